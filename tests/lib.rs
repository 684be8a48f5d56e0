//! Shared helpers for the reference tests (none yet).

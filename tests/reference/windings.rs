//! Reference checks: windings (see each test for its source).

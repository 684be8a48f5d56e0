//! Reference checks: materials (see each test for its source).

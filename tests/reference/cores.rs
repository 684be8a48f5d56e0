//! Reference checks: cores (see each test for its source).

//! Reference checks: topologies (see each test for its source).

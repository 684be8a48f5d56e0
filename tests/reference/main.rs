//! Reference checks: the engine against sources outside the project.
//! Each check names its source beside it.

mod conductors;
mod transformer;

//! Reference checks: the engine against sources outside the project.
//! Each check names its source beside it.

mod checks;
mod conductors;
mod cores;
mod design;
mod inductor;
mod materials;
mod stackup;
mod sweep;
mod topologies;
mod transformer;
mod windings;

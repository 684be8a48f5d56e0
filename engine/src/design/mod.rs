//! Converter designs: a specification in, a report out.

pub mod forward;

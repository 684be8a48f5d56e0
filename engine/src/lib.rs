//! Magwright's engine: the physics of ferrite transformers and coupled
//! inductors for switch-mode converters.
//!
//! Pure Rust, no web or UI dependency, SI units throughout (m, m², T, A, H,
//! Hz, W, °C for temperatures). Every function is pure: a specification in,
//! a report out. Bad input is a typed [`Error`] naming the field, never a
//! panic, NaN or infinity.
//!
//! Modules, from the bottom up:
//! * [`waveform`]: periodic piecewise-linear waveforms (currents, B(t)).
//! * [`core`]: core sets, their effective parameters and the library.
//! * [`material`]: ferrite grades and their loss coefficients.
//! * [`loss`]: core-loss density (Steinmetz family).
//! * [`gap`]: gapped-core inductance and saturation.
//! * [`winding`]: conductors and copper resistance.
//! * [`topology`]: converter waveforms and stresses.
//! * [`thermal`]: temperature rise and thermal equilibrium.
//! * [`design`]: converter designs, a spec in and a report out.
//! * [`notation`]: engineering notation ("200k") for front ends.

pub mod core;
pub mod design;
pub mod error;
pub mod gap;
pub mod json;
pub mod loss;
pub mod material;
pub mod notation;
pub mod thermal;
pub mod topology;
pub mod waveform;
pub mod winding;

pub use error::{Error, Result};

//! Magwright's engine: the physics of ferrite transformers and coupled
//! inductors for switch-mode converters.
//!
//! Pure Rust, no web or UI dependency, SI units throughout (m, m², T, A, H,
//! Hz, W, °C for temperatures). Every function is pure: a specification in,
//! a report out. Bad input is a typed [`Error`] naming the field, never a
//! panic, NaN or infinity.
//!
//! Modules, from the bottom up:
//! * [`error`], [`notation`], [`json`]: typed errors naming their field;
//!   engineering notation ("200k") and JSON for the edges.
//! * [`waveform`]: periodic piecewise-linear waveforms (currents, B(t)) with
//!   exact RMS and Fourier series.
//! * [`core`]: core sets, IEC 60205 effective parameters from dimensions, the library.
//! * [`material`]: ferrite grades, their loss coefficients, fitting from measurements.
//! * [`loss`]: core-loss density, Steinmetz and iGSE.
//! * [`gap`]: gapped-core inductance with fringing, gap solving, saturation.
//! * [`thermal`]: temperature rise and thermal equilibrium.
//! * [`winding`]: conductors, stack-up, fit, Dowell AC resistance of real
//!   currents, leakage.
//! * [`topology`]: converter specifications, waveforms and stresses at both
//!   line corners.
//! * [`design`]: the design file, the solver, sweeps and the optimiser.

pub mod core;
pub mod design;
pub mod error;
pub mod gap;
pub mod json;
pub mod json_errors;
pub mod json_spans;
pub mod loss;
pub mod material;
pub mod notation;
pub mod thermal;
pub mod topology;
pub mod waveform;
pub mod winding;

pub use error::{Error, Result};

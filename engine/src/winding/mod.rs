//! Windings: conductors, the stack-up on the bobbin, how it fits, its DC
//! and AC resistance for the real (non-sinusoidal) currents, and the
//! leakage inductance it makes.
//!
//! The pieces, in the order a design uses them:
//!
//! * [`wire`]: copper resistivity (IEC 60028) and AWG diameters (ASTM B258).
//! * [`conductor`]: what a turn is made of ([`Conductor`]: round enamelled
//!   wire by AWG or metric size and enamel grade, litz, foil,
//!   triple-insulated wire).
//! * [`stackup`]: the ordered list of sections, tapes and screens from the
//!   bobbin outward ([`stackup::StackUp`]), its JSON file format and the
//!   default stack-up builder for an interleaving pattern.
//! * [`fit`]: turns per layer, layers, build height against the bobbin,
//!   fill factor, and the per-layer geometry (height, mean turn length).
//! * [`dowell`]: skin depth and Dowell's layer functions.
//! * [`loss`]: copper loss of piecewise-linear currents, harmonic by
//!   harmonic, with Dowell's per-layer model and an analytic tail.
//! * [`leakage`]: leakage inductance from the MMF energy in the window.
//! * [`kelvin`]: Kelvin functions; the exact skin effect of one round wire,
//!   a reference the tests hold the layer model against.
//!
//! All lengths in metres, currents in amperes, temperatures in °C.

pub mod conductor;
pub mod dowell;
pub mod fit;
mod json;
pub mod kelvin;
pub mod leakage;
pub mod loss;
pub mod stackup;
pub mod stackup_file;
pub mod wire;

pub use conductor::{Conductor, Grade};
pub use dowell::skin_depth;
pub use loss::{copper_losses, LossModel, LossOptions, LossReport, WindingCurrent};

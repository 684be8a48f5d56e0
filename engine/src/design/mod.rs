//! Whole designs: a [`Design`] file in, a worst-case-checked [`Report`] out.
//!
//! * [`file`](mod@file): the design file type (spec, core, material, choices).
//! * [`solve`]: the solver: turns, gap, wire, stack-up, losses at both line
//!   corners, thermal equilibrium and the pass/fail checks.
//! * [`sweep`]: loss against frequency and against flux density.
//! * [`optimise`]: every library core × material ranked, with the Pareto front.
//! * [`material_view`]: a material's Pv–B loss curves for the page's chart.
//! * [`upgrade`]: older design files converted to the current version.

pub mod clamp;
pub mod file;
mod load;
pub mod material_view;
pub mod optimise;
pub mod solve;
pub mod sweep;
pub mod upgrade;
pub mod views;

pub use file::{Choices, CoreChoice, Design, MaterialChoice};
pub use solve::{evaluate, Report};

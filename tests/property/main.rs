//! Property-based and fuzz tests of the engine's public entry points.
//!
//! * [`design`]: random specifications, choices, cores and materials
//!   thrown at `design::evaluate`, `sweep::frequency` and `sweep::flux`.
//! * [`stackup`]: random stack-up documents at `winding::stackup::from_json`,
//!   then `winding::fit::fit` and `winding::loss::copper_losses`.
//! * [`invariants`]: physical invariants (ampere-turn and volt-second
//!   balance, energy, saturation, loss against turns, Fr against frequency,
//!   mode against waveform) over at least 1,000 accepted random designs
//!   per property.
//! * [`optimise`]: the optimiser against a brute force over a small library,
//!   and its Pareto front against the definition.
//! * [`sweeps`]: the as-wound curve keeps the design's turns and conductors;
//!   the best-material envelope is never above any material's curve.
//! * [`fuzz`]: a deterministic mutation loop over the files in
//!   `tests/fuzz/corpus/` (design files and stack-ups), at `Design::from_json`
//!   + `evaluate` and `stackup::from_json`/`import`.
//!
//! The invariants (the engine's house rules, engine/src/error.rs): never a
//! panic; every number in a report finite ([`finite`] sees the f64s
//! themselves, since serde_json would write NaN as `null`); losses ≥ 0;
//! Fr ≥ 1 (Dowell 1966: the AC resistance of a layer is never below its DC
//! resistance); power balance for every accepted design; every error has a
//! non-empty message, and names a well-formed field where it is about one.
//!
//! Bounded: 256 cases per property (fewer for the sweeps), fixed seeds via
//! proptest's deterministic runner, no failure files written.

mod conductor_scan;
mod design;
mod finite;
mod fuzz;
mod invariants;
mod optimise;
mod sweeps;
mod stackup;

use magwright_engine::error::Error;

/// A field name must look like a path of snake_case keys with indices
/// (`spec.outputs[0].voltage`, `choices.wires`, `items[3].conductor`).
pub fn well_formed_field(f: &str) -> bool {
    !f.is_empty()
        && f.chars()
            .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || "_.[]".contains(c))
        && !f.starts_with('.')
        && !f.ends_with('.')
}

/// Errors: a message, and a well-formed field where the error has one
/// (input and unknown-name errors always do).
pub fn check_error(e: &Error) -> Result<(), String> {
    if e.message().trim().is_empty() {
        return Err(format!("empty message: {e:?}"));
    }
    match (e, e.field()) {
        (Error::Input { .. } | Error::Unknown { .. }, None) => Err(format!("no field: {e:?}")),
        // A file's own (unknown) keys may be any text; engine-made names not.
        (Error::Format { .. }, Some(f)) if f.is_empty() || f.contains('?') => {
            Err(format!("bad field \"{f}\": {e:?}"))
        }
        (Error::Format { .. }, _) => Ok(()),
        (_, Some(f)) if !well_formed_field(f) => Err(format!("malformed field \"{f}\": {e:?}")),
        _ => Ok(()),
    }
}

/// Fixed-seed configuration (the same cases on every run, so CI is
/// reproducible): `cases` cases, no failure files, bounded shrinking.
pub fn config(cases: u32) -> proptest::test_runner::Config {
    proptest::test_runner::Config {
        cases,
        failure_persistence: None,
        max_shrink_iters: 2000,
        rng_algorithm: proptest::test_runner::RngAlgorithm::ChaCha,
        rng_seed: proptest::test_runner::RngSeed::Fixed(0x6d61_6777),
        ..proptest::test_runner::Config::default()
    }
}

//! Windings: conductors, copper resistivity, AC resistance and the stack-up.
//!
//! This first cut holds the conductor facts the first design slice needs:
//! the AWG diameter (ASTM B258) and copper resistivity (IEC 60028).

pub mod wire;

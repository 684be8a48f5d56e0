//! Gapped cores: inductance, fringing, gap for a target inductance, saturation check.

//! Converter topologies: waveforms and stresses of forward, flyback and push-pull.

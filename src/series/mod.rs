//! Series expansions.

pub mod laurent_fft;

//! Series expansions: Laurent coefficients by FFT.

pub mod laurent_fft;

//! Series expansions: Laurent coefficients by FFT, and the causal inverse
//! z-transform (long division, residues, trapezoidal rule on a circle).

pub mod inverse_z_long_division;
pub mod inverse_z_residues;
pub mod inverse_z_trapezoid;
pub mod laurent_fft;

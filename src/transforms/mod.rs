//! Integral transforms inverted through complex analysis: the inverse Laplace
//! transform (residues for rational F, the fixed Talbot contour for any F, a
//! pure delay e^{−τs} detected and shifted out) and the causal inverse
//! z-transform (long division, residues, the trapezoidal rule on circles);
//! and the readings of a rational transfer function in s or z (`system`).

pub mod laplace;
pub mod system;
pub mod z;

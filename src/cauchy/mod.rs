//! Cauchy integrals on circles: the one sampler and FFT (`circle`) that every
//! coefficient, residue and contour-way computation on a circle goes through.

pub mod circle;

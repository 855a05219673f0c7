//! The causal inverse z-transform x[n], n ≥ 0 (region of convergence outside
//! every singularity): long division and residues for rational X, the
//! trapezoidal rule on circles for any X, outside the singularities a search
//! bounds.

pub mod long_division;
pub mod residues;
pub mod singular_radius;
pub mod trapezoid;

//! The causal inverse z-transform x[n], n ≥ 0 (region of convergence outside
//! every singularity): the difference equation (with its rounding bound), long
//! division and residues for rational X, the
//! trapezoidal rule on circles for any X, outside the singularities a search
//! bounds.

pub mod long_division;
pub mod recurrence;
pub mod residues;
pub mod singular_radius;
pub mod trapezoid;

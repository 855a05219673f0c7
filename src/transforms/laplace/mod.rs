//! The inverse Laplace transform f(t) = L⁻¹[F](t), t > 0: the residue sum of
//! F(s)e^{st} (rational F), the fixed Talbot contour (any F), delays
//! Σ e^{−τₖs}Gₖ(s) recognised from the expression and inverted term by term,
//! the numerical detection of a pure delay e^{−τs}, the delay-shifted Talbot
//! inversion built on them, and the check for branch cuts crossing the contour.

pub mod contour_cuts;
pub mod delay_estimate;
pub mod delay_terms;
pub mod delayed_inversion;
pub mod delayed_residues;
pub mod fixed_talbot;
pub mod residues;

//! The inverse Laplace transform f(t) = L⁻¹[F](t), t > 0: the residue sum of
//! F(s)e^{st} (rational F), the fixed Talbot contour (any F), the detection of
//! a pure delay e^{−τs}, and the delay-shifted Talbot inversion built on them.

pub mod delay_estimate;
pub mod delayed_inversion;
pub mod fixed_talbot;
pub mod residues;

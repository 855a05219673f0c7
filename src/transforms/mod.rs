//! Integral transforms inverted through complex analysis: the inverse Laplace
//! transform by residues (rational F) and by a numerical Bromwich contour
//! (any F), and the detection of a pure delay e^{−τs}.

pub mod delay_estimate;
pub mod fixed_talbot;
pub mod laplace_residues;

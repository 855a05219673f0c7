//! One file a task. Each owns its request and response and reads top to
//! bottom: validate the input, choose the methods (the plan), call each
//! method once, reconcile the independent ways, convert to the wire.
//! No task imports another task.

pub mod argument_count;
pub mod contour_integral;
pub mod evaluate;
pub mod inverse_laplace;
pub mod inverse_z;
pub mod laurent;
pub mod partial_fractions;
pub mod phase_plot;
pub mod pole_trails;
pub mod real_integral;
pub mod residue;
pub mod singularities;
pub mod transfer_function;

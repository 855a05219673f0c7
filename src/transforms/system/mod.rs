//! Linear-system readings of a rational transfer function F in s (continuous)
//! or z (discrete): pole and zero data, the frequency response with its
//! margins, the encirclement count of the Nyquist contour's image, and the
//! step response with its metrics.

pub mod contour_image;
pub mod encirclement;
pub mod frequency_response;
pub mod pole_data;
pub mod pole_trails;
pub mod step_response;

/// Continuous (s) or discrete (z, with the sampling period T) systems.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Domain {
    S,
    Z { period: f64 },
}

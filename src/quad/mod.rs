//! Quadrature: the periodic trapezoidal rule on closed smooth pieces, adaptive
//! Gauss–Kronrod on intervals, and contour integrals built from both.
//!
//! Shared result, tolerance and error types live here; each method has its own file.

pub mod contour_quadrature;
pub mod gauss_kronrod;
pub mod real_line;
pub mod split_at_cuts;
pub mod trapezoid_periodic;

use crate::budget::BudgetExceeded;
use crate::C;

/// Requested accuracy: stop when the error estimate is at most
/// `max(abs, rel * |value|)` (or when rounding makes further work useless).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Tolerance {
    pub abs: f64,
    pub rel: f64,
}

impl Default for Tolerance {
    /// Relative 1e-12, no absolute target (rounding-limited results still stop).
    fn default() -> Self {
        Tolerance {
            abs: 0.0,
            rel: 1e-12,
        }
    }
}

impl Tolerance {
    /// The error target for a value of the given size.
    pub fn target(&self, value: C) -> f64 {
        self.abs.max(self.rel * value.norm())
    }
}

/// A quadrature value with an error estimate meant as an upper bound.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct QuadResult {
    pub value: C,
    pub error_estimate: f64,
    /// Evaluations of the integrand spent.
    pub evaluations: u64,
    /// False when the tolerance was not met before a refinement limit (the
    /// error estimate is still honest).
    pub converged: bool,
}

impl QuadResult {
    /// Nothing integrated yet: the start of a sum over pieces.
    pub fn zero() -> Self {
        QuadResult { value: C::new(0.0, 0.0), error_estimate: 0.0, evaluations: 0, converged: true }
    }

    /// Add one piece's result: values and error estimates add.
    pub fn absorb(&mut self, r: QuadResult) {
        self.value += r.value;
        self.error_estimate += r.error_estimate;
        self.evaluations += r.evaluations;
        self.converged &= r.converged;
    }
}

/// Why a quadrature stopped without a value.
#[derive(Debug, Clone, PartialEq)]
pub enum QuadError {
    /// The integrand was NaN or infinite at this parameter value.
    NotFinite { at: f64 },
    /// The work budget ran out.
    Budget(BudgetExceeded),
    /// Unusable input (message says what to fix).
    Invalid(String),
}

impl std::fmt::Display for QuadError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            QuadError::NotFinite { at } => write!(
                f,
                "the integrand is not finite at {at}; an integrable singularity must not sit on a node—split the interval there"
            ),
            QuadError::Budget(b) => write!(f, "{b}"),
            QuadError::Invalid(m) => write!(f, "{m}"),
        }
    }
}

impl std::error::Error for QuadError {}

impl From<QuadError> for crate::error::Failure {
    fn from(e: QuadError) -> Self {
        use crate::error::Failure;
        match e {
            QuadError::NotFinite { .. } => Failure::not_finite(e.to_string()),
            QuadError::Budget(b) => b.into(),
            QuadError::Invalid(m) => Failure::invalid(m),
        }
    }
}

impl From<BudgetExceeded> for QuadError {
    fn from(b: BudgetExceeded) -> Self {
        QuadError::Budget(b)
    }
}

/// True when both parts are finite.
pub(crate) fn is_finite(z: C) -> bool {
    z.re.is_finite() && z.im.is_finite()
}

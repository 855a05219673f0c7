//! The periodic trapezoidal rule on a closed smooth piece (circle or ellipse).
//!
//! Method: for a periodic analytic integrand the equispaced trapezoidal rule
//! converges geometrically; L. N. Trefethen and J. A. C. Weideman, "The
//! exponentially convergent trapezoidal rule", SIAM Review 56 (2014) 385–458.
//! N is doubled (reusing every old sample) until two successive sums agree;
//! the error estimate is their difference plus a rounding floor. Since the
//! convergence is geometric, the difference greatly over-estimates the error
//! of the finer sum, which is what we want from a bound.

use super::{is_finite, QuadError, QuadResult, Tolerance};
use crate::budget::Budget;
use crate::contour::Piece;
use crate::C;

/// First sample count.
pub const START_SAMPLES: usize = 16;
/// Largest sample count before giving up on the tolerance (estimate stays honest).
pub const MAX_SAMPLES: usize = 1 << 20;

/// ∫_0^1 g(t) dt for a 1-periodic g, by the doubling trapezoidal rule.
/// A non-finite g(t) is reported as [`QuadError::NotFinite`] at that t.
pub fn integrate_periodic(
    g: &mut dyn FnMut(f64) -> C,
    tol: Tolerance,
    budget: &mut Budget,
) -> Result<QuadResult, QuadError> {
    let start = budget.used();
    let mut eval = |t: f64, budget: &mut Budget| -> Result<C, QuadError> {
        budget.spend(1)?;
        let v = g(t);
        if is_finite(v) {
            Ok(v)
        } else {
            Err(QuadError::NotFinite { at: t })
        }
    };
    let mut n = START_SAMPLES;
    let mut sum = C::new(0.0, 0.0);
    let mut abs_sum = 0.0;
    for k in 0..n {
        let v = eval(k as f64 / n as f64, budget)?;
        sum += v;
        abs_sum += v.norm();
    }
    let mut previous = sum / n as f64;
    loop {
        // Add the midpoints: the 2N-point sum reuses the N old samples.
        for k in 0..n {
            let v = eval((2 * k + 1) as f64 / (2 * n) as f64, budget)?;
            sum += v;
            abs_sum += v.norm();
        }
        n *= 2;
        let current = sum / n as f64;
        // Rounding floor: summation and evaluation errors relative to the mean |g|.
        let floor = 16.0 * f64::EPSILON * (abs_sum / n as f64) * (n as f64).log2();
        let diff = (current - previous).norm();
        let error = diff + floor;
        let done = diff <= tol.target(current) || diff <= 4.0 * floor;
        if done || n >= MAX_SAMPLES {
            return Ok(QuadResult {
                value: current,
                error_estimate: error,
                evaluations: budget.used() - start,
                converged: done,
            });
        }
        previous = current;
    }
}

/// ∮ f(z) dz over one periodic piece (`Piece::Ellipse`), counter-clockwise as
/// the piece is parametrised. A non-finite f is reported at its t.
pub fn integrate_piece(
    f: &mut dyn FnMut(C) -> C,
    piece: &Piece,
    tol: Tolerance,
    budget: &mut Budget,
) -> Result<QuadResult, QuadError> {
    if !piece.is_periodic() {
        return Err(QuadError::Invalid(
            "the periodic trapezoidal rule needs a closed circle or ellipse piece; use Gauss–Kronrod on segments".into(),
        ));
    }
    let mut g = |t: f64| f(piece.point(t)) * piece.derivative(t);
    integrate_periodic(&mut g, tol, budget)
}

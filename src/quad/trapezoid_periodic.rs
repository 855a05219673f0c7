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
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::quad::{trapezoid_periodic::integrate_periodic, Tolerance};
/// use residuary::C;
/// // ∫_0^1 dt/(2 + cos 2πt) = 1/√3, from ∫_0^{2π} dθ/(a + b cos θ) = 2π/√(a² − b²)
/// // (a standard table integral, from memory).
/// let mut g = |t: f64| C::new(1.0 / (2.0 + (2.0 * std::f64::consts::PI * t).cos()), 0.0);
/// let r = integrate_periodic(&mut g, Tolerance::default(), &mut Budget::default()).unwrap();
/// let error = (r.value - C::new(1.0 / 3f64.sqrt(), 0.0)).norm();
/// assert!(r.converged && error < 1e-13 && error <= r.error_estimate);
/// ```
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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_estimate_bounds, check_method, simpson};
    use std::f64::consts::PI;

    type Periodic = fn(f64) -> C;

    #[test]
    fn periodic_integrands_agree_with_simpson_and_the_estimate_bounds_the_difference() {
        let cases: [(&str, Periodic); 3] = [
            ("e^{cos 2πt}", |t| C::new((2.0 * PI * t).cos().exp(), 0.0)),
            ("1/(1.1 + cos 2πt), a pole close to the real t axis", |t| C::new(1.0 / (1.1 + (2.0 * PI * t).cos()), 0.0)),
            ("e^{i sin 2πt} sin² 2πt", |t| C::new(0.0, (2.0 * PI * t).sin()).exp() * (2.0 * PI * t).sin().powi(2)),
        ];
        check_method(
            &cases,
            |f| {
                let r = integrate_periodic(&mut |t| f(t), Tolerance::default(), &mut Budget::default()).unwrap();
                assert!(r.converged);
                (r.value, Some(r.error_estimate))
            },
            // Simpson with 100 000 panels on one period (itself spectrally accurate here).
            |f| simpson(f, 0.0, 1.0, 100_000),
            1e-11,
        );
    }

    #[test]
    fn the_estimate_bounds_the_true_error_against_handbook_values() {
        // ∫_0^1 e^{cos 2πt} dt = I₀(1) = 1.2660658777520083356 (A&S 9.6.19 for the
        // integral, A&S Table 9.8 for the value).
        let want = C::new(1.266_065_877_752_008_3, 0.0);
        let loose = Tolerance { abs: 0.0, rel: 1e-6 };
        let r = integrate_periodic(&mut |t| C::new((2.0 * PI * t).cos().exp(), 0.0), loose, &mut Budget::default())
            .unwrap();
        assert_estimate_bounds(r.value, r.error_estimate, want, "I₀(1), rel 1e-6");
        // ∫_0^1 dt/(1.1 + cos 2πt) = 1/√(1.1² − 1) (a standard table integral, from memory).
        let want = C::new(1.0 / (1.21f64 - 1.0).sqrt(), 0.0);
        let r = integrate_periodic(&mut |t| C::new(1.0 / (1.1 + (2.0 * PI * t).cos()), 0.0), loose, &mut Budget::default())
            .unwrap();
        assert_estimate_bounds(r.value, r.error_estimate, want, "1/(1.1 + cos), rel 1e-6");
    }

    #[test]
    fn an_ellipse_piece_agrees_with_simpson_on_its_parametrisation() {
        let piece = Piece::Ellipse { center: C::new(0.5, -0.25), a: 2.0, b: 1.0, rot: C::from_polar(1.0, 0.3) };
        let f = |z: C| z.exp() / (z - C::new(0.2, 0.1));
        let r = integrate_piece(&mut |z| f(z), &piece, Tolerance::default(), &mut Budget::default()).unwrap();
        let want = simpson(|t| f(piece.point(t)) * piece.derivative(t), 0.0, 1.0, 100_000);
        assert_estimate_bounds(r.value, r.error_estimate + 1e-11, want, "ellipse piece vs Simpson");
        // The pole at 0.2 + 0.1i is inside: 2πi e^{0.2+0.1i} (residue theorem, common practice).
        let residue = C::new(0.0, 2.0 * PI) * C::new(0.2, 0.1).exp();
        assert_estimate_bounds(r.value, r.error_estimate, residue, "ellipse piece vs residue");
        let segment = Piece::Segment { from: C::new(0.0, 0.0), to: C::new(1.0, 0.0) };
        assert!(integrate_piece(&mut |z| z, &segment, Tolerance::default(), &mut Budget::default()).is_err());
    }
}

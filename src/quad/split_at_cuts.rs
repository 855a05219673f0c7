//! Method: ∮ f dz along a contour on which f jumps (a branch cut crosses it),
//! with every piece split at the crossings and each part integrated by
//! adaptive Gauss–Kronrod G7–K15 (Piessens et al., QUADPACK, 1983).
//!
//! On each part z(t), t ∈ [t_k, t_{k+1}], the integrand f(z(t)) z′(t) is
//! smooth up to the ends, and the rule's nodes are all interior, so each part
//! sees one side of the cut only: the integral converges at the rate of a
//! smooth integrand instead of the trapezoidal rule's O(1/n) on a jump.
//! Splitting an interval at a known discontinuity is common practice. The
//! relative tolerance is shared among the parts; values and error estimates add.

use super::contour_quadrature::on_piece_error;
use super::{gauss_kronrod, QuadResult, Tolerance};
use crate::budget::Budget;
use crate::contour::Contour;
use crate::error::Failure;
use crate::singular::cut_crossing::Crossing;
use crate::C;

/// ∮_contour f dz with each piece split at the given crossings (`piece`, `t`).
///
/// ```
/// use residuary::{budget::Budget, contour::Contour, quad::split_at_cuts::integral_split_at_cuts, C};
/// use residuary::singular::cut_crossing::Crossing;
/// // Principal log jumps by 2πi across the negative real axis; on the unit
/// // circle from −π to π, ∮ log z dz = −2πi (direct computation, common practice).
/// let circle = Contour::circle(C::new(0.0, 0.0), 1.0);
/// let cut = [Crossing { piece: 0, t: 0.5, at: C::new(-1.0, 0.0) }];
/// let r = integral_split_at_cuts(&mut |z: C| z.ln(), &circle, &cut, &mut Budget::new(100_000)).unwrap();
/// assert!((r.value - C::new(0.0, -2.0 * std::f64::consts::PI)).norm() < 1e-12);
/// ```
pub fn integral_split_at_cuts(
    f: &mut dyn FnMut(C) -> C,
    contour: &Contour,
    crossings: &[Crossing],
    budget: &mut Budget,
) -> Result<QuadResult, Failure> {
    let pieces = contour.pieces();
    let mut total = QuadResult::zero();
    let parts = pieces.len() + crossings.len();
    let tol = Tolerance { abs: 0.0, rel: Tolerance::default().rel / parts as f64 };
    for (i, piece) in pieces.iter().enumerate() {
        let mut cuts: Vec<f64> = crossings.iter().filter(|c| c.piece == i).map(|c| c.t).collect();
        cuts.sort_by(|a, b| a.total_cmp(b));
        let mut ends = vec![0.0];
        ends.extend(cuts.into_iter().filter(|t| *t > 0.0 && *t < 1.0));
        ends.push(1.0);
        for w in ends.windows(2) {
            if w[1] <= w[0] {
                continue;
            }
            let mut g = |t: f64| f(piece.point(t)) * piece.derivative(t);
            let r = gauss_kronrod::integrate(&mut g, w[0], w[1], tol, budget);
            total.absorb(r.map_err(|e| on_piece_error(f, piece, e))?);
        }
    }
    Ok(total)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_estimate_bounds, check_method, simpson};
    use crate::singular::cut_crossing::cut_crossings;
    use std::f64::consts::PI;

    fn unit_circle() -> Contour {
        Contour::circle(C::new(0.0, 0.0), 1.0)
    }

    /// The unit circle meets the principal cut (the negative real axis) at −1, half-way round.
    fn at_minus_one() -> Vec<Crossing> {
        vec![Crossing { piece: 0, t: 0.5, at: C::new(-1.0, 0.0) }]
    }

    fn split(f: fn(C) -> C, contour: &Contour, cuts: &[Crossing]) -> QuadResult {
        integral_split_at_cuts(&mut |z| f(z), contour, cuts, &mut Budget::new(1_000_000)).unwrap()
    }

    #[test]
    fn closed_forms_across_the_principal_cut() {
        // Direct computation with z = e^{iθ}, θ from −π to π (common practice):
        // ∮ log z dz = −∫ θ e^{iθ} dθ = −2πi; ∮ √z dz = i∫ e^{3iθ/2} dθ = −4i/3.
        // On the square with corners ±1 ± i the antiderivative z log z − z jumps
        // only at −1, so ∮ log z dz = −2πi there too.
        let square = Contour::rectangle(C::new(-1.0, -1.0), C::new(1.0, 1.0));
        let square_cuts = cut_crossings(&|z: C| z.ln(), &square, &mut Budget::new(1_000_000)).unwrap();
        assert_eq!(square_cuts.len(), 1, "{square_cuts:?}");
        assert!((square_cuts[0].at - C::new(-1.0, 0.0)).norm() < 1e-10);
        let cases: [(&str, fn(C) -> C, Contour, Vec<Crossing>, C); 3] = [
            ("log on the unit circle", |z| z.ln(), unit_circle(), at_minus_one(), C::new(0.0, -2.0 * PI)),
            ("sqrt on the unit circle", |z| z.sqrt(), unit_circle(), at_minus_one(), C::new(0.0, -4.0 / 3.0)),
            ("log on a square", |z| z.ln(), square, square_cuts, C::new(0.0, -2.0 * PI)),
        ];
        for (name, f, contour, cuts, want) in cases {
            let r = split(f, &contour, &cuts);
            assert!(r.converged, "{name}");
            assert!((r.value - want).norm() < 1e-12, "{name}: {} vs {want}", r.value);
            assert_estimate_bounds(r.value, r.error_estimate, want, name);
        }
    }

    #[test]
    fn off_centre_the_split_is_exact_and_cheaper_than_adaptive_bisection_alone() {
        // The circle |z − (0.3 + 0.2i)| = 1 meets the negative real axis at x₀ = 0.3 − √0.96,
        // at a parameter that is no dyadic fraction. With F = (2/3) z^{3/2}, which jumps
        // only there, ∮ √z dz = F(x₀ + i0) − F(x₀ − i0) = −(4/3) i |x₀|^{3/2} (common practice).
        let circle = Contour::circle(C::new(0.3, 0.2), 1.0);
        let cuts = cut_crossings(&|z: C| z.sqrt(), &circle, &mut Budget::new(1_000_000)).unwrap();
        assert_eq!(cuts.len(), 1, "{cuts:?}");
        let x0: f64 = 0.3 - 0.96f64.sqrt();
        assert!((cuts[0].at - C::new(x0, 0.0)).norm() < 1e-10, "{cuts:?}");
        let want = C::new(0.0, -4.0 / 3.0 * x0.abs().powf(1.5));
        let r = split(|z| z.sqrt(), &circle, &cuts);
        assert!((r.value - want).norm() < 1e-12, "{} vs {want}", r.value);
        assert_estimate_bounds(r.value, r.error_estimate, want, "off-centre sqrt");
        // Without the split, adaptive Gauss–Kronrod must bisect down onto the jump.
        let piece = circle.pieces()[0];
        let mut g = |t: f64| piece.point(t).sqrt() * piece.derivative(t);
        let tol = Tolerance { abs: 0.0, rel: Tolerance::default().rel / 2.0 };
        let whole = gauss_kronrod::integrate(&mut g, 0.0, 1.0, tol, &mut Budget::new(1_000_000)).unwrap();
        assert!(
            2 * r.evaluations < whole.evaluations,
            "split {} evaluations, unsplit {}",
            r.evaluations,
            whole.evaluations
        );
    }

    #[test]
    fn matches_simpson_on_the_two_sides_of_the_cut() {
        // Slow reference: Simpson in θ from −π to π, whose ends are the two sides of the
        // cut, so the integrand is smooth on the closed interval.
        let cases: Vec<(&str, fn(C) -> C)> = vec![
            ("sqrt(z)/(z − 0.5)", |z| z.sqrt() / (z - 0.5)),
            ("log(z)·exp(z)", |z| z.ln() * z.exp()),
            ("z^(1/3)/(z + 0.5i − 2)", |z| z.powf(1.0 / 3.0) / (z + C::new(-2.0, 0.5))),
        ];
        check_method(
            &cases,
            |f| {
                let r = split(*f, &unit_circle(), &at_minus_one());
                (r.value, Some(r.error_estimate))
            },
            |f| {
                simpson(
                    |t| {
                        let z = C::from_polar(1.0, t);
                        f(z) * C::new(0.0, 1.0) * z
                    },
                    -PI,
                    PI,
                    4000,
                )
            },
            1e-11,
        );
    }
}

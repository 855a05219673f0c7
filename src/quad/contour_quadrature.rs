//! ∮ f(z) dz over a closed contour, piece by piece.
//!
//! Method: circle and ellipse pieces use the periodic trapezoidal rule
//! (Trefethen & Weideman, SIAM Review 56, 2014), straight segments and arcs use
//! adaptive Gauss–Kronrod G7–K15 (Piessens et al., QUADPACK, 1983). The piece
//! values and their error estimates are summed.

use super::{gauss_kronrod, trapezoid_periodic, QuadError, QuadResult, Tolerance};
use crate::text;
use crate::error::Failure;
use crate::budget::Budget;
use crate::contour::{Contour, Piece};
use crate::C;

/// ∮_contour f(z) dz with an error estimate (sum of the pieces' estimates).
///
/// The tolerance is shared among pieces: each piece aims at
/// `max(tol.abs / pieces, tol.rel * |piece value|)`. Errors name the point
/// where f is not finite ("a singularity lies on the contour").
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::contour::Contour;
/// use residuary::quad::{contour_quadrature::contour_integral, Tolerance};
/// use residuary::C;
/// // ∮ e^z/(z − 1) dz around the square with corners ±2 ± 2i = 2πi·e
/// // (Cauchy's integral formula, common practice).
/// let square = Contour::rectangle(C::new(-2.0, -2.0), C::new(2.0, 2.0));
/// let r = contour_integral(&mut |z| z.exp() / (z - 1.0), &square,
///                          Tolerance::default(), &mut Budget::default()).unwrap();
/// let want = C::new(0.0, 2.0 * std::f64::consts::PI * std::f64::consts::E);
/// assert!((r.value - want).norm() <= r.error_estimate && r.error_estimate < 1e-10);
/// ```
pub fn contour_integral(
    f: &mut dyn FnMut(C) -> C,
    contour: &Contour,
    tol: Tolerance,
    budget: &mut Budget,
) -> Result<QuadResult, Failure> {
    contour.validate()?;
    let pieces = contour.pieces();
    let piece_tol = Tolerance {
        abs: tol.abs / pieces.len().max(1) as f64,
        rel: tol.rel,
    };
    let mut total = QuadResult::zero();
    for piece in &pieces {
        let result = match *piece {
            Piece::Ellipse { .. } => {
                trapezoid_periodic::integrate_piece(f, piece, piece_tol, budget)
            }
            Piece::Segment { from, to } => {
                let mut g = |t: f64| f(piece.point(t)) * (to - from);
                gauss_kronrod::integrate_unit(&mut g, piece_tol, budget)
            }
            Piece::Arc { .. } => {
                let mut g = |t: f64| f(piece.point(t)) * piece.derivative(t);
                gauss_kronrod::integrate_unit(&mut g, piece_tol, budget)
            }
        };
        total.absorb(result.map_err(|e| on_piece_error(f, piece, e))?);
    }
    Ok(total)
}

/// The message for a failed piece: where f is not finite on it (overflow or
/// a singularity, told apart by `overflow::overflows_near`), or why else.
pub fn on_piece_error(f: &mut dyn FnMut(C) -> C, piece: &Piece, e: QuadError) -> Failure {
    match e {
        QuadError::NotFinite { at } if crate::overflow::overflows_near(f, piece.point(at)) => {
            Failure::not_finite(crate::overflow::message(piece.point(at))).at(piece.point(at))
        }
        QuadError::NotFinite { at } => Failure::on_contour(format!(
            "f is not finite at {} on the contour: a singularity lies on it; move the contour",
            text::place(piece.point(at))
        ))
        .at(piece.point(at)),
        e => e.into(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_estimate_bounds, check_method, naive_circle_integral, naive_polyline_integral};
    use std::f64::consts::PI;

    type F = fn(C) -> C;

    fn run(f: F, contour: &Contour) -> QuadResult {
        contour_integral(&mut |z| f(z), contour, Tolerance::default(), &mut Budget::default()).unwrap()
    }

    #[test]
    fn circles_agree_with_the_naive_circle_sum() {
        let cases: [(&str, (F, C, f64)); 3] = [
            ("e^z/(z − 1) on |z| = 2", (|z| z.exp() / (z - 1.0), C::new(0.0, 0.0), 2.0)),
            ("1/((z − 0.3)²(z + 2)) on |z − 0.5i| = 1", (|z| 1.0 / ((z - 0.3).powi(2) * (z + 2.0)), C::new(0.0, 0.5), 1.0)),
            ("cos z / z³ off centre", (|z| z.cos() / z.powi(3), C::new(0.4, -0.2), 1.5)),
        ];
        check_method(
            &cases,
            |&(f, c, r)| {
                let q = run(f, &Contour::circle(c, r));
                (q.value, Some(q.error_estimate))
            },
            // 4096 equispaced points: far past convergence for poles this far from the circle.
            |&(f, c, r)| naive_circle_integral(f, c, r, 4096),
            1e-12,
        );
    }

    #[test]
    fn rectangles_and_polygons_agree_with_the_naive_polyline_sum() {
        let rect = Contour::rectangle(C::new(-1.0, -1.0), C::new(2.0, 1.5));
        let triangle = Contour::Polygon { vertices: vec![[-1.5, -0.2], [1.5, -0.2], [0.0, 2.0]] };
        let clockwise = Contour::Polygon { vertices: vec![[-1.0, -1.0], [-1.0, 1.0], [1.0, 1.0], [1.0, -1.0]] };
        let cases: [(&str, (F, Contour)); 4] = [
            ("e^z/(z − 1) on a rectangle", (|z| z.exp() / (z - 1.0), rect.clone())),
            ("z² + 1/(z − 0.5i)² on a rectangle", (|z| z * z + 1.0 / (z - C::new(0.0, 0.5)).powi(2), rect)),
            ("1/(z² + 0.25) on a triangle", (|z| 1.0 / (z * z + 0.25), triangle)),
            ("sin z/(z − 0.2) on a clockwise square", (|z| z.sin() / (z - 0.2) + 1.0 / z, clockwise)),
        ];
        check_method(
            &cases,
            |(f, contour)| {
                let q = run(*f, contour);
                (q.value, Some(q.error_estimate))
            },
            // Midpoint rule, 20 000 steps per edge: error O(h²) ≈ 1e-8 here.
            |(f, contour)| naive_polyline_integral(f, &contour.vertices(), 20_000),
            1e-7,
        );
    }

    #[test]
    fn the_estimate_bounds_the_true_error_against_the_residue_theorem() {
        // 1/(z² + 0.25) has simple poles at ±i/2 with residues ∓i (residue theorem, common practice):
        // the triangle encloses only i/2, so ∮ = 2πi·(−i) = 2π.
        let triangle = Contour::Polygon { vertices: vec![[-1.5, -0.2], [1.5, -0.2], [0.0, 2.0]] };
        let loose = Tolerance { abs: 0.0, rel: 1e-6 };
        let f = |z: C| 1.0 / (z * z + 0.25);
        let q = contour_integral(&mut |z| f(z), &triangle, loose, &mut Budget::default()).unwrap();
        assert_estimate_bounds(q.value, q.error_estimate, C::new(2.0 * PI, 0.0), "triangle, rel 1e-6");
        // Clockwise: −2πi·e^{0.5} for e^z/(z − 0.5) (Cauchy's integral formula).
        let clockwise = Contour::Polygon { vertices: vec![[-1.0, -1.0], [-1.0, 1.0], [1.0, 1.0], [1.0, -1.0]] };
        let q = contour_integral(&mut |z| z.exp() / (z - 0.5), &clockwise, loose, &mut Budget::default()).unwrap();
        assert_estimate_bounds(q.value, q.error_estimate, C::new(0.0, -2.0 * PI * 0.5f64.exp()), "clockwise, rel 1e-6");
    }

    #[test]
    fn a_pole_on_the_contour_is_refused_with_where() {
        // 1/z has its pole at 0, a corner of this rectangle (invented data).
        let rect = Contour::rectangle(C::new(0.0, 0.0), C::new(1.0, 1.0));
        let e = contour_integral(&mut |z| 1.0 / z, &rect, Tolerance::default(), &mut Budget::default());
        assert!(e.is_err());
    }
}

//! Zeros minus poles inside a contour by the argument principle: the total
//! change of arg f along the curve divided by 2π, with adaptive sampling.
//!
//! Method: the argument principle (A. L. Cauchy, 1831; see e.g. L. V. Ahlfors,
//! "Complex Analysis", 3rd ed., 1979, §5.2), evaluated by tracking the phase
//! of f between samples as in P. Henrici, "Applied and Computational Complex
//! Analysis", vol. 1 (1974), §4.10: every step is refined until the change of
//! arg f over it (and over each of its halves) stays below π/4, so the phase
//! cannot wrap unseen between samples.

use super::{eval, is_finite, show};
use crate::error::Failure;
use crate::budget::Budget;
use crate::contour::{Contour, Piece};
use crate::C;
use std::f64::consts::PI;

/// Largest phase change accepted over one step.
const MAX_STEP_PHASE: f64 = PI / 4.0;
/// Smallest parameter step before we declare a zero, pole or jump on the curve.
const MIN_STEP: f64 = 1e-11;

/// N − P (zeros minus poles, with multiplicity) of f inside `contour`
/// (weighted by the contour's winding number, so a clockwise polygon gives −(N − P)).
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::contour::Contour;
/// use residuary::singular::count_by_argument_principle;
/// use residuary::C;
/// // In |z| < 4, sin z has the zeros 0 and ±π, and sin z / (z − 1)² adds a
/// // double pole at 1 (common practice): N − P = 3 and 3 − 2 = 1.
/// let circle = Contour::circle(C::new(0.0, 0.0), 4.0);
/// let mut budget = Budget::default();
/// assert_eq!(count_by_argument_principle(&|z: C| z.sin(), &circle, &mut budget), Ok(3));
/// let g = |z: C| z.sin() / ((z - 1.0) * (z - 1.0));
/// assert_eq!(count_by_argument_principle(&g, &circle, &mut budget), Ok(1));
/// ```
pub fn count_by_argument_principle(
    f: &dyn Fn(C) -> C,
    contour: &Contour,
    budget: &mut Budget,
) -> Result<i64, Failure> {
    contour.validate()?;
    let total = total_phase_change(f, contour, budget)?;
    let turns = total / (2.0 * PI);
    let rounded = turns.round();
    if (turns - rounded).abs() > 0.05 {
        return Err(Failure::cut_crossing(format!(
            "the argument principle gave a non-integer count {turns:.3}: f may be discontinuous on the contour (a branch cut crosses the contour); move or shrink the contour"
        )));
    }
    Ok(rounded as i64)
}

/// Total change of arg f along the contour (radians).
pub fn total_phase_change(
    f: &dyn Fn(C) -> C,
    contour: &Contour,
    budget: &mut Budget,
) -> Result<f64, Failure> {
    let mut total = 0.0;
    for piece in contour.pieces() {
        total += piece_phase_change(f, &piece, budget)?;
    }
    Ok(total)
}

fn value_at(f: &dyn Fn(C) -> C, piece: &Piece, t: f64, budget: &mut Budget) -> Result<C, Failure> {
    let z = piece.point(t);
    let v = eval(f, z, budget)?;
    if !is_finite(v) && crate::overflow::overflows_near(&mut |x| f(x), z) {
        return Err(Failure::not_finite(crate::overflow::message(z)).at(z));
    }
    if !is_finite(v) || v == C::new(0.0, 0.0) {
        return Err(Failure::on_contour(on_contour_message(z)).at(z));
    }
    Ok(v)
}

fn on_contour_message(z: C) -> String {
    format!(
        "f has a zero or pole on the contour near {}, or is not finite there; move the contour",
        show(z)
    )
}

/// Phase change along one smooth piece, adaptively refined.
fn piece_phase_change(
    f: &dyn Fn(C) -> C,
    piece: &Piece,
    budget: &mut Budget,
) -> Result<f64, Failure> {
    let n0 = 64;
    let mut values = Vec::with_capacity(n0 + 1);
    for k in 0..=n0 {
        values.push(value_at(f, piece, k as f64 / n0 as f64, budget)?);
    }
    // Typical size of f on the piece: a jump between values of this size is a
    // cut, not a zero or pole (near which |f| is tiny or huge).
    let mut sizes: Vec<f64> = values.iter().map(|v| v.norm()).collect();
    sizes.sort_by(|x, y| x.partial_cmp(y).unwrap_or(std::cmp::Ordering::Equal));
    let typical = sizes[sizes.len() / 2];
    let mut total = 0.0;
    for k in 0..n0 {
        let (t0, t1) = (k as f64 / n0 as f64, (k + 1) as f64 / n0 as f64);
        total += interval_phase(
            f,
            piece,
            (t0, values[k]),
            (t1, values[k + 1]),
            typical,
            budget,
        )?;
    }
    Ok(total)
}

/// Phase change over [a, b], with an explicit stack instead of recursion.
fn interval_phase(
    f: &dyn Fn(C) -> C,
    piece: &Piece,
    a: (f64, C),
    b: (f64, C),
    typical: f64,
    budget: &mut Budget,
) -> Result<f64, Failure> {
    let mut total = 0.0;
    let mut stack = vec![(a, b)];
    while let Some(((ta, va), (tb, vb))) = stack.pop() {
        let tm = 0.5 * (ta + tb);
        let vm = value_at(f, piece, tm, budget)?;
        let d1 = (vm / va).arg();
        let d2 = (vb / vm).arg();
        let whole = (vb / va).arg();
        let ratio_ok = |p: C, q: C| {
            let r = p.norm() / q.norm();
            (0.25..=4.0).contains(&r)
        };
        let fine = d1.abs() <= MAX_STEP_PHASE
            && d2.abs() <= MAX_STEP_PHASE
            && (d1 + d2 - whole).abs() < 1e-9
            && ratio_ok(vm, va)
            && ratio_ok(vb, vm);
        if fine {
            total += d1 + d2;
        } else if tb - ta < MIN_STEP {
            let moderate = |v: C| (1e-6 * typical..=1e6 * typical).contains(&v.norm());
            let jump = (va - vb).norm() > 1e-3 * va.norm().max(vb.norm());
            if moderate(va) && moderate(vb) && jump {
                return Err(Failure::cut_crossing(jump_message(piece.point(tm))).at(piece.point(tm)));
            }
            return Err(Failure::on_contour(on_contour_message(piece.point(tm))).at(piece.point(tm)));
        } else {
            stack.push(((tm, vm), (tb, vb)));
            stack.push(((ta, va), (tm, vm)));
        }
    }
    Ok(total)
}

/// The message for a discontinuity of f on the contour (a `CutCrossing` failure).
pub(crate) fn jump_message(z: C) -> String {
    format!(
        "f jumps near {} on the contour: a branch cut crosses the contour (principal branch of log, sqrt or a non-integer power), so the argument principle cannot count zeros and poles inside it",
        show(z)
    )
}

/// True when `count_by_argument_principle` failed because f is discontinuous on the contour.
pub fn is_cut_error(e: &Failure) -> bool {
    e.kind() == crate::error::FailureKind::CutCrossing
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn counts_a_filter_response() {
        // (z - 0.5)^2 / ((z + 0.3i)(z - 2)) inside |z| < 1: 2 zeros, 1 pole, so N − P = 1
        // (argument principle; count by hand from the factors, common practice)
        let f = |z: C| (z - 0.5) * (z - 0.5) / ((z + C::new(0.0, 0.3)) * (z - 2.0));
        let mut b = Budget::new(1_000_000);
        assert_eq!(
            count_by_argument_principle(&f, &Contour::circle(C::new(0.0, 0.0), 1.0), &mut b),
            Ok(1)
        );
    }

    /// Slow reference: the change of arg f over 200 000 equal parameter steps per
    /// piece, each step's change taken as arg(f(b)/f(a)) (common practice; the
    /// steps are far finer than the distance of any zero or pole to the curves).
    fn count_by_sampling(f: &dyn Fn(C) -> C, contour: &Contour) -> i64 {
        let mut total = 0.0;
        for piece in contour.pieces() {
            let n = 200_000;
            for k in 0..n {
                let a = f(piece.point(k as f64 / n as f64));
                let b = f(piece.point((k + 1) as f64 / n as f64));
                total += (b / a).arg();
            }
        }
        (total / (2.0 * PI)).round() as i64
    }

    #[test]
    fn adaptive_count_matches_dense_sampling() {
        // zeros 0.5 (double), 0.2i, −1.5 + 0.5i; poles −0.3i, 2, 0.7 + 0.4i (triple)
        let f = |z: C| {
            (z - 0.5) * (z - 0.5) * (z - C::new(0.0, 0.2)) * (z - C::new(-1.5, 0.5))
                / ((z + C::new(0.0, 0.3)) * (z - 2.0) * (z - C::new(0.7, 0.4)).powi(3))
        };
        let shapes = [
            Contour::circle(C::new(0.0, 0.0), 1.0),
            Contour::circle(C::new(0.0, 0.0), 3.0),
            Contour::rectangle(C::new(-2.0, -1.0), C::new(1.0, 1.0)),
            Contour::Ellipse {
                center: [0.5, 0.0],
                semi_axes: [1.2, 0.35],
                angle: 0.3,
            },
            Contour::Polygon {
                vertices: vec![[0.1, 0.1], [0.1, 0.9], [0.9, 0.9], [0.9, 0.1]],
            },
        ];
        let mut b = Budget::new(10_000_000);
        let mut counts = Vec::new();
        for s in &shapes {
            let slow = count_by_sampling(&f, s);
            assert_eq!(
                count_by_argument_principle(&f, s, &mut b),
                Ok(slow),
                "{s:?}"
            );
            counts.push(slow);
        }
        // by hand from the factors: 3 − 4 = −1 in |z| < 1, 4 − 5 = −1 in |z| < 3, 4 − 4 = 0
        // in the rectangle, and −(0 − 3) = 3 for the clockwise square around the triple pole
        assert_eq!((counts[0], counts[1], counts[2], counts[4]), (-1, -1, 0, 3));
    }

    #[test]
    fn a_cut_crossing_the_contour_is_named_as_such() {
        // Principal sqrt jumps across the negative real axis (common practice).
        let mut b = Budget::new(1_000_000);
        let e = count_by_argument_principle(
            &|z: C| z.sqrt(),
            &Contour::circle(C::new(0.0, 0.0), 2.0),
            &mut b,
        )
        .unwrap_err();
        assert!(is_cut_error(&e), "{e}");
        // A pole on the contour is not called a cut.
        let e = count_by_argument_principle(
            &|z: C| 1.0 / (z - 2.0),
            &Contour::circle(C::new(0.0, 0.0), 2.0),
            &mut b,
        )
        .unwrap_err();
        assert!(!is_cut_error(&e) && e.message().contains("move the contour") && e.kind() == crate::error::FailureKind::OnContour, "{e}");
    }

    #[test]
    fn zero_on_contour_is_reported() {
        let f = |z: C| z - 1.0;
        let mut b = Budget::new(1_000_000);
        let e = count_by_argument_principle(
            &f,
            &Contour::rectangle(C::new(1.0, -1.0), C::new(2.0, 1.0)),
            &mut b,
        )
        .unwrap_err();
        assert!(e.message().contains("move the contour"), "{e}");
    }
}

//! Where a principal-branch cut crosses a contour: the jump discontinuities
//! of f along the curve.
//!
//! Method: sample f along every piece, then bisect each suspicious sample
//! interval (the largest changes, and any change much larger than its
//! neighbours') keeping the half with the larger change — the bisection
//! method for locating a discontinuity (R. L. Burden & J. D. Faires,
//! "Numerical Analysis", §2.1), as in `branch_jump.rs` for circles. The
//! change of a continuous function shrinks with the bracket; a jump does not,
//! so a change that survives 50 halvings is reported as a crossing.

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use crate::error::Failure;
use super::branch_jump::bisect_jump;
use super::{eval, is_finite};
use crate::budget::Budget;
use crate::contour::{Contour, Piece};
use crate::C;

/// Samples per piece for the first pass.
const SAMPLES: usize = 512;
/// Most intervals bisected per piece.
const MAX_CANDIDATES: usize = 16;

/// A place where f jumps along the contour.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Crossing {
    /// Index of the piece in `Contour::pieces()`.
    pub piece: usize,
    /// Parameter on that piece, in [0, 1].
    pub t: f64,
    pub at: C,
}

/// Points of the contour where f jumps (a branch cut crosses the curve there),
/// in order along the curve. Non-finite samples are skipped (the quadrature
/// reports those).
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::contour::Contour;
/// use residuary::singular::cut_crossing::cut_crossings;
/// use residuary::C;
/// // The principal sqrt(z − 3) has its cut on (−∞, 3] (common practice), which
/// // meets the square [−1/2, 1/2]² at −1/2 and 1/2 on its left and right sides.
/// let square = Contour::rectangle(C::new(-0.5, -0.5), C::new(0.5, 0.5));
/// let x = cut_crossings(&|z: C| (z - 3.0).sqrt(), &square, &mut Budget::default()).unwrap();
/// assert_eq!(x.len(), 2);
/// for want in [-0.5, 0.5] {
///     assert!(x.iter().any(|c| (c.at - C::new(want, 0.0)).norm() < 1e-9), "{x:?}");
/// }
/// ```
pub fn cut_crossings(
    f: &dyn Fn(C) -> C,
    contour: &Contour,
    budget: &mut Budget,
) -> Result<Vec<Crossing>, Failure> {
    contour.validate()?;
    let mut out = Vec::new();
    for (i, piece) in contour.pieces().iter().enumerate() {
        for t in piece_crossings(f, piece, budget)? {
            out.push(Crossing {
                piece: i,
                t,
                at: piece.point(t),
            });
        }
    }
    Ok(out)
}

fn piece_crossings(
    f: &dyn Fn(C) -> C,
    piece: &Piece,
    budget: &mut Budget,
) -> Result<Vec<f64>, Failure> {
    // Parameters 0, 1/n, …, 1 (a periodic piece's last interval wraps to t = 1 ≡ 0).
    let n = SAMPLES;
    let ts: Vec<f64> = (0..=n).map(|k| k as f64 / n as f64).collect();
    let mut vals = Vec::with_capacity(n + 1);
    for &t in &ts {
        vals.push(eval(f, piece.point(t), budget)?);
    }
    let max_abs = vals
        .iter()
        .filter(|v| is_finite(**v))
        .map(|v| v.norm())
        .fold(0.0, f64::max);
    let diffs: Vec<f64> = (0..n)
        .map(|j| {
            let d = (vals[j + 1] - vals[j]).norm();
            if d.is_finite() {
                d
            } else {
                0.0
            }
        })
        .collect();
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|&x, &y| diffs[y].total_cmp(&diffs[x]));
    let mut candidates: Vec<usize> = order.iter().take(6).cloned().collect();
    for j in 0..n {
        let l = if j > 0 { diffs[j - 1] } else { 0.0 };
        let r = if j + 1 < n { diffs[j + 1] } else { 0.0 };
        if diffs[j] > 3.0 * l.max(r)
            && !candidates.contains(&j)
            && candidates.len() < MAX_CANDIDATES
        {
            candidates.push(j);
        }
    }
    let mut jumps: Vec<f64> = Vec::new();
    for j in candidates {
        let d0 = diffs[j];
        if !(d0 > 1e-12 * max_abs) {
            continue;
        }
        let point = |t: f64| piece.point(t);
        let b = bisect_jump(f, &point, [(ts[j], vals[j]), (ts[j + 1], vals[j + 1])], 50, budget)?;
        if b.finite && b.size > 0.1 * d0 && b.size > 1e-9 * max_abs {
            jumps.push(b.at);
        }
    }
    jumps.sort_by(|x, y| x.total_cmp(y));
    jumps.dedup_by(|x, y| (*x - *y).abs() < 1e-9);
    Ok(jumps)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn principal_log_crosses_a_circle_once_and_a_nearby_pole_does_not() {
        let mut b = Budget::new(1_000_000);
        // Principal log has its cut on the negative real axis (common practice).
        let circle = Contour::circle(C::new(0.0, 0.0), 1.0);
        let x = cut_crossings(&|z: C| z.ln(), &circle, &mut b).unwrap();
        assert_eq!(x.len(), 1);
        assert!((x[0].at - C::new(-1.0, 0.0)).norm() < 1e-9);
        assert!((x[0].t - 0.5).abs() < 1e-9);
        // sqrt(z − 3): cut (−∞, 3] crosses a unit square twice (common practice).
        let square = Contour::rectangle(C::new(-0.5, -0.5), C::new(0.5, 0.5));
        let x = cut_crossings(&|z: C| (z - 3.0).sqrt(), &square, &mut b).unwrap();
        assert_eq!(x.len(), 2);
        // Slow reference: 200 000 equal steps along the square, counting steps where
        // f changes by more than 0.1 (|f'| ≤ 1/(2√2.5) there, so a smooth step changes
        // by < 1e-4; the jump is 2√|z − 3| ≥ 2√2.5).
        let mut slow = 0;
        for p in square.pieces() {
            let n = 50_000;
            for k in 0..n {
                let a = (p.point(k as f64 / n as f64) - 3.0).sqrt();
                let b = (p.point((k + 1) as f64 / n as f64) - 3.0).sqrt();
                if (b - a).norm() > 0.1 {
                    slow += 1;
                }
            }
        }
        assert_eq!(slow, x.len());
        // A pole just outside: steep but continuous.
        let p = C::new(1.0 + 1e-3, 0.0);
        assert!(cut_crossings(&|z: C| 1.0 / (z - p), &circle, &mut b)
            .unwrap()
            .is_empty());
    }
}

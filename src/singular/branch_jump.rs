//! Detection of jump discontinuities of f along a circle (a principal-branch
//! cut crossing it) by bisection: a jump of an analytic function's values
//! that does not shrink as the bracket shrinks to rounding level is a true
//! discontinuity, not steep smooth variation.
//!
//! Method: bisection on the sample interval with the largest change, keeping
//! the half with the larger change (the bisection method for locating a
//! discontinuity; e.g. R. L. Burden & J. D. Faires, "Numerical Analysis",
//! §2.1); a cut emanating from the centre crosses every small circle an odd
//! number of times, a cut merely passing through the centre an even number.

use super::{eval, is_finite};
use crate::error::Failure;
use crate::budget::Budget;
use crate::C;
use std::f64::consts::PI;

/// Number of jumps found along |z − a| = r, and whether f was finite there.
#[derive(Debug, Clone, PartialEq)]
pub struct JumpScan {
    /// Angles (radians) where f jumps.
    pub jumps: Vec<f64>,
    /// False when f was not finite at some sample.
    pub finite: bool,
}

/// Where bisection of a step of the parameter ended.
pub(crate) struct Bisected {
    /// Midpoint of the final bracket.
    pub at: f64,
    /// |f| difference across the final bracket: stays large only for a jump.
    pub size: f64,
    /// False when f was not finite somewhere on the way (bisection stopped there).
    pub finite: bool,
}

/// Bisect a step `[(t0, f0), (t1, f1)]` of a parametrised path `at(t)`
/// towards the side with the larger change, `steps` times: a jump keeps its
/// size as the bracket shrinks, a steep but continuous change does not
/// (bisection, e.g. Burden & Faires, Numerical Analysis, §2.1).
pub(crate) fn bisect_jump(
    f: &dyn Fn(C) -> C,
    at: &dyn Fn(f64) -> C,
    ends: [(f64, C); 2],
    steps: usize,
    budget: &mut Budget,
) -> Result<Bisected, Failure> {
    let [(mut t0, mut v0), (mut t1, mut v1)] = ends;
    let mut finite = true;
    for _ in 0..steps {
        let tm = 0.5 * (t0 + t1);
        let vm = eval(f, at(tm), budget)?;
        if !is_finite(vm) {
            finite = false;
            break;
        }
        if (vm - v0).norm() >= (v1 - vm).norm() {
            t1 = tm;
            v1 = vm;
        } else {
            t0 = tm;
            v0 = vm;
        }
    }
    Ok(Bisected { at: 0.5 * (t0 + t1), size: (v1 - v0).norm(), finite })
}

/// Scan |z − a| = r with `n` samples, bisect the suspicious intervals, and
/// return the angles of the discontinuities.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::singular::branch_jump::scan_for_jumps;
/// use residuary::C;
/// // The principal log has its cut on (−∞, 0] (common practice); the circle
/// // |z − (0.5 + 0.5i)| = 1 meets it once, where sin θ = −1/2 and 0.5 + cos θ < 0,
/// // at θ = 7π/6 (by hand).
/// let s = scan_for_jumps(&|z: C| z.ln(), C::new(0.5, 0.5), 1.0, 256, &mut Budget::default()).unwrap();
/// assert_eq!(s.jumps.len(), 1);
/// assert!((s.jumps[0] - 7.0 * std::f64::consts::PI / 6.0).abs() < 1e-9, "{:?}", s.jumps);
/// ```
pub fn scan_for_jumps(
    f: &dyn Fn(C) -> C,
    a: C,
    r: f64,
    n: usize,
    budget: &mut Budget,
) -> Result<JumpScan, Failure> {
    let at = |th: f64| a + C::from_polar(r, th);
    let mut vals = Vec::with_capacity(n);
    for j in 0..n {
        let th = 2.0 * PI * j as f64 / n as f64;
        vals.push(eval(f, at(th), budget)?);
    }
    if vals.iter().any(|v| !is_finite(*v)) {
        return Ok(JumpScan {
            jumps: Vec::new(),
            finite: false,
        });
    }
    let max_abs = vals.iter().map(|v| v.norm()).fold(0.0, f64::max);
    let diffs: Vec<f64> = (0..n)
        .map(|j| (vals[(j + 1) % n] - vals[j]).norm())
        .collect();
    // Suspicious: an interval whose change is much larger than both neighbours',
    // or among the largest changes. Bisect at most 12 of them.
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|&x, &y| {
        diffs[y]
            .partial_cmp(&diffs[x])
            .unwrap_or(std::cmp::Ordering::Equal)
    });
    let mut candidates: Vec<usize> = order.iter().take(6).cloned().collect();
    for j in 0..n {
        let l = diffs[(j + n - 1) % n];
        let rr = diffs[(j + 1) % n];
        if diffs[j] > 3.0 * l.max(rr) && !candidates.contains(&j) && candidates.len() < 12 {
            candidates.push(j);
        }
    }
    let mut jumps = Vec::new();
    for j in candidates {
        let d0 = diffs[j];
        if d0 <= 1e-12 * max_abs {
            continue;
        }
        let ends = [
            (2.0 * PI * j as f64 / n as f64, vals[j]),
            (2.0 * PI * (j + 1) as f64 / n as f64, vals[(j + 1) % n]),
        ];
        let b = bisect_jump(f, &at, ends, 44, budget)?;
        if b.size > 0.1 * d0 && b.size > 1e-9 * max_abs.max(f64::MIN_POSITIVE) {
            jumps.push(b.at);
        }
    }
    jumps.sort_by(|x, y| x.partial_cmp(y).unwrap_or(std::cmp::Ordering::Equal));
    jumps.dedup_by(|x, y| (*x - *y).abs() < 1e-9);
    Ok(JumpScan {
        jumps,
        finite: true,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn principal_sqrt_jumps_once_and_a_smooth_spike_does_not() {
        let mut b = Budget::new(1_000_000);
        // Principal sqrt has its cut on the negative real axis (common practice).
        let s = scan_for_jumps(&|z: C| z.sqrt(), C::new(0.0, 0.0), 0.5, 256, &mut b).unwrap();
        assert_eq!(s.jumps.len(), 1);
        // the cut (−∞, 0] meets the circle |z| = 0.5 at angle π (by hand)
        assert!((s.jumps[0] - PI).abs() < 1e-6);
        // A pole just outside the circle: steep but continuous.
        let p = C::new(0.5 + 1e-3, 0.0);
        let s = scan_for_jumps(&|z: C| 1.0 / (z - p), C::new(0.0, 0.0), 0.5, 256, &mut b).unwrap();
        assert!(s.jumps.is_empty());
    }

    /// Slow reference: 2²⁰ equal steps around the circle, a jump wherever one
    /// step changes f by more than a tenth of max |f| (common practice: the
    /// smooth change over a step is ~10⁻⁶ of that), at the step's midpoint.
    fn dense_jumps(f: &dyn Fn(C) -> C, a: C, r: f64) -> Vec<f64> {
        let n = 1 << 20;
        let th = |j: usize| 2.0 * PI * j as f64 / n as f64;
        let vals: Vec<C> = (0..=n).map(|j| f(a + C::from_polar(r, th(j)))).collect();
        let max_abs = vals.iter().map(|v| v.norm()).fold(0.0, f64::max);
        (0..n).filter(|&j| (vals[j + 1] - vals[j]).norm() > 0.1 * max_abs).map(|j| 0.5 * (th(j) + th(j + 1))).collect()
    }

    #[test]
    fn jump_angles_match_dense_sampling() {
        use crate::reference::check_method;
        type F = fn(C) -> C;
        // (f, centre, radius, which jump); the closed-form angle is beside each (by hand).
        let cases: [(&str, (F, C, f64, usize)); 5] = [
            // cut Im z = 0.2, Re z ≤ 0: θ = π − asin 0.2
            ("sqrt(z − 0.2i)", (|z| (z - C::new(0.0, 0.2)).sqrt(), C::new(0.0, 0.0), 1.0, 0)),
            // cut Im z = −0.1, Re z ≤ 0.3: θ = π + asin 0.1
            ("log(z − 0.3 + 0.1i)", (|z| (z - C::new(0.3, -0.1)).ln(), C::new(0.0, 0.0), 1.0, 0)),
            // z² − 1/4 ∈ (−∞, 0] on the imaginary axis: θ = π/2 and 3π/2
            ("sqrt(z² − 1/4), first", (|z| (z * z - 0.25).sqrt(), C::new(0.0, 0.0), 1.0, 0)),
            ("sqrt(z² − 1/4), second", (|z| (z * z - 0.25).sqrt(), C::new(0.0, 0.0), 1.0, 1)),
            // z^{1/3} principal, cut (−∞, 0] met by |z − 0.2| = 0.5 at θ = π
            ("z^(1/3)", (|z| z.powf(1.0 / 3.0), C::new(0.2, 0.0), 0.5, 0)),
        ];
        let closed_form = [PI - 0.2f64.asin(), PI + 0.1f64.asin(), PI / 2.0, 1.5 * PI, PI];
        check_method(
            &cases,
            |&(f, a, r, k)| {
                let s = scan_for_jumps(&f, a, r, 256, &mut Budget::new(1_000_000)).unwrap();
                assert_eq!(s.jumps.len(), dense_jumps(&f, a, r).len(), "{s:?}");
                (C::new(s.jumps[k], 0.0), None)
            },
            |&(f, a, r, k)| C::new(dense_jumps(&f, a, r)[k], 0.0),
            1e-5,
        );
        for ((name, (f, a, r, k)), want) in cases.iter().zip(closed_form) {
            let s = scan_for_jumps(f, *a, *r, 256, &mut Budget::new(1_000_000)).unwrap();
            assert!((s.jumps[*k] - want).abs() < 1e-9, "{name}: {:?} vs {want}", s.jumps);
        }
    }
}

//! Method: does a branch cut of F (as evaluated, principal branches) cross the
//! Talbot contour s(θ) = σ + rθ(cot θ + i)? Sample F at θ in (−π, π), then
//! bisect the suspicious steps (the largest changes, and any much larger than
//! its neighbours') keeping the half with the larger change: the change of a
//! continuous function shrinks with the bracket, a jump does not — the
//! bisection method for locating a discontinuity (R. L. Burden & J. D. Faires,
//! "Numerical Analysis", §2.1), the same test as `singular::cut_crossing` for
//! closed contours, whose `bisect_jump` kernel is reused here. A cut that
//! crosses the contour puts part of it between the contour and the Bromwich
//! line, so the inversion on that contour is wrong by the integral across
//! the cut: such times are declined.
//!
//! ```
//! use residuary::budget::Budget;
//! use residuary::transforms::laplace::contour_cuts::crossing;
//! use residuary::transforms::laplace::fixed_talbot::TalbotPlan;
//! use residuary::C;
//! // Principal sqrt(s² + 1) is cut on the imaginary axis for |Im s| ≥ 1 (common practice);
//! // this contour meets the axis near ±iπr/2 ≈ ±3.1i, across the cut. sqrt(s+i)·sqrt(s−i)
//! // has its cuts running left from ±i, inside the contour.
//! let plan = TalbotPlan { nodes: 24, r: 2.0, shift: 0.1 };
//! let b = &mut Budget::default();
//! assert!(crossing(&|s: C| (s * s + 1.0).sqrt(), plan, b).unwrap().is_some());
//! assert!(crossing(&|s: C| (s + C::i()).sqrt() * (s - C::i()).sqrt(), plan, b).unwrap().is_none());
//! ```

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use super::fixed_talbot::TalbotPlan;
use crate::budget::Budget;
use crate::error::Failure;
use crate::singular::branch_jump::bisect_jump;
use crate::C;
use std::f64::consts::PI;

/// Samples along the contour for the first pass.
const SAMPLES: usize = 256;
/// Most steps bisected.
const MAX_CANDIDATES: usize = 12;
/// The sampled range is |θ| ≤ (1 − this)·π (the ends run off to Re s → −∞).
const END_GAP: f64 = 1.0 / 64.0;

/// The point s(θ) of the contour of `plan`.
pub fn point(plan: TalbotPlan, theta: f64) -> C {
    if theta == 0.0 {
        return C::new(plan.shift + plan.r, 0.0);
    }
    C::new(plan.shift + plan.r * theta / theta.tan(), plan.r * theta)
}

/// A point where F jumps along the contour, if any.
pub fn crossing(f: &dyn Fn(C) -> C, plan: TalbotPlan, budget: &mut Budget) -> Result<Option<C>, Failure> {
    let n = SAMPLES;
    let th: Vec<f64> = (0..=n).map(|k| -PI * (1.0 - END_GAP) * (1.0 - 2.0 * k as f64 / n as f64)).collect();
    budget.spend(n as u64 + 1)?;
    let vals: Vec<C> = th.iter().map(|&x| f(point(plan, x))).collect();
    let finite = |v: &C| v.re.is_finite() && v.im.is_finite();
    let max_abs = vals.iter().filter(|v| finite(v)).map(|v| v.norm()).fold(0.0, f64::max);
    let diffs: Vec<f64> = (0..n)
        .map(|j| {
            let d = (vals[j + 1] - vals[j]).norm();
            if d.is_finite() { d } else { 0.0 }
        })
        .collect();
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|&x, &y| diffs[y].total_cmp(&diffs[x]));
    let mut candidates: Vec<usize> = order.iter().take(6).copied().collect();
    for j in 0..n {
        let l = if j > 0 { diffs[j - 1] } else { 0.0 };
        let r = if j + 1 < n { diffs[j + 1] } else { 0.0 };
        if diffs[j] > 3.0 * l.max(r) && !candidates.contains(&j) && candidates.len() < MAX_CANDIDATES {
            candidates.push(j);
        }
    }
    let at = |x: f64| point(plan, x);
    for j in candidates {
        let d0 = diffs[j];
        if !(d0 > 1e-12 * max_abs) {
            continue;
        }
        let b = bisect_jump(f, &at, [(th[j], vals[j]), (th[j + 1], vals[j + 1])], 50, budget)?;
        // Relative to the values near the step, not the largest anywhere (F may grow to the left).
        let local = vals[j].norm().max(vals[j + 1].norm());
        if b.finite && b.size > 0.1 * d0 && b.size > 1e-9 * local {
            return Ok(Some(at(b.at)));
        }
    }
    Ok(None)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_cut_across_the_contour_is_found_where_it_crosses() {
        // The principal log(w) is cut on w ≤ 0 (common practice): for log(s − 5i) that is the
        // ray Im s = 5, Re s ≤ 0. Where each hand-built contour meets Im s = 5 decides.
        let f = |s: C| (s - C::new(0.0, 5.0)).ln();
        let b = &mut Budget::default();
        // r = 1: Im s ≤ π < 5 everywhere, the ray Im s = 5 is never met.
        assert!(crossing(&f, TalbotPlan { nodes: 24, r: 1.0, shift: 0.0 }, b).unwrap().is_none());
        // r = 4, σ = 0: Im s = 5 at θ = 1.25 where Re s = 4·1.25·cot 1.25 ≈ 1.58 > 0: 5i inside, no crossing.
        assert!(crossing(&f, TalbotPlan { nodes: 24, r: 4.0, shift: 0.0 }, b).unwrap().is_none());
        // r = 4, σ = −3: Re s ≈ −1.42 < 0 at Im s = 5, on the ray: a crossing, found at Im s = 5.
        let x = crossing(&f, TalbotPlan { nodes: 24, r: 4.0, shift: -3.0 }, b).unwrap().expect("a crossing");
        assert!((x.im - 5.0).abs() < 1e-6, "{x}");
    }
}

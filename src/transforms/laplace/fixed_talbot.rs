//! Numerical inversion of the Laplace transform by the fixed Talbot method.
//!
//! Method: J. Abate and P. P. Valkó, "Multi-precision Laplace transform
//! inversion", Int. J. Numer. Meth. Eng. 60 (2004) 979–993. The Bromwich
//! integral f(t) = (1/2πi) ∫ e^{st} F(s) ds is taken along Talbot's contour
//! s(θ) = σ + rθ(cot θ + i), −π < θ < π, with the trapezoidal rule in θ at
//! θ_k = kπ/M. Abate–Valkó choose r = 2M/(5t) and σ = 0; here σ (a shift to
//! the right) and a larger r are used when known singularities of F would
//! otherwise lie outside the region the contour encloses.
//!
//! Both halves of the contour are summed (not 2·Re of one half), so F need not
//! be real on the real axis; the imaginary part of the result is then f's.
//!
//! Error estimate: the values at three node counts M″ < M′ < M. Their
//! difference |f_M − f_M″| bounds the error of the finest when convergence is
//! fast; when it is slow (a singularity close to the widened contour), the
//! ratio q = |f_M − f_M′|/|f_M′ − f_M″| of successive differences measures the
//! geometric rate, and the tail of the geometric series, |f_M − f_M′|·q/(1 − q),
//! doubled for safety, is the estimate (Richardson's reading of a
//! geometrically converging sequence, common practice). Plus a rounding bound
//! ε·Σ|terms| (the terms grow like e^{rt}, which is what limits the method in
//! double precision).

use crate::budget::{Budget, BudgetExceeded};
use crate::C;

/// Nodes of the finer rule at the nominal contour (Abate–Valkó's M).
pub const NODES: usize = 24;
/// Nodes of the coarser rule used for the error estimate.
pub const NODES_COARSE: usize = 18;
/// Nodes of the middle rule (the convergence rate between coarse and fine).
pub const NODES_MIDDLE: usize = 21;
/// Most nodes a widened contour may use.
pub const MAX_NODES: usize = 400;
/// Abate–Valkó's ratio r·t/M.
const RT_PER_NODE: f64 = 0.4;
/// Largest |θ| at which a known singularity may sit on the widened contour.
const THETA_MAX: f64 = 1.2;

/// Where the contour sits for one t: s(θ) = shift + r θ (cot θ + i).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TalbotPlan {
    pub nodes: usize,
    pub r: f64,
    pub shift: f64,
}

/// Why a Talbot sum has no value.
#[derive(Debug, Clone, PartialEq)]
pub enum TalbotError {
    /// F is not finite at this node (a singularity on or near the contour, or overflow).
    NotFinite {
        at: C,
    },
    Budget(BudgetExceeded),
}

/// One inverted value with its error estimate.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TalbotValue {
    pub value: C,
    /// |fine − coarse| + rounding bound.
    pub error_estimate: f64,
    /// The rounding part alone.
    pub rounding: f64,
    pub plan: TalbotPlan,
}

/// The contour for time `t` that keeps every point of `singular` strictly inside
/// (to the left), starting from the nominal r = 2M/(5t), σ = 0.
pub fn plan(t: f64, singular: &[C], nodes: usize) -> TalbotPlan {
    let mut r = 2.0 * nodes as f64 / (5.0 * t);
    // A singularity at height |Im p| needs θ_p = |Im p|/r ≤ THETA_MAX.
    let highest = singular.iter().map(|p| p.im.abs()).fold(0.0, f64::max);
    r = r.max(highest / THETA_MAX);
    let nodes = ((r * t / RT_PER_NODE).ceil() as usize).clamp(nodes, MAX_NODES);
    let mut shift: f64 = 0.0;
    for p in singular {
        let theta = p.im / r;
        let x = if theta == 0.0 {
            r
        } else {
            r * theta / theta.tan()
        };
        // Keep p a tenth of the contour's scale inside.
        shift = shift.max(p.re - x + 0.1 * r);
    }
    TalbotPlan { nodes, r, shift }
}

/// The trapezoidal sum on the contour of `plan` at time `t`; returns the value
/// and Σ|terms|·r/M (for the rounding bound).
pub fn talbot_sum(
    f: &mut dyn FnMut(C) -> C,
    t: f64,
    plan: TalbotPlan,
    budget: &mut Budget,
) -> Result<(C, f64), TalbotError> {
    let m = plan.nodes.max(2);
    budget
        .spend(2 * m as u64 - 1)
        .map_err(TalbotError::Budget)?;
    let weight = plan.r / m as f64;
    let s0 = C::new(plan.shift + plan.r, 0.0);
    let term = |s: C, gamma: C, fs: C| (s * t).exp() * fs * gamma;
    let f0 = f(s0);
    if !f0.is_finite() {
        return Err(TalbotError::NotFinite { at: s0 });
    }
    let t0 = term(s0, C::new(1.0, 0.0), f0);
    let mut sum = 0.5 * t0;
    let mut magnitude = 0.5 * t0.norm();
    for k in 1..m {
        let theta = k as f64 * std::f64::consts::PI / m as f64;
        let cot = 1.0 / theta.tan();
        let delta = C::new(plan.shift + plan.r * theta * cot, plan.r * theta);
        let gamma = C::new(1.0, theta * (1.0 + cot * cot) - cot);
        for (s, g) in [(delta, gamma), (delta.conj(), gamma.conj())] {
            let fs = f(s);
            if !fs.is_finite() {
                return Err(TalbotError::NotFinite { at: s });
            }
            let tk = term(s, g, fs);
            // e^{st} may underflow to 0 with F huge: 0·∞ is excluded above, a
            // non-finite product is overflow.
            if !tk.is_finite() {
                return Err(TalbotError::NotFinite { at: s });
            }
            sum += 0.5 * tk;
            magnitude += 0.5 * tk.norm();
        }
    }
    Ok((sum * weight, magnitude * weight))
}

/// f(t) by fixed Talbot on `plan`, with the coarse rule (same contour shape,
/// fewer nodes in proportion) for the error estimate.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::transforms::laplace::fixed_talbot::{invert, plan, NODES};
/// use residuary::C;
/// // 1/(s + 1) ↔ e^{−t} (Laplace transform table).
/// let v = invert(&mut |s: C| 1.0 / (s + 1.0), 2.0, plan(2.0, &[C::new(-1.0, 0.0)], NODES), &mut Budget::default()).unwrap();
/// assert!((v.value.re - (-2.0f64).exp()).abs() <= v.error_estimate);
/// ```
pub fn invert(
    f: &mut dyn FnMut(C) -> C,
    t: f64,
    plan: TalbotPlan,
    budget: &mut Budget,
) -> Result<TalbotValue, TalbotError> {
    let (fine, magnitude) = talbot_sum(f, t, plan, budget)?;
    let coarse_nodes = (plan.nodes * NODES_COARSE).div_ceil(NODES).max(2);
    let middle_nodes = (plan.nodes * NODES_MIDDLE).div_ceil(NODES).clamp(coarse_nodes + 1, plan.nodes.max(coarse_nodes + 2) - 1);
    let mut at = |nodes: usize, budget: &mut Budget| talbot_sum(f, t, TalbotPlan { nodes, ..plan }, budget).map(|x| x.0);
    let coarse = at(coarse_nodes, budget)?;
    let middle = at(middle_nodes, budget)?;
    // Rounding: each term carries a few ulps from F and from exp; the sum adds m of them.
    let rounding = 64.0 * f64::EPSILON * magnitude;
    let (d_fine, d_coarse) = ((fine - middle).norm(), (middle - coarse).norm());
    let q = d_fine / d_coarse;
    let tail = if q < 0.9 { 2.0 * d_fine * q / (1.0 - q) } else { 10.0 * d_fine.max(d_coarse) };
    let error_estimate = (fine - coarse).norm().max(tail) + rounding;
    Ok(TalbotValue {
        value: fine,
        // Saturate rather than report infinity ("no digits" stays a number on the wire).
        error_estimate: if error_estimate.is_finite() {
            error_estimate
        } else {
            f64::MAX
        },
        rounding,
        plan,
    })
}

/// Relative floor of [`meaningful`]: a value below this × the scale of f counts as zero.
pub const MEANINGFUL_FLOOR: f64 = 1e-3;

/// True when a contour value has at least one meaningful digit: its error
/// estimate is below max(|value|, `MEANINGFUL_FLOOR`·`scale`), `scale` being
/// the size of f at the other times (so a value near a zero of f is kept).
///
/// ```
/// use residuary::transforms::laplace::fixed_talbot::meaningful;
/// use residuary::C;
/// assert!(meaningful(C::new(0.5, 0.0), 1e-9, 1.0));
/// assert!(meaningful(C::new(1e-12, 0.0), 1e-9, 1.0)); // near a zero of f
/// assert!(!meaningful(C::new(8.8, 0.0), 900.0, 1.0)); // the estimate swamps the value
/// assert!(!meaningful(C::new(1.0, 0.0), f64::NAN, 1.0));
/// assert!(meaningful(C::new(0.0, 0.0), 0.0, 0.0)); // exactly zero
/// ```
pub fn meaningful(value: C, error_estimate: f64, scale: f64) -> bool {
    // An exact zero (every term vanished) is meaningful too.
    error_estimate < value.norm().max(MEANINGFUL_FLOOR * scale) || (error_estimate == 0.0 && value.is_finite())
}

/// f(t) at every time in `times` with the contour enclosing `singular`; `None`
/// where F was not finite on the contour (overflow or an unseen singularity).
/// Running out of budget stops the whole series.
pub fn invert_each(
    f: &mut dyn FnMut(C) -> C,
    times: &[f64],
    singular: &[C],
    budget: &mut Budget,
) -> Result<Vec<Option<TalbotValue>>, BudgetExceeded> {
    times
        .iter()
        .map(|&t| match invert(f, t, plan(t, singular, NODES), budget) {
            Ok(v) => Ok(Some(v)),
            Err(TalbotError::NotFinite { .. }) => Ok(None),
            Err(TalbotError::Budget(e)) => Err(e),
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{bromwich, check_method};

    #[test]
    fn talbot_matches_the_bromwich_integral_and_its_estimate_bounds_the_error() {
        // 1/(s + 1)^3 ↔ t² e^{−t}/2 (Laplace transform table, from memory); the slow
        // reference is the Bromwich line integral itself, on Re s = 0.5.
        let f = |s: C| 1.0 / ((s + 1.0) * (s + 1.0) * (s + 1.0));
        let poles = [C::new(-1.0, 0.0)];
        let cases = [("t = 0.1", 0.1), ("t = 1", 1.0), ("t = 4", 4.0), ("t = 10", 10.0)];
        check_method(
            &cases,
            |&t| {
                let v = invert(&mut |s| f(s), t, plan(t, &poles, NODES), &mut Budget::default()).unwrap();
                (v.value, Some(v.error_estimate))
            },
            |&t| bromwich(f, 0.5, t, 4000.0, 800_000),
            1e-6,
        );
    }

    #[test]
    fn high_poles_widen_the_contour_and_stay_inside() {
        // ω/(s² + ω²) ↔ sin ωt (Laplace transform table), ω = 30: the nominal contour
        // would leave the poles ±30i outside.
        let w = 30.0;
        let poles = [C::new(0.0, w), C::new(0.0, -w)];
        let p = plan(1.0, &poles, NODES);
        assert!(p.r >= w / THETA_MAX && p.nodes > NODES, "{p:?}");
        let v = invert(&mut |s: C| w / (s * s + w * w), 1.0, p, &mut Budget::default()).unwrap();
        crate::reference::assert_estimate_bounds(v.value, v.error_estimate, C::new(w.sin(), 0.0), "sin 30t at t = 1");
        // Four digits at least (rounding of the e^{rt}-sized terms limits it).
        assert!(v.error_estimate < 1e-4, "{}", v.error_estimate);
    }

    #[test]
    fn a_singularity_on_the_contour_is_not_finite() {
        // 1/s sampled on a contour that passes through s = 0.8 (its r·θ·cot θ at θ = 0).
        let p = TalbotPlan { nodes: 24, r: 0.8, shift: 0.0 };
        let r = talbot_sum(&mut |s: C| 1.0 / (s - 0.8), 1.0, p, &mut Budget::default());
        assert!(matches!(r, Err(TalbotError::NotFinite { .. })), "{r:?}");
    }
}

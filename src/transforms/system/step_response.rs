//! Step and impulse responses of a continuous F(s), with the step metrics.
//!
//! Method: the step response is y(t) = L⁻¹[F(s)/s](t), the impulse response
//! L⁻¹[F](t), each the residue sum of the exact rational analysis
//! (`transforms::laplace::residues`). The metrics are read on a uniform grid
//! with at least 20 samples per shortest period 2π/max|Im p| and 200 over the
//! span, the span 8 slowest time constants 1/|Re p| (at most [`MAX_SAMPLES`]
//! samples), and each is refined on the closed form (common practice for the
//! definitions, e.g. Ogata, from memory): the steady state y∞ = F(0) when every
//! pole of F lies in the open left half-plane (else none, and no metric);
//! the rise time from 10 % to 90 % of y∞ (first crossings, by bisection); the
//! peak time and overshoot 100·(y_max − y∞)/|y∞| (largest sample, refined by a
//! the zero of y′ = L⁻¹[F] between its neighbours by bisection, else a
//! golden-section search there; 0 when y never exceeds y∞);
//! the settling time, the last time |y − y∞| = 2 % |y∞| (by bisection), or none
//! when the response has not settled by the end of the span.
//!
//! ```
//! use residuary::singular::rational_poles::analyse_rational;
//! use residuary::transforms::system::step_response::{metrics, step_analysis};
//! use residuary::C;
//! // 1/(s + 1): y = 1 − e^{−t}, rise time ln 9, settling ln 50 (by hand).
//! let re = |x: f64| C::new(x, 0.0);
//! let (num, den) = ([re(1.0)], [re(1.0), re(1.0)]);
//! let f = analyse_rational(&num, &den).unwrap();
//! let step = step_analysis(&num, &den).unwrap();
//! let m = metrics(&f, &step, Some(1.0));
//! assert!((m.rise_time.unwrap() - 9f64.ln()).abs() < 1e-9);
//! assert!((m.settling_time.unwrap() - 50f64.ln()).abs() < 1e-9);
//! ```

use crate::error::Failure;
use crate::poly::mul;
use crate::singular::rational_poles::{analyse_rational, RationalAnalysis};
use crate::transforms::laplace::residues::residue_sum;
use crate::C;
use std::f64::consts::PI;

/// Most samples of the metric grid.
pub const MAX_SAMPLES: usize = 20_000;

/// The analysis of F(s)/s.
pub fn step_analysis(num: &[C], den: &[C]) -> Result<RationalAnalysis, Failure> {
    analyse_rational(num, &mul(den, &[C::new(0.0, 0.0), C::new(1.0, 0.0)]))
}

/// Re of the residue sum of `a` at t.
pub fn value(a: &RationalAnalysis, t: f64) -> f64 {
    residue_sum(a, t).0.re
}

/// The uniform sample grid for the poles of F (t₀ = 0 excluded).
pub fn grid(f: &RationalAnalysis) -> Vec<f64> {
    let rates: Vec<f64> = f.poles.iter().map(|p| p.at.re.abs()).filter(|&r| r > 0.0).collect();
    let sizes: Vec<f64> = f.poles.iter().map(|p| p.at.norm()).filter(|&r| r > 0.0).collect();
    let slowest = rates.iter().copied().reduce(f64::min).or(sizes.iter().copied().reduce(f64::min)).unwrap_or(1.0);
    let span = 8.0 / slowest;
    let max_im = f.poles.iter().map(|p| p.at.im.abs()).fold(0.0, f64::max);
    let mut dt = span / 200.0;
    if max_im > 0.0 {
        dt = dt.min(2.0 * PI / max_im / 20.0);
    }
    let n = ((span / dt).ceil() as usize).clamp(2, MAX_SAMPLES);
    (1..=n).map(|k| span * k as f64 / n as f64).collect()
}

/// The step metrics.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct StepMetrics {
    pub steady_state: Option<f64>,
    pub rise_time: Option<f64>,
    pub overshoot_percent: Option<f64>,
    pub settling_time: Option<f64>,
    pub peak_time: Option<f64>,
}

fn bisect(g: &dyn Fn(f64) -> f64, mut a: f64, mut b: f64) -> f64 {
    let ga = g(a) > 0.0;
    for _ in 0..80 {
        let m = 0.5 * (a + b);
        if m == a || m == b {
            break;
        }
        if (g(m) > 0.0) == ga {
            a = m;
        } else {
            b = m;
        }
    }
    0.5 * (a + b)
}

fn golden_max(g: &dyn Fn(f64) -> f64, mut a: f64, mut b: f64) -> f64 {
    let r = (5f64.sqrt() - 1.0) / 2.0;
    for _ in 0..100 {
        let (c, d) = (b - r * (b - a), a + r * (b - a));
        if g(c) > g(d) {
            b = d;
        } else {
            a = c;
        }
        if b - a <= 4.0 * f64::EPSILON * b.abs() {
            break;
        }
    }
    0.5 * (a + b)
}

/// The metrics of the step response `step` of F (`f`), with y∞ = `steady_state` (None: unstable or marginal).
pub fn metrics(f: &RationalAnalysis, step: &RationalAnalysis, steady_state: Option<f64>) -> StepMetrics {
    let Some(yinf) = steady_state.filter(|y| *y != 0.0 && y.is_finite()) else {
        return StepMetrics { steady_state, ..Default::default() };
    };
    let t = grid(f);
    let y = |x: f64| value(step, x) / yinf;
    let ys: Vec<f64> = t.iter().map(|&x| y(x)).collect();
    let y0 = y(0.0);
    let crossing = |level: f64| -> Option<f64> {
        let mut prev = (0.0, y0);
        for (&x, &v) in t.iter().zip(&ys) {
            if (prev.1 - level) * (v - level) <= 0.0 && prev.1 != v {
                return Some(bisect(&|s| y(s) - level, prev.0, x));
            }
            prev = (x, v);
        }
        None
    };
    let rise_time = match (crossing(0.1), crossing(0.9)) {
        (Some(a), Some(b)) if y0 < 0.1 => Some(b - a),
        _ => None,
    };
    let k = (0..ys.len()).max_by(|&i, &j| ys[i].total_cmp(&ys[j])).unwrap_or(0);
    let (peak_time, overshoot_percent) = if ys[k] > 1.0 && k + 1 < ys.len() {
        let lo = if k == 0 { 0.0 } else { t[k - 1] };
        // The peak is a zero of y′ = the impulse response (F itself): bisection where it changes sign.
        let slope = |x: f64| value(f, x);
        let tp = if slope(lo) > 0.0 && slope(t[k + 1]) < 0.0 { bisect(&slope, lo, t[k + 1]) } else { golden_max(&y, lo, t[k + 1]) };
        (Some(tp), Some(100.0 * (y(tp) - 1.0)))
    } else {
        (None, Some(0.0))
    };
    let band = 0.02;
    let outside = (0..ys.len()).rev().find(|&i| (ys[i] - 1.0).abs() > band);
    let settling_time = match outside {
        None => Some(0.0).filter(|_| (y0 - 1.0).abs() <= band),
        Some(i) if i + 1 < ys.len() => Some(bisect(&|s| (y(s) - 1.0).abs() - band, t[i], t[i + 1])),
        Some(_) => None,
    };
    StepMetrics { steady_state, rise_time, overshoot_percent, settling_time, peak_time }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::bromwich;

    #[test]
    fn step_values_agree_with_the_bromwich_integral_as_written() {
        // y = L⁻¹[F/s] for F = 5/(s² + 2s + 5), against the Bromwich integral on Re s = 1 taken by Simpson's rule.
        let re = |x: f64| C::new(x, 0.0);
        let (num, den) = ([re(5.0)], [re(5.0), re(2.0), re(1.0)]);
        let step = step_analysis(&num, &den).unwrap();
        for t in [0.5, 1.0, 3.0] {
            let want = bromwich(|s| re(5.0) / ((s * s + s * 2.0 + 5.0) * s), 1.0, t, 4000.0, 400_000).re;
            assert!((value(&step, t) - want).abs() < 2e-4, "t = {t}: {} vs {want}", value(&step, t));
        }
        // Overshoot e^{−πζ/√(1−ζ²)} with ωn = √5, ζ = 1/√5 (second-order step, from memory).
        let f = analyse_rational(&num, &den).unwrap();
        let m = metrics(&f, &step, Some(1.0));
        let zeta = 1.0 / 5f64.sqrt();
        let want = 100.0 * (-std::f64::consts::PI * zeta / (1.0 - zeta * zeta).sqrt()).exp();
        assert!((m.overshoot_percent.unwrap() - want).abs() < 1e-9 * want);
    }
}

/// The step metrics of a sampled (discrete) step response y[n] at t = nT, read on the samples
/// themselves (same definitions): the rise time from the first sample ≥ 10 % to the first ≥ 90 %
/// of y∞, the largest sample and its time for the overshoot and peak, and the settling time as
/// the first sample after the last one outside the 2 % band (none when that is the last sample).
///
/// ```
/// use residuary::transforms::system::step_response::sequence_metrics;
/// // y[n] = 1 − 0.5^(n+1), the step response of 0.5z/(z − 0.5)·… read by hand: 0.5, 0.75, 0.875, …
/// let y: Vec<f64> = (0..20).map(|n| 1.0 - 0.5f64.powi(n + 1)).collect();
/// let m = sequence_metrics(&y, 1.0, Some(1.0));
/// assert_eq!(m.rise_time, Some(3.0)); // 0.5 ≥ 0.1 at n = 0; 0.9375 ≥ 0.9 at n = 3
/// assert_eq!(m.settling_time, Some(5.0)); // |y − 1| = 0.03125 > 0.02 at n = 4, then 0.016
/// assert_eq!(m.overshoot_percent, Some(0.0));
/// ```
pub fn sequence_metrics(y: &[f64], period: f64, steady_state: Option<f64>) -> StepMetrics {
    let Some(yinf) = steady_state.filter(|y| *y != 0.0 && y.is_finite()) else {
        return StepMetrics { steady_state, ..Default::default() };
    };
    let r: Vec<f64> = y.iter().map(|v| v / yinf).collect();
    let first = |level: f64| r.iter().position(|&v| v >= level);
    let rise_time = match (first(0.1), first(0.9)) {
        (Some(a), Some(b)) => Some((b - a) as f64 * period),
        _ => None,
    };
    let k = (0..r.len()).max_by(|&i, &j| r[i].total_cmp(&r[j]));
    let (peak_time, overshoot_percent) = match k {
        Some(k) if r[k] > 1.0 => (Some(k as f64 * period), Some(100.0 * (r[k] - 1.0))),
        _ => (None, Some(0.0)),
    };
    let settling_time = match (0..r.len()).rev().find(|&i| (r[i] - 1.0).abs() > 0.02) {
        None => Some(0.0),
        Some(i) if i + 1 < r.len() => Some((i + 1) as f64 * period),
        Some(_) => None,
    };
    StepMetrics { steady_state, rise_time, overshoot_percent, settling_time, peak_time }
}

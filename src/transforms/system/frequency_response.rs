//! Frequency response and stability margins.
//!
//! Method: F(jω) (continuous) or F(e^{jωT}) for 0 < ω ≤ π/T (discrete), the
//! magnitude in decibels 20 log10|F| and the phase in degrees unwrapped along
//! the grid (each step taken as the principal change arg(F(ωₖ₊₁)/F(ωₖ)), so the
//! phase is continuous wherever the grid resolves it). The default grid is
//! logarithmic, 200 points per decade from a decade below the smallest nonzero
//! |pole| or |zero| (in z: of the equivalent s-plane roots ln(p)/T) to a decade
//! above the largest (in z: up to π/T), at most [`MAX_GRID`] points (the
//! density drops for wider spans); with no nonzero root it spans 0.1 to 10.
//! Margins (common practice, e.g. Ogata, from memory): at a gain crossover
//! |F| = 1 the phase margin is 180° + phase (reduced to (−180°, 180°]); at a
//! phase crossover, phase = −180° (mod 360°), the gain margin is −20 log10|F|
//! dB. Crossings are bracketed on the grid and refined by bisection on the
//! exact F (60 halvings, to rounding).
//!
//! ```
//! use residuary::transforms::system::{frequency_response::{margins, response}, Domain};
//! use residuary::C;
//! // F = 2/(s + 1): |F(jω)| = 1 at ω = √3, phase −60°, so the phase margin is 120° (by hand).
//! let f = |s: C| C::new(2.0, 0.0) / (s + 1.0);
//! let r = response(&f, &[0.1, 1.0, 10.0], Domain::S);
//! let m = margins(&f, &r, Domain::S);
//! assert!((m.gain_crossovers[0] - 3f64.sqrt()).abs() < 1e-12);
//! assert!((m.phase_margins[0] - 120.0).abs() < 1e-9);
//! ```

use super::Domain;
use crate::C;
use std::f64::consts::PI;

/// Points per decade of the default grid.
pub const PER_DECADE: f64 = 200.0;
/// Most points of the default grid.
pub const MAX_GRID: usize = 4001;

/// F sampled along the frequency axis.
#[derive(Debug, Clone, PartialEq)]
pub struct FrequencyResponse {
    /// Angular frequencies ω (rad per unit time).
    pub omega: Vec<f64>,
    pub value: Vec<C>,
    pub magnitude_db: Vec<f64>,
    /// Unwrapped, degrees.
    pub phase_deg: Vec<f64>,
}

/// The point of the frequency axis: jω, or e^{jωT}.
pub fn axis_point(omega: f64, domain: Domain) -> C {
    match domain {
        Domain::S => C::new(0.0, omega),
        Domain::Z { period } => C::from_polar(1.0, omega * period),
    }
}

/// The default grid from the nonzero root sizes (s-plane sizes; ω in rad per unit time).
pub fn default_grid(root_sizes: &[f64], domain: Domain) -> Vec<f64> {
    let sizes: Vec<f64> = root_sizes.iter().copied().filter(|&r| r > 0.0 && r.is_finite()).collect();
    let (mut lo, mut hi) = match (sizes.iter().copied().reduce(f64::min), sizes.iter().copied().reduce(f64::max)) {
        (Some(a), Some(b)) => (a / 10.0, b * 10.0),
        _ => (0.1, 10.0),
    };
    if let Domain::Z { period } = domain {
        let nyquist = PI / period;
        hi = nyquist;
        lo = lo.clamp(nyquist * 1e-6, nyquist * 1e-2);
    }
    // Root sizes near the ends of double precision (1e308 × 10 overflows): keep the grid finite.
    let (lo, hi) = (lo.clamp(1e-300, 1e300), hi.clamp(1e-300, 1e300));
    let (lo, hi) = if hi > lo { (lo, hi) } else { (lo, lo * 10.0) };
    let decades = (hi / lo).log10();
    let n = ((decades * PER_DECADE).ceil().min(MAX_GRID as f64) as usize).saturating_add(1).clamp(2, MAX_GRID);
    (0..n).map(|k| lo * (hi / lo).powf(k as f64 / (n - 1) as f64)).collect()
}

/// F along the axis at the given ω, phase unwrapped from the principal value at the first ω.
pub fn response(f: &dyn Fn(C) -> C, omega: &[f64], domain: Domain) -> FrequencyResponse {
    let value: Vec<C> = omega.iter().map(|&w| f(axis_point(w, domain))).collect();
    let magnitude_db = value.iter().map(|v| 20.0 * v.norm().log10()).collect();
    let mut phase_deg = Vec::with_capacity(value.len());
    for (k, v) in value.iter().enumerate() {
        let phase = if k == 0 || !value[k - 1].is_finite() || !v.is_finite() || value[k - 1].norm() == 0.0 {
            v.arg().to_degrees()
        } else {
            phase_deg[k - 1] + (v / value[k - 1]).arg().to_degrees()
        };
        phase_deg.push(phase);
    }
    FrequencyResponse { omega: omega.to_vec(), value, magnitude_db, phase_deg }
}

/// Crossovers and margins.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Margins {
    /// ω where |F| = 1.
    pub gain_crossovers: Vec<f64>,
    /// 180° + phase at each gain crossover, in (−180°, 180°].
    pub phase_margins: Vec<f64>,
    /// ω where the phase is −180° (mod 360°).
    pub phase_crossovers: Vec<f64>,
    /// −20 log10|F| at each phase crossover, dB.
    pub gain_margins: Vec<f64>,
}

/// Bisection of a sign change of `g` on [a, b] (g(a), g(b) of opposite signs or zero).
fn bisect(g: &dyn Fn(f64) -> f64, mut a: f64, mut b: f64) -> f64 {
    let ga = g(a);
    if ga == 0.0 {
        return a;
    }
    for _ in 0..60 {
        let m = 0.5 * (a + b);
        let gm = g(m);
        if gm == 0.0 || m == a || m == b {
            return m;
        }
        if (gm > 0.0) == (ga > 0.0) {
            a = m;
        } else {
            b = m;
        }
    }
    0.5 * (a + b)
}

/// Reduce an angle in degrees to (−180, 180].
fn reduce(deg: f64) -> f64 {
    let r = deg.rem_euclid(360.0);
    if r > 180.0 {
        r - 360.0
    } else {
        r
    }
}

/// Gain and phase crossovers of the sampled response, refined on the exact F.
pub fn margins(f: &dyn Fn(C) -> C, r: &FrequencyResponse, domain: Domain) -> Margins {
    let mut m = Margins::default();
    let finite = |k: usize| r.value[k].is_finite() && r.value[k].norm() > 0.0;
    for k in 0..r.omega.len().saturating_sub(1) {
        if !(finite(k) && finite(k + 1)) {
            continue;
        }
        let (a, b) = (r.omega[k], r.omega[k + 1]);
        // Gain crossover: log|F| changes sign (a zero at the right end belongs to the next interval).
        let log_mag = |w: f64| f(axis_point(w, domain)).norm().ln();
        let (la, lb) = (r.magnitude_db[k], r.magnitude_db[k + 1]);
        if (la > 0.0 && lb <= 0.0) || (la < 0.0 && lb >= 0.0) {
            let w = bisect(&log_mag, a, b);
            let phase = r.phase_deg[k] + (f(axis_point(w, domain)) / r.value[k]).arg().to_degrees();
            m.gain_crossovers.push(w);
            m.phase_margins.push(reduce(180.0 + phase));
        }
        // Phase crossover: the unwrapped phase passes −180° + 360°·n.
        let (pa, pb) = (r.phase_deg[k], r.phase_deg[k + 1]);
        let (na, nb) = (((pa + 180.0) / 360.0).floor(), ((pb + 180.0) / 360.0).floor());
        if na != nb {
            let target = 360.0 * na.max(nb) - 180.0;
            let phase = |w: f64| r.phase_deg[k] + (f(axis_point(w, domain)) / r.value[k]).arg().to_degrees() - target;
            let w = bisect(&phase, a, b);
            m.phase_crossovers.push(w);
            m.gain_margins.push(-20.0 * f(axis_point(w, domain)).norm().log10());
        }
    }
    m
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::check_method;

    #[test]
    fn magnitude_and_unwrapped_phase_of_three_lags() {
        // F = 1000/((s+1)(s+10)(s+100)): |F| = 1000/Π√(ω² + a²), phase −Σ atan(ω/a), reaching −270°
        // (first-order lags, common practice): the unwrapped phase must pass −180° continuously.
        let f = |s: C| C::new(1000.0, 0.0) / ((s + 1.0) * (s + 10.0) * (s + 100.0));
        let grid = default_grid(&[1.0, 10.0, 100.0], Domain::S);
        assert_eq!(grid.len(), 801, "0.1 to 1000: 4 decades at 200 per decade");
        let r = response(&f, &grid, Domain::S);
        let cases: Vec<(String, usize)> = (0..grid.len()).step_by(97).map(|k| (format!("ω = {}", grid[k]), k)).collect();
        let cases: Vec<(&str, usize)> = cases.iter().map(|(n, k)| (n.as_str(), *k)).collect();
        check_method(&cases, |&k| (C::new(r.magnitude_db[k], r.phase_deg[k]), None), |&k| {
            let w = grid[k];
            let mag: f64 = [1.0f64, 10.0, 100.0].iter().map(|a| (w * w + a * a).sqrt()).product();
            let phase: f64 = [1.0f64, 10.0, 100.0].iter().map(|a| -(w / a).atan().to_degrees()).sum();
            C::new(20.0 * (1000.0 / mag).log10(), phase)
        }, 1e-12);
        // Phase crossover where Σ atan(ω/a) = 180°: at ω² = 1110 (the product of the sums rule,
        // ω² = a b + b c + c a for three lags; by hand).
        let m = margins(&f, &r, Domain::S);
        assert_eq!(m.phase_crossovers.len(), 1);
        assert!((m.phase_crossovers[0] - 1110f64.sqrt()).abs() < 1e-10, "{m:?}");
    }
}

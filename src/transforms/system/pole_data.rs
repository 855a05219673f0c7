//! Pole and zero data of a transfer function.
//!
//! Method: for an s-plane root q (a pole or a zero), common practice in control
//! texts (e.g. Ogata, *Modern Control Engineering*, from memory): a real root
//! q < 0 has the time constant τ = −1/q; a complex root has the natural
//! frequency ωn = |q|, the damping ratio ζ = −Re q/|q| and the quality factor
//! Q = 1/(2ζ). A z-plane root p maps to its equivalent s-plane root
//! q = ln(p)/T (principal logarithm; sampling period T; from memory, the
//! mapping z = e^{sT}), and the same quantities are read from q, plus |p|.
//! The DC gain is F(0) (F(1) in z), infinite with the count of poles there
//! (integrators); the high-frequency gain is the ratio of leading coefficients
//! when the relative degree deg den − deg num is 0, else 0 (relative degree
//! > 0) or infinite (< 0); in z it is F(−1), the gain at the Nyquist frequency.
//!
//! ```
//! use residuary::transforms::system::{pole_data::root_data, Domain};
//! use residuary::C;
//! // s² + 2ζωn s + ωn² with ωn = 2, ζ = 0.3 has roots −0.6 ± 1.9079j (quadratic formula).
//! let q = C::new(-0.6, (4.0f64 - 0.36).sqrt());
//! let d = root_data(q, 1, Domain::S);
//! assert!((d.natural_frequency.unwrap() - 2.0).abs() < 1e-12);
//! assert!((d.damping_ratio.unwrap() - 0.3).abs() < 1e-12);
//! ```

use super::Domain;
use crate::singular::rational_poles::RationalAnalysis;
use crate::C;

/// The data of one pole or zero.
#[derive(Debug, Clone, PartialEq)]
pub struct RootData {
    pub at: C,
    pub order: u32,
    /// z only: the equivalent s-plane root ln(p)/T (`None` for p = 0).
    pub s_equivalent: Option<C>,
    /// z only: |p|.
    pub magnitude: Option<f64>,
    /// Real s-plane root q < 0: τ = −1/q.
    pub time_constant: Option<f64>,
    /// Complex s-plane root: ωn = |q|.
    pub natural_frequency: Option<f64>,
    /// Complex s-plane root: ζ = −Re q/|q|.
    pub damping_ratio: Option<f64>,
    /// Complex s-plane root with ζ ≠ 0: Q = 1/(2ζ).
    pub quality_factor: Option<f64>,
}

/// A root is real when its imaginary part is at rounding level of its size.
pub fn is_real(q: C) -> bool {
    q.im.abs() <= 1e-9 * q.norm().max(f64::MIN_POSITIVE)
}

/// The data of the root `at` of the given order.
pub fn root_data(at: C, order: u32, domain: Domain) -> RootData {
    let (q, s_equivalent, magnitude) = match domain {
        Domain::S => (Some(at), None, None),
        Domain::Z { period } => {
            let q = (at.norm() > 0.0).then(|| at.ln() / period);
            (q, q, Some(at.norm()))
        }
    };
    let mut d = RootData {
        at,
        order,
        s_equivalent,
        magnitude,
        time_constant: None,
        natural_frequency: None,
        damping_ratio: None,
        quality_factor: None,
    };
    if let Some(q) = q {
        if is_real(q) {
            d.time_constant = (q.re < 0.0).then(|| -1.0 / q.re);
        } else {
            let wn = q.norm();
            let zeta = -q.re / wn;
            d.natural_frequency = Some(wn);
            d.damping_ratio = Some(zeta);
            d.quality_factor = (zeta != 0.0).then(|| 1.0 / (2.0 * zeta));
        }
    }
    d
}

/// A gain: finite (`value`), or infinite through `pole_order` poles at the point.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Gain {
    pub value: Option<C>,
    /// Poles at the point (integrators for the DC gain); 0 when finite.
    pub pole_order: u32,
}

/// Poles of `a` at `point` (to rounding at the poles' scale), summed by order.
fn poles_at(a: &RationalAnalysis, point: C) -> u32 {
    let scale = a.poles.iter().map(|p| p.at.norm()).fold(1.0, f64::max);
    a.poles.iter().filter(|p| (p.at - point).norm() <= 1e-9 * scale + 4.0 * p.location_error).map(|p| p.order).sum()
}

/// F at a point, infinite where a pole sits; a removable point gives its limit.
pub fn gain_at(a: &RationalAnalysis, f: &dyn Fn(C) -> C, point: C) -> Gain {
    let pole_order = poles_at(a, point);
    if pole_order > 0 {
        return Gain { value: None, pole_order };
    }
    let removable = a.removable.iter().find(|r| (r.at - point).norm() <= 1e-9 * point.norm().max(1.0));
    Gain { value: Some(removable.map(|r| r.value).unwrap_or_else(|| f(point))), pole_order: 0 }
}

/// The DC gain: F(0) in s, F(1) in z.
pub fn dc_gain(a: &RationalAnalysis, f: &dyn Fn(C) -> C, domain: Domain) -> Gain {
    let point = match domain {
        Domain::S => C::new(0.0, 0.0),
        Domain::Z { .. } => C::new(1.0, 0.0),
    };
    gain_at(a, f, point)
}

/// deg den − deg num after cancellation.
pub fn relative_degree(a: &RationalAnalysis) -> i32 {
    -a.infinity_order
}

/// The high-frequency gain: in s the limit at infinity (`num_lead/den_lead` of
/// the reduced F, or 0, or infinite with the relative degree's size as
/// `pole_order`); in z, F(−1).
pub fn high_frequency_gain(a: &RationalAnalysis, f: &dyn Fn(C) -> C, lead_ratio: C, domain: Domain) -> Gain {
    match domain {
        Domain::Z { .. } => gain_at(a, f, C::new(-1.0, 0.0)),
        Domain::S => match relative_degree(a) {
            0 => Gain { value: Some(lead_ratio), pole_order: 0 },
            r if r > 0 => Gain { value: Some(C::new(0.0, 0.0)), pole_order: 0 },
            r => Gain { value: None, pole_order: (-r) as u32 },
        },
    }
}

/// True when every pole of `a` is strictly on the stable side: Re p < 0 (s) or |p| < 1 (z),
/// beyond rounding at the pole's size (common practice).
pub fn all_stable(a: &RationalAnalysis, domain: Domain) -> bool {
    a.poles.iter().all(|p| match domain {
        Domain::S => p.at.re < -1e-9 * p.at.norm() - 4.0 * p.location_error,
        Domain::Z { .. } => p.at.norm() < 1.0 - 1e-9 - 4.0 * p.location_error,
    })
}

/// Nonzero sizes of the s-plane roots (poles and zeros; in z of ln(p)/T), for the default frequency grid.
pub fn root_sizes(a: &RationalAnalysis, domain: Domain) -> Vec<f64> {
    let all = a.poles.iter().map(|p| p.at).chain(a.zeros.iter().map(|z| z.at));
    all.filter_map(|q| match domain {
        Domain::S => Some(q.norm()),
        Domain::Z { period } => (q.norm() > 0.0).then(|| (q.ln() / period).norm()),
    })
    .collect()
}

/// Samples spanning 8 slowest time constants of a discrete system (16 to `cap`; 64 without a decaying pole).
pub fn discrete_span(a: &RationalAnalysis, cap: usize) -> usize {
    let slowest = a.poles.iter().filter(|p| p.at.norm() > 0.0).map(|p| -p.at.norm().ln()).filter(|&r| r > 0.0).fold(f64::INFINITY, f64::min);
    if slowest.is_finite() { (8.0 / slowest).ceil() as usize + 1 } else { 64 }.clamp(16, cap)
}

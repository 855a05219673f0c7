//! Decay and growth tests that justify dropping the large arcs of a closed
//! contour (and refusing integrals over ℝ that diverge).
//!
//! Method:
//! - **Rational f = p/q** (degree-difference rule): |f(z)| ~ c |z|^(deg p − deg q)
//!   as z → ∞, so ∫_ℝ f dx converges and the half-circle contribution vanishes
//!   when deg q − deg p ≥ 2; with the factor e^{iωx}, ω ≠ 0, Jordan's lemma
//!   needs only f → 0, deg q − deg p ≥ 1 (L. V. Ahlfors, "Complex Analysis",
//!   3rd ed., McGraw-Hill 1979, ch. 4 §5.3 — from memory).
//! - **Other f** (sampling, common practice, a heuristic rather than a proof):
//!   |f| is sampled at x = ±2^k, k = −4 … 20 ([`sample_abs`]); ∫ f dx is taken
//!   to converge when |x f(x)| has fallen by 4 from 2^16 to 2^20 and below 1% of
//!   the peak of |f|, a Fourier amplitude when |f| itself falls by 2 (and below
//!   1%). The search box radius R is the smallest 2^k (k = 2 … 8, else 256)
//!   beyond which |f| stays under 1% of its peak. The arcs are dropped when
//!   the maximum of |f| on the half circles |z| = 2R and 4R ([`arc_max`]) falls
//!   by at least 3/4 (for ω = 0, the arc length times the maximum must fall so).

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use crate::error::Failure;
use crate::C;
use std::f64::consts::PI;
use std::ops::RangeInclusive;


/// Sign of the half-plane where e^{iωz} decays, the one a residue sum closes in:
/// +1 upper (ω ≥ 0), −1 lower (Jordan's lemma).
pub fn half_plane(omega: f64) -> f64 {
    if omega < 0.0 {
        -1.0
    } else {
        1.0
    }
}

/// The degree-difference rule: `Ok` when the residue formula applies to the
/// rational f = num/den whose order at infinity is `infinity_order`
/// (deg num − deg den), for ∫ f dx (ω = 0) or ∫ f e^{iωx} dx (ω ≠ 0).
/// The zero polynomial always passes.
///
/// ```
/// use residuary::singular::decay::check_rational_decay;
/// use residuary::C;
/// let x = [C::new(0.0, 0.0), C::new(1.0, 0.0)]; // f = x/(x² + 1): order −1 at ∞
/// assert!(check_rational_decay(&x, -1, 0.0).is_err()); // ∫ x/(x²+1) dx diverges
/// assert!(check_rational_decay(&x, -1, 1.0).is_ok()); // Jordan's lemma with ω = 1
/// ```
pub fn check_rational_decay(num: &[C], infinity_order: i32, omega: f64) -> Result<(), Failure> {
    if crate::poly::trim(num).is_empty() {
        return Ok(());
    }
    let decay = -infinity_order;
    if omega == 0.0 && decay < 2 {
        return Err(Failure::divergent(format!(
            "∫ f(x) dx over the whole real line diverges: f falls off only like 1/x^{decay} (the residue formula needs deg denominator − deg numerator ≥ 2, here {decay}); for an oscillating factor use kind \"fourier\" with omega ≠ 0"
        )));
    }
    if omega != 0.0 && decay < 1 {
        return Err(Failure::divergent(format!(
            "∫ f(x) e^(iωx) dx diverges: the amplitude f does not tend to 0 at infinity (deg denominator − deg numerator = {decay}, needs ≥ 1)"
        )));
    }
    Ok(())
}

/// max |f| over x = ±2^k for each k in `ks`, as `(2^k, max)`; a non-finite
/// value is a singularity on the real axis (`Divergent`).
pub fn sample_abs(f: &dyn Fn(C) -> C, ks: RangeInclusive<i32>) -> Result<Vec<(f64, f64)>, Failure> {
    let mut out = Vec::new();
    for k in ks {
        let x = 2f64.powi(k);
        let mut m: f64 = 0.0;
        for s in [x, -x] {
            let v = f(C::new(s, 0.0));
            if !(v.re.is_finite() && v.im.is_finite()) {
                return Err(Failure::divergent(format!(
                    "f is not finite at x = {s}: a singularity lies on the real axis, so the integral diverges (principal values are computed for rational f only)"
                )));
            }
            m = m.max(v.norm());
        }
        out.push((x, m));
    }
    Ok(out)
}

/// Largest |f| at 48 equispaced (midpoint) angles of the half circle |z| = ρ
/// in the half-plane σ = ±1; `None` if f is not finite there.
pub fn arc_max(f: &dyn Fn(C) -> C, rho: f64, sigma: f64) -> Option<f64> {
    let n = 48;
    let mut m: f64 = 0.0;
    for j in 0..n {
        let phi = PI * (j as f64 + 0.5) / n as f64;
        let v = f(C::from_polar(rho, sigma * phi));
        if !(v.re.is_finite() && v.im.is_finite()) {
            return None;
        }
        m = m.max(v.norm());
    }
    Some(m)
}

/// What sampling says about a non-rational f on the real line.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LineDecay {
    /// R: |f| has fallen to 1% of its peak beyond |x| = R (searched box radius).
    pub box_radius: f64,
    /// True when |f| decays on the half circles |z| = 2R, 4R of the closing half-plane.
    pub arcs_decay: bool,
}

/// The sampling tests of the module doc for ∫ f(x) e^{iωx} dx; `Err` when f
/// does not seem to decay on the real axis (the integral may diverge).
pub fn line_decay(f: &dyn Fn(C) -> C, omega: f64) -> Result<LineDecay, Failure> {
    let samples = sample_abs(f, -4..=20)?;
    let peak = samples.iter().map(|s| s.1).fold(0.0, f64::max);
    let at = |k: i32| samples[(k + 4) as usize].1;
    let tiny = 1e-300;
    if omega == 0.0 {
        let (a16, a20) = (at(16) * 2f64.powi(16), at(20) * 2f64.powi(20));
        if !(a20 <= 0.25 * a16 + tiny && a20 <= 1e-2 * peak + tiny) {
            return Err(Failure::invalid(
                "f does not appear to decay like 1/x² on the real axis (sampled up to |x| = 2^20), so ∫ f(x) dx may diverge; for an oscillating factor use kind \"fourier\"",
            ));
        }
    } else if !(at(20) <= 0.5 * at(16) + tiny && at(20) <= 1e-2 * peak + tiny) {
        return Err(Failure::invalid(
            "the amplitude f does not appear to tend to 0 on the real axis (sampled up to |x| = 2^20), so the Fourier integral may diverge",
        ));
    }
    let r = (2..=8)
        .map(|k| 2f64.powi(k))
        .find(|&x| samples.iter().filter(|s| s.0 >= x).all(|s| s.1 <= 1e-2 * peak))
        .unwrap_or(256.0);
    let sigma = half_plane(omega);
    let arcs_decay = match (arc_max(f, 2.0 * r, sigma), arc_max(f, 4.0 * r, sigma)) {
        (Some(m2), Some(m4)) if omega == 0.0 => 4.0 * r * m4 <= 0.75 * 2.0 * r * m2 + tiny,
        (Some(m2), Some(m4)) => m4 <= 0.75 * m2 + tiny,
        _ => false,
    };
    Ok(LineDecay { box_radius: r, arcs_decay })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::error::FailureKind;
    use crate::reference::check_method;

    /// Slow reference: max |f| on the half circle by dense sampling.
    fn dense_arc_max(f: &dyn Fn(C) -> C, rho: f64, sigma: f64) -> f64 {
        (0..=20_000)
            .map(|j| f(C::from_polar(rho, sigma * PI * j as f64 / 20_000.0)).norm())
            .fold(0.0, f64::max)
    }

    #[test]
    fn arc_maxima_match_dense_sampling() {
        let lorentz = |z: C| 1.0 / (z * z + 1.0);
        let shifted = |z: C| 1.0 / (z - C::new(0.5, 2.0));
        let growing = |z: C| (C::new(0.0, 1.0) * z).exp() / z;
        type F<'a> = &'a dyn Fn(C) -> C;
        let cases: [(&str, (F, f64, f64)); 4] = [
            ("1/(z²+1), upper, ρ = 4", (&lorentz, 4.0, 1.0)),
            ("1/(z²+1), lower, ρ = 16", (&lorentz, 16.0, -1.0)),
            ("1/(z − 0.5 − 2i), upper, ρ = 8", (&shifted, 8.0, 1.0)),
            ("e^{iz}/z, lower, ρ = 0.5 (grows like e^{ρ sin φ})", (&growing, 0.5, -1.0)),
        ];
        // 48 angles miss the true maximum by O((π/96)²) of the curvature: 1e-3 relative.
        check_method(
            &cases,
            |(f, rho, s)| (C::new(arc_max(*f, *rho, *s).unwrap(), 0.0), None),
            |(f, rho, s)| C::new(dense_arc_max(*f, *rho, *s), 0.0),
            2e-3,
        );
        // |1/(z²+1)| on |z| = 4 lies between 1/17 and 1/15 (triangle inequality).
        let m = arc_max(&lorentz, 4.0, 1.0).unwrap();
        assert!((1.0 / 17.0..=1.0 / 15.0).contains(&m), "{m}");
    }

    #[test]
    fn the_degree_rule_follows_the_textbook_conditions() {
        // Ahlfors ch. 4 §5.3 (from memory): ∫ p/q dx needs deg q ≥ deg p + 2;
        // Jordan's lemma needs deg q ≥ deg p + 1.
        let one = [C::new(1.0, 0.0)];
        assert!(check_rational_decay(&one, -2, 0.0).is_ok());
        assert_eq!(check_rational_decay(&one, -1, 0.0).unwrap_err().kind(), FailureKind::Divergent);
        assert!(check_rational_decay(&one, -1, -3.0).is_ok());
        assert_eq!(check_rational_decay(&one, 0, 2.0).unwrap_err().kind(), FailureKind::Divergent);
        assert!(check_rational_decay(&[], 5, 0.0).is_ok(), "f = 0 is integrable");
    }

    #[test]
    fn sampling_tells_decay_from_growth() {
        // 1/(1+x²) decays on every arc (degree rule, common practice).
        let d = line_decay(&|z: C| 1.0 / (z * z + 1.0), 0.0).unwrap();
        assert!(d.arcs_decay);
        assert!(d.box_radius >= 8.0 && d.box_radius <= 16.0, "{}", d.box_radius);
        // e^{−z²} = e^{−ρ² cos 2φ} grows near φ = π/2 (common practice).
        let g = line_decay(&|z: C| (-(z * z)).exp(), 2.0).unwrap();
        assert!(!g.arcs_decay);
        // 1/√(1+x²) falls only like 1/|x|: ∫ dx diverges.
        let e = line_decay(&|z: C| (z * z + 1.0).sqrt().inv(), 0.0).unwrap_err();
        assert_eq!(e.kind(), FailureKind::Invalid);
        // A pole on the axis is seen by the samples.
        let p = sample_abs(&|z: C| 1.0 / (z - 4.0), 0..=3).unwrap_err();
        assert_eq!(p.kind(), FailureKind::Divergent);
    }
}

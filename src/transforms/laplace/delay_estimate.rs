//! Detection of a pure delay F(s) = e^{−τs} G(s) from the growth of F's phase.
//!
//! Method: along the vertical line s = 1 + iy, with G of algebraic growth,
//! g(s) = s F′(s)/F(s) = −τ s + p + O(|s|^{−1/2}) for large |y|, so the slope
//! −(g(s₂) − g(s₁))/(s₂ − s₁) tends to τ. Two slopes far apart (|y| ≈ 10⁵ and
//! 10⁶) must agree and be real; otherwise F is not a single delay times a
//! function of algebraic growth (common practice: the shift theorem
//! L[f(t − τ)H(t − τ)] = e^{−τs} L[f], read backwards). F′ comes from the
//! expression's automatic derivative, so the slope is not a difference quotient.

use crate::C;

/// |τ| below this is reported as no delay.
const SMALLEST_DELAY: f64 = 1e-7;
/// Relative agreement required between the two slopes.
const AGREEMENT: f64 = 1e-7;

/// The slope estimate of τ from two points at heights y and 2y.
fn slope(f: &mut dyn FnMut(C) -> (C, C), y: f64) -> Option<C> {
    let g = |f: &mut dyn FnMut(C) -> (C, C), s: C| -> Option<C> {
        let (v, d) = f(s);
        let g = s * d / v;
        g.is_finite().then_some(g)
    };
    let s1 = C::new(1.0, y);
    let s2 = C::new(1.0, 2.0 * y);
    let g1 = g(f, s1)?;
    let g2 = g(f, s2)?;
    Some(-(g2 - g1) / (s2 - s1))
}

/// τ when F (value and derivative) behaves like e^{−τs} × algebraic growth, else None.
///
/// ```
/// use residuary::transforms::laplace::delay_estimate::estimate_delay;
/// use residuary::C;
/// // F = e^{−2s}/(s + 1) and F′ = −F·(2 + 1/(s + 1)).
/// let tau = estimate_delay(&mut |s: C| {
///     let f = (-2.0 * s).exp() / (s + 1.0);
///     (f, -f * (2.0 + 1.0 / (s + 1.0)))
/// });
/// assert!((tau.unwrap() - 2.0).abs() < 1e-6);
/// ```
pub fn estimate_delay(f: &mut dyn FnMut(C) -> (C, C)) -> Option<f64> {
    let near = slope(f, 1e5)?;
    let far = slope(f, 1e6)?;
    let scale = far.norm().max(1.0);
    let consistent = (near - far).norm() <= AGREEMENT * scale
        && far.im.abs() <= AGREEMENT * scale
        // The conjugate side must say the same (F need not be real).
        && slope(f, -1e6).is_some_and(|low| (low - far).norm() <= AGREEMENT * scale);
    (consistent && far.re.abs() >= SMALLEST_DELAY).then_some(far.re)
}

/// The exponential growth rate κ of |F| far to the left, from
/// κ ≈ (ln|F(2s)| − ln|F(s)|)/R at s = −R(1 + i/2), R = 40 (and the conjugate
/// direction). A sum of delays e^{−τ_k s} grows like e^{τ_max R}; the contour's
/// left wings then carry e^{(τ_max − t)R}, so the inversion means nothing for
/// t ≲ τ_max. Returns 0 when F does not grow exponentially (or cannot be sampled).
pub fn left_growth_rate(f: &mut dyn FnMut(C) -> C) -> f64 {
    const R: f64 = 40.0;
    let mut rate: f64 = 0.0;
    for dir in [C::new(-1.0, 0.5), C::new(-1.0, -0.5)] {
        let near = f(dir * R).norm();
        let far = f(dir * (2.0 * R)).norm();
        let k = if far.is_finite() && near > 0.0 && near.is_finite() {
            (far.ln() - near.ln()) / R
        } else if !far.is_finite() {
            // Overflow at 2R: growth beyond e^{700}/R.
            700.0 / (2.0 * R)
        } else {
            0.0
        };
        rate = rate.max(k);
    }
    rate
}

#[cfg(test)]
mod tests {
    use super::*;

    // The slow reference here is the definition: F = e^{−τs}G with G algebraic has τ as its
    // delay (the shift theorem, common practice); F and F′ are written out by hand.
    fn delayed(tau: f64) -> impl FnMut(C) -> (C, C) {
        move |s: C| {
            let g = 1.0 / (s * s + 2.0 * s + 5.0);
            let dg = -(2.0 * s + 2.0) * g * g;
            let e = (-tau * s).exp();
            (e * g, e * (dg - tau * g))
        }
    }

    #[test]
    fn a_single_delay_is_read_from_the_phase() {
        for tau in [0.25, 1.0, 3.5] {
            let got = estimate_delay(&mut delayed(tau)).expect("a delay");
            assert!((got - tau).abs() < 1e-6 * tau, "τ = {tau}: got {got}");
        }
        assert_eq!(estimate_delay(&mut delayed(0.0)), None, "no delay");
    }

    #[test]
    fn two_delays_are_not_one_but_grow_to_the_left() {
        // (1 − e^{−s})/s: the unit pulse, jumps at t = 0 and t = 1 (shift theorem).
        let mut pulse = |s: C| ((1.0 - (-s).exp()) / s, ((-s).exp() * s - (1.0 - (-s).exp())) / (s * s));
        assert_eq!(estimate_delay(&mut pulse), None);
        let kappa = left_growth_rate(&mut |s: C| (1.0 - (-s).exp()) / s);
        // |F| ~ e^{R}/R far left: the rate is 1 less a logarithmic term (ln 2/40 ≈ 0.017).
        assert!((kappa - 1.0).abs() < 0.05, "{kappa}");
        assert_eq!(left_growth_rate(&mut |s: C| 1.0 / (s + 1.0)), 0.0, "algebraic decay is no growth");
    }
}

//! The digamma function ψ(z) = Γ'(z)/Γ(z) of a complex argument.
//!
//! Method: upward recurrence ψ(z) = ψ(z+1) - 1/z (DLMF 5.5.2) until |z| >= 15,
//! then the asymptotic expansion ψ(z) ~ ln z - 1/(2z) - Σ B_{2k}/(2k z^{2k})
//! (DLMF 5.11.2); for Re z < 1/2 the reflection ψ(1-z) - ψ(z) = π cot(πz)
//! (DLMF 5.5.4). Poles at 0, -1, -2, … give a non-finite value.

use super::{cos_pi, sin_pi};
use crate::C;

/// B_{2k} / (2k) for k = 1..=8 (Bernoulli numbers, DLMF Table 24.2.1).
const ASYMPTOTIC: [f64; 8] = [
    1.0 / 12.0,
    -1.0 / 120.0,
    1.0 / 252.0,
    -1.0 / 240.0,
    1.0 / 132.0,
    -691.0 / 32760.0,
    1.0 / 12.0,
    -3617.0 / 8160.0,
];

/// ψ(z) for complex z.
///
/// ```
/// use residuary::special::digamma;
/// use residuary::C;
/// // ψ(1) = −γ and ψ(1/2) = −γ − 2 ln 2 (DLMF 5.4.12 and 5.4.13), γ = 0.5772156649015329.
/// let euler = 0.577_215_664_901_532_9;
/// assert!((digamma(C::new(1.0, 0.0)) + euler).norm() < 1e-14);
/// assert!((digamma(C::new(0.5, 0.0)) + euler + 2.0 * 2f64.ln()).norm() < 1e-14);
/// ```
pub fn digamma(z: C) -> C {
    if !(z.re.is_finite() && z.im.is_finite()) {
        return C::new(f64::NAN, f64::NAN);
    }
    if z.re < 0.5 {
        if z.im == 0.0 && z.re == z.re.floor() {
            return C::new(f64::NAN, f64::INFINITY); // pole
        }
        let cot = cos_pi(z) / sin_pi(z);
        return digamma_right(C::new(1.0 - z.re, -z.im)) - std::f64::consts::PI * cot;
    }
    digamma_right(z)
}

/// ψ(z) for Re z >= 1/2.
fn digamma_right(mut z: C) -> C {
    let mut shift = C::new(0.0, 0.0);
    while z.norm() < 15.0 {
        shift += 1.0 / z;
        z += 1.0;
    }
    let w = 1.0 / (z * z);
    let mut series = C::new(0.0, 0.0);
    for &c in ASYMPTOTIC.iter().rev() {
        series = series * w + c;
    }
    z.ln() - 0.5 / z - series * w - shift
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_close, check_method, simpson};

    /// ψ(z) = Γ'(z)/Γ(z) with both from Euler's integral after t = e^s (DLMF 5.2.1):
    /// Γ(z) = ∫_ℝ e^{zs − e^s} ds and Γ'(z) = ∫_ℝ s e^{zs − e^s} ds, by Simpson on
    /// [−80, 5], for Re z ≥ 1; below, the recurrence ψ(z) = ψ(z+1) − 1/z (DLMF 5.5.2).
    fn slow_digamma(mut z: C) -> C {
        let mut shift = C::new(0.0, 0.0);
        while z.re < 1.0 {
            shift += 1.0 / z;
            z += 1.0;
        }
        let g = simpson(|s| (z * s - s.exp()).exp(), -80.0, 5.0, 40_000);
        let dg = simpson(|s| (z * s - s.exp()).exp() * s, -80.0, 5.0, 40_000);
        dg / g - shift
    }

    #[test]
    fn digamma_agrees_with_the_quotient_of_euler_integrals() {
        let cases: Vec<(&str, C)> = vec![
            ("z = 2", C::new(2.0, 0.0)),
            ("z = 1.3 + 2i", C::new(1.3, 2.0)),
            ("z = 7.5 − 3i", C::new(7.5, -3.0)),
            ("z = 20 + i (asymptotic series directly)", C::new(20.0, 1.0)),
            ("z = 0.2 − 0.7i (reflection)", C::new(0.2, -0.7)),
            ("z = −1.5 (reflection)", C::new(-1.5, 0.0)),
            ("z = −4.2 + 0.1i (reflection)", C::new(-4.2, 0.1)),
        ];
        check_method(&cases, |&z| (digamma(z), None), |&z| slow_digamma(z), 1e-11);
    }

    #[test]
    fn the_slow_reference_reproduces_handbook_values() {
        // ψ(1) = −γ (DLMF 5.4.12), γ = 0.57721566490153286061 (DLMF 5.2.3).
        assert_close(slow_digamma(C::new(1.0, 0.0)), C::new(-0.577_215_664_901_532_9, 0.0), 1e-12, "ψ(1)");
        // Im ψ(iy) = 1/(2y) + (π/2) coth πy (DLMF 5.4.17) at y = 1.
        let pi = std::f64::consts::PI;
        let want = 0.5 + 0.5 * pi / pi.tanh();
        assert!((slow_digamma(C::new(0.0, 1.0)).im - want).abs() < 1e-12, "Im ψ(i) reference");
        assert!((digamma(C::new(0.0, 1.0)).im - want).abs() < 1e-13, "Im ψ(i)");
        assert!(!digamma(C::new(-3.0, 0.0)).im.is_finite(), "ψ has a pole at −3");
    }
}

//! The gamma function of a complex argument by the Lanczos approximation.
//!
//! Method: C. Lanczos, "A precision approximation of the gamma function",
//! SIAM J. Numer. Anal. Ser. B 1 (1964) 86–96, with the g = 607/128, n = 15
//! coefficient set of P. Godfrey, "A note on the computation of the convergent
//! Lanczos complex gamma approximation" (2001). For Re z < 1/2 the reflection
//! formula Γ(z) Γ(1-z) = π / sin(πz) (DLMF 5.5.3) is used, with sin(πz)
//! computed after exact reduction of Re z so that points near the poles keep
//! their relative accuracy. Poles at 0, -1, -2, … give a non-finite value.

use super::sin_pi;
use crate::C;

const G: f64 = 607.0 / 128.0;

/// Published digits kept as printed by the source.
#[allow(clippy::excessive_precision)]
const COEFFICIENTS: [f64; 15] = [
    0.999_999_999_999_997_091_82,
    57.156_235_665_862_923_517,
    -59.597_960_355_475_491_248,
    14.136_097_974_741_747_174,
    -0.491_913_816_097_620_199_78,
    0.339_946_499_848_118_886_99e-4,
    0.465_236_289_270_485_756_65e-4,
    -0.983_744_753_048_795_646_77e-4,
    0.158_088_703_224_912_488_84e-3,
    -0.210_264_441_724_104_883_19e-3,
    0.217_439_618_115_212_643_20e-3,
    -0.164_318_106_536_763_890_22e-3,
    0.844_182_239_838_527_432_93e-4,
    -0.261_908_384_015_814_086_70e-4,
    0.368_991_826_595_316_227_04e-5,
];

/// Γ(z) for complex z; non-finite at the poles z = 0, -1, -2, …
///
/// ```
/// use residuary::special::gamma;
/// use residuary::C;
/// // Γ(5) = 4! = 24 and Γ(1/2) = √π (DLMF 5.4.1 and 5.4.6).
/// assert!((gamma(C::new(5.0, 0.0)) - C::new(24.0, 0.0)).norm() < 1e-12);
/// assert!((gamma(C::new(0.5, 0.0)) - C::new(std::f64::consts::PI.sqrt(), 0.0)).norm() < 1e-14);
/// assert!(!gamma(C::new(-2.0, 0.0)).re.is_finite()); // a pole
/// ```
pub fn gamma(z: C) -> C {
    if !(z.re.is_finite() && z.im.is_finite()) {
        return C::new(f64::NAN, f64::NAN);
    }
    if z.re < 0.5 {
        if z.im == 0.0 && z.re == z.re.floor() {
            return C::new(f64::INFINITY, f64::NAN); // pole
        }
        let s = sin_pi(z);
        let one_minus = C::new(1.0 - z.re, -z.im);
        return C::new(std::f64::consts::PI, 0.0) / (s * lanczos(one_minus));
    }
    lanczos(z)
}

/// Γ(z) for Re z >= 1/2 by the Lanczos sum.
fn lanczos(z: C) -> C {
    let zm1 = z - 1.0;
    let mut sum = C::new(COEFFICIENTS[0], 0.0);
    for (k, &c) in COEFFICIENTS.iter().enumerate().skip(1) {
        sum += c / (zm1 + k as f64);
    }
    let t = zm1 + (G + 0.5);
    // sqrt(2π) t^(z-1/2) e^(-t) sum, combined in one exponential to delay overflow.
    let log_part = (zm1 + 0.5) * t.ln() - t;
    (2.0 * std::f64::consts::PI).sqrt() * log_part.exp() * sum
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{check_method, simpson};

    /// Euler's integral Γ(z) = ∫_0^∞ t^{z−1} e^{−t} dt (DLMF 5.2.1), Re z > 0, after
    /// t = e^s: ∫_ℝ e^{zs − e^s} ds, whose integrand is smooth and decays at both
    /// ends; by Simpson on [−80, 5] (the tails are below 1e-17 for Re z ≥ 1/2).
    fn euler_integral(z: C) -> C {
        simpson(|s| (z * s - s.exp()).exp(), -80.0, 5.0, 40_000)
    }

    /// Γ(z) for any non-pole z: the recurrence Γ(z) = Γ(z+n)/(z(z+1)…(z+n−1))
    /// (DLMF 5.5.1) up to Re z ≥ 1, then Euler's integral. No reflection formula.
    fn slow_gamma(z: C) -> C {
        let (mut w, mut product) = (z, C::new(1.0, 0.0));
        while w.re < 1.0 {
            product *= w;
            w += 1.0;
        }
        euler_integral(w) / product
    }

    #[test]
    fn gamma_agrees_with_euler_integral_and_the_recurrence() {
        let cases: Vec<(&str, C)> = vec![
            ("z = 1.5", C::new(1.5, 0.0)),
            ("z = 3.7 + 2i", C::new(3.7, 2.0)),
            ("z = 0.6 − 4i", C::new(0.6, -4.0)),
            ("z = 9.25 + 0.5i", C::new(9.25, 0.5)),
            ("z = 0.3 + i (reflection)", C::new(0.3, 1.0)),
            ("z = −2.5 (reflection)", C::new(-2.5, 0.0)),
            ("z = −3.9 + 0.2i (reflection, near a pole)", C::new(-3.9, 0.2)),
        ];
        check_method(&cases, |&z| (gamma(z), None), |&z| slow_gamma(z), 1e-12);
    }

    #[test]
    fn the_slow_reference_reproduces_handbook_values() {
        use crate::reference::assert_close;
        // Γ(1/2) = √π (DLMF 5.4.6); Γ(−1/2) = −2√π (DLMF 5.5.1 from it); Γ(6) = 120 (DLMF 5.4.1).
        let rp = std::f64::consts::PI.sqrt();
        assert_close(slow_gamma(C::new(0.5, 0.0)), C::new(rp, 0.0), 1e-13, "Γ(1/2)");
        assert_close(slow_gamma(C::new(-0.5, 0.0)), C::new(-2.0 * rp, 0.0), 1e-13, "Γ(−1/2)");
        assert_close(slow_gamma(C::new(6.0, 0.0)), C::new(120.0, 0.0), 1e-13, "Γ(6)");
        // |Γ(iy)|² = π/(y sinh πy) (DLMF 5.4.3) at y = 1, through the recurrence.
        let g = gamma(C::new(0.0, 1.0));
        let want = std::f64::consts::PI / std::f64::consts::PI.sinh();
        assert!((g.norm_sqr() - want).abs() < 1e-13 * want, "|Γ(i)|² = {}, want {want}", g.norm_sqr());
    }
}

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

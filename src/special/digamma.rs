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

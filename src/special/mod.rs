//! Special functions of a complex variable.

pub mod digamma;
pub mod gamma_lanczos;

pub use digamma::digamma;
pub use gamma_lanczos::gamma;

use crate::C;

/// sin(pi z) with exact argument reduction of Re z, so that it is accurate
/// near the integers (where the reflection formulas need it).
pub fn sin_pi(z: C) -> C {
    let (s, c) = sin_cos_pi_real(z.re);
    let y = std::f64::consts::PI * z.im;
    C::new(s * y.cosh(), c * y.sinh())
}

/// cos(pi z) with exact argument reduction of Re z.
pub fn cos_pi(z: C) -> C {
    let (s, c) = sin_cos_pi_real(z.re);
    let y = std::f64::consts::PI * z.im;
    C::new(c * y.cosh(), -s * y.sinh())
}

/// (sin(pi x), cos(pi x)) for real x; exact zeros at integers.
fn sin_cos_pi_real(x: f64) -> (f64, f64) {
    if !x.is_finite() {
        return (f64::NAN, f64::NAN);
    }
    // x - 2 round(x/2) is exact in binary floating point.
    let r = x - 2.0 * (x / 2.0).round(); // r in [-1, 1]
    let (mut s, mut c, mut t) = (1.0, 1.0, r);
    if t > 0.5 {
        t = 1.0 - t; // sin(pi r) = sin(pi (1-r)), cos flips sign
        c = -1.0;
    } else if t < -0.5 {
        t = -1.0 - t;
        c = -1.0;
    }
    let a = std::f64::consts::PI * t;
    s *= a.sin();
    c *= a.cos();
    if t == 0.0 {
        s = 0.0 * r.signum();
    }
    (s, c)
}

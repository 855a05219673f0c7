//! Telling overflow from a singularity.
//!
//! Method (common practice): a sample that is not finite is either a
//! singularity hit exactly, or a value beyond double precision
//! (|f| > 1.8e308, or an intermediate such as z^1999 that overflows and
//! leaves ∞·0 = NaN). A pole or branch point is an isolated point: a small
//! circle around it (radius 1e-6 relative) sees finite values. Overflow fills
//! a neighbourhood: the circle sees non-finite values too. So f is said to
//! overflow near z when at least two of eight points on that circle are not
//! finite, or all are finite but exceed 1e300 in modulus.

use crate::C;

/// Relative radius of the probe circle.
const PROBE: f64 = 1e-6;
/// A modulus this large at every probe point counts as overflow in the making.
const HUGE: f64 = 1e300;

/// True when f's non-finite value at `z` is overflow, not a singularity.
///
/// ```
/// use residuary::overflow::overflows_near;
/// use residuary::C;
/// // exp(800 z) at z = 1 is e^800 > 1.8e308 everywhere near 1 (overflow);
/// // 1/(z − 1) is infinite only at 1 itself (a pole).
/// assert!(overflows_near(&mut |z: C| (800.0 * z).exp(), C::new(1.0, 0.0)));
/// assert!(!overflows_near(&mut |z: C| (z - 1.0).inv(), C::new(1.0, 0.0)));
/// ```
pub fn overflows_near(f: &mut dyn FnMut(C) -> C, z: C) -> bool {
    let r = PROBE * z.norm().max(1.0);
    let mut bad = 0;
    let mut huge = 0;
    for k in 0..8 {
        let v = f(z + C::from_polar(r, 0.3 + k as f64 * std::f64::consts::FRAC_PI_4));
        if !(v.re.is_finite() && v.im.is_finite()) {
            bad += 1;
        } else if v.norm() > HUGE {
            huge += 1;
        }
    }
    bad >= 2 || huge == 8
}

/// The message for overflow on a contour near `z`.
pub fn message(z: C) -> String {
    format!(
        "f overflows double precision on the contour near {} (|f| or an intermediate value exceeds 1.8e308): this is overflow, \
         not a singularity; scale f (e.g. multiply it by exp(-700)) or move the contour where f is smaller",
        crate::text::place(z)
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn overflow_and_poles_are_told_apart() {
        // Slow reference: dense sampling of |f| around z (a 64-point circle and
        // a 16-point radial line), counted by hand against the same definition.
        let cases: Vec<(&str, Box<dyn Fn(C) -> C>, C, bool)> = vec![
            ("cosh(800 z) at 1", Box::new(|z: C| (800.0 * z).cosh()), C::new(1.0, 0.0), true),
            ("z^1999 at 3 (intermediate overflow)", Box::new(|z: C| z.powu(1999)), C::new(3.0, 0.0), true),
            ("1/(z−2)^3 at 2", Box::new(|z: C| (z - 2.0).powi(-3)), C::new(2.0, 0.0), false),
            ("tan at π/2", Box::new(|z: C| z.tan()), C::new(std::f64::consts::FRAC_PI_2, 0.0), false),
        ];
        for (name, f, z, want) in &cases {
            assert_eq!(overflows_near(&mut |x| f(x), *z), *want, "{name}");
            // The reference: how many of 64 points at the probe radius are non-finite or huge.
            let r = PROBE * z.norm().max(1.0);
            let bad = (0..64)
                .filter(|k| {
                    let v = f(z + C::from_polar(r, *k as f64 * std::f64::consts::TAU / 64.0));
                    !v.is_finite() || v.norm() > HUGE
                })
                .count();
            assert_eq!(bad > 32, *want, "{name}: reference count {bad}/64");
        }
    }
}

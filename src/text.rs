//! Every number-to-text of the core, in two registers:
//!
//! - **values** (closed forms, partial fractions, results written out):
//!   12 significant digits, trailing zeros dropped, ASCII `-`, parts at
//!   rounding level dropped — [`real`], [`complex`], [`value`];
//! - **places in messages** (where something happened): 6 decimals, both
//!   parts always shown, `−` (U+2212) — [`place`], [`place_real`].
//!
//! The page has its own `www/js/format.js` for what it shows.
//!
//! No text here ever spells a non-finite number (`NaN`, `inf`): a value that
//! is not representable is written as [`NOT_REPRESENTABLE`], and a caller that
//! writes such a value should also say so in a warning ([`representable`]
//! tells). Infinite places in messages are `∞` / `−∞`.
//!
//! Method: rounding to a fixed number of significant digits through Rust's
//! correctly rounded `{:e}` formatting, then the shortest text that reads back
//! as that rounded value (common practice).
//!
//! ```
//! use residuary::text::{place, real};
//! use residuary::C;
//! // 0.1 + 0.2 is 0.30000000000000004 in binary64 (IEEE 754); at 12 digits it is 0.3.
//! assert_eq!(real(0.1 + 0.2), "0.3");
//! assert_eq!(place(C::new(1.5, -0.25)), "1.5 − 0.25i");
//! ```

use crate::C;

/// What stands in the text for a number that is not representable (NaN, or
/// an infinite value where a number is due). Documented in docs/contract.md.
pub const NOT_REPRESENTABLE: &str = "(not representable)";

/// Whether both parts of `z` are finite, so its text is a number.
pub fn representable(z: C) -> bool {
    z.re.is_finite() && z.im.is_finite()
}

/// Compact decimal text of a real number (12 significant digits, no trailing zeros).
pub fn real(x: f64) -> String {
    if !x.is_finite() {
        return NOT_REPRESENTABLE.into();
    }
    let r: f64 = format!("{x:.11e}").parse().unwrap_or(x);
    if r == 0.0 {
        "0".into()
    } else if (1e-5..1e15).contains(&r.abs()) {
        format!("{r}")
    } else {
        format!("{r:e}")
    }
}

/// Text of a complex number at 12 digits; parts with magnitude ≤ `err` are dropped.
pub fn complex(z: C, err: f64) -> String {
    if !representable(z) {
        return NOT_REPRESENTABLE.into();
    }
    let re = if z.re.abs() <= err { 0.0 } else { z.re };
    let im = if z.im.abs() <= err { 0.0 } else { z.im };
    match (re == 0.0, im == 0.0) {
        (_, true) => real(re),
        (true, false) => format!("{}i", real(im)),
        (false, false) => {
            let sign = if im < 0.0 { "-" } else { "+" };
            format!("{} {sign} {}i", real(re), real(im.abs()))
        }
    }
}

/// A value at 12 digits with rounding-level parts (relative 1e-12) dropped.
pub fn value(z: C) -> String {
    complex(z, 1e-12 * (1.0 + z.norm()))
}

/// A place for messages: "2 + 0i", "1.5 − 0.25i".
pub fn place(z: C) -> String {
    if z.re.is_nan() || z.im.is_nan() {
        return NOT_REPRESENTABLE.into();
    }
    let sign = if z.im < 0.0 { '−' } else { '+' };
    format!("{} {} {}i", place_real(z.re), sign, place_real(z.im.abs()))
}

/// A real number for messages: 6 decimals at most, trailing zeros dropped;
/// exponent form below 1e-4 and from 1e9.
pub fn place_real(x: f64) -> String {
    if x.is_nan() {
        return NOT_REPRESENTABLE.into();
    }
    if x.is_infinite() {
        return if x > 0.0 { "∞".into() } else { "−∞".into() };
    }
    if x != 0.0 && (x.abs() < 1e-4 || x.abs() >= 1e9) {
        return format!("{x:.6e}");
    }
    let s = format!("{x:.6}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" {
        "0".into()
    } else {
        s.to_string()
    }
}

/// A size in messages (an error, a distance, a defect) for `{:.Ne}`:
/// `format!("{:.1e}", Sci(0.000123))` is "1.2e-4", as for the bare f64, but
/// infinity is `∞` and NaN is [`NOT_REPRESENTABLE`].
#[derive(Debug, Clone, Copy)]
pub struct Sci(pub f64);

impl std::fmt::LowerExp for Sci {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        if self.0.is_finite() {
            std::fmt::LowerExp::fmt(&self.0, f)
        } else {
            f.write_str(&place_real(self.0))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn values_keep_twelve_digits_and_drop_rounding() {
        assert_eq!(real(0.1 + 0.2), "0.3");
        assert_eq!(real(1.0 / 3.0), "0.333333333333");
        assert_eq!(real(-2.5e-7), "-2.5e-7");
        assert_eq!(complex(C::new(1.0, -0.25), 0.0), "1 - 0.25i");
        assert_eq!(value(C::new(2.0, 1e-15)), "2");
        assert_eq!(value(C::new(0.0, 3.0)), "3i");
    }

    #[test]
    fn places_show_both_parts_at_six_decimals() {
        assert_eq!(place(C::new(2.0, 0.0)), "2 + 0i");
        assert_eq!(place(C::new(1.5, -0.25)), "1.5 − 0.25i");
        assert_eq!(place_real(-0.0), "0");
        assert_eq!(place_real(1.0 / 3.0), "0.333333");
        assert_eq!(place_real(2e-5), "2.000000e-5");
        assert_eq!(place_real(f64::INFINITY), "∞");
    }

    /// By construction (the contract): no text spells NaN or inf.
    #[test]
    fn non_finite_values_are_a_word_not_nan() {
        let nan = f64::NAN;
        assert_eq!(real(nan), NOT_REPRESENTABLE);
        assert_eq!(real(f64::NEG_INFINITY), NOT_REPRESENTABLE);
        assert_eq!(complex(C::new(1.0, nan), 0.0), NOT_REPRESENTABLE);
        assert_eq!(value(C::new(f64::INFINITY, 0.0)), NOT_REPRESENTABLE);
        assert_eq!(place(C::new(nan, 1.0)), NOT_REPRESENTABLE);
        assert_eq!(place(C::new(f64::INFINITY, 1.0)), "∞ + 1i");
        assert_eq!(place_real(nan), NOT_REPRESENTABLE);
        assert_eq!(format!("{:.2e}", Sci(nan)), NOT_REPRESENTABLE);
        assert_eq!(format!("{:.1e}", Sci(1.23e-4)), "1.2e-4");
        assert_eq!(format!("{:.1e}", Sci(f64::INFINITY)), "∞");
        assert!(!representable(C::new(0.0, nan)) && representable(C::new(0.0, 1.0)));
    }

    /// Slow reference: read the text back as a number; 12 significant digits
    /// mean a relative error of at most ½·10⁻¹¹, 6 decimals an absolute one of ½·10⁻⁶.
    #[test]
    fn texts_read_back_within_their_rounding() {
        use crate::reference::check_method;
        // Invented values over many decades, both signs.
        let xs: Vec<f64> = (0..200)
            .map(|k| {
                let e = -9.0 + 0.117 * f64::from(k);
                let s = if k % 3 == 0 { -1.0 } else { 1.0 };
                s * 10f64.powf(e) * (1.0 + 0.123_456_789_012_345 * f64::from(k % 5))
            })
            .collect();
        let cases: Vec<(&str, f64)> = xs.iter().map(|&x| ("real()", x)).collect();
        check_method(
            &cases,
            |&x| (C::new(real(x).parse::<f64>().unwrap() / x, 0.0), None),
            |_| C::new(1.0, 0.0),
            5.000_001e-12,
        );
        let cases: Vec<(&str, f64)> =
            xs.iter().filter(|x| (1e-4..1e9).contains(&x.abs())).map(|&x| ("place_real()", x)).collect();
        check_method(
            &cases,
            // The error in units of ½·10⁻⁶ against 0, allowed 1 (assert_close scales by max(|0|, 1)).
            |&x| (C::new((place_real(x).parse::<f64>().unwrap() - x) / 5.000_001e-7, 0.0), None),
            |_| C::new(0.0, 0.0),
            1.0,
        );
    }
}

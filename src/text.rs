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

/// Compact decimal text of a real number (12 significant digits, no trailing zeros).
pub fn real(x: f64) -> String {
    if !x.is_finite() {
        return format!("{x}");
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
    let sign = if z.im < 0.0 { '−' } else { '+' };
    format!("{} {} {}i", place_real(z.re), sign, place_real(z.im.abs()))
}

/// A real number for messages: 6 decimals at most, trailing zeros dropped;
/// exponent form below 1e-4 and from 1e9.
pub fn place_real(x: f64) -> String {
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

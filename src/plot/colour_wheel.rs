//! Colour wheels: map the argument of a complex value, arg f ∈ (−π, π], to a
//! colour, through a precomputed lookup table of sRGB bytes.
//!
//! Method: a constant-lightness, constant-chroma hue circle in the OKLCH form
//! of OKLab (Björn Ottosson, "A perceptual color space for image processing",
//! 2020). Equal steps of arg give equal Euclidean steps ΔE_OK, so no hue band
//! looks wider than another. The plain HSV hue circle (Alvy Ray Smith, "Color
//! gamut transform pairs", SIGGRAPH 1978) is kept as an option.
//!
//! Our OKLCH wheel (`Wheel::Oklch`):
//! * lightness `OKLCH_LIGHTNESS` = 0.75 — near the lightness at which the
//!   smallest in-gamut chroma over all hues is largest (≈ 0.1275 at L = 0.75;
//!   the limiting hue is a cyan-blue near OKLCH hue 200°);
//! * chroma `OKLCH_CHROMA` = 0.12 — about 94 % of that bound, so every hue is
//!   inside the sRGB gamut with no clipping;
//! * hue = `OKLCH_HUE_AT_ARG_ZERO` + arg f, with OKLCH hue 55° at arg f = 0:
//!   a soft orange on the positive real axis. Increasing arg turns towards
//!   yellow-green (arg = π/2 ≈ hue 145°), cyan-blue at arg = ±π (hue 235°),
//!   violet-pink at arg = −π/2 (hue 325°).
//!
//! ```
//! use residuary::plot::colour_wheel::{colour, Wheel};
//! // The HSV hue circle (Smith 1978): arg 0 is pure red, arg 2π/3 pure green.
//! assert_eq!(colour(Wheel::Hsv, 0.0), [255, 0, 0]);
//! assert_eq!(colour(Wheel::Hsv, 2.0 * std::f64::consts::PI / 3.0), [0, 255, 0]);
//! ```

use super::oklab::{linear_to_srgb, oklab_to_linear_srgb, oklch_to_oklab, Triple};
use std::f64::consts::PI;
use std::sync::OnceLock;

/// Which hue circle colours the argument.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub enum Wheel {
    /// Our perceptually even OKLCH wheel (default).
    #[default]
    Oklch,
    /// Plain HSV hue circle: hue = arg, full saturation and value
    /// (arg 0 = red, then yellow, green, cyan, blue, magenta).
    Hsv,
}

/// Number of entries in each lookup table.
pub const LUT_SIZE: usize = 1024;
/// OKLab lightness of the default wheel.
pub const OKLCH_LIGHTNESS: f64 = 0.75;
/// OKLab chroma of the default wheel.
pub const OKLCH_CHROMA: f64 = 0.12;
/// OKLCH hue (radians) shown for arg f = 0: 55°, a soft orange.
pub const OKLCH_HUE_AT_ARG_ZERO: f64 = 55.0 * PI / 180.0;

/// The argument represented by LUT entry `k`: −π + 2πk/N (entry 0 is arg ±π).
pub fn lut_arg(k: usize) -> f64 {
    -PI + 2.0 * PI * (k as f64) / (LUT_SIZE as f64)
}

/// LUT index for an argument (any finite real; taken modulo 2π, rounded to
/// the nearest entry). Non-finite input gives entry 0.
#[inline]
pub fn lut_index(arg: f64) -> usize {
    let t = (arg / (2.0 * PI) + 0.5) * LUT_SIZE as f64;
    if !t.is_finite() || t.abs() > 1e15 {
        return 0;
    }
    // Round to nearest (floor of t + ½ without a libm call), then wrap.
    let r = t + 0.5;
    let mut k = r as i64;
    if (k as f64) > r {
        k -= 1;
    }
    k.rem_euclid(LUT_SIZE as i64) as usize
}

/// Exact (unquantised) encoded-sRGB colour of the wheel at `arg`, each
/// component in [0, 1].
pub fn wheel_srgb(wheel: Wheel, arg: f64) -> Triple {
    match wheel {
        Wheel::Oklch => {
            let lab = oklch_to_oklab([OKLCH_LIGHTNESS, OKLCH_CHROMA, OKLCH_HUE_AT_ARG_ZERO + arg]);
            oklab_to_linear_srgb(lab).map(|v| linear_to_srgb(v.clamp(0.0, 1.0)))
        }
        Wheel::Hsv => hsv_hue_to_srgb(arg),
    }
}

/// HSV with S = V = 1: hue angle (radians) → encoded sRGB.
fn hsv_hue_to_srgb(hue: f64) -> Triple {
    let h = (hue / (2.0 * PI)).rem_euclid(1.0) * 6.0;
    let f = |n: f64| {
        let k = (n + h).rem_euclid(6.0);
        1.0 - k.min(4.0 - k).clamp(0.0, 1.0)
    };
    [f(5.0), f(3.0), f(1.0)]
}

fn to_byte(v: f64) -> u8 {
    (v.clamp(0.0, 1.0) * 255.0).round() as u8
}

fn build_lut(wheel: Wheel) -> Vec<[u8; 3]> {
    (0..LUT_SIZE)
        .map(|k| wheel_srgb(wheel, lut_arg(k)).map(to_byte))
        .collect()
}

/// The lookup table of a wheel: `LUT_SIZE` sRGB byte triples, entry k for
/// arg = −π + 2πk/N. Built once per wheel, then shared.
pub fn lut(wheel: Wheel) -> &'static [[u8; 3]] {
    static OKLCH: OnceLock<Vec<[u8; 3]>> = OnceLock::new();
    static HSV: OnceLock<Vec<[u8; 3]>> = OnceLock::new();
    match wheel {
        Wheel::Oklch => OKLCH.get_or_init(|| build_lut(Wheel::Oklch)),
        Wheel::Hsv => HSV.get_or_init(|| build_lut(Wheel::Hsv)),
    }
}

/// Colour of `arg` by table lookup.
#[inline]
pub fn colour(wheel: Wheel, arg: f64) -> [u8; 3] {
    lut(wheel)[lut_index(arg)]
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plot::oklab::{oklab_to_oklch, srgb_to_oklab};
    use crate::reference::{assert_close, check_method};
    use crate::C;

    /// Invented arguments spread over (−π, π] and a little beyond.
    fn args() -> Vec<f64> {
        (0..97).map(|k| -3.5 + 7.0 * f64::from(k) / 96.0 + 0.001 * f64::from(k % 7)).collect()
    }

    /// Slow reference: Smith's hexcone (SIGGRAPH 1978) with S = V = 1 written
    /// sector by sector: h ∈ [0, 6), f its fraction, colours
    /// (1,f,0) (1−f,1,0) (0,1,f) (0,1−f,1) (f,0,1) (1,0,1−f).
    fn hexcone(hue: f64) -> Triple {
        let h = (hue / (2.0 * PI)).rem_euclid(1.0) * 6.0;
        let sector = h.floor();
        let f = h - sector;
        match sector as i64 {
            0 => [1.0, f, 0.0],
            1 => [1.0 - f, 1.0, 0.0],
            2 => [0.0, 1.0, f],
            3 => [0.0, 1.0 - f, 1.0],
            4 => [f, 0.0, 1.0],
            _ => [1.0, 0.0, 1.0 - f],
        }
    }

    #[test]
    fn hsv_wheel_matches_the_hexcone_sector_formulas() {
        let cases: Vec<(&str, (f64, usize))> =
            args().into_iter().flat_map(|a| (0..3).map(move |k| ("HSV component", (a, k)))).collect();
        check_method(
            &cases,
            |&(a, k)| (C::new(wheel_srgb(Wheel::Hsv, a)[k], 0.0), None),
            |&(a, k)| C::new(hexcone(a)[k], 0.0),
            1e-12,
        );
    }

    #[test]
    fn oklch_wheel_has_the_stated_lightness_chroma_and_hue() {
        // The module doc: L = 0.75, C = 0.12, hue = 55° + arg, all in gamut (no clipping).
        for a in args() {
            let lch = oklab_to_oklch(srgb_to_oklab(wheel_srgb(Wheel::Oklch, a)));
            let what = format!("arg {a}");
            // The published forward and inverse matrices agree to ~1e-8 (10 digits given); the hue, ÷ C = 0.12, to ~2e-7.
            assert_close(C::new(lch[0], lch[1]), C::new(0.75, 0.12), 1e-7, &what);
            assert_close(C::from_polar(1.0, lch[2]), C::from_polar(1.0, 55f64.to_radians() + a), 1e-6, &what);
        }
    }

    #[test]
    fn lut_index_is_the_nearest_entry_found_by_search() {
        // Slow reference: the entry whose argument is nearest on the circle, by trying all.
        for a in args() {
            let dist = |k: usize| (C::from_polar(1.0, a) - C::from_polar(1.0, lut_arg(k))).norm();
            let best = (0..LUT_SIZE).min_by(|&p, &q| dist(p).total_cmp(&dist(q))).unwrap();
            assert_eq!(lut_index(a), best, "arg {a}");
            assert_eq!(colour(Wheel::Oklch, a), lut(Wheel::Oklch)[best], "arg {a}");
        }
    }
}

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
//! Two wheels for reading without colour (`Wheel::Ramp`, `Wheel::BlueYellow`).
//! A constant-lightness wheel carries arg only in hue; under deuteranopia and
//! protanopia hue collapses to a blue–yellow axis (Brettel, Viénot & Mollon,
//! "Computerized simulation of color appearance for dichromats", JOSA A 14,
//! 1997), and in greyscale to nothing. Lightness is the one cue every reader
//! keeps (Kovesi, "Good colour maps: how to design them", arXiv:1509.03700,
//! 2015: a map is readable without colour where lightness varies along it).
//!
//! * `Wheel::Ramp` (the page's default): OKLab lightness rises linearly with
//!   arg over (−π, π], L = `RAMP_L_LOW` + (`RAMP_L_HIGH` − `RAMP_L_LOW`)·t with
//!   t = (arg + π)/2π, and falls back at arg = π: the one jump of the wheel is
//!   an edge along the rays where f is a negative real, and it marks where the
//!   turn starts. The hue turns with t too, from blue (OKLCH hue 260°) through
//!   violet, red and orange to yellow (hue 105°, 260° + 205°), so dark is blue
//!   and light is yellow as in the sequential maps of the same idea; chroma is
//!   `RAMP_CHROMA` or 95 % of the largest in-gamut chroma at that L and hue,
//!   whichever is smaller. Going counter-clockwise round a simple zero, arg f
//!   rises: dark to light; round a simple pole it falls: light to dark. The
//!   two stay apart in grey (a winding that reads the other way round).
//! * `Wheel::BlueYellow`: a closed loop in the OKLab plane a = 0 that dichromats
//!   of the red–green kinds keep (Brettel et al. 1997; Machado, Oliveira &
//!   Fernandes, "A physiologically-based model for simulation of color vision
//!   deficiency", IEEE TVCG 15, 2009): L = `BY_L_MID` + `BY_L_SWING`·sin arg,
//!   b = `BY_B`·cos arg — yellow at arg 0, near white at π/2, blue at ±π, dark
//!   grey at −π/2. No jump; a continuous wheel cannot also be read in grey
//!   (its lightness must repeat), for that use the ramp. Tritan observers (who
//!   lose blue–yellow) keep only its lightness.
//!
//! Checked in the tests by simulating the readers: deutan and protan by the
//! Machado 2009 matrices at severity 1 on linear sRGB, greyscale by the WCAG
//! relative luminance (W3C WCAG 2.2, 0.2126 R + 0.7152 G + 0.0722 B), then the
//! smallest ΔE_OK between LUT colours π/3 apart in arg.
//!
//! ```
//! use residuary::plot::colour_wheel::{colour, Wheel};
//! // The HSV hue circle (Smith 1978): arg 0 is pure red, arg 2π/3 pure green.
//! assert_eq!(colour(Wheel::Hsv, 0.0), [255, 0, 0]);
//! assert_eq!(colour(Wheel::Hsv, 2.0 * std::f64::consts::PI / 3.0), [0, 255, 0]);
//! ```

use super::oklab::{linear_to_srgb, max_in_gamut_chroma, oklab_to_linear_srgb, oklch_to_oklab, Triple};
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
    /// Lightness rising with arg over (−π, π], blue (dark) to yellow (light),
    /// with its one jump at arg = π: readable in grey and by dichromats.
    Ramp,
    /// A loop on the blue–yellow axis and in lightness, kept by deutan and
    /// protan observers; continuous (no jump).
    BlueYellow,
}

impl Wheel {
    /// The wheel of a contract name (`"oklch"`, `"hsv"`, `"ramp"`, `"blue_yellow"`).
    pub fn from_name(name: &str) -> Option<Wheel> {
        match name {
            "oklch" => Some(Wheel::Oklch),
            "hsv" => Some(Wheel::Hsv),
            "ramp" => Some(Wheel::Ramp),
            "blue_yellow" => Some(Wheel::BlueYellow),
            _ => None,
        }
    }
}

/// The contract names of the wheels, in the order the page offers them.
pub const WHEEL_NAMES: &[&str] = &["oklch", "hsv", "ramp", "blue_yellow"];

/// Ramp wheel: OKLab lightness just above arg = −π.
pub const RAMP_L_LOW: f64 = 0.36;
/// Ramp wheel: OKLab lightness at arg = π.
pub const RAMP_L_HIGH: f64 = 0.94;
/// Ramp wheel: OKLCH hue (radians) just above arg = −π: 260°, blue.
pub const RAMP_HUE_LOW: f64 = 260.0 * PI / 180.0;
/// Ramp wheel: the hue turned through from arg −π to π: 205° (to yellow, 105°).
pub const RAMP_HUE_SPAN: f64 = 205.0 * PI / 180.0;
/// Ramp wheel: chroma where the gamut allows it.
pub const RAMP_CHROMA: f64 = 0.11;
/// Blue–yellow wheel: mean OKLab lightness.
pub const BY_L_MID: f64 = 0.66;
/// Blue–yellow wheel: lightness swing, L = mid + swing · sin arg.
pub const BY_L_SWING: f64 = 0.22;
/// Blue–yellow wheel: b = BY_B · cos arg (a = 0).
pub const BY_B: f64 = 0.12;

/// The ramp's position t ∈ (0, 1] of arg: (arg + π)/2π on (−π, π], arg taken modulo 2π.
pub fn ramp_position(arg: f64) -> f64 {
    let t = ((arg + PI) / (2.0 * PI)).rem_euclid(1.0);
    if t <= 0.0 { 1.0 } else { t }
}

/// The ramp wheel's OKLab colour at `arg`.
pub fn ramp_oklab(arg: f64) -> Triple {
    let t = ramp_position(arg);
    let l = RAMP_L_LOW + (RAMP_L_HIGH - RAMP_L_LOW) * t;
    let hue = RAMP_HUE_LOW + RAMP_HUE_SPAN * t;
    let c = RAMP_CHROMA.min(0.95 * max_in_gamut_chroma(l, hue));
    oklch_to_oklab([l, c, hue])
}

/// The blue–yellow wheel's OKLab colour at `arg`.
pub fn blue_yellow_oklab(arg: f64) -> Triple {
    [BY_L_MID + BY_L_SWING * arg.sin(), 0.0, BY_B * arg.cos()]
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
        Wheel::Ramp => oklab_to_linear_srgb(ramp_oklab(arg)).map(|v| linear_to_srgb(v.clamp(0.0, 1.0))),
        Wheel::BlueYellow => oklab_to_linear_srgb(blue_yellow_oklab(arg)).map(|v| linear_to_srgb(v.clamp(0.0, 1.0))),
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
    static RAMP: OnceLock<Vec<[u8; 3]>> = OnceLock::new();
    static BLUE_YELLOW: OnceLock<Vec<[u8; 3]>> = OnceLock::new();
    match wheel {
        Wheel::Oklch => OKLCH.get_or_init(|| build_lut(Wheel::Oklch)),
        Wheel::Hsv => HSV.get_or_init(|| build_lut(Wheel::Hsv)),
        Wheel::Ramp => RAMP.get_or_init(|| build_lut(Wheel::Ramp)),
        Wheel::BlueYellow => BLUE_YELLOW.get_or_init(|| build_lut(Wheel::BlueYellow)),
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

    /// Deuteranopia, severity 1: Machado, Oliveira & Fernandes, IEEE TVCG 15 (2009), table of
    /// simulation matrices on linear RGB (from memory; the same values as colorspacious and
    /// DaltonLens reproduce).
    const DEUTERANOPIA: [[f64; 3]; 3] = [
        [0.367322, 0.860646, -0.227968],
        [0.280085, 0.672501, 0.047413],
        [-0.011820, 0.042940, 0.968881],
    ];
    /// Protanopia, severity 1: the same table (from memory).
    const PROTANOPIA: [[f64; 3]; 3] = [
        [0.152286, 1.052583, -0.204868],
        [0.114503, 0.786281, 0.099216],
        [-0.003882, -0.048116, 1.051998],
    ];

    #[derive(Clone, Copy, Debug)]
    enum Reader {
        Deutan,
        Protan,
        Grey,
    }

    /// What a reader sees of an sRGB byte triple, in OKLab.
    fn seen(rgb: [u8; 3], reader: Reader) -> Triple {
        use crate::plot::oklab::{linear_srgb_to_oklab, srgb_to_linear};
        let lin = rgb.map(|b| srgb_to_linear(f64::from(b) / 255.0));
        let mul = |m: &[[f64; 3]; 3]| {
            [0, 1, 2].map(|r| (m[r][0] * lin[0] + m[r][1] * lin[1] + m[r][2] * lin[2]).clamp(0.0, 1.0))
        };
        let out = match reader {
            Reader::Deutan => mul(&DEUTERANOPIA),
            Reader::Protan => mul(&PROTANOPIA),
            // WCAG 2.2 relative luminance (W3C): Y = 0.2126 R + 0.7152 G + 0.0722 B on linear sRGB
            Reader::Grey => [0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2]; 3],
        };
        linear_srgb_to_oklab(out)
    }

    /// The smallest ΔE_OK, as `reader` sees it, between LUT colours π/3 apart in arg.
    fn min_step_difference(wheel: Wheel, reader: Reader) -> f64 {
        use crate::plot::oklab::delta_e_ok;
        let t = lut(wheel);
        let step = LUT_SIZE / 6;
        (0..LUT_SIZE)
            .map(|k| delta_e_ok(seen(t[k], reader), seen(t[(k + step) % LUT_SIZE], reader)))
            .fold(f64::INFINITY, f64::min)
    }

    /// ΔE_OK ≈ 0.02 is about one just-noticeable difference (from memory, Ottosson 2020's
    /// scaling of OKLab to CIEDE2000 ≈ 100 ΔE_OK); three of them is the floor asked for here.
    const READABLE: f64 = 0.06;

    #[test]
    fn the_new_wheels_stay_readable_for_dichromats_and_in_grey_and_the_old_one_does_not() {
        let figure = |w, r| min_step_difference(w, r);
        for w in [Wheel::Ramp, Wheel::BlueYellow, Wheel::Oklch, Wheel::Hsv] {
            let f = [Reader::Deutan, Reader::Protan, Reader::Grey].map(|r| format!("{r:?} {:.4}", figure(w, r)));
            eprintln!("min ΔE_OK at π/3 steps, {w:?}: {}", f.join(", "));
        }
        for reader in [Reader::Deutan, Reader::Protan, Reader::Grey] {
            let got = figure(Wheel::Ramp, reader);
            assert!(got > READABLE, "ramp, {reader:?}: min ΔE_OK {got}");
        }
        for reader in [Reader::Deutan, Reader::Protan] {
            let got = figure(Wheel::BlueYellow, reader);
            assert!(got > READABLE, "blue-yellow, {reader:?}: min ΔE_OK {got}");
        }
        // the constant-lightness wheel collapses (measured: deutan 0.002, protan 0.042, grey 0.000)
        for reader in [Reader::Deutan, Reader::Protan, Reader::Grey] {
            let got = figure(Wheel::Oklch, reader);
            assert!(got < READABLE, "oklch, {reader:?}: min ΔE_OK {got} (expected to fail)");
        }
        assert!(figure(Wheel::Oklch, Reader::Grey) < 0.01, "constant lightness is flat grey");
        assert!(figure(Wheel::Oklch, Reader::Deutan) < 0.01, "two hues for a deutan reader");
    }

    #[test]
    fn the_ramp_has_the_stated_lightness_rising_with_arg_and_one_jump_at_pi() {
        // read back through the independent sRGB → OKLab route (Ottosson 2020 matrices)
        let mut last = f64::NEG_INFINITY;
        for k in 1..LUT_SIZE {
            let a = lut_arg(k);
            let exact = wheel_srgb(Wheel::Ramp, a);
            let lch = oklab_to_oklch(srgb_to_oklab(exact));
            let want = RAMP_L_LOW + (RAMP_L_HIGH - RAMP_L_LOW) * (a + PI) / (2.0 * PI);
            assert!((lch[0] - want).abs() < 1e-6, "arg {a}: L {} vs {want} (clipped?)", lch[0]);
            assert!(lch[1] > 0.02 && lch[1] <= RAMP_CHROMA + 1e-6, "arg {a}: chroma {}", lch[1]);
            let bytes_l = srgb_to_oklab(colour(Wheel::Ramp, a).map(|b| f64::from(b) / 255.0))[0];
            assert!(bytes_l > last - 2e-3, "arg {a}: byte lightness {bytes_l} after {last}");
            last = last.max(bytes_l);
        }
        // arg = π (entry 0) is the lightest; just above −π the darkest: the jump
        let top = oklab_to_oklch(srgb_to_oklab(wheel_srgb(Wheel::Ramp, PI)));
        let bottom = oklab_to_oklch(srgb_to_oklab(wheel_srgb(Wheel::Ramp, -PI + 1e-9)));
        assert!((top[0] - RAMP_L_HIGH).abs() < 1e-6 && (bottom[0] - RAMP_L_LOW).abs() < 1e-6, "{top:?} {bottom:?}");
        assert_eq!(lut(Wheel::Ramp)[0], colour(Wheel::Ramp, PI));
        // hues: blue-ish (OKLCH 260°) at the dark end, yellow (105°) at the light end
        assert_close(C::from_polar(1.0, bottom[2]), C::from_polar(1.0, 260f64.to_radians()), 1e-5, "dark hue");
        assert_close(C::from_polar(1.0, top[2]), C::from_polar(1.0, 105f64.to_radians()), 1e-5, "light hue");
    }

    #[test]
    fn the_blue_yellow_wheel_has_the_stated_loop_in_gamut() {
        for k in 0..LUT_SIZE {
            let a = lut_arg(k);
            let lab = srgb_to_oklab(wheel_srgb(Wheel::BlueYellow, a));
            let want = [BY_L_MID + BY_L_SWING * a.sin(), 0.0, BY_B * a.cos()];
            for i in 0..3 {
                assert!((lab[i] - want[i]).abs() < 1e-6, "arg {a}: {lab:?} vs {want:?} (clipped?)");
            }
        }
    }

    #[test]
    fn every_wheel_name_parses_and_unknown_names_do_not() {
        for &n in WHEEL_NAMES {
            assert!(Wheel::from_name(n).is_some(), "{n}");
        }
        assert_eq!(Wheel::from_name("ramp"), Some(Wheel::Ramp));
        assert_eq!(Wheel::from_name("blue_yellow"), Some(Wheel::BlueYellow));
        assert_eq!(Wheel::from_name("Ramp"), None);
    }
}

//! OKLab / OKLCH colour space and the sRGB transfer function.
//!
//! Method: the OKLab perceptual colour space of Björn Ottosson, "A perceptual
//! color space for image processing" (2020). The linear-sRGB ↔ LMS and
//! LMS′ ↔ Lab matrices and the XYZ → LMS matrix (M1) and LMS′ → Lab matrix (M2)
//! are the ones given in that publication. The sRGB transfer function and the
//! linear sRGB ↔ CIE XYZ (D65) matrix follow IEC 61966-2-1:1999.
//!
//! All colours are `[f64; 3]`; sRGB and linear sRGB components are nominally
//! in [0, 1] but nothing here clamps (out-of-gamut values pass through).
//!
//! ```
//! use residuary::plot::oklab::srgb_to_oklab;
//! // sRGB red #ff0000 is OKLab (0.62796, 0.22486, 0.12585) (from memory:
//! // the value quoted with Ottosson 2020 and in CSS Color 4's examples).
//! let lab = srgb_to_oklab([1.0, 0.0, 0.0]);
//! for (got, want) in lab.iter().zip([0.62796, 0.22486, 0.12585]) {
//!     assert!((got - want).abs() < 1e-4, "{lab:?}");
//! }
//! ```

/// One colour as three `f64` components.
pub type Triple = [f64; 3];

/// sRGB electro-optical transfer: encoded component → linear light
/// (IEC 61966-2-1). Odd-symmetric extension for negative inputs.
pub fn srgb_to_linear(u: f64) -> f64 {
    let a = u.abs();
    let v = if a <= 0.04045 {
        a / 12.92
    } else {
        ((a + 0.055) / 1.055).powf(2.4)
    };
    v.copysign(u)
}

/// Inverse sRGB transfer: linear light → encoded component (IEC 61966-2-1).
pub fn linear_to_srgb(v: f64) -> f64 {
    let a = v.abs();
    let u = if a <= 0.003_130_8 {
        12.92 * a
    } else {
        1.055 * a.powf(1.0 / 2.4) - 0.055
    };
    u.copysign(v)
}

fn mul(m: &[[f64; 3]; 3], v: Triple) -> Triple {
    [
        m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2],
        m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2],
        m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2],
    ]
}

/// Linear sRGB → LMS (Ottosson 2020, combined sRGB→XYZ→LMS matrix).
const LINEAR_SRGB_TO_LMS: [[f64; 3]; 3] = [
    [0.412_221_470_8, 0.536_332_536_3, 0.051_445_992_9],
    [0.211_903_498_2, 0.680_699_545_1, 0.107_396_956_6],
    [0.088_302_461_9, 0.281_718_837_6, 0.629_978_700_5],
];

/// LMS → linear sRGB (Ottosson 2020).
const LMS_TO_LINEAR_SRGB: [[f64; 3]; 3] = [
    [4.076_741_662_1, -3.307_711_591_3, 0.230_969_929_2],
    [-1.268_438_004_6, 2.609_757_401_1, -0.341_319_396_5],
    [-0.004_196_086_3, -0.703_418_614_7, 1.707_614_701_0],
];

/// CIE XYZ (D65) → LMS, "M1" (Ottosson 2020).
const XYZ_TO_LMS: [[f64; 3]; 3] = [
    [0.818_933_010_1, 0.361_866_742_4, -0.128_859_713_7],
    [0.032_984_543_6, 0.929_311_871_5, 0.036_145_638_7],
    [0.048_200_301_8, 0.264_366_269_1, 0.633_851_707_0],
];

/// Cube-rooted LMS′ → Lab, "M2" (Ottosson 2020).
const LMS_TO_LAB: [[f64; 3]; 3] = [
    [0.210_454_255_3, 0.793_617_785_0, -0.004_072_046_8],
    [1.977_998_495_1, -2.428_592_205_0, 0.450_593_709_9],
    [0.025_904_037_1, 0.782_771_766_2, -0.808_675_766_0],
];

/// Lab → cube-rooted LMS′, inverse of M2 (Ottosson 2020).
const LAB_TO_LMS: [[f64; 3]; 3] = [
    [1.0, 0.396_337_777_4, 0.215_803_757_3],
    [1.0, -0.105_561_345_8, -0.063_854_172_8],
    [1.0, -0.089_484_177_5, -1.291_485_548_0],
];

/// Linear sRGB → CIE XYZ (D65), IEC 61966-2-1.
const LINEAR_SRGB_TO_XYZ: [[f64; 3]; 3] = [
    [0.4124, 0.3576, 0.1805],
    [0.2126, 0.7152, 0.0722],
    [0.0193, 0.1192, 0.9505],
];

/// CIE XYZ (D65) → linear sRGB, IEC 61966-2-1.
const XYZ_TO_LINEAR_SRGB: [[f64; 3]; 3] = [
    [3.2406, -1.5372, -0.4986],
    [-0.9689, 1.8758, 0.0415],
    [0.0557, -0.2040, 1.0570],
];

fn lms_to_lab(lms: Triple) -> Triple {
    mul(&LMS_TO_LAB, [lms[0].cbrt(), lms[1].cbrt(), lms[2].cbrt()])
}

fn lab_to_lms(lab: Triple) -> Triple {
    let p = mul(&LAB_TO_LMS, lab);
    [p[0] * p[0] * p[0], p[1] * p[1] * p[1], p[2] * p[2] * p[2]]
}

/// Linear sRGB → OKLab.
pub fn linear_srgb_to_oklab(rgb: Triple) -> Triple {
    lms_to_lab(mul(&LINEAR_SRGB_TO_LMS, rgb))
}

/// OKLab → linear sRGB (may be outside [0, 1] when out of gamut).
pub fn oklab_to_linear_srgb(lab: Triple) -> Triple {
    mul(&LMS_TO_LINEAR_SRGB, lab_to_lms(lab))
}

/// CIE XYZ (D65, Y of white = 1) → OKLab.
pub fn xyz_to_oklab(xyz: Triple) -> Triple {
    lms_to_lab(mul(&XYZ_TO_LMS, xyz))
}

/// Linear sRGB → CIE XYZ (D65), IEC 61966-2-1.
pub fn linear_srgb_to_xyz(rgb: Triple) -> Triple {
    mul(&LINEAR_SRGB_TO_XYZ, rgb)
}

/// CIE XYZ (D65) → linear sRGB, IEC 61966-2-1.
pub fn xyz_to_linear_srgb(xyz: Triple) -> Triple {
    mul(&XYZ_TO_LINEAR_SRGB, xyz)
}

/// Encoded sRGB → OKLab.
pub fn srgb_to_oklab(rgb: Triple) -> Triple {
    linear_srgb_to_oklab(rgb.map(srgb_to_linear))
}

/// OKLab → encoded sRGB (unclamped).
pub fn oklab_to_srgb(lab: Triple) -> Triple {
    oklab_to_linear_srgb(lab).map(linear_to_srgb)
}

/// OKLab (L, a, b) → OKLCH (L, C, h) with hue h in radians, (−π, π].
pub fn oklab_to_oklch(lab: Triple) -> Triple {
    [lab[0], lab[1].hypot(lab[2]), lab[2].atan2(lab[1])]
}

/// OKLCH (L, C, h in radians) → OKLab.
pub fn oklch_to_oklab(lch: Triple) -> Triple {
    let (s, c) = lch[2].sin_cos();
    [lch[0], lch[1] * c, lch[1] * s]
}

/// Euclidean colour difference ΔE_OK between two OKLab colours.
pub fn delta_e_ok(p: Triple, q: Triple) -> f64 {
    let d = [p[0] - q[0], p[1] - q[1], p[2] - q[2]];
    (d[0] * d[0] + d[1] * d[1] + d[2] * d[2]).sqrt()
}

/// True when a linear sRGB colour lies in [0, 1]³ (with tolerance `eps`).
pub fn in_srgb_gamut(linear_rgb: Triple, eps: f64) -> bool {
    linear_rgb.iter().all(|&v| v >= -eps && v <= 1.0 + eps)
}

/// Largest chroma C such that OKLCH (l, C, hue) is inside the sRGB gamut,
/// found by bisection (gamut membership is monotone along a chroma ray
/// from the grey axis for 0 < l < 1).
pub fn max_in_gamut_chroma(l: f64, hue: f64) -> f64 {
    if !(l > 0.0 && l < 1.0 && hue.is_finite()) {
        return 0.0;
    }
    let (mut lo, mut hi) = (0.0_f64, 0.5_f64);
    for _ in 0..60 {
        let mid = 0.5 * (lo + hi);
        let rgb = oklab_to_linear_srgb(oklch_to_oklab([l, mid, hue]));
        if in_srgb_gamut(rgb, 0.0) {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    lo
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_close, check_method};
    use crate::C;

    /// Slow reference: Ottosson 2020 written out by hand along the published
    /// route XYZ → M1 → cube root → M2, with linear sRGB → XYZ from
    /// IEC 61966-2-1 — not the combined linear-sRGB → LMS matrix the code uses.
    fn by_hand_xyz_to_oklab(x: f64, y: f64, z: f64) -> Triple {
        let l = 0.8189330101 * x + 0.3618667424 * y - 0.1288597137 * z;
        let m = 0.0329845436 * x + 0.9293118715 * y + 0.0361456387 * z;
        let s = 0.0482003018 * x + 0.2643662691 * y + 0.6338517070 * z;
        // Real cube roots (M1 gives a negative l for pure Z).
        let (l, m, s) = (l.cbrt(), m.cbrt(), s.cbrt());
        [
            0.2104542553 * l + 0.7936177850 * m - 0.0040720468 * s,
            1.9779984951 * l - 2.4285922050 * m + 0.4505937099 * s,
            0.0259040371 * l + 0.7827717662 * m - 0.8086757660 * s,
        ]
    }

    fn by_hand_linear_srgb_to_oklab(r: f64, g: f64, b: f64) -> Triple {
        by_hand_xyz_to_oklab(
            0.4124 * r + 0.3576 * g + 0.1805 * b,
            0.2126 * r + 0.7152 * g + 0.0722 * b,
            0.0193 * r + 0.1192 * g + 0.9505 * b,
        )
    }

    /// Cases as (colour, component) so that each OKLab component is one check.
    fn component_cases(colours: &[(&'static str, Triple)]) -> Vec<(&'static str, (Triple, usize))> {
        colours.iter().flat_map(|&(n, c)| (0..3).map(move |k| (n, (c, k)))).collect()
    }

    #[test]
    fn linear_srgb_to_oklab_matches_the_published_matrices_by_hand() {
        // Invented colours spread over the gamut, plus the primaries and white.
        let colours = [
            ("white", [1.0, 1.0, 1.0]),
            ("red", [1.0, 0.0, 0.0]),
            ("green", [0.0, 1.0, 0.0]),
            ("blue", [0.0, 0.0, 1.0]),
            ("mid grey", [0.2, 0.2, 0.2]),
            ("orange", [0.8, 0.3, 0.05]),
            ("teal", [0.05, 0.45, 0.5]),
        ];
        // The 4-digit IEC matrix against Ottosson's 10-digit combined one: 1e-3 apart at most.
        check_method(
            &component_cases(&colours),
            |&(c, k)| (C::new(linear_srgb_to_oklab(c)[k], 0.0), None),
            |&(c, k)| C::new(by_hand_linear_srgb_to_oklab(c[0], c[1], c[2])[k], 0.0),
            1e-3,
        );
        // And the XYZ route of the code itself against the same hand computation, tightly.
        let xyz = [("D65 white", [0.95, 1.0, 1.089]), ("X", [1.0, 0.0, 0.0]), ("Y", [0.0, 1.0, 0.0]), ("Z", [0.0, 0.0, 1.0])];
        check_method(
            &component_cases(&xyz),
            |&(c, k)| (C::new(xyz_to_oklab(c)[k], 0.0), None),
            |&(c, k)| C::new(by_hand_xyz_to_oklab(c[0], c[1], c[2])[k], 0.0),
            1e-12,
        );
    }

    #[test]
    fn published_example_pairs() {
        // Ottosson 2020, table of XYZ → OKLab examples (three decimals), from memory.
        let table = [
            ([0.950, 1.000, 1.089], [1.000, 0.000, 0.000]),
            ([1.000, 0.000, 0.000], [0.450, 1.236, -0.019]),
            ([0.000, 1.000, 0.000], [0.922, -0.671, 0.263]),
            ([0.000, 0.000, 1.000], [0.153, -1.415, -0.449]),
        ];
        for (xyz, lab) in table {
            let got = xyz_to_oklab(xyz);
            for k in 0..3 {
                assert_close(C::new(got[k], 0.0), C::new(lab[k], 0.0), 1.5e-3, &format!("XYZ {xyz:?} component {k}"));
            }
        }
        // sRGB primaries (from memory: CSS Color 4 / Ottosson's reference code).
        for (rgb, lab) in [
            ([0.0, 1.0, 0.0], [0.86644, -0.23389, 0.17950]),
            ([0.0, 0.0, 1.0], [0.45201, -0.03246, -0.31153]),
        ] {
            let got = srgb_to_oklab(rgb);
            for k in 0..3 {
                assert_close(C::new(got[k], 0.0), C::new(lab[k], 0.0), 2e-4, &format!("sRGB {rgb:?} component {k}"));
            }
        }
    }

    #[test]
    fn transfer_function_and_inverses() {
        // IEC 61966-2-1 piecewise curve written out: 0.5 encoded → ((0.5+0.055)/1.055)^2.4.
        let want = ((0.5_f64 + 0.055) / 1.055).powf(2.4);
        assert_close(C::new(srgb_to_linear(0.5), 0.0), C::new(want, 0.0), 1e-15, "sRGB 0.5");
        assert_close(C::new(srgb_to_linear(0.02), 0.0), C::new(0.02 / 12.92, 0.0), 1e-15, "linear segment");
        // Round trips (the matrices are published as mutual inverses to ~1e-9).
        for rgb in [[0.3, 0.6, 0.9], [1.0, 0.0, 0.5], [0.01, 0.02, 0.03]] {
            let back = oklab_to_srgb(srgb_to_oklab(rgb));
            for k in 0..3 {
                assert_close(C::new(back[k], 0.0), C::new(rgb[k], 0.0), 1e-7, "sRGB → OKLab → sRGB");
            }
        }
    }
}

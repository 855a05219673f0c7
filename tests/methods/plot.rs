//! Tests of the phase-plot colouring, renderer, PNG and base64 output.

use residuary::plot::base64;
use residuary::plot::colour_wheel::{self, colour, lut, lut_arg, wheel_srgb, Wheel, LUT_SIZE};
use residuary::plot::legend::legend_ring;
use residuary::plot::oklab::*;
use residuary::plot::phase_plot::{
    render, render_rows, validate, PlotOptions, View, NO_VALUE_RGB, POLE_RGB, ZERO_RGB,
};
use residuary::plot::png_encode::{encode_png_rgba, png_data_url};
use residuary::C;
use std::f64::consts::PI;

fn close3(got: Triple, want: Triple, tol: f64) -> bool {
    (0..3).all(|k| (got[k] - want[k]).abs() <= tol)
}

// ---------------------------------------------------------------- OKLab

#[test]
fn oklab_xyz_reference_pairs() {
    // Ottosson 2020, "A perceptual color space for image processing", table of
    // XYZ → OKLab test values, 3 decimals (from memory; they agree with our
    // matrices to the printed precision).
    let pairs = [
        ([0.950, 1.000, 1.089], [1.000, 0.000, 0.000]),
        ([1.000, 0.000, 0.000], [0.450, 1.236, -0.019]),
        ([0.000, 1.000, 0.000], [0.922, -0.671, 0.263]),
        ([0.000, 0.000, 1.000], [0.153, -1.415, -0.449]),
    ];
    for (xyz, lab) in pairs {
        let got = xyz_to_oklab(xyz);
        assert!(close3(got, lab, 6e-4), "{xyz:?} -> {got:?}, want {lab:?}");
    }
}

#[test]
fn oklab_srgb_primaries_and_white() {
    // White: L = 1, a = b = 0 by construction (Ottosson 2020).
    let w = srgb_to_oklab([1.0, 1.0, 1.0]);
    assert!(close3(w, [1.0, 0.0, 0.0], 1e-6), "{w:?}");
    // sRGB primaries in OKLab, as tabulated in CSS Color Module Level 4
    // examples (from memory, 5-6 decimals).
    let refs = [
        ([1.0, 0.0, 0.0], [0.627_955, 0.224_863, 0.125_846]),
        ([0.0, 1.0, 0.0], [0.866_440, -0.233_888, 0.179_498]),
        ([0.0, 0.0, 1.0], [0.452_014, -0.032_457, -0.311_528]),
    ];
    for (rgb, lab) in refs {
        let got = srgb_to_oklab(rgb);
        assert!(close3(got, lab, 2e-6), "{rgb:?} -> {got:?}");
        // The same via IEC 61966-2-1 sRGB → XYZ and Ottosson's M1/M2: the
        // 4-digit IEC matrix limits agreement to ~1e-4.
        let via_xyz = xyz_to_oklab(linear_srgb_to_xyz(rgb));
        assert!(close3(via_xyz, lab, 2e-4), "{rgb:?} via XYZ -> {via_xyz:?}");
    }
    let w2 = xyz_to_oklab(linear_srgb_to_xyz([1.0, 1.0, 1.0]));
    assert!(close3(w2, [1.0, 0.0, 0.0], 2e-4), "{w2:?}");
}

#[test]
fn srgb_transfer_function() {
    // IEC 61966-2-1: linear segment below 0.04045, power 2.4 above.
    assert_eq!(srgb_to_linear(0.0), 0.0);
    assert_eq!(srgb_to_linear(1.0), 1.0);
    assert!((srgb_to_linear(0.04045) - 0.04045 / 12.92).abs() < 1e-15);
    // 0.5 encoded → 0.214041 linear (common practice value, = ((0.555/1.055)^2.4)).
    assert!((srgb_to_linear(0.5) - 0.214_041_140).abs() < 1e-8);
    // 18 % grey → 0.461356 encoded (1.055·0.18^(1/2.4) − 0.055, IEC 61966-2-1).
    assert!((linear_to_srgb(0.18) - 0.461_356_129).abs() < 1e-8);
    for k in 0..=1000 {
        let u = k as f64 / 1000.0;
        assert!((linear_to_srgb(srgb_to_linear(u)) - u).abs() < 1e-12, "{u}");
    }
    // Continuity at the segment joint (IEC 61966-2-1 constants are chosen
    // to join within ~1e-7).
    let a = srgb_to_linear(0.04045 - 1e-12);
    let b = srgb_to_linear(0.04045 + 1e-12);
    assert!((a - b).abs() < 1e-7);
}

#[test]
fn oklab_round_trips() {
    // Property: forward and inverse transforms compose to the identity.
    for r in 0..=10 {
        for g in 0..=10 {
            for b in 0..=10 {
                let rgb = [r as f64 / 10.0, g as f64 / 10.0, b as f64 / 10.0];
                let lab = linear_srgb_to_oklab(rgb);
                let back = oklab_to_linear_srgb(lab);
                // the published M2 and its published inverse agree only to
                // ~4e-8 (checked: M2·M2⁻¹ − I has entries up to 3.7e-8)
                assert!(close3(back, rgb, 1e-6), "{rgb:?} -> {back:?}");
                let lch = oklab_to_oklch(lab);
                assert!(close3(oklch_to_oklab(lch), lab, 1e-14));
                let srgb = rgb.map(linear_to_srgb);
                // the sRGB curve's slope (up to 12.92) magnifies the ~1e-9 matrix error
                assert!(close3(oklab_to_srgb(srgb_to_oklab(srgb)), srgb, 1e-5));
                let xyz = linear_srgb_to_xyz(rgb);
                assert!(close3(xyz_to_linear_srgb(xyz), rgb, 2e-4));
            }
        }
    }
}

#[test]
fn max_chroma_is_gamut_boundary() {
    // Property: just inside the returned chroma is in gamut, just outside is not
    // (sRGB gamut = [0, 1]³ in linear light, IEC 61966-2-1).
    for k in 0..36 {
        let h = k as f64 * PI / 18.0;
        let c = max_in_gamut_chroma(0.6, h);
        assert!(c > 0.05 && c < 0.4, "hue {h}: {c}");
        let inside = oklab_to_linear_srgb(oklch_to_oklab([0.6, c * 0.999, h]));
        let outside = oklab_to_linear_srgb(oklch_to_oklab([0.6, c * 1.001 + 1e-9, h]));
        assert!(in_srgb_gamut(inside, 0.0));
        assert!(!in_srgb_gamut(outside, 0.0));
    }
    assert_eq!(max_in_gamut_chroma(f64::NAN, 0.0), 0.0);
    assert_eq!(max_in_gamut_chroma(1.0, 0.0), 0.0);
}

// ---------------------------------------------------------------- wheels

fn step_ratio(wheel: Wheel, samples: usize) -> f64 {
    let labs: Vec<Triple> = (0..=samples)
        .map(|k| {
            srgb_to_oklab(wheel_srgb(
                wheel,
                -PI + 2.0 * PI * k as f64 / samples as f64,
            ))
        })
        .collect();
    let steps: Vec<f64> = labs.windows(2).map(|w| delta_e_ok(w[0], w[1])).collect();
    let max = steps.iter().cloned().fold(0.0, f64::max);
    let min = steps.iter().cloned().fold(f64::INFINITY, f64::min);
    max / min
}

#[test]
fn oklch_wheel_in_gamut_with_margin() {
    use colour_wheel::{OKLCH_CHROMA, OKLCH_HUE_AT_ARG_ZERO, OKLCH_LIGHTNESS};
    let mut min_cmax = f64::INFINITY;
    for k in 0..3600 {
        let h = k as f64 * PI / 1800.0;
        min_cmax = min_cmax.min(max_in_gamut_chroma(OKLCH_LIGHTNESS, h));
        let rgb = oklab_to_linear_srgb(oklch_to_oklab([OKLCH_LIGHTNESS, OKLCH_CHROMA, h]));
        assert!(in_srgb_gamut(rgb, 0.0), "hue {h} out of gamut: {rgb:?}");
    }
    // Chroma is 90–97 % of the largest chroma that fits all hues.
    assert!(
        OKLCH_CHROMA < 0.97 * min_cmax && OKLCH_CHROMA > 0.90 * min_cmax,
        "{min_cmax}"
    );
    // Property: our documented design convention, arg 0 has OKLCH hue 55° (a soft orange).
    let lch = oklab_to_oklch(srgb_to_oklab(wheel_srgb(Wheel::Oklch, 0.0)));
    assert!((lch[2] - OKLCH_HUE_AT_ARG_ZERO).abs() < 1e-6);
    assert!((lch[2].to_degrees() - 55.0).abs() < 1e-4);
    assert!((lch[0] - 0.75).abs() < 1e-6 && (lch[1] - 0.12).abs() < 1e-6);
}

#[test]
fn wheels_are_cyclic_and_smooth() {
    for wheel in [Wheel::Oklch, Wheel::Hsv] {
        assert_eq!(colour(wheel, -PI), colour(wheel, PI));
        let a = wheel_srgb(wheel, -PI);
        let b = wheel_srgb(wheel, PI);
        assert!(close3(a, b, 1e-12));
        // just either side of the cut: within one u8 step
        let l = colour(wheel, PI - 1e-9);
        let r = colour(wheel, -PI + 1e-9);
        for k in 0..3 {
            assert!((l[k] as i32 - r[k] as i32).abs() <= 1);
        }
        let t = lut(wheel);
        assert_eq!(t.len(), LUT_SIZE);
        for k in 0..LUT_SIZE {
            let (p, q) = (t[k], t[(k + 1) % LUT_SIZE]);
            for c in 0..3 {
                assert!(
                    (p[c] as i32 - q[c] as i32).abs() <= 2,
                    "{wheel:?} entry {k}"
                );
            }
        }
        // LUT agrees with the exact wheel
        for k in (0..LUT_SIZE).step_by(37) {
            let exact = wheel_srgb(wheel, lut_arg(k)).map(|v| (v * 255.0).round() as u8);
            assert_eq!(t[k], exact);
        }
    }
}

#[test]
fn oklch_wheel_is_perceptually_even_hsv_is_not() {
    // Exact wheel: equal arg steps give equal ΔE_OK (constant L, C, linear hue).
    let oklch = step_ratio(Wheel::Oklch, 1024);
    assert!(oklch < 1.01, "OKLCH ratio {oklch}");
    // HSV hue circle: steps differ by a large factor (fast through blue-magenta... slow near green).
    let hsv = step_ratio(Wheel::Hsv, 1024);
    // measured ≈ 37 (our own measurement; property: far from even)
    assert!(hsv > 10.0, "HSV ratio {hsv}");
    // Quantised LUT, compared 32 entries apart (ΔE ≈ 0.024 ≫ u8 rounding):
    let t = lut(Wheel::Oklch);
    let labs: Vec<Triple> = (0..=LUT_SIZE / 32)
        .map(|k| srgb_to_oklab(t[(k * 32) % LUT_SIZE].map(|v| v as f64 / 255.0)))
        .collect();
    let steps: Vec<f64> = labs.windows(2).map(|w| delta_e_ok(w[0], w[1])).collect();
    let max = steps.iter().cloned().fold(0.0, f64::max);
    let min = steps.iter().cloned().fold(f64::INFINITY, f64::min);
    assert!(max / min < 1.5, "LUT ratio {}", max / min); // measured ≈ 1.13
}

#[test]
fn hsv_wheel_primaries() {
    // HSV hue circle (Smith 1978): 0 = red, 120° = green, 240° = blue, 60° = yellow.
    assert_eq!(colour(Wheel::Hsv, 0.0), [255, 0, 0]);
    assert_eq!(colour(Wheel::Hsv, 2.0 * PI / 3.0), [0, 255, 0]);
    assert_eq!(colour(Wheel::Hsv, -2.0 * PI / 3.0), [0, 0, 255]);
    assert_eq!(colour(Wheel::Hsv, PI / 3.0), [255, 255, 0]);
    assert_eq!(colour(Wheel::Hsv, PI), [0, 255, 255]);
    assert_eq!(colour(Wheel::Oklch, f64::NAN), lut(Wheel::Oklch)[0]);
}

// ---------------------------------------------------------------- renderer

fn pointwise(f: impl Fn(C) -> C) -> impl FnMut(&[C], &mut [C]) {
    move |zs: &[C], out: &mut [C]| {
        for (o, z) in out.iter_mut().zip(zs) {
            *o = f(*z);
        }
    }
}

fn px(buf: &[u8], width: u32, i: u32, j: u32) -> [u8; 4] {
    let p = 4 * (j * width + i) as usize;
    [buf[p], buf[p + 1], buf[p + 2], buf[p + 3]]
}

fn plain(wheel: Wheel) -> PlotOptions {
    PlotOptions {
        wheel,
        modulus_lines: false,
        phase_lines: false,
        ..PlotOptions::default()
    }
}

const VIEW: View = View {
    x0: -2.0,
    x1: 3.0,
    y0: -1.0,
    y1: 1.5,
};

#[test]
fn identity_colours_match_pixel_arguments() {
    let (w, h) = (50u32, 25u32);
    for wheel in [Wheel::Oklch, Wheel::Hsv] {
        let mut out = vec![0u8; (w * h * 4) as usize];
        render(&mut pointwise(|z| z), VIEW, w, h, &plain(wheel), &mut out).unwrap();
        let (dx, dy) = (5.0 / w as f64, 2.5 / h as f64);
        // Slow reference: every pixel centre, independently.
        for j in 0..h {
            for i in 0..w {
                let z = C::new(-2.0 + (i as f64 + 0.5) * dx, 1.5 - (j as f64 + 0.5) * dy);
                let c = colour(wheel, z.arg());
                assert_eq!(px(&out, w, i, j), [c[0], c[1], c[2], 255], "pixel {i},{j}");
            }
        }
        // Top-right pixel: z = (3 − dx/2) + i(1.5 − dy/2), first quadrant.
        let c = colour(wheel, (1.5 - dy / 2.0).atan2(3.0 - dx / 2.0));
        assert_eq!(&px(&out, w, w - 1, 0)[..3], &c);
    }
    // The HSV top-right pixel at arg ≈ 0.45 rad (26°): red-orange (R = 255, B = 0).
    let mut out = vec![0u8; (w * h * 4) as usize];
    render(
        &mut pointwise(|z| z),
        VIEW,
        w,
        h,
        &plain(Wheel::Hsv),
        &mut out,
    )
    .unwrap();
    let p = px(&out, w, w - 1, 0);
    assert!(p[0] == 255 && p[2] == 0 && p[1] > 90 && p[1] < 140, "{p:?}");
}

#[test]
fn infinity_view_evaluates_at_reciprocal() {
    let (w, h) = (20u32, 20u32);
    let view = View {
        x0: -1.0,
        x1: 1.0,
        y0: -1.0,
        y1: 1.0,
    };
    let opts = PlotOptions {
        infinity_view: true,
        ..plain(Wheel::Oklch)
    };
    let mut out = vec![0u8; (w * h * 4) as usize];
    render(&mut pointwise(|z| z), view, w, h, &opts, &mut out).unwrap();
    // top-right pixel: w = 0.95 + 0.95i, z = 1/w has arg −π/4.
    let c = colour(Wheel::Oklch, -PI / 4.0);
    assert_eq!(&px(&out, w, w - 1, 0)[..3], &c);
    // an odd size puts a pixel centre at w = 0 → z = ∞ → pole colour
    let mut out = vec![0u8; 9 * 9 * 4];
    render(&mut pointwise(|z| z), view, 9, 9, &opts, &mut out).unwrap();
    assert_eq!(&px(&out, 9, 4, 4)[..3], &POLE_RGB);
}

#[test]
fn special_values_are_marked_and_never_crash() {
    let (w, h) = (40u32, 30u32);
    // Columns: 0..10 NaN, 10..20 infinite, 20..30 exact zero, 30..40 huge/tiny finite.
    let mut special = |zs: &[C], out: &mut [C]| {
        for (o, z) in out.iter_mut().zip(zs) {
            let col = ((z.re + 2.0) / 5.0 * 40.0).floor();
            *o = if col < 10.0 {
                C::new(f64::NAN, 1.0)
            } else if col < 20.0 {
                C::new(f64::INFINITY, f64::NEG_INFINITY)
            } else if col < 30.0 {
                C::new(0.0, 0.0)
            } else if z.im > 0.0 {
                C::new(1e300, -1e300)
            } else {
                C::new(-1e-310, 5e-320)
            };
        }
    };
    for lines in [false, true] {
        let opts = PlotOptions {
            modulus_lines: lines,
            phase_lines: lines,
            ..Default::default()
        };
        let mut out = vec![0u8; (w * h * 4) as usize];
        render(&mut special, VIEW, w, h, &opts, &mut out).unwrap();
        for j in 0..h {
            let nan = px(&out, w, 5, j);
            assert!(NO_VALUE_RGB.iter().any(|g| g[..] == nan[..3]));
            assert_eq!(&px(&out, w, 15, j)[..3], &POLE_RGB);
            assert_eq!(&px(&out, w, 25, j)[..3], &ZERO_RGB);
            assert!(out.chunks(4).all(|p| p[3] == 255));
        }
        // "no value" is a checkerboard: both greys occur
        let greys: Vec<[u8; 4]> = (0..8).map(|j| px(&out, w, 1, j)).collect();
        assert!(greys.iter().any(|p| p[..3] == NO_VALUE_RGB[0]));
        assert!(greys.iter().any(|p| p[..3] == NO_VALUE_RGB[1]));
        // huge finite: arg −π/4; tiny finite: arg ≈ π (hue from the LUT)
        let top = px(&out, w, 35, 2);
        let c = colour(Wheel::Oklch, -PI / 4.0);
        for k in 0..3 {
            assert!(top[k] <= c[k] && top[k] as f64 >= 0.5 * c[k] as f64);
        }
    }
    // An evaluator that writes nothing leaves "no value".
    let mut out = vec![0u8; 16];
    render(
        &mut |_: &[C], _: &mut [C]| {},
        VIEW,
        2,
        2,
        &PlotOptions::default(),
        &mut out,
    )
    .unwrap();
    assert!(out
        .chunks(4)
        .all(|p| NO_VALUE_RGB.iter().any(|g| g[..] == p[..3])));
}

#[test]
fn row_bands_equal_full_render() {
    // Slow reference: the full render in one call; every band must equal its rows exactly.
    let (w, h) = (97u32, 61u32);
    let view = View {
        x0: -2.0,
        x1: 2.0,
        y0: -1.3,
        y1: 1.2,
    };
    let f = |z: C| z.inv().exp() * z.sin() + C::new(0.0, 1.0) / (z - C::new(1.0, 0.5));
    for opts in [
        PlotOptions::default(),
        plain(Wheel::Hsv),
        PlotOptions {
            infinity_view: true,
            modulus_base: std::f64::consts::E,
            phase_line_count: 8,
            ..Default::default()
        },
    ] {
        let mut full = vec![0u8; (w * h * 4) as usize];
        render(&mut pointwise(f), view, w, h, &opts, &mut full).unwrap();
        for band in [1u32, 7, 60] {
            let mut start = 0;
            while start < h {
                let end = (start + band).min(h);
                let mut part = vec![0u8; ((end - start) * w * 4) as usize];
                render_rows(&mut pointwise(f), view, w, h, start, end, &opts, &mut part).unwrap();
                assert_eq!(
                    part[..],
                    full[(start * w * 4) as usize..(end * w * 4) as usize]
                );
                start = end;
            }
        }
    }
}

/// Index of the darkest pixel of row `j`, columns `range`, by channel sum.
fn darkest(buf: &[u8], w: u32, j: u32, range: std::ops::Range<u32>) -> (u32, u32) {
    range
        .map(|i| {
            let p = px(buf, w, i, j);
            (p[0] as u32 + p[1] as u32 + p[2] as u32, i)
        })
        .min()
        .map(|(s, i)| (i, s))
        .unwrap()
}

#[test]
fn modulus_and_phase_lines_sit_on_their_levels_at_any_resolution() {
    for n in [101u32, 401] {
        let view = View {
            x0: -2.0,
            x1: 2.0,
            y0: -2.0,
            y1: 2.0,
        };
        // modulus lines alone first (the real axis is also a phase line)
        let opts = PlotOptions {
            modulus_base: 2.0,
            phase_lines: false,
            ..Default::default()
        };
        let mut out = vec![0u8; (n * n * 4) as usize];
        render(&mut pointwise(|z| z), view, n, n, &opts, &mut out).unwrap();
        let d = 4.0 / n as f64;
        // pixel row through y = 0
        let mid = n / 2;
        // |f| = 1 crosses the positive real axis at x = 1 (f = z; by hand).
        let lo = ((2.7 / d) as u32, (3.3 / d) as u32); // x in 0.7..1.3
        let (i, s) = darkest(&out, n, mid, lo.0..lo.1);
        let x = -2.0 + (i as f64 + 0.5) * d;
        assert!((x - 1.0).abs() <= 1.0 * d, "n={n}: modulus line at {x}");
        let base = colour(Wheel::Oklch, 0.0);
        let bsum: u32 = base.iter().map(|&v| v as u32).sum();
        assert!(
            (s as f64) < 0.8 * bsum as f64,
            "line too faint: {s} vs {bsum}"
        );
        // Line width in pixels is resolution independent: count darkened pixels.
        let dark = (lo.0..lo.1)
            .filter(|&i| {
                let p = px(&out, n, i, mid);
                let sum = p[0] as u32 + p[1] as u32 + p[2] as u32;
                (sum as f64) < 0.85 * bsum as f64
            })
            .count();
        assert!((1..=3).contains(&dark), "n={n}: {dark} dark pixels");
        // Phase line arg = π/2 (a multiple of 2π/12) is the positive imaginary
        // axis: along the row through y ≈ 1 the darkest pixel is at x ≈ 0.
        let opts = PlotOptions {
            modulus_lines: false,
            phase_line_count: 12,
            ..Default::default()
        };
        render(&mut pointwise(|z| z), view, n, n, &opts, &mut out).unwrap();
        let row = ((2.0 - 1.0) / d) as u32;
        let (i, _) = darkest(&out, n, row, (mid - 10)..(mid + 11));
        let x = -2.0 + (i as f64 + 0.5) * d;
        assert!(x.abs() <= d, "n={n}: phase line at {x}");
    }
}

#[test]
fn invalid_requests_are_refused_with_reasons() {
    let opts = PlotOptions::default();
    let mut id = pointwise(|z| z);
    let mut buf = vec![0u8; 16];
    for (w, h) in [(0u32, 1u32), (1, 0), (4097, 1), (1, 4097)] {
        let e = render(&mut id, VIEW, w, h, &opts, &mut buf).unwrap_err();
        assert!(e.to_string().contains("1..=4096"), "{e}");
    }
    assert!(validate(&VIEW, 4096, 4096, &opts).is_ok()); // exactly 16 Mpx
    let bad_views = [
        View {
            x0: 1.0,
            x1: 1.0,
            ..VIEW
        },
        View {
            x0: 2.0,
            x1: 1.0,
            ..VIEW
        },
        View {
            y0: 0.0,
            y1: -1.0,
            ..VIEW
        },
        View {
            x0: f64::NAN,
            ..VIEW
        },
        View {
            y1: f64::INFINITY,
            ..VIEW
        },
        View {
            x0: -1e308,
            x1: 1e308,
            ..VIEW
        },
    ];
    for v in bad_views {
        assert!(render(&mut id, v, 2, 2, &opts, &mut buf).is_err(), "{v:?}");
    }
    // wrong buffer length
    let e = render(&mut id, VIEW, 2, 2, &opts, &mut [0u8; 15]).unwrap_err();
    assert!(e.to_string().contains("16"), "{e}");
    // bad band
    assert!(render_rows(&mut id, VIEW, 2, 2, 1, 1, &opts, &mut []).is_err());
    assert!(render_rows(&mut id, VIEW, 2, 2, 1, 3, &opts, &mut buf).is_err());
    // bad options
    let o = PlotOptions {
        phase_line_count: 0,
        ..opts
    };
    assert!(render(&mut id, VIEW, 2, 2, &o, &mut buf)
        .unwrap_err()
        .to_string().contains("phase_line_count"));
    for b in [1.0, 0.5, f64::NAN, f64::INFINITY] {
        let o = PlotOptions {
            modulus_base: b,
            ..opts
        };
        assert!(render(&mut id, VIEW, 2, 2, &o, &mut buf)
            .unwrap_err()
            .to_string().contains("modulus_base"));
    }
    // ...but ignored when that kind of line is off
    let o = PlotOptions {
        phase_lines: false,
        phase_line_count: 0,
        ..opts
    };
    assert!(render(&mut id, VIEW, 2, 2, &o, &mut buf).is_ok());
}

// ---------------------------------------------------------------- PNG, base64, legend

#[test]
fn png_round_trip() {
    let (w, h) = (37u32, 23u32);
    let mut out = vec![0u8; (w * h * 4) as usize];
    render(
        &mut pointwise(|z| z.sin() / (z * z + 1.5)),
        VIEW,
        w,
        h,
        &PlotOptions::default(),
        &mut out,
    )
    .unwrap();
    let bytes = encode_png_rgba(w, h, &out).unwrap();
    // PNG signature (PNG specification §5.2)
    assert_eq!(&bytes[..8], &[137, 80, 78, 71, 13, 10, 26, 10]);
    let decoder = png::Decoder::new(std::io::Cursor::new(&bytes));
    let mut reader = decoder.read_info().unwrap();
    let mut back = vec![0u8; reader.output_buffer_size()];
    let info = reader.next_frame(&mut back).unwrap();
    assert_eq!((info.width, info.height), (w, h));
    assert_eq!(info.color_type, png::ColorType::Rgba);
    assert_eq!(info.bit_depth, png::BitDepth::Eight);
    assert_eq!(back[..info.buffer_size()], out[..]);
    // data URL carries the same bytes
    let url = png_data_url(w, h, &out).unwrap();
    let b64 = url.strip_prefix("data:image/png;base64,").unwrap();
    assert_eq!(base64::decode(b64).unwrap(), bytes);
    // refusals
    assert!(encode_png_rgba(0, 1, &[]).is_err());
    assert!(encode_png_rgba(2, 2, &[0u8; 15]).is_err());
}

#[test]
fn base64_rfc4648_vectors() {
    // RFC 4648 §10 test vectors.
    let v = [
        ("", ""),
        ("f", "Zg=="),
        ("fo", "Zm8="),
        ("foo", "Zm9v"),
        ("foob", "Zm9vYg=="),
        ("fooba", "Zm9vYmE="),
        ("foobar", "Zm9vYmFy"),
    ];
    for (plain, enc) in v {
        assert_eq!(base64::encode(plain.as_bytes()), enc);
        assert_eq!(base64::decode(enc).unwrap(), plain.as_bytes());
    }
    // all byte values round trip; '+' and '/' appear (RFC 4648 Table 1)
    let all: Vec<u8> = (0..=255u8).collect();
    let e = base64::encode(&all);
    assert!(e.to_string().contains('+') && e.to_string().contains('/'));
    assert_eq!(base64::decode(&e).unwrap(), all);
    assert_eq!(base64::encode(&[0xfb, 0xff]), "+/8=");
    for bad in [
        "Zg=", "Z===", "Zh==", "Zm9v!A==", "Zg==Zg==", "=Zg=", "Zm9v\n",
    ] {
        assert!(base64::decode(bad).is_err(), "{bad:?} accepted");
    }
}

#[test]
fn legend_ring_shows_the_wheel() {
    let n = 64u32;
    for wheel in [Wheel::Oklch, Wheel::Hsv] {
        let img = legend_ring(n, wheel).unwrap();
        assert_eq!(img.len(), (n * n * 4) as usize);
        // centre hole and corner are transparent
        assert_eq!(px(&img, n, 32, 32)[3], 0);
        assert_eq!(px(&img, n, 0, 0)[3], 0);
        // right of centre, inside the ring: arg of that pixel centre
        let (i, j) = (58u32, 31u32);
        let (x, y) = (i as f64 + 0.5 - 32.0, 32.0 - (j as f64 + 0.5));
        let p = px(&img, n, i, j);
        assert_eq!(p[3], 255);
        assert_eq!(&p[..3], &colour(wheel, y.atan2(x)));
        // top of the ring: arg ≈ π/2
        let p = px(&img, n, 31, 4);
        assert_eq!(&p[..3], &colour(wheel, (32.0 - 4.5_f64).atan2(31.5 - 32.0)));
    }
    assert!(legend_ring(4, Wheel::Oklch).is_err());
    assert!(legend_ring(5000, Wheel::Oklch).is_err());
}

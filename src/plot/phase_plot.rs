//! Phase-plot renderer: colours each pixel of a view box by arg f(z), with
//! optional contour lines of log|f| and of arg f.
//!
//! Method: domain colouring ("phase plot") — the argument of f(z) picks a
//! hue from a colour wheel lookup table; an "enhanced" phase plot adds level
//! lines of log_b|f| and of arg f (E. Wegert and G. Semmler, "Phase plots of
//! complex functions: a journey in illustration", Notices of the AMS 58(6),
//! 2011). Lines are anti-aliased with a fixed width in pixels: the distance
//! to the nearest level, in level units, is divided by the local gradient in
//! level units per pixel, estimated by central differences with the
//! neighbouring pixels (one extra column on each side, one extra row above
//! and below). Where levels come closer than a few pixels the lines fade out
//! instead of forming moiré.
//!
//! Conventions:
//! * row 0 is the TOP of the image (largest imaginary part), column 0 the
//!   left (smallest real part); pixel (i, j) samples its centre
//!   z = x0 + (i + ½)·(x1 − x0)/width + i·(y1 − (j + ½)·(y1 − y0)/height);
//! * `infinity_view`: the view box holds w, and the renderer evaluates
//!   f at z = 1/w (w = 0 is passed as z = +∞ + 0i), so the picture around
//!   w = 0 shows f near z = ∞;
//! * special values: f = 0 → near-black, f infinite (a pole hit exactly, or
//!   overflow) → near-white, NaN ("no value": outside the domain or failed
//!   evaluation) → a grey 4-pixel checkerboard, distinct from both;
//! * modulus lines (when on) also add a gentle brightness ramp inside each
//!   band of log_b|f|, brightest just below the next level, so that |f|
//!   visibly grows away from zeros and towards poles.
//!
//! ```
//! use residuary::plot::colour_wheel::colour;
//! use residuary::plot::phase_plot::{render, PlotOptions, View, Wheel};
//! use residuary::C;
//! // f(z) = z on a 2×1 image of [−1, 1]×[−½, ½]: the pixel centres are
//! // z = −½ and z = ½ (the convention above), where arg f is π and 0.
//! let opts = PlotOptions { modulus_lines: false, phase_lines: false, ..PlotOptions::default() };
//! let view = View { x0: -1.0, x1: 1.0, y0: -0.5, y1: 0.5 };
//! let mut out = vec![0u8; 2 * 4];
//! let mut f = |zs: &[C], fs: &mut [C]| fs.copy_from_slice(zs);
//! render(&mut f, view, 2, 1, &opts, &mut out).unwrap();
//! assert_eq!(out[0..3], colour(Wheel::Oklch, std::f64::consts::PI));
//! assert_eq!(out[4..7], colour(Wheel::Oklch, 0.0));
//! assert_eq!((out[3], out[7]), (255, 255));
//! ```

pub use super::colour_wheel::Wheel;
use super::colour_wheel::{lut, lut_index};
use crate::error::Failure;
use crate::C;
use std::f64::consts::PI;

/// Largest accepted width or height in pixels.
pub const MAX_SIDE: u32 = 4096;
/// Largest accepted pixel count (16 Mpx = 16 × 2^20).
pub const MAX_PIXELS: u64 = 16 * 1024 * 1024;
/// Largest accepted number of phase lines per turn.
pub const MAX_PHASE_LINES: u32 = 720;

/// Colour of pixels where f = 0 exactly.
pub const ZERO_RGB: [u8; 3] = [18, 18, 18];
/// Colour of pixels where f is infinite.
pub const POLE_RGB: [u8; 3] = [250, 250, 250];
/// The two greys of the "no value" (NaN) checkerboard.
pub const NO_VALUE_RGB: [[u8; 3]; 2] = [[112, 112, 112], [144, 144, 144]];
/// Side of a "no value" checkerboard cell in pixels.
pub const NO_VALUE_CELL: i64 = 4;

/// Full line width in pixels (anti-aliased).
const LINE_WIDTH_PX: f64 = 1.3;
/// Darkening at the centre of a modulus line (fraction of the colour).
const MODULUS_LINE_STRENGTH: f64 = 0.38;
/// Darkening at the centre of a phase line.
const PHASE_LINE_STRENGTH: f64 = 0.28;
/// Depth of the brightness ramp inside a modulus band.
const MODULUS_RAMP_DEPTH: f64 = 0.10;
/// Level spacing (pixels) below which lines are fully faded out.
const FADE_START_PX: f64 = 2.0;
/// Level spacing (pixels) above which lines are fully drawn.
const FADE_END_PX: f64 = 5.0;

/// The rectangle of the complex plane shown: real part in [x0, x1],
/// imaginary part in [y0, y1].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct View {
    pub x0: f64,
    pub x1: f64,
    pub y0: f64,
    pub y1: f64,
}

/// Rendering options.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PlotOptions {
    /// Colour wheel for arg f.
    pub wheel: Wheel,
    /// Draw level lines of log_b|f| (and the brightness ramp between them).
    pub modulus_lines: bool,
    /// Draw level lines of arg f at multiples of 2π / `phase_line_count`.
    pub phase_lines: bool,
    /// Evaluate f(1/w) at pixel w (look at z = ∞ around w = 0).
    pub infinity_view: bool,
    /// Number of phase lines per full turn (1..=720), e.g. 12 (every 30°).
    pub phase_line_count: u32,
    /// Base b of the modulus levels |f| = b^k (finite, > 1), e.g. 2 or e.
    pub modulus_base: f64,
}

impl Default for PlotOptions {
    /// OKLCH wheel, both kinds of lines, 12 phase lines, modulus base 2.
    fn default() -> Self {
        PlotOptions {
            wheel: Wheel::Oklch,
            modulus_lines: true,
            phase_lines: true,
            infinity_view: false,
            phase_line_count: 12,
            modulus_base: 2.0,
        }
    }
}

/// Checks image size, view box and options; the error says what to change.
pub fn validate(view: &View, width: u32, height: u32, opts: &PlotOptions) -> Result<(), Failure> {
    if width == 0 || height == 0 || width > MAX_SIDE || height > MAX_SIDE {
        return Err(Failure::invalid(format!(
            "image size {width}×{height} is not allowed: width and height must each be 1..={MAX_SIDE} pixels"
        )));
    }
    if u64::from(width) * u64::from(height) > MAX_PIXELS {
        return Err(Failure::invalid(format!(
            "image of {width}×{height} pixels is too large: at most {MAX_PIXELS} pixels in total"
        )));
    }
    let View { x0, x1, y0, y1 } = *view;
    if ![x0, x1, y0, y1].iter().all(|v| v.is_finite()) {
        return Err(Failure::invalid("view box must have finite corners; choose finite x0, x1, y0, y1"));
    }
    if !(x0 < x1 && y0 < y1) {
        return Err(Failure::invalid(format!(
            "view box is empty: need x0 < x1 and y0 < y1 (got x {x0}..{x1}, y {y0}..{y1})"
        )));
    }
    if !((x1 - x0).is_finite() && (y1 - y0).is_finite()) {
        return Err(Failure::invalid("view box is too wide for double precision; choose a smaller view"));
    }
    if opts.phase_lines && !(1..=MAX_PHASE_LINES).contains(&opts.phase_line_count) {
        return Err(Failure::invalid(format!(
            "phase_line_count must be 1..={MAX_PHASE_LINES} (got {}); use e.g. 12, or turn phase lines off",
            opts.phase_line_count
        )));
    }
    if opts.modulus_lines && !(opts.modulus_base.is_finite() && opts.modulus_base > 1.0) {
        return Err(Failure::invalid(format!(
            "modulus_base must be a finite number greater than 1 (got {}); use e.g. 2 or 2.718281828",
            opts.modulus_base
        )));
    }
    Ok(())
}

/// Renders the whole image into `out` (RGBA8, `width·height·4` bytes,
/// row-major from the top row).
pub fn render(
    eval_block: &mut dyn FnMut(&[C], &mut [C]),
    view: View,
    width: u32,
    height: u32,
    opts: &PlotOptions,
    out: &mut [u8],
) -> Result<(), Failure> {
    render_rows(eval_block, view, width, height, 0, height, opts, out)
}

/// Renders rows `row_start..row_end` of the full `width × height` image into
/// `out`, which holds just that band: `(row_end − row_start)·width·4` bytes.
/// Bands rendered separately are byte-for-byte equal to the same rows of
/// [`render`]. `eval_block` is called once per row (plus one row above and
/// below the band when lines are on) with the points of that row.
#[allow(clippy::too_many_arguments)]
pub fn render_rows(
    eval_block: &mut dyn FnMut(&[C], &mut [C]),
    view: View,
    width: u32,
    height: u32,
    row_start: u32,
    row_end: u32,
    opts: &PlotOptions,
    out: &mut [u8],
) -> Result<(), Failure> {
    validate(&view, width, height, opts)?;
    if !(row_start < row_end && row_end <= height) {
        return Err(Failure::invalid(format!(
            "row band {row_start}..{row_end} is invalid: need row_start < row_end <= height ({height})"
        )));
    }
    let w = width as usize;
    let band = (row_end - row_start) as usize;
    let need = band * w * 4;
    if out.len() != need {
        return Err(Failure::invalid(format!(
            "output buffer has {} bytes but rows {row_start}..{row_end} of width {width} need {need} (RGBA)",
            out.len()
        )));
    }
    let lines = opts.modulus_lines || opts.phase_lines;
    let mut r = Renderer::new(view, width, height, opts, lines);
    if !lines {
        for (k, j) in (row_start..row_end).enumerate() {
            r.eval_row(eval_block, i64::from(j), 1);
            r.colour_row(i64::from(j), &mut out[k * w * 4..(k + 1) * w * 4]);
        }
        return Ok(());
    }
    // Rolling window: slot 0 = row above, 1 = this row, 2 = row below.
    r.eval_row(eval_block, i64::from(row_start) - 1, 0);
    r.eval_row(eval_block, i64::from(row_start), 1);
    for (k, j) in (row_start..row_end).enumerate() {
        r.eval_row(eval_block, i64::from(j) + 1, 2);
        r.colour_row(i64::from(j), &mut out[k * w * 4..(k + 1) * w * 4]);
        r.rows.rotate_left(1);
    }
    Ok(())
}

/// Per-pixel quantities of one evaluated row.
#[derive(Clone, Default)]
struct RowData {
    /// Class of f: see `KIND_*`.
    kind: Vec<u8>,
    /// arg f in (−π, π] (0 where not finite-nonzero).
    arg: Vec<f64>,
    /// ln|f| (finite for finite nonzero f; ±∞ or NaN otherwise).
    ln_abs: Vec<f64>,
}

const KIND_FINITE: u8 = 0;
const KIND_ZERO: u8 = 1;
const KIND_POLE: u8 = 2;
const KIND_NO_VALUE: u8 = 3;

struct Renderer<'a> {
    view: View,
    width: usize,
    dx: f64,
    dy: f64,
    pad: usize,
    opts: &'a PlotOptions,
    lut: &'static [[u8; 3]],
    zs: Vec<C>,
    fs: Vec<C>,
    rows: [RowData; 3],
    phase_scale: f64,
    modulus_scale: f64,
}

impl<'a> Renderer<'a> {
    fn new(view: View, width: u32, height: u32, opts: &'a PlotOptions, lines: bool) -> Self {
        let pad = usize::from(lines);
        let n = width as usize + 2 * pad;
        let row = RowData {
            kind: vec![KIND_NO_VALUE; n],
            arg: vec![0.0; n],
            ln_abs: vec![f64::NAN; n],
        };
        Renderer {
            view,
            width: width as usize,
            dx: (view.x1 - view.x0) / f64::from(width),
            dy: (view.y1 - view.y0) / f64::from(height),
            pad,
            opts,
            lut: lut(opts.wheel),
            zs: vec![C::new(0.0, 0.0); n],
            fs: vec![C::new(0.0, 0.0); n],
            rows: [row.clone(), row.clone(), row],
            phase_scale: f64::from(opts.phase_line_count.max(1)) / (2.0 * PI),
            modulus_scale: 1.0 / opts.modulus_base.ln(),
        }
    }

    /// Evaluates image row `j` (may be −1 or `height`), columns −pad..width+pad,
    /// into row slot `slot`.
    fn eval_row(&mut self, eval_block: &mut dyn FnMut(&[C], &mut [C]), j: i64, slot: usize) {
        let y = self.view.y1 - (j as f64 + 0.5) * self.dy;
        for (k, z) in self.zs.iter_mut().enumerate() {
            let i = k as f64 - self.pad as f64;
            let x = self.view.x0 + (i + 0.5) * self.dx;
            *z = if self.opts.infinity_view {
                reciprocal(x, y)
            } else {
                C::new(x, y)
            };
        }
        for f in self.fs.iter_mut() {
            *f = C::new(f64::NAN, f64::NAN);
        }
        eval_block(&self.zs, &mut self.fs);
        let row = &mut self.rows[slot];
        for (k, f) in self.fs.iter().enumerate() {
            let (kind, arg, ln_abs) = classify(*f);
            row.kind[k] = kind;
            row.arg[k] = arg;
            row.ln_abs[k] = ln_abs;
        }
    }

    /// Colours image row `j` from row slot 1 (with slots 0 and 2 as the rows
    /// above and below when lines are on).
    fn colour_row(&self, j: i64, out: &mut [u8]) {
        let mid = &self.rows[1];
        for i in 0..self.width {
            let c = i + self.pad;
            let rgb = match mid.kind[c] {
                KIND_ZERO => ZERO_RGB,
                KIND_POLE => POLE_RGB,
                KIND_NO_VALUE => {
                    let cell = ((i as i64).div_euclid(NO_VALUE_CELL) + j.div_euclid(NO_VALUE_CELL))
                        .rem_euclid(2);
                    NO_VALUE_RGB[cell as usize]
                }
                _ => {
                    let base = self.lut[lut_index(mid.arg[c])];
                    let m = if self.pad == 1 { self.shade(c) } else { 1.0 };
                    // m ∈ (0, 1]: the product stays in [0, 255]; +0.5 then truncation rounds.
                    base.map(|v| (f64::from(v) * m + 0.5) as u8)
                }
            };
            out[4 * i..4 * i + 4].copy_from_slice(&[rgb[0], rgb[1], rgb[2], 255]);
        }
    }

    /// Brightness multiplier in (0, 1] from modulus and phase lines at column slot `c`.
    fn shade(&self, c: usize) -> f64 {
        let [up, mid, down] = &self.rows;
        let mut m = 1.0;
        if self.opts.modulus_lines {
            let q = |r: &RowData, k: usize| r.ln_abs[k] * self.modulus_scale;
            let t = q(mid, c);
            let gx = central(q(mid, c - 1), t, q(mid, c + 1));
            let gy = central(q(up, c), t, q(down, c));
            if let Some(g) = gradient(gx, gy) {
                let fade = fade(g);
                let frac = t - fast_floor(t);
                m *= 1.0 - MODULUS_RAMP_DEPTH * (1.0 - frac) * fade;
                m *= 1.0 - MODULUS_LINE_STRENGTH * coverage(t, g) * fade;
            }
        }
        if self.opts.phase_lines {
            let s = self.phase_scale;
            let a = mid.arg[c];
            let ok = |r: &RowData, k: usize| r.kind[k] == KIND_FINITE;
            let d = |r: &RowData, k: usize, forward: bool| -> f64 {
                if !ok(r, k) {
                    return f64::NAN;
                }
                let diff = if forward { r.arg[k] - a } else { a - r.arg[k] };
                wrap_pi(diff) * s
            };
            let gx = central_steps(d(mid, c - 1, false), d(mid, c + 1, true));
            let gy = central_steps(d(up, c, false), d(down, c, true));
            if let Some(g) = gradient(gx, gy) {
                m *= 1.0 - PHASE_LINE_STRENGTH * coverage(a * s, g) * fade(g);
            }
        }
        m
    }
}

/// 1/w without overflow for tiny |w|; w = 0 maps to +∞ + 0i.
fn reciprocal(x: f64, y: f64) -> C {
    let s = x.abs().max(y.abs());
    if s == 0.0 {
        return C::new(f64::INFINITY, 0.0);
    }
    let (xs, ys) = (x / s, y / s);
    let d = s * (xs * xs + ys * ys);
    C::new(xs / d, -ys / d)
}

/// Kind, argument and ln|f| of one value, never NaN for finite nonzero f.
#[inline]
fn classify(f: C) -> (u8, f64, f64) {
    let (re, im) = (f.re, f.im);
    if re.is_nan() || im.is_nan() {
        (KIND_NO_VALUE, 0.0, f64::NAN)
    } else if re.is_infinite() || im.is_infinite() {
        (KIND_POLE, 0.0, f64::INFINITY)
    } else if re == 0.0 && im == 0.0 {
        (KIND_ZERO, 0.0, f64::NEG_INFINITY)
    } else {
        let (a, b) = (re.abs(), im.abs());
        let hi = a.max(b);
        let ln_abs = if (1e-150..=1e150).contains(&hi) {
            // Fast path: the squares neither overflow nor underflow.
            0.5 * (re * re + im * im).ln()
        } else {
            let r = a.min(b) / hi;
            hi.ln() + 0.5 * (r * r).ln_1p()
        };
        (KIND_FINITE, im.atan2(re), ln_abs)
    }
}

/// floor() without a libm call (exact for |q| < 2^52; larger values are integers).
#[inline]
fn fast_floor(q: f64) -> f64 {
    if q.abs() >= 4_503_599_627_370_496.0 || q.is_nan() {
        return q;
    }
    let t = q as i64 as f64;
    if t > q {
        t - 1.0
    } else {
        t
    }
}

/// Wraps a phase difference into [−π, π].
#[inline]
fn wrap_pi(d: f64) -> f64 {
    if d > PI {
        d - 2.0 * PI
    } else if d < -PI {
        d + 2.0 * PI
    } else {
        d
    }
}

/// Derivative per pixel from values left/centre/right: central difference
/// when both neighbours are finite, one-sided otherwise, `None` if neither.
#[inline]
fn central(left: f64, centre: f64, right: f64) -> Option<f64> {
    central_steps(centre - left, right - centre)
}

/// Same as [`central`] from the two one-pixel steps (NaN/∞ = unavailable).
#[inline]
fn central_steps(back: f64, fwd: f64) -> Option<f64> {
    match (back.is_finite(), fwd.is_finite()) {
        (true, true) => Some(0.5 * (back + fwd)),
        (true, false) => Some(back),
        (false, true) => Some(fwd),
        (false, false) => None,
    }
}

/// Gradient magnitude (level units per pixel) if usable.
#[inline]
fn gradient(gx: Option<f64>, gy: Option<f64>) -> Option<f64> {
    let g = match (gx, gy) {
        // Plain sqrt: an overflow to ∞ only means "levels far too dense".
        (Some(a), Some(b)) => (a * a + b * b).sqrt(),
        (Some(a), None) | (None, Some(a)) => a.abs(),
        (None, None) => return None,
    };
    (g.is_finite() && g > 1e-300).then_some(g)
}

/// Line coverage in [0, 1] at level coordinate `q` with gradient `g` per pixel.
#[inline]
fn coverage(q: f64, g: f64) -> f64 {
    if !q.is_finite() {
        return 0.0;
    }
    let dist_px = (q - fast_floor(q + 0.5)).abs() / g;
    (0.5 * LINE_WIDTH_PX + 0.5 - dist_px).clamp(0.0, 1.0)
}

/// 0 where levels are closer than `FADE_START_PX`, 1 beyond `FADE_END_PX`.
#[inline]
fn fade(g: f64) -> f64 {
    let spacing = 1.0 / g;
    let t = ((spacing - FADE_START_PX) / (FADE_END_PX - FADE_START_PX)).clamp(0.0, 1.0);
    t * t * (3.0 - 2.0 * t)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plot::colour_wheel::{OKLCH_CHROMA, OKLCH_HUE_AT_ARG_ZERO, OKLCH_LIGHTNESS};
    use crate::plot::oklab::{oklab_to_oklch, srgb_to_oklab};
    use crate::reference::assert_close;

    /// f(z) = (z² − 1)/(z − 2i): invented, zeros at ±1, a pole at 2i.
    fn f(z: C) -> C {
        (z * z - 1.0) / (z - C::new(0.0, 2.0))
    }

    fn plain() -> PlotOptions {
        PlotOptions { modulus_lines: false, phase_lines: false, ..PlotOptions::default() }
    }

    /// Slow reference: each pixel's centre written from the documented
    /// convention, arg f by atan2 of f evaluated there directly, and the hue
    /// read back from the pixel's own bytes (sRGB → OKLab → OKLCH hue).
    #[test]
    fn pixel_hue_is_arg_f_at_the_pixel_centre() {
        let (w, h) = (37u32, 23u32);
        let view = View { x0: -2.3, x1: 2.1, y0: -1.7, y1: 2.9 };
        let mut out = vec![0u8; (w * h * 4) as usize];
        let mut eval = |zs: &[C], fs: &mut [C]| {
            for (z, v) in zs.iter().zip(fs.iter_mut()) {
                *v = f(*z);
            }
        };
        render(&mut eval, view, w, h, &plain(), &mut out).unwrap();
        for j in 0..h {
            for i in 0..w {
                let z = C::new(
                    view.x0 + (f64::from(i) + 0.5) * (view.x1 - view.x0) / f64::from(w),
                    view.y1 - (f64::from(j) + 0.5) * (view.y1 - view.y0) / f64::from(h),
                );
                let v = f(z);
                let arg = v.im.atan2(v.re);
                let p = 4 * (j * w + i) as usize;
                let rgb = [out[p], out[p + 1], out[p + 2]].map(|b| f64::from(b) / 255.0);
                let lch = oklab_to_oklch(srgb_to_oklab(rgb));
                let what = format!("pixel ({i}, {j}) at z = {z}");
                // Byte rounding moves the hue by ~0.02 rad at chroma 0.12; the
                // 1024-entry table by at most π/1024.
                assert_close(
                    C::from_polar(1.0, lch[2]),
                    C::from_polar(1.0, OKLCH_HUE_AT_ARG_ZERO + arg),
                    0.05,
                    &what,
                );
                assert_close(C::new(lch[0], lch[1]), C::new(OKLCH_LIGHTNESS, OKLCH_CHROMA), 0.01, &what);
                assert_eq!(out[p + 3], 255, "{what}: opaque");
            }
        }
    }

    /// Slow reference for the view at infinity: the pixel at w shows f(1/w),
    /// computed directly; and lines only darken (never change the hue).
    #[test]
    fn infinity_view_and_lines_keep_the_hue_of_f_at_one_over_w() {
        let (w, h) = (16u32, 12u32);
        let view = View { x0: -0.9, x1: 0.7, y0: -0.55, y1: 0.65 };
        let opts = PlotOptions { infinity_view: true, ..PlotOptions::default() };
        let mut out = vec![0u8; (w * h * 4) as usize];
        let mut eval = |zs: &[C], fs: &mut [C]| {
            for (z, v) in zs.iter().zip(fs.iter_mut()) {
                *v = f(*z);
            }
        };
        render(&mut eval, view, w, h, &opts, &mut out).unwrap();
        for j in 0..h {
            for i in 0..w {
                let wz = C::new(
                    view.x0 + (f64::from(i) + 0.5) * (view.x1 - view.x0) / f64::from(w),
                    view.y1 - (f64::from(j) + 0.5) * (view.y1 - view.y0) / f64::from(h),
                );
                let v = f(C::new(1.0, 0.0) / wz);
                let p = 4 * (j * w + i) as usize;
                let rgb = [out[p], out[p + 1], out[p + 2]].map(|b| f64::from(b) / 255.0);
                let lch = oklab_to_oklch(srgb_to_oklab(rgb));
                // Darkening by ≤ 45 % scales the linear light, which keeps the
                // OKLab hue only approximately (the sRGB curve is not linear).
                assert_close(
                    C::from_polar(1.0, lch[2]),
                    C::from_polar(1.0, OKLCH_HUE_AT_ARG_ZERO + v.arg()),
                    0.2,
                    &format!("pixel ({i}, {j}) at w = {wz}"),
                );
            }
        }
    }
}

//! Colour-wheel legend: a ring image showing which colour stands for which
//! argument, so the page need not recompute the wheel.
//!
//! Method: the ring is the phase plot of f(w) = w on the unit annulus
//! 0.55 ≤ |w| ≤ 1 (arg 0 to the right, arg π/2 at the top, counter-clockwise),
//! coloured through the same lookup table as the renderer, with an
//! anti-aliased alpha edge (coverage from the signed distance to the circles).
//!
//! ```
//! use residuary::plot::colour_wheel::{colour, Wheel};
//! use residuary::plot::legend::legend_ring;
//! let n = 64;
//! let img = legend_ring(n, Wheel::Oklch).unwrap();
//! let px = |i: u32, j: u32| img[(4 * (j * n + i)) as usize..(4 * (j * n + i) + 4) as usize].to_vec();
//! // The centre is outside the ring (|w| < 0.55): transparent.
//! assert_eq!(px(32, 32)[3], 0);
//! // Pixel (60, 32) has centre w ≈ (28.5, −0.5)/31.5, arg ≈ −0.0175 (atan2):
//! // inside the ring, opaque, coloured for that argument.
//! let p = px(60, 32);
//! assert_eq!(p[3], 255);
//! assert_eq!(p[..3], colour(Wheel::Oklch, (-0.5f64).atan2(28.5)));
//! ```

use super::colour_wheel::{colour, Wheel};
use crate::error::Failure;

/// Largest legend side in pixels.
pub const MAX_LEGEND_SIZE: u32 = 1024;
/// Inner radius of the ring as a fraction of the outer radius.
pub const RING_INNER: f64 = 0.55;

/// RGBA8 image, `size × size`, row 0 at the top, of the colour ring;
/// transparent outside the ring.
pub fn legend_ring(size: u32, wheel: Wheel) -> Result<Vec<u8>, Failure> {
    if !(8..=MAX_LEGEND_SIZE).contains(&size) {
        return Err(Failure::invalid(format!(
            "legend size {size} is not allowed: choose 8..={MAX_LEGEND_SIZE} pixels"
        )));
    }
    let n = size as usize;
    let half = f64::from(size) / 2.0;
    let outer = half - 0.5;
    let inner = outer * RING_INNER;
    let mut out = vec![0u8; n * n * 4];
    for j in 0..n {
        let y = half - (j as f64 + 0.5);
        for i in 0..n {
            let x = (i as f64 + 0.5) - half;
            let r = x.hypot(y);
            let cov = (outer + 0.5 - r).clamp(0.0, 1.0) * (r - inner + 0.5).clamp(0.0, 1.0);
            if cov <= 0.0 {
                continue;
            }
            let rgb = colour(wheel, y.atan2(x));
            let p = 4 * (j * n + i);
            out[p..p + 3].copy_from_slice(&rgb);
            out[p + 3] = (cov * 255.0).round() as u8;
        }
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plot::colour_wheel::OKLCH_HUE_AT_ARG_ZERO;
    use crate::plot::oklab::{oklab_to_oklch, srgb_to_oklab};
    use crate::reference::assert_close;
    use crate::C;

    /// Slow reference: each pixel centre (y up, origin at the image centre),
    /// its radius and argument by hypot/atan2; well inside the ring the pixel
    /// must be opaque with OKLCH hue 55° + arg (read back from its bytes), well
    /// outside it transparent.
    #[test]
    fn ring_pixels_show_their_own_argument() {
        let n = 48u32;
        let img = legend_ring(n, Wheel::Oklch).unwrap();
        let c = f64::from(n) / 2.0;
        let (outer, inner) = (c - 0.5, (c - 0.5) * RING_INNER);
        for j in 0..n {
            for i in 0..n {
                let (x, y) = (f64::from(i) + 0.5 - c, c - f64::from(j) - 0.5);
                let r = x.hypot(y);
                let p = (4 * (j * n + i)) as usize;
                let what = format!("pixel ({i}, {j})");
                if r > outer + 1.0 || r < inner - 1.0 {
                    assert_eq!(img[p + 3], 0, "{what}: outside the ring");
                } else if r < outer - 1.0 && r > inner + 1.0 {
                    assert_eq!(img[p + 3], 255, "{what}: inside the ring");
                    let rgb = [img[p], img[p + 1], img[p + 2]].map(|b| f64::from(b) / 255.0);
                    let hue = oklab_to_oklch(srgb_to_oklab(rgb))[2];
                    // Byte rounding at chroma 0.12 moves the hue by ~0.02 rad.
                    assert_close(
                        C::from_polar(1.0, hue),
                        C::from_polar(1.0, OKLCH_HUE_AT_ARG_ZERO + y.atan2(x)),
                        0.05,
                        &what,
                    );
                }
            }
        }
        assert!(legend_ring(7, Wheel::Oklch).is_err());
    }
}

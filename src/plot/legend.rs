//! Colour-wheel legend: a ring image showing which colour stands for which
//! argument, so the page need not recompute the wheel.
//!
//! Method: the ring is the phase plot of f(w) = w on the unit annulus
//! 0.55 ≤ |w| ≤ 1 (arg 0 to the right, arg π/2 at the top, counter-clockwise),
//! coloured through the same lookup table as the renderer, with an
//! anti-aliased alpha edge (coverage from the signed distance to the circles).

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

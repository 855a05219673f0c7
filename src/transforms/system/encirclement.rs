//! The encirclement count of the Nyquist contour's image.
//!
//! Method: the argument principle (common practice; Nyquist's criterion, e.g.
//! Ogata, from memory). For L = num/den and a point a, L − a = (num − a·den)/den.
//! Continuous: the contour runs up the imaginary axis, around each
//! imaginary-axis pole of L by a small semicircle to its right, and back by the
//! large semicircle (clockwise about the right half-plane); the image of L
//! encircles a clockwise N = Z − P times, Z the zeros of L − a and P the poles
//! of L in the open right half-plane. Discrete: the unit circle, traversed as ω
//! runs from −π/T to π/T, indented outward around poles on it; N = P_in − Z_in
//! (the counterclockwise winding of the image is Z_in − P_in inside the disc),
//! which is Z − P with Z, P counted outside the unit circle when L − a and L
//! have as many finite poles as zeros. The roots are the exact roots of the
//! rational analysis; the count is cross-checked by the winding of the image
//! sampled along the contour by `contour_image::walk` (the same points the
//! image is drawn from). A zero of L − a on the contour (the image passes
//! through a) has no count: `None`.
//!
//! ```
//! use residuary::transforms::system::{encirclement::count, Domain};
//! use residuary::C;
//! // L = 2(s + 1)/(s(s − 1)): 1 + L has the roots of s² + s + 2 (left half-plane),
//! // L one pole at s = 1: P = 1, Z = 0, N = −1 (quadratic formula; by hand).
//! let re = |x: f64| C::new(x, 0.0);
//! let e = count(&[re(2.0), re(2.0)], &[re(0.0), re(-1.0), re(1.0)], re(-1.0), Domain::S, 10_000_000).unwrap();
//! assert_eq!((e.open_loop_unstable, e.closed_loop_unstable, e.winding), (1, 0, Some(-1)));
//! assert_eq!(e.sampled_winding, Some(-1));
//! ```

use super::Domain;
use crate::error::Failure;
use super::contour_image::{walk_capped, Segment, Tolerance};
use crate::poly::{add, scale};
use crate::singular::rational_poles::analyse_rational;
use crate::C;

/// Most points of the drawn image.
pub const IMAGE_POINTS: usize = 6000;

/// The count and its parts.
#[derive(Debug, Clone, PartialEq)]
pub struct Encirclement {
    /// N, clockwise encirclements of the point as ω increases; `None` when the image passes through it.
    pub winding: Option<i32>,
    /// P: poles of L in the right half-plane (outside the unit circle in z).
    pub open_loop_unstable: u32,
    /// Z: zeros of L − a there.
    pub closed_loop_unstable: u32,
    /// Zeros of L − a on the contour (imaginary axis or unit circle).
    pub on_contour: u32,
    /// N from the sampled image, when the sampling resolved it.
    pub sampled_winding: Option<i32>,
    /// The image of L along the contour, in contour order (at most about [`IMAGE_POINTS`] points).
    pub image: Vec<Segment>,
    /// Evaluations of L the walk spent.
    pub evaluations: u64,
}

/// Where a root lies relative to the contour: +1 unstable side, 0 on it, −1 stable side.
fn side(q: C, domain: Domain, tol: f64) -> i32 {
    let d = match domain {
        Domain::S => q.re,
        Domain::Z { .. } => q.norm() - 1.0,
    };
    if d > tol {
        1
    } else if d < -tol {
        -1
    } else {
        0
    }
}

/// N, P and Z for L = num/den about `point`, and the image; the walk spends at most `limit` evaluations.
pub fn count(num: &[C], den: &[C], point: C, domain: Domain, limit: u64) -> Result<Encirclement, Failure> {
    let shifted = add(num, &scale(den, -point));
    let open = analyse_rational(num, den)?;
    let closed = analyse_rational(&shifted, den)?;
    let scale_of = |zs: &mut dyn Iterator<Item = C>| zs.map(|z| z.norm()).fold(1.0, f64::max);
    let tol_open = 1e-9 * scale_of(&mut open.poles.iter().map(|p| p.at));
    let tol_closed = 1e-9 * scale_of(&mut closed.zeros.iter().map(|z| z.at));
    let tally = |roots: &mut dyn Iterator<Item = (C, u32, f64)>, tol: f64, want: i32| -> u32 {
        roots.filter(|&(q, _, e)| side(q, domain, tol + 4.0 * e) == want).map(|r| r.1).sum()
    };
    let poles = || open.poles.iter().map(|p| (p.at, p.order, p.location_error));
    let zeros = || closed.zeros.iter().map(|z| (z.at, z.order, z.location_error));
    let p_out = tally(&mut poles(), tol_open, 1);
    let z_out = tally(&mut zeros(), tol_closed, 1);
    let on_contour = tally(&mut zeros(), tol_closed, 0);
    let winding = (on_contour == 0).then(|| match domain {
        Domain::S => z_out as i32 - p_out as i32,
        Domain::Z { .. } => {
            let p_in = open.poles.iter().filter(|p| side(p.at, domain, tol_open + 4.0 * p.location_error) <= 0).map(|p| p.order).sum::<u32>();
            let z_in = tally(&mut zeros(), tol_closed, -1);
            p_in as i32 - z_in as i32
        }
    });
    let axis_poles: Vec<C> =
        open.poles.iter().filter(|p| side(p.at, domain, tol_open + 4.0 * p.location_error) == 0).map(|p| p.at).collect();
    let all_roots: Vec<C> = open.poles.iter().map(|p| p.at).chain(closed.zeros.iter().map(|z| z.at)).collect();
    let w = walk_capped(num, den, point, &axis_poles, &all_roots, domain, Tolerance::DRAW, limit, IMAGE_POINTS)?;
    // s: the contour is clockwise, so N = −(counterclockwise turns of the image); z: the
    // circle runs counterclockwise, and N is the clockwise count, also −ccw.
    let sampled_winding = if on_contour == 0 { w.counterclockwise_turns.map(|n| -n) } else { None };
    Ok(Encirclement {
        winding,
        open_loop_unstable: p_out,
        closed_loop_unstable: z_out,
        on_contour,
        sampled_winding,
        image: w.segments,
        evaluations: w.evaluations,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::sampled_winding;

    fn re(x: f64) -> C {
        C::new(x, 0.0)
    }

    #[test]
    fn the_count_agrees_with_a_dense_polyline_winding() {
        // L = K/((s+1)(s+2)(s+3)): closed loop s³ + 6s² + 11s + 6 + K, stable for K < 60 (Routh, from
        // memory): K = 10 gives N = 0, K = 100 gives N = 2. The reference: the winding of the image of the
        // imaginary axis sampled densely (the large semicircle maps to L(∞) = 0, a point), taken
        // counterclockwise as ω increases, is −N (the contour is clockwise).
        let den = crate::poly::from_roots(re(1.0), &[re(-1.0), re(-2.0), re(-3.0)]);
        for (k, want) in [(10.0, 0), (100.0, 2)] {
            let num = [re(k)];
            let e = count(&num, &den, re(-1.0), Domain::S, 10_000_000).unwrap();
            let image: Vec<C> = (-200_000..=200_000)
                .map(|i| {
                    let w = (i as f64 / 1000.0).powi(3);
                    let s = C::new(0.0, w);
                    crate::poly::eval(&num, s) / crate::poly::eval(&den, s)
                })
                .collect();
            assert_eq!(-sampled_winding(&image, re(-1.0)), want, "K = {k}: dense polyline");
            assert_eq!(e.winding, Some(want), "K = {k}");
            assert_eq!(e.sampled_winding, Some(want), "K = {k}");
            assert_eq!(e.closed_loop_unstable as i32, want, "K = {k}: Z = N + P with P = 0");
        }
    }

    #[test]
    fn a_pole_on_the_unit_circle_is_indented_outward() {
        // L = 0.5/(z − 1): 1 + L ∝ z − 0.5, inside; the pole at 1 counts as inside (indented outward),
        // so N = P_in − Z_in = 1 − 1 = 0 (by hand); a gain 3 moves the root to −2: N = 1 − 0 = 1.
        for (k, want) in [(0.5, 0), (3.0, 1)] {
            let e = count(&[re(k)], &[re(-1.0), re(1.0)], re(-1.0), Domain::Z { period: 1.0 }, 10_000_000).unwrap();
            assert_eq!((e.winding, e.sampled_winding), (Some(want), Some(want)), "gain {k}");
        }
    }
}

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
//! sampled along the contour (2048 steps a piece, the axis spaced as
//! ω = c sinh(u), each step halved until it turns by less than 0.3 rad and its
//! halves agree). A zero of L − a on the contour (the image passes through a) has no
//! count: `None`.
//!
//! ```
//! use residuary::transforms::system::{encirclement::count, Domain};
//! use residuary::C;
//! // L = 2(s + 1)/(s(s − 1)): 1 + L has the roots of s² + s + 2 (left half-plane),
//! // L one pole at s = 1: P = 1, Z = 0, N = −1 (quadratic formula; by hand).
//! let re = |x: f64| C::new(x, 0.0);
//! let e = count(&[re(2.0), re(2.0)], &[re(0.0), re(-1.0), re(1.0)], re(-1.0), Domain::S).unwrap();
//! assert_eq!((e.open_loop_unstable, e.closed_loop_unstable, e.winding), (1, 0, Some(-1)));
//! assert_eq!(e.sampled_winding, Some(-1));
//! ```

use super::Domain;
use crate::error::Failure;
use crate::poly::{add, eval, scale};
use crate::singular::rational_poles::analyse_rational;
use crate::C;
use std::f64::consts::PI;

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

/// N, P and Z for L = num/den about `point`.
pub fn count(num: &[C], den: &[C], point: C, domain: Domain) -> Result<Encirclement, Failure> {
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
    let g = |s: C| eval(&shifted, s) / eval(den, s);
    let sampled_winding = if on_contour == 0 { sampled(&g, &axis_poles, &all_roots, domain) } else { None };
    Ok(Encirclement { winding, open_loop_unstable: p_out, closed_loop_unstable: z_out, on_contour, sampled_winding })
}

/// One piece of the contour: a straight segment or a circular arc.
#[derive(Clone, Copy)]
enum Piece {
    /// The imaginary axis from y0 to y1, spaced as ω = c sinh(u) (dense near 0, sparse far out).
    Line(f64, f64, f64),
    /// centre, radius, angle from, angle to.
    Arc(C, f64, f64, f64),
}

impl Piece {
    fn at(self, t: f64) -> C {
        match self {
            Piece::Line(y0, y1, c) => {
                let (u0, u1) = ((y0 / c).asinh(), (y1 / c).asinh());
                C::new(0.0, c * (u0 + (u1 - u0) * t).sinh())
            }
            Piece::Arc(c, r, a, b) => c + C::from_polar(r, a + (b - a) * t),
        }
    }
}

/// The turn of g along a piece between parameters t0 and t1: the principal step, accepted when it
/// is below 0.3 rad and the two halves agree with it, else the sum over the halves (depth ≤ 40).
fn turn(g: &dyn Fn(C) -> C, piece: Piece, t0: f64, t1: f64, g0: C, g1: C, depth: u32) -> Option<f64> {
    let step = (g1 / g0).arg();
    let tm = 0.5 * (t0 + t1);
    let gm = g(piece.at(tm));
    let (a, b) = ((gm / g0).arg(), (g1 / gm).arg());
    if !(step.is_finite() && a.is_finite() && b.is_finite()) {
        return None;
    }
    if step.abs() < 0.3 && (a + b - step).abs() < 1e-6 {
        return Some(step);
    }
    if depth == 0 {
        return None;
    }
    Some(turn(g, piece, t0, tm, g0, gm, depth - 1)? + turn(g, piece, tm, t1, gm, g1, depth - 1)?)
}

/// The clockwise count N from the sampled image of g = L − a along the contour.
fn sampled(g: &dyn Fn(C) -> C, axis_poles: &[C], roots: &[C], domain: Domain) -> Option<i32> {
    // Indentation radius: well inside the gaps between roots; large radius well outside them all.
    let mut gap = f64::INFINITY;
    for &p in axis_poles {
        for &q in roots {
            let d = (p - q).norm();
            if d > 0.0 {
                gap = gap.min(d);
            }
        }
    }
    let size = roots.iter().map(|q| q.norm()).fold(1.0, f64::max);
    let smallest = roots.iter().map(|q| q.norm()).filter(|&r| r > 0.0).fold(f64::INFINITY, f64::min);
    // The axis spacing scale: a tenth of the smallest nonzero root size.
    let c = if smallest.is_finite() { smallest / 10.0 } else { 0.1 };
    let eps = if gap.is_finite() { gap * 1e-3 } else { 1e-3 * size }.min(1e-3);
    let mut pieces = Vec::new();
    match domain {
        Domain::S => {
            let big = 1e3 * size;
            let mut ys: Vec<f64> = axis_poles.iter().map(|p| p.im).collect();
            ys.sort_by(f64::total_cmp);
            let mut y = -big;
            for &yp in &ys {
                pieces.push(Piece::Line(y, yp - eps, c));
                // To the right of the pole: from below, counterclockwise through Re > 0.
                pieces.push(Piece::Arc(C::new(0.0, yp), eps, -PI / 2.0, PI / 2.0));
                y = yp + eps;
            }
            pieces.push(Piece::Line(y, big, c));
            pieces.push(Piece::Arc(C::new(0.0, 0.0), big, PI / 2.0, -PI / 2.0));
        }
        Domain::Z { .. } => {
            let mut angles: Vec<f64> = axis_poles.iter().map(|p| p.arg()).collect();
            angles.sort_by(f64::total_cmp);
            let mut a = -PI;
            for &ap in &angles {
                // Around the pole outside the circle (through the outward direction).
                pieces.push(Piece::Arc(C::new(0.0, 0.0), 1.0, a, ap - eps));
                let centre = C::from_polar(1.0, ap);
                let from = (C::from_polar(1.0, ap - eps) - centre).arg();
                let to = (C::from_polar(1.0, ap + eps) - centre).arg();
                let to = from + (to - from).rem_euclid(2.0 * PI);
                pieces.push(Piece::Arc(centre, eps, from, to));
                a = ap + eps;
            }
            pieces.push(Piece::Arc(C::new(0.0, 0.0), 1.0, a, PI));
        }
    }
    let mut total = 0.0;
    for piece in pieces {
        let n = 2048;
        let mut prev = g(piece.at(0.0));
        for k in 1..=n {
            let t0 = (k - 1) as f64 / n as f64;
            let t1 = k as f64 / n as f64;
            let next = g(piece.at(t1));
            total += turn(g, piece, t0, t1, prev, next, 40)?;
            prev = next;
        }
    }
    let ccw = total / (2.0 * PI);
    let rounded = ccw.round();
    if (ccw - rounded).abs() > 0.1 {
        return None;
    }
    // s: the contour is clockwise, so N = −(counterclockwise turns of the image); z: the
    // circle runs counterclockwise, and N is the clockwise count, also −ccw.
    Some(-(rounded as i32))
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
            let e = count(&num, &den, re(-1.0), Domain::S).unwrap();
            let image: Vec<C> = (-200_000..=200_000)
                .map(|i| {
                    let w = (i as f64 / 1000.0).powi(3);
                    let s = C::new(0.0, w);
                    eval(&num, s) / eval(&den, s)
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
            let e = count(&[re(k)], &[re(-1.0), re(1.0)], re(-1.0), Domain::Z { period: 1.0 }).unwrap();
            assert_eq!((e.winding, e.sampled_winding), (Some(want), Some(want)), "gain {k}");
        }
    }
}

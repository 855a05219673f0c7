//! The image of the indented Nyquist contour under L = num/den, sampled
//! adaptively: the one walk that both the sampled encirclement count and the
//! drawn image use.
//!
//! Method: the contour (continuous: the imaginary axis from −R to R indented by
//! small semicircles to the right of imaginary-axis poles, closed by the large
//! semicircle of radius R clockwise about the right half-plane; discrete: the
//! unit circle from angle −π to π, indented outward around poles on it) is cut
//! into pieces; the axis is parametrised as ω = c sinh(u) (dense near 0, sparse
//! far out), arcs by their angle. Each piece starts from a uniform grid of
//! [`START`] steps in its parameter, and a step is halved (adaptive
//! bisection, common practice) until the image turns about the counted point a
//! by less than 0.3 rad with its two halves agreeing (so the sum of principal
//! turns is the winding number, the argument principle — e.g. Ahlfors, from
//! memory), and, for drawing, the image turns about 0 by at most `turn_deg`
//! and changes modulus by at most the factor `ratio` where both ends are
//! finite and nonzero. Steps stop halving at depth [`DEPTH`]; a step that then
//! still fails the count condition leaves the count unresolved (`None`).
//!
//! ```
//! use residuary::transforms::system::{contour_image::{walk, Kind, Tolerance}, Domain};
//! use residuary::C;
//! // L = 1/(s + 1): the image of the imaginary axis is the circle |L − 1/2| = 1/2 (by hand), which
//! // does not surround −1: winding 0; the closing arc (radius 1000) maps to |L| ≈ 1/1000.
//! let re = |x: f64| C::new(x, 0.0);
//! let w = walk(&[re(1.0)], &[re(1.0), re(1.0)], re(-1.0), &[], &[re(-1.0)], Domain::S, Tolerance::DRAW, 1_000_000)
//!     .unwrap();
//! assert_eq!(w.counterclockwise_turns, Some(0));
//! for seg in &w.segments {
//!     for v in &seg.value {
//!         match seg.kind {
//!             Kind::Axis => assert!(((v - C::new(0.5, 0.0)).norm() - 0.5).abs() < 1e-12),
//!             _ => assert!((v.norm() - 1e-3).abs() < 1.1e-6), // 1/1001 ≤ |L| ≤ 1/999
//!         }
//!     }
//! }
//! ```

use super::Domain;
use crate::budget::BudgetExceeded;
use crate::poly::eval;
use crate::C;
use std::f64::consts::PI;

/// Uniform steps a piece starts from.
pub const START: usize = 128;
/// Most halvings of one starting step.
pub const DEPTH: u32 = 24;
/// Count condition: the largest turn about the point accepted for one step (rad).
const COUNT_TURN: f64 = 0.3;

/// Drawing tolerances of the walk.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Tolerance {
    /// Largest turn of the image about 0 between consecutive points, degrees.
    pub turn_deg: f64,
    /// Largest modulus ratio between consecutive points (> 1).
    pub ratio: f64,
}

impl Tolerance {
    /// The drawing tolerance: 3° and 20 %.
    pub const DRAW: Tolerance = Tolerance { turn_deg: 3.0, ratio: 1.2 };
    /// Only the count condition.
    pub const COUNT: Tolerance = Tolerance { turn_deg: 180.0, ratio: f64::INFINITY };

    fn looser(self) -> Tolerance {
        Tolerance { turn_deg: self.turn_deg * 2.0, ratio: self.ratio * self.ratio }
    }
}

/// What a piece of the contour is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    /// Along the frequency axis (the imaginary axis, or the unit circle).
    Axis,
    /// A small detour around a pole on the axis.
    Indent,
    /// The large closing semicircle (continuous only).
    Closing,
}

/// One piece of the image.
#[derive(Debug, Clone, PartialEq)]
pub struct Segment {
    pub kind: Kind,
    /// The angular frequency ω (rad per unit time) of each point, `Axis` pieces only.
    pub omega: Option<Vec<f64>>,
    pub value: Vec<C>,
}

/// The sampled image and its winding about the point.
#[derive(Debug, Clone, PartialEq)]
pub struct Walk {
    pub segments: Vec<Segment>,
    /// Counterclockwise turns of the image about the point (None when not resolved).
    pub counterclockwise_turns: Option<i32>,
    /// Evaluations of L spent.
    pub evaluations: u64,
}

/// One piece of the contour: a straight segment or a circular arc.
#[derive(Clone, Copy)]
enum Piece {
    /// The imaginary axis from y0 to y1, spaced as ω = c sinh(u).
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

/// The contour's pieces with their kinds.
fn pieces(axis_poles: &[C], roots: &[C], domain: Domain) -> Vec<(Kind, Piece)> {
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
    let size = roots.iter().map(|q| q.norm()).filter(|r| r.is_finite()).fold(1.0, f64::max).min(1e300);
    let smallest = roots.iter().map(|q| q.norm()).filter(|&r| r > 0.0 && r.is_finite()).fold(f64::INFINITY, f64::min);
    let c = if smallest.is_finite() { (smallest / 10.0).max(1e-300) } else { 0.1 };
    let eps = if gap.is_finite() { gap * 1e-3 } else { 1e-3 * size }.min(1e-3);
    let mut out = Vec::new();
    match domain {
        Domain::S => {
            let big = (1e3 * size).min(1e305);
            let mut ys: Vec<f64> = axis_poles.iter().map(|p| p.im).collect();
            ys.sort_by(f64::total_cmp);
            let mut y = -big;
            for &yp in &ys {
                out.push((Kind::Axis, Piece::Line(y, yp - eps, c)));
                // To the right of the pole: from below, counterclockwise through Re > 0.
                out.push((Kind::Indent, Piece::Arc(C::new(0.0, yp), eps, -PI / 2.0, PI / 2.0)));
                y = yp + eps;
            }
            out.push((Kind::Axis, Piece::Line(y, big, c)));
            out.push((Kind::Closing, Piece::Arc(C::new(0.0, 0.0), big, PI / 2.0, -PI / 2.0)));
        }
        Domain::Z { .. } => {
            let mut angles: Vec<f64> = axis_poles.iter().map(|p| p.arg()).collect();
            angles.sort_by(f64::total_cmp);
            let mut a = -PI;
            for &ap in &angles {
                out.push((Kind::Axis, Piece::Arc(C::new(0.0, 0.0), 1.0, a, ap - eps)));
                // Around the pole outside the circle (through the outward direction).
                let centre = C::from_polar(1.0, ap);
                let from = (C::from_polar(1.0, ap - eps) - centre).arg();
                let to = (C::from_polar(1.0, ap + eps) - centre).arg();
                let to = from + (to - from).rem_euclid(2.0 * PI);
                out.push((Kind::Indent, Piece::Arc(centre, eps, from, to)));
                a = ap + eps;
            }
            out.push((Kind::Axis, Piece::Arc(C::new(0.0, 0.0), 1.0, a, PI)));
        }
    }
    out
}

struct Walker<'a> {
    num: &'a [C],
    den: &'a [C],
    about: C,
    tol: Tolerance,
    evaluations: u64,
    limit: u64,
    resolved: bool,
}

impl Walker<'_> {
    fn value(&mut self, s: C) -> Result<C, BudgetExceeded> {
        self.evaluations += 1;
        if self.evaluations > self.limit {
            return Err(BudgetExceeded { limit: self.limit });
        }
        Ok(eval(self.num, s) / eval(self.den, s))
    }

    fn fine(&self, f0: C, f1: C) -> bool {
        let finite = f0.is_finite() && f1.is_finite() && f0.norm() > 0.0 && f1.norm() > 0.0;
        if !finite {
            return true;
        }
        let turn = (f1 / f0).arg().abs().to_degrees();
        let ratio = f1.norm() / f0.norm();
        turn <= self.tol.turn_deg && ratio <= self.tol.ratio && 1.0 / ratio <= self.tol.ratio
    }

    /// Append the points after t0 up to t1 (f1 included); returns the turn about the point.
    #[allow(clippy::too_many_arguments)]
    fn step(
        &mut self,
        piece: Piece,
        t0: f64,
        t1: f64,
        f0: C,
        f1: C,
        depth: u32,
        out: &mut Vec<(f64, C)>,
    ) -> Result<f64, BudgetExceeded> {
        let a = self.about;
        let whole = ((f1 - a) / (f0 - a)).arg();
        let tm = 0.5 * (t0 + t1);
        let fm = self.value(piece.at(tm))?;
        let (h0, h1) = (((fm - a) / (f0 - a)).arg(), ((f1 - a) / (fm - a)).arg());
        let counted = whole.is_finite() && h0.is_finite() && h1.is_finite() && whole.abs() < COUNT_TURN
            && (h0 + h1 - whole).abs() < 1e-6;
        if counted && self.fine(f0, f1) && self.fine(f0, fm) && self.fine(fm, f1) {
            out.push((t1, f1));
            return Ok(whole);
        }
        if depth == 0 || tm == t0 || tm == t1 {
            if !counted {
                self.resolved = false;
            }
            out.push((tm, fm));
            out.push((t1, f1));
            return Ok(if h0.is_finite() && h1.is_finite() { h0 + h1 } else { 0.0 });
        }
        let left = self.step(piece, t0, tm, f0, fm, depth - 1, out)?;
        let right = self.step(piece, tm, t1, fm, f1, depth - 1, out)?;
        Ok(left + right)
    }
}

/// The image of the contour under num/den, with the winding about `about`.
///
/// `axis_poles` are the poles on the axis (indented), `roots` all poles and zeros that matter for
/// the scales. The walk is repeated with looser drawing tolerances until it has at most `cap`
/// points in all (then thinned if still over); the count is from the finest walk. Spends at most
/// `limit` evaluations.
#[allow(clippy::too_many_arguments)]
pub fn walk(
    num: &[C],
    den: &[C],
    about: C,
    axis_poles: &[C],
    roots: &[C],
    domain: Domain,
    tol: Tolerance,
    limit: u64,
) -> Result<Walk, BudgetExceeded> {
    walk_capped(num, den, about, axis_poles, roots, domain, tol, limit, usize::MAX)
}

/// [`walk`] with a cap on the points drawn.
#[allow(clippy::too_many_arguments)]
pub fn walk_capped(
    num: &[C],
    den: &[C],
    about: C,
    axis_poles: &[C],
    roots: &[C],
    domain: Domain,
    tol: Tolerance,
    limit: u64,
    cap: usize,
) -> Result<Walk, BudgetExceeded> {
    let parts = pieces(axis_poles, roots, domain);
    let mut tol = tol;
    let mut spent = 0u64;
    let mut turns = None;
    let mut attempt = 0;
    loop {
        let mut w = Walker { num, den, about, tol, evaluations: 0, limit: limit.saturating_sub(spent), resolved: true };
        let mut segments = Vec::new();
        let mut total = 0.0;
        for &(kind, piece) in &parts {
            let mut pts: Vec<(f64, C)> = Vec::new();
            let mut prev = w.value(piece.at(0.0))?;
            pts.push((0.0, prev));
            for k in 1..=START {
                let (t0, t1) = ((k - 1) as f64 / START as f64, k as f64 / START as f64);
                let next = w.value(piece.at(t1))?;
                total += w.step(piece, t0, t1, prev, next, DEPTH, &mut pts)?;
                prev = next;
            }
            let omega = (kind == Kind::Axis).then(|| {
                pts.iter()
                    .map(|&(t, _)| match (piece, domain) {
                        (Piece::Arc(_, _, a, b), Domain::Z { period }) => (a + (b - a) * t) / period,
                        (p, _) => p.at(t).im,
                    })
                    .collect()
            });
            segments.push(Segment { kind, omega, value: pts.into_iter().map(|p| p.1).collect() });
        }
        spent += w.evaluations;
        if attempt == 0 {
            let ccw = total / (2.0 * PI);
            turns = (w.resolved && (ccw - ccw.round()).abs() <= 0.1).then(|| ccw.round() as i32);
        }
        let points: usize = segments.iter().map(|s| s.value.len()).sum();
        if points <= cap || attempt == 3 {
            if points > cap {
                thin(&mut segments, cap);
            }
            return Ok(Walk { segments, counterclockwise_turns: turns, evaluations: spent });
        }
        tol = tol.looser();
        attempt += 1;
    }
}

/// Keep every k-th point of each segment (and its ends) so that about `cap` remain.
fn thin(segments: &mut [Segment], cap: usize) {
    let points: usize = segments.iter().map(|s| s.value.len()).sum();
    let k = points.div_ceil(cap.max(1)).max(1);
    for s in segments.iter_mut() {
        let n = s.value.len();
        let keep: Vec<usize> = (0..n).filter(|&i| i % k == 0 || i + 1 == n).collect();
        s.value = keep.iter().map(|&i| s.value[i]).collect();
        if let Some(w) = &mut s.omega {
            *w = keep.iter().map(|&i| w[i]).collect();
        }
    }
}

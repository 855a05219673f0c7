//! Closed contours: the shapes of the public contract and their geometry.
//!
//! A contour is a closed curve made of smooth pieces. Circles and ellipses are
//! one periodic piece (the trapezoidal rule converges exponentially on them);
//! rectangles and polygons are straight segments (use Gauss rules per piece).
//! Orientation follows the shape: circles and ellipses run counter-clockwise,
//! a rectangle runs counter-clockwise from its lower-left corner, a polygon
//! runs through its vertices in the order given. A half-disc (diameter, then
//! arc; `half_disc.rs`) and a keyhole (slit edges and two arcs; `keyhole.rs`)
//! run counter-clockwise about the region they bound.

pub mod covering;
pub mod half_disc;
pub mod keyhole;

pub use half_disc::Side;

use crate::C;
use crate::error::Failure;
use std::f64::consts::PI;

/// A closed contour (its wire form is `api::wire::ContourShape`, field for field).
#[derive(Debug, Clone, PartialEq)]
pub enum Contour {
    Circle { center: [f64; 2], radius: f64 },
    Ellipse {
        center: [f64; 2],
        semi_axes: [f64; 2],
        angle: f64,
    },
    Rectangle { corners: [[f64; 2]; 2] },
    Polygon { vertices: Vec<[f64; 2]> },
    /// The diameter through `center` and the half circle on the `direction` side.
    HalfDisc { center: [f64; 2], radius: f64, direction: Side },
    /// The annulus `inner` < |z − center| < `outer` minus the slit of half-width
    /// `gap` along the ray at `angle`.
    Keyhole { center: [f64; 2], inner: f64, outer: f64, angle: f64, gap: f64 },
}

/// One smooth piece of a contour, parametrised by t in [0, 1].
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Piece {
    /// z(t) = center + rot * (a cos 2πt + i b sin 2πt); closed and periodic.
    Ellipse { center: C, a: f64, b: f64, rot: C },
    /// z(t) = from + t (to - from).
    Segment { from: C, to: C },
    /// z(t) = center + radius e^{i(start + sweep t)}; a negative sweep runs clockwise.
    Arc { center: C, radius: f64, start: f64, sweep: f64 },
}

impl Piece {
    pub fn point(&self, t: f64) -> C {
        match *self {
            Piece::Ellipse { center, a, b, rot } => {
                let th = 2.0 * PI * t;
                center + rot * C::new(a * th.cos(), b * th.sin())
            }
            Piece::Segment { from, to } => from + (to - from) * t,
            Piece::Arc { center, radius, start, sweep } => center + C::from_polar(radius, start + sweep * t),
        }
    }

    /// dz/dt.
    pub fn derivative(&self, t: f64) -> C {
        match *self {
            Piece::Ellipse { a, b, rot, .. } => {
                let th = 2.0 * PI * t;
                rot * C::new(-a * th.sin(), b * th.cos()) * (2.0 * PI)
            }
            Piece::Segment { from, to } => to - from,
            Piece::Arc { radius, start, sweep, .. } => C::from_polar(radius * sweep, start + sweep * t) * C::new(0.0, 1.0),
        }
    }

    /// True for a piece whose integrand is periodic in t (trapezoidal rule is spectral).
    pub fn is_periodic(&self) -> bool {
        matches!(self, Piece::Ellipse { .. })
    }

    /// Length of the piece (an ellipse's by a 256-chord polyline, within 1e-4 relative).
    pub fn length(&self) -> f64 {
        match *self {
            Piece::Segment { from, to } => (to - from).norm(),
            Piece::Arc { radius, sweep, .. } => radius * sweep.abs(),
            Piece::Ellipse { .. } => (0..256).map(|k| (self.point((k + 1) as f64 / 256.0) - self.point(k as f64 / 256.0)).norm()).sum(),
        }
    }

    /// Distance from z to a segment or arc (`None` for an ellipse: see `Contour::distance_to_boundary`).
    fn distance(&self, z: C) -> Option<f64> {
        match *self {
            Piece::Segment { from, to } => {
                let d = to - from;
                let t = (((z - from) * d.conj()).re / d.norm_sqr()).clamp(0.0, 1.0);
                Some((from + d * t - z).norm())
            }
            Piece::Arc { center, radius, start, sweep } => {
                // The angle of z measured from the arc's start in the arc's own direction.
                let w = z - center;
                let phi = ((w * C::from_polar(1.0, -start)).arg() * sweep.signum()).rem_euclid(2.0 * PI);
                let ends = (self.point(0.0) - z).norm().min((self.point(1.0) - z).norm());
                Some(if phi <= sweep.abs() { (w.norm() - radius).abs().min(ends) } else { ends })
            }
            Piece::Ellipse { .. } => None,
        }
    }
}

fn c(p: [f64; 2]) -> C {
    C::new(p[0], p[1])
}

impl Contour {
    /// A circle, the commonest region.
    pub fn circle(center: C, radius: f64) -> Self {
        Contour::Circle { center: [center.re, center.im], radius }
    }

    /// A rectangle from two opposite corners.
    pub fn rectangle(a: C, b: C) -> Self {
        Contour::Rectangle { corners: [[a.re, a.im], [b.re, b.im]] }
    }

    /// Check that the shape is a usable closed curve; the message says how to fix it.
    pub fn validate(&self) -> Result<(), Failure> {
        let finite = |p: &[f64; 2]| p[0].is_finite() && p[1].is_finite();
        match self {
            Contour::Circle { center, radius } => {
                if !finite(center) {
                    return Err(Failure::invalid("the circle's center must be two finite numbers"));
                }
                if !(radius.is_finite() && *radius > 0.0) {
                    return Err(Failure::invalid(format!("the circle's radius must be a positive number, got {radius}")));
                }
            }
            Contour::Ellipse { center, semi_axes, angle } => {
                if !finite(center) || !angle.is_finite() {
                    return Err(Failure::invalid("the ellipse's center and angle must be finite numbers"));
                }
                if !(semi_axes.iter().all(|a| a.is_finite() && *a > 0.0)) {
                    return Err(Failure::invalid("the ellipse's semi_axes must be two positive numbers"));
                }
            }
            Contour::Rectangle { corners } => {
                if !corners.iter().all(finite) {
                    return Err(Failure::invalid("the rectangle's corners must be finite numbers"));
                }
                let [p, q] = corners;
                if p[0] == q[0] || p[1] == q[1] {
                    return Err(Failure::invalid("the rectangle has zero width or height; give two opposite corners"));
                }
            }
            Contour::Polygon { vertices } => {
                if vertices.len() < 3 {
                    return Err(Failure::invalid("a polygon needs at least 3 vertices"));
                }
                if !vertices.iter().all(finite) {
                    return Err(Failure::invalid("the polygon's vertices must be finite numbers"));
                }
                if self.signed_area().abs() == 0.0 {
                    return Err(Failure::invalid("the polygon encloses no area; check its vertices"));
                }
            }
            Contour::HalfDisc { center, radius, .. } => {
                if !finite(center) {
                    return Err(Failure::invalid("the half-disc's center must be two finite numbers"));
                }
                if !(radius.is_finite() && *radius > 0.0) {
                    return Err(Failure::invalid(format!("the half-disc's radius must be a positive number, got {radius}")));
                }
            }
            Contour::Keyhole { center, inner, outer, angle, gap } => {
                if !finite(center) || !angle.is_finite() {
                    return Err(Failure::invalid("the keyhole's center and angle must be finite numbers"));
                }
                if !(inner.is_finite() && outer.is_finite() && *inner > 0.0 && inner < outer) {
                    return Err(Failure::invalid(format!(
                        "the keyhole needs 0 < inner < outer, got inner {inner} and outer {outer}"
                    )));
                }
                if !(gap.is_finite() && *gap > 0.0 && gap < inner) {
                    return Err(Failure::invalid(format!(
                        "the keyhole's gap (the slit's half-width) must be positive and less than inner ({inner}), got {gap}"
                    )));
                }
            }
        }
        Ok(())
    }

    /// The smooth pieces, in order, joined end to end.
    pub fn pieces(&self) -> Vec<Piece> {
        match self {
            Contour::Circle { center, radius } => vec![Piece::Ellipse {
                center: c(*center),
                a: *radius,
                b: *radius,
                rot: C::new(1.0, 0.0),
            }],
            Contour::Ellipse { center, semi_axes, angle } => vec![Piece::Ellipse {
                center: c(*center),
                a: semi_axes[0],
                b: semi_axes[1],
                rot: C::from_polar(1.0, *angle),
            }],
            Contour::Rectangle { .. } | Contour::Polygon { .. } => {
                let v = self.vertices();
                (0..v.len())
                    .map(|k| Piece::Segment { from: v[k], to: v[(k + 1) % v.len()] })
                    .collect()
            }
            Contour::HalfDisc { center, radius, direction } => half_disc::pieces(c(*center), *radius, *direction),
            Contour::Keyhole { center, inner, outer, angle, gap } => {
                keyhole::pieces(c(*center), *inner, *outer, *angle, *gap)
            }
        }
    }

    /// Vertices of a rectangle (counter-clockwise from lower left) or polygon.
    /// Empty for curved shapes.
    pub fn vertices(&self) -> Vec<C> {
        match self {
            Contour::Rectangle { corners } => {
                let (x0, x1) = (corners[0][0].min(corners[1][0]), corners[0][0].max(corners[1][0]));
                let (y0, y1) = (corners[0][1].min(corners[1][1]), corners[0][1].max(corners[1][1]));
                vec![C::new(x0, y0), C::new(x1, y0), C::new(x1, y1), C::new(x0, y1)]
            }
            Contour::Polygon { vertices } => vertices.iter().map(|p| c(*p)).collect(),
            _ => Vec::new(),
        }
    }

    /// +1 for a counter-clockwise contour, −1 for a clockwise one.
    ///
    /// Circles, ellipses and rectangles run counter-clockwise (see the module
    /// doc); a polygon's orientation is the sign of its signed area by the
    /// shoelace formula, A = ½ Σ (x_k y_{k+1} − x_{k+1} y_k) (common practice).
    /// A self-intersecting polygon gets the sign of its net area.
    ///
    /// ```
    /// use residuary::contour::Contour;
    /// let clockwise = Contour::Polygon { vertices: vec![[0.0, 0.0], [0.0, 1.0], [1.0, 1.0], [1.0, 0.0]] };
    /// assert_eq!(clockwise.orientation(), -1);
    /// assert_eq!(Contour::Circle { center: [0.0, 0.0], radius: 1.0 }.orientation(), 1);
    /// ```
    pub fn orientation(&self) -> i32 {
        if self.signed_area() < 0.0 {
            -1
        } else {
            1
        }
    }

    /// The same curve run counter-clockwise: a region is a set, so tasks that
    /// search a region count its contents the same whichever way it was drawn.
    ///
    /// ```
    /// use residuary::contour::Contour;
    /// let clockwise = Contour::Polygon { vertices: vec![[0.0, 0.0], [0.0, 1.0], [1.0, 1.0], [1.0, 0.0]] };
    /// assert_eq!(clockwise.counter_clockwise().orientation(), 1);
    /// ```
    pub fn counter_clockwise(self) -> Contour {
        match self {
            Contour::Polygon { mut vertices } if self_area(&vertices) < 0.0 => {
                vertices.reverse();
                Contour::Polygon { vertices }
            }
            other => other,
        }
    }

    fn signed_area(&self) -> f64 {
        let v = self.vertices();
        let n = v.len();
        (0..n).map(|k| v[k].re * v[(k + 1) % n].im - v[(k + 1) % n].re * v[k].im).sum::<f64>() / 2.0
    }

    /// Winding number of the contour about `z`; `None` when z lies on the curve
    /// (within a relative tolerance of 1e-12 of the contour's size).
    pub fn winding_number(&self, z: C) -> Option<i32> {
        let tol = 1e-12 * self.size().max(f64::MIN_POSITIVE);
        if self.distance_to_boundary(z) <= tol {
            return None;
        }
        match self {
            Contour::Circle { .. } | Contour::Ellipse { .. } => {
                let w = self.to_unit_disk(z);
                Some(if w.norm() < 1.0 { 1 } else { 0 })
            }
            Contour::Rectangle { .. } | Contour::Polygon { .. } => {
                // Crossing-number winding rule (Sunday's form of the standard algorithm).
                let v = self.vertices();
                let n = v.len();
                let mut wn = 0;
                for k in 0..n {
                    let (a, b) = (v[k], v[(k + 1) % n]);
                    let cross = (b.re - a.re) * (z.im - a.im) - (z.re - a.re) * (b.im - a.im);
                    if a.im <= z.im {
                        if b.im > z.im && cross > 0.0 {
                            wn += 1;
                        }
                    } else if b.im <= z.im && cross < 0.0 {
                        wn -= 1;
                    }
                }
                Some(wn)
            }
            Contour::HalfDisc { center, radius, direction } => Some(half_disc::winding(c(*center), *radius, *direction, z)),
            Contour::Keyhole { center, inner, outer, angle, gap } => {
                Some(keyhole::winding(c(*center), *inner, *outer, *angle, *gap, z))
            }
        }
    }

    /// Map an ellipse/circle to the unit disk (|w| < 1 inside).
    fn to_unit_disk(&self, z: C) -> C {
        match self {
            Contour::Circle { center, radius } => (z - c(*center)) / *radius,
            Contour::Ellipse { center, semi_axes, angle } => {
                let w = (z - c(*center)) * C::from_polar(1.0, -*angle);
                C::new(w.re / semi_axes[0], w.im / semi_axes[1])
            }
            _ => z,
        }
    }

    /// Euclidean distance from z to the curve.
    pub fn distance_to_boundary(&self, z: C) -> f64 {
        match self {
            Contour::Circle { center, radius } => ((z - c(*center)).norm() - radius).abs(),
            Contour::Ellipse { .. } => {
                // Dense sampling refined by golden-section; exact enough for tolerances.
                let piece = self.pieces()[0];
                let n = 512;
                let mut best = (f64::INFINITY, 0.0);
                for k in 0..n {
                    let t = k as f64 / n as f64;
                    let d = (piece.point(t) - z).norm();
                    if d < best.0 {
                        best = (d, t);
                    }
                }
                let (mut lo, mut hi) = (best.1 - 1.0 / n as f64, best.1 + 1.0 / n as f64);
                for _ in 0..60 {
                    let m1 = lo + (hi - lo) * 0.381_966_011_250_105;
                    let m2 = hi - (hi - lo) * 0.381_966_011_250_105;
                    if (piece.point(m1) - z).norm() < (piece.point(m2) - z).norm() {
                        hi = m2;
                    } else {
                        lo = m1;
                    }
                }
                (piece.point(0.5 * (lo + hi)) - z).norm().min(best.0)
            }
            // Segments and arcs only (never an ellipse piece here).
            _ => self.pieces().iter().filter_map(|p| p.distance(z)).fold(f64::INFINITY, f64::min),
        }
    }

    /// Axis-aligned bounding box as (lower-left, upper-right).
    pub fn bounding_box(&self) -> (C, C) {
        match self {
            Contour::Circle { center, radius } => {
                let z = c(*center);
                (z - C::new(*radius, *radius), z + C::new(*radius, *radius))
            }
            Contour::Ellipse { center, semi_axes, angle } => {
                let (a, b, (s, co)) = (semi_axes[0], semi_axes[1], angle.sin_cos());
                let hx = ((a * co).powi(2) + (b * s).powi(2)).sqrt();
                let hy = ((a * s).powi(2) + (b * co).powi(2)).sqrt();
                let z = c(*center);
                (z - C::new(hx, hy), z + C::new(hx, hy))
            }
            Contour::HalfDisc { center, radius, direction } => half_disc::bounding_box(c(*center), *radius, *direction),
            // The outer circle's box (the slit takes at most `gap` off one side).
            Contour::Keyhole { center, outer, .. } => {
                let z = c(*center);
                (z - C::new(*outer, *outer), z + C::new(*outer, *outer))
            }
            Contour::Rectangle { .. } | Contour::Polygon { .. } => {
                let v = self.vertices();
                let lo = v.iter().fold(C::new(f64::INFINITY, f64::INFINITY), |m, p| {
                    C::new(m.re.min(p.re), m.im.min(p.im))
                });
                let hi = v.iter().fold(C::new(f64::NEG_INFINITY, f64::NEG_INFINITY), |m, p| {
                    C::new(m.re.max(p.re), m.im.max(p.im))
                });
                (lo, hi)
            }
        }
    }

    /// A length scale: the larger side of the bounding box.
    pub fn size(&self) -> f64 {
        let (lo, hi) = self.bounding_box();
        (hi.re - lo.re).max(hi.im - lo.im)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Slow reference: winding number by summing the change of arg(z(t) - p)
    /// along a fine sampling of the curve (common practice).
    fn winding_by_sampling(c: &Contour, p: C) -> i32 {
        let mut total = 0.0;
        for piece in c.pieces() {
            let n = 4000;
            for k in 0..n {
                let a = piece.point(k as f64 / n as f64) - p;
                let b = piece.point((k + 1) as f64 / n as f64) - p;
                total += (b / a).arg();
            }
        }
        (total / (2.0 * PI)).round() as i32
    }

    fn shapes() -> Vec<Contour> {
        vec![
            Contour::circle(C::new(0.5, -0.25), 1.5),
            Contour::Ellipse { center: [0.0, 1.0], semi_axes: [2.0, 0.5], angle: 0.7 },
            Contour::rectangle(C::new(1.0, 1.0), C::new(-1.0, -2.0)),
            Contour::Polygon { vertices: vec![[0.0, 0.0], [2.0, 0.0], [2.0, 2.0], [1.0, 0.5], [0.0, 2.0]] },
            Contour::Polygon { vertices: vec![[0.0, 0.0], [0.0, 1.0], [1.0, 1.0], [1.0, 0.0]] },
            Contour::HalfDisc { center: [0.2, 0.1], radius: 2.0, direction: Side::Upper },
            Contour::HalfDisc { center: [0.0, 0.0], radius: 1.5, direction: Side::Left },
            Contour::Keyhole { center: [0.0, 0.0], inner: 0.5, outer: 2.0, angle: 0.0, gap: 0.05 },
            Contour::Keyhole { center: [1.0, 0.5], inner: 0.3, outer: 1.8, angle: 2.0, gap: 0.1 },
        ]
    }

    #[test]
    fn winding_matches_sampled_argument_change() {
        let probes = [C::new(0.1, 0.2), C::new(1.5, 1.5), C::new(1.0, 1.2), C::new(-1.7, 0.9), C::new(3.0, 0.0), C::new(0.5, 0.5)];
        let (mut checked, mut nonzero) = (0, 0);
        for s in shapes() {
            s.validate().unwrap();
            for &p in &probes {
                if s.distance_to_boundary(p) > 1e-3 {
                    let want = winding_by_sampling(&s, p);
                    assert_eq!(s.winding_number(p), Some(want), "{s:?} at {p}");
                    checked += 1;
                    nonzero += (want != 0) as usize;
                }
            }
        }
        // The comparison really ran, inside and outside the shapes (not skipped).
        assert!(checked >= 25 && nonzero >= 5 && nonzero < checked, "{checked} / {nonzero}");
    }

    #[test]
    fn half_disc_and_keyhole_inside_tests_by_hand() {
        // Plane geometry by hand: the upper half-disc |z − 0.2 − 0.1i| < 2, Im z > 0.1;
        // the keyhole 0.5 < |z| < 2 minus the slit |Im z| < 0.05, Re z > 0.
        let s = shapes();
        let (hd, kh) = (&s[5], &s[7]);
        assert_eq!(hd.winding_number(C::new(1.0, 0.5)), Some(1));
        assert_eq!(hd.winding_number(C::new(1.0, 0.0)), Some(0), "below the diameter");
        assert_eq!(hd.winding_number(C::new(0.2, 2.2)), Some(0), "beyond the arc");
        assert_eq!(hd.winding_number(C::new(-1.0, 0.1)), None, "on the diameter");
        assert_eq!(kh.winding_number(C::new(1.0, 0.0)), Some(0), "in the slit");
        assert_eq!(kh.winding_number(C::new(1.0, 0.06)), Some(1), "just above the slit");
        assert_eq!(kh.winding_number(C::new(-1.0, 0.0)), Some(1), "opposite the slit");
        assert_eq!(kh.winding_number(C::new(0.1, 0.1)), Some(0), "in the inner disc");
        assert_eq!(kh.winding_number(C::new(1.0, 0.05)), None, "on the slit's edge");
        assert_eq!(kh.winding_number(C::new(0.0, -2.0)), None, "on the outer circle");
        // Distances by hand: 0.5 from (1, 0.5) to the diameter Im z = 0.1 is 0.4;
        // from 0 to the keyhole is the inner radius 0.5 (nearest the inner arc).
        assert!((hd.distance_to_boundary(C::new(1.0, 0.5)) - 0.4).abs() < 1e-14);
        assert!((kh.distance_to_boundary(C::new(0.0, 0.0)) - 0.5).abs() < 1e-14);
        // The box of the upper half-disc: [−1.8, 2.2] × [0.1, 2.1] (by hand).
        let (lo, hi) = hd.bounding_box();
        assert!((lo - C::new(-1.8, 0.1)).norm() < 1e-14 && (hi - C::new(2.2, 2.1)).norm() < 1e-14);
        // The pieces join end to end into a closed curve.
        for sh in [hd, kh, &s[6], &s[8]] {
            let p = sh.pieces();
            for k in 0..p.len() {
                assert!((p[k].point(1.0) - p[(k + 1) % p.len()].point(0.0)).norm() < 1e-12, "{sh:?} piece {k}");
            }
        }
    }

    #[test]
    fn keyhole_and_half_disc_need_sound_sizes() {
        let kh = |inner, outer, gap| Contour::Keyhole { center: [0.0, 0.0], inner, outer, angle: 0.0, gap }.validate();
        assert!(kh(1.0, 2.0, 0.01).is_ok());
        assert!(kh(2.0, 1.0, 0.01).unwrap_err().message().contains("inner < outer"));
        assert!(kh(1.0, 2.0, 1.0).unwrap_err().message().contains("gap"));
        assert!(kh(1.0, 2.0, 0.0).is_err());
        assert!(Contour::HalfDisc { center: [0.0, 0.0], radius: 0.0, direction: Side::Lower }.validate().is_err());
    }

    #[test]
    fn clockwise_polygon_winds_negatively() {
        // (0,0) → (0,1) → (1,1) → (1,0) runs clockwise around (0.5, 0.5): −1 (by hand)
        let s = &shapes()[4];
        assert_eq!(s.winding_number(C::new(0.5, 0.5)), Some(-1));
    }

    #[test]
    fn point_on_curve_has_no_winding_number() {
        assert_eq!(Contour::circle(C::new(0.0, 0.0), 2.0).winding_number(C::new(0.0, 2.0)), None);
        assert_eq!(Contour::rectangle(C::new(0.0, 0.0), C::new(1.0, 1.0)).winding_number(C::new(1.0, 0.5)), None);
    }

    #[test]
    fn derivative_matches_central_difference() {
        // Slow reference: central difference, error O(h²) ≈ 1e-12 (common practice).
        for s in shapes() {
            for p in s.pieces() {
                for &t in &[0.1, 0.37, 0.8] {
                    let h = 1e-6;
                    let fd = (p.point(t + h) - p.point(t - h)) / (2.0 * h);
                    assert!((fd - p.derivative(t)).norm() < 1e-6 * (1.0 + fd.norm()));
                }
            }
        }
    }

    #[test]
    fn bad_shapes_are_refused_with_advice() {
        assert!(Contour::circle(C::new(0.0, 0.0), -1.0).validate().unwrap_err().message().contains("positive"));
        assert!(Contour::Polygon { vertices: vec![[0.0, 0.0], [1.0, 1.0]] }.validate().is_err());
        assert!(Contour::rectangle(C::new(0.0, 0.0), C::new(0.0, 1.0)).validate().is_err());
    }

    #[test]
    fn orientation_is_the_winding_about_an_inside_point() {
        // For a simple closed curve the winding number about any inside point is
        // +1 counter-clockwise and −1 clockwise (Jordan curve theorem, common
        // practice); the slow reference sums the argument change along the curve.
        let inside = [
            C::new(0.5, -0.25),
            C::new(0.0, 1.0),
            C::new(0.0, -0.5),
            C::new(1.0, 0.25),
            C::new(0.5, 0.5),
            C::new(0.2, 1.0),
            C::new(-0.7, 0.3),
            C::new(-1.0, 0.2),
            C::new(2.0, 0.5),
        ];
        for (s, p) in shapes().iter().zip(inside) {
            let w = winding_by_sampling(s, p);
            assert_eq!(w.abs(), 1, "{s:?}: {p} must be inside");
            assert_eq!(s.orientation(), w, "{s:?}");
        }
        assert_eq!(shapes()[4].orientation(), -1, "the last shape runs clockwise");
    }
}

/// Signed area of a polygon by the shoelace formula (see [`Contour::orientation`]).
fn self_area(vertices: &[[f64; 2]]) -> f64 {
    let n = vertices.len();
    (0..n).map(|k| vertices[k][0] * vertices[(k + 1) % n][1] - vertices[(k + 1) % n][0] * vertices[k][1]).sum::<f64>() / 2.0
}

//! Closed contours: the shapes of the public contract and their geometry.
//!
//! A contour is a closed curve made of smooth pieces. Circles and ellipses are
//! one periodic piece (the trapezoidal rule converges exponentially on them);
//! rectangles and polygons are straight segments (use Gauss rules per piece).
//! Orientation follows the shape: circles and ellipses run counter-clockwise,
//! a rectangle runs counter-clockwise from its lower-left corner, a polygon
//! runs through its vertices in the order given.

pub mod covering;

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
}

/// One smooth piece of a contour, parametrised by t in [0, 1].
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Piece {
    /// z(t) = center + rot * (a cos 2πt + i b sin 2πt); closed and periodic.
    Ellipse { center: C, a: f64, b: f64, rot: C },
    /// z(t) = from + t (to - from).
    Segment { from: C, to: C },
}

impl Piece {
    pub fn point(&self, t: f64) -> C {
        match *self {
            Piece::Ellipse { center, a, b, rot } => {
                let th = 2.0 * PI * t;
                center + rot * C::new(a * th.cos(), b * th.sin())
            }
            Piece::Segment { from, to } => from + (to - from) * t,
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
        }
    }

    /// True for a piece whose integrand is periodic in t (trapezoidal rule is spectral).
    pub fn is_periodic(&self) -> bool {
        matches!(self, Piece::Ellipse { .. })
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
            _ => self
                .pieces()
                .iter()
                .map(|p| match *p {
                    Piece::Segment { from, to } => {
                        let d = to - from;
                        let t = (((z - from) * d.conj()).re / d.norm_sqr()).clamp(0.0, 1.0);
                        (from + d * t - z).norm()
                    }
                    _ => unreachable!("straight-sided shapes have only segments"),
                })
                .fold(f64::INFINITY, f64::min),
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
            _ => {
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
        let inside = [C::new(0.5, -0.25), C::new(0.0, 1.0), C::new(0.0, -0.5), C::new(1.0, 0.25), C::new(0.5, 0.5)];
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

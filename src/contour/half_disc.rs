//! Method: the half-disc contour — a diameter through the centre and the
//! half circle on the named side, run counter-clockwise.
//!
//! With centre c, radius r and the unit normal d of the side (upper: i,
//! lower: −i, left: −1, right: 1), the diameter runs from c − r u to c + r u
//! with u = −i d, then the arc z = c + r e^{iφ}, φ from arg u to arg u + π.
//! A point z lies inside when |z − c| < r and Re((z − c) d̄) > 0 (plane
//! geometry, common practice); the closing contour of the textbook residue
//! evaluation of ∫ f(x) dx over the real line (Ahlfors, Complex Analysis,
//! 3rd ed., §5.3).

use super::Piece;
use crate::C;
use std::f64::consts::PI;

/// The side of the diameter where the arc lies.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Side {
    Upper,
    Lower,
    Left,
    Right,
}

impl Side {
    /// The unit normal pointing from the diameter into the half-disc.
    pub fn normal(self) -> C {
        match self {
            Side::Upper => C::new(0.0, 1.0),
            Side::Lower => C::new(0.0, -1.0),
            Side::Left => C::new(-1.0, 0.0),
            Side::Right => C::new(1.0, 0.0),
        }
    }
}

/// The diameter, then the arc.
pub fn pieces(center: C, radius: f64, side: Side) -> Vec<Piece> {
    let u = side.normal() * C::new(0.0, -1.0);
    vec![
        Piece::Segment { from: center - u * radius, to: center + u * radius },
        Piece::Arc { center, radius, start: u.arg(), sweep: PI },
    ]
}

/// +1 inside, 0 outside (the caller has excluded points on the curve).
pub fn winding(center: C, radius: f64, side: Side, z: C) -> i32 {
    let w = z - center;
    (w.norm() < radius && (w * side.normal().conj()).re > 0.0) as i32
}

/// The exact axis-aligned box: the diameter's ends and the arc's apex.
pub fn bounding_box(center: C, radius: f64, side: Side) -> (C, C) {
    let u = side.normal() * C::new(0.0, -1.0);
    let pts = [center - u * radius, center + u * radius, center + side.normal() * radius];
    let lo = pts.iter().fold(C::new(f64::INFINITY, f64::INFINITY), |m, p| C::new(m.re.min(p.re), m.im.min(p.im)));
    let hi = pts.iter().fold(C::new(f64::NEG_INFINITY, f64::NEG_INFINITY), |m, p| C::new(m.re.max(p.re), m.im.max(p.im)));
    (lo, hi)
}

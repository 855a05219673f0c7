//! Method: the keyhole contour — the annulus r₁ < |z − c| < r₂ minus a slit
//! of half-width g along the ray from c in the direction θ.
//!
//! With e = e^{iθ}, s₁ = √(r₁² − g²), s₂ = √(r₂² − g²), δ₁ = asin(g/r₁),
//! δ₂ = asin(g/r₂), the curve runs (counter-clockwise about the region):
//! the slit's upper edge c + e(s + ig) for s from s₁ to s₂; the outer circle
//! counter-clockwise from θ + δ₂ to θ + 2π − δ₂; the lower edge c + e(s − ig)
//! for s from s₂ back to s₁; the inner circle clockwise from θ + 2π − δ₁ to
//! θ + δ₁. A function with a branch cut along the slit (z^{α−1} with
//! arg z ∈ (θ, θ + 2π)) is analytic on and inside it: this is the contour of
//! Mellin-type integrals ∫₀^∞ x^{α−1} R(x) dx (Ahlfors, Complex Analysis,
//! 3rd ed., §5.3; Whittaker & Watson §6.24). A point z lies inside when
//! r₁ < |z − c| < r₂ and it is not in the slit, |Im((z − c)ē)| < g with
//! Re((z − c)ē) > 0 (plane geometry, common practice).

use super::Piece;
use crate::C;
use std::f64::consts::PI;

/// The slit's half-width when a request gives none, as a fraction of the inner radius.
pub const DEFAULT_GAP_FRACTION: f64 = 1e-3;

/// Upper edge, outer arc, lower edge, inner arc (clockwise).
pub fn pieces(center: C, inner: f64, outer: f64, angle: f64, gap: f64) -> Vec<Piece> {
    let e = C::from_polar(1.0, angle);
    let (s1, s2) = ((inner * inner - gap * gap).sqrt(), (outer * outer - gap * gap).sqrt());
    let (d1, d2) = ((gap / inner).asin(), (gap / outer).asin());
    vec![
        Piece::Segment { from: center + e * C::new(s1, gap), to: center + e * C::new(s2, gap) },
        Piece::Arc { center, radius: outer, start: angle + d2, sweep: 2.0 * PI - 2.0 * d2 },
        Piece::Segment { from: center + e * C::new(s2, -gap), to: center + e * C::new(s1, -gap) },
        Piece::Arc { center, radius: inner, start: angle + 2.0 * PI - d1, sweep: -(2.0 * PI - 2.0 * d1) },
    ]
}

/// +1 inside, 0 outside (the caller has excluded points on the curve).
pub fn winding(center: C, inner: f64, outer: f64, angle: f64, gap: f64, z: C) -> i32 {
    let w = (z - center) * C::from_polar(1.0, -angle);
    let r = w.norm();
    let in_slit = w.re > 0.0 && w.im.abs() < gap;
    (r > inner && r < outer && !in_slit) as i32
}

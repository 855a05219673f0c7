//! Removable points of a general f: candidates from the expression (zeros of
//! rational denominators inside it, like z = 0 in sin(z)/z) that the sampling
//! search cannot see, because f is finite there.
//!
//! Method: classify each candidate inside the region that is not already a
//! known point by its Laurent coefficients on small circles
//! (`singular::classify`, Cauchy integrals by the trapezoidal rule): a point
//! with no principal part is removable. A candidate that turns out to be a
//! pole or essential point was missed by the search, and is reported so.
//! Common practice; the classification is Riemann's theorem on removable
//! singularities (any complex-analysis text, e.g. Ahlfors, *Complex
//! Analysis*, 3rd ed., §4.3.1 — from memory).
//!
//! ```
//! use residuary::budget::Budget;
//! use residuary::contour::Contour;
//! use residuary::singular::{removable::removable_points, Hints};
//! use residuary::C;
//! let f = |z: C| z.sin() / z; // 0/0 at 0, as the expression evaluates
//! let region = Contour::circle(C::new(0.0, 0.0), 1.0);
//! let found = removable_points(&f, &[C::new(0.0, 0.0)], &region, &[], &Hints::default(), &mut Budget::default());
//! assert_eq!(found.points, vec![C::new(0.0, 0.0)]);
//! ```

use super::{classify_point, Hints, Kind};
use crate::budget::Budget;
use crate::contour::Contour;
use crate::C;

/// What the candidates turned out to be.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Removable {
    /// Removable points inside the region.
    pub points: Vec<C>,
    /// Candidates that are poles or essential points the search missed.
    pub missed: Vec<(Kind, C)>,
}

/// Classify the `candidates` strictly inside `region` that are not within
/// 1e-8 (relative to the region's size) of a `known` point or of each other.
pub fn removable_points(
    f: &dyn Fn(C) -> C,
    candidates: &[C],
    region: &Contour,
    known: &[C],
    hints: &Hints,
    budget: &mut Budget,
) -> Removable {
    let scale = region.size().max(f64::MIN_POSITIVE);
    let near = |a: C, b: C| (a - b).norm() <= 1e-8 * scale;
    let mut out = Removable::default();
    let mut seen: Vec<C> = Vec::new();
    for &z in candidates {
        let inside = region.winding_number(z).map(|w| w != 0) == Some(true);
        if !inside || known.iter().any(|&k| near(k, z)) || seen.iter().any(|&s| near(s, z)) {
            continue;
        }
        seen.push(z);
        match classify_point(f, z, hints, budget) {
            // `+ 0` turns a negative zero into a positive one for the wire.
            Ok(r) if r.kind == Kind::Removable => out.points.push(z + C::new(0.0, 0.0)),
            Ok(r) if r.kind == Kind::Pole || r.kind == Kind::Essential => out.missed.push((r.kind, z)),
            _ => {}
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sinc_is_removable_and_a_hidden_pole_is_reported_missed() {
        // sin z / z has a removable point at 0 (its Taylor series, DLMF 4.19.1);
        // 1/(z − 0.5) has a pole there (common practice).
        // As typed, sin(z)/z is 0/0 at 0: finite around it, undefined at it.
        let sinc = |z: C| z.sin() / z;
        let region = Contour::circle(C::new(0.0, 0.0), 1.0);
        let mut budget = Budget::default();
        let candidates = [C::new(0.0, 0.0), C::new(0.0, 0.0), C::new(3.0, 0.0)];
        let out = removable_points(&sinc, &candidates, &region, &[], &Hints::default(), &mut budget);
        assert_eq!(out.points, vec![C::new(0.0, 0.0)], "the duplicate and the outside point are skipped");
        assert!(out.missed.is_empty());
        let pole = |z: C| 1.0 / (z - 0.5);
        let out = removable_points(&pole, &[C::new(0.5, 0.0)], &region, &[], &Hints::default(), &mut budget);
        assert_eq!(out.missed, vec![(Kind::Pole, C::new(0.5, 0.0))]);
        assert!(out.points.is_empty());
    }
}

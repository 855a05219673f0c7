//! Method: regions that cover a contour, for searching singularities near it.
//!
//! A region search (`singular::region_search`) needs a region whose boundary
//! the searcher can walk counter-clockwise: a circle, an ellipse or a
//! rectangle. Every point a contour winds around lies inside its convex hull,
//! so it lies inside the contour's own disc or ellipse grown by a factor
//! g ≥ 1, and inside its axis-aligned bounding box padded by a margin m ≥ 0
//! (common practice). Several sizes are offered, largest first: a slightly
//! larger region also finds singularities just outside the contour (which are
//! then reported with winding 0), and the closer fits are there in case a
//! larger boundary happens to pass through a zero or pole and the search on
//! it fails.

use super::Contour;
use crate::C;

/// Growth factors of circles and ellipses, largest first.
const GROW: [f64; 3] = [1.05, 1.02, 1.0];
/// Margins of the bounding box of rectangles and polygons, as fractions of the contour's size.
const PAD: [f64; 3] = [0.05, 0.02, 0.005];

/// Regions that cover every point with nonzero winding, slightly larger than
/// the contour first, then closer fits.
///
/// A polygon is covered by its (counter-clockwise) bounding box: as a region
/// it would otherwise be searched with its own orientation.
///
/// ```
/// use residuary::contour::{covering::covering_regions, Contour};
/// let square = Contour::Polygon { vertices: vec![[0.0, 0.0], [0.0, 1.0], [1.0, 1.0], [1.0, 0.0]] };
/// let regions = covering_regions(&square);
/// assert_eq!(regions.len(), 3);
/// // Each region winds once, counter-clockwise, around the square's centre.
/// assert!(regions.iter().all(|r| r.winding_number(residuary::C::new(0.5, 0.5)) == Some(1)));
/// ```
pub fn covering_regions(contour: &Contour) -> Vec<Contour> {
    match contour {
        Contour::Circle { center, radius } => GROW
            .iter()
            .map(|g| Contour::Circle { center: *center, radius: radius * g })
            .collect(),
        Contour::Ellipse { center, semi_axes, angle } => GROW
            .iter()
            .map(|g| Contour::Ellipse {
                center: *center,
                semi_axes: [semi_axes[0] * g, semi_axes[1] * g],
                angle: *angle,
            })
            .collect(),
        // A keyhole: the discs about its outer circle (they also hold the inner
        // disc, whose points have winding 0 and are reported so).
        Contour::Keyhole { center, outer, .. } => GROW
            .iter()
            .map(|g| Contour::Circle { center: *center, radius: outer * g })
            .collect(),
        Contour::Rectangle { .. } | Contour::Polygon { .. } | Contour::HalfDisc { .. } => {
            let (lo, hi) = contour.bounding_box();
            let size = contour.size();
            PAD.iter()
                .map(|m| {
                    let pad = C::new(m * size, m * size);
                    Contour::rectangle(lo - pad, hi + pad)
                })
                .collect()
        }
    }
}

/// The contour itself where it can be searched as a region (circle, ellipse,
/// rectangle: the search then finds exactly what the contour encloses), and
/// the covering boxes of [`covering_regions`] for a polygon.
///
/// ```
/// use residuary::contour::{covering::contour_as_regions, Contour};
/// let disc = Contour::Circle { center: [0.0, 0.0], radius: 2.0 };
/// assert_eq!(contour_as_regions(&disc), vec![disc.clone()]);
/// ```
pub fn contour_as_regions(contour: &Contour) -> Vec<Contour> {
    match contour {
        Contour::Polygon { .. } | Contour::HalfDisc { .. } | Contour::Keyhole { .. } => covering_regions(contour),
        _ => vec![contour.clone()],
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::contour::Side;
    use crate::reference::sampled_winding;

    fn shapes() -> Vec<Contour> {
        vec![
            Contour::circle(C::new(0.5, -0.25), 1.5),
            Contour::Ellipse { center: [0.0, 1.0], semi_axes: [2.0, 0.5], angle: 0.7 },
            Contour::rectangle(C::new(1.0, 1.0), C::new(-1.0, -2.0)),
            // Clockwise, non-convex.
            Contour::Polygon { vertices: vec![[0.0, 0.0], [0.0, 2.0], [1.0, 0.5], [2.0, 2.0], [2.0, 0.0]] },
            // A figure eight: windings +1 and −1 in its two lobes.
            Contour::Polygon { vertices: vec![[0.0, 0.0], [3.0, 2.0], [3.0, 0.0], [0.0, 1.0]] },
            Contour::HalfDisc { center: [0.5, -0.5], radius: 1.2, direction: Side::Lower },
            Contour::Keyhole { center: [0.0, 1.0], inner: 0.4, outer: 1.5, angle: 1.0, gap: 0.05 },
        ]
    }

    /// Points of a grid over the contour's bounding box, padded.
    fn probes(c: &Contour) -> Vec<C> {
        let (lo, hi) = c.bounding_box();
        let n = 24;
        let mut out = Vec::new();
        for i in 0..=n {
            for j in 0..=n {
                let (u, v) = (i as f64 / n as f64 * 1.4 - 0.2, j as f64 / n as f64 * 1.4 - 0.2);
                out.push(C::new(lo.re + u * (hi.re - lo.re), lo.im + v * (hi.im - lo.im)));
            }
        }
        out
    }

    /// Winding number of a region about z by the slow reference: the argument
    /// change along a fine polyline through the region's boundary (common practice).
    fn slow_winding(c: &Contour, z: C) -> i32 {
        let n = 2000;
        let pts: Vec<C> = c
            .pieces()
            .iter()
            .flat_map(|p| (0..n).map(move |k| p.point(k as f64 / n as f64)))
            .collect();
        sampled_winding(&pts, z)
    }

    #[test]
    fn every_region_covers_every_point_the_contour_winds_around_once_counter_clockwise() {
        let mut nonzero = 0;
        for s in shapes() {
            let regions = covering_regions(&s);
            assert_eq!(regions.len(), 3);
            for z in probes(&s) {
                if s.distance_to_boundary(z) < 1e-3 * s.size() {
                    continue;
                }
                if slow_winding(&s, z) == 0 {
                    continue;
                }
                nonzero += 1;
                for r in &regions {
                    if r.distance_to_boundary(z) > 1e-6 {
                        assert_eq!(slow_winding(r, z), 1, "{r:?} must hold {z} once, counter-clockwise");
                    }
                }
            }
        }
        assert!(nonzero > 100, "the probes must reach inside the shapes ({nonzero})");
    }

    #[test]
    fn the_largest_region_comes_first_and_the_closest_fit_last() {
        for s in shapes() {
            let sizes: Vec<f64> = covering_regions(&s).iter().map(|r| r.size()).collect();
            assert!(sizes.windows(2).all(|w| w[0] > w[1]), "{sizes:?}");
            assert!(sizes[2] >= s.size() && sizes[2] <= 1.01 * s.size(), "{sizes:?}");
        }
    }

    #[test]
    fn curved_shapes_and_rectangles_are_their_own_region() {
        for s in shapes() {
            let own = contour_as_regions(&s);
            match s {
                Contour::Polygon { .. } | Contour::HalfDisc { .. } | Contour::Keyhole { .. } => {
                    assert_eq!(own, covering_regions(&s))
                }
                _ => assert_eq!(own, vec![s.clone()]),
            }
        }
    }
}

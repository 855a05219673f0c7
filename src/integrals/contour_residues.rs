//! Method: ∮_Γ f dz by residues, two independent ways, and the weighted count
//! of zeros and poles a contour winds around.
//!
//! **Inside residues** (the residue theorem, any complex-analysis text, e.g.
//! Ahlfors, "Complex Analysis", §4.5): for f analytic on and inside Γ except
//! at isolated singular points a,
//!
//! ```text
//! ∮_Γ f dz = 2πi Σ_a w(a) Res_a f,
//! ```
//!
//! w(a) the winding number of Γ about a. Rational f: the exact poles from
//! polynomial algebra. Other f: the poles and essential points a region
//! search locates on regions covering Γ; not available when a branch point
//! lies inside, a branch cut crosses Γ, or a residue could not be computed.
//!
//! **Outside residues** (rational f only): the finite residues and the residue
//! at infinity sum to zero (Ahlfors §4.5, from memory), so for any integer k,
//! ∮ f = 2πi Σ_a (w(a) − k) Res_a − 2πi k Res∞. When every pole with w ≠ 0 has
//! the same winding k, the inside poles drop out:
//!
//! ```text
//! ∮_Γ f dz = −2πi k (Σ_{w(a)=0} Res_a f + Res∞ f).
//! ```
//!
//! Res∞ comes from the expansion at infinity, not from the finite residues,
//! so this is a genuine check. With no pole inside, k is the orientation of Γ.
//!
//! **Zeros and poles wound** (the argument principle, Ahlfors §5.2): the
//! inside-residue sum for f′/f, whose residue at a zero or pole of order m is
//! ±m, is Σ_a w(a) m(a); the points behind it are listed with their windings.
//!
//! Error estimates: each residue's own estimate times |w|, plus rounding in
//! the sum, times 2π; for Res∞ a rounding bound from the coefficients' size.

use crate::budget::Budget;
use crate::contour::Contour;
use crate::error::Failure;
use crate::singular::cut_crossing::Crossing;
use crate::singular::rational_poles::{analyse_rational_polished, AsTyped};
use crate::singular::region_search::search_cover;
use crate::singular::{classify_point, Hints, Kind};
use crate::text;
use crate::ways::{Way, WayName};
use crate::C;
use std::f64::consts::PI;

/// A singular point closer to the contour than this fraction of its size gets a warning.
pub const NEAR_FRACTION: f64 = 1e-2;

/// What a singular point of f is, as far as the residue theorem cares.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PointKind {
    Pole,
    Essential,
    BranchPoint,
}

/// A singular point, its kind and order, its residue with an error estimate,
/// and the contour's winding number about it (`None`: on the contour).
#[derive(Debug, Clone, PartialEq)]
pub struct Singular {
    pub at: C,
    pub kind: PointKind,
    pub order: Option<u32>,
    pub residue: Option<(C, f64)>,
    pub winding: Option<i32>,
}

/// What the residue side produced: the points, the ways it could compute, and
/// why any way is missing.
#[derive(Debug, Clone, PartialEq)]
pub struct ResidueWays {
    pub points: Vec<Singular>,
    pub inside: Option<Way>,
    pub outside: Option<Way>,
    /// Why a way is missing, for each way that is (also among `warnings`).
    pub unavailable: Vec<(WayName, String)>,
    pub warnings: Vec<String>,
}

fn two_pi_i() -> C {
    C::new(0.0, 2.0 * PI)
}

/// Rounding in a sum of terms of this total magnitude.
fn rounding(magnitude: f64) -> f64 {
    8.0 * f64::EPSILON * magnitude
}

fn nonzero(w: Option<i32>) -> bool {
    matches!(w, Some(w) if w != 0)
}

/// Both residue ways for rational f = num/den (ascending coefficients), the
/// poles exact from polynomial algebra and polished on f as typed.
///
/// ```
/// use residuary::{contour::Contour, integrals::contour_residues::rational_residue_ways, C};
/// // (z + 1)/(z² + 4): poles ±2i, whose residues sum to 1 (the ratio of leading
/// // coefficients), so ∮ over |z| = 3 is 2πi (common practice).
/// let as_typed = |z: C| { let (n, d) = (z + 1.0, z * z + 4.0); (n / d, (d - n * 2.0 * z) / (d * d)) };
/// let (num, den) = ([C::new(1.0, 0.0), C::new(1.0, 0.0)], [C::new(4.0, 0.0), C::new(0.0, 0.0), C::new(1.0, 0.0)]);
/// let ways = rational_residue_ways(&num, &den, &as_typed, &Contour::circle(C::new(0.0, 0.0), 3.0)).unwrap();
/// let want = C::new(0.0, 2.0 * std::f64::consts::PI);
/// assert!((ways.inside.unwrap().value - want).norm() < 1e-13);
/// assert!((ways.outside.unwrap().value - want).norm() < 1e-13);
/// ```
pub fn rational_residue_ways(num: &[C], den: &[C], as_typed: AsTyped, contour: &Contour) -> Result<ResidueWays, Failure> {
    let a = analyse_rational_polished(num, den, as_typed)?;
    let mut warnings = a.warnings.clone();
    let points: Vec<Singular> = a
        .poles
        .iter()
        .map(|p| Singular {
            at: p.at,
            kind: PointKind::Pole,
            order: Some(p.order),
            residue: Some((p.residue, p.error_estimate)),
            winding: contour.winding_number(p.at),
        })
        .collect();
    if points.iter().any(|p| p.winding.is_none()) {
        // `check_on_and_near` turns this into the error.
        return Ok(ResidueWays { points, inside: None, outside: None, unavailable: Vec::new(), warnings });
    }
    let inside = inside_sum(&points);
    let mut unavailable = Vec::new();
    let mut windings: Vec<i32> = points.iter().filter_map(|p| p.winding).filter(|&w| w != 0).collect();
    windings.sort();
    windings.dedup();
    let outside = if windings.len() > 1 {
        let reason = format!(
            "the contour winds around f's poles with different winding numbers ({}), so the outside-residue form of the residue theorem does not isolate the outside poles; it is not computed",
            windings.iter().map(|w| w.to_string()).collect::<Vec<_>>().join(", ")
        );
        warnings.push(reason.clone());
        unavailable.push((WayName::OutsideResidues, reason));
        None
    } else {
        let k = windings.first().copied().unwrap_or_else(|| contour.orientation());
        // Rounding in Res∞ from the coefficients' size.
        let scale = num.iter().map(|c| c.norm()).fold(0.0, f64::max) / den.last().map(|d| d.norm()).unwrap_or(1.0);
        let infinity_error = 8.0 * (num.len() + den.len()) as f64 * f64::EPSILON * (a.residue_at_infinity.norm() + scale);
        Some(outside_sum(&points, k, a.residue_at_infinity, infinity_error))
    };
    Ok(ResidueWays { points, inside, outside, unavailable, warnings })
}

/// −2πi k (Σ_{w=0} Res_a + Res∞), with its error estimate.
fn outside_sum(points: &[Singular], k: i32, at_infinity: C, infinity_error: f64) -> Way {
    let mut sum = at_infinity;
    let mut err = infinity_error;
    let mut magnitude = at_infinity.norm();
    for p in points.iter().filter(|p| p.winding == Some(0)) {
        if let Some((r, e)) = p.residue {
            sum += r;
            err += e;
            magnitude += r.norm();
        }
    }
    let factor = -two_pi_i() * k as f64;
    Way::new(WayName::OutsideResidues, factor * sum, factor.norm() * (err + rounding(magnitude)))
}

/// 2πi Σ w(a) Res_a over the points with w ≠ 0; `None` if a residue is missing.
pub fn inside_sum(points: &[Singular]) -> Option<Way> {
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    let mut magnitude = 0.0;
    for p in points {
        let w = p.winding.unwrap_or(0);
        if w == 0 {
            continue;
        }
        let (r, e) = p.residue?;
        sum += r * w as f64;
        err += e * w.abs() as f64;
        magnitude += r.norm() * w.abs() as f64;
    }
    Some(Way::new(WayName::InsideResidues, two_pi_i() * sum, 2.0 * PI * (err + rounding(magnitude))))
}

/// The inside way for general f: singular points located on the first of
/// `regions` (covering the contour) where the search succeeds, residues of
/// essential points inside by classification. `crossings` are where a branch
/// cut crosses the contour (the theorem then does not apply). The outside way
/// is never available: it would need every singularity in the plane.
///
/// ```
/// use residuary::{budget::Budget, contour::{covering::covering_regions, Contour}, singular::Hints, C};
/// use residuary::integrals::contour_residues::general_residue_ways;
/// // ∮_{|z|=3} e^z/(z−1)² dz = 2πi e (Cauchy's formula for a derivative, common practice).
/// let f = |z: C| z.exp() / ((z - 1.0) * (z - 1.0));
/// let fd = |z: C| { let v = f(z); (v, v - v * 2.0 / (z - 1.0)) };
/// let circle = Contour::circle(C::new(0.0, 0.0), 3.0);
/// let ways = general_residue_ways(&f, &fd, &Hints::default(), &circle, &covering_regions(&circle), &[], &mut Budget::new(20_000_000)).unwrap();
/// let want = C::new(0.0, 2.0 * std::f64::consts::PI * std::f64::consts::E);
/// assert!((ways.inside.unwrap().value - want).norm() < 1e-9);
/// assert!(ways.outside.is_none());
/// ```
pub fn general_residue_ways(
    f: &dyn Fn(C) -> C,
    fd: &dyn Fn(C) -> (C, C),
    hints: &Hints,
    contour: &Contour,
    regions: &[Contour],
    crossings: &[Crossing],
    budget: &mut Budget,
) -> Result<ResidueWays, Failure> {
    let mut warnings = Vec::new();
    let mut blocked: Option<String> = None;
    if !crossings.is_empty() {
        let at: Vec<String> = crossings.iter().take(4).map(|c| text::value(c.at)).collect();
        blocked = Some(format!(
            "f jumps across a branch cut where the cut crosses the contour (near {}): f is not analytic inside, so the residue theorem does not apply; the quadrature integrates the principal branch as written",
            at.join(", ")
        ));
    }
    let found = match search_cover(f, fd, regions, hints, budget) {
        Ok(found) => found,
        Err(e) => {
            let reason = blocked.unwrap_or_else(|| format!("the singularities could not be located, so the residue side is not computed: {e}"));
            warnings.push(reason.clone());
            warnings.push(outside_reason());
            let unavailable = vec![(WayName::InsideResidues, reason), (WayName::OutsideResidues, outside_reason())];
            return Ok(ResidueWays { points: Vec::new(), inside: None, outside: None, unavailable, warnings });
        }
    };
    warnings.extend(found.warnings.iter().map(|w| format!("singularity search: {w}")));
    let mut points: Vec<Singular> = found
        .poles
        .iter()
        .map(|p| Singular {
            at: p.at,
            kind: PointKind::Pole,
            order: Some(p.order),
            residue: p.residue.map(|r| (r, p.error_estimate)),
            winding: contour.winding_number(p.at),
        })
        .collect();
    for &z in &found.essential {
        let winding = contour.winding_number(z);
        let residue = if nonzero(winding) {
            match classify_point(f, z, hints, budget) {
                Ok(r) if r.kind == Kind::Essential => r.residue.map(|c| (c, r.error_estimate)),
                Ok(_) => None,
                Err(e) if e.is_budget() => return Err(e),
                Err(_) => None,
            }
        } else {
            None
        };
        if residue.is_none() && nonzero(winding) {
            blocked.get_or_insert(format!(
                "the residue of the essential singularity at {} could not be computed, so the inside-residue sum is not available",
                text::value(z)
            ));
        }
        points.push(Singular { at: z, kind: PointKind::Essential, order: None, residue, winding });
    }
    for &z in &found.branch_points {
        let winding = contour.winding_number(z);
        if nonzero(winding) {
            blocked.get_or_insert(format!(
                "a branch point of f lies inside the contour at {}: f is not single-valued there, so the residue theorem does not apply",
                text::value(z)
            ));
        }
        points.push(Singular { at: z, kind: PointKind::BranchPoint, order: None, residue: None, winding });
    }
    if points.iter().any(|p| p.kind == PointKind::Pole && p.residue.is_none() && nonzero(p.winding)) {
        blocked.get_or_insert("a pole's residue could not be computed, so the inside-residue sum is not available".into());
    }
    let mut unavailable = Vec::new();
    let inside = match blocked {
        Some(reason) => {
            warnings.push(reason.clone());
            unavailable.push((WayName::InsideResidues, reason));
            None
        }
        None => inside_sum(&points),
    };
    warnings.push(outside_reason());
    unavailable.push((WayName::OutsideResidues, outside_reason()));
    Ok(ResidueWays { points, inside, outside: None, unavailable, warnings })
}

fn outside_reason() -> String {
    "outside residues are computed for rational f only: for other f they need every singularity in the whole plane and the residue at infinity, which sampling cannot certify".into()
}

/// A pole or essential point on the contour is a failure (the integral does
/// not exist); a branch point on it, or any singular point within
/// [`NEAR_FRACTION`] of the contour's size, a warning (returned).
///
/// ```
/// use residuary::{contour::Contour, integrals::contour_residues::{check_on_and_near, PointKind, Singular}, C};
/// let circle = Contour::circle(C::new(0.0, 0.0), 1.0);
/// let pole = |at: C| Singular { at, kind: PointKind::Pole, order: Some(1), residue: None, winding: circle.winding_number(at) };
/// assert!(check_on_and_near(&[pole(C::new(1.0, 0.0))], &circle).is_err());
/// assert_eq!(check_on_and_near(&[pole(C::new(1.001, 0.0))], &circle).unwrap().len(), 1);
/// assert!(check_on_and_near(&[pole(C::new(0.5, 0.0))], &circle).unwrap().is_empty());
/// ```
pub fn check_on_and_near(points: &[Singular], contour: &Contour) -> Result<Vec<String>, Failure> {
    let size = contour.size();
    let mut warnings = Vec::new();
    for p in points {
        let what = match p.kind {
            PointKind::Pole => "a pole",
            PointKind::Essential => "an essential singularity",
            PointKind::BranchPoint => "a branch point",
        };
        if p.winding.is_none() {
            if p.kind == PointKind::BranchPoint {
                warnings.push(format!(
                    "f has a branch point at {} on the contour; the integral exists only if f is integrable there",
                    text::value(p.at)
                ));
                continue;
            }
            return Err(Failure::on_contour(format!("f has {what} at {} on the contour; move the contour", text::value(p.at))).at(p.at));
        }
        let d = contour.distance_to_boundary(p.at);
        if d < NEAR_FRACTION * size {
            warnings.push(format!(
                "{what} at {} lies only {d:.1e} from the contour ({:.1e} of its size): the quadrature converges slowly and a small change of the contour would change which side it is on",
                text::value(p.at),
                text::Sci(d / size),
                d = text::Sci(d)
            ));
        }
    }
    Ok(warnings)
}

/// True when some singular point lies within [`NEAR_FRACTION`] of the contour's size.
pub fn any_near_contour(points: &[Singular], contour: &Contour) -> bool {
    points.iter().any(|p| contour.distance_to_boundary(p.at) < NEAR_FRACTION * contour.size())
}

/// A zero or a pole.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ZeroOrPole {
    Zero,
    Pole,
}

/// A zero or pole the contour winds around (w ≠ 0), with its order.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WoundPoint {
    pub at: C,
    pub kind: ZeroOrPole,
    pub order: u32,
    pub winding: i32,
}

/// The zeros and poles the contour winds around, with Σ w·m over each.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct WoundPoints {
    /// `None` when they cannot be listed with certainty (one on the contour,
    /// the search failed, or an essential point or branch point inside).
    pub points: Option<Vec<WoundPoint>>,
    pub warnings: Vec<String>,
}

impl WoundPoints {
    /// (Σ w·m over zeros, Σ w·m over poles); zeros − poles is the argument-principle count.
    pub fn weighted_counts(&self) -> Option<(i64, i64)> {
        let points = self.points.as_ref()?;
        let sum = |kind: ZeroOrPole| -> i64 {
            points.iter().filter(|p| p.kind == kind).map(|p| p.winding as i64 * p.order as i64).sum()
        };
        Some((sum(ZeroOrPole::Zero), sum(ZeroOrPole::Pole)))
    }

    /// True when the contour runs clockwise around some listed point.
    pub fn any_clockwise(&self) -> bool {
        self.points.iter().flatten().any(|p| p.winding < 0)
    }
}

/// The zeros then the poles with w ≠ 0; `Err(point)` for one on the contour.
fn wound(contour: &Contour, all: impl Iterator<Item = (C, ZeroOrPole, u32)>) -> Result<Vec<WoundPoint>, (C, ZeroOrPole)> {
    let mut out = Vec::new();
    for (at, kind, order) in all {
        match contour.winding_number(at) {
            Some(0) => {}
            Some(winding) => out.push(WoundPoint { at, kind, order, winding }),
            None => return Err((at, kind)),
        }
    }
    Ok(out)
}

/// Zeros and poles of rational f = num/den wound by the contour, exact from polynomial algebra.
///
/// ```
/// use residuary::{contour::Contour, integrals::contour_residues::rational_wound_points, C};
/// // (z − 2)/(z + 0.5)²: a double pole inside |z| = 1, the zero outside.
/// let as_typed = |z: C| { let d = (z + 0.5) * (z + 0.5); ((z - 2.0) / d, (z + 0.5 - (z - 2.0) * 2.0) / (d * (z + 0.5))) };
/// let (num, den) = ([C::new(-2.0, 0.0), C::new(1.0, 0.0)], [C::new(0.25, 0.0), C::new(1.0, 0.0), C::new(1.0, 0.0)]);
/// let w = rational_wound_points(&num, &den, &as_typed, &Contour::circle(C::new(0.0, 0.0), 1.0)).unwrap();
/// assert_eq!(w.weighted_counts(), Some((0, 2)));
/// ```
pub fn rational_wound_points(num: &[C], den: &[C], as_typed: AsTyped, contour: &Contour) -> Result<WoundPoints, Failure> {
    let a = analyse_rational_polished(num, den, as_typed)?;
    let mut warnings = a.warnings.clone();
    let all = a
        .zeros
        .iter()
        .map(|z| (z.at, ZeroOrPole::Zero, z.order))
        .chain(a.poles.iter().map(|p| (p.at, ZeroOrPole::Pole, p.order)));
    let points = match wound(contour, all) {
        Ok(points) => Some(points),
        Err((at, kind)) => {
            let kind = if kind == ZeroOrPole::Zero { "zero" } else { "pole" };
            warnings.push(format!("a {kind} at {} lies on the contour; move the contour", text::value(at)));
            None
        }
    };
    Ok(WoundPoints { points, warnings })
}

/// Zeros and poles of general f wound by the contour, located on the first of
/// `regions` where the search succeeds; not listed when an essential point or
/// branch point lies inside (f′/f then has other singularities there).
pub fn general_wound_points(
    f: &dyn Fn(C) -> C,
    fd: &dyn Fn(C) -> (C, C),
    hints: &Hints,
    contour: &Contour,
    regions: &[Contour],
    budget: &mut Budget,
) -> WoundPoints {
    let found = match search_cover(f, fd, regions, hints, budget) {
        Ok(found) => found,
        Err(e) => {
            return WoundPoints { points: None, warnings: vec![format!("zeros and poles could not be located separately: {e}")] };
        }
    };
    let mut warnings: Vec<String> = found.warnings.iter().map(|w| format!("singularity search: {w}")).collect();
    if let Some(z) = found.essential.iter().chain(&found.branch_points).find(|z| nonzero(contour.winding_number(**z))) {
        warnings.push(format!(
            "an essential singularity or branch point lies inside at {}: zeros and poles are not counted separately there, and the argument-principle count is only the winding of f around 0",
            text::value(*z)
        ));
        return WoundPoints { points: None, warnings };
    }
    let all = found
        .zeros
        .iter()
        .map(|z| (z.at, ZeroOrPole::Zero, z.order))
        .chain(found.poles.iter().map(|p| (p.at, ZeroOrPole::Pole, p.order)));
    WoundPoints { points: wound(contour, all).ok(), warnings }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::contour::covering::{contour_as_regions, covering_regions};
    use crate::error::FailureKind;
    use crate::reference::{check_method, naive_circle_integral, naive_polyline_integral, sampled_winding};

    /// A rational function given by its poles (simple) and a numerator's roots, with value and derivative.
    #[derive(Clone)]
    struct Rat {
        zeros: Vec<C>,
        poles: Vec<C>,
    }

    fn mul_linear(p: &[C], r: C) -> Vec<C> {
        // p(z)·(z − r), ascending coefficients.
        let mut out = vec![C::new(0.0, 0.0); p.len() + 1];
        for (k, c) in p.iter().enumerate() {
            out[k + 1] += c;
            out[k] -= c * r;
        }
        out
    }

    impl Rat {
        fn coefficients(&self) -> (Vec<C>, Vec<C>) {
            let one = vec![C::new(1.0, 0.0)];
            let num = self.zeros.iter().fold(one.clone(), |p, r| mul_linear(&p, *r));
            let den = self.poles.iter().fold(one, |p, r| mul_linear(&p, *r));
            (num, den)
        }

        fn eval(&self, z: C) -> C {
            let n: C = self.zeros.iter().map(|r| z - r).product();
            let d: C = self.poles.iter().map(|r| z - r).product();
            n / d
        }

        fn eval_d(&self, z: C) -> (C, C) {
            let v = self.eval(z);
            let log_d: C = self.zeros.iter().map(|r| (z - r).inv()).sum::<C>() - self.poles.iter().map(|r| (z - r).inv()).sum::<C>();
            (v, v * log_d)
        }
    }

    fn square(half: f64) -> Vec<[f64; 2]> {
        vec![[-half, -half], [half, -half], [half, half], [-half, half]]
    }

    /// Cases: (name, f, contour). The slow reference integrates along the contour directly.
    fn rational_cases() -> Vec<(&'static str, (Rat, Contour))> {
        let c = |re, im| C::new(re, im);
        let f1 = Rat { zeros: vec![c(0.3, 0.0)], poles: vec![c(0.5, 0.5), c(-0.5, 0.2), c(2.0, 0.0)] };
        let f2 = Rat { zeros: vec![], poles: vec![c(0.1, 0.0), c(0.1, 0.0), c(-3.0, 1.0)] };
        let f3 = Rat { zeros: vec![c(1.5, 1.2), c(-0.4, 0.1), c(0.0, 2.0)], poles: vec![c(0.2, -0.3), c(3.0, 3.0)] };
        // Clockwise square, and a figure eight whose lobes wind +1 and −1.
        let clockwise = Contour::Polygon { vertices: square(1.0).into_iter().rev().collect() };
        let eight = Contour::Polygon { vertices: vec![[0.0, 0.0], [3.0, 2.0], [3.0, 0.0], [0.0, 1.0]] };
        let f4 = Rat { zeros: vec![], poles: vec![c(2.5, 0.5), c(5.0, 0.0)] };
        vec![
            ("three poles, circle", (f1.clone(), Contour::circle(c(0.0, 0.0), 1.0))),
            ("three poles, ellipse", (f1.clone(), Contour::Ellipse { center: [0.0, 0.0], semi_axes: [1.5, 0.8], angle: 0.3 })),
            ("double pole, clockwise square", (f2, clockwise)),
            ("zeros beyond poles (polynomial part), rectangle", (f3, Contour::rectangle(c(-1.0, -1.0), c(1.0, 1.0)))),
            ("figure eight, one lobe", (f4, eight)),
        ]
    }

    /// The slow reference: the naive trapezoidal sum on circles, the midpoint
    /// rule along a polyline through the pieces otherwise.
    fn integral_along(f: &dyn Fn(C) -> C, contour: &Contour) -> C {
        match contour {
            Contour::Circle { center, radius } => naive_circle_integral(f, C::new(center[0], center[1]), *radius, 4000),
            _ => {
                let n = 20_000;
                let pts: Vec<C> = contour.pieces().iter().flat_map(|p| (0..n).map(move |k| p.point(k as f64 / n as f64))).collect();
                naive_polyline_integral(f, &pts, 20)
            }
        }
    }

    fn ways_of(f: &Rat, contour: &Contour) -> ResidueWays {
        let (num, den) = f.coefficients();
        rational_residue_ways(&num, &den, &|z| f.eval_d(z), contour).unwrap()
    }

    #[test]
    fn the_inside_way_matches_direct_integration_along_the_contour() {
        check_method(
            &rational_cases(),
            |(f, contour)| {
                let w = ways_of(f, contour).inside.expect("inside way");
                assert_eq!(w.name, WayName::InsideResidues);
                (w.value, Some(w.error))
            },
            |(f, contour)| integral_along(&|z| f.eval(z), contour),
            1e-7,
        );
    }

    #[test]
    fn the_outside_way_matches_direct_integration_where_the_windings_agree() {
        // All but the figure eight (where only one lobe holds a pole, so it is available too).
        check_method(
            &rational_cases(),
            |(f, contour)| {
                let w = ways_of(f, contour).outside.expect("outside way");
                assert_eq!(w.name, WayName::OutsideResidues);
                (w.value, Some(w.error))
            },
            |(f, contour)| integral_along(&|z| f.eval(z), contour),
            1e-7,
        );
    }

    #[test]
    fn the_estimates_bound_the_error_against_the_exact_sum() {
        // Exact value from the poles written down: for simple poles Res_a = n(a)/Π_{b≠a}(a − b)
        // (common practice), summed with the windings by the slow polyline reference.
        let c = |re, im| C::new(re, im);
        let f = Rat { zeros: vec![c(0.3, 0.0)], poles: vec![c(0.5, 0.5), c(-0.5, 0.2), c(2.0, 0.0)] };
        let circle = Contour::circle(c(0.0, 0.0), 1.0);
        let polyline: Vec<C> = (0..400).map(|k| C::from_polar(1.0, 2.0 * PI * k as f64 / 400.0)).collect();
        let mut want = C::new(0.0, 0.0);
        for (i, a) in f.poles.iter().enumerate() {
            let others: C = f.poles.iter().enumerate().filter(|(j, _)| *j != i).map(|(_, b)| a - b).product();
            want += two_pi_i() * (a - f.zeros[0]) / others * sampled_winding(&polyline, *a) as f64;
        }
        let ways = ways_of(&f, &circle);
        for w in [ways.inside.unwrap(), ways.outside.unwrap()] {
            crate::reference::assert_estimate_bounds(w.value, w.error, want, w.name.words());
        }
    }

    #[test]
    fn different_windings_leave_only_the_inside_way() {
        // The figure eight with a pole in each lobe: windings +1 and −1.
        let f = Rat { zeros: vec![], poles: vec![C::new(0.3, 0.5), C::new(2.5, 0.5)] };
        let eight = Contour::Polygon { vertices: vec![[0.0, 0.0], [3.0, 2.0], [3.0, 0.0], [0.0, 1.0]] };
        let ways = ways_of(&f, &eight);
        let mut windings: Vec<i32> = ways.points.iter().map(|p| p.winding.unwrap()).collect();
        windings.sort();
        assert_eq!(windings, vec![-1, 1]);
        assert!(ways.outside.is_none());
        assert!(ways.warnings.iter().any(|w| w.contains("different winding numbers")));
        crate::reference::assert_close(ways.inside.unwrap().value, integral_along(&|z| f.eval(z), &eight), 1e-7, "figure eight");
    }

    #[test]
    fn general_f_matches_direct_integration() {
        // Invented integrands with poles and an essential point, on circles and a rectangle,
        // each with f and f′ written out (the essential point's hint as the expression analysis gives it).
        type Case = (fn(C) -> C, fn(C) -> (C, C), Contour, Vec<C>);
        let cases: Vec<(&str, Case)> = vec![
            ("1/sin z around 0 and ±π", (|z| z.sin().inv(), |z| (z.sin().inv(), -z.cos() / (z.sin() * z.sin())), Contour::circle(C::new(0.0, 0.0), 4.0), vec![])),
            (
                "exp(z)/(z − 1)² on a rectangle",
                (|z| z.exp() / ((z - 1.0) * (z - 1.0)), |z| { let v = z.exp() / ((z - 1.0) * (z - 1.0)); (v, v - v * 2.0 / (z - 1.0)) }, Contour::rectangle(C::new(-0.5, -1.0), C::new(2.0, 1.0)), vec![]),
            ),
            (
                "exp(1/z) around its essential point",
                (|z| z.inv().exp(), |z| (z.inv().exp(), -z.inv().exp() / (z * z)), Contour::circle(C::new(0.2, 0.1), 1.0), vec![C::new(0.0, 0.0)]),
            ),
        ];
        check_method(
            &cases,
            |(f, fd, contour, essential)| {
                let hints = Hints { essential_candidates: essential.clone(), ..Hints::default() };
                let ways = general_residue_ways(f, fd, &hints, contour, &covering_regions(contour), &[], &mut Budget::new(50_000_000)).unwrap();
                let w = ways.inside.unwrap_or_else(|| panic!("inside way: {:?}", ways.warnings));
                assert!(ways.outside.is_none());
                (w.value, Some(w.error))
            },
            |(f, _, contour, _)| integral_along(f, contour),
            1e-7,
        );
    }

    #[test]
    fn a_cut_across_the_contour_blocks_the_inside_way() {
        let circle = Contour::circle(C::new(0.0, 0.0), 1.0);
        let f = |z: C| z.sqrt() / (z - 0.5);
        let fd = |z: C| (f(z), z.sqrt().inv() * 0.5 / (z - 0.5) - f(z) / (z - 0.5));
        let cut = [Crossing { piece: 0, t: 0.5, at: C::new(-1.0, 0.0) }];
        let hints = Hints { uses_branch_functions: true, ..Hints::default() };
        let ways = general_residue_ways(&f, &fd, &hints, &circle, &covering_regions(&circle), &cut, &mut Budget::new(50_000_000)).unwrap();
        assert!(ways.inside.is_none());
        assert!(ways.warnings.iter().any(|w| w.contains("branch cut")), "{:?}", ways.warnings);
    }

    #[test]
    fn on_the_contour_is_a_failure_and_near_it_a_warning() {
        let circle = Contour::circle(C::new(0.0, 0.0), 1.0);
        let at = |z: C, kind| Singular { at: z, kind, order: None, residue: None, winding: circle.winding_number(z) };
        let e = check_on_and_near(&[at(C::new(0.0, 1.0), PointKind::Essential)], &circle).unwrap_err();
        assert_eq!(e.kind(), FailureKind::OnContour);
        assert!(e.message().contains("essential singularity"), "{e}");
        let w = check_on_and_near(&[at(C::new(-1.0, 0.0), PointKind::BranchPoint)], &circle).unwrap();
        assert!(w[0].contains("integrable"), "{w:?}");
        let near = [at(C::new(0.995, 0.0), PointKind::Pole)];
        assert_eq!(check_on_and_near(&near, &circle).unwrap().len(), 1);
        assert!(any_near_contour(&near, &circle));
        assert!(!any_near_contour(&[at(C::new(0.9, 0.0), PointKind::Pole)], &circle));
    }

    #[test]
    fn wound_points_sum_to_the_argument_principle_count() {
        // Σ w·m equals (1/2πi) ∮ f′/f dz, computed here by the slow reference along the contour.
        for (name, (f, contour)) in rational_cases() {
            let (num, den) = f.coefficients();
            let w = rational_wound_points(&num, &den, &|z| f.eval_d(z), &contour).unwrap();
            let (zeros, poles) = w.weighted_counts().expect(name);
            let log_derivative = |z: C| {
                let (v, d) = f.eval_d(z);
                d / v
            };
            let count = integral_along(&log_derivative, &contour) / two_pi_i();
            assert!((count - C::new((zeros - poles) as f64, 0.0)).norm() < 1e-6, "{name}: {count} vs {zeros} − {poles}");
            assert_eq!(w.any_clockwise(), name.contains("clockwise") || name.contains("eight"), "{name}");
            let g = general_wound_points(&|z| f.eval(z), &|z| f.eval_d(z), &Hints::default(), &contour, &contour_as_regions(&contour), &mut Budget::new(50_000_000));
            assert_eq!(g.weighted_counts(), Some((zeros, poles)), "{name}: {:?}", g.warnings);
        }
        let circle = Contour::circle(C::new(0.0, 0.0), 1.0);
        let on = Rat { zeros: vec![C::new(0.0, 1.0)], poles: vec![C::new(0.2, 0.0)] };
        let (num, den) = on.coefficients();
        let w = rational_wound_points(&num, &den, &|z| on.eval_d(z), &circle).unwrap();
        assert_eq!(w.points, None);
        assert!(w.warnings.iter().any(|w| w.contains("a zero at") && w.contains("on the contour")), "{:?}", w.warnings);
    }
}

//! Method: the radius R₀ outside which a non-rational X is analytic, which
//! fixes the region of convergence |z| > R₀ of the causal inverse (common
//! practice: the causal sequence's transform converges outside its largest
//! singularity), and its check after the fact.
//!
//! R₀ is the largest modulus among the expression's structural candidates
//! (essential and branch points) and the poles, essential points and branch
//! points found by the singularity search of |z| < 10. The search keeps away
//! from an essential or branch point (a disc of radius `NEAR` about it), so
//! the points where the expression's rational denominators vanish (its pole
//! candidates) are classified one by one as well: a pole beside an essential
//! point, as in e^{0.5/z}/(1 − 0.3/z), is found that way, and a warning names
//! the discs searched only at those candidates. A singularity the
//! search could not see shows up afterwards: on a circle |z| = ρ > R₀ the
//! expansion of an X analytic outside has no positive powers, so a
//! coefficient c_m ρ^m (m = 1..3) above rounding means that X grows at
//! infinity or has a singularity outside the circle (Laurent's theorem,
//! common practice), and the inversion is refused.

use super::trapezoid::{ContourResult, POSITIVE_POWER_LIMIT};
use crate::budget::Budget;
use crate::contour::Contour;
use crate::error::Failure;
use crate::expr::Function;
use crate::singular::classify::classify_point_near;
use crate::singular::{find_singularities, Hints, Kind};
use crate::text;
use crate::C;

/// Radius of the disk searched for singularities.
pub const SEARCH_RADIUS: f64 = 10.0;
/// Radius about an essential or branch point that the region search leaves out
/// (0.02 × the disc's width 2·SEARCH_RADIUS, `singular::meromorphic`).
pub const NEAR: f64 = 0.04 * SEARCH_RADIUS;

/// What the search found.
#[derive(Debug, Clone, PartialEq)]
pub struct SingularBound {
    /// R₀: every singularity seen has |z| ≤ R₀.
    pub radius: f64,
    /// Poles found (location, order).
    pub poles: Vec<(C, u32)>,
    pub warnings: Vec<String>,
}

/// R₀ from the structural candidates in `hints`, a search of |z| < 10 and the
/// classification of each of `pole_candidates` (where denominators vanish)
/// that the search did not report.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::expr::Function;
/// use residuary::singular::Hints;
/// use residuary::transforms::z::singular_radius::search;
/// use residuary::C;
/// // 1/(z − 3): a simple pole at 3, which the search of |z| < 10 finds.
/// let f = Function::compile("1/(z-3)", "z", &[]).unwrap();
/// let r = search(&f, &Hints::default(), &[], &mut Budget::default());
/// assert!((r.radius - 3.0).abs() < 1e-8, "{}", r.radius);
/// // e^{0.5/z}/(1 − 0.3/z): the pole at 0.3 beside the essential point 0 (by construction).
/// let f = Function::compile("exp(0.5/z)/(1-0.3/z)", "z", &[]).unwrap();
/// let hints = Hints { essential_candidates: vec![C::new(0.0, 0.0)], ..Default::default() };
/// let r = search(&f, &hints, &[C::new(0.0, 0.0), C::new(0.3, 0.0)], &mut Budget::default());
/// assert!((r.radius - 0.3).abs() < 1e-12, "{}", r.radius);
/// ```
pub fn search(f: &Function, hints: &Hints, pole_candidates: &[C], budget: &mut Budget) -> SingularBound {
    let mut radius = hints
        .essential_candidates
        .iter()
        .chain(&hints.branch_candidates)
        .map(|z| z.norm())
        .filter(|r| r.is_finite())
        .fold(0.0, f64::max);
    let mut poles = Vec::new();
    let mut warnings = Vec::new();
    let eval = |z: C| f.eval(z);
    let eval_d = |z: C| f.eval_d(z);
    let disk = Contour::circle(C::new(0.0, 0.0), SEARCH_RADIUS);
    match find_singularities(&eval, &eval_d, &disk, hints, budget) {
        Ok(found) => {
            for p in &found.poles {
                radius = radius.max(p.at.norm());
                poles.push((p.at, p.order));
            }
            for z in found.essential.iter().chain(&found.branch_points) {
                radius = radius.max(z.norm());
            }
            let special: Vec<C> = found.essential.iter().chain(&found.branch_points).copied().collect();
            let more = classify_candidates(f, hints, pole_candidates, &special, &poles, budget);
            for &(z, order) in &more {
                radius = radius.max(z.norm());
                poles.push((z, order));
            }
            if !special.is_empty() {
                let at: Vec<String> = special.iter().map(|&z| text::place(z)).collect();
                warnings.push(format!(
                    "within {} of the essential or branch point{} {} poles were looked for only where the expression's denominators vanish; give \"singular_radius\" to be sure",
                    text::real(NEAR),
                    if special.len() > 1 { "s" } else { "" },
                    at.join(", ")
                ));
            }
        }
        Err(e) => warnings.push(format!(
            "the disk |z| < {SEARCH_RADIUS} was not searched for singularities ({e}); give \"singular_radius\" to be sure"
        )),
    }
    SingularBound { radius, poles, warnings }
}

/// The poles among `candidates` (in the searched disc, not already in `found`,
/// not one of the `special` points): each classified on its own small circles.
fn classify_candidates(
    f: &Function,
    hints: &Hints,
    candidates: &[C],
    special: &[C],
    found: &[(C, u32)],
    budget: &mut Budget,
) -> Vec<(C, u32)> {
    let eval = |z: C| f.eval(z);
    let same = |a: C, b: C| (a - b).norm() <= 1e-7 * (1.0 + a.norm());
    let mut out: Vec<(C, u32)> = Vec::new();
    for &c in candidates {
        if !(c.norm() < SEARCH_RADIUS)
            || special.iter().any(|&e| same(c, e))
            || found.iter().chain(&out).any(|&(p, _)| same(c, p))
        {
            continue;
        }
        let others: Vec<C> = special.iter().copied().chain(found.iter().map(|p| p.0)).collect();
        if let Ok(r) = classify_point_near(&eval, c, hints, &others, budget) {
            if let (Kind::Pole, Some(order)) = (r.kind, r.order) {
                out.push((c, order));
            }
        }
    }
    out
}

/// Refuse the contour values when the circles show positive powers of z.
pub fn check_no_positive_powers(contour: &ContourResult, radius: f64) -> Result<(), Failure> {
    if contour.positive_power_ratio <= POSITIVE_POWER_LIMIT {
        return Ok(());
    }
    Err(Failure::not_applicable(format!(
        "on |z| = {} X has positive powers of z (relative size {:.1e}): either X grows as |z| → ∞ (then it is not the transform of a causal sequence) or X has a singularity farther out than |z| = {}; give \"singular_radius\" at least as large as every singularity's modulus",
        text::real(contour.largest_radius),
        text::Sci(contour.positive_power_ratio),
        text::real(radius)
    )))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::transforms::z::trapezoid::inverse_z_trapezoid;

    #[test]
    fn the_search_finds_the_pole_the_candidates_miss() {
        // 1/(z − 3) + exp(1/z): the pole at |z| = 3 (by construction) bounds the singularities.
        let f = Function::compile("exp(1/z) + 1/(z-3)", "z", &[]).unwrap();
        let hints = Hints { essential_candidates: vec![C::new(0.0, 0.0)], ..Default::default() };
        let r = search(&f, &hints, &[], &mut Budget::default());
        assert!((r.radius - 3.0).abs() < 1e-8, "{}", r.radius);
        assert_eq!(r.poles.len(), 1);
        assert!((r.poles[0].0 - C::new(3.0, 0.0)).norm() < 1e-8);
    }

    #[test]
    fn a_singularity_outside_the_circles_is_refused() {
        // 1/(z − 3) sampled as if analytic for |z| > 0.5: inside |z| = 3 its expansion is
        // −Σ z^m/3^{m+1}, all positive powers (geometric series, common practice).
        let mut outside = |z: C| 1.0 / (z - 3.0);
        let c = inverse_z_trapezoid(&mut outside, 0.5, &[0, 1], 1 << 12, &mut Budget::default()).unwrap();
        assert!(c.largest_radius < 3.0, "{}", c.largest_radius);
        assert!(check_no_positive_powers(&c, 0.5).is_err());
        // z/(z − 0.5) ↔ 0.5^n has none (z-transform table, from memory).
        let mut inside = |z: C| z / (z - 0.5);
        let c = inverse_z_trapezoid(&mut inside, 0.5, &[0, 1], 1 << 12, &mut Budget::default()).unwrap();
        assert!(check_no_positive_powers(&c, 0.5).is_ok());
    }
}

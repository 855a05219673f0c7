//! Method: the radius R₀ outside which a non-rational X is analytic, which
//! fixes the region of convergence |z| > R₀ of the causal inverse (common
//! practice: the causal sequence's transform converges outside its largest
//! singularity), and its check after the fact.
//!
//! R₀ is the largest modulus among the expression's structural candidates
//! (essential and branch points) and the poles, essential points and branch
//! points found by the singularity search of |z| < 10. A singularity the
//! search could not see shows up afterwards: on a circle |z| = ρ > R₀ the
//! expansion of an X analytic outside has no positive powers, so a
//! coefficient c_m ρ^m (m = 1..3) above rounding means that X grows at
//! infinity or has a singularity outside the circle (Laurent's theorem,
//! common practice), and the inversion is refused.

use super::trapezoid::ContourResult;
use crate::budget::Budget;
use crate::contour::Contour;
use crate::error::Failure;
use crate::expr::Function;
use crate::singular::{find_singularities, Hints};
use crate::text;
use crate::C;

/// Radius of the disk searched for singularities.
pub const SEARCH_RADIUS: f64 = 10.0;
/// Largest |c_m|ρ^m / max|X| (m = 1..3) accepted as rounding noise.
const POSITIVE_POWER_LIMIT: f64 = 1e-9;

/// What the search found.
#[derive(Debug, Clone, PartialEq)]
pub struct SingularBound {
    /// R₀: every singularity seen has |z| ≤ R₀.
    pub radius: f64,
    /// Poles found (location, order).
    pub poles: Vec<(C, u32)>,
    pub warnings: Vec<String>,
}

/// R₀ from the structural candidates in `hints` and a search of |z| < 10.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::expr::Function;
/// use residuary::singular::Hints;
/// use residuary::transforms::z::singular_radius::search;
/// // 1/(z − 3): a simple pole at 3, which the search of |z| < 10 finds.
/// let f = Function::compile("1/(z-3)", "z", &[]).unwrap();
/// let r = search(&f, &Hints::default(), &mut Budget::default());
/// assert!((r.radius - 3.0).abs() < 1e-8, "{}", r.radius);
/// ```
pub fn search(f: &Function, hints: &Hints, budget: &mut Budget) -> SingularBound {
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
        }
        Err(e) => warnings.push(format!(
            "the disk |z| < {SEARCH_RADIUS} was not searched for singularities ({e}); give \"singular_radius\" to be sure"
        )),
    }
    SingularBound { radius, poles, warnings }
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
        let r = search(&f, &hints, &mut Budget::default());
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

//! Method: the singularity search (`singular::find_singularities`) tried on a
//! list of regions in turn, the first that succeeds giving the answer.
//!
//! The regions are alternatives that all cover the same points of interest
//! (`contour::covering`), largest first. A search can fail on one region for
//! reasons of that region alone (its boundary passes through, or very close
//! to, a zero or pole, so the argument principle along it cannot be
//! certified); a slightly different boundary then succeeds. Retrying on a
//! perturbed region is common practice. A spent budget is not a property of
//! the region: it ends the search at once.

use super::{find_singularities, Hints, RegionResult};
use crate::budget::Budget;
use crate::contour::Contour;
use crate::error::Failure;
use crate::C;

/// Zeros, poles, essential points and branch points of f on the first region
/// where the search succeeds; the last region's failure if none does, a
/// budget failure at once. `fd` gives f and f′.
///
/// ```
/// use residuary::{budget::Budget, contour::Contour, singular::{region_search::search_cover, Hints}, C};
/// let f = |z: C| (z - 0.5).inv();
/// let fd = |z: C| { let u = (z - 0.5).inv(); (u, -u * u) };
/// let regions = [Contour::circle(C::new(0.0, 0.0), 1.05), Contour::circle(C::new(0.0, 0.0), 1.0)];
/// let found = search_cover(&f, &fd, &regions, &Hints::default(), &mut Budget::new(1_000_000)).unwrap();
/// assert_eq!(found.poles.len(), 1);
/// assert!((found.poles[0].at - 0.5).norm() < 1e-10);
/// ```
pub fn search_cover(
    f: &dyn Fn(C) -> C,
    fd: &dyn Fn(C) -> (C, C),
    regions: &[Contour],
    hints: &Hints,
    budget: &mut Budget,
) -> Result<RegionResult, Failure> {
    let mut last = Failure::invalid("no region to search");
    for region in regions {
        match find_singularities(f, fd, region, hints, budget) {
            Ok(found) => return Ok(found),
            Err(e) if e.is_budget() => return Err(e),
            Err(e) => last = e,
        }
    }
    Err(last)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::error::FailureKind;
    use crate::reference::{check_method, naive_circle_integral};
    use std::f64::consts::PI;

    // Invented for the test: a simple pole at 1 and a double pole at −0.5i.
    fn f(z: C) -> C {
        ((z - 1.0) * (z + C::new(0.0, 0.5)).powi(2)).inv()
    }

    fn fd(z: C) -> (C, C) {
        let (a, b) = (z - 1.0, z + C::new(0.0, 0.5));
        let v = (a * b * b).inv();
        (v, -v * (a.inv() + b.inv() * 2.0))
    }

    #[test]
    fn the_first_region_that_succeeds_gives_the_residues() {
        let budget = || Budget::new(5_000_000);
        // The unit circle passes through the pole at 1: the search on it fails.
        let through = Contour::circle(C::new(0.0, 0.0), 1.0);
        let e = find_singularities(&f, &fd, &through, &Hints::default(), &mut budget()).unwrap_err();
        assert!(!e.is_budget(), "{e}");
        let regions = [through, Contour::circle(C::new(0.0, 0.0), 2.0)];
        let found = search_cover(&f, &fd, &regions, &Hints::default(), &mut budget()).unwrap();
        assert_eq!(found.poles.len(), 2, "{found:?}");
        // Slow reference: Res_a f = (1/2πi) ∮_{|z−a|=0.3} f dz by the naive trapezoidal sum.
        let cases: Vec<(&str, C)> = vec![("simple pole at 1", C::new(1.0, 0.0)), ("double pole at −0.5i", C::new(0.0, -0.5))];
        check_method(
            &cases,
            |a| {
                let p = found.poles.iter().find(|p| (p.at - a).norm() < 1e-6).expect("pole found");
                (p.residue.expect("a residue"), Some(p.error_estimate))
            },
            |a| naive_circle_integral(f, *a, 0.3, 400) / C::new(0.0, 2.0 * PI),
            1e-10,
        );
    }

    #[test]
    fn a_spent_budget_ends_the_search_and_no_region_is_an_invalid_request() {
        let regions = [Contour::circle(C::new(0.0, 0.0), 1.0), Contour::circle(C::new(0.0, 0.0), 2.0)];
        let e = search_cover(&f, &fd, &regions, &Hints::default(), &mut Budget::new(50)).unwrap_err();
        assert!(e.is_budget(), "{e}");
        let e = search_cover(&f, &fd, &[], &Hints::default(), &mut Budget::new(1000)).unwrap_err();
        assert_eq!(e.kind(), FailureKind::Invalid);
    }
}

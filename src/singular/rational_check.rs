//! An independent check of the exact rational residues: the trapezoidal rule
//! on a small circle around each pole, sampling the expression as typed.
//!
//! The exact path expands f into numerator and denominator coefficients; when
//! the expression was a product of many factors, that expansion can make the
//! roots far more sensitive to rounding than the factors were. Sampling the
//! compiled expression (which keeps the factors) on a circle around each
//! reported pole gives c₋₁ by a second, unrelated method. A disagreement
//! beyond both error estimates is reported, never hidden.
//!
//! Method: c₋₁ ≈ (1/N) Σ_k f(a + rω^k) rω^k, ω = e^{2πi/N}, N = 32, on the
//! circle of radius r = 0.15 × the distance to the nearest other pole, with
//! the N/2-point rule as the error estimate (L. N. Trefethen & J. A. C.
//! Weideman, "The exponentially convergent trapezoidal rule", SIAM Review 56,
//! 2014); the two values agree when they are consistent under `ways`' one
//! agreement rule.
//!
//! ```
//! use residuary::budget::Budget;
//! use residuary::singular::rational_check::check_residues;
//! use residuary::C;
//! // f = 1/((z − 1)(z + 2)): Res at 1 is 1/3 (simple-pole rule; common practice).
//! let f = |z: C| 1.0 / ((z - 1.0) * (z + 2.0));
//! let poles = [C::new(1.0, 0.0), C::new(-2.0, 0.0)];
//! let checks = check_residues(&f, &[(poles[0], C::new(1.0 / 3.0, 0.0), 1e-15)], &poles, &mut Budget::default());
//! let c = checks[0].as_ref().unwrap();
//! assert!(c.agrees && (c.sampled - C::new(1.0 / 3.0, 0.0)).norm() < 1e-13, "{c:?}");
//! ```

use crate::budget::Budget;
use crate::cauchy::circle::CircleSamples;
use crate::ways::{consistent, has_failed, Way, WayName};
use crate::C;

/// The outcome for one pole.
#[derive(Debug, Clone, PartialEq)]
pub struct Check {
    /// Residue by sampling f on circles around the reported location.
    pub sampled: C,
    /// Error estimate of `sampled`.
    pub sampled_error: f64,
    /// `|exact − sampled|`.
    pub difference: f64,
    /// True when the two agree within their error estimates (with a safety factor).
    pub agrees: bool,
}

/// Most poles checked in one request; beyond this the check is skipped.
pub const MAX_CHECKED: usize = 400;

/// Check each `(location, exact residue, exact error estimate)` against sampling.
/// `all_poles` are every pole of f (to keep each circle clear of the others).
/// Returns `None` for a pole that could not be checked (budget, non-finite samples,
/// or a sampled value whose own estimate exceeds it).
pub fn check_residues(
    f: &dyn Fn(C) -> C,
    poles: &[(C, C, f64)],
    all_poles: &[C],
    budget: &mut Budget,
) -> Vec<Option<Check>> {
    poles
        .iter()
        .take(MAX_CHECKED)
        .map(|&(at, exact, exact_error)| {
            let nearest = all_poles
                .iter()
                .map(|p| (p - at).norm())
                .filter(|&d| d > 0.0)
                .fold(f64::INFINITY, f64::min);
            let r = if nearest.is_finite() { 0.15 * nearest } else { 0.15 * at.norm().max(1.0) };
            let (sampled, sampled_error) = trapezoid_residue(f, at, r, budget)?;
            // A sampled value with no correct digit (its estimate exceeds it) is a failed
            // check, not evidence against the exact residue (the one rule, `ways`).
            if has_failed(&Way::new(WayName::TrapezoidalRule, sampled, sampled_error), 0.0) {
                return None;
            }
            let difference = (sampled - exact).norm();
            let agrees = consistent(
                &Way::new(WayName::Residues, exact, exact_error),
                &Way::new(WayName::TrapezoidalRule, sampled, sampled_error),
            );
            Some(Check { sampled, sampled_error, difference, agrees })
        })
        .chain(std::iter::repeat(None))
        .take(poles.len())
        .collect()
}

/// The checks of many poles summed up: a bound per pole, and how many disagree.
#[derive(Debug, Clone, PartialEq)]
pub struct CrossCheck {
    /// Per pole: the exact value is claimed no better than its difference from
    /// the sampled one plus the sampled value's own error (`None`: not checked).
    pub bounds: Vec<Option<f64>>,
    /// Poles whose two values are not consistent under the one agreement rule (`ways`).
    pub disagreeing: usize,
    /// The largest difference among those.
    pub worst: f64,
}

/// [`check_residues`] reduced to what a caller widens and warns with.
pub fn cross_check(f: &dyn Fn(C) -> C, poles: &[(C, C, f64)], all_poles: &[C], budget: &mut Budget) -> CrossCheck {
    let mut out = CrossCheck { bounds: Vec::with_capacity(poles.len()), disagreeing: 0, worst: 0.0 };
    for check in check_residues(f, poles, all_poles, budget) {
        out.bounds.push(check.as_ref().map(|c| c.difference + c.sampled_error));
        if let Some(c) = check.filter(|c| !c.agrees) {
            out.disagreeing += 1;
            out.worst = out.worst.max(c.difference);
        }
    }
    out
}

/// Samples per circle. The circle's radius is 0.15 of the distance to the
/// nearest other pole, so the aliasing error from the others is ~0.15^32
/// (1e-26) and that of the half rule, the error estimate, ~0.15^16 (7e-14).
const SAMPLES: usize = 32;

/// c₋₁ = (1/N) Σ f(a + r ω^k) r ω^k, with the difference from the N/2-point
/// rule (every other sample) as its error estimate (`cauchy::circle`).
fn trapezoid_residue(f: &dyn Fn(C) -> C, a: C, r: f64, budget: &mut Budget) -> Option<(C, f64)> {
    let samples = CircleSamples::take_finite(&mut |z| f(z), a, r, 0.0, SAMPLES, budget).ok()?.ok()?;
    Some(samples.residue_with_half_rule())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn agrees_on_a_well_conditioned_pole_and_flags_a_wrong_one() {
        // f = 1/((z−1)(z+2)): Res at 1 is 1/3, at −2 is −1/3 (simple-pole rule; common practice)
        let f = |z: C| 1.0 / ((z - 1.0) * (z + 2.0));
        let poles = [C::new(1.0, 0.0), C::new(-2.0, 0.0)];
        let claims = [(poles[0], C::new(1.0 / 3.0, 0.0), 1e-15), (poles[1], C::new(0.3, 0.0), 1e-15)];
        let checks = check_residues(&f, &claims, &poles, &mut Budget::default());
        let good = checks[0].as_ref().unwrap();
        assert!(good.agrees && good.difference < 1e-13, "{good:?}");
        let bad = checks[1].as_ref().unwrap();
        assert!(!bad.agrees && (bad.difference - (0.3 - -1.0 / 3.0f64).abs()).abs() < 1e-12, "{bad:?}");
    }

    /// Slow reference: the naive circle sum with 4096 points on a circle of
    /// another radius (`reference::naive_circle_coefficient`); the exact
    /// residues beside each case follow the simple/double-pole rules (common practice).
    #[test]
    fn sampled_residues_match_the_naive_circle_sum() {
        use crate::reference::{check_method, naive_circle_coefficient};
        type F = fn(C) -> C;
        let i = C::i();
        // (f, all its poles, the pole checked, its exact residue)
        let cases: [(&str, (F, Vec<C>, usize, C)); 3] = [
            // Res at 2i of 1/(z² + 4) = 1/(4i)
            ("1/(z²+4) at 2i", (|z| 1.0 / (z * z + 4.0), vec![2.0 * i, -2.0 * i], 0, 1.0 / (4.0 * i))),
            // Res at 1 of (z + 3)/((z − 1)²(z + 1)) = d/dz (z+3)/(z+1) at 1 = −2/4
            ("(z+3)/((z−1)²(z+1)) at 1", (|z| (z + 3.0) / ((z - 1.0).powi(2) * (z + 1.0)), vec![C::new(1.0, 0.0), C::new(-1.0, 0.0)], 0, C::new(-0.5, 0.0))),
            // Res at −1 of the same = (−1+3)/(−2)² = 1/2
            ("(z+3)/((z−1)²(z+1)) at −1", (|z| (z + 3.0) / ((z - 1.0).powi(2) * (z + 1.0)), vec![C::new(1.0, 0.0), C::new(-1.0, 0.0)], 1, C::new(0.5, 0.0))),
        ];
        check_method(
            &cases,
            |(f, poles, k, exact)| {
                let c = check_residues(f, &[(poles[*k], *exact, 1e-15)], poles, &mut Budget::default())[0].clone().unwrap();
                assert!(c.agrees, "{c:?}");
                (c.sampled, Some(c.sampled_error))
            },
            |(f, poles, k, _)| naive_circle_coefficient(f, poles[*k], 0.5, 4096, -1),
            1e-12,
        );
    }
}

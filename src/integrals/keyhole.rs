//! Method: the Mellin integral of a rational f by the keyhole contour
//! (L. V. Ahlfors, "Complex Analysis", 3rd ed., McGraw-Hill 1979, ch. 4 §5.3 —
//! from memory):
//!
//! ```text
//! ∫_0^∞ x^{α−1} f(x) dx = 2πi/(1 − e^{2πiα}) Σ_{a≠0} Res[z^{α−1} f(z), a],   arg z ∈ (0, 2π)
//! ```
//!
//! The contour runs out above the cut [0, ∞), around a large circle, back
//! below the cut (where z^{α−1} has gained the factor e^{2πi(α−1)}) and around
//! a small circle at 0. Both circles vanish exactly when −k < Re α < d, f ~ x^k
//! at 0 and f ~ x^{−d} at ∞ ([`Strip`]); α must not be an integer (then
//! there is no cut and the formula is 0/0). The residue of z^{α−1} f comes
//! from f's principal part and the Taylor series of z^{α−1} on that branch
//! (`integrals::product_residue::power_taylor`).

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use super::product_residue::{power_taylor, product_residue, ResidueSum, Role, Term};
use super::real_line::on_real_axis;
use crate::error::Failure;
use crate::singular::rational_poles::RationalAnalysis;
use crate::text;
use crate::C;
use std::f64::consts::PI;

/// The residue formula applied, in words.
pub const FORMULA: &str =
    "∫_0^∞ x^(α−1) f(x) dx = 2πi/(1 − e^(2πiα)) Σ_{a≠0} Res[z^(α−1) f(z), a], arg z ∈ (0, 2π) (keyhole contour)";

/// Number of leading (lowest-degree) zero coefficients of `p`, and the rest.
pub fn low_order(p: &[C]) -> (i64, Vec<C>) {
    let k = p.iter().take_while(|c| **c == C::new(0.0, 0.0)).count();
    (k as i64, p[k..].to_vec())
}

/// The convergence strip −k < Re α < d of ∫_0^∞ x^{α−1} f(x) dx.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Strip {
    /// k: f ~ x^k as x → 0.
    pub at_zero: i64,
    /// d: f ~ x^{−d} as x → ∞.
    pub at_infinity: i64,
}

/// Check that the keyhole formula applies to f = num/den (trimmed) and α:
/// α not an integer (`NotApplicable`), f not zero (`Invalid`), α inside the
/// strip (`Divergent`). Returns the strip.
pub fn check_alpha(num: &[C], den: &[C], alpha: C) -> Result<Strip, Failure> {
    if alpha.im == 0.0 && (alpha.re - alpha.re.round()).abs() <= 1e-12 * (1.0 + alpha.re.abs()) {
        return Err(Failure::not_applicable(format!(
            "alpha = {} is an integer: then x^(alpha−1) has no branch cut and the keyhole formula 2πi/(1 − e^(2πiα)) Σ Res degenerates (0/0); use a non-integer alpha (e.g. {} + 0.5) or, for an even integrand, kind \"line\"",
            alpha.re, alpha.re
        )));
    }
    if num.is_empty() {
        return Err(Failure::invalid("f is identically zero; the integral is 0"));
    }
    let k = low_order(num).0 - low_order(den).0;
    let d = (den.len() as i64 - 1) - (num.len() as i64 - 1);
    if !(alpha.re + (k as f64) > 0.0 && alpha.re < d as f64) {
        return Err(Failure::divergent(format!(
            "∫_0^∞ x^(α−1) f(x) dx diverges: here f ~ x^{k} near 0 and ~ x^{} at infinity, so it converges only for {} < Re α < {d}, and Re α = {}",
            -d, -k, alpha.re
        )));
    }
    Ok(Strip { at_zero: k, at_infinity: d })
}

/// The radii to draw the keyhole with: (R, ε), R beyond every pole, ε inside
/// every pole but the branch point 0 (the derivation lets R → ∞, ε → 0).
pub fn drawn_radii(a: &RationalAnalysis) -> (f64, f64) {
    let norms = a.poles.iter().map(|p| p.at.norm()).filter(|r| *r > 0.0);
    let (lo, hi) = norms.fold((f64::INFINITY, 0.0_f64), |(lo, hi), r| (lo.min(r), hi.max(r)));
    let outer = 1.0 + 1.25 * hi;
    let inner = if lo.is_finite() { (0.5 * lo).min(0.25 * outer) } else { 0.25 * outer };
    (outer, inner)
}

/// The keyhole residue sum for the rational f analysed in `a` (α already
/// checked by [`check_alpha`]); a pole on the positive real axis is refused
/// (`Divergent`), a pole at 0 is the branch point and is skipped.
///
/// ```
/// use residuary::integrals::keyhole::keyhole_residues;
/// use residuary::singular::rational_poles::analyse_rational;
/// use residuary::C;
/// // ∫_0^∞ x^{α−1}/(1 + x) dx = π/sin(πα) (DLMF 5.12.3 with 5.5.3).
/// let one = C::new(1.0, 0.0);
/// let a = analyse_rational(&[one], &[one, one]).unwrap();
/// let s = keyhole_residues(&a, C::new(0.25, 0.0)).unwrap();
/// let exact = std::f64::consts::PI / (std::f64::consts::PI / 4.0).sin();
/// assert!((s.value - C::new(exact, 0.0)).norm() <= s.error + 1e-14);
/// ```
pub fn keyhole_residues(a: &RationalAnalysis, alpha: C) -> Result<ResidueSum, Failure> {
    let scale = a.poles.iter().map(|p| p.at.norm()).fold(1.0, f64::max);
    let mut terms = Vec::new();
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    let two_pi_i = C::new(0.0, 2.0 * PI);
    let factor = two_pi_i / (C::new(1.0, 0.0) - (two_pi_i * alpha).exp());
    for p in &a.poles {
        if p.at.norm() <= 1e-13 * scale {
            continue; // the branch point z = 0: handled by the convergence condition
        }
        if p.at.re > 0.0 && on_real_axis(p, scale) {
            return Err(Failure::divergent(format!(
                "f has a pole at x = {} on the positive real axis: the Mellin integral diverges there",
                text::value(C::new(p.at.re, 0.0))
            )));
        }
        let taylor = power_taylor(alpha - 1.0, p.at, p.order as usize);
        let (res, res_err) = product_residue(&p.principal_part, &p.principal_part_errors, &taylor);
        sum += factor * res;
        err += factor.norm() * res_err;
        terms.push(Term { at: p.at, residue: res, weight: factor, error: res_err, role: Role::KeyholePole { order: p.order } });
    }
    let rounding = 16.0 * f64::EPSILON * factor.norm() * terms.iter().map(|t| t.residue.norm()).sum::<f64>();
    Ok(ResidueSum { terms, value: sum, error: err + rounding })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::error::FailureKind;
    use crate::reference::{check_method, simpson};
    use crate::singular::rational_poles::analyse_rational;

    fn c(re: f64) -> C {
        C::new(re, 0.0)
    }

    #[test]
    fn keyhole_sums_match_plain_quadrature_in_log_variable() {
        // (name, num, den ascending, α); the slow reference is Simpson on
        // ∫ e^{αu} f(e^u) du over |u| ≤ 120, where the integrands are below e^{−30}.
        let cases: Vec<(&str, (Vec<C>, Vec<C>, C))> = vec![
            ("1/(1+x), α = 0.3", (vec![c(1.0)], vec![c(1.0), c(1.0)], c(0.3))),
            ("1/(1+x)², α = 0.5 (double pole at −1)", (vec![c(1.0)], vec![c(1.0), c(2.0), c(1.0)], c(0.5))),
            ("1/(x²+2x+2), α = 0.7 (poles −1 ± i)", (vec![c(1.0)], vec![c(2.0), c(2.0), c(1.0)], c(0.7))),
            ("x/(1+x)³, α = 0.4 − 0.3i", (vec![c(0.0), c(1.0)], vec![c(1.0), c(3.0), c(3.0), c(1.0)], C::new(0.4, -0.3))),
        ];
        check_method(
            &cases,
            |(num, den, alpha)| {
                check_alpha(num, den, *alpha).unwrap();
                let s = keyhole_residues(&analyse_rational(num, den).unwrap(), *alpha).unwrap();
                (s.value, Some(s.error))
            },
            |(num, den, alpha)| {
                let g = |u: f64| {
                    let x = c(u.exp());
                    (*alpha * u).exp() * crate::poly::eval(num, x) / crate::poly::eval(den, x)
                };
                simpson(g, -120.0, 120.0, 400_000)
            },
            1e-8,
        );
        // Closed form for the second case: B(α, 2 − α) = (1 − α) π / sin(πα) (DLMF 5.12.1, 5.5.3).
        let s = keyhole_residues(&analyse_rational(&[c(1.0)], &[c(1.0), c(2.0), c(1.0)]).unwrap(), c(0.5)).unwrap();
        assert!((s.value - c(0.5 * PI)).norm() <= s.error + 1e-14, "{}", s.value);
    }

    #[test]
    fn the_strip_and_integer_alpha_are_enforced() {
        let (one, zero) = (c(1.0), c(0.0));
        // 1/(x(1+x)²): f ~ x^{−1} at 0, x^{−3} at ∞, so 1 < Re α < 3 (from memory).
        let den = [zero, one, c(2.0), one];
        assert_eq!(check_alpha(&[one], &den, c(2.5)).unwrap(), Strip { at_zero: -1, at_infinity: 3 });
        assert_eq!(check_alpha(&[one], &den, c(0.5)).unwrap_err().kind(), FailureKind::Divergent);
        assert_eq!(check_alpha(&[one], &[one, one], c(2.0)).unwrap_err().kind(), FailureKind::NotApplicable);
        // A pole at x = 2 on the cut: (x − 2)(x + 1) = x² − x − 2.
        let a = analyse_rational(&[one], &[c(-2.0), c(-1.0), one]).unwrap();
        assert_eq!(keyhole_residues(&a, c(0.5)).unwrap_err().kind(), FailureKind::Divergent);
    }
}

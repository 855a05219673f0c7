//! Method: ∫ over ℝ of f(x), or of f(x) e^{iωx}, by residues in the closing
//! half-plane (L. V. Ahlfors, "Complex Analysis", 3rd ed., McGraw-Hill 1979,
//! ch. 4 §5.3 — from memory):
//!
//! ```text
//! ω ≥ 0:  ∫ f(x) e^{iωx} dx =  2πi Σ_{Im a > 0} Res[f e^{iωz}, a] + πi Σ_{a real} Res[f e^{iωz}, a]
//! ω < 0:  ∫ f(x) e^{iωx} dx = −2πi Σ_{Im a < 0} Res[f e^{iωz}, a] − πi Σ_{a real} Res[f e^{iωz}, a]
//! ```
//!
//! The arcs vanish when f decays like 1/x² (ω = 0) or f → 0 (ω ≠ 0, Jordan's
//! lemma); see `singular::decay`. Simple poles on the real axis give the
//! Cauchy principal value, each with half weight (the small half circle
//! around it; Ahlfors, as above). The residue of f·e^{iωz} comes from f's
//! principal part (`integrals::product_residue`). Two sources of poles:
//! a rational f's exact partial fractions ([`rational_line_residues`]), or
//! poles of a general f located numerically in a box ([`general_line_residues`]).

use super::product_residue::{exp_taylor, product_residue, ResidueSum, Role, Term};
use crate::budget::Budget;
use crate::contour::Contour;
use crate::error::Failure;
use crate::singular::decay::LineDecay;
use crate::singular::rational_poles::{PoleInfo, RationalAnalysis};
use crate::singular::{find_singularities, Found, Hints, RegionResult};
use crate::text;
use crate::C;
use std::f64::consts::PI;

pub use crate::singular::decay::half_plane;

/// The residue formula applied, in words.
pub fn formula(omega: f64, principal_value: bool) -> String {
    let sign = if omega < 0.0 { "−" } else { "+" };
    let pv = if principal_value {
        format!(" {sign} πi Σ Res on the real axis (principal value)")
    } else {
        String::new()
    };
    if omega == 0.0 {
        format!("∫ f(x) dx = 2πi Σ_{{Im a > 0}} Res f{pv}")
    } else if omega > 0.0 {
        format!("∫ f(x) e^(iωx) dx = 2πi Σ_{{Im a > 0}} Res[f e^(iωz)]{pv} (Jordan's lemma, ω > 0)")
    } else {
        format!("∫ f(x) e^(iωx) dx = −2πi Σ_{{Im a < 0}} Res[f e^(iωz)]{pv} (Jordan's lemma, ω < 0)")
    }
}

/// A pole on the real axis (within what its location error allows), judged
/// relative to `scale`, the size of the largest pole.
pub fn on_real_axis(p: &PoleInfo, scale: f64) -> bool {
    p.at.im.abs() <= (10.0 * p.location_error).max(1e-12 * scale.max(p.at.norm()))
}

/// Taylor coefficients of the factor e^{iωz} at a (just 1 when ω = 0).
fn factor_taylor(omega: f64, a: C, n: usize) -> Vec<C> {
    if omega == 0.0 {
        let mut t = vec![C::new(0.0, 0.0); n];
        t[0] = C::new(1.0, 0.0);
        t
    } else {
        exp_taylor(omega, a, n)
    }
}

/// The residue side for a rational f.
#[derive(Debug, Clone, PartialEq)]
pub struct LineResidues {
    pub sum: ResidueSum,
    /// Simple poles on the real axis: (x, residue of f e^{iωz}). Non-empty
    /// means the value is a principal value.
    pub real_poles: Vec<(f64, C)>,
    /// No pole lies at |z| ≥ this: where the quadrature's tails may start.
    pub clear_beyond: f64,
}

impl LineResidues {
    pub fn principal_value(&self) -> bool {
        !self.real_poles.is_empty()
    }
}

/// The residue sum of the module doc for the rational f analysed in `a`.
/// A pole of order ≥ 2 on the real axis is refused (`Divergent`); poles very
/// near the axis and principal values are noted in `warnings`.
///
/// ```
/// use residuary::integrals::real_line::rational_line_residues;
/// use residuary::singular::rational_poles::analyse_rational;
/// use residuary::C;
/// // ∫ e^{2ix}/(x² + 1) dx = π e^{−2} (the cosine transform of a Lorentzian; common practice).
/// let one = C::new(1.0, 0.0);
/// let a = analyse_rational(&[one], &[one, C::new(0.0, 0.0), one]).unwrap();
/// let r = rational_line_residues(&a, 2.0, &mut Vec::new()).unwrap();
/// let exact = std::f64::consts::PI * (-2f64).exp();
/// assert!((r.sum.value - C::new(exact, 0.0)).norm() <= r.sum.error + 1e-15);
/// assert!(!r.principal_value());
/// ```
pub fn rational_line_residues(
    a: &RationalAnalysis,
    omega: f64,
    warnings: &mut Vec<String>,
) -> Result<LineResidues, Failure> {
    let sigma = half_plane(omega);
    let pole_scale = a.poles.iter().map(|p| p.at.norm()).fold(0.0, f64::max);
    let mut terms = Vec::new();
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    let mut real_poles: Vec<(f64, C)> = Vec::new();
    for p in &a.poles {
        let taylor = factor_taylor(omega, p.at, p.order as usize);
        let (res, res_err) = product_residue(&p.principal_part, &p.principal_part_errors, &taylor);
        let on_axis = on_real_axis(p, pole_scale);
        let (weight, role) = if on_axis {
            if p.order > 1 {
                return Err(Failure::divergent(format!(
                    "f has a pole of order {} at x = {} on the real axis: the integral diverges, even as a principal value; move the pole off the axis (e.g. add a small damping)",
                    p.order,
                    text::value(C::new(p.at.re, 0.0))
                )));
            }
            real_poles.push((p.at.re, res));
            (C::new(0.0, PI * sigma), Role::RealAxisPole)
        } else if p.at.im * sigma > 0.0 {
            (C::new(0.0, 2.0 * PI * sigma), Role::HalfPlanePole { order: p.order, upper: sigma > 0.0 })
        } else {
            continue;
        };
        if !on_axis && p.at.im.abs() < 1e-3 * (1.0 + p.at.norm()) {
            warnings.push(format!(
                "a pole at {} lies very close to the real axis: the integrand has a sharp peak there and the quadrature converges slowly",
                text::value(p.at)
            ));
        }
        sum += weight * res;
        err += weight.norm() * res_err;
        terms.push(Term { at: p.at, residue: res, weight, error: res_err, role });
    }
    if !real_poles.is_empty() {
        warnings.push(
            "f has simple poles on the real axis: the integral exists only as a Cauchy principal value, which is what is computed (each real pole adds ±πi × its residue)"
                .into(),
        );
    }
    let rounding = 8.0 * f64::EPSILON * terms.iter().map(|t| t.residue.norm() * 2.0 * PI).sum::<f64>();
    let reach = a.poles.iter().map(|p| p.at.norm()).fold(0.0, f64::max);
    Ok(LineResidues {
        sum: ResidueSum { terms, value: sum, error: err + rounding },
        real_poles,
        clear_beyond: 1.0 + 1.25 * reach,
    })
}

/// The residue sum for a general f (`fd` gives f and f′): singularities are
/// searched in the box |Re z| ≤ R, 0 < σ Im z ≤ R (R = `decay.box_radius`).
/// `Ok(None)` (with the reason in `warnings`) when the residue theorem does
/// not give the integral: the arcs do not decay, a branch point or essential
/// singularity lies in the half-plane, a principal part is unknown, or the
/// search failed. A pole on the real axis is refused (`Divergent`).
pub fn general_line_residues(
    f: &dyn Fn(C) -> C,
    fd: &dyn Fn(C) -> (C, C),
    hints: &Hints,
    omega: f64,
    decay: &LineDecay,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<Option<ResidueSum>, Failure> {
    let sigma = half_plane(omega);
    let r = decay.box_radius;
    let half = if sigma > 0.0 { "upper" } else { "lower" };
    if !decay.arcs_decay {
        warnings.push(format!(
            "|f| does not decay on the large half circles |z| = {}, {} in the {half} half-plane, so the residue theorem does not give the real integral; only the quadrature is computed",
            2.0 * r,
            4.0 * r,
        ));
        return Ok(None);
    }
    let margin = 0.02 * r;
    let region = if sigma > 0.0 {
        Contour::rectangle(C::new(-r, -margin), C::new(r, r))
    } else {
        Contour::rectangle(C::new(-r, -r), C::new(r, margin))
    };
    let found = match find_singularities(f, fd, &region, hints, budget) {
        Err(e) if e.is_budget() => return Err(e),
        Err(e) => {
            warnings.push(format!(
                "the singularities could not be located, so the residue side is not computed: {e}"
            ));
            return Ok(None);
        }
        Ok(found) => found,
    };
    warnings.extend(found.warnings.iter().map(|w| format!("singularity search: {w}")));
    warnings.push(format!(
        "f is not rational: only singularities in the box |Re z| ≤ {r}, {} were searched (f has fallen to 1% of its peak beyond |x| = {r} and was checked to decay on the half circles |z| = {}, {})",
        if sigma > 0.0 { format!("0 < Im z ≤ {r}") } else { format!("−{r} ≤ Im z < 0") },
        2.0 * r,
        4.0 * r
    ));
    located_sum(&found, omega, sigma, warnings)
}

/// Σ 2πiσ Res[f e^{iωz}] over the located poles in the half-plane σ.
fn located_sum(
    found: &RegionResult,
    omega: f64,
    sigma: f64,
    warnings: &mut Vec<String>,
) -> Result<Option<ResidueSum>, Failure> {
    if let Some(b) = found.branch_points.iter().find(|b| b.im * sigma > 0.0) {
        warnings.push(format!(
            "f has a branch point at {}, in the half-plane the contour closes in: the residue theorem does not apply",
            text::value(*b)
        ));
        return Ok(None);
    }
    if let Some(e) = found.essential.iter().find(|e| e.im * sigma > 0.0) {
        warnings.push(format!(
            "f has an essential singularity at {}: its residue with the factor e^(iωz) is not computed, so the residue side is not available",
            text::value(*e)
        ));
        return Ok(None);
    }
    let mut terms = Vec::new();
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    for p in &found.poles {
        if p.at.im.abs() <= 1e-6 * (1.0 + p.at.norm()) {
            return Err(Failure::divergent(format!(
                "f has a pole at about x = {} on the real axis: the integral diverges (principal values are computed for rational f only)",
                text::value(C::new(p.at.re, 0.0))
            )));
        }
        if p.at.im * sigma <= 0.0 {
            continue;
        }
        let Some(term) = located_term(p, omega, sigma) else {
            warnings.push(format!(
                "the principal part of the pole at {} is not known, so the residue side is not available",
                text::value(p.at)
            ));
            return Ok(None);
        };
        sum += term.weight * term.residue;
        err += term.weight.norm() * term.error;
        terms.push(term);
    }
    Ok(Some(ResidueSum { terms, value: sum, error: err + 8.0 * f64::EPSILON * sum.norm() }))
}

/// One located pole's term, or `None` when its principal part is not known.
fn located_term(p: &Found, omega: f64, sigma: f64) -> Option<Term> {
    if p.principal_part.len() < p.order as usize {
        return None;
    }
    let taylor = factor_taylor(omega, p.at, p.order as usize);
    let errors = vec![p.error_estimate; p.principal_part.len()];
    let (res, res_err) = product_residue(&p.principal_part, &errors, &taylor);
    Some(Term {
        at: p.at,
        residue: res,
        weight: C::new(0.0, 2.0 * PI * sigma),
        error: res_err,
        role: Role::LocatedPole { order: p.order },
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::error::FailureKind;
    use crate::reference::{check_method, simpson_folded};
    use crate::singular::decay::line_decay;
    use crate::singular::rational_poles::analyse_rational;

    fn c(re: f64) -> C {
        C::new(re, 0.0)
    }

    /// Slow reference: ∫ f(x) e^{iωx} dx over [p − L, p + L], folded about p.
    fn folded_simpson(f: &dyn Fn(C) -> C, omega: f64, p: f64, l: f64) -> C {
        simpson_folded(|x| f(c(x)) * C::new(0.0, omega * x).exp(), p, l, 400_000)
    }

    #[test]
    fn rational_sums_match_plain_quadrature() {
        // (name, num, den ascending, ω, pole to fold about); the integrands fall like 1/x³ or faster.
        let cases: Vec<(&str, (Vec<C>, Vec<C>, f64, f64))> = vec![
            // 1/((x²+1)(x²+4)) = 1/(x⁴ + 5x² + 4)
            ("1/((x²+1)(x²+4))", (vec![c(1.0)], vec![c(4.0), c(0.0), c(5.0), c(0.0), c(1.0)], 0.0, 0.0)),
            ("same, ω = 1.5", (vec![c(1.0)], vec![c(4.0), c(0.0), c(5.0), c(0.0), c(1.0)], 1.5, 0.0)),
            ("same, ω = −0.7", (vec![c(1.0)], vec![c(4.0), c(0.0), c(5.0), c(0.0), c(1.0)], -0.7, 0.0)),
            // 1/((x−1)(x²+4)) = 1/(x³ − x² + 4x − 4): a principal value at x = 1
            ("PV 1/((x−1)(x²+4))", (vec![c(1.0)], vec![c(-4.0), c(4.0), c(-1.0), c(1.0)], 0.0, 1.0)),
            // (x+2)/((x²+1)²): a double pole at ±i
            ("(x+2)/(x²+1)², ω = 2", (vec![c(2.0), c(1.0)], vec![c(1.0), c(0.0), c(2.0), c(0.0), c(1.0)], 2.0, 0.0)),
        ];
        check_method(
            &cases,
            |(num, den, omega, _)| {
                let a = analyse_rational(num, den).unwrap();
                let r = rational_line_residues(&a, *omega, &mut Vec::new()).unwrap();
                (r.sum.value, Some(r.sum.error))
            },
            |(num, den, omega, p)| {
                let f = |z: C| crate::poly::eval(num, z) / crate::poly::eval(den, z);
                folded_simpson(&f, *omega, *p, 2000.0)
            },
            1e-6,
        );
    }

    #[test]
    fn real_poles_give_half_weight_and_double_real_poles_are_refused() {
        // PV ∫ dx/((x−1)(x²+4)): residue at 1 is 1/5 (common practice), weight πi.
        let a = analyse_rational(&[c(1.0)], &[c(-4.0), c(4.0), c(-1.0), c(1.0)]).unwrap();
        let mut w = Vec::new();
        let r = rational_line_residues(&a, 0.0, &mut w).unwrap();
        assert!(r.principal_value());
        let t = r.sum.terms.iter().find(|t| t.role == Role::RealAxisPole).unwrap();
        assert!((t.residue - c(0.2)).norm() < 1e-14 && (t.weight - C::new(0.0, PI)).norm() < 1e-15);
        assert!(w.iter().any(|s| s.contains("principal value")));
        // 1/(x−1)²(x²+1): order 2 on the axis diverges even as a principal value.
        let den = crate::poly::mul(&[c(1.0), c(-2.0), c(1.0)], &[c(1.0), c(0.0), c(1.0)]);
        let a = analyse_rational(&[c(1.0)], &den).unwrap();
        let e = rational_line_residues(&a, 0.0, &mut Vec::new()).unwrap_err();
        assert_eq!(e.kind(), FailureKind::Divergent);
    }

    #[test]
    fn located_poles_of_a_general_f_match_plain_quadrature() {
        // e^{iz/2}/(z² + 1)²: not rational as typed; the reference integrates on the line.
        let f = |z: C| (C::new(0.0, 0.5) * z).exp() / ((z * z + 1.0) * (z * z + 1.0));
        let fd = |z: C| {
            let q = z * z + 1.0;
            let v = (C::new(0.0, 0.5) * z).exp() / (q * q);
            (v, v * (C::new(0.0, 0.5) - 4.0 * z / q))
        };
        let cases = [("e^{iz/2}/(z²+1)²", ())];
        check_method(
            &cases,
            |_| {
                let decay = line_decay(&f, 0.0).unwrap();
                let s = general_line_residues(&f, &fd, &Hints::default(), 0.0, &decay, &mut Budget::new(2_000_000), &mut Vec::new())
                    .unwrap()
                    .expect("a residue side");
                (s.value, Some(s.error))
            },
            |_| folded_simpson(&f, 0.0, 0.0, 2000.0),
            1e-6,
        );
    }
}

//! Method: the inverse Laplace transform of F(s) = Σₖ e^{−τₖ s}Gₖ(s), Gₖ
//! rational, τₖ ≥ 0 (`delay_terms`), term by term with the shift theorem
//! L[g(t − τ)H(t − τ)] = e^{−τs}G(s) (common practice):
//! f(t) = Σₖ gₖ(t − τₖ)·H(t − τₖ), each gₖ the residue sum of Gₖ
//! (`residues::residue_sum`). At a jump t = τₖ the Bromwich integral gives the
//! mean of the one-sided limits (Dirichlet's theorem for the inversion
//! integral, common practice): that is the value returned, i.e. H(0) = ½.
//! A polynomial part of Gₖ is an impulse δ^{(j)}(t − τₖ): it is in the closed
//! form, and zero at every t ≠ τₖ.
//!
//! The independent way is the fixed Talbot inversion of each Gₖ (less its
//! polynomial part) at t − τₖ (`fixed_talbot`); it is not computed at times
//! within `JUMP_MARGIN`·max(1, τₖ) of a jump, where the contour for t − τₖ → 0
//! widens without bound.
//!
//! Closed form: each gₖ written by `residues::closed_form` with t replaced by
//! t − τₖ and multiplied by the Heaviside step `H(t - τ)`, e.g.
//! `exp(-s)/(s^2+1)` ↦ `H(t - 1)*sin(t - 1)`.
//!
//! ```
//! use residuary::transforms::laplace::delay_terms::delay_terms;
//! use residuary::transforms::laplace::delayed_residues::{analyse_terms, closed_form, residue_series};
//! // (1 − e^{−s})/s is the unit pulse on (0, 1) (transform table, from memory).
//! let parts = analyse_terms(&delay_terms("(1-exp(-s))/s", "s", &[]).unwrap()).unwrap();
//! assert_eq!(closed_form(&parts), "1 - H(t - 1)");
//! let f = residue_series(&parts, &[0.5, 1.0, 2.0]);
//! assert_eq!([f[0].0.re, f[1].0.re, f[2].0.re], [1.0, 0.5, 0.0]);
//! ```

use super::delay_terms::DelayTerm;
use super::fixed_talbot::{invert, plan, TalbotError, NODES};
use super::residues::{has_real_coefficients, residue_sum};
use crate::budget::{Budget, BudgetExceeded};
use crate::error::Failure;
use crate::singular::rational_poles::{analyse_rational_polished, RationalAnalysis};
use crate::text;
use crate::C;

/// Relative distance max(1, τ)·this from a jump within which the contour way is not computed.
pub const JUMP_MARGIN: f64 = 1e-6;

/// One analysed term e^{−τs}G(s).
#[derive(Debug, Clone)]
pub struct DelayedPart {
    pub tau: f64,
    pub num: Vec<C>,
    pub den: Vec<C>,
    pub analysis: RationalAnalysis,
    /// G has real coefficients (g is real).
    pub real: bool,
}

/// The poles and principal parts of every Gₖ.
pub fn analyse_terms(terms: &[DelayTerm]) -> Result<Vec<DelayedPart>, Failure> {
    terms
        .iter()
        .map(|k| {
            let (num, den) = (k.g.num.clone(), k.g.den.clone());
            let as_typed = |s: C| {
                let (n, d) = (crate::poly::eval(&num, s), crate::poly::eval(&den, s));
                let (dn, dd) = (
                    crate::poly::eval(&crate::poly::derivative(&num), s),
                    crate::poly::eval(&crate::poly::derivative(&den), s),
                );
                (n / d, (dn * d - n * dd) / (d * d))
            };
            let analysis = analyse_rational_polished(&num, &den, &as_typed)?;
            Ok(DelayedPart { tau: k.tau, real: has_real_coefficients(&num, &den), num, den, analysis })
        })
        .collect()
}

/// f(t) = Σ gₖ(t − τₖ)H(t − τₖ), H(0) = ½, with the summed error estimates.
pub fn residue_value(parts: &[DelayedPart], t: f64) -> (C, f64) {
    let mut value = C::new(0.0, 0.0);
    let mut error = 0.0;
    for p in parts {
        let u = t - p.tau;
        if u < 0.0 {
            continue;
        }
        let (v, e) = residue_sum(&p.analysis, u);
        let weight = if u == 0.0 { 0.5 } else { 1.0 };
        value += weight * v;
        error += weight * e;
    }
    (value, error.min(f64::MAX))
}

/// The residue way at every time.
pub fn residue_series(parts: &[DelayedPart], times: &[f64]) -> Vec<(C, f64)> {
    times.iter().map(|&t| residue_value(parts, t)).collect()
}

/// The contour way at every time: Σ over started terms of Talbot[Gₖ − qₖ](t − τₖ),
/// with the summed estimates; `None` near a jump or where a term was not finite.
pub fn contour_series(parts: &[DelayedPart], times: &[f64], budget: &mut Budget) -> Result<Vec<Option<(C, f64)>>, BudgetExceeded> {
    let mut out = Vec::with_capacity(times.len());
    'times: for &t in times {
        let mut value = C::new(0.0, 0.0);
        let mut error = 0.0;
        for p in parts {
            let u = t - p.tau;
            if u.abs() <= JUMP_MARGIN * p.tau.max(1.0) {
                out.push(None);
                continue 'times;
            }
            if u < 0.0 {
                continue;
            }
            let q = &p.analysis.polynomial_part;
            let mut g = |s: C| crate::poly::eval(&p.num, s) / crate::poly::eval(&p.den, s) - crate::poly::eval(q, s);
            let poles: Vec<C> = p.analysis.poles.iter().map(|x| x.at).collect();
            match invert(&mut g, u, plan(u, &poles, NODES), budget) {
                Ok(v) => {
                    value += v.value;
                    error += v.error_estimate;
                }
                Err(TalbotError::NotFinite { .. }) => {
                    out.push(None);
                    continue 'times;
                }
                Err(TalbotError::Budget(e)) => return Err(e),
            }
        }
        out.push(Some((value, error.min(f64::MAX))));
    }
    Ok(out)
}

/// True when some Gₖ has a polynomial part (impulses at t = τₖ).
pub fn has_impulses(parts: &[DelayedPart]) -> bool {
    parts.iter().any(|p| p.analysis.polynomial_part.iter().any(|c| c.norm() > 0.0))
}

/// f(t) as text: `g₀(t) + H(t - τ₁)*g₁(t - τ₁) + …`, impulses as `δ(t - τ)`.
pub fn closed_form(parts: &[DelayedPart]) -> String {
    let mut out = String::new();
    for p in parts {
        let mut smooth = p.analysis.clone();
        smooth.polynomial_part.clear();
        let mut impulses = p.analysis.clone();
        impulses.poles.clear();
        let shift = |s: String| if p.tau == 0.0 { s } else { shifted(&s, &text::real(p.tau)) };
        let g = shift(super::residues::closed_form(&smooth, p.real));
        if g != "0" {
            let step = format!("H(t - {})", text::real(p.tau));
            let (neg, body) = match g.strip_prefix('-') {
                Some(rest) if single_term(rest) => (true, rest.to_string()),
                _ => (false, g.clone()),
            };
            // A leading numeric factor goes before the step: `2*H(t - 1)*(t - 1)`.
            let (factor, rest) = match body.split_once('*') {
                Some((k, rest)) if k.parse::<f64>().is_ok() && single_term(&body) => (format!("{k}*"), rest.to_string()),
                None if body.parse::<f64>().is_ok() && body != "1" => (format!("{body}*"), "1".to_string()),
                _ => (String::new(), body.clone()),
            };
            let term = match (p.tau == 0.0, rest.as_str()) {
                (true, _) => body.clone(),
                (false, "1") => format!("{factor}{step}"),
                (false, _) if single_term(&rest) => format!("{factor}{step}*{rest}"),
                (false, _) => format!("{factor}{step}*({rest})"),
            };
            push(&mut out, neg, &term);
        }
        if !impulses.polynomial_part.is_empty() {
            let d = shift(super::residues::closed_form(&impulses, p.real));
            if d != "0" {
                push(&mut out, false, &d);
            }
        }
    }
    if out.is_empty() {
        "0".into()
    } else {
        out
    }
}

fn push(out: &mut String, neg: bool, term: &str) {
    match (out.is_empty(), neg) {
        (true, false) => out.push_str(term),
        (true, true) => {
            out.push('-');
            out.push_str(term);
        }
        (false, false) => {
            out.push_str(" + ");
            out.push_str(term);
        }
        (false, true) => {
            out.push_str(" - ");
            out.push_str(term);
        }
    }
}

/// No `+`/`-` between terms outside parentheses.
fn single_term(s: &str) -> bool {
    let mut depth = 0i32;
    for w in s.as_bytes().windows(3) {
        match w[0] {
            b'(' => depth += 1,
            b')' => depth -= 1,
            _ => {}
        }
        if depth == 0 && w[0] == b' ' && (w[1] == b'+' || w[1] == b'-') && w[2] == b' ' {
            return false;
        }
    }
    true
}

/// `text` (a function of t) with every free `t` replaced by `t - tau`.
fn shifted(text: &str, tau: &str) -> String {
    let chars: Vec<char> = text.chars().collect();
    let word = |c: Option<&char>| c.is_some_and(|c| c.is_alphanumeric() || *c == '_');
    let mut out = String::with_capacity(text.len() + 16);
    for (i, &c) in chars.iter().enumerate() {
        let (before, after) = (if i > 0 { chars.get(i - 1) } else { None }, chars.get(i + 1));
        if c == 't' && !word(before) && !word(after) {
            if before == Some(&'(') && after == Some(&')') {
                out.push_str(&format!("t - {tau}"));
            } else {
                out.push_str(&format!("(t - {tau})"));
            }
        } else {
            out.push(c);
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{bromwich, check_method};
    use crate::transforms::laplace::delay_terms::delay_terms;

    fn parts(src: &str) -> Vec<DelayedPart> {
        analyse_terms(&delay_terms(src, "s", &[]).unwrap()).unwrap()
    }

    #[test]
    fn the_delayed_residue_sum_matches_the_bromwich_integral() {
        // The slow reference is the Bromwich line integral of F itself on Re s = 1,
        // which knows nothing of the decomposition. F decays like |s|^{-2} on that line.
        let src = "(1-exp(-s))^2/(s^2*(s+1))";
        let f = crate::expr::Function::compile(src, "s", &[]).unwrap();
        let p = parts(src);
        let cases = [("t = 0.5", 0.5), ("t = 1.5", 1.5), ("t = 3", 3.0)];
        check_method(&cases, |&t| {
            let (v, e) = residue_value(&p, t);
            (v, Some(e))
        }, |&t| bromwich(|s| f.eval(s), 1.0, t, 4000.0, 800_000), 1e-3);
        // And the contour way agrees away from the jumps.
        let c = contour_series(&p, &[0.5, 1.5, 3.0], &mut Budget::default()).unwrap();
        for (&t, c) in [0.5, 1.5, 3.0].iter().zip(&c) {
            let (v, e) = c.unwrap();
            let (r, re) = residue_value(&p, t);
            assert!((v - r).norm() <= 4.0 * (e + re) + 1e-12, "t = {t}: {v} vs {r}");
        }
    }

    #[test]
    fn closed_forms_shift_the_variable_and_name_the_step() {
        // Shift theorem with sin t ↔ 1/(s² + 1) and t e^{−t} ↔ 1/(s+1)² (transform table, from memory).
        assert_eq!(closed_form(&parts("exp(-s)/(s^2+1)")), "H(t - 1)*sin(t - 1)");
        assert_eq!(closed_form(&parts("exp(-2*s)/(s+1)^2")), "H(t - 2)*(t - 2)*exp(-(t - 2))");
        assert_eq!(closed_form(&parts("(1/s)*(1+exp(-s)+exp(-2*s))")), "1 + H(t - 1) + H(t - 2)");
        assert_eq!(closed_form(&parts("exp(-s)*(s+1)/s")), "H(t - 1) + δ(t - 1)");
        // At the jump the mean of the one-sided limits: sin 0 = 0 there, and 1/2 for the step.
        assert_eq!(residue_value(&parts("exp(-s)/s"), 1.0).0.re, 0.5);
    }
}

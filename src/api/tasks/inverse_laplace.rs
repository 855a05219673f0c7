//! `inverse_laplace`: f(t) = L⁻¹[F](t) at given times t > 0.
//!
//! Rational F: the residue sum (exact principal parts) is the answer, and the
//! fixed Talbot contour inversion is computed beside it as an independent
//! check; both are returned with their largest discrepancy. Any other F: the
//! fixed Talbot inversion alone, after detecting a pure delay e^{−τs}.
//!
//! Assumptions (documented for users): F is evaluated as typed, with principal
//! branches; every singularity and branch cut of F must lie to the left of the
//! contour. The contour is widened and shifted to enclose the singular points
//! the expression's structure reveals (roots of denominators, branch points of
//! sqrt/log/powers, essential points); singularities it cannot see (e.g. the
//! zeros of exp(s) − 2) are checked only by the two-rule error estimate.

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use crate::api::input::{budget, compile_text, hints};
use crate::text;
use crate::api::wire::{FunctionInput, Number};
use crate::api::error::{ApiError, ErrorCode};
use crate::expr::Function;
use crate::singular::rational_poles::analyse_rational_polished;
use crate::transforms::delay_estimate::{estimate_delay, left_growth_rate};
use crate::transforms::fixed_talbot::{invert, plan, TalbotError, TalbotValue, NODES};
use crate::transforms::laplace_residues::{closed_form, has_real_coefficients, residue_sum};
use crate::C;
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;

/// Most times one request may ask for.
pub const MAX_TIMES: usize = 10_000;
/// Largest time accepted.
pub const MAX_TIME: f64 = 1e15;

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct InverseLaplaceRequest {
    /// The transform F, as an expression in `var`.
    #[serde(rename = "F")]
    pub f: String,
    /// The transform variable, `s` by default.
    #[serde(default)]
    pub var: Option<String>,
    #[serde(default)]
    pub params: BTreeMap<String, Number>,
    /// Times t > 0.
    pub t: Vec<f64>,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

/// A pole of a rational F used in the residue sum.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PoleUsed {
    pub at: [f64; 2],
    pub order: u32,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct InverseLaplaceResponse {
    /// Re f(t) at each requested t.
    pub f: Vec<f64>,
    /// f(t) for t > 0 as text (rational F only), impulses δ(t) appended.
    pub closed_form: Option<String>,
    /// Im f(t), present only when some imaginary part exceeds its error estimate.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub f_imag: Option<Vec<f64>>,
    pub error_estimates: Vec<f64>,
    /// `"residues"` (rational F) or `"talbot"`.
    pub method: String,
    pub poles: Vec<PoleUsed>,
    /// Re of the residue sum (rational F), else null.
    pub by_residues: Option<Vec<f64>>,
    /// Re of the fixed Talbot inversion; null where the contour could not be used.
    pub by_contour: Vec<Option<f64>>,
    pub contour_error_estimates: Vec<Option<f64>>,
    /// max |residue sum − contour| over the times where both exist.
    pub max_discrepancy: Option<f64>,
    /// τ when F was recognised as e^{−τs} G(s); f is 0 for t < τ.
    pub delay: Option<f64>,
    /// Singular points the contour was placed to enclose (general F).
    pub singular_points_enclosed: Vec<[f64; 2]>,
    pub warnings: Vec<String>,
}

/// Relative size of an error estimate above which a contour value is flagged
/// (fewer than four correct digits).
const UNRELIABLE: f64 = 1e-4;

pub fn run(req: &InverseLaplaceRequest) -> Result<InverseLaplaceResponse, ApiError> {
    let times = validate_times(&req.t)?;
    let input = FunctionInput {
        f: String::new(),
        var: Some(req.var.clone().unwrap_or_else(|| "s".into())),
        params: req.params.clone(),
    };
    let f = compile_text(&req.f, &input, "F")?;
    let mut budget = budget(req.max_evaluations);
    let mut response = match f.rational() {
        Some(r) => rational(&f, &r.num.clone(), &r.den.clone(), &times, &mut budget),
        None => general(&f, &times, &mut budget),
    }?;
    let scale = response.poles.iter().map(|p| p.at[0].hypot(p.at[1])).fold(1.0, f64::max);
    let rightmost = response.poles.iter().map(|p| p.at[0]).fold(f64::NEG_INFINITY, f64::max);
    if rightmost > 1e-12 * scale {
        response.warnings.push(format!(
            "a pole lies in the right half-plane (Re s = {rightmost:.6}): f grows without bound (an unstable system). {}",
            crate::api::input::CAUTION
        ));
    } else if rightmost >= -1e-12 * scale {
        response.warnings.push(format!(
            "a pole lies on the imaginary axis: f does not decay (a marginally stable system). {}",
            crate::api::input::CAUTION
        ));
    }
    Ok(response)
}

fn validate_times(t: &[f64]) -> Result<Vec<f64>, ApiError> {
    if t.is_empty() {
        return Err(ApiError::invalid(
            "\"t\" is empty; pass the times t > 0 at which to evaluate f",
        ));
    }
    if t.len() > MAX_TIMES {
        return Err(ApiError::invalid(format!(
            "\"t\" has {} times; at most {MAX_TIMES} per request — split the request",
            t.len()
        )));
    }
    for (i, &x) in t.iter().enumerate() {
        if !x.is_finite() {
            return Err(ApiError::invalid(format!("t[{i}] is not a finite number")));
        }
        if x > MAX_TIME {
            return Err(ApiError::invalid(format!(
                "t[{i}] = {} is beyond {MAX_TIME:e}: at such times no digit of f survives in double precision; \
                 rescale time (e.g. work in ms or s)",
                text::real(x)
            )));
        }
        if x <= 0.0 {
            return Err(ApiError::invalid(format!(
                "t[{i}] = {} is not positive; f at t = 0 is the limit from the right and f = 0 for t < 0 \
                 (causal): pass t > 0",
                text::real(x)
            )));
        }
    }
    Ok(t.to_vec())
}

fn budget_error(e: crate::budget::BudgetExceeded) -> ApiError {
    e.into()
}

fn rational(
    f: &Function,
    num: &[C],
    den: &[C],
    times: &[f64],
    budget: &mut crate::budget::Budget,
) -> Result<InverseLaplaceResponse, ApiError> {
    let a = analyse_rational_polished(num, den, &|z| f.eval_d(z))?;
    let real = has_real_coefficients(num, den);
    let mut warnings = a.warnings.clone();
    let q = a.polynomial_part.clone();
    let has_impulses = q.iter().any(|c| c.norm() > 0.0);
    if has_impulses {
        warnings.push(
            "deg numerator ≥ deg denominator: F has a polynomial part, so f contains impulses δ(t), δ′(t), … at t = 0 \
             (shown in closed_form); the values here are f for t > 0, where the impulses vanish"
                .into(),
        );
    }
    let poles: Vec<C> = a.poles.iter().map(|p| p.at).collect();
    // The contour inverts F minus its polynomial part (impulses do not invert on a contour).
    let mut strictly_proper = |s: C| f.eval(s) - crate::poly::eval(&q, s);
    let mut by_residues = Vec::with_capacity(times.len());
    let mut residue_values = Vec::with_capacity(times.len());
    let mut error_estimates = Vec::with_capacity(times.len());
    let mut by_contour = Vec::with_capacity(times.len());
    let mut contour_errors = Vec::with_capacity(times.len());
    let mut max_discrepancy: Option<f64> = None;
    let mut disagreements = Vec::new();
    let mut contour_failures = Vec::new();
    for &t in times {
        let (value, err) = residue_sum(&a, t);
        residue_values.push(value);
        by_residues.push(value.re);
        let mut err = err;
        match invert(&mut strictly_proper, t, plan(t, &poles, NODES), budget) {
            Ok(v) => {
                let d = (v.value - value).norm();
                max_discrepancy = Some(max_discrepancy.map_or(d, |m| m.max(d)));
                if d > v.error_estimate + err {
                    disagreements.push((t, d));
                    err = err.max(d);
                }
                by_contour.push(Some(v.value.re));
                contour_errors.push(Some(v.error_estimate));
            }
            Err(TalbotError::Budget(e)) => return Err(budget_error(e)),
            Err(TalbotError::NotFinite { .. }) => {
                contour_failures.push(t);
                by_contour.push(None);
                contour_errors.push(None);
            }
        }
        error_estimates.push(err);
    }
    if let Some(&(t, d)) = disagreements.iter().max_by(|x, y| x.1.total_cmp(&y.1)) {
        warnings.push(format!(
            "the residue sum and the contour inversion disagree beyond their error estimates at {} of the times \
             (worst {} at t = {}); the error estimates include the disagreement",
            disagreements.len(),
            text::real(d),
            text::real(t)
        ));
    }
    if let Some(&t) = contour_failures.first() {
        warnings.push(format!(
            "the contour inversion overflowed at {} of the times (first t = {}); only the residue sum is given there",
            contour_failures.len(),
            text::real(t)
        ));
    }
    let f_imag = imaginary_parts(&residue_values, &error_estimates, &mut warnings);
    Ok(InverseLaplaceResponse {
        f: by_residues.clone(),
        closed_form: Some(closed_form(&a, real)),
        f_imag,
        error_estimates,
        method: "residues".into(),
        poles: a
            .poles
            .iter()
            .map(|p| PoleUsed {
                at: [p.at.re + 0.0, p.at.im + 0.0],
                order: p.order,
            })
            .collect(),
        by_residues: Some(by_residues),
        by_contour,
        contour_error_estimates: contour_errors,
        max_discrepancy,
        delay: None,
        singular_points_enclosed: Vec::new(),
        warnings,
    })
}

/// `Some(Im f)` with a warning when any imaginary part exceeds its error estimate.
fn imaginary_parts(values: &[C], errors: &[f64], warnings: &mut Vec<String>) -> Option<Vec<f64>> {
    let significant = values.iter().zip(errors).any(|(v, &e)| v.im.abs() > e);
    if !significant {
        return None;
    }
    warnings.push(
        "f is complex (F is not real on the real axis): \"f\" holds Re f(t) and \"f_imag\" holds Im f(t)".into(),
    );
    Some(values.iter().map(|v| v.im).collect())
}

/// Singular points the expression's structure reveals: denominator roots,
/// branch points and essential points.
fn structural_singularities(f: &Function) -> Vec<C> {
    let a = f.analysis();
    let h = hints(f);
    let mut points: Vec<C> = a.pole_candidates.clone();
    for p in &a.pole_candidate_polys {
        if let Ok((clusters, _)) = crate::poly::multiplicity::distinct_roots(p) {
            points.extend(clusters.into_iter().map(|c| c.center));
        }
    }
    points.extend(h.branch_candidates);
    points.extend(h.essential_candidates);
    points.retain(|z| z.is_finite());
    points
}

fn general(
    f: &Function,
    times: &[f64],
    budget: &mut crate::budget::Budget,
) -> Result<InverseLaplaceResponse, ApiError> {
    let singular = structural_singularities(f);
    let mut warnings = Vec::new();
    if f.analysis().uses_branch_functions {
        warnings.push(
            "F is evaluated as typed, with principal branches: its branch cuts must lie to the left of the \
             inversion contour (write sqrt(s^2+1) as sqrt(s+i)*sqrt(s-i), for example)"
                .into(),
        );
    }
    let mut with_derivative = |s: C| f.eval_d(s);
    let delay = estimate_delay(&mut with_derivative);
    budget.spend(6).map_err(budget_error)?;
    if let Some(tau) = delay {
        let magnitude = match text::real(tau.abs()).as_str() {
            "1" => String::new(),
            text => format!("{text}*"),
        };
        let factor = if tau > 0.0 {
            format!("e^(-{magnitude}s)")
        } else {
            format!("e^({magnitude}s)")
        };
        let kind = if tau > 0.0 {
            "a delay"
        } else {
            "a time advance (not the transform of a causal function unless F·e^(τs) vanishes fast enough)"
        };
        warnings.push(format!(
            "F contains {kind} {factor}: f jumps or bends at t = {}; f is computed as g(t − τ) with \
             g = L⁻¹[F·e^(τs)], and f = 0 for t < τ; values within a few error estimates of the jump are unreliable",
            text::real(tau)
        ));
    }
    let mut plain = |s: C| f.eval(s);
    // Delays F does not reduce to a single e^{−τs}: growth to the left bounds where f may jump.
    let growth = match delay {
        Some(tau) => {
            left_growth_rate(&mut |s: C| undelay(f, s, tau, 1.0, &std::cell::Cell::new(0.0)))
        }
        None => left_growth_rate(&mut plain),
    };
    budget.spend(4).map_err(budget_error)?;
    let mixed_delay = (growth > 0.05).then_some(growth);
    if let Some(kappa) = mixed_delay {
        warnings.push(format!(
            "F grows like e^({}·|s|) to the left: it contains delays up to about τ ≈ {} (e.g. 1 − e^(-s)), so f may \
             jump at each delay; the contour inversion is meaningless for t below about 1.2·τ, and there the \
             error estimates are set to at least the largest |f|",
            text::real(kappa),
            text::real(kappa)
        ));
    }
    let mut values = Vec::with_capacity(times.len());
    let mut errors = Vec::with_capacity(times.len());
    let mut unreliable = Vec::new();
    let mut fallbacks = Vec::new();
    for &t in times {
        let result = match delay {
            Some(tau) if t <= tau => Ok((C::new(0.0, 0.0), 0.0)),
            Some(tau) => {
                let shifted = t - tau;
                let dropped = std::cell::Cell::new(0.0);
                let mut undelayed = |s: C| undelay(f, s, tau, shifted, &dropped);
                // Just after the jump the nominal contour reaches Re s ≈ 2M/(5(t − τ)), where
                // F = e^{−τs}G underflows; keep Re s ≤ 600/τ by placing the contour for a later time.
                let contour_time = shifted.max(2.0 * NODES as f64 * tau.abs() / (5.0 * 600.0));
                match invert(
                    &mut undelayed,
                    shifted,
                    plan(contour_time, &singular, NODES),
                    budget,
                ) {
                    Ok(v) => Ok((
                        v.value,
                        v.error_estimate + dropped.get() * v.plan.r / v.plan.nodes as f64,
                    )),
                    Err(TalbotError::NotFinite { .. }) => {
                        // Still not computable: invert F itself; near the jump that value means little.
                        fallbacks.push(t);
                        direct(&mut plain, t, &singular, budget)
                            .map(|(v, e)| (v, e.max(v.norm()).max(1.0)))
                    }
                    Err(e) => Err(e),
                }
            }
            None => direct(&mut plain, t, &singular, budget),
        };
        let (v, e) = match result {
            Ok(x) => x,
            Err(TalbotError::Budget(e)) => return Err(budget_error(e)),
            Err(TalbotError::NotFinite { at }) => {
                return Err(ApiError::new(ErrorCode::NotFinite, format!(
                    "F is not finite at s = {} on the inversion contour for t = {}: F has a singularity there that \
                     the expression analysis did not locate, or overflows; the contour inversion needs every \
                     singularity of F to the left of the contour",
                    crate::text::complex(at, 0.0),
                    text::real(t)
                )))
            }
        };
        values.push(v);
        errors.push(e);
    }
    let largest = values.iter().map(|v| v.norm()).fold(0.0, f64::max);
    if let Some(kappa) = mixed_delay {
        let shift = delay.unwrap_or(0.0);
        for (&t, (v, e)) in times.iter().zip(values.iter().zip(errors.iter_mut())) {
            if t - shift <= 1.2 * kappa {
                *e = e.max(largest).max(v.norm()).max(1.0);
            }
        }
    }
    for (&t, (v, &e)) in times.iter().zip(values.iter().zip(&errors)) {
        if !(e <= UNRELIABLE * v.norm().max(1e-8 * largest)) {
            unreliable.push((t, e));
        }
    }
    if let Some(&(t, _)) = unreliable.first() {
        let hint = if delay.is_some() {
            "near the delay's jump"
        } else {
            "F may contain a delay (f jumps there), a singularity right of the contour, or a branch cut the contour crosses"
        };
        warnings.push(format!(
            "the contour inversion is not accurate at {} of the times (first t = {}): the two rules disagree; {hint}. \
             The error estimates show by how much",
            unreliable.len(),
            text::real(t)
        ));
    }
    if let Some(&t) = fallbacks.first() {
        warnings.push(format!(
            "at {} of the times just after the delay (first t = {}), F·e^(τs) could not be evaluated on the contour \
             and F was inverted directly; these values are unreliable (error estimate at least max(|f|, 1))",
            fallbacks.len(),
            text::real(t)
        ));
    }
    let f_imag = imaginary_parts(&values, &errors, &mut warnings);
    let re: Vec<f64> = values.iter().map(|v| v.re).collect();
    Ok(InverseLaplaceResponse {
        f: re.clone(),
        closed_form: None,
        f_imag,
        error_estimates: errors.clone(),
        method: "talbot".into(),
        poles: Vec::new(),
        by_residues: None,
        by_contour: re.into_iter().map(Some).collect(),
        contour_error_estimates: errors.into_iter().map(Some).collect(),
        max_discrepancy: None,
        delay,
        singular_points_enclosed: singular.iter().map(|z| [z.re + 0.0, z.im + 0.0]).collect(),
        warnings,
    })
}

fn direct(
    f: &mut dyn FnMut(C) -> C,
    t: f64,
    singular: &[C],
    budget: &mut crate::budget::Budget,
) -> Result<(C, f64), TalbotError> {
    invert(f, t, plan(t, singular, NODES), budget).map(|v: TalbotValue| (v.value, v.error_estimate))
}

/// G(s) = F(s)·e^{τs} for the delayed inversion at time `t_shifted` = t − τ.
/// Far left on the contour F itself overflows (F ~ e^{τ|Re s|}); there the
/// term e^{s·t_shifted}·G(s) is at most e^{Re s·t_shifted}(1 + |s|) for a G of
/// at most linear growth: it is dropped and that bound added to `dropped`.
/// Anything else non-finite stays non-finite (the caller then falls back).
fn undelay(f: &Function, s: C, tau: f64, t_shifted: f64, dropped: &std::cell::Cell<f64>) -> C {
    let g = f.eval(s) * (s * tau).exp();
    if g.is_finite() {
        return g;
    }
    if s.re < 0.0 {
        dropped.set(dropped.get() + (s.re * t_shifted).exp() * (1.0 + s.norm()));
        C::new(0.0, 0.0)
    } else {
        C::new(f64::NAN, f64::NAN)
    }
}

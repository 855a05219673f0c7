//! `inverse_laplace`: f(t) = L⁻¹[F](t) at given times t > 0.
//!
//! Rational F: the residue sum (exact principal parts) is the answer, and the
//! fixed Talbot contour inversion is computed beside it as an independent
//! check; both are returned with their largest discrepancy. Where the contour
//! way has no meaningful digit (its own estimate not below its value) it is
//! reported as not available at that time, not as a disagreement.
//! F = Σₖ e^{−τₖs}Gₖ(s) with rational Gₖ, read from the expression: the same,
//! term by term (f = Σ gₖ(t − τₖ)H(t − τₖ)), after checking the decomposition
//! against F at sample points. Any other F: the fixed Talbot inversion alone,
//! after detecting a pure delay e^{−τs} numerically; times where it has no
//! meaningful value, or a branch cut crosses its contour, are declined
//! (`f` null there) and the request is refused only when every time is.
//!
//! Assumptions (documented for users): F is evaluated as typed, with principal
//! branches; every singularity and branch cut of F must lie to the left of the
//! contour. The contour is widened and shifted to enclose the singular points
//! the expression's structure reveals (roots of denominators, branch points of
//! sqrt/log/powers, essential points); singularities it cannot see (e.g. the
//! zeros of exp(s) − 2) are checked only by the two-rule error estimate.

use crate::api::error::ApiError;
use crate::api::input::{budget, compile_text, hints, CAUTION};
use crate::api::wire::{FunctionInput, Number, Stability as StabilityOut};
use crate::api::shape::{Expect, Field};
use crate::api::wire::{transform_fields, BUDGET_FIELD};
use crate::budget::Budget;
use crate::expr::Function;
use crate::singular::rational_poles::analyse_function;
use crate::text;
use crate::transforms::laplace::delay_terms::{delay_terms, matches};
use crate::transforms::laplace::delayed_inversion::{decline_reason, enclosed_points, invert_with_delay};
use crate::transforms::laplace::delayed_residues::{self, analyse_terms, DelayedPart};
use crate::transforms::laplace::fixed_talbot::{invert_each, meaningful};
use crate::error::Failure;
use crate::transforms::laplace::residues::{closed_form, has_real_coefficients, residue_series, stability, Stability};
use crate::ways::{reconcile, Agreement, Way, WayName};
use crate::C;
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;

/// Most times one request may ask for.
pub const MAX_TIMES: usize = 10_000;
/// Largest time accepted.
pub const MAX_TIME: f64 = 1e15;

/// The declared fields of [`InverseLaplaceRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] =
    &[&transform_fields("F"), &[Field::required("t", Expect::AtMost(MAX_TIMES, &Expect::Real)), BUDGET_FIELD]];

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

/// Which way gives `f`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Method {
    /// The residue sum (rational F), checked by the contour inversion.
    Residues,
    /// The fixed Talbot contour alone (any other F).
    Talbot,
}

/// A pole of a rational F used in the residue sum.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PoleUsed {
    pub at: [f64; 2],
    pub order: u32,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct InverseLaplaceResponse {
    /// Re f(t) at each requested t; null at a declined time (see `declined`).
    pub f: Vec<Option<f64>>,
    /// f(t) for t > 0 as text (rational F and delayed rational terms), impulses δ(t) appended;
    /// a delayed term is `H(t - τ)*g(t - τ)` with the Heaviside step H.
    pub closed_form: Option<String>,
    /// Im f(t), present only when some imaginary part exceeds its error estimate.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub f_imag: Option<Vec<f64>>,
    /// Per time; null at a declined time.
    pub error_estimates: Vec<Option<f64>>,
    /// Indices of the times with no meaningful value (`f` and `error_estimates` null there).
    #[serde(default)]
    pub declined: Vec<usize>,
    /// `"residues"` (rational F) or `"talbot"`.
    pub method: Method,
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
    /// The delays τₖ > 0 read from the expression F = Σ e^{−τₖs}Gₖ(s), ascending; else empty.
    #[serde(default)]
    pub delays: Vec<f64>,
    /// Singular points the contour was placed to enclose (general F).
    pub singular_points_enclosed: Vec<[f64; 2]>,
    pub warnings: Vec<String>,
    /// The stability reading, where the poles were found exactly (rational F); else `null`.
    pub stability: Option<StabilityOut>,
    /// The index in `warnings` of the stability reading and its caution, when it is not stable.
    pub stability_warning: Option<usize>,
}

pub fn run(req: &InverseLaplaceRequest) -> Result<InverseLaplaceResponse, ApiError> {
    let times = validate_times(&req.t)?;
    let var = Some(req.var.clone().unwrap_or_else(|| "s".into()));
    let input = FunctionInput { f: String::new(), var, params: req.params.clone() };
    let f = compile_text(&req.f, &input, "F")?;
    let mut budget = budget(req.max_evaluations).weighted(f.weight());
    if let Some(r) = f.rational() {
        return rational(&f, &r.num.clone(), &r.den.clone(), &times, &mut budget);
    }
    let params: Vec<(String, C)> = req.params.iter().map(|(name, v)| (name.clone(), v.to_c())).collect();
    match delay_terms(&req.f, f.var(), &params).filter(|terms| matches(terms, &|s| f.eval(s))) {
        Some(terms) => delayed(&analyse_terms(&terms)?, &times, &mut budget),
        None => general(&f, &times, &mut budget),
    }
}

fn validate_times(t: &[f64]) -> Result<Vec<f64>, ApiError> {
    if t.is_empty() {
        return Err(ApiError::invalid("\"t\" is empty; pass the times t > 0 at which to evaluate f"));
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

/// Rational F: the residue sum is the answer; the contour inversion checks it.
fn rational(f: &Function, num: &[C], den: &[C], times: &[f64], budget: &mut Budget) -> Result<InverseLaplaceResponse, ApiError> {
    let a = analyse_function(f)?;
    let mut warnings = a.warnings.clone();
    let q = a.polynomial_part.clone();
    if q.iter().any(|c| c.norm() > 0.0) {
        warnings.push(
            "deg numerator ≥ deg denominator: F has a polynomial part, so f contains impulses δ(t), δ′(t), … at t = 0 \
             (shown in closed_form); the values here are f for t > 0, where the impulses vanish"
                .into(),
        );
    }
    let poles: Vec<C> = a.poles.iter().map(|p| p.at).collect();
    let by_residues = residue_series(&a, times);
    // The contour inverts F minus its polynomial part (impulses do not invert on a contour).
    let by_contour = invert_each(&mut |s: C| f.eval(s) - crate::poly::eval(&q, s), times, &poles, budget)?;
    let by_contour: Vec<Option<(C, f64)>> = by_contour.iter().map(|c| c.map(|c| (c.value, c.error_estimate))).collect();
    let plan = ResiduePlan {
        closed_form: closed_form(&a, has_real_coefficients(num, den)),
        poles: a.poles.iter().map(|p| (p.at, p.order)).collect(),
        delay: None,
        delays: Vec::new(),
    };
    Ok(with_residues(plan, &by_residues, &by_contour, times, warnings))
}

/// F = Σ e^{−τₖs}Gₖ(s): the delayed residue sums are the answer; the contour inversion of each Gₖ checks them.
fn delayed(parts: &[DelayedPart], times: &[f64], budget: &mut Budget) -> Result<InverseLaplaceResponse, ApiError> {
    let mut warnings: Vec<String> = parts.iter().flat_map(|p| p.analysis.warnings.iter().cloned()).collect();
    let delays: Vec<f64> = parts.iter().map(|p| p.tau).filter(|&tau| tau > 0.0).collect();
    warnings.push(format!(
        "F contains delays e^(-τs) with τ = {}: f = Σ g(t − τ)·H(t − τ), H the unit step (closed_form writes it \
         H(t - τ)); at a jump t = τ the value is the mean of the two one-sided limits (the Bromwich integral's value)",
        delays.iter().map(|&tau| text::real(tau)).collect::<Vec<_>>().join(", ")
    ));
    if delayed_residues::has_impulses(parts) {
        warnings.push(
            "a delayed term has a polynomial part: f contains impulses δ(t − τ) (shown in closed_form); the values \
             here are the finite part of f, where the impulses vanish"
                .into(),
        );
    }
    let by_residues = delayed_residues::residue_series(parts, times);
    let by_contour = delayed_residues::contour_series(parts, times, budget)?;
    let mut poles: Vec<(C, u32)> = Vec::new();
    for p in parts.iter().flat_map(|p| &p.analysis.poles) {
        if !poles.iter().any(|&(at, order)| at == p.at && order == p.order) {
            poles.push((p.at, p.order));
        }
    }
    let plan = ResiduePlan {
        closed_form: delayed_residues::closed_form(parts),
        poles,
        // Every term delayed: f = 0 before the smallest delay.
        delay: (parts[0].tau > 0.0).then_some(parts[0].tau),
        delays,
    };
    Ok(with_residues(plan, &by_residues, &by_contour, times, warnings))
}

/// What the residue ways know beyond their values.
struct ResiduePlan {
    closed_form: String,
    poles: Vec<(C, u32)>,
    delay: Option<f64>,
    delays: Vec<f64>,
}

/// The residue sum as the answer, reconciled with the contour way where that way has a meaningful value.
fn with_residues(
    plan: ResiduePlan,
    by_residues: &[(C, f64)],
    by_contour: &[Option<(C, f64)>],
    times: &[f64],
    mut warnings: Vec<String>,
) -> InverseLaplaceResponse {
    let floor = by_residues.iter().map(|v| v.0.norm()).filter(|x| x.is_finite()).fold(0.0, f64::max);
    // A contour value whose own estimate swamps it is not available there (not a disagreement).
    let contour: Vec<Option<(C, f64)>> =
        by_contour.iter().map(|c| c.filter(|&(v, e)| meaningful(v, e, floor))).collect();
    let verdicts: Vec<_> = by_residues
        .iter()
        .zip(&contour)
        .map(|(&(v, e), c)| {
            let mut ways = vec![Way::new(WayName::Residues, v, e)];
            ways.extend(c.map(|(c, ce)| Way::new(WayName::ContourInversion, c, ce)));
            reconcile(&ways, &[WayName::Residues], floor)
        })
        .collect();
    let disagreements: Vec<(f64, f64)> = times
        .iter()
        .zip(&verdicts)
        .filter(|(_, v)| v.agreement == Agreement::Disagree)
        .map(|(&t, v)| (t, v.max_discrepancy))
        .collect();
    if let Some(&(t, d)) = disagreements.iter().max_by(|x, y| x.1.total_cmp(&y.1)) {
        warnings.push(format!(
            "the residue sum and the contour inversion disagree beyond their error estimates at {} of the times \
             (worst {} at t = {}); the error estimates include the disagreement",
            disagreements.len(),
            text::real(d),
            text::real(t)
        ));
    }
    let failures: Vec<f64> = times.iter().zip(&contour).filter(|(_, c)| c.is_none()).map(|(&t, _)| t).collect();
    if let Some(&t) = failures.first() {
        warnings.push(format!(
            "the contour inversion gave no meaningful value at {} of the times (first t = {}: it overflowed, its own \
             error estimate was not below its value, or the time is at a delay's jump); only the residue sum is \
             given there",
            failures.len(),
            text::real(t)
        ));
    }
    let values: Vec<C> = verdicts.iter().map(|v| v.value).collect();
    let error_estimates: Vec<f64> = verdicts.iter().map(|v| v.error).collect();
    let f_imag = imaginary_parts(&values, &error_estimates, &mut warnings);
    let poles: Vec<C> = plan.poles.iter().map(|p| p.0).collect();
    let reading = stability(&poles);
    let stability_warning = (reading != Stability::Stable).then_some(warnings.len());
    match reading {
        Stability::Unstable(rightmost) => warnings.push(format!(
            "a pole lies in the right half-plane (Re s = {rightmost:.6}): f grows without bound (an unstable system). {CAUTION}"
        )),
        Stability::Marginal => warnings.push(format!(
            "a pole lies on the imaginary axis: f does not decay (a marginally stable system). {CAUTION}"
        )),
        Stability::Stable => {}
    }
    let re: Vec<f64> = values.iter().map(|v| v.re).collect();
    InverseLaplaceResponse {
        f: re.iter().copied().map(Some).collect(),
        closed_form: Some(plan.closed_form),
        f_imag,
        error_estimates: error_estimates.into_iter().map(Some).collect(),
        declined: Vec::new(),
        method: Method::Residues,
        poles: plan.poles.iter().map(|&(at, order)| PoleUsed { at: [at.re + 0.0, at.im + 0.0], order }).collect(),
        by_residues: Some(re),
        by_contour: contour.iter().map(|c| c.map(|c| c.0.re)).collect(),
        contour_error_estimates: contour.iter().map(|c| c.map(|c| c.1)).collect(),
        max_discrepancy: verdicts.iter().filter(|v| v.ways.len() > 1).map(|v| v.max_discrepancy).reduce(f64::max),
        delay: plan.delay,
        delays: plan.delays,
        singular_points_enclosed: Vec::new(),
        warnings,
        stability: Some(match reading {
            Stability::Stable => StabilityOut::Stable,
            Stability::Marginal => StabilityOut::MarginallyStable,
            Stability::Unstable(_) => StabilityOut::Unstable,
        }),
        stability_warning,
    }
}

/// Any other F: the delay-shifted Talbot inversion alone.
fn general(f: &Function, times: &[f64], budget: &mut Budget) -> Result<InverseLaplaceResponse, ApiError> {
    let enclosed = enclosed_points(f, &hints(f));
    let r = invert_with_delay(f, times, &enclosed, budget)?;
    if r.declined.len() == times.len() {
        let why = format!("the contour inversion has no meaningful value at any requested time: {}", decline_reason(r.cut_crossing));
        let failure = match r.cut_crossing {
            Some(at) => Failure::cut_crossing(why).at(at),
            None => Failure::unresolved(why),
        };
        return Err(failure.into());
    }
    let mut warnings = r.warnings;
    let served = |i: usize| !r.declined.contains(&i);
    let kept: Vec<(C, f64)> = (0..times.len()).map(|i| if served(i) { (r.values[i], r.errors[i]) } else { (C::new(0.0, 0.0), 0.0) }).collect();
    let (kept_values, kept_errors): (Vec<C>, Vec<f64>) = kept.into_iter().unzip();
    let f_imag = imaginary_parts(&kept_values, &kept_errors, &mut warnings)
        .map(|im| im.into_iter().enumerate().map(|(i, x)| if served(i) { x } else { f64::NAN }).collect());
    let re: Vec<Option<f64>> = (0..times.len()).map(|i| served(i).then_some(r.values[i].re)).collect();
    let errors: Vec<Option<f64>> = (0..times.len()).map(|i| served(i).then_some(r.errors[i])).collect();
    Ok(InverseLaplaceResponse {
        f: re.clone(),
        closed_form: None,
        f_imag,
        error_estimates: errors.clone(),
        declined: r.declined.clone(),
        method: Method::Talbot,
        poles: Vec::new(),
        by_residues: None,
        by_contour: re,
        contour_error_estimates: errors,
        max_discrepancy: None,
        delay: r.delay,
        delays: Vec::new(),
        singular_points_enclosed: r.enclosed.iter().map(|z| [z.re + 0.0, z.im + 0.0]).collect(),
        warnings,
        stability: None,
        stability_warning: None,
    })
}

/// `Some(Im f)` with a warning when any imaginary part exceeds its error estimate.
fn imaginary_parts(values: &[C], errors: &[f64], warnings: &mut Vec<String>) -> Option<Vec<f64>> {
    if !values.iter().zip(errors).any(|(v, &e)| v.im.abs() > e) {
        return None;
    }
    warnings.push(
        "f is complex (F is not real on the real axis): \"f\" holds Re f(t) and \"f_imag\" holds Im f(t)".into(),
    );
    Some(values.iter().map(|v| v.im).collect())
}

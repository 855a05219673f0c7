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

use crate::api::error::ApiError;
use crate::api::input::{budget, compile_text, hints, CAUTION};
use crate::api::wire::{FunctionInput, Number, Stability as StabilityOut};
use crate::budget::Budget;
use crate::expr::Function;
use crate::singular::rational_poles::analyse_rational_polished;
use crate::text;
use crate::transforms::laplace::delayed_inversion::{enclosed_points, invert_with_delay};
use crate::transforms::laplace::fixed_talbot::invert_each;
use crate::transforms::laplace::residues::{closed_form, has_real_coefficients, residue_series, stability, Stability};
use crate::ways::{reconcile, Agreement, Way, WayName};
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
    /// Re f(t) at each requested t.
    pub f: Vec<f64>,
    /// f(t) for t > 0 as text (rational F only), impulses δ(t) appended.
    pub closed_form: Option<String>,
    /// Im f(t), present only when some imaginary part exceeds its error estimate.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub f_imag: Option<Vec<f64>>,
    pub error_estimates: Vec<f64>,
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
    match f.rational() {
        Some(r) => rational(&f, &r.num.clone(), &r.den.clone(), &times, &mut budget),
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
    let a = analyse_rational_polished(num, den, &|z| f.eval_d(z))?;
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

    let floor = by_residues.iter().map(|v| v.0.norm()).filter(|x| x.is_finite()).fold(0.0, f64::max);
    let verdicts: Vec<_> = by_residues
        .iter()
        .zip(&by_contour)
        .map(|(&(v, e), c)| {
            let mut ways = vec![Way::new(WayName::Residues, v, e)];
            ways.extend(c.map(|c| Way::new(WayName::ContourInversion, c.value, c.error_estimate)));
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
    let failures: Vec<f64> = times.iter().zip(&by_contour).filter(|(_, c)| c.is_none()).map(|(&t, _)| t).collect();
    if let Some(&t) = failures.first() {
        warnings.push(format!(
            "the contour inversion overflowed at {} of the times (first t = {}); only the residue sum is given there",
            failures.len(),
            text::real(t)
        ));
    }
    let values: Vec<C> = verdicts.iter().map(|v| v.value).collect();
    let error_estimates: Vec<f64> = verdicts.iter().map(|v| v.error).collect();
    let f_imag = imaginary_parts(&values, &error_estimates, &mut warnings);
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
    Ok(InverseLaplaceResponse {
        f: re.clone(),
        closed_form: Some(closed_form(&a, has_real_coefficients(num, den))),
        f_imag,
        error_estimates,
        method: Method::Residues,
        poles: a.poles.iter().map(|p| PoleUsed { at: [p.at.re + 0.0, p.at.im + 0.0], order: p.order }).collect(),
        by_residues: Some(re),
        by_contour: by_contour.iter().map(|c| c.map(|c| c.value.re)).collect(),
        contour_error_estimates: by_contour.iter().map(|c| c.map(|c| c.error_estimate)).collect(),
        max_discrepancy: verdicts.iter().filter(|v| v.ways.len() > 1).map(|v| v.max_discrepancy).reduce(f64::max),
        delay: None,
        singular_points_enclosed: Vec::new(),
        warnings,
        stability: Some(match reading {
            Stability::Stable => StabilityOut::Stable,
            Stability::Marginal => StabilityOut::MarginallyStable,
            Stability::Unstable(_) => StabilityOut::Unstable,
        }),
        stability_warning,
    })
}

/// Any other F: the delay-shifted Talbot inversion alone.
fn general(f: &Function, times: &[f64], budget: &mut Budget) -> Result<InverseLaplaceResponse, ApiError> {
    let enclosed = enclosed_points(f, &hints(f));
    let r = invert_with_delay(f, times, &enclosed, budget)?;
    let mut warnings = r.warnings;
    let f_imag = imaginary_parts(&r.values, &r.errors, &mut warnings);
    let re: Vec<f64> = r.values.iter().map(|v| v.re).collect();
    Ok(InverseLaplaceResponse {
        f: re.clone(),
        closed_form: None,
        f_imag,
        error_estimates: r.errors.clone(),
        method: Method::Talbot,
        poles: Vec::new(),
        by_residues: None,
        by_contour: re.into_iter().map(Some).collect(),
        contour_error_estimates: r.errors.into_iter().map(Some).collect(),
        max_discrepancy: None,
        delay: r.delay,
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

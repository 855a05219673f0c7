//! `inverse_z`: the causal inverse z-transform x[n], n ≥ 0, of X(z), with the
//! region of convergence |z| > max |singularity| (the causal, right-sided sequence).
//!
//! Rational X is computed in up to three independent ways and the disagreement shown:
//! 1. **The difference equation** run on an impulse (long division, no roots),
//!    with its a-priori rounding bound: `transforms::z::recurrence`.
//! 2. **Residues**: partial fractions from the exact pole analysis, which also
//!    give the closed form and carry far n (`transforms::z::residues`).
//! 3. **Contour**: trapezoidal Cauchy integrals on circles outside every pole
//!    (`transforms::z::trapezoid`), only for the n where 1 and 2 do not agree:
//!    it costs a hundred times more than both.
//!
//! The ways are reconciled per n by the one agreement rule (`crate::ways`); `x`
//! comes from whichever of 1 and 2 has the smaller estimate.
//!
//! Any other X uses the contour method alone; its singularities are bounded by
//! `"singular_radius"` when given, else by structural candidates plus a search
//! of |z| < 10 and the expression's pole candidates classified one by one
//! (`transforms::z::singular_radius`), and the contour's own
//! positive-power check refuses an X that grows at infinity or has a
//! singularity outside the circles.

use crate::api::error::ApiError;
use crate::api::input::{budget, compile_text, hints, pole_candidates, CAUTION};
use crate::api::wire::{FunctionInput, Number, Stability as StabilityOut};
use crate::api::shape::{Expect, Field};
use crate::api::wire::{transform_fields, BUDGET_FIELD};
use crate::budget::Budget;
use crate::expr::Function;
use crate::singular::rational_poles::analyse_function;
use crate::text;
use crate::transforms::z::recurrence::values_at as recurrence_values;
use crate::transforms::z::residues::ResidueForm;
use crate::transforms::z::singular_radius::{check_no_positive_powers, search};
use crate::transforms::z::trapezoid::{inverse_z_trapezoid, ContourResult};
use crate::ways::{reconcile, Agreement, Way, WayName, ROUNDING};
use crate::C;
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;

/// Most values of n per request.
pub const MAX_COUNT: usize = 10_000;
/// Largest n accepted.
pub const MAX_N: f64 = 1e6;
/// Most samples on one contour circle.
const MAX_SAMPLES: usize = 1 << 20;

/// Which ways gave `x`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Method {
    /// Rational X: the difference equation and residues compared (the contour where they disagree).
    Rational,
    /// Any other X: the contour alone.
    Contour,
}

/// The declared fields of [`InverseZRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[
    &transform_fields("X"),
    &[
        Field::required("n", Expect::AtMost(MAX_COUNT, &Expect::Real)),
        Field::optional("singular_radius", Expect::OrNull(&Expect::Real)),
        BUDGET_FIELD,
    ],
];

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct InverseZRequest {
    /// The transform X(z).
    #[serde(rename = "X")]
    pub x: String,
    #[serde(default)]
    pub var: Option<String>,
    #[serde(default)]
    pub params: BTreeMap<String, Number>,
    /// The indices n ≥ 0 wanted.
    pub n: Vec<f64>,
    /// Optional (non-rational X): every singularity of X lies in |z| ≤ this radius.
    #[serde(default)]
    pub singular_radius: Option<f64>,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

/// The assumed region of convergence |z| > r.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct Roc {
    pub outer_radius_greater_than: f64,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PoleAt {
    pub at: [f64; 2],
    pub order: u32,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct InverseZResponse {
    /// Re x[n] for each requested n.
    pub x: Vec<f64>,
    /// Im x[n], present only when some imaginary part is significant.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub x_imag: Option<Vec<f64>>,
    /// The sequence in closed form (rational X), e.g. `0.5^n` or `2*0.9^n*cos(0.5*n)`.
    pub closed_form: Option<String>,
    /// Bound meant on |x[n] − true x[n]| (complex), per n.
    pub error_estimates: Vec<f64>,
    pub roc: Roc,
    /// Re x[n] from the residues / partial fractions (rational X).
    pub by_residues: Option<Vec<f64>>,
    /// Re x[n] from the difference equation (long division; rational X, when affordable).
    pub by_long_division: Option<Vec<f64>>,
    /// The a-priori rounding bound of each `by_long_division` value.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub long_division_error_estimates: Option<Vec<f64>>,
    /// Re x[n] from contour integrals; `null` where n was too large for the sampling
    /// and, for rational X, where the other two ways already agree.
    pub by_contour: Vec<Option<f64>>,
    /// Error estimate of each contour value.
    pub contour_error_estimates: Vec<Option<f64>>,
    /// Largest |difference| between any two ways over all n (for non-rational X:
    /// between the two best contour radii).
    pub max_discrepancy: f64,
    pub poles: Vec<PoleAt>,
    /// `"rational"` or `"contour"`.
    pub method: Method,
    /// Radii of the contour circles used.
    pub contour_radii: Vec<f64>,
    pub warnings: Vec<String>,
    /// The stability reading from the region of convergence |z| > r₀.
    pub stability: Option<StabilityOut>,
    /// The index in `warnings` of the stability reading and its caution, when it is not stable.
    pub stability_warning: Option<usize>,
}

pub fn run(req: &InverseZRequest) -> Result<InverseZResponse, ApiError> {
    let input = FunctionInput { f: String::new(), var: req.var.clone(), params: req.params.clone() };
    let f = compile_text(&req.x, &input, "X")?;
    let ns = indices(&req.n)?;
    let mut budget = budget(req.max_evaluations).weighted(f.weight());
    let mut response = match f.rational() {
        Some(r) => rational(&f, &r.num, &r.den, &ns, &mut budget)?,
        None => general(&f, req.singular_radius, &ns, &mut budget)?,
    };
    // The stability reading from the region of convergence |z| > r0 (common practice).
    let r0 = response.roc.outer_radius_greater_than;
    response.stability = Some(if r0 > 1.0 + ROUNDING {
        StabilityOut::Unstable
    } else if r0 >= 1.0 - ROUNDING {
        StabilityOut::MarginallyStable
    } else {
        StabilityOut::Stable
    });
    if response.stability != Some(StabilityOut::Stable) {
        response.stability_warning = Some(response.warnings.len());
    }
    if r0 > 1.0 + ROUNDING {
        response.warnings.push(format!(
            "a singularity lies outside the unit circle (|z| = {}): the sequence grows without bound (an unstable system). {CAUTION}",
            text::real(r0)
        ));
    } else if r0 >= 1.0 - ROUNDING {
        response.warnings.push(format!(
            "a singularity lies on the unit circle: the sequence does not decay (a marginally stable system). {CAUTION}"
        ));
    }
    Ok(response)
}

/// Validate the indices: integers 0 ≤ n ≤ 10⁶, at most 10 000 of them.
fn indices(n: &[f64]) -> Result<Vec<u64>, ApiError> {
    if n.is_empty() {
        return Err(ApiError::invalid("\"n\" is empty; give the indices wanted, e.g. \"n\": [0, 1, 2, 3]"));
    }
    if n.len() > MAX_COUNT {
        return Err(ApiError::invalid(format!(
            "\"n\" has {} entries; at most {MAX_COUNT} per request — split the request",
            n.len()
        )));
    }
    n.iter()
        .map(|&v| {
            if !v.is_finite() || v.fract() != 0.0 {
                Err(ApiError::invalid(format!("\"n\" must hold integers; {v} is not one")))
            } else if v < 0.0 {
                Err(ApiError::invalid(format!("n must be ≥ 0 for the causal inverse (x[n] = 0 for n < 0); got {v}")))
            } else if v > MAX_N {
                Err(ApiError::invalid(format!("n = {v} is too large; n ≤ 1000000")))
            } else {
                Ok(v as u64)
            }
        })
        .collect()
}

/// Rational X: the difference equation and the residues, reconciled per n; the
/// contour only where those two do not agree.
fn rational(f: &Function, num: &[C], den: &[C], ns: &[u64], budget: &mut Budget) -> Result<InverseZResponse, ApiError> {
    let analysis = analyse_function(f)?;
    let form = ResidueForm::from_analysis(&analysis)?;
    let mut warnings = analysis.warnings.clone();
    let r0 = form.singular_radius();
    let by_residues = form.values(ns);
    // Any weight gives a valid rounding bound; one just outside the poles gives a tight one.
    let n_max = ns.iter().copied().max().unwrap_or(0) as f64;
    // (All poles at the origin: a small weight keeps each impulse's bound its own.)
    let weights = [1.0, (r0 * (1.0 + 1.0 / (n_max + 1.0))).max(1e-3)];
    let by_recurrence = recurrence_values(num, den, &analysis.removable, ns, &weights)?;
    if by_recurrence.is_none() {
        warnings.push("the difference equation was skipped (too much work for this n and degree); x comes from the residues".into());
    }

    // Two independent ways (no roots / the exact pole analysis), then the contour where they do not agree.
    let preferred = [WayName::LongDivision, WayName::Residues];
    let floor = by_residues.iter().map(|v| v.0.norm()).filter(|x| x.is_finite()).fold(0.0, f64::max);
    let two_ways = |i: usize| {
        let mut ways = Vec::with_capacity(3);
        ways.extend(by_recurrence.iter().map(|d| Way::new(WayName::LongDivision, d[i].0, d[i].1)));
        ways.push(Way::new(WayName::Residues, by_residues[i].0, by_residues[i].1));
        ways
    };
    let mut verdicts: Vec<_> = (0..ns.len()).map(|i| reconcile(&two_ways(i), &preferred, floor)).collect();
    let unsettled: Vec<usize> = (0..ns.len()).filter(|&i| verdicts[i].agreement != Agreement::Agree).collect();
    let mut by_contour = vec![None; ns.len()];
    let mut contour = None;
    if !unsettled.is_empty() {
        let checked: Vec<u64> = unsettled.iter().map(|&i| ns[i]).collect();
        contour = inverse_z_trapezoid(&mut |z: C| f.eval(z), r0, &checked, MAX_SAMPLES, budget)
            .map_err(|e| warnings.push(format!("the contour method failed: {e}")))
            .ok();
        for (&i, v) in unsettled.iter().zip(contour_list(contour.as_ref(), checked.len())) {
            by_contour[i] = v;
            let mut ways = two_ways(i);
            ways.extend(v.map(|(v, e)| Way::new(WayName::TrapezoidalRule, v, e)));
            verdicts[i] = reconcile(&ways, &preferred, floor);
        }
        if contour.is_some() && unsettled.iter().any(|&i| by_contour[i].is_none()) {
            warnings.push(format!(
                "by_contour is null for n > {}: the circles would need more than {MAX_SAMPLES} samples",
                MAX_SAMPLES / 2 - 1
            ));
        }
    }
    let radii = contour.map(|c| {
        warnings.extend(c.warnings);
        c.radii
    });
    let real = num.iter().chain(den).all(|c| c.im == 0.0);
    let x: Vec<C> = verdicts.iter().map(|v| v.value).collect();
    let response = InverseZResponse {
        x: x.iter().map(|v| v.re).collect(),
        x_imag: None,
        closed_form: Some(form.closed_form(real)),
        error_estimates: verdicts.iter().map(|v| v.error).collect(),
        roc: Roc { outer_radius_greater_than: r0 },
        by_residues: Some(by_residues.iter().map(|v| v.0.re).collect()),
        by_long_division: by_recurrence.as_ref().map(|d| d.iter().map(|v| v.0.re).collect()),
        long_division_error_estimates: by_recurrence.as_ref().map(|d| d.iter().map(|v| v.1).collect()),
        by_contour: by_contour.iter().map(|v| v.map(|v| v.0.re)).collect(),
        contour_error_estimates: by_contour.iter().map(|v| v.map(|v| v.1)).collect(),
        max_discrepancy: verdicts.iter().map(|v| v.max_discrepancy).fold(0.0, f64::max),
        poles: analysis.poles.iter().map(|p| PoleAt { at: [p.at.re, p.at.im], order: p.order }).collect(),
        method: Method::Rational,
        contour_radii: radii.unwrap_or_default(),
        warnings,
        stability: None,
        stability_warning: None,
    };
    Ok(finish(response, &x))
}

fn contour_list(contour: Option<&ContourResult>, len: usize) -> Vec<Option<(C, f64)>> {
    match contour {
        Some(c) => c.values.iter().map(|v| v.map(|v| (v.value, v.error))).collect(),
        None => vec![None; len],
    }
}

/// Any other X: the contour alone, outside the given or searched singular radius.
fn general(f: &Function, singular_radius: Option<f64>, ns: &[u64], budget: &mut Budget) -> Result<InverseZResponse, ApiError> {
    let (r0, poles, mut warnings) = match singular_radius {
        Some(r) if r.is_finite() && r >= 0.0 => (r, Vec::new(), Vec::new()),
        Some(_) => return Err(ApiError::invalid("\"singular_radius\" must be a finite number ≥ 0")),
        None => {
            let b = search(f, &hints(f), &pole_candidates(f), budget);
            (b.radius, b.poles.iter().map(|&(z, order)| PoleAt { at: [z.re + 0.0, z.im + 0.0], order }).collect(), b.warnings)
        }
    };
    let contour = inverse_z_trapezoid(&mut |z: C| f.eval(z), r0, ns, MAX_SAMPLES, budget)?;
    check_no_positive_powers(&contour, r0)?;
    let values = contour_list(Some(&contour), ns.len());
    if let Some(i) = values.iter().position(|v| v.is_none()) {
        return Err(ApiError::invalid(format!(
            "n = {} is too large for the contour method (a non-rational X allows n ≤ {})",
            ns[i],
            MAX_SAMPLES / 2 - 1
        )));
    }
    warnings.extend(contour.warnings.iter().cloned());
    let r0 = contour.inner_singularity.map_or(r0, |r| r.max(r0));
    let x: Vec<C> = values.iter().map(|v| v.map(|v| v.0).unwrap_or_default()).collect();
    let response = InverseZResponse {
        x: x.iter().map(|v| v.re).collect(),
        x_imag: None,
        closed_form: None,
        error_estimates: values.iter().map(|v| v.map(|v| v.1).unwrap_or(f64::INFINITY)).collect(),
        roc: Roc { outer_radius_greater_than: r0 },
        by_residues: None,
        by_long_division: None,
        long_division_error_estimates: None,
        by_contour: values.iter().map(|v| v.map(|v| v.0.re)).collect(),
        contour_error_estimates: values.iter().map(|v| v.map(|v| v.1)).collect(),
        max_discrepancy: contour.radius_discrepancy,
        poles,
        method: Method::Contour,
        contour_radii: contour.radii,
        warnings,
        stability: None,
        stability_warning: None,
    };
    Ok(finish(response, &x))
}

/// The imaginary parts (when significant) and the overflow warning, from the complex x.
fn finish(mut r: InverseZResponse, x: &[C]) -> InverseZResponse {
    let scale = x.iter().map(|v| v.norm()).filter(|v| v.is_finite()).fold(0.0, f64::max);
    // An imaginary part is significant beyond its estimate and rounding at the sequence's scale.
    if x.iter().zip(&r.error_estimates).any(|(v, e)| v.im.abs() > e + ROUNDING * scale) {
        r.warnings.push("x[n] is complex (X has complex coefficients): \"x\" holds the real parts, \"x_imag\" the imaginary parts".into());
        r.x_imag = Some(x.iter().map(|v| v.im).collect());
    }
    if x.iter().any(|v| !v.re.is_finite()) {
        r.warnings.push("some x[n] overflow double precision (shown as null)".into());
    }
    r
}

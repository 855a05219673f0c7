//! `inverse_z`: the causal inverse z-transform x[n], n ≥ 0, of X(z), with the
//! region of convergence |z| > max |singularity| (the causal, right-sided sequence).
//!
//! Rational X is computed three independent ways and the disagreement shown:
//! 1. **Long division** of the reversed polynomials (exact recurrence, no roots):
//!    `series::inverse_z_long_division`. This is `x` when affordable.
//! 2. **Residues**: partial fractions from the exact pole analysis, which also
//!    give the closed form (`series::inverse_z_residues`).
//! 3. **Contour**: trapezoidal Cauchy integrals on circles outside every pole
//!    (`series::inverse_z_trapezoid`).
//!
//! Any other X uses the contour method alone; its singularities are bounded by
//! `"singular_radius"` when given, else by structural candidates plus a search
//! of |z| < 10, and the contour's own positive-power check refuses an X that
//! grows at infinity or has a singularity outside the circles.

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use crate::api::input::{budget, compile_text};
use crate::text;
use crate::api::wire::{FunctionInput, Number};
use crate::contour::Contour;
use crate::api::error::{ApiError, ErrorCode};
use crate::expr::Function;
use crate::transforms::z::long_division::{causal_sequence, deflate};
use crate::transforms::z::residues::ResidueForm;
use crate::transforms::z::trapezoid::{inverse_z_trapezoid, ContourResult};
use crate::singular::find_singularities;
use crate::singular::rational_poles::analyse_rational_polished;
use crate::C;
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;

/// Most values of n per request.
pub const MAX_COUNT: usize = 10_000;
/// Largest n accepted.
pub const MAX_N: f64 = 1e6;
/// Most samples on one contour circle.
const MAX_SAMPLES: usize = 1 << 20;
/// Most coefficient operations for the long division.
const LONG_DIVISION_WORK: usize = 50_000_000;
/// Radius of the disk searched for singularities of a non-rational X.
const SEARCH_RADIUS: f64 = 10.0;
/// Largest |c_m|ρ^m / max|X| (m = 1..3) accepted as rounding noise.
const POSITIVE_POWER_LIMIT: f64 = 1e-9;

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
    /// Re x[n] from long division (rational X, when affordable).
    pub by_long_division: Option<Vec<f64>>,
    /// Re x[n] from contour integrals; `null` where n was too large for the sampling.
    pub by_contour: Vec<Option<f64>>,
    /// Error estimate of each contour value.
    pub contour_error_estimates: Vec<Option<f64>>,
    /// Largest |difference| between any two ways over all n (for non-rational X:
    /// between the two best contour radii).
    pub max_discrepancy: f64,
    pub poles: Vec<PoleAt>,
    /// `"rational"` or `"contour"`.
    pub method: String,
    /// Radii of the contour circles used.
    pub contour_radii: Vec<f64>,
    pub warnings: Vec<String>,
}

pub fn run(req: &InverseZRequest) -> Result<InverseZResponse, ApiError> {
    let input = FunctionInput {
        f: String::new(),
        var: req.var.clone(),
        params: req.params.clone(),
    };
    let f = compile_text(&req.x, &input, "X")?;
    let ns = indices(&req.n)?;
    let mut budget = budget(req.max_evaluations);
    let mut warnings = Vec::new();
    let mut response = match f.rational() {
        Some(r) => rational(&f, &r.num, &r.den, &ns, &mut budget, &mut warnings)?,
        None => general(&f, req.singular_radius, &ns, &mut budget, &mut warnings)?,
    };
    let r0 = response.roc.outer_radius_greater_than;
    if r0 > 1.0 + 1e-12 {
        warnings.push(format!(
            "a singularity lies outside the unit circle (|z| = {}): the sequence grows without bound (an unstable system). {}",
            text::real(r0),
            crate::api::input::CAUTION
        ));
    } else if r0 >= 1.0 - 1e-12 {
        warnings.push(format!(
            "a singularity lies on the unit circle: the sequence does not decay (a marginally stable system). {}",
            crate::api::input::CAUTION
        ));
    }
    response.warnings.extend(warnings);
    Ok(response)
}

/// Validate the indices: integers 0 ≤ n ≤ 10⁶, at most 10 000 of them.
fn indices(n: &[f64]) -> Result<Vec<u64>, ApiError> {
    if n.is_empty() {
        return Err(ApiError::invalid(
            "\"n\" is empty; give the indices wanted, e.g. \"n\": [0, 1, 2, 3]",
        ));
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
                Err(ApiError::invalid(format!(
                    "\"n\" must hold integers; {v} is not one"
                )))
            } else if v < 0.0 {
                Err(ApiError::invalid(format!(
                    "n must be ≥ 0 for the causal inverse (x[n] = 0 for n < 0); got {v}"
                )))
            } else if v > MAX_N {
                Err(ApiError::invalid(format!("n = {v} is too large; n ≤ 1000000")))
            } else {
                Ok(v as u64)
            }
        })
        .collect()
}

fn rational(
    f: &Function,
    num: &[C],
    den: &[C],
    ns: &[u64],
    budget: &mut crate::budget::Budget,
    warnings: &mut Vec<String>,
) -> Result<InverseZResponse, ApiError> {
    let analysis = analyse_rational_polished(num, den, &|z| f.eval_d(z))?;
    let form = ResidueForm::from_analysis(&analysis)?;
    warnings.extend(analysis.warnings.iter().cloned());
    let r0 = analysis
        .poles
        .iter()
        .map(|p| p.at.norm())
        .fold(0.0, f64::max);
    let n_max = ns.iter().copied().max().unwrap_or(0) as usize;

    let residues: Vec<(C, f64)> = ns.iter().map(|&n| form.value(n)).collect();

    // Long division on the reduced X (common factors removed first).
    let (mut rn, mut rd) = (num.to_vec(), den.to_vec());
    for r in &analysis.removable {
        rn = deflate(&rn, r.at, r.cancelled_order);
        rd = deflate(&rd, r.at, r.cancelled_order);
    }
    let work = (n_max + 1).saturating_mul(rn.len() + rd.len());
    let division: Option<Vec<C>> = if work <= LONG_DIVISION_WORK {
        match causal_sequence(&rn, &rd, n_max + 1) {
            Ok(seq) => Some(ns.iter().map(|&n| seq[n as usize]).collect()),
            Err(e) => return Err(ApiError::from(e)),
        }
    } else {
        warnings.push("the long division was skipped (too much work for this n and degree); x comes from the residues".into());
        None
    };

    let mut eval = |z: C| f.eval(z);
    let contour = match inverse_z_trapezoid(&mut eval, r0, ns, MAX_SAMPLES, budget) {
        Ok(c) => Some(c),
        Err(e) => {
            warnings.push(format!("the contour method failed: {e}"));
            None
        }
    };
    let contour_values = contour_list(contour.as_ref(), ns.len());
    if contour_values.iter().any(|v| v.is_none()) {
        warnings.push(format!(
            "by_contour is null for n > {}: the circles would need more than {MAX_SAMPLES} samples",
            MAX_SAMPLES / 2 - 1
        ));
    }

    let mut x = Vec::with_capacity(ns.len());
    let mut errors = Vec::with_capacity(ns.len());
    let mut discrepancy = 0.0f64;
    for i in 0..ns.len() {
        let mut ways: Vec<(C, f64)> = vec![residues[i]];
        if let Some(c) = contour_values[i] {
            ways.push(c);
        }
        let value = division.as_ref().map(|d| d[i]).unwrap_or(residues[i].0);
        let mut bound = if division.is_some() {
            f64::INFINITY
        } else {
            residues[i].1
        };
        for &(v, e) in &ways {
            let d = (value - v).norm();
            bound = bound.min(d + e);
        }
        let all: Vec<C> = std::iter::once(value)
            .chain(ways.iter().map(|w| w.0))
            .collect();
        for a in &all {
            for b in &all {
                let d = (*a - *b).norm();
                if d.is_finite() {
                    discrepancy = discrepancy.max(d);
                }
            }
        }
        x.push(value);
        errors.push(bound);
    }
    let real = num.iter().chain(den).all(|c| c.im == 0.0);
    let closed_form = Some(form.closed_form(real));
    let radii = contour.map(|c| {
        warnings.extend(c.warnings.iter().cloned());
        c.radii
    });
    let poles = analysis
        .poles
        .iter()
        .map(|p| PoleAt {
            at: [p.at.re, p.at.im],
            order: p.order,
        })
        .collect();
    Ok(build(
        x,
        errors,
        closed_form,
        r0,
        Some(residues.iter().map(|v| v.0.re).collect()),
        division.map(|d| d.iter().map(|v| v.re).collect()),
        &contour_values,
        discrepancy,
        poles,
        "rational",
        radii,
        warnings,
    ))
}

fn contour_list(contour: Option<&ContourResult>, len: usize) -> Vec<Option<(C, f64)>> {
    match contour {
        Some(c) => c
            .values
            .iter()
            .map(|v| v.map(|v| (v.value, v.error)))
            .collect(),
        None => vec![None; len],
    }
}

fn general(
    f: &Function,
    singular_radius: Option<f64>,
    ns: &[u64],
    budget: &mut crate::budget::Budget,
    warnings: &mut Vec<String>,
) -> Result<InverseZResponse, ApiError> {
    let (r0, poles) = match singular_radius {
        Some(r) if r.is_finite() && r >= 0.0 => (r, Vec::new()),
        Some(_) => {
            return Err(ApiError::invalid(
                "\"singular_radius\" must be a finite number ≥ 0",
            ))
        }
        None => search_singularities(f, budget, warnings),
    };
    let mut eval = |z: C| f.eval(z);
    let contour =
        inverse_z_trapezoid(&mut eval, r0, ns, MAX_SAMPLES, budget)?;
    if !(contour.positive_power_ratio <= POSITIVE_POWER_LIMIT) {
        return Err(ApiError::new(ErrorCode::NotApplicable, format!(
            "on |z| = {} X has positive powers of z (relative size {:.1e}): either X grows as |z| → ∞ (then it is not the transform of a causal sequence) or X has a singularity farther out than |z| = {}; give \"singular_radius\" at least as large as every singularity's modulus",
            text::real(contour.largest_radius),
            contour.positive_power_ratio,
            text::real(r0)
        )));
    }
    let values = contour_list(Some(&contour), ns.len());
    if let Some(i) = values.iter().position(|v| v.is_none()) {
        return Err(ApiError::invalid(format!(
            "n = {} is too large for the contour method (a non-rational X allows n ≤ {})",
            ns[i],
            MAX_SAMPLES / 2 - 1
        )));
    }
    let x: Vec<C> = values
        .iter()
        .map(|v| v.map(|v| v.0).unwrap_or_default())
        .collect();
    let errors: Vec<f64> = values
        .iter()
        .map(|v| v.map(|v| v.1).unwrap_or(f64::INFINITY))
        .collect();
    warnings.extend(contour.warnings.iter().cloned());
    Ok(build(
        x,
        errors,
        None,
        r0,
        None,
        None,
        &values,
        contour.radius_discrepancy,
        poles,
        "contour",
        Some(contour.radii),
        warnings,
    ))
}

/// The largest singularity modulus of a non-rational X: structural candidates
/// (essential and branch points) and whatever a search of |z| < 10 finds.
fn search_singularities(
    f: &Function,
    budget: &mut crate::budget::Budget,
    warnings: &mut Vec<String>,
) -> (f64, Vec<PoleAt>) {
    let h = crate::api::input::hints(f);
    let mut r0 = h
        .essential_candidates
        .iter()
        .chain(&h.branch_candidates)
        .map(|z| z.norm())
        .filter(|r| r.is_finite())
        .fold(0.0, f64::max);
    let mut poles = Vec::new();
    let eval = |z: C| f.eval(z);
    let eval_d = |z: C| f.eval_d(z);
    let disk = Contour::circle(C::new(0.0, 0.0), SEARCH_RADIUS);
    match find_singularities(&eval, &eval_d, &disk, &h, budget) {
        Ok(found) => {
            for p in &found.poles {
                r0 = r0.max(p.at.norm());
                poles.push(PoleAt { at: [p.at.re, p.at.im], order: p.order });
            }
            for z in found.essential.iter().chain(&found.branch_points) {
                r0 = r0.max(z.norm());
            }
        }
        Err(e) => warnings.push(format!(
            "the disk |z| < {SEARCH_RADIUS} was not searched for singularities ({e}); give \"singular_radius\" to be sure"
        )),
    }
    (r0, poles)
}

#[allow(clippy::too_many_arguments)]
fn build(
    x: Vec<C>,
    errors: Vec<f64>,
    closed_form: Option<String>,
    r0: f64,
    by_residues: Option<Vec<f64>>,
    by_long_division: Option<Vec<f64>>,
    contour: &[Option<(C, f64)>],
    max_discrepancy: f64,
    poles: Vec<PoleAt>,
    method: &str,
    radii: Option<Vec<f64>>,
    warnings: &mut Vec<String>,
) -> InverseZResponse {
    let scale = x
        .iter()
        .map(|v| v.norm())
        .filter(|v| v.is_finite())
        .fold(0.0, f64::max);
    let significant = x
        .iter()
        .zip(&errors)
        .any(|(v, e)| v.im.abs() > e + 1e-12 * scale);
    let x_imag = if significant {
        warnings.push("x[n] is complex (X has complex coefficients): \"x\" holds the real parts, \"x_imag\" the imaginary parts".into());
        Some(x.iter().map(|v| v.im).collect())
    } else {
        None
    };
    if x.iter().any(|v| !(v.re.is_finite())) {
        warnings.push("some x[n] overflow double precision (shown as null)".into());
    }
    InverseZResponse {
        x: x.iter().map(|v| v.re).collect(),
        x_imag,
        closed_form,
        error_estimates: errors,
        roc: Roc {
            outer_radius_greater_than: r0,
        },
        by_residues,
        by_long_division,
        by_contour: contour.iter().map(|v| v.map(|v| v.0.re)).collect(),
        contour_error_estimates: contour.iter().map(|v| v.map(|v| v.1)).collect(),
        max_discrepancy,
        poles,
        method: method.into(),
        contour_radii: radii.unwrap_or_default(),
        warnings: std::mem::take(warnings),
    }
}

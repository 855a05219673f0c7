//! `residue`: the residue of f at one point or at infinity, with the point's kind and order.
//!
//! Rational f goes to exact partial-fraction algebra; anything else to the
//! trapezoidal rule on small circles with classification of the point.

use crate::api::input::{budget, compile, hints, point};
use crate::text;
use crate::api::wire::{pair, FunctionInput, BUDGET_FIELD, FUNCTION_FIELDS, Point, PointKind};
use crate::api::shape::{Expect, Field};
use crate::api::error::ApiError;
use crate::expr::Function;
use crate::singular::rational_check::cross_check;
use crate::singular::rational_poles::{PointKind as RationalKind, analyse_function, analyse_rational, residue_at_point_factored};
use crate::singular::{classify_infinity, classify_point, PointResult};
use crate::C;
use serde::{Deserialize, Serialize};

/// The declared fields of [`ResidueRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[FUNCTION_FIELDS, &[Field::required("at", Expect::Point), BUDGET_FIELD]];

/// `residue`: the residue of f at one point or at infinity.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ResidueRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub at: Point,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ResidueResponse {
    /// `null` where no residue exists (a branch point, or infinity not isolated).
    pub residue: Option<[f64; 2]>,
    /// `"pole"`, `"removable"`, `"regular"`, `"essential"` or `"branch_point"`.
    pub kind: PointKind,
    pub order: Option<u32>,
    pub error_estimate: Option<f64>,
    /// Principal-part coefficients `c_{-1}, c_{-2}, …` where known.
    pub principal_part: Vec<[f64; 2]>,
    /// `true` where poles of f accumulate at the point (tan, Γ, … at infinity): it is then
    /// not an isolated singularity (`kind` stays `"essential"`, `residue` is `null`).
    pub accumulation: bool,
    pub warnings: Vec<String>,
}

pub fn run(req: &ResidueRequest) -> Result<ResidueResponse, ApiError> {
    let f = compile(&req.function)?;
    match (point(&req.at, "at")?, f.rational()) {
        (Some(a), Some(r)) => rational_at(&f, r, a, req.max_evaluations),
        (None, Some(r)) => rational_at_infinity(&r.num, &r.den),
        (at, None) => general(&f, at, req.max_evaluations),
    }
}

fn rational_at(f: &Function, rational: &crate::expr::Rational, a: C, max_evaluations: Option<u64>) -> Result<ResidueResponse, ApiError> {
    // Method 1: exact algebra at the point, polished on the expression as typed.
    let r = residue_at_point_factored(rational, a, &|z| f.eval_d(z))?;
    let mut warnings = Vec::new();
    let mut error_estimate = r.error_estimate;
    if r.kind == RationalKind::Pole {
        // Method 2, the same independent check as in `singularities`: sample the expression as typed.
        let all: Vec<C> = analyse_function(f)
            .map(|x| x.poles.iter().map(|p| p.at).collect())
            .unwrap_or_default();
        let check = cross_check(&|z| f.eval(z), &[(r.at, r.residue, r.error_estimate)], &all, &mut budget(max_evaluations).weighted(f.weight()));
        if let Some(Some(bound)) = check.bounds.first() {
            error_estimate = error_estimate.max(*bound);
        }
        if check.disagreeing > 0 {
            warnings.push(format!(
                "the residue from the expanded polynomials disagrees with the trapezoidal rule on the expression \
                 as typed by {:.2e}; the expanded coefficients are sensitive to rounding, so this residue is uncertain",
                crate::text::Sci(check.worst)
            ));
        }
    } else {
        if let (Some(p), Some(d)) = (r.nearest_pole, r.distance_to_nearest_pole) {
            if d < 1e-3 * p.norm().max(1.0) {
                warnings.push(format!(
                    "a pole lies {d:.3e} away, at {}; ask for the residue there to get its residue",
                    text::complex(p, 0.0)
                ));
            }
        }
    }
    Ok(ResidueResponse {
        residue: Some(pair(r.residue)),
        kind: match r.kind {
            RationalKind::Pole => PointKind::Pole,
            RationalKind::Removable => PointKind::Removable,
            RationalKind::Regular => PointKind::Regular,
        },
        order: r.order,
        error_estimate: Some(error_estimate),
        principal_part: r.principal_part.iter().map(|&c| pair(c)).collect(),
        accumulation: false,
        warnings,
    })
}

fn rational_at_infinity(num: &[C], den: &[C]) -> Result<ResidueResponse, ApiError> {
    let a = analyse_rational(num, den)?;
    let (kind, order) =
        if a.infinity_order > 0 { (PointKind::Pole, Some(a.infinity_order as u32)) } else { (PointKind::Regular, None) };
    Ok(ResidueResponse {
        residue: Some(pair(a.residue_at_infinity)),
        kind,
        order,
        error_estimate: Some(a.residue_sum_tolerance.max(f64::EPSILON * a.residue_at_infinity.norm())),
        principal_part: Vec::new(),
        accumulation: false,
        warnings: a.warnings,
    })
}

fn general(f: &Function, at: Option<C>, max_evaluations: Option<u64>) -> Result<ResidueResponse, ApiError> {
    let hints = hints(f);
    let mut budget = budget(max_evaluations).weighted(f.weight());
    let eval = |z: C| f.eval(z);
    let r: PointResult = match at {
        Some(a) => classify_point(&eval, a, &hints, &mut budget),
        None => classify_infinity(&eval, &hints, &mut budget),
    }
    ?;
    let principal_part = if at.is_some() { r.principal_part.iter().map(|&c| pair(c)).collect() } else { Vec::new() };
    Ok(ResidueResponse {
        residue: r.residue.map(pair),
        kind: r.kind.into(),
        order: r.order,
        error_estimate: r.residue.map(|_| r.error_estimate),
        principal_part,
        // The expression's structure says so (expr/analysis: poles_accumulate_at_infinity).
        accumulation: at.is_none() && hints.poles_accumulate_at_infinity,
        warnings: r.warnings,
    })
}

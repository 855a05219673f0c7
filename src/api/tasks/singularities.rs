//! `singularities`: poles (with orders and residues), zeros, essential
//! singularities and branch points inside a region, plus the residue at infinity.

use crate::api::error::ApiError;
use crate::api::input::{budget, checked_contour, compile, hints, pole_candidates};
use crate::api::wire::{pair, ContourShape, FunctionInput, FUNCTION_FIELDS, Method};
use crate::api::shape::Field;
use crate::api::wire::{BUDGET_FIELD, CONTOUR};
use crate::contour::Contour;
use crate::expr::Function;
use crate::singular::classify::essential_residues;
use crate::singular::rational_check::cross_check;
use crate::singular::rational_in_region::in_region;
use crate::singular::rational_poles::{analyse_function, sensitivity_warning};
use crate::singular::removable::removable_points;
use crate::singular::{classify_infinity, find_singularities};
use crate::text;
use crate::C;
use serde::{Deserialize, Serialize};

/// The declared fields of [`SingularitiesRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[FUNCTION_FIELDS, &[Field::required("region", CONTOUR), BUDGET_FIELD]];

/// `singularities`: poles, zeros, essential singularities and branch points in a region.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct SingularitiesRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub region: ContourShape,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PoleOut {
    pub at: [f64; 2],
    pub order: u32,
    pub residue: Option<[f64; 2]>,
    pub error_estimate: Option<f64>,
    /// `c_{-1}, c_{-2}, …, c_{-order}`.
    pub principal_part: Vec<[f64; 2]>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ZeroOut {
    pub at: [f64; 2],
    pub order: u32,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PointOut {
    pub at: [f64; 2],
    /// For essential singularities, the residue `c_{-1}` where it could be computed.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub residue: Option<[f64; 2]>,
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub error_estimate: Option<f64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct SingularitiesResponse {
    pub poles: Vec<PoleOut>,
    pub zeros: Vec<ZeroOut>,
    pub essential: Vec<PointOut>,
    pub branch_points: Vec<PointOut>,
    /// Removable singularities (common roots of numerator and denominator).
    pub removable: Vec<PointOut>,
    pub residue_at_infinity: Option<[f64; 2]>,
    /// `|sum of all finite residues + residue at infinity|`, which must be ~0 (rational f).
    pub residue_sum_defect: Option<f64>,
    /// Zeros minus poles inside the region by the argument principle, where counted.
    pub zeros_minus_poles: Option<i64>,
    /// `"rational"` (exact polynomial algebra) or `"numerical"` (sampling methods).
    pub method: Method,
    pub warnings: Vec<String>,
}

/// The plan: rational f by exact algebra, cross-checked by sampling the
/// expression as typed; any other f by the sampling search of the region.
pub fn run(req: &SingularitiesRequest) -> Result<SingularitiesResponse, ApiError> {
    let f = compile(&req.function)?;
    // A region is a set: its contents count the same whichever way it is drawn.
    let region = checked_contour(&req.region, "region")?.counter_clockwise();
    match f.rational() {
        Some(_) => rational(&f, &region),
        None => general(&f, &region, req.max_evaluations),
    }
}

/// Said where a pole of order m > 1 is reported.
const MULTIPLE_POLE_CAUTION: &str = "a pole of order m > 1 could also be m separate poles closer together than double precision \
can tell apart (about 1e-8 relative for m = 2), which would have large residues of opposite \
sign; this matters when coefficients were rounded";

fn rational(f: &Function, region: &Contour) -> Result<SingularitiesResponse, ApiError> {
    // Method 1: exact algebra on the coefficients, polished on the expression as typed.
    let a = analyse_function(f)?;
    let part = in_region(&a, region);
    let mut warnings = a.warnings.clone();
    warnings.extend(part.on_boundary.iter().map(|(what, z)| {
        format!("a {what} at {} lies on the region's boundary; it is left out: move the boundary", text::complex(*z, 0.0))
    }));
    let mut poles: Vec<PoleOut> = part.poles.iter().map(|p| pole_out(p.at, p.order, Some((p.residue, p.error_estimate)), &p.principal_part)).collect();

    // Method 2: the trapezoidal rule on the expression as typed, one circle per pole.
    let claims: Vec<(C, C, f64)> = part.poles.iter().map(|p| (p.at, p.residue, p.error_estimate)).collect();
    let all: Vec<C> = a.poles.iter().map(|p| p.at).collect();
    let check = cross_check(&|z| f.eval(z), &claims, &all, &mut budget(None).weighted(f.weight()));
    for ((pole, bound), p) in poles.iter_mut().zip(&check.bounds).zip(&part.poles) {
        if let Some(b) = bound {
            pole.error_estimate = Some(pole.error_estimate.unwrap_or(0.0).max(*b));
            // The check raised the estimate past six digits where the analysis had not.
            if sensitivity_warning(p.at, p.residue, p.error_estimate).is_none() {
                warnings.extend(sensitivity_warning(p.at, p.residue, *b));
            }
        }
    }
    if check.disagreeing > 0 {
        warnings.push(format!(
            "{} residue(s) from the expanded polynomials disagree with the trapezoidal rule on the \
             expression as typed (by up to {:.2e}); the expanded coefficients are sensitive to rounding, so \
             these poles and residues are uncertain — their error estimates now include the disagreement",
            check.disagreeing, crate::text::Sci(check.worst)
        ));
    }
    if part.poles.iter().any(|p| p.order > 1 && p.order_inferred) {
        warnings.push(MULTIPLE_POLE_CAUTION.into());
    }
    if a.residue_sum_defect > a.residue_sum_tolerance.max(1e-300) * 10.0 {
        warnings.push(format!(
            "the residues do not add up: |Σ residues + Res∞| = {:.2e} exceeds what rounding explains ({:.2e}); treat the residues with care",
            crate::text::Sci(a.residue_sum_defect), crate::text::Sci(a.residue_sum_tolerance)
        ));
    }
    Ok(SingularitiesResponse {
        poles,
        zeros: part.zeros.iter().map(|z| ZeroOut { at: pair(z.at), order: z.order }).collect(),
        essential: Vec::new(),
        branch_points: Vec::new(),
        removable: part.removable.iter().map(|&z| point_out(z, Some((C::new(0.0, 0.0), None)))).collect(),
        residue_at_infinity: Some(pair(a.residue_at_infinity)),
        residue_sum_defect: Some(a.residue_sum_defect),
        zeros_minus_poles: Some(part.zeros_minus_poles),
        method: Method::Rational,
        warnings,
    })
}

fn general(f: &Function, region: &Contour, max_evaluations: Option<u64>) -> Result<SingularitiesResponse, ApiError> {
    let hints = hints(f);
    let mut budget = budget(max_evaluations).weighted(f.weight());
    let eval = |z: C| f.eval(z);
    // Method 1: the region search (argument principle, AAA, Newton, classification).
    let found = find_singularities(&eval, &|z| f.eval_d(z), region, &hints, &mut budget)?;
    let mut warnings = found.warnings.clone();
    // Method 2: residues at the essential points from Laurent coefficients on circles.
    let essential_res = essential_residues(&eval, &found.essential, &hints, &mut budget);
    // Method 3: the expression's own denominators point at removable points.
    let known: Vec<C> = found
        .poles
        .iter()
        .map(|p| p.at)
        .chain(found.zeros.iter().map(|z| z.at))
        .chain(found.essential.iter().copied())
        .chain(found.branch_points.iter().copied())
        .collect();
    let removable = removable_points(&eval, &pole_candidates(f), region, &known, &hints, &mut budget);
    warnings.extend(removable.missed.iter().map(|(kind, z)| {
        format!(
            "the search missed a {} at {} that the expression's denominator points to; check it with \"residue\"",
            kind.name(),
            text::complex(*z, 0.0)
        )
    }));
    // Method 4: the point at infinity.
    let residue_at_infinity = match classify_infinity(&eval, &hints, &mut budget) {
        Ok(r) => {
            warnings.extend(r.warnings.into_iter().map(|w| format!("at infinity: {w}")));
            r.residue.map(pair)
        }
        Err(e) => {
            warnings.push(format!("residue at infinity not computed: {e}"));
            None
        }
    };
    Ok(SingularitiesResponse {
        poles: found.poles.iter().map(|p| pole_out(p.at, p.order, p.residue.map(|r| (r, p.error_estimate)), &p.principal_part)).collect(),
        zeros: found.zeros.iter().map(|z| ZeroOut { at: pair(z.at), order: z.order }).collect(),
        essential: found.essential.iter().zip(essential_res).map(|(&z, r)| point_out(z, r.map(|(c, e)| (c, Some(e))))).collect(),
        branch_points: found.branch_points.iter().map(|&z| point_out(z, None)).collect(),
        removable: removable.points.iter().map(|&z| point_out(z, Some((C::new(0.0, 0.0), None)))).collect(),
        residue_at_infinity,
        residue_sum_defect: None,
        // null where a branch cut crossing the boundary made the count impossible
        zeros_minus_poles: found.boundary_count,
        method: Method::Numerical,
        warnings,
    })
}

fn pole_out(at: C, order: u32, residue: Option<(C, f64)>, principal_part: &[C]) -> PoleOut {
    PoleOut {
        at: pair(at),
        order,
        residue: residue.map(|(r, _)| pair(r)),
        error_estimate: residue.map(|(_, e)| e),
        principal_part: principal_part.iter().map(|&c| pair(c)).collect(),
    }
}

fn point_out(at: C, residue: Option<(C, Option<f64>)>) -> PointOut {
    PointOut { at: pair(at), residue: residue.map(|(r, _)| pair(r)), error_estimate: residue.and_then(|(_, e)| e) }
}

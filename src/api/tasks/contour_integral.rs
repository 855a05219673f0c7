//! `contour_integral`: ∮ f dz computed three independent ways, with any
//! disagreement shown rather than hidden.
//!
//! 1. **Quadrature** (`quad::contour_quadrature`), split at branch-cut
//!    crossings where f jumps (`quad::split_at_cuts`).
//! 2. **Inside residues**: 2πi Σ w(a) Res_a f (`integrals::contour_residues`),
//!    exact poles for rational f, located points otherwise.
//! 3. **Outside residues** (rational f only): −2πi k (Σ_{w=0} Res + Res∞).
//!
//! The ways are compared by the one agreement rule (`ways::reconcile`); for
//! rational f the value comes from the residues (exact algebra).

use crate::api::error::ApiError;
use crate::api::input::{budget, checked_contour, compile, hints};
use crate::api::wire::{pair, ContourRequest, Verdict, Method};
use std::collections::BTreeMap;
use crate::contour::covering::covering_regions;
use crate::integrals::contour_residues::{any_near_contour, check_on_and_near, general_residue_ways, rational_residue_ways, PointKind};
use crate::quad::contour_quadrature::contour_integral;
use crate::quad::split_at_cuts::integral_split_at_cuts;
use crate::quad::Tolerance;
use crate::singular::cut_crossing::cut_crossings;
use crate::ways::{reconcile, Agreement, Way, WayName};
use crate::C;
use serde::{Deserialize, Serialize};

/// `contour_integral`: ∮ f dz computed three independent ways (quadrature,
/// residues inside, residues outside plus infinity), disagreement shown.
pub type ContourIntegralRequest = ContourRequest;

/// The kind of a singular point on the wire.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum SingularKind {
    Pole,
    Essential,
    BranchPoint,
}

/// Which way `value` is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum ValueFrom {
    Quadrature,
    InsideResidues,
    OutsideResidues,
}

/// A singular point with the contour's winding number about it.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct WindingOut {
    pub at: [f64; 2],
    pub winding: i32,
    pub kind: SingularKind,
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub order: Option<u32>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ContourIntegralResponse {
    pub value: [f64; 2],
    pub by_quadrature: [f64; 2],
    pub by_inside_residues: Option<[f64; 2]>,
    pub by_outside_residues: Option<[f64; 2]>,
    /// Largest pairwise |difference| among the available ways.
    pub max_discrepancy: f64,
    pub winding: Vec<WindingOut>,
    pub value_from: ValueFrom,
    pub error_estimate: f64,
    pub quadrature_error_estimate: f64,
    pub inside_residues_error_estimate: Option<f64>,
    pub outside_residues_error_estimate: Option<f64>,
    /// One sentence: do the ways agree, and to what.
    pub agreement: String,
    /// The same as a machine word: `"single"`, `"agree"`, `"covered"` or `"disagree"`.
    pub verdict: Verdict,
    /// Why a way is missing, by its wire name (`"inside_residues"`, `"outside_residues"`).
    pub not_available: BTreeMap<String, String>,
    pub method: Method,
    pub warnings: Vec<String>,
}

pub fn run(req: &ContourIntegralRequest) -> Result<ContourIntegralResponse, ApiError> {
    let f = compile(&req.function)?;
    let contour = &checked_contour(&req.contour, "contour")?;
    let mut budget = budget(req.max_evaluations).weighted(f.weight());
    let (eval, eval_d) = (|z: C| f.eval(z), |z: C| f.eval_d(z));
    let hints = hints(&f);

    // Plan: residues (exact for rational f), the quadrature split wherever a cut crosses.
    let mut crossings = Vec::new();
    let (residues, method) = match f.rational() {
        Some(r) => (rational_residue_ways(&r.num, &r.den, &eval_d, contour)?, Method::Rational),
        None => {
            if hints.uses_branch_functions {
                crossings = cut_crossings(&eval, contour, &mut budget)?;
            }
            let regions = covering_regions(contour);
            (general_residue_ways(&eval, &eval_d, &hints, contour, &regions, &crossings, &mut budget)?, Method::Numerical)
        }
    };
    let mut warnings = residues.warnings;
    warnings.extend(check_on_and_near(&residues.points, contour)?);
    let mut g = eval;
    let q = if crossings.is_empty() {
        contour_integral(&mut g, contour, Tolerance::default(), &mut budget)?
    } else {
        integral_split_at_cuts(&mut g, contour, &crossings, &mut budget)?
    };
    if !q.converged {
        warnings.push(format!(
            "the quadrature did not reach its tolerance (error estimate {:.1e}); a singularity may lie close to the contour or f may jump across it",
            crate::text::Sci(q.error_estimate)
        ));
    }

    // Reconcile: residues preferred for rational f; scale floor 1.
    let quadrature = Way::new(WayName::Quadrature, q.value, q.error_estimate);
    let ways: Vec<Way> = [Some(quadrature), residues.inside, residues.outside].into_iter().flatten().collect();
    let preferred: &[WayName] = match method {
        Method::Rational => &[WayName::InsideResidues, WayName::OutsideResidues],
        Method::Numerical => &[],
    };
    let verdict = reconcile(&ways, preferred, 1.0);
    let why = if any_near_contour(&residues.points, contour) {
        "a singularity lies close to the contour, which slows the quadrature and makes the residue side sensitive to its exact position"
    } else {
        "a singularity may have been missed or lie close to the contour; try a slightly different contour"
    };
    let mut agreement = verdict.sentence(why);
    let missing: Vec<&str> = [(WayName::InsideResidues, residues.inside), (WayName::OutsideResidues, residues.outside)]
        .into_iter()
        .filter(|(_, w)| w.is_none())
        .map(|(n, _)| n.words())
        .collect();
    if matches!(verdict.agreement, Agreement::Single | Agreement::Agree) && !missing.is_empty() {
        agreement.push_str(&format!(" ({} not available; see warnings)", missing.join(" and ")));
    }
    if verdict.needs_warning() {
        warnings.push(agreement.clone());
    }

    let winding = residues
        .points
        .iter()
        .filter_map(|p| {
            let kind = match p.kind {
                PointKind::Pole => SingularKind::Pole,
                PointKind::Essential => SingularKind::Essential,
                PointKind::BranchPoint => SingularKind::BranchPoint,
            };
            p.winding.map(|winding| WindingOut { at: pair(p.at), winding, kind, order: p.order })
        })
        .collect();
    let value_from = match verdict.from {
        WayName::InsideResidues => ValueFrom::InsideResidues,
        WayName::OutsideResidues => ValueFrom::OutsideResidues,
        _ => ValueFrom::Quadrature,
    };
    Ok(ContourIntegralResponse {
        value: pair(verdict.value),
        by_quadrature: pair(quadrature.value),
        by_inside_residues: residues.inside.map(|w| pair(w.value)),
        by_outside_residues: residues.outside.map(|w| pair(w.value)),
        max_discrepancy: verdict.max_discrepancy,
        winding,
        value_from,
        error_estimate: verdict.error,
        quadrature_error_estimate: quadrature.error,
        inside_residues_error_estimate: residues.inside.map(|w| w.error),
        outside_residues_error_estimate: residues.outside.map(|w| w.error),
        agreement,
        verdict: verdict.agreement.into(),
        not_available: residues.unavailable.iter().map(|(w, why)| (w.wire().to_string(), why.clone())).collect(),
        method,
        warnings,
    })
}

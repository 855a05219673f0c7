//! `singularities`: poles (with orders and residues), zeros, essential
//! singularities and branch points inside a region, plus the residue at infinity.

use crate::api::input::{budget, checked_contour, compile, hints};
use crate::text;
use crate::api::wire::{pair, FunctionInput};
use crate::contour::Contour;
use crate::api::error::ApiError;
use crate::expr::Function;
use crate::singular::rational_check::check_residues;
use crate::singular::rational_poles::analyse_rational_polished;
use crate::singular::{classify_infinity, classify_point, find_singularities, Kind};
use crate::C;
use serde::{Deserialize, Serialize};

/// `singularities`: poles, zeros, essential singularities and branch points in a region.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct SingularitiesRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub region: Contour,
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
    pub method: String,
    pub warnings: Vec<String>,
}

pub fn run(req: &SingularitiesRequest) -> Result<SingularitiesResponse, ApiError> {
    let f = compile(&req.function)?;
    checked_contour(&req.region, "region")?;
    match f.rational() {
        Some(r) => rational(&f, &r.num, &r.den, &req.region),
        None => general(&f, &req.region, req.max_evaluations),
    }
}

/// Which side of the region's boundary a point is on; `None` on the boundary.
fn inside(region: &Contour, z: C) -> Option<bool> {
    region.winding_number(z).map(|w| w != 0)
}

fn rational(f: &Function, num: &[C], den: &[C], region: &Contour) -> Result<SingularitiesResponse, ApiError> {
    let a = analyse_rational_polished(num, den, &|z| f.eval_d(z))?;
    let mut warnings = a.warnings.clone();
    let mut boundary = Vec::new();
    let mut on_boundary = |what: &str, z: C| {
        boundary.push(format!(
            "a {what} at {} lies on the region's boundary; it is left out: move the boundary",
            text::complex(z, 0.0)
        ))
    };
    let mut poles = Vec::new();
    let mut balance: i64 = 0;
    for p in &a.poles {
        match inside(region, p.at) {
            Some(true) => {
                balance -= p.order as i64;
                poles.push(PoleOut {
                    at: pair(p.at),
                    order: p.order,
                    residue: Some(pair(p.residue)),
                    error_estimate: Some(p.error_estimate),
                    principal_part: p.principal_part.iter().map(|&c| pair(c)).collect(),
                })
            }
            Some(false) => {}
            None => on_boundary("pole", p.at),
        }
    }
    let mut zeros = Vec::new();
    for z in &a.zeros {
        match inside(region, z.at) {
            Some(true) => {
                balance += z.order as i64;
                zeros.push(ZeroOut { at: pair(z.at), order: z.order })
            }
            Some(false) => {}
            None => on_boundary("zero", z.at),
        }
    }
    warnings.append(&mut boundary);
    cross_check(f, &mut poles, &a.poles.iter().map(|p| p.at).collect::<Vec<_>>(), &mut warnings);
    let removable = a
        .removable
        .iter()
        .filter(|r| inside(region, r.at) == Some(true))
        .map(|r| PointOut { at: pair(r.at), residue: Some([0.0, 0.0]), error_estimate: None })
        .collect();
    if poles.iter().any(|p| p.order > 1) {
        warnings.push(
            "a pole of order m > 1 could also be m separate poles closer together than double precision \
             can tell apart (about 1e-8 relative for m = 2), which would have large residues of opposite \
             sign; this matters when coefficients were rounded"
                .into(),
        );
    }
    if a.residue_sum_defect > a.residue_sum_tolerance.max(1e-300) * 10.0 {
        warnings.push(format!(
            "the residues do not add up: |Σ residues + Res∞| = {:.2e} exceeds what rounding explains ({:.2e}); treat the residues with care",
            a.residue_sum_defect, a.residue_sum_tolerance
        ));
    }
    Ok(SingularitiesResponse {
        poles,
        zeros,
        essential: Vec::new(),
        branch_points: Vec::new(),
        removable,
        residue_at_infinity: Some(pair(a.residue_at_infinity)),
        residue_sum_defect: Some(a.residue_sum_defect),
        zeros_minus_poles: Some(balance),
        method: "rational".into(),
        warnings,
    })
}

/// Compare each exact residue with the trapezoidal rule on the expression as
/// typed; where they disagree, say so and widen the error estimate to cover it.
fn cross_check(f: &Function, poles: &mut [PoleOut], all: &[C], warnings: &mut Vec<String>) {
    let claims: Vec<(C, C, f64)> = poles
        .iter()
        .map(|p| {
            let r = p.residue.unwrap_or([0.0, 0.0]);
            (C::new(p.at[0], p.at[1]), C::new(r[0], r[1]), p.error_estimate.unwrap_or(0.0))
        })
        .collect();
    let eval = |z: C| f.eval(z);
    let checks = check_residues(&eval, &claims, all, &mut budget(None));
    let mut disagreeing = 0;
    let mut worst: f64 = 0.0;
    for (pole, check) in poles.iter_mut().zip(checks) {
        let Some(check) = check else { continue };
        // Two independent values: the exact one is claimed no better than their
        // difference plus the sampled value's own error.
        let bound = check.difference + check.sampled_error;
        pole.error_estimate = Some(pole.error_estimate.unwrap_or(0.0).max(bound));
        if !check.agrees {
            disagreeing += 1;
            worst = worst.max(check.difference);
        }
    }
    if disagreeing > 0 {
        warnings.push(format!(
            "{disagreeing} residue(s) from the expanded polynomials disagree with the trapezoidal rule on the \
             expression as typed (by up to {worst:.2e}); the expanded coefficients are sensitive to rounding, so \
             these poles and residues are uncertain — their error estimates now include the disagreement"
        ));
    }
}

/// Zeros of rational denominators inside the region that turned out to be
/// neither poles nor zeros: classify them, and keep the removable ones
/// (sin(z)/z at 0). The sampling search cannot see these: f is finite there.
fn removable_points(
    f: &Function,
    region: &Contour,
    found: &crate::singular::RegionResult,
    hints: &crate::singular::Hints,
    budget: &mut crate::budget::Budget,
    warnings: &mut Vec<String>,
) -> Vec<PointOut> {
    let a = f.analysis();
    let mut candidates = a.pole_candidates.clone();
    for p in &a.pole_candidate_polys {
        if let Ok((clusters, _)) = crate::poly::multiplicity::distinct_roots(p) {
            candidates.extend(clusters.into_iter().map(|c| c.center));
        }
    }
    let scale = region.size().max(f64::MIN_POSITIVE);
    let known: Vec<C> = found
        .poles
        .iter()
        .map(|p| p.at)
        .chain(found.zeros.iter().map(|z| z.at))
        .chain(found.essential.iter().copied())
        .chain(found.branch_points.iter().copied())
        .collect();
    let mut out: Vec<PointOut> = Vec::new();
    for z in candidates {
        if inside(region, z) != Some(true) || known.iter().any(|k| (k - z).norm() <= 1e-8 * scale) {
            continue;
        }
        if out.iter().any(|o| (C::new(o.at[0], o.at[1]) - z).norm() <= 1e-8 * scale) {
            continue;
        }
        let eval = |w: C| f.eval(w);
        match classify_point(&eval, z, hints, budget) {
            Ok(r) if r.kind == Kind::Removable => {
                out.push(PointOut { at: pair(z + C::new(0.0, 0.0)), residue: Some([0.0, 0.0]), error_estimate: None })
            }
            Ok(r) if r.kind == Kind::Pole || r.kind == Kind::Essential => warnings.push(format!(
                "the search missed a {} at {} that the expression's denominator points to; check it with \"residue\"",
                r.kind.name(),
                text::complex(z, 0.0)
            )),
            _ => {}
        }
    }
    out
}

fn general(f: &Function, region: &Contour, max_evaluations: Option<u64>) -> Result<SingularitiesResponse, ApiError> {
    let hints = hints(f);
    let mut budget = budget(max_evaluations);
    let eval = |z: C| f.eval(z);
    let eval_d = |z: C| f.eval_d(z);
    let found = find_singularities(&eval, &eval_d, region, &hints, &mut budget)?;
    let mut warnings = found.warnings.clone();
    let mut essential = Vec::new();
    for &z in &found.essential {
        let residue = classify_point(&eval, z, &hints, &mut budget)
            .ok()
            .filter(|r| r.kind == Kind::Essential)
            .and_then(|r| r.residue.map(|c| (c, r.error_estimate)));
        essential.push(PointOut {
            at: pair(z),
            residue: residue.map(|(c, _)| pair(c)),
            error_estimate: residue.map(|(_, e)| e),
        });
    }
    let removable = removable_points(f, region, &found, &hints, &mut budget, &mut warnings);
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
        poles: found
            .poles
            .iter()
            .map(|p| PoleOut {
                at: pair(p.at),
                order: p.order,
                residue: p.residue.map(pair),
                error_estimate: p.residue.map(|_| p.error_estimate),
                principal_part: p.principal_part.iter().map(|&c| pair(c)).collect(),
            })
            .collect(),
        zeros: found.zeros.iter().map(|z| ZeroOut { at: pair(z.at), order: z.order }).collect(),
        essential,
        branch_points: found.branch_points.iter().map(|&z| PointOut { at: pair(z), residue: None, error_estimate: None }).collect(),
        removable,
        residue_at_infinity,
        residue_sum_defect: None,
        // null where a branch cut crossing the boundary made the count impossible
        zeros_minus_poles: found.boundary_count,
        method: "numerical".into(),
        warnings,
    })
}

//! `singularities`: poles (with orders and residues), zeros, essential
//! singularities and branch points inside a region, plus the residue at infinity.

use super::{budget, compile, hints};
use crate::api::{pair, PointOut, PoleOut, SingularitiesRequest, SingularitiesResponse, ZeroOut};
use crate::contour::Contour;
use crate::error::ApiError;
use crate::expr::Function;
use crate::singular::rational_poles::{analyse_rational, format_complex};
use crate::singular::{classify_infinity, classify_point, find_singularities, Kind};
use crate::C;

pub fn run(req: &SingularitiesRequest) -> Result<SingularitiesResponse, ApiError> {
    let f = compile(&req.function)?;
    req.region.validate().map_err(|e| ApiError::new(format!("region: {e}")))?;
    match f.rational() {
        Some(r) => rational(&r.num, &r.den, &req.region),
        None => general(&f, &req.region, req.max_evaluations),
    }
}

/// Which side of the region's boundary a point is on; `None` on the boundary.
fn inside(region: &Contour, z: C) -> Option<bool> {
    region.winding_number(z).map(|w| w != 0)
}

fn rational(num: &[C], den: &[C], region: &Contour) -> Result<SingularitiesResponse, ApiError> {
    let a = analyse_rational(num, den).map_err(ApiError::new)?;
    let mut warnings = a.warnings.clone();
    let mut on_boundary = |what: &str, z: C| {
        warnings.push(format!(
            "a {what} at {} lies on the region's boundary; it is left out: move the boundary",
            format_complex(z, 0.0)
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

fn general(f: &Function, region: &Contour, max_evaluations: Option<u64>) -> Result<SingularitiesResponse, ApiError> {
    let hints = hints(f);
    let mut budget = budget(max_evaluations);
    let eval = |z: C| f.eval(z);
    let eval_d = |z: C| f.eval_d(z);
    let found = find_singularities(&eval, &eval_d, region, &hints, &mut budget).map_err(ApiError::new)?;
    let mut warnings = found.warnings;
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
                principal_part: Vec::new(),
            })
            .collect(),
        zeros: found.zeros.iter().map(|z| ZeroOut { at: pair(z.at), order: z.order }).collect(),
        essential,
        branch_points: found.branch_points.iter().map(|&z| PointOut { at: pair(z), residue: None, error_estimate: None }).collect(),
        removable: Vec::new(),
        residue_at_infinity,
        residue_sum_defect: None,
        zeros_minus_poles: Some(found.zeros_minus_poles),
        method: "numerical".into(),
        warnings,
    })
}

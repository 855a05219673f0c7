//! `argument_count`: zeros minus poles inside a contour by the argument
//! principle, and separately the zeros and the poles where they can be counted.
//!
//! `zeros_minus_poles` is (1/2π) × the total change of arg f along the contour
//! (`singular::count_by_argument_principle`), which equals Σ w(a)·m(a) over
//! zeros (m > 0) and poles (m < 0), w the winding number. `zeros` and `poles`
//! use the same weighting, so `zeros − poles = zeros_minus_poles` always; for
//! a counter-clockwise simple contour they are plain counts with multiplicity,
//! for a clockwise one they are negative (a warning says so). Rational f:
//! exact roots of numerator and denominator. Other f: the points located by
//! `singular::find_singularities`, reported only when their weighted sum
//! reconciles with the argument-principle count.

use crate::api::tasks::contour_integral::{covering_regions, search_cover};
use crate::api::input::{budget, checked_contour, compile};
use crate::api::wire::{pair, ContourRequest};
use crate::contour::Contour;
use crate::api::error::ApiError;
use crate::expr::Function;
use crate::singular::count_by_argument_principle;
use crate::singular::rational_poles::analyse_rational_polished;
use crate::C;
use serde::{Deserialize, Serialize};

/// `argument_count`: zeros − poles inside a contour by the argument principle.
pub type ArgumentCountRequest = ContourRequest;

/// A zero or pole counted, with the contour's winding number about it.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct CountedPoint {
    pub at: [f64; 2],
    /// `"zero"` or `"pole"`.
    pub kind: String,
    pub order: u32,
    pub winding: i32,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ArgumentCountResponse {
    /// Zeros with multiplicity, each weighted by the winding number (null when not certain).
    pub zeros: Option<i64>,
    /// Poles with multiplicity, each weighted by the winding number (null when not certain).
    pub poles: Option<i64>,
    /// The argument principle: (1/2π) × total change of arg f along the contour.
    pub zeros_minus_poles: i64,
    /// The zeros and poles behind `zeros` and `poles`.
    pub points: Vec<CountedPoint>,
    pub method: String,
    pub warnings: Vec<String>,
}

pub fn run(req: &ArgumentCountRequest) -> Result<ArgumentCountResponse, ApiError> {
    let f = compile(&req.function)?;
    let contour = checked_contour(&req.contour, "contour")?;
    let mut budget = budget(req.max_evaluations);
    let eval = |z: C| f.eval(z);
    let count = count_by_argument_principle(&eval, contour, &mut budget)?;
    let mut warnings = Vec::new();
    let (points, method) = match f.rational() {
        Some(r) => (
            rational_points(&f, &r.num, &r.den, contour, &mut warnings)?,
            "rational",
        ),
        None => (
            general_points(&f, contour, &mut budget, &mut warnings),
            "numerical",
        ),
    };
    let (mut zeros, mut poles) = (None, None);
    if let Some(points) = &points {
        let sum = |kind: &str| -> i64 {
            points
                .iter()
                .filter(|p| p.kind == kind)
                .map(|p| p.winding as i64 * p.order as i64)
                .sum()
        };
        let (z, p) = (sum("zero"), sum("pole"));
        if z - p == count {
            zeros = Some(z);
            poles = Some(p);
        } else if method == "rational" {
            // Exact algebra wins, but the mismatch is shown.
            zeros = Some(z);
            poles = Some(p);
            warnings.push(format!(
                "the exact zeros and poles give {} but the argument principle gives {count}; a zero or pole may lie very close to the contour",
                z - p
            ));
        } else {
            warnings.push(format!(
                "the zeros and poles located give zeros − poles = {}, but the argument principle gives {count}; they are not reported as counts (some may be missing or lie very close together)",
                z - p
            ));
        }
    }
    if points.iter().flatten().any(|p| p.winding < 0) {
        warnings.push("the contour runs clockwise around some points: each zero and pole is counted with its winding number, so counts there are negative".into());
    }
    Ok(ArgumentCountResponse {
        zeros,
        poles,
        zeros_minus_poles: count,
        points: points.unwrap_or_default(),
        method: method.into(),
        warnings,
    })
}

fn counted(at: C, kind: &str, order: u32, winding: i32) -> CountedPoint {
    CountedPoint {
        at: pair(at),
        kind: kind.into(),
        order,
        winding,
    }
}

fn rational_points(
    f: &Function,
    num: &[C],
    den: &[C],
    contour: &Contour,
    warnings: &mut Vec<String>,
) -> Result<Option<Vec<CountedPoint>>, ApiError> {
    let a = analyse_rational_polished(num, den, &|z| f.eval_d(z))?;
    warnings.extend(a.warnings.iter().cloned());
    let mut out = Vec::new();
    let all = a
        .zeros
        .iter()
        .map(|z| (z.at, "zero", z.order))
        .chain(a.poles.iter().map(|p| (p.at, "pole", p.order)));
    for (at, kind, order) in all {
        match contour.winding_number(at) {
            Some(0) => {}
            Some(w) => out.push(counted(at, kind, order, w)),
            None => {
                warnings.push(format!(
                    "a {kind} at {} lies on the contour; move the contour",
                    crate::text::value(at)
                ));
                return Ok(None);
            }
        }
    }
    Ok(Some(out))
}

fn general_points(
    f: &Function,
    contour: &Contour,
    budget: &mut crate::budget::Budget,
    warnings: &mut Vec<String>,
) -> Option<Vec<CountedPoint>> {
    // Curved shapes and rectangles are searched as they are; a polygon through its bounding box.
    let regions = match contour {
        Contour::Polygon { .. } => covering_regions(contour),
        _ => vec![contour.clone()],
    };
    let found = match search_cover(f, &regions, budget) {
        Ok(found) => found,
        Err(e) => {
            warnings.push(format!(
                "zeros and poles could not be located separately: {e}"
            ));
            return None;
        }
    };
    warnings.extend(
        found
            .warnings
            .iter()
            .map(|w| format!("singularity search: {w}")),
    );
    let nonzero = |z: &C| matches!(contour.winding_number(*z), Some(w) if w != 0);
    if let Some(z) = found
        .essential
        .iter()
        .chain(&found.branch_points)
        .find(|z| nonzero(z))
    {
        warnings.push(format!(
            "an essential singularity or branch point lies inside at {}: zeros and poles are not counted separately there, and the argument-principle count is only the winding of f around 0",
            crate::text::value(*z)
        ));
        return None;
    }
    let mut out = Vec::new();
    let all = found
        .zeros
        .iter()
        .map(|z| (z.at, "zero", z.order))
        .chain(found.poles.iter().map(|p| (p.at, "pole", p.order)));
    for (at, kind, order) in all {
        match contour.winding_number(at) {
            Some(0) => {}
            Some(w) => out.push(counted(at, kind, order, w)),
            None => return None,
        }
    }
    Some(out)
}

//! `argument_count`: zeros minus poles inside a contour by the argument
//! principle (`singular::count_by_argument_principle`), and separately the
//! zeros and the poles, each weighted by its winding number
//! (`integrals::contour_residues`: exact roots for rational f, located points
//! otherwise). `zeros − poles = zeros_minus_poles` always: located points are
//! reported only when they reconcile with the count; exact ones always, with
//! a warning when they do not.

use crate::api::error::ApiError;
use crate::api::input::{budget, checked_contour, compile, hints};
use crate::api::wire::{pair, ContourRequest, Method};
use crate::contour::covering::contour_as_regions;
use crate::integrals::contour_residues::{general_wound_points, rational_wound_points, ZeroOrPole};
use crate::singular::count_by_argument_principle;
use crate::C;
use serde::{Deserialize, Serialize};

/// `argument_count`: zeros − poles inside a contour by the argument principle.
pub type ArgumentCountRequest = ContourRequest;

/// `zero` or `pole` on the wire.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum CountedKind {
    Zero,
    Pole,
}

/// A zero or pole counted, with the contour's winding number about it.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct CountedPoint {
    pub at: [f64; 2],
    pub kind: CountedKind,
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
    pub method: Method,
    pub warnings: Vec<String>,
}

pub fn run(req: &ArgumentCountRequest) -> Result<ArgumentCountResponse, ApiError> {
    let f = compile(&req.function)?;
    let contour = &checked_contour(&req.contour, "contour")?;
    let mut budget = budget(req.max_evaluations).weighted(f.weight());
    let (eval, eval_d) = (|z: C| f.eval(z), |z: C| f.eval_d(z));
    let count = count_by_argument_principle(&eval, contour, &mut budget)?;
    let (wound, method) = match f.rational() {
        Some(r) => (rational_wound_points(&r.num, &r.den, &eval_d, contour)?, Method::Rational),
        None => (general_wound_points(&eval, &eval_d, &hints(&f), contour, &contour_as_regions(contour), &mut budget), Method::Numerical),
    };
    let mut warnings = wound.warnings.clone();
    let (mut zeros, mut poles) = (None, None);
    if let Some((z, p)) = wound.weighted_counts() {
        match (z - p == count, method) {
            (true, _) => (zeros, poles) = (Some(z), Some(p)),
            // Exact algebra wins, but the mismatch is shown.
            (false, Method::Rational) => {
                (zeros, poles) = (Some(z), Some(p));
                warnings.push(format!(
                    "the exact zeros and poles give {} but the argument principle gives {count}; a zero or pole may lie very close to the contour",
                    z - p
                ));
            }
            (false, Method::Numerical) => warnings.push(format!(
                "the zeros and poles located give zeros − poles = {}, but the argument principle gives {count}; they are not reported as counts (some may be missing or lie very close together)",
                z - p
            )),
        }
    }
    if wound.any_clockwise() {
        warnings.push("the contour runs clockwise around some points: each zero and pole is counted with its winding number, so counts there are negative".into());
    }
    let kind = |k| if k == ZeroOrPole::Zero { CountedKind::Zero } else { CountedKind::Pole };
    let points = wound.points.iter().flatten();
    let points = points.map(|p| CountedPoint { at: pair(p.at), kind: kind(p.kind), order: p.order, winding: p.winding });
    Ok(ArgumentCountResponse { zeros, poles, zeros_minus_poles: count, points: points.collect(), method, warnings })
}

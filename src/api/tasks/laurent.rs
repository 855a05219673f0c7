//! `laurent`: Laurent coefficients on an annulus around a point or around infinity.
//!
//! The coefficients come from FFTs of samples on circles inside the annulus;
//! singularities already known (poles of a rational f, points found in the
//! disk, structural candidates) are used to refuse an annulus that holds one.

use crate::api::input::{budget, compile, hints, point};

use crate::contour::Contour;
use crate::api::wire::{FunctionInput, BUDGET_FIELD, FUNCTION_FIELDS, Point};
use crate::api::shape::{Expect, Field};
use crate::api::error::{ApiError, ErrorCode};
use crate::expr::Function;
use crate::series::laurent_fft::{self, Center};
use crate::singular::find_singularities;
use crate::C;
use serde::{Deserialize, Serialize};

/// The declared fields of [`LaurentRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[
    FUNCTION_FIELDS,
    &[
        Field::required("center", Expect::Point),
        Field::optional("inner", Expect::Real),
        Field::optional("outer", Expect::OrNull(&Expect::Real)),
        Field::required("from", Expect::Whole),
        Field::required("to", Expect::Whole),
        BUDGET_FIELD,
    ],
];

/// `laurent`: coefficients `c_n`, `n = from..=to`, on an annulus around a point or infinity.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct LaurentRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub center: Point,
    #[serde(default)]
    pub inner: f64,
    /// Omitted or `null`: as far as the nearest singularity allows.
    #[serde(default)]
    pub outer: Option<f64>,
    pub from: i64,
    pub to: i64,
    /// The work budget (docs/contract.md); the default when omitted.
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct Coefficient {
    pub n: i64,
    pub c: [f64; 2],
    /// This coefficient's own error estimate (`error_estimate` is the largest of them).
    pub error: f64,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct LaurentResponse {
    pub coefficients: Vec<Coefficient>,
    pub error_estimate: f64,
    /// Radii of the sampling circles used.
    pub radii: Vec<f64>,
    pub warnings: Vec<String>,
}

pub fn run(req: &LaurentRequest) -> Result<LaurentResponse, ApiError> {
    let f = compile(&req.function)?;
    let center = match point(&req.center, "center")? {
        Some(a) => Center::Point(a),
        None => Center::Infinity,
    };
    let inner = req.inner;
    let outer = req.outer.unwrap_or(f64::INFINITY);
    if !(inner >= 0.0 && inner.is_finite()) {
        return Err(ApiError::invalid("\"inner\" must be a finite number ≥ 0"));
    }
    if matches!(center, Center::Point(_)) && !(outer > inner) {
        return Err(ApiError::invalid("\"outer\" must be larger than \"inner\" (or omitted: as far as the nearest singularity allows)"));
    }
    if let Center::Point(a) = center {
        let h = hints(&f);
        if let Some(b) = h.branch_candidates.iter().find(|b| (**b - a).norm() <= 1e-12 * a.norm().max(1.0)) {
            return Err(ApiError::new(ErrorCode::NotApplicable, format!(
                "f has a branch point at the centre {} (sqrt, log or a non-integer power), so it has no Laurent series there",
                crate::text::complex(*b + 0.0, 0.0)
            )));
        }
    }
    let mut warnings = Vec::new();
    let mut budget = budget(req.max_evaluations).weighted(f.weight());
    let known = known_singularities(&f, center, inner, outer, &mut warnings, &mut budget);
    // "outer" omitted: as far as the nearest known singularity beyond "inner" allows.
    let outer = match (req.outer, center) {
        (None, Center::Point(a)) => known
            .iter()
            .map(|s| (s - a).norm())
            .filter(|&d| d.is_finite() && d > inner * (1.0 + 1e-9) + 1e-12 * a.norm().max(1.0))
            .fold(outer, f64::min),
        _ => outer,
    };
    let spec = laurent_fft::LaurentRequest { center, inner, outer, from: req.from, to: req.to };
    let result = laurent_fft::laurent(|z| f.eval(z), &spec, &known, &mut budget)?;
    let mut radii = result.radius_used.clone();
    radii.sort_by(f64::total_cmp);
    radii.dedup();
    Ok(LaurentResponse {
        coefficients: result
            .coefficients
            .iter()
            .zip(&result.errors)
            .map(|(&(n, c), &error)| Coefficient { n, c: [c.re, c.im], error })
            .collect(),
        error_estimate: result.error_estimate,
        radii,
        warnings,
    })
}

/// Singular points that could lie in the annulus: exact poles of a rational f;
/// otherwise structural candidates plus whatever a search of the disk finds.
fn known_singularities(
    f: &Function,
    center: Center,
    inner: f64,
    outer: f64,
    warnings: &mut Vec<String>,
    budget: &mut crate::budget::Budget,
) -> Vec<C> {
    if f.rational().is_some() {
        // The same analysis as `singularities`, so both tasks place a pole at the same point.
        return match crate::singular::rational_poles::analyse_function(f) {
            Ok(a) => a.poles.iter().map(|p| p.at).collect(),
            Err(e) => {
                warnings.push(format!("poles not located ({e}); the annulus was checked by sampling only"));
                Vec::new()
            }
        };
    }
    let h = hints(f);
    let mut known: Vec<C> = h.essential_candidates.iter().chain(&h.branch_candidates).copied().collect();
    if let Center::Point(a) = center {
        if outer.is_finite() && outer > inner {
            // Search a disk slightly smaller than the outer circle, so a singularity
            // on that circle does not stop the search.
            let disk = Contour::circle(a, outer * (1.0 - 1e-9));
            let eval = |z: C| f.eval(z);
            let eval_d = |z: C| f.eval_d(z);
            match find_singularities(&eval, &eval_d, &disk, &h, budget) {
                Ok(found) => {
                    known.extend(found.poles.iter().map(|p| p.at));
                    known.extend(found.essential.iter().copied());
                    known.extend(found.branch_points.iter().copied());
                }
                Err(e) => warnings.push(format!(
                    "the disk |z − a| < outer was not searched for singularities ({e}); the annulus was checked by sampling only"
                )),
            }
        }
    }
    known
}

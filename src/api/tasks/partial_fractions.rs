//! `partial_fractions`: a rational f as polynomial part plus Σ c/(z − a)^k.

use crate::api::input::{compile, pairs};
use crate::api::wire::{pair, FunctionInput, FUNCTION_FIELDS};
use crate::api::shape::Field;
use crate::api::error::{ApiError, ErrorCode};
use crate::singular::rational_poles::{analyse_function, partial_fractions_string};
use serde::{Deserialize, Serialize};

/// The declared fields of [`PartialFractionsRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[FUNCTION_FIELDS];

/// `partial_fractions`: a rational f as polynomial part plus Σ c/(z−a)^k.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PartialFractionsRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct FractionTerm {
    pub at: [f64; 2],
    pub power: u32,
    pub c: [f64; 2],
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PartialFractionsResponse {
    /// Ascending coefficients of the polynomial part.
    pub polynomial: Vec<[f64; 2]>,
    pub terms: Vec<FractionTerm>,
    pub removable: Vec<[f64; 2]>,
    /// The expansion written out, e.g. `1 + 0.5/(s + 1) - 0.5/(s + 3)`.
    pub text: String,
    pub error_estimate: f64,
    pub warnings: Vec<String>,
}

pub fn run(req: &PartialFractionsRequest) -> Result<PartialFractionsResponse, ApiError> {
    let f = compile(&req.function)?;
    f.rational().ok_or_else(|| {
        ApiError::new(ErrorCode::NotApplicable, format!(
            "partial fractions need a rational function (a ratio of polynomials in {}); this f is not one. \
             Use \"singularities\" or \"laurent\" for its poles and principal parts",
            f.var()
        ))
    })?;
    let a = analyse_function(&f)?;
    let mut terms = Vec::new();
    let mut error_estimate: f64 = 0.0;
    for p in &a.poles {
        for (k, (&c, &e)) in p.principal_part.iter().zip(&p.principal_part_errors).enumerate() {
            terms.push(FractionTerm { at: pair(p.at), power: k as u32 + 1, c: pair(c) });
            error_estimate = error_estimate.max(e);
        }
    }
    Ok(PartialFractionsResponse {
        polynomial: a.polynomial_part.iter().map(|&c| pair(c)).collect(),
        terms,
        removable: pairs(&a.removable.iter().map(|r| r.at).collect::<Vec<_>>()),
        text: partial_fractions_string(&a, f.var()),
        error_estimate,
        warnings: a.warnings,
    })
}

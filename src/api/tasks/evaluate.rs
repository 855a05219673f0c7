//! `evaluate`: f and f' at a list of points.

use crate::api::input::{budget, compile, finite};
use crate::api::wire::{pair, FunctionInput, Number, BUDGET_FIELD, FUNCTION_FIELDS};
use crate::api::error::ApiError;
use crate::C;
use crate::api::shape::{Expect, Field};
use serde::{Deserialize, Serialize};

/// The declared fields of [`EvaluateRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[FUNCTION_FIELDS, &[Field::required("at", Expect::AtMost(MAX_POINTS, &Expect::Complex)), BUDGET_FIELD]];

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct EvaluateRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub at: Vec<Number>,
    /// The work budget (docs/contract.md): each point costs two evaluations
    /// (the value and, by forward-mode differentiation, the derivative).
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct EvaluateResponse {
    pub values: Vec<[f64; 2]>,
    pub derivatives: Vec<[f64; 2]>,
}

/// Most points one request may ask for.
pub const MAX_POINTS: usize = 1_000_000;

pub fn run(req: &EvaluateRequest) -> Result<EvaluateResponse, ApiError> {
    let f = compile(&req.function)?;
    if req.at.len() > MAX_POINTS {
        return Err(ApiError::invalid(format!("too many points in \"at\" (at most {MAX_POINTS}); split the request")));
    }
    let zs = req.at.iter().map(|&n| finite(n, "at")).collect::<Result<Vec<C>, _>>()?;
    budget(req.max_evaluations).weighted(f.weight()).spend(2 * zs.len() as u64)?;
    let mut values = vec![C::new(0.0, 0.0); zs.len()];
    let mut derivatives = values.clone();
    f.eval_block_d(&zs, &mut values, &mut derivatives);
    Ok(EvaluateResponse {
        values: values.into_iter().map(pair).collect(),
        derivatives: derivatives.into_iter().map(pair).collect(),
    })
}

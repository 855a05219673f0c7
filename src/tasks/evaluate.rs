//! `evaluate`: f and f' at a list of points.

use super::{compile, finite};
use crate::api::{pair, EvaluateRequest, EvaluateResponse};
use crate::error::ApiError;
use crate::C;

/// Most points one request may ask for.
pub const MAX_POINTS: usize = 1_000_000;

pub fn run(req: &EvaluateRequest) -> Result<EvaluateResponse, ApiError> {
    let f = compile(&req.function)?;
    if req.at.len() > MAX_POINTS {
        return Err(ApiError::new(format!("too many points in \"at\" (at most {MAX_POINTS}); split the request")));
    }
    let zs = req.at.iter().map(|&n| finite(n, "at")).collect::<Result<Vec<C>, _>>()?;
    let mut values = vec![C::new(0.0, 0.0); zs.len()];
    let mut derivatives = values.clone();
    f.eval_block_d(&zs, &mut values, &mut derivatives);
    Ok(EvaluateResponse {
        values: values.into_iter().map(pair).collect(),
        derivatives: derivatives.into_iter().map(pair).collect(),
    })
}

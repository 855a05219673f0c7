//! `residue` (being built).

use crate::api::{ResidueRequest, ResidueResponse};
use crate::error::ApiError;

pub fn run(_req: &ResidueRequest) -> Result<ResidueResponse, ApiError> {
    Err(ApiError::new("the \"residue\" task is not built yet"))
}

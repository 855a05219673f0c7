//! `laurent` (being built).

use crate::api::{LaurentRequest, LaurentResponse};
use crate::error::ApiError;

pub fn run(_req: &LaurentRequest) -> Result<LaurentResponse, ApiError> {
    Err(ApiError::new("the \"laurent\" task is not built yet"))
}

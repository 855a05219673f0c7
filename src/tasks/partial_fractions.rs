//! `partial_fractions` (being built).

use crate::api::{PartialFractionsRequest, PartialFractionsResponse};
use crate::error::ApiError;

pub fn run(_req: &PartialFractionsRequest) -> Result<PartialFractionsResponse, ApiError> {
    Err(ApiError::new("the \"partial_fractions\" task is not built yet"))
}

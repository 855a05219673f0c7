//! `singularities` (being built).

use crate::api::{SingularitiesRequest, SingularitiesResponse};
use crate::error::ApiError;

pub fn run(_req: &SingularitiesRequest) -> Result<SingularitiesResponse, ApiError> {
    Err(ApiError::new("the \"singularities\" task is not built yet"))
}

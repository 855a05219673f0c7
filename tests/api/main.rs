//! Tests through the doorway (`residuary::api`), one module per task or contract topic.
//! Every check names its outside source beside it.

#[path = "../common/mod.rs"]
mod common;

mod api_contract;
mod contour_integral;
mod contour_shapes;
mod contract_doc;
mod inverse_laplace;
mod inverse_z;
mod meromorphic_battery;
mod multiplicity;
mod overflow_and_scale;
mod partial_fractions;
mod pole_trails;
mod real_integral;
mod request_errors;
mod transfer_function;

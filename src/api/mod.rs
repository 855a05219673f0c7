//! The one doorway: `run(Request) -> Result<Response, ApiError>`.
//!
//! Every caller — the page (through `wasm`), node and the `residuary` command
//! line — comes in here. All serde lives below this module: [`wire`] holds the
//! shapes several tasks share, each file of [`tasks`] owns its task's request
//! and response, [`input`] turns wire values into checked core values, and
//! [`error`] is the one error that crosses the boundary, with a stable `code`.
//! [`shape`] checks a request's JSON against the fields its task declares
//! before serde reads it, so every request error names its field path.
//!
//! The JSON contract is public and documented in `docs/contract.md`. Complex
//! numbers are `[re, im]`. Fields may be added later; none may change meaning.

pub mod error;
pub mod input;
pub mod shape;
pub mod tasks;
pub mod wire;

pub use error::{ApiError, ErrorCode};
pub use tasks::argument_count::{ArgumentCountRequest, ArgumentCountResponse, CountedPoint};
pub use tasks::contour_integral::{ContourIntegralRequest, ContourIntegralResponse, WindingOut};
pub use tasks::evaluate::{EvaluateRequest, EvaluateResponse};
pub use tasks::inverse_laplace::{InverseLaplaceRequest, InverseLaplaceResponse};
pub use tasks::inverse_z::{InverseZRequest, InverseZResponse};
pub use tasks::laurent::{Coefficient, LaurentRequest, LaurentResponse};
pub use tasks::pole_trails::{PoleTrailsRequest, PoleTrailsResponse};
pub use tasks::partial_fractions::{FractionTerm, PartialFractionsRequest, PartialFractionsResponse};
pub use tasks::phase_plot::{phase_plot_rgba, PhasePlotRequest, Pixels, PlotOptionsInput};
pub use tasks::real_integral::{RealIntegralRequest, RealIntegralResponse};
pub use tasks::residue::{ResidueRequest, ResidueResponse};
pub use tasks::transfer_function::{TransferFunctionRequest, TransferFunctionResponse};
pub use tasks::singularities::{PointOut, PoleOut, SingularitiesRequest, SingularitiesResponse, ZeroOut};
pub use wire::{pair, ContourRequest, ContourShape, FunctionInput, Number, Point};

use serde::Serialize;
use serde_json::Value;

/// The parsed request: one variant per task.
#[derive(Debug, Clone)]
pub enum Request {
    Evaluate(EvaluateRequest),
    PhasePlot(PhasePlotRequest),
    Residue(ResidueRequest),
    Singularities(SingularitiesRequest),
    Laurent(LaurentRequest),
    PartialFractions(PartialFractionsRequest),
    ContourIntegral(ContourIntegralRequest),
    ArgumentCount(ArgumentCountRequest),
    RealIntegral(RealIntegralRequest),
    InverseLaplace(InverseLaplaceRequest),
    InverseZ(InverseZRequest),
    TransferFunction(TransferFunctionRequest),
    PoleTrails(PoleTrailsRequest),
}

/// A response: serialises to the task's own JSON object.
#[derive(Debug, Clone, Serialize)]
#[serde(untagged)]
pub enum Response {
    Evaluate(EvaluateResponse),
    Residue(ResidueResponse),
    Singularities(SingularitiesResponse),
    Laurent(LaurentResponse),
    PartialFractions(PartialFractionsResponse),
    ContourIntegral(ContourIntegralResponse),
    ArgumentCount(ArgumentCountResponse),
    RealIntegral(RealIntegralResponse),
    InverseLaplace(InverseLaplaceResponse),
    InverseZ(InverseZResponse),
    TransferFunction(TransferFunctionResponse),
    PoleTrails(PoleTrailsResponse),
    Json(Value),
}

/// Largest request text accepted, in bytes (64 MiB), refused before any parsing.
/// A request this size already costs about a gigabyte once parsed; split larger work.
pub const MAX_REQUEST_BYTES: usize = 64 * 1024 * 1024;

/// Every task name the contract defines, in the contract's order.
pub const TASKS: &[&str] = &[
    "evaluate",
    "phase_plot",
    "residue",
    "singularities",
    "laurent",
    "partial_fractions",
    "contour_integral",
    "argument_count",
    "real_integral",
    "inverse_laplace",
    "inverse_z",
    "transfer_function",
    "pole_trails",
];

impl Request {
    /// Parse a request from JSON, with messages that say what to fix.
    pub fn from_json(value: Value) -> Result<Request, ApiError> {
        let task = match value.get("task") {
            Some(Value::String(t)) => t.clone(),
            Some(_) => {
                return Err(ApiError::new(ErrorCode::UnknownTask, "\"task\" must be a string such as \"evaluate\""))
            }
            None => {
                return Err(ApiError::new(
                    ErrorCode::UnknownTask,
                    format!("the request has no \"task\"; use one of: {}", TASKS.join(", ")),
                ))
            }
        };
        fn body<T: serde::de::DeserializeOwned>(task: &str, v: Value) -> Result<T, ApiError> {
            shape::check_request(task, &v, fields_of(task))?;
            // The shape check above names the field of any fault; this is a fallback.
            serde_json::from_value(v)
                .map_err(|e| ApiError::new(ErrorCode::BadRequest, format!("bad \"{task}\" request: {e}")))
        }
        Ok(match task.as_str() {
            "evaluate" => Request::Evaluate(body(&task, value)?),
            "phase_plot" => Request::PhasePlot(body(&task, value)?),
            "residue" => Request::Residue(body(&task, value)?),
            "singularities" => Request::Singularities(body(&task, value)?),
            "laurent" => Request::Laurent(body(&task, value)?),
            "partial_fractions" => Request::PartialFractions(body(&task, value)?),
            "contour_integral" => Request::ContourIntegral(body(&task, value)?),
            "argument_count" => Request::ArgumentCount(body(&task, value)?),
            "real_integral" => Request::RealIntegral(body(&task, value)?),
            "inverse_laplace" => Request::InverseLaplace(body(&task, value)?),
            "inverse_z" => Request::InverseZ(body(&task, value)?),
            "transfer_function" => Request::TransferFunction(body(&task, value)?),
            "pole_trails" => Request::PoleTrails(body(&task, value)?),
            _ => {
                return Err(ApiError::new(
                    ErrorCode::UnknownTask,
                    format!("unknown task \"{task}\"; use one of: {}", TASKS.join(", ")),
                ))
            }
        })
    }
}

/// The fields a task declares (`api::shape`); empty for a name that is no task.
pub fn fields_of(task: &str) -> &'static [&'static [shape::Field]] {
    match task {
        "evaluate" => tasks::evaluate::FIELDS,
        "phase_plot" => tasks::phase_plot::FIELDS,
        "residue" => tasks::residue::FIELDS,
        "singularities" => tasks::singularities::FIELDS,
        "laurent" => tasks::laurent::FIELDS,
        "partial_fractions" => tasks::partial_fractions::FIELDS,
        "contour_integral" | "argument_count" => wire::CONTOUR_REQUEST_FIELDS,
        "real_integral" => tasks::real_integral::FIELDS,
        "inverse_laplace" => tasks::inverse_laplace::FIELDS,
        "inverse_z" => tasks::inverse_z::FIELDS,
        "transfer_function" => tasks::transfer_function::FIELDS,
        "pole_trails" => tasks::pole_trails::FIELDS,
        _ => &[],
    }
}

/// A phase-plot request for the page's pixel path (`wasm::phase_plot_rgba`),
/// checked like every other request; `"task"` may be omitted there.
pub fn phase_plot_request(value: Value) -> Result<PhasePlotRequest, ApiError> {
    match value.get("task") {
        None => {}
        Some(Value::String(t)) if t == "phase_plot" => {}
        Some(other) => {
            return Err(ApiError::new(
                ErrorCode::UnknownTask,
                format!("this call draws phase plots: \"task\" must be \"phase_plot\" or omitted, got {}", shape::got(other)),
            ))
        }
    }
    shape::check_request("phase_plot", &value, tasks::phase_plot::FIELDS)?;
    serde_json::from_value(value)
        .map_err(|e| ApiError::new(ErrorCode::BadRequest, format!("bad \"phase_plot\" request: {e}")))
}

/// Run one request.
pub fn run(request: Request) -> Result<Response, ApiError> {
    match request {
        Request::Evaluate(r) => tasks::evaluate::run(&r).map(Response::Evaluate),
        Request::PhasePlot(r) => tasks::phase_plot::encoded(&r).map(Response::Json),
        Request::Residue(r) => tasks::residue::run(&r).map(Response::Residue),
        Request::Singularities(r) => tasks::singularities::run(&r).map(Response::Singularities),
        Request::Laurent(r) => tasks::laurent::run(&r).map(Response::Laurent),
        Request::PartialFractions(r) => tasks::partial_fractions::run(&r).map(Response::PartialFractions),
        Request::ContourIntegral(r) => tasks::contour_integral::run(&r).map(Response::ContourIntegral),
        Request::ArgumentCount(r) => tasks::argument_count::run(&r).map(Response::ArgumentCount),
        Request::RealIntegral(r) => tasks::real_integral::run(&r).map(Response::RealIntegral),
        Request::InverseLaplace(r) => tasks::inverse_laplace::run(&r).map(Response::InverseLaplace),
        Request::InverseZ(r) => tasks::inverse_z::run(&r).map(Response::InverseZ),
        Request::TransferFunction(r) => tasks::transfer_function::run(&r).map(Response::TransferFunction),
        Request::PoleTrails(r) => tasks::pole_trails::run(&r).map(Response::PoleTrails),
    }
}

/// JSON in, JSON out: what the CLI, node and the page call. Never panics on
/// bad input; errors come back as `{"error":{"code":..,"message":..,"span":..}}`.
pub fn run_json_value(value: Value) -> Result<Value, ApiError> {
    let request = Request::from_json(value)?;
    let response = run(request)?;
    serde_json::to_value(response)
        .map_err(|e| ApiError::internal(format!("internal: could not encode the response: {e}")))
}

/// The request text from raw bytes: at most [`MAX_REQUEST_BYTES`], UTF-8
/// (RFC 8259 §8.1: JSON exchanged between systems is UTF-8), with a leading
/// byte-order mark skipped (RFC 8259 §8.1 lets a parser ignore one).
pub fn request_text(bytes: &[u8]) -> Result<&str, ApiError> {
    if bytes.len() > MAX_REQUEST_BYTES {
        return Err(too_large());
    }
    let text = std::str::from_utf8(bytes).map_err(|e| {
        let at = e.valid_up_to();
        ApiError::new(
            ErrorCode::InvalidJson,
            format!(
                "the request is not UTF-8 text (invalid byte 0x{:02X} at offset {at}); save it as UTF-8",
                bytes[at]
            ),
        )
    })?;
    Ok(text.strip_prefix('\u{FEFF}').unwrap_or(text))
}

fn too_large() -> ApiError {
    ApiError::new(
        ErrorCode::BadRequest,
        format!("the request is larger than {MAX_REQUEST_BYTES} bytes (64 MiB), the limit; split it into smaller requests"),
    )
}

/// Same as [`run_json_text`] on raw bytes (what the command line reads).
pub fn run_json_bytes(bytes: &[u8]) -> (String, bool) {
    match request_text(bytes) {
        Ok(text) => run_json_text(text),
        Err(e) => (e.to_json().to_string(), true),
    }
}

/// Same as [`run_json_value`] on text; returns the response text and whether it is an error.
/// Text longer than [`MAX_REQUEST_BYTES`] is refused unread; a leading byte-order mark is skipped.
pub fn run_json_text(text: &str) -> (String, bool) {
    let result = if text.len() > MAX_REQUEST_BYTES {
        Err(too_large())
    } else {
        let text = text.strip_prefix('\u{FEFF}').unwrap_or(text);
        serde_json::from_str::<Value>(text)
            .map_err(|e| ApiError::new(ErrorCode::InvalidJson, format!("the request is not valid JSON: {e}")))
            .and_then(run_json_value)
    };
    match result {
        Ok(v) => (v.to_string(), false),
        Err(e) => (e.to_json().to_string(), true),
    }
}

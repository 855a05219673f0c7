//! The one doorway: `run(Request) -> Result<Response, ApiError>`.
//!
//! The JSON contract is public and documented in README.md. Complex numbers
//! are `[re, im]`. Fields may be added later; none may change meaning.

use crate::contour::Contour;
use crate::error::ApiError;
use crate::C;
use serde::{Deserialize, Serialize};
use serde_json::Value;
use std::collections::BTreeMap;

/// A complex number on the wire: `[re, im]`, or a bare real number on input.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(untagged)]
pub enum Number {
    Real(f64),
    Complex([f64; 2]),
}

impl Number {
    pub fn to_c(self) -> C {
        match self {
            Number::Real(x) => C::new(x, 0.0),
            Number::Complex([re, im]) => C::new(re, im),
        }
    }
}

/// `[re, im]` for output; non-finite parts serialise as `null`.
pub fn pair(z: C) -> [f64; 2] {
    [z.re, z.im]
}

/// A point that may be the point at infinity: `[x, y]` or `"infinity"`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(untagged)]
pub enum Point {
    Finite([f64; 2]),
    Named(String),
}

/// The expression part shared by every request.
#[derive(Debug, Clone, Default, Serialize, Deserialize)]
pub struct FunctionInput {
    /// The expression text.
    pub f: String,
    /// Name of the free variable (`z` by default).
    #[serde(default)]
    pub var: Option<String>,
    /// Named parameters: a number or `[re, im]` each.
    #[serde(default)]
    pub params: BTreeMap<String, Number>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct EvaluateRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub at: Vec<Number>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct EvaluateResponse {
    pub values: Vec<[f64; 2]>,
    pub derivatives: Vec<[f64; 2]>,
}

/// `phase_plot`: colour each pixel of the view box by arg f (and optionally |f|).
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PhasePlotRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    /// `[x0, x1, y0, y1]`: real range then imaginary range.
    pub view: [f64; 4],
    /// `[width, height]` in pixels.
    pub size: [u32; 2],
    #[serde(default)]
    pub options: PlotOptionsInput,
    /// `"png"` (default) or `"rgba"`; both base64 in `"data"`.
    #[serde(default)]
    pub format: Option<String>,
    /// Optional `[first, end)` rows of the full image to render (for progressive drawing).
    #[serde(default)]
    pub rows: Option<[u32; 2]>,
}

#[derive(Debug, Clone, Default, Serialize, Deserialize)]
pub struct PlotOptionsInput {
    /// `"oklch"` (default, perceptually even) or `"hsv"`.
    #[serde(default)]
    pub wheel: Option<String>,
    #[serde(default)]
    pub modulus_lines: bool,
    #[serde(default)]
    pub phase_lines: bool,
    /// Plot f(1/w) around w = 0 (the view is then in the w-plane).
    #[serde(default)]
    pub infinity: bool,
}

/// The pixels of a phase plot (rows `first..end` of a `width`-wide image).
pub struct Pixels {
    pub width: u32,
    pub height: u32,
    pub rgba: Vec<u8>,
}

/// The page's fast path: raw RGBA pixels, no base64, no PNG.
pub fn phase_plot_rgba(request: &PhasePlotRequest) -> Result<Pixels, ApiError> {
    let _ = request;
    Err(ApiError::new("the \"phase_plot\" task is not built yet"))
}

/// The parsed request: one variant per task.
#[derive(Debug, Clone)]
pub enum Request {
    Evaluate(EvaluateRequest),
    /// Tasks defined by the contract whose request body is kept as JSON until built.
    Other { task: String, body: Value },
}

/// A response: serialises to the task's own JSON object.
#[derive(Debug, Clone, Serialize)]
#[serde(untagged)]
pub enum Response {
    Evaluate(EvaluateResponse),
    Json(Value),
}

/// Every task name the contract defines.
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
];

impl Request {
    /// Parse a request from JSON, with messages that say what to fix.
    pub fn from_json(value: Value) -> Result<Request, ApiError> {
        let task = match value.get("task") {
            Some(Value::String(t)) => t.clone(),
            Some(_) => return Err(ApiError::new("\"task\" must be a string such as \"evaluate\"")),
            None => {
                return Err(ApiError::new(format!(
                    "the request has no \"task\"; use one of: {}",
                    TASKS.join(", ")
                )))
            }
        };
        let body = |v: Value| -> Result<_, ApiError> {
            serde_json::from_value(v).map_err(|e| ApiError::new(format!("bad \"{task}\" request: {e}")))
        };
        match task.as_str() {
            "evaluate" => Ok(Request::Evaluate(body(value)?)),
            t if TASKS.contains(&t) => Ok(Request::Other { task, body: value }),
            _ => Err(ApiError::new(format!(
                "unknown task \"{task}\"; use one of: {}",
                TASKS.join(", ")
            ))),
        }
    }
}

/// Run one request.
pub fn run(request: Request) -> Result<Response, ApiError> {
    match request {
        Request::Evaluate(_) => Err(ApiError::new("the \"evaluate\" task is not built yet")),
        Request::Other { task, .. } => Err(ApiError::new(format!(
            "the \"{task}\" task is not built yet in this version of residuary"
        ))),
    }
}

/// JSON in, JSON out: what the CLI, node and the page call. Never panics on
/// bad input; errors come back as `{"error":{"message":..,"span":..}}`.
pub fn run_json_value(value: Value) -> Result<Value, ApiError> {
    let request = Request::from_json(value)?;
    let response = run(request)?;
    serde_json::to_value(response).map_err(|e| ApiError::new(format!("internal: could not encode the response: {e}")))
}

/// Same as [`run_json_value`] on text; returns the response text and whether it is an error.
pub fn run_json_text(text: &str) -> (String, bool) {
    let result = serde_json::from_str::<Value>(text)
        .map_err(|e| ApiError::new(format!("the request is not valid JSON: {e}")))
        .and_then(run_json_value);
    match result {
        Ok(v) => (v.to_string(), false),
        Err(e) => (e.to_json().to_string(), true),
    }
}

#[allow(dead_code)]
fn contour_from(v: &Value) -> Result<Contour, ApiError> {
    let c: Contour = serde_json::from_value(v.clone()).map_err(|e| ApiError::new(format!("bad contour: {e}")))?;
    c.validate().map_err(ApiError::new)?;
    Ok(c)
}

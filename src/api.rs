//! The one doorway: `run(Request) -> Result<Response, ApiError>`.
//!
//! The JSON contract is public and documented in docs/contract.md. Complex numbers
//! are `[re, im]`. Fields may be added later; none may change meaning.

use crate::contour::Contour;
use crate::error::ApiError;
use crate::tasks;
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
    tasks::phase_plot::pixels(request)
}

/// `residue`: the residue of f at one point or at infinity.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ResidueRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub at: Point,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ResidueResponse {
    /// `null` where no residue exists (a branch point, or infinity not isolated).
    pub residue: Option<[f64; 2]>,
    /// `"pole"`, `"removable"`, `"regular"`, `"essential"` or `"branch_point"`.
    pub kind: String,
    pub order: Option<u32>,
    pub error_estimate: Option<f64>,
    /// Principal-part coefficients `c_{-1}, c_{-2}, …` where known.
    pub principal_part: Vec<[f64; 2]>,
    pub warnings: Vec<String>,
}

/// `singularities`: poles, zeros, essential singularities and branch points in a region.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct SingularitiesRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub region: Contour,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PoleOut {
    pub at: [f64; 2],
    pub order: u32,
    pub residue: Option<[f64; 2]>,
    pub error_estimate: Option<f64>,
    /// `c_{-1}, c_{-2}, …, c_{-order}`.
    pub principal_part: Vec<[f64; 2]>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ZeroOut {
    pub at: [f64; 2],
    pub order: u32,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PointOut {
    pub at: [f64; 2],
    /// For essential singularities, the residue `c_{-1}` where it could be computed.
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub residue: Option<[f64; 2]>,
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub error_estimate: Option<f64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct SingularitiesResponse {
    pub poles: Vec<PoleOut>,
    pub zeros: Vec<ZeroOut>,
    pub essential: Vec<PointOut>,
    pub branch_points: Vec<PointOut>,
    /// Removable singularities (common roots of numerator and denominator).
    pub removable: Vec<PointOut>,
    pub residue_at_infinity: Option<[f64; 2]>,
    /// `|sum of all finite residues + residue at infinity|`, which must be ~0 (rational f).
    pub residue_sum_defect: Option<f64>,
    /// Zeros minus poles inside the region by the argument principle, where counted.
    pub zeros_minus_poles: Option<i64>,
    /// `"rational"` (exact polynomial algebra) or `"numerical"` (sampling methods).
    pub method: String,
    pub warnings: Vec<String>,
}

/// `laurent`: coefficients `c_n`, `n = from..=to`, on an annulus around a point or infinity.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct LaurentRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub center: Point,
    #[serde(default)]
    pub inner: f64,
    /// Omitted or `null`: as far as the nearest singularity allows.
    #[serde(default)]
    pub outer: Option<f64>,
    pub from: i64,
    pub to: i64,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct Coefficient {
    pub n: i64,
    pub c: [f64; 2],
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct LaurentResponse {
    pub coefficients: Vec<Coefficient>,
    pub error_estimate: f64,
    /// Radii of the sampling circles used.
    pub radii: Vec<f64>,
    pub warnings: Vec<String>,
}

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

/// A function and a closed contour: the request of `contour_integral` and `argument_count`.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ContourRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub contour: Contour,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

/// `contour_integral`: ∮ f dz computed three independent ways (quadrature,
/// residues inside, residues outside plus infinity), disagreement shown.
pub type ContourIntegralRequest = ContourRequest;

/// A singular point with the contour's winding number about it.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct WindingOut {
    pub at: [f64; 2],
    pub winding: i32,
    /// `"pole"`, `"essential"` or `"branch_point"`.
    pub kind: String,
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub order: Option<u32>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ContourIntegralResponse {
    pub value: [f64; 2],
    pub by_quadrature: [f64; 2],
    pub by_inside_residues: Option<[f64; 2]>,
    pub by_outside_residues: Option<[f64; 2]>,
    /// Largest pairwise |difference| among the available ways.
    pub max_discrepancy: f64,
    pub winding: Vec<WindingOut>,
    /// Which way `value` is: `"quadrature"`, `"inside_residues"` or `"outside_residues"`.
    pub value_from: String,
    pub error_estimate: f64,
    pub quadrature_error_estimate: f64,
    pub inside_residues_error_estimate: Option<f64>,
    pub outside_residues_error_estimate: Option<f64>,
    /// One sentence: do the ways agree, and to what.
    pub agreement: String,
    /// `"rational"` (exact polynomial algebra) or `"numerical"`.
    pub method: String,
    pub warnings: Vec<String>,
}

/// `argument_count`: zeros − poles inside a contour by the argument principle.
pub type ArgumentCountRequest = ContourRequest;

/// A zero or pole counted, with the contour's winding number about it.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct CountedPoint {
    pub at: [f64; 2],
    /// `"zero"` or `"pole"`.
    pub kind: String,
    pub order: u32,
    pub winding: i32,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ArgumentCountResponse {
    /// Zeros with multiplicity, each weighted by the winding number (null when not certain).
    pub zeros: Option<i64>,
    /// Poles with multiplicity, each weighted by the winding number (null when not certain).
    pub poles: Option<i64>,
    /// The argument principle: (1/2π) × total change of arg f along the contour.
    pub zeros_minus_poles: i64,
    /// The zeros and poles behind `zeros` and `poles`.
    pub points: Vec<CountedPoint>,
    pub method: String,
    pub warnings: Vec<String>,
}

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
    RealIntegral(tasks::real_integral::RealIntegralRequest),
    InverseLaplace(tasks::inverse_laplace::InverseLaplaceRequest),
    InverseZ(tasks::inverse_z::InverseZRequest),
    /// Tasks the contract defines that this version does not compute yet.
    NotBuilt { task: String },
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
    RealIntegral(tasks::real_integral::RealIntegralResponse),
    InverseLaplace(tasks::inverse_laplace::InverseLaplaceResponse),
    InverseZ(tasks::inverse_z::InverseZResponse),
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
        fn body<T: serde::de::DeserializeOwned>(task: &str, v: Value) -> Result<T, ApiError> {
            serde_json::from_value(v).map_err(|e| ApiError::new(format!("bad \"{task}\" request: {e}")))
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
            t if TASKS.contains(&t) => Request::NotBuilt { task },
            _ => {
                return Err(ApiError::new(format!(
                    "unknown task \"{task}\"; use one of: {}",
                    TASKS.join(", ")
                )))
            }
        })
    }
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
        Request::NotBuilt { task } => Err(ApiError::new(format!(
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


//! `phase_plot`: colour the view box by arg f (and |f| lines), as PNG or raw RGBA.

use crate::api::input::{budget, compile};

use crate::api::wire::{FunctionInput, BUDGET_FIELD, FUNCTION_FIELDS};
use crate::api::shape::{Expect, Field};
use crate::api::error::ApiError;
use crate::plot::colour_wheel::Wheel;
use crate::plot::phase_plot::{render_rows, PlotOptions, View};
use crate::C;
use serde::{Deserialize, Serialize};

/// The declared fields of [`PhasePlotRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[
    FUNCTION_FIELDS,
    &[
        Field::required("view", Expect::Exactly(4, &Expect::Real)),
        Field::required("size", Expect::Exactly(2, &Expect::Count32)),
        Field::optional("options", Expect::Object(OPTIONS_FIELDS)),
        Field::optional("format", Expect::OrNull(&Expect::Text)),
        Field::optional("rows", Expect::OrNull(&Expect::Exactly(2, &Expect::Count32))),
        BUDGET_FIELD,
    ],
];

/// The declared fields of [`PlotOptionsInput`].
pub const OPTIONS_FIELDS: &[&[Field]] = &[&[
    Field::optional("wheel", Expect::OrNull(&Expect::Text)),
    Field::optional("modulus_lines", Expect::Bool),
    Field::optional("phase_lines", Expect::Bool),
    Field::optional("infinity", Expect::Bool),
]];

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
    /// The work budget (docs/contract.md): one evaluation per pixel of the rows drawn.
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

#[derive(Debug, Clone, Default, Serialize, Deserialize)]
pub struct PlotOptionsInput {
    /// `"oklch"` (default, perceptually even), `"hsv"`, `"ramp"` (lightness rising with arg,
    /// readable in grey) or `"blue_yellow"` (kept by deutan and protan readers).
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
    pixels(request)
}

/// Render the requested rows of the plot as RGBA8.
pub fn pixels(req: &PhasePlotRequest) -> Result<Pixels, ApiError> {
    let f = compile(&req.function)?;
    let [x0, x1, y0, y1] = req.view;
    let [width, height] = req.size;
    let wheel = match req.options.wheel.as_deref() {
        None => Wheel::Oklch,
        Some(name) => Wheel::from_name(name).ok_or_else(|| {
            ApiError::invalid(format!(
                "unknown colour wheel \"{name}\"; use \"oklch\", \"hsv\", \"ramp\" or \"blue_yellow\""
            ))
        })?,
    };
    let opts = PlotOptions {
        wheel,
        modulus_lines: req.options.modulus_lines,
        phase_lines: req.options.phase_lines,
        infinity_view: req.options.infinity,
        ..PlotOptions::default()
    };
    let [first, end] = req.rows.unwrap_or([0, height]);
    let band = (end.saturating_sub(first) as usize).saturating_mul(width as usize).saturating_mul(4);
    if band > 4 * 16_777_216 {
        return Err(ApiError::invalid("the image is too large; at most 16 million pixels"));
    }
    budget(req.max_evaluations).weighted(f.weight()).spend(band as u64 / 4)?;
    let mut rgba = vec![0u8; band];
    let mut eval = |zs: &[C], out: &mut [C]| f.eval_block(zs, out);
    render_rows(&mut eval, View { x0, x1, y0, y1 }, width, height, first, end, &opts, &mut rgba)
        ?;
    Ok(Pixels { width, height: end - first, rgba })
}

/// The JSON answer: `{"width","height","format","data"}` with base64 data.
pub fn encoded(req: &PhasePlotRequest) -> Result<serde_json::Value, ApiError> {
    let px = pixels(req)?;
    let format = req.format.as_deref().unwrap_or("png");
    let bytes = match format {
        "png" => crate::plot::png_encode::encode_png_rgba(px.width, px.height, &px.rgba)?,
        "rgba" => px.rgba,
        other => return Err(ApiError::invalid(format!("unknown format \"{other}\"; use \"png\" or \"rgba\""))),
    };
    Ok(serde_json::json!({
        "width": px.width,
        "height": px.height,
        "format": format,
        "data": crate::plot::base64::encode(&bytes),
    }))
}

//! The WebAssembly binding: a thin layer over [`crate::api`] for the page.
//!
//! Every export answers errors as data (`{"error":{"code":..,"message":..,"span":..}}`)
//! rather than throwing, except `phase_plot_rgba`, whose error is a rejected
//! value carrying the same object so the page can show the message.

use crate::api::{self, PhasePlotRequest};
use crate::api::{ApiError, ErrorCode};
use serde::Serialize;
use serde_json::Value;
use wasm_bindgen::prelude::*;

/// Runs once when the module is instantiated: panics go to the console with a
/// readable message instead of a bare "unreachable".
#[wasm_bindgen(start)]
pub fn start() {
    console_error_panic_hook::set_once();
}

/// Serialise as plain JS objects (maps become objects, not `Map`s).
fn to_js<T: Serialize + ?Sized>(value: &T) -> JsValue {
    let serializer = serde_wasm_bindgen::Serializer::json_compatible();
    match value.serialize(&serializer) {
        Ok(js) => js,
        Err(e) => {
            // Last resort: a hand-built error object, so callers never see a throw.
            let message = format!("internal: could not encode the response: {e}");
            let error = ApiError::internal(message).to_json();
            error.serialize(&serializer).unwrap_or(JsValue::NULL)
        }
    }
}

/// Read a JS request object as JSON.
fn from_js(request: JsValue) -> Result<Value, ApiError> {
    serde_wasm_bindgen::from_value::<Value>(request)
        .map_err(|e| ApiError::new(ErrorCode::BadRequest, format!("the request is not a plain JSON-like object: {e}")))
}

/// Run one request object (the public JSON contract); returns the response
/// object or `{error:{code,message,span}}`. Never throws.
#[wasm_bindgen]
pub fn run(request: JsValue) -> JsValue {
    let result = from_js(request).and_then(api::run_json_value);
    match result {
        Ok(v) => to_js(&v),
        Err(e) => to_js(&e.to_json()),
    }
}

/// Same as [`run`] with JSON text in and out.
#[wasm_bindgen]
pub fn run_json(text: &str) -> String {
    api::run_json_text(text).0
}

/// Raw RGBA pixels of a phase plot (rows `rows[0]..rows[1]` when given).
/// On failure, rejects with `{error:{code,message,span}}`.
#[wasm_bindgen]
pub fn phase_plot_rgba(request: JsValue) -> Result<Vec<u8>, JsValue> {
    let value = from_js(request).map_err(|e| to_js(&e.to_json()))?;
    let parsed: PhasePlotRequest = api::phase_plot_request(value).map_err(|e| to_js(&e.to_json()))?;
    match api::phase_plot_rgba(&parsed) {
        Ok(pixels) => Ok(pixels.rgba),
        Err(e) => Err(to_js(&e.to_json())),
    }
}

/// The crate version, e.g. "0.1.0".
#[wasm_bindgen]
pub fn version() -> String {
    env!("CARGO_PKG_VERSION").to_string()
}

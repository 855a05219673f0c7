//! Tests of the WebAssembly exports (src/wasm.rs), run in node:
//! `CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUNNER=wasm-bindgen-test-runner cargo test --target wasm32-unknown-unknown --test wasm_api`
//!
//! Besides the export plumbing, these pin the response shapes the page reads
//! (www/js/singularities.js, main.js): a field renamed in the core breaks here first.
#![cfg(target_arch = "wasm32")]

use residuary::wasm;
use serde_json::{json, Value};
use wasm_bindgen::JsValue;
use wasm_bindgen_test::*;

/// A JSON value as a plain JS object (the way the page passes requests).
fn js(value: &Value) -> JsValue {
    let text = value.to_string();
    js_sys::JSON::parse(&text).expect("valid JSON")
}

/// A JS value back as JSON (via JSON.stringify, the same route the page's data takes).
fn json_of(value: &JsValue) -> Value {
    let text: String = js_sys::JSON::stringify(value).expect("stringify").into();
    serde_json::from_str(&text).expect("JSON text")
}

fn error_message(v: &Value) -> Option<String> {
    v.get("error")?.get("message")?.as_str().map(str::to_owned)
}

#[wasm_bindgen_test]
fn version_is_the_crate_version() {
    assert_eq!(wasm::version(), env!("CARGO_PKG_VERSION"));
}

#[wasm_bindgen_test]
fn a_request_without_task_gives_an_error_object_with_a_message() {
    let out = json_of(&wasm::run(js(&json!({"f": "z"}))));
    let message = error_message(&out).expect("an error object");
    assert!(
        message.contains("task"),
        "message should name the missing field: {message}"
    );
}

#[wasm_bindgen_test]
fn a_non_object_request_gives_an_error_not_a_throw() {
    let out = json_of(&wasm::run(JsValue::from_str("evaluate")));
    assert!(error_message(&out).is_some(), "got {out}");
    let out = json_of(&wasm::run(JsValue::UNDEFINED));
    assert!(error_message(&out).is_some(), "got {out}");
}

#[wasm_bindgen_test]
fn an_unknown_task_is_named_in_the_error() {
    let out = json_of(&wasm::run(js(&json!({"task": "fly", "f": "z"}))));
    let message = error_message(&out).expect("an error object");
    assert!(
        message.contains("fly") && message.contains("evaluate"),
        "{message}"
    );
}

#[wasm_bindgen_test]
fn run_json_reports_malformed_json() {
    let out: Value = serde_json::from_str(&wasm::run_json("{\"task\": ")).expect("JSON reply");
    let message = error_message(&out).expect("an error object");
    assert!(message.contains("JSON"), "{message}");
}

#[wasm_bindgen_test]
fn phase_plot_rgba_rejects_a_bad_request_with_an_error_object() {
    let err = wasm::phase_plot_rgba(js(&json!({"f": "z", "view": [0, 1]}))).expect_err("must fail");
    let out = json_of(&err);
    assert!(error_message(&out).is_some(), "got {out}");
}

// ---- tasks through the wasm exports ----------------------------------------------

/// (1 + i)^2 + 1 = 1 + 2i (common practice).
#[wasm_bindgen_test]
fn evaluate_a_polynomial() {
    let out = json_of(&wasm::run(js(
        &json!({"task": "evaluate", "f": "z^2+1", "at": [[1, 1]]}),
    )));
    let v = &out["values"][0];
    assert!((v[0].as_f64().unwrap() - 1.0).abs() < 1e-12, "got {out}");
    assert!((v[1].as_f64().unwrap() - 2.0).abs() < 1e-12, "got {out}");
}

/// Integer JS numbers (size, rows) must reach the u32 fields.
#[wasm_bindgen_test]
fn phase_plot_rgba_returns_width_times_rows_pixels() {
    let req = json!({"task": "phase_plot", "f": "z", "view": [-1, 1, -1, 1], "size": [8, 6], "rows": [2, 5]});
    let bytes = wasm::phase_plot_rgba(js(&req)).expect("pixels");
    assert_eq!(bytes.len(), 8 * 3 * 4);
    assert!(bytes.chunks(4).all(|p| p[3] == 255), "every pixel opaque");
}

/// A parse error carries the character span of the fault: here the '(' never closed.
#[wasm_bindgen_test]
fn parse_error_has_the_span_of_the_unclosed_bracket() {
    let out = json_of(&wasm::run(js(
        &json!({"task": "evaluate", "f": "(z+1", "at": [[0, 0]]}),
    )));
    // the unclosed '(' is character 0
    assert_eq!(out["error"]["span"], json!([0, 1]), "got {out}");
}

fn pair(v: &Value) -> (f64, f64) {
    (v[0].as_f64().unwrap_or(f64::NAN), v[1].as_f64().unwrap_or(f64::NAN))
}

/// The `singularities` shape the page reads, on a second-order low-pass section
/// wn^2/(s^2 + 2 zeta wn s + wn^2): poles at -zeta wn ± i wn sqrt(1 - zeta^2) (common practice).
#[wasm_bindgen_test]
fn singularities_response_has_the_fields_the_page_reads() {
    let req = json!({"task": "singularities", "f": "wn^2/(s^2 + 2*zeta*wn*s + wn^2)", "var": "s",
        "params": {"wn": 2, "zeta": 0.3}, "region": {"shape": "rectangle", "corners": [[-4, -3], [2, 3]]}});
    let out = json_of(&wasm::run(js(&req)));
    for key in ["poles", "zeros", "essential", "branch_points", "removable", "warnings"] {
        assert!(out[key].is_array(), "{key} missing: {out}");
    }
    assert!(out.get("residue_at_infinity").is_some() && out.get("method").is_some(), "{out}");
    let poles = out["poles"].as_array().expect("poles");
    assert_eq!(poles.len(), 2, "{out}");
    let im = 2.0 * (1.0f64 - 0.09).sqrt();
    for p in poles {
        let (re, y) = pair(&p["at"]);
        assert!((re + 0.6).abs() < 1e-9 && (y.abs() - im).abs() < 1e-9, "{p}");
        assert_eq!(p["order"], 1);
        // simple pole: residue = wn^2 / (p - conj p) (common practice: N/D')
        let (rr, ri) = pair(&p["residue"]);
        assert!(rr.abs() < 1e-9 && (ri + 4.0 / (2.0 * y)).abs() < 1e-9, "{p}");
        assert!(p["error_estimate"].as_f64().is_some(), "{p}");
        assert!(p["principal_part"].is_array(), "{p}");
    }
}

/// `residue`: principal_part[k] is the coefficient of (s - a)^-(k+1).
/// (s+3)/((s+1)^2 (s+2)) = 1/(s+2) - 1/(s+1) + 2/(s+1)^2 (partial fractions by hand).
#[wasm_bindgen_test]
fn residue_principal_part_is_ordered_from_c_minus_1() {
    let req = json!({"task": "residue", "f": "(s+3)/((s+1)^2*(s+2))", "var": "s", "at": [-1, 0]});
    let out = json_of(&wasm::run(js(&req)));
    assert_eq!(out["order"], 2, "{out}");
    let pp = out["principal_part"].as_array().expect("principal_part");
    assert_eq!(pp.len(), 2, "{out}");
    let (c1, _) = pair(&pp[0]);
    let (c2, _) = pair(&pp[1]);
    assert!((c1 + 1.0).abs() < 1e-9 && (c2 - 2.0).abs() < 1e-9, "{out}");
    assert!(out["warnings"].is_array(), "{out}");
}

/// `laurent`: {coefficients: [{n, c}], error_estimate}. exp(1/u) = sum u^-k / k! (DLMF 4.2.19).
#[wasm_bindgen_test]
fn laurent_response_lists_n_and_c() {
    let req = json!({"task": "laurent", "f": "exp(1/(z-1))", "center": [1, 0], "inner": 0, "outer": 1, "from": -4, "to": 1});
    let out = json_of(&wasm::run(js(&req)));
    let coeffs = out["coefficients"].as_array().expect("coefficients");
    let c3 = coeffs.iter().find(|t| t["n"] == -3).expect("n = -3");
    let (re, im) = pair(&c3["c"]);
    assert!((re - 1.0 / 6.0).abs() < 1e-9 && im.abs() < 1e-9, "{out}");
    assert!(out["error_estimate"].as_f64().is_some() && out["warnings"].is_array(), "{out}");
}

/// `partial_fractions`: a text and the terms; for a non-rational f an error with a way out.
#[wasm_bindgen_test]
fn partial_fractions_text_or_an_error_for_non_rational_f() {
    let req = json!({"task": "partial_fractions", "f": "(s+3)/((s+1)^2*(s+2))", "var": "s"});
    let out = json_of(&wasm::run(js(&req)));
    assert!(out["text"].is_string() && out["terms"].as_array().map_or(0, |t| t.len()) == 3, "{out}");
    let req = json!({"task": "partial_fractions", "f": "exp(-s)/(s+1)^2", "var": "s"});
    let out = json_of(&wasm::run(js(&req)));
    assert!(error_message(&out).is_some_and(|m| m.contains("rational")), "{out}");
}

//! Request errors name their field: the shape check of `api::shape` (field
//! paths, what a field expects, unknown fields with a did-you-mean), the
//! request text (byte-order mark, UTF-8, the size cap) and the characters of
//! an expression the lexer names by code point.
//!
//! The expected messages are the contract's own wording (docs/contract.md,
//! "Request errors"), so these checks are "by construction" of that text; the
//! code point names are those of the Unicode character database (from memory),
//! and the UTF-8 facts are RFC 3629 (0xFF never occurs in UTF-8) and RFC 8259 §8.1
//! (a parser may ignore a leading byte-order mark).

use residuary::api::shape::{Expect, Field};
use residuary::api::{self, run_json_text, Request, MAX_REQUEST_BYTES, TASKS};
use serde_json::{json, Value};

/// The error object of a request that must fail.
fn error(request: Value) -> (String, String, Value) {
    let (text, is_error) = run_json_text(&request.to_string());
    assert!(is_error, "{request} should be refused: {text}");
    let v: Value = serde_json::from_str(&text).unwrap();
    let e = &v["error"];
    (e["code"].as_str().unwrap().to_string(), e["message"].as_str().unwrap().to_string(), e["span"].clone())
}

fn circle(r: Value) -> Value {
    json!({"shape": "circle", "center": [0, 0], "radius": r})
}

#[test]
fn a_wrong_type_names_the_field_path_and_what_it_expects() {
    // by construction: the wording of docs/contract.md, "Request errors"
    let cases = [
        (
            json!({"task": "evaluate", "f": "a*z", "params": {"a": "2"}, "at": [1]}),
            "\"params.a\" must be a number or [re, im], got the string \"2\"",
        ),
        (
            json!({"task": "inverse_laplace", "F": "1/(s+1)", "t": [0.5, 1, 2, null]}),
            "\"t[3]\" must be a number, got null",
        ),
        (
            json!({"task": "evaluate", "f": "z", "at": [[1, 2], [3, true]]}),
            "\"at[1][1]\" must be a number, got true",
        ),
        (
            json!({"task": "laurent", "f": "1/z", "center": [0, 0], "from": 0.5, "to": 2}),
            "\"from\" must be a whole number (no decimal point), got 0.5",
        ),
        (
            json!({"task": "residue", "f": "1/z", "at": 3}),
            "\"at\" must be [x, y] or \"infinity\", got 3",
        ),
        (
            json!({"task": "singularities", "f": "1/z", "region": {"shape": "polygon", "vertices": [[0, 0], [1, 0], [1]]}}),
            "\"region.vertices[2]\" must be [x, y], two numbers, got a list of 1 item",
        ),
        (
            json!({"task": "contour_integral", "f": "1/z", "contour": circle(json!(1)), "max_evaluations": "lots"}),
            "\"max_evaluations\" must be a whole number ≥ 0 (no decimal point) or null, got the string \"lots\"",
        ),
        (
            json!({"task": "phase_plot", "f": "z", "view": [0, 1, 0], "size": [4, 4]}),
            "\"view\" must be a list of 4 items, each a number, got a list of 3 items",
        ),
        (
            json!({"task": "phase_plot", "f": "z", "view": [0, 1, 0, 1], "size": [4, 4], "options": {"phase_lines": "yes"}}),
            "\"options.phase_lines\" must be true or false, got the string \"yes\"",
        ),
    ];
    for (request, want) in cases {
        let (code, message, span) = error(request.clone());
        assert_eq!(message, want, "{request}");
        assert_eq!(code, "bad_request", "{request}");
        assert_eq!(span, Value::Null);
    }
}

#[test]
fn a_value_out_of_range_is_invalid_field_and_names_the_field() {
    // by construction (docs/contract.md): a radius must be > 0
    let (code, message, _) = error(json!({"task": "contour_integral", "f": "1/z", "contour": circle(json!(-1))}));
    assert_eq!(code, "invalid_field");
    assert_eq!(message, "\"contour.radius\" must be a positive number, got -1");
    let (code, message, _) = error(json!({"task": "singularities", "f": "1/z",
        "region": {"shape": "ellipse", "center": [0, 0], "semi_axes": [1, 0]}}));
    assert_eq!(code, "invalid_field");
    assert_eq!(message, "\"region.semi_axes[1]\" must be a positive number, got 0");
    let many: Vec<u32> = (0..10_001).collect();
    let (code, message, _) = error(json!({"task": "inverse_laplace", "F": "1/s", "t": many}));
    assert_eq!(code, "invalid_field");
    assert_eq!(message, "\"t\" has 10001 items; at most 10000 per request: split the request");
}

#[test]
fn a_missing_field_says_what_it_must_be() {
    let (code, message, _) = error(json!({"task": "contour_integral", "f": "1/z"}));
    assert_eq!(code, "bad_request");
    assert!(message.starts_with("\"contour\" is missing: it must be an object with \"shape\": \"circle\""), "{message}");
    let (_, message, _) = error(json!({"task": "contour_integral", "f": "1/z", "contour": {"shape": "circle", "center": [0, 0]}}));
    assert_eq!(message, "\"contour.radius\" is missing: it must be a positive number");
    let (_, message, _) = error(json!({"task": "argument_count", "f": "1/z", "contour": {"center": [0, 0], "radius": 1}}));
    assert_eq!(message, "\"contour.shape\" is missing: it must be \"circle\", \"ellipse\", \"rectangle\", \"polygon\", \"half_disc\" or \"keyhole\"");
}

#[test]
fn unknown_fields_are_refused_with_the_nearest_known_name() {
    let c = circle(json!(1));
    let cases = [
        (
            json!({"task": "contour_integral", "f": "1/z", "contour": c, "max_evaluation": 5000}),
            "unknown field \"max_evaluation\" in the \"contour_integral\" request; did you mean \"max_evaluations\"?",
        ),
        (
            json!({"task": "laurent", "f": "1/((z-1)*(z-3))", "center": [0, 0], "inner": 1, "outter": 3, "from": 0, "to": 1}),
            "unknown field \"outter\" in the \"laurent\" request; did you mean \"outer\"?",
        ),
        (
            json!({"task": "argument_count", "f": "z", "contour": {"shape": "circle", "center": [0, 0], "raduis": 1}}),
            "unknown field \"raduis\" in \"contour\" (a circle); did you mean \"radius\"?",
        ),
        (
            json!({"task": "phase_plot", "f": "z", "view": [0, 1, 0, 1], "size": [4, 4], "options": {"wheels": "hsv"}}),
            "unknown field \"wheels\" in \"options\"; did you mean \"wheel\"?",
        ),
        (
            json!({"task": "inverse_laplace", "f": "1/(s+1)", "t": [1]}),
            "unknown field \"f\" in the \"inverse_laplace\" request; did you mean \"F\"?",
        ),
        (
            json!({"task": "contour_integral", "f": "1/z", "contour": {"shape": "cirlce", "center": [0, 0], "radius": 1}}),
            "\"contour.shape\" must be \"circle\", \"ellipse\", \"rectangle\", \"polygon\", \"half_disc\" or \"keyhole\", got the string \"cirlce\"; did you mean \"circle\"?",
        ),
    ];
    for (request, want) in cases {
        let (code, message, _) = error(request.clone());
        assert_eq!(message, want, "{request}");
        assert_eq!(code, "bad_request");
    }
    // Nothing near: the known fields are listed, and a stray number is pointed at "params".
    let (_, message, _) = error(json!({"task": "residue", "f": "1/(z-a)", "at": [0, 0], "a": 1}));
    assert_eq!(
        message,
        "unknown field \"a\" in the \"residue\" request; the fields are \"task\", \"f\", \"var\", \"params\", \"at\" and \"max_evaluations\"; \
         a parameter of the expression goes in \"params\": {\"a\": …}"
    );
}

#[test]
fn the_request_text_is_checked_before_parsing() {
    // RFC 8259 §8.1: a parser may ignore a leading byte-order mark; residuary does.
    let (text, is_error) = run_json_text("\u{FEFF}{\"task\": \"evaluate\", \"f\": \"z\", \"at\": [2]}");
    assert!(!is_error, "{text}");
    assert_eq!(serde_json::from_str::<Value>(&text).unwrap()["values"], json!([[2.0, 0.0]]));
    // RFC 3629 §1: the byte 0xFF never appears in UTF-8.
    let (text, is_error) = api::run_json_bytes(b"{\"task\": \"evaluate\", \"f\": \"z\xFF\"}");
    assert!(is_error);
    let v: Value = serde_json::from_str(&text).unwrap();
    assert_eq!(v["error"]["code"], "invalid_json");
    assert_eq!(v["error"]["message"], "the request is not UTF-8 text (invalid byte 0xFF at offset 28); save it as UTF-8");
    // One byte over the cap is refused unread (the text is not even JSON).
    let big = " ".repeat(MAX_REQUEST_BYTES + 1);
    let (text, is_error) = run_json_text(&big);
    assert!(is_error);
    let v: Value = serde_json::from_str(&text).unwrap();
    assert_eq!(v["error"]["code"], "bad_request");
    assert!(v["error"]["message"].as_str().unwrap().contains("larger than 67108864 bytes (64 MiB)"), "{text}");
    assert_eq!(MAX_REQUEST_BYTES, 64 * 1024 * 1024, "docs/contract.md states 64 MiB");
}

#[test]
fn invisible_and_look_alike_characters_are_named_by_code_point() {
    // Code points and names: the Unicode character database (from memory).
    let cases = [
        ("z+\u{200B}1", "U+200B zero-width space at character 2; delete it", [2, 3]),
        ("z\u{200D}", "U+200D zero-width joiner at character 1; delete it", [1, 2]),
        ("\u{200C}z", "U+200C zero-width non-joiner at character 0; delete it", [0, 1]),
        ("1/\u{FEFF}z", "U+FEFF byte-order mark (zero-width no-break space) at character 2; delete it", [2, 3]),
        ("si\u{00AD}n(z)", "U+00AD soft hyphen at character 2; delete it", [2, 3]),
        ("(z\u{2212}1)", "U+2212 minus sign at character 2; type the ASCII '-' instead", [2, 3]),
        ("2\u{00D7}z", "U+00D7 multiplication sign at character 1; write * for multiplication", [1, 2]),
    ];
    for (f, want, span) in cases {
        let (code, message, got_span) = error(json!({"task": "evaluate", "f": f, "at": [1]}));
        assert_eq!((code.as_str(), message.as_str()), ("expression", want), "{f:?}");
        assert_eq!(got_span, json!(span), "{f:?}");
    }
    // No-break spaces (pasted from web pages) are spaces: z + 1 at z = 1 is 2 (by hand).
    let v = crate::common::ok_response(json!({"task": "evaluate", "f": "z\u{00A0}+\u{202F}1", "at": [1]}));
    assert_eq!(v["values"][0], json!([2.0, 0.0]), "{v}");
}

/// A valid value for a declared field (the `k`-th variant of a tagged shape).
fn sample(expect: &Expect, k: usize) -> Value {
    match expect {
        Expect::Text => json!("z"),
        Expect::Real => json!(1.5),
        Expect::Positive => json!(2),
        Expect::Whole => json!(-3),
        Expect::Count => json!(5000),
        Expect::Count32 => json!(4),
        Expect::Bool => json!(true),
        Expect::Complex | Expect::Pair | Expect::Point => json!([1, 2]),
        Expect::List(item) | Expect::AtMost(_, item) => json!([sample(item, k)]),
        Expect::Exactly(n, item) => Value::Array((0..*n).map(|_| sample(item, k)).collect()),
        Expect::Map(item) => json!({"a": sample(item, k)}),
        Expect::Object(groups) => object(groups, k),
        Expect::Tagged(t) => {
            let (name, _, fields) = t.variants[k % t.variants.len()];
            let mut v = object(&[fields], k);
            v[t.tag] = json!(name);
            v
        }
        Expect::OrNull(inner) => sample(inner, k),
    }
}

fn object(groups: &[&[Field]], k: usize) -> Value {
    let mut map = serde_json::Map::new();
    for f in groups.iter().flat_map(|g| g.iter()) {
        map.insert(f.name.to_string(), sample(&f.expect, k));
    }
    Value::Object(map)
}

/// Same keys at every object of `declared` (the sample) and `read` (what serde read, written back).
fn same_keys(declared: &Value, read: &Value, path: &str, task: &str) {
    if let (Value::Object(d), Value::Object(r)) = (declared, read) {
        let dk: Vec<&String> = d.keys().collect();
        let rk: Vec<&String> = r.keys().collect();
        assert_eq!(dk, rk, "\"{task}\" at \"{path}\": the declared fields differ from those serde reads");
        for (key, dv) in d {
            same_keys(dv, &r[key], &format!("{path}.{key}"), task);
        }
    }
}

#[test]
fn every_declared_field_is_one_serde_reads_and_no_other() {
    // By construction: a request with every declared field (each tagged variant in turn) must
    // parse, and written back from the Rust struct it has exactly those fields — so the
    // declarations beside the request structs cannot drift from the structs.
    for task in TASKS {
        for k in 0..4 {
            let request = object(api::fields_of(task), k);
            let parsed = Request::from_json({
                let mut r = request.clone();
                r["task"] = json!(task);
                r
            })
            .unwrap_or_else(|e| panic!("\"{task}\" with every declared field: {e}"));
            let read = match parsed {
                Request::Evaluate(r) => serde_json::to_value(r),
                Request::PhasePlot(r) => serde_json::to_value(r),
                Request::Residue(r) => serde_json::to_value(r),
                Request::Singularities(r) => serde_json::to_value(r),
                Request::Laurent(r) => serde_json::to_value(r),
                Request::PartialFractions(r) => serde_json::to_value(r),
                Request::ContourIntegral(r) => serde_json::to_value(r),
                Request::ArgumentCount(r) => serde_json::to_value(r),
                Request::RealIntegral(r) => serde_json::to_value(r),
                Request::InverseLaplace(r) => serde_json::to_value(r),
                Request::InverseZ(r) => serde_json::to_value(r),
                Request::TransferFunction(r) => serde_json::to_value(r),
                Request::PoleTrails(r) => serde_json::to_value(r),
            }
            .unwrap();
            // serde_json's Map keeps keys sorted, so both sides list them in one order.
            same_keys(&request, &read, "", task);
        }
    }
}


#[test]
fn the_pixel_path_checks_its_request_too() {
    let ok = api::phase_plot_request(json!({"task": "phase_plot", "f": "z", "view": [0, 1, 0, 1], "size": [2, 2]}));
    assert!(ok.is_ok());
    let ok = api::phase_plot_request(json!({"f": "z", "view": [0, 1, 0, 1], "size": [2, 2], "rows": [0, 1]}));
    assert!(ok.is_ok(), "\"task\" may be omitted on the pixel path");
    let e = api::phase_plot_request(json!({"f": "z", "view": [0, 1, 0, 1], "size": [2, 2], "row": [0, 1]})).unwrap_err();
    assert_eq!(e.message, "unknown field \"row\" in the \"phase_plot\" request; did you mean \"rows\"?");
    let e = api::phase_plot_request(json!({"task": "evaluate", "f": "z", "view": [0, 1, 0, 1], "size": [2, 2]})).unwrap_err();
    assert_eq!(e.code, api::ErrorCode::UnknownTask);
}

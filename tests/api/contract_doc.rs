//! docs/contract.md is executable: every ```json request block is sent through
//! the doorway (`api::run_json_text`, the same call the page, node and the CLI
//! make) and the ```json response block right after it is compared with what
//! comes back. The expected values in the document come from outside the
//! project (transform tables, handbooks, mpmath); each names its source in the
//! prose beside it.
//!
//! Comparison (as docs/contract.md states it): objects by the keys the document
//! lists (every one must be present; keys it omits are not compared), arrays
//! element by element with equal lengths, strings, booleans and null exactly,
//! integers exactly, other numbers within |got − want| ≤ REL·|want| + ABS.

use residuary::api::{run_json_text, TASKS};
use serde_json::Value;

/// Relative tolerance stated in docs/contract.md.
const REL: f64 = 1e-9;
/// Absolute floor stated in docs/contract.md, so an expected 0 accepts rounding noise.
const ABS: f64 = 1e-12;

const DOC: &str = include_str!("../../docs/contract.md");

/// One example: the request text, the expected response, and where they start in the document.
struct Example {
    line: usize,
    request: String,
    response: Value,
}

/// Fenced blocks of the document: (info string, body, line of the opening fence).
fn fenced_blocks(doc: &str) -> Vec<(String, String, usize)> {
    let mut blocks = Vec::new();
    let mut open: Option<(String, String, usize)> = None;
    for (i, line) in doc.lines().enumerate() {
        let trimmed = line.trim_start();
        match open.take() {
            None => {
                if let Some(info) = trimmed.strip_prefix("```") {
                    open = Some((info.trim().to_string(), String::new(), i + 1));
                }
            }
            Some((info, mut body, start)) => {
                if trimmed.starts_with("```") {
                    blocks.push((info, body, start));
                } else {
                    body.push_str(line);
                    body.push('\n');
                    open = Some((info, body, start));
                }
            }
        }
    }
    assert!(open.is_none(), "docs/contract.md has an unclosed code fence");
    blocks
}

/// Pair each `json request` block with the `json response` block that must follow it.
fn examples(doc: &str) -> Vec<Example> {
    let blocks = fenced_blocks(doc);
    let mut out = Vec::new();
    let mut i = 0;
    while i < blocks.len() {
        let (info, body, line) = &blocks[i];
        match info.as_str() {
            "json request" => {
                let next = blocks.get(i + 1);
                let (rinfo, rbody, rline) = match next {
                    Some(b) if b.0 == "json response" => b,
                    _ => panic!("docs/contract.md line {line}: a json request block must be followed by a json response block"),
                };
                let response: Value = serde_json::from_str(rbody)
                    .unwrap_or_else(|e| panic!("docs/contract.md line {rline}: {rinfo} block is not JSON: {e}"));
                out.push(Example { line: *line, request: body.clone(), response });
                i += 2;
            }
            "json response" => panic!("docs/contract.md line {line}: a json response block with no request before it"),
            _ => i += 1,
        }
    }
    out
}

/// Compare the documented value `want` with `got`; push one line per difference.
fn compare(want: &Value, got: &Value, path: &str, errors: &mut Vec<String>) {
    match (want, got) {
        (Value::Object(w), Value::Object(g)) => {
            for (key, wv) in w {
                let p = format!("{path}.{key}");
                match g.get(key) {
                    Some(gv) => compare(wv, gv, &p, errors),
                    None => errors.push(format!("{p}: documented but missing from the response")),
                }
            }
        }
        (Value::Array(w), Value::Array(g)) => {
            if w.len() != g.len() {
                errors.push(format!("{path}: documented {} elements, response has {}", w.len(), g.len()));
            }
            for (k, (wv, gv)) in w.iter().zip(g).enumerate() {
                compare(wv, gv, &format!("{path}[{k}]"), errors);
            }
        }
        (Value::Number(w), Value::Number(g)) => {
            let exact = |n: &serde_json::Number| n.is_i64() || n.is_u64();
            if exact(w) && exact(g) {
                if w.as_i64() != g.as_i64() || w.as_u64() != g.as_u64() {
                    errors.push(format!("{path}: documented {w}, response {g}"));
                }
            } else {
                let (a, b) = (w.as_f64().unwrap(), g.as_f64().unwrap());
                if !((a - b).abs() <= REL * a.abs() + ABS) {
                    errors.push(format!("{path}: documented {a}, response {b} (differ by {:e})", (a - b).abs()));
                }
            }
        }
        (w, g) if w == g => {}
        (w, g) => errors.push(format!("{path}: documented {w}, response {g}")),
    }
}

#[test]
fn every_example_in_the_contract_document_holds() {
    let all = examples(DOC);
    assert!(all.len() >= 10, "docs/contract.md should carry an example per task; found {}", all.len());
    let mut failures = Vec::new();
    for ex in &all {
        let (text, _is_error) = run_json_text(&ex.request);
        let got: Value = serde_json::from_str(&text).expect("the doorway always answers JSON");
        let mut errors = Vec::new();
        compare(&ex.response, &got, "response", &mut errors);
        if !errors.is_empty() {
            failures.push(format!(
                "docs/contract.md line {}:\n  {}\n  full response: {}",
                ex.line,
                errors.join("\n  "),
                text
            ));
        }
    }
    assert!(failures.is_empty(), "{} of {} examples disagree with the doorway:\n{}", failures.len(), all.len(), failures.join("\n"));
}

#[test]
fn the_document_has_an_example_for_every_task_and_an_error() {
    let all = examples(DOC);
    for task in TASKS {
        let shown = all.iter().any(|ex| {
            serde_json::from_str::<Value>(&ex.request).ok().and_then(|r| r.get("task").cloned()) == Some(Value::from(*task))
        });
        assert!(shown, "docs/contract.md has no example for the \"{task}\" task");
    }
    assert!(
        all.iter().any(|ex| ex.response.get("error").and_then(|e| e.get("code")).is_some()),
        "docs/contract.md needs at least one error example with its \"code\""
    );
}

#[test]
fn the_comparison_can_fail() {
    // A wrong expected value, a missing key, a wrong length and a wrong string are each caught.
    let got: Value = serde_json::json!({"value": [3.141592653589793, 0.0], "n": 3, "kind": "pole", "list": [1, 2]});
    let cases = [
        serde_json::json!({"value": [3.1415926, 0]}),
        serde_json::json!({"missing": 1}),
        serde_json::json!({"n": 4}),
        serde_json::json!({"kind": "zero"}),
        serde_json::json!({"list": [1]}),
    ];
    for want in &cases {
        let mut errors = Vec::new();
        compare(want, &got, "response", &mut errors);
        assert!(!errors.is_empty(), "{want} should not match {got}");
    }
    let mut errors = Vec::new();
    compare(&serde_json::json!({"value": [3.14159265358979, 1e-13], "n": 3}), &got, "response", &mut errors);
    assert!(errors.is_empty(), "within tolerance: {errors:?}");
}

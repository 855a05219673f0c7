//! Running one request through the doorway and checking what comes back:
//! no panic, a bounded time, no non-finite number written as text, and every
//! error with a known `code` and a message.

use serde_json::Value;
use std::panic::{catch_unwind, AssertUnwindSafe};
use std::sync::{Mutex, Once};
use std::time::{Duration, Instant};

/// The codes of docs/contract.md ("Errors"), except `internal`, which is a defect.
const CODES: &[&str] = &[
    "invalid_json",
    "unknown_task",
    "bad_request",
    "invalid_field",
    "expression",
    "budget_exhausted",
    "not_finite",
    "on_contour",
    "cut_crossing",
    "not_applicable",
    "divergent",
    "unresolved",
];

/// What one run gave.
pub struct Outcome {
    pub elapsed: Duration,
    pub problems: Vec<String>,
}

static PANIC_MESSAGE: Mutex<Option<String>> = Mutex::new(None);
static HOOK: Once = Once::new();
thread_local! {
    static IN_CASE: std::cell::Cell<bool> = const { std::cell::Cell::new(false) };
}

/// Panics inside a request are caught and recorded (with their location), not
/// printed; others (the test's own assertions) go to the default hook.
fn quiet_panics() {
    HOOK.call_once(|| {
        let default = std::panic::take_hook();
        std::panic::set_hook(Box::new(move |info| {
            if !IN_CASE.with(|c| c.get()) {
                return default(info);
            }
            let at = info.location().map(|l| format!(" at {}:{}", l.file(), l.line())).unwrap_or_default();
            let msg = info
                .payload()
                .downcast_ref::<&str>()
                .map(|s| s.to_string())
                .or_else(|| info.payload().downcast_ref::<String>().cloned())
                .unwrap_or_default();
            *PANIC_MESSAGE.lock().unwrap_or_else(|e| e.into_inner()) = Some(format!("{msg}{at}"));
        }));
    });
}

/// Run `request` (JSON text) through `run_json_text` and check the answer.
/// `limit` is the time it may take.
pub fn run(request: &str, limit: Duration) -> Outcome {
    quiet_panics();
    let start = Instant::now();
    IN_CASE.with(|c| c.set(true));
    let result = catch_unwind(AssertUnwindSafe(|| residuary::api::run_json_text(request)));
    IN_CASE.with(|c| c.set(false));
    let elapsed = start.elapsed();
    let mut problems = Vec::new();
    match result {
        Err(_) => {
            let msg = PANIC_MESSAGE.lock().unwrap_or_else(|e| e.into_inner()).take().unwrap_or_default();
            problems.push(format!("panic: {msg}"));
        }
        Ok((text, is_error)) => problems.extend(check_text(&text, is_error)),
    }
    if elapsed > limit {
        problems.push(format!("slow: {:.2} s (limit {:.2} s)", elapsed.as_secs_f64(), limit.as_secs_f64()));
    }
    Outcome { elapsed, problems }
}

/// The checks on a response text.
pub fn check_text(text: &str, is_error: bool) -> Vec<String> {
    let mut problems = Vec::new();
    let value: Value = match serde_json::from_str(text) {
        Ok(v) => v,
        Err(e) => return vec![format!("the response is not JSON ({e})")],
    };
    if is_error {
        let code = value["error"]["code"].as_str().unwrap_or("");
        if !CODES.contains(&code) {
            problems.push(format!("error code {:?} is not a user-facing code of the contract", value["error"]["code"]));
        }
        match value["error"]["message"].as_str() {
            Some(m) if !m.trim().is_empty() => {}
            _ => problems.push("error without a message".into()),
        }
    } else if !value.is_object() || value.get("error").is_some() {
        problems.push("a success that is not a plain object".into());
    }
    walk(&value, "", &mut problems);
    problems
}

/// Every string in the response, except the base64 image data, must not
/// spell a non-finite number.
fn walk(v: &Value, path: &str, problems: &mut Vec<String>) {
    match v {
        Value::String(s) => {
            if let Some(word) = non_finite_word(s) {
                problems.push(format!("{word:?} in text at {path}: {s:?}"));
            }
        }
        Value::Array(xs) => xs.iter().enumerate().for_each(|(k, x)| walk(x, &format!("{path}[{k}]"), problems)),
        Value::Object(m) => {
            for (k, x) in m {
                if k != "data" {
                    walk(x, &format!("{path}.{k}"), problems);
                }
            }
        }
        _ => {}
    }
}

/// `NaN`, `inf` or `Infinity` as a word of `s` (how Rust and JavaScript print
/// non-finite floats). "infinity" in a sentence is a place, not a number, and
/// is allowed; "Infinity" is flagged only after a sign or a digit context.
pub fn non_finite_word(s: &str) -> Option<&'static str> {
    let words = s.split(|c: char| !(c.is_ascii_alphanumeric() || c == '.'));
    let mut prev_end = 0usize;
    for w in words {
        let start = prev_end;
        prev_end = start + w.len() + 1;
        match w {
            "NaN" | "nan" | "NaNi" => return Some("NaN"),
            "inf" | "infi" => return Some("inf"),
            "Infinity" | "Infinityi" => {
                let before = s[..start].trim_end_matches(' ');
                let whole = s.trim().trim_start_matches(['-', '+']) == w;
                if whole || before.ends_with(['-', '+', '(', '−', '=', ',']) {
                    return Some("Infinity");
                }
            }
            _ => {}
        }
    }
    None
}

#[test]
fn the_word_check_tells_numbers_from_places() {
    // By construction: how Rust's `{}` prints non-finite f64 (std docs, Display for f64).
    assert_eq!(non_finite_word(&format!("{} + {}i", f64::NAN, f64::NAN)), Some("NaN"));
    assert_eq!(non_finite_word(&format!("pole at {}", f64::INFINITY)), Some("inf"));
    assert_eq!(non_finite_word(&format!("(z - {})", f64::NEG_INFINITY)), Some("inf"));
    assert_eq!(non_finite_word("-Infinity"), Some("Infinity"));
    assert_eq!(non_finite_word("the residue at infinity is 0"), None);
    assert_eq!(non_finite_word("Infinity is not isolated"), None);
    assert_eq!(non_finite_word("information; infinite sum"), None);
}

//! The command line as a script sees it: `residuary json` and `residuary plot`.

use serde_json::{json, Value};
use std::io::Write;
use std::process::{Command, Stdio};

fn residuary(args: &[&str], stdin: &str) -> (i32, String, String) {
    residuary_bytes(args, stdin.as_bytes())
}

fn residuary_bytes(args: &[&str], stdin: &[u8]) -> (i32, String, String) {
    let mut child = Command::new(env!("CARGO_BIN_EXE_residuary"))
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("the residuary binary runs");
    let mut input = child.stdin.take().unwrap();
    // The CLI stops reading past its cap, so a broken pipe here is expected for huge input.
    let _ = input.write_all(stdin);
    drop(input);
    let out = child.wait_with_output().unwrap();
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn json_request(request: Value) -> (i32, Value) {
    let (code, out, _) = residuary(&["json"], &request.to_string());
    (code, serde_json::from_str(&out).expect("stdout is one JSON document"))
}

#[test]
fn malformed_expression_is_an_error_object_with_a_span_and_exit_2() {
    let (code, v) = json_request(json!({"task": "evaluate", "f": "(z+1", "at": [[0, 0]]}));
    assert_eq!(code, 2);
    let e = &v["error"];
    assert!(e["message"].as_str().unwrap().contains("')'"), "{v}");
    assert_eq!(e["span"], json!([0, 1]), "the span points at the unclosed '('");
}

#[test]
fn malformed_json_and_unknown_tasks_are_errors_not_panics() {
    for text in ["", "{", "[1,2]", "{\"task\":\"fly\"}", "{\"task\":3}", "{\"f\":\"z\"}", "null"] {
        let (code, out, err) = residuary(&["json"], text);
        assert_eq!(code, 2, "{text}: {out} {err}");
        let v: Value = serde_json::from_str(&out).unwrap();
        assert!(v["error"]["message"].as_str().is_some_and(|m| !m.is_empty()), "{text}: {out}");
        assert!(!err.contains("panicked"), "{text}: {err}");
    }
}

#[test]
fn every_contract_task_answers_without_panicking() {
    let f = "exp(-s)/(s^2 + 2*s + 5)";
    let region = json!({"shape": "circle", "center": [0, 0], "radius": 4});
    let requests = [
        json!({"task": "evaluate", "f": f, "var": "s", "at": [[0, 1]]}),
        json!({"task": "phase_plot", "f": f, "var": "s", "view": [-3, 3, -3, 3], "size": [16, 16]}),
        json!({"task": "residue", "f": f, "var": "s", "at": [-1, 2]}),
        json!({"task": "singularities", "f": f, "var": "s", "region": region}),
        json!({"task": "laurent", "f": f, "var": "s", "center": [0, 0], "inner": 0, "outer": 1, "from": 0, "to": 3}),
        json!({"task": "partial_fractions", "f": "1/(s^2 + 2*s + 5)", "var": "s"}),
        json!({"task": "contour_integral", "f": f, "var": "s", "contour": region}),
        json!({"task": "argument_count", "f": f, "var": "s", "contour": region}),
        json!({"task": "real_integral", "kind": "line", "f": "1/(x^2+1)", "var": "x"}),
        json!({"task": "inverse_laplace", "F": "1/(s+1)", "t": [1]}),
        json!({"task": "inverse_z", "X": "z/(z-0.5)", "n": [0, 1]}),
    ];
    for r in requests {
        let (code, out, err) = residuary(&["json"], &r.to_string());
        assert!(code == 0 || code == 2, "{r}: exit {code}");
        assert!(!err.contains("panicked"), "{r}: {err}");
        let v: Value = serde_json::from_str(&out).unwrap();
        assert_eq!(code == 2, v.get("error").is_some(), "{r}: {out}");
    }
}

#[test]
fn residue_of_a_double_pole_through_the_cli() {
    // Res_{z=2} cos z/((z−2)²(z+1)) = d/dz[cos z/(z+1)] at 2 = (−3 sin 2 − cos 2)/9
    // (derivative rule for a double pole; common practice, any complex-analysis text).
    let (code, v) = json_request(json!({"task": "residue", "f": "cos(z)/((z-2)^2*(z+1))", "at": [2, 0]}));
    assert_eq!(code, 0, "{v}");
    let want = (-3.0 * 2f64.sin() - 2f64.cos()) / 9.0;
    let got = &v["residue"];
    assert!((got[0].as_f64().unwrap() - want).abs() < 1e-12 * want.abs(), "{v}");
    assert!(got[1].as_f64().unwrap().abs() < 1e-12);
    assert_eq!(v["kind"], "pole");
    assert_eq!(v["order"], 2);
    assert!(v["error_estimate"].as_f64().unwrap() >= (got[0].as_f64().unwrap() - want).abs());
}

#[test]
fn plot_writes_a_png_of_the_requested_size() {
    let dir = std::env::temp_dir().join(format!("residuary-cli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("lowpass.png");
    let (code, _, err) = residuary(
        &[
            "plot", "--f", "wn^2/(s^2+2*zeta*wn*s+wn^2)", "--var", "s", "--param", "wn=2", "--param", "zeta=0.3",
            "--view", "-4,2,-3,3", "--size", "64x48", "--modulus-lines", "-o", path.to_str().unwrap(),
        ],
        "",
    );
    assert_eq!(code, 0, "{err}");
    let bytes = std::fs::read(&path).unwrap();
    assert_eq!(&bytes[..8], b"\x89PNG\r\n\x1a\n", "PNG signature (RFC 2083)");
    // IHDR width and height, big-endian at offsets 16 and 20 (RFC 2083 §4.1.1)
    assert_eq!(u32::from_be_bytes(bytes[16..20].try_into().unwrap()), 64);
    assert_eq!(u32::from_be_bytes(bytes[20..24].try_into().unwrap()), 48);
    std::fs::remove_dir_all(&dir).ok();
}

#[test]
fn plot_refuses_bad_options_with_advice() {
    let (code, _, err) = residuary(&["plot", "--f", "z", "--size", "0x10", "-o", "/tmp/never.png"], "");
    assert_eq!(code, 2);
    assert!(err.contains("--size"), "{err}");
    let (code, _, err) = residuary(&["plot", "--f", "abs(z)", "-o", "/tmp/never.png"], "");
    assert_eq!(code, 2);
    assert!(err.contains("meromorphic"), "{err}");
}

#[test]
fn a_byte_order_mark_is_skipped_and_non_utf8_is_named_by_byte_and_offset() {
    // RFC 8259 §8.1: a parser may ignore a leading byte-order mark (EF BB BF in UTF-8).
    let (code, out, err) = residuary_bytes(&["json"], b"\xEF\xBB\xBF{\"task\":\"evaluate\",\"f\":\"z\",\"at\":[3]}");
    assert_eq!(code, 0, "{out} {err}");
    let v: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["values"], json!([[3.0, 0.0]]));
    // RFC 3629: 0xC3 starts a two-byte sequence and must be followed by 0x80..0xBF, not '"'.
    let (code, out, _) = residuary_bytes(&["json"], b"{\"task\":\"evaluate\",\"f\":\"\xC3\"}");
    assert_eq!(code, 2);
    let v: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["error"]["code"], "invalid_json");
    assert_eq!(v["error"]["message"], "the request is not UTF-8 text (invalid byte 0xC3 at offset 24); save it as UTF-8");
}

#[test]
fn a_request_over_64_mib_is_refused_unread() {
    // 64 MiB + 1 bytes of spaces: refused by size before any parsing (docs/contract.md).
    let big = vec![b' '; 64 * 1024 * 1024 + 1];
    let (code, out, err) = residuary_bytes(&["json"], &big);
    assert_eq!(code, 2, "{err}");
    let v: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["error"]["code"], "bad_request");
    assert!(v["error"]["message"].as_str().unwrap().contains("64 MiB"), "{out}");
}

#[cfg(target_os = "linux")]
#[test]
fn a_response_that_cannot_be_written_exits_1_with_the_reason_on_stderr() {
    // /dev/full accepts opening and fails every write with ENOSPC (Linux null(4) manual page).
    let full = std::fs::OpenOptions::new().write(true).open("/dev/full").expect("/dev/full exists on Linux");
    let mut child = Command::new(env!("CARGO_BIN_EXE_residuary"))
        .arg("json")
        .stdin(Stdio::piped())
        .stdout(full)
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    child.stdin.take().unwrap().write_all(b"{\"task\":\"evaluate\",\"f\":\"z\",\"at\":[1]}").unwrap();
    let out = child.wait_with_output().unwrap();
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(1), "{err}");
    assert!(err.contains("could not write the response"), "{err}");
    assert!(!err.contains("panicked"), "{err}");
}

#[test]
fn help_names_both_commands() {
    let (code, out, _) = residuary(&["--help"], "");
    assert_eq!(code, 0);
    assert!(out.contains("residuary json") && out.contains("residuary plot"));
}

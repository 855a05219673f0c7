//! A battery of the residue, singularity and infinity questions practitioners
//! ask about general (non-rational) functions, sent through the JSON doorway
//! (`api::run_json_text`) so the task glue is exercised too. References:
//! tests/fixtures/battery.json, written by tests/fixtures/gen_battery.py with
//! mpmath 1.3.0 at 40 digits; each case names its closed form (DLMF number or
//! rule) in its "source" field, and the script checks every closed form
//! against an independent mpmath contour integral before writing it.
//!
//! Every check: the kind and order match; |residue − reference| is within the
//! reported error estimate (plus the 1-ulp rounding of the f64 reference);
//! for poles the estimate itself is at most 1e-10 relative.

use residuary::api::run_json_text;
use serde_json::{json, Value};

fn fixtures() -> Value {
    serde_json::from_str(include_str!("../fixtures/battery.json")).expect("fixture JSON")
}

fn ask(req: &Value) -> (Value, bool) {
    let (text, is_err) = run_json_text(&req.to_string());
    (serde_json::from_str(&text).expect("response JSON"), is_err)
}

fn c(v: &Value) -> Option<(f64, f64)> {
    Some((v.get(0)?.as_f64()?, v.get(1)?.as_f64()?))
}

fn dist(a: (f64, f64), b: (f64, f64)) -> f64 {
    (a.0 - b.0).hypot(a.1 - b.1)
}

fn norm(a: (f64, f64)) -> f64 {
    a.0.hypot(a.1)
}

/// Checks a residue against its reference; `Err` says what is wrong.
fn check_residue(got: &Value, err: &Value, want: (f64, f64), kind: &str) -> Result<(), String> {
    let Some(r) = c(got) else {
        return Err(format!("no residue (got {got})"));
    };
    let e = err.as_f64().ok_or("no error estimate")?;
    let d = dist(r, want);
    let slack = 2.3e-16 * norm(want);
    if d > e + slack {
        return Err(format!(
            "|{r:?} − {want:?}| = {d:.2e} exceeds the estimate {e:.2e}"
        ));
    }
    if kind == "pole" && e > 1e-10 * norm(want).max(1.0) {
        return Err(format!("error estimate {e:.2e} above 1e-10 relative"));
    }
    if e > 1e-8 * norm(want).max(1.0) {
        return Err(format!("error estimate {e:.2e} is too loose to be useful"));
    }
    Ok(())
}

fn with_function(case: &Value, mut req: Value) -> Value {
    for key in ["var", "params"] {
        if let Some(v) = case.get(key) {
            req[key] = v.clone();
        }
    }
    req
}

/// Table of results, printed; the test fails if any row failed.
fn report(rows: &[(String, Result<(), String>)]) {
    assert!(!rows.is_empty(), "no battery rows ran (empty fixture?)");
    let mut failed = 0;
    for (name, r) in rows {
        match r {
            Ok(()) => println!("PASS  {name}"),
            Err(e) => {
                failed += 1;
                println!("FAIL  {name}: {e}");
            }
        }
    }
    assert_eq!(
        failed,
        0,
        "{failed} of {} battery checks failed (see the table above)",
        rows.len()
    );
}

#[test]
fn residues_at_points_and_infinity() {
    let fx = fixtures();
    let mut rows = Vec::new();
    for case in fx["residues"].as_array().unwrap() {
        let name = case["name"].as_str().unwrap().to_string();
        let req = with_function(
            case,
            json!({"task": "residue", "f": case["f"], "at": case["at"]}),
        );
        let (resp, is_err) = ask(&req);
        let kind = case["kind"].as_str().unwrap();
        let r = (|| {
            if is_err {
                return Err(format!("error: {resp}"));
            }
            let got_kind = resp["kind"].as_str().unwrap_or("");
            // The kind must match the fixture exactly (the 1/Γ case, where "removable"
            // and "regular" are both right, is in awkward_points_get_clear_answers).
            if got_kind != kind {
                return Err(format!(
                    "kind {got_kind}, expected {kind} ({})",
                    case["source"]
                ));
            }
            if resp["order"] != case["order"] {
                return Err(format!(
                    "order {}, expected {}",
                    resp["order"], case["order"]
                ));
            }
            let want = c(&case["residue"]).ok_or("fixture without residue")?;
            check_residue(&resp["residue"], &resp["error_estimate"], want, kind)
        })();
        rows.push((
            format!("residue {name} [{}]", case["source"].as_str().unwrap_or("")),
            r,
        ));
    }
    report(&rows);
}

#[test]
fn branch_points_never_get_a_number() {
    // Branch points of principal branches (DLMF §4.2 for log and powers, §4.23 for asin;
    // section numbers from memory, common practice).
    let cases = [
        ("sqrt(z)", json!([0, 0])),
        ("log(z)", json!([0, 0])),
        ("z^(1/3)", json!([0, 0])),
        ("sqrt(z^2-1)", json!([1, 0])),
        ("sqrt(z^2-1)", json!([-1, 0])),
        ("log((z-1)/(z+1))", json!([1, 0])),
        ("log((z-1)/(z+1))", json!([-1, 0])),
        ("asin(z)", json!([1, 0])),
        ("sqrt(z)", json!("infinity")),
        ("log(z)/(z-2)", json!([0, 0])),
    ];
    let mut rows = Vec::new();
    for (f, at) in cases {
        let (resp, is_err) = ask(&json!({"task": "residue", "f": f, "at": at}));
        let r = if is_err {
            Err(format!("error: {resp}"))
        } else if resp["kind"] != "branch_point" {
            Err(format!("kind {}", resp["kind"]))
        } else if !resp["residue"].is_null() || !resp["error_estimate"].is_null() {
            Err(format!("a number was given: {resp}"))
        } else {
            Ok(())
        };
        rows.push((format!("branch point {f} at {at}"), r));
    }
    report(&rows);
}

#[test]
fn awkward_points_get_clear_answers() {
    let mut rows = Vec::new();
    // A point on log's principal cut that is not a branch point: a clear error (common practice).
    let (resp, is_err) = ask(&json!({"task": "residue", "f": "log(z)", "at": [-3, 0]}));
    let msg = resp["error"]["message"].as_str().unwrap_or("");
    rows.push((
        "log z at -3 (on the cut)".into(),
        if is_err && msg.contains("cut") && msg.contains("not a branch point") {
            Ok(())
        } else {
            Err(format!("{resp}"))
        },
    ));
    // tan z: poles accumulate at infinity (common practice): no residue, a warning.
    let (resp, is_err) = ask(&json!({"task": "residue", "f": "tan(z)", "at": "infinity"}));
    rows.push((
        "tan z at infinity (not isolated)".into(),
        if !is_err && resp["residue"].is_null() && !resp["warnings"].as_array().unwrap().is_empty()
        {
            Ok(())
        } else {
            Err(format!("{resp}"))
        },
    ));
    // 1/Γ is entire (DLMF 5.2(i)); at −3 the expression is 1/∞: regular or removable, residue 0.
    let (resp, is_err) = ask(&json!({"task": "residue", "f": "1/gamma(z)", "at": [-3, 0]}));
    let kind = resp["kind"].as_str().unwrap_or("");
    rows.push((
        "1/gamma at -3".into(),
        if !is_err
            && (kind == "regular" || kind == "removable")
            && c(&resp["residue"]).is_some_and(|r| {
                norm(r) <= resp["error_estimate"].as_f64().unwrap_or(0.0).max(1e-14)
            })
        {
            Ok(())
        } else {
            Err(format!("{resp}"))
        },
    ));
    // A point 1e-6 from the pole of 1/sin at π is regular (common practice).
    let (resp, _) =
        ask(&json!({"task": "residue", "f": "1/sin(z)", "at": [std::f64::consts::PI + 1e-6, 0]}));
    rows.push((
        "1/sin at pi + 1e-6".into(),
        if resp["kind"] == "regular" {
            Ok(())
        } else {
            Err(format!("{resp}"))
        },
    ));
    // sin(1/sin z): zeros accumulate at 0 (1/sin z = kπ; common practice). No
    // crowd of them may be passed off as one multiple zero.
    let (resp, is_err) = ask(&json!({"task": "singularities", "f": "sin(1/sin(z))",
        "region": {"shape": "circle", "center": [0.5, 0.2], "radius": 1}}));
    let multiple = resp["zeros"]
        .as_array()
        .map(|z| z.iter().filter(|z| z["order"] != 1).count())
        .unwrap_or(0);
    rows.push((
        "sin(1/sin z): no fake multiple zeros".into(),
        if !is_err
            && resp["zeros"].is_array()
            && multiple == 0
            && !resp["warnings"].as_array().unwrap().is_empty()
        {
            Ok(())
        } else {
            Err(format!("{resp}"))
        },
    ));
    report(&rows);
}

fn find_near<'a>(list: &'a Value, at: (f64, f64), tol: f64) -> Option<&'a Value> {
    list.as_array()?
        .iter()
        .find(|p| c(&p["at"]).is_some_and(|z| dist(z, at) <= tol))
}

fn check_region(case: &Value) -> Result<(), String> {
    let req = with_function(
        case,
        json!({"task": "singularities", "f": case["f"], "region": case["region"]}),
    );
    let (resp, is_err) = ask(&req);
    if is_err {
        return Err(format!("error: {resp}"));
    }
    let want_poles = case["poles"].as_array().unwrap();
    if resp["poles"].as_array().map(|a| a.len()) != Some(want_poles.len()) {
        return Err(format!(
            "poles {}, expected {}",
            resp["poles"], case["poles"]
        ));
    }
    for p in want_poles {
        let at = c(&p["at"]).unwrap();
        let got = find_near(&resp["poles"], at, 1e-8 * (1.0 + norm(at)))
            .ok_or_else(|| format!("no pole at {at:?}: {}", resp["poles"]))?;
        if got["order"] != p["order"] {
            return Err(format!(
                "order at {at:?}: {} vs {}",
                got["order"], p["order"]
            ));
        }
        check_residue(
            &got["residue"],
            &got["error_estimate"],
            c(&p["residue"]).unwrap(),
            "pole",
        )
        .map_err(|e| format!("pole at {at:?}: {e}"))?;
    }
    let want_zeros = case["zeros"].as_array().unwrap();
    if resp["zeros"].as_array().map(|a| a.len()) != Some(want_zeros.len()) {
        return Err(format!(
            "zeros {}, expected {}",
            resp["zeros"], case["zeros"]
        ));
    }
    for z in want_zeros {
        let at = c(&z["at"]).unwrap();
        let got = find_near(&resp["zeros"], at, 1e-8 * (1.0 + norm(at)))
            .ok_or_else(|| format!("no zero at {at:?}: {}", resp["zeros"]))?;
        if got["order"] != z["order"] {
            return Err(format!("zero order at {at:?}"));
        }
    }
    for key in ["essential", "branch_points"] {
        let want = case[key].as_array().unwrap();
        if resp[key].as_array().map(|a| a.len()) != Some(want.len()) {
            return Err(format!("{key} {}, expected {}", resp[key], case[key]));
        }
        for w in want {
            let at = c(w).unwrap();
            find_near(&resp[key], at, 1e-8 * (1.0 + norm(at)))
                .ok_or_else(|| format!("no {key} point at {at:?}: {}", resp[key]))?;
        }
    }
    if let Some(inf) = c(&case["residue_at_infinity"]) {
        let got = c(&resp["residue_at_infinity"]).ok_or("no residue at infinity")?;
        if dist(got, inf) > 1e-10 * norm(inf).max(1.0) {
            return Err(format!("residue at infinity {got:?} vs {inf:?}"));
        }
    }
    Ok(())
}

#[test]
fn singularities_in_regions() {
    let fx = fixtures();
    let mut rows = Vec::new();
    let regions = fx["regions"].as_array().unwrap();
    // check_region skips the Res∞ comparison where the fixture has none: make sure
    // some cases do have one, so that comparison really runs.
    assert!(
        regions
            .iter()
            .filter(|r| c(&r["residue_at_infinity"]).is_some())
            .count()
            >= 2
    );
    for case in regions {
        let name = case["name"].as_str().unwrap();
        rows.push((format!("region {name} ({})", case["f"]), check_region(case)));
    }
    report(&rows);
}

#[test]
fn cosecant_in_a_large_disk_is_fast() {
    // Poles kπ (common practice): 0, ±π, ±2π lie in |z| < 7 (3π > 7), so 5 (by hand).
    // In release builds the whole request must take well under a second.
    let req = json!({"task": "singularities", "f": "1/sin(z)", "region": {"shape": "circle", "center": [0, 0], "radius": 7}});
    let t = std::time::Instant::now();
    let (resp, is_err) = ask(&req);
    let secs = t.elapsed().as_secs_f64();
    assert!(!is_err, "{resp}");
    assert_eq!(resp["poles"].as_array().unwrap().len(), 5);
    if !cfg!(debug_assertions) {
        assert!(secs < 0.5, "took {secs:.2} s");
    }
}

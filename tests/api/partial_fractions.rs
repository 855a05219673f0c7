//! `partial_fractions` and the transforms on repeated poles next to other poles:
//! each distinct pole keeps its own multiplicity (regressions: poles 1 apart were
//! merged into one pole of order 3 at their centroid).

use residuary::api::run_json_text;
use serde_json::{json, Value};

fn run(request: Value) -> Value {
    let (text, is_error) = run_json_text(&request.to_string());
    assert!(!is_error, "{request} answered {text}");
    serde_json::from_str(&text).unwrap()
}

/// (pole, power, coefficient) terms of the response, real parts only.
fn terms(r: &Value) -> Vec<(f64, u64, f64, f64)> {
    r["terms"]
        .as_array()
        .unwrap()
        .iter()
        .map(|t| {
            (t["at"][0].as_f64().unwrap(), t["power"].as_u64().unwrap(), t["c"][0].as_f64().unwrap(), t["c"][1].as_f64().unwrap())
        })
        .collect()
}

fn check(f: &str, want: &[(f64, u64, f64)], rel: f64) {
    let r = run(json!({"task": "partial_fractions", "f": f, "var": "s"}));
    let got = terms(&r);
    let e = r["error_estimate"].as_f64().unwrap();
    for &(at, power, c) in want {
        let t = got
            .iter()
            .find(|t| (t.0 - at).abs() < 1e-6 && t.1 == power)
            .unwrap_or_else(|| panic!("{f}: no term c/(s − {at})^{power} in {r}"));
        let d = ((t.2 - c).powi(2) + t.3.powi(2)).sqrt();
        assert!(d <= rel * c.abs().max(1.0), "{f}: c/(s − {at})^{power} = {} + {}i, want {c}", t.2, t.3);
        assert!(d <= e, "{f}: the error estimate {e:e} does not cover the error {d:e}");
    }
    let nonzero = got.iter().filter(|t| t.2.abs() + t.3.abs() > 1e-6).count();
    assert_eq!(nonzero, want.iter().filter(|w| w.2 != 0.0).count(), "{f}: {r}");
}

#[test]
fn a_simple_pole_beside_a_double_pole_keeps_both() {
    // sympy 1.14 apart, exact: 1/(s(s+1)²) = 1/s − 1/(s+1) − 1/(s+1)²  (every Laplace table's
    // first repeated-pole entry ↔ 1 − e^{−t} − t e^{−t}).
    check("1/(s*(s+1)^2)", &[(0.0, 1, 1.0), (-1.0, 1, -1.0), (-1.0, 2, -1.0)], 1e-12);
    // sympy 1.14 apart, exact: 1/(s(s+2)²) = 1/(4s) − 1/(4(s+2)) − 1/(2(s+2)²).
    check("1/(s*(s+2)^2)", &[(0.0, 1, 0.25), (-2.0, 1, -0.25), (-2.0, 2, -0.5)], 1e-12);
}

#[test]
fn three_triple_poles_half_a_unit_apart_stay_three() {
    // sympy 1.14 apart, exact: 1/((s+1)³(s+3/2)³(s+2)³) =
    // 384/(s+1) − 72/(s+1)² + 8/(s+1)³ − 768/(s+3/2) − 64/(s+3/2)³ + 384/(s+2) + 72/(s+2)² + 8/(s+2)³.
    check(
        "1/((s+1)^3*(s+1.5)^3*(s+2)^3)",
        &[
            (-1.0, 1, 384.0),
            (-1.0, 2, -72.0),
            (-1.0, 3, 8.0),
            (-1.5, 1, -768.0),
            (-1.5, 3, -64.0),
            (-2.0, 1, 384.0),
            (-2.0, 2, 72.0),
            (-2.0, 3, 8.0),
        ],
        1e-8,
    );
}

#[test]
fn the_inverse_laplace_of_the_table_entry_is_the_table_value() {
    // 1/(s(s+1)²) ↔ 1 − e^{−t} − t e^{−t} (Laplace transform table, e.g. Ogata, Modern Control
    // Engineering, App. A — from memory; the closed form follows from the partial fractions above).
    let t = [0.5, 1.0, 2.0, 5.0];
    let r = run(json!({"task": "inverse_laplace", "F": "1/(s*(s+1)^2)", "t": t}));
    for (i, &t) in t.iter().enumerate() {
        let want = 1.0 - (-t as f64).exp() - t * (-t as f64).exp();
        let got = r["f"][i].as_f64().unwrap();
        let e = r["error_estimates"][i].as_f64().unwrap();
        assert!((got - want).abs() <= e.max(1e-15) && (got - want).abs() < 1e-12, "t = {t}: {got} vs {want} (estimate {e})");
    }
    assert_eq!(r["poles"].as_array().unwrap().len(), 2, "{r}");
}

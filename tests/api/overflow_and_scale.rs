//! Overflow is not a singularity, extreme scales are balanced, and a region
//! counts the same in either orientation (issue reports, with their truth).

use serde_json::{json, Value};

use crate::common::ok_response;

fn run(request: Value) -> (Value, bool) {
    let (text, is_error) = residuary::api::run_json_text(&request.to_string());
    (serde_json::from_str(&text).unwrap(), is_error)
}

fn c(v: &Value) -> (f64, f64) {
    (v[0].as_f64().unwrap(), v[1].as_f64().unwrap())
}

#[test]
fn huge_growth_gets_a_circle_sized_to_it() {
    // Res_{z=0} e^{700z}/z = e^0 = 1 and Res_{z=0} e^{50z}/z³ = 50²/2 = 1250 (residue of g/z^m is
    // g^(m−1)(0)/(m−1)!, common practice). Before: 1.5e56 with no warning.
    for (f, want) in [("exp(700*z)/z", 1.0), ("exp(50*z)/z^3", 1250.0)] {
        let r = ok_response(json!({"task": "residue", "f": f, "at": [0, 0]}));
        let (re, im) = c(&r["residue"]);
        let err = (re - want).hypot(im);
        assert!(err <= 1e-8 * want, "{f}: {r}");
        assert!(err <= r["error_estimate"].as_f64().unwrap(), "{f}: estimate {r}");
    }
}

#[test]
fn overflow_on_every_circle_is_named_as_overflow() {
    // |e^{700z}/(z−1)²| > 1.8e308 on every circle about 1 that double precision can sample
    // (e^700 ≈ 1.0e304, over r² with r < 0.01): the residue 700·e^700 cannot be sampled.
    let (r, is_error) = run(json!({"task": "residue", "f": "exp(700*z)/(z-1)^2", "at": [1, 0]}));
    assert!(is_error, "{r}");
    assert_eq!(r["error"]["code"], "not_finite");
    assert!(r["error"]["message"].as_str().unwrap().contains("overflow, not a singularity"), "{r}");
}

#[test]
fn overflow_on_a_contour_is_not_called_a_singularity() {
    // 3^1999 ≈ 1e953 overflows, so 1/(z^1999 − 0.5) cannot be evaluated on |z| = 3 in double
    // precision (the answer would be 0: all poles inside and Res∞ = 0, by the residue theorem).
    for (f, r) in [("1/(z^1999-0.5)", 3.0), ("exp(800*z)", 2.0)] {
        let (v, is_error) = run(json!({"task": "contour_integral", "f": f, "contour": {"shape": "circle", "center": [0, 0], "radius": r}}));
        assert!(is_error, "{f}: {v}");
        assert_eq!(v["error"]["code"], "not_finite", "{f}: {v}");
        assert!(v["error"]["message"].as_str().unwrap().contains("overflows double precision on the contour"), "{f}: {v}");
    }
    // A true pole on the contour is still called one.
    let (v, _) = run(json!({"task": "contour_integral", "f": "1/(z-2)", "contour": {"shape": "circle", "center": [0, 0], "radius": 2}}));
    assert_eq!(v["error"]["code"], "on_contour", "{v}");
}

#[test]
fn coefficients_from_1e_minus_300_are_balanced() {
    // 1/(1e-300 z² + 1) = 1/(1e-300 (z − ia)(z + ia)), a = 1e150: Res at ±ia = ∓i·5e149 (by hand),
    // and Res∞ = 0. Before: NaN poles, "NaN" in the warnings.
    let r = ok_response(json!({"task": "singularities", "f": "1/(1e-300*z^2+1)", "region": {"shape": "circle", "center": [0, 0], "radius": 2e150}}));
    let poles = r["poles"].as_array().unwrap();
    assert_eq!(poles.len(), 2, "{r}");
    for p in poles {
        let (x, y) = c(&p["at"]);
        let (re, im) = c(&p["residue"]);
        assert!(x.abs() < 1e135 && (y.abs() - 1e150).abs() < 1e137, "{p}");
        assert!(re.abs() < 1e136 && (im + y.signum() * 5e149).abs() < 1e137, "{p}");
    }
    assert_eq!(c(&r["residue_at_infinity"]), (0.0, 0.0));
    assert!(!r.to_string().contains("NaN") && !r.to_string().contains("null"), "{r}");
}

#[test]
fn a_1_khz_resonator_in_rad_per_s() {
    // ωn²/(s² + 2ζωn s + ωn²), ωn = 6283, ζ = 0.01: poles −ζωn ± iωn√(1 − ζ²), residues
    // ∓iωn/(2√(1 − ζ²)) (standard second-order system, e.g. Ogata, *Modern Control Engineering*).
    let (w, z) = (6283.0f64, 0.01f64);
    let r = ok_response(json!({"task": "singularities", "f": "w^2/(s^2+2*zeta*w*s+w^2)", "var": "s",
        "params": {"w": w, "zeta": z}, "region": {"shape": "circle", "center": [0, 0], "radius": 1e4}}));
    let wd = w * (1.0 - z * z).sqrt();
    for p in r["poles"].as_array().unwrap() {
        let (x, y) = c(&p["at"]);
        assert!((x + z * w).abs() < 1e-9 * w && (y.abs() - wd).abs() < 1e-9 * w, "{p}");
        let (re, im) = c(&p["residue"]);
        let want = -y.signum() * w * w / (2.0 * wd);
        assert!(re.abs() < 1e-9 * w && (im - want).abs() < 1e-9 * w, "{p}: {want}");
    }
    assert_eq!(r["poles"].as_array().unwrap().len(), 2);
}

#[test]
fn a_clockwise_region_counts_like_a_counter_clockwise_one() {
    // exp(z)(z − 0.5)/(z + 0.5)³ in the square |x|, |y| < 1: one zero, a triple pole, N − P = −2
    // (counted by hand), whichever way the vertices run. Before: a false mismatch warning.
    let square = [[-1, -1], [1, -1], [1, 1], [-1, 1]];
    let reversed = [[-1, -1], [-1, 1], [1, 1], [1, -1]];
    for vertices in [square, reversed] {
        let r = ok_response(json!({"task": "singularities", "f": "exp(z)*(z-0.5)/(z+0.5)^3",
            "region": {"shape": "polygon", "vertices": vertices}}));
        assert_eq!(r["zeros_minus_poles"], -2, "{r}");
        assert!(r["warnings"].as_array().unwrap().is_empty(), "{r}");
    }
}

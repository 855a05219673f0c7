//! The `inverse_laplace` task through the public JSON doorway: Laplace
//! transform table pairs, mpmath fixtures, and a slow Bromwich-integral
//! reference for the fixed Talbot contour.


use crate::common::{ok_response as run, error_message as run_error, floats};
use residuary::budget::Budget;
use residuary::quad::{gauss_kronrod::integrate, Tolerance};
use residuary::C;
use serde_json::{json, Value};




/// Check f, by_residues, by_contour against `want`, each within its own error
/// estimate and within `tol` (relative to max(1, |want|)).
fn check(name: &str, r: &Value, ts: &[f64], want: impl Fn(f64) -> f64, tol: f64) {
    let f = floats(&r["f"]);
    let err = floats(&r["error_estimates"]);
    for (i, &t) in ts.iter().enumerate() {
        let w = want(t);
        let e = (f[i] - w).abs();
        assert!(
            e <= err[i],
            "{name}: t={t}: f={} want {w}: error {e:e} > estimate {:e}",
            f[i],
            err[i]
        );
        assert!(
            e <= tol * w.abs().max(1.0),
            "{name}: t={t}: f={} want {w}: error {e:e}",
            f[i]
        );
        if r["method"] == "residues" {
            let c = r["by_contour"][i].as_f64().unwrap();
            let ce = r["contour_error_estimates"][i].as_f64().unwrap();
            assert!(
                (c - w).abs() <= ce,
                "{name}: contour t={t}: {c} want {w}, estimate {ce:e}"
            );
            assert!((c - f[i]).abs() <= r["max_discrepancy"].as_f64().unwrap());
        }
    }
}

const TS: [f64; 6] = [0.1, 0.5, 1.0, 2.0, 3.7, 8.0];

fn table(f: &str, params: Value, want: impl Fn(f64) -> f64, name: &str) -> Value {
    let r = run(json!({"task": "inverse_laplace", "F": f, "params": params, "t": TS}));
    assert_eq!(r["method"], "residues", "{name}");
    check(name, &r, &TS, want, 1e-12);
    r
}

#[test]
fn table_exponential() {
    // A&S 29.3.8, from memory: 1/(s + a) -> exp(-a t)
    let r = table(
        "1/(s+a)",
        json!({"a": 0.7}),
        |t| (-0.7 * t).exp(),
        "1/(s+a)",
    );
    assert_eq!(r["closed_form"], "exp(-0.7*t)");
    assert_eq!(r["poles"], json!([{"at": [-0.7, 0.0], "order": 1}]));
    assert!(r["max_discrepancy"].as_f64().unwrap() < 1e-9);
}

#[test]
fn table_repeated_pole() {
    // A&S 29.3.9, from memory: 1/(s + a)^2 -> t exp(-a t)
    let r = table(
        "1/(s+2)^2",
        json!({}),
        |t| t * (-2.0 * t).exp(),
        "1/(s+a)^2",
    );
    assert_eq!(r["closed_form"], "t*exp(-2*t)");
    // 1/(s+a)^3 -> t^2/2 exp(-a t) (same table, from memory)
    let r = table(
        "1/(s+1)^3",
        json!({}),
        |t| t * t / 2.0 * (-t).exp(),
        "1/(s+a)^3",
    );
    assert_eq!(r["closed_form"], "0.5*t^2*exp(-t)");
}

#[test]
fn table_sine_and_cosine() {
    // A&S 29.3.16/29.3.17, from memory: w/(s^2+w^2) -> sin wt, s/(s^2+w^2) -> cos wt
    let w = 2.5;
    let r = table("w/(s^2+w^2)", json!({"w": w}), |t| (w * t).sin(), "sine");
    assert_eq!(r["closed_form"], "sin(2.5*t)");
    let r = table("s/(s^2+w^2)", json!({"w": w}), |t| (w * t).cos(), "cosine");
    assert_eq!(r["closed_form"], "cos(2.5*t)");
    assert!(r.get("f_imag").is_none());
}

#[test]
fn second_order_low_pass_impulse_response() {
    // common practice: wn^2/(s^2 + 2 zeta wn s + wn^2) -> wn/sqrt(1-zeta^2) exp(-zeta wn t) sin(wd t)
    let (wn, zeta) = (3.0_f64, 0.2_f64);
    let wd = wn * (1.0 - zeta * zeta).sqrt();
    let r = table(
        "wn^2/(s^2+2*zeta*wn*s+wn^2)",
        json!({"wn": wn, "zeta": zeta}),
        |t| wn / (1.0 - zeta * zeta).sqrt() * (-zeta * wn * t).exp() * (wd * t).sin(),
        "low-pass",
    );
    assert_eq!(
        r["closed_form"],
        "3.06186217848*exp(-0.6*t)*sin(2.93938769134*t)"
    );
}

#[test]
fn damped_pair_with_cosine_and_sine_parts() {
    // common practice: (s + 1)/((s + 1)^2 + 4) -> exp(-t) cos 2t, 1/((s+1)^2+4) -> exp(-t) sin(2t)/2
    let r = table(
        "(s+3)/((s+1)^2+4)",
        json!({}),
        |t| (-t).exp() * ((2.0 * t).cos() + (2.0 * t).sin()),
        "pair",
    );
    assert_eq!(r["closed_form"], "exp(-t)*(cos(2*t) + sin(2*t))");
}

#[test]
fn double_pole_on_the_imaginary_axis() {
    // handbook pair (resonant forcing), from memory: 1/(s^2 + 1)^2 -> (sin t - t cos t)/2
    let r = table(
        "1/(s^2+1)^2",
        json!({}),
        |t| (t.sin() - t * t.cos()) / 2.0,
        "resonance",
    );
    assert_eq!(r["closed_form"], "-0.5*t*cos(t) + 0.5*sin(t)");
}

#[test]
fn polynomial_part_gives_impulses() {
    // (s + 3)/(s + 1) = 1 + 2/(s + 1) -> delta(t) + 2 exp(-t) (common practice)
    let r = table("(s+3)/(s+1)", json!({}), |t| 2.0 * (-t).exp(), "impulse");
    assert_eq!(r["closed_form"], "2*exp(-t) + δ(t)");
    assert!(r["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .any(|w| w.as_str().unwrap().contains("impulses")));
}

#[test]
fn unstable_pole_grows() {
    // A&S 29.3.8 with a = -0.5, from memory: 1/(s - 0.5) -> exp(0.5 t)
    table("1/(s-0.5)", json!({}), |t| (0.5 * t).exp(), "unstable");
}

#[test]
fn fast_oscillation_contour_encloses_high_poles() {
    // sin wt with w = 20: the poles at ±20i must be inside the widened contour.
    let r = table("20/(s^2+400)", json!({}), |t| (20.0 * t).sin(), "w=20");
    assert!(r["by_contour"]
        .as_array()
        .unwrap()
        .iter()
        .all(|v| v.is_number()));
}

#[test]
fn complex_transform_returns_imaginary_part() {
    // A&S 29.3.8 with complex a, from memory: 1/(s + 1 - 2i) -> exp((-1 + 2i) t)
    let r = run(json!({"task": "inverse_laplace", "F": "1/(s+1-2*i)", "t": TS}));
    check("complex", &r, &TS, |t| (-t).exp() * (2.0 * t).cos(), 1e-12);
    let im = floats(&r["f_imag"]);
    for (i, &t) in TS.iter().enumerate() {
        assert!(
            (im[i] - (-t).exp() * (2.0 * t).sin()).abs() < 1e-13,
            "t={t}"
        );
    }
}

#[test]
fn inverse_square_root() {
    // A&S 29.3.4, from memory: 1/sqrt(s) -> 1/sqrt(pi t)
    let r = run(json!({"task": "inverse_laplace", "F": "1/sqrt(s)", "t": TS}));
    assert_eq!(r["method"], "talbot");
    assert!(r["by_residues"].is_null());
    check(
        "1/sqrt(s)",
        &r,
        &TS,
        |t| 1.0 / (std::f64::consts::PI * t).sqrt(),
        1e-9,
    );
}

#[test]
fn delayed_first_order_lag() {
    // shift theorem, common practice: exp(-tau s)/(s + 1) -> exp(-(t - tau)) for t > tau, 0 before
    let tau = 1.5;
    let ts = [0.5, 1.0, 1.4, 1.6, 2.0, 4.0, 9.0];
    let r = run(
        json!({"task": "inverse_laplace", "F": "exp(-tau*s)/(s+1)", "params": {"tau": tau}, "t": ts}),
    );
    assert!((r["delay"].as_f64().unwrap() - tau).abs() < 1e-9);
    check(
        "delay",
        &r,
        &ts,
        |t| if t > tau { (-(t - tau)).exp() } else { 0.0 },
        1e-9,
    );
    assert!(r["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .any(|w| w.as_str().unwrap().contains("delay")));
}

#[test]
fn pulse_with_two_edges_is_flagged() {
    // (1 - exp(-s))/s is the unit pulse on (0, 1) (common practice); not a single
    // delay, so the contour cannot be trusted before the falling edge: it must say so.
    let ts = [0.5, 1.0, 2.0, 3.0];
    let r = run(json!({"task": "inverse_laplace", "F": "(1-exp(-s))/s", "t": ts}));
    let f = floats(&r["f"]);
    let err = floats(&r["error_estimates"]);
    for (i, &t) in ts.iter().enumerate() {
        let want = if t < 1.0 { 1.0 } else { 0.0 };
        if t != 1.0 {
            assert!(
                (f[i] - want).abs() <= err[i],
                "t={t}: {} ± {}",
                f[i],
                err[i]
            );
        }
    }
    assert!(err[0] >= 1.0 && err[1] >= 1.0);
    assert!(err[2] < 1e-8 && err[3] < 1e-8);
    assert!(r["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .any(|w| w.as_str().unwrap().contains("delays")));
}

#[test]
fn mpmath_fixtures() {
    // mpmath 1.3.0, 30 digits (tests/fixtures/gen_inverse_laplace.py); sources per case in the JSON.
    let fx = crate::common::fixture("inverse_laplace");
    let mut checked = 0;
    for case in fx["cases"].as_array().unwrap() {
        let name = case["name"].as_str().unwrap();
        let ts: Vec<f64> = case["t"]
            .as_array()
            .unwrap()
            .iter()
            .map(crate::common::real)
            .collect();
        let want: Vec<f64> = case["f"]
            .as_array()
            .unwrap()
            .iter()
            .map(crate::common::real)
            .collect();
        let r = run(json!({"task": "inverse_laplace", "F": case["F"], "t": ts}));
        let f = floats(&r["f"]);
        let err = floats(&r["error_estimates"]);
        for i in 0..ts.len() {
            let e = (f[i] - want[i]).abs();
            assert!(
                e <= err[i],
                "{name} t={}: {} want {}: error {e:e} > estimate {:e}",
                ts[i],
                f[i],
                want[i],
                err[i]
            );
            assert!(
                e <= 1e-8 * want[i].abs().max(1.0),
                "{name} t={}: error {e:e}",
                ts[i]
            );
            checked += 1;
        }
    }
    assert_eq!(checked, 48);
}

/// Slow reference: f(t) = (e^{ct}/π) ∫_0^∞ Re[F(c + iy) e^{iyt}] dy (real f), by
/// adaptive Gauss–Kronrod on panels of length 10 up to y = 4000.
fn bromwich_line(f: impl Fn(C) -> C, c: f64, t: f64) -> f64 {
    let mut budget = Budget::new(50_000_000);
    let tol = Tolerance {
        abs: 1e-14,
        rel: 1e-13,
    };
    let mut total = 0.0;
    for k in 0..400 {
        let a = 10.0 * k as f64;
        let r = integrate(
            &mut |y: f64| C::new((f(C::new(c, y)) * C::new(0.0, y * t).exp()).re, 0.0),
            a,
            a + 10.0,
            tol,
            &mut budget,
        )
        .unwrap();
        total += r.value.re;
    }
    (c * t).exp() / std::f64::consts::PI * total
}

#[test]
fn talbot_against_bromwich_line_integral() {
    // exp(-sqrt(s)) decays like exp(-sqrt(y/2)) on the line Re s = 0.5, so the
    // truncated line integral is accurate to ~1e-12 (tail exp(-44)).
    let ts = [0.3, 1.0, 2.5];
    let r = run(json!({"task": "inverse_laplace", "F": "exp(-sqrt(s))", "t": ts}));
    let f = floats(&r["f"]);
    let err = floats(&r["error_estimates"]);
    for (i, &t) in ts.iter().enumerate() {
        let reference = bromwich_line(|s| (-s.sqrt()).exp(), 0.5, t);
        assert!(
            (f[i] - reference).abs() <= err[i] + 1e-11,
            "t={t}: {} vs line integral {reference}",
            f[i]
        );
    }
}

#[test]
fn times_are_validated() {
    let m = run_error(json!({"task": "inverse_laplace", "F": "1/(s+1)", "t": [1.0, 0.0]}));
    assert!(m.contains("t[1]") && m.contains("t > 0"), "{m}");
    let m = run_error(json!({"task": "inverse_laplace", "F": "1/(s+1)", "t": [-2.0]}));
    assert!(m.contains("t[0]"), "{m}");
    let m = run_error(json!({"task": "inverse_laplace", "F": "1/(s+1)", "t": []}));
    assert!(m.contains("empty"), "{m}");
    let many: Vec<f64> = (1..=10_001).map(|k| k as f64 * 1e-3).collect();
    let m = run_error(json!({"task": "inverse_laplace", "F": "1/(s+1)", "t": many}));
    assert!(m.contains("10000"), "{m}");
    let m = run_error(json!({"task": "inverse_laplace", "F": "1/(s+1)", "t": [1.0, 1e16]}));
    assert!(m.contains("t[1]") && m.contains("rescale"), "{m}");
    // The expression error names the field "F".
    let m = run_error(json!({"task": "inverse_laplace", "F": "1/(s+", "t": [1.0]}));
    assert!(m.contains("\"F\""), "{m}");
}

#[test]
fn variable_defaults_to_s_and_can_be_renamed() {
    let r = run(json!({"task": "inverse_laplace", "F": "1/(p+1)", "var": "p", "t": [1.0]}));
    assert!((floats(&r["f"])[0] - (-1.0f64).exp()).abs() < 1e-14);
    // With the default variable s, "z" is an unknown name.
    run_error(json!({"task": "inverse_laplace", "F": "1/(z+1)", "t": [1.0]}));
}

#[test]
fn budget_is_respected() {
    let ts: Vec<f64> = (1..=2000).map(|k| k as f64 * 1e-2).collect();
    let m = run_error(
        json!({"task": "inverse_laplace", "F": "1/sqrt(s)", "t": ts, "max_evaluations": 1000}),
    );
    assert!(m.contains("budget"), "{m}");
}

//! `transfer_function` through the doorway. Sources beside every check; the
//! numpy/scipy/mpmath digits come from tests/fixtures/gen_transfer_function.py.

use crate::common::{error_message, fixture, floats, ok_response};
use serde_json::{json, Value};
use std::f64::consts::PI;

fn close(got: f64, want: f64, rel: f64, what: &str) {
    assert!((got - want).abs() <= rel * want.abs().max(1e-300), "{what}: got {got}, want {want}");
}

fn f(v: &Value) -> f64 {
    v.as_f64().unwrap_or_else(|| panic!("expected a number, got {v}"))
}

#[test]
fn second_order_low_pass_closed_forms() {
    let r = ok_response(json!({"task": "transfer_function", "f": "wn^2/(s^2+2*zeta*wn*s+wn^2)",
        "params": {"wn": 2, "zeta": 0.3}}));
    let (wn, zeta) = (2.0f64, 0.3f64);
    let root = (1.0 - zeta * zeta).sqrt();
    // Poles −ζωn ± jωn√(1−ζ²) (quadratic formula); ωn, ζ, Q = 1/(2ζ) read back (definitions, Ogata, from memory).
    assert_eq!(r["poles"].as_array().unwrap().len(), 2);
    for p in r["poles"].as_array().unwrap() {
        close(f(&p["at"][0]), -zeta * wn, 1e-12, "Re pole");
        close(f(&p["at"][1]).abs(), wn * root, 1e-12, "|Im pole|");
        close(f(&p["natural_frequency"]), wn, 1e-12, "ωn");
        close(f(&p["damping_ratio"]), zeta, 1e-12, "ζ");
        close(f(&p["quality_factor"]), 1.0 / (2.0 * zeta), 1e-12, "Q");
        assert!(p["time_constant"].is_null());
    }
    // F(0) = 1, F → 0 with relative degree 2 (by inspection).
    assert_eq!(r["dc_gain"]["value"], json!([1.0, 0.0]));
    assert_eq!(r["high_frequency_gain"]["value"], json!([0.0, 0.0]));
    assert_eq!(r["relative_degree"], 2);
    // Overshoot e^{−πζ/√(1−ζ²)}, peak time π/(ωn√(1−ζ²)) (second-order step response, Ogata, from memory).
    let s = &r["step"];
    close(f(&s["overshoot_percent"]), 100.0 * (-PI * zeta / root).exp(), 1e-9, "overshoot");
    close(f(&s["peak_time"]), PI / (wn * root), 1e-9, "peak time");
    close(f(&s["steady_state"]), 1.0, 1e-12, "steady state");
    // Settling: the last 2 % crossing of the exact step response, mpmath 1.3 findroot (fixture);
    // the rough rule 4/(ζωn) = 6.67 is only approximate.
    let fx = fixture("transfer_function");
    close(f(&s["settling_time"]), f(&fx["second_order"]["settling_time"]), 1e-9, "settling time");
    // Rise time 10–90 %: bisection on the exact closed form y = 1 − e^{−ζωn t} sin(ωd t + acos ζ)/√(1−ζ²) (by hand).
    let y = |t: f64| 1.0 - (-zeta * wn * t).exp() * (wn * root * t + zeta.acos()).sin() / root;
    let first = |level: f64| {
        let (mut a, mut b) = (0.0, 1.6);
        for _ in 0..100 {
            let m = 0.5 * (a + b);
            if y(m) < level { a = m } else { b = m }
        }
        a
    };
    close(f(&s["rise_time"]), first(0.9) - first(0.1), 1e-9, "rise time");
    // The step samples against scipy 1.17.1 signal.step (fixture; scipy's lsim is accurate to ~1e-9 here).
    let r2 = ok_response(json!({"task": "transfer_function", "f": "4/(s^2+1.2*s+4)", "t": fx["second_order"]["t"]}));
    for (got, want) in floats(&r2["step"]["y"]).iter().zip(floats(&fx["second_order"]["scipy_step"])) {
        close(*got, want, 1e-7, "step sample vs scipy");
    }
    // Impulse = dy/dt of the step: 4/(ωd) e^{−0.6t} sin(ωd t) for this F (transform table, from memory).
    let wd = 2.0 * root;
    for (t, h) in floats(&r2["impulse"]["t"]).iter().zip(floats(&r2["impulse"]["y"])) {
        close(h, 4.0 / wd * (-0.6 * t).exp() * (wd * t).sin(), 1e-10, "impulse sample");
    }
}

#[test]
fn a_1_khz_resonator_in_hz() {
    let wn = 2.0 * PI * 1000.0;
    let zeta = 0.01f64;
    let r = ok_response(json!({"task": "transfer_function", "f": "w^2/(s^2+2*z*w*s+w^2)",
        "params": {"w": wn, "z": zeta}, "hz": true}));
    assert_eq!(r["frequency_response"]["unit"], "Hz");
    assert_eq!(r["margins"]["unit"], "Hz");
    // ωn/2π = 1000 Hz; Q = 1/(2ζ) = 50 (definitions, from memory).
    close(f(&r["poles"][0]["natural_frequency"]), 1000.0, 1e-12, "natural frequency in Hz");
    close(f(&r["poles"][0]["quality_factor"]), 50.0, 1e-10, "Q");
    // |F(jω)| = 1 where (1 − x)² + 4ζ²x = 1, x = (ω/ωn)²: x = 2 − 4ζ² (by hand); in Hz.
    let crossings = floats(&r["margins"]["gain_crossovers"]);
    assert_eq!(crossings.len(), 1, "{crossings:?}");
    close(crossings[0], 1000.0 * (2.0 - 4.0 * zeta * zeta).sqrt(), 1e-10, "gain crossover in Hz");
    // The grid's largest magnitude sits near the resonance, |F| peak 1/(2ζ√(1−ζ²)) ≈ 34 dB (Ogata, from memory).
    let mag = floats(&r["frequency_response"]["magnitude_db"]);
    let peak = mag.iter().cloned().fold(f64::MIN, f64::max);
    let want = 20.0 * (1.0 / (2.0 * zeta * (1.0 - zeta * zeta).sqrt())).log10();
    assert!(peak <= want + 1e-9 && peak > want - 0.5, "peak {peak} dB, resonance {want} dB");
    // Frequencies given in Hz are read in Hz: |F| at 1000 Hz is 1/(2ζ) (by hand).
    let r = ok_response(json!({"task": "transfer_function", "f": "w^2/(s^2+2*z*w*s+w^2)",
        "params": {"w": wn, "z": zeta}, "hz": true, "omega": [1000]}));
    close(f(&r["frequency_response"]["magnitude_db"][0]), 20.0 * 50f64.log10(), 1e-9, "|F| at 1 kHz");
    close(f(&r["frequency_response"]["phase_deg"][0]), -90.0, 1e-9, "phase at resonance");
    // Step overshoot and peak time of the 1 kHz resonator (second-order closed forms, from memory).
    let root = (1.0 - zeta * zeta).sqrt();
    close(f(&r["step"]["overshoot_percent"]), 100.0 * (-PI * zeta / root).exp(), 1e-8, "overshoot");
    close(f(&r["step"]["peak_time"]), PI / (wn * root), 1e-8, "peak time (seconds)");
}

#[test]
fn integrator_plant_margins() {
    // K/(s(s+1)(s+2)): phase −180° at ω = √2 where |L| = K/6, so the closed loop is marginal at K = 6
    // (Routh: s³ + 3s² + 2s + K, 3·2 = K; from memory).
    let r = ok_response(json!({"task": "transfer_function", "f": "6/(s*(s+1)*(s+2))"}));
    assert!(r["encirclement"]["winding"].is_null(), "K = 6 passes through −1: {}", r["encirclement"]);
    let r = ok_response(json!({"task": "transfer_function", "f": "2/(s*(s+1)*(s+2))"}));
    let m = &r["margins"];
    close(f(&m["phase_crossovers"][0]), 2f64.sqrt(), 1e-12, "phase crossover √2");
    close(f(&m["gain_margins"][0]), 20.0 * 3f64.log10(), 1e-10, "gain margin 20 log10(6/2) dB");
    // Gain crossover and phase margin: numpy.roots of x(x+1)(x+4) = 4 (fixture).
    let fx = &fixture("transfer_function")["integrator_k2"];
    close(f(&m["gain_crossovers"][0]), f(&fx["gain_crossover"]), 1e-12, "gain crossover");
    close(f(&m["phase_margins"][0]), f(&fx["phase_margin"]), 1e-10, "phase margin");
    // One integrator: DC gain infinite; relative degree 3 (by inspection).
    assert_eq!(r["dc_gain"]["infinite"], true);
    assert_eq!(r["dc_gain"]["pole_order"], 1);
    assert_eq!(r["relative_degree"], 3);
    // Closed loop s³ + 3s² + 2s + 2 is stable (Routh, 3·2 > 2): N = 0, P = 0 (the s = 0 pole is indented around).
    let e = &r["encirclement"];
    assert_eq!((e["winding"].as_i64(), e["open_loop_rhp_poles"].as_i64(), e["closed_loop_rhp_poles"].as_i64()), (Some(0), Some(0), Some(0)));
    assert_eq!(e["sampled_winding"], 0);
    // K = 10 > 6: two closed-loop right-half-plane poles (Routh sign changes), N = 2.
    let r = ok_response(json!({"task": "transfer_function", "f": "10/(s*(s+1)*(s+2))"}));
    assert_eq!(r["encirclement"]["winding"], 2);
    assert_eq!(r["encirclement"]["sampled_winding"], 2);
    assert_eq!(r["encirclement"]["closed_loop_rhp_poles"], 2);
    assert!(r["encirclement"]["caution"].as_str().unwrap().contains("verify them independently"));
}

#[test]
fn unstable_open_loop_stable_closed_loop() {
    // L = 2(s+1)/(s(s−1)): P = 1; 1 + L ∝ s² + s + 2, no right-half-plane root (numpy.roots, fixture) so Z = 0, N = −1.
    let fx = &fixture("transfer_function")["unstable_open_loop"];
    let r = ok_response(json!({"task": "transfer_function", "f": "2*(s+1)/(s*(s-1))"}));
    let e = &r["encirclement"];
    assert_eq!(e["open_loop_rhp_poles"], 1);
    assert_eq!(e["closed_loop_rhp_poles"], fx["closed_loop_rhp"]);
    assert_eq!(e["winding"], -1);
    assert_eq!(e["sampled_winding"], -1);
    assert_eq!(e["direction"], "clockwise");
    // About the point a = 10: L − 10 ∝ 10s² − 12s − 2, roots (12 ± √224)/20, one positive (quadratic
    // formula, by hand): Z = 1, P = 1, N = 0.
    let r = ok_response(json!({"task": "transfer_function", "f": "2*(s+1)/(s*(s-1))", "point": 10}));
    assert_eq!(r["encirclement"]["closed_loop_rhp_poles"], 1);
    assert_eq!(r["encirclement"]["winding"], 0);
    assert_eq!(r["encirclement"]["sampled_winding"], 0);
}

#[test]
fn second_order_iir_in_z() {
    let fx = &fixture("transfer_function")["iir2"];
    let a = floats(&fx["a"]);
    let req = json!({"task": "transfer_function", "var": "z", "f": format!("(0.2*z^2+0.3*z+0.1)/(z^2+({})*z+({}))", a[1], a[2]),
        "omega": fx["omega"]});
    let r = ok_response(req);
    assert_eq!(r["domain"], "z");
    // Poles 0.9 e^{±jπ/4}: |p| = 0.9, ln(p)/T = ln 0.9 ± jπ/4 (the mapping z = e^{sT}, from memory).
    for p in r["poles"].as_array().unwrap() {
        close(f(&p["magnitude"]), 0.9, 1e-12, "|p|");
        close(f(&p["s_equivalent"][0]), 0.9f64.ln(), 1e-12, "Re ln p");
        close(f(&p["s_equivalent"][1]).abs(), PI / 4.0, 1e-12, "|Im ln p|");
        close(f(&p["natural_frequency"]), (0.9f64.ln().powi(2) + PI * PI / 16.0).sqrt(), 1e-12, "ωn");
    }
    // Magnitude and (wrapped) phase against scipy 1.17.1 signal.freqz (fixture).
    for (got, want) in floats(&r["frequency_response"]["magnitude_db"]).iter().zip(floats(&fx["magnitude_db"])) {
        close(*got, want, 1e-10, "magnitude dB vs freqz");
    }
    for (got, want) in floats(&r["frequency_response"]["phase_deg"]).iter().zip(floats(&fx["phase_wrapped_deg"])) {
        let d = (got - want).rem_euclid(360.0);
        assert!(d.min(360.0 - d) < 1e-9, "phase vs freqz: {got} vs {want}");
    }
    // Impulse and step sequences against scipy signal.lfilter (fixture).
    let r = ok_response(json!({"task": "transfer_function", "var": "z", "f": format!("(0.2*z^2+0.3*z+0.1)/(z^2+({})*z+({}))", a[1], a[2]),
        "t": (0..40).map(|n| n as f64).collect::<Vec<_>>()}));
    for (got, want) in floats(&r["impulse"]["y"]).iter().zip(floats(&fx["impulse"])) {
        close(*got, want, 1e-12, "impulse vs lfilter");
    }
    for (got, want) in floats(&r["step"]["y"]).iter().zip(floats(&fx["step"])) {
        close(*got, want, 1e-12, "step vs lfilter");
    }
    // DC gain H(1) = 0.6/(1 − 2·0.9 cos(π/4) + 0.81) (by hand); stable, so the step settles there.
    let dc = 0.6 / (1.0 + a[1] + a[2]);
    close(f(&r["dc_gain"]["value"][0]), dc, 1e-12, "H(1)");
    close(f(&r["step"]["steady_state"]), dc, 1e-12, "steady state");
    // Poles inside the unit circle; 1 + H ∝ 1.2z² − 0.9728z + 0.91, a complex pair (discriminant < 0) of modulus
    // √(0.91/1.2) < 1 (quadratic formula, by hand): Z = P = 0, N = 0.
    assert_eq!(r["encirclement"]["winding"], 0);
    assert_eq!(r["encirclement"]["sampled_winding"], 0);
    // Step metrics read on the samples, against the same readings of 200 scipy lfilter samples (fixture).
    let sm = &fx["step_metrics"];
    for key in ["rise_time", "peak_time", "settling_time"] {
        assert_eq!(f(&r["step"][key]), f(&sm[key]), "{key}");
    }
    close(f(&r["step"]["overshoot_percent"]), f(&sm["overshoot_percent"]), 1e-10, "overshoot");
}

#[test]
fn refusals() {
    // Not rational: not_applicable with the reason.
    let (text, is_error) = residuary::api::run_json_text(&json!({"task": "transfer_function", "f": "exp(-s)/(s+1)"}).to_string());
    assert!(is_error);
    assert!(text.contains("not_applicable"), "{text}");
    assert!(error_message(json!({"task": "transfer_function", "f": "1/(s+1)", "domain": "w"})).contains("\"domain\""));
    // Beyond the Nyquist frequency π/T.
    assert!(error_message(json!({"task": "transfer_function", "f": "1/(z-0.5)", "var": "z", "omega": [4]})).contains("Nyquist"));
    // A discrete time beyond a million samples is refused, not run.
    assert!(error_message(json!({"task": "transfer_function", "f": "1/(z-0.5)", "var": "z", "t": [1e300]})).contains("beyond sample"));
    // A field that is not declared.
    assert!(error_message(json!({"task": "transfer_function", "f": "1/(s+1)", "omegas": [1]})).contains("omegas"));
}

// ---- the five reference systems (tests/fixtures/gen_transfer_function.py, key "systems") -----

/// Tolerances for one system against its fixture, each justified where the test uses it.
struct Tol {
    /// relative to the largest |y|, on step/impulse samples (scipy 1.17 step/impulse: a matrix
    /// exponential; measured agreement ~1e-13, so 1e-10 leaves room for other platforms)
    samples: f64,
    /// relative, on step metrics read on the 400 001-sample scipy simulation (linear interpolation
    /// of crossings: error ~ (ωn h)²/8 ≈ 1e-8 at the fixture's step h; the peak's parabola O(h³);
    /// measured 2e-8 at worst, the resonator)
    metrics: f64,
}

fn cx(v: &Value) -> (f64, f64) {
    (f(&v[0]), f(&v[1]))
}

/// The nearest fixture root to `at` (numpy.roots lists them in its own order).
fn nearest<'a>(rows: &'a [Value], at: (f64, f64)) -> &'a Value {
    rows.iter()
        .min_by(|a, b| {
            let d = |r: &Value| { let (x, y) = cx(&r["at"]); (x - at.0).hypot(y - at.1) };
            d(a).partial_cmp(&d(b)).unwrap()
        })
        .expect("fixture roots")
}

/// Poles or zeros of the response against numpy.roots (multiplicities expanded by `order`),
/// with ωn = |p|, ζ = −Re p/|p| (z: of s = ln(p)/T) and τ = −1/p for a real pole (definitions).
fn check_roots(got: &Value, want: &Value, what: &str) {
    let want = want.as_array().unwrap();
    let count: i64 = got.as_array().unwrap().iter().map(|r| r["order"].as_i64().unwrap()).sum();
    assert_eq!(count as usize, want.len(), "{what}: number of roots with multiplicity");
    for r in got.as_array().unwrap() {
        let at = cx(&r["at"]);
        let w = nearest(want, at);
        let (wx, wy) = cx(&w["at"]);
        let scale = wx.hypot(wy).max(1e-300);
        // numpy.roots (companion-matrix eigenvalues) is good to ~1e-13 relative for these simple
        // roots; a double zero at −1 (the IIR) splits by ~1e-8 in numpy, hence √ε.
        let tol = if r["order"].as_i64() == Some(1) { 1e-10 } else { 1e-7 };
        assert!((at.0 - wx).hypot(at.1 - wy) <= tol * scale, "{what} at {at:?} vs numpy.roots {wx}, {wy}");
        for key in ["natural_frequency", "damping_ratio", "time_constant"] {
            match (r[key].as_f64(), w[key].as_f64()) {
                (Some(g), Some(x)) => assert!((g - x).abs() <= tol * x.abs().max(1e-3), "{what} {key}: {g} vs {x}"),
                (None, None) => {}
                (g, x) => panic!("{what} {key}: {g:?} vs {x:?}"),
            }
        }
    }
}

fn request_for(sys: &Value) -> Value {
    let mut req = json!({"task": "transfer_function", "f": sys["f"], "var": sys["var"], "params": sys["params"],
        "hz": sys["hz"], "omega": sys["omega"]});
    if sys["var"] == "s" { req["t"] = sys["t"].clone() } else { req["sample_period"] = sys["sample_period"].clone() }
    req
}

fn check_system(key: &str, tol: Tol) {
    let fx = fixture("transfer_function");
    let sys = &fx["systems"][key];
    let r = ok_response(request_for(sys));
    check_roots(&r["poles"], &sys["poles"], &format!("{key} pole"));
    check_roots(&r["zeros"], &sys["zeros"], &format!("{key} zero"));
    // Frequency response at the fixture's frequencies, numpy.polyval ratio (fixture): both
    // evaluate the same polynomials in double precision, 1e-9 dB / 1e-9° leaves room for the
    // core's factored evaluation against numpy's Horner.
    let fr = &r["frequency_response"];
    assert_eq!(fr["unit"], sys["margins"]["unit"], "{key} unit");
    for (got, want) in floats(&fr["magnitude_db"]).iter().zip(floats(&sys["magnitude_db"])) {
        assert!((got - want).abs() < 1e-9, "{key} |F| {got} dB vs numpy {want} dB");
    }
    for (got, want) in floats(&fr["phase_deg"]).iter().zip(floats(&sys["phase_wrapped_deg"])) {
        let d = (got - want).rem_euclid(360.0);
        assert!(d.min(360.0 - d) < 1e-9, "{key} phase {got}° vs numpy {want}° (mod 360)");
    }
    // Margins: crossovers by scipy brentq on |L| − 1 and Im L (fixture, xtol 1e-15 relative);
    // the core refines its own grid crossings: 1e-9 relative on frequencies, 1e-7 on margins
    // (degrees, dB), which inherit the crossover's error times the slope.
    let m = &r["margins"];
    for (k, t) in [("gain_crossovers", 1e-9), ("phase_margins", 1e-7), ("phase_crossovers", 1e-9), ("gain_margins", 1e-7)] {
        let (got, want) = (floats(&m[k]), floats(&sys["margins"][k]));
        assert_eq!(got.len(), want.len(), "{key} {k}: {got:?} vs scipy brentq {want:?}");
        for (g, w) in got.iter().zip(&want) {
            assert!((g - w).abs() <= t * w.abs().max(1.0), "{key} {k}: {g} vs scipy brentq {w}");
        }
    }
    // Encirclement: Z from numpy.roots(den + num), P from numpy.roots(den), N = Z − P (fixture).
    let e = &r["encirclement"];
    assert_eq!(e["open_loop_rhp_poles"], sys["open_loop_rhp_poles"], "{key} P");
    assert_eq!(e["closed_loop_rhp_poles"], sys["closed_loop_rhp_poles"], "{key} Z");
    assert_eq!(e["winding"], sys["winding"], "{key} N");
    assert_eq!(e["sampled_winding"], sys["winding"], "{key} sampled N");
    // Coefficients: F = N/D with D monic, descending (numpy, fixture: the ladder's node equations,
    // the PID's products, scipy.signal.butter); k = N's leading coefficient. 1e-12 relative to the
    // largest coefficient (the core rebuilds them from its own cancellation of the typed form).
    for (side, k) in [("numerator", "numerator"), ("denominator", "denominator")] {
        let got = r["coefficients"][side].as_array().unwrap_or_else(|| panic!("{key}: coefficients.{side}"));
        let want = floats(&sys[k]);
        assert_eq!(got.len(), want.len(), "{key} {side} degree");
        let big = want.iter().fold(0.0f64, |a, b| a.max(b.abs()));
        for (g, w) in got.iter().zip(&want) {
            let (re, im) = cx(g);
            assert!((re - w).abs() <= 1e-12 * big && im.abs() <= 1e-12 * big, "{key} {side}: {re}+{im}i vs numpy {w}");
        }
    }
    let n0 = floats(&sys["numerator"])[0];
    assert!((f(&r["gain"][0]) - n0).abs() <= 1e-12 * n0.abs() && f(&r["gain"][1]) == 0.0, "{key} gain {} vs {n0}", r["gain"]);
    // The image of the contour: on the axis pieces, F at each listed frequency against an independent
    // evaluation of the fixture's polynomials (Horner, complex), 1e-9 relative; and the winding of the
    // whole image about `about` (sum of the angle steps, closed) is the fixture's N = Z − P.
    let (num, den) = (floats(&sys["numerator"]), floats(&sys["denominator"]));
    let horner = |c: &[f64], x: (f64, f64)| c.iter().fold((0.0, 0.0), |a: (f64, f64), k| (a.0 * x.0 - a.1 * x.1 + k, a.0 * x.1 + a.1 * x.0));
    let scale = if sys["hz"] == true { 2.0 * PI } else { 1.0 };
    let img = &r["image"];
    assert_eq!(cx(&img["about"]), (-1.0, 0.0), "{key} image about −1");
    let (mut turn, mut prev, mut first, mut checked) = (0.0f64, None::<(f64, f64)>, None, 0usize);
    for seg in img["segments"].as_array().unwrap() {
        let vals = seg["value"].as_array().unwrap();
        if seg["kind"] == "axis" {
            for (w, v) in floats(&seg["omega"]).iter().zip(vals).step_by(11) {
                let om = w * scale;
                let x = if sys["var"] == "z" { let t = om * f(&sys["sample_period"]); (t.cos(), t.sin()) } else { (0.0, om) };
                let (a, b) = (horner(&num, x), horner(&den, x));
                let d = b.0 * b.0 + b.1 * b.1;
                let want = ((a.0 * b.0 + a.1 * b.1) / d, (a.1 * b.0 - a.0 * b.1) / d);
                let got = cx(v);
                assert!((got.0 - want.0).hypot(got.1 - want.1) <= 1e-9 * want.0.hypot(want.1).max(1e-300), "{key} image at ω {w}: {got:?} vs {want:?}");
                checked += 1;
            }
        }
        for v in vals {
            let p = cx(v);
            let q = (p.0 + 1.0, p.1);
            if let Some(o) = prev { let o: (f64, f64) = o; turn += (o.0 * q.1 - o.1 * q.0).atan2(o.0 * q.0 + o.1 * q.1); } else { first = Some(q); }
            prev = Some(q);
        }
    }
    assert!(checked >= 10, "{key}: {checked} image points checked");
    if let (Some(o), Some(q)) = (prev, first) { turn += (o.0 * q.1 - o.1 * q.0).atan2(o.0 * q.0 + o.1 * q.1); }
    let n_img = -turn / (2.0 * PI);
    assert!((n_img - f(&sys["winding"])).abs() < 1e-6, "{key}: the image turns {n_img} times clockwise about −1, N = {}", sys["winding"]);
    // Step and impulse samples: scipy.signal.step/impulse (s) or dstep/dimpulse (z) (fixture).
    let (ys, yi) = (floats(&r["step"]["y"]), floats(&r["impulse"]["y"]));
    let (ws, wi) = (floats(&sys["step"]), floats(&sys["impulse"]));
    let n = ys.len().min(ws.len());
    assert!(n >= 4, "{key}: {n} step samples compared");
    let peak = ws.iter().chain(&wi).fold(0.0f64, |a, b| a.max(b.abs()));
    for (got, want) in ys.iter().zip(&ws).chain(yi.iter().zip(&wi)) {
        assert!((got - want).abs() <= tol.samples * peak, "{key} sample {got} vs scipy {want}");
    }
    // Step metrics: a fine scipy simulation (s) or the dstep samples (z) (fixture); null when a pole
    // is not stable (an integrator or a right-half-plane pole: no steady state).
    let sm = &sys["step_metrics"];
    if sm.is_null() {
        assert!(r["step"]["steady_state"].is_null(), "{key}: no steady state");
        return;
    }
    for k in ["steady_state", "rise_time", "peak_time", "settling_time"] {
        close(f(&r["step"][k]), f(&sm[k]), tol.metrics, &format!("{key} {k} vs scipy"));
    }
    let os = f(&r["step"]["overshoot_percent"]);
    assert!((os - f(&sm["overshoot_percent"])).abs() <= 100.0 * tol.metrics, "{key} overshoot {os} % vs scipy {}", sm["overshoot_percent"]);
}

#[test]
fn fourth_order_lc_ladder_low_pass_against_scipy() {
    // Rs = RL = 8 Ω, L1 = 0.975 mH, C2 = 36.8 µF, L3 = 2.35 mH, C4 = 15.2 µF (near a 1 kHz
    // Butterworth ladder): poles by numpy.roots of the node-equation polynomial, DC gain
    // RL/(Rs + RL) = 1/2 (voltage divider, by hand), relative degree 4 (by inspection).
    check_system("lowpass4_rlc", Tol { samples: 1e-10, metrics: 1e-7 });
    let fx = fixture("transfer_function");
    let r = ok_response(request_for(&fx["systems"]["lowpass4_rlc"]));
    close(f(&r["dc_gain"]["value"][0]), 0.5, 1e-12, "dc gain RL/(Rs+RL)");
    assert_eq!(r["relative_degree"], 4);
    // A 4th-order Butterworth response has phase −180° at its corner ωc, where |H| = ½·1/√2
    // (|H|² = ¼/(1 + (ω/ωc)⁸), from memory): gain margin 20 log10(2√2) dB; the component values
    // are rounded to 3 digits, so only to 1e-3 relative.
    close(f(&r["margins"]["gain_margins"][0]), 20.0 * (2.0 * 2f64.sqrt()).log10(), 1e-3, "gain margin ≈ 20 log10(2√2)");
}

#[test]
fn pid_controlled_plant_with_integrator_against_scipy() {
    // (Kp + Ki/s + Kd s/(τs + 1)) · K/((s + 1)(s + 10)), Kp = 2, Ki = 1, Kd = 0.5, τ = 0.05 s, K = 10:
    // the integrator pole at s = 0 (no steady state of the open loop's step: it ramps).
    check_system("pid_plant", Tol { samples: 1e-10, metrics: 1e-7 });
    let fx = fixture("transfer_function");
    let r = ok_response(request_for(&fx["systems"]["pid_plant"]));
    assert_eq!(r["dc_gain"]["infinite"], true);
    assert_eq!(r["dc_gain"]["pole_order"], 1);
    // High frequency: F → (Kp + Kd/τ)·K/s² → 0, relative degree 2 (by inspection).
    assert_eq!(r["relative_degree"], 2);
    // A pole at 0 exactly (the PID's integrator), the others at −1, −10, −1/τ = −20 (by inspection).
    let mut re: Vec<f64> = r["poles"].as_array().unwrap().iter().map(|p| f(&p["at"][0])).collect();
    re.sort_by(|a, b| a.partial_cmp(b).unwrap());
    for (g, w) in re.iter().zip([-20.0, -10.0, -1.0, 0.0]) {
        assert!((g - w).abs() <= 1e-10 * w.abs().max(1.0), "pole {g} vs {w}");
    }
}

#[test]
fn resonator_unstable_loop_and_iir_against_scipy() {
    // The other three reference systems through the same checks (fixture "systems").
    check_system("resonator_1khz", Tol { samples: 1e-10, metrics: 1e-7 });
    check_system("unstable_loop", Tol { samples: 1e-10, metrics: 1e-7 });
    // z: dstep/dimpulse are the exact recursion (lfilter), so the samples agree to rounding; the
    // metrics are whole samples times T.
    check_system("iir2_butter", Tol { samples: 1e-12, metrics: 1e-12 });
}

#[test]
fn coefficients_and_gain_match_numpy_poly_of_the_roots() {
    // numpy 2.4 poly of the typed zeros (× k) and poles, descending, monic denominator; the second case
    // cancels the common factor (s + 1) (tests/fixtures/gen_transfer_function.py).
    let fx = fixture("transfer_function");
    for case in fx["coefficients"].as_array().unwrap() {
        let r = ok_response(json!({"task": "transfer_function", "f": case["f"]}));
        let what = case["f"].as_str().unwrap();
        close(f(&r["gain"][0]), f(&case["gain"]), 1e-12, "gain");
        assert_eq!(f(&r["gain"][1]), 0.0, "{what}: real gain");
        for side in ["numerator", "denominator"] {
            let (got, want) = (r["coefficients"][side].as_array().unwrap(), case[side].as_array().unwrap());
            assert_eq!(got.len(), want.len(), "{what}: {side} degree");
            let size = want.iter().map(|c| cx(c).0.abs()).fold(1.0, f64::max);
            for (g, w) in got.iter().zip(want) {
                let ((gr, gi), (wr, wi)) = (cx(g), cx(w));
                assert!((gr - wr).abs() <= 1e-12 * size && (gi - wi).abs() <= 1e-12 * size, "{what}: {side} {g} vs {w}");
            }
        }
        assert_eq!(cx(&r["coefficients"]["denominator"][0]), (1.0, 0.0), "{what}: monic");
    }
}

/// Horner in descending powers: numpy.polyval's definition.
fn polyval(p: &[(f64, f64)], x: (f64, f64)) -> (f64, f64) {
    p.iter().fold((0.0, 0.0), |(ar, ai), &(cr, ci)| (ar * x.0 - ai * x.1 + cr, ar * x.1 + ai * x.0 + ci))
}

fn cdiv(a: (f64, f64), b: (f64, f64)) -> (f64, f64) {
    let d = b.0 * b.0 + b.1 * b.1;
    ((a.0 * b.0 + a.1 * b.1) / d, (a.1 * b.0 - a.0 * b.1) / d)
}

/// Counterclockwise turns of a closed polyline about a point: the sum of principal angle steps
/// (the winding number of a closed curve, by definition).
fn polyline_turns(points: &[(f64, f64)], about: (f64, f64)) -> f64 {
    let mut total = 0.0;
    for i in 0..points.len() {
        let (a, b) = (points[i], points[(i + 1) % points.len()]);
        let q = cdiv((b.0 - about.0, b.1 - about.1), (a.0 - about.0, a.1 - about.1));
        total += q.1.atan2(q.0);
    }
    total / (2.0 * PI)
}

#[test]
fn the_image_lies_on_f_and_winds_as_counted() {
    // Each case: F, its numpy.poly coefficients (fixture) or coefficients by hand, and N (the argument
    // principle by hand / Routh, from memory): K/((s+1)(s+2)(s+3)) at K = 100: N = 2 (K > 60 unstable);
    // the fixture's first case (an unstable pole at 2); 2(s+1)/(s(s−1)) (indent at 0): N = −1.
    let fx = fixture("transfer_function");
    let c0 = &fx["coefficients"][0];
    let list = |v: &Value| v.as_array().unwrap().iter().map(cx).collect::<Vec<_>>();
    let cases: Vec<(Value, Vec<(f64, f64)>, Vec<(f64, f64)>)> = vec![
        (json!({"f": "100/((s+1)*(s+2)*(s+3))"}), vec![(100.0, 0.0)], vec![(1.0, 0.0), (6.0, 0.0), (11.0, 0.0), (6.0, 0.0)]),
        (json!({"f": c0["f"]}), list(&c0["numerator"]), list(&c0["denominator"])),
        (json!({"f": "2*(s+1)/(s*(s-1))", "hz": true}), vec![(2.0, 0.0), (2.0, 0.0)], vec![(1.0, 0.0), (-1.0, 0.0), (0.0, 0.0)]),
    ];
    for (req, num, den) in cases {
        let mut req = req;
        req["task"] = json!("transfer_function");
        let hz = req.get("hz").is_some();
        let r = ok_response(req.clone());
        let image = &r["image"];
        assert_eq!(image["about"], json!([-1.0, 0.0]));
        let mut points = Vec::new();
        let mut kinds = Vec::new();
        for seg in image["segments"].as_array().unwrap() {
            kinds.push(seg["kind"].as_str().unwrap().to_string());
            let values = list(&seg["value"]);
            if seg["kind"] == "axis" {
                let omega = floats(&seg["omega"]);
                assert_eq!(omega.len(), values.len());
                assert!(omega.windows(2).all(|w| w[1] > w[0]), "{req}: ω increases");
                for (w, v) in omega.iter().zip(&values) {
                    let w = if hz { 2.0 * PI * w } else { *w };
                    let want = cdiv(polyval(&num, (0.0, w)), polyval(&den, (0.0, w)));
                    let scale = (want.0.hypot(want.1)).max(1e-300);
                    assert!((v.0 - want.0).hypot(v.1 - want.1) <= 1e-9 * scale, "{req}: F(j{w}) = {want:?}, got {v:?}");
                }
            } else {
                assert!(seg["omega"].is_null());
            }
            points.extend(values);
        }
        assert!(points.len() <= 6000 + 10, "{req}: {} points", points.len());
        assert_eq!(kinds.last().unwrap(), "closing", "{req}");
        let n = r["encirclement"]["winding"].as_i64().unwrap();
        let ccw = polyline_turns(&points, (-1.0, 0.0));
        assert!((ccw + n as f64).abs() < 1e-6, "{req}: polyline turns {ccw}, N = {n}");
        // Consecutive points turn by a few degrees about 0 and change modulus by ≤ 20 % where finite.
        for w in points.windows(2) {
            let q = cdiv(w[1], w[0]);
            assert!(q.1.atan2(q.0).abs().to_degrees() <= 3.0 + 1e-9 || q.0.hypot(q.1) > 1e6 || q.0.hypot(q.1) < 1e-6,
                "{req}: step {w:?}");
        }
    }
    // Cases' N: 2, the unstable pole gives P = 1 (closed loop by the count), −1.
    let r = ok_response(json!({"task": "transfer_function", "f": "2*(s+1)/(s*(s-1))"}));
    let kinds: Vec<&str> = r["image"]["segments"].as_array().unwrap().iter().map(|s| s["kind"].as_str().unwrap()).collect();
    assert_eq!(kinds, ["axis", "indent", "axis", "closing"]);
    assert_eq!(r["encirclement"]["winding"], -1);
}

#[test]
fn the_discrete_image_runs_along_the_unit_circle() {
    // H(z) = 0.5/(z − 1) with T = 2: the axis pieces are ωT from −π to π (ω to ±π/2), indented at z = 1;
    // H(e^{jωT}) = 0.5/(e^{jωT} − 1) (by hand), N = 0 (by hand; encirclement.rs).
    let r = ok_response(json!({"task": "transfer_function", "f": "0.5/(z-1)", "var": "z", "sample_period": 2}));
    let segs = r["image"]["segments"].as_array().unwrap();
    let kinds: Vec<&str> = segs.iter().map(|s| s["kind"].as_str().unwrap()).collect();
    assert_eq!(kinds, ["axis", "indent", "axis"]);
    close(f(&segs[0]["omega"][0]), -PI / 2.0, 1e-12, "first ω");
    close(f(segs[2]["omega"].as_array().unwrap().last().unwrap()), PI / 2.0, 1e-12, "last ω");
    for seg in [&segs[0], &segs[2]] {
        for (w, v) in floats(&seg["omega"]).iter().zip(seg["value"].as_array().unwrap()) {
            let want = cdiv((0.5, 0.0), ((2.0 * w).cos() - 1.0, (2.0 * w).sin()));
            let got = cx(v);
            assert!((got.0 - want.0).hypot(got.1 - want.1) <= 1e-9 * want.0.hypot(want.1), "ω {w}");
        }
    }
    assert_eq!(r["encirclement"]["winding"], 0);
}

fn error_code(request: Value) -> String {
    let (text, is_error) = residuary::api::run_json_text(&request.to_string());
    assert!(is_error, "request {request} should fail, got {text}");
    let v: Value = serde_json::from_str(&text).unwrap();
    v["error"]["code"].as_str().unwrap().to_string()
}

#[test]
fn a_tiny_budget_runs_out() {
    // The default grid of 1/((s+1)(s+10)) is 601 points (0.1 to 100 at 200 a decade, frequency_response.rs)
    // and the image walk at least 2·(128 + 1) evaluations: 1000 units cannot pay for all that (by count);
    // a budget of 1 000 000 can.
    let req = |budget: u64| json!({"task": "transfer_function", "f": "1/((s+1)*(s+10))", "max_evaluations": budget});
    assert_eq!(error_code(req(1000)), "budget_exhausted");
    let r = ok_response(req(1_000_000));
    assert_eq!(r["frequency_response"]["omega"].as_array().unwrap().len(), 601);
    // The step samples alone: 2000 times asked at a budget that covers the grid and the walk only.
    let r = residuary::api::run_json_text(&json!({"task": "transfer_function", "f": "1/(s+1)", "omega": [1],
        "t": (0..10_000).map(|k| k as f64 * 1e-3).collect::<Vec<_>>(), "max_evaluations": 20_000}).to_string());
    assert!(r.1 && r.0.contains("budget_exhausted"), "{}", r.0);
    ok_response(json!({"task": "transfer_function", "f": "1/(s+1)", "omega": [1], "t": [0, 1], "max_evaluations": 20_000}));
}

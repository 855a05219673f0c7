//! The `contour_integral` and `argument_count` tasks through the JSON API,
//! against handbook closed forms (named beside each check) and mpmath 1.3.0
//! fixtures at 40 digits (tests/fixtures/gen_contour.py → contour.json), which
//! integrate directly along each contour, independently of any residue.

use residuary::api::run_json_value;
use serde_json::{json, Value};
use std::f64::consts::{E, PI, SQRT_2};

type Cx = (f64, f64);

fn call(request: Value) -> Value {
    run_json_value(request.clone()).unwrap_or_else(|e| panic!("{request}: {}", e.message))
}

fn error(request: Value) -> String {
    match run_json_value(request.clone()) {
        Ok(v) => panic!("{request} should fail, got {v}"),
        Err(e) => e.message,
    }
}

fn cx(v: &Value) -> Cx {
    (v[0].as_f64().expect("re"), v[1].as_f64().expect("im"))
}

fn dist(a: Cx, b: Cx) -> f64 {
    ((a.0 - b.0).powi(2) + (a.1 - b.1).powi(2)).sqrt()
}

fn fixtures() -> Value {
    serde_json::from_str(include_str!("../fixtures/contour.json")).expect("fixture JSON")
}

fn fixture_value(name: &str) -> Cx {
    let fx = fixtures();
    assert_eq!(fx["mpmath_version"], "1.3.0");
    cx(&fx["cases"][name]["value"])
}

fn circle(x: f64, y: f64, r: f64) -> Value {
    json!({"shape":"circle","center":[x,y],"radius":r})
}

fn polygon(v: &Value) -> Value {
    json!({"shape":"polygon","vertices":v})
}

fn warnings(r: &Value) -> String {
    r["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .map(|w| w.as_str().unwrap())
        .collect::<Vec<_>>()
        .join(" | ")
}

/// Every available way equals `expected` within `tol`, and the response's own
/// bookkeeping holds: max_discrepancy is the largest pairwise difference
/// (recomputed here, the slow obvious way) and `value` is one of the ways.
fn check_ways(r: &Value, expected: Cx, tol: f64) -> usize {
    let ways: Vec<Cx> = ["by_quadrature", "by_inside_residues", "by_outside_residues"]
        .iter()
        .filter(|k| !r[**k].is_null())
        .map(|k| cx(&r[*k]))
        .collect();
    for (i, w) in ways.iter().enumerate() {
        assert!(
            dist(*w, expected) < tol,
            "way {i}: {w:?} vs {expected:?} in {r}"
        );
    }
    assert!(dist(cx(&r["value"]), expected) < tol, "{r}");
    let mut max_d: f64 = 0.0;
    for i in 0..ways.len() {
        for j in i + 1..ways.len() {
            max_d = max_d.max(dist(ways[i], ways[j]));
        }
    }
    let reported = r["max_discrepancy"].as_f64().unwrap();
    assert!(
        (reported - max_d).abs() <= 1e-15 * (1.0 + max_d),
        "{reported} vs {max_d}"
    );
    assert!(
        ways.iter().any(|w| *w == cx(&r["value"])),
        "value is one of the ways"
    );
    assert!(r["error_estimate"].as_f64().unwrap() < 1e-9, "{r}");
    ways.len()
}

fn winding_of(r: &Value, at: Cx) -> i64 {
    r["winding"]
        .as_array()
        .unwrap()
        .iter()
        .find(|w| dist(cx(&w["at"]), at) < 1e-8)
        .unwrap_or_else(|| panic!("no winding entry at {at:?} in {r}"))["winding"]
        .as_i64()
        .unwrap()
}

#[test]
fn cauchy_formula_for_a_derivative() {
    // ∮_{|z|=3} e^z/(z−1)² dz = 2πi (d/dz e^z)(1) = 2πi e: Cauchy's integral formula for derivatives (common practice).
    let r =
        call(json!({"task":"contour_integral","f":"exp(z)/(z-1)^2","contour":circle(0.0,0.0,3.0)}));
    assert_eq!(check_ways(&r, (0.0, 2.0 * PI * E), 1e-11), 2);
    assert!(r["by_outside_residues"].is_null());
    assert!(warnings(&r).contains("rational f only"));
    assert!(r["agreement"].as_str().unwrap().contains("agree to"));
    assert_eq!(winding_of(&r, (1.0, 0.0)), 1);
    assert_eq!(r["method"], "numerical");
}

#[test]
fn low_pass_filter_around_both_poles_is_zero() {
    // H(s) = ω0²/(s² + 2ζω0 s + ω0²): deg den − deg num = 2, so Res∞ = 0 and the
    // integral over a circle enclosing both poles is 2πi Σ res = 0 (common practice).
    let r = call(
        json!({"task":"contour_integral","f":"w0^2/(s^2+2*zeta*w0*s+w0^2)","var":"s",
        "params":{"w0":2.0,"zeta":0.3},"contour":circle(0.0,0.0,5.0)}),
    );
    assert_eq!(check_ways(&r, (0.0, 0.0), 1e-12), 3);
    assert_eq!(r["method"], "rational");
    assert!(r["agreement"]
        .as_str()
        .unwrap()
        .starts_with("all three ways agree"));
    // Poles −ζω0 ± iω0√(1−ζ²) (common practice).
    let (re, im) = (-0.6, 2.0 * (1.0f64 - 0.09).sqrt());
    assert_eq!(winding_of(&r, (re, im)), 1);
    assert_eq!(winding_of(&r, (re, -im)), 1);
    // A circle around the upper pole only: 2πi·ω0²/(p − p̄) = π ω0/√(1−ζ²) (common practice).
    let r = call(
        json!({"task":"contour_integral","f":"w0^2/(s^2+2*zeta*w0*s+w0^2)","var":"s",
        "params":{"w0":2.0,"zeta":0.3},"contour":circle(re,im,1.0)}),
    );
    assert_eq!(
        check_ways(&r, (PI * 2.0 / (1.0f64 - 0.09).sqrt(), 0.0), 1e-12),
        3
    );
    assert_eq!(winding_of(&r, (re, -im)), 0);
}

#[test]
fn quartic_over_a_large_circle_and_the_upper_half() {
    // 1/(z⁴+1): deg difference 4, so ∮ over |z| = 2 (all four poles) is 0 (common practice).
    let r = call(json!({"task":"contour_integral","f":"1/(z^4+1)","contour":circle(0.0,0.0,2.0)}));
    assert_eq!(check_ways(&r, (0.0, 0.0), 1e-13), 3);
    // A rectangle around the two upper poles: 2πi Σ_upper res = ∫_{−∞}^{∞} dx/(1+x⁴) = π/√2
    // (Gradshteyn & Ryzhik 3.241.2 with μ = 1, ν = 4, doubled, from memory; and mpmath 1.3.0, 40 digits).
    let line = fixture_value("quartic_real_line");
    assert!((line.0 - PI / SQRT_2).abs() < 1e-15);
    let r = call(
        json!({"task":"contour_integral","f":"1/(z^4+1)","contour":{"shape":"rectangle","corners":[[-3,0],[3,3]]}}),
    );
    assert_eq!(check_ways(&r, line, 1e-12), 3);
    let h = 0.5f64.sqrt();
    assert_eq!(winding_of(&r, (h, h)), 1);
    assert_eq!(winding_of(&r, (-h, h)), 1);
    assert_eq!(winding_of(&r, (h, -h)), 0);
    assert_eq!(winding_of(&r, (-h, -h)), 0);
}

#[test]
fn tangent_over_a_circle_of_radius_two() {
    // tan has simple poles at ±π/2 with residue −1 (Abramowitz & Stegun §4.3, from memory):
    // ∮_{|z|=2} tan z dz = 2πi·(−2) = −4πi.
    let r = call(json!({"task":"contour_integral","f":"tan(z)","contour":circle(0.0,0.0,2.0)}));
    assert_eq!(check_ways(&r, (0.0, -4.0 * PI), 1e-11), 2);
    assert_eq!(winding_of(&r, (PI / 2.0, 0.0)), 1);
    assert_eq!(winding_of(&r, (-PI / 2.0, 0.0)), 1);
}

#[test]
fn essential_singularity_uses_its_laurent_residue() {
    // exp(1/z) = Σ z^{−n}/n! (DLMF 4.2.19), so c₋₁ = 1 and ∮_{|z|=1} exp(1/z) dz = 2πi.
    let r = call(json!({"task":"contour_integral","f":"exp(1/z)","contour":circle(0.0,0.0,1.0)}));
    assert_eq!(check_ways(&r, (0.0, 2.0 * PI), 1e-10), 2);
    let w = &r["winding"][0];
    assert_eq!(w["kind"], "essential");
    assert_eq!(w["winding"], 1);
}

#[test]
fn clockwise_polygons_give_the_negative() {
    // mpmath 1.3.0, 40 digits: direct quadrature along the clockwise square around e^{iπ/4}.
    let fx = fixtures();
    let case = &fx["cases"]["exp_quartic_clockwise"];
    let expected = fixture_value("exp_quartic_clockwise");
    let r =
        call(json!({"task":"contour_integral","f":case["f"],"contour":polygon(&case["vertices"])}));
    assert_eq!(check_ways(&r, expected, 1e-12), 2);
    assert_eq!(winding_of(&r, (0.5f64.sqrt(), 0.5f64.sqrt())), -1);
    // The same square counter-clockwise: exactly the negative (common practice).
    let mut ccw: Vec<Value> = case["vertices"].as_array().unwrap().clone();
    ccw.reverse();
    let r = call(
        json!({"task":"contour_integral","f":case["f"],"contour":polygon(&Value::Array(ccw))}),
    );
    assert_eq!(check_ways(&r, (-expected.0, -expected.1), 1e-12), 2);
    // Rational f on a clockwise square: ∮ dz/(z − a) = 2πi·(winding −1) = −2πi for a
    // inside (Cauchy's integral formula, common practice), by all three ways.
    let r = call(json!({"task":"contour_integral","f":"1/(z-0.5-0.5i)",
        "contour":polygon(&json!([[0,0],[0,1],[1,1],[1,0]]))}));
    assert_eq!(check_ways(&r, (0.0, -2.0 * PI), 1e-12), 3);
}

#[test]
fn polygons_against_mpmath() {
    // mpmath 1.3.0, 40 digits, direct quadrature along each polygon (gen_contour.py),
    // itself checked there against residue closed forms.
    let fx = fixtures();
    for (name, ways) in [
        ("resonator_triangle", 3),
        ("tan_quadrilateral", 2),
        ("bowtie_one_lobe", 2),
        ("bowtie_one_lobe_rational", 3),
    ] {
        let case = &fx["cases"][name];
        let mut req =
            json!({"task":"contour_integral","f":case["f"],"contour":polygon(&case["vertices"])});
        if let Some(v) = case.get("var") {
            req["var"] = v.clone();
        }
        let r = call(req);
        assert_eq!(check_ways(&r, fixture_value(name), 1e-11), ways, "{name}");
    }
    let case = &fx["cases"]["gamma_rectangle"];
    let r = call(
        json!({"task":"contour_integral","f":"gamma(z)","contour":{"shape":"rectangle","corners":case["corners"]}}),
    );
    // Γ's residues at 0, −1, −2 are 1, −1, 1/2 (DLMF §5.2(i), from memory): sum 1/2, integral πi;
    // the mpmath fixture (direct quadrature) agrees to 1e-15.
    assert_eq!(check_ways(&r, (0.0, PI), 1e-11), 2);
    assert!(dist(fixture_value("gamma_rectangle"), (0.0, PI)) < 1e-15);
}

#[test]
fn self_intersecting_polygon_with_two_winding_values() {
    // Bow tie: left lobe winds +1, right lobe −1 (by hand from the vertex order); one pole in each.
    // mpmath 1.3.0, 40 digits (direct quadrature; checked there against 2πi Σ w·Res).
    let fx = fixtures();
    let case = &fx["cases"]["bowtie_two_lobes"];
    let r =
        call(json!({"task":"contour_integral","f":case["f"],"contour":polygon(&case["vertices"])}));
    assert_eq!(check_ways(&r, fixture_value("bowtie_two_lobes"), 1e-12), 2);
    assert!(r["by_outside_residues"].is_null());
    assert!(warnings(&r).contains("different winding numbers"));
    assert_eq!(winding_of(&r, (0.5, 1.0)), 1);
    assert_eq!(winding_of(&r, (2.6, 1.2)), -1);
}

#[test]
fn branch_cut_across_the_contour_leaves_only_quadrature() {
    // Principal sqrt has its cut on the negative real axis (common practice); it crosses
    // the unit circle at −1. mpmath 1.3.0, 40 digits, quadrature split at the cut.
    let r = call(
        json!({"task":"contour_integral","f":"sqrt(z)/(z-0.5)","contour":circle(0.0,0.0,1.0)}),
    );
    assert!(r["by_inside_residues"].is_null());
    assert!(r["by_outside_residues"].is_null());
    assert!(warnings(&r).contains("branch cut"));
    assert_eq!(r["value_from"], "quadrature");
    assert_eq!(check_ways(&r, fixture_value("sqrt_cut_circle"), 1e-11), 1);
    assert!(r["agreement"]
        .as_str()
        .unwrap()
        .starts_with("only the quadrature"));
}

#[test]
fn singularity_on_the_contour_is_an_error_and_near_it_a_warning() {
    let e = error(json!({"task":"contour_integral","f":"1/(z-1)","contour":circle(0.0,0.0,1.0)}));
    assert!(
        e.to_string().contains("pole at 1 on the contour") && e.to_string().contains("move the contour"),
        "{e}"
    );
    // 1/sin z has a pole at π (common practice), on the circle |z| = π.
    let e = error(json!({"task":"contour_integral","f":"1/sin(z)","contour":circle(0.0,0.0,PI)}));
    assert!(e.to_string().contains("on the contour"), "{e}");
    // A pole 1e-3 outside: the integral is 0 (Cauchy's theorem, common practice), with a warning.
    let r =
        call(json!({"task":"contour_integral","f":"1/(z-1.001)","contour":circle(0.0,0.0,1.0)}));
    assert_eq!(check_ways(&r, (0.0, 0.0), 1e-10), 3);
    assert!(warnings(&r).contains("from the contour"));
    assert_eq!(winding_of(&r, (1.001, 0.0)), 0);
}

#[test]
fn disagreement_is_shown_not_hidden() {
    // A pole 1e-8 inside the unit circle: the residue theorem gives 2πi (common practice),
    // while the trapezoidal rule cannot resolve the pole within its sample limit.
    let r = call(
        json!({"task":"contour_integral","f":"1/(z-0.99999999)","contour":circle(0.0,0.0,1.0)}),
    );
    assert!(dist(cx(&r["by_inside_residues"]), (0.0, 2.0 * PI)) < 1e-12);
    assert!(dist(cx(&r["by_outside_residues"]), (0.0, 2.0 * PI)) < 1e-12);
    assert!(dist(cx(&r["value"]), (0.0, 2.0 * PI)) < 1e-12);
    let q = cx(&r["by_quadrature"]);
    assert!(
        dist(q, (0.0, 2.0 * PI)) > 1.0,
        "the quadrature really is off here: {q:?}"
    );
    assert!((r["max_discrepancy"].as_f64().unwrap() - dist(q, (0.0, 2.0 * PI))).abs() < 1e-9);
    let agreement = r["agreement"].as_str().unwrap();
    assert!(
        agreement.contains("differ") && !agreement.contains("agree to"),
        "{agreement}"
    );
    assert!(warnings(&r).contains("close to the contour"));
    assert!(r["quadrature_error_estimate"].as_f64().unwrap() > 1.0);
}

#[test]
fn bad_requests_say_what_to_fix() {
    let e = error(json!({"task":"contour_integral","f":"1/z","contour":circle(0.0,0.0,-1.0)}));
    assert!(e.to_string().contains("radius"), "{e}");
    let e = error(json!({"task":"contour_integral","f":"1/z"}));
    assert!(e.to_string().contains("contour"), "{e}");
    let e = error(json!({"task":"argument_count","f":"1/(z","contour":circle(0.0,0.0,1.0)}));
    assert!(e.to_string().contains("')'"), "{e}");
    let e = error(
        json!({"task":"contour_integral","f":"tan(z)","contour":circle(0.0,0.0,2.0),"max_evaluations":1000}),
    );
    assert!(e.to_string().contains("max_evaluations"), "{e}");
}

// ---------------------------------------------------------------- argument_count

fn count(f: &str, contour: Value) -> Value {
    call(json!({"task":"argument_count","f":f,"contour":contour}))
}

#[test]
fn polynomial_zeros_in_a_rectangle() {
    // z⁴ − 1 has the fourth roots of unity ±1, ±i as zeros (common practice);
    // the rectangle holds 1, i, −i.
    let r = count(
        "z^4-1",
        json!({"shape":"rectangle","corners":[[-0.5,-1.5],[1.5,1.5]]}),
    );
    assert_eq!(
        (
            r["zeros"].as_i64(),
            r["poles"].as_i64(),
            r["zeros_minus_poles"].as_i64()
        ),
        (Some(3), Some(0), Some(3))
    );
    assert_eq!(r["method"], "rational");
    // (z−1)(z−2)(z+3) = z³ − 7z + 6 (common practice): two roots in [0, 2.5] × [−1, 1].
    let r = count(
        "z^3-7*z+6",
        json!({"shape":"rectangle","corners":[[0,-1],[2.5,1]]}),
    );
    assert_eq!(r["zeros"], 2);
    assert_eq!(r["zeros_minus_poles"], 2);
    // A non-rational f: (z² + 4)e^z has zeros ±2i only (e^z never vanishes, common practice).
    let r = count(
        "(z^2+4)*exp(z)",
        json!({"shape":"polygon","vertices":[[0,3],[-1,1],[1,1]]}),
    );
    assert_eq!(
        (
            r["zeros"].as_i64(),
            r["poles"].as_i64(),
            r["zeros_minus_poles"].as_i64()
        ),
        (Some(1), Some(0), Some(1))
    );
    assert_eq!(r["method"], "numerical");
}

#[test]
fn gamma_has_poles_and_no_zeros() {
    // Γ has no zeros and simple poles at 0, −1, −2, … (DLMF §5.2(i), from memory).
    let rect = json!({"shape":"rectangle","corners":[[-3.5,-1],[0.5,1]]});
    let r = count("gamma(z)", rect.clone());
    assert_eq!(
        (
            r["zeros"].as_i64(),
            r["poles"].as_i64(),
            r["zeros_minus_poles"].as_i64()
        ),
        (Some(0), Some(4), Some(-4))
    );
    // So 1/Γ has simple zeros there (same source).
    let r = count("1/gamma(z)", rect);
    assert_eq!(
        (
            r["zeros"].as_i64(),
            r["poles"].as_i64(),
            r["zeros_minus_poles"].as_i64()
        ),
        (Some(4), Some(0), Some(4))
    );
}

#[test]
fn tangent_in_an_ellipse() {
    // tan: zeros kπ, poles (k+½)π (Abramowitz & Stegun §4.3, from memory). The ellipse
    // with semi-axes 4 and 1 holds the zeros 0, ±π and the poles ±π/2 (3π/2 > 4).
    let r = count(
        "tan(z)",
        json!({"shape":"ellipse","center":[0,0],"semi_axes":[4,1]}),
    );
    assert_eq!(
        (
            r["zeros"].as_i64(),
            r["poles"].as_i64(),
            r["zeros_minus_poles"].as_i64()
        ),
        (Some(3), Some(2), Some(1))
    );
    assert_eq!(r["points"].as_array().unwrap().len(), 5);
}

#[test]
fn resonator_poles_and_clockwise_counts() {
    // 1/(s² + 0.2s + 1): two poles at −0.1 ± 0.995i (common practice).
    let r = call(
        json!({"task":"argument_count","f":"1/(s^2+0.2*s+1)","var":"s","contour":circle(0.0,0.0,2.0)}),
    );
    assert_eq!(
        (
            r["zeros"].as_i64(),
            r["poles"].as_i64(),
            r["zeros_minus_poles"].as_i64()
        ),
        (Some(0), Some(2), Some(-2))
    );
    // Clockwise square around the zero of z − 0.5 − 0.5i: the argument principle gives −1
    // (the winding number weights every point, common practice).
    let r = count(
        "z-0.5-0.5i",
        polygon(&json!([[0, 0], [0, 1], [1, 1], [1, 0]])),
    );
    assert_eq!(
        (r["zeros"].as_i64(), r["zeros_minus_poles"].as_i64()),
        (Some(-1), Some(-1))
    );
    assert!(warnings(&r).contains("clockwise"));
}

#[test]
fn essential_singularity_inside_gives_no_separate_counts() {
    // exp(1/z) has no zeros and no poles; its argument change on |z| = 1 is 0
    // (exp(1/z) = e^{cos θ} e^{−i sin θ} there, common practice).
    let r = count("exp(1/z)", circle(0.0, 0.0, 1.0));
    assert_eq!(r["zeros_minus_poles"], 0);
    assert!(r["zeros"].is_null() && r["poles"].is_null());
    assert!(warnings(&r).contains("essential"));
    // A zero on the contour is an error that says what to do.
    let e = error(json!({"task":"argument_count","f":"z-1","contour":circle(0.0,0.0,1.0)}));
    assert!(e.to_string().contains("move the contour"), "{e}");
}

//! The `real_integral` task through the JSON API, against handbook closed forms
//! (named beside each check) and mpmath 1.3.0 fixtures at 30 digits
//! (tests/fixtures/gen_real_integral.py → real_integral.json), which integrate
//! directly on the real line with no residues. Every error estimate is checked
//! to bound the true error.


use residuary::api::run_json_value;
use residuary::C;
use serde_json::{json, Value};
use std::f64::consts::PI;

fn call(request: Value) -> Value {
    run_json_value(request.clone()).unwrap_or_else(|e| panic!("{request}: {}", e.message))
}

fn error(request: Value) -> String {
    match run_json_value(request.clone()) {
        Ok(v) => panic!("{request} should fail, got {v}"),
        Err(e) => e.message,
    }
}

fn cx(v: &Value) -> C {
    C::new(v[0].as_f64().expect("re"), v[1].as_f64().expect("im"))
}

/// The request with "task" added.
fn request(mut body: Value) -> Value {
    body["task"] = json!("real_integral");
    body
}

/// Checks value, both ways and every error estimate against `exact`; `rel` is the accuracy demanded.
fn check(body: Value, exact: C, rel: f64) -> Value {
    let r = call(request(body.clone()));
    let scale = exact.norm().max(1e-300);
    let value = cx(&r["value"]);
    let err = r["error_estimate"].as_f64().unwrap();
    assert!(
        (value - exact).norm() <= rel * scale.max(1.0),
        "{body}: value {value} vs {exact}: {r}"
    );
    assert!(
        (value - exact).norm() <= err,
        "{body}: error estimate {err} does not bound {}: {r}",
        (value - exact).norm()
    );
    let q = cx(&r["by_quadrature"]);
    let qe = r["quadrature_error_estimate"].as_f64().unwrap();
    assert!(
        (q - exact).norm() <= qe,
        "{body}: quadrature estimate {qe} does not bound {}: {r}",
        (q - exact).norm()
    );
    if !r["by_residues"].is_null() {
        let s = cx(&r["by_residues"]);
        let se = r["residues_error_estimate"].as_f64().unwrap();
        assert!(
            (s - exact).norm() <= se.max(4.0 * f64::EPSILON * scale),
            "{body}: residue estimate {se} does not bound {}: {r}",
            (s - exact).norm()
        );
    }
    r
}

#[test]
fn lorentzian_line_integral_is_pi() {
    // ∫ dx/(1+x²) = π (common practice).
    let r = check(
        json!({"kind": "line", "f": "1/(1+x^2)"}),
        C::new(PI, 0.0),
        1e-14,
    );
    assert_eq!(r["method"], "rational");
    assert_eq!(r["residues_used"].as_array().unwrap().len(), 1);
    let used = &r["residues_used"][0];
    // Res_{z=i} 1/(1+z²) = 1/(2i) (common practice), weight 2πi.
    assert!((cx(&used["residue"]) - C::new(0.0, -0.5)).norm() < 1e-14);
    assert!((cx(&used["weight"]) - C::new(0.0, 2.0 * PI)).norm() < 1e-14);
    assert!((cx(&used["at"]) - C::new(0.0, 1.0)).norm() < 1e-14);
}

#[test]
fn dispersion_integral_of_two_lorentzians() {
    // ∫ dx/((x²+a²)(x²+b²)) = π/(ab(a+b)), a, b > 0 (common practice; by partial
    // fractions and ∫ dx/(x²+a²) = π/a).
    for (a, b) in [(1.5, 0.5), (1.0, 2.0), (0.1, 3.0)] {
        let exact = PI / (a * b * (a + b));
        check(
            json!({"kind": "line", "f": "1/((x^2+a^2)*(x^2+b^2))", "params": {"a": a, "b": b}}),
            C::new(exact, 0.0),
            1e-13,
        );
    }
}

#[test]
fn cosine_transform_of_a_lorentzian() {
    // ∫ cos(ωx)/(x²+a²) dx = π e^{−aω}/a, a, ω > 0 (G&R 3.723.2, from memory);
    // the sine part vanishes by symmetry, so ∫ e^{iωx}/(x²+a²) dx has the same value.
    for (a, w) in [(2.0f64, 3.0f64), (0.5, 1.0), (1.0, 10.0)] {
        let exact = PI * (-a * w).exp() / a;
        let r = check(
            json!({"kind": "fourier", "f": "1/(x^2+a^2)", "params": {"a": a}, "omega": w}),
            C::new(exact, 0.0),
            1e-13,
        );
        // ω < 0 closes in the lower half-plane and gives the same (even) value.
        let n = check(
            json!({"kind": "fourier", "f": "1/(x^2+a^2)", "params": {"a": a}, "omega": -w}),
            C::new(exact, 0.0),
            1e-13,
        );
        assert!(r["formula"].as_str().unwrap().contains("Im a > 0"));
        assert!(n["formula"].as_str().unwrap().contains("Im a < 0"));
    }
}

#[test]
fn lorentzian_line_shape_fourier_transform() {
    // Normalised Lorentzian L(x) = (γ/π)/((x−x₀)² + γ²) has characteristic function
    // ∫ L(x) e^{iωx} dx = e^{iωx₀ − γ|ω|} (common practice: the Cauchy distribution).
    let (x0, g) = (1.3, 0.4);
    for w in [0.7, -2.0, 5.0] {
        let exact = C::new(-g * f64::abs(w), w * x0).exp();
        check(
            json!({"kind": "fourier", "f": "(g/pi)/((x-x0)^2+g^2)", "params": {"g": g, "x0": x0}, "omega": w}),
            exact,
            1e-13,
        );
    }
}

#[test]
fn omega_zero_is_the_line_integral() {
    let r = check(
        json!({"kind": "fourier", "f": "1/(1+x^2)", "omega": 0}),
        C::new(PI, 0.0),
        1e-14,
    );
    assert!(r["warnings"].to_string().contains("ω = 0"));
}

#[test]
fn trig_integral_of_shifted_cosine() {
    // ∫_0^{2π} dθ/(a + b cos θ) = 2π/√(a² − b²), a > |b| (common practice).
    for (a, b) in [(3.0f64, 2.0f64), (1.25, -1.0), (5.0, 0.5)] {
        let exact = 2.0 * PI / f64::sqrt(a * a - b * b);
        let r = check(
            json!({"kind": "trig", "f": "1/(a+b*cos(x))", "params": {"a": a, "b": b}}),
            C::new(exact, 0.0),
            1e-11,
        );
        assert!(!r["by_residues"].is_null(), "{r}");
        // One pole of g inside the unit circle, at z = (−a + √(a² − b²))/b (common practice).
        let z = (-a + (a * a - b * b).sqrt()) / b;
        let used = r["residues_used"].as_array().unwrap();
        assert_eq!(used.len(), 1, "{r}");
        assert!((cx(&used[0]["at"]) - C::new(z, 0.0)).norm() < 1e-9, "{r}");
    }
}

#[test]
fn trig_accepts_the_variable_t() {
    let exact = 2.0 * PI / f64::sqrt(5.0); // a = 3, b = 2 (common practice, as above)
    check(
        json!({"kind": "trig", "f": "1/(3+2*cos(t))", "var": "t"}),
        C::new(exact, 0.0),
        1e-11,
    );
}

#[test]
fn mellin_of_one_over_one_plus_x() {
    // ∫_0^∞ x^{α−1}/(1+x) dx = π/sin(πα), 0 < α < 1 (DLMF 5.12.3 with Γ(α)Γ(1−α) = π/sin(πα), DLMF 5.5.3).
    for a in [0.3f64, 0.5, 0.9, 0.05] {
        let exact = PI / (PI * a).sin();
        check(
            json!({"kind": "mellin", "f": "1/(1+x)", "alpha": a}),
            C::new(exact, 0.0),
            1e-12,
        );
    }
}

#[test]
fn mellin_of_one_over_one_plus_x_squared() {
    // ∫_0^∞ x^{α−1}/(1+x²) dx = π/(2 sin(πα/2)), 0 < α < 2 (substitute t = x² in the case above; from memory).
    for a in [0.3f64, 1.5, 1.0 + 0.25] {
        let exact = PI / (2.0 * (PI * a / 2.0).sin());
        check(
            json!({"kind": "mellin", "f": "1/(1+x^2)", "alpha": a}),
            C::new(exact, 0.0),
            1e-12,
        );
    }
}

#[test]
fn mpmath_fixtures() {
    let fx = crate::common::fixture("real_integral");
    let cases = fx["cases"].as_array().unwrap();
    assert!(cases.len() >= 10);
    for case in cases {
        // mpmath 1.3.0, 30 digits (direct quadrature)
        let exact = crate::common::num(&case["value"]);
        let rel = if case["name"].as_str().unwrap().contains("branch") {
            1e-10
        } else {
            1e-12
        };
        let r = check(case["request"].clone(), exact, rel);
        if case["name"] == "line_principal_value" {
            assert_eq!(r["principal_value"], true, "{r}");
        }
    }
}

#[test]
fn branch_amplitude_has_no_residue_side_but_a_quadrature() {
    // (1+x²)^{−3/2} has branch points at ±i: the residue side is refused, the quadrature stays.
    let r = call(request(
        json!({"kind": "fourier", "f": "(1+x^2)^(-1.5)", "omega": 2}),
    ));
    assert!(r["by_residues"].is_null(), "{r}");
    assert_eq!(r["value_from"], "quadrature");
}

#[test]
fn gaussian_has_no_residue_side() {
    // ∫ e^{−x²} e^{iωx} dx = √π e^{−ω²/4} (common practice); e^{−z²} grows on the half circles.
    let w: f64 = 2.0;
    let exact = PI.sqrt() * (-w * w / 4.0).exp();
    let r = check(
        json!({"kind": "fourier", "f": "exp(-x^2)", "omega": w}),
        C::new(exact, 0.0),
        1e-12,
    );
    assert!(r["by_residues"].is_null(), "{r}");
    assert!(r["warnings"].to_string().contains("does not decay"), "{r}");
}

#[test]
fn non_rational_meromorphic_integrand_by_numerical_residues() {
    // ∫ e^{ix}/(x²+1) dx = π/e (common practice, the cosine transform above at a = ω = 1).
    let r = call(request(json!({"kind": "line", "f": "exp(i*x)/(x^2+1)"})));
    assert_eq!(r["method"], "numerical");
    let exact = C::new(PI / 1f64.exp(), 0.0);
    let v = cx(&r["value"]);
    assert!((v - exact).norm() < 1e-10, "{r}");
    assert!(
        (v - exact).norm() <= r["error_estimate"].as_f64().unwrap(),
        "{r}"
    );
    assert!(
        (cx(&r["by_quadrature"]) - exact).norm()
            <= r["quadrature_error_estimate"].as_f64().unwrap(),
        "{r}"
    );
}

#[test]
fn divergent_and_degenerate_cases_are_refused() {
    let cases = [
        (json!({"kind": "line", "f": "x/(x^2+1)"}), "diverges"),
        (json!({"kind": "line", "f": "1/(x^2-1)^2"}), "order 2"),
        (
            json!({"kind": "fourier", "f": "x^2/(x^2+1)", "omega": 1}),
            "diverges",
        ),
        (json!({"kind": "fourier", "f": "1/(x^2+1)"}), "omega"),
        (
            json!({"kind": "fourier", "f": "1/(x^2+1)", "omega": [1, 1]}),
            "real",
        ),
        (
            json!({"kind": "mellin", "f": "1/(1+x)", "alpha": 2}),
            "integer",
        ),
        (
            json!({"kind": "mellin", "f": "1/(1+x)", "alpha": 1.5}),
            "0 < Re α < 1",
        ),
        (
            json!({"kind": "mellin", "f": "1/(x*(1+x)^2)", "alpha": 0.5}),
            "1 < Re α < 3",
        ),
        (
            json!({"kind": "mellin", "f": "1/((x-2)*(x+1)^2)", "alpha": 0.5}),
            "positive real axis",
        ),
        (
            json!({"kind": "mellin", "f": "exp(-x)", "alpha": 0.5}),
            "rational",
        ),
        (json!({"kind": "mellin", "f": "1/(1+x)"}), "alpha"),
        (json!({"kind": "trig", "f": "x/(2+cos(x))"}), "periodic"),
        (json!({"kind": "trig", "f": "1/(1+cos(x))"}), "not finite"),
        (json!({"kind": "line", "f": "1/sqrt(1+x^2)"}), "decay"),
        (
            json!({"kind": "sideways", "f": "1/(1+x^2)"}),
            "unknown kind",
        ),
    ];
    for (body, needle) in cases {
        let m = error(request(body.clone()));
        assert!(m.contains(needle), "{body}: {m}");
    }
}

#[test]
fn overflow_of_cosh_is_not_a_singularity_on_the_line() {
    // ∫_{−∞}^{∞} dx / cosh x = π (Gradshteyn & Ryzhik 3.511.1 — from memory; also 2 arctan(e^x)
    // evaluated at ±∞). cosh overflows past |x| ≈ 710, where 1/cosh x is 0, not a singularity
    // (regression: the integral was refused as divergent at x = 1024).
    check(json!({"f": "1/cosh(x)", "var": "x", "kind": "line"}), C::new(PI, 0.0), 1e-9);
    // As typed, 1/cosh(1024) is 0 (C99 Annex G: ccosh of a real argument is real).
    let v = run_json_value(json!({"task": "evaluate", "f": "1/cosh(x)", "var": "x", "at": [1024.0, -1024.0]})).unwrap();
    assert_eq!(v["values"], json!([[0.0, 0.0], [0.0, 0.0]]), "{v}");
}

#[test]
fn a_removable_point_on_the_line_is_not_a_singularity() {
    // ∫ x/sinh x dx over ℝ = π²/2 (Gradshteyn & Ryzhik 3.521.2 — from memory; mpmath 1.3 quad,
    // 30 digits: 4.93480220054467930941724549994). As typed, x/sinh x is 0/0 at x = 0, which is
    // the midpoint node of the quadrature on [−L, L] (regression: refused as divergent).
    check(json!({"f": "x/sinh(x)", "var": "x", "kind": "line"}), C::new(PI * PI / 2.0, 0.0), 1e-9);
    // ∫ sin x /(x (x² + 1)) dx = π (1 − 1/e) (mpmath 1.3 quadosc, 30 digits: 1.98586530379887152055255019997).
    check(json!({"f": "sin(x)/(x*(x^2+1))", "var": "x", "kind": "line"}), C::new(PI * (1.0 - (-1.0f64).exp()), 0.0), 1e-9);
    // A true pole at the same place is still refused.
    assert!(error(request(json!({"f": "1/x", "var": "x", "kind": "line"}))).contains("diverges"));
}

/// The derivation's closing contour, lemma and written sum, per kind (the
/// contours and lemmas of the residue method: Ahlfors, "Complex Analysis",
/// 3rd ed., ch. 4 §5.3, from memory; the values are the handbook ones named).
#[test]
fn derivation_names_contour_lemma_and_sum() {
    // ω > 0: upper half-disc, Jordan; ∫ e^{3ix}/(x²+4) dx = π e^{−6}/2 (G&R 3.723.2, from memory).
    let r = call(request(json!({"kind": "fourier", "f": "1/(x^2+4)", "omega": 3})));
    let d = &r["derivation"];
    assert_eq!(d["contour"]["shape"], "upper_half_disc", "{r}");
    assert_eq!(d["lemma"], "jordan");
    assert_eq!(d["residues_of"], "f(z) e^(iωz)");
    let radius = d["contour"]["radius"].as_f64().unwrap();
    assert!(radius > 2.0, "the drawn radius encloses the pole 2i: {radius}");
    assert_eq!(r["residues_used"][0]["order"], 1);
    let exact = PI * (-6f64).exp() / 2.0;
    let written = d["sum"].as_str().unwrap();
    let total: f64 = written.rsplit("= ").next().unwrap().parse().unwrap();
    assert!((total - exact).abs() < 1e-12 * exact, "{written}");

    // ω < 0: lower half-disc, weight −2πi; the same value (f even).
    let r = call(request(json!({"kind": "fourier", "f": "1/(x^2+4)", "omega": -3})));
    assert_eq!(r["derivation"]["contour"]["shape"], "lower_half_disc");
    assert_eq!(r["derivation"]["lemma"], "jordan");
    assert!((cx(&r["residues_used"][0]["weight"]) - C::new(0.0, -2.0 * PI)).norm() < 1e-15);

    // ω = 0 (line): ML estimate; ∫ x²/(x⁴+1) dx = π/√2 (G&R 3.241.2 with μ = 3, ν = 4, from memory).
    let r = call(request(json!({"kind": "line", "f": "x^2/(x^4+1)"})));
    let d = &r["derivation"];
    assert_eq!(d["lemma"], "ml_estimate");
    assert_eq!(d["contour"]["shape"], "upper_half_disc");
    assert!(d["lemma_condition"].as_str().unwrap().contains("= 2"), "{d}");
    assert_eq!(r["residues_used"].as_array().unwrap().len(), 2);
    let total: f64 = d["sum"].as_str().unwrap().rsplit("= ").next().unwrap().parse().unwrap();
    assert!((total - PI / 2f64.sqrt()).abs() < 1e-11, "{d}");

    // A principal value: indented at 0; PV ∫ e^{ix}/x dx = iπ (Dirichlet integral, common practice).
    let r = call(request(json!({"kind": "fourier", "f": "1/x", "omega": 1})));
    assert_eq!(r["derivation"]["contour"]["indentations"], json!([[0.0, 0.0]]));
    assert_eq!(r["residues_used"][0]["order"], 1);

    // trig: unit circle, no lemma, the substitution; ∫ dθ/(2+cos θ) = 2π/√3 (from memory).
    let r = call(request(json!({"kind": "trig", "f": "1/(2+cos(x))"})));
    let d = &r["derivation"];
    assert_eq!(d["contour"]["shape"], "unit_circle");
    assert_eq!(d["contour"]["radius"], 1.0);
    assert_eq!(d["lemma"], "none");
    assert!(d["substitution"].as_str().unwrap().starts_with("z = e^(iθ), dθ = dz/(iz)"));
    // The pole of g inside |z| = 1 is −2 + √3 (root of z² + 4z + 1, by hand).
    assert!((cx(&r["residues_used"][0]["at"]) - C::new(3f64.sqrt() - 2.0, 0.0)).norm() < 1e-10);

    // mellin: keyhole with the strip 0 < Re α < 1 of ∫ x^{α−1}/(1+x) dx = π/sin πα (DLMF 5.12.3, 5.5.3).
    let r = call(request(json!({"kind": "mellin", "f": "1/(1+x)", "alpha": 0.25})));
    let d = &r["derivation"];
    assert_eq!(d["contour"]["shape"], "keyhole");
    assert_eq!(d["lemma"], "keyhole_circles");
    assert_eq!(d["strip"], json!([0, 1]));
    let (inner, outer) = (d["contour"]["inner_radius"].as_f64().unwrap(), d["contour"]["radius"].as_f64().unwrap());
    assert!(inner < 1.0 && outer > 1.0, "the circles bracket the pole −1: {d}");
    let total: f64 = d["sum"].as_str().unwrap().rsplit("= ").next().unwrap().parse().unwrap();
    assert!((total - PI / (PI / 4.0).sin()).abs() < 1e-11, "{d}");
    // 1/(x(1+x)²): f ~ x^{−1} at 0, x^{−3} at ∞, so 1 < Re α < 3 (from memory).
    let r = call(request(json!({"kind": "mellin", "f": "1/(x*(1+x)^2)", "alpha": 1.5})));
    assert_eq!(r["derivation"]["strip"], json!([1, 3]), "{r}");
}

/// No residue side, no derivation: a branch amplitude is integrated by quadrature only.
#[test]
fn no_derivation_without_residues() {
    let r = call(request(json!({"kind": "line", "f": "exp(-x^2)"})));
    assert!(r["by_residues"].is_null(), "{r}");
    assert!(r["derivation"].is_null(), "{r}");
}

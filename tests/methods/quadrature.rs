//! Gauss–Kronrod, periodic trapezoid and contour integrals against closed forms
//! and mpmath 1.3.0 (40 digits) fixtures in tests/fixtures/laurent.json.


use residuary::budget::Budget;
use residuary::contour::Contour;
use residuary::quad::contour_quadrature::contour_integral;
use residuary::quad::gauss_kronrod::{
    integrate, integrate_infinite, kronrod_panel, GAUSS_WEIGHTS, KRONROD_NODES, KRONROD_WEIGHTS,
};
use residuary::quad::trapezoid_periodic::integrate_periodic;
use residuary::quad::{QuadError, QuadResult, Tolerance};
use residuary::C;
use serde_json::Value;
use std::f64::consts::{E, PI};

const I: C = C { re: 0.0, im: 1.0 };

fn fixtures() -> Value {
    crate::common::fixture("laurent")
}

fn tight() -> Tolerance {
    Tolerance {
        abs: 0.0,
        rel: 1e-12,
    }
}

/// The value is within the estimate, and the estimate is not absurdly loose.
fn check(name: &str, r: &QuadResult, want: C, loose: f64) {
    let err = (r.value - want).norm();
    assert!(
        err <= r.error_estimate,
        "{name}: {} vs {want}: error {err:e} > estimate {:e}",
        r.value,
        r.error_estimate
    );
    assert!(
        r.error_estimate <= loose * want.norm().max(1.0),
        "{name}: estimate {:e} too loose",
        r.error_estimate
    );
}

#[test]
fn kronrod_rule_is_exact_to_degree_22() {
    // ∫_{-1}^{1} x^p dx = 2/(p+1) for even p, 0 for odd p (common practice)
    for p in 0..=22 {
        let (value, gauss_gap, _) =
            kronrod_panel(&mut |x: f64| C::new(x.powi(p), 0.0), -1.0, 1.0).unwrap();
        let exact = if p % 2 == 0 {
            2.0 / (p as f64 + 1.0)
        } else {
            0.0
        };
        assert!(
            (value.re - exact).abs() < 4e-16,
            "degree {p}: {} vs {exact}",
            value.re
        );
        // The 7-point Gauss rule is exact to degree 13, so K15 − G7 vanishes there.
        if p <= 13 {
            assert!(gauss_gap < 4e-16, "degree {p}: |K − G| = {gauss_gap:e}");
        }
    }
    // Degree 24 is beyond the rule: a real error appears (the test can fail).
    let (value, _, _) = kronrod_panel(&mut |x: f64| C::new(x.powi(24), 0.0), -1.0, 1.0).unwrap();
    assert!((value.re - 2.0 / 25.0).abs() > 1e-10);
}

#[test]
fn kronrod_table_matches_high_precision_recomputation() {
    // Nodes/weights recomputed from the Stieltjes polynomial in mpmath 1.3.0, 40 digits
    let fx = fixtures();
    let k = &fx["kronrod"];
    // 2.3e-16: one ulp below 1 — serde_json's default float parser may be off by one ulp.
    for j in 0..8 {
        assert!(
            (KRONROD_NODES[j] - k["nodes"][j].as_f64().unwrap()).abs() < 2.3e-16,
            "node {j}"
        );
        assert!(
            (KRONROD_WEIGHTS[j] - k["weights"][j].as_f64().unwrap()).abs() < 2.3e-16,
            "weight {j}"
        );
    }
    for j in 0..4 {
        assert!(
            (GAUSS_WEIGHTS[j] - k["gauss_weights"][j].as_f64().unwrap()).abs() < 2.3e-16,
            "gauss weight {j}"
        );
    }
}

#[test]
fn closed_form_integrals() {
    let mut b = Budget::default();
    let r = integrate(
        &mut |x: f64| C::new(x.exp(), 0.0),
        0.0,
        1.0,
        tight(),
        &mut b,
    )
    .unwrap();
    check("e^x", &r, C::new(E - 1.0, 0.0), 1e-11); // ∫0^1 e^x = e − 1 (common practice)
    let r = integrate(
        &mut |x: f64| C::new(1.0 / (1.0 + x * x), 0.0),
        0.0,
        1.0,
        tight(),
        &mut b,
    )
    .unwrap();
    // ∫0^1 dx/(1+x²) = arctan 1 = π/4 (common practice)
    check("1/(1+x²)", &r, C::new(PI / 4.0, 0.0), 1e-11);
    // Endpoint singularities (integrable): ∫0^1 x^{-1/2} = 2, ∫0^1 ln x = −1 (common practice)
    let r = integrate(
        &mut |x: f64| C::new(x.powf(-0.5), 0.0),
        0.0,
        1.0,
        tight(),
        &mut b,
    )
    .unwrap();
    check("x^-1/2", &r, C::new(2.0, 0.0), 1e-9);
    let r = integrate(&mut |x: f64| C::new(x.ln(), 0.0), 0.0, 1.0, tight(), &mut b).unwrap();
    check("ln x", &r, C::new(-1.0, 0.0), 1e-9);
    // Reversed limits flip the sign: ∫1^0 e^x = 1 − e (common practice).
    let r = integrate(
        &mut |x: f64| C::new(x.exp(), 0.0),
        1.0,
        0.0,
        tight(),
        &mut b,
    )
    .unwrap();
    check("e^x reversed", &r, C::new(1.0 - E, 0.0), 1e-11);
    // Gaussian integral ∫0^∞ e^{-x²} = √π/2 (common practice)
    let r = integrate_infinite(
        &mut |x: f64| C::new((-x * x).exp(), 0.0),
        0.0,
        f64::INFINITY,
        tight(),
        &mut b,
    )
    .unwrap();
    check("gauss", &r, C::new(PI.sqrt() / 2.0, 0.0), 1e-10);
    // ∫0^∞ x/(e^x − 1) dx = Γ(2)ζ(2) = π²/6: DLMF 25.5.1 with s = 2 and ζ(2) = π²/6,
    // DLMF 25.6.1 (equation numbers from memory; value checked with mpmath 1.3.0, 30 digits)
    let r = integrate_infinite(
        &mut |x: f64| C::new(x / x.exp_m1(), 0.0),
        0.0,
        f64::INFINITY,
        tight(),
        &mut b,
    )
    .unwrap();
    check("bose", &r, C::new(PI * PI / 6.0, 0.0), 1e-10);
}

#[test]
fn mpmath_fixture_integrals() {
    // mpmath.quad, mpmath 1.3.0, 40 digits
    let fx = fixtures();
    let end = |v: &Value| match v {
        Value::String(s) if s == "inf" => f64::INFINITY,
        Value::String(s) if s == "-inf" => f64::NEG_INFINITY,
        v => v.as_f64().unwrap(),
    };
    let mut seen = 0;
    for q in fx["quad"].as_array().unwrap() {
        let name = q["name"].as_str().unwrap();
        let want = C::new(
            q["value"][0].as_f64().unwrap(),
            q["value"][1].as_f64().unwrap(),
        );
        let (a, b) = (end(&q["a"]), end(&q["b"]));
        let mut f: Box<dyn FnMut(f64) -> C> = match name {
            "cos10x_expix" => Box::new(|x: f64| (10.0 * x).cos() * (I * x).exp()),
            "log1p_over_1px2" => Box::new(|x: f64| C::new(x.ln_1p() / (1.0 + x * x), 0.0)),
            "sqrt_x_log" => Box::new(|x: f64| C::new(x.sqrt() * x.ln(), 0.0)),
            "resonator_response" => Box::new(|x: f64| 1.0 / (2.0 - x * x + 0.4 * I * x)),
            "lorentzian_pair" => {
                Box::new(|x: f64| C::new(1.0 / ((x * x + 1.0) * (x * x + 4.0)), 0.0))
            }
            "bose_moment" => Box::new(|x: f64| C::new(x / x.exp_m1(), 0.0)),
            "gauss_left" => Box::new(|x: f64| C::new((-x * x).exp(), 0.0)),
            other => panic!("unknown fixture {other}"),
        };
        let mut budget = Budget::default();
        let r = integrate_infinite(&mut *f, a, b, tight(), &mut budget).unwrap();
        assert!(r.converged, "{name}");
        check(name, &r, want, 1e-9);
        seen += 1;
    }
    assert_eq!(seen, 7);
    // Closed form beside the fixture: ∫ 1/((x²+1)(x²+4)) over ℝ = π/6 (partial fractions, common practice)
    let lp = fx["quad"]
        .as_array()
        .unwrap()
        .iter()
        .find(|q| q["name"] == "lorentzian_pair")
        .unwrap();
    assert!((lp["value"][0].as_f64().unwrap() - PI / 6.0).abs() < 1e-15);
}

/// Slow reference: composite Simpson's rule with m (even) panels (common practice).
fn simpson(f: impl Fn(f64) -> C, a: f64, b: f64, m: usize) -> C {
    let h = (b - a) / m as f64;
    let mut s = f(a) + f(b);
    for k in 1..m {
        s += f(a + k as f64 * h) * if k % 2 == 1 { 4.0 } else { 2.0 };
    }
    s * h / 3.0
}

#[test]
fn adaptive_kronrod_matches_fine_simpson() {
    let f = |x: f64| (x * x).sin() * (0.5 * I * x).exp() / (1.0 + x);
    let mut b = Budget::default();
    let fast = integrate(&mut |x| f(x), 0.0, 4.0, tight(), &mut b).unwrap();
    // Simpson's error is at most (b − a)·h⁴·max|f⁗|/180 with h = 2e-5 and max|f⁗| of
    // order 1e4 here: below 1e-15, far under the 1e-12 tolerance (common practice bound).
    let slow = simpson(f, 0.0, 4.0, 200_000);
    assert!(
        (fast.value - slow).norm() < 1e-12,
        "{} vs {}",
        fast.value,
        slow
    );
    assert!(
        fast.evaluations < 5000,
        "adaptive used {} evaluations",
        fast.evaluations
    );
}

#[test]
fn nonfinite_integrand_and_budget_are_errors() {
    let mut b = Budget::default();
    // 1/(x − 0.5) with a Kronrod node exactly at the midpoint 0.5.
    let e = integrate(
        &mut |x: f64| C::new(1.0 / (x - 0.5), 0.0),
        0.0,
        1.0,
        tight(),
        &mut b,
    )
    .unwrap_err();
    assert_eq!(e, QuadError::NotFinite { at: 0.5 });
    let mut small = Budget::new(40);
    let e = integrate(
        &mut |x: f64| C::new(x.sqrt(), 0.0),
        0.0,
        1.0,
        tight(),
        &mut small,
    )
    .unwrap_err();
    assert!(matches!(e, QuadError::Budget(_)));
    assert!(integrate(
        &mut |x: f64| C::new(x, 0.0),
        0.0,
        f64::INFINITY,
        tight(),
        &mut b
    )
    .is_err());
}

#[test]
fn periodic_trapezoid_closed_form() {
    // ∫_0^{2π} dθ/(a + b cos θ) = 2π/√(a² − b²) (common practice); with t = θ/2π and a=2, b=1: 1/√3
    let mut b = Budget::default();
    let r = integrate_periodic(
        &mut |t: f64| C::new(1.0 / (2.0 + (2.0 * PI * t).cos()), 0.0),
        tight(),
        &mut b,
    )
    .unwrap();
    check("1/(2+cos)", &r, C::new(1.0 / 3f64.sqrt(), 0.0), 1e-11);
    assert!(
        r.evaluations <= 128,
        "geometric convergence: {} samples",
        r.evaluations
    );
}

#[test]
fn periodic_trapezoid_matches_fine_simpson_and_bessel_i0() {
    // Slow reference: composite Simpson with 100 000 panels (common practice) on a
    // smooth 1-periodic integrand with no closed form at hand.
    let g = |t: f64| {
        let th = 2.0 * PI * t;
        C::new(0.0, 3.0 * th).exp() * th.cos().exp() / (1.4 + th.sin())
    };
    let mut b = Budget::default();
    let fast = integrate_periodic(&mut |t| g(t), tight(), &mut b).unwrap();
    let slow = simpson(g, 0.0, 1.0, 100_000);
    let err = (fast.value - slow).norm();
    assert!(err < 1e-12, "{} vs {slow}: {err:e}", fast.value);
    assert!(
        err <= fast.error_estimate + 1e-13,
        "estimate {:e}",
        fast.error_estimate
    );
    // ∫0^1 e^{cos 2πt} dt = I₀(1) (integral representation of I₀, DLMF §10.32, from memory);
    // I₀(1) = 1.266065877752008335598… (mpmath 1.3.0 besseli(0, 1), 30 digits)
    let r = integrate_periodic(
        &mut |t: f64| C::new((2.0 * PI * t).cos().exp(), 0.0),
        tight(),
        &mut b,
    )
    .unwrap();
    check("e^cos", &r, C::new(1.266_065_877_752_008_3, 0.0), 1e-11);
}

fn cauchy(a: C) -> impl FnMut(C) -> C {
    move |z: C| 1.0 / (z - a)
}

#[test]
fn cauchy_kernel_on_every_shape() {
    // ∮ dz/(z − a) = 2πi·(winding number) (Cauchy's integral formula, common practice)
    let two_pi_i = 2.0 * PI * I;
    let a = C::new(0.3, 0.2);
    let shapes = [
        (Contour::circle(C::new(0.0, 0.0), 1.0), two_pi_i),
        (Contour::circle(C::new(3.0, 0.0), 1.0), C::new(0.0, 0.0)),
        (
            Contour::Ellipse {
                center: [0.0, 0.0],
                semi_axes: [2.0, 0.5],
                angle: 0.4,
            },
            two_pi_i,
        ),
        (
            Contour::rectangle(C::new(-1.0, -1.0), C::new(2.0, 1.5)),
            two_pi_i,
        ),
        (
            Contour::Polygon {
                vertices: vec![[0.0, 0.0], [2.0, 0.0], [2.0, 2.0], [1.0, 0.5], [0.0, 2.0]],
            },
            two_pi_i,
        ),
        (
            Contour::Polygon {
                vertices: vec![[0.0, 0.0], [0.0, 1.0], [1.0, 1.0], [1.0, 0.0]],
            },
            -two_pi_i,
        ),
    ];
    for (shape, want) in shapes {
        let mut b = Budget::default();
        let r = contour_integral(&mut cauchy(a), &shape, tight(), &mut b).unwrap();
        check(&format!("{shape:?}"), &r, want, 1e-10);
        assert_eq!(
            shape.winding_number(a).map(|w| two_pi_i * w as f64),
            Some(want)
        );
    }
}

#[test]
fn cauchy_integral_formula_for_second_derivative() {
    // ∮ e^z/z³ dz = 2πi·(e^z)''(0)/2! = πi (Cauchy's integral formula)
    let f = |z: C| z.exp() / (z * z * z);
    for shape in [
        Contour::circle(C::new(0.0, 0.0), 0.5),
        Contour::rectangle(C::new(-1.0, -2.0), C::new(3.0, 1.0)),
    ] {
        let mut b = Budget::default();
        let r = contour_integral(&mut |z| f(z), &shape, tight(), &mut b).unwrap();
        check("e^z/z^3", &r, PI * I, 1e-10);
    }
}

#[test]
fn ellipse_around_one_resonator_pole() {
    // H(s) = ω0²/(s² + 2ζω0 s + ω0²); residue at the upper pole p+ is ω0²/(p+ − p−) (simple pole, common practice)
    let (w0, zeta): (f64, f64) = (2.0, 0.1);
    let wd = w0 * (1.0 - zeta * zeta).sqrt();
    let (pp, pm) = (C::new(-zeta * w0, wd), C::new(-zeta * w0, -wd));
    let h = |s: C| w0 * w0 / ((s - pp) * (s - pm));
    let shape = Contour::Ellipse {
        center: [pp.re, pp.im],
        semi_axes: [1.0, 0.5],
        angle: 0.3,
    };
    let mut b = Budget::default();
    let r = contour_integral(&mut |s| h(s), &shape, tight(), &mut b).unwrap();
    check(
        "resonator pole",
        &r,
        2.0 * PI * I * w0 * w0 / (pp - pm),
        1e-10,
    );
    // Enclosing both poles: residues cancel (denominator degree 2 > numerator degree + 1,
    // so Res∞ = 0 and the finite residues sum to 0; residue theorem, common practice)
    let r = contour_integral(
        &mut |s| h(s),
        &Contour::circle(C::new(0.0, 0.0), 3.0),
        tight(),
        &mut b,
    )
    .unwrap();
    assert!(
        r.value.norm() <= r.error_estimate && r.error_estimate < 1e-12,
        "{} ± {:e}",
        r.value,
        r.error_estimate
    );
}

#[test]
fn singularity_on_the_contour_is_refused() {
    let mut b = Budget::default();
    // Refusals (the message is the contract; no numerical reference needed).
    // Pole at the circle's point t = 0, i.e. z = 1.
    let e = contour_integral(
        &mut cauchy(C::new(1.0, 0.0)),
        &Contour::circle(C::new(0.0, 0.0), 1.0),
        tight(),
        &mut b,
    )
    .unwrap_err();
    assert_eq!(e.kind(), residuary::error::FailureKind::OnContour);
    assert_eq!(
        e.to_string(),
        "f is not finite at 1 + 0i on the contour: a singularity lies on it; move the contour"
    );
    // Pole at the midpoint of the bottom edge of a rectangle.
    let e = contour_integral(
        &mut cauchy(C::new(0.5, 0.0)),
        &Contour::rectangle(C::new(0.0, 0.0), C::new(1.0, 1.0)),
        tight(),
        &mut b,
    )
    .unwrap_err();
    assert!(
        e.to_string().starts_with("f is not finite at 0.5 + 0i on the contour"),
        "{e}"
    );
    // Invalid shapes are refused with the contour's own advice.
    assert!(contour_integral(
        &mut cauchy(C::new(0.0, 0.0)),
        &Contour::circle(C::new(0.0, 0.0), -1.0),
        tight(),
        &mut b
    )
    .unwrap_err()
    .to_string().contains("positive"));
    let mut small = Budget::new(20);
    assert!(contour_integral(
        &mut cauchy(C::new(0.0, 0.0)),
        &Contour::circle(C::new(0.0, 0.0), 1.0),
        tight(),
        &mut small
    )
    .unwrap_err()
    .to_string().contains("budget"));
}

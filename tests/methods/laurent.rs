//! Laurent series by FFT: against handbook identities and mpmath 1.3.0 (40
//! digits) fixtures in tests/fixtures/laurent.json (generator gen_laurent.py).


use residuary::budget::Budget;
use residuary::series::laurent_fft::{
    coefficients_on_circle, laurent, Center, LaurentRequest, LaurentResult,
};
use residuary::C;
use serde_json::Value;
use std::f64::consts::PI;

fn fixtures() -> Value {
    crate::common::fixture("laurent")
}

fn case(name: &str) -> Value {
    fixtures()["laurent"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["name"] == name)
        .unwrap()
        .clone()
}

/// Reference coefficients (n, c_n) of a fixture case.
fn reference(case: &Value) -> Vec<(i64, C)> {
    case["coefficients"]
        .as_array()
        .unwrap()
        .iter()
        .map(|t| {
            (
                t[0].as_i64().unwrap(),
                C::new(t[1].as_f64().unwrap(), t[2].as_f64().unwrap()),
            )
        })
        .collect()
}

fn request(case: &Value) -> LaurentRequest {
    let center = match &case["center"] {
        Value::String(s) if s == "infinity" => Center::Infinity,
        v => Center::Point(C::new(v[0].as_f64().unwrap(), v[1].as_f64().unwrap())),
    };
    LaurentRequest {
        center,
        inner: case["inner"].as_f64().unwrap(),
        outer: case["outer"].as_f64().unwrap_or(f64::INFINITY),
        from: case["from"].as_i64().unwrap(),
        to: case["to"].as_i64().unwrap(),
    }
}

/// Every coefficient within its own error estimate, and the estimate not absurdly loose.
fn assert_matches(name: &str, result: &LaurentResult, reference: &[(i64, C)], loose: f64) {
    assert_eq!(result.coefficients.len(), reference.len(), "{name}");
    for (k, &(n, want)) in reference.iter().enumerate() {
        let (m, got) = result.coefficients[k];
        assert_eq!(m, n);
        let err = (got - want).norm();
        let est = result.errors[k];
        assert!(
            err <= est,
            "{name}: c_{n} = {got} vs {want}: error {err:e} exceeds estimate {est:e}"
        );
        assert!(
            est <= loose * (1.0 + want.norm()),
            "{name}: c_{n} estimate {est:e} too loose"
        );
        assert!(result.error_estimate >= est);
    }
}

fn run_case(name: &str, f: impl FnMut(C) -> C, known: &[C], loose: f64) -> LaurentResult {
    let c = case(name);
    let mut budget = Budget::default();
    let r = laurent(f, &request(&c), known, &mut budget).unwrap_or_else(|e| panic!("{name}: {e}"));
    assert_matches(name, &r, &reference(&c), loose);
    assert_eq!(r.samples as u64, budget.used());
    r
}

#[test]
fn exp_taylor_coefficients() {
    // DLMF 4.2.19: c_n = 1/n!
    run_case("exp", |z| z.exp(), &[], 1e-14);
}

#[test]
fn sin_and_cos_taylor_coefficients() {
    // DLMF 4.19.1, 4.19.2
    run_case("sin", |z| z.sin(), &[], 1e-14);
    run_case("cos", |z| z.cos(), &[], 1e-14);
}

#[test]
fn spot_values_from_handbook() {
    // Independent spot checks written from the identities themselves.
    let mut b = Budget::default();
    let req = LaurentRequest {
        center: Center::Point(C::new(0.0, 0.0)),
        inner: 0.0,
        outer: f64::INFINITY,
        from: 0,
        to: 7,
    };
    let r = laurent(|z: C| z.sin(), &req, &[], &mut b).unwrap();
    // DLMF 4.19.1: sin z = z − z³/6 + z⁵/120 − z⁷/5040
    assert!((r.coefficients[3].1 - C::new(-1.0 / 6.0, 0.0)).norm() < 1e-15);
    assert!((r.coefficients[7].1 - C::new(-1.0 / 5040.0, 0.0)).norm() < 1e-16);
    let req = LaurentRequest {
        outer: PI,
        from: -1,
        to: 3,
        ..req
    };
    let r = laurent(
        |z: C| z.cos() / z.sin(),
        &req,
        &[C::new(PI, 0.0), C::new(-PI, 0.0)],
        &mut b,
    )
    .unwrap();
    // DLMF 4.19.6: cot z = 1/z − z/3 − z³/45 − …
    assert!((r.coefficients[0].1 - C::new(1.0, 0.0)).norm() < 1e-13);
    assert!((r.coefficients[2].1 - C::new(-1.0 / 3.0, 0.0)).norm() < 1e-13);
    assert!((r.coefficients[4].1 - C::new(-1.0 / 45.0, 0.0)).norm() < 1e-13);
}

#[test]
fn bernoulli_numbers_from_one_over_expm1() {
    // DLMF 24.2.1: z/(e^z − 1) = Σ B_n z^n/n!, so 1/(e^z − 1) has c_m = B_{m+1}/(m+1)!
    // Singularities ±2πi lie on the outer circle |z| = 2π: allowed (open annulus).
    let known = [
        C::new(0.0, 0.0),
        C::new(0.0, 2.0 * PI),
        C::new(0.0, -2.0 * PI),
    ];
    let r = run_case("inv_expm1", |z: C| 1.0 / (z.exp() - 1.0), &known, 1e-12);
    // B_1 = −1/2 → c_0 = −1/2; B_2 = 1/6 → c_1 = 1/12 (DLMF Table 24.2.1)
    assert!((r.coefficients[1].1 - C::new(-0.5, 0.0)).norm() < 1e-14);
    assert!((r.coefficients[2].1 - C::new(1.0 / 12.0, 0.0)).norm() < 1e-14);
}

#[test]
fn cot_on_punctured_disk() {
    // DLMF 4.19.6 on 0 < |z| < π
    run_case(
        "cot",
        |z: C| z.cos() / z.sin(),
        &[C::new(0.0, 0.0), C::new(PI, 0.0), C::new(-PI, 0.0)],
        1e-12,
    );
}

#[test]
fn essential_singularity_exp_of_inverse() {
    // exp(1/z) = Σ z^{−k}/k! on |z| > 0 (DLMF 4.2.19 with z → 1/z)
    run_case(
        "exp_inv",
        |z: C| (1.0 / z).exp(),
        &[C::new(0.0, 0.0)],
        1e-13,
    );
}

#[test]
fn rational_function_on_three_annuli() {
    // 1/((z−1)(z−3)): geometric series, common practice
    let f = |z: C| 1.0 / ((z - 1.0) * (z - 3.0));
    let poles = [C::new(1.0, 0.0), C::new(3.0, 0.0)];
    // The pole z = 1 sits on the outer circle: c_n do not decay, so high n lose
    // about (1/ρ)^n on any circle ρ < 1 (Bornemann 2011); the estimate says so.
    run_case("rational_inner", f, &poles, 1e-12);
    run_case("rational_middle", f, &poles, 1e-12);
    run_case("rational_outer", f, &poles, 1e-12);
}

#[test]
fn around_infinity() {
    // z²/(z−2) = z + 2 + 4/z + 8/z² + … (geometric series, common practice); Res∞ = −c_{−1} = −4
    let r = run_case(
        "z2_over_z_minus_2",
        |z: C| z * z / (z - 2.0),
        &[C::new(2.0, 0.0)],
        1e-12,
    );
    let c_minus_1 = r.coefficients.iter().find(|t| t.0 == -1).unwrap().1;
    assert!((-c_minus_1 - C::new(-4.0, 0.0)).norm() < 1e-12);
    // exp(1/z) = 1 + 1/z + 1/(2z²) + … around infinity; Res∞ = −1 (DLMF 4.2.19)
    let r = run_case(
        "exp_inv_at_infinity",
        |z: C| (1.0 / z).exp(),
        &[C::new(0.0, 0.0)],
        1e-13,
    );
    let c_minus_1 = r.coefficients.iter().find(|t| t.0 == -1).unwrap().1;
    assert!((c_minus_1 - C::new(1.0, 0.0)).norm() < 1e-13);
}

#[test]
fn damped_resonator_moments() {
    // H(s) = ω0²/(s² + 2ζω0 s + ω0²), Taylor at 0 vs mpmath.taylor (mpmath 1.3.0, 40 digits)
    let c = case("resonator");
    let (w0, zeta) = (c["omega0"].as_f64().unwrap(), c["zeta"].as_f64().unwrap());
    let poles: Vec<C> = c["poles"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| C::new(p[0].as_f64().unwrap(), p[1].as_f64().unwrap()))
        .collect();
    let h = move |s: C| w0 * w0 / (s * s + 2.0 * zeta * w0 * s + w0 * w0);
    // Coefficients grow like |pole|^{−n} = 2^{−n}; allow estimates relative to size 1.
    let r = run_case("resonator", h, &poles, 1e-10);
    // DC gain H(0) = ω0²/ω0² = 1 (common practice)
    assert!((r.coefficients[0].1 - C::new(1.0, 0.0)).norm() < 1e-15);
}

#[test]
fn negative_and_nonnegative_ranges_use_different_circles() {
    // Property: in the middle annulus 1 < |z| < 3, n ≥ 0 prefer a large circle and n < 0 a
    // small one (rounding is amplified by ρ^{−n}; Bornemann 2011, Found. Comput. Math.).
    let c = case("rational_middle");
    let mut b = Budget::default();
    let r = laurent(
        |z: C| 1.0 / ((z - 1.0) * (z - 3.0)),
        &request(&c),
        &[],
        &mut b,
    )
    .unwrap();
    let radius = |n: i64| r.radius_used[r.coefficients.iter().position(|t| t.0 == n).unwrap()];
    assert!(
        radius(10) > radius(-10),
        "{} vs {}",
        radius(10),
        radius(-10)
    );
}

#[test]
fn refuses_an_annulus_containing_a_known_singularity() {
    let mut b = Budget::default();
    let req = LaurentRequest {
        center: Center::Point(C::new(1.0, 0.0)),
        inner: 0.5,
        outer: 3.0,
        from: -2,
        to: 2,
    };
    let e = laurent(|z: C| 1.0 / (z - 2.0), &req, &[C::new(2.0, 0.0)], &mut b).unwrap_err().to_string();
    assert_eq!(
        e,
        "the annulus 0.5 < |z − 1| < 3 contains a singularity at 2 + 0i; choose r2 < 1 or r1 > 1"
    );
    assert_eq!(b.used(), 0, "refused before sampling");
    let req = LaurentRequest {
        center: Center::Infinity,
        inner: 1.0,
        outer: f64::INFINITY,
        from: -3,
        to: 1,
    };
    let e = laurent(|z: C| 1.0 / (z - 2.0), &req, &[C::new(2.0, 0.0)], &mut b).unwrap_err().to_string();
    assert!(
        e.to_string().contains("singularity at 2 + 0i") && e.to_string().contains("r1 > 2"),
        "{e}"
    );
}

#[test]
fn detects_an_unannounced_singularity_between_circles() {
    // 1/(z − 2) on 0 < |z| < 10 without telling: circles on both sides of |z| = 2 disagree.
    let mut b = Budget::default();
    let req = LaurentRequest {
        center: Center::Point(C::new(0.0, 0.0)),
        inner: 0.0,
        outer: 10.0,
        from: -3,
        to: 3,
    };
    let e = laurent(|z: C| 1.0 / (z - 2.0), &req, &[], &mut b).unwrap_err().to_string();
    assert!(e.to_string().contains("singularity"), "{e}");
}

#[test]
fn rejects_bad_requests() {
    let mut b = Budget::default();
    let base = LaurentRequest {
        center: Center::Point(C::new(0.0, 0.0)),
        inner: 0.0,
        outer: 1.0,
        from: 0,
        to: 3,
    };
    let f = |z: C| z.exp();
    assert!(laurent(
        f,
        &LaurentRequest {
            inner: -1.0,
            ..base
        },
        &[],
        &mut b
    )
    .unwrap_err().to_string()
    .contains("inner radius"));
    assert!(
        laurent(f, &LaurentRequest { inner: 2.0, ..base }, &[], &mut b)
            .unwrap_err().to_string()
            .contains("outer radius")
    );
    assert!(laurent(
        f,
        &LaurentRequest {
            from: 0,
            to: 5000,
            ..base
        },
        &[],
        &mut b
    )
    .unwrap_err().to_string()
    .contains("at most"));
    assert!(laurent(
        f,
        &LaurentRequest {
            from: 3,
            to: 0,
            ..base
        },
        &[],
        &mut b
    )
    .unwrap_err().to_string()
    .contains("must not exceed"));
    let nan = laurent(|_z: C| C::new(f64::NAN, 0.0), &base, &[], &mut b).unwrap_err().to_string();
    assert!(
        nan.contains("not finite") && nan.contains("sampling circle"),
        "{nan}"
    );
}

#[test]
fn budget_exhaustion_is_an_error() {
    let mut b = Budget::new(100);
    let req = LaurentRequest {
        center: Center::Point(C::new(0.0, 0.0)),
        inner: 0.0,
        outer: f64::INFINITY,
        from: 0,
        to: 10,
    };
    let e = laurent(|z: C| z.exp(), &req, &[], &mut b).unwrap_err().to_string();
    assert!(e.to_string().contains("budget"), "{e}");
}

/// Slow reference: the O(N²) discrete Fourier sum c_n = (1/N) Σ f(a+ρω^k) ω^{−nk} ρ^{−n}.
fn naive_dft(f: impl Fn(C) -> C, a: C, rho: f64, n_samples: usize, from: i64, to: i64) -> Vec<C> {
    (from..=to)
        .map(|n| {
            let mut s = C::new(0.0, 0.0);
            for k in 0..n_samples {
                let theta = 2.0 * PI * k as f64 / n_samples as f64;
                let phase = 2.0 * PI * ((n * k as i64).rem_euclid(n_samples as i64)) as f64
                    / n_samples as f64;
                s += f(a + C::from_polar(rho, theta)) * C::from_polar(1.0, -phase);
            }
            s / n_samples as f64 / rho.powi(n as i32)
        })
        .collect()
}

#[test]
fn fft_kernel_matches_naive_dft() {
    // Slow reference: the O(N²) sum above on the same samples (must agree to rounding).
    let f = |z: C| (z.sin() + 1.0) / ((z - C::new(0.3, 2.0)) * (z + 0.1));
    let (a, rho, n) = (C::new(0.2, -0.1), 0.8, 256);
    let mut b = Budget::default();
    let fast = coefficients_on_circle(&mut |z| f(z), a, rho, n, -20, 20, &mut b).unwrap();
    let slow = naive_dft(f, a, rho, n, -20, 20);
    for (k, (x, y)) in fast.iter().zip(&slow).enumerate() {
        let scale = rho.powi(-(k as i32 - 20));
        assert!(
            (x - y).norm() <= 1e-13 * scale,
            "n = {}: {x} vs {y}",
            k as i64 - 20
        );
    }
}

#[test]
fn high_orders_next_to_a_boundary_pole_stay_relatively_accurate() {
    // 1/(z − 2) = −Σ z^n / 2^{n+1} on |z| < 2 (geometric series, common practice).
    // Without a circle close to |z| = 2, c_500 would lose (2/ρ)^500 (Bornemann 2011).
    let mut b = Budget::default();
    let req = LaurentRequest {
        center: Center::Point(C::new(0.0, 0.0)),
        inner: 0.0,
        outer: 2.0,
        from: 0,
        to: 500,
    };
    let r = laurent(|z: C| 1.0 / (z - 2.0), &req, &[C::new(2.0, 0.0)], &mut b).unwrap();
    for (k, &(n, c)) in r.coefficients.iter().enumerate() {
        let want = C::new(-(2f64.powi(-(n as i32) - 1)), 0.0);
        let err = (c - want).norm();
        assert!(
            err <= r.errors[k],
            "c_{n}: {c} vs {want}, error {err:e} > {:e}",
            r.errors[k]
        );
        assert!(
            r.errors[k] <= 1e-10 * want.norm(),
            "c_{n}: estimate {:e} vs |c| {:e}",
            r.errors[k],
            want.norm()
        );
    }
}

//! The `inverse_z` task through the public JSON doorway, against z-transform
//! tables, handbook series, a direct recursion of the difference equation, and
//! mpmath fixtures (tests/fixtures/gen_inverse_z.py).


use crate::common::{ok_response as ok, error_message as err, floats};
use residuary::api::run_json_text;
use serde_json::{json, Value};




/// Check x against `want(n)`: every value within its error estimate (plus a
/// rounding allowance of 4ε relative), every estimate small, and the
/// independent ways present for rational X agreeing with the truth.
fn check(r: &Value, ns: &[u64], want: impl Fn(u64) -> f64, max_rel_error: f64) {
    let x = floats(&r["x"]);
    let e = floats(&r["error_estimates"]);
    assert_eq!(x.len(), ns.len());
    for (i, &n) in ns.iter().enumerate() {
        let truth = want(n);
        let scale = truth.abs().max(1e-300);
        let d = (x[i] - truth).abs();
        assert!(
            d <= e[i] + 4.0 * f64::EPSILON * scale,
            "n={n}: x={} truth={truth} err est={}",
            x[i],
            e[i]
        );
        assert!(
            e[i] <= max_rel_error * truth.abs() + 1e-14 * max_abs(&x),
            "n={n}: estimate {} too large for {truth}",
            e[i]
        );
        if let Some(res) = r["by_residues"].as_array() {
            assert!((res[i].as_f64().unwrap() - truth).abs() <= 1e-10 * scale.max(max_abs(&x)));
        }
        if let Some(c) = r["by_contour"][i].as_f64() {
            let ce = r["contour_error_estimates"][i].as_f64().unwrap();
            assert!(
                (c - truth).abs() <= ce + 4.0 * f64::EPSILON * scale,
                "contour n={n}: {c} vs {truth} (est {ce})"
            );
        }
    }
}

fn max_abs(x: &[f64]) -> f64 {
    x.iter().fold(0.0, |m, v| m.max(v.abs()))
}

fn range(to: u64) -> Vec<u64> {
    (0..=to).collect()
}

#[test]
fn geometric_sequence() {
    // z/(z − a) ↔ a^n u[n] (Oppenheim & Schafer, Discrete-Time Signal Processing, Table 3.1, from memory)
    for a in [0.5f64, -0.8, 0.95] {
        let mut ns = range(30);
        ns.extend([100, 400]);
        let r = ok(json!({"task": "inverse_z", "X": "z/(z - a)", "params": {"a": a}, "n": ns}));
        check(&r, &ns, |n| a.powi(n as i32), 1e-11);
        assert_eq!(r["method"], "rational");
        assert!((r["roc"]["outer_radius_greater_than"].as_f64().unwrap() - a.abs()).abs() < 1e-14);
        assert!(r["max_discrepancy"].as_f64().unwrap() < 1e-13);
    }
    let r = ok(json!({"task": "inverse_z", "X": "z/(z - 0.5)", "n": [0, 1]}));
    assert_eq!(r["closed_form"], "0.5^n");
    let r = ok(json!({"task": "inverse_z", "X": "z/(z + 0.5)", "n": [0, 1]}));
    assert_eq!(r["closed_form"], "(-0.5)^n");
}

#[test]
fn negative_powers_form() {
    // 1/(1 − a z^{-1}) ↔ a^n u[n] (Oppenheim & Schafer, Table 3.1, from memory)
    let ns = range(40);
    let r = ok(json!({"task": "inverse_z", "X": "1/(1 - a/z)", "params": {"a": 0.9}, "n": ns}));
    check(&r, &ns, |n| 0.9f64.powi(n as i32), 1e-12);
    assert_eq!(r["closed_form"], "0.9^n");
}

#[test]
fn ramp_times_geometric() {
    // a z/(z − a)² ↔ n a^n u[n] (Oppenheim & Schafer, Table 3.1, from memory)
    let a = 0.7f64;
    let mut ns = range(30);
    ns.push(300);
    let r = ok(json!({"task": "inverse_z", "X": "a*z/(z - a)^2", "params": {"a": a}, "n": ns}));
    check(&r, &ns, |n| n as f64 * a.powi(n as i32), 1e-10);
    assert_eq!(r["closed_form"], "n*0.7^n");
    assert_eq!(r["poles"][0]["order"], 2);
}

#[test]
fn damped_cosine_and_sine() {
    // z(z − r cos θ)/(z² − 2r cos θ z + r²) ↔ r^n cos(nθ) u[n];
    // r sin θ z/(z² − 2r cos θ z + r²) ↔ r^n sin(nθ) u[n]
    // (Oppenheim & Schafer, Table 3.1, from memory)
    let (rr, t) = (0.9f64, 0.6f64);
    let ns = range(60);
    let den = "(z^2 - 2*r*cos(t)*z + r^2)";
    let r = ok(
        json!({"task": "inverse_z", "X": format!("z*(z - r*cos(t))/{den}"), "params": {"r": rr, "t": t}, "n": ns}),
    );
    check(&r, &ns, |n| rr.powi(n as i32) * (n as f64 * t).cos(), 1e-11);
    assert_eq!(r["closed_form"], "0.9^n*cos(0.6*n)");
    let r = ok(
        json!({"task": "inverse_z", "X": format!("r*sin(t)*z/{den}"), "params": {"r": rr, "t": t}, "n": ns}),
    );
    check(&r, &ns, |n| rr.powi(n as i32) * (n as f64 * t).sin(), 1e-10);
    assert_eq!(r["closed_form"], "0.9^n*sin(0.6*n)");
}

/// y[n] = x[n] + 1.2 y[n−1] − 0.72 y[n−2] driven by the unit impulse: the slow,
/// obviously correct reference (the difference equation itself).
fn resonator_by_recursion(count: usize) -> Vec<f64> {
    let mut y = vec![0.0f64; count];
    for n in 0..count {
        let input = if n == 0 { 1.0 } else { 0.0 };
        let y1 = if n >= 1 { y[n - 1] } else { 0.0 };
        let y2 = if n >= 2 { y[n - 2] } else { 0.0 };
        y[n] = input + 1.2 * y1 - 0.72 * y2;
    }
    y
}

#[test]
fn resonator_impulse_response_matches_difference_equation() {
    // H(z) = 1/(1 − 1.2 z^{-1} + 0.72 z^{-2}): impulse response = direct recursion (common practice)
    let reference = resonator_by_recursion(1001);
    let mut ns = range(200);
    ns.push(1000);
    let r = ok(json!({"task": "inverse_z", "X": "1/(1 - 1.2/z + 0.72/z^2)", "n": ns}));
    let x = floats(&r["x"]);
    let e = floats(&r["error_estimates"]);
    for (i, &n) in ns.iter().enumerate() {
        let want = reference[n as usize];
        let tol = 1e-13 * 0.8485f64.powi(n as i32).max(1e-300) + 1e-15 * want.abs();
        assert!(
            (x[i] - want).abs() <= e[i] + tol,
            "n={n}: {} vs {want}",
            x[i]
        );
        assert!(e[i] < 1e-12, "n={n}");
    }
    // Poles 0.6 ± 0.6i: r = 0.6√2, θ = π/4; x[n] = r^n (cos nπ/4 + sin nπ/4) (partial fractions by hand)
    assert_eq!(
        r["closed_form"],
        "0.848528137424^n*(cos(0.785398163397*n) + sin(0.785398163397*n))"
    );
    assert!(r["max_discrepancy"].as_f64().unwrap() < 1e-13);
}

#[test]
fn exp_of_inverse_z_gives_inverse_factorials() {
    // exp(1/z) = Σ z^{-n}/n! ↔ 1/n! (DLMF 4.2.19)
    let ns = range(25);
    let r = ok(json!({"task": "inverse_z", "X": "exp(1/z)", "n": ns}));
    let mut fact = 1.0f64;
    let want: Vec<f64> = ns
        .iter()
        .map(|&n| {
            if n > 0 {
                fact *= n as f64;
            }
            1.0 / fact
        })
        .collect();
    check(&r, &ns, |n| want[n as usize], 1e-11);
    assert_eq!(r["method"], "contour");
    assert!(r["closed_form"].is_null());
    assert!(r["by_residues"].is_null());
}

#[test]
fn mpmath_fixtures() {
    let fx = crate::common::fixture("inverse_z");
    for case in fx["cases"].as_array().unwrap() {
        let name = case["name"].as_str().unwrap();
        let ns: Vec<u64> = case["n"]
            .as_array()
            .unwrap()
            .iter()
            .map(|v| v.as_u64().unwrap())
            .collect();
        let want: Vec<Option<f64>> = case["x"]
            .as_array()
            .unwrap()
            .iter()
            .map(|v| {
                if v.is_null() {
                    None
                } else {
                    Some(crate::common::real(v))
                }
            })
            .collect();
        // mpmath 1.3.0, 40 digits (see the case's "source")
        let r = ok(json!({"task": "inverse_z", "X": case["X"], "n": ns}));
        let x = floats(&r["x"]);
        let e = floats(&r["error_estimates"]);
        let scale = max_abs(&x);
        for i in 0..ns.len() {
            let Some(w) = want[i] else { continue };
            let d = (x[i] - w).abs();
            // The fixture's own 40 digits: an exact zero may be stored as ~1e-42.
            assert!(
                d <= e[i] + 4.0 * f64::EPSILON * w.abs() + 1e-39 * scale,
                "{name} n={}: {} vs {w} (est {})",
                ns[i],
                x[i],
                e[i]
            );
            assert!(
                e[i] <= 1e-11 * scale,
                "{name} n={}: estimate {}",
                ns[i],
                e[i]
            );
        }
    }
}

#[test]
fn delayed_impulses_from_a_pole_at_the_origin() {
    // X = 1 + 2 z^{-1} + 3 z^{-3} ↔ δ[n] + 2δ[n−1] + 3δ[n−3] (definition of the z-transform)
    let ns = range(6);
    let r = ok(json!({"task": "inverse_z", "X": "1 + 2/z + 3/z^3", "n": ns}));
    let want = [1.0, 2.0, 0.0, 3.0, 0.0, 0.0, 0.0];
    check(&r, &ns, |n| want[n as usize], 1e-12);
    assert_eq!(r["closed_form"], "δ[n] + 2*δ[n-1] + 3*δ[n-3]");
}

#[test]
fn common_factor_does_not_excite_a_cancelled_mode() {
    // (z − 2)/((z − 2)(z − 0.5)) = 1/(z − 0.5) ↔ 0.5^{n−1} u[n−1] (time shift, from memory)
    let ns = vec![0, 1, 2, 60, 200];
    let r = ok(json!({"task": "inverse_z", "X": "(z - 2)/((z - 2)*(z - 0.5))", "n": ns}));
    check(
        &r,
        &ns,
        |n| {
            if n == 0 {
                0.0
            } else {
                0.5f64.powi(n as i32 - 1)
            }
        },
        1e-12,
    );
    assert_eq!(r["poles"].as_array().unwrap().len(), 1);
}

#[test]
fn complex_coefficients_report_imaginary_parts() {
    // z/(z − 0.5i) ↔ (0.5i)^n (Oppenheim & Schafer, Table 3.1 with complex a, from memory)
    let ns = range(8);
    let r = ok(json!({"task": "inverse_z", "X": "z/(z - 0.5*i)", "n": ns}));
    let x = floats(&r["x"]);
    let xi = floats(&r["x_imag"]);
    for &n in &ns {
        let w = residuary::C::new(0.0, 0.5).powi(n as i32);
        assert!(
            (x[n as usize] - w.re).abs() < 1e-15 && (xi[n as usize] - w.im).abs() < 1e-15,
            "n={n}"
        );
    }
    assert!(r["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .any(|w| w.as_str().unwrap().contains("x_imag")));
    let r = ok(json!({"task": "inverse_z", "X": "z/(z - 0.5)", "n": [0, 1]}));
    assert!(r.get("x_imag").is_none());
}

#[test]
fn large_n_and_unstable_systems() {
    // z/(z − a) ↔ a^n at n = 10^6 (Table 3.1, from memory); a^n computed as exp(n ln a)
    let a = 0.999999f64;
    let r = ok(json!({"task": "inverse_z", "X": "z/(z - a)", "params": {"a": a}, "n": [1000000]}));
    let want = (1e6 * a.ln()).exp();
    let x = floats(&r["x"]);
    let e = floats(&r["error_estimates"]);
    assert!(
        (x[0] - want).abs() <= e[0] + 1e-15,
        "{} vs {want} est {}",
        x[0],
        e[0]
    );
    assert!(e[0] < 1e-8 * want);
    assert!(r["by_contour"][0].is_null());
    // z/(z − 1.1) ↔ 1.1^n: grows, and says so (Table 3.1, from memory)
    let r = ok(json!({"task": "inverse_z", "X": "z/(z - 1.1)", "n": [0, 10, 50]}));
    check(&r, &[0, 10, 50], |n| 1.1f64.powi(n as i32), 1e-12);
    assert!(r["warnings"].to_string().contains("unstable"));
    // z/(z − 1) ↔ u[n]; z/(z − 1)² ↔ n u[n] (Oppenheim & Schafer, Table 3.1, from memory)
    let r = ok(json!({"task": "inverse_z", "X": "z/(z - 1)", "n": [0, 7]}));
    check(&r, &[0, 7], |_| 1.0, 1e-12);
    assert_eq!(r["closed_form"], "1");
    assert!(r["warnings"].to_string().contains("marginally"));
    let r = ok(json!({"task": "inverse_z", "X": "z/(z - 1)^2", "n": [0, 1, 9, 1000]}));
    check(&r, &[0, 1, 9, 1000], |n| n as f64, 1e-10);
    assert_eq!(r["closed_form"], "n");
}

#[test]
fn refusals_say_what_to_do() {
    assert!(err(json!({"task": "inverse_z", "X": "z/(z - 0.5)", "n": [-1]})).contains("≥ 0"));
    assert!(err(json!({"task": "inverse_z", "X": "z/(z - 0.5)", "n": [1.5]})).contains("integers"));
    assert!(
        err(json!({"task": "inverse_z", "X": "z/(z - 0.5)", "n": [2e6]})).contains("too large")
    );
    assert!(err(json!({"task": "inverse_z", "X": "z/(z - 0.5)", "n": []})).contains("empty"));
    let many: Vec<u64> = (0..10_001).collect();
    assert!(err(json!({"task": "inverse_z", "X": "z/(z - 0.5)", "n": many})).contains("at most"));
    assert!(err(json!({"task": "inverse_z", "X": "z^2/(z - 0.5)", "n": [0]})).contains("causal"));
    assert!(
        err(json!({"task": "inverse_z", "X": "exp(z)", "n": [0, 1]})).contains("positive powers")
    );
    let (text, is_error) =
        run_json_text(&json!({"task": "inverse_z", "X": "z/(z - ", "n": [0]}).to_string());
    assert!(
        is_error && text.contains("in \\\"X\\\"") && text.contains("\"span\":[6,6]"),
        "{text}"
    );
}

/// `c0 + c1/z + c2/z^2 + …` as expression text, each double written exactly (17 digits).
fn in_inverse_powers(c: &[f64]) -> String {
    let mut s = format!("({:?}", c[0]);
    for (k, v) in c.iter().enumerate().skip(1) {
        s += &format!(" {} {:?}/z^{k}", if *v < 0.0 { "-" } else { "+" }, v.abs());
    }
    s + ")"
}

#[test]
fn difference_equation_matches_scipy_lfilter() {
    // scipy 1.17.1 signal.lfilter on a unit impulse (tests/fixtures/gen_inverse_z_lfilter.py):
    // the same difference equation in double precision, so equal up to the rounding of each
    // side; the estimate bounds ours, and lfilter's rounding is of the same size (so 2×).
    let fx = crate::common::fixture("inverse_z_lfilter");
    for case in fx["cases"].as_array().unwrap() {
        let name = case["name"].as_str().unwrap();
        let coeffs = |key: &str| -> Vec<f64> { case[key].as_array().unwrap().iter().map(crate::common::real).collect() };
        let (b, a) = (coeffs("b"), coeffs("a"));
        let ns: Vec<u64> = case["n"].as_array().unwrap().iter().map(|v| v.as_u64().unwrap()).collect();
        let want = coeffs("x");
        let peak = crate::common::real(&case["max_abs"]);
        let x_text = format!("{}/{}", in_inverse_powers(&b), in_inverse_powers(&a));
        let r = ok(json!({"task": "inverse_z", "X": x_text, "n": ns}));
        let x = floats(&r["x"]);
        let e = floats(&r["error_estimates"]);
        let by_recurrence = floats(&r["by_long_division"]);
        let bounds = floats(&r["long_division_error_estimates"]);
        for i in 0..ns.len() {
            let d = (by_recurrence[i] - want[i]).abs();
            assert!(d <= 2.0 * bounds[i], "{name} n={}: {} vs lfilter {} (bound {:e})", ns[i], by_recurrence[i], want[i], bounds[i]);
            // A worst-case bound: about 10³ above the true difference near the peak, still useful.
            assert!(bounds[i] < 1e-10 * peak, "{name} n={}: bound {:e}", ns[i], bounds[i]);
            assert!((x[i] - want[i]).abs() <= e[i] + 2.0 * bounds[i], "{name} n={}", ns[i]);
        }
        // Recurrence and residues agree, so the costly contour was not run.
        assert!(r["by_contour"].as_array().unwrap().iter().all(|v| v.is_null()), "{name}");
    }
}

#[test]
fn far_n_by_the_difference_equation_and_the_residues() {
    // z²/((z − a)(z + 0.5)) ↔ (a^{n+1} − (−0.5)^{n+1})/(a + 0.5) (partial fractions, by
    // construction), a^{n+1} as exp((n+1) ln a); a = 0.99999 keeps x[10⁶] ≈ 3e-5.
    let a = 0.99999f64;
    let ns = vec![0u64, 1, 2, 10, 1000, 100_000, 999_999, 1_000_000];
    let r = ok(json!({"task": "inverse_z", "X": "z^2/((z - a)*(z + 0.5))", "params": {"a": a}, "n": ns}));
    let want = |n: u64| (((n + 1) as f64 * a.ln()).exp() - (-0.5f64).powi(n as i32 + 1)) / (a + 0.5);
    check(&r, &ns, want, 1e-8);
    let bounds = floats(&r["long_division_error_estimates"]);
    let by_recurrence = floats(&r["by_long_division"]);
    for (i, &n) in ns.iter().enumerate() {
        assert!((by_recurrence[i] - want(n)).abs() <= bounds[i] + 4.0 * f64::EPSILON * want(n), "n={n}");
    }
}

#[test]
fn a_pole_beside_an_essential_point_is_found() {
    // e^{0.5/z}/(1 − 0.3/z): x[n] = Σ_{k=0}^{n} (0.5^k/k!)·0.3^{n−k}, the Cauchy product of
    // the two series at infinity (by construction); ROC |z| > 0.3 (the pole at 0.3).
    let mut ns = range(30);
    ns.push(60);
    let r = ok(json!({"task": "inverse_z", "X": "exp(0.5/z)/(1 - 0.3/z)", "n": ns}));
    let want = |n: u64| {
        let (mut term, mut sum) = (1.0f64, 0.0f64);
        for k in 0..=n {
            if k > 0 {
                term *= 0.5 / k as f64;
            }
            sum += term * 0.3f64.powi((n - k) as i32);
        }
        sum
    };
    check(&r, &ns, want, 1e-10);
    assert_eq!(r["method"], "contour");
    assert!((r["roc"]["outer_radius_greater_than"].as_f64().unwrap() - 0.3).abs() < 1e-12);
    let poles = r["poles"].as_array().unwrap();
    assert_eq!(poles.len(), 1);
    assert!((poles[0]["at"][0].as_f64().unwrap() - 0.3).abs() < 1e-12 && poles[0]["order"] == 1);
    assert!(r["warnings"].to_string().contains("denominators vanish"));
}

#[test]
fn seeded_random_rational_family_stays_within_its_estimates() {
    // X = Σ_k c_k z/(z − p_k) ↔ Σ_k c_k p_k^n (z-transform table and linearity, by
    // construction), with real poles and conjugate pairs (conjugate c) so x is real.
    let mut state = 0x2545_f491_4f6c_dd1du64;
    let mut uniform = move || {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        (state >> 11) as f64 / (1u64 << 53) as f64
    };
    for case in 0..24 {
        let mut poles: Vec<(f64, f64, f64, f64)> = Vec::new(); // (re p, im p, re c, im c)
        for _ in 0..1 + (uniform() * 3.0) as usize {
            let (r, t) = (0.2 + 0.75 * uniform(), std::f64::consts::PI * uniform());
            let (cr, ci) = (2.0 * uniform() - 1.0, 2.0 * uniform() - 1.0);
            if uniform() < 0.4 {
                let sign = if t < 1.5 { 1.0 } else { -1.0 };
                poles.push((sign * r, 0.0, cr, 0.0));
            } else {
                poles.push((r * t.cos(), r * t.sin(), cr, ci));
                poles.push((r * t.cos(), -r * t.sin(), cr, -ci));
            }
        }
        let terms: Vec<String> = poles
            .iter()
            .map(|&(pr, pi, cr, ci)| format!("({cr:?} + {ci:?}*i)*z/(z - ({pr:?} + {pi:?}*i))"))
            .collect();
        let mut ns = range(40);
        ns.extend([150, 600]);
        let r = ok(json!({"task": "inverse_z", "X": terms.join(" + "), "n": ns}));
        let x = floats(&r["x"]);
        let e = floats(&r["error_estimates"]);
        for (i, &n) in ns.iter().enumerate() {
            let (mut want, mut size) = (residuary::C::new(0.0, 0.0), 0.0f64);
            for &(pr, pi, cr, ci) in &poles {
                let t = residuary::C::new(cr, ci) * residuary::C::new(pr, pi).powi(n as i32);
                want += t;
                size += t.norm();
            }
            // The truth's own rounding: a few ε of the summed term sizes (n ε from powi).
            let slack = (8.0 + n as f64) * f64::EPSILON * size;
            assert!(
                (x[i] - want.re).abs() <= e[i] + slack,
                "case {case} n={n}: {} vs {} (estimate {:e}); X = {}",
                x[i],
                want.re,
                e[i],
                terms.join(" + ")
            );
            assert!(e[i] < 1e-9 * (1.0 + size), "case {case} n={n}: estimate {:e}", e[i]);
        }
    }
}

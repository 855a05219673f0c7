//! Evaluator tests: against num-complex formulas, mpmath fixtures, handbook
//! identities, and block/scalar and derivative consistency.

use residuary::expr::Function;
use residuary::special::{digamma, gamma};
use residuary::C;
use serde_json::Value;

fn f(src: &str) -> Function {
    Function::compile(src, "z", &[]).unwrap_or_else(|e| panic!("{src}: {e}"))
}

fn c(v: &Value) -> C {
    C::new(v[0].as_f64().unwrap(), v[1].as_f64().unwrap())
}

fn fixture() -> Value {
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/fixtures/expr.json"
    ))
    .unwrap();
    serde_json::from_str(&text).unwrap()
}

fn rel(a: C, b: C) -> f64 {
    (a - b).norm() / b.norm().max(f64::MIN_POSITIVE)
}

fn assert_close(got: C, want: C, tol: f64, what: &str) {
    let e = rel(got, want);
    assert!(
        e <= tol,
        "{what}: got {got}, want {want}, relative error {e:e} > {tol:e}"
    );
}

const POINTS: [(f64, f64); 6] = [
    (0.3, 0.4),
    (-1.7, 2.2),
    (2.5, -0.6),
    (-0.2, -3.1),
    (4.0, 1.0),
    (0.9, 0.0),
];

#[test]
fn matches_num_complex_formulas() {
    // Reference: the same formula written by hand with the num-complex crate's
    // functions (a general-purpose library from crates.io, num-complex 0.4).
    type F = fn(C) -> C;
    let cases: Vec<(&str, F)> = vec![
        ("(z+1)/(z^2+4)", |z| (z + 1.0) / (z * z + 4.0)),
        ("2z^3 - 3z + 1", |z| z * z * z * 2.0 - z * 3.0 + 1.0),
        ("exp(-z)*sin(2z)", |z| (-z).exp() * (z * 2.0).sin()),
        ("log(z)+sqrt(z)", |z| z.ln() + z.sqrt()),
        ("cosh(z)/sinh(z)", |z| z.cosh() / z.sinh()),
        ("z^-2", |z| 1.0 / (z * z)),
        ("z^2.5", |z| z.powf(2.5)),
        ("z^(1+i)", |z| z.powc(C::new(1.0, 1.0))),
        ("3^z", |z| (z * 3f64.ln()).exp()),
        ("(z+1)^(z-1)", |z| (z + 1.0).powc(z - 1.0)),
        ("-z^2", |z| -(z * z)),
        ("asin(z)+acos(z)*atan(z)", |z| {
            z.asin() + z.acos() * z.atan()
        }),
        ("e^(i*pi*z)", |z| {
            (C::new(0.0, std::f64::consts::PI) * z).exp()
        }),
        ("1/(z-0.5)^3", |z| 1.0 / ((z - 0.5) * (z - 0.5) * (z - 0.5))),
    ];
    for (src, g) in cases {
        let fun = f(src);
        for (x, y) in POINTS {
            let z = C::new(x, y);
            assert_close(fun.eval(z), g(z), 1e-13, src);
        }
    }
}

#[test]
fn parameters_are_substituted() {
    let params = vec![
        ("wn".to_string(), C::new(2.0, 0.0)),
        ("zeta".to_string(), C::new(0.3, 0.0)),
    ];
    let h = Function::compile("wn^2/(s^2+2*zeta*wn*s+wn^2)", "s", &params).unwrap();
    let s = C::new(0.1, 1.7);
    // wn = 2, ζ = 0.3 substituted by hand: 4/(s² + 1.2 s + 4)
    let want = 4.0 / (s * s + s * 1.2 + 4.0);
    assert_close(h.eval(s), want, 1e-15, "second-order low-pass");
    assert_eq!(h.var(), "s");
    assert_eq!(h.source(), "wn^2/(s^2+2*zeta*wn*s+wn^2)");
}

#[test]
fn handbook_identities() {
    // DLMF 5.4.6: Γ(1/2) = √π
    assert_close(
        f("gamma(z)").eval(C::new(0.5, 0.0)),
        C::new(std::f64::consts::PI.sqrt(), 0.0),
        1e-15,
        "Γ(1/2)",
    );
    // DLMF 5.4.1: Γ(n+1) = n!
    let mut fact = 1.0;
    for n in 1..=20 {
        fact *= n as f64;
        assert_close(
            gamma(C::new(n as f64 + 1.0, 0.0)),
            C::new(fact, 0.0),
            1e-14,
            "n!",
        );
    }
    // Euler's formula: e^{iπ} = −1 (common practice)
    let v = f("e^(i*pi)").eval(C::new(0.0, 0.0));
    assert!((v - C::new(-1.0, 0.0)).norm() < 1e-15, "{v}");
    // sin² + cos² = 1 (common practice)
    let g = f("sin(z)^2 + cos(z)^2");
    for (x, y) in POINTS {
        assert_close(g.eval(C::new(x, y)), C::new(1.0, 0.0), 1e-13, "sin^2+cos^2");
    }
    // 0^positive = 0, z^0 = 1 (common practice)
    assert_eq!(f("z^3").eval(C::new(0.0, 0.0)), C::new(0.0, 0.0));
    assert_eq!(f("z^2.5").eval(C::new(0.0, 0.0)), C::new(0.0, 0.0));
    assert_eq!(f("z^0").eval(C::new(0.0, 0.0)), C::new(1.0, 0.0));
    // 2^3^2 = 2^9 = 512 (right-associative, common practice)
    assert_eq!(f("2^3^2").eval(C::new(0.0, 0.0)), C::new(512.0, 0.0));
}

#[test]
fn gamma_poles_are_not_finite() {
    // Γ and ψ have poles at 0, −1, −2, … (DLMF §5.2(i), from memory)
    for n in 0..6 {
        let v = gamma(C::new(-(n as f64), 0.0));
        assert!(!(v.re.is_finite() && v.im.is_finite()), "Γ(-{n}) = {v}");
        let d = digamma(C::new(-(n as f64), 0.0));
        assert!(!(d.re.is_finite() && d.im.is_finite()));
    }
}

#[test]
fn gamma_and_digamma_match_mpmath() {
    // mpmath 1.3.0, 40 digits (tests/fixtures/gen_expr.py)
    let fx = fixture();
    assert!(
        fx["gamma"].as_array().unwrap().len() >= 100,
        "fixture lost its Γ rows"
    );
    assert!(
        fx["digamma"].as_array().unwrap().len() >= 100,
        "fixture lost its ψ rows"
    );
    let mut worst = 0.0f64;
    for row in fx["gamma"].as_array().unwrap() {
        let (z, want) = (c(&row[0]), c(&row[1]));
        let e = rel(gamma(z), want);
        worst = worst.max(e);
        let tol = if z.norm() > 20.0 { 1e-13 } else { 1e-14 };
        assert!(e <= tol, "Γ({z}) = {} want {want}, rel {e:e}", gamma(z));
    }
    eprintln!("gamma worst relative error {worst:e}");
    for row in fx["digamma"].as_array().unwrap() {
        let (z, want) = (c(&row[0]), c(&row[1]));
        // absolute+relative: ψ has zeros where only absolute accuracy is meaningful
        let e = (digamma(z) - want).norm() / want.norm().max(1.0);
        assert!(e <= 1e-14, "ψ({z}) = {} want {want}, err {e:e}", digamma(z));
    }
    // Γ(1+i), mpmath 1.3.0
    let one_i = fx["gamma"]
        .as_array()
        .unwrap()
        .iter()
        .find(|r| c(&r[0]) == C::new(1.0, 1.0))
        .unwrap();
    assert_close(
        f("gamma(z)").eval(C::new(1.0, 1.0)),
        c(&one_i[1]),
        1e-15,
        "Γ(1+i)",
    );
}

#[test]
fn functions_and_derivatives_match_mpmath() {
    // mpmath 1.3.0, 40 digits; derivatives by mpmath.diff
    let fx = fixture();
    let mut rows_checked = 0;
    for (name, rows) in fx["functions"].as_object().unwrap() {
        let fun = f(&format!("{name}(z)"));
        for row in rows.as_array().unwrap() {
            let (z, v, d) = (c(&row[0]), c(&row[1]), c(&row[2]));
            let (gv, gd) = fun.eval_d(z);
            assert_close(fun.eval(z), v, 2e-14, &format!("{name}({z})"));
            assert_eq!(gv, fun.eval(z), "eval_d value equals eval for {name}");
            assert_close(gd, d, 5e-14, &format!("{name}'({z})"));
            rows_checked += 1;
        }
    }
    assert!(
        fx["functions"].as_object().unwrap().len() >= 17 && rows_checked >= 17,
        "fixture lost its functions ({rows_checked} rows)"
    );
    assert!(fx["composites"].as_array().unwrap().len() >= 7);
    for comp in fx["composites"].as_array().unwrap() {
        let src = comp["expr"].as_str().unwrap();
        let fun = f(src);
        for row in comp["points"].as_array().unwrap() {
            let (z, v, d) = (c(&row[0]), c(&row[1]), c(&row[2]));
            let (gv, gd) = fun.eval_d(z);
            assert_close(gv, v, 1e-13, &format!("{src} at {z}"));
            assert_close(gd, d, 1e-12, &format!("({src})' at {z}"));
        }
    }
}

#[test]
fn large_imaginary_parts_do_not_overflow() {
    // tan(x+iy) -> i as y -> +inf; sec, csc -> 0: from tan(x+iy) = (sin 2x + i sinh 2y)/
    // (cos 2x + cosh 2y) and |sin|, |cos| ~ e^|y|/2 (DLMF §4.21, from memory); tanh, coth
    // -> ±1 as Re z -> ±inf likewise (DLMF §4.35, from memory)
    let z = C::new(0.3, 400.0);
    assert_close(f("tan(z)").eval(z), C::new(0.0, 1.0), 1e-15, "tan");
    assert_close(
        f("tanh(z)").eval(C::new(400.0, 0.3)),
        C::new(1.0, 0.0),
        1e-15,
        "tanh",
    );
    assert_close(
        f("coth(z)").eval(C::new(-400.0, 0.3)),
        C::new(-1.0, 0.0),
        1e-15,
        "coth",
    );
    assert!(f("sec(z)").eval(z).norm() < 1e-170);
    assert!(f("csc(z)").eval(z).norm() < 1e-170);
}

fn central_difference(fun: &Function, z: C) -> C {
    let h = 1e-5;
    let hs = [C::new(h, 0.0), C::new(0.0, h)];
    // average of real and imaginary direction differences (analytic: both equal f')
    let d0 = (fun.eval(z + hs[0]) - fun.eval(z - hs[0])) / (2.0 * h);
    let d1 = (fun.eval(z + hs[1]) - fun.eval(z - hs[1])) / C::new(0.0, 2.0 * h);
    (d0 + d1) / 2.0
}

#[test]
fn derivative_matches_central_difference() {
    // Slow reference: central differences, error O(h²) ≈ 1e-10 relative (common practice).
    let srcs = [
        "(z+1)/(z^2+4)",
        "gamma(z)",
        "gamma(z^2+1)*sin(z)",
        "exp(1/(z-2))",
        "sqrt((z-1)/(z+1))",
        "z^z",
        "log(gamma(z))",
        "2^z*z^-3",
        "cot(z)+sec(z)-csc(z)",
        "atan(z)+asin(z/3)+acos(z/4)",
        "tanh(z)^2*coth(z)",
    ];
    let pts = [
        C::new(0.7, 0.4),
        C::new(-1.3, 0.9),
        C::new(2.1, -1.4),
        C::new(-2.6, -0.3),
    ];
    for src in srcs {
        let fun = f(src);
        for z in pts {
            let (_, d) = fun.eval_d(z);
            let fd = central_difference(&fun, z);
            assert_close(d, fd, 1e-7, &format!("({src})' at {z}"));
        }
    }
}

#[test]
fn block_equals_scalar_bit_for_bit() {
    // Slow reference: the scalar evaluator, point by point (must agree bit for bit).
    let srcs = [
        "(z+1)/(z^2+4)",
        "gamma(z)*exp(-z)",
        "z^(1/3)+2^z+z^(1+i)",
        "((((z+1)*(z+2))*((z+3)*(z+4)))*(((z+5)*(z+6))*((z+7)*(z+8))))",
        "sqrt(z)*log(z)-atan(z)",
        "7",
        "z",
    ];
    let zs: Vec<C> = (0..700)
        .map(|k| C::new((k as f64 * 0.37).sin() * 3.0, (k as f64 * 0.11).cos() * 2.5))
        .collect();
    let mut finite = 0;
    for src in srcs {
        let fun = f(src);
        let mut out = vec![C::new(0.0, 0.0); zs.len()];
        let mut out2 = vec![C::new(0.0, 0.0); zs.len()];
        let mut dout = vec![C::new(0.0, 0.0); zs.len()];
        fun.eval_block(&zs, &mut out);
        fun.eval_block_d(&zs, &mut out2, &mut dout);
        for (k, z) in zs.iter().enumerate() {
            let s = fun.eval(*z);
            let (sv, sd) = fun.eval_d(*z);
            let same = |a: C, b: C| {
                a == b || (a.re.is_nan() || a.im.is_nan()) && (b.re.is_nan() || b.im.is_nan())
            };
            assert!(same(out[k], s), "{src} block {} scalar {s}", out[k]);
            finite += (s.re.is_finite() && s.im.is_finite()) as usize;
            assert!(
                same(out2[k], s) && same(sv, s),
                "{src} value in derivative path"
            );
            assert!(
                same(dout[k], sd),
                "{src} derivative block {} scalar {sd}",
                dout[k]
            );
        }
    }
    // NaN = NaN counts as agreement above: make sure most values were real numbers.
    assert!(finite > 7 * 700 * 9 / 10, "only {finite} finite values");
}

#[test]
fn many_registers_use_the_heap_path() {
    // Right-nested sum needs more than 64 registers.
    let mut src = String::from("z");
    for k in 0..80 {
        src = format!("z*{k}+({src})");
    }
    let fun = f(&src);
    assert!(fun.program().registers > 64);
    let z = C::new(0.5, -0.25);
    // z·(0 + 1 + … + 79) + z by hand
    let want: C = (0..80).map(|k| z * k as f64).sum::<C>() + z;
    assert_close(fun.eval(z), want, 1e-13, "long sum");
    let (_, d) = fun.eval_d(z);
    assert_close(
        d,
        C::new((0..80).sum::<i32>() as f64 + 1.0, 0.0),
        1e-13,
        "long sum derivative",
    );
}

#[test]
fn functions_are_send_and_sync() {
    fn check<T: Send + Sync>() {}
    check::<Function>();
    let fun = f("gamma(z)/(z+3)");
    let z = C::new(0.3, 0.2);
    let want = fun.eval(z);
    std::thread::scope(|s| {
        for _ in 0..2 {
            s.spawn(|| assert_eq!(fun.eval(z), want));
        }
    });
}

#[test]
fn non_finite_inputs_do_not_panic() {
    let fun = f("gamma(z)*sqrt(z)/(z-1)+z^z+tan(z)");
    for z in [
        C::new(f64::NAN, 0.0),
        C::new(f64::INFINITY, -1.0),
        C::new(1.0, 0.0),
        C::new(0.0, 0.0),
        C::new(-3.0, 0.0),
    ] {
        let v = fun.eval(z);
        let (vd, _) = fun.eval_d(z);
        // at NaN, ±∞ and the poles 1, 0, −3 (of 1/(z−1), Γ) the value cannot be a finite number
        assert!(!(v.re.is_finite() && v.im.is_finite()), "{z}: {v}");
        assert!(!(vd.re.is_finite() && vd.im.is_finite()), "{z}: {vd}");
    }
    // and a regular point still gives a finite value
    assert!(fun.eval(C::new(0.5, 0.5)).norm().is_finite());
}

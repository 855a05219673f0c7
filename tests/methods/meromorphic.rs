//! Singularities of general meromorphic functions: counts, locations,
//! orders, residues, classification, infinity. References: mpmath 1.3.0 at
//! 40 digits (tests/fixtures/gen_meromorphic.py → meromorphic.json), which
//! checks each closed form named below against a contour integral.

use residuary::budget::Budget;
use residuary::contour::Contour;
use residuary::singular::{
    classify_infinity, classify_point, count_by_argument_principle, find_singularities, Hints, Kind,
};
use residuary::C;
use serde_json::Value;
use std::f64::consts::PI;

fn fixtures() -> Value {
    serde_json::from_str(include_str!("../fixtures/meromorphic.json")).expect("fixture JSON")
}

fn c(v: &Value) -> C {
    C::new(v[0].as_f64().unwrap(), v[1].as_f64().unwrap())
}

fn budget() -> Budget {
    Budget::new(5_000_000)
}

fn no_hints() -> Hints {
    Hints::default()
}

/// Central-difference derivative (the tests' stand-in for the symbolic one):
/// a first difference estimates |f/f'| (the distance to the nearest zero or
/// pole), and the step is then taken well below it.
fn numeric_fd(f: impl Fn(C) -> C) -> impl Fn(C) -> (C, C) {
    move |z: C| {
        let v = f(z);
        let mut h = 1e-6 * (1.0 + z.norm());
        for _ in 0..3 {
            let d = (f(z + h) - f(z - h)) / (2.0 * h);
            let dist = (v / d).norm();
            if !(dist.is_finite()) || h <= 1e-3 * dist {
                return (v, d);
            }
            h = (1e-3 * dist).max(1e-8 * (1.0 + z.norm()));
        }
        (v, (f(z + h) - f(z - h)) / (2.0 * h))
    }
}

/// Γ by the Lanczos approximation (g = 7, 9 terms; coefficients from memory,
/// checked against mpmath in `lanczos_gamma_matches_mpmath`), reflection for Re z < 1/2.
fn gamma(z: C) -> C {
    const G: f64 = 7.0;
    const P: [f64; 9] = [
        0.999_999_999_999_809_9,
        676.520_368_121_885_1,
        -1_259.139_216_722_402_8,
        771.323_428_777_653_1,
        -176.615_029_162_140_6,
        12.507_343_278_686_905,
        -0.138_571_095_265_720_12,
        9.984_369_578_019_572e-6,
        1.505_632_735_149_311_6e-7,
    ];
    if z.re < 0.5 {
        let pi = C::new(PI, 0.0);
        return pi / ((pi * z).sin() * gamma(C::new(1.0, 0.0) - z));
    }
    let z = z - 1.0;
    let mut x = C::new(P[0], 0.0);
    for (i, p) in P.iter().enumerate().skip(1) {
        x += *p / (z + i as f64);
    }
    let t = z + G + 0.5;
    (2.0 * PI).sqrt() * t.powc(z + 0.5) * (-t).exp() * x
}

/// Every reported bound must cover the true error, and the accuracy target is 1e-10 relative.
fn assert_residue(got: Option<C>, err: f64, want: C, what: &str) {
    let got = got.unwrap_or_else(|| panic!("{what}: no residue"));
    let true_err = (got - want).norm();
    assert!(
        true_err <= err,
        "{what}: error {true_err:e} exceeds its estimate {err:e} (got {got}, want {want})"
    );
    assert!(
        true_err <= 1e-10 * want.norm().max(1.0),
        "{what}: error {true_err:e} above target"
    );
    assert!(
        err <= 1e-8 * want.norm().max(1.0),
        "{what}: estimate {err:e} uselessly large"
    );
}

fn check_poles(res: &residuary::singular::RegionResult, want: &Value, what: &str) {
    let want = want.as_array().unwrap();
    assert_eq!(res.poles.len(), want.len(), "{what}: poles {:?}", res.poles);
    for w in want {
        let at = c(&w["at"]);
        let p = res
            .poles
            .iter()
            .find(|p| (p.at - at).norm() < 1e-9 * (1.0 + at.norm()))
            .unwrap_or_else(|| panic!("{what}: no pole near {at}: {:?}", res.poles));
        assert_eq!(p.order, 1, "{what}");
        assert_residue(p.residue, p.error_estimate, c(&w["residue"]), what);
    }
}

#[test]
fn lanczos_gamma_matches_mpmath() {
    // mpmath 1.3.0, 40 digits
    let values = fixtures()["cases"]["gamma_values"]
        .as_array()
        .unwrap()
        .clone();
    assert!(!values.is_empty(), "fixture lost its gamma values");
    for v in &values {
        let (z, want) = (c(&v["at"]), c(&v["value"]));
        assert!((gamma(z) - want).norm() <= 1e-13 * want.norm(), "{z}");
    }
}

#[test]
fn cosecant_poles_in_disk_of_radius_4() {
    // Residue of 1/sin at kπ is (−1)^k (1/cos kπ; common practice) — mpmath 1.3.0, 40 digits.
    let f = |z: C| 1.0 / z.sin();
    let fd = |z: C| (1.0 / z.sin(), -z.cos() / (z.sin() * z.sin()));
    let region = Contour::circle(C::new(0.0, 0.0), 4.0);
    let mut b = budget();
    assert_eq!(count_by_argument_principle(&f, &region, &mut b), Ok(-3));
    let res = find_singularities(&f, &fd, &region, &no_hints(), &mut b).unwrap();
    assert_eq!(res.zeros_minus_poles, -3);
    assert!(res.zeros.is_empty());
    check_poles(&res, &fixtures()["cases"]["csc"], "1/sin");
    assert!(res.warnings.is_empty(), "{:?}", res.warnings);
}

#[test]
fn tangent_poles_and_zeros() {
    // Abramowitz & Stegun §4.3 (from memory): tan has poles at π/2 + kπ with residue −1
    // (g/h' rule, common practice); zeros at kπ. Residues also mpmath 1.3.0, 40 digits.
    let f = |z: C| z.tan();
    let fd = |z: C| (z.tan(), 1.0 / (z.cos() * z.cos()));
    let region = Contour::Ellipse {
        center: [0.0, 0.0],
        semi_axes: [5.0, 1.0],
        angle: 0.0,
    };
    let mut b = budget();
    let res = find_singularities(&f, &fd, &region, &no_hints(), &mut b).unwrap();
    assert_eq!(res.zeros_minus_poles, 3 - 4);
    // Only the poles at ±π/2 and ±3π/2 lie inside (|x| < 5, by hand); fixture holds −π/2, π/2, 3π/2.
    assert_eq!(res.poles.len(), 4);
    let want = fixtures()["cases"]["tan"].as_array().unwrap().clone();
    assert_eq!(want.len(), 3, "fixture lost its tan poles");
    for w in &want {
        let at = c(&w["at"]);
        let p = res
            .poles
            .iter()
            .find(|p| (p.at - at).norm() < 1e-9)
            .expect("pole");
        assert_residue(p.residue, p.error_estimate, c(&w["residue"]), "tan");
    }
    assert_eq!(res.zeros.len(), 3);
    for k in -1..=1 {
        let z = C::new(k as f64 * PI, 0.0);
        assert!(
            res.zeros
                .iter()
                .any(|q| (q.at - z).norm() < 1e-12 && q.order == 1),
            "zero {z}"
        );
    }
}

#[test]
fn bose_factor_poles_on_imaginary_axis() {
    // 1/(e^z − 1): poles 2πik with residue 1 (common practice) — mpmath 1.3.0, 40 digits.
    let f = |z: C| 1.0 / (z.exp() - 1.0);
    let fd = |z: C| {
        let e = z.exp();
        (1.0 / (e - 1.0), -e / ((e - 1.0) * (e - 1.0)))
    };
    let region = Contour::rectangle(C::new(-1.0, -8.0), C::new(1.0, 8.0));
    let mut b = budget();
    let res = find_singularities(&f, &fd, &region, &no_hints(), &mut b).unwrap();
    assert_eq!(res.zeros_minus_poles, -3);
    check_poles(&res, &fixtures()["cases"]["bose"], "1/(e^z-1)");
}

#[test]
fn delayed_damped_resonator() {
    // e^{−sτ}/(s² + 2ζωs + ω²): residue e^{−pτ}/(2p + 2ζω) at each pole p — mpmath 1.3.0, 40 digits.
    let fx = &fixtures()["cases"]["resonator"];
    let (w, zeta, tau) = (
        fx["omega"].as_f64().unwrap(),
        fx["zeta"].as_f64().unwrap(),
        fx["tau"].as_f64().unwrap(),
    );
    let f = move |s: C| (-s * tau).exp() / (s * s + 2.0 * zeta * w * s + w * w);
    let region = Contour::rectangle(C::new(-2.0, -3.0), C::new(1.0, 3.0));
    let mut b = budget();
    let res = find_singularities(&f, &numeric_fd(f), &region, &no_hints(), &mut b).unwrap();
    assert_eq!(res.zeros_minus_poles, -2);
    check_poles(&res, &fx["poles"], "resonator");
    // Also at a single point.
    for p in fx["poles"].as_array().unwrap() {
        let r = classify_point(&f, c(&p["at"]), &no_hints(), &mut b).unwrap();
        assert_eq!((r.kind, r.order), (Kind::Pole, Some(1)));
        assert_residue(
            r.residue,
            r.error_estimate,
            c(&p["residue"]),
            "resonator point",
        );
    }
}

#[test]
fn gamma_poles_in_a_rectangle() {
    // DLMF §5.2(i): Γ has simple poles at −n with residue (−1)^n/n! — mpmath 1.3.0, 40 digits.
    let region = Contour::rectangle(C::new(-5.5, -1.0), C::new(0.5, 1.0));
    let mut b = budget();
    let res = find_singularities(&gamma, &numeric_fd(gamma), &region, &no_hints(), &mut b).unwrap();
    assert_eq!(res.zeros_minus_poles, -6);
    check_poles(&res, &fixtures()["cases"]["gamma"], "gamma");
}

#[test]
fn zeros_of_sine_minus_half_z() {
    // mpmath 1.3.0 findroot, 40 digits.
    let f = |z: C| z.sin() - z / 2.0;
    let fd = |z: C| (z.sin() - z / 2.0, z.cos() - 0.5);
    let region = Contour::rectangle(C::new(-3.0, -1.0), C::new(3.0, 1.0));
    let mut b = budget();
    let res = find_singularities(&f, &fd, &region, &no_hints(), &mut b).unwrap();
    assert_eq!(res.zeros_minus_poles, 3);
    assert!(res.poles.is_empty());
    assert_eq!(res.zeros.len(), 3);
    let want = fixtures()["cases"]["sin_minus_half"]
        .as_array()
        .unwrap()
        .clone();
    assert_eq!(want.len(), 3, "fixture lost its zeros");
    for w in &want {
        let z = c(w);
        let q = res
            .zeros
            .iter()
            .find(|q| (q.at - z).norm() < 1e-12)
            .unwrap_or_else(|| panic!("zero {z}: {:?}", res.zeros));
        assert_eq!(q.order, 1);
        assert!(
            (q.at - z).norm() <= q.error_estimate.max(4e-16),
            "location error estimate"
        );
    }
}

#[test]
fn double_pole_of_exp_over_sine_squared() {
    // e^z/sin²z = (1 + z + …)/z² near 0: double pole, residue 1 — mpmath 1.3.0, 40 digits.
    let f = |z: C| z.exp() / (z.sin() * z.sin());
    let want = c(&fixtures()["cases"]["exp_csc2"]["residue"]);
    let mut b = budget();
    let r = classify_point(&f, C::new(0.0, 0.0), &no_hints(), &mut b).unwrap();
    assert_eq!((r.kind, r.order), (Kind::Pole, Some(2)));
    assert_residue(r.residue, r.error_estimate, want, "e^z/sin^2 point");
    assert!((r.principal_part[1] - 1.0).norm() < 1e-10); // c₋₂ = e⁰/1 = 1 (by hand)
    let res = find_singularities(
        &f,
        &numeric_fd(f),
        &Contour::circle(C::new(0.0, 0.0), 1.0),
        &no_hints(),
        &mut b,
    )
    .unwrap();
    assert_eq!(res.zeros_minus_poles, -2);
    assert_eq!(res.poles.len(), 1);
    assert_eq!(res.poles[0].order, 2);
    assert_residue(
        res.poles[0].residue,
        res.poles[0].error_estimate,
        want,
        "e^z/sin^2 region",
    );
}

#[test]
fn essential_singularities_have_residues_but_no_order() {
    let ess = &fixtures()["cases"]["essential"];
    let mut b = budget();
    // exp(1/(z−1)) = Σ (z−1)^{−k}/k! (DLMF 4.2.19): c₋₁ = 1.
    let r = classify_point(
        &|z: C| (1.0 / (z - 1.0)).exp(),
        C::new(1.0, 0.0),
        &no_hints(),
        &mut b,
    )
    .unwrap();
    assert_eq!((r.kind, r.order), (Kind::Essential, None));
    assert_residue(
        r.residue,
        r.error_estimate,
        c(&ess["exp_inv_shift"]),
        "exp(1/(z-1))",
    );
    // c₋₂ = 1/2! (DLMF 4.2.19)
    assert!((r.principal_part[1] - 0.5).norm() < 1e-10);
    // sin(1/z) = 1/z − 1/(6z³) + … (DLMF 4.19.1): residue 1.
    let r = classify_point(
        &|z: C| (1.0 / z).sin(),
        C::new(0.0, 0.0),
        &no_hints(),
        &mut b,
    )
    .unwrap();
    assert_eq!(r.kind, Kind::Essential);
    assert_residue(r.residue, r.error_estimate, c(&ess["sin_inv"]), "sin(1/z)");
    // z² exp(1/z): residue 1/3! = 1/6 (DLMF 4.2.19).
    let r = classify_point(
        &|z: C| z * z * (1.0 / z).exp(),
        C::new(0.0, 0.0),
        &no_hints(),
        &mut b,
    )
    .unwrap();
    assert_eq!(r.kind, Kind::Essential);
    assert_residue(
        r.residue,
        r.error_estimate,
        c(&ess["z2_exp_inv"]),
        "z^2 exp(1/z)",
    );
}

#[test]
fn branch_points_are_refused_without_a_number() {
    let mut b = budget();
    let cases: Vec<(Box<dyn Fn(C) -> C>, C, &str)> = vec![
        (Box::new(|z: C| z.sqrt()), C::new(0.0, 0.0), "sqrt(z)"),
        (
            Box::new(|z: C| (z - 1.0).ln()),
            C::new(1.0, 0.0),
            "log(z-1)",
        ),
        (Box::new(|z: C| z.powf(0.5)), C::new(0.0, 0.0), "z^0.5"),
        (
            Box::new(|z: C| z.powf(1.0 / 3.0) / z),
            C::new(0.0, 0.0),
            "z^(1/3)/z",
        ),
    ];
    // Only multivalued expressions are scanned for cuts: say so, as the task glue does.
    let branchy = Hints {
        uses_branch_functions: true,
        ..Hints::default()
    };
    for (f, a, what) in cases {
        let r = classify_point(&*f, a, &branchy, &mut b).unwrap();
        assert_eq!(r.kind, Kind::BranchPoint, "{what}");
        assert_eq!(r.residue, None, "{what}");
    }
    // sqrt(z) at infinity is a branch point too (common practice).
    let r = classify_infinity(&|z: C| z.sqrt(), &branchy, &mut b).unwrap();
    assert_eq!((r.kind, r.residue), (Kind::BranchPoint, None));
}

#[test]
fn regular_and_removable_points() {
    let mut b = budget();
    // sin z / z is 0/0 at 0 (removable: sin z = z − z³/6 + …, DLMF 4.19.1), residue 0.
    let r = classify_point(&|z: C| z.sin() / z, C::new(0.0, 0.0), &no_hints(), &mut b).unwrap();
    assert_eq!(r.kind, Kind::Removable);
    assert!(r.residue.unwrap().norm() <= r.error_estimate.max(1e-14));
    let r = classify_point(&|z: C| z.cos(), C::new(0.4, 0.1), &no_hints(), &mut b).unwrap();
    assert_eq!((r.kind, r.order), (Kind::Regular, None));
}

#[test]
fn residues_at_infinity() {
    let inf = &fixtures()["cases"]["infinity"];
    let mut b = budget();
    // Res∞ exp(1/z) = −1 — mpmath 1.3.0, 40 digits.
    let r = classify_infinity(&|z: C| (1.0 / z).exp(), &no_hints(), &mut b).unwrap();
    assert_eq!(r.kind, Kind::Regular);
    assert_residue(
        r.residue,
        r.error_estimate,
        c(&inf["exp_inv"]),
        "exp(1/z) at inf",
    );
    // z²/(z − 1) = z + 1 + 1/z + …: simple pole at ∞, Res∞ = −1 — mpmath 1.3.0, 40 digits.
    let r = classify_infinity(&|z: C| z * z / (z - 1.0), &no_hints(), &mut b).unwrap();
    assert_eq!((r.kind, r.order), (Kind::Pole, Some(1)));
    assert_residue(
        r.residue,
        r.error_estimate,
        c(&inf["z2_over_z_minus_1"]),
        "z^2/(z-1) at inf",
    );
    // A cubic: pole of order 3 at ∞, residue 0 — mpmath 1.3.0, 40 digits.
    let r = classify_infinity(&|z: C| z * z * z - 2.0 * z + 5.0, &no_hints(), &mut b).unwrap();
    assert_eq!((r.kind, r.order), (Kind::Pole, Some(3)));
    assert_residue(
        r.residue,
        r.error_estimate,
        c(&inf["cubic"]),
        "cubic at inf",
    );
    // exp(z) at ∞: essential (Casorati–Weierstrass; common practice), Res∞ = 0.
    let r = classify_infinity(&|z: C| z.exp(), &no_hints(), &mut b).unwrap();
    assert_eq!(r.kind, Kind::Essential);
    assert_residue(r.residue, r.error_estimate, C::new(0.0, 0.0), "exp at inf");
}

#[test]
fn gamma_at_infinity_has_no_residue() {
    // Poles of Γ accumulate at infinity (DLMF §5.2(i)): not isolated, so no residue.
    let mut b = budget();
    let r = classify_infinity(&gamma, &no_hints(), &mut b).unwrap();
    assert_eq!(r.kind, Kind::Essential);
    assert_eq!(r.residue, None, "{r:?}");
    assert!(!r.warnings.is_empty());
}

#[test]
fn singularity_on_the_contour_is_an_error_not_a_number() {
    let f = |z: C| 1.0 / z.sin();
    let fd = |z: C| (1.0 / z.sin(), -z.cos() / (z.sin() * z.sin()));
    let mut b = budget();
    let region = Contour::rectangle(C::new(-1.0, -1.0), C::new(PI, 1.0));
    let e = find_singularities(&f, &fd, &region, &no_hints(), &mut b).unwrap_err();
    assert!(e.to_string().contains("move the contour"), "{e}");
    // A pole 1e-9 outside the boundary: an error, or a count without it — never a wrong pole.
    let p = C::new(1.0 + 1e-9, 0.0);
    let g = move |z: C| 1.0 / (z - p);
    let gd = move |z: C| (1.0 / (z - p), -1.0 / ((z - p) * (z - p)));
    match find_singularities(
        &g,
        &gd,
        &Contour::circle(C::new(0.0, 0.0), 1.0),
        &no_hints(),
        &mut b,
    ) {
        Err(e) => assert!(e.to_string().contains("contour"), "{e}"),
        Ok(r) => {
            assert_eq!(r.zeros_minus_poles, 0);
            assert!(r.poles.is_empty());
        }
    }
}

#[test]
fn too_many_singularities_for_the_budget_is_a_clear_error() {
    let f = |z: C| 1.0 / z.sin();
    let fd = |z: C| (1.0 / z.sin(), -z.cos() / (z.sin() * z.sin()));
    let mut b = Budget::new(300_000);
    let e = find_singularities(
        &f,
        &fd,
        &Contour::rectangle(C::new(-300.0, -1.0), C::new(300.5, 1.0)),
        &no_hints(),
        &mut b,
    )
    .unwrap_err();
    assert!(
        e.to_string().contains("budget") || e.to_string().contains("shrink the region"),
        "{e}"
    );
}

#[test]
fn hinted_essential_point_is_excluded_from_the_pole_search() {
    // exp(1/z) + 1/(z − 0.5): essential at 0 (DLMF 4.2.19 series), simple pole at 0.5 with residue 1.
    let f = |z: C| (1.0 / z).exp() + 1.0 / (z - 0.5);
    let hints = Hints {
        essential_candidates: vec![C::new(0.0, 0.0)],
        ..Hints::default()
    };
    let mut b = budget();
    let res = find_singularities(
        &f,
        &numeric_fd(f),
        &Contour::circle(C::new(0.1, 0.0), 1.0),
        &hints,
        &mut b,
    )
    .unwrap();
    assert_eq!(res.essential, vec![C::new(0.0, 0.0)]);
    let p = res
        .poles
        .iter()
        .find(|p| (p.at - 0.5).norm() < 1e-9)
        .unwrap_or_else(|| panic!("pole at 0.5: {res:?}"));
    assert_residue(
        p.residue,
        p.error_estimate,
        C::new(1.0, 0.0),
        "pole next to essential",
    );
    assert!(!res.warnings.is_empty()); // the count cannot be checked, and we say so
}

#[test]
fn point_next_to_a_pole_is_not_called_essential() {
    // 1/sin z is analytic at π + 1e-5 (its pole is at π; common practice): regular, residue 0.
    let mut b = budget();
    let r = classify_point(
        &|z: C| 1.0 / z.sin(),
        C::new(PI + 1e-5, 0.0),
        &no_hints(),
        &mut b,
    )
    .unwrap();
    assert_eq!(r.kind, Kind::Regular, "{r:?}");
    assert!(r.residue.unwrap().norm() <= r.error_estimate.max(1e-12));
}

//! The half-disc and keyhole contours through the JSON API (`contour_integral`,
//! `argument_count`, `singularities`), against residue sums by hand and mpmath
//! 1.3.0 integrals along the pieces at 40 digits (tests/fixtures/gen_shapes.py
//! → shapes.json), and the Mellin integral ∫₀^∞ x^{α−1}/(1+x) dx = π/sin(πα)
//! (Gradshteyn & Ryzhik 3.222.2, from memory).

use residuary::api::run_json_value;
use serde_json::{json, Value};
use std::f64::consts::PI;

type Cx = (f64, f64);

fn call(request: Value) -> Value {
    run_json_value(request.clone()).unwrap_or_else(|e| panic!("{request}: {}", e.message))
}

fn cx(v: &Value) -> Cx {
    (v[0].as_f64().expect("re"), v[1].as_f64().expect("im"))
}

fn dist(a: Cx, b: Cx) -> f64 {
    ((a.0 - b.0).powi(2) + (a.1 - b.1).powi(2)).sqrt()
}

fn fixtures() -> Value {
    let fx: Value = serde_json::from_str(include_str!("../fixtures/shapes.json")).expect("fixture JSON");
    assert_eq!(fx["mpmath_version"], "1.3.0");
    fx
}

fn integral(case: &Value) -> Value {
    let mut req = json!({"task": "contour_integral", "f": case["f"], "contour": case["contour"]});
    if let Some(p) = case.get("params") {
        req["params"] = p.clone();
    }
    call(req)
}

#[test]
fn every_shape_matches_mpmath_along_its_pieces() {
    let fx = fixtures();
    let cases = fx["cases"].as_object().unwrap();
    assert_eq!(cases.len(), 6);
    for (name, case) in cases {
        let want = cx(&case["value"]); // mpmath 1.3.0 quad along the pieces, 40 digits
        let r = integral(case);
        let scale = (want.0.hypot(want.1)).max(1.0);
        for way in ["value", "by_quadrature"] {
            let got = cx(&r[way]);
            assert!(dist(got, want) < 1e-10 * scale, "{name} {way}: {got:?} vs {want:?}");
        }
        if case["f"].as_str().unwrap().contains("log") {
            continue;
        }
        // Rational f: the inside residues agree too.
        let got = cx(&r["by_inside_residues"]);
        assert!(dist(got, want) < 1e-10 * scale, "{name} residues: {got:?} vs {want:?}");
        assert_eq!(r["verdict"], "agree", "{name}: {r}");
    }
}

#[test]
fn windings_of_the_poles_are_those_by_hand() {
    // Plane geometry by hand: in the upper half-disc |z| < 3 lie 2i and 0.5 + 0.7i, not −2i;
    // in the keyhole about 0.5 (radii 0.5, 2.5, slit upward) lie −1 and 2 + i, not 0.5 + 0.1i.
    let fx = fixtures();
    let cases = [
        ("upper", vec![((0.0, 2.0), 1), ((0.5, 0.7), 1), ((0.0, -2.0), 0)]),
        ("keyhole_rational", vec![((-1.0, 0.0), 1), ((2.0, 1.0), 1), ((0.5, 0.1), 0)]),
        ("left", vec![((-1.0, 1.0), 1), ((-1.0, -1.0), 1)]),
        ("lower", vec![((-1.0, 1.0), 0), ((-1.0, -1.0), 1)]),
    ];
    for (name, want) in cases {
        let r = integral(&fx["cases"][name]);
        let listed = r["winding"].as_array().unwrap();
        for (at, w) in want {
            match listed.iter().find(|p| dist(cx(&p["at"]), at) < 1e-9) {
                Some(p) => assert_eq!(p["winding"], w, "{name} at {at:?}"),
                // A point far outside the shape's covering region is not listed at all.
                None => assert_eq!(w, 0, "{name}: no point at {at:?} in {listed:?}"),
            }
        }
        assert!(listed.iter().any(|p| p["winding"] == 1), "{name}: {listed:?}");
    }
}

#[test]
fn mellin_integral_through_the_keyhole_closed_form() {
    // z^{α−1} with arg z in (θ, θ + 2π) is exp((α − 1)(log(−z e^{−iθ}) + i(θ + π))): the
    // principal log has its cut on the negative real axis, so log(−z e^{−iθ}) has it on the ray at θ.
    // Inside the keyhole only the pole −1 lies, arg(−1) = π, so the integral is
    // 2πi e^{iπ(α−1)} whatever the radii (residue theorem); on the slit's edges the integrand
    // differs by e^{2πi(α−1)}, so letting r₁ → 0, r₂ → ∞ (arcs vanish for 0 < α < 1),
    // ∫₀^∞ x^{α−1}/(1+x) dx = ∮/(1 − e^{2πiα}) = π/sin(πα) (Gradshteyn & Ryzhik 3.222.2, from memory).
    for (alpha, theta, log) in [
        (0.4, 0.0, "log(-z)+i*pi"),
        (0.7, 0.0, "log(-z)+i*pi"),
        (0.4, PI / 2.0, "log(i*z)+1.5*i*pi"),
    ] {
        let r = call(json!({
            "task": "contour_integral",
            "f": format!("exp((a-1)*({log}))/(1+z)"),
            "params": {"a": alpha},
            "contour": {"shape": "keyhole", "center": [0, 0], "inner": 0.05, "outer": 4, "angle": theta},
        }));
        let v = cx(&r["by_quadrature"]);
        // 2πi e^{iφ} = (−2π sin φ, 2π cos φ), φ = π(α − 1).
        let phi = PI * (alpha - 1.0);
        let want = (-2.0 * PI * phi.sin(), 2.0 * PI * phi.cos());
        assert!(dist(v, want) < 1e-10, "α {alpha}, θ {theta}: {v:?} vs {want:?}");
        // ∮/(1 − e^{2πiα}).
        let (dr, di) = (1.0 - (2.0 * PI * alpha).cos(), -(2.0 * PI * alpha).sin());
        let d2 = dr * dr + di * di;
        let ratio = ((v.0 * dr + v.1 * di) / d2, (v.1 * dr - v.0 * di) / d2);
        let closed = PI / (PI * alpha).sin();
        assert!(dist(ratio, (closed, 0.0)) < 1e-10 * closed, "α {alpha}: {ratio:?} vs π/sin(πα) = {closed}");
    }
}

#[test]
fn argument_count_on_the_new_shapes() {
    // By hand: f = (z − 0.5i)/((z + 0.5 + 0.5i)(z − 0.2 − 0.3i)) in the upper half-disc |z| < 1:
    // the zero 0.5i and the pole 0.2 + 0.3i inside, the pole −0.5 − 0.5i below: N − P = 0.
    let r = call(json!({"task": "argument_count", "f": "(z-0.5i)/((z+0.5+0.5i)*(z-0.2-0.3i))",
        "contour": {"shape": "half_disc", "center": [0, 0], "radius": 1, "direction": "upper"}}));
    assert_eq!((r["zeros"].as_i64(), r["poles"].as_i64()), (Some(1), Some(1)), "{r}");
    // The keyhole 0.5 < |z| < 3 minus the slit along the positive axis: the pole −1.5 inside,
    // the zero 2 in the slit and the pole 0.2 + 0.3i in the inner disc are not: N − P = −1.
    let r = call(json!({"task": "argument_count", "f": "(z-2)/((z+1.5)*(z-0.2-0.3i))",
        "contour": {"shape": "keyhole", "center": [0, 0], "inner": 0.5, "outer": 3}}));
    assert_eq!(r["zeros_minus_poles"], -1, "{r}");
    // A non-rational f (the same zeros and poles times e^z), by the numerical count.
    let r = call(json!({"task": "argument_count", "f": "exp(z)*(z-2)/((z+1.5)*(z-0.2-0.3i))",
        "contour": {"shape": "keyhole", "center": [0, 0], "inner": 0.5, "outer": 3, "gap": 0.01}}));
    assert_eq!(r["zeros_minus_poles"], -1, "{r}");
}

#[test]
fn singularities_in_a_half_disc_region() {
    // By hand: of the poles 0.2 + 0.3i, −0.5 − 0.5i and −0.3i of e^z/(…), the lower half-disc
    // |z| < 1 holds the last two.
    let r = call(json!({"task": "singularities", "f": "exp(z)/((z+0.5+0.5i)*(z-0.2-0.3i)*(z+0.3i))",
        "region": {"shape": "half_disc", "center": [0, 0], "radius": 1, "direction": "lower"}}));
    let poles: Vec<Cx> = r["poles"].as_array().unwrap().iter().map(|p| cx(&p["at"])).collect();
    assert_eq!(poles.len(), 2, "{r}");
    for want in [(-0.5, -0.5), (0.0, -0.3)] {
        assert!(poles.iter().any(|p| dist(*p, want) < 1e-8), "{want:?} in {poles:?}");
    }
}

#[test]
fn unsound_shapes_are_refused_with_the_field() {
    for (contour, says) in [
        (json!({"shape": "keyhole", "center": [0, 0], "inner": 2, "outer": 1}), "inner < outer"),
        (json!({"shape": "keyhole", "center": [0, 0], "inner": 1, "outer": 2, "gap": 1.5}), "gap"),
        (json!({"shape": "half_disc", "center": [0, 0], "radius": 1, "direction": "up"}), "upper"),
        (json!({"shape": "half_disc", "center": [0, 0], "radius": 1}), "direction"),
    ] {
        let e = run_json_value(json!({"task": "contour_integral", "f": "1/(z-5)", "contour": contour})).unwrap_err();
        assert!(e.message.contains(says), "{contour}: {}", e.message);
    }
}

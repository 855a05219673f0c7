//! The public JSON contract: field names and meanings of every built task,
//! checked through the same doorway the page, node and the CLI use.

use residuary::api::run_json_text;
use serde_json::{json, Value};

fn run(request: Value) -> Value {
    let (text, is_error) = run_json_text(&request.to_string());
    let v: Value = serde_json::from_str(&text).unwrap();
    assert!(!is_error, "{request} answered {v}");
    v
}

fn run_err(request: Value) -> Value {
    let (text, is_error) = run_json_text(&request.to_string());
    assert!(is_error, "{request} should fail but answered {text}");
    serde_json::from_str::<Value>(&text).unwrap()["error"].clone()
}

fn c(v: &Value) -> (f64, f64) {
    (v[0].as_f64().unwrap(), v[1].as_f64().unwrap())
}

fn close(v: &Value, re: f64, im: f64, tol: f64) -> bool {
    let (a, b) = c(v);
    ((a - re).powi(2) + (b - im).powi(2)).sqrt() <= tol * (re.hypot(im)).max(1.0)
}

#[test]
fn evaluate_returns_values_and_derivatives() {
    // (1+i)² + 1 = 1 + 2i and d/dz = 2z = 2 + 2i (common practice)
    let v = run(json!({"task": "evaluate", "f": "z^2+1", "at": [[1, 1], 2]}));
    assert!(close(&v["values"][0], 1.0, 2.0, 1e-15));
    assert!(close(&v["derivatives"][0], 2.0, 2.0, 1e-15));
    assert!(close(&v["values"][1], 5.0, 0.0, 1e-15), "a bare real number is accepted as a point");
}

#[test]
fn parameters_may_be_real_or_complex_and_the_variable_renamed() {
    // H(s) = wn²/(s² + 2ζ wn s + wn²) at s = 0 is 1 (DC gain of a low-pass; common practice)
    let v = run(json!({"task": "evaluate", "f": "wn^2/(s^2+2*zeta*wn*s+wn^2)", "var": "s",
                       "params": {"wn": 3, "zeta": [0.2, 0.0]}, "at": [[0, 0]]}));
    assert!(close(&v["values"][0], 1.0, 0.0, 1e-15));
    let e = run_err(json!({"task": "evaluate", "f": "wn*s", "var": "s", "at": [[0, 0]]}));
    assert!(e["message"].as_str().unwrap().contains("wn"));
    assert_eq!(e["span"], json!([0, 2]));
}

#[test]
fn phase_plot_png_and_rgba() {
    let v = run(json!({"task": "phase_plot", "f": "z", "view": [-1, 1, -1, 1], "size": [8, 4]}));
    assert_eq!((v["width"].as_u64(), v["height"].as_u64(), v["format"].as_str()), (Some(8), Some(4), Some("png")));
    let png = residuary::plot::base64::decode(v["data"].as_str().unwrap()).unwrap();
    assert_eq!(&png[..8], b"\x89PNG\r\n\x1a\n");
    let v = run(json!({"task": "phase_plot", "f": "z", "view": [-1, 1, -1, 1], "size": [8, 4], "format": "rgba", "rows": [1, 3]}));
    let rgba = residuary::plot::base64::decode(v["data"].as_str().unwrap()).unwrap();
    assert_eq!(rgba.len(), 8 * 2 * 4, "rows 1..3 of an 8-wide image");
    assert_eq!(v["height"], 2);
}

#[test]
fn residue_shape_at_a_pole_a_regular_point_and_infinity() {
    // Res_{s=-1} (s+3)/((s+1)²(s+2)) = d/ds[(s+3)/(s+2)] at −1 = −1/(s+2)² = −1 (derivative rule, common practice)
    let v = run(json!({"task": "residue", "f": "(s+3)/((s+1)^2*(s+2))", "var": "s", "at": [-1, 0]}));
    assert!(close(&v["residue"], -1.0, 0.0, 1e-12), "{v}");
    assert_eq!((v["kind"].as_str(), v["order"].as_u64()), (Some("pole"), Some(2)));
    assert!(v["error_estimate"].as_f64().unwrap() < 1e-10);
    // c_{-2} = (s+3)/(s+2) at −1 = 2 (same rule)
    assert!(close(&v["principal_part"][1], 2.0, 0.0, 1e-12));

    // 1/(z − 1) is analytic at 0: regular, residue 0 (by hand)
    let v = run(json!({"task": "residue", "f": "1/(z-1)", "at": [0, 0]}));
    assert_eq!((v["kind"].as_str(), v["order"].is_null()), (Some("regular"), true));
    assert!(close(&v["residue"], 0.0, 0.0, 0.0));

    // Res∞ (z²+1)/(z−2) = −(coefficient of 1/z at infinity) = −5 (long division: z + 2 + 5/z + …; common practice)
    let v = run(json!({"task": "residue", "f": "(z^2+1)/(z-2)", "at": "infinity"}));
    assert!(close(&v["residue"], -5.0, 0.0, 1e-12), "{v}");
    assert_eq!((v["kind"].as_str(), v["order"].as_u64()), (Some("pole"), Some(1)));
}

#[test]
fn residue_at_infinity_tells_a_non_isolated_point() {
    // Poles of tan, csc and Γ pile up at infinity (tan: π/2 + kπ, csc: kπ, DLMF 4.14; Γ: −n,
    // DLMF 5.2(i)): no punctured neighbourhood of infinity is free of them, so it is not isolated.
    for f in ["tan(z)", "csc(z)", "gamma(z)"] {
        let v = run(json!({"task": "residue", "f": f, "at": "infinity"}));
        assert_eq!(v["accumulation"], json!(true), "{f}: {v}");
        assert!(v["residue"].is_null(), "{f}: {v}");
    }
    // exp z has an isolated essential singularity at infinity (its Taylor series, DLMF 4.2.19)
    let v = run(json!({"task": "residue", "f": "exp(z)", "at": "infinity"}));
    assert_eq!((v["kind"].as_str(), v["accumulation"].as_bool()), (Some("essential"), Some(false)), "{v}");
    // tan(1/z) is analytic at infinity (tan is analytic at 0): its poles accumulate at 0 instead
    let v = run(json!({"task": "residue", "f": "tan(1/z)", "at": "infinity"}));
    assert_eq!(v["accumulation"], json!(false), "{v}");
    // 1/((z-1)(z-2)) at infinity: a zero of order 2, regular (by hand); at a finite pole never an accumulation
    let v = run(json!({"task": "residue", "f": "1/((z-1)*(z-2))", "at": "infinity"}));
    assert_eq!((v["kind"].as_str(), v["accumulation"].as_bool()), (Some("regular"), Some(false)), "{v}");
    let v = run(json!({"task": "residue", "f": "tan(z)", "at": [1.5707963267948966, 0]}));
    assert_eq!((v["kind"].as_str(), v["accumulation"].as_bool()), (Some("pole"), Some(false)), "{v}");
}

#[test]
fn residue_of_general_functions_and_refusals() {
    // Γ has residue (−1)^n/n! at −n (DLMF §5.2(i)); n = 4 → 1/24
    let v = run(json!({"task": "residue", "f": "gamma(z)", "at": [-4, 0]}));
    assert!(close(&v["residue"], 1.0 / 24.0, 0.0, 1e-10), "{v}");
    assert_eq!(v["kind"], "pole");
    // exp(1/z) = Σ z^{−k}/k! (DLMF 4.2.19): essential at 0 with residue 1
    let v = run(json!({"task": "residue", "f": "exp(1/z)", "at": [0, 0]}));
    assert_eq!(v["kind"], "essential");
    assert!(close(&v["residue"], 1.0, 0.0, 1e-10), "{v}");
    // a branch point has no residue: never a number
    let v = run(json!({"task": "residue", "f": "sqrt(z-1)", "at": [1, 0]}));
    assert_eq!(v["kind"], "branch_point");
    assert!(v["residue"].is_null());
    // non-analytic input is refused with its span
    let e = run_err(json!({"task": "residue", "f": "1/abs(z)", "at": [0, 0]}));
    assert_eq!(e["span"], json!([2, 5]));
    let e = run_err(json!({"task": "residue", "f": "1/z", "at": "nowhere"}));
    assert!(e["message"].as_str().unwrap().contains("infinity"));
}

#[test]
fn singularities_shape_for_a_filter() {
    // Second-order low-pass: poles −ζωn ± iωn√(1−ζ²), residues ±ωn/(2i√(1−ζ²)) (common practice)
    let (wn, zeta) = (2.0f64, 0.3f64);
    let v = run(json!({"task": "singularities", "f": "wn^2/(s^2+2*zeta*wn*s+wn^2)", "var": "s",
                       "params": {"wn": wn, "zeta": zeta},
                       "region": {"shape": "rectangle", "corners": [[-5, -5], [5, 5]]}}));
    let poles = v["poles"].as_array().unwrap();
    assert_eq!(poles.len(), 2);
    let wd = wn * (1.0 - zeta * zeta).sqrt();
    for p in poles {
        let (_, im) = c(&p["at"]);
        let sign = im.signum();
        assert!(close(&p["at"], -zeta * wn, sign * wd, 1e-13), "{p}");
        // ωn²/(2iωd·sign) = −i·sign·ωn²/(2ωd)
        assert!(close(&p["residue"], 0.0, -sign * wn * wn / (2.0 * wd), 1e-12), "{p}");
        assert_eq!(p["order"], 1);
        assert!(p["error_estimate"].as_f64().unwrap() < 1e-12);
        assert_eq!(p["principal_part"].as_array().unwrap().len(), 1);
    }
    assert!(v["zeros"].as_array().unwrap().is_empty());
    assert!(close(&v["residue_at_infinity"], 0.0, 0.0, 1e-15));
    assert!(v["residue_sum_defect"].as_f64().unwrap() < 1e-14);
    assert_eq!(v["zeros_minus_poles"], -2);
    for key in ["essential", "branch_points", "removable", "warnings"] {
        assert!(v[key].is_array(), "{key}");
    }
    // a region that leaves the poles outside finds none: s² + 2s + 5 has roots −1 ± 2i,
    // at distance > 4 from 3 (by hand)
    let v = run(json!({"task": "singularities", "f": "1/(s^2+2*s+5)", "var": "s",
                       "region": {"shape": "circle", "center": [3, 0], "radius": 1}}));
    assert!(v["poles"].as_array().unwrap().is_empty());
}

#[test]
fn singularities_of_a_trigonometric_quotient() {
    // tan z = sin z/cos z: simple poles at π/2 + kπ, residue sin/(cos)′ = −1 (simple-pole rule g/h′; common practice)
    let v = run(json!({"task": "singularities", "f": "tan(z)", "region": {"shape": "circle", "center": [0, 0], "radius": 3}}));
    let poles = v["poles"].as_array().unwrap();
    assert_eq!(poles.len(), 2, "{v}");
    for p in poles {
        let (x, _) = c(&p["at"]);
        assert!(close(&p["at"], x.signum() * std::f64::consts::FRAC_PI_2, 0.0, 1e-12), "{p}");
        assert!(close(&p["residue"], -1.0, 0.0, 1e-10), "{p}");
    }
    let zeros = v["zeros"].as_array().unwrap();
    assert_eq!(zeros.len(), 1, "tan has zeros at kπ: only 0 lies in |z| < 3");
    assert_eq!(v["method"], "numerical");
}

#[test]
fn laurent_shape_and_refusal() {
    // 1/((z−1)(z−3)) on 1 < |z| < 3: −Σ_{n≥0} z^n/(2·3^{n+1}) − Σ_{n≥1} z^{−n}/2 (geometric series; common practice)
    let v = run(json!({"task": "laurent", "f": "1/((z-1)*(z-3))", "center": [0, 0], "inner": 1, "outer": 3, "from": -2, "to": 2}));
    let coeffs = v["coefficients"].as_array().unwrap();
    assert_eq!(coeffs.len(), 5);
    for k in coeffs {
        let n = k["n"].as_i64().unwrap();
        let want = if n >= 0 { -1.0 / (2.0 * 3f64.powi(n as i32 + 1)) } else { -0.5 };
        assert!(close(&k["c"], want, 0.0, 1e-12), "{k}");
        // each coefficient's own estimate bounds its error and never exceeds the overall one
        let err = k["error"].as_f64().unwrap();
        let c = &k["c"];
        let got = (c[0].as_f64().unwrap() - want).hypot(c[1].as_f64().unwrap());
        assert!(got <= err.max(1e-15) && err <= v["error_estimate"].as_f64().unwrap(), "{k}");
    }
    assert!(v["error_estimate"].as_f64().unwrap() < 1e-10);
    let e = run_err(json!({"task": "laurent", "f": "1/((z-1)*(z-3))", "center": [0, 0], "inner": 0.5, "outer": 2, "from": 0, "to": 1}));
    assert!(e["message"].as_str().unwrap().contains("singularity at 1"), "{e}");
    // around infinity: z²/(z−2) = z + 2 + 4/z + … so c₋₁ = 4 and Res∞ = −4 (common practice)
    let v = run(json!({"task": "laurent", "f": "z^2/(z-2)", "center": "infinity", "inner": 3, "from": -1, "to": 1}));
    let c_minus_1 = v["coefficients"].as_array().unwrap().iter().find(|k| k["n"] == -1).unwrap();
    assert!(close(&c_minus_1["c"], 4.0, 0.0, 1e-10), "{v}");
}

#[test]
fn partial_fractions_shape() {
    // (s+3)/((s+1)²(s+2)) = 1/(s+2) − 1/(s+1) + 2/(s+1)² (cover-up and derivative rules; common practice)
    let v = run(json!({"task": "partial_fractions", "f": "(s+3)/((s+1)^2*(s+2))", "var": "s"}));
    assert_eq!(v["text"], "1/(s + 2) - 1/(s + 1) + 2/(s + 1)^2");
    assert_eq!(v["terms"].as_array().unwrap().len(), 3);
    assert!(v["polynomial"].as_array().unwrap().is_empty());
    let e = run_err(json!({"task": "partial_fractions", "f": "exp(s)/(s+1)", "var": "s"}));
    assert!(e["message"].as_str().unwrap().contains("rational"));
}

#[test]
fn ill_conditioned_expansion_is_recovered_from_the_expression_as_typed() {
    // 1/Π(z − p_k) for 80 poles near the unit circle, typed as a product. Expanding it into
    // coefficients makes the roots very sensitive to rounding; the exact residue of the
    // factored form is 1/Π_{j≠k}(p_k − p_j) (simple-pole rule; common practice).
    let n = 80;
    let poles: Vec<(f64, f64)> = (0..n)
        .map(|k| {
            let t = 2.0 * std::f64::consts::PI * (k as f64 + 0.3) / n as f64;
            let r = 0.9 + 0.05 * ((3 * k) as f64).sin();
            (r * t.cos(), r * t.sin())
        })
        .collect();
    let f = format!(
        "1/({})",
        poles.iter().map(|(x, y)| format!("(z - ({x:.17} + {y:.17}i))")).collect::<Vec<_>>().join("*")
    );
    let v = run(json!({"task": "singularities", "f": f, "region": {"shape": "circle", "center": [0, 0], "radius": 2}}));
    let found = v["poles"].as_array().unwrap().len();
    assert!(found > 0, "no poles reported at all: {v}");
    let mut checked = 0;
    let mut worst_ratio: f64 = 0.0;
    let mut worst_location: f64 = 0.0;
    for p in v["poles"].as_array().unwrap() {
        let (x, y) = c(&p["at"]);
        let z = residuary::C::new(x, y);
        let (k, distance) = poles
            .iter()
            .enumerate()
            .map(|(k, &(a, b))| (k, (z - residuary::C::new(a, b)).norm()))
            .min_by(|a, b| a.1.total_cmp(&b.1))
            .unwrap();
        worst_location = worst_location.max(distance);
        if distance > 1e-8 {
            continue; // a misplaced pole: its residue belongs to no true pole
        }
        let pk = residuary::C::new(poles[k].0, poles[k].1);
        let exact = poles
            .iter()
            .enumerate()
            .filter(|&(j, _)| j != k)
            .fold(residuary::C::new(1.0, 0.0), |acc, (_, &(a, b))| acc * (pk - residuary::C::new(a, b)))
            .inv();
        let (re, im) = c(&p["residue"]);
        let err = (residuary::C::new(re, im) - exact).norm();
        worst_ratio = worst_ratio.max(err / p["error_estimate"].as_f64().unwrap());
        checked += 1;
    }
    let warned = v["warnings"].as_array().unwrap().iter().any(|w| w.as_str().unwrap().contains("disagree"));
    // Where a pole is in the right place its estimate covers the residue error; where the
    // expansion moved poles, the response says so.
    assert!(worst_ratio <= 1.0, "an estimate undercuts the error by a factor {worst_ratio}");
    // refined on the expression as typed, the poles land where the factors put them
    assert!(worst_location < 1e-12, "poles off by {worst_location:e} (warned: {warned})");
    // the residue check above really ran, and a wrong pole count is flagged too
    assert!(checked > 0, "no pole was in its right place: nothing checked");
    assert!(found == n || warned, "{found} poles of {n} with no warning");
}

#[test]
fn removable_points_of_general_functions_are_listed() {
    // sin z / z → 1 as z → 0 (series DLMF 4.19.1): removable, not a pole; zeros at ±π (and
    // ±2π > 4 lie outside; by hand)
    let v = run(json!({"task": "singularities", "f": "sin(z)/z", "region": {"shape": "circle", "center": [0, 0], "radius": 4}}));
    let removable = v["removable"].as_array().unwrap();
    assert_eq!(removable.len(), 1, "{v}");
    assert!(close(&removable[0]["at"], 0.0, 0.0, 1e-12));
    assert!(v["poles"].as_array().unwrap().is_empty());
    assert_eq!(v["zeros"].as_array().unwrap().len(), 2);
}

#[test]
fn a_product_of_many_factors_keeps_its_accuracy() {
    // 1/Π_{j=1}^{15}(s+j): expanded, its denominator is a Wilkinson-type polynomial whose roots
    // move by ~1e-6 under rounding; as typed, the factors pin them. Residue at −k is
    // 1/Π_{j≠k}(j−k) (simple-pole rule g/h′; common practice).
    let f = format!("1/({})", (1..=15).map(|j| format!("(s+{j})")).collect::<Vec<_>>().join("*"));
    let v = run(json!({"task": "singularities", "f": f, "var": "s",
                       "region": {"shape": "circle", "center": [-8, 0], "radius": 9}}));
    let poles = v["poles"].as_array().unwrap();
    assert_eq!(poles.len(), 15, "{v}");
    for p in poles {
        let (x, y) = c(&p["at"]);
        let k = (-x).round() as i64;
        assert!(((x + k as f64).powi(2) + y * y).sqrt() <= 1e-13 * k as f64, "pole near −{k}: {p}");
        let exact = 1.0 / (1..=15).filter(|&j| j != k).map(|j| (j - k) as f64).product::<f64>();
        let (re, im) = c(&p["residue"]);
        let err = (re - exact).hypot(im);
        assert!(err <= 1e-12 * exact.abs(), "residue at −{k}: {re} vs {exact}");
        assert!(err <= p["error_estimate"].as_f64().unwrap(), "estimate at −{k}");
    }
}

#[test]
fn machine_words_stand_beside_the_sentences() {
    // ∮ dz/z around |z| = 1 is 2πi (residue theorem; common practice): every way agrees.
    let r = run(json!({"task": "contour_integral", "f": "1/z",
        "contour": {"shape": "circle", "center": [0, 0], "radius": 1}}));
    assert_eq!(r["verdict"], "agree", "{r}");
    assert!(r["not_available"].as_object().unwrap().is_empty(), "{r}");
    // exp(z)/z is not rational: the outside way is not available, and says why.
    let r = run(json!({"task": "contour_integral", "f": "exp(z)/z",
        "contour": {"shape": "circle", "center": [0, 0], "radius": 1}}));
    let why = r["not_available"]["outside_residues"].as_str().unwrap();
    assert!(r["warnings"].as_array().unwrap().iter().any(|w| w == why), "{r}");
    assert!(close(&r["value"], 0.0, 2.0 * std::f64::consts::PI, 1e-10), "{r}");
    // 1/(s − 1) ↔ e^t grows (transform table; common practice): unstable, and the index
    // points at the reading with its caution.
    let r = run(json!({"task": "inverse_laplace", "F": "1/(s-1)", "t": [1.0]}));
    assert_eq!(r["stability"], "unstable", "{r}");
    let i = r["stability_warning"].as_u64().unwrap() as usize;
    assert!(r["warnings"][i].as_str().unwrap().contains("licensed engineering practice"), "{r}");
    let r = run(json!({"task": "inverse_laplace", "F": "1/(s+1)", "t": [1.0]}));
    assert_eq!(r["stability"], "stable", "{r}");
    assert!(r["stability_warning"].is_null(), "{r}");
    // z/(z − 0.5) ↔ 0.5^n (z-transform table): converges for |z| > 0.5, inside the unit circle, so stable.
    let r = run(json!({"task": "inverse_z", "X": "z/(z-0.5)", "n": [0, 1]}));
    assert_eq!(r["stability"], "stable", "{r}");
}

#[test]
fn poles_accumulating_at_infinity_leave_it_without_a_residue() {
    // csc z, sec z and z csc z have poles at nπ (or π/2 + nπ) for every integer n, which
    // accumulate at infinity: it is not an isolated singularity (common practice; the same
    // task already answered 1/sin z so). Regression: they were "regular, residue 0".
    for f in ["csc(z)", "sec(z)", "z*csc(z)", "gamma(z)", "tanh(2*z+1)"] {
        let r = run(json!({"task": "residue", "f": f, "at": "infinity"}));
        assert_eq!(r["kind"], "essential", "{f}: {r}");
        assert!(r["residue"].is_null(), "{f}: {r}");
    }
    // csc(1/z) = z + 1/(6z) + … near infinity (sin's series, DLMF 4.19.4): a simple pole with
    // Res∞ = −1/6 — an argument that does not grow keeps the ordinary classification.
    let r = run(json!({"task": "residue", "f": "csc(1/z)", "at": "infinity"}));
    assert_eq!(r["kind"], "pole", "{r}");
    assert!(close(&r["residue"], -1.0 / 6.0, 0.0, 1e-10), "{r}");
}

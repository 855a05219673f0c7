//! `pole_trails` through the doorway. Sources beside every check; the numpy digits come from
//! tests/fixtures/gen_transfer_function.py (key `trails6`).

use crate::common::{fixture, floats, ok_response};
use serde_json::{json, Value};

fn root(v: &Value) -> Option<(f64, f64)> {
    v.as_array().map(|a| (a[0].as_f64().unwrap(), a[1].as_f64().unwrap()))
}

fn trails(v: &Value) -> Vec<Vec<Option<(f64, f64)>>> {
    v.as_array().unwrap().iter().map(|t| t.as_array().unwrap().iter().map(root).collect()).collect()
}

fn dist(a: (f64, f64), b: (f64, f64)) -> f64 {
    (a.0 - b.0).hypot(a.1 - b.1)
}

fn code(request: Value) -> (String, String) {
    let (text, is_error) = residuary::api::run_json_text(&request.to_string());
    assert!(is_error, "request {request} should fail, got {text}");
    let v: Value = serde_json::from_str(&text).unwrap();
    (v["error"]["code"].as_str().unwrap().into(), v["error"]["message"].as_str().unwrap().into())
}

#[test]
fn a_second_order_family_through_its_double_pole() {
    // s² + k s + 1: poles −k/2 ± √(k²/4 − 1) (quadratic formula, by hand), complex for k < 2, a double pole
    // −1 at k = 2 (value 40 of 81), real and apart beyond.
    let r = ok_response(json!({"task": "pole_trails", "f": "1/(s^2+k*s+1)",
        "sweep": {"name": "k", "from": 0, "to": 4, "steps": 81}}));
    assert_eq!(r["name"], "k");
    let ks = floats(&r["values"]);
    assert_eq!(ks.len(), 81);
    assert_eq!((ks[0], ks[40], ks[80]), (0.0, 2.0, 4.0));
    let p = trails(&r["poles"]);
    assert_eq!(p.len(), 2);
    assert!(r["zeros"].as_array().unwrap().is_empty());
    for (i, &k) in ks.iter().enumerate() {
        let d = k * k / 4.0 - 1.0;
        let want = if d < 0.0 {
            [(-k / 2.0, (-d).sqrt()), (-k / 2.0, -(-d).sqrt())]
        } else {
            [(-k / 2.0 + d.sqrt(), 0.0), (-k / 2.0 - d.sqrt(), 0.0)]
        };
        let (a, b) = (p[0][i].unwrap(), p[1][i].unwrap());
        let err = (dist(a, want[0]) + dist(b, want[1])).min(dist(a, want[1]) + dist(b, want[0]));
        // A double root is found to about √ε (its sensitivity).
        let tol = if (k - 2.0).abs() < 1e-12 { 1e-6 } else { 1e-10 };
        assert!(err < tol, "k = {k}: got {a:?} {b:?}, want {want:?}");
    }
    // Continuity: no step of a trail is longer than the largest move of a root between two values
    // (≈ 0.23, beside the double pole, by the closed form); a swap would jump ≈ 0.45 or more.
    for t in &p {
        for w in t.windows(2) {
            assert!(dist(w[0].unwrap(), w[1].unwrap()) < 0.3, "jump {w:?}");
        }
        // Each trail keeps one side: the sign of Im before k = 2, of Re + k/2 after it.
        let im: Vec<f64> = (1..40).map(|i| t[i].unwrap().1.signum()).collect();
        assert!(im.iter().all(|&x| x == im[0]), "{im:?}");
        let re: Vec<f64> = (41..81).map(|i| (t[i].unwrap().0 + ks[i] / 2.0).signum()).collect();
        assert!(re.iter().all(|&x| x == re[0]), "{re:?}");
    }
}

#[test]
fn a_degree_six_family_matches_numpy_roots_at_every_value() {
    // numpy 2.4 roots of s⁶ + s⁵ + 3s⁴ + 2s³ + k s² + s + 1 at k = 0.5 … 6.5 (fixture).
    let fx = fixture("transfer_function");
    let t6 = &fx["trails6"];
    let r = ok_response(json!({"task": "pole_trails", "f": t6["f"],
        "sweep": {"name": "k", "from": 0.5, "to": 6.5, "steps": 13}}));
    for (got, want) in floats(&r["values"]).iter().zip(floats(&t6["k"])) {
        assert!((got - want).abs() < 1e-14);
    }
    let p = trails(&r["poles"]);
    assert_eq!(p.len(), 6);
    for (i, roots) in t6["roots"].as_array().unwrap().iter().enumerate() {
        let mut got: Vec<(f64, f64)> = p.iter().map(|t| t[i].unwrap()).collect();
        let all: Vec<(f64, f64)> = roots.as_array().unwrap().iter().map(|w| root(w).unwrap()).collect();
        for &w in &all {
            let (j, d) = got.iter().enumerate().map(|(j, g)| (j, dist(*g, w))).min_by(|a, b| a.1.total_cmp(&b.1)).unwrap();
            // numpy finds a double root only to about √ε: k = 3 factors as (s² + 1)²(s² + s + 1) (by hand).
            let double = all.iter().filter(|&&v| dist(v, w) < 1e-6).count() > 1;
            assert!(d < if double { 1e-7 } else { 1e-9 }, "k index {i}: numpy root {w:?}, nearest {:?}", got[j]);
            got.remove(j);
        }
    }
    // At k = 3 the double roots ±j exactly (the factorisation above).
    for want in [(0.0, 1.0), (0.0, -1.0)] {
        assert_eq!(p.iter().filter(|t| dist(t[5].unwrap(), want) < 1e-12).count(), 2, "double root {want:?}");
    }
    // Trails are continuous: between two values the trails' total move is the least total move of any
    // matching of the old roots to the new (brute force over the 6! = 720 permutations).
    fn perms(k: usize, p: &mut Vec<usize>, f: &mut dyn FnMut(&[usize])) {
        if k == p.len() {
            f(p);
            return;
        }
        for i in k..p.len() {
            p.swap(k, i);
            perms(k + 1, p, f);
            p.swap(k, i);
        }
    }
    for i in 0..12 {
        let moved: f64 = p.iter().map(|t| dist(t[i].unwrap(), t[i + 1].unwrap())).sum();
        let mut least = f64::INFINITY;
        perms(0, &mut (0..6).collect(), &mut |q| {
            least = least.min(q.iter().enumerate().map(|(a, &b)| dist(p[a][i].unwrap(), p[b][i + 1].unwrap())).sum());
        });
        assert!(moved <= least * (1.0 + 1e-9) + 1e-12, "step {i}: moved {moved}, least {least}");
    }
}

#[test]
fn a_degree_drop_leaves_a_gap_and_a_log_sweep() {
    // (s + a)/(a s² + s + 1): at a = 0 F = s/(s + 1), one pole (by hand); the other trail is null there.
    let r = ok_response(json!({"task": "pole_trails", "f": "(s+a)/(a*s^2+s+1)",
        "sweep": {"name": "a", "from": -1, "to": 1, "steps": 5}}));
    let p = trails(&r["poles"]);
    assert_eq!(p.len(), 2);
    assert_eq!(p.iter().filter(|t| t[2].is_none()).count(), 1);
    let at0 = p.iter().find_map(|t| t[2]).unwrap();
    assert!(dist(at0, (-1.0, 0.0)) < 1e-12);
    // The zero −a (by hand).
    let z = trails(&r["zeros"]);
    for (i, a) in floats(&r["values"]).iter().enumerate() {
        assert!(dist(z[0][i].unwrap(), (-a, 0.0)) < 1e-12);
    }
    assert!(!r["warnings"].as_array().unwrap().is_empty());
    // Log scale: 1, 10, 100 (by definition); the pole of 1/(s + c) is −c.
    let r = ok_response(json!({"task": "pole_trails", "f": "1/(s+c)",
        "sweep": {"name": "c", "from": 1, "to": 100, "steps": 3, "scale": "log"}}));
    let v = floats(&r["values"]);
    assert!((v[1] - 10.0).abs() < 1e-12 && v[2] == 100.0);
    assert!(dist(trails(&r["poles"])[0][1].unwrap(), (-10.0, 0.0)) < 1e-10);
}

#[test]
fn refusals() {
    let req = |f: &str, sweep: Value| json!({"task": "pole_trails", "f": f, "sweep": sweep});
    let sweep = json!({"name": "k", "from": 0, "to": 1});
    assert_eq!(code(req("exp(k*s)", sweep.clone())).0, "not_applicable");
    let (c, m) = code(req("1/(s+k)", json!({"name": "K", "from": 0, "to": 1})));
    assert_eq!(c, "invalid_field");
    assert!(m.contains("sweep.name"), "{m}");
    assert_eq!(code(req("1/(s+k)", json!({"name": "k", "from": 0, "to": 1, "steps": 1}))).0, "invalid_field");
    assert_eq!(code(req("1/(s+k)", json!({"name": "k", "from": 0, "to": 1, "steps": 2001}))).0, "invalid_field");
    assert_eq!(code(req("1/(s+k)", json!({"name": "k", "from": 0, "to": 1, "scale": "log"}))).0, "invalid_field");
    assert_eq!(code(req("1/(s+k)", json!({"name": "k", "from": 0, "to": 1, "scale": "cubic"}))).0, "invalid_field");
    assert_eq!(code(req("1/(s+k)", json!({"name": "k", "from": 0}))).0, "bad_request");
    assert_eq!(code(json!({"task": "pole_trails", "f": "1/(s+k)", "sweep": {"name": "k", "from": 0, "to": 1},
        "max_evaluations": 1000})).0, "budget_exhausted");
}

//! Multiplicity structure through the `singularities` task: typed products
//! analysed factor by factor, expanded coefficients by the backward error on
//! the pejorative manifold (Zeng, Math. Comp. 74, 2005).
//!
//! Truth by construction: for f = Π (z − a_j)^{−m_j} the principal part at
//! a_i is read off the binomial series of Π_{j≠i} (t + a_i − a_j)^{−m_j}
//! (partial fractions, e.g. Henrici, *Applied and Computational Complex
//! Analysis* vol. 1, §7.1): c_{−k} is the coefficient of t^{m_i − k}. Every
//! check: the order matches, each principal-part coefficient is within its
//! stated tolerance, and the residue's error estimate bounds its error.

use residuary::C;
use serde_json::{json, Value};

use crate::common::ok_response;

/// Principal part c_{−1}, …, c_{−m_i} of Π (z − a_j)^{−m_j} at a_i by the binomial series.
fn principal_part(structure: &[(C, u32)], i: usize) -> Vec<C> {
    let (a, m) = structure[i];
    let m = m as usize;
    let mut series = vec![C::new(0.0, 0.0); m];
    series[0] = C::new(1.0, 0.0);
    for (j, &(b, mj)) in structure.iter().enumerate() {
        if j == i {
            continue;
        }
        // (t + d)^{−mj} = d^{−mj} Σ_n binom(−mj, n) (t/d)^n
        let d = a - b;
        let mut term = vec![C::new(0.0, 0.0); m];
        let mut coef = d.powi(-(mj as i32));
        for (n, t) in term.iter_mut().enumerate() {
            *t = coef;
            coef *= -(mj as f64 + n as f64) / ((n + 1) as f64) / d;
        }
        let mut next = vec![C::new(0.0, 0.0); m];
        for p in 0..m {
            for q in 0..m - p {
                next[p + q] += series[p] * term[q];
            }
        }
        series = next;
    }
    (1..=m).map(|k| series[m - k]).collect()
}

fn singularities(f: &str, radius: f64) -> Value {
    ok_response(json!({"task": "singularities", "f": f, "region": {"shape": "circle", "center": [0, 0], "radius": radius}}))
}

fn c(v: &Value) -> C {
    C::new(v[0].as_f64().unwrap(), v[1].as_f64().unwrap())
}

/// Check every pole of the response against the structure (all of it inside the region).
fn check_structure(f: &str, resp: &Value, structure: &[(C, u32)], relative: f64) {
    let poles = resp["poles"].as_array().unwrap();
    assert_eq!(poles.len(), structure.len(), "{f}: {} poles, expected {}: {resp}", poles.len(), structure.len());
    for (i, &(a, m)) in structure.iter().enumerate() {
        let p = poles
            .iter()
            .min_by(|x, y| (c(&x["at"]) - a).norm().total_cmp(&(c(&y["at"]) - a).norm()))
            .unwrap();
        assert_eq!(p["order"].as_u64().unwrap(), m as u64, "{f}: order at {a}: {p}");
        let want = principal_part(structure, i);
        let got: Vec<C> = p["principal_part"].as_array().unwrap().iter().map(c).collect();
        let scale = want.iter().map(|x| x.norm()).fold(0.0, f64::max);
        for (k, (g, w)) in got.iter().zip(&want).enumerate() {
            assert!((g - w).norm() <= relative * scale, "{f}: c_-{} at {a}: {g} vs {w} (scale {scale:e})", k + 1);
        }
        let estimate = p["error_estimate"].as_f64().unwrap();
        assert!((got[0] - want[0]).norm() <= estimate + 1e-15 * scale, "{f}: residue error {:e} > estimate {estimate:e} at {a}", (got[0] - want[0]).norm());
    }
}

#[test]
fn the_first_repeated_pole_of_a_transform_table_stays_two_poles() {
    // 1/(s(s+1)^2) = 1/s − 1/(s+1) − 1/(s+1)^2 (transform tables, from memory; binomial series here).
    let f = "1/(s*(s+1)^2)";
    let r = ok_response(json!({"task": "singularities", "f": f, "var": "s", "region": {"shape": "circle", "center": [0, 0], "radius": 3}}));
    check_structure(f, &r, &[(C::new(0.0, 0.0), 1), (C::new(-1.0, 0.0), 2)], 1e-12);
}

#[test]
fn typed_factors_keep_poles_0_42_apart_distinct() {
    // (s + 1.41)^4 (s^2 + 3.46 s + 3.2954)^4: the quadratic is (s + 1.73)^2 + 0.55^2 (by hand),
    // so three poles of order 4 (issue report: one pole of order 12 before).
    let f = "1/((s+1.41)^4*(s^2+3.46*s+3.2954)^4)";
    let r = ok_response(json!({"task": "singularities", "f": f, "var": "s", "region": {"shape": "circle", "center": [0, 0], "radius": 5}}));
    let s = [(C::new(-1.41, 0.0), 4), (C::new(-1.73, 0.55), 4), (C::new(-1.73, -0.55), 4)];
    check_structure(f, &r, &s, 1e-10);
    // The orders are stated by the typed powers: no "could be separate poles" caution.
    assert!(r["warnings"].as_array().unwrap().iter().all(|w| !w.as_str().unwrap().contains("could also be")), "{r}");
}

#[test]
fn the_same_structure_from_expanded_decimal_coefficients() {
    // The product above expanded exactly (sympy 1.14 expand on the decimals as rationals); the
    // binary rounding of these decimals is the only perturbation.
    let f = "1/(s^12+19.48*s^11+174.9974*s^10+958.279828*s^9+3561.26256697*s^8+9459.2350521992*s^7\
             +18407.751985986224*s^6+26435.35837247704304*s^5+27797.0775425441732824*s^4\
             +20865.201408482624000736*s^3+10609.36595671070814018912*s^2\
             +3280.019115822229696549824*s+466.1320877763522081060224)";
    let r = ok_response(json!({"task": "singularities", "f": f, "var": "s", "region": {"shape": "circle", "center": [0, 0], "radius": 5}}));
    let s = [(C::new(-1.41, 0.0), 4), (C::new(-1.73, 0.55), 4), (C::new(-1.73, -0.55), 4)];
    check_structure(f, &r, &s, 1e-10);
}

#[test]
fn a_double_and_a_simple_pole_1e_6_apart_as_typed() {
    // 1/((z − a)^2 (z − b)), d = b − a: Res_b = 1/d², c₋₁(a) = −1/d², c₋₂(a) = −1/d (by hand).
    let f = "1/((z-1.456)^2*(z-1.456001456))";
    let r = singularities(f, 3.0);
    let (a, b) = (1.456f64, 1.456001456f64);
    check_structure(f, &r, &[(C::new(a, 0.0), 2), (C::new(b, 0.0), 1)], 1e-8);
}

#[test]
fn three_triple_poles_keep_their_integer_principal_parts() {
    // 1/((s+1)^3 (s+1.5)^3 (s+2)^3): c₋₁ = 384, −768, 384 (sympy 1.14 apart; also the binomial series).
    let f = "1/((s+1)^3*(s+1.5)^3*(s+2)^3)";
    let r = ok_response(json!({"task": "singularities", "f": f, "var": "s", "region": {"shape": "circle", "center": [0, 0], "radius": 5}}));
    check_structure(f, &r, &[(C::new(-1.0, 0.0), 3), (C::new(-1.5, 0.0), 3), (C::new(-2.0, 0.0), 3)], 1e-12);
}

#[test]
fn degree_1000_typed_as_ten_factors_has_no_merges() {
    // Π_k 1/(z^100 − c_k): at a root r of factor k, Res = 1/(100 r^99) · Π_{j≠k} 1/(c_k − c_j)
    // (simple pole of g/h with h′ = 100 r^99 and r^100 = c_k; by construction).
    let cs = [0.5, 0.55, 0.6, 0.65, 0.7, 0.75, 0.8, 0.85, 0.9, 0.95];
    let f = format!("1/({})", cs.iter().map(|c| format!("(z^100-{c})")).collect::<Vec<_>>().join("*"));
    let r = singularities(&f, 2.0);
    let poles = r["poles"].as_array().unwrap();
    assert_eq!(poles.len(), 1000, "merged or lost poles");
    for p in poles {
        assert_eq!(p["order"], 1);
        let z = c(&p["at"]);
        let k = (0..10).min_by(|&i, &j| (z.powu(100) - cs[i]).norm().total_cmp(&(z.powu(100) - cs[j]).norm())).unwrap();
        let mut want = (100.0 * z.powu(99)).inv();
        for (j, cj) in cs.iter().enumerate() {
            if j != k {
                want /= cs[k] - cj;
            }
        }
        let got = c(&p["residue"]);
        assert!((got - want).norm() <= 1e-10 * want.norm(), "{z}: {got} vs {want}");
        assert!((got - want).norm() <= p["error_estimate"].as_f64().unwrap(), "{z}: estimate");
    }
}

#[test]
fn seeded_expanded_structures_up_to_multiplicity_5() {
    // Random structures (seeded LCG): 1–4 distinct roots on a grid of quarters, multiplicities
    // 1–5, degree ≤ 30, typed as expanded coefficients (exact in binary: dyadic roots).
    let mut state: u64 = 0x5eed_0008;
    let mut next = |n: u64| {
        state = state.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
        (state >> 33) % n
    };
    for case in 0..40 {
        let k = 1 + next(4) as usize;
        let mut s: Vec<(C, u32)> = Vec::new();
        while s.len() < k {
            let a = C::new((next(25) as f64 - 12.0) / 4.0, (next(17) as f64 - 8.0) / 4.0);
            if s.iter().all(|(b, _)| (a - b).norm() > 0.2) {
                s.push((a, 1 + next(5) as u32));
            }
        }
        let all: Vec<C> = s.iter().flat_map(|&(z, m)| std::iter::repeat_n(z, m as usize)).collect();
        let p = residuary::poly::from_roots(C::new(1.0, 0.0), &all);
        let terms: Vec<String> = p
            .iter()
            .enumerate()
            .filter(|(_, c)| c.norm() > 0.0)
            .map(|(n, c)| format!("({:?}{:+?}i)*z^{n}", c.re, c.im))
            .collect();
        let f = format!("1/({})", terms.join("+"));
        let r = singularities(&f, 10.0);
        check_structure(&format!("case {case}: {s:?}"), &r, &s, 1e-9);
    }
}

#[test]
fn ill_conditioned_expanded_input_is_flagged() {
    // z² − 2.000001 z + 1.000001 = (z − 1)(z − 1.000001) in decimals; in binary the poles move by
    // ~1e-11 and the residues ±1e6 by ~1e-4 relative (common practice: the residue's condition
    // is 1/|spacing|). The error estimate must cover the decimal truth and a warning must say so.
    let r = singularities("1/(z^2-2.000001*z+1.000001)", 5.0);
    for p in r["poles"].as_array().unwrap() {
        let sign = if c(&p["at"]).re > 1.0000005 { 1.0 } else { -1.0 };
        let err = (c(&p["residue"]) - C::new(sign * 1e6, 0.0)).norm();
        assert!(err <= p["error_estimate"].as_f64().unwrap(), "{p}");
    }
    assert!(r["warnings"].as_array().unwrap().iter().any(|w| w.as_str().unwrap().contains("sensitive")), "{r}");
}

//! Aberth–Ehrlich roots and multiplicities against outside references.


use residuary::poly::aberth_ehrlich::{roots, MAX_DEGREE};
use residuary::poly::multiplicity::distinct_roots;
use residuary::poly::{abs_eval, eval, from_roots};
use residuary::C;
use crate::common::list;
use serde_json::Value;

fn c(re: f64, im: f64) -> C {
    C::new(re, im)
}

fn fixtures() -> Value {
    crate::common::fixture("rational")
}



/// Max over roots of |p(r)| / Σ|p_k||r|^k (normwise backward error, common practice),
/// through the reversed polynomial where |r| > 1 so nothing overflows; NaN fails loudly.
fn backward_error(p: &[C], rs: &[C]) -> f64 {
    let rp: Vec<C> = p.iter().rev().copied().collect();
    let mut worst = 0.0f64;
    for &r in rs {
        let be = if r.norm() <= 1.0 {
            eval(p, r).norm() / abs_eval(p, r.norm())
        } else {
            eval(&rp, r.inv()).norm() / abs_eval(&rp, 1.0 / r.norm())
        };
        assert!(be.is_finite(), "backward error at {r} is not finite");
        worst = worst.max(be);
    }
    worst
}

/// Deterministic pseudo-random numbers in [-1, 1) (64-bit LCG, Knuth MMIX constants).
struct Lcg(u64);
impl Lcg {
    fn next(&mut self) -> f64 {
        self.0 = self
            .0
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        ((self.0 >> 11) as f64 / (1u64 << 53) as f64) * 2.0 - 1.0
    }
}

#[test]
fn fixture_polynomials_match_mpmath_within_estimates() {
    // mpmath 1.3.0, 40 digits (tests/fixtures/gen_rational.py); tolerances per case.
    let fx = fixtures();
    let cases = fx["roots"].as_array().unwrap();
    assert!(cases.len() >= 4, "fixture lost its cases");
    for case in cases {
        let name = case["name"].as_str().unwrap();
        let p = list(&case["coeffs"]);
        let want = list(&case["roots"]);
        let got = roots(&p).unwrap();
        assert!(got.converged, "{name}");
        assert_eq!(got.roots.len(), want.len(), "{name}");
        let tol = match name {
            // our accuracy targets; monomial-basis conditioning limits these three (common practice)
            "Wilkinson-like degree 10" => 1e-9,
            "Chebyshev T_20" => 1e-11,
            "Legendre P_10" => 1e-12,
            _ => 1e-14,
        };
        for w in &want {
            let (i, d) = got
                .roots
                .iter()
                .enumerate()
                .map(|(i, r)| (i, (r - w).norm()))
                .min_by(|a, b| a.1.total_cmp(&b.1))
                .unwrap();
            assert!(d <= tol, "{name}: root {w} off by {d}");
            assert!(
                d <= got.errors[i],
                "{name}: root {w} off by {d} > estimate {}",
                got.errors[i]
            );
        }
        assert!(backward_error(&p, &got.roots) < 1e-14, "{name}");
    }
}

#[test]
fn chebyshev_roots_closed_form() {
    // T_20 zeros cos((2k−1)π/40): from T_n(cos θ) = cos nθ (DLMF §18.5, from memory;
    // common practice)
    let fx = fixtures();
    let case = fx["roots"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["name"] == "Chebyshev T_20")
        .unwrap();
    let got = roots(&list(&case["coeffs"])).unwrap();
    let mut re: Vec<f64> = got.roots.iter().map(|z| z.re).collect();
    re.sort_by(f64::total_cmp);
    for (k, r) in (1..=20).rev().zip(re) {
        let want = ((2 * k - 1) as f64 * std::f64::consts::PI / 40.0).cos();
        assert!((r - want).abs() < 1e-11, "{r} vs {want}");
    }
}

#[test]
fn known_roots_by_construction_are_recovered() {
    // roots by construction (product of linear factors), degree 25, well separated
    let mut g = Lcg(7);
    let want: Vec<C> = (0..25).map(|_| c(2.0 * g.next(), 2.0 * g.next())).collect();
    let p = from_roots(c(0.5, -1.5), &want);
    let got = roots(&p).unwrap();
    for w in &want {
        let (i, d) = got
            .roots
            .iter()
            .enumerate()
            .map(|(i, r)| (i, (r - w).norm()))
            .min_by(|a, b| a.1.total_cmp(&b.1))
            .unwrap();
        assert!(
            d <= got.errors[i],
            "root {w} off by {d} > {}",
            got.errors[i]
        );
        assert!(d < 1e-6, "root {w} off by {d}");
    }
}

#[test]
fn large_random_degrees_have_tiny_backward_error() {
    // normwise backward error should be a small multiple of the unit roundoff (common
    // practice for Aberth–Ehrlich with Newton correction; cf. Bini 1996, from memory)
    for (deg, seed) in [(100usize, 1u64), (500, 2), (1000, 3)] {
        let mut g = Lcg(seed);
        let p: Vec<C> = (0..=deg).map(|_| c(g.next(), g.next())).collect();
        let got = roots(&p).unwrap();
        assert_eq!(got.roots.len(), deg);
        assert!(got.converged);
        let be = backward_error(&p, &got.roots);
        assert!(be < 1e-13, "degree {deg}: backward error {be}");
    }
}

#[test]
fn wide_coefficient_range() {
    // roots 1e-8, 1, 1e8, 3e4 i by construction: relative accuracy near unit roundoff
    let want = [c(1e-8, 0.0), c(1.0, 0.0), c(1e8, 0.0), c(0.0, 3e4)];
    let got = roots(&from_roots(c(1.0, 0.0), &want)).unwrap();
    for w in want {
        let d = got
            .roots
            .iter()
            .map(|r| (r - w).norm() / w.norm())
            .fold(f64::INFINITY, f64::min);
        assert!(d < 1e-12, "{w}: relative error {d}");
    }
}

#[test]
fn low_degrees_and_zero_coefficients() {
    // z^3 (2z − 3) (z^2 + 4): roots 0,0,0, 1.5, ±2i by construction
    let p = from_roots(
        c(2.0, 0.0),
        &[
            c(0.0, 0.0),
            c(0.0, 0.0),
            c(0.0, 0.0),
            c(1.5, 0.0),
            c(0.0, 2.0),
            c(0.0, -2.0),
        ],
    );
    let got = roots(&p).unwrap();
    assert_eq!(got.roots.iter().filter(|z| **z == c(0.0, 0.0)).count(), 3);
    let (cl, _) = distinct_roots(&p).unwrap();
    let zero = cl.iter().find(|k| k.center == c(0.0, 0.0)).unwrap();
    assert_eq!(zero.multiplicity, 3);
    // quadratic z^2 − 1e8 z + 1 : roots 1e8 and 1e-8 (to 16 digits) without cancellation (common practice)
    let q = roots(&[c(1.0, 0.0), c(-1e8, 0.0), c(1.0, 0.0)]).unwrap();
    let small = q
        .roots
        .iter()
        .map(|z| z.norm())
        .fold(f64::INFINITY, f64::min);
    assert!((small - 1e-8).abs() < 1e-22, "{small}");
    // linear 4z + 2 = 0 → −0.5 (by hand)
    assert_eq!(
        roots(&[c(2.0, 0.0), c(4.0, 0.0)]).unwrap().roots,
        vec![c(-0.5, 0.0)]
    );
    // a nonzero constant has no roots; trailing zero top coefficients are ignored (by hand)
    assert!(roots(&[c(3.0, 0.0), c(0.0, 0.0)]).unwrap().roots.is_empty());
}

#[test]
fn bad_input_is_an_error_not_a_panic() {
    assert!(roots(&[]).is_err());
    assert!(roots(&[c(1.0, 0.0), c(f64::INFINITY, 0.0)]).is_err());
    assert!(roots(&vec![c(1.0, 0.0); MAX_DEGREE + 2]).is_err());
}

#[test]
fn multiplicities_three_two_one() {
    // (z−1)^3 (z+2)^2 (z−i) expanded: multiplicities by construction
    let one = c(1.0, 0.0);
    let p = from_roots(
        one,
        &[one, one, one, c(-2.0, 0.0), c(-2.0, 0.0), c(0.0, 1.0)],
    );
    let (cl, ok) = distinct_roots(&p).unwrap();
    assert!(ok);
    let find = |w: C| cl.iter().find(|k| (k.center - w).norm() < 1e-3).unwrap();
    let (a, b, i) = (find(one), find(c(-2.0, 0.0)), find(c(0.0, 1.0)));
    assert_eq!((a.multiplicity, b.multiplicity, i.multiplicity), (3, 2, 1));
    for (k, w) in [(a, one), (b, c(-2.0, 0.0)), (i, c(0.0, 1.0))] {
        let err = (k.center - w).norm();
        assert!(err < 1e-10, "{w}: {err}");
        assert!(
            err <= k.error.max(1e-300),
            "{w}: {err} > estimate {}",
            k.error
        );
        assert!(k.resolved);
    }
    // the individual cluster members are far worse than the refined center: a triple root
    // moves by about eps^(1/3) ~ 6e-6 under rounding (perturbation theory, common practice)
    assert!(a.spread > 1e-8);
}

#[test]
fn high_multiplicity_with_rounded_root() {
    // (z − 0.3)^5 (z + 1) with 0.3 not exact in binary: one cluster of 5 (by construction)
    let r = c(0.3, 0.0);
    let p = from_roots(c(1.0, 0.0), &[r, r, r, r, r, c(-1.0, 0.0)]);
    let (cl, _) = distinct_roots(&p).unwrap();
    let k = cl.iter().find(|k| (k.center - r).norm() < 1e-2).unwrap();
    assert_eq!(k.multiplicity, 5);
    let err = (k.center - r).norm();
    assert!(err < 1e-9 && err <= k.error, "{err} vs {}", k.error);
}

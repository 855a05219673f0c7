//! Rational detection and structural analysis tests. Expected coefficients
//! are expanded by hand (common practice: binomial expansion).

use residuary::expr::rational::MAX_DEGREE;
use residuary::poly::eval;
use residuary::expr::{Analysis, Function};
use residuary::C;

fn r(x: f64) -> C {
    C::new(x, 0.0)
}

fn fun(src: &str, var: &str, params: &[(String, C)]) -> Function {
    Function::compile(src, var, params).unwrap_or_else(|e| panic!("{src}: {e}"))
}

#[test]
fn product_of_linear_factors() {
    // (s+1)(s+2) = s^2 + 3s + 2 (by hand)
    let f = fun("(s+1)(s+2)", "s", &[]);
    let q = f.rational().expect("rational");
    assert_eq!(q.num, vec![r(2.0), r(3.0), r(1.0)]);
    assert_eq!(q.den, vec![r(1.0)]);
}

#[test]
fn second_order_low_pass_with_parameters() {
    // wn^2/(s^2 + 2 zeta wn s + wn^2) with wn = 3, zeta = 0.25: 9/(s^2 + 1.5 s + 9) (by hand)
    let params = vec![("wn".to_string(), r(3.0)), ("zeta".to_string(), r(0.25))];
    let f = fun("wn^2/(s^2+2*zeta*wn*s+wn^2)", "s", &params);
    let q = f.rational().expect("rational");
    assert_eq!(q.num, vec![r(9.0)]);
    assert_eq!(q.den, vec![r(9.0), r(1.5), r(1.0)]);
}

#[test]
fn negative_integer_power() {
    // (z-1)^-2 = 1/(z^2 - 2z + 1) (binomial expansion by hand)
    let q = fun("(z-1)^-2", "z", &[])
        .rational()
        .cloned()
        .expect("rational");
    assert_eq!(q.num, vec![r(1.0)]);
    assert_eq!(q.den, vec![r(1.0), r(-2.0), r(1.0)]);
}

#[test]
fn sums_of_fractions() {
    // identical denominators are combined without growth: 1/(z-1) + 2/(z-1) = 3/(z-1)
    let q = fun("1/(z-1)+2/(z-1)", "z", &[])
        .rational()
        .cloned()
        .unwrap();
    assert_eq!(q.num, vec![r(3.0)]);
    assert_eq!(q.den, vec![r(-1.0), r(1.0)]);
    // 1/(z-1) + 1/(z+1) = 2z/(z^2-1) (by hand)
    let q = fun("1/(z-1)+1/(z+1)", "z", &[])
        .rational()
        .cloned()
        .unwrap();
    assert_eq!(q.num, vec![r(0.0), r(2.0)]);
    assert_eq!(q.den, vec![r(-1.0), r(0.0), r(1.0)]);
    // property: a partial-fraction style sum with complex constants, once combined,
    // agrees with direct evaluation
    let src = "(2+i)/(z-1) - 3/(z+2i)^2 + z^3/4 + exp(1)";
    let f = fun(src, "z", &[]);
    let q = f.rational().unwrap();
    for z in [C::new(0.3, 0.7), C::new(-2.0, 1.5)] {
        let direct = f.eval(z);
        let via = eval(&q.num, z) / eval(&q.den, z);
        assert!(
            (direct - via).norm() < 1e-13 * direct.norm(),
            "{src}: {direct} vs {via}"
        );
    }
}

#[test]
fn constants_and_polynomials() {
    let q = fun("3", "z", &[]).rational().cloned().unwrap();
    assert_eq!((q.num, q.den), (vec![r(3.0)], vec![r(1.0)]));
    let q = fun("z - z", "z", &[]).rational().cloned().unwrap();
    // The zero function: the zero polynomial is empty (the one convention, `residuary::poly`).
    assert!(q.num.is_empty(), "{:?}", q.num);
    // constant subexpressions are folded: z/2 + sqrt(4)
    let q = fun("z/2 + sqrt(4)", "z", &[]).rational().cloned().unwrap();
    assert_eq!(q.num, vec![r(2.0), r(0.5)]);
    assert_eq!(q.den, vec![r(1.0)]);
    // (1+z)^5 binomial coefficients 1 5 10 10 5 1 (binomial theorem, common practice)
    let q = fun("(1+z)^5", "z", &[]).rational().cloned().unwrap();
    assert_eq!(q.num, [1.0, 5.0, 10.0, 10.0, 5.0, 1.0].map(r).to_vec());
}

#[test]
fn non_rational_is_none() {
    for src in [
        "exp(z)",
        "z^0.5",
        "sqrt(z)",
        "z^z",
        "2^z",
        "gamma(z)",
        "1/(z - z)",
        "sin(1/z)*z",
    ] {
        assert!(fun(src, "z", &[]).rational().is_none(), "{src}");
    }
}

#[test]
fn degree_limit_declines() {
    assert!(fun(&format!("z^{MAX_DEGREE}"), "z", &[])
        .rational()
        .is_some());
    let f = fun(&format!("z^{}", MAX_DEGREE + 1), "z", &[]);
    assert!(f.rational().is_none());
    // still evaluates fine
    assert_eq!(f.eval(r(1.0)), r(1.0));
    assert!(fun("(z+1)^100000000", "z", &[]).rational().is_none());
    assert!(fun("1/(z^1500 + 1) + 1/(z^1500 - 1)", "z", &[])
        .rational()
        .is_none());
}

fn has(points: &[C], p: C) -> bool {
    points.iter().any(|q| (q - p).norm() < 1e-14)
}

#[test]
fn analysis_candidates() {
    let a = fun("exp(1/(z-2))", "z", &[]).analysis().clone();
    assert!(has(&a.essential_candidates, r(2.0)));
    assert!(!a.uses_branch_functions);
    assert!(
        !a.is_entire_transcendental_at_infinity,
        "exp(1/(z-2)) -> 1 at infinity"
    );

    let a = fun("sqrt((z-1)/(z+1))", "z", &[]).analysis().clone();
    assert!(a.uses_branch_functions);
    assert!(has(&a.branch_candidates, r(1.0)) && has(&a.branch_candidates, r(-1.0)));

    let a = fun("log(z)", "z", &[]).analysis().clone();
    assert!(has(&a.branch_candidates, r(0.0)));

    // quadratic denominator solved exactly: z^2 + 4 -> ±2i
    let a = fun("sin(1/(z^2+4))", "z", &[]).analysis().clone();
    assert!(
        has(&a.essential_candidates, C::new(0.0, 2.0))
            && has(&a.essential_candidates, C::new(0.0, -2.0))
    );

    // cubic denominator handed on as a polynomial
    let a = fun("cos(z/(z^3-2))", "z", &[]).analysis().clone();
    assert_eq!(
        a.essential_candidate_polys,
        vec![vec![r(-2.0), r(0.0), r(0.0), r(1.0)]]
    );

    // asin(w): w = ±1 and poles of w; atan(w): w = ±i
    let a = fun("asin(z/2)", "z", &[]).analysis().clone();
    assert!(has(&a.branch_candidates, r(2.0)) && has(&a.branch_candidates, r(-2.0)));
    let a = fun("atan(z)", "z", &[]).analysis().clone();
    assert!(
        has(&a.branch_candidates, C::new(0.0, 1.0)) && has(&a.branch_candidates, C::new(0.0, -1.0))
    );

    let a = fun("gamma(z)/(z+1)", "z", &[]).analysis().clone();
    assert!(a.has_gamma && a.is_entire_transcendental_at_infinity);
    let a = fun("exp(-z)*(z+1)", "z", &[]).analysis().clone();
    assert!(a.is_entire_transcendental_at_infinity && !a.has_gamma);
    // a rational function: nothing essential or branched; its denominator's zeros ±2i
    // are pole candidates (quadratic formula; common practice)
    let a = fun("(z+1)/(z^2+4)", "z", &[]).analysis().clone();
    assert!(has(&a.pole_candidates, C::new(0.0, 2.0)) && has(&a.pole_candidates, C::new(0.0, -2.0)));
    assert_eq!(Analysis { pole_candidates: Vec::new(), ..a }, Default::default());
    // sin z / z and a negative power: 0 and 1 are where poles or removable points may sit
    let a = fun("sin(z)/z + exp(z)*(z-1)^-2", "z", &[]).analysis().clone();
    assert!(has(&a.pole_candidates, r(0.0)) && has(&a.pole_candidates, r(1.0)));
    let a = fun("z^(1/3)", "z", &[]).analysis().clone();
    assert!(a.uses_branch_functions && has(&a.branch_candidates, r(0.0)));
}

//! Recognition of F(s) = Σₖ e^{−τₖ s}·Gₖ(s), Gₖ rational, τₖ real, from the
//! expression tree (not numerically).
//!
//! Method: a bottom-up walk over the resolved expression (parameters
//! substituted, constants folded) that keeps every subtree as a finite sum of
//! (τ, G) pairs: constants and the variable are (0, c) and (0, s); sums join
//! the lists (equal τ merged); products multiply pairwise (τ₁ + τ₂, G₁G₂);
//! quotients and negative powers need a single-term divisor (τ₁ − τ₂, G₁/G₂);
//! non-negative integer powers multiply out; `exp(a + b·s)` with constants a,
//! b (b real) is (−b, e^{a}), and k^(a + b·s) is exp((a + b·s)·ln k). Anything
//! else (a sum in a denominator, sqrt, exp of s², …) is not of this form. The
//! rational parts use `crate::expr::rational`'s exact expansion. This is the
//! shift theorem L[g(t − τ)H(t − τ)] = e^{−τs}G(s) read backwards (common
//! practice); τ is read as typed, so `exp(-s)` has τ = 1 exactly.
//!
//! ```
//! use residuary::transforms::laplace::delay_terms::delay_terms;
//! // The unit pulse (1 − e^{−s})/s = 1/s − e^{−s}/s: two terms, τ = 0 and τ = 1.
//! let terms = delay_terms("(1-exp(-s))/s", "s", &[]).unwrap();
//! assert_eq!(terms.iter().map(|k| k.tau).collect::<Vec<_>>(), vec![0.0, 1.0]);
//! // Rational F has no delay, and sqrt is not of this form.
//! assert!(delay_terms("1/(s+1)", "s", &[]).is_none());
//! assert!(delay_terms("exp(-s)/sqrt(s)", "s", &[]).is_none());
//! ```

use crate::expr::compile::{resolve, R};
use crate::expr::rational::{Rational, RationalBuilder};
use crate::expr::{parse, BinOp, Func};
use crate::C;

/// Most terms a sum may hold (products multiply the count).
pub const MAX_TERMS: usize = 64;

/// One term e^{−τ s}·G(s).
#[derive(Debug, Clone, PartialEq)]
pub struct DelayTerm {
    /// The delay τ (as typed, parameters substituted).
    pub tau: f64,
    /// G = num/den (not reduced).
    pub g: Rational,
}

type Sum = Vec<(f64, Rational)>;

/// The terms of F, sorted by τ, when F has this form with at least one τ > 0
/// and every τ ≥ 0 (a causal delay); `None` otherwise (including a
/// time advance τ < 0, left to the general inversion).
pub fn delay_terms(src: &str, var: &str, params: &[(String, C)]) -> Option<Vec<DelayTerm>> {
    let tree = resolve(&parse(src).ok()?, var, params).ok()?;
    let mut b = RationalBuilder::new();
    let mut sum = walk(&tree, &mut b)?;
    sum.retain(|(_, g)| !g.num.is_empty());
    sum.sort_by(|x, y| x.0.total_cmp(&y.0));
    if !sum.iter().any(|(tau, _)| *tau > 0.0) || sum.iter().any(|(tau, _)| !(*tau >= 0.0 && tau.is_finite())) {
        return None;
    }
    Some(sum.into_iter().map(|(tau, g)| DelayTerm { tau, g }).collect())
}

/// True when Σ e^{−τₖ s}Gₖ(s) equals `f` at a few points right of the
/// imaginary axis (a guard against a wrong decomposition), relative 1e-9.
pub fn matches(terms: &[DelayTerm], f: &dyn Fn(C) -> C) -> bool {
    [C::new(1.3, 0.7), C::new(0.4, -2.1), C::new(2.2, 3.3), C::new(0.9, 0.0)].iter().all(|&s| {
        let mut sum = C::new(0.0, 0.0);
        let mut scale: f64 = 0.0;
        for k in terms {
            let v = (-k.tau * s).exp() * crate::poly::eval(&k.g.num, s) / crate::poly::eval(&k.g.den, s);
            sum += v;
            scale = scale.max(v.norm());
        }
        let want = f(s);
        if !(sum.is_finite() && want.is_finite()) {
            // A pole at a sample point: say nothing against the decomposition.
            return !want.is_finite() && !sum.is_finite();
        }
        (sum - want).norm() <= 1e-9 * scale.max(want.norm()).max(f64::MIN_POSITIVE)
    })
}

fn walk(e: &R, b: &mut RationalBuilder) -> Option<Sum> {
    match e {
        R::Const(c) => Some(vec![(0.0, b.constant(*c)?)]),
        R::Var => Some(vec![(0.0, b.variable())]),
        R::Neg(x) => Some(walk(x, b)?.into_iter().map(|(tau, g)| (tau, b.neg(g))).collect()),
        R::Bin(op, x, y) => {
            // exp-like powers k^(a + b s) first: the exponent need not be a plain sum.
            if let (BinOp::Pow, Some(k), None) = (op, x.as_const(), y.as_const()) {
                return exponential(&walk(y, b)?, k.ln(), b);
            }
            let sx = walk(x, b)?;
            match op {
                BinOp::Add => add(sx, walk(y, b)?, b),
                BinOp::Sub => {
                    let sy = walk(y, b)?.into_iter().map(|(tau, g)| (tau, b.neg(g))).collect();
                    add(sx, sy, b)
                }
                BinOp::Mul => mul(&sx, &walk(y, b)?, b),
                BinOp::Div => {
                    let sy = walk(y, b)?;
                    let [(ty, gy)] = sy.as_slice() else { return None };
                    sx.iter().map(|(tx, gx)| Some((tx - ty, b.div(gx, gy)?))).collect()
                }
                BinOp::Pow => {
                    let n = crate::expr::program::as_small_integer(y.as_const()?)?;
                    if let [(tx, gx)] = sx.as_slice() {
                        return Some(vec![(tx * n as f64, b.powi(gx, n as i64)?)]);
                    }
                    // A sum raised to a power: multiplied out (at most MAX_TERMS factors).
                    if !(0..=MAX_TERMS as i32).contains(&n) {
                        return None;
                    }
                    let mut acc = vec![(0.0, b.constant(C::new(1.0, 0.0))?)];
                    for _ in 0..n {
                        acc = mul(&acc, &sx, b)?;
                    }
                    Some(acc)
                }
            }
        }
        R::Call(Func::Exp, x) => exponential(&walk(x, b)?, C::new(1.0, 0.0), b),
        R::Call(..) => None,
    }
}

/// exp(factor·arg) for an argument a + b·s (one undelayed polynomial term of degree ≤ 1).
fn exponential(arg: &Sum, factor: C, b: &mut RationalBuilder) -> Option<Sum> {
    let [(tau, g)] = arg.as_slice() else { return None };
    if *tau != 0.0 || g.den != [C::new(1.0, 0.0)] || g.num.len() > 2 {
        return None;
    }
    let a = g.num.first().copied().unwrap_or_default() * factor;
    let slope = g.num.get(1).copied().unwrap_or_default() * factor;
    if slope.im != 0.0 || !slope.re.is_finite() {
        return None;
    }
    Some(vec![(-slope.re + 0.0, b.constant(a.exp())?)])
}

fn add(mut x: Sum, y: Sum, b: &mut RationalBuilder) -> Option<Sum> {
    for (tau, g) in y {
        match x.iter_mut().find(|(t, _)| *t == tau) {
            Some((_, h)) => *h = b.add(h, &g)?,
            None => x.push((tau, g)),
        }
    }
    (x.len() <= MAX_TERMS).then_some(x)
}

fn mul(x: &Sum, y: &Sum, b: &mut RationalBuilder) -> Option<Sum> {
    if x.len() * y.len() > MAX_TERMS * MAX_TERMS {
        return None;
    }
    let mut out: Sum = Vec::new();
    for (tx, gx) in x {
        for (ty, gy) in y {
            out = add(out, vec![(tx + ty, b.mul(gx, gy)?)], b)?;
        }
    }
    Some(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::expr::Function;

    fn taus(src: &str) -> Vec<f64> {
        delay_terms(src, "s", &[]).unwrap_or_default().iter().map(|k| k.tau).collect()
    }

    #[test]
    fn delays_are_read_exactly_as_typed() {
        // The shift theorem read backwards (common practice): each e^{−τs} factor is a delay τ.
        assert_eq!(taus("exp(-s)/(s^2+1)"), vec![1.0]);
        assert_eq!(taus("exp(-2*s)/(s+1)"), vec![2.0]);
        assert_eq!(taus("exp(-s*0.3)/(s+1)"), vec![0.3]);
        assert_eq!(taus("(1-exp(-s))^2/s^2"), vec![0.0, 1.0, 2.0]);
        assert_eq!(taus("(1/s)*(1+exp(-s)+exp(-2*s))"), vec![0.0, 1.0, 2.0]);
        assert_eq!(taus("e^(-s)/s"), vec![1.0]);
        assert_eq!(taus("1/(s*exp(s))"), vec![1.0]);
        assert_eq!(taus("exp(-s)^3/s"), vec![3.0]);
        assert_eq!(taus("(1-exp(-s))^100000/s"), Vec::<f64>::new(), "too many terms: not taken");
        let with_param = delay_terms("exp(-T*s)/s", "s", &[("T".into(), C::new(2.5, 0.0))]).unwrap();
        assert_eq!(with_param[0].tau, 2.5);
        // exp(−a s − b): the constant factor e^{−b} moves into G.
        let k = delay_terms("exp(-2*s-1)/s", "s", &[]).unwrap();
        assert_eq!(k[0].tau, 2.0);
        assert!((k[0].g.num[0].re - (-1.0f64).exp()).abs() < 1e-16);
    }

    #[test]
    fn other_forms_are_not_taken() {
        for src in ["1/(s+1)", "exp(s)/s", "exp(-s^2)", "1/(1-exp(-s))", "sqrt(s)*exp(-s)", "exp(-i*s)/s", "exp(-s)-exp(-s)"] {
            assert!(delay_terms(src, "s", &[]).is_none(), "{src}");
        }
    }

    #[test]
    fn the_decomposition_equals_the_expression() {
        // Slow reference: the compiled expression itself at sample points.
        for src in ["(1-exp(-s))^2/s^2", "exp(-s)/(s^2+1) + 3/(s+2)", "(s+1)*exp(-0.5*s)*exp(-s)/(s^3+2)"] {
            let f = Function::compile(src, "s", &[]).unwrap();
            let terms = delay_terms(src, "s", &[]).unwrap();
            assert!(matches(&terms, &|s| f.eval(s)), "{src}");
        }
        let wrong = vec![DelayTerm { tau: 1.0, g: Rational::expanded(vec![C::new(1.0, 0.0)], vec![C::new(0.0, 0.0), C::new(1.0, 0.0)]) }];
        let f = Function::compile("exp(-2*s)/s", "s", &[]).unwrap();
        assert!(!matches(&wrong, &|s| f.eval(s)));
    }
}

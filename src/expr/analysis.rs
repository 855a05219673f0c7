//! Structural analysis of a compiled expression: rational form of the whole
//! function and of each function argument, and the candidate points where
//! essential singularities or branch points may sit.
//!
//! One bottom-up pass computes the rational form (if any) of every subtree.
//! Candidate points are roots of small polynomials, solved exactly (linear,
//! or the quadratic formula in its cancellation-free form); roots of larger
//! polynomials are handed on as coefficient lists.
//!
//! Method: exact rational forms by [`super::rational`]'s direct expansion;
//! linear roots as −c/b; quadratic roots in the cancellation-free form
//! q = −(b + sign·√(b² − 4ac))/2, roots q/a and c/q (W. H. Press et al.,
//! Numerical Recipes, §5.6, from memory).
//!
//! ```
//! use residuary::expr::analysis::quadratic_roots;
//! use residuary::C;
//! // z² − 3z + 2 = (z − 1)(z − 2), factored by hand.
//! let mut r = quadratic_roots(C::new(1.0, 0.0), C::new(-3.0, 0.0), C::new(2.0, 0.0)).map(|z| z.re);
//! r.sort_by(f64::total_cmp);
//! assert_eq!(r, [1.0, 2.0]);
//! // exp(1/(z − 2)) has its essential-singularity candidate at the pole z = 2 of the argument.
//! let f = residuary::expr::Function::compile("exp(1/(z-2))", "z", &[]).unwrap();
//! assert_eq!(f.analysis().essential_candidates, vec![C::new(2.0, 0.0)]);
//! ```

use super::compile::R;
use super::functions::Func;
use super::parser::BinOp;
use super::program::as_small_integer;
use super::rational::{Rational, RationalBuilder};
use crate::poly::{add, degree, is_zero, scale, trim};
use crate::C;

/// What the structure of f says about its singularities.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Analysis {
    /// sqrt, log, asin/acos/atan of a non-constant, or a non-integer/complex power of a non-constant base.
    pub uses_branch_functions: bool,
    /// Finite points a where an entire transcendental function (exp, sin, …), a function
    /// with infinitely many poles (tan, sec, gamma, …) or k^(…) is applied to a rational
    /// argument with a pole at a.
    pub essential_candidates: Vec<C>,
    /// Finite points where a branch function's rational argument reaches a branch point
    /// of that function (zeros/poles for sqrt, log and powers; ±1 and poles for
    /// asin/acos; ±i for atan).
    pub branch_candidates: Vec<C>,
    /// Polynomials (ascending coefficients) of degree > 2 whose roots are further essential candidates.
    pub essential_candidate_polys: Vec<Vec<C>>,
    /// Polynomials (ascending coefficients) of degree > 2 whose roots are further branch candidates.
    pub branch_candidate_polys: Vec<Vec<C>>,
    /// Zeros of denominators (and of bases raised to negative integer powers) that are
    /// rational: points where f may have a pole or a removable singularity.
    pub pole_candidates: Vec<C>,
    /// Polynomials of degree > 2 whose roots are further pole candidates.
    pub pole_candidate_polys: Vec<Vec<C>>,
    /// gamma is applied to a non-constant argument.
    pub has_gamma: bool,
    /// f contains exp/sin/…/gamma/k^(…) of an argument that is not rational with a finite
    /// limit at infinity, so infinity is not a pole (essential or worse).
    pub is_entire_transcendental_at_infinity: bool,
    /// f contains tan, cot, sec, csc, tanh, coth or gamma of an argument that grows without
    /// bound as z → ∞ (or is not rational): their poles then accumulate at infinity, which is
    /// not an isolated singularity.
    pub poles_accumulate_at_infinity: bool,
}

/// Run the analysis; returns it with the rational form of the whole function.
pub fn analyse(e: &R) -> (Analysis, Option<Rational>) {
    let mut a = Analysis::default();
    let mut b = RationalBuilder::new();
    let r = walk(e, &mut a, &mut b);
    (a, r)
}

fn walk(e: &R, an: &mut Analysis, b: &mut RationalBuilder) -> Option<Rational> {
    match e {
        R::Const(c) => b.constant(*c),
        R::Var => Some(b.variable()),
        R::Neg(x) => walk(x, an, b).map(|r| b.neg(r)),
        R::Bin(op, x, y) => {
            let rx = walk(x, an, b);
            let ry = walk(y, an, b);
            if let (BinOp::Div, Some(d)) = (op, &ry) {
                add_roots(&d.num, &mut an.pole_candidates, &mut an.pole_candidate_polys);
            }
            match op {
                BinOp::Add => b.add(&rx?, &ry?),
                BinOp::Sub => b.sub(&rx?, &ry?),
                BinOp::Mul => b.mul(&rx?, &ry?),
                BinOp::Div => b.div(&rx?, &ry?),
                BinOp::Pow => power(x, y, rx, ry, an, b),
            }
        }
        R::Call(f, x) => {
            let rx = walk(x, an, b);
            call(*f, rx, an);
            None
        }
    }
}

fn power(
    x: &R,
    y: &R,
    rx: Option<Rational>,
    ry: Option<Rational>,
    an: &mut Analysis,
    b: &mut RationalBuilder,
) -> Option<Rational> {
    match (x.as_const(), y.as_const()) {
        (_, Some(k)) => {
            if let Some(n) = as_small_integer(k) {
                if let (true, Some(r)) = (n < 0, &rx) {
                    add_roots(&r.num, &mut an.pole_candidates, &mut an.pole_candidate_polys);
                }
                return b.powi(&rx?, n as i64);
            }
            // Non-integer constant power of a non-constant base.
            an.uses_branch_functions = true;
            if let Some(r) = rx {
                add_zeros_and_poles(&r, an);
            }
            None
        }
        (Some(_), None) => {
            // k^g = exp(g ln k): an entire function of g.
            entire_of(ry.as_ref(), an);
            None
        }
        (None, None) => {
            an.uses_branch_functions = true;
            an.is_entire_transcendental_at_infinity = true;
            if let Some(r) = rx {
                add_zeros_and_poles(&r, an);
            }
            if let Some(r) = ry {
                add_roots(
                    &r.den,
                    &mut an.essential_candidates,
                    &mut an.essential_candidate_polys,
                );
            }
            None
        }
    }
}

/// An entire (or infinitely-many-poles) function applied to `arg`.
fn entire_of(arg: Option<&Rational>, an: &mut Analysis) {
    match arg {
        Some(r) => {
            add_roots(
                &r.den,
                &mut an.essential_candidates,
                &mut an.essential_candidate_polys,
            );
            if degree(&r.num) > degree(&r.den) {
                an.is_entire_transcendental_at_infinity = true;
            }
        }
        None => an.is_entire_transcendental_at_infinity = true,
    }
}

fn call(f: Func, arg: Option<Rational>, an: &mut Analysis) {
    let one = C::new(1.0, 0.0);
    let i = C::new(0.0, 1.0);
    if f == Func::Gamma {
        an.has_gamma = true;
    }
    let infinitely_many_poles = matches!(f, Func::Tan | Func::Cot | Func::Sec | Func::Csc | Func::Tanh | Func::Coth | Func::Gamma);
    let grows = match &arg {
        Some(r) => degree(&r.num) > degree(&r.den),
        None => true,
    };
    if infinitely_many_poles && grows {
        an.poles_accumulate_at_infinity = true;
    }
    if !f.is_branch() {
        entire_of(arg.as_ref(), an);
        return;
    }
    an.uses_branch_functions = true;
    let Some(r) = arg else { return };
    let (pts, polys) = (&mut an.branch_candidates, &mut an.branch_candidate_polys);
    // Points where num/den = w, i.e. roots of num - w den.
    let level = |w: C| {
        add(&r.num, &scale(&r.den, -w))
    };
    match f {
        Func::Log | Func::Sqrt => {
            add_roots(&r.num, pts, polys);
            add_roots(&r.den, pts, polys);
        }
        Func::Asin | Func::Acos => {
            add_roots(&level(one), pts, polys);
            add_roots(&level(-one), pts, polys);
            add_roots(&r.den, pts, polys);
        }
        Func::Atan => {
            add_roots(&level(i), pts, polys);
            add_roots(&level(-i), pts, polys);
        }
        _ => {}
    }
}

/// Zeros and poles of a rational base or argument: branch candidates.
fn add_zeros_and_poles(r: &Rational, an: &mut Analysis) {
    add_roots(&r.num, &mut an.branch_candidates, &mut an.branch_candidate_polys);
    add_roots(&r.den, &mut an.branch_candidates, &mut an.branch_candidate_polys);
}

/// Roots of `p` (degree <= 2) into `points`, or `p` itself into `polys`.
fn add_roots(p: &[C], points: &mut Vec<C>, polys: &mut Vec<Vec<C>>) {
    let p = trim(p);
    if is_zero(&p) {
        return;
    }
    let mut push = |z: C| {
        if z.re.is_finite() && z.im.is_finite() && !points.contains(&z) {
            points.push(z);
        }
    };
    match degree(&p) {
        None | Some(0) => {}
        Some(1) => push(-p[0] / p[1]),
        Some(2) => {
            for z in quadratic_roots(p[2], p[1], p[0]) {
                push(z);
            }
        }
        _ => {
            if !polys.contains(&p) {
                polys.push(p);
            }
        }
    }
}

/// Roots of a z^2 + b z + c (a != 0), avoiding cancellation:
/// q = -(b + sign·sqrt(b^2 - 4ac))/2 with the sign making |q| largest; roots q/a, c/q.
pub fn quadratic_roots(a: C, b: C, c: C) -> [C; 2] {
    let s = (b * b - a * c * 4.0).sqrt();
    let q = if (b + s).norm() >= (b - s).norm() {
        -(b + s) / 2.0
    } else {
        -(b - s) / 2.0
    };
    if q == C::new(0.0, 0.0) {
        return [C::new(0.0, 0.0), C::new(0.0, 0.0)];
    }
    [q / a, c / q]
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::check_method;

    /// Slow reference: the schoolbook formula (−b ± √(b² − 4ac))/(2a), fine
    /// for these well-conditioned invented cases; roots paired by nearness.
    #[test]
    fn quadratic_roots_match_the_schoolbook_formula() {
        let c = C::new;
        let quads = [
            ("real roots", [c(1.0, 0.0), c(-3.0, 0.0), c(2.0, 0.0)]),
            ("complex pair", [c(2.0, 0.0), c(1.0, 0.0), c(5.0, 0.0)]),
            ("complex coefficients", [c(1.0, 1.0), c(-2.0, 0.5), c(0.3, -4.0)]),
            ("double root", [c(1.0, 0.0), c(-4.0, 2.0), c(3.0, -4.0)]),
        ];
        let mut cases = Vec::new();
        for (name, [a, b, cc]) in quads {
            let s = (b * b - a * cc * 4.0).sqrt();
            for want in [(-b + s) / (a * 2.0), (-b - s) / (a * 2.0)] {
                cases.push((name, ([a, b, cc], want)));
            }
        }
        check_method(
            &cases,
            |&([a, b, cc], want)| {
                let [r0, r1] = quadratic_roots(a, b, cc);
                (if (r0 - want).norm() <= (r1 - want).norm() { r0 } else { r1 }, None)
            },
            |&(_, want)| want,
            1e-12,
        );
        // Cancellation: z² + 1e8 z + 1 has the small root −1e-8 − 1e-24 (series
        // of the root in 1/b, common practice), which the schoolbook formula loses.
        let [r0, r1] = quadratic_roots(c(1.0, 0.0), c(1e8, 0.0), c(1.0, 0.0));
        let small = if r0.norm() < r1.norm() { r0 } else { r1 };
        assert!((small.re + 1e-8).abs() <= 1e-22, "small root {small}");
    }

    #[test]
    fn candidates_from_rational_arguments() {
        use crate::expr::Function;
        // By hand: 1/(z² − 4) has poles ±2 (difference of squares); log(z − 1) branches at 1.
        let f = Function::compile("exp(1/(z^2-4)) + log(z-1)", "z", &[]).unwrap();
        let a = f.analysis();
        let mut e: Vec<f64> = a.essential_candidates.iter().map(|z| z.re).collect();
        e.sort_by(f64::total_cmp);
        assert_eq!(e, [-2.0, 2.0]);
        assert!(a.uses_branch_functions);
        assert!(a.branch_candidates.contains(&C::new(1.0, 0.0)));
    }
}

//! Small helpers on polynomials stored as ascending coefficient slices
//! (`p[k]` multiplies `z^k`), and the submodules for roots, multiplicities,
//! truncated power series and partial fractions.
//!
//! Horner evaluation carries the running error bound of Higham, "Accuracy and
//! Stability of Numerical Algorithms" (SIAM, 2nd ed. 2002), Algorithm 5.1,
//! widened by a factor for complex arithmetic.

pub mod aberth_ehrlich;
pub mod multiplicity;
pub mod partial_fractions;
pub mod pejorative;
pub mod taylor;

use crate::C;
use crate::error::Failure;

/// Complex zero.
pub const ZERO_C: C = C::new(0.0, 0.0);

/// Unit roundoff of f64 (half the machine epsilon).
pub const UNIT_ROUNDOFF: f64 = f64::EPSILON / 2.0;

/// Drop exactly-zero highest coefficients. An identically zero polynomial becomes empty.
pub fn trim(p: &[C]) -> Vec<C> {
    let mut n = p.len();
    while n > 0 && p[n - 1] == C::new(0.0, 0.0) {
        n -= 1;
    }
    p[..n].to_vec()
}

/// Degree after trimming, or `None` for the zero polynomial.
pub fn degree(p: &[C]) -> Option<usize> {
    p.iter().rposition(|c| *c != C::new(0.0, 0.0))
}

/// a/b by Smith's algorithm (R. L. Smith, "Algorithm 116: Complex division",
/// Comm. ACM 5 (1962) 435): scaled by the larger component of b, so that
/// 1/(1e-300 + 0i) is 1e300, where the textbook (ac + bd)/(c² + d²) squares
/// 1e-300 to 0 and gives NaN. Division by zero gives (a.re/0, a.im/0): ±∞,
/// or NaN in a zero component. The evaluator's division is this one.
#[inline]
pub fn cdiv(a: C, b: C) -> C {
    if b.re == 0.0 && b.im == 0.0 {
        return C::new(a.re / 0.0, a.im / 0.0);
    }
    if b.re.abs() >= b.im.abs() {
        let r = b.im / b.re;
        let d = b.re + b.im * r;
        C::new((a.re + a.im * r) / d, (a.im - a.re * r) / d)
    } else {
        let r = b.re / b.im;
        let d = b.re * r + b.im;
        C::new((a.re * r + a.im) / d, (a.im * r - a.re) / d)
    }
}

/// Horner evaluation.
pub fn eval(p: &[C], z: C) -> C {
    p.iter().rev().fold(C::new(0.0, 0.0), |acc, &c| acc * z + c)
}

/// Horner evaluation with a running bound on the rounding error of the result
/// (Higham 2002, Alg. 5.1; the factor 4 covers complex multiply-add).
pub fn eval_with_bound(p: &[C], z: C) -> (C, f64) {
    let az = z.norm();
    let mut y = C::new(0.0, 0.0);
    let mut mu = 0.0;
    for &c in p.iter().rev() {
        y = y * z + c;
        mu = mu * az + y.norm();
    }
    (y, 4.0 * UNIT_ROUNDOFF * mu)
}

/// `Σ |p_k| r^k`: the scale against which a value of `p` at `|z| = r` is measured.
pub fn abs_eval(p: &[C], r: f64) -> f64 {
    p.iter().rev().fold(0.0, |acc, c| acc * r + c.norm())
}

/// The derivative's coefficients.
pub fn derivative(p: &[C]) -> Vec<C> {
    p.iter()
        .enumerate()
        .skip(1)
        .map(|(k, &c)| c * k as f64)
        .collect()
}

/// The `n`-th derivative's coefficients.
pub fn nth_derivative(p: &[C], n: usize) -> Vec<C> {
    let mut d = p.to_vec();
    for _ in 0..n {
        d = derivative(&d);
    }
    d
}

/// True for the zero polynomial (empty, or every coefficient exactly zero).
pub fn is_zero(p: &[C]) -> bool {
    p.iter().all(|c| *c == C::new(0.0, 0.0))
}

/// Sum of two polynomials, trimmed.
pub fn add(a: &[C], b: &[C]) -> Vec<C> {
    let mut out = vec![C::new(0.0, 0.0); a.len().max(b.len())];
    for (k, c) in a.iter().enumerate() {
        out[k] += c;
    }
    for (k, c) in b.iter().enumerate() {
        out[k] += c;
    }
    trim(&out)
}

/// `s·a`, trimmed.
pub fn scale(a: &[C], s: C) -> Vec<C> {
    trim(&a.iter().map(|c| c * s).collect::<Vec<C>>())
}

/// Product of two polynomials.
pub fn mul(a: &[C], b: &[C]) -> Vec<C> {
    if a.is_empty() || b.is_empty() {
        return Vec::new();
    }
    let mut out = vec![C::new(0.0, 0.0); a.len() + b.len() - 1];
    for (i, &x) in a.iter().enumerate() {
        for (j, &y) in b.iter().enumerate() {
            out[i + j] += x * y;
        }
    }
    out
}

/// Polynomial division `num = q·den + r` with `deg r < deg den`.
pub fn divrem(num: &[C], den: &[C]) -> Result<(Vec<C>, Vec<C>), Failure> {
    let den = trim(den);
    let num = trim(num);
    let Some(&lead) = den.last() else {
        return Err(Failure::invalid("division by the zero polynomial; give a nonzero denominator"));
    };
    if num.len() < den.len() {
        return Ok((Vec::new(), num));
    }
    let dn = den.len() - 1;
    let mut r = num.clone();
    let mut q = vec![C::new(0.0, 0.0); num.len() - dn];
    for k in (0..q.len()).rev() {
        let c = r[k + dn] / lead;
        q[k] = c;
        for (j, &d) in den.iter().enumerate() {
            r[k + j] -= c * d;
        }
        r[k + dn] = C::new(0.0, 0.0);
    }
    r.truncate(dn);
    Ok((q, r))
}

/// Coefficients of `p(z + a)` (Taylor shift), by repeated synthetic division.
pub fn taylor_shift(p: &[C], a: C) -> Vec<C> {
    taylor::coefficients_at(p, a, p.len())
}

/// Coefficients in reverse order: `z^n p(1/z)`, for work near infinity.
pub fn reverse(p: &[C]) -> Vec<C> {
    p.iter().rev().copied().collect()
}

/// `lc · Π (z − r_j)` expanded: a reference builder for tests and examples.
pub fn from_roots(lc: C, roots: &[C]) -> Vec<C> {
    let mut p = vec![lc];
    for &r in roots {
        p = mul(&p, &[-r, C::new(1.0, 0.0)]);
    }
    p
}

#[cfg(test)]
mod tests {
    use super::*;

    fn c(re: f64) -> C {
        C::new(re, 0.0)
    }

    #[test]
    fn smith_division_survives_extreme_scales() {
        // Smith 1962: (1 + 2i)/(3 + 4i) = (11 + 2i)/25 (by hand); 1/(1e-300 i) = −1e300 i.
        let q = cdiv(C::new(1.0, 2.0), C::new(3.0, 4.0));
        assert!((q - C::new(0.44, 0.08)).norm() < 1e-16);
        let tiny = cdiv(C::new(1.0, 0.0), C::new(0.0, 1e-300));
        assert!((tiny - C::new(0.0, -1e300)).norm() <= 1e300 * 4e-16, "{tiny}");
        assert!((cdiv(C::new(2e-300, 0.0), C::new(1e-300, 0.0)) - 2.0).norm() < 1e-15);
        // The textbook formula fails here (why Smith's is used): c² + d² underflows to 0.
        assert!(!(C::new(1.0, 0.0) / C::new(0.0, 1e-300)).is_finite());
    }

    #[test]
    fn divrem_recovers_quotient_and_remainder() {
        // (z^3 + 2z + 5) = (z^2 + z + 3)(z − 1) + 8 ... by hand: (z−1)(z^2+z+3) = z^3 + 2z − 3
        let (q, r) = divrem(&[c(5.0), c(2.0), c(0.0), c(1.0)], &[c(-1.0), c(1.0)]).unwrap();
        assert_eq!(q, vec![c(3.0), c(1.0), c(1.0)]);
        assert_eq!(r, vec![c(8.0)]);
    }

    #[test]
    fn taylor_shift_matches_binomial_expansion() {
        // (z+2)^3 = z^3 + 6z^2 + 12z + 8 (binomial theorem)
        let s = taylor_shift(&[c(0.0), c(0.0), c(0.0), c(1.0)], c(2.0));
        assert_eq!(s, vec![c(8.0), c(12.0), c(6.0), c(1.0)]);
    }

    #[test]
    fn running_bound_covers_cancellation() {
        // (z−1)^4 expanded at z = 1 + 1e-4: exact value 1e-16 (binomial theorem)
        let p = from_roots(c(1.0), &[c(1.0); 4]);
        let z = c(1.0 + 1e-4);
        let (v, b) = eval_with_bound(&p, z);
        let exact = (z - c(1.0)).powi(4);
        assert!((v - exact).norm() <= b, "{v} vs {exact}, bound {b}");
    }
}

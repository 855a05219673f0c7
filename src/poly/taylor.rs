//! Truncated power series arithmetic: products, reciprocals, quotients and
//! exponentials of series `Σ a_k t^k` kept to a fixed number of terms, plus the
//! Taylor coefficients of a polynomial about a point.
//!
//! Method: the classical recurrences for formal power series (Cauchy product,
//! reciprocal by forward substitution, exponential by `E' = A'E`), as in
//! D. E. Knuth, "The Art of Computer Programming" vol. 2, §4.7 (1969/1997).
//! Taylor coefficients use repeated synthetic division (Horner's scheme).

use crate::C;
use crate::error::Failure;

const ZERO: C = C::new(0.0, 0.0);

/// First `n` coefficients of `a·b`.
pub fn mul_trunc(a: &[C], b: &[C], n: usize) -> Vec<C> {
    let mut out = vec![ZERO; n];
    for (i, &x) in a.iter().enumerate().take(n) {
        for (j, &y) in b.iter().enumerate().take(n - i) {
            out[i + j] += x * y;
        }
    }
    out
}

/// First `n` coefficients of `1/a`; needs `a[0] ≠ 0`.
pub fn reciprocal(a: &[C], n: usize) -> Result<Vec<C>, Failure> {
    let a0 = a.first().copied().unwrap_or(ZERO);
    if a0 == ZERO || !a0.is_finite() {
        return Err(Failure::invalid("the series has no reciprocal: its constant term is zero"));
    }
    let mut r = vec![ZERO; n];
    if n == 0 {
        return Ok(r);
    }
    r[0] = a0.inv();
    for k in 1..n {
        let mut s = ZERO;
        for j in 1..=k.min(a.len().saturating_sub(1)) {
            s += a[j] * r[k - j];
        }
        r[k] = -s * r[0];
    }
    Ok(r)
}

/// First `n` coefficients of `a/b`; needs `b[0] ≠ 0`.
pub fn div_trunc(a: &[C], b: &[C], n: usize) -> Result<Vec<C>, Failure> {
    Ok(mul_trunc(a, &reciprocal(b, n)?, n))
}

/// First `n` coefficients of `exp(a)` for a series with `a[0] = 0` (the constant is ignored).
pub fn exp_series(a: &[C], n: usize) -> Vec<C> {
    let mut e = vec![ZERO; n];
    if n == 0 {
        return e;
    }
    e[0] = C::new(1.0, 0.0);
    for k in 1..n {
        let mut s = ZERO;
        for j in 1..=k.min(a.len().saturating_sub(1)) {
            s += a[j] * e[k - j] * j as f64;
        }
        e[k] = s / k as f64;
    }
    e
}

/// First `count` Taylor coefficients of `p` about `a`: `p(a + t) = Σ c_j t^j`,
/// so `c_j = p^(j)(a)/j!`. Repeated synthetic division (Horner), O(n·count).
///
/// ```
/// use residuary::poly::taylor::coefficients_at;
/// use residuary::C;
/// // (2 + t)³ = 8 + 12t + 6t² + t³ (binomial theorem).
/// let z3 = [C::new(0.0, 0.0), C::new(0.0, 0.0), C::new(0.0, 0.0), C::new(1.0, 0.0)];
/// let c = coefficients_at(&z3, C::new(2.0, 0.0), 5);
/// let want = [8.0, 12.0, 6.0, 1.0, 0.0];
/// assert!(c.iter().zip(want).all(|(c, w)| (c - C::new(w, 0.0)).norm() < 1e-13));
/// ```
pub fn coefficients_at(p: &[C], a: C, count: usize) -> Vec<C> {
    let mut work = p.to_vec();
    let mut out = Vec::with_capacity(count);
    for _ in 0..count {
        if work.is_empty() {
            out.push(ZERO);
            continue;
        }
        // Divide work by (z − a): quotient replaces work, remainder is the coefficient.
        let mut acc = ZERO;
        for k in (0..work.len()).rev() {
            let c = work[k];
            work[k] = acc;
            acc = acc * a + c;
        }
        out.push(acc);
        work.pop(); // the quotient's top slot is zero
    }
    out
}

/// The same sums with all signs made positive: `Σ_k |p_k| C(k,j) |a|^(k−j)`,
/// the scale that bounds rounding and coefficient errors of [`coefficients_at`].
pub fn abs_coefficients_at(p: &[C], a: C, count: usize) -> Vec<f64> {
    let ap: Vec<C> = p.iter().map(|c| C::new(c.norm(), 0.0)).collect();
    coefficients_at(&ap, C::new(a.norm(), 0.0), count)
        .into_iter()
        .map(|c| c.re)
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn c(re: f64) -> C {
        C::new(re, 0.0)
    }

    #[test]
    fn reciprocal_of_one_minus_t_is_geometric() {
        // 1/(1 − t) = Σ t^k (geometric series, common practice)
        let r = reciprocal(&[c(1.0), c(-1.0)], 6).unwrap();
        assert!(r.iter().all(|x| *x == c(1.0)));
    }

    #[test]
    fn exp_of_t_gives_inverse_factorials() {
        // exp(t) = Σ t^k/k!  (DLMF 4.2.19)
        let e = exp_series(&[c(0.0), c(1.0)], 8);
        let mut f = 1.0;
        for (k, x) in e.iter().enumerate() {
            if k > 0 {
                f *= k as f64;
            }
            assert!((x.re - 1.0 / f).abs() < 1e-16);
        }
    }

    #[test]
    fn coefficients_at_are_scaled_derivatives() {
        // p = z^4: p(2 + t) = 16 + 32t + 24t^2 + 8t^3 + t^4 (binomial theorem)
        let t = coefficients_at(&[c(0.0), c(0.0), c(0.0), c(0.0), c(1.0)], c(2.0), 6);
        let want = [16.0, 32.0, 24.0, 8.0, 1.0, 0.0];
        for (x, w) in t.iter().zip(want) {
            assert_eq!(*x, c(w));
        }
    }

    #[test]
    fn zero_constant_term_has_no_reciprocal() {
        assert!(reciprocal(&[c(0.0), c(1.0)], 3).is_err());
    }

    #[test]
    fn coefficients_at_agree_with_the_naive_circle_coefficient() {
        use crate::reference::{check_method, naive_circle_coefficient};
        // p(z) = (1 + 2i) − z + 0.5 z³ − i z⁵ + 0.25 z⁶ (invented data); its Taylor
        // coefficients about a are the naive DFT sums of p on a circle about a,
        // exact with 64 > degree points up to rounding.
        let p = [C::new(1.0, 2.0), C::new(-1.0, 0.0), ZERO, C::new(0.5, 0.0), ZERO, C::new(0.0, -1.0), C::new(0.25, 0.0)];
        let horner = |z: C| p.iter().rev().fold(ZERO, |acc, &c| acc * z + c);
        for a in [C::new(0.0, 0.0), C::new(1.5, -0.5), C::new(-2.0, 3.0)] {
            let got = coefficients_at(&p, a, 9);
            let cases: Vec<(&str, usize)> = vec![("c_0", 0), ("c_1", 1), ("c_2", 2), ("c_3", 3), ("c_4", 4), ("c_5", 5), ("c_6", 6), ("c_7 = 0", 7), ("c_8 = 0", 8)];
            check_method(&cases, |&j| (got[j], None), |&j| naive_circle_coefficient(horner, a, 1.0, 64, j as i64), 1e-12);
        }
    }
}

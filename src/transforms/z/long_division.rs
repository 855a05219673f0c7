//! Causal inverse z-transform of a rational X(z) = N(z)/D(z) by long division.
//!
//! Method: with w = 1/z, X(1/w) = w^{q−p} Ñ(w)/D̃(w), where p = deg N, q = deg D
//! and Ñ, D̃ are the reversed polynomials (D̃(0) = leading coefficient of D ≠ 0).
//! The causal sequence is x[n] = [w^n] X(1/w), so x[n] = t_{n−(q−p)} with t the
//! Taylor coefficients of Ñ/D̃: power-series division (D. E. Knuth, "The Art of
//! Computer Programming" vol. 2, §4.7, 1969/1997), done by `poly::taylor::div_trunc`.
//! It is the classical "power series expansion by long division" of the
//! z-transform (A. V. Oppenheim & R. W. Schafer, "Discrete-Time Signal
//! Processing", §3.4.3, from memory). No roots are needed, so it is independent
//! of the residue method.

use crate::poly::taylor::div_trunc;
use crate::error::Failure;
use crate::poly::{divrem, trim};
use crate::singular::rational_poles::RemovableInfo;
use crate::C;

/// x[0..count) of the causal inverse of num/den (ascending coefficients).
/// Fails when deg num > deg den (X grows at infinity: not a causal transform).
pub fn causal_sequence(num: &[C], den: &[C], count: usize) -> Result<Vec<C>, Failure> {
    let num = trim(num);
    let den = trim(den);
    if den.is_empty() {
        return Err(Failure::invalid("the denominator is identically zero"));
    }
    let zero = C::new(0.0, 0.0);
    if num.is_empty() {
        return Ok(vec![zero; count]);
    }
    let (p, q) = (num.len() - 1, den.len() - 1);
    if p > q {
        return Err(Failure::not_applicable(improper_message(p, q)));
    }
    let shift = q - p;
    let reversed_num: Vec<C> = num.iter().rev().copied().collect();
    let reversed_den: Vec<C> = den.iter().rev().copied().collect();
    let terms = count.saturating_sub(shift);
    let t = div_trunc(&reversed_num, &reversed_den, terms)?;
    let mut x = vec![zero; count.min(shift)];
    x.extend(t);
    Ok(x)
}

/// Most coefficient operations one division may take.
pub const WORK_LIMIT: usize = 50_000_000;

/// x[n] for each n in `ns` of the reduced X: the factors common to numerator
/// and denominator (`common`, from the exact analysis) are divided out first.
/// `None` when the division would take more than `WORK_LIMIT` operations.
///
/// ```
/// use residuary::transforms::z::long_division::values_at;
/// use residuary::C;
/// // z/(z − 0.5) ↔ 0.5^n (z-transform table).
/// let x = values_at(&[C::new(0.0, 0.0), C::new(1.0, 0.0)], &[C::new(-0.5, 0.0), C::new(1.0, 0.0)], &[], &[3]).unwrap().unwrap();
/// assert_eq!(x[0], C::new(0.125, 0.0));
/// ```
pub fn values_at(
    num: &[C],
    den: &[C],
    common: &[RemovableInfo],
    ns: &[u64],
) -> Result<Option<Vec<C>>, Failure> {
    let (mut rn, mut rd) = (num.to_vec(), den.to_vec());
    for r in common {
        rn = deflate(&rn, r.at, r.cancelled_order);
        rd = deflate(&rd, r.at, r.cancelled_order);
    }
    let n_max = ns.iter().copied().max().unwrap_or(0) as usize;
    if (n_max + 1).saturating_mul(rn.len() + rd.len()) > WORK_LIMIT {
        return Ok(None);
    }
    let seq = causal_sequence(&rn, &rd, n_max + 1)?;
    Ok(Some(ns.iter().map(|&n| seq[n as usize]).collect()))
}

/// Divide `p` by (z − a)^k, dropping the (rounding-level) remainder: removes a
/// factor common to numerator and denominator before the division, so that the
/// recurrence does not carry a mode the reduced X does not have.
pub fn deflate(p: &[C], a: C, k: u32) -> Vec<C> {
    let mut out = trim(p);
    for _ in 0..k {
        match divrem(&out, &[-a, C::new(1.0, 0.0)]) {
            Ok((quotient, _)) if !quotient.is_empty() => out = quotient,
            _ => break,
        }
    }
    out
}

/// The message for deg num > deg den.
pub fn improper_message(p: usize, q: usize) -> String {
    format!(
        "X(z) grows like z^{} as |z| → ∞ (numerator degree {p} > denominator degree {q}), so it is not the z-transform of a causal sequence; divide X by z^{} to shift the sequence",
        p - q,
        p - q
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    fn c(x: f64) -> C {
        C::new(x, 0.0)
    }

    #[test]
    fn geometric_sequence() {
        // z/(z − 0.5) ↔ 0.5^n (z-transform table, from memory)
        let x = causal_sequence(&[c(0.0), c(1.0)], &[c(-0.5), c(1.0)], 6).unwrap();
        for (n, v) in x.iter().enumerate() {
            assert!((v.re - 0.5f64.powi(n as i32)).abs() < 1e-15);
        }
    }

    #[test]
    fn strictly_proper_is_delayed() {
        // 1/(z − 0.5) ↔ 0.5^{n−1} u[n−1] (time shift, from memory)
        let x = causal_sequence(&[c(1.0)], &[c(-0.5), c(1.0)], 4).unwrap();
        assert_eq!(x[0], c(0.0));
        assert!((x[3].re - 0.25).abs() < 1e-15);
    }

    #[test]
    fn a_common_factor_is_divided_out_before_the_division() {
        // (z − 2)z/((z − 2)(z − 0.5)) = z/(z − 0.5) ↔ 0.5^n (z-transform table, from memory);
        // checked against the slow reference: the naive DFT coefficient of X(1/w) at w = 0.
        let num = crate::poly::mul(&[c(-2.0), c(1.0)], &[c(0.0), c(1.0)]);
        let den = crate::poly::mul(&[c(-2.0), c(1.0)], &[c(-0.5), c(1.0)]);
        let common = [RemovableInfo { at: c(2.0), value: c(0.0), cancelled_order: 1 }];
        let ns = [0u64, 1, 7, 30];
        let x = values_at(&num, &den, &common, &ns).unwrap().unwrap();
        let reduced = |w: C| 1.0 / (1.0 - 0.5 * w);
        let cases: Vec<(String, usize)> = ns.iter().enumerate().map(|(i, n)| (format!("n = {n}"), i)).collect();
        let cases: Vec<(&str, usize)> = cases.iter().map(|(s, i)| (s.as_str(), *i)).collect();
        crate::reference::check_method(
            &cases,
            |&i| (x[i], None),
            |&i| crate::reference::naive_circle_coefficient(reduced, c(0.0), 1.0, 256, ns[i] as i64),
            1e-13,
        );
    }

    #[test]
    fn improper_is_refused() {
        assert!(causal_sequence(&[c(0.0), c(0.0), c(1.0)], &[c(-0.5), c(1.0)], 4).is_err());
    }
}

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
    fn improper_is_refused() {
        assert!(causal_sequence(&[c(0.0), c(0.0), c(1.0)], &[c(-0.5), c(1.0)], 4).is_err());
    }
}

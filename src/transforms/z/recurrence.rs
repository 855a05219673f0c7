//! Causal inverse z-transform of a rational X(z) by running its difference
//! equation on a unit impulse, with an a-priori bound on the rounding.
//!
//! Method: with w = z⁻¹, X = B(w)/A(w) where A(w) = Σ_{k=0}^{q} a_k w^k,
//! a_k = den[q − k], and B(w) = w^{q−p} Ñ(w), b_n = num[q − n] (p = deg num ≤
//! q = deg den). Then x = B/A is the impulse response of the difference equation
//!
//! ```text
//! a₀ x[n] = b_n − Σ_{k=1}^{q} a_k x[n−k],     x[n] = 0 for n < 0,
//! ```
//!
//! O(n·q) operations, no roots needed (common practice; e.g. A. V. Oppenheim &
//! R. W. Schafer, "Discrete-Time Signal Processing", ch. 2 and §3.4, from
//! memory). It is the power-series division of `long_division` written as the
//! recurrence it is.
//!
//! Rounding bound (first order, common practice of forward error analysis).
//! Each step commits a local error |η[n]| ≤ ℓ[n] = u (|b_n| + Σ_k |a_k||x̂[n−k]|)/|a₀|,
//! with u = 4(q + 2)ε for the complex multiply-adds plus (q + 1)ε for the
//! rounding of the coefficients themselves. The computed x̂ then satisfies
//! the same equation driven by a₀η, so x̂ − x = g ∗ η, g the impulse response
//! of 1/A scaled so that g[0] = 1. For any ρ > 0, with g̃[m] = g[m] ρ^{−m}
//! (the recurrence with a_k ρ^{−k}, so nothing overflows),
//!
//! ```text
//! |x̂[n] − x[n]| ≤ Σ_j |g[n−j]| ℓ[j] ≤ G_ρ(n) · P_ρ(n),
//! G_ρ(n) = Σ_{m≤n} |g̃[m]|,   P_ρ(n) = max_{j≤n} ρ^{n−j} ℓ[j] = max(ρ P_ρ(n−1), ℓ[n]).
//! ```
//!
//! Every ρ gives a bound; ρ near the largest pole modulus gives a tight one
//! (≈ 2n(5q + 9)ε|x[n]| for a simple pole), so the caller passes a few and the
//! smallest bound is kept, doubled for the rounding of g̃ and of the bound itself.
//! The bound costs one more recurrence per ρ.
//!
//! What it does not cover: coefficients that carry more than (q + 1)ε of
//! their own size, as when X was typed as a product of many factors and the
//! expansion cancels (z²⁴/Π(z − 0.95 e^{iθ_k}) is z²⁴/(z²⁴ + 0.95²⁴) only to
//! rounding at the scale of the binomial sums). The task compares this way with
//! the residues, whose poles are polished on X as typed, for that reason.
//!
//! ```
//! use residuary::transforms::z::recurrence::impulse_response;
//! use residuary::C;
//! // z/(z − 0.5) ↔ 0.5^n (z-transform table, from memory).
//! let r = impulse_response(&[C::new(0.0, 0.0), C::new(1.0, 0.0)], &[C::new(-0.5, 0.0), C::new(1.0, 0.0)], 40, &[0.5]).unwrap();
//! assert!((r.values[39].re - 0.5f64.powi(39)).abs() <= r.errors[39]);
//! assert!(r.errors[39] < 1e-12 * 0.5f64.powi(39)); // 2·40·(5q + 9)ε relative, q = 1
//! ```

use super::long_division::{deflate, improper_message, WORK_LIMIT};
use crate::error::Failure;
use crate::poly::trim;
use crate::singular::rational_poles::RemovableInfo;
use crate::C;

const EPS: f64 = f64::EPSILON;
const ZERO: C = C::new(0.0, 0.0);

/// x[0..count) and a bound on the rounding error of each.
#[derive(Debug, Clone, PartialEq)]
pub struct Recurrence {
    pub values: Vec<C>,
    pub errors: Vec<f64>,
}

/// x[0..count) of the causal inverse of num/den (ascending coefficients in z),
/// each with its rounding bound, the smallest over the weights `rhos` (each > 0;
/// none given means ρ = 1). Fails when deg num > deg den (not causal).
pub fn impulse_response(num: &[C], den: &[C], count: usize, rhos: &[f64]) -> Result<Recurrence, Failure> {
    let num = trim(num);
    let den = trim(den);
    if den.is_empty() {
        return Err(Failure::invalid("the denominator is identically zero"));
    }
    if num.is_empty() {
        return Ok(Recurrence { values: vec![ZERO; count], errors: vec![0.0; count] });
    }
    let (p, q) = (num.len() - 1, den.len() - 1);
    if p > q {
        return Err(Failure::not_applicable(improper_message(p, q)));
    }
    let a: Vec<C> = den.iter().rev().copied().collect();
    let b = |n: usize| if n <= q { num.get(q - n).copied().unwrap_or(ZERO) } else { ZERO };
    let a0_inv = a[0].inv();
    // Sizes in the cheap norm |re| + |im| ≥ |·| (a bound may only grow by it).
    let size_of = |c: C| c.re.abs() + c.im.abs();
    let abs_a: Vec<f64> = a.iter().map(|&c| size_of(c)).collect();
    let u = (4.0 * (q as f64 + 2.0) + q as f64 + 1.0) * EPS;
    let a0_size = a0_inv.norm();

    let mut x = vec![ZERO; count];
    let mut local = vec![0.0f64; count];
    for n in 0..count {
        let bn = b(n);
        let mut s = bn;
        let mut size = size_of(bn);
        for k in 1..=q.min(n) {
            s -= a[k] * x[n - k];
            size += abs_a[k] * size_of(x[n - k]);
        }
        x[n] = s * a0_inv;
        local[n] = u * size * a0_size;
    }

    let rhos: Vec<f64> = rhos.iter().copied().filter(|r| r.is_finite() && *r > 0.0).collect();
    let rhos = if rhos.is_empty() { vec![1.0] } else { rhos };
    let mut errors = vec![f64::INFINITY; count];
    let mut g = vec![ZERO; count];
    for &rho in &rhos {
        // g̃: a₀ g̃[m] = −Σ a_k ρ^{−k} g̃[m−k], g̃[0] = 1.
        let scaled: Vec<C> = (0..=q).map(|k| a[k] * rho.powi(-(k as i32))).collect();
        if scaled.iter().any(|c| !c.is_finite()) {
            continue;
        }
        let (mut big_g, mut big_p) = (0.0f64, 0.0f64);
        for n in 0..count {
            let gn = if n == 0 {
                C::new(1.0, 0.0)
            } else {
                let mut s = ZERO;
                for k in 1..=q.min(n) {
                    s -= scaled[k] * g[n - k];
                }
                s * a0_inv
            };
            g[n] = gn;
            big_g += size_of(gn);
            big_p = (rho * big_p).max(local[n]);
            let bound = 2.0 * big_g * big_p;
            if bound < errors[n] {
                errors[n] = bound;
            }
        }
    }
    for (e, v) in errors.iter_mut().zip(&x) {
        if e.is_nan() || !v.is_finite() {
            *e = f64::INFINITY;
        }
    }
    Ok(Recurrence { values: x, errors })
}

/// (x[n], bound) for each n in `ns` of the reduced X: the factors common to
/// numerator and denominator (`common`, from the exact analysis) are divided
/// out first, so the recurrence carries no cancelled mode. `None` when it would
/// take more than `WORK_LIMIT` operations.
pub fn values_at(
    num: &[C],
    den: &[C],
    common: &[RemovableInfo],
    ns: &[u64],
    rhos: &[f64],
) -> Result<Option<Vec<(C, f64)>>, Failure> {
    let (mut rn, mut rd) = (num.to_vec(), den.to_vec());
    for r in common {
        rn = deflate(&rn, r.at, r.cancelled_order);
        rd = deflate(&rd, r.at, r.cancelled_order);
    }
    let n_max = ns.iter().copied().max().unwrap_or(0) as usize;
    if (n_max + 1).saturating_mul(rd.len() * (rhos.len().max(1) + 1)) > WORK_LIMIT {
        return Ok(None);
    }
    let r = impulse_response(&rn, &rd, n_max + 1, rhos)?;
    Ok(Some(ns.iter().map(|&n| (r.values[n as usize], r.errors[n as usize])).collect()))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{check_method, naive_circle_coefficient};

    fn c(x: f64) -> C {
        C::new(x, 0.0)
    }

    /// X(1/w) for X = num/den, as the slow reference samples it.
    fn x_of_w(num: &[C], den: &[C], w: C) -> C {
        let z = w.inv();
        crate::poly::eval(num, z) / crate::poly::eval(den, z)
    }

    #[test]
    fn the_recurrence_matches_the_naive_dft_coefficient_and_its_bound_holds() {
        // The slow reference: x[n] = [w^n] X(1/w), the naive DFT on |w| = r inside the
        // disc where X(1/w) is analytic (Cauchy's formula, common practice), r just inside
        // the nearest singularity 1/|pole| so that its rounding is not amplified.
        // Cases by construction: a resonator (poles 0.6 ± 0.6i), a double pole at −0.7
        // with a delay, complex coefficients (pole 0.5i), a near-unit pole 0.99.
        let cases: Vec<(&str, Vec<C>, Vec<C>, f64)> = vec![
            ("resonator", vec![c(0.0), c(0.0), c(1.0)], vec![c(0.72), c(-1.2), c(1.0)], 1.1),
            ("double pole, delayed", vec![c(1.0)], crate::poly::mul(&[c(0.7), c(1.0)], &[c(0.7), c(1.0)]), 1.35),
            ("complex", vec![c(0.0), c(1.0)], vec![C::new(0.0, -0.5), c(1.0)], 1.9),
            ("near the unit circle", vec![c(0.0), c(1.0)], vec![c(-0.99), c(1.0)], 1.005),
        ];
        for (name, num, den, r_w) in &cases {
            let ns = [0usize, 1, 2, 5, 17, 60];
            let rec = impulse_response(num, den, 61, &[1.0 / r_w, 1.0]).unwrap();
            let labelled: Vec<(String, usize)> = ns.iter().map(|n| (format!("{name} n = {n}"), *n)).collect();
            let labelled: Vec<(&str, usize)> = labelled.iter().map(|(s, n)| (s.as_str(), *n)).collect();
            check_method(
                &labelled,
                |&n| (rec.values[n], Some(rec.errors[n])),
                |&n| naive_circle_coefficient(|w| x_of_w(num, den, w), c(0.0), *r_w, 16384, n as i64),
                1e-12,
            );
        }
    }

    #[test]
    fn the_bound_is_tight_for_a_simple_pole_and_covers_the_true_error() {
        // 0.9^n (z-transform table, from memory) computed as exp(n ln 0.9): with ρ = 0.9 the
        // bound is of order n·(5q + 9)ε·|x[n]| (here 1.2e-11 relative at n = 2000), far below
        // the absolute ε that ρ = 1 alone gives.
        let rec = impulse_response(&[c(0.0), c(1.0)], &[c(-0.9), c(1.0)], 2001, &[0.9, 1.0]).unwrap();
        for n in [10usize, 300, 2000] {
            let want = (n as f64 * 0.9f64.ln()).exp();
            let d = (rec.values[n].re - want).abs();
            assert!(d <= rec.errors[n] + 4.0 * EPS * want, "n={n}: {d:e} > {:e}", rec.errors[n]);
            assert!(rec.errors[n] < 1e-14 * n as f64 * want, "n={n}: {:e} vs {want:e}", rec.errors[n]);
        }
    }

    #[test]
    fn it_is_the_long_division() {
        // The same sequence as the power-series division (two formulations of one
        // expansion at infinity, Knuth TAOCP vol. 2 §4.7): equal to rounding, which the
        // bound covers for each of the two (the division rounds alike; so twice the bound).
        let num = [c(0.3), c(-1.0), c(2.0)];
        let den = [c(0.1), c(0.2), c(-0.5), c(1.0)];
        let rec = impulse_response(&num, &den, 50, &[1.0]).unwrap();
        let div = super::super::long_division::causal_sequence(&num, &den, 50).unwrap();
        for n in 0..50 {
            assert!((rec.values[n] - div[n]).norm() <= 2.0 * rec.errors[n], "n={n}");
        }
        assert!(impulse_response(&[c(0.0), c(0.0), c(1.0)], &[c(-0.5), c(1.0)], 4, &[]).is_err());
    }
}

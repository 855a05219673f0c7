//! Principal parts of a rational function at its poles, exactly from the
//! partial-fraction structure.
//!
//! Method: classical partial-fraction expansion (e.g. P. Henrici, "Applied and
//! Computational Complex Analysis" vol. 1, §7.1, 1974): with
//! `den = lc·Π (z − b_j)^{m_j}` and `num` having a zero of order k at a pole
//! `a` of multiplicity m in `den`, `f = g(z)/(z − a)^(m−k)` where
//! `g(a + t) = [num(a + t)/t^k] / [lc·(Π_{j≠a}(a − b_j)^{m_j})·exp(Σ_j m_j log(1 + t/(a − b_j)))]`.
//! The Taylor coefficients of g come from truncated series arithmetic
//! (power sums of `1/(a − b_j)` and a series exponential), so the principal-part
//! coefficient `c_{−i}` is g's coefficient `m − k − i`. No finite differences.
//! A second, independent route divides the Taylor series of `num` and `den`
//! about `a` directly; the two are compared for the error estimate.

use crate::error::Failure;
use super::taylor::{abs_coefficients_at, coefficients_at, div_trunc, exp_series, mul_trunc};
use super::ZERO_C;
use crate::C;

/// A product `mantissa · 2^exponent` that cannot overflow while it is built.
#[derive(Debug, Clone, Copy)]
struct Scaled {
    mantissa: C,
    exponent: i32,
}

impl Scaled {
    fn new(x: C) -> Self {
        let mut s = Scaled {
            mantissa: x,
            exponent: 0,
        };
        s.normalise();
        s
    }
    fn normalise(&mut self) {
        let m = self.mantissa.norm();
        if m > 0.0 && m.is_finite() {
            let e = m.log2().round() as i32;
            if e.abs() > 64 {
                self.mantissa *= 2f64.powi(-e);
                self.exponent += e;
            }
        }
    }
    fn mul(&mut self, x: C) {
        self.mantissa *= x;
        self.normalise();
    }
}

/// `x · 2^e` without an overflowing intermediate power.
fn scale_pow2(x: C, e: i32) -> C {
    let half = e / 2;
    x * 2f64.powi(half) * 2f64.powi(e - half)
}

/// The series `g(a + t)` to `count` terms by the product route.
///
/// `factors` is the full factorisation of the denominator (`lead · Π (z − b_j)^{m_j}`);
/// the factor at index `skip` is the pole itself. `k` is the order of the zero of
/// `num` at `a` (common roots), whose first k Taylor coefficients are dropped.
pub fn local_series_product(
    num: &[C],
    k: usize,
    lead: C,
    factors: &[(C, u32)],
    skip: usize,
    a: C,
    count: usize,
) -> Vec<C> {
    let (series, _) = product_route(num, k, lead, factors, skip, a, count);
    series
}

/// Product route; also returns a bound on the numerator's rounding contribution per coefficient.
fn product_route(
    num: &[C],
    k: usize,
    lead: C,
    factors: &[(C, u32)],
    skip: usize,
    a: C,
    count: usize,
) -> (Vec<C>, Vec<f64>) {
    let mut p = Scaled::new(lead);
    let mut power_sums = vec![ZERO_C; count];
    for (j, &(b, m)) in factors.iter().enumerate() {
        if j == skip {
            continue;
        }
        let d = a - b;
        p.mul(d.powu(m));
        let u = d.inv();
        let mut uk = C::new(1.0, 0.0);
        for s in power_sums.iter_mut().skip(1) {
            uk *= u;
            *s += uk * m as f64;
        }
    }
    // −Σ_j m_j log(1 + u_j t) = Σ_i (−1)^i s_i t^i / i
    let log_series: Vec<C> = power_sums
        .iter()
        .enumerate()
        .map(|(i, &s)| {
            if i == 0 {
                ZERO_C
            } else {
                s * (if i % 2 == 0 { 1.0 } else { -1.0 }) / i as f64
            }
        })
        .collect();
    let e = exp_series(&log_series, count);
    let n_len = num.len().max(1) as f64;
    let taylor = coefficients_at(num, a, k + count);
    let abs_taylor = abs_coefficients_at(num, a, k + count);
    let reduced: Vec<C> = taylor[k..].to_vec();
    let raw = mul_trunc(&reduced, &e, count);
    let inv = p.mantissa.inv();
    let series = raw
        .iter()
        .map(|&x| scale_pow2(x * inv, -p.exponent))
        .collect();
    let abs_e: Vec<f64> = e.iter().map(|x| x.norm()).collect();
    let rounding = (0..count)
        .map(|i| {
            let s: f64 = (0..=i).map(|j| abs_taylor[k + j] * abs_e[i - j]).sum();
            scale_pow2(
                C::new(8.0 * n_len * super::UNIT_ROUNDOFF * s * inv.norm(), 0.0),
                -p.exponent,
            )
            .re
        })
        .collect();
    (series, rounding)
}

/// The series `g(a + t)` by the direct route: `[num(a+t)/t^k] / [den(a+t)/t^m]`.
pub fn local_series_direct(
    num: &[C],
    k: usize,
    den: &[C],
    m: usize,
    a: C,
    count: usize,
) -> Result<Vec<C>, Failure> {
    let n = coefficients_at(num, a, k + count);
    let d = coefficients_at(den, a, m + count);
    div_trunc(&n[k..], &d[m..], count)
}

/// The principal part at one pole with a per-coefficient error estimate.
#[derive(Debug, Clone, PartialEq)]
pub struct LocalExpansion {
    /// `c_{−1}, c_{−2}, …, c_{−order}` (empty when the point is not a pole).
    pub principal_part: Vec<C>,
    pub principal_part_errors: Vec<f64>,
    /// For a removable point (`order ≤ 0`): the limit of f there.
    pub limit: Option<C>,
}

/// Principal part of `num/den` at the factor `index` of `factors`.
///
/// * `order` = multiplicity in den − zero order `k` of num there (≤ 0: removable).
/// * `location_error`: error of the factor's center; `factor_errors`: errors of all centers.
/// * `check_direct`: also divide the expanded `den` by `(z − a)^m` and count the difference
///   from the product route in the error. Off when the centers were polished on f as typed:
///   then the expanded coefficients are the less accurate description of f.
///
/// ```
/// use residuary::poly::{from_roots, partial_fractions::local_expansion};
/// use residuary::C;
/// // 1/((z − 1)²(z + 1)) = (−1/4)/(z − 1) + (1/2)/(z − 1)² + (1/4)/(z + 1) (partial fractions by hand).
/// let one = C::new(1.0, 0.0);
/// let den = from_roots(one, &[one, one, -one]);
/// let e = local_expansion(&[one], &den, one, &[(one, 2), (-one, 1)], &[0.0, 0.0], 0, 0, true);
/// assert!((e.principal_part[0] - C::new(-0.25, 0.0)).norm() < 1e-14); // c_{−1}, the residue
/// assert!((e.principal_part[1] - C::new(0.5, 0.0)).norm() < 1e-14); // c_{−2}
/// ```
#[allow(clippy::too_many_arguments)]
pub fn local_expansion(
    num: &[C],
    den: &[C],
    lead: C,
    factors: &[(C, u32)],
    factor_errors: &[f64],
    index: usize,
    k: usize,
    check_direct: bool,
) -> LocalExpansion {
    let (a, m) = factors[index];
    let order = m as i64 - k as i64;
    if order <= 0 {
        let limit = if order < 0 {
            ZERO_C
        } else {
            local_series_product(num, k, lead, factors, index, a, 1)[0]
        };
        return LocalExpansion {
            principal_part: Vec::new(),
            principal_part_errors: Vec::new(),
            limit: Some(limit),
        };
    }
    let q = order as usize;
    let (g, rounding) = product_route(num, k, lead, factors, index, a, q);
    let direct = if check_direct {
        local_series_direct(num, k, den, m as usize, a, q).unwrap_or_else(|_| vec![C::new(f64::NAN, 0.0); q])
    } else {
        g.clone()
    };
    // Sensitivity to the location of this pole: recompute at shifted centers.
    let ea = factor_errors[index];
    let shifted: Vec<Vec<C>> = [C::new(ea, 0.0), C::new(0.0, ea)]
        .iter()
        .map(|&da| local_series_product(num, k, lead, factors, index, a + da, q))
        .collect();
    // Sensitivity to the other centers: relative change Σ m_j e_j/|a − b_j| per order of t.
    let other: f64 = factors
        .iter()
        .zip(factor_errors)
        .enumerate()
        .filter(|(j, _)| *j != index)
        .map(|(_, (&(b, mj), &e))| mj as f64 * e / ((a - b).norm() - e).max(f64::MIN_POSITIVE))
        .sum();
    let n_total = (num.len() + den.len()) as f64;
    let mut parts = Vec::with_capacity(q);
    let mut errors = Vec::with_capacity(q);
    for i in 1..=q {
        let idx = q - i;
        let gi = g[idx];
        let scale = g.iter().map(|x| x.norm()).fold(0.0, f64::max);
        let mut e = 2.0 * (gi - direct[idx]).norm()
            + shifted
                .iter()
                .map(|s| 2.0 * (s[idx] - gi).norm())
                .fold(0.0, f64::max)
            + rounding[idx]
            + scale * other.min(1.0) * (idx as f64 + 1.0)
            + 8.0 * n_total * super::UNIT_ROUNDOFF * gi.norm();
        if !e.is_finite() {
            e = f64::INFINITY;
        }
        parts.push(gi);
        errors.push(e);
    }
    LocalExpansion {
        principal_part: parts,
        principal_part_errors: errors,
        limit: None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::poly::from_roots;

    #[test]
    fn double_pole_principal_part() {
        // 1/((z−1)^2 (z+1)) = (−1/4)/(z−1) + (1/2)/(z−1)^2 + (1/4)/(z+1)  (partial fractions by hand)
        let one = C::new(1.0, 0.0);
        let den = from_roots(one, &[one, one, -one]);
        let factors = [(one, 2), (-one, 1)];
        let e = local_expansion(&[one], &den, one, &factors, &[0.0, 0.0], 0, 0, true);
        assert!((e.principal_part[0] - C::new(-0.25, 0.0)).norm() < 1e-15);
        assert!((e.principal_part[1] - C::new(0.5, 0.0)).norm() < 1e-15);
    }

    #[test]
    fn principal_parts_agree_with_the_naive_circle_coefficient() {
        use crate::reference::{check_method, naive_circle_coefficient};
        // f = (z² + i)/((z − 1)³ (z + 2)² (z − i)) (invented data). About each pole a,
        // c_{−j} is the naive DFT Laurent coefficient on a small circle about a
        // (radius 0.4: no other pole within 0.4 of a, and 512 points).
        let one = C::new(1.0, 0.0);
        let (a1, a2, a3) = (one, C::new(-2.0, 0.0), C::new(0.0, 1.0));
        let num = [C::new(0.0, 1.0), ZERO_C, one];
        let den = from_roots(one, &[a1, a1, a1, a2, a2, a3]);
        let factors = [(a1, 3), (a2, 2), (a3, 1)];
        let f = |z: C| (z * z + C::new(0.0, 1.0)) / ((z - a1).powi(3) * (z - a2).powi(2) * (z - a3));
        for index in 0..3 {
            let (a, m) = factors[index];
            let e = local_expansion(&num, &den, one, &factors, &[0.0; 3], index, 0, true);
            assert_eq!(e.principal_part.len(), m as usize);
            let cases: Vec<(String, usize)> = (0..m as usize).map(|j| (format!("pole {a}: c_-{}", j + 1), j)).collect();
            let cases: Vec<(&str, usize)> = cases.iter().map(|(s, j)| (s.as_str(), *j)).collect();
            check_method(
                &cases,
                |&j| (e.principal_part[j], Some(e.principal_part_errors[j])),
                |&j| naive_circle_coefficient(f, a, 0.4, 512, -(j as i64) - 1),
                1e-11,
            );
        }
    }
}

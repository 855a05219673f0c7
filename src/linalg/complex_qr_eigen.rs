//! Eigenvalues of a small dense complex matrix: Householder reduction to
//! upper Hessenberg form, then the shifted QR algorithm with Wilkinson shifts
//! and deflation.
//!
//! Method: J. G. F. Francis, "The QR transformation, a unitary analogue to the
//! LR transformation", Computer J. 4 (1961/62) 265–271 and 332–345; shift
//! strategy from J. H. Wilkinson, "The Algebraic Eigenvalue Problem" (1965).

use crate::C;

/// Eigenvalues of the n×n matrix `a` (row-major `a[i][j]`). Returns `None`
/// if the iteration fails to converge (never happens for finite input in
/// practice) or the input is not finite.
///
/// ```
/// use residuary::linalg::complex_qr_eigen::eigenvalues;
/// use residuary::C;
/// // [[2, 1], [1, 2]] has eigenvalues 1 and 3 (characteristic polynomial (λ − 2)² − 1).
/// let r = |x: f64| C::new(x, 0.0);
/// let mut ev: Vec<f64> = eigenvalues(vec![vec![r(2.0), r(1.0)], vec![r(1.0), r(2.0)]])
///     .unwrap().iter().map(|z| z.re).collect();
/// ev.sort_by(f64::total_cmp);
/// assert!((ev[0] - 1.0).abs() < 1e-14 && (ev[1] - 3.0).abs() < 1e-14);
/// ```
pub fn eigenvalues(mut a: Vec<Vec<C>>) -> Option<Vec<C>> {
    let n = a.len();
    if a.iter()
        .any(|row| row.len() != n || row.iter().any(|x| !x.re.is_finite() || !x.im.is_finite()))
    {
        return None;
    }
    if n == 0 {
        return Some(Vec::new());
    }
    hessenberg(&mut a);
    let zero = C::new(0.0, 0.0);
    let mut hi = n - 1;
    let mut iter = 0usize;
    let mut total = 0usize;
    while hi > 0 {
        // Find the start of the active unreduced block.
        let mut l = hi;
        while l > 0 {
            let s = a[l - 1][l - 1].norm() + a[l][l].norm();
            let s = if s == 0.0 { 1.0 } else { s };
            if a[l][l - 1].norm() <= f64::EPSILON * s {
                a[l][l - 1] = zero;
                break;
            }
            l -= 1;
        }
        if l == hi {
            hi -= 1;
            iter = 0;
            continue;
        }
        iter += 1;
        total += 1;
        if total > 100 * n + 200 {
            return None;
        }
        let mu = if iter % 11 == 10 {
            // Exceptional shift to break cycles.
            a[hi][hi] + a[hi][hi - 1].norm() * C::new(0.75, 0.4)
        } else {
            let (p, q, r, s) = (a[hi - 1][hi - 1], a[hi - 1][hi], a[hi][hi - 1], a[hi][hi]);
            let half = (p - s) * 0.5;
            let disc = (half * half + q * r).sqrt();
            let m1 = (p + s) * 0.5 + disc;
            let m2 = (p + s) * 0.5 - disc;
            if (m1 - s).norm() < (m2 - s).norm() {
                m1
            } else {
                m2
            }
        };
        // Explicit shifted QR step on the block l..=hi via Givens rotations.
        for k in l..=hi {
            a[k][k] -= mu;
        }
        let mut rots: Vec<(C, C)> = Vec::with_capacity(hi - l);
        for k in l..hi {
            let (x, y) = (a[k][k], a[k + 1][k]);
            let r = (x.norm_sqr() + y.norm_sqr()).sqrt();
            let (c, s) = if r == 0.0 {
                (C::new(1.0, 0.0), zero)
            } else {
                (x / r, y / r)
            };
            for j in k..=hi {
                let (u, w) = (a[k][j], a[k + 1][j]);
                a[k][j] = c.conj() * u + s.conj() * w;
                a[k + 1][j] = -s * u + c * w;
            }
            rots.push((c, s));
        }
        for (idx, k) in (l..hi).enumerate() {
            let (c, s) = rots[idx];
            let top = (k + 2).min(hi);
            for row in a.iter_mut().take(top + 1).skip(l) {
                let (u, w) = (row[k], row[k + 1]);
                row[k] = u * c + w * s;
                row[k + 1] = -u * s.conj() + w * c.conj();
            }
        }
        for k in l..=hi {
            a[k][k] += mu;
        }
    }
    Some((0..n).map(|i| a[i][i]).collect())
}

/// In-place reduction to upper Hessenberg form by Householder reflections.
fn hessenberg(a: &mut [Vec<C>]) {
    let n = a.len();
    for k in 0..n.saturating_sub(2) {
        let norm: f64 = (k + 1..n).map(|i| a[i][k].norm_sqr()).sum::<f64>().sqrt();
        if norm == 0.0 {
            continue;
        }
        let x0 = a[k + 1][k];
        let phase = if x0.norm() > 0.0 {
            x0 / x0.norm()
        } else {
            C::new(1.0, 0.0)
        };
        let mut v: Vec<C> = (k + 1..n).map(|i| a[i][k]).collect();
        v[0] += phase * norm;
        let vn: f64 = v.iter().map(|x| x.norm_sqr()).sum();
        if vn == 0.0 {
            continue;
        }
        // A ← H A: rows k+1..n.
        for j in 0..n {
            let dot: C = v
                .iter()
                .enumerate()
                .map(|(t, vi)| vi.conj() * a[k + 1 + t][j])
                .sum();
            let s = dot * (2.0 / vn);
            for (t, vi) in v.iter().enumerate() {
                a[k + 1 + t][j] -= s * vi;
            }
        }
        // A ← A H: columns k+1..n.
        for row in a.iter_mut() {
            let dot: C = v
                .iter()
                .enumerate()
                .map(|(t, vi)| row[k + 1 + t] * vi)
                .sum();
            let s = dot * (2.0 / vn);
            for (t, vi) in v.iter().enumerate() {
                row[k + 1 + t] -= s * vi.conj();
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Slow reference: a matrix built as S D S⁻¹ for a known triangular S has
    /// eigenvalues D (similarity invariance, any linear-algebra text).
    #[test]
    fn recovers_known_spectrum() {
        let d = [
            C::new(1.0, 2.0),
            C::new(-3.0, 0.5),
            C::new(0.25, -1.0),
            C::new(2.0, 2.0),
            C::new(-0.5, -0.5),
            C::new(1.0, 2.0 + 1e-3),
        ];
        let n = d.len();
        // S = I + strictly upper part; S^{-1} computed by back substitution.
        let mut s = vec![vec![C::new(0.0, 0.0); n]; n];
        for i in 0..n {
            s[i][i] = C::new(1.0, 0.0);
            for j in i + 1..n {
                s[i][j] = C::new(
                    ((i * 7 + j * 3) % 5) as f64 * 0.3 - 0.6,
                    ((i + 2 * j) % 3) as f64 * 0.2,
                );
            }
        }
        let mut sinv = vec![vec![C::new(0.0, 0.0); n]; n];
        for col in 0..n {
            for i in (0..n).rev() {
                let mut x = if i == col {
                    C::new(1.0, 0.0)
                } else {
                    C::new(0.0, 0.0)
                };
                for j in i + 1..n {
                    x -= s[i][j] * sinv[j][col];
                }
                sinv[i][col] = x;
            }
        }
        let mut a = vec![vec![C::new(0.0, 0.0); n]; n];
        for i in 0..n {
            for j in 0..n {
                a[i][j] = (0..n).map(|k| s[i][k] * d[k] * sinv[k][j]).sum();
            }
        }
        let mut ev = eigenvalues(a).unwrap();
        for want in d {
            let (idx, err) = ev
                .iter()
                .enumerate()
                .map(|(i, e)| (i, (e - want).norm()))
                .fold((0, f64::INFINITY), |b, x| if x.1 < b.1 { x } else { b });
            assert!(err < 1e-9, "{want} err {err}");
            ev.remove(idx);
        }
    }

    /// det by cofactor expansion along the first row (the definition; common practice).
    fn cofactor_det(m: &[Vec<C>]) -> C {
        let n = m.len();
        if n == 1 {
            return m[0][0];
        }
        let mut sum = C::new(0.0, 0.0);
        for j in 0..n {
            let minor: Vec<Vec<C>> = m[1..].iter().map(|row| row.iter().enumerate().filter(|&(k, _)| k != j).map(|(_, &x)| x).collect()).collect();
            let sign = if j % 2 == 0 { 1.0 } else { -1.0 };
            sum += m[0][j] * cofactor_det(&minor) * sign;
        }
        sum
    }

    #[test]
    fn eigenvalues_are_the_roots_of_the_characteristic_polynomial() {
        use crate::reference::{check_method, naive_circle_coefficient};
        // A 4×4 complex matrix (invented data). Slow reference: the coefficients of
        // det(zI − A), each by the naive DFT on |z| = 1 of the cofactor determinant
        // (exact for a degree-4 polynomial with 32 points up to rounding); they must
        // equal the coefficients of Π (z − λ_k) over the computed eigenvalues.
        let c = |re: f64, im: f64| C::new(re, im);
        let a = vec![
            vec![c(1.0, 0.5), c(-2.0, 0.0), c(0.3, 1.0), c(0.0, -1.0)],
            vec![c(0.5, 0.0), c(0.0, 2.0), c(1.0, 0.0), c(-0.7, 0.2)],
            vec![c(0.0, -1.5), c(1.0, 1.0), c(-1.0, 0.0), c(2.0, 0.0)],
            vec![c(1.2, 0.0), c(0.0, 0.0), c(0.4, -0.4), c(0.5, 1.0)],
        ];
        let ev = eigenvalues(a.clone()).unwrap();
        assert_eq!(ev.len(), 4);
        let char_poly = |z: C| {
            let m: Vec<Vec<C>> = (0..4).map(|i| (0..4).map(|j| if i == j { z - a[i][j] } else { -a[i][j] }).collect()).collect();
            cofactor_det(&m)
        };
        let from_eigenvalues = crate::poly::from_roots(C::new(1.0, 0.0), &ev);
        let cases = [("z^0", 0usize), ("z^1", 1), ("z^2", 2), ("z^3", 3), ("z^4", 4)];
        check_method(
            &cases,
            |&k| (from_eigenvalues[k], None),
            |&k| naive_circle_coefficient(char_poly, C::new(0.0, 0.0), 1.0, 32, k as i64),
            1e-12,
        );
    }
}

//! Smallest right singular vector of a tall complex matrix: Householder QR
//! followed by the one-sided Jacobi SVD of the triangular factor.
//!
//! Method: M. R. Hestenes, "Inversion of matrices by biorthogonalization and
//! related results", J. SIAM 6 (1958) 51–90; with the QR preconditioning of
//! Z. Drmač & K. Veselić, "New fast and accurate Jacobi SVD algorithm I",
//! SIAM J. Matrix Anal. Appl. 29 (2008) 1322–1342. Accurate to working
//! precision in the singular vectors (no squaring of the matrix).

use crate::C;

/// Column-major dense matrix: `cols[j][i]` is entry (i, j).
pub type Columns = Vec<Vec<C>>;

/// Householder QR of a tall matrix (m ≥ n): returns the n×n factor R as columns.
pub fn householder_r(mut a: Columns, m: usize) -> Columns {
    let n = a.len();
    let steps = n.min(m);
    for k in 0..steps {
        let norm: f64 = (k..m).map(|i| a[k][i].norm_sqr()).sum::<f64>().sqrt();
        if norm == 0.0 {
            continue;
        }
        let x0 = a[k][k];
        let phase = if x0.norm() > 0.0 {
            x0 / x0.norm()
        } else {
            C::new(1.0, 0.0)
        };
        let alpha = -phase * norm;
        let mut v: Vec<C> = (k..m).map(|i| a[k][i]).collect();
        v[0] -= alpha;
        let vn: f64 = v.iter().map(|x| x.norm_sqr()).sum::<f64>();
        if vn == 0.0 {
            continue;
        }
        for col in a.iter_mut().skip(k) {
            // col -= 2 v (v^H col) / (v^H v)
            let dot: C = v
                .iter()
                .zip(&col[k..m])
                .map(|(vi, ci)| vi.conj() * ci)
                .sum();
            let s = dot * (2.0 / vn);
            for (ci, vi) in col[k..m].iter_mut().zip(&v) {
                *ci -= s * vi;
            }
        }
    }
    a.into_iter()
        .map(|mut col| {
            col.truncate(n);
            col.resize(n, C::new(0.0, 0.0));
            col
        })
        .collect()
}

/// One-sided Jacobi SVD of a square matrix given by columns. Returns the
/// singular values and the right singular vectors (as columns of V).
pub fn jacobi_svd(mut a: Columns) -> (Vec<f64>, Columns) {
    let n = a.len();
    let mut v: Columns = (0..n)
        .map(|j| {
            (0..n)
                .map(|i| {
                    if i == j {
                        C::new(1.0, 0.0)
                    } else {
                        C::new(0.0, 0.0)
                    }
                })
                .collect()
        })
        .collect();
    for _sweep in 0..60 {
        let mut rotated = false;
        for p in 0..n {
            for q in p + 1..n {
                let alpha: f64 = a[p].iter().map(|x| x.norm_sqr()).sum();
                let beta: f64 = a[q].iter().map(|x| x.norm_sqr()).sum();
                let gamma: C = a[p].iter().zip(&a[q]).map(|(x, y)| x.conj() * y).sum();
                let g = gamma.norm();
                if g == 0.0 || g <= 1e-15 * (alpha * beta).sqrt() {
                    continue;
                }
                rotated = true;
                let phase = gamma / g;
                let zeta = (beta - alpha) / (2.0 * g);
                let t = zeta.signum() / (zeta.abs() + (1.0 + zeta * zeta).sqrt());
                let c = 1.0 / (1.0 + t * t).sqrt();
                let s = c * t;
                rotate(&mut a, p, q, c, s, phase);
                rotate(&mut v, p, q, c, s, phase);
            }
        }
        if !rotated {
            break;
        }
    }
    let sigma = a
        .iter()
        .map(|col| col.iter().map(|x| x.norm_sqr()).sum::<f64>().sqrt())
        .collect();
    (sigma, v)
}

/// a_p ← c a_p − s e^{−iφ} a_q,  a_q ← s e^{iφ} a_p + c a_q.
fn rotate(a: &mut Columns, p: usize, q: usize, c: f64, s: f64, phase: C) {
    let (left, right) = a.split_at_mut(q);
    let (cp, cq) = (&mut left[p], &mut right[0]);
    for (x, y) in cp.iter_mut().zip(cq.iter_mut()) {
        let (xp, yq) = (*x, *y);
        *x = xp * c - yq * phase.conj() * s;
        *y = xp * phase * s + yq * c;
    }
}

/// The right singular vector for the smallest singular value of the m×n
/// matrix given by columns (m ≥ n), and that singular value.
///
/// ```
/// use residuary::linalg::jacobi_svd::smallest_right_singular_vector;
/// use residuary::C;
/// // Columns (1, 1, 1) and (1, 1, 1): rank one, so σ_min = 0 with v ∝ (1, −1)
/// // (any linear algebra text).
/// let one = C::new(1.0, 0.0);
/// let (v, sigma) = smallest_right_singular_vector(vec![vec![one; 3], vec![one; 3]], 3);
/// assert!(sigma < 1e-14);
/// assert!((v[0] + v[1]).norm() < 1e-14 && (v[0].norm() - 0.5f64.sqrt()).abs() < 1e-14);
/// ```
pub fn smallest_right_singular_vector(a: Columns, m: usize) -> (Vec<C>, f64) {
    let r = householder_r(a, m);
    let (sigma, v) = jacobi_svd(r);
    let mut best = 0;
    for (j, s) in sigma.iter().enumerate() {
        if *s < sigma[best] {
            best = j;
        }
    }
    (v[best].clone(), sigma.get(best).copied().unwrap_or(0.0))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Property: the residual ‖A v‖ of the returned vector must equal the
    /// returned smallest singular value, and no random unit vector may do better.
    #[test]
    fn smallest_vector_minimises_residual() {
        let m = 12;
        let n = 5;
        let mut seed = 12345u64;
        let mut rnd = || {
            seed = seed
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            ((seed >> 11) as f64 / (1u64 << 53) as f64) - 0.5
        };
        let a: Columns = (0..n)
            .map(|_| (0..m).map(|_| C::new(rnd(), rnd())).collect())
            .collect();
        let (v, smin) = smallest_right_singular_vector(a.clone(), m);
        let apply = |x: &[C]| -> f64 {
            (0..m)
                .map(|i| (0..n).map(|j| a[j][i] * x[j]).sum::<C>().norm_sqr())
                .sum::<f64>()
                .sqrt()
        };
        let vn: f64 = v.iter().map(|x| x.norm_sqr()).sum::<f64>().sqrt();
        assert!((vn - 1.0).abs() < 1e-12);
        assert!((apply(&v) - smin).abs() < 1e-12);
        for _ in 0..200 {
            let x: Vec<C> = (0..n).map(|_| C::new(rnd(), rnd())).collect();
            let xn: f64 = x.iter().map(|z| z.norm_sqr()).sum::<f64>().sqrt();
            let x: Vec<C> = x.iter().map(|z| z / xn).collect();
            assert!(apply(&x) >= smin - 1e-12);
        }
    }

    /// Householder reflector I − 2uuᴴ/(uᴴu) as columns: unitary by construction.
    fn reflector(u: &[C]) -> Columns {
        let uu: f64 = u.iter().map(|x| x.norm_sqr()).sum();
        (0..u.len())
            .map(|j| {
                (0..u.len())
                    .map(|i| {
                        let delta = if i == j { 1.0 } else { 0.0 };
                        C::new(delta, 0.0) - u[i] * u[j].conj() * (2.0 / uu)
                    })
                    .collect()
            })
            .collect()
    }

    /// Slow reference by construction: A = U Σ Vᴴ with unitary reflectors U, V and
    /// chosen Σ has singular values Σ and right singular vectors the columns of V
    /// (definition of the SVD, any linear-algebra text), so the smallest pair is known.
    #[test]
    fn recovers_a_constructed_smallest_singular_pair() {
        let (m, n) = (9, 5);
        let sigma = [3.0, 1.5, 0.7, 1e-3, 0.2];
        let u: Vec<C> = (0..m)
            .map(|i| C::new(0.3 + i as f64 * 0.17, (i as f64 * 1.3).sin()))
            .collect();
        let w: Vec<C> = (0..n)
            .map(|j| C::new((j as f64 * 0.7).cos(), 0.2 * j as f64 - 0.4))
            .collect();
        let (uu, vv) = (reflector(&u), reflector(&w));
        // A[:, j] = Σ_k U[:, k] σ_k conj(V[j, k])
        let a: Columns = (0..n)
            .map(|j| {
                (0..m)
                    .map(|i| (0..n).map(|k| uu[k][i] * sigma[k] * vv[k][j].conj()).sum())
                    .collect()
            })
            .collect();
        let (v, smin) = smallest_right_singular_vector(a, m);
        assert!(
            (smin - 1e-3).abs() < 1e-13,
            "smallest singular value {smin}"
        );
        // |⟨v, V[:, 3]⟩| = 1 up to rounding (the vector is defined up to a phase)
        let overlap: C = (0..n).map(|i| vv[3][i].conj() * v[i]).sum();
        assert!((overlap.norm() - 1.0).abs() < 1e-12, "overlap {overlap}");
    }

    #[test]
    fn the_smallest_pair_agrees_with_the_closed_form_eigenvalue_of_the_gram_matrix() {
        // A 4×2 complex matrix (invented data). Slow reference: σ_min² is the smaller
        // eigenvalue of the 2×2 Hermitian AᴴA = [[p, q], [q̄, s]], by the quadratic
        // formula (p + s)/2 − √(((p − s)/2)² + |q|²) (common practice).
        let c = |re: f64, im: f64| C::new(re, im);
        let cols: Columns = vec![
            vec![c(1.0, 0.5), c(-0.3, 0.0), c(0.2, 1.0), c(0.0, -0.4)],
            vec![c(0.8, 0.2), c(0.1, -0.5), c(1.1, 0.6), c(0.3, 0.0)],
        ];
        let dot = |x: &[C], y: &[C]| x.iter().zip(y).map(|(a, b)| a.conj() * b).sum::<C>();
        let (p, q, s) = (dot(&cols[0], &cols[0]).re, dot(&cols[0], &cols[1]), dot(&cols[1], &cols[1]).re);
        let lambda_min = 0.5 * (p + s) - ((0.5 * (p - s)).powi(2) + q.norm_sqr()).sqrt();
        let (v, sigma) = smallest_right_singular_vector(cols.clone(), 4);
        crate::reference::assert_close(C::new(sigma * sigma, 0.0), C::new(lambda_min, 0.0), 1e-13, "σ_min²");
        // v is a unit vector with ‖Av‖ = σ_min.
        let av: Vec<C> = (0..4).map(|i| cols[0][i] * v[0] + cols[1][i] * v[1]).collect();
        assert!((dot(&v, &v).re - 1.0).abs() < 1e-14, "v is not a unit vector");
        assert!((dot(&av, &av).re.sqrt() - sigma).abs() < 1e-13, "‖Av‖ differs from σ");
    }
}

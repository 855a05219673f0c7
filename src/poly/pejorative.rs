//! Multiplicity structure of an expanded polynomial, chosen by the backward error.
//!
//! Method: Z. Zeng, "Computing multiple roots of inexact polynomials", Math.
//! Comp. 74 (2005) 869–903. A multiplicity structure (m₁, …, m_k) defines the
//! *pejorative manifold* of monic polynomials Π (z − z_j)^{m_j}; on it the
//! roots are well conditioned. For a given structure, Gauss–Newton finds the
//! nearest point: minimise ‖G(z₁, …, z_k) − p/lc‖₂ over the roots, where G's
//! coefficients are those of Π (z − z_j)^{m_j} and ∂G/∂z_j = −m_j·G/(z − z_j)
//! (Zeng §3). The structure kept is the coarsest one whose refined backward
//! error ‖G − p/lc‖/‖p/lc‖ is at working precision (Zeng's "minimal
//! multiplicity structure within the backward nearness"): merging is accepted
//! only when the merged model explains the coefficients as well as rounding
//! allows, and the unmerged model (simple roots) cannot do measurably better.
//!
//! Candidate structures come from single-linkage merging of the simple root
//! approximations *inside* each inclusion-disc cluster (Bini 1996: disjoint
//! disc unions hold separate roots, so no merge crosses them), coarsest first.
//! The error of each refined root is first-order: the row norm of the
//! Gauss–Newton pseudo-inverse times the coefficient noise (Zeng §4's
//! structure-preserving condition number, written out).

use super::{mul, UNIT_ROUNDOFF};
use crate::C;

/// Highest degree refined this way (cost grows like degree⁴ over the levels).
pub const MAX_DEGREE: usize = 40;
/// Backward error accepted, in units of degree × unit roundoff.
const ACCEPT: f64 = 256.0;
/// Safety factor on the first-order root errors.
const SAFETY: f64 = 8.0;
const ITERATIONS: usize = 40;

/// A refined multiplicity structure.
#[derive(Debug, Clone, PartialEq)]
pub struct Structure {
    /// Distinct roots with multiplicities, refined on the pejorative manifold.
    pub roots: Vec<(C, u32)>,
    /// First-order error estimate of each root.
    pub errors: Vec<f64>,
    /// Indices of the simple approximations that form each root.
    pub members: Vec<Vec<usize>>,
    /// Relative backward error ‖Π(z − z_j)^{m_j} − p/lc‖₂ / ‖p/lc‖₂.
    pub backward_error: f64,
    /// Whether the backward error is at working precision (else this is only
    /// the best structure found).
    pub accepted: bool,
}

/// Coefficients (ascending, monic) of Π (z − z_j)^{m_j}.
fn expand(roots: &[(C, u32)]) -> Vec<C> {
    let mut p = vec![C::new(1.0, 0.0)];
    for &(z, m) in roots {
        for _ in 0..m {
            p = mul(&p, &[-z, C::new(1.0, 0.0)]);
        }
    }
    p
}

fn norm2(v: &[C]) -> f64 {
    v.iter().map(|c| c.norm_sqr()).sum::<f64>().sqrt()
}

/// Least squares `min ‖A x − b‖` by modified Gram–Schmidt QR (A given by columns),
/// with the row norms of the pseudo-inverse A⁺ = R⁻¹Qᴴ. `None` if A is rank-deficient.
fn least_squares(mut cols: Vec<Vec<C>>, b: &[C]) -> Option<(Vec<C>, Vec<f64>)> {
    let k = cols.len();
    let mut r = vec![vec![C::new(0.0, 0.0); k]; k];
    for j in 0..k {
        for _ in 0..2 {
            // Twice is enough (Giraud et al., Numer. Math. 101, 2005: "twice is enough").
            for i in 0..j {
                let dot: C = cols[i].iter().zip(&cols[j]).map(|(q, a)| q.conj() * a).sum();
                r[i][j] += dot;
                let qi = cols[i].clone();
                for (a, q) in cols[j].iter_mut().zip(&qi) {
                    *a -= dot * q;
                }
            }
        }
        let n = norm2(&cols[j]);
        if !(n > 0.0) || !n.is_finite() {
            return None;
        }
        r[j][j] = C::new(n, 0.0);
        for a in cols[j].iter_mut() {
            *a /= n;
        }
    }
    // x = R⁻¹ Qᴴ b.
    let qb: Vec<C> = cols.iter().map(|q| q.iter().zip(b).map(|(q, b)| q.conj() * b).sum()).collect();
    let mut x = vec![C::new(0.0, 0.0); k];
    for i in (0..k).rev() {
        let s: C = (i + 1..k).map(|j| r[i][j] * x[j]).sum();
        x[i] = (qb[i] - s) / r[i][i];
    }
    // Rows of R⁻¹ (upper triangular), by back substitution on the identity.
    let mut inv = vec![vec![C::new(0.0, 0.0); k]; k];
    for c in 0..k {
        for i in (0..=c).rev() {
            let e = if i == c { C::new(1.0, 0.0) } else { C::new(0.0, 0.0) };
            let s: C = (i + 1..=c).map(|j| r[i][j] * inv[j][c]).sum();
            inv[i][c] = (e - s) / r[i][i];
        }
    }
    let rows = inv.iter().map(|row| norm2(row)).collect();
    x.iter().all(|v| v.is_finite()).then_some((x, rows))
}

/// Gauss–Newton on the pejorative manifold of `mults` from `start`, towards
/// the monic target `q`. Returns roots, per-root error estimates and the
/// relative backward error.
fn refine(q: &[C], start: &[C], mults: &[u32]) -> Option<(Vec<C>, Vec<f64>, f64)> {
    let n = q.len() - 1;
    let scale = norm2(q);
    let mut z = start.to_vec();
    let mut rows = vec![f64::INFINITY; z.len()];
    let mut last = f64::INFINITY;
    for _ in 0..ITERATIONS {
        let structure: Vec<(C, u32)> = z.iter().copied().zip(mults.iter().copied()).collect();
        let g = expand(&structure);
        let residual: Vec<C> = (0..n).map(|i| g[i] - q[i]).collect();
        // Column j: −m_j · Π(z − z_i)^{m_i} / (z − z_j), ascending coefficients below the leading one.
        let cols: Vec<Vec<C>> = (0..z.len())
            .map(|j| {
                let mut s = structure.clone();
                s[j].1 -= 1;
                let h = expand(&s);
                (0..n).map(|i| -h.get(i).copied().unwrap_or_default() * mults[j] as f64).collect()
            })
            .collect();
        let (step, row_norms) = least_squares(cols, &residual)?;
        rows = row_norms;
        let before = norm2(&residual);
        let size = norm2(&step);
        for (x, d) in z.iter_mut().zip(&step) {
            *x -= d;
        }
        let reference = z.iter().map(|x| x.norm()).fold(1.0, f64::max);
        if !(size <= 1e-3 * reference) && before >= last {
            return None; // diverging
        }
        last = before;
        if size <= 4.0 * UNIT_ROUNDOFF * reference {
            break;
        }
    }
    let structure: Vec<(C, u32)> = z.iter().copied().zip(mults.iter().copied()).collect();
    let g = expand(&structure);
    let residual: Vec<C> = (0..n).map(|i| g[i] - q[i]).collect();
    let backward = norm2(&residual) / scale;
    let noise = (backward + n as f64 * UNIT_ROUNDOFF) * scale;
    let errors = rows.iter().map(|r| SAFETY * r * noise).collect();
    z.iter().all(|x| x.is_finite()).then_some((z, errors, backward))
}

/// Choose the multiplicity structure of `p` (ascending, degree ≥ 1) from its
/// simple root approximations `approx` and the inclusion-disc clusters
/// `clusters` (indices into `approx`): the coarsest single-linkage structure
/// inside the clusters whose refined backward error is at working precision.
/// `None` when the degree is above [`MAX_DEGREE`] or no structure refines.
///
/// ```
/// use residuary::poly::{from_roots, pejorative::choose_structure};
/// use residuary::C;
/// // (z − 1)⁵ (z + 2)²: multiplicities by construction; the approximations are
/// // perturbed by hand the way a root finder leaves them (a spread of 1e-3).
/// let (a, b) = (C::new(1.0, 0.0), C::new(-2.0, 0.0));
/// let p = from_roots(C::new(3.0, 0.0), &[a, a, a, a, a, b, b]);
/// let approx: Vec<C> = (0..5).map(|k| a + C::from_polar(1e-3, k as f64 * 1.2566))
///     .chain([b + 1e-7, b - 1e-7]).collect();
/// let s = choose_structure(&p, &approx, &[(0..7).collect()]).unwrap();
/// assert_eq!(s.roots.len(), 2);
/// let five = s.roots.iter().find(|r| r.1 == 5).unwrap();
/// assert!((five.0 - a).norm() < 1e-13);
/// ```
pub fn choose_structure(p: &[C], approx: &[C], clusters: &[Vec<usize>]) -> Option<Structure> {
    let n = p.len().checked_sub(1)?;
    if n == 0 || n > MAX_DEGREE || approx.len() != n {
        return None;
    }
    let lc = p[n];
    let q: Vec<C> = p.iter().map(|c| c / lc).collect();
    if !q.iter().all(|c| c.is_finite()) {
        return None;
    }
    // Single-linkage merge events inside each cluster, nearest pairs first.
    let mut pairs: Vec<(f64, usize, usize)> = Vec::new();
    for c in clusters {
        for (x, &i) in c.iter().enumerate() {
            for &j in &c[x + 1..] {
                pairs.push(((approx[i] - approx[j]).norm(), i, j));
            }
        }
    }
    pairs.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut parent: Vec<usize> = (0..n).collect();
    let find = |parent: &mut Vec<usize>, mut i: usize| {
        while parent[i] != i {
            parent[i] = parent[parent[i]];
            i = parent[i];
        }
        i
    };
    // Levels: the partition after each merge event, finest (all simple) first.
    let mut levels: Vec<Vec<usize>> = vec![(0..n).collect()];
    for &(_, i, j) in &pairs {
        let (a, b) = (find(&mut parent, i), find(&mut parent, j));
        if a != b {
            parent[a] = b;
            levels.push((0..n).map(|k| find(&mut parent, k)).collect());
        }
    }
    let accept = ACCEPT * n as f64 * UNIT_ROUNDOFF;
    let mut finest_ok: Option<Structure> = None;
    for labels in levels.iter().rev() {
        let mut groups: Vec<Vec<usize>> = Vec::new();
        let mut slot = vec![usize::MAX; n];
        for (k, &l) in labels.iter().enumerate() {
            if slot[l] == usize::MAX {
                slot[l] = groups.len();
                groups.push(Vec::new());
            }
            groups[slot[l]].push(k);
        }
        if groups.iter().all(|g| g.len() == 1) && finest_ok.is_some() {
            break;
        }
        let start: Vec<C> = groups.iter().map(|g| g.iter().map(|&k| approx[k]).sum::<C>() / g.len() as f64).collect();
        let mults: Vec<u32> = groups.iter().map(|g| g.len() as u32).collect();
        let Some((z, errors, backward)) = refine(&q, &start, &mults) else { continue };
        let s = Structure {
            roots: z.into_iter().zip(mults).collect(),
            errors,
            members: groups,
            backward_error: backward,
            accepted: backward <= accept,
        };
        if backward <= accept {
            return Some(s);
        }
        if finest_ok.as_ref().is_none_or(|f| backward < f.backward_error) {
            finest_ok = Some(s);
        }
    }
    finest_ok
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::poly::from_roots;
    use crate::reference::check_method;

    /// Slow reference: the structure's roots against the roots it was built from
    /// (by construction), for several structures with close multiple roots.
    #[test]
    fn recovers_multiplicities_that_clustering_merges() {
        let c = |re: f64, im: f64| C::new(re, im);
        // Invented structures: multiple roots 0.5 apart, orders 4 and 5.
        let cases: Vec<(&str, Vec<(C, u32)>)> = vec![
            ("(-1.5-i)^4 (-1.5-1.5i)^5 (1.5)^2", vec![(c(-1.5, -1.0), 4), (c(-1.5, -1.5), 5), (c(1.5, 0.0), 2)]),
            ("(0.5+4i)^4 (1.5+4i)^5 (1.5-0.5i)", vec![(c(0.5, 4.0), 4), (c(1.5, 4.0), 5), (c(1.5, -0.5), 1)]),
            ("(1)^3 (1.25)^3 (-2)^2", vec![(c(1.0, 0.0), 3), (c(1.25, 0.0), 3), (c(-2.0, 0.0), 2)]),
        ];
        let mut checks = Vec::new();
        for (name, structure) in &cases {
            let all: Vec<C> = structure.iter().flat_map(|&(z, m)| std::iter::repeat_n(z, m as usize)).collect();
            let p = from_roots(C::new(1.0, 0.0), &all);
            let r = crate::poly::aberth_ehrlich::roots(&p).unwrap();
            let s = choose_structure(&p, &r.roots, &[(0..all.len()).collect()]).expect(name);
            let mut got = s.roots.clone();
            got.sort_by(|a, b| a.1.cmp(&b.1).then(a.0.re.total_cmp(&b.0.re)));
            let mut want = structure.clone();
            want.sort_by(|a, b| a.1.cmp(&b.1).then(a.0.re.total_cmp(&b.0.re)));
            assert_eq!(got.iter().map(|r| r.1).collect::<Vec<_>>(), want.iter().map(|r| r.1).collect::<Vec<_>>(), "{name}");
            for (g, w) in got.iter().zip(&want) {
                let i = s.roots.iter().position(|r| r == g).unwrap();
                checks.push((*name, (g.0, s.errors[i], w.0)));
            }
        }
        check_method(&checks, |&(g, e, _)| (g, Some(e)), |&(_, _, w)| w, 1e-10);
    }
}

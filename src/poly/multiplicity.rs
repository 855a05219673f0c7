//! Multiple roots from clusters of simple approximations.
//!
//! Method: a root of multiplicity m comes out of a floating-point root finder as m
//! points on a circle of radius about `(u·scale/|p^(m)/m!|)^(1/m)`. Clusters are
//! the connected unions of the inclusion discs of Bini, "Numerical computation
//! of polynomial zeros by means of Aberth's method", Numer. Algorithms 13
//! (1996) (a union of k discs holds k roots). Each cluster is replaced by its
//! centroid — the mean of the cluster's roots is a well-conditioned function of
//! the coefficients (common practice) — and then refined by Newton's method on
//! `p^(m−1)`, for which the m-fold root is simple. The idea that a multiple
//! root is well-conditioned once its multiplicity is fixed is that of Z. Zeng,
//! "Computing multiple roots of inexact polynomials", Math. Comp. 74 (2005).

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use crate::error::Failure;
use super::aberth_ehrlich::{self, Roots};
use super::pejorative;
use super::taylor::{abs_coefficients_at, coefficients_at};
use super::{nth_derivative, UNIT_ROUNDOFF};
use crate::C;

/// Safety factor on the first-order error of a refined multiple root.
const ERROR_SAFETY: f64 = 8.0;
/// A cluster wider than this many perturbation radii is not explained by one multiple root.
const SPREAD_TOLERANCE: f64 = 30.0;

/// One distinct root with its multiplicity.
#[derive(Debug, Clone, PartialEq)]
pub struct RootCluster {
    /// Centroid of the cluster, refined by Newton on `p^(m−1)`.
    pub center: C,
    pub multiplicity: u32,
    /// Error estimate of `center`.
    pub error: f64,
    /// How far rounding the coefficients to double precision alone can move an
    /// m-fold root, ~(u·Σ|p_k||c|^k / |p^(m)(c)/m!|)^(1/m): a floor on the location error.
    pub perturbation: f64,
    /// Largest distance from a member approximation to the center.
    pub spread: f64,
    /// The simple approximations that formed the cluster.
    pub members: Vec<C>,
    /// False when the spread is too wide for a single m-fold root: then the cluster is
    /// probably several distinct roots closer together than double precision resolves.
    pub resolved: bool,
}

/// Roots of `p` grouped into distinct roots with multiplicities.
///
/// ```
/// use residuary::poly::{from_roots, multiplicity::distinct_roots};
/// use residuary::C;
/// // (z − 1)³(z + 2): a triple root at 1 and a simple one at −2 (by construction).
/// let one = C::new(1.0, 0.0);
/// let p = from_roots(one, &[one, one, one, C::new(-2.0, 0.0)]);
/// let (clusters, converged) = distinct_roots(&p).unwrap();
/// assert!(converged && clusters.len() == 2);
/// let triple = clusters.iter().find(|c| c.multiplicity == 3).unwrap();
/// assert!((triple.center - one).norm() <= triple.error.max(1e-12));
/// ```
pub fn distinct_roots(p: &[C]) -> Result<(Vec<RootCluster>, bool), Failure> {
    let r = aberth_ehrlich::roots(p)?;
    let groups = cluster_groups(p, &r);
    if groups.iter().any(|g| g.len() > 1) {
        // The clusters bound what may merge; the backward error decides what does.
        if let Some(s) = pejorative::choose_structure(p, &r.roots, &groups) {
            return Ok((from_structure(&r, s), r.converged));
        }
    }
    Ok((clusters_from_groups(p, &r, groups), r.converged))
}

/// Root clusters from a structure chosen on the pejorative manifold.
fn from_structure(r: &Roots, s: pejorative::Structure) -> Vec<RootCluster> {
    s.roots
        .iter()
        .zip(&s.errors)
        .zip(&s.members)
        .map(|((&(center, m), &error), idx)| {
            let members: Vec<C> = idx.iter().map(|&i| r.roots[i]).collect();
            // Exact members (zeros at the origin read off the coefficients) stay exact.
            let (center, error) = if members.iter().all(|z| *z == members[0]) && m > 1 { (members[0], 0.0) } else { (center, error) };
            let spread = members.iter().map(|z| (z - center).norm()).fold(0.0, f64::max);
            RootCluster { center, multiplicity: m, error, perturbation: error, spread, members, resolved: s.accepted }
        })
        .collect()
}

/// Distinct roots of a product `Π p_k^{m_k}` given as its factors, each
/// factor's roots found on its own (see [`distinct_roots`]) and their
/// multiplicities scaled by `m_k`. Roots of different factors stay distinct
/// unless they coincide to working precision — within the sum of their
/// error estimates plus rounding of their size — which is checked, not
/// assumed: two typed factors `(z − 1.456)²(z − 1.456001456)` give a double
/// root and a simple one 1.456e-6 apart.
///
/// ```
/// use residuary::poly::multiplicity::distinct_roots_of_product;
/// use residuary::C;
/// let c = |x: f64| C::new(x, 0.0);
/// // (z − 1.456)² (z − 1.456001456): monic linear factors (by construction).
/// let (a, b) = ([c(-1.456), c(1.0)], [c(-1.456001456), c(1.0)]);
/// let (roots, converged) = distinct_roots_of_product(&[(&a[..], 2), (&b[..], 1)]).unwrap();
/// assert!(converged && roots.len() == 2);
/// assert!(roots.iter().any(|r| r.multiplicity == 2 && (r.center - c(1.456)).norm() < 1e-15));
/// ```
pub fn distinct_roots_of_product(factors: &[(&[C], u32)]) -> Result<(Vec<RootCluster>, bool), Failure> {
    let mut all: Vec<RootCluster> = Vec::new();
    let mut converged = true;
    for &(p, m) in factors {
        let (mut roots, ok) = if p.len() == 2 {
            // A linear factor: its root is read off, to the rounding of one division.
            let z = -p[0] / p[1];
            let e = 2.0 * UNIT_ROUNDOFF * z.norm();
            (vec![RootCluster { center: z, multiplicity: 1, error: e, perturbation: e, spread: 0.0, members: vec![z], resolved: true }], true)
        } else {
            distinct_roots(p)?
        };
        converged &= ok;
        for r in &mut roots {
            r.multiplicity *= m;
        }
        all.extend(roots);
    }
    // Merge roots of different factors that coincide to working precision.
    let mut merged: Vec<RootCluster> = Vec::new();
    for r in all {
        let same = merged.iter_mut().find(|q| {
            let tol = 4.0 * (q.error + r.error) + 16.0 * UNIT_ROUNDOFF * q.center.norm().max(r.center.norm());
            (q.center - r.center).norm() <= tol
        });
        match same {
            Some(q) => {
                let (mq, mr) = (q.multiplicity as f64, r.multiplicity as f64);
                q.center = (q.center * mq + r.center * mr) / (mq + mr);
                q.multiplicity += r.multiplicity;
                q.error = q.error.max(r.error);
                q.perturbation = q.perturbation.max(r.perturbation);
                q.resolved &= r.resolved;
                q.members.extend(r.members);
            }
            None => merged.push(r),
        }
    }
    Ok((merged, converged))
}

fn find(parent: &mut [usize], i: usize) -> usize {
    let mut r = i;
    while parent[r] != r {
        r = parent[r];
    }
    let mut k = i;
    while parent[k] != r {
        let next = parent[k];
        parent[k] = r;
        k = next;
    }
    r
}

/// Group the approximations in `r` (roots of `p`) into clusters.
pub fn cluster_roots(p: &[C], r: &Roots) -> Vec<RootCluster> {
    let groups = cluster_groups(p, r);
    clusters_from_groups(p, r, groups)
}

/// Indices of the approximations in each connected union of inclusion discs.
fn cluster_groups(p: &[C], r: &Roots) -> Vec<Vec<usize>> {
    let n = r.roots.len();
    let radius: Vec<f64> = (0..n)
        .map(|i| {
            // The inclusion disc n|p|/|p′| holds a root (Bini 1996). The running
            // error bound is not used here: for a member of a cluster it can be far
            // wider than the disc and would bridge distinct multiple roots.
            let inclusion = r.inclusion_radii[i];
            if inclusion.is_finite() {
                inclusion
            } else {
                // p′ vanishes at the approximation (it converged onto a multiple
                // root exactly): the inclusion disc is the whole plane and would
                // merge every root into one. Use the perturbation radius instead.
                perturbation_radius(p, r.roots[i])
            }
        })
        .collect();
    let mut parent: Vec<usize> = (0..n).collect();
    // Sort by real part so only nearby pairs are compared.
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|&a, &b| r.roots[a].re.total_cmp(&r.roots[b].re));
    let max_radius = radius
        .iter()
        .copied()
        .filter(|x| x.is_finite())
        .fold(0.0, f64::max);
    for (oi, &i) in order.iter().enumerate() {
        for &j in &order[oi + 1..] {
            let dx = r.roots[j].re - r.roots[i].re;
            if dx > radius[i] + max_radius && radius[i].is_finite() {
                break;
            }
            let d = (r.roots[i] - r.roots[j]).norm();
            if !(d > radius[i] + radius[j]) {
                let (a, b) = (find(&mut parent, i), find(&mut parent, j));
                if a != b {
                    parent[a] = b;
                }
            }
        }
    }
    let mut groups: Vec<Vec<usize>> = Vec::new();
    let mut slot = vec![usize::MAX; n];
    for i in 0..n {
        let g = find(&mut parent, i);
        if slot[g] == usize::MAX {
            slot[g] = groups.len();
            groups.push(Vec::new());
        }
        groups[slot[g]].push(i);
    }
    groups
}

/// One cluster per group: a single member as it is, others refined (centroid and Newton on p^(m−1)).
fn clusters_from_groups(p: &[C], r: &Roots, groups: Vec<Vec<usize>>) -> Vec<RootCluster> {
    groups
        .into_iter()
        .map(|g| {
            let members: Vec<C> = g.iter().map(|&i| r.roots[i]).collect();
            if members.len() == 1 {
                let i = g[0];
                return RootCluster {
                    center: members[0],
                    multiplicity: 1,
                    error: r.errors[i],
                    perturbation: r.errors[i],
                    spread: 0.0,
                    members,
                    resolved: true,
                };
            }
            refine_cluster(p, members)
        })
        .collect()
}

/// How far rounding the coefficients can move a root at `z` of the
/// multiplicity the Taylor coefficients there show: with k the first index
/// with p^(k)(z) ≠ 0, (4 n u Σ|p_j||z|^j / |p^(k)(z)/k!|)^(1/k) (common practice,
/// the first-order perturbation of a k-fold root; Zeng 2005, §2). Infinite
/// when p vanishes identically there.
fn perturbation_radius(p: &[C], z: C) -> f64 {
    let tc = coefficients_at(p, z, p.len());
    let scale = abs_coefficients_at(p, z, 1)[0];
    match (1..tc.len()).find(|&k| tc[k] != C::new(0.0, 0.0)) {
        Some(k) => (4.0 * (p.len() as f64) * UNIT_ROUNDOFF * scale / tc[k].norm()).powf(1.0 / k as f64),
        None => f64::INFINITY,
    }
}

/// Centroid, Newton refinement on `p^(m−1)`, error estimate and a resolvability check.
fn refine_cluster(p: &[C], members: Vec<C>) -> RootCluster {
    let m = members.len();
    let centroid = members.iter().sum::<C>() / m as f64;
    let spread = members
        .iter()
        .map(|z| (z - centroid).norm())
        .fold(0.0, f64::max);
    let mut resolved = true;
    if members.iter().all(|z| *z == centroid) {
        // Exact (e.g. zeros at the origin found by coefficient inspection).
        return RootCluster {
            center: centroid,
            multiplicity: m as u32,
            error: 0.0,
            perturbation: 0.0,
            spread,
            members,
            resolved,
        };
    }
    // Perturbation radius of an m-fold root under coefficient noise u·Σ|p_k||c|^k (common practice).
    let perturbation_at = |c: C| {
        let tc = coefficients_at(p, c, m + 1);
        let scale = abs_coefficients_at(p, c, 1)[0];
        (4.0 * (p.len() as f64) * UNIT_ROUNDOFF * scale / tc[m].norm()).powf(1.0 / m as f64)
    };
    // Newton may move the centre as far as the members could be off: their
    // spread, or the perturbation radius when the members bunched up early.
    let reach = spread.max(perturbation_at(centroid)).max(UNIT_ROUNDOFF * centroid.norm());
    let d = nth_derivative(p, m - 1);
    let mut center = centroid;
    for _ in 0..8 {
        let t = coefficients_at(&d, center, 2);
        if t[1] == C::new(0.0, 0.0) {
            break;
        }
        let step = t[0] / t[1];
        let next = center - step;
        if !next.is_finite() || (next - centroid).norm() > 2.0 * reach {
            break;
        }
        center = next;
        if step.norm() <= 4.0 * UNIT_ROUNDOFF * center.norm() {
            break;
        }
    }
    // First-order error of the simple root of p^(m−1): (|value| + rounding + coefficient noise)/|slope|.
    let t = coefficients_at(&d, center, 2);
    let s = abs_coefficients_at(&d, center, 1)[0];
    let dn = d.len().max(1) as f64;
    let mut error = ERROR_SAFETY * (t[0].norm() + 4.0 * dn * UNIT_ROUNDOFF * s) / t[1].norm();
    if !(error.is_finite()) || error > 2.0 * reach {
        center = centroid;
        error = 2.0 * reach;
    }
    let rho = perturbation_at(center);
    if !(spread <= SPREAD_TOLERANCE * rho) {
        resolved = false;
    }
    RootCluster {
        center,
        multiplicity: m as u32,
        error,
        perturbation: if rho.is_finite() { rho } else { spread },
        spread,
        members,
        resolved,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::poly::from_roots;

    #[test]
    fn triple_double_simple() {
        // (z−1)^3 (z+2)^2 (z−i): multiplicities by construction
        let one = C::new(1.0, 0.0);
        let p = from_roots(
            one,
            &[
                one,
                one,
                one,
                C::new(-2.0, 0.0),
                C::new(-2.0, 0.0),
                C::new(0.0, 1.0),
            ],
        );
        let (mut cl, ok) = distinct_roots(&p).unwrap();
        assert!(ok);
        cl.sort_by_key(|c| std::cmp::Reverse(c.multiplicity));
        assert_eq!(
            cl.iter().map(|c| c.multiplicity).collect::<Vec<_>>(),
            vec![3, 2, 1]
        );
        assert!((cl[0].center - one).norm() < 1e-10);
        assert!((cl[1].center + 2.0).norm() < 1e-10);
        assert!((cl[2].center - C::new(0.0, 1.0)).norm() < 1e-12);
        assert!(cl.iter().all(|c| c.resolved));
    }

    #[test]
    fn multiplicities_agree_with_the_argument_principle() {
        // (z − 1 − i)³ (z + 0.5)² (z − 2) (invented data): the number of zeros in a
        // small circle about each cluster's center, by the naive circle sum of p'/p
        // (argument principle, common practice), is the cluster's multiplicity.
        let (a, b) = (C::new(1.0, 1.0), C::new(-0.5, 0.0));
        let p = from_roots(C::new(2.0, 0.0), &[a, a, a, b, b, C::new(2.0, 0.0)]);
        let dp = crate::poly::nth_derivative(&p, 1);
        let eval = |q: &[C], z: C| q.iter().rev().fold(C::new(0.0, 0.0), |acc, &c| acc * z + c);
        let (clusters, converged) = distinct_roots(&p).unwrap();
        assert!(converged);
        assert_eq!(clusters.len(), 3);
        for cl in &clusters {
            assert!(cl.resolved);
            let i = crate::reference::naive_circle_integral(|z| eval(&dp, z) / eval(&p, z), cl.center, 0.3, 512);
            let count = (i / C::new(0.0, 2.0 * std::f64::consts::PI)).re;
            assert!((count - cl.multiplicity as f64).abs() < 1e-8, "{}: multiplicity {} but {count} zeros", cl.center, cl.multiplicity);
            // The center is within its error estimate of one of the true roots.
            let d = [a, b, C::new(2.0, 0.0)].iter().map(|r| (r - cl.center).norm()).fold(f64::INFINITY, f64::min);
            assert!(d <= cl.error, "{}: distance {d:.1e} > estimate {:.1e}", cl.center, cl.error);
        }
    }
}

//! AAA rational approximation of sampled values, and the poles and zeros of
//! the resulting barycentric rational function.
//!
//! Method: Y. Nakatsukasa, O. Sète, L. N. Trefethen, "The AAA algorithm for
//! rational approximation", SIAM J. Sci. Comput. 40 (2018) A1494–A1522.
//! Weights: smallest right singular vector of the Loewner matrix
//! (crate::linalg::jacobi_svd). Poles/zeros: roots of the barycentric
//! denominator Σ wⱼ/(z − zⱼ) (numerator Σ wⱼfⱼ/(z − zⱼ)); instead of the
//! (n+1)×(n+1) arrowhead pencil we use the equivalent n×n standard problem
//! P(Z − cI), P = I − e wᵀ/(wᵀe), whose eigenvalues are the roots minus c
//! plus one spurious 0 (dropped); c is a shift chosen far from the data.

use crate::linalg::{complex_qr_eigen::eigenvalues, jacobi_svd::smallest_right_singular_vector};
use crate::C;

/// A barycentric rational approximant r(z) = Σ wⱼfⱼ/(z−zⱼ) / Σ wⱼ/(z−zⱼ).
#[derive(Debug, Clone)]
pub struct Barycentric {
    pub support: Vec<C>,
    pub values: Vec<C>,
    pub weights: Vec<C>,
    /// Max |F − r| on the samples, relative to max |F|.
    pub relative_error: f64,
    pub converged: bool,
}

impl Barycentric {
    pub fn eval(&self, z: C) -> C {
        let mut num = C::new(0.0, 0.0);
        let mut den = C::new(0.0, 0.0);
        for ((zj, fj), wj) in self.support.iter().zip(&self.values).zip(&self.weights) {
            let d = z - zj;
            if d == C::new(0.0, 0.0) {
                return *fj;
            }
            num += wj * fj / d;
            den += wj / d;
        }
        num / den
    }

    /// Poles of the approximant (roots of the denominator).
    pub fn poles(&self) -> Vec<C> {
        secular_roots(&self.support, &self.weights)
    }

    /// Zeros of the approximant (roots of the numerator).
    pub fn zeros(&self) -> Vec<C> {
        let wf: Vec<C> = self
            .weights
            .iter()
            .zip(&self.values)
            .map(|(w, f)| w * f)
            .collect();
        secular_roots(&self.support, &wf)
    }
}

/// AAA on samples (z_i, f_i) with relative tolerance `tol` and at most
/// `max_terms` support points. Non-finite samples must be removed beforehand.
///
/// ```
/// use residuary::singular::aaa::aaa;
/// use residuary::C;
/// // tan z sampled on |z| = 2.5: its poles inside are ±π/2 (common practice).
/// let z: Vec<C> = (0..300)
///     .map(|k| C::from_polar(2.5, 2.0 * std::f64::consts::PI * (k as f64 + 0.3) / 300.0))
///     .collect();
/// let f: Vec<C> = z.iter().map(|s| s.tan()).collect();
/// let r = aaa(&z, &f, 1e-13, 60);
/// let half_pi = std::f64::consts::FRAC_PI_2;
/// for want in [half_pi, -half_pi] {
///     let got = r.poles().into_iter().map(|p| (p - want).norm()).fold(f64::INFINITY, f64::min);
///     assert!(got < 1e-8, "pole near {want}: off by {got:.1e}");
/// }
/// ```
pub fn aaa(z: &[C], f: &[C], tol: f64, max_terms: usize) -> Barycentric {
    let m = z.len();
    let scale = f
        .iter()
        .map(|v| v.norm())
        .fold(0.0, f64::max)
        .max(f64::MIN_POSITIVE);
    let mean: C = f.iter().sum::<C>() / m.max(1) as f64;
    let mut r: Vec<C> = vec![mean; m];
    let mut in_support = vec![false; m];
    let mut support_idx: Vec<usize> = Vec::new();
    let mut weights: Vec<C> = Vec::new();
    let mut err = f64::INFINITY;
    let mut converged = false;
    let max_terms = max_terms.min(m / 2).max(1);
    while support_idx.len() < max_terms {
        // Greedy: the sample where the current approximant is worst.
        let mut worst = None;
        let mut worst_err = -1.0;
        for i in 0..m {
            if !in_support[i] {
                let e = (f[i] - r[i]).norm();
                if e > worst_err {
                    worst_err = e;
                    worst = Some(i);
                }
            }
        }
        let Some(j) = worst else { break };
        in_support[j] = true;
        support_idx.push(j);
        let rest: Vec<usize> = (0..m).filter(|&i| !in_support[i]).collect();
        let cols: Vec<Vec<C>> = support_idx
            .iter()
            .map(|&s| {
                rest.iter()
                    .map(|&i| (f[i] - f[s]) / (z[i] - z[s]))
                    .collect()
            })
            .collect();
        let (w, _) = smallest_right_singular_vector(cols, rest.len());
        weights = w;
        // Update r on the non-support samples.
        for &i in &rest {
            let mut num = C::new(0.0, 0.0);
            let mut den = C::new(0.0, 0.0);
            for (k, &s) in support_idx.iter().enumerate() {
                let c = weights[k] / (z[i] - z[s]);
                num += c * f[s];
                den += c;
            }
            r[i] = num / den;
        }
        for &s in &support_idx {
            r[s] = f[s];
        }
        err = (0..m).map(|i| (f[i] - r[i]).norm()).fold(0.0, f64::max) / scale;
        if !err.is_finite() {
            err = f64::INFINITY;
        }
        if err <= tol {
            converged = true;
            break;
        }
    }
    Barycentric {
        support: support_idx.iter().map(|&i| z[i]).collect(),
        values: support_idx.iter().map(|&i| f[i]).collect(),
        weights,
        relative_error: err,
        converged,
    }
}

/// Roots of Σ wⱼ/(z − zⱼ) (a polynomial of degree ≤ n − 1 after clearing denominators).
///
/// Shift-and-invert form of the arrowhead pencil: with D = diag(zⱼ − c) and
/// s = Σ wⱼ/(zⱼ − c) ≠ 0, the roots λ satisfy 1/(λ − c) = μ for the nonzero
/// eigenvalues μ of M = D⁻¹(I − e vᵀ), vⱼ = wⱼ/((zⱼ − c) s); M has one spurious
/// eigenvalue 0 (vᵀe = 1), which is dropped. The shift c is picked among a few
/// points near the data where |s| is largest relative to Σ|wⱼ/(zⱼ − c)|, which
/// keeps M well scaled even when the degree drops (Σ wⱼ ≈ 0).
pub fn secular_roots(support: &[C], w: &[C]) -> Vec<C> {
    let n = support.len();
    if n < 2 || w.len() != n {
        return Vec::new();
    }
    let center: C = support.iter().sum::<C>() / n as f64;
    let spread = support
        .iter()
        .map(|s| (s - center).norm())
        .fold(0.0, f64::max)
        .max(1e-300);
    let mut best: Option<(f64, C, C)> = None;
    for k in 0..24 {
        let rad = spread * [0.13, 0.37, 0.71][k % 3];
        let c = center + C::from_polar(rad, 0.7 + 2.3999632297 * k as f64);
        let min_gap = support
            .iter()
            .map(|z| (z - c).norm())
            .fold(f64::INFINITY, f64::min);
        if min_gap < 1e-3 * spread {
            continue;
        }
        let s: C = support.iter().zip(w).map(|(z, wj)| wj / (z - c)).sum();
        let mag: f64 = support
            .iter()
            .zip(w)
            .map(|(z, wj)| (wj / (z - c)).norm())
            .sum();
        let quality = s.norm() / mag.max(f64::MIN_POSITIVE);
        if quality.is_finite() && best.map_or(true, |b| quality > b.0) {
            best = Some((quality, c, s));
        }
    }
    let Some((_, c, s)) = best else {
        return Vec::new();
    };
    if s.norm() == 0.0 {
        return Vec::new();
    }
    let d: Vec<C> = support.iter().map(|z| z - c).collect();
    let v: Vec<C> = w.iter().zip(&d).map(|(wj, dj)| wj / (dj * s)).collect();
    let mut mat = vec![vec![C::new(0.0, 0.0); n]; n];
    for (i, row) in mat.iter_mut().enumerate() {
        for (j, x) in row.iter_mut().enumerate() {
            let delta = if i == j { 1.0 } else { 0.0 };
            *x = (C::new(delta, 0.0) - v[j]) / d[i];
        }
    }
    let Some(mut mu) = eigenvalues(mat) else {
        return Vec::new();
    };
    if let Some(idx) = (0..mu.len()).min_by(|&a, &b| {
        mu[a]
            .norm()
            .partial_cmp(&mu[b].norm())
            .unwrap_or(std::cmp::Ordering::Equal)
    }) {
        mu.remove(idx);
    }
    mu.into_iter()
        .filter(|m| m.norm() > 0.0)
        .map(|m| c + C::new(1.0, 0.0) / m)
        .filter(|z| z.re.is_finite() && z.im.is_finite())
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn nearest(list: &[C], p: C) -> f64 {
        list.iter()
            .map(|z| (z - p).norm())
            .fold(f64::INFINITY, f64::min)
    }

    /// A second-order low-pass response (our scenario) sampled on |z| = 2:
    /// exact rational of type (1, 2), so AAA must recover its poles and zero;
    /// the reference is the closed form by construction (common practice).
    #[test]
    fn recovers_poles_and_zero_of_a_rational_response() {
        let p1 = C::new(-0.3, 0.9);
        let p2 = C::new(-0.3, -0.9);
        let zr = C::new(0.5, 0.0);
        let f = |s: C| (s - zr) / ((s - p1) * (s - p2));
        let z: Vec<C> = (0..200)
            .map(|k| C::from_polar(2.0, 2.0 * std::f64::consts::PI * k as f64 / 200.0))
            .collect();
        let fv: Vec<C> = z.iter().map(|&s| f(s)).collect();
        let r = aaa(&z, &fv, 1e-13, 50);
        assert!(r.converged);
        let poles = r.poles();
        assert!(
            nearest(&poles, p1) < 1e-9 && nearest(&poles, p2) < 1e-9,
            "{poles:?}"
        );
        assert!(
            nearest(&r.zeros(), zr) < 1e-9,
            "{:?} {:?} {:?}",
            r.zeros(),
            r.support,
            r.weights
        );
        let t = C::new(0.7, 0.4);
        assert!((r.eval(t) - f(t)).norm() < 1e-10);
    }

    /// Slow reference: a simple pole p of f alone inside a small circle is
    /// p = (∮ z f dz) / (∮ f dz) (residue theorem; common practice), each
    /// integral by the naive circle sum `reference::naive_circle_integral`.
    /// AAA sees f only on a large circle, never near the pole.
    #[test]
    fn poles_of_sampled_functions_match_the_contour_centroid() {
        use crate::reference::{check_method, naive_circle_integral};
        type F = fn(C) -> C;
        // (f, radius of the sampling circle about 0, a guess within 0.1 of the pole)
        let cases: [(&str, (F, f64, C)); 4] = [
            ("tan z at π/2", (|z| z.tan(), 2.5, C::new(1.6, 0.05))),
            ("tan z at −π/2", (|z| z.tan(), 2.5, C::new(-1.55, -0.05))),
            ("1/(e^z − 2) at ln 2", (|z| 1.0 / (z.exp() - 2.0), 2.0, C::new(0.7, 0.05))),
            ("z/(z² + 2z + 5) + sin z at −1+2i", (|z| z / (z * z + 2.0 * z + 5.0) + z.sin(), 3.0, C::new(-1.05, 1.95))),
        ];
        check_method(
            &cases,
            |&(f, rho, guess)| {
                let z: Vec<C> = (0..400)
                    .map(|k| C::from_polar(rho, 2.0 * std::f64::consts::PI * (k as f64 + 0.3) / 400.0))
                    .collect();
                let fv: Vec<C> = z.iter().map(|&s| f(s)).collect();
                let r = aaa(&z, &fv, 1e-13, 80);
                let poles = r.poles();
                let best = poles.iter().copied().min_by(|a, b| (a - guess).norm().total_cmp(&(b - guess).norm()));
                (best.unwrap(), None)
            },
            |&(f, _, guess)| {
                naive_circle_integral(|z| z * f(z), guess, 0.3, 4096) / naive_circle_integral(f, guess, 0.3, 4096)
            },
            1e-8,
        );
    }
}

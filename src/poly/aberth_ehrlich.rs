//! All roots of a polynomial by the Aberth–Ehrlich simultaneous iteration.
//!
//! Method: O. Aberth, "Iteration methods for finding all zeros of a
//! polynomial simultaneously", Math. Comp. 27 (1973); L. W. Ehrlich, "A
//! modified Newton method for polynomials", Comm. ACM 10 (1967). Starting
//! points on circles whose radii come from the Newton polygon, Gauss–Seidel
//! updates, evaluation through the reversed polynomial outside the unit disc,
//! and the stopping rule "|p(z)| below the running rounding-error bound" all
//! follow D. A. Bini, "Numerical computation of polynomial zeros by means of
//! Aberth's method", Numer. Algorithms 13 (1996). Inclusion radii
//! `n·|p(z_i)| / |a_n Π_{j≠i}(z_i − z_j)|` are the Gerschgorin-type discs used
//! there (each connected union of k discs holds exactly k roots).

use super::{UNIT_ROUNDOFF, ZERO_C};
use crate::error::Failure;
use crate::C;

/// Largest degree accepted.
pub const MAX_DEGREE: usize = 5000;
/// Safety factor applied to the first-order (condition × backward error) root error.
const ERROR_SAFETY: f64 = 8.0;
const MAX_ITERATIONS: usize = 500;

/// Roots with per-root accuracy information.
#[derive(Debug, Clone, PartialEq)]
pub struct Roots {
    pub roots: Vec<C>,
    /// First-order error estimate `(|p(z)| + rounding bound + u·Σ|p_k||z|^k)/|p'(z)|`, times a safety factor.
    /// For members of a multiple root this is large (correctly: they are ill-conditioned).
    pub errors: Vec<f64>,
    /// Inclusion-disc radii (Bini 1996); overlapping discs mark clusters.
    pub inclusion_radii: Vec<f64>,
    /// Number of sweeps used.
    pub iterations: usize,
    /// Whether every root met the backward-error stopping rule.
    pub converged: bool,
}

/// Value, derivative-over-value and rounding bound of `p` at `z`, computed as
/// `ln|p(z)|`-safe quantities. Returns `(ratio p'/p, |p| ≤ bound?, log|p|+bound, |p|/|p'|-style scale)`.
struct Eval {
    /// p'(z)/p(z) (may be infinite when p(z) = 0).
    ratio: C,
    /// |p(z)| is below its rounding bound: z is a root to working precision.
    converged: bool,
    /// ln(|p(z)| + bound) — for the inclusion radius.
    log_residual: f64,
    /// (|p(z)| + bound + u·Σ|p_k||z|^k) / |p'(z)|: first-order error.
    first_order_error: f64,
}

/// |re| + |im|: between |z| and √2·|z|, so bounds built on it stay bounds, and
/// it costs no square root (the hot loop of every sweep runs through here).
fn abs1(z: C) -> f64 {
    z.re.abs() + z.im.abs()
}

fn horner_with_derivative(p: &[C], z: C) -> (C, C, f64, f64) {
    let az = z.norm();
    let mut y = ZERO_C;
    let mut dy = ZERO_C;
    let mut mu = 0.0;
    let mut scale = 0.0;
    for &c in p.iter().rev() {
        dy = dy * z + y;
        y = y * z + c;
        mu = mu * az + abs1(y);
        scale = scale * az + abs1(c);
    }
    (y, dy, 4.0 * UNIT_ROUNDOFF * mu, scale)
}

/// Evaluate at `z`, through the reversed polynomial `rp` when |z| > 1 so that
/// nothing overflows: `p(z) = z^n rp(1/z)`, `p'/p = w(n − w rp'(w)/rp(w))`.
fn evaluate(p: &[C], rp: &[C], z: C) -> Eval {
    let n = (p.len() - 1) as f64;
    let (ratio, v, bound, scale, dv_abs, log_factor) = if z.norm() <= 1.0 {
        let (v, dv, bound, scale) = horner_with_derivative(p, z);
        (dv / v, v, bound, scale, dv.norm(), 0.0)
    } else {
        let w = z.inv();
        let (v, dv, bound, scale) = horner_with_derivative(rp, w);
        // p'(z) = z^(n−1) (n q(w) − w q'(w)); divide everything by |z|^n.
        let dp = (v * n - w * dv) * w;
        (dp / v, v, bound, scale, dp.norm(), n * z.norm().ln())
    };
    let residual = v.norm() + bound;
    Eval {
        ratio,
        converged: v.norm() <= bound,
        log_residual: residual.ln() + log_factor,
        first_order_error: (residual + UNIT_ROUNDOFF * scale) / dv_abs,
    }
}

/// Starting points on circles from the upper convex hull of `(k, ln|a_k|)` (Bini 1996, §3).
fn initial_points(p: &[C]) -> Vec<C> {
    let n = p.len() - 1;
    let pts: Vec<(usize, f64)> = p
        .iter()
        .enumerate()
        .filter(|(_, c)| c.norm() > 0.0)
        .map(|(k, c)| (k, c.norm().ln()))
        .collect();
    // Upper hull by a monotone chain.
    let mut hull: Vec<(usize, f64)> = Vec::new();
    for &q in &pts {
        while hull.len() >= 2 {
            let (a, b) = (hull[hull.len() - 2], hull[hull.len() - 1]);
            let cross =
                (b.0 as f64 - a.0 as f64) * (q.1 - a.1) - (b.1 - a.1) * (q.0 as f64 - a.0 as f64);
            if cross >= 0.0 {
                hull.pop();
            } else {
                break;
            }
        }
        hull.push(q);
    }
    let sigma = 0.7;
    let mut out = Vec::with_capacity(n);
    for w in hull.windows(2) {
        let (k0, l0) = w[0];
        let (k1, l1) = w[1];
        let m = k1 - k0;
        let radius = ((l0 - l1) / m as f64).exp();
        for j in 0..m {
            let angle =
                std::f64::consts::TAU * (j as f64 / m as f64 + k0 as f64 / n as f64) + sigma;
            out.push(C::from_polar(radius, angle));
        }
    }
    // A hull spoilt by overflow (|c| = ∞ for a finite c) still owes n starting points.
    if out.len() != n {
        out = (0..n).map(|j| C::from_polar(1.0, std::f64::consts::TAU * j as f64 / n as f64 + sigma)).collect();
    }
    out
}

fn check_input(p: &[C]) -> Result<(), Failure> {
    if let Some(k) = p.iter().position(|c| !c.is_finite()) {
        return Err(Failure::not_finite(format!(
            "coefficient {k} of the polynomial is not a finite number; check the expression for overflow or division by zero"
        )));
    }
    Ok(())
}

/// All roots of `p` (ascending coefficients), with error estimates.
///
/// Zeros at the origin (vanishing low coefficients) are returned exactly, first.
/// Errors: a non-finite coefficient, the zero polynomial, degree above [`MAX_DEGREE`].
///
/// ```
/// use residuary::poly::aberth_ehrlich::roots;
/// use residuary::C;
/// // z² − 3z + 2 = (z − 1)(z − 2) (factoring by hand, common practice).
/// let r = roots(&[C::new(2.0, 0.0), C::new(-3.0, 0.0), C::new(1.0, 0.0)]).unwrap();
/// let mut re: Vec<f64> = r.roots.iter().map(|z| z.re).collect();
/// re.sort_by(f64::total_cmp);
/// assert!((re[0] - 1.0).abs() < 1e-14 && (re[1] - 2.0).abs() < 1e-14);
/// assert!(r.roots.iter().all(|z| z.im.abs() < 1e-14));
/// ```
pub fn roots(p: &[C]) -> Result<Roots, Failure> {
    check_input(p)?;
    let p = super::trim(p);
    if p.is_empty() {
        return Err(Failure::invalid("the polynomial is identically zero, so it has no isolated roots"));
    }
    if p.len() - 1 > MAX_DEGREE {
        return Err(Failure::invalid(format!(
            "the polynomial has degree {}, above the limit {MAX_DEGREE}; simplify or factor the expression",
            p.len() - 1
        )));
    }
    let zeros_at_origin = p.iter().position(|c| *c != ZERO_C).unwrap_or(0);
    let q = &p[zeros_at_origin..];
    // Scale by a power of two (exact) so the largest coefficient is about 1.
    let big = q.iter().map(|c| c.norm()).fold(0.0, f64::max);
    let s = 2f64.powi(-(big.log2().round() as i32));
    let q: Vec<C> = q.iter().map(|c| c * s).collect();
    // Balance the variable, z = σu with σ = 2^e near (|q₀|/|q_n|)^{1/n} (the
    // geometric mean of the root moduli), so that poles at 6e3 rad/s or
    // coefficients from 1e-300 to 1e300 are found like unit-scaled ones
    // (common practice: Bini 1996 §2 scales the same way). Powers of two keep
    // the scaled coefficients exact.
    let n = q.len() - 1;
    let e = if n >= 1 {
        ((q[0].norm().log2() - q[n].norm().log2()) / n as f64).round()
    } else {
        0.0
    };
    let e = if e.is_finite() && e.abs() >= 2.0 { e as i32 } else { 0 };
    let q = if e != 0 { balanced(&q, e) } else { q };
    let sigma = pow2(1.0, e);
    let mut out = core_roots(&q);
    if e != 0 {
        for z in out.roots.iter_mut() {
            *z *= sigma;
        }
        for x in out.errors.iter_mut().chain(out.inclusion_radii.iter_mut()) {
            *x *= sigma;
        }
    }
    let mut roots = vec![ZERO_C; zeros_at_origin];
    roots.append(&mut out.roots);
    let mut errors = vec![0.0; zeros_at_origin];
    errors.append(&mut out.errors);
    let mut radii = vec![0.0; zeros_at_origin];
    radii.append(&mut out.inclusion_radii);
    Ok(Roots {
        roots,
        errors,
        inclusion_radii: radii,
        ..out
    })
}

/// `x · 2^k` without an overflowing intermediate power of two.
fn pow2(x: f64, k: i32) -> f64 {
    let half = k / 2;
    x * 2f64.powi(half) * 2f64.powi(k - half)
}

/// Coefficients of q(2^e u), renormalised by a power of two so the largest is about 1.
fn balanced(q: &[C], e: i32) -> Vec<C> {
    // log2 of each scaled modulus, to find the normalising power without overflow.
    let top = q
        .iter()
        .enumerate()
        .filter(|(_, c)| c.norm() > 0.0)
        .map(|(k, c)| c.norm().log2() + (e as f64) * k as f64)
        .fold(f64::NEG_INFINITY, f64::max)
        .round() as i32;
    q.iter()
        .enumerate()
        .map(|(k, c)| {
            let shift = e * k as i32 - top;
            C::new(pow2(c.re, shift), pow2(c.im, shift))
        })
        .collect()
}

/// Roots of a polynomial with nonzero constant and leading coefficients.
fn core_roots(q: &[C]) -> Roots {
    let n = q.len() - 1;
    let mut z = match n {
        0 => Vec::new(),
        1 => vec![-q[0] / q[1]],
        2 => quadratic(q),
        _ => initial_points(q),
    };
    let rq = super::reverse(q);
    let mut done = vec![n <= 2; n];
    let mut iterations = 0;
    if n > 2 {
        while iterations < MAX_ITERATIONS && done.iter().any(|d| !d) {
            iterations += 1;
            for i in 0..n {
                if done[i] {
                    continue;
                }
                let e = evaluate(q, &rq, z[i]);
                if e.converged || !e.ratio.is_finite() {
                    done[i] = true;
                    continue;
                }
                let step = aberth_step(&z, i, e.ratio);
                if step.is_finite() {
                    z[i] -= step;
                } else {
                    done[i] = true;
                }
            }
        }
    }
    // Polishing: one more Aberth (Newton with implicit deflation) step for each root,
    // kept only where it lowers the residual.
    if n >= 2 {
        for i in 0..n {
            let e = evaluate(q, &rq, z[i]);
            if !e.ratio.is_finite() {
                continue;
            }
            let step = aberth_step(&z, i, e.ratio);
            let cand = z[i] - step;
            if cand.is_finite() && evaluate(q, &rq, cand).log_residual < e.log_residual {
                z[i] = cand;
            }
        }
    }
    let converged = done.iter().all(|d| *d) && z.iter().all(|x| x.is_finite());
    let (errors, radii) = accuracy(q, &rq, &z);
    Roots {
        roots: z,
        errors,
        inclusion_radii: radii,
        iterations,
        converged,
    }
}

/// Aberth correction `1 / (p'/p − Σ_{j≠i} 1/(z_i − z_j))`.
fn aberth_step(z: &[C], i: usize, ratio: C) -> C {
    let zi = z[i];
    let mut s = ZERO_C;
    for (j, &zj) in z.iter().enumerate() {
        if j != i {
            let d = zi - zj;
            let nd = d.norm_sqr();
            if nd > 0.0 {
                s += d.conj() / nd;
            }
        }
    }
    let denom = ratio - s;
    if denom == ZERO_C {
        ZERO_C
    } else {
        denom.inv()
    }
}

/// Both roots of `q0 + q1 z + q2 z^2` without cancellation (common practice).
fn quadratic(q: &[C]) -> Vec<C> {
    let (c, b, a) = (q[0], q[1], q[2]);
    let d = (b * b - a * c * 4.0).sqrt();
    let t = if (b.conj() * d).re >= 0.0 {
        -(b + d) / 2.0
    } else {
        -(b - d) / 2.0
    };
    if t == ZERO_C {
        // Only reachable through underflow (t = 0 needs b = 0 and ac = 0).
        let r = (-c / a).sqrt();
        return vec![r, -r];
    }
    vec![t / a, c / t]
}

/// First-order errors and inclusion radii for all roots.
fn accuracy(q: &[C], rq: &[C], z: &[C]) -> (Vec<f64>, Vec<f64>) {
    let n = z.len();
    let log_lead = q[n].norm().ln();
    let mut errors = Vec::with_capacity(n);
    let mut radii = Vec::with_capacity(n);
    for i in 0..n {
        let e = evaluate(q, rq, z[i]);
        let mut log_prod = 0.0;
        let mut coincident = false;
        for (j, &zj) in z.iter().enumerate() {
            if j != i {
                let d = (z[i] - zj).norm();
                if d == 0.0 {
                    coincident = true;
                } else {
                    log_prod += d.ln();
                }
            }
        }
        let r = if coincident {
            f64::INFINITY
        } else {
            ((n as f64).ln() + e.log_residual - log_lead - log_prod).exp()
        };
        let fe = ERROR_SAFETY * e.first_order_error;
        errors.push(if fe.is_nan() { f64::INFINITY } else { fe });
        radii.push(if r.is_nan() { f64::INFINITY } else { r });
    }
    (errors, radii)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn c(re: f64, im: f64) -> C {
        C::new(re, im)
    }

    #[test]
    fn zeros_at_origin_are_exact() {
        // z^2 (z − 3): roots 0, 0, 3 by construction
        let r = roots(&[c(0.0, 0.0), c(0.0, 0.0), c(-3.0, 0.0), c(1.0, 0.0)]).unwrap();
        assert_eq!(&r.roots[..2], &[c(0.0, 0.0), c(0.0, 0.0)]);
        assert!((r.roots[2] - c(3.0, 0.0)).norm() < 1e-15);
    }

    #[test]
    fn bad_inputs_are_errors() {
        assert!(roots(&[c(0.0, 0.0)]).is_err());
        assert!(roots(&[c(f64::NAN, 0.0), c(1.0, 0.0)]).is_err());
        assert!(roots(&vec![c(1.0, 0.0); MAX_DEGREE + 2]).is_err());
    }

    /// (1/2πi) ∮ p'/p dz on |z − w| = r by the naive circle sum: the number of roots
    /// of p within r of w (argument principle, common practice).
    fn zeros_inside(p: &[C], w: C, r: f64) -> f64 {
        let dp: Vec<C> = p.iter().enumerate().skip(1).map(|(k, &c)| c * k as f64).collect();
        let eval = |q: &[C], z: C| q.iter().rev().fold(C::new(0.0, 0.0), |acc, &c| acc * z + c);
        let integral = crate::reference::naive_circle_integral(|z| eval(&dp, z) / eval(p, z), w, r, 512);
        (integral / C::new(0.0, 2.0 * std::f64::consts::PI)).re
    }

    #[test]
    fn each_root_holds_exactly_one_zero_by_the_argument_principle() {
        // Invented coefficients; each found root must have exactly one zero of p
        // within half the distance to its nearest neighbour, and p's value there
        // must be small relative to the sum of |p_k||z|^k (the roots' residuals).
        let p: Vec<C> = [(3.0, -1.0), (0.5, 2.0), (-4.0, 0.0), (1.0, 1.0), (0.0, -2.5), (2.0, 0.0), (-1.0, 0.5), (1.0, 0.0)]
            .iter()
            .map(|&(a, b)| c(a, b))
            .collect();
        let r = roots(&p).unwrap();
        assert_eq!(r.roots.len(), 7);
        for (i, &z) in r.roots.iter().enumerate() {
            let gap = r.roots.iter().enumerate().filter(|&(j, _)| j != i).map(|(_, &w)| (w - z).norm()).fold(f64::INFINITY, f64::min);
            let count = zeros_inside(&p, z, 0.5 * gap);
            assert!((count - 1.0).abs() < 1e-6, "root {z}: {count} zeros within {:.3}", 0.5 * gap);
            // The estimate must reach the true zero: one zero lies within errors[i] of z
            // (radii below 1e-6 of the gap are widened to it, where the naive sum is reliable).
            let disc = r.errors[i].max(1e-6 * gap);
            let count = zeros_inside(&p, z, disc);
            assert!((count - 1.0).abs() < 1e-6, "root {z}: its error disc {disc:.1e} holds {count} zeros");
        }
        // The whole root set: all 7 zeros lie within radius 10 (Cauchy bound 1 + max|p_k| = 5.03).
        assert!((zeros_inside(&p, c(0.0, 0.0), 10.0) - 7.0).abs() < 1e-9);
    }
}

//! Laurent coefficients (and so residues) of f about a point from samples on
//! a circle, by the trapezoidal rule, doubling the sample count until the
//! coefficients settle.
//!
//! Method: c_k = (1/2πi)∮ f(z)(z−a)^{−k−1} dz ≈ (1/N) Σ_j f(a + rω^j)(rω^j)^{−k},
//! ω = e^{2πi/N}; exponentially convergent for f analytic in an annulus
//! around the circle: L. N. Trefethen & J. A. C. Weideman, "The exponentially
//! convergent trapezoidal rule", SIAM Review 56 (2014) 385–458, §§3, 10.

use super::is_finite;
use crate::cauchy::circle::CircleSamples;
use crate::error::Failure;
use crate::budget::Budget;
use crate::C;

/// Angle offset of the first sample (keeps samples off the real axis, where
/// principal-branch cuts usually lie).
const OFFSET: f64 = std::f64::consts::FRAC_1_PI;

/// Laurent data of f on one circle |z − a| = r.
#[derive(Debug, Clone)]
pub struct CircleLaurent {
    pub center: C,
    pub radius: f64,
    /// Samples used.
    pub n: usize,
    /// Coefficients are available for k in −k_max..=k_max.
    pub k_max: usize,
    /// Normalised coefficients ĉ_k = c_k r^k (the size of each term on the circle).
    normalized: Vec<C>,
    /// |ĉ_k(N) − ĉ_k(N/2)| for each k: how much the last doubling changed it.
    change: Vec<f64>,
    /// max |f| on the circle.
    pub max_abs: f64,
    /// True when the last doubling changed no coefficient by more than 1e-13·max|f|.
    pub converged: bool,
    /// Winding number of f along the circle from the samples, when the phase is resolved.
    pub winding: Option<i64>,
}

impl CircleLaurent {
    /// ĉ_k = c_k r^k.
    pub fn normalized(&self, k: i64) -> C {
        self.normalized[(k + self.k_max as i64) as usize]
    }
    /// The Laurent coefficient c_k.
    pub fn coeff(&self, k: i64) -> C {
        self.normalized(k) * self.radius.powi(-k as i32)
    }
    /// Change of c_k in the last doubling of N.
    pub fn coeff_change(&self, k: i64) -> f64 {
        self.change[(k + self.k_max as i64) as usize] * self.radius.powi(-k as i32)
    }
    /// Rounding-error level of c_k: a few ulps of the largest term, scaled to c_k.
    pub fn coeff_noise(&self, k: i64) -> f64 {
        8.0 * f64::EPSILON * self.max_abs * (self.n as f64).sqrt() * self.radius.powi(-k as i32)
    }
}

/// Laurent coefficients c_{−k_max..k_max} of f on |z − a| = r. Returns
/// `Ok(None)` if f is not finite at some sample (a singularity on or near the
/// circle, or overflow), and `Err` only when the budget runs out.
pub fn laurent_on_circle(
    f: &dyn Fn(C) -> C,
    a: C,
    r: f64,
    k_max: usize,
    n_max: usize,
    budget: &mut Budget,
) -> Result<Option<CircleLaurent>, Failure> {
    let n0 = (4 * k_max).max(64).next_power_of_two();
    let n_max = n_max.max(n0);
    let mut g = |z: C| f(z);
    let mut samples = CircleSamples::take(&mut g, a, r, OFFSET, n0, budget)?;
    let mut prev: Option<Vec<C>> = None;
    loop {
        if samples.first_non_finite().is_some() {
            return Ok(None);
        }
        let n = samples.len();
        let spectrum = samples.spectrum();
        let kk = k_max as i64;
        let coeffs: Vec<C> = (-kk..=kk).map(|k| samples.normalized_from(&spectrum, k)).collect();
        let max_abs = samples.max_abs();
        let change: Vec<f64> = match &prev {
            Some(p) => coeffs.iter().zip(p).map(|(x, y)| (x - y).norm()).collect(),
            None => vec![f64::INFINITY; coeffs.len()],
        };
        let worst = change.iter().cloned().fold(0.0, f64::max);
        let converged = worst <= 1e-13 * max_abs.max(f64::MIN_POSITIVE);
        if converged || 2 * n > n_max {
            return Ok(Some(CircleLaurent {
                center: a,
                radius: r,
                n,
                k_max,
                normalized: coeffs,
                change,
                max_abs,
                converged,
                winding: samples.winding(),
            }));
        }
        // Double: the new nodes are the midpoints.
        if samples.double(&mut g, budget)?.is_some() {
            return Ok(None);
        }
        prev = Some(coeffs);
    }
}

/// Residue of f at a by the trapezoidal rule on |z − a| = r, with an error
/// estimate from a second radius r/2 (and the sample-count doubling): the
/// difference of the two estimates, times 2, plus the rounding level.
/// The circle must enclose no singularity other than a.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::singular::residue_trapezoid::residue_by_trapezoid;
/// use residuary::C;
/// // Res_{z=0} cos z / z³ = −1/2, the z² Taylor coefficient of cos (common practice).
/// let f = |z: C| z.cos() / (z * z * z);
/// let (res, err) = residue_by_trapezoid(&f, C::new(0.0, 0.0), 1.0, &mut Budget::default()).unwrap();
/// assert!((res - C::new(-0.5, 0.0)).norm() <= err.max(1e-13), "{res} ± {err}");
/// ```
pub fn residue_by_trapezoid(
    f: &dyn Fn(C) -> C,
    a: C,
    r: f64,
    budget: &mut Budget,
) -> Result<(C, f64), Failure> {
    let outer = laurent_on_circle(f, a, r, 8, 1 << 14, budget)?;
    let inner = laurent_on_circle(f, a, 0.5 * r, 8, 1 << 14, budget)?;
    match (outer, inner) {
        (Some(o), Some(i)) => {
            let res = o.coeff(-1);
            let err = 2.0 * (res - i.coeff(-1)).norm()
                + o.coeff_change(-1).min(1e300)
                + o.coeff_noise(-1)
                + 4.0 * f64::EPSILON * res.norm();
            Ok((res, err))
        }
        _ => Err(Failure::not_finite(format!(
            "f is not finite on the circle |z − a| = {r} or {}; choose another radius",
            0.5 * r
        ))),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Slow reference: the residue of g(z)/(z − a) is g(a) (Cauchy's integral formula).
    #[test]
    fn residue_of_simple_pole_is_the_numerator_value() {
        let a = C::new(0.3, -0.2);
        let f = |z: C| z.exp() / (z - a);
        let mut b = Budget::new(1_000_000);
        let (res, err) = residue_by_trapezoid(&f, a, 0.5, &mut b).unwrap();
        let want = a.exp();
        assert!((res - want).norm() <= err, "{res} vs {want}, err {err}");
        assert!(err < 1e-13);
    }

    /// Against the slow reference: the naive DFT sum on a circle with many
    /// points (`reference::naive_circle_coefficient`, Cauchy's formula for
    /// c₋₁ taken as written), on a pole of order 1, 2 and 3 and a pole with a
    /// neighbour outside the circle.
    #[test]
    fn residues_match_the_naive_circle_sum() {
        use crate::reference::{check_method, naive_circle_coefficient};
        type F = fn(C) -> C;
        let cases: [(&str, (F, C, f64)); 4] = [
            ("e^z/(z−0.3+0.2i)", (|z| z.exp() / (z - C::new(0.3, -0.2)), C::new(0.3, -0.2), 0.5)),
            ("sin z/(z−1)²", (|z| z.sin() / ((z - 1.0) * (z - 1.0)), C::new(1.0, 0.0), 0.7)),
            ("e^{2z}/(z+i)³", (|z| (2.0 * z).exp() / (z + C::i()).powi(3), -C::i(), 0.4)),
            ("1/((z−2)(z+1))", (|z| 1.0 / ((z - 2.0) * (z + 1.0)), C::new(2.0, 0.0), 1.5)),
        ];
        check_method(
            &cases,
            |&(f, a, r)| {
                let (res, err) = residue_by_trapezoid(&f, a, r, &mut Budget::new(1_000_000)).unwrap();
                (res, Some(err))
            },
            |&(f, a, r)| naive_circle_coefficient(f, a, 0.8 * r, 4096, -1),
            1e-11,
        );
    }
}

/// Move an approximate pole location `a` of order m onto the pole, without
/// derivatives: about a' = p + δ the expansion of c₋ₘ(z − p)^{−m} has
/// c'₋ₘ₋₁ = −mδc₋ₘ + O(δ²), so p ≈ a' + c'₋ₘ₋₁/(m c'₋ₘ). Iterated a few times
/// on the circle |z − a| = rho (which must enclose only that pole). For a
/// zero, pass `invert = true` (1/f has a pole of the same order there).
pub fn recenter_pole(
    f: &dyn Fn(C) -> C,
    a: C,
    m: u32,
    rho: f64,
    invert: bool,
    budget: &mut Budget,
) -> Result<C, Failure> {
    let g = |z: C| {
        if invert {
            C::new(1.0, 0.0) / f(z)
        } else {
            f(z)
        }
    };
    let mut p = a;
    for _ in 0..4 {
        let Some(l) = laurent_on_circle(&g, p, rho, m as usize + 2, 4096, budget)? else {
            break;
        };
        let (cm, cm1) = (l.coeff(-(m as i64)), l.coeff(-(m as i64) - 1));
        if cm.norm() == 0.0 || !is_finite(cm1 / cm) {
            break;
        }
        let shift = cm1 / (cm * m as f64);
        if shift.norm() > 0.5 * rho {
            break;
        }
        p += shift;
        if shift.norm() <= 4.0 * f64::EPSILON * p.norm().max(rho) {
            break;
        }
    }
    Ok(p)
}

//! The residue of a product f·g at a pole a of f where g is analytic at a.
//!
//! Method: the coefficient of (z − a)^{−1} in the Cauchy product of the
//! Laurent series of f (principal part c₋₁ … c₋ₘ) with the Taylor series of g:
//! Res[f·g, a] = Σ_{k=1}^{m} c₋ₖ · g^{(k−1)}(a)/(k−1)!
//! (series multiplication; e.g. L. V. Ahlfors, "Complex Analysis", 3rd ed.,
//! McGraw-Hill 1979, ch. 4 §5.1 — from memory). The Taylor coefficients of the
//! two entire or branch factors the real-integral task needs are given here:
//! e^{iωz} (Fourier integrals) and z^β on the branch arg z ∈ [0, 2π) (Mellin
//! integrals on a keyhole contour).
//!
//! Also here: [`Term`] and [`ResidueSum`], the weighted sum Σ wₖ Res(aₖ) that
//! each residue method for real integrals (`real_line`, `unit_circle`,
//! `keyhole`) returns.

use crate::C;

/// Why a point is in a residue sum, and so why it has its weight.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Role {
    /// A pole of the given order in the half-plane the contour closes in (upper or lower).
    HalfPlanePole { order: u32, upper: bool },
    /// A simple pole on the real axis: principal value, half weight.
    RealAxisPole,
    /// A pole of a non-rational f, located numerically.
    LocatedPole { order: u32 },
    /// A pole of g(z) = f(−i log z)/(iz) inside |z| = 1.
    DiskPole { order: u32 },
    /// An essential singularity of g inside |z| = 1.
    DiskEssential,
    /// A pole of f off the cut; the residue is that of z^(α−1) f with arg z in (0, 2π).
    KeyholePole { order: u32 },
}

impl Role {
    /// The pole's order (1 for a principal-value pole); `None` for an essential singularity.
    pub fn order(self) -> Option<u32> {
        match self {
            Role::HalfPlanePole { order, .. } | Role::LocatedPole { order } | Role::DiskPole { order } | Role::KeyholePole { order } => Some(order),
            Role::RealAxisPole => Some(1),
            Role::DiskEssential => None,
        }
    }

    /// The point and its weight in words (the `note` of the real-integral response).
    pub fn note(self) -> String {
        match self {
            Role::HalfPlanePole { order, upper } => {
                format!("pole of order {order} in the {} half-plane", if upper { "upper" } else { "lower" })
            }
            Role::RealAxisPole => "simple pole on the real axis: principal value, half weight".into(),
            Role::LocatedPole { order } => format!("pole of order {order} (located numerically)"),
            Role::DiskPole { order } => format!("pole of order {order} inside |z| = 1"),
            Role::DiskEssential => "essential singularity inside |z| = 1".into(),
            Role::KeyholePole { order } => format!("pole of order {order}; residue of z^(α−1) f with arg z in (0, 2π)"),
        }
    }
}

/// One term w · Res of a residue sum.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Term {
    pub at: C,
    /// The residue of the whole integrand at `at`.
    pub residue: C,
    pub weight: C,
    /// Bound on the residue's error.
    pub error: f64,
    pub role: Role,
}

/// A residue sum: its terms, the value Σ weight · residue and a bound on its error.
#[derive(Debug, Clone, PartialEq)]
pub struct ResidueSum {
    pub terms: Vec<Term>,
    pub value: C,
    pub error: f64,
}

/// Res[f·g, a] from f's principal part `c₋₁, c₋₂, …` (in that order) and g's
/// Taylor coefficients `g^{(j)}(a)/j!`, j = 0, 1, …; with an error bound from
/// the principal-part error bounds `errors` (same order; missing entries count as 0).
///
/// ```
/// use residuary::integrals::product_residue::{exp_taylor, product_residue};
/// use residuary::C;
/// // Res[e^{iz}/(z − i)², i] = i e^{i·i} = i/e (the derivative of e^{iz} at i).
/// let a = C::new(0.0, 1.0);
/// let pp = [C::new(0.0, 0.0), C::new(1.0, 0.0)]; // c₋₁ = 0, c₋₂ = 1
/// let (r, err) = product_residue(&pp, &[0.0; 2], &exp_taylor(1.0, a, 2));
/// assert!((r - C::new(0.0, (-1f64).exp())).norm() <= err + 1e-15);
/// ```
pub fn product_residue(principal_part: &[C], errors: &[f64], taylor: &[C]) -> (C, f64) {
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    let mut magnitude = 0.0;
    for (k, c) in principal_part.iter().enumerate() {
        let t = taylor.get(k).copied().unwrap_or(C::new(f64::NAN, f64::NAN));
        sum += c * t;
        magnitude += (c * t).norm();
        err += errors.get(k).copied().unwrap_or(0.0) * t.norm();
    }
    let rounding = 8.0 * f64::EPSILON * (principal_part.len() as f64 + 1.0) * magnitude;
    (sum, err + rounding)
}

/// Taylor coefficients of e^{iωz} at a: (iω)^j e^{iωa} / j!, j = 0..n.
pub fn exp_taylor(omega: f64, a: C, n: usize) -> Vec<C> {
    let iw = C::new(0.0, omega);
    let mut t = (iw * a).exp();
    let mut out = Vec::with_capacity(n);
    for j in 0..n {
        out.push(t);
        t = t * iw / (j as f64 + 1.0);
    }
    out
}

/// The argument of a in [0, 2π) (the branch just above the positive real axis).
pub fn arg_0_2pi(a: C) -> f64 {
    let t = a.arg();
    if t < 0.0 {
        t + 2.0 * std::f64::consts::PI
    } else {
        t
    }
}

/// a^β with arg a in [0, 2π).
pub fn power_0_2pi(a: C, beta: C) -> C {
    (beta * C::new(a.norm().ln(), arg_0_2pi(a))).exp()
}

/// Taylor coefficients of z^β at a ≠ 0 on the branch arg z ∈ [0, 2π):
/// binom(β, j) a^{β−j}, j = 0..n.
pub fn power_taylor(beta: C, a: C, n: usize) -> Vec<C> {
    let base = power_0_2pi(a, beta);
    let mut binom = C::new(1.0, 0.0);
    let mut out = Vec::with_capacity(n);
    let mut a_pow = C::new(1.0, 0.0); // a^{−j}
    for j in 0..n {
        out.push(binom * base * a_pow);
        binom = binom * (beta - j as f64) / (j as f64 + 1.0);
        a_pow /= a;
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Slow reference: the residue as the naive DFT coefficient c₋₁ on a small circle.
    fn residue_by_circle(h: &dyn Fn(C) -> C, a: C, r: f64) -> C {
        crate::reference::naive_circle_coefficient(h, a, r, 256, -1)
    }

    #[test]
    fn triple_pole_times_exponential_matches_circle_quadrature() {
        let a = C::new(0.3, 1.2);
        // f = (2 − i)/(z − a)^3 + 0.5/(z − a)^2 + 1.5/(z − a): principal part c₋₁, c₋₂, c₋₃.
        let pp = [C::new(1.5, 0.0), C::new(0.5, 0.0), C::new(2.0, -1.0)];
        let w = 1.7;
        let h = |z: C| {
            let u = z - a;
            (pp[0] / u + pp[1] / (u * u) + pp[2] / (u * u * u)) * (C::new(0.0, w) * z).exp()
        };
        let (r, _) = product_residue(&pp, &[0.0; 3], &exp_taylor(w, a, 3));
        assert!((r - residue_by_circle(&h, a, 0.5)).norm() < 1e-12);
    }

    #[test]
    fn double_pole_times_power_matches_circle_quadrature() {
        let a = C::new(-0.8, -0.6); // arg in (π, 3π/2): the branch matters
        let beta = C::new(-0.65, 0.2);
        let pp = [C::new(0.7, 0.1), C::new(-1.1, 0.4)];
        let h = |z: C| {
            let u = z - a;
            (pp[0] / u + pp[1] / (u * u)) * power_0_2pi(z, beta)
        };
        let (r, _) = product_residue(&pp, &[0.0; 2], &power_taylor(beta, a, 2));
        // Radius 0.3 keeps the circle off the cut on the positive real axis.
        assert!((r - residue_by_circle(&h, a, 0.3)).norm() < 1e-12);
    }
}

//! Method: real integrals by quadrature alone, independent of any residue —
//! the check the residue methods are compared with.
//!
//! - **The whole line** ([`line_integral`]): adaptive Gauss–Kronrod on
//!   [−L, L], beyond which no singularity lies; the tails on the real axis
//!   (mapped to finite ranges by `gauss_kronrod::integrate_infinite`) or, for
//!   ω ≠ 0, moved onto the vertical rays ±L + iσt, σ = sign ω, where e^{iωz}
//!   decays like e^{−|ω|t} (analytic continuation of the tail, valid because
//!   no singularity lies beyond L and f → 0 there; D. Huybrechs and
//!   S. Vandewalle, "On the evaluation of highly oscillatory integrals by
//!   analytic continuation", SIAM J. Numer. Anal. 44 (2006) — from memory).
//! - **Principal values**: at a simple real pole p with residue r the kernel
//!   r·s(x − p), s(u) = 1/u − u/(u² + 1) ([`pv_kernel`]: odd, 1/u at 0, decaying
//!   like 1/u³), is subtracted and its principal value
//!   PV ∫_A^B s = ½ ln(B²(A² + 1)/(A²(B² + 1))) added back in closed form
//!   (singularity subtraction, common practice); the rest is smooth at p.
//! - **Periodic** ([`periodic_integral`]): ∫_0^{2π} f(θ) dθ by the doubling
//!   periodic trapezoidal rule (`quad::trapezoid_periodic`).
//! - **Mellin** ([`log_substituted_integral`]): ∫_0^∞ x^{α−1} f(x) dx =
//!   ∫_ℝ e^{αu} f(e^u) du, u = ln x, for rational f; far out, f is replaced by
//!   its forms x^k num₀/den₀ (x → 0) and x^{−d} rev num/rev den (x → ∞), which
//!   neither overflow nor lose f to underflow.

use super::gauss_kronrod::{integrate, integrate_infinite};
use super::trapezoid_periodic::integrate_periodic;
use super::{QuadError, QuadResult, Tolerance};
use crate::budget::Budget;
use crate::error::Failure;
use crate::C;
use std::f64::consts::PI;

/// s(u) = h²/(u(u² + h²)) = 1/u − u/(u² + h²), h = 1: odd, 1/u at 0, decays like 1/u³.
/// f(x), or at a removable point where f as typed is 0/0 (x/sinh x at 0; a
/// quadrature node can land there, e.g. the midpoint of [−L, L]) the limit
/// from both sides: the mean of f(x ± δ), δ = 1e-7 max(1, |x|), accepted only
/// when the two sides agree to 1e-6 relative — a pole or a jump stays
/// non-finite and is refused as before. The limit's error is O(δ²|f″|)
/// (central difference, common practice), below the quadrature's tolerance.
fn at_removable(f: &dyn Fn(C) -> C, x: f64) -> C {
    let v = f(C::new(x, 0.0));
    if v.re.is_finite() && v.im.is_finite() {
        return v;
    }
    let d = 1e-7 * x.abs().max(1.0);
    let (l, r) = (f(C::new(x - d, 0.0)), f(C::new(x + d, 0.0)));
    let finite = |z: C| z.re.is_finite() && z.im.is_finite();
    if finite(l) && finite(r) && (l - r).norm() <= 1e-6 * l.norm().max(r.norm()) {
        (l + r) * 0.5
    } else {
        v
    }
}

pub fn pv_kernel(u: f64) -> f64 {
    1.0 / u - u / (u * u + 1.0)
}

/// PV ∫_A^B s(u) du = ½ ln(B²(A² + 1) / (A²(B² + 1))).
pub fn pv_kernel_integral(a: f64, b: f64) -> f64 {
    0.5 * ((b * b) * (a * a + 1.0) / ((a * a) * (b * b + 1.0))).ln()
}

/// A quadrature failure, with a non-finite integrand read as a singularity
/// on the path (`Divergent`) at `what` = the point.
fn on_path(e: QuadError, what: &str) -> Failure {
    match e {
        QuadError::NotFinite { at } if at.is_infinite() => Failure::not_finite(format!(
            "f gives no finite number as {what} → {}∞ (the expression cannot be evaluated that far out in double precision); \
             check the expression, or integrate over a finite range where it is negligible",
            if at < 0.0 { "−" } else { "+" }
        )),
        QuadError::NotFinite { at } => Failure::divergent(format!(
            "f is not finite at {what} = {at:.6e}: a singularity lies on the path of integration, so the integral diverges there; check the expression"
        )),
        other => Failure::from(other),
    }
}

/// (Principal value) ∫_ℝ f(x) e^{iωx} dx. `real_poles` are the simple poles
/// on the axis with the residue of f e^{iωz} there; no other singularity may
/// lie at |z| ≥ `l`. With `rays` (and ω ≠ 0) the tails run on ±L + iσt.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::quad::real_line::line_integral;
/// use residuary::C;
/// // PV ∫ e^{ix}/x dx = iπ (the Dirichlet integral; common practice).
/// let f = |z: C| 1.0 / z;
/// let r = line_integral(&f, 1.0, &[(0.0, C::new(1.0, 0.0))], 2.0, true, &mut Budget::new(1_000_000)).unwrap();
/// assert!((r.value - C::new(0.0, std::f64::consts::PI)).norm() <= r.error_estimate);
/// ```
pub fn line_integral(
    f: &dyn Fn(C) -> C,
    omega: f64,
    real_poles: &[(f64, C)],
    l: f64,
    rays: bool,
    budget: &mut Budget,
) -> Result<QuadResult, Failure> {
    let tol = Tolerance::default();
    let osc = |x: f64| -> C { at_removable(f, x) * C::new(0.0, omega * x).exp() };
    let mut central = |x: f64| -> C {
        let mut v = osc(x);
        for (p, r) in real_poles {
            v -= r * pv_kernel(x - p);
        }
        v
    };
    let mut ends: Vec<f64> = vec![-l];
    let mut poles: Vec<f64> = real_poles.iter().map(|(p, _)| *p).collect();
    poles.sort_by(|a, b| a.total_cmp(b));
    ends.extend(poles);
    ends.push(l);
    let mut total = QuadResult::zero();
    for w in ends.windows(2) {
        if w[1] > w[0] {
            total.absorb(integrate(&mut central, w[0], w[1], tol, budget).map_err(|e| on_path(e, "x"))?);
        }
    }
    for (p, r) in real_poles {
        total.value += r * pv_kernel_integral(-l - p, l - p);
    }
    if rays && omega != 0.0 {
        let dir = C::new(0.0, if omega < 0.0 { -1.0 } else { 1.0 });
        for (start, sign) in [(l, 1.0), (-l, -1.0)] {
            let mut g = |t: f64| -> C {
                let z = C::new(start, 0.0) + dir * t;
                let e = C::new(0.0, omega * start).exp() * (-omega.abs() * t).exp();
                f(z) * e * dir * sign
            };
            let r = integrate_infinite(&mut g, 0.0, f64::INFINITY, tol, budget)
                .map_err(|e| on_path(e, "t (on the ray from ±L)"))?;
            total.absorb(r);
        }
    } else {
        let mut g = |x: f64| osc(x);
        let right = integrate_infinite(&mut g, l, f64::INFINITY, tol, budget).map_err(|e| on_path(e, "x"))?;
        let left = integrate_infinite(&mut g, f64::NEG_INFINITY, -l, tol, budget).map_err(|e| on_path(e, "x"))?;
        total.absorb(right);
        total.absorb(left);
    }
    Ok(total)
}

/// ∫_0^{2π} f(θ) dθ for a 2π-periodic f, by the periodic trapezoidal rule.
pub fn periodic_integral(f: &dyn Fn(C) -> C, budget: &mut Budget) -> Result<QuadResult, Failure> {
    let two_pi = 2.0 * PI;
    let mut g = |t: f64| f(C::new(two_pi * t, 0.0)) * two_pi;
    integrate_periodic(&mut g, Tolerance::default(), budget).map_err(|e| match e {
        QuadError::NotFinite { at } => Failure::divergent(format!(
            "f is not finite at θ = {:.6}: a singularity lies on the real θ axis, so the integral diverges",
            at * two_pi
        )),
        other => Failure::from(other),
    })
}

/// ∫_0^∞ x^{α−1} f(x) dx in u = ln x, for f = num/den (trimmed, as typed in
/// `f`), α inside the convergence strip. Warns when α is near its edge.
pub fn log_substituted_integral(
    f: &dyn Fn(C) -> C,
    num: &[C],
    den: &[C],
    alpha: C,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<QuadResult, Failure> {
    use crate::integrals::keyhole::low_order;
    use crate::poly::{eval, reverse};
    let (kn, num0) = low_order(num);
    let (kd, den0) = low_order(den);
    let k = kn - kd; // f ~ x^k at 0
    let d = (den.len() as i64 - 1) - (num.len() as i64 - 1); // f ~ x^−d at ∞
    let (rnum, rden) = (reverse(num), reverse(den));
    let mut g = |u: f64| -> C {
        if u.abs() <= 30.0 {
            (alpha * u).exp() * f(C::new(u.exp(), 0.0))
        } else if u < 0.0 {
            let x = C::new(u.exp(), 0.0);
            ((alpha + k as f64) * u).exp() * eval(&num0, x) / eval(&den0, x)
        } else {
            let y = C::new((-u).exp(), 0.0);
            ((alpha - d as f64) * u).exp() * eval(&rnum, y) / eval(&rden, y)
        }
    };
    let tol = Tolerance::default();
    let mut total = integrate_infinite(&mut g, f64::NEG_INFINITY, 0.0, tol, budget).map_err(|e| on_path(e, "u = ln x"))?;
    total.absorb(integrate_infinite(&mut g, 0.0, f64::INFINITY, tol, budget).map_err(|e| on_path(e, "u = ln x"))?);
    let margin = (alpha.re + k as f64).min(d as f64 - alpha.re);
    if margin < 0.05 {
        warnings.push(format!(
            "Re α is within {margin:.2} of the edge of the convergence strip: the integrand decays slowly and the quadrature needs many points"
        ));
    }
    Ok(total)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_estimate_bounds, check_method, simpson, simpson_folded};

    fn budget() -> Budget {
        Budget::new(5_000_000)
    }

    #[test]
    fn the_pv_kernel_integral_is_the_antiderivative() {
        // PV ∫_A^B s: folded Simpson on the symmetric part plus plain Simpson on the rest.
        let cases = [("A = −3, B = 5", (-3.0, 5.0)), ("A = −0.5, B = 0.2", (-0.5, 0.2)), ("A = −7, B = 7", (-7.0, 7.0))];
        check_method(
            &cases,
            |(a, b)| (C::new(pv_kernel_integral(*a, *b), 0.0), None),
            |(a, b)| {
                let m = a.abs().min(b.abs());
                // The odd kernel cancels on [−m, m]; what is left is regular.
                let (lo, hi) = if -a > *b { (*a, -m) } else { (m, *b) };
                simpson(|u| C::new(pv_kernel(u), 0.0), lo, hi, 20_000)
            },
            1e-10,
        );
    }

    #[test]
    fn line_tails_on_rays_and_on_the_axis_match_closed_forms() {
        // ∫ e^{iωx}/(x² + 1) dx = π e^{−|ω|} (common practice); ∫ dx/(x² + 1) = π.
        let f = |z: C| 1.0 / (z * z + 1.0);
        for (omega, rays) in [(2.0, true), (-1.0, true), (0.0, false), (0.5, false)] {
            let r = line_integral(&f, omega, &[], 2.25, rays, &mut budget()).unwrap();
            let exact = C::new(PI * (-f64::abs(omega)).exp(), 0.0);
            assert_estimate_bounds(r.value, r.error_estimate + 1e-13, exact, &format!("ω = {omega}, rays {rays}"));
            // Oscillating tails on the real axis converge more slowly than on rays.
            let demand = if rays || omega == 0.0 { 1e-10 } else { 1e-7 };
            assert!((r.value - exact).norm() < demand, "ω = {omega}: {}", r.value);
        }
    }

    #[test]
    fn a_principal_value_matches_the_folded_reference() {
        // PV ∫ dx/((x − 1)(x² + 4)): the slow reference folds f about the pole.
        let f = |z: C| 1.0 / ((z - 1.0) * (z * z + 4.0));
        let r = line_integral(&f, 0.0, &[(1.0, C::new(0.2, 0.0))], 3.5, false, &mut budget()).unwrap();
        let reference = simpson_folded(|x| f(C::new(x, 0.0)), 1.0, 4000.0, 800_000);
        assert!((r.value - reference).norm() < 1e-7, "{} vs {reference}", r.value);
    }

    #[test]
    fn periodic_and_log_substituted_rules_match_closed_forms() {
        // ∫_0^{2π} dθ/(3 + 2 cos θ) = 2π/√5 (common practice).
        let r = periodic_integral(&|z: C| 1.0 / (3.0 + 2.0 * z.cos()), &mut budget()).unwrap();
        assert_estimate_bounds(r.value, r.error_estimate + 1e-14, C::new(2.0 * PI / 5f64.sqrt(), 0.0), "trig");
        // ∫_0^∞ x^{α−1}/(1 + x) dx = π/sin(πα) (DLMF 5.12.3 with 5.5.3).
        let one = C::new(1.0, 0.0);
        let alpha = C::new(0.3, 0.0);
        let mut w = Vec::new();
        let m = log_substituted_integral(&|z: C| 1.0 / (1.0 + z), &[one], &[one, one], alpha, &mut budget(), &mut w).unwrap();
        assert_estimate_bounds(m.value, m.error_estimate + 1e-13, C::new(PI / (0.3 * PI).sin(), 0.0), "mellin");
        assert!(w.is_empty());
    }
}

//! Adaptive Gauss–Kronrod quadrature (7-point Gauss, 15-point Kronrod) with
//! global adaptive bisection, for complex-valued integrands of a real variable.
//!
//! Method: R. Piessens, E. de Doncker-Kapenga, C. W. Überhuber, D. K. Kahaner,
//! "QUADPACK: A Subroutine Package for Automatic Integration", Springer 1983
//! (the G7–K15 pair and global adaptive subdivision). The node and weight table
//! below is the one published there (to 33 digits; rounded here to f64); it is
//! checked in the tests by integrating every monomial up to degree 22 exactly
//! and against nodes recomputed in high precision (tests/fixtures/gen_laurent.py).
//!
//! Error estimate per subinterval: |K15 − G7| (the error of the lower-order
//! rule, hence a pessimistic bound for K15) plus a rounding floor
//! 50·ε·∫|f|. QUADPACK's sharper (200·|K−G|/…)^{3/2} heuristic is deliberately
//! not used: users need a bound, not a guess.
//!
//! Infinite intervals use a change of variable onto a finite one:
//! - [a, ∞):   x = a + t/(1 − t),     dx = dt/(1 − t)²,           t ∈ [0, 1)
//! - (−∞, b]:  x = b − (1 − t)/t,     dx = dt/t²,                 t ∈ (0, 1]
//! - (−∞, ∞):  x = t/(1 − t²),        dx = (1 + t²)/(1 − t²)² dt,  t ∈ (−1, 1)
//!
//! The Gauss–Kronrod nodes are interior, so the singular endpoints of the
//! maps are never evaluated. The integrand must decay (faster than 1/|x|) for
//! the transformed integrand to stay bounded.

use super::{is_finite, QuadError, QuadResult, Tolerance};
use crate::budget::Budget;
use crate::C;
use std::cmp::Ordering;
use std::collections::BinaryHeap;

/// Kronrod abscissae on [−1, 1] (nonnegative half, descending); odd indices
/// (1, 3, 5, 7) are the 7-point Gauss–Legendre nodes. QUADPACK (1983), qk15.
#[allow(clippy::excessive_precision)] // the published 33-digit table, kept verbatim
pub const KRONROD_NODES: [f64; 8] = [
    0.991_455_371_120_812_639_206_854_697_526_329,
    0.949_107_912_342_758_524_526_189_684_047_851,
    0.864_864_423_359_769_072_789_712_788_640_926,
    0.741_531_185_599_394_439_863_864_773_280_788,
    0.586_087_235_467_691_130_294_144_845_693_013,
    0.405_845_151_377_397_166_906_606_412_076_961,
    0.207_784_955_007_898_467_600_689_403_773_245,
    0.0,
];

/// Kronrod weights matching [`KRONROD_NODES`]. QUADPACK (1983), qk15.
#[allow(clippy::excessive_precision)] // the published 33-digit table, kept verbatim
pub const KRONROD_WEIGHTS: [f64; 8] = [
    0.022_935_322_010_529_224_963_732_008_058_970,
    0.063_092_092_629_978_553_290_700_663_189_204,
    0.104_790_010_322_250_183_839_876_322_541_518,
    0.140_653_259_715_525_918_745_189_590_510_238,
    0.169_004_726_639_267_902_826_583_426_598_550,
    0.190_350_578_064_785_409_913_256_402_421_014,
    0.204_432_940_075_298_892_414_161_999_234_649,
    0.209_482_141_084_727_828_012_999_174_891_714,
];

/// Gauss weights for the nodes KRONROD_NODES[1], [3], [5], [7]. QUADPACK (1983), qk15.
#[allow(clippy::excessive_precision)] // the published 33-digit table, kept verbatim
pub const GAUSS_WEIGHTS: [f64; 4] = [
    0.129_484_966_168_869_693_270_611_432_679_082,
    0.279_705_391_489_276_667_901_467_771_423_780,
    0.381_830_050_505_118_944_950_369_775_488_975,
    0.417_959_183_673_469_387_755_102_040_816_327,
];

/// Subintervals allowed before giving up on the tolerance (the estimate stays honest).
pub const MAX_SUBINTERVALS: usize = 5000;

/// One G7–K15 application on [a, b].
#[derive(Debug, Clone, Copy)]
struct Panel {
    a: f64,
    b: f64,
    value: C,
    error: f64,
    /// Rounding floor for this panel: below it bisection cannot help.
    floor: f64,
}

impl PartialEq for Panel {
    fn eq(&self, other: &Self) -> bool {
        self.error == other.error
    }
}
impl Eq for Panel {}
impl PartialOrd for Panel {
    fn partial_cmp(&self, other: &Self) -> Option<Ordering> {
        Some(self.cmp(other))
    }
}
impl Ord for Panel {
    fn cmp(&self, other: &Self) -> Ordering {
        self.error.total_cmp(&other.error)
    }
}

/// Apply the G7–K15 pair once on [a, b]: (K15 value, |K15 − G7|, ∫|f| by K15).
pub fn kronrod_panel(
    f: &mut dyn FnMut(f64) -> C,
    a: f64,
    b: f64,
) -> Result<(C, f64, f64), QuadError> {
    let mid = 0.5 * (a + b);
    let half = 0.5 * (b - a);
    let mut eval = |x: f64| -> Result<C, QuadError> {
        let v = f(x);
        if is_finite(v) {
            Ok(v)
        } else {
            Err(QuadError::NotFinite { at: x })
        }
    };
    let center = eval(mid)?;
    let mut kronrod = center * KRONROD_WEIGHTS[7];
    let mut gauss = center * GAUSS_WEIGHTS[3];
    let mut abs_sum = center.norm() * KRONROD_WEIGHTS[7];
    for j in 0..7 {
        let dx = half * KRONROD_NODES[j];
        let (lo, hi) = (eval(mid - dx)?, eval(mid + dx)?);
        let pair = lo + hi;
        kronrod += pair * KRONROD_WEIGHTS[j];
        abs_sum += (lo.norm() + hi.norm()) * KRONROD_WEIGHTS[j];
        if j % 2 == 1 {
            gauss += pair * GAUSS_WEIGHTS[j / 2];
        }
    }
    let h = half.abs();
    Ok((
        kronrod * half,
        ((kronrod - gauss) * half).norm(),
        abs_sum * h,
    ))
}

fn make_panel(
    f: &mut dyn FnMut(f64) -> C,
    a: f64,
    b: f64,
    budget: &mut Budget,
) -> Result<Panel, QuadError> {
    budget.spend(15)?;
    let (value, error, abs_integral) = kronrod_panel(f, a, b)?;
    let floor = 50.0 * f64::EPSILON * abs_integral;
    Ok(Panel {
        a,
        b,
        value,
        error: error.max(floor),
        floor,
    })
}

/// ∫_a^b f(x) dx for finite a, b (b < a is allowed and flips the sign), by
/// globally adaptive G7–K15: the panel with the largest error is bisected
/// until the summed error meets the tolerance, every panel is at its
/// rounding floor, or [`MAX_SUBINTERVALS`] is reached (then `converged` is false).
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::quad::{gauss_kronrod::integrate, Tolerance};
/// use residuary::C;
/// // ∫_0^π sin x dx = 2 (elementary; any calculus table).
/// let r = integrate(&mut |x| C::new(x.sin(), 0.0), 0.0, std::f64::consts::PI,
///                   Tolerance::default(), &mut Budget::default()).unwrap();
/// let error = (r.value - C::new(2.0, 0.0)).norm();
/// assert!(r.converged && error < 1e-12 && error <= r.error_estimate);
/// ```
pub fn integrate(
    f: &mut dyn FnMut(f64) -> C,
    a: f64,
    b: f64,
    tol: Tolerance,
    budget: &mut Budget,
) -> Result<QuadResult, QuadError> {
    if !(a.is_finite() && b.is_finite()) {
        return Err(QuadError::Invalid(format!(
            "the interval [{a}, {b}] has an infinite or missing end; use the infinite-interval version"
        )));
    }
    if a == b {
        return Ok(QuadResult {
            value: C::new(0.0, 0.0),
            error_estimate: 0.0,
            evaluations: 0,
            converged: true,
        });
    }
    let start = budget.used();
    let mut heap = BinaryHeap::new();
    let mut settled: Vec<Panel> = Vec::new();
    heap.push(make_panel(f, a, b, budget)?);
    let mut converged = false;
    loop {
        let value: C = heap.iter().chain(settled.iter()).map(|p| p.value).sum();
        let error: f64 = heap.iter().chain(settled.iter()).map(|p| p.error).sum();
        if error <= tol.target(value) {
            converged = true;
            break;
        }
        let Some(worst) = heap.pop() else {
            // Every panel sits at its rounding floor: nothing more can be gained.
            converged = true;
            break;
        };
        let mid = 0.5 * (worst.a + worst.b);
        let too_narrow = mid == worst.a
            || mid == worst.b
            || (worst.b - worst.a).abs() <= 8.0 * f64::EPSILON * mid.abs();
        if worst.error <= worst.floor || too_narrow {
            settled.push(worst);
            continue;
        }
        if heap.len() + settled.len() + 1 >= MAX_SUBINTERVALS {
            heap.push(worst);
            break;
        }
        heap.push(make_panel(f, worst.a, mid, budget)?);
        heap.push(make_panel(f, mid, worst.b, budget)?);
    }
    let value: C = heap.iter().chain(settled.iter()).map(|p| p.value).sum();
    let error: f64 = heap.iter().chain(settled.iter()).map(|p| p.error).sum();
    Ok(QuadResult {
        value,
        error_estimate: error,
        evaluations: budget.used() - start,
        converged,
    })
}

/// ∫_0^1 f(t) dt (the form contour segments use).
pub fn integrate_unit(
    f: &mut dyn FnMut(f64) -> C,
    tol: Tolerance,
    budget: &mut Budget,
) -> Result<QuadResult, QuadError> {
    integrate(f, 0.0, 1.0, tol, budget)
}

/// ∫_a^b f(x) dx where a may be −∞ and b may be +∞ (finite ends are passed
/// through to [`integrate`]). See the module doc for the transformations.
/// A non-finite integrand is reported at the original x, not at t.
pub fn integrate_infinite(
    f: &mut dyn FnMut(f64) -> C,
    a: f64,
    b: f64,
    tol: Tolerance,
    budget: &mut Budget,
) -> Result<QuadResult, QuadError> {
    if a.is_nan() || b.is_nan() {
        return Err(QuadError::Invalid(
            "an end of the interval is not a number".into(),
        ));
    }
    if a > b {
        let r = integrate_infinite(f, b, a, tol, budget)?;
        return Ok(QuadResult {
            value: -r.value,
            ..r
        });
    }
    if a == b {
        return integrate(f, 0.0, 0.0, tol, budget);
    }
    type Map = Box<dyn Fn(f64) -> (f64, f64)>;
    let (map, t0, t1): (Map, f64, f64) = match (a.is_finite(), b.is_finite()) {
        (true, true) => return integrate(f, a, b, tol, budget),
        (true, false) => (
            Box::new(move |t: f64| (a + t / (1.0 - t), 1.0 / ((1.0 - t) * (1.0 - t)))),
            0.0,
            1.0,
        ),
        (false, true) => (
            Box::new(move |t: f64| (b - (1.0 - t) / t, 1.0 / (t * t))),
            0.0,
            1.0,
        ),
        (false, false) => (
            Box::new(|t: f64| {
                let s = 1.0 - t * t;
                (t / s, (1.0 + t * t) / (s * s))
            }),
            -1.0,
            1.0,
        ),
    };
    let mut bad_x = None;
    let mut g = |t: f64| {
        let (x, dx) = map(t);
        let v = f(x);
        if !is_finite(v) && bad_x.is_none() {
            bad_x = Some(x);
        }
        if v == C::new(0.0, 0.0) {
            // Decayed to zero: do not let an overflowing dx turn 0 into NaN.
            v
        } else {
            v * dx
        }
    };
    match integrate(&mut g, t0, t1, tol, budget) {
        Err(QuadError::NotFinite { at }) => Err(QuadError::NotFinite {
            at: bad_x.unwrap_or(map(at).0),
        }),
        other => other,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_estimate_bounds, check_method, simpson, simpson_line};

    type Integrand = fn(f64) -> C;

    fn tight() -> Tolerance {
        Tolerance { abs: 0.0, rel: 1e-12 }
    }

    #[test]
    fn finite_intervals_agree_with_simpson_and_the_estimate_bounds_the_difference() {
        // Smooth integrands, some oscillating and one sharply peaked (Runge's
        // 1/(1+25x²)), so the adaptive bisection has work to do.
        let cases: [(&str, (Integrand, f64, f64)); 4] = [
            ("x² e^{ix} on [0, 2]", (|x| C::new(0.0, x).exp() * (x * x), 0.0, 2.0)),
            ("e^{−x} sin 3x on [0, π]", (|x| C::new((-x).exp() * (3.0 * x).sin(), 0.0), 0.0, std::f64::consts::PI)),
            ("1/(1+25x²) on [−1, 1]", (|x| C::new(1.0 / (1.0 + 25.0 * x * x), 0.0), -1.0, 1.0)),
            ("cos 40x on [1, 0] (reversed)", (|x| C::new((40.0 * x).cos(), 0.0), 1.0, 0.0)),
        ];
        check_method(
            &cases,
            |&(f, a, b)| {
                let r = integrate(&mut |x| f(x), a, b, tight(), &mut Budget::default()).unwrap();
                assert!(r.converged);
                (r.value, Some(r.error_estimate))
            },
            // Simpson with 200 000 panels: error below 1e-13 for these integrands.
            |&(f, a, b)| simpson(f, a, b, 200_000),
            1e-10,
        );
    }

    #[test]
    fn the_estimate_bounds_the_true_error_against_handbook_values() {
        // ∫_{−1}^{1} dx/(1+25x²) = (2/5) arctan 5 (elementary antiderivative, any calculus table).
        let want = C::new(0.4 * 5f64.atan(), 0.0);
        // A loose tolerance, so the estimate is tested where it is not negligible.
        let loose = Tolerance { abs: 0.0, rel: 1e-5 };
        let r = integrate(&mut |x| C::new(1.0 / (1.0 + 25.0 * x * x), 0.0), -1.0, 1.0, loose, &mut Budget::default())
            .unwrap();
        assert_estimate_bounds(r.value, r.error_estimate, want, "Runge integrand, rel 1e-5");
        assert!(r.error_estimate <= 1e-5 * want.norm(), "tolerance not met: {:.2e}", r.error_estimate);
        // ∫_0^2 x² e^{ix} dx = [e^{ix}(−i x² + 2x + 2i)]_0^2 (integration by parts, from memory).
        let e = |x: f64| C::new(0.0, x).exp() * C::new(2.0 * x, 2.0 - x * x);
        let want = e(2.0) - e(0.0);
        let r = integrate(&mut |x| C::new(0.0, x).exp() * (x * x), 0.0, 2.0, loose, &mut Budget::default()).unwrap();
        assert_estimate_bounds(r.value, r.error_estimate, want, "x² e^{ix}, rel 1e-5");
    }

    #[test]
    fn infinite_intervals_agree_with_simpson_on_a_long_truncation() {
        // e^{−x²} and e^{−x} cos x are below 1e-17 past |x| = 40, so Simpson on a
        // truncated interval is the slow reference.
        let gauss: Integrand = |x| C::new((-x * x).exp(), 0.0);
        let damped: Integrand = |x| C::new((-x).exp() * x.cos(), 0.0);
        let r = integrate_infinite(&mut |x| gauss(x), f64::NEG_INFINITY, f64::INFINITY, tight(), &mut Budget::default())
            .unwrap();
        let want = simpson_line(gauss, 10.0, 20_000);
        // ∫ e^{−x²} dx = √π (DLMF 7.4.1 at z = 0 doubled; the Gaussian integral).
        crate::reference::assert_close(want, C::new(std::f64::consts::PI.sqrt(), 0.0), 1e-12, "the reference itself");
        assert_estimate_bounds(r.value, r.error_estimate + 1e-12, want, "∫ e^{−x²} over ℝ");
        crate::reference::assert_close(r.value, want, 1e-10, "∫ e^{−x²} over ℝ");
        let r = integrate_infinite(&mut |x| damped(x), 0.0, f64::INFINITY, tight(), &mut Budget::default()).unwrap();
        // ∫_0^∞ e^{−x} cos x dx = 1/2 (Laplace transform of cos at s = 1, any table).
        let want = simpson(damped, 0.0, 40.0, 200_000);
        crate::reference::assert_close(want, C::new(0.5, 0.0), 1e-12, "the reference itself");
        assert_estimate_bounds(r.value, r.error_estimate + 1e-12, want, "∫_0^∞ e^{−x} cos x");
        crate::reference::assert_close(r.value, want, 1e-10, "∫_0^∞ e^{−x} cos x");
        // (−∞, b]: ∫_{−∞}^0 e^{x} dx = 1 (elementary).
        let r = integrate_infinite(&mut |x| C::new(x.exp(), 0.0), f64::NEG_INFINITY, 0.0, tight(), &mut Budget::default())
            .unwrap();
        let want = simpson(|x| C::new(x.exp(), 0.0), -40.0, 0.0, 200_000);
        assert_estimate_bounds(r.value, r.error_estimate + 1e-12, want, "∫_{−∞}^0 e^x");
        crate::reference::assert_close(r.value, want, 1e-10, "∫_{−∞}^0 e^x");
    }
}

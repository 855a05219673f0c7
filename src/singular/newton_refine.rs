//! Newton refinement of approximate zeros and poles, with the multiplicity
//! estimated from the linear convergence rate and then used in the modified
//! step (so multiple zeros/poles converge quadratically).
//!
//! Method: Newton's method; for a zero of multiplicity m the modified step
//! z − m f/f' (E. Schröder, "Über unendlich viele Algorithmen zur Auflösung
//! der Gleichungen", Math. Ann. 2 (1870) 317–365). For a pole of f we apply
//! it to g = 1/f: g/g' = (1/f)/(−f'/f²) = −f/f', so the step is z + m f/f'.

use super::is_finite;
use crate::error::Failure;
use crate::budget::Budget;
use crate::C;

/// Which kind of point Newton should converge to.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Target {
    Zero,
    Pole,
}

/// A converged point and the size of the last step (a location error estimate).
#[derive(Debug, Clone, Copy)]
pub struct Refined {
    pub at: C,
    pub last_step: f64,
}

/// Refine `start` by damped Newton (a step is halved until it decreases |f|
/// for a zero, |1/f| for a pole). The result is accepted only if it is a
/// local minimum of that merit against four neighbours at distance δ, a
/// derivative-free certificate that a zero/pole lies within about δ.
/// `None` when it fails, or wanders further than `max_travel` from the start.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::singular::newton_refine::{newton_refine, Target};
/// use residuary::C;
/// // The first positive zero of cos is π/2 (common practice).
/// let fd = |z: C| (z.cos(), -z.sin());
/// let r = newton_refine(&fd, C::new(1.4, 0.1), Target::Zero, 1.0, &mut Budget::default())
///     .unwrap()
///     .unwrap();
/// assert!((r.at - C::new(std::f64::consts::FRAC_PI_2, 0.0)).norm() < 1e-12, "{:?}", r.at);
/// ```
pub fn newton_refine(
    fd: &dyn Fn(C) -> (C, C),
    start: C,
    target: Target,
    max_travel: f64,
    budget: &mut Budget,
) -> Result<Option<Refined>, Failure> {
    let merit = |v: C| match target {
        Target::Zero => v.norm(),
        Target::Pole => 1.0 / v.norm(),
    };
    let scale = start.norm().max(max_travel * 1e-3).max(f64::MIN_POSITIVE);
    let mut z = start;
    let mut m = 1.0;
    let mut prev_step = f64::INFINITY;
    let mut prev_ratio = f64::NAN;
    let mut last_step = f64::NAN;
    budget.spend(1)?;
    let (mut v, mut d) = fd(z);
    for _ in 0..80 {
        if merit(v) == 0.0 {
            return Ok(Some(Refined {
                at: z,
                last_step: 0.0,
            }));
        }
        if !is_finite(v) || !is_finite(d) || d == C::new(0.0, 0.0) {
            break;
        }
        let q = v / d;
        let full = match target {
            Target::Zero => -q * m,
            Target::Pole => q * m,
        };
        if !is_finite(full) {
            break;
        }
        let mut accepted = None;
        let mut t = 1.0;
        for _ in 0..6 {
            let zt = z + full * t;
            budget.spend(1)?;
            let (vt, dt) = fd(zt);
            if merit(vt) < merit(v) || (target == Target::Pole && !is_finite(vt)) {
                accepted = Some((zt, vt, dt, t));
                break;
            }
            t *= 0.5;
        }
        let Some((zt, vt, dt, t)) = accepted else {
            break;
        };
        let s = (zt - z).norm();
        z = zt;
        v = vt;
        d = dt;
        last_step = s;
        if (z - start).norm() > max_travel {
            return Ok(None);
        }
        if target == Target::Pole && !is_finite(v) {
            return Ok(Some(Refined {
                at: z,
                last_step: 0.0,
            }));
        }
        if s <= 4.0 * f64::EPSILON * scale.max(z.norm()) {
            break;
        }
        // Multiplicity from the linear rate 1 − 1/m of plain full steps.
        if t == 1.0 {
            let ratio = s / prev_step;
            if m == 1.0 && (0.4..0.97).contains(&ratio) && (ratio - prev_ratio).abs() < 0.05 {
                m = (1.0 / (1.0 - ratio)).round().max(1.0);
            }
            prev_ratio = ratio;
        }
        prev_step = s;
    }
    // Certificate: z beats its four neighbours at distance δ.
    let delta = 1e-6 * scale.max(z.norm());
    let here = merit(v);
    if !here.is_finite() {
        return Ok(None);
    }
    for k in 0..4 {
        let w = z + C::from_polar(delta, 0.3 + k as f64 * std::f64::consts::FRAC_PI_2);
        budget.spend(1)?;
        let (vw, _) = fd(w);
        if !(merit(vw) > here) {
            return Ok(None);
        }
    }
    let err = if last_step.is_finite() {
        last_step.min(delta)
    } else {
        delta
    };
    Ok(Some(Refined {
        at: z,
        last_step: err.max(4.0 * f64::EPSILON * z.norm()),
    }))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_double_pole_and_triple_zero() {
        // f = (z − 1)^3 / (z + 2)^2 ; f' by the quotient rule. // common practice
        let fd = |z: C| {
            let a = (z - 1.0).powi(3);
            let b = (z + 2.0).powi(2);
            let da = (z - 1.0).powi(2) * 3.0;
            let db = (z + 2.0) * 2.0;
            (a / b, (da * b - a * db) / (b * b))
        };
        let mut b = Budget::new(10_000);
        let p = newton_refine(&fd, C::new(-2.1, 0.05), Target::Pole, 1.0, &mut b)
            .unwrap()
            .unwrap();
        assert!((p.at - C::new(-2.0, 0.0)).norm() < 1e-12, "{:?}", p.at);
        let z = newton_refine(&fd, C::new(1.1, -0.05), Target::Zero, 1.0, &mut b)
            .unwrap()
            .unwrap();
        assert!((z.at - C::new(1.0, 0.0)).norm() < 1e-10, "{:?}", z.at);
    }

    /// Slow reference: the one zero (pole) of f inside a circle sits at
    /// (∮ z f'/f dz) / (∮ f'/f dz), the centroid form of the argument
    /// principle (Ahlfors, "Complex Analysis", ch. 5 §3.2 — from memory),
    /// each integral by the naive circle sum `reference::naive_circle_integral`.
    #[test]
    fn points_match_the_contour_centroid() {
        use crate::reference::{check_method, naive_circle_integral};
        type Fd = fn(C) -> (C, C);
        let cases: [(&str, (Fd, C, Target)); 5] = [
            ("zero of cos near 1.5", (|z| (z.cos(), -z.sin()), C::new(1.5, 0.1), Target::Zero)),
            ("pole of sec near 1.6", (|z| (1.0 / z.cos(), z.sin() / (z.cos() * z.cos())), C::new(1.6, -0.1), Target::Pole)),
            ("zero of e^z − 2", (|z| (z.exp() - 2.0, z.exp()), C::new(0.6, 0.2), Target::Zero)),
            ("double zero of (z²+1)²", (|z| ((z * z + 1.0).powi(2), (z * z + 1.0) * z * 4.0), C::new(0.1, 1.1), Target::Zero)),
            ("pole of 1/(z³−2)", (|z| {
                let q = z * z * z - 2.0;
                (1.0 / q, -(z * z * 3.0) / (q * q))
            }, C::new(1.2, 0.05), Target::Pole)),
        ];
        check_method(
            &cases,
            |&(fd, start, target)| {
                let r = newton_refine(&fd, start, target, 1.0, &mut Budget::new(100_000)).unwrap().unwrap();
                (r.at, Some(r.last_step))
            },
            |&(fd, start, _)| {
                let log_d = |z: C| {
                    let (v, d) = fd(z);
                    d / v
                };
                let r = 0.3;
                naive_circle_integral(|z| z * log_d(z), start, r, 4096) / naive_circle_integral(log_d, start, r, 4096)
            },
            1e-10,
        );
    }
}

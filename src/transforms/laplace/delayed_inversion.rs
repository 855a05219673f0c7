//! Method: the inverse Laplace transform of any F (not only rational) by the
//! fixed Talbot contour, with a pure delay shifted out first.
//!
//! When F(s) = e^{−τs} G(s) (detected by `delay_estimate::estimate_delay`),
//! the shift theorem L[g(t − τ)H(t − τ)](s) = e^{−τs} G(s) (common practice)
//! gives f(t) = 0 for t ≤ τ and f(t) = g(t − τ), g = L⁻¹[F·e^{τs}] inverted
//! by fixed Talbot (`fixed_talbot::invert`; J. Abate & P. P. Valkó, Int. J.
//! Numer. Meth. Eng. 60 (2004) 979–993). Without a delay, F itself is
//! inverted. The contour is placed to enclose the singular points the
//! expression's structure reveals (`enclosed_points`).
//!
//! Far left on the contour F·e^{τs} may overflow although the term
//! e^{s(t−τ)} F(s) e^{τs} is tiny; there the term is dropped and the bound
//! e^{Re s·(t−τ)}(1 + |s|) (G of at most linear growth, from memory) is added
//! to the error estimate. F with several delays (growth e^{κ|s|} to the left,
//! `delay_estimate::left_growth_rate`) cannot be inverted for t ≲ κ: there the
//! error estimate is raised to at least the largest |f| (the contour cannot
//! see those jumps).
//!
//! Declined times: a value whose error estimate is not below
//! max(|value|, 10⁻³·the largest meaningful |value|) carries no digit (the
//! estimate includes the rounding growth e^{rt}·ε of the Talbot terms), and a
//! value on a contour that a branch cut of F crosses (`contour_cuts`) is
//! wrong by the integral across the cut: both are declined, time by time
//! (`declined`), and the rest answered.

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use super::delay_estimate::{estimate_delay, left_growth_rate};
use super::contour_cuts::crossing;
use super::fixed_talbot::{invert, meaningful, plan, TalbotError, TalbotPlan, NODES};
use crate::budget::Budget;
use crate::error::Failure;
use crate::expr::Function;
use crate::singular::Hints;
use crate::text;
use crate::C;
use std::cell::Cell;

/// Relative size of an error estimate above which a contour value is flagged
/// (fewer than four correct digits).
const UNRELIABLE: f64 = 1e-4;
/// A left growth rate κ above this means F holds delays the shift cannot remove.
const MIXED_DELAY_RATE: f64 = 0.05;
/// Below this multiple of κ (after the delay), a value of a mixed-delay F means nothing.
const MIXED_DELAY_REACH: f64 = 1.2;
/// Largest Re s·τ kept on the contour just after a jump (F = e^{−τs}G underflows beyond).
const LARGEST_SHIFT_EXPONENT: f64 = 600.0;

/// The inversion of a general F at every requested time.
#[derive(Debug, Clone, PartialEq)]
pub struct DelayedInversion {
    /// f(t) per time (complex: F need not be real on the real axis).
    pub values: Vec<C>,
    /// Error estimate per time.
    pub errors: Vec<f64>,
    /// τ when F = e^{−τs} G(s).
    pub delay: Option<f64>,
    /// The points the contour was placed to enclose.
    pub enclosed: Vec<C>,
    /// What the user must know (delays, unreliable values, fallbacks, declined times).
    pub warnings: Vec<String>,
    /// Indices of the times the method cannot serve (no meaningful value there).
    pub declined: Vec<usize>,
    /// A point where a branch cut of F crosses the contour, when one does at some declined time.
    pub cut_crossing: Option<C>,
}

/// Singular points the expression's structure reveals: denominator roots,
/// branch points and essential points (`hints` as the task gathered them).
pub fn enclosed_points(f: &Function, hints: &Hints) -> Vec<C> {
    let a = f.analysis();
    let mut points: Vec<C> = a.pole_candidates.clone();
    for p in &a.pole_candidate_polys {
        if let Ok((clusters, _)) = crate::poly::multiplicity::distinct_roots(p) {
            points.extend(clusters.into_iter().map(|c| c.center));
        }
    }
    points.extend(hints.branch_candidates.iter().copied());
    points.extend(hints.essential_candidates.iter().copied());
    points.retain(|z| z.is_finite());
    points
}

/// f(t) at every t > 0 in `times`, with the contour enclosing `enclosed`.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::expr::Function;
/// use residuary::transforms::laplace::delayed_inversion::invert_with_delay;
/// // e^{−s}/(s + 1) ↔ e^{−(t−1)} for t > 1, 0 before (the shift theorem).
/// let f = Function::compile("exp(-s)/(s+1)", "s", &[]).unwrap();
/// let r = invert_with_delay(&f, &[0.5, 2.0], &[residuary::C::new(-1.0, 0.0)], &mut Budget::default()).unwrap();
/// assert!((r.delay.unwrap() - 1.0).abs() < 1e-9);
/// assert_eq!(r.values[0].re, 0.0);
/// assert!((r.values[1].re - (-1.0f64).exp()).abs() <= r.errors[1].max(1e-10));
/// ```
pub fn invert_with_delay(
    f: &Function,
    times: &[f64],
    enclosed: &[C],
    budget: &mut Budget,
) -> Result<DelayedInversion, Failure> {
    let mut warnings = Vec::new();
    if f.analysis().uses_branch_functions {
        warnings.push(
            "F is evaluated as typed, with principal branches: its branch cuts must lie to the left of the \
             inversion contour (write sqrt(s^2+1) as sqrt(s+i)*sqrt(s-i), for example)"
                .into(),
        );
    }
    let delay = estimate_delay(&mut |s: C| f.eval_d(s));
    budget.spend(6)?;
    if let Some(tau) = delay {
        warnings.push(delay_warning(tau));
    }
    let mut plain = |s: C| f.eval(s);
    // Delays F does not reduce to a single e^{−τs}: growth to the left bounds where f may jump.
    let growth = match delay {
        Some(tau) => left_growth_rate(&mut |s: C| undelay(f, s, tau, 1.0, &Cell::new(0.0))),
        None => left_growth_rate(&mut plain),
    };
    budget.spend(4)?;
    let mixed_delay = (growth > MIXED_DELAY_RATE).then_some(growth);
    if let Some(kappa) = mixed_delay {
        warnings.push(format!(
            "F grows like e^({}·|s|) to the left: it contains delays up to about τ ≈ {} (e.g. 1 − e^(-s)), so f may \
             jump at each delay; the contour inversion is meaningless for t below about 1.2·τ, and there the \
             error estimates are set to at least the largest |f|",
            text::real(kappa),
            text::real(kappa)
        ));
    }
    let mut values = Vec::with_capacity(times.len());
    let mut errors = Vec::with_capacity(times.len());
    let mut plans = Vec::with_capacity(times.len());
    let mut fallbacks = Vec::new();
    for &t in times {
        let result = match delay {
            Some(tau) if t <= tau => Ok((C::new(0.0, 0.0), 0.0, None)),
            Some(tau) => {
                let shifted = t - tau;
                let dropped = Cell::new(0.0);
                let mut undelayed = |s: C| undelay(f, s, tau, shifted, &dropped);
                // Just after the jump the nominal contour reaches Re s ≈ 2M/(5(t − τ)), where
                // F = e^{−τs}G underflows; keep Re s ≤ 600/τ by placing the contour for a later time.
                let contour_time =
                    shifted.max(2.0 * NODES as f64 * tau.abs() / (5.0 * LARGEST_SHIFT_EXPONENT));
                match invert(&mut undelayed, shifted, plan(contour_time, enclosed, NODES), budget) {
                    Ok(v) => Ok((v.value, v.error_estimate + dropped.get() * v.plan.r / v.plan.nodes as f64, Some(v.plan))),
                    Err(TalbotError::NotFinite { .. }) => {
                        // Still not computable: invert F itself; near the jump that value means little.
                        fallbacks.push(t);
                        direct(&mut plain, t, enclosed, budget).map(|(v, e, p)| (v, e.max(v.norm()).max(1.0), p))
                    }
                    Err(e) => Err(e),
                }
            }
            None => direct(&mut plain, t, enclosed, budget),
        };
        let (v, e, p) = match result {
            Ok(x) => x,
            Err(TalbotError::Budget(e)) => return Err(e.into()),
            Err(TalbotError::NotFinite { at }) => {
                return Err(Failure::not_finite(format!(
                    "F is not finite at s = {} on the inversion contour for t = {}: F has a singularity there that \
                     the expression analysis did not locate, or overflows; the contour inversion needs every \
                     singularity of F to the left of the contour",
                    text::complex(at, 0.0),
                    text::real(t)
                ))
                .at(at))
            }
        };
        values.push(v);
        errors.push(e);
        plans.push(p);
    }
    let largest = values.iter().map(|v| v.norm()).fold(0.0, f64::max);
    if let Some(kappa) = mixed_delay {
        let shift = delay.unwrap_or(0.0);
        for (&t, (v, e)) in times.iter().zip(values.iter().zip(errors.iter_mut())) {
            if t - shift <= MIXED_DELAY_REACH * kappa {
                *e = e.max(largest).max(v.norm()).max(1.0);
            }
        }
    }
    let crossings = if f.analysis().uses_branch_functions {
        cut_crossings(f, &plans, budget)?
    } else {
        vec![None; plans.len()]
    };
    let declined = declined_times(&values, &errors, &plans, &crossings);
    let cut_crossing = declined.iter().find_map(|&i| crossings[i]);
    let unreliable: Vec<f64> = times
        .iter()
        .zip(values.iter().zip(&errors))
        .enumerate()
        .filter(|(i, (_, (v, &e)))| !(e <= UNRELIABLE * v.norm().max(1e-8 * largest)) && !declined.contains(i))
        .map(|(_, (&t, _))| t)
        .collect();
    if let Some(&t) = unreliable.first() {
        let hint = if delay.is_some() {
            "near the delay's jump"
        } else {
            "F may contain a delay (f jumps there), a singularity right of the contour, or a branch cut the contour crosses"
        };
        warnings.push(format!(
            "the contour inversion is not accurate at {} of the times (first t = {}): the two rules disagree; {hint}. \
             The error estimates show by how much",
            unreliable.len(),
            text::real(t)
        ));
    }
    if let Some(&t) = fallbacks.first() {
        warnings.push(format!(
            "at {} of the times just after the delay (first t = {}), F·e^(τs) could not be evaluated on the contour \
             and F was inverted directly; these values are unreliable (error estimate at least max(|f|, 1))",
            fallbacks.len(),
            text::real(t)
        ));
    }
    if !declined.is_empty() {
        warnings.push(declined_warning(times, &declined, cut_crossing));
    }
    Ok(DelayedInversion { values, errors, delay, enclosed: enclosed.to_vec(), warnings, declined, cut_crossing })
}

/// A cut crossing per time (checked once per distinct contour).
fn cut_crossings(f: &Function, plans: &[Option<TalbotPlan>], budget: &mut Budget) -> Result<Vec<Option<C>>, Failure> {
    let mut seen: Vec<(TalbotPlan, Option<C>)> = Vec::new();
    let mut out = Vec::with_capacity(plans.len());
    for p in plans {
        let Some(p) = *p else {
            out.push(None);
            continue;
        };
        let known = seen.iter().find(|(q, _)| *q == p).map(|(_, x)| *x);
        let x = match known {
            Some(x) => x,
            None => {
                let x = crossing(&|s: C| f.eval(s), p, budget)?;
                seen.push((p, x));
                x
            }
        };
        out.push(x);
    }
    Ok(out)
}

/// The times without a meaningful value: the estimate is not below
/// max(|value|, 10⁻³ × the largest meaningful |value|) (`meaningful`), or a cut
/// crosses the contour. Exact values (no contour: f = 0 before a delay) stay.
pub fn declined_times(values: &[C], errors: &[f64], plans: &[Option<TalbotPlan>], crossings: &[Option<C>]) -> Vec<usize> {
    let own = |v: &C, e: f64| e < v.norm();
    let largest = values
        .iter()
        .zip(errors)
        .zip(crossings)
        .filter(|((v, &e), x)| own(v, e) && x.is_none())
        .map(|((v, _), _)| v.norm())
        .fold(0.0, f64::max);
    (0..values.len())
        .filter(|&i| {
            plans[i].is_some()
                && (crossings[i].is_some() || !meaningful(values[i], errors[i], largest))
        })
        .collect()
}

/// The sentence naming the declined times.
fn declined_warning(times: &[f64], declined: &[usize], cut: Option<C>) -> String {
    let shown: Vec<String> = declined.iter().take(8).map(|&i| text::real(times[i])).collect();
    let more = if declined.len() > 8 { format!(" and {} more", declined.len() - 8) } else { String::new() };
    format!(
        "declined at {} of the times (t = {}{more}): no meaningful value, so \"f\" is null there; {}",
        declined.len(),
        shown.join(", "),
        decline_reason(cut)
    )
}

/// Why times are declined: a cut crossing the contour near `cut`, or estimates not below the values.
pub fn decline_reason(cut: Option<C>) -> String {
    match cut {
        Some(at) => format!(
            "a branch cut of F (as typed, principal branches) crosses the inversion contour near s = {}, so the \
             contour misses the integral across the cut (or, at other times, the error estimate is not below the \
             value): write F with its cuts running left (e.g. sqrt(s+i)*sqrt(s-i) for sqrt(s^2+1))",
            text::complex(at, 0.0)
        ),
        None => "the error estimate is not below the value (the rounding of the contour's terms, which grow like \
                 e^(r·t), or the two rules disagree)"
            .into(),
    }
}

/// The sentence on a detected delay (or time advance) τ.
fn delay_warning(tau: f64) -> String {
    let magnitude = match text::real(tau.abs()).as_str() {
        "1" => String::new(),
        text => format!("{text}*"),
    };
    let factor = if tau > 0.0 { format!("e^(-{magnitude}s)") } else { format!("e^({magnitude}s)") };
    let kind = if tau > 0.0 {
        "a delay"
    } else {
        "a time advance (not the transform of a causal function unless F·e^(τs) vanishes fast enough)"
    };
    format!(
        "F contains {kind} {factor}: f jumps or bends at t = {}; f is computed as g(t − τ) with \
         g = L⁻¹[F·e^(τs)], and f = 0 for t < τ; values within a few error estimates of the jump are unreliable",
        text::real(tau)
    )
}

/// F itself inverted at `t` on the contour enclosing `enclosed`.
fn direct(
    f: &mut dyn FnMut(C) -> C,
    t: f64,
    enclosed: &[C],
    budget: &mut Budget,
) -> Result<(C, f64, Option<TalbotPlan>), TalbotError> {
    invert(f, t, plan(t, enclosed, NODES), budget).map(|v| (v.value, v.error_estimate, Some(v.plan)))
}

/// G(s) = F(s)·e^{τs} for the delayed inversion at time `t_shifted` = t − τ.
/// Far left on the contour F itself overflows (F ~ e^{τ|Re s|}); there the
/// term e^{s·t_shifted}·G(s) is at most e^{Re s·t_shifted}(1 + |s|) for a G of
/// at most linear growth: it is dropped and that bound added to `dropped`.
/// Anything else non-finite stays non-finite (the caller then falls back).
fn undelay(f: &Function, s: C, tau: f64, t_shifted: f64, dropped: &Cell<f64>) -> C {
    let g = f.eval(s) * (s * tau).exp();
    if g.is_finite() {
        return g;
    }
    if s.re < 0.0 {
        dropped.set(dropped.get() + (s.re * t_shifted).exp() * (1.0 + s.norm()));
        C::new(0.0, 0.0)
    } else {
        C::new(f64::NAN, f64::NAN)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::check_method;

    fn compile(text: &str) -> Function {
        Function::compile(text, "s", &[]).unwrap()
    }

    /// The slow reference on Re s = 1, |Im s| ≤ 4000 (F must decay like |s|^{−3}).
    fn bromwich(f: &Function, t: f64) -> C {
        crate::reference::bromwich(|s| f.eval(s), 1.0, t, 4000.0, 800_000)
    }

    #[test]
    fn delayed_inversion_matches_the_bromwich_integral() {
        // e^{−s}/(s + 1)^3 ↔ (t − 1)² e^{−(t−1)}/2 for t > 1 (shift theorem, common practice);
        // checked against the slow Bromwich integral, which knows nothing of the delay.
        let f = compile("exp(-s)/(s+1)^3");
        let cases = [("t = 0.5", 0.5), ("t = 1.5", 1.5), ("t = 3", 3.0), ("t = 6", 6.0)];
        check_method(
            &cases,
            |&t| {
                let r = invert_with_delay(&f, &[t], &[C::new(-1.0, 0.0)], &mut Budget::default()).unwrap();
                assert_eq!(r.delay.map(|d| (d - 1.0).abs() < 1e-9), Some(true));
                (r.values[0], Some(r.errors[0]))
            },
            |&t| bromwich(&f, t),
            1e-6,
        );
    }

    #[test]
    fn a_plain_transform_is_inverted_directly_and_its_estimate_bounds_the_error() {
        // 1/sqrt(s) ↔ 1/sqrt(πt) (Abramowitz & Stegun 29.3.4, from memory).
        let f = compile("1/sqrt(s)");
        let cases = [("t = 0.5", 0.5), ("t = 2", 2.0)];
        check_method(
            &cases,
            |&t| {
                let r = invert_with_delay(&f, &[t], &[C::new(0.0, 0.0)], &mut Budget::default()).unwrap();
                assert_eq!(r.delay, None);
                (r.values[0], Some(r.errors[0]))
            },
            |&t| C::new(1.0 / (std::f64::consts::PI * t).sqrt(), 0.0),
            1e-9,
        );
    }

    #[test]
    fn times_without_a_meaningful_value_are_declined() {
        // 1/sqrt(s² + 1) ↔ J₀(t) (DLMF 10.22.43), but the principal sqrt(s² + 1) is cut on the
        // imaginary axis beyond ±i (common practice), across every contour enclosing ±i.
        let enclosed = [C::new(0.0, 1.0), C::new(0.0, -1.0)];
        let r = invert_with_delay(&compile("1/sqrt(s^2+1)"), &[1.0, 5.0], &enclosed, &mut Budget::default()).unwrap();
        assert_eq!(r.declined, vec![0, 1], "{:?}", r.warnings);
        assert!(r.cut_crossing.is_some_and(|at| at.re.abs() < 1e-6 && at.im.abs() > 1.0), "{:?}", r.cut_crossing);
        // With the cuts running left from ±i, t = 1 is served (J₀(1) = 0.765197686557966551,
        // mpmath 1.3 besselj) and t = 50 declined: the rounding of e^{rt}-sized terms leaves no digit.
        let r = invert_with_delay(&compile("1/(sqrt(s+i)*sqrt(s-i))"), &[1.0, 50.0], &enclosed, &mut Budget::default()).unwrap();
        assert_eq!(r.declined, vec![1], "{:?}", r.warnings);
        assert_eq!(r.cut_crossing, None);
        crate::reference::assert_estimate_bounds(r.values[0], r.errors[0], C::new(0.765197686557966551, 0.0), "J0(1)");
    }

    #[test]
    fn several_delays_raise_the_estimate_before_the_last_jump() {
        // (1 − e^{−s})/s is the unit pulse on (0, 1) (shift theorem, common practice):
        // the contour cannot see the jump at t = 1, so the estimate must cover |f| there.
        let f = compile("(1-exp(-s))/s");
        let r = invert_with_delay(&f, &[0.5, 3.0], &[C::new(0.0, 0.0)], &mut Budget::default()).unwrap();
        assert!(r.errors[0] >= (r.values[0] - 1.0).norm(), "{:?}", r);
        assert!(r.warnings.iter().any(|w| w.contains("delays")), "{:?}", r.warnings);
    }
}

//! Classification of a point a (or infinity) as pole (with order),
//! removable, regular, essential or branch point, with the residue and the
//! leading principal-part coefficients.
//!
//! Method: Laurent coefficients on four concentric circles of radii
//! r, r/2, r/8, r/32 by the trapezoidal rule (see residue_trapezoid.rs). On a
//! punctured disk free of other singularities the Laurent series is the same
//! on every circle, so the coefficient sets must agree (this validates r and
//! gives the error estimate). A pole of order m has exactly m significant
//! principal coefficients on every circle; at an essential singularity the
//! number of significant terms grows without bound as the circle shrinks,
//! because max|f| grows faster than any power of 1/r (Casorati–Weierstrass;
//! see E. Hille, "Analytic Function Theory" vol. 1, 1959, §8.4). Branch
//! points are recognised by a jump of f along the circle that persists under
//! bisection (branch_jump.rs), and then get no residue.

use super::branch_jump::scan_for_jumps;
use crate::error::Failure;
use super::residue_trapezoid::{laurent_on_circle, CircleLaurent};
use super::{eval, is_finite, show, Hints, Kind, PointResult};
use crate::budget::Budget;
use crate::C;

/// Default first radius (an irrational-looking number keeps circles off
/// lattices of singularities such as integers and multiples of π).
const FIRST_RADIUS: f64 = 0.237_113;
/// Coefficients c₋K..c_K examined on each circle.
const K_WINDOW: usize = 48;
/// A normalised coefficient counts as nonzero above this fraction of max|f|.
const SIGNIFICANT: f64 = 1e-11;
/// Most samples per circle.
const N_MAX: usize = 8192;

/// Classify f at the finite point a.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::singular::{classify_point, Hints, Kind};
/// use residuary::C;
/// // e^z/(z − 1)² has a double pole at 1 with residue (e^z)' at 1 = e (common practice).
/// let f = |z: C| z.exp() / ((z - 1.0) * (z - 1.0));
/// let p = classify_point(&f, C::new(1.0, 0.0), &Hints::default(), &mut Budget::default()).unwrap();
/// assert_eq!((p.kind, p.order), (Kind::Pole, Some(2)));
/// assert!((p.residue.unwrap() - std::f64::consts::E).norm() < 1e-10, "{p:?}");
/// ```
pub fn classify_point(
    f: &dyn Fn(C) -> C,
    a: C,
    hints: &Hints,
    budget: &mut Budget,
) -> Result<PointResult, Failure> {
    classify_point_near(f, a, hints, &[], budget)
}

/// Classify f at infinity through h(w) = f(1/w) at w = 0. The residue at
/// infinity is −(coefficient of w¹ in h) = −(coefficient of z⁻¹ in f); a pole
/// of h of order n is a pole of f at infinity of order n, and
/// `principal_part` lists the coefficients of h(w) at w⁻¹, w⁻², … (that is,
/// of f at z¹, z², …).
pub fn classify_infinity(
    f: &dyn Fn(C) -> C,
    hints: &Hints,
    budget: &mut Budget,
) -> Result<PointResult, Failure> {
    if hints.poles_accumulate_at_infinity {
        // The expression's structure decides it: no punctured disk around infinity is free
        // of poles, so there is no Laurent series there and no residue (common practice).
        return Ok(PointResult {
            kind: Kind::Essential,
            order: None,
            residue: None,
            principal_part: Vec::new(),
            error_estimate: f64::INFINITY,
            warnings: vec!["the poles of f (tan, cot, sec, csc, tanh, coth or gamma of an argument that grows without bound) accumulate at infinity: infinity is not an isolated singularity, so it has no residue".into()],
        });
    }
    let h = |w: C| f(C::new(1.0, 0.0) / w);
    let map = |v: &Vec<C>| -> Vec<C> {
        v.iter()
            .filter(|p| p.norm() > 0.0)
            .map(|p| C::new(1.0, 0.0) / p)
            .collect()
    };
    let mapped = Hints {
        essential_candidates: map(&hints.essential_candidates),
        branch_candidates: map(&hints.branch_candidates),
        uses_branch_functions: hints.uses_branch_functions,
        poles_accumulate_at_infinity: false,
    };
    let mut out = analyse(&h, C::new(0.0, 0.0), &mapped, &[], true, budget)?;
    for w in out.warnings.iter_mut() {
        *w = w.replace("{at}", "infinity");
    }
    Ok(out)
}

/// Classify f at a, keeping the circles away from the `others` (known
/// singularities nearby).
pub(crate) fn classify_point_near(
    f: &dyn Fn(C) -> C,
    a: C,
    hints: &Hints,
    others: &[C],
    budget: &mut Budget,
) -> Result<PointResult, Failure> {
    if !is_finite(a) {
        return Err(Failure::invalid(
            "the point must be a finite complex number (use classify_infinity for infinity)",
        ));
    }
    let mut out = analyse(f, a, hints, others, false, budget)?;
    for w in out.warnings.iter_mut() {
        *w = w.replace("{at}", &show(a));
    }
    Ok(out)
}

/// Largest dynamic range ln(max|f| / min|f|) a sampling circle may see: beyond
/// it the rounding of the largest samples (u·max|f|) swamps the coefficients.
const MAX_LOG_RANGE: f64 = 24.0;

/// A circle radius ≤ `r` about `a` on which f's modulus varies by at most
/// e^MAX_LOG_RANGE: a function with huge growth (e^{700z}/z varies by e^{700}
/// on |z| = 1/2) gets circles sized to its growth, ~MAX_LOG_RANGE/(its rate),
/// instead of residues drowned in rounding. A pole or zero at `a` itself
/// leaves |f| constant on the circle to first order and does not shrink it.
/// (Circle sizing by the growth rate: common practice for trapezoidal
/// Cauchy integrals; see Bornemann, Found. Comput. Math. 11 (2011) §3, from memory.)
fn growth_radius(f: &dyn Fn(C) -> C, a: C, mut r: f64, budget: &mut Budget) -> Result<f64, Failure> {
    const PROBES: usize = 32;
    for _ in 0..12 {
        let mut lo = f64::INFINITY;
        let mut hi: f64 = 0.0;
        let mut finite = true;
        for k in 0..PROBES {
            let t = std::f64::consts::TAU * (k as f64 + 0.5) / PROBES as f64;
            let v = eval(f, a + C::from_polar(r, t), budget)?;
            if !is_finite(v) {
                finite = false;
                break;
            }
            let m = v.norm();
            lo = lo.min(m);
            hi = hi.max(m);
        }
        // Non-finite samples: the ring loop below shrinks past them.
        if !finite || lo == 0.0 {
            return Ok(r);
        }
        let range = (hi / lo).ln();
        if range <= MAX_LOG_RANGE {
            return Ok(r);
        }
        r *= (0.8 * MAX_LOG_RANGE / range).max(1.0 / 64.0);
    }
    Ok(r)
}

fn analyse(
    f: &dyn Fn(C) -> C,
    a: C,
    hints: &Hints,
    others: &[C],
    at_infinity: bool,
    budget: &mut Budget,
) -> Result<PointResult, Failure> {
    let scale = 1.0 + a.norm();
    let mut cap = FIRST_RADIUS;
    for p in others
        .iter()
        .chain(&hints.essential_candidates)
        .chain(&hints.branch_candidates)
    {
        let d = (p - a).norm();
        if d > 1e-12 * scale {
            cap = cap.min(0.4 * d);
        }
    }
    let hinted_branch = hints
        .branch_candidates
        .iter()
        .any(|b| (b - a).norm() <= 1e-9 * scale);

    // 1. Single-valuedness: jumps along circles of radius cap, cap/4, cap/16.
    // Skipped when the expression has no multivalued function (then f is
    // single-valued and the scan, about half the cost, can find nothing).
    let radii = [cap, cap / 4.0, cap / 16.0];
    let mut counts: Vec<Option<usize>> = Vec::new();
    let scan_radii: &[f64] = if hints.uses_branch_functions || hinted_branch {
        &radii
    } else {
        &[]
    };
    for &r in scan_radii {
        let scan = scan_for_jumps(f, a, r, 256, budget)?;
        counts.push(if scan.finite {
            Some(scan.jumps.len())
        } else {
            None
        });
    }
    if let Some(last) = counts.iter().rev().flatten().next().copied() {
        if last % 2 == 1 || (last > 0 && hinted_branch) {
            return Ok(branch_point());
        }
        if last > 0 {
            return Err(Failure::cut_crossing(format!(
                "f jumps across a branch cut through {} (the principal branch of log, sqrt or a non-integer power): f is not analytic in any punctured disk around it, so a residue is not defined there, and it is not a branch point either; ask at a point off the cut, or rewrite f so that its cut lies elsewhere (e.g. log(-z) instead of log(z) moves log's cut to the positive real axis)",
                if at_infinity { "infinity".to_string() } else { show(a) }
            )));
        }
    }
    if hinted_branch && counts.iter().all(|c| c.is_none()) {
        return Ok(branch_point());
    }
    // Start from the largest radius below which no jump was seen.
    let mut r = cap;
    for (i, c) in counts.iter().enumerate() {
        if matches!(c, Some(n) if *n > 0) {
            r = radii[(i + 1).min(2)];
        }
    }
    r = growth_radius(f, a, r, budget)?;

    // 2. Laurent coefficients on r, r/2, r/8, r/32; shrink until they agree.
    let mut inner_overflow = false;
    let mut chosen: Option<Vec<CircleLaurent>> = None;
    let mut probed = false;
    // The rings before the first shrink towards a suspected nearby
    // singularity: used if the smaller circles turn out unusable (the
    // suspicion was wrong, e.g. a fast-decaying essential principal part).
    let mut before_probe: Option<(Vec<CircleLaurent>, bool)> = None;
    let mut every_ring_overflowed = true;
    for _attempt in 0..12 {
        let mut rings = Vec::new();
        let mut finite = true;
        for div in [1.0, 2.0, 8.0, 32.0] {
            match laurent_on_circle(f, a, r / div, K_WINDOW, N_MAX, budget)? {
                Some(l) => rings.push(l),
                None => {
                    finite = false;
                    break;
                }
            }
        }
        every_ring_overflowed &= !finite && rings.len() < 2;
        let consistent = rings.len() >= 2
            && rings
                .windows(2)
                .all(|w| agree(&w[0], &w[1]) && !poles_inside_annulus(&w[0], &w[1]));
        if !consistent {
            if let Some((old, overflow)) = before_probe.take() {
                inner_overflow = overflow;
                chosen = Some(old);
                break;
            }
            r *= if rings.len() < 2 { 0.3 } else { 0.25 };
            continue;
        }
        // A singularity inside every circle but not at a (e.g. a pole at
        // distance δ < r/32) gives a principal part decaying geometrically,
        // |ĉ₋ₖ|^{1/k} → δ/r; an essential singularity's decays faster than
        // any geometric sequence. Shrink below δ in the first case.
        if let Some(delta) = nearby_singularity(&rings[0]).or_else(|| {
            if probed {
                None
            } else {
                offset_pole(&rings[0])
            }
        }) {
            if delta > 1e-13 * scale && delta < r && !(probed && before_probe.is_none()) {
                if !probed {
                    before_probe = Some((rings.clone(), !finite));
                }
                probed = true;
                r = 0.25 * delta;
                continue;
            }
        }
        inner_overflow = !finite;
        chosen = Some(rings);
        break;
    }
    // Every ring failed on non-finite samples: overflow (the shared probe) or true singularities?
    if chosen.is_none() && every_ring_overflowed && crate::overflow::overflows_near(&mut |z| f(z), a + C::from_polar(r, 0.7)) {
        return Err(Failure::not_finite(format!(
            "f overflows double precision (|f| > 1.8e308) on every sampling circle around {}, down to radius {r:.1e}: \
             this is overflow, not a singularity, and the residue cannot be computed by sampling; divide f by a \
             large constant (e.g. exp(-700)*f) and scale the answer back",
            if at_infinity { "infinity".to_string() } else { show(a) }
        )));
    }
    let Some(rings) = chosen else {
        return Ok(PointResult {
            kind: Kind::Essential,
            order: None,
            residue: None,
            principal_part: Vec::new(),
            error_estimate: 0.0,
            warnings: vec![format!(
                "no punctured disk around {{at}} free of other singularities was found (down to radius {:.1e}): singularities such as poles accumulate at {{at}}, so it is not an isolated singularity and has no residue",
                crate::text::Sci(r)
            )],
        });
    };

    // 3. Apparent pole order on each circle.
    let orders: Vec<usize> = rings.iter().map(apparent_order).collect();
    let rises = orders.windows(2).filter(|w| w[1] > w[0]).count();
    let falls = orders.windows(2).any(|w| w[1] < w[0]);
    let top = *orders.iter().max().unwrap_or(&0);
    let essential = inner_overflow || top + 2 >= K_WINDOW || (rises >= 2 && !falls);

    let outer = &rings[0];
    let second = &rings[1];
    // Residue at a finite point is c₋₁; at infinity it is −c₁ of f(1/w).
    let k_res: i64 = if at_infinity { 1 } else { -1 };
    let sign = if at_infinity { -1.0 } else { 1.0 };
    let residue = outer.coeff(k_res) * sign;
    let error = 2.0 * (outer.coeff(k_res) - second.coeff(k_res)).norm()
        + finite_or_big(outer.coeff_change(k_res))
        + outer.coeff_noise(k_res)
        + 4.0 * f64::EPSILON * residue.norm();
    let mut warnings = Vec::new();
    if !outer.converged {
        warnings.push("the Laurent coefficients at {at} did not settle within the sample limit; the error estimate may be pessimistic".to_string());
    }
    // Essential points and infinity can have huge terms on every circle; a
    // residue whose error estimate is not small is withheld, never guessed.
    let unreliable = !(error <= 1e-6 * residue.norm().max(1.0));
    if (essential || at_infinity) && unreliable {
        return Ok(PointResult {
            kind: if essential { Kind::Essential } else { Kind::Pole },
            order: None,
            residue: None,
            principal_part: Vec::new(),
            error_estimate: 0.0,
            warnings: vec![format!(
                "f grows so fast near {{at}} that its residue there cannot be determined (estimated error {error:.1e}); singularities may accumulate at {{at}}, in which case no residue exists",
                error = crate::text::Sci(error)
            )],
        });
    }
    if essential {
        return Ok(PointResult {
            kind: Kind::Essential,
            order: None,
            residue: Some(residue),
            principal_part: (1..=10).map(|k| outer.coeff(-k)).collect(),
            error_estimate: error,
            warnings,
        });
    }
    if top == 0 {
        // Bounded near a: regular if f(a) matches the limit, else removable.
        let c0 = outer.coeff(0);
        let kind = if at_infinity {
            Kind::Regular
        } else {
            let v = eval(f, a, budget)?;
            if is_finite(v)
                && (v - c0).norm() <= 1e-8 * outer.max_abs.max(c0.norm()).max(f64::MIN_POSITIVE)
            {
                Kind::Regular
            } else {
                Kind::Removable
            }
        };
        let residue = if at_infinity {
            residue
        } else {
            C::new(0.0, 0.0)
        };
        let error = if at_infinity {
            error
        } else {
            outer.coeff(-1).norm() + outer.coeff_noise(-1)
        };
        return Ok(PointResult {
            kind,
            order: None,
            residue: Some(residue),
            principal_part: Vec::new(),
            error_estimate: error,
            warnings,
        });
    }
    Ok(PointResult {
        kind: Kind::Pole,
        order: Some(top as u32),
        residue: Some(residue),
        principal_part: (1..=top as i64).map(|k| outer.coeff(-k)).collect(),
        error_estimate: error,
        warnings,
    })
}

fn branch_point() -> PointResult {
    PointResult {
        kind: Kind::BranchPoint,
        order: None,
        residue: None,
        principal_part: Vec::new(),
        error_estimate: 0.0,
        warnings: vec!["f is not single-valued around {at} (a branch point): it has no Laurent series and no residue there".to_string()],
    }
}

fn finite_or_big(x: f64) -> f64 {
    if x.is_finite() {
        x
    } else {
        0.0
    }
}

/// Distance of a singularity other than the centre, inside the circle, read
/// from a geometrically decaying principal part: log|ĉ₋ₖ| is then linear in k
/// with slope log(δ/r) (root test). An essential singularity's principal part
/// decays faster than geometrically (log|ĉ₋ₖ| concave, like −k log k), so the
/// slope over the upper half of the terms must match the slope over the
/// lower half. `None` when the principal part terminates or is not geometric.
fn nearby_singularity(l: &CircleLaurent) -> Option<f64> {
    let top = apparent_order(l);
    if top < 8 {
        return None;
    }
    // (k, log|ĉ₋ₖ|) for the larger of two neighbours (skips the zero
    // coefficients of odd or even functions).
    let point = |k: usize| {
        let k = k.max(2);
        let (a, b) = (
            l.normalized(-(k as i64)).norm(),
            l.normalized(-(k as i64 - 1)).norm(),
        );
        if a >= b {
            (k as f64, a.ln())
        } else {
            ((k - 1) as f64, b.ln())
        }
    };
    let (p1, p2, p3) = (point(top / 4), point(top / 2), point(top));
    let slope = |p: (f64, f64), q: (f64, f64)| (q.1 - p.1) / (q.0 - p.0);
    let (s_lo, s_hi) = (slope(p1, p2), slope(p2, p3));
    if !(s_lo.is_finite() && s_hi.is_finite()) || s_hi >= 0.0 {
        return None;
    }
    if (s_lo - s_hi).abs() <= 0.15 + 0.05 * s_hi.abs() {
        Some(s_hi.exp() * l.radius)
    } else {
        None
    }
}

/// A pole at distance δ from the centre looks like a short principal part
/// with ratios c₋ₖ₋₁/c₋ₖ ≈ −δ (it ends only where the terms reach rounding
/// level). Returns δ when the last ratios agree; the caller re-examines on a
/// circle smaller than δ (harmless for a true pole, which looks the same there).
fn offset_pole(l: &CircleLaurent) -> Option<f64> {
    let top = apparent_order(l) as i64;
    if !(2..=8).contains(&top) {
        return None;
    }
    let c = |k: i64| l.coeff(-k);
    let q1 = c(top) / c(top - 1);
    let q0 = if top >= 3 {
        c(top - 1) / c(top - 2)
    } else {
        q1
    };
    let near = (q1 - q0).norm() <= 0.2 * q1.norm().max(q0.norm());
    let delta = q1.norm();
    if near && delta.is_finite() && delta < 0.25 * l.radius {
        Some(delta)
    } else {
        None
    }
}

/// Largest k with a significant c₋ₖ on this circle (0 if none).
fn apparent_order(l: &CircleLaurent) -> usize {
    let floor = SIGNIFICANT * l.max_abs;
    let mut m = 0;
    for k in 1..=l.k_max as i64 {
        let size = l.normalized(-k).norm();
        let change = l.coeff_change(-k) * l.radius.powi(-k as i32);
        let change = if change.is_finite() { change } else { 0.0 };
        if size > floor && size > 10.0 * change {
            m = k as usize;
        }
    }
    m
}

/// Do two circles (outer radius R, inner radius ρ) give the same Laurent
/// coefficients, within their rounding and truncation levels?
fn agree(outer: &CircleLaurent, inner: &CircleLaurent) -> bool {
    let ratio = outer.radius / inner.radius;
    let kk = outer.k_max.min(inner.k_max) as i64;
    for k in -kk..=kk {
        // Compare in the outer circle's normalisation: c_k R^k.
        let x = outer.normalized(k);
        let y = inner.normalized(k) * ratio.powi(k as i32);
        let tol = 1e-9 * (outer.max_abs + inner.max_abs * ratio.powi(k as i32));
        if !((x - y).norm() <= tol) {
            return false;
        }
    }
    true
}

/// N − P inside a disk can only decrease as the disk shrinks around an
/// isolated singularity (no poles near it); an increase means poles lie in
/// the annulus between the circles.
fn poles_inside_annulus(outer: &CircleLaurent, inner: &CircleLaurent) -> bool {
    matches!((outer.winding, inner.winding), (Some(wo), Some(wi)) if wi > wo)
}

/// The residue c₋₁ at each of `points` that classifies as essential (with its
/// error estimate); `None` where it is not essential or could not be computed.
pub fn essential_residues(f: &dyn Fn(C) -> C, points: &[C], hints: &Hints, budget: &mut Budget) -> Vec<Option<(C, f64)>> {
    points
        .iter()
        .map(|&z| {
            classify_point(f, z, hints, budget)
                .ok()
                .filter(|r| r.kind == Kind::Essential)
                .and_then(|r| r.residue.map(|c| (c, r.error_estimate)))
        })
        .collect()
}


#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{check_method, naive_circle_coefficient};

    /// Slow reference: c₋₁ by the naive circle sum with 8192 points
    /// (`reference::naive_circle_coefficient`) on a circle of radius `r_ref`
    /// that encloses no other singularity; the kind, order and closed-form
    /// residue are beside each case.
    #[test]
    fn kinds_and_residues_match_the_naive_circle_sum() {
        type F = fn(C) -> C;
        let i = C::i();
        // (f, point, kind, order, radius for the reference)
        let cases: [(&str, (F, C, Kind, Option<u32>, f64)); 5] = [
            // e^z/(z − 1)²: double pole, Res = e (derivative rule; common practice)
            ("e^z/(z−1)² at 1", (|z| z.exp() / ((z - 1.0) * (z - 1.0)), C::new(1.0, 0.0), Kind::Pole, Some(2), 0.5)),
            // cot z at π: simple pole, Res = cos π / cos π = 1 (common practice)
            ("cot z at π", (|z| z.cos() / z.sin(), C::new(std::f64::consts::PI, 0.0), Kind::Pole, Some(1), 1.0)),
            // 1/(z² + 4)² at 2i: Res = d/dz (z + 2i)^{−2} at 2i = −2/(4i)³ = −i/32 (common practice)
            ("1/(z²+4)² at 2i", (|z| 1.0 / (z * z + 4.0).powi(2), 2.0 * i, Kind::Pole, Some(2), 1.0)),
            // e^{1/z} = Σ z^{−k}/k!: essential, Res = 1 (common practice)
            ("e^(1/z) at 0", (|z| (1.0 / z).exp(), C::new(0.0, 0.0), Kind::Essential, None, 0.5)),
            // sin z / z⁴ = z⁻³ − z⁻¹/6 + …: triple pole, Res = −1/6 (Taylor series; common practice)
            ("sin z/z⁴ at 0", (|z| z.sin() / (z * z).powi(2), C::new(0.0, 0.0), Kind::Pole, Some(3), 1.0)),
        ];
        let closed_form = [
            C::new(std::f64::consts::E, 0.0),
            C::new(1.0, 0.0),
            -i / 32.0,
            C::new(1.0, 0.0),
            C::new(-1.0 / 6.0, 0.0),
        ];
        check_method(
            &cases,
            |&(f, a, kind, order, _)| {
                let p = classify_point(&f, a, &Hints::default(), &mut Budget::new(10_000_000)).unwrap();
                assert_eq!((p.kind, p.order), (kind, order), "{p:?}");
                (p.residue.unwrap(), Some(p.error_estimate))
            },
            |&(f, a, _, _, r)| naive_circle_coefficient(f, a, r, 8192, -1),
            1e-10,
        );
        for ((name, (f, a, ..)), want) in cases.iter().zip(closed_form) {
            let p = classify_point(f, *a, &Hints::default(), &mut Budget::new(10_000_000)).unwrap();
            crate::reference::assert_close(p.residue.unwrap(), want, 1e-10, name);
        }
    }

    #[test]
    fn regular_removable_and_branch_points() {
        let mut b = Budget::new(10_000_000);
        // sin z / z is removable at 0, e^z regular at 0 (Taylor series; common practice)
        let p = classify_point(&|z: C| z.sin() / z, C::new(0.0, 0.0), &Hints::default(), &mut b).unwrap();
        assert_eq!(p.kind, Kind::Removable, "{p:?}");
        let p = classify_point(&|z: C| z.exp(), C::new(0.0, 0.0), &Hints::default(), &mut b).unwrap();
        assert_eq!(p.kind, Kind::Regular, "{p:?}");
        // sqrt z branches at 0 (common practice) and has no residue there
        let hints = Hints { uses_branch_functions: true, ..Hints::default() };
        let p = classify_point(&|z: C| z.sqrt(), C::new(0.0, 0.0), &hints, &mut b).unwrap();
        assert_eq!((p.kind, p.residue), (Kind::BranchPoint, None), "{p:?}");
        // z²/(z − 1) has a simple pole at infinity: f = z + 1 + 1/(z − 1), so the
        // residue at infinity is −1 (−(coefficient of z⁻¹); common practice)
        let p = classify_infinity(&|z: C| z * z / (z - 1.0), &Hints::default(), &mut b).unwrap();
        assert_eq!((p.kind, p.order), (Kind::Pole, Some(1)), "{p:?}");
        crate::reference::assert_close(p.residue.unwrap(), C::new(-1.0, 0.0), 1e-10, "Res at ∞ of z²/(z−1)");
    }
}

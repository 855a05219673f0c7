//! Exact singularity analysis of a rational function `num/den`.
//!
//! Method: roots of both polynomials by the Aberth–Ehrlich iteration
//! (Bini, Numer. Algorithms 13, 1996), multiplicities from root clusters
//! (centroid + Newton on `p^(m−1)`, after Zeng, Math. Comp. 74, 2005), common
//! roots cancelled, principal parts from the partial-fraction structure
//! (see `poly::partial_fractions`). The residue at infinity is computed
//! independently from the expansion at infinity — `f = q + r/den` with
//! `Res∞ f = −r_{n−1}/d_n`, `n = deg den` (common practice) — so that the
//! residue theorem `Σ Res + Res∞ = 0` is a genuine check.

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use crate::expr::rational::Rational;
use crate::poly::multiplicity::{distinct_roots, distinct_roots_of_product, RootCluster};
use crate::text;
use crate::error::Failure;
use crate::poly::partial_fractions::local_expansion;
use crate::poly::{divrem, trim, UNIT_ROUNDOFF, ZERO_C};
use crate::C;

/// A pole with its Laurent principal part.
#[derive(Debug, Clone, PartialEq)]
pub struct PoleInfo {
    pub at: C,
    /// Error estimate of `at`.
    pub location_error: f64,
    pub order: u32,
    /// `c_{−1}`.
    pub residue: C,
    /// `c_{−1}, c_{−2}, …, c_{−order}`.
    pub principal_part: Vec<C>,
    /// Error estimate of each principal-part coefficient (same order).
    pub principal_part_errors: Vec<f64>,
    /// Error estimate of the residue.
    pub error_estimate: f64,
    /// True when the order was inferred from a cluster of root approximations
    /// of expanded coefficients (it could then be several close poles); false
    /// when the product as typed states it, e.g. `(z − 1)^3`.
    pub order_inferred: bool,
}

/// A zero of f (after cancelling common roots).
#[derive(Debug, Clone, PartialEq)]
pub struct ZeroInfo {
    pub at: C,
    pub order: u32,
    pub location_error: f64,
}

/// A root common to numerator and denominator that leaves f finite.
#[derive(Debug, Clone, PartialEq)]
pub struct RemovableInfo {
    pub at: C,
    /// The limit of f at this point.
    pub value: C,
    /// How many factors `(z − at)` cancelled.
    pub cancelled_order: u32,
}

#[derive(Debug, Clone, PartialEq)]
pub struct RationalAnalysis {
    /// Sorted by real part, then imaginary part.
    pub poles: Vec<PoleInfo>,
    pub zeros: Vec<ZeroInfo>,
    pub removable: Vec<RemovableInfo>,
    /// Quotient of `num ÷ den`, ascending coefficients (empty when deg num < deg den).
    pub polynomial_part: Vec<C>,
    pub residue_at_infinity: C,
    /// `deg num − deg den`: > 0 pole order at ∞, < 0 zero order at ∞, 0 finite nonzero.
    pub infinity_order: i32,
    /// `|Σ finite residues + Res∞|`, which the residue theorem says is 0.
    pub residue_sum_defect: f64,
    /// What the defect may be from rounding alone: `Σ residue errors + rounding of Res∞`.
    pub residue_sum_tolerance: f64,
    pub warnings: Vec<String>,
}

/// Relative error estimate of a residue above which a sensitivity warning is given.
const SENSITIVE_RESIDUE: f64 = 1e-6;

/// A warning when a residue's error estimate leaves fewer than six reliable digits.
pub fn sensitivity_warning(at: C, residue: C, error_estimate: f64) -> Option<String> {
    let relative = error_estimate / residue.norm();
    (residue.norm() > 0.0 && !(relative <= SENSITIVE_RESIDUE)).then(|| {
        format!(
            "the residue at {} is uncertain (error estimate {:.1e}: about {} digits are certain); close poles make \
             residues ill-conditioned, and rounding the typed numbers to double precision moves them this much",
            describe(at),
            text::Sci(error_estimate),
            (-relative.log10()).floor().max(0.0)
        )
    })
}

fn check_finite(p: &[C], what: &str) -> Result<(), Failure> {
    if let Some(k) = p.iter().position(|c| !c.is_finite()) {
        return Err(Failure::not_finite(format!(
            "coefficient {k} of the {what} is not a finite number; check the expression"
        )));
    }
    Ok(())
}

fn describe(z: C) -> String {
    text::complex(z, 0.0)
}

fn cluster_warning(c: &RootCluster, what: &str) -> Option<String> {
    if c.resolved || c.multiplicity < 2 {
        return None;
    }
    let list: Vec<String> = c.members.iter().map(|z| describe(*z)).collect();
    Some(format!(
        "{what} at {} are closer than can be resolved at double precision; treated as one {} of order {} at {}",
        list.join(" and "),
        &what[..what.len() - 1],
        c.multiplicity,
        describe(c.center)
    ))
}

/// Analyse `num/den` (ascending coefficients; common roots may remain).
///
/// ```
/// use residuary::singular::rational_poles::analyse_rational;
/// use residuary::C;
/// // (z + 3)/((z − 1)²(z + 1)) = (z + 3)/(z³ − z² − z + 1): a double pole at 1 with
/// // residue d/dz (z+3)/(z+1) at 1 = −1/2, a simple pole at −1 with residue 2/4 = 1/2,
/// // so the residue at infinity is 0 (residue rules; common practice).
/// let re = |x: f64| C::new(x, 0.0);
/// let a = analyse_rational(&[re(3.0), re(1.0)], &[re(1.0), re(-1.0), re(-1.0), re(1.0)]).unwrap();
/// let at_one = a.poles.iter().find(|p| (p.at - re(1.0)).norm() < 1e-6).unwrap();
/// assert_eq!(at_one.order, 2);
/// assert!((at_one.residue - re(-0.5)).norm() < 1e-8, "{at_one:?}");
/// let at_minus_one = a.poles.iter().find(|p| (p.at - re(-1.0)).norm() < 1e-6).unwrap();
/// assert!((at_minus_one.residue - re(0.5)).norm() < 1e-8, "{at_minus_one:?}");
/// assert!(a.residue_at_infinity.norm() < 1e-8);
/// ```
pub fn analyse_rational(num: &[C], den: &[C]) -> Result<RationalAnalysis, Failure> {
    analyse(num, den, None, None).and_then(all_finite)
}

/// Refuse an analysis holding a non-finite number (a root finder overflowing
/// on coefficients that span too many magnitudes, as 1e-300 z² + 1 does): a
/// refusal with the reason, not NaN poles.
fn all_finite(a: RationalAnalysis) -> Result<RationalAnalysis, Failure> {
    let ok = |z: &C| z.re.is_finite() && z.im.is_finite();
    let finite = a.poles.iter().all(|p| ok(&p.at) && ok(&p.residue) && p.principal_part.iter().all(ok))
        && a.zeros.iter().all(|z| ok(&z.at))
        && a.removable.iter().all(|r| ok(&r.at) && ok(&r.value))
        && a.polynomial_part.iter().all(ok)
        && ok(&a.residue_at_infinity);
    if finite {
        Ok(a)
    } else {
        Err(Failure::unresolved(
            "the poles and zeros of this rational f could not be computed in double precision: its coefficients \
             span too many orders of magnitude; rescale the variable or the coefficients",
        ))
    }
}

/// Value and derivative of f as the user typed it (products of factors kept).
pub type AsTyped<'a> = &'a dyn Fn(C) -> (C, C);

/// Like [`analyse_rational`], with every pole and zero location polished by
/// Newton's method on f as typed (`z ← z ± m·f/f′`). Expanding a product of
/// many factors into coefficients can make its roots far more sensitive than
/// the factors were (Wilkinson's example, (s+1)(s+2)…(s+20)); the expression
/// as typed keeps them well conditioned. A polished root is kept only if the
/// iteration converges near where it started; the principal parts are then
/// computed from the polished factors.
pub fn analyse_rational_polished(num: &[C], den: &[C], as_typed: AsTyped) -> Result<RationalAnalysis, Failure> {
    analyse(num, den, None, Some(as_typed)).and_then(all_finite)
}

/// Like [`analyse_rational_polished`], and the roots are found factor by
/// factor in the product form the user typed (`Rational::factors`), so
/// distinct factors keep distinct roots however close: the expanded
/// coefficients of `(z − 1.456)²(z − 1.456001456)` cannot tell a triple root
/// from the double and simple roots the factors state.
///
/// ```
/// use residuary::expr::Function;
/// use residuary::singular::rational_poles::analyse_factored;
/// use residuary::C;
/// // 1/((z − 1.456)²(z − 1.456001456)): with d = 1.456e-6, partial fractions by hand give
/// // Res at 1.456001456 = 1/d² and Res at 1.456 = −1/d² (they sum to 0: Res∞ = 0).
/// let f = Function::compile("1/((z-1.456)^2*(z-1.456001456))", "z", &[]).unwrap();
/// let a = analyse_factored(f.rational().unwrap(), &|z| f.eval_d(z)).unwrap();
/// assert_eq!(a.poles.len(), 2);
/// let d: f64 = 1.456001456 - 1.456;
/// let simple = a.poles.iter().find(|p| p.order == 1).unwrap();
/// assert!((simple.residue.re * d * d - 1.0).abs() < 1e-6, "{simple:?}");
/// ```
pub fn analyse_factored(r: &Rational, as_typed: AsTyped) -> Result<RationalAnalysis, Failure> {
    analyse(&r.num, &r.den, Some(r), Some(as_typed)).and_then(all_finite)
}

/// [`analyse_factored`] on f's own rational form, polished on f as typed;
/// `not_applicable` when f is not rational.
pub fn analyse_function(f: &crate::expr::Function) -> Result<RationalAnalysis, Failure> {
    let r = f
        .rational()
        .ok_or_else(|| Failure::not_applicable("f is not a rational function of its variable"))?;
    analyse_factored(r, &|z| f.eval_d(z))
}

/// Newton's method for a root of order `m` of f (`pole = false`) or of 1/f
/// (`pole = true`), from `z`, moving at most `reach`. Returns the polished
/// point and an error estimate, or `None` when it does not settle.
fn polish(as_typed: AsTyped, z: C, m: u32, pole: bool, reach: f64) -> Option<(C, f64)> {
    let m = m as f64;
    let mut x = z;
    for _ in 0..12 {
        let (v, d) = as_typed(x);
        if !(v.is_finite() && d.is_finite()) || d == ZERO_C {
            // Exactly on the point (f infinite or zero): nothing left to move.
            return (v == ZERO_C || !v.is_finite()).then_some((x, 4.0 * UNIT_ROUNDOFF * x.norm()));
        }
        let ratio = v / d;
        let step = if pole { -ratio * m } else { ratio * m };
        if !step.is_finite() {
            return None;
        }
        x -= step;
        if (x - z).norm() > reach {
            return None;
        }
        if step.norm() <= 4.0 * UNIT_ROUNDOFF * x.norm().max(f64::MIN_POSITIVE) {
            return Some((x, 4.0 * step.norm() + 4.0 * UNIT_ROUNDOFF * x.norm()));
        }
    }
    None
}

/// Aberth–Ehrlich sweeps (Aberth 1973) for the simple poles, with the
/// logarithmic derivative of the denominator taken from f as typed:
/// den′/den = num′/num − f′/f. The new locations are kept only if every
/// sweep converges to distinct finite points.
fn aberth_on_typed(poles: &mut [RootCluster], num: &[C], as_typed: AsTyped) {
    let mut z: Vec<C> = poles.iter().map(|c| c.center).collect();
    let dnum = crate::poly::derivative(num);
    let mut last = vec![f64::INFINITY; z.len()];
    for _ in 0..60 {
        let mut largest: f64 = 0.0;
        for i in 0..z.len() {
            let (v, d) = as_typed(z[i]);
            if !v.is_finite() || v == ZERO_C {
                last[i] = 0.0; // exactly on a pole (or a zero of f): nothing to move
                continue;
            }
            let num_ratio = if num.len() > 1 { crate::poly::eval(&dnum, z[i]) / crate::poly::eval(num, z[i]) } else { ZERO_C };
            let den_ratio = num_ratio - d / v;
            let others: C = (0..z.len()).filter(|&j| j != i).map(|j| (z[i] - z[j]).inv()).sum();
            let step = (den_ratio - others).inv();
            if !step.is_finite() {
                return;
            }
            z[i] -= step;
            last[i] = step.norm();
            largest = largest.max(step.norm() / z[i].norm().max(f64::MIN_POSITIVE));
        }
        if largest <= 4.0 * UNIT_ROUNDOFF {
            let distinct = (0..z.len()).all(|i| (0..i).all(|j| z[i] != z[j]));
            if distinct && z.iter().all(|x| x.is_finite()) {
                for ((c, &x), &e) in poles.iter_mut().zip(&z).zip(&last) {
                    c.center = x;
                    c.error = 4.0 * e + 4.0 * UNIT_ROUNDOFF * x.norm();
                }
            }
            return;
        }
    }
}

fn analyse(num: &[C], den: &[C], factored: Option<&Rational>, as_typed: Option<AsTyped>) -> Result<RationalAnalysis, Failure> {
    check_finite(num, "numerator")?;
    check_finite(den, "denominator")?;
    let num = trim(num);
    let den = trim(den);
    if den.is_empty() {
        return Err(Failure::invalid(
            "the denominator is identically zero; the expression is undefined everywhere",
        ));
    }
    let mut warnings = Vec::new();
    if num.is_empty() {
        warnings.push("the function is identically zero: no poles, zeros or residues".into());
        return Ok(RationalAnalysis {
            poles: Vec::new(),
            zeros: Vec::new(),
            removable: Vec::new(),
            polynomial_part: Vec::new(),
            residue_at_infinity: ZERO_C,
            infinity_order: 0,
            residue_sum_defect: 0.0,
            residue_sum_tolerance: 0.0,
            warnings,
        });
    }
    // Roots side by side: factor by factor when a product form is known.
    let (den_factors, num_factors) = factored.map_or((Vec::new(), Vec::new()), |r| (r.side(true), r.side(false)));
    let roots_of = |p: &[C], factors: &[(&[C], u32)]| {
        if factors.is_empty() { distinct_roots(p) } else { distinct_roots_of_product(factors) }
    };
    let (mut den_clusters, den_ok) = roots_of(&den, &den_factors).map_err(|e| e.context("denominator: "))?;
    let (mut num_clusters, num_ok) = if num.len() > 1 {
        roots_of(&num, &num_factors).map_err(|e| e.context("numerator: "))?
    } else {
        (Vec::new(), true)
    };
    if !den_ok || !num_ok {
        warnings.push("the root finder did not meet its stopping rule for every root; results may be inaccurate".into());
    }
    warnings.extend(
        den_clusters
            .iter()
            .filter_map(|c| cluster_warning(c, "poles")),
    );
    warnings.extend(
        num_clusters
            .iter()
            .filter_map(|c| cluster_warning(c, "zeros")),
    );

    // Pair each denominator root with at most one numerator root at the same place.
    let mut num_used = vec![false; num_clusters.len()];
    let mut zero_order_at = vec![0usize; den_clusters.len()];
    for (i, d) in den_clusters.iter().enumerate() {
        let mut best: Option<(usize, f64)> = None;
        for (j, z) in num_clusters.iter().enumerate() {
            if num_used[j] {
                continue;
            }
            let dist = (d.center - z.center).norm();
            let tol = 4.0 * (d.error + z.error)
                + 16.0 * UNIT_ROUNDOFF * d.center.norm().max(z.center.norm());
            if dist <= tol && best.is_none_or(|(_, b)| dist < b) {
                best = Some((j, dist));
            }
        }
        if let Some((j, _)) = best {
            num_used[j] = true;
            zero_order_at[i] = num_clusters[j].multiplicity as usize;
        }
    }

    // When every pole is simple and none cancels, first run Aberth–Ehrlich
    // sweeps for all poles at once on f as typed: the simultaneous iteration
    // repairs even approximations that started near the wrong pole.
    if let Some(as_typed) = as_typed {
        if den_clusters.len() >= 2
            && den_clusters.iter().all(|c| c.multiplicity == 1)
            && zero_order_at.iter().all(|&k| k == 0)
        {
            aberth_on_typed(&mut den_clusters, &num, as_typed);
        }
    }
    // Polish unpaired poles and zeros on f as typed; each may move at most a
    // quarter of the way to the nearest other root.
    let mut polished_all = false;
    if let Some(as_typed) = as_typed {
        let centers: Vec<C> = den_clusters.iter().chain(&num_clusters).map(|c| c.center).collect();
        let reach = |z: C| {
            let nearest = centers.iter().map(|c| (c - z).norm()).filter(|&d| d > 0.0).fold(f64::INFINITY, f64::min);
            if nearest.is_finite() { 0.25 * nearest } else { 0.25 * z.norm().max(1.0) }
        };
        polished_all = true;
        for (i, d) in den_clusters.iter_mut().enumerate() {
            if zero_order_at[i] > 0 {
                continue; // cancelled against a zero: f is finite there
            }
            match polish(as_typed, d.center, d.multiplicity, true, reach(d.center)) {
                // A multiplicity inferred from a cluster is not polished: Newton on
                // f as typed stalls in the noise around a multiple root, where the
                // pejorative-manifold refinement is the accurate one.
                Some(_) if d.members.len() > 1 => {}
                Some((z, e)) => {
                    d.center = z;
                    d.error = e;
                }
                None => polished_all = false,
            }
        }
        for (j, z) in num_clusters.iter_mut().enumerate() {
            if num_used[j] {
                continue;
            }
            if let Some((x, e)) = polish(as_typed, z.center, z.multiplicity, false, reach(z.center)) {
                if z.members.len() <= 1 {
                    z.center = x;
                    z.error = e;
                }
            }
        }
    }

    let lead = den[den.len() - 1];
    let factors: Vec<(C, u32)> = den_clusters
        .iter()
        .map(|c| (c.center, c.multiplicity))
        .collect();
    let factor_errors: Vec<f64> = den_clusters.iter().map(|c| c.error).collect();
    let mut poles = Vec::new();
    let mut removable = Vec::new();
    let mut zeros = Vec::new();
    for (i, d) in den_clusters.iter().enumerate() {
        let k = zero_order_at[i];
        // The direct route divides the expanded denominator's Taylor series: a
        // check only when the expanded coefficients are what the user typed.
        let check_direct = !polished_all && den_factors.len() <= 1;
        let e = local_expansion(&num, &den, lead, &factors, &factor_errors, i, k, check_direct);
        match e.limit {
            None => {
                let residue = e.principal_part.first().copied().unwrap_or(ZERO_C);
                let error_estimate = e.principal_part_errors.first().copied().unwrap_or(0.0);
                poles.push(PoleInfo {
                    at: d.center,
                    location_error: d.error,
                    order: d.multiplicity - k as u32,
                    residue,
                    principal_part: e.principal_part,
                    principal_part_errors: e.principal_part_errors,
                    error_estimate,
                    order_inferred: d.members.len() > 1,
                });
            }
            Some(value) => {
                removable.push(RemovableInfo {
                    at: d.center,
                    value,
                    cancelled_order: d.multiplicity,
                });
                if k > d.multiplicity as usize {
                    zeros.push(ZeroInfo {
                        at: d.center,
                        order: k as u32 - d.multiplicity,
                        location_error: d.error,
                    });
                }
            }
        }
    }
    for (j, z) in num_clusters.iter().enumerate() {
        if !num_used[j] {
            zeros.push(ZeroInfo {
                at: z.center,
                order: z.multiplicity,
                location_error: z.error,
            });
        }
    }
    // Sensitivity: say so when a residue has fewer than six reliable digits.
    warnings.extend(poles.iter().filter_map(|p| sensitivity_warning(p.at, p.residue, p.error_estimate)));
    let by_position = |a: &C, b: &C| a.re.total_cmp(&b.re).then(a.im.total_cmp(&b.im));
    poles.sort_by(|a, b| by_position(&a.at, &b.at));
    zeros.sort_by(|a, b| by_position(&a.at, &b.at));
    removable.sort_by(|a, b| by_position(&a.at, &b.at));

    // Expansion at infinity, independent of the poles.
    let (quotient, remainder) = divrem(&num, &den)?;
    let n = den.len() - 1;
    let r_top = if n >= 1 {
        remainder.get(n - 1).copied().unwrap_or(ZERO_C)
    } else {
        ZERO_C
    };
    let residue_at_infinity = -crate::poly::cdiv(r_top, lead);
    let infinity_order = num.len() as i32 - den.len() as i32;
    let sum: C = poles.iter().map(|p| p.residue).sum();
    let residue_sum_defect = (sum + residue_at_infinity).norm();
    let scale = num.iter().map(|c| c.norm()).fold(0.0, f64::max) / lead.norm();
    let residue_sum_tolerance = poles.iter().map(|p| p.error_estimate).sum::<f64>()
        + 8.0
            * (num.len() + den.len()) as f64
            * UNIT_ROUNDOFF
            * (residue_at_infinity.norm() + sum.norm() + scale);
    if !(residue_sum_defect <= 10.0 * residue_sum_tolerance) {
        warnings.push(format!(
            "the residues do not sum to zero within their error estimates (defect {residue_sum_defect:.3e}); some residues may be inaccurate",
            residue_sum_defect = text::Sci(residue_sum_defect)
        ));
    }
    Ok(RationalAnalysis {
        poles,
        zeros,
        removable,
        polynomial_part: trim(&quotient),
        residue_at_infinity,
        infinity_order,
        residue_sum_defect,
        residue_sum_tolerance,
        warnings,
    })
}

/// What kind of point a residue was asked at.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PointKind {
    Pole,
    Removable,
    Regular,
}

impl PointKind {
    pub fn as_str(self) -> &'static str {
        match self {
            PointKind::Pole => "pole",
            PointKind::Removable => "removable",
            PointKind::Regular => "regular",
        }
    }
}

/// The residue at one requested point.
#[derive(Debug, Clone, PartialEq)]
pub struct PointResidue {
    pub kind: PointKind,
    /// The singular point matched (the computed pole location), or the requested point.
    pub at: C,
    /// Pole order (`None` unless `kind` is `Pole`).
    pub order: Option<u32>,
    pub residue: C,
    pub error_estimate: f64,
    pub principal_part: Vec<C>,
    /// The limit of f at a removable point.
    pub removable_value: Option<C>,
    /// Nearest pole and its distance, so a caller can say "a pole lies 3e-6 away".
    pub nearest_pole: Option<C>,
    pub distance_to_nearest_pole: Option<f64>,
}

/// Relative tolerance for matching a requested point to a pole.
pub const MATCH_RELATIVE: f64 = 1e-10;

/// The matching rule: `a` is at a singular point `s` (location error `e`) when
/// `|a − s| ≤ max(16·e, 1e-10·max(1, |s|))`. The nearest such point wins.
fn matches(a: C, s: C, e: f64) -> Option<f64> {
    let d = (a - s).norm();
    let tol = (16.0 * e).max(MATCH_RELATIVE * s.norm().max(1.0));
    (d <= tol).then_some(d)
}

/// Residue of `num/den` at the point `a`: pole, removable singularity or regular point.
pub fn residue_at_point(num: &[C], den: &[C], a: C) -> Result<PointResidue, Failure> {
    residue_at_point_with(num, den, a, None, None)
}

/// [`residue_at_point`] with the poles polished on f as typed (see [`analyse_rational_polished`]).
pub fn residue_at_point_polished(num: &[C], den: &[C], a: C, as_typed: AsTyped) -> Result<PointResidue, Failure> {
    residue_at_point_with(num, den, a, None, Some(as_typed))
}

/// [`residue_at_point`] on the product form as typed (see [`analyse_factored`]).
pub fn residue_at_point_factored(r: &Rational, a: C, as_typed: AsTyped) -> Result<PointResidue, Failure> {
    residue_at_point_with(&r.num, &r.den, a, Some(r), Some(as_typed))
}

fn residue_at_point_with(num: &[C], den: &[C], a: C, factored: Option<&Rational>, as_typed: Option<AsTyped>) -> Result<PointResidue, Failure> {
    if !a.is_finite() {
        return Err(Failure::invalid("the point must be finite; ask for the residue at infinity separately"));
    }
    let r = analyse(num, den, factored, as_typed)?;
    let nearest = r
        .poles
        .iter()
        .map(|p| (p.at, (p.at - a).norm()))
        .min_by(|x, y| x.1.total_cmp(&y.1));
    let mut out = PointResidue {
        kind: PointKind::Regular,
        at: a,
        order: None,
        residue: ZERO_C,
        error_estimate: 0.0,
        principal_part: Vec::new(),
        removable_value: None,
        nearest_pole: nearest.map(|n| n.0),
        distance_to_nearest_pole: nearest.map(|n| n.1),
    };
    let pole = r
        .poles
        .iter()
        .filter_map(|p| matches(a, p.at, p.location_error).map(|d| (p, d)))
        .min_by(|x, y| x.1.total_cmp(&y.1));
    if let Some((p, _)) = pole {
        out.kind = PointKind::Pole;
        out.at = p.at;
        out.order = Some(p.order);
        out.residue = p.residue;
        out.error_estimate = p.error_estimate;
        out.principal_part = p.principal_part.clone();
        return Ok(out);
    }
    let rem = r
        .removable
        .iter()
        .filter_map(|p| matches(a, p.at, 0.0).map(|d| (p, d)))
        .min_by(|x, y| x.1.total_cmp(&y.1));
    if let Some((p, _)) = rem {
        out.kind = PointKind::Removable;
        out.at = p.at;
        out.removable_value = Some(p.value);
    }
    Ok(out)
}

/// Sign and magnitude text of a coefficient: (" + ", "2") or (" - ", "(0.25 + 1i)").
fn signed_coefficient(z: C, err: f64) -> (bool, String, bool) {
    let re = if z.re.abs() <= err { 0.0 } else { z.re };
    let im = if z.im.abs() <= err { 0.0 } else { z.im };
    let negative = re < 0.0 || (re == 0.0 && im < 0.0);
    let w = if negative {
        -C::new(re, im)
    } else {
        C::new(re, im)
    };
    let text = text::complex(w, 0.0);
    let compound = re != 0.0 && im != 0.0;
    (
        negative,
        if compound { format!("({text})") } else { text },
        w == C::new(1.0, 0.0),
    )
}

/// `(z - a)` text for a pole location.
fn linear_factor(var: &str, a: C, err: f64) -> String {
    let re = if a.re.abs() <= err { 0.0 } else { a.re };
    let im = if a.im.abs() <= err { 0.0 } else { a.im };
    if re == 0.0 && im == 0.0 {
        return var.to_string();
    }
    let (neg, text, _) = signed_coefficient(C::new(re, im), 0.0);
    format!("({var} {} {text})", if neg { "+" } else { "-" })
}

/// Readable partial fractions, e.g. `2 + 0.5/(z - 1) - (0.25 + 1i)/(z + 2i)^2`.
pub fn partial_fractions_string(a: &RationalAnalysis, var: &str) -> String {
    let mut terms: Vec<(bool, String)> = Vec::new();
    let q = &a.polynomial_part;
    let q_err = 16.0
        * (q.len() as f64 + 1.0)
        * UNIT_ROUNDOFF
        * q.iter().map(|c| c.norm()).fold(0.0, f64::max);
    for (k, &c) in q.iter().enumerate().rev() {
        if c.norm() <= q_err {
            continue;
        }
        let (neg, text, one) = signed_coefficient(c, q_err);
        let power = match k {
            0 => String::new(),
            1 => var.to_string(),
            _ => format!("{var}^{k}"),
        };
        let body = match (k, one) {
            (0, _) => text,
            (_, true) => power,
            (_, false) => format!("{text}*{power}"),
        };
        terms.push((neg, body));
    }
    for p in &a.poles {
        let factor = linear_factor(var, p.at, p.location_error);
        for (i, (&c, &e)) in p
            .principal_part
            .iter()
            .zip(&p.principal_part_errors)
            .enumerate()
        {
            if c.norm() <= e {
                continue;
            }
            let (neg, text, _) = signed_coefficient(c, e);
            let power = if i == 0 {
                String::new()
            } else {
                format!("^{}", i + 1)
            };
            terms.push((neg, format!("{text}/{factor}{power}")));
        }
    }
    join_signed(&terms)
}

/// Signed terms joined as `a - b + c` (a leading `-` when the first is
/// negative); `"0"` when there are none. Shared by every closed-form writer.
pub fn join_signed(terms: &[(bool, String)]) -> String {
    let mut s = String::new();
    for (i, (neg, body)) in terms.iter().enumerate() {
        match (i, neg) {
            (0, true) => s.push_str(&format!("-{body}")),
            (0, false) => s.push_str(body),
            (_, true) => s.push_str(&format!(" - {body}")),
            (_, false) => s.push_str(&format!(" + {body}")),
        }
    }
    if s.is_empty() {
        "0".into()
    } else {
        s
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::poly::from_roots;

    fn c(re: f64, im: f64) -> C {
        C::new(re, im)
    }

    #[test]
    fn string_form_of_a_small_example() {
        // 2 + 0.5/(z − 1) − (0.25 + i)/(z + 2i)^2 by construction (combined into num/den here);
        // property: the printed form gives back the terms, poles sorted by real part.
        let one = c(1.0, 0.0);
        let den = from_roots(one, &[one, c(0.0, -2.0), c(0.0, -2.0)]);
        let zp2i = from_roots(one, &[c(0.0, -2.0), c(0.0, -2.0)]);
        let zm1 = from_roots(one, &[one]);
        let mut num = crate::poly::mul(&den, &[c(2.0, 0.0)]);
        for (k, v) in zp2i.iter().enumerate() {
            num[k] += v * 0.5;
        }
        for (k, v) in zm1.iter().enumerate() {
            num[k] -= v * c(0.25, 1.0);
        }
        let a = analyse_rational(&num, &den).unwrap();
        assert_eq!(
            partial_fractions_string(&a, "z"),
            "2 - (0.25 + 1i)/(z + 2i)^2 + 0.5/(z - 1)"
        );
    }

    fn horner(p: &[C], z: C) -> C {
        p.iter().rev().fold(C::new(0.0, 0.0), |acc, &c| acc * z + c)
    }

    /// Slow reference: each residue by the naive circle sum
    /// (`reference::naive_circle_coefficient`, 8192 points, radius 0.25 — every
    /// pole here is at least 0.9 from the others) on num/den evaluated by Horner,
    /// and Res∞ = −(1/2πi)∮ f dz on |z| = 10 (common practice), by
    /// `reference::naive_circle_integral`.
    #[test]
    fn residues_match_the_naive_circle_sum() {
        use crate::reference::{check_method, naive_circle_coefficient, naive_circle_integral};
        let one = c(1.0, 0.0);
        // (num, den) ascending; the denominators are built from their roots
        let cases: Vec<(&str, (Vec<C>, Vec<C>))> = vec![
            ("(z² + 1)/((z − 2)(z + 1 − i)(z − 3i))", (vec![one, c(0.0, 0.0), one], from_roots(one, &[c(2.0, 0.0), c(-1.0, 1.0), c(0.0, 3.0)]))),
            ("(z⁴ − 2z + 5)/((z − 1)³(z + 2))", (vec![c(5.0, 0.0), c(-2.0, 0.0), c(0.0, 0.0), c(0.0, 0.0), one], from_roots(one, &[one, one, one, c(-2.0, 0.0)]))),
            ("3/(2(z + i)²(z − 0.5))", (vec![c(3.0, 0.0)], from_roots(c(2.0, 0.0), &[c(0.0, -1.0), c(0.0, -1.0), c(0.5, 0.0)]))),
        ];
        let mut poles = Vec::new();
        let mut infinity = Vec::new();
        for (name, (num, den)) in &cases {
            let a = analyse_rational(num, den).unwrap();
            assert_eq!(a.poles.iter().map(|p| p.order).sum::<u32>() as usize, den.len() - 1, "{name}");
            for p in &a.poles {
                poles.push((*name, (num.clone(), den.clone(), p.at, p.residue, p.error_estimate)));
            }
            infinity.push((*name, (num.clone(), den.clone(), a.residue_at_infinity)));
        }
        check_method(
            &poles,
            |(_, _, _, res, err)| (*res, Some(*err)),
            |(num, den, at, _, _)| naive_circle_coefficient(|z| horner(num, z) / horner(den, z), *at, 0.25, 8192, -1),
            1e-10,
        );
        check_method(
            &infinity,
            |(_, _, res)| (*res, None),
            |(num, den, _)| -naive_circle_integral(|z| horner(num, z) / horner(den, z), c(0.0, 0.0), 10.0, 8192) / c(0.0, 2.0 * std::f64::consts::PI),
            1e-9,
        );
    }
}

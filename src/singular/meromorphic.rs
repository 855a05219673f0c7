//! The driver: zeros, poles (with orders and residues), essential
//! singularities and branch points of a general meromorphic f inside a region.
//!
//! Method: count N − P by the argument principle; locate candidates as the
//! poles and zeros of an AAA rational approximant of boundary samples
//! (Nakatsukasa, Sète & Trefethen, SIAM J. Sci. Comput. 40 (2018)); refine
//! each by Newton; take each order from the winding number of f on a small
//! circle; check Σ orders(zeros) − Σ orders(poles) against the count and,
//! when they disagree (or AAA cannot resolve the boundary data), subdivide
//! the region's bounding box into quadrants and repeat (recursive
//! subdivision as in P. Kravanja & M. Van Barel, "Computing the Zeros of
//! Analytic Functions", LNM 1727, Springer 2000, ch. 1). Residues come from
//! classify.rs (trapezoidal rule on circles).

use super::aaa::aaa;
use crate::error::Failure;
use super::argument_principle::{count_by_argument_principle, is_cut_error};
use super::classify::classify_point_near;
use super::newton_refine::{newton_refine, Refined, Target};
use super::residue_trapezoid::{laurent_on_circle, recenter_pole};
use super::{eval, is_finite, show, Found, Hints, Kind, RegionResult};
use crate::budget::Budget;
use crate::contour::{Contour, Piece};
use crate::C;

/// Deepest subdivision level (4^3 = 64 leaves at most).
const MAX_DEPTH: usize = 3;
/// Boundary samples given to AAA per (sub)region.
const SAMPLES: usize = 600;
/// Most AAA support points.
const MAX_TERMS: usize = 90;
/// Refuse regions with more zeros and poles than this.
const MAX_POINTS: usize = 400;

/// A located point with signed order (positive: zero, negative: pole).
#[derive(Debug, Clone, Copy)]
struct Pt {
    at: C,
    order: i64,
    loc_err: f64,
}

struct Ctx<'a> {
    f: &'a dyn Fn(C) -> C,
    fd: &'a dyn Fn(C) -> (C, C),
    excluded: Vec<C>,
    excluded_radius: f64,
    warnings: Vec<String>,
    /// AAA poles outside the searched pieces (keeps residue circles away from them).
    outside_poles: Vec<C>,
    merge_tol: f64,
    /// AAA poles inside the region that no winding check confirmed (a
    /// cluster of them marks a possible essential singularity).
    dropped: Vec<C>,
    /// Centres of the smallest cells whose count a branch cut prevented.
    uncounted: Vec<C>,
}

/// Zeros, poles, essential singularities and branch points of f inside `region`.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::contour::Contour;
/// use residuary::singular::{find_singularities, Hints};
/// use residuary::C;
/// // In |z| < 2, 1/cos z has simple poles at ±π/2 with residues ∓1
/// // (Res = 1/(cos)'(±π/2) = 1/∓sin(±π/2); common practice) and no zeros.
/// let f = |z: C| 1.0 / z.cos();
/// let fd = |z: C| (1.0 / z.cos(), z.sin() / (z.cos() * z.cos()));
/// let region = Contour::circle(C::new(0.0, 0.0), 2.0);
/// let r = find_singularities(&f, &fd, &region, &Hints::default(), &mut Budget::default()).unwrap();
/// assert_eq!((r.poles.len(), r.zeros.len(), r.zeros_minus_poles), (2, 0, -2));
/// let half_pi = std::f64::consts::FRAC_PI_2;
/// for (at, res) in [(half_pi, -1.0), (-half_pi, 1.0)] {
///     let p = r.poles.iter().find(|p| (p.at - at).norm() < 1e-9).expect("pole at ±π/2");
///     assert_eq!(p.order, 1);
///     assert!((p.residue.unwrap() - res).norm() < 1e-9, "{p:?}");
/// }
/// ```
pub fn find_singularities(
    f: &dyn Fn(C) -> C,
    fd: &dyn Fn(C) -> (C, C),
    region: &Contour,
    hints: &Hints,
    budget: &mut Budget,
) -> Result<RegionResult, Failure> {
    region.validate()?;
    let mut warnings = Vec::new();
    let count = match count_by_argument_principle(f, region, budget) {
        Ok(n) => Some(n),
        Err(e) if is_cut_error(&e) => {
            warnings.push(format!(
                "{e}; zeros and poles were located piece by piece, each piece checked where no cut crosses it"
            ));
            None
        }
        Err(e) => return Err(e),
    };
    let size = region.size();
    let mut essential = Vec::new();
    let mut branch_points = Vec::new();

    // Points symbolic analysis flagged: classify those inside the region.
    let flagged: Vec<C> = hints
        .essential_candidates
        .iter()
        .chain(&hints.branch_candidates)
        .cloned()
        .collect();
    for &p in &flagged {
        if !matches!(region.winding_number(p), Some(w) if w != 0) {
            continue;
        }
        let others: Vec<C> = flagged
            .iter()
            .cloned()
            .filter(|q| (q - p).norm() > 0.0)
            .collect();
        match classify_point_near(f, p, hints, &others, budget) {
            Ok(r) => match r.kind {
                Kind::Essential => essential.push(p),
                Kind::BranchPoint => branch_points.push(p),
                _ => {}
            },
            Err(e) if e.is_budget() => return Err(e),
            Err(e) => warnings.push(format!(
                "could not classify the flagged point {}: {e}",
                show(p)
            )),
        }
    }
    let excluded: Vec<C> = essential.iter().chain(&branch_points).cloned().collect();
    let mut ctx = Ctx {
        f,
        fd,
        excluded,
        excluded_radius: 0.02 * size,
        warnings: Vec::new(),
        outside_poles: Vec::new(),
        merge_tol: 1e-7 * size,
        dropped: Vec::new(),
        uncounted: Vec::new(),
    };
    let pts = search(&mut ctx, region, count, 0, budget)?;
    warnings.append(&mut ctx.warnings);
    if !ctx.uncounted.is_empty() {
        warnings.push(format!(
            "a branch cut crosses {} small part(s) of the region (near {}): zeros and poles there were located without the argument-principle check, and points on the cut itself are never reported",
            ctx.uncounted.len(),
            ctx.uncounted.iter().take(4).map(|z| show(*z)).collect::<Vec<_>>().join(", ")
        ));
    }
    // Essential singularities no hint named: AAA poles that cluster without
    // converging to a pole.
    let known: Vec<C> = pts.iter().map(|p| p.at).collect();
    for e in unhinted_essential(&mut ctx, region, &known, hints, budget)? {
        if !essential
            .iter()
            .any(|q: &C| (q - e).norm() <= ctx.merge_tol)
        {
            essential.push(e);
        }
    }

    // Residues of the poles, keeping each circle away from every other singularity.
    let pole_sites: Vec<C> = pts.iter().filter(|p| p.order < 0).map(|p| p.at).collect();
    // AAA poles outside a cell that are mere images of a point found in a
    // neighbouring cell (a multiple pole is fitted by a few nearby poles)
    // must not shrink the residue circles.
    let images_removed: Vec<C> = ctx
        .outside_poles
        .iter()
        .cloned()
        .filter(|q| !pts.iter().any(|p| (p.at - q).norm() < 1e-3 * size))
        .collect();
    let mut poles = Vec::new();
    let mut zeros = Vec::new();
    let classify_hints = Hints {
        essential_candidates: Vec::new(),
        branch_candidates: Vec::new(),
        uses_branch_functions: hints.uses_branch_functions,
        poles_accumulate_at_infinity: false,
    };
    for p in &pts {
        if p.order > 0 {
            zeros.push(Found {
                at: p.at,
                order: p.order as u32,
                residue: None,
                error_estimate: p.loc_err,
                principal_part: Vec::new(),
            });
            continue;
        }
        let others: Vec<C> = pole_sites
            .iter()
            .chain(&images_removed)
            .chain(&ctx.excluded)
            .cloned()
            .filter(|q| (q - p.at).norm() > ctx.merge_tol)
            .collect();
        let r = match classify_point_near(f, p.at, &classify_hints, &others, budget) {
            Ok(r) => r,
            Err(e) if e.is_budget() => return Err(e),
            Err(e) => {
                warnings.push(format!(
                    "a pole of order {} at {} could not be examined further: {e}",
                    -p.order,
                    show(p.at)
                ));
                poles.push(Found {
                    at: p.at,
                    order: (-p.order) as u32,
                    residue: None,
                    error_estimate: 0.0,
                    principal_part: Vec::new(),
                });
                continue;
            }
        };
        for w in r.warnings {
            warnings.push(w);
        }
        match r.kind {
            Kind::Pole => {
                let m = r.order.unwrap_or(0);
                if m as i64 != -p.order {
                    warnings.push(format!(
                        "the pole at {} has winding order {} but its Laurent coefficients suggest order {m}; the winding order is reported",
                        show(p.at),
                        -p.order
                    ));
                }
                poles.push(Found {
                    at: p.at,
                    order: (-p.order) as u32,
                    residue: r.residue,
                    error_estimate: r.error_estimate,
                    principal_part: r.principal_part,
                });
            }
            Kind::Essential => essential.push(p.at),
            Kind::BranchPoint => branch_points.push(p.at),
            Kind::Regular | Kind::Removable => warnings.push(format!(
                "a pole-like point at {} turned out to be {}; it is not listed",
                show(p.at),
                r.kind.name()
            )),
        }
    }
    let net: i64 = zeros.iter().map(|z| z.order as i64).sum::<i64>()
        - poles.iter().map(|p| p.order as i64).sum::<i64>();
    if !essential.is_empty() || !branch_points.is_empty() {
        warnings.push("an essential singularity or branch point lies inside the region, so the argument-principle count does not check the zeros and poles found".to_string());
    } else if count.is_some_and(|count| net != count) {
        let count = count.unwrap_or(0);
        warnings.push(format!(
            "the zeros and poles found give N − P = {net}, but the argument principle gives {count}; some may be missing (too many or too close together); try a smaller region"
        ));
    }
    let key = |z: &C| (z.re, z.im);
    poles.sort_by(|x, y| {
        key(&x.at)
            .partial_cmp(&key(&y.at))
            .unwrap_or(std::cmp::Ordering::Equal)
    });
    zeros.sort_by(|x, y| {
        key(&x.at)
            .partial_cmp(&key(&y.at))
            .unwrap_or(std::cmp::Ordering::Equal)
    });
    Ok(RegionResult {
        poles,
        zeros,
        essential,
        branch_points,
        zeros_minus_poles: count.unwrap_or(net),
        boundary_count: count,
        warnings,
    })
}

fn inside(c: &Contour, z: C) -> bool {
    matches!(c.winding_number(z), Some(w) if w != 0)
}

/// Locate the points inside `c` (whose N − P is `count`, `None` when a cut
/// crossing the boundary prevents counting), subdividing when needed.
fn search(
    ctx: &mut Ctx,
    c: &Contour,
    count: Option<i64>,
    depth: usize,
    budget: &mut Budget,
) -> Result<Vec<Pt>, Failure> {
    // Uncountable cells: split first (AAA on data with a jump is costly and poor).
    if count.is_none() && depth < MAX_DEPTH {
        if let Some(all) = subdivide(ctx, c, depth, budget)? {
            return Ok(all);
        }
    }
    let (pts, aaa_ok) = locate(ctx, c, count.is_some(), budget)?;
    let net: i64 = pts.iter().map(|p| p.order).sum();
    let has_excluded = ctx
        .excluded
        .iter()
        .any(|e| inside(c, *e) || c.distance_to_boundary(*e) < ctx.excluded_radius);
    if let Some(count) = count {
        if aaa_ok && (net == count || has_excluded) {
            return Ok(pts);
        }
    }
    if depth >= MAX_DEPTH || count.is_none() {
        match count {
            Some(count) if net != count && !has_excluded => ctx.warnings.push(format!(
                "could not reconcile the count in part of the region near {} (found N − P = {net}, expected {count}) at the deepest subdivision",
                show(mid(c))
            )),
            None => ctx.uncounted.push(mid(c)),
            _ => {}
        }
        return Ok(pts);
    }
    Ok(subdivide(ctx, c, depth, budget)?.unwrap_or(pts))
}

/// Search the four quadrants of c's bounding box (shifting the split point
/// if a zero, pole or branch point lies on a quadrant's edge). `None` when no
/// split could be counted.
fn subdivide(
    ctx: &mut Ctx,
    c: &Contour,
    depth: usize,
    budget: &mut Budget,
) -> Result<Option<Vec<Pt>>, Failure> {
    let (lo, hi) = c.bounding_box();
    let mut last_err: Option<Failure> = None;
    for attempt in 0..4 {
        let shift = [0.0123, -0.0311, 0.0457, 0.0][attempt];
        let xm = lo.re + (hi.re - lo.re) * (0.5 + shift);
        let ym = lo.im + (hi.im - lo.im) * (0.5 - shift * 0.7);
        let quads = [
            Contour::rectangle(lo, C::new(xm, ym)),
            Contour::rectangle(C::new(xm, lo.im), C::new(hi.re, ym)),
            Contour::rectangle(C::new(xm, ym), hi),
            Contour::rectangle(C::new(lo.re, ym), C::new(xm, hi.im)),
        ];
        let mut counts = Vec::new();
        let mut ok = true;
        for q in &quads {
            match count_by_argument_principle(ctx.f, q, budget) {
                Ok(n) => counts.push(Some(n)),
                Err(e) if e.is_budget() => return Err(e),
                Err(e) if is_cut_error(&e) => counts.push(None),
                Err(e) => {
                    last_err = Some(e);
                    ok = false;
                    break;
                }
            }
        }
        if !ok {
            continue;
        }
        let mut all: Vec<Pt> = Vec::new();
        for (q, n) in quads.iter().zip(counts) {
            for p in search(ctx, q, n, depth + 1, budget)? {
                if inside(c, p.at) && !all.iter().any(|o| (o.at - p.at).norm() <= ctx.merge_tol) {
                    all.push(p);
                }
            }
            if all.len() > MAX_POINTS {
                return Err(Failure::invalid(format!(
                    "more than {MAX_POINTS} zeros and poles lie in the region; shrink the region"
                )));
            }
        }
        return Ok(Some(all));
    }
    ctx.warnings.push(format!(
        "could not subdivide the region near {}: {}",
        show(mid(c)),
        last_err.map(|e| e.to_string()).unwrap_or_default()
    ));
    Ok(None)
}

fn mid(c: &Contour) -> C {
    let (lo, hi) = c.bounding_box();
    (lo + hi) * 0.5
}

/// Length of a contour piece (for distributing samples).
fn piece_length(p: &Piece) -> f64 {
    p.length()
}

/// AAA on the boundary of `c`, then Newton and winding orders. Returns the
/// points inside `c` and whether AAA resolved the boundary data.
fn locate(
    ctx: &mut Ctx,
    c: &Contour,
    counted: bool,
    budget: &mut Budget,
) -> Result<(Vec<Pt>, bool), Failure> {
    let pieces = c.pieces();
    let lengths: Vec<f64> = pieces.iter().map(piece_length).collect();
    let total: f64 = lengths.iter().sum();
    let mut zs = Vec::with_capacity(SAMPLES + 64);
    let mut fs = Vec::with_capacity(SAMPLES + 64);
    for (p, len) in pieces.iter().zip(&lengths) {
        // At least a few samples per piece, but not 16 on each of 20 000 edges.
        let least = (SAMPLES / pieces.len().max(1)).clamp(1, 16);
        let n = ((SAMPLES as f64 * len / total).ceil() as usize).max(least);
        for k in 0..n {
            let t = if p.is_periodic() {
                k as f64 / n as f64
            } else {
                (k as f64 + 0.5) / n as f64
            };
            let z = p.point(t);
            let v = eval(ctx.f, z, budget)?;
            if is_finite(v) {
                zs.push(z);
                fs.push(v);
            }
        }
    }
    // Data with a jump (a cut crosses c) cannot be fitted to 1e-12; a
    // shorter fit still places the poles and zeros away from the cut.
    let terms = if counted { MAX_TERMS } else { MAX_TERMS / 3 };
    // A fit costs ~N·m³ (one SVD per step): take no more terms than the budget pays for.
    let terms = terms.min(crate::budget::aaa_terms_within(zs.len(), budget.remaining()));
    let r = aaa(&zs, &fs, 1e-12, terms);
    budget.spend_units(crate::budget::units_for_aaa(zs.len(), r.support.len()))?;
    let size = c.size();
    let near = |z: C| inside(c, z) || c.distance_to_boundary(z) < 0.1 * size;
    let mut refined: Vec<(C, Target, f64)> = Vec::new();
    let poles = r.poles();
    // Only a converged fit's poles outside c are trusted as singularities of f
    // (an unconverged fit, e.g. of data with a jump, scatters spurious ones).
    if r.converged {
        for &p in &poles {
            if !inside(c, p) && c.distance_to_boundary(p) < 3.0 * size {
                ctx.outside_poles.push(p);
            }
        }
    }
    let candidates: Vec<(C, Target)> = poles
        .iter()
        .map(|&p| (p, Target::Pole))
        .chain(r.zeros().into_iter().map(|z| (z, Target::Zero)))
        .filter(|(z, _)| near(*z))
        .collect();
    for (z0, target) in candidates {
        // Newton, or (if it fails, e.g. an inexact derivative) the raw AAA point,
        // which the winding check and the recentring below then confirm or drop.
        let nr = newton_refine(ctx.fd, z0, target, 0.5 * size, budget)?;
        if nr.is_none() && target == Target::Pole && inside(c, z0) {
            ctx.dropped.push(z0);
        }
        let x = nr.unwrap_or(Refined {
            at: z0,
            last_step: f64::NAN,
        });
        {
            if !inside(c, x.at)
                || ctx
                    .excluded
                    .iter()
                    .any(|e| (e - x.at).norm() < ctx.excluded_radius)
            {
                continue;
            }
            if refined
                .iter()
                .any(|(q, t, _)| *t == target && (q - x.at).norm() <= ctx.merge_tol)
            {
                continue;
            }
            refined.push((x.at, target, x.last_step));
        }
    }
    // Orders from winding numbers on small circles.
    let mut pts = Vec::new();
    for (i, &(z, target, step)) in refined.iter().enumerate() {
        let mut gap = 0.05 * size;
        for (j, &(q, _, _)) in refined.iter().enumerate() {
            if i != j {
                gap = gap.min(0.3 * (q - z).norm());
            }
        }
        for q in ctx.outside_poles.iter().chain(&ctx.excluded) {
            let d = (q - z).norm();
            if d > 1e-4 * size {
                gap = gap.min(0.3 * d);
            }
        }
        let mut rho = gap.max(1e-9 * size);
        let mut order = None;
        for _ in 0..3 {
            match count_by_argument_principle(ctx.f, &Contour::circle(z, rho), budget) {
                Ok(n) => {
                    order = Some(n);
                    break;
                }
                Err(e) if e.is_budget() => return Err(e),
                Err(_) => rho /= 3.0,
            }
        }
        match order {
            Some(0) | None => {
                if target == Target::Pole {
                    ctx.dropped.push(z);
                }
            }
            Some(n) => {
                // Derivative-free polish (needed when Newton could not converge).
                let z = if step.is_nan() || n.abs() > 1 || n < 0 || step > 1e-12 * size {
                    recenter_pole(ctx.f, z, n.unsigned_abs() as u32, rho, n > 0, budget)?
                } else {
                    z
                };
                let step = if step.is_nan() { 1e-3 * rho } else { step };
                // A winding number |n| > 1 is one point of order |n| only if
                // the lower Taylor coefficients of f (zero) or 1/f (pole)
                // vanish there; otherwise |n| distinct points crowd inside
                // the circle (e.g. zeros accumulating at an essential point).
                if n.abs() > 1 && !single_point_of_order(ctx.f, z, n, rho, budget)? {
                    ctx.warnings.push(format!(
                        "f winds {n} times around a circle of radius {rho:.1e} about {}, but no single zero or pole of that order is there: zeros or poles crowd there, or an essential singularity sits there; nothing is listed for it (ask for the residue near there to classify it)",
                        show(z)
                    ));
                    if n < 0 {
                        ctx.dropped.push(z);
                    }
                    continue;
                }
                if (n > 0) != (target == Target::Zero) {
                    ctx.warnings.push(format!(
                        "Newton aimed at a {} but the winding number at {} is {n}",
                        if target == Target::Zero {
                            "zero"
                        } else {
                            "pole"
                        },
                        show(z)
                    ));
                }
                if !pts.iter().any(|p: &Pt| (p.at - z).norm() <= ctx.merge_tol) {
                    pts.push(Pt {
                        at: z,
                        order: n,
                        loc_err: step.max(f64::EPSILON * z.norm()),
                    });
                }
            }
        }
    }
    Ok((pts, r.converged))
}

/// Most AAA-pole clusters examined as possible essential singularities.
const MAX_CLUSTERS: usize = 4;

/// Essential singularities that symbolic analysis did not flag. AAA fits an
/// essential singularity with poles that crowd around it without any of them
/// being a pole of f (Nakatsukasa, Sète & Trefethen 2018, §6). For each such
/// cluster, the log-derivative f'/f (meromorphic at p when f = e^{h}, h with
/// a pole at p) is recentred onto its pole by `recenter_pole`, and the point
/// is kept only if `classify_point_near` calls it essential. Clusters that
/// cannot be pinned down are reported as warnings, never as points.
fn unhinted_essential(
    ctx: &mut Ctx,
    region: &Contour,
    known: &[C],
    hints: &Hints,
    budget: &mut Budget,
) -> Result<Vec<C>, Failure> {
    let size = region.size();
    let link = 0.05 * size;
    let loose: Vec<C> = ctx
        .dropped
        .iter()
        .cloned()
        .filter(|z| inside(region, *z))
        .filter(|z| !known.iter().any(|k| (k - z).norm() < 1e-3 * size))
        .filter(|z| !ctx.excluded.iter().any(|e| (e - z).norm() < 2.0 * link))
        .collect();
    // Single-link clusters.
    let mut label: Vec<usize> = (0..loose.len()).collect();
    for i in 0..loose.len() {
        for j in 0..i {
            if (loose[i] - loose[j]).norm() < link {
                let (a, b) = (label[i], label[j]);
                for l in label.iter_mut() {
                    if *l == a {
                        *l = b;
                    }
                }
            }
        }
    }
    let mut clusters: Vec<Vec<C>> = Vec::new();
    let mut seen = Vec::new();
    for (i, &l) in label.iter().enumerate() {
        if seen.contains(&l) {
            continue;
        }
        seen.push(l);
        let members: Vec<C> = (i..loose.len())
            .filter(|&j| label[j] == l)
            .map(|j| loose[j])
            .collect();
        if members.len() >= 3 {
            clusters.push(members);
        }
    }
    clusters.sort_by_key(|m| std::cmp::Reverse(m.len()));
    let mut found = Vec::new();
    let fd = ctx.fd;
    let logd = |z: C| {
        let (v, d) = fd(z);
        d / v
    };
    for members in clusters.into_iter().take(MAX_CLUSTERS) {
        let centre = members.iter().sum::<C>() / members.len() as f64;
        let spread = members
            .iter()
            .map(|z| (z - centre).norm())
            .fold(0.0, f64::max);
        // A circle around the cluster that keeps clear of every known point.
        let mut rad = (3.0 * spread).max(1e-3 * size);
        for k in known.iter().chain(&ctx.outside_poles) {
            let d = (k - centre).norm();
            if d > spread {
                rad = rad.min(0.8 * d);
            }
        }
        let located = match pin_log_derivative_pole(&logd, centre, rad, budget)? {
            Some(p) if inside(region, p) => {
                let others: Vec<C> = known
                    .iter()
                    .cloned()
                    .filter(|k| (k - p).norm() > 0.0)
                    .collect();
                match classify_point_near(ctx.f, p, hints, &others, budget) {
                    Ok(r) if r.kind == Kind::Essential => Some(p),
                    Err(e) if e.is_budget() => return Err(e),
                    _ => None,
                }
            }
            _ => None,
        };
        match located {
            Some(p) => found.push(p),
            None => ctx.warnings.push(format!(
                "{} poles of the rational fit crowd near {} without converging to a pole of f: f may have an essential singularity or an accumulation of singularities there, which was not located; ask for the residue at a point there to classify it",
                members.len(),
                show(centre)
            )),
        }
    }
    Ok(found)
}

/// The pole of g (a log-derivative) inside |z − centre| < rad, if g's
/// principal part there is that of one pole of modest order: the order is
/// the k with the largest normalised |c₋ₖ| (the geometric tail of an offset
/// pole decays from there), and the location comes from `recenter_pole`.
fn pin_log_derivative_pole(
    g: &dyn Fn(C) -> C,
    centre: C,
    rad: f64,
    budget: &mut Budget,
) -> Result<Option<C>, Failure> {
    let Some(l) = laurent_on_circle(g, centre, rad, 16, 4096, budget)? else {
        return Ok(None);
    };
    let (mut m, mut best) = (0usize, 1e-9 * l.max_abs);
    for k in 1..=16usize {
        let v = l.normalized(-(k as i64)).norm();
        if v > best {
            best = v;
            m = k;
        }
    }
    if m == 0 || m > 8 {
        return Ok(None);
    }
    let p = recenter_pole(g, centre, m as u32, rad, false, budget)?;
    Ok(if is_finite(p) && (p - centre).norm() < rad {
        Some(p)
    } else {
        None
    })
}

/// Is there one zero (n > 0) or pole (n < 0) of order |n| at z, rather than
/// |n| separate ones inside |w − z| < rho? For g = f (zero) or 1/f (pole),
/// the Taylor coefficients c₀ … c_{|n|−1} of g about z must be negligible
/// next to c_{|n|} (normalised to the circle).
fn single_point_of_order(
    f: &dyn Fn(C) -> C,
    z: C,
    n: i64,
    rho: f64,
    budget: &mut Budget,
) -> Result<bool, Failure> {
    let m = n.unsigned_abs() as usize;
    let g = |w: C| {
        if n > 0 {
            f(w)
        } else {
            C::new(1.0, 0.0) / f(w)
        }
    };
    let Some(l) = laurent_on_circle(&g, z, rho, m + 1, 4096, budget)? else {
        return Ok(true);
    };
    let lead = l.normalized(m as i64).norm();
    let lower = (0..m as i64)
        .map(|k| l.normalized(k).norm())
        .fold(0.0, f64::max);
    Ok(lower <= 1e-6 * lead.max(f64::MIN_POSITIVE) || lower <= 1e-12 * l.max_abs)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{check_method, naive_circle_coefficient, naive_circle_integral};

    type F = fn(C) -> C;
    type Fd = fn(C) -> (C, C);

    /// (f, f and f', region, how many poles and zeros it holds — counted by hand from the factors)
    fn cases() -> Vec<(&'static str, (F, Fd, Contour, usize, usize))> {
        vec![
            (
                "e^z/((z − 0.5)²(z + 1 + i)) in |z| < 2",
                (
                    |z| z.exp() / ((z - 0.5).powi(2) * (z + C::new(1.0, 1.0))),
                    |z| {
                        let f = z.exp() / ((z - 0.5).powi(2) * (z + C::new(1.0, 1.0)));
                        // f'/f = 1 − 2/(z − 0.5) − 1/(z + 1 + i) (logarithmic derivative)
                        (f, f * (1.0 - 2.0 / (z - 0.5) - 1.0 / (z + C::new(1.0, 1.0))))
                    },
                    Contour::circle(C::new(0.0, 0.0), 2.0),
                    2,
                    0,
                ),
            ),
            (
                "(z² − 2)/(z³ − 1) in the rectangle [−2, 2] × [−1.5, 1.5]",
                (
                    |z| (z * z - 2.0) / (z * z * z - 1.0),
                    |z| {
                        let (p, q) = (z * z - 2.0, z * z * z - 1.0);
                        (p / q, (z * 2.0 * q - p * z * z * 3.0) / (q * q))
                    },
                    Contour::rectangle(C::new(-2.0, -1.5), C::new(2.0, 1.5)),
                    3,
                    2,
                ),
            ),
        ]
    }

    /// Slow references: each pole's residue by the naive circle sum
    /// (`reference::naive_circle_coefficient`, radius 0.2, 8192 points), and
    /// each point's location by the centroid (∮ z f'/f dz)/(∮ f'/f dz) of
    /// the argument principle on a circle of radius 0.2 about it (Ahlfors,
    /// "Complex Analysis", ch. 5 §3.2 — from memory), by the naive circle sum.
    #[test]
    fn residues_and_locations_match_naive_circle_sums() {
        let mut residues = Vec::new();
        let mut points = Vec::new();
        for (name, (f, fd, region, n_poles, n_zeros)) in cases() {
            let r = find_singularities(&f, &fd, &region, &Hints::default(), &mut Budget::new(50_000_000)).unwrap();
            assert_eq!((r.poles.len(), r.zeros.len()), (n_poles, n_zeros), "{name}: {r:?}");
            for p in &r.poles {
                residues.push((name, (f, p.at, p.residue.unwrap(), p.error_estimate)));
                points.push((name, (fd, p.at, p.error_estimate.max(1e-12))));
            }
            for z in &r.zeros {
                points.push((name, (fd, z.at, z.error_estimate)));
            }
        }
        check_method(
            &residues,
            |&(_, _, res, err)| (res, Some(err)),
            |&(f, at, _, _)| naive_circle_coefficient(f, at, 0.2, 8192, -1),
            1e-10,
        );
        check_method(
            &points,
            |&(_, at, _)| (at, None),
            |&(fd, at, _)| {
                let log_d = |z: C| {
                    let (v, d) = fd(z);
                    d / v
                };
                naive_circle_integral(|z| z * log_d(z), at, 0.2, 8192) / naive_circle_integral(log_d, at, 0.2, 8192)
            },
            1e-9,
        );
    }
}

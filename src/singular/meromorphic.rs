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
use super::argument_principle::count_by_argument_principle;
use super::classify::classify_point_near;
use super::newton_refine::{newton_refine, Refined, Target};
use super::residue_trapezoid::recenter_pole;
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
}

/// Zeros, poles, essential singularities and branch points of f inside `region`.
pub fn find_singularities(
    f: &dyn Fn(C) -> C,
    fd: &dyn Fn(C) -> (C, C),
    region: &Contour,
    hints: &Hints,
    budget: &mut Budget,
) -> Result<RegionResult, String> {
    region.validate()?;
    let count = count_by_argument_principle(f, region, budget)?;
    let size = region.size();
    let mut essential = Vec::new();
    let mut branch_points = Vec::new();
    let mut warnings = Vec::new();

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
            Err(e) if e.contains("budget") => return Err(e),
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
    };
    let pts = search(&mut ctx, region, count, 0, budget)?;
    warnings.append(&mut ctx.warnings);

    // Residues of the poles, keeping each circle away from every other singularity.
    let pole_sites: Vec<C> = pts.iter().filter(|p| p.order < 0).map(|p| p.at).collect();
    let mut poles = Vec::new();
    let mut zeros = Vec::new();
    let classify_hints = Hints {
        essential_candidates: Vec::new(),
        branch_candidates: Vec::new(),
        uses_branch_functions: hints.uses_branch_functions,
    };
    for p in &pts {
        if p.order > 0 {
            zeros.push(Found {
                at: p.at,
                order: p.order as u32,
                residue: None,
                error_estimate: p.loc_err,
            });
            continue;
        }
        let others: Vec<C> = pole_sites
            .iter()
            .chain(&ctx.outside_poles)
            .chain(&ctx.excluded)
            .cloned()
            .filter(|q| (q - p.at).norm() > ctx.merge_tol)
            .collect();
        let r = classify_point_near(f, p.at, &classify_hints, &others, budget)?;
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
    } else if net != count {
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
        zeros_minus_poles: count,
        warnings,
    })
}

fn inside(c: &Contour, z: C) -> bool {
    matches!(c.winding_number(z), Some(w) if w != 0)
}

/// Locate the points inside `c` (whose N − P is `count`), subdividing when needed.
fn search(
    ctx: &mut Ctx,
    c: &Contour,
    count: i64,
    depth: usize,
    budget: &mut Budget,
) -> Result<Vec<Pt>, String> {
    let (pts, aaa_ok) = locate(ctx, c, budget)?;
    let net: i64 = pts.iter().map(|p| p.order).sum();
    let has_excluded = ctx
        .excluded
        .iter()
        .any(|e| inside(c, *e) || c.distance_to_boundary(*e) < ctx.excluded_radius);
    if aaa_ok && (net == count || has_excluded) {
        return Ok(pts);
    }
    if depth >= MAX_DEPTH {
        if net != count && !has_excluded {
            ctx.warnings.push(format!(
                "could not reconcile the count in part of the region near {} (found N − P = {net}, expected {count}) at the deepest subdivision",
                show(mid(c))
            ));
        }
        return Ok(pts);
    }
    let (lo, hi) = c.bounding_box();
    let mut last_err = String::new();
    for attempt in 0..4 {
        let shift = [0.0, 0.0123, -0.0311, 0.0457][attempt];
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
                Ok(n) => counts.push(n),
                Err(e) if e.contains("budget") => return Err(e),
                Err(e) => {
                    last_err = e;
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
                return Err(format!(
                    "more than {MAX_POINTS} zeros and poles lie in the region; shrink the region"
                ));
            }
        }
        return Ok(all);
    }
    ctx.warnings.push(format!(
        "could not subdivide the region near {}: {last_err}",
        show(mid(c))
    ));
    Ok(pts)
}

fn mid(c: &Contour) -> C {
    let (lo, hi) = c.bounding_box();
    (lo + hi) * 0.5
}

/// Length of a contour piece (for distributing samples).
fn piece_length(p: &Piece) -> f64 {
    match *p {
        Piece::Segment { from, to } => (to - from).norm(),
        Piece::Ellipse { .. } => (0..64)
            .map(|k| (p.point((k + 1) as f64 / 64.0) - p.point(k as f64 / 64.0)).norm())
            .sum(),
    }
}

/// AAA on the boundary of `c`, then Newton and winding orders. Returns the
/// points inside `c` and whether AAA resolved the boundary data.
fn locate(ctx: &mut Ctx, c: &Contour, budget: &mut Budget) -> Result<(Vec<Pt>, bool), String> {
    let pieces = c.pieces();
    let lengths: Vec<f64> = pieces.iter().map(piece_length).collect();
    let total: f64 = lengths.iter().sum();
    let mut zs = Vec::with_capacity(SAMPLES + 64);
    let mut fs = Vec::with_capacity(SAMPLES + 64);
    for (p, len) in pieces.iter().zip(&lengths) {
        let n = ((SAMPLES as f64 * len / total).ceil() as usize).max(16);
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
    let r = aaa(&zs, &fs, 1e-12, MAX_TERMS);
    let size = c.size();
    let near = |z: C| inside(c, z) || c.distance_to_boundary(z) < 0.1 * size;
    let mut refined: Vec<(C, Target, f64)> = Vec::new();
    let poles = r.poles();
    for &p in &poles {
        if !inside(c, p) && c.distance_to_boundary(p) < 3.0 * size {
            ctx.outside_poles.push(p);
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
                Err(e) if e.contains("budget") => return Err(e),
                Err(_) => rho /= 3.0,
            }
        }
        match order {
            Some(0) | None => {}
            Some(n) => {
                // Derivative-free polish (needed when Newton could not converge).
                let z = if step.is_nan() || n.abs() > 1 || n < 0 || step > 1e-12 * size {
                    recenter_pole(ctx.f, z, n.unsigned_abs() as u32, rho, n > 0, budget)?
                } else {
                    z
                };
                let step = if step.is_nan() { 1e-3 * rho } else { step };
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

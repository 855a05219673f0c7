//! `contour_integral`: ∮ f dz computed three independent ways, with any
//! disagreement shown rather than hidden.
//!
//! 1. **Quadrature**: periodic trapezoidal rule on circles and ellipses,
//!    adaptive Gauss–Kronrod on segments (`quad::contour_quadrature`).
//! 2. **Inside residues**: the residue theorem, ∮_Γ f dz = 2πi Σ_a w(a) Res_a f,
//!    over the singular points a with winding number w(a) ≠ 0. Rational f: exact
//!    poles from polynomial algebra; other f: poles and essential points located
//!    numerically on a region covering the contour. Not available when a branch
//!    point lies inside or a branch cut crosses the contour (f is then not
//!    analytic inside, so the theorem does not apply).
//! 3. **Outside residues** (rational f only): with Σ_a Res_a + Res∞ = 0, for any
//!    integer k, ∮ f = 2πi Σ_a (w(a) − k) Res_a − 2πi k Res∞. When every pole
//!    with w ≠ 0 has the same winding k (k = 1 for a counter-clockwise simple
//!    contour, −1 for a clockwise one, or a self-intersecting polygon whose poles
//!    all lie in lobes of equal winding), the inside poles drop out:
//!    ∮ f = −2πi k (Σ_{w(a)=0} Res_a + Res∞). Res∞ comes from the expansion at
//!    infinity, not from the finite residues, so this is a genuine check. Poles
//!    with two different nonzero windings: not available (a warning says so).
//!    For non-rational f it is not available either: it needs every singularity
//!    in the plane, which sampling cannot certify.

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use crate::api::input::{budget, checked_contour, compile, hints};
use crate::text;
use crate::api::wire::{pair, ContourRequest};
use crate::budget::Budget;
use crate::contour::Contour;
use crate::api::error::{ApiError, ErrorCode};
use crate::expr::Function;
use crate::quad::contour_quadrature::{contour_integral, on_piece_error};
use crate::quad::Tolerance;
use crate::quad::{gauss_kronrod, QuadResult};
use crate::singular::cut_crossing::{cut_crossings, Crossing};
use crate::singular::rational_poles::analyse_rational_polished;
use crate::singular::{classify_point, find_singularities, Kind, RegionResult};
use crate::error::Failure;
use crate::C;
use std::f64::consts::PI;
use serde::{Deserialize, Serialize};

/// `contour_integral`: ∮ f dz computed three independent ways (quadrature,
/// residues inside, residues outside plus infinity), disagreement shown.
pub type ContourIntegralRequest = ContourRequest;

/// A singular point with the contour's winding number about it.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct WindingOut {
    pub at: [f64; 2],
    pub winding: i32,
    /// `"pole"`, `"essential"` or `"branch_point"`.
    pub kind: String,
    #[serde(skip_serializing_if = "Option::is_none", default)]
    pub order: Option<u32>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ContourIntegralResponse {
    pub value: [f64; 2],
    pub by_quadrature: [f64; 2],
    pub by_inside_residues: Option<[f64; 2]>,
    pub by_outside_residues: Option<[f64; 2]>,
    /// Largest pairwise |difference| among the available ways.
    pub max_discrepancy: f64,
    pub winding: Vec<WindingOut>,
    /// Which way `value` is: `"quadrature"`, `"inside_residues"` or `"outside_residues"`.
    pub value_from: String,
    pub error_estimate: f64,
    pub quadrature_error_estimate: f64,
    pub inside_residues_error_estimate: Option<f64>,
    pub outside_residues_error_estimate: Option<f64>,
    /// One sentence: do the ways agree, and to what.
    pub agreement: String,
    /// `"rational"` (exact polynomial algebra) or `"numerical"`.
    pub method: String,
    pub warnings: Vec<String>,
}

/// A singular point closer to the contour than this fraction of its size gets a warning.
const NEAR_FRACTION: f64 = 1e-2;
/// Two ways agree when they differ by at most this many times their summed error estimates.
const AGREEMENT_FACTOR: f64 = 10.0;
/// "Agree" is said only when the ways also differ by at most this fraction of the value's size (or 1).
const CLOSE_AGREEMENT: f64 = 1e-8;

/// One way of computing the integral.
#[derive(Debug, Clone, Copy)]
struct Way {
    value: C,
    error: f64,
}

/// A singular point, its kind and order, and the contour's winding number about it.
#[derive(Debug, Clone)]
struct Singular {
    at: C,
    kind: Kind,
    order: Option<u32>,
    residue: Option<(C, f64)>,
    winding: Option<i32>,
}

/// What the residue side produced.
struct ResidueWays {
    points: Vec<Singular>,
    /// Where a branch cut crosses the contour (the quadrature splits there).
    crossings: Vec<Crossing>,
    inside: Option<Way>,
    outside: Option<Way>,
}

fn two_pi_i() -> C {
    C::new(0.0, 2.0 * PI)
}

fn kind_name(k: Kind) -> &'static str {
    k.name()
}

pub fn run(req: &ContourIntegralRequest) -> Result<ContourIntegralResponse, ApiError> {
    let f = compile(&req.function)?;
    let contour = checked_contour(&req.contour, "contour")?;
    let mut budget = budget(req.max_evaluations);
    let mut warnings = Vec::new();
    let (ways, method) = match f.rational() {
        Some(r) => (
            rational_ways(&f, &r.num, &r.den, contour, &mut warnings)?,
            "rational",
        ),
        None => (
            general_ways(&f, contour, &mut budget, &mut warnings)?,
            "numerical",
        ),
    };
    check_on_and_near(&ways.points, contour, &mut warnings)?;

    let eval = |z: C| f.eval(z);
    let mut g = eval;
    let q = if ways.crossings.is_empty() {
        contour_integral(&mut g, contour, Tolerance::default(), &mut budget)
    } else {
        split_quadrature(&mut g, contour, &ways.crossings, &mut budget)
    }
    ?;
    if !q.converged {
        warnings.push(format!(
            "the quadrature did not reach its tolerance (error estimate {:.1e}); a singularity may lie close to the contour or f may jump across it",
            q.error_estimate
        ));
    }
    let quadrature = Way {
        value: q.value,
        error: q.error_estimate,
    };
    let named = [
        ("quadrature", Some(quadrature)),
        ("inside residues", ways.inside),
        ("outside residues", ways.outside),
    ];
    let available: Vec<(&str, Way)> = named
        .iter()
        .filter_map(|(n, w)| w.map(|w| (*n, w)))
        .collect();
    let (max_discrepancy, agreement) = agreement(&available, &ways.points, contour, &mut warnings);

    // The value: residues for rational f (exact algebra), otherwise the smallest error estimate.
    let pool: Vec<&(&str, Way)> = if method == "rational" && available.len() > 1 {
        available.iter().skip(1).collect()
    } else {
        available.iter().collect()
    };
    let best = pool
        .iter()
        .min_by(|a, b| a.1.error.total_cmp(&b.1.error))
        .map(|w| **w)
        .unwrap_or(("quadrature", quadrature));

    let winding = ways
        .points
        .iter()
        .filter_map(|p| {
            p.winding.map(|w| WindingOut {
                at: pair(p.at),
                winding: w,
                kind: kind_name(p.kind).into(),
                order: p.order,
            })
        })
        .collect();
    Ok(ContourIntegralResponse {
        value: pair(best.1.value),
        by_quadrature: pair(quadrature.value),
        by_inside_residues: ways.inside.map(|w| pair(w.value)),
        by_outside_residues: ways.outside.map(|w| pair(w.value)),
        max_discrepancy,
        winding,
        value_from: best.0.replace(' ', "_"),
        error_estimate: best.1.error,
        quadrature_error_estimate: quadrature.error,
        inside_residues_error_estimate: ways.inside.map(|w| w.error),
        outside_residues_error_estimate: ways.outside.map(|w| w.error),
        agreement,
        method: method.into(),
        warnings,
    })
}

/// Largest pairwise difference and a sentence about agreement; disagreements also become warnings.
fn agreement(
    ways: &[(&str, Way)],
    points: &[Singular],
    contour: &Contour,
    warnings: &mut Vec<String>,
) -> (f64, String) {
    let mut max_d: f64 = 0.0;
    let mut worst: Option<(usize, usize, f64)> = None;
    for i in 0..ways.len() {
        for j in i + 1..ways.len() {
            let d = (ways[i].1.value - ways[j].1.value).norm();
            max_d = max_d.max(d);
            let allowed = AGREEMENT_FACTOR * (ways[i].1.error + ways[j].1.error);
            let excess = d / allowed.max(f64::MIN_POSITIVE);
            if !(d <= allowed) && worst.is_none_or(|(_, _, e)| excess > e) {
                worst = Some((i, j, excess));
            }
        }
    }
    let missing: Vec<&str> = ["inside residues", "outside residues"]
        .into_iter()
        .filter(|n| !ways.iter().any(|(m, _)| m == n))
        .collect();
    let not_available = if missing.is_empty() {
        String::new()
    } else {
        format!(" ({} not available; see warnings)", missing.join(" and "))
    };
    if ways.len() == 1 {
        return (
            0.0,
            format!("only the quadrature is available{not_available}"),
        );
    }
    let near = points
        .iter()
        .any(|p| contour.distance_to_boundary(p.at) < NEAR_FRACTION * contour.size());
    let why = if near {
        "a singularity lies close to the contour, which slows the quadrature and makes the residue side sensitive to its exact position"
    } else {
        "a singularity may have been missed or lie close to the contour; try a slightly different contour"
    };
    let Some((i, j, _)) = worst else {
        let who = if ways.len() == 3 {
            "all three ways".to_string()
        } else {
            format!("{} and {}", ways[0].0, ways[1].0)
        };
        let scale = ways.iter().map(|w| w.1.value.norm()).fold(1.0, f64::max);
        if max_d <= CLOSE_AGREEMENT * scale {
            return (max_d, format!("{who} agree to {max_d:.1e}{not_available}"));
        }
        // Consistent only because one error estimate is large: say so.
        let loose = ways
            .iter()
            .max_by(|a, b| a.1.error.total_cmp(&b.1.error))
            .map(|w| (w.0, w.1.error))
            .unwrap_or(("quadrature", 0.0));
        let text = format!(
            "{who} differ by up to {max_d:.1e}; only the large error estimate of the {} ({:.1e}) covers that: {why}",
            loose.0, loose.1
        );
        warnings.push(text.clone());
        return (max_d, text);
    };
    let text = format!(
        "{} and {} differ by {:.1e}, more than their error estimates ({:.1e}, {:.1e}) allow: {why}",
        ways[i].0,
        ways[j].0,
        (ways[i].1.value - ways[j].1.value).norm(),
        ways[i].1.error,
        ways[j].1.error
    );
    warnings.push(text.clone());
    (max_d, text)
}

/// Poles or essential points on the contour are an error; close ones a warning.
fn check_on_and_near(
    points: &[Singular],
    contour: &Contour,
    warnings: &mut Vec<String>,
) -> Result<(), ApiError> {
    let size = contour.size();
    for p in points {
        let what = match p.kind {
            Kind::Pole => "a pole",
            Kind::Essential => "an essential singularity",
            _ => "a branch point",
        };
        if p.winding.is_none() {
            if p.kind == Kind::BranchPoint {
                warnings.push(format!(
                    "f has a branch point at {} on the contour; the integral exists only if f is integrable there",
                    text::value(p.at)
                ));
                continue;
            }
            return Err(ApiError::new(ErrorCode::OnContour, format!(
                "f has {what} at {} on the contour; move the contour",
                text::value(p.at)
            )));
        }
        let d = contour.distance_to_boundary(p.at);
        if d < NEAR_FRACTION * size {
            warnings.push(format!(
                "{what} at {} lies only {d:.1e} from the contour ({:.1e} of its size): the quadrature converges slowly and a small change of the contour would change which side it is on",
                text::value(p.at),
                d / size
            ));
        }
    }
    Ok(())
}

/// ∮ f dz with every piece split where f jumps, each part by adaptive
/// Gauss–Kronrod (`quad::gauss_kronrod`): the rule's nodes are interior, so
/// each part sees one side of the cut, and the integral converges at the
/// rate of a smooth integrand instead of the trapezoidal rule's O(1/n) on a
/// jump.
fn split_quadrature(
    f: &mut dyn FnMut(C) -> C,
    contour: &Contour,
    crossings: &[Crossing],
    budget: &mut Budget,
) -> Result<QuadResult, Failure> {
    let pieces = contour.pieces();
    let mut total = QuadResult::zero();
    let parts = pieces.len() + crossings.len();
    let tol = Tolerance {
        abs: 0.0,
        rel: Tolerance::default().rel / parts as f64,
    };
    for (i, piece) in pieces.iter().enumerate() {
        let mut cuts: Vec<f64> = crossings
            .iter()
            .filter(|c| c.piece == i)
            .map(|c| c.t)
            .collect();
        cuts.sort_by(|a, b| a.total_cmp(b));
        let mut ends = vec![0.0];
        ends.extend(cuts.into_iter().filter(|t| *t > 0.0 && *t < 1.0));
        ends.push(1.0);
        for w in ends.windows(2) {
            if w[1] <= w[0] {
                continue;
            }
            let mut g = |t: f64| f(piece.point(t)) * piece.derivative(t);
            let r = gauss_kronrod::integrate(&mut g, w[0], w[1], tol, budget);
            total.absorb(r.map_err(|e| on_piece_error(piece, e))?);
        }
    }
    Ok(total)
}

/// Rounding in a sum of terms of this total magnitude.
fn rounding(magnitude: f64) -> f64 {
    8.0 * f64::EPSILON * magnitude
}

/// +1 for a counter-clockwise contour, −1 for a clockwise polygon (by signed area).
fn orientation(contour: &Contour) -> i32 {
    let v = contour.vertices();
    if v.is_empty() {
        return 1;
    }
    let n = v.len();
    let area: f64 = (0..n)
        .map(|k| v[k].re * v[(k + 1) % n].im - v[(k + 1) % n].re * v[k].im)
        .sum();
    if area < 0.0 {
        -1
    } else {
        1
    }
}

fn rational_ways(
    f: &Function,
    num: &[C],
    den: &[C],
    contour: &Contour,
    warnings: &mut Vec<String>,
) -> Result<ResidueWays, ApiError> {
    let a = analyse_rational_polished(num, den, &|z| f.eval_d(z))?;
    warnings.extend(a.warnings.iter().cloned());
    let points: Vec<Singular> = a
        .poles
        .iter()
        .map(|p| Singular {
            at: p.at,
            kind: Kind::Pole,
            order: Some(p.order),
            residue: Some((p.residue, p.error_estimate)),
            winding: contour.winding_number(p.at),
        })
        .collect();
    if points.iter().any(|p| p.winding.is_none()) {
        // check_on_and_near turns this into the error message.
        return Ok(ResidueWays {
            points,
            crossings: Vec::new(),
            inside: None,
            outside: None,
        });
    }
    let inside = inside_sum(&points);
    let windings: Vec<i32> = {
        let mut w: Vec<i32> = points
            .iter()
            .filter_map(|p| p.winding)
            .filter(|&w| w != 0)
            .collect();
        w.sort();
        w.dedup();
        w
    };
    let outside = if windings.len() > 1 {
        warnings.push(format!(
            "the contour winds around f's poles with different winding numbers ({}), so the outside-residue form of the residue theorem does not isolate the outside poles; it is not computed",
            windings.iter().map(|w| w.to_string()).collect::<Vec<_>>().join(", ")
        ));
        None
    } else {
        let k = windings
            .first()
            .copied()
            .unwrap_or_else(|| orientation(contour));
        let mut sum = a.residue_at_infinity;
        let scale = num.iter().map(|c| c.norm()).fold(0.0, f64::max)
            / den.last().map(|d| d.norm()).unwrap_or(1.0);
        let mut err = 8.0
            * (num.len() + den.len()) as f64
            * f64::EPSILON
            * (a.residue_at_infinity.norm() + scale);
        let mut magnitude = a.residue_at_infinity.norm();
        for p in points.iter().filter(|p| p.winding == Some(0)) {
            if let Some((r, e)) = p.residue {
                sum += r;
                err += e;
                magnitude += r.norm();
            }
        }
        let factor = -two_pi_i() * k as f64;
        Some(Way {
            value: factor * sum,
            error: factor.norm() * (err + rounding(magnitude)),
        })
    };
    Ok(ResidueWays {
        points,
        crossings: Vec::new(),
        inside,
        outside,
    })
}

/// 2πi Σ w(a) Res_a over points with w ≠ 0; `None` if a residue is missing.
fn inside_sum(points: &[Singular]) -> Option<Way> {
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    let mut magnitude = 0.0;
    for p in points {
        let w = p.winding.unwrap_or(0);
        if w == 0 {
            continue;
        }
        let (r, e) = p.residue?;
        sum += r * w as f64;
        err += e * w.abs() as f64;
        magnitude += r.norm() * w.abs() as f64;
    }
    Some(Way {
        value: two_pi_i() * sum,
        error: 2.0 * PI * (err + rounding(magnitude)),
    })
}

/// Regions that cover every point with nonzero winding, slightly larger than
/// the contour first (so singularities just outside are found and reported),
/// then closer fits in case a larger boundary passes through a zero or pole.
pub(crate) fn covering_regions(contour: &Contour) -> Vec<Contour> {
    let grow = [1.05, 1.02, 1.0];
    match contour {
        Contour::Circle { center, radius } => grow
            .iter()
            .map(|g| Contour::Circle {
                center: *center,
                radius: radius * g,
            })
            .collect(),
        Contour::Ellipse {
            center,
            semi_axes,
            angle,
        } => grow
            .iter()
            .map(|g| Contour::Ellipse {
                center: *center,
                semi_axes: [semi_axes[0] * g, semi_axes[1] * g],
                angle: *angle,
            })
            .collect(),
        Contour::Rectangle { .. } | Contour::Polygon { .. } => {
            // A polygon as a region would be searched with its own orientation;
            // its (counter-clockwise) bounding box covers it.
            let (lo, hi) = contour.bounding_box();
            let size = contour.size();
            [0.05, 0.02, 0.005]
                .iter()
                .map(|m| {
                    let pad = C::new(m * size, m * size);
                    Contour::rectangle(lo - pad, hi + pad)
                })
                .collect()
        }
    }
}

/// Zeros, poles, essential points and branch points of a general f on the
/// first covering region where the search succeeds.
pub(crate) fn search_cover(
    f: &Function,
    regions: &[Contour],
    budget: &mut Budget,
) -> Result<RegionResult, Failure> {
    let hints = hints(f);
    let eval = |z: C| f.eval(z);
    let eval_d = |z: C| f.eval_d(z);
    let mut last = Failure::invalid("no region to search");
    for region in regions {
        match find_singularities(&eval, &eval_d, region, &hints, budget) {
            Ok(found) => return Ok(found),
            Err(e) if e.is_budget() => return Err(e),
            Err(e) => last = e,
        }
    }
    Err(last)
}

fn general_ways(
    f: &Function,
    contour: &Contour,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<ResidueWays, ApiError> {
    let hints = hints(f);
    let eval = |z: C| f.eval(z);
    let mut blocked: Option<String> = None;
    let mut crossings = Vec::new();
    if hints.uses_branch_functions {
        match cut_crossings(&eval, contour, budget) {
            Ok(x) if !x.is_empty() => {
                let at: Vec<String> = x.iter().take(4).map(|c| text::value(c.at)).collect();
                crossings = x;
                blocked = Some(format!(
                    "f jumps across a branch cut where the cut crosses the contour (near {}): f is not analytic inside, so the residue theorem does not apply; the quadrature integrates the principal branch as written",
                    at.join(", ")
                ));
            }
            Ok(_) => {}
            Err(e) => return Err(ApiError::from(e)),
        }
    }
    let found = match search_cover(f, &covering_regions(contour), budget) {
        Ok(found) => found,
        Err(e) => {
            warnings.push(blocked.unwrap_or_else(|| format!("the singularities could not be located, so the residue side is not computed: {e}")));
            warnings.push(outside_reason());
            return Ok(ResidueWays {
                points: Vec::new(),
                crossings,
                inside: None,
                outside: None,
            });
        }
    };
    warnings.extend(
        found
            .warnings
            .iter()
            .map(|w| format!("singularity search: {w}")),
    );
    let mut points: Vec<Singular> = found
        .poles
        .iter()
        .map(|p| Singular {
            at: p.at,
            kind: Kind::Pole,
            order: Some(p.order),
            residue: p.residue.map(|r| (r, p.error_estimate)),
            winding: contour.winding_number(p.at),
        })
        .collect();
    for &z in &found.essential {
        let winding = contour.winding_number(z);
        let residue = if matches!(winding, Some(w) if w != 0) {
            match classify_point(&eval, z, &hints, budget) {
                Ok(r) if r.kind == Kind::Essential => r.residue.map(|c| (c, r.error_estimate)),
                Ok(_) => None,
                Err(e) if e.is_budget() => return Err(ApiError::from(e)),
                Err(_) => None,
            }
        } else {
            None
        };
        if residue.is_none() && matches!(winding, Some(w) if w != 0) {
            blocked.get_or_insert(format!(
                "the residue of the essential singularity at {} could not be computed, so the inside-residue sum is not available",
                text::value(z)
            ));
        }
        points.push(Singular {
            at: z,
            kind: Kind::Essential,
            order: None,
            residue,
            winding,
        });
    }
    for &z in &found.branch_points {
        let winding = contour.winding_number(z);
        if matches!(winding, Some(w) if w != 0) {
            blocked.get_or_insert(format!(
                "a branch point of f lies inside the contour at {}: f is not single-valued there, so the residue theorem does not apply",
                text::value(z)
            ));
        }
        points.push(Singular {
            at: z,
            kind: Kind::BranchPoint,
            order: None,
            residue: None,
            winding,
        });
    }
    if points.iter().any(|p| {
        p.kind == Kind::Pole && p.residue.is_none() && matches!(p.winding, Some(w) if w != 0)
    }) {
        blocked.get_or_insert(
            "a pole's residue could not be computed, so the inside-residue sum is not available"
                .into(),
        );
    }
    let inside = match blocked {
        Some(reason) => {
            warnings.push(reason);
            None
        }
        None => inside_sum(&points),
    };
    warnings.push(outside_reason());
    Ok(ResidueWays {
        points,
        crossings,
        inside,
        outside: None,
    })
}

fn outside_reason() -> String {
    "outside residues are computed for rational f only: for other f they need every singularity in the whole plane and the residue at infinity, which sampling cannot certify".into()
}

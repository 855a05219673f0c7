//! Laurent coefficients by the FFT of samples on circles (Cauchy integrals by
//! the trapezoidal rule).
//!
//! Method: c_n = (1/2πi) ∮ f(z) (z − a)^{−n−1} dz on |z − a| = ρ, discretised
//! by the N-point trapezoidal rule, which is one FFT:
//! c_n ≈ (1/N) Σ_k f(a + ρω^k) ω^{−nk} ρ^{−n}, ω = e^{2πi/N}.
//! The choice of radius follows F. Bornemann, "Accuracy and stability of
//! computing high-order derivatives of analytic functions by Cauchy
//! integrals", Found. Comput. Math. 11 (2011) 1–63: the rounding error of c_n on
//! |z − a| = ρ is about ε·max|f|·ρ^{−n}, so nonnegative n prefer large circles
//! and negative n small ones. We sample on a ladder of radii inside the
//! annulus and keep, for every n, the radius with the smallest error estimate.
//!
//! On each circle N (a power of two) is doubled, reusing old samples, until
//! the coefficients stop changing (aliasing below the rounding floor) or a
//! cap is reached. Error estimate per coefficient: 10·|c_n(N) − c_n(N/2)|
//! plus the rounding floor ε·max|f|·ρ^{−n}·(4 + log₂N) + 4ε(|n|+1)|c_n|.
//! Results from different radii must agree within their estimates: a large
//! disagreement means a singularity lies between the circles and the request
//! is refused; a small one widens the estimate.
//!
//! Around infinity the series is f(z) = Σ c_n z^n on r1 < |z| < ∞ (n < 0 are
//! the decaying terms, Res∞ f = −c_{−1}). This is the expansion of
//! g(w) = f(1/w) on 0 < |w| < 1/r1 with the index reversed: sampling f on
//! |z| = ρ is sampling g on |w| = 1/ρ, so the same circles serve both.

use crate::budget::Budget;
use crate::text;
use crate::error::Failure;
use crate::C;
use crate::cauchy::circle::CircleSamples;

/// Most coefficients one request may ask for.
pub const MAX_COEFFICIENTS: i64 = 4096;
/// Largest |n| accepted.
pub const MAX_INDEX: i64 = 1_000_000;
/// Largest |center| accepted: beyond it |z − center|² overflows double precision.
pub const MAX_CENTER: f64 = 1e150;
/// Most samples on one circle.
pub const MAX_SAMPLES_PER_CIRCLE: usize = 1 << 16;

/// Where the series is centred.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Center {
    Point(C),
    /// Expansion in powers of z valid for |z| > inner (outer is ignored).
    Infinity,
}

/// Coefficients c_from..=c_to of f on inner < |z − a| < outer.
/// `outer` may be `f64::INFINITY`; `inner` may be 0 (punctured disk).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LaurentRequest {
    pub center: Center,
    pub inner: f64,
    pub outer: f64,
    pub from: i64,
    pub to: i64,
}

/// The coefficients with per-coefficient error estimates (upper bounds meant).
#[derive(Debug, Clone, PartialEq)]
pub struct LaurentResult {
    /// (n, c_n) for n = from..=to.
    pub coefficients: Vec<(i64, C)>,
    /// Error estimate of each coefficient, same order.
    pub errors: Vec<f64>,
    /// The largest of `errors`.
    pub error_estimate: f64,
    /// The circle radius (|z − a|, or |z| around infinity) each coefficient came from.
    pub radius_used: Vec<f64>,
    /// Evaluations of f spent.
    pub samples: usize,
}

/// The coefficients c_from..=c_to from exactly `samples` points on one circle
/// |z − center| = radius, by one FFT (no error control). This is the fast
/// kernel; [`laurent`] adds radius choice and convergence checks.
pub fn coefficients_on_circle(
    f: &mut dyn FnMut(C) -> C,
    center: C,
    radius: f64,
    samples: usize,
    from: i64,
    to: i64,
    budget: &mut Budget,
) -> Result<Vec<C>, Failure> {
    if samples == 0 || !(radius.is_finite() && radius > 0.0) || from > to {
        return Err(Failure::invalid("need samples > 0, a positive finite radius and from ≤ to"));
    }
    match CircleSamples::take_finite(f, center, radius, 0.0, samples, budget)? {
        Ok(s) => Ok(s.coefficients(from, to)),
        Err(z) => Err(Failure::not_finite(not_finite_message(z, center, radius)).at(z)),
    }
}

/// Laurent coefficients of f; see the module doc for the method.
///
/// `known_singularities` are singular points found elsewhere; the request is
/// refused, naming one, if any lies strictly inside the annulus.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::series::laurent_fft::{laurent, Center, LaurentRequest};
/// use residuary::C;
/// // e^z/z³ = Σ z^{n−3}/n!: c_{−1} = 1/2! = 1/2 and c_1 = 1/4! = 1/24 (DLMF 4.2.19).
/// let req = LaurentRequest { center: Center::Point(C::new(0.0, 0.0)), inner: 0.0,
///                            outer: f64::INFINITY, from: -3, to: 1 };
/// let r = laurent(|z: C| z.exp() / z.powi(3), &req, &[], &mut Budget::default()).unwrap();
/// let (n, c) = r.coefficients[2];
/// assert_eq!(n, -1);
/// assert!((c - C::new(0.5, 0.0)).norm() <= r.errors[2] && r.errors[2] < 1e-12);
/// assert!((r.coefficients[4].1 - C::new(1.0 / 24.0, 0.0)).norm() <= r.errors[4]);
/// ```
pub fn laurent<F: FnMut(C) -> C>(
    mut f: F,
    req: &LaurentRequest,
    known_singularities: &[C],
    budget: &mut Budget,
) -> Result<LaurentResult, Failure> {
    let (center, inner, outer) = check_request(req)?;
    check_singularities(req, center, inner, outer, known_singularities)?;
    let start = budget.used();
    let mut fits = Vec::new();
    let mut first_failure = None;
    for rho in radius_ladder(inner, outer, req.from, req.to) {
        match fit_on_circle(&mut f, center, rho, req.from, req.to, budget) {
            Ok(fit) => fits.push(fit),
            Err(CircleFailure::Budget(m)) => return Err(m),
            Err(CircleFailure::NotFinite(z)) => {
                first_failure.get_or_insert((z, rho));
            }
        }
    }
    if fits.len() < 2 {
        let (z, rho) = first_failure.unwrap_or((center, inner));
        return Err(Failure::not_finite(not_finite_message(z, center, rho)).at(z));
    }
    combine(&fits, req, center, budget.used() - start)
}

/// One circle's coefficients and their error estimates.
struct CircleFit {
    radius: f64,
    values: Vec<C>,
    errors: Vec<f64>,
}

fn finite(z: C) -> bool {
    z.re.is_finite() && z.im.is_finite()
}

enum CircleFailure {
    NotFinite(C),
    Budget(Failure),
}


/// Sample on |z − a| = ρ with N doubling until the coefficients settle.
fn fit_on_circle(
    f: &mut dyn FnMut(C) -> C,
    center: C,
    rho: f64,
    from: i64,
    to: i64,
    budget: &mut Budget,
) -> Result<CircleFit, CircleFailure> {
    let count = (to - from + 1) as usize;
    let mut n = (2 * count).next_power_of_two().max(64);
    let cap = MAX_SAMPLES_PER_CIRCLE.max(4 * n);
    let mut samples = CircleSamples::take_finite(f, center, rho, 0.0, n, budget)
        .map_err(CircleFailure::Budget)?
        .map_err(CircleFailure::NotFinite)?;
    let mut previous: Vec<C> = samples.coefficients(from, to);
    let mut previous_worst = f64::INFINITY;
    loop {
        if let Some(z) = samples.double(f, budget).map_err(CircleFailure::Budget)? {
            return Err(CircleFailure::NotFinite(z));
        }
        n *= 2;
        let spectrum = samples.spectrum();
        let max_f = samples.max_abs();
        let eps = f64::EPSILON;
        let mut values = Vec::with_capacity(count);
        let mut errors = Vec::with_capacity(count);
        let mut settled = true;
        // Largest change, measured in units of max|f| (the scale of the samples).
        let mut worst = 0.0f64;
        for (i, m) in (from..=to).enumerate() {
            let (c, factor) = samples.coefficient_from(&spectrum, m);
            let diff = (c - previous[i]).norm();
            let floor = eps * max_f * factor * (4.0 + (n as f64).log2())
                + 4.0 * eps * (m.unsigned_abs() as f64 + 1.0) * c.norm();
            let error = 10.0 * diff + floor;
            if diff.is_nan() || diff > 2.0 * floor {
                settled = false;
            }
            if factor > 0.0 && factor.is_finite() && max_f > 0.0 {
                worst = worst.max(diff / (factor * max_f));
            }
            values.push(c);
            errors.push(if error.is_nan() { f64::INFINITY } else { error });
        }
        // Stagnation at rounding level: further doubling cannot help.
        let stagnant = worst <= 1e-10 && worst > 0.25 * previous_worst;
        if settled || stagnant || n >= cap {
            return Ok(CircleFit {
                radius: rho,
                values,
                errors,
            });
        }
        previous_worst = worst;
        previous = values;
    }
}

/// Circles to try, strictly inside the annulus. For high orders n next to a
/// singular boundary circle R, Bornemann's balance ρ^{−n}/|R − ρ| favours
/// ρ ≈ R(1 ∓ 1/n); we add ρ = R(1 ∓ 4/n), which still converges with N ≈ 10n.
fn radius_ladder(inner: f64, outer: f64, from: i64, to: i64) -> Vec<f64> {
    let mut radii = base_ladder(inner, outer);
    if outer.is_finite() && to > 40 {
        radii.push(outer * (1.0 - 4.0 / (to as f64 + 1.0)));
    }
    if inner > 0.0 && from < -40 {
        radii.push(inner * (1.0 + 4.0 / (from.unsigned_abs() as f64 + 1.0)));
    }
    radii.retain(|&r| r > inner && r < outer);
    radii
}

fn base_ladder(inner: f64, outer: f64) -> Vec<f64> {
    match (inner > 0.0, outer.is_finite()) {
        (false, true) => [1.0 / 64.0, 1.0 / 16.0, 0.25, 0.5, 0.75, 0.9]
            .iter()
            .map(|s| s * outer)
            .collect(),
        (false, false) => (-5..=5).map(|j| 2f64.powi(j)).collect(),
        (true, false) => [1.1, 1.25, 1.6, 2.5, 4.0, 8.0, 32.0]
            .iter()
            .map(|s| s * inner)
            .collect(),
        (true, true) => [0.1, 0.25, 0.5, 0.75, 0.9]
            .iter()
            .map(|s| inner * (outer / inner).powf(*s))
            .collect(),
    }
}

/// For every n keep the radius with the smallest estimate; check agreement.
fn combine(
    fits: &[CircleFit],
    req: &LaurentRequest,
    center: C,
    used: u64,
) -> Result<LaurentResult, Failure> {
    let mut coefficients = Vec::new();
    let mut errors = Vec::new();
    let mut radius_used = Vec::new();
    for (i, n) in (req.from..=req.to).enumerate() {
        let mut order: Vec<usize> = (0..fits.len()).collect();
        order.sort_by(|&p, &q| fits[p].errors[i].total_cmp(&fits[q].errors[i]));
        let (best, second) = (&fits[order[0]], &fits[order[1]]);
        let (c, mut e) = (best.values[i], best.errors[i]);
        if !(e.is_finite() && finite(c)) {
            return Err(Failure::not_finite(format!(
                "c_{n} cannot be represented in double precision on this annulus (it over- or underflows); rescale the variable or ask for fewer coefficients"
            )));
        }
        // Any two circles that both claim accuracy must agree.
        for p in 0..fits.len() {
            for q in p + 1..fits.len() {
                let (a, b) = (&fits[p], &fits[q]);
                let d = (a.values[i] - b.values[i]).norm();
                if d > 1000.0 * (a.errors[i] + b.errors[i])
                    && d > 1e-13 * a.values[i].norm().max(b.values[i].norm())
                {
                    let (lo, hi) = (a.radius.min(b.radius), a.radius.max(b.radius));
                    let ring = ring_text(req.center, center);
                    return Err(Failure::unresolved(format!(
                        "the coefficient c_{n} computed on {ring} = {} and on {ring} = {} disagree ({} vs {}): f probably has a singularity (or branch cut) with {} < {ring} < {} inside the requested annulus, so it has no single Laurent series there; narrow the annulus to avoid it",
                        text::place_real(lo), text::place_real(hi), text::place(a.values[i]), text::place(b.values[i]), text::place_real(lo), text::place_real(hi)
                    )));
                }
            }
        }
        let d = (c - second.values[i]).norm();
        if d > e + second.errors[i] {
            e = d + second.errors[i];
        }
        coefficients.push((n, c));
        errors.push(e);
        radius_used.push(best.radius);
    }
    let error_estimate = errors.iter().copied().fold(0.0, f64::max);
    Ok(LaurentResult {
        coefficients,
        errors,
        error_estimate,
        radius_used,
        samples: used as usize,
    })
}

fn check_request(req: &LaurentRequest) -> Result<(C, f64, f64), Failure> {
    let center = match req.center {
        Center::Point(a) if finite(a) && a.norm() < MAX_CENTER => a,
        Center::Point(a) if finite(a) => {
            return Err(Failure::invalid(format!(
                "the center {} is too far out: distances to it do not fit double precision (|center| < {MAX_CENTER:e})",
                text::place(a)
            )))
        }
        Center::Point(_) => return Err(Failure::invalid("the center must be a finite complex number")),
        Center::Infinity => C::new(0.0, 0.0),
    };
    let inner = req.inner;
    let outer = if req.center == Center::Infinity {
        f64::INFINITY
    } else {
        req.outer
    };
    if !(inner.is_finite() && inner >= 0.0) {
        return Err(Failure::invalid(format!(
            "the inner radius must be a finite number ≥ 0, got {}",
            text::place_real(inner)
        )));
    }
    if outer.is_nan() || outer <= inner {
        return Err(Failure::invalid(format!(
            "the outer radius ({}) must be larger than the inner radius ({})",
            text::place_real(outer),
            text::place_real(inner)
        )));
    }
    if req.from > req.to {
        return Err(Failure::invalid(format!(
            "from ({}) must not exceed to ({})",
            req.from, req.to
        )));
    }
    if req.from < -MAX_INDEX || req.to > MAX_INDEX {
        return Err(Failure::invalid(format!("coefficient indices must lie within ±{MAX_INDEX}")));
    }
    if req.to - req.from + 1 > MAX_COEFFICIENTS {
        return Err(Failure::invalid(format!(
            "{} coefficients requested; at most {MAX_COEFFICIENTS} per request—narrow from..to",
            req.to - req.from + 1
        )));
    }
    Ok((center, inner, outer))
}

/// Refuse an annulus with a known singular point strictly inside, naming it.
fn check_singularities(
    req: &LaurentRequest,
    center: C,
    inner: f64,
    outer: f64,
    known: &[C],
) -> Result<(), Failure> {
    let scale = if outer.is_finite() {
        outer
    } else {
        inner.max(1.0)
    };
    let lo = inner + 1e-9 * inner + 1e-12 * scale;
    let hi = if outer.is_finite() {
        outer * (1.0 - 1e-9)
    } else {
        f64::INFINITY
    };
    let inside: Vec<(C, f64)> = known
        .iter()
        .filter(|s| finite(**s))
        .map(|&s| (s, (s - center).norm()))
        .filter(|&(_, d)| d > lo && d < hi)
        .collect();
    let Some(&(first, _)) = inside.first() else {
        return Ok(());
    };
    let d_min = inside.iter().map(|p| p.1).fold(f64::INFINITY, f64::min);
    let d_max = inside.iter().map(|p| p.1).fold(0.0, f64::max);
    let more = if inside.len() > 1 {
        format!(" (and {} more)", inside.len() - 1)
    } else {
        String::new()
    };
    let ring = ring_text(req.center, center);
    if req.center == Center::Infinity {
        return Err(Failure::invalid(format!(
            "the region {ring} > {} around infinity contains a singularity at {}{more}; choose r1 > {}",
            text::place_real(inner), text::place(first), round_up(d_max)
        )));
    }
    let region = if outer.is_finite() {
        format!("{} < {ring} < {}", text::place_real(inner), text::place_real(outer))
    } else {
        format!("{ring} > {}", text::place_real(inner))
    };
    let mut advice = format!("choose r2 < {}", round_down(d_min));
    if d_max < outer {
        advice += &format!(" or r1 > {}", round_up(d_max));
    }
    Err(Failure::invalid(format!(
        "the annulus {region} contains a singularity at {}{more}; {advice}",
        text::place(first)
    )))
}

fn not_finite_message(z: C, center: C, rho: f64) -> String {
    format!(
        "f is not finite at {} on the sampling circle |z − ({})| = {}; the annulus seems to contain a singularity; narrow the annulus to avoid it",
        text::place(z),
        text::place(center),
        text::place_real(rho)
    )
}

/// "|z − 1|", "|z + 2|", "|z|", "|z − (1 + 2i)|".
fn ring_text(center: Center, a: C) -> String {
    if center == Center::Infinity || a == C::new(0.0, 0.0) {
        "|z|".into()
    } else if a.im == 0.0 {
        if a.re > 0.0 {
            format!("|z − {}|", text::place_real(a.re))
        } else {
            format!("|z + {}|", text::place_real(-a.re))
        }
    } else {
        format!("|z − ({})|", text::place(a))
    }
}

/// x rounded to 6 significant digits, downwards/upwards (so strict advice stays true).
fn round_down(x: f64) -> String {
    round_significant(x, f64::floor)
}
fn round_up(x: f64) -> String {
    round_significant(x, f64::ceil)
}
fn round_significant(x: f64, op: fn(f64) -> f64) -> String {
    if x <= 0.0 || !x.is_finite() {
        return text::place_real(x);
    }
    let p = 10f64.powi(5 - x.log10().floor() as i32);
    let r = op(x * p) / p;
    if r.is_finite() && p.is_finite() {
        text::real(r)
    } else {
        text::real(x)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_close, check_method, naive_circle_coefficient};

    type F = fn(C) -> C;

    /// Run `laurent` on the request and compare every coefficient with the naive
    /// DFT sum on the circle |z − center| = `reference_radius` (inside the annulus)
    /// with `points` points; each coefficient's own estimate must bound the difference.
    fn check_against_naive(name: &str, f: F, req: LaurentRequest, reference_radius: f64, points: usize) {
        let r = laurent(f, &req, &[], &mut Budget::default()).unwrap();
        let center = match req.center {
            Center::Point(a) => a,
            // Around infinity the series is in powers of z, as on any circle about 0.
            Center::Infinity => C::new(0.0, 0.0),
        };
        let cases: Vec<(String, usize)> =
            (0..r.coefficients.len()).map(|i| (format!("{name}: c_{}", r.coefficients[i].0), i)).collect();
        let cases: Vec<(&str, usize)> = cases.iter().map(|(s, i)| (s.as_str(), *i)).collect();
        check_method(
            &cases,
            |&i| (r.coefficients[i].1, Some(r.errors[i])),
            |&i| naive_circle_coefficient(f, center, reference_radius, points, r.coefficients[i].0),
            1e-12,
        );
    }

    #[test]
    fn coefficients_agree_with_the_naive_circle_sum() {
        let point = |a: C, inner: f64, outer: f64, from: i64, to: i64| LaurentRequest {
            center: Center::Point(a),
            inner,
            outer,
            from,
            to,
        };
        check_against_naive("e^z/z² about 0", |z| z.exp() / (z * z), point(C::new(0.0, 0.0), 0.0, f64::INFINITY, -4, 8), 1.0, 256);
        // The annulus 1 < |z| < 2 between the two poles: on |z| = 1.5 the naive sum's
        // aliasing error is about (1.5/2)^1024 + (1/1.5)^1024, far below rounding.
        check_against_naive(
            "1/((z − 1)(z − 2)) on 1 < |z| < 2",
            |z| 1.0 / ((z - 1.0) * (z - 2.0)),
            point(C::new(0.0, 0.0), 1.0, 2.0, -6, 6),
            1.5,
            1024,
        );
        check_against_naive(
            "cos z/(z − 0.5 − 0.5i)³ about its pole",
            |z| z.cos() / (z - C::new(0.5, 0.5)).powi(3),
            point(C::new(0.5, 0.5), 0.0, f64::INFINITY, -3, 4),
            1.0,
            256,
        );
        check_against_naive(
            "z²/(z − 1) about infinity",
            |z| z * z / (z - 1.0),
            LaurentRequest { center: Center::Infinity, inner: 1.0, outer: f64::INFINITY, from: -5, to: 2 },
            3.0,
            1024,
        );
    }

    #[test]
    fn coefficients_match_series_from_tables() {
        // 1/((z − 1)(z − 2)) = −Σ_{n≥1} z^{−n} − Σ_{n≥0} z^n/2^{n+1} on 1 < |z| < 2
        // (partial fractions and geometric series, common practice).
        let req = LaurentRequest { center: Center::Point(C::new(0.0, 0.0)), inner: 1.0, outer: 2.0, from: -3, to: 3 };
        let r = laurent(|z: C| 1.0 / ((z - 1.0) * (z - 2.0)), &req, &[], &mut Budget::default()).unwrap();
        for (i, &(n, c)) in r.coefficients.iter().enumerate() {
            let want = if n < 0 { -1.0 } else { -0.5f64.powi(n as i32 + 1) };
            assert_close(c, C::new(want, 0.0), 1e-12, &format!("c_{n}"));
            assert!((c - C::new(want, 0.0)).norm() <= r.errors[i], "c_{n}: estimate {:.2e} too small", r.errors[i]);
        }
        // A pole of f inside the annulus is refused, naming it.
        assert!(laurent(|z: C| 1.0 / (z - 1.5), &req, &[C::new(1.5, 0.0)], &mut Budget::default()).is_err());
    }
}

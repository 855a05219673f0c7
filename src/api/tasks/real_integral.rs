//! `real_integral`: real integrals by residue calculus, each checked against an
//! independent quadrature, with any disagreement shown rather than hidden.
//!
//! Kinds (standard residue-calculus evaluations; L. V. Ahlfors, "Complex
//! Analysis", 3rd ed., McGraw-Hill 1979, ch. 4 §5.3 — from memory):
//! - `line`: ∫_{−∞}^{∞} f(x) dx = 2πi Σ_{Im a > 0} Res f (f decaying like 1/x²);
//!   simple poles on the real axis give the principal value, each adding πi·Res.
//! - `fourier`: ∫ f(x) e^{iωx} dx — f is the amplitude, the task supplies e^{iωx}.
//!   ω > 0: 2πi Σ_{upper} Res[f e^{iωz}]; ω < 0: −2πi Σ_{lower}; ω = 0: `line`
//!   (Jordan's lemma: f → 0 at infinity suffices when ω ≠ 0). Real simple poles:
//!   principal value with ±πi·Res.
//! - `trig`: ∫_0^{2π} f(θ) dθ with z = e^{iθ}: = 2πi Σ_{|a|<1} Res g,
//!   g(z) = f(−i log z)/(iz) (single-valued when f is 2π-periodic).
//! - `mellin`: ∫_0^∞ x^{α−1} f(x) dx for rational f, by the keyhole contour:
//!   = 2πi/(1 − e^{2πiα}) Σ_{a≠0} Res[z^{α−1} f(z), a], arg z ∈ (0, 2π).
//!
//! Residues of f·e^{iωz} and z^{α−1}·f come from f's exact principal parts
//! (`singular::product_residue`). Rational f: poles by polynomial algebra.
//! Other f: poles located numerically in a box of radius R where |f| has
//! decayed (a warning says only that box was searched).
//!
//! The quadrature is independent of the residues (except that a principal
//! value subtracts the known singular part at real poles): adaptive
//! Gauss–Kronrod on [−L, L] beyond which no pole lies; for ω ≠ 0 the two tails
//! are moved onto the vertical rays ±L + iσt, where e^{iωz} decays like
//! e^{−|ω|t} (analytic continuation of the tail, valid because no singularity
//! lies beyond L and f → 0 there; D. Huybrechs and S. Vandewalle, "On the
//! evaluation of highly oscillatory integrals by analytic continuation",
//! SIAM J. Numer. Anal. 44 (2006) — from memory). Mellin: x = e^u on the whole
//! line; trig: periodic trapezoidal rule.

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use crate::api::input::{budget, compile, hints};
use crate::text;
use crate::api::wire::{pair, FunctionInput, Number};
use crate::budget::Budget;
use crate::contour::Contour;
use crate::api::error::{ApiError, ErrorCode};
use crate::expr::Function;
use crate::quad::gauss_kronrod::{integrate, integrate_infinite};
use crate::quad::trapezoid_periodic::integrate_periodic;
use crate::quad::{QuadError, QuadResult, Tolerance};
use crate::singular::product_residue::{exp_taylor, power_taylor, product_residue};
use crate::singular::rational_poles::{analyse_rational_polished, PoleInfo};
use crate::singular::{classify_point, find_singularities, Hints, Kind};
use crate::error::Failure;
use crate::C;
use serde::{Deserialize, Serialize};
use std::f64::consts::PI;

/// `real_integral` request.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct RealIntegralRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    /// `"line"`, `"fourier"`, `"trig"` or `"mellin"`.
    pub kind: String,
    /// ω of e^{iωx} (fourier).
    #[serde(default)]
    pub omega: Option<Number>,
    /// α of x^{α−1} (mellin).
    #[serde(default)]
    pub alpha: Option<Number>,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

/// One residue in the residue-side sum: value = Σ weight · residue.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ResidueUsed {
    pub at: [f64; 2],
    /// The residue of the whole integrand (f·e^{iωz}, z^{α−1}f, or f(−i log z)/(iz)).
    pub residue: [f64; 2],
    pub weight: [f64; 2],
    /// What the point is and why it has this weight.
    pub note: String,
    pub error_estimate: f64,
}

/// `real_integral` response.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct RealIntegralResponse {
    pub value: [f64; 2],
    pub by_quadrature: [f64; 2],
    /// `null` when the residue side could not be computed (see warnings).
    pub by_residues: Option<[f64; 2]>,
    pub residues_used: Vec<ResidueUsed>,
    /// |by_quadrature − by_residues| (0 when only one way is available).
    pub max_discrepancy: f64,
    /// Bound on |value − true value|.
    pub error_estimate: f64,
    pub quadrature_error_estimate: f64,
    pub residues_error_estimate: Option<f64>,
    /// `"residues"` or `"quadrature"`.
    pub value_from: String,
    /// One sentence: do the two ways agree, and to what.
    pub agreement: String,
    /// The residue formula applied, in words.
    pub formula: String,
    /// True when the value is a Cauchy principal value (simple poles on the real axis).
    pub principal_value: bool,
    /// `"rational"` (exact polynomial algebra) or `"numerical"`.
    pub method: String,
    pub warnings: Vec<String>,
}

/// Two ways agree when they differ by at most this many times their summed error estimates.
const AGREEMENT_FACTOR: f64 = 10.0;

#[derive(Debug, Clone, Copy)]
struct Way {
    value: C,
    error: f64,
}

/// What the residue side produced.
struct ResidueSide {
    way: Option<Way>,
    used: Vec<ResidueUsed>,
    method: &'static str,
    formula: String,
    principal_value: bool,
}

fn i_times(x: f64) -> C {
    C::new(0.0, x)
}

pub fn run(req: &RealIntegralRequest) -> Result<RealIntegralResponse, ApiError> {
    let input = FunctionInput {
        f: req.function.f.clone(),
        var: Some(req.function.var.clone().unwrap_or_else(|| "x".into())),
        params: req.function.params.clone(),
    };
    let f = compile(&input)?;
    let mut budget = budget(req.max_evaluations);
    let mut warnings = Vec::new();
    let kind = req.kind.trim().to_ascii_lowercase();
    let real_param = |n: Option<Number>, name: &str| -> Result<f64, ApiError> {
        let Some(n) = n else {
            return Err(ApiError::invalid(format!(
                "kind \"{kind}\" needs \"{name}\" (a real number)"
            )));
        };
        let z = n.to_c();
        if !(z.re.is_finite() && z.im == 0.0) {
            return Err(ApiError::invalid(format!(
                "\"{name}\" must be a finite real number"
            )));
        }
        Ok(z.re)
    };
    let (side, quadrature) = match kind.as_str() {
        "line" => line_like(&f, 0.0, &mut budget, &mut warnings)?,
        "fourier" => {
            let omega = real_param(req.omega, "omega")?;
            if omega == 0.0 {
                warnings.push("ω = 0: the Fourier integral is the line integral ∫ f(x) dx".into());
            }
            line_like(&f, omega, &mut budget, &mut warnings)?
        }
        "trig" => trig(&f, &mut budget, &mut warnings)?,
        "mellin" => {
            let Some(alpha) = req.alpha else {
                return Err(ApiError::invalid(
                    "kind \"mellin\" needs \"alpha\" (a number or [re, im]): the integral is ∫_0^∞ x^(alpha−1) f(x) dx",
                ));
            };
            let alpha = crate::api::input::finite(alpha, "alpha")?;
            mellin(&f, alpha, &mut budget, &mut warnings)?
        }
        other => {
            return Err(ApiError::invalid(format!(
                "unknown kind \"{other}\"; use \"line\", \"fourier\", \"trig\" or \"mellin\""
            )))
        }
    };
    Ok(assemble(side, quadrature, warnings))
}

fn assemble(side: ResidueSide, q: QuadResult, mut warnings: Vec<String>) -> RealIntegralResponse {
    if !q.converged {
        warnings.push(format!(
            "the quadrature did not reach its tolerance (error estimate {:.1e}); f may vary sharply or decay slowly",
            q.error_estimate
        ));
    }
    let quad = Way {
        value: q.value,
        error: q.error_estimate,
    };
    let (value_from, best, max_discrepancy, agreement, error) = match side.way {
        None => (
            "quadrature",
            quad,
            0.0,
            "only the quadrature is available (residues not available; see warnings)".to_string(),
            quad.error,
        ),
        Some(r) => {
            let d = (r.value - quad.value).norm();
            let allowed = AGREEMENT_FACTOR * (r.error + quad.error);
            let best = if side.method == "rational" || r.error <= quad.error {
                ("residues", r)
            } else {
                ("quadrature", quad)
            };
            let size = r.value.norm().max(quad.value.norm()).max(1e-300);
            if d <= allowed && d <= 1e-8 * size.max(1.0) {
                (
                    best.0,
                    best.1,
                    d,
                    format!("residues and quadrature agree to {d:.1e}"),
                    best.1.error,
                )
            } else if d <= allowed {
                let text = format!(
                    "residues and quadrature differ by {d:.1e}; only the large error estimate of the quadrature ({:.1e}) or of the residues ({:.1e}) covers that",
                    quad.error, r.error
                );
                warnings.push(text.clone());
                (best.0, best.1, d, text, best.1.error.max(d))
            } else {
                let text = format!(
                    "residues and quadrature differ by {d:.1e}, more than their error estimates ({:.1e}, {:.1e}) allow: a singularity may have been missed or f may not decay as the residue formula needs; the error estimate is raised to the difference",
                    r.error, quad.error
                );
                warnings.push(text.clone());
                (best.0, best.1, d, text, best.1.error.max(d))
            }
        }
    };
    RealIntegralResponse {
        value: pair(best.value),
        by_quadrature: pair(quad.value),
        by_residues: side.way.map(|w| pair(w.value)),
        residues_used: side.used,
        max_discrepancy,
        error_estimate: error,
        quadrature_error_estimate: quad.error,
        residues_error_estimate: side.way.map(|w| w.error),
        value_from: value_from.into(),
        agreement,
        formula: side.formula,
        principal_value: side.principal_value,
        method: side.method.into(),
        warnings,
    }
}

fn quad_error(e: QuadError, what: &str) -> ApiError {
    match e {
        QuadError::NotFinite { at } => ApiError::new(ErrorCode::Divergent, format!(
            "f is not finite at {what} = {at:.6e}: a singularity lies on the path of integration, so the integral diverges there; check the expression"
        )),
        other => Failure::from(other).into(),
    }
}

fn add(a: QuadResult, b: QuadResult) -> QuadResult {
    QuadResult {
        value: a.value + b.value,
        error_estimate: a.error_estimate + b.error_estimate,
        evaluations: a.evaluations + b.evaluations,
        converged: a.converged && b.converged,
    }
}

fn zero_result() -> QuadResult {
    QuadResult {
        value: C::new(0.0, 0.0),
        error_estimate: 0.0,
        evaluations: 0,
        converged: true,
    }
}

// ---------------------------------------------------------------- line / fourier

/// Sign of the half-plane the residue side closes in: +1 upper (ω ≥ 0), −1 lower.
fn half_plane(omega: f64) -> f64 {
    if omega < 0.0 {
        -1.0
    } else {
        1.0
    }
}

fn formula_line(omega: f64, pv: bool) -> String {
    let pv_text = if pv {
        " + πi Σ Res on the real axis (principal value)"
    } else {
        ""
    };
    if omega == 0.0 {
        format!("∫ f(x) dx = 2πi Σ_{{Im a > 0}} Res f{pv_text}")
    } else if omega > 0.0 {
        format!("∫ f(x) e^(iωx) dx = 2πi Σ_{{Im a > 0}} Res[f e^(iωz)]{pv_text} (Jordan's lemma, ω > 0)")
    } else {
        let pv_text = if pv {
            " − πi Σ Res on the real axis (principal value)"
        } else {
            ""
        };
        format!("∫ f(x) e^(iωx) dx = −2πi Σ_{{Im a < 0}} Res[f e^(iωz)]{pv_text} (Jordan's lemma, ω < 0)")
    }
}

fn line_like(
    f: &Function,
    omega: f64,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<(ResidueSide, QuadResult), ApiError> {
    match f.rational() {
        Some(r) => line_rational(f, &r.num, &r.den, omega, budget, warnings),
        None => line_general(f, omega, budget, warnings),
    }
}

/// A pole on the real axis (within what its location error allows), judged
/// relative to `scale`, the size of the largest pole.
fn on_real_axis(p: &PoleInfo, scale: f64) -> bool {
    p.at.im.abs() <= (10.0 * p.location_error).max(1e-12 * scale.max(p.at.norm()))
}

fn line_rational(
    f: &Function,
    num: &[C],
    den: &[C],
    omega: f64,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<(ResidueSide, QuadResult), ApiError> {
    let a = analyse_rational_polished(num, den, &|z| f.eval_d(z))?;
    warnings.extend(a.warnings.iter().cloned());
    let zero = crate::poly::trim(num).is_empty();
    let decay = -a.infinity_order;
    if !zero {
        if omega == 0.0 && decay < 2 {
            return Err(ApiError::new(ErrorCode::Divergent, format!(
                "∫ f(x) dx over the whole real line diverges: f falls off only like 1/x^{decay} (the residue formula needs deg denominator − deg numerator ≥ 2, here {decay}); for an oscillating factor use kind \"fourier\" with omega ≠ 0"
            )));
        }
        if omega != 0.0 && decay < 1 {
            return Err(ApiError::new(ErrorCode::Divergent, format!(
                "∫ f(x) e^(iωx) dx diverges: the amplitude f does not tend to 0 at infinity (deg denominator − deg numerator = {decay}, needs ≥ 1)"
            )));
        }
    }
    let sigma = half_plane(omega);
    let pole_scale = a.poles.iter().map(|p| p.at.norm()).fold(0.0, f64::max);
    let mut used = Vec::new();
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    let mut real_poles: Vec<(f64, C)> = Vec::new();
    for p in &a.poles {
        let taylor = if omega == 0.0 {
            let mut t = vec![C::new(0.0, 0.0); p.order as usize];
            t[0] = C::new(1.0, 0.0);
            t
        } else {
            exp_taylor(omega, p.at, p.order as usize)
        };
        let (res, res_err) = product_residue(&p.principal_part, &p.principal_part_errors, &taylor);
        let (weight, note) = if on_real_axis(p, pole_scale) {
            if p.order > 1 {
                return Err(ApiError::new(ErrorCode::Divergent, format!(
                    "f has a pole of order {} at x = {} on the real axis: the integral diverges, even as a principal value; move the pole off the axis (e.g. add a small damping)",
                    p.order,
                    text::value(C::new(p.at.re, 0.0))
                )));
            }
            real_poles.push((p.at.re, res));
            (
                i_times(PI * sigma),
                "simple pole on the real axis: principal value, half weight".to_string(),
            )
        } else if p.at.im * sigma > 0.0 {
            (
                i_times(2.0 * PI * sigma),
                format!(
                    "pole of order {} in the {} half-plane",
                    p.order,
                    if sigma > 0.0 { "upper" } else { "lower" }
                ),
            )
        } else {
            continue;
        };
        if !on_real_axis(p, pole_scale) && p.at.im.abs() < 1e-3 * (1.0 + p.at.norm()) {
            warnings.push(format!(
                "a pole at {} lies very close to the real axis: the integrand has a sharp peak there and the quadrature converges slowly",
                text::value(p.at)
            ));
        }
        sum += weight * res;
        err += weight.norm() * res_err;
        used.push(ResidueUsed {
            at: pair(p.at),
            residue: pair(res),
            weight: pair(weight),
            note,
            error_estimate: res_err,
        });
    }
    let pv = !real_poles.is_empty();
    if pv {
        warnings.push(
            "f has simple poles on the real axis: the integral exists only as a Cauchy principal value, which is what is computed (each real pole adds ±πi × its residue)"
                .into(),
        );
    }
    let rounding = 8.0
        * f64::EPSILON
        * used
            .iter()
            .map(|u| C::new(u.residue[0], u.residue[1]).norm() * 2.0 * PI)
            .sum::<f64>();
    let side = ResidueSide {
        way: Some(Way {
            value: sum,
            error: err + rounding,
        }),
        used,
        method: "rational",
        formula: formula_line(omega, pv),
        principal_value: pv,
    };
    // Beyond L no pole lies, so the tails can be moved onto vertical rays.
    let reach = a.poles.iter().map(|p| p.at.norm()).fold(0.0, f64::max);
    let l = 1.0 + 1.25 * reach;
    let eval = |z: C| f.eval(z);
    let q = line_quadrature(&eval, omega, &real_poles, l, omega != 0.0, budget)?;
    Ok((side, q))
}

/// s(u) = h²/(u(u² + h²)) = 1/u − u/(u² + h²), h = 1: odd, 1/u at 0, decays like 1/u³.
fn pv_kernel(u: f64) -> f64 {
    1.0 / u - u / (u * u + 1.0)
}

/// PV ∫_A^B s(u) du = ½ ln(B²(A² + 1) / (A²(B² + 1))).
fn pv_kernel_integral(a: f64, b: f64) -> f64 {
    0.5 * ((b * b) * (a * a + 1.0) / ((a * a) * (b * b + 1.0))).ln()
}

/// The real-line integral of f(x) e^{iωx}: [−L, L] by adaptive Gauss–Kronrod
/// (minus the singular parts r/(x − p) at real simple poles, added back in
/// closed form as a principal value), the tails either along the real axis or,
/// for ω ≠ 0 with no singularity beyond L, on the rays ±L + iσt.
fn line_quadrature(
    f: &dyn Fn(C) -> C,
    omega: f64,
    real_poles: &[(f64, C)],
    l: f64,
    rays: bool,
    budget: &mut Budget,
) -> Result<QuadResult, ApiError> {
    let tol = Tolerance::default();
    let osc = |x: f64| -> C { f(C::new(x, 0.0)) * C::new(0.0, omega * x).exp() };
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
    let mut total = zero_result();
    for w in ends.windows(2) {
        if w[1] > w[0] {
            let r =
                integrate(&mut central, w[0], w[1], tol, budget).map_err(|e| quad_error(e, "x"))?;
            total = add(total, r);
        }
    }
    for (p, r) in real_poles {
        total.value += r * pv_kernel_integral(-l - p, l - p);
    }
    if rays && omega != 0.0 {
        let sigma = half_plane(omega);
        let dir = C::new(0.0, sigma);
        for (start, sign) in [(l, 1.0), (-l, -1.0)] {
            let mut g = |t: f64| -> C {
                let z = C::new(start, 0.0) + dir * t;
                let e = C::new(0.0, omega * start).exp() * (-omega.abs() * t).exp();
                f(z) * e * dir * sign
            };
            let r = integrate_infinite(&mut g, 0.0, f64::INFINITY, tol, budget)
                .map_err(|e| quad_error(e, "t (on the ray from ±L)"))?;
            total = add(total, r);
        }
    } else {
        let mut g = |x: f64| osc(x);
        let right = integrate_infinite(&mut g, l, f64::INFINITY, tol, budget)
            .map_err(|e| quad_error(e, "x"))?;
        let left = integrate_infinite(&mut g, f64::NEG_INFINITY, -l, tol, budget)
            .map_err(|e| quad_error(e, "x"))?;
        total = add(add(total, right), left);
    }
    Ok(total)
}

/// max |f| over x = ±2^k, k ∈ ks (errors at a non-finite value).
fn sample_abs(
    f: &Function,
    ks: std::ops::RangeInclusive<i32>,
) -> Result<Vec<(f64, f64)>, ApiError> {
    let mut out = Vec::new();
    for k in ks {
        let x = 2f64.powi(k);
        let mut m: f64 = 0.0;
        for s in [x, -x] {
            let v = f.eval(C::new(s, 0.0));
            if !(v.re.is_finite() && v.im.is_finite()) {
                return Err(ApiError::new(ErrorCode::Divergent, format!(
                    "f is not finite at x = {s}: a singularity lies on the real axis, so the integral diverges (principal values are computed for rational f only)"
                )));
            }
            m = m.max(v.norm());
        }
        out.push((x, m));
    }
    Ok(out)
}

/// Largest |f| on the half circle |z| = ρ in the half-plane σ (None if not finite there).
fn arc_max(f: &Function, rho: f64, sigma: f64) -> Option<f64> {
    let n = 48;
    let mut m: f64 = 0.0;
    for j in 0..n {
        let phi = PI * (j as f64 + 0.5) / n as f64;
        let z = C::from_polar(rho, sigma * phi);
        let v = f.eval(z);
        if !(v.re.is_finite() && v.im.is_finite()) {
            return None;
        }
        m = m.max(v.norm());
    }
    Some(m)
}

fn line_general(
    f: &Function,
    omega: f64,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<(ResidueSide, QuadResult), ApiError> {
    let samples = sample_abs(f, -4..=20)?;
    let peak = samples.iter().map(|s| s.1).fold(0.0, f64::max);
    let at = |k: i32| samples[(k + 4) as usize].1;
    let tiny = 1e-300;
    // Convergence on the real axis, judged from samples at 2^16 and 2^20.
    if omega == 0.0 {
        let (a16, a20) = (at(16) * 2f64.powi(16), at(20) * 2f64.powi(20));
        if !(a20 <= 0.25 * a16 + tiny && a20 <= 1e-2 * peak + tiny) {
            return Err(ApiError::invalid(
                "f does not appear to decay like 1/x² on the real axis (sampled up to |x| = 2^20), so ∫ f(x) dx may diverge; for an oscillating factor use kind \"fourier\"",
            ));
        }
    } else if !(at(20) <= 0.5 * at(16) + tiny && at(20) <= 1e-2 * peak + tiny) {
        return Err(ApiError::invalid(
            "the amplitude f does not appear to tend to 0 on the real axis (sampled up to |x| = 2^20), so the Fourier integral may diverge",
        ));
    }
    // R: where |f| has fallen to 1% of its peak.
    let mut r = 256.0;
    for k in 2..=8 {
        if samples
            .iter()
            .filter(|s| s.0 >= 2f64.powi(k))
            .all(|s| s.1 <= 1e-2 * peak)
        {
            r = 2f64.powi(k);
            break;
        }
    }
    let sigma = half_plane(omega);
    let arc_ok = match (arc_max(f, 2.0 * r, sigma), arc_max(f, 4.0 * r, sigma)) {
        (Some(m2), Some(m4)) => {
            if omega == 0.0 {
                4.0 * r * m4 <= 0.75 * 2.0 * r * m2 + tiny
            } else {
                m4 <= 0.75 * m2 + tiny
            }
        }
        _ => false,
    };
    let formula = formula_line(omega, false);
    let mut side = ResidueSide {
        way: None,
        used: Vec::new(),
        method: "numerical",
        formula,
        principal_value: false,
    };
    let margin = 0.02 * r;
    let region = if sigma > 0.0 {
        Contour::rectangle(C::new(-r, -margin), C::new(r, r))
    } else {
        Contour::rectangle(C::new(-r, -r), C::new(r, margin))
    };
    if !arc_ok {
        warnings.push(format!(
            "|f| does not decay on the large half circles |z| = {}, {} in the {} half-plane, so the residue theorem does not give the real integral; only the quadrature is computed",
            2.0 * r,
            4.0 * r,
            if sigma > 0.0 { "upper" } else { "lower" }
        ));
    } else {
        let h = hints(f);
        let eval = |z: C| f.eval(z);
        let eval_d = |z: C| f.eval_d(z);
        match find_singularities(&eval, &eval_d, &region, &h, budget) {
            Err(e) if e.is_budget() => return Err(ApiError::from(e)),
            Err(e) => warnings.push(format!(
                "the singularities could not be located, so the residue side is not computed: {e}"
            )),
            Ok(found) => {
                warnings.extend(
                    found
                        .warnings
                        .iter()
                        .map(|w| format!("singularity search: {w}")),
                );
                warnings.push(format!(
                    "f is not rational: only singularities in the box |Re z| ≤ {r}, {} were searched (f has fallen to 1% of its peak beyond |x| = {r} and was checked to decay on the half circles |z| = {}, {})",
                    if sigma > 0.0 { format!("0 < Im z ≤ {r}") } else { format!("−{r} ≤ Im z < 0") },
                    2.0 * r,
                    4.0 * r
                ));
                side.way = general_residue_sum(&found, omega, sigma, &mut side.used, warnings)?;
            }
        }
    }
    let eval = |z: C| f.eval(z);
    let q = line_quadrature(&eval, omega, &[], r, arc_ok && omega != 0.0, budget)?;
    Ok((side, q))
}

fn general_residue_sum(
    found: &crate::singular::RegionResult,
    omega: f64,
    sigma: f64,
    used: &mut Vec<ResidueUsed>,
    warnings: &mut Vec<String>,
) -> Result<Option<Way>, ApiError> {
    if let Some(b) = found.branch_points.iter().find(|b| b.im * sigma > 0.0) {
        warnings.push(format!(
            "f has a branch point at {}, in the half-plane the contour closes in: the residue theorem does not apply",
            text::value(*b)
        ));
        return Ok(None);
    }
    if let Some(e) = found.essential.iter().find(|e| e.im * sigma > 0.0) {
        warnings.push(format!(
            "f has an essential singularity at {}: its residue with the factor e^(iωz) is not computed, so the residue side is not available",
            text::value(*e)
        ));
        return Ok(None);
    }
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    for p in &found.poles {
        if p.at.im.abs() <= 1e-6 * (1.0 + p.at.norm()) {
            return Err(ApiError::new(ErrorCode::Divergent, format!(
                "f has a pole at about x = {} on the real axis: the integral diverges (principal values are computed for rational f only)",
                text::value(C::new(p.at.re, 0.0))
            )));
        }
        if p.at.im * sigma <= 0.0 {
            continue;
        }
        if p.principal_part.len() < p.order as usize {
            warnings.push(format!(
                "the principal part of the pole at {} is not known, so the residue side is not available",
                text::value(p.at)
            ));
            return Ok(None);
        }
        let taylor = if omega == 0.0 {
            let mut t = vec![C::new(0.0, 0.0); p.order as usize];
            t[0] = C::new(1.0, 0.0);
            t
        } else {
            exp_taylor(omega, p.at, p.order as usize)
        };
        let errors = vec![p.error_estimate; p.principal_part.len()];
        let (res, res_err) = product_residue(&p.principal_part, &errors, &taylor);
        let weight = i_times(2.0 * PI * sigma);
        sum += weight * res;
        err += weight.norm() * res_err;
        used.push(ResidueUsed {
            at: pair(p.at),
            residue: pair(res),
            weight: pair(weight),
            note: format!("pole of order {} (located numerically)", p.order),
            error_estimate: res_err,
        });
    }
    Ok(Some(Way {
        value: sum,
        error: err + 8.0 * f64::EPSILON * sum.norm(),
    }))
}

// ---------------------------------------------------------------- trig

fn trig(
    f: &Function,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<(ResidueSide, QuadResult), ApiError> {
    for theta in [0.0, 0.37, 1.1, 2.5, 4.0, 5.7] {
        let a = f.eval(C::new(theta, 0.0));
        let b = f.eval(C::new(theta + 2.0 * PI, 0.0));
        if !(a.re.is_finite() && a.im.is_finite()) {
            return Err(ApiError::new(ErrorCode::Divergent, format!(
                "f is not finite at θ = {theta}: a singularity lies on the real θ axis, so the integral diverges"
            )));
        }
        if !((a - b).norm() <= 1e-9 * (1.0 + a.norm())) {
            return Err(ApiError::new(ErrorCode::NotApplicable, format!(
                "f is not 2π-periodic (f({theta}) ≠ f({theta} + 2π)): kind \"trig\" needs f built from cos and sin of the variable; for other integrands use kind \"line\" or a contour_integral"
            )));
        }
    }
    let two_pi = 2.0 * PI;
    let mut g = |t: f64| f.eval(C::new(two_pi * t, 0.0)) * two_pi;
    let q = integrate_periodic(&mut g, Tolerance::default(), budget).map_err(|e| match e {
        QuadError::NotFinite { at } => ApiError::new(ErrorCode::Divergent, format!(
            "f is not finite at θ = {:.6}: a singularity lies on the real θ axis, so the integral diverges",
            at * two_pi
        )),
        other => Failure::from(other).into(),
    })?;

    // g(z) = f(−i log z)/(iz) on the unit disk.
    let theta = |z: C| C::new(0.0, -1.0) * z.ln();
    let gz = |z: C| f.eval(theta(z)) / (C::new(0.0, 1.0) * z);
    let gzd = |z: C| {
        let (v, d) = f.eval_d(theta(z));
        (
            v / (C::new(0.0, 1.0) * z),
            (C::new(0.0, 1.0) * v - d) / (z * z),
        )
    };
    let region = Contour::circle(C::new(0.0, 0.0), 1.0);
    let h = Hints {
        essential_candidates: Vec::new(),
        branch_candidates: Vec::new(),
        uses_branch_functions: f.analysis().uses_branch_functions,
    };
    let mut side = ResidueSide {
        way: None,
        used: Vec::new(),
        method: "numerical",
        formula: "∫_0^2π f(θ) dθ = 2πi Σ_{|a|<1} Res g, g(z) = f(−i log z)/(iz), z = e^(iθ)".into(),
        principal_value: false,
    };
    if h.uses_branch_functions {
        warnings.push(
            "f uses sqrt, log or a non-integer power, so g(z) = f(−i log z)/(iz) may have branch points in the unit disk, where the residue theorem does not apply: the residue side is not computed".into(),
        );
        return Ok((side, q));
    }
    match find_singularities(&gz, &gzd, &region, &h, budget) {
        Err(e) if e.is_budget() => return Err(ApiError::from(e)),
        Err(e) => warnings.push(format!(
            "the singularities of g(z) = f(−i log z)/(iz) in the unit disk could not be located, so the residue side is not computed: {e}"
        )),
        Ok(found) => {
            warnings.extend(found.warnings.iter().map(|w| format!("singularity search: {w}")));
            let mut sum = C::new(0.0, 0.0);
            let mut err = 0.0;
            let mut ok = true;
            let weight = i_times(2.0 * PI);
            if let Some(b) = found.branch_points.first() {
                warnings.push(format!(
                    "g has a branch point at {} inside the unit circle: the residue theorem does not apply",
                    text::value(*b)
                ));
                ok = false;
            }
            let mut points: Vec<(C, Option<C>, f64, String)> = found
                .poles
                .iter()
                .map(|p| (p.at, p.residue, p.error_estimate, format!("pole of order {} inside |z| = 1", p.order)))
                .collect();
            for &z in &found.essential {
                match classify_point(&gz, z, &h, budget) {
                    Ok(r) if r.kind == Kind::Essential => points.push((z, r.residue, r.error_estimate, "essential singularity inside |z| = 1".into())),
                    Err(e) if e.is_budget() => return Err(ApiError::from(e)),
                    _ => points.push((z, None, 0.0, "essential singularity".into())),
                }
            }
            for (at, res, e, note) in points {
                let Some(res) = res else {
                    warnings.push(format!(
                        "the residue of g at {} could not be computed, so the residue side is not available",
                        text::value(at)
                    ));
                    ok = false;
                    continue;
                };
                sum += weight * res;
                err += weight.norm() * e;
                side.used.push(ResidueUsed {
                    at: pair(at),
                    residue: pair(res),
                    weight: pair(weight),
                    note,
                    error_estimate: e,
                });
            }
            warnings.push(
                "trig: the residues of g(z) = f(−i log z)/(iz) are located numerically inside the unit circle (sampling methods)".into(),
            );
            if ok {
                side.way = Some(Way {
                    value: sum,
                    error: err + 8.0 * f64::EPSILON * sum.norm(),
                });
            }
        }
    }
    Ok((side, q))
}

// ---------------------------------------------------------------- mellin

/// Number of leading (lowest-degree) zero coefficients, and the rest.
fn strip_low(p: &[C]) -> (i64, Vec<C>) {
    let k = p.iter().take_while(|c| **c == C::new(0.0, 0.0)).count();
    (k as i64, p[k..].to_vec())
}

fn mellin(
    f: &Function,
    alpha: C,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<(ResidueSide, QuadResult), ApiError> {
    let Some(r) = f.rational() else {
        return Err(ApiError::invalid(
            "kind \"mellin\" needs f rational in the variable (a ratio of polynomials) with no poles on (0, ∞); for other f use kind \"line\" after the substitution x = e^u",
        ));
    };
    if alpha.im == 0.0 && (alpha.re - alpha.re.round()).abs() <= 1e-12 * (1.0 + alpha.re.abs()) {
        return Err(ApiError::new(ErrorCode::NotApplicable, format!(
            "alpha = {} is an integer: then x^(alpha−1) has no branch cut and the keyhole formula 2πi/(1 − e^(2πiα)) Σ Res degenerates (0/0); use a non-integer alpha (e.g. {} + 0.5) or, for an even integrand, kind \"line\"",
            alpha.re, alpha.re
        )));
    }
    let num = crate::poly::trim(&r.num);
    let den = crate::poly::trim(&r.den);
    if num.is_empty() {
        return Err(ApiError::invalid("f is identically zero; the integral is 0"));
    }
    let (kn, num0) = strip_low(&num);
    let (kd, den0) = strip_low(&den);
    let k = kn - kd; // f ~ x^k at 0
    let d = (den.len() as i64 - 1) - (num.len() as i64 - 1); // f ~ x^−d at ∞
    if !(alpha.re + (k as f64) > 0.0 && alpha.re < d as f64) {
        return Err(ApiError::new(ErrorCode::Divergent, format!(
            "∫_0^∞ x^(α−1) f(x) dx diverges: here f ~ x^{k} near 0 and ~ x^{} at infinity, so it converges only for {} < Re α < {d}, and Re α = {}",
            -d,
            -k,
            alpha.re
        )));
    }
    let a = analyse_rational_polished(&num, &den, &|z| f.eval_d(z))?;
    warnings.extend(a.warnings.iter().cloned());
    let scale = a.poles.iter().map(|p| p.at.norm()).fold(1.0, f64::max);
    let mut used = Vec::new();
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    let factor = i_times(2.0 * PI) / (C::new(1.0, 0.0) - (i_times(2.0 * PI) * alpha).exp());
    for p in &a.poles {
        if p.at.norm() <= 1e-13 * scale {
            continue; // the branch point z = 0: handled by the convergence condition
        }
        if p.at.re > 0.0 && on_real_axis(p, scale) {
            return Err(ApiError::new(ErrorCode::Divergent, format!(
                "f has a pole at x = {} on the positive real axis: the Mellin integral diverges there",
                text::value(C::new(p.at.re, 0.0))
            )));
        }
        let taylor = power_taylor(alpha - 1.0, p.at, p.order as usize);
        let (res, res_err) = product_residue(&p.principal_part, &p.principal_part_errors, &taylor);
        sum += factor * res;
        err += factor.norm() * res_err;
        used.push(ResidueUsed {
            at: pair(p.at),
            residue: pair(res),
            weight: pair(factor),
            note: format!(
                "pole of order {}; residue of z^(α−1) f with arg z in (0, 2π)",
                p.order
            ),
            error_estimate: res_err,
        });
    }
    let side = ResidueSide {
        way: Some(Way {
            value: sum,
            error: err + 16.0 * f64::EPSILON * factor.norm() * used.iter().map(|u| C::new(u.residue[0], u.residue[1]).norm()).sum::<f64>(),
        }),
        used,
        method: "rational",
        formula: "∫_0^∞ x^(α−1) f(x) dx = 2πi/(1 − e^(2πiα)) Σ_{a≠0} Res[z^(α−1) f(z), a], arg z ∈ (0, 2π) (keyhole contour)".into(),
        principal_value: false,
    };
    // Quadrature in u = ln x: ∫ e^{αu} f(e^u) du. The compiled f in the middle;
    // far out, the forms x^{α+k} num0/den0 (x → 0) and x^{α−d} rev num/rev den
    // (x → ∞), which neither overflow nor lose f to underflow.
    let rev = |p: &[C]| -> Vec<C> { p.iter().rev().cloned().collect() };
    let (rnum, rden) = (rev(&num), rev(&den));
    let mut g = |u: f64| -> C {
        if u.abs() <= 30.0 {
            (alpha * u).exp() * f.eval(C::new(u.exp(), 0.0))
        } else if u < 0.0 {
            let x = C::new(u.exp(), 0.0);
            ((alpha + k as f64) * u).exp() * crate::poly::eval(&num0, x)
                / crate::poly::eval(&den0, x)
        } else {
            let y = C::new((-u).exp(), 0.0);
            ((alpha - d as f64) * u).exp() * crate::poly::eval(&rnum, y)
                / crate::poly::eval(&rden, y)
        }
    };
    let tol = Tolerance::default();
    let left = integrate_infinite(&mut g, f64::NEG_INFINITY, 0.0, tol, budget)
        .map_err(|e| quad_error(e, "u = ln x"))?;
    let right = integrate_infinite(&mut g, 0.0, f64::INFINITY, tol, budget)
        .map_err(|e| quad_error(e, "u = ln x"))?;
    let margin = (alpha.re + k as f64).min(d as f64 - alpha.re);
    if margin < 0.05 {
        warnings.push(format!(
            "Re α is within {margin:.2} of the edge of the convergence strip: the integrand decays slowly and the quadrature needs many points"
        ));
    }
    Ok((side, add(left, right)))
}

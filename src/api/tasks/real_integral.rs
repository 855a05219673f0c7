//! `real_integral`: real integrals by residue calculus, each checked against an
//! independent quadrature, with any disagreement shown rather than hidden.
//!
//! The plan, per kind (each method in its own file, formula and source there):
//! - `line`, `fourier` (∫ f(x) e^{iωx} dx, f the amplitude): residues in the
//!   closing half-plane, `integrals::real_line` (rational f exactly, with
//!   principal values; other f located in a box after `singular::decay`'s tests);
//!   quadrature `quad::real_line::line_integral`.
//! - `trig` (∫_0^{2π}): `integrals::unit_circle`; `quad::real_line::periodic_integral`.
//! - `mellin` (∫_0^∞ x^{α−1} f, rational f): `integrals::keyhole`;
//!   `quad::real_line::log_substituted_integral`.
//!
//! The two ways are reconciled by the one rule of `crate::ways`, residues
//! preferred for rational f (exact algebra), else the smaller estimate.

use crate::api::error::ApiError;
use crate::api::input::{budget, compile, hints};
use crate::api::wire::{pair, FunctionInput, FUNCTION_FIELDS, Number, Verdict, Method};
use crate::api::shape::{Expect, Field};
use crate::api::wire::BUDGET_FIELD;
use crate::budget::Budget;
use crate::expr::Function;
use crate::integrals::product_residue::ResidueSum;
use crate::integrals::derivation::{self, Derivation};
use crate::integrals::{keyhole, real_line, unit_circle};
use crate::quad::real_line::{line_integral, log_substituted_integral, periodic_integral};
use crate::quad::QuadResult;
use crate::singular::decay::{check_rational_decay, line_decay};
use crate::singular::rational_poles::analyse_function;
use crate::ways::{reconcile, Way, WayName};
use serde::{Deserialize, Serialize};

/// The declared fields of [`RealIntegralRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[
    FUNCTION_FIELDS,
    &[
        Field::required("kind", Expect::Text),
        Field::optional("omega", Expect::OrNull(&Expect::Complex)),
        Field::optional("alpha", Expect::OrNull(&Expect::Complex)),
        BUDGET_FIELD,
    ],
];

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
    /// The pole's order (1 for a principal-value pole); `null` for an essential singularity.
    pub order: Option<u32>,
    /// What the point is and why it has this weight.
    pub note: String,
    pub error_estimate: f64,
}

/// The closed contour of the derivation (`derivation.contour`).
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ClosingContour {
    /// `"upper_half_disc"`, `"lower_half_disc"`, `"unit_circle"` or `"keyhole"`.
    pub shape: String,
    /// A radius enclosing every point of the sum (the derivation lets R → ∞); 1 for the unit circle.
    pub radius: Option<f64>,
    /// The keyhole's small circle (the derivation lets ε → 0); `null` for other shapes.
    pub inner_radius: Option<f64>,
    /// The real-axis poles the line is indented around (principal values), `[x, 0]`.
    pub indentations: Vec<[f64; 2]>,
}

/// The derivation as a report writes it (`null` when the residue side is not available).
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct DerivationOut {
    pub contour: ClosingContour,
    /// `"jordan"`, `"ml_estimate"`, `"keyhole_circles"` or `"none"`.
    pub lemma: String,
    /// Why the lemma applies to this f, one sentence.
    pub lemma_condition: String,
    /// Mellin: the convergence strip `[lower, upper]` of Re α; else `null`.
    pub strip: Option<[i64; 2]>,
    /// Trig: the change of variable; else `null`.
    pub substitution: Option<String>,
    /// The function whose residues are summed.
    pub residues_of: String,
    /// Σ weight · residue written out, then "= value".
    pub sum: String,
}

impl From<Derivation> for DerivationOut {
    fn from(d: Derivation) -> Self {
        DerivationOut {
            contour: ClosingContour {
                shape: d.shape.word().into(),
                radius: d.radius.filter(|r| r.is_finite()),
                inner_radius: d.inner_radius.filter(|r| r.is_finite()),
                indentations: d.indentations.iter().map(|x| [*x + 0.0, 0.0]).collect(),
            },
            lemma: d.lemma.word().into(),
            lemma_condition: d.lemma_condition,
            strip: d.strip.map(|(a, b)| [a, b]),
            substitution: d.substitution.map(Into::into),
            residues_of: d.residues_of.into(),
            sum: d.sum,
        }
    }
}

/// Which way the value comes from.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum ValueFrom {
    Residues,
    Quadrature,
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
    pub value_from: ValueFrom,
    /// One sentence: do the two ways agree, and to what.
    pub agreement: String,
    /// The same as a machine word: `"single"`, `"agree"`, `"covered"` or `"disagree"`.
    pub verdict: Verdict,
    /// The residue formula applied, in words.
    pub formula: String,
    /// True when the value is a Cauchy principal value (simple poles on the real axis).
    pub principal_value: bool,
    pub method: Method,
    pub warnings: Vec<String>,
    /// The derivation: closing contour, lemma, substitution, the sum written out.
    pub derivation: Option<DerivationOut>,
}

/// What may cause a disagreement of the two ways.
const WHY: &str = "a singularity may have been missed or f may not decay as the residue formula needs; the error estimate is raised to the difference";

/// What the residue side produced.
struct ResidueSide {
    sum: Option<ResidueSum>,
    method: Method,
    formula: String,
    principal_value: bool,
    /// The derivation, its `sum` written by `assemble`.
    derivation: Option<Derivation>,
}

pub fn run(req: &RealIntegralRequest) -> Result<RealIntegralResponse, ApiError> {
    let input = FunctionInput {
        f: req.function.f.clone(),
        var: Some(req.function.var.clone().unwrap_or_else(|| "x".into())),
        params: req.function.params.clone(),
    };
    let f = compile(&input)?;
    let mut budget = budget(req.max_evaluations).weighted(f.weight());
    let mut warnings = Vec::new();
    let kind = req.kind.trim().to_ascii_lowercase();
    let (side, quadrature) = match kind.as_str() {
        "line" => line(&f, 0.0, &mut budget, &mut warnings)?,
        "fourier" => {
            let omega = match req.omega.map(Number::to_c) {
                None => return Err(ApiError::invalid(format!("kind \"{kind}\" needs \"omega\" (a real number)"))),
                Some(w) if !(w.re.is_finite() && w.im == 0.0) => return Err(ApiError::invalid("\"omega\" must be a finite real number")),
                Some(w) => w.re,
            };
            if omega == 0.0 {
                warnings.push("ω = 0: the Fourier integral is the line integral ∫ f(x) dx".into());
            }
            line(&f, omega, &mut budget, &mut warnings)?
        }
        "trig" => trig(&f, &mut budget, &mut warnings)?,
        "mellin" => {
            let Some(alpha) = req.alpha else {
                return Err(ApiError::invalid("kind \"mellin\" needs \"alpha\" (a number or [re, im]): the integral is ∫_0^∞ x^(alpha−1) f(x) dx"));
            };
            let alpha = crate::api::input::finite(alpha, "alpha")?;
            mellin(&f, alpha, &mut budget, &mut warnings)?
        }
        other => return Err(ApiError::invalid(format!("unknown kind \"{other}\"; use \"line\", \"fourier\", \"trig\" or \"mellin\""))),
    };
    Ok(assemble(side, quadrature, warnings))
}

type Sides = (ResidueSide, QuadResult);

/// `line` and `fourier`: exact residues for rational f, located ones otherwise.
fn line(f: &Function, omega: f64, budget: &mut Budget, warnings: &mut Vec<String>) -> Result<Sides, ApiError> {
    let eval = |z| f.eval(z);
    let eval_d = |z| f.eval_d(z);
    let Some(r) = f.rational() else {
        let decay = line_decay(&eval, omega)?;
        let sum = real_line::general_line_residues(&eval, &eval_d, &hints(f), omega, &decay, budget, warnings)?;
        let rays = decay.arcs_decay && omega != 0.0;
        let q = line_integral(&eval, omega, &[], decay.box_radius, rays, budget)?;
        let formula = real_line::formula(omega, false);
        let d = derivation::half_disc(omega, decay.box_radius, Vec::new(), None, String::new());
        return Ok((ResidueSide { sum, method: Method::Numerical, formula, principal_value: false, derivation: Some(d) }, q));
    };
    let a = analyse_function(f)?;
    warnings.extend(a.warnings.iter().cloned());
    check_rational_decay(&r.num, a.infinity_order, omega)?;
    let res = real_line::rational_line_residues(&a, omega, warnings)?;
    // Beyond `clear_beyond` no pole lies, so the tails can be moved onto vertical rays.
    let q = line_integral(&eval, omega, &res.real_poles, res.clear_beyond, omega != 0.0, budget)?;
    let pv = res.principal_value();
    let formula = real_line::formula(omega, pv);
    let indentations = res.real_poles.iter().map(|p| p.0).collect();
    let d = derivation::half_disc(omega, res.clear_beyond, indentations, Some(-a.infinity_order), String::new());
    Ok((ResidueSide { sum: Some(res.sum), method: Method::Rational, formula, principal_value: pv, derivation: Some(d) }, q))
}

/// `trig`: residues of g inside the unit circle; the periodic trapezoidal rule.
fn trig(f: &Function, budget: &mut Budget, warnings: &mut Vec<String>) -> Result<Sides, ApiError> {
    let eval = |z| f.eval(z);
    unit_circle::check_periodic(&eval)?;
    let q = periodic_integral(&eval, budget)?;
    let branches = f.analysis().uses_branch_functions;
    let sum = unit_circle::unit_circle_residues(&eval, &|z| f.eval_d(z), branches, budget, warnings)?;
    let formula = unit_circle::FORMULA.into();
    let d = derivation::unit_circle(String::new());
    Ok((ResidueSide { sum, method: Method::Numerical, formula, principal_value: false, derivation: Some(d) }, q))
}

/// `mellin`: the keyhole sum for rational f; quadrature in u = ln x.
fn mellin(f: &Function, alpha: crate::C, budget: &mut Budget, warnings: &mut Vec<String>) -> Result<Sides, ApiError> {
    let Some(r) = f.rational() else {
        return Err(ApiError::invalid("kind \"mellin\" needs f rational in the variable (a ratio of polynomials) with no poles on (0, ∞); for other f use kind \"line\" after the substitution x = e^u"));
    };
    let (num, den) = (crate::poly::trim(&r.num), crate::poly::trim(&r.den));
    let strip = keyhole::check_alpha(&num, &den, alpha)?;
    let a = analyse_function(f)?;
    warnings.extend(a.warnings.iter().cloned());
    let sum = keyhole::keyhole_residues(&a, alpha)?;
    let q = log_substituted_integral(&|z| f.eval(z), &num, &den, alpha, budget, warnings)?;
    let formula = keyhole::FORMULA.into();
    let (outer, inner) = keyhole::drawn_radii(&a);
    let d = derivation::keyhole(outer, inner, strip.at_zero, strip.at_infinity, alpha, String::new());
    Ok((ResidueSide { sum: Some(sum), method: Method::Rational, formula, principal_value: false, derivation: Some(d) }, q))
}

/// Reconcile the two ways (residues preferred for rational f) and write the response.
fn assemble(side: ResidueSide, q: QuadResult, mut warnings: Vec<String>) -> RealIntegralResponse {
    if !q.converged {
        let e = crate::text::Sci(q.error_estimate);
        warnings.push(format!("the quadrature did not reach its tolerance (error estimate {e:.1e}); f may vary sharply or decay slowly"));
    }
    let residues = side.sum.as_ref().map(|s| Way::new(WayName::Residues, s.value, s.error));
    let quad = Way::new(WayName::Quadrature, q.value, q.error_estimate);
    let ways: Vec<Way> = residues.into_iter().chain([quad]).collect();
    let preferred: &[WayName] = if side.method == Method::Rational { &[WayName::Residues] } else { &[] };
    let verdict = reconcile(&ways, preferred, 1.0);
    let mut agreement = verdict.sentence(WHY);
    if residues.is_none() {
        agreement.push_str(" (residues not available; see warnings)");
    }
    if verdict.needs_warning() {
        warnings.push(agreement.clone());
    }
    let derivation = match (side.derivation, &side.sum) {
        (Some(mut d), Some(s)) => {
            let pairs: Vec<_> = s.terms.iter().map(|t| (t.weight, t.residue)).collect();
            d.sum = derivation::written_sum(&pairs, s.value);
            Some(DerivationOut::from(d))
        }
        _ => None,
    };
    let terms = side.sum.map(|s| s.terms).unwrap_or_default();
    RealIntegralResponse {
        value: pair(verdict.value),
        by_quadrature: pair(quad.value),
        by_residues: residues.map(|w| pair(w.value)),
        residues_used: (terms.into_iter())
            .map(|t| ResidueUsed { at: pair(t.at), residue: pair(t.residue), weight: pair(t.weight), order: t.role.order(), note: t.role.note(), error_estimate: t.error })
            .collect(),
        max_discrepancy: verdict.max_discrepancy,
        error_estimate: verdict.error,
        quadrature_error_estimate: quad.error,
        residues_error_estimate: residues.map(|w| w.error),
        value_from: if verdict.from == WayName::Residues { ValueFrom::Residues } else { ValueFrom::Quadrature },
        agreement,
        verdict: verdict.agreement.into(),
        formula: side.formula,
        principal_value: side.principal_value,
        method: side.method,
        warnings,
        derivation,
    }
}

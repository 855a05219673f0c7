//! `transfer_function`: the readings of a rational transfer function F in s
//! (continuous) or z (discrete, sampling period T): pole and zero data, DC and
//! high-frequency gains, the frequency response with gain and phase margins,
//! the encirclement count of the Nyquist contour's image about −1 (or a given
//! point), and the step and impulse responses (with the step metrics in s).
//!
//! Plan: compile F, refuse it unless rational (`not_applicable`), analyse it
//! exactly, then call each method of `transforms::system` once and convert.
//! Frequencies are rad per unit time, or Hz with `"hz": true` (f = ω/2π), and
//! the response says which in `unit`.

use crate::api::error::ApiError;
use crate::api::input::{budget, compile_text, CAUTION};
use crate::budget::Budget;
use crate::api::shape::{Expect, Field};
use crate::error::Failure;
use crate::api::wire::{pair, FunctionInput, Number, BUDGET_FIELD, FUNCTION_FIELDS};
use crate::poly::{from_roots, mul, trim};
use crate::singular::rational_poles::{analyse_function, RationalAnalysis};
use crate::text;
use crate::transforms::laplace::residues::{has_real_coefficients, residue_series};
use crate::transforms::system::contour_image::Kind;
use crate::transforms::system::encirclement::count;
use crate::transforms::system::frequency_response::{default_grid, margins, response};
use crate::transforms::system::pole_data::{
    all_stable, dc_gain, discrete_span, high_frequency_gain, relative_degree, root_data, root_sizes, Gain, RootData,
};
use crate::transforms::system::step_response::{grid, metrics, sequence_metrics, step_analysis};
use crate::transforms::system::Domain;
use crate::transforms::z::recurrence::impulse_response;
use crate::C;
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;
use std::f64::consts::PI;

/// Most evaluations of F the image walk may spend.
pub const IMAGE_EVALUATIONS: u64 = 2_000_000;
/// Most frequencies or times one request may list.
pub const MAX_POINTS: usize = 10_000;
/// Largest sample index n = t/T of a discrete response.
pub const MAX_SAMPLE_INDEX: usize = 1_000_000;
/// Most samples returned for the step and impulse responses when `t` is not given.
pub const MAX_RESPONSE_SAMPLES: usize = 2_000;

/// The declared fields of [`TransferFunctionRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] = &[
    FUNCTION_FIELDS,
    &[
        Field::optional("domain", Expect::OrNull(&Expect::Text)),
        Field::optional("sample_period", Expect::OrNull(&Expect::Positive)),
        Field::optional("omega", Expect::OrNull(&Expect::AtMost(MAX_POINTS, &Expect::Positive))),
        Field::optional("hz", Expect::OrNull(&Expect::Bool)),
        Field::optional("point", Expect::OrNull(&Expect::Complex)),
        Field::optional("t", Expect::OrNull(&Expect::AtMost(MAX_POINTS, &Expect::Real))),
        BUDGET_FIELD,
    ],
];

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct TransferFunctionRequest {
    pub f: String,
    /// `s` by default (`z` when `domain` is `"z"`).
    #[serde(default)]
    pub var: Option<String>,
    #[serde(default)]
    pub params: BTreeMap<String, Number>,
    /// `"s"` or `"z"`; by default `"z"` when the variable is `z`, else `"s"`.
    #[serde(default)]
    pub domain: Option<String>,
    /// T for `"z"` (default 1).
    #[serde(default)]
    pub sample_period: Option<f64>,
    /// Frequencies for the response (rad per unit time, or Hz with `hz`); default a grid.
    #[serde(default)]
    pub omega: Option<Vec<f64>>,
    #[serde(default)]
    pub hz: Option<bool>,
    /// The point the encirclement is counted about (default −1).
    #[serde(default)]
    pub point: Option<Number>,
    /// Times for the step and impulse samples (t ≥ 0; at 0 the limit from the right; in z rounded to
    /// the nearest sample n = t/T); default a grid.
    #[serde(default)]
    pub t: Option<Vec<f64>>,
    /// The work budget: the frequency-grid evaluations, the image walk and the step/impulse samples are charged.
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

/// One pole or zero.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct RootOut {
    pub at: [f64; 2],
    pub order: u32,
    pub time_constant: Option<f64>,
    /// In `unit`.
    pub natural_frequency: Option<f64>,
    pub damping_ratio: Option<f64>,
    pub quality_factor: Option<f64>,
    /// z only: ln(p)/T.
    pub s_equivalent: Option<[f64; 2]>,
    /// z only: |p|.
    pub magnitude: Option<f64>,
}

/// A gain: `value` when finite, else `infinite` with `pole_order` poles at the point.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct GainOut {
    pub value: Option<[f64; 2]>,
    pub infinite: bool,
    /// Integrators (poles at s = 0, z = 1) for the DC gain; the pole order at ∞ for the high-frequency gain in s.
    pub pole_order: u32,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct FrequencyOut {
    pub omega: Vec<f64>,
    pub magnitude_db: Vec<f64>,
    pub phase_deg: Vec<f64>,
    /// `"rad/s"` or `"Hz"` (rad or cycles per unit time).
    pub unit: String,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct MarginsOut {
    pub gain_crossovers: Vec<f64>,
    pub phase_margins: Vec<f64>,
    pub phase_crossovers: Vec<f64>,
    pub gain_margins: Vec<f64>,
    pub unit: String,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct EncirclementOut {
    pub about: [f64; 2],
    /// N: clockwise encirclements of `about` as ω increases (counterclockwise count −1 each); null when
    /// the image passes through the point.
    pub winding: Option<i32>,
    pub direction: String,
    /// P: poles of F in the right half-plane (outside the unit circle in z).
    pub open_loop_rhp_poles: u32,
    /// Z: roots of F − about there (closed-loop poles for about = −1).
    pub closed_loop_rhp_poles: u32,
    /// N from the image sampled along the contour (null when not resolved).
    pub sampled_winding: Option<i32>,
    pub caution: String,
}

/// F = N/D after cancelling common factors, descending powers, D monic.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct CoefficientsOut {
    pub numerator: Vec<[f64; 2]>,
    pub denominator: Vec<[f64; 2]>,
}

/// One piece of the image of the encirclement contour.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ImageSegmentOut {
    /// `"axis"`, `"indent"` or `"closing"`.
    pub kind: String,
    /// The frequency of each point (in `unit`, negative ones too), `"axis"` pieces only.
    pub omega: Option<Vec<f64>>,
    pub value: Vec<[f64; 2]>,
}

/// F along the encirclement contour, in contour order.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ImageOut {
    pub about: [f64; 2],
    pub segments: Vec<ImageSegmentOut>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct StepOut {
    pub t: Vec<f64>,
    pub y: Vec<f64>,
    pub steady_state: Option<f64>,
    pub rise_time: Option<f64>,
    pub overshoot_percent: Option<f64>,
    pub settling_time: Option<f64>,
    pub peak_time: Option<f64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ImpulseOut {
    pub t: Vec<f64>,
    pub y: Vec<f64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct TransferFunctionResponse {
    pub domain: String,
    /// T (z only).
    pub sample_period: Option<f64>,
    pub poles: Vec<RootOut>,
    pub zeros: Vec<RootOut>,
    pub dc_gain: GainOut,
    pub high_frequency_gain: GainOut,
    /// deg den − deg num.
    pub relative_degree: i32,
    pub coefficients: CoefficientsOut,
    /// k in F = k·Π(v − zᵢ)/Π(v − pᵢ): the numerator's leading coefficient.
    pub gain: [f64; 2],
    pub frequency_response: FrequencyOut,
    pub margins: MarginsOut,
    pub encirclement: EncirclementOut,
    pub image: ImageOut,
    pub step: StepOut,
    pub impulse: ImpulseOut,
    pub warnings: Vec<String>,
}

pub fn run(req: &TransferFunctionRequest) -> Result<TransferFunctionResponse, ApiError> {
    let (domain, var) = domain_of(req)?;
    let input = FunctionInput { f: String::new(), var: Some(var), params: req.params.clone() };
    let f = compile_text(&req.f, &input, "f")?;
    let a = analyse_function(&f)?;
    let r = f.rational().expect("analyse_function refuses a non-rational f");
    let (num, den) = (trim(&r.num), trim(&r.den));
    if num.is_empty() {
        return Err(Failure::not_applicable("F is identically zero: it has no frequency response, poles or zeros to read").into());
    }
    let mut warnings = a.warnings.clone();
    let real = has_real_coefficients(&num, &den);
    if !real {
        warnings.push("F has complex coefficients: the responses below are the real parts".into());
    }
    let hz = req.hz.unwrap_or(false);
    let to_unit = if hz { 1.0 / (2.0 * PI) } else { 1.0 };
    let unit = if hz { "Hz" } else { "rad/s" }.to_string();
    let eval = |x: C| f.eval(x);
    let mut budget = budget(req.max_evaluations).weighted(f.weight());

    let roots = |list: Vec<RootData>| list.into_iter().map(|d| root_out(d, to_unit)).collect::<Vec<_>>();
    let poles = roots(a.poles.iter().map(|p| root_data(p.at, p.order, domain)).collect());
    let zeros = roots(a.zeros.iter().map(|z| root_data(z.at, z.order, domain)).collect());
    let lead = num[num.len() - 1] / den[den.len() - 1];
    let dc = dc_gain(&a, &eval, domain);
    let hf = high_frequency_gain(&a, &eval, lead, domain);

    let omega = match &req.omega {
        Some(w) => frequencies(w, hz, domain)?,
        None => default_grid(&root_sizes(&a, domain), domain),
    };
    budget.spend(omega.len() as u64)?;
    let fr = response(&eval, &omega, domain);
    let m = margins(&eval, &fr, domain);
    // Each crossing: about 62 evaluations of its bisection.
    budget.spend(62 * (m.gain_crossovers.len() + m.phase_crossovers.len()) as u64)?;

    let about = req.point.map(|p| p.to_c()).unwrap_or(C::new(-1.0, 0.0));
    let e = count(&num, &den, about, domain, (budget.remaining() / budget.weight()).min(IMAGE_EVALUATIONS))?;
    budget.spend(e.evaluations)?;
    if e.on_contour > 0 {
        warnings.push(format!(
            "F − ({}) has a root on the {}: the image passes through the point, so no encirclement count is given",
            text::complex(about, 0.0),
            if domain == Domain::S { "imaginary axis" } else { "unit circle" }
        ));
    } else if e.sampled_winding != e.winding {
        warnings.push(format!(
            "the sampled winding of the image ({}) differs from the count by the argument principle ({}); the \
             count from the exact roots is given",
            e.sampled_winding.map_or("unresolved".into(), |n| n.to_string()),
            e.winding.map_or("none".into(), |n| n.to_string())
        ));
    }

    let (step, impulse) = match domain {
        Domain::S => continuous_responses(&a, &num, &den, dc, req.t.as_deref(), &mut warnings, &mut budget)?,
        Domain::Z { period } => discrete_responses(&a, &num, &den, dc, period, req.t.as_deref(), &mut budget)?,
    };
    Ok(TransferFunctionResponse {
        domain: if domain == Domain::S { "s" } else { "z" }.into(),
        sample_period: match domain {
            Domain::S => None,
            Domain::Z { period } => Some(period),
        },
        poles,
        zeros,
        dc_gain: gain_out(dc),
        high_frequency_gain: gain_out(hf),
        relative_degree: relative_degree(&a),
        coefficients: coefficients(&a, &num, &den, real),
        gain: pair(lead + 0.0),
        frequency_response: FrequencyOut {
            omega: fr.omega.iter().map(|w| w * to_unit).collect(),
            magnitude_db: fr.magnitude_db,
            phase_deg: fr.phase_deg,
            unit: unit.clone(),
        },
        margins: MarginsOut {
            gain_crossovers: m.gain_crossovers.iter().map(|w| w * to_unit).collect(),
            phase_margins: m.phase_margins,
            phase_crossovers: m.phase_crossovers.iter().map(|w| w * to_unit).collect(),
            gain_margins: m.gain_margins,
            unit,
        },
        encirclement: EncirclementOut {
            about: pair(about),
            winding: e.winding,
            direction: "clockwise".into(),
            open_loop_rhp_poles: e.open_loop_unstable,
            closed_loop_rhp_poles: e.closed_loop_unstable,
            sampled_winding: e.sampled_winding,
            caution: CAUTION.into(),
        },
        image: ImageOut {
            about: pair(about),
            segments: e
                .image
                .into_iter()
                .map(|seg| ImageSegmentOut {
                    kind: match seg.kind {
                        Kind::Axis => "axis",
                        Kind::Indent => "indent",
                        Kind::Closing => "closing",
                    }
                    .into(),
                    omega: seg.omega.map(|w| w.iter().map(|x| x * to_unit).collect()),
                    value: seg.value.into_iter().map(pair).collect(),
                })
                .collect(),
        },
        step,
        impulse,
        warnings,
    })
}

/// N and D of F in descending powers after cancelling common factors, D monic: the typed
/// coefficients when nothing cancelled, else rebuilt from the roots (k·Π(v − zᵢ), Π(v − pᵢ)).
fn coefficients(a: &RationalAnalysis, num: &[C], den: &[C], real: bool) -> CoefficientsOut {
    let zeros: Vec<C> = a.zeros.iter().flat_map(|z| std::iter::repeat_n(z.at, z.order as usize)).collect();
    let poles: Vec<C> = a.poles.iter().flat_map(|p| std::iter::repeat_n(p.at, p.order as usize)).collect();
    let d = den[den.len() - 1];
    let (n, m) = if zeros.len() + 1 == num.len() && poles.len() + 1 == den.len() {
        (num.iter().map(|c| c / d).collect::<Vec<_>>(), den.iter().map(|c| c / d).collect::<Vec<_>>())
    } else {
        let lead = num[num.len() - 1] / d;
        (from_roots(lead, &zeros), from_roots(C::new(1.0, 0.0), &poles))
    };
    let out = |p: Vec<C>| -> Vec<[f64; 2]> {
        p.into_iter().rev().map(|c| pair(if real { C::new(c.re, 0.0) } else { c } + 0.0)).collect()
    };
    CoefficientsOut { numerator: out(n), denominator: out(m) }
}

fn domain_of(req: &TransferFunctionRequest) -> Result<(Domain, String), ApiError> {
    let name = match (req.domain.as_deref(), req.var.as_deref()) {
        (Some(d), _) => d.to_string(),
        (None, Some("z")) => "z".into(),
        (None, _) => "s".into(),
    };
    let period = req.sample_period.unwrap_or(1.0);
    if !(period.is_finite() && period > 0.0) {
        return Err(ApiError::invalid("\"sample_period\" must be a finite number > 0"));
    }
    let domain = match name.as_str() {
        "s" => Domain::S,
        "z" => Domain::Z { period },
        other => return Err(ApiError::invalid(format!("\"domain\" is \"{other}\"; use \"s\" (continuous) or \"z\" (discrete)"))),
    };
    let var = req.var.clone().unwrap_or_else(|| name.clone());
    Ok((domain, var))
}

fn root_out(d: RootData, to_unit: f64) -> RootOut {
    RootOut {
        at: pair(d.at + 0.0),
        order: d.order,
        time_constant: d.time_constant,
        natural_frequency: d.natural_frequency.map(|w| w * to_unit),
        damping_ratio: d.damping_ratio,
        quality_factor: d.quality_factor,
        s_equivalent: d.s_equivalent.map(pair),
        magnitude: d.magnitude,
    }
}

fn gain_out(g: Gain) -> GainOut {
    GainOut { value: g.value.map(pair), infinite: g.value.is_none(), pole_order: g.pole_order }
}

fn frequencies(w: &[f64], hz: bool, domain: Domain) -> Result<Vec<f64>, ApiError> {
    if w.is_empty() {
        return Err(ApiError::invalid("\"omega\" is empty; omit it for the default grid"));
    }
    let omega: Vec<f64> = w.iter().map(|x| if hz { 2.0 * PI * x } else { *x }).collect();
    if let Domain::Z { period } = domain {
        if let Some(i) = omega.iter().position(|&x| x > PI / period * (1.0 + 1e-12)) {
            return Err(ApiError::invalid(format!(
                "omega[{i}] is beyond the Nyquist frequency π/T = {} rad per unit time; a discrete response repeats \
                 beyond it",
                text::real(PI / period)
            )));
        }
    }
    Ok(omega)
}

fn times(t: Option<&[f64]>, default: Vec<f64>) -> Result<Vec<f64>, ApiError> {
    let Some(t) = t else { return Ok(default) };
    if let Some(i) = t.iter().position(|x| !(x.is_finite() && *x >= 0.0)) {
        return Err(ApiError::invalid(format!("t[{i}] must be a finite number ≥ 0")));
    }
    Ok(t.to_vec())
}

/// Every k-th point so that at most MAX_RESPONSE_SAMPLES remain.
fn thin(t: Vec<f64>) -> Vec<f64> {
    let k = t.len().div_ceil(MAX_RESPONSE_SAMPLES).max(1);
    t.into_iter().step_by(k).collect()
}

fn continuous_responses(
    a: &RationalAnalysis,
    num: &[C],
    den: &[C],
    dc: Gain,
    t: Option<&[f64]>,
    warnings: &mut Vec<String>,
    budget: &mut Budget,
) -> Result<(StepOut, ImpulseOut), ApiError> {
    let s = step_analysis(num, den)?;
    let stable = all_stable(a, Domain::S);
    let steady = dc.value.filter(|_| stable).map(|v| v.re);
    let m = metrics(a, &s, steady);
    if !stable {
        warnings.push(format!(
            "a pole of F is not in the open left half-plane: the step response has no steady state, and no step \
             metric is given. {CAUTION}"
        ));
    }
    if relative_degree(a) <= 0 {
        warnings.push(
            "deg num ≥ deg den: the impulse response holds δ(t) terms at t = 0 (and the step response too when \
             deg num > deg den); the values here are for t > 0"
                .into(),
        );
    }
    let t = times(t, thin(grid(a)))?;
    // Each sample of the step and the impulse sums one exponential term a pole (and its powers).
    budget.spend_units(2 * t.len() as u64 * (den.len() as u64 + 1))?;
    let at = |x: &RationalAnalysis| -> Vec<f64> {
        // At t = 0 the residue sum is the limit from the right.
        residue_series(x, &t).iter().map(|v| v.0.re).collect()
    };
    let (ys, yi) = (at(&s), at(a));
    Ok((
        StepOut {
            t: t.clone(),
            y: ys,
            steady_state: m.steady_state,
            rise_time: m.rise_time,
            overshoot_percent: m.overshoot_percent,
            settling_time: m.settling_time,
            peak_time: m.peak_time,
        },
        ImpulseOut { t, y: yi },
    ))
}

/// Sequences y[n] at t = nT: the impulse response of F and of F·z/(z − 1) (the step), by the difference equation.
fn discrete_responses(
    a: &RationalAnalysis,
    num: &[C],
    den: &[C],
    dc: Gain,
    period: f64,
    t: Option<&[f64]>,
    budget: &mut Budget,
) -> Result<(StepOut, ImpulseOut), ApiError> {
    let default_n = discrete_span(a, MAX_RESPONSE_SAMPLES);
    let n: Vec<usize> = match t {
        Some(_) => {
            let t = times(t, Vec::new())?;
            if t.iter().any(|x| x / period > MAX_SAMPLE_INDEX as f64) {
                return Err(ApiError::invalid(format!(
                    "a time in \"t\" is beyond sample {MAX_SAMPLE_INDEX} (t/T); ask for earlier times"
                )));
            }
            t.iter().map(|x| (x / period).round() as usize).collect()
        }
        None => (0..default_n).collect(),
    };
    let count = n.iter().copied().max().unwrap_or(0) + 1;
    // The difference equations: each sample costs one multiply-add a coefficient, three sequences.
    let span = count.max(discrete_span(a, MAX_RESPONSE_SAMPLES));
    budget.spend_units(3 * span as u64 * (num.len() + den.len() + 2) as u64 / 4)?;
    let h = impulse_response(num, den, count, &[1.0])?;
    let step_num = mul(num, &[C::new(0.0, 0.0), C::new(1.0, 0.0)]);
    let step_den = mul(den, &[C::new(-1.0, 0.0), C::new(1.0, 0.0)]);
    let s = impulse_response(&step_num, &step_den, count, &[1.0])?;
    let stable = all_stable(a, Domain::Z { period });
    let tk: Vec<f64> = n.iter().map(|&k| k as f64 * period).collect();
    // The metrics read on the default span of samples (or up to the largest requested one, if longer).
    let whole = if span > count { impulse_response(&step_num, &step_den, span, &[1.0])? } else { s.clone() };
    let sequence: Vec<f64> = whole.values.iter().map(|v| v.re).collect();
    let m = sequence_metrics(&sequence, period, dc.value.filter(|_| stable).map(|v| v.re));
    Ok((
        StepOut {
            t: tk.clone(),
            y: n.iter().map(|&k| s.values[k].re).collect(),
            steady_state: m.steady_state,
            rise_time: m.rise_time,
            overshoot_percent: m.overshoot_percent,
            settling_time: m.settling_time,
            peak_time: m.peak_time,
        },
        ImpulseOut { t: tk, y: n.iter().map(|&k| h.values[k].re).collect() },
    ))
}

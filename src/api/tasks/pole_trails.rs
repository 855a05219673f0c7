//! `pole_trails`: how the poles and zeros of a rational F move as one
//! parameter sweeps a range.
//!
//! Plan: check the sweep, then for each value substitute the parameter,
//! compile F and read its rational form (refused unless rational:
//! `not_applicable`), find the roots of the numerator and denominator after
//! cancelling common factors (the same rational analysis `transfer_function`
//! uses), and match them to the trails so far (`transforms::system::pole_trails`).

use crate::api::error::ApiError;
use crate::api::input::{budget, compile_text};
use crate::api::shape::{Expect, Field};
use crate::api::wire::{pair, FunctionInput, Number, BUDGET_FIELD, FUNCTION_FIELDS};
use crate::error::Failure;
use crate::singular::rational_poles::analyse_function;
use crate::text;
use crate::transforms::system::pole_trails::Trails;
use crate::C;
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;

/// Fewest and most sweep values.
pub const MIN_STEPS: u64 = 2;
pub const MAX_STEPS: u64 = 2000;
/// Default number of sweep values.
pub const DEFAULT_STEPS: u64 = 60;

const SWEEP_FIELDS: &[Field] = &[
    Field::required("name", Expect::Text),
    Field::required("from", Expect::Real),
    Field::required("to", Expect::Real),
    Field::optional("steps", Expect::OrNull(&Expect::Count)),
    Field::optional("scale", Expect::OrNull(&Expect::Text)),
];

/// The declared fields of [`PoleTrailsRequest`] (checked by `api::shape`).
pub const FIELDS: &[&[Field]] =
    &[FUNCTION_FIELDS, &[Field::required("sweep", Expect::Object(&[SWEEP_FIELDS])), BUDGET_FIELD]];

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct Sweep {
    pub name: String,
    pub from: f64,
    pub to: f64,
    /// Default 60, 2 to 2000.
    #[serde(default)]
    pub steps: Option<u64>,
    /// `"linear"` (default) or `"log"` (from, to > 0).
    #[serde(default)]
    pub scale: Option<String>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PoleTrailsRequest {
    pub f: String,
    /// Default `"s"`.
    #[serde(default)]
    pub var: Option<String>,
    #[serde(default)]
    pub params: BTreeMap<String, Number>,
    pub sweep: Sweep,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct PoleTrailsResponse {
    pub name: String,
    pub values: Vec<f64>,
    /// Each trail: one entry a value, `[re, im]` or null where that root does not exist.
    pub poles: Vec<Vec<Option<[f64; 2]>>>,
    pub zeros: Vec<Vec<Option<[f64; 2]>>>,
    pub warnings: Vec<String>,
}

/// Budget units one step costs: the compile and the rational analysis, 2·(n + 4)² with n the number
/// of coefficients of N and D (measured natively: about 50 µs = 500 units a step at degree 10 over
/// degree 4, n = 16; bench/transfer_function.rs).
fn step_units(coefficients: usize) -> u64 {
    let n = coefficients as u64 + 4;
    2 * n * n
}

pub fn run(req: &PoleTrailsRequest) -> Result<PoleTrailsResponse, ApiError> {
    let var = req.var.clone().unwrap_or_else(|| "s".into());
    let s = &req.sweep;
    let steps = s.steps.unwrap_or(DEFAULT_STEPS);
    if !(MIN_STEPS..=MAX_STEPS).contains(&steps) {
        return Err(ApiError::invalid(format!("\"sweep.steps\" is {steps}; use {MIN_STEPS} to {MAX_STEPS}")));
    }
    if !(s.from.is_finite() && s.to.is_finite()) {
        return Err(ApiError::invalid("\"sweep.from\" and \"sweep.to\" must be finite numbers"));
    }
    let log = match s.scale.as_deref() {
        None | Some("linear") => false,
        Some("log") => true,
        Some(other) => {
            return Err(ApiError::invalid(format!("\"sweep.scale\" is \"{other}\"; use \"linear\" or \"log\"")))
        }
    };
    if log && !(s.from > 0.0 && s.to > 0.0) {
        return Err(ApiError::invalid("a \"log\" sweep needs \"sweep.from\" and \"sweep.to\" > 0"));
    }
    if s.name == var {
        return Err(ApiError::invalid(format!("\"sweep.name\" is \"{}\", the variable; sweep a parameter of f", s.name)));
    }
    // The name must be one f uses: a name in its text, and f without it must not compile.
    let mut without = req.params.clone();
    without.remove(&s.name);
    let plain = FunctionInput { f: String::new(), var: Some(var.clone()), params: without.clone() };
    let names: Vec<&str> = req.f.split(|c: char| !(c.is_alphanumeric() || c == '_')).collect();
    if !names.contains(&s.name.as_str()) || compile_text(&req.f, &plain, "f").is_ok() {
        return Err(ApiError::invalid(format!("\"sweep.name\": f has no parameter \"{}\"", s.name)));
    }
    let n = steps as usize;
    let values: Vec<f64> = (0..n)
        .map(|i| {
            let t = i as f64 / (n - 1) as f64;
            if i + 1 == n {
                s.to
            } else if log {
                s.from * (s.to / s.from).powf(t)
            } else {
                s.from * (1.0 - t) + s.to * t
            }
        })
        .collect();
    let mut budget = budget(req.max_evaluations);
    let (mut poles, mut zeros) = (Trails::default(), Trails::default());
    let mut warnings: Vec<String> = Vec::new();
    let mut degrees: Option<(usize, usize)> = None;
    let mut degree_changed = false;
    for &v in &values {
        let mut params = without.clone();
        params.insert(s.name.clone(), Number::Real(v));
        let input = FunctionInput { f: String::new(), var: Some(var.clone()), params };
        let f = compile_text(&req.f, &input, "f")?;
        let r = f.rational().ok_or_else(|| Failure::not_applicable("f is not a rational function of its variable"))?;
        budget.spend_units(step_units(r.num.len() + r.den.len()))?;
        let (p, z) = match analyse_function(&f) {
            Ok(a) => {
                for w in a.warnings {
                    if warnings.len() < 8 && !warnings.contains(&w) {
                        warnings.push(w);
                    }
                }
                let expand = |list: Vec<(C, u32)>| -> Vec<C> {
                    list.into_iter().flat_map(|(at, m)| std::iter::repeat_n(at + 0.0, m as usize)).collect()
                };
                (
                    expand(a.poles.iter().map(|p| (p.at, p.order)).collect()),
                    expand(a.zeros.iter().map(|z| (z.at, z.order)).collect()),
                )
            }
            Err(e) => {
                if warnings.len() < 8 {
                    warnings.push(format!("at {} = {}: no roots ({})", s.name, text::real(v), e.message()));
                }
                (Vec::new(), Vec::new())
            }
        };
        match degrees {
            Some(d) if d != (z.len(), p.len()) => degree_changed = true,
            _ => {}
        }
        degrees = Some((z.len(), p.len()));
        poles.push(&p);
        zeros.push(&z);
    }
    if degree_changed {
        warnings.push(format!(
            "the number of poles or zeros changes along the sweep (a degree drops or a common factor cancels): a \
             trail is null where its root does not exist"
        ));
    }
    let out = |t: Trails| -> Vec<Vec<Option<[f64; 2]>>> {
        t.trails.into_iter().map(|trail| trail.into_iter().map(|r| r.map(pair)).collect()).collect()
    };
    Ok(PoleTrailsResponse { name: s.name.clone(), values, poles: out(poles), zeros: out(zeros), warnings })
}

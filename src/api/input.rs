//! From wire values to checked core values: compile the expression, check
//! numbers, points and contours (errors name the field), make the budget.

use super::error::{ApiError, ErrorCode};
use super::wire::{FunctionInput, Number, Point};
use crate::budget::{Budget, DEFAULT_EVALUATIONS};
use crate::expr::{ExprError, Function};
use crate::singular::Hints;
use crate::C;

/// Said beside every stability reading (a result that can feed a control design).
pub const CAUTION: &str = "Stability readings here are numerical aids: verify them independently and follow the \
applicable codes and licensed engineering practice before relying on them in a design.";

/// Largest parameter count a request may carry.
const MAX_PARAMS: usize = 64;

/// Compile the request's expression with its variable and parameters.
/// Errors keep the character span into the expression text.
pub fn compile(input: &FunctionInput) -> Result<Function, ApiError> {
    compile_text(&input.f, input, "f")
}

/// Compile `text` (the request field named `field`) with the variable and parameters of `input`.
pub fn compile_text(text: &str, input: &FunctionInput, field: &str) -> Result<Function, ApiError> {
    let var = input.var.as_deref().unwrap_or("z");
    if input.params.len() > MAX_PARAMS {
        return Err(ApiError::invalid(format!("too many parameters (at most {MAX_PARAMS})")));
    }
    let mut params = Vec::with_capacity(input.params.len());
    for (name, value) in &input.params {
        let v = value.to_c();
        if !(v.re.is_finite() && v.im.is_finite()) {
            return Err(ApiError::invalid(format!("parameter \"{name}\" must be a finite number")));
        }
        params.push((name.clone(), v));
    }
    Function::compile(text, var, &params).map_err(|e| expr_error(e, field))
}

fn expr_error(e: ExprError, field: &str) -> ApiError {
    let message = if field == "f" { e.message } else { format!("in \"{field}\": {}", e.message) };
    ApiError { code: ErrorCode::Expression, message, span: e.span.map(|(a, b)| [a, b]) }
}

/// A finite complex number from the wire, or a clear error naming the field.
pub fn finite(n: Number, field: &str) -> Result<C, ApiError> {
    let z = n.to_c();
    if z.re.is_finite() && z.im.is_finite() {
        Ok(z)
    } else {
        Err(ApiError::invalid(format!("\"{field}\" must be finite numbers")))
    }
}
/// A contour or region from a request, checked; the message names the field.
pub fn checked_contour(c: &super::wire::ContourShape, field: &str) -> Result<crate::contour::Contour, ApiError> {
    let c = crate::contour::Contour::from(c);
    c.validate().map_err(|e| ApiError::invalid(format!("{field}: {e}")))?;
    Ok(c)
}

/// A point of the contract: `Some(z)` for `[x, y]`, `None` for `"infinity"`.
pub fn point(p: &Point, field: &str) -> Result<Option<C>, ApiError> {
    match p {
        Point::Finite([x, y]) if x.is_finite() && y.is_finite() => Ok(Some(C::new(*x, *y))),
        Point::Finite(_) => Err(ApiError::invalid(format!("\"{field}\" must be finite numbers [x, y]"))),
        Point::Named(name) if name.eq_ignore_ascii_case("infinity") => Ok(None),
        Point::Named(other) => Err(ApiError::invalid(format!(
            "\"{field}\" must be [x, y] or \"infinity\", not \"{other}\""
        ))),
    }
}

/// The work budget a request asked for, or the default.
pub fn budget(max_evaluations: Option<u64>) -> Budget {
    Budget::new(max_evaluations.unwrap_or(DEFAULT_EVALUATIONS).clamp(1_000, 1_000_000_000))
}

/// What the expression's structure says about where essential singularities and
/// branch points may sit (roots of arguments' numerators and denominators).
pub fn hints(f: &Function) -> Hints {
    let a = f.analysis();
    let mut hints = Hints {
        essential_candidates: a.essential_candidates.clone(),
        branch_candidates: a.branch_candidates.clone(),
        uses_branch_functions: a.uses_branch_functions,
        poles_accumulate_at_infinity: a.poles_accumulate_at_infinity,
    };
    let roots_of = |polys: &Vec<Vec<C>>| -> Vec<C> {
        polys
            .iter()
            .filter_map(|p| crate::poly::multiplicity::distinct_roots(p).ok())
            .flat_map(|(clusters, _)| clusters.into_iter().map(|c| c.center))
            .collect()
    };
    hints.essential_candidates.extend(roots_of(&a.essential_candidate_polys));
    hints.branch_candidates.extend(roots_of(&a.branch_candidate_polys));
    hints
}

/// Where the expression's rational denominators vanish: candidates for
/// removable points (and poles) that sampling cannot see.
pub fn pole_candidates(f: &Function) -> Vec<C> {
    let a = f.analysis();
    let mut out = a.pole_candidates.clone();
    for p in &a.pole_candidate_polys {
        if let Ok((clusters, _)) = crate::poly::multiplicity::distinct_roots(p) {
            out.extend(clusters.into_iter().map(|c| c.center));
        }
    }
    out
}

/// `[re, im]` list of points.
pub fn pairs(zs: &[C]) -> Vec<[f64; 2]> {
    zs.iter().map(|z| [z.re, z.im]).collect()
}

//! Task handlers behind the API doorway: each turns a parsed request into a
//! response by calling the numerical core. One file a task.

pub mod evaluate;
pub mod phase_plot;

use crate::api::{FunctionInput, Number};
use crate::error::ApiError;
use crate::expr::{ExprError, Function};
use crate::C;

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
        return Err(ApiError::new(format!("too many parameters (at most {MAX_PARAMS})")));
    }
    let mut params = Vec::with_capacity(input.params.len());
    for (name, value) in &input.params {
        let v = value.to_c();
        if !(v.re.is_finite() && v.im.is_finite()) {
            return Err(ApiError::new(format!("parameter \"{name}\" must be a finite number")));
        }
        params.push((name.clone(), v));
    }
    Function::compile(text, var, &params).map_err(|e| expr_error(e, field))
}

fn expr_error(e: ExprError, field: &str) -> ApiError {
    let message = if field == "f" { e.message } else { format!("in \"{field}\": {}", e.message) };
    ApiError { message, span: e.span.map(|(a, b)| [a, b]) }
}

/// A finite complex number from the wire, or a clear error naming the field.
pub fn finite(n: Number, field: &str) -> Result<C, ApiError> {
    let z = n.to_c();
    if z.re.is_finite() && z.im.is_finite() {
        Ok(z)
    } else {
        Err(ApiError::new(format!("\"{field}\" must be finite numbers")))
    }
}
pub mod residue;
pub mod singularities;
pub mod laurent;
pub mod partial_fractions;

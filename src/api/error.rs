//! The one error type that crosses the API: a stable machine `code`, a plain
//! message that says what to do next, and where it has one, the character span.

use crate::error::{Failure, FailureKind};
use crate::expr::ExprError;
use serde::Serialize;

/// The stable machine code of an [`ApiError`]; listed in `docs/contract.md`.
/// Callers branch on this, never on the message.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum ErrorCode {
    /// The request text is not JSON.
    InvalidJson,
    /// `"task"` is missing or names no task of the contract.
    UnknownTask,
    /// A field is missing or of the wrong type.
    BadRequest,
    /// A field's value is out of range or not allowed; the message names the field.
    InvalidField,
    /// The expression does not parse or names something unknown; `span` points at it.
    Expression,
    /// The work budget ran out.
    BudgetExhausted,
    /// f is not finite at a point the method must evaluate.
    NotFinite,
    /// A singularity lies on or too near the contour.
    OnContour,
    /// A branch cut crosses the contour where the method cannot split.
    CutCrossing,
    /// The task does not apply to this f.
    NotApplicable,
    /// An improper integral diverges.
    Divergent,
    /// The methods could not certify an answer.
    Unresolved,
    /// A fault of residuary itself.
    Internal,
}

impl ErrorCode {
    /// The code as it appears on the wire.
    pub fn as_str(self) -> &'static str {
        match self {
            ErrorCode::InvalidJson => "invalid_json",
            ErrorCode::UnknownTask => "unknown_task",
            ErrorCode::BadRequest => "bad_request",
            ErrorCode::InvalidField => "invalid_field",
            ErrorCode::Expression => "expression",
            ErrorCode::BudgetExhausted => "budget_exhausted",
            ErrorCode::NotFinite => "not_finite",
            ErrorCode::OnContour => "on_contour",
            ErrorCode::CutCrossing => "cut_crossing",
            ErrorCode::NotApplicable => "not_applicable",
            ErrorCode::Divergent => "divergent",
            ErrorCode::Unresolved => "unresolved",
            ErrorCode::Internal => "internal",
        }
    }

    /// Every code, in the order of the contract's table.
    pub const ALL: [ErrorCode; 13] = [
        ErrorCode::InvalidJson,
        ErrorCode::UnknownTask,
        ErrorCode::BadRequest,
        ErrorCode::InvalidField,
        ErrorCode::Expression,
        ErrorCode::BudgetExhausted,
        ErrorCode::NotFinite,
        ErrorCode::OnContour,
        ErrorCode::CutCrossing,
        ErrorCode::NotApplicable,
        ErrorCode::Divergent,
        ErrorCode::Unresolved,
        ErrorCode::Internal,
    ];
}

impl From<FailureKind> for ErrorCode {
    fn from(kind: FailureKind) -> Self {
        match kind {
            FailureKind::Budget => ErrorCode::BudgetExhausted,
            FailureKind::NotFinite => ErrorCode::NotFinite,
            FailureKind::OnContour => ErrorCode::OnContour,
            FailureKind::CutCrossing => ErrorCode::CutCrossing,
            FailureKind::Invalid => ErrorCode::InvalidField,
            FailureKind::NotApplicable => ErrorCode::NotApplicable,
            FailureKind::Divergent => ErrorCode::Divergent,
            FailureKind::Unresolved => ErrorCode::Unresolved,
        }
    }
}

/// A user-facing error: a stable `code`, a plain message that says what to do
/// next, and where it has one, the character span `[start, end)` of the input.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ApiError {
    pub code: ErrorCode,
    pub message: String,
    pub span: Option<[usize; 2]>,
}

impl ApiError {
    pub fn new(code: ErrorCode, message: impl Into<String>) -> Self {
        ApiError { code, message: message.into(), span: None }
    }

    /// A field's value is not allowed; the message names the field.
    pub fn invalid(message: impl Into<String>) -> Self {
        ApiError::new(ErrorCode::InvalidField, message)
    }

    /// A fault of residuary itself (never the user's input).
    pub fn internal(message: impl Into<String>) -> Self {
        ApiError::new(ErrorCode::Internal, message)
    }

    pub fn at(code: ErrorCode, message: impl Into<String>, start: usize, end: usize) -> Self {
        ApiError { code, message: message.into(), span: Some([start, end]) }
    }

    /// The same error with its message prefixed (`"region: …"`).
    pub fn context(mut self, prefix: &str) -> Self {
        self.message = format!("{prefix}{}", self.message);
        self
    }

    /// The JSON shape of the public contract: `{"error":{"code":..,"message":..,"span":..}}`.
    pub fn to_json(&self) -> serde_json::Value {
        serde_json::json!({ "error": { "code": self.code, "message": self.message, "span": self.span } })
    }
}

impl From<Failure> for ApiError {
    fn from(e: Failure) -> Self {
        ApiError::new(e.kind().into(), e.message().to_string())
    }
}

impl From<crate::budget::BudgetExceeded> for ApiError {
    fn from(e: crate::budget::BudgetExceeded) -> Self {
        Failure::from(e).into()
    }
}

impl From<ExprError> for ApiError {
    fn from(e: ExprError) -> Self {
        ApiError { code: ErrorCode::Expression, message: e.message, span: e.span.map(|(a, b)| [a, b]) }
    }
}

impl std::fmt::Display for ApiError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self.span {
            Some([a, b]) => write!(f, "{} (at characters {}..{})", self.message, a, b),
            None => write!(f, "{}", self.message),
        }
    }
}

impl std::error::Error for ApiError {}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn codes_serialise_to_their_wire_names() {
        for code in ErrorCode::ALL {
            assert_eq!(serde_json::to_value(code).unwrap(), serde_json::json!(code.as_str()));
        }
    }

    #[test]
    fn failures_keep_their_sentence_and_map_their_kind() {
        let e: ApiError = Failure::on_contour("move the contour").into();
        assert_eq!(e.code, ErrorCode::OnContour);
        assert_eq!(e.to_json()["error"]["code"], "on_contour");
        assert_eq!(e.to_json()["error"]["message"], "move the contour");
    }
}

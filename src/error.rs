//! The one error type that crosses the API.

use serde::Serialize;

/// A user-facing error: a plain message that says what to do next, and where
/// it has one, the character span `[start, end)` of the offending input.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ApiError {
    pub message: String,
    pub span: Option<[usize; 2]>,
}

impl ApiError {
    pub fn new(message: impl Into<String>) -> Self {
        ApiError { message: message.into(), span: None }
    }

    pub fn at(message: impl Into<String>, start: usize, end: usize) -> Self {
        ApiError { message: message.into(), span: Some([start, end]) }
    }

    /// The JSON shape of the public contract: `{"error":{"message":..,"span":..}}`.
    pub fn to_json(&self) -> serde_json::Value {
        serde_json::json!({ "error": { "message": self.message, "span": self.span } })
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

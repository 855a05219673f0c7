//! The core's one error type: a [`Failure`] with a [`FailureKind`] that callers
//! branch on, a sentence for people, and where it has one, the point it is about.
//!
//! The shape follows ndarray's `ShapeError`: one type with a `kind()`, so no
//! caller ever reads the message to decide what to do. The API maps each kind
//! to a stable wire `code` (`crate::api::error`).

use crate::budget::BudgetExceeded;
use crate::C;

/// What went wrong, for code to branch on. The wire codes are in `docs/contract.md`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum FailureKind {
    /// The work budget (function evaluations) ran out.
    Budget,
    /// f (or an integrand) is not finite at a point a method must evaluate.
    NotFinite,
    /// A singularity lies on, or too near, the contour.
    OnContour,
    /// A branch cut crosses the contour (f jumps there).
    CutCrossing,
    /// The input is out of range or inconsistent; the message names what to change.
    Invalid,
    /// The method does not apply to this f (e.g. polynomial algebra on a non-rational f).
    NotApplicable,
    /// An improper integral diverges.
    Divergent,
    /// The method ran but could not certify an answer (no convergence, non-integer count …).
    Unresolved,
}

/// A failure of a core method: a kind, a sentence that says what to do next, and the point it is about.
#[derive(Debug, Clone, PartialEq)]
pub struct Failure {
    kind: FailureKind,
    message: String,
    at: Option<C>,
}

impl Failure {
    pub fn new(kind: FailureKind, message: impl Into<String>) -> Self {
        Failure { kind, message: message.into(), at: None }
    }

    /// The input is unusable; the message names the field or value to change.
    pub fn invalid(message: impl Into<String>) -> Self {
        Failure::new(FailureKind::Invalid, message)
    }

    pub fn not_finite(message: impl Into<String>) -> Self {
        Failure::new(FailureKind::NotFinite, message)
    }

    pub fn on_contour(message: impl Into<String>) -> Self {
        Failure::new(FailureKind::OnContour, message)
    }

    pub fn cut_crossing(message: impl Into<String>) -> Self {
        Failure::new(FailureKind::CutCrossing, message)
    }

    pub fn not_applicable(message: impl Into<String>) -> Self {
        Failure::new(FailureKind::NotApplicable, message)
    }

    pub fn divergent(message: impl Into<String>) -> Self {
        Failure::new(FailureKind::Divergent, message)
    }

    pub fn unresolved(message: impl Into<String>) -> Self {
        Failure::new(FailureKind::Unresolved, message)
    }

    /// The same failure, about the point `z`.
    pub fn at(mut self, z: C) -> Self {
        self.at = Some(z);
        self
    }

    /// The same failure with a prefix naming where it happened (`"denominator: …"`).
    pub fn context(mut self, prefix: &str) -> Self {
        self.message = format!("{prefix}{}", self.message);
        self
    }

    pub fn kind(&self) -> FailureKind {
        self.kind
    }

    pub fn is_budget(&self) -> bool {
        self.kind == FailureKind::Budget
    }

    pub fn message(&self) -> &str {
        &self.message
    }

    pub fn point(&self) -> Option<C> {
        self.at
    }
}

impl From<BudgetExceeded> for Failure {
    fn from(e: BudgetExceeded) -> Self {
        Failure::new(FailureKind::Budget, e.to_string())
    }
}

impl std::fmt::Display for Failure {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for Failure {}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn budget_failures_keep_the_budget_sentence_and_kind() {
        let f = Failure::from(BudgetExceeded { limit: 7 });
        assert!(f.is_budget());
        assert!(f.to_string().starts_with("the work budget of 7 function evaluations ran out"));
    }

    #[test]
    fn context_prefixes_and_keeps_the_kind() {
        let f = Failure::invalid("zero polynomial").context("denominator: ").at(C::new(1.0, 2.0));
        assert_eq!(f.kind(), FailureKind::Invalid);
        assert_eq!(f.message(), "denominator: zero polynomial");
        assert_eq!(f.point(), Some(C::new(1.0, 2.0)));
    }
}

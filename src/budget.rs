//! A work budget counted in function evaluations.
//!
//! Wall-clock time is not available on every target (`std::time::Instant`
//! panics on wasm32-unknown-unknown), so long computations are bounded by the
//! number of evaluations of f they may spend. The page additionally runs long
//! work where it can be cancelled.

/// Evaluations a single request may spend unless it asks for fewer.
pub const DEFAULT_EVALUATIONS: u64 = 20_000_000;

#[derive(Debug, Clone)]
pub struct Budget {
    remaining: u64,
    limit: u64,
}

/// Returned when a computation ran out of its budget.
#[derive(Debug, Clone, PartialEq)]
pub struct BudgetExceeded {
    pub limit: u64,
}

impl std::fmt::Display for BudgetExceeded {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "the work budget of {} function evaluations ran out; shrink the region or view, or raise \"max_evaluations\"",
            self.limit
        )
    }
}

impl Budget {
    pub fn new(evaluations: u64) -> Self {
        Budget { remaining: evaluations, limit: evaluations }
    }

    /// Take `n` evaluations from the budget, or fail if there are not enough.
    pub fn spend(&mut self, n: u64) -> Result<(), BudgetExceeded> {
        if n > self.remaining {
            self.remaining = 0;
            return Err(BudgetExceeded { limit: self.limit });
        }
        self.remaining -= n;
        Ok(())
    }

    pub fn remaining(&self) -> u64 {
        self.remaining
    }

    pub fn used(&self) -> u64 {
        self.limit - self.remaining
    }
}

impl Default for Budget {
    fn default() -> Self {
        Budget::new(DEFAULT_EVALUATIONS)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn spending_past_the_limit_fails_and_empties() {
        let mut b = Budget::new(10);
        assert!(b.spend(4).is_ok());
        assert_eq!(b.remaining(), 6);
        assert_eq!(b.spend(7), Err(BudgetExceeded { limit: 10 }));
        assert_eq!(b.remaining(), 0);
    }
}

//! A work budget counted in function evaluations.
//!
//! Wall-clock time is not available on every target (`std::time::Instant`
//! panics on wasm32-unknown-unknown), so long computations are bounded by the
//! number of evaluations of f they may spend. The page additionally runs long
//! work where it can be cancelled.
//!
//! One unit is one evaluation of a short f. An evaluation of a long f costs
//! [`weight_for_program`] units (its compiled program's cost over
//! [`OPS_PER_UNIT`]), so the default budget bounds a request to about the
//! same time whatever the expression; work that is not an evaluation (the
//! linear algebra of a rational fit, pixels of a plot) is charged in the same
//! units where it can dominate. Calibrated on one machine (common practice:
//! measure and round): the default budget is about 2 s of work natively.

/// Evaluations a single request may spend unless it asks for fewer.
pub const DEFAULT_EVALUATIONS: u64 = 20_000_000;

/// Arithmetic operations of a compiled program one more budget unit pays for.
pub const OPS_PER_UNIT: usize = 16;

/// Units one evaluation of a compiled program costs, from its cost in
/// arithmetic operations (`expr::program::Program::cost`): 1, plus one per
/// [`OPS_PER_UNIT`]. Measured natively: an evaluation of a short f at one
/// point takes about 0.1 µs (the unit), each arithmetic operation about 5 ns.
pub fn weight_for_program(cost: usize) -> u64 {
    1 + (cost / OPS_PER_UNIT) as u64
}

/// Units the AAA fit of `samples` values with `terms` support points costs:
/// one SVD per step, 2.5 to 5 ns · samples · terms³ in all (measured
/// natively; `singular::aaa`).
pub fn units_for_aaa(samples: usize, terms: usize) -> u64 {
    (samples as u64).saturating_mul((terms as u64).pow(3)) / 20
}

/// The most support points an AAA fit of `samples` values may take so that
/// [`units_for_aaa`] stays within `remaining` units (at least 1).
pub fn aaa_terms_within(samples: usize, remaining: u64) -> usize {
    let m = (remaining as f64 * 20.0 / samples.max(1) as f64).cbrt().floor();
    (m as usize).max(1)
}

#[derive(Debug, Clone)]
pub struct Budget {
    remaining: u64,
    limit: u64,
    /// Units one evaluation costs.
    weight: u64,
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
        Budget { remaining: evaluations, limit: evaluations, weight: 1 }
    }

    /// The same budget where each evaluation costs `weight` units (see
    /// [`weight_for_program`]).
    pub fn weighted(mut self, weight: u64) -> Self {
        self.weight = weight.max(1);
        self
    }

    /// Units one evaluation costs.
    pub fn weight(&self) -> u64 {
        self.weight
    }

    /// Take `n` evaluations (`n × weight` units) from the budget, or fail if
    /// there are not enough.
    pub fn spend(&mut self, n: u64) -> Result<(), BudgetExceeded> {
        self.spend_units(n.saturating_mul(self.weight))
    }

    /// Take `units` of work that is not an evaluation of f (linear algebra,
    /// colouring pixels), or fail if there are not enough.
    pub fn spend_units(&mut self, n: u64) -> Result<(), BudgetExceeded> {
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

    #[test]
    fn a_long_program_costs_more_per_evaluation() {
        // By construction: one unit, plus one per 16 operations.
        assert_eq!(weight_for_program(1), 1);
        assert_eq!(weight_for_program(15), 1);
        assert_eq!(weight_for_program(16), 2);
        let mut b = Budget::new(100).weighted(weight_for_program(160));
        assert_eq!(b.weight(), 11);
        assert!(b.spend(9).is_ok());
        assert_eq!(b.remaining(), 1);
        assert!(b.spend(1).is_err());
    }

    #[test]
    fn an_affordable_fit_stays_within_the_budget() {
        for remaining in [1u64, 1_000, 123_456, 20_000_000] {
            let m = aaa_terms_within(600, remaining);
            assert!(m == 1 || units_for_aaa(600, m) <= remaining);
            assert!(units_for_aaa(600, m + 1) > remaining);
        }
    }
}

//! Independent ways of computing one value, reconciled into one verdict.
//!
//! Method (common practice for validated numerics): each way gives a value v
//! and an error estimate e. Two ways are *consistent* when
//!
//! ```text
//! |v₁ − v₂| ≤ FACTOR · (e₁ + e₂) + ROUNDING · max(|v₁|, |v₂|)
//! ```
//!
//! (the estimates, with a safety factor, plus rounding at the values' scale).
//! They *agree* when they are consistent and also
//! `|v₁ − v₂| ≤ CLOSE · max(|v₁|, |v₂|, floor)`: the discrepancy is small
//! relative to the scale of the values, `floor` being the size below which
//! a value counts as zero for the task.
//!
//! The verdict's value comes from the preferred ways (exact algebra before
//! sampling) with the smallest estimate. Its error estimate is that way's own,
//! or where it has none, the bound |v − w| + e_w from any other way w. When
//! the ways are only consistent (a large estimate covers the gap) or
//! contradict their estimates, it is raised to the largest discrepancy: the
//! estimate must bound the true error, and then at least one way is off by
//! that much. This one rule is used by every task that compares ways.
//!
//! A way whose own estimate exceeds both its value and `floor` has no correct
//! digit: it is *failed* — listed, but left out of the comparison (a failed
//! check is not a disagreement, and must not inflate a good way's estimate).
//! When every way failed, all are compared as they are.
//!
//! Figures in sentences are relative to the scale of the values compared
//! (the largest |value|, at least `floor`), and say so.

use crate::C;

/// The safety factor on the summed error estimates.
pub const FACTOR: f64 = 10.0;
/// Relative rounding slack at the scale of the values.
pub const ROUNDING: f64 = 1e-12;
/// Agreement in the strict sense: the discrepancy relative to the scale of the values.
pub const CLOSE: f64 = 1e-8;

/// Which way a value came from; the wire names are `snake_case` of these.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum WayName {
    Quadrature,
    InsideResidues,
    OutsideResidues,
    Residues,
    ContourInversion,
    LongDivision,
    TrapezoidalRule,
}

impl WayName {
    /// The name in sentences ("inside residues").
    pub fn words(self) -> &'static str {
        match self {
            WayName::Quadrature => "quadrature",
            WayName::InsideResidues => "inside residues",
            WayName::OutsideResidues => "outside residues",
            WayName::Residues => "residues",
            WayName::ContourInversion => "contour inversion",
            WayName::LongDivision => "long division",
            WayName::TrapezoidalRule => "trapezoidal rule",
        }
    }

    /// The name on the wire ("inside_residues").
    pub fn wire(self) -> &'static str {
        match self {
            WayName::Quadrature => "quadrature",
            WayName::InsideResidues => "inside_residues",
            WayName::OutsideResidues => "outside_residues",
            WayName::Residues => "residues",
            WayName::ContourInversion => "contour_inversion",
            WayName::LongDivision => "long_division",
            WayName::TrapezoidalRule => "trapezoidal_rule",
        }
    }
}

/// One way's answer: a value and its error estimate (`f64::INFINITY` when it has none).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Way {
    pub name: WayName,
    pub value: C,
    pub error: f64,
}

impl Way {
    pub fn new(name: WayName, value: C, error: f64) -> Self {
        Way { name, value, error }
    }
}

/// How the ways relate.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Agreement {
    /// Only one way was available.
    Single,
    /// Consistent, and close relative to the scale of the values.
    Agree,
    /// Consistent only because some error estimate is large.
    Covered,
    /// Some pair differs by more than its estimates allow.
    Disagree,
}

/// The reconciled answer.
#[derive(Debug, Clone, PartialEq)]
pub struct Verdict {
    pub value: C,
    pub from: WayName,
    /// Bounds the true error (see the module doc).
    pub error: f64,
    /// Largest pairwise |difference|.
    pub max_discrepancy: f64,
    /// `max_discrepancy / max(scale of the values, floor)`.
    pub relative_discrepancy: f64,
    pub agreement: Agreement,
    /// For `Disagree`, the pair that is most inconsistent; for `Covered`, the
    /// way with the largest estimate (twice).
    pub worst: Option<(Way, Way)>,
    /// Every way given, in the order given (failed ones included).
    pub ways: Vec<Way>,
    /// Ways left out because their own estimate exceeds their value (and `floor`).
    pub failed: Vec<WayName>,
    /// The scale the relative figures use: the largest |value| compared, at least `floor`.
    pub scale: f64,
}

/// True when a way's own estimate leaves it no correct digit.
pub fn has_failed(w: &Way, floor: f64) -> bool {
    w.error.is_finite() && w.error > w.value.norm().max(floor)
}

/// True when two ways are consistent under the one rule.
pub fn consistent(a: &Way, b: &Way) -> bool {
    let d = (a.value - b.value).norm();
    d <= allowed(a, b)
}

fn allowed(a: &Way, b: &Way) -> f64 {
    FACTOR * (a.error + b.error) + ROUNDING * a.value.norm().max(b.value.norm())
}

/// Reconcile `ways` (at least one). The value comes from `preferred` ways when
/// any is present, otherwise from all, choosing the smallest estimate.
/// `floor` is the size below which a value counts as zero (1 for
/// dimensionless integrals; the scale of f where the task knows it).
pub fn reconcile(given: &[Way], preferred: &[WayName], floor: f64) -> Verdict {
    assert!(!given.is_empty(), "reconcile needs at least one way");
    let failed: Vec<WayName> = given.iter().filter(|w| has_failed(w, floor)).map(|w| w.name).collect();
    let working: Vec<Way> = given.iter().filter(|w| !has_failed(w, floor)).copied().collect();
    let ways: &[Way] = if working.is_empty() { given } else { &working };
    let pool: Vec<&Way> = {
        let p: Vec<&Way> = ways.iter().filter(|w| preferred.contains(&w.name)).collect();
        if p.is_empty() {
            ways.iter().collect()
        } else {
            p
        }
    };
    let best = **pool
        .iter()
        .min_by(|a, b| a.error.total_cmp(&b.error))
        .expect("pool is not empty");

    let mut max_d: f64 = 0.0;
    let mut worst: Option<(Way, Way, f64)> = None;
    for i in 0..ways.len() {
        for j in i + 1..ways.len() {
            let d = (ways[i].value - ways[j].value).norm();
            if d.is_finite() {
                max_d = max_d.max(d);
            }
            let excess = d / allowed(&ways[i], &ways[j]).max(f64::MIN_POSITIVE);
            // `!(d <= …)`: a NaN difference counts as inconsistent.
            if !(d <= allowed(&ways[i], &ways[j])) && worst.is_none_or(|(_, _, e)| excess > e) {
                worst = Some((ways[i], ways[j], excess));
            }
        }
    }
    let scale = ways.iter().map(|w| w.value.norm()).filter(|x| x.is_finite()).fold(floor, f64::max);
    let relative = max_d / scale.max(f64::MIN_POSITIVE);

    // The best way's own estimate, or the tightest bound another way implies.
    let mut error = best.error;
    if !error.is_finite() {
        error = ways
            .iter()
            .filter(|w| w.name != best.name)
            .map(|w| (w.value - best.value).norm() + w.error)
            .fold(f64::INFINITY, f64::min);
    }

    let (agreement, worst) = if ways.len() == 1 {
        (Agreement::Single, None)
    } else if let Some((a, b, _)) = worst {
        (Agreement::Disagree, Some((a, b)))
    } else if max_d <= CLOSE * scale {
        (Agreement::Agree, None)
    } else {
        let loose = *ways.iter().max_by(|a, b| a.error.total_cmp(&b.error)).expect("not empty");
        (Agreement::Covered, Some((loose, loose)))
    };
    if matches!(agreement, Agreement::Covered | Agreement::Disagree) {
        error = error.max(max_d);
    }
    Verdict {
        value: best.value,
        from: best.name,
        error,
        max_discrepancy: max_d,
        relative_discrepancy: relative,
        agreement,
        worst,
        ways: given.to_vec(),
        failed: if working.is_empty() { Vec::new() } else { failed },
        scale,
    }
}

impl Verdict {
    /// The ways compared (not failed).
    fn compared(&self) -> Vec<&Way> {
        self.ways.iter().filter(|w| !self.failed.contains(&w.name)).collect()
    }

    /// Who is compared, in words: "all three ways", "residues and quadrature".
    fn who(&self) -> String {
        let c = self.compared();
        match c.len() {
            1 => c[0].name.words().to_string(),
            2 => format!("{} and {}", c[0].name.words(), c[1].name.words()),
            3 if self.ways.len() == 3 => "all three ways".to_string(),
            n if n == self.ways.len() => format!("all {n} ways"),
            n => format!("{n} ways"),
        }
    }

    /// " (the quadrature failed: its error estimate 3e5 exceeds its value)", or "".
    fn failures(&self) -> String {
        if self.failed.is_empty() {
            return String::new();
        }
        let names: Vec<String> = self
            .ways
            .iter()
            .filter(|w| self.failed.contains(&w.name))
            .map(|w| format!("the {} failed (its error estimate {:.1e} exceeds its value)", w.name.words(), w.error))
            .collect();
        format!("; {}", names.join(", "))
    }

    /// One sentence on agreement; `why` says what may cause a disagreement.
    pub fn sentence(&self, why: &str) -> String {
        let d = crate::text::Sci(self.max_discrepancy);
        let r = crate::text::Sci(self.relative_discrepancy);
        let main = match (self.agreement, self.worst) {
            (Agreement::Single, _) => format!("only the {} is available", self.compared()[0].name.words()),
            (Agreement::Agree, _) => format!("{} agree to {r:.1e} relative ({d:.1e} absolute; values of size {:.1e})", self.who(), crate::text::Sci(self.scale)),
            (Agreement::Covered, Some((loose, _))) => format!(
                "{} differ by up to {d:.1e} ({r:.1e} relative); only the large error estimate of the {} ({:.1e}) covers that: {why}",
                self.who(),
                loose.name.words(),
                crate::text::Sci(loose.error)
            ),
            (_, Some((a, b))) => format!(
                "{} and {} differ by {:.1e} ({:.1e} relative), more than their error estimates ({:.1e}, {:.1e}) allow: {why}",
                a.name.words(),
                b.name.words(),
                crate::text::Sci((a.value - b.value).norm()),
                crate::text::Sci((a.value - b.value).norm() / self.scale.max(f64::MIN_POSITIVE)),
                crate::text::Sci(a.error),
                crate::text::Sci(b.error)
            ),
            (_, None) => format!("{} differ by up to {d:.1e} ({r:.1e} relative): {why}", self.who()),
        };
        main + &self.failures()
    }

    /// True when the sentence is a caution the user must see (not plain agreement).
    pub fn needs_warning(&self) -> bool {
        matches!(self.agreement, Agreement::Covered | Agreement::Disagree)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn w(name: WayName, re: f64, error: f64) -> Way {
        Way::new(name, C::new(re, 0.0), error)
    }

    // Slow reference: the rule written out for two ways, by hand.
    fn reference_agreement(a: f64, ea: f64, b: f64, eb: f64, floor: f64) -> Agreement {
        let d = (a - b).abs();
        let scale = a.abs().max(b.abs());
        if d > 10.0 * (ea + eb) + 1e-12 * scale {
            Agreement::Disagree
        } else if d <= 1e-8 * scale.max(floor) {
            Agreement::Agree
        } else {
            Agreement::Covered
        }
    }

    #[test]
    fn two_ways_follow_the_rule_written_out() {
        // A grid of values and estimates around each boundary of the rule (common practice).
        let values = [0.0, 1e-20, 1.0, 1.0 + 1e-9, 1.0 + 1e-7, 1.5, 1e6, 1e6 * (1.0 + 1e-9)];
        let errors = [0.0, 1e-16, 1e-10, 1e-3];
        for &a in &values {
            for &b in &values {
                for &ea in &errors {
                    for &eb in &errors {
                        let v = reconcile(&[w(WayName::Residues, a, ea), w(WayName::Quadrature, b, eb)], &[], 1.0);
                        assert_eq!(v.agreement, reference_agreement(a, ea, b, eb, 1.0), "{a} {ea} {b} {eb}");
                        assert!(v.error >= ea.min(eb), "the estimate never drops below the best way's own");
                        if v.agreement != Agreement::Agree {
                            assert!(v.error >= v.max_discrepancy);
                        }
                    }
                }
            }
        }
    }

    #[test]
    fn preferred_ways_give_the_value_and_a_missing_estimate_is_bounded_by_another_way() {
        let division = w(WayName::LongDivision, 2.0, f64::INFINITY);
        let residues = w(WayName::Residues, 2.0 + 1e-13, 1e-12);
        let v = reconcile(&[division, residues], &[WayName::LongDivision], 1.0);
        assert_eq!(v.from, WayName::LongDivision);
        assert_eq!(v.value, C::new(2.0, 0.0));
        assert!((v.error - (1e-13 + 1e-12)).abs() < 1e-15, "{}", v.error);
        assert_eq!(v.agreement, Agreement::Agree);
    }

    #[test]
    fn a_disagreement_names_the_worst_pair_and_raises_the_estimate() {
        let ways = [
            w(WayName::Quadrature, 1.0, 1e-14),
            w(WayName::InsideResidues, 1.0, 1e-14),
            w(WayName::OutsideResidues, 1.5, 1e-14),
        ];
        let v = reconcile(&ways, &[WayName::InsideResidues, WayName::OutsideResidues], 1.0);
        assert_eq!(v.agreement, Agreement::Disagree);
        assert_eq!(v.max_discrepancy, 0.5);
        assert!(v.error >= 0.5);
        let s = v.sentence("a singularity may have been missed");
        assert!(s.starts_with("quadrature and outside residues differ by 5.0e-1"), "{s}");
        assert!(v.needs_warning());
    }

    #[test]
    fn a_way_with_no_correct_digit_is_failed_not_a_disagreement() {
        // Residues exact to 1e-12; the contour way 8.8e9 ± 1.7e11 (values seen for a 1 kHz
        // resonator at t = 0.01): its estimate exceeds its value, so it is left out.
        let ways = [w(WayName::Residues, -16.74, 1e-12), w(WayName::ContourInversion, 8.8e9, 1.7e11)];
        let v = reconcile(&ways, &[WayName::Residues], 1.0);
        assert_eq!(v.failed, vec![WayName::ContourInversion]);
        assert_eq!(v.agreement, Agreement::Single);
        assert_eq!(v.error, 1e-12, "a failed check does not inflate the answer's estimate");
        let s = v.sentence("");
        assert!(s.contains("only the residues is available; the contour inversion failed"), "{s}");
        // Both failed: compared as they are.
        let both = [w(WayName::Residues, 1.0, 5.0), w(WayName::Quadrature, 2.0, 5.0)];
        assert!(reconcile(&both, &[], 1.0).failed.is_empty());
    }

    #[test]
    fn agreement_figures_are_relative_and_say_so() {
        let v = reconcile(&[w(WayName::Residues, 1e6, 1e-9), w(WayName::Quadrature, 1e6 + 1e-4, 1e-9)], &[], 1.0);
        assert_eq!(v.agreement, Agreement::Disagree);
        let ok = reconcile(&[w(WayName::Residues, 1e6, 1e-5), w(WayName::Quadrature, 1e6 + 1e-4, 1e-5)], &[], 1.0);
        assert_eq!(ok.agreement, Agreement::Agree);
        assert!(ok.sentence("").starts_with("residues and quadrature agree to 1.0e-10 relative"), "{}", ok.sentence(""));
    }

    #[test]
    fn a_nan_way_is_never_called_agreement() {
        let v = reconcile(&[w(WayName::Quadrature, f64::NAN, 1e-3), w(WayName::Residues, 1.0, 1e-3)], &[], 1.0);
        assert_eq!(v.agreement, Agreement::Disagree);
    }
}

//! Method: the written derivation of a real integral by residues — which closed
//! contour is used, which estimate makes its added pieces vanish, the
//! substitution, and the residue sum written out term by term. Nothing is
//! computed here that the residue methods did not compute; this is their report.
//!
//! The lemmas (L. V. Ahlfors, "Complex Analysis", 3rd ed., McGraw-Hill 1979,
//! ch. 4 §5.3 — from memory):
//! - Jordan's lemma: if f(z) → 0 uniformly on the half circles C_R in the upper
//!   half-plane and ω > 0, then ∫_{C_R} f(z) e^{iωz} dz → 0 (ω < 0: the lower
//!   half-plane).
//! - The ML estimate: |∫_{C_R} f dz| ≤ πR · max_{C_R} |f|, which tends to 0 when
//!   |f(z)| = O(1/|z|²).
//! - The keyhole's two circles: with f ~ z^k at 0 and f ~ z^{−d} at ∞, the small
//!   circle contributes O(ε^{Re α + k}) and the large one O(R^{Re α − d}), both → 0
//!   exactly in the strip −k < Re α < d.
//! - The unit circle needs no lemma: z = e^{iθ} maps [0, 2π) onto |z| = 1 exactly.
//!
//! ```
//! use residuary::integrals::derivation::{written_sum, Lemma};
//! use residuary::C;
//! // 2πi · (−0.25i) = π/2.
//! let s = written_sum(&[(C::new(0.0, 2.0 * std::f64::consts::PI), C::new(0.0, -0.25))], C::new(std::f64::consts::FRAC_PI_2, 0.0));
//! assert_eq!(s, "(6.28318530718i) · (-0.25i) = 1.57079632679");
//! assert_eq!(Lemma::Jordan.word(), "jordan");
//! ```

use crate::text;
use crate::C;

/// The closed contour of the derivation.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Shape {
    UpperHalfDisc,
    LowerHalfDisc,
    UnitCircle,
    Keyhole,
}

impl Shape {
    /// The wire word.
    pub fn word(self) -> &'static str {
        match self {
            Shape::UpperHalfDisc => "upper_half_disc",
            Shape::LowerHalfDisc => "lower_half_disc",
            Shape::UnitCircle => "unit_circle",
            Shape::Keyhole => "keyhole",
        }
    }
}

/// The estimate that makes the added pieces of the contour vanish.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Lemma {
    Jordan,
    MlEstimate,
    KeyholeCircles,
    None,
}

impl Lemma {
    /// The wire word.
    pub fn word(self) -> &'static str {
        match self {
            Lemma::Jordan => "jordan",
            Lemma::MlEstimate => "ml_estimate",
            Lemma::KeyholeCircles => "keyhole_circles",
            Lemma::None => "none",
        }
    }
}

/// A derivation as a report would write it.
#[derive(Debug, Clone, PartialEq)]
pub struct Derivation {
    pub shape: Shape,
    /// A radius that encloses every point of the sum (the derivation lets R → ∞;
    /// this is the one to draw); 1 for the unit circle.
    pub radius: Option<f64>,
    /// The keyhole's small circle (drawn radius; the derivation lets ε → 0).
    pub inner_radius: Option<f64>,
    /// Real-axis poles the line is indented around (principal values).
    pub indentations: Vec<f64>,
    pub lemma: Lemma,
    /// Why the lemma applies here, in one sentence.
    pub lemma_condition: String,
    /// The convergence strip (−k, d) of Re α (Mellin).
    pub strip: Option<(i64, i64)>,
    /// The change of variable (trig).
    pub substitution: Option<&'static str>,
    /// The function whose residues are summed.
    pub residues_of: &'static str,
    /// Σ weight · residue written out, "= value".
    pub sum: String,
}

/// The substitution of the trigonometric kind.
pub const TRIG_SUBSTITUTION: &str = "z = e^(iθ), dθ = dz/(iz), cos θ = (z + 1/z)/2, sin θ = (z − 1/z)/(2i)";

/// Σ wₖ · Resₖ written out term by term at 12 digits, then "= total".
pub fn written_sum(terms: &[(C, C)], total: C) -> String {
    if terms.is_empty() {
        return format!("(no singular point contributes) = {}", text::value(total));
    }
    let parts: Vec<String> = terms.iter().map(|(w, r)| format!("({}) · ({})", text::value(*w), text::value(*r))).collect();
    format!("{} = {}", parts.join(" + "), text::value(total))
}

/// Half-disc derivation for ∫ f(x) e^{iωx} dx (ω = 0: ∫ f dx). `decay` is the
/// relative degree of a rational f (None: f not rational, decay checked by sampling).
pub fn half_disc(omega: f64, radius: f64, indentations: Vec<f64>, decay: Option<i32>, sum: String) -> Derivation {
    let upper = omega >= 0.0;
    let half = if upper { "upper" } else { "lower" };
    let how = match decay {
        Some(d) => format!("f falls off like 1/|z|^{d} (deg denominator − deg numerator = {d})"),
        None => "|f| was checked by sampling to fall off on the real line and on the half circles |z| = 2R, 4R".into(),
    };
    let (lemma, lemma_condition, residues_of) = if omega == 0.0 {
        (
            Lemma::MlEstimate,
            format!("|∫ over the half circle of radius R| ≤ πR · max |f| → 0 because |f(z)| = O(1/|z|²): {how}"),
            "f(z)",
        )
    } else {
        let sign = if upper { "ω > 0" } else { "ω < 0" };
        (
            Lemma::Jordan,
            format!("{sign}, so |e^(iωz)| ≤ 1 in the {half} half-plane, and f(z) → 0 as |z| → ∞: {how}; the half circle's integral tends to 0"),
            "f(z) e^(iωz)",
        )
    };
    Derivation {
        shape: if upper { Shape::UpperHalfDisc } else { Shape::LowerHalfDisc },
        radius: Some(radius),
        inner_radius: None,
        indentations,
        lemma,
        lemma_condition,
        strip: None,
        substitution: None,
        residues_of,
        sum,
    }
}

/// Unit-circle derivation for ∫_0^{2π} f(θ) dθ.
pub fn unit_circle(sum: String) -> Derivation {
    Derivation {
        shape: Shape::UnitCircle,
        radius: Some(1.0),
        inner_radius: None,
        indentations: Vec::new(),
        lemma: Lemma::None,
        lemma_condition: "no piece is added: z = e^(iθ) maps 0 ≤ θ < 2π onto the unit circle, traversed once counter-clockwise".into(),
        strip: None,
        substitution: Some(TRIG_SUBSTITUTION),
        residues_of: "g(z) = f(−i log z)/(iz)",
        sum,
    }
}

/// An exponent as written after "x^": 2, (−1).
fn power(k: i64) -> String {
    if k < 0 {
        format!("(−{})", -k)
    } else {
        k.to_string()
    }
}

/// "+ 2", "− 1": a term added to Re α.
fn signed(k: i64) -> String {
    if k < 0 {
        format!("− {}", -k)
    } else {
        format!("+ {k}")
    }
}

/// Keyhole derivation for ∫_0^∞ x^{α−1} f(x) dx; `strip` = (k, d) with f ~ x^k at 0, x^{−d} at ∞.
pub fn keyhole(radius: f64, inner_radius: f64, at_zero: i64, at_infinity: i64, alpha: C, sum: String) -> Derivation {
    let (k, d) = (at_zero, at_infinity);
    Derivation {
        shape: Shape::Keyhole,
        radius: Some(radius),
        inner_radius: Some(inner_radius),
        indentations: Vec::new(),
        lemma: Lemma::KeyholeCircles,
        lemma_condition: format!(
            "f ~ x^{} near 0 and ~ x^{} at infinity: the small circle gives O(ε^(Re α {})) and the large one O(R^(Re α − {d})), both → 0 for {} < Re α < {d}, and Re α = {}; below the cut z^(α−1) has gained e^(2πi(α−1)), hence the factor 1/(1 − e^(2πiα))",
            power(k),
            power(-d),
            signed(k),
            -k,
            text::real(alpha.re)
        ),
        strip: Some((-k, d)),
        substitution: None,
        residues_of: "z^(α−1) f(z), arg z in (0, 2π)",
        sum,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_sum_is_written_term_by_term() {
        // 2πi·(1/(4e^{iπ/4}))+… : two terms and their total, as written (12 digits, by hand).
        let w = C::new(0.0, 1.0);
        let s = written_sum(&[(w, C::new(1.0, 0.0)), (w, C::new(0.0, -2.0))], C::new(2.0, 1.0));
        assert_eq!(s, "(1i) · (1) + (1i) · (-2i) = 2 + 1i");
        assert_eq!(written_sum(&[], C::new(0.0, 0.0)), "(no singular point contributes) = 0");
    }

    #[test]
    fn the_keyhole_condition_names_the_strip() {
        // 1/(x(1+x)²): k = −1, d = 3, so 1 < Re α < 3.
        let d = keyhole(3.0, 0.5, -1, 3, C::new(1.5, 0.0), String::new());
        assert_eq!(d.strip, Some((1, 3)));
        assert!(d.lemma_condition.contains("f ~ x^(−1) near 0 and ~ x^(−3) at infinity"), "{}", d.lemma_condition);
        assert!(d.lemma_condition.contains("1 < Re α < 3"), "{}", d.lemma_condition);
        assert_eq!(half_disc(-1.0, 2.0, vec![], Some(1), String::new()).shape, Shape::LowerHalfDisc);
    }
}

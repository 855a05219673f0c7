//! Causal inverse z-transform of any X analytic for |z| > R₀ (and at infinity)
//! by Cauchy integrals on circles, discretised by the trapezoidal rule (one FFT
//! per circle gives every n at once).
//!
//! Method: x[n] = (1/2πi) ∮_{|z|=ρ} X(z) z^{n−1} dz = c_{−n}, the coefficient of
//! z^{−n} of X's expansion at infinity, for any ρ > R₀. With N samples,
//! b_j = (1/N) Σ_k X(ρω^k) ω^{−jk} = Σ_{m ≡ j (mod N)} c_m ρ^m, so
//! x̃[n] = ρ^n b_{−n} = x[n] + Σ_{l≥1} x[n + lN] ρ^{−lN} when N > n (aliasing decays
//! like (R₀/ρ)^N). Rounding makes an error of about ε·max|X|·ρ^n, which grows
//! with ρ for n > 0; the balance of the two fixes the radius, after
//! F. Bornemann, "Accuracy and stability of computing high-order derivatives of
//! analytic functions by Cauchy integrals", Found. Comput. Math. 11 (2011) 1–63:
//! ρ ≈ R₀(1 + m/n) for a pole of order m on |z| = R₀, ρ ≈ 1/n when R₀ = 0 (e.g.
//! exp(1/z)). We sample on a ladder of radii, and for every n keep the radius with
//! the smallest error estimate.
//!
//! Error estimate on one circle: 10·|x̃_N[n] − x̃_{N/2}[n]| (the N/2 rule uses every
//! other sample) plus the rounding floor ε·max|X|·ρ^n·(4 + log₂N) + 4ε(n+1)|x̃|.
//! Two radii that disagree by more than their estimates widen the estimate to
//! the disagreement. Positive powers c_1, c_2, c_3 (read from the same FFT) must
//! vanish: if not, X grows at infinity or has a singularity outside the circle;
//! circles up to the largest such one are then dropped when a larger one is clean.
//! The samples and the FFT are the one circle kernel's (`cauchy::circle`).
//!
//! ```
//! use residuary::budget::Budget;
//! use residuary::transforms::z::trapezoid::inverse_z_trapezoid;
//! use residuary::C;
//! // z/(z − 0.5) ↔ 0.5^n (z-transform table, e.g. Oppenheim & Schafer, Table 3.1 — from memory).
//! let r = inverse_z_trapezoid(&mut |z: C| z / (z - 0.5), 0.5, &[3], 1 << 16, &mut Budget::default()).unwrap();
//! let x3 = r.values[0].unwrap();
//! assert!((x3.value.re - 0.125).abs() <= x3.error && x3.error < 1e-13);
//! ```

use crate::budget::Budget;
use crate::error::Failure;
use crate::C;
use crate::cauchy::circle::CircleSamples;

/// One value with its error estimate and the radius it came from.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ContourValue {
    pub value: C,
    pub error: f64,
    pub radius: f64,
}

/// Everything the contour method found.
#[derive(Debug, Clone, PartialEq)]
pub struct ContourResult {
    /// One entry per requested n; `None` when no circle could hold enough samples.
    pub values: Vec<Option<ContourValue>>,
    /// Largest |second-best − best| over n (the disagreement between radii).
    pub radius_discrepancy: f64,
    /// max_m |c_m| ρ^m / max|X| for m = 1..3 on the largest circle: should be ~ε.
    pub positive_power_ratio: f64,
    /// The largest circle (where positive powers were checked).
    pub largest_radius: f64,
    pub radii: Vec<f64>,
    /// When a circle showed positive powers inside a clean larger one: its radius
    /// (a singularity lies farther out than it, so |z| > this is the honest ROC bound).
    pub inner_singularity: Option<f64>,
    pub warnings: Vec<String>,
}

/// Largest |c_m|ρ^m / max|X| (m = 1..3) on a circle accepted as rounding noise.
pub const POSITIVE_POWER_LIMIT: f64 = 1e-9;

struct Circle {
    radius: f64,
    /// (value, error) per requested n; None where N ≤ 2(n+1).
    fits: Vec<Option<(C, f64)>>,
    positive_power_ratio: f64,
}

/// x[n] for every n in `ns` (each ≥ 0) of the causal inverse of `f`, which
/// must be analytic for |z| > `singular_radius` and at infinity.
pub fn inverse_z_trapezoid(
    f: &mut dyn FnMut(C) -> C,
    singular_radius: f64,
    ns: &[u64],
    max_samples: usize,
    budget: &mut Budget,
) -> Result<ContourResult, Failure> {
    if !(singular_radius.is_finite() && singular_radius >= 0.0) {
        return Err(Failure::invalid("the singular radius must be a finite number ≥ 0"));
    }
    // Values need 2(n + 1) samples or more; larger n are left out (None).
    let n_max = ns
        .iter()
        .copied()
        .filter(|&n| 2 * (n as usize + 1) <= max_samples)
        .max()
        .unwrap_or(0);
    let mut circles = Vec::new();
    let mut warnings = Vec::new();
    for (radius, samples) in ladder(singular_radius, n_max, max_samples) {
        let Ok(taken) = CircleSamples::take_finite(f, C::new(0.0, 0.0), radius, 0.0, samples, budget) else {
            warnings.push(format!(
                "the work budget ran out after {} circles; values for the largest n may be missing or less accurate",
                circles.len()
            ));
            break;
        };
        // A circle where X overflows or is not finite is skipped; the others carry the values.
        if let Ok(samples) = taken {
            circles.push(fit_circle(&samples, ns));
        }
    }
    if circles.is_empty() {
        return Err(Failure::not_finite("X could not be sampled on any circle outside its singularities; check the expression (is X finite for large |z|?)"));
    }
    // A circle whose expansion has positive powers lies inside a singularity the
    // caller did not know (Laurent's theorem): it and every smaller circle are dropped,
    // as long as a larger circle is clean (else the caller's own check refuses).
    circles.sort_by(|a, b| a.radius.total_cmp(&b.radius));
    let mut inner_singularity = None;
    if let Some(k) = circles.iter().rposition(|c| c.positive_power_ratio > POSITIVE_POWER_LIMIT) {
        if k + 1 < circles.len() {
            let (inside, outside) = (circles[k].radius, circles[k + 1].radius);
            warnings.push(format!(
                "X has a singularity between |z| = {} and |z| = {} that was not found (its expansion on the smaller circle has positive powers): the circles inside it were not used; give \"singular_radius\" to be sure",
                crate::text::real(inside),
                crate::text::real(outside)
            ));
            inner_singularity = Some(inside);
            circles.drain(..=k);
        }
    }
    let largest = circles
        .iter()
        .max_by(|a, b| a.radius.total_cmp(&b.radius))
        .map(|c| (c.radius, c.positive_power_ratio))
        .unwrap_or((0.0, 0.0));
    let mut values = Vec::with_capacity(ns.len());
    let mut radius_discrepancy = 0.0f64;
    for i in 0..ns.len() {
        let mut options: Vec<(f64, C, f64)> = circles
            .iter()
            .filter_map(|c| c.fits[i].map(|(v, e)| (c.radius, v, e)))
            .collect();
        options.sort_by(|a, b| a.2.total_cmp(&b.2));
        let Some(&(radius, value, mut error)) = options.first() else {
            values.push(None);
            continue;
        };
        if let Some(&(_, second, second_error)) = options.get(1) {
            let d = (value - second).norm();
            if d.is_finite() {
                radius_discrepancy = radius_discrepancy.max(d);
            }
            if d > error + second_error {
                error = d + second_error;
            }
        }
        values.push(Some(ContourValue {
            value,
            error,
            radius,
        }));
    }
    let mut radii: Vec<f64> = circles.iter().map(|c| c.radius).collect();
    radii.sort_by(f64::total_cmp);
    Ok(ContourResult {
        values,
        radius_discrepancy,
        positive_power_ratio: largest.1,
        largest_radius: largest.0,
        radii,
        inner_singularity,
        warnings,
    })
}

/// The circles (radius, samples): radii approaching R₀ like R₀(1 + s), s = 4, 1,
/// 1/4, …, down to about 1/(2 n_max) (or, for R₀ = 0, radii 4, 1, 1/4, … down to
/// about 1/(2 n_max)); samples enough for n_max and for the aliasing of the
/// half-size rule to fall below rounding.
fn ladder(r0: f64, n_max: u64, max_samples: usize) -> Vec<(f64, usize)> {
    let min_samples = (2 * (n_max as usize + 1)).next_power_of_two().max(128);
    let mut out = Vec::new();
    let mut s = 4.0f64;
    loop {
        let (radius, needed) = if r0 > 0.0 {
            // (1 + s)^{−N/2} ≤ 1e−17 needs N ≥ 2·39/ln(1 + s).
            (r0 * (1.0 + s), (78.0 / s.ln_1p()).ceil() as usize)
        } else {
            (s, 0)
        };
        let samples = needed.next_power_of_two().max(min_samples);
        if samples > max_samples {
            if out.is_empty() {
                out.push((radius, max_samples));
            }
            break;
        }
        out.push((radius, samples));
        if s * (n_max as f64 + 1.0) < 0.5 || s < 1e-12 {
            break;
        }
        s /= 4.0;
    }
    out
}

/// Every requested x[n] on one circle, from its samples and the N/2 rule's (every other sample).
fn fit_circle(samples: &CircleSamples, ns: &[u64]) -> Circle {
    let max_f = samples.max_abs();
    let coarse = samples.every_other();
    let (fine_spectrum, coarse_spectrum) = (samples.spectrum(), coarse.spectrum());
    let nc = coarse.len();
    let log2n = (samples.len() as f64).log2();
    let fits = ns
        .iter()
        .map(|&n| {
            if (nc as u64) < n + 1 {
                return None;
            }
            // x̃[n] = ρ^n b_{−n}: the coefficient of z^{−n}.
            let (v, factor) = samples.coefficient_from(&fine_spectrum, -(n as i64));
            let (w, _) = coarse.coefficient_from(&coarse_spectrum, -(n as i64));
            let floor = f64::EPSILON * max_f * factor * (4.0 + log2n)
                + 4.0 * f64::EPSILON * (n as f64 + 1.0) * v.norm();
            let e = 10.0 * (v - w).norm() + floor;
            Some((v, if e.is_nan() { f64::INFINITY } else { e }))
        })
        .collect();
    let positive_power_ratio = if max_f > 0.0 {
        (1..=3).map(|m| fine_spectrum[m].norm() / max_f).fold(0.0, f64::max)
    } else {
        0.0
    };
    Circle { radius: samples.radius, fits, positive_power_ratio }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn geometric_sequence_on_circles() {
        // z/(z − 0.5) ↔ 0.5^n (z-transform table, from memory)
        let mut f = |z: C| z / (z - 0.5);
        let ns = [0u64, 1, 5, 40];
        let r = inverse_z_trapezoid(&mut f, 0.5, &ns, 1 << 20, &mut Budget::default()).unwrap();
        for (n, v) in ns.iter().zip(&r.values) {
            let v = v.unwrap();
            let want = 0.5f64.powi(*n as i32);
            assert!((v.value.re - want).abs() <= v.error, "n={n}");
            assert!(v.error < 1e-13, "n={n} err={}", v.error);
        }
        assert!(r.positive_power_ratio < 1e-13);
    }

    #[test]
    fn circles_inside_an_unknown_pole_are_dropped() {
        // e^{0.5/z}/(1 − 0.3/z) told analytic for |z| > 0: the circles inside the pole at 0.3
        // show positive powers and are dropped; x[n] = Σ_k (0.5^k/k!)·0.3^{n−k} (the Cauchy
        // product of the two series at infinity, by construction).
        let mut f = |z: C| (0.5 / z).exp() / (1.0 - 0.3 / z);
        let ns = [0u64, 1, 2, 10, 30];
        let r = inverse_z_trapezoid(&mut f, 0.0, &ns, 1 << 16, &mut Budget::default()).unwrap();
        let inner = r.inner_singularity.expect("the pole is seen");
        assert!(inner < 0.3 && r.radii.iter().all(|&rho| rho > 0.3), "{inner} {:?}", r.radii);
        for (n, v) in ns.iter().zip(&r.values) {
            let (mut term, mut want) = (1.0f64, 0.0f64);
            for k in 0..=*n {
                if k > 0 {
                    term *= 0.5 / k as f64;
                }
                want += term * 0.3f64.powi((n - k) as i32);
            }
            let v = v.unwrap();
            assert!((v.value.re - want).abs() <= v.error + 1e-15 * want, "n={n}: {} vs {want}", v.value.re);
        }
    }

    #[test]
    fn growing_function_shows_positive_powers() {
        let mut f = |z: C| z * z / (z - 0.5);
        let r = inverse_z_trapezoid(&mut f, 0.5, &[0, 1], 1 << 16, &mut Budget::default()).unwrap();
        assert!(r.positive_power_ratio > 1e-3);
    }
}

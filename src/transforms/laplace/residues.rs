//! Inverse Laplace transform of a rational F by the residue theorem.
//!
//! Method: closing the Bromwich contour to the left (Jordan's lemma, valid for
//! t > 0 when F → 0 at infinity), f(t) = Σ over poles a of Res[F(s) e^{st}, a].
//! With the exact principal part F ~ Σ_k c_{−k} (s − a)^{−k}, that residue is
//! e^{at} Σ_k c_{−k} t^{k−1}/(k−1)! (common practice: the residue of a pole of
//! order k of e^{st}/(s − a)^k). A polynomial part q(s) = Σ q_k s^k inverts to impulses
//! Σ q_k δ^{(k)}(t), which vanish for t > 0.
//!
//! The closed form combines conjugate pole pairs of a real F into damped
//! sinusoids e^{αt}(A(t) cos βt + B(t) sin βt).

use crate::singular::rational_poles::{PoleInfo, RationalAnalysis};
use crate::text;
use crate::C;

/// f(t) for t > 0 with an error estimate (coefficient and location errors
/// propagated, plus rounding of the sum).
pub fn residue_sum(analysis: &RationalAnalysis, t: f64) -> (C, f64) {
    let mut value = C::new(0.0, 0.0);
    let mut error = 0.0;
    let mut magnitude = 0.0;
    for p in &analysis.poles {
        let e = (p.at * t).exp();
        let mut poly = C::new(0.0, 0.0);
        let mut poly_abs = 0.0;
        let mut poly_err = 0.0;
        let mut power = 1.0; // t^{k}/k!
        for (k, (&c, &ce)) in p
            .principal_part
            .iter()
            .zip(&p.principal_part_errors)
            .enumerate()
        {
            if k > 0 {
                power *= t / k as f64;
            }
            poly += c * power;
            poly_abs += c.norm() * power;
            poly_err += ce * power;
        }
        let term = e * poly;
        value += term;
        magnitude += e.norm() * poly_abs * (1.0 + (p.at * t).norm());
        // d/da of e^{at} P(t) contributes t·e^{at}·P(t) per unit location error.
        error += e.norm() * (poly_err + p.location_error * t * poly_abs);
    }
    // Beyond the range of doubles the estimate saturates at f64::MAX ("no digits").
    let error = error + 16.0 * f64::EPSILON * magnitude;
    (value, if error.is_finite() { error } else { f64::MAX })
}

/// The residue sum at every time, in order: (value, error estimate) per t.
///
/// ```
/// use residuary::singular::rational_poles::analyse_rational;
/// use residuary::transforms::laplace::residues::residue_series;
/// use residuary::C;
/// // 1/(s + 2) ↔ e^{−2t} (Laplace transform table).
/// let (num, den) = ([C::new(1.0, 0.0)], [C::new(2.0, 0.0), C::new(1.0, 0.0)]);
/// let a = analyse_rational(&num, &den).unwrap();
/// let f = residue_series(&a, &[0.5]);
/// assert!((f[0].0.re - (-1.0f64).exp()).abs() <= f[0].1 + 1e-15);
/// ```
pub fn residue_series(analysis: &RationalAnalysis, times: &[f64]) -> Vec<(C, f64)> {
    times.iter().map(|&t| residue_sum(analysis, t)).collect()
}

/// Where the poles put the system, with rounding at the poles' scale.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Stability {
    /// Every pole has Re s < 0 (or there is none).
    Stable,
    /// The rightmost pole lies on the imaginary axis.
    Marginal,
    /// A pole with Re s > 0, the largest such real part.
    Unstable(f64),
}

/// The stability the poles show (Re a < 0 for all a: common practice).
pub fn stability(poles: &[C]) -> Stability {
    let scale = poles.iter().map(|p| p.norm()).fold(1.0, f64::max);
    let rightmost = poles.iter().map(|p| p.re).fold(f64::NEG_INFINITY, f64::max);
    let rounding = crate::ways::ROUNDING * scale;
    if rightmost > rounding {
        Stability::Unstable(rightmost)
    } else if rightmost >= -rounding {
        Stability::Marginal
    } else {
        Stability::Stable
    }
}

/// True when every coefficient of num and den is real (to rounding): then f is real.
pub fn has_real_coefficients(num: &[C], den: &[C]) -> bool {
    let real = |p: &[C]| {
        let scale = p.iter().map(|c| c.norm()).fold(0.0, f64::max);
        p.iter().all(|c| c.im.abs() <= 64.0 * f64::EPSILON * scale)
    };
    real(num) && real(den)
}

/// A readable closed form of f(t) for t > 0 (12 significant digits), with the
/// impulses of a polynomial part appended, e.g. `0.5*exp(-t) - 0.5*exp(-3*t) + 2*δ(t)`.
pub fn closed_form(analysis: &RationalAnalysis, real: bool) -> String {
    let mut terms: Vec<(bool, String)> = Vec::new();
    let mut used = vec![false; analysis.poles.len()];
    for (i, p) in analysis.poles.iter().enumerate() {
        if used[i] {
            continue;
        }
        used[i] = true;
        let tol = 16.0 * p.location_error.max(f64::EPSILON * p.at.norm());
        if real && p.at.im.abs() <= tol {
            let coeffs = t_polynomial(p, |c| c.re);
            if let Some(term) = real_pole_term(p.at.re, tol, &coeffs) {
                terms.push(term);
            }
        } else if real {
            // Pair with the conjugate pole; write the pair from the upper one.
            let partner = (0..analysis.poles.len())
                .filter(|&j| !used[j])
                .min_by(|&a, &b| {
                    let da = (analysis.poles[a].at - p.at.conj()).norm();
                    let db = (analysis.poles[b].at - p.at.conj()).norm();
                    da.total_cmp(&db)
                });
            if let Some(j) = partner {
                used[j] = true;
            }
            let upper = match partner {
                Some(j) if p.at.im < 0.0 => &analysis.poles[j],
                _ => p,
            };
            let cos_part = t_polynomial(upper, |c| 2.0 * c.re);
            let sin_part = t_polynomial(upper, |c| -2.0 * c.im);
            terms.extend(pair_term(upper.at, tol, &cos_part, &sin_part));
        } else {
            terms.extend(complex_pole_terms(p, tol));
        }
    }
    let q = &analysis.polynomial_part;
    let q_scale = q.iter().map(|c| c.norm()).fold(0.0, f64::max);
    for (k, &c) in q.iter().enumerate() {
        if c.norm() <= 64.0 * f64::EPSILON * q_scale {
            continue;
        }
        let delta = match k {
            0 => "δ(t)".to_string(),
            1 => "δ'(t)".to_string(),
            2 => "δ''(t)".to_string(),
            _ => format!("δ^({k})(t)"),
        };
        let (neg, text) = if real {
            signed_real(c.re)
        } else {
            signed_complex(c)
        };
        terms.push((neg, product(&text, &delta)));
    }
    join(&terms)
}

/// Coefficients of t^j (j = 0..order−1) of c_{−(j+1)}/j!, mapped to reals by `part`,
/// each with its error; parts within the error are zeroed.
fn t_polynomial(p: &PoleInfo, part: impl Fn(C) -> f64) -> Vec<f64> {
    let mut factorial = 1.0;
    let mut out = Vec::new();
    for (j, (&c, &e)) in p
        .principal_part
        .iter()
        .zip(&p.principal_part_errors)
        .enumerate()
    {
        if j > 0 {
            factorial *= j as f64;
        }
        let v = part(c) / factorial;
        out.push(if v.abs() <= 2.0 * e / factorial {
            0.0
        } else {
            v
        });
    }
    out
}

fn signed_real(x: f64) -> (bool, String) {
    (x < 0.0, text::real(x.abs()))
}

fn signed_complex(z: C) -> (bool, String) {
    if z.im == 0.0 {
        return signed_real(z.re);
    }
    if z.re == 0.0 {
        return (z.im < 0.0, format!("{}i", text::real(z.im.abs())));
    }
    (false, format!("({})", text::complex(z, 0.0)))
}

/// `a*b`, dropping a factor "1" (and an empty factor).
fn product(a: &str, b: &str) -> String {
    match (a, b) {
        ("" | "1", "") => "1".into(),
        ("" | "1", _) => b.into(),
        (_, "") => a.into(),
        _ => format!("{a}*{b}"),
    }
}

/// `exp(a*t)` text; empty for a = 0.
fn exp_text(a: f64) -> String {
    match text::real(a).as_str() {
        "0" => String::new(),
        "1" => "exp(t)".into(),
        "-1" => "exp(-t)".into(),
        text => format!("exp({text}*t)"),
    }
}

fn t_power(j: usize) -> String {
    match j {
        0 => String::new(),
        1 => "t".into(),
        _ => format!("t^{j}"),
    }
}

/// `Σ p_j t^j` as signed terms.
fn poly_terms(coeffs: &[f64]) -> Vec<(bool, String)> {
    coeffs
        .iter()
        .enumerate()
        .filter(|(_, &c)| c != 0.0)
        .map(|(j, &c)| {
            let (neg, text) = signed_real(c);
            (neg, product(&text, &t_power(j)))
        })
        .collect()
}

/// `P(t)` times `factor`: a single signed term, parenthesised when P has several.
fn times(poly: Vec<(bool, String)>, factor: &str) -> Option<(bool, String)> {
    match poly.len() {
        0 => None,
        1 => {
            let (neg, body) = poly.into_iter().next()?;
            Some((neg, product(&body, factor)))
        }
        _ => Some((false, product(&format!("({})", join(&poly)), factor))),
    }
}

fn real_pole_term(alpha: f64, tol: f64, coeffs: &[f64]) -> Option<(bool, String)> {
    let alpha = if alpha.abs() <= tol { 0.0 } else { alpha };
    times(poly_terms(coeffs), &exp_text(alpha))
}

fn pair_term(at: C, tol: f64, cos_part: &[f64], sin_part: &[f64]) -> Vec<(bool, String)> {
    let alpha = if at.re.abs() <= tol { 0.0 } else { at.re };
    let beta = text::real(at.im.abs());
    let damping = exp_text(alpha);
    let argument = if beta == "1" {
        "t".to_string()
    } else {
        format!("{beta}*t")
    };
    let cosine = format!("cos({argument})");
    let sine = format!("sin({argument})");
    let (cos_terms, sin_terms) = (poly_terms(cos_part), poly_terms(sin_part));
    // One of the two alone: `A*exp(αt)*sin(βt)`.
    if cos_terms.is_empty() {
        return times(sin_terms, &product(&damping, &sine))
            .into_iter()
            .collect();
    }
    if sin_terms.is_empty() {
        return times(cos_terms, &product(&damping, &cosine))
            .into_iter()
            .collect();
    }
    let mut inner = Vec::new();
    inner.extend(times(cos_terms, &cosine));
    inner.extend(times(sin_terms, &sine));
    if damping.is_empty() {
        return inner;
    }
    vec![(false, product(&damping, &format!("({})", join(&inner))))]
}

fn complex_pole_terms(p: &PoleInfo, tol: f64) -> Vec<(bool, String)> {
    let a = C::new(
        if p.at.re.abs() <= tol { 0.0 } else { p.at.re },
        if p.at.im.abs() <= tol { 0.0 } else { p.at.im },
    );
    let exp = if a == C::new(0.0, 0.0) {
        String::new()
    } else if a.im == 0.0 {
        exp_text(a.re)
    } else {
        format!("exp(({})*t)", text::complex(a, 0.0))
    };
    let mut factorial = 1.0;
    let mut out = Vec::new();
    for (j, (&c, &e)) in p
        .principal_part
        .iter()
        .zip(&p.principal_part_errors)
        .enumerate()
    {
        if j > 0 {
            factorial *= j as f64;
        }
        let c = c / factorial;
        if c.norm() <= 2.0 * e / factorial {
            continue;
        }
        let c = C::new(
            if c.re.abs() <= e { 0.0 } else { c.re },
            if c.im.abs() <= e { 0.0 } else { c.im },
        );
        let (neg, text) = signed_complex(c);
        out.push((neg, product(&product(&text, &t_power(j)), &exp)));
    }
    out
}

/// Signed terms joined: `a - b + c`; "0" when empty.
fn join(terms: &[(bool, String)]) -> String {
    crate::singular::rational_poles::join_signed(terms)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{bromwich, check_method};
    use crate::singular::rational_poles::analyse_rational;

    fn c(x: f64) -> C {
        C::new(x, 0.0)
    }

    #[test]
    fn the_residue_sum_matches_the_bromwich_integral() {
        // 1/((s + 1)(s + 2)^2) ↔ e^{−t} − e^{−2t} − t e^{−2t} (partial fractions and the
        // Laplace transform table, from memory); the slow reference is the line integral.
        let num = [c(1.0)];
        let den = crate::poly::mul(&[c(1.0), c(1.0)], &crate::poly::mul(&[c(2.0), c(1.0)], &[c(2.0), c(1.0)]));
        let a = analyse_rational(&num, &den).unwrap();
        let f = |s: C| 1.0 / ((s + 1.0) * (s + 2.0) * (s + 2.0));
        let cases = [("t = 0.2", 0.2), ("t = 1", 1.0), ("t = 5", 5.0)];
        check_method(&cases, |&t| {
            let (v, e) = residue_sum(&a, t);
            (v, Some(e))
        }, |&t| bromwich(f, 0.5, t, 4000.0, 800_000), 1e-6);
        let exact = |t: f64| (-t).exp() - (-2.0 * t).exp() - t * (-2.0 * t).exp();
        for (v, &t) in residue_series(&a, &[0.2, 1.0, 5.0]).iter().zip(&[0.2, 1.0, 5.0]) {
            crate::reference::assert_estimate_bounds(v.0, v.1.max(1e-16), c(exact(t)), "against the table");
        }
        assert_eq!(closed_form(&a, true), "(-1 - t)*exp(-2*t) + exp(-t)");
    }

    #[test]
    fn stability_follows_the_rightmost_pole() {
        // Common practice: Re a < 0 for every pole is stability; Re a = 0 marginal.
        assert_eq!(stability(&[c(-1.0), C::new(-0.5, 2.0)]), Stability::Stable);
        assert_eq!(stability(&[c(-1.0), C::new(1e-14, 2.0)]), Stability::Marginal);
        assert_eq!(stability(&[c(-1.0), c(0.25)]), Stability::Unstable(0.25));
        assert_eq!(stability(&[]), Stability::Stable);
    }
}

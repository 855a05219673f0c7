//! Causal inverse z-transform of a rational X(z) by residues (partial fractions),
//! with a closed form and a rigorous-in-first-order error bound per value.
//!
//! Method: X(z) = p₀ + Σ_a Σ_{k=1}^{m_a} c_{a,k}/(z − a)^k (poles and principal
//! parts from `singular::rational_poles`). Expanding at infinity,
//! 1/(z − a)^k = Σ_{j≥0} C(j+k−1, k−1) a^j z^{−j−k}, so
//!   x[n] = p₀ δ[n] + Σ_{a,k} c_{a,k} C(n−1, k−1) a^{n−k}   (terms with n ≥ k),
//! which is Σ_a Res[X(z) z^{n−1}, a] for n ≥ 1 (the residue formula of the
//! inverse z-transform, A. V. Oppenheim & R. W. Schafer, "Discrete-Time Signal
//! Processing", §3.3, from memory), and x[0] = X(∞) = p₀ (initial value theorem).
//! For the closed form, C(n−1, k−1) is a polynomial in n that equals (−1)^{k−1}
//! at n = 0, so for n ≥ 0
//!   x[n] = D δ[n] + Σ_{a≠0} q_a(n) a^n + Σ_k c_{0,k} δ[n−k],
//!   q_a(n) = Σ_k c_{a,k} a^{−k} C(n−1, k−1),  D = p₀ + Σ_{a≠0,k} c_{a,k} (−a)^{−k};
//! conjugate pole pairs of a real X combine to r^n (P(n) cos nθ + Q(n) sin nθ).
//!
//! Error bound of each term: |c| C [(|a|+δa)^m − |a|^m] + δc C (|a|+δa)^m plus
//! rounding (8 + 4m)ε|c| C |a|^m, m = n − k, with δa, δc the error estimates of
//! the pole location and principal-part coefficient.

use crate::singular::rational_poles::RationalAnalysis;
use crate::text;
use crate::error::Failure;
use crate::C;

const EPS: f64 = f64::EPSILON;

/// One pole: location and principal part c_{a,1..m}.
#[derive(Debug, Clone, PartialEq)]
pub struct PoleTerm {
    pub at: C,
    pub at_error: f64,
    pub coefficients: Vec<C>,
    pub coefficient_errors: Vec<f64>,
}

impl PoleTerm {
    /// A pole at the origin (its terms are delayed impulses).
    fn at_origin(&self) -> bool {
        self.at.norm() <= self.at_error.max(1e-300)
    }
}

/// X as p₀ + Σ principal parts.
#[derive(Debug, Clone, PartialEq)]
pub struct ResidueForm {
    pub constant: C,
    pub constant_error: f64,
    pub poles: Vec<PoleTerm>,
}

impl ResidueForm {
    /// The form from an exact rational analysis; fails when X has a polynomial
    /// part of degree ≥ 1 (X grows at infinity: no causal inverse).
    pub fn from_analysis(a: &RationalAnalysis) -> Result<ResidueForm, Failure> {
        let scale = a
            .polynomial_part
            .iter()
            .map(|c| c.norm())
            .fold(0.0, f64::max);
        if a.polynomial_part
            .iter()
            .skip(1)
            .any(|c| c.norm() > 64.0 * EPS * scale)
        {
            return Err(Failure::not_applicable(format!(
                "X(z) grows like z^{} as |z| → ∞, so it is not the z-transform of a causal sequence; divide X by a power of z to shift the sequence",
                a.polynomial_part.len() - 1
            )));
        }
        let constant = a.polynomial_part.first().copied().unwrap_or_default();
        let poles = a
            .poles
            .iter()
            .map(|p| PoleTerm {
                at: p.at,
                at_error: p.location_error,
                coefficients: p.principal_part.clone(),
                coefficient_errors: p.principal_part_errors.clone(),
            })
            .collect();
        Ok(ResidueForm {
            constant,
            constant_error: 16.0 * EPS * constant.norm(),
            poles,
        })
    }

    /// The largest pole modulus: X is analytic for |z| greater than this.
    pub fn singular_radius(&self) -> f64 {
        self.poles.iter().map(|p| p.at.norm()).fold(0.0, f64::max)
    }

    /// x[n] and its error bound at each n of `ns`, in order.
    ///
    /// ```
    /// use residuary::transforms::z::residues::{PoleTerm, ResidueForm};
    /// use residuary::C;
    /// // z/(z − 0.5) = 1 + 0.5/(z − 0.5) ↔ 0.5^n (z-transform table).
    /// let form = ResidueForm {
    ///     constant: C::new(1.0, 0.0),
    ///     constant_error: 0.0,
    ///     poles: vec![PoleTerm { at: C::new(0.5, 0.0), at_error: 0.0, coefficients: vec![C::new(0.5, 0.0)], coefficient_errors: vec![0.0] }],
    /// };
    /// let x = form.values(&[0, 1, 4]);
    /// assert!((x[2].0 - C::new(0.0625, 0.0)).norm() <= x[2].1);
    /// assert_eq!(form.singular_radius(), 0.5);
    /// ```
    pub fn values(&self, ns: &[u64]) -> Vec<(C, f64)> {
        let polar = self.polar();
        ns.iter().map(|&n| self.value_with(n, &polar)).collect()
    }

    /// x[n] and a bound on its error.
    pub fn value(&self, n: u64) -> (C, f64) {
        self.value_with(n, &self.polar())
    }

    /// Per pole, what does not depend on n: (|a|, ln|a|, arg a, ln(1 + δa/|a|)).
    fn polar(&self) -> Vec<(f64, f64, f64, f64)> {
        self.poles
            .iter()
            .map(|p| {
                let r = p.at.norm();
                (r, r.ln(), p.at.arg(), (p.at_error / r).ln_1p())
            })
            .collect()
    }

    fn value_with(&self, n: u64, polar: &[(f64, f64, f64, f64)]) -> (C, f64) {
        if n == 0 {
            return (self.constant, self.constant_error);
        }
        let mut sum = C::new(0.0, 0.0);
        let mut error = 0.0;
        for (pole, &(r, ln_r, theta, ln_growth)) in self.poles.iter().zip(polar) {
            for (i, (&c, &dc)) in pole
                .coefficients
                .iter()
                .zip(&pole.coefficient_errors)
                .enumerate()
            {
                let k = i as u64 + 1;
                if k > n {
                    break;
                }
                let m = (n - k) as f64;
                let ln_binom = ln_binomial(n - 1, k - 1);
                if pole.at_origin() {
                    // c/z^k ↔ c δ[n − k]; a location error δ perturbs it by ≤ |c|·C·δ^m.
                    let value = if n == k { c } else { C::new(0.0, 0.0) };
                    sum += value;
                    let da = pole.at_error.max(r);
                    let perturbed = if m == 0.0 {
                        1.0
                    } else {
                        (ln_binom + m * da.ln()).exp()
                    };
                    error += (c.norm() + dc) * perturbed + dc + 4.0 * EPS * value.norm();
                    continue;
                }
                let size = (ln_binom + m * ln_r).exp();
                let term = c * C::from_polar(size, m * theta);
                sum += term;
                // (r + δ)^m − r^m = r^m·expm1(m·ln1p(δ/r)).
                let growth = (m * ln_growth).exp_m1();
                let perturbed = size + size * growth;
                error += c.norm() * size * growth
                    + dc * perturbed
                    + (8.0 + 4.0 * m + 2.0 * k as f64) * EPS * c.norm() * size;
            }
        }
        error += 4.0 * EPS * sum.norm();
        (sum, if error.is_nan() { f64::INFINITY } else { error })
    }

    /// The closed form, e.g. `0.9^n*(cos(0.5*n) + 2*sin(0.5*n))`, `2*0.5^n - δ[n]`.
    /// `real`: X has real coefficients (conjugate poles are paired).
    pub fn closed_form(&self, real: bool) -> String {
        let mut terms: Vec<String> = Vec::new();
        let mut delta = self.constant;
        let mut delayed: Vec<(usize, C)> = Vec::new();
        let mut used = vec![false; self.poles.len()];
        for pole in self.poles.iter().filter(|p| !p.at_origin()) {
            for (k, &c) in pole.coefficients.iter().enumerate() {
                delta += c * (-pole.at).powi(-(k as i32 + 1));
            }
        }
        let qs: Vec<Vec<C>> = self.poles.iter().map(polynomial_in_n).collect();
        let mut size = self.constant.norm();
        for (pole, q) in self.poles.iter().zip(&qs) {
            let list = if pole.at_origin() {
                &pole.coefficients
            } else {
                q
            };
            size = list.iter().map(|c| c.norm()).fold(size, f64::max);
        }
        let tol = 1e-11 * size.max(f64::MIN_POSITIVE);
        for (i, pole) in self.poles.iter().enumerate() {
            if used[i] {
                continue;
            }
            used[i] = true;
            if pole.at_origin() {
                for (k, &c) in pole.coefficients.iter().enumerate() {
                    delayed.push((k + 1, c));
                }
                continue;
            }
            let a = pole.at;
            let q = &qs[i];
            let is_real_pole = a.im.abs() <= pole.at_error.max(1e-14 * a.norm());
            if real && is_real_pole {
                let coeffs: Vec<f64> = q.iter().map(|b| b.re).collect();
                if let Some(p) = poly_text(&coeffs, tol) {
                    if (a.re - 1.0).abs() <= 1e-14 {
                        terms.push(p); // the unit step (n ≥ 0)
                    } else {
                        terms.push(times(&p, &format!("{}^n", base_text(a.re))));
                    }
                }
                continue;
            }
            if real {
                let partner = (0..self.poles.len()).find(|&j| {
                    !used[j]
                        && (self.poles[j].at - a.conj()).norm()
                            <= 4.0 * (pole.at_error + self.poles[j].at_error) + 1e-12 * a.norm()
                });
                if let Some(j) = partner {
                    used[j] = true;
                    let cos: Vec<f64> = q.iter().map(|b| 2.0 * b.re).collect();
                    let sin: Vec<f64> = q.iter().map(|b| -2.0 * b.im).collect();
                    let theta = text::real(a.arg().abs());
                    let mut parts = Vec::new();
                    let s = if a.arg() < 0.0 { -1.0 } else { 1.0 };
                    if let Some(p) = poly_text(&cos, tol) {
                        parts.push(times(&p, &format!("cos({theta}*n)")));
                    }
                    let sin: Vec<f64> = sin.iter().map(|v| s * v).collect();
                    if let Some(p) = poly_text(&sin, tol) {
                        parts.push(times(&p, &format!("sin({theta}*n)")));
                    }
                    if parts.is_empty() {
                        continue;
                    }
                    let inner = join(&parts);
                    let r = a.norm();
                    let body = if parts.len() > 1 {
                        format!("({inner})")
                    } else {
                        inner
                    };
                    if (r - 1.0).abs() <= 1e-14 {
                        terms.push(body);
                    } else {
                        let r = text::real(r);
                        terms.push(match body.strip_prefix('-') {
                            Some(rest) => format!("-{r}^n*{rest}"),
                            None => format!("{r}^n*{body}"),
                        });
                    }
                    continue;
                }
            }
            if let Some(p) = complex_poly_text(q, tol) {
                terms.push(times(&p, &format!("({})^n", complex_text(a))));
            }
        }
        if delta.norm() > tol {
            terms.push(times(&number_text(delta, real), "δ[n]"));
        }
        for (k, c) in delayed {
            if c.norm() > tol {
                terms.push(times(&number_text(c, real), &format!("δ[n-{k}]")));
            }
        }
        if terms.is_empty() {
            return "0".into();
        }
        join(&terms)
    }
}

/// ln C(n, k) (exact for small arguments, lgamma-free product otherwise).
fn ln_binomial(n: u64, k: u64) -> f64 {
    let k = k.min(n - k.min(n));
    let mut s = 0.0;
    for j in 0..k {
        s += ((n - j) as f64).ln() - ((j + 1) as f64).ln();
    }
    s
}

/// Power-basis coefficients (in n) of q_a(n) = Σ_k c_k a^{−k} C(n−1, k−1).
fn polynomial_in_n(pole: &PoleTerm) -> Vec<C> {
    let mut out = vec![C::new(0.0, 0.0); pole.coefficients.len()];
    // basis = C(n−1, k−1) as a polynomial in n, built by multiplying (n − j)/j.
    let mut basis = vec![1.0f64];
    for (i, &c) in pole.coefficients.iter().enumerate() {
        let k = i + 1;
        if k > 1 {
            let j = (k - 1) as f64;
            let mut next = vec![0.0; basis.len() + 1];
            for (d, &b) in basis.iter().enumerate() {
                next[d + 1] += b / j;
                next[d] -= b * j / j;
            }
            basis = next;
        }
        let w = c * pole.at.powi(-(k as i32));
        for (d, &b) in basis.iter().enumerate() {
            out[d] += w * b;
        }
    }
    out
}

/// "0.5", "(-0.5)".
fn base_text(x: f64) -> String {
    if x < 0.0 {
        format!("({})", text::real(x))
    } else {
        text::real(x)
    }
}

fn complex_text(z: C) -> String {
    crate::text::complex(z, 0.0)
}

fn number_text(z: C, real: bool) -> String {
    if real || z.im == 0.0 {
        text::real(z.re)
    } else {
        format!("({})", complex_text(z))
    }
}

/// `coef*factor`, dropping a unit coefficient: "2*0.5^n", "0.5^n", "-0.5^n".
fn times(coef: &str, factor: &str) -> String {
    match coef {
        "1" => factor.to_string(),
        "-1" => format!("-{factor}"),
        _ => format!("{coef}*{factor}"),
    }
}

/// Real polynomial in n: "2", "1 + 0.5*n", "(1 + 0.5*n)" wrapped when compound.
fn poly_text(coeffs: &[f64], tol: f64) -> Option<String> {
    let parts: Vec<String> = coeffs
        .iter()
        .enumerate()
        .filter(|(_, c)| c.abs() > tol)
        .map(|(d, &c)| match d {
            0 => text::real(c),
            1 => times(&text::real(c), "n"),
            _ => times(&text::real(c), &format!("n^{d}")),
        })
        .collect();
    match parts.len() {
        0 => None,
        1 => Some(parts[0].clone()),
        _ => Some(format!("({})", join(&parts))),
    }
}

fn complex_poly_text(coeffs: &[C], tol: f64) -> Option<String> {
    let parts: Vec<String> = coeffs
        .iter()
        .enumerate()
        .filter(|(_, c)| c.norm() > tol)
        .map(|(d, &c)| {
            let t = number_text(c, false);
            match d {
                0 => t,
                1 => times(&t, "n"),
                _ => times(&t, &format!("n^{d}")),
            }
        })
        .collect();
    match parts.len() {
        0 => None,
        1 => Some(parts[0].clone()),
        _ => Some(format!("({})", join(&parts))),
    }
}

/// Join terms with " + ", turning "+ -x" into "- x".
fn join(terms: &[String]) -> String {
    let mut s = String::new();
    for (i, t) in terms.iter().enumerate() {
        if i == 0 {
            s.push_str(t);
        } else if let Some(rest) = t.strip_prefix('-') {
            s.push_str(" - ");
            s.push_str(rest);
        } else {
            s.push_str(" + ");
            s.push_str(t);
        }
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    fn form(poles: Vec<(C, Vec<C>)>, constant: f64) -> ResidueForm {
        ResidueForm {
            constant: C::new(constant, 0.0),
            constant_error: 0.0,
            poles: poles
                .into_iter()
                .map(|(at, coefficients)| PoleTerm {
                    at,
                    at_error: 0.0,
                    coefficient_errors: vec![0.0; coefficients.len()],
                    coefficients,
                })
                .collect(),
        }
    }

    #[test]
    fn double_pole_gives_n_a_to_the_n() {
        // a z/(z − a)² = a/(z − a) + a²/(z − a)² ↔ n a^n (z-transform table, from memory)
        let a = 0.8;
        let f = form(
            vec![(C::new(a, 0.0), vec![C::new(a, 0.0), C::new(a * a, 0.0)])],
            0.0,
        );
        for n in 0..12u64 {
            let (v, _) = f.value(n);
            assert!((v.re - n as f64 * a.powi(n as i32)).abs() < 1e-14, "n={n}");
        }
        assert_eq!(f.closed_form(true), "n*0.8^n");
    }

    #[test]
    fn binomial_polynomial_matches_definition() {
        // C(n−1, 2) = (n−1)(n−2)/2 (definition of the binomial coefficient)
        let p = PoleTerm {
            at: C::new(1.0, 0.0),
            at_error: 0.0,
            coefficients: vec![C::new(0.0, 0.0), C::new(0.0, 0.0), C::new(1.0, 0.0)],
            coefficient_errors: vec![0.0; 3],
        };
        let q = polynomial_in_n(&p);
        for n in 0..6 {
            let v: f64 = q
                .iter()
                .enumerate()
                .map(|(d, c)| c.re * (n as f64).powi(d as i32))
                .sum();
            let want = ((n as f64) - 1.0) * ((n as f64) - 2.0) / 2.0;
            assert!((v - want).abs() < 1e-12);
        }
    }
}

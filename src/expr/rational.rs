//! Rational-function detection: exact polynomial arithmetic on (numerator,
//! denominator) pairs over the expression tree, with the one polynomial kit
//! and its convention (`crate::poly`: ascending coefficients, trimmed, the
//! zero polynomial empty).
//!
//! Method: direct expansion (schoolbook products, binary powering for integer
//! powers, a/b + c/d = (ad + cb)/(bd) with the shortcut (a + c)/b when the
//! denominators are identical). No cancellation of common factors.
//!
//! ```
//! use residuary::expr::Function;
//! use residuary::C;
//! // (z + 1)/(z − 2)^2 expanded by hand: num = 1 + z, den = 4 − 4z + z².
//! let f = Function::compile("(z+1)/(z-2)^2", "z", &[]).unwrap();
//! let r = f.rational().unwrap();
//! let c = |x: f64| C::new(x, 0.0);
//! assert_eq!(r.num, vec![c(1.0), c(1.0)]);
//! assert_eq!(r.den, vec![c(4.0), c(-4.0), c(1.0)]);
//! // Not rational: no form is built.
//! assert!(Function::compile("exp(z)/(z-1)", "z", &[]).unwrap().rational().is_none());
//! ```

use crate::poly::{add, is_zero, mul, trim};
use crate::C;

/// Highest degree rational detection will build; beyond it detection declines.
pub const MAX_DEGREE: usize = 2000;

/// Work limit (coefficient multiplications) for one detection, so long inputs stay fast.
pub const MAX_WORK: usize = 40_000_000;

/// f = num/den, ascending coefficients (`num[k]` multiplies z^k). Not reduced.
/// Both are trimmed of trailing exact zeros (`crate::poly`'s convention: the
/// zero polynomial is empty, so f ≡ 0 has `num = []`); `den` is never zero.
///
/// `factors` keeps the product structure the user typed: num/den equals
/// `(lc(num)/lc(den)) · Π poly^power` over the factors, each `poly` monic of
/// degree ≥ 1, numerator factors with `power > 0`, denominator factors with
/// `power < 0` (a polynomial may appear on both sides: nothing is cancelled).
/// Expanding `(z − 1.456)²(z − 1.456001456)` into coefficients makes its roots
/// far more sensitive than the factors are; analysing factor by factor keeps
/// distinct factors' roots distinct. A sum has no product structure of its
/// own: its numerator is one factor and its denominator keeps the factors of
/// the terms' denominators. Never empty on a side that has degree ≥ 1.
#[derive(Debug, Clone, PartialEq)]
pub struct Rational {
    pub num: Vec<C>,
    pub den: Vec<C>,
    pub factors: Vec<Factor>,
}

/// One factor `poly^power` of a [`Rational`]'s product form.
#[derive(Debug, Clone, PartialEq)]
pub struct Factor {
    /// Ascending, monic, degree ≥ 1.
    pub poly: Vec<C>,
    /// Non-zero; negative for a denominator factor.
    pub power: i32,
}

/// `p` made monic, or `None` for a constant (or a leading coefficient that
/// cannot be divided out finitely).
fn monic(p: &[C]) -> Option<Vec<C>> {
    let p = trim(p);
    if p.len() < 2 {
        return None;
    }
    let lc = p[p.len() - 1];
    let q: Vec<C> = p.iter().map(|c| crate::poly::cdiv(*c, lc)).collect();
    q.iter().all(|c| c.re.is_finite() && c.im.is_finite()).then_some(q)
}

/// Append `poly^power` (any polynomial; constants are dropped), merging with
/// an identical factor on the same side.
fn push_factor(factors: &mut Vec<Factor>, poly: &[C], power: i32) -> bool {
    if power == 0 || trim(poly).len() < 2 {
        return true;
    }
    let Some(q) = monic(poly) else { return false };
    if let Some(f) = factors.iter_mut().find(|f| f.poly == q && (f.power > 0) == (power > 0)) {
        f.power += power;
        return true;
    }
    factors.push(Factor { poly: q, power });
    true
}

/// The trivial product form of num/den: one factor per side.
fn trivial_factors(num: &[C], den: &[C]) -> Vec<Factor> {
    let mut f = Vec::new();
    push_factor(&mut f, num, 1);
    push_factor(&mut f, den, -1);
    f
}

impl Rational {
    /// num/den with the trivial product form (one factor per side).
    pub fn expanded(num: Vec<C>, den: Vec<C>) -> Rational {
        let factors = trivial_factors(&num, &den);
        Rational { num, den, factors }
    }

    /// The factors on one side (`denominator = true`: the poles' side), as (poly, multiplicity).
    pub fn side(&self, denominator: bool) -> Vec<(&[C], u32)> {
        self.factors
            .iter()
            .filter(|f| (f.power < 0) == denominator)
            .map(|f| (f.poly.as_slice(), f.power.unsigned_abs()))
            .collect()
    }
}

/// Length less one: the degree, with 0 for constants and the zero polynomial (for limits only).
fn length_degree(p: &[C]) -> usize {
    p.len().saturating_sub(1)
}

/// Arithmetic on rational functions with degree and work limits; every
/// operation returns None when a limit would be passed.
pub struct RationalBuilder {
    work: usize,
}

impl Default for RationalBuilder {
    fn default() -> Self {
        Self::new()
    }
}

impl RationalBuilder {
    pub fn new() -> Self {
        RationalBuilder { work: 0 }
    }

    fn mul_poly(&mut self, a: &[C], b: &[C]) -> Option<Vec<C>> {
        if length_degree(a) + length_degree(b) > MAX_DEGREE {
            return None;
        }
        self.work += a.len() * b.len();
        if self.work > MAX_WORK {
            return None;
        }
        Some(mul(a, b))
    }

    pub fn constant(&self, c: C) -> Option<Rational> {
        if !(c.re.is_finite() && c.im.is_finite()) {
            return None;
        }
        Some(Rational::expanded(trim(&[c]), vec![C::new(1.0, 0.0)]))
    }

    pub fn variable(&self) -> Rational {
        Rational::expanded(vec![C::new(0.0, 0.0), C::new(1.0, 0.0)], vec![C::new(1.0, 0.0)])
    }

    /// Divide through by a constant denominator so polynomials keep den = [1].
    fn normalise(&self, r: Rational) -> Option<Rational> {
        if is_zero(&r.den)
            || r.num
                .iter()
                .chain(&r.den)
                .any(|c| !(c.re.is_finite() && c.im.is_finite()))
        {
            return None;
        }
        if r.den.len() == 1 && r.den[0] != C::new(1.0, 0.0) {
            let d = r.den[0];
            let num = trim(&r.num.iter().map(|c| crate::poly::cdiv(*c, d)).collect::<Vec<C>>());
            return Some(Rational {
                num,
                den: vec![C::new(1.0, 0.0)],
                factors: r.factors,
            });
        }
        Some(r)
    }

    pub fn neg(&self, a: Rational) -> Rational {
        Rational {
            num: a.num.iter().map(|c| -c).collect(),
            den: a.den,
            factors: a.factors,
        }
    }

    /// The denominator factors of a and b together (the sum's denominator is
    /// their product), then the expanded sum numerator as one factor.
    fn sum_factors(a: &Rational, b: &Rational, num: &[C], shared_den: bool) -> Vec<Factor> {
        let mut factors = Vec::new();
        let mut ok = push_factor(&mut factors, num, 1);
        for f in a.factors.iter().filter(|f| f.power < 0) {
            ok &= push_factor(&mut factors, &f.poly, f.power);
        }
        if !shared_den {
            for f in b.factors.iter().filter(|f| f.power < 0) {
                ok &= push_factor(&mut factors, &f.poly, f.power);
            }
        }
        if ok { factors } else { Vec::new() }
    }

    pub fn add(&mut self, a: &Rational, b: &Rational) -> Option<Rational> {
        if a.den == b.den {
            let num = add(&a.num, &b.num);
            let factors = Self::sum_factors(a, b, &num, true);
            return self.normalise(Self::with_factors(num, a.den.clone(), factors));
        }
        let n1 = self.mul_poly(&a.num, &b.den)?;
        let n2 = self.mul_poly(&b.num, &a.den)?;
        let den = self.mul_poly(&a.den, &b.den)?;
        let num = add(&n1, &n2);
        let factors = Self::sum_factors(a, b, &num, false);
        self.normalise(Self::with_factors(num, den, factors))
    }

    /// A rational with the given product form, or the trivial one when that
    /// form was lost (empty for a non-constant side) or does not match the degrees.
    fn with_factors(num: Vec<C>, den: Vec<C>, factors: Vec<Factor>) -> Rational {
        let degree = |positive: bool| -> usize {
            factors
                .iter()
                .filter(|f| (f.power > 0) == positive)
                .map(|f| (f.poly.len() - 1) * f.power.unsigned_abs() as usize)
                .sum()
        };
        let num_t = trim(&num);
        let den_t = trim(&den);
        let consistent = (num_t.is_empty() || degree(true) == num_t.len() - 1)
            && degree(false) == den_t.len().saturating_sub(1);
        if consistent {
            Rational { num, den, factors }
        } else {
            Rational::expanded(num, den)
        }
    }

    /// Product form of a·b (`sign` 1) or a/b (`sign` −1).
    fn product_factors(a: &Rational, b: &Rational, sign: i32) -> Vec<Factor> {
        let mut factors = Vec::new();
        let mut ok = true;
        for f in &a.factors {
            ok &= push_factor(&mut factors, &f.poly, f.power);
        }
        for f in &b.factors {
            ok &= push_factor(&mut factors, &f.poly, sign * f.power);
        }
        if ok { factors } else { Vec::new() }
    }

    pub fn sub(&mut self, a: &Rational, b: &Rational) -> Option<Rational> {
        let nb = self.neg(b.clone());
        self.add(a, &nb)
    }

    pub fn mul(&mut self, a: &Rational, b: &Rational) -> Option<Rational> {
        let num = self.mul_poly(&a.num, &b.num)?;
        let den = self.mul_poly(&a.den, &b.den)?;
        let factors = Self::product_factors(a, b, 1);
        self.normalise(Self::with_factors(num, den, factors))
    }

    pub fn div(&mut self, a: &Rational, b: &Rational) -> Option<Rational> {
        if is_zero(&b.num) {
            return None;
        }
        let num = self.mul_poly(&a.num, &b.den)?;
        let den = self.mul_poly(&a.den, &b.num)?;
        let factors = Self::product_factors(a, b, -1);
        self.normalise(Self::with_factors(num, den, factors))
    }

    /// a^n for an integer n (negative swaps numerator and denominator).
    pub fn powi(&mut self, a: &Rational, n: i64) -> Option<Rational> {
        let (base_num, base_den) = if n >= 0 {
            (&a.num, &a.den)
        } else {
            (&a.den, &a.num)
        };
        if is_zero(base_den) {
            return None;
        }
        let m = n.unsigned_abs() as usize;
        let too_big = |p: &[C]| length_degree(p).checked_mul(m).is_none_or(|d| d > MAX_DEGREE);
        if too_big(base_num) || too_big(base_den) {
            return None;
        }
        let num = self.poly_pow(base_num, m)?;
        let den = self.poly_pow(base_den, m)?;
        let power = i32::try_from(n).ok();
        let factors = match power {
            Some(k) => {
                let mut factors = Vec::new();
                let mut ok = true;
                for f in &a.factors {
                    ok &= f.power.checked_mul(k).is_some_and(|p| push_factor(&mut factors, &f.poly, p));
                }
                if ok { factors } else { Vec::new() }
            }
            None => Vec::new(),
        };
        self.normalise(Self::with_factors(num, den, factors))
    }

    fn poly_pow(&mut self, p: &[C], mut m: usize) -> Option<Vec<C>> {
        let mut acc = vec![C::new(1.0, 0.0)];
        let mut base = p.to_vec();
        while m > 0 {
            if m & 1 == 1 {
                acc = self.mul_poly(&acc, &base)?;
            }
            m >>= 1;
            if m > 0 {
                base = self.mul_poly(&base, &base)?;
            }
        }
        Some(acc)
    }
}

#[cfg(test)]
mod tests {
    use crate::expr::Function;
    use crate::reference::check_method;
    use crate::C;

    /// Plain Horner evaluation of ascending coefficients (the slow side of the check).
    fn horner(p: &[C], z: C) -> C {
        let mut acc = C::new(0.0, 0.0);
        for c in p.iter().rev() {
            acc = acc * z + c;
        }
        acc
    }

    /// Slow reference: the expression evaluated directly at sample points,
    /// against num/den of the detected rational form by Horner. Invented
    /// rational expressions, exercising +, −, ×, ÷, integer powers of both signs,
    /// complex constants and a non-reduced quotient.
    #[test]
    fn detected_num_over_den_equals_the_expression_at_sample_points() {
        let sources = [
            "(z^2+3)/(z-2)^3",
            "1/(z-1) + 2/(z+1) - 3*z",
            "(z+1)^5 - z*(z-1)",
            "z^-2 + 4",
            "(1+2i)*z/(z^2+4) - i",
            "(z^2-1)/(z-1)",
            "((z-3)^-2 + 1/(2*z+1))^2 / (z - 0.5i)",
            "(2*z^3 - z + 7)/5",
        ];
        let points = [
            C::new(0.3, 0.7),
            C::new(-1.4, 0.25),
            C::new(2.6, -1.1),
            C::new(0.05, -0.4),
            C::new(-0.8, -2.2),
        ];
        let mut cases = Vec::new();
        for src in sources {
            let f = Function::compile(src, "z", &[]).unwrap();
            assert!(f.rational().is_some(), "{src} is rational but none was detected");
            for z in points {
                cases.push((src, (f.clone(), z)));
            }
        }
        check_method(
            &cases,
            |(f, z)| {
                let r = f.rational().unwrap();
                (horner(&r.num, *z) / horner(&r.den, *z), None)
            },
            |(f, z)| f.eval(*z),
            1e-11,
        );
    }

    #[test]
    fn non_rational_expressions_get_no_form() {
        // A rational form would be wrong for these (common practice: exp, sqrt
        // and non-integer powers are not rational functions).
        for src in ["exp(z)", "sqrt(z+1)", "z^0.5", "1/(sin(z)+2)", "z^z"] {
            let f = Function::compile(src, "z", &[]).unwrap();
            assert!(f.rational().is_none(), "{src} was taken for a rational function");
        }
    }
}

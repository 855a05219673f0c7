//! Rational-function detection: exact polynomial arithmetic on (numerator,
//! denominator) pairs over the expression tree, with the one polynomial kit
//! and its convention (`crate::poly`: ascending coefficients, trimmed, the
//! zero polynomial empty).
//!
//! Method: direct expansion (schoolbook products, binary powering for integer
//! powers, a/b + c/d = (ad + cb)/(bd) with the shortcut (a + c)/b when the
//! denominators are identical). No cancellation of common factors.

use crate::poly::{add, is_zero, mul, trim};
use crate::C;

/// Highest degree rational detection will build; beyond it detection declines.
pub const MAX_DEGREE: usize = 2000;

/// Work limit (coefficient multiplications) for one detection, so long inputs stay fast.
pub const MAX_WORK: usize = 40_000_000;

/// f = num/den, ascending coefficients (`num[k]` multiplies z^k). Not reduced.
/// Both are trimmed of trailing exact zeros (`crate::poly`'s convention: the
/// zero polynomial is empty, so f ≡ 0 has `num = []`); `den` is never zero.
#[derive(Debug, Clone, PartialEq)]
pub struct Rational {
    pub num: Vec<C>,
    pub den: Vec<C>,
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
        Some(Rational {
            num: trim(&[c]),
            den: vec![C::new(1.0, 0.0)],
        })
    }

    pub fn variable(&self) -> Rational {
        Rational {
            num: vec![C::new(0.0, 0.0), C::new(1.0, 0.0)],
            den: vec![C::new(1.0, 0.0)],
        }
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
            let num = trim(&r.num.iter().map(|c| c / d).collect::<Vec<C>>());
            return Some(Rational {
                num,
                den: vec![C::new(1.0, 0.0)],
            });
        }
        Some(r)
    }

    pub fn neg(&self, a: Rational) -> Rational {
        Rational {
            num: a.num.iter().map(|c| -c).collect(),
            den: a.den,
        }
    }

    pub fn add(&mut self, a: &Rational, b: &Rational) -> Option<Rational> {
        if a.den == b.den {
            return self.normalise(Rational {
                num: add(&a.num, &b.num),
                den: a.den.clone(),
            });
        }
        let n1 = self.mul_poly(&a.num, &b.den)?;
        let n2 = self.mul_poly(&b.num, &a.den)?;
        let den = self.mul_poly(&a.den, &b.den)?;
        self.normalise(Rational {
            num: add(&n1, &n2),
            den,
        })
    }

    pub fn sub(&mut self, a: &Rational, b: &Rational) -> Option<Rational> {
        let nb = self.neg(b.clone());
        self.add(a, &nb)
    }

    pub fn mul(&mut self, a: &Rational, b: &Rational) -> Option<Rational> {
        let num = self.mul_poly(&a.num, &b.num)?;
        let den = self.mul_poly(&a.den, &b.den)?;
        self.normalise(Rational { num, den })
    }

    pub fn div(&mut self, a: &Rational, b: &Rational) -> Option<Rational> {
        if is_zero(&b.num) {
            return None;
        }
        let num = self.mul_poly(&a.num, &b.den)?;
        let den = self.mul_poly(&a.den, &b.num)?;
        self.normalise(Rational { num, den })
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
        self.normalise(Rational { num, den })
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

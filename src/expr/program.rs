//! Flat register program and its block evaluator, with forward-mode derivatives.
//!
//! Register 0 holds the variable. Every instruction loops over a block of up to
//! [`BLOCK`] points, so the cost of dispatching on the instruction is shared by
//! the whole block. Registers are laid out register-major (`r * stride + j`), one
//! contiguous array per register. The derivative path carries a second register
//! file with d/dz of each register (forward-mode automatic differentiation).

use super::functions::{div, recip, Func};
use crate::C;

/// Points evaluated together per instruction.
pub const BLOCK: usize = 256;

/// Register index.
pub type Reg = u32;

/// One instruction. `k` operands are constants folded at compile time.
#[derive(Debug, Clone, PartialEq)]
pub enum Op {
    LoadK {
        dst: Reg,
        k: C,
    },
    Add {
        dst: Reg,
        a: Reg,
        b: Reg,
    },
    Sub {
        dst: Reg,
        a: Reg,
        b: Reg,
    },
    Mul {
        dst: Reg,
        a: Reg,
        b: Reg,
    },
    Div {
        dst: Reg,
        a: Reg,
        b: Reg,
    },
    Neg {
        dst: Reg,
        a: Reg,
    },
    /// a + k
    AddK {
        dst: Reg,
        a: Reg,
        k: C,
    },
    /// a * k
    MulK {
        dst: Reg,
        a: Reg,
        k: C,
    },
    /// a / k
    DivK {
        dst: Reg,
        a: Reg,
        k: C,
    },
    /// k - a
    KSub {
        dst: Reg,
        k: C,
        a: Reg,
    },
    /// k / a
    KDiv {
        dst: Reg,
        k: C,
        a: Reg,
    },
    /// a^n, n integer
    Powi {
        dst: Reg,
        a: Reg,
        n: i32,
    },
    /// a^f, f real and not an integer
    Powf {
        dst: Reg,
        a: Reg,
        f: f64,
    },
    /// a^k, k complex with nonzero imaginary part
    Powc {
        dst: Reg,
        a: Reg,
        k: C,
    },
    /// k^a = exp(a ln k); `ln_k` precomputed
    KPow {
        dst: Reg,
        k: C,
        ln_k: C,
        a: Reg,
    },
    /// a^b, both variable
    Pow {
        dst: Reg,
        a: Reg,
        b: Reg,
    },
    Call {
        dst: Reg,
        f: Func,
        a: Reg,
    },
}

/// A compiled program: instructions, number of registers, and the result register.
#[derive(Debug, Clone)]
pub struct Program {
    pub ops: Vec<Op>,
    pub registers: usize,
    pub result: Reg,
}

impl Program {
    /// The cost of one run in arithmetic operations: 1 per instruction, and
    /// [`CALL_COST`] for a function call or a power by a non-integer (they
    /// run exp, log or trigonometric kernels; measured, common practice).
    pub fn cost(&self) -> usize {
        self.ops
            .iter()
            .map(|op| match op {
                Op::Call { .. } | Op::Pow { .. } | Op::Powf { .. } | Op::Powc { .. } | Op::KPow { .. } => CALL_COST,
                _ => 1,
            })
            .sum()
    }
}

/// Arithmetic operations one call of exp, log, sin, … costs, roughly.
pub const CALL_COST: usize = 12;

/// z^n by binary powering; z^0 = 1, negative n by a reciprocal.
#[inline]
pub fn powi(a: C, n: i32) -> C {
    if n == 0 {
        return C::new(1.0, 0.0);
    }
    let mut e = n.unsigned_abs();
    let mut base = a;
    let mut acc: Option<C> = None;
    loop {
        if e & 1 == 1 {
            acc = Some(match acc {
                None => base,
                Some(x) => x * base,
            });
        }
        e >>= 1;
        if e == 0 {
            break;
        }
        base = base * base;
    }
    let v = acc.unwrap_or(C::new(1.0, 0.0));
    if n < 0 {
        recip(v)
    } else {
        v
    }
}

/// a^f for real f on the principal branch, in polar form; 0^f = 0 for f > 0.
#[inline]
pub fn powf(a: C, f: f64) -> C {
    if f == 0.5 {
        return a.sqrt();
    }
    if a.re == 0.0 && a.im == 0.0 {
        return if f > 0.0 {
            C::new(0.0, 0.0)
        } else {
            C::new(f64::INFINITY, f64::NAN)
        };
    }
    let r = a.norm().powf(f);
    let t = a.arg() * f;
    C::new(r * t.cos(), r * t.sin())
}

/// a^k for complex k on the principal branch: exp(k ln a); 0^k = 0 for Re k > 0.
#[inline]
pub fn powc(a: C, k: C) -> C {
    if a.re == 0.0 && a.im == 0.0 {
        return if k.re > 0.0 {
            C::new(0.0, 0.0)
        } else {
            C::new(f64::NAN, f64::NAN)
        };
    }
    (k * a.ln()).exp()
}

/// Whether `k` is an integer that fits the integer-power instruction.
pub fn as_small_integer(k: C) -> Option<i32> {
    if k.im == 0.0 && k.re.fract() == 0.0 && k.re.abs() <= i32::MAX as f64 {
        Some(k.re as i32)
    } else {
        None
    }
}

/// a^b with the same specialisations the compiler uses for constant exponents.
pub fn pow(a: C, b: C) -> C {
    if let Some(n) = as_small_integer(b) {
        powi(a, n)
    } else if b.im == 0.0 {
        powf(a, b.re)
    } else {
        powc(a, b)
    }
}

/// d/da a^b (for constant b), matching [`pow`].
fn dpow_base(a: C, b: C) -> C {
    if let Some(n) = as_small_integer(b) {
        if n == 0 {
            C::new(0.0, 0.0)
        } else {
            powi(a, n - 1) * n as f64
        }
    } else if b.im == 0.0 {
        if a.re == 0.0 && a.im == 0.0 {
            return if b.re > 1.0 {
                C::new(0.0, 0.0)
            } else {
                C::new(f64::INFINITY, f64::NAN)
            };
        }
        powf(a, b.re - 1.0) * b.re
    } else {
        if a.re == 0.0 && a.im == 0.0 {
            return if b.re > 1.0 {
                C::new(0.0, 0.0)
            } else {
                C::new(f64::NAN, f64::NAN)
            };
        }
        powc(a, b - 1.0) * b
    }
}

#[inline]
fn kpow(k: C, ln_k: C, a: C) -> C {
    if k.re == 0.0 && k.im == 0.0 {
        return if a.re > 0.0 {
            C::new(0.0, 0.0)
        } else {
            C::new(f64::NAN, f64::NAN)
        };
    }
    (a * ln_k).exp()
}

macro_rules! each {
    ($n:expr, |$j:ident| $body:expr) => {
        for $j in 0..$n {
            $body;
        }
    };
}

impl Program {
    /// Run on `n <= stride` points stored in `v` (register-major, `stride` per register);
    /// register 0 must already hold the points.
    pub fn run(&self, v: &mut [C], stride: usize, n: usize) {
        let s = stride;
        for op in &self.ops {
            match *op {
                Op::LoadK { dst, k } => {
                    let d = dst as usize * s;
                    v[d..d + n].iter_mut().for_each(|x| *x = k)
                }
                Op::Add { dst, a, b } => bin(v, s, n, dst, a, b, |x, y| x + y),
                Op::Sub { dst, a, b } => bin(v, s, n, dst, a, b, |x, y| x - y),
                Op::Mul { dst, a, b } => bin(v, s, n, dst, a, b, |x, y| x * y),
                Op::Div { dst, a, b } => bin(v, s, n, dst, a, b, div),
                Op::Neg { dst, a } => un(v, s, n, dst, a, |x| -x),
                Op::AddK { dst, a, k } => un(v, s, n, dst, a, |x| x + k),
                Op::MulK { dst, a, k } => un(v, s, n, dst, a, |x| x * k),
                Op::DivK { dst, a, k } => un(v, s, n, dst, a, |x| div(x, k)),
                Op::KSub { dst, k, a } => un(v, s, n, dst, a, |x| k - x),
                Op::KDiv { dst, k, a } => un(v, s, n, dst, a, |x| div(k, x)),
                Op::Powi { dst, a, n: p } => match p {
                    2 => un(v, s, n, dst, a, |x| x * x),
                    _ => un(v, s, n, dst, a, |x| powi(x, p)),
                },
                Op::Powf { dst, a, f } => un(v, s, n, dst, a, |x| powf(x, f)),
                Op::Powc { dst, a, k } => un(v, s, n, dst, a, |x| powc(x, k)),
                Op::KPow { dst, k, ln_k, a } => un(v, s, n, dst, a, |x| kpow(k, ln_k, x)),
                Op::Pow { dst, a, b } => bin(v, s, n, dst, a, b, pow),
                Op::Call { dst, f, a } => match f {
                    Func::Exp => un(v, s, n, dst, a, C::exp),
                    Func::Sin => un(v, s, n, dst, a, C::sin),
                    Func::Cos => un(v, s, n, dst, a, C::cos),
                    Func::Log => un(v, s, n, dst, a, C::ln),
                    Func::Sqrt => un(v, s, n, dst, a, C::sqrt),
                    other => un(v, s, n, dst, a, |x| other.value(x)),
                },
            }
        }
    }

    /// Run values `v` and derivatives `d` together; register 0 must hold the
    /// points in `v` (its derivative is set to 1 here).
    pub fn run_d(&self, v: &mut [C], d: &mut [C], stride: usize, n: usize) {
        let s = stride;
        let r = |x: Reg| x as usize * s;
        let one = C::new(1.0, 0.0);
        let zero = C::new(0.0, 0.0);
        each!(n, |j| d[j] = one);
        for op in &self.ops {
            match *op {
                Op::LoadK { dst, k } => each!(n, |j| {
                    v[r(dst) + j] = k;
                    d[r(dst) + j] = zero
                }),
                Op::Add { dst, a, b } => each!(n, |j| {
                    v[r(dst) + j] = v[r(a) + j] + v[r(b) + j];
                    d[r(dst) + j] = d[r(a) + j] + d[r(b) + j]
                }),
                Op::Sub { dst, a, b } => each!(n, |j| {
                    v[r(dst) + j] = v[r(a) + j] - v[r(b) + j];
                    d[r(dst) + j] = d[r(a) + j] - d[r(b) + j]
                }),
                Op::Mul { dst, a, b } => each!(n, |j| {
                    let (x, y) = (v[r(a) + j], v[r(b) + j]);
                    let (dx, dy) = (d[r(a) + j], d[r(b) + j]);
                    v[r(dst) + j] = x * y;
                    d[r(dst) + j] = dx * y + x * dy
                }),
                Op::Div { dst, a, b } => each!(n, |j| {
                    let (x, y) = (v[r(a) + j], v[r(b) + j]);
                    let (dx, dy) = (d[r(a) + j], d[r(b) + j]);
                    let q = div(x, y);
                    v[r(dst) + j] = q;
                    d[r(dst) + j] = div(dx - q * dy, y)
                }),
                Op::Neg { dst, a } => each!(n, |j| {
                    v[r(dst) + j] = -v[r(a) + j];
                    d[r(dst) + j] = -d[r(a) + j]
                }),
                Op::AddK { dst, a, k } => each!(n, |j| {
                    v[r(dst) + j] = v[r(a) + j] + k;
                    d[r(dst) + j] = d[r(a) + j]
                }),
                Op::MulK { dst, a, k } => each!(n, |j| {
                    v[r(dst) + j] = v[r(a) + j] * k;
                    d[r(dst) + j] = d[r(a) + j] * k
                }),
                Op::DivK { dst, a, k } => each!(n, |j| {
                    v[r(dst) + j] = div(v[r(a) + j], k);
                    d[r(dst) + j] = div(d[r(a) + j], k)
                }),
                Op::KSub { dst, k, a } => each!(n, |j| {
                    v[r(dst) + j] = k - v[r(a) + j];
                    d[r(dst) + j] = -d[r(a) + j]
                }),
                Op::KDiv { dst, k, a } => each!(n, |j| {
                    let x = v[r(a) + j];
                    let q = div(k, x);
                    v[r(dst) + j] = q;
                    d[r(dst) + j] = -div(q * d[r(a) + j], x)
                }),
                Op::Powi { dst, a, n: p } => each!(n, |j| {
                    let x = v[r(a) + j];
                    let dx = d[r(a) + j];
                    v[r(dst) + j] = powi(x, p);
                    d[r(dst) + j] = dpow_base(x, C::new(p as f64, 0.0)) * dx
                }),
                Op::Powf { dst, a, f } => each!(n, |j| {
                    let x = v[r(a) + j];
                    let dx = d[r(a) + j];
                    v[r(dst) + j] = powf(x, f);
                    d[r(dst) + j] = dpow_base(x, C::new(f, 0.0)) * dx
                }),
                Op::Powc { dst, a, k } => each!(n, |j| {
                    let x = v[r(a) + j];
                    let dx = d[r(a) + j];
                    v[r(dst) + j] = powc(x, k);
                    d[r(dst) + j] = dpow_base(x, k) * dx
                }),
                Op::KPow { dst, k, ln_k, a } => each!(n, |j| {
                    let p = kpow(k, ln_k, v[r(a) + j]);
                    v[r(dst) + j] = p;
                    d[r(dst) + j] = p * ln_k * d[r(a) + j]
                }),
                Op::Pow { dst, a, b } => each!(n, |j| {
                    let (x, y) = (v[r(a) + j], v[r(b) + j]);
                    let (dx, dy) = (d[r(a) + j], d[r(b) + j]);
                    let p = pow(x, y);
                    v[r(dst) + j] = p;
                    // d(x^y) = x^y (y' ln x + y x'/x)
                    d[r(dst) + j] = p * (dy * x.ln() + div(y * dx, x))
                }),
                Op::Call { dst, f, a } => each!(n, |j| {
                    let (fx, dfx) = f.value_d(v[r(a) + j]);
                    let dx = d[r(a) + j];
                    v[r(dst) + j] = fx;
                    d[r(dst) + j] = dfx * dx
                }),
            }
        }
    }
}

/// dst[j] = f(a[j]) over one block, on disjoint slices (no per-element index arithmetic).
#[inline(always)]
fn un(v: &mut [C], s: usize, n: usize, dst: Reg, a: Reg, f: impl Fn(C) -> C) {
    let (d, a) = (dst as usize, a as usize);
    if d == a {
        v[d * s..d * s + n].iter_mut().for_each(|x| *x = f(*x));
    } else if a < d {
        let (lo, hi) = v.split_at_mut(d * s);
        for (o, x) in hi[..n].iter_mut().zip(&lo[a * s..a * s + n]) {
            *o = f(*x);
        }
    } else {
        let (lo, hi) = v.split_at_mut(a * s);
        for (o, x) in lo[d * s..d * s + n].iter_mut().zip(&hi[..n]) {
            *o = f(*x);
        }
    }
}

/// dst[j] = f(a[j], b[j]) over one block; dst may coincide with a or b.
#[inline(always)]
fn bin(v: &mut [C], s: usize, n: usize, dst: Reg, a: Reg, b: Reg, f: impl Fn(C, C) -> C) {
    let d = dst as usize;
    let (lo, hi) = v.split_at_mut(d * s);
    let (dp, rest) = hi.split_at_mut(s);
    let dp = &mut dp[..n];
    let get = |x: Reg| -> Option<&[C]> {
        let x = x as usize;
        match x.cmp(&d) {
            std::cmp::Ordering::Equal => None,
            std::cmp::Ordering::Less => Some(&lo[x * s..x * s + n]),
            std::cmp::Ordering::Greater => Some(&rest[(x - d - 1) * s..(x - d - 1) * s + n]),
        }
    };
    match (get(a), get(b)) {
        (Some(x), Some(y)) => {
            for ((o, p), q) in dp.iter_mut().zip(x).zip(y) {
                *o = f(*p, *q);
            }
        }
        (None, Some(y)) => {
            for (o, q) in dp.iter_mut().zip(y) {
                *o = f(*o, *q);
            }
        }
        (Some(x), None) => {
            for (o, p) in dp.iter_mut().zip(x) {
                *o = f(*p, *o);
            }
        }
        (None, None) => dp.iter_mut().for_each(|o| *o = f(*o, *o)),
    }
}

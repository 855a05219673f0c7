//! The built-in one-argument functions: names, values and derivatives.
//!
//! Values use num-complex's principal branches where they are robust, and own
//! formulas where num-complex overflows (tan/tanh/sec/csc at large imaginary
//! parts, following Kahan's "Branch cuts for complex elementary functions", 1987).

use crate::special::{digamma, gamma};
use crate::C;

/// A built-in analytic (or principal-branch) function.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Func {
    Exp,
    Log,
    Sqrt,
    Sin,
    Cos,
    Tan,
    Cot,
    Sec,
    Csc,
    Sinh,
    Cosh,
    Tanh,
    Coth,
    Asin,
    Acos,
    Atan,
    Gamma,
}

/// Names read by the parser (`ln` is an alias of `log`).
pub const FUNCTION_NAMES: &[(&str, Func)] = &[
    ("exp", Func::Exp),
    ("log", Func::Log),
    ("ln", Func::Log),
    ("sqrt", Func::Sqrt),
    ("sin", Func::Sin),
    ("cos", Func::Cos),
    ("tan", Func::Tan),
    ("cot", Func::Cot),
    ("sec", Func::Sec),
    ("csc", Func::Csc),
    ("sinh", Func::Sinh),
    ("cosh", Func::Cosh),
    ("tanh", Func::Tanh),
    ("coth", Func::Coth),
    ("asin", Func::Asin),
    ("acos", Func::Acos),
    ("atan", Func::Atan),
    ("gamma", Func::Gamma),
];

/// Names refused because the function is not complex-differentiable.
pub const NON_ANALYTIC_NAMES: &[&str] = &[
    "abs", "re", "im", "conj", "arg", "Re", "Im", "real", "imag", "norm", "Abs", "sign", "floor",
    "ceil", "round", "max", "min",
];

/// Constant names.
pub const CONSTANT_NAMES: &[&str] = &["i", "pi", "e"];

impl Func {
    pub fn from_name(name: &str) -> Option<Func> {
        FUNCTION_NAMES
            .iter()
            .find(|(n, _)| *n == name)
            .map(|(_, f)| *f)
    }

    pub fn name(self) -> &'static str {
        FUNCTION_NAMES
            .iter()
            .find(|(_, f)| *f == self)
            .map(|(n, _)| *n)
            .unwrap_or("?")
    }

    /// Multivalued functions evaluated on their principal branch.
    pub fn is_branch(self) -> bool {
        matches!(
            self,
            Func::Log | Func::Sqrt | Func::Asin | Func::Acos | Func::Atan
        )
    }

    /// Value at `z`.
    #[inline]
    pub fn value(self, z: C) -> C {
        match self {
            Func::Exp => exp(z),
            Func::Log => z.ln(),
            Func::Sqrt => z.sqrt(),
            Func::Sin => z.sin(),
            Func::Cos => z.cos(),
            Func::Tan => tan(z),
            Func::Cot => recip(tan(z)),
            Func::Sec => sec(z),
            Func::Csc => csc(z),
            Func::Sinh => sinh(z),
            Func::Cosh => cosh(z),
            Func::Tanh => tanh(z),
            Func::Coth => recip(tanh(z)),
            Func::Asin => asin(z),
            Func::Acos => acos(z),
            Func::Atan => z.atan(),
            Func::Gamma => gamma(z),
        }
    }

    /// Value and derivative at `z`.
    #[inline]
    pub fn value_d(self, z: C) -> (C, C) {
        let one = C::new(1.0, 0.0);
        match self {
            Func::Exp => {
                let v = exp(z);
                (v, v)
            }
            Func::Log => (z.ln(), recip(z)),
            Func::Sqrt => {
                let v = z.sqrt();
                (v, recip(v + v))
            }
            Func::Sin => (z.sin(), z.cos()),
            Func::Cos => (z.cos(), -z.sin()),
            // Derivatives as squares of sec/csc, not 1 + tan^2, to avoid cancellation
            // where tan -> ±i (large |Im z|).
            Func::Tan => {
                let s = sec(z);
                (tan(z), s * s)
            }
            Func::Cot => {
                let c = csc(z);
                (recip(tan(z)), -(c * c))
            }
            Func::Sec => {
                let s = sec(z);
                (s, s * tan(z))
            }
            Func::Csc => {
                let c = csc(z);
                (c, -c * recip(tan(z)))
            }
            Func::Sinh => (sinh(z), cosh(z)),
            Func::Cosh => (cosh(z), sinh(z)),
            // tanh' = sech^2 z = sec(iz)^2; coth' = -csch^2 z = csc(iz)^2.
            Func::Tanh => {
                let s = sec(C::new(-z.im, z.re));
                (tanh(z), s * s)
            }
            Func::Coth => {
                let c = csc(C::new(-z.im, z.re));
                (recip(tanh(z)), c * c)
            }
            // d/dz asin z = 1/sqrt(1-z^2), written as 1/(sqrt(1-z) sqrt(1+z)) to match
            // the principal branch cuts (-inf,-1] and [1,inf).
            Func::Asin => (asin(z), recip((one - z).sqrt() * (one + z).sqrt())),
            Func::Acos => (acos(z), -recip((one - z).sqrt() * (one + z).sqrt())),
            Func::Atan => (z.atan(), recip(one + z * z)),
            Func::Gamma => {
                let g = gamma(z);
                (g, g * digamma(z))
            }
        }
    }
}

/// `m · t` where t comes from a cosine or sine: an exactly zero t gives an
/// exactly zero part even when m overflowed (∞ · 0 would be NaN). So exp, cosh
/// and sinh of a real argument past the overflow threshold are real infinities,
/// and 1/cosh(x) there is 0, as on the real line (common practice; C99 Annex G
/// specifies the same for cexp and ccosh of real arguments).
#[inline]
fn scaled(m: f64, t: f64) -> f64 {
    if t == 0.0 {
        0.0
    } else {
        m * t
    }
}

/// e^z = e^x (cos y + i sin y), with exact zero parts kept (see [`scaled`]).
pub fn exp(z: C) -> C {
    let m = z.re.exp();
    if z.im == 0.0 {
        return C::new(m, z.im);
    }
    let (s, c) = z.im.sin_cos();
    C::new(scaled(m, c), scaled(m, s))
}

/// cosh z = cosh x cos y + i sinh x sin y, with exact zero parts kept.
pub fn cosh(z: C) -> C {
    let (s, c) = z.im.sin_cos();
    C::new(scaled(z.re.cosh(), c), scaled(z.re.sinh(), s))
}

/// sinh z = sinh x cos y + i cosh x sin y, with exact zero parts kept.
pub fn sinh(z: C) -> C {
    let (s, c) = z.im.sin_cos();
    C::new(scaled(z.re.sinh(), c), scaled(z.re.cosh(), s))
}

/// 1/w by Smith's algorithm (no overflow of |w|^2); 1/0 is non-finite.
#[inline]
pub fn recip(w: C) -> C {
    div(C::new(1.0, 0.0), w)
}

/// a/b by Smith's algorithm (R. L. Smith, "Algorithm 116: Complex division", CACM 1962).
#[inline]
pub fn div(a: C, b: C) -> C {
    crate::poly::cdiv(a, b)
}

/// Principal asin by Kahan's formula: with ξ = √(1−z), η = √(1+z),
/// asin z = atan2(x, Re(ξη)) + i asinh(Im(conj(ξ) η)). No cancellation for large |z|.
pub fn asin(z: C) -> C {
    let one = C::new(1.0, 0.0);
    let (xi, eta) = ((one - z).sqrt(), (one + z).sqrt());
    let re = z.re.atan2((xi * eta).re);
    let im = (xi.conj() * eta).im.asinh();
    C::new(re, im)
}

/// Principal acos by Kahan's formula: acos z = 2 atan2(Re ξ, Re η) + i asinh(Im(conj(η) ξ)).
pub fn acos(z: C) -> C {
    let one = C::new(1.0, 0.0);
    let (xi, eta) = ((one - z).sqrt(), (one + z).sqrt());
    let re = 2.0 * xi.re.atan2(eta.re);
    let im = (eta.conj() * xi).im.asinh();
    C::new(re, im)
}

/// tanh by Kahan's formula; exact limit ±1 for large |Re z|.
pub fn tanh(z: C) -> C {
    let (x, y) = (z.re, z.im);
    if x.abs() > 22.0 {
        let e = (-2.0 * x.abs()).exp();
        return C::new(1f64.copysign(x), 4.0 * y.sin() * y.cos() * e);
    }
    let t = y.tan();
    let beta = 1.0 + t * t;
    let s = x.sinh();
    let rho = (1.0 + s * s).sqrt();
    let den = 1.0 + beta * s * s;
    C::new(beta * rho * s / den, t / den)
}

/// tan z = -i tanh(i z).
pub fn tan(z: C) -> C {
    let w = tanh(C::new(-z.im, z.re));
    C::new(w.im, -w.re)
}

/// sec z = 1/cos z, without overflow for large |Im z|.
pub fn sec(z: C) -> C {
    let (x, y) = (z.re, z.im);
    if y.abs() > 20.0 {
        let e = 2.0 * (-y.abs()).exp();
        return C::new(e * x.cos(), e * 1f64.copysign(y) * x.sin());
    }
    recip(z.cos())
}

/// csc z = 1/sin z, without overflow for large |Im z|.
pub fn csc(z: C) -> C {
    let (x, y) = (z.re, z.im);
    if y.abs() > 20.0 {
        let e = 2.0 * (-y.abs()).exp();
        return C::new(e * x.sin(), -e * 1f64.copysign(y) * x.cos());
    }
    recip(z.sin())
}

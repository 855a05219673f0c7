//! Compilation: resolve names, fold constants, and emit a flat register program.
//!
//! Registers are allocated like a stack (post-order walk; a binary node's
//! right operand goes one register above its left), so the register count is
//! the depth of right-nesting, not the size of the expression.

use super::functions::{Func, CONSTANT_NAMES, FUNCTION_NAMES, NON_ANALYTIC_NAMES};
use super::parser::{BinOp, Constant, Expr, Node};
use super::program::{as_small_integer, pow, Op, Program, Reg};
use super::ExprError;
use crate::C;

/// A resolved expression: the variable, folded constants, operations.
#[derive(Debug, Clone, PartialEq)]
pub enum R {
    Const(C),
    Var,
    Neg(Box<R>),
    Bin(BinOp, Box<R>, Box<R>),
    Call(Func, Box<R>),
}

impl R {
    pub fn as_const(&self) -> Option<C> {
        match self {
            R::Const(c) => Some(*c),
            _ => None,
        }
    }
}

fn valid_identifier(name: &str) -> bool {
    let mut chars = name.chars();
    matches!(chars.next(), Some(c) if c.is_ascii_alphabetic() || c == '_')
        && chars.all(|c| c.is_ascii_alphanumeric() || c == '_')
}

/// Check a variable or parameter name; `what` is "variable" or "parameter".
pub fn check_name(name: &str, what: &str, span: Option<(usize, usize)>) -> Result<(), ExprError> {
    let bad = |message: String| Err(ExprError { message, span });
    if !valid_identifier(name) {
        return bad(format!(
            "the {what} name '{name}' is not a valid name: use letters, digits and _, starting with a letter"
        ));
    }
    if CONSTANT_NAMES.contains(&name) {
        return bad(format!(
            "the {what} cannot be named '{name}': that is a built-in constant; pick another name"
        ));
    }
    if FUNCTION_NAMES.iter().any(|(n, _)| *n == name) || NON_ANALYTIC_NAMES.contains(&name) {
        return bad(format!(
            "the {what} cannot be named '{name}': that is a function name; pick another name"
        ));
    }
    Ok(())
}

/// Resolve names and fold constant subexpressions.
pub fn resolve(e: &Expr, var: &str, params: &[(String, C)]) -> Result<R, ExprError> {
    let folded_error = |span: (usize, usize)| ExprError {
        message: "this constant part evaluates to infinity or an undefined number (a division by \
                  zero, a pole of gamma, or an overflow): correct it"
            .into(),
        span: Some(span),
    };
    let out = match &e.node {
        Node::Num(v) => R::Const(C::new(*v, 0.0)),
        Node::Const(Constant::I) => R::Const(C::new(0.0, 1.0)),
        Node::Const(Constant::Pi) => R::Const(C::new(std::f64::consts::PI, 0.0)),
        Node::Const(Constant::E) => R::Const(C::new(std::f64::consts::E, 0.0)),
        Node::Name(name) => {
            if name == var {
                R::Var
            } else if let Some((_, value)) = params.iter().find(|(n, _)| n == name) {
                if !(value.re.is_finite() && value.im.is_finite()) {
                    return Err(ExprError {
                        message: format!(
                            "the parameter '{name}' is not a finite number: give it a finite value"
                        ),
                        span: Some(e.span),
                    });
                }
                R::Const(*value)
            } else {
                let hint = if name.chars().count() == 1 && var != name {
                    format!(" (the variable is '{var}')")
                } else {
                    String::new()
                };
                return Err(ExprError {
                    message: format!(
                        "unknown name '{name}': add it as a parameter or check the spelling{hint}"
                    ),
                    span: Some(e.span),
                });
            }
        }
        Node::Neg(a) => match resolve(a, var, params)? {
            R::Const(c) => R::Const(-c),
            other => R::Neg(Box::new(other)),
        },
        Node::Call(f, a) => match resolve(a, var, params)? {
            R::Const(c) => R::Const(f.value(c)),
            other => R::Call(*f, Box::new(other)),
        },
        Node::Binary(op, a, b) => {
            let (x, y) = (resolve(a, var, params)?, resolve(b, var, params)?);
            fold_binary(*op, x, y)
        }
    };
    if let R::Const(c) = out {
        if !(c.re.is_finite() && c.im.is_finite()) {
            return Err(folded_error(e.span));
        }
    }
    Ok(out)
}

fn fold_binary(op: BinOp, x: R, y: R) -> R {
    let one = C::new(1.0, 0.0);
    match (op, &x, &y) {
        (_, R::Const(a), R::Const(b)) => R::Const(match op {
            BinOp::Add => a + b,
            BinOp::Sub => a - b,
            BinOp::Mul => a * b,
            BinOp::Div => super::functions::div(*a, *b),
            BinOp::Pow => pow(*a, *b),
        }),
        (BinOp::Pow, _, R::Const(k)) if *k == C::new(0.0, 0.0) => R::Const(one), // z^0 = 1
        (BinOp::Pow, _, R::Const(k)) if *k == one => x,
        (BinOp::Mul, R::Const(k), _) if *k == one => y,
        (BinOp::Mul | BinOp::Div, _, R::Const(k)) if *k == one => x,
        _ => R::Bin(op, Box::new(x), Box::new(y)),
    }
}

/// Emit the flat program for a resolved expression.
pub fn emit_program(e: &R) -> Program {
    let mut em = Emitter {
        ops: Vec::new(),
        max_reg: 0,
    };
    let result = em.emit(e, 1);
    Program {
        ops: em.ops,
        registers: em.max_reg as usize + 1,
        result,
    }
}

struct Emitter {
    ops: Vec<Op>,
    max_reg: Reg,
}

impl Emitter {
    fn emit(&mut self, e: &R, free: Reg) -> Reg {
        let dst = free;
        let op = match e {
            R::Var => return 0,
            R::Const(k) => Op::LoadK { dst, k: *k },
            R::Neg(a) => {
                let a = self.emit(a, free);
                Op::Neg { dst, a }
            }
            R::Call(f, a) => {
                let a = self.emit(a, free);
                Op::Call { dst, f: *f, a }
            }
            R::Bin(op, x, y) => match (op, x.as_const(), y.as_const()) {
                (BinOp::Add, _, Some(k)) => Op::AddK {
                    dst,
                    a: self.emit(x, free),
                    k,
                },
                (BinOp::Sub, _, Some(k)) => Op::AddK {
                    dst,
                    a: self.emit(x, free),
                    k: -k,
                },
                (BinOp::Mul, _, Some(k)) => Op::MulK {
                    dst,
                    a: self.emit(x, free),
                    k,
                },
                (BinOp::Div, _, Some(k)) => Op::DivK {
                    dst,
                    a: self.emit(x, free),
                    k,
                },
                (BinOp::Add, Some(k), _) => Op::AddK {
                    dst,
                    a: self.emit(y, free),
                    k,
                },
                (BinOp::Mul, Some(k), _) => Op::MulK {
                    dst,
                    a: self.emit(y, free),
                    k,
                },
                (BinOp::Sub, Some(k), _) => Op::KSub {
                    dst,
                    k,
                    a: self.emit(y, free),
                },
                (BinOp::Div, Some(k), _) => Op::KDiv {
                    dst,
                    k,
                    a: self.emit(y, free),
                },
                (BinOp::Pow, _, Some(k)) => {
                    let a = self.emit(x, free);
                    if let Some(n) = as_small_integer(k) {
                        Op::Powi { dst, a, n }
                    } else if k.im == 0.0 {
                        Op::Powf { dst, a, f: k.re }
                    } else {
                        Op::Powc { dst, a, k }
                    }
                }
                (BinOp::Pow, Some(k), _) => Op::KPow {
                    dst,
                    k,
                    ln_k: k.ln(),
                    a: self.emit(y, free),
                },
                _ => {
                    let a = self.emit(x, free);
                    let next = if a == free { free + 1 } else { free };
                    let b = self.emit(y, next);
                    match op {
                        BinOp::Add => Op::Add { dst, a, b },
                        BinOp::Sub => Op::Sub { dst, a, b },
                        BinOp::Mul => Op::Mul { dst, a, b },
                        BinOp::Div => Op::Div { dst, a, b },
                        BinOp::Pow => Op::Pow { dst, a, b },
                    }
                }
            },
        };
        self.max_reg = self.max_reg.max(dst);
        self.ops.push(op);
        dst
    }
}

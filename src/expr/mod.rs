//! The expression engine: parse a formula in one complex variable, compile it
//! to a flat register program, and evaluate it (with its derivative) fast.
//!
//! ```text
//! parse ──► Expr (spans) ──► resolve+fold ──► R ──┬─► Program (block evaluator, f and f')
//!                                                  └─► analysis + rational form
//! ```

pub mod analysis;
pub mod compile;
pub mod functions;
pub mod lexer;
pub mod parser;
pub mod program;
pub mod rational;

pub use analysis::Analysis;
pub use functions::Func;
pub use parser::{parse, BinOp, Constant, Expr, Node};
pub use rational::Rational;

use crate::C;
use program::{Program, BLOCK};
use std::cell::RefCell;

/// A user-facing expression error: what to do, and where (character offsets `[start, end)`).
#[derive(Debug, Clone, PartialEq)]
pub struct ExprError {
    pub message: String,
    pub span: Option<(usize, usize)>,
}

impl std::fmt::Display for ExprError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self.span {
            Some((a, b)) => write!(f, "{} (at characters {}..{})", self.message, a, b),
            None => write!(f, "{}", self.message),
        }
    }
}

impl std::error::Error for ExprError {}

/// Scalar evaluation keeps its registers on the stack up to this many.
const STACK_REGISTERS: usize = 64;

/// A compiled function of one complex variable. Immutable, `Send + Sync`;
/// evaluation scratch lives on the stack or in a per-thread buffer.
#[derive(Debug, Clone)]
pub struct Function {
    source: String,
    var: String,
    program: Program,
    rational: Option<Rational>,
    analysis: Analysis,
}

thread_local! {
    static SCRATCH: RefCell<(Vec<C>, Vec<C>)> = const { RefCell::new((Vec::new(), Vec::new())) };
}

impl Function {
    /// Parse and compile `src` as a function of `var`, with named parameter values.
    pub fn compile(src: &str, var: &str, params: &[(String, C)]) -> Result<Function, ExprError> {
        let tree = parse(src)?;
        let span_of = |name: &str| -> Option<(usize, usize)> {
            lexer::lex(src).ok()?.into_iter().find_map(|t| match t.tok {
                lexer::Tok::Ident(ref s) if s == name => Some(t.span),
                _ => None,
            })
        };
        compile::check_name(var, "variable", span_of(var))?;
        for (name, _) in params {
            compile::check_name(name, "parameter", span_of(name))?;
            if name == var {
                return Err(ExprError {
                    message: format!("'{name}' is both the variable and a parameter: rename one"),
                    span: span_of(name),
                });
            }
        }
        let resolved = compile::resolve(&tree, var, params)?;
        let program = compile::emit_program(&resolved);
        let (analysis, rational) = analysis::analyse(&resolved);
        Ok(Function {
            source: src.to_string(),
            var: var.to_string(),
            program,
            rational,
            analysis,
        })
    }

    /// f(z).
    pub fn eval(&self, z: C) -> C {
        let n = self.program.registers;
        if n <= STACK_REGISTERS {
            let mut v = [C::new(0.0, 0.0); STACK_REGISTERS];
            v[0] = z;
            self.program.run(&mut v, 1, 1);
            return v[self.program.result as usize];
        }
        let mut out = [C::new(0.0, 0.0)];
        self.eval_block(&[z], &mut out);
        out[0]
    }

    /// (f(z), f'(z)).
    pub fn eval_d(&self, z: C) -> (C, C) {
        let n = self.program.registers;
        if n <= STACK_REGISTERS {
            let mut v = [C::new(0.0, 0.0); STACK_REGISTERS];
            let mut d = [C::new(0.0, 0.0); STACK_REGISTERS];
            v[0] = z;
            self.program.run_d(&mut v, &mut d, 1, 1);
            let r = self.program.result as usize;
            return (v[r], d[r]);
        }
        let (mut out, mut dout) = ([C::new(0.0, 0.0)], [C::new(0.0, 0.0)]);
        self.eval_block_d(&[z], &mut out, &mut dout);
        (out[0], dout[0])
    }

    /// out[j] = f(zs[j]) for j < min(zs.len(), out.len()).
    pub fn eval_block(&self, zs: &[C], out: &mut [C]) {
        self.with_scratch(false, |v, _| {
            let r = self.program.result as usize * BLOCK;
            for (zc, oc) in zs.chunks(BLOCK).zip(out.chunks_mut(BLOCK)) {
                let n = zc.len().min(oc.len());
                v[..n].copy_from_slice(&zc[..n]);
                self.program.run(v, BLOCK, n);
                oc[..n].copy_from_slice(&v[r..r + n]);
            }
        });
    }

    /// out[j] = f(zs[j]), dout[j] = f'(zs[j]).
    pub fn eval_block_d(&self, zs: &[C], out: &mut [C], dout: &mut [C]) {
        self.with_scratch(true, |v, d| {
            let r = self.program.result as usize * BLOCK;
            for ((zc, oc), dc) in zs
                .chunks(BLOCK)
                .zip(out.chunks_mut(BLOCK))
                .zip(dout.chunks_mut(BLOCK))
            {
                let n = zc.len().min(oc.len()).min(dc.len());
                v[..n].copy_from_slice(&zc[..n]);
                self.program.run_d(v, d, BLOCK, n);
                oc[..n].copy_from_slice(&v[r..r + n]);
                dc[..n].copy_from_slice(&d[r..r + n]);
            }
        });
    }

    /// Run `work` with register files of `registers * BLOCK` values, reusing a
    /// per-thread buffer (a fresh one if that buffer is already in use).
    fn with_scratch(&self, derivative: bool, work: impl FnOnce(&mut [C], &mut [C])) {
        let len = self.program.registers * BLOCK;
        let dlen = if derivative { len } else { 0 };
        let mut work = Some(work);
        let _ = SCRATCH.try_with(|cell| {
            if let Ok(mut s) = cell.try_borrow_mut() {
                let (v, d) = &mut *s;
                if v.len() < len {
                    v.resize(len, C::new(0.0, 0.0));
                }
                if d.len() < dlen {
                    d.resize(dlen, C::new(0.0, 0.0));
                }
                if let Some(w) = work.take() {
                    w(&mut v[..len], &mut d[..dlen]);
                }
            }
        });
        if let Some(w) = work.take() {
            let mut v = vec![C::new(0.0, 0.0); len];
            let mut d = vec![C::new(0.0, 0.0); dlen];
            w(&mut v, &mut d);
        }
    }

    /// The rational form num/den when f is a ratio of polynomials in the variable.
    pub fn rational(&self) -> Option<&Rational> {
        self.rational.as_ref()
    }

    pub fn analysis(&self) -> &Analysis {
        &self.analysis
    }

    pub fn source(&self) -> &str {
        &self.source
    }

    pub fn var(&self) -> &str {
        &self.var
    }

    /// Budget units one evaluation of f costs (`crate::budget::weight_for_program`
    /// of its program's cost).
    pub fn weight(&self) -> u64 {
        crate::budget::weight_for_program(self.program.cost())
    }

    /// The compiled instruction list (for inspection and tests).
    pub fn program(&self) -> &Program {
        &self.program
    }
}

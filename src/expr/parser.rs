//! Recursive-descent parser for the expression language.
//!
//! Grammar (lowest to highest precedence):
//! ```text
//! sum     := product (('+' | '-') product)*
//! product := unary (('*' | '/') unary | implicit power)*
//! unary   := ('-' | '+') unary | power
//! power   := primary ('^' unary)?          right-associative: 2^3^2 = 2^(3^2)
//! primary := number | constant | name | function '(' sum ')' | '(' sum ')'
//! ```
//! Implicit multiplication applies only when the left token is a number or a
//! closing parenthesis and the right token is a name or '('. Depth is checked
//! before every recursion so no input can overflow the stack.

use super::functions::{Func, CONSTANT_NAMES, NON_ANALYTIC_NAMES};
use super::lexer::{lex, Tok, Token};
use super::ExprError;

/// Deepest accepted nesting of parentheses, signs, powers and calls.
pub const MAX_DEPTH: usize = 200;

/// Deepest accepted syntax tree (long chains such as 1+1+…+1 nest to the left);
/// keeps every later recursive pass within a small stack, including on wasm.
pub const MAX_TREE_DEPTH: usize = 1500;

/// A built-in constant.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Constant {
    /// The imaginary unit `i`.
    I,
    Pi,
    E,
}

/// A binary operator.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum BinOp {
    Add,
    Sub,
    Mul,
    Div,
    Pow,
}

/// An expression node with its character span `[start, end)` in the source.
#[derive(Debug, Clone, PartialEq)]
pub struct Expr {
    pub node: Node,
    pub span: (usize, usize),
}

/// The node kinds of the syntax tree.
#[derive(Debug, Clone, PartialEq)]
pub enum Node {
    Num(f64),
    Const(Constant),
    /// The variable or a parameter; resolved when compiling.
    Name(String),
    Neg(Box<Expr>),
    Binary(BinOp, Box<Expr>, Box<Expr>),
    Call(Func, Box<Expr>),
}

fn err(message: impl Into<String>, span: (usize, usize)) -> ExprError {
    ExprError {
        message: message.into(),
        span: Some(span),
    }
}

/// Parse `src` into a syntax tree.
pub fn parse(src: &str) -> Result<Expr, ExprError> {
    let tokens = lex(src)?;
    if tokens.is_empty() {
        return Err(ExprError {
            message: "empty expression: type a function of z such as (z+1)/(z^2+4)".into(),
            span: Some((0, src.chars().count())),
        });
    }
    let mut p = Parser {
        tokens: &tokens,
        pos: 0,
    };
    let e = p.sum(0)?;
    if let Some(t) = p.peek() {
        return Err(match t.tok {
            Tok::RParen => err("unmatched ')': remove it or add a '(' before it", t.span),
            _ => err(format!("unexpected {}", t.tok.describe()), t.span),
        });
    }
    if tree_depth(&e) > MAX_TREE_DEPTH {
        return Err(err(
            format!("the expression has more than {MAX_TREE_DEPTH} chained operations: shorten or factor it"),
            e.span,
        ));
    }
    Ok(e)
}

/// Depth of the tree, computed without recursion.
fn tree_depth(e: &Expr) -> usize {
    let mut stack = vec![(e, 1usize)];
    let mut deepest = 0;
    while let Some((x, d)) = stack.pop() {
        deepest = deepest.max(d);
        match &x.node {
            Node::Neg(a) | Node::Call(_, a) => stack.push((a, d + 1)),
            Node::Binary(_, a, b) => {
                stack.push((a, d + 1));
                stack.push((b, d + 1));
            }
            _ => {}
        }
    }
    deepest
}

/// Message for a name that is a refused, non-analytic function.
pub fn non_analytic_message(name: &str) -> String {
    let hint = match name {
        "abs" | "Abs" | "norm" => {
            " For a gain |H(jw)|^2 on the imaginary axis, use the analytic H(s)*H(-s) (real coefficients)."
        }
        "conj" => " For real coefficients, conj(f(z)) on the real axis equals f(z) itself.",
        _ => "",
    };
    format!(
        "{name}(...) is not complex-differentiable, so residues are undefined; residues and \
         contour integrals need a meromorphic function (complex-differentiable except at \
         isolated points).{hint}"
    )
}

struct Parser<'a> {
    tokens: &'a [Token],
    pos: usize,
}

impl<'a> Parser<'a> {
    fn peek(&self) -> Option<&'a Token> {
        self.tokens.get(self.pos)
    }

    fn prev(&self) -> Option<&'a Token> {
        self.pos.checked_sub(1).and_then(|k| self.tokens.get(k))
    }

    fn depth_check(&self, depth: usize) -> Result<(), ExprError> {
        if depth > MAX_DEPTH {
            let span = self
                .peek()
                .map(|t| t.span)
                .or(self.prev().map(|t| t.span))
                .unwrap_or((0, 0));
            return Err(err(
                format!("the expression nests deeper than {MAX_DEPTH} levels: simplify it"),
                span,
            ));
        }
        Ok(())
    }

    /// Error for a missing operand at the current position.
    fn missing_operand(&self) -> ExprError {
        match (self.prev(), self.peek()) {
            (Some(p), None) => {
                let end = p.span.1;
                err(
                    format!(
                        "unexpected end of input: an operand is missing after {}",
                        p.tok.describe()
                    ),
                    (end, end),
                )
            }
            (Some(p), Some(t)) if t.tok == Tok::RParen && p.tok == Tok::LParen => err(
                "empty parentheses: put an expression inside",
                (p.span.0, t.span.1),
            ),
            (Some(p), Some(t)) => err(
                format!(
                    "an operand is missing between {} and {}: add a number or name",
                    p.tok.describe(),
                    t.tok.describe()
                ),
                t.span,
            ),
            (None, Some(t)) => err(
                format!(
                    "the expression cannot start with {}: add an operand before it",
                    t.tok.describe()
                ),
                t.span,
            ),
            (None, None) => err(
                "empty expression: type a function of z such as (z+1)/(z^2+4)",
                (0, 0),
            ),
        }
    }

    fn sum(&mut self, depth: usize) -> Result<Expr, ExprError> {
        self.depth_check(depth)?;
        let mut lhs = self.product(depth)?;
        while let Some(t) = self.peek() {
            let op = match t.tok {
                Tok::Plus => BinOp::Add,
                Tok::Minus => BinOp::Sub,
                _ => break,
            };
            self.pos += 1;
            let rhs = self.product(depth)?;
            let span = (lhs.span.0, rhs.span.1);
            lhs = Expr {
                node: Node::Binary(op, Box::new(lhs), Box::new(rhs)),
                span,
            };
        }
        Ok(lhs)
    }

    fn product(&mut self, depth: usize) -> Result<Expr, ExprError> {
        let mut lhs = self.unary(depth)?;
        while let Some(t) = self.peek() {
            let (op, rhs) = match &t.tok {
                Tok::Star | Tok::Slash => {
                    let op = if t.tok == Tok::Star {
                        BinOp::Mul
                    } else {
                        BinOp::Div
                    };
                    self.pos += 1;
                    (op, self.unary(depth)?)
                }
                Tok::Num(_) | Tok::Ident(_) | Tok::LParen => {
                    let left = self.prev().map(|p| &p.tok);
                    let left_ok = matches!(left, Some(Tok::Num(_)) | Some(Tok::RParen));
                    let right_ok = matches!(t.tok, Tok::Ident(_) | Tok::LParen);
                    if !(left_ok && right_ok) {
                        let p = self.prev().map(|p| p.span).unwrap_or(t.span);
                        return Err(err(
                            format!(
                                "missing operator: put * between {} and {}",
                                self.prev().map(|p| p.tok.describe()).unwrap_or_default(),
                                t.tok.describe()
                            ),
                            (p.0, t.span.1),
                        ));
                    }
                    (BinOp::Mul, self.power(depth)?)
                }
                _ => break,
            };
            let span = (lhs.span.0, rhs.span.1);
            lhs = Expr {
                node: Node::Binary(op, Box::new(lhs), Box::new(rhs)),
                span,
            };
        }
        Ok(lhs)
    }

    fn unary(&mut self, depth: usize) -> Result<Expr, ExprError> {
        self.depth_check(depth)?;
        match self.peek() {
            Some(t) if t.tok == Tok::Minus || t.tok == Tok::Plus => {
                self.pos += 1;
                let inner = self.unary(depth + 1)?;
                if t.tok == Tok::Plus {
                    return Ok(inner);
                }
                let span = (t.span.0, inner.span.1);
                Ok(Expr {
                    node: Node::Neg(Box::new(inner)),
                    span,
                })
            }
            _ => self.power(depth),
        }
    }

    fn power(&mut self, depth: usize) -> Result<Expr, ExprError> {
        let base = self.primary(depth)?;
        if let Some(t) = self.peek() {
            if t.tok == Tok::Caret {
                self.pos += 1;
                let exponent = self.unary(depth + 1)?;
                let span = (base.span.0, exponent.span.1);
                return Ok(Expr {
                    node: Node::Binary(BinOp::Pow, Box::new(base), Box::new(exponent)),
                    span,
                });
            }
        }
        Ok(base)
    }

    fn primary(&mut self, depth: usize) -> Result<Expr, ExprError> {
        let Some(t) = self.peek() else {
            return Err(self.missing_operand());
        };
        match &t.tok {
            Tok::Num(v) => {
                self.pos += 1;
                Ok(Expr {
                    node: Node::Num(*v),
                    span: t.span,
                })
            }
            Tok::LParen => {
                self.pos += 1;
                if self.peek().map(|n| &n.tok) == Some(&Tok::RParen) {
                    return Err(self.missing_operand());
                }
                let inner = self.sum(depth + 1)?;
                self.close(t)?;
                let end = self.prev().map(|p| p.span.1).unwrap_or(inner.span.1);
                Ok(Expr {
                    node: inner.node,
                    span: (t.span.0, end),
                })
            }
            Tok::Ident(name) => self.name(t, name, depth),
            _ => Err(self.missing_operand()),
        }
    }

    /// Expect the ')' matching `open`.
    fn close(&mut self, open: &Token) -> Result<(), ExprError> {
        match self.peek() {
            Some(c) if c.tok == Tok::RParen => {
                self.pos += 1;
                Ok(())
            }
            Some(c) => Err(err(
                format!(
                    "expected ')' to close '(' opened at {}, found {}",
                    open.span.0,
                    c.tok.describe()
                ),
                c.span,
            )),
            None => Err(err(
                format!("expected ')' to close '(' opened at {}", open.span.0),
                open.span,
            )),
        }
    }

    fn name(&mut self, t: &'a Token, name: &str, depth: usize) -> Result<Expr, ExprError> {
        self.pos += 1;
        let next_is_paren = self.peek().map(|n| &n.tok) == Some(&Tok::LParen);
        if NON_ANALYTIC_NAMES.contains(&name) {
            return Err(err(non_analytic_message(name), t.span));
        }
        if let Some(f) = Func::from_name(name) {
            if !next_is_paren {
                return Err(err(
                    format!("'{name}' is a function: write {name}(...) with parentheses, e.g. {name}(z)"),
                    t.span,
                ));
            }
            let open = &self.tokens[self.pos];
            self.pos += 1;
            if self.peek().map(|n| &n.tok) == Some(&Tok::RParen) {
                return Err(err(
                    format!("{name}() needs an argument, e.g. {name}(z)"),
                    (t.span.0, self.tokens[self.pos].span.1),
                ));
            }
            let arg = self.sum(depth + 1)?;
            self.close(open)?;
            let end = self.prev().map(|p| p.span.1).unwrap_or(arg.span.1);
            return Ok(Expr {
                node: Node::Call(f, Box::new(arg)),
                span: (t.span.0, end),
            });
        }
        let node = match name {
            "i" => Node::Const(Constant::I),
            "pi" => Node::Const(Constant::Pi),
            "e" => Node::Const(Constant::E),
            _ => {
                if next_is_paren {
                    let paren = self.tokens[self.pos].span;
                    return Err(err(
                        format!("unknown function '{name}'; write {name}*(...) to multiply"),
                        (t.span.0, paren.1),
                    ));
                }
                Node::Name(name.to_string())
            }
        };
        debug_assert!(CONSTANT_NAMES.len() == 3);
        Ok(Expr { node, span: t.span })
    }
}

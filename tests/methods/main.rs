//! Tests of the numerical methods called directly, one module per method family.
//! Every check names its outside source beside it.

#[path = "../common/mod.rs"]
mod common;

mod expr_eval;
mod expr_parser;
mod expr_rational;
mod laurent;
mod meromorphic;
mod plot;
mod poly_roots;
mod quadrature;
mod rational_residues;

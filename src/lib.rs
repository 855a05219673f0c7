//! residuary — singularities, residues, Laurent series and contour integrals.
//!
//! The core is plain Rust with no WebAssembly types. Every caller (the page
//! through `wasm`, node, and the `residuary` command line) goes through
//! [`api::run`], the one doorway.

pub mod api;
pub mod budget;
pub mod cauchy;
pub mod contour;
pub mod error;
pub mod expr;
pub mod integrals;
pub mod linalg;
pub mod plot;
pub mod poly;
pub mod quad;
#[cfg(test)]
pub(crate) mod reference;
pub mod series;
pub mod singular;
pub mod special;
pub mod text;
pub mod transforms;
pub mod ways;

#[cfg(target_arch = "wasm32")]
pub mod wasm;

/// The complex number type used everywhere.
pub type C = num_complex::Complex64;

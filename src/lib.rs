//! residuary — singularities, residues, Laurent series, contour and real
//! integrals, and inverse transforms, each computed in independent ways and
//! reconciled by one rule, so that every value comes with an error estimate
//! that bounds its error, or is refused with the reason.
//!
//! The core is plain Rust with no WebAssembly types. Every caller (the page
//! through `wasm`, node, and the `residuary` command line) goes through
//! [`api::run`], the one doorway; the JSON contract is `docs/contract.md`.
//!
//! ```
//! use residuary::api::run_json_text;
//! // Res_{z=-3} Γ(z) = (−1)³/3! = −1/6 (DLMF 5.2.1 and §5.2(i)).
//! let (out, is_error) = run_json_text(r#"{"task": "residue", "f": "gamma(z)", "at": [-3, 0]}"#);
//! assert!(!is_error);
//! let v: serde_json::Value = serde_json::from_str(&out).unwrap();
//! assert!((v["residue"][0].as_f64().unwrap() + 1.0 / 6.0).abs() < 1e-12);
//! assert_eq!(v["kind"], "pole");
//! ```
//!
//! # Where each task's methods live
//!
//! A task file (`api/tasks/<task>.rs`) is the plan; each method is one file.
//!
//! | task | methods (files) |
//! |---|---|
//! | `evaluate`, `phase_plot` | [`expr`] (compiler and evaluator), [`plot::phase_plot`], [`plot::colour_wheel`] |
//! | `residue` | [`singular::rational_poles`], [`singular::rational_check`] (by [`cauchy::circle`]); [`singular::classify`] for other f |
//! | `singularities` | [`singular::rational_poles`] (roots by [`poly::multiplicity`] and [`poly::pejorative`]), [`singular::rational_in_region`], [`singular::rational_check`]; for other f [`singular::meromorphic`] (with [`singular::argument_principle`], [`singular::aaa`], [`singular::newton_refine`], [`singular::classify`], [`singular::cut_crossing`]), [`singular::removable`] |
//! | `laurent` | [`series::laurent_fft`] (by [`cauchy::circle`]) |
//! | `partial_fractions` | [`singular::rational_poles`], [`poly::partial_fractions`] |
//! | `contour_integral` | [`quad::contour_quadrature`], [`quad::split_at_cuts`], [`integrals::contour_residues`], [`contour::covering`], [`singular::region_search`] |
//! | `argument_count` | [`singular::argument_principle`], [`integrals::contour_residues`] |
//! | `real_integral` | [`integrals::real_line`], [`integrals::unit_circle`], [`integrals::keyhole`], [`integrals::product_residue`], [`quad::real_line`], [`singular::decay`] |
//! | `inverse_laplace` | [`transforms::laplace::residues`], [`transforms::laplace::fixed_talbot`], [`transforms::laplace::delayed_inversion`], [`transforms::laplace::delay_estimate`], [`transforms::laplace::delay_terms`], [`transforms::laplace::delayed_residues`], [`transforms::laplace::contour_cuts`] |
//! | `inverse_z` | [`transforms::z::recurrence`], [`transforms::z::residues`], [`transforms::z::trapezoid`] (by [`cauchy::circle`]), [`transforms::z::singular_radius`] |
//! | `transfer_function` | [`transforms::system::pole_data`], [`transforms::system::frequency_response`], [`transforms::system::encirclement`], [`transforms::system::step_response`] (on [`singular::rational_poles`], [`transforms::laplace::residues`], [`transforms::z::recurrence`]) |
//!
//! One kernel per idea: [`ways`] is the one rule by which independent ways
//! agree; [`cauchy::circle`] the one sampler and FFT on a circle; [`text`]
//! every number-to-text; [`error`] the core's one error type (a kind to
//! branch on, a sentence for people); [`budget`] bounds every request's work.
//! `docs/methods.md` gives each method's formula and published source.

pub mod api;
pub mod budget;
pub mod cauchy;
pub mod contour;
pub mod error;
pub mod expr;
pub mod integrals;
pub mod linalg;
pub mod overflow;
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

//! ∮ f(z) dz over a closed contour, piece by piece.
//!
//! Method: circle and ellipse pieces use the periodic trapezoidal rule
//! (Trefethen & Weideman, SIAM Review 56, 2014), straight segments use
//! adaptive Gauss–Kronrod G7–K15 (Piessens et al., QUADPACK, 1983). The piece
//! values and their error estimates are summed.

use super::{gauss_kronrod, trapezoid_periodic, QuadError, QuadResult, Tolerance};
use crate::text;
use crate::error::Failure;
use crate::budget::Budget;
use crate::contour::{Contour, Piece};
use crate::C;

/// ∮_contour f(z) dz with an error estimate (sum of the pieces' estimates).
///
/// The tolerance is shared among pieces: each piece aims at
/// `max(tol.abs / pieces, tol.rel * |piece value|)`. Errors name the point
/// where f is not finite ("a singularity lies on the contour").
pub fn contour_integral(
    f: &mut dyn FnMut(C) -> C,
    contour: &Contour,
    tol: Tolerance,
    budget: &mut Budget,
) -> Result<QuadResult, Failure> {
    contour.validate()?;
    let pieces = contour.pieces();
    let piece_tol = Tolerance {
        abs: tol.abs / pieces.len().max(1) as f64,
        rel: tol.rel,
    };
    let mut total = QuadResult::zero();
    for piece in &pieces {
        let result = match *piece {
            Piece::Ellipse { .. } => {
                trapezoid_periodic::integrate_piece(f, piece, piece_tol, budget)
            }
            Piece::Segment { from, to } => {
                let mut g = |t: f64| f(piece.point(t)) * (to - from);
                gauss_kronrod::integrate_unit(&mut g, piece_tol, budget)
            }
        };
        total.absorb(result.map_err(|e| on_piece_error(piece, e))?);
    }
    Ok(total)
}

/// The message for a failed piece: where f is not finite on it, or why else.
pub fn on_piece_error(piece: &Piece, e: QuadError) -> Failure {
    match e {
        QuadError::NotFinite { at } => Failure::on_contour(format!(
            "f is not finite at {} on the contour: a singularity lies on it; move the contour",
            text::place(piece.point(at))
        ))
        .at(piece.point(at)),
        e => e.into(),
    }
}

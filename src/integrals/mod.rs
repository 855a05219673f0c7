//! Integrals evaluated by residues: around a contour, over the real line,
//! over the unit circle (trigonometric) and around a keyhole (Mellin).
//! Each file is one method with its `//! Method:` doc and a slow reference test.

pub mod contour_residues;
pub mod derivation;
pub mod keyhole;
pub mod product_residue;
pub mod real_line;
pub mod unit_circle;

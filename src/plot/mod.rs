//! Phase plots: colour wheels, the row-band renderer, PNG and base64 output.

pub mod base64;
pub mod colour_wheel;
pub mod legend;
pub mod oklab;
pub mod phase_plot;
pub mod png_encode;

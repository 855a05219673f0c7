//! The three phase-plot benchmark functions, of growing cost, shared by the
//! native example (bench/phase_plot_native.rs) and the wasm benchmark
//! (bench/wasm/src/lib.rs) through `#[path]`. bench/phase_plot_numpy.py
//! writes the same three functions in numpy; keep the three in step.
//!
//! Each case has its expression text (for the interpreted evaluator) and the
//! same function written by hand in Rust.

use residuary::C;

/// One benchmark function: a short name, the expression in the variable `z`,
/// and the same function hand-written.
pub struct Case {
    pub name: &'static str,
    pub expr: &'static str,
    pub handwritten: fn(C) -> C,
}

/// Second-order low-pass filter H(z) = wn²/(z² + 2ζ wn z + wn²), wn = 2, ζ = 0.3.
fn lowpass2(z: C) -> C {
    C::new(4.0, 0.0) / (z * z + 1.2 * z + 4.0)
}

/// Damped resonator response with a pair of poles at ±i.
fn damped_resonator(z: C) -> C {
    (-z).exp() * (3.0 * z).sin() / (z * z + 1.0)
}

/// A sum of trigonometric, exponential, logarithm and square-root terms.
fn mixed(z: C) -> C {
    z.sin() / (z * z * z - 1.0) + z.exp() * (z * z).cos() + (z + 2.0).ln() * (z * z - 1.0).sqrt()
}

/// The cases, cheapest first.
pub const CASES: [Case; 3] = [
    Case {
        name: "lowpass2",
        expr: "4/(z^2 + 1.2*z + 4)",
        handwritten: lowpass2,
    },
    Case {
        name: "resonator",
        expr: "exp(-z)*sin(3*z)/(z^2 + 1)",
        handwritten: damped_resonator,
    },
    Case {
        name: "mixed",
        expr: "sin(z)/(z^3 - 1) + exp(z)*cos(z^2) + log(z + 2)*sqrt(z^2 - 1)",
        handwritten: mixed,
    },
];

/// The view and image size every benchmark uses: 800×600 pixels on
/// [-3, 3] × [-2.25, 2.25].
pub const WIDTH: u32 = 800;
pub const HEIGHT: u32 = 600;
pub const VIEW: [f64; 4] = [-3.0, 3.0, -2.25, 2.25];

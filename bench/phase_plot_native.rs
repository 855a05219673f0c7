//! Benchmark of the phase-plot renderer with hand-written Rust evaluators.
//!
//! Run: `cargo run --release --example phase_plot_native [-- --png DIR]`
//! Prints Mpixel/s for evaluation alone, colouring alone (identity f) and the
//! full render, for three functions of growing cost. `--png DIR` also writes
//! the pictures. To compare another evaluator (e.g. the interpreted one), add
//! one line to `cases()`.

use residuary::plot::phase_plot::{render, PlotOptions, View};
use residuary::plot::png_encode::encode_png_rgba;
use residuary::C;
use std::time::Instant;

type Block = Box<dyn FnMut(&[C], &mut [C])>;

/// Applies a pointwise function to a block.
fn pointwise(f: impl Fn(C) -> C + 'static) -> Block {
    Box::new(move |zs: &[C], out: &mut [C]| {
        for (o, z) in out.iter_mut().zip(zs) {
            *o = f(*z);
        }
    })
}

/// The cases: (name, evaluator). One line per evaluator.
fn cases() -> Vec<(&'static str, Block)> {
    vec![
        // Second-order low-pass filter H(s) = wn²/(s² + 2ζ wn s + wn²), wn = 2, ζ = 0.3.
        (
            "lowpass2 (rational)",
            pointwise(|s| {
                let (wn, zeta) = (2.0, 0.3);
                C::new(wn * wn, 0.0) / (s * s + 2.0 * zeta * wn * s + wn * wn)
            }),
        ),
        // Essential singularity at 0 times an entire function.
        ("exp(1/z)*sin(z)", pointwise(|z| z.inv().exp() * z.sin())),
        // Several transcendental calls per point.
        (
            "sin(z)/(z^3-1) + exp(z)cos(z^2)",
            pointwise(|z| z.sin() / (z * z * z - 1.0) + z.exp() * (z * z).cos()),
        ),
        // ("interpreted lowpass2", interpreted_block("2^2/(z^2+2*0.3*2*z+2^2)")),
    ]
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    let png_dir = args
        .iter()
        .position(|a| a == "--png")
        .and_then(|k| args.get(k + 1).cloned());
    let (width, height) = (800u32, 600u32);
    let view = View {
        x0: -3.0,
        x1: 3.0,
        y0: -2.25,
        y1: 2.25,
    };
    let opts = PlotOptions::default();
    let mpx = f64::from(width * height) / 1e6;
    let mut out = vec![0u8; (width * height * 4) as usize];
    let reps = 5;

    let mut identity = pointwise(|z| z);
    let t = Instant::now();
    for _ in 0..reps {
        render(&mut identity, view, width, height, &opts, &mut out).expect("render");
    }
    let colour_rate = mpx * reps as f64 / t.elapsed().as_secs_f64();
    let plain = PlotOptions {
        modulus_lines: false,
        phase_lines: false,
        ..opts
    };
    let t = Instant::now();
    for _ in 0..reps {
        render(&mut identity, view, width, height, &plain, &mut out).expect("render");
    }
    let plain_rate = mpx * reps as f64 / t.elapsed().as_secs_f64();
    println!("{width}x{height}, {reps} repetitions, lines on");
    println!("colouring only, no lines: {plain_rate:.2} Mpx/s");
    println!(
        "{:<36} {:>12} {:>12} {:>12}",
        "function", "eval Mpx/s", "render Mpx/s", "colour Mpx/s"
    );
    println!(
        "{:<36} {:>12} {:>12.2} {:>12.2}",
        "identity (colouring only)", "-", colour_rate, colour_rate
    );

    for (name, mut block) in cases() {
        // Evaluation alone, same grid.
        let zs: Vec<C> = (0..height)
            .flat_map(|j| {
                (0..width).map(move |i| {
                    C::new(
                        view.x0 + (f64::from(i) + 0.5) * (view.x1 - view.x0) / f64::from(width),
                        view.y1 - (f64::from(j) + 0.5) * (view.y1 - view.y0) / f64::from(height),
                    )
                })
            })
            .collect();
        let mut fs = vec![C::new(0.0, 0.0); zs.len()];
        let t = Instant::now();
        for _ in 0..reps {
            for (zr, fr) in zs.chunks(width as usize).zip(fs.chunks_mut(width as usize)) {
                block(zr, fr);
            }
        }
        let eval_rate = mpx * reps as f64 / t.elapsed().as_secs_f64();
        let t = Instant::now();
        for _ in 0..reps {
            render(&mut block, view, width, height, &opts, &mut out).expect("render");
        }
        let render_rate = mpx * reps as f64 / t.elapsed().as_secs_f64();
        println!("{name:<36} {eval_rate:>12.2} {render_rate:>12.2} {colour_rate:>12.2}");
        if let Some(dir) = &png_dir {
            let png = encode_png_rgba(width, height, &out).expect("png");
            let file: String = name
                .chars()
                .map(|c| if c.is_ascii_alphanumeric() { c } else { '_' })
                .collect();
            std::fs::write(format!("{dir}/{file}.png"), png).expect("write png");
        }
    }
}

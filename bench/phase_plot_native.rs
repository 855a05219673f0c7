//! Benchmark of the phase-plot renderer, native: the interpreted evaluator
//! (`expr::Function::eval_block`) against the same functions hand-written in
//! Rust, for the three functions of bench/cases.rs.
//!
//! Run: `cargo run --release --example phase_plot_native [-- --png DIR]`
//! Prints Mpixel/s (median of repetitions) for evaluation alone, the plain
//! render (colour only, no lines; what bench/phase_plot_numpy.py times) and
//! the full render with lines, and the ratio interpreted/hand-written.
//! `--png DIR` also writes the pictures.

#[path = "cases.rs"]
mod cases;

use cases::{CASES, HEIGHT, VIEW, WIDTH};
use residuary::expr::Function;
use residuary::plot::phase_plot::{render, PlotOptions, View};
use residuary::plot::png_encode::encode_png_rgba;
use residuary::C;
use std::time::Instant;

const REPS: usize = 9;

/// Median wall times in seconds of `REPS` runs of each of `a` and `b`, after
/// one warm-up run each. The runs alternate (a, b, a, b, ...) so that load
/// from other processes on a shared machine falls on both alike.
fn median_pair(a: &mut dyn FnMut(), b: &mut dyn FnMut()) -> (f64, f64) {
    a();
    b();
    let (mut ta, mut tb) = (Vec::new(), Vec::new());
    for _ in 0..REPS {
        let t = Instant::now();
        a();
        ta.push(t.elapsed().as_secs_f64());
        let t = Instant::now();
        b();
        tb.push(t.elapsed().as_secs_f64());
    }
    let median = |mut ts: Vec<f64>| {
        ts.sort_by(f64::total_cmp);
        ts[REPS / 2]
    };
    (median(ta), median(tb))
}

/// Pixel centres of the image, row by row from the top (as the renderer samples).
fn grid(view: View) -> Vec<C> {
    (0..HEIGHT)
        .flat_map(|j| {
            (0..WIDTH).map(move |i| {
                C::new(
                    view.x0 + (f64::from(i) + 0.5) * (view.x1 - view.x0) / f64::from(WIDTH),
                    view.y1 - (f64::from(j) + 0.5) * (view.y1 - view.y0) / f64::from(HEIGHT),
                )
            })
        })
        .collect()
}

/// Mpixel/s of evaluation alone, plain render and full render.
struct Rates {
    eval: f64,
    plain: f64,
    full: f64,
}

type Block<'a> = &'a mut dyn FnMut(&[C], &mut [C]);

/// Rates of two evaluators, measured alternately.
fn measure(a: Block, b: Block, view: View) -> (Rates, Rates) {
    let mpx = f64::from(WIDTH * HEIGHT) / 1e6;
    let zs = grid(view);
    let w = WIDTH as usize;
    let (mut fa, mut fb) = (
        vec![C::new(0.0, 0.0); zs.len()],
        vec![C::new(0.0, 0.0); zs.len()],
    );
    let (mut oa, mut ob) = (vec![0u8; zs.len() * 4], vec![0u8; zs.len() * 4]);
    let (ea, eb) = median_pair(
        &mut || {
            zs.chunks(w)
                .zip(fa.chunks_mut(w))
                .for_each(|(z, f)| a(z, f))
        },
        &mut || {
            zs.chunks(w)
                .zip(fb.chunks_mut(w))
                .for_each(|(z, f)| b(z, f))
        },
    );
    let lines = PlotOptions::default();
    let plain = PlotOptions {
        modulus_lines: false,
        phase_lines: false,
        ..lines
    };
    let mut times = [(0.0, 0.0); 2];
    for (k, opts) in [plain, lines].iter().enumerate() {
        times[k] = median_pair(
            &mut || render(a, view, WIDTH, HEIGHT, opts, &mut oa).expect("render"),
            &mut || render(b, view, WIDTH, HEIGHT, opts, &mut ob).expect("render"),
        );
    }
    (
        Rates {
            eval: mpx / ea,
            plain: mpx / times[0].0,
            full: mpx / times[1].0,
        },
        Rates {
            eval: mpx / eb,
            plain: mpx / times[0].1,
            full: mpx / times[1].1,
        },
    )
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    let png_dir = args
        .iter()
        .position(|a| a == "--png")
        .and_then(|k| args.get(k + 1).cloned());
    let view = View {
        x0: VIEW[0],
        x1: VIEW[1],
        y0: VIEW[2],
        y1: VIEW[3],
    };
    let mut out = vec![0u8; (WIDTH * HEIGHT * 4) as usize];

    println!(
        "native phase plot, {WIDTH}x{HEIGHT} on [{},{}]x[{},{}], median of {REPS} runs, Mpixel/s",
        VIEW[0], VIEW[1], VIEW[2], VIEW[3]
    );
    let mut identity = |zs: &[C], fs: &mut [C]| fs.copy_from_slice(&zs[..fs.len()]);
    let mut identity2 = |zs: &[C], fs: &mut [C]| fs.copy_from_slice(&zs[..fs.len()]);
    let (id, _) = measure(&mut identity, &mut identity2, view);
    println!(
        "colouring alone (f = z): plain {:.2}, with lines {:.2}",
        id.plain, id.full
    );
    println!(
        "{:<10} {:<12} {:>8} {:>8} {:>8}",
        "function", "evaluator", "eval", "plain", "lines"
    );
    for case in CASES.iter() {
        let f = case.handwritten;
        let mut hand = |zs: &[C], fs: &mut [C]| {
            for (o, z) in fs.iter_mut().zip(zs) {
                *o = f(*z);
            }
        };
        let compiled = match Function::compile(case.expr, "z", &[]) {
            Ok(c) => c,
            Err(e) => {
                eprintln!(
                    "{}: cannot compile {:?}: {}",
                    case.name, case.expr, e.message
                );
                std::process::exit(1);
            }
        };
        let mut interp = |zs: &[C], fs: &mut [C]| compiled.eval_block(zs, fs);
        let (it, hw) = measure(&mut interp, &mut hand, view);
        for (who, r) in [("hand", &hw), ("interpreted", &it)] {
            println!(
                "{:<10} {:<12} {:>8.2} {:>8.2} {:>8.2}",
                case.name, who, r.eval, r.plain, r.full
            );
        }
        println!(
            "{:<10} {:<12} {:>8.2} {:>8.2} {:>8.2}",
            case.name,
            "ratio i/h",
            it.eval / hw.eval,
            it.plain / hw.plain,
            it.full / hw.full
        );
        if let Some(dir) = &png_dir {
            render(
                &mut interp,
                view,
                WIDTH,
                HEIGHT,
                &PlotOptions::default(),
                &mut out,
            )
            .expect("render");
            let png = encode_png_rgba(WIDTH, HEIGHT, &out).expect("png");
            std::fs::write(format!("{dir}/{}.png", case.name), png).expect("write png");
        }
    }
}

//! Benchmark exports for node (bench/wasm/run.mjs): render the three
//! functions of bench/cases.rs with residuary's phase-plot renderer, once
//! through the interpreted evaluator and once hand-written in Rust. The
//! caller times each call (wasm32-unknown-unknown has no clock).

#[path = "../../cases.rs"]
mod cases;

use cases::{CASES, HEIGHT, VIEW, WIDTH};
use residuary::expr::Function;
use residuary::plot::phase_plot::{render, PlotOptions, View};
use residuary::C;
use wasm_bindgen::prelude::*;

fn view() -> View {
    View {
        x0: VIEW[0],
        x1: VIEW[1],
        y0: VIEW[2],
        y1: VIEW[3],
    }
}

fn case(index: u32) -> Result<&'static cases::Case, JsError> {
    CASES
        .get(index as usize)
        .ok_or_else(|| JsError::new(&format!("no case {index}: use 0..{}", CASES.len())))
}

fn options(lines: bool) -> PlotOptions {
    PlotOptions {
        modulus_lines: lines,
        phase_lines: lines,
        ..PlotOptions::default()
    }
}

/// Render into a fresh buffer; returns a byte sum so the work cannot be skipped.
fn render_sum(block: &mut dyn FnMut(&[C], &mut [C]), lines: bool) -> Result<u32, JsError> {
    let mut out = vec![0u8; (WIDTH * HEIGHT * 4) as usize];
    render(block, view(), WIDTH, HEIGHT, &options(lines), &mut out)
        .map_err(|e| JsError::new(&e))?;
    Ok(out
        .iter()
        .map(|&b| u32::from(b))
        .fold(0u32, u32::wrapping_add))
}

fn compile(expr: &str) -> Result<Function, JsError> {
    Function::compile(expr, "z", &[]).map_err(|e| JsError::new(&e.message))
}

fn hand_block(index: u32) -> Result<impl FnMut(&[C], &mut [C]), JsError> {
    let f = case(index)?.handwritten;
    Ok(move |zs: &[C], fs: &mut [C]| {
        for (o, z) in fs.iter_mut().zip(zs) {
            *o = f(*z);
        }
    })
}

/// Pixel centres of the image, row by row from the top.
fn grid() -> Vec<C> {
    let v = view();
    (0..HEIGHT)
        .flat_map(|j| {
            (0..WIDTH).map(move |i| {
                C::new(
                    v.x0 + (f64::from(i) + 0.5) * (v.x1 - v.x0) / f64::from(WIDTH),
                    v.y1 - (f64::from(j) + 0.5) * (v.y1 - v.y0) / f64::from(HEIGHT),
                )
            })
        })
        .collect()
}

#[wasm_bindgen]
pub fn case_count() -> u32 {
    CASES.len() as u32
}

#[wasm_bindgen]
pub fn case_name(index: u32) -> Result<String, JsError> {
    Ok(case(index)?.name.to_string())
}

#[wasm_bindgen]
pub fn case_expr(index: u32) -> Result<String, JsError> {
    Ok(case(index)?.expr.to_string())
}

/// Image width × height in pixels.
#[wasm_bindgen]
pub fn pixels() -> u32 {
    WIDTH * HEIGHT
}

/// One render of `expr` (variable z) through the interpreted evaluator.
#[wasm_bindgen]
pub fn render_interpreted(expr: &str, lines: bool) -> Result<u32, JsError> {
    let f = compile(expr)?;
    render_sum(&mut |zs: &[C], fs: &mut [C]| f.eval_block(zs, fs), lines)
}

/// One render of case `index` hand-written in Rust.
#[wasm_bindgen]
pub fn render_handwritten(index: u32, lines: bool) -> Result<u32, JsError> {
    render_sum(&mut hand_block(index)?, lines)
}

/// Evaluation alone on the image grid, interpreted; returns a sum of the values' real parts.
#[wasm_bindgen]
pub fn eval_interpreted(expr: &str) -> Result<f64, JsError> {
    let f = compile(expr)?;
    let zs = grid();
    let mut fs = vec![C::new(0.0, 0.0); zs.len()];
    for (zr, fr) in zs.chunks(WIDTH as usize).zip(fs.chunks_mut(WIDTH as usize)) {
        f.eval_block(zr, fr);
    }
    Ok(fs.iter().map(|v| v.re).filter(|x| x.is_finite()).sum())
}

/// Evaluation alone on the image grid, hand-written.
#[wasm_bindgen]
pub fn eval_handwritten(index: u32) -> Result<f64, JsError> {
    let mut block = hand_block(index)?;
    let zs = grid();
    let mut fs = vec![C::new(0.0, 0.0); zs.len()];
    for (zr, fr) in zs.chunks(WIDTH as usize).zip(fs.chunks_mut(WIDTH as usize)) {
        block(zr, fr);
    }
    Ok(fs.iter().map(|v| v.re).filter(|x| x.is_finite()).sum())
}

/// Largest |interpreted − hand-written| / max(1, |hand-written|) over the grid:
/// shows both evaluators compute the same function.
#[wasm_bindgen]
pub fn max_difference(index: u32) -> Result<f64, JsError> {
    let c = case(index)?;
    let f = compile(c.expr)?;
    let zs = grid();
    let mut fs = vec![C::new(0.0, 0.0); zs.len()];
    f.eval_block(&zs, &mut fs);
    Ok(zs
        .iter()
        .zip(&fs)
        .map(|(&z, &v)| {
            let h = (c.handwritten)(z);
            if h.is_finite() && v.is_finite() {
                (v - h).norm() / h.norm().max(1.0)
            } else {
                0.0
            }
        })
        .fold(0.0, f64::max))
}

//! Times the Aberth–Ehrlich root finder on the polynomials written by
//! bench/roots.py and compares with the numpy.roots timings stored there.
//!
//! Usage: python3 bench/roots.py && cargo run --release --example roots -- [file.json]

use residuary::poly::aberth_ehrlich::roots;
use residuary::poly::{abs_eval, eval, reverse};
use residuary::C;
use std::time::Instant;

/// |p(z)|/Σ|p_k||z|^k, through the reversed polynomial when |z| > 1 so nothing overflows.
fn backward_error(p: &[C], rp: &[C], z: C) -> f64 {
    if z.norm() <= 1.0 {
        eval(p, z).norm() / abs_eval(p, z.norm())
    } else {
        let w = z.inv();
        eval(rp, w).norm() / abs_eval(rp, w.norm())
    }
}

fn main() {
    let path = std::env::args()
        .nth(1)
        .unwrap_or_else(|| "/tmp/residuary_roots_bench.json".into());
    let text = match std::fs::read_to_string(&path) {
        Ok(t) => t,
        Err(e) => {
            eprintln!("cannot read {path}: {e}; run python3 bench/roots.py first");
            std::process::exit(1);
        }
    };
    let data: serde_json::Value = match serde_json::from_str(&text) {
        Ok(d) => d,
        Err(e) => {
            eprintln!("{path} is not valid JSON: {e}");
            std::process::exit(1);
        }
    };
    let empty = Vec::new();
    for case in data["cases"].as_array().unwrap_or(&empty) {
        let p: Vec<C> = case["coeffs"]
            .as_array()
            .unwrap_or(&empty)
            .iter()
            .map(|v| {
                C::new(
                    v[0].as_f64().unwrap_or(f64::NAN),
                    v[1].as_f64().unwrap_or(f64::NAN),
                )
            })
            .collect();
        let rp = reverse(&p);
        let mut best = f64::INFINITY;
        let mut result = None;
        for _ in 0..3 {
            let t0 = Instant::now();
            let r = roots(&p);
            best = best.min(t0.elapsed().as_secs_f64());
            result = Some(r);
        }
        let r = match result {
            Some(Ok(r)) => r,
            Some(Err(e)) => {
                eprintln!("degree {}: {e}", p.len().saturating_sub(1));
                continue;
            }
            None => continue,
        };
        let be = r
            .roots
            .iter()
            .map(|&z| backward_error(&p, &rp, z))
            .fold(0.0, f64::max);
        let np = case["numpy_seconds"].as_f64().unwrap_or(f64::NAN);
        let npbe = case["numpy_backward_error"].as_f64().unwrap_or(f64::NAN);
        println!(
            "degree {:5}: aberth {:9.2} ms ({} sweeps, backward error {:.2e}) | numpy.roots {:9.2} ms (backward error {:.2e}) | speed-up x{:.1}",
            p.len() - 1,
            best * 1e3,
            r.iterations,
            be,
            np * 1e3,
            npbe,
            np / best
        );
    }
}

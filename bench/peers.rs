//! Times residuary (`api::run`, native, release) on the requests bench/peers.py
//! wrote and prints the ratio residuary ÷ peer for each (below 1: residuary is
//! faster), with the difference from the peer's value where there is one.
//!
//! Usage: python3 bench/peers.py && cargo run --release --example peers -- [file.json]

use residuary::api::{self, Request};
use serde_json::Value;
use std::time::Instant;

const REPS: usize = 21;

fn main() {
    let path = std::env::args().nth(1).unwrap_or_else(|| "/tmp/residuary_peers_bench.json".into());
    let data: Value = match std::fs::read_to_string(&path).map(|t| serde_json::from_str(&t)) {
        Ok(Ok(d)) => d,
        _ => {
            eprintln!("cannot read {path}; run python3 bench/peers.py first");
            std::process::exit(1);
        }
    };
    println!(
        "residuary (api::run, native) vs peers (scipy {}, numpy {}, mpmath {}); median of {REPS} runs",
        data["scipy"], data["numpy"], data["mpmath"]
    );
    println!("{:<18} {:<62} {:>11} {:>11} {:>10}  value difference", "task", "case", "residuary", "peer", "ratio");
    let empty = Vec::new();
    for case in data["cases"].as_array().unwrap_or(&empty) {
        let run = || Request::from_json(case["request"].clone()).and_then(api::run);
        let answer = match run() {
            Ok(r) => serde_json::to_value(r).unwrap_or(Value::Null),
            Err(e) => {
                eprintln!("{}: {}", case["label"], e.message);
                std::process::exit(1);
            }
        };
        let mut times: Vec<f64> = (0..REPS)
            .map(|_| {
                let t = Instant::now();
                let _ = run();
                t.elapsed().as_secs_f64()
            })
            .collect();
        times.sort_by(f64::total_cmp);
        let ours = times[REPS / 2];
        let peer = case["peer_seconds"].as_f64().unwrap_or(f64::NAN);
        let difference = match (case["value_key"].as_str(), case["index"].as_u64()) {
            (Some(key), Some(i)) => {
                let got = answer[key][i as usize].as_f64().unwrap_or(f64::NAN);
                let want = case["peer_value"][0].as_f64().unwrap_or(f64::NAN);
                format!("{:.1e} at the last index", (got - want).abs())
            }
            _ => match case["request"]["task"].as_str() {
                Some("contour_integral") => {
                    let v = &answer["value"];
                    let (re, im) = (v[0].as_f64().unwrap_or(f64::NAN), v[1].as_f64().unwrap_or(f64::NAN));
                    let w = &case["peer_value"];
                    let d = (re - w[0].as_f64().unwrap_or(f64::NAN)).hypot(im - w[1].as_f64().unwrap_or(f64::NAN));
                    format!("{d:.1e}")
                }
                _ => "-".into(),
            },
        };
        println!(
            "{:<18} {:<62} {:>8.3} ms {:>8.3} ms {:>10.2}  {difference}",
            case["task"].as_str().unwrap_or(""),
            case["label"].as_str().unwrap_or(""),
            ours * 1e3,
            peer * 1e3,
            ours / peer
        );
    }
}

//! A seeded in-process fuzzer over the doorway (`residuary::api::run_json_text`).
//!
//! Random expressions from the grammar of the expression language and random,
//! often mutated, requests for every task go through the doorway; each answer
//! is checked (check.rs): no panic, done within a time limit, no `NaN`, `inf`
//! or `Infinity` written in any string, every error with a code of the
//! contract and a message. What it finds becomes a fixed request in
//! regressions.rs.
//!
//! Knobs (environment):
//! - `RESIDUARY_FUZZ_CASES`: how many requests (default 22 000, two thousand per task);
//! - `RESIDUARY_FUZZ_SEED`: the seed (default 8; the run prints it);
//! - `RESIDUARY_FUZZ_SLOW_MS`: the time one request with a small budget may
//!   take (default 1 000 ms), ×3 that at the default budget, proportionally
//!   more for a larger one;
//! - `RESIDUARY_FUZZ_HANG_S`: the watchdog that stops the run (default 60 s).
//!
//! The long run (DEVELOPERS.md): `RESIDUARY_FUZZ_CASES=1000000 cargo test --release --test fuzz`.

mod check;
mod gen;
mod regressions;

use residuary::api::TASKS;
use residuary::budget::DEFAULT_EVALUATIONS;
use std::sync::{Arc, Mutex};
use std::time::{Duration, Instant};

fn env_u64(name: &str, default: u64) -> u64 {
    std::env::var(name).ok().and_then(|s| s.trim().parse().ok()).unwrap_or(default)
}

/// The time a request may take: small budgets must be fast; the default
/// budget (or a task without one) gets three times as long, a larger budget
/// proportionally more.
pub fn limit_for(request: &str) -> Duration {
    let small = env_u64("RESIDUARY_FUZZ_SLOW_MS", 1_000);
    let asked = serde_json::from_str::<serde_json::Value>(request)
        .ok()
        .and_then(|v| v.get("max_evaluations").and_then(|n| n.as_u64()));
    match asked {
        Some(n) if n <= 100_000 => Duration::from_millis(small),
        // A budget above the default buys proportionally more time (1e9 is 50 times the default).
        Some(n) if n > DEFAULT_EVALUATIONS => {
            Duration::from_millis(3 * small).mul_f64(n.min(1_000_000_000) as f64 / DEFAULT_EVALUATIONS as f64)
        }
        _ => Duration::from_millis(3 * small),
    }
}

/// A watchdog: if one request runs past `hard`, print it and stop the whole
/// run (a hang cannot be interrupted in-process).
fn watchdog(current: Arc<Mutex<Option<(Instant, String)>>>, hard: Duration) {
    std::thread::spawn(move || loop {
        std::thread::sleep(Duration::from_millis(500));
        let guard = current.lock().unwrap_or_else(|e| e.into_inner());
        if let Some((start, req)) = guard.as_ref() {
            if start.elapsed() > hard {
                eprintln!("fuzz: HANG (> {} s) on request:\n{req}", hard.as_secs());
                std::process::exit(101);
            }
        }
    });
}

#[test]
fn random_requests_through_the_doorway() {
    let cases = env_u64("RESIDUARY_FUZZ_CASES", 22_000);
    let seed = env_u64("RESIDUARY_FUZZ_SEED", 8);
    let current = Arc::new(Mutex::new(None));
    watchdog(current.clone(), Duration::from_secs(env_u64("RESIDUARY_FUZZ_HANG_S", 60)));
    let mut rng = gen::Rng::new(seed);
    let mut findings: Vec<(String, String)> = Vec::new();
    let mut per_task = vec![(0u64, Duration::ZERO, Duration::ZERO); TASKS.len()];
    let started = Instant::now();
    for case in 0..cases {
        let k = (case % TASKS.len() as u64) as usize;
        let task = TASKS[k];
        let request = gen::request(&mut rng, task);
        let text = if rng.chance(0.3) { gen::mutate(&mut rng, request) } else { request.to_string() };
        *current.lock().unwrap() = Some((Instant::now(), text.clone()));
        let out = check::run(&text, limit_for(&text));
        *current.lock().unwrap() = None;
        let t = &mut per_task[k];
        t.0 += 1;
        t.1 += out.elapsed;
        t.2 = t.2.max(out.elapsed);
        for p in out.problems {
            findings.push((p, text.clone()));
        }
    }
    eprintln!("fuzz: {cases} requests, seed {seed}, {:.1} s", started.elapsed().as_secs_f64());
    for (k, (n, total, worst)) in per_task.iter().enumerate() {
        if *n > 0 {
            eprintln!(
                "  {:<18} {:>7} requests, mean {:>8.3} ms, worst {:>8.1} ms",
                TASKS[k],
                n,
                total.as_secs_f64() * 1e3 / *n as f64,
                worst.as_secs_f64() * 1e3
            );
        }
    }
    if !findings.is_empty() {
        // One line per distinct problem (its first 60 characters), with one request that shows it.
        let mut seen = std::collections::BTreeMap::new();
        for (p, r) in &findings {
            let key: String = p.chars().take(60).collect();
            seen.entry(key).or_insert_with(|| (p.clone(), r.clone(), 0)).2 += 1;
        }
        let mut report = format!("{} findings ({} distinct), seed {seed}:\n", findings.len(), seen.len());
        for (p, r, n) in seen.values() {
            report.push_str(&format!("- {p} (×{n})\n  {r}\n"));
        }
        panic!("{report}");
    }
}

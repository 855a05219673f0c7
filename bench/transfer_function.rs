//! `transfer_function` (default grids) and `pole_trails` (60 steps) on a degree-10 rational function,
//! natively through the doorway: median of 31 runs, in ms. The page redraws every view while a pole is
//! dragged and needs each frame within 50 ms.
//!
//! cargo run --release --example transfer_function

use std::time::Instant;

fn median_ms(mut run: impl FnMut()) -> f64 {
    let mut t: Vec<f64> = (0..31)
        .map(|_| {
            let s = Instant::now();
            run();
            s.elapsed().as_secs_f64() * 1e3
        })
        .collect();
    t.sort_by(f64::total_cmp);
    t[t.len() / 2]
}

fn main() {
    // Five resonances (ωn 0.5 … 10, ζ 0.1 … 0.5) over a degree-4 numerator: degree 10, all poles stable.
    let den = "(s^2+0.1*s+0.25)*(s^2+0.4*s+1)*(s^2+1.2*s+4)*(s^2+4*s+25)*(s^2+10*s+100)";
    let cases = [
        ("s, typed as factors", format!("k*(s+0.3)*(s+3)*(s^2+s+9)/({den})"), "s"),
        (
            "s, expanded coefficients",
            // The same denominator expanded (numpy 2.4 poly of the roots).
            "k*(s^4+4.3*s^3+13.2*s^2+30.6*s+8.1)/(s^10+15.7*s^9+194.69*s^8+1016.708*s^7+4634.972*s^6+\
             8777.12*s^5+18109.85*s^4+13238*s^3+15005*s^2+3400*s+2500)"
                .to_string(),
            "s",
        ),
        ("z, ten poles inside the circle", "k/((z-0.5)*(z+0.3)*(z^2-1.2*z+0.72)*(z^2+0.5*z+0.5)*(z^2-0.1*z+0.8)*(z^2+1.4*z+0.6))".into(), "z"),
    ];
    for (what, f, var) in &cases {
        let tf = serde_json::json!({"task": "transfer_function", "f": f, "var": var, "params": {"k": 50}}).to_string();
        let (out, err) = residuary::api::run_json_text(&tf);
        assert!(!err, "{out}");
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        let points: usize = v["image"]["segments"].as_array().unwrap().iter().map(|s| s["value"].as_array().unwrap().len()).sum();
        let ms = median_ms(|| {
            residuary::api::run_json_text(&tf);
        });
        println!(
            "transfer_function, {what}: {ms:.2} ms (grid {} points, image {points} points, step {} samples)",
            v["frequency_response"]["omega"].as_array().unwrap().len(),
            v["step"]["t"].as_array().unwrap().len()
        );
        let trails = serde_json::json!({"task": "pole_trails", "f": f, "var": var,
            "sweep": {"name": "k", "from": 0.1, "to": 100, "steps": 60, "scale": "log"}})
        .to_string();
        let (out, err) = residuary::api::run_json_text(&trails);
        assert!(!err, "{out}");
        let ms = median_ms(|| {
            residuary::api::run_json_text(&trails);
        });
        println!("pole_trails (60 steps), {what}: {ms:.2} ms");
    }
}

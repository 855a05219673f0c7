//! Benchmark of the `singularities` task through `residuary::api::run`:
//! time for a degree-100 rational function, and measured residue accuracy
//! against the mpmath fixtures (tests/fixtures/rational.json and
//! meromorphic.json, mpmath 1.3.0 at 40 digits) and closed forms.
//!
//! Run: `cargo run --release --example singularities`
//! The targets: degree 100 well under 10 ms native; residues of
//! simple poles of rational functions ≤ 1e-12 relative, poles of order ≤ 4
//! ≤ 1e-9, general meromorphic functions ≤ 1e-10.

use residuary::api::{self, Request, Response, SingularitiesResponse};
use residuary::C;
use serde_json::{json, Value};
use std::f64::consts::PI;
use std::time::Instant;

const REPS: usize = 21;
const DEGREE: usize = 100;

/// Runs one `singularities` request; exits with the message on failure.
fn singularities(f: &str, region: Value) -> SingularitiesResponse {
    let request = json!({"task": "singularities", "f": f, "region": region});
    let answer = Request::from_json(request).and_then(api::run);
    match answer {
        Ok(Response::Singularities(r)) => r,
        Ok(_) => fail(f, "unexpected response kind"),
        Err(e) => fail(f, &e.message),
    }
}

fn fail(f: &str, why: &str) -> ! {
    let short: String = f.chars().take(80).collect();
    eprintln!("singularities of {short}...: {why}");
    std::process::exit(1)
}

fn c(v: [f64; 2]) -> C {
    C::new(v[0], v[1])
}

/// A complex number as expression text, e.g. `(0.5 + -0.25*i)`.
fn literal(z: C) -> String {
    format!("({} + {}*i)", z.re, z.im)
}

/// Polynomial with ascending coefficients as expression text.
fn poly_text(coeffs: &[C]) -> String {
    let terms: Vec<String> = coeffs
        .iter()
        .enumerate()
        .filter(|(_, a)| a.norm() != 0.0)
        .map(|(k, a)| format!("{}*z^{k}", literal(*a)))
        .collect();
    if terms.is_empty() {
        "0".into()
    } else {
        terms.join(" + ")
    }
}

fn median_ms(mut work: impl FnMut()) -> f64 {
    work();
    let mut times: Vec<f64> = (0..REPS)
        .map(|_| {
            let t = Instant::now();
            work();
            t.elapsed().as_secs_f64() * 1e3
        })
        .collect();
    times.sort_by(f64::total_cmp);
    times[REPS / 2]
}

/// Known poles and residues of a test function, when there is a closed form.
type Known = Option<(Vec<C>, Vec<C>)>;

/// Times one degree-100 function and compares its poles and residues with
/// the closed form when there is one.
fn bench_one(label: &str, f: &str, known: Known) {
    let region = json!({"shape": "circle", "center": [0, 0], "radius": 2});
    let ms = median_ms(|| {
        singularities(f, region.clone());
    });
    let r = singularities(f, region);
    let mut line = format!(
        "  {label:<44} {ms:7.2} ms  {} poles, {} zeros; residue-sum defect {:.1e}",
        r.poles.len(),
        r.zeros.len(),
        r.residue_sum_defect.unwrap_or(f64::NAN)
    );
    if let Some((poles, residues)) = known {
        let (mut loc, mut res, mut est) = (0.0f64, 0.0f64, 0.0f64);
        for (&p, &w) in poles.iter().zip(&residues) {
            let got = r
                .poles
                .iter()
                .min_by(|a, b| (c(a.at) - p).norm().total_cmp(&(c(b.at) - p).norm()));
            let Some(got) = got else {
                fail(f, "no poles found")
            };
            loc = loc.max((c(got.at) - p).norm() / p.norm());
            let g = got.residue.map_or(C::new(f64::NAN, 0.0), c);
            res = res.max((g - w).norm() / w.norm());
            est = est.max(got.error_estimate.unwrap_or(f64::NAN) / w.norm());
        }
        line += &format!(
            "; vs closed form: max relative pole error {loc:.1e}, residue error {res:.1e} (largest reported estimate {est:.1e})"
        );
    }
    println!("{line}");
}

/// Degree-100 rational functions: a feedback comb filter (known poles and
/// residues), a dense denominator with pseudo-random coefficients, and a
/// bank of resonances entered as a product of 100 factors.
fn bench_degree_100() {
    println!("singularities of degree-{DEGREE} rational functions through api::run, region |z| < 2, median of {REPS} runs");
    // Feedback comb filter H(z) = z^N/(z^N − a): poles p_k = a^(1/N) e^(2πik/N),
    // residue a/(N p_k^(N−1)) = p_k/N (simple pole of a ratio: common practice).
    let a = 0.5f64;
    let comb: Vec<C> = (0..DEGREE)
        .map(|k| {
            C::from_polar(
                a.powf(1.0 / DEGREE as f64),
                2.0 * PI * k as f64 / DEGREE as f64,
            )
        })
        .collect();
    let comb_res = comb.iter().map(|&p| p / DEGREE as f64).collect();
    bench_one(
        "comb filter z^100/(z^100 - 0.5)",
        &format!("z^{DEGREE}/(z^{DEGREE} - {a})"),
        Some((comb, comb_res)),
    );
    // Dense denominator, coefficients uniform in [-1, 1]² from a fixed xorshift sequence.
    let mut state = 0x9e37_79b9_7f4a_7c15u64;
    let mut uniform = || {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        (state >> 11) as f64 / (1u64 << 52) as f64 - 1.0
    };
    let dense: Vec<C> = (0..=DEGREE).map(|_| C::new(uniform(), uniform())).collect();
    bench_one(
        "1/(dense degree-100 polynomial)",
        &format!("1/({})", poly_text(&dense)),
        None,
    );
    // 100 damped resonances on a wavy ring (radius 0.85..0.95) over z² + 1/4,
    // entered as a product. Expanded into coefficients, its roots are
    // ill-conditioned (a relative change of 1e-16 in the coefficients moves
    // them by ~0.3): this line shows what happens to such input.
    let ring: Vec<C> = (0..DEGREE)
        .map(|k| {
            let theta = 2.0 * PI * (k as f64 + 0.5) / DEGREE as f64;
            C::from_polar(0.9 + 0.05 * (3.0 * k as f64).sin(), theta)
        })
        .collect();
    let ring_res = (0..DEGREE)
        .map(|k| {
            let d: C = (0..DEGREE)
                .filter(|&j| j != k)
                .map(|j| ring[k] - ring[j])
                .product();
            (ring[k] * ring[k] + 0.25) / d
        })
        .collect();
    let factors: Vec<String> = ring
        .iter()
        .map(|&p| format!("(z - {})", literal(p)))
        .collect();
    bench_one(
        "resonance bank, product of 100 factors",
        &format!("(z^2 + 0.25)/({})", factors.join("*")),
        Some((ring, ring_res)),
    );
}

/// Reads a number written as a decimal string or a JSON number.
fn number(v: &Value) -> f64 {
    match v {
        Value::String(s) => s.parse().unwrap_or(f64::NAN),
        other => other.as_f64().unwrap_or(f64::NAN),
    }
}

fn complex(v: &Value) -> C {
    C::new(number(&v[0]), number(&v[1]))
}

fn fixture(name: &str) -> Value {
    let path = format!("{}/tests/fixtures/{name}", env!("CARGO_MANIFEST_DIR"));
    let text = std::fs::read_to_string(&path).unwrap_or_else(|e| fail(&path, &e.to_string()));
    serde_json::from_str(&text).unwrap_or_else(|e| fail(&path, &e.to_string()))
}

/// Largest error and where it was.
#[derive(Default)]
struct Worst {
    /// Relative to the coefficient itself (residue) or to the pole's largest
    /// principal-part coefficient.
    error: f64,
    case: String,
    /// Relative to the largest principal-part coefficient of the whole
    /// function, as tests/rational_residues.rs measures.
    scaled: f64,
    count: usize,
    /// Poles whose reported residue error estimate is below the true residue error.
    uncovered: usize,
    /// Every relative error, to count those above the target.
    all: Vec<f64>,
}

impl Worst {
    fn add(&mut self, error: f64, scaled: f64, covered: Option<bool>, case: &str) {
        self.count += 1;
        self.all.push(error);
        // NaN (a missing value) counts as the worst.
        if error.is_nan() || error > self.error {
            self.error = error;
            self.case = case.to_string();
        }
        if scaled.is_nan() || scaled > self.scaled {
            self.scaled = scaled;
        }
        if covered == Some(false) {
            self.uncovered += 1;
        }
    }

    fn print(&self, what: &str, target: f64, scaled: bool) {
        let also = if scaled {
            format!(
                " ({:.1e} relative to the function's largest coefficient)",
                self.scaled
            )
        } else {
            String::new()
        };
        let above = self.all.iter().filter(|&&e| e.is_nan() || e > target).count();
        println!(
            "  {what:<46} {:3} poles: max relative error {:.1e}{also}, worst in \"{}\"; {above} above the target {target:.0e}; residue error estimate below the true error for {}",
            self.count, self.error, self.case, self.uncovered
        );
    }
}

/// Rational fixtures: residues of simple poles, principal parts of poles of order 2..4.
fn accuracy_rational() -> (Worst, Worst) {
    let fx = fixture("rational.json");
    let (mut simple, mut higher) = (Worst::default(), Worst::default());
    let empty = Vec::new();
    for case in fx["rational"].as_array().unwrap_or(&empty) {
        let name = case["name"].as_str().unwrap_or("?");
        let list = |key: &str| -> Vec<C> {
            case[key]
                .as_array()
                .unwrap_or(&empty)
                .iter()
                .map(complex)
                .collect()
        };
        let f = format!(
            "({})/({})",
            poly_text(&list("num")),
            poly_text(&list("den"))
        );
        let want = case["poles"].as_array().unwrap_or(&empty);
        let parts: Vec<Vec<C>> = want
            .iter()
            .map(|p| {
                p["principal_part"]
                    .as_array()
                    .unwrap_or(&empty)
                    .iter()
                    .map(complex)
                    .collect()
            })
            .collect();
        let case_scale = parts.iter().flatten().map(|w| w.norm()).fold(0.0, f64::max);
        let reach = want
            .iter()
            .map(|p| complex(&p["at"]).norm())
            .fold(0.0, f64::max);
        let region = json!({"shape": "circle", "center": [0, 0], "radius": 1.0 + 2.0 * reach});
        let r = singularities(&f, region);
        for (wp, pp) in want.iter().zip(&parts) {
            let at = complex(&wp["at"]);
            let order = wp["order"].as_u64().unwrap_or(0);
            let worst = if order == 1 { &mut simple } else { &mut higher };
            let got = r
                .poles
                .iter()
                .filter(|p| u64::from(p.order) == order)
                .min_by(|a, b| (c(a.at) - at).norm().total_cmp(&(c(b.at) - at).norm()));
            let Some(got) = got else {
                worst.add(f64::NAN, f64::NAN, None, name);
                continue;
            };
            // Largest coefficient error; NaN when one is missing.
            let err = pp
                .iter()
                .enumerate()
                .map(|(k, w)| {
                    got.principal_part
                        .get(k)
                        .map_or(f64::NAN, |&g| (c(g) - w).norm())
                })
                .fold(0.0f64, |m, e| {
                    if e.is_nan() || m.is_nan() {
                        f64::NAN
                    } else {
                        m.max(e)
                    }
                });
            let pole_scale = pp.iter().map(|w| w.norm()).fold(0.0, f64::max);
            let res = got.residue.map_or(C::new(f64::NAN, 0.0), c);
            let covered = got.error_estimate.map(|e| (res - pp[0]).norm() <= e);
            worst.add(err / pole_scale, err / case_scale, covered, name);
        }
    }
    (simple, higher)
}

/// General meromorphic functions (sampling methods) against meromorphic.json.
fn accuracy_meromorphic() -> Worst {
    let fx = fixture("meromorphic.json");
    let cases = &fx["cases"];
    let rect = |a: [f64; 2], b: [f64; 2]| json!({"shape": "rectangle", "corners": [a, b]});
    let res = &cases["resonator"];
    let (w, zeta, tau) = (
        number(&res["omega"]),
        number(&res["zeta"]),
        number(&res["tau"]),
    );
    let resonator = format!("exp(-{tau}*z)/(z^2 + {}*z + {})", 2.0 * zeta * w, w * w);
    let runs: Vec<(String, Value, Value)> = vec![
        (
            "1/sin(z)".into(),
            json!({"shape": "circle", "center": [0, 0], "radius": 4}),
            cases["csc"].clone(),
        ),
        (
            "tan(z)".into(),
            json!({"shape": "ellipse", "center": [0, 0], "semi_axes": [5, 1]}),
            cases["tan"].clone(),
        ),
        (
            "1/(exp(z) - 1)".into(),
            rect([-1.0, -8.0], [1.0, 8.0]),
            cases["bose"].clone(),
        ),
        (
            resonator,
            rect([-2.0, -3.0], [1.0, 3.0]),
            res["poles"].clone(),
        ),
        (
            "gamma(z)".into(),
            rect([-5.5, -1.0], [0.5, 1.0]),
            cases["gamma"].clone(),
        ),
        (
            "exp(z)/sin(z)^2".into(),
            json!({"shape": "circle", "center": [0, 0], "radius": 1}),
            json!([cases["exp_csc2"].clone()]),
        ),
    ];
    let mut worst = Worst::default();
    let empty = Vec::new();
    for (f, region, want) in runs {
        let r = singularities(&f, region);
        for wp in want.as_array().unwrap_or(&empty) {
            let at = complex(&wp["at"]);
            let want_res = complex(&wp["residue"]);
            let got = r
                .poles
                .iter()
                .min_by(|a, b| (c(a.at) - at).norm().total_cmp(&(c(b.at) - at).norm()));
            match got {
                Some(p) if (c(p.at) - at).norm() < 1e-6 * (1.0 + at.norm()) => {
                    let res = p.residue.map_or(C::new(f64::NAN, 0.0), c);
                    let err = (res - want_res).norm();
                    let covered = p.error_estimate.map(|e| err <= e);
                    worst.add(err / want_res.norm(), f64::NAN, covered, &f);
                }
                _ => worst.add(f64::NAN, f64::NAN, None, &f),
            }
        }
    }
    worst
}

fn main() {
    bench_degree_100();
    println!(
        "residue accuracy through api::run vs mpmath 1.3.0 (40 digits) fixtures in tests/fixtures/"
    );
    let (simple, higher) = accuracy_rational();
    simple.print("rational, simple poles (residue)", 1e-12, true);
    higher.print("rational, poles of order 2..4 (principal part)", 1e-9, true);
    let t = Instant::now();
    let mero = accuracy_meromorphic();
    let ms = t.elapsed().as_secs_f64() * 1e3;
    mero.print("general meromorphic (residue)", 1e-10, false);
    println!("  (the six general meromorphic cases took {ms:.0} ms in all)");
}

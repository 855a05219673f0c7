//! The generators: a small seeded PRNG, random expressions from the grammar
//! of the expression language, and random requests for every task, some of
//! them mutated (fields dropped, duplicated or retyped, extreme numbers,
//! empty or long arrays, degenerate contours).

use serde_json::{json, Map, Value};

/// SplitMix64 (Steele, Lea & Flood, "Fast splittable pseudorandom number
/// generators", OOPSLA 2014): one 64-bit state, good enough to pick cases.
pub struct Rng(u64);

impl Rng {
    pub fn new(seed: u64) -> Self {
        Rng(seed)
    }
    pub fn next_u64(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }
    /// Uniform in `0..n` (n > 0).
    pub fn below(&mut self, n: u64) -> u64 {
        self.next_u64() % n
    }
    pub fn unit(&mut self) -> f64 {
        (self.next_u64() >> 11) as f64 / (1u64 << 53) as f64
    }
    pub fn chance(&mut self, p: f64) -> bool {
        self.unit() < p
    }
    pub fn pick<'a, T>(&mut self, xs: &'a [T]) -> &'a T {
        &xs[self.below(xs.len() as u64) as usize]
    }
    pub fn range(&mut self, lo: f64, hi: f64) -> f64 {
        lo + (hi - lo) * self.unit()
    }
}

/// The functions the parser knows (src/expr/functions.rs).
const FUNCTIONS: &[&str] = &[
    "exp", "log", "ln", "sqrt", "sin", "cos", "tan", "cot", "sec", "csc", "sinh", "cosh", "tanh", "coth", "asin",
    "acos", "atan", "gamma",
];

/// Numbers as they are written in expressions, plain and extreme.
fn number_text(rng: &mut Rng) -> String {
    match rng.below(10) {
        0 => rng.pick(&["1e-300", "1e300", "1e-12", "1e12", "0", "0.0", "1e-320", "1e308"]).to_string(),
        1 => format!("{}", rng.below(1000)),
        2 => format!("{:.3}", rng.range(0.0, 10.0)),
        3 => format!("{}e{}", 1 + rng.below(9), rng.below(40) as i64 - 20),
        _ => format!("{}", 1 + rng.below(5)),
    }
}

/// A random expression of nesting depth at most `depth` in `var` and `params`.
pub fn expression(rng: &mut Rng, depth: u32, var: &str, params: &[&str]) -> String {
    if depth == 0 || rng.chance(0.3) {
        return match rng.below(10) {
            0..=4 => var.to_string(),
            5 | 6 => number_text(rng),
            7 if !params.is_empty() => rng.pick(params).to_string(),
            7 | 8 => rng.pick(&["i", "pi", "e"]).to_string(),
            _ => format!("({var}-{})", number_text(rng)),
        };
    }
    let d = depth - 1;
    match rng.below(12) {
        0 | 1 => format!("({}+{})", expression(rng, d, var, params), expression(rng, d, var, params)),
        2 => format!("({}-{})", expression(rng, d, var, params), expression(rng, d, var, params)),
        3 | 4 => format!("{}*{}", expression(rng, d, var, params), expression(rng, d, var, params)),
        5 | 6 => format!("{}/({})", expression(rng, d, var, params), expression(rng, d, var, params)),
        7 => {
            let k = rng.pick(&["2", "3", "-1", "-2", "0.5", "1/3", "10", "100", "-7"]).to_string();
            format!("({})^{k}", expression(rng, d, var, params))
        }
        8 => format!("({})^({})", expression(rng, d, var, params), expression(rng, d, var, params)),
        9 => format!("-{}", expression(rng, d, var, params)),
        _ => format!("{}({})", rng.pick(FUNCTIONS), expression(rng, d, var, params)),
    }
}

/// A rational expression: a product of (var − a)^k over another, times a constant.
fn rational(rng: &mut Rng, var: &str) -> String {
    let factor = |rng: &mut Rng| {
        let a = format!("{}", rng.below(7) as i64 - 3);
        let b = if rng.chance(0.5) { format!("+{}*i", rng.below(4)) } else { String::new() };
        let k = 1 + rng.below(3);
        format!("({var}-({a}{b}))^{k}")
    };
    let num: Vec<String> = (0..rng.below(3)).map(|_| factor(rng)).collect();
    let den: Vec<String> = (0..1 + rng.below(4)).map(|_| factor(rng)).collect();
    let num = if num.is_empty() { number_text(rng) } else { num.join("*") };
    format!("{num}/({})", den.join("*"))
}

/// A real number for a request field: ordinary mostly, sometimes extreme.
pub fn real(rng: &mut Rng) -> f64 {
    match rng.below(12) {
        0 => *rng.pick(&[1e300, -1e300, 1e-300, -1e-300, 5e-324, 0.0, -0.0, 1.7976931348623157e308, 1e16]),
        1 => rng.range(-1e6, 1e6),
        _ => (rng.range(-5.0, 5.0) * 8.0).round() / 8.0,
    }
}

fn complex(rng: &mut Rng) -> Value {
    if rng.chance(0.3) {
        json!(real(rng))
    } else {
        json!([real(rng), real(rng)])
    }
}

fn positive(rng: &mut Rng) -> f64 {
    match rng.below(10) {
        0 => *rng.pick(&[0.0, -1.0, 1e-300, 1e300, 1e-9, 1e9]),
        _ => rng.range(0.1, 6.0),
    }
}

/// A contour, often ordinary, sometimes degenerate.
pub fn contour(rng: &mut Rng) -> Value {
    let c = |rng: &mut Rng| json!([real(rng), real(rng)]);
    match rng.below(10) {
        0 | 1 | 2 => json!({"shape": "circle", "center": c(rng), "radius": positive(rng)}),
        8 => {
            let side = *rng.pick(&["upper", "lower", "left", "right"]);
            json!({"shape": "half_disc", "center": c(rng), "radius": positive(rng), "direction": side})
        }
        9 => {
            let (a, b) = (positive(rng), positive(rng));
            let mut k = json!({"shape": "keyhole", "center": c(rng), "inner": a.min(b), "outer": a.max(b), "angle": real(rng)});
            if rng.chance(0.5) {
                k["gap"] = json!(positive(rng) * 0.01);
            }
            k
        }
        3 => json!({"shape": "ellipse", "center": c(rng), "semi_axes": [positive(rng), positive(rng)], "angle": real(rng)}),
        4 | 5 => {
            if rng.chance(0.2) {
                let p = c(rng);
                json!({"shape": "rectangle", "corners": [p, p]})
            } else {
                json!({"shape": "rectangle", "corners": [c(rng), c(rng)]})
            }
        }
        _ => {
            let n = match rng.below(10) {
                0 => rng.below(3),
                1 => 200 + rng.below(2000),
                _ => 3 + rng.below(8),
            };
            let r = positive(rng).abs().max(1e-3);
            let mut vs: Vec<Value> = (0..n)
                .map(|k| {
                    let t = std::f64::consts::TAU * k as f64 / n as f64;
                    let wob = if rng.chance(0.2) { rng.range(0.2, 1.8) } else { 1.0 };
                    json!([r * wob * t.cos(), r * wob * t.sin()])
                })
                .collect();
            if n > 1 && rng.chance(0.2) {
                let v = vs[0].clone();
                vs.push(v); // a repeated vertex
            }
            if n > 3 && rng.chance(0.1) {
                vs.swap(1, 2); // self-intersecting
            }
            json!({"shape": "polygon", "vertices": vs})
        }
    }
}

/// Which budget a generated request asks for: small almost always, so the
/// run stays short; the default sometimes.
pub fn budget(rng: &mut Rng) -> Option<u64> {
    match rng.below(100) {
        0..=2 => None,
        3..=6 => Some(0),
        _ => Some(*rng.pick(&[1_000, 2_000, 5_000, 10_000, 30_000])),
    }
}

/// One random request for `task` (no mutation yet).
pub fn request(rng: &mut Rng, task: &str) -> Value {
    let (var, default_var) = match task {
        "inverse_laplace" => ("s", "s"),
        "transfer_function" if rng.chance(0.7) => ("s", "s"),
        "pole_trails" => ("s", "s"),
        _ => ("z", "z"),
    };
    let custom_var = rng.chance(0.05);
    let var = if custom_var { "w" } else { var };
    let params: Vec<&str> = if rng.chance(0.2) { vec!["a", "b"] } else { vec![] };
    let depth = 1 + rng.below(6) as u32;
    let f = if rng.chance(0.35) || (task == "partial_fractions" || task == "transfer_function") && rng.chance(0.7) {
        rational(rng, var)
    } else {
        expression(rng, depth, var, &params)
    };
    let mut m = Map::new();
    m.insert("task".into(), json!(task));
    let key = match task {
        "inverse_laplace" => "F",
        "inverse_z" => "X",
        _ => "f",
    };
    m.insert(key.into(), json!(f));
    if custom_var {
        m.insert("var".into(), json!(var));
    } else if rng.chance(0.05) {
        m.insert("var".into(), json!(default_var));
    }
    if !params.is_empty() {
        m.insert("params".into(), json!({"a": complex(rng), "b": complex(rng)}));
    }
    let b = budget(rng);
    let put_budget = |m: &mut Map<String, Value>| {
        if let Some(n) = b {
            m.insert("max_evaluations".into(), json!(n));
        }
    };
    match task {
        "evaluate" => {
            let n = if rng.chance(0.05) { rng.below(2000) } else { rng.below(8) };
            m.insert("at".into(), Value::Array((0..n).map(|_| complex(rng)).collect()));
            put_budget(&mut m);
        }
        "phase_plot" => {
            let (x0, y0) = (real(rng), real(rng));
            let view = json!([x0, x0 + positive(rng), y0, y0 + positive(rng)]);
            m.insert("view".into(), view);
            let (w, h) = (rng.below(24), rng.below(24));
            m.insert("size".into(), json!([w, h]));
            if rng.chance(0.5) {
                m.insert(
                    "options".into(),
                    json!({"wheel": rng.pick(&["oklch", "hsv"]), "modulus_lines": rng.chance(0.5),
                           "phase_lines": rng.chance(0.5), "infinity": rng.chance(0.3)}),
                );
            }
            if rng.chance(0.5) {
                m.insert("format".into(), json!(rng.pick(&["png", "rgba"])));
            }
            if rng.chance(0.3) {
                let a = rng.below(h + 2);
                m.insert("rows".into(), json!([a, a + rng.below(h + 2)]));
            }
            put_budget(&mut m);
        }
        "residue" => {
            let at = if rng.chance(0.2) { json!("infinity") } else { json!([real(rng), real(rng)]) };
            m.insert("at".into(), at);
        }
        "singularities" => {
            m.insert("region".into(), contour(rng));
            put_budget(&mut m);
        }
        "laurent" => {
            let center = if rng.chance(0.2) { json!("infinity") } else { json!([real(rng), real(rng)]) };
            m.insert("center".into(), center);
            if rng.chance(0.6) {
                m.insert("inner".into(), json!(positive(rng)));
            }
            if rng.chance(0.6) {
                m.insert("outer".into(), json!(positive(rng) * 3.0));
            }
            let from = rng.below(20) as i64 - 10;
            let to = if rng.chance(0.05) { from + 100_000 } else { from + rng.below(12) as i64 };
            m.insert("from".into(), json!(from));
            m.insert("to".into(), json!(to));
            put_budget(&mut m);
        }
        "partial_fractions" => {}
        "contour_integral" | "argument_count" => {
            m.insert("contour".into(), contour(rng));
            put_budget(&mut m);
        }
        "real_integral" => {
            let kind = *rng.pick(&["line", "fourier", "trig", "mellin", "line", "LINE", "other"]);
            m.insert("kind".into(), json!(kind));
            if kind == "fourier" || rng.chance(0.1) {
                m.insert("omega".into(), complex(rng));
            }
            if kind == "mellin" || rng.chance(0.1) {
                m.insert("alpha".into(), complex(rng));
            }
            put_budget(&mut m);
        }
        "inverse_laplace" => {
            let n = if rng.chance(0.03) { 500 } else { rng.below(5) };
            m.insert("t".into(), Value::Array((0..n).map(|_| json!(real(rng).abs())).collect()));
            put_budget(&mut m);
        }
        "inverse_z" => {
            let n = if rng.chance(0.03) { 500 } else { rng.below(5) };
            m.insert("n".into(), Value::Array((0..n).map(|_| json!(rng.below(40))).collect()));
            if rng.chance(0.3) {
                m.insert("singular_radius".into(), json!(positive(rng)));
            }
            put_budget(&mut m);
        }
        "transfer_function" => {
            if var == "z" && !custom_var {
                m.insert("var".into(), json!("z"));
            }
            if rng.chance(0.3) {
                m.insert("domain".into(), json!(if rng.chance(0.5) { "s" } else { "z" }));
            }
            if rng.chance(0.2) {
                m.insert("sample_period".into(), json!(positive(rng)));
            }
            if rng.chance(0.2) {
                let n = rng.below(6);
                m.insert("omega".into(), Value::Array((0..n).map(|_| json!(positive(rng))).collect()));
            }
            if rng.chance(0.2) {
                m.insert("hz".into(), json!(rng.chance(0.5)));
            }
            if rng.chance(0.2) {
                m.insert("point".into(), complex(rng));
            }
            if rng.chance(0.3) {
                let n = rng.below(5);
                m.insert("t".into(), Value::Array((0..n).map(|_| json!(real(rng).abs())).collect()));
            }
            put_budget(&mut m);
        }
        "pole_trails" => {
            if rng.chance(0.8) {
                let f = format!("({})+a*({})", rational(rng, var), rational(rng, var));
                m.insert("f".into(), json!(f));
            }
            let mut sweep = Map::new();
            sweep.insert("name".into(), json!(if rng.chance(0.9) { "a" } else { "q" }));
            sweep.insert("from".into(), json!(real(rng)));
            sweep.insert("to".into(), json!(real(rng)));
            if rng.chance(0.7) {
                sweep.insert("steps".into(), json!(rng.below(40)));
            }
            if rng.chance(0.3) {
                sweep.insert("scale".into(), json!(if rng.chance(0.5) { "log" } else { "linear" }));
            }
            m.insert("sweep".into(), Value::Object(sweep));
            put_budget(&mut m);
        }
        _ => {}
    }
    Value::Object(m)
}

/// A value of a random other type (or an extreme one) to put in place of a field.
fn retyped(rng: &mut Rng) -> Value {
    match rng.below(12) {
        0 => Value::Null,
        1 => json!(true),
        2 => json!("x"),
        3 => json!(""),
        4 => json!([]),
        5 => json!({}),
        6 => json!(-1),
        7 => json!(1e300),
        8 => json!(18_446_744_073_709_551_615u64),
        9 => json!([1e308, -1e308]),
        10 => json!([[0, 0], [0, 0]]),
        _ => json!(0.5),
    }
}

/// [`retyped`], but a budget stays near the default: a budget of 1e9 buys
/// minutes of work, too long for a test run.
fn retyped_for(rng: &mut Rng, key: &str) -> Value {
    let v = retyped(rng);
    match v.as_u64() {
        Some(n) if key == "max_evaluations" && n > 20_000_000 => json!(20_000_001),
        _ => v,
    }
}

/// Every number in `v` (nested) is replaced by an extreme value with probability `p`.
fn extremes(rng: &mut Rng, v: &mut Value, p: f64) {
    match v {
        Value::Number(_) if rng.chance(p) => {
            *v = json!(*rng.pick(&[1e308, -1e308, 5e-324, 0.0, -1.0, 1e19, 4.5e15, 1e-300]));
        }
        Value::Array(xs) => xs.iter_mut().for_each(|x| extremes(rng, x, p)),
        Value::Object(m) => m.values_mut().for_each(|x| extremes(rng, x, p)),
        _ => {}
    }
}

/// Mutate a request: drop, retype or blow up a field, push extremes. Returns
/// the request text (a duplicated key can only be written in text).
pub fn mutate(rng: &mut Rng, mut v: Value) -> String {
    let mut duplicate: Option<(String, Value)> = None;
    for _ in 0..1 + rng.below(3) {
        let Value::Object(m) = &mut v else { break };
        let keys: Vec<String> = m.keys().cloned().collect();
        if keys.is_empty() {
            break;
        }
        let key = rng.pick(&keys).clone();
        match rng.below(7) {
            0 => {
                m.remove(&key);
            }
            1 => {
                let v = retyped_for(rng, &key);
                m.insert(key, v);
            }
            2 => {
                let v = retyped_for(rng, &key);
                duplicate = Some((key, v));
            }
            3 => {
                if let Some(Value::Array(xs)) = m.get_mut(&key) {
                    if rng.chance(0.5) {
                        xs.clear();
                    } else if let Some(x) = xs.first().cloned() {
                        let n = 1 + rng.below(3000) as usize;
                        xs.extend(std::iter::repeat(x).take(n));
                    }
                } else {
                    m.insert("unexpected_field".into(), retyped(rng));
                }
            }
            4 => {
                if let Some(x) = m.get_mut(&key) {
                    extremes(rng, x, 0.5);
                }
            }
            5 => {
                // Truncate or garble the expression text.
                for k in ["f", "F", "X"] {
                    if let Some(Value::String(s)) = m.get_mut(k) {
                        let cut = rng.below(s.len() as u64 + 1) as usize;
                        let cut = (0..=cut).rev().find(|&c| s.is_char_boundary(c)).unwrap_or(0);
                        s.truncate(cut);
                        if rng.chance(0.5) {
                            s.push_str(*rng.pick(&[")", "(", "^", "**", "+", "1e999", "z z", "é", "\u{0}", "a"]));
                        }
                    }
                }
            }
            _ => {
                if let Some(x) = m.get_mut(&key) {
                    extremes(rng, x, 1.0);
                }
            }
        }
    }
    let mut text = v.to_string();
    if let Some((k, x)) = duplicate {
        if text.ends_with('}') && text.len() > 2 {
            text.pop();
            text.push_str(&format!(",{}:{}}}", json!(k), x));
        }
    }
    text
}

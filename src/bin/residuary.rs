//! The `residuary` command line: a thin shell over `residuary::api`.
//!
//! `residuary json` reads one request on stdin and writes one response on
//! stdout (exit 2 on an error response); `residuary plot` writes a phase-plot PNG.
//!
//! Exit status of `residuary json`: 0 with a response, 2 with an error object
//! on stdout (a panic too: the hook prints `{"error":{"code":"internal",…}}`),
//! 1 when the response could not be written (stdout closed, disk full), with
//! the reason on stderr.

use residuary::api::{self, FunctionInput, Number, PhasePlotRequest, PlotOptionsInput};
use std::io::{Read, Write};
use std::process::exit;

const HELP: &str = "\
residuary — singularities, residues, Laurent series and contour integrals

USAGE
  residuary json                 read one JSON request on stdin, write the response on stdout
  residuary plot [OPTIONS] -o FILE.png
                                 write a phase plot of f as a PNG image
  residuary --help | --version

PLOT OPTIONS
  --f EXPR              the function, e.g. 'wn^2/(s^2 + 2*zeta*wn*s + wn^2)'   (required)
  --var NAME            the free variable (default z)
  --param NAME=VALUE    a parameter, real or complex ('0.3' or '0.3+0.1i'); repeatable
  --view X0,X1,Y0,Y1    the real and imaginary ranges (default -4,4,-4,4)
  --size WxH            pixels (default 800x800)
  --wheel NAME          colour wheel: oklch (default, perceptually even), hsv, ramp (lightness rises with arg), blue_yellow
  --modulus-lines       draw log-spaced lines of constant |f|
  --phase-lines         draw lines of constant arg f
  --infinity            plot f(1/w) around w = 0
  -o, --output FILE     the PNG to write (required)

EXAMPLES
  echo '{\"task\":\"residue\",\"f\":\"exp(-s)/(s^2+2*s+5)\",\"var\":\"s\",\"at\":[-1,2]}' | residuary json
  residuary plot --f 'wn^2/(s^2+2*zeta*wn*s+wn^2)' --var s --param wn=2 --param zeta=0.3 \\
      --view -4,2,-3,3 --size 600x600 --modulus-lines -o lowpass.png

The JSON requests and responses are described in docs/contract.md. Errors come back as
{\"error\":{\"code\":...,\"message\":...,\"span\":[start,end]|null}} with exit status 2.
Requests larger than 64 MiB are refused unread. Exit status 1: the response could not be
written (the reason is on stderr).
";

fn fail(message: &str) -> ! {
    eprintln!("residuary: {message}");
    eprintln!("try 'residuary --help'");
    exit(2);
}

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    match args.first().map(String::as_str) {
        Some("json") => json(),
        Some("plot") => plot(&args[1..]),
        Some("--help") | Some("-h") | Some("help") | None => print!("{HELP}"),
        Some("--version") | Some("-V") => println!("residuary {}", env!("CARGO_PKG_VERSION")),
        Some(other) => fail(&format!("unknown command '{other}'")),
    }
}

fn json() {
    std::panic::set_hook(Box::new(|info| {
        let what = info
            .payload()
            .downcast_ref::<&str>()
            .map(|s| s.to_string())
            .or_else(|| info.payload().downcast_ref::<String>().cloned())
            .unwrap_or_else(|| "a panic".to_string());
        let place = info.location().map(|l| format!(" at {}:{}", l.file(), l.line())).unwrap_or_default();
        // Nothing more can go wrong usefully here: write what we can and leave.
        let mut out = std::io::stdout().lock();
        let _ = writeln!(out, "{}", internal_error_json(&format!("{what}{place}")));
        let _ = out.flush();
        eprintln!("residuary: internal error: {what}{place}");
        exit(2);
    }));
    let mut bytes = Vec::new();
    // One byte more than the cap, so an over-long request is seen without reading all of it.
    let cap = api::MAX_REQUEST_BYTES as u64 + 1;
    if let Err(e) = std::io::stdin().lock().take(cap).read_to_end(&mut bytes) {
        fail(&format!("could not read standard input: {e}"));
    }
    let (out, is_error) = api::run_json_bytes(&bytes);
    drop(bytes);
    let mut stdout = std::io::stdout().lock();
    if let Err(e) = writeln!(stdout, "{out}").and_then(|_| stdout.flush()) {
        eprintln!("residuary: could not write the response to standard output: {e}");
        exit(1);
    }
    if is_error {
        exit(2);
    }
}

/// The error object a panic prints on stdout (never a backtrace there).
fn internal_error_json(what: &str) -> String {
    api::ApiError::internal(format!(
        "internal error in residuary ({what}); please report it with the request"
    ))
    .to_json()
    .to_string()
}

/// Parse `a+bi`, `a-bi`, `bi`, `a` (spaces allowed) into a complex number.
fn parse_complex(text: &str) -> Option<Number> {
    let t: String = text.chars().filter(|c| !c.is_whitespace()).collect();
    if let Ok(x) = t.parse::<f64>() {
        return Some(Number::Real(x));
    }
    let body = t.strip_suffix('i')?;
    // split at the last sign that is not part of an exponent
    let bytes = body.as_bytes();
    let split = (1..bytes.len())
        .rev()
        .find(|&k| (bytes[k] == b'+' || bytes[k] == b'-') && !matches!(bytes[k - 1], b'e' | b'E'));
    let (re, im) = match split {
        Some(k) => (body[..k].parse::<f64>().ok()?, &body[k..]),
        None => (0.0, body),
    };
    let im = match im {
        "" | "+" => 1.0,
        "-" => -1.0,
        s => s.parse::<f64>().ok()?,
    };
    Some(Number::Complex([re, im]))
}

fn numbers<const N: usize>(text: &str, sep: char, what: &str) -> [f64; N] {
    let parts: Vec<f64> = text.split(sep).filter_map(|p| p.trim().parse().ok()).collect();
    parts.try_into().unwrap_or_else(|_| fail(&format!("{what} needs {N} numbers separated by '{sep}'")))
}

fn plot(args: &[String]) {
    let mut function = FunctionInput::default();
    let mut view = [-4.0, 4.0, -4.0, 4.0];
    let mut size = [800u32, 800];
    let mut options = PlotOptionsInput::default();
    let mut output: Option<String> = None;
    let mut it = args.iter();
    while let Some(arg) = it.next() {
        let mut value = |name: &str| it.next().cloned().unwrap_or_else(|| fail(&format!("{name} needs a value")));
        match arg.as_str() {
            "--f" => function.f = value("--f"),
            "--var" => function.var = Some(value("--var")),
            "--param" => {
                let p = value("--param");
                let (name, v) = p.split_once('=').unwrap_or_else(|| fail("--param takes NAME=VALUE"));
                let v = parse_complex(v).unwrap_or_else(|| fail(&format!("cannot read '{v}' as a number like 0.3 or 0.3+0.1i")));
                function.params.insert(name.trim().to_string(), v);
            }
            "--view" => view = numbers::<4>(&value("--view"), ',', "--view"),
            "--size" => {
                let [w, h] = numbers::<2>(&value("--size").to_lowercase(), 'x', "--size");
                if !(w >= 1.0 && h >= 1.0 && w.fract() == 0.0 && h.fract() == 0.0 && w <= 4096.0 && h <= 4096.0) {
                    fail("--size takes WxH with whole numbers from 1 to 4096");
                }
                size = [w as u32, h as u32];
            }
            "--wheel" => options.wheel = Some(value("--wheel")),
            "--modulus-lines" => options.modulus_lines = true,
            "--phase-lines" => options.phase_lines = true,
            "--infinity" => options.infinity = true,
            "-o" | "--output" => output = Some(value("--output")),
            "--help" | "-h" => {
                print!("{HELP}");
                return;
            }
            other => fail(&format!("unknown plot option '{other}'")),
        }
    }
    if function.f.is_empty() {
        fail("plot needs --f EXPR");
    }
    let output = output.unwrap_or_else(|| fail("plot needs -o FILE.png"));
    let request = PhasePlotRequest { function, view, size, options, format: Some("png".into()), rows: None, max_evaluations: None };
    let pixels = api::phase_plot_rgba(&request).unwrap_or_else(|e| fail(&e.to_string()));
    let png = residuary::plot::png_encode::encode_png_rgba(pixels.width, pixels.height, &pixels.rgba)
        .unwrap_or_else(|e| fail(&e.to_string()));
    std::fs::write(&output, png).unwrap_or_else(|e| fail(&format!("could not write {output}: {e}")));
    eprintln!("wrote {output} ({}x{})", pixels.width, pixels.height);
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn complex_parameters_parse() {
        assert_eq!(parse_complex("0.3"), Some(Number::Real(0.3)));
        assert_eq!(parse_complex("0.3+0.1i"), Some(Number::Complex([0.3, 0.1])));
        assert_eq!(parse_complex("-2i"), Some(Number::Complex([0.0, -2.0])));
        assert_eq!(parse_complex("1e-3-i"), Some(Number::Complex([1e-3, -1.0])));
        assert_eq!(parse_complex("2e+1+3e-1i"), Some(Number::Complex([20.0, 0.3])));
        assert_eq!(parse_complex("abc"), None);
    }

    #[test]
    fn a_panic_prints_an_internal_error_object() {
        let v: serde_json::Value = serde_json::from_str(&internal_error_json("index out of bounds at x.rs:1")).unwrap();
        assert_eq!(v["error"]["code"], "internal");
        assert!(v["error"]["message"].as_str().unwrap().contains("index out of bounds"));
        assert_eq!(v["error"]["span"], serde_json::Value::Null);
    }
}

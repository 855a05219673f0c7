//! Slow, obviously correct references and the one check harness that every
//! method's test uses (in the spirit of rustfft's naive DFT check): a fast
//! method is tested against the plain sum it replaces, and its error
//! estimate against the true error.
//!
//! Test-only (`#[cfg(test)]`): nothing here is fast or robust, on purpose.

#![allow(dead_code)]

use crate::C;
use std::f64::consts::PI;

/// Composite Simpson rule with `n` (even) panels on [a, b]: the plainest quadrature.
pub fn simpson(f: impl Fn(f64) -> C, a: f64, b: f64, n: usize) -> C {
    let n = n + n % 2;
    let h = (b - a) / n as f64;
    let mut sum = f(a) + f(b);
    for k in 1..n {
        let w = if k % 2 == 1 { 4.0 } else { 2.0 };
        sum += f(a + k as f64 * h) * w;
    }
    sum * (h / 3.0)
}

/// ∫ f over the real line by Simpson on [−L, L] after x = L·tan(πu/2)-free
/// truncation: f must decay fast enough that |x| > `half_width` is negligible.
pub fn simpson_line(f: impl Fn(f64) -> C, half_width: f64, n: usize) -> C {
    simpson(f, -half_width, half_width, n)
}

/// The k-th Taylor/Laurent coefficient of f about `center` by the naive
/// discrete Fourier sum on the circle of radius `r` with `n` points:
/// c_k ≈ (1/n) Σ_j f(center + r ω^j) (r ω^j)^(−k), ω = e^(2πi/n).
pub fn naive_circle_coefficient(f: impl Fn(C) -> C, center: C, r: f64, n: usize, k: i64) -> C {
    let mut sum = C::new(0.0, 0.0);
    for j in 0..n {
        let w = C::from_polar(r, 2.0 * PI * j as f64 / n as f64);
        sum += f(center + w) * w.powi(-(k as i32));
    }
    sum / n as f64
}

/// ∮ f dz around a circle by the naive trapezoidal sum: (2πi/n) Σ f(z_j)(z_j − center).
pub fn naive_circle_integral(f: impl Fn(C) -> C, center: C, r: f64, n: usize) -> C {
    let mut sum = C::new(0.0, 0.0);
    for j in 0..n {
        let w = C::from_polar(r, 2.0 * PI * j as f64 / n as f64);
        sum += f(center + w) * w;
    }
    sum * C::new(0.0, 2.0 * PI / n as f64)
}

/// ∮ f dz along a closed polyline by the midpoint rule on `n` steps per edge.
pub fn naive_polyline_integral(f: impl Fn(C) -> C, vertices: &[C], n: usize) -> C {
    let mut sum = C::new(0.0, 0.0);
    for i in 0..vertices.len() {
        let (a, b) = (vertices[i], vertices[(i + 1) % vertices.len()]);
        let h = (b - a) / n as f64;
        for k in 0..n {
            sum += f(a + h * (k as f64 + 0.5)) * h;
        }
    }
    sum
}

/// Winding number of a closed polyline about `z` by summing the argument change.
pub fn sampled_winding(vertices: &[C], z: C) -> i32 {
    let mut turn = 0.0;
    for i in 0..vertices.len() {
        let (a, b) = (vertices[i] - z, vertices[(i + 1) % vertices.len()] - z);
        turn += (b / a).arg();
    }
    (turn / (2.0 * PI)).round() as i32
}

/// Assert `got` is within `rel` of `want` relative to max(|want|, 1) — with what was checked in the message.
#[track_caller]
pub fn assert_close(got: C, want: C, rel: f64, what: &str) {
    let d = (got - want).norm();
    let scale = want.norm().max(1.0);
    assert!(d <= rel * scale, "{what}: got {got}, want {want}, |difference| {d:.2e} > {rel:.1e} × {scale:.2e}");
}

/// Assert an error estimate bounds the true error (and is not absurdly loose).
#[track_caller]
pub fn assert_estimate_bounds(got: C, estimate: f64, want: C, what: &str) {
    let d = (got - want).norm();
    assert!(
        estimate >= d,
        "{what}: the error estimate {estimate:.2e} does not bound the true error {d:.2e}"
    );
    assert!(estimate.is_finite(), "{what}: the error estimate is not finite");
}

/// The one harness: run `method` on every case and compare with `reference`
/// (the slow way) and, where the method gives one, its error estimate with the
/// true error. Each case carries its own name for the failure message.
#[track_caller]
pub fn check_method<T>(
    cases: &[(&str, T)],
    method: impl Fn(&T) -> (C, Option<f64>),
    reference: impl Fn(&T) -> C,
    rel: f64,
) {
    for (name, case) in cases {
        let (got, estimate) = method(case);
        let want = reference(case);
        assert_close(got, want, rel, name);
        if let Some(e) = estimate {
            // The reference is itself approximate: allow it its own share `rel`.
            let d = (got - want).norm();
            assert!(
                e + rel * want.norm().max(1.0) >= d,
                "{name}: the error estimate {e:.2e} does not bound the difference {d:.2e} from the slow reference"
            );
        }
    }
}

/// The inverse Laplace transform by the Bromwich integral taken as it is written,
/// f(t) = (1/2π) ∫ e^{(c+iy)t} F(c+iy) dy on |y| ≤ `half_height`, by Simpson with
/// `n` panels: F must be analytic for Re s ≥ c and decay fast along the line.
pub fn bromwich(f: impl Fn(C) -> C, c: f64, t: f64, half_height: f64, n: usize) -> C {
    let i = simpson(|y| (C::new(c, y) * t).exp() * f(C::new(c, y)), -half_height, half_height, n);
    i / (2.0 * PI)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_references_reproduce_handbook_values() {
        // ∫_0^π sin x dx = 2 (any calculus table).
        let s = simpson(|x| C::new(x.sin(), 0.0), 0.0, PI, 200);
        assert_close(s, C::new(2.0, 0.0), 1e-8, "Simpson on sin");
        // e^z = Σ z^k/k!: c_3 = 1/6 (power series, DLMF 4.2.19).
        let c3 = naive_circle_coefficient(|z| z.exp(), C::new(0.0, 0.0), 1.0, 64, 3);
        assert_close(c3, C::new(1.0 / 6.0, 0.0), 1e-14, "naive DFT coefficient");
        // ∮ dz/z = 2πi (residue theorem, common practice).
        let i1 = naive_circle_integral(|z| 1.0 / z, C::new(0.0, 0.0), 2.0, 16);
        assert_close(i1, C::new(0.0, 2.0 * PI), 1e-14, "naive circle integral");
        let square = [C::new(-1.0, -1.0), C::new(1.0, -1.0), C::new(1.0, 1.0), C::new(-1.0, 1.0)];
        assert_eq!(sampled_winding(&square, C::new(0.0, 0.0)), 1);
        assert_eq!(sampled_winding(&square, C::new(3.0, 0.0)), 0);
        let p = naive_polyline_integral(|z| 1.0 / z, &square, 4000);
        assert_close(p, C::new(0.0, 2.0 * PI), 1e-6, "naive polyline integral");
    }
}

/// A principal value PV ∫_{p−L}^{p+L} g(x) dx about a simple real pole p, by
/// Simpson on the folded integrand g(p + t) + g(p − t), where the pole's 1/t
/// terms cancel. Near t = 0 the rounding of p ± t spoils that cancellation, so
/// Simpson starts at t = 1e-4 and [0, 1e-4] is one rectangle (error O(1e-8)).
pub fn simpson_folded(g: impl Fn(f64) -> C, p: f64, l: f64, n: usize) -> C {
    let h = |t: f64| g(p + t) + g(p - t);
    h(1e-4) * 1e-4 + simpson(&h, 1e-4, 1e-2, 2_000) + simpson(&h, 1e-2, l, n)
}

//! The one sampler on a circle |z − a| = r, and the one FFT that turns its
//! samples into Laurent coefficients. Residues, Laurent series, the check of
//! exact residues and the inverse z-transform's contour way all use it.
//!
//! Method: the N-point trapezoidal rule for the Cauchy integral
//! c_k = (1/2πi) ∮ f(z)(z − a)^{−k−1} dz on z_j = a + r e^{iθ_j},
//! θ_j = θ₀ + 2πj/N, which is one discrete Fourier transform:
//! c_k ≈ (1/N) Σ_j f(z_j) e^{−ikθ_j} r^{−k}. It converges exponentially for f
//! analytic in an annulus around the circle: L. N. Trefethen &
//! J. A. C. Weideman, "The exponentially convergent trapezoidal rule",
//! SIAM Review 56 (2014) 385–458, §§3, 10. Doubling N reuses every sample
//! (the new nodes are the midpoints), which gives the change of each
//! coefficient as its aliasing estimate.
//!
//! ```
//! use residuary::budget::Budget;
//! use residuary::cauchy::circle::CircleSamples;
//! use residuary::C;
//! // e^z = Σ z^k / k!: c_2 = 1/2 (DLMF 4.2.19).
//! let s = CircleSamples::take(&mut |z: C| z.exp(), C::new(0.0, 0.0), 1.0, 0.0, 32, &mut Budget::default()).unwrap();
//! let c = s.coefficients(0, 3);
//! assert!((c[2] - 0.5).norm() < 1e-15);
//! ```

use crate::budget::Budget;
use crate::error::Failure;
use crate::C;
use rustfft::FftPlanner;
use std::f64::consts::PI;

/// Samples of f at N equispaced points of a circle, in order of angle.
#[derive(Debug, Clone)]
pub struct CircleSamples {
    pub center: C,
    pub radius: f64,
    /// Angle θ₀ of the first node.
    pub offset: f64,
    pub values: Vec<C>,
}

/// The j-th of n nodes on the circle: a + r e^{i(θ₀ + 2πj/n)}.
pub fn node(center: C, radius: f64, offset: f64, n: usize, j: usize) -> C {
    center + C::from_polar(radius, offset + 2.0 * PI * j as f64 / n as f64)
}

/// The forward DFT in place, unnormalised: X_k = Σ_j x_j e^{−2πijk/N}.
pub fn fft(values: &mut [C]) {
    if values.is_empty() {
        return;
    }
    FftPlanner::<f64>::new().plan_fft_forward(values.len()).process(values);
}

fn finite(z: C) -> bool {
    z.re.is_finite() && z.im.is_finite()
}

impl CircleSamples {
    /// Sample f at `n` nodes, spending `n` evaluations of the budget first.
    /// Non-finite values are kept: ask [`Self::first_non_finite`].
    pub fn take(
        f: &mut dyn FnMut(C) -> C,
        center: C,
        radius: f64,
        offset: f64,
        n: usize,
        budget: &mut Budget,
    ) -> Result<Self, Failure> {
        budget.spend(n as u64)?;
        let values = (0..n).map(|j| f(node(center, radius, offset, n, j))).collect();
        Ok(CircleSamples { center, radius, offset, values })
    }

    /// Like [`Self::take`], but stops at the first non-finite value and returns its node.
    pub fn take_finite(
        f: &mut dyn FnMut(C) -> C,
        center: C,
        radius: f64,
        offset: f64,
        n: usize,
        budget: &mut Budget,
    ) -> Result<Result<Self, C>, Failure> {
        budget.spend(n as u64)?;
        let mut values = Vec::with_capacity(n);
        for j in 0..n {
            let z = node(center, radius, offset, n, j);
            let v = f(z);
            if !finite(v) {
                return Ok(Err(z));
            }
            values.push(v);
        }
        Ok(Ok(CircleSamples { center, radius, offset, values }))
    }

    pub fn len(&self) -> usize {
        self.values.len()
    }

    pub fn is_empty(&self) -> bool {
        self.values.is_empty()
    }

    /// The node of sample j.
    pub fn node(&self, j: usize) -> C {
        node(self.center, self.radius, self.offset, self.len(), j)
    }

    /// The first node whose value is not finite.
    pub fn first_non_finite(&self) -> Option<C> {
        self.values.iter().position(|v| !finite(*v)).map(|j| self.node(j))
    }

    /// max |f| over the samples.
    pub fn max_abs(&self) -> f64 {
        self.values.iter().map(|v| v.norm()).fold(0.0, f64::max)
    }

    /// Double N by sampling the midpoints (spends N evaluations). Returns the
    /// first new node where f is not finite, if any (the samples are then unchanged).
    pub fn double(&mut self, f: &mut dyn FnMut(C) -> C, budget: &mut Budget) -> Result<Option<C>, Failure> {
        let n = self.len();
        budget.spend(n as u64)?;
        let mut finer = Vec::with_capacity(2 * n);
        for (j, &old) in self.values.iter().enumerate() {
            finer.push(old);
            let z = node(self.center, self.radius, self.offset, 2 * n, 2 * j + 1);
            let v = f(z);
            if !finite(v) {
                return Ok(Some(z));
            }
            finer.push(v);
        }
        self.values = finer;
        Ok(None)
    }

    /// The samples at every other node (the N/2-point rule).
    pub fn every_other(&self) -> CircleSamples {
        CircleSamples {
            center: self.center,
            radius: self.radius,
            offset: self.offset,
            values: self.values.iter().step_by(2).copied().collect(),
        }
    }

    /// The spectrum b_k = (1/N) Σ_j f_j e^{−2πijk/N}, k = 0..N (index k mod N).
    pub fn spectrum(&self) -> Vec<C> {
        let mut b = self.values.clone();
        fft(&mut b);
        let n = b.len() as f64;
        for x in b.iter_mut() {
            *x /= n;
        }
        b
    }

    /// Normalised coefficient ĉ_k = c_k r^k = b_k e^{−ikθ₀} from a spectrum of these samples.
    pub fn normalized_from(&self, spectrum: &[C], k: i64) -> C {
        let b = spectrum[k.rem_euclid(spectrum.len() as i64) as usize];
        if self.offset == 0.0 {
            b
        } else {
            b * C::from_polar(1.0, -(k as f64) * self.offset)
        }
    }

    /// c_k from a spectrum of these samples, and the factor r^{−k}.
    pub fn coefficient_from(&self, spectrum: &[C], k: i64) -> (C, f64) {
        let b = self.normalized_from(spectrum, k);
        let factor = (-(k as f64) * self.radius.ln()).exp();
        let c = if b == C::new(0.0, 0.0) { b } else { b * factor };
        (c, factor)
    }

    /// c_from..=c_to (one FFT).
    pub fn coefficients(&self, from: i64, to: i64) -> Vec<C> {
        let s = self.spectrum();
        (from..=to).map(|k| self.coefficient_from(&s, k).0).collect()
    }

    /// The winding number of f along the circle from the phase increments,
    /// when every increment is below π/2 (so the phase is resolved).
    pub fn winding(&self) -> Option<i64> {
        let n = self.len();
        let mut total = 0.0;
        for j in 0..n {
            let (p, q) = (self.values[j], self.values[(j + 1) % n]);
            if p == C::new(0.0, 0.0) || q == C::new(0.0, 0.0) {
                return None;
            }
            let d = (q / p).arg();
            if d.abs() > PI / 2.0 {
                return None;
            }
            total += d;
        }
        Some((total / (2.0 * PI)).round() as i64)
    }

    /// The residue c₋₁ = (1/N) Σ f_j (z_j − a) with the N/2-point rule's
    /// difference plus the rounding level as its error estimate.
    pub fn residue_with_half_rule(&self) -> (C, f64) {
        let n = self.len();
        let (mut all, mut even, mut magnitude) = (C::new(0.0, 0.0), C::new(0.0, 0.0), 0.0);
        for (j, v) in self.values.iter().enumerate() {
            let term = v * (self.node(j) - self.center);
            all += term;
            magnitude += term.norm();
            if j % 2 == 0 {
                even += term;
            }
        }
        let full = all / n as f64;
        let half = even / (n / 2) as f64;
        (full, (full - half).norm() + 64.0 * f64::EPSILON * magnitude / n as f64)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{assert_close, check_method, naive_circle_coefficient};

    #[test]
    fn coefficients_match_the_naive_dft_on_offset_circles() {
        // Slow reference: the plain DFT sum (reference.rs) with the same nodes.
        let f = |z: C| (z * 0.7).exp() / (z - 3.0);
        let cases: Vec<(&str, (i64, f64, f64))> = vec![
            ("c_0 r=1", (0, 1.0, 0.0)),
            ("c_3 r=1 offset", (3, 1.0, 0.3)),
            ("c_-2 r=0.5 offset", (-2, 0.5, 1.0 / PI)),
            ("c_5 r=2", (5, 2.0, 0.0)),
        ];
        check_method(
            &cases,
            |&(k, r, off)| {
                let s = CircleSamples::take(&mut |z| f(z), C::new(0.0, 0.0), r, off, 64, &mut Budget::default()).unwrap();
                (s.coefficients(k, k)[0], None)
            },
            |&(k, r, off)| {
                // Rotating the nodes by θ₀ is sampling g(w) = f(e^{iθ₀} w) with c_k(g) = e^{ikθ₀} c_k(f).
                let g = |w: C| f(w * C::from_polar(1.0, off));
                naive_circle_coefficient(g, C::new(0.0, 0.0), r, 64, k) * C::from_polar(1.0, -(k as f64) * off)
            },
            1e-13,
        );
    }

    #[test]
    fn the_half_rule_residue_bounds_its_error() {
        // Res_{z=1} e^z/((z−1)(z+2)) = e/3 (simple-pole rule; common practice).
        let f = |z: C| z.exp() / ((z - 1.0) * (z + 2.0));
        let s = CircleSamples::take(&mut |z| f(z), C::new(1.0, 0.0), 0.45, 0.0, 32, &mut Budget::default()).unwrap();
        let (res, err) = s.residue_with_half_rule();
        let want = C::new(std::f64::consts::E / 3.0, 0.0);
        crate::reference::assert_estimate_bounds(res, err, want, "half-rule residue");
        assert_close(res, want, 1e-12, "half-rule residue");
    }

    #[test]
    fn doubling_reuses_samples_and_finds_the_winding() {
        // z³ winds three times about 0 on |z| = 1 (argument principle; common practice).
        let mut f = |z: C| z * z * z;
        let mut b = Budget::new(1000);
        let mut s = CircleSamples::take(&mut f, C::new(0.0, 0.0), 1.0, 0.1, 16, &mut b).unwrap();
        assert_eq!(s.double(&mut f, &mut b).unwrap(), None);
        assert_eq!(s.len(), 32);
        assert_eq!(b.used(), 32);
        assert_eq!(s.winding(), Some(3));
        let c = s.coefficients(3, 3)[0];
        assert_close(c, C::new(1.0, 0.0), 1e-14, "c_3 of z³");
        let mut g = |z: C| 1.0 / (z - 1.0);
        assert!(CircleSamples::take(&mut g, C::new(0.0, 0.0), 1.0, 0.0, 4, &mut b).unwrap().first_non_finite().is_some());
    }
}

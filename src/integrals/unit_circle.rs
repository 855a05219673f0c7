//! Method: a trigonometric integral by residues inside the unit circle
//! (L. V. Ahlfors, "Complex Analysis", 3rd ed., McGraw-Hill 1979, ch. 4 §5.3 —
//! from memory). With z = e^{iθ}, dθ = dz/(iz):
//!
//! ```text
//! ∫_0^{2π} f(θ) dθ = ∮_{|z|=1} g(z) dz = 2πi Σ_{|a|<1} Res[g, a],   g(z) = f(−i log z)/(iz)
//! ```
//!
//! g is single-valued when f is 2π-periodic ([`check_periodic`]); f built from
//! sqrt, log or non-integer powers may give g branch points in the disk, where
//! the theorem does not apply. The singularities of g in the disk are located
//! numerically (`singular::find_singularities`; essential ones classified by
//! `singular::classify_point`), each residue with its error bound.

// `!(a <= b)` is deliberate: a NaN must take the cautious branch.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use super::product_residue::{ResidueSum, Role, Term};
use crate::budget::Budget;
use crate::contour::Contour;
use crate::error::Failure;
use crate::singular::{classify_point, find_singularities, Hints, Kind};
use crate::text;
use crate::C;
use std::f64::consts::PI;

/// The residue formula applied, in words.
pub const FORMULA: &str = "∫_0^2π f(θ) dθ = 2πi Σ_{|a|<1} Res g, g(z) = f(−i log z)/(iz), z = e^(iθ)";

/// Check at six points that f is finite on the real axis (else `Divergent`)
/// and 2π-periodic (else `NotApplicable`).
pub fn check_periodic(f: &dyn Fn(C) -> C) -> Result<(), Failure> {
    for theta in [0.0, 0.37, 1.1, 2.5, 4.0, 5.7] {
        let a = f(C::new(theta, 0.0));
        let b = f(C::new(theta + 2.0 * PI, 0.0));
        if !(a.re.is_finite() && a.im.is_finite()) {
            return Err(Failure::divergent(format!(
                "f is not finite at θ = {theta}: a singularity lies on the real θ axis, so the integral diverges"
            )));
        }
        if !((a - b).norm() <= 1e-9 * (1.0 + a.norm())) {
            return Err(Failure::not_applicable(format!(
                "f is not 2π-periodic (f({theta}) ≠ f({theta} + 2π)): kind \"trig\" needs f built from cos and sin of the variable; for other integrands use kind \"line\" or a contour_integral"
            )));
        }
    }
    Ok(())
}

/// 2πi Σ_{|a|<1} Res g for the periodic f (`fd` gives f and f′).
/// `Ok(None)` (with the reason in `warnings`) when f uses branch functions,
/// g has a branch point in the disk, a residue is unknown, or the search failed.
///
/// ```
/// use residuary::budget::Budget;
/// use residuary::integrals::unit_circle::unit_circle_residues;
/// use residuary::C;
/// // ∫_0^{2π} dθ/(2 + cos θ) = 2π/√3 (common practice).
/// let f = |z: C| 1.0 / (2.0 + z.cos());
/// let fd = |z: C| { let v = f(z); (v, v * v * z.sin()) };
/// let s = unit_circle_residues(&f, &fd, false, &mut Budget::new(1_000_000), &mut Vec::new())
///     .unwrap()
///     .unwrap();
/// let exact = 2.0 * std::f64::consts::PI / 3f64.sqrt();
/// assert!((s.value - C::new(exact, 0.0)).norm() <= s.error + 1e-12);
/// ```
pub fn unit_circle_residues(
    f: &dyn Fn(C) -> C,
    fd: &dyn Fn(C) -> (C, C),
    uses_branch_functions: bool,
    budget: &mut Budget,
    warnings: &mut Vec<String>,
) -> Result<Option<ResidueSum>, Failure> {
    let i = C::new(0.0, 1.0);
    let theta = |z: C| -i * z.ln();
    let g = |z: C| f(theta(z)) / (i * z);
    let gd = |z: C| {
        let (v, d) = fd(theta(z));
        (v / (i * z), (i * v - d) / (z * z))
    };
    let hints = Hints { uses_branch_functions, ..Hints::default() };
    if uses_branch_functions {
        warnings.push(
            "f uses sqrt, log or a non-integer power, so g(z) = f(−i log z)/(iz) may have branch points in the unit disk, where the residue theorem does not apply: the residue side is not computed".into(),
        );
        return Ok(None);
    }
    let found = match find_singularities(&g, &gd, &Contour::circle(C::new(0.0, 0.0), 1.0), &hints, budget) {
        Err(e) if e.is_budget() => return Err(e),
        Err(e) => {
            warnings.push(format!(
                "the singularities of g(z) = f(−i log z)/(iz) in the unit disk could not be located, so the residue side is not computed: {e}"
            ));
            return Ok(None);
        }
        Ok(found) => found,
    };
    warnings.extend(found.warnings.iter().map(|w| format!("singularity search: {w}")));
    let mut ok = true;
    if let Some(b) = found.branch_points.first() {
        warnings.push(format!(
            "g has a branch point at {} inside the unit circle: the residue theorem does not apply",
            text::value(*b)
        ));
        ok = false;
    }
    // (point, residue if known, its error, role)
    let mut points: Vec<(C, Option<C>, f64, Role)> =
        found.poles.iter().map(|p| (p.at, p.residue, p.error_estimate, Role::DiskPole { order: p.order })).collect();
    for &z in &found.essential {
        match classify_point(&g, z, &hints, budget) {
            Ok(r) if r.kind == Kind::Essential => points.push((z, r.residue, r.error_estimate, Role::DiskEssential)),
            Err(e) if e.is_budget() => return Err(e),
            _ => points.push((z, None, 0.0, Role::DiskEssential)),
        }
    }
    let weight = C::new(0.0, 2.0 * PI);
    let mut terms = Vec::new();
    let mut sum = C::new(0.0, 0.0);
    let mut err = 0.0;
    for (at, res, e, role) in points {
        let Some(res) = res else {
            warnings.push(format!(
                "the residue of g at {} could not be computed, so the residue side is not available",
                text::value(at)
            ));
            ok = false;
            continue;
        };
        sum += weight * res;
        err += weight.norm() * e;
        terms.push(Term { at, residue: res, weight, error: e, role });
    }
    warnings.push(
        "trig: the residues of g(z) = f(−i log z)/(iz) are located numerically inside the unit circle (sampling methods)".into(),
    );
    Ok(ok.then(|| ResidueSum { terms, value: sum, error: err + 8.0 * f64::EPSILON * sum.norm() }))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::{check_method, simpson};

    #[test]
    fn unit_circle_sums_match_plain_quadrature() {
        type F = fn(C) -> C;
        type Fd = fn(C) -> (C, C);
        fn f1(z: C) -> C {
            1.0 / (3.0 + 2.0 * z.cos())
        }
        fn d1(z: C) -> (C, C) {
            let v = f1(z);
            (v, 2.0 * v * v * z.sin())
        }
        // A double pole of g: 1/(2 + cos θ)².
        fn f2(z: C) -> C {
            let q = 2.0 + z.cos();
            1.0 / (q * q)
        }
        fn d2(z: C) -> (C, C) {
            let q = 2.0 + z.cos();
            (1.0 / (q * q), 2.0 * z.sin() / (q * q * q))
        }
        // Complex coefficients: 1/(2 − i sin θ + cos θ / 2).
        fn f3(z: C) -> C {
            1.0 / (2.0 - C::new(0.0, 1.0) * z.sin() + 0.5 * z.cos())
        }
        fn d3(z: C) -> (C, C) {
            let v = f3(z);
            (v, v * v * (C::new(0.0, 1.0) * z.cos() + 0.5 * z.sin()))
        }
        let cases: [(&str, (F, Fd)); 3] =
            [("1/(3 + 2cos θ)", (f1, d1)), ("1/(2 + cos θ)²", (f2, d2)), ("1/(2 − i sin θ + cos θ/2)", (f3, d3))];
        check_method(
            &cases,
            |(f, fd)| {
                let s = unit_circle_residues(f, fd, false, &mut Budget::new(2_000_000), &mut Vec::new()).unwrap().unwrap();
                (s.value, Some(s.error))
            },
            |(f, _)| simpson(|t| f(C::new(t, 0.0)), 0.0, 2.0 * PI, 20_000),
            1e-9,
        );
        // Closed forms (common practice): 2π/√5 and 2πa/(a² − b²)^{3/2} = 4π/3^{3/2}.
        let s = unit_circle_residues(&f2, &d2, false, &mut Budget::new(2_000_000), &mut Vec::new()).unwrap().unwrap();
        assert!((s.value - C::new(4.0 * PI / 3f64.powf(1.5), 0.0)).norm() <= s.error.max(1e-12), "{}", s.value);
    }

    #[test]
    fn periodicity_and_branch_functions_are_checked() {
        assert!(check_periodic(&|z: C| 1.0 / (2.0 + z.cos())).is_ok());
        assert!(check_periodic(&|z: C| z / (2.0 + z.cos())).is_err());
        assert!(check_periodic(&|z: C| 1.0 / z.sin()).is_err(), "1/sin θ is not finite at θ = 0");
        let mut w = Vec::new();
        let f = |z: C| (2.0 + z.cos()).sqrt();
        let s = unit_circle_residues(&f, &|z| (f(z), C::new(0.0, 0.0)), true, &mut Budget::new(1000), &mut w).unwrap();
        assert!(s.is_none() && w[0].contains("branch points"));
    }
}

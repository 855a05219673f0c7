//! Poles, residues, partial fractions and the residue at infinity of rational
//! functions, against mpmath fixtures and closed forms.


use residuary::poly::from_roots;
use residuary::singular::rational_poles::{
    analyse_rational, partial_fractions_string, residue_at_point, PointKind, RationalAnalysis,
};
use residuary::C;
use crate::common::{list, num};
use serde_json::Value;

fn c(re: f64, im: f64) -> C {
    C::new(re, im)
}

fn fixtures() -> Value {
    crate::common::fixture("rational")
}



#[test]
fn fixtures_poles_residues_principal_parts() {
    // mpmath 1.3.0, 40 digits: derivative rule via mpmath.diff (tests/fixtures/gen_rational.py)
    let fx = fixtures();
    let mut checked = 0;
    for case in fx["rational"].as_array().unwrap() {
        let name = case["name"].as_str().unwrap();
        let a = analyse_rational(&list(&case["num"]), &list(&case["den"])).unwrap();
        let want_poles = case["poles"].as_array().unwrap();
        assert_eq!(a.poles.len(), want_poles.len(), "{name}: {:?}", a.poles);
        let scale = want_poles
            .iter()
            .flat_map(|p| list(&p["principal_part"]))
            .map(|z| z.norm())
            .fold(0.0, f64::max);
        for wp in want_poles {
            let at = num(&wp["at"]);
            let order = wp["order"].as_u64().unwrap() as u32;
            let pp = list(&wp["principal_part"]);
            let got = a
                .poles
                .iter()
                .min_by(|x, y| (x.at - at).norm().total_cmp(&(y.at - at).norm()))
                .unwrap();
            assert_eq!(got.order, order, "{name} at {at}");
            let loc = (got.at - at).norm();
            assert!(
                loc <= got.location_error.max(1e-300),
                "{name} at {at}: location off {loc} > {}",
                got.location_error
            );
            // our accuracy targets: simple poles 1e-12 relative, order ≤ 4 1e-9 relative
            // (to the largest coefficient)
            let target = if order == 1 { 1e-12 } else { 1e-9 };
            for (k, w) in pp.iter().enumerate() {
                let err = (got.principal_part[k] - w).norm();
                let est = got.principal_part_errors[k];
                assert!(
                    err <= est,
                    "{name} at {at}, c_-{}: error {err:e} > estimate {est:e}",
                    k + 1
                );
                assert!(
                    err <= target * scale.max(w.norm()),
                    "{name} at {at}, c_-{}: error {err:e}",
                    k + 1
                );
                // property: the estimate is not absurdly pessimistic
                assert!(
                    est <= 1e-6 * scale,
                    "{name} at {at}, c_-{}: estimate {est:e}",
                    k + 1
                );
                checked += 1;
            }
            // property: the residue is c₋₁, the first principal-part coefficient
            assert_eq!(got.residue, got.principal_part[0]);
        }
        // residue at infinity (residue theorem at 40 digits) and the defect
        let rinf = num(&case["residue_at_infinity"]);
        assert!(
            (a.residue_at_infinity - rinf).norm() <= 1e-12 * scale.max(1.0),
            "{name}: Res∞ {}",
            a.residue_at_infinity
        );
        assert!(
            a.residue_sum_defect <= 1e-10 * scale.max(1.0),
            "{name}: defect {}",
            a.residue_sum_defect
        );
        assert!(
            a.residue_sum_defect <= 10.0 * a.residue_sum_tolerance,
            "{name}"
        );
        assert!(a.warnings.is_empty(), "{name}: {:?}", a.warnings);
        let q = list(&case["polynomial_part"]);
        assert_eq!(a.polynomial_part.len(), q.len(), "{name}");
        for (x, y) in a.polynomial_part.iter().zip(&q) {
            assert!(
                (x - y).norm() <= 1e-14 * y.norm().max(1.0),
                "{name}: polynomial part"
            );
        }
    }
    assert!(checked > 30);
}

#[test]
fn second_order_low_pass_closed_form() {
    // H(s) = wn²/(s² + 2ζ wn s + wn²): poles s = −ζwn ± i wn√(1−ζ²); residue at s₊ is
    // wn²/(s₊ − s₋) = wn/(2i√(1−ζ²)) and its conjugate at s₋ (common practice: simple-pole rule g/h').
    for (wn, zeta) in [
        (1.0, 0.3),
        (2.0 * std::f64::consts::PI * 50.0, 0.05),
        (1e4, 0.9),
    ] {
        let num = [c(wn * wn, 0.0)];
        let den = [c(wn * wn, 0.0), c(2.0 * zeta * wn, 0.0), c(1.0, 0.0)];
        let a = analyse_rational(&num, &den).unwrap();
        let w = (1.0 - zeta * zeta).sqrt();
        let sp = c(-zeta * wn, wn * w);
        let rp = c(wn, 0.0) / c(0.0, 2.0 * w);
        assert_eq!(a.poles.len(), 2);
        for (s, r) in [(sp, rp), (sp.conj(), rp.conj())] {
            let p = a
                .poles
                .iter()
                .find(|p| (p.at - s).norm() < 1e-9 * wn)
                .unwrap();
            assert_eq!(p.order, 1);
            let err = (p.residue - r).norm();
            assert!(err <= 1e-12 * r.norm(), "wn {wn} ζ {zeta}: {err}");
            assert!(err <= p.error_estimate);
        }
        // deg den − deg num = 2 ⇒ Res∞ = 0 and the finite residues cancel (residue theorem)
        assert_eq!(a.residue_at_infinity, c(0.0, 0.0));
        assert_eq!(a.infinity_order, -2);
        assert!(a.residue_sum_defect <= 1e-12 * wn);
    }
}

#[test]
fn cancellation_gives_removable_point() {
    // (z−1)(z+2)/((z−1)(z−3)) = (z+2)/(z−3) = 1 + 5/(z−3): removable at 1 with value −3/2 (by hand)
    let one = c(1.0, 0.0);
    let num = from_roots(one, &[one, c(-2.0, 0.0)]);
    let den = from_roots(one, &[one, c(3.0, 0.0)]);
    let a = analyse_rational(&num, &den).unwrap();
    assert_eq!(a.poles.len(), 1);
    assert!((a.poles[0].at - c(3.0, 0.0)).norm() < 1e-14);
    assert!((a.poles[0].residue - c(5.0, 0.0)).norm() < 1e-13);
    assert_eq!(a.removable.len(), 1);
    assert!((a.removable[0].at - one).norm() < 1e-14);
    assert!((a.removable[0].value - c(-1.5, 0.0)).norm() < 1e-13);
    assert_eq!(a.zeros.len(), 1);
    assert!((a.zeros[0].at - c(-2.0, 0.0)).norm() < 1e-14);
    assert_eq!(a.infinity_order, 0);
    assert_eq!(partial_fractions_string(&a, "z"), "1 + 5/(z - 3)");

    let r = residue_at_point(&num, &den, one).unwrap();
    assert_eq!(r.kind, PointKind::Removable);
    assert_eq!(r.kind.as_str(), "removable");
    assert_eq!(r.residue, c(0.0, 0.0));
    let r = residue_at_point(&num, &den, c(3.0, 0.0)).unwrap();
    assert_eq!((r.kind, r.order), (PointKind::Pole, Some(1)));
    assert!((r.residue - c(5.0, 0.0)).norm() <= r.error_estimate.max(1e-13));
    let r = residue_at_point(&num, &den, c(2.0, 0.5)).unwrap();
    assert_eq!(
        (r.kind, r.order, r.residue),
        (PointKind::Regular, None, c(0.0, 0.0))
    );
    assert!((r.distance_to_nearest_pole.unwrap() - 0.5f64.hypot(1.0)).abs() < 1e-12);
}

#[test]
fn residue_at_infinity_cases() {
    // f = (3z² + 1)/(2z³ − z): deg difference 1 ⇒ Res∞ = −lc(num)/lc(den) = −3/2 (common practice)
    let a = analyse_rational(
        &[c(1.0, 0.0), c(0.0, 0.0), c(3.0, 0.0)],
        &[c(0.0, 0.0), c(-1.0, 0.0), c(0.0, 0.0), c(2.0, 0.0)],
    )
    .unwrap();
    assert!((a.residue_at_infinity - c(-1.5, 0.0)).norm() < 1e-15);
    assert_eq!(a.infinity_order, -1);
    assert!(a.residue_sum_defect < 1e-14);
    // improper f = z³/(z − 2) = z² + 2z + 4 + 8/(z − 2): Res∞ = −8 (polynomial division by hand)
    let a = analyse_rational(
        &[c(0.0, 0.0), c(0.0, 0.0), c(0.0, 0.0), c(1.0, 0.0)],
        &[c(-2.0, 0.0), c(1.0, 0.0)],
    )
    .unwrap();
    assert!((a.residue_at_infinity - c(-8.0, 0.0)).norm() < 1e-14);
    assert_eq!(a.infinity_order, 2);
    assert_eq!(
        a.polynomial_part,
        vec![c(4.0, 0.0), c(2.0, 0.0), c(1.0, 0.0)]
    );
    assert_eq!(
        partial_fractions_string(&a, "s"),
        "s^2 + 2*s + 4 + 8/(s - 2)"
    );
    // z³ in the numerator, no factor z in the denominator ⇒ a zero of order 3 at 0 (by hand)
    assert_eq!(a.zeros.len(), 1);
    assert_eq!((a.zeros[0].at, a.zeros[0].order), (c(0.0, 0.0), 3));
}

#[test]
fn partial_cancellation_lowers_the_order() {
    // (z−1)(z+4)/((z−1)^3 (z+0.5)) = (z+4)/((z−1)^2 (z+0.5)); by hand: c_{−2} at 1 = 5/1.5 = 10/3
    let one = c(1.0, 0.0);
    let num = from_roots(one, &[one, c(-4.0, 0.0)]);
    let den = from_roots(one, &[one, one, one, c(-0.5, 0.0)]);
    let r = residue_at_point(&num, &den, one).unwrap();
    assert_eq!((r.kind, r.order), (PointKind::Pole, Some(2)));
    assert!((r.principal_part[1] - c(10.0 / 3.0, 0.0)).norm() < 1e-9);
    // Res at 1 = d/dz[(z+4)/(z+0.5)] at 1 = −3.5/1.5² = −14/9 (by hand)
    assert!((r.residue - c(-14.0 / 9.0, 0.0)).norm() <= r.error_estimate);
    let a = analyse_rational(&num, &den).unwrap();
    assert!(a.removable.is_empty());
}

#[test]
fn string_uses_compact_numbers_and_signs() {
    // 1/(s² + 4) = (−0.25i)/(s − 2i) + (0.25i)/(s + 2i)  (partial fractions by hand)
    let a = analyse_rational(&[c(1.0, 0.0)], &[c(4.0, 0.0), c(0.0, 0.0), c(1.0, 0.0)]).unwrap();
    // property: compact number format and signs, poles ordered (the values are by hand)
    assert_eq!(
        partial_fractions_string(&a, "s"),
        "0.25i/(s + 2i) - 0.25i/(s - 2i)"
    );
}

#[test]
fn errors_and_limits() {
    // Refusals and edge cases; values by hand.
    assert!(analyse_rational(&[c(1.0, 0.0)], &[c(0.0, 0.0)]).is_err());
    assert!(analyse_rational(&[c(f64::NAN, 0.0)], &[c(1.0, 0.0), c(1.0, 0.0)]).is_err());
    let big = vec![c(1.0, 0.0); 6000];
    let e = analyse_rational(&[c(1.0, 0.0)], &big).unwrap_err();
    assert!(e.message().contains("limit"), "{e}");
    assert!(residue_at_point(
        &[c(1.0, 0.0)],
        &[c(1.0, 0.0), c(1.0, 0.0)],
        c(f64::NAN, 0.0)
    )
    .is_err());
    // identically zero numerator: no poles, a warning
    let a: RationalAnalysis =
        analyse_rational(&[c(0.0, 0.0)], &[c(1.0, 0.0), c(1.0, 0.0)]).unwrap();
    assert!(a.poles.is_empty() && !a.warnings.is_empty());
    // a constant denominator: no poles, the polynomial part is num/const
    let a = analyse_rational(&[c(2.0, 0.0), c(4.0, 0.0)], &[c(2.0, 0.0)]).unwrap();
    assert!(a.poles.is_empty());
    assert_eq!(a.polynomial_part, vec![c(1.0, 0.0), c(2.0, 0.0)]);
    assert_eq!(a.residue_at_infinity, c(0.0, 0.0));
}

#[test]
fn close_but_resolvable_poles_stay_separate() {
    // 1/((z−1)(z−1−1e-6)): residues ±1e6 (simple-pole rule g/h', common practice)
    let one = c(1.0, 0.0);
    let b = c(1.0 + 1e-6, 0.0);
    let a = analyse_rational(&[one], &from_roots(one, &[one, b])).unwrap();
    assert_eq!(a.poles.len(), 2);
    let want = 1.0 / ((1.0 + 1e-6) - 1.0); // exact separation of the binary numbers
    for p in &a.poles {
        let w = if p.at.re < 1.0 + 5e-7 { -want } else { want };
        let err = (p.residue.re - w).abs();
        assert!(
            err <= p.error_estimate,
            "{} vs {w}: {err} > {}",
            p.residue,
            p.error_estimate
        );
        // coefficient rounding moves roots 1e-6 apart by ~u/1e-6 each: ~1e-4 relative (common practice)
        assert!(err <= 1e-3 * w.abs());
    }
}

//! Requests the fuzzer (or a report) found wrong, kept as fixed cases with the
//! same checks (check.rs). Each says what was wrong; the truth beside each is
//! the contract itself (docs/contract.md: no non-finite number as text, errors
//! carry a code and a message) unless a number is checked.

use crate::check;
use crate::limit_for;

fn assert_clean(request: &str) -> serde_json::Value {
    let out = check::run(request, limit_for(request));
    assert!(out.problems.is_empty(), "{request}\n{:#?}", out.problems);
    serde_json::from_str(&residuary::api::run_json_text(request).0).unwrap()
}

#[test]
fn known_cases_stay_clean() {
    for request in CASES {
        assert_clean(request);
    }
}

/// Each line: the request, as the fuzzer or a report gave it.
const CASES: &[&str] = &[
    // "NaN + NaNi" in the text of singularities and partial_fractions: the
    // roots of 1e-300 z² + 1 are ±1e150 i (by construction), which the root
    // finder did not resolve.
    r#"{"task":"singularities","f":"1/(1e-300*z^2+1)","region":{"shape":"circle","center":[0,0],"radius":2}}"#,
    r#"{"task":"partial_fractions","f":"1/(1e-300*z^2+1)"}"#,
    r#"{"task":"residue","f":"1/(1e-300*z^2+1)","at":[0,0]}"#,
    // "r1 > inf" and a 300-digit radius in the laurent refusal: a centre at
    // 1.8e308 puts every distance beyond double precision (IEEE 754 binary64).
    r#"{"center":[-1.625,1.7976931348623157e+308],"f":"(z-(0))^2*(z-(-2+3*i))^1/((z-(2+3*i))^2*(z-(2+1*i))^1*(z-(0+2*i))^2*(z-(0+2*i))^2)","from":-6,"inner":1e-9,"max_evaluations":30000,"task":"laurent","to":4}"#,
    r#"{"center":[4.0,1.7976931348623157e+308],"f":"((i/(z))^100/(pi)+(-z)^(e)/(coth(z)*(z-z)))","from":-8,"max_evaluations":2000,"task":"laurent","to":3}"#,
    // A panic (index out of bounds) in the Aberth–Ehrlich starting points when
    // a coefficient's modulus overflows.
    r#"{"f":"3*(((1e-320+z)+z*a)*(z)^-2/(sin(pi))*((3+e)/((z-4)*z))^-2)^2","kind":"line","max_evaluations":5000,"omega":[289681.5900862133,-4.5],"params":{"a":[562140.2959503001,3.625],"b":[4.25,-1.625]},"task":"real_integral","var":"z"}"#,
    // Slow before every task had a budget and AAA fits were charged: seconds
    // (30 s for the first) at a budget of a few thousand.
    r#"{"center":[1.875,-2.375],"f":"acos(sec(((z)^-7+(-(1e16)^(e)+(20+(z-(z-8e-20)))))))","from":6,"inner":4.953144759757145,"max_evaluations":5000,"outer":5.348325247593396,"task":"laurent","to":15}"#,
    r#"{"contour":{"angle":-3.5,"center":[3.25,-0.125],"semi_axes":[3.567065412213972,1e-9],"shape":"ellipse"},"f":"(log(z))^10","max_evaluations":10000,"task":"contour_integral","var":"z"}"#,
    r#"{"task":"contour_integral","f":"tan(tan(22)^z+z)","contour":{"shape":"circle","center":[0,0],"radius":1},"max_evaluations":100000}"#,
    // "error estimate inf" in the sensitivity warning: 1e308 over a product of
    // factors overflows the residues' error estimates.
    r#"{"contour":{"center":[-2.375,-2.5],"radius":0.9619366422684023,"shape":"circle"},"f":"1e308/((z-(1+1*i))^2*(z-(0+0*i))^2*(z-(2))^1)","max_evaluations":2000,"task":"contour_integral"}"#,
    r#"{"f":"1e308/((z-(-2))^1*(z-(2))^2*(z-(1+2*i))^2)","region":{"shape":"circle","center":[0,0],"radius":5},"task":"singularities"}"#,
    // "x = inf" in the real-integral refusal (seed 23 of the long run): coth(w) is NaN at w = ∞,
    // where the substituted line integral samples its end point.
    r#"{"f":"1e-320/(coth(w))","kind":"line","max_evaluations":2000,"omega":3.25,"task":"real_integral","var":"w"}"#,
    // A panic (usize overflow) in the default frequency grid: a root of size 1e308 made the
    // grid's upper end 1e309 = ∞ (seed 8 of `make test`, the day transfer_function came in).
    r#"{"f":"(s-1e308)","hz":false,"task":"transfer_function"}"#,
    r#"{"f":"1/(s-1e-308)","task":"transfer_function"}"#,
];

/// A budget bounds the three tasks that had none: work far beyond a budget of
/// a thousand is refused before it is done (by construction: one evaluation
/// per pixel, two per point of `evaluate`, 4001 coefficients need more than
/// 1000 samples).
#[test]
fn small_budgets_refuse_big_work_quickly() {
    let points: Vec<String> = (0..600).map(|k| k.to_string()).collect();
    let evaluate = format!(r#"{{"task":"evaluate","f":"z","at":[{}],"max_evaluations":1000}}"#, points.join(","));
    for request in [
        r#"{"task":"phase_plot","f":"sin(z)","view":[-1,1,-1,1],"size":[1000,1000],"max_evaluations":1000}"#,
        evaluate.as_str(),
        r#"{"task":"laurent","f":"exp(1/z)","center":[0,0],"inner":0.5,"outer":2,"from":-2000,"to":2000,"max_evaluations":1000}"#,
    ] {
        let v = assert_clean(request);
        assert_eq!(v["error"]["code"], "budget_exhausted", "{request}");
    }
    // Within the budget the same tasks answer.
    let v = assert_clean(r#"{"task":"evaluate","f":"z","at":[1,2],"max_evaluations":1000}"#);
    assert_eq!(v["values"][1][0], 2.0);
}

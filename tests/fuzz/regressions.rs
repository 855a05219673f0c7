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
];

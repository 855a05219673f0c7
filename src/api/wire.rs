//! Wire shapes shared by several tasks: numbers, points, the function input,
//! the contour request, and the enums that name states on the wire.
//!
//! Complex numbers are `[re, im]` on the wire. Each task's own request and
//! response live in its file under `api/tasks/`.

use super::shape::{Expect, Field, Tagged};
use crate::C;
use serde::de::{self, Deserializer, SeqAccess, Visitor};
use serde::{Deserialize, Serialize};
use std::collections::BTreeMap;
use std::fmt;

/// A complex number on the wire: `[re, im]`, or a bare real number on input.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(untagged)]
pub enum Number {
    Real(f64),
    Complex([f64; 2]),
}

/// Read by hand rather than as an untagged enum, so a wrong value says what
/// was expected ("a number or [re, im]") instead of naming the Rust type.
impl<'de> Deserialize<'de> for Number {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        struct V;
        impl<'de> Visitor<'de> for V {
            type Value = Number;
            fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
                f.write_str("a number or [re, im]")
            }
            fn visit_f64<E: de::Error>(self, x: f64) -> Result<Number, E> {
                Ok(Number::Real(x))
            }
            fn visit_i64<E: de::Error>(self, x: i64) -> Result<Number, E> {
                Ok(Number::Real(x as f64))
            }
            fn visit_u64<E: de::Error>(self, x: u64) -> Result<Number, E> {
                Ok(Number::Real(x as f64))
            }
            fn visit_seq<A: SeqAccess<'de>>(self, seq: A) -> Result<Number, A::Error> {
                pair_of(seq, &self).map(Number::Complex)
            }
        }
        d.deserialize_any(V)
    }
}

/// Exactly two numbers from a sequence, or an error in the visitor's words.
fn pair_of<'de, A: SeqAccess<'de>>(mut seq: A, expected: &dyn de::Expected) -> Result<[f64; 2], A::Error> {
    let re: f64 = seq.next_element()?.ok_or_else(|| de::Error::invalid_length(0, expected))?;
    let im: f64 = seq.next_element()?.ok_or_else(|| de::Error::invalid_length(1, expected))?;
    if seq.next_element::<de::IgnoredAny>()?.is_some() {
        return Err(de::Error::invalid_length(3, expected));
    }
    Ok([re, im])
}

impl Number {
    pub fn to_c(self) -> C {
        match self {
            Number::Real(x) => C::new(x, 0.0),
            Number::Complex([re, im]) => C::new(re, im),
        }
    }
}

/// `[re, im]` for output; non-finite parts serialise as `null`.
pub fn pair(z: C) -> [f64; 2] {
    [z.re, z.im]
}

/// A point that may be the point at infinity: `[x, y]` or `"infinity"`.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(untagged)]
pub enum Point {
    Finite([f64; 2]),
    Named(String),
}

/// By hand, like [`Number`], so the error says `[x, y] or "infinity"`.
impl<'de> Deserialize<'de> for Point {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        struct V;
        impl<'de> Visitor<'de> for V {
            type Value = Point;
            fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
                f.write_str("[x, y] or \"infinity\"")
            }
            fn visit_str<E: de::Error>(self, s: &str) -> Result<Point, E> {
                Ok(Point::Named(s.to_string()))
            }
            fn visit_seq<A: SeqAccess<'de>>(self, seq: A) -> Result<Point, A::Error> {
                pair_of(seq, &self).map(Point::Finite)
            }
        }
        d.deserialize_any(V)
    }
}

/// The declared fields of [`FunctionInput`] (`api::shape` checks requests against them).
pub const FUNCTION_FIELDS: &[Field] = &[
    Field::required("f", Expect::Text),
    Field::optional("var", Expect::OrNull(&Expect::Text)),
    Field::optional("params", Expect::Map(&Expect::Complex)),
];

/// The declared fields of a task's own expression (`"F"`, `"X"`) beside `var` and `params`.
pub const fn transform_fields(name: &'static str) -> [Field; 3] {
    [
        Field::required(name, Expect::Text),
        Field::optional("var", Expect::OrNull(&Expect::Text)),
        Field::optional("params", Expect::Map(&Expect::Complex)),
    ]
}

/// `"max_evaluations"`: the work budget, shared by the long tasks.
pub const BUDGET_FIELD: Field = Field::optional("max_evaluations", Expect::OrNull(&Expect::Count));

/// The declared shape of [`ContourShape`].
pub const CONTOUR: Expect = Expect::Tagged(&Tagged {
    tag: "shape",
    variants: &[
        ("circle", "a circle", &[Field::required("center", Expect::Pair), Field::required("radius", Expect::Positive)]),
        (
            "ellipse",
            "an ellipse",
            &[
                Field::required("center", Expect::Pair),
                Field::required("semi_axes", Expect::Exactly(2, &Expect::Positive)),
                Field::optional("angle", Expect::Real),
            ],
        ),
        ("rectangle", "a rectangle", &[Field::required("corners", Expect::Exactly(2, &Expect::Pair))]),
        ("polygon", "a polygon", &[Field::required("vertices", Expect::List(&Expect::Pair))]),
        (
            "half_disc",
            "a half-disc",
            &[
                Field::required("center", Expect::Pair),
                Field::required("radius", Expect::Positive),
                Field::required("direction", Expect::Text),
            ],
        ),
        (
            "keyhole",
            "a keyhole",
            &[
                Field::required("center", Expect::Pair),
                Field::required("inner", Expect::Positive),
                Field::required("outer", Expect::Positive),
                Field::optional("angle", Expect::Real),
                Field::optional("gap", Expect::Positive),
            ],
        ),
    ],
});

/// The declared fields of [`ContourRequest`] (`contour_integral`, `argument_count`).
pub const CONTOUR_REQUEST_FIELDS: &[&[Field]] =
    &[FUNCTION_FIELDS, &[Field::required("contour", CONTOUR), BUDGET_FIELD]];

/// The expression part shared by every request.
#[derive(Debug, Clone, Default, Serialize, Deserialize)]
pub struct FunctionInput {
    /// The expression text.
    pub f: String,
    /// Name of the free variable (`z` by default).
    #[serde(default)]
    pub var: Option<String>,
    /// Named parameters: a number or `[re, im]` each.
    #[serde(default)]
    pub params: BTreeMap<String, Number>,
}

/// A function and a closed contour: the request of `contour_integral` and `argument_count`.
#[derive(Debug, Clone, Serialize, Deserialize)]
pub struct ContourRequest {
    #[serde(flatten)]
    pub function: FunctionInput,
    pub contour: ContourShape,
    #[serde(default)]
    pub max_evaluations: Option<u64>,
}

/// The kind of a point on the wire: `"pole"`, `"removable"`, `"regular"`,
/// `"essential"` or `"branch_point"`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum PointKind {
    Pole,
    Removable,
    Regular,
    Essential,
    BranchPoint,
}

impl From<crate::singular::Kind> for PointKind {
    fn from(k: crate::singular::Kind) -> Self {
        use crate::singular::Kind;
        match k {
            Kind::Pole => PointKind::Pole,
            Kind::Removable => PointKind::Removable,
            Kind::Regular => PointKind::Regular,
            Kind::Essential => PointKind::Essential,
            Kind::BranchPoint => PointKind::BranchPoint,
        }
    }
}

/// How singular points were found: `"rational"` (exact polynomial algebra) or
/// `"numerical"` (sampling methods).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Method {
    Rational,
    Numerical,
}

/// How independent ways relate (the one rule, `crate::ways`): `"single"`,
/// `"agree"`, `"covered"` (consistent only because an error estimate is
/// large) or `"disagree"`. Callers branch on this, never on the sentence.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Verdict {
    Single,
    Agree,
    Covered,
    Disagree,
}

impl From<crate::ways::Agreement> for Verdict {
    fn from(a: crate::ways::Agreement) -> Self {
        use crate::ways::Agreement;
        match a {
            Agreement::Single => Verdict::Single,
            Agreement::Agree => Verdict::Agree,
            Agreement::Covered => Verdict::Covered,
            Agreement::Disagree => Verdict::Disagree,
        }
    }
}

/// A stability reading from the poles (common practice: every pole in the
/// open left half-plane, or inside the unit circle for sequences):
/// `"stable"`, `"marginally_stable"` or `"unstable"`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Stability {
    Stable,
    MarginallyStable,
    Unstable,
}

/// A closed contour as written in requests (`{"shape": "circle", …}`); the
/// core's `contour::Contour` has the same variants and fields.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "shape", rename_all = "snake_case", deny_unknown_fields)]
pub enum ContourShape {
    Circle { center: [f64; 2], radius: f64 },
    Ellipse {
        center: [f64; 2],
        semi_axes: [f64; 2],
        #[serde(default)]
        angle: f64,
    },
    Rectangle { corners: [[f64; 2]; 2] },
    Polygon { vertices: Vec<[f64; 2]> },
    HalfDisc { center: [f64; 2], radius: f64, direction: HalfDiscSide },
    Keyhole {
        center: [f64; 2],
        inner: f64,
        outer: f64,
        #[serde(default)]
        angle: f64,
        /// Half-width of the slit; `contour::keyhole::DEFAULT_GAP_FRACTION` × inner when absent.
        #[serde(default)]
        gap: Option<f64>,
    },
}

/// The side of a half-disc's diameter where its arc lies.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum HalfDiscSide {
    Upper,
    Lower,
    Left,
    Right,
}

impl From<&ContourShape> for crate::contour::Contour {
    fn from(c: &ContourShape) -> Self {
        use crate::contour::Contour;
        match c.clone() {
            ContourShape::Circle { center, radius } => Contour::Circle { center, radius },
            ContourShape::Ellipse { center, semi_axes, angle } => Contour::Ellipse { center, semi_axes, angle },
            ContourShape::Rectangle { corners } => Contour::Rectangle { corners },
            ContourShape::Polygon { vertices } => Contour::Polygon { vertices },
            ContourShape::HalfDisc { center, radius, direction } => {
                use crate::contour::Side;
                let direction = match direction {
                    HalfDiscSide::Upper => Side::Upper,
                    HalfDiscSide::Lower => Side::Lower,
                    HalfDiscSide::Left => Side::Left,
                    HalfDiscSide::Right => Side::Right,
                };
                Contour::HalfDisc { center, radius, direction }
            }
            ContourShape::Keyhole { center, inner, outer, angle, gap } => {
                let gap = gap.unwrap_or(crate::contour::keyhole::DEFAULT_GAP_FRACTION * inner);
                Contour::Keyhole { center, inner, outer, angle, gap }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_contour_reads_from_its_json_shape() {
        let s: ContourShape = serde_json::from_str(r#"{"shape":"ellipse","center":[1,2],"semi_axes":[3,1]}"#).unwrap();
        let c = crate::contour::Contour::from(&s);
        assert_eq!(c, crate::contour::Contour::Ellipse { center: [1.0, 2.0], semi_axes: [3.0, 1.0], angle: 0.0 });
        assert!(serde_json::from_str::<ContourShape>(r#"{"shape":"circle","center":[0,0],"radius":1,"r":2}"#).is_err());
    }

    #[test]
    fn numbers_and_points_read_both_forms_and_say_what_they_expect() {
        // The two forms of docs/contract.md: a bare real or [re, im]; [x, y] or a name.
        assert_eq!(serde_json::from_str::<Number>("2").unwrap(), Number::Real(2.0));
        assert_eq!(serde_json::from_str::<Number>("[1, -0.5]").unwrap(), Number::Complex([1.0, -0.5]));
        assert_eq!(serde_json::from_str::<Point>("\"infinity\"").unwrap(), Point::Named("infinity".into()));
        assert_eq!(serde_json::from_str::<Point>("[3, 4]").unwrap(), Point::Finite([3.0, 4.0]));
        let e = serde_json::from_str::<Number>("\"2\"").unwrap_err().to_string();
        assert!(e.contains("expected a number or [re, im]"), "{e}");
        let e = serde_json::from_str::<Number>("[1, 2, 3]").unwrap_err().to_string();
        assert!(e.contains("a number or [re, im]"), "{e}");
        let e = serde_json::from_str::<Point>("7").unwrap_err().to_string();
        assert!(e.contains("expected [x, y] or \"infinity\""), "{e}");
    }
}

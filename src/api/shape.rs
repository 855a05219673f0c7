//! The shape of every request, checked on the JSON value before serde reads it.
//!
//! Each task declares its fields beside its request struct (a [`Field`] list:
//! name, what it expects, required or not). [`check_request`] walks the JSON
//! value against that list, so that
//!
//! - every shape error names its field path and what the field expects:
//!   `"params.a" must be a number or [re, im], got the string "2"`,
//!   `"t[3]" must be a number, got null`, `"contour.radius" must be a positive number, got -1`;
//! - a field the task does not declare is refused with the nearest declared
//!   name: `unknown field "max_evaluation" in the "contour_integral" request;
//!   did you mean "max_evaluations"?` — a misspelled optional field is never
//!   silently ignored.
//!
//! Type errors are `bad_request`; a number of the right type out of its range
//! (a radius ≤ 0) is `invalid_field`, as everywhere in the contract.
//!
//! Method: a recursive walk of the `serde_json::Value` tree against a static
//! description (common practice); the suggestion is the declared name at the
//! smallest Levenshtein edit distance (V. I. Levenshtein, 1965; the two-row
//! dynamic programme, common practice), offered only when it is close.
//!
//! ```
//! use residuary::api::run_json_text;
//! let (text, is_error) = run_json_text(r#"{"task":"residue","f":"1/z","at":[0,0],"var":"z","param":{}}"#);
//! assert!(is_error);
//! assert!(text.contains(r#"did you mean \"params\"?"#), "{text}");
//! ```

use super::error::{ApiError, ErrorCode};
use serde_json::Value;
use std::fmt;

/// What a field expects.
#[derive(Debug, Clone, Copy)]
pub enum Expect {
    /// A string.
    Text,
    /// Any JSON number.
    Real,
    /// A number > 0 (a number ≤ 0 is `invalid_field`).
    Positive,
    /// A whole number that fits i64.
    Whole,
    /// A whole number ≥ 0 that fits u64.
    Count,
    /// A whole number ≥ 0 that fits u32.
    Count32,
    /// `true` or `false`.
    Bool,
    /// A number or `[re, im]`.
    Complex,
    /// `[x, y]`.
    Pair,
    /// `[x, y]` or a name (`"infinity"`; the name itself is checked by the task).
    Point,
    /// A list, each item as given.
    List(&'static Expect),
    /// A list of at most this many items, each as given (a longer one is
    /// `invalid_field`, refused before the items are converted).
    AtMost(usize, &'static Expect),
    /// A list of exactly this many items, each as given.
    Exactly(usize, &'static Expect),
    /// An object of free names (parameters), each value as given.
    Map(&'static Expect),
    /// An object with these fields (groups of fields, e.g. the function input and the task's own).
    Object(&'static [&'static [Field]]),
    /// An object whose `tag` field picks the variant and its fields (the contour shapes).
    Tagged(&'static Tagged),
    /// `null` or as given.
    OrNull(&'static Expect),
}

/// One declared field of an object.
#[derive(Debug, Clone, Copy)]
pub struct Field {
    pub name: &'static str,
    pub expect: Expect,
    pub required: bool,
}

impl Field {
    pub const fn required(name: &'static str, expect: Expect) -> Field {
        Field { name, expect, required: true }
    }
    pub const fn optional(name: &'static str, expect: Expect) -> Field {
        Field { name, expect, required: false }
    }
}

/// An object told apart by one string field (`"shape": "circle"`).
#[derive(Debug, Clone, Copy)]
pub struct Tagged {
    pub tag: &'static str,
    /// Variant name, its article-led description (`"a circle"`), its fields (besides the tag).
    pub variants: &'static [(&'static str, &'static str, &'static [Field])],
}

impl Expect {
    /// What the field expects, as the end of "… must be ___".
    pub fn describe(&self) -> String {
        match self {
            Expect::Text => "a string".into(),
            Expect::Real => "a number".into(),
            Expect::Positive => "a positive number".into(),
            Expect::Whole => "a whole number (no decimal point)".into(),
            Expect::Count => "a whole number ≥ 0 (no decimal point)".into(),
            Expect::Count32 => format!("a whole number from 0 to {} (no decimal point)", u32::MAX),
            Expect::Bool => "true or false".into(),
            Expect::Complex => "a number or [re, im]".into(),
            Expect::Pair => "[x, y], two numbers".into(),
            Expect::Point => "[x, y] or \"infinity\"".into(),
            Expect::List(item) => format!("a list, each item {}", item.describe()),
            Expect::AtMost(n, item) => format!("a list of at most {n} items, each {}", item.describe()),
            Expect::Exactly(n, item) => format!("a list of {n} items, each {}", item.describe()),
            Expect::Map(item) => format!("an object of names, each value {}", item.describe()),
            Expect::Object(groups) => {
                let names: Vec<String> = groups.iter().flat_map(|g| g.iter()).map(|f| format!("\"{}\"", f.name)).collect();
                format!("an object with the fields {}", names.join(", "))
            }
            Expect::Tagged(t) => format!("an object with \"{}\": {}", t.tag, quoted_list(t.variants.iter().map(|v| v.0))),
            Expect::OrNull(inner) => format!("{} or null", inner.describe()),
        }
    }
}

/// `"a", "b" or "c"`.
fn quoted_list<'a>(names: impl Iterator<Item = &'a str>) -> String {
    joined(names, "or")
}

/// `"a", "b" and "c"` (or with another last word).
fn joined<'a>(names: impl Iterator<Item = &'a str>, last: &str) -> String {
    let names: Vec<String> = names.map(|n| format!("\"{n}\"")).collect();
    match names.len() {
        0 => String::new(),
        1 => names[0].clone(),
        n => format!("{} {last} {}", names[..n - 1].join(", "), names[n - 1]),
    }
}

/// Where a value sits in the request: built on the way down, written only for a message.
#[derive(Clone, Copy)]
enum Path<'a> {
    Root,
    Key(&'a Path<'a>, &'a str),
    Index(&'a Path<'a>, usize),
}

impl fmt::Display for Path<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Path::Root => Ok(()),
            Path::Key(Path::Root, k) => write!(f, "{k}"),
            Path::Key(p, k) => write!(f, "{p}.{k}"),
            Path::Index(p, i) => write!(f, "{p}[{i}]"),
        }
    }
}

/// How a JSON value reads in a message: `null`, `true`, `-1`, `the string "2"`, `a list of 3 items`.
pub fn got(v: &Value) -> String {
    match v {
        Value::Null => "null".into(),
        Value::Bool(b) => b.to_string(),
        Value::Number(n) => n.to_string(),
        Value::String(s) => {
            let short: String = s.chars().take(40).collect();
            let more = if s.chars().count() > 40 { "…" } else { "" };
            format!("the string {}{more}", Value::String(short))
        }
        Value::Array(a) => match a.len() {
            0 => "an empty list".into(),
            1 => "a list of 1 item".into(),
            n => format!("a list of {n} items"),
        },
        Value::Object(_) => "an object".into(),
    }
}

/// Levenshtein distance between two short names (characters, not bytes).
pub fn edit_distance(a: &str, b: &str) -> usize {
    let b: Vec<char> = b.chars().collect();
    let mut prev: Vec<usize> = (0..=b.len()).collect();
    let mut row = vec![0; b.len() + 1];
    for (i, ca) in a.chars().enumerate() {
        row[0] = i + 1;
        for (j, &cb) in b.iter().enumerate() {
            let substitute = prev[j] + usize::from(ca != cb);
            row[j + 1] = substitute.min(prev[j + 1] + 1).min(row[j] + 1);
        }
        std::mem::swap(&mut prev, &mut row);
    }
    prev[b.len()]
}

/// The known name nearest to `name`, if it is close enough to be a slip
/// (same letters up to case, the start of a known name, or at most a third of
/// the letters changed: none for a name of one or two letters).
pub fn did_you_mean<'a>(name: &str, known: impl IntoIterator<Item = &'a str>) -> Option<&'a str> {
    let lower = name.to_lowercase();
    let mut best: Option<(usize, &str)> = None;
    for k in known {
        let kl = k.to_lowercase();
        let d = if kl == lower {
            0
        } else if lower.chars().count() >= 3 && kl.starts_with(&lower) {
            1
        } else {
            edit_distance(&lower, &kl)
        };
        if best.map_or(true, |(bd, _)| d < bd) {
            best = Some((d, k));
        }
    }
    let allowed = name.chars().count() / 3;
    best.filter(|&(d, _)| d <= allowed).map(|(_, k)| k)
}

fn bad(path: &Path, expect: &Expect, v: &Value) -> ApiError {
    ApiError::new(ErrorCode::BadRequest, format!("\"{path}\" must be {}, got {}", expect.describe(), got(v)))
}

/// Check a whole request of `task` against its declared field groups (the
/// `"task"` field itself is always allowed).
pub fn check_request(task: &str, value: &Value, groups: &[&[Field]]) -> Result<(), ApiError> {
    let Value::Object(_) = value else {
        return Err(ApiError::new(ErrorCode::BadRequest, format!("the \"{task}\" request must be a JSON object, got {}", got(value))));
    };
    const TASK: &[Field] = &[Field::optional("task", Expect::Text)];
    let mut all: Vec<&[Field]> = vec![TASK];
    all.extend_from_slice(groups);
    check_object(value, &all, &Path::Root, &format!("the \"{task}\" request"))
}

fn check_object(v: &Value, groups: &[&[Field]], path: &Path, place: &str) -> Result<(), ApiError> {
    let Value::Object(map) = v else { unreachable!("checked by the caller") };
    let fields = || groups.iter().flat_map(|g| g.iter());
    for key in map.keys() {
        if !fields().any(|f| f.name == key) {
            let takes_params = fields().any(|f| f.name == "params");
            let hint = match did_you_mean(key, fields().map(|f| f.name)) {
                Some(near) => format!("did you mean \"{near}\"?"),
                None if takes_params && matches!(map[key], Value::Number(_) | Value::Array(_)) => format!(
                    "the fields are {}; a parameter of the expression goes in \"params\": {{\"{key}\": …}}",
                    joined(fields().map(|f| f.name), "and")
                ),
                None => format!("the fields are {}", joined(fields().map(|f| f.name), "and")),
            };
            return Err(ApiError::new(ErrorCode::BadRequest, format!("unknown field \"{key}\" in {place}; {hint}")));
        }
    }
    for field in fields() {
        let at = Path::Key(path, field.name);
        match map.get(field.name) {
            Some(value) => check(value, &field.expect, &at)?,
            None if field.required => {
                return Err(ApiError::new(
                    ErrorCode::BadRequest,
                    format!("\"{at}\" is missing: it must be {}", field.expect.describe()),
                ))
            }
            None => {}
        }
    }
    Ok(())
}

fn check(v: &Value, expect: &Expect, path: &Path) -> Result<(), ApiError> {
    let ok = match (expect, v) {
        (Expect::Text, Value::String(_)) => true,
        (Expect::Real, Value::Number(_)) => true,
        (Expect::Positive, Value::Number(n)) => {
            if n.as_f64().is_some_and(|x| x > 0.0) {
                true
            } else {
                return Err(ApiError::invalid(format!("\"{path}\" must be a positive number, got {n}")));
            }
        }
        (Expect::Whole, Value::Number(n)) => n.as_i64().is_some(),
        (Expect::Count, Value::Number(n)) => n.as_u64().is_some(),
        (Expect::Count32, Value::Number(n)) => n.as_u64().is_some_and(|k| k <= u32::MAX as u64),
        (Expect::Bool, Value::Bool(_)) => true,
        (Expect::Complex, Value::Number(_)) => true,
        (Expect::Complex | Expect::Pair | Expect::Point, Value::Array(items)) if items.len() == 2 => {
            return each(items, &Expect::Real, path)
        }
        (Expect::Point, Value::String(_)) => true,
        (Expect::List(item), Value::Array(items)) => return each(items, item, path),
        (Expect::AtMost(n, item), Value::Array(items)) => {
            if items.len() > *n {
                return Err(ApiError::invalid(format!(
                    "\"{path}\" has {} items; at most {n} per request: split the request",
                    items.len()
                )));
            }
            return each(items, item, path);
        }
        (Expect::Exactly(n, item), Value::Array(items)) if items.len() == *n => return each(items, item, path),
        (Expect::Map(item), Value::Object(map)) => {
            for (k, x) in map {
                check(x, item, &Path::Key(path, k))?;
            }
            return Ok(());
        }
        (Expect::Object(groups), Value::Object(_)) => return check_object(v, groups, path, &format!("\"{path}\"")),
        (Expect::Tagged(t), Value::Object(map)) => return check_tagged(v, map, t, path),
        (Expect::OrNull(_), Value::Null) => true,
        (Expect::OrNull(inner), _) if kind_fits(inner, v) => return check(v, inner, path),
        _ => false,
    };
    if ok {
        Ok(())
    } else {
        Err(bad(path, expect, v))
    }
}

/// Whether the JSON kind of `v` is one `expect` may take (a deeper look is `check`'s).
fn kind_fits(expect: &Expect, v: &Value) -> bool {
    match expect {
        Expect::Text => v.is_string(),
        Expect::Real | Expect::Positive | Expect::Whole | Expect::Count | Expect::Count32 => v.is_number(),
        Expect::Bool => v.is_boolean(),
        Expect::Complex => v.is_number() || v.is_array(),
        Expect::Point => v.is_string() || v.is_array(),
        Expect::Pair | Expect::List(_) | Expect::AtMost(..) | Expect::Exactly(..) => v.is_array(),
        Expect::Map(_) | Expect::Object(_) | Expect::Tagged(_) => v.is_object(),
        Expect::OrNull(inner) => v.is_null() || kind_fits(inner, v),
    }
}

fn each(items: &[Value], item: &Expect, path: &Path) -> Result<(), ApiError> {
    for (i, x) in items.iter().enumerate() {
        check(x, item, &Path::Index(path, i))?;
    }
    Ok(())
}

fn check_tagged(v: &Value, map: &serde_json::Map<String, Value>, t: &Tagged, path: &Path) -> Result<(), ApiError> {
    let at = Path::Key(path, t.tag);
    let names = || t.variants.iter().map(|x| x.0);
    let tag = match map.get(t.tag) {
        None => {
            return Err(ApiError::new(
                ErrorCode::BadRequest,
                format!("\"{at}\" is missing: it must be {}", quoted_list(names())),
            ))
        }
        Some(Value::String(s)) => s.as_str(),
        Some(other) => {
            return Err(ApiError::new(ErrorCode::BadRequest, format!("\"{at}\" must be {}, got {}", quoted_list(names()), got(other))))
        }
    };
    let Some((_, what, fields)) = t.variants.iter().find(|x| x.0 == tag) else {
        let hint = did_you_mean(tag, names()).map(|n| format!("; did you mean \"{n}\"?")).unwrap_or_default();
        return Err(ApiError::new(
            ErrorCode::BadRequest,
            format!("\"{at}\" must be {}, got the string \"{tag}\"{hint}", quoted_list(names())),
        ));
    };
    // The tag is the one field every variant has; declared here so it is never "unknown".
    let tag_field = [Field::required(t.tag, Expect::Text)];
    check_object(v, &[&tag_field, fields], path, &format!("\"{path}\" ({what})"))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn edit_distance_counts_insertions_deletions_and_substitutions() {
        // Worked by hand from the definition (Levenshtein 1965): kitten → sitting is 3
        // (two substitutions and one insertion), the textbook example.
        assert_eq!(edit_distance("kitten", "sitting"), 3);
        assert_eq!(edit_distance("", "abc"), 3);
        assert_eq!(edit_distance("max_evaluation", "max_evaluations"), 1);
        assert_eq!(edit_distance("outter", "outer"), 1);
        assert_eq!(edit_distance("same", "same"), 0);
    }

    #[test]
    fn suggestions_only_when_close() {
        let known = ["contour", "max_evaluations", "f", "var", "params"];
        assert_eq!(did_you_mean("max_evaluation", known), Some("max_evaluations"));
        assert_eq!(did_you_mean("countour", known), Some("contour"));
        assert_eq!(did_you_mean("F", known), Some("f"), "case only");
        assert_eq!(did_you_mean("max", known), Some("max_evaluations"), "the start of a name");
        assert_eq!(did_you_mean("zeta", known), None, "nothing near");
        assert_eq!(did_you_mean("a", known), None, "one letter is too short to guess from");
    }

    #[test]
    fn values_read_as_the_user_wrote_them() {
        assert_eq!(got(&serde_json::json!("2")), "the string \"2\"");
        assert_eq!(got(&serde_json::json!(null)), "null");
        assert_eq!(got(&serde_json::json!(-1)), "-1");
        assert_eq!(got(&serde_json::json!([1, 2, 3])), "a list of 3 items");
    }
}

//! Lexer: turns expression text into tokens with character spans `[start, end)`.
//!
//! Spans count characters (Unicode scalar values), not bytes, so the page can
//! underline the right place even after non-ASCII input.

use super::ExprError;

/// Longest accepted expression, in characters.
pub const MAX_LENGTH: usize = 10_000;

/// One token kind.
#[derive(Debug, Clone, PartialEq)]
pub enum Tok {
    Num(f64),
    Ident(String),
    Plus,
    Minus,
    Star,
    Slash,
    Caret,
    LParen,
    RParen,
}

/// A token with its character span.
#[derive(Debug, Clone, PartialEq)]
pub struct Token {
    pub tok: Tok,
    pub span: (usize, usize),
}

impl Tok {
    /// How the token reads in a message.
    pub fn describe(&self) -> String {
        match self {
            Tok::Num(_) => "a number".to_string(),
            Tok::Ident(s) => format!("'{s}'"),
            Tok::Plus => "'+'".into(),
            Tok::Minus => "'-'".into(),
            Tok::Star => "'*'".into(),
            Tok::Slash => "'/'".into(),
            Tok::Caret => "'^'".into(),
            Tok::LParen => "'('".into(),
            Tok::RParen => "')'".into(),
        }
    }
}

fn err(message: impl Into<String>, start: usize, end: usize) -> ExprError {
    ExprError {
        message: message.into(),
        span: Some((start, end)),
    }
}

/// Advice for a character we do not read, so the message says what to type instead.
fn advice_for(c: char) -> Option<&'static str> {
    Some(match c {
        '²' => "superscripts are not read; write ^2, e.g. z^2",
        '³' => "superscripts are not read; write ^3, e.g. z^3",
        '¹' | '⁰' | '⁴' | '⁵' | '⁶' | '⁷' | '⁸' | '⁹' | '⁻' | '⁺' => {
            "superscripts are not read; write the power with ^, e.g. z^4"
        }
        'π' | 'Π' => "write pi for the constant π",
        '·' | '⋅' | '∗' => "write * for multiplication",
        '÷' | '∕' => "write / for division",
        '√' => "write sqrt(...) for the square root",
        'ⅈ' | 'ⅉ' => "write i for the imaginary unit",
        '∞' => "infinity cannot be typed into f; write a function of the variable",
        '[' | ']' | '{' | '}' => "use round parentheses ( ) for grouping",
        ',' => "each function takes one argument; ',' is not used in expressions",
        ';' => "write one expression; ';' is not used",
        '=' => "type only the right-hand side, e.g. (z+1)/(z^2+4), not f = ...",
        '|' => "|...| is the modulus, which is not complex-differentiable; residues need a meromorphic function",
        '!' => "write gamma(n+1) instead of n!",
        _ => return None,
    })
}

/// Characters that show as nothing, as a plain space, or as an ASCII operator
/// they are not: named by code point so the message can point at them
/// (names from the Unicode character database), with what to do instead.
fn invisible_or_look_alike(c: char) -> Option<(&'static str, &'static str)> {
    Some(match c {
        '\u{200B}' => ("zero-width space", "delete it"),
        '\u{200C}' => ("zero-width non-joiner", "delete it"),
        '\u{200D}' => ("zero-width joiner", "delete it"),
        '\u{2060}' => ("word joiner", "delete it"),
        '\u{200E}' => ("left-to-right mark", "delete it"),
        '\u{200F}' => ("right-to-left mark", "delete it"),
        '\u{FEFF}' => ("byte-order mark (zero-width no-break space)", "delete it"),
        '\u{00AD}' => ("soft hyphen", "delete it"),
        '\u{2212}' => ("minus sign", "type the ASCII '-' instead"),
        '\u{2013}' => ("en dash", "this dash is not a minus sign; type the ASCII '-' instead"),
        '\u{2014}' => ("em dash", "this dash is not a minus sign; type the ASCII '-' instead"),
        '\u{00D7}' => ("multiplication sign", "write * for multiplication"),
        _ => return None,
    })
}

/// Split `src` into tokens. Errors carry character spans.
pub fn lex(src: &str) -> Result<Vec<Token>, ExprError> {
    let chars: Vec<char> = src.chars().collect();
    if chars.len() > MAX_LENGTH {
        return Err(ExprError {
            message: format!(
                "the expression is {} characters long; the limit is {MAX_LENGTH}: shorten it",
                chars.len()
            ),
            span: None,
        });
    }
    let mut out = Vec::new();
    let mut i = 0;
    while i < chars.len() {
        let c = chars[i];
        // Before the whitespace test (no-break spaces, pasted from a wiki, are read as spaces).
        if let Some((name, todo)) = invisible_or_look_alike(c) {
            return Err(err(format!("U+{:04X} {name} at character {i}; {todo}", c as u32), i, i + 1));
        }
        if c.is_whitespace() {
            i += 1;
            continue;
        }
        let start = i;
        let single = |t: Tok| Token {
            tok: t,
            span: (start, start + 1),
        };
        match c {
            '+' => out.push(single(Tok::Plus)),
            '-' => out.push(single(Tok::Minus)),
            '*' => {
                if chars.get(i + 1) == Some(&'*') {
                    return Err(err(
                        "'**' is not a power operator here; write ^ for powers, e.g. z^2",
                        i,
                        i + 2,
                    ));
                }
                out.push(single(Tok::Star))
            }
            '/' => out.push(single(Tok::Slash)),
            '^' => out.push(single(Tok::Caret)),
            '(' => out.push(single(Tok::LParen)),
            ')' => out.push(single(Tok::RParen)),
            '0'..='9' | '.' => {
                let (value, end) = lex_number(&chars, i)?;
                out.push(Token {
                    tok: Tok::Num(value),
                    span: (start, end),
                });
                i = end;
                continue;
            }
            c if c.is_ascii_alphabetic() || c == '_' => {
                let mut end = i;
                while end < chars.len() && (chars[end].is_ascii_alphanumeric() || chars[end] == '_')
                {
                    end += 1;
                }
                let name: String = chars[i..end].iter().collect();
                out.push(Token {
                    tok: Tok::Ident(name),
                    span: (start, end),
                });
                i = end;
                continue;
            }
            other => {
                let message = match advice_for(other) {
                    Some(a) => format!("unexpected character '{other}': {a}"),
                    None => format!(
                        "unexpected character '{other}': use numbers, names, + - * / ^ and parentheses"
                    ),
                };
                return Err(err(message, i, i + 1));
            }
        }
        i += 1;
    }
    Ok(out)
}

/// Read a number starting at `i`: `2`, `2.5`, `.5`, `1e-3`, `2E+4`.
/// An `e` counts as an exponent only when a digit (optionally after a sign)
/// follows; otherwise `2e` is the number 2 followed by the constant e.
fn lex_number(chars: &[char], i: usize) -> Result<(f64, usize), ExprError> {
    let mut end = i;
    let digits = |mut k: usize| {
        while k < chars.len() && chars[k].is_ascii_digit() {
            k += 1;
        }
        k
    };
    end = digits(end);
    let mut seen_digit = end > i;
    if end < chars.len() && chars[end] == '.' {
        let after = digits(end + 1);
        seen_digit |= after > end + 1;
        end = after;
        if end < chars.len() && chars[end] == '.' {
            return Err(err(
                "a number has two decimal points: remove one",
                i,
                end + 1,
            ));
        }
    }
    if !seen_digit {
        return Err(err(
            "a lone '.' is not a number: write a digit, e.g. 0.5",
            i,
            end,
        ));
    }
    if end < chars.len() && (chars[end] == 'e' || chars[end] == 'E') {
        let mut k = end + 1;
        if k < chars.len() && (chars[k] == '+' || chars[k] == '-') {
            k += 1;
        }
        if k < chars.len() && chars[k].is_ascii_digit() {
            end = digits(k);
        }
    }
    let text: String = chars[i..end].iter().collect();
    match text.parse::<f64>() {
        Ok(v) if v.is_finite() => Ok((v, end)),
        _ => Err(err(
            format!("the number {text} is too large for double precision (about 1.8e308): use a smaller one"),
            i,
            end,
        )),
    }
}

//! Parser tests: precedence, implicit multiplication, every error path with
//! its character span, limits, and a random-input no-panic test.

use residuary::expr::{parse, BinOp, Constant, Expr, ExprError, Function, Node};
use residuary::C;

fn err(src: &str) -> ExprError {
    match Function::compile(src, "z", &[]) {
        Ok(_) => panic!("{src:?} should fail"),
        Err(e) => e,
    }
}

fn check_err(src: &str, span: (usize, usize), needle: &str) {
    let e = err(src);
    assert_eq!(e.span, Some(span), "{src:?}: {}", e.message);
    assert!(
        e.message.contains(needle),
        "{src:?}: message {:?} lacks {needle:?}",
        e.message
    );
}

fn val(src: &str, z: C) -> C {
    Function::compile(src, "z", &[])
        .unwrap_or_else(|e| panic!("{src}: {e}"))
        .eval(z)
}

fn shape(e: &Expr) -> String {
    match &e.node {
        Node::Num(v) => format!("{v}"),
        Node::Const(Constant::I) => "i".into(),
        Node::Const(Constant::Pi) => "pi".into(),
        Node::Const(Constant::E) => "e".into(),
        Node::Name(n) => n.clone(),
        Node::Neg(a) => format!("(-{})", shape(a)),
        Node::Call(f, a) => format!("{}({})", f.name(), shape(a)),
        Node::Binary(op, a, b) => {
            let o = match op {
                BinOp::Add => "+",
                BinOp::Sub => "-",
                BinOp::Mul => "*",
                BinOp::Div => "/",
                BinOp::Pow => "^",
            };
            format!("({}{o}{})", shape(a), shape(b))
        }
    }
}

fn tree(src: &str) -> String {
    shape(&parse(src).unwrap_or_else(|e| panic!("{src}: {e}")))
}

#[test]
fn precedence_and_associativity() {
    // Conventional precedence (common practice).
    assert_eq!(tree("2^3^2"), "(2^(3^2))");
    assert_eq!(tree("-z^2"), "(-(z^2))");
    assert_eq!(tree("+z"), "z");
    assert_eq!(tree("1-2-3"), "((1-2)-3)");
    assert_eq!(tree("1/2/3"), "((1/2)/3)");
    assert_eq!(tree("1+2*3^-1"), "(1+(2*(3^(-1))))");
    assert_eq!(tree("z^-2"), "(z^(-2))");
    assert_eq!(tree("2*-z"), "(2*(-z))");
    assert_eq!(tree("sin(z)^2"), "(sin(z)^2)");
    assert_eq!(tree("ln(z)"), "log(z)");
    assert_eq!(val("2^3^2", C::new(0.0, 0.0)), C::new(512.0, 0.0));
    assert_eq!(val("-2^2", C::new(0.0, 0.0)), C::new(-4.0, 0.0));
}

#[test]
fn numbers() {
    let z0 = C::new(0.0, 0.0);
    assert_eq!(val("2.5", z0), C::new(2.5, 0.0));
    assert_eq!(val(".5", z0), C::new(0.5, 0.0));
    assert_eq!(val("1e-3", z0), C::new(1e-3, 0.0));
    assert_eq!(val("2E+4", z0), C::new(2e4, 0.0));
    assert_eq!(val("2e-3", z0), C::new(0.002, 0.0));
    // 2e is 2 times e; 2e+z is 2e + z
    assert_eq!(val("2e", z0), C::new(2.0 * std::f64::consts::E, 0.0));
    assert_eq!(
        val("2e+z", C::new(1.0, 0.0)),
        C::new(2.0 * std::f64::consts::E + 1.0, 0.0)
    );
    assert_eq!(val("3i", z0), C::new(0.0, 3.0));
    assert_eq!(val("3pi", z0), C::new(3.0 * std::f64::consts::PI, 0.0));
}

#[test]
fn implicit_multiplication() {
    assert_eq!(tree("2z"), "(2*z)");
    assert_eq!(tree("2.5s"), "(2.5*s)");
    assert_eq!(tree("2(z+1)"), "(2*(z+1))");
    assert_eq!(tree("(s+1)(s+2)"), "((s+1)*(s+2))");
    assert_eq!(tree("(s+1)s"), "((s+1)*s)");
    assert_eq!(tree("2z^2"), "(2*(z^2))");
    assert_eq!(tree("1/2z"), "((1/2)*z)");
    assert_eq!(tree("sin(z)(z+1)"), "(sin(z)*(z+1))");
    check_err("z z", (0, 3), "put * between 'z' and 'z'");
    check_err("z 2", (0, 3), "put * between 'z' and a number");
    check_err("2 3", (0, 3), "put * between a number and a number");
    check_err("(z+1)2", (4, 6), "put * between ')' and a number");
    check_err("pi(z)", (0, 3), "put * between 'pi' and '('");
}

#[test]
fn error_messages_and_spans() {
    check_err("", (0, 0), "empty expression");
    check_err("   ", (0, 3), "empty expression");
    check_err("z**2", (1, 3), "write ^ for powers");
    check_err(
        "z+",
        (2, 2),
        "unexpected end of input: an operand is missing after '+'",
    );
    check_err("z^", (2, 2), "operand is missing after '^'");
    check_err("(z+1", (0, 1), "expected ')' to close '(' opened at 0");
    check_err("z*(z+1", (2, 3), "expected ')' to close '(' opened at 2");
    check_err("z+1)", (3, 4), "unmatched ')'");
    check_err("()", (0, 2), "empty parentheses");
    check_err("sin()", (0, 5), "needs an argument");
    check_err("sin z", (0, 3), "write sin(...)");
    check_err("z*/2", (2, 3), "an operand is missing between '*' and '/'");
    check_err("*z", (0, 1), "cannot start with '*'");
    check_err(
        "s(z+1)",
        (0, 2),
        "unknown function 's'; write s*(...) to multiply",
    );
    check_err(
        "z + wn",
        (4, 6),
        "unknown name 'wn': add it as a parameter or check the spelling",
    );
    check_err("1e999", (0, 5), "too large");
    check_err("1..2", (0, 3), "two decimal points");
    check_err("z+.", (2, 3), "lone '.'");
    check_err("z#2", (1, 2), "unexpected character '#'");
    check_err("1/0 + z", (0, 3), "infinity or an undefined number");
    check_err("gamma(0)*z", (0, 8), "infinity or an undefined number");
    check_err("f(z) = z", (5, 6), "right-hand side");
    check_err("f(z)", (0, 2), "unknown function 'f'");
    check_err("z = 2", (2, 3), "right-hand side");
    check_err("max(z)", (0, 3), "not complex-differentiable");
    check_err("max(z, 1)", (5, 6), "one argument");
}

#[test]
fn non_analytic_functions_are_refused() {
    for name in [
        "abs", "re", "im", "conj", "arg", "Re", "Im", "real", "imag", "norm",
    ] {
        let src = format!("1 + {name}(z)");
        let e = err(&src);
        assert_eq!(e.span, Some((4, 4 + name.len())), "{src}");
        assert!(
            e.message
                .contains("is not complex-differentiable, so residues are undefined"),
            "{}",
            e.message
        );
        assert!(e.message.contains("meromorphic"));
    }
    check_err("|z|", (0, 1), "modulus");
}

#[test]
fn spans_count_characters_not_bytes() {
    // 'π' and '²' are 2 bytes in UTF-8 but one character each.
    check_err("z²+1", (1, 2), "write ^2");
    check_err("2π", (1, 2), "write pi");
    check_err("ππ z z", (0, 1), "pi");
    check_err("π²+ z z", (0, 1), "pi");
    check_err("é+1", (0, 1), "unexpected character 'é'");
    check_err("(z−1)", (2, 3), "ASCII '-'");
    check_err("√z", (0, 1), "sqrt");
    // error after non-ASCII text inside a comment-free expression: span of 'wn' in chars
    let e = Function::compile("2*z +  wn", "z", &[]).unwrap_err();
    assert_eq!(e.span, Some((7, 9)));
}

#[test]
fn variable_and_parameter_names() {
    let p = |n: &str| vec![(n.to_string(), C::new(1.0, 0.0))];
    assert!(Function::compile("s^2+1", "s", &[]).is_ok());
    assert!(Function::compile("wn*t", "t", &p("wn")).is_ok());
    let e = Function::compile("z", "z", &p("e")).unwrap_err();
    assert!(e.message.contains("built-in constant"), "{}", e.message);
    let e = Function::compile("pi*2", "pi", &[]).unwrap_err();
    assert!(e.message.contains("built-in constant"));
    assert_eq!(e.span, Some((0, 2)));
    let e = Function::compile("z+sin(z)", "sin", &[]).unwrap_err();
    assert!(e.message.contains("function name"));
    let e = Function::compile("z", "2x", &[]).unwrap_err();
    assert!(e.message.contains("not a valid name"));
    let e = Function::compile("z+a", "z", &p("z")).unwrap_err();
    assert!(e.message.contains("both the variable and a parameter"));
    // using z when the variable is s says so
    let e = Function::compile("z+1", "s", &[]).unwrap_err();
    assert!(e.message.contains("the variable is 's'"), "{}", e.message);
    assert_eq!(e.span, Some((0, 1)));
}

#[test]
fn limits() {
    // length
    let long = "z+".repeat(6000) + "z";
    let e = err(&long);
    assert!(e.message.contains("limit is 10000"), "{}", e.message);
    // 100 000 '(' must not overflow the stack
    let e = err(&"(".repeat(100_000));
    assert!(e.message.contains("limit"));
    // nesting depth within the length limit
    let deep = "(".repeat(300) + "z" + &")".repeat(300);
    let e = err(&deep);
    assert!(e.message.contains("nests deeper than 200"), "{}", e.message);
    let signs = "-".repeat(500) + "z";
    assert!(err(&signs).message.contains("nests deeper"));
    let towers = "z^".repeat(400) + "2";
    assert!(err(&towers).message.contains("nests deeper"));
    // moderate nesting is fine
    let ok = "(".repeat(150) + "z" + &")".repeat(150);
    assert_eq!(val(&ok, C::new(2.0, 0.0)), C::new(2.0, 0.0));
    // a long chain within the length limit but beyond the tree-depth limit
    let chain = "z+".repeat(2000) + "z";
    assert!(err(&chain).message.contains("chained operations"));
    let fine = "z+".repeat(1000) + "z";
    assert_eq!(val(&fine, C::new(1.0, 0.0)), C::new(1001.0, 0.0));
}

#[test]
fn random_strings_never_panic() {
    let alphabet: Vec<char> = "z s()+-*/^.,e1 2i9pisinlogexpgamma_abs|²π0E"
        .chars()
        .collect();
    let mut seed: u64 = 0x9E37_79B9_7F4A_7C15;
    let mut next = || {
        seed ^= seed << 13;
        seed ^= seed >> 7;
        seed ^= seed << 17;
        seed
    };
    let mut ok = 0;
    for _ in 0..5000 {
        let len = (next() % 24) as usize;
        let s: String = (0..len)
            .map(|_| alphabet[(next() % alphabet.len() as u64) as usize])
            .collect();
        if let Ok(f) = Function::compile(&s, "z", &[]) {
            ok += 1;
            let _ = f.eval_d(C::new(0.3, -0.2));
            let _ = f.rational();
        } else if let Err(e) = Function::compile(&s, "z", &[]) {
            let n = s.chars().count();
            if let Some((a, b)) = e.span {
                assert!(a <= b && b <= n, "{s:?}: span {a}..{b} outside 0..{n}");
            }
            assert!(!e.message.is_empty());
        }
    }
    assert!(
        ok > 50,
        "the fuzz alphabet should produce some valid expressions, got {ok}"
    );
}

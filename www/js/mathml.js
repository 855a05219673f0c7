// MathML built as DOM nodes (no library): the one element builder and number writer the typeset
// formulas share (principal parts, Laurent series, real integrals and their derivations).

import { fmtReal } from './format.js';

export const MATHML_NS = 'http://www.w3.org/1998/Math/MathML';

/** A MathML element `tag` with the children given (strings become text nodes). */
export function mathEl(tag, ...children) {
  const node = document.createElementNS(MATHML_NS, tag);
  for (const c of children) node.append(typeof c === 'string' ? document.createTextNode(c) : c);
  return node;
}

/** |x| to 10 significant digits as <mn>; an exponent written as × 10^k. */
export function mathMagnitude(x) {
  const t = fmtReal(Math.abs(x), 10);
  const e = /^([\d.]+)e([−-]?\d+)$/.exec(t);
  if (!e) return mathEl('mn', t);
  return mathEl('mrow', mathEl('mn', e[1]), mathEl('mo', '×'), mathEl('msup', mathEl('mn', '10'), mathEl('mn', e[2].replace('-', '−'))));
}

/** A complex coefficient as MathML: {node, negative (the leading sign is written outside, by the
 *  caller), one (it reads 1 to the 10 digits shown: left out before a power)}; parentheses when it
 *  has two parts. */
export function mathCoefficient(c) {
  const [re, im] = c;
  if (im === 0) return { node: mathMagnitude(re), negative: re < 0, one: fmtReal(Math.abs(re), 10) === '1' };
  if (re === 0) {
    const node = mathEl('mrow');
    if (Math.abs(im) !== 1) node.append(mathMagnitude(im), mathEl('mo', '\u2062'));
    node.append(mathEl('mi', 'i'));
    return { node, negative: im < 0, one: false };
  }
  const node = mathEl('mrow', mathEl('mo', '('));
  if (re < 0) node.append(mathEl('mo', '−'));
  node.append(mathMagnitude(re), mathEl('mo', im < 0 ? '−' : '+'));
  if (Math.abs(im) !== 1) node.append(mathMagnitude(im), mathEl('mo', '\u2062'));
  node.append(mathEl('mi', 'i'), mathEl('mo', ')'));
  return { node, negative: false, one: false };
}

/** (v − a) as MathML: v alone for a = 0, v ∓ |a| for a real a, v ∓ |b|i for an imaginary one,
 *  v ∓ |Re a| ∓ |Im a|i otherwise. */
export function mathShift(v, a) {
  const [re, im] = a;
  if (re === 0 && im === 0) return mathEl('mi', v);
  const row = mathEl('mrow', mathEl('mi', v));
  if (im === 0) { row.append(mathEl('mo', re > 0 ? '−' : '+'), mathMagnitude(re)); return row; }
  if (re === 0) {
    row.append(mathEl('mo', im > 0 ? '−' : '+'));
    if (Math.abs(im) !== 1) row.append(mathMagnitude(im), mathEl('mo', '\u2062'));
    row.append(mathEl('mi', 'i'));
    return row;
  }
  row.append(mathEl('mo', re > 0 ? '−' : '+'), mathMagnitude(re), mathEl('mo', im > 0 ? '−' : '+'));
  if (Math.abs(im) !== 1) row.append(mathMagnitude(im), mathEl('mo', '\u2062'));
  row.append(mathEl('mi', 'i'));
  return row;
}

/** A coefficient node without its outer parentheses (over a fraction bar they are not needed). */
function bareCoefficient(node) {
  const kids = Array.from(node.childNodes || []);
  const isMo = (k, t) => k && k.localName === 'mo' && k.textContent === t;
  if (kids.length > 2 && isMo(kids[0], '(') && isMo(kids[kids.length - 1], ')')) {
    const row = mathEl('mrow');
    for (const k of kids.slice(1, -1)) row.append(k);
    return row;
  }
  return node;
}

/** A complex number's parts below `floor` written as 0. */
function trimPair(z, floor) {
  return [Math.abs(z[0]) <= floor ? 0 : z[0], Math.abs(z[1]) <= floor ? 0 : z[1]];
}

/** The partial fractions of a `partial_fractions` response as <math>: `lhs` (e.g. f(z)) = the
 *  polynomial part (ascending coefficients) + Σ c/(v − a)^k. Parts of a location below 10⁻¹² of
 *  its size, and of a coefficient below 10⁻¹² of the largest, are written as 0. */
export function partialFractionsMathML(v, resp) {
  const math = mathEl('math');
  math.setAttribute('display', 'block');
  const row = mathEl('mrow', mathEl('mi', 'f'), mathEl('mo', '('), mathEl('mi', v), mathEl('mo', ')'), mathEl('mo', '='));
  const poly = Array.isArray(resp.polynomial) ? resp.polynomial : [];
  const terms = Array.isArray(resp.terms) ? resp.terms : [];
  const size = Math.max(0, ...poly.concat(terms.map((t) => t.c)).map((c) => Math.hypot(c[0], c[1])));
  const cFloor = 1e-12 * size;
  let first = true;
  const sign = (negative) => {
    if (!first) row.append(mathEl('mo', negative ? '−' : '+'));
    else if (negative) row.append(mathEl('mo', '−'));
    first = false;
  };
  // the polynomial part, highest power first
  for (let k = poly.length - 1; k >= 0; k--) {
    const c = trimPair(poly[k], cFloor);
    if (c[0] === 0 && c[1] === 0) continue;
    const { node, negative, one } = mathCoefficient(c);
    sign(negative);
    const power = k === 0 ? null : k === 1 ? mathEl('mi', v) : mathEl('msup', mathEl('mi', v), mathEl('mn', String(k)));
    if (!power) row.append(node);
    else if (one) row.append(power);
    else row.append(node, mathEl('mo', '\u2062'), power);
  }
  for (const t of terms) {
    const c = trimPair(t.c, cFloor);
    if (c[0] === 0 && c[1] === 0) continue;
    const at = trimPair(t.at, 1e-12 * Math.hypot(t.at[0], t.at[1]));
    const { node, negative, one } = mathCoefficient(c);
    sign(negative);
    const base = mathShift(v, at);
    const bare = at[0] === 0 && at[1] === 0;
    const power = t.power === 1 ? base : mathEl('msup', bare ? base : mathEl('mrow', mathEl('mo', '('), base, mathEl('mo', ')')), mathEl('mn', String(t.power)));
    row.append(mathEl('mfrac', one ? mathEl('mn', '1') : bareCoefficient(node), power));
  }
  if (first) row.append(mathEl('mn', '0'));
  math.append(row);
  return math;
}

// ---- closed forms: the core's text read once into MathML ----------------------------------------

/** The tokens of a closed form: numbers (with an imaginary unit glued on: 2i), names (with primes:
 *  δ''), operators and brackets. Throws on anything else. */
function closedFormTokens(text) {
  const out = [];
  const re = /\s*(?:(\d+(?:\.\d+)?(?:[eE][-+−]?\d+)?)(i(?![A-Za-z]))?|([A-Za-zδ][A-Za-z0-9]*'*)|([-+*/^()[\],−]))/y;
  let m;
  re.lastIndex = 0;
  while (re.lastIndex < text.length) {
    if (/^\s*$/.test(text.slice(re.lastIndex))) break;
    m = re.exec(text);
    if (!m) throw new Error(`cannot read the closed form at character ${re.lastIndex}`);
    if (m[1] !== undefined) out.push({ t: 'num', v: m[1], imag: Boolean(m[2]) });
    else if (m[3] !== undefined) out.push({ t: 'name', v: m[3] });
    else out.push({ t: 'op', v: m[4] === '−' ? '-' : m[4] });
  }
  return out;
}

/** A closed form (the core's `closed_form`: numbers, t or n, + − * / ^, exp, sin, cos, H(·), δ(·),
 *  δ[·], δ', δ^(k)) read into a tree: {k: 'num'|'name'|'call'|'group'|'neg'|'add'|'mul'|'div'|'pow', …}. */
export function parseClosedForm(text) {
  const toks = closedFormTokens(text);
  let i = 0;
  const peek = () => toks[i];
  const isOp = (v) => toks[i] && toks[i].t === 'op' && toks[i].v === v;
  const expect = (v) => { if (!isOp(v)) throw new Error(`expected ${v} in the closed form`); i++; };
  function sum() {
    let a = product();
    const terms = [{ sign: 1, a }];
    while (isOp('+') || isOp('-')) { const s = toks[i++].v === '+' ? 1 : -1; terms.push({ sign: s, a: product() }); }
    return terms.length === 1 ? a : { k: 'add', terms };
  }
  function product() {
    let a = unary();
    while (isOp('*') || isOp('/')) {
      const op = toks[i++].v;
      const b = unary();
      a = op === '*' ? { k: 'mul', a, b } : { k: 'div', a, b };
    }
    return a;
  }
  function unary() {
    if (isOp('-')) { i++; return { k: 'neg', a: unary() }; }
    if (isOp('+')) { i++; return unary(); }
    return power();
  }
  function power() {
    const base = atom();
    if (isOp('^')) { i++; return { k: 'pow', a: base, b: isOp('-') ? (i++, { k: 'neg', a: atom() }) : atom() }; }
    return base;
  }
  function atom() {
    const tk = peek();
    if (!tk) throw new Error('the closed form ends early');
    if (tk.t === 'num') { i++; return { k: 'num', v: tk.v, imag: tk.imag }; }
    if (tk.t === 'name') {
      i++;
      let name = tk.v;
      let order = null;
      if (name === 'δ' && isOp('^')) { i++; expect('('); order = atom(); expect(')'); }
      if (isOp('(')) { i++; const arg = sum(); expect(')'); return { k: 'call', name, arg, bracket: '(', order }; }
      if (isOp('[')) { i++; const arg = sum(); expect(']'); return { k: 'call', name, arg, bracket: '[', order }; }
      if (order) throw new Error('δ^(k) without its argument');
      return { k: 'name', v: name };
    }
    if (tk.t === 'op' && tk.v === '(') { i++; const inner = sum(); expect(')'); return { k: 'group', a: inner }; }
    throw new Error(`unexpected ${tk.v} in the closed form`);
  }
  const tree = sum();
  if (i !== toks.length) throw new Error('unexpected text after the closed form');
  return tree;
}

const CLOSED_FORM_FUNCTIONS = new Set(['sin', 'cos', 'tan', 'sinh', 'cosh', 'tanh', 'log', 'ln']);

/** The leftmost leaf of a tree is a number (a product then needs a visible dot before it). */
function startsWithNumber(n) {
  if (n.k === 'num') return true;
  if (n.k === 'mul' || n.k === 'div' || n.k === 'pow') return startsWithNumber(n.a);
  return false;
}

function ungroup(n) { return n.k === 'group' ? n.a : n; }

/** A number's text as MathML: × 10^k for an exponent. */
function numberMath(text, imag) {
  const e = /^([\d.]+)[eE]([-+−]?\d+)$/.exec(text);
  const n = e ? mathEl('mrow', mathEl('mn', e[1]), mathEl('mo', '×'), mathEl('msup', mathEl('mn', '10'), mathEl('mn', e[2].replace(/^[-−]/, '−').replace(/^\+/, '')))) : mathEl('mn', text);
  return imag ? mathEl('mrow', n, mathEl('mo', '\u2062'), mathEl('mi', 'i')) : n;
}

/** A closed-form tree as MathML. */
export function closedFormMath(n) {
  switch (n.k) {
    case 'num': return numberMath(n.v, n.imag);
    case 'name': return mathEl('mi', n.v.replace(/''/g, '″').replace(/'/g, '′'));
    case 'group': return mathEl('mrow', mathEl('mo', '('), closedFormMath(n.a), mathEl('mo', ')'));
    case 'neg': return mathEl('mrow', mathEl('mo', '−'), closedFormMath(n.a));
    case 'add': {
      const row = mathEl('mrow');
      n.terms.forEach((t, j) => {
        if (j > 0 || t.sign < 0) row.append(mathEl('mo', t.sign < 0 ? '−' : '+'));
        row.append(closedFormMath(t.a));
      });
      return row;
    }
    case 'mul': return mathEl('mrow', closedFormMath(n.a), mathEl('mo', startsWithNumber(n.b) ? '·' : '\u2062'), closedFormMath(n.b));
    case 'div': return mathEl('mfrac', closedFormMath(ungroup(n.a)), closedFormMath(ungroup(n.b)));
    case 'pow': return mathEl('msup', closedFormMath(n.a), closedFormMath(ungroup(n.b)));
    case 'call': {
      const arg = closedFormMath(n.arg);
      if (n.name === 'exp' && n.bracket === '(') return mathEl('msup', mathEl('mi', 'e'), arg);
      const name = mathEl('mi', n.name.replace(/''/g, '″').replace(/'/g, '′'));
      const head = n.order ? mathEl('msup', name, mathEl('mrow', mathEl('mo', '('), closedFormMath(n.order), mathEl('mo', ')'))) : name;
      const close = n.bracket === '[' ? ']' : ')';
      return mathEl('mrow', head, ...(CLOSED_FORM_FUNCTIONS.has(n.name) ? [mathEl('mo', '\u2061')] : []), mathEl('mo', n.bracket), arg, mathEl('mo', close));
    }
    default: throw new Error('unknown closed-form node');
  }
}

/** `lhs = closed form` as <math display=block>, or null when the text cannot be read (the page
 *  then keeps the plain text alone). `lhs` is a MathML node. */
export function closedFormMathML(lhs, text) {
  let tree;
  try { tree = parseClosedForm(text); } catch (e) { return null; }
  const math = mathEl('math', mathEl('mrow', lhs, mathEl('mo', '='), closedFormMath(tree)));
  math.setAttribute('display', 'block');
  return math;
}

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

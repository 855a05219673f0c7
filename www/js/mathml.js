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

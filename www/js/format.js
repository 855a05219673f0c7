// Numbers as text on the page: short readable reals, complex numbers on one or
// two lines, significant digits that carry information, full precision for titles.
import { isFinitePair } from './complex.js';

/** A short, readable number: up to `digits` significant digits, no trailing zeros. */
export function fmtReal(x, digits = 6) {
  if (x === null || x === undefined || Number.isNaN(x)) return 'NaN';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '−∞';
  if (x === 0) return '0';
  const ax = Math.abs(x);
  let t;
  if (ax >= 1e-4 && ax < 1e7) {
    t = Number(x.toPrecision(digits)).toString();
  } else {
    t = x.toExponential(digits - 1).replace(/\.?0+e/, 'e').replace('e+', 'e');
  }
  return t.replace(/-/g, '−');
}

/** [re, im] as "a + bi"; tiny parts relative to the other are kept (numbers must be right). */
export function fmtComplex(z, digits = 6) {
  if (!Array.isArray(z) || z.length !== 2) return '—';
  const [re, im] = z.map((v) => (v === null ? NaN : v));
  if (Number.isNaN(re) || Number.isNaN(im)) return 'not a number';
  if (!Number.isFinite(re) || !Number.isFinite(im)) return '∞';
  if (im === 0) return fmtReal(re, digits);
  const ims = fmtReal(Math.abs(im), digits);
  const imPart = (ims === '1' ? '' : ims) + 'i';
  if (re === 0) return (im < 0 ? '−' : '') + imPart;
  return fmtReal(re, digits) + (im < 0 ? ' − ' : ' + ') + imPart;
}

/** Drop a part of [re, im] that lies below the last of `digits` significant digits of |z|
 *  (e.g. the 1e-17 imaginary part of a real pole found numerically): it carries no information. */
export function trimComplex(z, digits = 10, absFloor = 0) {
  if (!isFinitePair(z)) return z;
  const floor = Math.max(Math.hypot(z[0], z[1]) * Math.pow(10, -digits), absFloor);
  return [Math.abs(z[0]) < floor ? 0 : z[0], Math.abs(z[1]) < floor ? 0 : z[1]];
}

/** Drop parts below an absolute level (e.g. a coefficient's error estimate). */
export function trimBelow(z, level) {
  if (!isFinitePair(z) || !(level > 0)) return z;
  return [Math.abs(z[0]) < level ? 0 : z[0], Math.abs(z[1]) < level ? 0 : z[1]];
}

/** [re, im] to `digits` significant digits of |z|, as one line. */
export function fmtSig(z, digits = 10, absFloor = 0) {
  return fmtComplex(trimComplex(z, digits, absFloor), digits);
}

/** [re, im] to `digits` significant digits as two lines ["a", "+ bi"] (the second may be ''),
 *  so long complex numbers fit a narrow table column. */
export function fmtSigLines(z, digits = 10, absFloor = 0) {
  const t = trimComplex(z, digits, absFloor);
  if (!isFinitePair(t)) return [fmtComplex(t, digits), ''];
  const [re, im] = t;
  if (im === 0 || re === 0) return [fmtComplex(t, digits), ''];
  const ims = fmtReal(Math.abs(im), digits);
  return [fmtReal(re, digits), (im < 0 ? '− ' : '+ ') + (ims === '1' ? '' : ims) + 'i'];
}

/** Full double precision, for titles and copying: "re, im". */
export function fmtExact(z) {
  return isFinitePair(z) ? `${z[0]} ${z[1] < 0 || Object.is(z[1], -0) ? '-' : '+'} ${Math.abs(z[1])}i` : String(z);
}

/** A function input {f, var, params} as a reader would write it: "f(z) = … (a = 2, b = 1+0.5i)". */
export function functionWords(base) {
  const v = (base && base.var) || 'z';
  const params = base && base.params && typeof base.params === 'object' ? Object.entries(base.params) : [];
  const p = params.map(([k, x]) => `${k} = ${Array.isArray(x) ? fmtComplex(x, 6) : fmtReal(x, 6)}`).join(', ');
  return `f(${v}) = ${base ? base.f : ''}` + (p ? ` (${p})` : '');
}

// ---- machine-readable numbers (exported and copied text: CSV, JSON, tab-separated copies) ----

/** How complex numbers are written in exported and copied text: 'columns' (re and im in two
 *  columns), 'j' (one cell "a+bj", as Python's complex() reads it) or 'i' (one cell "a+bi"). */
export const COMPLEX_FORMATS = ['columns', 'j', 'i'];

/** A real as machine-readable text: the shortest decimal that reads back to the same double
 *  (at most 17 significant digits; ECMAScript Number::toString; −0 as "-0"), ASCII minus, exponent as "e";
 *  not finite: "inf", "-inf", "nan" (as Python's float() reads them); null: empty. */
export function numText(x) {
  if (x === null || x === undefined) return '';
  if (typeof x !== 'number') return String(x);
  if (Number.isNaN(x)) return 'nan';
  if (!Number.isFinite(x)) return x > 0 ? 'inf' : '-inf';
  if (Object.is(x, -0)) return '-0';
  return String(x).replace('e+', 'e');
}

/** [re, im] as one machine-readable cell "a+bj" (`unit` 'j') or "a+bi" (`unit` 'i'): both parts
 *  always written, the sign of im between them (−0 written "-0"), no spaces. */
export function complexText(z, unit = 'j') {
  if (!Array.isArray(z) || z.length !== 2) return '';
  const [re, im] = z;
  const neg = typeof im === 'number' && (im < 0 || Object.is(im, -0));
  const ims = typeof im === 'number' ? numText(Math.abs(im)) : numText(im);
  return `${numText(re)}${neg ? '-' : '+'}${ims}${unit}`;
}

/** Read a full-precision title written by fmtExact ("Full precision: a + bi" or "a - bi") back
 *  into [re, im], or null (the copy handler of tables uses it for cells showing fewer digits). */
export function parseExact(text) {
  const m = /^(?:Full precision: )?(\S+) ([+-]) (\S+)i$/.exec(String(text || '').trim());
  if (!m) return null;
  const re = Number(m[1]), im = Number(m[3]) * (m[2] === '-' ? -1 : 1);
  return Number.isNaN(re) || Number.isNaN(im) ? null : [re, im];
}

/** A displayed number's text made machine-readable: soft hyphens dropped, U+2212 to ASCII minus, "∞" to "inf", "—" empty,
 *  line breaks and the spaces around a complex sign removed, "i" as the chosen unit. */
export function cleanNumberText(text, unit = 'j') {
  let t = String(text || '').replace(/\u00ad/g, '').replace(/\u2212/g, '-').replace(/∞/g, 'inf').replace(/\s+/g, ' ').trim();
  if (t === '—') return ''; // the tables' dash for "none"
  t = t.replace(/^≈ /, ''); // "≈ 0": below the error level
  const m = /^(-?[0-9.]+(?:e-?[0-9]+)?) ([+-]) ([0-9.]*(?:e-?[0-9]+)?)i$/.exec(t);
  if (m) return `${m[1]}${m[2]}${m[3] === '' ? '1' : m[3]}${unit}`;
  const p = /^(-?)([0-9.]*(?:e-?[0-9]+)?)i$/.exec(t);
  if (p) return `0${p[1] === '-' ? '-' : '+'}${p[2] === '' ? '1' : p[2]}${unit}`;
  return t;
}

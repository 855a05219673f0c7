// Small helpers shared by the page: complex numbers as [re, im], number
// formatting, safe storage and DOM shortcuts.

/** Parse a parameter value typed by a person: "2", "-0.5", "1e-3", "0.3+0.1i", "2i", "-i", "3-4j".
 *  Returns [re, im] or null when the text is not a number. */
export function parseComplex(text) {
  const s = String(text).replace(/\s+/g, '').replace(/j/g, 'i').replace(/[−–]/g, '-');
  if (s === '') return null;
  const num = '(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?';
  const real = new RegExp('^([+-]?' + num + ')$');
  const imag = new RegExp('^([+-]?(?:' + num + ')?)\\*?i$');
  const both = new RegExp('^([+-]?' + num + ')([+-](?:' + num + ')?)\\*?i$');
  const coef = (t) => (t === '' || t === '+' ? 1 : t === '-' ? -1 : Number(t));
  let m;
  if ((m = s.match(real))) return [Number(m[1]), 0];
  if ((m = s.match(imag))) return [0, coef(m[1])];
  if ((m = s.match(both))) return [Number(m[1]), coef(m[2])];
  return null;
}

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

export function cAbs(z) { return Math.hypot(z[0], z[1]); }
export function cArg(z) { return Math.atan2(z[1], z[0]); }
export function cSub(a, b) { return [a[0] - b[0], a[1] - b[1]]; }
export function cInv(z) { const d = z[0] * z[0] + z[1] * z[1]; return [z[0] / d, -z[1] / d]; }
export function isFinitePair(z) {
  return Array.isArray(z) && z.length === 2 && Number.isFinite(z[0]) && Number.isFinite(z[1]);
}

/** localStorage that never throws (file:// pages may refuse it). */
export const safeStorage = {
  get(key) {
    try { return window.localStorage.getItem(key); } catch (e) { return null; }
  },
  set(key, value) {
    try { window.localStorage.setItem(key, value); return true; } catch (e) { return false; }
  },
};

/** Element shortcut. */
export function $(id) { return document.getElementById(id); }

/** Create an element with attributes and children. */
export function el(tag, attrs = {}, ...children) {
  const node = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) {
    if (k === 'class') node.className = v;
    else if (k === 'text') node.textContent = v;
    else if (k.startsWith('on') && typeof v === 'function') node.addEventListener(k.slice(2), v);
    else if (v !== undefined && v !== null && v !== false) node.setAttribute(k, v === true ? '' : v);
  }
  for (const c of children) if (c !== null && c !== undefined) node.append(c);
  return node;
}

/** Call `fn` once input has been quiet for `ms` milliseconds. */
export function debounce(fn, ms) {
  let timer = 0;
  const wrapped = (...args) => {
    clearTimeout(timer);
    timer = setTimeout(() => fn(...args), ms);
  };
  wrapped.cancel = () => clearTimeout(timer);
  return wrapped;
}

/** Let the browser paint and handle input before continuing. */
export function yieldToBrowser() {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

/** The error object of a response, if any: {message, span} or null. */
export function responseError(response) {
  if (!response || typeof response !== 'object') return { message: 'no answer from the engine', span: null };
  if (response.error) return { message: String(response.error.message || 'unknown error'), span: response.error.span || null };
  return null;
}

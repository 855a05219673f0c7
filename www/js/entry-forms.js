// Entering f as a ratio of polynomials: two forms under the function input, coefficients (highest
// power first) or gain, zeros and poles (with a helper that adds a pole pair from ωn and ζ), each
// written into f as a plain expression; and the current f read back into both forms from the
// core's `transfer_function` reading. The parsing and writing functions are pure (no page, no
// core) and exported for tests; attachEntryForms wires them to the folded block in index.html.
//
// Lists: items separated by commas (then spaces inside an item are allowed: -0.5 + 2i) or, with no
// comma, by spaces. A number is real (2, -0.5, 1e-3) or complex a+bi (also 2i, -i, 3-4j). A root
// may be a conjugate pair a±bi (or a+-bi): both a+bi and a−bi; and a repeated root ends in ^m:
// -1^2 is a double root at −1, -0.5±2i^2 a double pair.
import { parseComplex } from './params.js';

/** Up to 12 significant digits, trailing zeros trimmed; plain ASCII (the expression language). */
export function entryNumber(x) {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  return String(Number(x.toPrecision(12)));
}

/** [re, im] as text the expression language and the forms read: "2", "-0.5", "2i", "1-3.5i". */
export function entryComplex(z) {
  const [re, im] = z;
  if (im === 0) return entryNumber(re);
  const imText = Math.abs(im) === 1 ? 'i' : entryNumber(Math.abs(im)) + 'i';
  if (re === 0) return (im < 0 ? '-' : '') + imText;
  return entryNumber(re) + (im < 0 ? '-' : '+') + imText;
}

/** A plain real number as typed, kept as it is in the written f (e.g. "6283", "0.40", "1e-3"). */
const PLAIN_REAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A refusal naming the field and the item: {field, item (1-based, or null), message}. */
function entryFailure(field, item, what) {
  return { field, item, message: item ? `${field}, item ${item}: ${what}` : `${field}: ${what}` };
}

/** The items of a list typed in a field: split at commas (or semicolons) when there is one, else
 *  at spaces; empty items (a trailing comma) are dropped. */
export function splitItems(text) {
  const t = String(text).trim();
  if (t === '') return [];
  const parts = /[,;]/.test(t) ? t.split(/[,;]/) : t.split(/\s+/);
  return parts.map((p) => p.trim()).filter((p) => p !== '');
}

const NUMBER_HINT = 'write a number such as 2, -0.5, 1e-3 or 0.3+0.1i';

/** One number as typed: {text (spaces removed), value: [re, im]} or null. */
function entryValue(text) {
  const compact = text.replace(/\s+/g, '');
  const v = parseComplex(compact);
  if (!v || !v.every(Number.isFinite)) return null;
  return { text: compact, value: v };
}

/** Coefficients typed in `field` ("numerator", "denominator"): {ok: true, items: [{text, value}]}
 *  in the order typed (highest power first), or {ok: false, error}. */
export function parseCoefficients(text, field) {
  const items = splitItems(text);
  if (items.length === 0) return { ok: false, error: entryFailure(field, null, 'type at least one coefficient, highest power first') };
  const out = [];
  for (let i = 0; i < items.length; i++) {
    const v = entryValue(items[i]);
    if (!v) return { ok: false, error: entryFailure(field, i + 1, `“${items[i]}” is not a number: ${NUMBER_HINT}`) };
    out.push(v);
  }
  while (out.length > 1 && out[0].value[0] === 0 && out[0].value[1] === 0) out.shift();
  if (out.length === 1 && out[0].value[0] === 0 && out[0].value[1] === 0) {
    return { ok: false, error: entryFailure(field, null, 'every coefficient is 0') };
  }
  return { ok: true, items: out };
}

/** The largest repeat count accepted after ^. */
export const MAX_REPEAT = 60;

/** Roots typed in `field` ("zeros", "poles"): {ok: true, roots: [{value: [re, im], text, order}]}
 *  (a ± pair gives two roots) or {ok: false, error}. `text` is the typed number for a real root. */
export function parseRoots(text, field) {
  const items = splitItems(text);
  const roots = [];
  for (let i = 0; i < items.length; i++) {
    const raw = items[i];
    const bad = (what) => ({ ok: false, error: entryFailure(field, i + 1, `“${raw}” ${what}`) });
    let body = raw.replace(/\s+/g, '');
    let order = 1;
    const rep = body.match(/^(.*)\^(.*)$/);
    if (rep) {
      if (!/^\d+$/.test(rep[2]) || Number(rep[2]) < 1 || Number(rep[2]) > MAX_REPEAT) return bad(`has a repeat count that is not a whole number from 1 to ${MAX_REPEAT} (write e.g. -1^2 for a double root)`);
      order = Number(rep[2]);
      body = rep[1];
    }
    const paren = body.match(/^\((.*)\)$/);
    if (paren) body = paren[1];
    const pm = body.match(/^(.*?)(?:±|\+-)(.*)$/);
    if (pm) {
      const re = pm[1] === '' ? { text: '0', value: [0, 0] } : entryValue(pm[1]);
      const im = parseComplex(pm[2]);
      if (!re || re.value[1] !== 0) return bad('is not a pair a±bi: the part before ± must be a real number');
      if (!im || im[0] !== 0 || im[1] === 0 || !Number.isFinite(im[1])) return bad('is not a pair a±bi: the part after ± must be an imaginary number such as 2i');
      const b = Math.abs(im[1]);
      roots.push({ value: [re.value[0], b], text: null, order }, { value: [re.value[0], -b], text: null, order });
      continue;
    }
    const v = entryValue(body);
    if (!v) return bad(`is not a number: ${NUMBER_HINT}, a pair such as -0.5±2i, or a repeated root such as -1^2`);
    roots.push({ value: v.value, text: v.value[1] === 0 && PLAIN_REAL.test(v.text) ? v.text : null, order });
  }
  return { ok: true, roots };
}

/** The gain k: blank is 1. {ok: true, gain: {text, value}} or {ok: false, error}. */
export function parseGain(text) {
  const t = String(text).trim();
  if (t === '') return { ok: true, gain: { text: '1', value: [1, 0] } };
  const v = entryValue(t);
  if (!v) return { ok: false, error: entryFailure('gain k', null, `“${t}” is not a number: ${NUMBER_HINT}`) };
  if (v.value[0] === 0 && v.value[1] === 0) return { ok: false, error: entryFailure('gain k', null, 'k = 0 makes f = 0') };
  return { ok: true, gain: v };
}

/** The magnitude text of a coefficient or root (its sign apart): as typed when it is a plain real
 *  number, else to 12 significant digits. */
function magnitudeText(item) {
  if (item.text && PLAIN_REAL.test(item.text)) return item.text.replace(/^[+-]/, '');
  return entryNumber(Math.abs(item.value[0]));
}

/** The polynomial with coefficients `items` ({text, value}, highest power first) in `v`:
 *  "s^2 + 0.4*s + 4". */
export function polynomialText(items, v) {
  const n = items.length - 1;
  let out = '';
  items.forEach((c, i) => {
    const p = n - i;
    const [re, im] = c.value;
    if (re === 0 && im === 0) return;
    const power = p === 0 ? '' : p === 1 ? v : `${v}^${p}`;
    let sign, body;
    if (im !== 0) {
      sign = '+';
      body = `(${entryComplex(c.value)})`;
    } else {
      sign = re < 0 ? '-' : '+';
      body = magnitudeText(c);
      if (power && Math.abs(re) === 1) body = '';
    }
    const term = body && power ? `${body}*${power}` : body || power;
    out += out === '' ? (sign === '-' ? '-' : '') + term : ` ${sign} ${term}`;
  });
  return out;
}

/** True when `text` is one term that needs no parentheses as a numerator ("3", "-2*s^2", "s"). */
function singleTerm(text) {
  return !/\s[+-]\s/.test(text);
}

/** f from coefficient lists (strings as typed) in `v`: {ok: true, f} or {ok: false, error}. */
export function coefficientsToF(numText, denText, v) {
  const num = parseCoefficients(numText, 'numerator');
  if (!num.ok) return num;
  const den = parseCoefficients(denText, 'denominator');
  if (!den.ok) return den;
  const n = polynomialText(num.items, v);
  const d = polynomialText(den.items, v);
  const top = singleTerm(n) ? n : `(${n})`;
  if (d === '1') return { ok: true, f: n };
  const plainDen = PLAIN_REAL.test(d) && !d.startsWith('-');
  return { ok: true, f: `${top}/${plainDen ? d : `(${d})`}` };
}

/** The roots grouped into factors, in the order first typed: a real root r → (v − r), a conjugate
 *  pair σ ± ωi → the real quadratic v² − 2σv + (σ² + ω²), any other complex root → (v − a − bi);
 *  equal roots merged into one factor with a power. Each {text, order}. */
export function rootFactors(roots, v) {
  // the multiset of roots, in first-typed order
  const bag = [];
  for (const r of roots) {
    const same = bag.find((b) => b.value[0] === r.value[0] && b.value[1] === r.value[1]);
    if (same) same.order += r.order;
    else bag.push({ value: r.value.slice(), text: r.text, order: r.order });
  }
  const factors = [];
  for (const b of bag) {
    if (b.order === 0) continue;
    const [re, im] = b.value;
    if (im === 0) {
      const t = re === 0 ? v : `(${v} ${re < 0 ? '+' : '-'} ${magnitudeText(b)})`;
      factors.push({ text: t, order: b.order });
      b.order = 0;
      continue;
    }
    const mate = bag.find((c) => c !== b && c.order > 0 && c.value[0] === re && c.value[1] === -im);
    if (mate) {
      const m = Math.min(b.order, mate.order);
      const lin = -2 * re, con = re * re + im * im;
      const linText = lin === 0 ? '' : ` ${lin < 0 ? '-' : '+'} ${Math.abs(lin) === 1 ? '' : entryNumber(Math.abs(lin)) + '*'}${v}`;
      factors.push({ text: `(${v}^2${linText} + ${entryNumber(con)})`, order: m });
      b.order -= m;
      mate.order -= m;
    }
    if (b.order > 0) {
      const negRe = re === 0 ? '' : ` ${re < 0 ? '+' : '-'} ${entryNumber(Math.abs(re))}`;
      const negIm = ` ${im < 0 ? '+' : '-'} ${Math.abs(im) === 1 ? '' : entryNumber(Math.abs(im))}i`;
      factors.push({ text: `(${v}${negRe}${negIm})`, order: b.order });
      b.order = 0;
    }
  }
  return factors.map((f) => ({ text: f.order === 1 ? f.text : `${f.text}^${f.order}`, order: f.order }));
}

/** A product of factors: "(s + 1)*(s^2 + 2*s + 5)" (null for none). */
function productText(factors) {
  return factors.length ? factors.map((f) => f.text).join('*') : null;
}

/** f from the gain, zero and pole fields (strings as typed) in `v`: {ok: true, f} or {ok: false, error}. */
export function zpkToF(gainText, zerosText, polesText, v) {
  const k = parseGain(gainText);
  if (!k.ok) return k;
  const zeros = parseRoots(zerosText, 'zeros');
  if (!zeros.ok) return zeros;
  const poles = parseRoots(polesText, 'poles');
  if (!poles.ok) return poles;
  return { ok: true, f: zpkExpression(k.gain, zeros.roots, poles.roots, v) };
}

/** f = k·Π(v − zᵢ)/Π(v − pⱼ) as a plain expression in `v`: the gain {value: [re, im], text?} and
 *  the roots [{value, text?, order}] grouped by rootFactors (a conjugate pair as its real
 *  quadratic, equal roots as one power; a plain real number kept as typed). The one writer of
 *  the factored form: the forms here and a dragged root (pole-drag.js) both use it. */
export function zpkExpression(k, zeros, poles, v) {
  const zTop = productText(rootFactors(zeros, v));
  const poleFactors = rootFactors(poles, v);
  const pBottom = productText(poleFactors);
  const [kr, ki] = k.value;
  let top;
  if (ki !== 0) top = `(${entryComplex(k.value)})` + (zTop ? '*' + zTop : '');
  else {
    const mag = magnitudeText(k);
    const sign = kr < 0 ? '-' : '';
    if (!zTop) top = sign + mag;
    else if (Math.abs(kr) === 1) top = sign + zTop;
    else top = `${sign}${mag}*${zTop}`;
  }
  if (!pBottom) return top;
  return `${top}/${poleFactors.length === 1 ? pBottom : `(${pBottom})`}`;
}

/** The pole pair of a second-order section from ωn (> 0; rad per unit time, or Hz: × 2π) and ζ,
 *  as the text to add to the poles field: "σ±ωi" for ζ < 1, two real poles (or one double) for
 *  ζ ≥ 1. In z (sampling period T > 0) the poles are mapped by z = e^(sT). Numbers carry every
 *  digit (shortest round trip) so the written quadratic is s² + 2ζωn·s + ωn² to 12 digits.
 *  {ok: true, text} or {ok: false, error}. */
export function polePairText(wnText, zetaText, unit, v, periodText = '1') {
  const wn0 = parseComplex(String(wnText).trim());
  if (!wn0 || wn0[1] !== 0 || !(wn0[0] > 0) || !Number.isFinite(wn0[0])) return { ok: false, error: entryFailure('ωn', null, `“${String(wnText).trim()}” is not a frequency > 0 (in ${unit})`) };
  const zeta = parseComplex(String(zetaText).trim());
  if (!zeta || zeta[1] !== 0 || !Number.isFinite(zeta[0])) return { ok: false, error: entryFailure('ζ', null, `“${String(zetaText).trim()}” is not a real number (the damping ratio, e.g. 0.5)`) };
  const wn = unit === 'Hz' ? 2 * Math.PI * wn0[0] : wn0[0];
  const z = zeta[0];
  let T = 1;
  if (v === 'z') {
    const t = parseComplex(String(periodText).trim());
    if (!t || t[1] !== 0 || !(t[0] > 0) || !Number.isFinite(t[0])) return { ok: false, error: entryFailure('sampling period T', null, `“${String(periodText).trim()}” is not a time > 0`) };
    T = t[0];
  }
  const sigma = -z * wn;
  const real = (x) => String(v === 'z' ? Math.exp(x * T) : x);
  if (Math.abs(z) < 1) {
    const wd = wn * Math.sqrt(1 - z * z);
    if (v !== 'z') return { ok: true, text: `${String(sigma)}±${String(wd)}i` };
    const r = Math.exp(sigma * T);
    return { ok: true, text: `${String(r * Math.cos(wd * T))}±${String(Math.abs(r * Math.sin(wd * T)))}i` };
  }
  if (Math.abs(z) === 1) return { ok: true, text: `${real(sigma)}^2` };
  const d = wn * Math.sqrt(z * z - 1);
  return { ok: true, text: `${real(sigma + d)}, ${real(sigma - d)}` };
}

// ---- reading f back ------------------------------------------------------------------------------

/** Parts of [re, im] below 1e-12 of `scale` set to 0 (the rounding of a real system's numbers). */
function entryTrim(z, scale) {
  const floor = 1e-12 * scale;
  return [Math.abs(z[0]) < floor ? 0 : z[0], Math.abs(z[1]) < floor ? 0 : z[1]];
}

/** Π (v − rᵢ)^orderᵢ multiplied out, times k: coefficients [re, im], highest power first. */
export function multiplyOut(roots, k = [1, 0]) {
  let poly = [k.slice()];
  for (const r of roots) {
    for (let m = 0; m < (r.order || 1); m++) {
      const next = poly.map((c) => c.slice()).concat([[0, 0]]);
      for (let i = 0; i < poly.length; i++) {
        const [a, b] = poly[i];
        next[i + 1][0] -= a * r.at[0] - b * r.at[1];
        next[i + 1][1] -= a * r.at[1] + b * r.at[0];
      }
      poly = next;
    }
  }
  return poly;
}

/** Coefficients ([re, im], highest power first) as the form shows them: "1 3 7 5". */
export function coefficientsText(coefs) {
  const scale = Math.max(...coefs.map((c) => Math.hypot(c[0], c[1])), 0);
  return coefs.map((c) => entryComplex(entryTrim(c, scale))).join(' ');
}

/** Roots [{at, order}] as the form shows them: conjugates as one a±bi item, repeats with ^m:
 *  "-1, -1±2i". */
export function rootsText(roots) {
  const items = roots.map((r) => ({ at: entryTrim(r.at, Math.hypot(r.at[0], r.at[1])), order: r.order || 1, used: false }));
  const out = [];
  for (const r of items) {
    if (r.used) continue;
    r.used = true;
    const rep = r.order === 1 ? '' : `^${r.order}`;
    const [re, im] = r.at;
    if (im !== 0) {
      const tol = 1e-12 * Math.hypot(re, im);
      const mate = items.find((c) => !c.used && c.order === r.order && Math.abs(c.at[0] - re) <= tol && Math.abs(c.at[1] + im) <= tol);
      if (mate) {
        mate.used = true;
        const mag = Math.abs(im) === 1 ? 'i' : entryNumber(Math.abs(im)) + 'i';
        out.push(`${re === 0 ? '' : entryNumber(re)}±${mag}${rep}`);
        continue;
      }
    }
    out.push(entryComplex(r.at) + rep);
  }
  return out.join(', ');
}

/** What the forms show for a `transfer_function` response: {gain, zeros, poles, numerator,
 *  denominator} as text. The core's `gain` and `coefficients` are used when the response has them;
 *  otherwise they are multiplied out here from the poles and zeros, with the gain `fallbackGain`
 *  ([re, im]). */
export function formsFromResponse(resp, fallbackGain) {
  const poles = Array.isArray(resp.poles) ? resp.poles : [];
  const zeros = Array.isArray(resp.zeros) ? resp.zeros : [];
  let k = Array.isArray(resp.gain) ? resp.gain : fallbackGain;
  k = entryTrim(k, Math.hypot(k[0], k[1]));
  const c = resp.coefficients;
  const numerator = c && Array.isArray(c.numerator) ? c.numerator : multiplyOut(zeros, k);
  const denominator = c && Array.isArray(c.denominator) ? c.denominator : multiplyOut(poles);
  return {
    gain: entryComplex(k),
    zeros: rootsText(zeros),
    poles: rootsText(poles),
    numerator: coefficientsText(numerator),
    denominator: coefficientsText(denominator),
  };
}

/** k from F at a point a: F(a)·Π(a − pᵢ)/Π(a − zᵢ), with each root's order. */
export function gainAt(a, value, poles, zeros) {
  const mul = (x, y) => [x[0] * y[0] - x[1] * y[1], x[0] * y[1] + x[1] * y[0]];
  const div = (x, y) => { const d = y[0] * y[0] + y[1] * y[1]; return [(x[0] * y[0] + x[1] * y[1]) / d, (x[1] * y[0] - x[0] * y[1]) / d]; };
  let k = value.slice();
  for (const p of poles) for (let m = 0; m < (p.order || 1); m++) k = mul(k, [a[0] - p.at[0], a[1] - p.at[1]]);
  for (const z of zeros) for (let m = 0; m < (z.order || 1); m++) k = div(k, [a[0] - z.at[0], a[1] - z.at[1]]);
  return k;
}

// ---- the block on the page ------------------------------------------------------------------------

/** Wire the folded block (#entry-box). `hooks`: currentVar() (the page's variable now),
 *  base() ({f, var, params} of the page now), run(request) (the core, off the main thread;
 *  resolves with its response), check(f, var) (null when f can be used, else an error message),
 *  write(f, var) (put f into the function input the way an example does). */
export function attachEntryForms(hooks) {
  const get = (id) => document.getElementById(id);
  const box = get('entry-box');
  if (!box) return;
  const parts = {
    coef: get('entry-coef'), zpk: get('entry-zpk'), variable: get('entry-var'), num: get('entry-num'), den: get('entry-den'),
    gain: get('entry-gain'), zeros: get('entry-zeros'), poles: get('entry-poles'), wn: get('entry-wn'), wnUnit: get('entry-wn-unit'),
    zeta: get('entry-zeta'), period: get('entry-period'), periodRow: get('entry-period-row'), addPair: get('entry-add-pair'),
    write: get('entry-write'), read: get('entry-read'), message: get('entry-message'),
  };
  const fields = { numerator: parts.num, denominator: parts.den, 'gain k': parts.gain, zeros: parts.zeros, poles: parts.poles,
    'ωn': parts.wn, 'ζ': parts.zeta, 'sampling period T': parts.period };
  const kind = () => (box.querySelector('input[name="entry-kind"]:checked') || {}).value || 'coef';
  const say = (text, look) => {
    parts.message.textContent = text;
    parts.message.className = 'entry-message' + (look ? ' ' + look : '');
    parts.message.dataset.look = look || '';
  };
  const clearInvalid = () => { for (const input of Object.values(fields)) input.removeAttribute('aria-invalid'); };
  const refuse = (error, outcome = 'The function is unchanged.') => {
    clearInvalid();
    const input = fields[error.field];
    if (input) { input.setAttribute('aria-invalid', 'true'); input.focus(); }
    say(error.message.charAt(0).toUpperCase() + error.message.slice(1) + '. ' + outcome, 'bad');
  };
  const showKind = () => {
    parts.coef.hidden = kind() !== 'coef';
    parts.zpk.hidden = kind() !== 'zpk';
  };
  const showVar = () => {
    const v = parts.variable.value;
    parts.periodRow.hidden = v !== 'z';
    for (const node of box.querySelectorAll('.entry-v')) node.textContent = v;
  };
  /** The variable choice follows the page's variable when that is s or z. */
  const followVar = () => {
    const v = hooks.currentVar();
    if (v === 's' || v === 'z') parts.variable.value = v;
    showVar();
  };

  for (const r of box.querySelectorAll('input[name="entry-kind"]')) r.addEventListener('change', () => { showKind(); say('', ''); });
  parts.variable.addEventListener('change', showVar);
  for (const input of Object.values(fields)) input.addEventListener('input', () => input.removeAttribute('aria-invalid'));

  parts.addPair.addEventListener('click', () => {
    const pair = polePairText(parts.wn.value, parts.zeta.value, parts.wnUnit.value, parts.variable.value, parts.period.value);
    if (!pair.ok) { refuse(pair.error, 'Nothing was added to the poles.'); return; }
    clearInvalid();
    const now = parts.poles.value.trim();
    parts.poles.value = now === '' ? pair.text : `${now}${/[,;]/.test(now) || /\s/.test(pair.text) ? ', ' : /\s/.test(now) ? ' ' : ', '}${pair.text}`;
    say(`Added ${pair.text} to the poles.`, '');
  });

  parts.write.addEventListener('click', () => {
    const v = parts.variable.value;
    const made = kind() === 'coef'
      ? coefficientsToF(parts.num.value, parts.den.value, v)
      : zpkToF(parts.gain.value, parts.zeros.value, parts.poles.value, v);
    if (!made.ok) { refuse(made.error); return; }
    const problem = hooks.check(made.f, v);
    if (problem) { clearInvalid(); say(`The core does not accept ${made.f}: ${problem}. The function is unchanged.`, 'bad'); return; }
    clearInvalid();
    hooks.write(made.f, v);
    say(`Wrote f(${v}) = ${made.f}`, 'good');
  });

  let readSerial = 0;
  /** Fill both forms from the current f (when it is a ratio of polynomials). */
  async function readFromF(auto = false) {
    const serial = ++readSerial;
    const base = hooks.base();
    say('Reading f…', '');
    const v = base.var;
    const request = { task: 'transfer_function', f: base.f, var: v, params: base.params, omega: [v === 'z' ? 0.5 : 1], t: [0] };
    const resp = await hooks.run(request);
    if (serial !== readSerial) return;
    if (!resp || resp.error) {
      const code = resp && resp.error ? resp.error.code : 'internal';
      say(code === 'not_applicable' ? 'f is not a ratio of polynomials with a nonzero value, so it has no coefficients to show.'
        : code === 'cancelled' ? 'Stopped before f was read.'
          : `Could not read f: ${resp && resp.error ? resp.error.message : 'no answer'}.`, auto ? '' : 'bad');
      return;
    }
    let k = resp.gain;
    if (!Array.isArray(k)) {
      const a = [0.3701, 0.6113]; // any point that is neither a pole nor a zero
      const ev = await hooks.run({ task: 'evaluate', f: base.f, var: v, params: base.params, at: [a] });
      if (serial !== readSerial) return;
      if (!ev || ev.error || !Array.isArray(ev.values)) { say('Could not read the gain of f.', 'bad'); return; }
      k = gainAt(a, ev.values[0], resp.poles || [], resp.zeros || []);
    }
    const shown = formsFromResponse(resp, k);
    if (v === 's' || v === 'z') parts.variable.value = v;
    showVar();
    parts.gain.value = shown.gain;
    parts.zeros.value = shown.zeros;
    parts.poles.value = shown.poles;
    parts.num.value = shown.numerator;
    parts.den.value = shown.denominator;
    clearInvalid();
    say(`Read from f(${v}); both forms show it.`, 'good');
    // where k and the coefficients came from: the core's response, or multiplied out here
    parts.message.dataset.source = Array.isArray(resp.gain) && resp.coefficients ? 'core' : 'page';
  }
  parts.read.addEventListener('click', () => readFromF(false));
  // Enter in a field does what its button does: add the pair, or write f.
  for (const input of Object.values(fields)) {
    input.addEventListener('keydown', (e) => {
      if (e.key !== 'Enter' || e.isComposing) return;
      e.preventDefault();
      (input.closest('.entry-pair') ? parts.addPair : parts.write).click();
    });
  }

  box.addEventListener('toggle', () => {
    if (!box.open) return;
    const empty = [parts.num, parts.den, parts.gain, parts.zeros, parts.poles].every((i) => i.value.trim() === '');
    followVar();
    if (empty && hooks.base().f.trim() !== '') readFromF(true);
  });
  showKind();
  followVar();
}

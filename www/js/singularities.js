// The singularities panel: the region, the search (off the main thread and
// cancellable), the table, the markers, the residue at infinity with the sum
// check, the stability reading and, for a chosen point, its principal part in
// MathML with its Laurent coefficients.
import { el, fmtComplex, fmtReal, cAbs, cSub, isFinitePair, responseError } from './util.js';
import { runHeavy, cancelHeavy } from './engine.js';

const MATHML = 'http://www.w3.org/1998/Math/MathML';

export const KIND_WORDS = {
  pole: 'pole', zero: 'zero', essential: 'essential singularity', branch: 'branch point', removable: 'removable point',
};

/** The contour of the chosen region. `view` is [x0, x1, y0, y1]. */
export function regionContour(region, view) {
  if (region.mode === 'circle') {
    const [x, y, r] = region.circle;
    return { shape: 'circle', center: [x, y], radius: r };
  }
  const v = region.mode === 'rect' ? region.rect : view;
  return { shape: 'rectangle', corners: [[v[0], v[2]], [v[1], v[3]]] };
}

/** Why a region cannot be searched, or '' when it can. */
export function regionProblem(contour) {
  if (contour.shape === 'circle') {
    if (!(contour.radius > 0) || !contour.center.every(Number.isFinite)) return 'the circle needs a finite centre and a radius above 0';
  } else {
    const [[a, b], [c, d]] = contour.corners;
    if (![a, b, c, d].every(Number.isFinite) || a === c || b === d) return 'the rectangle needs two different finite corners';
  }
  return '';
}

/** Flatten a singularities response into one list of points. */
export function itemsOf(resp) {
  const items = [];
  const pts = (list) => (Array.isArray(list) ? list : []);
  for (const p of pts(resp.poles)) items.push({ kind: 'pole', at: p.at, order: p.order, residue: p.residue, error: p.error_estimate });
  for (const z of pts(resp.zeros)) items.push({ kind: 'zero', at: z.at, order: z.order, error: z.error_estimate });
  for (const e of pts(resp.essential)) items.push({ kind: 'essential', at: Array.isArray(e) ? e : e.at });
  for (const b of pts(resp.branch_points)) items.push({ kind: 'branch', at: Array.isArray(b) ? b : b.at });
  for (const r of pts(resp.removable)) items.push({ kind: 'removable', at: Array.isArray(r) ? r : r.at });
  return items.filter((it) => isFinitePair(it.at));
}

/** Plain-words stability reading from the poles found, for s (Re s > 0) or z (|z| > 1). */
export function stabilityReading(variable, items, contour) {
  const poles = items.filter((it) => it.kind === 'pole');
  const whole = 'Only poles inside the searched region are counted; widen the region to be sure none lie outside it.';
  if (variable === 's') {
    const tol = (p) => 1e-9 * Math.max(1, cAbs(p.at));
    const right = poles.filter((p) => p.at[0] > tol(p)).length;
    const onAxis = poles.filter((p) => Math.abs(p.at[0]) <= tol(p)).length;
    return `Stability reading: ${right} pole${right === 1 ? '' : 's'} with Re s > 0` +
      (onAxis ? `, ${onAxis} on the imaginary axis` : '') + ` (of ${poles.length} found). ` +
      (right === 0 && onAxis === 0 && poles.length > 0 ? 'No unstable pole was found in the region. ' : '') + whole;
  }
  if (variable === 'z') {
    const tol = (p) => 1e-9 * Math.max(1, cAbs(p.at));
    const outside = poles.filter((p) => cAbs(p.at) > 1 + tol(p)).length;
    const onCircle = poles.filter((p) => Math.abs(cAbs(p.at) - 1) <= tol(p)).length;
    return `Stability reading: ${outside} pole${outside === 1 ? '' : 's'} with |z| > 1` +
      (onCircle ? `, ${onCircle} on the unit circle` : '') + ` (of ${poles.length} found). ` + whole;
  }
  return '';
}

/** Send the search; resolves with the response or an error object. */
export function searchSingularities(base, contour) {
  return runHeavy(Object.assign({}, base, { task: 'singularities', region: contour }));
}
export { cancelHeavy };

/** Fill the table body; `onPick(i)` when a row is chosen. */
export function fillTable(tbody, items, onPick) {
  tbody.textContent = '';
  if (items.length === 0) {
    tbody.append(el('tr', { class: 'empty' }, el('td', { colspan: 5, text: 'No poles, zeros or other special points were found in the region.' })));
    return;
  }
  items.forEach((it, i) => {
    const tr = el('tr', { tabindex: 0, 'data-index': i, title: 'Show the principal part and Laurent coefficients' },
      el('td', { class: 'num', text: fmtComplex(it.at, 8) }),
      el('td', { class: 'kind' }, markerIcon(it.kind), ' ' + KIND_WORDS[it.kind]),
      el('td', { class: 'num', text: it.order === undefined || it.order === null ? '—' : String(it.order) }),
      el('td', { class: 'num', text: it.residue ? fmtComplex(it.residue, 8) : '—' }),
      el('td', { class: 'num', text: Number.isFinite(it.error) ? fmtReal(it.error, 2) : '—' }));
    tr.addEventListener('click', () => onPick(i));
    tr.addEventListener('keydown', (e) => { if (e.key === 'Enter' || e.key === ' ') { e.preventDefault(); onPick(i); } });
    tbody.append(tr);
  });
}

/** Mark the chosen row. */
export function highlightRow(tbody, index) {
  for (const tr of tbody.querySelectorAll('tr')) tr.classList.toggle('picked', Number(tr.dataset.index) === index);
}

/** A small inline SVG of a marker, for the table and the key. */
export function markerIcon(kind) {
  const ns = 'http://www.w3.org/2000/svg';
  const svg = document.createElementNS(ns, 'svg');
  svg.setAttribute('width', '16'); svg.setAttribute('height', '16'); svg.setAttribute('viewBox', '-8 -8 16 16');
  svg.setAttribute('aria-hidden', 'true');
  svg.classList.add('marker-icon');
  const shape = (tag, attrs) => { const s = document.createElementNS(ns, tag); for (const [k, v] of Object.entries(attrs)) s.setAttribute(k, v); svg.append(s); };
  const line = { fill: 'none', stroke: '#111', 'stroke-width': '1.6', 'stroke-linejoin': 'round' };
  if (kind === 'pole') shape('polygon', Object.assign({ points: '0,-6 6,0 0,6 -6,0' }, line));
  else if (kind === 'zero') { shape('circle', Object.assign({ r: 5 }, line)); shape('circle', { r: 2, fill: '#111' }); }
  else if (kind === 'essential') {
    let d = '';
    for (let k = 0; k < 8; k++) { const a = (k * Math.PI) / 4, r = k % 2 ? 3.5 : 6.5; d += `M0 0L${(r * Math.cos(a)).toFixed(2)} ${(r * Math.sin(a)).toFixed(2)}`; }
    shape('path', Object.assign({ d }, line));
  } else if (kind === 'branch') shape('polygon', Object.assign({ points: '0,-6 6,4 -6,4' }, line));
  else shape('rect', Object.assign({ x: -4, y: -4, width: 8, height: 8 }, line));
  return svg;
}

/** Radius for the Laurent annulus: half the distance to the nearest other singular point. */
export function laurentRadius(item, items, fallback) {
  let nearest = Infinity;
  for (const other of items) {
    if (other === item || other.kind === 'zero') continue;
    const d = cAbs(cSub(other.at, item.at));
    if (d > 0 && d < nearest) nearest = d;
  }
  return Number.isFinite(nearest) ? nearest / 2 : fallback;
}

/** Ask for the Laurent coefficients about a point. */
export function requestLaurent(base, item, radius) {
  const order = item.order > 0 ? item.order : (item.kind === 'essential' ? 8 : 0);
  const from = item.kind === 'zero' ? 0 : -order - 2;
  return runHeavy(Object.assign({}, base, { task: 'laurent', center: item.at, inner: 0, outer: radius, from, to: 3 }));
}

// ---- MathML --------------------------------------------------------------------

function m(tag, ...children) {
  const node = document.createElementNS(MATHML, tag);
  for (const c of children) node.append(typeof c === 'string' ? document.createTextNode(c) : c);
  return node;
}
function mn(x) { return m('mn', fmtReal(Math.abs(x), 8)); }

/** (v − z0) as MathML. */
function shift(variable, z0) {
  if (z0[0] === 0 && z0[1] === 0) return m('mi', variable);
  const row = m('mrow', m('mi', variable));
  const re = z0[0], im = z0[1];
  if (re !== 0) row.append(m('mo', re > 0 ? '−' : '+'), mn(re));
  if (im !== 0) {
    row.append(m('mo', (im > 0) === true ? '−' : '+'));
    if (Math.abs(im) !== 1) row.append(mn(im), m('mo', '\u2062'));
    row.append(m('mi', 'i'));
  }
  return row;
}

/** A complex coefficient as MathML; `wrap` adds parentheses when it has two parts. */
function coefficient(c) {
  const [re, im] = c;
  if (im === 0) return { node: mn(re), negative: re < 0, one: Math.abs(re) === 1 };
  if (re === 0) {
    const node = m('mrow');
    if (Math.abs(im) !== 1) node.append(mn(im), m('mo', '\u2062'));
    node.append(m('mi', 'i'));
    return { node, negative: im < 0, one: false };
  }
  const node = m('mrow', m('mo', '('), re < 0 ? m('mo', '−') : '', mn(re), m('mo', im < 0 ? '−' : '+'));
  if (Math.abs(im) !== 1) node.append(mn(im), m('mo', '\u2062'));
  node.append(m('mi', 'i'), m('mo', ')'));
  return { node, negative: false, one: false };
}

/** The principal part Σ_{n<0} c_n (v − z0)^n written out; terms below `cutoff` are left out. */
export function principalPartMathML(variable, z0, coefficients, cutoff) {
  const math = m('math');
  math.setAttribute('display', 'block');
  const row = m('mrow');
  const terms = coefficients.filter((t) => t.n < 0 && isFinitePair(t.c) && cAbs(t.c) > cutoff).sort((a, b) => a.n - b.n);
  if (terms.length === 0) row.append(m('mn', '0'));
  terms.forEach((t, i) => {
    const { node, negative, one } = coefficient(t.c);
    if (i > 0) row.append(m('mo', negative ? '−' : '+'));
    else if (negative) row.append(m('mo', '−'));
    const k = -t.n;
    const base = shift(variable, z0);
    const needParens = !(z0[0] === 0 && z0[1] === 0);
    const power = k === 1 ? base
      : m('msup', needParens ? m('mrow', m('mo', '('), base, m('mo', ')')) : base, m('mn', String(k)));
    row.append(m('mfrac', one ? m('mn', '1') : node, power));
  });
  math.append(row);
  return math;
}

/** Fill the detail box for one item from a laurent response. */
export function showDetail(parts, variable, item, response, radius) {
  parts.box.hidden = false;
  parts.title.textContent = `${KIND_WORDS[item.kind][0].toUpperCase() + KIND_WORDS[item.kind].slice(1)} at ${variable} = ${fmtComplex(item.at, 8)}`;
  parts.math.textContent = '';
  parts.body.textContent = '';
  const err = responseError(response);
  if (err) {
    parts.note.textContent = err.message === 'cancelled' ? 'Stopped.' : 'Laurent series not available: ' + err.message;
    return;
  }
  const coeffs = Array.isArray(response.coefficients) ? response.coefficients : [];
  const est = Number.isFinite(response.error_estimate) ? response.error_estimate : 0;
  const biggest = Math.max(0, ...coeffs.filter((t) => isFinitePair(t.c)).map((t) => cAbs(t.c)));
  const cutoff = Math.max(10 * est, 1e-13 * biggest);
  const label = el('p', { class: 'detail-label', text: item.kind === 'zero' ? 'Principal part (none expected at a zero):' : 'Principal part:' });
  parts.math.append(label, principalPartMathML(variable, item.at, coeffs, cutoff));
  parts.note.textContent = `Series about ${variable} = ${fmtComplex(item.at, 6)} valid for 0 < |${variable} − ${variable}₀| < ${fmtReal(radius, 4)}` +
    ` (half the distance to the nearest other singular point). Error estimate ${fmtReal(est, 2)}; terms below ${fmtReal(cutoff, 2)} are left out of the formula but listed below.`;
  for (const t of coeffs) parts.body.append(el('tr', {}, el('td', { class: 'num', text: String(t.n) }), el('td', { class: 'num', text: fmtComplex(t.c, 10) })));
}

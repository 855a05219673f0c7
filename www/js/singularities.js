// The singularities panel: the search request (run off the main thread and
// cancellable), the table, the markers, the residue at infinity with the sum
// check, the stability reading and, for a chosen point, its principal part in
// MathML with its Laurent coefficients.
import { el } from './dom.js';
import { cAbs, cSub, isFinitePair } from './complex.js';
import { fmtComplex, fmtReal, fmtSig, fmtSigLines, fmtExact, trimBelow, trimComplex } from './format.js';
import { mathEl, mathMagnitude, mathCoefficient } from './mathml.js';
import { latexButton } from './latex.js';
import { runHeavy, responseError } from './engine.js';
import { KIND_WORDS, markerIcon } from './markers.js';
import { regionWords } from './region.js';
import { windingNumber } from './contour-geom.js';


/** Flatten a singularities response into one list of points. `floor` is the size below which a
 *  location's real or imaginary part is rounding noise (a small fraction of the region's size). */
export function itemsOf(resp, floor = 0) {
  const items = [];
  const pts = (list) => (Array.isArray(list) ? list : []);
  const pp = (p) => (Array.isArray(p.principal_part) ? p.principal_part.filter(isFinitePair) : []);
  const method = resp.method; // 'rational' or 'numerical': which method produced each point
  for (const p of pts(resp.poles)) items.push({ kind: 'pole', at: p.at, order: p.order, residue: p.residue, error: p.error_estimate, principal: pp(p), method });
  for (const z of pts(resp.zeros)) items.push({ kind: 'zero', at: z.at, order: z.order, error: z.error_estimate });
  for (const e of pts(resp.essential)) {
    const at = Array.isArray(e) ? e : e.at;
    items.push({ kind: 'essential', at, residue: e.residue, error: e.error_estimate });
  }
  for (const b of pts(resp.branch_points)) items.push({ kind: 'branch', at: Array.isArray(b) ? b : b.at });
  for (const r of pts(resp.removable)) items.push({ kind: 'removable', at: Array.isArray(r) ? r : r.at });
  for (const it of items) it.floor = floor;
  return items.filter((it) => isFinitePair(it.at));
}

/** Does the region hold the closed unit disc? */
function coversUnitDisc(contour) {
  if (contour.shape === 'circle') return cAbs(contour.center) + 1 < contour.radius;
  if (contour.shape !== 'rectangle') {
    // every point of a circle just outside the unit circle is inside the contour (and it holds 0)
    return windingNumber(contour, [0, 0]) !== 0 &&
      Array.from({ length: 64 }, (_, k) => [1.0001 * Math.cos(k * Math.PI / 32), 1.0001 * Math.sin(k * Math.PI / 32)]).every((p) => windingNumber(contour, p));
  }
  const [[a, b], [c, d]] = contour.corners;
  return Math.min(a, c) < -1 && Math.max(a, c) > 1 && Math.min(b, d) < -1 && Math.max(b, d) > 1;
}

/** A conditional transfer-function reading of the poles found, only for the variable s
 *  (continuous time: Re s > 0 is unstable) or z (discrete time: |z| > 1 is unstable, and only
 *  when f is rational in z, `method` 'rational': z is also the default variable of any f).
 *  Returns {title, text} or null for any other variable. */
export function stabilityReading(variable, items, contour, method = 'rational') {
  const poles = items.filter((it) => it.kind === 'pole');
  const tol = (p) => 1e-9 * Math.max(1, cAbs(p.at));
  const n = poles.length;
  const where = regionWords(variable, contour);
  const plural = (k, word) => `${k} ${word}${k === 1 ? '' : 's'}`;
  if (variable === 's') {
    const right = poles.filter((p) => p.at[0] > tol(p)).length;
    const onAxis = poles.filter((p) => Math.abs(p.at[0]) <= tol(p)).length;
    const rightmost = n ? Math.max(...poles.map((p) => p.at[0])) : NaN;
    let text = n === 0 ? 'No pole was found in the region. '
      : `Of the ${plural(n, 'pole')} found, ${right} ${right === 1 ? 'has' : 'have'} Re s > 0` +
        (onAxis ? ` and ${onAxis} ${onAxis === 1 ? 'lies' : 'lie'} on the imaginary axis` : '') +
        `; the rightmost is at Re s = ${fmtReal(rightmost, 6)}. ` +
        (right === 0 && onAxis === 0 ? 'No pole in the right half-plane was found. ' : '');
    text += `Only the searched region (${where}) was examined: a pole outside it would be missed, and the right half-plane never fits in a finite region, so widen the region to be sure.`;
    return { title: 'Read as a continuous-time transfer function H(s)', text };
  }
  if (variable === 'z' && method === 'rational') {
    const outside = poles.filter((p) => cAbs(p.at) > 1 + tol(p)).length;
    const onCircle = poles.filter((p) => Math.abs(cAbs(p.at) - 1) <= tol(p)).length;
    const largest = n ? Math.max(...poles.map((p) => cAbs(p.at))) : NaN;
    let text = n === 0 ? 'No pole was found in the region. '
      : `Of the ${plural(n, 'pole')} found, ${outside} ${outside === 1 ? 'has' : 'have'} |z| > 1` +
        (onCircle ? ` and ${onCircle} ${onCircle === 1 ? 'lies' : 'lie'} on the unit circle` : '') +
        `; the largest pole modulus is ${fmtReal(largest, 6)}. `;
    text += `Only the searched region (${where}) was examined: a pole outside it would be missed` +
      (coversUnitDisc(contour) ? '.' : ', and this region does not even cover the whole unit disc.') +
      ' Widen the region to be sure.';
    return { title: 'Read as a discrete-time transfer function H(z)', text };
  }
  return null;
}

/** Send the search; resolves with the response or an error object (`ticket`: see runHeavy). */
export function searchSingularities(base, contour, ticket = null) {
  return runHeavy(Object.assign({}, base, { task: 'singularities', region: contour }), ticket);
}

/** Residue at infinity and the residue-sum check, in one short line each (`parts`: resInf, sumCheck). */
export function showSums(parts, resp, items) {
  const rinf = resp.residue_at_infinity;
  parts.resInf.textContent = isFinitePair(rinf) ? fmtSig(rinf, 10) : 'not available for this function (see the warnings)';
  parts.resInf.title = isFinitePair(rinf) ? 'Full precision: ' + fmtExact(rinf) : '';
  const withResidue = items.filter((it) => (it.kind === 'pole' || it.kind === 'essential') && isFinitePair(it.residue));
  const sum = withResidue.reduce((acc, it) => [acc[0] + it.residue[0], acc[1] + it.residue[1]], [0, 0]);
  if (!isFinitePair(rinf)) {
    parts.sumCheck.textContent = `Σ residues in the region = ${fmtSig(sum, 10)} (no check without the residue at infinity)`;
    return;
  }
  const total = cAbs([sum[0] + rinf[0], sum[1] + rinf[1]]);
  const scale = Math.max(1e-300, cAbs(rinf), ...withResidue.map((it) => cAbs(it.residue)));
  const small = total <= 1e-8 * scale + 1e-13;
  parts.sumCheck.textContent = `|Σ residues in the region + Res∞| = ${fmtReal(total, small ? 2 : 6)}` +
    (small ? ' (about 0, as expected when the region holds every finite singularity)'
      : ' — not 0, so f has singular points outside the region (or a residue is inaccurate)');
  parts.sumCheck.classList.toggle('bad', !small);
}

/** A table cell holding a complex number on one or two lines, 10 significant digits;
 *  the full double-precision value is in the title (and in the copied text). */
function complexCell(z, floor = 0) {
  if (!isFinitePair(z)) return el('td', { class: 'num', text: '—' });
  const [a, b] = fmtSigLines(z, 10, floor);
  const td = el('td', { class: 'num', title: 'Full precision: ' + fmtExact(z) }, el('span', { class: 'cline', text: a }));
  if (b) td.append(el('span', { class: 'cline', text: b }));
  return td;
}

/** Rows the table shows at a time: a page of this many rows is built in well under 50 ms, so a
 *  search with thousands of points never stalls the page (the markers show them all). */
export const TABLE_PAGE = 100;
/** Rows put in per task while a page is built. */
const ROW_CHUNK = 10;

/** The winding-number cell of row `tr`: `k` an integer, null (the point is on the contour) or
 *  undefined (not known). */
function windingCell(tr, k) {
  const cell = tr.querySelector('td.winding');
  if (!cell) return;
  cell.textContent = k === null || k === undefined ? (k === null ? 'on it' : '—') : String(k).replace('-', '−');
  cell.title = k === null ? 'The point lies on the contour' : '';
  tr.dataset.winding = k === null || k === undefined ? '' : String(k);
}

/** The winding-number column: `w[i]` for row i (kept on the body for the rows of other pages). */
export function showWindings(tbody, w) {
  tbody.windings = w;
  for (const tr of tbody.querySelectorAll('tr[data-index]')) windingCell(tr, w[Number(tr.dataset.index)]);
}

/** The cell with its column's name (shown above the value where a phone's narrow screen stacks
 *  the columns, style.css). */
function labelled(td, label) {
  td.dataset.label = label;
  return td;
}

/** One row of the table for item `it` at index `i` (its winding from `windings`, when known). */
function tableRow(it, i, onPick, windings) {
  const tr = el('tr', { tabindex: 0, 'data-index': i, 'data-kind': it.kind, 'data-at': JSON.stringify(it.at),
    'data-residue': isFinitePair(it.residue) ? JSON.stringify(it.residue) : null, title: 'Show the principal part and Laurent coefficients' },
    labelled(complexCell(it.at, it.floor), 'Location'),
    el('td', { class: 'kind', 'data-label': 'Kind' }, markerIcon(it.kind), ' ' + KIND_WORDS[it.kind]),
    el('td', { class: 'num', 'data-label': 'Order', text: it.order === undefined || it.order === null ? '—' : String(it.order) }),
    labelled(complexCell(it.residue), 'Residue'),
    el('td', { class: 'num', 'data-label': 'Error estimate', text: Number.isFinite(it.error) ? fmtReal(it.error, 2) : '—' }),
    el('td', { class: 'num winding', 'data-label': 'Winding', text: '—' }));
  if (windings) windingCell(tr, windings[i]);
  tr.addEventListener('click', () => onPick(i));
  tr.addEventListener('keydown', (e) => { if (e.key === 'Enter' || e.key === ' ') { e.preventDefault(); onPick(i); } });
  return tr;
}

/** Fill the table body, TABLE_PAGE rows at a time, with Previous / Next below it in `pager`
 *  (an element, or null); `onPick(i)` when a row is chosen. The body keeps its pager as
 *  `tbody.pager` ({page, pages, show(p), showRowOf(i)}). Resolves once the first page is in. */
export function fillTable(tbody, items, onPick, pager = document.getElementById('sing-pager')) {
  tbody.textContent = '';
  if (pager) { pager.textContent = ''; pager.hidden = true; }
  tbody.pager = null;
  tbody.windings = null;
  if (items.length === 0) {
    tbody.append(el('tr', { class: 'empty' }, el('td', { colspan: 6, text: 'No poles, zeros or other special points were found in the region.' })));
    return Promise.resolve(true);
  }
  const pages = Math.ceil(items.length / TABLE_PAGE);
  const state = { page: 0, pages };
  const label = el('span', { class: 'pager-label', 'aria-live': 'polite' });
  const prev = el('button', { type: 'button', class: 'small', id: 'sing-prev', text: 'Previous rows' });
  const next = el('button', { type: 'button', class: 'small', id: 'sing-next', text: 'Next rows' });
  let generation = 0;
  /** Show page `p`; its rows go in ROW_CHUNK at a time, one task each (resolves when all are in). */
  state.show = (p) => {
    const gen = ++generation;
    state.page = Math.max(0, Math.min(pages - 1, p));
    const from = state.page * TABLE_PAGE, to = Math.min(items.length, from + TABLE_PAGE);
    tbody.textContent = '';
    label.textContent = `Rows ${from + 1}–${to} of ${items.length}`;
    prev.disabled = state.page === 0;
    next.disabled = state.page === pages - 1;
    if (pager) pager.dataset.page = String(state.page);
    const put = (a) => {
      const rows = document.createDocumentFragment();
      for (let i = a; i < Math.min(to, a + ROW_CHUNK); i++) rows.append(tableRow(items[i], i, onPick, tbody.windings));
      tbody.append(rows);
    };
    put(from);
    if (from + ROW_CHUNK >= to) return Promise.resolve(true);
    return new Promise((resolve) => {
      let a = from + ROW_CHUNK;
      const step = () => {
        if (gen !== generation) { resolve(false); return; }
        put(a);
        a += ROW_CHUNK;
        if (a < to) setTimeout(step, 0); else resolve(true);
      };
      setTimeout(step, 0);
    });
  };
  /** Show the page holding row `i`. */
  state.showRowOf = (i) => { const p = Math.floor(i / TABLE_PAGE); return p !== state.page ? state.show(p) : Promise.resolve(true); };
  prev.addEventListener('click', () => state.show(state.page - 1));
  next.addEventListener('click', () => state.show(state.page + 1));
  tbody.pager = state;
  if (pager && pages > 1) {
    pager.append(prev, label, next);
    pager.hidden = false;
  }
  return state.show(0);
}

/** Mark the chosen row (turning to its page first). */
export function highlightRow(tbody, index) {
  const mark = () => { for (const tr of tbody.querySelectorAll('tr')) tr.classList.toggle('picked', Number(tr.dataset.index) === index); };
  if (tbody.pager) tbody.pager.showRowOf(index).then(mark);
  mark();
}

/** Radius for the Laurent annulus: half the distance to the nearest other singular point,
 *  or `fallback` when none was found. Returns {radius, why} (the reason in words). */
export function laurentRadius(item, items, fallback) {
  let nearest = Infinity;
  for (const other of items) {
    if (other === item || other.kind === 'zero') continue;
    const d = cAbs(cSub(other.at, item.at));
    if (d > 0 && d < nearest) nearest = d;
  }
  return Number.isFinite(nearest)
    ? { radius: nearest / 2, why: 'half the distance to the nearest other singular point found' }
    : { radius: fallback, why: 'no other singular point was found in the region' };
}

/** Ask for the Laurent coefficients about a point (none for a branch point: f has no
 *  Laurent series about it). Resolves with the response or an error object. */
export function requestLaurent(base, item, radius) {
  if (item.kind === 'branch') {
    return Promise.resolve({ error: { code: 'not_applicable', message: 'f is not single-valued around a branch point, so it has no Laurent series there', span: null } });
  }
  const order = item.order > 0 ? item.order : 0;
  const from = item.kind === 'zero' || item.kind === 'removable' ? 0 : item.kind === 'essential' ? -12 : -order - 2;
  return runHeavy(Object.assign({}, base, { task: 'laurent', center: item.at, inner: 0, outer: radius, from, to: 3 }));
}

// ---- MathML --------------------------------------------------------------------

/** (v − z0) as MathML. */
function shift(variable, z0) {
  if (z0[0] === 0 && z0[1] === 0) return mathEl('mi', variable);
  const row = mathEl('mrow', mathEl('mi', variable));
  const re = z0[0], im = z0[1];
  if (re !== 0) row.append(mathEl('mo', re > 0 ? '−' : '+'), mathMagnitude(re));
  if (im !== 0) {
    row.append(mathEl('mo', im > 0 ? '−' : '+'));
    if (Math.abs(im) !== 1) row.append(mathMagnitude(im), mathEl('mo', '\u2062'));
    row.append(mathEl('mi', 'i'));
  }
  return row;
}

/** The principal part Σ_{n<0} c_n (v − z0)^n written out. Coefficient parts below `level`
 *  (the error level) are written as 0; `more` appends "+ ⋯" (an essential singularity). */
export function principalPartMathML(variable, z0, coefficients, level, more, floor = 0, maxTerms = 12) {
  const math = mathEl('math');
  math.setAttribute('display', 'block');
  const row = mathEl('mrow');
  const terms = coefficients
    .filter((t) => t.n < 0 && isFinitePair(t.c))
    .map((t) => ({ n: t.n, c: trimBelow(t.c, level) }))
    .filter((t) => t.c[0] !== 0 || t.c[1] !== 0)
    .sort((a, b) => b.n - a.n);
  if (terms.length > maxTerms) { terms.length = maxTerms; more = true; }
  if (terms.length === 0) row.append(mathEl('mn', '0'));
  const centre = trimComplex(z0, 12, floor);
  terms.forEach((t, i) => {
    const { node, negative, one } = mathCoefficient(t.c);
    if (i > 0) row.append(mathEl('mo', negative ? '−' : '+'));
    else if (negative) row.append(mathEl('mo', '−'));
    const k = -t.n;
    const base = shift(variable, centre);
    const needParens = !(centre[0] === 0 && centre[1] === 0);
    const power = k === 1 ? base
      : mathEl('msup', needParens ? mathEl('mrow', mathEl('mo', '('), base, mathEl('mo', ')')) : base, mathEl('mn', String(k)));
    row.append(mathEl('mfrac', one ? mathEl('mn', '1') : node, power));
  });
  if (more && terms.length) row.append(mathEl('mo', '+'), mathEl('mo', '⋯'));
  math.append(row);
  return math;
}

/** Which method produced a pole's principal part, as the detail's label says it. */
export function principalPartSource(method) {
  if (method === 'rational') return 'Principal part (from the partial fractions of the rational function: exact in form, the poles are polynomial roots to about double precision):';
  return 'Principal part (numerical: Laurent coefficients by the trapezoidal rule on circles around the point, from the search):';
}

/** Fill the detail box for one item from a laurent response. */
export function showDetail(parts, variable, item, response, annulus) {
  const radius = annulus.radius;
  parts.box.hidden = false;
  parts.title.textContent = `${KIND_WORDS[item.kind][0].toUpperCase() + KIND_WORDS[item.kind].slice(1)} at ${variable} = ${fmtSig(item.at, 10, item.floor)}`;
  parts.math.textContent = '';
  parts.body.textContent = '';
  parts.warnings.textContent = '';
  const err = responseError(response);
  const coeffs = err ? [] : (Array.isArray(response.coefficients) ? response.coefficients : []);
  const est = !err && Number.isFinite(response.error_estimate) ? response.error_estimate : 0;
  const biggest = Math.max(0, ...coeffs.filter((t) => isFinitePair(t.c)).map((t) => cAbs(t.c)));
  const level = Math.max(10 * est, 1e-13 * biggest);
  // The search's own principal part (a pole): say which method produced it.
  const exact = item.kind === 'pole' && Array.isArray(item.principal) && item.principal.length > 0;
  const notes = [];
  if (item.kind === 'zero' || item.kind === 'removable') {
    parts.math.append(el('p', { class: 'detail-label', text: `No principal part: f is analytic at a ${KIND_WORDS[item.kind]}.` }));
  } else if (exact) {
    // The search's principal part: partial fractions for a rational f, trapezoidal Laurent
    // coefficients on circles around the point for any other f.
    const ppLevel = Math.max(10 * (Number.isFinite(item.error) ? item.error : 0), 1e-15 * Math.max(...item.principal.map(cAbs)));
    const pp = item.principal.map((c, k) => ({ n: -(k + 1), c }));
    const math = principalPartMathML(variable, item.at, pp, ppLevel, false, item.floor);
    parts.math.append(el('p', { class: 'detail-label', 'data-method': item.method || '', text: principalPartSource(item.method) }),
      math, latexButton(math, 'the principal part'));
  } else if (!err) {
    parts.math.append(el('p', { class: 'detail-label', text: item.kind === 'essential'
      ? 'Principal part (infinitely many terms; the first ones, from the Laurent coefficients below):'
      : 'Principal part (from the Laurent coefficients below):' }),
    principalPartMathML(variable, item.at, coeffs, level, item.kind === 'essential', item.floor, item.kind === 'essential' ? 4 : 12));
    const math = parts.math.querySelector('math');
    if (math) parts.math.append(latexButton(math, 'the principal part'));
  }
  if (err) {
    notes.push(err.code === 'cancelled' ? 'Stopped.' : 'Laurent series not available: ' + err.message + '.');
  } else {
    notes.push(`Laurent series about ${variable}₀ = ${fmtSig(item.at, 10, item.floor)}, valid for 0 < |${variable} − ${variable}₀| < ${fmtReal(radius, 4)}` +
      ` (${annulus.why}).` +
      ` Error estimate ${fmtReal(est, 2)}; parts below ${fmtReal(level, 2)} are shown as ≈ 0.`);
    // Never hide disagreement: compare c₋₁ with the residue reported by the search.
    const c1 = coeffs.find((t) => t.n === -1);
    if (c1 && isFinitePair(c1.c) && isFinitePair(item.residue)) {
      const diff = cAbs(cSub(c1.c, item.residue));
      const allowed = Math.max(100 * (est + (Number.isFinite(item.error) ? item.error : 0)), 1e-9 * cAbs(item.residue), 1e-12);
      if (diff > allowed) {
        parts.warnings.append(el('li', { text: `The Laurent coefficient c₋₁ = ${fmtSig(c1.c, 10)} and the residue from the search, ${fmtSig(item.residue, 10)}, differ by ${fmtReal(diff, 2)}: trust neither until the cause is found (try a smaller region around the point).` }));
      }
    }
    for (const w of Array.isArray(response.warnings) ? response.warnings : []) parts.warnings.append(el('li', { text: String(w) }));
  }
  if (exact) notes.push(`Residue error estimate ${fmtReal(item.error, 2)}.`);
  parts.note.textContent = notes.join(' ');
  parts.table.hidden = coeffs.length === 0;
  for (const t of coeffs) {
    const shown = isFinitePair(t.c) ? trimBelow(t.c, level) : t.c;
    const tiny = isFinitePair(shown) && shown[0] === 0 && shown[1] === 0;
    const td = tiny
      ? el('td', { class: 'num dim', text: '≈ 0', title: `|c| = ${fmtReal(cAbs(t.c), 2)}, below the error level` })
      : el('td', { class: 'num', title: 'Full precision: ' + fmtExact(t.c), text: fmtComplex(shown, 10) });
    parts.body.append(el('tr', { 'data-n': t.n, 'data-c': JSON.stringify(t.c) }, el('td', { class: 'num', text: String(t.n).replace('-', '−') }), td));
  }
}

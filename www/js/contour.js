// The contour-integral block: ∮ f around the region's boundary, computed by the
// core three independent ways (residues inside; residues outside and at
// infinity; direct quadrature), each shown with its error estimate, and any
// disagreement between them shown in a warning style, never hidden. Also the
// argument-principle count of zeros and poles inside the contour.
import { el } from './dom.js';
import { isFinitePair } from './complex.js';
import { fmtReal, fmtSig, fmtSigLines, fmtExact, trimBelow } from './format.js';
import { runHeavy, responseError } from './engine.js';

/** The three ways, in the order shown; `key` is the response field suffix. */
const WAYS = [
  { key: 'inside_residues', name: 'Residues inside', how: '2πi × Σ (winding × residue) over the points inside' },
  { key: 'outside_residues', name: 'Residues outside and at infinity', how: '−2πi × (Σ residues outside + residue at ∞)' },
  { key: 'quadrature', name: 'Quadrature along the contour', how: 'the integral summed numerically along the path' },
];

/** The contour in words: its shape, where it lies and its direction (`direction` −1: clockwise). */
export function contourWords(variable, contour, isView, direction = 1) {
  const v = variable;
  const way = direction < 0 ? 'clockwise' : 'counter-clockwise';
  if (contour.shape === 'circle') {
    const [cx, cy] = contour.center;
    const centre = cx === 0 && cy === 0 ? v
      : cy === 0 ? `${v} ${cx < 0 ? '+' : '−'} ${fmtReal(Math.abs(cx), 6)}` : `${v} − (${fmtSig(contour.center, 6)})`;
    return `∮ f(${v}) d${v} once ${way} around the circle |${centre}| = ${fmtReal(contour.radius, 6)}`;
  }
  if (contour.shape === 'ellipse') {
    const [a, b] = contour.semi_axes;
    const t = contour.angle || 0;
    return `∮ f(${v}) d${v} once ${way} around the ellipse centred at ${fmtSig(contour.center, 6)} with semi-axes ${fmtReal(a, 6)} and ${fmtReal(b, 6)}` +
      (t !== 0 ? `, turned by ${fmtReal((t * 180) / Math.PI, 4)} degrees` : '');
  }
  if (contour.shape === 'half_disc') {
    return `∮ f(${v}) d${v} once ${way} around the ${contour.direction} half-disc of radius ${fmtReal(contour.radius, 6)} about ${fmtSig(contour.center, 6)} (its diameter, then its half circle)`;
  }
  if (contour.shape === 'keyhole') {
    const g = contour.gap === undefined ? 0.001 * contour.inner : contour.gap;
    return `∮ f(${v}) d${v} once ${way} around the keyhole about ${fmtSig(contour.center, 6)}: radii ${fmtReal(contour.inner, 6)} and ${fmtReal(contour.outer, 6)}, ` +
      `the slit at ${fmtReal(((contour.angle || 0) * 180) / Math.PI, 4)} degrees with half-width ${fmtReal(g, 3)} (out along one edge, round the outer circle, back along the other, round the inner circle the other way)`;
  }
  if (contour.shape === 'polygon') {
    return `∮ f(${v}) d${v} once ${way} around the polygon through ` + contour.vertices.map((p) => fmtSig(p, 4)).join(', ');
  }
  const [[a, b], [c, d]] = contour.corners;
  return `∮ f(${v}) d${v} once ${way} around the ${isView ? 'border of the current view' : 'rectangle'}: ` +
    `Re ${v} from ${fmtReal(Math.min(a, c), 6)} to ${fmtReal(Math.max(a, c), 6)}, Im ${v} from ${fmtReal(Math.min(b, d), 6)} to ${fmtReal(Math.max(b, d), 6)}`;
}

/** Ask the worker for the integral and then the count; each resolves with a response or an error object. */
export function requestContourIntegral(base, contour) {
  return runHeavy(Object.assign({}, base, { task: 'contour_integral', contour }));
}
export function requestArgumentCount(base, contour) {
  return runHeavy(Object.assign({}, base, { task: 'argument_count', contour }));
}

/** A complex value to 10 significant digits; parts below `level` (its error estimate) read 0. */
function valueText(z, level) {
  return fmtSig(trimBelow(z, level), 10);
}

function estimateText(e) {
  return Number.isFinite(e) ? fmtReal(e, 2) : '—';
}

/** Put the block into its "working" or "stale" look with a status line. */
export function contourStatus(parts, text, look) {
  parts.status.textContent = text;
  parts.box.classList.toggle('stale', look === 'stale');
  parts.box.dataset.state = look;
}

/** The direction of a contour as the core takes it: a polygon by its vertex order (the shoelace
 *  sign), every other shape counter-clockwise. */
function coreDirection(contour) {
  if (contour.shape !== 'polygon') return 1;
  let s = 0;
  const v = contour.vertices;
  for (let k = 0; k < v.length; k++) s += v[k][0] * v[(k + 1) % v.length][1] - v[(k + 1) % v.length][0] * v[k][1];
  return s < 0 ? -1 : 1;
}

/** Fill the block from a contour_integral response. `sign` −1: the page takes the contour the
 *  other way round from the core (the reverse control on a circle, ellipse or rectangle; the
 *  contract has no orientation field for them), so the integral along it is −1 × the core's value. */
export function showContourIntegral(parts, variable, contour, isView, resp, sign = 1) {
  parts.box.hidden = false;
  parts.box.classList.remove('stale', 'disagree');
  parts.contour.textContent = contourWords(variable, contour, isView, coreDirection(contour) * sign) + '.';
  if (parts.orientation) {
    const value = isFinitePair(resp && resp.value) ? resp.value : null;
    parts.orientation.hidden = !(sign < 0);
    parts.orientation.textContent = sign < 0
      ? 'Taken clockwise (reversed): the values below are for the counter-clockwise contour the computing core integrates; along the reversed contour the integral is −1 times them' +
        (value ? `, ${valueText([-value[0], -value[1]], resp.error_estimate)}.` : '.')
      : '';
    parts.orientation.dataset.value = sign < 0 && value ? JSON.stringify([-value[0], -value[1]]) : '';
  }
  parts.ways.textContent = '';
  parts.warnings.textContent = '';
  parts.value.textContent = '';
  parts.verdict.textContent = '';
  parts.verdict.className = 'ci-verdict';
  const err = responseError(resp);
  parts.result.hidden = Boolean(err);
  if (err) {
    const stopped = err.code === 'cancelled';
    contourStatus(parts, stopped ? 'Stopped before the contour integral finished.' : 'The contour integral was not computed: ' + err.message + '.', stopped ? 'stale' : 'error');
    parts.box.dataset.state = stopped ? 'stopped' : 'error';
    return;
  }
  contourStatus(parts, '', 'done');
  const warnings = (Array.isArray(resp.warnings) ? resp.warnings : []).map(String);

  // The value, with its error estimate and the way it was taken from.
  const value = isFinitePair(resp.value) ? resp.value : null;
  const from = WAYS.find((w) => w.key === resp.value_from);
  parts.value.dataset.value = JSON.stringify(resp.value);
  parts.value.append(
    el('span', { class: 'ci-number', title: value ? 'Full precision: ' + fmtExact(value) : '', text: value ? valueText(value, resp.error_estimate) : 'not available' }),
    el('span', { class: 'ci-est', text: ` error estimate ${estimateText(resp.error_estimate)}` + (from ? ` (from: ${from.name.toLowerCase()})` : '') }));

  // The three ways.
  const available = [];
  for (const way of WAYS) {
    const z = resp['by_' + way.key];
    const e = resp[way.key + '_error_estimate'];
    const tr = el('tr', { 'data-way': way.key, 'data-value': JSON.stringify(z ?? null), 'data-error': Number.isFinite(e) ? String(e) : '' },
      el('th', { scope: 'row' }, el('span', { class: 'ci-way', text: way.name }), el('span', { class: 'ci-how', text: way.how })));
    if (isFinitePair(z)) {
      available.push({ way, z, e: Number.isFinite(e) ? e : NaN });
      const [lineA, lineB] = fmtSigLines(trimBelow(z, e), 10);
      const cell = el('td', { class: 'num', title: 'Full precision: ' + fmtExact(z) }, el('span', { class: 'cline', text: lineA }));
      if (lineB) cell.append(el('span', { class: 'cline', text: lineB }));
      tr.append(cell,
        el('td', { class: 'num', text: estimateText(e) }));
    } else {
      // The core says why a way is missing, keyed by the way's wire name.
      const reason = (resp.not_available && typeof resp.not_available[way.key] === 'string') ? resp.not_available[way.key] : '';
      tr.classList.add('missing');
      tr.append(el('td', { colspan: 2, class: 'ci-missing', text: '—, not available: ' + (reason || 'see the warnings below') }));
    }
    parts.ways.append(tr);
  }

  showAgreement(parts.verdict, parts.box, resp, available.map((a) => a.e));
  for (const w of warnings) parts.warnings.append(el('li', { text: w }));
}

/** How independent ways agree, shown in `verdict` (a <p>) and marked on `box` (data-agree
 *  yes | no | unchecked, class disagree): the largest difference against the sum of the error
 *  estimates `errors` (one per available way), and the core's `agreement` sentence and `verdict`
 *  word from `resp`. Disagreement is shown, never hidden. Shared by every block computing one
 *  value in independent ways (the contour integral, the real integral). Returns 'yes' | 'no' | 'unchecked'. */
export function showAgreement(verdict, box, resp, errors) {
  const maxD = Number(resp.max_discrepancy);
  const sumErr = errors.reduce((s, e) => s + (Number.isFinite(e) ? e : Infinity), 0);
  const agreement = typeof resp.agreement === 'string' ? resp.agreement : '';
  const flagged = resp.verdict === 'disagree' || resp.verdict === 'covered';
  const disagree = errors.length >= 2 && (!(maxD <= sumErr) || flagged);
  const lines = [];
  if (errors.length >= 2) {
    lines.push(`Largest difference between the ${errors.length} ways: ${estimateText(maxD)}` +
      ` (their error estimates add up to ${estimateText(sumErr)}${disagree ? '' : '; the difference is within them'}).`);
  } else {
    lines.push('Only one way could be computed, so nothing checks this value.');
  }
  if (agreement) lines.push('Verdict: ' + agreement.charAt(0).toUpperCase() + agreement.slice(1) + (agreement.endsWith('.') ? '' : '.'));
  verdict.textContent = lines.join(' ');
  if (disagree) verdict.prepend(el('strong', { text: 'The ways disagree by more than their error estimates allow: do not rely on the value until the cause is found. ' }));
  verdict.classList.toggle('disagree', disagree);
  verdict.classList.toggle('unchecked', errors.length < 2);
  box.classList.toggle('disagree', disagree);
  const word = disagree ? 'no' : errors.length < 2 ? 'unchecked' : 'yes';
  box.dataset.agree = word;
  return word;
}

/** One line from an argument_count response: "Inside the contour: N zeros, P poles (...)". */
export function showArgumentCount(parts, resp) {
  parts.count.textContent = '';
  const err = responseError(resp);
  if (err) {
    parts.count.textContent = err.code === 'cancelled' ? '' : 'Zeros and poles inside: not counted (' + err.message + ').';
    parts.count.dataset.k = '';
    return;
  }
  const k = Number(resp.zeros_minus_poles);
  const plural = (n, word) => `${n} ${word}${n === 1 ? '' : 's'}`;
  const kText = Number.isFinite(k) ? String(k).replace('-', '−') : '?';
  parts.count.dataset.k = Number.isFinite(k) ? String(k) : '';
  parts.count.textContent = Number.isInteger(resp.zeros) && Number.isInteger(resp.poles)
    ? `Inside the contour: ${plural(resp.zeros, 'zero')}, ${plural(resp.poles, 'pole')} (argument principle: N − P = ${kText}).`
    : `Inside the contour: zeros and poles not counted separately (argument principle: N − P = ${kText}).`;
  for (const w of Array.isArray(resp.warnings) ? resp.warnings : []) parts.warnings.append(el('li', { text: 'Count: ' + String(w) }));
}

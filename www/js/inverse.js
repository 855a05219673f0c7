// The inverse-transform block: for the variable s, f(t) = the inverse Laplace
// transform of the function, for z the causal sequence x[n] of the inverse
// z-transform. The core computes both by residues and checks them against a
// numerical contour inversion (and, for z, long division); this block draws the
// result on a small chart, gives the closed form when there is one, the largest
// disagreement between the ways, and every warning the core gives.
import { el } from './dom.js';
import { fmtReal } from './format.js';
import { runHeavy, responseError } from './engine.js';

/** How many times t the s-chart samples in (0, T]. */
export const INVERSE_TIMES = 120;
/** Default last index N of the z-chart. */
export const INVERSE_DEFAULT_N = 40;

/** Only these variables have an inverse transform here. */
export function inverseKind(variable) {
  return variable === 's' ? 'laplace' : variable === 'z' ? 'z' : null;
}

/** The default time span: ten time constants of the slowest pole (10/|Re p|), else 10. */
export function defaultSpan(items) {
  const poles = items.filter((it) => it.kind === 'pole' && Array.isArray(it.at));
  if (!poles.length) return 10;
  const rightmost = Math.max(...poles.map((p) => p.at[0]));
  const a = Math.abs(rightmost);
  if (!(a > 1e-6)) return 10;
  return Number(Math.min(1e4, Math.max(1e-3, 10 / a)).toPrecision(3));
}

/** The request for the current function; `span` is T (s) or N (z). */
export function inverseRequest(base, span) {
  if (base.var === 's') {
    const t = [];
    for (let k = 1; k <= INVERSE_TIMES; k++) t.push((span * k) / INVERSE_TIMES);
    return { task: 'inverse_laplace', F: base.f, var: 's', params: base.params, t };
  }
  const n = [];
  for (let k = 0; k <= span; k++) n.push(k);
  return { task: 'inverse_z', X: base.f, var: 'z', params: base.params, n };
}

export function requestInverse(base, span) {
  return runHeavy(inverseRequest(base, span));
}

/** A status line and a look ('busy', 'stale', 'done', 'error', 'closed'). */
export function inverseStatus(parts, text, look) {
  parts.status.textContent = text;
  parts.box.dataset.state = look;
}

/** A warning that says the system is unstable or marginally stable gets the prominent look. */
function isStabilityWarning(text) {
  return /unstable|marginally stable|grows without bound|does not decay/i.test(text);
}

/** Fill the block from the response (or error object) of `inverseRequest`. */
export function showInverse(parts, request, resp) {
  const isS = request.task === 'inverse_laplace';
  parts.warnings.textContent = '';
  parts.closed.textContent = '';
  parts.facts.textContent = '';
  const err = responseError(resp);
  if (err) {
    parts.result.hidden = true;
    delete parts.chart.dataset.points;
    if (err.message === 'cancelled') { inverseStatus(parts, 'Stopped before the inverse transform finished.', 'stale'); return; }
    const msg = err.message.charAt(0).toUpperCase() + err.message.slice(1);
    inverseStatus(parts, 'Not computed: ' + msg + (msg.endsWith('.') ? '' : '.'), 'error');
    return;
  }
  inverseStatus(parts, '', 'done');
  parts.result.hidden = false;
  const xs = isS ? request.t : request.n;
  const ys = (isS ? resp.f : resp.x) || [];
  const values = xs.map((_, i) => (Number.isFinite(ys[i]) ? ys[i] : null));
  parts.chart.dataset.kind = isS ? 'laplace' : 'z';
  parts.chart.dataset.points = JSON.stringify({ x: xs, y: values });
  parts.chart.setAttribute('aria-label', isS
    ? `Line chart of f(t) for t from ${fmtReal(xs[0], 4)} to ${fmtReal(xs[xs.length - 1], 4)}`
    : `Stem plot of x[n] for n = 0 to ${xs[xs.length - 1]}`);
  drawInverseChart(parts.chart);

  for (const w of Array.isArray(resp.warnings) ? resp.warnings.map(String) : []) {
    const strong = isStabilityWarning(w);
    parts.warnings.append(el('li', { class: strong ? 'inv-alarm' : '', text: w.charAt(0).toUpperCase() + w.slice(1) }));
  }
  const lhs = isS ? 'f(t)' : 'x[n]';
  const where = isS ? 'for t > 0' : 'for n ≥ 0';
  if (typeof resp.closed_form === 'string' && resp.closed_form) {
    parts.closed.append(el('span', { class: 'inv-label', text: 'Closed form' }), ' ',
      el('code', { class: 'inv-formula', text: `${lhs} = ${resp.closed_form}` }), ` ${where}`);
  } else {
    parts.closed.append(el('span', { class: 'inv-label', text: 'Closed form' }), ' none (the function is not rational); the values are numerical.');
  }
  const fact = (term, text, attrs = {}) => parts.facts.append(el('div', attrs, el('dt', { text: term }), el('dd', { text })));
  if (!isS && resp.roc && Number.isFinite(resp.roc.outer_radius_greater_than)) {
    fact('Convergence', `|z| > ${fmtReal(resp.roc.outer_radius_greater_than, 6)} (the causal sequence: X converges outside its largest singularity)`);
  }
  const ways = isS ? 'residue sum and numerical contour inversion' : 'residues, contour integral and long division';
  const d = resp.max_discrepancy;
  if (Number.isFinite(d)) {
    const own = (Array.isArray(resp.contour_error_estimates) ? resp.contour_error_estimates : []).filter(Number.isFinite);
    const ownText = own.length ? `; the contour's own error estimate reaches ${fmtReal(Math.max(...own), 2)}` : '';
    fact('Agreement', `largest difference between ${ways}: ${fmtReal(d, 2)}${ownText}`, { 'data-discrepancy': String(d) });
  } else {
    fact('Agreement', 'only one way was available here, so there is no cross-check');
  }
  const est = Array.isArray(resp.error_estimates) ? resp.error_estimates : [];
  let worst = -1;
  est.forEach((e, i) => { if (Number.isFinite(e) && (worst < 0 || e > est[worst])) worst = i; });
  if (worst >= 0) fact('Error estimate', `at most ${fmtReal(est[worst], 2)} (largest at ${isS ? 't' : 'n'} = ${fmtReal(xs[worst], 6)})`);
  if (isS && Number.isFinite(resp.delay) && resp.delay > 0) fact('Delay', `f(t) = 0 for t < ${fmtReal(resp.delay, 6)}`);
}

/** "Nice" tick positions covering [lo, hi]. */
function ticks(lo, hi, count) {
  const span = hi - lo;
  if (!(span > 0)) return [lo];
  const raw = span / count;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) || 10 * mag;
  const out = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return out;
}

const tickText = (v) => fmtReal(Number(v.toPrecision(6)), 4);

/** Draw (or redraw, after a resize) the chart from its data attribute. */
export function drawInverseChart(canvas) {
  const box = canvas.parentElement.getBoundingClientRect();
  const cssW = Math.max(160, Math.floor(box.width));
  const cssH = Math.round(Math.min(220, Math.max(140, cssW * 0.45)));
  const dpr = window.devicePixelRatio || 1;
  canvas.style.height = cssH + 'px';
  canvas.width = Math.round(cssW * dpr);
  canvas.height = Math.round(cssH * dpr);
  const g = canvas.getContext('2d');
  g.setTransform(dpr, 0, 0, dpr, 0, 0);
  g.clearRect(0, 0, cssW, cssH);
  if (!canvas.dataset.points) return;
  const { x, y } = JSON.parse(canvas.dataset.points);
  const stems = canvas.dataset.kind === 'z';
  const finite = y.filter((v) => v !== null);
  if (!finite.length) return;
  let lo = Math.min(0, ...finite), hi = Math.max(0, ...finite);
  if (hi - lo < 1e-300) { hi += 1; lo -= 1; }
  const pad = 0.06 * (hi - lo);
  lo -= stems && lo === 0 ? 0 : pad;
  hi += pad;
  const x0 = stems ? -0.5 : 0, x1 = stems ? x[x.length - 1] + 0.5 : x[x.length - 1];
  const yt = ticks(lo, hi, 4), xt = stems ? ticks(0, x[x.length - 1], 6).filter((v) => Number.isInteger(v)) : ticks(0, x1, 6);
  g.font = '11px system-ui, sans-serif';
  const left = 8 + Math.max(...yt.map((v) => g.measureText(tickText(v)).width)), right = 10, top = 8, bottom = 22;
  const px = (v) => left + ((v - x0) / (x1 - x0)) * (cssW - left - right);
  const py = (v) => top + ((hi - v) / (hi - lo)) * (cssH - top - bottom);
  // grid and tick labels
  g.strokeStyle = '#e3e8ec';
  g.lineWidth = 1;
  g.fillStyle = '#5b6670';
  g.textAlign = 'right';
  g.textBaseline = 'middle';
  for (const v of yt) {
    const yy = Math.round(py(v)) + 0.5;
    g.beginPath(); g.moveTo(left, yy); g.lineTo(cssW - right, yy); g.stroke();
    g.fillText(tickText(v), left - 4, yy);
  }
  g.textAlign = 'center';
  g.textBaseline = 'top';
  for (const v of xt) {
    const xx = Math.round(px(v)) + 0.5;
    g.beginPath(); g.moveTo(xx, top); g.lineTo(xx, cssH - bottom); g.stroke();
    g.fillText(tickText(v), xx, cssH - bottom + 4);
  }
  // the axes: the zero line and the left edge
  g.strokeStyle = '#7d8891';
  g.beginPath();
  g.moveTo(left, Math.round(py(0)) + 0.5); g.lineTo(cssW - right, Math.round(py(0)) + 0.5);
  g.moveTo(left + 0.5, top); g.lineTo(left + 0.5, cssH - bottom);
  g.stroke();
  g.textAlign = 'right';
  g.textBaseline = 'bottom';
  g.fillText(stems ? 'n' : 't', cssW - right, cssH - bottom - 2);
  // the data
  g.strokeStyle = '#1f5f8b';
  g.fillStyle = '#1f5f8b';
  g.lineWidth = stems ? 1.2 : 1.8;
  if (stems) {
    const r = Math.max(1.5, Math.min(3.5, (cssW - left - right) / x.length / 3));
    x.forEach((n, i) => {
      if (y[i] === null) return;
      g.beginPath(); g.moveTo(px(n), py(0)); g.lineTo(px(n), py(y[i])); g.stroke();
      g.beginPath(); g.arc(px(n), py(y[i]), r, 0, 2 * Math.PI); g.fill();
    });
  } else {
    g.beginPath();
    let pen = false;
    x.forEach((t, i) => {
      if (y[i] === null) { pen = false; return; }
      if (pen) g.lineTo(px(t), py(y[i])); else g.moveTo(px(t), py(y[i]));
      pen = true;
    });
    g.stroke();
  }
}

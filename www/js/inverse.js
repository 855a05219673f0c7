// The inverse-transform block: for the variable s, f(t) = the inverse Laplace
// transform of the function, for z the causal sequence x[n] of the inverse
// z-transform. The core computes both by residues and checks them against a
// numerical contour inversion (and, for z, long division); this block draws the
// result on a small chart, gives the closed form when there is one, the largest
// disagreement between the ways, and every warning the core gives.
import { mathEl, closedFormMathML } from './mathml.js';
import { latexButton } from './latex.js';
import { el } from './dom.js';
import { fmtReal } from './format.js';
import { runHeavy, responseError } from './engine.js';
import { drawInverseChart } from './inverse-chart.js';

/** Fewest times t the s-chart samples in (0, T]; more when the poles oscillate (see timeCount). */
export const INVERSE_TIMES = 120;
/** Most times one chart asks for (the contract allows 10 000). */
export const INVERSE_MAX_TIMES = 4000;
/** Samples per period of the fastest oscillation, so that none aliases (issue: ≥ 20). */
const PER_PERIOD = 20;

/** How many times to sample (0, T]: at least INVERSE_TIMES, and PER_PERIOD per period 2π/|Im p|
 *  of the fastest-oscillating pole found, up to INVERSE_MAX_TIMES. */
export function timeCount(items, span) {
  const poles = (items || []).filter((it) => it.kind === 'pole' && Array.isArray(it.at));
  const fastest = Math.max(0, ...poles.map((p) => Math.abs(p.at[1])));
  const wanted = Math.ceil((PER_PERIOD * span * fastest) / (2 * Math.PI));
  return Math.min(INVERSE_MAX_TIMES, Math.max(INVERSE_TIMES, Number.isFinite(wanted) ? wanted : INVERSE_TIMES));
}
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

/** The request for the current function; `span` is T (s) or N (z); `items` the singularities
 *  found (their oscillation sets how densely t is sampled). */
export function inverseRequest(base, span, items) {
  if (base.var === 's') {
    const t = [];
    const count = timeCount(items, span);
    for (let k = 1; k <= count; k++) t.push((span * k) / count);
    return { task: 'inverse_laplace', F: base.f, var: 's', params: base.params, t };
  }
  const n = [];
  for (let k = 0; k <= span; k++) n.push(k);
  return { task: 'inverse_z', X: base.f, var: 'z', params: base.params, n };
}

/** `request` (inverse_laplace on a uniform grid) with times packed around each delay τ inside it:
 *  τ(1 ∓ 1e-9) (the values just before and after the jump) and τ ± kh/4, k = 1…3 (h the grid
 *  step); null when no delay falls inside or the grid is not a Laplace one. */
export function denserNearJumps(request, delays) {
  if (request.task !== 'inverse_laplace' || !Array.isArray(delays) || !delays.length) return null;
  const t = request.t;
  const T = t[t.length - 1];
  const h = T / t.length;
  const inside = delays.filter((d) => Number.isFinite(d) && d > 0 && d < T);
  if (!inside.length) return null;
  const extra = [];
  for (const d of inside) {
    extra.push(d * (1 - 1e-9), d * (1 + 1e-9));
    for (let k = 1; k <= 3; k++) extra.push(d - (k * h) / 4, d + (k * h) / 4);
  }
  const all = Array.from(new Set(t.concat(extra.filter((x) => x > 0 && x <= T)))).sort((a, b) => a - b);
  if (all.length > 10000) return null;
  return Object.assign({}, request, { t: all });
}

/** A status line and a look ('busy', 'stale', 'done', 'error', 'closed'). */
export function inverseStatus(parts, text, look) {
  parts.status.textContent = text;
  parts.box.dataset.state = look;
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
    if (err.code === 'cancelled') { inverseStatus(parts, 'Stopped before the inverse transform finished.', 'stale'); return; }
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
  // A numerical inversion (no closed form) shows its error estimates as a band around the line.
  const est = Array.isArray(resp.error_estimates) ? resp.error_estimates : [];
  const band = isS && !resp.closed_form && est.some(Number.isFinite)
    ? xs.map((_, i) => (Number.isFinite(est[i]) && values[i] !== null ? est[i] : null)) : null;
  parts.chart.dataset.points = JSON.stringify(band ? { x: xs, y: values, err: band } : { x: xs, y: values });
  parts.chart.dataset.band = band ? 'error' : 'none';
  parts.chart.setAttribute('aria-label', isS
    ? `Line chart of f(t) for t from ${fmtReal(xs[0], 4)} to ${fmtReal(xs[xs.length - 1], 4)}` + (band ? ', shaded by its error estimate' : '')
    : `Stem plot of x[n] for n = 0 to ${xs[xs.length - 1]}`);
  drawInverseChart(parts.chart);

  // The core marks which warning is its stability reading (unstable or marginally stable).
  const warningList = Array.isArray(resp.warnings) ? resp.warnings.map(String) : [];
  for (const [i, w] of warningList.entries()) {
    const strong = Number.isInteger(resp.stability_warning) && i === resp.stability_warning;
    parts.warnings.append(el('li', { class: strong ? 'inv-alarm' : '', text: w.charAt(0).toUpperCase() + w.slice(1) }));
  }
  const lhs = isS ? 'f(t)' : 'x[n]';
  const where = isS ? 'for t > 0' : 'for n ≥ 0';
  if (typeof resp.closed_form === 'string' && resp.closed_form) {
    // the core's text read once into MathML (mathml.js), its LaTeX written from that tree (latex.js)
    const lhsMath = isS ? mathEl('mrow', mathEl('mi', 'f'), mathEl('mo', '('), mathEl('mi', 't'), mathEl('mo', ')'))
      : mathEl('mrow', mathEl('mi', 'x'), mathEl('mo', '['), mathEl('mi', 'n'), mathEl('mo', ']'));
    const math = closedFormMathML(lhsMath, resp.closed_form);
    parts.closed.append(el('span', { class: 'inv-label', text: 'Closed form' }), ' ');
    if (math) parts.closed.append(math);
    parts.closed.append(el('code', { class: 'inv-formula', text: `${lhs} = ${resp.closed_form}` }), ` ${where}`);
    if (math) parts.closed.append(' ', latexButton(math, 'the closed form'));
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
  let worst = -1;
  est.forEach((e, i) => { if (Number.isFinite(e) && (worst < 0 || e > est[worst])) worst = i; });
  if (worst >= 0) fact('Error estimate', `at most ${fmtReal(est[worst], 2)} (largest at ${isS ? 't' : 'n'} = ${fmtReal(xs[worst], 6)})` + (band ? '; the chart shades f ± the estimate at each time' : ''));
  if (isS && Number.isFinite(resp.delay) && resp.delay > 0) fact('Delay', `f(t) = 0 for t < ${fmtReal(resp.delay, 6)}`);
  if (isS && Array.isArray(resp.delays) && resp.delays.length) fact('Delays', `τ = ${resp.delays.map((d) => fmtReal(d, 6)).join(', ')}; H(t − τ) in the closed form is the unit step (½ at the jump)`);
  if (isS && Array.isArray(resp.declined) && resp.declined.length) fact('Declined', `${resp.declined.length} of the times have no meaningful value (gaps in the chart); see the warnings`);
}

// ---- the section on the page ---------------------------------------------------------

/** What the section shows: the request it answers (key), whether T/N was typed, and a serial
 *  that makes an answer arriving after Stop or a newer request go unused. */
const inverseSection = { key: '', spanTyped: false, serial: 0 };

/** The span asked for: T (s) or N (z), typed or the default. */
function inverseSpan(page, kind) {
  const typed = Number(page.ui.inv.span.value);
  if (kind === 'z') {
    return inverseSection.spanTyped && Number.isFinite(typed) && typed >= 0 ? Math.min(2000, Math.floor(typed)) : INVERSE_DEFAULT_N;
  }
  return inverseSection.spanTyped && Number.isFinite(typed) && typed > 0 ? Math.min(1e6, typed) : defaultSpan(page.found.items);
}

/** For the scripting interface, before the next search for the variable `variable`: the span
 *  (T for s, N for z; null keeps the typed or default one) and whether the section is open
 *  (null keeps the page's usual choice). */
export function askInverse(page, variable, span, open) {
  if (Number.isFinite(span)) {
    page.ui.inv.span.value = String(span);
    inverseSection.spanTyped = true;
    inverseSection.keepSpanFor = variable; // a new variable would otherwise forget the span
  }
  if (typeof open === 'boolean') inverseSection.forceOpen = open;
}

/** The span now in use, T (s) or N (z), or null for a variable with no inverse transform. */
export function currentInverseSpan(page, variable) {
  const kind = inverseKind(variable);
  return kind ? inverseSpan(page, kind) : null;
}

/** After a search: show the section for s (any f) or z (a rational f, or when asked), in words
 *  fitting the variable, open or folded; `rational` says whether the search found f rational. */
export function prepareInverse(page, base, rational = true) {
  const inv = page.ui.inv;
  const kind = inverseKind(base.var);
  const box = inv.box;
  const wasVar = box.dataset.var;
  // For z the section is a discrete-time reading: shown when f is rational, or when asked for
  // (set() with panels.inverse, an example); Γ(z) and other functions of z do not get it.
  const asked = inverseSection.forceOpen === true || page.inverseOpenNext === true;
  const applies = kind === 'laplace' || (kind === 'z' && (rational || asked));
  box.hidden = !applies;
  if (!applies) { page.inverseOpenNext = null; inverseSection.forceOpen = null; return; }
  if (wasVar !== base.var && inverseSection.keepSpanFor !== base.var) inverseSection.spanTyped = false;
  inverseSection.keepSpanFor = null;
  // Open for s; for z folded unless the chosen example is a transfer function (or the user opened it).
  if (page.inverseOpenNext !== null) box.open = base.var === 's' || page.inverseOpenNext;
  else if (wasVar !== base.var) box.open = base.var === 's';
  page.inverseOpenNext = null;
  if (typeof inverseSection.forceOpen === 'boolean') box.open = inverseSection.forceOpen;
  inverseSection.forceOpen = null;
  box.dataset.var = base.var;
  if (kind === 'laplace') {
    inv.title.textContent = 'Inverse Laplace transform f(t)';
    inv.what.textContent = 'The time function f(t), t > 0, whose Laplace transform is the function above, read as F(s): the sum of the residues of F(s)·exp(st), checked against a numerical inversion along a contour passing right of the singularities.';
    inv.spanLabel.textContent = 'Times 0 < t ≤ T, T =';
    inv.spanHint.textContent = inverseSection.spanTyped ? '' : '(default: 10/|Re| of the rightmost pole, or 10)';
  } else {
    inv.title.textContent = 'Inverse z-transform x[n]';
    inv.what.textContent = 'The causal sequence x[n], n ≥ 0, whose z-transform is the function above (read as X(z)): by residues, checked against a contour integral and long division.';
    inv.spanLabel.textContent = 'Samples n = 0 … N, N =';
    inv.spanHint.textContent = '';
  }
  inv.span.step = kind === 'z' ? '1' : 'any';
  if (!inverseSection.spanTyped) inv.span.value = String(inverseSpan(page, kind));
  if (!box.open) {
    inv.result.hidden = true;
    inv.warnings.textContent = '';
    inverseSection.key = '';
    inverseStatus(inv, 'Open this section to compute the inverse transform.', 'closed');
  }
}

/** Compute and show the inverse transform for `base` (the searched function). */
export async function runInverse(page, base) {
  const inv = page.ui.inv;
  const kind = inverseKind(base.var);
  if (!kind) return;
  const span = inverseSpan(page, kind);
  if (!inverseSection.spanTyped) inv.span.value = String(span);
  const asked = inverseRequest(base, span, page.found.items);
  const serial = ++inverseSection.serial;
  inverseStatus(inv, kind === 'laplace' ? 'Computing f(t)…' : 'Computing x[n]…', 'busy');
  let request = asked;
  let resp = await runHeavy(asked);
  if (serial !== inverseSection.serial) return;
  // f jumps at each delay τ: sample again with times packed around the jumps, so the chart shows
  // each jump where it is instead of a slope across one sampling interval
  const denser = responseError(resp) ? null : denserNearJumps(asked, resp.delays);
  if (denser) {
    const again = await runHeavy(denser);
    if (serial !== inverseSection.serial) return;
    if (!responseError(again)) { request = denser; resp = again; }
  }
  showInverse(inv, request, resp);
  inverseSection.key = JSON.stringify(asked);
  if (page.results) { page.results.inverse = resp; page.results.inverseRequest = request; }
}

/** Stop pressed: an inverse transform in progress is dropped. */
export function stopInverse(page) {
  if (page.ui.inv.box.dataset.state !== 'busy') return;
  inverseSection.serial++;
  inverseStatus(page.ui.inv, 'Stopped before the inverse transform finished.', 'stale');
}

/** Opening the section or changing T/N outside a search: compute now, if the results are current. */
async function inverseOnDemand(page) {
  const ui = page.ui;
  if (ui.inv.box.hidden || !ui.inv.box.open) return;
  if (ui.find.disabled) return; // a search is running; it computes the inverse at its end
  if (ui.singTable.classList.contains('stale') || !page.found.base) { inverseStatus(ui.inv, 'Computed with the next search.', 'stale'); return; }
  const kind = inverseKind(page.found.base.var);
  if (!kind) return;
  if (inverseSection.key === JSON.stringify(inverseRequest(page.found.base, inverseSpan(page, kind), page.found.items))) {
    if (!ui.inv.result.hidden) drawInverseChart(ui.inv.chart); // its width may have changed while folded
    return;
  }
  const serial = page.searchSerial;
  ui.cancel.disabled = false;
  await runInverse(page, page.found.base);
  if (serial === page.searchSerial) ui.cancel.disabled = true;
}

/** Opening the section and changing T or N. */
export function attachInverseSection(page) {
  const inv = page.ui.inv;
  inv.box.addEventListener('toggle', () => {
    if (inv.box.open) inverseOnDemand(page);
  });
  inv.span.addEventListener('change', () => {
    inverseSection.spanTyped = inv.span.value.trim() !== '';
    inv.spanHint.textContent = '';
    inverseOnDemand(page);
  });
}

// Wires the page together: state, inputs, the plot, the readout and the
// singularities panel. Everything the user types is kept (see state.js).
import { $, el, debounce } from './dom.js';
import { cAbs, cArg, cInv, isFinitePair } from './complex.js';
import { fmtComplex, fmtReal, fmtSig, fmtExact } from './format.js';
import { Engine, startEngine, runNow, runHeavy, responseError } from './engine.js';
import { loadState, saveState, fromHash, toHash } from './state.js';
import { showUnderline, syncMirror } from './expr-input.js';
import { renderParams, paramsForRequest } from './params.js';
import { createPlot } from './plot.js';
import { KIND_WORDS } from './markers.js';
import { drawWheelKey, fillMarkerKey } from './legend.js';
import { demoList, demoState } from './demos.js';
import {
  regionContour, regionProblem, regionWords, itemsOf, stabilityReading, searchSingularities, cancelHeavy,
  fillTable, highlightRow, laurentRadius, requestLaurent, showDetail,
} from './singularities.js';
import { requestContourIntegral, requestArgumentCount, showContourIntegral, showArgumentCount, contourStatus } from './contour.js';
import { inverseKind, defaultSpan, inverseRequest, requestInverse, showInverse, inverseStatus, drawInverseChart, INVERSE_DEFAULT_N } from './inverse.js';

const state = loadState();
const ui = {
  expr: $('expr'), mirror: $('expr-mirror'), message: $('expr-message'), varName: $('var-name'),
  params: $('params'), modulus: $('opt-modulus'), phase: $('opt-phase'), infinity: $('opt-infinity'),
  wheel: $('opt-wheel'), canvas: $('plot'), readout: $('readout'), plotStatus: $('plot-status'),
  find: $('find'), cancel: $('cancel-find'), autoFind: $('auto-find'), findStatus: $('find-status'),
  resInf: $('res-inf'), sumCheck: $('sum-check'), stability: $('stability'), stabilityBox: $('stability-box'),
  stabilityTitle: $('stability-title'), warnings: $('warnings'), tbody: $('sing-body'), partial: $('partial-fractions'),
  pfWarnings: $('pf-warnings'), plotDescription: $('plot-description'),
  detail: { box: $('detail'), title: $('detail-title'), math: $('detail-math'), note: $('detail-note'), body: $('laurent-body'),
    warnings: $('detail-warnings'), table: $('laurent-table') },
  ci: { box: $('ci-box'), contour: $('ci-contour'), status: $('ci-status'), result: $('ci-result'), value: $('ci-value'),
    ways: $('ci-ways'), verdict: $('ci-verdict'), count: $('ci-count'), warnings: $('ci-warnings') },
  inv: { box: $('inv-box'), title: $('inv-title'), what: $('inv-what'), span: $('inv-span'), spanLabel: $('inv-span-label'),
    spanHint: $('inv-span-hint'), status: $('inv-status'), warnings: $('inv-warnings'), result: $('inv-result'),
    chart: $('inv-chart'), closed: $('inv-closed'), facts: $('inv-facts') },
};

let exprOk = false;           // the last check found no error in the function
let lastZView = state.view.slice();
let found = { items: [], key: '' };
let searchSerial = 0;
let readingOpenNext = null;  // an example says whether to open the transfer-function reading
let inverseOpenNext = null;  // ... and whether to open the inverse transform (for z)
let inverse = { key: '', spanTyped: false, serial: 0 }; // what the inverse block shows

// ---- requests ------------------------------------------------------------------

function functionInput() {
  const { params } = paramsForRequest(state.params);
  return { f: state.f, var: state.var.trim() || 'z', params };
}

function plotRequestBase() {
  return Object.assign(functionInput(), {
    options: { wheel: state.wheel, modulus_lines: state.modulus, phase_lines: state.phase, infinity: state.infinity },
  });
}

// ---- plot ----------------------------------------------------------------------

const plot = createPlot(ui.canvas, {
  baseRequest: () => (Engine.ready ? plotRequestBase() : null),
  onViewChange: (view) => {
    state.view = view;
    if (!state.infinity) lastZView = view.slice();
    persist();
    if (state.region.mode === 'view') { fillRegionFields(); regionMoved(); autoSearchSoon(1000); }
    describePlot();
  },
  onPointer: (p) => readoutAt(p),
  onMarkerClick: (i) => pick(i),
  onStatus: (what, error) => {
    ui.plotStatus.textContent = what === 'drawing' ? 'Drawing…' : what === 'error' ? 'Plot failed (see the message on the plot).' : '';
    ui.canvas.dataset.status = what;
  },
});

function applyAxisName() {
  plot.axisName = state.infinity ? 'w' : (state.var.trim() || 'z');
  plot.infinityMode = state.infinity;
  plot.unitCircle = !state.infinity && state.var.trim() === 'z'; // the stability boundary in the z-plane
}

// ---- persistence ---------------------------------------------------------------

const persist = debounce(() => saveState(state), 250);

// ---- expression checking ---------------------------------------------------------

function checkExpression() {
  syncMirror(ui.expr, ui.mirror);
  const { problems } = paramsForRequest(state.params);
  if (!Engine.ready) {
    showUnderline(ui.mirror, state.f, null);
    ui.message.textContent = Engine.message || 'Loading the computing core…';
    return false;
  }
  if (state.f.trim() === '') {
    showUnderline(ui.mirror, state.f, null);
    ui.message.textContent = 'Type a function of ' + (state.var.trim() || 'z') + ', for example 1/(' + (state.var.trim() || 'z') + '^2 + 1.5*' + (state.var.trim() || 'z') + ' + 4).';
    ui.message.className = 'expr-message';
    return false;
  }
  const resp = runNow(Object.assign(functionInput(), { task: 'evaluate', at: [[0.31, 0.17]] }));
  const err = responseError(resp);
  showUnderline(ui.mirror, state.f, err && err.span);
  if (err) {
    ui.message.textContent = err.message.charAt(0).toUpperCase() + err.message.slice(1) + (err.message.endsWith('.') ? '' : '.');
    ui.message.className = 'expr-message bad';
    ui.expr.setAttribute('aria-invalid', 'true');
    return false;
  }
  ui.expr.removeAttribute('aria-invalid');
  if (problems.length) {
    ui.message.textContent = 'Parameter: ' + problems[0] + '.';
    ui.message.className = 'expr-message bad';
    return false;
  }
  ui.message.textContent = 'f(' + functionInput().var + ') is understood.';
  ui.message.className = 'expr-message good';
  return true;
}

function showNoPicture() {
  if (plot.coarse) return; // keep the last good picture
  plot.message = Engine.ready ? 'No picture yet: the function needs fixing (see the message under it).' : Engine.message;
  plot.draw();
}

const afterTyping = debounce(() => {
  exprOk = checkExpression();
  if (exprOk) plot.render();
  else showNoPicture();
  autoSearchSoon(700);
}, 120);

/** The results no longer belong to the function: dim them and take the markers off the plot. */
function markResultsStale() {
  searchSerial++;
  $('sing-table').classList.add('stale');
  ui.find.disabled = false;
  ui.cancel.disabled = true;
  ui.findStatus.className = 'find-status';
  ui.findStatus.textContent = state.autoFind ? 'The function changed; searching again when typing stops…' : 'The function changed: press “Find singularities” for new results.';
  if (plot.markers.length) { plot.markers = []; plot.selected = -1; plot.draw(); }
  ui.canvas.dataset.markers = '0';
  ui.detail.box.hidden = true;
  if (ui.ci.box.dataset.state !== 'none') contourStatus(ui.ci, 'The function changed: the contour integral is computed again with the next search.', 'stale');
  if (!['none', 'closed'].includes(ui.inv.box.dataset.state)) inverseStatus(ui.inv, 'The function changed: the inverse transform is computed again with the next search.', 'stale');
}

/** Once the function is no longer the chosen example's, the example's name and text go. */
function forgetExampleIfChanged() {
  const picker = $('demo-select');
  const d = demoList()[Number(picker.value)];
  if (picker.value === '' || !d) return;
  if (d.f !== state.f || (d.var || 'z') !== state.var.trim()) {
    picker.value = '';
    $('demo-description').hidden = true;
  }
}

function inputsChanged() {
  forgetExampleIfChanged();
  markResultsStale();
  persist();
  showUnderline(ui.mirror, state.f, null);
  syncMirror(ui.expr, ui.mirror);
  afterTyping();
}

// ---- pointer readout -------------------------------------------------------------

let readoutPoint = null, readoutQueued = false;
function readoutAt(p) {
  readoutPoint = p;
  if (readoutQueued) return;
  readoutQueued = true;
  requestAnimationFrame(() => {
    readoutQueued = false;
    const q = readoutPoint;
    if (!q) { ui.readout.textContent = 'Move the pointer over the plot to read values.'; return; }
    const v = state.var.trim() || 'z';
    const z = state.infinity ? cInv(q) : q;
    const where = state.infinity ? `w = ${fmtComplex(q, 5)}, ${v} = 1/w = ${fmtComplex(z, 5)}` : `${v} = ${fmtComplex(q, 5)}`;
    if (!exprOk || !isFinitePair(z)) { ui.readout.textContent = where; return; }
    const resp = runNow(Object.assign(functionInput(), { task: 'evaluate', at: [z] }));
    const err = responseError(resp);
    if (err || !resp.values || !resp.values[0]) { ui.readout.textContent = where + ' — ' + (err ? err.message : 'no value'); return; }
    const f = resp.values[0].map((x) => (x === null ? NaN : x));
    ui.readout.dataset.z = JSON.stringify(z);   // full precision, for checking
    ui.readout.dataset.f = JSON.stringify(resp.values[0]);
    const mod = cAbs(f), arg = cArg(f);
    ui.readout.textContent = `${where}   f = ${fmtComplex(f, 6)}   |f| = ${fmtReal(mod, 6)}   arg f = ` +
      (Number.isFinite(arg) && Number.isFinite(mod) && mod > 0 ? `${fmtReal(arg, 5)} rad (${fmtReal((arg * 180) / Math.PI, 4)}°)` : 'undefined');
  });
}

// ---- singularities ---------------------------------------------------------------

function currentContour() {
  const view = state.infinity ? lastZView : state.view;
  return regionContour(state.region, view);
}

function fillRegionFields() {
  const v = state.region.mode === 'view' ? (state.infinity ? lastZView : state.view) : state.region.rect;
  const ids = ['rect-x0', 'rect-x1', 'rect-y0', 'rect-y1'];
  ids.forEach((id, k) => { if (document.activeElement !== $(id)) $(id).value = fmtReal(v[k], 6).replace(/−/g, '-'); });
  const [cx, cy, r] = state.region.circle;
  [['circ-x', cx], ['circ-y', cy], ['circ-r', r]].forEach(([id, x]) => { if (document.activeElement !== $(id)) $(id).value = x; });
  for (const radio of document.querySelectorAll('input[name=region-mode]')) radio.checked = radio.value === state.region.mode;
  $('region-rect').classList.toggle('dim', state.region.mode !== 'rect');
  $('region-circle').classList.toggle('dim', state.region.mode !== 'circle');
  plot.region = state.region.mode === 'view' ? null : currentContour();
}

/** The contour no longer matches the shown integral: say so until the next search. */
function regionMoved() {
  const st = ui.ci.box.dataset.state;
  if (st === 'done' || st === 'error') contourStatus(ui.ci, 'The region changed: the integral below is for the contour named above; search again to update it.', 'stale');
}

const autoSearch = debounce(() => { if (state.autoFind) findSingularities(); }, 700);
function autoSearchSoon() { if (state.autoFind) autoSearch(); }

async function findSingularities() {
  autoSearch.cancel();
  if (!Engine.ready || !exprOk) {
    ui.findStatus.textContent = exprOk ? 'The computing core is not ready.' : 'Fix the function first.';
    return;
  }
  const contour = currentContour();
  const problem = regionProblem(contour);
  if (problem) { ui.findStatus.textContent = 'Region: ' + problem + '.'; return; }
  const serial = ++searchSerial;
  const base = functionInput();
  ui.find.disabled = true;
  ui.cancel.disabled = false;
  ui.findStatus.textContent = 'Searching…';
  ui.findStatus.className = 'find-status busy';
  if (ui.ci.box.dataset.state !== 'none') contourStatus(ui.ci, 'Waiting for the search…', 'stale');
  const resp = await searchSingularities(base, contour);
  if (serial !== searchSerial) return;
  ui.findStatus.className = 'find-status';
  const err = responseError(resp);
  if (err) {
    ui.find.disabled = false;
    ui.cancel.disabled = true;
    ui.findStatus.textContent = err.message === 'cancelled' ? 'Search stopped.' : 'Search failed: ' + err.message;
    contourStatus(ui.ci, 'Not computed: the search did not finish.', 'stale');
    return;
  }
  $('sing-table').classList.remove('stale');
  const size = contour.shape === 'circle' ? contour.radius
    : Math.max(Math.abs(contour.corners[1][0] - contour.corners[0][0]), Math.abs(contour.corners[1][1] - contour.corners[0][1]));
  found = { items: itemsOf(resp, 1e-12 * size), base, contour };
  const n = found.items.length;
  ui.findStatus.textContent = n ? `Found ${n} point${n === 1 ? '' : 's'} in the region` +
    (resp.method === 'rational' ? ' (f is rational: exact analysis)' : resp.method === 'numerical' ? ' (numerical search)' : '') +
    '. Choose a row or marker for its principal part.' : 'Search finished: nothing in the region.';
  fillTable(ui.tbody, found.items, pick);
  plot.markers = found.items;
  plot.selected = -1;
  plot.draw();
  ui.canvas.dataset.markers = String(found.items.length);
  describePlot();
  ui.detail.box.hidden = true;
  ui.warnings.textContent = '';
  for (const w of Array.isArray(resp.warnings) ? resp.warnings : []) ui.warnings.append(el('li', { text: String(w) }));
  showSums(resp, found.items);
  // A transfer-function reading, only for s or z, and said to be a reading.
  const reading = stabilityReading(base.var, found.items, contour);
  const wasVar = ui.stabilityBox.dataset.var;
  ui.stabilityBox.hidden = !reading;
  if (reading) {
    ui.stabilityTitle.textContent = reading.title;
    ui.stability.textContent = reading.text;
    // Open by default for s; for z (also the default variable) it stays folded unless opened,
    // except for an example that is a transfer function.
    if (readingOpenNext !== null) ui.stabilityBox.open = readingOpenNext;
    else if (wasVar !== base.var) ui.stabilityBox.open = base.var === 's';
    readingOpenNext = null;
    ui.stabilityBox.dataset.var = base.var;
  }
  prepareInverse(base);
  // The contour integral three ways, then the argument-principle count (still cancellable by Stop).
  contourStatus(ui.ci, 'Computing the contour integral three ways…', 'busy');
  const ci = await requestContourIntegral(base, contour);
  if (serial !== searchSerial) return;
  showContourIntegral(ui.ci, base.var, contour, state.region.mode === 'view', ci);
  const count = await requestArgumentCount(base, contour);
  if (serial !== searchSerial) return;
  showArgumentCount(ui.ci, count);
  // Then the inverse transform (s or z), when its section is open; Stop still cancels it.
  if (!ui.inv.box.hidden && ui.inv.box.open) {
    await runInverse(base);
    if (serial !== searchSerial) return;
  }
  ui.find.disabled = false;
  ui.cancel.disabled = true;
  // Partial fractions, shown only when f is rational (the task answers).
  const pf = await runHeavy(Object.assign({}, base, { task: 'partial_fractions' }));
  if (serial !== searchSerial) return;
  const pfErr = responseError(pf);
  ui.partial.hidden = Boolean(pfErr) || typeof pf.text !== 'string';
  ui.pfWarnings.textContent = '';
  if (!ui.partial.hidden) {
    ui.partial.textContent = 'Partial fractions: ' + pf.text;
    for (const w of Array.isArray(pf.warnings) ? pf.warnings : []) ui.pfWarnings.append(el('li', { text: 'Partial fractions: ' + String(w) }));
  }
}

// ---- inverse transform -------------------------------------------------------------

/** The span asked for: T (s) or N (z), typed or the default. */
function inverseSpan(kind) {
  const typed = Number(ui.inv.span.value);
  if (kind === 'z') {
    return inverse.spanTyped && Number.isFinite(typed) && typed >= 0 ? Math.min(2000, Math.floor(typed)) : INVERSE_DEFAULT_N;
  }
  return inverse.spanTyped && Number.isFinite(typed) && typed > 0 ? Math.min(1e6, typed) : defaultSpan(found.items);
}

/** After a search: show the section for s or z, in words fitting the variable, open or folded. */
function prepareInverse(base) {
  const kind = inverseKind(base.var);
  const box = ui.inv.box;
  const wasVar = box.dataset.var;
  box.hidden = !kind;
  if (!kind) { inverseOpenNext = null; return; }
  if (wasVar !== base.var) inverse.spanTyped = false;
  // Open for s; for z folded unless the chosen example is a transfer function (or the user opened it).
  if (inverseOpenNext !== null) box.open = base.var === 's' || inverseOpenNext;
  else if (wasVar !== base.var) box.open = base.var === 's';
  inverseOpenNext = null;
  box.dataset.var = base.var;
  if (kind === 'laplace') {
    ui.inv.title.textContent = 'Inverse Laplace transform f(t)';
    ui.inv.what.textContent = 'The time function f(t), t > 0, whose Laplace transform is the function above, read as F(s): the sum of the residues of F(s)·exp(st), checked against a numerical inversion along a contour passing right of the singularities.';
    ui.inv.spanLabel.textContent = 'Times 0 < t ≤ T, T =';
    ui.inv.spanHint.textContent = inverse.spanTyped ? '' : '(default: 10/|Re| of the rightmost pole, or 10)';
  } else {
    ui.inv.title.textContent = 'Inverse z-transform x[n]';
    ui.inv.what.textContent = 'The causal sequence x[n], n ≥ 0, whose z-transform is the function above (read as X(z)): by residues, checked against a contour integral and long division.';
    ui.inv.spanLabel.textContent = 'Samples n = 0 … N, N =';
    ui.inv.spanHint.textContent = '';
  }
  ui.inv.span.step = kind === 'z' ? '1' : 'any';
  if (!inverse.spanTyped) ui.inv.span.value = String(inverseSpan(kind));
  if (!box.open) {
    ui.inv.result.hidden = true;
    ui.inv.warnings.textContent = '';
    inverse.key = '';
    inverseStatus(ui.inv, 'Open this section to compute the inverse transform.', 'closed');
  }
}

/** Compute and show the inverse transform for `base` (the searched function). */
async function runInverse(base) {
  const kind = inverseKind(base.var);
  if (!kind) return;
  const span = inverseSpan(kind);
  if (!inverse.spanTyped) ui.inv.span.value = String(span);
  const request = inverseRequest(base, span);
  const serial = ++inverse.serial;
  inverseStatus(ui.inv, kind === 'laplace' ? 'Computing f(t)…' : 'Computing x[n]…', 'busy');
  const resp = await requestInverse(base, span);
  if (serial !== inverse.serial) return;
  showInverse(ui.inv, request, resp);
  inverse.key = JSON.stringify(request);
}

/** Opening the section or changing T/N outside a search: compute now, if the results are current. */
async function inverseOnDemand() {
  if (ui.inv.box.hidden || !ui.inv.box.open) return;
  if (ui.find.disabled) return; // a search is running; it computes the inverse at its end
  if ($('sing-table').classList.contains('stale') || !found.base) { inverseStatus(ui.inv, 'Computed with the next search.', 'stale'); return; }
  const kind = inverseKind(found.base.var);
  if (!kind) return;
  if (inverse.key === JSON.stringify(inverseRequest(found.base, inverseSpan(kind)))) {
    if (!ui.inv.result.hidden) drawInverseChart(ui.inv.chart); // its width may have changed while folded
    return;
  }
  const serial = searchSerial;
  ui.cancel.disabled = false;
  await runInverse(found.base);
  if (serial === searchSerial) ui.cancel.disabled = true;
}

/** Residue at infinity and the residue-sum check, in one short line each. */
function showSums(resp, items) {
  const rinf = resp.residue_at_infinity;
  ui.resInf.textContent = isFinitePair(rinf) ? fmtSig(rinf, 10) : 'not available for this function (see the warnings)';
  ui.resInf.title = isFinitePair(rinf) ? 'Full precision: ' + fmtExact(rinf) : '';
  const withResidue = items.filter((it) => (it.kind === 'pole' || it.kind === 'essential') && isFinitePair(it.residue));
  const sum = withResidue.reduce((acc, it) => [acc[0] + it.residue[0], acc[1] + it.residue[1]], [0, 0]);
  if (!isFinitePair(rinf)) {
    ui.sumCheck.textContent = `Σ residues in the region = ${fmtSig(sum, 10)} (no check without the residue at infinity)`;
    return;
  }
  const total = cAbs([sum[0] + rinf[0], sum[1] + rinf[1]]);
  const scale = Math.max(1e-300, cAbs(rinf), ...withResidue.map((it) => cAbs(it.residue)));
  const small = total <= 1e-8 * scale + 1e-13;
  ui.sumCheck.textContent = `|Σ residues in the region + Res∞| = ${fmtReal(total, small ? 2 : 6)}` +
    (small ? ' (about 0, as expected when the region holds every finite singularity)'
      : ' — not 0, so f has singular points outside the region (or a residue is inaccurate)');
  ui.sumCheck.classList.toggle('bad', !small);
}

/** A short text description of the plot for screen readers. */
function describePlot() {
  const v = state.infinity ? 'w' : (state.var.trim() || 'z');
  const [x0, x1, y0, y1] = plot.getView();
  const counts = {};
  for (const it of plot.markers) counts[it.kind] = (counts[it.kind] || 0) + 1;
  const marked = Object.entries(counts).map(([k, c]) => `${c} ${KIND_WORDS[k]}${c === 1 ? '' : 's'}`).join(', ');
  ui.plotDescription.textContent = `Phase plot of f${state.infinity ? '(1/w)' : ''} for ${regionWords(v, { shape: 'rectangle', corners: [[x0, y0], [x1, y1]] })}: colour shows the argument of f.` +
    (marked ? ` Marked: ${marked}; see the singularities table.` : '');
}

async function pick(index) {
  const item = found.items[index];
  if (!item) return;
  plot.selected = index;
  plot.draw();
  highlightRow(ui.tbody, index);
  const c = found.contour;
  const size = c.shape === 'circle' ? c.radius : Math.max(Math.abs(c.corners[1][0] - c.corners[0][0]), Math.abs(c.corners[1][1] - c.corners[0][1])) / 2;
  const annulus = laurentRadius(item, found.items, Math.max(size / 2, 1e-6));
  ui.detail.box.hidden = false;
  ui.detail.note.textContent = 'Computing the Laurent series…';
  ui.detail.math.textContent = '';
  ui.detail.body.textContent = '';
  ui.detail.warnings.textContent = '';
  const resp = await requestLaurent(found.base, item, annulus.radius);
  if (plot.selected !== index) return;
  showDetail(ui.detail, found.base.var, item, resp, annulus);
  const r = ui.detail.box.getBoundingClientRect();
  if (r.top > window.innerHeight || r.bottom < 0) ui.detail.box.scrollIntoView({ block: 'nearest' });
}

// ---- wiring ----------------------------------------------------------------------

function applyStateToControls() {
  ui.expr.value = state.f;
  ui.varName.value = state.var;
  ui.modulus.checked = state.modulus;
  ui.phase.checked = state.phase;
  ui.infinity.checked = state.infinity;
  ui.wheel.value = state.wheel;
  ui.autoFind.checked = state.autoFind;
  renderParams(ui.params, state.params, inputsChanged);
  applyAxisName();
  fillRegionFields();
  showUnderline(ui.mirror, state.f, null);
  syncMirror(ui.expr, ui.mirror);
}

ui.expr.addEventListener('input', () => { state.f = ui.expr.value; inputsChanged(); });
ui.expr.addEventListener('scroll', () => { ui.mirror.scrollTop = ui.expr.scrollTop; });
ui.varName.addEventListener('input', () => { state.var = ui.varName.value; applyAxisName(); plot.draw(); inputsChanged(); });
$('add-param').addEventListener('click', () => {
  const used = new Set(state.params.map((p) => p.name));
  const name = ['a', 'b', 'c', 'k', 'w0', 'zeta', 'tau'].find((n) => !used.has(n)) || 'p' + (state.params.length + 1);
  state.params.push({ name, value: '1', lo: null, hi: null });
  renderParams(ui.params, state.params, inputsChanged);
  inputsChanged();
  const inputs = ui.params.querySelectorAll('.p-name');
  if (inputs.length) inputs[inputs.length - 1].focus();
});
const optionChanged = () => {
  state.modulus = ui.modulus.checked;
  state.phase = ui.phase.checked;
  state.wheel = ui.wheel.value;
  persist();
  if (exprOk) plot.render();
};
ui.modulus.addEventListener('change', optionChanged);
ui.phase.addEventListener('change', optionChanged);
ui.wheel.addEventListener('change', () => { optionChanged(); drawWheelKey($('wheel'), state.wheel); });
ui.infinity.addEventListener('change', () => {
  state.infinity = ui.infinity.checked;
  if (state.infinity) { lastZView = plot.getView(); plot.homeView = [-1, 1, -1, 1]; plot.setView([-1, 1, -1, 1]); }
  else { plot.homeView = lastZView.slice(); plot.setView(lastZView); }
  state.view = plot.getView();
  applyAxisName();
  fillRegionFields();
  plot.coarse = null; plot.fine = null;
  plot.draw();
  describePlot();
  persist();
  if (exprOk) plot.render();
});
$('zoom-in').addEventListener('click', () => plot.zoom(1 / 1.5));
$('zoom-out').addEventListener('click', () => plot.zoom(1.5));
$('zoom-reset').addEventListener('click', () => plot.reset());

for (const radio of document.querySelectorAll('input[name=region-mode]')) {
  radio.addEventListener('change', () => {
    if (!radio.checked) return;
    if (radio.value === 'rect' && state.region.mode === 'view') state.region.rect = (state.infinity ? lastZView : state.view).slice();
    state.region.mode = radio.value;
    fillRegionFields();
    regionMoved();
    plot.draw();
    persist();
    autoSearchSoon();
  });
}
const regionTyped = () => {
  const num = (id) => Number($(id).value);
  const rect = ['rect-x0', 'rect-x1', 'rect-y0', 'rect-y1'].map(num);
  if (rect.every(Number.isFinite)) {
    if (state.region.mode === 'view') state.region.mode = 'rect';
    if (state.region.mode === 'rect') state.region.rect = rect;
  }
  const circle = ['circ-x', 'circ-y', 'circ-r'].map(num);
  if (circle.every(Number.isFinite)) state.region.circle = circle;
  fillRegionFields();
  regionMoved();
  plot.draw();
  persist();
  autoSearchSoon();
};
for (const id of ['rect-x0', 'rect-x1', 'rect-y0', 'rect-y1']) $(id).addEventListener('change', regionTyped);
for (const id of ['circ-x', 'circ-y', 'circ-r']) $(id).addEventListener('change', () => {
  if (state.region.mode !== 'circle') state.region.mode = 'circle';
  regionTyped();
});
ui.find.addEventListener('click', findSingularities);
ui.cancel.addEventListener('click', async () => {
  searchSerial++;
  ui.cancel.disabled = true;
  ui.find.disabled = false;
  ui.findStatus.className = 'find-status';
  ui.findStatus.textContent = 'Search stopped.';
  if (ui.ci.box.dataset.state === 'busy') contourStatus(ui.ci, 'Stopped before the contour integral finished.', 'stale');
  if (ui.inv.box.dataset.state === 'busy') { inverse.serial++; inverseStatus(ui.inv, 'Stopped before the inverse transform finished.', 'stale'); }
  await cancelHeavy();
});
ui.autoFind.addEventListener('change', () => { state.autoFind = ui.autoFind.checked; persist(); });
ui.inv.box.addEventListener('toggle', () => {
  if (ui.inv.box.open) inverseOnDemand();
});
ui.inv.span.addEventListener('change', () => {
  inverse.spanTyped = ui.inv.span.value.trim() !== '';
  ui.inv.spanHint.textContent = '';
  inverseOnDemand();
});

// Examples.
const demos = demoList();
const select = $('demo-select');
demos.forEach((d, i) => select.append(el('option', { value: String(i), text: d.title })));
if (demos.length === 0) select.closest('label').hidden = true;
/** Take over a whole new setup (an example, or a link's state); keeps the display options unless given. */
function adopt(next) {
  Object.assign(state, next);
  plot.homeView = state.infinity ? [-1, 1, -1, 1] : state.view.slice();
  plot.setView(state.view);
  if (!state.infinity) lastZView = plot.getView();
  applyStateToControls();
  plot.coarse = null; plot.fine = null;
  plot.markers = []; plot.selected = -1;
  ui.detail.box.hidden = true;
  describePlot();
  inputsChanged();
}

select.addEventListener('change', () => {
  const d = demos[Number(select.value)];
  if (!d) return;
  readingOpenNext = Boolean(d.transfer_function);
  inverseOpenNext = Boolean(d.transfer_function);
  adopt(Object.assign(demoState(d), { infinity: false, region: Object.assign({}, state.region, { mode: 'view' }) }));
  $('demo-description').hidden = !d.description;
  $('demo-description').textContent = d.description || '';
});

// A link followed while the page is open (only the address hash changes).
window.addEventListener('hashchange', () => {
  const next = fromHash(window.location.hash);
  if (next && toHash(state) !== window.location.hash) adopt(next);
});

// Layout follows the container (also inside an iframe).
let resizeTimer = 0;
const resized = () => {
  clearTimeout(resizeTimer);
  resizeTimer = setTimeout(() => { plot.resize(); if (exprOk) plot.scheduleRender(0); if (!ui.inv.result.hidden) drawInverseChart(ui.inv.chart); }, 80);
};
if (typeof ResizeObserver === 'function') new ResizeObserver(resized).observe(ui.canvas.parentElement);
window.addEventListener('resize', resized); // the height limit follows the window height

// ---- start -------------------------------------------------------------------------

fillMarkerKey($('marker-key'));
plot.resize();
plot.homeView = state.infinity ? [-1, 1, -1, 1] : state.view.slice();
plot.setView(state.view);
applyStateToControls();
ui.message.textContent = 'Loading the computing core…';

startEngine().then(() => {
  $('version').textContent = Engine.ready ? `Core version ${Engine.version}.` : '';
  drawWheelKey($('wheel'), state.wheel);
  exprOk = checkExpression();
  if (exprOk) plot.render();
  else showNoPicture();
  if (exprOk && state.autoFind) findSingularities();
  document.body.dataset.workers = String(Engine.usesWorkers);
  document.body.dataset.ready = 'true';
});

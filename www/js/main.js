// Wires the page together: the state, the controls, the plot, the readout, the
// region editor and the search pipeline. Everything the user types is kept (see state.js).
import { $, debounce } from './dom.js';
import { Engine, startEngine, runHeavy, runNow, responseError, cancelHeavy } from './engine.js';
import { openState, saveState, stateFromLink, sameState, lastWrittenHash, onStorage } from './state.js';
import { attachLinkBar } from './link-bar.js';
import { setScheme } from './scheme.js';
import { attachPrint } from './print.js';
import { showUnderline, syncMirror, checkExpression } from './expr-input.js';
import { renderParams, functionInput } from './params.js';
import { createPlot, plotDescription } from './plot.js';
import { createReadout } from './readout.js';
import { attachPlotCursor } from './plot-cursor.js';
import { createRegionEditor } from './region.js';
import { createContourEditor, createContourLive, windings } from './contour-edit.js';
import { contourStatus } from './contour.js';
import { showWindings } from './singularities.js';
import { markerAt } from './plot/overlays.js';
import { createPipeline } from './pipeline.js';
import { attachInverseSection } from './inverse.js';
import { drawInverseChart } from './inverse-chart.js';
import { attachTransferSection, redrawTransfer, setTransferDomain, transferDomain } from './transfer.js';
import { createPoleDrag } from './pole-drag.js';
import { createLivePath } from './live.js';
import { createTrails } from './trails.js';
import { drawWheelKey, fillMarkerKey } from './legend.js';
import { setSymbols, refreshMarkerIcons } from './markers.js';
import { demoList, demoState, fillExampleMenu, forgetExampleIfChanged } from './demos.js';
import { rationalAnalysis, fitView, UNIT_CIRCLE_BOX } from './fit.js';
import { installScripting, applyTransferState } from './scripting.js';
import { attachEntryForms } from './entry-forms.js';
import { attachRealIntegral } from './real-integral.js';
import { attachLaurentPanel } from './laurent-panel.js';
import { createImageCurve } from './image-curve.js';
import { installExport } from './export.js';
import { applyCompact, installEmbed } from './embed.js';

// The link's state (a packed one is unpacked asynchronously), else what this browser kept.
const opening = await openState(window.location.hash);
const state = opening.state;
setScheme(state.scheme); // the page's colours before anything is drawn
applyCompact(state); // a link's compact mode (embed.js), before the plot is sized
const ui = {
  expr: $('expr'), mirror: $('expr-mirror'), message: $('expr-message'), varName: $('var-name'), varDomain: $('var-domain'),
  params: $('params'), modulus: $('opt-modulus'), phase: $('opt-phase'), infinity: $('opt-infinity'),
  wheel: $('opt-wheel'), symbols: $('opt-symbols'), scheme: $('opt-scheme'), canvas: $('plot'), readout: $('readout'), plotStatus: $('plot-status'),
  fit: $('zoom-fit'), fitNote: $('fit-note'), fitNoteText: $('fit-note-text'), zoomSmall: $('zoom-small'), regionNote: $('region-note'),
  find: $('find'), cancel: $('cancel-find'), autoFind: $('auto-find'), findStatus: $('find-status'),
  resInf: $('res-inf'), sumCheck: $('sum-check'), stability: $('stability'), stabilityBox: $('stability-box'),
  stabilityTitle: $('stability-title'), warnings: $('warnings'), tbody: $('sing-body'), singTable: $('sing-table'),
  partial: $('partial-fractions'), pfWarnings: $('pf-warnings'), plotDescription: $('plot-description'),
  detail: { box: $('detail'), title: $('detail-title'), math: $('detail-math'), note: $('detail-note'), body: $('laurent-body'),
    warnings: $('detail-warnings'), table: $('laurent-table') },
  ci: { box: $('ci-box'), contour: $('ci-contour'), status: $('ci-status'), result: $('ci-result'), value: $('ci-value'),
    ways: $('ci-ways'), verdict: $('ci-verdict'), count: $('ci-count'), warnings: $('ci-warnings'), orientation: $('ci-orientation') },
  inv: { box: $('inv-box'), title: $('inv-title'), what: $('inv-what'), span: $('inv-span'), spanLabel: $('inv-span-label'),
    spanHint: $('inv-span-hint'), status: $('inv-status'), warnings: $('inv-warnings'), result: $('inv-result'),
    chart: $('inv-chart'), closed: $('inv-closed'), facts: $('inv-facts') },
  tf: { box: $('tf-box'), unit: $('tf-unit'), period: $('tf-period'), periodRow: $('tf-period-row'), status: $('tf-status'),
    warnings: $('tf-warnings'), result: $('tf-result'), chart: $('tf-chart'), readout: $('tf-readout'), margins: $('tf-margins'),
    encircle: $('tf-encircle'), caution: $('tf-caution'), rootsHead: $('tf-roots-head'), roots: $('tf-roots'), facts: $('tf-facts'),
    stepFigure: $('tf-step-figure'), stepChart: $('tf-step-chart'), step: $('tf-step') },
};

/** What the parts of the page share. */
const page = {
  state, ui,
  plot: null,
  exprOk: false,                 // the last check found no error in the function
  lastZView: state.view.slice(), // the z-plane view, kept while the view around infinity is shown
  found: { items: [], key: '' }, // the last search: its points, the function (base) and the contour
  searchSerial: 0,               // raised by every new search, change and Stop; stale answers are dropped
  readingOpenNext: null,         // an example says whether to open the transfer-function reading
  inverseOpenNext: null,         // ... and whether to open the inverse transform (for z)
};

const persist = debounce(() => saveState(state), 250);

// ---- the plot, the readout, the region and the pipeline ------------------------------

const plot = createPlot(ui.canvas, {
  baseRequest: () => (Engine.ready ? Object.assign(functionInput(state), {
    options: { wheel: state.wheel, modulus_lines: state.modulus, phase_lines: state.phase, infinity: state.infinity },
  }) : null),
  onViewChange: (view) => {
    state.view = view;
    if (!state.infinity) page.lastZView = view.slice();
    persist();
    if (state.region.mode === 'view') { region.fill(); pipeline.regionMoved(); pipeline.autoSearchSoon(); }
    describePlot();
  },
  onPointer: (p) => readoutAt(p),
  onMarkerClick: (i) => pipeline.pick(i),
  onMarkerDragStart: (i) => { const ok = poleDrag.start(i); if (ok) ui.canvas.dataset.dragging = 'true'; return ok; },
  onMarkerDrag: (p) => poleDrag.move(p),
  onMarkerDragEnd: () => { delete ui.canvas.dataset.dragging; poleDrag.end(); },
  onUndo: () => poleDrag.undo(),
  onMarkerNudge: (index, d) => poleDrag.nudge(index, d),
  onMarkerNudgeEnd: () => poleDrag.nudgeEnd(),
  // the contour on the plot (contour-edit.js): a press on its handles or outline edits it
  contourDrawing: () => Boolean(page.contourEdit && page.contourEdit.drawing),
  onContourPress: (pos) => Boolean(page.contourEdit && page.contourEdit.press(pos)),
  onContourMove: (pos) => page.contourEdit.move(pos),
  onContourRelease: (pos, moved) => {
    const wasDrawing = page.contourEdit.drawing;
    page.contourEdit.release(pos, moved);
    if (!moved && !wasDrawing) { const i = markerAt(plot, pos); if (i >= 0) pipeline.pick(i); }
  },
  onContourHover: (pos) => page.contourEdit && page.contourEdit.hover(pos),
  onDoubleClick: (pos) => Boolean(page.contourEdit && page.contourEdit.doubleClick(pos)),
  onKey: (event) => Boolean(page.contourEdit && page.contourEdit.key(event)),
  onCursorKey: (event) => Boolean(page.plotCursor && page.plotCursor.key(event)),
  onStatus: (what) => {
    ui.plotStatus.textContent = what === 'drawing' ? 'Drawing…' : what === 'error' ? 'Plot failed (see the message on the plot).' : '';
    ui.canvas.dataset.status = what;
  },
});
page.plot = plot;
const readoutAt = createReadout(page);
page.plotCursor = attachPlotCursor(page, readoutAt, $('cursor-live')); // the keyboard cursor and its announced readout
const region = createRegionEditor(page, (how) => {
  pipeline.regionMoved(); plot.draw(); persist();
  if (how && how.now && state.autoFind && page.exprOk) pipeline.find(); else pipeline.autoSearchSoon();
});
const pipeline = createPipeline(page, {
  contour: () => region.contour(), sign: () => region.sign(), tableFilled: () => showWindingColumn(),
  describePlot: () => { describePlot(); poleDrag.prepare(); },
  searched: (serial) => laurent.afterSearch(serial), stale: () => laurent.stale(),
});
const laurent = attachLaurentPanel(page, { persist: () => persist() });
page.laurent = laurent;

// ---- the contour on the plot: drawn, dragged, its integral live ------------------------------

page.regionEditor = region;
/** The winding column of the singularities table, for the contour as it stands (the searched
 *  contour when the region is the view: a nudge may have moved it). */
function showWindingColumn() {
  const items = page.found.items || [];
  const contour = state.region.mode === 'view' && page.found.contour ? page.found.contour : region.contour();
  showWindings(ui.tbody, windings(items, contour, region.sign()));
}
const contourLive = createContourLive(page, { contour: () => region.contour() });
/** A drag let go or an edit made: the full search (or, with automatic search off, the stale label). */
function contourCommitted() {
  contourLive.stop();
  persist();
  pipeline.regionMoved();
  if (state.autoFind && page.exprOk) pipeline.find();
  else if (ui.ci.box.dataset.state === 'live') contourStatus(ui.ci, 'The contour moved: the values below may be for a step of the drag; search again to update them.', 'stale');
}
page.contourEdit = createContourEditor(page, {
  live: () => {
    persist();
    // a search still running would hold the worker: drop it silently, it runs again on release
    if (!ui.cancel.disabled) {
      page.searchSerial++;
      ui.cancel.disabled = true;
      ui.find.disabled = false;
      ui.findStatus.className = 'find-status';
      ui.findStatus.textContent = 'The contour is moving: the search runs once you let go.';
      cancelHeavy();
    }
    if (page.exprOk && Engine.ready) contourLive.change();
  },
  released: contourCommitted,
  changed: contourCommitted,
});
page.contourEdit.refresh = showWindingColumn;
plot.contourEdit = page.contourEdit;
$('poly-draw').addEventListener('click', () => page.contourEdit.startDrawing());
region.fill();
attachInverseSection(page);
attachTransferSection(page);
// The real-integral block (real-integral.js): recomputed when open and f or its fields change.
const realIntegral = attachRealIntegral(page, { redraw: () => plot.draw(), persist: () => persist(), show: (v) => plot.show(v) });

function applyAxisName() {
  plot.axisName = state.infinity ? 'w' : (state.var.trim() || 'z');
  plot.infinityMode = state.infinity;
  plot.unitCircle = !state.infinity && state.var.trim() === 'z'; // the stability boundary in the z-plane
}

function describePlot() {
  ui.plotDescription.textContent = plotDescription(plot, state.infinity ? 'w' : (state.var.trim() || 'z'), state.infinity);
}

// ---- typing ------------------------------------------------------------------------------

function showNoPicture() {
  if (plot.keepLastValid()) return; // keep the last good picture, labelled with its f
  plot.message = Engine.ready ? 'No picture yet: the function needs fixing (see the message under it).' : Engine.message;
  plot.draw();
}

function checkTyped() {
  page.exprOk = checkExpression(ui, state);
  if (page.exprOk) plot.render();
  else showNoPicture();
  showFitControl();
  return page.exprOk;
}
const afterTyping = debounce(() => {
  checkTyped();
  pipeline.autoSearchSoon();
}, 120);

// ---- fitting the view to a rational f ----------------------------------------------------------

/** The Fit button shows while f is rational (the core's partial fractions answer). */
async function showFitControl() {
  if (!page.exprOk || !Engine.ready) { ui.fit.hidden = true; return; }
  const base = functionInput(state);
  const known = await rationalAnalysis(base);
  if (JSON.stringify(functionInput(state)) !== JSON.stringify(base)) return;
  ui.fit.hidden = !(known && known.rational && fitView(known.poles, known.zeros));
}

/** Fit the view to every finite pole and zero of a rational f (10 % margin); says so under the
 *  plot when the poles span decades. Resolves true when the view was fitted. */
async function fitToPoints() {
  if (!page.exprOk || !Engine.ready || state.infinity) return false;
  const base = functionInput(state);
  const known = await rationalAnalysis(base);
  if (JSON.stringify(functionInput(state)) !== JSON.stringify(base) || state.infinity) return false;
  const extra = transferDomain(base.var) === 'z' ? UNIT_CIRCLE_BOX : [];
  const fit = known && known.rational ? fitView(known.poles, known.zeros, extra) : null;
  ui.fit.hidden = !fit;
  if (!fit) return false;
  ui.fitNote.hidden = !fit.decades;
  if (fit.decades) {
    ui.fitNoteText.textContent = fit.decades.note;
    ui.zoomSmall.hidden = !fit.decades.smallView;
    page.smallView = fit.decades.smallView;
  }
  plot.homeView = fit.view.slice();
  plot.reset();
  return true;
}

const live = createLivePath(page, {
  plot, pipeline,
  /** What a live change does at once besides the views: the state kept, the underline follows. */
  edited() {
    forgetExampleIfChanged(state);
    persist();
    showUnderline(ui.mirror, state.f, null);
    syncMirror(ui.expr, ui.mirror);
    realIntegral.changed();
  },
  trailsChanged: () => trails.changed(),
});
const liveUpdate = () => live.update();

/** The change is complete (a drag let go, a slider released, an undo): check and search now. */
function commitNow() {
  live.committed();
  markChanged();
  afterTyping.cancel();
  if (checkTyped()) pipeline.find();
  trails.changed();
}

const poleDrag = createPoleDrag(page, { liveChanged: liveUpdate, released: commitNow, undone: commitNow });
const trails = createTrails(page, { persist: () => persist() });
$('drag-undo').addEventListener('click', () => poleDrag.undo());

function inputsChanged(how) {
  if (how && how.live) { liveUpdate(); return; }
  if (how && how.released) { commitNow(); return; }
  trails.changed();
  markChanged();
  afterTyping();
}

/** What every change of f, its variable or its parameters does at once: the results go stale,
 *  the state is kept, the underline follows the text. */
function markChanged() {
  live.settle();
  forgetExampleIfChanged(state);
  ui.fitNote.hidden = true;
  pipeline.markStale();
  persist();
  showUnderline(ui.mirror, state.f, null);
  syncMirror(ui.expr, ui.mirror);
  realIntegral.changed();
}

function applyStateToControls() {
  ui.expr.value = state.f;
  ui.varName.value = state.var;
  ui.modulus.checked = state.modulus;
  ui.phase.checked = state.phase;
  ui.infinity.checked = state.infinity;
  ui.wheel.value = state.wheel;
  ui.symbols.value = state.symbols;
  applySymbols();
  if ($('export-complex')) $('export-complex').value = state.complex_format;
  ui.scheme.value = state.scheme;
  setScheme(state.scheme);
  ui.autoFind.checked = state.autoFind;
  applyTransferState(page);
  renderParams(ui.params, state.params, inputsChanged);
  applyAxisName();
  region.fill();
  showUnderline(ui.mirror, state.f, null);
  syncMirror(ui.expr, ui.mirror);
}

// ---- the controls --------------------------------------------------------------------------

ui.expr.addEventListener('input', () => { state.f = ui.expr.value; poleDrag.forget(); inputsChanged(); });
ui.expr.addEventListener('scroll', () => { ui.mirror.scrollTop = ui.expr.scrollTop; });
ui.varName.addEventListener('input', () => { state.var = ui.varName.value; applyAxisName(); plot.draw(); inputsChanged(); });
ui.varDomain.addEventListener('change', () => { state.domain = ui.varDomain.value; setTransferDomain(state.domain); inputsChanged(); });
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
  if (page.exprOk) plot.render();
};
ui.modulus.addEventListener('change', optionChanged);
ui.phase.addEventListener('change', optionChanged);
ui.wheel.addEventListener('change', () => { optionChanged(); drawWheelKey($('wheel'), state.wheel); });
/** Pole and zero symbols: ours, or × and ○ as in a pole–zero diagram; the plot, key and table follow. */
function applySymbols() {
  setSymbols(state.symbols);
  refreshMarkerIcons(document.body);
  plot.draw();
}
ui.symbols.addEventListener('change', () => { state.symbols = ui.symbols.value; persist(); applySymbols(); });
ui.scheme.addEventListener('change', () => { state.scheme = ui.scheme.value; persist(); setScheme(state.scheme); });
ui.infinity.addEventListener('change', () => {
  state.infinity = ui.infinity.checked;
  if (state.infinity) { page.lastZView = plot.getView(); plot.homeView = [-1, 1, -1, 1]; plot.setView([-1, 1, -1, 1]); }
  else { plot.homeView = page.lastZView.slice(); plot.setView(page.lastZView); }
  state.view = plot.getView();
  applyAxisName();
  region.fill();
  plot.coarse = null; plot.fine = null;
  plot.draw();
  describePlot();
  persist();
  if (page.exprOk) plot.render();
});
$('zoom-in').addEventListener('click', () => plot.zoom(1 / 1.5));
$('zoom-out').addEventListener('click', () => plot.zoom(1.5));
$('zoom-reset').addEventListener('click', () => plot.reset());
ui.fit.addEventListener('click', () => fitToPoints());
ui.zoomSmall.addEventListener('click', () => { if (page.smallView) plot.show(page.smallView); });
ui.find.addEventListener('click', pipeline.find);
ui.cancel.addEventListener('click', () => { pipeline.stop(); realIntegral.stop(); });
ui.autoFind.addEventListener('change', () => { state.autoFind = ui.autoFind.checked; persist(); });

// ---- examples and links ------------------------------------------------------------------

const select = $('demo-select');
fillExampleMenu(select);
/** Take over a whole new setup (an example, or a link's state); keeps the display options unless given. */
function adopt(next) {
  Object.assign(state, next);
  plot.homeView = state.infinity ? [-1, 1, -1, 1] : state.view.slice();
  plot.setView(state.view);
  if (!state.infinity) page.lastZView = plot.getView();
  applyStateToControls();
  plot.coarse = null; plot.fine = null;
  plot.markers = []; plot.selected = -1;
  ui.detail.box.hidden = true;
  poleDrag.forget();
  trails.adopted();
  describePlot();
  inputsChanged();
}

select.addEventListener('change', () => {
  const d = demoList()[Number(select.value)];
  if (!d) return;
  page.readingOpenNext = Boolean(d.transfer_function);
  page.inverseOpenNext = Boolean(d.transfer_function);
  const next = Object.assign(demoState(d), { infinity: false, region: Object.assign({}, state.region, { mode: 'view' }) });
  if (d.real_integral) next.integral = Object.assign({}, state.integral, d.real_integral, { open: true }); // the example opens its integral
  adopt(next);
  $('demo-description').hidden = !d.description;
  $('demo-description').textContent = d.description || '';
  // A rational example opens fitted to its poles and zeros.
  afterTyping.cancel();
  if (checkTyped()) fitToPoints().then(() => pipeline.autoSearchSoon());
});

// ---- entering f as a ratio of polynomials ----------------------------------------------------

/** f written from the entry forms takes the path an example takes: a new function in the view
 *  region, fitted to its poles and zeros, then searched. */
function writeFunction(f, v) {
  adopt({ f, var: v, infinity: false, region: Object.assign({}, state.region, { mode: 'view' }) });
  afterTyping.cancel();
  if (checkTyped()) fitToPoints().then(() => pipeline.autoSearchSoon());
}
attachEntryForms({
  currentVar: () => state.var.trim() || 'z',
  base: () => functionInput(state),
  run: runHeavy,
  check: (f, v) => {
    if (!Engine.ready) return Engine.message || 'the computing core is still loading';
    const err = responseError(runNow(Object.assign(functionInput(state), { f, var: v, task: 'evaluate', at: [[0.31, 0.17]] })));
    return err ? err.message : null;
  },
  write: writeFunction,
});

// The link bar (link-bar.js): a link that replaced other work keeps it one click away; an
// unreadable link says so and keeps the work; a full storage says so.
const linkBar = attachLinkBar((s) => adopt(s));
onStorage((outcome) => linkBar.storage(outcome));
if (opening.problem) linkBar.bad(opening.problem);
else if (opening.previous) linkBar.opened(opening.previous, state);

// A link followed while the page is open (only the address hash changes).
window.addEventListener('hashchange', async () => {
  const hash = window.location.hash;
  if (hash === lastWrittenHash()) return;
  const link = await stateFromLink(hash);
  if (hash !== window.location.hash) return; // another change came in meanwhile
  if (link.kind === 'bad') { linkBar.bad(link.reason); return; }
  if (link.kind !== 'ok' || sameState(link.state, state)) return;
  const had = JSON.parse(JSON.stringify(state));
  adopt(link.state);
  linkBar.opened(had, link.state);
});

// Layout follows the container (also inside an iframe).
let resizeTimer = 0;
const resized = () => {
  clearTimeout(resizeTimer);
  resizeTimer = setTimeout(() => { plot.resize(); if (page.exprOk) plot.scheduleRender(0); if (!ui.inv.result.hidden) drawInverseChart(ui.inv.chart); redrawTransfer(page); }, 80);
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

// A page opened with no view of its own (no link's view, nothing kept) fits a rational f.
const fitOnOpen = opening.fromLink ? !opening.linkGivesView : !opening.hadStored;
const started = startEngine().then(async () => {
  $('version').textContent = Engine.ready ? `Core version ${Engine.version}.` : '';
  drawWheelKey($('wheel'), state.wheel);
  checkTyped();
  trails.changed();
  if (page.exprOk && fitOnOpen) await fitToPoints();
  if (page.exprOk && state.autoFind) pipeline.find();
  document.body.dataset.workers = String(Engine.usesWorkers);
  document.body.dataset.ready = 'true';
});

// The image curve f(γ) (image-curve.js), for the region's contour.
const imageCurve = createImageCurve(page, {
  contour: () => region.contour(),
  fnInput: () => (page.exprOk ? functionInput(state) : null),
  argumentCount: () => {
    const res = page.results;
    if (!res || !res.argument_count || res.serial !== page.searchSerial) return null;
    return JSON.stringify(res.contour) === JSON.stringify(region.contour()) ? res.argument_count : null;
  },
});

// The page's colours (scheme.js) and printing (print.js): every drawing on a canvas follows them.
function redrawDrawings() {
  plot.draw();
  if (Engine.ready) drawWheelKey($('wheel'), state.wheel);
  if (!ui.inv.result.hidden) drawInverseChart(ui.inv.chart);
  redrawTransfer(page);
  imageCurve.redraw();
}
setScheme(state.scheme, redrawDrawings);
page.print = attachPrint(page, {
  request: () => (page.exprOk && Engine.ready ? Object.assign(functionInput(state), {
    options: { wheel: state.wheel, modulus_lines: state.modulus, phase_lines: state.phase, infinity: state.infinity },
  }) : null),
  redraw: redrawDrawings,
});

installScripting(page, {
  started,
  imageCurve,
  adopt,
  checkNow: () => { afterTyping.cancel(); return checkTyped(); },
  fit: fitToPoints,
  contour: () => region.contour(),
  windings: () => {
    const items = page.found.items || [];
    const contour = state.region.mode === 'view' && page.found.contour ? page.found.contour : region.contour();
    const w = windings(items, contour, region.sign());
    return items.map((it, i) => ({ at: it.at.slice(), kind: it.kind, winding: w[i] }));
  },
  pipeline,
  trails: () => trails.refresh(),
  integral: realIntegral,
});

// Export and copy (export.js): PNG, SVG, CSV and JSON of the plot and of every result; window.residuary.export.
installExport(page, { baseRequest: () => plot.baseRequest(), persist: () => persist(), results: () => window.residuary.results() });

// The Embed control and, in a frame, the message interface (embed.js).
installEmbed(page, { started });

// The search pipeline: after the function or the region changes, search the
// region for singularities (off the main thread, cancellable by Stop), then fill
// the table, the markers, the residue sums and the transfer-function reading;
// then the contour integral three ways, the argument-principle count, the
// inverse transform (when its section is open) and the partial fractions. Each
// step checks that no newer search or Stop has come in the meantime. Also the
// Laurent detail for a chosen point.
import { el, debounce } from './dom.js';
import { Engine, runHeavy, cancelHeavy, responseError } from './engine.js';
import { functionInput } from './params.js';
import { regionProblem } from './region.js';
import {
  itemsOf, stabilityReading, searchSingularities, showSums, fillTable, highlightRow, laurentRadius, requestLaurent, showDetail,
} from './singularities.js';
import { requestContourIntegral, requestArgumentCount, showContourIntegral, showArgumentCount, contourStatus } from './contour.js';
import { inverseStatus, prepareInverse, runInverse, stopInverse } from './inverse.js';
import { prepareTransfer, runTransfer, stopTransfer, transferOpen } from './transfer.js';
import { rationalAnalysis, nudgeOffEdges, nudgeNote } from './fit.js';
import { contourSize } from './contour-geom.js';

/** The pipeline over `page` (state, ui, plot, exprOk, found, searchSerial, readingOpenNext; see
 *  main.js). Hooks: contour() (the region's contour now), describePlot() (after the markers change),
 *  searched(serial) (after the partial fractions: the Laurent section), stale() (the results no longer belong to f).
 *  Every run keeps what each panel computed in page.results ({serial, base, contour, singularities,
 *  contour_integral, argument_count, inverse, transfer_function, partial_fractions}: the core's responses) and ends with
 *  an outcome: {status: 'done'}, {status: 'failed', error: {code, message}} or {status: 'superseded'}
 *  (a newer run, a change or Stop came in). `settled()` resolves when the latest run has ended. */
export function createPipeline(page, hooks) {
  const { state, ui } = page;
  const plot = () => page.plot;
  let latestRun = Promise.resolve({ status: 'done' });

  const autoSearch = debounce(() => { if (state.autoFind) find(); }, 700);

  /** The results no longer belong to the function: dim them and take the markers off the plot. */
  function markStale() {
    page.searchSerial++;
    ui.singTable.classList.add('stale');
    ui.find.disabled = false;
    ui.cancel.disabled = true;
    ui.findStatus.className = 'find-status';
    ui.findStatus.textContent = state.autoFind ? 'The function changed; searching again when typing stops…' : 'The function changed: press “Find singularities” for new results.';
    if (plot().markers.length) { plot().markers = []; plot().selected = -1; plot().draw(); }
    ui.canvas.dataset.markers = '0';
    ui.detail.box.hidden = true;
    if (hooks.stale) hooks.stale(); // the Laurent section (laurent-panel.js)
    if (ui.ci.box.dataset.state !== 'none') contourStatus(ui.ci, 'The function changed: the contour integral is computed again with the next search.', 'stale');
    if (!['none', 'closed'].includes(ui.inv.box.dataset.state)) inverseStatus(ui.inv, 'The function changed: the inverse transform is computed again with the next search.', 'stale');
  }

  /** The contour no longer matches the shown integral: say so until the next search. */
  function regionMoved() {
    const st = ui.ci.box.dataset.state;
    if (st === 'done' || st === 'error') contourStatus(ui.ci, 'The region changed: the integral below is for the contour named above; search again to update it.', 'stale');
  }

  /** Run the pipeline now; resolves with its outcome (see above). */
  function find() {
    const run = runPipeline();
    latestRun = run;
    return run;
  }

  /** Resolves with the outcome of the latest run once it has ended (and no newer one began). */
  async function settled() {
    for (;;) {
      const run = latestRun;
      const outcome = await run;
      if (run === latestRun) return outcome;
    }
  }

  async function runPipeline() {
    const superseded = { status: 'superseded' };
    autoSearch.cancel();
    if (!Engine.ready || !page.exprOk) {
      ui.findStatus.textContent = page.exprOk ? 'The computing core is not ready.' : 'Fix the function first.';
      return { status: 'failed', error: Engine.ready ? { code: 'expression', message: 'fix the function first' } : { code: 'not_ready', message: 'the computing core is still loading' } };
    }
    let contour = hooks.contour();
    const problem = regionProblem(contour);
    if (problem) { ui.findStatus.textContent = 'Region: ' + problem + '.'; return { status: 'failed', error: { code: 'invalid_field', message: 'region: ' + problem } }; }
    const serial = ++page.searchSerial;
    const base = functionInput(state);
    page.results = { serial, base, contour, sign: hooks.sign ? hooks.sign() : 1 };
    ui.regionNote.textContent = '';
    ui.find.disabled = true;
    ui.cancel.disabled = false;
    ui.findStatus.textContent = 'Searching…';
    ui.findStatus.className = 'find-status busy';
    if (ui.ci.box.dataset.state !== 'none') contourStatus(ui.ci, 'Waiting for the search…', 'stale');
    // The current view as the region: a known pole or zero on its edge moves the edge out a little.
    if (state.region.mode === 'view') {
      const known = await rationalAnalysis(base);
      if (serial !== page.searchSerial) return superseded;
      if (known && known.rational) {
        const nudge = nudgeOffEdges(contour, known.poles.concat(known.zeros));
        if (nudge.widenedBy > 0) {
          contour = nudge.contour;
          page.results.contour = contour;
          page.results.nudge = { widened_by: nudge.widenedBy, at: nudge.at, note: nudgeNote(base.var, nudge, known.poles) };
          ui.regionNote.textContent = page.results.nudge.note;
        }
      }
    }
    const resp = await searchSingularities(base, contour);
    if (serial !== page.searchSerial) return superseded;
    page.results.singularities = resp;
    ui.findStatus.className = 'find-status';
    const err = responseError(resp);
    if (err) {
      ui.find.disabled = false;
      ui.cancel.disabled = true;
      ui.findStatus.textContent = err.code === 'cancelled' ? 'Search stopped.' : 'Search failed: ' + err.message;
      contourStatus(ui.ci, 'Not computed: the search did not finish.', 'stale');
      return { status: 'failed', error: { code: err.code, message: err.message } };
    }
    ui.singTable.classList.remove('stale');
    const size = contour.shape === 'circle' ? contour.radius : contourSize(contour);
    const found = { items: itemsOf(resp, 1e-12 * size), base, contour };
    page.found = found;
    const n = found.items.length;
    ui.findStatus.textContent = n ? `Found ${n} point${n === 1 ? '' : 's'} in the region` +
      (resp.method === 'rational' ? ' (f is rational: exact analysis)' : resp.method === 'numerical' ? ' (numerical search)' : '') +
      '. Choose a row or marker for its principal part.' : 'Search finished: nothing in the region.';
    fillTable(ui.tbody, found.items, pick);
    if (hooks.tableFilled) hooks.tableFilled();
    plot().markers = found.items;
    plot().selected = -1;
    plot().draw();
    ui.canvas.dataset.markers = String(found.items.length);
    hooks.describePlot();
    ui.detail.box.hidden = true;
    ui.warnings.textContent = '';
    for (const w of Array.isArray(resp.warnings) ? resp.warnings : []) ui.warnings.append(el('li', { text: String(w) }));
    showSums(ui, resp, found.items);
    // A transfer-function reading, only for s or z, and said to be a reading.
    const reading = stabilityReading(base.var, found.items, contour);
    const wasVar = ui.stabilityBox.dataset.var;
    ui.stabilityBox.hidden = !reading;
    if (reading) {
      ui.stabilityTitle.textContent = reading.title;
      ui.stability.textContent = reading.text;
      // Open by default for s; for z (also the default variable) it stays folded unless opened,
      // except for an example that is a transfer function.
      if (page.readingOpenNext !== null) ui.stabilityBox.open = page.readingOpenNext;
      else if (wasVar !== base.var) ui.stabilityBox.open = base.var === 's';
      page.readingOpenNext = null;
      ui.stabilityBox.dataset.var = base.var;
    }
    prepareInverse(page, base);
    // The contour integral three ways, then the argument-principle count (still cancellable by Stop).
    contourStatus(ui.ci, 'Computing the contour integral three ways…', 'busy');
    const ci = await requestContourIntegral(base, contour);
    if (serial !== page.searchSerial) return superseded;
    page.results.contour_integral = ci;
    showContourIntegral(ui.ci, base.var, contour, state.region.mode === 'view', ci, hooks.sign ? hooks.sign() : 1);
    const count = await requestArgumentCount(base, contour);
    if (serial !== page.searchSerial) return superseded;
    page.results.argument_count = count;
    showArgumentCount(ui.ci, count);
    // Then the inverse transform (s or z), when its section is open; Stop still cancels it.
    if (!ui.inv.box.hidden && ui.inv.box.open) {
      await runInverse(page, base);
      if (serial !== page.searchSerial) return superseded;
    }
    // Then the transfer-function reading (rational f in s or z), when its section is open.
    await prepareTransfer(page, base);
    if (serial !== page.searchSerial) return superseded;
    if (transferOpen(page)) {
      await runTransfer(page, base);
      if (serial !== page.searchSerial) return superseded;
    }
    ui.find.disabled = false;
    ui.cancel.disabled = true;
    // Partial fractions, shown only when f is rational (the task answers).
    const pf = await runHeavy(Object.assign({}, base, { task: 'partial_fractions' }));
    if (serial !== page.searchSerial) return superseded;
    page.results.partial_fractions = pf;
    const pfErr = responseError(pf);
    ui.partial.hidden = Boolean(pfErr) || typeof pf.text !== 'string';
    ui.pfWarnings.textContent = '';
    if (!ui.partial.hidden) {
      ui.partial.textContent = 'Partial fractions: ' + pf.text;
      for (const w of Array.isArray(pf.warnings) ? pf.warnings : []) ui.pfWarnings.append(el('li', { text: 'Partial fractions: ' + String(w) }));
    }
    // Then the Laurent section and the kind of infinity (laurent-panel.js).
    if (hooks.searched) {
      await hooks.searched(serial);
      if (serial !== page.searchSerial) return superseded;
    }
    return { status: 'done' };
  }

  /** Stop pressed: whatever is computing is dropped and the heavy worker restarted. */
  async function stop() {
    page.searchSerial++;
    ui.cancel.disabled = true;
    ui.find.disabled = false;
    ui.findStatus.className = 'find-status';
    ui.findStatus.textContent = 'Search stopped.';
    if (ui.ci.box.dataset.state === 'busy') contourStatus(ui.ci, 'Stopped before the contour integral finished.', 'stale');
    stopInverse(page);
    stopTransfer(page);
    await cancelHeavy();
  }

  /** A row or marker chosen: its principal part and Laurent coefficients. */
  async function pick(index) {
    const found = page.found;
    const item = found.items[index];
    if (!item) return;
    plot().selected = index;
    plot().draw();
    highlightRow(ui.tbody, index);
    const c = found.contour;
    const size = c.shape === 'circle' ? c.radius : contourSize(c) / 2;
    const annulus = laurentRadius(item, found.items, Math.max(size / 2, 1e-6));
    ui.detail.box.hidden = false;
    ui.detail.note.textContent = 'Computing the Laurent series…';
    ui.detail.math.textContent = '';
    ui.detail.body.textContent = '';
    ui.detail.warnings.textContent = '';
    const resp = await requestLaurent(found.base, item, annulus.radius);
    if (plot().selected !== index) return;
    showDetail(ui.detail, found.base.var, item, resp, annulus);
    const r = ui.detail.box.getBoundingClientRect();
    if (r.top > window.innerHeight || r.bottom < 0) ui.detail.box.scrollIntoView({ block: 'nearest' });
  }

  return {
    find, stop, pick, markStale, regionMoved, settled,
    /** Search after a pause, when automatic search is on. */
    autoSearchSoon() { if (state.autoFind) autoSearch(); },
  };
}

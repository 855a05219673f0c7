// The search pipeline: after the function or the region changes, search the
// region for singularities (off the main thread, cancellable by Stop), then fill
// the table, the markers, the residue sums and the transfer-function reading;
// then the contour integral three ways, the argument-principle count, the
// inverse transform (when its section is open) and the partial fractions. Each
// step checks that no newer search or Stop has come in the meantime. Also the
// Laurent detail for a chosen point.
import { $, el, debounce } from './dom.js';
import { Engine, runHeavy, cancelHeavy, abandonHeavy, responseError, yieldToBrowser } from './engine.js';
import { searchInPieces, SPLIT_AFTER_MS } from './search-pieces.js';
import { functionInput } from './params.js';
import { regionProblem } from './region.js';
import {
  itemsOf, stabilityReading, searchSingularities, showSums, fillTable, highlightRow, laurentRadius, requestLaurent, showDetail,
} from './singularities.js';
import { requestContourIntegral, requestArgumentCount, showContourIntegral, showArgumentCount, contourStatus } from './contour.js';
import { inverseStatus, prepareInverse, runInverse, stopInverse } from './inverse.js';
import { prepareTransfer, runTransfer, stopTransfer, transferOpen } from './transfer.js';
import { rationalAnalysis, nudgeOffEdges, nudgeNote, widenOffContour, widenNote, NUDGE_TRIES } from './fit.js';
import { contourSize } from './contour-geom.js';
import { fmtReal, fmtSig, functionWords } from './format.js';
import { KIND_WORDS } from './markers.js';
import { isFinitePair } from './complex.js';
import { partialFractionsMathML } from './mathml.js';
import { latexButton } from './latex.js';

/** Seconds as shown by the progress line: one decimal. */
function secondsText(ms) {
  return (Math.max(0, ms) / 1000).toFixed(1) + ' s';
}

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

  const singStale = () => $('sing-stale');
  const sums = () => $('sums');

  /** The table, the sums and the detail shown as stale and inert: dimmed, labelled with the f
   *  they were computed for, rows unfocusable and unclickable (pick() refuses them too). */
  function showTableStale(why) {
    ui.singTable.classList.add('stale');
    ui.tbody.inert = true;
    if ($('sing-pager')) $('sing-pager').inert = true;
    for (const tr of ui.tbody.querySelectorAll('tr[data-index]')) tr.removeAttribute('tabindex');
    if (sums()) sums().classList.add('stale');
    for (const part of [ui.warnings, ui.stabilityBox, ui.partial, ui.pfWarnings]) part.classList.add('stale');
    ui.detail.box.hidden = true;
    hidePickNote();
    const note = singStale();
    const found = page.found;
    if (note) {
      note.hidden = !(found && found.base && found.items);
      note.textContent = note.hidden ? '' : `Stale: the table and the sums below were computed for ${functionWords(found.base)}; ${why}. They cannot be chosen until a search for the current f finishes.`;
    }
  }

  /** Fresh results: the table and the sums at full contrast and live again. */
  function showTableFresh() {
    ui.singTable.classList.remove('stale');
    ui.tbody.inert = false;
    if ($('sing-pager')) $('sing-pager').inert = false;
    if (sums()) sums().classList.remove('stale');
    for (const part of [ui.warnings, ui.stabilityBox, ui.partial, ui.pfWarnings]) part.classList.remove('stale');
    const note = singStale();
    if (note) { note.hidden = true; note.textContent = ''; }
  }

  /** The results no longer belong to the function: dim them and take the markers off the plot. */
  function markStale() {
    page.searchSerial++;
    endProgress();
    showTableStale('the function has changed since');
    ui.find.disabled = false;
    ui.cancel.disabled = true;
    ui.findStatus.className = 'find-status';
    ui.findStatus.textContent = state.autoFind ? 'The function changed; searching again when typing stops…' : 'The function changed: press “Find singularities” for new results.';
    if (plot().markers.length) { plot().markers = []; plot().selected = -1; plot().draw(); }
    ui.canvas.dataset.markers = '0';
    if (hooks.stale) hooks.stale(); // the Laurent section (laurent-panel.js)
    if (ui.ci.box.dataset.state !== 'none') contourStatus(ui.ci, 'The function changed: the contour integral is computed again with the next search.', 'stale');
    if (!['none', 'closed'].includes(ui.inv.box.dataset.state)) inverseStatus(ui.inv, 'The function changed: the inverse transform is computed again with the next search.', 'stale');
  }

  // ---- progress: the stage, the time since the run began and what it has found so far ----
  // The core answers one search in one piece. A search of a rectangle that has not answered
  // within SPLIT_AFTER_MS is abandoned and run again in pieces (search-pieces.js): the line then
  // counts the points the finished pieces found ("37 points so far, 9 of 16 pieces searched").
  // Once the search has answered, the later stages say how many points it found.
  const progress = { timer: 0, t0: 0, stage: '', found: '', count: null, pieces: '' };
  const progressLine = () => $('find-progress');
  function showProgress() {
    const line = progressLine();
    if (!line) return;
    line.hidden = false;
    line.textContent = `${progress.stage} ${secondsText(performance.now() - progress.t0)}` + (progress.found ? ` · ${progress.found}` : '') + '. Stop abandons it.';
    line.dataset.stage = progress.key;
    if (progress.count === null) delete line.dataset.found; else line.dataset.found = String(progress.count);
    if (progress.pieces) line.dataset.pieces = progress.pieces; else delete line.dataset.pieces;
  }
  function startProgress() {
    clearInterval(progress.timer);
    progress.t0 = performance.now();
    progress.found = '';
    progress.count = null;
    progress.pieces = '';
    progress.timer = setInterval(showProgress, 200);
  }

  /** The search of `contour`, with a running count when it is long: a rectangle whose search has not
   *  answered within page.searchSplitAfterMs (default SPLIT_AFTER_MS; Infinity never splits) is
   *  abandoned and searched again in pieces, each finished piece adding to the count shown. A quick
   *  search is never split, so its answer is the core's own. */
  async function searchWithProgress(base, contour, serial) {
    const ticket = {};
    const first = searchSingularities(base, contour, ticket);
    const after = typeof page.searchSplitAfterMs === 'number' ? page.searchSplitAfterMs : SPLIT_AFTER_MS;
    if (!Engine.usesWorkers || !(after < Infinity)) return first;
    const LATE = {};
    let timer = 0;
    const late = new Promise((resolve) => { timer = setTimeout(() => resolve(LATE), Math.max(0, after)); });
    const winner = await Promise.race([first, late]);
    clearTimeout(timer);
    if (winner !== LATE || serial !== page.searchSerial) return first;
    if (contour.shape !== 'rectangle') {
      progress.found = 'this shape is searched whole: what it finds is counted when it answers';
      showProgress();
      return first;
    }
    if (!(await abandonHeavy(ticket.id))) return first; // it answered meanwhile
    if (serial !== page.searchSerial) return { error: { code: 'cancelled', message: 'cancelled', span: null } };
    const plural = (n, word) => `${n} ${word}${n === 1 ? '' : 's'}`;
    return searchInPieces(contour, (c) => searchSingularities(base, c), {
      stopped: () => serial !== page.searchSerial,
      fmt: (x) => fmtReal(x, 6),
      onPiece: ({ done, total, found, kinds }) => {
        progress.count = found;
        progress.pieces = `${done}/${total}`;
        progress.found = `${plural(kinds.zeros, 'zero')} and ${plural(kinds.poles, 'pole')}` + (kinds.other ? ` and ${plural(kinds.other, 'other point')}` : '') +
          ` so far, ${done} of ${total} pieces of the region searched`;
        showProgress();
      },
    });
  }
  function stage(key, text) {
    progress.key = key;
    progress.stage = text;
    showProgress();
  }
  /** The run has ended; the line is cleared and the time it took is returned (ms). */
  function endProgress() {
    clearInterval(progress.timer);
    progress.timer = 0;
    const line = progressLine();
    if (line) { line.hidden = true; line.textContent = ''; delete line.dataset.stage; }
    return progress.t0 ? performance.now() - progress.t0 : 0;
  }

  /** The contour no longer matches the shown integral: say so until the next search. */
  function regionMoved() {
    const st = ui.ci.box.dataset.state;
    if (st === 'done' || st === 'error') contourStatus(ui.ci, 'The region changed: the integral below is for the contour named above; search again to update it.', 'stale');
    // The points found are still f's, but the sums and the count are the searched region's.
    if (sums() && page.found && page.found.items && !ui.singTable.classList.contains('stale')) sums().classList.add('stale');
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
    ui.findStatus.textContent = 'Searching the region for zeros, poles and other special points.';
    ui.findStatus.className = 'find-status busy';
    startProgress();
    stage('search', 'Searching for zeros and poles:');
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
    let resp = await searchWithProgress(base, contour, serial);
    if (serial !== page.searchSerial) return superseded;
    // The current view as the region, and the search met a zero or pole on its edge (f not
    // rational, e.g. gamma's poles at the integers): widen the region a little, by a step that is
    // not a round number, and search again; the note says so.
    if (state.region.mode === 'view') {
      const start = contour;
      for (let k = 0; k < NUDGE_TRIES && responseError(resp) && responseError(resp).code === 'on_contour'; k++) {
        const nudge = widenOffContour(start, k);
        contour = nudge.contour;
        page.results.contour = contour;
        page.results.nudge = { widened_by: nudge.widenedBy, at: null, note: widenNote(base.var, nudge) };
        ui.regionNote.textContent = page.results.nudge.note;
        resp = await searchWithProgress(base, contour, serial);
        if (serial !== page.searchSerial) return superseded;
      }
    }
    page.results.singularities = resp;
    // performance marks around taking the answer in (table, markers, sums): residuary-table-start / -end
    performance.mark('residuary-table-start');
    // Large answers are shown in steps, letting the browser breathe between them (no task over 50 ms).
    const big = (Array.isArray(resp.poles) ? resp.poles.length : 0) + (Array.isArray(resp.zeros) ? resp.zeros.length : 0) > 300;
    const breathe = async () => { if (big) await yieldToBrowser(); return serial !== page.searchSerial; };
    if (await breathe()) return superseded;
    ui.findStatus.className = 'find-status';
    const err = responseError(resp);
    if (err) {
      const took = endProgress();
      ui.find.disabled = false;
      ui.cancel.disabled = true;
      ui.findStatus.textContent = err.code === 'cancelled' ? `Search stopped after ${secondsText(took)}.` : `Search failed after ${secondsText(took)}: ` + err.message;
      showTableStale(err.code === 'cancelled' ? 'the search for the current f was stopped' : 'the search for the current f failed');
      if (plot().markers.length) { plot().markers = []; plot().selected = -1; plot().draw(); ui.canvas.dataset.markers = '0'; }
      const old = page.found && page.found.base && !ui.ci.result.hidden && ui.ci.box.dataset.state !== 'none';
      contourStatus(ui.ci, 'Not computed: the search did not finish' + (old ? `; the integral below is for ${functionWords(page.found.base)}.` : '.'), 'stale');
      return { status: 'failed', error: { code: err.code, message: err.message } };
    }
    showTableFresh();
    page.lastGood = page.results;
    const size = contour.shape === 'circle' ? contour.radius : contourSize(contour);
    const found = { items: itemsOf(resp, 1e-12 * size), base, contour };
    if (await breathe()) return superseded;
    page.found = found;
    const n = found.items.length;
    progress.found = `${n} point${n === 1 ? '' : 's'} found`;
    progress.count = n;
    const inPieces = resp.pieces ? `; searched in ${resp.pieces.total} overlapping pieces, merged` : '';
    ui.findStatus.textContent = n ? `Found ${n} point${n === 1 ? '' : 's'} in the region` +
      (resp.method === 'rational' ? ' (f is rational: partial fractions, poles as polynomial roots)' : resp.method === 'numerical' ? ' (numerical search)' : '') +
      inPieces + '. Choose a row or marker for its principal part.' : `Search finished: nothing in the region${inPieces}.`;
    await fillTable(ui.tbody, found.items, pick);
    if (hooks.tableFilled) hooks.tableFilled();
    if (await breathe()) return superseded;
    plot().markers = found.items;
    plot().selected = -1;
    plot().draw();
    ui.canvas.dataset.markers = String(found.items.length);
    if (await breathe()) return superseded;
    hooks.describePlot();
    ui.detail.box.hidden = true;
    hidePickNote();
    ui.warnings.textContent = '';
    for (const w of Array.isArray(resp.warnings) ? resp.warnings : []) ui.warnings.append(el('li', { text: String(w) }));
    showSums(ui, resp, found.items);
    if (await breathe()) return superseded;
    performance.mark('residuary-table-end');
    // A transfer-function reading, only for s or z, and said to be a reading.
    const reading = stabilityReading(base.var, found.items, contour, resp.method);
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
    prepareInverse(page, base, resp.method === 'rational');
    // The contour integral three ways, then the argument-principle count (still cancellable by Stop).
    contourStatus(ui.ci, 'Computing the contour integral three ways…', 'busy');
    stage('integral', 'Computing the contour integral three ways:');
    const ci = await requestContourIntegral(base, contour);
    if (serial !== page.searchSerial) return superseded;
    page.results.contour_integral = ci;
    showContourIntegral(ui.ci, base.var, contour, state.region.mode === 'view', ci, hooks.sign ? hooks.sign() : 1);
    stage('count', 'Counting zeros minus poles (argument principle):');
    const count = await requestArgumentCount(base, contour);
    if (serial !== page.searchSerial) return superseded;
    page.results.argument_count = count;
    showArgumentCount(ui.ci, count);
    // Then the inverse transform (s or z), when its section is open; Stop still cancels it.
    if (!ui.inv.box.hidden && ui.inv.box.open) {
      stage('inverse', 'Computing the inverse transform:');
      await runInverse(page, base);
      if (serial !== page.searchSerial) return superseded;
    }
    // Then the transfer-function reading (rational f in s or z), when its section is open.
    await prepareTransfer(page, base);
    if (serial !== page.searchSerial) return superseded;
    if (transferOpen(page)) {
      stage('transfer', 'Computing the frequency response:');
      await runTransfer(page, base);
      if (serial !== page.searchSerial) return superseded;
    }
    ui.find.disabled = false;
    ui.cancel.disabled = true;
    endProgress();
    // Partial fractions, shown only when f is rational (the task answers).
    const pf = await runHeavy(Object.assign({}, base, { task: 'partial_fractions' }));
    if (serial !== page.searchSerial) return superseded;
    page.results.partial_fractions = pf;
    const pfErr = responseError(pf);
    ui.partial.hidden = Boolean(pfErr) || typeof pf.text !== 'string';
    ui.pfWarnings.textContent = '';
    if (!ui.partial.hidden) {
      // typeset from the response's terms (mathml.js), with its LaTeX (latex.js) and the core's text kept
      ui.partial.textContent = '';
      const math = partialFractionsMathML(base.var, pf);
      ui.partial.append(el('span', { class: 'pf-label', text: 'Partial fractions:' }), math,
        el('code', { class: 'pf-plain', text: pf.text }), latexButton(math, 'the partial fractions'));
      for (const w of Array.isArray(pf.warnings) ? pf.warnings : []) ui.pfWarnings.append(el('li', { text: 'Partial fractions: ' + String(w) }));
    }
    // Then the Laurent section and the kind of infinity (laurent-panel.js).
    if (hooks.searched) {
      await hooks.searched(serial);
      if (serial !== page.searchSerial) return superseded;
    }
    return { status: 'done' };
  }

  /** Stop pressed: whatever is computing is dropped and the heavy worker restarted. Every
   *  status that was waiting says it was stopped; what is still shown from before is stale. */
  async function stop() {
    const running = progress.timer !== 0;
    const during = progress.stage.replace(/:$/, '');
    page.searchSerial++;
    const took = endProgress();
    ui.cancel.disabled = true;
    ui.find.disabled = false;
    ui.findStatus.className = 'find-status';
    ui.findStatus.textContent = running ? `Search stopped after ${secondsText(took)} (stage: ${during.charAt(0).toLowerCase() + during.slice(1)}).` : 'Search stopped.';
    const ciState = ui.ci.box.dataset.state;
    if (ciState !== 'none' && ciState !== 'done' && ciState !== 'error') {
      const old = !ui.ci.result.hidden && page.found && page.found.base;
      contourStatus(ui.ci, 'Stopped before the contour integral was computed' + (old ? `; the integral below is for ${functionWords(page.found.base)}.` : '.'), 'stale');
      ui.ci.box.dataset.state = 'stopped';
    }
    if (!page.results || !page.results.singularities || responseError(page.results.singularities)) {
      showTableStale('the search for the current f was stopped');
      if (plot().markers.length) { plot().markers = []; plot().selected = -1; plot().draw(); ui.canvas.dataset.markers = '0'; }
    }
    stopInverse(page);
    stopTransfer(page);
    await cancelHeavy();
  }

  /** Under the plot: the point chosen, its order and residue, and a way to its detail. */
  function showPickNote(variable, item) {
    const note = $('pick-note');
    if (!note) return;
    note.textContent = '';
    const kind = KIND_WORDS[item.kind];
    const facts = [item.order > 0 ? `order ${item.order}` : '', isFinitePair(item.residue) ? `residue ${fmtSig(item.residue, 10)}` : ''].filter(Boolean).join(', ');
    note.append(`Chosen: ${kind} at ${variable} = ${fmtSig(item.at, 10, item.floor)}` + (facts ? ` (${facts})` : '') + '. ',
      el('button', { type: 'button', class: 'small', id: 'pick-go', text: 'Go to its Laurent series', onclick: () => ui.detail.box.scrollIntoView({ block: 'start' }) }));
    note.hidden = false;
  }
  function hidePickNote() {
    const note = $('pick-note');
    if (note) { note.hidden = true; note.textContent = ''; }
  }

  /** A row or marker chosen: its principal part and Laurent coefficients. */
  async function pick(index) {
    const found = page.found;
    // A stale table is inert: its rows belong to another f (or to a search that did not finish).
    if (ui.singTable.classList.contains('stale')) return;
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
    showPickNote(found.base.var, item);
    // Scroll to the detail only where it sits beside the plot (three columns, the plot held in
    // place): in one or two columns the plot stays where it is and the note under it offers a
    // way to the detail.
    const r = ui.detail.box.getBoundingClientRect();
    const p = ui.canvas.getBoundingClientRect();
    const beside = r.left >= p.right - 1 || r.right <= p.left + 1;
    const column = ui.detail.box.closest('.results');
    const ownScroll = column && getComputedStyle(column).overflowY === 'auto' && column.scrollHeight > column.clientHeight + 1;
    if (beside && ownScroll) {
      // the results column scrolls by itself beside the plot: bring the detail up in it, the page stays
      const c = column.getBoundingClientRect();
      if (r.top < c.top || r.top > c.bottom - 40) column.scrollTop += r.top - c.top - 8;
    } else if (beside && (r.top > window.innerHeight || r.bottom < 0)) ui.detail.box.scrollIntoView({ block: 'nearest' });
  }

  return {
    find, stop, pick, markStale, regionMoved, settled,
    /** Search after a pause, when automatic search is on. */
    autoSearchSoon() { if (state.autoFind) autoSearch(); },
  };
}

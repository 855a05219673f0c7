// The page's scripting interface, window.residuary (docs/scripting.md): set(state) applies a
// state and resolves when every shown panel has computed for it; state() reads the state back;
// results() gives what each panel computed, as the core's JSON contract responses. The state
// uses the contract's field names (f, var, params, region, contour, t, n) plus the page's own
// (view, panels and the display options); links and stored states keep the page's own shape.
import { Engine, runNow, responseError, yieldToBrowser } from './engine.js';
import { paramsForRequest, functionInput } from './params.js';
import { sanitize, saveState } from './state.js';
import { regionProblem } from './region.js';
import { askInverse, currentInverseSpan } from './inverse.js';
import { askTransfer, transferOpen, setTransferPoint, currentTransferPoint } from './transfer.js';

/** A failure of set(): rejects with {code, message} (the contract's codes, plus the page's). */
function scriptError(code, message) {
  return { code, message };
}

const isNum = (x) => typeof x === 'number' && Number.isFinite(x);
const isPair = (p) => Array.isArray(p) && p.length === 2 && p.every(isNum);

/** Contract params ({name: number | [re, im]}) as the page's parameter rows. */
function paramRows(params) {
  if (Array.isArray(params)) return params; // the page's own rows, as in a link
  return Object.entries(params).map(([name, v]) => {
    if (isNum(v)) return { name, value: String(v), lo: null, hi: null };
    if (isPair(v)) return { name, value: v[1] === 0 ? String(v[0]) : `${v[0]}${v[1] < 0 ? '-' : '+'}${Math.abs(v[1])}i`, lo: null, hi: null };
    throw scriptError('bad_request', `params.${name} must be a number or [re, im]`);
  });
}

/** A contract contour (or "view") as the page's region, merged into `region`. */
function regionFrom(value, region) {
  if (value === 'view') return Object.assign({}, region, { mode: 'view' });
  if (value && value.shape === 'rectangle' && Array.isArray(value.corners) && value.corners.length === 2 && value.corners.every(isPair)) {
    const [[a, b], [c, d]] = value.corners;
    return Object.assign({}, region, { mode: 'rect', rect: [Math.min(a, c), Math.max(a, c), Math.min(b, d), Math.max(b, d)] });
  }
  if (value && value.shape === 'circle' && isPair(value.center) && isNum(value.radius)) {
    return Object.assign({}, region, { mode: 'circle', circle: [value.center[0], value.center[1], value.radius] });
  }
  throw scriptError('bad_request', 'region must be "view", {"shape": "rectangle", "corners": [[x0, y0], [x1, y1]]} or {"shape": "circle", "center": [x, y], "radius": r}');
}

const KNOWN = ['f', 'var', 'params', 'view', 'region', 'contour', 't', 'n', 'panels', 'modulus', 'phase', 'infinity', 'wheel', 'symbols', 'autoFind',
  'hz', 'sample_period', 'point'];

/** The transfer section's controls from the page state: the unit (#tf-unit), the sampling period
 *  (#tf-period) and the encirclement point (transfer.js's setTransferPoint). */
export function applyTransferState(page) {
  const { state, ui } = page;
  ui.tf.unit.value = state.hz ? 'Hz' : 'rad/s';
  ui.tf.period.value = String(state.sample_period);
  setTransferPoint(state.point.slice());
}

/** The encirclement point in use: transfer.js's (a click on its chart may have moved it), else the state's. */
function transferPoint(state) {
  const p = currentTransferPoint();
  return isPair(p) ? p.slice() : state.point.slice();
}

/** The page state after `partial` (checked field by field; throws {code, message}). */
function nextPageState(current, partial) {
  if (!partial || typeof partial !== 'object' || Array.isArray(partial)) throw scriptError('bad_request', 'set() takes an object');
  for (const k of Object.keys(partial)) if (!KNOWN.includes(k)) throw scriptError('bad_request', `unknown field "${k}" (known: ${KNOWN.join(', ')})`);
  const next = JSON.parse(JSON.stringify(current));
  if ('f' in partial) { if (typeof partial.f !== 'string') throw scriptError('bad_request', 'f must be a string'); next.f = partial.f; }
  if ('var' in partial) { if (typeof partial.var !== 'string') throw scriptError('bad_request', 'var must be a string'); next.var = partial.var; }
  if ('params' in partial) {
    if (!partial.params || typeof partial.params !== 'object') throw scriptError('bad_request', 'params must be an object {name: number | [re, im]}');
    next.params = paramRows(partial.params);
  }
  if ('view' in partial) {
    const v = partial.view;
    if (!(Array.isArray(v) && v.length === 4 && v.every(isNum) && v[1] > v[0] && v[3] > v[2])) throw scriptError('invalid_field', 'view must be [x0, x1, y0, y1] with x0 < x1 and y0 < y1');
    next.view = v.slice();
  }
  const region = 'region' in partial ? partial.region : partial.contour;
  if (region !== undefined) next.region = regionFrom(region, next.region);
  for (const k of ['modulus', 'phase', 'infinity', 'autoFind']) {
    if (k in partial) { if (typeof partial[k] !== 'boolean') throw scriptError('bad_request', `${k} must be true or false`); next[k] = partial[k]; }
  }
  if ('symbols' in partial) { if (!['own', 'diagram'].includes(partial.symbols)) throw scriptError('invalid_field', 'symbols must be "own" or "diagram"'); next.symbols = partial.symbols; }
  if ('hz' in partial) { if (typeof partial.hz !== 'boolean') throw scriptError('bad_request', 'hz must be true or false'); next.hz = partial.hz; }
  if ('sample_period' in partial) {
    const T = partial.sample_period;
    if (!isNum(T)) throw scriptError('bad_request', 'sample_period must be a number');
    if (!(T > 0)) throw scriptError('invalid_field', 'sample_period must be T > 0');
    if ((next.var.trim() || 'z') !== 'z') throw scriptError('invalid_field', 'sample_period is for var z only (a discrete-time F(z))');
    next.sample_period = T;
  }
  if ('point' in partial) {
    const p = partial.point;
    if (isNum(p)) next.point = [p, 0];
    else if (isPair(p)) next.point = p.slice();
    else throw scriptError('bad_request', 'point must be a number or [re, im]');
  }
  if ('wheel' in partial) { if (!['oklch', 'hsv'].includes(partial.wheel)) throw scriptError('invalid_field', 'wheel must be "oklch" or "hsv"'); next.wheel = partial.wheel; }
  return sanitize(next);
}

/** Install window.residuary. `hooks`: started (a promise: the core has loaded), adopt(state)
 *  (take over a whole page state), checkNow() (check f at once; true when it can be used),
 *  fit() (fit the view to a rational f's poles and zeros; resolves true when it did),
 *  contour() (the region's contour), pipeline (find, settled). */
export function installScripting(page, hooks) {
  const { state, ui } = page;
  // The unit and the sampling period typed into the section are kept with the page state.
  ui.tf.unit.addEventListener('change', () => { state.hz = ui.tf.unit.value === 'Hz'; saveState(state); });
  ui.tf.period.addEventListener('change', () => {
    const T = Number(ui.tf.period.value);
    if (Number.isFinite(T) && T > 0) { state.sample_period = T; saveState(state); }
  });

  // A point picked in the section (a click on its polar plot, or its reset) is kept too:
  // transfer.js announces it with a `transfer-point` event (detail [re, im]).
  ui.tf.box.addEventListener('transfer-point', (ev) => {
    const p = ev.detail;
    if (isPair(p)) { state.point = p.slice(); saveState(state); }
  });

  function currentState() {
    const v = state.var.trim() || 'z';
    const r = state.region;
    const out = {
      f: state.f,
      var: v,
      params: paramsForRequest(state.params).params,
      view: state.view.slice(),
      region: r.mode === 'view' ? 'view'
        : r.mode === 'rect' ? { shape: 'rectangle', corners: [[r.rect[0], r.rect[2]], [r.rect[1], r.rect[3]]] }
          : { shape: 'circle', center: [r.circle[0], r.circle[1]], radius: r.circle[2] },
      contour: hooks.contour(),
      panels: { inverse: !ui.inv.box.hidden && ui.inv.box.open, transfer: transferOpen(page) },
      modulus: state.modulus, phase: state.phase, infinity: state.infinity, wheel: state.wheel, symbols: state.symbols, autoFind: state.autoFind,
      hz: state.hz, point: transferPoint(state),
    };
    const res = page.results;
    if (res && res.contour && !ui.singTable.classList.contains('stale')) out.contour = res.contour; // as searched (a nudge moves it)
    const span = currentInverseSpan(page, v);
    if (v === 's') out.t = span;
    if (v === 'z') { out.n = span; out.sample_period = state.sample_period; }
    return out;
  }

  /** The function input a result was computed for, in the contract's shape. */
  /** A deep copy of a response (plain JSON data): structuredClone where there is one (quicker
   *  for answers with thousands of points), else through JSON. */
  const copy = (x) => (typeof structuredClone === 'function' ? structuredClone(x) : JSON.parse(JSON.stringify(x)));
  const forWhat = (base) => (base ? JSON.parse(JSON.stringify({ f: base.f, var: base.var, params: base.params || {} })) : null);

  /** What results() holds, as [key, response, added fields] (the responses not yet copied). */
  function resultsPlan() {
    const res = page.results;
    if (!res) return [];
    const stale = ui.singTable.classList.contains('stale') || res.serial !== page.searchSerial;
    const plan = [];
    const entry = (key, resp, extra = {}) => { if (resp) plan.push([key, resp, Object.assign({ stale }, extra)]); };
    // The table shown: this run's search, or, while it runs or after it failed or was stopped,
    // the last search that finished (dimmed and inert on the page), stale and naming its f.
    const good = page.lastGood;
    const searchFailed = !res.singularities || responseError(res.singularities);
    const older = searchFailed && good && good !== res;
    if (older && good.singularities) {
      plan.push(['singularities', good.singularities, { stale: true, region: good.contour, nudge: good.nudge || null,
        computed_for: forWhat(good.base), search_error: res.singularities ? responseError(res.singularities) : null }]);
    } else entry('singularities', res.singularities, { region: res.contour, nudge: res.nudge || null, computed_for: forWhat(res.base) });
    for (const key of ['contour_integral', 'argument_count']) {
      if (res[key]) entry(key, res[key], { contour: res.contour, computed_for: forWhat(res.base) });
      else if (older && good[key]) plan.push([key, good[key], { stale: true, contour: good.contour, computed_for: forWhat(good.base) }]);
    }
    if (res.inverse && res.inverseRequest && !ui.inv.box.hidden && ui.inv.box.open) {
      const key = res.inverseRequest.task;
      entry(key, res.inverse, key === 'inverse_laplace' ? { t: res.inverseRequest.t } : { n: res.inverseRequest.n });
    }
    if (res.transfer_function && transferOpen(page)) entry('transfer_function', res.transfer_function);
    entry('partial_fractions', res.partial_fractions);
    return plan;
  }

  function currentResults() {
    const out = {};
    for (const [key, resp, extra] of resultsPlan()) out[key] = Object.assign({}, copy(resp), extra);
    return out;
  }

  /** The same as results(), one entry per task, so that copying large answers never holds up the page. */
  async function currentResultsInSteps() {
    const out = {};
    for (const [key, resp, extra] of resultsPlan()) {
      await yieldToBrowser();
      out[key] = Object.assign({}, copy(resp), extra);
    }
    return out;
  }

  async function set(partial) {
    await hooks.started;
    if (!Engine.ready) throw scriptError('not_ready', Engine.message || 'the computing core could not start');
    const next = nextPageState(state, partial || {});
    const v = next.var.trim() || 'z';
    const span = v === 's' ? partial.t : v === 'z' ? partial.n : undefined;
    if (span !== undefined && !(isNum(span) && span > 0)) throw scriptError('invalid_field', v === 's' ? 't must be T > 0 (the page samples t = T/120 … T)' : 'n must be N > 0 (the page computes n = 0 … N)');
    const panels = partial.panels;
    if (panels !== undefined && (!panels || typeof panels !== 'object' || Object.keys(panels).some((k) => !['inverse', 'transfer'].includes(k)) ||
      ['inverse', 'transfer'].some((k) => panels[k] !== undefined && typeof panels[k] !== 'boolean'))) throw scriptError('bad_request', 'panels must be {inverse: true | false, transfer: true | false}');
    hooks.adopt(next);
    askInverse(page, v, span, panels ? panels.inverse : null);
    askTransfer(panels ? panels.transfer : null);
    if (!hooks.checkNow()) {
      const { problems } = paramsForRequest(state.params);
      const resp = runNow(Object.assign(functionInput(state), { task: 'evaluate', at: [[0.31, 0.17]] }));
      const err = responseError(resp);
      if (err) throw scriptError(err.code, err.message);
      if (state.f.trim() === '') throw scriptError('expression', 'f is empty');
      throw scriptError('invalid_field', problems[0] || 'the function cannot be used');
    }
    const problem = regionProblem(hooks.contour());
    if (problem) throw scriptError('invalid_field', 'region: ' + problem);
    const newFunction = ['f', 'var', 'params'].some((k) => k in partial);
    if (newFunction && !('view' in partial) && !next.infinity) await hooks.fit();
    const outcome = await hooks.pipeline.find();
    if (outcome.status === 'failed') throw scriptError(outcome.error.code, outcome.error.message);
    if (outcome.status === 'superseded') throw scriptError('cancelled', 'a newer change or Stop came in before the panels finished');
    return currentResultsInSteps();
  }

  window.residuary = {
    /** Apply `partial` (any of the fields of state()); resolves with results() once every shown
     *  panel has computed for it; rejects with {code, message}. */
    set,
    /** The page's state now, in the shape set() takes. */
    state: currentState,
    /** What each shown panel computed, keyed by task. */
    results: currentResults,
    /** Resolves when whatever is computing now has finished (with results()). */
    settled: async () => { await hooks.started; await hooks.pipeline.settled(); return currentResultsInSteps(); },
  };
}

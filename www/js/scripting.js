// The page's scripting interface, window.residuary (docs/scripting.md): set(state) applies a
// state and resolves when every shown panel has computed for it; state() reads the state back;
// results() gives what each panel computed, as the core's JSON contract responses. The state
// uses the contract's field names (f, var, params, region, contour, t, n) plus the page's own
// (view, panels and the display options); links and stored states keep the page's own shape.
import { Engine, runNow, responseError, yieldToBrowser } from './engine.js';
import { paramsForRequest, functionInput } from './params.js';
import { sanitize, saveState, WHEELS } from './state.js';
import { regionProblem } from './region.js';
import { askInverse, currentInverseSpan } from './inverse.js';
import { askTransfer, transferOpen, setTransferPoint, currentTransferPoint, setTransferDomain } from './transfer.js';
import { INTEGRAL_KINDS } from './real-integral.js';
import { SPLIT_AFTER_MS } from './search-pieces.js';

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

/** A contract contour (or "view") as the page's region, merged into `region`: rectangle, circle,
 *  ellipse ({center, semi_axes, angle}) and polygon ({vertices}, whose order is its direction). */
function regionFrom(value, region) {
  if (value === 'view') return Object.assign({}, region, { mode: 'view' });
  if (value && value.shape === 'rectangle' && Array.isArray(value.corners) && value.corners.length === 2 && value.corners.every(isPair)) {
    const [[a, b], [c, d]] = value.corners;
    return Object.assign({}, region, { mode: 'rect', rect: [Math.min(a, c), Math.max(a, c), Math.min(b, d), Math.max(b, d)] });
  }
  if (value && value.shape === 'circle' && isPair(value.center) && isNum(value.radius)) {
    return Object.assign({}, region, { mode: 'circle', circle: [value.center[0], value.center[1], value.radius] });
  }
  if (value && value.shape === 'ellipse' && isPair(value.center) && isPair(value.semi_axes) && (value.angle === undefined || isNum(value.angle))) {
    return Object.assign({}, region, { mode: 'ellipse', ellipse: [value.center[0], value.center[1], value.semi_axes[0], value.semi_axes[1], value.angle || 0] });
  }
  if (value && value.shape === 'polygon' && Array.isArray(value.vertices) && value.vertices.length >= 3 && value.vertices.every(isPair)) {
    return Object.assign({}, region, { mode: 'polygon', polygon: value.vertices.map((p) => p.slice()) });
  }
  if (value && value.shape === 'half_disc' && isPair(value.center) && isNum(value.radius) && ['upper', 'lower', 'left', 'right'].includes(value.direction)) {
    return Object.assign({}, region, { mode: 'half_disc', half_disc: [value.center[0], value.center[1], value.radius, value.direction] });
  }
  if (value && value.shape === 'keyhole' && isPair(value.center) && isNum(value.inner) && isNum(value.outer) &&
    (value.angle === undefined || isNum(value.angle)) && (value.gap === undefined || isNum(value.gap))) {
    return Object.assign({}, region, { mode: 'keyhole', keyhole: [value.center[0], value.center[1], value.inner, value.outer, value.angle || 0, value.gap === undefined ? null : value.gap] });
  }
  throw scriptError('bad_request', 'region must be "view", {"shape": "rectangle", "corners": [[x0, y0], [x1, y1]]}, {"shape": "circle", "center": [x, y], "radius": r}, ' +
    '{"shape": "ellipse", "center": [x, y], "semi_axes": [a, b], "angle": t}, {"shape": "polygon", "vertices": [[x, y], …]}, ' +
    '{"shape": "half_disc", "center": [x, y], "radius": r, "direction": "upper" | "lower" | "left" | "right"} or {"shape": "keyhole", "center": [x, y], "inner": r1, "outer": r2, "angle": t, "gap": g}');
}

const KNOWN = ['f', 'var', 'params', 'view', 'region', 'contour', 'reversed', 't', 'n', 'panels', 'modulus', 'phase', 'infinity', 'wheel', 'symbols', 'autoFind',
  'hz', 'sample_period', 'point', 'trails', 'domain', 'mode', 'kind', 'omega', 'alpha', 'laurent', 'image_point', 'complex_format', 'scheme'];

/** The Laurent section's choice (contract names: center, inner, outer, from, to) checked, or null. */
function laurentChoice(x) {
  if (x === null) return null;
  if (!x || typeof x !== 'object' || Array.isArray(x)) throw scriptError('bad_request', 'laurent must be {center, inner, outer, from, to} or null');
  for (const k of Object.keys(x)) if (!['center', 'inner', 'outer', 'from', 'to'].includes(k)) throw scriptError('bad_request', `unknown field "laurent.${k}" (known: center, inner, outer, from, to)`);
  const center = x.center === 'infinity' ? 'infinity' : isNum(x.center) ? [x.center, 0] : isPair(x.center) ? x.center.slice() : null;
  if (!center) throw scriptError('bad_request', 'laurent.center must be [x, y] or "infinity"');
  const inner = x.inner === undefined ? 0 : x.inner;
  const outer = x.outer === undefined ? null : x.outer;
  if (!isNum(inner) || !(outer === null || isNum(outer))) throw scriptError('bad_request', 'laurent.inner must be a number and laurent.outer a number or null');
  if (!(inner >= 0) || (outer !== null && !(outer > inner))) throw scriptError('invalid_field', 'laurent needs 0 ≤ inner < outer');
  const from = x.from === undefined ? -5 : x.from, to = x.to === undefined ? 5 : x.to;
  if (!Number.isInteger(from) || !Number.isInteger(to)) throw scriptError('bad_request', 'laurent.from and laurent.to must be whole numbers');
  if (from > to) throw scriptError('invalid_field', 'laurent.from must be no larger than laurent.to');
  return { center, inner, outer, from, to };
}

/** The transfer section's controls from the page state: the unit (#tf-unit), the sampling period
 *  (#tf-period) and the encirclement point (transfer.js's setTransferPoint). */
export function applyTransferState(page) {
  const { state, ui } = page;
  ui.tf.unit.value = state.hz ? 'Hz' : 'rad/s';
  ui.tf.period.value = String(state.sample_period);
  setTransferPoint(state.point.slice());
  setTransferDomain(state.domain);
  if (ui.varDomain) ui.varDomain.value = state.domain;
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
  if ('reversed' in partial) {
    if (typeof partial.reversed !== 'boolean') throw scriptError('bad_request', 'reversed must be true or false');
    next.region.reversed = partial.reversed;
  }
  for (const k of ['modulus', 'phase', 'infinity', 'autoFind']) {
    if (k in partial) { if (typeof partial[k] !== 'boolean') throw scriptError('bad_request', `${k} must be true or false`); next[k] = partial[k]; }
  }
  if ('complex_format' in partial) {
    if (!['columns', 'j', 'i'].includes(partial.complex_format)) throw scriptError('invalid_field', 'complex_format must be "columns", "j" or "i"');
    next.complex_format = partial.complex_format;
  }
  if ('scheme' in partial) { if (!['light', 'dark', 'system'].includes(partial.scheme)) throw scriptError('invalid_field', 'scheme must be "light", "dark" or "system"'); next.scheme = partial.scheme; }
  if ('symbols' in partial) { if (!['own', 'diagram'].includes(partial.symbols)) throw scriptError('invalid_field', 'symbols must be "own" or "diagram"'); next.symbols = partial.symbols; }
  if ('hz' in partial) { if (typeof partial.hz !== 'boolean') throw scriptError('bad_request', 'hz must be true or false'); next.hz = partial.hz; }
  if ('sample_period' in partial) {
    const T = partial.sample_period;
    if (!isNum(T)) throw scriptError('bad_request', 'sample_period must be a number');
    if (!(T > 0)) throw scriptError('invalid_field', 'sample_period must be T > 0');
    const d = 'domain' in partial ? (partial.domain === null ? 'none' : partial.domain) : next.domain;
    const discrete = d === 'z' || (d === 'auto' && (next.var.trim() || 'z') === 'z');
    if (!discrete) throw scriptError('invalid_field', 'sample_period is for a discrete-time F: var z, or domain "z"');
    next.sample_period = T;
  }
  if ('point' in partial) {
    const p = partial.point;
    if (isNum(p)) next.point = [p, 0];
    else if (isPair(p)) next.point = p.slice();
    else throw scriptError('bad_request', 'point must be a number or [re, im]');
  }
  // The real-integral block (real-integral.js): the contract's kind, omega, alpha; giving kind opens it.
  if ('kind' in partial) {
    if (!INTEGRAL_KINDS.includes(partial.kind)) throw scriptError('invalid_field', `kind must be one of ${INTEGRAL_KINDS.join(', ')}`);
    next.integral.kind = partial.kind;
    next.integral.open = true;
  }
  if ('omega' in partial) { if (!isNum(partial.omega)) throw scriptError('bad_request', 'omega must be a real number'); next.integral.omega = partial.omega; }
  if ('alpha' in partial) {
    const a = partial.alpha;
    if (!(isNum(a) || isPair(a))) throw scriptError('bad_request', 'alpha must be a number or [re, im]');
    next.integral.alpha = isPair(a) && a[1] === 0 ? a[0] : a;
  }
  if (partial.panels && typeof partial.panels.integral === 'boolean') next.integral.open = partial.panels.integral;
  if ('laurent' in partial) next.laurent = laurentChoice(partial.laurent);
  if ('wheel' in partial) { if (!WHEELS.includes(partial.wheel)) throw scriptError('invalid_field', `wheel must be one of ${WHEELS.map((w) => `"${w}"`).join(', ')}`); next.wheel = partial.wheel; }
  if ('trails' in partial) next.trails = trailsFrom(partial.trails);
  if ('domain' in partial) {
    const d = partial.domain === null ? 'none' : partial.domain;
    if (!['auto', 's', 'z', 'none'].includes(d)) throw scriptError('invalid_field', 'domain must be "s", "z", "auto" (by the variable\'s name) or null (not read as a transfer function)');
    next.domain = d;
  }
  if ('mode' in partial && !['transfer_function', 'function'].includes(partial.mode)) throw scriptError('invalid_field', 'mode must be "transfer_function" or "function"');
  return sanitize(next);
}

/** set()'s `trails`: null (none), or {name, from, to, steps (default 41), shown (default true)}. */
function trailsFrom(t) {
  if (t === null) return null;
  if (!t || typeof t !== 'object' || Array.isArray(t)) throw scriptError('bad_request', 'trails must be null or {name, from, to, steps, shown}');
  for (const k of Object.keys(t)) if (!['name', 'from', 'to', 'steps', 'shown'].includes(k)) throw scriptError('bad_request', `unknown field "trails.${k}" (known: name, from, to, steps, shown)`);
  if (typeof t.name !== 'string' || !t.name.trim()) throw scriptError('bad_request', 'trails.name must name a parameter');
  if (!isNum(t.from) || !isNum(t.to) || t.from === t.to) throw scriptError('invalid_field', 'trails.from and trails.to must be two different numbers');
  const steps = t.steps === undefined ? 41 : t.steps;
  if (!(Number.isInteger(steps) && steps >= 2 && steps <= 400)) throw scriptError('invalid_field', 'trails.steps must be a whole number from 2 to 400');
  if (t.shown !== undefined && typeof t.shown !== 'boolean') throw scriptError('bad_request', 'trails.shown must be true or false');
  return { name: t.name.trim(), from: t.from, to: t.to, steps, shown: t.shown !== false };
}

/** Install window.residuary. `hooks`: started (a promise: the core has loaded), adopt(state)
 *  (take over a whole page state), checkNow() (check f at once; true when it can be used),
 *  fit() (fit the view to a rational f's poles and zeros; resolves true when it did),
 *  contour() (the region's contour), pipeline (find, settled), imageCurve (image-curve.js). */
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
      region: r.mode === 'view' ? 'view' : hooks.contour(),
      contour: hooks.contour(),
      reversed: Boolean(r.reversed) && r.mode !== 'polygon',
      panels: { inverse: !ui.inv.box.hidden && ui.inv.box.open, transfer: transferOpen(page), integral: hooks.integral.open(), laurent: page.laurent.isOpen(), image: hooks.imageCurve.open() },
      kind: state.integral.kind, omega: state.integral.omega, alpha: state.integral.alpha,
      laurent: state.laurent ? JSON.parse(JSON.stringify(state.laurent)) : null,
      image_point: hooks.imageCurve.point(),
      modulus: state.modulus, phase: state.phase, infinity: state.infinity, wheel: state.wheel, symbols: state.symbols, autoFind: state.autoFind,
      modulus: state.modulus, phase: state.phase, infinity: state.infinity, wheel: state.wheel, symbols: state.symbols, scheme: state.scheme, autoFind: state.autoFind,
      complex_format: state.complex_format,
      hz: state.hz, point: transferPoint(state),
      domain: state.domain === 'none' ? null : state.domain,
      mode: !ui.tf.box.hidden ? 'transfer_function' : 'function',
      trails: state.trails ? { name: state.trails.name, from: state.trails.from, to: state.trails.to, steps: state.trails.steps, shown: state.trails.shown } : null,
    };
    const res = page.results;
    if (res && res.contour && !ui.singTable.classList.contains('stale')) out.contour = res.contour; // as searched (a nudge moves it)
    const span = currentInverseSpan(page, v);
    if (v === 's') out.t = span;
    if (v === 'z') out.n = span;
    if (state.domain === 'z' || (state.domain === 'auto' && v === 'z')) out.sample_period = state.sample_period;
    return out;
  }

  /** results().real_integral: the block's response (the contract's, or its {error}) with its request and stale. */
  function addIntegral(out) {
    const r = hooks.integral.result();
    if (r) out.real_integral = Object.assign(JSON.parse(JSON.stringify(r.response)), { request: r.request, stale: r.stale });
    return out;
  }

  /** A deep copy of a response (plain JSON data): structuredClone where there is one (quicker
   *  for answers with thousands of points), else through JSON. */
  const copy = (x) => (typeof structuredClone === 'function' ? structuredClone(x) : JSON.parse(JSON.stringify(x)));
  /** The function input a result was computed for, in the contract's shape. */
  const forWhat = (base) => (base ? JSON.parse(JSON.stringify({ f: base.f, var: base.var, params: base.params || {} })) : null);

  /** What results() holds from the search's run, as [key, response, added fields] (the responses
   *  not yet copied). */
  function resultsPlan() {
    const res = page.results || (page.liveContour ? {} : null);
    if (!res) return [];
    const stale = ui.singTable.classList.contains('stale') || res.serial !== page.searchSerial;
    const plan = [];
    const entry = (key, resp, extra = {}) => { if (resp) plan.push([key, resp, Object.assign({ stale }, extra)]); };
    // The table shown: this run's search, or, while it runs or after it failed or was stopped,
    // the last search that finished (dimmed and inert on the page), stale and naming its f.
    const good = page.lastGood;
    const searchFailed = !res.singularities || responseError(res.singularities);
    const older = searchFailed && good && good !== res;
    // the table's winding column: each point shown and how often the page's contour winds round it
    const windings = hooks.windings ? { windings: hooks.windings() } : {};
    if (older && good.singularities) {
      plan.push(['singularities', good.singularities, Object.assign({ stale: true, region: good.contour, nudge: good.nudge || null,
        computed_for: forWhat(good.base), search_error: res.singularities ? responseError(res.singularities) : null }, windings)]);
    } else entry('singularities', res.singularities, Object.assign({ region: res.contour, nudge: res.nudge || null, computed_for: forWhat(res.base) }, windings));
    for (const key of ['contour_integral', 'argument_count']) {
      // orientation −1: the page takes the contour clockwise (reversed) and the integral along it is −1 × value
      const orient = key === 'contour_integral' ? { orientation: res.sign || 1 } : {};
      if (res[key]) entry(key, res[key], Object.assign({ contour: res.contour, computed_for: forWhat(res.base) }, orient));
      else if (older && good[key]) plan.push([key, good[key], Object.assign({ stale: true, contour: good.contour, computed_for: forWhat(good.base) }, orient)]);
    }
    // while a contour is being dragged: the last live answers, for the contour they were computed on
    const lc = page.liveContour;
    if (lc && lc.contour_integral) {
      plan.push(['contour_live', { contour: lc.contour, orientation: lc.sign, contour_integral: lc.contour_integral,
        argument_count: lc.argument_count || null }, {}]);
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
    return addPanels(out);
  }

  /** The panels outside the search's run: pole trails, the real integral, the Laurent section and
   *  the image curve (each knows what it was computed for). */
  function addPanels(out) {
    const res = page.results;
    const stale = !res || ui.singTable.classList.contains('stale') || res.serial !== page.searchSerial;
    if (state.trails && page.trailsResult) out.pole_trails = Object.assign({}, copy(page.trailsResult), { stale });
    addIntegral(out);
    const lp = page.laurent.results(stale);
    if (lp) out.laurent = lp;
    const image = hooks.imageCurve.result(); // computed for the state as it is now: never stale
    if (image) out.image_curve = image;
    return out;
  }

  /** The same as results(), one entry per task, so that copying large answers never holds up the page. */
  async function currentResultsInSteps() {
    const out = {};
    for (const [key, resp, extra] of resultsPlan()) {
      await yieldToBrowser();
      out[key] = Object.assign({}, copy(resp), extra);
    }
    addPanels(out);
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
    if (panels !== undefined && (!panels || typeof panels !== 'object' || Object.keys(panels).some((k) => !['inverse', 'transfer', 'integral', 'laurent', 'image'].includes(k)) ||
      ['inverse', 'transfer', 'integral', 'laurent', 'image'].some((k) => panels[k] !== undefined && typeof panels[k] !== 'boolean'))) throw scriptError('bad_request', 'panels must be {inverse: true | false, transfer: true | false, integral: true | false, laurent: true | false, image: true | false}');
    if (partial.image_point !== undefined && !isPair(partial.image_point)) throw scriptError('invalid_field', 'image_point must be [re, im]');
    hooks.adopt(next);
    if (panels && panels.laurent !== undefined) page.laurent.setOpen(panels.laurent);
    if ('laurent' in partial) page.laurent.setExplicit();
    askInverse(page, v, span, panels ? panels.inverse : null);
    // mode "transfer_function" opens the frequency-response section, "function" folds it (panels.transfer wins)
    const modeOpen = partial.mode === 'transfer_function' ? true : partial.mode === 'function' ? false : null;
    askTransfer(panels && typeof panels.transfer === 'boolean' ? panels.transfer : modeOpen);
    if (partial.image_point !== undefined) hooks.imageCurve.setPoint(partial.image_point);
    if (panels && panels.image !== undefined) hooks.imageCurve.setOpen(panels.image);
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
    const integralDone = hooks.integral.ensure();
    const newFunction = ['f', 'var', 'params'].some((k) => k in partial);
    if (newFunction && !('view' in partial) && !next.infinity) await hooks.fit();
    const outcome = await hooks.pipeline.find();
    if (outcome.status === 'failed') throw scriptError(outcome.error.code, outcome.error.message);
    if (outcome.status === 'superseded') throw scriptError('cancelled', 'a newer change or Stop came in before the panels finished');
    await integralDone;
    await hooks.integral.ensure();
    // the trails: computed after the search (a refresh already under way may supersede one call)
    if (state.trails && state.trails.shown) {
      await hooks.trails();
      for (let i = 0; i < 3 && !page.trailsResult; i++) await hooks.trails();
    }
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
    settled: async () => { await hooks.started; await hooks.pipeline.settled(); await hooks.integral.ensure(); return currentResultsInSteps(); },
    /** The page's tuning: {search_split_after_ms} (ms before a long search of a rectangle is run
     *  again in pieces with a running count; null: never). Sets the fields given, returns them all. */
    options(o = {}) {
      if (o && 'search_split_after_ms' in o) {
        const v = o.search_split_after_ms;
        if (v !== null && !(typeof v === 'number' && v >= 0)) throw scriptError('invalid_field', 'search_split_after_ms must be a number of milliseconds ≥ 0, or null (never split)');
        page.searchSplitAfterMs = v === null ? Infinity : v;
      }
      const v = typeof page.searchSplitAfterMs === 'number' ? page.searchSplitAfterMs : SPLIT_AFTER_MS;
      return { search_split_after_ms: v === Infinity ? null : v };
    },
  };
}

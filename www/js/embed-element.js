// <residuary-view>: the embeddable element (docs/embedding.md). One self-contained script,
// dist/residuary-view.js (built by www/tools/build-page.mjs from this entry), defines it; each
// element draws the phase plot of its f and shows the panels it names, in its own shadow root
// (nothing here reads the page's ids). Every element on a page shares ONE engine: the wasm
// module is compiled once and its two workers are started once (engine.js is module-level).
// Attributes: f, var, params ("a=1, b=0.3+0.1i"), view ("x0 x1 y0 y1"), region ("view" or a
// contract contour as JSON), panels ("plot singularities residues integral count fractions"),
// compact (present: the compact layout). Each finished computation dispatches the CustomEvent
// 'residuary-results' (detail: results()); el.residuary is {set, state, results, settled}, the
// shapes of window.residuary (docs/scripting.md) for the fields it has.
import { Engine, startEngine, runHeavy, plotBands, responseError } from './engine.js';
import { MARGIN, setView, viewBox } from './plot/view.js';
import { drawAxes } from './plot/axes.js';
import { drawRegion, drawMarkers } from './plot/overlays.js';
import { KIND_WORDS } from './markers.js';
import { parseComplex } from './params.js';
import { fmtComplex, fmtReal, trimComplex, trimBelow } from './format.js';

/** The panels an element can show, in the order they appear. */
export const EMBED_PANELS = ['plot', 'singularities', 'residues', 'integral', 'count', 'fractions'];
const DEFAULT_PANELS = ['plot', 'singularities', 'residues', 'integral'];
const EMBED_FIELDS = ['f', 'var', 'params', 'view', 'region', 'contour', 'panels', 'compact'];
const ATTRIBUTES = ['f', 'var', 'params', 'view', 'region', 'panels', 'compact'];

const isNum = (x) => typeof x === 'number' && Number.isFinite(x);
const isPair = (p) => Array.isArray(p) && p.length === 2 && p.every(isNum);
const embedError = (code, message) => ({ code, message });

/** The one engine of every element on the page: started by the first element, shared after. */
let engineStart = null;
export function sharedEngine() {
  if (!engineStart) engineStart = startEngine();
  return engineStart;
}

/** Did the host page's Content-Security-Policy refuse WebAssembly? The browser reports it as a
 *  securitypolicyviolation whose blockedURI is "wasm-eval" (CSP Level 3, W3C): the element then says
 *  so in its own words, with the line an administrator adds, instead of the browser's message. */
let wasmRefused = false;
if (typeof document !== 'undefined') {
  document.addEventListener('securitypolicyviolation', (ev) => { if (ev.blockedURI === 'wasm-eval') wasmRefused = true; });
}
const CSP_WORDS = 'The computing core cannot start here: this page\'s Content-Security-Policy does not allow WebAssembly. ' +
  'An administrator can allow it by adding \'wasm-unsafe-eval\' to script-src (and blob: to worker-src) in the policy of this page (docs/embedding.md).';

/** One picture at a time through the shared plot worker: engine.js keeps a single plot job (a
 *  newer call drops the older), so the elements queue theirs. */
let plotChain = Promise.resolve();
function queuedPlot(request, onBand) {
  const job = plotChain.then(() => plotBands(request, [null], onBand));
  plotChain = job.then(() => {}, () => {});
  return job;
}

/** "a=1, b=0.3+0.1i" (commas or semicolons) as the contract's params; throws {code, message}. */
export function parseParamsText(text) {
  const params = {};
  for (const part of String(text || '').split(/[,;]/)) {
    if (!part.trim()) continue;
    const m = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*=\s*(.+?)\s*$/.exec(part);
    const v = m ? parseComplex(m[2]) : null;
    if (!m || !v) throw embedError('invalid_field', `params: "${part.trim()}" is not name=value (e.g. a=1, b=0.3+0.1i)`);
    params[m[1]] = v[1] === 0 ? v[0] : v;
  }
  return params;
}

/** The contract's params as attribute text ("a=1, b=0.3+0.1i"). */
export function paramsText(params) {
  return Object.entries(params || {}).map(([k, v]) => {
    if (isNum(v)) return `${k}=${v}`;
    return `${k}=${v[0]}${v[1] < 0 ? '-' : '+'}${Math.abs(v[1])}i`;
  }).join(', ');
}

function parseView(text) {
  const v = String(text).trim().startsWith('[') ? JSON.parse(text) : String(text).trim().split(/[\s,]+/).map(Number);
  if (!(Array.isArray(v) && v.length === 4 && v.every(isNum) && v[1] > v[0] && v[3] > v[2])) {
    throw embedError('invalid_field', 'view must be "x0 x1 y0 y1" with x0 < x1 and y0 < y1');
  }
  return v;
}

/** A contract contour checked for its shape's fields, or "view". */
function checkRegion(r) {
  if (r === 'view') return 'view';
  const ok = r && typeof r === 'object' && (
    (r.shape === 'rectangle' && Array.isArray(r.corners) && r.corners.length === 2 && r.corners.every(isPair)) ||
    (r.shape === 'circle' && isPair(r.center) && isNum(r.radius) && r.radius > 0) ||
    (r.shape === 'ellipse' && isPair(r.center) && isPair(r.semi_axes)) ||
    (r.shape === 'polygon' && Array.isArray(r.vertices) && r.vertices.length >= 3 && r.vertices.every(isPair)) ||
    (r.shape === 'half_disc' && isPair(r.center) && isNum(r.radius)) ||
    (r.shape === 'keyhole' && isPair(r.center) && isNum(r.inner) && isNum(r.outer)));
  if (!ok) throw embedError('invalid_field', 'region must be "view" or a contract contour, e.g. {"shape": "circle", "center": [0, 0], "radius": 2}');
  return JSON.parse(JSON.stringify(r));
}

function parseRegion(text) {
  const t = String(text).trim();
  if (t === '' || t === 'view') return 'view';
  let r;
  try { r = JSON.parse(t); } catch (e) { throw embedError('invalid_field', 'region must be "view" or a contract contour written as JSON'); }
  return checkRegion(r);
}

function parsePanels(value) {
  const list = Array.isArray(value) ? value : String(value).split(/[\s,]+/).filter(Boolean);
  for (const p of list) if (!EMBED_PANELS.includes(p)) throw embedError('invalid_field', `panels: unknown panel "${p}" (known: ${EMBED_PANELS.join(', ')})`);
  return EMBED_PANELS.filter((p) => list.includes(p));
}

/** The element's state from its attributes; throws {code, message}. */
function stateFromAttributes(host) {
  const a = (n) => host.getAttribute(n);
  return {
    f: a('f') || '',
    var: (a('var') || 'z').trim() || 'z',
    params: parseParamsText(a('params') || ''),
    view: a('view') ? parseView(a('view')) : [-3, 3, -3, 3],
    region: a('region') ? parseRegion(a('region')) : 'view',
    panels: a('panels') !== null ? parsePanels(a('panels')) : DEFAULT_PANELS.slice(),
    compact: host.hasAttribute('compact'),
  };
}

/** A set() argument applied to `state`, as attribute values {name: string | null}; throws {code, message}. */
function attributesFor(partial) {
  if (!partial || typeof partial !== 'object' || Array.isArray(partial)) throw embedError('bad_request', 'set() takes an object');
  for (const k of Object.keys(partial)) if (!EMBED_FIELDS.includes(k)) throw embedError('bad_request', `unknown field "${k}" (known: ${EMBED_FIELDS.join(', ')})`);
  const out = {};
  if ('f' in partial) { if (typeof partial.f !== 'string') throw embedError('bad_request', 'f must be a string'); out.f = partial.f; }
  if ('var' in partial) { if (typeof partial.var !== 'string') throw embedError('bad_request', 'var must be a string'); out.var = partial.var; }
  if ('params' in partial) {
    const p = partial.params;
    if (typeof p === 'string') out.params = paramsText(parseParamsText(p));
    else if (p && typeof p === 'object' && !Array.isArray(p) && Object.values(p).every((v) => isNum(v) || isPair(v))) out.params = paramsText(p);
    else throw embedError('bad_request', 'params must be {name: number | [re, im]} or "a=1, b=2"');
  }
  if ('view' in partial) out.view = parseView(JSON.stringify(partial.view)).join(' ');
  const region = 'region' in partial ? partial.region : partial.contour;
  if (region !== undefined) { const r = checkRegion(region); out.region = r === 'view' ? 'view' : JSON.stringify(r); }
  if ('panels' in partial) out.panels = parsePanels(partial.panels).join(' ');
  if ('compact' in partial) {
    if (typeof partial.compact !== 'boolean') throw embedError('bad_request', 'compact must be true or false');
    out.compact = partial.compact ? '' : null;
  }
  return out;
}

/** The points of a singularities response, as the markers draw them. */
function pointsOf(resp) {
  const list = (x) => (Array.isArray(x) ? x : []);
  const at = (p) => (Array.isArray(p) ? p : p.at);
  const out = [];
  for (const p of list(resp.poles)) out.push({ kind: 'pole', at: p.at, order: p.order, residue: p.residue });
  for (const p of list(resp.zeros)) out.push({ kind: 'zero', at: p.at, order: p.order });
  for (const p of list(resp.essential)) out.push({ kind: 'essential', at: at(p), residue: p.residue });
  for (const p of list(resp.branch_points)) out.push({ kind: 'branch', at: at(p) });
  for (const p of list(resp.removable)) out.push({ kind: 'removable', at: at(p) });
  return out.filter((p) => isPair(p.at));
}

const STYLE = `
:host { display: block; font: 14px/1.4 system-ui, sans-serif; color: #1b1d21; background: #fff; border: 1px solid #d5d8dd; border-radius: 6px; padding: 10px; max-width: 100%; box-sizing: border-box; }
:host([compact]) { padding: 4px; font-size: 12.5px; border-radius: 4px; }
[hidden] { display: none !important; }
.title { margin: 0 0 6px; font-weight: 600; overflow-wrap: anywhere; }
:host([compact]) .title { display: none; }
canvas { display: block; width: 100%; }
.status { margin: 4px 0; color: #555; min-height: 1.2em; }
.status[data-state=error] { color: #a11; }
table { border-collapse: collapse; margin: 6px 0; font-variant-numeric: tabular-nums; }
th, td { text-align: left; padding: 2px 8px 2px 0; border-bottom: 1px solid #e4e6ea; vertical-align: top; }
th { font-weight: 600; }
h3 { font-size: 1em; margin: 8px 0 2px; }
:host([compact]) h3 { margin-top: 4px; }
p { margin: 2px 0; }
ul.note { margin: 2px 0; padding-left: 1.2em; font-size: 0.92em; }
.note { color: #555; }
.foot { margin-top: 6px; color: #666; font-size: 0.85em; }
:host([compact]) .foot { display: none; }
`;

class ResiduaryView extends HTMLElement {
  static get observedAttributes() { return ATTRIBUTES; }

  constructor() {
    super();
    const root = this.attachShadow({ mode: 'open' });
    // a constructed style sheet where the browser has one: a Content-Security-Policy without
    // style-src 'unsafe-inline' does not apply to it (an inline <style> is the fallback)
    let sheet = null;
    try { sheet = new CSSStyleSheet(); sheet.replaceSync(STYLE); root.adoptedStyleSheets = [sheet]; } catch (e) { sheet = null; }
    root.innerHTML = `${sheet ? '' : `<style>${STYLE}</style>`}
      <p class="title" part="title"></p>
      <div class="figure" part="plot"><canvas role="img" aria-label="Phase plot"></canvas></div>
      <p class="status" role="status" aria-live="polite">Starting the computing core…</p>
      <section class="sing" part="singularities" hidden><h3>Singular points and zeros</h3><table><thead></thead><tbody></tbody></table><p class="inf"></p><ul class="sing-warnings note"></ul></section>
      <section class="ci" part="integral" hidden><h3>Contour integral</h3><p class="ci-value"></p><table><thead><tr><th>Way</th><th>Value</th><th>Error estimate</th></tr></thead><tbody></tbody></table><p class="ci-verdict note"></p><ul class="ci-warnings note"></ul></section>
      <section class="count" part="count" hidden><h3>Argument count</h3><p class="count-text"></p></section>
      <section class="pf" part="fractions" hidden><h3>Partial fractions</h3><p class="pf-text"></p></section>
      <p class="foot">Computed in this page by residuary; no network.</p>`;
    const q = (s) => root.querySelector(s);
    this._ui = {
      title: q('.title'), figure: q('.figure'), canvas: q('canvas'), status: q('.status'),
      sing: q('.sing'), singHead: q('.sing thead'), singBody: q('.sing tbody'), inf: q('.inf'), singWarnings: q('.sing-warnings'),
      ci: q('.ci'), ciValue: q('.ci-value'), ciWays: q('.ci tbody'), ciVerdict: q('.ci-verdict'), ciWarnings: q('.ci-warnings'),
      count: q('.count'), countText: q('.count-text'), pf: q('.pf'), pfText: q('.pf-text'),
    };
    this._results = {};
    this._state = null;
    this._serial = 0;
    this._pending = null;     // the run in flight: a promise of its outcome
    this._scheduled = false;
    this._quiet = false;      // set() writes attributes without scheduling a second run
    this._picture = null;     // {canvas, box} of the last phase plot
    this._width = 0;
    const host = this;
    this.residuary = {
      /** Apply `partial` (f, var, params, view, region, panels, compact); resolves with results(). */
      set: (partial) => host._set(partial),
      /** The element's state now, in the shape set() takes. */
      state: () => host._stateNow(),
      /** What each shown panel computed, keyed by task (the contract's responses). */
      results: () => JSON.parse(JSON.stringify(host._results)),
      /** Resolves with results() once whatever is computing now has finished. */
      settled: async () => { while (host._pending) { try { await host._pending; } catch (e) { /* reported in results */ } } return host.residuary.results(); },
    };
  }

  connectedCallback() {
    this._schedule();
    if (typeof ResizeObserver === 'function' && !this._resize) {
      this._resize = new ResizeObserver(() => {
        const w = Math.floor(this._ui.figure.clientWidth);
        if (this._state && Engine.ready && Math.abs(w - this._width) > 2) { this._layout(); this._drawPicture(); this._renderPlot(this._serial); }
      });
      this._resize.observe(this);
    }
  }

  attributeChangedCallback() { if (!this._quiet) this._schedule(); }

  /** Run once after the attribute changes of this task (several attributes set together: one run). */
  _schedule() {
    if (this._scheduled || !this.isConnected) return;
    this._scheduled = true;
    // the run starts at once as `_pending`, so settled() waits for it even before the microtask
    let start;
    const gate = new Promise((resolve) => { start = resolve; });
    const run = gate.then(() => { this._scheduled = false; return this._run(); });
    this._track(run);
    queueMicrotask(start);
  }

  _track(run) {
    const tracked = run.finally(() => { if (this._pending === tracked) this._pending = null; });
    tracked.catch(() => {});
    this._pending = tracked;
    return tracked;
  }

  _stateNow() {
    let s;
    try { s = stateFromAttributes(this); } catch (e) { s = this._state; }
    if (!s) return null;
    const out = JSON.parse(JSON.stringify(s));
    out.contour = contourOf(s);
    return out;
  }

  async _set(partial) {
    const attrs = attributesFor(partial === undefined ? {} : partial); // throws {code, message}: set() rejects
    this._quiet = true;
    try {
      for (const [k, v] of Object.entries(attrs)) { if (v === null) this.removeAttribute(k); else this.setAttribute(k, v); }
    } finally { this._quiet = false; }
    const outcome = await this._track(this._run());
    if (outcome.error) throw outcome.error;
    if (outcome.superseded) throw embedError('cancelled', 'a newer change came in before the panels finished');
    return this.residuary.results();
  }

  /** Compute everything the element shows for its attributes; resolves {ok} or {error}, never rejects. */
  async _run() {
    try { return await this._compute(); } catch (e) {
      const error = embedError('internal', String((e && e.message) || e));
      this._showStatus('error', error.message);
      return { error };
    }
  }

  async _compute() {
    const serial = ++this._serial;
    const ui = this._ui;
    let s;
    try { s = stateFromAttributes(this); } catch (e) {
      this._showStatus('error', e.message);
      return { error: e };
    }
    this._state = s;
    const base = { f: s.f, var: s.var, params: s.params };
    const shows = (p) => s.panels.includes(p);
    ui.title.textContent = `f(${s.var}) = ${s.f}`;
    ui.figure.hidden = !shows('plot');
    this._showStatus('busy', Engine.ready ? 'Computing…' : 'Starting the computing core…');
    const started = await sharedEngine();
    if (serial !== this._serial) return { superseded: true };
    if (!started.ok) {
      await new Promise((resolve) => setTimeout(resolve, 0)); // the violation report may come just after the refusal
      const message = wasmRefused ? CSP_WORDS : started.message;
      const error = embedError('not_ready', message);
      this._showStatus('error', message);
      return { error };
    }
    if (s.f.trim() === '') { const error = embedError('expression', 'f is empty: give the element an f attribute'); this._showStatus('error', error.message); return { error }; }
    this._layout();
    const contour = contourOf(s);
    const plotDone = shows('plot') ? this._renderPlot(serial) : Promise.resolve();
    const computedFor = JSON.parse(JSON.stringify(base));
    const ask = (task, extra) => runHeavy(Object.assign({}, base, { task }, extra));
    const [sing, ci, count, pf] = await Promise.all([
      ask('singularities', { region: contour }),
      shows('integral') ? ask('contour_integral', { contour }) : null,
      shows('integral') || shows('count') ? ask('argument_count', { contour }) : null,
      shows('fractions') ? ask('partial_fractions', {}) : null,
    ]);
    await plotDone;
    if (serial !== this._serial) return { superseded: true };
    const results = {};
    results.singularities = Object.assign({}, sing, { stale: false, region: contour, nudge: null, computed_for: computedFor });
    if (ci) results.contour_integral = Object.assign({}, ci, { stale: false, contour, computed_for: computedFor, orientation: 1 });
    if (count) results.argument_count = Object.assign({}, count, { stale: false, contour, computed_for: computedFor });
    if (pf) results.partial_fractions = Object.assign({}, pf, { stale: false });
    this._results = results;
    this._markers = responseError(sing) ? [] : pointsOf(sing);
    this._drawPicture();
    this._showTables(s, results);
    const err = responseError(sing);
    if (err) this._showStatus('error', 'No search: ' + err.message);
    else this._showStatus('done', '');
    this.dataset.ready = 'true';
    this.dispatchEvent(new CustomEvent('residuary-results', { detail: this.residuary.results(), bubbles: true, composed: true }));
    return err ? { error: embedError(err.code, err.message) } : { ok: true };
  }

  _showStatus(what, text) {
    this._ui.status.dataset.state = what;
    this._ui.status.textContent = text;
    this._ui.status.hidden = what === 'done';
  }

  /** The canvas fitted to the element's width; the view kept (the picture is widened to its aspect). */
  _layout() {
    const s = this._state;
    const canvas = this._ui.canvas;
    const width = Math.max(200, Math.floor(this._ui.figure.clientWidth || 420));
    const pw = width - MARGIN.left - MARGIN.right;
    // the view's own aspect, within 0.4 … 1 of the width (compact: 0.8), so the view shown is the one asked for
    const aspect = (s.view[3] - s.view[2]) / (s.view[1] - s.view[0]);
    const ph = Math.round(Math.max(150, Math.min(pw * Math.max(0.4, Math.min(aspect, s.compact ? 0.8 : 1)), 700)));
    const dpr = window.devicePixelRatio || 1;
    this._width = width;
    const plot = this._plot || { ctx: canvas.getContext('2d'), canvas, markers: [], selected: -1, axisName: s.var, region: null, regionDirection: 1, infinityMode: false };
    Object.assign(plot, { cssW: width, cssH: ph + MARGIN.top + MARGIN.bottom, pw, ph, axisName: s.var });
    canvas.width = Math.round(plot.cssW * dpr);
    canvas.height = Math.round(plot.cssH * dpr);
    canvas.style.height = plot.cssH + 'px';
    setView(plot, s.view);
    plot.region = contourOf(s);
    this._plot = plot;
  }

  /** The core's picture of the view, through the shared plot worker. */
  async _renderPlot(serial) {
    const plot = this._plot;
    const s = this._state;
    const box = viewBox(plot);
    const dpr = window.devicePixelRatio || 1;
    const W = Math.max(1, Math.round(plot.pw * Math.min(dpr, 2))), H = Math.max(1, Math.round(plot.ph * Math.min(dpr, 2)));
    const layer = document.createElement('canvas');
    layer.width = W; layer.height = H;
    const request = { task: 'phase_plot', f: s.f, var: s.var, params: s.params, view: box, size: [W, H], format: 'rgba', options: {} };
    let drawn = false;
    const outcome = await queuedPlot(request, (rows, rgba) => {
      if (rgba.length !== W * H * 4) return;
      layer.getContext('2d').putImageData(new ImageData(new Uint8ClampedArray(rgba.buffer, rgba.byteOffset, rgba.length), W, H), 0, 0);
      drawn = true;
    });
    if (serial !== this._serial) return;
    if (drawn && outcome && outcome.done) this._picture = { canvas: layer, box, message: '' };
    else this._picture = { canvas: null, box, message: 'No picture: ' + ((outcome && outcome.error && outcome.error.message) || 'the core drew nothing') };
    this.dataset.plot = drawn ? 'drawn' : 'none';
    this._drawPicture();
  }

  _drawPicture() {
    const plot = this._plot;
    if (!plot) return;
    const ctx = plot.ctx;
    const dpr = window.devicePixelRatio || 1;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.fillStyle = '#fff';
    ctx.fillRect(0, 0, plot.cssW, plot.cssH);
    ctx.save();
    ctx.beginPath();
    ctx.rect(MARGIN.left, MARGIN.top, plot.pw, plot.ph);
    ctx.clip();
    ctx.fillStyle = '#e9ebee';
    ctx.fillRect(MARGIN.left, MARGIN.top, plot.pw, plot.ph);
    const pic = this._picture;
    if (pic && pic.canvas) {
      const [x0, x1, y0, y1] = pic.box;
      const [v0, , , w1] = viewBox(plot);
      ctx.drawImage(pic.canvas, MARGIN.left + (x0 - v0) / plot.scale, MARGIN.top + (w1 - y1) / plot.scale, (x1 - x0) / plot.scale, (y1 - y0) / plot.scale);
    } else if (pic && pic.message) {
      ctx.fillStyle = '#333';
      ctx.font = '13px system-ui, sans-serif';
      ctx.fillText(pic.message.slice(0, 90), MARGIN.left + 8, MARGIN.top + 20);
    }
    plot.markers = this._markers || [];
    drawRegion(plot);
    drawMarkers(plot);
    ctx.restore();
    drawAxes(plot);
    const counts = {};
    for (const m of plot.markers) counts[m.kind] = (counts[m.kind] || 0) + 1;
    const marked = Object.entries(counts).map(([k, c]) => `${c} ${KIND_WORDS[k]}${c === 1 ? '' : 's'}`).join(', ');
    this._ui.canvas.setAttribute('aria-label', `Phase plot of f(${plot.axisName}) = ${this._state ? this._state.f : ''}: colour shows the argument of f.${marked ? ' Marked: ' + marked + '.' : ''}`);
  }

  _showTables(s, results) {
    const ui = this._ui;
    const shows = (p) => s.panels.includes(p);
    const sing = results.singularities;
    const singErr = responseError(sing);
    ui.sing.hidden = !(shows('singularities') || shows('residues')) || Boolean(singErr);
    if (!ui.sing.hidden) {
      const cols = [['Location', (p) => fmtComplex(trimComplex(p.at))]];
      if (shows('singularities')) cols.push(['Kind', (p) => KIND_WORDS[p.kind]], ['Order', (p) => (p.order ? String(p.order) : '—')]);
      if (shows('residues')) cols.push(['Residue', (p) => (p.residue ? fmtComplex(trimComplex(p.residue)) : '—')]);
      const pts = pointsOf(sing).filter((p) => shows('singularities') || p.residue);
      ui.singHead.innerHTML = '';
      const hr = document.createElement('tr');
      for (const [name] of cols) { const th = document.createElement('th'); th.scope = 'col'; th.textContent = name; hr.append(th); }
      ui.singHead.append(hr);
      ui.singBody.innerHTML = '';
      for (const p of pts.slice(0, 200)) {
        const tr = document.createElement('tr');
        tr.dataset.kind = p.kind;
        for (const [, cell] of cols) { const td = document.createElement('td'); td.textContent = cell(p); tr.append(td); }
        ui.singBody.append(tr);
      }
      if (pts.length === 0) {
        const tr = document.createElement('tr'); const td = document.createElement('td');
        td.colSpan = cols.length; td.textContent = 'None in the region.'; tr.append(td); ui.singBody.append(tr);
      }
      ui.singWarnings.textContent = '';
      for (const w of Array.isArray(sing.warnings) ? sing.warnings : []) { const li = document.createElement('li'); li.textContent = String(w); ui.singWarnings.append(li); }
      ui.inf.textContent = shows('residues') && isPair(sing.residue_at_infinity) ? `Residue at infinity: ${fmtComplex(trimComplex(sing.residue_at_infinity))}` : '';
    }
    const ci = results.contour_integral;
    ui.ci.hidden = !ci;
    if (ci) {
      const e = responseError(ci);
      ui.ciWays.innerHTML = '';
      if (e) { ui.ciValue.textContent = 'Not computed: ' + e.message; ui.ciVerdict.textContent = ''; }
      else {
        ui.ciValue.textContent = `Value: ${fmtComplex(trimBelow(ci.value, ci.error_estimate), 10)}`; // parts below the error estimate written as 0
        for (const [name, v, err] of [['inside residues', ci.by_inside_residues, ci.inside_residues_error_estimate],
          ['outside residues', ci.by_outside_residues, ci.outside_residues_error_estimate], ['quadrature', ci.by_quadrature, ci.quadrature_error_estimate]]) {
          if (!isPair(v)) continue;
          const tr = document.createElement('tr');
          for (const t of [name, fmtComplex(isNum(err) ? trimBelow(v, err) : v, 10), isNum(err) ? fmtReal(err, 2) : '—']) { const td = document.createElement('td'); td.textContent = t; tr.append(td); }
          ui.ciWays.append(tr);
        }
        ui.ciVerdict.textContent = ci.agreement || '';
      }
      ui.ciWarnings.textContent = '';
      for (const w of Array.isArray(ci.warnings) ? ci.warnings : []) { const li = document.createElement('li'); li.textContent = String(w); ui.ciWarnings.append(li); }
    }
    const count = results.argument_count;
    ui.count.hidden = !(count && shows('count'));
    if (count && shows('count')) {
      const e = responseError(count);
      ui.countText.textContent = e ? 'Not computed: ' + e.message : `zeros − poles inside the contour = ${count.zeros_minus_poles} (${count.zeros} zeros, ${count.poles} poles, with multiplicity)`;
    }
    const pf = results.partial_fractions;
    ui.pf.hidden = !pf;
    if (pf) { const e = responseError(pf); ui.pfText.textContent = e ? e.message : `f(${s.var}) = ${pf.text}`; }
  }
}

/** The contour the element searches: its region, or the view as a rectangle. */
function contourOf(s) {
  if (s.region !== 'view') return JSON.parse(JSON.stringify(s.region));
  const [x0, x1, y0, y1] = s.view;
  return { shape: 'rectangle', corners: [[x0, y0], [x1, y1]] };
}

if (typeof customElements !== 'undefined' && !customElements.get('residuary-view')) customElements.define('residuary-view', ResiduaryView);

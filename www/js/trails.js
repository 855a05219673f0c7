// Pole trails: how the poles and zeros of f move while one parameter runs over a range.
// The core's `pole_trails` task gives the paths (docs/contract.md); while a core without that
// task is loaded (code "unknown_task"), the page computes the same shape itself from the
// `partial_fractions` of f and of 1/f at each step, matching each root to the nearest root of
// the step before. The plot draws them (plot/overlays.js drawTrails); the drawn data is on the
// plot canvas as data-trails (JSON {name, values, poles, zeros}, docs/page.md).
import { $, el, debounce } from './dom.js';
import { runHeavy, responseError } from './engine.js';
import { functionInput, parseComplex } from './params.js';

/** Default number of parameter values along a trail. */
export const TRAIL_STEPS = 41;
const MAX_STEPS = 400;

/** Roots of one partial_fractions answer, each repeated by its multiplicity. */
function rootList(pf) {
  const seen = [];
  for (const t of Array.isArray(pf.terms) ? pf.terms : []) {
    if (!Array.isArray(t.at) || !t.at.every(Number.isFinite)) continue;
    const same = seen.find((r) => Math.abs(r.at[0] - t.at[0]) + Math.abs(r.at[1] - t.at[1]) <= 1e-12 * Math.max(1, Math.hypot(...t.at)));
    if (same) same.order = Math.max(same.order, t.power || 1);
    else seen.push({ at: t.at, order: t.power || 1 });
  }
  const out = [];
  for (const r of seen) for (let i = 0; i < r.order; i++) out.push(r.at);
  return out;
}

/** Continuous paths from the roots at each step: greedy nearest matching to each trail's last point. */
export function matchTrails(steps) {
  const trails = [];
  steps.forEach((roots, s) => {
    const free = roots.map((_, i) => i);
    const pairs = [];
    trails.forEach((trail, t) => {
      let last = null;
      for (let k = trail.length - 1; k >= 0 && !last; k--) last = trail[k];
      if (last) roots.forEach((r, i) => pairs.push([Math.hypot(r[0] - last[0], r[1] - last[1]), t, i]));
    });
    pairs.sort((a, b) => a[0] - b[0]);
    const usedT = new Set(), usedR = new Set();
    for (const [, t, i] of pairs) {
      if (usedT.has(t) || usedR.has(i)) continue;
      usedT.add(t); usedR.add(i);
      trails[t].push(roots[i]);
    }
    trails.forEach((trail, t) => { if (!usedT.has(t)) trail.push(null); });
    for (const i of free) if (!usedR.has(i)) trails.push(new Array(s).fill(null).concat([roots[i]]));
  });
  return trails;
}

/** The parameter values of a sweep {from, to, steps, scale}: `steps` values, both ends included. */
export function sweepValues(sweep) {
  const n = Math.max(2, Math.min(MAX_STEPS, Math.round(sweep.steps)));
  const out = [];
  for (let i = 0; i < n; i++) {
    const u = i / (n - 1);
    out.push(sweep.scale === 'log' ? sweep.from * Math.pow(sweep.to / sweep.from, u) : sweep.from + u * (sweep.to - sweep.from));
  }
  return out;
}

/** The trails for `base` ({f, var, params}) over `sweep` ({name, from, to, steps, scale}):
 *  {name, values, poles, zeros, warnings} or {error: {code, message}}. */
export async function computeTrails(base, sweep, isCurrent = () => true) {
  const resp = await runHeavy(Object.assign({}, base, { task: 'pole_trails', sweep }));
  const err = responseError(resp);
  if (!err) return resp;
  if (err.code !== 'unknown_task') return { error: err };
  const values = sweepValues(sweep);
  const poles = [], zeros = [];
  for (const v of values) {
    if (!isCurrent()) return { error: { code: 'cancelled', message: 'superseded' } };
    const at = Object.assign({}, base, { params: Object.assign({}, base.params, { [sweep.name]: v }) });
    const pf = await runHeavy(Object.assign({}, at, { task: 'partial_fractions' }));
    const e1 = responseError(pf);
    if (e1 && e1.code !== 'not_applicable') return { error: e1 };
    if (e1) return { error: { code: 'not_applicable', message: `f is not rational at ${sweep.name} = ${v}` } };
    const inv = await runHeavy(Object.assign({}, at, { f: `1/(${base.f})`, task: 'partial_fractions' }));
    const e2 = responseError(inv);
    poles.push(rootList(pf));
    zeros.push(e2 ? [] : rootList(inv));
  }
  return { name: sweep.name, values, poles: matchTrails(poles), zeros: matchTrails(zeros), warnings: [] };
}

/** The "Trails" controls under the parameters, over `page`; hooks.persist() keeps the state. */
export function createTrails(page, hooks) {
  const { state } = page;
  const ui = { box: $('trails-box'), param: $('trail-param'), from: $('trail-from'), to: $('trail-to'), steps: $('trail-steps'),
    draw: $('trail-draw'), show: $('trail-show'), status: $('trail-status') };
  const canvas = page.ui.canvas;
  let serial = 0, key = '';

  function rows() { return state.params.filter((p) => /^[A-Za-z_][A-Za-z0-9_]*$/.test(p.name.trim()) && parseComplex(p.value)); }

  /** Fill the select with the parameters (keeping the choice), hide the block without any. */
  function fill() {
    const names = rows().map((p) => p.name.trim());
    ui.box.hidden = names.length === 0;
    const want = (state.trails && names.includes(state.trails.name)) ? state.trails.name : (names.includes(ui.param.value) ? ui.param.value : names[0]);
    ui.param.textContent = '';
    for (const n of names) ui.param.append(el('option', { value: n, text: n }));
    if (want) ui.param.value = want;
    if (state.trails && state.trails.name === want) {
      ui.from.value = String(state.trails.from); ui.to.value = String(state.trails.to); ui.steps.value = String(state.trails.steps);
      ui.show.checked = state.trails.shown;
    } else if (want && !ui.from.value) defaultRange();
  }

  function defaultRange() {
    const p = rows().find((r) => r.name.trim() === ui.param.value);
    if (!p) return;
    ui.from.value = String(p.lo ?? 0);
    ui.to.value = String(p.hi ?? 1);
    ui.steps.value = String(TRAIL_STEPS);
  }

  function currentValue(name) {
    const p = rows().find((r) => r.name.trim() === name);
    const v = p ? parseComplex(p.value) : null;
    return v ? v[0] : null;
  }

  function clear(text) {
    page.plot.trails = null;
    delete canvas.dataset.trails;
    canvas.dataset.trailsState = 'none';
    ui.status.textContent = text || '';
    page.plot.draw();
  }

  /** Compute (when the function, the others' values or the range changed) and draw. */
  async function refresh() {
    const t = state.trails;
    if (!t || !page.exprOk) { if (page.plot.trails) clear(); return; }
    if (!rows().some((r) => r.name.trim() === t.name)) { clear(); return; }
    const base = functionInput(state);
    const others = Object.assign({}, base.params);
    delete others[t.name];
    const sweep = { name: t.name, from: t.from, to: t.to, steps: t.steps, scale: 'linear' };
    const k = JSON.stringify([base.f, base.var, others, sweep]);
    if (k === key && page.plot.trails) {
      page.plot.trails.current = currentValue(t.name);
      page.plot.trails.shown = t.shown;
      page.plot.draw();
      return;
    }
    const mine = ++serial;
    canvas.dataset.trailsState = 'busy';
    ui.status.textContent = 'Computing the trails…';
    const out = await computeTrails(base, sweep, () => mine === serial);
    if (mine !== serial) return;
    if (out.error) { key = ''; clear('No trails: ' + out.error.message); return; }
    key = k;
    const data = { name: out.name, values: out.values, poles: out.poles, zeros: out.zeros };
    page.plot.trails = Object.assign({}, data, { current: currentValue(t.name), shown: t.shown });
    canvas.dataset.trails = JSON.stringify(data);
    canvas.dataset.trailsState = 'done';
    ui.status.textContent = `${out.poles.length} pole and ${out.zeros.length} zero trail${out.zeros.length === 1 ? '' : 's'}, ${t.name} from ${t.from} to ${t.to} (solid: poles, dashed: zeros; a tick per step).`;
    page.plot.draw();
  }
  const refreshSoon = debounce(refresh, 250);

  function readControls() {
    const from = Number(ui.from.value), to = Number(ui.to.value), steps = Math.round(Number(ui.steps.value));
    if (!ui.param.value || !Number.isFinite(from) || !Number.isFinite(to) || from === to || !(steps >= 2 && steps <= MAX_STEPS)) {
      ui.status.textContent = `Give a range with two different ends and 2 to ${MAX_STEPS} steps.`;
      return false;
    }
    state.trails = { name: ui.param.value, from, to, steps, shown: true };
    ui.show.checked = true;
    hooks.persist();
    return true;
  }

  ui.param.addEventListener('change', () => { defaultRange(); });
  ui.draw.addEventListener('click', () => { if (readControls()) refresh(); });
  ui.show.addEventListener('change', () => {
    if (!state.trails) { if (ui.show.checked && readControls()) refresh(); return; }
    state.trails.shown = ui.show.checked;
    hooks.persist();
    if (page.plot.trails) { page.plot.trails.shown = ui.show.checked; page.plot.draw(); } else refresh();
  });

  return {
    /** The parameters or the function changed. */
    changed() {
      fill();
      if (!state.trails) return;
      const t = page.plot.trails;
      if (t && t.name === state.trails.name) { t.current = currentValue(t.name); page.plot.draw(); } // the ring follows at once
      refreshSoon();
    },
    /** A new state was taken over (an example, a link). */
    adopted() { key = ''; ui.from.value = ''; fill(); if (state.trails) refreshSoon(); else clear(); },
    refresh,
  };
}

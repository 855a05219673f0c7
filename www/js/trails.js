// Pole trails: how the poles and zeros of f move while one parameter runs over a range.
// The core's `pole_trails` task gives the paths (docs/contract.md: roots matched step to step by
// least total distance). The plot draws them (plot/overlays.js drawTrails); the drawn data is on the
// plot canvas as data-trails (JSON {name, values, poles, zeros}, docs/page.md).
import { $, el, debounce } from './dom.js';
import { runHeavy, responseError } from './engine.js';
import { functionInput, parseComplex } from './params.js';

/** Default number of parameter values along a trail. */
export const TRAIL_STEPS = 41;
const MAX_STEPS = 400;

/** The trails for `base` ({f, var, params}) over `sweep` ({name, from, to, steps, scale}):
 *  {name, values, poles, zeros, warnings} or {error: {code, message}}. */
export async function computeTrails(base, sweep) {
  const resp = await runHeavy(Object.assign({}, base, { task: 'pole_trails', sweep }));
  const err = responseError(resp);
  return err ? { error: err } : resp;
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
    page.trailsResult = null;
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
    page.trailsResult = null;
    canvas.dataset.trailsState = 'busy';
    ui.status.textContent = 'Computing the trails…';
    const out = await computeTrails(base, sweep);
    if (mine !== serial) return;
    if (out.error) { key = ''; clear('No trails: ' + out.error.message); page.trailsResult = out; return; }
    key = k;
    page.trailsResult = out; // results().pole_trails (scripting.js)
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

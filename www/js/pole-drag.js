// Moving a pole or a zero of a rational f with the pointer: f is rewritten in the gain–zeros–poles
// form k·Π(v − zᵢ)^mᵢ / Π(v − pⱼ)^nⱼ with the moved root, every frame, and every open view follows
// (main.js's live path: one request of each kind in flight, the newest wins).
//
// Rules (docs/page.md): for f with real coefficients a real root stays on the real axis (it is
// dragged along it) and a complex root moves with its mirror image, the pair written as a real
// quadratic (v^2 + a*v + b); for complex coefficients each root moves alone. Numbers are rounded
// to 6 significant digits. Parameters in f are replaced by their values in the rewritten form.
// "Undo the drag" (and Ctrl+Z on the plot) brings back the f typed before the drag, exactly.
import { runHeavy, runNow, responseError } from './engine.js';
import { functionInput } from './params.js';
import { zpkExpression } from './entry-forms.js';

/** Significant digits of the rewritten form. */
export const DRAG_DIGITS = 6;
/** A root with |Im| ≤ this × max(1, |root|) counts as real. */
const REAL_TOL = 1e-9;

/** x to DRAG_DIGITS significant digits, written plainly ("-0.2", "4", "1.5e-7"). */
export function dragNum(x) {
  if (x === 0 || Object.is(x, -0)) return '0';
  return String(Number(x.toPrecision(DRAG_DIGITS)));
}

const isReal = (p) => Math.abs(p[1]) <= REAL_TOL * Math.max(1, Math.hypot(p[0], p[1]));

/** f written as k·Π(v − z)^m / Π(v − p)^n for the model {k: [re, im], zeros, poles, real}, every
 *  number rounded to DRAG_DIGITS significant digits (a root within REAL_TOL of the real axis put
 *  on it), by the one writer of the factored form (entry-forms.js). */
export function zpkText(v, model) {
  const round = (x) => Number(dragNum(x));
  // A complex root is rounded through its quadratic's coefficients (−2 Re p, |p|², as written), so
  // a pair left where it was keeps typed coefficients such as 0.4 and 4 exactly.
  const rounded = (at) => {
    if (isReal(at)) return [round(at[0]), 0];
    const re = -round(-2 * at[0]) / 2, m2 = round(at[0] * at[0] + at[1] * at[1]);
    const im = Math.sqrt(Math.max(0, m2 - re * re));
    return [re, at[1] < 0 ? -im : im];
  };
  const roots = (list) => list.map((r) => ({ value: rounded(r.at), order: r.order }));
  const k = model.real ? [round(model.k[0]), 0] : [round(model.k[0]), round(model.k[1])];
  return zpkExpression({ value: k }, roots(model.zeros), roots(model.poles), v);
}

/** Roots with their multiplicities from a partial_fractions answer (the highest power at a point). */
function rootsOf(pf) {
  const out = [];
  for (const t of Array.isArray(pf.terms) ? pf.terms : []) {
    if (!Array.isArray(t.at) || !t.at.every(Number.isFinite)) continue;
    const same = out.find((r) => Math.abs(r.at[0] - t.at[0]) + Math.abs(r.at[1] - t.at[1]) <= 1e-12 * Math.max(1, Math.hypot(...t.at)));
    if (same) same.order = Math.max(same.order, t.power || 1);
    else out.push({ at: t.at.slice(), order: t.power || 1 });
  }
  return out;
}

/** The gain–zeros–poles model of a rational `base` ({f, var, params}): {k, zeros, poles, real},
 *  or null when f is not rational or the core does not answer. k = f(s0)·Π(s0 − p)/Π(s0 − z) at
 *  a generic point s0 (the `evaluate` task). */
const MAX_DRAG_TERMS = 400;
export async function rationalModel(base) {
  const pf = await runHeavy(Object.assign({}, base, { task: 'partial_fractions' }));
  if (responseError(pf)) return null;
  // Dragging one of thousands of poles is not offered: the model's checks grow with the square of
  // their number and would hold up the page (no main-thread task over 50 ms).
  if (Array.isArray(pf.terms) && pf.terms.length > MAX_DRAG_TERMS) return null;
  const inv = await runHeavy(Object.assign({}, base, { f: `1/(${base.f})`, task: 'partial_fractions' }));
  const invErr = responseError(inv);
  if (invErr && invErr.code !== 'not_applicable') return null;
  const poles = rootsOf(pf);
  const zeros = invErr ? [] : rootsOf(inv);
  const s0 = [0.4137, 0.7719];
  const ev = runNow(Object.assign({}, base, { task: 'evaluate', at: [s0] }));
  if (responseError(ev) || !Array.isArray(ev.values)) return null;
  let k = ev.values[0];
  const mul = (a, b) => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
  const div = (a, b) => { const d = b[0] * b[0] + b[1] * b[1]; return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d]; };
  const pow = (a, n) => { let r = [1, 0]; for (let i = 0; i < n; i++) r = mul(r, a); return r; };
  for (const p of poles) k = mul(k, pow([s0[0] - p.at[0], s0[1] - p.at[1]], p.order));
  for (const z of zeros) k = div(k, pow([s0[0] - z.at[0], s0[1] - z.at[1]], z.order));
  if (!k.every(Number.isFinite)) return null;
  // real coefficients: k real and every root's mirror among the roots of the same side
  const mirrored = (list) => list.every((r) => isReal(r.at) || list.some((q) => q.order === r.order &&
    Math.abs(q.at[0] - r.at[0]) + Math.abs(q.at[1] + r.at[1]) <= 1e-7 * Math.max(1, Math.hypot(...r.at))));
  const real = Math.abs(k[1]) <= 1e-9 * Math.max(1e-300, Math.abs(k[0])) && mirrored(poles) && mirrored(zeros);
  if (real) {
    for (const r of poles.concat(zeros)) if (isReal(r.at)) r.at[1] = 0;
    k = [k[0], 0];
  }
  return { k, zeros, poles, real };
}

/** The drag controller over `page`. hooks: liveChanged() (f was rewritten during a drag: the
 *  cheap views follow), released() (the drag ended: the full search), undone() (f restored). */
export function createPoleDrag(page, hooks) {
  const { state, ui } = page;
  const drag = { model: null, modelKey: '', active: null, undo: [], frame: 0, pending: null };

  /** Ready the model for the function now (after a search); resolves when known. */
  async function prepare() {
    const base = functionInput(state);
    const key = JSON.stringify(base);
    if (drag.modelKey === key && drag.model) return drag.model;
    const model = await rationalModel(base);
    if (JSON.stringify(functionInput(state)) !== key) return null;
    drag.model = model;
    drag.modelKey = key;
    ui.canvas.dataset.draggable = model ? 'true' : 'false';
    return model;
  }

  /** Pointer down on marker `index`: true when a drag starts (then the view does not pan). */
  function start(index) {
    const m = page.plot.markers[index];
    const model = drag.model;
    if (!m || !model || state.infinity || (m.kind !== 'pole' && m.kind !== 'zero')) return false;
    if (drag.modelKey !== JSON.stringify(functionInput(state))) return false;
    const list = m.kind === 'pole' ? model.poles : model.zeros;
    let best = -1, bestD = Infinity;
    list.forEach((r, i) => { const d = Math.hypot(r.at[0] - m.at[0], r.at[1] - m.at[1]); if (d < bestD) { bestD = d; best = i; } });
    if (best < 0 || bestD > 1e-3 * Math.max(1, Math.hypot(...m.at))) return false;
    const root = list[best];
    let partner = -1;
    if (model.real && !isReal(root.at)) {
      partner = list.findIndex((q, i) => i !== best && q.order === root.order && Math.abs(q.at[0] - root.at[0]) + Math.abs(q.at[1] + root.at[1]) <= 1e-6 * Math.max(1, Math.hypot(...root.at)));
    }
    const partnerMarker = partner >= 0 ? page.plot.markers.findIndex((q) => q.kind === m.kind && Math.hypot(q.at[0] - list[partner].at[0], q.at[1] - list[partner].at[1]) <= 1e-3 * Math.max(1, Math.hypot(...q.at))) : -1;
    drag.active = { kind: m.kind, root: best, partner, marker: index, partnerMarker, onAxis: model.real && isReal(root.at), before: { f: state.f }, moved: false };
    return true;
  }

  /** The pointer at plane point p during a drag. */
  function move(p) {
    const a = drag.active;
    if (!a) return;
    drag.pending = p;
    if (!drag.frame) drag.frame = requestAnimationFrame(frame);
  }

  function frame() {
    drag.frame = 0;
    const a = drag.active, p = drag.pending;
    drag.pending = null;
    if (!a || !p) return;
    const model = drag.model;
    const list = a.kind === 'pole' ? model.poles : model.zeros;
    const at = a.onAxis ? [p[0], 0] : [p[0], p[1]];
    list[a.root].at = at;
    if (a.partner >= 0) list[a.partner].at = [at[0], -at[1]];
    const markers = page.plot.markers;
    if (markers[a.marker]) markers[a.marker] = Object.assign({}, markers[a.marker], { at });
    if (a.partnerMarker >= 0 && markers[a.partnerMarker]) markers[a.partnerMarker] = Object.assign({}, markers[a.partnerMarker], { at: [at[0], -at[1]] });
    if (!a.moved) { a.moved = true; drag.undo.push(a.before); }
    state.f = zpkText(state.var.trim() || 'z', model);
    drag.modelKey = JSON.stringify(functionInput(state));
    ui.expr.value = state.f;
    showUndo();
    hooks.liveChanged();
  }

  /** Pointer up: the last position is applied, then the full search. */
  function end() {
    const a = drag.active;
    if (!a) return;
    if (drag.pending) { cancelAnimationFrame(drag.frame); drag.frame = 0; frame(); }
    drag.active = null;
    // the next drag starts from the roots the search finds for the rewritten f
    if (a.moved) { drag.model = null; drag.modelKey = ''; hooks.released(); }
  }

  function showUndo() {
    const u = document.getElementById('drag-undo');
    if (u) u.hidden = drag.undo.length === 0;
    const note = document.getElementById('drag-note');
    if (note) {
      note.hidden = drag.undo.length === 0;
      note.textContent = 'f was rewritten from its gain, zeros and poles with the moved root (numbers to 6 significant digits' +
        (state.params.length ? '; parameters replaced by their values' : '') + '). Undo the drag brings back the f before it.';
    }
  }

  /** Bring back the f from before the last drag, exactly. */
  function undo() {
    const before = drag.undo.pop();
    showUndo();
    if (!before) return false;
    state.f = before.f;
    ui.expr.value = state.f;
    drag.model = null; drag.modelKey = '';
    hooks.undone();
    return true;
  }

  /** Alt + arrows on marker `index`: the first press starts a drag, each press moves the root by
   *  `d` (plane units); nudgeEnd() applies it like a pointer release. False when it cannot move. */
  let nudgeAt = null;
  function nudge(index, d) {
    if (!drag.active) {
      if (index < 0 || !start(index)) return false;
      nudgeAt = page.plot.markers[index].at.slice();
    }
    if (!nudgeAt) return false; // a pointer drag is under way
    nudgeAt = [nudgeAt[0] + d[0], nudgeAt[1] + d[1]];
    move(nudgeAt);
    return true;
  }
  function nudgeEnd() {
    if (!nudgeAt) return;
    nudgeAt = null;
    end();
  }

  /** f was typed or replaced: the undo list no longer applies. */
  function forget() { drag.undo.length = 0; drag.model = null; drag.modelKey = ''; showUndo(); }

  return { prepare, start, move, end, nudge, nudgeEnd, undo, forget, get active() { return drag.active; }, get undoDepth() { return drag.undo.length; } };
}

/** At most this many frequencies and step times in a live transfer request (the full grids
 *  come back with the search on release). */
export const LIVE_FREQUENCIES = 160;
export const LIVE_TIMES = 120;

/** Every k-th value of `xs` (the first and last kept) so that at most `n` remain. */
function thin(xs, n) {
  if (!Array.isArray(xs) || xs.length <= n) return xs;
  const out = [];
  const step = (xs.length - 1) / (n - 1);
  for (let i = 0; i < n; i++) out.push(xs[Math.round(i * step)]);
  return out;
}

/** The transfer request for a live frame: `request` (transfer.js transferRequest) on the grids of
 *  the last full answer `previous`, thinned (the axes stay put while dragging and the core's
 *  work drops with the number of points). Unchanged when there is no previous answer. */
export function liveTransferRequest(request, previous) {
  const out = Object.assign({}, request);
  const fr = previous && previous.frequency_response;
  if (fr && Array.isArray(fr.omega)) {
    const om = thin(fr.omega.filter((w) => Number.isFinite(w) && w > 0), LIVE_FREQUENCIES);
    if (om.length >= 2) out.omega = om;
  }
  const st = previous && previous.step;
  if (st && Array.isArray(st.t) && st.t.length >= 2) out.t = thin(st.t, LIVE_TIMES);
  return out;
}

/** At most this many times in a live inverse Laplace request (inverse.js samples up to 4000). */
export const LIVE_INVERSE_TIMES = 60;

/** The inverse-transform request for a live frame: its times thinned (x[n] of z is kept whole). */
export function liveInverseRequest(request) {
  if (!Array.isArray(request.t)) return request;
  return Object.assign({}, request, { t: thin(request.t, LIVE_INVERSE_TIMES) });
}

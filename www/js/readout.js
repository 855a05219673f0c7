// The pointer readout under the plot: the point (and 1/w in the view around
// infinity), f there, |f| and arg f, evaluated by the core on the main thread
// once per animation frame. The keyboard cursor (plot-cursor.js) reads through it too and
// passes `told`, which receives the text once written (for its announcement).
import { cAbs, cArg, cInv, isFinitePair } from './complex.js';
import { fmtComplex, fmtReal } from './format.js';
import { runNow, responseError } from './engine.js';
import { functionInput } from './params.js';

/** A function to call with the plane point under the pointer (or null when it leaves), and
 *  optionally `told(text)`, called with the readout's text when it is written. */
export function createReadout(page) {
  const out = page.ui.readout;
  let readoutPoint = null, readoutTold = null, readoutQueued = false;
  const write = (text) => {
    out.textContent = text;
    if (readoutTold) { const t = readoutTold; readoutTold = null; t(text); }
  };
  return function readoutAt(p, told = null) {
    readoutPoint = p;
    readoutTold = told;
    if (readoutQueued) return;
    readoutQueued = true;
    requestAnimationFrame(() => {
      readoutQueued = false;
      const state = page.state;
      const q = readoutPoint;
      if (!q) { write('Move the pointer over the plot to read values.'); return; }
      const v = state.var.trim() || 'z';
      const z = state.infinity ? cInv(q) : q;
      const where = state.infinity ? `w = ${fmtComplex(q, 5)}, ${v} = 1/w = ${fmtComplex(z, 5)}` : `${v} = ${fmtComplex(q, 5)}`;
      if (!page.exprOk || !isFinitePair(z)) { write(where); return; }
      const resp = runNow(Object.assign(functionInput(state), { task: 'evaluate', at: [z] }));
      const err = responseError(resp);
      if (err || !resp.values || !resp.values[0]) { write(where + ' — ' + (err ? err.message : 'no value')); return; }
      const f = resp.values[0].map((x) => (x === null ? NaN : x));
      out.dataset.z = JSON.stringify(z);   // full precision, for checking
      out.dataset.f = JSON.stringify(resp.values[0]);
      const mod = cAbs(f), arg = cArg(f);
      write(`${where}   f = ${fmtComplex(f, 6)}   |f| = ${fmtReal(mod, 6)}   arg f = ` +
        (Number.isFinite(arg) && Number.isFinite(mod) && mod > 0 ? `${fmtReal(arg, 5)} rad (${fmtReal((arg * 180) / Math.PI, 4)}°)` : 'undefined'));
    });
  };
}

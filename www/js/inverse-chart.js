// The inverse transform's chart: f(t) as a line over 0 < t ≤ T, or x[n] as stems
// for n = 0 … N, with a light grid and tick labels. The data sit on the canvas
// (data-points, data-kind) so a resize can redraw without asking the core again.
// `opts` (the transfer section's charts): `cursor` (a sample index to mark), `xLabel` (the axis
// name with its unit), `extraY` (values the y range must include), `decorate(g, map)` (drawn
// under the data: the step metrics); returns the map {px, py, left, right, top, bottom, toX}.
import { sizedCanvas, niceTicks, tickText } from './chart-kit.js';
import { ink } from './scheme.js';

/** Draw (or redraw, after a resize) the chart from its data attribute. */
export function drawInverseChart(canvas, opts = {}) {
  const { g, cssW, cssH } = sizedCanvas(canvas, { minW: 160, minH: 140, maxH: 220, aspect: 0.45 });
  if (!canvas.dataset.points) return null;
  const { x, y, err } = JSON.parse(canvas.dataset.points);
  const stems = canvas.dataset.kind === 'z';
  const finite = y.filter((v) => v !== null).concat((opts.extraY || []).filter(Number.isFinite));
  if (!finite.length) return null;
  let lo = finite.reduce((a, v) => Math.min(a, v), 0), hi = finite.reduce((a, v) => Math.max(a, v), 0);
  if (hi - lo < 1e-300) { hi += 1; lo -= 1; }
  const pad = 0.06 * (hi - lo);
  lo -= stems && lo === 0 ? 0 : pad;
  hi += pad;
  const x0 = stems ? -0.5 : 0, x1 = stems ? x[x.length - 1] + 0.5 : x[x.length - 1];
  const yt = niceTicks(lo, hi, 4), xt = stems ? niceTicks(0, x[x.length - 1], 6).filter((v) => Number.isInteger(v)) : niceTicks(0, x1, 6);
  g.font = '11px system-ui, sans-serif';
  const left = 8 + Math.max(...yt.map((v) => g.measureText(tickText(v)).width)), right = 10, top = 8, bottom = opts.xLabel ? 34 : 22;
  const px = (v) => left + ((v - x0) / (x1 - x0)) * (cssW - left - right);
  const py = (v) => top + ((hi - v) / (hi - lo)) * (cssH - top - bottom);
  // grid and tick labels
  g.strokeStyle = ink('chart-grid');
  g.lineWidth = 1;
  g.fillStyle = ink('chart-text');
  g.textAlign = 'right';
  g.textBaseline = 'middle';
  for (const v of yt) {
    const yy = Math.round(py(v)) + 0.5;
    g.beginPath(); g.moveTo(left, yy); g.lineTo(cssW - right, yy); g.stroke();
    g.fillText(tickText(v), left - 4, yy);
  }
  g.textAlign = 'center';
  g.textBaseline = 'top';
  for (const v of xt) {
    const xx = Math.round(px(v)) + 0.5;
    g.beginPath(); g.moveTo(xx, top); g.lineTo(xx, cssH - bottom); g.stroke();
    g.fillText(tickText(v), xx, cssH - bottom + 4);
  }
  // the axes: the zero line and the left edge
  g.strokeStyle = ink('chart-frame');
  g.beginPath();
  g.moveTo(left, Math.round(py(0)) + 0.5); g.lineTo(cssW - right, Math.round(py(0)) + 0.5);
  g.moveTo(left + 0.5, top); g.lineTo(left + 0.5, cssH - bottom);
  g.stroke();
  g.textAlign = 'right';
  g.textBaseline = 'bottom';
  if (opts.xLabel) g.fillText(opts.xLabel, cssW - right, cssH - 1); // under the tick labels
  else g.fillText(stems ? 'n' : 't', cssW - right, cssH - bottom - 2);
  const map = { px, py, left, right: cssW - right, top, bottom: cssH - bottom,
    toX: (xx) => x0 + ((xx - left) / (cssW - left - right)) * (x1 - x0) };
  if (opts.decorate) { g.save(); opts.decorate(g, map); g.restore(); }
  if (Array.isArray(err) && !stems) errorBand(g, map, x, y, err);
  // the data
  g.strokeStyle = ink('chart-curve');
  g.fillStyle = ink('chart-curve');
  g.lineWidth = stems ? 1.2 : 1.8;
  if (stems) {
    const r = Math.max(1.5, Math.min(3.5, (cssW - left - right) / x.length / 3));
    x.forEach((n, i) => {
      if (y[i] === null) return;
      g.beginPath(); g.moveTo(px(n), py(0)); g.lineTo(px(n), py(y[i])); g.stroke();
      g.beginPath(); g.arc(px(n), py(y[i]), r, 0, 2 * Math.PI); g.fill();
    });
  } else {
    g.beginPath();
    let pen = false;
    x.forEach((t, i) => {
      if (y[i] === null) { pen = false; return; }
      if (pen) g.lineTo(px(t), py(y[i])); else g.moveTo(px(t), py(y[i]));
      pen = true;
    });
    g.stroke();
  }
  const c = opts.cursor;
  if (Number.isInteger(c) && c >= 0 && c < x.length && y[c] !== null) {
    const xx = Math.round(px(x[c])) + 0.5;
    g.strokeStyle = ink('chart-cursor');
    g.lineWidth = 1;
    g.beginPath(); g.moveTo(xx, top); g.lineTo(xx, cssH - bottom); g.stroke();
    g.fillStyle = ink('chart-mark');
    g.beginPath(); g.arc(px(x[c]), py(y[c]), 3.5, 0, 2 * Math.PI); g.fill();
  }
  return map;
}

/** The error band of a numerical inversion: y ± its error estimate, shaded under the line (clipped
 *  to the plotting box; a gap where a value or its estimate is missing). */
function errorBand(g, map, x, y, err) {
  g.save();
  g.beginPath();
  g.rect(map.left, map.top, map.right - map.left, map.bottom - map.top);
  g.clip();
  g.fillStyle = ink('chart-band');
  let run = [];
  const flush = () => {
    if (run.length > 1) {
      g.beginPath();
      run.forEach((i, k) => { const X = map.px(x[i]), Y = map.py(y[i] + err[i]); if (k) g.lineTo(X, Y); else g.moveTo(X, Y); });
      for (let k = run.length - 1; k >= 0; k--) { const i = run[k]; g.lineTo(map.px(x[i]), map.py(y[i] - err[i])); }
      g.closePath();
      g.fill();
    }
    run = [];
  };
  x.forEach((_, i) => { if (y[i] !== null && Number.isFinite(err[i])) run.push(i); else flush(); });
  flush();
  g.restore();
}

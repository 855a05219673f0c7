// The polar frequency plot: the image F(γ) of the encirclement contour γ in the F-plane, in
// contour order (ω from −∞ to +∞), with arrows in the direction of increasing ω, and the point
// the encirclements are counted about, marked. Two views: linear with equal scales on both axes
// (fitted to the point and the curve's finite part), or compressed, where every value w is drawn
// at w/(1 + |w|/R) so that the whole plane, infinity included, fits in the disc of radius R (the
// map keeps the directions and the order of the radii, so the turns about the point are the same).
import { sizedCanvas, niceTicks, tickText, nearestPixel } from './chart-kit.js';
import { fmtReal, fmtComplex } from './format.js';
import { ink } from './scheme.js';

/** The compression radius: R = 2 max(1, c), c the 75th percentile of |F| over the frequency grid
 *  (`fit.cap`), so that the curve's finite part keeps most of the disc; it does not depend on the
 *  point counted about, so picking a point does not rescale the view. */
export const compressionRadius = (fit) => 2 * Math.max(1, fit && Number.isFinite(fit.cap) ? fit.cap : 1);

/** w drawn at w/(1 + |w|/R) (compressed) or at w (linear). */
function squeeze(re, im, R) {
  const s = 1 / (1 + Math.hypot(re, im) / R);
  return [re * s, im * s];
}

/** The inverse of squeeze: a drawn position back to the value (null on or beyond the rim). */
function unsqueeze(x, y, R) {
  const r = Math.hypot(x, y);
  if (r >= R) return null;
  const s = 1 / (1 - r / R);
  return [x * s, y * s];
}

/** The linear view's box: the point, the origin and the curve, padded by 8 %: all of it when it
 *  is bounded (no detour around a pole on the contour), else its finite part: the samples no larger than a cap (3 max(1, |p|) or the 75th percentile of |F|, the
 *  larger); with `fit` {cap, wLo, wHi} (from the frequency response's grid, which spreads its
 *  points evenly over the decades where F changes) the cap is given and only the axis samples with
 *  wLo ≤ |ω| ≤ wHi count, so that the points crowded near a pole on the contour do not widen it. */
function linearBox(samples, about, fit) {
  const pMag = Math.max(1, Math.hypot(about[0], about[1]));
  // A curve with no detour (no pole on the contour) and a finite closing arc is bounded: all of it is shown.
  const axisMax = Math.max(0, ...samples.filter((s) => s.kind === 'axis' && s.re !== null).map((s) => Math.hypot(s.re, s.im)).filter(Number.isFinite));
  const bounded = !samples.some((s) => s.re === null || s.kind === 'indent' || (s.kind === 'closing' && !(Math.hypot(s.re, s.im) <= 2 * axisMax)));
  let cap;
  if (bounded) { cap = Infinity; fit = null; }
  else if (fit && Number.isFinite(fit.cap)) cap = Math.max(3 * pMag, fit.cap);
  else {
    const mags = samples.filter((s) => s.re !== null).map((s) => Math.hypot(s.re, s.im)).filter(Number.isFinite).sort((a, b) => a - b);
    cap = Math.max(3 * pMag, mags.length ? mags[Math.floor(0.75 * (mags.length - 1))] : 1);
  }
  const counts = (s) => !fit || (s.w !== null && Math.abs(s.w) >= fit.wLo && Math.abs(s.w) <= fit.wHi);
  let x0 = Math.min(0, about[0]), x1 = Math.max(0, about[0]), y0 = Math.min(0, about[1]), y1 = Math.max(0, about[1]);
  for (const s of samples) {
    if (s.re === null || !counts(s) || !(Math.hypot(s.re, s.im) <= cap)) continue;
    x0 = Math.min(x0, s.re); x1 = Math.max(x1, s.re); y0 = Math.min(y0, s.im); y1 = Math.max(y1, s.im);
  }
  const pad = 0.08 * Math.max(x1 - x0, y1 - y0, 1e-9);
  return [x0 - pad, x1 + pad, y0 - pad, y1 + pad];
}

/** Draw the chart from `data` {samples: [{re, im, w, kind}], about: [re, im], unit, fit} in `mode`
 *  ('linear' or 'compressed'; optional `labels` {styles, x, y} for the legend line and axis names) with the cursor at sample `cursor` (−1 none). Returns the mapping:
 *  {at(i) → [x, y] | null, toValue(x, y) → [re, im] | null}. */
export function drawPolarChart(canvas, data, mode = 'linear', cursor = -1) {
  const { g, cssW, cssH } = sizedCanvas(canvas, { minW: 220, minH: 260, maxH: 440, aspect: 0.78 });
  if (!data || !data.samples.length) return null;
  const { samples, about } = data;
  const squeezed = mode === 'compressed';
  const R = compressionRadius(data.fit);
  g.font = '11px system-ui, sans-serif';
  // what is shown, above the plot: the view, then the line styles (on two lines when narrow)
  const left = 44, right = 10, bottom = 30;
  const title = squeezed ? `Compressed view: w drawn at w/(1 + |w|/R), R = ${fmtReal(R, 4)}` : 'Linear view, equal scales';
  // `data.labels` {styles, x, y} replaces the frequency wording (the image curve of image-curve.js)
  const labels = data.labels || null;
  const styles = labels ? labels.styles : 'solid ω > 0, dashed ω < 0, brown: detours and closing arc';
  const lines = !labels && g.measureText(styles).width > cssW - left - right ? [title, 'solid ω > 0, dashed ω < 0', 'brown: detours and closing arc'] : [title, styles];
  const top = 4 + 13 * lines.length;
  const W = cssW - left - right, H = cssH - top - bottom;
  let [x0, x1, y0, y1] = squeezed ? [-1.06 * R, 1.06 * R, -1.06 * R, 1.06 * R] : linearBox(samples, about, data.fit);
  // equal scales: widen the shorter side about its centre
  const scale = Math.min(W / (x1 - x0), H / (y1 - y0));
  const cx = (x0 + x1) / 2, cy = (y0 + y1) / 2;
  x0 = cx - W / scale / 2; x1 = cx + W / scale / 2; y0 = cy - H / scale / 2; y1 = cy + H / scale / 2;
  const clampPx = (v) => Math.max(-1e5, Math.min(1e5, v));
  const px = (x) => clampPx(left + (x - x0) * scale), py = (y) => clampPx(top + (y1 - y) * scale);
  const place = (re, im) => { const [x, y] = squeezed ? squeeze(re, im, R) : [re, im]; return [px(x), py(y)]; };
  const pts = samples.map((s) => (s.re === null || !Number.isFinite(s.re) || !Number.isFinite(s.im) ? null : place(s.re, s.im)));

  // the grid: linear ticks, or rings at |F| = 0.5, 1, 2, 5, 10, … and the rim (|F| infinite)
  g.lineWidth = 1;
  g.fillStyle = ink('chart-text');
  g.save();
  g.beginPath(); g.rect(left, top, W, H); g.clip();
  if (!squeezed) {
    const xt = niceTicks(x0, x1, Math.max(3, Math.round(W / 70))), yt = niceTicks(y0, y1, Math.max(3, Math.round(H / 50)));
    g.strokeStyle = ink('chart-grid');
    for (const v of xt) { const xx = Math.round(px(v)) + 0.5; g.beginPath(); g.moveTo(xx, top); g.lineTo(xx, top + H); g.stroke(); }
    for (const v of yt) { const yy = Math.round(py(v)) + 0.5; g.beginPath(); g.moveTo(left, yy); g.lineTo(left + W, yy); g.stroke(); }
    g.restore();
    g.textAlign = 'center'; g.textBaseline = 'top';
    for (const v of xt) g.fillText(tickText(v), px(v), top + H + 4);
    g.textAlign = 'right'; g.textBaseline = 'middle';
    for (const v of yt) g.fillText(tickText(v), left - 4, py(v));
  } else {
    g.strokeStyle = ink('chart-grid');
    g.textAlign = 'left'; g.textBaseline = 'bottom';
    for (const r of [0.5, 1, 2, 5, 10, 100, 1000]) {
      const rr = (r / (1 + r / R)) * scale;
      g.beginPath(); g.arc(px(0), py(0), rr, 0, 2 * Math.PI); g.stroke();
      if (rr > 14 && R * scale - rr > 10) g.fillText(fmtReal(r, 3), px(0) + rr * 0.7071 + 2, py(0) - rr * 0.7071);
    }
    g.strokeStyle = ink('chart-axis');
    g.setLineDash([2, 3]);
    g.beginPath(); g.arc(px(0), py(0), R * scale, 0, 2 * Math.PI); g.stroke();
    g.setLineDash([]);
    g.fillStyle = ink('chart-text'); g.textAlign = 'left'; g.textBaseline = 'bottom';
    g.fillText('dotted rim: |F| infinite', left + 3, top + H - 3);
    g.restore();
  }
  // the axes Re F = 0, Im F = 0
  g.save();
  g.beginPath(); g.rect(left, top, W, H); g.clip();
  g.strokeStyle = ink('chart-axis');
  g.beginPath();
  g.moveTo(left, Math.round(py(0)) + 0.5); g.lineTo(left + W, Math.round(py(0)) + 0.5);
  g.moveTo(Math.round(px(0)) + 0.5, top); g.lineTo(Math.round(px(0)) + 0.5, top + H);
  g.stroke();

  // the curve, piece by piece: ω > 0 solid, ω < 0 dashed, the detours and the closing arc brown
  const look = (s) => (s.kind !== 'axis' ? [ink('chart-curve-3'), [5, 3], 1.4] : s.w !== null && s.w < 0 ? [ink('chart-curve-2'), [6, 3], 1.4] : [ink('chart-curve'), [], 1.8]);
  let i = 0;
  while (i < samples.length) {
    const [colour, dash, width] = look(samples[i]);
    const key = colour;
    let j = i;
    g.strokeStyle = colour; g.setLineDash(dash); g.lineWidth = width;
    g.beginPath();
    let pen = false;
    if (i > 0 && pts[i - 1] && pts[i] && !samples[i].gap) { g.moveTo(...pts[i - 1]); pen = true; }
    while (j < samples.length && look(samples[j])[0] === key) {
      const p = pts[j];
      if (samples[j].gap) pen = false;
      if (!p) pen = false; else if (pen) g.lineTo(...p); else { g.moveTo(...p); pen = true; }
      j++;
    }
    g.stroke();
    i = j;
  }
  g.setLineDash([]);
  // arrows along the curve (every ~90 px of drawn length) pointing the way ω increases
  g.fillStyle = ink('chart-curve');
  let run = 45;
  for (let k = 1; k < pts.length; k++) {
    const a = pts[k - 1], b = pts[k];
    if (!a || !b || samples[k].gap) continue;
    const dx = b[0] - a[0], dy = b[1] - a[1], d = Math.hypot(dx, dy);
    const inside = b[0] > left && b[0] < left + W && b[1] > top && b[1] < top + H;
    if (!inside || d > 200) continue;
    run -= d;
    if (run > 0 || d < 1e-6) continue;
    run = 90;
    const ux = dx / d, uy = dy / d;
    g.fillStyle = look(samples[k])[0];
    g.beginPath();
    g.moveTo(b[0] + 6 * ux, b[1] + 6 * uy);
    g.lineTo(b[0] - 4 * ux - 4 * uy, b[1] - 4 * uy + 4 * ux);
    g.lineTo(b[0] - 4 * ux + 4 * uy, b[1] - 4 * uy - 4 * ux);
    g.closePath(); g.fill();
  }
  // the point counted about: a red cross in a ring
  const [ax, ay] = place(about[0], about[1]);
  g.strokeStyle = ink('chart-mark'); g.lineWidth = 2;
  g.beginPath(); g.moveTo(ax - 6, ay - 6); g.lineTo(ax + 6, ay + 6); g.moveTo(ax - 6, ay + 6); g.lineTo(ax + 6, ay - 6); g.stroke();
  g.lineWidth = 1.2;
  g.beginPath(); g.arc(ax, ay, 8, 0, 2 * Math.PI); g.stroke();
  g.fillStyle = ink('chart-mark'); g.textAlign = 'left'; g.textBaseline = 'bottom';
  g.fillText('about ' + fmtComplex(about, 4), ax + 9, ay - 6);
  // the cursor
  if (cursor >= 0 && pts[cursor]) {
    const [cxp, cyp] = pts[cursor];
    g.strokeStyle = ink('chart-cursor'); g.lineWidth = 1;
    g.beginPath(); g.moveTo(cxp - 10, cyp); g.lineTo(cxp + 10, cyp); g.moveTo(cxp, cyp - 10); g.lineTo(cxp, cyp + 10); g.stroke();
    g.fillStyle = ink('chart-mark');
    g.beginPath(); g.arc(cxp, cyp, 3.5, 0, 2 * Math.PI); g.fill();
  }
  g.restore();
  g.strokeStyle = ink('chart-frame'); g.lineWidth = 1;
  g.strokeRect(left + 0.5, top + 0.5, W - 1, H - 1);
  // the lines above the plot and the axes' names
  g.textAlign = 'left'; g.textBaseline = 'top';
  lines.forEach((t, k) => { g.fillStyle = k ? ink('chart-text') : ink('chart-text-strong'); g.fillText(t, left, 2 + 13 * k); });
  g.textAlign = 'right'; g.textBaseline = 'bottom';
  g.fillText(labels ? labels.x : 'Re F', left + W, cssH - 2);
  g.save(); g.translate(10, top + H / 2); g.rotate(-Math.PI / 2); g.textAlign = 'center'; g.textBaseline = 'middle'; g.fillText(labels ? labels.y : 'Im F', 0, 0); g.restore();
  return {
    at: (k) => pts[k] || null,
    nearest: (x, y) => nearestPixel(pts.length, (k) => pts[k], x, y),
    toValue: (x, y) => {
      if (x < left || x > left + W || y < top || y > top + H) return null;
      const vx = x0 + (x - left) / scale, vy = y1 - (y - top) / scale;
      return squeezed ? unsqueeze(vx, vy, R) : [vx, vy];
    },
  };
}


// The frequency-response chart: the magnitude in dB above, the phase in degrees below, over
// a logarithmic frequency axis with a tick and a label at every decade. The data sit on the
// canvas (data-points: {omega, db, deg, unit, nyquist}) so that a resize or the pointer can
// redraw without asking the core again; `cursor` is the index the pointer is nearest.
import { fmtReal } from './format.js';
import { sizedCanvas, niceTicks, tickText } from './chart-kit.js';
import { ink } from './scheme.js';

/** Phase ticks: multiples of 45° or 90° (more for a wide span). */
function phaseTicks(lo, hi) {
  const span = hi - lo;
  const step = span <= 200 ? 45 : span <= 540 ? 90 : 180 * Math.ceil(span / 1080);
  const out = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-9; v += step) out.push(v);
  return out;
}

/** A decade as text: 0.01, 0.1, 1, 10, 100, 1000, then 1e4 … */
export function decadeText(k) {
  if (k >= -3 && k <= 3) return fmtReal(Math.pow(10, k), 4);
  return '1e' + String(k).replace('-', '−');
}

/** The index of the grid frequency nearest (on the log axis) to `w`. */
export function nearestIndex(omega, w) {
  let best = 0, bestD = Infinity;
  const lw = Math.log10(w);
  omega.forEach((x, i) => { const d = Math.abs(Math.log10(x) - lw); if (d < bestD) { bestD = d; best = i; } });
  return best;
}

/** Draw (or redraw) the chart from its data attribute; returns the x mapping for the pointer. */
export function drawBodeChart(canvas, cursor = -1) {
  const { g, cssW, cssH } = sizedCanvas(canvas, { minW: 200, minH: 260, maxH: 380, aspect: 0.62 });
  if (!canvas.dataset.points) return null;
  const { omega, db, deg, unit, nyquist } = JSON.parse(canvas.dataset.points);
  if (!omega.length) return null;
  const lx0 = Math.log10(omega[0]), lx1 = Math.log10(omega[omega.length - 1]) > lx0 ? Math.log10(omega[omega.length - 1]) : lx0 + 1;
  const range = (vals, minSpan) => {
    const f = vals.filter((v) => v !== null && Number.isFinite(v));
    if (!f.length) return [-1, 1];
    let lo = Math.min(...f), hi = Math.max(...f);
    if (hi - lo < minSpan) { const m = (hi + lo) / 2; lo = m - minSpan / 2; hi = m + minSpan / 2; }
    const pad = 0.06 * (hi - lo);
    return [lo - pad, hi + pad];
  };
  // a zero on the axis sends |F| to −∞: the magnitude pane shows at most 120 dB below its top
  const dbTop = Math.max(...db.filter((v) => v !== null && Number.isFinite(v)), -Infinity);
  const [dbLo, dbHi] = range(db.map((v) => (v !== null && Number.isFinite(v) ? Math.max(v, dbTop - 120) : null)), 10);
  const [phLo, phHi] = range(deg, 45);
  const dbT = niceTicks(dbLo, dbHi, 4, [1, 2, 2.5, 5, 10]);
  const phT = phaseTicks(phLo, phHi);
  g.font = '11px system-ui, sans-serif';
  const labelW = Math.max(...dbT.concat(phT).map((v) => g.measureText(tickText(v)).width));
  const left = 24 + labelW, right = 12, top = 8, gap = 26, bottom = 34;
  const paneH = (cssH - top - gap - bottom) / 2;
  const panes = [
    { y0: top, lo: dbLo, hi: dbHi, ticks: dbT, vals: db, name: '|F| (dB)' },
    { y0: top + paneH + gap, lo: phLo, hi: phHi, ticks: phT, vals: deg, name: 'phase (°)' },
  ];
  const px = (w) => left + ((Math.log10(w) - lx0) / (lx1 - lx0)) * (cssW - left - right);
  const decades = [];
  for (let k = Math.ceil(lx0 - 1e-9); k <= Math.floor(lx1 + 1e-9); k++) decades.push(k);
  for (const p of panes) {
    const py = (v) => p.y0 + ((p.hi - v) / (p.hi - p.lo)) * paneH;
    p.py = py;
    // the minor grid (2 … 9 in each decade), the decades, the value ticks
    g.lineWidth = 1;
    g.strokeStyle = ink('chart-grid-minor');
    for (let k = Math.floor(lx0); k <= Math.ceil(lx1); k++) {
      for (let m = 2; m <= 9; m++) {
        const l = k + Math.log10(m);
        if (l < lx0 || l > lx1) continue;
        const xx = Math.round(px(Math.pow(10, l))) + 0.5;
        g.beginPath(); g.moveTo(xx, p.y0); g.lineTo(xx, p.y0 + paneH); g.stroke();
      }
    }
    g.strokeStyle = ink('chart-grid');
    for (const k of decades) {
      const xx = Math.round(px(Math.pow(10, k))) + 0.5;
      g.beginPath(); g.moveTo(xx, p.y0); g.lineTo(xx, p.y0 + paneH); g.stroke();
    }
    g.fillStyle = ink('chart-text');
    g.textAlign = 'right';
    g.textBaseline = 'middle';
    for (const v of p.ticks) {
      const yy = Math.round(py(v)) + 0.5;
      g.strokeStyle = v === 0 ? ink('chart-axis') : ink('chart-grid');
      g.beginPath(); g.moveTo(left, yy); g.lineTo(cssW - right, yy); g.stroke();
      g.fillText(tickText(v), left - 4, yy);
    }
    g.strokeStyle = ink('chart-frame');
    g.strokeRect(left + 0.5, p.y0 + 0.5, cssW - left - right - 1, paneH - 1);
    // the pane's name, turned along its left edge
    g.save();
    g.translate(10, p.y0 + paneH / 2);
    g.rotate(-Math.PI / 2);
    g.textAlign = 'center';
    g.textBaseline = 'middle';
    g.fillStyle = ink('chart-text-strong');
    g.fillText(p.name, 0, 0);
    g.restore();
    // the curve; a null (a frequency at a pole) lifts the pen
    g.save();
    g.beginPath(); g.rect(left, p.y0, cssW - left - right, paneH); g.clip();
    g.strokeStyle = ink('chart-curve');
    g.lineWidth = 1.8;
    g.beginPath();
    let pen = false;
    omega.forEach((w, i) => {
      const v = p.vals[i];
      if (v === null || !Number.isFinite(v)) { pen = false; return; }
      if (pen) g.lineTo(px(w), py(v)); else g.moveTo(px(w), py(v));
      pen = true;
    });
    g.stroke();
    g.restore();
  }
  // decade labels under the lower pane, the axis name, the Nyquist frequency (z)
  g.fillStyle = ink('chart-text');
  g.textAlign = 'center';
  g.textBaseline = 'top';
  const axisY = panes[1].y0 + paneH + 4;
  for (const k of decades) g.fillText(decadeText(k), px(Math.pow(10, k)), axisY);
  for (const k of decades) g.fillText(decadeText(k), px(Math.pow(10, k)), panes[0].y0 + paneH + 4);
  g.textAlign = 'right';
  g.fillStyle = ink('chart-text-strong');
  g.fillText(unit === 'Hz' ? 'frequency f (Hz)' : 'frequency ω (rad/s)', cssW - right, axisY + 15);
  if (Number.isFinite(nyquist) && nyquist > 0) {
    const xx = Math.round(px(nyquist)) - 0.5;
    g.strokeStyle = ink('chart-warn');
    g.setLineDash([4, 3]);
    for (const p of panes) { g.beginPath(); g.moveTo(xx, p.y0); g.lineTo(xx, p.y0 + paneH); g.stroke(); }
    g.setLineDash([]);
    g.fillStyle = ink('chart-warn');
    g.textAlign = 'right';
    g.textBaseline = 'top';
    g.fillText('Nyquist', xx - 3, panes[0].y0 + 2);
  }
  // the pointer's cursor
  if (cursor >= 0 && cursor < omega.length) {
    const xx = Math.round(px(omega[cursor])) + 0.5;
    g.strokeStyle = ink('chart-cursor');
    g.lineWidth = 1;
    for (const p of panes) {
      g.beginPath(); g.moveTo(xx, p.y0); g.lineTo(xx, p.y0 + paneH); g.stroke();
      const v = p.vals[cursor];
      if (v !== null && Number.isFinite(v) && v >= p.lo && v <= p.hi) {
        g.fillStyle = ink('chart-mark');
        g.beginPath(); g.arc(xx, p.py(v), 3.5, 0, 2 * Math.PI); g.fill();
      }
    }
  }
  return { left, right: cssW - right, toFrequency: (x) => Math.pow(10, lx0 + ((x - left) / (cssW - left - right)) * (lx1 - lx0)) };
}

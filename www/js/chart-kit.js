// What the small charts share (the inverse transform's, the frequency response's): a canvas
// sized to its box at the device's pixel ratio, "nice" linear ticks, and tick labels.
import { fmtReal } from './format.js';

/** Size `canvas` to its parent's width (at least `minW`) and a height of `aspect` × width
 *  kept within [minH, maxH], at the device pixel ratio; returns the cleared 2-D context in
 *  CSS pixels with the size used. */
export function sizedCanvas(canvas, { minW, minH, maxH, aspect }) {
  const box = canvas.parentElement.getBoundingClientRect();
  const cssW = Math.max(minW, Math.floor(box.width));
  const cssH = Math.round(Math.min(maxH, Math.max(minH, cssW * aspect)));
  const dpr = window.devicePixelRatio || 1;
  canvas.style.height = cssH + 'px';
  canvas.width = Math.round(cssW * dpr);
  canvas.height = Math.round(cssH * dpr);
  const g = canvas.getContext('2d');
  g.setTransform(dpr, 0, 0, dpr, 0, 0);
  g.clearRect(0, 0, cssW, cssH);
  return { g, cssW, cssH };
}

/** "Nice" linear tick positions covering [lo, hi], about `count` of them, steps `steps` × 10^k. */
export function niceTicks(lo, hi, count, steps = [1, 2, 5, 10]) {
  const span = hi - lo;
  if (!(span > 0)) return [lo];
  const raw = span / count;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = steps.map((m) => m * mag).find((s) => s >= raw) || 10 * mag;
  const out = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return out;
}

/** A tick label: up to four significant digits, the page's minus sign. */
export const tickText = (v) => fmtReal(Number(v.toPrecision(6)), 4);

/** The cursor of a chart: the pointer picks the nearest sample, and the focused canvas
 *  (tabindex 0) moves it with ArrowLeft / ArrowRight (Shift: 10 samples), Home and End.
 *  `view` gives `count()` (samples now shown, 0 when none), `pick(x, y)` (the sample nearest the
 *  canvas point in CSS pixels, or −1), `draw(i)` (redraw with the cursor at i, −1 for none) and
 *  `read(i)` (the readout's text for sample i). The readout (an aria-live region) shows it.
 *  Returns {index, show(i), reset()}: reset forgets the cursor when new data arrive. */
export function attachCursor(canvas, readout, view) {
  const cur = { index: -1 };
  canvas.tabIndex = 0;
  readout.setAttribute('aria-live', 'polite');
  cur.show = (i) => {
    const n = view.count();
    if (!n) return;
    cur.index = Math.max(0, Math.min(n - 1, i));
    view.draw(cur.index);
    readout.textContent = view.read(cur.index);
  };
  cur.reset = () => { cur.index = -1; };
  canvas.addEventListener('pointermove', (ev) => {
    if (!view.count()) return;
    const r = canvas.getBoundingClientRect();
    const i = view.pick(ev.clientX - r.left, ev.clientY - r.top);
    if (i >= 0) cur.show(i);
  });
  canvas.addEventListener('keydown', (ev) => {
    const n = view.count();
    if (!n) return;
    const step = ev.shiftKey ? 10 : 1;
    const at = cur.index < 0 ? -1 : cur.index;
    let next;
    if (ev.key === 'ArrowRight') next = at < 0 ? 0 : at + step;
    else if (ev.key === 'ArrowLeft') next = at < 0 ? n - 1 : at - step;
    else if (ev.key === 'Home') next = 0;
    else if (ev.key === 'End') next = n - 1;
    else return;
    ev.preventDefault();
    cur.show(next);
  });
  return cur;
}

/** The index of the sample nearest to (x, y) among `n` samples whose canvas positions `at(i)`
 *  gives as [px, py] (or null for a sample not drawn); −1 when none is drawn. */
export function nearestPixel(n, at, x, y) {
  let best = -1, bestD = Infinity;
  for (let i = 0; i < n; i++) {
    const p = at(i);
    if (!p) continue;
    const d = (p[0] - x) ** 2 + (p[1] - y) ** 2;
    if (d < bestD) { bestD = d; best = i; }
  }
  return best;
}

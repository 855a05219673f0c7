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

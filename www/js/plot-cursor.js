// The keyboard cursor on the phase plot. With the plot focused, C shows a crosshair (C again or
// Escape hides it); while it shows, the arrow keys move it 4 CSS pixels (with Shift 40) instead
// of panning, and the view follows when it reaches an edge. Its readout (z, f(z), |f|, arg f) is
// the pointer readout's (readout.js), and a polite live region announces it, at most once every
// ANNOUNCE_MS (the last position is always announced). The canvas carries data-cursor: the
// crosshair's plane point as JSON, absent when hidden.
import { toScreen, viewBox } from './plot/view.js';

/** The shortest time between two announcements, in milliseconds. */
export const ANNOUNCE_MS = 600;
/** One arrow press moves the crosshair this many CSS pixels (with Shift ten times as far). */
export const CURSOR_STEP_PX = 4;

/** `readoutAt(point, told)` from createReadout; `live` the polite live region it speaks through. */
export function attachPlotCursor(page, readoutAt, live) {
  const plot = page.plot;
  const canvas = plot.canvas;
  let point = null;           // the crosshair's plane point, or null when hidden
  let last = -Infinity, timer = 0, pending = '';

  function speak() {
    timer = 0;
    last = performance.now();
    live.textContent = pending;
  }
  function announce(text) {
    pending = text;
    if (timer) return;
    const wait = last + ANNOUNCE_MS - performance.now();
    if (wait <= 0) speak(); else timer = setTimeout(speak, wait);
  }
  function show() {
    if (point) canvas.dataset.cursor = JSON.stringify(point); else delete canvas.dataset.cursor;
    plot.draw();
    if (point) readoutAt(point, announce);
  }
  function move(dx, dy) {
    point = [point[0] + dx, point[1] + dy];
    // keep the crosshair in sight: the view follows by the overshoot
    const [x0, x1, y0, y1] = viewBox(plot);
    const m = 2 * plot.scale;
    const sx = Math.min(0, point[0] - (x0 + m)) + Math.max(0, point[0] - (x1 - m));
    const sy = Math.min(0, point[1] - (y0 + m)) + Math.max(0, point[1] - (y1 - m));
    if (sx || sy) plot.show([x0 + sx, x1 + sx, y0 + sy, y1 + sy]);
    show();
  }

  const api = {
    get point() { return point; },
    /** A key on the focused plot: true when the cursor used it. */
    key(event) {
      const k = event.key;
      if ((k === 'c' || k === 'C') && !event.ctrlKey && !event.metaKey && !event.altKey) {
        point = point ? null : [plot.cx, plot.cy];
        if (!point) announce('Cursor hidden; the arrow keys pan the view.');
        show();
        return true;
      }
      if (!point) return false;
      if (k === 'Escape') { point = null; announce('Cursor hidden; the arrow keys pan the view.'); show(); return true; }
      if (event.altKey || event.ctrlKey || event.metaKey) return false;
      const step = (event.shiftKey ? 10 : 1) * CURSOR_STEP_PX * plot.scale;
      const d = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, step], ArrowDown: [0, -step] }[k];
      if (!d) return false;
      move(d[0], d[1]);
      return true;
    },
  };
  // the crosshair, drawn by the plot after its overlays: a dark cross on a light one, seen on any colour
  plot.overlayHooks = (plot.overlayHooks || []).concat([(ctx) => {
    if (!point) return;
    const [sx, sy] = toScreen(plot, point[0], point[1]);
    for (const [style, width] of [['rgba(255,255,255,0.95)', 4], ['#111', 1.5]]) {
      ctx.strokeStyle = style; ctx.lineWidth = width;
      ctx.beginPath();
      ctx.moveTo(sx - 14, sy); ctx.lineTo(sx - 4, sy); ctx.moveTo(sx + 4, sy); ctx.lineTo(sx + 14, sy);
      ctx.moveTo(sx, sy - 14); ctx.lineTo(sx, sy - 4); ctx.moveTo(sx, sy + 4); ctx.lineTo(sx, sy + 14);
      ctx.stroke();
    }
  }]);
  return api;
}

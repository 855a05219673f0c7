// The plot's view: which part of the plane the canvas shows (centre and complex
// units per CSS pixel), the transforms between the plane and canvas pixels, zoom
// about a point, and fitting the canvas to its box. Every function takes the plot
// object made by createPlot (www/js/plot.js).

/** Room around the picture for the tick labels and axis names, in CSS pixels. */
export const MARGIN = { left: 54, right: 10, top: 8, bottom: 34 };

/** The part of the plane shown: [x0, x1, y0, y1]. */
export function viewBox(plot) {
  return [plot.cx - plot.scale * plot.pw / 2, plot.cx + plot.scale * plot.pw / 2,
    plot.cy - plot.scale * plot.ph / 2, plot.cy + plot.scale * plot.ph / 2];
}

/** Plane point (x, y) to canvas CSS pixels. */
export function toScreen(plot, x, y) {
  const [x0, , , y1] = viewBox(plot);
  return [MARGIN.left + (x - x0) / plot.scale, MARGIN.top + (y1 - y) / plot.scale];
}

/** Canvas CSS pixels to the plane point under them. */
export function toPlane(plot, px, py) {
  const [x0, , , y1] = viewBox(plot);
  return [x0 + (px - MARGIN.left) * plot.scale, y1 - (py - MARGIN.top) * plot.scale];
}

/** Show at least the rectangle `v` = [x0, x1, y0, y1], centred. */
export function setView(plot, v) {
  plot.cx = (v[0] + v[1]) / 2;
  plot.cy = (v[2] + v[3]) / 2;
  plot.scale = Math.max((v[1] - v[0]) / plot.pw, (v[3] - v[2]) / plot.ph);
  if (!(plot.scale > 0) || !Number.isFinite(plot.scale)) plot.scale = 6 / plot.pw;
}

/** Scale the view by `factor`, keeping the plane point under the CSS pixel `at` (default: the
 *  centre) in place. False, and nothing changes, when the scale would leave the usable range. */
export function zoomAbout(plot, factor, at) {
  const [px, py] = at || [MARGIN.left + plot.pw / 2, MARGIN.top + plot.ph / 2];
  const [x, y] = toPlane(plot, px, py);
  const next = plot.scale * factor;
  if (!(next > 1e-13 && next < 1e12)) return false;
  plot.scale = next;
  // keep (x, y) under the pointer
  const [nx, ny] = toPlane(plot, px, py);
  plot.cx += x - nx;
  plot.cy += y - ny;
  return true;
}

/** Is the CSS pixel [x, y] on the picture (not in the margin)? */
export function insidePlot(plot, [x, y]) {
  return x >= MARGIN.left && x <= MARGIN.left + plot.pw && y >= MARGIN.top && y <= MARGIN.top + plot.ph;
}

/** Fit the canvas to its box; keeps the centre and the visible span. */
export function fitCanvas(plot) {
  const canvas = plot.canvas;
  const keep = plot.pw > 0 ? viewBox(plot) : null;
  // Fill the column's width; square-ish, but never taller than the window leaves room for
  // (the toolbar above and the readout below stay in sight, also inside a small iframe).
  const width = Math.max(200, Math.floor(canvas.parentElement.clientWidth || 400));
  const plotW = width - MARGIN.left - MARGIN.right;
  const room = (window.innerHeight || 800) - 150;
  const plotH = Math.round(Math.max(180, Math.min(plotW, room, 1100)));
  plot.cssW = width;
  plot.cssH = plotH + MARGIN.top + MARGIN.bottom;
  plot.pw = plotW;
  plot.ph = plotH;
  const dpr = window.devicePixelRatio || 1;
  canvas.width = Math.round(plot.cssW * dpr);
  canvas.height = Math.round(plot.cssH * dpr);
  canvas.style.height = plot.cssH + 'px';
  if (keep) setView(plot, keep);
}

// The phase-plot figure: one canvas showing the picture from the core, the axes
// with tick labels, the region outline and the singularity markers. The parts:
// plot/view.js (what part of the plane is shown, and the transforms), plot/render.js
// (progressive rendering through the core), plot/axes.js, plot/overlays.js (unit
// circle, region, markers, message) and plot/input.js (pan, zoom, pick).
import { viewBox, toPlane, setView, zoomAbout, fitCanvas, MARGIN } from './plot/view.js';
import { drawLayer, renderPlot, renderLive, scheduleRender, keepLastValid } from './plot/render.js';
import { drawAxes } from './plot/axes.js';
import { drawUnitCircle, drawRegion, drawMarkers, drawMessage, drawTrails, drawInfinityMarker, drawAnnulus, drawLastValid } from './plot/overlays.js';
import { attachInput } from './plot/input.js';
import { KIND_WORDS } from './markers.js';
import { regionWords } from './region.js';
import { drawIntegralContour } from './real-integral.js';
import { ink } from './scheme.js';

/** The plot on `canvas`. Hooks: baseRequest() (the request without view and size, or null while
 *  the core loads), onViewChange(view), onPointer(point | null), onMarkerClick(index), onStatus(what, error). */
export function createPlot(canvas, hooks) {
  const plot = {
    canvas, ctx: canvas.getContext('2d'),
    cx: 0, cy: 0, scale: 0.01,      // view centre and complex units per CSS pixel
    homeView: [-3, 3, -3, 3],
    cssW: 300, cssH: 300, pw: 200, ph: 200,
    coarse: null, fine: null,        // {canvas, box:[x0,x1,y0,y1], rowsDone, rows}
    message: '', busy: false,
    markers: [], selected: -1, region: null, axisName: 'z',
    trails: null,                    // pole trails to draw (trails.js), or null
    annulus: null,                   // the Laurent section's annulus {center, inner, outer}, drawn dashed (laurent-panel.js)
    infinityPoint: null,             // the kind of infinity, marked at w = 0 in the view at infinity: {kind, label} (laurent-panel.js)
    generation: 0, renderTimer: 0,
  };

  plot.getView = () => viewBox(plot);
  plot.toPlane = (px, py) => toPlane(plot, px, py);
  plot.setView = (v) => setView(plot, v);
  /** Fit the canvas to its box; keeps the centre and the visible span. */
  plot.resize = () => { fitCanvas(plot); plot.draw(); };
  /** Compose everything onto the canvas (cheap; no core calls). */
  plot.draw = () => drawPlot(plot);
  /** Ask the core for a new picture of the current view (coarse, then fine). */
  plot.render = () => renderPlot(plot, hooks);
  /** The phase_plot request without view and size (null while the core loads); export.js uses it. */
  plot.baseRequest = () => hooks.baseRequest();
  /** drawOverlays (below), for export.js's stand-in plots (no import of this module there). */
  plot.drawOverlays = drawOverlays;
  /** A quick coarse picture while dragging (resolves true when drawn). */
  plot.renderLive = () => renderLive(plot, hooks);
  /** The typed f is invalid: keep the last picture with a label naming its f (false: none). */
  plot.keepLastValid = () => keepLastValid(plot);
  /** Redraw soon (coalesces bursts of view changes). */
  plot.scheduleRender = (ms = 90) => scheduleRender(plot, ms);

  function viewChanged() {
    plot.draw();
    hooks.onViewChange && hooks.onViewChange(viewBox(plot));
    plot.scheduleRender();
  }
  plot.zoom = (factor, at) => { if (zoomAbout(plot, factor, at)) viewChanged(); };
  plot.reset = () => { setView(plot, plot.homeView); viewChanged(); };
  /** Show at least `v` = [x0, x1, y0, y1], as a pan or zoom would. */
  plot.show = (v) => { setView(plot, v); viewChanged(); };
  attachInput(plot, viewChanged, hooks);
  return plot;
}

function drawPlot(plot) {
  const ctx = plot.ctx;
  const dpr = plot.pixelRatio || window.devicePixelRatio || 1; // print.js draws at print resolution
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  ctx.clearRect(0, 0, plot.cssW, plot.cssH);
  ctx.fillStyle = ink('plot-bg');
  ctx.fillRect(0, 0, plot.cssW, plot.cssH);
  ctx.save();
  ctx.beginPath();
  ctx.rect(MARGIN.left, MARGIN.top, plot.pw, plot.ph);
  ctx.clip();
  ctx.fillStyle = ink('plot-empty');
  ctx.fillRect(MARGIN.left, MARGIN.top, plot.pw, plot.ph);
  ctx.imageSmoothingEnabled = true;
  drawLayer(plot, plot.coarse);
  // Crisp when the picture has one pixel per device pixel; smooth when it is scaled.
  const fineScale = plot.fine ? plot.fine.canvas.width / Math.max(1, (plot.fine.box[1] - plot.fine.box[0]) / plot.scale) : 1;
  ctx.imageSmoothingEnabled = Math.abs(fineScale - dpr) > 0.01;
  drawLayer(plot, plot.fine);
  drawOverlays(plot);
  for (const hook of plot.overlayHooks || []) hook(ctx); // e.g. the image curve's mark on γ
  drawMessage(plot);
  drawLastValid(plot);
  ctx.restore();
  drawAxes(plot);
}

/** What is drawn over the picture, on plot.ctx (CSS-pixel transform set): the unit circle, the
 *  region's contour, the real integral's contour, pole trails, the Laurent annulus, the markers
 *  and the marker of infinity. The page's plot and export.js's PNG and SVG share it. */
export function drawOverlays(plot) {
  drawUnitCircle(plot);
  drawRegion(plot);
  drawIntegralContour(plot);
  drawTrails(plot);
  drawAnnulus(plot);
  drawMarkers(plot);
  drawInfinityMarker(plot);
}

/** A short text description of the plot for screen readers; `v` names the plane's variable. */
export function plotDescription(plot, v, infinity) {
  const [x0, x1, y0, y1] = plot.getView();
  const counts = {};
  for (const it of plot.markers) counts[it.kind] = (counts[it.kind] || 0) + 1;
  const marked = Object.entries(counts).map(([k, c]) => `${c} ${KIND_WORDS[k]}${c === 1 ? '' : 's'}`).join(', ');
  return `Phase plot of f${infinity ? '(1/w)' : ''} for ${regionWords(v, { shape: 'rectangle', corners: [[x0, y0], [x1, y1]] })}: colour shows the argument of f.` +
    (marked ? ` Marked: ${marked}; see the singularities table.` : '');
}

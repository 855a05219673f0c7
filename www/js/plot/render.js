// Progressive rendering of the phase plot through the core: a quarter-resolution
// pass, then full-resolution row bands; a newer request abandons an older one.
// Each pass is a layer (an offscreen canvas with the plane box it covers), so
// while panning or zooming the last pictures are moved and scaled at once.
import { plotBands } from '../engine.js';
import { toScreen, viewBox } from './view.js';
import { functionWords } from '../format.js';

const BAND_PIXELS = 40000;
// Rendering costs per pixel (about 0.5–1.5 µs each in the core), so on high-DPI screens the
// picture is drawn at the device resolution only up to this many pixels, and scaled above it.
const PIXEL_BUDGET = 1.2e6;

/** Draw the rows of `layer` done so far where its box lies in the current view. */
export function drawLayer(plot, layer) {
  if (!layer) return;
  const [bx0, bx1, by0, by1] = layer.box;
  const [left, top] = toScreen(plot, bx0, by1);
  const w = (bx1 - bx0) / plot.scale;
  const h = (by1 - by0) / plot.scale;
  const rows = Math.min(layer.rowsDone, layer.canvas.height);
  if (rows <= 0) return;
  const frac = rows / layer.canvas.height;
  plot.ctx.drawImage(layer.canvas, 0, 0, layer.canvas.width, rows, left, top, w, h * frac);
}

function newLayer(w, h, b) {
  const c = document.createElement('canvas');
  c.width = w;
  c.height = h;
  return { canvas: c, ctx: c.getContext('2d'), box: b, rowsDone: 0 };
}

function putRows(layer, rows, rgba) {
  const w = layer.canvas.width;
  const [r0, r1] = rows || [0, layer.canvas.height];
  let first = r0, count = r1 - r0;
  if (rgba.length === w * layer.canvas.height * 4) { first = 0; count = layer.canvas.height; }
  if (rgba.length !== w * count * 4 || count <= 0) return false;
  const img = new ImageData(new Uint8ClampedArray(rgba.buffer, rgba.byteOffset, rgba.length), w, count);
  layer.ctx.putImageData(img, 0, first);
  layer.rowsDone = Math.max(layer.rowsDone, first + count);
  return true;
}

/** Ask the core for a new picture of the current view (coarse, then fine).
 *  `hooks.baseRequest()` gives the function and options (null: not ready); `hooks.onStatus`
 *  hears 'drawing', 'done' or 'error'. */
export async function renderPlot(plot, hooks) {
  clearTimeout(plot.renderTimer);
  const gen = ++plot.generation;
  const base = hooks.baseRequest();
  if (!base) return;
  const b = viewBox(plot);
  const dpr = window.devicePixelRatio || 1;
  const rs = Math.max(0.5, Math.min(dpr, Math.sqrt(PIXEL_BUDGET / Math.max(1, plot.pw * plot.ph))));
  const W = Math.max(1, Math.round(plot.pw * rs)), H = Math.max(1, Math.round(plot.ph * rs));
  const cw = Math.max(1, Math.ceil(W / 4)), ch = Math.max(1, Math.ceil(H / 4));
  plot.busy = true;
  hooks.onStatus && hooks.onStatus('drawing');
  const coarse = newLayer(cw, ch, b);
  const req = (w, h) => Object.assign({}, base, { task: 'phase_plot', view: b, size: [w, h], format: 'rgba' });
  const first = await plotBands(req(cw, ch), [null], (rows, rgba) => putRows(coarse, rows, rgba));
  if (gen !== plot.generation || first.stale) return;
  if (first.error) {
    plot.coarse = null; plot.fine = null;
    plot.message = 'No picture: ' + first.error.message;
    plot.busy = false;
    plot.draw();
    hooks.onStatus && hooks.onStatus('error', first.error);
    return;
  }
  plot.message = '';
  plot.coarse = coarse;
  pictureIsOf(plot, base);
  plot.fine = newLayer(W, H, b);
  const fine = plot.fine;
  plot.draw();
  const step = Math.max(2, Math.floor(BAND_PIXELS / W));
  const bands = [];
  for (let r = 0; r < H; r += step) bands.push([r, Math.min(H, r + step)]);
  const second = await plotBands(req(W, H), bands, (rows, rgba) => {
    if (gen !== plot.generation) return;
    putRows(fine, rows, rgba);
    plot.draw();
  });
  if (gen !== plot.generation || second.stale) return;
  plot.busy = false;
  if (second.error) {
    plot.message = 'Picture incomplete: ' + second.error.message;
    plot.draw();
    hooks.onStatus && hooks.onStatus('error', second.error);
    return;
  }
  hooks.onStatus && hooks.onStatus('done');
}

/** Render after `ms` milliseconds (coalesces bursts of view changes). */
export function scheduleRender(plot, ms) {
  clearTimeout(plot.renderTimer);
  plot.renderTimer = setTimeout(plot.render, ms);
}

/** The live picture while something is being dragged: one coarse pass (a quarter of the
 *  resolution, `LIVE_DIVISOR`), no fine bands; a newer call abandons an older one.
 *  Resolves true when this picture was drawn (false: superseded or failed). */
export const LIVE_DIVISOR = 4;
export async function renderLive(plot, hooks) {
  clearTimeout(plot.renderTimer);
  const gen = ++plot.generation;
  const base = hooks.baseRequest();
  if (!base) return false;
  const b = viewBox(plot);
  const cw = Math.max(1, Math.ceil(plot.pw / LIVE_DIVISOR)), ch = Math.max(1, Math.ceil(plot.ph / LIVE_DIVISOR));
  const layer = newLayer(cw, ch, b);
  const req = Object.assign({}, base, { task: 'phase_plot', view: b, size: [cw, ch], format: 'rgba' });
  const out = await plotBands(req, [null], (rows, rgba) => putRows(layer, rows, rgba));
  if (gen !== plot.generation || out.stale || out.error) return false;
  plot.message = '';
  plot.coarse = layer;
  pictureIsOf(plot, base);
  plot.fine = null;
  plot.draw();
  return true;
}

/** The picture now drawn is of `base`'s f: the "last valid f" label, if any, goes. */
function pictureIsOf(plot, base) {
  plot.pictureOf = functionWords(base);
  plot.lastValid = false;
  plot.canvas.dataset.pictureOf = plot.pictureOf;
  if (plot.canvas.dataset.lastValid !== undefined) plot.canvas.setAttribute('aria-label', 'Phase plot');
  delete plot.canvas.dataset.lastValid;
}

/** The typed f cannot be drawn: keep the last picture, labelled with the f it shows (the label
 *  stays until a picture of a valid f replaces it). False when there is no picture to keep. */
export function keepLastValid(plot) {
  if (!plot.coarse || !plot.pictureOf) return false;
  plot.lastValid = true;
  plot.canvas.dataset.lastValid = plot.pictureOf;
  plot.canvas.setAttribute('aria-label', `Phase plot of the last valid f, ${plot.pictureOf}; the typed f has an error`);
  plot.draw();
  return true;
}

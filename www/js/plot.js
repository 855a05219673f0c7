// The phase-plot figure: one canvas showing the picture from the core, the axes
// with tick labels, the region outline and the singularity markers.
// Drawing is progressive: a quarter-resolution pass, then full-resolution row
// bands; a newer request abandons an older one. While panning or zooming the
// last pictures are moved and scaled at once, and the core redraws after.
import { plotBands } from './engine.js';
import { cInv } from './complex.js';
import { fmtReal } from './format.js';

const MARGIN = { left: 54, right: 10, top: 8, bottom: 34 };
const BAND_PIXELS = 40000;
// Rendering costs per pixel (about 0.5–1.5 µs each in the core), so on high-DPI screens the
// picture is drawn at the device resolution only up to this many pixels, and scaled above it.
const PIXEL_BUDGET = 1.2e6;

/** Nice tick spacing for a span shown across `pixels`. */
function tickStep(span, pixels) {
  const target = span / Math.max(2, pixels / 70);
  const p = Math.pow(10, Math.floor(Math.log10(target)));
  for (const m of [1, 2, 5, 10]) if (m * p >= target) return m * p;
  return 10 * p;
}

function tickLabel(v, step) {
  if (Math.abs(v) < step * 1e-6) return '0';
  const digits = Math.max(0, -Math.floor(Math.log10(step)));
  if (Math.abs(v) >= 1e5 || Math.abs(v) < 1e-4) return fmtReal(v, 3);
  return v.toFixed(Math.min(digits, 10)).replace('-', '−');
}

export function createPlot(canvas, hooks) {
  const ctx = canvas.getContext('2d');
  const plot = {
    cx: 0, cy: 0, scale: 0.01,      // view centre and complex units per CSS pixel
    homeView: [-3, 3, -3, 3],
    cssW: 300, cssH: 300, pw: 200, ph: 200,
    coarse: null, fine: null,        // {canvas, box:[x0,x1,y0,y1], rowsDone, rows}
    message: '', busy: false,
    markers: [], selected: -1, region: null, axisName: 'z',
    generation: 0,
  };
  let renderTimer = 0;

  function box() {
    return [plot.cx - plot.scale * plot.pw / 2, plot.cx + plot.scale * plot.pw / 2,
      plot.cy - plot.scale * plot.ph / 2, plot.cy + plot.scale * plot.ph / 2];
  }
  plot.getView = box;

  function toScreen(x, y) {
    const [x0, , , y1] = box();
    return [MARGIN.left + (x - x0) / plot.scale, MARGIN.top + (y1 - y) / plot.scale];
  }
  function toPlane(px, py) {
    const [x0, , , y1] = box();
    return [x0 + (px - MARGIN.left) * plot.scale, y1 - (py - MARGIN.top) * plot.scale];
  }
  plot.toPlane = toPlane;

  plot.setView = function (v) {
    plot.cx = (v[0] + v[1]) / 2;
    plot.cy = (v[2] + v[3]) / 2;
    plot.scale = Math.max((v[1] - v[0]) / plot.pw, (v[3] - v[2]) / plot.ph);
    if (!(plot.scale > 0) || !Number.isFinite(plot.scale)) plot.scale = 6 / plot.pw;
  };

  /** Fit the canvas to its box; keeps the centre and the visible span. */
  plot.resize = function () {
    const keep = plot.pw > 0 ? box() : null;
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
    if (keep) plot.setView(keep);
    plot.draw();
  };

  // ---- drawing ---------------------------------------------------------------

  function drawLayer(layer) {
    if (!layer) return;
    const [bx0, bx1, by0, by1] = layer.box;
    const [left, top] = toScreen(bx0, by1);
    const w = (bx1 - bx0) / plot.scale;
    const h = (by1 - by0) / plot.scale;
    const rows = Math.min(layer.rowsDone, layer.canvas.height);
    if (rows <= 0) return;
    const frac = rows / layer.canvas.height;
    ctx.drawImage(layer.canvas, 0, 0, layer.canvas.width, rows, left, top, w, h * frac);
  }

  function drawMarker(kind, x, y, selected) {
    ctx.save();
    ctx.lineWidth = 2;
    if (selected) {
      ctx.strokeStyle = '#fff';
      ctx.lineWidth = 5;
      ctx.beginPath(); ctx.arc(x, y, 12, 0, 2 * Math.PI); ctx.stroke();
      ctx.strokeStyle = '#111';
      ctx.lineWidth = 2;
      ctx.beginPath(); ctx.arc(x, y, 12, 0, 2 * Math.PI); ctx.stroke();
    }
    markerPath(ctx, kind, x, y);
    ctx.restore();
  }

  function drawMarkers() {
    plot.markers.forEach((m, i) => {
      let p = m.at;
      if (plot.infinityMode) {
        if (p[0] === 0 && p[1] === 0) return;
        p = cInv(p);
      }
      const [x, y] = toScreen(p[0], p[1]);
      if (x < MARGIN.left - 10 || x > MARGIN.left + plot.pw + 10 || y < MARGIN.top - 10 || y > MARGIN.top + plot.ph + 10) return;
      drawMarker(m.kind, x, y, i === plot.selected);
      if (m.order > 1) {
        ctx.font = 'bold 12px system-ui, sans-serif';
        ctx.lineWidth = 3;
        ctx.strokeStyle = 'rgba(255,255,255,0.9)';
        ctx.fillStyle = '#111';
        ctx.strokeText(String(m.order), x + 8, y - 7);
        ctx.fillText(String(m.order), x + 8, y - 7);
      }
    });
  }

  /** A faint dotted unit circle in the z-plane (where |z| = 1 matters for discrete time). */
  function drawUnitCircle() {
    if (!plot.unitCircle) return;
    const [sx, sy] = toScreen(0, 0);
    ctx.save();
    ctx.setLineDash([2, 4]);
    ctx.lineWidth = 1;
    ctx.strokeStyle = 'rgba(0,0,0,0.45)';
    ctx.beginPath();
    ctx.arc(sx, sy, 1 / plot.scale, 0, 2 * Math.PI);
    ctx.stroke();
    ctx.restore();
  }

  /** The region's boundary: the contour of the contour integral, a thin outline with small
   *  arrowheads showing its counter-clockwise direction (dark with a light edge, so it reads on any colour). */
  function drawRegion() {
    const r = plot.region;
    if (!r || plot.infinityMode) return;
    const arrows = []; // [x, y, dx, dy] on the screen: a point on the outline and the direction of travel
    ctx.save();
    ctx.beginPath();
    if (r.shape === 'rectangle') {
      const [[ax, ay], [bx, by]] = r.corners;
      const [sx0, sy0] = toScreen(Math.min(ax, bx), Math.max(ay, by)); // top left
      const [sx1, sy1] = toScreen(Math.max(ax, bx), Math.min(ay, by)); // bottom right
      ctx.rect(sx0, sy0, sx1 - sx0, sy1 - sy0);
      const mx = (sx0 + sx1) / 2, my = (sy0 + sy1) / 2;
      // Counter-clockwise in the plane: along the bottom to the right, up the right side, ...
      arrows.push([mx, sy1, 1, 0], [sx1, my, 0, -1], [mx, sy0, -1, 0], [sx0, my, 0, 1]);
    } else if (r.shape === 'circle') {
      const [sx, sy] = toScreen(r.center[0], r.center[1]);
      const rad = r.radius / plot.scale;
      ctx.arc(sx, sy, rad, 0, 2 * Math.PI);
      for (const t of [Math.PI / 4, (3 * Math.PI) / 4, (5 * Math.PI) / 4, (7 * Math.PI) / 4]) {
        // the point at angle t in the plane, and the tangent (−sin t, cos t), with y flipped
        arrows.push([sx + rad * Math.cos(t), sy - rad * Math.sin(t), -Math.sin(t), -Math.cos(t)]);
      }
    }
    ctx.lineWidth = 3;
    ctx.strokeStyle = 'rgba(255,255,255,0.75)';
    ctx.stroke();
    ctx.lineWidth = 1.25;
    ctx.strokeStyle = 'rgba(15,15,15,0.9)';
    ctx.stroke();
    const size = 6;
    for (const [x, y, dx, dy] of arrows) {
      ctx.beginPath();
      ctx.moveTo(x + dx * size, y + dy * size);
      ctx.lineTo(x - dx * size - dy * size * 0.75, y - dy * size + dx * size * 0.75);
      ctx.lineTo(x - dx * size + dy * size * 0.75, y - dy * size - dx * size * 0.75);
      ctx.closePath();
      ctx.fillStyle = 'rgba(15,15,15,0.9)';
      ctx.lineWidth = 1.5;
      ctx.strokeStyle = 'rgba(255,255,255,0.85)';
      ctx.stroke();
      ctx.fill();
    }
    ctx.restore();
  }

  function drawAxes() {
    const [x0, x1, y0, y1] = box();
    const L = MARGIN.left, T = MARGIN.top, W = plot.pw, H = plot.ph;
    ctx.save();
    // Zero lines inside the plot.
    ctx.strokeStyle = 'rgba(0,0,0,0.35)';
    ctx.lineWidth = 1;
    ctx.beginPath();
    if (x0 < 0 && x1 > 0) { const [sx] = toScreen(0, 0); ctx.moveTo(sx, T); ctx.lineTo(sx, T + H); }
    if (y0 < 0 && y1 > 0) { const [, sy] = toScreen(0, 0); ctx.moveTo(L, sy); ctx.lineTo(L + W, sy); }
    ctx.stroke();
    // Frame.
    ctx.strokeStyle = '#333';
    ctx.strokeRect(L + 0.5, T + 0.5, W - 1, H - 1);
    // Ticks and labels.
    ctx.fillStyle = '#222';
    ctx.font = '12px system-ui, -apple-system, "Segoe UI", sans-serif';
    const sx = tickStep(x1 - x0, W);
    ctx.textAlign = 'center';
    ctx.textBaseline = 'top';
    for (let v = Math.ceil(x0 / sx) * sx; v <= x1 + sx * 1e-9; v += sx) {
      const [px] = toScreen(v, 0);
      ctx.beginPath(); ctx.moveTo(px, T + H); ctx.lineTo(px, T + H + 5); ctx.stroke();
      ctx.fillText(tickLabel(v, sx), px, T + H + 7);
    }
    const sy = tickStep(y1 - y0, H);
    ctx.textAlign = 'right';
    ctx.textBaseline = 'middle';
    for (let v = Math.ceil(y0 / sy) * sy; v <= y1 + sy * 1e-9; v += sy) {
      const [, py] = toScreen(0, v);
      ctx.beginPath(); ctx.moveTo(L - 5, py); ctx.lineTo(L, py); ctx.stroke();
      const label = tickLabel(v, sy);
      ctx.fillText(label === '0' ? '0' : label + 'i', L - 7, py);
    }
    // Axis names.
    ctx.textAlign = 'right';
    ctx.textBaseline = 'bottom';
    ctx.font = 'italic 12px system-ui, sans-serif';
    ctx.fillText('Re ' + plot.axisName, L + W, plot.cssH - 1);
    ctx.save();
    ctx.translate(11, T + 4);
    ctx.rotate(-Math.PI / 2);
    ctx.textAlign = 'right';
    ctx.textBaseline = 'middle';
    ctx.fillText('Im ' + plot.axisName, 0, 0);
    ctx.restore();
    ctx.restore();
  }

  /** Compose everything onto the canvas (cheap; no core calls). */
  plot.draw = function () {
    const dpr = window.devicePixelRatio || 1;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, plot.cssW, plot.cssH);
    ctx.fillStyle = '#fff';
    ctx.fillRect(0, 0, plot.cssW, plot.cssH);
    ctx.save();
    ctx.beginPath();
    ctx.rect(MARGIN.left, MARGIN.top, plot.pw, plot.ph);
    ctx.clip();
    ctx.fillStyle = '#e9ebee';
    ctx.fillRect(MARGIN.left, MARGIN.top, plot.pw, plot.ph);
    ctx.imageSmoothingEnabled = true;
    drawLayer(plot.coarse);
    // Crisp when the picture has one pixel per device pixel; smooth when it is scaled.
    const fineScale = plot.fine ? plot.fine.canvas.width / Math.max(1, (plot.fine.box[1] - plot.fine.box[0]) / plot.scale) : 1;
    ctx.imageSmoothingEnabled = Math.abs(fineScale - dpr) > 0.01;
    drawLayer(plot.fine);
    drawUnitCircle();
    drawRegion();
    drawMarkers();
    if (plot.message) {
      ctx.fillStyle = 'rgba(255,255,255,0.88)';
      ctx.fillRect(MARGIN.left, MARGIN.top + plot.ph / 2 - 30, plot.pw, 60);
      ctx.fillStyle = '#333';
      ctx.font = '14px system-ui, sans-serif';
      ctx.textAlign = 'center';
      ctx.textBaseline = 'middle';
      wrapText(ctx, plot.message, MARGIN.left + plot.pw / 2, MARGIN.top + plot.ph / 2, plot.pw - 24, 18);
    }
    ctx.restore();
    drawAxes();
  };

  // ---- rendering through the core -------------------------------------------

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

  /** Ask the core for a new picture of the current view (coarse, then fine). */
  plot.render = async function () {
    clearTimeout(renderTimer);
    const gen = ++plot.generation;
    const base = hooks.baseRequest();
    if (!base) return;
    const b = box();
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
  };

  /** Redraw soon (coalesces bursts of view changes). */
  plot.scheduleRender = function (ms = 90) {
    clearTimeout(renderTimer);
    renderTimer = setTimeout(plot.render, ms);
  };

  // ---- interaction -------------------------------------------------------------

  function viewChanged() {
    plot.draw();
    hooks.onViewChange && hooks.onViewChange(box());
    plot.scheduleRender();
  }

  plot.zoom = function (factor, at) {
    const [px, py] = at || [MARGIN.left + plot.pw / 2, MARGIN.top + plot.ph / 2];
    const [x, y] = toPlane(px, py);
    const next = plot.scale * factor;
    if (!(next > 1e-13 && next < 1e12)) return;
    plot.scale = next;
    // keep (x, y) under the pointer
    const [nx, ny] = toPlane(px, py);
    plot.cx += x - nx;
    plot.cy += y - ny;
    viewChanged();
  };

  plot.reset = function () {
    plot.setView(plot.homeView);
    viewChanged();
  };

  const pointers = new Map();
  let dragStart = null, pinchStart = null, moved = false;

  function localPos(event) {
    const r = canvas.getBoundingClientRect();
    return [event.clientX - r.left, event.clientY - r.top];
  }
  function insidePlot([x, y]) {
    return x >= MARGIN.left && x <= MARGIN.left + plot.pw && y >= MARGIN.top && y <= MARGIN.top + plot.ph;
  }

  canvas.addEventListener('pointerdown', (event) => {
    const pos = localPos(event);
    if (!insidePlot(pos) && pointers.size === 0) return;
    canvas.setPointerCapture(event.pointerId);
    pointers.set(event.pointerId, pos);
    moved = false;
    if (pointers.size === 1) dragStart = { pos, cx: plot.cx, cy: plot.cy };
    if (pointers.size === 2) {
      const [a, b] = [...pointers.values()];
      pinchStart = { dist: Math.hypot(a[0] - b[0], a[1] - b[1]), scale: plot.scale };
    }
  });

  canvas.addEventListener('pointermove', (event) => {
    const pos = localPos(event);
    if (pointers.has(event.pointerId)) {
      pointers.set(event.pointerId, pos);
      if (pointers.size === 2 && pinchStart) {
        const [a, b] = [...pointers.values()];
        const d = Math.hypot(a[0] - b[0], a[1] - b[1]);
        if (d > 4) {
          const mid = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
          plot.zoom((pinchStart.scale * pinchStart.dist / d) / plot.scale, mid);
          moved = true;
        }
      } else if (dragStart) {
        const dx = pos[0] - dragStart.pos[0], dy = pos[1] - dragStart.pos[1];
        if (Math.abs(dx) + Math.abs(dy) > 3) moved = true;
        if (moved) {
          plot.cx = dragStart.cx - dx * plot.scale;
          plot.cy = dragStart.cy + dy * plot.scale;
          viewChanged();
        }
      }
    }
    hooks.onPointer && hooks.onPointer(insidePlot(pos) ? toPlane(pos[0], pos[1]) : null);
  });

  function endPointer(event) {
    if (!pointers.has(event.pointerId)) return;
    const pos = pointers.get(event.pointerId);
    pointers.delete(event.pointerId);
    if (pointers.size < 2) pinchStart = null;
    if (pointers.size === 1) {
      const [p] = [...pointers.values()];
      dragStart = { pos: p, cx: plot.cx, cy: plot.cy };
    }
    if (pointers.size === 0) {
      dragStart = null;
      if (!moved && event.type === 'pointerup') clickAt(pos);
    }
  }
  canvas.addEventListener('pointerup', endPointer);
  canvas.addEventListener('pointercancel', endPointer);
  canvas.addEventListener('pointerleave', () => { if (pointers.size === 0) hooks.onPointer && hooks.onPointer(null); });

  canvas.addEventListener('wheel', (event) => {
    const pos = localPos(event);
    if (!insidePlot(pos)) return;
    event.preventDefault();
    const unit = event.deltaMode === 1 ? 33 : event.deltaMode === 2 ? 400 : 1;
    const dy = Math.max(-300, Math.min(300, event.deltaY * unit));
    plot.zoom(Math.pow(1.0015, dy), pos);
  }, { passive: false });

  function clickAt(pos) {
    let best = -1, bestD = 14;
    plot.markers.forEach((m, i) => {
      let p = m.at;
      if (plot.infinityMode) { if (p[0] === 0 && p[1] === 0) return; p = cInv(p); }
      const [x, y] = toScreen(p[0], p[1]);
      const d = Math.hypot(x - pos[0], y - pos[1]);
      if (d < bestD) { bestD = d; best = i; }
    });
    if (best >= 0 && hooks.onMarkerClick) hooks.onMarkerClick(best);
  }

  canvas.addEventListener('keydown', (event) => {
    const k = event.key;
    const pan = 40 * plot.scale;
    if (k === '+' || k === '=') plot.zoom(1 / 1.25);
    else if (k === '-' || k === '_') plot.zoom(1.25);
    else if (k === 'ArrowLeft') { plot.cx -= pan; viewChanged(); }
    else if (k === 'ArrowRight') { plot.cx += pan; viewChanged(); }
    else if (k === 'ArrowUp') { plot.cy += pan; viewChanged(); }
    else if (k === 'ArrowDown') { plot.cy -= pan; viewChanged(); }
    else if (k === '0') plot.reset();
    else return;
    event.preventDefault();
  });

  return plot;
}

/** Centered text wrapped to `width`, for messages over the plot. */
function wrapText(ctx, text, x, y, width, lineHeight) {
  const words = String(text).split(/\s+/);
  const lines = [];
  let line = '';
  for (const w of words) {
    const t = line ? line + ' ' + w : w;
    if (ctx.measureText(t).width > width && line) { lines.push(line); line = w; } else line = t;
  }
  if (line) lines.push(line);
  const shown = lines.slice(0, 3);
  shown.forEach((l, i) => ctx.fillText(l, x, y + (i - (shown.length - 1) / 2) * lineHeight));
}

/** Our own marker shapes: pole = hollow diamond, zero = dot inside a ring,
 *  essential = eight-point burst, branch point = hollow triangle, removable = small hollow square. */
export function markerPath(ctx, kind, x, y) {
  ctx.lineJoin = 'round';
  const halo = () => { ctx.strokeStyle = 'rgba(255,255,255,0.95)'; ctx.lineWidth = 4; ctx.stroke(); ctx.strokeStyle = '#111'; ctx.lineWidth = 2; ctx.stroke(); };
  ctx.beginPath();
  if (kind === 'pole') {
    ctx.moveTo(x, y - 7); ctx.lineTo(x + 7, y); ctx.lineTo(x, y + 7); ctx.lineTo(x - 7, y); ctx.closePath();
    halo();
  } else if (kind === 'zero') {
    ctx.arc(x, y, 6, 0, 2 * Math.PI);
    halo();
    ctx.beginPath(); ctx.arc(x, y, 2.4, 0, 2 * Math.PI); ctx.fillStyle = '#111'; ctx.fill();
  } else if (kind === 'essential') {
    for (let k = 0; k < 8; k++) {
      const a = (k * Math.PI) / 4, r = k % 2 ? 4 : 8;
      ctx.moveTo(x, y); ctx.lineTo(x + r * Math.cos(a), y + r * Math.sin(a));
    }
    halo();
  } else if (kind === 'branch') {
    ctx.moveTo(x, y - 7); ctx.lineTo(x + 7, y + 5); ctx.lineTo(x - 7, y + 5); ctx.closePath();
    halo();
  } else {
    ctx.rect(x - 4.5, y - 4.5, 9, 9);
    halo();
  }
}

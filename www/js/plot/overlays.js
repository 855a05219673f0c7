// What the plot draws over the picture: the unit circle of the z-plane, the
// region's outline with its direction and the contour editor's handles, the singularity markers, and a message.
import { cInv } from '../complex.js';
import { drawMarker } from '../markers.js';
import { MARGIN, toScreen } from './view.js';
import { contourPath } from '../contour-geom.js';

/** A faint dotted unit circle in the z-plane (where |z| = 1 matters for discrete time). */
export function drawUnitCircle(plot) {
  if (!plot.unitCircle) return;
  const ctx = plot.ctx;
  const [sx, sy] = toScreen(plot, 0, 0);
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
 *  arrowheads showing its direction (dark with a light edge, so it reads on any colour): the
 *  core's direction (contourPath) times plot.regionDirection's sign for shapes other than a polygon
 *  (whose vertex order is its direction). Then the contour editor's handles (plot.contourEdit). */
export function drawRegion(plot) {
  const r = plot.region;
  if (plot.infinityMode) return;
  if (r) {
    const ctx = plot.ctx;
    let path = contourPath(r, 128).map(([x, y]) => toScreen(plot, x, y));
    const reversed = r.shape !== 'polygon' && plot.regionDirection < 0;
    if (reversed) path = path.reverse();
    const n = path.length;
    ctx.save();
    ctx.beginPath();
    path.forEach(([x, y], i) => (i ? ctx.lineTo(x, y) : ctx.moveTo(x, y)));
    ctx.closePath();
    ctx.lineWidth = 3;
    ctx.strokeStyle = 'rgba(255,255,255,0.75)';
    ctx.stroke();
    ctx.lineWidth = 1.25;
    ctx.strokeStyle = 'rgba(15,15,15,0.9)';
    ctx.stroke();
    // arrowheads: at the middle of each side of a rectangle or polygon, at four points of a circle or ellipse
    const at = r.shape === 'circle' || r.shape === 'ellipse'
      ? [0.125, 0.375, 0.625, 0.875].map((u) => [Math.floor(u * n), 0.5])
      : r.shape === 'half_disc' || r.shape === 'keyhole'
        ? (r.shape === 'half_disc' ? [0.05, 0.15, 0.4, 0.6, 0.8] : [0.035, 0.25, 0.5, 0.675, 0.85]).map((u) => [Math.floor(u * n), 0.5])
      : path.map((_, k) => [k, 0.5]);
    const size = 6;
    for (const [k, u] of at) {
      const a = path[k], b = path[(k + 1) % n];
      let dx = b[0] - a[0], dy = b[1] - a[1];
      const len = Math.hypot(dx, dy);
      if (!(len > 0)) continue;
      dx /= len; dy /= len;
      const x = a[0] + u * (b[0] - a[0]), y = a[1] + u * (b[1] - a[1]);
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
  if (plot.contourEdit) plot.contourEdit.drawOverlay(plot.ctx);
}

/** Where marker `m` sits on the canvas, or null (the origin has no image in the view around infinity). */
export function markerScreenPoint(plot, m) {
  let p = m.at;
  if (plot.infinityMode) {
    if (p[0] === 0 && p[1] === 0) return null;
    p = cInv(p);
  }
  return toScreen(plot, p[0], p[1]);
}

/** Above this many markers, a marker whose kind was already drawn within the same
 *  MARKER_CELL-pixel cell is skipped: thousands of poles on a small circle would otherwise be
 *  drawn on top of each other (a marker is 12 pixels wide), one frame taking far over 50 ms. */
export const MARKER_THIN_FROM = 300;
const MARKER_CELL = 4;

/** Every marker in (or just outside) the view, the chosen one ringed, orders above 1 written beside. */
export function drawMarkers(plot) {
  const ctx = plot.ctx;
  const thin = plot.markers.length >= MARKER_THIN_FROM;
  const drawn = thin ? new Set() : null;
  plot.markers.forEach((m, i) => {
    const at = markerScreenPoint(plot, m);
    if (!at) return;
    const [x, y] = at;
    if (x < MARGIN.left - 10 || x > MARGIN.left + plot.pw + 10 || y < MARGIN.top - 10 || y > MARGIN.top + plot.ph + 10) return;
    if (thin && i !== plot.selected) {
      const key = `${m.kind}|${m.order}|${Math.round(x / MARKER_CELL)}|${Math.round(y / MARKER_CELL)}`;
      if (drawn.has(key)) return;
      drawn.add(key);
    }
    drawMarker(ctx, m.kind, x, y, i === plot.selected);
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

/** The index of the marker nearest the CSS pixel `pos` within 14 pixels, or −1. */
export function markerAt(plot, pos) {
  let best = -1, bestD = 14;
  plot.markers.forEach((m, i) => {
    const at = markerScreenPoint(plot, m);
    if (!at) return;
    const d = Math.hypot(at[0] - pos[0], at[1] - pos[1]);
    if (d < bestD) { bestD = d; best = i; }
  });
  return best;
}

/** `plot.message`, if any, in a light band across the middle of the picture. */
export function drawMessage(plot) {
  if (!plot.message) return;
  const ctx = plot.ctx;
  ctx.fillStyle = 'rgba(255,255,255,0.88)';
  ctx.fillRect(MARGIN.left, MARGIN.top + plot.ph / 2 - 30, plot.pw, 60);
  ctx.fillStyle = '#333';
  ctx.font = '14px system-ui, sans-serif';
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  wrapText(ctx, plot.message, MARGIN.left + plot.pw / 2, MARGIN.top + plot.ph / 2, plot.pw - 24, 18);
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

/** Pole trails (trails.js): each root's path as the parameter runs over its range. Poles solid,
 *  zeros dashed (told apart without colour), a small tick across the path at every step, the
 *  first and last points labelled with the parameter's value there, and a ring where the
 *  parameter's current value puts the root (between steps: interpolated). */
export function drawTrails(plot) {
  const t = plot.trails;
  if (!t || !t.shown || plot.infinityMode) return;
  const ctx = plot.ctx;
  const label = (text, x, y) => {
    ctx.font = '11px system-ui, sans-serif';
    ctx.lineWidth = 3;
    ctx.strokeStyle = 'rgba(255,255,255,0.9)';
    ctx.fillStyle = '#111';
    ctx.strokeText(text, x + 6, y - 6);
    ctx.fillText(text, x + 6, y - 6);
  };
  const fmt = (v) => String(Number(v.toPrecision(3)));
  ctx.save();
  for (const [kind, list] of [['pole', t.poles], ['zero', t.zeros]]) {
    for (const trail of list || []) {
      const pts = trail.map((p) => (p ? toScreen(plot, p[0], p[1]) : null));
      // the path, broken where the root does not exist
      ctx.setLineDash(kind === 'zero' ? [6, 4] : []);
      for (const [width, colour] of [[4, 'rgba(255,255,255,0.8)'], [1.6, 'rgba(15,15,15,0.95)']]) {
        ctx.lineWidth = width;
        ctx.strokeStyle = colour;
        ctx.beginPath();
        let pen = false;
        for (const q of pts) {
          if (!q) { pen = false; continue; }
          if (pen) ctx.lineTo(q[0], q[1]); else ctx.moveTo(q[0], q[1]);
          pen = true;
        }
        ctx.stroke();
      }
      ctx.setLineDash([]);
      // ticks across the path at each step
      ctx.lineWidth = 1;
      ctx.strokeStyle = 'rgba(15,15,15,0.9)';
      ctx.beginPath();
      pts.forEach((q, i) => {
        if (!q) return;
        const a = pts[i - 1] || q, b = pts[i + 1] || q;
        let dx = b[0] - a[0], dy = b[1] - a[1];
        const len = Math.hypot(dx, dy);
        if (!(len > 0)) return;
        dx /= len; dy /= len;
        ctx.moveTo(q[0] - dy * 3, q[1] + dx * 3);
        ctx.lineTo(q[0] + dy * 3, q[1] - dx * 3);
      });
      ctx.stroke();
      const first = pts.findIndex(Boolean);
      let last = -1;
      pts.forEach((q, i) => { if (q) last = i; });
      // a root that does not move (its path within 3 pixels) gets no labels: the marker says where it is
      const drawn = pts.filter(Boolean);
      const extent = drawn.length ? Math.max(...drawn.map((q) => Math.hypot(q[0] - drawn[0][0], q[1] - drawn[0][1]))) : 0;
      if (extent > 3) {
        if (first >= 0) label(`${t.name}=${fmt(t.values[first])}`, pts[first][0], pts[first][1]);
        if (last > first) label(`${t.name}=${fmt(t.values[last])}`, pts[last][0], pts[last][1]);
      }
      // the current value
      if (Number.isFinite(t.current)) {
        const i = t.values.findIndex((v, j) => j + 1 < t.values.length && (v - t.current) * (t.values[j + 1] - t.current) <= 0);
        if (i >= 0 && trail[i] && trail[i + 1]) {
          const span = t.values[i + 1] - t.values[i];
          const u = span !== 0 ? (t.current - t.values[i]) / span : 0;
          const [x, y] = toScreen(plot, trail[i][0] + u * (trail[i + 1][0] - trail[i][0]), trail[i][1] + u * (trail[i + 1][1] - trail[i][1]));
          ctx.beginPath(); ctx.arc(x, y, 5, 0, 2 * Math.PI);
          ctx.lineWidth = 3.5; ctx.strokeStyle = 'rgba(255,255,255,0.9)'; ctx.stroke();
          ctx.lineWidth = 1.5; ctx.strokeStyle = '#111'; ctx.stroke();
        }
      }
    }
  }
  ctx.restore();
}

/** In the view at infinity, the point w = 0 (z = ∞) gets a marker of its own — a ring around the
 *  symbol of its kind (laurent-panel.js sets plot.infinityPoint = {kind, label}; a non-isolated
 *  point gets a dashed second ring) — with its kind written beside it. The canvas carries the kind
 *  drawn in data-infinity-marker (absent when none is drawn). */
export function drawInfinityMarker(plot) {
  const p = plot.infinityPoint;
  if (!p || !plot.infinityMode) { delete plot.canvas.dataset.infinityMarker; return; }
  const [x, y] = toScreen(plot, 0, 0);
  if (x < MARGIN.left || x > MARGIN.left + plot.pw || y < MARGIN.top || y > MARGIN.top + plot.ph) { delete plot.canvas.dataset.infinityMarker; return; }
  const ctx = plot.ctx;
  ctx.save();
  const ring = (r, dash) => {
    ctx.setLineDash(dash);
    ctx.beginPath(); ctx.arc(x, y, r, 0, 2 * Math.PI);
    ctx.lineWidth = 4; ctx.strokeStyle = 'rgba(255,255,255,0.85)'; ctx.stroke();
    ctx.lineWidth = 1.6; ctx.strokeStyle = '#111'; ctx.stroke();
  };
  ring(11, []);
  if (p.kind === 'non_isolated') ring(16, [3, 3]);
  ctx.setLineDash([]);
  const symbol = { pole: 'pole', essential: 'essential', non_isolated: 'essential', branch_point: 'branch', removable: 'removable' }[p.kind];
  if (symbol) drawMarker(ctx, symbol, x, y, false);
  else { ctx.beginPath(); ctx.arc(x, y, 2.5, 0, 2 * Math.PI); ctx.fillStyle = '#111'; ctx.fill(); }
  ctx.font = 'bold 12px system-ui, sans-serif';
  ctx.lineWidth = 3;
  ctx.strokeStyle = 'rgba(255,255,255,0.9)';
  ctx.fillStyle = '#111';
  ctx.textAlign = 'left';
  ctx.textBaseline = 'middle';
  ctx.strokeText(p.label, x + 20, y - 14);
  ctx.fillText(p.label, x + 20, y - 14);
  ctx.restore();
  plot.canvas.dataset.infinityMarker = p.kind;
}

/** The Laurent section's annulus (plot.annulus = {center, inner, outer}): its two circles dashed,
 *  dark on a light edge. In the view at infinity only an annulus about 0 is drawn (|w| = 1/r). */
export function drawAnnulus(plot) {
  const a = plot.annulus;
  if (!a) { delete plot.canvas.dataset.annulus; return; }
  let c = a.center, radii = [a.inner, a.outer];
  if (plot.infinityMode) {
    if (c[0] !== 0 || c[1] !== 0) { delete plot.canvas.dataset.annulus; return; }
    radii = radii.map((r) => (r > 0 ? 1 / r : Infinity));
  }
  const [sx, sy] = toScreen(plot, c[0], c[1]);
  const ctx = plot.ctx;
  ctx.save();
  ctx.setLineDash([7, 4]);
  for (const r of radii) {
    if (!(r > 0) || !Number.isFinite(r)) continue;
    ctx.beginPath();
    ctx.arc(sx, sy, r / plot.scale, 0, 2 * Math.PI);
    ctx.lineWidth = 3; ctx.strokeStyle = 'rgba(255,255,255,0.7)'; ctx.stroke();
    ctx.lineWidth = 1.2; ctx.strokeStyle = 'rgba(15,15,15,0.85)'; ctx.stroke();
  }
  ctx.restore();
  plot.canvas.dataset.annulus = JSON.stringify([c, a.inner, Number.isFinite(a.outer) ? a.outer : null]);
}

/** Over a picture kept while the typed f is invalid: a band at the top naming the f it shows. */
export function drawLastValid(plot) {
  if (!plot.lastValid || !plot.pictureOf) return;
  const ctx = plot.ctx;
  ctx.save();
  ctx.font = '13px system-ui, sans-serif';
  const text = `Last valid f shown: ${plot.pictureOf}. The typed f has an error.`;
  const pad = 6;
  const maxW = plot.pw - 2 * pad;
  let shown = text;
  if (ctx.measureText(shown).width > maxW) {
    while (shown.length > 8 && ctx.measureText(shown + '...').width > maxW) shown = shown.slice(0, -1);
    shown += '...';
  }
  ctx.fillStyle = 'rgba(255,248,230,0.94)';
  ctx.fillRect(MARGIN.left, MARGIN.top, plot.pw, 24);
  ctx.strokeStyle = '#b7791f';
  ctx.lineWidth = 2;
  ctx.beginPath();
  ctx.moveTo(MARGIN.left, MARGIN.top + 24);
  ctx.lineTo(MARGIN.left + plot.pw, MARGIN.top + 24);
  ctx.stroke();
  ctx.fillStyle = '#5a3d0c';
  ctx.textAlign = 'left';
  ctx.textBaseline = 'middle';
  ctx.fillText(shown, MARGIN.left + pad, MARGIN.top + 12);
  ctx.restore();
}

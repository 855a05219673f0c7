// The plot's axes: zero lines, the frame, ticks at nice spacings with their
// labels, and the axis names (Re z, Im z, or w in the view around infinity).
import { fmtReal } from '../format.js';
import { MARGIN, viewBox, toScreen } from './view.js';
import { ink } from '../scheme.js';

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

/** Draw the axes of the current view (CSS-pixel transform already set on the context). */
export function drawAxes(plot) {
  const ctx = plot.ctx;
  const [x0, x1, y0, y1] = viewBox(plot);
  const L = MARGIN.left, T = MARGIN.top, W = plot.pw, H = plot.ph;
  ctx.save();
  // Zero lines inside the plot.
  ctx.strokeStyle = 'rgba(0,0,0,0.35)';
  ctx.lineWidth = 1;
  ctx.beginPath();
  if (x0 < 0 && x1 > 0) { const [sx] = toScreen(plot, 0, 0); ctx.moveTo(sx, T); ctx.lineTo(sx, T + H); }
  if (y0 < 0 && y1 > 0) { const [, sy] = toScreen(plot, 0, 0); ctx.moveTo(L, sy); ctx.lineTo(L + W, sy); }
  ctx.stroke();
  // Frame.
  ctx.strokeStyle = ink('plot-frame');
  ctx.strokeRect(L + 0.5, T + 0.5, W - 1, H - 1);
  // Ticks and labels.
  ctx.fillStyle = ink('plot-ink');
  ctx.font = '12px system-ui, -apple-system, "Segoe UI", sans-serif';
  const sx = tickStep(x1 - x0, W);
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  for (let v = Math.ceil(x0 / sx) * sx; v <= x1 + sx * 1e-9; v += sx) {
    const [px] = toScreen(plot, v, 0);
    ctx.beginPath(); ctx.moveTo(px, T + H); ctx.lineTo(px, T + H + 5); ctx.stroke();
    ctx.fillText(tickLabel(v, sx), px, T + H + 7);
  }
  const sy = tickStep(y1 - y0, H);
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (let v = Math.ceil(y0 / sy) * sy; v <= y1 + sy * 1e-9; v += sy) {
    const [, py] = toScreen(plot, 0, v);
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

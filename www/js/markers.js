// The singularity markers: what each kind is called, its shape on the plot canvas,
// and the same shape as a small SVG for the table and the key.

export const KIND_WORDS = {
  pole: 'pole', zero: 'zero', essential: 'essential singularity', branch: 'branch point', removable: 'removable point',
};

/** Which symbols poles and zeros get: 'own' (the shapes below) or 'diagram', the trade's usual
 *  pole–zero diagram convention (× for a pole, ○ for a zero; common practice in control texts). */
let symbols = 'own';
export function setSymbols(style) { symbols = style === 'diagram' ? 'diagram' : 'own'; }

/** Our own marker shapes: pole = hollow diamond, zero = dot inside a ring,
 *  essential = eight-point burst, branch point = hollow triangle, removable = small hollow square. */
export function markerPath(ctx, kind, x, y) {
  ctx.lineJoin = 'round';
  const halo = () => { ctx.strokeStyle = 'rgba(255,255,255,0.95)'; ctx.lineWidth = 4; ctx.stroke(); ctx.strokeStyle = '#111'; ctx.lineWidth = 2; ctx.stroke(); };
  ctx.beginPath();
  if (symbols === 'diagram' && kind === 'pole') {
    ctx.moveTo(x - 6, y - 6); ctx.lineTo(x + 6, y + 6); ctx.moveTo(x + 6, y - 6); ctx.lineTo(x - 6, y + 6);
    halo();
  } else if (symbols === 'diagram' && kind === 'zero') {
    ctx.arc(x, y, 6, 0, 2 * Math.PI);
    halo();
  } else if (kind === 'pole') {
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

/** A marker on the plot canvas at (x, y) in CSS pixels; the chosen one gets a ring. */
export function drawMarker(ctx, kind, x, y, selected) {
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

/** A small inline SVG of a marker, for the table and the key. */
export function markerIcon(kind) {
  const ns = 'http://www.w3.org/2000/svg';
  const svg = document.createElementNS(ns, 'svg');
  svg.setAttribute('width', '16'); svg.setAttribute('height', '16'); svg.setAttribute('viewBox', '-8 -8 16 16');
  svg.setAttribute('aria-hidden', 'true');
  svg.classList.add('marker-icon');
  svg.dataset.kind = kind;
  const shape = (tag, attrs) => { const s = document.createElementNS(ns, tag); for (const [k, v] of Object.entries(attrs)) s.setAttribute(k, v); svg.append(s); };
  const line = { fill: 'none', stroke: 'currentColor', 'stroke-width': '1.6', 'stroke-linejoin': 'round' };
  if (symbols === 'diagram' && kind === 'pole') shape('path', Object.assign({ d: 'M-5 -5L5 5M5 -5L-5 5' }, line));
  else if (symbols === 'diagram' && kind === 'zero') shape('circle', Object.assign({ r: 5 }, line));
  else if (kind === 'pole') shape('polygon', Object.assign({ points: '0,-6 6,0 0,6 -6,0' }, line));
  else if (kind === 'zero') { shape('circle', Object.assign({ r: 5 }, line)); shape('circle', { r: 2, fill: 'currentColor' }); }
  else if (kind === 'essential') {
    let d = '';
    for (let k = 0; k < 8; k++) { const a = (k * Math.PI) / 4, r = k % 2 ? 3.5 : 6.5; d += `M0 0L${(r * Math.cos(a)).toFixed(2)} ${(r * Math.sin(a)).toFixed(2)}`; }
    shape('path', Object.assign({ d }, line));
  } else if (kind === 'branch') shape('polygon', Object.assign({ points: '0,-6 6,4 -6,4' }, line));
  else shape('rect', Object.assign({ x: -4, y: -4, width: 8, height: 8 }, line));
  return svg;
}

/** Redraw every marker icon under `root` (the table, the key) in the current symbols. */
export function refreshMarkerIcons(root) {
  for (const old of root.querySelectorAll('svg.marker-icon[data-kind]')) old.replaceWith(markerIcon(old.dataset.kind));
}

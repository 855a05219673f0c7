// The contract's contours (docs/contract.md, "Contours") as polylines in the plane: one sampler
// per shape, each returning {points: [[x, y], …], t: [t, …]} with t in [0, 1) the fraction of
// the arc length from the contour's start, in the contour's own direction. The curve is closed:
// the last point joins the first. The geometry is the core's (src/contour/): circles and
// ellipses from angle 0 counter-clockwise, a rectangle from its lower-left corner
// counter-clockwise, a polygon through its vertices in order, a half-disc's diameter then its
// arc, a keyhole's upper slit edge outward, outer circle, lower edge inward, inner circle clockwise.

/** The keyhole's slit half-width when none is given, as a fraction of the inner radius (as the core). */
export const KEYHOLE_GAP_FRACTION = 1e-3;

const segment = (a, b) => ({ at: (t) => [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t], length: Math.hypot(b[0] - a[0], b[1] - a[1]) });
const arc = (c, r, start, sweep) => ({
  at: (t) => [c[0] + r * Math.cos(start + sweep * t), c[1] + r * Math.sin(start + sweep * t)],
  length: r * Math.abs(sweep),
});
function ellipsePiece(c, a, b, angle) {
  const co = Math.cos(angle), si = Math.sin(angle);
  const at = (t) => {
    const x = a * Math.cos(2 * Math.PI * t), y = b * Math.sin(2 * Math.PI * t);
    return [c[0] + co * x - si * y, c[1] + si * x + co * y];
  };
  let length = 0;
  for (let k = 0; k < 128; k++) { const p = at(k / 128), q = at((k + 1) / 128); length += Math.hypot(q[0] - p[0], q[1] - p[1]); }
  return { at, length };
}
const closedPolyline = (v) => v.map((p, k) => segment(p, v[(k + 1) % v.length]));

/** Pieces laid end to end, sampled with about `n` points spread by arc length (at least 2 per piece). */
function samplePieces(pieces, n) {
  const total = pieces.reduce((s, p) => s + p.length, 0) || 1;
  const points = [], t = [];
  let before = 0;
  for (const p of pieces) {
    const m = Math.max(2, Math.round((n * p.length) / total));
    for (let k = 0; k < m; k++) {
      points.push(p.at(k / m));
      t.push((before + (p.length * k) / m) / total);
    }
    before += p.length;
  }
  return { points, t };
}

export const circlePieces = (c) => [arc(c.center, c.radius, 0, 2 * Math.PI)];
export const ellipsePieces = (c) => [ellipsePiece(c.center, c.semi_axes[0], c.semi_axes[1], c.angle || 0)];
export function rectanglePieces(c) {
  const [[a, b], [p, q]] = c.corners;
  const x0 = Math.min(a, p), x1 = Math.max(a, p), y0 = Math.min(b, q), y1 = Math.max(b, q);
  return closedPolyline([[x0, y0], [x1, y0], [x1, y1], [x0, y1]]);
}
export const polygonPieces = (c) => closedPolyline(c.vertices);
const NORMAL = { upper: [0, 1], lower: [0, -1], left: [-1, 0], right: [1, 0] };
export function halfDiscPieces(c) {
  const d = NORMAL[c.direction] || NORMAL.upper;
  const u = [d[1], -d[0]]; // −i·d
  const [x, y] = c.center, r = c.radius;
  return [segment([x - r * u[0], y - r * u[1]], [x + r * u[0], y + r * u[1]]), arc(c.center, r, Math.atan2(u[1], u[0]), Math.PI)];
}
export function keyholePieces(c) {
  const r1 = c.inner, r2 = c.outer, th = c.angle || 0;
  const g = c.gap === undefined || c.gap === null ? KEYHOLE_GAP_FRACTION * r1 : c.gap;
  const e = [Math.cos(th), Math.sin(th)];
  const at = (s, h) => [c.center[0] + e[0] * s - e[1] * h, c.center[1] + e[1] * s + e[0] * h];
  const s1 = Math.sqrt(r1 * r1 - g * g), s2 = Math.sqrt(r2 * r2 - g * g);
  const d1 = Math.asin(g / r1), d2 = Math.asin(g / r2);
  return [
    segment(at(s1, g), at(s2, g)),
    arc(c.center, r2, th + d2, 2 * Math.PI - 2 * d2),
    segment(at(s2, -g), at(s1, -g)),
    arc(c.center, r1, th + 2 * Math.PI - d1, -(2 * Math.PI - 2 * d1)),
  ];
}

const PIECES = { circle: circlePieces, ellipse: ellipsePieces, rectangle: rectanglePieces, polygon: polygonPieces, half_disc: halfDiscPieces, keyhole: keyholePieces };

export const sampleCircle = (c, n = 400) => samplePieces(circlePieces(c), n);
export const sampleEllipse = (c, n = 400) => samplePieces(ellipsePieces(c), n);
export const sampleRectangle = (c, n = 400) => samplePieces(rectanglePieces(c), n);
export const samplePolygon = (c, n = 400) => samplePieces(polygonPieces(c), n);
export const sampleHalfDisc = (c, n = 400) => samplePieces(halfDiscPieces(c), n);
export const sampleKeyhole = (c, n = 400) => samplePieces(keyholePieces(c), n);

/** Any contract contour as a closed polyline of about `n` points; null for an unknown shape. */
export function sampleContour(contour, n = 400) {
  const pieces = contour && PIECES[contour.shape];
  return pieces ? samplePieces(pieces(contour), n) : null;
}

/** The point of the contour at arc-length fraction t (0 ≤ t < 1). */
export function contourPointAt(contour, t) {
  const pieces = PIECES[contour.shape](contour);
  const total = pieces.reduce((s, p) => s + p.length, 0);
  let left = (((t % 1) + 1) % 1) * total;
  for (const p of pieces) {
    if (left <= p.length || p === pieces[pieces.length - 1]) return p.at(p.length ? Math.min(1, left / p.length) : 0);
    left -= p.length;
  }
  return null;
}

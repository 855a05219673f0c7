// The contour's geometry, plain functions with no page behind them: the closed path of each
// contract shape (circle, ellipse, rectangle, polygon, half-disc, keyhole) in the plane, the winding number of the
// path about a point, and the path's orientation; the handles of the page's region and what
// dragging one does (regionHandles, dragRegion). The editor (contour-edit.js), the plot's
// outline (plot/overlays.js) and the singularities table's winding column use them.

import { sampleContour } from './contour-path.js';

const TWO_PI = 2 * Math.PI;

/** The closed path of a contract contour as plane points (the last joins the first), in the
 *  direction the core integrates: counter-clockwise for circle, ellipse and rectangle; the
 *  vertex order for a polygon. A rectangle's corners and a polygon's vertices as they are; the
 *  curved shapes from the one sampler (contour-path.js), `n` points on a circle or an ellipse. */
export function contourPath(contour, n = 96) {
  if (contour.shape === 'circle' || contour.shape === 'ellipse') return sampleContour(contour, n).points;
  if (contour.shape === 'rectangle') {
    const [[ax, ay], [bx, by]] = contour.corners;
    const x0 = Math.min(ax, bx), x1 = Math.max(ax, bx), y0 = Math.min(ay, by), y1 = Math.max(ay, by);
    return [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];
  }
  if (contour.shape === 'polygon') return contour.vertices.map((p) => p.slice());
  // the curved shapes: the one sampler of the contract's shapes (contour-path.js), points spread
  // by arc length, about n on a full turn
  if (contour.shape === 'half_disc' || contour.shape === 'keyhole') {
    const sampled = sampleContour(contour, Math.round(1.6 * n));
    return sampled ? sampled.points : [];
  }
  return [];
}

/** The half-disc's side as the angle of its outward axis. */
export const DIRECTION_ANGLE = { right: 0, upper: Math.PI / 2, left: Math.PI, lower: -Math.PI / 2 };

/** Twice the signed area of a closed polygonal path (the shoelace formula): > 0 counter-clockwise. */
export function signedArea2(path) {
  let s = 0;
  for (let k = 0; k < path.length; k++) {
    const [x0, y0] = path[k], [x1, y1] = path[(k + 1) % path.length];
    s += x0 * y1 - x1 * y0;
  }
  return s;
}

/** The distance from p to the segment a–b. */
export function segmentDistance(p, a, b) {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  const u = len2 > 0 ? Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2)) : 0;
  return Math.hypot(p[0] - a[0] - u * dx, p[1] - a[1] - u * dy);
}

/** The contour's size: its largest extent (the scale "near the contour" is measured against). */
export function contourSize(contour) {
  const path = contourPath(contour, 16);
  const xs = path.map((p) => p[0]), ys = path.map((p) => p[1]);
  return Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys));
}

/** The winding number of the closed polygonal path about p: the sum over its edges of the angle
 *  each edge subtends at p, over 2π (each angle taken in (−π, π] by atan2 of the cross and dot
 *  products; the definition of the winding number of a closed curve, Ahlfors, Complex Analysis,
 *  ch. 4 — from memory). null when p lies within `tol` of the path. */
export function pathWinding(path, p, tol = 0) {
  let total = 0;
  for (let k = 0; k < path.length; k++) {
    const a = path[k], b = path[(k + 1) % path.length];
    if (segmentDistance(p, a, b) <= tol) return null;
    const ax = a[0] - p[0], ay = a[1] - p[1], bx = b[0] - p[0], by = b[1] - p[1];
    total += Math.atan2(ax * by - ay * bx, ax * bx + ay * by);
  }
  return Math.round(total / TWO_PI);
}

/** The winding number about p of a closed polyline of computed values ([[re, im], …], the image
 *  curve f(γ)): pathWinding, and null when a value is not finite or the curve passes through p. */
export function windingAbout(values, p) {
  if (!values.every((v) => Number.isFinite(v[0]) && Number.isFinite(v[1]))) return null;
  const w = pathWinding(values, p, 0);
  return w === null ? null : w || 0; // never −0
}

/** The winding number of a contract contour about p, as the core integrates it (see
 *  contourPath), times `sign` (−1 when the page's contour is taken the other way round).
 *  Circles and ellipses: mapped affinely onto the unit circle (an orientation-keeping map keeps
 *  winding numbers), where the winding about q is 1 for |q| < 1 and 0 for |q| > 1; rectangles
 *  and polygons: the edge-angle sum (pathWinding). null on (within 1e-9 of the size of) the contour. */
export function windingNumber(contour, p, sign = 1) {
  const tol = 1e-9 * Math.max(contourSize(contour), 1e-300);
  let w;
  if (contour.shape === 'circle' || contour.shape === 'ellipse') {
    const [cx, cy] = contour.center;
    const [a, b] = contour.shape === 'circle' ? [contour.radius, contour.radius] : contour.semi_axes;
    const t = contour.shape === 'ellipse' ? contour.angle || 0 : 0;
    const dx = p[0] - cx, dy = p[1] - cy;
    const u = (Math.cos(t) * dx + Math.sin(t) * dy) / a, v = (-Math.sin(t) * dx + Math.cos(t) * dy) / b;
    const rho = Math.hypot(u, v);
    if (Math.abs(rho - 1) * Math.min(a, b) <= tol) return null;
    w = rho < 1 ? 1 : 0;
  } else if (contour.shape === 'half_disc' || contour.shape === 'keyhole') {
    // inside 1, outside 0, none on the curve (contract.md): exact tests of the two regions
    const [cx, cy] = contour.center;
    const dx = p[0] - cx, dy = p[1] - cy, rho = Math.hypot(dx, dy);
    if (contour.shape === 'half_disc') {
      const phi = DIRECTION_ANGLE[contour.direction] ?? Math.PI / 2;
      const along = dx * Math.cos(phi) + dy * Math.sin(phi);
      if ((Math.abs(rho - contour.radius) <= tol && along >= -tol) || (Math.abs(along) <= tol && rho <= contour.radius + tol)) return null;
      w = rho < contour.radius && along > 0 ? 1 : 0;
    } else {
      const th = contour.angle || 0, g = contour.gap === undefined ? 0.001 * contour.inner : contour.gap;
      const s = dx * Math.cos(th) + dy * Math.sin(th), off = -dx * Math.sin(th) + dy * Math.cos(th);
      const inRing = rho > contour.inner && rho < contour.outer, inSlit = s > 0 && Math.abs(off) < g;
      const onSlitEdge = s > 0 && Math.abs(Math.abs(off) - g) <= tol && rho >= contour.inner - tol && rho <= contour.outer + tol;
      const onCircle = (Math.abs(rho - contour.inner) <= tol || Math.abs(rho - contour.outer) <= tol) && !(s > 0 && Math.abs(off) < g - tol);
      if (onSlitEdge || onCircle) return null;
      w = inRing && !inSlit ? 1 : 0;
    }
  } else {
    w = pathWinding(contourPath(contour), p, tol);
    if (w === null) return null;
  }
  return w * sign === 0 ? 0 : w * sign;
}

const copyGeomRegion = (x) => JSON.parse(JSON.stringify(x));

/** The handles of the region in plane coordinates: [{id, at, look}] (look: 'move', 'size', 'turn'). */
export function regionHandles(region) {
  const r = region;
  if (r.mode === 'rect') {
    const [x0, x1, y0, y1] = r.rect;
    return [
      { id: 'corner-0', at: [x0, y0], look: 'size' }, { id: 'corner-1', at: [x1, y0], look: 'size' },
      { id: 'corner-2', at: [x1, y1], look: 'size' }, { id: 'corner-3', at: [x0, y1], look: 'size' },
      { id: 'center', at: [(x0 + x1) / 2, (y0 + y1) / 2], look: 'move' },
    ];
  }
  if (r.mode === 'circle') {
    const [x, y, rad] = r.circle;
    return [{ id: 'center', at: [x, y], look: 'move' }, { id: 'radius', at: [x + rad, y], look: 'size' }];
  }
  if (r.mode === 'ellipse') {
    const [x, y, a, b, t] = r.ellipse;
    return [
      { id: 'center', at: [x, y], look: 'move' },
      { id: 'axis-a', at: [x + a * Math.cos(t), y + a * Math.sin(t)], look: 'turn' },
      { id: 'axis-b', at: [x - b * Math.sin(t), y + b * Math.cos(t)], look: 'size' },
    ];
  }
  if (r.mode === 'half_disc') {
    const [x, y, rad, dir] = r.half_disc;
    const phi = DIRECTION_ANGLE[dir] ?? Math.PI / 2;
    return [{ id: 'center', at: [x, y], look: 'move' }, { id: 'apex', at: [x + rad * Math.cos(phi), y + rad * Math.sin(phi)], look: 'turn' }];
  }
  if (r.mode === 'keyhole') {
    const [x, y, r1, r2, th] = r.keyhole;
    const back = th + Math.PI;
    return [
      { id: 'center', at: [x, y], look: 'move' },
      { id: 'inner', at: [x + r1 * Math.cos(back), y + r1 * Math.sin(back)], look: 'size' },
      { id: 'outer', at: [x + r2 * Math.cos(back), y + r2 * Math.sin(back)], look: 'size' },
      { id: 'slit', at: [x + ((r1 + r2) / 2) * Math.cos(th), y + ((r1 + r2) / 2) * Math.sin(th)], look: 'turn' },
    ];
  }
  if (r.mode === 'polygon') {
    const n = r.polygon.length;
    const c = r.polygon.reduce((s, p) => [s[0] + p[0] / n, s[1] + p[1] / n], [0, 0]);
    return r.polygon.map((p, i) => ({ id: 'vertex-' + i, at: p.slice(), look: 'size' })).concat([{ id: 'center', at: c, look: 'move' }]);
  }
  return [];
}

/** The region after dragging `grab` (from regionHandles or an edge) from plane point `p0` to `p`;
 *  `start` is the region when the drag began. Pure: returns a new region. */
export function dragRegion(start, grab, p0, p) {
  const r = copyGeomRegion(start);
  const dx = p[0] - p0[0], dy = p[1] - p0[1];
  const id = grab.id;
  if (id === 'center' || (id.startsWith('edge') && ['ellipse', 'polygon', 'half_disc', 'keyhole'].includes(r.mode))) {
    if (r.mode === 'half_disc' || r.mode === 'keyhole') { r[r.mode][0] += dx; r[r.mode][1] += dy; return r; }
    if (r.mode === 'rect') r.rect = [r.rect[0] + dx, r.rect[1] + dx, r.rect[2] + dy, r.rect[3] + dy];
    else if (r.mode === 'circle') { r.circle[0] += dx; r.circle[1] += dy; } else if (r.mode === 'ellipse') { r.ellipse[0] += dx; r.ellipse[1] += dy; } else if (r.mode === 'polygon') r.polygon = r.polygon.map(([x, y]) => [x + dx, y + dy]);
    return r;
  }
  if (r.mode === 'rect') {
    const [x0, x1, y0, y1] = start.rect;
    let [a, b, c, d] = [x0, x1, y0, y1];
    if (id.startsWith('corner')) {
      const k = Number(id.slice(7));
      const ox = k === 0 || k === 3 ? x1 : x0, oy = k === 0 || k === 1 ? y1 : y0; // the opposite corner stays
      [a, b, c, d] = [Math.min(p[0], ox), Math.max(p[0], ox), Math.min(p[1], oy), Math.max(p[1], oy)];
    } else if (id.startsWith('edge')) {
      const k = Number(id.slice(5)); // 0 bottom, 1 right, 2 top, 3 left (the path's order)
      if (k === 0) [c, d] = [Math.min(p[1], y1), Math.max(p[1], y1)];
      if (k === 2) [c, d] = [Math.min(p[1], y0), Math.max(p[1], y0)];
      if (k === 1) [a, b] = [Math.min(p[0], x0), Math.max(p[0], x0)];
      if (k === 3) [a, b] = [Math.min(p[0], x1), Math.max(p[0], x1)];
    }
    if (b > a && d > c) r.rect = [a, b, c, d];
    return r;
  }
  if (r.mode === 'circle') {
    const rad = Math.hypot(p[0] - r.circle[0], p[1] - r.circle[1]);
    if (rad > 0) r.circle[2] = rad;
    return r;
  }
  if (r.mode === 'ellipse') {
    const [x, y, , , t] = r.ellipse;
    if (id === 'axis-a') {
      const a = Math.hypot(p[0] - x, p[1] - y);
      if (a > 0) { r.ellipse[2] = a; r.ellipse[4] = Math.atan2(p[1] - y, p[0] - x); }
    } else if (id === 'axis-b') {
      const b = Math.abs(-(p[0] - x) * Math.sin(t) + (p[1] - y) * Math.cos(t));
      if (b > 0) r.ellipse[3] = b;
    }
    return r;
  }
  if (r.mode === 'half_disc' && id === 'apex') {
    // the radius, and the side snapped to the nearest of the four
    const [x, y] = r.half_disc;
    const rad = Math.hypot(p[0] - x, p[1] - y);
    if (rad > 0) {
      r.half_disc[2] = rad;
      const t = Math.atan2(p[1] - y, p[0] - x);
      r.half_disc[3] = Object.keys(DIRECTION_ANGLE).reduce((best, k) =>
        (Math.abs(Math.atan2(Math.sin(t - DIRECTION_ANGLE[k]), Math.cos(t - DIRECTION_ANGLE[k]))) <
          Math.abs(Math.atan2(Math.sin(t - DIRECTION_ANGLE[best]), Math.cos(t - DIRECTION_ANGLE[best]))) ? k : best), 'upper');
    }
    return r;
  }
  if (r.mode === 'keyhole') {
    const [x, y, r1, r2, , gap] = r.keyhole;
    const rho = Math.hypot(p[0] - x, p[1] - y);
    if (id === 'inner' && rho > (gap ?? 0) && rho < r2) r.keyhole[2] = rho;
    if (id === 'outer' && rho > r1) r.keyhole[3] = rho;
    if (id === 'slit' && rho > 0) r.keyhole[4] = Math.atan2(p[1] - y, p[0] - x);
    return r;
  }
  if (r.mode === 'polygon' && id.startsWith('vertex')) r.polygon[Number(id.slice(7))] = p.slice();
  return r;
}

/** The indented imaginary axis as a closed polygon: the boundary of the right half-disc |s| < R,
 *  Re s > 0, taken counter-clockwise (the arc from −iR through R to iR, then down the axis), with a
 *  small half circle of radius `eps` into the right half-plane around each axis point i·y in `ys`
 *  (the poles on the axis stay outside the region). The contour of the stability count in s
 *  (common practice), as vertices: `arcSteps` on the large arc, `indentSteps` on each indentation. */
export function indentedAxisPolygon(R, ys, eps, arcSteps = 40, indentSteps = 8) {
  const out = [];
  for (let j = 0; j <= arcSteps; j++) {
    const t = -Math.PI / 2 + (Math.PI * j) / arcSteps;
    out.push([R * Math.cos(t), R * Math.sin(t)]);
  }
  const inside = ys.filter((y) => Math.abs(y) < R - 2 * eps).sort((a, b) => b - a);
  for (const y of inside) {
    for (let j = 0; j <= indentSteps; j++) {
      const t = Math.PI / 2 - (Math.PI * j) / indentSteps;
      out.push([eps * Math.cos(t), y + eps * Math.sin(t)]);
    }
  }
  return out.map(([x, y]) => [Math.abs(x) < 1e-15 * R ? 0 : x, y]);
}

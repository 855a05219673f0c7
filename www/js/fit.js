// Fitting the view to a rational f: every finite pole and zero, found by the core's
// partial fractions of f (its poles) and of 1/f (the poles of 1/f are the zeros of f),
// a box around them with a margin, and a note when the poles span many decades.
// Also the nudge that keeps a singularity off the edge of the "current view" region.
import { runHeavy, responseError } from './engine.js';
import { fmtReal, fmtComplex } from './format.js';

/** Largest / smallest nonzero pole modulus above which the view says the poles span decades. */
export const FIT_DECADES = 1e3;
/** Margin around the points, as a fraction of their span. */
export const FIT_MARGIN = 0.1;
/** A point this close to the region's edge (relative to the region's size) counts as on it. */
export const EDGE_RELATIVE = 1e-9;

const analysisCache = { key: '', value: null };

/** The key of a function input {f, var, params}. */
function analysisKey(base) {
  return JSON.stringify([base.f, base.var, base.params]);
}

/** The finite poles and zeros of a rational f: {rational: true, poles, zeros} (each a list of
 *  [re, im], each point once), or {rational: false} when f is not rational, or null when the
 *  core could not answer (stopped, still loading). Cached for the last function asked. */
export async function rationalAnalysis(base) {
  const key = analysisKey(base);
  if (analysisCache.key === key) return analysisCache.value;
  const pf = await runHeavy(Object.assign({}, base, { task: 'partial_fractions' }));
  const err = responseError(pf);
  let value;
  if (err) {
    if (err.code !== 'not_applicable') return null;
    value = { rational: false };
  } else {
    const inv = await runHeavy(Object.assign({}, base, { f: `1/(${base.f})`, task: 'partial_fractions' }));
    const invErr = responseError(inv);
    if (invErr && invErr.code !== 'not_applicable') return null;
    const atOf = (resp) => distinct((Array.isArray(resp.terms) ? resp.terms : []).map((t) => t.at));
    value = { rational: true, poles: atOf(pf), zeros: invErr ? [] : atOf(inv) };
  }
  analysisCache.key = key;
  analysisCache.value = value;
  return value;
}

/** The same points once each (partial fractions list a pole of order m m times). */
function distinct(points) {
  const out = [];
  const seen = new Set(); // exact equality, as before, in one pass (thousands of poles stay quick)
  for (const p of points) {
    if (!Array.isArray(p) || !p.every(Number.isFinite)) continue;
    const key = p[0] + ',' + p[1];
    if (!seen.has(key)) { seen.add(key); out.push(p); }
  }
  return out;
}

/** The smallest of 1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8 (× a power of ten) at least x > 0. */
function niceUp(x) {
  const p = Math.pow(10, Math.floor(Math.log10(x)));
  const m = [1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10].find((v) => v * p >= x * (1 - 1e-12));
  return m * p;
}

/** The view [x0, x1, y0, y1] (square: the plot widens it to its own aspect) holding every point
 *  (the poles, the zeros and `extra` points that must be seen, such as the unit circle's four
 *  extreme points for a discrete-time f) with a margin of FIT_MARGIN of the span, and at least a
 *  minimal size; with `decades` set (and
 *  a one-line `note`) when the nonzero pole moduli span more than FIT_DECADES. Null for no point. */
export function fitView(poles, zeros, extra = []) {
  const pts = poles.concat(zeros, extra);
  if (!pts.length) return null;
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const largest = Math.max(...pts.map((p) => Math.hypot(p[0], p[1])));
  let span = Math.max(x1 - x0, y1 - y0);
  // One point, or points closer together than their distance from 0 can show: a box of the
  // size of their modulus (or 2 around the origin), so that the neighbourhood is seen.
  const minimal = Math.max(largest > 0 ? 0.5 * largest : 2, 1e-12);
  if (!(span >= minimal * 1e-6)) span = minimal;
  // Round to numbers a reader can take in: the half-width up to 1, 1.2, 1.5, 2, 2.5, 3, 4, 5,
  // 6 or 8 times a power of ten, the centre to a twentieth of it (the margin absorbs the shift).
  const half = niceUp((span * (1 + 2 * FIT_MARGIN)) / 2);
  const step = half / 20;
  const cx = Math.round((x0 + x1) / 2 / step) * step;
  const cy = Math.round((y0 + y1) / 2 / step) * step;
  const view = [cx - half, cx + half, cy - half, cy + half];
  const moduli = poles.map((p) => Math.hypot(p[0], p[1])).filter((m) => m > 0);
  let decades = null;
  if (moduli.length > 1) {
    const big = Math.max(...moduli);
    const small = Math.min(...moduli);
    if (big / small > FIT_DECADES) {
      decades = { largest: big, smallest: small };
      decades.note = `The poles span ${fmtReal(Math.log10(big / small), 2)} decades (|p| from ${fmtReal(small, 3)} to ${fmtReal(big, 3)}): ` +
        'the view is fitted to the largest, so the small ones sit near the origin.';
      // the view that holds the small ones: those within FIT_DECADES of the smallest
      const isNear = (p) => Math.hypot(p[0], p[1]) <= small * FIT_DECADES;
      const nearPoles = poles.filter(isNear);
      const nearZeros = zeros.filter(isNear);
      decades.smallView = nearPoles.length + nearZeros.length < pts.length ? fitView(nearPoles, nearZeros).view : null;
    }
  }
  return { view, decades };
}

/** The region's contour moved off the points that lie on its edge: a rectangle whose edge passes
 *  within EDGE_RELATIVE (of its size) of a point is widened on every side by a small amount.
 *  Returns {contour, widenedBy, at} (widenedBy 0 when nothing moved). */
export function nudgeOffEdges(contour, points) {
  if (contour.shape !== 'rectangle' || !points.length) return { contour, widenedBy: 0, at: null };
  let [[a, b], [c, d]] = contour.corners;
  let x0 = Math.min(a, c), x1 = Math.max(a, c), y0 = Math.min(b, d), y1 = Math.max(b, d);
  const size = Math.max(x1 - x0, y1 - y0);
  const onEdge = () => points.find((p) => {
    const tol = EDGE_RELATIVE * Math.max(size, Math.abs(p[0]), Math.abs(p[1]));
    const inX = p[0] >= x0 - tol && p[0] <= x1 + tol;
    const inY = p[1] >= y0 - tol && p[1] <= y1 + tol;
    return (inY && (Math.abs(p[0] - x0) <= tol || Math.abs(p[0] - x1) <= tol)) ||
      (inX && (Math.abs(p[1] - y0) <= tol || Math.abs(p[1] - y1) <= tol));
  });
  let at = onEdge();
  if (!at) return { contour, widenedBy: 0, at: null };
  const first = at;
  let step = 1e-4 * size;
  let widened = 0;
  for (let k = 0; k < 8 && at; k++) {
    x0 -= step; x1 += step; y0 -= step; y1 += step;
    widened += step;
    step *= 1.618; // a new edge that lands on another point moves again, by a different amount
    at = onEdge();
  }
  return { contour: { shape: 'rectangle', corners: [[x0, y0], [x1, y1]] }, widenedBy: widened, at: first };
}

/** The sentence for the singularities panel after a nudge. */
export function nudgeNote(variable, nudge, poles) {
  const what = poles.includes(nudge.at) ? 'pole' : 'zero';
  return `The region was widened by ${fmtReal(nudge.widenedBy, 3)} on every side so that the ${what} at ${variable} = ${fmtComplex(nudge.at, 6)} is not on its edge.`;
}

/** The unit circle's extreme points: a discrete-time transfer function's view holds the circle
 *  (its stability boundary, common practice for z-plane diagrams). */
export const UNIT_CIRCLE_BOX = [[1, 0], [-1, 0], [0, 1], [0, -1]];

/** How many times the search is asked again with a wider region when it reports a zero or pole
 *  on the edge of the "current view" region (f not rational, so its points are not known first). */
export const NUDGE_TRIES = 4;

/** The `k`-th widening (k = 0, 1, …) of a region whose edge the search found a zero or pole on:
 *  a rectangle widened on every side by 1e-4 × its size × 1.618^k × (1 + 0.0731k) (not a round
 *  step: lattices of integers or of multiples of π are not met again), or a circle whose radius
 *  grows by that much. Returns {contour, widenedBy}. */
export function widenOffContour(contour, k) {
  const grow = (size) => 1e-4 * size * Math.pow(1.618, k) * (1 + 0.0731 * k) * 1.0137;
  if (contour.shape === 'circle') {
    const by = grow(contour.radius);
    return { contour: { shape: 'circle', center: contour.center.slice(), radius: contour.radius + by }, widenedBy: by };
  }
  const [[a, b], [c, d]] = contour.corners;
  const x0 = Math.min(a, c), x1 = Math.max(a, c), y0 = Math.min(b, d), y1 = Math.max(b, d);
  const by = grow(Math.max(x1 - x0, y1 - y0));
  return { contour: { shape: 'rectangle', corners: [[x0 - by, y0 - by], [x1 + by, y1 + by]] }, widenedBy: by };
}

/** The sentence for the singularities panel after such a widening. */
export function widenNote(variable, nudge) {
  return `The search met a zero or pole of f on the edge of the current view, so the region was widened by ${fmtReal(nudge.widenedBy, 3)} on every side (${variable} is searched a little beyond the view).`;
}

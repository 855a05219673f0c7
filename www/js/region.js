// The region the search, the contour integral and the argument count use: the
// current view, a rectangle, a circle, an ellipse, a polygon, a half-disc or a keyhole. Its contour, its
// orientation, its description in words, and the editor (the shape select, the typed
// coordinates and the reverse control). Drawing and dragging it on the plot: contour-edit.js.
import { $ } from './dom.js';
import { fmtComplex, fmtReal } from './format.js';
import { contourSize, signedArea2, indentedAxisPolygon } from './contour-geom.js';
import { rationalAnalysis } from './fit.js';
import { functionInput } from './params.js';

/** The shapes of the select, in its order: the page's mode and the contract's shape. */
export const REGION_SHAPES = [
  { mode: 'view', shape: 'rectangle', words: 'The current view' },
  { mode: 'rect', shape: 'rectangle', words: 'Rectangle' },
  { mode: 'circle', shape: 'circle', words: 'Circle' },
  { mode: 'ellipse', shape: 'ellipse', words: 'Ellipse' },
  { mode: 'polygon', shape: 'polygon', words: 'Polygon' },
  { mode: 'half_disc', shape: 'half_disc', words: 'Half-disc' },
  { mode: 'keyhole', shape: 'keyhole', words: 'Keyhole' },
];

/** The contour of the chosen region. `view` is [x0, x1, y0, y1]. A polygon keeps its vertex
 *  order (the core integrates along it); the other shapes are counter-clockwise (see regionSign). */
export function regionContour(region, view) {
  if (region.mode === 'circle') {
    const [x, y, r] = region.circle;
    return { shape: 'circle', center: [x, y], radius: r };
  }
  if (region.mode === 'ellipse') {
    const [x, y, a, b, t] = region.ellipse;
    return { shape: 'ellipse', center: [x, y], semi_axes: [a, b], angle: t };
  }
  if (region.mode === 'polygon') return { shape: 'polygon', vertices: region.polygon.map((p) => p.slice()) };
  if (region.mode === 'half_disc') {
    const [x, y, r, direction] = region.half_disc;
    return { shape: 'half_disc', center: [x, y], radius: r, direction };
  }
  if (region.mode === 'keyhole') {
    // gap null: the contract's default, 0.001 × inner
    const [x, y, inner, outer, angle, gap] = region.keyhole;
    return Object.assign({ shape: 'keyhole', center: [x, y], inner, outer, angle }, gap === null || gap === undefined ? {} : { gap });
  }
  const v = region.mode === 'rect' ? region.rect : view;
  return { shape: 'rectangle', corners: [[v[0], v[2]], [v[1], v[3]]] };
}

/** +1 when the contour is taken as the core takes it, −1 when the page's reverse control has
 *  turned a circle, ellipse or rectangle round (the contract has no orientation field for them:
 *  the core integrates counter-clockwise and the page negates). A polygon's direction is its vertex order. */
export function regionSign(region) {
  return region.mode !== 'polygon' && region.reversed ? -1 : 1;
}

/** The direction of the contour as drawn: 1 counter-clockwise, −1 clockwise. */
export function regionDirection(region, contour) {
  if (contour.shape === 'polygon') return signedArea2(contour.vertices) < 0 ? -1 : 1;
  return regionSign(region);
}

/** Why a region cannot be searched, or '' when it can. */
export function regionProblem(contour) {
  const fin = (p) => Array.isArray(p) && p.every(Number.isFinite);
  if (contour.shape === 'circle') {
    if (!(contour.radius > 0) || !fin(contour.center)) return 'the circle needs a finite centre and a radius above 0';
  } else if (contour.shape === 'ellipse') {
    if (!fin(contour.center) || !(contour.semi_axes[0] > 0 && contour.semi_axes[1] > 0) || !Number.isFinite(contour.angle || 0)) return 'the ellipse needs a finite centre, semi-axes above 0 and a finite rotation';
  } else if (contour.shape === 'half_disc') {
    if (!fin(contour.center) || !(contour.radius > 0) || !['upper', 'lower', 'left', 'right'].includes(contour.direction)) return 'the half-disc needs a finite centre, a radius above 0 and a side (upper, lower, left or right)';
  } else if (contour.shape === 'keyhole') {
    const g = contour.gap === undefined ? 0.001 * contour.inner : contour.gap;
    if (!fin(contour.center) || !(contour.inner > 0 && contour.outer > contour.inner) || !Number.isFinite(contour.angle || 0) || !(g > 0 && g < contour.inner)) return 'the keyhole needs a finite centre, radii 0 < inner < outer and a gap between 0 and the inner radius';
  } else if (contour.shape === 'polygon') {
    const v = contour.vertices;
    if (!Array.isArray(v) || v.length < 3 || !v.every(fin)) return 'the polygon needs at least 3 finite vertices';
    if (!(Math.abs(signedArea2(v)) > 1e-12 * contourSize(contour) ** 2)) return 'the polygon encloses no area';
  } else {
    const [[a, b], [c, d]] = contour.corners;
    if (![a, b, c, d].every(Number.isFinite) || a === c || b === d) return 'the rectangle needs two different finite corners';
  }
  return '';
}

/** The region in words, e.g. "Re s from −4 to 2, Im s from −3 to 3". */
export function regionWords(variable, contour) {
  if (contour.shape === 'circle') return `|${variable} − (${fmtComplex(contour.center, 4)})| < ${fmtReal(contour.radius, 4)}`;
  if (contour.shape === 'ellipse') {
    const [a, b] = contour.semi_axes;
    return `the ellipse centred at ${fmtComplex(contour.center, 4)} with semi-axes ${fmtReal(a, 4)} and ${fmtReal(b, 4)}` +
      ((contour.angle || 0) !== 0 ? `, turned by ${fmtReal(((contour.angle || 0) * 180) / Math.PI, 4)} degrees` : '');
  }
  if (contour.shape === 'half_disc') return `the ${contour.direction} half of |${variable} − (${fmtComplex(contour.center, 4)})| < ${fmtReal(contour.radius, 4)}`;
  if (contour.shape === 'keyhole') return `${fmtReal(contour.inner, 4)} < |${variable} − (${fmtComplex(contour.center, 4)})| < ${fmtReal(contour.outer, 4)} without the slit at ${fmtReal(((contour.angle || 0) * 180) / Math.PI, 4)} degrees`;
  if (contour.shape === 'polygon') return `the polygon with ${contour.vertices.length} vertices ` + contour.vertices.map((p) => `(${fmtComplex(p, 4)})`).join(', ');
  const [[a, b], [c, d]] = contour.corners;
  return `Re ${variable} from ${fmtReal(Math.min(a, c), 4)} to ${fmtReal(Math.max(a, c), 4)}, Im ${variable} from ${fmtReal(Math.min(b, d), 4)} to ${fmtReal(Math.max(b, d), 4)}`;
}

/** Vertices as typed, "x, y; x, y; …", or null when they do not read as at least 3 pairs. */
export function parseVertices(text) {
  const pairs = String(text).split(';').map((s) => s.trim()).filter(Boolean).map((s) => s.split(/[\s,]+/).filter(Boolean).map(Number));
  if (pairs.length < 3 || !pairs.every((p) => p.length === 2 && p.every(Number.isFinite))) return null;
  return pairs;
}
const verticesText = (vs) => vs.map(([x, y]) => `${fieldNum(x)}, ${fieldNum(y)}`).join('; ');
const fieldNum = (x) => fmtReal(x, 6).replace(/−/g, '-');

/** A default polygon (a pentagon) and ellipse inside the view `v`. */
export function defaultPolygon(v) {
  const cx = (v[0] + v[1]) / 2, cy = (v[2] + v[3]) / 2, r = 0.35 * Math.min(v[1] - v[0], v[3] - v[2]);
  return Array.from({ length: 5 }, (_, k) => {
    const t = Math.PI / 2 + (2 * Math.PI * k) / 5;
    return [Number((cx + r * Math.cos(t)).toPrecision(4)), Number((cy + r * Math.sin(t)).toPrecision(4))];
  });
}

/** Wire the region editor. `page` holds the state (state.region, state.view, state.infinity),
 *  the z-plane view kept while the view around infinity is shown (page.lastZView) and the
 *  plot (which outlines the region). `changed(how)` runs after every edit (how.now: search at once). */
export function createRegionEditor(page, changed) {
  const state = page.state;
  const zView = () => (state.infinity ? page.lastZView : state.view);
  const FIELDS = {
    rect: ['rect-x0', 'rect-x1', 'rect-y0', 'rect-y1'],
    circle: ['circ-x', 'circ-y', 'circ-r'],
    ellipse: ['ell-x', 'ell-y', 'ell-a', 'ell-b', 'ell-angle'],
    half_disc: ['hd-x', 'hd-y', 'hd-r', 'hd-dir'],
    keyhole: ['kh-x', 'kh-y', 'kh-inner', 'kh-outer', 'kh-angle', 'kh-gap'],
  };
  const setField = (id, value) => { if (document.activeElement !== $(id)) $(id).value = value; };
  const editor = {
    /** The contour of the region as it stands. */
    contour: () => regionContour(state.region, zView()),
    /** +1, or −1 when the contour is taken the other way round from the core's (regionSign). */
    sign: () => regionSign(state.region),
    /** Show the region in the fields and on the plot. */
    fill() {
      const r = state.region;
      const v = r.mode === 'view' ? zView() : r.rect;
      FIELDS.rect.forEach((id, k) => setField(id, fieldNum(v[k])));
      FIELDS.circle.forEach((id, k) => setField(id, fieldNum(r.circle[k])));
      const [ex, ey, ea, eb, et] = r.ellipse;
      [ex, ey, ea, eb, (et * 180) / Math.PI].forEach((x, k) => setField(FIELDS.ellipse[k], fieldNum(x)));
      setField('poly-vertices', verticesText(r.polygon));
      const [hx, hy, hr, hdir] = r.half_disc;
      [hx, hy, hr].forEach((x, k) => setField(FIELDS.half_disc[k], fieldNum(x)));
      setField('hd-dir', hdir);
      const [kx, ky, k1, k2, kt, kg] = r.keyhole;
      [kx, ky, k1, k2, (kt * 180) / Math.PI].forEach((x, k) => setField(FIELDS.keyhole[k], fieldNum(x)));
      setField('kh-gap', kg === null || kg === undefined ? '' : fieldNum(kg));
      $('region-shape').value = r.mode;
      $('region-rect').hidden = !(r.mode === 'rect' || r.mode === 'view');
      $('region-rect').classList.toggle('dim', r.mode !== 'rect');
      $('region-circle').hidden = r.mode !== 'circle';
      $('region-ellipse').hidden = r.mode !== 'ellipse';
      $('region-polygon').hidden = r.mode !== 'polygon';
      $('region-half-disc').hidden = r.mode !== 'half_disc';
      $('region-keyhole').hidden = r.mode !== 'keyhole';
      const contour = editor.contour();
      const dir = regionDirection(r, contour);
      $('contour-direction').textContent = dir > 0 ? 'Taken counter-clockwise.' : 'Taken clockwise.';
      $('contour-reverse').dataset.direction = dir > 0 ? 'counter-clockwise' : 'clockwise';
      page.plot.region = r.mode === 'view' ? null : contour;
      page.plot.regionDirection = dir;
      if (page.contourEdit && page.contourEdit.refresh) page.contourEdit.refresh();
    },
  };
  // `now`: a deliberate one-off change (shape chosen, direction reversed) searches at once, not after a pause
  const edited = (now) => { editor.fill(); changed(now === true ? { now: true } : undefined); };

  $('region-shape').addEventListener('change', () => {
    const mode = $('region-shape').value;
    const r = state.region;
    if (mode === 'rect' && r.mode === 'view') r.rect = zView().slice();
    r.mode = mode;
    edited(true);
  });
  $('contour-reverse').addEventListener('click', () => {
    const r = state.region;
    if (r.mode === 'polygon') r.polygon = r.polygon.slice().reverse();
    else r.reversed = !r.reversed;
    edited(true);
  });
  const regionTyped = (mode) => () => {
    const vals = FIELDS[mode].map((id) => Number($(id).value));
    if (!vals.every(Number.isFinite)) return;
    if (mode === 'ellipse') vals[4] = (vals[4] * Math.PI) / 180;
    state.region[mode] = vals;
    state.region.mode = mode;
    edited();
  };
  for (const mode of ['rect', 'circle', 'ellipse']) for (const id of FIELDS[mode]) $(id).addEventListener('change', regionTyped(mode));
  const halfDiscTyped = () => {
    const vals = ['hd-x', 'hd-y', 'hd-r'].map((id) => Number($(id).value));
    if (!vals.every(Number.isFinite)) return;
    state.region.half_disc = [vals[0], vals[1], vals[2], $('hd-dir').value];
    state.region.mode = 'half_disc';
    edited();
  };
  for (const id of FIELDS.half_disc) $(id).addEventListener('change', halfDiscTyped);
  const keyholeTyped = () => {
    const vals = ['kh-x', 'kh-y', 'kh-inner', 'kh-outer', 'kh-angle'].map((id) => Number($(id).value));
    if (!vals.every(Number.isFinite)) return;
    const gapText = $('kh-gap').value.trim();
    const gap = gapText === '' ? null : Number(gapText);
    if (gap !== null && !Number.isFinite(gap)) return;
    state.region.keyhole = [vals[0], vals[1], vals[2], vals[3], (vals[4] * Math.PI) / 180, gap];
    state.region.mode = 'keyhole';
    edited();
  };
  for (const id of FIELDS.keyhole) $(id).addEventListener('change', keyholeTyped);
  // The indented imaginary axis (contour-geom.js indentedAxisPolygon): the right half-disc of
  // radius R reaching to the view's edge (or 1.5 × the largest pole found), indented by ε around
  // every pole on the axis (all of a rational f's, else those the last search found); set as the
  // polygon, to edit like any other.
  $('poly-indented').addEventListener('click', async () => {
    const v = zView();
    // the poles: every finite pole of a rational f (its partial fractions), else those the last search found
    const known = page.exprOk ? await rationalAnalysis(functionInput(state)) : null;
    const items = known && known.rational ? known.poles.map((at) => ({ kind: 'pole', at }))
      : ((page.found && page.found.items) || []).filter((it) => it.kind === 'pole');
    const onAxis = items.filter((it) => Math.abs(it.at[0]) <= 1e-9 * Math.max(1, Math.hypot(...it.at))).map((it) => it.at[1]);
    const fromView = Math.min(v[1], v[3], -v[2]);
    const largest = Math.max(0, ...items.map((it) => Math.hypot(...it.at)));
    const R = fromView > 0 ? 0.95 * fromView : largest > 0 ? 1.5 * largest : 1;
    const sorted = onAxis.slice().sort((a, b) => a - b);
    const gap = sorted.slice(1).reduce((m, y, k) => Math.min(m, y - sorted[k]), Infinity);
    const eps = Math.min(0.03 * R, 0.3 * gap);
    state.region.polygon = indentedAxisPolygon(R, onAxis, eps).map(([x, y]) => [Number(x.toPrecision(10)), Number(y.toPrecision(10))]);
    state.region.mode = 'polygon';
    state.region.reversed = false;
    edited(true);
  });
  $('poly-vertices').addEventListener('change', () => {
    const vs = parseVertices($('poly-vertices').value);
    $('poly-vertices').setAttribute('aria-invalid', vs ? 'false' : 'true');
    if (!vs) return;
    state.region.polygon = vs;
    state.region.mode = 'polygon';
    edited();
  });
  return editor;
}

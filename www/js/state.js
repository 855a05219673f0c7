// The page state, and keeping it: localStorage (when the browser allows it on
// this page) and the URL hash, so a link can carry a whole setup.

import { defaultIntegral, sanitizeIntegral } from './real-integral.js';

const STORAGE_KEY = 'residuary.page.v1';

/** The colour wheels (the contract's phase_plot `wheel` names). */
export const WHEELS = ['ramp', 'blue_yellow', 'oklch', 'hsv'];

/** localStorage that never throws (file:// pages may refuse it). */
export const safeStorage = {
  get(key) {
    try { return window.localStorage.getItem(key); } catch (e) { return null; }
  },
  set(key, value) {
    try { window.localStorage.setItem(key, value); return true; } catch (e) { return false; }
  },
};

export function defaultState() {
  return {
    f: '(z^3 - 1) / (z^2 + 0.4*z + 4)',
    var: 'z',
    params: [],
    view: [-3, 3, -3, 3],
    modulus: false,
    phase: false,
    infinity: false,
    wheel: 'ramp',       // the colour wheel: lightness rises with arg, readable in grey (a link's own wheel is kept)
    symbols: 'own',
    // the region: its mode (view, rect, circle, ellipse, polygon), each shape's numbers (ellipse:
    // [cx, cy, a, b, angle in radians]; polygon: its vertices in order) and reversed (a circle,
    // ellipse or rectangle taken clockwise: the page negates the core's counter-clockwise integral)
    region: { mode: 'view', rect: [-3, 3, -3, 3], circle: [0, 0, 2], ellipse: [0, 0, 2, 1, 0],
      polygon: [[0, 2], [-1.9, 0.62], [-1.18, -1.62], [1.18, -1.62], [1.9, 0.62]],
      half_disc: [0, 0, 2, 'upper'],          // [cx, cy, radius, side]
      keyhole: [0, 0, 0.1, 2, 0, null],      // [cx, cy, inner, outer, slit angle in radians, gap (null: the contract's default)]
      reversed: false },
    autoFind: true,
    hz: false,           // the transfer section's frequency unit: Hz (true) or rad/s
    sample_period: 1,    // its sampling period T (z)
    point: [-1, 0],      // the point its encirclements are counted about
    domain: 'auto',      // f read as a transfer function: 'auto' (by the variable's name), 's', 'z', 'none'
    integral: defaultIntegral(), // the real-integral block: {kind, omega, alpha, open} (real-integral.js)
    laurent: null, // the Laurent section's choice: {center: [x, y] | "infinity", inner, outer, from, to} (laurent-panel.js)
    trails: null, // pole trails for one parameter: {name, from, to, steps, shown} (trails.js)
  };
}

/** Bring any stored object into the current shape, dropping what does not fit. */
export function sanitize(raw) {
  const s = defaultState();
  if (!raw || typeof raw !== 'object') return s;
  const num4 = (v) => Array.isArray(v) && v.length === 4 && v.every(Number.isFinite);
  if (typeof raw.f === 'string') s.f = raw.f.slice(0, 4000);
  if (typeof raw.var === 'string') s.var = raw.var.slice(0, 40);
  if (Array.isArray(raw.params)) {
    s.params = raw.params
      .filter((p) => p && typeof p.name === 'string')
      .slice(0, 40)
      .map((p) => ({
        name: p.name.slice(0, 40),
        value: String(p.value ?? '0').slice(0, 80),
        lo: Number.isFinite(p.lo) ? p.lo : null,
        hi: Number.isFinite(p.hi) ? p.hi : null,
      }));
  }
  if (num4(raw.view) && raw.view[1] > raw.view[0] && raw.view[3] > raw.view[2]) s.view = raw.view;
  for (const k of ['modulus', 'phase', 'infinity', 'autoFind', 'hz']) if (typeof raw[k] === 'boolean') s[k] = raw[k];
  if (Number.isFinite(raw.sample_period) && raw.sample_period > 0) s.sample_period = raw.sample_period;
  if (Array.isArray(raw.point) && raw.point.length === 2 && raw.point.every(Number.isFinite)) s.point = raw.point.slice();
  if (['auto', 's', 'z', 'none'].includes(raw.domain)) s.domain = raw.domain;
  if (WHEELS.includes(raw.wheel)) s.wheel = raw.wheel;
  if (raw.symbols === 'own' || raw.symbols === 'diagram') s.symbols = raw.symbols;
  s.integral = sanitizeIntegral(raw.integral);
  const t = raw.trails;
  if (t && typeof t === 'object' && typeof t.name === 'string' && Number.isFinite(t.from) && Number.isFinite(t.to) && t.from !== t.to &&
    Number.isInteger(t.steps) && t.steps >= 2 && t.steps <= 400) {
    s.trails = { name: t.name.slice(0, 40), from: t.from, to: t.to, steps: t.steps, shown: t.shown !== false };
  }
  const l = raw.laurent;
  if (l && typeof l === 'object' && (l.center === 'infinity' || (Array.isArray(l.center) && l.center.length === 2 && l.center.every(Number.isFinite))) &&
    Number.isFinite(l.inner) && l.inner >= 0 && (l.outer === null || (Number.isFinite(l.outer) && l.outer > l.inner)) &&
    Number.isInteger(l.from) && Number.isInteger(l.to) && l.from <= l.to) {
    s.laurent = { center: l.center === 'infinity' ? 'infinity' : l.center.slice(), inner: l.inner, outer: l.outer, from: l.from, to: l.to };
  }
  const r = raw.region;
  if (r && typeof r === 'object') {
    if (['view', 'rect', 'circle', 'ellipse', 'polygon', 'half_disc', 'keyhole'].includes(r.mode)) s.region.mode = r.mode;
    const h = r.half_disc;
    if (Array.isArray(h) && h.length === 4 && h.slice(0, 3).every(Number.isFinite) && ['upper', 'lower', 'left', 'right'].includes(h[3])) s.region.half_disc = h.slice();
    const k = r.keyhole;
    if (Array.isArray(k) && k.length === 6 && k.slice(0, 5).every(Number.isFinite) && (k[5] === null || Number.isFinite(k[5]))) s.region.keyhole = k.slice();
    if (Array.isArray(r.ellipse) && r.ellipse.length === 5 && r.ellipse.every(Number.isFinite)) s.region.ellipse = r.ellipse;
    if (Array.isArray(r.polygon) && r.polygon.length >= 3 && r.polygon.length <= 200 &&
      r.polygon.every((p) => Array.isArray(p) && p.length === 2 && p.every(Number.isFinite))) s.region.polygon = r.polygon.map((p) => p.slice());
    if (typeof r.reversed === 'boolean') s.region.reversed = r.reversed;
    if (num4(r.rect)) s.region.rect = r.rect;
    if (Array.isArray(r.circle) && r.circle.length === 3 && r.circle.every(Number.isFinite)) s.region.circle = r.circle;
  }
  return s;
}

/** Encode for the URL hash. */
export function toHash(state) {
  return '#s=' + encodeURIComponent(JSON.stringify(state));
}

/** The state carried by a hash, or null. */
export function fromHash(hash) {
  const m = /^#s=(.*)$/.exec(hash || '');
  if (!m) return null;
  try {
    return sanitize(JSON.parse(decodeURIComponent(m[1])));
  } catch (e) {
    return null;
  }
}

/** Does the hash carry a state with a view of its own? */
export function hashGivesView(hash) {
  const m = /^#s=(.*)$/.exec(hash || '');
  if (!m) return false;
  try { const raw = JSON.parse(decodeURIComponent(m[1])); return Boolean(raw && Array.isArray(raw.view)); } catch (e) { return false; }
}

/** Has this browser kept a state of the page? */
export function hasStoredState() {
  return Boolean(safeStorage.get(STORAGE_KEY));
}

/** Where the page starts: the link's hash first, then what this browser kept, then the defaults. */
export function loadState() {
  const fromLink = fromHash(window.location.hash);
  if (fromLink) return fromLink;
  const stored = safeStorage.get(STORAGE_KEY);
  if (stored) {
    try { return sanitize(JSON.parse(stored)); } catch (e) { /* fall through */ }
  }
  return defaultState();
}

/** Keep the state in both places; failures are ignored (the page still works). */
export function saveState(state) {
  safeStorage.set(STORAGE_KEY, JSON.stringify(state));
  const hash = toHash(state);
  if (window.location.hash === hash) return;
  try {
    window.history.replaceState(null, '', hash);
  } catch (e) {
    try { window.location.replace(hash); } catch (e2) { /* keep going */ }
  }
}

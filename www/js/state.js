// The page state, and keeping it: localStorage (when the browser allows it on
// this page) and the URL hash, so a link can carry a whole setup. Both keep it whole
// (share.js packs a long state into the link); nothing is cut.

import { defaultIntegral, sanitizeIntegral } from './real-integral.js';
import { encodeLink, decodeLink } from './share.js';

const STORAGE_KEY = 'residuary.page.v1';
// What this browser had when a link replaced it ("Restore what you had").
const PREVIOUS_KEY = 'residuary.page.before-link.v1';

/** The colour wheels (the contract's phase_plot `wheel` names). */
export const WHEELS = ['ramp', 'blue_yellow', 'oklch', 'hsv'];

/** localStorage that never throws (file:// pages may refuse it). */
export const safeStorage = {
  get(key) {
    try { return window.localStorage.getItem(key); } catch (e) { return null; }
  },
  set(key, value) {
    return safeStorage.put(key, value) === 'ok';
  },
  /** 'ok', 'full' (the browser's quota is used up) or 'refused' (no storage on this page). */
  put(key, value) {
    try { window.localStorage.setItem(key, value); return 'ok'; } catch (e) {
      const full = e && (e.name === 'QuotaExceededError' || e.name === 'NS_ERROR_DOM_QUOTA_REACHED' || e.code === 22);
      return full ? 'full' : 'refused';
    }
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
    complex_format: 'columns', // complex numbers in exported and copied text: 'columns' (re, im), 'j' (a+bj) or 'i' (a+bi) (export.js)
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
    scheme: 'system', // the page's colours: 'light', 'dark' or 'system' (follows prefers-color-scheme)
    // embedding (embed.js, docs/embedding.md): a link's compact mode, its panels (null: the default
    // ones) and the one parent origin whose messages the framed page takes (null: its parent's, any)
    compact: false, compact_panels: null, parent_origin: null,
  };
}

/** Bring any stored object into the current shape, dropping what does not fit. */
export function sanitize(raw) {
  const s = defaultState();
  if (!raw || typeof raw !== 'object') return s;
  const num4 = (v) => Array.isArray(v) && v.length === 4 && v.every(Number.isFinite);
  // strings are kept whole: a cut f would be another function (the core refuses one too long)
  if (typeof raw.f === 'string') s.f = raw.f;
  if (typeof raw.var === 'string') s.var = raw.var;
  if (Array.isArray(raw.params)) {
    s.params = raw.params
      .filter((p) => p && typeof p.name === 'string')
      .slice(0, 40)
      .map((p) => ({
        name: p.name,
        value: String(p.value ?? '0'),
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
  if (['columns', 'j', 'i'].includes(raw.complex_format)) s.complex_format = raw.complex_format;
  if (['light', 'dark', 'system'].includes(raw.scheme)) s.scheme = raw.scheme;
  s.integral = sanitizeIntegral(raw.integral);
  if (raw.compact === true) s.compact = true;
  if (Array.isArray(raw.compact_panels)) s.compact_panels = raw.compact_panels.filter((p) => typeof p === 'string' && /^[a-z]{1,20}$/.test(p)).slice(0, 20);
  if (typeof raw.parent_origin === 'string' && /^https?:\/\/[^\s/]+$/.test(raw.parent_origin)) s.parent_origin = raw.parent_origin;
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

/** Two states the same once each is brought into the current shape? */
export function sameState(a, b) {
  return JSON.stringify(sanitize(a)) === JSON.stringify(sanitize(b));
}

/** What this browser kept (brought into the current shape), or null. */
export function storedState(key = STORAGE_KEY) {
  const text = safeStorage.get(key);
  if (!text) return null;
  try { return sanitize(JSON.parse(text)); } catch (e) { return null; }
}

/** Where the page starts (async: a packed link is unpacked by the browser's decompression).
 *  The link's state first, then what this browser kept, then the defaults. Resolves with
 *  {state, fromLink, linkGivesView, hadStored, previous (the kept state a link replaced, or null),
 *  problem (why a link that claims a state could not be read, or null)}. */
export async function openState(hash) {
  const stored = storedState();
  const link = await decodeLink(hash || '');
  if (link.kind === 'ok') {
    const state = sanitize(link.raw);
    const previous = !state.compact && stored && !sameState(stored, state) ? stored : null; // a frame replaces nothing
    if (previous) safeStorage.put(PREVIOUS_KEY, JSON.stringify(previous));
    return { state, fromLink: true, linkGivesView: Array.isArray(link.raw.view), hadStored: Boolean(stored), previous, problem: null };
  }
  return { state: stored || defaultState(), fromLink: false, linkGivesView: false, hadStored: Boolean(stored), previous: null,
    problem: link.kind === 'bad' ? link.reason : null };
}

/** The state a link carries: {kind: 'ok', state} | {kind: 'bad', reason} | {kind: 'none'}. */
export async function stateFromLink(hash) {
  const link = await decodeLink(hash || '');
  return link.kind === 'ok' ? { kind: 'ok', state: sanitize(link.raw) } : link;
}

let stateWrites = 0;
let lastStateHash = '';
let storageListener = null;
/** The hash the page wrote last (a hashchange to it is the page's own). */
export const lastWrittenHash = () => lastStateHash;
/** `fn(outcome)` hears each storage write: 'ok', 'full' or 'refused'. */
export function onStorage(fn) { storageListener = fn; }

/** Keep the state in both places, whole: this browser's storage (its outcome goes to the
 *  onStorage listener; a compact, embedded page keeps nothing in the browser, so a frame never
 *  overwrites the user's own page) and the address (packed when long; the newest call wins). */
export async function saveState(state) {
  const serial = ++stateWrites;
  const json = JSON.stringify(state);
  const outcome = state.compact ? 'ok' : safeStorage.put(STORAGE_KEY, json);
  if (storageListener && !state.compact) storageListener(outcome);
  let hash;
  try { hash = await encodeLink(JSON.parse(json)); } catch (e) { return outcome; }
  if (serial !== stateWrites || window.location.hash === hash) return outcome;
  lastStateHash = hash;
  try {
    window.history.replaceState(null, '', hash);
  } catch (e) {
    try { window.location.replace(hash); } catch (e2) { /* keep going */ }
  }
  return outcome;
}

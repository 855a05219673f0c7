// The page's colours: light or dark, chosen in Display ("as the system is set" follows
// prefers-color-scheme). style.css holds both palettes as custom properties under
// html[data-scheme=light|dark]; canvas drawings read their colours from the same properties
// through ink(), so charts follow the scheme.

const schemeMedia = typeof window !== 'undefined' && window.matchMedia ? window.matchMedia('(prefers-color-scheme: dark)') : null;
let schemeChoiceNow = 'system';
let schemeForced = null; // print.js prints light whatever the screen shows
let schemeCache = new Map();
let schemeListener = null;

/** The scheme in use: 'light' or 'dark'. */
export function schemeInUse() {
  if (schemeForced) return schemeForced;
  if (schemeChoiceNow === 'light' || schemeChoiceNow === 'dark') return schemeChoiceNow;
  return schemeMedia && schemeMedia.matches ? 'dark' : 'light';
}

function applySchemeNow() {
  const root = document.documentElement;
  const next = schemeInUse();
  root.dataset.schemeChoice = schemeChoiceNow;
  if (root.dataset.scheme === next) return;
  root.dataset.scheme = next;
  schemeCache = new Map();
  if (schemeListener) schemeListener(next);
}

/** Use `c` ('light', 'dark' or 'system'); `onChange(scheme)` hears every change of the scheme in use. */
export function setScheme(c, onChange) {
  schemeChoiceNow = ['light', 'dark', 'system'].includes(c) ? c : 'system';
  if (onChange) schemeListener = onChange;
  applySchemeNow();
}

/** Force a scheme (print.js: 'light') or stop forcing (null). */
export function forceScheme(s) {
  schemeForced = s;
  applySchemeNow();
}

if (schemeMedia && schemeMedia.addEventListener) schemeMedia.addEventListener('change', () => applySchemeNow());

/** A colour of the scheme in use for canvas drawing: the custom property --`name` of the page. */
export function ink(name) {
  let v = schemeCache.get(name);
  if (v === undefined) {
    v = getComputedStyle(document.documentElement).getPropertyValue('--' + name).trim() || '#808080';
    schemeCache.set(name, v);
  }
  return v;
}

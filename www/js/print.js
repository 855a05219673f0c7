// Printing the page: style.css's print block hides the controls; here, before printing, every
// section is opened, a header names the function, its variable and parameters, the view and
// the date, the page's colours go light (paper) and the phase plot is rendered by the core at
// print resolution (PRINT_SCALE × its size on screen) into an <img> that replaces the canvas.
// After printing everything goes back as it was. Both beforeprint/afterprint and the print
// media query (a page printed by a headless browser, or emulated) start it.
import { $, el } from './dom.js';
import { plotOnce } from './engine.js';
import { paramsForRequest } from './params.js';
import { forceScheme } from './scheme.js';
import { fmtReal } from './format.js';

/** The plot is drawn at this many image pixels per CSS pixel of the screen's plot (2–3×)... */
export const PRINT_SCALE = 3;
/** ... within this many pixels in all (the core renders it on the main thread). */
const PRINT_PIXELS = 6e6;
// Sections not opened for print: the raw sample tables (hundreds of rows) and the entry forms.
const KEEP_FOLDED = 'details.tf-data, #entry-box';

/** The header's lines for `state` at `when` (a Date): [[label, text], …]. */
export function printHeaderLines(state, when) {
  const v = state.var.trim() || 'z';
  const { params } = paramsForRequest(state.params);
  const names = Object.keys(params);
  const value = (x) => (Array.isArray(x) ? `${fmtReal(x[0], 12)} ${x[1] < 0 ? '−' : '+'} ${fmtReal(Math.abs(x[1]), 12)}i` : fmtReal(x, 12));
  const [x0, x1, y0, y1] = state.view;
  const pad = (n) => String(n).padStart(2, '0');
  const date = `${when.getFullYear()}-${pad(when.getMonth() + 1)}-${pad(when.getDate())} ${pad(when.getHours())}:${pad(when.getMinutes())}`;
  return [
    ['Function', `f(${v}) = ${state.f}`],
    ['Variable', v],
    ['Parameters', names.length ? names.map((n) => `${n} = ${value(params[n])}`).join('; ') : 'none'],
    ['View', `Re ${v} from ${fmtReal(x0, 6)} to ${fmtReal(x1, 6)}, Im ${v} from ${fmtReal(y0, 6)} to ${fmtReal(y1, 6)}` + (state.infinity ? ` (about infinity: f(1/w))` : '')],
    ['Printed', date],
  ];
}

/** The phase plot with its overlays and axes at `k` image pixels per CSS pixel, as a PNG data URL
 *  (the core's picture at that resolution; the screen's picture scaled when the core cannot). */
export function plotAtPrintResolution(plot, request, k) {
  const scale = Math.max(1, Math.min(k, Math.sqrt(PRINT_PIXELS / Math.max(1, plot.cssW * plot.cssH))));
  const W = Math.round(plot.pw * scale), H = Math.round(plot.ph * scale);
  const view = plot.getView();
  let fine = null;
  if (request) {
    const out = plotOnce(Object.assign({}, request, { task: 'phase_plot', view, size: [W, H], format: 'rgba' }));
    if (!out.error && out.rgba && out.rgba.length === W * H * 4) {
      const c = document.createElement('canvas');
      c.width = W; c.height = H;
      const ctx = c.getContext('2d');
      ctx.putImageData(new ImageData(new Uint8ClampedArray(out.rgba), W, H), 0, 0);
      fine = { canvas: c, ctx, box: view, rowsDone: H };
    }
  }
  const big = document.createElement('canvas');
  big.width = Math.round(plot.cssW * scale);
  big.height = Math.round(plot.cssH * scale);
  const saved = { ctx: plot.ctx, coarse: plot.coarse, fine: plot.fine, pixelRatio: plot.pixelRatio };
  plot.ctx = big.getContext('2d');
  plot.pixelRatio = scale;
  if (fine) { plot.coarse = null; plot.fine = fine; }
  try { plot.draw(); } finally { Object.assign(plot, saved); }
  return { url: big.toDataURL('image/png'), width: big.width, height: big.height, scale, fromCore: Boolean(fine) };
}

/** Hooks: request() (the plot's function and options, or null), redraw() (the charts, after the
 *  colours change). Returns {before, after, printing()} (tests call them too). */
export function attachPrint(page, hooks) {
  const head = $('print-head'), figure = page.ui.canvas.parentElement;
  let saved = null;
  // Sections opened (and closed again) for print do not hear it: their own toggle handlers would
  // start computing, or keep the opening in the page state. The capture phase at the document
  // comes before the element's own listeners.
  const quiet = new Set();
  document.addEventListener('toggle', (ev) => { if (quiet.has(ev.target)) ev.stopImmediatePropagation(); }, true);

  function before() {
    if (saved) return;
    saved = { opened: [] };
    for (const d of document.querySelectorAll('details')) {
      if (!d.open && !d.matches(KEEP_FOLDED)) { quiet.add(d); d.open = true; saved.opened.push(d); }
    }
    head.textContent = '';
    head.append(el('h1', { text: 'residuary' }));
    for (const [label, text] of printHeaderLines(page.state, new Date())) {
      head.append(el('p', { class: label === 'Function' ? 'print-line print-f' : 'print-line', 'data-line': label.toLowerCase() },
        el('strong', { text: label + ': ' }), text));
    }
    head.hidden = false;
    forceScheme('light');
    hooks.redraw();
    const pic = plotAtPrintResolution(page.plot, hooks.request(), PRINT_SCALE);
    const img = el('img', { class: 'print-plot', id: 'print-plot', src: pic.url, alt: page.ui.canvas.getAttribute('aria-label') || 'Phase plot',
      'data-scale': String(pic.scale), 'data-from-core': String(pic.fromCore), width: String(pic.width), height: String(pic.height) });
    figure.append(img);
    figure.classList.add('printing');
    document.documentElement.dataset.printing = 'true';
    document.body.dataset.prints = String(Number(document.body.dataset.prints || 0) + 1); // how many times made ready (tests)
  }

  function after() {
    if (!saved) return;
    const opened = saved.opened;
    for (const d of opened) d.open = false;
    saved = null;
    setTimeout(() => { if (!saved) for (const d of opened) quiet.delete(d); }, 200); // after their toggle events
    head.hidden = true;
    head.textContent = '';
    const img = $('print-plot');
    if (img) img.remove();
    figure.classList.remove('printing');
    delete document.documentElement.dataset.printing;
    forceScheme(null);
    hooks.redraw();
  }

  window.addEventListener('beforeprint', before);
  window.addEventListener('afterprint', after);
  const media = window.matchMedia ? window.matchMedia('print') : null;
  if (media && media.addEventListener) media.addEventListener('change', (e) => (e.matches ? before() : after()));
  return { before, after, printing: () => Boolean(saved) };
}

// Export and copy: the plot as PNG (the core's picture at a chosen resolution, with or without
// the axes and the overlay) or as SVG (the overlay in vector form, the picture optionally inside
// as a PNG <image>); every result as JSON and every table in it as CSV, JSON or tab-separated
// text, numbers machine-readable (format.js numText: round-trip digits, ASCII minus; complex
// numbers as re/im columns, "a+bj" or "a+bi", the state's complex_format); copy buttons; and
// a copy handler that makes a selection in any table of the page clean tab-separated values.
// The tables are read from window.residuary.results() (docs/scripting.md), so what is exported
// is what the API gives.
import { el, copyText } from './dom.js';
import { numText, complexText, parseExact, cleanNumberText, COMPLEX_FORMATS } from './format.js';
import { runHeavy, responseError } from './engine.js';
import { MARGIN, viewBox } from './plot/view.js';
import { drawAxes } from './plot/axes.js';

// ---- the tables of a results() object ---------------------------------------------------------

/** The page's additions to a result that restate its input (the contour, the function, the
 *  request): left out of the tables (every result's JSON keeps them). */
const INPUT_FIELDS = new Set(['region', 'contour', 'request']);
/** Pairs of numbers that are not complex numbers (an interval, a span, a size). */
const NOT_COMPLEX = new Set(['radii', 'span', 'semi_axes', 'size', 'rows', 'view', 't', 'n', 'omega', 'magnitude_db', 'phase_deg',
  'gain_crossovers', 'phase_margins', 'phase_crossovers', 'gain_margins', 'error_estimates', 'values']);
/** Lists of samples: a list of numbers as long as one of these beside it is a sample list too. */
const SAMPLE_KEYS = ['t', 'n', 'omega'];
const isNumOrNull = (x) => x === null || typeof x === 'number';
const isPlain = (x) => x !== null && typeof x === 'object' && !Array.isArray(x);
/** [re, im] (either may be null: not finite in the contract's JSON) under the field `name`. */
const isComplex = (v, name) => Array.isArray(v) && v.length === 2 && v.every(isNumOrNull) && !NOT_COMPLEX.has(name);

/** A table cell: {c: [re, im]} for a complex number, else a number, string, boolean or null. */
function cellOf(v, name) {
  if (isComplex(v, name)) return { c: v };
  if (Array.isArray(v) || isPlain(v)) return JSON.stringify(v);
  return v;
}

/** Rows of objects as a table: columns in order of first appearance, nested objects as dotted names. */
function rowsTable(name, items) {
  const cols = [];
  const index = new Map();
  const flat = items.map((it) => {
    const out = {};
    const walk = (o, prefix) => {
      for (const [k, v] of Object.entries(o)) {
        const p = prefix ? `${prefix}.${k}` : k;
        if (isPlain(v)) { walk(v, p); continue; }
        if (!index.has(p)) { index.set(p, cols.length); cols.push(p); }
        out[p] = cellOf(v, k);
      }
    };
    walk(it, '');
    return out;
  });
  return { name, columns: cols, rows: flat.map((o) => cols.map((c) => (c in o ? o[c] : null))) };
}

/** Every table of one results() entry `key`: arrays of objects (poles, terms, coefficients, points,
 *  residues used), parallel arrays of numbers (samples: t with f, ω with dB and degrees), and the
 *  rest (values, flags, words) as one "key" table of field and value. */
export function entryTables(key, entry) {
  const tables = [];
  const summary = [];
  const used = new Set();
  const unique = (n) => { let m = n, k = 2; while (used.has(m)) m = `${n}.${k++}`; used.add(m); return m; };
  const walk = (obj, path) => {
    const series = [];
    const sampleLen = SAMPLE_KEYS.map((k) => (Array.isArray(obj[k]) ? obj[k].length : -1));
    for (const [k, v] of Object.entries(obj)) {
      const p = path ? `${path}.${k}` : k;
      if (!path && INPUT_FIELDS.has(k)) continue; // what it was computed for: in the JSON, not a table
      if (!Array.isArray(v) && !isPlain(v)) { summary.push([p, v]); continue; }
      if (isPlain(v)) { walk(v, p); continue; }
      const sampled = sampleLen.includes(v.length) && v.every(isNumOrNull);
      if ((isComplex(v, k) && !sampled) || v.length === 0) { summary.push([p, cellOf(v, k)]); continue; }
      if (v.every(isPlain)) { tables.push(rowsTable(unique(`${key}.${p}`), v)); continue; }
      if (v.every(isNumOrNull) || v.every((x) => isComplex(x, ''))) { series.push([k, v]); continue; }
      summary.push([p, JSON.stringify(v)]);
    }
    const groups = new Map();
    for (const s of series) {
      if (!groups.has(s[1].length)) groups.set(s[1].length, []);
      groups.get(s[1].length).push(s);
    }
    for (const g of groups.values()) {
      const name = g.length === 1 ? `${key}.${path ? path + '.' : ''}${g[0][0]}` : `${key}${path ? '.' + path : ''}.samples`;
      const n = g[0][1].length;
      const rows = [];
      for (let i = 0; i < n; i++) rows.push(g.map(([k, a]) => cellOf(a[i], '')));
      tables.push({ name: unique(name), columns: g.map(([k]) => k), rows });
    }
  };
  if (isPlain(entry)) walk(entry, '');
  if (summary.length) tables.unshift({ name: unique(key), columns: ['field', 'value'], rows: summary.map(([p, v]) => [p, v]) });
  return tables;
}

/** Every table of a results() object, in the order of its keys. */
export function resultTables(results) {
  const out = [];
  for (const [key, entry] of Object.entries(results || {})) out.push(...entryTables(key, entry));
  return out;
}

// ---- writing a table: machine-readable cells ---------------------------------------------------

/** The table as rows of text cells (with its heading row first) in complex format `fmt`:
 *  'columns' splits each column holding a complex number into "name.re" and "name.im" (a cell
 *  there that is not a complex number, e.g. a field's whole number, leaves "name.im" empty). */
export function tableMatrix(table, fmt = 'columns') {
  const complexCol = table.columns.map((_, j) => table.rows.some((r) => r[j] && typeof r[j] === 'object' && r[j].c));
  const split = fmt === 'columns';
  const head = [];
  table.columns.forEach((c, j) => { if (split && complexCol[j]) head.push(c + '.re', c + '.im'); else head.push(c); });
  const text = (v) => (v === null || v === undefined ? '' : typeof v === 'number' ? numText(v) : String(v));
  const rows = table.rows.map((r) => {
    const out = [];
    r.forEach((v, j) => {
      const isC = v && typeof v === 'object' && v.c;
      if (split && complexCol[j]) {
        if (isC) out.push(text(v.c[0]), text(v.c[1]));
        else out.push(text(v), ''); // not a complex number: no imaginary part written
      } else out.push(isC ? complexText(v.c, fmt === 'i' ? 'i' : 'j') : text(v));
    });
    return out;
  });
  return [head, ...rows];
}

/** RFC 4180 CSV: commas, CRLF line ends, fields with a comma, quote or line break quoted. */
export function toCSV(matrix) {
  const q = (s) => (/[",\r\n]/.test(s) ? '"' + s.replace(/"/g, '""') + '"' : s);
  return matrix.map((r) => r.map(q).join(',')).join('\r\n') + '\r\n';
}

/** Tab-separated values (tabs and line breaks inside a field become spaces). */
export function toTSV(matrix) {
  return matrix.map((r) => r.map((s) => s.replace(/[\t\r\n]+/g, ' ')).join('\t')).join('\n') + '\n';
}

/** The table as JSON {table, complex_format, columns, rows}: numbers as JSON numbers (null: not
 *  finite), complex numbers split into two columns or written "a+bj" / "a+bi". */
export function toTableJSON(table, fmt = 'columns') {
  const split = fmt === 'columns';
  const complexCol = table.columns.map((_, j) => table.rows.some((r) => r[j] && typeof r[j] === 'object' && r[j].c));
  const columns = [];
  table.columns.forEach((c, j) => { if (split && complexCol[j]) columns.push(c + '.re', c + '.im'); else columns.push(c); });
  const rows = table.rows.map((r) => {
    const out = [];
    r.forEach((v, j) => {
      const isC = v && typeof v === 'object' && v.c;
      if (split && complexCol[j]) { if (isC) out.push(v.c[0], v.c[1]); else out.push(v === undefined ? null : v, null); }
      else out.push(isC ? complexText(v.c, fmt === 'i' ? 'i' : 'j') : v === undefined ? null : v);
    });
    return out;
  });
  return JSON.stringify({ table: table.name, complex_format: fmt, columns, rows }, null, 1) + '\n';
}

// ---- files and the clipboard -----------------------------------------------------------------

/** Offer `data` (string or bytes) as a download named `name`. */
export function download(data, name, type) {
  const url = URL.createObjectURL(data instanceof Blob ? data : new Blob([data], { type }));
  const a = el('a', { href: url, download: name });
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10000);
}


/** A selection inside a table as tab-separated values: each selected row, each cell's number in
 *  full precision (a cell's data-copy, else the full-precision title format.js fmtExact wrote,
 *  else its text made machine-readable), complex numbers in format `fmt`. Null: the selection is
 *  not across cells of one table. */
export function selectionTSV(selection, fmt) {
  if (!selection || selection.rangeCount === 0 || selection.isCollapsed) return null;
  const range = selection.getRangeAt(0);
  const start = range.startContainer.nodeType === 1 ? range.startContainer : range.startContainer.parentElement;
  const table = start && start.closest ? start.closest('table') : null;
  if (!table || !table.contains(range.endContainer)) return null;
  // a node is taken when the selection covers some of its contents (not when it only touches its edge)
  const overlaps = (node) => {
    const r = document.createRange();
    r.selectNodeContents(node);
    return range.compareBoundaryPoints(Range.START_TO_END, r) > 0 && range.compareBoundaryPoints(Range.END_TO_START, r) < 0;
  };
  const rows = Array.from(table.rows).filter(overlaps);
  const cellsOf = (tr) => Array.from(tr.cells).filter(overlaps);
  const picked = rows.map(cellsOf).filter((cs) => cs.length);
  if (picked.length < 2 && (!picked.length || picked[0].length < 2)) return null; // inside one cell: the browser's own copy
  const unit = fmt === 'i' ? 'i' : 'j';
  const value = (td) => {
    if (td.dataset && td.dataset.copy !== undefined) return { t: td.dataset.copy };
    const z = td.tagName === 'TD' ? parseExact(td.title) : null;
    if (z) return { c: z };
    return { t: cleanNumberText(td.textContent, unit) };
  };
  const matrix = picked.map((cs) => cs.map(value));
  const width = Math.max(...matrix.map((r) => r.length));
  const complexCol = Array.from({ length: width }, (_, j) => matrix.some((r) => r[j] && r[j].c));
  const split = fmt === 'columns';
  return matrix.map((r, i) => r.flatMap((v, j) => {
    const th = picked[i][j].tagName === 'TH';
    if (v.c) return split ? [numText(v.c[0]), numText(v.c[1])] : [complexText(v.c, unit)];
    if (split && complexCol[j]) return th ? [v.t + ' (re)', v.t + ' (im)'] : [v.t, ''];
    return [v.t];
  }).map((s) => s.replace(/[\t\r\n]+/g, ' ')).join('\t')).join('\n') + '\n';
}

// ---- the picture -----------------------------------------------------------------------------

function base64Bytes(text) {
  const bin = atob(text);
  const bytes = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  return bytes;
}
function bytesBase64(bytes) {
  let s = '';
  for (let i = 0; i < bytes.length; i += 0x8000) s += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000));
  return btoa(s);
}

/** The export's frame: a stand-in for the page's plot (same markers, region, trails, …) with the
 *  picture W×H pixels at k pixels per CSS pixel, showing the plot's view (widened to W:H). */
function frame(plot, opts) {
  let k, W, H;
  if (opts.width && opts.height) {
    W = Math.round(opts.width); H = Math.round(opts.height);
    k = W / plot.pw;
  } else {
    k = opts.scale || 1;
    W = Math.max(1, Math.round(plot.pw * k)); H = Math.max(1, Math.round(plot.ph * k));
  }
  const p = Object.create(plot);
  const [x0, x1, y0, y1] = viewBox(plot);
  p.pw = W / k; p.ph = H / k;
  p.cssW = p.pw + MARGIN.left + MARGIN.right; p.cssH = p.ph + MARGIN.top + MARGIN.bottom;
  p.cx = (x0 + x1) / 2; p.cy = (y0 + y1) / 2;
  p.scale = Math.max((x1 - x0) / p.pw, (y1 - y0) / p.ph);
  p.contourEdit = null; // no editing handles in an export
  p.selected = -1;
  return { p, k, W, H, view: viewBox(p) };
}

/** The limits of a picture (the core renders at most 16 million pixels). */
export const MAX_PIXELS = 16777216;

/** The core's picture of the frame: the phase_plot task's response in `format` ('png' or 'rgba'). */
async function corePicture(baseRequest, fr, format) {
  const base = baseRequest();
  if (!base) return { error: { code: 'not_ready', message: 'the computing core is still loading', span: null } };
  if (fr.W * fr.H > MAX_PIXELS) return { error: { code: 'invalid_field', message: `the picture would have ${fr.W * fr.H} pixels; at most ${MAX_PIXELS}`, span: null } };
  const req = Object.assign({}, base, { task: 'phase_plot', view: fr.view, size: [fr.W, fr.H], format,
    max_evaluations: Math.min(1e9, Math.max(2e7, fr.W * fr.H * 64)) });
  const resp = await runHeavy(req);
  return responseError(resp) ? { error: responseError(resp) } : resp;
}

/** What is around and over the picture, drawn on `ctx` (a canvas context, or svgContext's). */
function compose(fr, ctx, opts, drawPicture) {
  const { p, k } = fr;
  p.ctx = ctx;
  const ox = opts.axes ? 0 : -MARGIN.left * k, oy = opts.axes ? 0 : -MARGIN.top * k;
  ctx.setTransform(k, 0, 0, k, ox, oy);
  if (opts.axes) { ctx.fillStyle = '#fff'; ctx.fillRect(0, 0, p.cssW, p.cssH); }
  ctx.save();
  ctx.beginPath();
  ctx.rect(MARGIN.left, MARGIN.top, p.pw, p.ph);
  ctx.clip();
  drawPicture();
  if (opts.overlay) p.drawOverlays(p); // plot.js drawOverlays
  ctx.restore();
  if (opts.axes) drawAxes(p);
}

const sizeOf = (fr, opts) => (opts.axes ? [Math.round(fr.p.cssW * fr.k), Math.round(fr.p.cssH * fr.k)] : [fr.W, fr.H]);

/** The plot as PNG bytes. opts: scale (pixels per CSS pixel of the plot, default 1) or width and
 *  height (the picture's pixels), axes (the frame, ticks and labels around it), overlay (markers,
 *  contour, trails, …). Without axes and overlay these are the core's PNG bytes as they are.
 *  Resolves {png: Uint8Array, width, height} or {error}. */
export async function plotPNG(plot, baseRequest, opts = {}) {
  const fr = frame(plot, opts);
  if (!opts.axes && !opts.overlay) {
    const r = await corePicture(baseRequest, fr, 'png');
    return r.error ? r : { png: base64Bytes(r.data), width: r.width, height: r.height };
  }
  const r = await corePicture(baseRequest, fr, 'rgba');
  if (r.error) return r;
  const pic = document.createElement('canvas');
  pic.width = r.width; pic.height = r.height;
  const rgba = base64Bytes(r.data);
  pic.getContext('2d').putImageData(new ImageData(new Uint8ClampedArray(rgba.buffer), r.width, r.height), 0, 0);
  const [cw, ch] = sizeOf(fr, opts);
  const out = document.createElement('canvas');
  out.width = cw; out.height = ch;
  const ctx = out.getContext('2d');
  compose(fr, ctx, opts, () => {
    ctx.imageSmoothingEnabled = false;
    ctx.drawImage(pic, MARGIN.left, MARGIN.top, fr.p.pw, fr.p.ph);
    ctx.imageSmoothingEnabled = true;
  });
  const blob = await new Promise((resolve) => out.toBlob(resolve, 'image/png'));
  if (!blob) return { error: { code: 'internal', message: 'the browser could not encode the PNG', span: null } };
  return { png: new Uint8Array(await blob.arrayBuffer()), width: cw, height: ch };
}

/** The plot as SVG text: the overlay (and the axes, with opts.axes) as vector paths and text,
 *  the core's picture inside as a PNG <image> when opts.picture. Resolves {svg, width, height} or {error}. */
export async function plotSVG(plot, baseRequest, opts = {}) {
  const fr = frame(plot, opts);
  let href = null;
  if (opts.picture) {
    const r = await corePicture(baseRequest, fr, 'png');
    if (r.error) return r;
    href = 'data:image/png;base64,' + r.data;
  }
  const [w, h] = sizeOf(fr, Object.assign({}, opts));
  const ctx = svgContext(w, h);
  compose(fr, ctx, Object.assign({ overlay: true }, opts), () => {
    if (href) ctx.image(href, MARGIN.left, MARGIN.top, fr.p.pw, fr.p.ph);
  });
  return { svg: ctx.finish(), width: w, height: h };
}

// ---- a 2-D context that writes SVG (the subset the plot's drawing uses) ----------------------

const esc = (s) => String(s).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const r3 = (x) => String(Math.round(x * 1000) / 1000);

/** A stand-in for CanvasRenderingContext2D recording SVG: paths are transformed as they are built
 *  (arcs as polylines), text carries the transform; clip() opens a clipped group until restore(). */
export function svgContext(width, height) {
  const parts = [];
  let m = [1, 0, 0, 1, 0, 0];
  let path = [];       // subpaths: [[x, y], …] in output coordinates, .closed
  let clipN = 0;
  const stack = [];
  const measurer = document.createElement('canvas').getContext('2d');
  const st = { fillStyle: '#000', strokeStyle: '#000', lineWidth: 1, font: '10px sans-serif', textAlign: 'start', textBaseline: 'alphabetic', lineJoin: 'miter', dash: [], groups: 0 };
  const T = (x, y) => [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];
  const scaleOf = () => Math.sqrt(Math.abs(m[0] * m[3] - m[1] * m[2]));
  const cur = () => path[path.length - 1];
  const d = () => path.map((sp) => sp.map(([x, y], i) => `${i ? 'L' : 'M'}${r3(x)} ${r3(y)}`).join('') + (sp.closed ? 'Z' : '')).join('');
  const strokeAttrs = () => `fill="none" stroke="${esc(st.strokeStyle)}" stroke-width="${r3(st.lineWidth * scaleOf())}" stroke-linejoin="${st.lineJoin}"` +
    (st.dash.length ? ` stroke-dasharray="${st.dash.map((x) => r3(x * scaleOf())).join(' ')}"` : '');
  const anchor = { start: 'start', left: 'start', center: 'middle', end: 'end', right: 'end' };
  const baseline = { alphabetic: 'auto', middle: 'central', top: 'hanging', hanging: 'hanging', bottom: 'text-after-edge', ideographic: 'text-after-edge' };
  const text = (s, x, y, paint) => parts.push(`<text x="${r3(x)}" y="${r3(y)}" transform="matrix(${m.map(r3).join(' ')})" ` +
    `style="font:${esc(st.font)}" text-anchor="${anchor[st.textAlign] || 'start'}" dominant-baseline="${baseline[st.textBaseline] || 'auto'}" ${paint}>${esc(s)}</text>`);
  const ctx = {
    get fillStyle() { return st.fillStyle; }, set fillStyle(v) { st.fillStyle = String(v); },
    get strokeStyle() { return st.strokeStyle; }, set strokeStyle(v) { st.strokeStyle = String(v); },
    get lineWidth() { return st.lineWidth; }, set lineWidth(v) { st.lineWidth = Number(v); },
    get font() { return st.font; }, set font(v) { st.font = String(v); },
    get textAlign() { return st.textAlign; }, set textAlign(v) { st.textAlign = String(v); },
    get textBaseline() { return st.textBaseline; }, set textBaseline(v) { st.textBaseline = String(v); },
    get lineJoin() { return st.lineJoin; }, set lineJoin(v) { st.lineJoin = String(v); },
    imageSmoothingEnabled: true,
    setTransform(a, b, c, dd, e, f) { m = [a, b, c, dd, e, f]; },
    translate(x, y) { m = [m[0], m[1], m[2], m[3], m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]]; },
    rotate(t) {
      const c = Math.cos(t), s = Math.sin(t);
      m = [m[0] * c + m[2] * s, m[1] * c + m[3] * s, -m[0] * s + m[2] * c, -m[1] * s + m[3] * c, m[4], m[5]];
    },
    save() { stack.push(Object.assign({}, st, { m: m.slice(), dash: st.dash.slice() })); st.groups = 0; },
    restore() {
      for (; st.groups > 0; st.groups--) parts.push('</g>');
      const s = stack.pop();
      if (s) { Object.assign(st, s); m = s.m; delete st.m; }
    },
    setLineDash(a) { st.dash = Array.isArray(a) ? a.slice() : []; },
    beginPath() { path = []; },
    moveTo(x, y) { const sp = [T(x, y)]; path.push(sp); },
    lineTo(x, y) { if (!cur()) path.push([]); cur().push(T(x, y)); },
    closePath() { if (cur()) { cur().closed = true; const first = cur()[0]; if (first) path.push([first]); } },
    rect(x, y, w, h) { const sp = [T(x, y), T(x + w, y), T(x + w, y + h), T(x, y + h)]; sp.closed = true; path.push(sp); },
    arc(x, y, r, a0, a1, ccw) {
      let span = a1 - a0;
      if (ccw) { if (span > 0) span -= 2 * Math.PI * Math.ceil(span / (2 * Math.PI)); span = Math.max(span, -2 * Math.PI); }
      else { if (span < 0) span += 2 * Math.PI * Math.ceil(-span / (2 * Math.PI)); span = Math.min(span, 2 * Math.PI); }
      const n = Math.max(8, Math.ceil(Math.abs(span) / (Math.PI / 48)));
      for (let i = 0; i <= n; i++) {
        const a = a0 + span * i / n;
        const q = T(x + r * Math.cos(a), y + r * Math.sin(a));
        if (i === 0 && cur()) cur().push(q); else if (i === 0) path.push([q]); else cur().push(q);
      }
    },
    stroke() { if (path.length) parts.push(`<path d="${d()}" ${strokeAttrs()}/>`); },
    fill() { if (path.length) parts.push(`<path d="${d()}" fill="${esc(st.fillStyle)}" stroke="none"/>`); },
    clip() {
      const id = `clip${++clipN}`;
      parts.push(`<clipPath id="${id}"><path d="${d()}"/></clipPath><g clip-path="url(#${id})">`);
      st.groups++;
    },
    fillRect(x, y, w, h) { const save = path; path = []; ctx.rect(x, y, w, h); ctx.fill(); path = save; },
    strokeRect(x, y, w, h) { const save = path; path = []; ctx.rect(x, y, w, h); ctx.stroke(); path = save; },
    clearRect() {},
    fillText(s, x, y) { text(s, x, y, `fill="${esc(st.fillStyle)}"`); },
    strokeText(s, x, y) { text(s, x, y, `fill="none" stroke="${esc(st.strokeStyle)}" stroke-width="${r3(st.lineWidth)}" stroke-linejoin="round"`); },
    measureText(s) { measurer.font = st.font; return measurer.measureText(s); },
    drawImage() {},
    /** The picture: a PNG data URL drawn at (x, y) w×h in the current transform. */
    image(href, x, y, w, h) {
      parts.push(`<image href="${href}" x="${r3(x)}" y="${r3(y)}" width="${r3(w)}" height="${r3(h)}" transform="matrix(${m.map(r3).join(' ')})" preserveAspectRatio="none" style="image-rendering:pixelated"/>`);
    },
    finish() {
      while (stack.length) ctx.restore();
      for (; st.groups > 0; st.groups--) parts.push('</g>');
      return `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">\n` +
        parts.join('\n') + '\n</svg>\n';
    },
  };
  return ctx;
}

// ---- the Export section ----------------------------------------------------------------------

const fileBase = (f) => 'residuary-' + (String(f || 'f').replace(/[^A-Za-z0-9]+/g, '_').replace(/^_|_$/g, '').slice(0, 40) || 'f');

/** The Export section (#export-box in the plot's column) and the copy handler of tables; adds
 *  window.residuary.export (docs/scripting.md). `page`: {state, plot}; `hooks`: baseRequest(),
 *  persist(), results() (window.residuary.results). */
export function installExport(page, hooks) {
  const box = document.getElementById('export-box');
  const $ = (id) => document.getElementById(id);
  const ui = box ? {
    scale: $('export-scale'), width: $('export-width'), height: $('export-height'), sizeBox: $('export-size'),
    axes: $('export-axes'), overlay: $('export-overlay'), picture: $('export-svg-picture'),
    png: $('export-png'), svg: $('export-svg'), json: $('export-json'), complex: $('export-complex'),
    list: $('export-tables'), status: $('export-status'),
  } : null;
  const fmt = () => (COMPLEX_FORMATS.includes(page.state.complex_format) ? page.state.complex_format : 'columns');
  const say = (t) => { if (ui) ui.status.textContent = t; };

  function pictureOptions(o = {}) {
    const custom = ui && ui.scale.value === 'custom';
    const out = {
      scale: ui && !custom ? Number(ui.scale.value) : 1,
      axes: ui ? ui.axes.checked : true, overlay: ui ? ui.overlay.checked : true, picture: ui ? ui.picture.checked : true,
    };
    if (custom) { out.width = Number(ui.width.value); out.height = Number(ui.height.value); }
    return Object.assign(out, o);
  }
  const badSize = (o) => o.width !== undefined && !(Number.isInteger(o.width) && Number.isInteger(o.height) && o.width > 0 && o.height > 0);

  const api = {
    /** The tables of results() now: [{name, columns, rows}] (cells: numbers, strings, {c: [re, im]}). */
    tables: () => resultTables(hooks.results()),
    /** One table as text: `as` 'csv', 'tsv' or 'json'; `complex` defaults to the state's complex_format. */
    table(name, as = 'csv', complex = fmt()) {
      const t = api.tables().find((x) => x.name === name);
      if (!t) return null;
      if (as === 'json') return toTableJSON(t, complex);
      const m = tableMatrix(t, complex);
      return as === 'tsv' ? toTSV(m) : toCSV(m);
    },
    /** Every result as JSON text (the contract's responses, numbers as JSON numbers). */
    json: () => JSON.stringify(hooks.results(), null, 1) + '\n',
    /** The plot as PNG: resolves {png (base64), width, height} or {error}. */
    async png(o) {
      const r = await plotPNG(page.plot, hooks.baseRequest, pictureOptions(o));
      return r.error ? r : { png: bytesBase64(r.png), width: r.width, height: r.height };
    },
    /** The core's RGBA8 pixels of the picture the PNG would hold (the phase_plot task, format
     *  "rgba"): resolves {rgba (base64), width, height, view} or {error}. */
    async pixels(o) {
      const fr = frame(page.plot, pictureOptions(o));
      const r = await corePicture(hooks.baseRequest, fr, 'rgba');
      return r.error ? r : { rgba: r.data, width: r.width, height: r.height, view: fr.view };
    },
    /** The plot as SVG: resolves {svg, width, height} or {error}. */
    svg: (o) => plotSVG(page.plot, hooks.baseRequest, pictureOptions(o)),
  };
  if (window.residuary) window.residuary.export = api;

  // Ctrl+C on a selection in a table: tab-separated machine-readable values.
  document.addEventListener('copy', (ev) => {
    const t = selectionTSV(document.getSelection(), fmt());
    if (t === null || !ev.clipboardData) return;
    ev.clipboardData.setData('text/plain', t);
    ev.preventDefault();
  });

  if (!ui) return api;
  ui.complex.value = fmt();
  ui.complex.addEventListener('change', () => { page.state.complex_format = ui.complex.value; hooks.persist(); });
  ui.scale.addEventListener('change', () => {
    ui.sizeBox.hidden = ui.scale.value !== 'custom';
    if (ui.scale.value === 'custom' && !ui.width.value) { ui.width.value = String(Math.round(page.plot.pw * 2)); ui.height.value = String(Math.round(page.plot.ph * 2)); }
  });
  ui.png.addEventListener('click', async () => {
    const o = pictureOptions();
    if (badSize(o)) { say('Width and height must be whole numbers of pixels above 0.'); return; }
    say('Rendering the PNG…');
    const r = await plotPNG(page.plot, hooks.baseRequest, o);
    if (r.error) { say('No PNG: ' + r.error.message); return; }
    download(new Blob([r.png], { type: 'image/png' }), fileBase(page.state.f) + '.png');
    say(`PNG saved: ${r.width} × ${r.height} pixels.`);
  });
  ui.svg.addEventListener('click', async () => {
    const o = pictureOptions();
    if (badSize(o)) { say('Width and height must be whole numbers of pixels above 0.'); return; }
    say('Writing the SVG…');
    const r = await plotSVG(page.plot, hooks.baseRequest, o);
    if (r.error) { say('No SVG: ' + r.error.message); return; }
    download(r.svg, fileBase(page.state.f) + '.svg', 'image/svg+xml');
    say(`SVG saved: ${r.width} × ${r.height}.`);
  });
  ui.json.addEventListener('click', () => { download(api.json(), fileBase(page.state.f) + '-results.json', 'application/json'); say('Results saved as JSON.'); });

  // The list of tables: rebuilt when the section opens and, while it is open, when the tables
  // change (a button reads the results again when pressed, so it never saves an older table).
  let signature = '';
  function refresh() {
    if (!box.open) return;
    const tables = api.tables();
    const sig = JSON.stringify(tables.map((t) => [t.name, t.rows.length, t.columns.length]));
    if (sig === signature) return;
    signature = sig;
    ui.list.replaceChildren(...(tables.length ? tables.map((t) => el('li', { 'data-table': t.name },
      el('span', { class: 'export-name', text: `${t.name} (${t.rows.length} row${t.rows.length === 1 ? '' : 's'})` }), ' ',
      el('button', { type: 'button', class: 'small', 'data-as': 'csv', 'aria-label': `CSV of ${t.name}`, text: 'CSV' }), ' ',
      el('button', { type: 'button', class: 'small', 'data-as': 'json', 'aria-label': `JSON of ${t.name}`, text: 'JSON' }), ' ',
      el('button', { type: 'button', class: 'small', 'data-as': 'copy', 'aria-label': `Copy ${t.name} as tab-separated text`, text: 'Copy' })))
      : [el('li', { text: 'No results yet: search first.' })]));
  }
  ui.list.addEventListener('click', async (ev) => {
    const b = ev.target.closest('button');
    const li = b && b.closest('li');
    if (!b || !li) return;
    const name = li.dataset.table;
    const as = b.dataset.as;
    const text = api.table(name, as === 'copy' ? 'tsv' : as);
    if (text === null) { say(`${name} is no longer among the results.`); refresh(); return; }
    if (as === 'copy') { say((await copyText(text)) ? `${name} copied (tab-separated).` : 'The browser refused the copy.'); return; }
    download(text, `${fileBase(page.state.f)}-${name.replace(/[^A-Za-z0-9]+/g, '_')}.${as}`, as === 'csv' ? 'text/csv' : 'application/json');
    say(`${name} saved as ${as.toUpperCase()}.`);
  });
  box.addEventListener('toggle', () => { signature = ''; refresh(); });
  setInterval(refresh, 2000); // while open: the list follows new results (no rebuild when it is the same)
  return api;
}

// A chart's samples as a table, folded under the chart: "Data (n samples)" in a <details>,
// built only when opened and 200 rows at a time (previous / next), so that no single task
// on the main thread grows with the number of samples.
import { el, copyText } from './dom.js';
import { cleanNumberText, numText } from './format.js';
import { toCSV, toTSV, download } from './export.js';

export const ROWS_PER_PAGE = 200;

const tables = new WeakMap();

/** Turn the (empty) <details> `box` into a data table once; `caption` names the chart. */
function build(box, caption) {
  const summary = el('summary', { text: 'Data' });
  const head = el('thead');
  const body = el('tbody');
  const prev = el('button', { type: 'button', class: 'data-prev', text: 'Previous 200' });
  const next = el('button', { type: 'button', class: 'data-next', text: 'Next 200' });
  const where = el('span', { class: 'data-where', 'aria-live': 'polite' });
  const copy = el('button', { type: 'button', class: 'small data-copy', text: 'Copy all', 'aria-label': `Copy every row of the ${caption} as tab-separated text` });
  const csv = el('button', { type: 'button', class: 'small data-csv', text: 'CSV', 'aria-label': `Save every row of the ${caption} as CSV` });
  box.append(summary,
    el('div', { class: 'data-nav' }, prev, next, where, copy, csv),
    el('div', { class: 'tf-table-wrap data-wrap' }, el('table', { class: 'tf-table data-table' },
      el('caption', { class: 'visually-hidden', text: caption }), head, body)));
  const t = { box, summary, head, body, prev, next, where, spec: null, page: 0 };
  prev.addEventListener('click', () => { t.page--; render(t); });
  next.addEventListener('click', () => { t.page++; render(t); });
  box.addEventListener('toggle', () => { if (box.open) render(t); });
  copy.addEventListener('click', async () => {
    if (!t.spec) return;
    where.textContent = (await copyText(toTSV(dataMatrix(t.spec)))) ? `${t.spec.count} rows copied` : 'the browser refused the copy';
  });
  csv.addEventListener('click', () => {
    if (!t.spec) return;
    download(toCSV(dataMatrix(t.spec)), caption.replace(/[^A-Za-z0-9]+/g, '-').toLowerCase() + '.csv', 'text/csv');
  });
  tables.set(box, t);
  return t;
}

const cellText = (v) => (typeof v === 'number' ? numText(v) : v === null || v === undefined ? '' : String(v));

/** Every row of `spec` as machine-readable text (format.js numText): its values(i) when the
 *  chart gives them (full precision), else the cells shown made machine-readable. */
export function dataMatrix(spec) {
  const rows = [spec.heads.slice()];
  for (let i = 0; i < spec.count; i++) {
    rows.push(spec.values ? spec.values(i).map(cellText)
      : spec.row(i).map((c) => cleanNumberText(c)));
  }
  return rows;
}

/** Draw the current page (only while open). */
function render(t) {
  const s = t.spec;
  if (!t.box.open || !s) return;
  const pages = Math.max(1, Math.ceil(s.count / ROWS_PER_PAGE));
  t.page = Math.max(0, Math.min(pages - 1, t.page));
  t.head.textContent = '';
  t.head.append(el('tr', {}, ...s.heads.map((h) => el('th', { scope: 'col', text: h }))));
  const from = t.page * ROWS_PER_PAGE, to = Math.min(s.count, from + ROWS_PER_PAGE);
  const rows = [];
  for (let i = from; i < to; i++) {
    // data-copy: the full-precision value a copy of the selection takes (export.js selectionTSV)
    const vs = s.values ? s.values(i) : null;
    rows.push(el('tr', { 'data-index': String(i) }, ...s.row(i).map((c, j) => el('td', { text: c, 'data-copy': vs ? cellText(vs[j]) : null }))));
  }
  t.body.replaceChildren(...rows);
  t.prev.disabled = t.page === 0;
  t.next.disabled = t.page >= pages - 1;
  t.where.textContent = s.count ? `rows ${from + 1}–${to} of ${s.count}` : 'no samples';
}

/** Give the table under a chart its samples: `spec` {heads: [column heading with its unit],
 *  count, row(i) → [cell text], values(i) → [number | text] (optional: the full-precision values
 *  that Copy all and CSV write)} (null: no data). Back to the first page; drawn now if open. */
export function setDataTable(box, caption, spec) {
  const t = tables.get(box) || build(box, caption);
  t.spec = spec;
  t.page = 0;
  const n = spec ? spec.count : 0;
  t.summary.textContent = `Data (${n} sample${n === 1 ? '' : 's'})`;
  t.head.textContent = '';
  t.body.textContent = '';
  if (t.box.open) render(t);
}

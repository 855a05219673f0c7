// The page's side of embedding (docs/embedding.md): the Embed control (the <residuary-view>
// snippet and the iframe for the current state, each with a copy button), the compact mode a
// link asks for (state.compact: header, examples, inputs and the sections not chosen hidden), and
// the message interface of a framed page: parent → page {type: 'residuary:set', id, state},
// page → parent {type: 'residuary:results', id, results} or {type: 'residuary:error', id, error}.
import { $ } from './dom.js';
import { encodeLink } from './share.js';

/** The panels a compact page can show (the element's names, plus the page's other sections). */
export const COMPACT_PANELS = ['plot', 'singularities', 'residues', 'integral', 'count', 'fractions', 'real', 'inverse', 'transfer', 'laurent', 'image'];
/** The panels the Embed control offers (those the element has). */
const EMBED_OFFERED = ['plot', 'singularities', 'residues', 'integral', 'count', 'fractions'];
const EMBED_DEFAULT = ['plot', 'singularities', 'residues', 'integral'];

/** Which page elements each compact panel keeps (by id or selector). */
const EMBED_PARTS = {
  plot: ['.plot-panel .figure', '.plot-tools'],
  singularities: ['.results .table-wrap', '#sing-pager', '#sing-stale', '#find-status', '#warnings', '#h-sing'],
  residues: ['.results .table-wrap', '#sing-pager', '#sums', '#h-sing'],
  integral: ['#ci-box'],
  count: ['#ci-box'],
  fractions: ['#partial-fractions', '#pf-warnings'],
  real: ['#ri-box'],
  inverse: ['#inv-box'],
  transfer: ['#tf-box', '#stability-box'],
  laurent: ['#lp-box'],
  image: ['#image-box'],
};
/** What a compact page never shows. */
const EMBED_HIDDEN = ['.topbar', '#demo-description', '.panel.inputs', '.plot-hint', '.key', '.foot', '#embed-box',
  '.results fieldset.region', '.results .actions', '#region-note', '#detail', '#pick-note', '#fit-note', '#drag-note', '#readout'];

/** The compact layout, when the link's state asks for it (called once, before the plot is sized). */
export function applyCompact(state) {
  if (!state.compact) return;
  const chosen = state.compact_panels || EMBED_DEFAULT;
  const keep = new Set();
  for (const p of chosen) for (const sel of EMBED_PARTS[p] || []) for (const node of document.querySelectorAll(sel)) keep.add(node);
  const hide = (node) => { if (!keep.has(node)) node.classList.add('embed-off'); };
  for (const sel of EMBED_HIDDEN) document.querySelectorAll(sel).forEach(hide);
  for (const parts of Object.values(EMBED_PARTS)) for (const sel of parts) document.querySelectorAll(sel).forEach(hide);
  document.documentElement.classList.add('compact');
  document.body.dataset.compact = chosen.join(' ');
}

const embedAttr = (s) => String(s).replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/** The contract's params as the element's attribute text: "a=1, b=0.3+0.1i". */
function embedParamsText(params) {
  return Object.entries(params || {}).map(([k, v]) => (typeof v === 'number' ? `${k}=${v}` : `${k}=${v[0]}${v[1] < 0 ? '-' : '+'}${Math.abs(v[1])}i`)).join(', ');
}

/** The <residuary-view> snippet for `s` (window.residuary.state()). */
export function elementSnippet(s, panels, compact) {
  const view = s.view.map((x) => Number(x.toPrecision(12))).join(' ');
  const parts = [`f="${embedAttr(s.f)}"`, `var="${embedAttr(s.var)}"`];
  const params = embedParamsText(s.params);
  if (params) parts.push(`params="${embedAttr(params)}"`);
  parts.push(`view="${view}"`);
  if (s.region !== 'view') parts.push(`region="${embedAttr(JSON.stringify(s.region))}"`);
  parts.push(`panels="${panels.join(' ')}"`);
  if (compact) parts.push('compact');
  const close = '</' + 'script>'; // written in two parts: the page inlines this file in a script element
  return `<script src="residuary-view.js">${close}\n<residuary-view ${parts.join(' ')}></residuary-view>`;
}

/** The iframe for the page state `pageState`, compact with `panels` (async: a long state's link is
 *  packed by the browser's compression, share.js). */
export async function iframeSnippet(pageState, panels) {
  const link = 'residuary.html' + await encodeLink(Object.assign({}, pageState, { compact: true, compact_panels: panels.slice() }));
  return `<iframe src="${embedAttr(link)}" title="residuary: f(${embedAttr(pageState.var || 'z')}) = ${embedAttr(pageState.f)}" width="720" height="640" sandbox="allow-scripts" style="border:1px solid #ccc"></iframe>`;
}

/** The Embed control and, in a frame, the message interface. `hooks.started`: the core has loaded. */
export function installEmbed(page, hooks) {
  const box = $('embed-box');
  if (box) attachEmbedControl(page, box);
  if (window.parent !== window) attachEmbedMessages(page, hooks);
}

function attachEmbedControl(page, box) {
  const picks = $('embed-panels');
  for (const p of EMBED_OFFERED) {
    const label = document.createElement('label');
    const input = document.createElement('input');
    input.type = 'checkbox';
    input.value = p;
    input.checked = EMBED_DEFAULT.includes(p);
    label.append(input, ' ' + p);
    picks.append(label);
  }
  const chosen = () => [...picks.querySelectorAll('input:checked')].map((i) => i.value);
  let refreshes = 0;
  const refresh = async () => {
    if (!box.open || !window.residuary) return;
    const serial = ++refreshes;
    const panels = chosen();
    $('embed-element').value = elementSnippet(window.residuary.state(), panels, $('embed-compact').checked);
    const frame = await iframeSnippet(page.state, panels);
    if (serial === refreshes) $('embed-iframe').value = frame;
  };
  box.addEventListener('toggle', refresh);
  picks.addEventListener('change', refresh);
  $('embed-compact').addEventListener('change', refresh);
  $('embed-refresh').addEventListener('click', refresh);
  // the snippets follow the page while the control is open
  let timer = 0;
  const soon = () => { clearTimeout(timer); timer = setTimeout(refresh, 300); };
  for (const ev of ['input', 'change', 'pointerup', 'wheel']) document.addEventListener(ev, soon, { passive: true });
  for (const [button, area] of [['embed-copy-element', 'embed-element'], ['embed-copy-iframe', 'embed-iframe']]) {
    $(button).addEventListener('click', async () => {
      refresh();
      const text = $(area).value;
      const note = $('embed-note');
      try {
        await navigator.clipboard.writeText(text);
        note.textContent = 'Copied.';
      } catch (e) {
        $(area).select();
        note.textContent = 'This browser does not let the page copy here: the text is selected, copy it with the keyboard.';
      }
    });
  }
}

/** Messages from the parent window: only from window.parent, and only from state.parent_origin when
 *  the link names one; answers go back to the sender's origin ("*" only when that origin is opaque:
 *  a file: or sandboxed parent, whose origin cannot be named). */
function attachEmbedMessages(page, hooks) {
  const pinned = page.state.parent_origin || null;
  let known = pinned;
  const post = (message, origin) => { try { window.parent.postMessage(message, origin); } catch (e) { /* the parent went away */ } };
  window.addEventListener('message', async (event) => {
    if (event.source !== window.parent) return;
    const d = event.data;
    if (!d || typeof d !== 'object' || d.type !== 'residuary:set') return;
    if (pinned && event.origin !== pinned) return;
    const target = event.origin === 'null' ? '*' : event.origin;
    known = target;
    const id = d.id === undefined ? null : d.id;
    try {
      const results = await window.residuary.set(d.state || {});
      post({ type: 'residuary:results', id, results }, target);
    } catch (e) {
      post({ type: 'residuary:error', id, error: { code: (e && e.code) || 'internal', message: String((e && e.message) || e) } }, target);
    }
  });
  hooks.started.then(async () => {
    post({ type: 'residuary:ready' }, pinned || '*'); // carries nothing but its type
    if (!pinned) return;
    const results = await window.residuary.settled();
    if (known === pinned) post({ type: 'residuary:results', id: null, results }, pinned);
  });
}

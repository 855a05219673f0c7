// The example menu: our own scenarios, inlined from demo-data/*.json at build time.
/* global DEMO_DATA */
import { $, el } from './dom.js';

export function demoList() {
  return typeof DEMO_DATA !== 'undefined' && Array.isArray(DEMO_DATA) ? DEMO_DATA : [];
}

/** Turn a demo into page-state fields. */
export function demoState(demo) {
  const params = Object.entries(demo.params || {}).map(([name, v]) => ({
    name,
    value: Array.isArray(v) ? `${v[0]}${v[1] < 0 ? '-' : '+'}${Math.abs(v[1])}i` : String(v),
    lo: null,
    hi: null,
  }));
  return { f: demo.f, var: demo.var || 'z', params, view: demo.view || [-3, 3, -3, 3] };
}

/** Fill the example menu; hide it when there are no examples. */
export function fillExampleMenu(select) {
  const demos = demoList();
  demos.forEach((d, i) => select.append(el('option', { value: String(i), text: d.title })));
  if (demos.length === 0) select.closest('label').hidden = true;
}

/** Once the function is no longer the chosen example's, the example's name and text go. */
export function forgetExampleIfChanged(state) {
  const picker = $('demo-select');
  const d = demoList()[Number(picker.value)];
  if (picker.value === '' || !d) return;
  if (d.f !== state.f || (d.var || 'z') !== state.var.trim()) {
    picker.value = '';
    $('demo-description').hidden = true;
  }
}

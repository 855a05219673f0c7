// The example menu: our own scenarios, inlined from demo-data/*.json at build time.
/* global DEMO_DATA */

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

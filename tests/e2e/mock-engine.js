// A stand-in engine for exercising the page's UI before the real core is in
// place (installed with page.addInitScript as globalThis.__residuaryTestEngine).
// It understands + - * / ^, parentheses, numbers, i, the variable, parameters
// and exp(); it colours by arg f with a plain hue wheel. Its "singularities"
// answer is a fixed, hand-checked example for (z - 1)/(z^2 + 4):
// poles ±2i with residues (2 ± i)/4 (common practice: simple pole residue = N(p)/D'(p)).
(() => {
  function parse(src, variable, params) {
    let pos = 0;
    const err = (message, a, b) => { const e = new Error(message); e.span = [a, b]; throw e; };
    const ws = () => { while (src[pos] === ' ') pos++; };
    const C = (re, im = 0) => [re, im];
    const add = (a, b) => [a[0] + b[0], a[1] + b[1]];
    const sub = (a, b) => [a[0] - b[0], a[1] - b[1]];
    const mul = (a, b) => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
    const div = (a, b) => { const d = b[0] * b[0] + b[1] * b[1]; return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d]; };
    const exp = (a) => { const m = Math.exp(a[0]); return [m * Math.cos(a[1]), m * Math.sin(a[1])]; };
    const pow = (a, n) => { let r = C(1); const k = Math.abs(n); for (let j = 0; j < k; j++) r = mul(r, a); return n < 0 ? div(C(1), r) : r; };
    function expr() { let f = term(); for (;;) { ws(); const c = src[pos]; if (c === '+' || c === '-') { pos++; const g = term(), h = f; f = c === '+' ? (z) => add(h(z), g(z)) : (z) => sub(h(z), g(z)); } else return f; } }
    function term() { let f = unary(); for (;;) { ws(); const c = src[pos]; if (c === '*' || c === '/') { pos++; const g = unary(), h = f; f = c === '*' ? (z) => mul(h(z), g(z)) : (z) => div(h(z), g(z)); } else return f; } }
    function unary() { ws(); if (src[pos] === '-') { pos++; const g = unary(); return (z) => sub(C(0), g(z)); } return power(); }
    function power() {
      const b = atom(); ws();
      if (src[pos] === '^') { pos++; ws(); const s = pos; const m = /^-?\d+/.exec(src.slice(pos)); if (!m) err('the power must be a whole number here', s, s + 1); pos += m[0].length; const n = Number(m[0]); return (z) => pow(b(z), n); }
      return b;
    }
    function atom() {
      ws();
      const s = pos, rest = src.slice(pos);
      let m;
      if ((m = /^\d+\.?\d*(e-?\d+)?/.exec(rest))) { pos += m[0].length; const v = Number(m[0]); return () => C(v); }
      if ((m = /^[A-Za-z_]\w*/.exec(rest))) {
        pos += m[0].length; const name = m[0];
        if (name === 'exp') { ws(); if (src[pos] !== '(') err('write exp(...)', pos, pos + 1); pos++; const g = expr(); ws(); if (src[pos] !== ')') err("missing ')'", pos, pos + 1); pos++; return (z) => exp(g(z)); }
        if (name === variable) return (z) => z;
        if (name === 'i') return () => C(0, 1);
        if (name in params) { const v = params[name]; const c = Array.isArray(v) ? v : C(v); return () => c; }
        err(`unknown name "${name}": add it as a parameter or use ${variable}`, s, pos);
      }
      if (src[pos] === '(') { pos++; const g = expr(); ws(); if (src[pos] !== ')') err("missing ')': close the bracket", s, pos); pos++; return g; }
      err(pos >= src.length ? 'the expression ends too soon' : `unexpected "${src[pos]}"`, pos, Math.min(src.length, pos + 1));
    }
    const f = expr(); ws();
    if (pos < src.length) err(`unexpected "${src[pos]}"`, pos, pos + 1);
    return f;
  }
  function compile(req) {
    return parse(String(req.f), req.var || 'z', req.params || {});
  }
  function hue(f) {
    const a = Math.atan2(f[1], f[0]);
    if (!Number.isFinite(a) || !Number.isFinite(f[0]) || !Number.isFinite(f[1])) return [128, 128, 128];
    const h = ((a / (2 * Math.PI)) + 1) % 1 * 6, k = Math.floor(h), t = h - k;
    const rgb = [[1, t, 0], [1 - t, 1, 0], [0, 1, t], [0, 1 - t, 1], [t, 0, 1], [1, 0, 1 - t]][k % 6];
    return rgb.map((v) => Math.round(60 + 180 * v));
  }
  globalThis.__residuaryTestEngine = {
    run(req) {
      try {
        const f = compile(req);
        if (req.task === 'evaluate') return { values: req.at.map((p) => f(Array.isArray(p) ? p : [p, 0])), derivatives: req.at.map(() => [0, 0]) };
        if (req.task === 'singularities') {
          return { poles: [{ at: [0, 2], order: 1, residue: [0.5, 0.25], error_estimate: 1e-12 }, { at: [0, -2], order: 1, residue: [0.5, -0.25], error_estimate: 1e-12 }],
            zeros: [{ at: [1, 0], order: 1 }], essential: [], branch_points: [], removable: [], residue_at_infinity: [-1, 0], residue_sum_defect: 0, warnings: [] };
        }
        if (req.task === 'laurent') return { coefficients: [{ n: -1, c: [0.5, 0.25] }, { n: 0, c: [0.1, 0] }], error_estimate: 1e-13 };
        return { error: { message: `the "${req.task}" task is not in the stand-in engine`, span: null } };
      } catch (e) {
        return { error: { message: e.message, span: e.span || null } };
      }
    },
    phasePlotRgba(req) {
      const f = compile(req);
      const [w, h] = req.size, [x0, x1, y0, y1] = req.view;
      const [r0, r1] = req.rows || [0, h];
      const out = new Uint8Array(w * (r1 - r0) * 4);
      for (let j = r0; j < r1; j++) for (let i = 0; i < w; i++) {
        let z = [x0 + (i + 0.5) * (x1 - x0) / w, y1 - (j + 0.5) * (y1 - y0) / h];
        if (req.options && req.options.infinity) { const d = z[0] * z[0] + z[1] * z[1]; z = [z[0] / d, -z[1] / d]; }
        const [r, g, b] = hue(f(z));
        const k = ((j - r0) * w + i) * 4;
        out[k] = r; out[k + 1] = g; out[k + 2] = b; out[k + 3] = 255;
      }
      return out;
    },
  };
})();

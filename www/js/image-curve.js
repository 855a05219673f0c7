// The image curve: f(γ) in the w-plane for the region's contour γ, drawn with the polar chart
// (polar-chart.js), with its winding number about 0 and about a point the user picks (−1 at
// first, for stability work; a click on the chart moves it), each by an angle sum: the sum of
// arg((w_{k+1} − p)/(w_k − p)) along the closed polyline, over 2π, refined where a step turns by
// more than π/4 (common practice). By the argument principle the winding about 0 is the zeros
// minus poles inside γ, compared with the core's argument_count when the page has it.
// Hovering γ on the phase plot marks its image (markImageAt), hovering the image marks γ.
import { $ } from './dom.js';
import { runNow, responseError } from './engine.js';
import { drawPolarChart } from './polar-chart.js';
import { sampleContour } from './contour-path.js';
import { windingAbout } from './contour-geom.js';
import { toScreen } from './plot/view.js';
import { fmtComplex } from './format.js';

const START = 384, MAX = 6000, TURN = Math.PI / 4;

function evaluate(fnInput, pts) {
  const resp = runNow(Object.assign({}, fnInput, { task: 'evaluate', at: pts }));
  const err = responseError(resp);
  if (err) return { error: err };
  return { values: resp.values.map((v) => (v && v[0] !== null && v[1] !== null ? v : [NaN, NaN])) };
}

/** Sample γ, evaluate f, and refine where the image turns fast about 0 or p. */
function imageOf(contour, fnInput, p) {
  const s = sampleContour(contour, START);
  if (!s) return { error: { code: 'invalid_field', message: `no sampler for the shape "${contour && contour.shape}"` } };
  let z = s.points, t = s.t;
  let ev = evaluate(fnInput, z);
  if (ev.error) return ev;
  let w = ev.values;
  for (let pass = 0; pass < 4 && z.length < MAX; pass++) {
    const add = [];
    for (let k = 0; k < z.length; k++) {
      const j = (k + 1) % z.length;
      const turn = (q) => Math.abs(Math.atan2(...((a, b) => [a[0] * b[1] - a[1] * b[0], a[0] * b[0] + a[1] * b[1]])([w[k][0] - q[0], w[k][1] - q[1]], [w[j][0] - q[0], w[j][1] - q[1]])));
      if (turn([0, 0]) > TURN || turn(p) > TURN) add.push(k);
    }
    if (!add.length) break;
    const mids = add.map((k) => {
      const j = (k + 1) % z.length;
      return [(z[k][0] + z[j][0]) / 2, (z[k][1] + z[j][1]) / 2];
    });
    const evm = evaluate(fnInput, mids);
    if (evm.error) return evm;
    const nz = [], nt = [], nw = [];
    let m = 0;
    for (let k = 0; k < z.length; k++) {
      nz.push(z[k]); nt.push(t[k]); nw.push(w[k]);
      if (add[m] === k) {
        const t1 = k + 1 < z.length ? t[k + 1] : 1;
        nz.push(mids[m]); nt.push((t[k] + t1) / 2); nw.push(evm.values[m]); m++;
      }
    }
    z = nz; t = nt; w = nw;
  }
  return { z, t, w };
}

let current = null; // the one image curve of the page (markImageAt reaches it)

/** Mark the image of γ(t) (t the arc-length fraction along the contour) on the image chart. */
export function markImageAt(t) {
  if (current) current.markAt(t);
}

/** Wire the image curve: `hooks` contour() (the region's contour), fnInput() (f, var, params as
 *  a request, or null when f cannot be used), argumentCount() (the page's argument_count for the
 *  same contour, or null). */
export function createImageCurve(page, hooks) {
  const box = $('image-box'), canvas = $('image-chart'), words = $('image-winding'), input = $('image-point');
  let point = [-1, 0], data = null, key = '', cursor = -1, spoken = null;
  const view = { map: null };

  function draw() {
    if (!box.open) return;
    const samples = data && data.w ? data.w.map((v, k) => ({ re: Number.isFinite(v[0]) ? v[0] : null, im: Number.isFinite(v[1]) ? v[1] : null, w: data.t[k], kind: 'axis' })) : [];
    view.map = drawPolarChart(canvas, { samples, about: point, labels: { styles: 'the arrows run the way γ runs', x: 'Re w', y: 'Im w' } }, 'linear', cursor);
    canvas.dataset.marked = String(cursor);
    box.dataset.marked = String(cursor);
  }

  function describe() {
    if (!data) { words.textContent = ''; return; }
    if (data.error) { words.textContent = 'The image could not be computed: ' + data.error.message; return; }
    const w0 = data.winding_about_0, wp = data.winding_about_point;
    const say = (n) => (n === null ? 'not defined (the image passes through the point)' : String(n));
    let text = `Winding number of f(γ) about 0: ${say(w0)}; about ${fmtComplex(point, 4)}: ${say(wp)}.`;
    const ac = hooks.argumentCount();
    spoken = ac ? ac.zeros_minus_poles : null;
    if (ac && Number.isFinite(ac.zeros_minus_poles)) {
      text += ` Zeros minus poles inside γ (argument count): ${ac.zeros_minus_poles}` + (ac.zeros_minus_poles === w0 ? ', the same.' : ', which differs: the sampling may miss fast turns.');
    }
    words.textContent = text;
  }

  function compute() {
    const contour = hooks.contour(), fn = hooks.fnInput();
    const k = JSON.stringify([contour, fn, point]);
    if (k === key && data) {
      // the argument count may have arrived since: say so
      const ac = hooks.argumentCount();
      const seen = ac ? ac.zeros_minus_poles : null;
      if (seen !== spoken) describe();
      return data;
    }
    key = k;
    if (!fn) { data = { error: { code: 'expression', message: 'f cannot be used' } }; describe(); draw(); return data; }
    const r = imageOf(contour, fn, point);
    if (r.error) data = { error: r.error, contour };
    else {
      data = Object.assign(r, {
        contour,
        winding_about_0: windingAbout(r.w, [0, 0]),
        winding_about_point: windingAbout(r.w, point),
      });
    }
    cursor = -1;
    describe();
    draw();
    return data;
  }

  const api = {
    compute,
    /** Draw again (the page's colours changed). */
    redraw: () => draw(),
    open: () => box.open,
    setOpen(v) { box.open = !!v; if (box.open) compute(); },
    /** results().image_curve */
    result() {
      if (!box.open) return undefined;
      const d = compute();
      if (d.error) return { error: d.error, contour: d.contour, point: point.slice() };
      return {
        contour: d.contour,
        points: d.z.map((z, k) => ({ t: d.t[k], z, w: d.w[k].map((x) => (Number.isFinite(x) ? x : null)) })),
        winding_about_0: d.winding_about_0,
        winding_about_point: d.winding_about_point,
        point: point.slice(),
      };
    },
    point: () => point.slice(),
    setPoint(p) { point = p.slice(); input.value = fmtComplex(point, 6).replace(/−/g, '-'); key = ''; if (box.open) compute(); },
    markAt(t) {
      if (!data || !data.t) return;
      let best = 0;
      for (let k = 1; k < data.t.length; k++) if (Math.abs(data.t[k] - t) < Math.abs(data.t[best] - t)) best = k;
      cursor = best;
      page.plot.gammaMark = null;
      draw();
      box.dataset.markedOn = 'image';
    },
  };
  current = api;

  box.addEventListener('toggle', () => { if (box.open) { key = ''; compute(); } });
  setInterval(() => { if (box.open && document.visibilityState !== 'hidden') compute(); }, 500);

  // a click on the chart picks the point counted about; the buttons preset it
  canvas.addEventListener('click', (ev) => {
    if (!view.map) return;
    const r = canvas.getBoundingClientRect();
    const v = view.map.toValue(ev.clientX - r.left, ev.clientY - r.top);
    if (v) api.setPoint(v);
  });
  $('image-point-minus1').addEventListener('click', () => api.setPoint([-1, 0]));
  $('image-point-zero').addEventListener('click', () => api.setPoint([0, 0]));
  input.addEventListener('change', () => {
    const m = input.value.replace(/\s+/g, '').match(/^([+-]?[\d.]+(?:e[+-]?\d+)?)?(?:([+-][\d.]*(?:e[+-]?\d+)?)i)?$/i);
    if (!m || (!m[1] && !m[2])) return;
    const im = m[2] === undefined ? 0 : m[2] === '+' || m[2] === '-' ? Number(m[2] + '1') : Number(m[2]);
    const p = [m[1] ? Number(m[1]) : 0, im];
    if (p.every(Number.isFinite)) api.setPoint(p);
  });

  // hovering the image marks γ on the phase plot
  canvas.addEventListener('pointermove', (ev) => {
    if (!view.map || !data || !data.z) return;
    const r = canvas.getBoundingClientRect();
    const k = view.map.nearest(ev.clientX - r.left, ev.clientY - r.top);
    if (k === null || k === undefined || k < 0) return;
    cursor = k;
    page.plot.gammaMark = data.z[k];
    page.plot.draw();
    draw();
    box.dataset.markedOn = 'contour';
  });
  canvas.addEventListener('pointerleave', () => { page.plot.gammaMark = null; page.plot.draw(); });

  // hovering γ on the phase plot marks its image: the nearest contour sample within 12 px
  page.plot.canvas.addEventListener('pointermove', (ev) => {
    if (!box.open || !data || !data.z) return;
    const r = page.plot.canvas.getBoundingClientRect();
    const x = ev.clientX - r.left, y = ev.clientY - r.top;
    let best = -1, bd = 12;
    data.z.forEach((z, k) => {
      const [sx, sy] = toScreen(page.plot, z[0], z[1]);
      const d = Math.hypot(sx - x, sy - y);
      if (d < bd) { bd = d; best = k; }
    });
    if (best >= 0) markImageAt(data.t[best]);
  });
  // the mark on γ, drawn by the plot after its overlays
  page.plot.overlayHooks = (page.plot.overlayHooks || []).concat([(ctx) => {
    const m = page.plot.gammaMark;
    if (!m) return;
    const [sx, sy] = toScreen(page.plot, m[0], m[1]);
    ctx.strokeStyle = '#c0392b'; ctx.lineWidth = 2;
    ctx.beginPath(); ctx.arc(sx, sy, 6, 0, 2 * Math.PI); ctx.stroke();
  }]);
  return api;
}

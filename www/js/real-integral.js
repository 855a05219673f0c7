// The real-integral block: ∫ over the real line, a Fourier integral (ω of either sign), a
// trigonometric integral over 0 … 2π and a Mellin integral, by the core's `real_integral`
// (residues, checked against an independent quadrature), with the derivation as a report would
// write it: the closing contour (also drawn on the phase plot while the block is open), the
// residues used, the lemma that drops the added pieces, the sum. Divergent integrals show the
// core's refusal. The integrand is the page's f in the page's variable, that variable running
// along the real axis (x) or over one period (θ).
import { mathEl } from './mathml.js';
import { latexButton } from './latex.js';
import { el } from './dom.js';
import { isFinitePair } from './complex.js';
import { fmtReal, fmtSig, fmtExact, trimBelow } from './format.js';
import { runHeavy, responseError } from './engine.js';
import { functionInput } from './params.js';
import { showAgreement } from './contour.js';
import { toScreen } from './plot/view.js';

export const INTEGRAL_KINDS = ['line', 'fourier', 'trig', 'mellin'];

/** The block's own state (kept in the page state as `integral`). */
export function defaultIntegral() {
  return { kind: 'line', omega: 1, alpha: 0.5, open: false };
}

/** `raw` brought into the shape of defaultIntegral(), dropping what does not fit. */
export function sanitizeIntegral(raw) {
  const s = defaultIntegral();
  if (!raw || typeof raw !== 'object') return s;
  if (INTEGRAL_KINDS.includes(raw.kind)) s.kind = raw.kind;
  if (Number.isFinite(raw.omega)) s.omega = raw.omega;
  if (Number.isFinite(raw.alpha)) s.alpha = raw.alpha;
  else if (Array.isArray(raw.alpha) && raw.alpha.length === 2 && raw.alpha.every(Number.isFinite)) s.alpha = raw.alpha.slice();
  if (typeof raw.open === 'boolean') s.open = raw.open;
  return s;
}

/** α as typed: "0.3", "0.3+0.2i", "0.3 - 0.2i" → a number or [re, im]; null when unreadable. */
export function parseAlpha(text) {
  const t = String(text).replace(/\s+/g, '').replace(/−/g, '-');
  if (/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(t)) return Number(t);
  const mml = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)([+-](?:\d+\.?\d*|\.\d+)?(?:e[+-]?\d+)?)\*?i$/i.exec(t);
  if (!m) return null;
  const im = m[2] === '+' ? 1 : m[2] === '-' ? -1 : Number(m[2]);
  return Number.isFinite(Number(m[1])) && Number.isFinite(im) ? [Number(m[1]), im] : null;
}

function riAlphaText(a) {
  return Array.isArray(a) ? fmtSig(a, 12).replace(/−/g, '-') : String(a);
}

/** The request for the page's f. */
export function integralRequest(state) {
  const it = state.integral;
  const req = Object.assign({ task: 'real_integral', kind: it.kind }, functionInput(state));
  if (it.kind === 'fourier') req.omega = it.omega;
  if (it.kind === 'mellin') req.alpha = it.alpha;
  return req;
}

// ---- MathML, with the same formula as plain text beside it ------------------------------------

/** A MathML element; string children become text. */
const mmi = (t) => mathEl('mi', t), mmo = (t) => mathEl('mo', t), mmn = (t) => mathEl('mn', t);
const mrow = (...c) => mathEl('mrow', ...c);
const msup = (b, e) => mathEl('msup', b, e);
const msubsup = (b, lo, hi) => mathEl('msubsup', b, lo, hi);
const msub = (b, lo) => mathEl('msub', b, lo);
const mspace = () => { const sp = mathEl('mspace'); sp.setAttribute('width', '1em'); return sp; };
const mnum = (x) => { const t = fmtReal(x, 10); return t.startsWith('−') ? mrow(mmo('−'), mmn(t.slice(1))) : mmn(t); };

/** A formula: <math> with `alttext`, and the plain text in a copyable code element beside it. */
function mathBlock(mathRow, plain, cls = 'ri-math') {
  const math = mathEl('math', mathRow);
  math.setAttribute('display', 'block');
  math.setAttribute('alttext', plain);
  return el('div', { class: cls }, math, el('code', { class: 'ri-plain', text: plain }), latexButton(math));
}

/** The integral asked for, as MathML and text; `pv` prefixes the principal value. */
function integralStatement(kind, omega, alpha, pv, value) {
  const x = kind === 'trig' ? 'θ' : 'x';
  const P = pv ? [mathEl('mtext', 'PV'), mmo('\u2061')] : [];
  const P_t = pv ? 'PV ' : '';
  const int = (lo, hi) => msubsup(mmo('∫'), lo, hi);
  const fx = [mmi('f'), mmo('('), mmi(x), mmo(')')];
  const dx = [mmi('d'), mmi(x)];
  const eq = [mmo('='), mathEl('mtext', value)];
  if (kind === 'line') return [mrow(...P, int(mrow(mmo('−'), mmi('∞')), mmi('∞')), ...fx, ...dx, ...eq), `${P_t}∫_{−∞}^{∞} f(x) dx = ${value}`];
  if (kind === 'fourier') {
    return [mrow(...P, int(mrow(mmo('−'), mmi('∞')), mmi('∞')), ...fx, msup(mmi('e'), mrow(mmi('i'), mmi('ω'), mmi(x))), ...dx, ...eq, mspace(), mmo('('), mmi('ω'), mmo('='), mnum(omega), mmo(')')),
      `${P_t}∫_{−∞}^{∞} f(x) e^(iωx) dx = ${value}   (ω = ${fmtReal(omega, 10)})`];
  }
  if (kind === 'trig') return [mrow(int(mmn('0'), mrow(mmn('2'), mmi('π'))), ...fx, ...dx, ...eq), `∫_0^{2π} f(θ) dθ = ${value}`];
  const a = Array.isArray(alpha) ? fmtSig(alpha, 10) : fmtReal(alpha, 10);
  return [mrow(int(mmn('0'), mmi('∞')), msup(mmi('x'), mrow(mmi('α'), mmo('−'), mmn('1'))), ...fx, ...dx, ...eq, mspace(), mmo('('), mmi('α'), mmo('='), mathEl('mtext', a), mmo(')')),
    `∫_0^∞ x^(α−1) f(x) dx = ${value}   (α = ${a})`];
}

/** The residue formula of the derivation, as MathML and text. */
function residueFormula(resp) {
  const d = resp.derivation;
  const res = (what) => mrow(mmi('Res'), mmo('['), ...what, mmo(','), mmi('a'), mmo(']'));
  const sigma = (cond) => msub(mmo('∑'), cond);
  const twoPiI = [mmn('2'), mmi('π'), mmi('i')];
  const pvTerm = d.contour.indentations.length ? [mmo(d.contour.shape === 'lower_half_disc' ? '−' : '+'), mmi('π'), mmi('i'), sigma(mrow(mmi('a'), mmo('∈'), mmi('ℝ'))), res(d.residues_of === 'f(z)' ? [mmi('f')] : [mmi('f'), msup(mmi('e'), mrow(mmi('i'), mmi('ω'), mmi('z')))])] : [];
  const pvText = d.contour.indentations.length ? ` ${d.contour.shape === 'lower_half_disc' ? '−' : '+'} πi Σ_{a real} Res[${d.residues_of}, a]` : '';
  switch (d.contour.shape) {
    case 'upper_half_disc':
    case 'lower_half_disc': {
      const up = d.contour.shape === 'upper_half_disc';
      const what = d.residues_of === 'f(z)' ? [mmi('f')] : [mmi('f'), msup(mmi('e'), mrow(mmi('i'), mmi('ω'), mmi('z')))];
      return [mrow(mmo('='), ...(up ? [] : [mmo('−')]), ...twoPiI, sigma(mrow(mmi('Im'), mmo('\u2061'), mmi('a'), mmo(up ? '>' : '<'), mmn('0'))), res(what), ...pvTerm),
        `= ${up ? '' : '−'}2πi Σ_{Im a ${up ? '>' : '<'} 0} Res[${d.residues_of}, a]${pvText}`];
    }
    case 'unit_circle':
      return [mrow(mmo('='), ...twoPiI, sigma(mrow(mmo('|'), mmi('a'), mmo('|'), mmo('<'), mmn('1'))), res([mmi('g')]), mmo(','), mmi('g'), mmo('('), mmi('z'), mmo(')'), mmo('='),
        mathEl('mfrac', mrow(mmi('f'), mmo('('), mmo('−'), mmi('i'), mmi('log'), mmo('\u2061'), mmi('z'), mmo(')')), mrow(mmi('i'), mmi('z')))),
        '= 2πi Σ_{|a|<1} Res[g, a], g(z) = f(−i log z)/(iz)'];
    default:
      return [mrow(mmo('='), mathEl('mfrac', mrow(...twoPiI), mrow(mmn('1'), mmo('−'), msup(mmi('e'), mrow(mmn('2'), mmi('π'), mmi('i'), mmi('α'))))),
        sigma(mrow(mmi('a'), mmo('≠'), mmn('0'))), res([msup(mmi('z'), mrow(mmi('α'), mmo('−'), mmn('1'))), mmi('f')])),
        '= 2πi/(1 − e^(2πiα)) Σ_{a≠0} Res[z^(α−1) f, a], arg z in (0, 2π)'];
  }
}

// ---- words ----------------------------------------------------------------------------------------

const RI_SHAPE_WORDS = {
  upper_half_disc: 'the upper half-disc: the real segment [−R, R] and the half circle |z| = R above it, counter-clockwise',
  lower_half_disc: 'the lower half-disc: the real segment [−R, R] and the half circle |z| = R below it, traversed clockwise (the real line still left to right)',
  unit_circle: 'the unit circle |z| = 1, once counter-clockwise',
  keyhole: 'the keyhole around the cut [0, ∞): out along the top of the cut, the large circle |z| = R, back below the cut, the small circle |z| = ε',
};
const RI_LEMMA_WORDS = {
  jordan: 'Jordan’s lemma drops the half circle',
  ml_estimate: 'The ML estimate (length × maximum) drops the half circle',
  keyhole_circles: 'Both circles of the keyhole vanish by the ML estimate',
  none: 'No piece is added to the path, so no lemma is needed',
};

function riEst(e) { return Number.isFinite(e) ? fmtReal(e, 2) : '—'; }

/** The variable sentence: the page's f and variable as the integrand. */
function integralVariableNote(kind, v) {
  if (kind === 'trig') return `The integrand is the page’s f with its variable ${v} = θ running over one period, 0 ≤ θ ≤ 2π (f must be 2π-periodic).`;
  if (kind === 'mellin') return `The integrand is the page’s f with its variable ${v} = x running along the positive real axis, times x^(α−1).`;
  return `The integrand is the page’s f with its variable ${v} = x running along the whole real axis${kind === 'fourier' ? ', times e^(iωx) (f is the amplitude)' : ''}.`;
}

// ---- the block ------------------------------------------------------------------------------------

/** The closing contour drawn on the phase plot while the block is open (set by showIntegral). */
export function drawIntegralContour(plot) {
  const c = plot.integralContour;
  if (!c || plot.infinityMode) return;
  const ctx = plot.ctx;
  const px = (x, y) => toScreen(plot, x, y);
  const R = c.radius;
  const rad = (r) => r / plot.scale;
  const [ox, oy] = px(0, 0);
  ctx.save();
  ctx.beginPath();
  if (c.shape === 'unit_circle') {
    ctx.arc(ox, oy, rad(1), 0, 2 * Math.PI);
  } else if (c.shape === 'keyhole') {
    const eps = c.inner_radius, gap = Math.min(0.03, 0.3 * eps / R);
    const a = Math.asin(Math.min(0.9, gap * R / eps));
    ctx.moveTo(ox + rad(eps) * Math.cos(a), oy - rad(eps) * Math.sin(a));
    ctx.lineTo(ox + rad(R) * Math.cos(gap), oy - rad(R) * Math.sin(gap));
    ctx.arc(ox, oy, rad(R), -gap, -2 * Math.PI + gap, true);
    ctx.lineTo(ox + rad(eps) * Math.cos(a), oy + rad(eps) * Math.sin(a));
    ctx.arc(ox, oy, rad(eps), a, 2 * Math.PI - a);
  } else {
    const up = c.shape === 'upper_half_disc';
    const dents = c.indentations.map((p) => p[0]).filter((x) => Math.abs(x) < R).sort((p, q) => p - q);
    const bump = Math.min(0.05 * R, ...dents.slice(1).map((x, i) => 0.4 * (x - dents[i])));
    const [sx0, sy0] = px(-R, 0);
    ctx.moveTo(sx0, sy0);
    for (const x of dents) {
      const [bx, by] = px(x, 0);
      ctx.lineTo(bx - rad(bump), by);
      ctx.arc(bx, by, rad(bump), Math.PI, 0, !up); // into the closing half-plane, the pole outside
    }
    ctx.lineTo(...px(R, 0));
    ctx.arc(ox, oy, rad(R), 0, Math.PI, up); // the canvas's y points down: anticlockwise on screen is the upper half
  }
  ctx.lineWidth = 3.5;
  ctx.strokeStyle = 'rgba(255,255,255,0.8)';
  ctx.stroke();
  ctx.setLineDash([7, 4]);
  ctx.lineWidth = 1.5;
  ctx.strokeStyle = 'rgba(20,20,20,0.95)';
  ctx.stroke();
  ctx.setLineDash([]);
  // The direction of travel: arrowheads at plane points [x, y] pointing right (+1) or left (−1).
  const arrows = c.shape === 'unit_circle' ? [[0, 1, -1], [0, -1, 1]]
    : c.shape === 'keyhole' ? [[(R + c.inner_radius) / 2, 0, 1], [0, R, -1], [0, c.inner_radius, 1]]
      : [[-R / 2, 0, 1], [0, c.shape === 'upper_half_disc' ? R : -R, -1]];
  for (const [x, y, dir] of arrows) {
    const [sx, sy] = px(x, y);
    const yy = c.shape === 'keyhole' && y === 0 ? sy - 4 : sy;
    ctx.beginPath();
    ctx.moveTo(sx + 6 * dir, yy);
    ctx.lineTo(sx - 5 * dir, yy - 5);
    ctx.lineTo(sx - 5 * dir, yy + 5);
    ctx.closePath();
    ctx.fillStyle = 'rgba(20,20,20,0.95)';
    ctx.strokeStyle = 'rgba(255,255,255,0.85)';
    ctx.lineWidth = 1.5;
    ctx.stroke();
    ctx.fill();
  }
  ctx.restore();
}

/** Wire the block (#ri-box). `hooks`: redraw() (the plot), persist(), show(view) (the plot shows at least view). Returns {changed(),
 *  ensure(), result(), stop()}: changed() after f, var, params or the block's fields change;
 *  ensure() computes for the current state when open (resolves when done); result() gives
 *  {request, response, stale} or null. */
export function attachRealIntegral(page, hooks) {
  const { state } = page;
  const $ = (id) => document.getElementById(id);
  const ui = {
    box: $('ri-box'), kind: $('ri-kind'), omega: $('ri-omega'), omegaRow: $('ri-omega-row'), alpha: $('ri-alpha'),
    alphaRow: $('ri-alpha-row'), what: $('ri-what'), status: $('ri-status'), refusal: $('ri-refusal'), result: $('ri-result'),
    statement: $('ri-statement'), value: $('ri-value'), pv: $('ri-pv'), ways: $('ri-ways'), verdict: $('ri-verdict'),
    showAll: $('ri-show'), derivation: $('ri-derivation'), residues: $('ri-residues'), warnings: $('ri-warnings'), staleNote: $('ri-stale'),
  };
  const block = { serial: 0, key: '', request: null, response: null, running: null, timer: 0 };

  function fill() {
    const it = state.integral;
    ui.kind.value = it.kind;
    ui.omega.value = String(it.omega);
    ui.alpha.value = riAlphaText(it.alpha);
    ui.omegaRow.hidden = it.kind !== 'fourier';
    ui.alphaRow.hidden = it.kind !== 'mellin';
    ui.what.textContent = integralVariableNote(it.kind, state.var.trim() || 'z');
    if (ui.box.open !== it.open) ui.box.open = it.open;
  }

  function setStatus(text, look) {
    ui.status.textContent = text;
    ui.box.dataset.state = look;
  }

  /** The results shown no longer belong to the state: dimmed, labelled, inert; the contour goes. */
  function markStale() {
    if (!block.response) return;
    ui.result.classList.add('stale');
    ui.refusal.classList.add('stale');
    ui.staleNote.hidden = false;
    ui.staleNote.textContent = `Computed for f = ${block.request.f} (${block.request.kind}); recomputing for the current f…`;
    if (page.plot.integralContour) { page.plot.integralContour = null; ui.box.dataset.drawn = ''; hooks.redraw(); }
  }

  function clear() {
    ui.result.hidden = true;
    ui.refusal.hidden = true;
    ui.staleNote.hidden = true;
    ui.result.classList.remove('stale');
    ui.refusal.classList.remove('stale');
  }

  function show(request, resp) {
    clear();
    const err = responseError(resp);
    page.plot.integralContour = null;
    ui.box.dataset.drawn = '';
    if (err) {
      if (err.code === 'cancelled') { setStatus('Stopped before the real integral finished.', 'stopped'); hooks.redraw(); return; }
      ui.refusal.hidden = false;
      ui.refusal.textContent = '';
      const head = err.code === 'divergent' ? 'Refused: the integral diverges. ' : err.code === 'not_applicable' ? 'Not computed: the method does not apply. ' : 'Not computed: ';
      ui.refusal.append(el('strong', { text: head }), el('span', { class: 'ri-reason', text: err.message }));
      ui.refusal.dataset.code = err.code || '';
      setStatus('', err.code === 'divergent' ? 'refused' : 'error');
      hooks.redraw();
      return;
    }
    setStatus('', 'done');
    ui.result.hidden = false;
    const value = isFinitePair(resp.value) ? fmtSig(trimBelow(resp.value, resp.error_estimate), 12) : 'not representable';
    const [mathRow, plain] = integralStatement(request.kind, request.omega, request.alpha, resp.principal_value, value);
    ui.statement.textContent = '';
    ui.statement.append(mathBlock(mathRow, plain));
    ui.value.textContent = '';
    ui.value.dataset.value = JSON.stringify(resp.value);
    ui.value.append(el('span', { class: 'ci-number', title: isFinitePair(resp.value) ? 'Full precision: ' + fmtExact(resp.value) : '', text: value }),
      el('span', { class: 'ci-est', text: ` error estimate ${riEst(resp.error_estimate)} (from: ${resp.value_from === 'residues' ? 'residues' : 'quadrature'})` }));
    ui.pv.hidden = !resp.principal_value;

    // The two ways and their agreement (the display the contour integral uses).
    ui.ways.textContent = '';
    const ways = [
      { key: 'residues', name: 'Residues', how: 'the residue theorem on the closing contour (the derivation below)', z: resp.by_residues, e: resp.residues_error_estimate },
      { key: 'quadrature', name: 'Quadrature', how: 'the integral summed numerically along the real path, independently', z: resp.by_quadrature, e: resp.quadrature_error_estimate },
    ];
    const errors = [];
    for (const w of ways) {
      const tr = el('tr', { 'data-way': w.key, 'data-value': JSON.stringify(w.z ?? null) },
        el('th', { scope: 'row' }, el('span', { class: 'ci-way', text: w.name }), el('span', { class: 'ci-how', text: w.how })));
      if (isFinitePair(w.z)) {
        errors.push(Number.isFinite(w.e) ? w.e : NaN);
        tr.append(el('td', { class: 'num', title: 'Full precision: ' + fmtExact(w.z), text: fmtSig(trimBelow(w.z, w.e), 12) }), el('td', { class: 'num', text: riEst(w.e) }));
      } else {
        tr.classList.add('missing');
        tr.append(el('td', { colspan: 2, class: 'ci-missing', text: '—, not available: see the warnings below' }));
      }
      ui.ways.append(tr);
    }
    showAgreement(ui.verdict, ui.box, resp, errors);

    // The derivation.
    ui.derivation.textContent = '';
    ui.residues.textContent = '';
    const d = resp.derivation;
    ui.derivation.hidden = !d;
    ui.residues.closest('table').hidden = !d;
    if (d) {
      const step = (title, ...body) => ui.derivation.append(el('li', { 'data-step': title }, el('strong', { text: title + '. ' }), ...body));
      if (d.substitution) step('Substitution', el('span', { class: 'ri-sub', text: d.substitution + ': the integral becomes ∮ over |z| = 1 of g(z) dz.' }));
      const r = d.contour.radius;
      const radius = d.contour.shape === 'unit_circle' ? ' It lies in the plane of z = e^(iθ), not in the plane of the page’s variable: the plot draws it for reference, and the points in the table are points of that plane.' : d.contour.shape === 'keyhole'
        ? ` Drawn on the plot with R = ${fmtReal(r, 4)}, ε = ${fmtReal(d.contour.inner_radius, 4)} (the derivation lets R → ∞, ε → 0).`
        : ` Drawn on the plot with R = ${fmtReal(r, 4)} (the derivation lets R → ∞).`;
      const dents = d.contour.indentations.length
        ? ` The line is indented by small half circles around ${d.contour.indentations.map((p) => 'x = ' + fmtReal(p[0], 10)).join(', ')} (simple poles on the axis): the value is a Cauchy principal value, each such pole counting with half weight, ±πi × its residue.`
        : '';
      step('Closing contour', el('span', { class: 'ri-shape', 'data-shape': d.contour.shape, text: RI_SHAPE_WORDS[d.contour.shape] + '.' + radius + dents }));
      step('Residues', el('span', { text: `of ${d.residues_of} at the singular points the contour encloses (table).` }));
      step('Lemma', el('span', { class: 'ri-lemma', 'data-lemma': d.lemma, text: `${RI_LEMMA_WORDS[d.lemma] || d.lemma}: ${d.lemma_condition}.` }));
      const [fRow, fPlain] = residueFormula(resp);
      const sumBox = el('div', { class: 'ri-sum' }, mathBlock(fRow, fPlain), el('code', { class: 'ri-written', text: '= ' + d.sum }));
      step('Sum', sumBox);
      for (const t of resp.residues_used) {
        const cell = (z, e) => el('td', { class: 'num', title: 'Full precision: ' + fmtExact(z), text: fmtSig(e ? trimBelow(z, e) : z, 8) });
        ui.residues.append(el('tr', { title: t.note }, cell(t.at, 0), el('td', { class: 'num', text: t.order === null || t.order === undefined ? 'essential' : String(t.order) }),
          cell(t.residue, t.error_estimate), cell(t.weight, 0), el('td', { class: 'ri-note', text: t.note })));
      }
      if (!resp.residues_used.length) ui.residues.append(el('tr', {}, el('td', { colspan: 5, text: 'No singular point lies inside: the sum is 0.' })));
      page.plot.integralContour = d.contour;
    }
    ui.showAll.hidden = !d;
    ui.box.dataset.drawn = d ? d.contour.shape : '';
    ui.warnings.textContent = '';
    for (const w of resp.warnings || []) ui.warnings.append(el('li', { text: String(w) }));
    hooks.redraw();
  }

  /** Compute for the current state when open and not already shown; resolves when done. */
  function ensure() {
    clearTimeout(block.timer);
    if (!ui.box.open) return Promise.resolve();
    const request = integralRequest(state);
    const key = JSON.stringify(request);
    if (key === block.key) return block.running || Promise.resolve();
    const serial = ++block.serial;
    block.key = key;
    markStale();
    setStatus('Computing the real integral…', 'busy');
    block.running = runHeavy(request).then((resp) => {
      if (serial !== block.serial) return;
      block.request = request;
      block.response = resp;
      block.running = null;
      show(request, resp);
    });
    return block.running;
  }

  function changed() {
    fill();
    if (!ui.box.open) return;
    if (JSON.stringify(integralRequest(state)) !== block.key) markStale();
    clearTimeout(block.timer);
    block.timer = setTimeout(ensure, 250);
  }

  ui.box.addEventListener('toggle', () => {
    state.integral.open = ui.box.open;
    hooks.persist();
    if (ui.box.open) { ensure(); if (block.response && !responseError(block.response) && block.key === JSON.stringify(integralRequest(state))) show(block.request, block.response); }
    else if (page.plot.integralContour) { page.plot.integralContour = null; ui.box.dataset.drawn = ''; hooks.redraw(); }
  });
  // Zoom the plot out (or in) to the whole drawn contour, with a margin.
  ui.showAll.addEventListener('click', () => {
    const c = page.plot.integralContour;
    if (!c || page.plot.infinityMode) return;
    const R = 1.15 * c.radius;
    const half = c.shape === 'upper_half_disc' ? [-0.15 * R, R] : c.shape === 'lower_half_disc' ? [-R, 0.15 * R] : [-R, R];
    hooks.show([-R, R, half[0], half[1]]);
  });
  ui.kind.addEventListener('change', () => { state.integral.kind = ui.kind.value; hooks.persist(); changed(); });
  ui.omega.addEventListener('change', () => {
    const w = Number(ui.omega.value);
    if (ui.omega.value.trim() !== '' && Number.isFinite(w)) { state.integral.omega = w; hooks.persist(); changed(); }
  });
  ui.alpha.addEventListener('change', () => {
    const a = parseAlpha(ui.alpha.value);
    ui.alpha.setCustomValidity(a === null ? 'α is a number, or a complex number such as 0.3+0.2i' : '');
    if (a !== null) { state.integral.alpha = a; hooks.persist(); changed(); }
  });
  fill();
  setStatus('Open to compute; recomputed when f or the fields here change.', 'closed');

  return {
    changed,
    fill,
    ensure,
    stop() {
      if (ui.box.dataset.state !== 'busy') return;
      block.serial++; block.key = ''; block.running = null;
      setStatus('Stopped before the real integral finished.', 'stopped');
    },
    open: () => ui.box.open,
    result() {
      if (!block.response || !ui.box.open) return null;
      return { request: block.request, response: block.response, stale: block.key !== JSON.stringify(integralRequest(state)) || ui.box.dataset.state === 'busy' };
    },
  };
}

// The transfer-function section: for a rational f in s (continuous) or z (discrete, sampling
// period T), the core's `transfer_function` reading: the frequency response on a chart
// (bode-chart.js), the gain and phase margins, the encirclement count with the open- and
// closed-loop right-half-plane (outside-the-unit-circle) poles, the poles and zeros with their
// natural frequency, damping, Q and time constant, and the step response with its metrics.
// Computed when the section is opened, and again with each search while it is open.
import { el } from './dom.js';
import { fmtReal, fmtComplex } from './format.js';
import { runHeavy, responseError } from './engine.js';
import { rationalAnalysis } from './fit.js';
import { drawBodeChart, nearestIndex } from './bode-chart.js';
import { drawInverseChart } from './inverse-chart.js';

/** Only these variables are read as a transfer function. */
export function transferDomain(variable) {
  return variable === 's' || variable === 'z' ? variable : null;
}

/** What the section shows and asks: the request it answers (key), the chosen unit and sampling
 *  period, and a serial that makes an answer arriving after Stop or a newer request go unused. */
const section = { key: '', serial: 0, forceOpen: null, chart: null };

/** The point the encirclement is counted about, [re, im] (−1 by default). */
let point = [-1, 0];
/** Count the encirclements about `p` ([re, im]) from the next reading on. */
export function setTransferPoint(p) { point = [p[0], p[1]]; }
/** The point the encirclements are counted about, [re, im]. */
export function currentTransferPoint() { return point.slice(); }

/** The sampling period typed (z), or 1. */
function samplePeriod(ui) {
  const T = Number(ui.period.value);
  return Number.isFinite(T) && T > 0 ? T : 1;
}

/** The request for the function `base` ({f, var, params}) with the section's choices. */
export function transferRequest(base, ui) {
  const req = { task: 'transfer_function', f: base.f, var: base.var, params: base.params, hz: ui.unit.value === 'Hz', point: point.slice() };
  if (base.var === 'z') req.sample_period = samplePeriod(ui);
  return req;
}

function status(parts, text, look) {
  parts.status.textContent = text;
  parts.box.dataset.state = look;
}

const cap = (s) => s.charAt(0).toUpperCase() + s.slice(1);
const num = (x, d = 5) => (x === null || x === undefined ? '—' : fmtReal(x, d));
const int = (n) => (n === null || n === undefined ? '—' : String(n).replace('-', '−'));
const times = (n) => (Math.abs(n) === 1 ? 'time' : 'times');

/** A gain {value, infinite, pole_order} as text. */
function gainText(g) {
  if (!g) return '—';
  if (g.infinite) return `infinite (a pole of order ${g.pole_order} there)`;
  if (!Array.isArray(g.value)) return '—';
  const [re, im] = g.value;
  const mag = Math.hypot(re, im);
  return fmtComplex(g.value, 6) + (mag > 0 ? ` (${fmtReal(20 * Math.log10(mag), 4)} dB)` : '');
}

/** The margins as sentences. */
function marginLines(m) {
  const u = m.unit;
  const out = [];
  const gc = m.gain_crossovers || [], pm = m.phase_margins || [];
  out.push(gc.length
    ? 'Gain crossover (|F| = 0 dB): ' + gc.map((w, i) => `${num(w)} ${u}, phase margin ${num(pm[i], 4)}°`).join('; ')
    : 'Gain crossover (|F| = 0 dB): none on the frequency grid, so no phase margin');
  const pc = m.phase_crossovers || [], gm = m.gain_margins || [];
  out.push(pc.length
    ? 'Phase crossover (phase −180° mod 360°): ' + pc.map((w, i) => `${num(w)} ${u}, gain margin ${num(gm[i], 4)} dB`).join('; ')
    : 'Phase crossover (phase −180° mod 360°): none on the frequency grid, so no gain margin');
  return out;
}

/** The encirclement sentence. */
function encirclementText(e, domain) {
  const about = fmtComplex(e.about, 6);
  const image = domain === 'z' ? 'F(e^(jωT))' : 'F(jω)';
  const where = domain === 'z' ? 'outside the unit circle' : 'in the right half-plane';
  const P = e.open_loop_rhp_poles, Z = e.closed_loop_rhp_poles;
  if (e.winding === null || e.winding === undefined) {
    return `${image} passes through ${about} (or the count was not resolved), so the encirclements are not counted; open-loop poles ${where} P = ${int(P)} (see the warnings).`;
  }
  const N = e.winding;
  return `${image} encircles ${about} N = ${int(N)} ${times(N)} clockwise` + (N < 0 ? ` (${-N} counterclockwise)` : '') +
    `; open-loop poles ${where} P = ${int(P)}; closed-loop poles ${where} Z = N + P = ${int(Z)}.`;
}

/** Fill the section from the response (or error object) of `request`. */
export function showTransfer(parts, request, resp) {
  parts.warnings.textContent = '';
  const err = responseError(resp);
  if (err) {
    parts.result.hidden = true;
    delete parts.chart.dataset.points;
    if (err.code === 'cancelled') { status(parts, 'Stopped before the frequency response finished.', 'stale'); return; }
    status(parts, 'Not computed: ' + cap(err.message) + (err.message.endsWith('.') ? '' : '.'), 'error');
    return;
  }
  status(parts, '', 'done');
  parts.result.hidden = false;
  const domain = resp.domain;
  const fr = resp.frequency_response;
  const T = resp.sample_period;
  const nyquist = domain === 'z' && T > 0 ? (fr.unit === 'Hz' ? 1 / (2 * T) : Math.PI / T) : null;
  parts.chart.dataset.points = JSON.stringify({ omega: fr.omega, db: fr.magnitude_db, deg: fr.phase_deg, unit: fr.unit, nyquist });
  parts.chart.setAttribute('aria-label', `Frequency response: magnitude in dB and phase in degrees for frequencies ${num(fr.omega[0], 3)} to ${num(fr.omega[fr.omega.length - 1], 3)} ${fr.unit}`);
  section.chart = drawBodeChart(parts.chart);
  parts.readout.textContent = 'Point at the chart for the values at a frequency.';

  for (const w of Array.isArray(resp.warnings) ? resp.warnings : []) parts.warnings.append(el('li', { text: cap(String(w)) }));

  parts.margins.textContent = '';
  for (const line of marginLines(resp.margins)) parts.margins.append(el('li', { text: line }));

  const e = resp.encirclement;
  parts.encircle.textContent = encirclementText(e, domain);
  parts.encircle.dataset.winding = String(e.winding);
  parts.encircle.dataset.p = String(e.open_loop_rhp_poles);
  parts.encircle.dataset.z = String(e.closed_loop_rhp_poles);
  parts.caution.textContent = e.caution || '';

  // the poles and zeros
  const u = fr.unit;
  parts.rootsHead.textContent = '';
  const heads = ['', 'at', 'order', u === 'Hz' ? 'fn (Hz)' : `ωn (${u})`, 'ζ', 'Q', 'τ'].concat(domain === 'z' ? ['|p|', 's = ln(p)/T'] : []);
  parts.rootsHead.append(el('tr', {}, ...heads.map((h) => el('th', { scope: 'col', text: h }))));
  parts.roots.textContent = '';
  const rows = [...(resp.poles || []).map((r) => ['pole', r]), ...(resp.zeros || []).map((r) => ['zero', r])];
  for (const [kind, r] of rows) {
    const cells = [kind, fmtComplex(r.at, 6), String(r.order), num(r.natural_frequency), num(r.damping_ratio, 4),
      num(r.quality_factor, 4), num(r.time_constant)];
    if (domain === 'z') cells.push(num(r.magnitude), r.s_equivalent ? fmtComplex(r.s_equivalent, 5) : '—');
    parts.roots.append(el('tr', {}, ...cells.map((c) => el('td', { text: c }))));
  }
  if (!rows.length) parts.roots.append(el('tr', {}, el('td', { colspan: String(heads.length), text: 'No finite poles or zeros.' })));

  parts.facts.textContent = '';
  const fact = (term, text) => parts.facts.append(el('div', {}, el('dt', { text: term }), el('dd', { text })));
  fact(domain === 'z' ? 'DC gain F(1)' : 'DC gain F(0)', gainText(resp.dc_gain));
  fact(domain === 'z' ? 'Gain at Nyquist F(−1)' : 'High-frequency gain', gainText(resp.high_frequency_gain));
  fact('Relative degree', `${resp.relative_degree} (degree of the denominator minus that of the numerator)`);

  // the step response
  const st = resp.step;
  parts.step.textContent = '';
  if (st && Array.isArray(st.t) && st.t.length) {
    const isZ = domain === 'z';
    const xs = isZ ? st.t.map((t) => Math.round(t / T)) : st.t;
    parts.stepChart.dataset.kind = isZ ? 'z' : 'laplace';
    parts.stepChart.dataset.points = JSON.stringify({ x: xs, y: st.y.map((v) => (Number.isFinite(v) ? v : null)) });
    parts.stepFigure.hidden = false;
    drawInverseChart(parts.stepChart);
    const tu = isZ ? ` (T = ${num(T)})` : '';
    const m = (term, v, unit = '') => parts.step.append(el('div', {}, el('dt', { text: term }), el('dd', { text: v === null || v === undefined ? '—' : num(v) + unit })));
    if (st.steady_state === null) {
      parts.step.append(el('div', {}, el('dt', { text: 'Metrics' }), el('dd', { text: 'none: the step response has no steady state (a pole is not ' + (isZ ? 'inside the unit circle' : 'in the open left half-plane') + ')' })));
    } else {
      m('Steady state', st.steady_state);
      m('Rise time 10–90 %', st.rise_time, tu);
      m('Overshoot', st.overshoot_percent, ' %');
      m('Peak time', st.peak_time, tu);
      m('Settling time 2 %', st.settling_time, tu);
    }
  } else {
    parts.stepFigure.hidden = true;
    delete parts.stepChart.dataset.points;
  }
}

// ---- the section on the page ---------------------------------------------------------

/** For the scripting interface, before the next search: open or fold the section (null keeps it). */
export function askTransfer(open) {
  if (typeof open === 'boolean') section.forceOpen = open;
}

/** Whether the section is shown and open. */
export function transferOpen(page) {
  const box = page.ui.tf.box;
  return !box.hidden && box.open;
}

/** After a search: show the section when f is rational in s or z; folded unless asked. */
export async function prepareTransfer(page, base) {
  const tf = page.ui.tf;
  const domain = transferDomain(base.var);
  let shown = Boolean(domain);
  if (shown) {
    const known = await rationalAnalysis(base);
    shown = Boolean(known && known.rational);
  }
  tf.box.hidden = !shown;
  if (typeof section.forceOpen === 'boolean') tf.box.open = section.forceOpen;
  section.forceOpen = null;
  if (!shown) return;
  tf.periodRow.hidden = domain !== 'z';
  tf.box.dataset.var = domain;
  if (!tf.box.open) {
    tf.result.hidden = true;
    tf.warnings.textContent = '';
    section.key = '';
    status(tf, 'Open this section to compute the frequency response.', 'closed');
  }
}

/** Compute and show the reading for `base` (the searched function). */
export async function runTransfer(page, base) {
  const tf = page.ui.tf;
  if (!transferDomain(base.var)) return;
  const request = transferRequest(base, tf);
  const serial = ++section.serial;
  status(tf, 'Computing the frequency response…', 'busy');
  const resp = await runHeavy(request);
  if (serial !== section.serial) return;
  showTransfer(tf, request, resp);
  section.key = JSON.stringify(request);
  if (page.results) { page.results.transfer_function = resp; page.results.transferRequest = request; }
}

/** Stop pressed: a reading in progress is dropped. */
export function stopTransfer(page) {
  if (page.ui.tf.box.dataset.state !== 'busy') return;
  section.serial++;
  status(page.ui.tf, 'Stopped before the frequency response finished.', 'stale');
}

/** Redraw the charts (after a resize). */
export function redrawTransfer(page) {
  const tf = page.ui.tf;
  if (tf.result.hidden || !tf.box.open) return;
  section.chart = drawBodeChart(tf.chart);
  if (!tf.stepFigure.hidden) drawInverseChart(tf.stepChart);
}

/** Opening the section or changing a choice outside a search: compute now, if the results are current. */
async function onDemand(page) {
  const ui = page.ui;
  if (!transferOpen(page)) return;
  if (ui.find.disabled) return; // a search is running; it computes the reading at its end
  if (ui.singTable.classList.contains('stale') || !page.found.base) { status(ui.tf, 'Computed with the next search.', 'stale'); return; }
  if (section.key === JSON.stringify(transferRequest(page.found.base, ui.tf))) { redrawTransfer(page); return; }
  const serial = page.searchSerial;
  ui.cancel.disabled = false;
  await runTransfer(page, page.found.base);
  if (serial === page.searchSerial) ui.cancel.disabled = true;
}

/** Opening the section, the unit and the sampling period, and the pointer on the chart. */
export function attachTransferSection(page) {
  const tf = page.ui.tf;
  tf.box.addEventListener('toggle', () => { if (tf.box.open) onDemand(page); });
  tf.unit.addEventListener('change', () => onDemand(page));
  tf.period.addEventListener('change', () => onDemand(page));
  const readAt = (ev) => {
    if (!tf.chart.dataset.points || !section.chart) return;
    const r = tf.chart.getBoundingClientRect();
    const x = ev.clientX - r.left;
    if (x < section.chart.left || x > section.chart.right) return;
    const d = JSON.parse(tf.chart.dataset.points);
    const i = nearestIndex(d.omega, section.chart.toFrequency(x));
    drawBodeChart(tf.chart, i);
    const sym = d.unit === 'Hz' ? 'f' : 'ω';
    tf.readout.textContent = `${sym} = ${num(d.omega[i])} ${d.unit}: |F| = ${d.db[i] === null ? '— (a pole)' : num(d.db[i], 5) + ' dB'}, phase = ${d.deg[i] === null ? '—' : num(d.deg[i], 5) + '°'}`;
  };
  tf.chart.addEventListener('pointermove', readAt);
  tf.chart.addEventListener('pointerleave', () => { if (tf.chart.dataset.points) drawBodeChart(tf.chart); });
}

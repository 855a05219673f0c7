// The transfer-function section: for a rational f in s (continuous) or z (discrete, sampling
// period T), the core's `transfer_function` reading: the frequency response on a chart
// (bode-chart.js), the gain and phase margins, the encirclement count with the open- and
// closed-loop right-half-plane (outside-the-unit-circle) poles, the poles and zeros with their
// natural frequency, damping, Q and time constant, the polar plot of the contour's image with the
// point counted about (a click picks another), and the step (with its metrics drawn) and impulse
// responses. Each chart has a cursor (pointer and keys, chart-kit.js) and its samples in a folded
// table (data-table.js). Computed when the section is opened, and again with each search while
// it is open.
import { el, $ } from './dom.js';
import { fmtReal, fmtComplex } from './format.js';
import { runHeavy, responseError } from './engine.js';
import { rationalAnalysis } from './fit.js';
import { drawBodeChart, nearestIndex } from './bode-chart.js';
import { drawInverseChart } from './inverse-chart.js';
import { drawPolarChart } from './polar-chart.js';
import { attachCursor } from './chart-kit.js';
import { setDataTable } from './data-table.js';
import { ink } from './scheme.js';

/** How f is read as a transfer function: 'auto' (by the variable's name: s continuous, z
 *  discrete, any other not at all), 's', 'z', or 'none' (never). The page state's `domain`. */
let chosenDomain = 'auto';
export const DOMAIN_CHOICES = ['auto', 's', 'z', 'none'];
export function setTransferDomain(d) { chosenDomain = DOMAIN_CHOICES.includes(d) ? d : 'auto'; }
export function currentTransferDomain() { return chosenDomain; }

/** The domain f in `variable` is read in ('s' or 'z'), or null when it is not read as a transfer function. */
export function transferDomain(variable) {
  if (chosenDomain === 'none') return null;
  if (chosenDomain === 's' || chosenDomain === 'z') return chosenDomain;
  return variable === 's' || variable === 'z' ? variable : null;
}

/** What the section shows and asks: the request it answers (key), the chosen unit and sampling
 *  period, and a serial that makes an answer arriving after Stop or a newer request go unused. */
const section = { key: '', serial: 0, forceOpen: null, chart: null, openedFor: '', autoOpened: false,
  point: null,        // the point the encirclements are counted about ([re, im]); null: −1
  polar: null,        // {samples: [{re, im, w, kind}], about, unit, domain}: the polar plot's data
  shown: 0,           // counts the responses shown (a deferred drawing of an older one is dropped)
  bode: null,         // the frequency response shown (the chart's data-points, parsed)
  polarMap: null, stepMap: null, impulseMap: null,
  time: { step: null, impulse: null }, // {x, t, y, isZ, T, metrics}: the time charts' data
  cursors: null };    // the four charts' cursors (attachCursor)

/** The point the encirclements are counted about, [re, im] (default −1). */
export function currentTransferPoint() {
  return section.point ? section.point.slice() : [-1, 0];
}

/** Count the encirclements about `p` (a number, [re, im], or null for −1) from the next reading
 *  on; returns the point kept, [re, im]. A point that is not finite is refused (an error with
 *  code bad_request). */
export function setTransferPoint(p) {
  const pair = p === null || p === undefined ? [-1, 0] : typeof p === 'number' ? [p, 0] : p;
  if (!Array.isArray(pair) || pair.length !== 2 || !pair.every((v) => typeof v === 'number' && Number.isFinite(v))) {
    const err = new Error('the point must be a finite number or [re, im]');
    err.code = 'bad_request';
    throw err;
  }
  section.point = pair[0] === -1 && pair[1] === 0 ? null : [pair[0] + 0, pair[1] + 0];
  return currentTransferPoint();
}

/** The sampling period typed (z), or 1. */
function samplePeriod(ui) {
  const T = Number(ui.period.value);
  return Number.isFinite(T) && T > 0 ? T : 1;
}

/** The request for the function `base` ({f, var, params}) with the section's choices. */
export function transferRequest(base, ui) {
  const domain = transferDomain(base.var) || 's';
  const req = { task: 'transfer_function', f: base.f, var: base.var, params: base.params, domain, hz: ui.unit.value === 'Hz' };
  if (domain === 'z') req.sample_period = samplePeriod(ui);
  if (section.point) req.point = section.point.slice();
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

/** The polar plot's samples in contour order: the core's image of the contour when the response
 *  has one, else F(jω) from the frequency response for ω > 0 and its mirror (the conjugate) for
 *  ω < 0. Each sample {re, im, w (the frequency, negative on the mirror; null off the axis), kind}. */
export function polarSamples(resp) {
  const out = [];
  const segs = resp.image && Array.isArray(resp.image.segments) ? resp.image.segments : null;
  if (segs) {
    for (const seg of segs) {
      const vals = Array.isArray(seg.value) ? seg.value : [];
      vals.forEach((v, k) => {
        const ok = Array.isArray(v) && Number.isFinite(v[0]) && Number.isFinite(v[1]);
        out.push({ re: ok ? v[0] : null, im: ok ? v[1] : null, w: Array.isArray(seg.omega) ? seg.omega[k] : null, kind: seg.kind || 'axis' });
      });
    }
    return out;
  }
  const fr = resp.frequency_response;
  const pos = fr.omega.map((w, i) => {
    const db = fr.magnitude_db[i], deg = fr.phase_deg[i];
    if (db === null || deg === null || !Number.isFinite(db) || !Number.isFinite(deg)) return { re: null, im: null, w, kind: 'axis' };
    const m = Math.pow(10, db / 20), a = (deg * Math.PI) / 180;
    return { re: m * Math.cos(a), im: m * Math.sin(a), w, kind: 'axis' };
  });
  for (let i = pos.length - 1; i >= 0; i--) out.push({ re: pos[i].re, im: pos[i].im === null ? null : -pos[i].im, w: -pos[i].w, kind: 'axis' });
  // the fallback knows nothing of the contour's detour at ω = 0: the pen lifts there
  if (pos.length) pos[0].gap = true;
  return out.concat(pos);
}

const cell = (v, d = 9) => (v === null || v === undefined || !Number.isFinite(v) ? '—' : fmtReal(v, d));
const pieceName = { axis: 'axis', indent: 'detour', closing: 'closing arc' };

/** The frequency symbol and unit: ω (rad/s) or f (Hz). */
const freqSym = (unit) => (unit === 'Hz' ? 'f' : 'ω');
const freqHead = (unit) => (unit === 'Hz' ? 'f (Hz)' : 'ω (rad/s)');

/** The readout of polar sample i. */
function polarRead(i) {
  const d = section.polar, s = d.samples[i];
  const where = s.kind === 'indent' ? 'on the detour around a pole on the contour' : s.kind === 'closing' ? 'on the large closing arc'
    : `${freqSym(d.unit)} = ${num(s.w)} ${d.unit}`;
  if (s.re === null) return `${where}: F = — (a pole)`;
  const mag = Math.hypot(s.re, s.im);
  return `${where}: F = ${fmtComplex([s.re, s.im], 6)} (|F| = ${num(mag)}, angle ${num((Math.atan2(s.im, s.re) * 180) / Math.PI, 5)}°)`;
}

/** The readout of time-chart sample i. */
function timeRead(which, i) {
  const d = section.time[which];
  const name = which === 'step' ? (d.isZ ? 'y[n]' : 'y(t)') : d.isZ ? 'h[n]' : 'h(t)';
  const v = d.y[i] === null ? '—' : num(d.y[i], 6);
  return d.isZ ? `n = ${d.x[i]} (t = ${num(d.t[i])} s): ${name} = ${v}` : `t = ${num(d.t[i])} s: ${name} = ${v}`;
}

/** The step metrics drawn on the step chart: the steady state and its 2 % band, the peak,
 *  the 10–90 % rise interval and the settling time. */
function stepDecoration(d) {
  const st = d.metrics;
  if (!st || st.steady_state === null || !Number.isFinite(st.steady_state)) return null;
  const yinf = st.steady_state, band = 0.02 * Math.abs(yinf);
  const toX = (t) => (d.isZ ? t / d.T : t);
  // the rise's start: the first sample at 10 % of the steady state (the core refines on the closed form)
  const k10 = d.y.findIndex((v) => v !== null && v * Math.sign(yinf) >= 0.1 * Math.abs(yinf));
  const t10 = k10 >= 0 ? d.t[k10] : null;
  return (g, m) => {
    const x0 = m.left, x1 = m.right;
    g.fillStyle = ink('chart-good-band');
    g.fillRect(x0, m.py(yinf + band), x1 - x0, m.py(yinf - band) - m.py(yinf + band));
    g.strokeStyle = ink('chart-good'); g.lineWidth = 1; g.setLineDash([5, 3]);
    g.beginPath(); g.moveTo(x0, m.py(yinf)); g.lineTo(x1, m.py(yinf)); g.stroke();
    g.setLineDash([]);
    g.font = '10px system-ui, sans-serif'; g.fillStyle = ink('chart-good'); g.textAlign = 'right'; g.textBaseline = 'bottom';
    g.fillText('steady state ± 2 %', x1 - 2, m.py(yinf + band) - 1);
    if (t10 !== null && Number.isFinite(st.rise_time)) {
      const a = m.px(toX(t10)), b = m.px(toX(t10 + st.rise_time)), yy = m.py(0.5 * yinf);
      g.strokeStyle = ink('chart-purple'); g.fillStyle = ink('chart-purple');
      g.beginPath(); g.moveTo(a, yy); g.lineTo(b, yy); g.moveTo(a, yy - 4); g.lineTo(a, yy + 4); g.moveTo(b, yy - 4); g.lineTo(b, yy + 4); g.stroke();
      g.textAlign = 'left'; g.textBaseline = 'bottom';
      g.fillText('rise 10–90 %', b + 3, yy);
    }
    if (Number.isFinite(st.settling_time)) {
      const xx = m.px(toX(st.settling_time));
      g.strokeStyle = ink('chart-good'); g.setLineDash([2, 3]);
      g.beginPath(); g.moveTo(xx, m.top); g.lineTo(xx, m.bottom); g.stroke(); g.setLineDash([]);
      g.fillStyle = ink('chart-good'); g.textAlign = 'left'; g.textBaseline = 'top';
      g.fillText('settled', xx + 2, m.top + 1);
    }
    if (Number.isFinite(st.peak_time) && Number.isFinite(st.overshoot_percent)) {
      const xx = m.px(toX(st.peak_time)), yy = m.py(yinf + (st.overshoot_percent / 100) * Math.abs(yinf));
      g.fillStyle = ink('chart-mark');
      g.beginPath(); g.moveTo(xx, yy - 6); g.lineTo(xx + 5, yy); g.lineTo(xx, yy + 6); g.lineTo(xx - 5, yy); g.closePath(); g.fill();
      g.textAlign = 'left'; g.textBaseline = 'bottom';
      g.fillText('peak', xx + 6, yy - 2);
    }
  };
}

/** Draw a time chart (step or impulse) with its cursor. */
function drawTime(parts, which, cursor = -1) {
  const d = section.time[which];
  const canvas = which === 'step' ? parts.stepChart : parts.impulseChart;
  if (!d) return;
  const extraY = which === 'step' && d.metrics && Number.isFinite(d.metrics.steady_state)
    ? [d.metrics.steady_state * 1.02, d.metrics.steady_state * 0.98] : [];
  const xLabel = d.isZ ? `n (t = nT, T = ${num(d.T)} s)` : 'time t (s)';
  const map = drawInverseChart(canvas, { cursor, xLabel, extraY, decorate: which === 'step' ? stepDecoration(d) : null });
  if (which === 'step') section.stepMap = map; else section.impulseMap = map;
}

/** A time chart's data from the response's {t, y}. */
function timeData(series, isZ, T, metrics) {
  if (!series || !Array.isArray(series.t) || !series.t.length) return null;
  const y = series.y.map((v) => (Number.isFinite(v) ? v : null));
  return { t: series.t, x: isZ ? series.t.map((t) => Math.round(t / T)) : series.t, y, isZ, T, metrics };
}

/** Show a time chart (or hide its figure) and give its table the samples. */
function showTime(parts, which, d) {
  section.time[which] = d;
  const canvas = which === 'step' ? parts.stepChart : parts.impulseChart;
  const figure = which === 'step' ? parts.stepFigure : parts.impulseFigure;
  const table = which === 'step' ? parts.stepData : parts.impulseData;
  const readout = which === 'step' ? parts.stepReadout : parts.impulseReadout;
  if (section.cursors) section.cursors[which].reset();
  if (!d) {
    figure.hidden = true;
    delete canvas.dataset.points;
    setDataTable(table, `${which} response samples`, null);
    return;
  }
  canvas.dataset.kind = d.isZ ? 'z' : 'laplace';
  canvas.dataset.points = JSON.stringify({ x: d.x, y: d.y });
  figure.hidden = false;
  if (which === 'step') section.stepMap = null; else section.impulseMap = null;
  later(() => drawTime(parts, which));
  readout.textContent = 'Point at the chart, or focus it and use the arrow keys, for the values at a time.';
  const name = which === 'step' ? 'y' : 'h';
  setDataTable(table, `${which === 'step' ? 'Step' : 'Impulse'} response samples`, {
    heads: d.isZ ? ['n', 't = nT (s)', `${name}[n]`] : ['t (s)', `${name}(t)`],
    count: d.t.length,
    row: (i) => (d.isZ ? [String(d.x[i]), cell(d.t[i]), cell(d.y[i])] : [cell(d.t[i]), cell(d.y[i])]),
    values: (i) => (d.isZ ? [d.x[i], d.t[i], d.y[i]] : [d.t[i], d.y[i]]),
  });
}

/** Run `fn` in a task of its own (so that no one task draws every chart), unless newer data
 *  arrived meanwhile. */
function later(fn) {
  const serial = section.shown;
  setTimeout(() => { if (serial === section.shown) fn(); }, 0);
}

/** Draw the polar plot with its cursor. */
function drawPolar(parts, cursor = -1) {
  section.polarMap = drawPolarChart(parts.polar, section.polar, parts.polarView.value, cursor);
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
  section.shown++;
  const domain = resp.domain;
  const fr = resp.frequency_response;
  const T = resp.sample_period;
  const nyquist = domain === 'z' && T > 0 ? (fr.unit === 'Hz' ? 1 / (2 * T) : Math.PI / T) : null;
  if (section.cursors) for (const c of Object.values(section.cursors)) c.reset();
  section.bode = { omega: fr.omega, db: fr.magnitude_db, deg: fr.phase_deg, unit: fr.unit, nyquist };
  parts.chart.dataset.points = JSON.stringify(section.bode);
  parts.chart.setAttribute('aria-label', `Frequency response: magnitude in dB and phase in degrees for frequencies ${num(fr.omega[0], 3)} to ${num(fr.omega[fr.omega.length - 1], 3)} ${fr.unit}`);
  section.chart = drawBodeChart(parts.chart);
  parts.readout.textContent = 'Point at the chart, or focus it and use the arrow keys, for the values at a frequency.';
  setDataTable(parts.bodeData, 'Frequency response samples', {
    heads: [freqHead(fr.unit), '|F| (dB)', 'phase (°)'],
    count: fr.omega.length,
    row: (i) => [cell(fr.omega[i]), cell(fr.magnitude_db[i]), cell(fr.phase_deg[i])],
    values: (i) => [fr.omega[i], fr.magnitude_db[i], fr.phase_deg[i]],
  });

  for (const w of Array.isArray(resp.warnings) ? resp.warnings : []) parts.warnings.append(el('li', { text: cap(String(w)) }));

  parts.margins.textContent = '';
  for (const line of marginLines(resp.margins)) parts.margins.append(el('li', { text: line }));

  const e = resp.encirclement;
  parts.encircle.textContent = encirclementText(e, domain);
  parts.encircle.dataset.winding = String(e.winding);
  parts.encircle.dataset.p = String(e.open_loop_rhp_poles);
  parts.encircle.dataset.z = String(e.closed_loop_rhp_poles);
  parts.caution.textContent = e.caution || '';
  const aboutText = fmtComplex(e.about, 6);
  parts.encircleHead.textContent = `Encirclement of ${aboutText}`;
  parts.about.textContent = `about ${aboutText}`;
  parts.about.dataset.point = JSON.stringify(e.about);
  parts.pointReset.hidden = e.about[0] === -1 && e.about[1] === 0;

  // the polar plot of the contour's image
  const mags = fr.magnitude_db.filter((v) => v !== null && Number.isFinite(v)).map((v) => Math.pow(10, v / 20)).sort((a, b) => a - b);
  const fit = mags.length ? { cap: mags[Math.floor(0.75 * (mags.length - 1))], wLo: fr.omega[0], wHi: fr.omega[fr.omega.length - 1] } : null;
  section.polar = { samples: polarSamples(resp), about: e.about, unit: fr.unit, domain, fit, fromImage: Boolean(resp.image && resp.image.segments) };
  const image = domain === 'z' ? 'F(e^(jωT))' : 'F(jω)';
  parts.polar.setAttribute('aria-label', `Polar plot of ${image} with the point ${aboutText} marked; ${parts.encircle.textContent}`);
  section.polarMap = null;
  later(() => drawPolar(parts));
  parts.polarReadout.textContent = 'Point at the plot, or focus it and use the arrow keys, for the values along the contour.';
  const ps = section.polar.samples;
  setDataTable(parts.polarData, 'Polar plot samples in contour order', {
    heads: [freqHead(fr.unit), 'piece', 'Re F', 'Im F'],
    count: ps.length,
    row: (i) => [ps[i].w === null ? '—' : cell(ps[i].w), pieceName[ps[i].kind] || ps[i].kind, cell(ps[i].re), cell(ps[i].im)],
    values: (i) => [ps[i].w, ps[i].kind, ps[i].re, ps[i].im],
  });

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

  // the step and impulse responses
  const st = resp.step;
  const isZ = domain === 'z';
  showTime(parts, 'step', timeData(st, isZ, T, st));
  showTime(parts, 'impulse', timeData(resp.impulse, isZ, T, null));
  parts.step.textContent = '';
  if (section.time.step) {
    const tu = isZ ? ` s (T = ${num(T)} s)` : ' s';
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

/** After a search: show the section when f is rational in s or z, opened for a new function
 *  unless set() asked otherwise. */
export async function prepareTransfer(page, base) {
  const tf = page.ui.tf;
  const domain = transferDomain(base.var);
  let shown = Boolean(domain);
  if (shown) {
    const known = await rationalAnalysis(base);
    shown = Boolean(known && known.rational);
  }
  tf.box.hidden = !shown;
  // A function that reads as a transfer function opens the section when it is new (typed, an
  // example, a link, set()); folding it keeps it folded while the function stays the same.
  const fresh = JSON.stringify([base.f, base.var, base.params, domain]);
  section.autoOpened = false;
  if (typeof section.forceOpen === 'boolean') tf.box.open = section.forceOpen;
  else if (shown && fresh !== section.openedFor) { tf.box.open = true; section.autoOpened = true; }
  section.forceOpen = null;
  if (shown) section.openedFor = fresh;
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
  // opened by itself for a function the reading does not apply to (an improper F(z)): folded
  // again, its reason kept inside
  const err = responseError(resp);
  if (section.autoOpened && err && err.code === 'not_applicable') tf.box.open = false;
  section.autoOpened = false;
  section.key = JSON.stringify(request);
  if (page.results) { page.results.transfer_function = resp; page.results.transferRequest = request; }
}

/** Stop pressed: a reading in progress is dropped. */
export function stopTransfer(page) {
  if (page.ui.tf.box.dataset.state !== 'busy') return;
  section.serial++;
  status(page.ui.tf, 'Stopped before the frequency response finished.', 'stale');
}

/** Redraw the charts (after a resize), keeping their cursors. */
export function redrawTransfer(page) {
  const tf = page.ui.tf;
  if (tf.result.hidden || !tf.box.open) return;
  const at = (k) => (section.cursors ? section.cursors[k].index : -1);
  section.chart = drawBodeChart(tf.chart, at('bode'));
  if (section.polar) drawPolar(tf, at('polar'));
  if (!tf.stepFigure.hidden) drawTime(tf, 'step', at('step'));
  if (!tf.impulseFigure.hidden) drawTime(tf, 'impulse', at('impulse'));
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

/** A picked point rounded to three significant digits of its larger part. */
function roundPoint([re, im]) {
  const big = Math.max(Math.abs(re), Math.abs(im));
  if (!(big > 0)) return [0, 0];
  const q = Math.pow(10, Math.floor(Math.log10(big)) - 2);
  const r = (v) => Number((Math.round(v / q) * q).toPrecision(12)) + 0;
  return [r(re), r(im)];
}

/** Opening the section, the unit and the sampling period, the charts' cursors, the polar view
 *  and the point picked on the polar plot. */
export function attachTransferSection(page) {
  const tf = page.ui.tf;
  Object.assign(tf, {
    bodeData: $('tf-bode-data'), encircleHead: $('tf-encircle-head'), polarView: $('tf-polar-view'), about: $('tf-about'),
    pointReset: $('tf-point-reset'), polar: $('tf-polar'), polarReadout: $('tf-polar-readout'), polarData: $('tf-polar-data'),
    stepReadout: $('tf-step-readout'), stepData: $('tf-step-data'), impulseFigure: $('tf-impulse-figure'),
    impulseChart: $('tf-impulse-chart'), impulseReadout: $('tf-impulse-readout'), impulseData: $('tf-impulse-data'),
  });
  tf.box.addEventListener('toggle', () => { if (tf.box.open) onDemand(page); });
  tf.unit.addEventListener('change', () => onDemand(page));
  tf.period.addEventListener('change', () => onDemand(page));
  const bodeData = () => (tf.chart.dataset.points ? section.bode : null);
  const timeCursor = (which, canvas, readout) => attachCursor(canvas, readout, {
    count: () => (section.time[which] && !canvas.closest('[hidden]') ? section.time[which].t.length : 0),
    pick: (x) => {
      const m = which === 'step' ? section.stepMap : section.impulseMap, d = section.time[which];
      if (!m || !d || x < m.left || x > m.right) return -1;
      const want = m.toX(x);
      let best = 0;
      d.x.forEach((v, i) => { if (Math.abs(v - want) < Math.abs(d.x[best] - want)) best = i; });
      return best;
    },
    draw: (i) => drawTime(tf, which, i),
    read: (i) => timeRead(which, i),
  });
  section.cursors = {
    bode: attachCursor(tf.chart, tf.readout, {
      count: () => { const d = bodeData(); return d && section.chart ? d.omega.length : 0; },
      pick: (x) => (x < section.chart.left || x > section.chart.right ? -1 : nearestIndex(bodeData().omega, section.chart.toFrequency(x))),
      draw: (i) => { section.chart = drawBodeChart(tf.chart, i); },
      read: (i) => {
        const d = bodeData();
        return `${freqSym(d.unit)} = ${num(d.omega[i])} ${d.unit}: |F| = ${d.db[i] === null ? '— (a pole)' : num(d.db[i], 5) + ' dB'}, phase = ${d.deg[i] === null ? '—' : num(d.deg[i], 5) + '°'}`;
      },
    }),
    polar: attachCursor(tf.polar, tf.polarReadout, {
      count: () => (section.polar ? section.polar.samples.length : 0),
      pick: (x, y) => (section.polarMap ? section.polarMap.nearest(x, y) : -1),
      draw: (i) => drawPolar(tf, i),
      read: polarRead,
    }),
    step: timeCursor('step', tf.stepChart, tf.stepReadout),
    impulse: timeCursor('impulse', tf.impulseChart, tf.impulseReadout),
  };
  tf.polarView.addEventListener('change', () => { if (section.polar) drawPolar(tf, section.cursors.polar.index); });
  // a click on the polar plot counts about the point clicked
  tf.polar.addEventListener('click', (ev) => {
    if (!section.polarMap) return;
    const r = tf.polar.getBoundingClientRect();
    const v = section.polarMap.toValue(ev.clientX - r.left, ev.clientY - r.top);
    if (!v) return;
    setTransferPoint(roundPoint(v));
    tf.box.dispatchEvent(new CustomEvent('transfer-point', { detail: currentTransferPoint() }));
    onDemand(page);
  });
  tf.pointReset.addEventListener('click', () => {
    setTransferPoint(null);
    tf.box.dispatchEvent(new CustomEvent('transfer-point', { detail: currentTransferPoint() }));
    onDemand(page);
  });
}

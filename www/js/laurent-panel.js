// The Laurent section: a series about a chosen centre (a singularity found, a typed point, or
// infinity) in one of the annuli the singularities define, n = from … to; the coefficients with
// their error estimates and the principal part typeset (MathML, with a plain-text line beside it).
// Also the kind of the point at infinity (the core's residue at "infinity"), shown here and marked
// at w = 0 in the plot's view at infinity (plot/overlays.js drawInfinityMarker).
import { mathEl, mathMagnitude, mathCoefficient } from './mathml.js';
import { latexButton } from './latex.js';
import { $, el } from './dom.js';
import { cAbs, cSub, isFinitePair } from './complex.js';
import { fmtReal, fmtSig, fmtComplex, fmtExact, trimBelow, trimComplex } from './format.js';
import { runHeavy, responseError } from './engine.js';
import { KIND_WORDS } from './markers.js';

const LP_SINGULAR = ['pole', 'essential', 'branch'];

/** The kind of infinity in words, and a short key for the plot and the DOM, from a residue
 *  response at "infinity": {key, words, label}. */
export function infinityKind(resp) {
  if (!resp || responseError(resp)) return null;
  if (resp.accumulation) return { key: 'non_isolated', words: 'a non-isolated singularity: poles of f accumulate there, so f has no Laurent series about ∞', label: 'non-isolated' };
  if (resp.kind === 'pole') return { key: 'pole', words: `a pole of order ${resp.order}`, label: `pole, order ${resp.order}` };
  if (resp.kind === 'essential') return { key: 'essential', words: 'an isolated essential singularity', label: 'essential' };
  if (resp.kind === 'branch_point') return { key: 'branch_point', words: 'a branch point (f is not single-valued around ∞)', label: 'branch point' };
  if (resp.kind === 'removable') return { key: 'removable', words: 'a removable singularity', label: 'removable' };
  return { key: 'regular', words: 'a regular point (f is analytic at ∞)', label: 'regular' };
}

/** Distinct radii |a − c| > 0 of the points `pts` (sorted), each with the points on that circle. */
export function circlesAbout(c, pts) {
  const out = [];
  const scale = Math.max(1, cAbs(c));
  for (const a of pts) {
    const r = cAbs(cSub(a, c));
    if (!(r > 1e-12 * scale)) continue;
    const same = out.find((o) => Math.abs(o.r - r) <= 1e-9 * Math.max(r, scale * 1e-3));
    if (same) same.points.push(a); else out.push({ r, points: [a] });
  }
  return out.sort((p, q) => p.r - q.r);
}

/** How far the searched contour reaches from c in every direction (0 when c is outside it). */
function reachInside(c, contour) {
  if (!contour) return 0;
  if (contour.shape === 'circle') return Math.max(0, contour.radius - cAbs(cSub(c, contour.center)));
  if (contour.shape === 'rectangle') {
    const [[a, b], [p, q]] = contour.corners;
    const d = Math.min(c[0] - Math.min(a, p), Math.max(a, p) - c[0], c[1] - Math.min(b, q), Math.max(b, q) - c[1]);
    return Math.max(0, d);
  }
  return 0;
}

/** The annuli about c (a point, or 'infinity') that the singular points `pts` define. `complete`:
 *  every finite singular point is known (a rational f); otherwise only those in `contour` are.
 *  Each annulus: {inner, outer, innerPoints, outerPoints, request: {center, inner, outer}, certain,
 *  w: [1/outer, 1/inner] around infinity}. */
export function annuliAbout(c, pts, complete, contour) {
  if (c === 'infinity') {
    const circles = circlesAbout([0, 0], pts);
    const atZero = pts.some((a) => cAbs(a) <= 1e-12);
    const list = [];
    // |z| > r_max first (the neighbourhood of infinity, 0 < |w| < 1/r_max), then inwards.
    for (let k = circles.length; k >= 0; k--) {
      const inner = k > 0 ? circles[k - 1].r : 0;
      const outer = k < circles.length ? circles[k].r : Infinity;
      const around = k === circles.length;
      list.push({
        inner, outer,
        innerPoints: k > 0 ? circles[k - 1].points : atZero ? [[0, 0]] : [],
        outerPoints: k < circles.length ? circles[k].points : [],
        request: around ? { center: 'infinity', inner, outer: null } : { center: [0, 0], inner, outer },
        certain: complete,
        w: [around ? 0 : 1 / outer, inner > 0 ? 1 / inner : Infinity],
      });
    }
    return list;
  }
  const circles = circlesAbout(c, pts);
  const reach = complete ? Infinity : reachInside(c, contour);
  const list = [];
  for (let k = 0; k <= circles.length; k++) {
    const inner = k > 0 ? circles[k - 1].r : 0;
    const outer = k < circles.length ? circles[k].r : Infinity;
    const certain = complete || outer <= reach * (1 + 1e-12);
    // an uncertain last annulus is computed out to what the search saw (the core searches that disc again)
    const sent = Number.isFinite(outer) ? outer : complete ? null : reach > inner * 1.01 ? reach : Math.max(2 * inner, 1);
    list.push({
      inner, outer, innerPoints: k > 0 ? circles[k - 1].points : [], outerPoints: k < circles.length ? circles[k].points : [],
      request: { center: c.slice(), inner, outer: sent }, certain, reach,
    });
  }
  return list;
}

/** The annulus in words: `0 < |z − c| < r (bounded by the pole at …)`. */
function annulusWords(v, c, a) {
  const r = (x) => (Number.isFinite(x) ? fmtReal(x, 6) : '∞');
  if (c === 'infinity') {
    const w = `${a.w[0] === 0 ? '0' : r(a.w[0])} < |w| < ${r(a.w[1])}`;
    return `${w}, w = 1/${v} (${r(a.inner)} < |${v}| < ${r(a.outer)})`;
  }
  c = trimComplex(c, 10);
  const t = fmtSig(c, 8);
  const d = c[0] === 0 && c[1] === 0 ? `|${v}|` : c[1] === 0 && c[0] > 0 ? `|${v} − ${t}|` : c[1] === 0 ? `|${v} + ${t.slice(1)}|` : `|${v} − (${t})|`;
  return `${r(a.inner)} < ${d} < ${r(a.outer)}`;
}

function pointsWords(v, pts, kindOf) {
  return pts.map((p) => `${kindOf(p)} at ${v} = ${fmtSig(p, 8)}`).join(', ');
}

// ---- typesetting ---------------------------------------------------------------------------

/** The base (v − c) as MathML and as text. */
function seriesBase(v, c) {
  if (c[0] === 0 && c[1] === 0) return { node: mathEl('mi', v), text: v, bare: true };
  const t = `${v} − (${fmtComplex(c, 10)})`;
  const row = mathEl('mrow', mathEl('mi', v));
  if (c[1] === 0) { row.append(mathEl('mo', c[0] > 0 ? '−' : '+'), mathMagnitude(c[0])); return { node: row, text: `${v} ${c[0] > 0 ? '−' : '+'} ${fmtReal(Math.abs(c[0]), 10)}`, bare: false }; }
  row.append(mathEl('mo', '−'), mathCoefficient(c).node);
  return { node: row, text: t, bare: false };
}

/** Σ c_n (v − c)^n over `terms` ({n, c}, already trimmed, non-zero) as MathML and plain text;
 *  negative n as fractions. `more`: "+ ⋯" at the end. */
export function seriesMath(v, c, terms, more) {
  const math = mathEl('math');
  math.setAttribute('display', 'block');
  const row = mathEl('mrow');
  const b = seriesBase(v, c);
  const texts = [];
  if (terms.length === 0) { row.append(mathEl('mn', '0')); texts.push('0'); }
  terms.forEach((t, i) => {
    const { node, negative, one } = mathCoefficient(t.c);
    if (i > 0) row.append(mathEl('mo', negative ? '−' : '+'));
    else if (negative) row.append(mathEl('mo', '−'));
    const k = Math.abs(t.n);
    const bb = b.bare ? b.node.cloneNode(true) : mathEl('mrow', mathEl('mo', '('), b.node.cloneNode(true), mathEl('mo', ')'));
    const power = k === 1 ? (t.n < 0 ? b.node.cloneNode(true) : bb) : mathEl('msup', bb, mathEl('mn', String(k)));
    if (t.n < 0) row.append(mathEl('mfrac', one ? mathEl('mn', '1') : node, power));
    else if (t.n === 0) row.append(one ? mathEl('mn', '1') : node);
    else { if (!one) row.append(node, mathEl('mo', '\u2062')); row.append(power); }
    const mag = negative ? [-t.c[0], -t.c[1]] : t.c;
    const ct = t.c[1] === 0 ? fmtReal(Math.abs(t.c[0]), 10) : `(${fmtComplex(mag, 10)})`;
    const bt = b.bare ? v : `(${b.text})`;
    const pw = `${bt}${t.n === 1 ? '' : '^' + String(t.n).replace('-', '−')}`;
    const pt = t.n === 0 ? ct : one && t.n > 0 ? pw : `${ct}·${pw}`;
    texts.push((i > 0 ? (negative ? ' − ' : ' + ') : negative ? '−' : '') + pt);
  });
  if (more && terms.length) { row.append(mathEl('mo', '+'), mathEl('mo', '⋯')); texts.push(' + …'); }
  math.append(row);
  return { math, text: texts.join('') };
}

// ---- the panel --------------------------------------------------------------------------------

/** Attach the section (#lp-box). Hooks: persist() (keep the page state). Returns
 *  {afterSearch(serial), stale(), results(), stateValue(), open()}. */
export function attachLaurentPanel(page, hooks) {
  const { state } = page;
  const ui = {
    box: $('lp-box'), center: $('lp-center'), pointRow: $('lp-point'), x: $('lp-x'), y: $('lp-y'), annulus: $('lp-annulus'),
    from: $('lp-from'), to: $('lp-to'), infinity: $('lp-infinity'), note: $('lp-annulus-note'), status: $('lp-status'),
    warnings: $('lp-warnings'), result: $('lp-result'), method: $('lp-method'), math: $('lp-math'), text: $('lp-text'),
    body: $('lp-body'),
  };
  const my = { serial: -1, infinity: null, infinityResp: null, annuli: [], response: null, request: null, index: -1, choice: null, busy: null };

  const v = () => state.var.trim() || 'z';
  const found = () => (page.found && Array.isArray(page.found.items) ? page.found.items : []);
  const rationalPoles = () => {
    const pf = page.results && page.results.partial_fractions;
    if (!pf || responseError(pf) || !Array.isArray(pf.terms)) return null;
    const pts = [];
    for (const t of pf.terms) if (isFinitePair(t.at) && !pts.some((p) => cAbs(cSub(p, t.at)) <= 1e-12 * Math.max(1, cAbs(t.at)))) pts.push(t.at);
    return pts;
  };
  const kindOf = (p) => {
    const it = found().find((i) => LP_SINGULAR.includes(i.kind) && cAbs(cSub(i.at, p)) <= 1e-9 * Math.max(1, cAbs(p)));
    return it ? KIND_WORDS[it.kind] : 'pole';
  };

  function setStatus(text, st) { ui.status.textContent = text; ui.box.dataset.state = st; }

  /** The centre options: each singular point found, a typed point, infinity. */
  function fillCentres() {
    const keep = ui.center.value;
    ui.center.textContent = '';
    found().forEach((it, i) => {
      if (!LP_SINGULAR.includes(it.kind) || it.kind === 'branch') return;
      ui.center.append(el('option', { value: 'item:' + i, text: `${KIND_WORDS[it.kind]} at ${fmtSig(it.at, 8, it.floor)}` }));
    });
    ui.center.append(el('option', { value: 'point', text: 'a point typed here' }), el('option', { value: 'infinity', text: 'infinity (w = 1/' + v() + ' around 0)' }));
    if ([...ui.center.options].some((o) => o.value === keep)) ui.center.value = keep;
  }

  /** The centre chosen: [x, y] or 'infinity'. */
  function centre() {
    const c = ui.center.value;
    if (c === 'infinity') return 'infinity';
    if (c.startsWith('item:')) { const it = found()[Number(c.slice(5))]; if (it) return it.at.slice(); }
    const x = Number(ui.x.value), y = Number(ui.y.value);
    return [Number.isFinite(x) ? x : 0, Number.isFinite(y) ? y : 0];
  }

  /** Put the state's choice (state.laurent) into the controls, the annulus by its radii. */
  function applyChoice(choice) {
    const typed = ui.center.value === 'point';
    fillCentres();
    if (choice) {
      if (choice.center === 'infinity') ui.center.value = 'infinity';
      else {
        const c = choice.center;
        const i = found().findIndex((it) => LP_SINGULAR.includes(it.kind) && it.kind !== 'branch' && cAbs(cSub(it.at, c)) <= 1e-9 * Math.max(1, cAbs(c)));
        if (i >= 0) ui.center.value = 'item:' + i;
        else if (my.explicit || typed) { ui.center.value = 'point'; ui.x.value = String(c[0]); ui.y.value = String(c[1]); }
        else { ui.center.value = ui.center.options[0].value; choice = null; } // a point of an earlier f: start afresh
      }
      if (choice) { ui.from.value = String(choice.from); ui.to.value = String(choice.to); }
    } else if (!ui.center.value || my.explicit) ui.center.value = ui.center.options[0].value;
    ui.pointRow.hidden = ui.center.value !== 'point';
    fillAnnuli(choice);
  }

  function fillAnnuli(choice) {
    const c = centre();
    const poles = rationalPoles();
    const pts = poles || found().filter((it) => LP_SINGULAR.includes(it.kind)).map((it) => it.at);
    const contour = page.results && page.results.contour;
    my.annuli = annuliAbout(c, pts, Boolean(poles), contour);
    const keep = choice ? -1 : Number(ui.annulus.value);
    ui.annulus.textContent = '';
    my.annuli.forEach((a, i) => ui.annulus.append(el('option', { value: String(i), text: annulusWords(v(), c, a) + (a.certain ? '' : ' (outer limit unknown)') })));
    let pick = keep >= 0 && keep < my.annuli.length ? keep : 0;
    if (choice) {
      const same = (p, q) => (p === null || p === undefined || !Number.isFinite(p) ? !(Number.isFinite(q)) || q === null : Math.abs(p - q) <= 1e-9 * Math.max(1, Math.abs(p)));
      const i = my.annuli.findIndex((a) => same(a.inner, choice.inner) && (c === 'infinity' && a.request.center === 'infinity' ? true : same(a.outer, choice.outer) || same(a.request.outer, choice.outer)));
      if (i >= 0) pick = i;
      else if (!my.explicit) pick = 0;
      else {
        // an annulus of its own (set through window.residuary): kept as asked
        my.annuli.push({ inner: choice.inner, outer: choice.outer ?? Infinity, innerPoints: [], outerPoints: [], certain: false, custom: true,
          request: { center: c === 'infinity' ? 'infinity' : c, inner: choice.inner, outer: c === 'infinity' ? null : choice.outer ?? null }, w: [0, choice.inner > 0 ? 1 / choice.inner : Infinity] });
        pick = my.annuli.length - 1;
        ui.annulus.append(el('option', { value: String(pick), text: `${fmtReal(choice.inner, 6)} < |${v()} − c| < ${choice.outer == null ? '∞' : fmtReal(choice.outer, 6)} (as set; not one of the annuli listed)` }));
      }
    }
    ui.annulus.value = String(pick);
  }

  /** The request for the chosen centre, annulus and terms, or an error object. */
  function request() {
    const a = my.annuli[Number(ui.annulus.value)];
    const from = Math.round(Number(ui.from.value)), to = Math.round(Number(ui.to.value));
    if (!a) return { error: { code: 'invalid_field', message: 'no annulus to expand in' } };
    if (!Number.isFinite(from) || !Number.isFinite(to) || from > to) return { error: { code: 'invalid_field', message: '"from" must be a whole number no larger than "to"' } };
    if (to - from > 400) return { error: { code: 'invalid_field', message: 'at most 401 terms at a time here' } };
    const r = a.request;
    const req = Object.assign({}, page.found.base, { task: 'laurent', center: r.center, inner: r.inner, from, to });
    if (r.outer !== null && r.outer !== undefined && Number.isFinite(r.outer)) req.outer = r.outer;
    else if (r.center !== 'infinity') req.outer = null;
    return req;
  }

  function describeAnnulus(c, a) {
    const parts = [`Annulus ${annulusWords(v(), c, a)}.`];
    const d = c === 'infinity' || (c[0] === 0 && c[1] === 0) ? `|${v()}|` : `|${v()} − c|`;
    const edge = (r, pts) => `On ${d} = ${fmtReal(r, 6)}: ${pointsWords(v(), pts, kindOf)}.`;
    if (a.innerPoints.length) parts.push(edge(a.inner, a.innerPoints));
    if (a.outerPoints.length) parts.push(edge(a.outer, a.outerPoints));
    if (!a.certain && !a.custom) {
      parts.push(c === 'infinity'
        ? 'Outer limit unknown: the search covered only the region, so a singular point outside it could bound this annulus sooner.'
        : `Outer limit unknown: the search covered only the region (it reaches ${fmtReal(a.reach, 6)} from the centre), so a singular point outside it could lie closer` +
          (Number.isFinite(a.outer) ? '.' : `; computed out to ${fmtReal(a.request.outer, 6)}.`));
    }
    return parts.join(' ');
  }

  /** The annulus drawn on the plot (plot/overlays.js drawAnnulus) while the section is open. */
  function showAnnulus(req) {
    const outer = req && req.center !== 'infinity' && Number.isFinite(req.outer) ? req.outer : Infinity;
    page.plot.annulus = req && ui.box.open ? { center: req.center === 'infinity' ? [0, 0] : req.center, inner: req.inner, outer } : null;
    page.plot.draw();
  }

  function clearResult() {
    ui.result.hidden = true;
    ui.method.textContent = '';
    ui.method.dataset.exact = 'false';
    ui.body.textContent = '';
    ui.math.textContent = '';
    ui.text.textContent = '';
    ui.warnings.textContent = '';
  }

  /** Compute and show the series for the controls' choice (the search must have answered). */
  async function run() {
    if (!page.found || !page.found.base || my.serial !== page.searchSerial) return;
    const serial = my.serial;
    const c = centre();
    const a = my.annuli[Number(ui.annulus.value)];
    const req = request();
    my.request = req; my.response = null; my.index = Number(ui.annulus.value);
    clearResult();
    ui.note.textContent = a ? describeAnnulus(c, a) : '';
    state.laurent = req.error ? state.laurent : { center: req.center, inner: req.inner, outer: req.outer === undefined ? null : req.outer, from: req.from, to: req.to };
    hooks.persist();
    showAnnulus(req.error ? null : req);
    if (req.error) { my.response = req; setStatus('Not computed: ' + req.error.message + '.', 'error'); return; }
    const inf = infinityKind(my.infinityResp);
    let resp;
    if (c === 'infinity' && req.center === 'infinity' && inf && inf.key === 'non_isolated') {
      resp = { error: { code: 'not_applicable', message: 'infinity is not an isolated singularity of f (its poles accumulate there), so f has no Laurent series about it', span: null } };
    } else {
      setStatus('Computing the Laurent coefficients…', 'busy');
      resp = await runHeavy(req);
      if (serial !== page.searchSerial || my.request !== req) return;
    }
    my.response = resp;
    show(c, a, req, resp);
  }

  function show(c, a, req, resp) {
    const err = responseError(resp);
    if (err) { setStatus((err.code === 'cancelled' ? 'Stopped' : 'Not available') + ': ' + err.message + '.', 'error'); return; }
    const coeffs = Array.isArray(resp.coefficients) ? resp.coefficients : [];
    const est = Number.isFinite(resp.error_estimate) ? resp.error_estimate : 0;
    const biggest = Math.max(0, ...coeffs.filter((t) => isFinitePair(t.c)).map((t) => cAbs(t.c)));
    const level = Math.max(10 * est, 1e-13 * biggest);
    setStatus(`${coeffs.length} coefficients, n = ${String(req.from).replace('-', '−')} … ${req.to}: numerical (trapezoidal rule on circles), error ≤ ${fmtReal(est, 2)}.`, 'done');
    ui.result.hidden = false;
    // The principal part: negative powers (about a point), positive powers about infinity.
    const atInf = req.center === 'infinity';
    const w = v();
    const inPart = (n) => (atInf ? n > 0 : n < 0);
    const sorted = coeffs.filter((t) => inPart(t.n) && isFinitePair(t.c)).map((t) => ({ n: t.n, c: trimBelow(t.c, level) }))
      .filter((t) => t.c[0] !== 0 || t.c[1] !== 0).sort((p, q) => (atInf ? p.n - q.n : q.n - p.n));
    const poles = rationalPoles();
    const item = found().find((it) => it.kind === 'pole' && Array.isArray(c) && cAbs(cSub(it.at, c)) <= 1e-9 * Math.max(1, cAbs(c)));
    // More terms follow beyond those asked for: about infinity past n = to (unless a pole's order
    // says the part is complete); about a point past n = from, except at a pole of known order m
    // in its punctured disc asked from n ≤ −m.
    const inf = infinityKind(my.infinityResp);
    const more = atInf
      ? !(inf && inf.key === 'pole' && req.to >= my.infinityResp.order) && !(inf && inf.key === 'regular') && req.to >= 1
      : !(item && a.inner === 0 && item.order > 0 && req.from <= -item.order) && req.from < 0;
    const exactPart = poles && item && a.inner === 0 && page.results.singularities && page.results.singularities.method === 'rational' &&
      Array.isArray(item.principal) && item.principal.length > 0;
    let terms = sorted, label;
    if (exactPart) {
      const ppLevel = Math.max(10 * (Number.isFinite(item.error) ? item.error : 0), 1e-15 * Math.max(...item.principal.map(cAbs)));
      terms = item.principal.map((cc, k) => ({ n: -(k + 1), c: trimBelow(cc, ppLevel) })).filter((t) => t.c[0] !== 0 || t.c[1] !== 0);
      label = `Principal part, exact up to rounding (f is rational: from its partial fractions; residue error ≤ ${fmtReal(item.error, 2)}):`;
    } else {
      label = (atInf ? 'Principal part at ∞ (the growing powers; ' : 'Principal part (the negative powers; ') +
        `numerical, error ≤ ${fmtReal(est, 2)}` + (more ? '; the terms shown, more follow' : '') + '):';
    }
    ui.method.textContent = label;
    ui.method.dataset.exact = exactPart ? 'true' : 'false';
    const scale = Array.isArray(c) ? Math.max(1, cAbs(c)) : 1;
    const { math, text } = seriesMath(w, atInf ? [0, 0] : trimComplex(c, 12, 1e-12 * scale), terms, more && !exactPart);
    ui.math.append(math, latexButton(math, 'the principal part'));
    ui.text.textContent = (atInf ? 'Growing part: ' : 'Principal part: ') + text;
    for (const t of coeffs) {
      const shown = isFinitePair(t.c) ? trimBelow(t.c, level) : t.c;
      const tiny = isFinitePair(shown) && shown[0] === 0 && shown[1] === 0;
      ui.body.append(el('tr', { 'data-n': t.n, 'data-c': JSON.stringify(t.c), 'data-error': String(t.error ?? est) },
        el('td', { class: 'num', text: String(t.n).replace('-', '−') }),
        tiny ? el('td', { class: 'num dim', text: '≈ 0', title: `|c| = ${fmtReal(cAbs(t.c), 2)}, below the error level` })
          : el('td', { class: 'num', title: 'Full precision: ' + fmtExact(t.c), text: fmtComplex(shown, 10) }),
        el('td', { class: 'num', text: fmtReal(Number.isFinite(t.error) ? t.error : est, 2) })));
    }
    for (const x of Array.isArray(resp.warnings) ? resp.warnings : []) ui.warnings.append(el('li', { text: String(x) }));
  }

  /** The kind of infinity, after each search: shown here and marked in the view at infinity. */
  async function classifyInfinity(serial) {
    const resp = await runHeavy(Object.assign({}, page.found.base, { task: 'residue', at: 'infinity' }));
    if (serial !== page.searchSerial) return false;
    my.infinityResp = resp;
    const k = infinityKind(resp);
    ui.infinity.textContent = k ? `The point at infinity is ${k.words}.` : 'The point at infinity could not be classified: ' + (responseError(resp) || {}).message + '.';
    ui.infinity.dataset.kind = k ? k.key : 'unknown';
    page.plot.infinityPoint = k ? { kind: k.key, label: `${v()} = ∞: ${k.label}` } : null;
    page.plot.draw();
    return true;
  }

  async function afterSearch(serial) {
    my.serial = serial;
    if (!(await classifyInfinity(serial))) return;
    applyChoice(state.laurent);
    my.explicit = false;
    if (ui.box.open) await run();
  }

  function stale() {
    my.serial = -1;
    if (page.plot && (page.plot.infinityPoint || page.plot.annulus)) { page.plot.infinityPoint = null; page.plot.annulus = null; page.plot.draw(); }
    if (ui.box.dataset.state !== 'none') setStatus('The function changed: the series is computed again with the next search.', 'stale');
    ui.infinity.textContent = '';
    clearResult();
    ui.note.textContent = '';
  }

  const rerun = () => { if (my.serial === page.searchSerial) run(); };
  ui.center.addEventListener('change', () => { ui.pointRow.hidden = ui.center.value !== 'point'; fillAnnuli(null); ui.annulus.value = '0'; rerun(); });
  for (const input of [ui.x, ui.y]) input.addEventListener('change', () => { fillAnnuli(null); ui.annulus.value = '0'; rerun(); });
  for (const input of [ui.annulus, ui.from, ui.to]) input.addEventListener('change', rerun);
  ui.box.addEventListener('toggle', () => {
    if (!ui.box.open) { page.plot.annulus = null; page.plot.draw(); return; }
    if (my.serial === page.searchSerial) { if (!my.response) run(); else showAnnulus(my.request && !my.request.error ? my.request : null); }
  });

  return {
    afterSearch, stale,
    /** The next search takes state.laurent as given (window.residuary's set), even an annulus not listed. */
    setExplicit() { my.explicit = true; },
    /** Open or fold the section (window.residuary's panels.laurent). */
    setOpen(open) { ui.box.open = Boolean(open); },
    isOpen: () => ui.box.open,
    /** results().laurent: the contract response plus the panel's choice, while the section is open. */
    results(staleFlag) {
      if (!ui.box.open || !my.response || !my.request || my.request.error) return undefined;
      const r = my.request;
      return Object.assign(JSON.parse(JSON.stringify(my.response)), {
        stale: staleFlag || my.serial !== page.searchSerial,
        annulus: my.index, center: r.center, inner: r.inner, outer: r.outer === undefined ? null : r.outer, from: r.from, to: r.to,
        certain: Boolean(my.annuli[my.index] && my.annuli[my.index].certain),
        exact_principal_part: ui.method.dataset.exact === 'true',
        infinity: my.infinityResp ? JSON.parse(JSON.stringify(my.infinityResp)) : null,
      });
    },
  };
}

// Parameter rows: name, value (a real number, or complex text such as 0.3+0.1i)
// and a slider over the real part.
import { el } from './dom.js';
import { fmtReal } from './format.js';

/** Parse a parameter value typed by a person: "2", "-0.5", "1e-3", "0.3+0.1i", "2i", "-i", "3-4j".
 *  Returns [re, im] or null when the text is not a number. */
export function parseComplex(text) {
  const s = String(text).replace(/\s+/g, '').replace(/j/g, 'i').replace(/[−–]/g, '-');
  if (s === '') return null;
  const num = '(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?';
  const real = new RegExp('^([+-]?' + num + ')$');
  const imag = new RegExp('^([+-]?(?:' + num + ')?)\\*?i$');
  const both = new RegExp('^([+-]?' + num + ')([+-](?:' + num + ')?)\\*?i$');
  const coef = (t) => (t === '' || t === '+' ? 1 : t === '-' ? -1 : Number(t));
  let m;
  if ((m = s.match(real))) return [Number(m[1]), 0];
  if ((m = s.match(imag))) return [0, coef(m[1])];
  if ((m = s.match(both))) return [Number(m[1]), coef(m[2])];
  return null;
}

/** A slider range that holds `v` comfortably. */
export function rangeFor(v) {
  if (v === 0) return [-1, 1];
  const m = Math.pow(10, Math.ceil(Math.log10(Math.abs(v) * 2)));
  return v > 0 ? [0, m] : [-m, 0];
}

/** The params object for a request: {name: number | [re, im]}; bad rows are reported. */
export function paramsForRequest(rows) {
  const params = {};
  const problems = [];
  for (const p of rows) {
    const name = p.name.trim();
    if (!name) continue;
    if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name)) { problems.push(`“${name}” is not a usable name: use letters, digits and _ (starting with a letter)`); continue; }
    const v = parseComplex(p.value);
    if (!v || !Number.isFinite(v[0]) || !Number.isFinite(v[1])) { problems.push(`the value of ${name} is not a number: write e.g. 2, -0.5, 1e-3 or 0.3+0.1i`); continue; }
    params[name] = v[1] === 0 ? v[0] : v;
  }
  return { params, problems };
}

/** The function as the core is asked for it: {f, var, params} (rows that do not parse are left out). */
export function functionInput(state) {
  const { params } = paramsForRequest(state.params);
  return { f: state.f, var: state.var.trim() || 'z', params };
}

/** Draw the rows into `container`; `onChange(how)` fires on every edit (`how` for the slider:
 *  {live: true} while it moves, {released: true} when it is let go; undefined otherwise). */
export function renderParams(container, rows, onChange) {
  container.textContent = '';
  if (rows.length === 0) {
    container.append(el('p', { class: 'hint', text: 'No parameters. Add one to use a name such as wn or zeta in the function.' }));
  }
  rows.forEach((p, index) => {
    const v = parseComplex(p.value);
    if (p.lo === null || p.hi === null || (v && (v[0] < p.lo || v[0] > p.hi))) [p.lo, p.hi] = rangeFor(v ? v[0] : 0);
    const name = el('input', { type: 'text', class: 'p-name', value: p.name, 'aria-label': `Name of parameter ${index + 1}`, spellcheck: 'false', autocomplete: 'off' });
    const value = el('input', { type: 'text', class: 'p-value', value: p.value, 'aria-label': `Value of parameter ${index + 1}`, spellcheck: 'false', autocomplete: 'off', inputmode: 'decimal' });
    const slider = el('input', { type: 'range', class: 'p-slider', min: p.lo, max: p.hi, step: (p.hi - p.lo) / 400, value: v ? v[0] : 0, 'aria-label': `Real part of parameter ${index + 1}` });
    const remove = el('button', { type: 'button', class: 'small p-remove', 'aria-label': `Remove parameter ${index + 1}`, title: 'Remove', text: '×' });
    const markValidity = () => value.classList.toggle('invalid', !parseComplex(value.value));
    markValidity();
    name.addEventListener('input', () => { p.name = name.value; onChange(); });
    value.addEventListener('input', () => {
      p.value = value.value;
      markValidity();
      const z = parseComplex(value.value);
      if (z) {
        if (z[0] < p.lo || z[0] > p.hi) {
          [p.lo, p.hi] = rangeFor(z[0]);
          slider.min = p.lo; slider.max = p.hi; slider.step = (p.hi - p.lo) / 400;
        }
        slider.value = z[0];
      }
      onChange();
    });
    slider.addEventListener('input', () => {
      const z = parseComplex(value.value) || [0, 0];
      const re = Number(fmtReal(Number(slider.value), 4).replace(/−/g, '-'));
      value.value = z[1] === 0 ? String(re) : `${re}${z[1] < 0 ? '-' : '+'}${Math.abs(z[1])}i`;
      p.value = value.value;
      markValidity();
      onChange({ live: true }); // while the slider moves: the live path (main.js)
    });
    slider.addEventListener('change', () => onChange({ released: true })); // let go: the full search
    remove.addEventListener('click', () => {
      rows.splice(index, 1);
      renderParams(container, rows, onChange);
      onChange();
    });
    container.append(el('div', { class: 'param-row' }, name, el('span', { class: 'eq', text: '=' }), value, slider, remove));
  });
}

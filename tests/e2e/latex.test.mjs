// Unit tests (node, no browser) of www/js/latex.js, the LaTeX writer of the page's MathML, on
// known trees built by www/js/mathml.js (partial fractions from terms, closed forms read from the
// core's text) over a minimal DOM of our own. run.mjs imports this file;
// alone: node --test tests/e2e/latex.test.mjs
import { test, describe } from 'node:test';
import assert from 'node:assert/strict';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** Just enough of a document for mathml.js: elements with children, attributes and text. */
function fakeNode(tag) {
  return {
    nodeType: 1, localName: tag, childNodes: [], attrs: {},
    append(...cs) { for (const c of cs) this.childNodes.push(typeof c === 'string' ? textNode(c) : c); },
    setAttribute(k, v) { this.attrs[k] = String(v); },
    getAttribute(k) { return this.attrs[k] ?? null; },
    get textContent() { return this.childNodes.map((c) => c.textContent).join(''); },
  };
}
function textNode(t) { return { nodeType: 3, textContent: t }; }
globalThis.document = globalThis.document || { createElementNS: (ns, tag) => fakeNode(tag), createTextNode: textNode };

const here = dirname(fileURLToPath(import.meta.url));
const js = resolve(here, '..', '..', 'www', 'js');
const { toLatex } = await import(pathToFileURL(join(js, 'latex.js')).href);
const { mathEl, partialFractionsMathML, closedFormMathML, parseClosedForm } = await import(pathToFileURL(join(js, 'mathml.js')).href);

const lhsT = () => mathEl('mrow', mathEl('mi', 'f'), mathEl('mo', '('), mathEl('mi', 't'), mathEl('mo', ')'));

describe('LaTeX written from the MathML tree (node)', () => {
  test('elements: fractions, powers, scripts, operators, Greek letters, upright names', () => {
    const t = mathEl('math', mathEl('mrow',
      mathEl('msubsup', mathEl('mo', '∫'), mathEl('mrow', mathEl('mo', '−'), mathEl('mi', '∞')), mathEl('mi', '∞')),
      mathEl('mfrac', mathEl('mn', '1'), mathEl('mrow', msq('x'), mathEl('mo', '+'), mathEl('mn', '1'))),
      mathEl('mi', 'd'), mathEl('mi', 'x'), mathEl('mo', '='), mathEl('mi', 'π')));
    function msq(v) { return mathEl('msup', mathEl('mi', v), mathEl('mn', '2')); }
    assert.equal(toLatex(t), '\\int_{-\\infty}^{\\infty}\\frac{1}{x^2 + 1}dx = \\pi');
    const r = mathEl('mrow', mathEl('mi', 'Res'), mathEl('mo', '['), mathEl('mi', 'f'), mathEl('mo', ','), mathEl('mi', 'a'), mathEl('mo', ']'), mathEl('mo', '\u2062'), mathEl('mi', 'sin'), mathEl('mo', '\u2061'), mathEl('mi', 'θ'));
    assert.equal(toLatex(r), '\\operatorname{Res}[f, a] \\sin \\theta');
    assert.equal(toLatex(mathEl('mrow', mathEl('mtext', 'for t > 0'))), '\\text{for t > 0}');
    assert.equal(toLatex(mathEl('mrow', mathEl('mn', '2.5'), mathEl('mo', '×'), mathEl('msup', mathEl('mn', '10'), mathEl('mn', '−7')))), '2.5\\times 10^{-7}');
  });

  test('partial fractions from the contract example: 1/(s + 2) − 1/(s + 1) + 2/(s + 1)²', () => {
    // docs/contract.md partial_fractions: (s + 3)/((s + 2)(s + 1)²), Heaviside cover-up by hand
    const m = partialFractionsMathML('s', { polynomial: [], terms: [{ at: [-2, 0], power: 1, c: [1, 0] }, { at: [-1, 0], power: 1, c: [-1, 0] }, { at: [-1, 0], power: 2, c: [2, 0] }] });
    assert.equal(toLatex(m), 'f(s) = \\frac{1}{s + 2} - \\frac{1}{s + 1} + \\frac{2}{(s + 1)^2}');
    // a polynomial part and complex poles ±i: z + 1/(2i)/(z − i) … written with i
    const c = partialFractionsMathML('z', { polynomial: [[0, 0], [1, 0]], terms: [{ at: [0, 1], power: 1, c: [0, -0.5] }, { at: [0, -1], power: 1, c: [0, 0.5] }, { at: [1, 2], power: 1, c: [3, -1] }] });
    assert.equal(toLatex(c), 'f(z) = z - \\frac{0.5 i}{z - i} + \\frac{0.5 i}{z + i} + \\frac{3 - i}{z - 1 - 2 i}');
  });

  test('closed forms read once from the core\'s text (its own test strings, src/transforms)', () => {
    const cases = [
      ['3.06186217848*exp(-0.6*t)*sin(2.93938769134*t)', 'f(t) = 3.06186217848 e^{-0.6 t} \\sin(2.93938769134 t)'],
      ['(-1 - t)*exp(-2*t) + exp(-t)', 'f(t) = (-1 - t) e^{-2 t} + e^{-t}'],
      ['H(t - 2)*(t - 2)*exp(-(t - 2))', 'f(t) = H(t - 2) (t - 2) e^{-(t - 2)}'],
      ['H(t - 1) + δ(t - 1)', 'f(t) = H(t - 1) + \\delta(t - 1)'],
      ['0.5*exp(-t) - 0.5*exp(-3*t) + 2*δ(t)', 'f(t) = 0.5 e^{-t} - 0.5 e^{-3 t} + 2 \\delta(t)'],
      ['1.5e-07*t', 'f(t) = 1.5\\times 10^{-07} t'],
    ];
    for (const [text, want] of cases) assert.equal(toLatex(closedFormMathML(lhsT(), text)), want, text);
    const lhsN = mathEl('mrow', mathEl('mi', 'x'), mathEl('mo', '['), mathEl('mi', 'n'), mathEl('mo', ']'));
    assert.equal(toLatex(closedFormMathML(lhsN, '0.848528137424^n*(cos(0.785398163397*n) + sin(0.785398163397*n))')),
      'x[n] = 0.848528137424^n (\\cos(0.785398163397 n) + \\sin(0.785398163397 n))');
    assert.equal(toLatex(closedFormMathML(mathEl('mrow'), '2*0.5^n - δ[n]')), '= 2\\cdot 0.5^n - \\delta[n]');
    assert.equal(closedFormMathML(lhsT(), '2*(t'), null, 'an unreadable text gives no MathML (the plain text stays)');
    assert.deepEqual(parseClosedForm('-2^n').k, 'neg');
    assert.equal(toLatex(closedFormMathML(lhsT(), "δ''(t) + 3*δ^(3)(t)")), "f(t) = \\delta''(t) + 3 \\delta^{(3)}(t)");
  });
});

// Unit tests (node, no browser) of the pure parsing and writing functions of www/js/entry-forms.js:
// f typed as coefficients or as gain, zeros and poles. run.mjs imports this file, so
// `make test-e2e` (node --test tests/e2e/run.mjs) runs it too; alone: node --test tests/e2e/entry-forms.test.mjs
// The page's modules are plain ES modules without a package.json of their own, so they are copied
// into a temporary directory that says "type": "module" and imported from there.
import { test, describe, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const jsDir = resolve(here, '..', '..', 'www', 'js');

const close = (a, b, tol = 1e-12) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

describe('entry forms: parsing and writing (node)', () => {
  let E, dir;
  before(async () => {
    dir = mkdtempSync(join(tmpdir(), 'residuary-entry-'));
    cpSync(jsDir, dir, { recursive: true });
    writeFileSync(join(dir, 'package.json'), '{"type": "module"}');
    E = await import(pathToFileURL(join(dir, 'entry-forms.js')).href);
  });
  after(() => { if (dir) rmSync(dir, { recursive: true, force: true }); });

  test('coefficients, highest power first, as a plain ratio (numbers kept as typed)', () => {
    // by hand: [1, 0, 4] is s^2 + 4, [1, 0.4, 4] is s^2 + 0.4 s + 4
    assert.deepEqual(E.coefficientsToF('1 0 4', '1 0.4 4', 's'), { ok: true, f: '(s^2 + 4)/(s^2 + 0.4*s + 4)' });
    assert.deepEqual(E.coefficientsToF('6283', '1, 6283', 's'), { ok: true, f: '6283/(s + 6283)' });
    assert.deepEqual(E.coefficientsToF('0 0 -1 2.50', '1+2i, -3, 1', 'z'), { ok: true, f: '(-z + 2.50)/((1+2i)*z^2 - 3*z + 1)' });
    assert.deepEqual(E.coefficientsToF('3', '2', 's'), { ok: true, f: '3/2' });
    assert.deepEqual(E.coefficientsToF('1 1', '1', 's'), { ok: true, f: 's + 1' });
  });

  test('coefficient errors name the field and the item', () => {
    const bad = E.coefficientsToF('1', '1 x 4', 's');
    assert.equal(bad.ok, false);
    assert.equal(bad.error.field, 'denominator');
    assert.equal(bad.error.item, 2);
    assert.match(bad.error.message, /^denominator, item 2: “x” is not a number/);
    assert.match(E.coefficientsToF('0 0', '1', 's').error.message, /^numerator: every coefficient is 0/);
    assert.match(E.coefficientsToF('1', '', 's').error.message, /^denominator: type at least one coefficient/);
  });

  test('gain, zeros and poles: a ± pair becomes its real quadratic, a repeat a power', () => {
    // by hand: (s + 1)(s^2 + 2s + 5) has the roots −1, −1 ± 2i; (s + 0.5)^2 + 4 = s^2 + s + 4.25
    assert.deepEqual(E.zpkToF('2', '-3', '-1, -1±2i', 's'), { ok: true, f: '2*(s + 3)/((s + 1)*(s^2 + 2*s + 5))' });
    assert.deepEqual(E.zpkToF('', '', '-1^2, -0.5+-2i', 's'), { ok: true, f: '1/((s + 1)^2*(s^2 + s + 4.25))' });
    // conjugates typed one by one are paired too; a lone complex root stays a linear factor
    assert.deepEqual(E.zpkToF('-1', '0, 1+2i', '0^2, -2, -1 + 1i, -1 - 1i', 's'), { ok: true, f: '-s*(s - 1 - 2i)/(s^2*(s + 2)*(s^2 + 2*s + 2))' });
    assert.deepEqual(E.zpkToF('1e3', '', '−2', 'z'), { ok: true, f: '1e3/(z + 2)' });
    assert.deepEqual(E.zpkToF('0.5', '-1 -1', '0.5', 'z'), { ok: true, f: '0.5*(z + 1)^2/(z - 0.5)' });
  });

  test('zero-pole-gain errors name the field and the item', () => {
    const third = E.zpkToF('1', '', '-1, -2, -0.5±2', 's');
    assert.equal(third.ok, false);
    assert.deepEqual([third.error.field, third.error.item], ['poles', 3]);
    assert.match(third.error.message, /^poles, item 3: “-0\.5±2” is not a pair a±bi/);
    assert.match(E.zpkToF('1', '-1^0', '-1', 's').error.message, /^zeros, item 1: “-1\^0” has a repeat count/);
    assert.match(E.zpkToF('1', '', '-1, 2^x', 's').error.message, /^poles, item 2:/);
    assert.match(E.zpkToF('0', '', '-1', 's').error.message, /^gain k: k = 0/);
    assert.match(E.zpkToF('k', '', '-1', 's').error.message, /^gain k: “k” is not a number/);
  });

  test('a pole pair from ωn and ζ (rad/s or Hz; in z mapped by e^(sT))', () => {
    // from memory (second-order section): poles −ζωn ± iωn√(1 − ζ²)
    const pair = E.polePairText('2', '0.3', 'rad/s', 's');
    assert.ok(pair.ok);
    const m = pair.text.match(/^(.*)±(.*)i$/);
    assert.ok(close(Number(m[1]), -0.6) && close(Number(m[2]), 2 * Math.sqrt(1 - 0.09)), pair.text);
    // written: s^2 + 2ζωn s + ωn^2 = s^2 + 1.2 s + 4 (from memory), to 12 digits
    assert.deepEqual(E.zpkToF('4', '', pair.text, 's'), { ok: true, f: '4/(s^2 + 1.2*s + 4)' });
    // Hz multiplies by 2π: ωn = 1 Hz, ζ = 0.5 gives |p| = 2π
    const hz = E.polePairText('1', '0.5', 'Hz', 's').text.match(/^(.*)±(.*)i$/);
    assert.ok(close(Math.hypot(Number(hz[1]), Number(hz[2])), 2 * Math.PI), hz[0]);
    // ζ = 1: a double real pole at −ωn; ζ = 2: −ωn(ζ ± √(ζ² − 1)) (from memory)
    assert.equal(E.polePairText('2', '1', 'rad/s', 's').text, '-2^2');
    const over = E.polePairText('2', '2', 'rad/s', 's').text.split(', ').map(Number);
    assert.ok(close(over[0], -2 * (2 - Math.sqrt(3))) && close(over[1], -2 * (2 + Math.sqrt(3))), String(over));
    // z = e^(sT), T = 0.1: |z| = e^(−ζωn T), arg z = ωn√(1 − ζ²) T (from memory)
    const zp = E.polePairText('1', '0.5', 'rad/s', 'z', '0.1').text.match(/^(.*)±(.*)i$/);
    const re = Number(zp[1]), im = Number(zp[2]);
    assert.ok(close(Math.hypot(re, im), Math.exp(-0.05)) && close(Math.atan2(im, re), Math.sqrt(0.75) * 0.1), zp[0]);
    assert.match(E.polePairText('0', '0.3', 'rad/s', 's').error.message, /^ωn: “0” is not a frequency > 0 \(in rad\/s\)/);
    assert.match(E.polePairText('1', 'x', 'Hz', 's').error.message, /^ζ: /);
    assert.match(E.polePairText('1', '0.5', 'rad/s', 'z', '-1').error.message, /^sampling period T: /);
  });

  test('reading back: multiplied out, conjugates shown as a±bi, 12 digits trimmed', () => {
    // numpy 2.4 poly([-1, -1, -0.5+2j, -0.5-2j]) = [1, 3, 7.25, 9.5, 4.25]
    const den = E.multiplyOut([{ at: [-1, 0], order: 2 }, { at: [-0.5, 2], order: 1 }, { at: [-0.5, -2], order: 1 }]);
    [1, 3, 7.25, 9.5, 4.25].forEach((c, i) => assert.ok(close(den[i][0], c) && Math.abs(den[i][1]) < 1e-12, `${den[i]}`));
    assert.equal(E.coefficientsText(den), '1 3 7.25 9.5 4.25');
    // scipy 1.17 signal.zpk2tf([-3], [-1, -1+2j, -1-2j], 2) = [2, 6] / [1, 3, 7, 5]
    assert.equal(E.coefficientsText(E.multiplyOut([{ at: [-3, 0], order: 1 }], [2, 0])), '2 6');
    assert.equal(E.coefficientsText(E.multiplyOut([{ at: [-1, -2], order: 1 }, { at: [-1, 0], order: 1 }, { at: [-1, 2], order: 1 }])), '1 3 7 5');
    assert.equal(E.rootsText([{ at: [-1, -2], order: 1 }, { at: [-1, 0], order: 1 }, { at: [-1, 2], order: 1 }]), '-1±2i, -1');
    assert.equal(E.rootsText([{ at: [0, 1], order: 2 }, { at: [0, -1], order: 2 }, { at: [0.1 + 1e-17, 3], order: 1 }]), '±i^2, 0.1+3i');
    assert.equal(E.entryNumber(1 / 3), '0.333333333333');
    assert.equal(E.entryNumber(-2.0000000000001), '-2');
    // what is read can be written again: the same f up to the order of the factors
    assert.deepEqual(E.zpkToF('2', '-3', '-1±2i, -1', 's'), { ok: true, f: '2*(s + 3)/((s^2 + 2*s + 5)*(s + 1))' });
    // k from F at a point a: F(a)·Π(a − p)/Π(a − z); F = 2(s + 3)/(s + 1) at a = 1 is 4 (by hand)
    const k = E.gainAt([1, 0], [4, 0], [{ at: [-1, 0], order: 1 }], [{ at: [-3, 0], order: 1 }]);
    assert.ok(close(k[0], 2) && k[1] === 0, String(k));
  });
});

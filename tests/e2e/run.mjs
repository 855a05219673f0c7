// End-to-end tests of dist/residuary.html in headless Chromium (the system's
// /usr/bin/chromium via playwright-core; no browser is ever downloaded).
// Run: node --test tests/e2e/   (or: node --test tests/e2e/run.mjs)
//
// Two groups:
//  - "page with the real core": opens the built file from file:// as a person would.
//    Tests named "[core]" need the numerical core (phase_plot, evaluate,
//    singularities, laurent) and fail until it is integrated.
//  - "page UI with a stand-in engine": the same page with tests/e2e/mock-engine.js
//    installed first, so the UI (drawing, underline, markers, MathML, pan/zoom,
//    persistence) is checked independently of the core.
import { test, describe, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { mkdtempSync, mkdirSync, readFileSync, existsSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { createRequire } from 'node:module';

const here = dirname(fileURLToPath(import.meta.url));
const require = createRequire(join(here, 'package.json'));
const { chromium } = require('playwright-core');
const root = resolve(here, '..', '..');
const pagePath = join(root, 'dist', 'residuary.html');
const pageUrl = pathToFileURL(pagePath).href;
const artifacts = join(here, 'artifacts');
mkdirSync(artifacts, { recursive: true });
const mockSource = readFileSync(join(here, 'mock-engine.js'), 'utf8');
const CHROMIUM = process.env.CHROMIUM || '/usr/bin/chromium';

const LOWPASS = 'wn^2/(s^2 + 2*zeta*wn*s + wn^2)';

/** A fresh browser profile that records errors and every request leaving the file. */
async function openBrowser({ mock }) {
  const profile = mkdtempSync(join(tmpdir(), 'residuary-e2e-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1360, height: 900 },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const log = { errors: [], requests: [] };
  context.on('request', (r) => {
    const u = r.url();
    if (!u.startsWith('file:') && !u.startsWith('data:') && !u.startsWith('blob:')) log.requests.push(u);
  });
  if (mock) await context.addInitScript({ content: mockSource });
  const page = context.pages()[0] || (await context.newPage());
  page.on('console', (m) => { if (m.type() === 'error') log.errors.push(m.text()); });
  page.on('pageerror', (e) => log.errors.push(String(e)));
  return { context, page, log, close: async () => { await context.close(); rmSync(profile, { recursive: true, force: true }); } };
}

async function load(page, hash = '') {
  await page.goto(pageUrl + hash);
  await page.waitForSelector('body[data-ready=true]', { timeout: 20000 });
}

/** A hash and colour count of the plot canvas. */
function canvasInfo(page) {
  return page.evaluate(() => {
    const c = document.getElementById('plot');
    const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
    let h = 2166136261 >>> 0;
    const colours = new Set();
    for (let i = 0; i < d.length; i += 4) {
      h = Math.imul(h ^ d[i] ^ (d[i + 1] << 8) ^ (d[i + 2] << 16), 16777619) >>> 0;
      if (i % 28 === 0) colours.add((d[i] << 16) | (d[i + 1] << 8) | d[i + 2]);
    }
    return { hash: h, colours: colours.size };
  });
}

async function plotDone(page, timeout = 30000) {
  await page.waitForFunction(() => document.getElementById('plot').dataset.status === 'done', null, { timeout });
}

async function typeFunction(page, text) {
  await page.fill('#expr', text);
}

async function setParams(page, params) {
  for (const [name, value] of Object.entries(params)) {
    await page.click('#add-param');
    const names = page.locator('.p-name');
    const values = page.locator('.p-value');
    const n = await names.count();
    await names.nth(n - 1).fill(name);
    await values.nth(n - 1).fill(String(value));
  }
}

describe('page with the real core', () => {
  let b;
  before(async () => { assert.ok(existsSync(pagePath), `build the page first (make build): ${pagePath}`); b = await openBrowser({ mock: false }); });
  after(async () => { if (b) await b.close(); });

  test('loads from file:// with no errors and no network requests', async () => {
    await load(b.page);
    await b.page.waitForTimeout(500);
    assert.deepEqual(b.log.errors, []);
    assert.deepEqual(b.log.requests, []);
    assert.match(await b.page.textContent('#version'), /Core version \d+\.\d+\.\d+/);
  });

  test('keeps what was typed across a reload (storage and address)', async () => {
    await typeFunction(b.page, 'exp(-tau*s)/(s^2 + 1)');
    await b.page.fill('#var-name', 's');
    await b.page.waitForTimeout(600);
    assert.match(b.page.url(), /#s=/);
    await b.page.goto(pageUrl); // no hash: must come back from localStorage
    await b.page.waitForSelector('body[data-ready=true]');
    assert.equal(await b.page.inputValue('#expr'), 'exp(-tau*s)/(s^2 + 1)');
    assert.equal(await b.page.inputValue('#var-name'), 's');
  });

  test('[core] typing the low-pass filter redraws the phase plot', async () => {
    await load(b.page, '#s=' + encodeURIComponent(JSON.stringify({ f: '1/(s^2 + s + 4)', var: 's', params: [{ name: 'wn', value: '2' }, { name: 'zeta', value: '0.3' }], view: [-3, 3, -3, 3] })));
    await plotDone(b.page);
    const beforeInfo = await canvasInfo(b.page);
    await typeFunction(b.page, LOWPASS);
    await b.page.waitForTimeout(300);
    await plotDone(b.page);
    const afterInfo = await canvasInfo(b.page);
    assert.notEqual(afterInfo.hash, beforeInfo.hash, 'the canvas did not change');
    assert.ok(afterInfo.colours > 500, `the plot has only ${afterInfo.colours} colours`);
    await b.page.screenshot({ path: join(artifacts, 'core-lowpass.png'), fullPage: true });
  });

  test('[core] a malformed function is underlined where the error is, with a message', async () => {
    await typeFunction(b.page, 'wn^2/(s^2 + 2*zeta*wn*s + ');
    await b.page.waitForSelector('#expr-mirror mark.err', { timeout: 5000 });
    const msg = await b.page.textContent('#expr-message');
    assert.ok(msg && msg.length > 5, 'no message under the function');
    assert.equal(await b.page.getAttribute('#expr', 'aria-invalid'), 'true');
  });

  test('[core] finds the two poles of the low-pass filter and shows a principal part', async () => {
    await typeFunction(b.page, LOWPASS);
    await b.page.click('#find');
    await b.page.waitForSelector('#sing-body tr[data-index]', { timeout: 30000 });
    const kinds = await b.page.$$eval('#sing-body tr[data-index] td:nth-child(2)', (tds) => tds.map((t) => t.textContent.trim()));
    // poles at -zeta*wn ± i wn sqrt(1 - zeta^2) = -0.6 ± 1.9079i (common practice: 2nd-order section)
    assert.equal(kinds.filter((k) => k === 'pole').length, 2);
    const loc = await b.page.textContent('#sing-body tr[data-index] td:nth-child(1)');
    assert.match(loc, /−0\.6/);
    assert.match(await b.page.textContent('#stability'), /0 poles with Re s > 0/);
    assert.equal(await b.page.isVisible('#caution'), true);
    await b.page.click('#sing-body tr[data-index="0"]');
    await b.page.waitForSelector('#detail-math math', { timeout: 30000 });
    await b.page.screenshot({ path: join(artifacts, 'core-singularities.png'), fullPage: true });
  });

  test('still no errors and no network requests at the end', () => {
    assert.deepEqual(b.log.requests, []);
    assert.deepEqual(b.log.errors, []);
  });
});

describe('page UI with a stand-in engine', () => {
  let b;
  before(async () => { b = await openBrowser({ mock: true }); });
  after(async () => { if (b) await b.close(); });

  test('draws a phase plot and changes it as the function is typed', async () => {
    await load(b.page);
    await plotDone(b.page);
    const first = await canvasInfo(b.page);
    assert.ok(first.colours > 500, `only ${first.colours} colours`);
    await typeFunction(b.page, '(z - 1)/(z^2 + 4)');
    await b.page.waitForTimeout(300);
    await plotDone(b.page);
    const second = await canvasInfo(b.page);
    assert.notEqual(second.hash, first.hash);
  });

  test('underlines the exact characters of an error and says what is wrong', async () => {
    await typeFunction(b.page, '(z - 1)/(z^2 + q)');
    await b.page.waitForSelector('#expr-mirror mark.err');
    assert.equal(await b.page.textContent('#expr-mirror mark.err'), 'q');
    assert.match(await b.page.textContent('#expr-message'), /unknown name "q"/i);
    await b.page.screenshot({ path: join(artifacts, 'ui-error.png') });
  });

  test('marks poles and zeros, fills the table and writes the principal part in MathML', async () => {
    await typeFunction(b.page, '(z - 1)/(z^2 + 4)');
    await b.page.waitForTimeout(200);
    await b.page.click('#find');
    await b.page.waitForSelector('#sing-body tr[data-index]');
    assert.equal(await b.page.locator('#sing-body tr[data-index]').count(), 3);
    assert.match(await b.page.textContent('#res-inf'), /−1/);
    assert.match(await b.page.textContent('#sum-check'), /1/);
    await b.page.click('#sing-body tr[data-index="0"]');
    await b.page.waitForSelector('#detail-math math mfrac');
    assert.match(await b.page.textContent('#detail-title'), /Pole at z = 2i/);
    assert.equal(await b.page.locator('#laurent-body tr').count(), 2);
    await b.page.screenshot({ path: join(artifacts, 'ui-singularities.png'), fullPage: true });
  });

  test('gives a stability reading with the caution when the variable is s', async () => {
    await typeFunction(b.page, '(s - 1)/(s^2 + 4)');
    await b.page.fill('#var-name', 's');
    await b.page.waitForTimeout(200);
    await b.page.click('#find');
    await b.page.waitForFunction(() => /Re s > 0/.test(document.getElementById('stability').textContent));
    assert.match(await b.page.textContent('#stability'), /0 poles with Re s > 0, 2 on the imaginary axis/);
    assert.equal(await b.page.isVisible('#caution'), true);
  });

  test('pans by drag, zooms by button and wheel, resets', async () => {
    const view = () => b.page.evaluate(() => JSON.parse(decodeURIComponent(location.hash.slice(3))).view);
    await b.page.click('#zoom-reset');
    await b.page.waitForTimeout(400);
    const v0 = await view();
    const box = await b.page.locator('#plot').boundingBox();
    await b.page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await b.page.mouse.down();
    await b.page.mouse.move(box.x + box.width / 2 + 80, box.y + box.height / 2 + 40, { steps: 5 });
    await b.page.mouse.up();
    await b.page.waitForTimeout(400);
    const v1 = await view();
    assert.ok(v1[0] < v0[0] && v1[2] > v0[2], 'dragging right/down moves the view left/up');
    await b.page.click('#zoom-in');
    await b.page.waitForTimeout(400);
    const v2 = await view();
    assert.ok(v2[1] - v2[0] < (v1[1] - v1[0]) * 0.8, 'zoom in shrinks the view');
    await b.page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await b.page.mouse.wheel(0, 300);
    await b.page.waitForTimeout(400);
    const v3 = await view();
    assert.ok(v3[1] - v3[0] > v2[1] - v2[0], 'wheel down zooms out');
    await b.page.click('#zoom-reset');
    await b.page.waitForTimeout(400);
    const v4 = await view();
    assert.ok(Math.abs(v4[1] - v4[0] - (v0[1] - v0[0])) < 1e-9);
  });

  test('reads z and f(z) under the pointer', async () => {
    await typeFunction(b.page, 'z^2 + 1');
    await b.page.fill('#var-name', 'z');
    await b.page.waitForTimeout(300);
    const box = await b.page.locator('#plot').boundingBox();
    await b.page.mouse.move(box.x + box.width / 2 + 3, box.y + box.height / 2 + 5);
    await b.page.waitForFunction(() => /\|f\| =/.test(document.getElementById('readout').textContent));
    assert.match(await b.page.textContent('#readout'), /z = .*f = .*arg f = /);
  });

  test('view at infinity relabels the axes and redraws', async () => {
    const before = await canvasInfo(b.page);
    await b.page.check('#opt-infinity');
    await plotDone(b.page);
    const afterInfo = await canvasInfo(b.page);
    assert.notEqual(afterInfo.hash, before.hash);
    await b.page.uncheck('#opt-infinity');
  });

  test('a link with a state in its address opens that state', async () => {
    const state = { f: '1/(z^2 + 0.5*z + 2)', var: 'z', params: [{ name: 'a', value: '0.3+0.1i' }], view: [-2, 2, -2, 2], phase: true };
    await load(b.page, '#s=' + encodeURIComponent(JSON.stringify(state)));
    await b.page.waitForFunction((f) => document.getElementById('expr').value === f, state.f, { timeout: 5000 });
    assert.equal(await b.page.inputValue('#expr'), state.f);
    assert.equal(await b.page.inputValue('.p-value'), '0.3+0.1i');
    assert.equal(await b.page.isChecked('#opt-phase'), true);
  });

  test('the examples menu loads our scenarios', async () => {
    const options = await b.page.$$eval('#demo-select option', (os) => os.map((o) => o.textContent));
    assert.ok(options.length >= 7, `only ${options.length - 1} examples`);
    await b.page.selectOption('#demo-select', { index: 1 });
    await b.page.waitForTimeout(300);
    assert.notEqual(await b.page.inputValue('#expr'), '');
    assert.equal(await b.page.isHidden('#demo-description'), false);
  });

  test('no errors and no network requests with the stand-in engine', () => {
    assert.deepEqual(b.log.requests, []);
    assert.deepEqual(b.log.errors, []);
  });
});

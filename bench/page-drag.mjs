// Speed of the live path while a pole is dragged (a benchmark, not a test): the real page
// (dist/residuary.html, run `make build` first) in headless chromium, a degree-10 rational f with
// the transfer section (and the inverse transform, open by default for s) open, a drag of 60
// animation frames on one pole marker. Prints, per view, ms from "f rewritten" (the mark
// residuary-live-f-<n>, set when the frame writes the new f) to "that f drawn / computed"
// (residuary-live-plot-<n>, -transfer-<n>, -inverse-<n>; main.js), median and 90th percentile,
// and how many of the 60 frames each view showed (the others were skipped as stale).
// Run: node bench/page-drag.mjs
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '..');
const require = createRequire(join(root, 'tests', 'e2e', 'package.json'));
const { chromium } = require('playwright-core');
const FRAMES = 60;
// degree 3 over degree 10: five resonances, two real poles, a real zero and a pair of zeros
const F = '(s+3)*(s^2+s+9)/((s+0.5)*(s+6)*(s^2+0.6*s+1)*(s^2+0.8*s+4)*(s^2+1.2*s+9)*(s^2+0.4*s+16))';

const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM || '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--allow-file-access-from-files'],
});
const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } });
await page.goto(pathToFileURL(join(root, 'dist', 'residuary.html')).href);
await page.waitForSelector('body[data-ready=true]', { timeout: 20000 });
await page.evaluate((f) => window.residuary.set({ f, var: 's', params: {}, panels: { transfer: true, inverse: true } }), F);
await page.waitForFunction(() => document.getElementById('plot').dataset.draggable === 'true', null, { timeout: 20000 });
const m = await page.evaluate(() => {
  const r = document.getElementById('plot').getBoundingClientRect();
  const v = window.residuary.state().view;
  return { left: r.left + 54, top: r.top + 8, x0: v[0], y1: v[3], scale: (v[1] - v[0]) / (r.width - 54 - 10) };
});
const toPx = (p) => [m.left + (p[0] - m.x0) / m.scale, m.top + (m.y1 - p[1]) / m.scale];
// the pole −0.4 + i√15.84 of s^2 + 0.8 s + 16 ... here s^2 + 0.8 s + 4: −0.4 + i√3.84
const from = toPx([-0.4, Math.sqrt(3.84)]);
const to = toPx([-1.4, 2.6]);
await page.evaluate(() => performance.clearMarks());
await page.mouse.move(from[0], from[1]);
await page.mouse.down();
const t0 = Date.now();
for (let i = 1; i <= FRAMES; i++) {
  await page.mouse.move(from[0] + ((to[0] - from[0]) * i) / FRAMES, from[1] + ((to[1] - from[1]) * i) / FRAMES);
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r())));
}
const wall = Date.now() - t0;
await page.waitForTimeout(1500); // the last updates land
const marks = await page.evaluate(() => performance.getEntriesByType('mark').filter((e) => e.name.startsWith('residuary-live-')).map((e) => [e.name, e.startTime]));
await page.mouse.up();
await page.evaluate(() => window.residuary.settled());
await browser.close();

const at = new Map(marks);
const fSerials = marks.filter(([n]) => n.startsWith('residuary-live-f-')).map(([n]) => Number(n.slice('residuary-live-f-'.length)));
const q = (xs, p) => { const s = xs.slice().sort((a, b) => a - b); return s[Math.min(s.length - 1, Math.floor(p * (s.length - 1) + 0.5))]; };
console.log(`f = ${F}`);
console.log(`${FRAMES} pointer frames in ${wall} ms of wall time; ${fSerials.length} rewrites of f`);
for (const view of ['plot', 'transfer', 'inverse']) {
  const lat = fSerials.filter((n) => at.has(`residuary-live-${view}-${n}`)).map((n) => at.get(`residuary-live-${view}-${n}`) - at.get(`residuary-live-f-${n}`));
  if (!lat.length) { console.log(`${view}: no update`); continue; }
  console.log(`${view}: ${lat.length} of ${fSerials.length} shown; f rewritten -> done: median ${q(lat, 0.5).toFixed(1)} ms, 90th percentile ${q(lat, 0.9).toFixed(1)} ms`);
}

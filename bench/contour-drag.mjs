// Speed of the live contour integral while a contour is dragged (a benchmark, not a test): the
// real page (dist/residuary.html, run `make build` first) in headless chromium, a degree-20
// rational f (ten pole pairs, a cubic numerator), a circle whose radius handle is dragged over 60
// animation frames (and then a polygon vertex over 60 more). Prints ms from "contour moved" (the
// mark residuary-contour-move-<n>) to "its integral three ways shown" (residuary-contour-live-<n>;
// contour-edit.js createContourLive; the argument count follows when no newer contour waits), median and 90th percentile, and
// how many of the moves were shown (the others were skipped: a newer contour had come in).
// Run: node bench/contour-drag.mjs
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '..');
const require = createRequire(join(root, 'tests', 'e2e', 'package.json'));
const { chromium } = require('playwright-core');
const FRAMES = 60;
// ten conjugate pairs r e^{±iθ}: z² − 2r cos θ z + r², radii kept off 1.2 … 2.2 (the drag's range)
const pairs = [[0.3, 0.4], [0.5, 1.1], [0.7, 2.0], [0.9, 2.8], [1.0, 0.2], [2.4, 0.7], [2.6, 1.5], [2.8, 2.3], [3.0, 0.1], [3.2, 2.9]];
const quad = ([r, t]) => { const c = 2 * r * Math.cos(t); return `(z^2 ${c < 0 ? "+" : "-"} ${Math.abs(c).toFixed(4)}*z + ${(r * r).toFixed(4)})`; };
const F = `(z + 3)*(z^2 + z + 9)/(${pairs.map(quad).join('*')})`;

const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM || '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--allow-file-access-from-files'],
});
const page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
await page.goto(pathToFileURL(join(root, 'dist', 'residuary.html')).href);
await page.waitForSelector('body[data-ready=true]', { timeout: 20000 });
const q = (xs, p) => { const s = xs.slice().sort((a, b) => a - b); return s[Math.min(s.length - 1, Math.floor(p * (s.length - 1) + 0.5))]; };

async function run(name, region, from, to) {
  await page.evaluate(([f, region]) => window.residuary.set({ f, var: 'z', params: {}, view: [-4, 4, -4, 4], region }), [F, region]);
  const m = await page.evaluate(() => {
    const r = document.getElementById('plot').getBoundingClientRect();
    const v = window.residuary.state().view;
    return { left: r.left + 54, top: r.top + 8, x0: v[0], y1: v[3], scale: (v[1] - v[0]) / (r.width - 54 - 10) };
  });
  const toPx = (p) => [m.left + (p[0] - m.x0) / m.scale, m.top + (m.y1 - p[1]) / m.scale];
  const [a, b] = [toPx(from), toPx(to)];
  await page.evaluate(() => performance.clearMarks());
  await page.mouse.move(a[0], a[1]);
  await page.mouse.down();
  const t0 = Date.now();
  for (let i = 1; i <= FRAMES; i++) {
    await page.mouse.move(a[0] + ((b[0] - a[0]) * i) / FRAMES, a[1] + ((b[1] - a[1]) * i) / FRAMES);
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r())));
  }
  const wall = Date.now() - t0;
  await page.waitForTimeout(1500); // the last update lands
  const marks = await page.evaluate(() => performance.getEntriesByType('mark').filter((e) => e.name.startsWith('residuary-contour-')).map((e) => [e.name, e.startTime]));
  const errors = await page.evaluate(() => (window.residuary && document.getElementById('ci-status').textContent));
  await page.mouse.up();
  await page.evaluate(() => window.residuary.settled());
  const at = new Map(marks);
  const moves = marks.filter(([n]) => n.startsWith('residuary-contour-move-')).map(([n]) => Number(n.slice('residuary-contour-move-'.length)));
  const lat = moves.filter((n) => at.has(`residuary-contour-live-${n}`)).map((n) => at.get(`residuary-contour-live-${n}`) - at.get(`residuary-contour-move-${n}`));
  console.log(`${name}: ${FRAMES} pointer frames in ${wall} ms; ${moves.length} moves, ${lat.length} shown; ms per update median ${q(lat, 0.5).toFixed(1)}, p90 ${q(lat, 0.9).toFixed(1)}, max ${Math.max(...lat).toFixed(1)} (${errors})`);
}

console.log(`f = ${F}`);
await run('circle radius 1.2 → 2.2', { shape: 'circle', center: [0, 0], radius: 1.2 }, [1.2, 0], [2.2, 0]);
await run('polygon vertex (1.5, 0) → (2.1, 0.4)', { shape: 'polygon', vertices: [[1.5, 0], [0, 1.6], [-1.6, 0], [0, -1.6]] }, [1.5, 0], [2.1, 0.4]);
await browser.close();

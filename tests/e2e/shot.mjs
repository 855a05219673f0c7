// ad-hoc screenshots (not a test; not committed)
import { chromium } from 'playwright-core';
import path from 'node:path';
const [,, out, stateJson, w = '1366', h = '768', full = ''] = process.argv;
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking'] });
const p = await b.newPage({ viewport: { width: +w, height: +h } });
const errs = [];
p.on('console', (m) => { if (m.type() === 'error') errs.push(m.text()); });
p.on('pageerror', (e) => errs.push(String(e)));
await p.goto('file://' + path.resolve('dist/residuary.html'));
await p.waitForFunction(() => window.residuary);
const st = JSON.parse(stateJson);
const r = await p.evaluate(async (s) => { try { await window.residuary.set(s); return 'ok'; } catch (e) { return JSON.stringify(e); } }, st);
await p.waitForTimeout(800);
if (process.env.SCROLL) await p.evaluate((sel) => document.querySelector(sel).scrollIntoView(), process.env.SCROLL);
await p.screenshot({ path: out, fullPage: full === 'full' });
console.log(r, errs.join('\n'));
await b.close();

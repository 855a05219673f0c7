import { chromium } from 'playwright-core';
import path from 'node:path';
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const p = await b.newPage();
await p.goto('file://' + path.resolve('dist/residuary.html'));
await p.waitForFunction(() => window.residuary);
const r = await p.evaluate(async () => { const res = await window.residuary.set({ f: 'exp(-2*s)/(s+1)', var: 's', params: {}, panels: { inverse: true }, t: 6 }); const inv = res.inverse_laplace; const i = inv.t.findIndex((t) => t > 1.99 && t < 2); return { n: inv.t.length, around: inv.t.slice(i - 2, i + 4), f: inv.f.slice(i - 2, i + 4), delays: inv.delays }; });
console.log(JSON.stringify(r));
await b.close();

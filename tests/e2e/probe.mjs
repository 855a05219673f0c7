// ad-hoc probe (not committed)
import { chromium } from 'playwright-core';
import path from 'node:path';
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking'] });
const p = await b.newPage({ viewport: { width: 1366, height: 900 } });
const errs = [];
p.on('pageerror', (e) => errs.push(String(e)));
p.on('console', (m) => { if (m.type() === 'error') errs.push(m.text()); });
await p.goto('file://' + path.resolve('dist/residuary.html'));
await p.waitForFunction(() => window.residuary);
const cases = JSON.parse(process.argv[2]);
for (const st of cases) {
  const t0 = Date.now();
  const r = await p.evaluate(async (s) => {
    try {
      const res = await window.residuary.set(s);
      const tf = res.transfer_function;
      if (!tf) return { keys: Object.keys(res) };
      if (tf.error) return { error: tf.error };
      const e = tf.encirclement, m = tf.margins, st = tf.step;
      return { poles: tf.poles.map((q) => q.at.map((v) => +v.toPrecision(4))), zeros: tf.zeros.map((q) => q.at.map((v) => +v.toPrecision(4))),
        N: e.winding, P: e.open_loop_rhp_poles, Z: e.closed_loop_rhp_poles, sampled: e.sampled_winding,
        gc: m.gain_crossovers.map((v) => +v.toPrecision(4)), pm: m.phase_margins.map((v) => +v.toPrecision(4)), pc: m.phase_crossovers.map((v) => +v.toPrecision(4)), gm: m.gain_margins.map((v) => +v.toPrecision(4)),
        ss: st && st.steady_state, os: st && st.overshoot_percent, ts: st && st.settling_time, warnings: tf.warnings, imagePts: tf.image.segments.reduce((a, g) => a + g.value.length, 0), segs: tf.image.segments.map((g) => g.kind).join(','), view: window.residuary.state().view.map((v) => +v.toPrecision(3)) };
    } catch (e) { return { reject: e }; }
  }, st);
  console.log(st.f, `${Date.now() - t0} ms`, JSON.stringify(r));
}
console.log('errors:', errs);
await b.close();

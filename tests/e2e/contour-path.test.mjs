// Unit tests (node, no browser) of www/js/contour-path.js: the polylines of every contract contour
// shape, checked against plane geometry by hand, and the angle-sum winding of f(γ) against the
// core's argument_count (loaded in node from dist/pkg) on the same half-disc and keyhole.
// run.mjs imports this file; alone: node --test tests/e2e/contour-path.test.mjs (after make build).
import { test, describe, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { cpSync, mkdtempSync, rmSync, writeFileSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '..', '..');
const jsDir = join(root, 'www', 'js');

describe('contour paths: samplers of every shape (node)', () => {
  let P, G, dir, core;
  before(async () => {
    dir = mkdtempSync(join(tmpdir(), 'residuary-path-'));
    cpSync(jsDir, dir, { recursive: true });
    writeFileSync(join(dir, 'package.json'), '{"type": "module"}');
    P = await import(pathToFileURL(join(dir, 'contour-path.js')).href);
    G = await import(pathToFileURL(join(dir, 'contour-geom.js')).href); // the angle-sum winding
    const glue = await import(pathToFileURL(join(root, 'dist', 'pkg', 'residuary.js')).href);
    glue.initSync({ module: readFileSync(join(root, 'dist', 'pkg', 'residuary_bg.wasm')) });
    core = (req) => JSON.parse(glue.run_json(JSON.stringify(req)));
  });
  after(() => { if (dir) rmSync(dir, { recursive: true, force: true }); });

  const shapes = [
    [{ shape: 'circle', center: [0.5, -0.25], radius: 1.5 }, [0.5, -0.25], [3, 0]],
    [{ shape: 'ellipse', center: [0, 1], semi_axes: [2, 0.5], angle: 0.7 }, [0, 1], [0, -1]],
    [{ shape: 'rectangle', corners: [[1, 1], [-1, -2]] }, [0, -0.5], [2, 0]],
    [{ shape: 'polygon', vertices: [[0, 0], [2, 0], [2, 2], [1, 0.5], [0, 2]] }, [1, 0.25], [1, 1.5]],
    [{ shape: 'half_disc', center: [0.2, 0.1], radius: 2, direction: 'upper' }, [0.2, 1], [1, 0]],
    [{ shape: 'half_disc', center: [0, 0], radius: 1.5, direction: 'left' }, [-0.7, 0.3], [0.5, 0]],
    [{ shape: 'keyhole', center: [0, 0], inner: 0.5, outer: 2, gap: 0.05 }, [-1, 0.2], [1, 0]],
    [{ shape: 'keyhole', center: [1, 0.5], inner: 0.3, outer: 1.8, angle: 2 }, [2, 0.5], [1, 0.5]],
  ];

  test('each polyline winds once about an inside point and not about an outside one (by hand)', () => {
    for (const [c, inside, outside] of shapes) {
      const s = P.sampleContour(c, 800);
      assert.ok(s.points.length >= 700, c.shape);
      assert.equal(G.windingAbout(s.points, inside), 1, `${JSON.stringify(c)} about ${inside}`);
      assert.equal(G.windingAbout(s.points, outside), 0, `${JSON.stringify(c)} about ${outside}`);
      assert.ok(s.t.every((t, k) => t >= 0 && t < 1 && (k === 0 || t > s.t[k - 1])), 't increases in [0, 1)');
    }
  });

  test('the points lie on the shapes (plane geometry by hand)', () => {
    const hd = P.sampleHalfDisc({ center: [0.2, 0.1], radius: 2, direction: 'upper' }, 400);
    for (const [x, y] of hd.points) assert.ok(y >= 0.1 - 1e-12 && Math.hypot(x - 0.2, y - 0.1) <= 2 + 1e-12 && (Math.abs(y - 0.1) < 1e-12 || Math.abs(Math.hypot(x - 0.2, y - 0.1) - 2) < 1e-12));
    assert.deepEqual(hd.points[0], [-1.8, 0.1], 'the diameter starts at c − r');
    const kh = P.sampleKeyhole({ center: [0, 0], inner: 0.5, outer: 2, gap: 0.05 }, 400);
    for (const [x, y] of kh.points) {
      const r = Math.hypot(x, y);
      assert.ok(Math.abs(r - 0.5) < 1e-12 || Math.abs(r - 2) < 1e-12 || (Math.abs(Math.abs(y) - 0.05) < 1e-12 && x > 0), `${x}, ${y}`);
    }
    // the keyhole's slit half-width defaults to 0.001 × inner, as the core's
    const dflt = P.sampleKeyhole({ center: [0, 0], inner: 2, outer: 3 }, 100);
    assert.ok(Math.abs(dflt.points[0][1] - 0.002) < 1e-15, `${dflt.points[0]}`);
    assert.deepEqual(P.sampleContour({ shape: 'triangle' }), null);
  });

  test('the winding of f(γ) about 0 equals the core\'s argument_count on a half-disc and a keyhole', () => {
    // By hand: (z − 0.5i)(z + 1.2)/((z + 0.5 + 0.5i)(z − 0.2 − 0.3i)) in the upper half-disc |z| < 1: zero 0.5i,
    // pole 0.2 + 0.3i, 0 in all; times (z − 2 − i) in the keyhole 0.6 < |z| < 3 (slit on the positive axis): zeros
    // −1.2 and 2 + i, pole −0.5 − 0.5i (0.5i and 0.2 + 0.3i are in the inner disc): 1; (z − 0.5i)/(z + 0.5 + 0.5i)
    // in the lower half-disc |z| < 1: the pole only, −1.
    const f1 = '(z-0.5i)*(z+1.2)/((z+0.5+0.5i)*(z-0.2-0.3i))';
    const cases = [
      [f1, { shape: 'half_disc', center: [0, 0], radius: 1, direction: 'upper' }, 0],
      [f1 + '*(z-2-i)', { shape: 'keyhole', center: [0, 0], inner: 0.6, outer: 3 }, 1],
      ['(z-0.5i)/(z+0.5+0.5i)', { shape: 'half_disc', center: [0, 0], radius: 1, direction: 'lower' }, -1],
    ];
    for (const [f, contour, want] of cases) {
      const s = P.sampleContour(contour, 2000);
      const ev = core({ task: 'evaluate', f, at: s.points });
      const count = core({ task: 'argument_count', f, contour });
      assert.equal(count.zeros_minus_poles, want, `${f}: ${JSON.stringify(count)}`);
      assert.equal(G.windingAbout(ev.values, [0, 0]), want, `${f} on ${contour.shape}`);
    }
  });
});

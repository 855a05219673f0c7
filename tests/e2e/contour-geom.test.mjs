// Unit tests (node, no browser) of www/js/contour-geom.js:
// winding numbers of each contract shape and the drag arithmetic (regionHandles, dragRegion). run.mjs imports this file;
// alone: node --test tests/e2e/contour-geom.test.mjs
import { test, describe, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const jsDir = resolve(here, '..', '..', 'www', 'js');

/** An independent winding number: the change of arg(γ(t) − p) along a fine sampling of the
 *  curve γ (given as a function of t in [0, 1)), each step's change taken in (−π, π], over 2π. */
function argumentChange(gamma, p, steps = 4000) {
  let total = 0, prev = null;
  for (let k = 0; k <= steps; k++) {
    const [x, y] = gamma((k % steps) / steps);
    const a = Math.atan2(y - p[1], x - p[0]);
    if (prev !== null) { let d = a - prev; while (d > Math.PI) d -= 2 * Math.PI; while (d <= -Math.PI) d += 2 * Math.PI; total += d; }
    prev = a;
  }
  return Math.round(total / (2 * Math.PI)) || 0; // no −0
}
const polyCurve = (vs) => (t) => {
  const n = vs.length, u = t * n, k = Math.floor(u), s = u - k;
  const a = vs[k], b = vs[(k + 1) % n];
  return [a[0] + s * (b[0] - a[0]), a[1] + s * (b[1] - a[1])];
};

describe('contour geometry: winding numbers and drags (node)', () => {
  let G, E, dir;
  before(async () => {
    dir = mkdtempSync(join(tmpdir(), 'residuary-geom-'));
    cpSync(jsDir, dir, { recursive: true });
    writeFileSync(join(dir, 'package.json'), '{"type": "module"}');
    G = await import(pathToFileURL(join(dir, 'contour-geom.js')).href);
    E = G; // the drag arithmetic lives beside the geometry
  });
  after(() => { if (dir) rmSync(dir, { recursive: true, force: true }); });

  // a fixed grid of test points, some near the curves
  const points = [];
  for (let i = -12; i <= 12; i++) for (let j = -12; j <= 12; j++) points.push([i * 0.2517 + 0.013, j * 0.2491 - 0.007]);

  test('ellipse and circle windings equal the argument change along the curve', () => {
    const e = { shape: 'ellipse', center: [0.3, -0.2], semi_axes: [2.1, 0.9], angle: 0.7 };
    const ge = (t) => {
      const u = e.semi_axes[0] * Math.cos(2 * Math.PI * t), v = e.semi_axes[1] * Math.sin(2 * Math.PI * t);
      return [e.center[0] + Math.cos(e.angle) * u - Math.sin(e.angle) * v, e.center[1] + Math.sin(e.angle) * u + Math.cos(e.angle) * v];
    };
    const c = { shape: 'circle', center: [-0.5, 0.4], radius: 1.7 };
    const gc = (t) => [c.center[0] + c.radius * Math.cos(2 * Math.PI * t), c.center[1] + c.radius * Math.sin(2 * Math.PI * t)];
    let inside = 0;
    for (const p of points) {
      const we = G.windingNumber(e, p), wc = G.windingNumber(c, p);
      assert.equal(we, argumentChange(ge, p), `ellipse at ${p}`);
      assert.equal(wc, argumentChange(gc, p), `circle at ${p}`);
      assert.equal(G.windingNumber(e, p, -1), -we === 0 ? 0 : -we, 'reversed');
      inside += we;
    }
    assert.ok(inside > 50 && inside < points.length - 50, `a real mix of inside and outside: ${inside}`);
    assert.equal(G.windingNumber(c, [c.center[0] + c.radius, c.center[1]]), null, 'on the circle');
  });

  test('polygon windings (a non-convex, a clockwise and a self-crossing one) equal the argument change', () => {
    const polys = [
      [[0, -1], [2, -1], [2, 2], [-0.5, 2], [0, 0.5], [-2.5, 0.3], [-1, -2.2]],
      [[1, 1], [1, -1.5], [-1.2, -1.5], [-1.2, 1]],            // clockwise
      [[-2, -2], [2, 2], [2, -2], [-2, 2]],                     // a bow tie: +1 in one lobe, −1 in the other
      [[0, 2.5], [0.6, -2], [-2.4, 1], [2.4, 1], [-0.6, -2]],  // a pentagram drawn clockwise: −2 in the middle
    ];
    const seen = new Set();
    for (const vs of polys) {
      for (const p of points) {
        const w = G.windingNumber({ shape: 'polygon', vertices: vs }, p);
        assert.equal(w, argumentChange(polyCurve(vs), p), `${JSON.stringify(vs)} at ${p}`);
        seen.add(w);
      }
    }
    for (const w of [-1, 0, 1, -2]) assert.ok(seen.has(w), `winding ${w} occurs (the pentagram, drawn clockwise, gives −2 in its middle): ${[...seen]}`);
    assert.equal(G.windingNumber({ shape: 'polygon', vertices: polys[0] }, [1, -1]), null, 'on an edge');
    const r = { shape: 'rectangle', corners: [[1, 1], [-2, -0.5]] };
    for (const p of points) assert.equal(G.windingNumber(r, p), argumentChange(polyCurve([[-2, -0.5], [1, -0.5], [1, 1], [-2, 1]]), p));
  });

  test('half-disc and keyhole windings equal the argument change along their pieces (contract.md: 1 inside, 0 outside)', () => {
    // the half-disc: the diameter from c + r·e^{i(φ+π/2)} to c + r·e^{i(φ−π/2)}, then the half circle
    for (const [direction, phi] of [['upper', Math.PI / 2], ['left', Math.PI], ['lower', -Math.PI / 2], ['right', 0]]) {
      const h = { shape: 'half_disc', center: [0.2, -0.1], radius: 2.3, direction };
      const c = h.center, r = h.radius;
      const gamma = (t) => {
        if (t < 0.5) { const u = 2 * t; const a = phi + Math.PI / 2, b = phi - Math.PI / 2; return [c[0] + r * ((1 - u) * Math.cos(a) + u * Math.cos(b)), c[1] + r * ((1 - u) * Math.sin(a) + u * Math.sin(b))]; }
        const s = phi - Math.PI / 2 + Math.PI * (2 * t - 1);
        return [c[0] + r * Math.cos(s), c[1] + r * Math.sin(s)];
      };
      let inside = 0;
      for (const p of points) { const w = G.windingNumber(h, p); assert.equal(w, argumentChange(gamma, p), `${direction} at ${p}`); inside += w; }
      assert.ok(inside > 40, `${direction}: ${inside} inside`);
    }
    // the keyhole: out along the edge at +g, the outer circle, in along −g, the inner circle backwards
    const k = { shape: 'keyhole', center: [-0.3, 0.2], inner: 0.6, outer: 2.6, angle: 0.9, gap: 0.06 };
    const [cx, cy] = k.center, th = k.angle, g = k.gap;
    const d1 = Math.asin(g / k.inner), d2 = Math.asin(g / k.outer);
    const onEdge = (side, rad) => { const s = Math.sqrt(rad * rad - g * g); return [cx + s * Math.cos(th) - side * g * Math.sin(th), cy + s * Math.sin(th) + side * g * Math.cos(th)]; };
    const gamma = (t) => {
      const u = (t % 0.25) * 4;
      if (t < 0.25) return onEdge(1, k.inner + u * (k.outer - k.inner));
      if (t < 0.5) { const s = th + d2 + u * (2 * Math.PI - 2 * d2); return [cx + k.outer * Math.cos(s), cy + k.outer * Math.sin(s)]; }
      if (t < 0.75) return onEdge(-1, k.outer - u * (k.outer - k.inner));
      const s = th + 2 * Math.PI - d1 - u * (2 * Math.PI - 2 * d1);
      return [cx + k.inner * Math.cos(s), cy + k.inner * Math.sin(s)];
    };
    const extra = [[cx + 1.5 * Math.cos(th), cy + 1.5 * Math.sin(th)], [cx + 1.5 * Math.cos(th) - 0.1 * Math.sin(th), cy + 1.5 * Math.sin(th) + 0.1 * Math.cos(th)]];
    let inside = 0;
    for (const p of points.concat(extra)) { const w = G.windingNumber(k, p); assert.equal(w, argumentChange(gamma, p, 12000), `keyhole at ${p}`); inside += w; }
    assert.equal(G.windingNumber(k, extra[0]), 0, 'in the slit: outside');
    assert.equal(G.windingNumber(k, extra[1]), 1, 'beside the slit: inside');
    assert.equal(G.windingNumber(k, [cx, cy]), 0, 'the centre is outside');
    assert.ok(inside > 100, `${inside} inside`);
  });

  test('drags: a rectangle corner keeps the opposite corner, an ellipse axis turns it, a polygon vertex moves alone', () => {
    const r = E.dragRegion({ mode: 'rect', rect: [-1, 1, -1, 1] }, { id: 'corner-2' }, [1, 1], [3, -2]);
    assert.deepEqual(r.rect, [-1, 3, -2, -1]);
    const side = E.dragRegion({ mode: 'rect', rect: [-1, 1, -1, 1] }, { id: 'edge-3' }, [-1, 0], [-4, 0.5]);
    assert.deepEqual(side.rect, [-4, 1, -1, 1]);
    const e = E.dragRegion({ mode: 'ellipse', ellipse: [1, 1, 2, 1, 0] }, { id: 'axis-a' }, [3, 1], [1, 4]);
    assert.ok(Math.abs(e.ellipse[2] - 3) < 1e-15 && Math.abs(e.ellipse[4] - Math.PI / 2) < 1e-15, JSON.stringify(e));
    const c = E.dragRegion({ mode: 'circle', circle: [0, 0, 1] }, { id: 'center' }, [0, 0], [0.5, -0.25]);
    assert.deepEqual(c.circle, [0.5, -0.25, 1]);
    const p = E.dragRegion({ mode: 'polygon', polygon: [[0, 0], [1, 0], [0, 1]] }, { id: 'vertex-1' }, [1, 0], [2, -1]);
    assert.deepEqual(p.polygon, [[0, 0], [2, -1], [0, 1]]);
  });
});

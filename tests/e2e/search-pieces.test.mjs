// Unit tests (node, no browser) of www/js/search-pieces.js: the split of a rectangle into
// overlapping pieces, the merge of their answers (a point on a cut found by two pieces kept once)
// and the failure of a piece named, never hidden. run.mjs imports this file;
// alone: node --test tests/e2e/search-pieces.test.mjs
import { test, describe } from 'node:test';
import assert from 'node:assert/strict';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const mod = await import(pathToFileURL(join(resolve(here, '..', '..', 'www', 'js'), 'search-pieces.js')).href);
const { splitRectangle, gridFor, mergeAnswers, searchInPieces, widenPiece, OVERLAP } = mod;

const region = { shape: 'rectangle', corners: [[-2, -1], [3, 1.5]] };
const inside = (c, p) => { const [[a, b], [x, y]] = c.corners; return p[0] > a && p[0] < x && p[1] > b && p[1] < y; };
const onEdge = (c, p, eps = 1e-12) => { const [[a, b], [x, y]] = c.corners; return (Math.abs(p[0] - a) < eps || Math.abs(p[0] - x) < eps) && p[1] >= b && p[1] <= y || (Math.abs(p[1] - b) < eps || Math.abs(p[1] - y) < eps) && p[0] >= a && p[0] <= x; };

describe('search in pieces (node)', () => {
  test('the pieces cover the region, stay inside it, and no cut line is a piece edge', () => {
    const pieces = splitRectangle(region, 4, 3);
    assert.equal(pieces.length, 12);
    // a grid of points (cut lines included) each lies strictly inside at least one piece and on no piece's edge
    for (let i = 1; i < 40; i++) for (let j = 1; j < 30; j++) {
      const p = [-2 + 5 * i / 40, -1 + 2.5 * j / 30];
      assert.ok(pieces.some((q) => inside(q.contour, p)), `point ${p} is in no piece`);
      assert.ok(!pieces.some((q) => onEdge(q.contour, p)), `point ${p} is on a piece's edge`);
    }
    for (const q of pieces) {
      const [[a, b], [x, y]] = q.contour.corners;
      assert.ok(a >= -2 && x <= 3 && b >= -1 && y <= 1.5, JSON.stringify(q.contour));
    }
    // the cut x = −0.75 (cell width 1.25) lies OVERLAP·1.25 inside both neighbours
    assert.ok(Math.abs(pieces[0].contour.corners[1][0] - (-0.75 + OVERLAP * 1.25)) < 1e-12);
    assert.ok(Math.abs(pieces[1].contour.corners[0][0] - (-0.75 - OVERLAP * 1.25)) < 1e-12);
    assert.deepEqual(gridFor(4, 4), [4, 4]);
    assert.deepEqual(gridFor(10, 4), [6, 3]);
  });

  test('a wider piece keeps the region edges and moves only its inner edges out', () => {
    const pieces = splitRectangle(region, 2, 2);
    const w = widenPiece(pieces[0], region, 3);
    assert.deepEqual(w.contour.corners[0], [-2, -1]);
    assert.ok(Math.abs(w.contour.corners[1][0] - (0.5 + 3 * OVERLAP * 2.5)) < 1e-12, JSON.stringify(w.contour));
  });

  test('merge: the union, a point twice within tolerance kept once (the smaller error), another kind kept', () => {
    const a = { poles: [{ at: [0, 0], order: 1, residue: [1, 0], error_estimate: 1e-10 }], zeros: [{ at: [1, 1], order: 2 }], essential: [], branch_points: [], removable: [], residue_at_infinity: [0, 0], method: 'numerical', warnings: ['w1'] };
    const b = { poles: [{ at: [1e-12, 0], order: 1, residue: [1, 0], error_estimate: 1e-13 }, { at: [2, 0], order: 1, residue: [3, 0] }], zeros: [{ at: [0, 0], order: 1 }], essential: [], branch_points: [], removable: [], residue_at_infinity: [0, 0], method: 'numerical', warnings: ['w1', 'w2'] };
    const m = mergeAnswers([a, b], 1e-9);
    assert.equal(m.poles.length, 2);
    assert.equal(m.poles[0].error_estimate, 1e-13);
    assert.equal(m.zeros.length, 2, 'a zero where a pole is (another kind) is not a twin');
    assert.deepEqual(m.warnings, ['w1', 'w2']);
    assert.equal(m.zeros_minus_poles, null);
    // a double zero found 1e-7 apart by two pieces is one point (its location is less sharp); simple zeros that far apart stay two
    const d = mergeAnswers([{ zeros: [{ at: [0, 0], order: 2 }, { at: [5, 0], order: 1 }] }, { zeros: [{ at: [1e-7, 0], order: 2 }, { at: [5 + 1e-7, 0], order: 1 }] }], 1e-9);
    assert.deepEqual(d.zeros.map((z) => z.order), [2, 1, 1]);
  });

  test('a fake core: every point found once, on a cut too; a failed piece is named, with what the others found', async () => {
    // points of an invented f (by construction): one on the cut x = 0.5 of a 2×2 grid, one at a corner of four cells
    const pts = [[0.5, 0.3], [0.5, 0.25], [-1, -0.5], [2.5, 1.2], [-1.5, 1.2]];
    const core = (contour) => Promise.resolve({ poles: pts.filter((p) => inside(contour, p)).map((at) => ({ at, order: 1, residue: [1, 0] })), zeros: [], essential: [], branch_points: [], removable: [], residue_at_infinity: [-5, 0], method: 'numerical', warnings: [] });
    const seen = [];
    const m = await searchInPieces(region, core, { grid: [2, 2], onPiece: (s) => seen.push(s) });
    assert.equal(m.poles.length, pts.length, JSON.stringify(m.poles));
    assert.deepEqual(m.pieces.grid, [2, 2]);
    assert.deepEqual(seen.map((s) => s.done), [0, 1, 2, 3, 4]);
    assert.ok(seen.every((s, i) => i === 0 || s.found >= seen[i - 1].found));
    assert.equal(seen[4].found, pts.length);
    assert.deepEqual(seen[4].kinds, { poles: pts.length, zeros: 0, other: 0 });
    let calls = 0;
    const failing = (contour) => (++calls === 3 ? Promise.resolve({ error: { code: 'budget_exhausted', message: 'the budget ran out' } }) : core(contour));
    const f = await searchInPieces(region, failing, { grid: [2, 2] });
    assert.equal(f.error.code, 'budget_exhausted');
    assert.match(f.error.message, /^the search of piece 3 of 4 \(x .*\) failed: the budget ran out \(the 2 pieces searched before it had found \d+ points/);
    // a point met on a piece's inner edge: that piece is searched again with a wider overlap
    let met = 0;
    const edgy = (contour) => (contour.corners[1][0] > 0.5 && contour.corners[1][0] < 0.6 && contour.corners[0][1] === -1 && met++ === 0 ? Promise.resolve({ error: { code: 'on_contour', message: 'on it' } }) : core(contour));
    const e = await searchInPieces(region, edgy, { grid: [2, 2] });
    assert.equal(met, 1);
    assert.equal(e.poles.length, pts.length);
    const stopped = await searchInPieces(region, core, { grid: [2, 2], stopped: () => true });
    assert.equal(stopped.error.code, 'cancelled');
  });
});

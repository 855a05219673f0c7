// A long singularities search in pieces, so that the page can say what it has found so far: a
// rectangle is cut into a grid of sub-rectangles that overlap a little (no piece has an edge where
// a neighbour's edge is, so a point on a cut line lies inside two pieces instead of on both
// contours), each piece is searched by the core on its own, and the answers are merged: the union
// of the points, a point found by two overlapping pieces kept once (same kind, closer than a tiny
// fraction of the region's size). The outer edges are the region's own, so no piece reaches
// outside it. DOM-free (unit-tested in node by tests/e2e/search-pieces.test.mjs).

/** A search that has not answered after this long (ms) is run again in pieces, to show a running
 *  count (pipeline.js searchWithProgress; window.residuary.options changes it). */
export const SPLIT_AFTER_MS = 1000;

/** The overlap of two neighbouring pieces on each side of a cut, as a fraction of a cell's width:
 *  not a round number, so the pieces' edges do not fall on round coordinates (gamma's poles). */
export const OVERLAP = 0.0371;
/** Pieces of a split search (about; the grid follows the region's aspect). */
export const SEARCH_PIECES = 16;

/** The grid [nx, ny] for a rectangle of width w and height h: near-square cells, nx·ny ≈ n. */
export function gridFor(w, h, n = SEARCH_PIECES) {
  const ratio = w > 0 && h > 0 ? w / h : 1;
  let nx = Math.max(1, Math.round(Math.sqrt(n * ratio)));
  nx = Math.min(nx, n);
  const ny = Math.max(1, Math.round(n / nx));
  return [nx, ny];
}

/** The pieces of rectangle `contour` ({shape: 'rectangle', corners}) on an nx × ny grid, each
 *  {contour, cell: [x0, x1, y0, y1] (the cell before the overlap), index}. `overlap` is the fraction
 *  of a cell's width (height) each piece reaches past an inner cut. */
export function splitRectangle(contour, nx, ny, overlap = OVERLAP) {
  const [[a, b], [c, d]] = contour.corners;
  const x0 = Math.min(a, c), x1 = Math.max(a, c), y0 = Math.min(b, d), y1 = Math.max(b, d);
  const dx = (x1 - x0) / nx, dy = (y1 - y0) / ny;
  const xs = Array.from({ length: nx + 1 }, (_, i) => (i === nx ? x1 : x0 + i * dx));
  const ys = Array.from({ length: ny + 1 }, (_, j) => (j === ny ? y1 : y0 + j * dy));
  const pieces = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const cell = [xs[i], xs[i + 1], ys[j], ys[j + 1]];
      const lo = [i === 0 ? x0 : xs[i] - overlap * dx, j === 0 ? y0 : ys[j] - overlap * dy];
      const hi = [i === nx - 1 ? x1 : xs[i + 1] + overlap * dx, j === ny - 1 ? y1 : ys[j + 1] + overlap * dy];
      pieces.push({ index: pieces.length, cell, contour: { shape: 'rectangle', corners: [lo, hi] } });
    }
  }
  return pieces;
}

/** The same piece with a wider overlap (after a point was met on one of its inner edges): each
 *  inner edge moves out by `factor` times the overlap, never past the region's own edges. */
export function widenPiece(piece, region, factor) {
  const [[a, b], [c, d]] = region.corners;
  const X0 = Math.min(a, c), X1 = Math.max(a, c), Y0 = Math.min(b, d), Y1 = Math.max(b, d);
  const [cx0, cx1, cy0, cy1] = piece.cell;
  const [[lx, ly], [hx, hy]] = piece.contour.corners;
  const grow = (edge, cellEdge, lo, hi, sign) => {
    if (edge === lo || edge === hi) return edge; // the region's own edge stays
    return Math.min(hi, Math.max(lo, cellEdge + sign * factor * Math.abs(edge - cellEdge)));
  };
  return Object.assign({}, piece, {
    contour: { shape: 'rectangle', corners: [[grow(lx, cx0, X0, X1, -1), grow(ly, cy0, Y0, Y1, -1)], [grow(hx, cx1, X0, X1, 1), grow(hy, cy1, Y0, Y1, 1)]] },
  });
}

const LISTS = ['poles', 'zeros', 'essential', 'branch_points', 'removable'];

/** The points of a singularities response by kind: {poles, zeros, other}. */
export function kindCounts(resp) {
  const n = (k) => (resp && Array.isArray(resp[k]) ? resp[k].length : 0);
  return { poles: n('poles'), zeros: n('zeros'), other: n('essential') + n('branch_points') + n('removable') };
}

/** The number of points in a singularities response (every list). */
export function pointCount(resp) {
  if (!resp || typeof resp !== 'object') return 0;
  return LISTS.reduce((n, k) => n + (Array.isArray(resp[k]) ? resp[k].length : 0), 0);
}

function atOf(p) { return Array.isArray(p) ? p : p && p.at; }

/** Merge the responses of the pieces (`answers`, one per piece, none an error) into one response
 *  of the contract's shape: every list the union of the pieces' lists, a point found twice (same
 *  kind and order, within `tol` of each other, 1000·tol for a multiple point) kept once, the one with the smaller error estimate; the
 *  residue at infinity and the residue-sum defect (properties of f, not of the region) from the
 *  first piece; `method` "numerical" if any piece's is; the warnings once each. `zeros_minus_poles`
 *  is null: each piece's count is for its own piece (the page counts the whole contour after). */
export function mergeAnswers(answers, tol) {
  const out = {};
  for (const key of LISTS) {
    const kept = [];
    for (const resp of answers) {
      for (const p of Array.isArray(resp[key]) ? resp[key] : []) {
        const at = atOf(p);
        if (!Array.isArray(at)) continue;
        // a multiple point is located less sharply (about ε^(1/m)): its copies may differ more
        const order = (x) => (x && Number.isInteger(x.order) ? x.order : 1);
        const twin = kept.findIndex((q) => order(q) === order(p) &&
          Math.hypot(atOf(q)[0] - at[0], atOf(q)[1] - at[1]) <= (order(p) > 1 ? 1e3 * tol : tol));
        if (twin < 0) kept.push(p);
        else {
          const e = (x) => (x && Number.isFinite(x.error_estimate) ? x.error_estimate : Infinity);
          if (e(p) < e(kept[twin])) kept[twin] = p;
        }
      }
    }
    out[key] = kept;
  }
  const first = answers[0] || {};
  out.residue_at_infinity = first.residue_at_infinity === undefined ? null : first.residue_at_infinity;
  if ('residue_sum_defect' in first) out.residue_sum_defect = first.residue_sum_defect;
  out.zeros_minus_poles = null;
  out.method = answers.some((r) => r.method === 'numerical') ? 'numerical' : (first.method || 'numerical');
  const warnings = [];
  for (const r of answers) for (const w of Array.isArray(r.warnings) ? r.warnings : []) if (!warnings.includes(String(w))) warnings.push(String(w));
  out.warnings = warnings;
  return out;
}

/** The tolerance two pieces' copies of one point agree within: 1e-8 of the region's size. */
export function twinTolerance(region) {
  const [[a, b], [c, d]] = region.corners;
  return 1e-8 * Math.max(Math.abs(c - a), Math.abs(d - b));
}

/** A piece in words, for a failure message: "piece 3 of 16 (x 0.5 … 1, y −1 … −0.5)". */
export function pieceWords(piece, total, fmt = (x) => String(x)) {
  const [[lx, ly], [hx, hy]] = piece.contour.corners;
  return `piece ${piece.index + 1} of ${total} (x ${fmt(lx)} … ${fmt(hx)}, y ${fmt(ly)} … ${fmt(hy)})`;
}

/** Search `region` (a rectangle) in pieces: `search(contour)` resolves with the core's response for
 *  one piece; `onPiece({done, total, found, kinds})` after each piece (found: the merged count so far, kinds:
 *  {poles, zeros, other});
 *  `stopped()` true drops the rest. Resolves with the merged response plus `pieces` ({grid, total,
 *  overlap}); or, when a piece fails (after two wider overlaps if it met a point on an inner edge),
 *  with that piece's error, its message naming the piece and what the other pieces had found. */
export async function searchInPieces(region, search, { onPiece = () => {}, stopped = () => false, grid = null, fmt } = {}) {
  const [[a, b], [c, d]] = region.corners;
  const [nx, ny] = grid || gridFor(Math.abs(c - a), Math.abs(d - b));
  const pieces = splitRectangle(region, nx, ny);
  const tol = twinTolerance(region);
  const answers = [];
  const info = { grid: [nx, ny], total: pieces.length, overlap: OVERLAP };
  onPiece({ done: 0, total: pieces.length, found: 0, kinds: { poles: 0, zeros: 0, other: 0 } });
  for (const piece of pieces) {
    let resp = await search(piece.contour);
    if (stopped()) return { error: { code: 'cancelled', message: 'cancelled', span: null }, pieces: info };
    for (let k = 0; k < 2 && resp && resp.error && resp.error.code === 'on_contour' && piece.contour.corners; k++) {
      const wider = widenPiece(piece, region, 1.618 * (k + 1));
      resp = await search(wider.contour);
      if (stopped()) return { error: { code: 'cancelled', message: 'cancelled', span: null }, pieces: info };
    }
    if (!resp || resp.error) {
      const e = (resp && resp.error) || { code: 'internal', message: 'no answer', span: null };
      const so = pointCount(mergeAnswers(answers, tol));
      return {
        error: { code: e.code, span: null,
          message: `the search of ${pieceWords(piece, pieces.length, fmt)} failed: ${e.message}` +
            (answers.length ? ` (the ${answers.length} piece${answers.length === 1 ? '' : 's'} searched before it had found ${so} point${so === 1 ? '' : 's'}; they are not shown, since the region was not searched whole)` : '') },
        pieces: Object.assign({ failed: piece.index }, info),
      };
    }
    answers.push(resp);
    const merged = mergeAnswers(answers, tol);
    onPiece({ done: answers.length, total: pieces.length, found: pointCount(merged), kinds: kindCounts(merged) });
  }
  return Object.assign(mergeAnswers(answers, tol), { pieces: info });
}

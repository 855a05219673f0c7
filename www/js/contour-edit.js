// Drawing and editing the contour on the plot: handles for each shape (a rectangle's corners
// and sides; a circle's centre and radius; an ellipse's centre, two semi-axis handles, the first
// of which also turns it; a polygon's vertices), dragging the outline, drawing a polygon vertex by
// vertex, inserting a vertex (double-click on an edge) and deleting one (double-click on it, or
// choose it and press Delete). plot/input.js routes a press here before it pans; the region editor
// (region.js) keeps the typed coordinates in step. While a contour is dragged, its integral three
// ways and the argument count follow live (createContourLive): one request in flight, the newest
// contour next, at most one per animation frame; the full search runs on release.
import { functionInput } from './params.js';
import { requestContourIntegral, requestArgumentCount, showContourIntegral, showArgumentCount } from './contour.js';
import { contourPath, segmentDistance, windingNumber, regionHandles, dragRegion } from './contour-geom.js';
import { regionSign } from './region.js';
import { toScreen, toPlane } from './plot/view.js';

const HANDLE_PX = 9;   // a press this close to a handle grabs it
const EDGE_PX = 6;     // ... this close to the outline grabs the outline
const CLOSE_PX = 10;   // drawing a polygon: a click this close to the first vertex closes it

const copyRegion = (x) => JSON.parse(JSON.stringify(x));

/** The editor over `page` (state, plot, regionEditor). Hooks: live() after each step of a drag,
 *  released() when a drag that moved ends, changed() after a discrete edit (a vertex added or
 *  removed, a polygon drawn). */
export function createContourEditor(page, hooks) {
  const { state } = page;
  const plot = () => page.plot;
  const ed = {
    drag: null,          // {grab, p0, start}
    drawing: null,       // {vertices: [[x, y]], hover: [x, y] | null} while a polygon is being drawn
    chosen: -1,          // the polygon vertex last pressed (Delete removes it)
  };
  const editable = () => !state.infinity && ['rect', 'circle', 'ellipse', 'polygon', 'half_disc', 'keyhole'].includes(state.region.mode);
  const screen = (p) => toScreen(plot(), p[0], p[1]);

  /** What is under the CSS pixel `pos`: a handle, an edge ({id: 'edge-k', at}), or null. */
  function hit(pos) {
    if (!editable()) return null;
    let best = null, bestD = HANDLE_PX;
    for (const h of regionHandles(state.region)) {
      const s = screen(h.at);
      const d = Math.hypot(s[0] - pos[0], s[1] - pos[1]);
      if (d < bestD || (d === bestD && h.id !== 'center')) { best = h; bestD = d; }
    }
    if (best) return best;
    const path = contourPath(page.regionEditor.contour(), 192).map(screen);
    const n = path.length;
    let edge = -1, edgeD = EDGE_PX;
    for (let k = 0; k < n; k++) {
      const d = segmentDistance(pos, path[k], path[(k + 1) % n]);
      if (d < edgeD) { edgeD = d; edge = k; }
    }
    if (edge < 0) return null;
    return { id: 'edge-' + edge, at: toPlane(plot(), pos[0], pos[1]) };
  }

  /** The plane point of the contour nearest the CSS pixel `pos`, when within EDGE_PX of it. */
  function nearestOnContour(pos) {
    if (!plot().region || state.infinity) return null;
    const path = contourPath(plot().region, 192).map(screen);
    let best = null, bestD = EDGE_PX;
    for (let k = 0; k < path.length; k++) {
      const a = path[k], b = path[(k + 1) % path.length];
      const dx = b[0] - a[0], dy = b[1] - a[1], len2 = dx * dx + dy * dy;
      const u = len2 > 0 ? Math.max(0, Math.min(1, ((pos[0] - a[0]) * dx + (pos[1] - a[1]) * dy) / len2)) : 0;
      const q = [a[0] + u * dx, a[1] + u * dy];
      const d = Math.hypot(q[0] - pos[0], q[1] - pos[1]);
      if (d < bestD) { bestD = d; best = q; }
    }
    return best ? toPlane(plot(), best[0], best[1]) : null;
  }

  function apply(region) {
    state.region = region;
    page.regionEditor.fill();
    plot().draw();
  }

  function finishDrawing() {
    const d = ed.drawing;
    ed.drawing = null;
    delete plot().canvas.dataset.contourEdit;
    if (!d || d.vertices.length < 3) { plot().draw(); return; }
    apply(Object.assign(copyRegion(state.region), { mode: 'polygon', polygon: d.vertices }));
    hooks.changed();
  }

  const editor = {
    /** A press at `pos` (CSS pixels): true when the editor takes it (no pan). */
    press(pos) {
      if (ed.drawing) return true;
      const g = hit(pos);
      if (!g) return false;
      ed.chosen = g.id.startsWith('vertex') ? Number(g.id.slice(7)) : -1;
      ed.drag = { grab: g, p0: toPlane(plot(), pos[0], pos[1]), start: copyRegion(state.region), moved: false };
      plot().canvas.dataset.contourDragging = 'true';
      return true;
    },
    /** The pointer moved to `pos` during a press the editor took. */
    move(pos) {
      const p = toPlane(plot(), pos[0], pos[1]);
      if (ed.drawing) { ed.drawing.hover = p; plot().draw(); return; }
      if (!ed.drag) return;
      ed.drag.moved = true;
      apply(dragRegion(ed.drag.start, ed.drag.grab, ed.drag.p0, p));
      hooks.live();
    },
    /** The press ended at `pos`; `moved`: the pointer travelled. */
    release(pos, moved) {
      if (ed.drawing) {
        if (moved) return;
        const d = ed.drawing;
        const first = d.vertices[0];
        if (first && d.vertices.length >= 3) {
          const s = screen(first);
          if (Math.hypot(s[0] - pos[0], s[1] - pos[1]) < CLOSE_PX) { finishDrawing(); return; }
        }
        d.vertices.push(toPlane(plot(), pos[0], pos[1]));
        plot().draw();
        return;
      }
      const drag = ed.drag;
      ed.drag = null;
      delete plot().canvas.dataset.contourDragging;
      if (drag && drag.moved) hooks.released();
      else plot().draw();
    },
    /** The pointer is over `pos` with nothing pressed: the cursor says what a press would do. */
    hover(pos) {
      const c = plot().canvas;
      if (ed.drawing) { ed.drawing.hover = pos ? toPlane(plot(), pos[0], pos[1]) : null; plot().draw(); return; }
      const g = pos ? hit(pos) : null;
      if (g) c.dataset.contourHover = 'handle'; else delete c.dataset.contourHover;
      // the point of the contour under the pointer (for views linked to γ, e.g. its image):
      // a 'contour-hover' event on the canvas, detail {at: [x, y]} or null
      const at = pos ? nearestOnContour(pos) : null;
      if (at || ed.hovered) c.dispatchEvent(new CustomEvent('contour-hover', { detail: at ? { at } : null }));
      ed.hovered = Boolean(at);
    },
    /** A double-click: on a polygon vertex deletes it, on a polygon edge inserts one. */
    doubleClick(pos) {
      if (ed.drawing) { finishDrawing(); return true; }
      if (state.region.mode !== 'polygon' || !editable()) return false;
      const g = hit(pos);
      if (!g) return false;
      const r = copyRegion(state.region);
      if (g.id.startsWith('vertex')) {
        if (r.polygon.length <= 3) return true;
        r.polygon.splice(Number(g.id.slice(7)), 1);
      } else if (g.id.startsWith('edge')) {
        const k = Number(g.id.slice(5)); // the path of a polygon is its vertices: edge k runs from vertex k to k + 1
        r.polygon.splice(k + 1, 0, g.at.slice());
      } else return false;
      ed.chosen = -1;
      apply(r);
      hooks.changed();
      return true;
    },
    /** A key on the plot: Delete / Backspace removes the chosen vertex, Enter closes a polygon being drawn, Escape stops drawing. */
    key(event) {
      if (ed.drawing && event.key === 'Enter') { finishDrawing(); return true; }
      if (ed.drawing && event.key === 'Escape') { ed.drawing = null; delete plot().canvas.dataset.contourEdit; plot().draw(); return true; }
      if ((event.key === 'Delete' || event.key === 'Backspace') && state.region.mode === 'polygon' && ed.chosen >= 0 && state.region.polygon.length > 3) {
        const r = copyRegion(state.region);
        r.polygon.splice(ed.chosen, 1);
        ed.chosen = -1;
        apply(r);
        hooks.changed();
        return true;
      }
      return false;
    },
    /** Start drawing a new polygon: each click adds a vertex. */
    startDrawing() {
      ed.drawing = { vertices: [], hover: null };
      plot().canvas.dataset.contourEdit = 'drawing';
      plot().canvas.focus();
      plot().draw();
    },
    get drawing() { return Boolean(ed.drawing); },
    get dragging() { return Boolean(ed.drag); },
    /** Draw the handles (and a polygon being drawn) over the plot. */
    drawOverlay(ctx) {
      if (ed.drawing) {
        const vs = ed.drawing.vertices.concat(ed.drawing.hover ? [ed.drawing.hover] : []).map(screen);
        ctx.save();
        ctx.beginPath();
        vs.forEach(([x, y], i) => (i ? ctx.lineTo(x, y) : ctx.moveTo(x, y)));
        ctx.setLineDash([5, 4]);
        for (const [w, c] of [[3, 'rgba(255,255,255,0.8)'], [1.25, 'rgba(15,15,15,0.9)']]) { ctx.lineWidth = w; ctx.strokeStyle = c; ctx.stroke(); }
        ctx.setLineDash([]);
        ed.drawing.vertices.forEach((p, i) => knob(ctx, screen(p), i === 0 ? 'turn' : 'size'));
        ctx.restore();
        return;
      }
      if (!editable()) return;
      for (const h of regionHandles(state.region)) {
        if (state.region.mode === 'ellipse' && h.id.startsWith('axis')) guide(ctx, screen([state.region.ellipse[0], state.region.ellipse[1]]), screen(h.at));
        knob(ctx, screen(h.at), h.look, ed.chosen >= 0 && h.id === 'vertex-' + ed.chosen);
      }
    },
  };
  return editor;
}

/** A handle: a white disc with a dark ring ('size'), a dark disc with a white ring ('turn': it also
 *  turns the shape), or a plus ('move'); none looks like a singularity marker (markers.js). */
function knob(ctx, [x, y], look, chosen) {
  ctx.save();
  if (look === 'move') {
    ctx.beginPath();
    ctx.moveTo(x - 7, y); ctx.lineTo(x + 7, y); ctx.moveTo(x, y - 7); ctx.lineTo(x, y + 7);
    ctx.lineWidth = 4; ctx.strokeStyle = 'rgba(255,255,255,0.9)'; ctx.stroke();
    ctx.lineWidth = 1.6; ctx.strokeStyle = '#111'; ctx.stroke();
  } else {
    ctx.beginPath();
    ctx.arc(x, y, chosen ? 6 : 4.5, 0, 2 * Math.PI);
    ctx.fillStyle = '#fff'; ctx.fill();
    ctx.lineWidth = chosen ? 2.5 : 1.5; ctx.strokeStyle = '#111'; ctx.stroke();
    if (look === 'turn') { ctx.beginPath(); ctx.arc(x, y, 4.5, 0, 2 * Math.PI); }
    if (look === 'turn') { ctx.lineWidth = 3; ctx.strokeStyle = '#fff'; ctx.stroke(); ctx.fillStyle = '#111'; ctx.fill(); }
  }
  ctx.restore();
}

/** A thin dotted line from the ellipse's centre to an axis handle. */
function guide(ctx, a, b) {
  ctx.save();
  ctx.setLineDash([2, 3]);
  ctx.lineWidth = 1;
  ctx.strokeStyle = 'rgba(15,15,15,0.8)';
  ctx.beginPath(); ctx.moveTo(a[0], a[1]); ctx.lineTo(b[0], b[1]); ctx.stroke();
  ctx.restore();
}

/** The live contour integral while the contour is dragged, over `page` (state, ui.ci, results).
 *  change(): the contour moved (coalesced to one request per animation frame, one in flight, the
 *  newest contour next; the argument count follows when no newer contour waits); stop(): the drag ended (answers still in flight are dropped: the full
 *  search takes over). performance marks residuary-contour-move-<n> (the change) and
 *  residuary-contour-live-<n> (its integral and count shown) time it (bench/contour-drag.mjs).
 *  page.liveContour keeps the last live answers while the drag lasts: {contour, sign, contour_integral,
 *  argument_count} (window.residuary results().contour_live). */
export function createContourLive(page, hooks) {
  const live = { serial: 0, active: false, busy: false, again: false, frame: 0 };
  async function loop() {
    live.frame = 0;
    if (live.busy) { live.again = true; return; }
    live.busy = true;
    do {
      live.again = false;
      const serial = live.serial;
      const contour = hooks.contour();
      const sign = regionSign(page.state.region);
      const base = functionInput(page.state);
      const ci = await requestContourIntegral(base, contour);
      if (!live.active) break;
      page.liveContour = { contour, sign, contour_integral: ci, argument_count: null };
      showContourIntegral(page.ui.ci, base.var, contour, false, ci, sign);
      page.ui.ci.count.textContent = '';
      page.ui.ci.status.textContent = 'Live while the contour moves; the full search runs when you let go.';
      page.ui.ci.box.dataset.state = 'live';
      performance.mark(`residuary-contour-live-${serial}`);
      // the argument count only while no newer contour waits (the integral comes first)
      if (live.again) continue;
      const count = await requestArgumentCount(base, contour);
      if (!live.active) break;
      if (live.serial === serial) { page.liveContour.argument_count = count; showArgumentCount(page.ui.ci, count); }
    } while (live.again && live.active);
    live.busy = false;
  }
  return {
    change() {
      live.active = true;
      live.serial++;
      performance.mark(`residuary-contour-move-${live.serial}`);
      if (!live.frame) live.frame = requestAnimationFrame(loop);
    },
    stop() {
      live.active = false;
      page.liveContour = null;
      if (live.frame) { cancelAnimationFrame(live.frame); live.frame = 0; }
    },
  };
}

/** The winding number of the page's contour about each point of `items` (contour-geom.js), or
 *  null on the contour; `sign` from regionSign. */
export function windings(items, contour, sign) {
  return items.map((it) => windingNumber(contour, it.at, sign));
}

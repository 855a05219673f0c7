// Pointer, wheel and keyboard input on the plot: drag to pan, pinch or wheel to
// zoom about the pointer, arrow keys and + − 0 from the keyboard; a click that
// did not move picks the nearest marker; the pointer's plane point goes to the readout.
// A marker the page lets move (hooks.onMarkerDragStart) is dragged instead of the view; then a
// press on the contour's handle or outline (hooks.onContourPress) edits the contour, never pans.
import { insidePlot, toPlane } from './view.js';
import { markerAt, markerScreenPoint } from './overlays.js';

/** Listen on `plot.canvas`. `viewChanged()` after every pan; `hooks.onPointer(point | null)`,
 *  `hooks.onMarkerClick(index)`; optional `hooks.onMarkerDragStart(index)` (true: move it),
 *  `hooks.onMarkerDrag(planePoint)`, `hooks.onMarkerDragEnd(moved)`, `hooks.onUndo()` (Ctrl+Z),
 *  `hooks.onMarkerNudge(index, [dx, dy])` (Alt + arrows on the selected marker; true: it moves) and
 *  `hooks.onMarkerNudgeEnd()` (Alt let go, or the plot loses focus).
 *  optional contour
 *  editing (contour-edit.js): `hooks.contourDrawing()` (a polygon is being drawn: every press is the
 *  editor's), `hooks.onContourPress(pos)` (true: the editor takes the press), `hooks.onContourMove(pos)`,
 *  `hooks.onContourRelease(pos, moved)`, `hooks.onContourHover(pos | null)`, `hooks.onDoubleClick(pos)`,
 *  `hooks.onKey(event)` (true: handled), `hooks.onCursorKey(event)` (the keyboard cursor; true: handled). Zooming goes through plot.zoom and plot.reset. */
export function attachInput(plot, viewChanged, hooks) {
  const canvas = plot.canvas;
  const pointers = new Map();
  let dragStart = null, pinchStart = null, moved = false;
  let markerDrag = null; // a marker being moved (hooks.onMarkerDragStart said yes): no panning
  let contourPress = null; // a press the contour editor took: {id, pos, moved}: no panning

  function localPos(event) {
    const r = canvas.getBoundingClientRect();
    return [event.clientX - r.left, event.clientY - r.top];
  }

  canvas.addEventListener('pointerdown', (event) => {
    const pos = localPos(event);
    if (!insidePlot(plot, pos) && pointers.size === 0) return;
    canvas.setPointerCapture(event.pointerId);
    moved = false;
    if (pointers.size === 0 && !markerDrag && !contourPress && hooks.contourDrawing && hooks.contourDrawing()) {
      contourPress = { id: event.pointerId, pos, moved: false };
      hooks.onContourPress(pos);
      return;
    }
    if (pointers.size === 0 && hooks.onMarkerDragStart) {
      const index = markerAt(plot, pos);
      if (index >= 0 && hooks.onMarkerDragStart(index)) {
        // the root keeps its offset from the pointer (a marker grabbed off centre does not jump)
        const at = markerScreenPoint(plot, plot.markers[index]) || pos;
        markerDrag = { id: event.pointerId, index, pos, offset: [at[0] - pos[0], at[1] - pos[1]] };
        return;
      }
    }
    if (markerDrag || contourPress) return;
    if (pointers.size === 0 && hooks.onContourPress && hooks.onContourPress(pos)) {
      contourPress = { id: event.pointerId, pos, moved: false };
      return;
    }
    pointers.set(event.pointerId, pos);
    if (pointers.size === 1) dragStart = { pos, cx: plot.cx, cy: plot.cy };
    if (pointers.size === 2) {
      const [a, b] = [...pointers.values()];
      pinchStart = { dist: Math.hypot(a[0] - b[0], a[1] - b[1]), scale: plot.scale };
    }
  });

  canvas.addEventListener('pointermove', (event) => {
    const pos = localPos(event);
    if (markerDrag && markerDrag.id === event.pointerId) {
      if (Math.abs(pos[0] - markerDrag.pos[0]) + Math.abs(pos[1] - markerDrag.pos[1]) > 2) markerDrag.moved = true;
      if (markerDrag.moved) hooks.onMarkerDrag(toPlane(plot, pos[0] + markerDrag.offset[0], pos[1] + markerDrag.offset[1]));
    } else if (contourPress && contourPress.id === event.pointerId) {
      if (Math.abs(pos[0] - contourPress.pos[0]) + Math.abs(pos[1] - contourPress.pos[1]) > 2) contourPress.moved = true;
      if (contourPress.moved || (hooks.contourDrawing && hooks.contourDrawing())) hooks.onContourMove(pos);
    } else if (!contourPress && pointers.size === 0 && !markerDrag) {
      if (hooks.contourDrawing && hooks.contourDrawing()) hooks.onContourMove(pos);
      else if (hooks.onContourHover) hooks.onContourHover(insidePlot(plot, pos) ? pos : null);
    }
    if (markerDrag || contourPress) {
      // nothing more: the view stays
    } else if (pointers.has(event.pointerId)) {
      pointers.set(event.pointerId, pos);
      if (pointers.size === 2 && pinchStart) {
        const [a, b] = [...pointers.values()];
        const d = Math.hypot(a[0] - b[0], a[1] - b[1]);
        if (d > 4) {
          const mid = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
          plot.zoom((pinchStart.scale * pinchStart.dist / d) / plot.scale, mid);
          moved = true;
        }
      } else if (dragStart) {
        const dx = pos[0] - dragStart.pos[0], dy = pos[1] - dragStart.pos[1];
        if (Math.abs(dx) + Math.abs(dy) > 3) moved = true;
        if (moved) {
          plot.cx = dragStart.cx - dx * plot.scale;
          plot.cy = dragStart.cy + dy * plot.scale;
          viewChanged();
        }
      }
    }
    hooks.onPointer && hooks.onPointer(insidePlot(plot, pos) ? toPlane(plot, pos[0], pos[1]) : null);
  });

  function endPointer(event) {
    if (contourPress && contourPress.id === event.pointerId) {
      const c = contourPress;
      contourPress = null;
      hooks.onContourRelease(localPos(event), c.moved || event.type !== 'pointerup');
      return;
    }
    if (markerDrag && markerDrag.id === event.pointerId) {
      const d = markerDrag;
      markerDrag = null;
      hooks.onMarkerDragEnd(d.moved);
      if (!d.moved && event.type === 'pointerup' && hooks.onMarkerClick) hooks.onMarkerClick(d.index);
      return;
    }
    if (!pointers.has(event.pointerId)) return;
    const pos = pointers.get(event.pointerId);
    pointers.delete(event.pointerId);
    if (pointers.size < 2) pinchStart = null;
    if (pointers.size === 1) {
      const [p] = [...pointers.values()];
      dragStart = { pos: p, cx: plot.cx, cy: plot.cy };
    }
    if (pointers.size === 0) {
      dragStart = null;
      if (!moved && event.type === 'pointerup') {
        const best = markerAt(plot, pos);
        if (best >= 0 && hooks.onMarkerClick) hooks.onMarkerClick(best);
      }
    }
  }
  canvas.addEventListener('pointerup', endPointer);
  canvas.addEventListener('pointercancel', endPointer);
  canvas.addEventListener('pointerleave', () => { if (pointers.size === 0) hooks.onPointer && hooks.onPointer(null); });

  canvas.addEventListener('wheel', (event) => {
    const pos = localPos(event);
    if (!insidePlot(plot, pos)) return;
    event.preventDefault();
    const unit = event.deltaMode === 1 ? 33 : event.deltaMode === 2 ? 400 : 1;
    const dy = Math.max(-300, Math.min(300, event.deltaY * unit));
    plot.zoom(Math.pow(1.0015, dy), pos);
  }, { passive: false });

  canvas.addEventListener('dblclick', (event) => {
    const pos = localPos(event);
    if (insidePlot(plot, pos) && hooks.onDoubleClick && hooks.onDoubleClick(pos)) event.preventDefault();
  });

  canvas.addEventListener('keydown', (event) => {
    const k = event.key;
    if (hooks.onKey && hooks.onKey(event)) { event.preventDefault(); return; }
    if ((event.ctrlKey || event.metaKey) && (k === 'z' || k === 'Z') && hooks.onUndo) {
      if (hooks.onUndo()) event.preventDefault();
      return;
    }
    // Alt + arrows move the selected pole or zero (4 pixels a press, Shift: 40), as a drag that
    // ends when Alt is let go
    if (event.altKey && k.startsWith('Arrow') && hooks.onMarkerNudge) {
      const step = (event.shiftKey ? 10 : 1) * 4 * plot.scale;
      const d = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, step], ArrowDown: [0, -step] }[k];
      if (d && hooks.onMarkerNudge(plot.selected, d)) { event.preventDefault(); return; }
    }
    // the keyboard cursor (plot-cursor.js): C shows it, then the arrows move it instead of panning
    if (hooks.onCursorKey && hooks.onCursorKey(event)) { event.preventDefault(); return; }
    const pan = 40 * plot.scale;
    if (k === '+' || k === '=') plot.zoom(1 / 1.25);
    else if (k === '-' || k === '_') plot.zoom(1.25);
    else if (k === 'ArrowLeft') { plot.cx -= pan; viewChanged(); }
    else if (k === 'ArrowRight') { plot.cx += pan; viewChanged(); }
    else if (k === 'ArrowUp') { plot.cy += pan; viewChanged(); }
    else if (k === 'ArrowDown') { plot.cy -= pan; viewChanged(); }
    else if (k === '0') plot.reset();
    else return;
    event.preventDefault();
  });
  const nudgeDone = () => { if (hooks.onMarkerNudgeEnd) hooks.onMarkerNudgeEnd(); };
  canvas.addEventListener('keyup', (event) => { if (event.key === 'Alt') nudgeDone(); });
  canvas.addEventListener('blur', nudgeDone);
}

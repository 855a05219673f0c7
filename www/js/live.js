// The live path: a pole or zero being dragged, a parameter slider moving. Every view follows the
// newest f: the coarse phase plot, the transfer section and the inverse transform when open. One
// request of each kind is in flight at a time; when it answers, the newest f (if it changed
// meanwhile) goes next, so stale states are skipped. The full search runs once on release
// (main.js). performance marks residuary-live-f/plot/transfer/inverse-<n> time it
// (bench/page-drag.mjs).
import { runHeavy } from './engine.js';
import { functionInput } from './params.js';
import { transferOpen, transferRequest, showTransfer } from './transfer.js';
import { inverseRequest, showInverse, currentInverseSpan } from './inverse.js';
import { liveTransferRequest, liveInverseRequest } from './pole-drag.js';

/** The live path over `page`; hooks: plot, pipeline, edited() (the state kept, the underline
 *  redrawn), trailsChanged(). */
export function createLivePath(page, hooks) {
  const { state, ui } = page;
  const { plot, pipeline } = hooks;
  const live = { serial: 0, stale: false, tfPrevious: null,
    plot: { name: 'plot', busy: false, again: false },
    tf: { name: 'transfer', busy: false, again: false },
    inv: { name: 'inverse', busy: false, again: false } };

  async function loop(slot, work) {
    if (slot.busy) { slot.again = true; return; }
    slot.busy = true;
    do {
      slot.again = false;
      const serial = live.serial;
      if (await work(serial) !== false) performance.mark(`residuary-live-${slot.name}-${serial}`);
    } while (slot.again);
    slot.busy = false;
  }

  /** One live transfer reading: the section's request on thinned grids (pole-drag.js); dropped
   *  when the change was completed meanwhile (the search's own reading wins). */
  async function transfer() {
    const previous = page.results && page.results.transfer_function;
    if (previous && !live.tfPrevious) live.tfPrevious = previous;
    const request = liveTransferRequest(transferRequest(functionInput(state), ui.tf), live.tfPrevious);
    const resp = await runHeavy(request);
    if (!live.stale) return false;
    showTransfer(ui.tf, request, resp);
    return true;
  }

  /** One live inverse transform (thinned times, pole-drag.js); dropped like transfer(). */
  async function inverse() {
    const base = functionInput(state);
    const span = currentInverseSpan(page, base.var);
    if (!span) return false;
    const request = liveInverseRequest(inverseRequest(base, span, page.found.items));
    const resp = await runHeavy(request);
    if (!live.stale) return false;
    showInverse(ui.inv, request, resp);
    return true;
  }

  return {
    /** f changed while dragging or sliding: every open view follows. */
    update() {
      live.serial++;
      performance.mark(`residuary-live-f-${live.serial}`);
      if (!live.stale) {
        // the table and every result no longer belong to f; the markers being moved stay
        const keep = plot.markers;
        pipeline.markStale();
        plot.markers = keep;
        live.stale = true;
        ui.findStatus.textContent = 'Changing: the search runs once you let go.';
      }
      hooks.edited();
      page.exprOk = true;
      loop(live.plot, () => plot.renderLive());
      if (transferOpen(page)) loop(live.tf, transfer);
      if (!ui.inv.box.hidden && ui.inv.box.open) loop(live.inv, inverse);
      hooks.trailsChanged();
    },
    /** The change was let go (or undone): the next live change starts from the search's reading. */
    committed() { live.tfPrevious = null; },
    /** Any completed change: answers of the live path still in flight are dropped. */
    settle() { live.stale = false; },
  };
}

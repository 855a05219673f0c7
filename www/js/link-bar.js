// The bar under the header that keeps a user's work one click away when a link replaced it
// ("Restore what you had", and back to the link's version), says when a link could not be read
// (the current work is kept), and when this browser could not keep the state (storage full).
import { $ } from './dom.js';

/** `adopt(state)` takes a whole page state over. Returns {opened(previous, linked), bad(reason), storage(outcome)}. */
export function attachLinkBar(adopt) {
  const bar = $('link-bar'), text = $('link-bar-text'), swap = $('link-bar-swap'), close = $('link-bar-close');
  const note = $('storage-note');
  const copy = (s) => JSON.parse(JSON.stringify(s));
  let previous = null, linked = null, showing = 'none';

  function show(what) {
    showing = what;
    bar.hidden = what === 'none';
    bar.dataset.state = what;
    swap.hidden = what !== 'opened' && what !== 'restored';
    if (what === 'opened') {
      text.textContent = 'Opened from a link: it replaced the work this browser had kept.';
      swap.textContent = 'Restore what you had';
    } else if (what === 'restored') {
      text.textContent = 'Restored what you had before the link.';
      swap.textContent = "Back to the link's version";
    }
  }
  swap.addEventListener('click', () => {
    if (showing === 'opened' && previous) { adopt(copy(previous)); show('restored'); }
    else if (showing === 'restored' && linked) { adopt(copy(linked)); show('opened'); }
  });
  close.addEventListener('click', () => show('none'));

  return {
    /** A link's state replaced `had` (a different state the page had). */
    opened(had, link) { previous = copy(had); linked = copy(link); show('opened'); },
    /** A link claimed a state but could not be read; the page kept its work. */
    bad(reason) {
      show('bad');
      text.textContent = `This link could not be read: ${reason}. Your current work is kept.`;
    },
    /** The outcome of a storage write ('ok', 'full', 'refused'). */
    storage(outcome) {
      note.hidden = outcome !== 'full';
      if (outcome === 'full') note.textContent = "This browser's storage for the page is full: the state was not kept here (the page address still carries it; copy the link to keep it).";
    },
    state: () => showing,
  };
}

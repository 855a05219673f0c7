// The region the search, the contour integral and the argument count use: the
// current view, a rectangle or a circle. Its contour, its description in words,
// and the editor (the mode buttons and the corner / centre-and-radius fields).
import { $ } from './dom.js';
import { fmtComplex, fmtReal } from './format.js';

/** The contour of the chosen region. `view` is [x0, x1, y0, y1]. */
export function regionContour(region, view) {
  if (region.mode === 'circle') {
    const [x, y, r] = region.circle;
    return { shape: 'circle', center: [x, y], radius: r };
  }
  const v = region.mode === 'rect' ? region.rect : view;
  return { shape: 'rectangle', corners: [[v[0], v[2]], [v[1], v[3]]] };
}

/** Why a region cannot be searched, or '' when it can. */
export function regionProblem(contour) {
  if (contour.shape === 'circle') {
    if (!(contour.radius > 0) || !contour.center.every(Number.isFinite)) return 'the circle needs a finite centre and a radius above 0';
  } else {
    const [[a, b], [c, d]] = contour.corners;
    if (![a, b, c, d].every(Number.isFinite) || a === c || b === d) return 'the rectangle needs two different finite corners';
  }
  return '';
}

/** The region in words, e.g. "Re s from −4 to 2, Im s from −3 to 3". */
export function regionWords(variable, contour) {
  if (contour.shape === 'circle') return `|${variable} − (${fmtComplex(contour.center, 4)})| < ${fmtReal(contour.radius, 4)}`;
  const [[a, b], [c, d]] = contour.corners;
  return `Re ${variable} from ${fmtReal(Math.min(a, c), 4)} to ${fmtReal(Math.max(a, c), 4)}, Im ${variable} from ${fmtReal(Math.min(b, d), 4)} to ${fmtReal(Math.max(b, d), 4)}`;
}

/** Wire the region editor. `page` holds the state (state.region, state.view, state.infinity),
 *  the z-plane view kept while the view around infinity is shown (page.lastZView) and the
 *  plot (which outlines the region). `changed()` runs after every edit. */
export function createRegionEditor(page, changed) {
  const state = page.state;
  const zView = () => (state.infinity ? page.lastZView : state.view);
  const editor = {
    /** The contour of the region as it stands. */
    contour: () => regionContour(state.region, zView()),
    /** Show the region in the fields and on the plot. */
    fill() {
      const v = state.region.mode === 'view' ? zView() : state.region.rect;
      const ids = ['rect-x0', 'rect-x1', 'rect-y0', 'rect-y1'];
      ids.forEach((id, k) => { if (document.activeElement !== $(id)) $(id).value = fmtReal(v[k], 6).replace(/−/g, '-'); });
      const [cx, cy, r] = state.region.circle;
      [['circ-x', cx], ['circ-y', cy], ['circ-r', r]].forEach(([id, x]) => { if (document.activeElement !== $(id)) $(id).value = x; });
      for (const radio of document.querySelectorAll('input[name=region-mode]')) radio.checked = radio.value === state.region.mode;
      $('region-rect').classList.toggle('dim', state.region.mode !== 'rect');
      $('region-circle').classList.toggle('dim', state.region.mode !== 'circle');
      page.plot.region = state.region.mode === 'view' ? null : editor.contour();
    },
  };
  const edited = () => { editor.fill(); changed(); };

  for (const radio of document.querySelectorAll('input[name=region-mode]')) {
    radio.addEventListener('change', () => {
      if (!radio.checked) return;
      if (radio.value === 'rect' && state.region.mode === 'view') state.region.rect = zView().slice();
      state.region.mode = radio.value;
      edited();
    });
  }
  const regionTyped = () => {
    const num = (id) => Number($(id).value);
    const rect = ['rect-x0', 'rect-x1', 'rect-y0', 'rect-y1'].map(num);
    if (rect.every(Number.isFinite)) {
      if (state.region.mode === 'view') state.region.mode = 'rect';
      if (state.region.mode === 'rect') state.region.rect = rect;
    }
    const circle = ['circ-x', 'circ-y', 'circ-r'].map(num);
    if (circle.every(Number.isFinite)) state.region.circle = circle;
    edited();
  };
  for (const id of ['rect-x0', 'rect-x1', 'rect-y0', 'rect-y1']) $(id).addEventListener('change', regionTyped);
  for (const id of ['circ-x', 'circ-y', 'circ-r']) $(id).addEventListener('change', () => {
    if (state.region.mode !== 'circle') state.region.mode = 'circle';
    regionTyped();
  });
  return editor;
}

// The colour key: the core's own colouring of f(z) = z on a small square, cut
// to a ring, with the argument marked around it; and the marker key.
import { plotOnce } from './engine.js';
import { el } from './dom.js';
import { markerIcon, KIND_WORDS } from './markers.js';
import { ink } from './scheme.js';

/** Draw the colour ring for `wheel` ("oklch" or "hsv") into `canvas` (150 × 150 drawing units). */
export function drawWheelKey(canvas, wheel) {
  // Drawn at the device resolution (crisp on high-DPI screens); layout in 150 × 150 CSS pixels.
  const dpr = Math.min(3, Math.max(1, Math.round(window.devicePixelRatio || 1)));
  canvas.width = 150 * dpr;
  canvas.height = 150 * dpr;
  const ctx = canvas.getContext('2d');
  const css = 150, ring = 96, size = ring * dpr, off = ((css - ring) / 2) * dpr;
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  ctx.clearRect(0, 0, canvas.width, canvas.height);
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  const result = plotOnce({ task: 'phase_plot', f: 'z', var: 'z', params: {}, view: [-1, 1, -1, 1], size: [size, size], options: { wheel }, format: 'rgba' });
  if (result.error || !result.rgba || result.rgba.length !== size * size * 4) {
    ctx.fillStyle = ink('chart-text');
    ctx.font = '11px system-ui, sans-serif';
    ctx.textAlign = 'center';
    ctx.fillText('key appears when', css / 2, css / 2 - 7);
    ctx.fillText('plotting works', css / 2, css / 2 + 8);
    return false;
  }
  const data = new Uint8ClampedArray(result.rgba);
  for (let j = 0; j < size; j++) {
    for (let i = 0; i < size; i++) {
      const x = (i + 0.5) / size * 2 - 1, y = 1 - (j + 0.5) / size * 2;
      const r = Math.hypot(x, y);
      if (r > 1 || r < 0.45) data[(j * size + i) * 4 + 3] = 0;
    }
  }
  ctx.putImageData(new ImageData(data, size, size), off, off);
  ctx.fillStyle = ink('plot-ink');
  ctx.font = '11px system-ui, sans-serif';
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  const c = css / 2, R = ring / 2 + 11;
  ctx.fillText('0', c + R, c);
  ctx.fillText('π/2', c, c - R + 2);
  ctx.fillText('±π', c - R - 2, c);
  ctx.fillText('−π/2', c, c + R - 2);
  ctx.fillText('arg f', c, c);
  const caption = canvas.closest('figure') && canvas.closest('figure').querySelector('figcaption');
  if (caption) caption.textContent = WHEEL_CAPTIONS[wheel] || WHEEL_CAPTIONS.oklch;
  canvas.setAttribute('aria-label', 'Colour key: ' + (WHEEL_CAPTIONS[wheel] || WHEEL_CAPTIONS.oklch));
  return true;
}

/** What each wheel's key says (the wheels: src/plot/colour_wheel.rs). */
const WHEEL_CAPTIONS = {
  ramp: 'Colour and lightness show arg f: dark blue just above −π, lighter through red to light yellow at π, where it jumps back to dark. Round a zero, counter-clockwise, it gets lighter; round a pole, darker. Brightness steps (with modulus lines) show |f|.',
  blue_yellow: 'Colour shows arg f on a blue–yellow loop: yellow at 0, light at π/2, blue at ±π, dark at −π/2. Brightness steps (with modulus lines) show |f|.',
  oklch: 'Colour shows arg f; brightness steps (with modulus lines) show |f|.',
  hsv: 'Colour shows arg f; brightness steps (with modulus lines) show |f|.',
};

/** List each marker shape with its meaning. */
export function fillMarkerKey(list) {
  list.textContent = '';
  for (const kind of ['pole', 'zero', 'essential', 'branch', 'removable']) {
    list.append(el('li', {}, markerIcon(kind), ' ' + KIND_WORDS[kind]));
  }
  list.append(el('li', { class: 'hint', text: 'A number beside a marker is its order. A dotted circle marks |z| = 1 when the variable is z.' }));
}

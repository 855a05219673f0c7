// Complex numbers as [re, im]: the little arithmetic the page does itself.

export function cAbs(z) { return Math.hypot(z[0], z[1]); }
export function cArg(z) { return Math.atan2(z[1], z[0]); }
export function cSub(a, b) { return [a[0] - b[0], a[1] - b[1]]; }
export function cInv(z) { const d = z[0] * z[0] + z[1] * z[1]; return [z[0] / d, -z[1] / d]; }
export function isFinitePair(z) {
  return Array.isArray(z) && z.length === 2 && Number.isFinite(z[0]) && Number.isFinite(z[1]);
}

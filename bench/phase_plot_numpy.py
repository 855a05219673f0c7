"""Vectorised numpy reference timing for the phase-plot benchmark.

Same grid (800x600 pixel centres on [-3,3]x[-2.25,2.25]) and the same three
functions as bench/cases.rs (used by the native and wasm benchmarks). Times
(a) function evaluation alone, (b) evaluation + arg + colour lookup through a
1024-entry table (the colouring step of a plain phase plot, no contour
lines). Prints Mpixel/s, median of REPS runs after one warm-up.

Run: python3 bench/phase_plot_numpy.py [--json]   (needs numpy)
--json prints one JSON object per function instead of the table.
"""
import json
import sys
import time

import numpy as np

W, H = 800, 600
X0, X1, Y0, Y1 = -3.0, 3.0, -2.25, 2.25
REPS = 7
LUT_SIZE = 1024


def grid():
    x = X0 + (np.arange(W) + 0.5) * (X1 - X0) / W
    y = Y1 - (np.arange(H) + 0.5) * (Y1 - Y0) / H
    return x[None, :] + 1j * y[:, None]


def lowpass2(z):
    """Second-order low-pass, wn = 2, zeta = 0.3: 4/(z^2 + 1.2 z + 4)."""
    return 4.0 / (z * z + 1.2 * z + 4.0)


def resonator(z):
    """exp(-z) sin(3z)/(z^2 + 1)."""
    return np.exp(-z) * np.sin(3.0 * z) / (z * z + 1.0)


def mixed(z):
    """sin(z)/(z^3 - 1) + exp(z) cos(z^2) + log(z + 2) sqrt(z^2 - 1)."""
    return (np.sin(z) / (z * z * z - 1.0) + np.exp(z) * np.cos(z * z)
            + np.log(z + 2.0) * np.sqrt(z * z - 1.0))


CASES = [("lowpass2", lowpass2), ("resonator", resonator), ("mixed", mixed)]


def hsv_lut():
    """Plain HSV hue table (any 1024x3 uint8 table times the same)."""
    h = (np.arange(LUT_SIZE) / LUT_SIZE + 0.5) % 1.0 * 6.0
    def f(n):
        k = (n + h) % 6.0
        return 1.0 - np.clip(np.minimum(k, 4.0 - k), 0.0, 1.0)
    return (np.stack([f(5.0), f(3.0), f(1.0)], axis=1) * 255).round().astype(np.uint8)


def colour(fz, lut):
    idx = np.rint((np.angle(fz) / (2 * np.pi) + 0.5) * LUT_SIZE).astype(np.int64) % LUT_SIZE
    rgb = lut[idx]
    rgba = np.empty(fz.shape + (4,), np.uint8)
    rgba[..., :3] = rgb
    rgba[..., 3] = 255
    bad = ~np.isfinite(fz)
    rgba[bad, :3] = 128
    return rgba


def rate(fn):
    """Mpixel/s from the median of REPS timed runs after one warm-up."""
    fn()
    times = []
    for _ in range(REPS):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    times.sort()
    return W * H / 1e6 / times[REPS // 2]


def main():
    as_json = "--json" in sys.argv[1:]
    z = grid()
    lut = hsv_lut()
    if not as_json:
        print(f"numpy {np.__version__}, {W}x{H}, median of {REPS} runs")
        print(f"{'function':<12} {'eval Mpx/s':>12} {'eval+colour Mpx/s':>18}")
    with np.errstate(all="ignore"):
        for name, f in CASES:
            e = rate(lambda: f(z))
            c = rate(lambda: colour(f(z), lut))
            if as_json:
                print(json.dumps({"numpy": np.__version__, "function": name,
                                  "eval_mpx_s": e, "plain_mpx_s": c}))
            else:
                print(f"{name:<12} {e:>12.2f} {c:>18.2f}")


if __name__ == "__main__":
    main()

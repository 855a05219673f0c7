"""Vectorised numpy reference timing for the phase-plot benchmark.

Same grid (800x600 pixel centres on [-3,3]x[-2.25,2.25]) and the same three
functions as bench/phase_plot_native.rs. Times (a) function evaluation alone,
(b) evaluation + arg + colour lookup through a 1024-entry table (the
colouring step of a plain phase plot, no contour lines). Prints Mpixel/s.

Run: python3 bench/phase_plot_numpy.py   (needs numpy)
"""
import time

import numpy as np

W, H = 800, 600
X0, X1, Y0, Y1 = -3.0, 3.0, -2.25, 2.25
REPS = 5
LUT_SIZE = 1024


def grid():
    x = X0 + (np.arange(W) + 0.5) * (X1 - X0) / W
    y = Y1 - (np.arange(H) + 0.5) * (Y1 - Y0) / H
    return x[None, :] + 1j * y[:, None]


def lowpass2(s):
    wn, zeta = 2.0, 0.3
    return wn * wn / (s * s + 2 * zeta * wn * s + wn * wn)


def essential(z):
    return np.exp(1 / z) * np.sin(z)


def mixed(z):
    return np.sin(z) / (z ** 3 - 1) + np.exp(z) * np.cos(z * z)


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
    fn()
    t = time.perf_counter()
    for _ in range(REPS):
        fn()
    return W * H * REPS / 1e6 / (time.perf_counter() - t)


def main():
    z = grid()
    lut = hsv_lut()
    print(f"numpy {np.__version__}, {W}x{H}, {REPS} repetitions")
    print(f"{'function':<36} {'eval Mpx/s':>12} {'eval+colour Mpx/s':>18}")
    with np.errstate(all="ignore"):
        for name, f in [("lowpass2 (rational)", lowpass2),
                        ("exp(1/z)*sin(z)", essential),
                        ("sin(z)/(z^3-1) + exp(z)cos(z^2)", mixed)]:
            e = rate(lambda: f(z))
            c = rate(lambda: colour(f(z), lut))
            print(f"{name:<36} {e:>12.2f} {c:>18.2f}")


if __name__ == "__main__":
    main()

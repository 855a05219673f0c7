"""Time general-purpose peers on the tasks residuary does, and record each
request, the peer's time and the peer's value in a JSON file that
bench/peers.rs reads to time residuary on the same requests.

Peers (general-purpose open-source libraries): scipy.signal.lfilter on a unit
impulse (inverse z of a rational X), scipy.signal.residue (partial fractions),
mpmath.quad on a parametrised circle (contour integral), mpmath.invertlaplace
with Talbot's contour (inverse Laplace), numpy.roots is in bench/roots.py.
mpmath runs at 15 digits (mp.dps = 15), like double precision.

Usage: python3 bench/peers.py [out.json]   (default: /tmp/residuary_peers_bench.json)
Then:  cargo run --release --example peers -- [out.json]
"""
import json
import sys
import time

import mpmath as mp
import numpy as np
import scipy
import scipy.signal as sig

path = sys.argv[1] if len(sys.argv) > 1 else "/tmp/residuary_peers_bench.json"
mp.mp.dps = 15


def best_of(work, reps):
    best, out = float("inf"), None
    for _ in range(reps):
        t0 = time.perf_counter()
        out = work()
        best = min(best, time.perf_counter() - t0)
    return best, out


def inverse_powers(c):
    """c0 + c1/z + ... as residuary expression text, each double exactly (repr)."""
    s = "(" + repr(float(c[0]))
    for k, v in enumerate(c[1:], start=1):
        s += (" - " if v < 0 else " + ") + repr(abs(float(v))) + "/z^%d" % k
    return s + ")"


cases = []

# Inverse z: impulse responses of a narrow resonator (poles 0.999 e^{±0.1i}), a
# 4th-order Butterworth low-pass, and a resonator whose response decays into
# subnormal numbers before n = 10 000 (slow arithmetic for both sides).
narrow = [1.0, -2 * 0.999 * np.cos(0.1), 0.999 ** 2]
for label, (b, a), counts in [
    ("narrow resonator, poles 0.999 e^{±0.1i}", ([1.0], narrow), (1000, 10000)),
    ("Butterworth order 4 (scipy.signal.butter(4, 0.2))", sig.butter(4, 0.2), (1000,)),
    ("resonator 1/(1 - 1.2/z + 0.72/z^2), subnormal tail", ([1.0], [1.0, -1.2, 0.72]), (10000,)),
]:
    for count in counts:
        impulse = np.zeros(count)
        impulse[0] = 1.0
        secs, y = best_of(lambda: sig.lfilter(b, a, impulse), 51)
        cases.append({
            "task": "inverse z", "label": f"{label}, n = 0..{count - 1}", "peer": "scipy.signal.lfilter",
            "request": {"task": "inverse_z", "X": inverse_powers(b) + "/" + inverse_powers(a), "n": list(range(count))},
            "peer_seconds": secs, "value_key": "x", "peer_value": [float(y[-1])], "index": count - 1,
        })

# Partial fractions: scipy.signal.residue of a degree-6 denominator with a double pole.
den = np.poly([-1.0, -1.0, -2.0, -0.5 + 2j, -0.5 - 2j, -3.0]).real
num = [1.0, 0.0, 3.0]
secs, (r, p, k) = best_of(lambda: sig.residue(num, den), 21)
cases.append({
    "task": "partial fractions", "label": "(s^2 + 3)/((s+1)^2 (s+2)(s^2+s+4.25)(s+3))", "peer": "scipy.signal.residue",
    "request": {"task": "partial_fractions", "f": "(s^2 + 3)/((s+1)^2*(s+2)*(s^2+s+4.25)*(s+3))", "var": "s"},
    "peer_seconds": secs,
})

# Contour integral: cos(z)/(z - 0.5)^2 on |z| = 1, = 2πi·(−sin 0.5) (residue of a double pole).
def circle_integral():
    g = lambda t: mp.cos(mp.expj(t)) / (mp.expj(t) - 0.5) ** 2 * 1j * mp.expj(t)
    return mp.quad(g, [0, mp.pi, 2 * mp.pi])
secs, v = best_of(circle_integral, 5)
cases.append({
    "task": "contour integral", "label": "cos(z)/(z - 0.5)^2 on |z| = 1", "peer": "mpmath.quad (15 digits) on the circle",
    "request": {"task": "contour_integral", "f": "cos(z)/(z - 0.5)^2", "contour": {"shape": "circle", "center": [0, 0], "radius": 1}},
    "peer_seconds": secs, "peer_value": [float(v.real), float(v.imag)],
})

# Inverse Laplace: 1/((s+1)(s+2)) at three times, f(t) = e^{-t} - e^{-2t}.
ts = [0.5, 1.0, 2.0]
secs, vals = best_of(lambda: [mp.invertlaplace(lambda s: 1 / ((s + 1) * (s + 2)), t, method="talbot") for t in ts], 5)
cases.append({
    "task": "inverse Laplace", "label": "1/((s+1)(s+2)) at t = 0.5, 1, 2", "peer": "mpmath.invertlaplace (Talbot, 15 digits)",
    "request": {"task": "inverse_laplace", "F": "1/((s+1)*(s+2))", "t": ts},
    "peer_seconds": secs, "value_key": "f", "peer_value": [float(vals[-1])], "index": 2,
})

for c in cases:
    print(f"{c['task']:<18} {c['label']:<60} {c['peer']:<42} {c['peer_seconds'] * 1e3:9.3f} ms")
with open(path, "w") as fh:
    json.dump({"scipy": scipy.__version__, "numpy": np.__version__, "mpmath": mp.__version__, "cases": cases}, fh)
print("wrote", path)

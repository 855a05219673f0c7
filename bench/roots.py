"""Time numpy.roots (companion-matrix eigenvalues) on random complex polynomials
and record the coefficients, timings and backward errors in a JSON file that
bench/roots.rs reads to time the Aberth–Ehrlich solver on the same input.

Usage: python3 bench/roots.py [out.json]   (default: /tmp/residuary_roots_bench.json)
Then:  cargo run --release --example roots -- [out.json]
Backward error: max over roots r of |p(r)| / sum_k |p_k| |r|^k.
"""
import json, sys, time
import numpy as np

path = sys.argv[1] if len(sys.argv) > 1 else "/tmp/residuary_roots_bench.json"


def backward_error(asc, roots):
    """max |p(r)|/sum|p_k||r|^k, via the reversed polynomial where |r| > 1 (no overflow)."""
    out = 0.0
    for r in roots:
        if abs(r) <= 1:
            desc, x = asc[::-1], r
        else:
            desc, x = asc, 1 / r
        out = max(out, abs(np.polyval(desc, x)) / np.polyval(np.abs(desc), abs(x)))
    return float(out)


rng = np.random.default_rng(20240601)
cases = []
for deg in (100, 500, 1000):
    c = rng.standard_normal(deg + 1) + 1j * rng.standard_normal(deg + 1)  # ascending
    desc = c[::-1]
    best = float("inf")
    for _ in range(3 if deg < 1000 else 1):
        t0 = time.perf_counter()
        r = np.roots(desc)
        best = min(best, time.perf_counter() - t0)
    be = backward_error(c, r)
    print(f"numpy.roots degree {deg:5d}: {best*1e3:9.2f} ms   backward error {be:.2e}")
    cases.append({"degree": deg, "coeffs": [[float(x.real), float(x.imag)] for x in c],
                  "numpy_seconds": best, "numpy_backward_error": be})
with open(path, "w") as fh:
    json.dump({"numpy": np.__version__, "cases": cases}, fh)
print("wrote", path)

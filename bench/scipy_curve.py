#!/usr/bin/env python3
"""Comparison for `npm run bench`: the same species H and S curves computed with
scipy.integrate.quad, cumulatively over the same grid (one quad per interval and species,
for Cp and Cp/T), from each segment's anchor. Needs python3 with scipy (Debian:
python3-scipy). Prints one JSON line: {"ms": ..., "h": [...last values...]} or a skip line."""
import json
import math
import sys
import time

try:
    from scipy.integrate import quad
except ImportError:
    print(json.dumps({"skip": "python3 with scipy not found (Debian: apt install python3-scipy)"}))
    sys.exit(0)

R = 8.314462618


def nasa_cp(a):
    return lambda T: R * (a[0] + T * (a[1] + T * (a[2] + T * (a[3] + T * a[4]))))


def main():
    data = json.load(open(sys.argv[1]))
    grid = data["grid"]
    t0 = time.perf_counter()
    out = []
    for sp in data["species"]:
        h = [0.0] * len(grid)
        s = [0.0] * len(grid)
        for seg in sp["segments"]:
            cp = nasa_cp(seg["coeffs"])
            cpt = lambda T, cp=cp: cp(T) / T
            idx = [i for i, T in enumerate(grid) if seg["lo"] <= T <= seg["hi"]]
            ta, ha, sa = seg["anchorK"], seg["hJ"], seg["sJ"]
            up = [i for i in idx if grid[i] >= ta]
            down = [i for i in reversed(idx) if grid[i] < ta]
            for chain, sign in ((up, 1), (down, -1)):
                prev, hh, ss = ta, ha, sa
                for i in chain:
                    T = grid[i]
                    a, b = (prev, T) if sign > 0 else (T, prev)
                    hh += sign * quad(cp, a, b, epsabs=0, epsrel=1e-13)[0]
                    ss += sign * quad(cpt, a, b, epsabs=0, epsrel=1e-13)[0]
                    h[i], s[i] = hh, ss
                    prev = T
        out.append({"h": h[:: max(1, len(grid) // 10)], "s": s[:: max(1, len(grid) // 10)]})
    ms = (time.perf_counter() - t0) * 1000
    print(json.dumps({"ms": ms, "samples": out}))


main()

"""Length of the 3-D segment model (fem/solid.py): how the factors and the far-field departure depend
on the distance between the feature and the end faces, on the same mesh sizes at the feature.

For the demo's keyseat end (cases/keyseat_end_3d.toml: d = 30 mm, 8 x 4 mm end-milled keyseat 36 mm
long, fillet 0.6 mm, centred, quarter model) and a 6 mm through cross hole in a 30 mm shaft (centred,
quarter model), the segment is made ``kl + 2 e d`` long for feature-to-end distances e (in diameters);
every length is meshed at one fineness (the sizes at the feature and on the plain bar are set in
diameters, so the local mesh is the same at every length) and solved once (the finest mesh of a study).
Prints per load and length: the factor, its change from the longest model's, and the far-field
departure three ways: on the raw element stress at the facet points within half a diameter of each
end, on the nodal-averaged stress (as :func:`fem.solid.solve_segment` reads it, ``far_field``), and
the raw one on the end face's rim alone (|z - end| < 0.05 d). Also the whole process's CPU seconds.
Asserts nothing (not part of pytest).

    python tests/benchmarks/bench_segment_length.py [fineness] [keyseat|hole|both] [e1,e2,...]
"""
from __future__ import annotations

import resource
import sys
import time

import numpy as np


def _cpu() -> float:
    me, kids = resource.getrusage(resource.RUSAGE_SELF), resource.getrusage(resource.RUSAGE_CHILDREN)
    return me.ru_utime + me.ru_stime + kids.ru_utime + kids.ru_stime


def _zone_departure(pts, mag, seg, nominal, load, width):
    """The far-field departure of fem.solid._far_field over |z - end| < width (fraction of nominal)."""
    r = np.hypot(pts[0], pts[1])
    worst = 0.0
    for end in (0.0, seg.length):
        near = (np.abs(pts[2] - end) < width) & (np.abs(r - seg.d / 2) < 1e-6 * seg.d)
        if not np.any(near):
            continue
        if load == "bending_x":
            ref = nominal * np.maximum(pts[1][near], 0) / (seg.d / 2)
        elif load == "bending_y":
            ref = nominal * np.maximum(pts[0][near], 0) / (seg.d / 2)
        else:
            ref = nominal
        worst = max(worst, float(np.max(np.abs(mag[near] - ref))) / nominal)
    return worst


def main():
    from compare.solve.segments import KEYS
    from fem import solid

    fineness = float(sys.argv[1]) if len(sys.argv) > 1 else 0.4
    which = sys.argv[2] if len(sys.argv) > 2 else "both"
    es = [float(v) for v in sys.argv[3].split(",")] if len(sys.argv) > 3 else [0.75, 1.0, 1.5, 2.0, 3.0]
    d = 0.030
    kinds = {"keyseat": 0.036, "hole": 0.006}
    for kind, span in kinds.items():
        if which not in (kind, "both"):
            continue
        rows = {}
        for e in es:
            L = span + 2 * e * d + 2e-6  # a micrometre over, so e = 0.75 passes the check
            if kind == "keyseat":
                f = solid.ProfileKeyseat(0.008, 0.004, L / 2 - span / 2, L / 2 + span / 2, 0.6e-3)
            else:
                f = solid.CrossHole(0.006, L / 2)
            seg = solid.Segment(d, L, (f,))
            c0, w0 = _cpu(), time.perf_counter()
            sm = solid.mesh_segment(seg, fineness=fineness, symmetry=solid.symmetry_of(seg))
            res = solid.solve_segment(sm, E=2.05e11, nu=0.29)
            rows[e] = {}
            for load, r in res.items():
                raw = solid.stress_measure(r.stress, load)
                rows[e][load] = (r.factor, _zone_departure(r.points, raw, seg, r.nominal, load, 0.5 * d),
                                 r.far_field, _zone_departure(r.points, raw, seg, r.nominal, load, 0.05 * d),
                                 r.dofs)
            print(f"{kind} e = {e:g} d (length {L * 1e3:.1f} mm): {r.dofs} unknowns, "
                  f"CPU {_cpu() - c0:.0f} s, wall {time.perf_counter() - w0:.0f} s", flush=True)
        ref = rows[max(es)]
        print(f"\n{kind}, fineness {fineness:g}, quarter model; departures in % of nominal "
              "(raw = element values, nodal = nodal-averaged as the solver reads it, rim = raw at the end face)")
        for load in solid.LOADS:
            print(f"  {KEYS[load]}")
            for e in es:
                k, far, nod, rim, n = rows[e][load]
                print(f"    e {e:4g} d: factor {k:.4f} ({100 * (k / ref[load][0] - 1):+.2f} % vs e {max(es):g} d)  "
                      f"departure raw {100 * far:5.1f} %  nodal {100 * nod:5.1f} %  rim {100 * rim:5.1f} %")
        print(flush=True)
    print(f"whole process CPU {_cpu():.0f} s")


if __name__ == "__main__":
    main()

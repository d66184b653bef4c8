"""3-D segment accuracy benchmark (fem/solid.py, compare/solve/segments.py): the demo's keyseat end
(cases/keyseat_end_3d.toml: d = 30 mm, 8 x 4 mm end-milled keyseat, 36 mm long, bottom fillet given
on the command line, 0.6 mm by default) in a 126 mm segment (the demo's and the defaults' length:
the keyseat's span plus 3 d, compare.case.segment.MARGIN, so 1.5 d from each end face) studied on
three similar meshes at one fineness, every load, on the model the keyseat's mirror symmetry allows
(the quarter: x >= 0, z >= length/2) unless told otherwise; ``local`` divides the feature's sizes
further (the plain bar keeps its own).

Prints the whole process's CPU seconds (resource.getrusage: this process and its children, both
cores counted), wall seconds, peak resident memory, the unknowns of the three meshes and each factor
with its three meshes' values, its estimate (GCI) and where its peak sits, then whether every estimate
is below the 1 % of issue 21. Asserts nothing (not part of pytest). Measured figures (fineness
0.27-0.46, and the sizing changes tried): DEVELOPERS.md, "3-D keyseat end at 1 %".

    python tests/benchmarks/bench_segment_accuracy.py [fineness] [fillet in mm] [local] [symmetry 0|1|2] [ball=D,R] [similar=0|1]

``ball=D,R`` sets ``fem.solid.PEAK_BALL`` = (D, R) for the run: balls of radius R fillet radii at the
keyseat's predicted peak places (``fem.solid.peak_points``) holding the peak size / D on each mesh
(``ball=none``: no balls); ``similar=1`` sets ``fem.solid.SIMILAR`` (graded zones similar too).
"""
from __future__ import annotations

import resource
import sys
import time


def _cpu() -> float:
    me, kids = resource.getrusage(resource.RUSAGE_SELF), resource.getrusage(resource.RUSAGE_CHILDREN)
    return me.ru_utime + me.ru_stime + kids.ru_utime + kids.ru_stime


def main():
    w0 = time.perf_counter()
    from compare.solve.segments import study_segment
    from fem import solid

    argv = [a for a in sys.argv if "=" not in a]
    for a in sys.argv[1:]:
        if a.startswith("ball="):
            v = a.split("=", 1)[1]
            solid.PEAK_BALL = None if v == "none" else tuple(float(x) for x in v.split(","))
        if a.startswith("similar="):
            solid.SIMILAR = a.split("=", 1)[1] == "1"
    sys.argv = argv
    fineness = float(sys.argv[1]) if len(sys.argv) > 1 else 0.3
    fillet = (float(sys.argv[2]) if len(sys.argv) > 2 else 0.6) * 1e-3
    d, kl = 0.030, 0.036
    L = kl + 3 * d  # the demo's and the defaults' length (span + MARGIN d)
    local = float(sys.argv[3]) if len(sys.argv) > 3 else 1.0
    seg = solid.Segment(d, L, (solid.ProfileKeyseat(0.008, 0.004, L / 2 - kl / 2, L / 2 + kl / 2, fillet),))
    symmetry = int(sys.argv[4]) if len(sys.argv) > 4 else solid.symmetry_of(seg)
    st = study_segment(seg, fineness=fineness, E=2.05e11, nu=0.29, local=local, symmetry=symmetry)
    cpu, wall = _cpu(), time.perf_counter() - w0
    mem = max(resource.getrusage(resource.RUSAGE_SELF).ru_maxrss,
              resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss) / 1024**2
    model = ("whole segment", "half model (x >= 0)", "quarter model (x >= 0, z >= length/2)")[symmetry]
    print(f"keyseat end: d 30 mm, 8 x 4 mm, fillet {fillet * 1e3:g} mm, fineness {fineness:g}, local {local:g}, {model}, "
          f"peak balls {solid.PEAK_BALL}, similar {solid.SIMILAR}")
    print(f"feature edge lengths {', '.join('-' if x is None else f'{x * 1e3:.3f}' for x in st.feature_sizes)} mm, measured ratios {st.ratios}")
    print(f"unknowns {st.dofs} (of the model solved); whole process CPU {cpu:.0f} s, wall {wall:.0f} s, peak memory {mem:.2f} GB")
    ok = True
    for key, v in st.values.items():
        e = st.estimates[key]
        g = e["gci"]
        ok = ok and g is not None and g <= 0.01
        vals = ", ".join(f"{x:.4f}" for x in e["values"])
        print(f"  {key:13s} {v:.4f}  meshes [{vals}]  GCI {'-' if g is None else f'{100 * g:.2f} %'}  "
              f"({e['status']})  peak at (x, y, z) = ({', '.join(f'{c * 1e3:.2f}' for c in st.peaks[key]['at'])}) mm")
    print("every factor within 1 %" if ok else "1 % NOT reached at this fineness")


if __name__ == "__main__":
    main()

"""3-D keyseat end by a submodel (fem/submodel.py, compare/solve/segments.py study_submodel): the demo
keyseat (d = 30 mm, 8 x 4 mm end-milled keyseat, 36 mm long, centred in a 90 mm segment, bottom fillet
0.6 mm by default) on the quarter model at one fineness (and every size x1.4), and a box round the
keyseat's end z = z1 meshed at three feature sizes (x1.96, x1.4, x1) driven by the finer segment mesh,
the finest also by the coarser one.

Prints the whole process's CPU seconds (this process and its children, both cores counted), wall
seconds, peak resident memory, the unknowns, and per load the submodel's three values, its GCI, the
segment mesh's effect, their sum, the peak's place and the segment model's factor outside the box.
Asserts nothing (not part of pytest).

    python tests/benchmarks/bench_segment_submodel.py [size in mm] [margin in mm] [fineness] [local] [fillet in mm]
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
    from compare.solve.segments import study_submodel
    from fem import solid, submodel

    arg = [float(a) for a in sys.argv[1:]]
    size = (arg[0] if len(arg) > 0 else 0.2) * 1e-3
    margin = (arg[1] if len(arg) > 1 else 8.0) * 1e-3
    fineness = arg[2] if len(arg) > 2 else 0.3
    local = arg[3] if len(arg) > 3 else 1.0
    fillet = (arg[4] if len(arg) > 4 else 0.6) * 1e-3
    d, L, kl = 0.030, 0.090, 0.036
    f = solid.ProfileKeyseat(0.008, 0.004, L / 2 - kl / 2, L / 2 + kl / 2, fillet)
    seg = solid.Segment(d, L, (f,))
    box = submodel.keyseat_end_box(seg, f, margin, symmetry=2)
    st = study_submodel(seg, box, size, fineness=fineness, E=2.05e11, nu=0.29, local=local, symmetry=2)
    cpu, wall = _cpu(), time.perf_counter() - w0
    mem = max(resource.getrusage(resource.RUSAGE_SELF).ru_maxrss,
              resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss) / 1024**2
    print(f"keyseat end: d 30 mm, 8 x 4 mm, fillet {fillet * 1e3:g} mm; quarter model fineness {fineness:g}, local {local:g}; "
          f"submodel size {size * 1e3:g} mm, margin {margin * 1e3:g} mm, box (mm) {[round(v * 1e3, 2) for v in box]}")
    print(f"unknowns: segment {st.global_dofs} (coarser, finer), submodel {st.dofs}; whole process CPU {cpu:.0f} s, "
          f"wall {wall:.0f} s, peak memory {mem:.2f} GB")
    ok = True
    for key, v in st.values.items():
        e = st.estimates[key]
        g, t = e["gci"], e["total"]
        governs = v >= st.outside[key]
        ok = ok and (t is not None and t <= 0.01 or not governs)
        vals = ", ".join(f"{x:.4f}" for x in e["values"])
        print(f"  {key:13s} {v:.4f}  submodels [{vals}]  GCI {'-' if g is None else f'{100 * g:.2f} %'} ({e['status']}); "
              f"segment mesh effect {100 * e['global_effect']:.2f} % ({e['global_values'][0]:.4f} driven by the coarser); "
              f"total {'-' if t is None else f'{100 * t:.2f} %'}; peak at ({', '.join(f'{c * 1e3:.2f}' for c in st.peaks[key])}) mm; "
              f"segment model outside the box {st.outside[key]:.4f}{'' if governs else ' (larger: the box does not hold this peak)'}")
    print("every governing factor within 1 %" if ok else "1 % NOT reached")


if __name__ == "__main__":
    main()

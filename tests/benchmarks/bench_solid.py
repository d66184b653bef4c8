"""3-D segment benchmark (fem/solid.py, compare/solve/segments.py): one end-milled keyseat end,
the three-mesh study of Kt (tension, bending in two planes) and Kts, at rising fineness until every
GCI is below 1 % or the budget ends. Prints CPU seconds (process time, both cores counted), wall
seconds, unknowns of the finest mesh and the peak resident memory. Asserts nothing (not part of
pytest).

    python tests/benchmarks/bench_solid.py [fillet/d] [max fineness]
"""
from __future__ import annotations

import resource
import sys
import time

from classic.keys import metric_parallel_key
from compare.solve.segments import study_segment
from fem import solid


def main():
    d = 0.03
    fillet = float(sys.argv[1]) * d if len(sys.argv) > 1 else 0.02 * d
    top = float(sys.argv[2]) if len(sys.argv) > 2 else 2.0
    k = metric_parallel_key(d)
    seg = solid.Segment(d, 3.0 * d, (solid.ProfileKeyseat(k["width"], k["depth"], 0.75 * d, 2.25 * d, fillet),))
    print(f"keyseat end: d = {d * 1e3:g} mm, key {k['width'] * 1e3:g} x {k['depth'] * 1e3:g} mm "
          f"({k['source']}), bottom fillet {fillet * 1e3:.3g} mm")
    f = 0.5
    while f <= top + 1e-9:
        c0, w0 = time.process_time(), time.perf_counter()
        st = study_segment(seg, fineness=f)
        cpu, wall = time.process_time() - c0, time.perf_counter() - w0
        mem = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024**2
        gcis = {k_: st.estimates[k_]["gci"] for k_ in st.values}
        print(f"fineness {f:g}: unknowns {st.dofs}, CPU {cpu:.0f} s, wall {wall:.0f} s, peak memory {mem:.2f} GB")
        for k_, v in st.values.items():
            g = gcis[k_]
            print(f"   {k_:13s} {v:.4f}  GCI {'-' if g is None else f'{100 * g:.2f} %'}  "
                  f"{st.estimates[k_]['status']}  peak at z = {st.peaks[k_]['at'][2] * 1e3:.2f} mm")
        if all(g is not None and g < 0.01 for g in gcis.values()):
            print("every factor within 1 %")
            break
        f *= 1.4


if __name__ == "__main__":
    main()

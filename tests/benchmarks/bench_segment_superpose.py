"""Superposition of a 3-D segment's unit-load results for a station (compare/solve/segment_superpose.py):
the keyseat end of cases/fan_jackshaft_keyseat_end.toml (30 mm shaft, 8 x 4 mm keyseat, 0.6 mm bottom
fillet, 36 mm long) studied at a fineness, then the unit fields built and superposed for a standing
and a rotating shaft, and the pruned principal-stress scan (Tresca). Prints CPU and wall seconds of
each step, the surface points and the candidate points the pruning kept. Asserts nothing (not part of
pytest).

    python tests/benchmarks/bench_segment_superpose.py [fineness]
"""
from __future__ import annotations

import math
import sys
import time

import numpy as np

from compare.solve.segment_superpose import superpose, unit_fields
from compare.solve.segments import study_segment
from fem import solid


def timed(label, fn):
    c0, w0 = time.process_time(), time.perf_counter()
    out = fn()
    print(f"{label}: CPU {time.process_time() - c0:.2f} s, wall {time.perf_counter() - w0:.2f} s")
    return out


def main():
    f = float(sys.argv[1]) if len(sys.argv) > 1 else 0.3
    d, L = 0.03, 0.096
    seg = solid.Segment(d, L, (solid.ProfileKeyseat(0.008, 0.004, L / 2 - 0.018, L / 2 + 0.018, 0.0006),))
    st = timed(f"study at fineness {f:g}", lambda: study_segment(seg, fineness=f))
    print(f"  unknowns {st.dofs}")
    fl = timed("unit fields", lambda: unit_fields(st.finest, d, L, turn=0.0))
    print(f"  surface points {fl.points.shape[1]}, kept {int(fl.keep.sum())}")
    loads = (0.0, 48.0, 0.0, 60.0)
    timed("superpose, standing shaft", lambda: superpose(fl, *loads, rotating=False))
    sp = timed("superpose, rotating shaft (720 angles per turn)", lambda: superpose(fl, *loads, rotating=True))
    fro = lambda t: np.sqrt(np.einsum("ij...,ij...->...", t, t))  # noqa: E731
    tr = timed("Tresca over the turn (pruned by the Frobenius norm)",
               lambda: sp.worst(lambda p: p[..., 2] - p[..., 0], math.sqrt(2)))
    bound = math.sqrt(2) * (fro(sp.mean) + np.sqrt(fro(sp.A) ** 2 + fro(sp.B) ** 2))
    print(f"  Tresca {tr[0] / 1e6:.2f} MPa; points scanned {int((bound >= tr[0] * (1 - 1e-12)).sum())} of {len(sp.idx)}")
    tv = timed("Tresca over the turn (pruned by the von Mises bound)",
               lambda: sp.worst(lambda p: p[..., 2] - p[..., 0], 2 / math.sqrt(3), of="von_mises"))
    bound = 2 / math.sqrt(3) * sp.vm_bound
    print(f"  Tresca {tv[0] / 1e6:.2f} MPa; points scanned {int((bound >= tv[0] * (1 - 1e-12)).sum())} of {len(sp.idx)}")


if __name__ == "__main__":
    main()

"""Meridian-section solves of a shoulder and a U-groove: unknowns, mesh and solve times and the
factor on each fineness of the feature study, then the whole feature study (three loads, refined
until monotone or a limit) with its estimates and time. Prints figures; asserts nothing (not part of
pytest).

    python tests/benchmarks/bench_axisym.py
"""
from __future__ import annotations

import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from compare.solve.features import Feature, study_feature  # noqa: E402
from fem.axisym import LOADS, groove_profile, mesh_profile, shoulder_profile, solve_profile  # noqa: E402

D = 0.02


def main() -> None:
    for name, prof in (("shoulder D/d 1.5, r/d 0.05", shoulder_profile(D, 1.5 * D, 0.05 * D)),
                       ("U-groove D/d 1.5, r/d 0.05", groove_profile(1.5 * D, 0.25 * D, 0.05 * D))):
        print(name)
        for fineness in (1.0, 2.0, 4.0, 8.0):
            t0 = time.perf_counter()
            mm = mesh_profile(prof, fineness)
            tm = time.perf_counter() - t0
            row = [f"  fineness {fineness:>3}: mesh {tm:6.2f} s, {mm.mesh.t.shape[1]:>7} elements"]
            for load in LOADS:
                t1 = time.perf_counter()
                r = solve_profile(mm, load)
                row.append(f"{load} {r.dofs:>7} dofs {time.perf_counter() - t1:6.2f} s Kt {r.kt:.5f}")
            print(";  ".join(row))
    for name, f in (("shoulder D/d 1.5, r/d 0.05", Feature("shoulder", 0.1, D, 1.5 * D, 0.05 * D, "s")),
                    ("U-groove D/d 1.5, r/d 0.05", Feature("groove", 0.1, D, 1.5 * D, 0.05 * D, "g", depth=0.25 * D,
                                                          width=0.1 * D))):
        t0 = time.perf_counter()
        st = study_feature(f, 0.3)
        print(f"{name}: feature study {time.perf_counter() - t0:.1f} s")
        for load, r in st.items():
            print(f"  {load}: Kt {r['kt']:.5f}, fineness {r['fineness']}, {r['dofs']} unknowns on the finest, "
                  f"estimate {r['gci']:.2e} ({r['gci_kind']}, observed order {r['order']}), limited: {r['limited']}")


if __name__ == "__main__":
    main()

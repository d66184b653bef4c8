"""Torsion benchmark: time per stage, accuracy against a much finer reference, and the mesh needed
to reach 0.1 % on J and 1 % on the peak. Prints figures; asserts nothing (not part of pytest).

    python tests/benchmarks/bench_torsion.py
"""
from __future__ import annotations

import math
import time

from fem.geometry import Keyway, keyed_section, round_section
from fem.mesh import MeshOptions, mesh_section
from fem.properties import area_moments
from fem.torsion import solve_torsion


def run(section, fineness):
    t0 = time.perf_counter()
    sm = mesh_section(section, MeshOptions(fineness=fineness))
    t1 = time.perf_counter()
    pr = area_moments(sm)
    tr = solve_torsion(sm, pr.centroid)
    t2 = time.perf_counter()
    return sm, tr, dict(mesh=t1 - t0, total=t2 - t0, **tr.seconds)


def main():
    d = 0.03
    cases = {
        "round bar d = 30 mm": (round_section(d), math.pi * d**4 / 32, 16 / (math.pi * d**3)),
        "keyed d = 30 mm, 8 x 4 keyway, fillet 0.02 d": (keyed_section(d, [Keyway(0.008, 0.004, 0.02 * d)]), None, None),
    }
    for name, (sec, Jex, tex) in cases.items():
        if Jex is None:
            _, ref, _ = run(sec, 8.0)
            Jex, tex = ref.J_warping, ref.peak_per_torque
            src = f"reference: same model at fineness 8 ({ref.dofs} DOFs)"
        else:
            src = "reference: exact (πd⁴/32, 16T/πd³)"
        print(f"\n{name} — {src}")
        print(f"{'fineness':>8} {'DOFs':>7} {'mesh s':>7} {'asm s':>6} {'solve s':>7} {'warp s':>6} {'post s':>6} {'total s':>7} {'err J':>9} {'err peak':>9}")
        reached = None
        for f in (0.35, 0.5, 0.7, 1.0, 1.4, 2.0, 3.0):
            run(sec, f)  # warm-up (gmsh, imports)
            sm, tr, s = run(sec, f)
            eJ, et = tr.J / Jex - 1, tr.peak_per_torque / tex - 1
            print(f"{f:8.2f} {tr.dofs:7d} {s['mesh']:7.3f} {s['assemble']:6.3f} {s['solve_stress_function']:7.3f} "
                  f"{s['solve_warping']:6.3f} {s['boundary']:6.3f} {s['total']:7.3f} {eJ:9.1e} {et:9.1e}")
            if reached is None and abs(eJ) < 1e-3 and abs(et) < 1e-2:
                reached = (f, tr.dofs, s["total"])
        if reached:
            print(f"0.1 % on J and 1 % on the peak first reached at fineness {reached[0]}: {reached[1]} DOFs, {reached[2]:.3f} s")


if __name__ == "__main__":
    main()

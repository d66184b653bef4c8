"""Accuracy benchmark: time and DOFs to reach the requested accuracy, adaptive against uniform
refinement, and the effectivity of the error estimate (estimate / true error). Prints figures; asserts
nothing (not part of pytest).

    python tests/benchmarks/bench_accuracy.py
"""
from __future__ import annotations

import time
import warnings
from pathlib import Path

from compare.case.case import load_case
from compare.cli.cmd_verify import verify_case
from compare.solve.accuracy import estimates, refine_to_accuracy
from fem.geometry import Keyway, keyed_section
from fem.mesh import MeshOptions, mesh_section
from fem.properties import area_moments
from fem.torsion import solve_torsion

ROOT = Path(__file__).resolve().parents[2]
warnings.simplefilter("ignore")


def verification():
    print("Verification cases (target 0.1 % on peaks): adaptive run as `shaftcheck run` does it")
    print(f"{'case':<16} {'quantity':<16} {'DOFs':>7} {'seconds':>8} {'true error':>11} {'estimate':>10} {'effectivity':>11}")
    for f in sorted((ROOT / "cases" / "verification").glob("*.toml")):
        t0 = time.perf_counter()
        rows = verify_case(f)
        dt = time.perf_counter() - t0
        for r in rows:
            eff = r["estimated_error"] / r["relative_error"] if r["relative_error"] > 0 and r["estimated_error"] else float("nan")
            print(f"{r['case']:<16} {r['quantity']:<16} {r['dofs']:7d} {dt:8.2f} {r['relative_error']:11.2e} "
                  f"{r['estimated_error'] or float('nan'):10.2e} {eff:11.2f}")


def keyed():
    d = 0.03
    sec = keyed_section(d, [Keyway(0.008, 0.004, 0.02 * d)])
    sm = mesh_section(sec, MeshOptions(fineness=8.0))
    ref = solve_torsion(sm, area_moments(sm).centroid, warping=False)
    print(f"\nKeyed 30 mm shaft, 8 x 4 keyway, fillet 0.02 d: reference at fineness 8 ({ref.dofs} DOFs), "
          f"J {ref.J:.9e}, peak/T {ref.peak_per_torque:.7e}")

    def first_reaching(opts_for, label):
        for f in (0.5, 0.7, 1.0, 1.4, 2.0, 2.8, 4.0, 5.6, 8.0, 11.0):
            t0 = time.perf_counter()
            m = mesh_section(sec, opts_for(f))
            tr = solve_torsion(m, area_moments(m).centroid, warping=False)
            dt = time.perf_counter() - t0
            eJ, ep = abs(tr.J / ref.J - 1), abs(tr.peak_per_torque / ref.peak_per_torque - 1)
            if ep < 1e-3 and eJ < 1e-4:
                print(f"  {label:<44} fineness {f:5.1f}: {tr.dofs:7d} DOFs, {dt:6.2f} s, error J {eJ:.1e}, peak {ep:.1e}")
                return tr.dofs
        print(f"  {label:<44} not reached up to fineness {f}: there {tr.dofs} DOFs, error J {eJ:.1e}, peak {ep:.1e}")
        return -tr.dofs  # a lower bound on what it would need

    uni = first_reaching(lambda f: MeshOptions(fineness=f, small_arc=0.0, per_circle=12.0), "uniform refinement (one size everywhere)")
    grd = first_reaching(lambda f: MeshOptions(fineness=f), "uniform refinement of the graded default mesh")
    case = load_case(ROOT / "cases" / "conveyor_gear_seat.toml")
    case.section = sec
    case.material.poisson = None
    t0 = time.perf_counter()
    st = refine_to_accuracy(case, 1e-3, 400_000)
    dt = time.perf_counter() - t0
    fine = st.solutions[-1].torsion
    eJ, ep = abs(fine.J / ref.J - 1), abs(fine.peak_per_torque / ref.peak_per_torque - 1)
    est = estimates(st.solutions)
    print(f"  {'adaptive (recovery indicator) + study':<44} {fine.dofs:7d} DOFs on the finest of {[s.dofs for s in st.solutions]}, "
          f"{dt:.2f} s in all, error J {eJ:.1e}, peak {ep:.1e}")
    print(f"  estimate (GCI) J {est['J']['gci']:.1e} (effectivity {est['J']['gci'] / max(eJ, 1e-300):.1f}), "
          f"peak {est['tau_max']['gci']:.1e} (effectivity {est['tau_max']['gci'] / max(ep, 1e-300):.1f})")
    for name, n in (("uniform", uni), ("graded", grd)):
        if n:
            more = "more than " if n < 0 else ""
            print(f"  DOF ratio {name} / adaptive finest mesh: {more}{abs(n) / fine.dofs:.1f}")


if __name__ == "__main__":
    verification()
    keyed()

"""The designer's checklist on the demo countershaft without its station section checks: time of the
bearing lives and of the torsion model along the shaft (twist and the lowest three torsional
frequencies, round bars), and of the torsion model alone on a fine line. Prints figures; not a test."""
import time
from pathlib import Path

import numpy as np

from compare.case.case import load_case
from compare.checks.shaft_beam import solve_layout
from compare.checks.shaft_checklist import bearing_life, torsional
from fem.torsion_line import TorsionLine, natural_frequencies

ROOT = Path(__file__).resolve().parents[2]


def demo(repeat=5):
    case = load_case(ROOT / "cases" / "countershaft_layout.toml")
    lay = solve_layout(case.shaft, case.section, case.material)
    torsional(case.shaft, case, lay, [], [])  # warm-up
    t0 = time.perf_counter()
    for _ in range(repeat):
        bearing_life(case.shaft, lay)
        tor = torsional(case.shaft, case, lay, [], [])
    dt = (time.perf_counter() - t0) / repeat
    print(f"demo countershaft: {len(lay['z'])} nodes, {dt * 1e3:.1f} ms for bearing lives + torsion "
          f"(first torsional frequency {tor['frequencies']['values'][0]:.1f} rad/s)")


def line(n):
    z = np.linspace(0.0, 1.0, n + 1)
    t0 = time.perf_counter()
    natural_frequencies(TorsionLine(z, 1e4, 1e-3), [(0, 0.01), (n, 0.02)], count=3)
    print(f"torsion line, {n} elements (dense eigh): {(time.perf_counter() - t0) * 1e3:.1f} ms")


if __name__ == "__main__":
    demo()
    for n in (120, 500, 1000):
        line(n)

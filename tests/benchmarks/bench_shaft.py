"""Whole-shaft beam step (no station section checks): time of the layout solve for the demo
countershaft and for a long shaft with many loads and supports. Prints figures; not a test."""
import time
from pathlib import Path

from compare.case.case import load_case, parse_case
from compare.checks.shaft_beam import solve_layout

ROOT = Path(__file__).resolve().parents[2]


def timed(label, case, repeat=5):
    solve_layout(case.shaft, case.section, case.material)  # warm-up (imports, pint)
    t0 = time.perf_counter()
    for _ in range(repeat):
        r = solve_layout(case.shaft, case.section, case.material)
    dt = (time.perf_counter() - t0) / repeat
    print(f"{label}: {len(r['z']) - 1} beam elements, {dt * 1e3:.1f} ms per layout solve "
          f"(two static planes, Rayleigh, eigenvalues, diagrams)")


if __name__ == "__main__":
    timed("demo countershaft", load_case(ROOT / "cases" / "countershaft_layout.toml"))
    n = 8
    long = {"case": {"units": "mm-N-MPa"}, "material": {"elastic_modulus": "205 GPa", "poisson": 0.29},
            "shaft": {"length": 3000, "density": 7850, "supports": [{"at": 375 * i} for i in range(n + 1)],
                      "segments": [{"from": 0, "to": 3000, "diameter": 60}], "sections": [{"at": 100}],
                      "loads": [{"at": 187.5 + 375 * i, "force": [100, -2000], "mass": 10} for i in range(n)]}}
    timed("line shaft, 9 supports, 8 loads", parse_case(long))

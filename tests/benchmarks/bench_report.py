"""Report benchmark: time to draw the figures and write report.html, results.csv and the VTU fields
for the demo cases (the shaft layout's report of the whole shaft included), beside the time of the
analysis itself, and the size of report.html; then the whole process (`shaftcheck run`) of the layout
demo with and without the report. Prints figures; asserts nothing (not part of pytest).

    python tests/benchmarks/bench_report.py
"""
from __future__ import annotations

import subprocess
import sys
import tempfile
import time
from pathlib import Path

from compare.case.case import load_case
from compare.output.design_report import report_files
from compare.output.results import build_results
from compare.pipeline import analyse

ROOT = Path(__file__).resolve().parents[2]


def main() -> None:
    print(f"{'case':<26} {'analysis s':>10} {'report s':>9} {'figures':>8} {'report.html kB':>15}")
    for name in ("conveyor_gear_seat", "conveyor_fatigue", "custom_slotted_shaft", "countershaft_layout"):
        case = load_case(ROOT / "cases" / f"{name}.toml")
        t0 = time.perf_counter()
        a = analyse(case)
        res = build_results(a)
        t1 = time.perf_counter()
        files = report_files(a, res)
        t2 = time.perf_counter()
        nfig = sum(1 for k in files if k.endswith(".png"))
        print(f"{name:<26} {t1 - t0:>10.2f} {t2 - t1:>9.2f} {nfig:>8} {len(files['report.html'].encode()) / 1e3:>15.0f}")


    print("\nwhole process, countershaft_layout (wall clock, s):")
    for extra in ([], ["--no-report"]):
        with tempfile.TemporaryDirectory() as d:
            t0 = time.perf_counter()
            subprocess.run([sys.executable, "-m", "compare.cli", "run", str(ROOT / "cases" / "countershaft_layout.toml"),
                            "--out", str(Path(d) / "out"), "--quiet", "--no-vtu", *extra], check=True, cwd=ROOT)
            print(f"  {' '.join(extra) or 'with the report':<16} {time.perf_counter() - t0:8.1f}")


if __name__ == "__main__":
    main()

"""The fixed reference workload of the speed targets (prints; asserts nothing; not part of pytest).
Whole-process CPU seconds (user + system of the child process, imports included), the median of
REPEATS runs, printed beside the target. The machine is shared: compare CPU seconds, not wall
seconds, and run before and after a change alternately.

    python tests/benchmarks/bench_reference.py targets [REPEATS] [--compile]   # the workload against the targets
    python tests/benchmarks/bench_reference.py phases CASE [--no-report] [--compile]   # CPU shares of one run's phases

targets:
- gear-seat demo (cases/conveyor_gear_seat.toml) with --no-report, and with the report;
- splined pump shaft demo (cases/splined_pump_shaft.toml) with --no-report;
- countershaft layout demo (cases/countershaft_layout.toml) with --no-report;
- keyed-shaft sweep at the 1 % target (tests/benchmarks/sweep_case.toml, the keyseat fillet varied):
  CPU per variant on one worker, from two sweeps of different length (the difference over the
  difference in variants, so the start-up of the process and of Dask is not counted).
Bytecode: the children run with Python's bytecode cache in a directory of their own under the
temporary directory (PYTHONPYCACHEPREFIX; warmed by one untimed import first), as an installed
program runs; with ``--compile`` they run as this process does (where PYTHONDONTWRITEBYTECODE is
set, every run compiles the project's modules again: about 0.3 CPU s, measured).
Measured (issue 24, second pass; medians of five alternating runs each, warm bytecode cache, CPU s
before → after; details and the phase shares in docs/speed.md): gear seat --no-report 2.54 → 2.83
(the same code path; an alternating check of five pairs gave 2.94 → 2.85), with the report 5.23 →
6.03 (load), spline 19.30 → 12.84, countershaft layout 31.18 → 23.52, keyed sweep per variant
0.62 → 0.63. Phase shares before → after, spline: meshing 62 → 39 %, torsion 8 → 13 %, shear
functions 10 → 15 %, writing 7 → 12 %; countershaft: shoulder studies 77 → 72 %, stations 16 → 18 %;
gear seat: imports 21 → 19 %, meshing 29 → 30 %, study 58 → 59 %.
Fourth pass (the spline's root-fillet grading, fem.mesh.MeshOptions.spline_grading): spline
whole process 12.24 → 9.62 CPU s (medians of three alternating runs), finest mesh 64.8k → 45.0k
unknowns.
phases: one run under cProfile with a CPU-time clock; the share of imports, meshing, the linear
solves and the rest of the FE work, the accuracy study's bookkeeping, the checks, the report's
figures and the file writing (imports made later, such as matplotlib's, count in the phase that makes them). The profiler's own cost inflates Python-heavy phases (figures most).
"""
from __future__ import annotations

import os
import resource
import shutil
import statistics
import subprocess
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
CASES = ROOT / "cases"

#: (label, case, extra arguments, target CPU s): the issue's targets for the reference workload
WORKLOAD = [
    ("gear-seat demo, no report", "conveyor_gear_seat", ["--no-report"], 1.2),
    ("gear-seat demo, with report", "conveyor_gear_seat", [], 2.5),
    ("splined pump shaft, no report", "splined_pump_shaft", ["--no-report"], 3.5),
    ("countershaft layout, no report", "countershaft_layout", ["--no-report"], 4.0),
]
SWEEP_TARGET = 0.25  # CPU s of work per variant at the 1 % target
SWEEP_SHORT, SWEEP_LONG = 4, 12  # variants of the two sweeps whose difference gives the cost per variant


#: environment of the timed children (see the module docstring, 'Bytecode')
CHILD_ENV: dict | None = None


def _bytecode_cache() -> dict:
    env = dict(os.environ)
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    env["PYTHONPYCACHEPREFIX"] = str(Path(tempfile.gettempdir()) / "shaftcheck-bench-pycache")
    subprocess.run([sys.executable, "-c", "import compare.cli, compare.sweep, compare.output.figures"],
                   cwd=ROOT, env=env, capture_output=True)  # warm the cache, untimed
    return env


def _cpu(cmd: list[str]) -> tuple[float, int]:
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    p = subprocess.run(cmd, capture_output=True, text=True, cwd=ROOT, env=CHILD_ENV)
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    return (after.ru_utime + after.ru_stime) - (before.ru_utime + before.ru_stime), p.returncode


def _run_case(case: str, extra: list[str]) -> tuple[float, int]:
    out = Path(tempfile.mkdtemp()) / "o"
    try:
        return _cpu([sys.executable, "-m", "compare.cli", "run", str(CASES / f"{case}.toml"), "--out", str(out),
                     "--quiet", *extra])
    finally:
        shutil.rmtree(out.parent, ignore_errors=True)


def _run_sweep(n: int) -> tuple[float, int]:
    tmp = Path(tempfile.mkdtemp())
    try:
        case = tmp / "fillet.toml"
        case.write_text((ROOT / "tests" / "benchmarks" / "sweep_case.toml").read_text())
        return _cpu([sys.executable, "-m", "compare.cli", "sweep", str(case), "--vary",
                     f"section.keyways[0].fillet=0.2mm:1.2mm:{n}", "--out", str(tmp / "o"), "--quiet",
                     "--workers", "1"])
    finally:
        shutil.rmtree(tmp, ignore_errors=True)


def targets(repeats: int) -> None:
    print(f"{'workload':34s} {'median CPU s':>12s} {'runs':>24s} {'target':>7s}  exit")
    for label, case, extra, target in WORKLOAD:
        runs = [_run_case(case, extra) for _ in range(repeats)]
        cpu = [c for c, _ in runs]
        print(f"{label:34s} {statistics.median(cpu):12.2f} {' '.join(f'{c:.2f}' for c in cpu):>24s} "
              f"{target:7.2f}  {sorted({code for _, code in runs})}", flush=True)
    per = []
    for _ in range(repeats):
        (c1, e1), (c2, e2) = _run_sweep(SWEEP_SHORT), _run_sweep(SWEEP_LONG)
        per.append((c2 - c1) / (SWEEP_LONG - SWEEP_SHORT))
    print(f"{'keyed sweep, CPU s per variant':34s} {statistics.median(per):12.3f} "
          f"{' '.join(f'{c:.3f}' for c in per):>24s} {SWEEP_TARGET:7.2f}  [{e1}, {e2}]")


#: phase -> the functions (module, name, at the place where they are called) whose inclusive CPU time it is
PHASES = [
    ("meshing (gmsh, conversion, boundary offsets)", [("compare.solve.accuracy", "mesh_section")]),
    ("torsion (assembly, solve, peaks)", [("compare.solve.accuracy", "solve_torsion")]),
    ("warping function (final mesh of each step)", [("compare.solve.accuracy", "add_warping")]),
    ("shear functions", [("compare.solve.accuracy", "solve_shear")]),
    ("shear peaks (results and indicator)", [("compare.solve.accuracy", "shear_peak")]),
    ("adaptive indicator (shear peaks included)", [("compare.solve.accuracy", "indicator")]),
    ("study: refinement and every mesh (all of the above)", [("compare.pairs.analysis", "refine_to_accuracy")]),
    ("checks (combined stress, fatigue)", [("compare.pipeline", "combined_step")]),
    ("layout: shoulder and groove studies (meridian FE)", [("compare.pairs.feature_step", "study_feature")]),
    ("layout: beam, stations and their section runs", [("compare.pipeline", "layout_step")]),
    ("whole analysis (study, pairs, checks)", [("compare.cli.cmd_run", "analyse")]),
    ("report figures", [("compare.output.figures", "all_figures")]),
    ("writing the files (VTU, report text)", [("compare.cli.cmd_run", "write_outputs")]),
]

_PHASE_CHILD = r"""
import importlib, json, sys, time
c0 = time.process_time()
from compare.cli import main
imports = time.process_time() - c0
phases = json.loads(sys.argv[1])
spent = {}

def timed(label, fn):
    def wrapper(*a, **k):
        t = time.process_time()
        try:
            return fn(*a, **k)
        finally:
            spent[label] = spent.get(label, 0.0) + time.process_time() - t
    return wrapper

for label, places in phases:
    for mod, name in places:
        m = importlib.import_module(mod)
        setattr(m, name, timed(label, getattr(m, name)))
code = main(sys.argv[2:])
print(json.dumps(dict(imports=imports, spent=spent, total=time.process_time(), code=code)))
"""


def phases(case: str, extra: list[str]) -> None:
    """Inclusive CPU seconds of each phase of one run, by timers around the named functions (no
    profiler: its own cost would inflate the Python-heavy phases); a phase may contain another."""
    import json

    if not Path(case).is_file():
        sys.exit(f"phases: no case file {case!r} (give the case's path, e.g. cases/countershaft_layout.toml)")
    out = Path(tempfile.mkdtemp()) / "o"
    try:
        p = subprocess.run([sys.executable, "-c", _PHASE_CHILD, json.dumps(PHASES), "run", str(Path(case).resolve()),
                            "--out", str(out), "--quiet", *extra], cwd=ROOT, capture_output=True, text=True,
                           env=CHILD_ENV)
    finally:
        shutil.rmtree(out.parent, ignore_errors=True)
    lines = p.stdout.strip().splitlines()
    if p.returncode != 0 or not lines:
        sys.exit(f"phases: the run failed (exit {p.returncode}): {(p.stderr.strip().splitlines() or [''])[-1]}")
    r = json.loads(lines[-1])
    total = r["total"]
    print(f"{case} {' '.join(extra)}: {total:.2f} CPU s in the process (main() returned {r['code']})")
    print(f"  {'imports at start (import compare.cli)':52s} {r['imports']:6.2f} s {100 * r['imports'] / total:5.1f} %")
    for label, _ in PHASES:
        c = r["spent"].get(label, 0.0)
        print(f"  {label:52s} {c:6.2f} s {100 * c / total:5.1f} %")


if __name__ == "__main__":
    os.environ.setdefault("PYTHONHASHSEED", "0")
    argv = [a for a in sys.argv if a != "--compile"]
    if "--compile" not in sys.argv:
        CHILD_ENV = _bytecode_cache()
    what = argv[1] if len(argv) > 1 else "targets"
    if what == "targets":
        targets(int(argv[2]) if len(argv) > 2 else 3)
    elif what == "phases" and len(argv) > 2:
        phases(argv[2], argv[3:])
    else:
        sys.exit(__doc__)

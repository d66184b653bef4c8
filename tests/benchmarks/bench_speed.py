"""Speed and scale figures (prints; asserts nothing; not part of pytest). The machine is shared:
compare CPU seconds and ratios, not wall seconds.

    python tests/benchmarks/bench_speed.py demos                 # whole-process time of each demo case
    python tests/benchmarks/bench_speed.py large [N ...]         # torsion solve at N unknowns (default up to 1e6)
    python tests/benchmarks/bench_speed.py sweep [VARIANTS]      # fillet sweep on 1 and 2 workers and via --scheduler

demos: each demo case runs in a fresh process (`python -m compare.cli run CASE`), timed from the
process start (imports included); the same process then factorises and solves the final torsion
system once more (the 'bare solve'), and the ratio of the two is printed (goal: at most 3), with the
time of meshing alone for the study's three meshes and its ratio to the bare solve: a floor that no
run with the three-mesh study can go under.
large: a uniform mesh of the keyed 30 mm section at increasing fineness; wall time of mesh, assembly
and the stress-function solve, CPU time of the whole torsion step, peak memory of the process, and the exponent of a power-law fit of the
solve time against the unknowns (goal: 1M unknowns in 20 s and 4 GB, exponent at most 1.15).
sweep: VARIANTS values of the keyseat fillet (default 200) at accuracy 1 %, on a local cluster of one
worker, of two, and through --scheduler on a local scheduler with two `dask worker` processes.
"""
from __future__ import annotations

import json
import math
import os
import resource
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))  # runs from a checkout without the editable install
DEMOS = ["conveyor_gear_seat", "conveyor_fatigue", "custom_slotted_shaft", "pump_coupling_inch"]

_CHILD = r"""
import time, sys
t0 = time.perf_counter()
from compare.cli import main
code = main(["run", sys.argv[1], "--out", sys.argv[2], "--quiet"])
total = time.perf_counter() - t0
import json
import numpy as np, scipy.sparse.linalg as spla
from skfem import Basis, ElementTriP2
from compare.case.case import load_case
from compare.pipeline import analyse
from fem import forms
from fem.mesh import mesh_section
# the final torsion system of the same case (same mesh as the run's finest) solved bare, once
a = analyse(load_case(sys.argv[1]))
basis = Basis(a.mesh.mesh, ElementTriP2(), intorder=4)
K = forms.laplace.assemble(basis); f = forms.prandtl_load.assemble(basis)
from skfem import condense
Kc, fc, _, _ = condense(K, f, D=basis.get_dofs())
t1 = time.perf_counter()
spla.splu(Kc.tocsc(), permc_spec="MMD_AT_PLUS_A", diag_pivot_thresh=0.0, options=dict(SymmetricMode=True)).solve(fc)
bare = time.perf_counter() - t1
# meshing alone (gmsh, conversion, boundary offsets) of the study's three meshes, as the run made them
mesh3 = sum(sol.mesh.seconds for sol in a.study.solutions[-3:])
print(json.dumps(dict(code=code, total=total, bare=bare, dofs=int(basis.N), mesh3=mesh3)))
"""


def demos():
    print(f"{'case':24s} {'wall s':>7s} {'CPU s':>7s} {'unknowns':>9s} {'bare solve s':>12s} {'ratio':>7s} "
          f"{'3 meshes s':>10s} {'/ bare':>7s}")
    for name in DEMOS:
        with tempfile.TemporaryDirectory() as tmp:
            before = resource.getrusage(resource.RUSAGE_CHILDREN)
            t0 = time.perf_counter()
            p = subprocess.run([sys.executable, "-c", _CHILD, str(ROOT / "cases" / f"{name}.toml"), str(Path(tmp) / "o")],
                               capture_output=True, text=True, cwd=ROOT)
            after = resource.getrusage(resource.RUSAGE_CHILDREN)
            wall = time.perf_counter() - t0
        if p.returncode != 0:
            print(f"{name:24s} failed: {p.stderr.strip().splitlines()[-1:]}")
            continue
        r = json.loads(p.stdout.strip().splitlines()[-1])
        cpu = (after.ru_utime + after.ru_stime) - (before.ru_utime + before.ru_stime)
        print(f"{name:24s} {r['total']:7.2f} {cpu:7.2f} {r['dofs']:9d} {r['bare']:12.3f} {r['total'] / r['bare']:7.1f} "
              f"{r['mesh3']:10.2f} {r['mesh3'] / r['bare']:7.1f}   (exit {r['code']}; CPU s covers the run and the bare re-solve)")


def large(sizes):
    import numpy as np

    from fem.geometry import Keyway, keyed_section
    from fem.linalg import DIRECT_LIMIT
    from fem.mesh import MeshOptions, mesh_section
    from fem.properties import area_moments
    from fem.torsion import solve_torsion

    sec = keyed_section(0.03, [Keyway(width=0.008, depth=0.004, fillet=0.0006)])
    pilot = mesh_section(sec, MeshOptions(fineness=2.0))
    per_f2 = pilot.mesh.doflocs.shape[1] / 2.0**2  # unknowns per fineness², recalibrated on every mesh
    pts = []
    print(f"{'unknowns':>9s} {'mesh s':>7s} {'assemble s':>10s} {'solve s':>8s} {'solver':>8s} {'torsion CPU s':>13s} "
          f"{'peak RSS GB':>11s}")
    for target in sizes:
        fineness = math.sqrt(target / per_f2)
        t0 = time.perf_counter()
        sm = mesh_section(sec, MeshOptions(fineness=fineness))
        t1 = time.perf_counter()
        c0 = time.process_time()
        tr = solve_torsion(sm, area_moments(sm).centroid, warping=False)
        cpu = time.process_time() - c0  # the whole torsion step (assembly, solve, boundary), all threads
        rss = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1e6  # kB -> GB (Linux)
        s = tr.seconds
        solver = "direct" if tr.dofs <= DIRECT_LIMIT else "AMG+CG"
        print(f"{tr.dofs:9d} {t1 - t0:7.1f} {s['assemble']:10.2f} {s['solve_stress_function']:8.2f} {solver:>8s} {cpu:13.1f} {rss:11.2f}",
              flush=True)
        pts.append((tr.dofs, s["solve_stress_function"], solver))
        per_f2 = sm.mesh.doflocs.shape[1] / fineness**2
    for label, sel in (("all sizes", pts), ("AMG+CG sizes only", [p for p in pts if p[2] == "AMG+CG"])):
        if len(sel) >= 2:
            x, y = np.log([p[0] for p in sel]), np.log([p[1] for p in sel])
            print(f"fitted exponent of solve time against unknowns ({label}): {np.polyfit(x, y, 1)[0]:.2f}")


def _sweep(case, n, extra, tag):
    out = Path(tempfile.mkdtemp()) / tag
    cmd = [sys.executable, "-m", "compare.cli", "sweep", str(case), "--vary",
           f"section.keyways[0].fillet=0.2mm:1.2mm:{n}", "--out", str(out), "--quiet", *extra]
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    t0 = time.perf_counter()
    p = subprocess.run(cmd, capture_output=True, text=True, cwd=ROOT)
    wall = time.perf_counter() - t0
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    shutil.rmtree(out.parent, ignore_errors=True)
    cpu = (after.ru_utime + after.ru_stime) - (before.ru_utime + before.ru_stime)
    print(f"{tag:28s} wall {wall:7.1f} s   CPU (this process's children) {cpu:7.1f} s   exit {p.returncode}")
    return wall


def sweep(n):
    tmp = Path(tempfile.mkdtemp())
    case = tmp / "fillet.toml"
    case.write_text((ROOT / "tests" / "benchmarks" / "sweep_case.toml").read_text())
    w1 = _sweep(case, n, ["--workers", "1"], "1 worker")
    w2 = _sweep(case, n, ["--workers", "2"], "2 workers")
    print(f"speed-up on two workers: {w1 / w2:.2f}")
    port = 8786 + os.getpid() % 1000
    sched = subprocess.Popen(["dask", "scheduler", "--port", str(port), "--no-dashboard"], cwd=ROOT,
                             env=dict(os.environ, PYTHONPATH=str(ROOT)), stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    workers = []
    try:
        time.sleep(3)
        # the workers as README starts them: no nanny (so no MALLOC_TRIM_THRESHOLD_) and no profiler
        env = dict(os.environ, PYTHONPATH=str(ROOT), DASK_DISTRIBUTED__WORKER__PROFILE__ENABLED="False")
        workers = [subprocess.Popen(["dask", "worker", f"tcp://127.0.0.1:{port}", "--nthreads", "1", "--no-nanny",
                                     "--no-dashboard"], cwd=ROOT, env=env, stdout=subprocess.DEVNULL,
                                    stderr=subprocess.DEVNULL) for _ in range(2)]
        time.sleep(5)
        _sweep(case, n, ["--scheduler", f"tcp://127.0.0.1:{port}"], "--scheduler (2 dask workers)")
    finally:
        for proc in workers + [sched]:
            proc.terminate()
            proc.wait(timeout=30)
        shutil.rmtree(tmp, ignore_errors=True)


if __name__ == "__main__":
    what = sys.argv[1] if len(sys.argv) > 1 else "demos"
    if what == "demos":
        demos()
    elif what == "large":
        large([int(float(s)) for s in sys.argv[2:]] or [125_000, 250_000, 500_000, 1_050_000])
    elif what == "sweep":
        sweep(int(sys.argv[2]) if len(sys.argv) > 2 else 200)
    else:
        sys.exit(__doc__)

"""A 3-D reference for one cross-hole geometry on meshes far finer at the hole than the segment study's.

The geometry (:data:`GEOMETRY`): a solid round shaft d = 30 mm, modelled over 2.5 d, with a plain
through hole of 0.2 d (no chamfer) across its axis at mid-length. The factors of tension, bending in
the plane of the hole's axis (``bending_y``) and torsion are solved on meshes refined at the hole far
past the study's: global fineness :data:`REF_FINENESS`, the hole's sizes divided further by
``local`` = :data:`REF_LOCAL` (ratio 1.4 from mesh to mesh; the plain bar, whose elementary field the
quadratic elements hold exactly, keeps its size). The reference is the Richardson extrapolation of
the three finest values (classic/gci.py), its uncertainty the GCI of that sequence with Fs 3 and the
order limited to [0.5, 2] (at least the last change). Where the three do not converge
monotonically (:func:`converged` false) the record holds the finest value with three times the
spread of the last three as its uncertainty (the project's rule for an oscillating sequence, Fs 3):
an interval the value is taken to lie in, not a converged value. The engine's own solver
(direct up to fem.solid.DIRECT_LIMIT unknowns, AMG + CG above, every solve checked against its
residual). Prints the sequences, CPU seconds and unknowns, and
writes tests/data/segment_references.json with its provenance (command, date, figures), which
tests/test_compare_segment_coverage.py reads. Slow (minutes); not part of pytest.

    python tests/benchmarks/segment_references.py [--out PATH] [--local L1,L2,...]
"""
from __future__ import annotations

import datetime as _dt
import json
import platform
import resource
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from classic.gci import convergence_study  # noqa: E402
from compare.solve.segments import KEYS, mesh_dofs  # noqa: E402
from fem import solid  # noqa: E402

#: d [m], length [m], hole diameter [m], hole position [m]
GEOMETRY = {"d": 0.030, "length": 0.075, "hole_diameter": 0.006, "hole_z": 0.0375}
LOADS = ("tension", "bending_y", "torsion")
E, NU = 2.0e11, 0.3
REF_FINENESS = 0.45
REF_LOCAL = (1.0, 1.4, 1.96, 2.744)
REF_FS = 3.0
OUT = Path(__file__).resolve().parents[1] / "data" / "segment_references.json"


def segment() -> solid.Segment:
    g = GEOMETRY
    return solid.Segment(g["d"], g["length"], (solid.CrossHole(g["hole_diameter"], g["hole_z"]),))


def _cpu() -> float:
    me, kids = resource.getrusage(resource.RUSAGE_SELF), resource.getrusage(resource.RUSAGE_CHILDREN)
    return me.ru_utime + me.ru_stime + kids.ru_utime + kids.ru_stime


def extrapolate(vals: list[float], r: float) -> dict:
    """Reference and uncertainty from a sequence coarse to fine at ratio ``r`` (module docstring)."""
    last = vals[-3:]
    s = convergence_study(last[::-1], r)
    if s.monotone and s.order is not None and s.order > 0:
        p = min(max(s.order, 0.5), 2.0)
        e = abs(last[-1] - last[-2])
        ref = last[-1] + (last[-1] - last[-2]) / (r**p - 1)
        u = max(REF_FS * e / (r**p - 1), e)
    else:
        ref = last[-1]
        u = REF_FS * max(abs(v - last[-1]) for v in last)
    return {"reference": ref, "uncertainty": u, "observed_order": s.order, "status": s.status}


def converged(rec: dict) -> bool:
    """Whether a stored reference converged: its last three values converge monotonically at a
    positive order. Otherwise it is the finest value with three times the spread as its uncertainty."""
    return rec["status"] == "monotone convergence" and (rec["observed_order"] or 0) > 0


def write(out: Path, argv: list[str], local, runs, dofs, cpus, c_all) -> dict:
    """The references from the meshes solved so far (three at least) written to ``out``."""
    r = local[1] / local[0]
    local = list(local[:len(runs)])
    refs = {}
    for load in LOADS:
        vals = [x[load] for x in runs]
        rec = extrapolate(vals, r)
        rec.update(load=load, key=KEYS[load], values=vals, dofs=dofs)
        refs[KEYS[load]] = rec
        print(f"{KEYS[load]}: {[f'{v:.5f}' for v in vals]} order {rec['observed_order']} ({rec['status']}) -> "
              f"reference {rec['reference']:.5f} ± {rec['uncertainty']:.2e}", flush=True)
    doc = {
        "provenance": {
            "what": __doc__.strip().splitlines()[0],
            "command": "python tests/benchmarks/segment_references.py " + " ".join(argv),
            "date": _dt.datetime.now(_dt.timezone.utc).strftime("%Y-%m-%d %H:%M UTC"),
            "machine": f"{platform.machine()}, Python {platform.python_version()}",
            "cpu_seconds_per_mesh": [round(c, 1) for c in cpus],
            "cpu_seconds": round(_cpu() - c_all, 1),
            "fineness": REF_FINENESS, "local": list(local), "solver": "fem.solid default (direct, AMG + CG above its limit; residual checked)",
            "E": E, "nu": NU,
        },
        "geometry": GEOMETRY,
        "references": refs,
    }
    out.write_text(json.dumps(doc, indent=1) + "\n", encoding="utf-8")
    return doc


def main(argv: list[str]) -> None:
    out, local = OUT, REF_LOCAL
    if "--out" in argv:
        out = Path(argv[argv.index("--out") + 1])
    if "--local" in argv:
        local = tuple(float(x) for x in argv[argv.index("--local") + 1].split(","))
    seg = segment()
    runs, dofs, cpus = [], [], []
    c_all = _cpu()
    for lo in local:
        c0 = _cpu()
        sm = solid.mesh_segment(seg, fineness=REF_FINENESS, local=lo)
        res = solid.solve_segment(sm, LOADS, E, NU)
        runs.append({k: v.factor for k, v in res.items()})
        dofs.append(mesh_dofs(sm))
        cpus.append(_cpu() - c0)
        print(f"local {lo:g}: {dofs[-1]} unknowns, {cpus[-1]:.0f} CPU s, "
              + ", ".join(f"{k} {v:.5f}" for k, v in runs[-1].items()), flush=True)
        del sm, res
        if len(runs) >= 3:  # written after every mesh from the third on: a stopped run leaves its best
            doc = write(out, argv, local, runs, dofs, cpus, c_all)
    print(f"written {out}; whole run {doc['provenance']['cpu_seconds']:.0f} CPU s")


if __name__ == "__main__":
    main(sys.argv[1:])

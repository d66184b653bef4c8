"""Converged references for the shoulder and groove factors, independent of the feature study's meshes.

For each geometry of :data:`GEOMETRIES` and each load, the factor is solved on meshes much finer at the
feature arcs than the study's (global fineness :data:`REF_FINENESS`, the arcs and their neighbourhood at
arc fineness :data:`REF_ARC_FINENESS`: the fineness-1 size field there divided by that number), and the
reference is the Richardson extrapolation of that sequence (classic/gci.py) with its own GCI (Fs = 3,
the order limited to [0.5, 2]) as its uncertainty. Prints the sequences and writes
tests/data/feature_references.json, which tests/test_compare_features_coverage.py reads (it recomputes
one reference on the fly). Slow (minutes, some solves reach 10^6 unknowns); not part of pytest.

    python tests/benchmarks/feature_references.py [--out PATH] [NAME ...]
"""
from __future__ import annotations

import json
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

import fem.linalg  # noqa: E402
from fem.axisym import LOADS, groove_profile, mesh_profile, shoulder_profile, solve_profile  # noqa: E402
from classic.gci import convergence_study  # noqa: E402

D_SMALL = 0.02  # any size: the factors are scale-free
#: name -> (kind, D/d, r/d); a groove's depth is (D - d)/2 with d its bottom diameter
GEOMETRIES = {
    "shoulder D/d 1.1 r/d 0.02": ("shoulder", 1.1, 0.02),
    "shoulder D/d 2.0 r/d 0.05": ("shoulder", 2.0, 0.05),
    "shoulder D/d 1.5 r/d 0.1": ("shoulder", 1.5, 0.1),
    "groove D/d 1.5 r/d 0.05": ("groove", 1.5, 0.05),
}
REF_FINENESS = 4.0
REF_ARC_FINENESS = (4.0, 8.0, 16.0)
#: the reference's uncertainty: the GCI of its own sequence with this factor (Roache 1994: 3 where the
#: order is not shown to be asymptotic)
REF_FS = 3.0
OUT = Path(__file__).resolve().parents[1] / "data" / "feature_references.json"


def profile(kind: str, Dd: float, rd: float):
    d = D_SMALL
    if kind == "shoulder":
        return shoulder_profile(d, Dd * d, rd * d)
    return groove_profile(Dd * d, (Dd - 1) / 2 * d, rd * d)


def reference(kind: str, Dd: float, rd: float, load: str, arc=REF_ARC_FINENESS, fineness=REF_FINENESS) -> dict:
    """The reference record of one geometry and load (see the module docstring)."""
    prof = profile(kind, Dd, rd)
    vals, dofs = [], []
    for fa in arc:
        r = solve_profile(mesh_profile(prof, fineness, fa), load)
        vals.append(r.kt)
        dofs.append(r.dofs)
    s = convergence_study(vals[::-1], arc[1] / arc[0])
    p = None if s.order is None else min(max(s.order, 0.5), 2.0)
    if s.monotone and p is not None and s.order > 0:
        e = abs(vals[-1] - vals[-2])
        if s.order > 2.2:  # a runaway order: the last change no smaller than the one before at order 2
            e = max(e, abs(vals[-2] - vals[-3]) / 4.0)
        ref = vals[-1] + (vals[-1] - vals[-2]) / ((arc[1] / arc[0]) ** p - 1)
        u = REF_FS * e / ((arc[1] / arc[0]) ** p - 1)
    else:  # not monotone: the finest value, its uncertainty the spread times the two-mesh factor
        ref = vals[-1]
        u = REF_FS * max(abs(v - vals[-1]) for v in vals)
    return {"kind": kind, "D_over_d": Dd, "r_over_d": rd, "load": load, "reference": ref, "uncertainty": u,
            "values": vals, "observed_order": s.order, "status": s.status, "dofs": dofs,
            "fineness": fineness, "arc_fineness": list(arc)}


def main(argv: list[str]) -> None:
    out = OUT
    if "--out" in argv:
        i = argv.index("--out")
        out = Path(argv[i + 1])
        argv = argv[:i] + argv[i + 2:]
    fem.linalg.DIRECT_LIMIT = 10**7  # direct solves throughout: the references must not carry a CG tolerance
    names = argv or list(GEOMETRIES)
    old = json.loads(out.read_text()) if out.exists() else {}
    recs = old.get("references", {})
    for name in names:
        kind, Dd, rd = GEOMETRIES[name]
        for load in LOADS:
            t = time.perf_counter()
            rec = reference(kind, Dd, rd, load)
            recs[f"{name}, {load}"] = rec
            print(f"{name}, {load}: values {[f'{v:.6f}' for v in rec['values']]} dofs {rec['dofs']} "
                  f"order {rec['observed_order']} ({rec['status']}) -> reference {rec['reference']:.6f} "
                  f"± {rec['uncertainty']:.2e} ({time.perf_counter() - t:.0f} s)", flush=True)
            out.write_text(json.dumps({"provenance": __doc__.strip().splitlines()[0] + " Written by "
                                       "tests/benchmarks/feature_references.py.", "references": recs}, indent=1))


if __name__ == "__main__":
    main(sys.argv[1:])

"""The FE work on a composite section: meshes refined by a constant ratio until every targeted
estimate is within the case's accuracy target (or ``analysis.max_dofs`` / ``analysis.max_seconds``
stops it), the three finest forming the convergence study (classic/gci.py through
:func:`compare.solve.accuracy.one_study`, the section study's rules: formal-order cap, Fs 1.25 or 3).

As for one material, the study's estimates are widened by what the two independent torsion solutions
of the finest mesh show: GJ at least the bracket width (the stress-function GJ is a lower and the
warping-function GJ an upper bound), and each region's torsion peak by the parting of its two
evaluations. Numbers and records only.
"""
from __future__ import annotations

import math
import time
from dataclasses import dataclass, field

from fem.composite import composite_torsion, mesh_composite, weighted_properties
from fem.composite_shear import composite_shear, shear_stress_peaks
from fem.errors import LimitError
from fem.linalg import record_solves

from .accuracy import RATIO, one_study
from .progress import tick

#: Quantities the accuracy target applies to, with their formal order on P2 (peaks 2, energies 4).
ORDER = {"GJ": 4.0, "EA": 4.0, "EIxx": 4.0, "EIyy": 4.0, "tau_max": 2.0, "tau_shear_max": 2.0}


@dataclass
class CompositeSolution:
    mesh: object
    torsion: object
    props: object
    fineness: float
    seconds: float
    #: transverse shear (fem/composite_shear.py) when the case gives a shear force: the shear functions
    #: and each region's peak under the case's (Vx, Vy) through the shear centre
    shear: object = None
    shear_peaks: list | None = None

    @property
    def dofs(self) -> int:
        return self.torsion.dofs


@dataclass
class CompositeStudy:
    solutions: list
    estimates: dict
    target: float
    limited: str | None
    seconds: float = 0.0
    solves: list = field(default_factory=list)


def solve_composite_on(case, fineness: float) -> CompositeSolution:
    t0 = time.perf_counter()
    tick("mesh and solve")
    mats = case.region_materials
    cm = mesh_composite(list(case.section.regions), fineness)
    tr = composite_torsion(cm, [m.shear_modulus for m in mats])
    pr = weighted_properties(cm, [m.elastic_modulus for m in mats])
    sh = peaks = None
    if case.loads.shear is not None:
        sh = composite_shear(cm, [m.elastic_modulus for m in mats], [m.shear_modulus for m in mats],
                             [m.poisson for m in mats], pr)
        peaks = shear_stress_peaks(cm, sh, *case.loads.shear)
    return CompositeSolution(cm, tr, pr, fineness, time.perf_counter() - t0, sh, peaks)


def quantities(sol: CompositeSolution) -> dict[str, float]:
    q = {"GJ": sol.torsion.GJ, "EA": sol.props.EA, "EIxx": sol.props.EIxx, "EIyy": sol.props.EIyy}
    for k, p in enumerate(sol.torsion.peaks):
        q[f"tau_max[{k}]"] = p.value
    for k, p in enumerate(sol.shear_peaks or []):
        if p.value > 0:  # a region the shear force leaves unloaded has nothing to converge
            q[f"tau_shear_max[{k}]"] = p.value
    return q


def _estimates(seq: list[CompositeSolution]) -> dict:
    qs = [quantities(s) for s in reversed(seq)]  # fine first
    dofs = [s.dofs for s in reversed(seq)]
    size = math.sqrt(seq[-1].props.area)
    out = {}
    for key in qs[0]:
        base = key.split("[")[0]
        # one_study knows the section study's keys: a peak studies as tau_max, an energy as J
        d = one_study("tau_max" if base.startswith("tau") else "J", [q[key] for q in qs], dofs, (RATIO, RATIO), size)
        d["order_formal"] = ORDER[base]
        out[key] = d
    tr = seq[-1].torsion
    gap = abs(tr.GJ_warping - tr.GJ) / tr.GJ
    g = out["GJ"]
    if g["gci"] is not None:
        g.update(gci_study=g["gci"], bracket_gap=gap, gci=max(g["gci"], gap),
                 estimate_kind="bracket" if gap > g["gci"] else "study")
    for k, (p, pw) in enumerate(zip(tr.peaks, tr.peaks_warping)):
        d = out[f"tau_max[{k}]"]
        if d["gci"] is not None and p.value > 0:
            parting = abs(pw.value - p.value) / p.value
            d.update(gci_study=d["gci"], peak_parting=parting, gci=d["gci"] + parting, estimate_kind="study+parting")
    for d in out.values():
        d.setdefault("estimate_kind", "study")
    return out


def study_composite(case, fineness: float | None = None) -> CompositeStudy:
    """Meshes at fineness f, f·r, f·r², ... (r = :data:`~compare.solve.accuracy.RATIO`) until the
    targeted estimates are within the target or a limit stops it."""
    t0 = time.perf_counter()
    a = case.analysis
    f = fineness if fineness is not None else a.fineness
    deadline = t0 + a.max_seconds
    with record_solves() as solves:
        seq = [solve_composite_on(case, f), solve_composite_on(case, f * RATIO)]
        if seq[-1].dofs * RATIO**2 > a.max_dofs:
            raise LimitError(f"the composite study's third mesh would pass analysis.max_dofs = {a.max_dofs}: "
                             "lower the fineness or raise max_dofs")
        seq.append(solve_composite_on(case, f * RATIO**2))
        limited = None
        while True:
            est = _estimates(seq[-3:])
            worst = max((v["gci"] for v in est.values() if v["gci"] is not None), default=0.0)
            unknown = any(v["gci"] is None for v in est.values())
            if worst <= a.accuracy and not unknown:
                break
            n_next = seq[-1].dofs * RATIO**2
            if n_next > a.max_dofs:
                limited = f"the next mesh would exceed analysis.max_dofs = {a.max_dofs}"
                break
            if time.perf_counter() + 2.0 * seq[-1].seconds * RATIO**2.6 > deadline:
                limited = f"analysis.max_seconds = {a.max_seconds:g} s: the next mesh would not finish within the time left"
                break
            seq.append(solve_composite_on(case, seq[-1].fineness * RATIO))
    st = CompositeStudy(seq[-3:], est, a.accuracy, limited, time.perf_counter() - t0, solves)
    return st

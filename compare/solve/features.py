"""Shoulders and grooves along the shaft, solved on their meridian sections (fem/axisym.py).

Each shoulder (a step between two segments, with its ``fillet``) and each groove of the case's
``[shaft]`` becomes a :class:`Feature`; :func:`study_feature` solves it in torsion, tension and
bending on fillet-refined meshes (fineness :data:`FINENESS`, ratio 2 in element size everywhere) and
returns, per load, the factor on the finest mesh with its error estimate, the peak's place and the
far-field check (the model is long enough when the surface stress away from the feature is the
elementary one to :data:`FAR_FIELD_TOL`). Each feature is modelled alone: the shaft on either side is
taken as plain for :data:`fem.axisym.SIDE_LENGTH` larger diameters; a neighbour closer than
:data:`NEIGHBOUR_REACH` larger diameters is reported (``neighbours``), not modelled.

The error estimate follows the rule of the section study (compare/solve/accuracy.py, ``one_study``):
the GCI of the last three values (classic/gci.py, Roache 1994), Fs 3 with the order limited to [0.5,
formal] where the sequence is not shown to be asymptotic, and an observed order above 1.1 × formal
(:data:`FORMAL_ORDER`) does not shrink the last difference. These meshes are never taken as asymptotic
(Fs 1.25) and the order is limited further, to :data:`ORDER_LIMIT`: measured, see there.
Where the last three values do not converge monotonically, one more mesh (fineness × 2) is solved and
the coarsest dropped, until they do, or :data:`SPREAD_FACTOR` times the largest spread of the last three
values from the finest is already within the case's accuracy target (``target``; the bound the study
would report anyway, see :data:`STOP_WITHIN_TARGET`), or a limit stops it (:data:`MAX_DOFS`, the case's
``analysis.max_dofs`` and ``analysis.max_seconds``; ``limited`` says which); without convergence the
bound is that spread bound (``gci_kind = "spread"``). ``ended_by`` says which rule ended each study
(:data:`ENDED_BY`). Identical features are solved once, a step down and a step up of the same
diameters and fillet included (one meridian model, positions mirrored). Numbers and records only.
"""
from __future__ import annotations

import math
import time
from dataclasses import dataclass, field

import numpy as np

from classic.gci import convergence_study
from fem import axisym
from fem.errors import InputError

from .accuracy import FORMAL_ORDER as _SECTION_ORDERS, FS_OSCILLATORY

#: Meshes of the study, coarse to fine (ratio 2 in element size everywhere, fillet included); more
#: are added at ratio 2 while the last three values do not converge monotonically.
FINENESS = (1.0, 2.0, 4.0)
#: Formal order of a peak stress with P2 elements (a gradient at points: h²), as for the section's
#: peaks (compare/solve/accuracy.py FORMAL_ORDER). The observed order is never used above it.
FORMAL_ORDER = _SECTION_ORDERS["tau_max"]
#: The order the GCI uses at most (Fs 3 always): these meshes are not in the asymptotic range at the
#: fillet. Measured (tests/benchmarks/feature_references.py and tests/test_compare_features_coverage.py):
#: observed orders 1.0-2.9 on the references' own sequences and 0.0-3.6 on the studies'; where a study's
#: three values happened to show the formal order 2 (Fs 1.25), the estimate fell to 0.38 of the true
#: error (shoulder D/d 2.0, r/d 0.05, tension, fineness x 1.25), and Fs 3 at order 2 would still not
#: have covered it; at order 1 it does, on every geometry, load and mesh scaling tested.
ORDER_LIMIT = 1.0
#: Largest number of unknowns of one meridian solve the study makes: the direct solver's range
#: (fem.linalg.DIRECT_LIMIT); above it the bending problem's iterative solve is slow (measured:
#: 70 s at 211k unknowns against 1 s at 57k). The case's analysis.max_dofs applies when smaller.
MAX_DOFS = 150_000
#: At most this many meshes per load (the first three and the refinements past them).
MAX_MESHES = 6
#: The far-field surface stress must match the elementary one to this (issue 13: "to 1e-4"); the
#: model's length was chosen so that it does, with a margin (measured 1e-6 or better).
FAR_FIELD_TOL = 1e-4
#: Poisson's ratio used when the case gives none (steel); Kt in tension and bending depends on it
#: weakly, Kts in torsion not at all. Recorded with the result.
DEFAULT_POISSON = 0.3
#: Features closer than this many larger diameters are reported as neighbours (they interact and
#: are modelled alone). Measured here: 1.5 diameters from a U-groove (D/d = 1.5, r/d = 0.05, tension)
#: the surface stress is within 5e-4 of the elementary one.
NEIGHBOUR_REACH = 1.5
#: Safety factor on the spread of the three values when they do not converge monotonically (the
#: two-grid factor of Roache, J. Fluids Eng. 116, 1994: 3), as in the section study.
SPREAD_FACTOR = FS_OSCILLATORY
#: A study whose last three values do not converge monotonically stops adding meshes once its spread
#: bound (SPREAD_FACTOR × the spread, the bound it reports) is within this fraction of the case's accuracy
#: target. 1: the target is the error the case accepts on each studied quantity; the section study stops
#: at it too (compare/solve/accuracy.py: every targeted GCI within the target), and a spread bound within
#: it raises no warning (compare/checks/feature_findings.py). A further mesh would only prove a digit the
#: case did not ask for (the countershaft demo's Kts: spread bounds 1.8e-3 and 1.0e-3 on fineness 1, 2, 4
#: at a 1 % target, then a fourth mesh of about 100k unknowns). Covered: tests/test_compare_features_coverage.py.
STOP_WITHIN_TARGET = 1.0
#: What ended a load's study (results ``<factor>_ended_by``): the last three values converge
#: monotonically (GCI); they do not, but the spread bound is within the target; a limit stopped the
#: refinement (``limited`` says which); fewer than three meshes were asked for (no bound).
ENDED_BY = ("monotone", "spread_within_target", "limit", "fewer_than_three_meshes")
#: Any modulus: the factors are ratios of stresses and do not depend on it.
_E = 2.0e11


@dataclass
class Feature:
    """A shoulder or groove of the shaft, SI. ``d`` is the smaller diameter at the feature (the one
    the nominal stresses use); ``D`` the larger (shoulder) or the shaft's (groove)."""

    kind: str
    at: float
    d: float
    D: float
    radius: float | None
    field: str
    depth: float | None = None
    width: float | None = None
    bore: float = 0.0
    step_down: bool = False  # a shoulder whose larger diameter is on the left (z < at)
    skipped: str | None = None  # why there is no FE value (a record, worded in output/)
    notes: list = field(default_factory=list)

    @property
    def h(self) -> float:
        return (self.D - self.d) / 2 if self.kind == "shoulder" else self.depth


def shaft_features(shaft) -> list[Feature]:
    """The shoulders and grooves of a :class:`~compare.case.shaft.Shaft`, in order along it."""
    out: list[Feature] = []
    segs = shaft.segments
    for i in range(1, len(segs)):
        a, b = segs[i - 1], segs[i]
        if a.diameter == b.diameter:
            continue
        small, big = (a, b) if a.diameter < b.diameter else (b, a)
        bore = small.bore or 0.0
        f = Feature("shoulder", b.start, small.diameter, big.diameter, b.fillet, f"shaft.segments[{i}].fillet",
                    bore=bore, step_down=a.diameter > b.diameter)
        if (a.bore or 0.0) != (b.bore or 0.0):
            f.notes.append("bore_taken_uniform")  # the smaller segment's bore, on both sides
        if a.section is not None or b.section is not None:
            f.skipped = "composite_shoulder"  # bonded regions: the meridian-section FE is of one material
        elif b.fillet is None:
            f.skipped = "sharp_shoulder"  # no fillet given: the corner's elastic stress is unbounded
        elif b.fillet > f.h * (1 + 1e-9):
            f.skipped = "fillet_beyond_step"  # a fillet larger than the step is not a tangent quarter arc
        out.append(f)
    for j, g in enumerate(shaft.grooves):
        seg = shaft.segment_at(g.at)
        D = seg.diameter if seg is not None else None
        if D is None:
            continue  # a shaft without segments has no diameter here (the case's section is used)
        f = Feature("groove", g.at, D - 2 * g.depth, D, g.radius, f"shaft.grooves[{j}]", depth=g.depth,
                    width=g.width, bore=(seg.bore or 0.0))
        if g.radius > g.depth * (1 + 1e-9):
            f.skipped = "groove_radius_beyond_depth"  # the bottom arc would not meet parallel flanks
        out.append(f)
    out.sort(key=lambda f: f.at)
    for k, f in enumerate(out):
        reach = NEIGHBOUR_REACH * f.D
        near = [o.field for o in out if o is not f and abs(o.at - f.at) < reach]
        if near:
            f.notes.append({"neighbours": near, "modelled_alone_over": reach})
    return out


def profile_of(f: Feature) -> axisym.Profile:
    """The meridian profile of ``f``; bad geometry raises InputError naming the case-file field."""
    try:
        if f.kind == "shoulder":
            return axisym.shoulder_profile(f.d, f.D, f.radius, bore=f.bore)
        return axisym.groove_profile(f.D, f.depth, f.radius, f.width, bore=f.bore)
    except InputError as exc:
        raise InputError(f.field, exc.value, exc.reason, exc.unit) from None


def model_to_shaft(f: Feature, prof: axisym.Profile, z: float) -> float:
    """Axial position [m] along the shaft of a model point at height ``z`` of the meridian model."""
    z0 = prof.params["at"]
    return f.at - (z - z0) if f.step_down else f.at + (z - z0)


def study_feature(f: Feature, poisson: float | None = None, fineness=None, cache: dict | None = None,
                  max_dofs: int | None = None, max_seconds: float | None = None,
                  target: float | None = None) -> dict:
    """Solve ``f`` in the three loads on the meshes of ``fineness`` (coarse to fine, ratio 2; default
    :data:`FINENESS`), refined further where needed (module docstring) within ``max_dofs`` (at most
    :data:`MAX_DOFS`) and ``max_seconds`` (the case's analysis limits); with ``target`` (the case's
    ``analysis.accuracy``) a non-monotone study stops once its spread bound is within it
    (:data:`STOP_WITHIN_TARGET`), without it only convergence or a limit stop it. Returns {load: record}; an empty
    dict for a skipped feature. ``cache`` (a dict) reuses the solution of a feature of the same geometry,
    whichever way it faces: a step down (larger diameter on the left) has the very meridian model of
    the step up (:func:`profile_of` does not depend on the side), only its positions along the shaft
    run the other way (:func:`model_to_shaft`)."""
    if f.skipped:
        return {}
    fineness = FINENESS if fineness is None else tuple(fineness)
    key = (f.kind, f.d, f.D, f.radius, f.depth, f.width, f.bore, f.step_down, f.at, poisson, fineness, max_dofs,
           max_seconds, target)
    geo = key[:7] + key[9:]  # everything but the place and the side it faces
    if cache is not None and geo in cache:
        return _moved(cache[geo], f)
    out = _study(f, poisson, fineness, max_dofs, max_seconds, target)
    if cache is not None:
        cache[geo] = (f.at, f.step_down, out)
    return out


def _moved(entry, f: Feature) -> dict:
    """A cached study moved to the place of ``f`` (same geometry; facing the same way or the other:
    a position ``a`` of the cached feature at ``at0`` is ``f.at ± (a − at0)``)."""
    at0, down0, out = entry
    if down0 == f.step_down:
        dz = f.at - at0

        def move(a):
            return a + dz
    else:
        def move(a):
            return f.at - (a - at0)
    res = {}
    for load, rec in out.items():
        r = {**rec}
        r["peak"] = {**rec["peak"], "at": move(rec["peak"]["at"])}
        r["peak_von_mises"] = {**rec["peak_von_mises"], "at": move(rec["peak_von_mises"]["at"])}
        r["map"] = {**rec["map"], "at": [move(z) for z in rec["map"]["at"]]}
        r["components"] = {**rec["components"], "at": move(rec["components"]["at"])}
        res[load] = r
    return res


def error_bound(kts: list[float], ratio: float, formal: float = FORMAL_ORDER, order_limit: float | None = None) -> dict:
    """The error estimate of the finest of ``kts`` (coarse to fine, the last three used, meshes at
    ``ratio``), relative to its value, by the section study's rule (module docstring).

    Returns {"bound", "kind" ("gci" / "spread" / None), "order" (observed), "order_used",
    "safety_factor", "status", "converged" (the last three converge monotonically), "why"}."""
    out = {"bound": None, "kind": None, "order": None, "order_used": None, "safety_factor": None,
           "status": "single mesh", "converged": False, "why": None}
    if len(kts) < 3:
        return out
    order_limit = ORDER_LIMIT if order_limit is None else order_limit
    f3, f2, f1 = kts[-3:]  # f1 the finest
    study = convergence_study([f1, f2, f3], ratio)
    out["status"] = study.status
    out["order"] = study.order
    if study.monotone and study.order is not None and study.order > 0:
        p_obs = study.order
        # Oberkampf & Roy's rule (Verification and Validation in Scientific Computing, 2010, Sec. 8.6;
        # from memory), as compare/solve/accuracy.py: Fs 1.25 at the formal order where the observed one
        # is within 10 % of it, else Fs 3 with the order limited to [0.5, formal]. Here the meshes are not
        # in the asymptotic range (see ORDER_LIMIT): Fs 3 always and the order limited to [0.5, ORDER_LIMIT]
        p, fs = min(max(p_obs, 0.5), formal, order_limit), FS_OSCILLATORY
        e21 = abs(f1 - f2)
        why = ("the meshes are not shown to be in the asymptotic range: Fs 3 at the observed order limited to "
               "[0.5, ORDER_LIMIT]")
        if p_obs > 1.1 * formal:
            # a runaway order: the last two meshes agree better than the method's order explains (an
            # error crossing zero): the last change is taken no smaller than the one before it reduced
            # at the order used
            e21 = max(e21, abs(f2 - f3) / ratio**p)
            why += "; observed order above the formal one: the last change taken no smaller than the previous one reduced"
        out.update(bound=fs * e21 / abs(f1) / (ratio**p - 1.0), kind="gci", order_used=p, safety_factor=fs,
                   converged=True, why=why)
        return out
    spread = max(abs(k - f1) for k in (f1, f2, f3)) / abs(f1)
    out.update(bound=SPREAD_FACTOR * spread, kind="spread", safety_factor=SPREAD_FACTOR,
               why="the last three values do not converge monotonically: the spread of the three values")
    return out


class _Meshes:
    """The study's meshes of one profile, made when first asked for (fineness -> MeridianMesh)."""

    def __init__(self, prof):
        self.prof, self.meshes = prof, {}

    def __call__(self, fineness: float):
        if fineness not in self.meshes:
            self.meshes[fineness] = axisym.mesh_profile(self.prof, fineness)
        return self.meshes[fineness]


def _refined(meshes: _Meshes, load: str, fineness: tuple, nu: float, max_dofs: int, max_seconds: float | None,
             t0: float, target: float | None = None):
    """Solve ``load`` on ``fineness`` and on finer meshes (ratio 2) until the last three values converge
    monotonically, their spread bound is within ``target`` × :data:`STOP_WITHIN_TARGET`, or a limit
    stops it. Returns (results, fineness used, estimate with ``ended_by`` (:data:`ENDED_BY`), limited)."""
    ratio = fineness[1] / fineness[0]
    fns = list(fineness)
    seconds = []

    def solve(fn):
        t = time.perf_counter()
        r = axisym.solve_profile(meshes(fn), load, _E, nu)
        seconds.append(time.perf_counter() - t)
        return r

    results = [solve(fn) for fn in fns]
    limited = None
    while True:
        est = error_bound([r.kt for r in results], ratio)
        if len(results) < 3:
            est["ended_by"] = "fewer_than_three_meshes"
            break
        if est["converged"]:
            est["ended_by"] = "monotone"
            break
        if target is not None and est["bound"] <= STOP_WITHIN_TARGET * target:
            est["ended_by"] = "spread_within_target"
            est["why"] += (f"; SPREAD_FACTOR × the spread is within the case's accuracy target ({target:g}): "
                           "no further mesh")
            break
        nxt = fns[-1] * ratio
        predicted = results[-1].dofs * (results[-1].dofs / results[-2].dofs)
        if len(results) >= MAX_MESHES:
            limited = f"stopped after {MAX_MESHES} meshes"
        elif predicted > max_dofs:
            which = "the feature study's limit" if max_dofs == MAX_DOFS else "analysis.max_dofs"
            limited = f"the next mesh (fineness {nxt:g}, about {predicted:.3g} unknowns) would exceed {which} = {max_dofs}"
        elif max_seconds is not None:
            spent = time.perf_counter() - t0
            if spent + 5 * seconds[-1] > max_seconds:  # 4 times the unknowns, a little more than 4 times the time
                limited = f"the next mesh would end after analysis.max_seconds = {max_seconds:g} s"
        if limited:
            est["ended_by"] = "limit"
            break
        fns.append(nxt)
        results.append(solve(nxt))
    return results, fns, est, limited


def _study(f: Feature, poisson, fineness, max_dofs=None, max_seconds=None, target=None) -> dict:
    nu = DEFAULT_POISSON if poisson is None else poisson
    prof = profile_of(f)
    meshes = _Meshes(prof)
    limit = MAX_DOFS if max_dofs is None else min(MAX_DOFS, max_dofs)
    t0 = time.perf_counter()
    out = {}
    for load in axisym.LOADS:
        results, fns, est, limited = _refined(meshes, load, fineness, nu, limit, max_seconds, t0, target)
        fine = results[-1]
        # the station's FE path superposes the loads point by point, so their components come from one
        # mesh: the study's last common one (the factor itself may come from a finer mesh)
        common = results[len(fineness) - 1]
        comp = axisym.feature_stress_components(meshes(fineness[-1]), common.basis, common.x, load, _E, nu)
        kts = [r.kt for r in results]
        ff = fine.far_field
        pk = fine.peak
        out[load] = {
            "kt": fine.kt,
            "values_coarse_to_fine": kts,
            "fineness": fns,
            "gci": est["bound"],
            "gci_kind": est["kind"],
            "gci_why": est["why"],
            "order": est["order"],
            "order_used": est["order_used"],
            "safety_factor": est["safety_factor"],
            "status": est["status"],
            "limited": limited,
            "ended_by": est["ended_by"],
            "target": target,
            "peak": {"stress_per_nominal": fine.kt, "r": pk.r, "at": model_to_shaft(f, prof, pk.z),
                     "angle": pk.angle},
            "peak_von_mises": {"per_nominal": fine.peak_vm.value / fine.nominal, "r": fine.peak_vm.r,
                               "at": model_to_shaft(f, prof, fine.peak_vm.z), "angle": fine.peak_vm.angle},
            "far_field": {"fem": ff["fem"] / fine.nominal, "exact": ff["exact"] / fine.nominal,
                          "tolerance": FAR_FIELD_TOL,
                          "passed": abs(ff["fem"] / ff["exact"] - 1) <= FAR_FIELD_TOL},
            "dofs": fine.dofs,
            "poisson": nu,
            # boundary stresses along the feature arcs on the finest mesh, per nominal (for figures)
            "map": {"r": fine.points["r"].tolist(),
                    "at": [model_to_shaft(f, prof, float(z)) for z in fine.points["z"]],
                    "s1_per_nominal": (fine.points["s1"] / fine.nominal).tolist(),
                    "vm_per_nominal": (fine.points["vm"] / fine.nominal).tolist()},
            # stress components per nominal at the points of the study's last common mesh (fineness
            # fineness[-1], the same for every load), for superposing a station's loads point by point
            # (compare/checks/feature_local.py); kept out of results.json
            "components": {"r": comp["r"], "at": np.array([model_to_shaft(f, prof, float(z)) for z in comp["z"]]),
                           "cos": comp["cos"] / common.nominal, "sin": comp["sin"] / common.nominal,
                           "fineness": fineness[-1]},
        }
    return out

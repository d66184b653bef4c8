"""Accuracy evidence on every run: adaptive refinement to the requested accuracy, then a
three-mesh convergence study (observed order, Richardson extrapolation, Grid Convergence Index).

1. **Adaptive start.** The recovery (Zienkiewicz–Zhu) indicator of the torsion stress function and of
   both shear functions, relative to each field's peak, sets a new element size everywhere (gmsh
   re-meshes the exact geometry under that background size, so the boundary stays curved), until the
   indicator is below a fraction of the target.
2. **Study.** The adapted size field S is meshed at S·r² and S·r as well (r = :data:`RATIO`, all
   sizes scaled together: geometrically similar meshes); the finest, S, gives the reported results. From the three values of every reported quantity:
   observed order, extrapolated value and GCI (Roache, J. Fluids Eng. 116:405–413, 1994; Fs = 1.25 with
   three meshes; the unequal-ratio form of Celik et al., J. Fluids Eng. 130, 2008, with the
   representative ratio from the DOF counts).
3. **More.** While an estimate is above the target, the field is refined by 1/r and the oldest mesh
   drops out (one new solve per step). Only the documented limits ``analysis.max_dofs`` and
   ``analysis.max_seconds`` stop this; there is no cap on the number of steps.

A quantity next to a sharp re-entrant corner has no converged value; it is tracked only to show that.
"""
from __future__ import annotations

import math
import time
from dataclasses import dataclass, field

import numpy as np

from classic.gci import convergence_study
from fem.bases import interpolate
from fem.errors import LimitError
from fem.estimate import adapted_sizes, element_sizes, near_points, recovery_indicator, triangles_xy
from fem.linalg import record_solves, reuse_factorisations
from fem.mesh import MeshOptions, mesh_section
from fem.properties import area_moments
from fem.shear import shear_peak, solve_shear
from fem.torsion import SINGULAR_RADIUS, add_warping, solve_torsion

from ..case.case import FINENESS_RANGE, check_fineness  # noqa: F401  (re-exported for callers)
from .progress import tick

RATIO = 1.4  # refinement ratio between the meshes of the study (Celik et al. advise r > 1.3)
SAFETY = 0.5  # the adaptive start aims the recovery indicator at this fraction of the target
MAX_ADAPT = 2  # adaptive re-meshing steps before the study (a start, not a limit: the study refines on)
FS = 1.25  # GCI factor of safety with three or more meshes (Roache 1994)
FS_OSCILLATORY = 3.0  # applied to the spread of the three values when they do not converge monotonically


@dataclass
class Solution:
    """Everything solved on one mesh."""

    mesh: object
    props: object
    torsion: object
    shear: object | None
    shear_peak: object | None
    spec: tuple  # (fineness, size field or None)
    seconds: float
    has_shear_force: bool = False

    @property
    def dofs(self) -> int:
        return self.torsion.dofs


def solve_on(case, fineness: float, size_field=None, warping: bool = False, mesh=None) -> Solution:
    """Mesh and solve; the warping check is left out unless asked (the final mesh adds it). ``mesh``,
    if given, is this very mesh made already (the pilot at the same fineness): it is not made again."""
    t0 = time.perf_counter()
    tick("mesh and solve")
    sm = mesh if mesh is not None else mesh_section(case.section, MeshOptions(fineness=fineness), size_field)
    pr = area_moments(sm)
    tr = solve_torsion(sm, pr.centroid, warping=warping)
    sr = pk = None
    if case.material.poisson is not None:
        sr = solve_shear(sm, pr, case.material.poisson)
        if case.loads.shear is not None:  # without a shear force no shear peak is reported or studied
            pk = shear_peak(sm, sr, *case.loads.shear)
    # a mesh made earlier still counts its meshing time: later steps are predicted from this one
    made = mesh.seconds if mesh is not None else 0.0
    return Solution(sm, pr, tr, sr, pk, (fineness, size_field), time.perf_counter() - t0 + made,
                    case.loads.shear is not None)


def quantities(sol: Solution) -> dict[str, float]:
    """The reported quantities whose accuracy is studied: J, the torsion peak (per unit torque), and
    with Poisson's ratio the shear centre and coefficients, plus the shear peak when the case gives a
    shear force (otherwise no shear stress is reported, so none is studied)."""
    q = {"J": sol.torsion.J, "tau_max": sol.torsion.peak_per_torque}
    if sol.torsion.peak_at_corner_per_torque is not None:
        q["tau_max_corner"] = sol.torsion.peak_at_corner_per_torque
    if sol.shear is not None:
        if sol.has_shear_force:
            q["shear_tau_max"] = sol.shear_peak.value
        q["shear_centre_x"], q["shear_centre_y"] = sol.shear.centre
        q["kappa_x"], q["kappa_y"] = sol.shear.kappa_x, sol.shear.kappa_y
    return q


def _weight(basis, u_grad_mag_peak, grad_fn) -> np.ndarray:
    """Per-element weight: 1 where the local stress is at least half the peak, falling off as its
    square below that. The requested accuracy is on the peaks (and on integrals, which converge
    faster), so low-stress regions such as the convex corners where a keyway meets the shaft surface
    need not be resolved to the peak's accuracy."""
    g = grad_fn(basis)
    level = np.sqrt(np.max(g, axis=1)) / u_grad_mag_peak
    return np.clip(level / 0.5, 0.0, 1.0) ** 2


def indicator(sol: Solution) -> tuple[np.ndarray, np.ndarray]:
    """Relative recovery indicator per element (largest over the fields: the torsion stress function
    relative to its boundary peak, each shear function relative to its unit-force stress peak),
    weighted by the local stress level (:func:`_weight`), and the mask of elements next to a singular
    corner."""
    tr = sol.torsion
    peak = tr.peak_per_torque * tr.J
    w = _weight(tr.basis, peak, lambda b: np.sum(np.asarray(interpolate(b, tr.phi).grad) ** 2, axis=0))
    rel = w * recovery_indicator(tr.basis, tr.phi) / peak
    if sol.shear is not None:
        sr = sol.shear
        for k, u in enumerate((sr.psi, sr.phi)):
            pk = shear_peak(sol.mesh, sr, 1.0 - k, float(k), moment=False).value * sr.delta
            ux = sr.unit_stresses_at(sr.basis)[k]

            def g2(_b, ux=ux):
                return (np.asarray(ux[0]) ** 2 + np.asarray(ux[1]) ** 2) * sr.delta**2

            w = _weight(sr.basis, pk, g2)
            rel = np.maximum(rel, w * recovery_indicator(sr.basis, u) / pk)
    keep = near_points(sol.mesh.mesh, sol.torsion.singular_corners, SINGULAR_RADIUS * sol.mesh.section.length_scale)
    return rel, keep


@dataclass
class Study:
    solutions: list
    target: float
    max_dofs: int
    limited: str | None = None  # why refinement stopped short of the target, if it did
    adapt_steps: int = 0
    refine_steps: int = 0  # refinement steps past the first study (no cap: only max_dofs and max_seconds stop them)
    indicator_max: list = field(default_factory=list)
    seconds: float = 0.0
    distinct: bool = True  # the study's meshes are distinct and refined by the stated ratio
    ratios: list = field(default_factory=list)  # measured ratios between the study's meshes
    solves: list = field(default_factory=list)  # every linear solve: size, method, residual (fem.linalg)


#: Measured cost of one mesh-and-solve against unknowns: time ∝ N^1.3 (gmsh meshing 1.2, assembly
#: 1.1, solves 1.3; tests/benchmarks). Used to predict whether the next mesh fits the time left.
COST_EXPONENT = 1.3

#: Seconds a run may exceed ``analysis.max_seconds`` by: the work after the study (warping check,
#: stresses over the load cycle, results) is reserved from the budget by prediction, but the first
#: mesh must be made before anything can be predicted, and predictions miss. Stated in docs/outputs.md.
MARGIN_SECONDS = 10.0

#: Accepted band of the measured refinement ratio between successive meshes of the study, from
#: the DOF counts (√(N_fine/N_coarse)) and from the median element size. The meshes are sized at
#: exactly RATIO; gmsh's meshes of a size field follow it only approximately, and local feature
#: refinement grows more slowly than the bulk, so the DOF ratio runs below r². A ratio below
#: 1.1 means the meshes are nearly the same and the study proves nothing (Celik et al. 2008 advise
#: r > 1.3 for the mesh sizes; the DOF ratio is the looser measure).
RATIO_BAND = (1.1, 2.0)


def _predict_seconds(sol: Solution, dofs: float) -> float:
    return sol.seconds * (max(dofs, 1.0) / sol.dofs) ** COST_EXPONENT


def pilot_fineness(fineness: float) -> float:
    """Fineness of the pilot mesh: the first mesh itself at fineness ≤ 0.5; the fineness of the
    study's coarsest mesh, ``fineness/RATIO²``, up to fineness 1 (at most 0.51: the pilot is then
    that very mesh when the adaptive start leaves the first mesh as it is, and is not made again);
    0.5 above that."""
    if fineness <= 0.5:
        return fineness
    return fineness / RATIO**2 if fineness <= 1.0 else 0.5


def first_mesh_dofs(case, fineness: float) -> tuple[int, object]:
    """Estimate the unknowns of the first mesh before making it: a pilot mesh at fineness ≤ 0.51
    (:func:`pilot_fineness`: a few thousand unknowns), its bulk part (8/√3·A/h², P2 on equilateral
    triangles) scaled by the fineness squared and the rest (feature refinement, which grows at most
    linearly with the fineness) by the fineness. Measured 0.84–1.13× the real count (two demo and
    two verification cases at fineness 1 and 3): not a strict bound, a first mesh may pass max_dofs
    by about a fifth. Returns the estimate and the pilot mesh (the first mesh itself when its
    fineness is the first mesh's; see :func:`_refine` for its other use)."""
    fp = pilot_fineness(fineness)
    pilot = mesh_section(case.section, MeshOptions(fineness=fp))
    n = int(pilot.mesh.p.shape[1])
    if fp == fineness:
        return n, pilot
    A = float(pilot.boundary.integrals["A"])
    bulk = min(n, 8.0 / math.sqrt(3.0) * A / pilot.h_global**2)
    k = fineness / fp
    return int(bulk * k**2 + (n - bulk) * k), pilot


def _next_dofs_from_field(sol: Solution, sizes: np.ndarray) -> float:
    """Unknowns of a mesh made under the background ``sizes`` on the triangles of ``sol``'s mesh:
    its count scaled by Σ area/size² against the same sum with the current element sizes."""

    h_now = element_sizes(sol.mesh.mesh)
    s = np.asarray(sizes, float)
    s = np.min(s, axis=1) if s.ndim == 2 else s
    area = np.sqrt(3.0) / 4.0 * h_now**2
    return sol.dofs * float(np.sum(area / np.minimum(s, sol.mesh.h_global) ** 2) / np.sum(area / h_now**2))


def mesh_ratios(coarse: Solution, fine: Solution) -> tuple[float, float]:
    """Measured refinement ratio between two meshes: from the DOF counts, √(N_fine/N_coarse), and
    from the median element size."""

    r_dofs = math.sqrt(fine.dofs / coarse.dofs)
    r_size = float(np.median(element_sizes(coarse.mesh.mesh)) / np.median(element_sizes(fine.mesh.mesh)))
    return r_dofs, r_size


def _distinct(seq: list) -> tuple[bool, list]:
    lo, hi = RATIO_BAND
    ratios = [mesh_ratios(a, b) for a, b in zip(seq[:-1], seq[1:])]
    ok = all(lo <= r <= hi for pair in ratios for r in pair)
    return ok, [[float(r) for r in pair] for pair in ratios]


def refine_to_accuracy(case, target: float, max_dofs: int, fineness: float | None = None,
                       max_seconds: float = math.inf) -> Study:
    """Adaptive start, then the study, refined until every targeted GCI is within ``target`` or a
    limit (DOFs, seconds, steps) stops it; ``Study.limited`` then says which.

    Limits are kept before work, not after: the first mesh's size is estimated before it is made
    (refused with :class:`~fem.errors.LimitError` above ``max_dofs``), and every later mesh is made
    only if its estimated size fits ``max_dofs`` and its predicted time (with the time the final
    steps need) fits what is left of ``max_seconds``. A run whose limits do not allow even the
    first study ends with LimitError (exit 3, nothing written)."""

    t0 = time.perf_counter()
    deadline = t0 + max_seconds

    def fits(seconds: float) -> bool:
        return time.perf_counter() + seconds <= deadline

    f0 = fineness if fineness is not None else case.analysis.fineness
    est0, first = first_mesh_dofs(case, f0)
    if est0 > max_dofs:
        raise LimitError(f"the first mesh at fineness {f0:g} would have about {est0} unknowns, above "
                         f"analysis.max_dofs = {max_dofs}: lower the fineness or raise max_dofs")
    with record_solves() as solves, reuse_factorisations():
        study = _refine(case, target, max_dofs, f0, fits, LimitError, max_seconds, first)
    study.solves = solves
    study.seconds = time.perf_counter() - t0
    return study


def _refine(case, target, max_dofs, f0, fits, LimitError, max_seconds, pilot=None) -> Study:
    # the pilot is the first mesh (same fineness) or, when no adaptive step changes the first mesh,
    # the study's coarsest one (fineness f0/RATIO², no size field): made once, used where it fits
    same = pilot is not None and pilot.options.fineness == f0
    sol = solve_on(case, f0, mesh=pilot if same else None)
    spare = None if same else pilot
    h_max = sol.mesh.h_global
    study = Study([], target, max_dofs)
    # the final steps (warping check, stresses) cost about one more solve on the finest mesh
    coarse_cost = _predict_seconds(sol, sol.dofs / RATIO**2) + _predict_seconds(sol, sol.dofs / RATIO**4)
    if not fits(coarse_cost + sol.seconds):
        raise LimitError(f"analysis.max_seconds = {max_seconds:g} s is too short for the first convergence study "
                         f"(the first mesh alone took {sol.seconds:.2g} s)")
    # --- adaptive start
    for _step in range(MAX_ADAPT):
        rel, keep = indicator(sol)
        rel_max = float(np.max(np.where(keep, 0.0, rel)))
        study.indicator_max.append(rel_max)
        if rel_max <= SAFETY * target:
            break
        sizes = adapted_sizes(sol.mesh, rel, SAFETY * target, h_max, keep)
        n_next = _next_dofs_from_field(sol, sizes)
        if n_next > max_dofs:
            break
        # the adapted mesh, the study's two coarser ones and the final steps must all fit
        if not fits(_predict_seconds(sol, n_next) * (2.0 + 1.0 / RATIO**2.6 + 1.0 / RATIO**5.2)):
            break
        nxt = solve_on(case, f0, (triangles_xy(sol.mesh.mesh), sizes))
        if nxt.dofs > max_dofs:
            break
        sol = nxt
        study.adapt_steps += 1
    # --- the study: S·r², S·r, S
    fine, field_ = sol.spec

    def scaled(s):
        if field_ is None:
            f = fine / s
            made = spare if spare is not None and spare.options.fineness == f else None
            return solve_on(case, f, mesh=made)
        tri, sz = field_
        return solve_on(case, fine / s, (tri, sz * s))

    # the adapted mesh is the finest; two coarser ones make the study (the finest gives the results)
    seq = [scaled(RATIO**2), scaled(RATIO), sol]
    extra = 0
    while True:
        study.solutions = seq
        ensure_warping(seq[-1])  # the second, independent torsion peak and the J bracket (see estimates())
        study.distinct, study.ratios = _distinct(seq)
        est = estimates(seq)
        worst = max((v["gci"] for k, v in est.items() if k in TARGETED and v["gci"] is not None), default=0.0)
        unknown = any(v["gci"] is None for k, v in est.items() if k in TARGETED)
        if worst <= target and not unknown and study.distinct:
            study.limited = None
            break
        n_next = seq[-1].dofs * RATIO**2
        if n_next > max_dofs:
            study.limited = f"the next mesh would exceed analysis.max_dofs = {max_dofs}"
            break
        if not fits(2.0 * _predict_seconds(seq[-1], n_next)):
            study.limited = (f"analysis.max_seconds = {max_seconds:g} s: the next mesh would not finish "
                             "within the time left")
            break
        seq = seq[1:] + [scaled(1.0 / RATIO ** (extra + 1))]
        extra += 1
        study.refine_steps = extra
    if not study.distinct and study.limited is None:
        study.limited = "the meshes of the study are not refined by the stated ratio"
    ensure_warping(seq[-1])
    return study


def ensure_warping(sol: Solution) -> None:
    """Solve the warping function on ``sol``'s mesh unless done (it gives the second torsion peak and
    the upper bound of J that :func:`estimates` uses on the finest mesh)."""
    if not math.isfinite(sol.torsion.peak_warping_per_torque):
        add_warping(sol.mesh, sol.torsion, sol.props.centroid)


#: Formal order of convergence of each quantity with P2 elements: peak stresses (gradients at points)
#: h², energy-type integrals (J, κ) h⁴. The GCI uses min(observed, formal) — an observed order above
#: the formal one is not trusted (common practice; Roache, Verification and Validation in
#: Computational Science and Engineering, 1998, from memory).
FORMAL_ORDER = {"J": 4.0, "kappa_x": 4.0, "kappa_y": 4.0, "tau_max": 2.0, "shear_tau_max": 2.0,
                "shear_centre_x": 2.0, "shear_centre_y": 2.0,
                # peaks of the 3-D segments (solve/segments.py): P2 stresses, like tau_max
                "kt_axial": 2.0, "kt_bending_x": 2.0, "kt_bending_y": 2.0, "kts": 2.0}

#: Quantities the requested accuracy applies to (the corner value never converges and is excluded).
TARGETED = ("J", "tau_max", "shear_tau_max", "shear_centre_x", "shear_centre_y", "kappa_x", "kappa_y")
LENGTHS = ("shear_centre_x", "shear_centre_y")  # judged relative to the section size, not their value


def estimates(seq: list[Solution]) -> dict[str, dict]:
    """Per quantity: the convergence study on the three meshes (fine to coarse)."""
    qs = [quantities(s) for s in reversed(seq)]  # fine first
    dofs = [s.dofs for s in reversed(seq)]
    # the meshes are geometrically similar by construction (every size scaled by RATIO); the
    # representative ratio from the DOF counts is reported beside it
    r21 = r32 = RATIO
    size = math.sqrt(seq[-1].props.area)
    out = {}
    for key in qs[0]:
        if not all(key in q for q in qs):
            continue
        vals = [q[key] for q in qs]
        out[key] = one_study(key, vals, dofs, (r21, r32), size)
    independent_bounds(out, seq[-1].torsion)
    return out


#: How the estimate of the torsion peak and of J is made from the three-mesh study and the two
#: independent solutions on the finest mesh (stress function and warping function), recorded as
#: ``estimate_kind``.
ESTIMATE_KINDS = {
    "study": "three-mesh study (GCI, or the spread when the values do not converge monotonically)",
    "study+parting": "three-mesh study plus the parting of the two independent peak evaluations on the finest mesh",
    "bracket": "the J bracket: the warping-function J above and the stress-function J below the exact J",
}


def independent_bounds(out: dict, tr) -> None:
    """Widen the study's estimates of ``tau_max`` and ``J`` with what the two independent torsion
    solutions of the finest mesh show; a bias that all three meshes of the study share (their
    values on one side of the exact one) is invisible to the study itself.

    - ``tau_max``: the study's estimate plus the parting of the stress-function and warping-function
      peaks, |τ_w − τ_φ|/τ_φ. The two are independent evaluations of the same peak (different unknowns,
      different derivatives); their difference is of the size of the error. Measured on the nine
      verification cases at fineness 0.8, 0.9, 1, 1.12 and 1.25, each unturned and turned 30° (72
      values with a true error of at least 1 % of the target): the study alone fell short of the true
      error by up to 1.15× (three values on one side of the exact one), the parting alone by up to
      2.7×; their sum covered every one, by 1.98× or more, and stayed within 50× of it.
    - ``J``: at least the relative width of the bracket (J_warping − J)/J: the stress-function J is a
      lower and the warping-function J an upper bound of the exact J of the meshed domain
      (complementary and potential energy; Timoshenko & Goodier, Theory of Elasticity, 3rd ed.,
      chapter 10), so on a straight-edged section the bracket bounds the error whatever the meshes.

    The study's own value stays under ``gci_study``; ``gci`` is the estimate used everywhere."""
    d = out.get("tau_max")
    if d is not None and d["gci"] is not None and math.isfinite(tr.peak_warping_per_torque) and tr.peak_per_torque > 0:
        parting = abs(tr.peak_warping_per_torque - tr.peak_per_torque) / tr.peak_per_torque
        d.update(gci_study=d["gci"], peak_parting=parting, gci=d["gci"] + parting, estimate_kind="study+parting")
    d = out.get("J")
    if d is not None and d["gci"] is not None and math.isfinite(tr.J_warping) and tr.J > 0:
        gap = abs(tr.J_warping - tr.J) / abs(tr.J)
        d.update(gci_study=d["gci"], bracket_gap=gap, gci=max(d["gci"], gap),
                 estimate_kind="bracket" if gap > d["gci"] else "study")
    for d in out.values():
        d.setdefault("estimate_kind", "study")


def one_study(key, vals, dofs, ratios, size) -> dict:
    scale = size if key in LENGTHS else abs(vals[0])
    d = dict(dofs=list(reversed(dofs)), values=list(reversed(vals)), observed_order=None, extrapolated=None,
             gci=None, asymptotic=False, status="", relative_to="section size √A" if key in LENGTHS else "value")
    spread = max(abs(v - vals[0]) for v in vals)
    if key in LENGTHS and spread <= 1e-7 * size:
        d.update(status="unchanged to round-off (fixed by symmetry)", gci=spread / size, extrapolated=vals[0], asymptotic=True)
        return d
    if scale == 0.0:
        if spread == 0.0:  # e.g. a shear peak under a zero shear force: nothing to estimate
            d.update(status="zero on every mesh (the load that drives it is zero)", gci=0.0, extrapolated=0.0,
                     asymptotic=True)
            return d
        scale = max(abs(v) for v in vals)  # zero on the finest mesh only: relative to the largest value
    if key == "tau_max_corner":
        grows = vals[0] > vals[1] > vals[2]
        d.update(status="singular corner: grows without bound as the mesh is refined" if grows else
                 "singular corner: no converged value exists", gci=None)
        return d
    try:
        s = convergence_study(vals, ratios if ratios[0] != ratios[1] else ratios[0], Fs=FS)
    except Exception as exc:  # e.g. ratios too close to 1 for the order iteration
        d.update(status=f"study failed ({exc})", gci=FS_OSCILLATORY * spread / scale)
        return d
    d["status"] = s.status
    if s.monotone and s.order is not None and s.order > 0:
        # Oberkampf & Roy's rule for the GCI (Verification and Validation in Scientific Computing,
        # 2010, §8.6; from memory): where the observed order is within 10 % of the formal one the
        # sequence is taken as asymptotic (Fs = 1.25, formal p); elsewhere Fs = 3 with p limited to
        # [0.5, formal].
        pf = FORMAL_ORDER.get(key, s.order)
        asymptotic = abs(s.order - pf) <= 0.1 * pf
        p, fs = (pf, FS) if asymptotic else (min(max(s.order, 0.5), pf), FS_OSCILLATORY)
        r, r32 = ratios[0], ratios[1]
        e21 = abs(vals[1] - vals[0])
        d["observed_order"] = s.order
        d["order_used"] = p
        d["order_limited"] = bool(s.order > pf)
        d["safety_factor"] = fs
        if s.order > 1.1 * pf:
            # the observed order ran away above the formal one: the last two meshes agree better
            # than the method's order explains, which is chance (an error crossing zero), not
            # accuracy. The last difference is then not trusted either: it is taken no smaller
            # than the earlier one reduced at the formal order. For an error C·h^p on meshes h1,
            # h2 = r21·h1, h3 = r32·h2: f2 − f1 = C·h1^p·(r21^p − 1) and f3 − f2 = C·h1^p·r21^p·(r32^p − 1),
            # so |f2 − f1| = |f3 − f2|·(r21^p − 1)/(r21^p·(r32^p − 1)); with equal ratios |f3 − f2|/r^p.
            # (With unequal, measured ratios, |f3 − f2|/r21^p fell short of it where r32 < r21.)
            # Without this the GCI fell below the true error (observed orders 12–14, issue 15).
            e21 = max(e21, abs(vals[2] - vals[1]) * (r**pf - 1.0) / (r**pf * (r32**pf - 1.0)))
            d["order_note"] = (f"observed order {s.order:.3g} above the formal {pf:g}: the formal order is used and "
                               "the last change is taken no smaller than the one before it reduced at that order")
        d["extrapolated"] = vals[0] + (vals[0] - vals[1]) / (r ** p - 1.0)
        d["gci"] = fs * e21 / scale / (r ** p - 1.0)
        d["asymptotic_ratio"] = s.asymptotic_ratio
        d["asymptotic"] = bool(asymptotic)
    else:
        # oscillatory or stalled: no order; the spread of the three values, with the two-mesh factor
        d["gci"] = FS_OSCILLATORY * spread / scale
        d["extrapolated"] = None
    return d

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
3. **More.** While a GCI is above the target and the DOF limit allows, the field is refined by 1/r
   and the oldest mesh drops out (one new solve per step).

A quantity next to a sharp re-entrant corner has no converged value; it is tracked only to show that.
"""
from __future__ import annotations

import math
import time
from dataclasses import dataclass, field

import numpy as np

from classic.gci import convergence_study
from fem.estimate import adapted_sizes, near_points, recovery_indicator, triangles_xy
from fem.mesh import MeshOptions, mesh_section
from fem.properties import area_moments
from fem.shear import shear_peak, solve_shear
from fem.torsion import SINGULAR_RADIUS, add_warping, solve_torsion

RATIO = 1.4  # refinement ratio between the meshes of the study (Celik et al. advise r > 1.3)
SAFETY = 0.5  # the adaptive start aims the recovery indicator at this fraction of the target
MAX_ADAPT = 2  # adaptive re-meshing steps before the study
MAX_EXTRA = 4  # refinement steps after the first study
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


def solve_on(case, fineness: float, size_field=None, warping: bool = False) -> Solution:
    """Mesh and solve; the warping check is left out unless asked (the final mesh adds it)."""
    t0 = time.perf_counter()
    sm = mesh_section(case.section, MeshOptions(fineness=fineness), size_field)
    pr = area_moments(sm)
    tr = solve_torsion(sm, pr.centroid, warping=warping)
    sr = pk = None
    if case.material.poisson is not None:
        sr = solve_shear(sm, pr, case.material.poisson)
        Vx, Vy = case.loads.shear if case.loads.shear else (0.0, 1.0)
        pk = shear_peak(sm, sr, Vx, Vy)
    return Solution(sm, pr, tr, sr, pk, (fineness, size_field), time.perf_counter() - t0, case.loads.shear is not None)


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
    w = _weight(tr.basis, peak, lambda b: np.sum(np.asarray(b.interpolate(tr.phi).grad) ** 2, axis=0))
    rel = w * recovery_indicator(tr.basis, tr.phi) / peak
    if sol.shear is not None:
        sr = sol.shear
        for k, u in enumerate((sr.psi, sr.phi)):
            pk = shear_peak(sol.mesh, sr, 1.0 - k, float(k)).value * sr.delta
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
    indicator_max: list = field(default_factory=list)
    seconds: float = 0.0


def refine_to_accuracy(case, target: float, max_dofs: int, fineness: float | None = None,
                       max_seconds: float = math.inf) -> Study:
    """Adaptive start, then the study, refined until every targeted GCI is within ``target`` or a
    limit (DOFs, seconds, steps) stops it; ``Study.limited`` then says which."""
    t0 = time.perf_counter()
    f0 = fineness if fineness is not None else case.analysis.fineness
    h_max = None
    sol = solve_on(case, f0)
    h_max = sol.mesh.h_global
    study = Study([], target, max_dofs)
    # --- adaptive start
    for step in range(MAX_ADAPT):
        if time.perf_counter() - t0 > max_seconds:
            break
        rel, keep = indicator(sol)
        rel_max = float(np.max(np.where(keep, 0.0, rel)))
        study.indicator_max.append(rel_max)
        if rel_max <= SAFETY * target:
            break
        sizes = adapted_sizes(sol.mesh, rel, SAFETY * target, h_max, keep)
        nxt = solve_on(case, f0, (triangles_xy(sol.mesh.mesh), sizes))
        if nxt.dofs > max_dofs:
            break
        sol = nxt
        study.adapt_steps += 1
    # --- the study: S·r², S·r, S
    fine, field_ = sol.spec

    def scaled(s):
        if field_ is None:
            return solve_on(case, fine / s)
        tri, sz = field_
        return solve_on(case, fine / s, (tri, sz * s))

    # the adapted mesh is the finest; two coarser ones make the study (the finest gives the results)
    seq = [scaled(RATIO**2), scaled(RATIO), sol]
    extra = 0
    while True:
        study.solutions = seq
        est = estimates(seq)
        worst = max((v["gci"] for k, v in est.items() if k in TARGETED and v["gci"] is not None), default=0.0)
        unknown = any(v["gci"] is None for k, v in est.items() if k in TARGETED)
        if worst <= target and not unknown:
            break
        if seq[-1].dofs * RATIO**2 > max_dofs:
            study.limited = f"the next mesh would exceed analysis.max_dofs = {max_dofs}"
            break
        if time.perf_counter() - t0 > max_seconds:
            study.limited = f"analysis.max_seconds = {max_seconds:g} s was used up"
            break
        if extra > MAX_EXTRA:
            study.limited = f"stopped after {MAX_EXTRA} refinement steps past the first study"
            break
        seq = seq[1:] + [scaled(1.0 / RATIO ** (extra + 1))]
        extra += 1
    add_warping(seq[-1].mesh, seq[-1].torsion, seq[-1].props.centroid)
    study.seconds = time.perf_counter() - t0
    return study


#: Formal order of convergence of each quantity with P2 elements: peak stresses (gradients at points)
#: h², energy-type integrals (J, κ) h⁴. The GCI uses min(observed, formal) — an observed order above
#: the formal one is not trusted (common practice; Roache, Verification and Validation in
#: Computational Science and Engineering, 1998, from memory).
FORMAL_ORDER = {"J": 4.0, "kappa_x": 4.0, "kappa_y": 4.0, "tau_max": 2.0, "shear_tau_max": 2.0,
                "shear_centre_x": 2.0, "shear_centre_y": 2.0}

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
    return out


def one_study(key, vals, dofs, ratios, size) -> dict:
    scale = size if key in LENGTHS else abs(vals[0])
    d = dict(dofs=list(reversed(dofs)), values=list(reversed(vals)), observed_order=None, extrapolated=None,
             gci=None, asymptotic=False, status="", relative_to="section size √A" if key in LENGTHS else "value")
    spread = max(abs(v - vals[0]) for v in vals)
    if key in LENGTHS and spread <= 1e-7 * size:
        d.update(status="unchanged to round-off (fixed by symmetry)", gci=spread / size, extrapolated=vals[0], asymptotic=True)
        return d
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
        d["observed_order"] = s.order
        d["order_used"] = p
        d["safety_factor"] = fs
        d["extrapolated"] = vals[0] + (vals[0] - vals[1]) / (ratios[0] ** p - 1.0)
        d["gci"] = fs * abs(vals[1] - vals[0]) / scale / (ratios[0] ** p - 1.0)
        d["asymptotic_ratio"] = s.asymptotic_ratio
        d["asymptotic"] = bool(asymptotic)
    else:
        # oscillatory or stalled: no order; the spread of the three values, with the two-mesh factor
        d["gci"] = FS_OSCILLATORY * spread / scale
        d["extrapolated"] = None
    return d

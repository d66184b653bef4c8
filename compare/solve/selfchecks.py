"""Self-checks on every run: the run tests its own numbers against bounds that hold whatever the
section, and records each as ``{name, value, limit, passed}`` under ``results.json`` ``checks``.
A failed check means the numbers cannot be trusted: the accuracy verdict becomes "not met" and the
exit code 3 (``compare.accuracy_step``).

Checks return numbers; nothing here formats text for the terminal.
"""
from __future__ import annotations

import math

import numpy as np

from fem import linalg

#: The stress-function J is a lower bound and the warping J an upper bound of the exact J of the
#: meshed domain (minimum complementary and minimum potential energy; Timoshenko & Goodier, Theory of
#: Elasticity, 3rd ed., chapter 10, from memory for the section). Both are compared on the mesh
#: (before the boundary correction, which is an estimate and obeys no bound). Round-off allowance:
#: BRACKET_ROUNDOFF × max(1, Ip/J). The warping J is the polar moment Ip less a warping term; on an
#: open thin-walled section Ip is thousands of times J, and the round-off, the quadrature error of
#: curved elements and the solve tolerance (relative residual 1e-9) in that difference grow with the
#: ratio (measured: −1.3e-8 on a half tube with t/R = 0.02, Ip/J ≈ 7500, every solve converged). The
#: failures this check is for are per cent, not parts per billion.
BRACKET_ROUNDOFF = 1e-9

#: The two peak values (stress function, warping function) may each carry the estimated error of
#: the peak (its GCI) and in opposite directions: they may part by twice it. Without a study the
#: accuracy target stands in for the estimate.
PEAK_PARTING_FACTOR = 2.0

#: Equilibrium of the shear stresses: the unit-force fields must integrate to the unit forces.
#: The Galerkin solution satisfies this up to the quadrature of the curved elements: 1e-6 of the
#: force is far above what is seen (1e-9 and below) and far below anything a designer would see.
RESULTANT_LIMIT = 1e-6

#: |τ·n| on the free boundary relative to the peak: zero in the exact solution, met only weakly by
#: the FE one, so it shrinks with the mesh like the peak's own error. Limit: 10 % of the peak,
#: a gross-failure bound (a wrong solve gives O(1)), not an accuracy measure.
TRACTION_LIMIT = 0.1

#: The shear centre lies within this many section sizes of the section's bounding box: a slit thin
#: tube, the classic extreme, has it one diameter from the tube's centre (half a diameter outside
#: the box); two sizes is generous.
CENTRE_BOX = 2.0


def _check(name: str, value, limit, passed: bool, note: str) -> dict:
    v = None if value is None or (isinstance(value, float) and not math.isfinite(value)) else float(value)
    return dict(name=name, value=v, limit=float(limit) if limit is not None else None,
                passed=bool(passed and (value is None or math.isfinite(float(value)))), note=note)


def self_checks(a, estimates: dict | None = None, target: float | None = None, solves: list | None = None) -> list[dict]:
    """The list of checks of an :class:`~compare.analysis.Analysis` (``estimates``: the
    convergence study's per-quantity dict, if there was one)."""

    tr, out = a.torsion, []
    # --- J bracket on the mesh: J_warping ≥ J (beyond round-off)
    if math.isfinite(tr.J_warping_mesh):
        gap = (tr.J_warping_mesh - tr.J_mesh) / abs(tr.J_mesh)
        allow = BRACKET_ROUNDOFF * max(1.0, abs(a.props.polar / tr.J_mesh))
        out.append(_check("J bracket: (J_warping − J_stress_function)/J on the mesh", gap, -allow,
                          gap >= -allow,
                          "the warping J is an upper bound and the stress-function J a lower bound of the exact J: "
                          "a negative gap beyond round-off means a failed solve"))
    # --- the two torsion peaks agree within the estimated error
    if math.isfinite(tr.peak_warping_per_torque) and tr.peak_per_torque > 0:
        part = abs(tr.peak_warping_per_torque - tr.peak_per_torque) / tr.peak_per_torque
        tm = (estimates or {}).get("tau_max", {})
        est = tm.get("gci_study", tm.get("gci"))  # the study's own estimate: the parting is what is checked here
        base = max(x for x in (est, target, 1e-12) if x is not None)
        # The estimate is the stress-function peak's; the warping peak (a derivative of the warping
        # function on the boundary) is the less accurate of the two and is not studied. Measured on the
        # exact ellipse at 0.01 %: stress-function peak 7.7e-6 off, warping peak 6.7e-5 off, GCI 2.5e-5.
        # So the pair must agree within twice the larger of the estimate and the requested accuracy: a
        # parting beyond that is a failed solve (the defects this catches part by factors, not 1e-4).
        limit = PEAK_PARTING_FACTOR * base
        out.append(_check("torsion peak: stress function against warping function (relative)", part, limit,
                          part <= limit, "the two independent solutions of the same peak must agree within "
                          "twice the larger of its estimated error and the accuracy target"))
    # --- linear solves
    if solves:
        worst = max(s["residual"] for s in solves if s.get("residual") is not None)
        out.append(_check("linear solves: largest relative residual", worst, linalg.RESIDUAL_TOL, worst <= linalg.RESIDUAL_TOL,
                          f"{len(solves)} solves; every one is checked and a miss stops the run"))
    # --- transverse shear
    sr = a.shear
    if sr is not None:
        r = [abs(v) for v in sr.resultant_residual["Vx"] + sr.resultant_residual["Vy"]]
        out.append(_check("shear: resultant of the unit-force stresses minus the unit force", max(r), RESULTANT_LIMIT,
                          max(r) <= RESULTANT_LIMIT, "equilibrium of the shear stresses"))
        for nm, k in (("kappa_x", sr.kappa_x), ("kappa_y", sr.kappa_y)):
            out.append(_check(f"shear: 0 < {nm} ≤ 1", k, 1.0, 0.0 < k <= 1.0 + 1e-12,
                              "κ = (V²/A)/∫|τ|²dA ≤ 1 by the Cauchy–Schwarz inequality (∫τ dA = V)"))
        p = a.mesh.mesh.p
        L = a.case.section.length_scale
        lo, hi = p.min(axis=1) - CENTRE_BOX * L, p.max(axis=1) + CENTRE_BOX * L
        cx, cy = sr.centre
        dist = max(float(lo[0] - cx), float(cx - hi[0]), float(lo[1] - cy), float(cy - hi[1]), 0.0) / L
        out.append(_check("shear centre: distance outside a box two section sizes around the section (in sizes)",
                          dist if math.isfinite(cx) and math.isfinite(cy) else math.inf, 0.0, dist <= 0.0,
                          "a shear centre far from the section is a failed solve"))
        pk = a.shear_peak
        if pk is not None and a.case.loads.shear is not None:
            out.append(_check("shear: moment of the stresses about the shear centre (per |V|·size)",
                              abs(pk.moment_residual), RESULTANT_LIMIT, abs(pk.moment_residual) <= RESULTANT_LIMIT,
                              "the stresses of a force through the shear centre have no moment about it"))
            out.append(_check("shear: largest |τ·n| on the free boundary relative to τmax", pk.normal_traction,
                              TRACTION_LIMIT, pk.normal_traction <= TRACTION_LIMIT,
                              "the free surface carries no shear traction"))
    # --- a peak below the nominal where it cannot be
    s = a.case.section
    kts = a.kts
    if kts is not None and s.kind == "keyed":
        slack = (target or 0.0) + ((estimates or {}).get("tau_max", {}).get("gci") or 0.0)
        out.append(_check("Kts of a keyed shaft ≥ 1", kts, 1.0 - slack, kts >= 1.0 - slack,
                          "a keyway cut from a round shaft raises the peak above the round-bar nominal (every "
                          "published keyway Kts exceeds 1; common practice); allowance: target plus estimate"))
    if not np.isfinite(tr.J) or tr.J <= 0:
        out.append(_check("J > 0", tr.J, 0.0, False, "a torsion constant must be positive"))
    return out


def failed(checks: list[dict]) -> list[dict]:
    return [c for c in checks if not c["passed"]]

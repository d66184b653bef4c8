"""One case solved: mesh, section properties, torsion (and the shear solution with the study).

:func:`solve` returns an :class:`Analysis` holding the FE objects (for plots, VTU export and
later steps). The pairs against the hand formulas (:mod:`compare.pairs`), the checks
(:mod:`compare.checks`) and the results dictionary (:mod:`compare.output.results`) are added by
the rooms above; :func:`compare.pipeline.analyse` runs them all.
"""
from __future__ import annotations

import math
import time
from dataclasses import dataclass, field

import numpy as np

from classic import torsion as ct
from fem.errors import InputError
from fem.mesh import SectionMesh
from fem.properties import AreaMoments
from fem.torsion import TorsionResult

from ..case.case import Case
from .accuracy import refine_to_accuracy, solve_on


@dataclass
class Analysis:
    case: Case
    mesh: SectionMesh
    props: AreaMoments
    torsion: TorsionResult
    pairs: list  # compare.pairs.pairs.Pair, added by the pairs room
    seconds: dict
    extra: dict = field(default_factory=dict)  # results of later steps, by key
    shear: object = None  # fem.shear.ShearResult when Poisson's ratio is known
    shear_peak: object = None  # fem.shear.ShearPeak when shear forces are given
    study: object = None  # compare.solve.accuracy.Study: the meshes of the convergence study

    # ------------------------------------------------------------------ derived torsion values
    @property
    def torque(self) -> float:
        return self.case.loads.torque

    @property
    def tau_max(self) -> float:
        return abs(self.torque) * self.torsion.peak_per_torque

    def nominal_shear(self) -> tuple[float, str, str] | None:
        """Handbook nominal for Kts: 16T/(πd³) on the full diameter (16TD/(π(D⁴−d⁴)) with a bore)."""
        s = self.case.section
        if not s.diameter:
            return None
        T = abs(self.torque) or 1.0
        if s.bore:
            return (ct.tube_peak_shear(T, s.diameter, s.bore), "16·T·D/(π(D⁴−d⁴)) on the full diameter and the bore",
                    "elementary torsion of a tube; the handbook convention for Kts (Peterson's Stress Concentration Factors)")
        return (ct.keyed_nominal_shear(T, s.diameter), "16·T/(π·d³) on the full diameter",
                "elementary torsion of a round bar; the handbook convention for Kts (Peterson's Stress Concentration Factors)")

    @property
    def kts(self) -> float | None:
        nom = self.nominal_shear()
        if nom is None or self.torsion.singular_corners:
            return None
        T = abs(self.torque) or 1.0
        return T * self.torsion.peak_per_torque / nom[0]

    def where(self, at) -> dict:
        return locate(self.mesh, at)


def solve(case: Case, fineness: float | None = None, study: bool = True) -> Analysis:
    """Solve the case. With ``study`` (the default, and what the command line does), refine to the
    case's accuracy target and run the convergence study; the results come from the finest mesh."""
    m = case.material
    if m.shear_modulus is None:
        raise InputError("material.shear_modulus", None,
                         "is required (or give elastic_modulus and poisson)")
    if case.loads.shear is not None and m.poisson is None:
        raise InputError("material.poisson", None, "is required for transverse shear (loads.shear is given)")
    t0 = time.perf_counter()
    if study:
        st = refine_to_accuracy(case, case.analysis.accuracy, case.analysis.max_dofs, fineness,
                                case.analysis.max_seconds)
        sol = st.solutions[-1]
    else:
        st = None
        sol = solve_on(case, fineness if fineness is not None else case.analysis.fineness, warping=True)
    t1 = time.perf_counter()
    a = Analysis(case, sol.mesh, sol.props, sol.torsion, [], dict(solve=t1 - t0, final_mesh=sol.seconds))
    a.shear, a.shear_peak = sol.shear, sol.shear_peak
    a.study = st
    return a


def locate(sm: SectionMesh, at) -> dict:
    """Where a point is, in words a designer uses: which boundary, on what kind of curve, at which
    keyway, and its angle and distance about the shaft axis (SI; the report formats it)."""
    x, y = at
    s = sm.section
    ox, oy = s.origin
    loc = dict(at=[float(x), float(y)], angle_deg=math.degrees(math.atan2(y - oy, x - ox)) % 360.0,
               distance_from_axis=math.hypot(x - ox, y - oy), boundary=None, feature=None, radius=None, keyway=None)
    X = np.asarray(sm.boundary_basis().global_coordinates())
    d = np.hypot(X[0] - x, X[1] - y)
    i = int(np.argmin(np.min(d, axis=1)))
    curve = sm.curve_of(int(sm.boundary_facets[i]))
    if curve is not None and float(np.min(d)) < 1e-3 * s.length_scale:
        loc["boundary"] = "outer" if curve.loop == 0 else f"hole {curve.loop}"
        if curve.kind == "arc" and curve.radius is not None and curve.radius < 0.25 * s.length_scale:
            loc["feature"], loc["radius"] = "fillet", curve.radius
        else:
            loc["feature"] = {"line": "straight edge", "arc": "arc", "ellipse": "curved edge"}.get(curve.kind, "curved edge")
            if curve.kind == "arc":
                loc["radius"] = curve.radius
    if s.kind == "keyed":
        def off(i):
            return abs((loc["angle_deg"] - (s.keyways[i].angle + s.rotation) + 180.0) % 360.0 - 180.0)
        k = min(range(len(s.keyways)), key=off)
        if off(k) < 60.0:
            loc["keyway"] = k + 1
    return loc

"""One case solved and set beside the hand formulas: mesh, section properties, torsion (the solve
room does the work), and the torsion pairs against the hand formulas.

:func:`solve_case` returns an :class:`Analysis` holding the FE objects (for plots, VTU export and
later steps). The later steps (shear, accuracy, checks) are run in order by
:func:`compare.pipeline.analyse`; :func:`compare.output.results.build_results` makes the
JSON-ready dictionary in SI base units.
"""
from __future__ import annotations

import math
import time
from dataclasses import dataclass, field

import numpy as np

from classic import properties as cp
from classic import torsion as ct
from fem.errors import InputError
from fem.mesh import SectionMesh
from fem.properties import AreaMoments
from fem.torsion import TorsionResult

from ..case.case import Case
from ..solve.accuracy import refine_to_accuracy, solve_on
from .counterparts import recognise
from .hand_shapes import HAND_KINDS, NOMINAL_OF, hand_pairs
from .pairs import Pair, not_applicable

#: Accepted FE-vs-exact tolerances in 'check' pairs, each with its reason.
TOL_J = (2e-4, "default mesh targets 0.02 % on J (issue 2); measured errors are far below")
TOL_PEAK = (1e-2, "default mesh targets 1 % on the boundary peak stress")
TOL_PROP = (1e-5, "curved second-order elements reproduce areas and moments of arcs to better than 1e-5")


@dataclass
class Analysis:
    case: Case
    mesh: SectionMesh
    props: AreaMoments
    torsion: TorsionResult
    pairs: list[Pair]
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
        """Handbook nominal for Kts: 16T/(πd³) on the nominal diameter (16TD/(π(D⁴−d⁴)) with a bore);
        the nominal diameter is the full diameter unless the section names another (Section.nominal)."""
        s = self.case.section
        if not s.nominal:
            return None
        T = abs(self.torque) or 1.0
        on = "the full diameter" if s.nominal == s.diameter else f"the nominal diameter ({NOMINAL_OF.get(s.kind, 'given')})"
        if s.bore:
            return (ct.tube_peak_shear(T, s.nominal, s.bore), f"16·T·D/(π(D⁴−d⁴)) on {on} and the bore",
                    "elementary torsion of a tube; the handbook convention for Kts (Peterson's Stress Concentration Factors)")
        return (ct.keyed_nominal_shear(T, s.nominal), f"16·T/(π·d³) on {on}",
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


def solve_case(case: Case, fineness: float | None = None, study: bool = True) -> Analysis:
    """Solve the case and pair the torsion results. With ``study`` (the default, and what the command
    line does), refine to the case's accuracy target and run the convergence study; the results come
    from the finest mesh. The later steps are :func:`compare.pipeline.analyse`'s."""
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
    a.pairs = torsion_pairs(a)
    return a


def torsion_pairs(a: Analysis) -> list[Pair]:
    """The FE results beside their hand formulas (or the reason there is none)."""
    s, tr, pr = a.case.section, a.torsion, a.props
    out: list[Pair] = []
    cp_ = recognise(s)
    if cp_ is not None:
        out.append(Pair("torsion constant J", tr.J, cp_.J, f"{cp_.name}: {cp_.source}", "check", "second_moment", *TOL_J))
        out.append(Pair("peak torsional shear τmax per unit torque", tr.peak_per_torque, cp_.peak_per_torque,
                        f"{cp_.name}: {cp_.source}", "check", "per_cubic", *TOL_PEAK))
        if cp_.area is not None:
            out.append(Pair("area", pr.area, cp_.area, f"{cp_.name}: exact geometry", "check", "area", *TOL_PROP))
        if cp_.Ixx is not None:
            out.append(Pair("second moment Ixx", pr.Ixx, cp_.Ixx, f"{cp_.name}: exact geometry", "check", "second_moment", *TOL_PROP))
            out.append(Pair("second moment Iyy", pr.Iyy, cp_.Iyy, f"{cp_.name}: exact geometry", "check", "second_moment", *TOL_PROP))
    elif s.kind == "keyed":
        d = s.diameter
        Jr = ct.tube_torsion_constant(d, s.bore) if s.bore else ct.round_torsion_constant(d)
        out.append(Pair("J relative to the plain shaft (πd⁴/32" + (" minus the bore)" if s.bore else ")"), tr.J, Jr,
                        ROUND_NOTE, "factor", "second_moment",
                        note="no exact formula for a keyed section: the ratio is the torsional stiffness kept, not an error"))
        Ir = cp.tube_second_moment(d, s.bore) if s.bore else cp.round_second_moment(d)
        out.append(Pair("Ixx relative to the plain shaft", pr.Ixx, Ir, ROUND_NOTE, "factor", "second_moment",
                        note="bending stiffness kept about x"))
        out.append(Pair("Iyy relative to the plain shaft", pr.Iyy, Ir, ROUND_NOTE, "factor", "second_moment",
                        note="bending stiffness kept about y"))
        out.append(not_applicable("Tc/J with the round-bar J", tr.peak_per_torque,
                                  "the round-bar Tc/J does not describe a keyed section; the Kts below uses the handbook nominal instead",
                                  "per_cubic"))
    elif s.kind in HAND_KINDS:
        out.extend(hand_pairs(a))
    else:
        out.append(not_applicable("torsion constant J", tr.J, "no published closed form for this section", "second_moment"))
    nom = a.nominal_shear()
    T = abs(a.torque) or 1.0
    if nom is not None and tr.singular_corners:
        out.append(not_applicable("Kts = τmax,FE / τnominal", None,
                                  "the section has sharp re-entrant corners, where the stress is unbounded: no Kts exists "
                                  "until the real fillet radius is modelled", "stress"))
    elif nom is not None:
        kind = "check" if s.kind == "round" and s.nominal == s.diameter else "factor"
        tol = TOL_PEAK if kind == "check" else (None, "")
        out.append(Pair("Kts = τmax,FE / τnominal", T * tr.peak_per_torque, nom[0], f"nominal {nom[1]}: {nom[2]}",
                        kind, "stress", *tol,
                        note="ratio is the effective torsional stress-concentration factor" if kind == "factor" else
                        "plain round: Kts should be 1"))
    return out


ROUND_NOTE = "plain round bar of the same diameter (elementary formula)"


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

"""The hand approximations a designer uses for flats, drives and the cross-slot, set beside the FE
values, so the results show how far off each is. None of them is exact for these sections: every
pair is a ``'factor'`` (the ratio is how far the hand value is off), never a check with a tolerance.

The dimensions come from the case's resolved geometry (``Case.geometry``, SI).
"""
from __future__ import annotations

import math

from classic import torsion as ct
from classic.equivalent import equal_area_round_torsion_constant

from .pairs import Pair

#: Section kinds with hand approximations here.
HAND_KINDS = ("flatted", "square", "hexagon", "cross_slot")
#: How each kind's default nominal diameter is chosen (for the Kts formula's wording).
NOMINAL_OF = {"flatted": "the round diameter", "cross_slot": "the shaft diameter",
              "spline": "the minor (root) diameter of the external spline, as spline practice takes the shaft stress",
              "square": "the size across flats", "hexagon": "the size across flats", "custom": "given"}

COMMON = "common practice"
POLYA = ("round bar of the same area: an upper bound on J of any solid section (Saint-Venant's conjecture, "
         "proved by Pólya 1948; Pólya & Szegő, Isoperimetric Inequalities in Mathematical Physics, 1951)")
SERIES_SQUARE = ("sharp square, corner radius ignored: Saint-Venant series for the rectangle at w/t = 1 "
                 "(Timoshenko & Goodier, Theory of Elasticity, 3rd ed.; Roark's Formulas for Stress and Strain, "
                 "7th ed., Table 10.1: J = 2.25a⁴, a = half side)")


def _v(geo: dict, key: str):
    e = geo.get(key)
    return e["value"] if isinstance(e, dict) else None


def _round_pairs(a, d: float, what: str, note: str) -> list[Pair]:
    """J and τmax/T of the round bar of diameter ``d`` (the one inside the section), as factors."""
    tr, s = a.torsion, a.case.section
    src = f"round bar of {what} (elementary torsion; {COMMON})"
    bore = s.bore if s.bore and s.bore < d else None
    J = ct.tube_torsion_constant(d, bore) if bore else ct.round_torsion_constant(d)
    tau = ct.tube_peak_shear(1.0, d, bore) if bore else ct.round_peak_shear(1.0, d)
    return [Pair(f"J against the round bar of {what}", tr.J, J, src, "factor", "second_moment", note=note),
            Pair(f"τmax per unit torque against the round bar of {what}", tr.peak_per_torque, tau, src, "factor",
                 "per_cubic", note="the ratio is how far the hand peak is off (above 1: the hand value is unsafe)")]


def hand_pairs(a) -> list[Pair]:
    s, geo, tr = a.case.section, a.case.geometry, a.torsion
    out: list[Pair] = []
    if s.kind == "flatted":
        across = min(f["across_to_opposite_side"]["value"] for f in geo["flats"])
        out += _round_pairs(a, across, "the smallest size across the flats",
                            "that round bar fits inside the section, so for a solid shaft J lies above it; "
                            "the ratio is the stiffness the hand value leaves out")
        D = s.diameter
        out.append(Pair("J against the full round bar", tr.J,
                        ct.tube_torsion_constant(D, s.bore) if s.bore else ct.round_torsion_constant(D),
                        "plain round bar of the full diameter (elementary formula)", "factor", "second_moment",
                        note="the torsional stiffness kept after the flats"))
    elif s.kind in ("square", "hexagon"):
        af = _v(geo, "size") or _v(geo, "across_flats")
        if s.kind == "square" and not s.bore:
            out.append(Pair("J against the sharp square", tr.J, ct.rectangle_torsion_constant(af, af), SERIES_SQUARE,
                            "factor", "second_moment",
                            note="rounding the corners removes only corner material, where the shear stress is "
                                 "near zero: expect a ratio just below 1"))
            out.append(Pair("τmax per unit torque against the sharp square", tr.peak_per_torque,
                            ct.rectangle_peak_shear(1.0, af, af), SERIES_SQUARE, "factor", "per_cubic",
                            note="the peak is at the middle of a side, away from the rounded corners: expect a "
                                 "ratio close to 1"))
        out += _round_pairs(a, af, "the size across flats",
                            "the inscribed round bar: fits inside the section, so for a solid drive J lies above it")
    elif s.kind == "cross_slot":
        D = s.diameter
        reach = 2 * math.hypot(_v(geo, "slot_length") / 2, _v(geo, "slot_width") / 2)
        out.append(Pair("J against the tube with a bore round the cross", tr.J, ct.tube_torsion_constant(D, reach),
                        f"tube of the shaft diameter and a bore through the cross's outer corners (elementary; {COMMON})",
                        "factor", "second_moment", note="the hand value replaces the cross by the circle round it"))
        out.append(Pair("τmax per unit torque against that tube", tr.peak_per_torque, ct.tube_peak_shear(1.0, D, reach),
                        f"tube of the shaft diameter and a bore through the cross's outer corners (elementary; {COMMON})",
                        "factor", "per_cubic", note="the tube's peak is on the outside; the socket's slot ends may carry more"))
    if not s.bore and s.kind != "cross_slot":
        out.append(Pair("J against the round bar of the same area", tr.J, equal_area_round_torsion_constant(a.props.area),
                        POLYA, "factor", "second_moment", note="an upper bound: the ratio must be below 1"))
    return out


# ----------------------------------------------------------------------------- shear centre by symmetry
SYMMETRY_SOURCE = "a section with an axis of symmetry has its shear centre on that axis (common practice)"


def _same_angle(a: float, b: float) -> bool:
    return abs((a - b + 180.0) % 360.0 - 180.0) < 1e-9


def symmetry(a):
    """What symmetry puts the shear centre where, for the shapes of this module and for keyways:
    ``('point', None)`` for two axes of symmetry (the centre is the centroid), ``('axis', deg)`` for
    one axis through the shaft axis at ``deg``, ``None`` when none is known."""
    s, geo = a.case.section, a.case.geometry
    if s.kind in ("square", "hexagon", "cross_slot"):
        return ("point", None)
    if s.kind == "keyed" and len(s.keyways) == 2:
        k1, k2 = s.keyways
        if (k1.width, k1.depth, k1.fillet) == (k2.width, k2.depth, k2.fillet):
            if _same_angle(k1.angle + 180.0, k2.angle):
                return ("point", None)
            return ("axis", _bisector(k1.angle, k2.angle) + s.rotation)
    if s.kind == "flatted" and geo.get("flats"):
        fl = [(f["depth"]["value"], f["angle_deg"]["value"]) for f in geo["flats"]]
        if len(fl) == 1:
            return ("axis", fl[0][1] + s.rotation)
        if len(fl) == 2 and fl[0][0] == fl[1][0] and _same_angle(fl[0][1] + 180.0, fl[1][1]):
            return ("point", None)
        if len(fl) == 2 and fl[0][0] == fl[1][0]:  # two equal flats: symmetric about their bisector
            return ("axis", _bisector(fl[0][1], fl[1][1]) + s.rotation)
    return None


def _bisector(d1: float, d2: float) -> float:
    """Direction [deg] halfway between two directions (not opposite)."""
    a1, a2 = math.radians(d1), math.radians(d2)
    return math.degrees(math.atan2(math.sin(a1) + math.sin(a2), math.cos(a1) + math.cos(a2)))


def symmetry_centre_pairs(a, off, L: float, tol) -> list[Pair]:
    """The shear centre against what symmetry says (``off`` = centre − centroid, ``L`` the size)."""
    kind, deg = symmetry(a)
    if kind == "point":
        return [Pair("shear-centre offset from the centroid / size", float(math.hypot(*off)) / L, 0.0,
                     "a doubly symmetric section has its shear centre at the centroid (common practice)", "check",
                     "dimensionless", *tol)]
    ang = math.radians(deg)
    perp = abs(-math.sin(ang) * off[0] + math.cos(ang) * off[1])
    return [Pair("shear centre off the symmetry line / size", float(perp) / L, 0.0, SYMMETRY_SOURCE, "check",
                 "dimensionless", *tol)]

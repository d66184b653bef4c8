"""A splined shaft's FE results beside the round bars a designer would use for it (classic/splines.py):
the round bar of the minor diameter (J and the shaft stress 16T/(πd³)), the round bar of the
mean of the major and minor diameters (J) and of the major diameter (J, the upper bound). None is
exact for a spline: every pair is a factor (how far off the hand value is), never a check.
"""
from __future__ import annotations

from classic import splines as csp
from classic import torsion as ct

from .pairs import Pair

MINOR_SOURCE = ("round bar of the minor (root) diameter: common practice for the shaft body of a spline "
                "(Machinery's Handbook, 26th ed., 'Involute Splines', from memory)")
MEAN_SOURCE = "round bar of the mean of the major and minor diameters: common practice (from memory)"
MAJOR_SOURCE = "round bar of the major diameter: an upper bound of J (the section lies inside it)"


def geometry(section) -> dict:
    """``Section.geometry`` as {name: value}."""
    return {n: v for n, v, _src in section.geometry}


def spline_step(a) -> None:
    """Append the spline's hand-approximation pairs to ``a.pairs`` (nothing for other sections)."""
    s = a.case.section
    if s.kind != "spline":
        return
    g = geometry(s)
    D, d = g["major_diameter"], g["minor_diameter"]
    tr = a.torsion
    T = abs(a.torque) or 1.0
    a.pairs.append(Pair("J relative to the round bar of the minor diameter", tr.J,
                        csp.minor_diameter_torsion_constant(d), MINOR_SOURCE, "factor", "second_moment",
                        note="the teeth's share of the torsional stiffness (a lower bound: the ratio is at least 1)"))
    a.pairs.append(Pair("J relative to the round bar of the mean diameter", tr.J,
                        csp.mean_diameter_torsion_constant(D, d), MEAN_SOURCE, "factor", "second_moment",
                        note="how far off the mean-diameter stiffness estimate is"))
    a.pairs.append(Pair("J relative to the round bar of the major diameter", tr.J, ct.round_torsion_constant(D),
                        MAJOR_SOURCE, "factor", "second_moment", note="the torsional stiffness kept (at most 1)"))
    if not tr.singular_corners:
        a.pairs.append(Pair("τmax relative to 16T/(πd³) on the minor diameter", T * tr.peak_per_torque,
                            csp.minor_diameter_shear(T, d), MINOR_SOURCE, "factor", "stress",
                            note="the root-fillet stress concentration over the minor-diameter shaft stress"))

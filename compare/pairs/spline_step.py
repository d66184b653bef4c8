"""A splined shaft's FE results beside the round bars a designer would use for it (classic/splines.py):
the round bar of the minor diameter (J; its shaft stress 16T/(πd³) is the nominal of Kts, as spline
practice takes it), the round bar of the mean of the major and minor diameters (J) and of the major
diameter (J, the upper bound; its 16T/(πD³) as context). None is
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
MAJOR_NOMINAL_SOURCE = "elementary torsion of a round bar of the major diameter, 16T/(πD³): context, not the spline convention"


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
        # Kts itself is on the minor diameter (Section.nominal_diameter; the spline convention); the
        # major-diameter figure is kept as context, since a designer may meet charts on either
        a.pairs.append(Pair("τmax relative to 16T/(πD³) on the major diameter", T * tr.peak_per_torque,
                            ct.keyed_nominal_shear(T, D), MAJOR_NOMINAL_SOURCE, "factor", "stress",
                            note="context only: Kts is on the minor diameter; the major diameter understates "
                                 "the shaft stress of the spline's body"))

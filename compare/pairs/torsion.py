"""The torsion results beside their hand formulas: J, the peak shear per unit torque, the section
properties, and Kts against the handbook nominal (or the reason there is no formula)."""
from __future__ import annotations

from classic import properties as cp
from classic import torsion as ct

from ..solve.analysis import Analysis
from .counterparts import recognise
from .pairs import Pair, not_applicable

#: Accepted FE-vs-exact tolerances in 'check' pairs, each with its reason.
TOL_J = (2e-4, "default mesh targets 0.02 % on J (issue 2); measured errors are far below")
TOL_PEAK = (1e-2, "default mesh targets 1 % on the boundary peak stress")
TOL_PROP = (1e-5, "curved second-order elements reproduce areas and moments of arcs to better than 1e-5")


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
    else:
        out.append(not_applicable("torsion constant J", tr.J, "no published closed form for this section", "second_moment"))
    nom = a.nominal_shear()
    T = abs(a.torque) or 1.0
    if nom is not None and tr.singular_corners:
        out.append(not_applicable("Kts = τmax,FE / τnominal", None,
                                  "the section has sharp re-entrant corners, where the stress is unbounded: no Kts exists "
                                  "until the real fillet radius is modelled", "stress"))
    elif nom is not None:
        kind = "check" if s.kind == "round" else "factor"
        tol = TOL_PEAK if kind == "check" else (None, "")
        out.append(Pair("Kts = τmax,FE / τnominal", T * tr.peak_per_torque, nom[0], f"nominal {nom[1]}: {nom[2]}",
                        kind, "stress", *tol,
                        note="ratio is the effective torsional stress-concentration factor" if kind == "factor" else
                        "plain round: Kts should be 1"))
    return out


ROUND_NOTE = "plain round bar of the same diameter (elementary formula)"

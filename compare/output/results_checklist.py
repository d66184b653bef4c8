"""results.json blocks of the designer's checklist (compare/checks/shaft_checklist.py): ``keys``,
``splines``, ``press_fits``, ``shaft.bearing_life``, ``shaft.torsional``, and their warnings (with a
sentence each; SI numbers in the data). docs/layout.md ('Keys, fits, splines, bearing life and torsion along
the shaft') documents the keys.
"""
from __future__ import annotations

import math

from .report import Fmt


def add_checklist_results(out: dict, a) -> None:
    """Put the checklist's records in ``out`` (a layout case only) and its warnings after the others."""
    out.pop("checklist", None)
    cl = a.extra.get("checklist")
    if not cl or "shaft" not in out:
        return
    out["keys"] = cl["keys"]
    out["splines"] = cl["splines"]
    out["press_fits"] = cl["press_fits"]
    out["shaft"]["bearing_life"] = cl["bearing_life"]
    out["shaft"]["torsional"] = cl["torsional"]
    ws = checklist_warnings(cl, a.case.units)
    severe = [w for w in ws if w["code"] in SEVERE]
    rest = [w for w in ws if w["code"] not in SEVERE]
    before = list(out.get("warnings", []))
    # after the warnings that withdraw a verdict, before the rest: a key, fit or bearing that fails matters
    # as much as a factor below 1
    k = sum(1 for w in before if "no_verdict" in w["code"])
    out["warnings"] = before[:k] + severe + before[k:] + rest


#: Warnings of the checklist that report a failure (put first); the others are cautions (put last).
SEVERE = ("key_overloaded", "key_below_design_factor", "spline_overloaded", "fit_lost", "fit_slips", "fit_yields",
          "bearing_life_short", "bearing_heavy_load", "torsional_resonance")


def checklist_warnings(cl: dict, system=None) -> list[dict]:
    """The warnings of the checklist: {code, text (in the case's units), data (SI)}."""
    f = Fmt(system)
    out = []

    def _who(e: dict) -> str:
        return e.get("name") or f"at z = {f.q(e['at'], 'length', 4)}"

    def add(code, text, **data):
        out.append({"code": code, "text": text, "data": data})

    for k in cl["keys"]:
        n, nd = k["factor"], k["design_factor"]
        if n is not None and n < 1:
            add("key_overloaded", f"key in keyway {k['keyway']} at station {_who(k)}: factor of safety {n:.3g} below 1 "
                "(the key or its seat yields under the nominal stress)", station=k["station"], keyway=k["keyway"], factor=n)
        elif k["ok"] is False:
            add("key_below_design_factor", f"key in keyway {k['keyway']} at station {_who(k)}: factor of safety "
                f"{n:.3g} below the design factor {nd:g}; it needs a key {f.q(k['required_length']['governing'], 'length', 4)} "
                "long", station=k["station"], keyway=k["keyway"], factor=n)
    for s in cl["splines"]:
        add("spline_standard_governs", f"spline at station {_who(s)}: tooth shear and flank pressure are the simplified "
            "formulas (from memory, all teeth sharing evenly): the spline standard's own rating governs",
            station=s["station"])
        if s["shear_factor"] is not None and s["shear_factor"] < 1:
            add("spline_overloaded", f"spline at station {_who(s)}: tooth shear factor {s['shear_factor']:.3g} below 1",
                station=s["station"], factor=s["shear_factor"])
    for pf in cl["press_fits"]:
        if pf["fit_lost"]:
            add("fit_lost", f"press fit at station {_who(pf)}: the temperature change takes the whole interference "
                "away: the fit holds nothing at the operating temperatures", station=pf["station"])
        else:
            if pf["slip_factor_torque"] is not None and pf["slip_factor_torque"] < 1:
                add("fit_slips", f"press fit at station {_who(pf)}: it holds {pf['slip_factor_torque']:.3g} times the "
                    "torque through it: it slips", station=pf["station"], factor=pf["slip_factor_torque"])
            if pf["slip_factor_axial"] is not None and pf["slip_factor_axial"] < 1:
                add("fit_slips", f"press fit at station {_who(pf)}: it holds {pf['slip_factor_axial']:.3g} times the "
                    "axial force through it: it slides", station=pf["station"], factor=pf["slip_factor_axial"])
            for who in ("hub", "shaft"):
                n = pf[f"{who}_factor"]
                if n is not None and n < 1:
                    add("fit_yields", f"press fit at station {_who(pf)}: the {who} yields at the fit (factor {n:.3g})",
                        station=pf["station"], member=who, factor=n)
        add("fit_fretting", f"press fit at station {_who(pf)}: fretting at the hub's ends lowers the shaft's fatigue "
            "strength; " + (f"the chart factor Kt = {pf['kt_bending']:g} ({pf['kt_bending_source']}) is used in the "
                            "station's fatigue check" if pf["kt_bending"] is not None else
                            "no chart factor was given (fit.kt_bending with its source): the station's fatigue check "
                            "leaves the fit out"), station=pf["station"])
    for b in cl["bearing_life"]:
        who = b["name"] or f.q(b["at"], "length", 4)
        if "skipped" in b:
            add("bearing_life_skipped", f"bearing {who}: no rating life ({b['skipped']})", at=b["at"])
        elif b.get("ok") is False:
            add("bearing_life_short", f"bearing {who}: basic rating life {b['L10_hours']:.4g} h below the required "
                f"{b['required_life_hours']:g} h", at=b["at"])
        if b.get("heavy_load"):
            add("bearing_heavy_load", f"bearing {who}: P above half of C, outside the range of the basic rating life "
                "formula", at=b["at"])
    fr = (cl["torsional"] or {}).get("frequencies") or {}
    if fr.get("ok") is False:
        close = [w for w, r in zip(fr["values"], fr["ratios"]) if abs(r - 1) <= fr["margin"]]
        add("torsional_resonance", "a torsional natural frequency of the shaft lies within "
            f"±{fr['margin']:.0%} of the operating speed ({', '.join(f'{w * 30 / math.pi:.4g} rpm' for w in close)})",
            values=close)
    return out

"""The FE path of a layout station with a 3-D feature (a keyseat's end, a cross hole): local stresses
from the station's 3-D segment study (compare/pairs/station_segment.py) in place of the 2-D section's.

The unit-load results of the finest 3-D mesh are superposed with the station's loads N, (Mx, My), T
(compare/solve/segment_superpose.py: a standing shaft at its one instant; a rotating shaft with the
bending fixed in space, alternating von Mises from the bending's amplitude, mean von Mises from the
steady axial force and torque, Shigley's Mechanical Engineering Design, 9th ed., Sec. 6-14). The
station's loads act on the whole modelled segment — both ends of a keyseat and its prismatic middle —
so a load taken at one end of the keyseat is also applied at the other (the safe side where the loads
vary along the feature; the layout checks every candidate point along it, compare/checks/shaft_extent.py).
Then the static criteria (von Mises, Tresca; Coulomb–Mohr and modified Mohr where the case asks for them)
and the fatigue criteria of :mod:`.checks` at every surface point, the smallest factor of each the
station's FE-path value; with the station's own 2-D section (a keyed station) each criterion keeps the
smaller of the two paths (the 2-D section carries the transverse shear, the 3-D model the keyseat's end).

Not in the 3-D model: transverse shear forces (recorded as a note). When the 3-D study did not show its
accuracy target, or when its model is too short for the feature (the far-field check,
compare/checks/segment_far_field.py), the station has no verdict (:func:`no_verdict_unshown`).
Numbers and records only.
"""
from __future__ import annotations

import copy
import math
from types import SimpleNamespace

import numpy as np

from classic import stress as cs

from ..solve.segment_superpose import summary, superpose
from .checks import SHIGLEY, _fe_factors, governing, required_endurance, set_required_strength
from .feature_local import _factor_below_one
from .segment_far_field import TOO_SHORT_REASON, station_too_short

SOURCE = "3-D FE of the station's segment (unit loads superposed)"
#: Code of the warning when the 3-D study did not show its accuracy target; exit code then.
NOT_SHOWN = "segment_station_accuracy_not_met"
EXIT_NOT_SHOWN = 3
#: the reason a verdict is withheld when the 3-D study did not show its target (a station's ``governing.reason``)
NOT_SHOWN_REASON = "the 3-D segment study of the station's feature did not show its accuracy target"
#: Code of the station's own warning when its 3-D model is too short (no verdict, exit code 3 too)
TOO_SHORT = "segment_station_too_short"


def _where(local: dict, p: np.ndarray) -> dict:
    x, y, z = (float(v) for v in p)
    return {"boundary": "3-D segment surface", "feature": local["kind"].replace("_", " "),
            "z": local["centre"] + z - local["length"] / 2, "angle_deg": math.degrees(math.atan2(y, x)) % 360.0,
            "distance_from_axis": math.hypot(x, y), "source": SOURCE}


def segment_fe_path(a, local: dict) -> dict:
    """Replace the FE-path entries of the station analysis ``a`` (``static``, ``fatigue``, the
    ``governing`` result) by those of the 3-D local stresses (the 2-D section's kept beside them under
    ``plain_section``/``plain_round``). The load-dependent records are copied first, so an analysis
    shared with another candidate point is never changed. Returns the record stored as
    ``a.extra['static']['fe_local']`` / ``a.extra['fatigue']['fe_local']`` and ``a.extra['segment_local']``."""
    for key in ("static", "fatigue", "governing", "warnings", "materials", "combined"):
        if key in a.extra:
            a.extra[key] = copy.deepcopy(a.extra[key])
    case = a.case
    ld = case.loads
    Mx, My = ld.bending
    N, T = float(ld.axial or 0.0), float(ld.torque or 0.0)
    rot = bool(ld.rotating)
    keep_min = bool(local.get("keep_section_min"))
    sp = superpose(local["fields"], N, float(Mx), float(My), T, rot)
    summ = summary(sp)
    pts = sp.points
    plain_key = "plain_section" if keep_min else "plain_round"
    notes = ["the station's N, Mx, My, T superposed on the 3-D segment's unit-load results (finest mesh), at every "
             "surface sample point away from the model's end faces",
             "rotating shaft: bending fixed in space, fully reversed; alternating von Mises the largest over the shaft "
             "angle (closed form), mean von Mises from the steady axial force and torque" if rot else
             "shaft standing still: every stress is a mean stress, the moment's direction as given",
             "the station's loads act on the whole modelled segment (both keyseat ends and its middle): the safe side",
             "transverse shear forces are not in the 3-D model (the 2-D section's FE path carries them)"]
    if keep_min:
        notes.append("the station has its own 2-D section: each criterion keeps the smaller of the 2-D section's FE "
                     "path and the 3-D segment's")
    rec = {"source": SOURCE, "field": local["field"], "kind": local["kind"], "points": summ["points"],
           "angles_per_turn": summ["angles_per_turn"], "loads": {"N": N, "Mx": float(Mx), "My": float(My), "T": T,
                                                                 "rotating": rot},
           "summary": {**summ, "von_mises_peak_where": _where(local, np.asarray(summ["von_mises_peak_at"])),
                       "alternating_peak_where": _where(local, np.asarray(summ["alternating_peak_at"]))},
           "accuracy_met": bool(local["met"]), "notes": notes}
    m = case.material
    st = a.extra.get("static") or {}
    crits = st.get("criteria", [])
    new_static = {}
    if "von_mises" in crits:
        i = int(np.argmax(sp.vm_peak))
        new_static["von_mises"] = (float(cs.yield_factor_von_mises(m.yield_strength, sp.vm_peak[i])), i)
        v, k, _ = sp.worst(lambda p: p[..., 2] - p[..., 0], 2.0 / math.sqrt(3.0), of="von_mises")
        new_static["tresca"] = (float(m.yield_strength / v) if v > 0 else math.inf, k)
    for name, fn in (("coulomb_mohr", cs.coulomb_mohr_factor), ("modified_mohr", cs.modified_mohr_factor)):
        if name in crits:
            Sut, Suc = m.ultimate, m.compressive_ultimate

            def inv(p, fn=fn, Sut=Sut, Suc=Suc):
                n = np.asarray(fn(p[..., 2], p[..., 0], Sut, Suc), float)
                return np.where(np.isfinite(n) & (n > 0), 1.0 / np.where(n > 0, n, 1.0), 0.0)

            v, k, _ = sp.worst(inv, 1.0 / Sut + 1.0 / Suc)
            new_static[name] = (1.0 / v if v > 0 else math.inf, k)
    for name, (value, k) in new_static.items():
        st.setdefault(plain_key, {})[name] = {"factor": st[name], "at": st["at"][name], "where": st["where"][name]}
        if keep_min and st[name] <= value:
            continue
        st[name] = value
        st["at"][name] = [float(pts[0, k]), float(pts[1, k])]
        st["where"][name] = _where(local, pts[:, k])
    if new_static:
        st["path"] = f"{SOURCE}: local stresses at the feature, worst point and instant of the load cycle"
        st["fe_local"] = rec
        nd = case.analysis.design_factor
        if nd is not None:
            set_required_strength(st, nd, m, st.get("required_strength") or {})
    ft = a.extra.get("fatigue") or {}
    if ft and "skipped" not in ft:
        facs = _fe_factors(SimpleNamespace(sa=sp.sa, sm=sp.sm), np.arange(len(sp.sa)), ft["Se"], m.ultimate,
                           m.yield_strength)
        for name, n in facs.items():
            i = int(np.argmin(n))
            old = ft["fe"].get(name)
            if old is not None:
                ft.setdefault(f"{plain_key}_fe", {})[name] = old
            if keep_min and old is not None and old["factor"] <= float(n[i]):
                continue
            ft["fe"][name] = {"factor": float(n[i]), "at": [float(pts[0, i]), float(pts[1, i])],
                              "sigma_a_vm": float(sp.sa[i]), "sigma_m_vm": float(sp.sm[i]),
                              "where": _where(local, pts[:, i])}
            ft[name] = float(n[i])
        ft["path"] = (f"{SOURCE}: local stresses at every surface point (Kf = Kt, q = 1: no notch sensitivity "
                      "applied, conservative against the hand path)")
        ft["fe_local"] = rec
        if "von_mises" in st:
            ft["first_cycle_yield_von_mises"] = st["von_mises"]
        nd = case.analysis.design_factor
        if nd is not None:
            ft["required_endurance_limit"] = required_endurance(
                {k: v for k, v in ft["fe"].items() if k in facs}, None, nd, m.ultimate, m.yield_strength)
        ft["fe_notes"] = list(ft.get("fe_notes") or []) + [f"FE path at the 3-D feature ({SHIGLEY} criteria): " + n
                                                           for n in notes]
    gov = a.extra.get("governing")
    if not (gov or {}).get("no_verdict"):
        g = governing(a, st, ft) if (st or ft) else None
        if g is not None:
            a.extra["governing"] = g
        _factor_below_one(a)
    a.extra.setdefault("combined", {}).setdefault("notes", []).append(
        "this station has a 3-D feature: the combined stress points above are the 2-D section's; its static and "
        "fatigue FE-path factors come from the " + SOURCE)
    a.extra["segment_local"] = rec
    short = station_too_short(local["record"])
    if not local["met"] or short:
        no_verdict_unshown(a, local["record"], short)
    return rec


def no_verdict_unshown(a, rec: dict, short: list | None = None) -> None:
    """The station's 3-D study did not show its accuracy target, or its model is too short for the
    feature (``short``: the far-field record of compare/checks/segment_far_field.py): its verdicts are
    withdrawn (the values kept beside, marked), the warning first, exit code :data:`EXIT_NOT_SHOWN`
    (at least)."""
    reasons = ([] if rec["met"] else [NOT_SHOWN_REASON]) \
        + ([TOO_SHORT_REASON] if short else [])
    reason = "; ".join(reasons)
    gov = a.extra.get("governing")
    if gov and not gov.get("no_verdict"):
        a.extra["governing"] = {"factor": None, "no_verdict": True, "reason": reason, "criterion": None, "path": None,
                                "at": None, "where": None, "design_factor": a.case.analysis.design_factor,
                                "meets_design_factor": None, "away_from_corners": gov,
                                "reason_text": "no verdict: " + reason}
    st = a.extra.get("static")
    if st and "meets_design_factor" in st:
        st["meets_design_factor"] = {c: None for c in st["meets_design_factor"]}
    for e in a.extra.get("materials") or []:
        e["meets"] = None
        e["meets_what_was_checked"] = None
        e["no_verdict"] = reason
    ws = ([{"code": NOT_SHOWN, "field": rec["field"], "kind": rec["kind"], "target": rec["target"],
            "achieved": rec["achieved"], "limited_by": rec["limited_by"]}] if not rec["met"] else []) \
        + ([{"code": TOO_SHORT, "field": rec["field"], "kind": rec["kind"], **{k: v for k, v in short[0].items()
                                                                              if k != "code"}}] if short else [])
    a.extra["warnings"] = ws + [x for x in a.extra.get("warnings") or [] if x.get("code") not in (NOT_SHOWN, TOO_SHORT)]
    a.extra["exit_code"] = max(EXIT_NOT_SHOWN, a.extra.get("exit_code") or 0)

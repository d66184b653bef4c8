"""A station's verdict where its factors come from a shoulder or groove study that did not show the
case's accuracy target.

A shoulder or groove study (compare/solve/features.py) may end above ``analysis.accuracy``: its three
values converge monotonically with a bound above the target (``feature_target_not_shown``), or a
limit stopped it with a spread bound (``feature_refinement_limited``), or it has no bound at all
(``feature_no_gci``). Those warnings come first, but the station's factor of safety still rests on
that factor: through the hand path's Kt and Kts, and through the FE path's local stresses at the
fillet. Its "meets the design factor" verdict is then only supported when it still holds with every
stress raised by the factor's error bound b: each criterion the checks use (static von Mises and
Tresca, the DE fatigue criteria Goodman, Gerber, ASME elliptic and Soderberg, Langer's first-cycle
yield) is an equation in n·σ_a and n·σ_m, so stresses ×(1 + b) give exactly n/(1 + b) (the criteria
as Shigley's Mechanical Engineering Design, 9th ed., Secs. 5-4, 5-5 and 7-4, writes them). Raising
every stress, not only the part the factor scales, is the conservative side; in the hand path
Kf = 1 + q(Kt − 1) moves by no more than Kt does.

- bound within the target: nothing to do (the case asked for that accuracy);
- a "meets" verdict that still holds at n/(1 + b): kept, and the governing record says so
  (``holds_within_feature_bound``);
- a "meets" verdict that does not hold there (or a factor without a bound): withdrawn, the values
  kept beside, marked, the warning ``feature_bound_no_verdict`` first and exit code 3, as for a 3-D
  study short of its target (compare/checks/segment_local.py);
- a "does not meet" verdict is kept: it is the conservative one, and a redesign is called for anyway.
"""
from __future__ import annotations

from .findings import withdraw_verdicts
from .segment_local import NOT_SHOWN, TOO_SHORT

#: Exit code of a station (and so the shaft) whose verdict the bound withdraws: the accuracy one
EXIT_BOUND = 3
#: Code of the station's own warning when its verdict is withdrawn
NO_VERDICT = "feature_bound_no_verdict"
#: the reason a verdict is withdrawn (the governing record's ``reason``)
BOUND_REASON = ("the margin over the design factor lies within the error bound of a shoulder or groove factor "
                "whose study did not show the accuracy target")


def used_feature_bounds(st) -> dict | None:
    """The shoulder or groove factors the station's checks rest on, with their bounds: {key: {field,
    bound}} (bound None: no estimate), from ``Station.kt``: the hand path's ``kt_bending`` and
    ``kts_torsion`` where they are still the feature study's (compare/pairs/feature_step.py records
    their bounds in ``kt['feature_bounds']``; a 3-D model's factor that replaced one is not), and the
    FE path's three factors where it reads the fillet's local stresses (``kt['fillet_stresses']``).
    None when it rests on none."""
    kt = st.kt
    bounds = kt.get("feature_bounds")
    if bounds is None:
        return None
    fb, field = bounds
    out = {}
    for key in ("kt_bending", "kts_torsion"):
        if key in fb and key in kt and kt[key][1] == fb[key]["source"] and key not in st.fatigue:
            out[key] = {"field": field, "bound": fb[key]["bound"]}
    if "fillet_stresses" in kt:
        for key, v in fb.items():
            out.setdefault(key, {"field": field, "bound": v["bound"]})
    return out or None


def bound_verdict(a, rec: dict, used: dict | None, target: float) -> dict | None:
    """Test the station analysis ``a``'s verdict against the largest bound in ``used``
    (:func:`used_feature_bounds`) when that bound exceeds ``target`` (or is unknown). Withdraws a
    "meets" verdict that does not hold at n/(1 + b) (module docstring); returns the record kept on the
    station (``rec['feature_bound']``), None when no bound exceeds the target."""
    if not used:
        return None
    known = [v["bound"] for v in used.values() if v["bound"] is not None]
    unknown = any(v["bound"] is None for v in used.values())
    b = None if unknown else max(known)
    if b is not None and b <= target:
        return None
    gov = a.extra.get("governing") or {}
    n, nd = gov.get("factor"), gov.get("design_factor")
    lowered = None if (n is None or b is None) else n / (1 + b)
    out = {"bound": b, "target": target, "factors": used, "factor": n, "design_factor": nd, "factor_lowered": lowered}
    if gov.get("no_verdict") or nd is None or n is None or not gov.get("meets_design_factor"):
        out["verdict"] = "none to test" if (nd is None or n is None or gov.get("no_verdict")) else "does not meet (kept)"
    elif lowered is not None and lowered >= nd:
        out["verdict"] = "holds"
        gov["holds_within_feature_bound"] = {"bound": b, "target": target, "factor_lowered": lowered}
    else:
        out["verdict"] = "withdrawn"
        _withdraw(a, gov, out)
    rec["feature_bound"] = out
    return out


def _withdraw(a, gov: dict, out: dict) -> None:
    withdraw_verdicts(a, BOUND_REASON, note=BOUND_REASON, design_factor=gov.get("design_factor"))
    w = {"code": NO_VERDICT, **{k: out[k] for k in ("bound", "target", "factor", "design_factor", "factor_lowered")},
         "fields": sorted({v["field"] for v in out["factors"].values()})}
    a.extra["warnings"] = [w] + [x for x in a.extra.get("warnings") or [] if x.get("code") != NO_VERDICT]
    a.extra["exit_code"] = max(EXIT_BOUND, a.extra.get("exit_code") or 0)


def no_verdict_first(warnings: list) -> list:
    """``warnings`` with the station's no-verdict records first, in their order (this module's, a 3-D
    study's short of its target or too short, a sharp corner's), then the rest: the governing station
    also receives the shaft's feature findings (compare/pipeline.py), which must not push the reason a
    verdict is withheld down the list."""
    lead = {NO_VERDICT, NOT_SHOWN, TOO_SHORT, "feature_station_sharp_no_verdict"}
    return [w for w in warnings if w.get("code") in lead] + [w for w in warnings if w.get("code") not in lead]

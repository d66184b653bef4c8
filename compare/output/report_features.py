"""The summary lines and warning texts of the shoulders and grooves along the shaft
(``shaft.features`` of results.json; compare/pairs/feature_step.py)."""
from __future__ import annotations

_NAMES = {"kts": "Kts torsion", "kt_bending": "Kt bending", "kt_axial": "Kt axial"}


def _pct(v) -> str:
    return "—" if v is None else f"{100 * v:.2g} %"


def feature_lines(res: dict, f) -> list[str]:
    """Summary block: each feature, its FE factors with their error bounds, the chart beside them."""
    feats = (res.get("shaft") or {}).get("features") or []
    if not feats:
        return []
    lines = ["Shoulders and grooves (axisymmetric FE of the meridian section; chart: Roark 7th ed., Table 17.1)"]
    for r in feats:
        size = (f"d {f.q(r['d'], 'length', 4)}, D {f.q(r['D'], 'length', 4)}" if r["kind"] == "shoulder" else
                f"D {f.q(r['D'], 'length', 4)}, depth {f.q(r['depth'], 'length', 3)}, width {f.q(r['width'], 'length', 3)}")
        rad = f", radius {f.q(r['radius'], 'length', 3)}" if r.get("radius") else ""
        lines.append(f"  {r['kind']} at {f.q(r['at'], 'length', 5)} ({r['field']}): {size}{rad}")
        if r.get("skipped"):
            lines.append(f"      no factors: {_SKIP.get(r['skipped'], r['skipped'])}")
            continue
        for key, name in _NAMES.items():
            ch = r.get(f"{key}_chart") or {}
            chart = _chart_text(r[key], ch)
            pk = r.get(f"{key}_peak") or {}
            ang = f", {pk['angle']:.0f}° round the arc" if pk.get("angle") is not None else ""
            bound = "GCI" if r.get(f"{key}_gci_kind") == "gci" else "error bound"
            lines.append(f"      {name:<12} FE {r[key]:.3f} ({bound} {_pct(r.get(f'{key}_gci'))}), {chart}; "
                         f"peak at {f.q(pk.get('at'), 'length', 5)}{ang}")
            if r.get(f"{key}_limited"):
                lines.append(f"      {'':<12} refinement stopped: {r[f'{key}_limited']}")
            elif r.get(f"{key}_ended_by") == "spread_within_target":
                lines.append(f"      {'':<12} not monotone on its last three meshes; refinement ended: 3 × their "
                             "spread is within the accuracy target")
    return lines


def _chart_text(fe: float, ch: dict) -> str:
    """The chart beside the FE factor: the ratio where the fit agrees within its stated accuracy; where
    it does not, the words that the remembered fit is off there and the FE is the one to trust."""
    if ch.get("value") is None:
        return f"no chart value ({_WHY.get(ch.get('why'), ch.get('why'))})"
    if ch.get("disagrees_with_fe"):
        side = "below" if ch["chart_minus_fe"] < 0 else "above"
        return (f"chart {ch['value']:.3f} is {abs(100 * ch['chart_minus_fe']):.0f} % {side} the FE, beyond the "
                f"±{100 * (ch['allowed'] or 0):.2g} % the fit's stated accuracy and the FE's error estimate allow: "
                "the remembered fit is off here, trust the FE value")
    return f"chart {ch['value']:.3f}, FE/chart {fe / ch['value']:.3f}"


_SKIP = {"sharp_shoulder": "no fillet radius given; a sharp shoulder has an unbounded elastic stress",
         "fillet_beyond_step": "the fillet is larger than the step (not a tangent quarter arc)",
         "groove_radius_beyond_depth": "the bottom radius is larger than the depth (not modelled)",
         "composite_shoulder": "a step of a composite segment (bonded regions): the shoulder factor of one material "
                               "does not apply, and none is computed"}
_WHY = {"outside_range": "geometry outside the fit's h/r range; not extrapolated",
        "bored_shaft": "the fit is for solid shafts"}


def feature_warning_text(w: dict, f) -> str | None:
    """The words of a ``feature_*`` warning record (compare/checks/feature_findings.py)."""
    code = w["code"]
    if code == "feature_sharp_shoulder":
        return (f"NO FACTOR AT A SHARP SHOULDER: {w['field']} (at {f.q(w['at'], 'length', 5)}) gives no fillet radius. The "
                "elastic stress in a sharp corner is unbounded, so no Kt, Kts or fatigue verdict can be given there; "
                "give the fillet radius.")
    if code in ("feature_fillet_beyond_step", "feature_groove_radius_beyond_depth", "feature_composite_shoulder"):
        return (f"FEATURE NOT MODELLED: {w['field']} (at {f.q(w['at'], 'length', 5)}): "
                f"{_SKIP[code[len('feature_'):]]}; no factors are given for it.")
    if code == "feature_far_field":
        return (f"MODEL TOO SHORT: {w['field']}, {_NAMES.get(w['factor'], w['factor'])}: away from the feature the surface "
                f"stress is {w['fem']:.6g} of nominal, not {w['exact']:.6g} (tolerance {w['tolerance']:.0e}); the end "
                "conditions may reach the feature.")
    if code == "feature_no_gci":
        return (f"NO ERROR ESTIMATE: {w['field']}, {_NAMES.get(w['factor'], w['factor'])}: the three meshes gave "
                f"{w['values']}; the factor carries an unknown discretisation error.")
    if code == "feature_refinement_limited":
        return (f"FEATURE FACTOR BOUNDED BY ITS SPREAD: {w['field']}, {_NAMES.get(w['factor'], w['factor'])}: the meshes "
                f"gave {', '.join(f'{v:.5f}' for v in w['values'])}, which do not converge monotonically, and refining "
                f"further was stopped ({w['limited']}); its error bound ({_pct(w['bound'])}) is three times the spread of "
                "the last three values, not a convergence estimate.")
    if code == "feature_target_not_shown":
        return (f"FEATURE FACTOR ACCURACY TARGET NOT SHOWN: {w['field']}, {_NAMES.get(w['factor'], w['factor'])}: the meshes "
                f"gave {', '.join(f'{v:.5f}' for v in w['values'])}, which converge monotonically, but their error bound "
                f"({_pct(w['bound'])}) exceeds the target ({_pct(w['target'])}); the study does not refine further, so "
                "read the factor with that bound.")
    if code == "feature_bound_no_verdict":  # compare/checks/feature_bound.py
        bound = "unknown (a factor without an estimate)" if w["bound"] is None else _pct(w["bound"])
        low = "" if w["factor_lowered"] is None else f" to {w['factor_lowered']:.3g}"
        return (f"NO VERDICT: the factor of safety {w['factor']:.3g} meets the design factor {w['design_factor']:.3g} only "
                f"by less than the error bound of the shoulder or groove factor it rests on ({', '.join(w['fields'])}: "
                f"bound {bound}, above the accuracy target {_pct(w['target'])}). Raised by that bound, the stresses "
                f"lower it{low}, below the design factor, so the numbers do not support 'meets'; the values are kept "
                "beside, marked. Ask for a looser target only knowingly; else give the feature more unknowns "
                "(analysis.max_dofs) or a finer fineness.")
    if code == "feature_neighbours":
        return (f"FEATURES INTERACT: {w['field']} has {', '.join(w['neighbours'])} within {f.q(w['length'], 'length', 3)}; "
                "each is modelled alone on a plain shaft, so their factors ignore each other.")
    if code == "feature_station_sharp_no_verdict":
        who = w.get("name") or f.q(w["at"], "length", 5)
        fields = ", ".join(c["field"] for c in w["corners"])
        return (f"NO VERDICT AT STATION {who}: it sits at a sharp corner ({fields} not given). The elastic stress in a "
                "sharp re-entrant corner is unbounded, so this station has no peak stress and no factor of safety, "
                "and no material can be said to meet the design factor; the factors shown for it are the plain "
                "section's, away from the corner. Give the real fillet radius.")
    if code == "feature_station_fe_path":
        who = w.get("name") or f.q(w["at"], "length", 5)
        return (f"STATION ON A SHOULDER OR GROOVE ({who}): its hand path uses the FE Kt and Kts of the feature with the notch "
                "sensitivity at its radius; its FE path (local stresses) is that of the plain round section and does not "
                "see the feature, so read that station's verdict from the hand path.")
    return None


def factors_only_summary(res: dict, f) -> str:
    """The terminal summary of a layout asking for the shoulder and groove factors only."""
    lines = [f"shaftcheck {res['tool']['version']} — {res['case']['title']}",
             f"units: {f.s.name}   shoulder and groove factors only (no loads, no stations: no beam, no checks)", ""]
    for w in res.get("warnings", []):
        lines.append(f"WARNING: {w['text']}")
    if res.get("warnings"):
        lines.append("")
    lines += feature_lines(res, f)
    lines += ["", "These are stress-concentration factors, not a verdict: no load, strength or factor of safety "
              "was checked.", "", res["caution"]]
    return "\n".join(lines)

"""The shaft layout's part of ``results.json``: ``shaft`` (reactions, diagrams, deflections, slopes,
critical speeds, stations) and ``section_loads`` (one entry per checked station with its section
results beside it), and the terminal lines of the layout. SI in the results; the case's units on
the terminal. docs/layout.md documents the keys.
"""
from __future__ import annotations

import math
from dataclasses import replace

from ..checks.segment_far_field import far_field_text
from ..checks.shaft_modes import mode_shapes
from .report import Fmt
from .results_segment import model_phrase

_STATION_KEYS = ("governing", "warnings", "static", "fatigue", "torsion", "section", "exit_code", "regions",
                 "not_checked")  # regions, not_checked: a station on a composite segment


def add_shaft_results(out: dict, a, build_results) -> None:
    """Replace the raw layout records a.extra put in ``out`` by the ``shaft`` and ``section_loads``
    blocks (``build_results`` of each station's analysis is handed in: same room, no circle)."""
    out.pop("shaft_stations", None)
    rec = a.extra.get("shaft")
    if rec is None or "layout" not in rec:
        out.pop("shaft", None)
        return
    lay, stations = rec["layout"], rec["stations"]
    analyses = a.extra["shaft_stations"]
    cs = dict(lay["critical_speeds"])
    modes = mode_shapes(rec["shaft"], lay) if rec.get("shaft") is not None else None
    if modes is not None:  # the shapes of the frequencies above (the report draws them)
        cs["mode_shapes"] = modes
    d = lay["diagrams"]
    out["shaft"] = {
        "parts": lay["parts"],
        "reactions": lay["reactions"],
        "axial_reaction_note": lay["axial_reaction_note"],
        "diagrams": d["columns"],
        "max_deflection": d["max_deflection"],
        "max_moment": d["max_moment"],
        "slopes": lay["slopes"],
        "gear_deflections": lay["gear_deflections"],
        "critical_speeds": cs,
        "equilibrium_residual": lay["equilibrium_residual"],
        "beam_solve_residual": lay["fe_residual"],
        "fe_sections": lay["fe_sections"],
        "beam": {"elements": len(lay["z"]) - 1, "theory": "Timoshenko (shear deformation; rotary inertia in the "
                 "critical speeds)", "stiffness": "round-bar E·I and κ·G·A per segment; a station's FE section over "
                 "its feature length where given (fe_sections)"},
        "governing_station": lay["governing_station"],
        "composite_segments": [p.record for p in (lay.get("composite_segments") or {}).values()],
        "warnings": shaft_warnings(lay, stations),
    }
    loads = []
    for rec_st, sa in zip(stations, analyses):
        r = build_results(replace(sa, extra={k: v for k, v in sa.extra.items() if k not in ("shaft", "shaft_stations")}))
        entry = {"at": rec_st["at"], "name": rec_st["name"], **rec_st["loads"]["used"],
                 "left": rec_st["loads"]["left"], "right": rec_st["loads"]["right"],
                 "jump": rec_st["loads"]["jump"], "used_side": rec_st["loads"]["used_side"],
                 "diameter": rec_st["diameter"], "features": rec_st["features"], "kt_from": rec_st["kt_from"],
                 "checked_again": rec_st.get("checked_again", False),
                 "used_at": rec_st["loads"].get("used_at", rec_st["at"]),
                 "at_load_point": rec_st.get("at_load_point"), "extent": rec_st.get("extent"),
                 # where along the station's feature its loads were taken, where the station record says
                 **{k: rec_st[k] for k in ("loads_where", "governing_at") if k in rec_st},
                 # a 3-D feature: its study (also in results 'segments') and which FE path the station took
                 # and the far-field check's records for it (compare/checks/shaft_stations.py; empty: long enough)
                 **({"segment": rec_st["segment"], "fe_path": rec_st.get("fe_path"),
                     "segment_far_field": rec_st.get("segment_far_field") or []} if "segment" in rec_st else {}),
                 "results": {k: r[k] for k in _STATION_KEYS if k in r}}
        loads.append(entry)
    out["section_loads"] = loads
    if rec.get("segments"):  # each station's 3-D study (a [segment] case's entry, with its station)
        out["segments"] = rec["segments"]
    # the layout's warnings first, beside the governing station's own
    out["warnings"] = [{"code": w["code"], "text": w["text"], "data": {k: v for k, v in w.items() if k not in ("code", "text")}}
                       for w in out["shaft"]["warnings"]] + out.get("warnings", [])


def shaft_warnings(lay: dict, stations: list) -> list[dict]:
    """Records with a sentence each (SI numbers in the data; the terminal writes its own units)."""
    out = []
    for st in stations:  # first: stations whose 3-D study did not show its target: no verdict there
        seg = st.get("segment")
        if seg is not None and not seg["met"]:
            ach = seg["achieved"]
            out.append({"code": "station_segment_accuracy_not_met", "at": st["at"], "name": st["name"],
                        "field": seg["field"], "target": seg["target"], "achieved": ach, "limited_by": seg["limited_by"],
                        "text": f"NO VERDICT at station {st['name'] or st['at']}: ACCURACY TARGET NOT SHOWN by the 3-D "
                                f"study of its {seg['kind'].replace('_', ' ')} ({seg['field']}): target "
                                f"{100 * seg['target']:.3g} %, estimated error "
                                f"{'unknown' if ach is None else f'{100 * ach:.3g} %'}"
                                + (f" ({seg['limited_by']})" if seg["limited_by"] else "") + ". Its Kt, Kts and "
                                "local stresses are estimates, not a verdict."})
    for st in stations:  # stations whose 3-D model is too short (compare/checks/segment_far_field.py): no verdict
        out.extend(station_far_field(st))
    for st in stations:  # first: stations at a sharp corner, which can have no verdict at all
        for c in st.get("sharp") or []:
            out.append({"code": "station_sharp_no_verdict", "at": st["at"], "name": st["name"], "corner": c,
                        "text": f"NO VERDICT at station {st['name'] or st['at']}: it sits at a sharp {c['kind']} "
                                f"corner ({c['field']} not given). The elastic stress there is unbounded, so no Kt, no "
                                "local stress and no factor of safety can be given for it, and none is given for the "
                                "whole shaft; give the real fillet radius."})
    for st in stations:  # then: a rotating shaft's station on a composite segment, whose fatigue is not checked
        if st.get("fatigue_not_checked"):
            out.append({"code": "station_fatigue_not_checked", "at": st["at"], "name": st["name"],
                        "text": f"NO VERDICT at station {st['name'] or st['at']}: FATIGUE NOT CHECKED in "
                                f"{st['fatigue_not_checked']}. It is on a composite segment of a rotating shaft, so its "
                                "bending stress alternates every turn, and those regions have no fatigue data (give "
                                "ultimate and surface, or polymer data, per region); its factors leave their fatigue out "
                                "and are not a verdict for the shaft."})
    for st in stations:
        if st.get("warning") == "kt_missing" and not st.get("sharp"):
            out.append({"code": "station_kt_missing", "at": st["at"], "name": st["name"], "features": st["features"],
                        "text": f"station {st['name'] or st['at']}: at a {' and '.join(st['features'])}, which a 2-D "
                                "section cannot see; its fatigue check leaves the stress concentration out (give "
                                "fatigue.kt_bending / kts_torsion for the station with their source). Its factors are "
                                "not a verdict for the shoulder."})
        code = st.get("exit_code")
        if code and not (code == 4 and st.get("fatigue_not_checked")):  # said above
            out.append({"code": "station_without_verdict", "at": st["at"], "name": st["name"], "exit_code": code,
                        "text": f"station {st['name'] or st['at']}: its section check has no supported verdict "
                                f"(exit code {code}; see its warnings in section_loads)"})
    for p in (lay.get("composite_segments") or {}).values():
        acc = p.record["accuracy"]
        if not acc["met"]:
            got = "unknown" if acc["achieved"] is None else f"{100 * acc['achieved']:.3g} %"
            out.append({"code": "composite_segment_accuracy_not_met", "segment": p.index, "achieved": acc["achieved"],
                        "target": acc["target"], "text": f"ACCURACY TARGET NOT SHOWN for composite segment {p.index}: its "
                        f"EI, κGA and GJ carry an estimated error of {got} (target {100 * acc['target']:.3g} %"
                        f"{'; ' + acc['limited_by'] if acc['limited_by'] else ''}), and so do the beam's results (exit 3)"})
    for s in lay["slopes"]:
        if not s["ok"]:
            out.append({"code": "slope_above_limit", "at": s["at"], "name": s["name"], "slope": s["slope"],
                        "limit": s["limit"], "text": f"slope at {s['kind']} {s['name'] or s['at']} is {s['slope']:.3g} "
                        f"rad, above {s['limit']:.3g} rad ({s['basis']})"})
    for g in lay["gear_deflections"]:
        if not g["ok"]:
            out.append({"code": "gear_deflection_above_limit", "at": g["at"], "name": g["name"],
                        "text": f"deflection at gear {g['name']} above the common-practice limit"})
    cs = lay["critical_speeds"]
    if cs.get("ok") is False:
        out.append({"code": "critical_speed_margin", "text": "operating speed above half the first critical speed"})
    return out


def station_far_field(st: dict) -> list[dict]:
    """The ``segment_far_field`` warnings of a station's 3-D study with their sentences: the records
    the layout's checks left on the station (compare/checks/shaft_stations.py, from
    compare/checks/segment_far_field.py; none when its model is long enough or it has no 3-D
    feature). The station then has no verdict (compare/checks/segment_local.py)."""
    return [{**w, "text": far_field_text(w)} for w in st.get("segment_far_field") or []]


def shaft_summary(res: dict, system) -> str:
    """The layout block of the terminal summary (empty for a section-only case)."""
    sh = res.get("shaft")
    if not sh or "reactions" not in sh:  # no layout block (a case asking for the feature factors only)
        return ""
    f = Fmt(system)
    lines = ["Shaft layout (beam in two planes, Timoshenko)"]
    for w in sh["warnings"]:
        lines.append(f"  WARNING: {_warning_line(w, f)}")
    for r in sh["reactions"]:
        lines.append(f"  reaction {r['name'] or ''} at {f.q(r['at'], 'length', 4)}: Fx {f.q(r['Fx'], 'force', 4)}, "
                     f"Fy {f.q(r['Fy'], 'force', 4)}, |F| {f.q(r['F'], 'force', 4)}"
                     + (f", axial {f.q(r['Fz'], 'force', 4)} (locating bearing)" if r.get("Fz") else ""))
    md = sh["max_deflection"]
    lines.append(f"  largest deflection {f.q(md['value'], 'length', 3)} at {f.q(md['at'], 'length', 4)}; largest bending "
                 f"moment {f.q(sh['max_moment']['value'], 'moment', 4)} at {f.q(sh['max_moment']['at'], 'length', 4)}")
    for s in sh["slopes"]:
        lines.append(f"  slope at {s['kind']} {s['name'] or ''} ({f.q(s['at'], 'length', 4)}): {s['slope']:.3g} rad, "
                     f"limit {s['limit']:.3g} rad — {'ok' if s['ok'] else 'ABOVE'}")
    for g in sh["gear_deflections"]:
        lines.append(f"  deflection at gear {g['name']}: {f.q(g['deflection'], 'length', 3)}, limit "
                     f"{f.q(g['limit'], 'length', 3)} (common practice) — {'ok' if g['ok'] else 'ABOVE'}")
    cs = sh["critical_speeds"]
    if "skipped" in cs:
        lines.append(f"  critical speed: not computed ({cs['skipped']})")
    else:
        w1 = cs["values"][0] if cs["values"] else None
        text = f"  first critical speed {_rpm(w1)} (beam model), Rayleigh {_rpm(cs['rayleigh'])}"
        if cs.get("speed"):
            text += (f"; operating {_rpm(cs['speed'])}, ratio {cs['ratio']:.3g} (need ≥ {cs['margin']:g}, common "
                     f"practice) — {'ok' if cs['ok'] else 'TOO CLOSE'}")
        lines.append(text)
    lines.append("  stations:")
    for st in res.get("section_loads", []):
        gov = (st["results"].get("governing") or {})
        n = gov.get("factor")
        verdict = "no verdict" if gov.get("no_verdict") or n is None else f"n = {n:.3g} ({gov.get('criterion')})"
        hb = gov.get("holds_within_feature_bound")  # compare/checks/feature_bound.py
        if hb:
            verdict += (f"; meets the design factor also with the stresses raised by its shoulder or groove factor's "
                        f"{100 * hb['bound']:.2g} % bound (n {hb['factor_lowered']:.3g})")
        if gov.get("region") is not None:  # a station on a composite segment
            why = gov.get("not_a_verdict") or ", ".join(str(w).replace("_", " ") for w in gov.get("not_supported_because", []))
            verdict += f" in {gov['region']}" + (f"; NOT A VERDICT: {why or 'see its warnings'}"
                                                 if gov.get("verdict_supported") is False else "")
        if st.get("fe_path") == "segment":
            verdict += "; FE path from the 3-D segment's local stresses"
        elif "fe_local" in (st["results"].get("fatigue") or {}) or "fe_local" in (st["results"].get("static") or {}):
            verdict += "; FE path from the meridian-section FE at the fillet"
        M = math.hypot(st["Mx"], st["My"])
        ext = st.get("extent")
        side = f", {st['used_side']} side of a jump" if st["used_side"] and (st["jump"] or ext) else ""
        if ext and abs(st["used_at"] - st["at"]) > 1e-9 * ext["length"]:
            side = f", loads at z = {f.q(st['used_at'], 'length', 4)}" + side
        lines.append(f"    {f.q(st['at'], 'length', 4)} {st['name'] or ''}: M {f.q(M, 'moment', 4)}, T "
                     f"{f.q(st['T'], 'moment', 4)}, N {f.q(st['N'], 'force', 4)}{side} — {verdict}")
        lines.extend(f"      {x}" for x in station_place_lines(st, f))
        if st.get("segment"):  # a 3-D feature: its factors, each with its three-mesh estimate
            lines.append(f"      {segment_line(st['segment'], bool(st.get('segment_far_field')))}")
    for c in sh.get("composite_segments") or []:
        hand = {p["quantity"].split(": ", 1)[1]: p["ratio"] for p in c["compare"]}
        ratios = ", ".join(f"{k.split(' (')[0]} FE/hand {v:.6f}" for k, v in hand.items() if v is not None)
        lines.append(f"  composite segment {c['segment']} ({f.q(c['from'], 'length', 4)} to {f.q(c['to'], 'length', 4)}): "
                     f"EI {f.q(c['EI'], 'rigidity', 5)}, GJ {f.q(c['GJ'], 'rigidity', 5)}" + (f"; {ratios}" if ratios else ""))
    if sh.get("composite_segments"):
        lines.append("  polymer regions: the supplier's data for the grade and the part's own tests decide (grade, processing, "
                     "weld lines, orientation in the moulding, temperature, moisture and time under load change them)")
    g = sh["governing_station"]
    lines.append(f"  the section summary below is the governing station's ({_station_name(res, g, f)})")
    return "\n".join(lines)


def segment_line(seg: dict, short: bool = False) -> str:
    """The 3-D factors of a station's feature in one line, each with its estimate; ``short``: the
    layout's checks found its model too short (the station's ``segment_far_field`` records)."""
    def one(key, label):
        g = seg[f"{key}_gci"]
        return f"{label} {seg[key]:.3g} ({'no estimate' if g is None else f'±{100 * g:.2g} %'})"
    kb = seg["kt_bending_used"]["from"]
    return (f"3-D {seg['kind'].replace('_', ' ')} ({seg['dofs'][-1]} unknowns on the finest of three meshes, "
            f"{model_phrase(seg.get('model'))}): "
            f"{one(kb, 'Kt bending')}, {one('kts', 'Kts')}, {one('kt_axial', 'Kt axial')}; "
            + ("estimates within the target" if seg["met"] else "ACCURACY TARGET NOT SHOWN: no verdict at this station")
            + ("; MODEL TOO SHORT (far-field check): no verdict at this station" if short else ""))


def _feature_word(field: str) -> str:
    """The kind of feature a length field belongs to (``shaft.sections[0].section.keyways[0].length``)."""
    for key, word in (("keyways", "keyway"), ("flats", "flat"), ("cut", "cut")):
        if f".{key}[" in field:
            return word
    return "splined length"


def _point_words(p: dict, f: Fmt, word: str) -> str:
    """Where a candidate point of a feature is: 'z = 45 mm (end of the keyway toward A)'."""
    what = []
    if p["end"]:
        what.append(f"{p['end']} of the {word}" + (f" toward {p['toward']}" if p["toward"] else " toward the shaft's end"))
    what += [f"at {n}" for n in p["parts"]] + [f"at support {n}" for n in p["supports"]]
    if p["station"] and not p["parts"] and not p["supports"]:
        what.append("the station")
    if p["side"]:
        what.append(f"{p['side']} side of the jump")
    return f"z = {f.q(p['z'], 'length', 4)}" + (f" ({', '.join(what)})" if what else "")


def station_place_lines(st: dict, f: Fmt) -> list[str]:
    """What a station is placed on: a load point, and for a feature with a length where along it the
    governing loads were (static and fatigue each)."""
    out = []
    lp = st.get("at_load_point")
    if lp:
        names = lp["parts"] + [f"support {n}" for n in lp["supports"]]
        out.append(f"station at the load point of {' and '.join(names)}: the loads jump here")
    ext = st.get("extent")
    if ext:
        word = _feature_word(ext["field"])
        g = ext["governing"]
        placed = "placed by feature_from" if ext["placed"] == "feature_from" else ext["placed"]
        text = (f"its {word} runs from {f.q(ext['from'], 'length', 4)} to {f.q(ext['to'], 'length', 4)} ({placed}); "
                f"checked at {len(ext['candidates'])} points along it; governing loads at {_point_words(g, f, word)}")
        for key, label in (("static_governing", "static"), ("fatigue_governing", "fatigue")):
            p = ext.get(key)
            if p is not None and p["factor"] is not None:
                there = "there" if p["index"] == g["index"] else f"at {_point_words(p, f, word)}"
                text += f"; {label} lowest n = {p['factor']:.3g} {there}"
        out.append(text)
    return out


def _station_name(res, g, f) -> str:
    st = res.get("section_loads", [])[g]
    return st["name"] or f.q(st["at"], "length", 4)


def _rpm(w) -> str:
    return "—" if w is None else f"{w:.4g} rad/s ({w * 60 / (2 * math.pi):.4g} rpm)"


def _warning_line(w: dict, f: Fmt) -> str:
    return w["text"]

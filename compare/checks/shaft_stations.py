"""From the layout to every checked station: the whole-shaft beam step, the loads at each station
(both sides of a jump, the larger used), one section check per station (the ordinary section
analysis, handed in as ``analyse`` so this room does not import the pipeline), the beam solved again
with each station's FE section over its feature length, and the governing station. A station whose
section has a feature with a length is then checked on that one solved section at every candidate
point along the feature (:mod:`.shaft_extent`), and the worst candidate is the station's result.

Kt hook for shoulders and grooves: a station's fatigue factors come, in this order, from the
station's own ``fatigue`` table in the case file, from ``Station.kt`` (filled by a feature step that
computes shoulder and groove factors, {"kt_bending": (value, source), "kts_torsion": (value, source)}),
and from the case's [fatigue] table. A station at a shoulder or groove with none of these gets a
warning: a 2-D section cannot see a shoulder or a groove, so its fatigue check leaves that factor out.
A station on a solved feature takes its FE path (static and fatigue) from the feature's local stresses
at the fillet (:mod:`.feature_local`), not from the plain round section. A station at a sharp shoulder
or groove bottom (no radius) has no verdict (:func:`no_verdict_at_sharp`), and then neither has the shaft.
A station with a 3-D feature (``Station.segment``: a keyseat's end, a cross hole) takes its hand-path
factors from its 3-D study (``Station.kt``, compare/pairs/station_segment.py) and its FE path from the
study's superposed local stresses at every candidate point along its feature (:mod:`.segment_local`).
"""
from __future__ import annotations

import math
from dataclasses import replace

from fem.geometry import round_section

from ..case.case import Case, Fatigue, parse_feature_lengths
from ..case.shaft import Segment, Shaft, Station
from ..case.units import from_si
from .feature_bound import bound_verdict, used_feature_bounds
from .feature_findings import DEFAULT_TARGET
from .feature_local import fillet_fe_path
from .segment_far_field import station_records
from .segment_local import segment_fe_path
from .findings import EXIT_NO_VERDICT, withdraw_verdicts
from .shaft_beam import SIDE, loads_at, solve_layout
from .shaft_composite import composite_segments
from .shaft_extent import at_load_point, check_over_extent, section_loads

#: Relative change of a station's loads between the round-bar beam and the beam with the stations'
#: FE sections above which the station is checked again (only an indeterminate shaft can change).
RELOAD_TOL = 1e-3
LOAD_KEYS = ("N", "Vx", "Vy", "Mx", "My", "T")


def station_diameter(shaft: Shaft, segs, at: float):
    """(diameter, bore, at_step) of the plain shaft at ``at``: at a step, the smaller side."""
    left = next((s for s in segs if s.start < at <= s.end), None)
    right = next((s for s in segs if s.start <= at < s.end), None)
    cands = [s for s in (left, right) if s is not None]
    s = min(cands, key=lambda s: s.diameter)
    step = left is not None and right is not None and left is not right and left.diameter != right.diameter
    return s.diameter, s.bore, step


def nominal_equivalent(ld: dict, d: float) -> float:
    """Nominal von Mises stress of a plain round under the loads (used only to pick the side of a jump):
    σ = 4N/(πd²) + 32M/(πd³), τ = 16T/(πd³), √(σ² + 3τ²)."""
    M = math.hypot(ld["Mx"], ld["My"])
    s = 4 * abs(ld["N"]) / (math.pi * d**2) + 32 * M / (math.pi * d**3)
    t = 16 * abs(ld["T"]) / (math.pi * d**3)
    return math.hypot(s, math.sqrt(3) * t)


def station_loads(layout: dict, st: Station, d: float) -> dict:
    """Loads just left and just right of the station; the larger (by the nominal equivalent stress) is
    used. Away from a jump both are the same."""
    L = layout["z"][-1]
    left = loads_at(layout["items"], layout["z"], layout["qy"], max(st.at - SIDE * L, 0.0) if st.at > 0 else 0.0)
    right = loads_at(layout["items"], layout["z"], layout["qy"], st.at if st.at < L else L * (1 - SIDE))
    if st.at <= 0.0:
        left = right
    if st.at >= L:
        right = left
    scale = max(max(abs(v) for v in left.values()), max(abs(v) for v in right.values()), 1e-300)
    jump = any(abs(left[k] - right[k]) > 1e-9 * scale for k in LOAD_KEYS)
    use = "right" if nominal_equivalent(right, d) > nominal_equivalent(left, d) else "left"
    return {"left": left, "right": right, "jump": jump, "used_side": use if jump else None,
            "used": right if use == "right" else left, "used_at": st.at}


def station_case(case: Case, shaft: Shaft, st: Station, segs, loads: dict) -> tuple[Case, dict]:
    """The ordinary section case of one station with its loads, and a record of what it is made of."""
    d, bore, step = station_diameter(shaft, segs, st.at)
    near = [g for g in shaft.grooves if abs(g.at - st.at) <= g.width / 2 + 1e-12]
    if near:  # in a groove the plain section is the groove bottom's (the diameter of the groove's Kt nominals)
        d = min(d, min(d - 2 * g.depth for g in near))
    section = st.section if st.section is not None else round_section(d, bore)
    comp = composite_segment_at(shaft, segs, st.at)
    if comp is not None:  # bonded regions: the segment's composite section, checked region by region
        section, bore = comp.section, None
    fat = replace(case.fatigue) if case.fatigue else Fatigue()
    kt_from = {}
    for key in ("kt_bending", "kts_torsion"):
        if key in st.fatigue:
            setattr(fat, key, st.fatigue[key])
            setattr(fat, f"{key}_source", st.fatigue[f"{key}_source"])
            kt_from[key] = "station"
        elif key in st.kt:
            setattr(fat, key, st.kt[key][0])
            setattr(fat, f"{key}_source", st.kt[key][1])
            kt_from[key] = "feature"
        elif getattr(fat, key) is not None:
            kt_from[key] = "case"
    if "notch_radius" in st.fatigue:
        fat.notch_radius = st.fatigue["notch_radius"]
        fat.notch_radius_source = None
    elif "notch_radius" in st.kt and "feature" in kt_from.values():  # the fillet / groove radius
        fat.notch_radius = st.kt["notch_radius"][0]
        src = st.kt["notch_radius"][1]
        fat.notch_radius_source = f"the {'groove bottom' if 'grooves' in src else 'fillet'} radius of the feature ({src})"
    lo = section_loads(loads, shaft.rotating)
    title = f"{case.title} — station at z = {_where(case, st.at)}" + (f" ({st.name})" if st.name else "")
    sc = Case(title, case.units, section, lo, case.material, case.analysis, path=case.path, fatigue=fat,
              feature_lengths=parse_feature_lengths(st.raw.get("section", {}), case.units) if st.section else [],
              geometry=st.geometry, region_materials=list(comp.materials) if comp is not None else [])
    features = (["shoulder"] if step else []) + (["groove"] * bool(near))
    rec = {"at": st.at, "name": st.name, "diameter": d, "bore": bore, "features": features,
           "section_kind": section.kind, "kt_from": kt_from}
    if features and not {"kt_bending", "kts_torsion"} & set(kt_from):
        rec["warning"] = "kt_missing"
    sharp = sharp_features(shaft, segs, st.at)
    if sharp:
        rec["sharp"] = sharp
    return sc, rec


def composite_segment_at(shaft: Shaft, segs, at: float) -> Segment | None:
    """The composite segment a station is on, or None (a station at a joint of a composite segment
    with another is refused by the case parser)."""
    tol = SHARP_REACH * shaft.length
    return next((s for s in segs if s.section is not None and s.start - tol <= at <= s.end + tol), None)


def composite_station(rec: dict, a, rotating: bool) -> None:
    """A station on a composite segment: exit code 3 when its section study did not show the accuracy
    target (as a composite section's own results say). On a rotating shaft its bending alternates: each
    region's fatigue is checked with its own data (compare/checks/composite_fatigue.py); a region left
    without fatigue data there is said first, and the station (so the shaft) has no verdict (exit code
    :data:`EXIT_NO_VERDICT`), never a silent pass on the static factor alone."""
    rec["composite"] = True
    st = a.extra["composite"]["study"]
    achieved = max((v["gci"] for v in st.estimates.values() if v["gci"] is not None), default=None)
    if achieved is None or achieved > st.target or st.limited is not None:  # as the composite results say
        a.extra["exit_code"] = max(3, a.extra.get("exit_code") or 0)
    if not rotating:
        return
    skipped = [r for w in a.extra.get("warnings") or [] if w["code"] == "composite_fatigue_not_checked"
               for r in w.get("regions", [])]
    if not skipped:  # every region's fatigue was checked
        return
    rec["fatigue_not_checked"] = ", ".join(skipped)
    a.extra["exit_code"] = max(EXIT_NO_VERDICT, a.extra.get("exit_code") or 0)
    if a.extra.get("governing"):
        a.extra["governing"] = dict(a.extra["governing"], verdict_supported=False,
                                    not_a_verdict="fatigue not checked in " + ", ".join(skipped) + " (no fatigue data)")


def _where(case: Case, z: float) -> str:
    """A position along the shaft in the case's units, for a station case's title."""
    return f"{from_si(z, 'length', case.units):.6g} {case.units.label('length')}" if case.units else f"{z:.6g} m"


#: A station is at a sharp shoulder or groove bottom when it lies within this fraction of the shaft's
#: length of the corner (the tolerance of the layout's own positions, case/shaft.py GAP_TOL).
SHARP_REACH = 1e-9


def sharp_features(shaft: Shaft, segs, at: float) -> list[dict]:
    """The sharp re-entrant corners at ``at``: a shoulder without a fillet, a groove with a zero bottom
    radius. The elastic stress there is unbounded, so the station can have no verdict."""
    tol = SHARP_REACH * shaft.length
    out = []
    for i in range(1, len(segs)):
        a, b = segs[i - 1], segs[i]
        if a.diameter != b.diameter and not b.fillet and abs(b.start - at) <= tol:
            out.append({"kind": "shoulder", "field": f"shaft.segments[{i}].fillet", "at": b.start})
    for j, g in enumerate(shaft.grooves):
        if not g.radius and abs(g.at - at) <= g.width / 2 + tol:
            out.append({"kind": "groove", "field": f"shaft.grooves[{j}].radius", "at": g.at})
    return out


def no_verdict_at_sharp(rec: dict, a) -> None:
    """A station at a sharp shoulder or groove bottom: its verdicts withdrawn (the values of the plain
    section kept, marked), a warning first, exit code :data:`EXIT_NO_VERDICT`."""
    sharp = rec.get("sharp")
    if not sharp:
        return
    kinds = " and ".join(sorted({s["kind"] for s in sharp}))
    withdraw_verdicts(a, reason=f"sharp {kinds} corner (no fillet radius)")
    w = {"code": "feature_station_sharp_no_verdict", "at": rec["at"], "name": rec.get("name", ""), "corners": sharp}
    a.extra["warnings"] = [w] + list(a.extra.get("warnings") or [])
    a.extra["exit_code"] = max(EXIT_NO_VERDICT, a.extra.get("exit_code") or 0)


def layout_step(case: Case, analyse, fineness: float | None = None):
    """The whole shaft, then every station through ``analyse(case) -> Analysis``. Returns the
    governing station's Analysis, with ``extra['shaft']`` holding the layout record and
    ``extra['shaft_stations']`` the station analyses (governing included). ``fineness`` (the command
    line's, else the case's) is that of the composite segments' section studies."""
    shaft = case.shaft
    comp = composite_segments(case, fineness)  # each composite segment's section solved once: EI, κGA, GJ, mass
    layout = solve_layout(shaft, case.section, case.material, composite=comp)
    segs = shaft.segments or _uniform(shaft, case)
    stations, analyses = [], []
    for st in shaft.stations:
        d, _, _ = station_diameter(shaft, segs, st.at)
        sl = station_loads(layout, st, d)
        sc, rec = station_case(case, shaft, st, segs, sl["used"])
        rec.update(loads=sl)
        stations.append(rec)
        analyses.append(analyse(sc))
    overrides = _fe_overrides(shaft, stations, analyses)
    if overrides:
        layout2 = solve_layout(shaft, case.section, case.material, overrides=overrides, composite=comp)
        for i, st in enumerate(shaft.stations):
            d = stations[i]["diameter"]
            sl = station_loads(layout2, st, d)
            old = stations[i]["loads"]["used"]
            scale = max(max(abs(v) for v in old.values()), 1e-300)
            # a station with a feature length is checked over its feature below, on the loads of this layout
            if st.extent is None and any(abs(sl["used"][k] - old[k]) > RELOAD_TOL * scale for k in LOAD_KEYS):
                sc, rec = station_case(case, shaft, st, segs, sl["used"])
                rec.update(loads=sl, checked_again=True)
                stations[i] = rec
                analyses[i] = analyse(sc)
            else:
                stations[i]["loads"] = sl
        layout = layout2
    layout["fe_sections"] = [{"from": o[0], "to": o[1], "Ixx": o[2], "Iyy": o[3], "area": o[4], "kappa": o[5]}
                             for o in overrides]
    for i, (st, rec) in enumerate(zip(shaft.stations, stations)):
        a = analyses[i]
        rec["at_load_point"] = at_load_point(layout, st.at)
        fillet = "fillet_stresses" in st.kt and not rec.get("sharp")
        if fillet:
            rec["fe_path"] = "feature"
        hook = (lambda b, st=st: fillet_fe_path(b, st.kt["fillet_stresses"][0], keep_section_min=st.section is not None)
                ) if fillet else None
        solid3d = "segment_stresses" in st.kt and not rec.get("sharp")
        if solid3d:  # a 3-D feature (keyseat end, cross hole): its local stresses at every candidate point
            rec["fe_path"] = "segment"
            rec["segment"] = st.kt["segment_stresses"][0]["record"]
            # a model too short for its feature: the record the output words (no verdict there)
            rec["segment_far_field"] = station_records(rec)
            if fillet:  # also on a shoulder or groove: each criterion the smaller of the 3-D and the fillet's
                hook = lambda b, st=st: (segment_fe_path(b, st.kt["segment_stresses"][0]),  # noqa: E731
                                         fillet_fe_path(b, st.kt["fillet_stresses"][0], keep_section_min=True))
            else:
                hook = lambda b, st=st: segment_fe_path(b, st.kt["segment_stresses"][0])  # noqa: E731
        if st.extent is not None:  # the worst loads anywhere along the station's feature
            a, used, rec["extent"] = check_over_extent(a, st, layout, shaft.rotating, at_station=hook,
                                                       everywhere=solid3d)
            g = rec["extent"]["governing"]
            rec["loads"] = dict(rec["loads"], used=used, used_at=g["z"], used_side=g["side"])
            if not g["station"]:  # the section results that follow say where their loads were taken
                a = replace(a, case=replace(a.case, title=f"{a.case.title}, loads at z = {_where(case, g['z'])}"))
            analyses[i] = a
        elif hook is not None:  # the FE path from the feature's local stresses
            hook(a)
        no_verdict_at_sharp(rec, a)
        if "composite" in a.extra:
            composite_station(rec, a, shaft.rotating)
        # a verdict resting on a shoulder or groove factor whose study did not show the target: it must
        # hold with the stresses raised by that factor's bound, else it is withdrawn
        bound_verdict(a, rec, used_feature_bounds(st), case.analysis.accuracy or DEFAULT_TARGET)
        gov = a.extra.get("governing") or {}
        rec["governing"] = gov or None
        rec["exit_code"] = a.extra.get("exit_code")
    factors = [((rec["governing"] or {}).get("factor"), i) for i, rec in enumerate(stations)]
    known = [(n, i) for n, i in factors if n is not None and math.isfinite(n)]
    g = min(known)[1] if known else 0
    # a station without a verdict (an unbounded stress) governs: no other station's factor is the shaft's
    g = next((i for i, rec in enumerate(stations) if (rec["governing"] or {}).get("no_verdict")), g)
    a = analyses[g]
    layout["governing_station"] = g
    worst = max((rec["exit_code"] or 0 for rec in stations), default=0)
    if any(not p.record["accuracy"]["met"] for p in comp.values()):  # a composite segment's EI, GJ not shown
        worst = max(worst, 3)
    if worst:  # a station without a supported verdict makes the whole run one
        a.extra["exit_code"] = max(worst, a.extra.get("exit_code") or 0)
    a.extra["shaft"] = {"layout": layout, "stations": stations}
    a.extra["shaft_stations"] = analyses
    return a


def _uniform(shaft: Shaft, case: Case):
    return [Segment(0.0, shaft.length, case.section.diameter, case.section.bore)]


def _fe_overrides(shaft: Shaft, stations, analyses) -> list:
    """(z0, z1, Ixx, Iyy, A, κ) over the feature length of every station whose own section gives one."""
    out = []
    for st, rec, a in zip(shaft.stations, stations, analyses):
        if st.section is None or st.extent is None or a.shear is None:
            continue
        kappa = min(a.shear.kappa_x, a.shear.kappa_y)
        out.append((*st.extent, a.props.Ixx, a.props.Iyy, a.props.area, kappa))
    return out

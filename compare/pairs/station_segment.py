"""The 3-D feature of a layout station (a keyseat's end, a cross hole; compare/case/shaft_segment.py):
its segment studied on three meshes (compare/solve/segments.py) within the case's limits, and what
the station check takes from it (numbers and records only):

* the hand path's factors, in ``Station.kt``: Kt in bending the larger of the two planes (on a rotating
  shaft the moment turns round the section, and on a standing one the larger is the safe side), Kts in
  torsion, each with the source "3-D FE, this run" and its three-mesh estimate, and the notch radius
  (the keyseat's bottom fillet, the hole's radius) for the notch sensitivity;
* a shoulder of the outline within reach of the feature (compare/case/shaft_segment.py, SHOULDER_REACH)
  is in the 3-D model itself (``shoulder_in_model`` in the record): the model's factors are the
  station's, replacing the shoulder's meridian ones unless those are larger (``kept_shoulder_factor``:
  the 3-D meshes are far coarser at the fillet; the FE path then also reads the fillet's meridian
  local stresses, :func:`fillet_in_fe_path`), and the notch radius is the shoulder's fillet where
  the bending peak sits on it; a step down along the shaft is modelled as a step up and its unit fields
  mirrored back (``model_mirrored``); a combined model whose first mesh exceeds analysis.max_dofs falls
  back to the feature alone, with the reason;
* otherwise a station also on a shoulder or groove keeps, factor by factor, the larger of the two
  (neither model holds both raisers; grooves are never in the 3-D model), and its FE path takes the
  smaller factor of the 3-D and the fillet's local stresses;
* the segment is solved on the smallest model its features allow (compare/pairs/segment_step.py;
  ``model`` in the record: "whole", "half" or "quarter"), its surface stress completed to the whole
  surface by reflection;
* the FE path's unit fields (``Station.kt['segment_stresses']``): the finest mesh's stress per unit
  N, Mx, My, T at the surface points, turned into the station's frame (compare/solve/segment_superpose.py),
  superposed with the station's loads by compare/checks/segment_local.py.

Runs before the stations are checked (compare/pipeline.py), after the shoulder and groove step (a
station's own 3-D feature overrides a shoulder's factors there).
"""
from __future__ import annotations

import math
import time

from fem.errors import LimitError

from ..case.shaft_segment import use_alone
from ..solve.segment_superpose import MODEL_ANGLE, unit_fields
from ..solve.segments import KEYS, study_segment
from .segment_step import MODELS, model_symmetry

#: the source written beside each 3-D factor the station uses
SOURCE = "3-D FE, this run"
#: a stand-in modulus [Pa] where the case gives none (the factors and unit stresses do not depend on E)
E_STANDIN = 2.0e11


def station_segment_record(i: int, st, ss, study, target: float) -> dict:
    """The results record of one station's 3-D study (the keys of a [segment] case's ``segments``
    entry, with the station and what it used)."""
    feat = ss.model.features[0]
    a, b = feat.span()
    L = ss.model.length
    sgn = -1.0 if ss.mirrored else 1.0
    mid = ss.mid if ss.mid is not None else ss.centre

    def on_shaft(z):  # the shaft's z of the model's z
        return mid + sgn * (z - L / 2)
    gcis = [study.estimates[k]["gci"] for k in KEYS.values()]
    achieved = None if any(g is None for g in gcis) else max(gcis)
    met = achieved is not None and achieved <= target and study.limited is None
    rec = {"station": i, "name": st.name, "at": st.at, "kind": ss.kind, "field": ss.field,
           "centre": ss.centre, "span": sorted([on_shaft(a), on_shaft(b)]), "angle_deg": ss.angle,
           "diameter": ss.d, "length": L, "sizes": dict(ss.sizes), "dofs": study.dofs, "seconds": study.seconds,
           "limited_by": study.limited, "target": target, "achieved": achieved, "met": bool(met)}
    peaks = {}
    turn = math.radians(ss.angle - MODEL_ANGLE[ss.kind])
    c, s = math.cos(turn), math.sin(turn)
    for key in KEYS.values():
        est = study.estimates[key]
        rec[key] = study.values[key]
        rec[f"{key}_gci"] = est["gci"]
        rec[f"{key}_status"] = est["status"]
        x, y, z = (float(v) for v in study.peaks[key]["at"])
        peaks[key] = {"at": [x, y, z], "on_feature": study.peaks[key]["on_feature"],
                      "feature": study.peaks[key].get("feature"),
                      "at_on_shaft": [c * x - s * y, s * x + c * y, on_shaft(z)]}
    rec["peak_location"] = peaks
    rec["far_field"] = {k: study.far_field.get(k) for k in KEYS.values()}  # compare/checks/segment_far_field.py
    rec["peak_location_frame"] = ("at: the 3-D model's (z from its left end face, the feature centred at length/2 "
                                  "unless a shoulder is in the model, then its small diameter at z = 0; a keyseat on "
                                  "+y, a hole's axis along x); at_on_shaft: the station's x, y and z along the shaft")
    rec["model_mid_on_shaft"] = mid
    rec["model_mirrored"] = bool(ss.mirrored)
    kb = max(("kt_bending_x", "kt_bending_y"), key=lambda k: study.values[k])
    rec["kt_bending_used"] = {"value": study.values[kb], "from": kb, "gci": rec[f"{kb}_gci"],
                              "why": "the larger of the two bending planes (the moment's direction relative to the "
                                     "feature turns on a rotating shaft; on a standing one the larger is the safe side)"}
    rec["kts_used"] = {"value": study.values["kts"], "from": "kts", "gci": rec["kts_gci"]}
    return rec


def take_combined(kt: dict, key: str, value: float, src: str, rec: dict) -> bool:
    """Put the combined (feature and shoulder) 3-D model's factor ``value`` into the station's ``kt[key]``
    unless the shoulder's meridian-section factor already there is larger: that one is then kept and
    ``rec['kept_shoulder_factor'][key]`` says so (the 3-D meshes are far coarser at the fillet than the
    meridian study's: on the winch demo the combined model read the fillet in bending 6 % below it,
    inside a 22 % estimate). A replaced meridian factor is recorded under
    ``rec['replaced_shoulder_or_groove_factor']``. Returns whether the combined value was taken."""
    if key in kt and kt[key][1] != src:
        if kt[key][0] > value:
            rec.setdefault("kept_shoulder_factor", {})[key] = {
                "value": kt[key][0], "source": kt[key][1], "combined_3d": value,
                "why": "the shoulder's meridian factor is larger than the combined 3-D model's (read on coarser "
                       "meshes): the larger is used"}
            return False
        rec.setdefault("replaced_shoulder_or_groove_factor", {})[key] = {
            "value": kt[key][0], "source": kt[key][1],
            "why": "the 3-D model holds the shoulder and the station's feature together"}
    kt[key] = (value, src)
    return True


def fillet_in_fe_path(kt: dict, rec: dict) -> bool:
    """Whether the FE path of a station whose 3-D model holds a shoulder also reads the shoulder's
    meridian local stresses (``kt['fillet_stresses']``, when the station has them). It does where a
    meridian factor was kept as larger than the combined model's (:func:`take_combined`): the combined
    model's coarse meshes read the fillet low, and its local stresses alone would carry that into the
    FE path; the station's FE path then takes, criterion by criterion, the smaller safety factor of the
    two (compare/checks/shaft_stations.py), the safe side. Otherwise the combined model holds both
    raisers and the meridian stresses are dropped. ``rec['fe_path_with_fillet']`` says why they stay."""
    if rec.get("kept_shoulder_factor") and "fillet_stresses" in kt:
        rec["fe_path_with_fillet"] = ("a meridian shoulder factor larger than the combined 3-D model's was kept: "
                                      "the FE path takes the worse of the 3-D model's and the fillet's local stresses")
        return True
    kt.pop("fillet_stresses", None)
    return False


def _source(ss, key: str, rec: dict) -> str:
    g = rec[f"{key}_gci"]
    # without an estimate, say why: a limit of the case, else the study's own reason (its status: a mesh
    # hardly refined at the feature, compare/solve/segments.py)
    why = rec["limited_by"] if rec["limited_by"] is not None else rec[f"{key}_status"]
    est = f"three-mesh estimate {100 * g:.2g} %" if g is not None else f"no estimate ({why})"
    return f"{SOURCE} ({ss.kind} at {ss.field}, {key}; {est})"


def station_segments_step(case) -> list[dict] | None:
    """Study every station's 3-D feature; fill the stations' ``kt``. Returns the records (None when no
    station has one)."""
    shaft = case.shaft
    if shaft is None or not any(getattr(st, "segment", None) is not None for st in shaft.stations):
        return None
    an, m = case.analysis, case.material
    E = m.elastic_modulus if m.elastic_modulus else E_STANDIN
    out = []
    for i, st in enumerate(shaft.stations):
        ss = st.segment
        if ss is None:
            continue
        t0 = time.perf_counter()
        fineness = ss.fineness if ss.fineness is not None else an.fineness
        sym = model_symmetry(ss.model, getattr(ss, "symmetry", None))
        fell_back = None
        try:
            study = study_segment(ss.model, fineness=fineness, E=E, nu=m.poisson, max_dofs=an.max_dofs,
                                  max_seconds=an.max_seconds, symmetry=sym)
        except LimitError as exc:
            if ss.shoulder_in_model is None:
                raise
            # the combined model is too large for the case's limit: the feature alone, as before
            fell_back = f"the combined model with the shoulder exceeded a limit ({exc}); the feature modelled alone"
            use_alone(ss, fell_back)
            sym = model_symmetry(ss.model, getattr(ss, "symmetry", None))
            study = study_segment(ss.model, fineness=fineness, E=E, nu=m.poisson, max_dofs=an.max_dofs,
                                  max_seconds=an.max_seconds, symmetry=sym)
        rec = station_segment_record(i, st, ss, study, an.accuracy)
        rec["model"] = MODELS[sym]
        rec["shoulder_in_model"] = ss.shoulder_in_model
        if ss.shoulder_not_in_model is not None:
            rec["shoulder_not_in_model"] = ss.shoulder_not_in_model
        rec["grooves_in_model"] = False  # grooves stay with the larger-of-the-two rule (not modelled in 3-D)
        kb = rec["kt_bending_used"]["from"]
        notch = ss.notch if ss.notch is not None else (ss.sizes["hole_diameter"] / 2, f"{ss.field}.hole_diameter")
        # the station's hand-path factors from this study: (Station.kt key, value, source)
        factors = (("kt_bending", rec["kt_bending_used"]["value"], _source(ss, kb, rec)),
                   ("kts_torsion", rec["kts_used"]["value"], _source(ss, "kts", rec)))
        sh = ss.shoulder_in_model
        if sh is not None and study.peaks[kb].get("feature") == "shoulder":
            notch = (sh["fillet"], sh["field"])  # the bending peak on the shoulder's fillet: its radius
        if sh is not None:
            # one model holds both raisers: its factors replace the shoulder's meridian ones, except where
            # the meridian factor is larger (the 3-D model reads the fillet on far coarser meshes: the
            # winch demo's fillet 6 % below the meridian's, inside a 22 % estimate), which is then kept
            for key, value, src in factors:
                if take_combined(st.kt, key, value, src, rec) and key == "kt_bending":
                    st.kt["notch_radius"] = notch
            if "notch_radius" not in st.kt:
                st.kt["notch_radius"] = notch
            fillet_in_fe_path(st.kt, rec)
        else:
            # a station also on a shoulder or groove (the feature step ran first): each factor the larger of
            # the two, with the notch radius of the one that gave the bending factor (neither model holds both
            # raisers: the shoulder not within reach, or not buildable, or a groove)
            shoulder = {k: st.kt[k] for k in ("kt_bending", "kts_torsion", "notch_radius") if k in st.kt}
            for key, value, src in factors:
                if key in shoulder and shoulder[key][0] > value:
                    rec.setdefault("also_on_a_shoulder_or_groove", {})[key] = \
                        "the shoulder or groove's factor is larger: used (neither model holds both raisers)"
                    continue
                st.kt[key] = (value, src)
                if key == "kt_bending":
                    st.kt["notch_radius"] = notch
            if "notch_radius" not in st.kt:
                st.kt["notch_radius"] = notch
        turn = ss.angle - MODEL_ANGLE[ss.kind]
        fields = unit_fields(study.finest, ss.d, ss.model.length, turn=turn, mirror=ss.mirrored,
                             far_d=ss.model.far_diameter)
        local = {"fields": fields, "record": rec, "kind": ss.kind, "field": ss.field,
                 "centre": ss.mid if ss.mid is not None else ss.centre,
                 "length": ss.model.length, "met": rec["met"], "keep_section_min": st.section is not None,
                 "study": study}
        st.kt["segment_stresses"] = (local, ss.field)
        rec["seconds_total"] = time.perf_counter() - t0
        out.append(rec)
    return out

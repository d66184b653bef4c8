"""Shoulders and grooves along the shaft: the FE factors beside the published chart fits, and the
factors handed to the station checks.

For each feature of ``[shaft]`` (compare/solve/features.py) this step stores a record in
``Analysis.extra['shaft']['features']`` (numbers and records only: kind, place, sizes, the FE Kt in
bending and tension and Kts in torsion with their GCIs and peak places, and the chart values with
their source and validity), adds a :class:`~compare.pairs.pairs.Pair` per load (FE beside the
Roark Table 17.1 fit; ``kind='factor'``: a fit is no exact solution, so no tolerance applies and
the ratio is reported as the chart's difference from the converged FE; where the fit is further from
the FE than its stated accuracy, classic.notch_fits.ACCURACY, plus the FE's error estimate, the pair
has no chart value and no ratio and says that the fit is off there), and fills the ``kt`` of
every station that sits on a feature, so the station's fatigue check uses the FE factors with the
notch sensitivity at the feature's radius. Outside a fit's h/r range the chart value is None and
the record says so; nothing is extrapolated.
"""
from __future__ import annotations

from classic import notch_fits
from classic._validity import OutOfRangeError

from ..solve.features import Feature, shaft_features, study_feature
from .pairs import Pair

#: Which of our loads is which key of results.json / the station check.
KEYS = {"bending": "kt_bending", "tension": "kt_axial", "torsion": "kts"}
STATION_KEYS = {"bending": "kt_bending", "torsion": "kts_torsion", "tension": "kt_axial"}
DISAGREES_NOTE = ("the published curve fit (coefficients from memory) disagrees with this FE value by more than "
                  "the fit's stated accuracy plus the FE's error estimate: the fit is off here and the FE value, "
                  "with its error estimate, is the one to trust (the chart value is in shaft.features)")
FE_SOURCE = "FE, axisymmetric model of the meridian section (three or more meshes, GCI)"


def chart_value(f: Feature, load: str) -> dict:
    """The Table 17.1 fit for ``f`` in ``load``: {value, source, h_over_r, range, valid, why}."""
    hr = f.h / f.radius if f.radius else None
    rng = notch_fits.RANGES[(f.kind, load)]
    rec = {"value": None, "source": notch_fits.SOURCE, "h_over_r": hr, "range": [rng.low, rng.high],
           "valid": False, "why": None}
    if f.bore:
        rec["why"] = "bored_shaft"  # the fits are for solid shafts
        return rec
    if hr is None or not rng.contains(hr):
        rec["why"] = "outside_range"
        return rec
    second = f.d if f.kind == "shoulder" else f.depth
    try:
        rec["value"] = notch_fits.kt_fit(f.kind, load, f.D, second, f.radius)
    except OutOfRangeError as exc:  # a geometry the fit cannot take (recorded, never clamped)
        rec["why"] = exc.reason
        return rec
    rec["valid"] = True
    return rec


def judge_chart(ch: dict, fe: float | None, gci: float | None) -> dict:
    """``ch`` with ``chart_minus_fe`` ((chart − FE)/FE), ``allowed`` (the fit's stated accuracy plus the
    FE's error estimate) and ``disagrees_with_fe``: the fit is further from the converged FE than that,
    so the fit (coefficients from memory) is off there and the FE value is the one to trust."""
    out = {**ch, "chart_minus_fe": None, "allowed": None, "disagrees_with_fe": False}
    if ch.get("value") is None or fe is None:
        return out
    allowed = notch_fits.ACCURACY + (gci or 0.0)
    diff = (ch["value"] - fe) / fe
    out.update(chart_minus_fe=diff, allowed=allowed, disagrees_with_fe=bool(abs(diff) > allowed))
    return out


def feature_record(f: Feature, study: dict) -> dict:
    rec = {"kind": f.kind, "at": f.at, "field": f.field, "d": f.d, "radius": f.radius, "bore": f.bore,
           "skipped": f.skipped, "notes": list(f.notes)}
    if f.kind == "shoulder":
        rec["D"] = f.D
    else:
        rec.update({"D": f.D, "depth": f.depth, "width": f.width})
    for load, key in KEYS.items():
        s = study.get(load)
        rec[key] = s["kt"] if s else None
        rec[f"{key}_gci"] = s["gci"] if s else None
        rec[f"{key}_gci_kind"] = s["gci_kind"] if s else None
        rec[f"{key}_order"] = s["order"] if s else None
        for k in ("order_used", "safety_factor", "gci_why", "limited", "ended_by", "fineness"):
            rec[f"{key}_{k}"] = s[k] if s else None
        rec[f"{key}_peak"] = s["peak"] if s else None
        rec[f"{key}_peak_von_mises"] = s["peak_von_mises"] if s else None
        rec[f"{key}_far_field"] = s["far_field"] if s else None
        rec[f"{key}_values_coarse_to_fine"] = s["values_coarse_to_fine"] if s else None
        ch = chart_value(f, load) if f.radius else None
        rec[f"{key}_chart"] = judge_chart(ch, rec[key], rec[f"{key}_gci"]) if ch is not None else None
        rec[f"{key}_map"] = s["map"] if s else None
    if study:
        rec["poisson"] = next(iter(study.values()))["poisson"]
    return rec


def feature_pairs(rec: dict) -> list[Pair]:
    out = []
    names = {"kt_bending": "Kt bending", "kt_axial": "Kt axial", "kts": "Kts torsion"}
    for key, label in names.items():
        if rec[key] is None:
            continue
        ch = rec[f"{key}_chart"] or {}
        if ch.get("disagrees_with_fe"):
            # no ratio: FE/chart would make the converged FE look wrong where the remembered fit is off
            out.append(Pair(f"{label} at {rec['field']}", rec[key], None, ch.get("source", ""), kind="factor",
                            note=DISAGREES_NOTE))
            continue
        out.append(Pair(f"{label} at {rec['field']}", rec[key], ch.get("value"), ch.get("source", ""),
                        kind="factor" if ch.get("value") is not None else "not applicable",
                        note="published curve fit: FE/chart is the fit's difference from the converged FE"
                        if ch.get("value") is not None else f"no chart value ({ch.get('why')})"))
    return out


def station_factors(shaft, records: list[dict], studies: list[dict] | None = None) -> None:
    """Fill ``Station.kt`` of every station on a feature (within the fillet, or the groove's width):
    the factors, the notch radius and, with ``studies``, ``fillet_stresses`` = (the stress components
    per nominal at the points along the feature arcs of each load, with d and bore of the nominals;
    the feature's field) for the station's FE path (compare/checks/feature_local.py)."""
    for st in shaft.stations:
        for k, rec in enumerate(records):
            if rec["kts"] is None:
                continue
            reach = rec["radius"] if rec["kind"] == "shoulder" else rec["width"] / 2
            if abs(st.at - rec["at"]) <= reach * (1 + 1e-9):
                bounds = {}  # each factor's error bound, with the source that marks it as this study's
                for load, key in KEYS.items():
                    gci = rec[f"{key}_gci"]
                    bound = {"gci": "GCI", "spread": "error bound (spread)"}.get(rec[f"{key}_gci_kind"], "")
                    src = f"{FE_SOURCE}, {rec['field']}" + (f", {bound} {gci:.2%}" if gci is not None else "")
                    st.kt[STATION_KEYS[load]] = (rec[key], src)
                    bounds[STATION_KEYS[load]] = {"bound": gci, "source": src}
                # for the station's verdict where a bound exceeds the target (compare/checks/feature_bound.py)
                st.kt["feature_bounds"] = (bounds, rec["field"])
                st.kt["notch_radius"] = (rec["radius"], rec["field"])
                if studies is not None and studies[k]:
                    local = {load: studies[k][load]["components"] for load in KEYS}
                    local.update(d=rec["d"], bore=rec["bore"] or 0.0, kind=rec["kind"], radius=rec["radius"],
                                 field=rec["field"], at=rec["at"])
                    st.kt["fillet_stresses"] = (local, rec["field"])
                break


def shaft_features_step(case) -> dict | None:
    """Solve every shoulder and groove of ``case.shaft`` and fill the ``kt`` of the stations on them.
    Returns {"records": [...] in order along the shaft, "pairs": [...]}, or None without [shaft].
    Runs before the stations are checked (compare/pipeline.py)."""
    shaft = case.shaft
    if shaft is None:
        return None
    nu = case.material.poisson
    records, pairs, cache, studies = [], [], {}, []
    for f in shaft_features(shaft):
        lim = case.analysis
        study = study_feature(f, nu, cache=cache, max_dofs=lim.max_dofs, max_seconds=lim.max_seconds,
                              target=lim.accuracy)
        rec = feature_record(f, study)
        records.append(rec)
        studies.append(study)
        pairs.extend(feature_pairs(rec))
    station_factors(shaft, records, studies)
    return {"records": records, "pairs": pairs}


def attach_features(a, feats: dict | None) -> None:
    """Put the records in ``a.extra['shaft']['features']`` and the pairs in ``a.pairs``."""
    if feats is None:
        return
    a.extra.setdefault("shaft", {})["features"] = feats["records"]
    a.pairs.extend(feats["pairs"])

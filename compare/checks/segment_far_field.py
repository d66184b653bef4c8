"""Is a 3-D segment long enough? The far-field check of a segment study (compare/solve/segments.py),
for a ``[segment]`` case and a layout station's 3-D feature (records; output/ words them).

:func:`fem.solid.solve_segment` reads, per load, the largest departure of the surface stress (the
nodal-averaged one the factor is read from) from the plain bar's elementary stress within half a
diameter of each end face, relative to the nominal stress (``far_field``). The ends carry the plain
bar's exact displacement (or traction), so where the feature's own field still reaches that zone, the
ends hold it and the factor is read on a model too short for it. Where a load's departure exceeds
:data:`FAR_FIELD_TOL` a ``segment_far_field`` record is returned with the figures. The factors are
kept and shown, flagged, but no verdict rests on them (a short model read a keyseat's Kt in tension
4.6 % low, the unsafe side): a ``[segment]`` case's verdict is withheld and the run ends with exit 3
(compare/output/results_segment.py), as when its accuracy target is not shown; a layout station's
verdict is withdrawn the way a 3-D study short of its target withdraws it
(compare/checks/segment_local.py, :func:`station_too_short`), and so is the shaft's.
"""
from __future__ import annotations

#: Largest far-field departure (fraction of the nominal stress) accepted without a warning. Measured
#: (tests/benchmarks/bench_segment_length.py, fineness 0.4, quarter models; the demo keyseat end, d 30
#: mm, 8 x 4 mm, 36 mm long, fillet 0.6 mm, and a 6 mm through cross hole in a 30 mm shaft): with the
#: feature 1.5, 2 or 3 diameters from the end faces the departure was 0.5-6.3 % of nominal in every
#: load (the mesh's own scatter on the coarse plain bar: it falls with refinement, not with length),
#: 1 diameter away up to 9.7 % (the keyseat in tension), and from 1 diameter on the factors agreed with
#: the 3-diameter model's within 2.5 % (the scatter between meshes at that fineness); 0.75 diameter
#: away (fem.solid.END_ZONE, the least the model accepts) the departure was 12-27 % in the loads the
#: feature disturbs most (the same at fineness 0.8: the feature's own field) and the keyseat's Kt in
#: tension read 4.6 % low (bending about x 2.2 %). 10 % lies above every model's 1 diameter or more
#: long and below every short model's departure in tension.
FAR_FIELD_TOL = 0.10
#: why the tolerance is what it is (written with the warning)
FAR_FIELD_WHY = ("above the up to 9.7 % measured with the feature 1-3 diameters from the ends (mostly the coarse "
                 "plain-bar mesh's scatter), below the 12-27 % read with it 0.75 diameter away, where a keyseat's Kt "
                 "in tension read 4.6 % low")

_KEYS = ("kt_axial", "kt_bending_x", "kt_bending_y", "kts")


def feature_to_end(segment) -> float | None:
    """The least distance [m] from a (non-shoulder) feature's span to an end face of ``segment``
    (fem.solid.Segment), None without one."""
    gaps = [g for f in segment.features if f.kind != "shoulder" for g in (f.span()[0], segment.length - f.span()[1])]
    return min(gaps) if gaps else None


#: the reason a verdict is withheld (a station's ``governing.reason``)
TOO_SHORT_REASON = ("the 3-D model of the station's feature is too short: the feature's field reaches its end faces, "
                    "so its factors may read low")


def station_gap(seg: dict) -> float:
    """The least distance [m] from a layout station's feature span to its 3-D model's end faces, from
    the station's segment record (compare/pairs/station_segment.py): the model's ends lie about its
    mid-length on the shaft (``model_mid_on_shaft``; not the feature's centre when a shoulder is in it)."""
    L = seg["length"]
    c = seg.get("model_mid_on_shaft") if seg.get("model_mid_on_shaft") is not None else seg["centre"]
    return min(seg["span"][0] - (c - L / 2), c + L / 2 - seg["span"][1])


def station_too_short(seg: dict | None, where: dict | None = None) -> list[dict]:
    """The ``segment_far_field`` record of a layout station's 3-D study (its segment record), none when
    its model is long enough or there is no study."""
    if seg is None or not seg.get("far_field"):
        return []
    return segment_far_field(seg["far_field"], seg["length"], seg["diameter"], station_gap(seg), where)


def segment_case_step(a) -> list[dict]:
    """The far-field check of a ``[segment]`` case (compare/pairs/segment_step.py's study): its
    ``segment_far_field`` records, kept in ``a.extra['segment_far_field']`` for the output to word
    (compare/output/results_segment.py) and returned."""
    st = a.extra["segment"]["study"]
    recs = segment_far_field(st.far_field, st.segment.length, st.segment.d, feature_to_end(st.segment))
    a.extra["segment_far_field"] = recs
    return recs


def station_records(st: dict) -> list[dict]:
    """The ``segment_far_field`` records of a layout station (its record in the layout's checks, with
    ``name``, ``at`` and, for a 3-D feature, ``segment``), naming the station and its field: what
    compare/output/results_shaft.py words. None when its model is long enough or it has no 3-D study."""
    seg = st.get("segment")
    if seg is None:
        return []
    return station_too_short(seg, {"station": st["name"] or st["at"], "at": st["at"], "field": seg["field"]})


def segment_far_field(far_field: dict, length: float, diameter: float, gap: float | None,
                      where: dict | None = None) -> list[dict]:
    """``segment_far_field`` records for the factors whose far-field departure (``far_field[key]``, a
    fraction of the nominal, as compare.solve.segments.SegmentStudy.far_field holds it) exceeds
    :data:`FAR_FIELD_TOL`: one record naming every such factor with its departure, the model's
    ``length``, ``diameter`` and the feature-to-end distance ``gap`` [m]; ``where`` (e.g. the station)
    is copied into it. None exceeding (or no figures): no record."""
    over = {k: float(far_field[k]) for k in _KEYS
            if far_field.get(k) is not None and float(far_field[k]) > FAR_FIELD_TOL}
    if not over:
        return []
    rec = {"code": "segment_far_field", "departures": over, "tolerance": FAR_FIELD_TOL, "why": FAR_FIELD_WHY,
           "length": length, "diameter": diameter, "feature_to_end": gap}
    rec.update(where or {})
    return [rec]


def far_field_text(w: dict, q=None) -> str:
    """The words of a ``segment_far_field`` record; ``q(value, 'length')`` formats lengths (SI metres
    written as millimetres without it)."""
    q = q or (lambda v, kind: f"{v * 1e3:.4g} mm")
    who = f" at station {w['station']}" if w.get("station") is not None else ""
    deps = ", ".join(f"{k} {100 * v:.3g} %" for k, v in w["departures"].items())
    gap = w.get("feature_to_end")
    gap_words = "" if gap is None else f", the feature {gap / w['diameter']:.2f} diameters from an end face"
    return (f"NO VERDICT{who}: THE 3-D MODEL IS TOO SHORT: within half a "
            f"diameter of an end face the surface stress departs from the plain bar's by {deps} of nominal (tolerance "
            f"{100 * w['tolerance']:.3g} %: {w['why']}); model {q(w['length'], 'length')} long{gap_words}. The "
            "feature's field reaches the end faces, which hold the plain bar's displacement, so its factors may read "
            "low (the unsafe side) by a few per cent: they are shown, flagged, but are not a verdict. Model a longer "
            "segment (the feature at least 1 diameter from each end) or refine (a coarse mesh's own scatter can also "
            "show here).")

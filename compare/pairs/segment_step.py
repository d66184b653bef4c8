"""A 3-D segment (the case's ``[segment]``, compare/case/segment.py) studied on three similar meshes
(compare/solve/segments.py) within the case's limits. Returns the
:class:`~compare.pairs.analysis.Analysis` the output reads, with ``extra['segment']`` holding the
study and ``extra['segment_rows']`` one record per factor, with the handbook value beside where the
project has one (from memory: context, never a pass mark), and ``pairs`` one
:class:`~compare.pairs.pairs.Pair` per factor (``kind='factor'`` with the handbook value, else
``'not applicable'`` with the reason).

A shoulder alone (``kind = "shoulder"``) gets the Roark Table 17.1 fits of Peterson's stepped-bar
charts (classic/notch_fits.py; both bending planes the one fit, the shoulder being round).
A keyseat end gets Shigley's first-iteration estimates (another geometry: key in place, r/d = 0.02).
A plain through cross hole gets Peterson's fits for a round bar with a transverse hole
(classic/cross_hole.py, gross-section nominal like the 3-D engine): bending in the plane of the
hole's axis (``kt_bending_y``: the hole runs along x) and torsion (half the fit's σmax/τ, the bore's
surface being in uniaxial stress at the peak); no fit for tension or for bending about the hole's own
axis (the hole on the neutral plane); a chamfered or blind hole, or d/D outside the fit's range, has
no value and the row says why.

The segment is solved on the smallest model its features allow (:func:`fem.solid.symmetry_of`: the
quarter of a keyseat centred along the segment, the half of one off centre, the whole beside a
shoulder or with a blind hole), except that a cross hole keeps the whole model unless the case asks
(:func:`model_symmetry`: its quarter model's meshes were hardly refined at the hole); the surface stress is completed to the whole lateral surface
by reflection, so factors, peaks and figures read the whole segment. ``extra['segment']['model']``
says which ("whole", "half" or "quarter", :data:`MODELS`)."""
from __future__ import annotations

import time

from classic import cross_hole as ch
from classic import fatigue as cf
from classic import notch_fits
from classic._validity import OutOfRangeError
from fem import solid

from ..case.segment import MODELS
from ..solve.segments import KEYS, study_segment
from .analysis import Analysis
from .pairs import Pair

#: Handbook first-iteration estimates for an end-milled keyseat (Shigley, Table 7-1; from memory):
#: r/d = 0.02, key in place. Context only: the geometry and loading differ from the case's. Bending
#: about x only: the keyseat (on +y) then lies where the bending stress is largest; bending about y
#: puts it near the neutral plane, where the chart does not apply.
KEYSEAT_CHART = {"kt_bending_x": 2.14, "kts": 3.0}
KEYSEAT_CHART_SOURCE = (f"{cf.EDITION}, Table 7-1 first-iteration estimates for an end-milled keyseat (r/d = 0.02, "
                        "key in place; from memory) — context only, a chart read by eye")
#: the cross-hole fits per factor key (classic/cross_hole.py); the other keys have none
CROSS_HOLE_FITS = {"kt_bending_y": ch.cross_hole_kt_bending, "kts": ch.cross_hole_kts_torsion}
CROSS_HOLE_SOURCE = ch.SOURCE + "; torsion: half the fit's σmax/τ"
#: why a factor of a cross hole has no handbook value
CROSS_HOLE_NONE = {"kt_axial": "no tension fit in the project", "kt_bending_x": "the hole lies on the neutral plane "
                   "of this bending: no chart applies"}
#: the shoulder fits per factor key (classic/notch_fits.py, gross nominal of the smaller diameter d like
#: the 3-D engine); a round shoulder is axisymmetric, so both bending planes take the one bending fit
SHOULDER_LOADS = {"kt_axial": "tension", "kt_bending_x": "bending", "kt_bending_y": "bending", "kts": "torsion"}
#: the 3-D meshes' own shaft on a plain bar reads E-independent factors; a stand-in modulus [Pa]
E_STANDIN = 2.0e11


def segment_step(case, fineness: float | None = None) -> Analysis:
    t0 = time.perf_counter()
    an = case.analysis
    m = case.material
    seg = case.segment
    E = m.elastic_modulus if m.elastic_modulus else E_STANDIN  # the factors do not depend on E
    sym = model_symmetry(seg, getattr(case, "segment_symmetry", None))
    st = study_segment(seg, fineness=fineness if fineness is not None else an.fineness, E=E, nu=m.poisson,
                       max_dofs=an.max_dofs, max_seconds=an.max_seconds, symmetry=sym)
    feat = seg.features[0]
    sh = seg.shoulder
    a, b = feat.span()
    rows = []
    pairs = []
    for load, key in KEYS.items():
        est = st.estimates[key]
        # a handbook chart is of the feature alone: none beside a shoulder, whose fillet may hold the peak
        chart, source, why = (handbook_value(feat, seg.d, key) if sh is None or feat is sh else
                              (None, None, "no handbook value beside a shoulder (the charts are of the feature alone)"))
        rows.append({"key": key, "load": load, "value": st.values[key], "gci": est["gci"], "status": est["status"],
                     "peak_at": st.peaks[key]["at"], "peak_on_feature": st.peaks[key]["on_feature"],
                     "peak_feature": st.peaks[key].get("feature"),
                     "chart": chart, "chart_source": source if chart is not None else None, "chart_why": why})
        if chart is not None:
            pairs.append(Pair(key, st.values[key], chart, source, kind="factor",
                              note="handbook value beside (from memory): FE/handbook is context, not a pass mark"))
        else:
            pairs.append(Pair(key, st.values[key], None, "", kind="not applicable", note=why or ""))
    out = Analysis(case, None, None, None, pairs, {"solve": time.perf_counter() - t0})
    out.extra["segment"] = {"study": st, "kind": feat.kind, "model": MODELS[sym], "at": (a + b) / 2, "span": [a, b],
                            "shoulder": None if sh is None else {"D": sh.D, "fillet": sh.fillet, "at": sh.z}}
    out.extra["segment_rows"] = rows
    out.extra["warnings"] = []
    return out


def model_symmetry(seg, chosen: int | None = None) -> int:
    """The mirror symmetry the study uses: ``chosen`` (the case's, already checked against the
    features), else the whole model for a cross hole, else the most the features allow
    (:func:`fem.solid.symmetry_of`)."""
    if chosen is not None:
        return int(chosen)
    # a cross hole keeps the whole model unless asked: on the quarter model its meshes were hardly
    # refined at the hole (measured ratios 1.10-1.21 at fineness 0.25, 1.10-1.11 at 0.3 in two runs, against
    # the nominal 1.4; compare.solve.segments.measured_ratios), so its study would give no estimate there
    if any(isinstance(f, solid.CrossHole) for f in seg.features):
        return 0
    return solid.symmetry_of(seg)


def handbook_value(feat, d: float, key: str) -> tuple[float | None, str | None, str | None]:
    """(value, source, why not) of the handbook factor beside FE factor ``key`` of feature ``feat`` on
    a shaft of diameter ``d`` [m]; value None with the reason where there is none."""
    if feat.kind == "keyseat_end":
        v = KEYSEAT_CHART.get(key)
        return (v, KEYSEAT_CHART_SOURCE, None) if v is not None else (None, None, "no chart value for this load")
    if feat.kind == "shoulder":
        load = SHOULDER_LOADS[key]
        try:
            return notch_fits.kt_fit("shoulder", load, feat.D, d, feat.fillet), notch_fits.SOURCE, None
        except OutOfRangeError as exc:
            return None, None, f"h/r = {(feat.D - d) / 2 / feat.fillet:.3g} outside the fit's range ({exc.reason})"
    if feat.kind == "cross_hole":
        fit = CROSS_HOLE_FITS.get(key)
        if fit is None:
            return None, None, CROSS_HOLE_NONE[key]
        if feat.depth is not None:
            return None, None, "a blind hole: the fit is for a through hole"
        if feat.chamfer > 0:
            return None, None, "a chamfered hole: the fit is for a plain (unchamfered) hole"
        try:
            return fit(feat.diameter, d), CROSS_HOLE_SOURCE, None
        except OutOfRangeError as exc:
            return None, None, f"d/D = {feat.diameter / d:.3g} outside the fit's range ({exc.reason})"
    return None, None, "no handbook value for this feature"

"""A 3-D segment (the case's ``[segment]``, compare/case/segment.py) studied on three similar meshes
(compare/solve/segments.py) within the case's limits. Returns the
:class:`~compare.pairs.analysis.Analysis` the output reads, with ``extra['segment']`` holding the
study and ``extra['segment_rows']`` one record per factor, with the handbook value beside where the
project has one (from memory, and a different geometry: context, never a pass mark)."""
from __future__ import annotations

import time

from classic import fatigue as cf

from ..solve.segments import KEYS, study_segment
from .analysis import Analysis

#: Handbook first-iteration estimates for an end-milled keyseat (Shigley, Table 7-1; from memory):
#: r/d = 0.02, key in place. Context only: the geometry and loading differ from the case's. Bending
#: about x only: the keyseat (on +y) then lies where the bending stress is largest; bending about y
#: puts it near the neutral plane, where the chart does not apply.
KEYSEAT_CHART = {"kt_bending_x": 2.14, "kts": 3.0}
KEYSEAT_CHART_SOURCE = (f"{cf.EDITION}, Table 7-1 first-iteration estimates for an end-milled keyseat (r/d = 0.02, "
                        "key in place; from memory) — context only, a chart read by eye")
#: the 3-D meshes' own shaft on a plain bar reads E-independent factors; a stand-in modulus [Pa]
E_STANDIN = 2.0e11


def segment_step(case, fineness: float | None = None) -> Analysis:
    t0 = time.perf_counter()
    an = case.analysis
    m = case.material
    seg = case.segment
    E = m.elastic_modulus if m.elastic_modulus else E_STANDIN  # the factors do not depend on E
    st = study_segment(seg, fineness=fineness if fineness is not None else an.fineness, E=E, nu=m.poisson,
                       max_dofs=an.max_dofs, max_seconds=an.max_seconds)
    feat = seg.features[0]
    sh = seg.shoulder
    a, b = feat.span()
    rows = []
    for load, key in KEYS.items():
        est = st.estimates[key]
        # the keyseat's chart is of a keyseat alone: none beside a shoulder, whose fillet may hold the peak
        chart = KEYSEAT_CHART.get(key) if feat.kind == "keyseat_end" and sh is None else None
        rows.append({"key": key, "load": load, "value": st.values[key], "gci": est["gci"], "status": est["status"],
                     "peak_at": st.peaks[key]["at"], "peak_on_feature": st.peaks[key]["on_feature"],
                     "peak_feature": st.peaks[key].get("feature"),
                     "chart": chart, "chart_source": KEYSEAT_CHART_SOURCE if chart is not None else None})
    out = Analysis(case, None, None, None, [], {"solve": time.perf_counter() - t0})
    out.extra["segment"] = {"study": st, "kind": feat.kind, "at": (a + b) / 2, "span": [a, b],
                            "shoulder": None if sh is None else {"D": sh.D, "fillet": sh.fillet, "at": sh.z}}
    out.extra["segment_rows"] = rows
    out.extra["warnings"] = []
    return out

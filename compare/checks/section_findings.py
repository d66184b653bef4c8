"""What a spline or an imported outline cannot support, as warning records (worded in
compare/output/section_geometry.py): a mesh outline has straight facets only; a spline's 2-D section
does not model the tooth loads; dimensions taken from standard tables held from memory."""
from __future__ import annotations

from fem.geometry import PRACTICALLY_SHARP, practically_sharp_fillets


def section_findings(section) -> list[dict]:
    g = {n: (v, src) for n, v, src in section.geometry}
    out = []
    sharp = practically_sharp_fillets(section)
    if sharp:  # built as sharp corners: the no-verdict rule of a sharp corner applies
        out.append({"code": "fillet_taken_sharp", "fillets": [{"field": f, "radius": r} for f, r in sharp],
                    "below": PRACTICALLY_SHARP, "size": section.length_scale})
    if g.get("curved_boundary", (True, ""))[0] is False:
        out.append({"code": "straight_facet_outline", "source": g.get("source", ("", ""))[0]})
    if section.kind == "spline":
        out.append({"code": "spline_2d_model", "form": g.get("form", ("", ""))[0]})
    remembered = sorted(n for n, (_v, src) in g.items() if isinstance(src, str) and "from memory" in src)
    if remembered:
        out.append({"code": "dimensions_from_memory", "fields": remembered,
                    "sources": sorted({g[n][1] for n in remembered})})
    return out

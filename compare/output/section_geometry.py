"""``section.geometry`` of results.json (the resolved dimensions of a spline or an imported outline,
SI, each with where it came from) and the words of the section warnings of
compare/checks/section_findings.py."""
from __future__ import annotations

SECTION_WARNINGS = {"straight_facet_outline", "spline_2d_model", "dimensions_from_memory", "fillet_taken_sharp"}


def geometry_record(section) -> dict | None:
    """{name: {"value": ..., "from": ...}} (as the keyway and flat shapes record theirs) or None when the
    section has no resolved dimensions."""
    if not section.geometry:
        return None
    return {n: {"value": v, "from": src} for n, v, src in section.geometry}


def section_warning_text(w: dict, f=None) -> str:
    code = w["code"]
    if code == "fillet_taken_sharp":
        q = (lambda v: f.q(v, "length", 3)) if f is not None else (lambda v: f"{v:.3g} m")
        which = ", ".join(f"{x['field']} = {q(x['radius'])}" for x in w["fillets"])
        return (f"PRACTICALLY SHARP CORNER: {which} is below {w['below']:g} of the section's size "
                f"({q(w['below'] * w['size'])}), smaller than the roughness of any machined surface. It is "
                "modelled as a sharp corner, where the elastic peak stress is unbounded: no peak stress, no Kts "
                "and no factor of safety are given there. Give the radius the cutter or the drawing specifies.")
    if code == "straight_facet_outline":
        return ("STRAIGHT FACETS ONLY: the outline is the boundary polygon of a triangle mesh, so curved edges "
                "(fillets, arcs) are modelled as straight facets and no curved-boundary accuracy is claimed: peak "
                "stresses at a faceted fillet can be wrong by more than the accuracy estimate shows, and a facet "
                "corner can look like a sharp corner. Import the drawing (DXF, STEP) for a trustworthy peak.")
    if code == "spline_2d_model":
        return ("2-D MODEL OF A SPLINE: the results are the torsion and bending of the splined length as a prism. "
                "The load the hub's teeth put on the spline teeth (contact, tooth bending and shear), the share of "
                "the torque along the engagement and the stress at the spline run-out are 3-D effects not modelled "
                "here; check them with the spline standard's own rating.")
    if code == "dimensions_from_memory":
        return (f"DIMENSIONS FROM MEMORY: {', '.join(w['fields'])} came from {'; '.join(w['sources'])}. These "
                "defaults are held from memory, not copied from the standard: check them against the standard "
                "(or give every dimension) before relying on the results.")
    return code

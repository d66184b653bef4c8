"""The results dictionary written to ``results.json``: SI base units (m, m², m⁴, N, N·m, Pa, rad/m),
coordinates those of the case's geometry. docs/outputs.md ('results.json') documents every key."""
from __future__ import annotations

import math

from .._version import __version__
from .results_composite import composite_results
from .results_composite_layout import composite_layout_results
from .results_segment import segment_results
from ..pairs.analysis import Analysis
from .report import CAUTION, Fmt, warning_text
from .report_combined import governing_text
from .results_features import add_feature_results, factors_only_results
from .results_checklist import add_checklist_results
from .results_shaft import add_shaft_results
from .section_geometry import geometry_record
from .trace import input_hashes

SCHEMA_VERSION = 1


def build_results(a: Analysis) -> dict:
    if (a.extra.get("shaft") or {}).get("factors_only"):  # a layout asking for the feature factors only
        return _clean(factors_only_results(a, warnings_out, SCHEMA_VERSION))
    if "composite" in a.extra and "shaft" in a.extra:  # a layout whose governing station is composite
        return _clean(composite_layout_results(a, warnings_out, SCHEMA_VERSION, build_results))
    if "composite" in a.extra:  # bonded regions of several materials
        return _clean(composite_results(a, warnings_out, SCHEMA_VERSION))
    if "segment" in a.extra:  # a 3-D segment study
        return _clean(segment_results(a, warnings_out, SCHEMA_VERSION))
    pr, tr, sm, case = a.props, a.torsion, a.mesh, a.case
    T = a.torque
    G = case.material.shear_modulus
    nom = a.nominal_shear()
    tau = a.tau_max
    J_lo, J_hi = tr.J, tr.J_warping
    torsion = {
        "J": tr.J,
        "J_warping": tr.J_warping,
        "J_bracket": [min(J_lo, J_hi), max(J_lo, J_hi)],
        "J_relative_gap": abs(J_hi - J_lo) / abs(J_lo),
        "J_mesh": tr.J_mesh,
        "J_warping_mesh": tr.J_warping_mesh,
        "boundary_correction": tr.J - tr.J_mesh,
        "torque": T,
        "tau_max": tau,
        "tau_max_at": list(tr.peak_at),
        "tau_max_where": a.where(tr.peak_at),
        "tau_max_warping": abs(T) * tr.peak_warping_per_torque,
        "tau_max_warping_at": list(tr.peak_warping_at),
        "peak_relative_difference": abs(tr.peak_warping_per_torque - tr.peak_per_torque) / tr.peak_per_torque,
        "tau_max_per_torque": tr.peak_per_torque,
        "twist_per_length": T / (G * tr.J),
        "torsional_stiffness_GJ": G * tr.J,
        "section_modulus": 1.0 / tr.peak_per_torque if tr.peak_per_torque else None,  # T/τmax
        "singular_corners": [list(p) for p in tr.singular_corners],
        "tau_max_excludes_singular_corners": bool(tr.singular_corners),
        "hole_constants": tr.hole_constants,
        "hole_areas": tr.hole_areas,
        "dofs": tr.dofs,
    }
    if nom is not None:
        torsion["kts"] = a.kts  # None where sharp re-entrant corners make the peak unbounded
        torsion["kts_nominal"] = {"tau_nominal": nom[0] if T else None,
                                  "tau_nominal_per_torque": nom[0] / (abs(T) or 1.0),
                                  "formula": nom[1], "source": nom[2]}
    out = {
        "schema_version": SCHEMA_VERSION,
        "tool": {"name": "shaftcheck", "version": __version__},
        "case": {"title": case.title, "units": case.units.name if case.units else None,
                 "file": str(case.path) if case.path else None},
        "inputs": input_hashes(case),
        "caution": CAUTION,
        "section": {
            "kind": case.section.kind,
            "geometry": {**(case.geometry or {}), **(geometry_record(case.section) or {})},  # every resolved dimension (SI) and where it came from
            "area": pr.area,
            "centroid": list(pr.centroid),
            "Ixx": pr.Ixx, "Iyy": pr.Iyy, "Ixy": pr.Ixy,
            "I1": pr.I1, "I2": pr.I2, "principal_angle_deg": pr.principal_angle_deg,
            "polar": pr.polar,
            "c_max": pr.c_max,
            "exact_boundary_integral": pr.exact,
            "fe_vs_boundary_integral": pr.rel_diff,
        },
        "torsion": torsion,
        "compare": [p.to_dict() for p in a.pairs],
        "mesh": {
            "fineness": sm.options.fineness,
            "element_size": sm.h_global,
            "elements": sm.info["elements"],
            "dofs": tr.dofs,
            "element": "6-node curved (isoparametric) triangle, quadratic",
            "sharp_reentrant_corners": [list(c.point) for c in sm.boundary.reentrant_sharp_corners],
        },
        "seconds": {**a.seconds, **{f"torsion_{k}": v for k, v in tr.seconds.items()}},
    }
    for key, value in a.extra.items():
        out[key] = value
    if "governing" in out:
        gov = out["governing"]
        if gov.get("no_verdict"):
            away = gov.get("away_from_corners")
            if away:
                away = _with_text(away, governing_text(away, out.get("fatigue", {}), Fmt(case.units)))
            out["governing"] = {**gov, "away_from_corners": away,
                                "text": gov.get("reason_text")
                                or "no verdict: a sharp re-entrant corner leaves the peak stress unbounded"}
        else:
            out["governing"] = _with_text(gov, governing_text(gov, out.get("fatigue", {}), Fmt(case.units)))
    out["warnings"] = warnings_out(a)
    _qualify_pass(out)
    add_shaft_results(out, a, build_results)  # the shaft layout's blocks, if the case has one
    add_feature_results(out, a)  # shaft.features: shoulders and grooves
    add_checklist_results(out, a)  # keys, splines, press fits, bearing life, torsion along the shaft
    out["exit_code"] = int(out.get("exit_code") or 0)  # in every results.json, 0 included (docs/outputs.md)
    return _clean(out)


#: Warnings after which "meets the design factor" is not a verdict the numbers support: the accuracy was
#: not shown, the solution failed a self-check, or the 2-D model does not describe the feature.
UNSUPPORTED_PASS = ("accuracy_not_met", "self_check_failed", "open_section", "short_feature",
                    "polymer_illustrative_data")


def _qualify_pass(out: dict) -> None:
    """A governing factor above the design factor is not presented as a pass when a warning says the
    numbers cannot support it: ``governing.verdict_supported`` is False and the sentence says why."""
    gov = out.get("governing")
    if not gov or gov.get("no_verdict") or not gov.get("meets_design_factor"):
        return
    why = [w["code"] for w in out.get("warnings", []) if w["code"] in UNSUPPORTED_PASS]
    gov["verdict_supported"] = not why
    for m in out.get("materials") or []:
        if why and m.get("meets") is True:
            m["meets"] = None
            m["no_verdict"] = "the warnings above say the numbers cannot support a pass"
    if why and gov.get("text"):
        nd = gov.get("design_factor")
        gov["text"] = gov["text"].replace(f"(meets the design factor {nd:g})",
                                          f"(above the design factor {nd:g}, but NOT a verdict: see the warnings)")


def warnings_out(a: Analysis) -> list[dict]:
    """``warnings``: [{code, text, data}], the text in the case's units, most serious first."""
    f = Fmt(a.case.units)
    return [{"code": w["code"], "text": warning_text(w, f), "data": {k: v for k, v in w.items() if k != "code"}}
            for w in a.extra.get("warnings", [])]


def _with_text(record: dict, text: str) -> dict:
    """A copy of the record with its sentence after ``where`` (the analysis keeps the bare record)."""
    out = {}
    for k, v in record.items():
        out[k] = v
        if k == "where":
            out["text"] = text
    out.setdefault("text", text)
    return out


def _clean(v):
    """JSON-safe: floats stay floats, NaN/inf become None, tuples lists."""
    if isinstance(v, dict):
        return {k: _clean(x) for k, x in v.items()}
    if isinstance(v, (list, tuple)):
        return [_clean(x) for x in v]
    if isinstance(v, float):
        return v if math.isfinite(v) else None
    if hasattr(v, "item"):
        return _clean(v.item())
    return v

"""What the numbers of a run cannot support, found after every other step: the ``warnings`` of
``results.json`` (as records; the output step words them) and the verdicts they withdraw.

- A sharp re-entrant corner has no bounded peak stress: no factor of safety, no material 'meets' and
  no Kts can be given for the section. The governing result is withdrawn (kept, marked, as the value
  away from the corners) and the run ends with :data:`EXIT_NO_VERDICT`.
- A cut that joins a hole to the outside (or two holes) changes the section's connectivity: the 2-D
  model is a slit running the whole length of the shaft, not a local hole.
- A feature given a ``length`` shorter than the section is wide is a local 3-D feature: the 2-D model
  describes it as a slot running the whole length.
- A factor of safety below 1, a failed self-check, an accuracy target not met: said first.
"""
from __future__ import annotations

import math

from fem.topology import cut_connectivity

from .polymer import polymer_findings
from .section_findings import section_findings

#: Exit code of a run that can give no verdict: the stress is unbounded at a sharp re-entrant corner.
EXIT_NO_VERDICT = 4

#: Keyway bottom radii of the metric key standards, 0.16 mm (small keys) to 0.6 mm (shafts of 65–130 mm):
#: ISO/R773 and DIN 6885-1, keyway bottom radius tables.
KEYWAY_RADII = (0.16e-3, 0.6e-3)


def findings_step(a) -> None:
    """Fill ``a.extra['warnings']`` (records with a ``code``, most serious first) and withdraw the
    verdicts a sharp corner leaves unsupported."""
    out: list[dict] = []
    tr = a.torsion
    if tr.singular_corners:
        corners = []
        for p in tr.singular_corners:
            w = a.where(p)
            corners.append({"at": [float(p[0]), float(p[1])], "keyway": w.get("keyway"),
                            "boundary": w.get("boundary")})
        out.append({"code": "sharp_corner_no_verdict", "corners": corners,
                    "keyed": a.case.section.kind == "keyed", "keyway_radii": list(KEYWAY_RADII)})
        withdraw_verdicts(a)
    gov = a.extra.get("governing") or {}
    n = gov.get("factor")
    if n is None:
        n = (gov.get("away_from_corners") or {}).get("factor")
    if n is not None and math.isfinite(n) and n < 1.0:
        out.append({"code": "factor_below_one", "factor": n, "criterion": gov.get("criterion") or
                    (gov.get("away_from_corners") or {}).get("criterion"),
                    "path": gov.get("path") or (gov.get("away_from_corners") or {}).get("path"),
                    "away_from_corners": gov.get("factor") is None})
    for c in a.extra.get("checks", []) or []:
        if not c.get("passed", True):
            out.append({"code": "self_check_failed", "check": c.get("name"), "value": c.get("value"),
                        "limit": c.get("limit")})
    acc = a.extra.get("accuracy")
    if acc is not None and not acc.get("met"):
        known = acc.get("meshes_distinct", True)  # meshes not refined by the ratio: no estimate stands
        out.append({"code": "accuracy_not_met", "target": acc.get("target"), "achieved": acc.get("achieved") if known else None,
                    "limited_by": acc.get("limited_by"), "because": list(acc.get("not_met_because") or [])})
    for ch in cut_connectivity(a.case.section):
        out.append({"code": "open_section", **ch})
    out.extend(section_findings(a.case.section))  # splines, imported outlines
    out.extend(polymer_findings(a))  # invented polymer data
    width = a.case.section.length_scale
    for field, length in a.case.feature_lengths:
        if length < width and field != "section":  # a spline's length: its spline_2d_model warning says it
            out.append({"code": "short_feature", "field": field, "length": length, "width": width})
    a.extra["warnings"] = out
    if tr.singular_corners:
        a.extra["exit_code"] = EXIT_NO_VERDICT


def withdraw_verdicts(a, reason: str = "sharp re-entrant corner", note: str | None = None,
                      design_factor: float | None = None) -> None:
    """With an unbounded peak, no factor of safety is the section's: the governing result becomes
    'no verdict' (the value away from the corners is kept beside it, marked), static 'meets' flags
    and every material's 'meets' become None. ``reason`` names the corner (a keyway's, a shoulder's).
    Another reason (compare/checks/feature_bound.py) gives the materials' ``note`` (else "the stress
    is unbounded") and the governing record's ``design_factor`` (else the case's) and
    ``reason_text``."""
    gov = a.extra.get("governing")
    a.extra["governing"] = {"factor": None, "no_verdict": True, "reason": reason,
                            "criterion": None, "path": None, "at": None, "where": None,
                            "design_factor": a.case.analysis.design_factor if design_factor is None else design_factor,
                            "meets_design_factor": None, "away_from_corners": gov}
    if note is not None:
        a.extra["governing"]["reason_text"] = "no verdict: " + reason
    st = a.extra.get("static")
    if st and "meets_design_factor" in st:
        st["meets_design_factor"] = {c: None for c in st["meets_design_factor"]}
    for e in a.extra.get("materials") or []:
        e["meets"] = None
        e["meets_what_was_checked"] = None
        e["no_verdict"] = f"{reason}: the stress is unbounded" if note is None else note

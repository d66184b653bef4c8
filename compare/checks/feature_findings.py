"""Warnings about the shoulders and grooves of ``[shaft]`` (records; output/ words them):

- a shoulder without a fillet radius: its elastic stress is unbounded, so it has no Kt and a
  station there no fatigue verdict from these factors;
- a feature the model cannot take (fillet larger than the step, groove radius larger than its depth);
- the model's far-field check failed (the feature's disturbance reached the plain shaft);
- a factor without an error estimate;
- a factor whose meshes were not refined until its last three values converged monotonically (a
  limit stopped it: its bound is the spread of the last three values) and whose bound exceeds the
  case's accuracy target;
- a factor whose bound exceeds the case's accuracy target without a limit (its last three values
  converge monotonically, but their GCI is larger than the target: the study does not refine further
  then; the factor's accuracy is not shown to the target);
- features closer together than the plain length each model assumes (they interact; modelled alone);
- a station on a feature whose FE path could not be taken from the feature's local stresses: its hand
  path carries the FE Kt, Kts, but its FE path is the plain round section's, which does not see the
  shoulder or groove (a station on a solved feature takes the fillet's local stresses: checks/feature_local.py).
"""
from __future__ import annotations

from ..pairs.analysis import Analysis
from ..pairs.feature_step import attach_features
from .findings import EXIT_NO_VERDICT

#: accuracy target where the analysis gives none (compare.case.case.Analysis.accuracy's default)
DEFAULT_TARGET = 1e-3


def feature_findings(a) -> list[dict]:
    out: list[dict] = []
    feats = (a.extra.get("shaft") or {}).get("features") or []
    # a spread bound within the case's accuracy target needs no warning (the record and the summary
    # still say that the refinement was stopped)
    analysis = getattr(getattr(a, "case", None), "analysis", None)
    target = getattr(analysis, "accuracy", None) or DEFAULT_TARGET
    for rec in feats:
        if rec.get("skipped"):
            out.append({"code": f"feature_{rec['skipped']}", "field": rec["field"], "at": rec["at"],
                        "radius": rec.get("radius")})
            continue
        for key in ("kt_bending", "kt_axial", "kts"):
            ff = rec.get(f"{key}_far_field")
            if ff is not None and not ff["passed"]:
                out.append({"code": "feature_far_field", "field": rec["field"], "factor": key,
                            "fem": ff["fem"], "exact": ff["exact"], "tolerance": ff["tolerance"]})
            if rec.get(f"{key}_limited") and (rec.get(f"{key}_gci") is None or rec[f"{key}_gci"] > target):
                out.append({"code": "feature_refinement_limited", "field": rec["field"], "factor": key,
                            "limited": rec[f"{key}_limited"], "bound": rec.get(f"{key}_gci"),
                            "values": rec.get(f"{key}_values_coarse_to_fine")})
            elif rec.get(f"{key}_gci") is not None and rec[f"{key}_gci"] > target:
                # converged monotonically on its meshes, but its GCI is above what the case asks
                out.append({"code": "feature_target_not_shown", "field": rec["field"], "factor": key,
                            "bound": rec[f"{key}_gci"], "target": target,
                            "values": rec.get(f"{key}_values_coarse_to_fine")})
            if rec.get(key) is not None and rec.get(f"{key}_gci") is None:
                out.append({"code": "feature_no_gci", "field": rec["field"], "factor": key,
                            "values": rec.get(f"{key}_values_coarse_to_fine")})
        for note in rec.get("notes", []):
            if isinstance(note, dict) and "neighbours" in note:
                out.append({"code": "feature_neighbours", "field": rec["field"], "neighbours": note["neighbours"],
                            "length": note["modelled_alone_over"]})
    for st in (a.extra.get("shaft") or {}).get("stations") or []:
        if "feature" in (st.get("kt_from") or {}).values() and st.get("fe_path") not in ("feature", "segment"):
            out.append({"code": "feature_station_fe_path", "at": st["at"], "name": st.get("name", "")})
    return out


def factors_only(case, feats: dict) -> Analysis:
    """The result of a layout with shoulders or grooves but no loads and no stations: the features'
    factors and their warnings only (no section solve, no beam; ``extra['shaft']['factors_only']``).
    A feature that can have no factor (a sharp shoulder) makes the run one without a verdict (exit 4)."""
    a = Analysis(case, None, None, None, [], {}, extra={"shaft": {"factors_only": True}})
    attach_features(a, feats)
    a.extra["warnings"] = feature_findings(a)
    sharp = any(r.get("skipped") in ("sharp_shoulder", "composite_shoulder") for r in a.extra["shaft"]["features"])
    a.extra["exit_code"] = EXIT_NO_VERDICT if sharp else 0
    return a

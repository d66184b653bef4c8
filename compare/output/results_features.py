"""``shaft.features`` of results.json: one record per shoulder or groove, in order along the shaft
(compare/pairs/feature_step.py builds them; SI; docs/shoulders-grooves.md documents the keys)."""
from __future__ import annotations

from .._version import __version__
from .report import CAUTION


def add_feature_results(out: dict, a) -> None:
    """Copy the feature records into ``out['shaft']['features']`` (the layout block may have replaced
    ``out['shaft']``)."""
    feats = (a.extra.get("shaft") or {}).get("features")
    if feats is None:
        return
    out.setdefault("shaft", {})["features"] = feats


def factors_only_results(a, warnings_out, schema_version: int) -> dict:
    """results.json of a layout asking for the shoulder and groove factors only (no loads, no stations):
    the case, the caution, the FE-beside-chart pairs, ``shaft.features``, the warnings and the exit code.
    ``warnings_out`` and the schema version (compare/output/results.py) are handed in: same room, no circle."""
    case = a.case
    return {"schema_version": schema_version, "tool": {"name": "shaftcheck", "version": __version__},
            "case": {"title": case.title, "units": case.units.name if case.units else None,
                     "file": str(case.path) if case.path else None},
            "caution": CAUTION, "factors_only": True,
            "compare": [p.to_dict() for p in a.pairs],
            "shaft": {"features": a.extra["shaft"]["features"]},
            "warnings": warnings_out(a), "exit_code": a.extra.get("exit_code", 0)}

"""results.json of a shaft layout whose governing station is on a composite segment: the composite
section's own blocks (compare/output/results_composite.py) for that station, then the layout's blocks
(``shaft``, ``section_loads``, the checklist and feature blocks) as for any layout."""
from __future__ import annotations

from .results_checklist import add_checklist_results
from .results_composite import composite_results
from .results_features import add_feature_results
from .results_shaft import add_shaft_results
from .trace import input_hashes


def composite_layout_results(a, warnings_out, schema_version: int, build_results) -> dict:
    out = composite_results(a, warnings_out, schema_version)
    out["inputs"] = input_hashes(a.case)
    out["shaft"] = a.extra["shaft"]
    out["shaft_stations"] = None
    out["checklist"] = a.extra.get("checklist")
    add_shaft_results(out, a, build_results)
    add_feature_results(out, a)
    add_checklist_results(out, a)
    out["exit_code"] = max(int(out.get("exit_code") or 0), int(a.extra.get("exit_code") or 0))
    return out

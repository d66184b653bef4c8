"""``shaft.features`` of results.json: one record per shoulder or groove, in order along the shaft
(compare/pairs/feature_step.py builds them; SI; README 'Shoulders and grooves' documents the keys)."""
from __future__ import annotations


def add_feature_results(out: dict, a) -> None:
    """Copy the feature records into ``out['shaft']['features']`` (the layout block may have replaced
    ``out['shaft']``)."""
    feats = (a.extra.get("shaft") or {}).get("features")
    if feats is None:
        return
    out.setdefault("shaft", {})["features"] = feats

"""The words of a composite section's own warnings (compare/checks/composite_checks.py)."""
from __future__ import annotations


def composite_warning_text(w: dict) -> str:
    if w["code"] == "composite_fatigue_not_checked":
        parts = [f"{n} ({why})" for n, why in zip(w.get("regions", []), w.get("reasons", []))]
        return ("FATIGUE NOT CHECKED IN EVERY REGION: the loads alternate, but " + "; ".join(parts) + ". The lowest "
                "factor shown leaves those regions' fatigue out; give each region its fatigue data.")
    return w["code"]

"""Summary lines for the section dimensions the user did not give: the ones taken from a key
standard's table or a default, with where they came from (``results.json`` ``section.geometry``)."""
from __future__ import annotations

_KEYWAY = ("width", "depth", "fillet")


def geometry_lines(geo: dict, f) -> list[str]:
    """One line per keyway that took dimensions from a key table, one per other dimension that was
    not given (lengths in the case's units), and a caution for every key-table row that is from
    memory. ``f`` formats quantities (output.report.Fmt)."""
    geo = geo or {}
    lines = []
    for i, kw in enumerate(geo.get("keyways", [])):
        taken = [k for k in _KEYWAY if kw.get(k, {}).get("from", "given") != "given"]
        if not taken:
            continue
        dims = ", ".join(f"{k} {f.q(kw[k]['value'], 'length')}" for k in taken)
        src = kw.get("standard") or kw[taken[0]]["from"]
        row = kw.get("table_row")
        if row:
            src += f", row over {f.q(row['over'], 'length', 4)} up to {f.q(row['up_to'], 'length', 4)}"
        if "middle" in kw.get("fillet", {}).get("from", ""):
            src += " (fillet: the middle of the standard's range)"
        lines.append(f"  keyway {i + 1}: {dims} from {src}")
        if row and row.get("from_memory"):
            lines.append(f"  CAUTION: keyway {i + 1}: {row['caution']}")
    for key, e in geo.items():
        if isinstance(e, dict) and "from" in e and e["from"] != "given" and key != "nominal_diameter" \
                and e.get("value") is not None and not key.endswith("angle_deg") and e["from"].startswith("default"):
            lines.append(f"  {key}: {f.q(e['value'], 'length')} ({e['from']})")
    return lines

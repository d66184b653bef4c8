"""Small checks shared by every case-file parser (case.py, shapes.py, outlines.py, shaft.py): unknown
keys, angles, and a stress-concentration factor read from a chart with its source. Each raises :class:`~fem.errors.InputError` naming the field and the value as written."""
from __future__ import annotations

import math

from fem.errors import InputError, escape_text

from .units import to_si


def known(d, allowed: set, where: str) -> None:
    """``d`` must be a table whose keys are all in ``allowed``; ``where`` names it ('' for the top)."""
    if not isinstance(d, dict):
        raise InputError(where or "case file", d, "must be a table")
    for k in d:
        if k not in allowed:
            name = f"{where}.{k}" if where else k
            raise InputError(name, d[k] if not isinstance(d[k], dict) else None,
                             f"unknown key (expected one of: {', '.join(sorted(allowed))})")


def angle(v, name) -> float:
    """Degrees: a plain number is degrees; a string may carry deg or rad."""
    if isinstance(v, (int, float)) and not isinstance(v, bool):
        if not math.isfinite(v):
            raise InputError(name, v, "is not a finite angle")
        return float(v)
    return math.degrees(to_si(v, "angle", name, None))


def chart_factor(d: dict, key: str, where: str) -> tuple[float, str] | None:
    """``d[key]``, a stress-concentration factor read from a chart (at least 1), and ``d[key + '_source']``,
    the chart it was read from (required, escaped for output); None when ``key`` is not given.
    ``where`` names the table (``fatigue``, ``shaft.stations[0].fatigue``)."""
    if key not in d:
        return None
    v = to_si(d[key], "dimensionless", f"{where}.{key}", None)
    if not v >= 1:
        raise InputError(f"{where}.{key}", d[key], "a stress-concentration factor is at least 1")
    src = d.get(f"{key}_source")
    if not isinstance(src, str) or not src.strip():
        raise InputError(f"{where}.{key}_source", src, f"is required with {where}.{key}: name the chart it was "
                         "read from (book, edition, figure)")
    return v, escape_text(src.strip())

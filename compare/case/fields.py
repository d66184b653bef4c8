"""Small checks shared by every case-file parser (case.py, shapes.py, outlines.py, shaft.py): unknown
keys and angles. Each raises :class:`~fem.errors.InputError` naming the field and the value as written."""
from __future__ import annotations

import math

from fem.errors import InputError

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

"""Validity ranges as data.

A published formula holds over a stated range of its parameters. Each range is declared once, at
module level beside the formula, as a :class:`Validity`; the formula calls :meth:`Validity.check`.
Outside the range it either warns (:class:`OutOfRangeWarning`) or refuses
(:class:`OutOfRangeError`), as the range says. It never clamps.
"""
from __future__ import annotations

import math
import warnings
from dataclasses import dataclass


class OutOfRangeWarning(UserWarning):
    """A formula was used outside the range its source states."""


class OutOfRangeError(ValueError):
    """A formula was asked for a value outside the range where it means anything."""

    def __init__(self, field: str, value, reason: str):
        self.field, self.value, self.reason = field, value, reason
        super().__init__(f"{field} = {value!r}: {reason}")


@dataclass(frozen=True)
class Validity:
    """Closed range ``low <= value <= high`` of one parameter of one formula.

    Parameters
    ----------
    name : str
        Parameter name as the formula's signature spells it.
    low, high : float
        Bounds (``-inf``/``inf`` for none), in the parameter's own unit.
    unit : str
        Unit of the bounds, for the message.
    action : {'warn', 'refuse'}
        What happens outside the range.
    source : str
        Where the range is stated.
    strict_low, strict_high : bool
        Exclude the bound itself.
    """

    name: str
    low: float = -math.inf
    high: float = math.inf
    unit: str = ""
    action: str = "refuse"
    source: str = ""
    strict_low: bool = False
    strict_high: bool = False

    def contains(self, value: float) -> bool:
        lo_ok = value > self.low if self.strict_low else value >= self.low
        hi_ok = value < self.high if self.strict_high else value <= self.high
        return bool(lo_ok and hi_ok)

    def mask(self, values):
        """Element-wise :meth:`contains` for an array (NaN is outside)."""
        import numpy as np  # noqa: PLC0415

        a = np.asarray(values, dtype=float)
        lo = a > self.low if self.strict_low else a >= self.low
        hi = a < self.high if self.strict_high else a <= self.high
        return lo & hi

    def check(self, value: float) -> float:
        """Return ``value`` unchanged if inside the range; warn or raise otherwise."""
        if isinstance(value, float) and math.isnan(value):
            raise OutOfRangeError(self.name, value, "is not a number")
        if self.contains(value):
            return value
        lo = "(" if self.strict_low else "["
        hi = ")" if self.strict_high else "]"
        reason = f"outside the valid range {lo}{self.low:g}, {self.high:g}{hi} {self.unit}".rstrip()
        if self.source:
            reason += f" ({self.source})"
        if self.action == "warn":
            warnings.warn(f"{self.name} = {value!r}: {reason}", OutOfRangeWarning, stacklevel=3)
            return value
        raise OutOfRangeError(self.name, value, reason)


def checked(validity: Validity, value) -> float:
    """``value`` as a float, inside ``validity``; a one-line error naming the field otherwise."""
    try:
        x = float(value)
    except (TypeError, ValueError):
        raise OutOfRangeError(validity.name, value, "is not a real number") from None
    return float(validity.check(x))

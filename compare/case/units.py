"""Units at the edges: case-file values in, report values out. SI inside, always.

A case declares one unit system (``units = "mm-N-MPa"`` or ``"in-lbf-psi"``); a plain number in the
case takes that system's unit for its field's dimension, and a string carries its own unit
(``"25 mm"``, ``"150 N*m"``, ``"900 lbf*in"``). Conversion goes through pint.
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass
from functools import lru_cache

from fem.errors import InputError


@lru_cache(maxsize=1)
def ureg():
    import pint  # noqa: PLC0415  lazy import of a slow dependency: pint takes ~0.3 s to load; plain numbers never need it

    return pint.UnitRegistry()


#: Dimensions a case-file field can have, with their SI unit.
SI = {
    "length": "m",
    "area": "m**2",
    "second_moment": "m**4",
    "force": "N",
    "moment": "N*m",
    "stress": "Pa",
    "angle": "rad",
    "twist": "rad/m",
    "temperature": "degC",
    "dimensionless": "",
    "density": "kg/m**3",
    "mass": "kg",
    "mass_inertia": "kg*m**2",
    "stiffness": "N/m",
    "angular_speed": "rad/s",
}
#: Default units of the shaft-layout dimensions for a plain number, per length unit of the system.
_LAYOUT_UNITS = {
    "mm": {"density": "kg/m**3", "mass": "kg", "mass_inertia": "kg*m**2", "stiffness": "N/mm", "angular_speed": "rpm"},
    "m": {"density": "kg/m**3", "mass": "kg", "mass_inertia": "kg*m**2", "stiffness": "N/m", "angular_speed": "rpm"},
    "inch": {"density": "lb/inch**3", "mass": "lb", "mass_inertia": "lb*inch**2", "stiffness": "lbf/inch",
             "angular_speed": "rpm"},
}
_LAYOUT_LABELS = {"kg/m**3": "kg/m³", "kg*m**2": "kg·m²", "N/mm": "N/mm", "N/m": "N/m", "lb/inch**3": "lb/in³",
                  "lb*inch**2": "lb·in²", "lbf/inch": "lbf/in", "rpm": "rpm", "kg": "kg", "lb": "lb"}


@dataclass(frozen=True)
class UnitSystem:
    name: str
    length: str
    force: str
    stress: str

    def unit(self, dimension: str) -> str:
        if dimension in _LAYOUT_UNITS["m"]:
            return _LAYOUT_UNITS[self.length][dimension]
        return {
            "length": self.length,
            "area": f"{self.length}**2",
            "second_moment": f"{self.length}**4",
            "force": self.force,
            "moment": f"{self.force}*{self.length}",
            "stress": self.stress,
            "angle": "deg",
            "twist": f"deg/{self.length}",
            "temperature": "degC",
            "dimensionless": "",
        }[dimension]

    def label(self, dimension: str) -> str:
        if dimension in _LAYOUT_UNITS["m"]:
            return _LAYOUT_LABELS[_LAYOUT_UNITS[self.length][dimension]]
        return {
            "length": self.length,
            "area": f"{self.length}²",
            "second_moment": f"{self.length}⁴",
            "force": self.force,
            "moment": f"{self.force}·{self.length}",
            "stress": self.stress,
            "angle": "°",
            "twist": f"°/{self.length}",
            "temperature": "°C",
            "dimensionless": "",
        }[dimension]


SYSTEMS = {
    "mm-N-MPa": UnitSystem("mm-N-MPa", "mm", "N", "MPa"),
    "m-N-Pa": UnitSystem("m-N-Pa", "m", "N", "Pa"),
    "in-lbf-psi": UnitSystem("in-lbf-psi", "inch", "lbf", "psi"),
    "in-lbf-ksi": UnitSystem("in-lbf-ksi", "inch", "lbf", "ksi"),
}


#: Significant digits a converted dimensional value keeps (lengths, forces, moments, stresses):
#: far beyond any drawing or data sheet (a change of at most 5e-14 of the value), yet few enough to
#: wipe out the last-bit noise of a unit conversion, so the same quantity in any unit system is the
#: same float (0.6 in and 15.24 mm both become 0.01524 m) and the same shaft gets the same mesh.
SIGNIFICANT_DIGITS = 14
_ROUNDED = {"length", "area", "second_moment", "force", "moment", "stress"}


def round_significant(x: float, digits: int = SIGNIFICANT_DIGITS) -> float:
    """``x`` rounded to ``digits`` significant decimal digits (the nearest float to that decimal)."""
    return float(f"{x:.{digits - 1}e}") if math.isfinite(x) and x != 0.0 else x


def unit_system(name, field="case.units") -> UnitSystem | None:
    if name is None:
        return None
    if not isinstance(name, str) or name not in SYSTEMS:
        raise InputError(field, name, f"unknown unit system; use one of {', '.join(SYSTEMS)}")
    return SYSTEMS[name]


def to_si(value, dimension: str, field: str, system: UnitSystem | None) -> float:
    """A case-file value (number or 'number unit' string) as a float in SI for ``dimension``.
    Infinite and NaN values are refused however written (``inf``, ``"inf"``, ``"1e400 mm"``)."""
    si = _to_si(value, dimension, field, system)
    if not math.isfinite(si):
        raise InputError(field, value, "is not a finite number", _unit_of(value, dimension, system))
    return si


def _unit_of(value, dimension, system):
    """The unit a plain number takes from the case's unit system (for echoing it)."""
    if isinstance(value, (int, float)) and not isinstance(value, bool) and system is not None:
        return system.label(dimension) or None
    return None


def _to_si(value, dimension: str, field: str, system: UnitSystem | None) -> float:
    if isinstance(value, bool) or value is None:
        raise InputError(field, value, f"expected a {dimension.replace('_', ' ')}")
    if isinstance(value, int) and abs(value) > 10**300:
        raise InputError(field, value, "is far too large to be a number of this tool")
    if isinstance(value, (int, float)):
        if not math.isfinite(value):
            raise InputError(field, value, "is not a finite number")
        if dimension == "dimensionless":
            return float(value)
        if system is None:
            raise InputError(field, value, "has no unit and the case declares no unit system (set case.units or write e.g. \"25 mm\")")
        value = f"{value!r} {system.unit(dimension)}"
        return _convert(value, dimension, field)
    if isinstance(value, str):
        text = value.strip()
        if text.endswith("%") and dimension == "dimensionless":
            try:
                return float(text[:-1]) / 100.0
            except ValueError:
                raise InputError(field, value, "is not a percentage") from None
        try:
            float(text)
        except ValueError:
            return _convert(text, dimension, field)
        if dimension == "dimensionless":
            return float(text)
        raise InputError(field, value, f"is missing its unit (write e.g. \"{text} {system.unit(dimension) if system else SI[dimension]}\")")
    raise InputError(field, value, f"expected a number or a string with a unit, not {type(value).__name__}")


def _convert(text: str, dimension: str, field: str) -> float:
    u = ureg()
    # pint evaluates powers: "1 mm**9**9**9" would run for ever. Units need small whole powers only.
    powers = re.findall(r"(?:\*\*|\^)\s*\(?\s*[-+]?\s*([0-9.]*)", text)
    if len(text) > 80 or re.search(r"(?:\*\*|\^)[^*^/a-zA-Z]*(?:\*\*|\^)", text) or any(
            not p or len(p) > 2 for p in powers):
        raise InputError(field, text, "cannot be read as a quantity with a unit (write a number and a unit, "
                         "e.g. \"25 mm\", \"150 N*m\", \"1 mm**4\")")
    try:
        # number and unit apart: pint refuses offset units (°C) inside an expression like "80 degC"
        m = re.fullmatch(r"\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*", text)
        q = u.Quantity(float(m.group(1)), m.group(2) or "") if m else u.Quantity(text)
    except Exception:
        raise InputError(field, text, "cannot be read as a quantity with a unit") from None
    target = SI[dimension]
    try:
        if dimension == "temperature":
            return float(q.to("degC").magnitude)
        if dimension == "dimensionless":
            return float(q.to("dimensionless").magnitude)
        v = float(q.to(target).magnitude)
        return round_significant(v) if dimension in _ROUNDED else v
    except Exception:
        raise InputError(field, text, f"is not a{'n' if dimension[0] in 'aeiou' else ''} {dimension.replace('_', ' ')} (expected units like {target})") from None


def from_si(value: float, dimension: str, system: UnitSystem) -> float:
    """An SI float in the system's unit for ``dimension`` (for reports)."""
    if dimension == "dimensionless":
        return value
    u = ureg()
    if dimension == "temperature":
        return value
    return float(u.Quantity(value, SI[dimension]).to(system.unit(dimension)).magnitude)

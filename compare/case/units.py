"""Units at the edges: case-file values in, report values out. SI inside, always.

A case declares one unit system (``units = "mm-N-MPa"`` or ``"in-lbf-psi"``); a plain number in the
case takes that system's unit for its field's dimension, and a string carries its own unit
(``"25 mm"``, ``"150 N*m"``, ``"900 lbf*in"``). Conversion is pint's: the common units with pint's
own factors (:data:`_FACTORS`, without loading pint), any other unit through pint itself.
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass
from functools import lru_cache

from fem.errors import InputError


@lru_cache(maxsize=1)
def ureg():
    import pint  # noqa: PLC0415  lazy import of a slow dependency: pint takes ~0.3 s to load; the units in _FACTORS never need it

    return pint.UnitRegistry()


#: Dimensions a case-file field can have, with their SI unit.
SI = {
    "length": "m",
    "area": "m**2",
    "second_moment": "m**4",
    "force": "N",
    "moment": "N*m",
    "rigidity": "N*m**2",  # GJ, EI
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
    "time": "s",  # load durations and service lives (a polymer's creep and cycles)
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


#: The units a case commonly writes, each with pint's own factor to SI and back, as pint 0.25 gives them
#: (``Quantity(1.0, unit).to(si)`` and the reverse; checked bit for bit against pint by
#: tests/test_compare_units.py). pint converts a multiplicative unit with one multiplication by
#: that factor, so these give exactly pint's result without loading pint, which takes about 0.3 s of
#: every run. Any other unit, and every temperature, goes through pint.
_FACTORS = {
    ("mm", "length"): (0.001, 1000.0),
    ("m", "length"): (1.0, 1.0),
    ("inch", "length"): (0.0254, 39.37007874015748),
    ("in", "length"): (0.0254, 39.37007874015748),
    ("cm", "length"): (0.01, 100.0),
    ("ft", "length"): (0.30479999999999996, 3.2808398950131235),
    ("N", "force"): (1.0, 1.0),
    ("kN", "force"): (1000.0, 0.001),
    ("lbf", "force"): (4.4482216152605005, 0.22480894309971053),
    ("kip", "force"): (4448.221615260501, 0.00022480894309971047),
    ("Pa", "stress"): (1.0, 1.0),
    ("kPa", "stress"): (1000.0, 0.001),
    ("MPa", "stress"): (1000000.0, 1e-06),
    ("GPa", "stress"): (1000000000.0, 1e-09),
    ("psi", "stress"): (6894.7572931683635, 0.0001450377377302092),
    ("ksi", "stress"): (6894757.293168363, 1.4503773773020921e-07),
    ("N*m", "moment"): (1.0, 1.0),
    ("N*mm", "moment"): (0.001, 1000.0),
    ("kN*m", "moment"): (1000.0, 0.001),
    ("lbf*in", "moment"): (0.11298482902761671, 8.850745791327187),
    ("lbf*inch", "moment"): (0.11298482902761671, 8.850745791327187),
    ("lbf*ft", "moment"): (1.3558179483314006, 0.7375621492772655),
    ("deg", "angle"): (0.017453292519943295, 57.29577951308232),
    ("rad", "angle"): (1.0, 1.0),
    ("rpm", "angular_speed"): (0.10471975511965977, 9.549296585513721),
    ("rad/s", "angular_speed"): (1.0, 1.0),
    ("kg", "mass"): (1.0, 1.0),
    ("g", "mass"): (0.001, 1000.0),
    ("lb", "mass"): (0.4535923700000001, 2.2046226218487757),
    ("kg/m**3", "density"): (1.0, 1.0),
    ("lb/inch**3", "density"): (27679.90471020313, 3.6127292000083674e-05),
    ("kg*m**2", "mass_inertia"): (1.0, 1.0),
    ("lb*inch**2", "mass_inertia"): (0.0002926396534292, 3417.1718982093994),
    ("N/mm", "stiffness"): (1000.0, 0.001),
    ("N/m", "stiffness"): (1.0, 1.0),
    ("lbf/inch", "stiffness"): (175.12683524647645, 0.0057101471547326465),
    ("deg/mm", "twist"): (17.453292519943297, 0.057295779513082325),
    ("deg/m", "twist"): (0.017453292519943295, 57.29577951308232),
    ("deg/inch", "twist"): (0.6871375007851691, 1.455312799632291),
    ("mm**2", "area"): (1e-06, 1000000.0),
    ("inch**2", "area"): (0.00064516, 1550.0031000062002),
    ("m**2", "area"): (1.0, 1.0),
    ("mm**4", "second_moment"): (1.0000000000000002e-12, 999999999999.9999),
    ("inch**4", "second_moment"): (4.1623142559999997e-07, 2402509.610028831),
    ("m**4", "second_moment"): (1.0, 1.0),
    ("s", "time"): (1.0, 1.0),
    ("min", "time"): (60.0, 0.016666666666666666),
    ("h", "time"): (3600.0, 0.0002777777777777778),
    ("day", "time"): (86400.0, 1.1574074074074073e-05),
}


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
            "rigidity": f"{self.force}*{self.length}**2",
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
            "rigidity": f"{self.force}·{self.length}²",
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
    # pint evaluates powers: "1 mm**9**9**9" would run for ever. Units need small whole powers only.
    powers = re.findall(r"(?:\*\*|\^)\s*\(?\s*[-+]?\s*([0-9.]*)", text)
    if len(text) > 80 or re.search(r"(?:\*\*|\^)[^*^/a-zA-Z]*(?:\*\*|\^)", text) or any(
            not p or len(p) > 2 for p in powers):
        raise InputError(field, text, "cannot be read as a quantity with a unit (write a number and a unit, "
                         "e.g. \"25 mm\", \"150 N*m\", \"1 mm**4\")")
    # number and unit apart: pint refuses offset units (°C) inside an expression like "80 degC"
    m = re.fullmatch(r"\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*", text)
    if m and (m.group(2), dimension) in _FACTORS:
        v = float(m.group(1)) * _FACTORS[m.group(2), dimension][0]  # pint's result, without pint
        return round_significant(v) if dimension in _ROUNDED else v
    u = ureg()
    try:
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
    if dimension == "temperature":
        return value
    unit = system.unit(dimension)
    if (unit, dimension) in _FACTORS:
        return float(value) * _FACTORS[unit, dimension][1]  # pint's result, without pint
    return float(ureg().Quantity(value, SI[dimension]).to(unit).magnitude)

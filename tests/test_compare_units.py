"""Unit conversion at the edges: the table of common units gives exactly what pint gives.

The reference is pint itself (an outside, well-kept library): every factor in the table must be pint's
own factor to SI and back, bit for bit, and a conversion through the table must equal pint's
conversion of the same value, bit for bit, so skipping pint changes no result.
"""
from __future__ import annotations

import random
import subprocess
import sys

import pint
import pytest

from compare.case import units

UREG = pint.UnitRegistry()


@pytest.mark.parametrize(("unit", "dimension"), sorted(units._FACTORS))
def test_factor_is_pints_own(unit, dimension):
    to_si, from_si = units._FACTORS[unit, dimension]
    si = units.SI[dimension]
    assert UREG.Quantity(1.0, unit).to(si).magnitude == to_si
    assert UREG.Quantity(1.0, si).to(unit).magnitude == from_si


@pytest.mark.parametrize(("unit", "dimension"), sorted(units._FACTORS))
def test_conversion_equals_pint_bit_for_bit(unit, dimension):
    rng = random.Random(7)
    values = [rng.uniform(0.0, 2000.0) for _ in range(200)] + [25.0, 0.25, 90.0, 1.5, 3.0, 1e-3]
    si = units.SI[dimension]
    for v in values:
        ours = units.to_si(f"{v!r} {unit}", dimension, "f", None)
        exact = UREG.Quantity(v, unit).to(si).magnitude
        if dimension in units._ROUNDED:
            exact = units.round_significant(exact)
        assert ours == exact, (v, unit)


@pytest.mark.parametrize("system", sorted(units.SYSTEMS))
def test_from_si_equals_pint_bit_for_bit(system):
    s = units.SYSTEMS[system]
    rng = random.Random(11)
    for dimension in ("length", "area", "second_moment", "force", "moment", "stress", "angle", "twist", "mass",
                      "density", "mass_inertia", "stiffness", "angular_speed"):
        for _ in range(50):
            v = rng.uniform(1e-6, 1e9)
            exact = UREG.Quantity(v, units.SI[dimension]).to(s.unit(dimension)).magnitude
            assert units.from_si(v, dimension, s) == exact, (system, dimension, v)


def test_other_units_and_wrong_dimensions_still_go_through_pint():
    assert units.to_si("1 ft", "length", "f", None) == units.round_significant(0.3048)
    assert units.to_si("2 km", "length", "f", None) == 2000.0  # not in the table: pint
    assert units.to_si("80 degC", "temperature", "f", None) == 80.0
    with pytest.raises(units.InputError, match="is not a length"):
        units.to_si("25 N", "length", "f", None)  # in the table, but for force


def test_a_demo_case_loads_without_pint():
    code = ("import sys; from compare.case.case import load_case; load_case('cases/conveyor_gear_seat.toml'); "
            "print('pint' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True,
                         cwd=__import__("pathlib").Path(__file__).resolve().parents[1])
    assert out.stdout.strip() == "False"

"""Case files: units at the edge, every bad field refused with a one-line error naming it."""
import math

import pytest

from compare.case.case import parse_case
from compare.case.units import SYSTEMS, to_si
from fem.errors import InputError

BASE = {
    "case": {"title": "t", "units": "mm-N-MPa"},
    "section": {"shape": "keyed", "diameter": 25, "keyways": [{"width": 8, "depth": 4, "fillet": 0.4}]},
    "loads": {"torque": "120 N*m"},
    "material": {"shear_modulus": "79 GPa", "poisson": 0.3},
}


def case_with(**changes):
    import copy

    d = copy.deepcopy(BASE)
    for path, value in changes.items():
        keys = path.split("__")
        node = d
        for k in keys[:-1]:
            node = node[int(k)] if isinstance(node, list) else node.setdefault(k, {})
        if value is None:
            node.pop(keys[-1], None)
        else:
            node[keys[-1]] = value
    return d


def test_plain_numbers_take_the_case_unit_system():
    c = parse_case(BASE)
    assert c.section.diameter == pytest.approx(0.025)
    assert c.section.keyways[0].fillet == pytest.approx(0.0004)
    assert c.loads.torque == pytest.approx(120.0)
    assert c.material.shear_modulus == pytest.approx(79e9)


def test_strings_carry_their_own_unit():
    # 1 in = 25.4 mm and 1 lbf = 4.4482216152605 N exactly (international yard and pound, 1959)
    assert to_si("1.25 in", "length", "x", None) == pytest.approx(0.03175, rel=1e-12)
    assert to_si("900 lbf*in", "moment", "x", None) == pytest.approx(900 * 4.4482216152605 * 0.0254, rel=1e-9)
    assert to_si(12, "stress", "x", SYSTEMS["in-lbf-psi"]) == pytest.approx(12 * 4.4482216152605 / 0.0254**2, rel=1e-9)


@pytest.mark.parametrize("change,field", [
    ({"section__keyways__0__depth": 13}, "section.keyways[0].depth"),        # deeper than the radius
    ({"section__keyways__0__fillet": 4.5}, "section.keyways[0].fillet"),     # wider than half the keyway
    ({"section__diameter": "25"}, "section.diameter"),                       # a string with no unit
    ({"section__diameter": "25 N"}, "section.diameter"),                     # the wrong kind of unit
    ({"case__units": None, "section__diameter": 25}, "section.diameter"),    # no unit and no unit system
    ({"loads__torque_alternating": -5}, "loads.torque_alternating"),         # a negative amplitude
    ({"material__poisson": 0.7}, "material.poisson"),
    ({"material__shear_modulus": "-79 GPa"}, "material.shear_modulus"),
    ({"loads__torqe": 5}, "loads.torqe"),                                    # a misspelt key
    ({"section__shape": "octagon"}, "section.shape"),
    ({"case__units": "furlongs"}, "case.units"),
])
def test_bad_fields_are_named(change, field):
    with pytest.raises(InputError) as e:
        parse_case(case_with(**change))
    assert e.value.field == field
    assert "\n" not in str(e.value)


def test_percent_accuracy_and_angles():
    c = parse_case(case_with(analysis__accuracy="0.05 %", section__keyways__0__angle="0.5 rad"))
    assert c.analysis.accuracy == pytest.approx(5e-4)
    assert c.section.keyways[0].angle == pytest.approx(math.degrees(0.5))


def test_temperatures_with_offset_units():
    # °C and °F are offset units; 176 °F = 80 °C exactly ((176 − 32)·5/9)
    c = parse_case(case_with(material__temperature="176 degF"))
    assert c.material.temperature == pytest.approx(80.0, rel=1e-12)
    c = parse_case(case_with(material__temperature=80))
    assert c.material.temperature == pytest.approx(80.0)
    with pytest.raises(InputError) as e:
        parse_case(case_with(material__temperature="80 kg"))
    assert e.value.field == "material.temperature"

"""The ``segment`` table of a layout station (compare/case/shaft_segment.py): what the 3-D model is made
of (sizes from the keyed section, the key length from the keyway's length and its place along the shaft,
the default modelled length, the feature's angle) and the refusals that name the field. No solve."""
import pytest

from compare.case.case import parse_case
from fem import solid
from fem.errors import InputError


def layout(station: dict, segments=None) -> dict:
    return {
        "case": {"units": "mm-N-MPa"},
        "material": {"elastic_modulus": "205 GPa", "poisson": 0.29},
        "shaft": {"length": 300, "supports": [{"at": 30}, {"at": 230}],
                  "segments": segments or [{"from": 0, "to": 300, "diameter": 30}],
                  "loads": [{"at": 110, "force": [0, -1000], "torque": 60}, {"at": 280, "torque": -60}],
                  "sections": [{"at": 110, **station}]},
    }


KEYED = {"shape": "keyed", "diameter": 30, "keyways": [{"width": 8, "depth": 4, "fillet": 0.6, "angle": 45,
                                                         "length": 36}]}


def test_keyseat_end_takes_the_keyway():
    c = parse_case(layout({"section": KEYED, "segment": {"kind": "keyseat_end"}, "feature_from": 100}))
    ss = c.shaft.stations[0].segment
    assert ss.kind == "keyseat_end" and ss.angle == 45.0
    assert ss.centre == pytest.approx(0.118)  # from feature_from = 100 over the 36 mm keyway
    m = ss.model
    (f,) = m.features
    assert isinstance(f, solid.ProfileKeyseat)
    assert (f.width, f.depth, f.fillet) == pytest.approx((0.008, 0.004, 0.0006))
    assert f.z1 - f.z0 == pytest.approx(0.036) and (f.z0 + f.z1) / 2 == pytest.approx(m.length / 2)
    assert m.length == pytest.approx(0.036 + 3 * 0.030) and m.d == pytest.approx(0.030)  # span + 3 d (MARGIN)
    assert ss.notch == (0.0006, "shaft.sections[0].section.keyways[0].fillet")


def test_sled_runner_and_cross_hole():
    c = parse_case(layout({"section": KEYED, "segment": {"kind": "sled_runner", "cutter_diameter": 40,
                                                          "length": 120, "fineness": 0.5}}))
    ss = c.shaft.stations[0].segment
    assert isinstance(ss.model.features[0], solid.SledKeyseat) and ss.model.length == pytest.approx(0.12)
    assert ss.fineness == 0.5
    c = parse_case(layout({"segment": {"kind": "cross_hole", "hole_diameter": 5, "chamfer": 0.5, "angle": 30}}))
    ss = c.shaft.stations[0].segment
    (f,) = ss.model.features
    assert isinstance(f, solid.CrossHole) and f.diameter == pytest.approx(0.005) and f.chamfer == pytest.approx(5e-4)
    assert ss.angle == 30.0 and ss.centre == pytest.approx(0.11)
    assert ss.model.length == pytest.approx(0.096)  # the span (6 mm with the chamfers) plus three diameters
    assert ss.symmetry is None and solid.symmetry_of(ss.model) == 2  # the study takes the quarter by default


@pytest.mark.parametrize("station,field", [
    ({"segment": {"kind": "sled_runner"}}, "shaft.sections[0].segment.kind"),
    ({"section": KEYED, "segment": {"kind": "sled_runner"}}, "shaft.sections[0].segment.cutter_diameter"),
    ({"section": KEYED, "segment": {"kind": "keyseat_end", "keyway": 1}}, "shaft.sections[0].segment.keyway"),
    ({"section": KEYED, "segment": {"kind": "keyseat_end", "hole_diameter": 3}},
     "shaft.sections[0].segment.hole_diameter"),
    ({"segment": {"kind": "cross_hole", "hole_diameter": 5, "angle": "north"}}, "shaft.sections[0].segment.angle"),
    ({"segment": "cross_hole"}, "shaft.sections[0].segment"),
    ({"segment": {"kind": "cross_hole", "hole_diameter": 5, "chamfer": -1}}, "shaft.sections[0].segment.chamfer"),
    ({"segment": {"kind": "cross_hole", "hole_diameter": 5, "model": "eighth"}}, "shaft.sections[0].segment.model"),
    ({"segment": {"kind": "cross_hole", "hole_diameter": 5, "hole_depth": 12, "model": "half"}},
     "shaft.sections[0].segment.model"),  # a blind hole: no mirror plane, the whole model only
])
def test_refusals_name_the_field(station, field):
    with pytest.raises(InputError) as e:
        parse_case(layout(station))
    assert e.value.field == field

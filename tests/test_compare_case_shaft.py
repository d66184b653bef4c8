"""The [shaft] schema (compare/case/shaft.py): fields parsed to SI, defaults, refusals naming the field."""
import math

import pytest

from compare.case.case import parse_case
from fem.errors import InputError

BASE = {
    "case": {"units": "mm-N-MPa"},
    "material": {"elastic_modulus": "205 GPa", "poisson": 0.29},
}


def shaft_case(**shaft):
    d = {"length": 300, "sections": [{"at": 150}], "supports": [{"at": 0}, {"at": 300, "stiffness": 2e5}],
         "segments": [{"from": 0, "to": 100, "diameter": 30}, {"from": 100, "to": 300, "diameter": 35, "fillet": 1}]}
    d.update(shaft)
    return parse_case({**BASE, "shaft": d})


def test_layout_in_si():
    c = shaft_case(density=7850, speed="1450 rpm", rotating=True,
                   loads=[{"at": 50, "kind": "gear", "torque": 100, "pitch_diameter": 80, "pressure_angle": 20,
                           "helix_angle": 15, "hand": "left", "mesh_angle": 90, "mass": 2},
                          {"at": 250, "kind": "pulley", "torque": "-0.1 N*m", "diameter": 100, "tension_ratio": 3,
                           "pull_angle": 0},
                          {"at": 150, "force": [10, -20], "moment": [1, 2], "axial": 5}],
                   grooves=[{"at": 200, "width": 2, "depth": 0.5, "radius": 0.2}],
                   sections=[{"at": 120, "name": "shoulder"},
                             {"at": 50, "section": {"shape": "round", "diameter": 30},
                              "fatigue": {"kt_bending": 1.7, "kt_bending_source": "chart (from memory)"}}])
    s = c.shaft
    assert s.length == pytest.approx(0.3) and s.speed == pytest.approx(1450 * 2 * math.pi / 60)
    assert s.density == 7850 and s.rotating and s.self_weight
    assert [seg.diameter for seg in s.segments] == pytest.approx([0.03, 0.035])
    assert s.segments[1].fillet == pytest.approx(0.001) and s.segments[0].fillet is None
    assert s.supports[1].stiffness == pytest.approx(2e8) and s.supports[0].stiffness is None
    g, p, f = s.loads
    assert g.torque == pytest.approx(0.1) and g.gear.hand == "left" and g.gear.helix_angle == 15 and g.mass == 2
    assert p.torque == pytest.approx(-0.1) and p.pulley.tension_ratio == 3
    assert f.force == pytest.approx((10, -20)) and f.moment == pytest.approx((1e-3, 2e-3)) and f.axial == 5
    assert s.grooves[0].radius == pytest.approx(2e-4)
    assert s.stations[0].section is None and s.stations[1].fatigue["kt_bending"] == 1.7
    assert c.section.diameter == pytest.approx(0.03)  # no [section]: the first segment's plain round
    assert s.segment_at(0.1).diameter == pytest.approx(0.035)
    assert s.segment_at(0.1, "left").diameter == pytest.approx(0.03)


def test_loads_rotating_carries_over_and_sprocket_has_no_slack_side():
    d = {**BASE, "loads": {"rotating": True}, "section": {"shape": "round", "diameter": 30},
         "shaft": {"length": 300, "supports": [{"at": 0}, {"at": 300}],
                   "sections": [{"at": 100}],
                   "loads": [{"at": 10, "kind": "sprocket", "torque": 5, "diameter": 60, "pull_angle": 90},
                             {"at": 290, "torque": -5}]}}
    s = parse_case(d).shaft
    assert s.rotating and s.segments == [] and math.isinf(s.loads[0].pulley.tension_ratio)


@pytest.mark.parametrize("change, field", [
    ({"length": -3}, "shaft.length"),
    ({"supports": [{"at": 10}]}, "shaft.supports"),
    ({"supports": [{"at": 10}, {"at": 10}]}, "shaft.supports[1].at"),
    ({"supports": [{"at": 0}, {"at": 300, "stiffness": 0}]}, "shaft.supports[1].stiffness"),
    ({"segments": [{"from": 0, "to": 200, "diameter": 30}]}, "shaft.segments[0].to"),
    ({"segments": [{"from": 0, "to": 300, "diameter": 30, "bore": 30}]}, "shaft.segments[0].bore"),
    ({"loads": [{"at": 10, "kind": "magnet"}]}, "shaft.loads[0].kind"),
    ({"loads": [{"at": 10, "kind": "gear", "torque": 0, "pitch_diameter": 50, "pressure_angle": 50,
                 "mesh_angle": 0}]}, "shaft.loads[0].pressure_angle"),
    ({"loads": [{"at": 10, "kind": "gear", "torque": 0, "pitch_diameter": 50, "pressure_angle": 20}]},
     "shaft.loads[0].mesh_angle"),
    ({"loads": [{"at": 10, "force": [1]}]}, "shaft.loads[0].force"),
    ({"loads": [{"at": 10, "mass": -1}]}, "shaft.loads[0].mass"),
    ({"loads": [{"at": 10, "colour": "red"}]}, "shaft.loads[0].colour"),
    ({"grooves": [{"at": 50, "width": 2, "depth": 20, "radius": 0.5}]}, "shaft.grooves[0].depth"),
    ({"grooves": [{"at": 50, "width": 2, "depth": 1, "radius": 1.5}]}, "shaft.grooves[0].radius"),
    ({"sections": [{"at": 50, "fatigue": {"kt_bending": 2}}]}, "shaft.sections[0].fatigue.kt_bending_source"),
    ({"sections": [{"at": 50, "section": {"shape": "round", "diameter": -30}}]}, "shaft.sections[0].section.diameter"),
    ({"density": 0}, "shaft.density"),
    ({"rotating": "yes"}, "shaft.rotating"),
    ({"sections": [], "segments": [{"from": 0, "to": 300, "diameter": 30}]}, "shaft.sections"),  # no feature either
    ({"sections": [], "loads": [{"at": 50, "force": [0, -10]}]}, "shaft.sections"),  # loads need a station
])
def test_refusals_name_the_field(change, field):
    with pytest.raises(InputError) as e:
        shaft_case(**change)
    assert e.value.field == field


def test_section_needed_without_segments():
    with pytest.raises(InputError) as e:
        parse_case({**BASE, "shaft": {"length": 300, "supports": [{"at": 0}, {"at": 300}]}})
    assert e.value.field == "section"


def test_section_loads_come_from_the_layout():
    d = {**BASE, "loads": {"torque": 10}, "section": {"shape": "round", "diameter": 30},
         "shaft": {"length": 300, "supports": [{"at": 0}, {"at": 300}], "sections": [{"at": 100}]}}
    with pytest.raises(InputError) as e:
        parse_case(d)
    assert e.value.field == "loads.torque"

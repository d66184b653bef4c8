"""A station with a feature length is checked at the worst loads along the feature
(compare/checks/shaft_extent.py, the placing in compare/case/shaft.py). The loads are checked against
statics done by hand; the factors against the same section checked at the station alone."""
import json
import math
import tomllib
from pathlib import Path

import pytest

from compare.case.case import parse_case
from compare.checks.shaft_beam import G_STANDARD, solve_layout
from compare.checks.shaft_extent import candidates, check_over_extent, factors, with_loads
from compare.pipeline import analyse
from fem.errors import InputError

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "cases" / "countershaft_layout.toml"
BASE = {"case": {"units": "mm-N-MPa"}, "material": {"elastic_modulus": "205 GPa", "poisson": 0.29}}
KEYWAY = {"width": 8, "depth": 4, "fillet": 0.25}
KEYED40 = {"shape": "keyed", "diameter": 30, "keyways": [{**KEYWAY, "length": 40}]}


def shaft_case(sections, **shaft):
    d = {"length": 300, "supports": [{"at": 20, "name": "A"}, {"at": 280, "name": "B"}],
         "segments": [{"from": 0, "to": 300, "diameter": 30}], "sections": sections}
    d.update(shaft)
    return parse_case({**BASE, "shaft": d})


def demo_data() -> dict:
    return tomllib.loads(DEMO.read_text())


# ----------------------------------------------------------------------------- where the feature lies


def test_feature_centred_on_the_station_or_from_feature_from():
    c = shaft_case([{"at": 100, "section": {"shape": "keyed", "diameter": 30, "keyways": [{**KEYWAY, "length": 40}]}},
                    {"at": 100, "feature_from": 100,
                     "section": {"shape": "keyed", "diameter": 30, "keyways": [{**KEYWAY, "length": 40}]}},
                    {"at": 100, "section": {"shape": "keyed", "diameter": 30, "keyways": [KEYWAY]}},
                    {"at": 150}])
    a, b, plain, bare = c.shaft.stations
    assert a.extent == pytest.approx((0.08, 0.12)) and a.extent_field == "shaft.sections[0].section.keyways[0].length"
    assert b.extent == pytest.approx((0.10, 0.14))
    assert plain.extent is None and bare.extent is None  # no length: checked at its `at` only, as before


def test_flat_spline_and_cut_lengths_place_the_feature():
    c = shaft_case([{"at": 100, "section": {"shape": "flatted", "diameter": 30, "flats": [{"depth": 3, "length": 30}]}},
                    {"at": 200, "section": {"shape": "spline", "form": "straight", "splines": 6, "minor_diameter": 26,
                                            "major_diameter": 30, "width": 6, "fillet": 0.2, "length": 50}},
                    {"at": 150, "section": {"shape": "custom", "add": [{"disk": {"radius": 15}}],
                                            "cut": [{"rectangle": {"center": [0, 14], "size": [6, 6]}, "length": 12},
                                                    {"rectangle": {"center": [0, -14], "size": [6, 6]}, "length": 20}]}}])
    flat, spline, cut = c.shaft.stations
    assert flat.extent == pytest.approx((0.085, 0.115)) and flat.extent_field.endswith("section.flats[0].length")
    assert spline.extent == pytest.approx((0.175, 0.225)) and spline.extent_field == "shaft.sections[1].section.length"
    # the longest feature of the section sets the stretch the section (all its features) is checked over
    assert cut.extent == pytest.approx((0.14, 0.16)) and cut.extent_field.endswith("section.cut[1].length")


@pytest.mark.parametrize("station, field", [
    ({"at": 10, "section": KEYED40},
     "shaft.sections[0].section.keyways[0].length"),  # centred: -10 to 30 mm, off the left end
    ({"at": 290, "feature_from": 280, "section": KEYED40},
     "shaft.sections[0].section.keyways[0].length"),  # 280 to 320 mm on a 300 mm shaft
    ({"at": 100, "feature_from": 150, "section": KEYED40},
     "shaft.sections[0].feature_from"),  # the station is not on its feature
    ({"at": 100, "feature_from": 90, "section": {"shape": "keyed", "diameter": 30, "keyways": [KEYWAY]}},
     "shaft.sections[0].feature_from"),  # no feature with a length to place
    ({"at": 100, "section": {"shape": "flatted", "diameter": 30, "flats": [{"depth": 3, "length": 0}]}},
     "shaft.sections[0].section.flats[0].length"),
])
def test_feature_placing_refusals(station, field):
    with pytest.raises(InputError) as e:
        shaft_case([station])
    assert e.value.field == field


def test_feature_across_a_step_or_a_groove_is_refused_but_may_end_at_the_step():
    segs = [{"from": 0, "to": 150, "diameter": 30}, {"from": 150, "to": 300, "diameter": 35, "fillet": 1}]
    key40 = {"shape": "keyed", "diameter": 30, "keyways": [{**KEYWAY, "length": 40}]}
    with pytest.raises(InputError) as e:
        shaft_case([{"at": 140, "section": key40}], segments=segs)
    assert e.value.field == "shaft.sections[0].section.keyways[0].length" and "step" in e.value.reason
    ok = shaft_case([{"at": 130, "section": key40}], segments=segs)  # 110 to 150 mm: ends at the step
    assert ok.shaft.stations[0].extent == pytest.approx((0.11, 0.15))
    with pytest.raises(InputError) as e:
        shaft_case([{"at": 100, "section": key40}], grooves=[{"at": 119, "width": 2, "depth": 1, "radius": 0.3}])
    assert e.value.field == "shaft.sections[0].section.keyways[0].length" and "groove" in e.value.reason


# ----------------------------------------------------------------------------- the candidate loads


def test_demo_pulley_keyseat_candidates_against_statics():
    c = parse_case(demo_data())
    lay = solve_layout(c.shaft, c.section, c.material)
    st = c.shaft.stations[0]  # the pulley keyseat: station at the pulley's load point, keyway 40 mm centred
    cands = candidates(lay, st)
    assert [(round(x["z"] * 1e3, 9), x["side"]) for x in cands] == [(5, None), (25, "left"), (25, "right"), (45, None)]
    assert cands[1]["parts"] == cands[2]["parts"] == ["V-belt pulley"] and cands[1]["station"]
    assert cands[3]["end"] == "end" and cands[3]["toward"] == "A" and cands[0]["toward"] is None
    # statics: belt pull F1 + F2 with (F1 − F2)·D/2 = T and F1/F2 = 5 (Shigley's Mechanical Engineering
    # Design, 9th ed., Sec. 17-2), horizontal (pull_angle 0); the overhang carries it to the bearing
    T, D, ratio = 120.0, 0.2, 5.0
    F2 = T / (D / 2) / (ratio - 1)
    pull = ratio * F2 + F2
    q = 7850 * G_STANDARD * math.pi * 0.03**2 / 4  # self-weight per length of the 30 mm seat [N/m]
    for x in cands:
        z = x["z"]
        arm = max(z - 0.025, 0.0) if x["side"] != "left" else 0.0
        statics = {"My": pull * arm, "Mx": q * z**2 / 2, "T": -T if arm or x["side"] == "right" else 0.0}
        res = {k: {"fem": x["loads"][k], "exact": v} for k, v in statics.items()}
        for k, r in res.items():
            assert r["fem"] == pytest.approx(r["exact"], rel=1e-9, abs=1e-9), (z, x["side"], k)
    at_end = cands[3]["loads"]
    assert math.hypot(at_end["Mx"], at_end["My"]) == pytest.approx(pull * 0.020, rel=1e-4)  # 1800 N × 20 mm = 36 N·m
    at_station = cands[2]["loads"]
    assert math.hypot(at_station["Mx"], at_station["My"]) < 0.02  # only the self-weight of 25 mm of shaft


def test_feature_across_a_support_and_a_load_at_its_end_take_both_sides():
    key = {"shape": "keyed", "diameter": 30, "keyways": [{**KEYWAY, "length": 40}]}
    c = shaft_case([{"at": 30, "section": key}],  # 10 to 50 mm: over support A at 20, the gear at the end (50)
                   loads=[{"at": 50, "force": [0, -2000], "torque": "80 N*m"}, {"at": 200, "torque": "-80 N*m"}])
    lay = solve_layout(c.shaft, c.section, c.material)
    cands = candidates(lay, c.shaft.stations[0])
    got = [(round(x["z"] * 1e3, 9), x["side"]) for x in cands]
    assert got == [(10, None), (20, "left"), (20, "right"), (30, None), (50, "left"), (50, "right")]
    RA = next(r for r in lay["reactions"] if r["name"] == "A")
    left, right = cands[1]["loads"], cands[2]["loads"]
    assert right["Vy"] - left["Vy"] == pytest.approx(-RA["Fy"], rel=1e-12)  # the shear force jumps by the reaction
    assert cands[1]["supports"] == ["A"]
    # the load exactly at the feature's end: both sides read (the torque is on one side only)
    assert cands[4]["loads"]["T"] == 0.0 and cands[5]["loads"]["T"] == pytest.approx(-80.0)
    assert cands[4]["end"] == cands[5]["end"] == "end"


# ----------------------------------------------------------------------------- checked on the FE section


@pytest.fixture(scope="module")
def demo_pulley():
    """The demo with its pulley keyseat station only (the other stations are not needed here)."""
    d = demo_data()
    d["shaft"]["sections"] = [d["shaft"]["sections"][0]]
    c = parse_case(d)
    return c, analyse(c)


def test_demo_pulley_keyseat_is_checked_where_the_overhang_bends_it(demo_pulley):
    c, a = demo_pulley
    rec = a.extra["shaft"]["stations"][0]
    ext = rec["extent"]
    assert rec["at_load_point"] == {"parts": ["V-belt pulley"], "supports": []}
    assert ext["from"] == pytest.approx(0.005) and ext["to"] == pytest.approx(0.045)
    g = ext["governing"]
    assert g["z"] == pytest.approx(0.045) and g["end"] == "end" and g["toward"] == "A"
    # statics: belt pull 1800 N × 20 mm lever arm to the keyseat's end (Shigley 9th ed., Sec. 17-2)
    statics = 1800.0 * 0.020
    used = rec["loads"]["used"]
    assert math.hypot(used["Mx"], used["My"]) == pytest.approx(statics, rel=1e-4)
    assert rec["loads"]["used_at"] == pytest.approx(0.045)
    at_station = next(r for r in ext["candidates"] if r["station"] and r["side"] == "right")
    # the same section, the same torque, and the bending added: every factor drops
    assert g["factor"] < at_station["factor"]
    assert ext["fatigue_governing"]["factor"] < at_station["fatigue"]
    assert ext["static_governing"]["factor"] <= at_station["static"]
    assert a.extra["governing"]["factor"] == pytest.approx(g["factor"], rel=1e-12)  # the station's result is it
    assert a.case.loads.bending == pytest.approx((used["Mx"], used["My"]))
    # the self-weight's departure from a straight moment line between candidates: q·h²/8, h = 20 mm; over
    # the keyseat the beam carries the station's FE section (its area, less than the round's)
    q = 7850 * G_STANDARD * a.props.area
    assert a.props.area < math.pi * 0.03**2 / 4
    assert ext["self_weight_departure"] == pytest.approx(q * 0.020**2 / 8, rel=1e-9)


def test_between_candidates_the_factor_is_not_lower(demo_pulley):
    """Convexity of 1/n in the loads (shaft_extent's docstring): inside a stretch where the loads are
    linear in z, the factor is no lower than at the stretch's ends."""
    c, a = demo_pulley
    st = c.shaft.stations[0]
    lay = a.extra["shaft"]["layout"]
    ext = a.extra["shaft"]["stations"][0]["extent"]
    from compare.checks.shaft_beam import loads_at
    ends = [r["factor"] for r in ext["candidates"] if r["z"] > 0.025 or r["side"] == "right"]
    for z in (0.030, 0.035, 0.040):
        b = with_loads(a, loads_at(lay["items"], lay["z"], lay["qy"], z), c.shaft.rotating)
        n = factors(b)["factor"]
        assert n >= min(ends) * (1 - 1e-9)
        assert n <= max(ends) * (1 + 1e-9)  # moment grows along the stretch, torque steady: in between
    assert st.extent is not None


def test_check_over_extent_reuses_the_section_and_keeps_the_base_clean(demo_pulley):
    c, a = demo_pulley
    st = c.shaft.stations[0]
    lay = a.extra["shaft"]["layout"]
    before = dict(a.extra)
    got, used, rec = check_over_extent(a, st, lay, c.shaft.rotating)
    assert got.mesh is a.mesh and got.torsion is a.torsion  # no new mesh, no new solve
    assert set(before) == set(a.extra) and all(before[k] is a.extra[k] for k in before)
    assert rec["governing"]["z"] == pytest.approx(0.045)


def test_run_flat_over_a_support_summary_and_results(tmp_path, run_cli):
    """A flatted station whose flat runs over a bearing: the results say where the loads were taken,
    the summary says so, results.csv carries it; a plain station beside it keeps its old record."""
    case = tmp_path / "flat.toml"
    case.write_text("""
[case]
title = "flat over a bearing"
units = "mm-N-MPa"
[material]
elastic_modulus = "205 GPa"
poisson = 0.29
yield = 500
ultimate = 700
[analysis]
accuracy = "2 %"
[shaft]
length = 300
rotating = true
supports = [{ at = 40, name = "A" }, { at = 300, name = "B" }]
[[shaft.segments]]
from = 0
to = 300
diameter = 30
[[shaft.loads]]
at = 0
force = [0, -1000]
torque = "50 N*m"
[[shaft.loads]]
at = 200
torque = "-50 N*m"
[[shaft.sections]]
at = 20
name = "flat"
feature_from = 10
section = { shape = "flatted", diameter = 30, flats = [{ depth = 3, length = 40 }] }
[[shaft.sections]]
at = 100
name = "plain"
""")
    out = tmp_path / "out"
    code, stdout, err = run_cli("run", str(case), "--out", str(out), "--no-vtu")
    assert code == 0, err
    res = json.loads((out / "results.json").read_text())
    flat, plain = res["section_loads"]
    ext = flat["extent"]
    assert ext["from"] == pytest.approx(0.010) and ext["to"] == pytest.approx(0.050)
    assert ext["placed"] == "feature_from"
    # statics: the overhung 1000 N at the free end bends the shaft most over the bearing, 1000 N × 40 mm
    g = ext["governing"]
    assert g["z"] == pytest.approx(0.040) and g["supports"] == ["A"]
    # (rel 1e-7: the left side of the jump is read 1e-9 of the shaft's length before the support)
    assert math.hypot(flat["Mx"], flat["My"]) == pytest.approx(1000 * 0.040, rel=1e-7)
    assert flat["used_at"] == pytest.approx(0.040)
    assert {(round(r["z"] * 1e3, 6), r["side"]) for r in ext["candidates"]} >= {(40, "left"), (40, "right")}
    assert plain["extent"] is None and plain["used_at"] == pytest.approx(0.1) and plain["at_load_point"] is None
    assert "loads at z = 40 mm" in stdout and "its flat runs from 10 mm to 50 mm (placed by feature_from)" in stdout
    from compare.api import QuantityRecord
    q = QuantityRecord(res)  # what r.q gives in the Python API
    assert q.section_loads[0].used_at.to("mm").magnitude == pytest.approx(40.0)
    assert q.section_loads[0].extent.governing.z.to("mm").magnitude == pytest.approx(40.0)
    rows = (out / "results.csv").read_text()
    assert "section_loads[0].used_at" in rows and "section_loads[1].used_at" not in rows


def test_spline_engagement_over_a_load_point_takes_both_sides():
    spline = {"shape": "spline", "form": "straight", "splines": 6, "minor_diameter": 26, "major_diameter": 30,
              "width": 6, "fillet": 0.2, "length": 50}
    c = shaft_case([{"at": 200, "name": "splined hub", "section": spline}],
                   loads=[{"at": 60, "torque": "-40 N*m"}, {"at": 215, "force": [500, 0], "torque": "40 N*m"}])
    lay = solve_layout(c.shaft, c.section, c.material)
    cands = candidates(lay, c.shaft.stations[0])
    assert [(round(x["z"] * 1e3, 9), x["side"]) for x in cands] == [(175, None), (200, None), (215, "left"),
                                                                     (215, "right"), (225, None)]
    # statics: simply supported span A (20) to B (280) with 500 N at 215 mm: My = R_B·(280 − z) right of it
    RB = 500 * (215 - 20) / (280 - 20)
    res = {"fem": cands[4]["loads"]["My"], "exact": -RB * 0.055}  # internal My on the +z face (signs: shaft_beam)
    assert res["fem"] == pytest.approx(res["exact"], rel=1e-9)
    assert cands[2]["loads"]["T"] == pytest.approx(40.0) and cands[3]["loads"]["T"] == pytest.approx(0.0, abs=1e-9)
    assert cands[2]["parts"] == ["loads[1]"] and cands[1]["station"] and not cands[1]["parts"]

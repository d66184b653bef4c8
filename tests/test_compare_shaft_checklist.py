"""The designer's checklist on a layout: case keys (compare/case/shaft_checklist.py), the checks
(compare/checks/shaft_checklist.py) against hand-worked values of the published formulas, and the
outputs (results.json keys, summary lines, results.csv rows, the report's section)."""
import json
import math

import numpy as np
import pytest

from compare.api import Case, analyse
from compare.case.case import parse_case
from compare.checks.shaft_beam import solve_layout
from compare.checks.shaft_checklist import bearing_life, fit_check, key_checks, spline_check, torsional
from compare.output.report_checklist import checklist_html, checklist_rows, checklist_summary
from compare.output.results_checklist import checklist_warnings
from fem.errors import InputError

BASE = {"case": {"units": "mm-N-MPa"},
        "material": {"elastic_modulus": "205 GPa", "poisson": 0.29, "yield": 540, "ultimate": 760}}


def layout(**over):
    d = {"length": 300, "speed": "1000 rpm",
         "supports": [{"at": 50, "bearing": "deep_groove_ball", "dynamic_rating": "20 kN", "required_life": 10000},
                      {"at": 250, "bearing": "cylindrical_roller", "dynamic_rating": "30 kN"}],
         "segments": [{"from": 0, "to": 300, "diameter": 30}],
         "loads": [{"at": 150, "force": [0, -2000], "torque": "100 N*m", "inertia": 0.01},
                   {"at": 290, "torque": "-100 N*m", "inertia": 0.03}],
         "sections": [{"at": 150}]}
    d.update(over)
    return parse_case({**BASE, "shaft": d})


def station(**over):
    s = {"at": 150, "section": {"shape": "keyed", "diameter": 30,
                                "keyways": [{"width": 8, "depth": 4, "fillet": 0.25, "length": 40}]},
         "key": {"height": 7, "yield": 390, "hub_yield": 250, "design_factor": 2}}
    s.update(over)
    return s


# ----------------------------------------------------------------------------- case keys


def test_case_keys_in_si():
    c = layout(sections=[station(fit={"interference": 0.02, "hub_diameter": 60, "length": 40, "friction": 0.12,
                                      "hub_yield": 300, "kt_bending": 1.9, "kt_bending_source": "a chart (test)"})])
    a, b = c.shaft.supports
    assert a.rating.C == 20e3 and a.rating.element == "ball" and a.rating.required_life == 10000
    assert b.rating.element == "roller" and b.rating.X is None
    cl = c.shaft.stations[0].checklist
    assert cl.key.length == pytest.approx(0.040) and cl.key.length_from == "the keyway's length"
    kw = cl.key.keyways[0]
    y = 0.015 - math.sqrt(0.015**2 - 0.004**2)  # chordal height, ASME B17.1's Y
    assert kw.shaft_engagement == pytest.approx(0.004 - y) and kw.hub_engagement == pytest.approx(0.007 - 0.004 + y)
    assert cl.fit.interference == pytest.approx(2e-5) and cl.fit.hub_diameter == pytest.approx(0.060)
    assert c.shaft.stations[0].fatigue["kt_bending"] == 1.9  # the fit's chart factor becomes the station's Kt


def test_standard_keyway_gives_the_key_height():
    # ISO/R773 and DIN 6885-1: shafts over 22 up to 30 mm take an 8 x 7 key
    s = station(section={"shape": "keyed", "diameter": 30, "keyways": [{"standard": "metric", "length": 40}]},
                key={"yield": 390, "hub_yield": 250})
    kw = layout(sections=[s]).shaft.stations[0].checklist.key.keyways[0]
    assert kw.height == pytest.approx(0.007) and "6885" in kw.height_from


@pytest.mark.parametrize("sections, supports, field", [
    ([station(key={"yield": 390, "hub_yield": 250})], None, "shaft.sections[0].key.height"),
    ([station(key={"height": 7, "hub_yield": 250})], None, "shaft.sections[0].key.yield"),
    ([station(key={"height": 3, "yield": 390, "hub_yield": 250})], None, "shaft.sections[0].key.height"),
    ([station(key={"height": 7, "yield": 390, "hub_yield": 250, "colour": 1})], None, "shaft.sections[0].key.colour"),
    ([{"at": 150, "key": {"height": 7, "yield": 390, "hub_yield": 250}}], None, "shaft.sections[0].key"),
    ([{"at": 150, "fit": {"interference": 0.02, "hub_diameter": 25, "length": 40, "friction": 0.1}}], None,
     "shaft.sections[0].fit.hub_diameter"),
    ([{"at": 150, "fit": {"interference": 0.02, "hub_diameter": 60, "length": 40}}], None,
     "shaft.sections[0].fit.friction"),
    ([{"at": 150, "fit": {"interference": 0.02, "hub_diameter": 60, "length": 40, "friction": 0.1,
                          "hub_temperature_rise": 30}}], None, "shaft.sections[0].fit.hub_expansion"),
    ([{"at": 150, "fit": {"interference": 0.02, "hub_diameter": 60, "length": 40, "friction": 0.1,
                          "kt_bending": 2}}], None, "shaft.sections[0].fit.kt_bending_source"),
    ([{"at": 150, "spline": {"length": 20, "depth": 1}}], None, "shaft.sections[0].spline"),
    (None, [{"at": 50, "dynamic_rating": "20 kN"}, {"at": 250}], "shaft.supports[0].bearing"),
    (None, [{"at": 50, "bearing": "tapered_roller", "dynamic_rating": "20 kN", "x_factor": 0.4}, {"at": 250}],
     "shaft.supports[0].y_factor"),
    (None, [{"at": 50, "required_life": 100}, {"at": 250}], "shaft.supports[0].required_life"),
    (None, [{"at": 50, "bearing": "tapered_roller", "dynamic_rating": 0}, {"at": 250}],
     "shaft.supports[0].dynamic_rating"),
])
def test_refusals_name_the_field(sections, supports, field):
    over = {}
    if sections is not None:
        over["sections"] = sections
    if supports is not None:
        over["supports"] = supports
    with pytest.raises(InputError) as e:
        layout(**over)
    assert e.value.field == field


# ----------------------------------------------------------------------------- checks (no section FE needed)


def _srec(T):
    z = {"N": 0.0, "Vx": 0.0, "Vy": 0.0, "Mx": 0.0, "My": 0.0, "T": T}
    return {"loads": {"left": z, "right": z}, "diameter": 0.030, "bore": None}


def test_key_checks_hand_worked():
    # Shigley 9th ed., Sec. 7-7: τ = 2T/(d·w·L), σ = 2T/(d·t·L); the part at the station carries 100 N·m
    c = layout(sections=[station()])
    st = c.shaft.stations[0]
    (k,) = key_checks(0, st, _srec(100.0), st.checklist.key, c.shaft, 540e6, None)
    ts = st.checklist.key.keyways[0].shaft_engagement
    assert k["torque"] == pytest.approx(100.0) and "part" in k["torque_basis"]
    assert k["shear_stress"] == pytest.approx(2 * 100 / (0.030 * 0.008 * 0.040), rel=1e-12)
    assert k["bearing_stress_shaft"] == pytest.approx(2 * 100 / (0.030 * ts * 0.040), rel=1e-12)
    assert k["factors"]["shear"] == pytest.approx(0.577 * 390e6 / k["shear_stress"], rel=1e-12)
    assert k["factors"]["bearing_hub"] == pytest.approx(250e6 / k["bearing_stress_hub"], rel=1e-12)
    # at the required length each factor is the design factor
    for side, n in k["factors"].items():
        assert n * k["required_length"][side] / k["length"] == pytest.approx(2.0, rel=1e-12)


def test_two_keys_share_as_common_practice():
    kws = [{"width": 8, "depth": 4, "fillet": 0.25, "length": 40, "angle": 90},
           {"width": 8, "depth": 4, "fillet": 0.25, "length": 40, "angle": 270}]
    c = layout(sections=[station(section={"shape": "keyed", "diameter": 30, "keyways": kws})])
    st = c.shaft.stations[0]
    ks = key_checks(0, st, _srec(100.0), st.checklist.key, c.shaft, 540e6, None)
    assert len(ks) == 2 and all(k["torque_per_key"] == pytest.approx(100 / 1.5) for k in ks)


def test_bearing_life_from_the_reactions_hand_worked():
    # a 2 kN load midway between bearings 200 mm apart: 1 kN on each (statics); ISO 281 L10 = (C/P)^p
    c = layout()
    lay = solve_layout(c.shaft, c.section, c.material)
    a, b = bearing_life(c.shaft, lay)
    assert a["Fr"] == pytest.approx(1000.0, rel=1e-9) and b["Fr"] == pytest.approx(1000.0, rel=1e-9)
    assert a["L10_revolutions"] == pytest.approx(20.0**3 * 1e6, rel=1e-8)
    assert b["L10_revolutions"] == pytest.approx(30.0 ** (10 / 3) * 1e6, rel=1e-8)
    assert a["L10_hours"] == pytest.approx(8e9 / (1000 * 60), rel=1e-8) and a["ok"] is True
    assert "adjusted" in a["caution"]


def test_bearing_with_thrust_needs_x_and_y():
    c = layout(loads=[{"at": 150, "force": [0, -2000], "axial": 500, "torque": "100 N*m"},
                      {"at": 290, "torque": "-100 N*m"}])
    lay = solve_layout(c.shaft, c.section, c.material)
    a, b = bearing_life(c.shaft, lay)
    assert "skipped" in a and "x_factor" in a["skipped"] and "L10_revolutions" in b  # the locating bearing takes Fa
    c = layout(loads=[{"at": 150, "force": [0, -2000], "axial": 500, "torque": "100 N*m"},
                                  {"at": 290, "torque": "-100 N*m"}],
               supports=[{"at": 50, "bearing": "deep_groove_ball", "dynamic_rating": "20 kN", "x_factor": 0.56,
                          "y_factor": 1.6}, {"at": 250}])
    (a,) = bearing_life(c.shaft, solve_layout(c.shaft, c.section, c.material))
    assert a["P"] == pytest.approx(0.56 * 1000 + 1.6 * 500, rel=1e-8)


def test_fit_check_hand_worked():
    # Shigley 9th ed., eq. (3-57), one material, solid shaft: p = E·δ(ro² − R²)/(2R·ro²), δ radial
    c = layout(sections=[{"at": 150, "fit": {"interference": 0.03, "hub_diameter": 60, "length": 40,
                                             "friction": 0.12, "hub_yield": 300}}])
    st = c.shaft.stations[0]
    f = fit_check(0, st, _srec(100.0), st.checklist.fit, c)
    R, ro, d = 0.015, 0.030, 15e-6
    p = 205e9 * d * (ro**2 - R**2) / (2 * R * ro**2)
    assert {"fem": f["contact_pressure"], "exact": p} == pytest.approx({"fem": p, "exact": p}, rel=1e-12)
    assert f["torque_capacity"] == pytest.approx(2 * math.pi * 0.12 * p * R**2 * 0.040, rel=1e-12)
    assert f["slip_factor_torque"] == pytest.approx(f["torque_capacity"] / 100.0)
    codes = [w["code"] for w in checklist_warnings({"keys": [], "splines": [], "press_fits": [f], "bearing_life": [],
                                                    "torsional": {}})]
    assert codes == ["fit_fretting"]  # the caution on fretting is always given


def test_fit_lost_to_temperature():
    c = layout(sections=[{"at": 150, "fit": {"interference": 0.01, "hub_diameter": 60, "length": 40,
                                             "friction": 0.12, "hub_expansion": 23e-6, "hub_temperature_rise": 40}}])
    st = c.shaft.stations[0]
    f = fit_check(0, st, _srec(100.0), st.checklist.fit, c)
    assert f["fit_lost"] and f["contact_pressure"] == 0 and f["torque_capacity"] == 0


def test_torsional_two_discs_on_a_massless_shaft():
    # Den Hartog, Mechanical Vibrations, 4th ed. (1956): ω² = k(J1 + J2)/(J1·J2), k = GJ/L; and the
    # twist between the parts θ = T·L/(GJ) (Shigley 9th ed., eq. (3-35)), round bars (no FE stations)
    c = layout()
    lay = solve_layout(c.shaft, c.section, c.material)
    tor = torsional(c.shaft, c, lay, [], [])
    G = c.material.shear_modulus
    J = math.pi * 0.030**4 / 32
    k = G * J / 0.140
    exact = math.sqrt(k * (0.01 + 0.03) / (0.01 * 0.03))
    w = tor["frequencies"]["values"]
    assert len(w) == 1 and {"fem": w[0], "exact": exact} == pytest.approx({"fem": exact, "exact": exact}, rel=1e-9)
    (bt,) = tor["between"]
    assert bt["angle"]["fe"] == pytest.approx(-100 * 0.140 / (G * J), rel=1e-9)  # T on the +z face is −100 N·m
    assert bt["angle"]["classic"] == pytest.approx(bt["angle"]["fe"], rel=1e-12)  # no FE section: the same
    assert tor["frequencies"]["ok"] is True and tor["frequencies"]["ratios"][0] == pytest.approx(exact / (1000 * math.pi / 30))


# ----------------------------------------------------------------------------- whole run


@pytest.fixture(scope="module")
def small_run(tmp_path_factory):
    d = {**BASE, "analysis": {"accuracy": "5 %"},
         "shaft": {"length": 300, "speed": "1000 rpm", "density": 7850,
                   "supports": [{"at": 50, "bearing": "deep_groove_ball", "dynamic_rating": "20 kN",
                                 "required_life": 10000}, {"at": 250}],
                   "segments": [{"from": 0, "to": 300, "diameter": 30}],
                   "loads": [{"at": 150, "force": [0, -2000], "torque": "100 N*m", "inertia": 0.01},
                             {"at": 290, "torque": "-100 N*m", "inertia": 0.03}],
                   "sections": [{"at": 150, "fit": {"interference": 0.03, "hub_diameter": 60, "length": 40,
                                                    "friction": 0.12, "hub_yield": 300}}]}}
    r = analyse(Case.from_dict(d))
    out = tmp_path_factory.mktemp("run")
    r.save(out, vtu=False, report=True)
    return r, out


def test_results_summary_csv_and_report_carry_the_checklist(small_run):
    r, out = small_run
    res = json.loads((out / "results.json").read_text())
    assert set(res["shaft"]["bearing_life"][0]) >= {"L10_revolutions", "L10_hours", "C", "P", "caution"}
    assert res["press_fits"][0]["contact_pressure"] > 0 and res["keys"] == [] and res["splines"] == []
    fr = res["shaft"]["torsional"]["frequencies"]
    assert fr["values"][0] > 0 and "speed" in fr
    assert any(w["code"] == "fit_fretting" for w in res["warnings"])
    csv = (out / "results.csv").read_text()
    assert "press fit" in csv and "basic rating life L10" in csv and "first torsional natural frequency" in csv
    assert "Keys, fits, splines, bearings and torsion along the shaft" in (out / "report.html").read_text()
    text = checklist_summary(res, r.analysis.case.units)
    assert "press fit" in text and "L10" in text and "torsional natural frequencies" in text
    assert checklist_rows(res, r.analysis.case.units) and "<li>" in checklist_html(res, r.analysis.case.units)
    assert np.isfinite(res["shaft"]["torsional"]["between"][0]["angle"]["fe"])


def test_api_quantities_of_the_checklist(small_run):
    r, _ = small_run
    assert r.q.press_fits[0].contact_pressure.to("MPa").magnitude == pytest.approx(
        r.press_fits[0]["contact_pressure"] / 1e6)
    assert str(r.q.shaft.bearing_life[0].L10_hours.units) == "hour"
    assert r.q.shaft.torsional.frequencies.values.to("rpm").magnitude[0] == pytest.approx(
        r.shaft["torsional"]["frequencies"]["values"][0] * 30 / math.pi)


def test_spline_check_hand_worked():
    # from memory (Dudley, Gear Handbook, 1962): τ = 2T/(d_p·z·t·L), p = 2T/(d_p·z·h·L); involute spline
    # module 1.25, 24 teeth: d_p = m·z = 30 mm, basic tooth thickness half the circular pitch
    sec = {"shape": "spline", "form": "involute", "module": 1.25, "teeth": 24, "pressure_angle": 30, "root": "flat"}
    c = layout(segments=[{"from": 0, "to": 300, "diameter": 31.25}],
               sections=[{"at": 150, "section": sec, "spline": {"length": 20, "depth": 1.0}}])
    st = c.shaft.stations[0]
    s = spline_check(0, st, _srec(100.0), st.checklist.spline, c.shaft, 540e6)
    t = math.pi * 1.25e-3 / 2
    assert s["pitch_diameter"] == pytest.approx(0.030) and s["tooth_thickness"] == pytest.approx(t)
    assert s["shear_stress"] == pytest.approx(2 * 100 / (0.030 * 24 * t * 0.020), rel=1e-12)
    assert s["bearing_pressure"] == pytest.approx(2 * 100 / (0.030 * 24 * 0.001 * 0.020), rel=1e-12)
    assert s["from_memory"] and s["bearing_factor"] is None
    codes = [w["code"] for w in checklist_warnings({"keys": [], "splines": [s], "press_fits": [], "bearing_life": [],
                                                    "torsional": {}})]
    assert codes == ["spline_standard_governs"]


def test_failures_are_warned():
    # a key of soft material (n < 1), a small bearing below its required life, and an operating speed at
    # the two-disc torsional frequency (Den Hartog, 4th ed.: ω² = k(J1 + J2)/(J1·J2))
    G = 205e9 / (2 * 1.29)
    k = G * math.pi * 0.030**4 / 32 / 0.140
    w = math.sqrt(k * 0.04 / 0.0003)
    c = layout(speed=f"{w} rad/s",
               supports=[{"at": 50, "bearing": "deep_groove_ball", "dynamic_rating": "2 kN", "required_life": 1e6},
                         {"at": 250}],
               sections=[station(key={"height": 7, "yield": 5, "hub_yield": 250, "design_factor": 2})])
    st = c.shaft.stations[0]
    lay = solve_layout(c.shaft, c.section, c.material)
    cl = {"keys": key_checks(0, st, _srec(100.0), st.checklist.key, c.shaft, 540e6, None), "splines": [],
          "press_fits": [], "bearing_life": bearing_life(c.shaft, lay), "torsional": torsional(c.shaft, c, lay, [], [])}
    codes = {x["code"] for x in checklist_warnings(cl, c.units)}
    assert {"key_overloaded", "bearing_life_short", "torsional_resonance"} <= codes
    assert cl["keys"][0]["factor"] < 1 and cl["bearing_life"][0]["ok"] is False
    assert cl["torsional"]["frequencies"]["ratios"][0] == pytest.approx(1.0, rel=1e-9)


def test_near_coincident_points_do_not_upset_the_torsion_model():
    # a station 1e-7 of the length beside a part would make a tiny element: the nodes are merged, and
    # the two-disc frequency (Den Hartog, 4th ed.) still holds to the merge's share
    c = layout(sections=[{"at": 150}, {"at": 290 - 3e-5}])
    lay = solve_layout(c.shaft, c.section, c.material)
    tor = torsional(c.shaft, c, lay, [], [])
    G = c.material.shear_modulus
    k = G * math.pi * 0.030**4 / 32 / 0.140
    exact = math.sqrt(k * (0.01 + 0.03) / (0.01 * 0.03))
    assert tor["frequencies"]["values"][0] == pytest.approx(exact, rel=1e-5)


def test_api_reads_the_key_list_by_item(small_run):
    r, _ = small_run
    assert r["keys"] == [] and callable(r.keys)  # r.keys is the mapping's method; the list is r["keys"]


# ----------------------------------------------------------------------------- random values in the new fields

hypothesis = pytest.importorskip("hypothesis")
from hypothesis import HealthCheck, given, settings  # noqa: E402
from hypothesis import strategies as hst  # noqa: E402

_VALUES = hst.one_of(
    hst.integers(min_value=-10**6, max_value=10**6), hst.floats(allow_nan=True, allow_infinity=True), hst.booleans(),
    hst.text(max_size=8), hst.sampled_from(["25 mm", "-3 mm", "20 kN", "0 N", "1e400 N", "nan", "300 MPa", "12 %"]),
    hst.lists(hst.integers(min_value=-5, max_value=5), max_size=2), hst.dictionaries(hst.text(max_size=4), hst.integers(), max_size=2))
_KEY = ["height", "length", "yield", "hub_yield", "design_factor", "junk"]
_FIT = ["interference", "hub_diameter", "length", "friction", "hub_elastic_modulus", "hub_poisson", "hub_yield",
        "shaft_expansion", "hub_expansion", "shaft_temperature_rise", "hub_temperature_rise", "kt_bending",
        "kt_bending_source"]
_SUP = ["dynamic_rating", "x_factor", "y_factor", "required_life", "bearing"]


@settings(max_examples=80, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(hst.sampled_from(["key", "fit", "support"]), hst.data())
def test_random_values_are_refused_in_one_field_or_checked_without_error(where, data):
    # the input promise: a bad value is an InputError naming a field; an accepted one runs every check
    key = {"height": 7, "length": 36, "yield": 390, "hub_yield": 250, "design_factor": 2}
    fit = {"interference": 0.02, "hub_diameter": 60, "length": 40, "friction": 0.12}
    sup = {"at": 50, "bearing": "deep_groove_ball", "dynamic_rating": "20 kN"}
    target = {"key": (key, _KEY), "fit": (fit, _FIT), "support": (sup, _SUP)}[where]
    for name in data.draw(hst.lists(hst.sampled_from(target[1]), min_size=1, max_size=3)):
        target[0][name] = data.draw(_VALUES)
    try:
        c = layout(sections=[station(key=key, fit=fit)], supports=[sup, {"at": 250}])
    except InputError as e:
        assert e.field.startswith(("shaft.sections[0]", "shaft.supports[0]")) and "\n" not in str(e)
        return
    st = c.shaft.stations[0]
    lay = solve_layout(c.shaft, c.section, c.material)
    key_checks(0, st, _srec(100.0), st.checklist.key, c.shaft, 540e6, None)
    fit_check(0, st, _srec(100.0), st.checklist.fit, c)
    bearing_life(c.shaft, lay)
    torsional(c.shaft, c, lay, [], [])


def test_key_design_factor_defaults_to_the_cases():
    c = parse_case({**BASE, "analysis": {"design_factor": 3}, "shaft": {
        "length": 300, "supports": [{"at": 50}, {"at": 250}], "segments": [{"from": 0, "to": 300, "diameter": 30}],
        "loads": [{"at": 150, "torque": "100 N*m"}, {"at": 290, "torque": "-100 N*m"}],
        "sections": [station(key={"height": 7, "yield": 390, "hub_yield": 250})]}})
    st = c.shaft.stations[0]
    (k,) = key_checks(0, st, _srec(100.0), st.checklist.key, c.shaft, 540e6, c.analysis.design_factor)
    assert k["design_factor"] == 3 and min(k["factors"].values()) * k["required_length"]["governing"] / k["length"] == \
        pytest.approx(3.0, rel=1e-12)

"""The whole-shaft step (compare/checks/shaft_beam.py, shaft_stations.py) against textbook beam
cases, gear relations and exact critical speeds. Exact-solution results stored as {"fem", "exact"}."""
import json
import math

import pytest

from classic.shear import energy_round
from compare.case.case import parse_case
from compare.checks.shaft_beam import G_STANDARD, part_actions, solve_layout
from compare.checks.shaft_stations import station_loads

E, NU = 205e9, 0.29
G = E / (2 * (1 + NU))
D = 0.04
A, I = math.pi * D**2 / 4, math.pi * D**4 / 64
KGA = energy_round(NU) * G * A


def layout(**shaft):
    d = {"case": {"units": "m-N-Pa"}, "material": {"elastic_modulus": E, "poisson": NU},
         "shaft": {"length": 1.0, "supports": [{"at": 0}, {"at": 1.0}], "sections": [{"at": 0.5}],
                   "segments": [{"from": 0, "to": 1.0, "diameter": D}]}}
    d["shaft"].update(shaft)
    c = parse_case(d)
    return c, solve_layout(c.shaft, c.section, c.material)


def test_two_plane_point_load_roark_and_vector_sum():
    # Roark's Formulas for Stress and Strain, 7th ed., Table 8.1, case 1e, in each plane; the shear
    # deflection P·a·b/(L·κGA) of the Timoshenko beam added (unit-load method)
    a, b = 0.3, 0.7
    Fx, Fy = 400.0, -900.0
    c, r = layout(loads=[{"at": a, "force": [Fx, Fy]}])
    P = math.hypot(Fx, Fy)
    R1, R2 = r["reactions"]
    res = {"R1": {"fem": R1["F"], "exact": P * b}, "R2": {"fem": R2["F"], "exact": P * a},
           "M_max": {"fem": r["diagrams"]["max_moment"]["value"], "exact": P * a * b},
           "y": {"fem": math.hypot(r["plane_x"].w[_node(r, a)], r["plane_y"].w[_node(r, a)]),
                 "exact": P * a**2 * b**2 / (3 * E * I) + P * a * b / KGA}}
    for k, v in res.items():
        assert v["fem"] == pytest.approx(v["exact"], rel=1e-9), k
    assert R1["Fx"] == pytest.approx(-Fx * b) and R1["Fy"] == pytest.approx(-Fy * b)
    assert r["equilibrium_residual"]["force"] < 1e-10 and r["equilibrium_residual"]["moment"] < 1e-10  # round-off


def _node(r, z):
    return int(abs(r["z"] - z).argmin())


def test_overhung_pulley_shigley_a9_10():
    # Shigley's Mechanical Engineering Design, 9th ed., Table A-9, beam 10: R1 = −F a/L,
    # R2 = F (L + a)/L, y = F a² (L + a)/(3EI); plus the shear deflection F a (L + a)/(L κGA)
    Ls, a = 0.8, 0.2
    c, r = layout(length=Ls + a, supports=[{"at": 0}, {"at": Ls}], sections=[{"at": Ls}],
                  segments=[{"from": 0, "to": Ls + a, "diameter": D}],
                  loads=[{"at": Ls + a, "kind": "pulley", "torque": 100.0, "diameter": 0.2, "tension_ratio": 3,
                          "pull_angle": 90},
                         {"at": 0.4, "torque": -100.0}])
    F = 4 * 100.0 / 0.2  # (r + 1)/(r − 1)·2T/D = 2·1000 N
    R1, R2 = r["reactions"]
    res = {"R1": {"fem": R1["Fy"], "exact": F * a / Ls}, "R2": {"fem": R2["Fy"], "exact": -F * (Ls + a) / Ls},
           "y": {"fem": r["plane_y"].w[-1], "exact": F * a**2 * (Ls + a) / (3 * E * I) + F * a * (Ls + a) / (Ls * KGA)}}
    for k, v in res.items():
        assert v["fem"] == pytest.approx(v["exact"], rel=1e-9), k


def test_three_supports_two_equal_spans_uniform_load():
    # continuous beam, two equal spans, uniform load: end reactions 3wl/8, middle 10wl/8 (AISC Steel
    # Construction Manual, 13th ed., Table 3-23; three-moment equation, Timoshenko, Strength of
    # Materials, Part I, 3rd ed., Art. 45). These are Euler–Bernoulli values: the Timoshenko beam's
    # shear deformation moves them by about (d/l)²; with d/l = 0.02 that is below 1e-3.
    rho, l = 7850.0, 1.0
    c, r = layout(length=2 * l, density=rho, supports=[{"at": 0}, {"at": l}, {"at": 2 * l}],
                  segments=[{"from": 0, "to": 2 * l, "diameter": D / 2}], sections=[{"at": l}])
    w = rho * math.pi * (D / 2) ** 2 / 4 * G_STANDARD
    ends, mid = r["reactions"][0]["Fy"], r["reactions"][1]["Fy"]
    res = {"end": {"fem": ends, "exact": 3 * w * l / 8}, "middle": {"fem": mid, "exact": 10 * w * l / 8}}
    for k, v in res.items():
        assert v["fem"] == pytest.approx(v["exact"], rel=1e-3), k
    assert r["reactions"][2]["Fy"] == pytest.approx(ends, rel=1e-9)


def test_gear_forces_in_the_layout():
    # Shigley 9th ed., eq. (13-40): Wt = 2T/d, Wr = Wt tan φn / cos ψ, Wa = Wt tan ψ; the mesh point
    # at +y: Wt along −x for torque put in (r × F = +T), Wr toward the axis (−y); right hand: thrust −Wt tan ψ
    c, r = layout(loads=[{"at": 0.3, "kind": "gear", "torque": 200.0, "pitch_diameter": 0.1, "pressure_angle": 20,
                          "helix_angle": 20, "hand": "right", "mesh_angle": 90},
                         {"at": 0.7, "torque": -200.0}])
    p = part_actions(c.shaft)[0]
    Wt = 2 * 200.0 / 0.1
    assert p.Fx == pytest.approx(-Wt)
    assert p.Fy == pytest.approx(-Wt * math.tan(math.radians(20)) / math.cos(math.radians(20)))
    assert p.Fz == pytest.approx(-Wt * math.tan(math.radians(20)))
    assert p.Mx == pytest.approx(0.05 * p.Fz) and abs(p.My) < 1e-12
    assert 0.05 * (-p.Fx) == pytest.approx(200.0)  # the tangential force carries the torque
    # the thrust goes to the left-most (locating) bearing; the diagram's axial force is −Fz left of the gear
    assert r["reactions"][0]["Fz"] == pytest.approx(-p.Fz)
    lefty = r["diagrams"]["columns"]
    i = max(k for k, x in enumerate(lefty["x"]) if x < 0.3)
    assert lefty["N"][i] == pytest.approx(p.Fz) and lefty["T"][i] == 0.0
    j = min(k for k, x in enumerate(lefty["x"]) if x > 0.3)
    assert lefty["T"][j] == pytest.approx(-200.0)


def test_single_central_mass_rayleigh_exact():
    # one mass on a massless shaft: Rayleigh's estimate (Shigley 9th ed., eq. 7-23) is exact,
    # ω = √(k/m) with k = 1/(L³/(48EI) + L/(4κGA)); the beam eigenvalue must agree
    m = 20.0
    c, r = layout(loads=[{"at": 0.5, "mass": m}], speed="3000 rpm")
    k = 1 / (1 / (48 * E * I) + 1 / (4 * KGA))
    cs = r["critical_speeds"]
    res = {"rayleigh": {"fem": cs["rayleigh"], "exact": math.sqrt(k / m)},
           "beam": {"fem": cs["values"][0], "exact": math.sqrt(k / m)}}
    for key, v in res.items():
        assert v["fem"] == pytest.approx(v["exact"], rel=1e-9), key
    assert cs["speed"] == pytest.approx(100 * math.pi) and cs["ok"] == (cs["values"][0] >= 2 * 100 * math.pi)


def test_uniform_shaft_first_critical_speed():
    # (π/L)²·√(EI/(ρA)) (Euler–Bernoulli, exact; Shigley 9th ed., eq. 7-22). The layout's beam adds
    # shear and rotary inertia, which lower it by about (π r/L)²(1 + E/κG)/2 ≈ 5e-4 at L/d = 25.
    rho = 7850.0
    c, r = layout(density=rho, self_weight=False)
    exact = math.pi**2 * math.sqrt(E * I / (rho * A))
    res = {"fem": r["critical_speeds"]["values"][0], "exact": exact}
    assert res["fem"] == pytest.approx(res["exact"], rel=2e-3)
    assert res["fem"] < res["exact"]


def test_station_at_a_jump_uses_the_larger_side():
    c, r = layout(loads=[{"at": 0.5, "kind": "point", "force": [0, -1000], "torque": 50.0},
                         {"at": 0.9, "torque": -50.0}])
    st = c.shaft.stations[0]
    sl = station_loads(r, st, D)
    assert sl["jump"] and sl["left"]["T"] == 0.0 and sl["right"]["T"] == pytest.approx(-50.0)
    assert sl["used"] is sl["right"]  # same moment on both sides; the torque makes the right side larger
    assert sl["left"]["Mx"] == pytest.approx(sl["right"]["Mx"]) == pytest.approx(-250.0)


def test_torque_that_does_not_balance_is_an_input_error():
    from fem.errors import InputError
    with pytest.raises(InputError) as e:
        layout(loads=[{"at": 0.3, "torque": 10.0}])
    assert e.value.field == "shaft.loads[*].torque"


def test_run_small_layout(tmp_path, run_cli):
    case = tmp_path / "layout.toml"
    case.write_text("""
[case]
title = "small layout"
units = "mm-N-MPa"
[material]
elastic_modulus = "205 GPa"
poisson = 0.29
yield = 500
ultimate = 700
[analysis]
accuracy = "1 %"
[shaft]
length = 300
rotating = true
speed = "1000 rpm"
density = 7850
self_weight = false
supports = [{ at = 0 }, { at = 300 }]
[[shaft.segments]]
from = 0
to = 300
diameter = 30
[[shaft.loads]]
at = 100
kind = "gear"
torque = "-60 N*m"
pitch_diameter = 100
pressure_angle = 20
mesh_angle = 0
mass = 2
[[shaft.loads]]
at = 200
torque = "60 N*m"
[[shaft.sections]]
at = 100
name = "gear seat"
""")
    out = tmp_path / "out"
    code, stdout, err = run_cli("run", str(case), "--out", str(out), "--no-vtu")
    assert code == 0, err
    res = json.loads((out / "results.json").read_text())
    assert res["exit_code"] == 0  # present when 0 too (docs/outputs.md, results.json keys)
    sh, sl = res["shaft"], res["section_loads"]
    assert len(sl) == 1 and sl[0]["at"] == pytest.approx(0.1)
    Wt = 1200.0  # 2T/d
    # gear at 1/3 of the span: the moment there is the vector sum of the two planes' P·a·b/L
    P = math.hypot(Wt, Wt * math.tan(math.radians(20)))
    M = math.hypot(sl[0]["Mx"], sl[0]["My"])
    assert M == pytest.approx(P * 0.1 * 0.2 / 0.3, rel=1e-9)  # Roark Table 8.1, case 1e, in both planes
    assert sl[0]["results"]["governing"]["factor"] > 0
    assert set(sh["diagrams"]) >= {"x", "Vx", "Vy", "Mx", "My", "M", "T", "N", "slope_x", "slope_y",
                                   "deflection_x", "deflection_y"}
    assert sh["critical_speeds"]["values"] == sorted(sh["critical_speeds"]["values"])
    assert "Shaft layout" in stdout and "gear seat" in stdout
    svg = (out / "shaft.svg").read_text()
    assert svg.lstrip().startswith("<?xml") and "</svg>" in svg  # the diagrams with the stations marked


def test_api_reads_layout_results_with_units(tmp_path):
    from compare import Case, analyse
    case = tmp_path / "api.toml"
    case.write_text("""
[case]
units = "mm-N-MPa"
[material]
elastic_modulus = "205 GPa"
poisson = 0.29
[analysis]
accuracy = "1 %"
[shaft]
length = 200
supports = [{ at = 0 }, { at = 200 }]
[[shaft.segments]]
from = 0
to = 200
diameter = 25
[[shaft.loads]]
at = 100
force = [0, -1000]
[[shaft.sections]]
at = 50
""")
    r = analyse(Case.load(case))
    # Roark Table 8.1, case 1e at mid-span with the shear deflection P·L/(4κGA) added
    E, G = 205e9, 205e9 / 2.58
    Ir, Ar = math.pi * 0.025**4 / 64, math.pi * 0.025**2 / 4
    exact = 1000 * 0.2**3 / (48 * E * Ir) + 1000 * 0.2 / (4 * energy_round(0.29) * G * Ar)
    res = {"fem": r.q.shaft.max_deflection.value.to("mm").magnitude, "exact": exact * 1e3}
    assert res["fem"] == pytest.approx(res["exact"], rel=1e-9)
    assert r.section_loads[0]["Mx"] == pytest.approx(-25.0)  # R1·a = 500 N × 0.05 m, sagging
    out = r.save(tmp_path / "out", vtu=False, report=False)
    assert sorted(p.name for p in out.iterdir()) == ["results.json", "shaft.svg"]


@pytest.mark.parametrize("offset", [1e-10, 1e-8])
def test_a_station_a_hair_from_a_load_shares_its_node(offset):
    """A station 1e-10 of the length from a load was refused as 'supports leave the shaft free to move': the
    element between them made the stiffness ill-conditioned. Points closer than NODE_MERGE of the length now
    share a node; the reactions are still the statics of the simply supported beam (Roark's Formulas for
    Stress and Strain, 7th ed., Table 8.1, case 1e)."""
    a, P = 0.3, 1000.0
    c, r = layout(loads=[{"at": a, "force": [0.0, -P]}], sections=[{"at": a + offset}])
    R1, R2 = r["reactions"]
    res = {"R1": {"fem": R1["Fy"], "exact": P * (1 - a)}, "R2": {"fem": R2["Fy"], "exact": P * a}}
    for k, v in res.items():
        assert v["fem"] == pytest.approx(v["exact"], rel=1e-9), k

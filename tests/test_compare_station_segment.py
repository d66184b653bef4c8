"""A layout station with a 3-D feature (``segment`` table of a [[shaft.sections]] station), through the
command line in-process: results keys, the hand path (the 3-D Kt and Kts as the station's factors),
the FE path (the superposed local stresses), the verdict withheld while the 3-D study misses its
target, and the figure in the layout report. Also the [segment] case's own report and figure.

Outside checks: (1) Shigley's shaft equations (Mechanical Engineering Design, 9th ed., eqs. 7-7 and 6-32)
on the nominal stresses: the hand path must use Kt = the larger 3-D bending factor and Kts = the 3-D
torsion factor, so its alternating von Mises stress is Kf·32M/(πd³) with Kf = 1 + q(Kt − 1), recomputed
here from the station's loads; (2) on a rotating shaft the bending stress at a point is
cos ψ·A + sin ψ·B (bending fixed in space; the section turns), so its von Mises amplitude lies between
M·max(vm_x, vm_y) and M·√(vm_x² + vm_y²), vm_x and vm_y the unit-moment von Mises stresses there
(the values at ψ = 0 and 90°, and the triangle inequality; exact).
"""
import json
import math

import pytest

from compare.cli.main import main
from compare.case.case import load_case

LAYOUT = """[case]
title = "test: a cross-drilled shaft on two bearings"
units = "mm-N-MPa"

[material]
elastic_modulus = "205 GPa"
poisson = 0.29
yield = 540
ultimate = 760
surface = "machined"

[analysis]
accuracy = "25 %"

[shaft]
length = 240
speed = "600 rpm"
rotating = true
supports = [{ at = 20, name = "A" }, { at = 220, name = "B" }]

[[shaft.segments]]
from = 0
to = 240
diameter = 24

[[shaft.loads]]
at = 120
name = "pulley"
force = [0, -1500]
torque = 40

[[shaft.loads]]
at = 230
name = "coupling"
torque = -40

[[shaft.sections]]
at = 150
name = "lubrication hole"
segment = { kind = "cross_hole", hole_diameter = 4, angle = 30, fineness = 0.3 }
"""


@pytest.fixture(scope="module")
def layout_run(tmp_path_factory):
    d = tmp_path_factory.mktemp("station_segment")
    case = d / "case.toml"
    case.write_text(LAYOUT)
    code = main(["run", str(case), "--out", str(d / "out")])
    res = json.loads((d / "out" / "results.json").read_text())
    return code, res, d / "out", case


@pytest.mark.slow
def test_results_keys_and_exit_code(layout_run):
    code, res, out, _ = layout_run
    (seg,) = res["segments"]
    assert seg["station"] == 0 and seg["kind"] == "cross_hole" and seg["field"] == "shaft.sections[0].segment"
    assert seg["centre"] == pytest.approx(0.15) and seg["angle_deg"] == 30.0 and seg["diameter"] == pytest.approx(0.024)
    # a through hole centred in its model is mirror symmetric about two planes, but a cross hole keeps
    # the whole model by default (its quarter model's meshes were hardly refined at the hole)
    assert seg["model"] == "whole"
    for k in ("kt_axial", "kt_bending_x", "kt_bending_y", "kts"):
        assert seg[k] > 1.0, k  # a hole raises the stress under every load (Peterson's charts: Kt > 1)
        assert f"{k}_gci" in seg and len(seg["peak_location"][k]["at"]) == 3
        x, y, z = seg["peak_location"][k]["at"]
        xs, ys, zs = seg["peak_location"][k]["at_on_shaft"]
        assert math.hypot(xs, ys) == pytest.approx(math.hypot(x, y), rel=1e-12)  # turned about the axis only
        assert zs - seg["centre"] == pytest.approx(z - seg["length"] / 2, abs=1e-12)
    assert len(seg["dofs"]) == 3 and seg["dofs"][0] < seg["dofs"][1] < seg["dofs"][2]
    gcis = [seg[f"{k}_gci"] for k in ("kt_axial", "kt_bending_x", "kt_bending_y", "kts")]
    met = all(g is not None for g in gcis) and max(gcis) <= 0.25 and seg["limited_by"] is None
    assert seg["met"] == met
    st = res["section_loads"][0]
    assert st["fe_path"] == "segment" and st["segment"]["kind"] == "cross_hole"
    gov = st["results"]["governing"]
    assert code == res["exit_code"]
    if met:
        assert not any(w["code"] == "station_segment_accuracy_not_met" for w in res["warnings"])
        assert not gov.get("no_verdict")
    else:  # no verdict, said first
        assert code == res["exit_code"] == 3
        assert res["warnings"][0]["code"] == "station_segment_accuracy_not_met"
        assert "ACCURACY TARGET NOT SHOWN" in res["warnings"][0]["text"]
        assert gov["no_verdict"] and gov["factor"] is None and gov["away_from_corners"]["factor"] > 0
        assert st["results"]["warnings"][0]["code"] == "segment_station_accuracy_not_met"


@pytest.mark.slow
def test_hand_path_uses_the_3d_factors(layout_run):
    """Shigley 9th ed., eqs. 6-32 and 7-7: σa' = Kf·32M/(πd³) with Kf = 1 + q(Kt − 1), Kt the 3-D one."""
    _, res, _, _ = layout_run
    seg = res["segments"][0]
    hand = res["section_loads"][0]["results"]["fatigue"]["hand"]
    assert hand["Kt"] == pytest.approx(max(seg["kt_bending_x"], seg["kt_bending_y"]), rel=1e-12)
    assert hand["Kts"] == pytest.approx(seg["kts"], rel=1e-12)
    assert "3-D FE, this run" in hand["Kt_source"] and "3-D FE, this run" in hand["Kts_source"]
    assert hand["notch_radius"] == pytest.approx(0.002)  # the hole's radius
    st = res["section_loads"][0]
    M = math.hypot(st["Mx"], st["My"])
    d = 0.024
    Kf = 1 + hand["q"] * (hand["Kt"] - 1)
    check = {"fem": hand["sigma_a_vm"], "exact": Kf * 32 * M / (math.pi * d**3)}
    assert check["fem"] == pytest.approx(check["exact"], rel=1e-9)


@pytest.mark.slow
def test_fe_path_is_the_superposed_3d_stress(layout_run, tmp_path):
    """The FE path's numbers are the 3-D superposition's: von Mises factor = Sy / peak von Mises, and the
    alternating peak bracketed by the unit-moment von Mises stresses (module docstring, (2))."""
    import numpy as np

    from compare.pairs.station_segment import station_segments_step
    from compare.solve.segment_superpose import von_mises

    _, res, _, case_path = layout_run
    r = res["section_loads"][0]["results"]
    local = r["static"]["fe_local"]
    assert local["source"].startswith("3-D FE")
    s = local["summary"]
    assert r["static"]["von_mises"] == pytest.approx(540e6 / s["von_mises_peak"], rel=1e-12)
    assert s["rotating"] and s["angles_per_turn"] == 720
    # rebuild the unit fields (same meshes: the same machine, the same run settings) and bracket σa'
    case = load_case(case_path)
    station_segments_step(case)
    fl = case.shaft.stations[0].kt["segment_stresses"][0]["fields"]
    M = math.hypot(local["loads"]["Mx"], local["loads"]["My"])
    k = fl.keep
    vx, vy = von_mises(fl.S[1][..., k]), von_mises(fl.S[2][..., k])
    lo, hi = M * np.max(np.maximum(vx, vy)), M * np.max(np.hypot(vx, vy))
    assert lo * (1 - 1e-9) <= s["alternating_peak"] <= hi * (1 + 1e-9)
    assert r["fatigue"]["fe_local"]["field"] == "shaft.sections[0].segment"
    # the mean tensor is T·S_T (steady torque, no axial force here), so its von Mises stress is |T| times
    # the unit torque's at that point, at most |T|·max vm(S_T) (exact)
    T = local["loads"]["T"]
    assert abs(T) > 0
    vt = von_mises(fl.S[3][..., k])
    assert s["alternating_peak_mean"] <= abs(T) * np.max(vt) * (1 + 1e-9)
    assert s["sigma_m_vm"] <= abs(T) * np.max(vt) * (1 + 1e-9)


@pytest.mark.slow
def test_layout_report_has_the_surface_figure(layout_run):
    _, _, out, _ = layout_run
    html = (out / "report.html").read_text()
    assert (out / "figures" / "station1_segment_surface.png").stat().st_size > 1000
    assert "station1_segment_surface" in html and "3-D segment FE at the feature" in html
    assert "<h3>3-D feature</h3>" in html and "Kt bending" in html and "whole model" in html


SEGMENT = """[case]
title = "test: a cross hole in 3-D"
units = "mm-N-MPa"

[segment]
kind = "cross_hole"
diameter = 24
hole_diameter = 4

[material]
poisson = 0.29

[analysis]
fineness = 0.3
accuracy = "25 %"
"""


@pytest.mark.slow
def test_segment_case_report_has_the_surface_figure(tmp_path, capsys):
    case = tmp_path / "seg.toml"
    case.write_text(SEGMENT)
    code = main(["run", str(case), "--out", str(tmp_path / "out"), "--no-vtu"])
    capsys.readouterr()
    res = json.loads((tmp_path / "out" / "results.json").read_text())
    assert code == res["exit_code"] in (0, 3)
    html = (tmp_path / "out" / "report.html").read_text()
    assert (tmp_path / "out" / "figures" / "segment_surface.svg").exists()
    assert "segment_surface" in html and "Stress on the surface near the feature" in html
    if not res["accuracy"]["met"]:
        assert "ACCURACY TARGET NOT SHOWN" in html
    csv = (tmp_path / "out" / "results.csv").read_text().splitlines()
    assert csv[0].startswith("factor,") and len(csv) == 5


@pytest.mark.slow
def test_on_a_shoulder_too_each_factor_is_the_larger(tmp_path):
    """A station whose 3-D feature also sits on a shoulder (the feature step ran first): each hand-path
    factor is the larger of the two models' (neither holds both raisers), with its own source."""
    from compare.pairs.station_segment import station_segments_step

    case_path = tmp_path / "case.toml"
    case_path.write_text(LAYOUT)
    case = load_case(case_path)
    st = case.shaft.stations[0]
    st.kt.update(kt_bending=(9.0, "shoulder (test stand-in)"), kts_torsion=(1.01, "shoulder (test stand-in)"),
                 notch_radius=(0.001, "shaft.segments[1].fillet"))
    (rec,) = station_segments_step(case)
    assert st.kt["kt_bending"] == (9.0, "shoulder (test stand-in)")
    assert st.kt["notch_radius"] == (0.001, "shaft.segments[1].fillet")
    assert st.kt["kts_torsion"][0] == rec["kts"] > 1.01 and "3-D FE, this run" in st.kt["kts_torsion"][1]
    assert "kt_bending" in rec["also_on_a_shoulder_or_groove"]


@pytest.mark.slow
def test_layout_segment_vtu(layout_run):
    """segment.vtu of a layout: the station's 3-D surface points along the shaft, its largest von Mises
    stress over the turn equal to the FE path's recorded peak (the same superposition)."""
    import meshio

    _, res, out, _ = layout_run
    m = meshio.read(out / "segment.vtu")
    seg = res["segments"][0]
    z = m.points[:, 2]
    assert seg["centre"] - seg["length"] / 2 < z.min() and z.max() < seg["centre"] + seg["length"] / 2
    assert set(m.point_data["station"].tolist()) == {0.0}
    peak = res["section_loads"][0]["results"]["static"]["fe_local"]["summary"]["von_mises_peak"]
    assert float(m.point_data["von_mises"].max()) == pytest.approx(peak, rel=1e-12)
    for k in ("tension", "bending_x", "bending_y"):
        assert m.point_data[f"von_mises_over_nominal_{k}"].max() > 1.0  # a hole raises every load's stress
    assert m.point_data["von_mises_over_nominal_torsion"].max() > math.sqrt(3)  # √3 on the plain surface


@pytest.mark.slow
def test_standing_shaft_turned_hole_reproduces_its_factor(tmp_path):
    """A standing shaft, bending about x only, the hole's axis turned to y (angle 90): in the model's frame
    the moment bends about its y axis, so the FE path's largest principal stress over its nominal
    32|M|/(πd³) must be the study's kt_bending_y (fem/solid.py's definition of Kt; to round-off: the
    same mesh, points and tension side), and nothing alternates."""
    text = (LAYOUT.replace("rotating = true", "rotating = false").replace("at = 150\nname", "at = 100\nname")
            .replace("angle = 30", "angle = 90").replace("force = [0, -1500]", "force = [0, 1500]"))
    case = tmp_path / "case.toml"
    case.write_text(text)
    main(["run", str(case), "--out", str(tmp_path / "out"), "--no-vtu", "--no-report"])
    res = json.loads((tmp_path / "out" / "results.json").read_text())
    st = res["section_loads"][0]
    # Mx > 0 turned into the model is its own bending case's sign: the tension side is the one the study's
    # factor was read on (the other mouth of the hole is the mirror image only up to the mesh)
    assert st["My"] == pytest.approx(0.0, abs=1e-9) and st["Mx"] > 0 and st["T"] == pytest.approx(0.0, abs=1e-9)
    s = st["results"]["static"]["fe_local"]["summary"]
    nominal = 32 * abs(st["Mx"]) / (math.pi * 0.024**3)
    check = {"fem": s["sigma1_peak"] / nominal, "exact": res["segments"][0]["kt_bending_y"]}
    assert check["fem"] == pytest.approx(check["exact"], rel=1e-9)
    assert not s["rotating"] and s["sigma_a_vm"] == 0.0
    assert res["segments"][0]["kt_bending_y"] > res["segments"][0]["kt_bending_x"]  # the hole in the bending plane


@pytest.mark.slow
def test_station_quarter_model_within_the_estimates_of_the_whole(tmp_path):
    """The station's cross hole (through, centred in its model) is solved on the whole segment by
    default and on the quarter with ``model = "quarter"``. Every factor the quarter's study gives an
    estimate for lies within the sum of the two three-mesh estimates of the whole's (each bounds its own
    error; the meshes differ); where the quarter's meshes were hardly refined at the hole (a measured
    ratio below MIN_MEASURED_RATIO, compare.solve.segments) it gives no estimate and says why, never a
    small one. The superposed unit fields read the whole surface in both (points on both sides of both
    mirror planes, in the model's frame)."""
    import numpy as np

    from compare.pairs.station_segment import station_segments_step

    recs, fields = {}, {}
    for model in ("", ', model = "quarter"'):
        case_path = tmp_path / "case.toml"
        case_path.write_text(LAYOUT.replace("fineness = 0.3 }", f"fineness = 0.25{model} }}"))
        case = load_case(case_path)
        (rec,) = station_segments_step(case)
        recs[rec["model"]] = rec
        fields[rec["model"]] = case.shaft.stations[0].kt["segment_stresses"][0]["fields"]
    q, w = recs["quarter"], recs["whole"]
    for key in ("kt_axial", "kt_bending_x", "kt_bending_y", "kts"):
        gq, gw = q[f"{key}_gci"], w[f"{key}_gci"]
        assert gw is not None, key
        if gq is None:
            assert "hardly refined at the feature" in q[f"{key}_status"], (key, q[f"{key}_status"])
            continue
        got = {"fem": q[key], "exact": w[key]}  # "exact": the whole segment's study
        assert abs(got["fem"] - got["exact"]) <= gq * got["fem"] + gw * got["exact"], (key, got, gq, gw)
    for fl in fields.values():
        turn = np.radians(-fl.turn)  # back to the model's frame: the hole's axis along x
        x = np.cos(turn) * fl.points[0] - np.sin(turn) * fl.points[1]
        z = fl.points[2] - q["length"] / 2
        assert (x > 0.1 * q["diameter"]).any() and (x < -0.1 * q["diameter"]).any()
        assert (z > 0.3 * q["diameter"]).any() and (z < -0.3 * q["diameter"]).any()


def test_a_factor_without_an_estimate_names_its_reason_in_the_source():
    """The source written beside a station's 3-D factor says why it has no estimate: the limit of the
    case when one stopped the study, else the study's own reason (its status; e.g. meshes hardly
    refined at the feature), never 'None'."""
    from types import SimpleNamespace

    from compare.pairs.station_segment import _source

    ss = SimpleNamespace(kind="cross_hole", field="shaft.stations[0].segment")
    why = "no estimate: the meshes were hardly refined at the feature (measured ratios 1.13, 1.10 against 1.4)"
    rec = {"kts_gci": None, "limited_by": None, "kts_status": why}
    assert why in _source(ss, "kts", rec) and "None" not in _source(ss, "kts", rec)
    rec["limited_by"] = "analysis.max_seconds (5 s) passed after 1 of 3 meshes"
    assert "analysis.max_seconds" in _source(ss, "kts", rec)
    rec.update(kts_gci=0.05)
    assert "three-mesh estimate 5 %" in _source(ss, "kts", rec)

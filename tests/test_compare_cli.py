"""The command line, in-process: results.json contents, unit-system invariance, bad input."""
import json
import math
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]

MM = """
[case]
title = "same shaft, metric"
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 28.575
[[section.keyways]]
width = 6.35
depth = 3.175
fillet = 0.396875
angle = 90
[loads]
torque = "100 N*m"
[material]
shear_modulus = "80 GPa"
poisson = 0.3
"""

# The same shaft in inches: 1.125 in, 1/4 in key, 1/8 in deep, 1/64 in radius; 885.0746 lbf·in = 100 N·m
INCH = """
[case]
title = "same shaft, inch"
units = "in-lbf-psi"
[section]
shape = "keyed"
diameter = 1.125
[[section.keyways]]
width = 0.25
depth = 0.125
fillet = 0.015625
angle = 90
[loads]
torque = "100 N*m"
[material]
shear_modulus = "80 GPa"
poisson = 0.3
"""


def write(tmp_path, name, text):
    p = tmp_path / name
    p.write_text(text)
    return p


def test_run_writes_results_in_si(tmp_path, run_cli):
    case = write(tmp_path, "c.toml", MM)
    code, out, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / "o"))
    assert code == 0, err
    res = json.loads((tmp_path / "o" / "results.json").read_text())
    for key in ("area", "centroid", "Ixx", "Iyy", "Ixy"):
        assert key in res["section"]
    t = res["torsion"]
    for key in ("J", "J_warping", "tau_max", "tau_max_at", "twist_per_length", "kts"):
        assert key in t
    assert t["twist_per_length"] == pytest.approx(100.0 / (80e9 * t["J"]), rel=1e-12)
    assert t["kts"] == pytest.approx(t["tau_max"] / (16 * 100.0 / (math.pi * 0.028575**3)), rel=1e-12)
    assert 1.5 < t["kts"] < 4.0  # a filleted keyseat in torsion (Peterson's charts span this band; common practice)
    assert t["tau_max_where"]["keyway"] == 1 and t["tau_max_where"]["feature"] == "fillet"
    assert any(p["kind"] == "factor" and p["quantity"].startswith("Kts") for p in res["compare"])
    assert "Kts" in out and "Caution" in out
    assert (tmp_path / "o" / "section.vtu").stat().st_size > 0


def test_unit_systems_give_the_same_si_results(tmp_path, run_cli):
    res = {}
    for name, text in (("mm", MM), ("inch", INCH)):
        case = write(tmp_path, f"{name}.toml", text)
        code, _, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / name), "--no-vtu", "--quiet")
        assert code == 0, err
        res[name] = json.loads((tmp_path / name / "results.json").read_text())
    for key in ("J", "J_warping", "tau_max", "twist_per_length", "kts"):
        assert res["mm"]["torsion"][key] == pytest.approx(res["inch"]["torsion"][key], rel=1e-9)
    assert res["mm"]["section"]["area"] == pytest.approx(res["inch"]["section"]["area"], rel=1e-12)


def test_round_bar_pairs_are_checks_within_tolerance(tmp_path, run_cli):
    case = write(tmp_path, "r.toml", """
[case]
units = "mm-N-MPa"
[section]
shape = "round"
diameter = 40
bore = 16
[loads]
torque = "500 N*m"
[material]
shear_modulus = "80 GPa"
""")
    code, _, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / "o"), "--quiet", "--no-vtu")
    assert code == 0, err
    res = json.loads((tmp_path / "o" / "results.json").read_text())
    checks = [p for p in res["compare"] if p["kind"] == "check"]
    assert {p["quantity"] for p in checks} >= {"torsion constant J", "area"}
    assert all(p["within_tolerance"] for p in checks)
    # tube, exact: τmax = 16TD/(π(D⁴−d⁴)) (any strength-of-materials text)
    assert res["torsion"]["tau_max"] == pytest.approx(16 * 500 * 0.04 / (math.pi * (0.04**4 - 0.016**4)), rel=1e-2)


@pytest.mark.parametrize("edit,field", [
    (("depth = 3.175", "depth = 15"), "section.keyways[0].depth"),
    (("fillet = 0.396875", "fillet = 3.5"), "section.keyways[0].fillet"),
    (('torque = "100 N*m"', 'torque = "100"'), "loads.torque"),
    (("diameter = 28.575", "diameter = -28.575"), "section.diameter"),
])
def test_bad_input_exits_2_with_one_line_and_writes_nothing(tmp_path, run_cli, edit, field):
    case = write(tmp_path, "bad.toml", MM.replace(*edit))
    out = tmp_path / "o"
    code, stdout, err = run_cli("run", "--no-report", str(case), "--out", str(out))
    assert code == 2
    assert err.count("\n") == 1 and field in err
    assert "Traceback" not in err
    assert not out.exists()
    assert not list(tmp_path.glob(".shaftcheck-*"))


def test_self_intersecting_outline_exits_2(tmp_path, run_cli):
    case = write(tmp_path, "bow.toml", """
[case]
units = "mm-N-MPa"
[section]
shape = "custom"
add = [ { polygon = { points = [[0, 0], [10, 10], [10, 0], [0, 10]] } } ]
[loads]
torque = 1000
[material]
shear_modulus = 80000
""")
    code, _, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / "o"))
    assert code == 2 and "section.add[0].polygon.points" in err and "intersects itself" in err


def test_missing_case_file_and_usage_errors(tmp_path, run_cli):
    code, _, err = run_cli("run", "--no-report", str(tmp_path / "nope.toml"))
    assert code == 2 and "case file" in err
    code, _, err = run_cli("frobnicate")
    assert code == 2 and err.count("\n") == 1


@pytest.mark.parametrize("name", ["conveyor_gear_seat.toml", "pump_coupling_inch.toml", "custom_slotted_shaft.toml"])
def test_demo_cases_run(tmp_path, run_cli, name):
    code, out, err = run_cli("run", "--no-report", str(ROOT / "cases" / name), "--out", str(tmp_path / "o"), "--no-vtu")
    assert code == 0, err
    assert "τmax" in out


def test_sharp_keyway_corners_are_reported_as_singular(tmp_path, run_cli):
    # A sharp re-entrant corner (interior angle 270°) has an unbounded stress (Williams' corner
    # solution; Timoshenko & Goodier discuss the re-entrant corner in torsion): no Kts is given.
    text = MM.replace("fillet = 0.396875\n", "") + '[analysis]\naccuracy = "1 %"\n'
    case = write(tmp_path, "sharp.toml", text)
    code, out, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / "o"), "--no-vtu")
    assert code == 4, err  # no verdict: docs/outputs.md, exit codes
    res = json.loads((tmp_path / "o" / "results.json").read_text())
    assert len(res["torsion"]["singular_corners"]) == 2
    assert res["torsion"]["kts"] is None
    assert "sharp re-entrant corner" in out
    kts = [p for p in res["compare"] if p["quantity"].startswith("Kts")]
    assert kts[0]["kind"] == "not applicable" and kts[0]["ratio"] is None

"""The combined-stress, static, fatigue and material results through the command line.

These run ``compare.cli.main`` in-process. They need ``combined_step`` called from ``analyse()`` and
``combined_lines`` from ``report.summary()`` (the wiring of issue 4); the in-process tests of the same
results are in tests/test_compare_combined.py."""
import json
import math
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
LBF, INCH = 4.4482216152605, 0.0254  # exact definitions
PSI = LBF / INCH**2

POINT_KEYS = {"at", "sigma", "tau", "sigma1", "sigma2", "sigma3", "tau_max", "von_mises", "tresca", "angle_deg", "criterion"}


def run(tmp_path, run_cli, case, name="o"):
    code, out, err = run_cli("run", "--no-report", "--verbose", str(case), "--out", str(tmp_path / name), "--no-vtu")
    res = json.loads((tmp_path / name / "results.json").read_text()) if code == 0 else None
    return code, out, err, res


def test_demo_case_results_and_summary(tmp_path, run_cli):
    code, out, err, res = run(tmp_path, run_cli, ROOT / "cases" / "conveyor_fatigue.toml")
    assert code == 0, err
    c = res["combined"]
    assert c["points"] and all(POINT_KEYS <= set(p) for p in c["points"])
    for k in ("von_mises_max", "sigma1_max", "tau_abs_max"):
        assert c[k] > 0
    assert {"von_mises", "tresca"} <= set(res["static"])
    ft = res["fatigue"]
    for k in ("goodman", "gerber", "asme_elliptic", "soderberg", "yield_langer", "Se", "factors"):
        assert k in ft, k
    assert isinstance(res["materials"], list) and res["materials"][0]["rank"] == 1
    g = res["governing"]
    assert {"factor", "criterion", "at", "text"} <= set(g)
    # the summary leads with the governing factor of safety and where
    assert out.index("GOVERNING:") < out.index("Section")
    assert g["text"] in out
    for head in ("Combined stress", "Static check", "Fatigue", "Materials", "ILLUSTRATIVE"):
        assert head in out, head


MM = """
[case]
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 28.575
[[section.keyways]]
width = 6.35
depth = 3.175
fillet = 0.396875
[loads]
rotating = true
bending = ["90 N*m", "-40 N*m"]
torque = "120 N*m"
shear = ["800 N", "-1500 N"]
[material]
shear_modulus = "80 GPa"
poisson = 0.3
yield = "500 MPa"
ultimate = "700 MPa"
surface = "ground"
[analysis]
design_factor = 1.6
"""


def test_results_do_not_depend_on_the_unit_system(tmp_path, run_cli):
    # the same shaft in inches: 1.125 in, 1/4 in key, 1/8 in deep, 1/64 in radius (1 in = 25.4 mm)
    inch = (MM.replace('units = "mm-N-MPa"', 'units = "in-lbf-psi"').replace("28.575", "1.125")
            .replace("6.35", "0.25").replace("3.175", "0.125").replace("0.396875", "0.015625"))
    (tmp_path / "mm.toml").write_text(MM)
    (tmp_path / "in.toml").write_text(inch)
    _, _, err1, a = run(tmp_path, run_cli, tmp_path / "mm.toml", "mm")
    _, _, err2, b = run(tmp_path, run_cli, tmp_path / "in.toml", "in")
    assert a is not None, err1
    assert b is not None, err2
    rel = 1e-6  # conversion round-off; the geometry in SI is the same
    for k in ("von_mises_max", "sigma1_max", "tau_abs_max"):
        assert b["combined"][k] == pytest.approx(a["combined"][k], rel=rel)
    for k in a["fatigue"]["criteria"]:
        assert b["fatigue"][k] == pytest.approx(a["fatigue"][k], rel=rel)
    assert b["governing"]["factor"] == pytest.approx(a["governing"]["factor"], rel=rel)


@pytest.mark.parametrize("edit,field", [
    (("[analysis]", '[fatigue]\nkt_bending = 2.1\n[analysis]'), "fatigue.kt_bending_source"),
    (("design_factor = 1.6", 'design_factor = 1.6\nmaterials = "nowhere.toml"'), "analysis.materials"),
    (("torque = \"120 N*m\"", 'torque = "120 N*m"\nbending_mean = [1, 0]'), "loads.bending_mean"),
])
def test_bad_input_is_one_line_naming_the_field(tmp_path, run_cli, edit, field):
    p = tmp_path / "bad.toml"
    p.write_text(MM.replace(*edit))
    code, _, err = run_cli("run", "--no-report", "--verbose", str(p), "--out", str(tmp_path / "o"))
    assert code == 2 and field in err and err.count("\n") == 1 and "Traceback" not in err


def test_torque_only_case_still_runs(tmp_path, run_cli):
    p = tmp_path / "t.toml"
    p.write_text(MM.split("[loads]")[0] + '[loads]\ntorque = "50 N*m"\n[material]\nshear_modulus = "80 GPa"\n')
    code, out, err, res = run(tmp_path, run_cli, p)
    assert code == 0, err
    # pure torsion: von Mises = √3·τmax (Shigley 9th ed., eq. 5-15 with σ = 0)
    assert res["combined"]["von_mises_max"] == pytest.approx(math.sqrt(3) * res["torsion"]["tau_max"], rel=1e-9)
    assert "governing" not in res and "GOVERNING" not in out

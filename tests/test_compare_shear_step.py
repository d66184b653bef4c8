"""The shear step through the command line: results keys, pairs of the same definition only."""
import json
import math

import pytest

ROUND = """
[case]
units = "mm-N-MPa"
[section]
shape = "round"
diameter = 30
[loads]
torque = "100 N*m"
shear = [0, "5 kN"]
[material]
elastic_modulus = "200 GPa"
poisson = 0.3
"""


def run(tmp_path, run_cli, text, name="c"):
    p = tmp_path / f"{name}.toml"
    p.write_text(text)
    code, out, err = run_cli("run", "--no-report", "--verbose", str(p), "--out", str(tmp_path / name), "--no-vtu")
    res = json.loads((tmp_path / name / "results.json").read_text()) if code == 0 else None
    return code, out, err, res


def test_round_bar_shear_results_and_pairs(tmp_path, run_cli):
    code, out, err, res = run(tmp_path, run_cli, ROUND)
    assert code == 0, err
    sh = res["shear"]
    for key in ("centre", "kappa_x", "kappa_y", "kappa_xy", "tau_max", "tau_max_at", "residuals"):
        assert key in sh
    # exact flexure, Timoshenko & Goodier 3rd ed. §120: centre value (3+2ν)/(2(1+ν))·V/A at ν = 0.3
    A = math.pi * 0.03**2 / 4
    assert sh["tau_max"] == pytest.approx(1.3846 * 5000 / A, rel=1e-2)
    checks = [p for p in res["compare"] if p["kind"] == "check"]
    assert all(p["within_tolerance"] for p in checks), [p for p in checks if not p["within_tolerance"]]
    kappa_pairs = [p for p in res["compare"] if p["quantity"].startswith("shear coefficient")]
    # the FE energy coefficient is compared only with the energy closed form; Cowper and
    # Hutchinson are shown, labelled, with no ratio
    compared = [p for p in kappa_pairs if p["ratio"] is not None]
    assert compared and all("energy" in p["quantity"] for p in compared)
    assert any("Cowper" in p["quantity"] and p["ratio"] is None for p in kappa_pairs)
    assert "Transverse shear" in out


def test_without_shear_force_centre_and_coefficients_are_still_reported(tmp_path, run_cli):
    code, _, err, res = run(tmp_path, run_cli, ROUND.replace('shear = [0, "5 kN"]\n', ""))
    assert code == 0, err
    assert "kappa_y" in res["shear"] and "centre" in res["shear"]
    assert "tau_max" not in res["shear"]


def test_shear_needs_poisson(tmp_path, run_cli):
    text = ROUND.replace("poisson = 0.3\n", "").replace('elastic_modulus = "200 GPa"', 'shear_modulus = "77 GPa"')
    code, _, err, _ = run(tmp_path, run_cli, text)
    assert code == 2 and "material.poisson" in err


def test_keyed_shaft_shear_centre_on_the_symmetry_line_and_vq_ib_pair(tmp_path, run_cli):
    text = ROUND.replace('shape = "round"\ndiameter = 30', 'shape = "keyed"\ndiameter = 30\n[[section.keyways]]\nwidth = 8\ndepth = 4\nfillet = 0.4')
    code, _, err, res = run(tmp_path, run_cli, text)
    assert code == 0, err
    sym = [p for p in res["compare"] if p["quantity"].startswith("shear centre off the keyway")]
    assert sym[0]["within_tolerance"]
    vq = [p for p in res["compare"] if "VQ/(Ib)" in p["quantity"]]
    assert vq and vq[0]["kind"] == "factor" and 0.9 < vq[0]["ratio"] < 1.2

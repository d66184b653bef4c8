"""Accuracy evidence: convergence study keys, the verification suite, singular corners, DOF limit."""
import json

import pytest

from compare.solve.accuracy import one_study

KEYED = """
[case]
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 24
[[section.keyways]]
width = 8
depth = 4
fillet = 0.4
[loads]
torque = "60 N*m"
[material]
shear_modulus = "80 GPa"
poisson = 0.3
"""


def run(tmp_path, run_cli, text, *extra):
    p = tmp_path / "c.toml"
    p.write_text(text)
    code, out, err = run_cli("run", str(p), "--out", str(tmp_path / "o"), "--no-vtu", *extra)
    res = json.loads((tmp_path / "o" / "results.json").read_text()) if (tmp_path / "o" / "results.json").exists() else None
    return code, out, err, res


def test_every_run_carries_a_convergence_study(tmp_path, run_cli):
    code, out, err, res = run(tmp_path, run_cli, KEYED)
    assert code == 0, err
    conv = res["convergence"]
    for key in ("J", "tau_max", "shear_centre_x", "shear_centre_y", "kappa_x", "kappa_y"):
        c = conv[key]
        assert len(c["dofs"]) == 3 and len(c["values"]) == 3
        assert c["dofs"][0] < c["dofs"][1] < c["dofs"][2]
        for k in ("observed_order", "extrapolated", "gci", "asymptotic"):
            assert k in c
    acc = res["accuracy"]
    assert acc["target"] == pytest.approx(1e-3)  # default 0.1 %
    assert acc["met"] and acc["achieved"] <= acc["target"]
    # the reported results come from the finest mesh of the study
    assert res["torsion"]["dofs"] == conv["J"]["dofs"][-1]
    assert "Accuracy: target 0.1 %" in out


def test_verification_suite_passes_and_its_estimates_cover_the_true_errors(tmp_path, run_cli):
    # Exact values: cases/verification/*.toml, each naming its source (round bar and tube: elementary
    # torsion; ellipse, hollow ellipse, triangle: Roark 7th ed. Table 10.1; rectangles: Saint-Venant
    # series; round bar in shear: Timoshenko & Goodier §120 and the energy coefficient closed form).
    code, out, err = run_cli("verify", "--out", str(tmp_path / "v"))
    assert code == 0, out + err
    rep = json.loads((tmp_path / "v" / "verify.json").read_text())
    rows = rep["rows"]
    assert len({r["case"] for r in rows}) >= 8
    for r in rows:
        assert r["relative_error"] <= r["target"], r
        assert r["relative_error"] <= r["estimated_error"], r
        # effectivity of the error estimate (estimate / true error): the GCI is built to be
        # conservative (Fs = 1.25 to 3), so it sits above 1; stated band: at most 100
        if r["relative_error"] > 1e-9:
            assert 1.0 <= r["estimated_error"] / r["relative_error"] <= 100.0, r


def test_sharp_keyway_is_reported_singular_not_given_a_number(tmp_path, run_cli):
    text = KEYED.replace("fillet = 0.4\n", "").replace("poisson = 0.3\n", "") + '[analysis]\naccuracy = "1 %"\n'
    code, out, err, res = run(tmp_path, run_cli, text)
    assert code == 4, err  # no verdict with a sharp corner (README, exit codes)
    corner = res["convergence"]["tau_max_corner"]
    assert corner["gci"] is None and corner["status"].startswith("singular corner")
    assert res["accuracy"]["singular_corners"] is True
    assert "no value is given" in out


def test_dof_limit_stops_refinement_with_exit_3(tmp_path, run_cli):
    text = KEYED + '[analysis]\naccuracy = "0.001 %"\nmax_dofs = 6000\n'
    code, out, err, res = run(tmp_path, run_cli, text)
    assert code == 3
    assert res["accuracy"]["met"] is False and "max_dofs" in res["accuracy"]["limited_by"]
    assert "NOT MET" in out and "refinement stopped" in out


def test_study_of_an_exact_power_law_recovers_order_and_limit():
    # Self-consistency (not an outside value): f = f0 + C h² on meshes h, 1.4h, 1.96h gives p = 2 and
    # the extrapolated f0, in the asymptotic range.
    f0, C, h = 2.0, 0.3, 0.01
    vals = [f0 + C * (h * 1.4**k) ** 2 for k in range(3)]
    d = one_study("tau_max", vals, [4000, 2000, 1000], (1.4, 1.4), 1.0)
    assert d["observed_order"] == pytest.approx(2.0, rel=1e-9)
    assert d["extrapolated"] == pytest.approx(f0, rel=1e-12)
    assert d["asymptotic"] is True
    # GCI = 1.25·|f2 − f1|/f1/(r² − 1) (Roache 1994)
    assert d["gci"] == pytest.approx(1.25 * abs(vals[1] - vals[0]) / vals[0] / (1.4**2 - 1), rel=1e-12)


def test_oscillating_values_get_the_spread_based_estimate():
    d = one_study("tau_max", [1.0, 1.001, 0.9995], [4000, 2000, 1000], (1.4, 1.4), 1.0)
    assert d["status"] == "oscillatory" and d["observed_order"] is None
    assert d["gci"] == pytest.approx(3.0 * 0.001, rel=1e-9)


def test_time_limit_stops_refinement_with_exit_3(tmp_path, run_cli):
    text = KEYED + '[analysis]\naccuracy = "0.001 %"\nmax_seconds = 0.01\n'
    code, out, err, res = run(tmp_path, run_cli, text)
    assert code == 3
    assert "max_seconds" in res["accuracy"]["limited_by"]

"""Warnings and withdrawn verdicts (compare.findings): a sharp keyway corner gives no verdict, a cut that
opens a hole to the outside or a short feature is named as a 2-D model of a 3-D feature, a factor of
safety below 1 is said first, and round-off is printed as zero."""
import json

import pytest

from compare.checks.findings import EXIT_NO_VERDICT
from fem.geometry import Disk, Keyway, custom_section, keyed_section, rectangle
from fem.topology import cut_connectivity

KEYED = """
[case]
title = "keyed"
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 30
[[section.keyways]]
width = 8
depth = 4
fillet = {fillet}
[loads]
torque = "200 N*m"
bending = ["150 N*m", "0 N*m"]
[material]
elastic_modulus = "205 GPa"
poisson = 0.29
yield = "390 MPa"
[analysis]
accuracy = "1 %"
design_factor = 1.5
materials = "{materials}"
"""


def _run(run_cli, tmp_path, text, name="case", verbose=True):
    p = tmp_path / f"{name}.toml"
    p.write_text(text)
    code, out, err = run_cli("run", "--no-report", *(["--verbose"] if verbose else []), str(p), "--out",
                             str(tmp_path / name), "--no-vtu")
    res = json.loads((tmp_path / name / "results.json").read_text())
    return code, out, err, res


@pytest.fixture(scope="module")
def materials(tmp_path_factory):
    from pathlib import Path
    return str(Path(__file__).resolve().parents[1] / "cases" / "materials_demo.toml")


def test_sharp_keyway_corner_gives_no_verdict(run_cli, tmp_path, materials):
    # Issue defect 1: fillet = 0 must not end in "meets". The corner stress of a re-entrant 90° corner is
    # unbounded (Williams' corner solution; any elasticity text, e.g. Timoshenko & Goodier 3rd ed.), so no
    # factor of safety exists for the section.
    code, out, _, res = _run(run_cli, tmp_path, KEYED.format(fillet=0, materials=materials))
    assert code == EXIT_NO_VERDICT == 4
    assert out.splitlines()[3].startswith("WARNING: NO VERDICT: sharp re-entrant corner")
    assert "keyway 1" in out.splitlines()[3] and "0.16 mm to 0.6 mm" in out.splitlines()[3]
    assert res["warnings"][0]["code"] == "sharp_corner_no_verdict"
    assert len(res["warnings"][0]["data"]["corners"]) == 2
    gov = res["governing"]
    assert gov["factor"] is None and gov["no_verdict"] is True and gov["meets_design_factor"] is None
    assert "meets the design factor" not in out.split("Section")[0]
    assert all(m["meets"] is None and m["no_verdict"] for m in res["materials"])
    assert " meets" not in out.split("Materials")[1].split("Skipped")[0].replace("can be said to meet", "")
    assert res["torsion"]["kts"] is None
    assert all(v is None for v in res["static"]["meets_design_factor"].values())


def test_the_real_bottom_radius_gives_a_verdict_and_no_warning(run_cli, tmp_path, materials):
    code, out, _, res = _run(run_cli, tmp_path, KEYED.format(fillet=0.25, materials=materials))
    assert code == 0
    assert res["warnings"] == []
    assert res["governing"]["factor"] is not None and res["governing"]["factor"] > 1
    assert out.splitlines()[3].startswith("GOVERNING: n = ")
    # symmetric section: round-off printed as zero (centroid x, Ixy)
    line = next(x for x in out.splitlines() if x.strip().startswith("Ixx, Iyy, Ixy"))
    assert line.rstrip().endswith(", 0 mm⁴")
    cen = next(x for x in out.splitlines() if x.strip().startswith("centroid"))
    assert cen.split("(")[1].startswith("0, ")


TUBE = """
[case]
title = "tube with a radial hole given as a cut"
units = "mm-N-MPa"
[section]
shape = "custom"
add = [ { disk = { center = [0, 0], radius = 20 } } ]
cut = [ { disk = { center = [0, 0], radius = 14 } },
        { rectangle = { center = [17, 0], size = [8, 5] }, length = "5 mm" } ]
[loads]
torque = "300 N*m"
[material]
elastic_modulus = "205 GPa"
poisson = 0.29
yield = "390 MPa"
[analysis]
accuracy = "1 %"
"""


def test_cut_opening_the_bore_is_named_and_a_factor_below_one_comes_first(run_cli, tmp_path):
    # Issue defect 2: a radial hole entered as a cut joining the bore to the outside makes a slit tube.
    # Thin-walled theory (common practice): the closed tube's J = π(D⁴−d⁴)/32 against Σbt³/3 open.
    code, out, _, res = _run(run_cli, tmp_path, TUBE)
    codes = [w["code"] for w in res["warnings"]]
    assert codes[0] == "factor_below_one"
    assert "open_section" in codes and "short_feature" in codes
    first = out.splitlines()[3]
    assert first.startswith("WARNING: FACTOR OF SAFETY BELOW 1")
    opened = next(w for w in res["warnings"] if w["code"] == "open_section")
    assert opened["data"]["label"] == "section.cut[1].rectangle"
    assert "slit running the full length" in opened["text"]
    import math
    J_closed = math.pi * (0.04**4 - 0.028**4) / 32
    assert res["torsion"]["J"] < 0.1 * J_closed  # the slit tube has lost most of its torsion constant
    assert code == 0


def test_cut_connectivity_topology():
    slit = custom_section([Disk((0, 0), 0.02)], [rectangle((0.016, 0), (0.01, 0.004), name="s"), Disk((0, 0), 0.012)])
    ch = cut_connectivity(slit)
    assert [c["step"] for c in ch] == [1] and ch[0]["holes_without"] == 1 and ch[0]["holes_with"] == 0
    assert cut_connectivity(keyed_section(0.03, [Keyway(0.008, 0.004, 0.0004, 90)], bore=0.01)) == []
    assert cut_connectivity(custom_section([Disk((0, 0), 0.02)], [Disk((0.005, 0), 0.002)])) == []


def test_inch_case_words_in_inches_and_bore_nominal(run_cli, tmp_path):
    text = """
[case]
title = "inch keyed with a bore"
units = "in-lbf-psi"
[section]
shape = "keyed"
diameter = 1.125
bore = 0.4
[[section.keyways]]
width = 0.25
depth = 0.125
fillet = "0.015625 in"
[loads]
torque = "1450 lbf*in"
bending_alternating = ["900 lbf*in", "0 lbf*in"]
[material]
elastic_modulus = "29.5e6 psi"
poisson = 0.29
yield = "90 ksi"
ultimate = "120 ksi"
surface = "machined"
[analysis]
accuracy = "1 %"
"""
    code, out, _, res = _run(run_cli, tmp_path, text)
    kb = res["fatigue"]["factors"]["kb"]["source"]
    assert "d = 1.125 in" in kb
    assert "π(D⁴−d⁴)" in res["fatigue"]["hand"]["Kts_source"]


def test_a_pass_is_not_presented_when_the_2d_model_does_not_describe_the_feature(run_cli, tmp_path, materials):
    # The slit tube of the test above under a small torque: every factor is above the design factor, but the
    # open-section warning says the 2-D model is not the part, so no "PASSES" and no material "meets".
    text = TUBE.replace('torque = "300 N*m"', 'torque = "20 N*m"').replace(
        '[analysis]\naccuracy = "1 %"\n', f'[analysis]\naccuracy = "1 %"\ndesign_factor = 1.5\nmaterials = "{materials}"\n')
    code, out, _, res = _run(run_cli, tmp_path, text, verbose=False)
    gov = res["governing"]
    assert gov["factor"] > 1.5 and gov["meets_design_factor"] is True and gov["verdict_supported"] is False
    assert "NOT a verdict" in gov["text"] and "meets the design factor" not in gov["text"]
    verdict = next(x for x in out.splitlines() if x.startswith("VERDICT"))
    assert verdict.startswith("VERDICT: NOT SHOWN") and "PASSES" not in verdict
    assert all(m["meets"] is not True for m in res["materials"])
    assert "meets" not in [x.rsplit(": ", 1)[-1] for x in out.splitlines()]


TINY_FILLET = """
[case]
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 30
[[section.keyways]]
width = 8
depth = 4
fillet = {r}
[loads]
torque = "60 N*m"
[material]
shear_modulus = "80 GPa"
[analysis]
accuracy = "1 %"
"""


def _tiny(run_cli, tmp_path, r):
    p = tmp_path / f"r{r}.toml"
    p.write_text(TINY_FILLET.format(r=r))
    code, out, err = run_cli("run", "--no-report", "--no-vtu", str(p), "--out", str(tmp_path / f"o{r}"))
    res = json.loads((tmp_path / f"o{r}" / "results.json").read_text()) if code in (0, 3, 4) else None
    return code, out, err, res


@pytest.mark.slow
def test_tiny_keyway_fillets_are_solved_and_follow_the_corner_law(run_cli, tmp_path):
    """A fillet of 0.005 mm on a 30 mm shaft (r/d 1.7e-4) was refused with gmsh's words; it is a real
    radius and is solved. Check against the corner law: the warping function near a re-entrant corner
    of interior angle α is harmonic with free faces, so it goes as r^(π/α) (separation of variables in
    the wedge) and the stress as r^(π/α − 1) = r^(-1/3) at α = 3π/2; a fillet of radius ρ, the only
    length at the corner, then scales the peak as ρ^(-1/3) (a dimensional argument). Ten times smaller
    gives Kts × 10^(1/3) = 2.154. Tolerance 1 %: the law is the leading term as ρ → 0 (at ρ/w = 6e-4
    the next terms are small), plus the two runs' error estimates."""
    kts = {}
    for r in (0.005, 0.0005):
        code, out, err, res = _tiny(run_cli, tmp_path, r)
        assert code == 0 and "error" not in err, err
        kts[r] = (res["torsion"]["kts"], res["convergence"]["tau_max"]["gci"])
    ratio = {"fem": kts[0.0005][0] / kts[0.005][0], "exact": 10 ** (1 / 3)}
    assert ratio["fem"] == pytest.approx(ratio["exact"], rel=0.01 + kts[0.005][1] + kts[0.0005][1])


def test_a_fillet_below_a_millionth_of_the_size_is_a_sharp_corner_said_in_the_trades_words(run_cli, tmp_path):
    """1e-6 mm on a 30 mm shaft: no mesher message; the corner is modelled sharp, the no-verdict rule of
    a sharp corner applies (exit 4) and the warning says why in a designer's words."""
    code, out, err, res = _tiny(run_cli, tmp_path, 1e-6)
    assert code == EXIT_NO_VERDICT, err
    assert "Newton" not in out + err and "circle arc" not in out + err
    codes = [w["code"] for w in res["warnings"]]
    assert "fillet_taken_sharp" in codes and "sharp_corner_no_verdict" in codes
    w = res["warnings"][codes.index("fillet_taken_sharp")]
    assert w["data"]["fillets"][0]["field"] == "section.keyways[0].fillet"
    assert "PRACTICALLY SHARP CORNER: section.keyways[0].fillet" in out and "roughness" in out
    assert res["torsion"]["kts"] is None and res["governing"]["no_verdict"]

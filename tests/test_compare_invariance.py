"""Same shaft, same answer: unit system, translation, uniform scale, rotation and mirroring.

Unit conversions: 1 in = 25.4 mm and 1 lbf = 4.448 221 615 260 5 N, both exact by definition
(NIST Special Publication 811, 2008 ed., Appendix B). A converted length keeps 14 significant
digits, so the same dimension written in inches or in millimetres is the same float, the same
section, the same mesh and bit for bit the same result. A translation changes J and the peak only
by round-off; a rotation or a mirror image gets a different mesh, so there the two answers need
only agree within their convergence studies' GCIs (Roache, J. Fluids Eng. 116:405-413, 1994).

The property tests run a fixed pseudo-random sample (``derandomize``), so the suite is repeatable.
"""
import dataclasses
import json
import math
from decimal import Decimal

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from compare.solve.accuracy import estimates, refine_to_accuracy
from compare.case.case import parse_case, parse_section
from compare.case.units import SYSTEMS, round_significant, to_si, unit_system
from tests.helpers import torsion_of

INCH = Decimal("0.0254")  # m, exact (NIST SP 811, 2008 ed., App. B)
LBF = 4.4482216152605  # N, exact (same source)
EPS = np.finfo(float).eps


def test_the_same_length_in_inches_and_millimetres_is_the_same_float():
    for inches in ("0.6", "1.5", "0.375", "0.1875", "1.2", "2.1", "0.3"):
        mm = Decimal(inches) * Decimal("25.4")
        a = to_si(float(inches), "length", "x", SYSTEMS["in-lbf-psi"])
        b = to_si(float(mm), "length", "x", SYSTEMS["mm-N-MPa"])
        c = to_si(f"{inches} in", "length", "x", None)
        assert a == b == c == float(Decimal(inches) * INCH), inches  # identical, not only close
    # rounding to 14 significant digits changes a value by at most 5e-14 of itself
    assert to_si("1450 lbf*in", "moment", "x", None) == pytest.approx(1450 * LBF * 0.0254, rel=1e-13)
    assert round_significant(0.015239999999999998) == 0.01524
    assert round_significant(-3.00000000000004e-5) == -3e-5 and round_significant(1.0000000000001) == 1.0000000000001
    assert round_significant(0.0) == 0.0 and math.isinf(round_significant(math.inf))
    # angles are not rounded: 90° stays exactly a quarter turn
    assert math.degrees(to_si("90 deg", "angle", "x", None)) == 90.0


KEYED_MM = """
[case]
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 38.1
[[section.keyways]]
width = 9.525
depth = 4.7625
fillet = 0.508
[loads]
torque = "400 N*m"
[material]
shear_modulus = "80 GPa"
[analysis]
accuracy = "1 %"
"""
KEYED_IN = (KEYED_MM.replace("mm-N-MPa", "in-lbf-psi").replace("38.1", "1.5").replace("9.525", "0.375")
            .replace("4.7625", "0.1875").replace("0.508", "0.02"))  # torque and modulus carry their own units


def test_a_keyed_section_in_mm_and_in_inches_gives_bit_identical_results(tmp_path, run_cli):
    # before the geometry was normalised these ended on different meshes (7.2k against 12.1k DOFs)
    res = {}
    for name, text in (("mm", KEYED_MM), ("inch", KEYED_IN)):
        (tmp_path / f"{name}.toml").write_text(text)
        code, _, err = run_cli("run", "--no-report", str(tmp_path / f"{name}.toml"), "--out", str(tmp_path / name), "--no-vtu", "--quiet")
        assert code == 0, err
        res[name] = json.loads((tmp_path / name / "results.json").read_text())
    mm, inch = res["mm"], res["inch"]
    assert mm["mesh"]["dofs"] == inch["mesh"]["dofs"] and mm["mesh"]["elements"] == inch["mesh"]["elements"]
    for key in ("J", "J_warping", "tau_max", "kts", "twist_per_length"):
        assert mm["torsion"][key] == inch["torsion"][key], key  # bit-identical
    assert mm["section"]["area"] == inch["section"]["area"]
    assert mm["torsion"]["tau_max_at"] == inch["torsion"]["tau_max_at"]


# ----------------------------------------------------------------------------- property tests

@st.composite
def sections_in_thou(draw):
    """A valid section as whole thousandths of an inch (so it is exact in inches and in mm)."""
    kind = draw(st.sampled_from(["round", "keyed", "rectangle"]))
    if kind == "rectangle":
        w = draw(st.integers(400, 2000))
        h = draw(st.integers(300, 2000))
        fillet = draw(st.integers(0, min(w, h) * 3 // 10))
        rot = draw(st.integers(0, 179))
        return dict(kind=kind, size=(w, h), fillet=fillet, rotation=rot)
    d = draw(st.integers(500, 3000))
    if kind == "round":
        bore = draw(st.one_of(st.just(0), st.integers(d // 5, d * 7 // 10)))
        return dict(kind=kind, diameter=d, bore=bore)
    w = draw(st.integers(d * 15 // 100, d * 30 // 100))
    depth = draw(st.integers(d * 5 // 100, d * 12 // 100))
    fillet = draw(st.integers(max(1, min(w // 2, depth) // 20), min(w // 2, depth) // 2))
    room = d - 2 * depth - d // 10  # leave a wall of at least a twentieth of d under the keyway
    bore = draw(st.one_of(st.just(0), st.integers(d // 5, max(d // 5, room))))
    angle = draw(st.integers(0, 359))
    return dict(kind=kind, diameter=d, bore=bore if bore < room else 0, keyway=(w, depth, fillet, angle))


def as_table(spec, units: str) -> dict:
    """The [section] table of a case file in inches or millimetres (exact decimal numbers)."""
    f = Decimal("0.001") if units.startswith("in") else Decimal("0.0254")

    def v(thou):
        return float(Decimal(thou) * f)

    if spec["kind"] == "rectangle":
        w, h = spec["size"]
        rect = {"center": [0, 0], "size": [v(w), v(h)], "rotation": spec["rotation"]}
        if spec["fillet"]:
            rect["fillet"] = v(spec["fillet"])
        return {"shape": "custom", "add": [{"rectangle": rect}]}
    t = {"shape": spec["kind"], "diameter": v(spec["diameter"])}
    if spec["bore"]:
        t["bore"] = v(spec["bore"])
    if spec["kind"] == "keyed":
        w, depth, fillet, angle = spec["keyway"]
        t["keyways"] = [{"width": v(w), "depth": v(depth), "fillet": v(fillet), "angle": angle}]
    return t


def round_off_tolerance(sm, distance: float) -> float:
    """Relative round-off of a result on a mesh moved ``distance`` from the origin: node
    coordinates carry about eps·distance, which the smallest element turns into a relative error
    of about eps·distance/h_min (a factor 20 of margin); 1e-13 for the rest of the arithmetic."""
    p = sm.mesh.p[:, sm.mesh.t[:3]]
    h_min = float(np.min(np.hypot(*(p[:, 0] - p[:, 1]))))
    return 1e-13 + 20 * EPS * distance / h_min


FAST = settings(max_examples=8, deadline=None, derandomize=True, database=None,
                suppress_health_check=[HealthCheck.too_slow])


@FAST
@given(spec=sections_in_thou(), dx=st.floats(-1.5, 1.5), dy=st.floats(-1.5, 1.5))
def test_unit_system_and_translation_leave_J_and_the_peak_unchanged(spec, dx, dy):
    sec_in = parse_section(as_table(spec, "in"), unit_system("in-lbf-psi"))
    sec_mm = parse_section(as_table(spec, "mm"), unit_system("mm-N-MPa"))
    assert sec_in == sec_mm  # the same numbers in SI, not only close
    fineness = 0.5  # coarse: invariance does not need accuracy
    sm_i, _, tr_i = torsion_of(sec_in, fineness)
    sm_m, _, tr_m = torsion_of(sec_mm, fineness)
    assert tr_m.dofs == tr_i.dofs
    assert tr_m.J == tr_i.J and tr_m.peak_per_torque == tr_i.peak_per_torque  # bit-identical
    # translated by up to 1.5 section sizes in each direction
    L = sec_in.length_scale
    sm_t, _, tr_t = torsion_of(sec_in.moved(dx * L, dy * L), fineness)
    assert tr_t.dofs == tr_i.dofs and np.array_equal(sm_t.mesh.t, sm_i.mesh.t)
    tol = round_off_tolerance(sm_i, math.hypot(dx, dy) * L + L)
    assert tr_t.J == pytest.approx(tr_i.J, rel=tol)  # exact: a translation leaves J unchanged
    assert tr_t.peak_per_torque == pytest.approx(tr_i.peak_per_torque, rel=tol)


GCI_TARGET = 2e-2  # a coarse study is enough to show the bands overlap; it keeps the test fast


def _study(case, section):
    st_ = refine_to_accuracy(dataclasses.replace(case, section=section), GCI_TARGET, 200_000, max_seconds=60)
    return estimates(st_.solutions)


@settings(max_examples=3, deadline=None, derandomize=True, database=None,
          suppress_health_check=[HealthCheck.too_slow])
@given(spec=sections_in_thou(), turn=st.floats(5.0, 355.0))
def test_rotation_and_mirroring_agree_within_the_gci(spec, turn):
    case = parse_case({"case": {"units": "in-lbf-psi"}, "section": as_table(spec, "in"),
                       "loads": {"torque": 1000}, "material": {"shear_modulus": "11.5e6 psi"}})
    base = _study(case, case.section)
    for other in (case.section.moved(rotation=turn), case.section.mirrored()):
        e = _study(case, other)
        for key in ("J", "tau_max"):
            a, b = base[key], e[key]
            fa, fb = a["values"][-1], b["values"][-1]  # the finest mesh of each study is reported
            assert a["gci"] is not None and b["gci"] is not None, key
            # each GCI bounds the relative error of its fine value: the two bands must overlap
            assert abs(fb - fa) <= a["gci"] * abs(fa) + b["gci"] * abs(fb), (key, fa, fb, a["gci"], b["gci"])


@pytest.mark.parametrize("exponent", [-30, 9])
def test_a_keyed_section_at_any_scale_runs_and_gives_the_same_factor(tmp_path, run_cli, exponent):
    """Issue: a keyed section scaled to 1e-30 mm ended in a gmsh traceback ("Could not create circle
    arc"): the cut-connectivity test and the elementary-shear cut built the section in metres, where
    OpenCASCADE's absolute tolerances fail. Both now build it in the scale-free frame, as the mesher
    does. Kts is dimensionless and J scales with the fourth power of the size (elementary torsion,
    dimensional analysis): at 1e-30 and 1e9 times the size they agree with the unscaled run within the
    two runs' error estimates."""
    k = 10.0**exponent
    scaled = (KEYED_MM.replace("38.1", repr(38.1 * k)).replace("9.525", repr(9.525 * k))
              .replace("4.7625", repr(4.7625 * k)).replace("0.508", repr(0.508 * k)))
    scaled = scaled.replace("[loads]", "[loads]\nshear = [\"0 N\", \"1000 N\"]").replace(
        "[material]\n", "[material]\npoisson = 0.3\n")
    plain = KEYED_MM.replace("[loads]", "[loads]\nshear = [\"0 N\", \"1000 N\"]").replace(
        "[material]\n", "[material]\npoisson = 0.3\n")
    res = {}
    for name, text in (("plain", plain), ("scaled", scaled)):
        (tmp_path / f"{name}.toml").write_text(text)
        code, _, err = run_cli("run", "--no-report", str(tmp_path / f"{name}.toml"), "--out", str(tmp_path / name),
                               "--no-vtu", "--quiet")
        assert code == 0 and "Traceback" not in err, err
        res[name] = json.loads((tmp_path / name / "results.json").read_text())
    a, b = res["plain"], res["scaled"]
    ga, gb = a["convergence"]["tau_max"]["gci"], b["convergence"]["tau_max"]["gci"]
    assert abs(b["torsion"]["kts"] - a["torsion"]["kts"]) <= ga * a["torsion"]["kts"] + gb * b["torsion"]["kts"]
    Ja, Jb = a["torsion"]["J"], b["torsion"]["J"] / k**4
    ja, jb = a["convergence"]["J"]["gci"], b["convergence"]["J"]["gci"]
    assert abs(Jb - Ja) <= ja * Ja + jb * Jb

"""Combined stress, static and fatigue checks, material choice (compare.checks.combined,
compare.checks.checks, compare.checks.materials), run in-process: analyse(case), combined_step(a),
build_results(a).

Every check against an outside value names its source beside it."""
import copy
import inspect
import math
import sys
from pathlib import Path

import numpy as np
import pytest

from classic import fatigue as cf
from compare.case.case import load_case, parse_case
from compare.checks import combined as cb
from compare.checks.materials import read_table
from compare.checks.step import combined_step
from compare.output.report import Fmt
from compare.output.report_combined import combined_lines, governing_line
from compare.output.results import build_results
from compare.pipeline import analyse
from fem.errors import InputError

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

ROOT = Path(__file__).resolve().parents[1]
LBF, INCH = 4.4482216152605, 0.0254      # N per lbf, m per in (exact definitions)
PSI = LBF / INCH**2
KPSI = 1e3 * PSI
LBF_IN = LBF * INCH
# rel 5e-3: the default mesh reads boundary stresses of a round bar to about 0.08 % here (measured);
# the project's default target for peak stresses is 1 %
TOL_FE = 5e-3


def _analyse(case):
    # without the accuracy study when analyse() offers one: these tests check the combination, not the mesh
    kw = {"study": False} if "study" in inspect.signature(analyse).parameters else {}
    return analyse(case, **kw)


def solve(text_or_dict):
    data = tomllib.loads(text_or_dict) if isinstance(text_or_dict, str) else text_or_dict
    a = _analyse(parse_case(data))
    combined_step(a)
    return a, build_results(a)


def rerun(a, **loads):
    """Same section and mesh, other loads (the unit fields do not depend on the loads); the case's
    loads are put back afterwards (the analyses are shared by the tests of this module)."""
    saved = copy.deepcopy(a.case.loads)
    try:
        for k, v in loads.items():
            setattr(a.case.loads, k, v)
        a.extra = {k: v for k, v in a.extra.items() if k not in ("combined", "static", "fatigue", "materials", "governing")}
        combined_step(a)
        return build_results(a)
    finally:
        a.case.loads = saved


def nearest_boundary(fld, x, y):
    d = np.hypot(fld.xy[0] - x, fld.xy[1] - y)
    d[~fld.on_boundary] = np.inf
    return int(np.argmin(d))


ROUND = """
[case]
units = "mm-N-MPa"
[section]
shape = "round"
diameter = 30
[loads]
bending = ["200 N*m", 0]
torque = "150 N*m"
shear = [0, "5 kN"]
[material]
elastic_modulus = "200 GPa"
poisson = 0.3
yield = 400
ultimate = 600
"""

KEYED = """
[case]
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 30
[[section.keyways]]
width = 8
depth = 4
fillet = 0.4
angle = 90
[loads]
rotating = true
bending = ["150 N*m", 0]
torque = "200 N*m"
shear = [0, "-3 kN"]
[material]
elastic_modulus = "205 GPa"
poisson = 0.29
yield = 450
ultimate = 650
surface = "machined"
reliability = 0.99
[analysis]
design_factor = 1.5
"""


@pytest.fixture(scope="module")
def round_bar():
    return solve(ROUND)


@pytest.fixture(scope="module")
def keyed():
    return solve(KEYED)


# ------------------------------------------------------------------ round bar: FE path = hand formulas

def test_round_bar_extreme_fibre_and_neutral_axis(round_bar):
    a, _ = round_bar
    fld, cyc = cb.build_field(a), cb.load_cycle(a.case)
    sg, tx, ty = fld.stress(cyc.mean)
    d, M, T, V, nu = 0.03, 200.0, 150.0, 5000.0, 0.3
    A = math.pi * d**2 / 4
    # extreme fibre (0, R): σ = 32M/(πd³) (Mc/I, any strength-of-materials text), τ = 16T/(πd³)
    # (elementary torsion), and the exact flexure stress vanishes there (Timoshenko & Goodier,
    # Theory of Elasticity, 3rd ed., §120)
    i = nearest_boundary(fld, 0.0, d / 2)
    r = math.hypot(*fld.xy[:, i])
    sig_h = 32 * M / (math.pi * d**3) * fld.xy[1, i] / (d / 2)
    tau_h = 16 * T / (math.pi * d**3) * r / (d / 2)
    assert sg[i] == pytest.approx(sig_h, rel=TOL_FE)
    assert math.hypot(tx[i], ty[i]) == pytest.approx(tau_h, rel=TOL_FE)
    # Mohr's circle of the shaft state (Shigley 9th ed., Sec. 3-6): centre σ/2, radius √((σ/2)² + τ²)
    rep = cb.stress_report(float(sg[i]), float(tx[i]), float(ty[i]))
    R_h = math.hypot(sig_h / 2, tau_h)
    assert rep["mohr"]["centre"] == pytest.approx(sig_h / 2, rel=TOL_FE)
    assert rep["mohr"]["radius"] == pytest.approx(R_h, rel=TOL_FE)
    assert rep["sigma1"] == pytest.approx(sig_h / 2 + R_h, rel=TOL_FE)
    assert rep["sigma3"] == pytest.approx(sig_h / 2 - R_h, rel=TOL_FE)
    assert rep["sigma2"] == 0.0
    assert rep["von_mises"] == pytest.approx(math.sqrt(sig_h**2 + 3 * tau_h**2), rel=TOL_FE)
    assert rep["tresca"] == pytest.approx(2 * R_h, rel=TOL_FE)
    # neutral axis (R, 0): σ = 0; torsion plus the exact flexure surface value (1+2ν)/(1+ν)·V/A, both
    # along +y there (Timoshenko & Goodier 3rd ed. §120: 1.231 V/A at ν = 0.3)
    j = nearest_boundary(fld, d / 2, 0.0)
    assert abs(sg[j]) < 1e-6 * sig_h
    tau_na = 16 * T / (math.pi * d**3) + (1 + 2 * nu) / (1 + nu) * V / A
    assert ty[j] == pytest.approx(tau_na, rel=TOL_FE)
    rep = cb.stress_report(float(sg[j]), float(tx[j]), float(ty[j]))
    # pure shear: Mohr's circle about the origin, σ1 = τ at 45° (Shigley 9th ed., Sec. 3-6)
    assert rep["sigma1"] == pytest.approx(tau_na, rel=TOL_FE)
    assert rep["sigma3"] == pytest.approx(-tau_na, rel=TOL_FE)
    assert rep["angle_deg"] == pytest.approx(45.0, abs=1e-3)
    assert rep["mohr"]["centre"] == pytest.approx(0.0, abs=1e-6 * tau_na)


def test_principal_stresses_agree_with_the_general_eigen_solve():
    # the shaft form (one σ, one resultant τ) against the 3-D eigenvalues (Shigley 9th ed., eq. 3-15)
    from classic import stress as cs

    for sig, tx, ty in ((80e6, -30e6, 10e6), (-50e6, 0.0, 45e6), (0.0, 0.0, 0.0), (10e6, 0.0, 0.0)):
        rep = cb.stress_report(sig, tx, ty)
        s = cs.principal_stresses(0.0, 0.0, sig, 0.0, ty, tx)
        scale = abs(sig) + math.hypot(tx, ty) + 1.0
        for got, want in zip((rep["sigma1"], rep["sigma2"], rep["sigma3"]), s):
            assert abs(got - want) <= 1e-9 * scale  # round-off only
        # the three principal directions are orthonormal
        D = np.array([rep["directions"][k] for k in ("sigma1", "sigma2", "sigma3")])
        assert np.allclose(D @ D.T, np.eye(3), atol=1e-12)


def test_round_bar_von_mises_max_and_the_fe_path_equals_the_hand_path(round_bar):
    a, _ = round_bar
    d, M, T = 0.03, 200.0, 150.0
    # bending and torque only: the largest von Mises stress is at the extreme fibre,
    # √(σ² + 3τ²) with σ = 32M/(πd³), τ = 16T/(πd³) (Shigley 9th ed., eq. 7-15)
    res = rerun(a, shear=None, rotating=True, alternating={}, mean={})
    sig, tau = 32 * M / (math.pi * d**3), 16 * T / (math.pi * d**3)
    c = res["combined"]
    assert c["von_mises_max"] == pytest.approx(math.sqrt(sig**2 + 3 * tau**2), rel=TOL_FE)
    # rotating: fully reversed, the largest tension and compression are equal
    assert c["sigma1_max"] == pytest.approx(sig / 2 + math.hypot(sig / 2, tau), rel=TOL_FE)
    assert c["sigma3_min"] == pytest.approx(-(sig / 2 + math.hypot(sig / 2, tau)), rel=TOL_FE)
    # plain round, no notch: the FE local stresses are the nominal ones, so the FE path's factors
    # equal the hand path's (Shigley 9th ed., eqs. 7-7 to 7-16) to the FE accuracy
    a.case.material.surface = "machined"
    try:
        res = rerun(a, shear=None, rotating=True, alternating={}, mean={})
    finally:
        a.case.material.surface = None
    ft = res["fatigue"]
    assert ft["hand"]["Kf"] == 1.0 and ft["hand"]["Kfs"] == 1.0
    for k in ("goodman", "gerber", "asme_elliptic", "soderberg", "yield_langer"):
        assert ft[k] == pytest.approx(ft["hand"][k], rel=TOL_FE), k
    assert ft["first_cycle_yield_von_mises"] == pytest.approx(ft["hand"]["first_cycle_yield"], rel=TOL_FE)


# ------------------------------------------------------------------ Shigley's worked shaft example

EX71 = """
[case]
units = "in-lbf-ksi"
[section]
shape = "round"
diameter = 1.1
[loads]
rotating = true
bending = ["1260 lbf*in", 0]
torque = "1100 lbf*in"
[material]
elastic_modulus = "30e6 psi"
poisson = 0.3
yield = 82
ultimate = 105
endurance_limit = 29.3
[fatigue]
kt_bending = 1.68
kt_bending_source = "Shigley 9th ed., Example 7-1 (shoulder fillet chart, Fig. A-15-9)"
kts_torsion = 1.42
kts_torsion_source = "Shigley 9th ed., Example 7-1 (shoulder fillet chart, Fig. A-15-8)"
notch_radius = "0.11 in"
"""


def test_hand_path_reproduces_shigley_example_7_1():
    # Shigley's Mechanical Engineering Design, 9th ed., Example 7-1 (p. 371): Kf 1.58, Kfs 1.37,
    # Ma 1260 lbf·in, Tm 1100 lbf·in, d 1.1 in, Se 29.3, Sut 105, Sy 82 kpsi -> n = 1.63 (Goodman),
    # 1.87 (Gerber), 1.88 (ASME elliptic), 1.56 (Soderberg); first-cycle yield ny = 4.50
    # (Shigley, Mechanical Engineering Design, 9th ed., Example 7-1). The shoulder is a 3-D feature, so its chart Kt, Kts are given.
    _, res = solve(EX71)
    h = res["fatigue"]["hand"]
    assert round(h["q"], 2) == 0.85 and round(h["qs"], 2) == 0.88  # Example 7-1 (from memory)
    assert round(h["Kf"], 2) == 1.58 and round(h["Kfs"], 2) == 1.37
    assert h["Ma"] == pytest.approx(1260 * LBF_IN, rel=1e-12) and h["Mm"] == 0.0  # rotating: fully reversed
    assert h["Tm"] == pytest.approx(1100 * LBF_IN, rel=1e-12) and h["Ta"] == 0.0
    assert round(h["goodman"], 2) == 1.63
    assert round(h["soderberg"], 2) == 1.56
    assert round(h["first_cycle_yield"], 2) == 4.50
    # Gerber and ASME elliptic: the printed inputs give 1.863 and 1.872 where the book prints 1.87
    # and 1.88 (see classic/fatigue.py); abs 0.01 = one unit of the printed last digit
    assert h["gerber"] == pytest.approx(1.87, abs=0.01)
    assert h["asme_elliptic"] == pytest.approx(1.88, abs=0.01)
    assert round(h["yield_langer"], 2) == 3.25  # Example 7-1, the Langer line (from memory)
    assert "Example 7-1" in h["Kt_source"] and "Example 7-1" in h["Kts_source"]


def test_marin_factors_example_7_1_through_the_case():
    # Shigley 9th ed., Example 7-1: machined, Sut = 105 kpsi, d = 1.1 in, 99 % reliability:
    # ka = 0.787, kb = 0.870 (from memory), ke = 0.814 (Table 6-5), printed Se = 29.3 kpsi
    text = EX71.replace("endurance_limit = 29.3\n", 'surface = "machined"\nreliability = 0.99\n')
    _, res = solve(text)
    ft = res["fatigue"]
    f = ft["factors"]
    # SI inside: Table 6-2's MPa column (4.51·724^-0.265 = 0.7877); the book used the kpsi column
    # (0.787). The columns are one fit rounded two ways (classic.fatigue.surface_factor): rel 2e-3
    assert f["ka"]["value"] == pytest.approx(0.787, rel=2e-3)
    # likewise eq. 6-20's mm form at 27.94 mm (0.868) against the inch form the book used (0.870):
    # one fit rounded two ways (tests/test_classic_fatigue.py holds them within 0.5 %)
    assert f["kb"]["value"] == pytest.approx(0.870, rel=3e-3)
    assert f["ke"]["value"] == 0.814
    assert f["kc"]["value"] == 1.0 and f["kd"]["value"] == 1.0 and f["kf"]["value"] == 1.0
    assert "not given" in f["kd"]["source"]  # an assumed factor says so
    assert ft["Se_prime"] == pytest.approx(52.5 * KPSI, rel=1e-12)  # eq. 6-8: 0.5·Sut
    # the book multiplies the factors rounded to three decimals; with the SI columns the chain gives
    # 29.23 kpsi: rel 5e-3 covers the two column roundings above
    assert ft["Se"] / KPSI == pytest.approx(29.3, rel=5e-3)
    assert all("9th ed." in v["source"] or "not given" in v["source"] or "no miscellaneous" in v["source"]
               for v in f.values())


def test_marin_surface_reliability_and_temperature_factors(round_bar):
    a, _ = round_bar
    m = a.case.material
    saved = copy.copy(m)
    try:
        # Shigley 9th ed., Example 6-3: machined steel, Sut = 520 MPa -> ka = 4.51·520^-0.265 = 0.860
        m.ultimate, m.surface = 520e6, "machined"
        res = rerun(a)
        assert round(res["fatigue"]["factors"]["ka"]["value"], 3) == 0.860
        # a reliability not in Table 6-5: eq. 6-29, ke = 1 − 0.08·z_a, z_a = 2.5758 at 99.5 %
        # (standard normal quantile); it lies between the table's 0.814 (99 %) and 0.753 (99.9 %)
        m.reliability = 0.995
        res = rerun(a)
        ke = res["fatigue"]["factors"]["ke"]
        assert ke["value"] == pytest.approx(1 - 0.08 * 2.5758293, rel=1e-6) and "eq. 6-29" in ke["source"]
        # Shigley 9th ed., Example 6-5 (from memory): 450 °F gives kd = 1.007 (eq. 6-27)
        m.temperature = (450.0 - 32.0) / 1.8
        res = rerun(a)
        assert round(res["fatigue"]["factors"]["kd"]["value"], 3) == 1.007
        # the endurance limit given directly is used as is, with no Marin factor
        m.endurance_limit = 200e6
        res = rerun(a)
        assert res["fatigue"]["Se"] == 200e6 and res["fatigue"]["factors"] == {}
    finally:
        a.case.material = saved


# ------------------------------------------------------------------ keyed shaft

def test_keyed_shaft_governing_point_sits_at_the_keyway_fillet(keyed):
    # a keyseat's bottom fillet is the stress raiser of a keyed seat (Peterson's charts locate the
    # peak there; common practice): the scan, not an assumption, must find it
    a, res = keyed
    gov = res["governing"]
    assert gov["where"]["feature"] == "fillet" and gov["where"]["keyway"] == 1
    assert gov["where"]["radius"] == pytest.approx(0.0004, rel=1e-6)
    vm = next(p for p in res["combined"]["points"] if p["criterion"] == "von_mises")
    assert vm["where"]["feature"] == "fillet"
    for k in res["fatigue"]["criteria"]:
        assert res["fatigue"]["fe"][k]["where"]["feature"] == "fillet", k
    assert gov["factor"] == min(v for v in _all_factors(res))
    assert gov["text"] and "fillet" in gov["text"]
    # 2-D bending ratio of a keyed section: above 1 (second moment lost), far below the 3-D
    # keyseat-end chart value 2.14 (Shigley, Mechanical Engineering Design, 9th ed., Table 7-1)
    kt = res["combined"]["kt_bending_2d"]["value"]
    assert 1.0 < kt < 1.5
    assert "2-D" in res["fatigue"]["hand"]["Kt_source"]


def _all_factors(res):
    out = [res["static"][k] for k in res["static"]["criteria"]]
    out += [res["fatigue"][k] for k in res["fatigue"]["criteria"]]
    h = res["fatigue"]["hand"]
    out += [h[k] for k in ("goodman", "gerber", "asme_elliptic", "soderberg", "yield_langer", "first_cycle_yield") if k in h]
    return out


def test_rotating_shaft_bending_is_fully_reversed_at_every_point(keyed):
    a, _ = keyed
    case = copy.deepcopy(a.case)
    case.loads.torque, case.loads.shear = 0.0, None
    fld, cyc = cb.build_field(a), cb.load_cycle(case)
    # in the section frame the fixed bending vector turns: mean 0, fully reversed (Shigley 9th ed.,
    # Sec. 7-4: rotating shaft, steady bending -> Mm = 0, Ma = M)
    assert not np.any(cyc.mean[1:3]) and cyc.rotating
    fs = cb.fatigue_stresses(fld, cyc, 0.85)
    assert np.all(fs.sm == 0.0)
    amp = 150.0 * np.hypot(fld.S[1], fld.S[2])  # amplitude of A cos ψ + B sin ψ
    assert fs.sa == pytest.approx(amp, rel=1e-12)  # closed form, round-off only
    # over a turn every point sees +amp and −amp: the largest tension equals the largest compression,
    # though the keyed section is not symmetric about its centroidal x axis
    w1 = cb.worst_over_cycle(fld, cyc, "sigma1")
    w3 = cb.worst_over_cycle(fld, cyc, "sigma3")
    ok = ~fld.excluded
    assert w1.value[ok].max() == pytest.approx(w3.value[ok].max(), rel=1e-12)
    assert w1.value[ok].max() == pytest.approx(amp[ok].max(), rel=1e-12)
    # the same bending not rotating: tension and compression peaks differ (the neutral axis is shifted)
    case.loads.rotating = False
    cyc2 = cb.load_cycle(case)
    s = fld.stress(cyc2.mean)[0][ok]
    assert s.max() != pytest.approx(-s.min(), rel=1e-3)


def test_rotating_scan_with_shear_matches_a_dense_brute_force(keyed):
    # independent check of the closed form + bounded scan: every point, every 1° of shaft angle
    a, _ = keyed
    fld, cyc = cb.build_field(a), cb.load_cycle(a.case)
    assert cyc.rotating_shear
    A, B, C, D = cb._rot_parts(fld, cyc)
    psi = np.linspace(0, 2 * np.pi, 361)
    ok = np.flatnonzero(~fld.excluded)
    # the brittle criteria too, with Suc > 2·Sut and Suc < 2·Sut (the sign of a bound's σ term flips)
    cases = [(name, None) for name in cb.STRESS_MEASURES]
    cases += [(name, {"Sut": Sut, "Suc": Suc}) for name in ("coulomb_mohr", "modified_mohr")
              for Sut, Suc in ((200e6, 700e6), (300e6, 400e6))]
    for name, strengths in cases:
        w = cb.worst_over_cycle(fld, cyc, name, strengths)
        brute = -np.inf
        for _, L in cyc.corners():
            sf, tx, ty = fld.stress(L)
            for ch in np.array_split(ok, 8):
                sig, tau = cb._state(sf[ch, None], tx[ch, None], ty[ch, None], A[ch, None], B[ch, None],
                                     (C[0][ch, None], C[1][ch, None]), (D[0][ch, None], D[1][ch, None]), psi[None, :])
                brute = max(brute, float(_reference_measure(name, sig, tau, strengths).max()))
        best = w.value[w.best(~fld.excluded)]
        # a 1° grid reads a peak low by about (0.5° in rad)²/2 · 4 (second harmonic) < 2e-4; the scan
        # is refined, so it must be at least the grid's value and within that of it
        assert best >= brute * (1 - 1e-12), (name, strengths)
        assert best == pytest.approx(brute, rel=2e-4), (name, strengths)


def _reference_measure(name, sig, tau, st):
    """Written out independently of compare.checks.combined.measure, for the shaft state s1 >= 0 = s2 >= s3."""
    R = np.sqrt(sig**2 / 4 + tau**2)
    s1, s3 = sig / 2 + R, sig / 2 - R
    if name == "von_mises":
        return np.sqrt(sig**2 + 3 * tau**2)  # Shigley 9th ed., eq. 5-15
    if name == "tresca":
        return s1 - s3  # eq. 5-1
    if name == "sigma1":
        return s1
    if name == "sigma3":
        return -s3
    Sut, Suc = st["Sut"], st["Suc"]
    if name == "coulomb_mohr":
        return s1 / Sut - s3 / Suc  # eq. 5-31b, the branch s1 >= 0 >= s3
    # modified Mohr, eqs. 5-32a/b for s1 >= 0
    return np.where(s3 >= -s1, s1 / Sut, (Suc - Sut) * s1 / (Suc * Sut) - s3 / Suc)


def test_results_are_invariant_to_the_unit_system():
    # the same keyed shaft and loads in mm-N-MPa and in-lbf-psi (1.125 in shaft, 1/4 in keyway,
    # 1/8 in deep, 1/64 in fillet; values converted with 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N)
    def text(units, L, F, S):
        Lf = lambda v: repr(v / L)  # noqa: E731
        return f"""
[case]
units = "{units}"
[section]
shape = "keyed"
diameter = {Lf(0.028575)}
[[section.keyways]]
width = {Lf(0.00635)}
depth = {Lf(0.003175)}
fillet = {Lf(0.000396875)}
[loads]
rotating = true
bending = [{repr(90.0 / (F * L))}, {repr(-40.0 / (F * L))}]
torque = {repr(120.0 / (F * L))}
torque_alternating = {repr(15.0 / (F * L))}
shear = [{repr(800.0 / F)}, {repr(-1500.0 / F)}]
[material]
shear_modulus = {repr(80e9 / S)}
poisson = 0.3
yield = {repr(500e6 / S)}
ultimate = {repr(700e6 / S)}
surface = "ground"
[analysis]
design_factor = 1.6
"""
    _, mm = solve(text("mm-N-MPa", 1e-3, 1.0, 1e6))
    _, inch = solve(text("in-lbf-psi", INCH, LBF, PSI))
    rel = 1e-6  # unit conversion round-off; the meshes of the two are the same geometry in SI
    for k in ("von_mises_max", "sigma1_max", "sigma3_min", "tau_abs_max"):
        assert inch["combined"][k] == pytest.approx(mm["combined"][k], rel=rel), k
    for k in mm["static"]["criteria"]:
        assert inch["static"][k] == pytest.approx(mm["static"][k], rel=rel), k
    for k in mm["fatigue"]["criteria"]:
        assert inch["fatigue"][k] == pytest.approx(mm["fatigue"][k], rel=rel), k
        assert inch["fatigue"]["hand"][k] == pytest.approx(mm["fatigue"]["hand"][k], rel=rel), k
    assert inch["fatigue"]["Se"] == pytest.approx(mm["fatigue"]["Se"], rel=rel)
    assert inch["governing"]["factor"] == pytest.approx(mm["governing"]["factor"], rel=rel)
    assert inch["governing"]["criterion"] == mm["governing"]["criterion"]


def test_non_rotating_alternating_corners_are_the_worst_instant(round_bar):
    # torque 150 N·m steady with ±60 N·m, bending mean 200 N·m with ±80 N·m: the worst instant of an
    # unknown phase is a corner, here M = 280, T = 210 N·m: √(σ² + 3τ²) at the extreme fibre
    # (Shigley 9th ed., eq. 7-15 takes Mm + Ma and Tm + Ta the same way)
    a, _ = round_bar
    loads = dict(shear=None, rotating=False, mean={}, alternating={"torque": 60.0, "bending": (80.0, 0.0)})
    res = rerun(a, **loads)
    d = 0.03
    k_s, k_t = 32 / (math.pi * d**3), 16 / (math.pi * d**3)
    vm_peak = math.hypot(280 * k_s, math.sqrt(3) * 210 * k_t)
    assert res["combined"]["von_mises_max"] == pytest.approx(vm_peak, rel=TOL_FE)
    # static yield, von Mises (Shigley 9th ed., eq. 5-19): n = Sy/σ'
    assert res["static"]["von_mises"] == pytest.approx(400e6 / vm_peak, rel=TOL_FE)
    # no surface finish and no endurance limit: fatigue is skipped, and says why
    assert "material.surface" in res["combined"]["skipped"]["fatigue"]
    # with Se given: σa' = √((32Ma/πd³)² + 3(16Ta/πd³)²), σm' likewise (Shigley 9th ed., eqs. 7-5,
    # 7-6), both largest at the extreme fibre; DE-Goodman 1/n = σa'/Se + σm'/Sut (eq. 7-7)
    a.case.material.endurance_limit = 250e6
    try:
        res = rerun(a, **loads)
    finally:
        a.case.material.endurance_limit = None
    sa, sm = math.hypot(80 * k_s, math.sqrt(3) * 60 * k_t), math.hypot(200 * k_s, math.sqrt(3) * 150 * k_t)
    ft = res["fatigue"]
    assert ft["fe"]["goodman"]["sigma_a_vm"] == pytest.approx(sa, rel=TOL_FE)
    assert ft["fe"]["goodman"]["sigma_m_vm"] == pytest.approx(sm, rel=TOL_FE)
    assert ft["goodman"] == pytest.approx(1 / (sa / 250e6 + sm / 600e6), rel=TOL_FE)
    assert ft["hand"]["goodman"] == pytest.approx(1 / (sa / 250e6 + sm / 600e6), rel=1e-12)  # the same formula
    assert ft["yield_langer"] == pytest.approx(400e6 / (sa + sm), rel=TOL_FE)  # eq. 6-49


# ------------------------------------------------------------------ static criteria, brittle materials

def test_brittle_round_bar_in_torsion_coulomb_mohr_and_modified_mohr(round_bar):
    # pure torsion τ: Coulomb–Mohr predicts failure at τ = Sut·Suc/(Sut + Suc), modified Mohr at
    # τ = Sut (Shigley 9th ed., Sec. 5-9, from memory; classic.stress doctests)
    a, _ = round_bar
    m = a.case.material
    saved = copy.copy(m)
    try:
        m.kind, m.yield_strength, m.ultimate, m.compressive_ultimate = "brittle", None, 200e6, 700e6
        a.case.analysis.design_factor = 2.0
        res = rerun(a, shear=None, bending=(0.0, 0.0), rotating=False, mean={}, alternating={})
        tau = 16 * 150 / (math.pi * 0.03**3)
        st = res["static"]
        assert set(st["criteria"]) == {"coulomb_mohr", "modified_mohr"}
        assert st["coulomb_mohr"] == pytest.approx(200e6 * 700e6 / 900e6 / tau, rel=TOL_FE)
        assert st["modified_mohr"] == pytest.approx(200e6 / tau, rel=TOL_FE)
        assert "brittle" in st["skipped"]["von_mises"]
        req = st["required_strength"]["ultimate_coulomb_mohr"]
        assert req["ultimate"] == pytest.approx(200e6 * 2.0 / st["coulomb_mohr"], rel=1e-12)  # definition
        assert "skipped" in res["fatigue"] and "brittle" in res["fatigue"]["skipped"]
        assert res["governing"]["criterion"] == "coulomb_mohr"  # the smaller of the two here
    finally:
        a.case.material = saved
        a.case.analysis.design_factor = None


def test_required_strength_for_the_design_factor(keyed):
    _, res = keyed
    st = res["static"]
    # n = Sy/σ' (Shigley 9th ed., eq. 5-19), so Sy needed for nd is nd·σ'
    assert st["required_strength"]["yield_von_mises"] == pytest.approx(1.5 * res["combined"]["von_mises_max"], rel=1e-12)
    assert st["required_strength"]["yield_tresca"] == pytest.approx(1.5 * 2 * res["combined"]["tau_abs_max"], rel=1e-12)
    # the endurance limit Goodman needs: 1/nd = σa'/Se + σm'/Sut (Shigley 9th ed., eq. 6-46) at its point
    g = res["fatigue"]["fe"]["goodman"]
    Se_req = res["fatigue"]["required_endurance_limit"]["goodman"]
    assert 1 / 1.5 == pytest.approx(g["sigma_a_vm"] / Se_req + g["sigma_m_vm"] / 650e6, rel=1e-12)
    assert cf.goodman_factor(g["sigma_a_vm"], g["sigma_m_vm"], Se_req, 650e6) == pytest.approx(1.5, rel=1e-12)


# ------------------------------------------------------------------ data missing: skip, say why

def test_torque_only_case_without_strengths_skips_and_says_why():
    text = """
[case]
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 25
[[section.keyways]]
width = 8
depth = 4
fillet = 0.4
[loads]
torque = "100 N*m"
[material]
shear_modulus = "79 GPa"
"""
    a, res = solve(text)
    c = res["combined"]
    # pure torsion: σ = 0, so von Mises = √3·τmax and Tresca = 2·τmax (Shigley 9th ed., eqs. 5-15, 5-1)
    assert c["von_mises_max"] == pytest.approx(math.sqrt(3) * res["torsion"]["tau_max"], rel=1e-9)
    assert c["tau_abs_max"] == pytest.approx(res["torsion"]["tau_max"], rel=1e-9)
    assert res["static"]["criteria"] == []
    assert "material.yield" in c["skipped"]["static.von_mises"]
    assert "skipped" in res["fatigue"]
    assert "governing" not in res and "governing" in c["skipped"]
    assert any("transverse-shear" in n for n in c["notes"])  # no Poisson's ratio: no shear field
    lines = combined_lines(res, Fmt(a.case.units))
    assert lines[0].startswith("Combined stress") and any("Skipped" in x for x in lines)
    assert governing_line(res) is None


def test_sharp_corners_are_excluded_from_the_maxima():
    text = KEYED.replace("fillet = 0.4\n", "")
    a, res = solve(text)
    c = res["combined"]
    assert c["read_points"]["excluded_near_sharp_corners"] > 0
    from fem.torsion import SINGULAR_RADIUS

    rho = SINGULAR_RADIUS * a.case.section.length_scale
    corners = a.torsion.singular_corners
    for p in c["points"]:
        assert min(math.hypot(p["at"][0] - x, p["at"][1] - y) for x, y in corners) >= rho * (1 - 1e-9)
    assert "skipped" in res["fatigue"]["hand"] and "sharp" in res["fatigue"]["hand"]["skipped"]


# ------------------------------------------------------------------ material table

def test_demo_table_is_labelled_illustrative():
    head, rows = read_table(ROOT / "cases" / "materials_demo.toml")
    assert head["illustrative"] is True
    assert all("(illustrative)" in m.name for m, _ in rows)
    text = (ROOT / "cases" / "materials_demo.toml").read_text()
    assert "INVENTED" in text and "ILLUSTRATIVE" in text


def test_material_ranking_by_margin(keyed, tmp_path):
    a, _ = keyed
    table = tmp_path / "t.toml"
    table.write_text("""
[table]
units = "mm-N-MPa"
illustrative = true
[[material]]
name = "weak steel (illustrative)"
class = "steel"
yield = 250
ultimate = 420
[[material]]
name = "strong steel (illustrative)"
class = "steel"
yield = 900
ultimate = 1100
surface = "ground"
[[material]]
name = "polymer (illustrative)"
class = "polymer"
yield = 60
ultimate = 70
""")
    a.case.analysis.materials = str(table)
    try:
        res = rerun(a)
    finally:
        a.case.analysis.materials = None
    mats = res["materials"]
    assert [e["name"] for e in mats] == ["strong steel (illustrative)", "weak steel (illustrative)", "polymer (illustrative)"]
    strong, weak, poly = mats
    assert strong["meets"] is True and weak["meets"] is False
    assert strong["margin"] == pytest.approx(strong["factor"] / 1.5, rel=1e-12)
    # the static yield factor scales with Sy (Shigley 9th ed., eq. 5-19): same stress field for every row
    assert strong["factors"]["von_mises"] / weak["factors"]["von_mises"] == pytest.approx(900 / 250, rel=1e-12)
    # the case's material (Sy 450) gives the case's own static factor
    assert res["static"]["von_mises"] == pytest.approx(weak["factors"]["von_mises"] * 450 / 250, rel=1e-12)
    assert poly["complete"] is False and poly["meets"] is None
    assert any("moisture" in x for x in poly["not_checked"])
    assert all("wear" in " ".join(e["not_checked"]) for e in mats)


def test_material_table_errors_name_the_field(tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text('[table]\nunits = "mm-N-MPa"\n[[material]]\nname = "x"\nyeild = 300\n')
    with pytest.raises(InputError) as e:
        read_table(bad)
    assert "material[0].yeild" in str(e.value) and "\n" not in str(e.value)
    bad.write_text('[table]\nunits = "mm-N-MPa"\n[[material]]\nname = "x"\nclass = "wood"\nyield = 30\n')
    with pytest.raises(InputError, match=r"material\[0\]\.class"):
        read_table(bad)
    bad.write_text('[[material]]\nname = "x"\nyield = 30\n')
    with pytest.raises(InputError, match=r"material\[0\]\.yield.*no unit"):
        read_table(bad)


# ------------------------------------------------------------------ case-file keys of this issue

BASE = {
    "case": {"units": "mm-N-MPa"},
    "section": {"shape": "round", "diameter": 25},
    "loads": {"torque": 1000},
    "material": {"shear_modulus": "79 GPa", "poisson": 0.3},
}


@pytest.mark.parametrize("change,field", [
    ({"loads": {"rotating": True, "bending": [10, 0], "bending_mean": [5, 0]}}, "loads.bending_mean"),
    ({"loads": {"rotating": True, "shear": [0, 5], "shear_alternating": [0, 1]}}, "loads.shear_alternating"),
    ({"fatigue": {"kt_bending": 2.0}}, "fatigue.kt_bending_source"),
    ({"fatigue": {"kt_bending": 0.8, "kt_bending_source": "chart"}}, "fatigue.kt_bending"),
    ({"fatigue": {"kts_torsion_source": "chart"}}, "fatigue.kts_torsion_source"),
    ({"fatigue": {"notch_radius": -1}}, "fatigue.notch_radius"),
    ({"fatigue": {"kt": 2}}, "fatigue.kt"),
])
def test_bad_fatigue_and_rotating_keys_are_named(change, field):
    d = copy.deepcopy(BASE)
    for k, v in change.items():
        d.setdefault(k, {}).update(v)
    with pytest.raises(InputError) as e:
        parse_case(d)
    assert e.value.field == field and "\n" not in str(e.value)


def test_a_vector_amplitude_may_point_anywhere():
    d = copy.deepcopy(BASE)
    d["loads"].update(bending=[100, 0], bending_alternating=[-30, 40])
    c = parse_case(d)
    cyc = cb.load_cycle(c)
    # mm-N-MPa: moments in N·mm
    assert np.allclose(cyc.alt["bending"][1:3], [-0.030, 0.040], rtol=1e-12)
    assert np.allclose(cyc.mean[1:3], [0.100, 0.0], rtol=1e-12)  # no bending_mean: the steady value is the mean


def test_demo_case_runs_in_process():
    a = _analyse(load_case(ROOT / "cases" / "conveyor_fatigue.toml"))
    combined_step(a)
    res = build_results(a)
    assert res["combined"]["loads"]["rotating"] is True
    assert res["materials"] and res["materials"][0]["illustrative"]
    assert res["governing"]["where"]["feature"] == "fillet"
    lines = combined_lines(res, Fmt(a.case.units))
    text = "\n".join(lines)
    for head in ("Combined stress", "Static check", "Fatigue", "Materials"):
        assert head in text
    assert "ILLUSTRATIVE" in text

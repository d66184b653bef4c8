"""Checks of classic.stress against exact results of elementary elasticity and textbook examples."""
import math
import warnings

import numpy as np
import pytest

from classic import stress
from classic._validity import OutOfRangeError

LBF_IN = 4.4482216152605 * 0.0254   # N*m per lbf*in (exact definitions)
INCH = 0.0254                       # m per in, exact
PSI = 4.4482216152605 / 0.0254**2   # Pa per psi


# --- nominal stresses ---------------------------------------------------------------------------

def test_bending_stress_round_example_7_1():
    # Shigley 9th ed., Example 7-1 (value from memory): Kf*Ma = 1.58*1260 lbf*in on d = 1.1 in
    # gives 15 235 psi. rel 5e-5: the book rounds to the psi.
    s = stress.bending_stress_round(1.58 * 1260 * LBF_IN, 1.1 * INCH)
    assert s / PSI == pytest.approx(15235.0, rel=5e-5)


def test_bending_stress_round_is_mc_over_i():
    # Any strength-of-materials text: sigma = M c / I with I = pi d^4/64, c = d/2 (exact).
    M, d = 850.0, 0.042
    assert stress.bending_stress_round(M, d) == pytest.approx(M * (d / 2) / (math.pi * d**4 / 64),
                                                              rel=1e-14)  # round-off only


def test_axial_stress_definition():
    # Definition of normal stress (any strength-of-materials text): 10 kN on 100 mm^2 = 100 MPa.
    assert stress.axial_stress(10e3, 100e-6) == pytest.approx(100e6, rel=1e-14)  # round-off


def test_nominal_stress_refusals_name_field():
    with pytest.raises(OutOfRangeError, match=r"^d = 0\.0: "):
        stress.bending_stress_round(100.0, 0.0)
    with pytest.raises(OutOfRangeError, match=r"^A = -1\.0: "):
        stress.axial_stress(100.0, -1.0)
    with pytest.raises(OutOfRangeError, match=r"^M = 'ten': is not a number$"):
        stress.bending_stress_round("ten", 0.05)


# --- unsymmetric bending ------------------------------------------------------------------------

def _rect_props(b, h, theta):
    """Centroidal Ixx=int y^2, Iyy=int x^2, Ixy=int xy of a b (along u) x h (along v) rectangle
    whose u axis is turned by theta from x. Exact transformation of second moments."""
    Iu = h * b**3 / 12.0   # int u^2 dA
    Iv = b * h**3 / 12.0   # int v^2 dA
    c, s = math.cos(theta), math.sin(theta)
    # x = u c - v s, y = u s + v c
    Iyy = Iu * c * c + Iv * s * s
    Ixx = Iu * s * s + Iv * c * c
    Ixy = (Iu - Iv) * c * s
    return Ixx, Iyy, Ixy


def test_unsymmetric_bending_rotated_rectangle_matches_principal_axes():
    # Exact Euler-Bernoulli result (any text): about principal axes u, v of a rectangle,
    # sigma = Mu v / Iv - Mv u / Iu (moment-vector components, right-handed). Describing the same
    # section, moment and point in axes turned by theta must give the same stress: this exercises
    # the Ixy terms and their signs.
    b, h = 0.03, 0.08
    Mu, Mv = 1200.0, -450.0
    u, v = 0.011, -0.027
    Iu, Iv = h * b**3 / 12.0, b * h**3 / 12.0
    expected = Mu * v / Iv - Mv * u / Iu
    for theta in (0.0, 0.3, 1.1, 2.5, -0.7):
        c, s = math.cos(theta), math.sin(theta)
        Ixx, Iyy, Ixy = _rect_props(b, h, theta)
        x, y = u * c - v * s, u * s + v * c
        Mx, My = Mu * c - Mv * s, Mu * s + Mv * c
        got = stress.unsymmetric_bending_stress(Mx, My, x, y, Ixx, Iyy, Ixy)
        assert got == pytest.approx(expected, rel=1e-12)  # exact up to round-off


def test_unsymmetric_bending_resultants_of_l_section():
    # Statics (definition of the stress resultants): for the field returned, int y*sigma dA = Mx
    # and -int x*sigma dA = My, with no axial force. Discretised L-section; the section properties
    # are computed with the same cells, so the identities hold to round-off.
    n = 120
    xs = (np.arange(n) + 0.5) / n * 0.06
    X, Y = np.meshgrid(xs, xs)
    inside = (X < 0.012) | (Y < 0.010)          # legs 12 mm and 10 mm thick, 60 mm long
    dA = (0.06 / n) ** 2
    x0, y0 = X[inside], Y[inside]
    A = dA * x0.size
    xc, yc = x0.sum() * dA / A, y0.sum() * dA / A
    x, y = x0 - xc, y0 - yc
    Ixx, Iyy, Ixy = (y * y).sum() * dA, (x * x).sum() * dA, (x * y).sum() * dA
    assert abs(Ixy) > 0.3 * math.sqrt(Ixx * Iyy)   # a truly unsymmetric section
    Mx, My = 340.0, -125.0
    s = stress.unsymmetric_bending_stress(Mx, My, x, y, Ixx, Iyy, Ixy)
    scale = abs(s).max() * A
    assert (s * dA).sum() == pytest.approx(0.0, abs=1e-12 * scale)   # no axial force
    assert (y * s * dA).sum() == pytest.approx(Mx, rel=1e-10)         # round-off
    assert (-x * s * dA).sum() == pytest.approx(My, rel=1e-10)        # round-off


def test_unsymmetric_bending_reduces_to_round_bar():
    # Shigley 9th ed., Sec. 3-10: sigma = Mc/I; for Mx alone the top fibre (+y) is in tension,
    # for My alone the +x fibre is in compression (right-handed moment vector).
    d, M = 0.05, 1000.0
    I = math.pi * d**4 / 64
    top = stress.unsymmetric_bending_stress(M, 0.0, 0.0, d / 2, I, I)
    side = stress.unsymmetric_bending_stress(0.0, M, d / 2, 0.0, I, I)
    assert top == pytest.approx(stress.bending_stress_round(M, d), rel=1e-14)   # round-off
    assert side == pytest.approx(-stress.bending_stress_round(M, d), rel=1e-14)  # round-off


def test_unsymmetric_bending_refuses_impossible_properties():
    with pytest.raises(OutOfRangeError, match=r"Ixy\^2/\(Ixx\*Iyy\)"):
        stress.unsymmetric_bending_stress(1.0, 0.0, 0.0, 0.01, 1e-8, 1e-8, 1e-8)
    with pytest.raises(OutOfRangeError, match=r"^Ixx = 0\.0"):
        stress.unsymmetric_bending_stress(1.0, 0.0, 0.0, 0.01, 0.0, 1e-8)


# --- principal stresses -------------------------------------------------------------------------

def test_principal_stresses_example_5_1b():
    # Shigley 9th ed., Example 5-1(b) (from memory): sigma_x = 30, sigma_y = 70, tau_xy = -30 kpsi
    # -> 86.1 and 13.9 kpsi (and 0). abs 0.05: printed to 0.1 kpsi.
    s1, s2, s3 = stress.principal_stresses(30.0, 70.0, 0.0, -30.0, 0.0, 0.0)
    assert s1 == pytest.approx(86.1, abs=0.05)
    assert s2 == pytest.approx(13.9, abs=0.05)
    assert s3 == pytest.approx(0.0, abs=1e-12)


def test_principal_stresses_exact_cases():
    # Exact eigenvalues: pure shear tau_xy = t -> (t, 0, -t); all three shears equal t ->
    # (2t, -t, -t); a diagonal tensor is its own principal state, sorted.
    t = 37.0
    assert stress.principal_stresses(0, 0, 0, t, 0, 0) == pytest.approx((t, 0.0, -t), abs=1e-12)
    assert stress.principal_stresses(0, 0, 0, t, t, t) == pytest.approx((2 * t, -t, -t), rel=1e-12)
    # rel=1e-12: exact formula, round-off only
    assert stress.principal_stresses(-5.0, 12.0, 3.0, 0, 0, 0) == \
        pytest.approx((12.0, 3.0, -5.0), rel=1e-12)


def test_principal_stresses_keep_the_invariants():
    # Definition (any elasticity text): I1, I2, I3 of the tensor equal the symmetric functions of
    # its principal stresses. Random tensors, vectorised call.
    rng = np.random.default_rng(7)
    c = rng.normal(scale=100.0, size=(6, 50))
    sx, sy, sz, txy, tyz, tzx = c
    s1, s2, s3 = stress.principal_stresses(sx, sy, sz, txy, tyz, tzx)
    assert np.all(s1 >= s2) and np.all(s2 >= s3)
    I1 = sx + sy + sz
    I2 = sx * sy + sy * sz + sz * sx - txy**2 - tyz**2 - tzx**2
    I3 = (sx * sy * sz + 2 * txy * tyz * tzx - sx * tyz**2 - sy * tzx**2 - sz * txy**2)
    scale = np.abs(c).max()
    assert np.allclose(s1 + s2 + s3, I1, atol=1e-10 * scale)              # round-off
    assert np.allclose(s1 * s2 + s2 * s3 + s3 * s1, I2, atol=1e-10 * scale**2)
    assert np.allclose(s1 * s2 * s3, I3, atol=1e-10 * scale**3)


# --- shaft Mohr circle --------------------------------------------------------------------------

def test_shaft_mohr_matches_3d_principal_stresses_and_direction():
    # Mohr's circle of the shaft state (Shigley 9th ed., Sec. 3-6) against the 3-D eigenproblem of
    # the same tensor; the angle is checked by T n = s1 n for n turned by theta from z towards the
    # resultant shear (exact).
    sig, tzx, tzy = 140.0, 30.0, -55.0
    m = stress.shaft_mohr(sig, tzx, tzy)
    s1, s2, s3 = stress.principal_stresses(0.0, 0.0, sig, 0.0, tzy, tzx)
    assert (m.s1, m.s2, m.s3) == pytest.approx((s1, s2, s3), abs=1e-10)
    assert m.centre == pytest.approx(sig / 2, rel=1e-12)  # exact; round-off
    assert m.radius == pytest.approx((m.s1 - m.s3) / 2, rel=1e-12)  # exact; round-off
    tau = math.hypot(tzx, tzy)
    e = np.array([tzx / tau, tzy / tau, 0.0])          # shear direction in the section plane
    n = math.sin(m.angle) * e + math.cos(m.angle) * np.array([0.0, 0.0, 1.0])
    T = np.array([[0, 0, tzx], [0, 0, tzy], [tzx, tzy, sig]], dtype=float)
    assert T @ n == pytest.approx(m.s1 * n, abs=1e-10)


def test_shaft_mohr_vectorised_and_compressive():
    sig = np.array([-80.0, 0.0, 80.0])
    m = stress.shaft_mohr(sig, np.array([20.0, 20.0, 20.0]), 0.0)
    assert m.s2.shape == (3,) and np.all(m.s2 == 0.0)
    assert np.all(m.s1 >= 0.0) and np.all(m.s3 <= 0.0)
    # pure shear (sigma = 0): s1 = tau, s3 = -tau, at 45 degrees (Shigley 9th ed., Sec. 3-6)
    # rel=1e-12: exact formula, round-off only
    assert m.s1[1] == pytest.approx(20.0, rel=1e-12) and m.s3[1] == pytest.approx(-20.0, rel=1e-12)
    assert m.angle[1] == pytest.approx(math.pi / 4, rel=1e-12)  # exact; round-off


# --- equivalent stresses and factors of safety --------------------------------------------------

def test_von_mises_three_forms_agree_and_exact_cases():
    # Shigley 9th ed., eqs. 5-12, 5-14, 5-15: the principal-stress, component and (sigma, tau)
    # forms are the same quantity. Uniaxial -> sigma; pure shear -> sqrt(3) tau (exact).
    sig, tau = 120.0, 45.0
    m = stress.shaft_mohr(sig, tau, 0.0)
    a = stress.von_mises(m.s1, m.s2, m.s3)
    b = stress.von_mises_tensor(0.0, 0.0, sig, 0.0, 0.0, tau)
    c = stress.von_mises_sigma_tau(sig, tau)
    assert a == pytest.approx(c, rel=1e-12) and b == pytest.approx(c, rel=1e-12)
    assert stress.von_mises(250.0, 0.0, 0.0) == pytest.approx(250.0, rel=1e-12)  # exact; round-off
    # rel=1e-12: exact formula, round-off only
    assert stress.von_mises_sigma_tau(0.0, 10.0) == pytest.approx(10.0 * math.sqrt(3), rel=1e-12)


def test_yield_factors_example_5_1():
    # Shigley 9th ed., Example 5-1 (from memory), Sy = 100 kpsi.
    # (a) sigma_x = sigma_y = 70 kpsi: both theories n = 1.43.
    vm = stress.von_mises_tensor(70.0, 70.0, 0.0, 0.0, 0.0, 0.0)
    s1, s2, s3 = stress.principal_stresses(70.0, 70.0, 0.0, 0.0, 0.0, 0.0)
    assert round(stress.yield_factor_von_mises(100.0, vm), 2) == 1.43
    assert round(stress.yield_factor_tresca(100.0, s1, s3), 2) == 1.43
    # (b) sigma_x = 30, sigma_y = 70, tau_xy = -30: DE n = 1.25, MSS n = 1.16.
    vm = stress.von_mises_tensor(30.0, 70.0, 0.0, -30.0, 0.0, 0.0)
    s1, s2, s3 = stress.principal_stresses(30.0, 70.0, 0.0, -30.0, 0.0, 0.0)
    assert round(stress.yield_factor_von_mises(100.0, vm), 2) == 1.25
    assert round(stress.yield_factor_tresca(100.0, s1, s3), 2) == 1.16
    assert stress.tresca(s1, s2, s3) == pytest.approx(s1 - s3, rel=1e-12)  # exact; round-off


def test_tresca_pure_shear_ratio_to_von_mises():
    # Exact: in pure shear Tresca = 2 tau and von Mises = sqrt(3) tau (Shigley 9th ed., Sec. 5-5).
    s = stress.shaft_mohr(0.0, 10.0, 0.0)
    assert stress.tresca(s.s1, s.s2, s.s3) / stress.von_mises(s.s1, s.s2, s.s3) == \
        pytest.approx(2 / math.sqrt(3), rel=1e-12)


def test_coulomb_mohr_limits():
    # Shigley 9th ed., eqs. 5-31a..c (numbering from memory): uniaxial tension -> Sut/s,
    # uniaxial compression -> Suc/|s|, pure shear -> torsional strength Sut*Suc/(Sut+Suc).
    Sut, Suc = 31.0, 109.0   # ASTM grade 30 cast iron, Shigley 9th ed. Table A-24 (from memory)
    # rel=1e-12: exact formula, round-off only
    assert stress.coulomb_mohr_factor(10.0, 0.0, Sut, Suc) == pytest.approx(3.1, rel=1e-12)
    # rel=1e-12: exact formula, round-off only
    assert stress.coulomb_mohr_factor(0.0, -50.0, Sut, Suc) == \
        pytest.approx(109.0 / 50.0, rel=1e-12)
    tau = 12.0
    assert stress.coulomb_mohr_factor(tau, -tau, Sut, Suc) == \
        pytest.approx(Sut * Suc / (Sut + Suc) / tau, rel=1e-12)
    assert stress.coulomb_mohr_factor(0.0, 0.0, Sut, Suc) == math.inf


def test_modified_mohr_limits_and_continuity():
    # Shigley 9th ed., eqs. 5-32a..c (numbering from memory): in pure shear the modified Mohr
    # torsional strength is Sut; the branches meet at s3 = -s1; it is never more conservative than
    # brittle Coulomb-Mohr (Shigley 9th ed., Fig. 5-23, from memory).
    Sut, Suc = 31.0, 109.0
    # rel=1e-12: exact formula, round-off only
    assert stress.modified_mohr_factor(12.0, -12.0, Sut, Suc) == \
        pytest.approx(Sut / 12.0, rel=1e-12)
    below = stress.modified_mohr_factor(12.0, -12.0 * (1 + 1e-9), Sut, Suc)
    assert below == pytest.approx(Sut / 12.0, rel=1e-8)
    s1 = np.linspace(0.0, 30.0, 31)
    s3 = -np.linspace(0.0, 100.0, 31)
    mm = stress.modified_mohr_factor(s1, s3, Sut, Suc)
    cm = stress.coulomb_mohr_factor(s1, s3, Sut, Suc)
    assert mm.shape == (31,)
    assert np.all(mm[1:] >= cm[1:] * (1 - 1e-12))
    # rel=1e-12: exact formula, round-off only
    assert stress.modified_mohr_factor(0.0, -50.0, Sut, Suc) == \
        pytest.approx(109.0 / 50.0, rel=1e-12)


def test_factor_refusals():
    with pytest.raises(OutOfRangeError, match=r"^s1 - s3 = -10\.0: "):
        stress.yield_factor_tresca(100.0, 0.0, 10.0)
    with pytest.raises(OutOfRangeError, match=r"^Suc = -109\.0: "):
        stress.coulomb_mohr_factor(10.0, 0.0, 31.0, -109.0)
    with pytest.raises(OutOfRangeError, match=r"^Sy = 0\.0: "):
        stress.yield_factor_von_mises(0.0, 10.0)


def test_vectorised_equals_scalar():
    sig = np.array([10.0, -40.0, 75.0])
    tau = np.array([5.0, 20.0, 0.0])
    vec = stress.von_mises_sigma_tau(sig, tau)
    assert isinstance(vec, np.ndarray) and vec.shape == (3,)
    assert isinstance(stress.von_mises_sigma_tau(10.0, 5.0), float)
    for i in range(3):
        assert vec[i] == stress.von_mises_sigma_tau(float(sig[i]), float(tau[i]))
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        n = stress.yield_factor_von_mises(100.0, np.array([0.0, 50.0]))
    assert n[0] == math.inf and n[1] == pytest.approx(2.0, rel=1e-12)  # exact; round-off

"""classic/shaft.py: the textbook relations, their validity ranges, and the beam cases against each other."""
import math
import warnings

import pytest

from classic import shaft as cs
from classic._validity import OutOfRangeError, OutOfRangeWarning


def test_gear_force_relations():
    # Shigley's Mechanical Engineering Design, 9th ed., Sec. 13-16, eq. (13-40): with W the total
    # force, Wr = W sin φn, Wt = W cos φn cos ψ, Wa = W cos φn sin ψ
    T, d, phi, psi = 250.0, 0.12, 20.0, 25.0
    f = cs.gear_forces(T, d, phi, psi)
    W = f.tangential / (math.cos(math.radians(phi)) * math.cos(math.radians(psi)))
    assert f.tangential == pytest.approx(2 * T / d, rel=1e-14)
    assert f.radial == pytest.approx(W * math.sin(math.radians(phi)), rel=1e-14)
    assert f.axial == pytest.approx(W * math.cos(math.radians(phi)) * math.sin(math.radians(psi)), rel=1e-14)
    spur = cs.gear_forces(-T, d, phi)  # spur: Wr = Wt tan φ (Shigley 9th ed., Sec. 13-14); sign ignored
    assert spur.radial == pytest.approx(spur.tangential * math.tan(math.radians(phi))) and spur.axial == 0.0


def test_gear_validity():
    with pytest.raises(OutOfRangeError):
        cs.gear_forces(10.0, 0.1, 50.0)
    with warnings.catch_warnings(record=True) as w:
        warnings.simplefilter("always")
        cs.gear_forces(10.0, 0.1, 20.0, 50.0)
    assert any(issubclass(x.category, OutOfRangeWarning) for x in w)


def test_belt_pull_and_chain():
    b = cs.belt_pull(50.0, 0.25, 3.0)
    assert (b.tight - b.slack) * 0.25 / 2 == pytest.approx(50.0)  # T = (F1 − F2) D/2 (Shigley 9th ed., Sec. 17-2)
    assert b.tight / b.slack == pytest.approx(3.0)
    c = cs.belt_pull(50.0, 0.25, math.inf)
    assert c.slack == 0.0 and c.pull == pytest.approx(400.0)
    with pytest.raises(OutOfRangeError):
        cs.belt_pull(50.0, 0.25, 1.0)


def test_overhang_limit_of_simple_support():
    # Shigley 9th ed., Table A-9, beam 10 at a = 0 puts the load on the support: no moment, no deflection
    c = cs.overhung_point_load(100.0, 0.0, 0.5, 1e4)
    assert c.R2 == pytest.approx(100.0) and c.M_max == 0.0 and c.y_load == 0.0


def test_rayleigh_one_mass_is_exact_and_refuses_nonsense():
    k, m = 2.0e6, 5.0  # ω = √(k/m) for one mass on a spring (exact)
    y = m * 9.80665 / k
    assert cs.rayleigh_critical_speed([m * 9.80665], [y]) == pytest.approx(math.sqrt(k / m), rel=1e-14)
    with pytest.raises(OutOfRangeError):
        cs.rayleigh_critical_speed([10.0], [-1e-4])


def test_limits_are_the_table_ranges():
    # Shigley 9th ed., Table 7-2 (from memory): ranges lower < upper, ball bearings looser than rollers
    for lo, hi in cs.SLOPE_LIMITS.values():
        assert 0 < lo < hi
    assert cs.SLOPE_LIMITS["tapered_roller"][1] < cs.SLOPE_LIMITS["deep_groove_ball"][1]
    assert cs.GEAR_DEFLECTION_LIMIT == pytest.approx(0.127e-3)

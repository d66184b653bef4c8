"""classic/polymer.py: the stress-life power law, the creep modulus in log time, the Goodman line and
the table reading, against hand-worked values of the published forms (sources beside each check)."""
import math

import numpy as np
import pytest

from classic._validity import OutOfRangeError
from classic.polymer import (basquin_amplitude, basquin_fit, creep_modulus, goodman_factor_polymer,
                             interpolate_in_table, sn_strength)


def test_basquin_fit_gives_back_a_power_law():
    # Basquin, Proc. ASTM 10 (1910): sigma_a = A N^b; points placed exactly on A = 120, b = -0.085
    N = np.array([1e3, 1e4, 1e5, 1e6, 1e7])
    S = 120.0 * N ** -0.085
    fit = basquin_fit(N, S)
    assert fit.A == pytest.approx(120.0, rel=1e-10)
    assert fit.b == pytest.approx(-0.085, rel=1e-10)
    assert fit.r2 == pytest.approx(1.0, abs=1e-12)
    # between the points: the power law itself, hand-worked 120 * (3e5)^-0.085
    S_f, _ = sn_strength(3e5, N, S)
    assert S_f == pytest.approx(120.0 * 3e5 ** -0.085, rel=1e-10)


def test_basquin_fit_regresses_life_on_stress():
    # ASTM E739 (from memory): log N is the dependent variable. Three points off a line: the slope of
    # log N on log S is the least-squares one worked by hand with numpy's closed form below.
    N = np.array([1e4, 1e5, 1e6])
    S = np.array([40.0, 33.0, 25.0])
    x, y = np.log10(S), np.log10(N)
    c1 = np.sum((x - x.mean()) * (y - y.mean())) / np.sum((x - x.mean()) ** 2)
    c0 = y.mean() - c1 * x.mean()
    fit = basquin_fit(N, S)
    assert fit.b == pytest.approx(1 / c1, rel=1e-12)
    assert fit.A == pytest.approx(10 ** (-c0 / c1), rel=1e-10)
    assert 0 < fit.r2 < 1


def test_sn_strength_refuses_outside_the_tested_lives():
    N, S = [1e4, 1e7], [40.0, 20.0]
    with pytest.raises(OutOfRangeError, match="cycles"):
        sn_strength(2e7, N, S)  # no endurance limit assumed, no extension past the longest test
    with pytest.raises(OutOfRangeError):
        sn_strength(5e3, N, S)
    assert sn_strength(1e7, N, S)[0] == pytest.approx(20.0, rel=1e-12)


@pytest.mark.parametrize("N,S,what", [
    ([1e4, 1e5], [20.0, 30.0], "fall"),         # amplitude rising with life
    ([1e5, 1e4], [30.0, 20.0], "increase"),     # lives not increasing
    ([1e4], [30.0], "two"),                     # one point
    ([1e4, 1e5], [30.0, -1.0], "positive"),     # negative amplitude
])
def test_basquin_fit_refuses_bad_points(N, S, what):
    with pytest.raises(OutOfRangeError, match=what):
        basquin_fit(N, S)


def test_basquin_amplitude_hand_value():
    # 50 * (1e6)^-0.1 = 50 * 10^-0.6 = 12.559 (hand-worked)
    assert basquin_amplitude(1e6, 50.0, -0.1) == pytest.approx(50 * 10 ** -0.6, rel=1e-14)


def test_creep_modulus_is_linear_in_log_time():
    # Crawford, Plastics Engineering, 3rd ed., ch. 2 (from memory): creep modulus on log time.
    t = [3600.0, 3.6e5, 3.6e7]
    E = [2.0e9, 1.6e9, 1.1e9]
    assert creep_modulus(3.6e6, t, E) == pytest.approx(1.35e9, rel=1e-12)  # halfway in log t
    assert creep_modulus(3600.0 * 10 ** 0.5, t, E) == pytest.approx(1.9e9, rel=1e-12)
    with pytest.raises(OutOfRangeError, match="duration"):
        creep_modulus(3.6e8, t, E)
    with pytest.raises(OutOfRangeError):
        creep_modulus(60.0, t, E)


def test_interpolate_refuses_outside_and_never_clamps():
    T, S = [-20.0, 23.0, 80.0], [90.0, 75.0, 40.0]
    assert interpolate_in_table(23.0, T, S) == 75.0
    assert interpolate_in_table(51.5, T, S) == pytest.approx(57.5)
    for x in (-20.001, 80.5, math.nan):
        with pytest.raises(OutOfRangeError):
            interpolate_in_table(x, T, S, "temperature", "degC")


def test_goodman_polymer_hand_values():
    # Goodman line (1899, from memory): 1/n = sa/Sf + sm/Sut
    assert goodman_factor_polymer(12.0, 0.0, 24.0, 70.0) == pytest.approx(2.0)       # fully reversed
    assert goodman_factor_polymer(0.0, 35.0, 24.0, 70.0) == pytest.approx(2.0)       # static: Sut/sm
    assert goodman_factor_polymer(6.0, 17.5, 24.0, 70.0) == pytest.approx(2.0)       # 0.25 + 0.25
    assert goodman_factor_polymer(0.0, 0.0, 24.0, 70.0) == math.inf
    with pytest.raises(OutOfRangeError):
        goodman_factor_polymer(1.0, 1.0, 0.0, 70.0)

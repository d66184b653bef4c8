"""classic/key_design.py: key stresses, engagement and required lengths against Shigley's example
(from memory) and hand-worked values."""
import math

import pytest

from classic import key_design as ck
from classic._validity import OutOfRangeError



def test_key_design_reproduces_shigley_example():
    # Shigley's Mechanical Engineering Design, 9th ed., Example 7-6 (from memory): 40 hp at 600 rev/min,
    # shaft 1 7/16 in, 3/8 in square key of Sy = 65 kpsi, design factor 2.80 -> l = 1.16 in (shear),
    # 1.34 in (crushing, on t/2 = 3/16 in). Unit-free relations, worked in lbf and in.
    T = 63025 * 40 / 600  # hp·rev/min -> lbf·in (the example's 4200 lbf·in)
    assert T == pytest.approx(4200, rel=2e-3)
    ssy = ck.shear_yield_distortion_energy(65e3)
    assert ssy == pytest.approx(37.5e3, rel=2e-3)
    assert ck.key_length_for_shear(4200, 1.4375, 0.375, ssy, 2.80) == pytest.approx(1.16, abs=0.01)
    assert ck.key_length_for_bearing(4200, 1.4375, 0.1875, 65e3, 2.80) == pytest.approx(1.34, abs=0.01)


def test_key_stresses_and_lengths_are_consistent_hand_values():
    # hand-worked from tau = 2T/(d w L), sigma = 2T/(d t L) (Shigley 9th ed., Sec. 7-7): at the required
    # length the factor is exactly the design factor
    T, d, w, t, Sy, nd = 250.0, 0.040, 0.012, 0.0031, 400e6, 2.5
    tau = ck.key_shear_stress(T, d, w, 0.050)
    assert {"fem": tau, "exact": 2 * 250 / (0.040 * 0.012 * 0.050)} == pytest.approx({"fem": 20.833333e6, "exact": 20.833333e6})
    L = ck.key_length_for_shear(T, d, w, 0.577 * Sy, nd)
    assert 0.577 * Sy / ck.key_shear_stress(T, d, w, L) == pytest.approx(nd, rel=1e-12)
    L = ck.key_length_for_bearing(T, d, t, Sy, nd)
    assert Sy / ck.key_bearing_stress(T, d, t, L) == pytest.approx(nd, rel=1e-12)


def test_engagement_depths_add_up_to_the_key_height():
    # geometry of the key in its seat: chordal height (ASME B17.1's Y) = r - sqrt(r^2 - (w/2)^2)
    d, w, depth, h = 0.040, 0.012, 0.005, 0.008
    ts, th = ck.engagement_depths(d, w, depth, h)
    y = 0.020 - math.sqrt(0.020**2 - 0.006**2)
    assert ts == pytest.approx(depth - y, rel=1e-14) and ts + th == pytest.approx(h, rel=1e-14)
    with pytest.raises(OutOfRangeError):
        ck.engagement_depths(d, w, 0.009, h)  # a keyway deeper than the key is high: nothing enters the hub


def test_two_keys_count_as_one_and_a_half():
    # common practice (from memory; DIN 6892 method C, load-share 0.75 per key)
    assert ck.effective_key_count(1) == 1.0 and ck.effective_key_count(2) == 1.5

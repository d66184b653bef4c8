"""The checklist's published formulas (classic/key_design.py, press_fit.py, bearings.py, torsional.py,
spline_design.py) against hand-worked values, published worked examples and exact solutions. Each
check names its source; 'from memory' where the example's numbers are remembered, not re-read."""
import math

import pytest

from classic import bearings as cb
from classic import key_design as ck
from classic import press_fit as cp
from classic import spline_design as csp
from classic import torsional as ct
from classic._validity import OutOfRangeError

# ----------------------------------------------------------------------------- keys


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


# ----------------------------------------------------------------------------- press fits


@pytest.mark.parametrize("ri", [0.0, 0.008])
def test_lame_pressure_one_material_reduces_to_the_closed_form(ri):
    # Shigley 9th ed., eq. (3-57): one material, p = E·δ/(2R³)·(ro² − R²)(R² − ri²)/(ro² − ri²), δ the
    # radial interference
    E, nu, R, ro, delta = 207e9, 0.30, 0.025, 0.045, 15e-6
    p = cp.contact_pressure(delta, R, ro, ri, E, nu, E, nu)
    exact = E * delta / (2 * R**3) * (ro**2 - R**2) * (R**2 - ri**2) / (ro**2 - ri**2)
    assert {"fem": p, "exact": exact} == pytest.approx({"fem": exact, "exact": exact}, rel=1e-12)


def test_lame_pressure_two_materials_closes_the_gap_exactly():
    # exact Lamé (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., Sec. 28): the radial displacements
    # of hub bore and shaft surface under p differ by the radial interference
    R, ro, ri, delta = 0.030, 0.060, 0.010, 20e-6
    Eo, nuo, Ei, nui = 110e9, 0.33, 207e9, 0.29  # a bronze hub on a steel shaft (illustrative)
    p = cp.contact_pressure(delta, R, ro, ri, Eo, nuo, Ei, nui)
    s = cp.fit_stresses(p, R, ro, ri)
    u_hub = R / Eo * (s.hub_tangential - nuo * s.hub_radial)
    u_shaft = R / Ei * (s.shaft_tangential - nui * s.shaft_radial)
    assert {"fem": u_hub - u_shaft, "exact": delta} == pytest.approx({"fem": delta, "exact": delta}, rel=1e-12)
    # the hub's Lamé stresses balance the pressure: σt at the bore of a thick cylinder under p inside
    assert s.hub_tangential == pytest.approx(p * (ro**2 + R**2) / (ro**2 - R**2), rel=1e-14)


def test_fit_torque_and_axial_force_hand_values():
    # Shigley 9th ed., Sec. 7-8: T = (π/2)·f·p·l·d² ; axial F = π·f·p·l·d (hand-worked)
    p, R, L, f = 40e6, 0.020, 0.050, 0.15
    assert cp.fit_torque(p, R, L, f) == pytest.approx(math.pi / 2 * f * p * L * (2 * R) ** 2, rel=1e-14)
    assert cp.fit_axial_force(p, R, L, f) == pytest.approx(math.pi * f * p * L * 2 * R, rel=1e-14)
    assert cp.fit_torque(p, R, L, f) == pytest.approx(753.98, abs=0.01)


def test_thermal_change_hand_value():
    # free expansion of each diameter, Δd = α·d·ΔT (hand-worked): a hub warmer than the shaft loosens the fit
    assert cp.thermal_interference_change(0.040, 12e-6, 10.0, 12e-6, 30.0) == pytest.approx(-9.6e-6, rel=1e-12)


# ----------------------------------------------------------------------------- bearings


def test_basic_rating_life_shigley_example():
    # Shigley 9th ed., Example 11-1 (from memory): 30 000 h at 1800 rev/min under 2.67 kN needs
    # C10 = 39.5 kN for a ball bearing; backwards, 39.5 kN gives 30 000 h within the example's rounding
    L = cb.basic_rating_life(39.5e3, 2.67e3, cb.life_exponent("ball"))
    h = cb.life_hours(L, 1800 * 2 * math.pi / 60)
    assert h == pytest.approx(30_000, rel=0.005)


def test_basic_rating_life_iso281_hand_values():
    # ISO 281:2007, L10 = (C/P)^p million revolutions, p = 3 ball, 10/3 roller (hand-worked)
    assert cb.basic_rating_life(20e3, 2e3, 3.0) == pytest.approx(1e9, rel=1e-14)
    assert cb.basic_rating_life(20e3, 2e3, cb.life_exponent("roller")) == pytest.approx(10 ** (10 / 3) * 1e6, rel=1e-14)
    assert cb.life_hours(60e6, 2 * math.pi * 1000 / 60) == pytest.approx(1000.0, rel=1e-14)  # 60e6 rev at 1000 rpm
    assert cb.equivalent_dynamic_load(3000.0, 1000.0, 0.56, 1.4) == pytest.approx(3080.0, rel=1e-14)


# ----------------------------------------------------------------------------- torsion, splines


def test_twist_and_textbook_frequencies_hand_values():
    # Shigley 9th ed., eq. (3-35); Den Hartog, Mechanical Vibrations, 4th ed., two discs (from memory)
    J = math.pi * 0.05**4 / 32
    assert ct.twist_angle(1000.0, 2.0, 80e9, J) == pytest.approx(1000 * 2 / (80e9 * J), rel=1e-14)
    assert ct.two_disc_frequency(4000.0, 0.02, 0.02) == pytest.approx(math.sqrt(4000 * 2 / 0.02), rel=1e-14)
    assert ct.free_free_shaft_frequency(2, 0.5, 80e9, 8000.0) == pytest.approx(2 * math.pi / 0.5 * math.sqrt(1e7), rel=1e-14)


def test_spline_formulas_from_memory_reduce_to_the_pitch_circle_form():
    # from memory (Dudley, Gear Handbook, 1962): with t = πd/(2z), τ = 2T/(d z t L) = 4T/(π d² L)
    T, d, z, L = 300.0, 0.030, 24, 0.025
    t = math.pi * d / (2 * z)
    assert csp.spline_tooth_shear(T, d, z, t, L) == pytest.approx(4 * T / (math.pi * d**2 * L), rel=1e-13)
    assert csp.spline_bearing_pressure(T, d, z, 0.00125, L) == pytest.approx(2 * T / (d * z * 0.00125 * L), rel=1e-14)

"""classic/press_fit.py: Lamé press fits against the closed form of one material and the exact
displacement compatibility of two."""
import math

import pytest

from classic import press_fit as cp



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

"""The exact cone solution of torsion (classic/revolution.py)."""
import math

import numpy as np
import pytest
from scipy.integrate import quad

from classic._validity import OutOfRangeError
from classic.revolution import cone_surface_shear, cone_torsion_constant_C, cone_torsion_rotation


@pytest.mark.parametrize("alpha_deg", [5.0, 20.0, 45.0])
def test_cone_solution_carries_its_torque_and_solves_the_equation(alpha_deg):
    # Timoshenko & Goodier, Theory of Elasticity, 3rd ed., the conical shaft in torsion: the stress
    # τ_θz = G r ∂ω/∂z integrated over any cross-section gives back the torque (equilibrium), and
    # ω satisfies ∂/∂r(r³ ∂ω/∂r) + ∂/∂z(r³ ∂ω/∂z) = 0 (checked here by finite differences).
    G, T, a = 8.0e10, 250.0, math.radians(alpha_deg)
    C = cone_torsion_constant_C(T, G, a)
    for z in (0.05, 0.2):
        R = z * math.tan(a)
        tq = quad(lambda r: 2 * math.pi * r**2 * G * r * (-3 * C * z * (r**2 + z**2) ** -2.5), 0, R)[0]
        torque = {"fem": tq, "exact": T}  # "fem" here: the numerical integral of the closed form
        assert torque["fem"] == pytest.approx(torque["exact"], rel=1e-10)
    r, z, h = 0.01, 0.1, 1e-4
    w = lambda rr, zz: cone_torsion_rotation(T, G, a, rr, zz)  # noqa: E731
    # r⁻³ ∇·(r³∇ω) = ω_rr + (3/r) ω_r + ω_zz, central differences (error ~h² ≈ 1e-8 relative)
    w_rr = (w(r + h, z) - 2 * w(r, z) + w(r - h, z)) / h**2
    w_r = (w(r + h, z) - w(r - h, z)) / (2 * h)
    w_zz = (w(r, z + h) - 2 * w(r, z) + w(r, z - h)) / h**2
    scale = abs(w_rr) + abs(3 * w_r / r) + abs(w_zz)
    assert abs(w_rr + 3 * w_r / r + w_zz) < 1e-5 * scale


def test_surface_shear_is_the_gradient_of_the_rotation():
    G, T, a, z = 8.0e10, 100.0, math.radians(30.0), 0.08
    r = z * math.tan(a)
    h = 1e-7
    wr = (cone_torsion_rotation(T, G, a, r + h, z) - cone_torsion_rotation(T, G, a, r - h, z)) / (2 * h)
    wz = (cone_torsion_rotation(T, G, a, r, z + h) - cone_torsion_rotation(T, G, a, r, z - h)) / (2 * h)
    tau = G * r * math.hypot(wr, wz)
    # the gradient is along the generator, so the surface is traction-free: (∂ω/∂r, ∂ω/∂z)·n = 0
    n = np.array([math.cos(a), -math.sin(a)])
    assert abs(np.dot([wr, wz], n)) < 1e-6 * math.hypot(wr, wz)
    assert cone_surface_shear(T, a, z) == pytest.approx(tau, rel=1e-6)


@pytest.mark.parametrize("alpha", [0.0, math.pi / 2, -0.1, float("nan")])
def test_bad_angle_refused(alpha):
    with pytest.raises(OutOfRangeError):
        cone_surface_shear(1.0, alpha, 1.0)

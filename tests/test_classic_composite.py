"""classic/composite.py: the closed forms of bonded concentric layers and the transformed section.

The flexure closed form (concentric_flexure_shear) is derived in the project; it is checked here
against the published one-layer solution (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., ch. 12,
circular section: (3 + 2ν)/(2(1 + ν))·V/A at the centre, (1 + 2ν)/(1 + ν)·V/A on the surface at the
neutral axis; classic/shear.py) and against the conditions it was built from, and in
tests/test_fem_composite_shear.py against the FE.
"""
import math

import pytest

from classic._validity import OutOfRangeError
from classic.composite import (concentric_bending_rigidity, concentric_flexure_peak, concentric_flexure_shear,
                               transformed_section_shear)
from classic.shear import round_flexure_centre, round_flexure_surface

R1, R2, R3 = 0.004, 0.009, 0.012


@pytest.mark.parametrize("nu", [0.0, 0.3, 0.45])
def test_one_material_in_three_layers_is_the_published_round_bar(nu):
    E = [200e9] * 3
    G = [200e9 / (2 * (1 + nu))] * 3
    V = 1000.0
    radii = [0.0, R1, R2, R3]
    centre = {"exact": round_flexure_centre(V, 2 * R3, nu),
              "classic": concentric_flexure_shear(V, E, G, [nu] * 3, radii, 0, 1e-12, 0.0)[0]}
    surface = {"exact": round_flexure_surface(V, 2 * R3, nu),
               "classic": -concentric_flexure_shear(V, E, G, [nu] * 3, radii, 2, R3, math.pi / 2)[1]}
    for row in (centre, surface):
        assert row["classic"] == pytest.approx(row["exact"], rel=1e-12)
    assert concentric_flexure_peak(V, E, G, [nu] * 3, radii, 0)[0] == pytest.approx(centre["exact"], rel=1e-12)


def test_bonded_layers_meet_their_interface_and_surface_conditions():
    """τ_zr continuous at every interface and zero on the free surfaces (inner bore included); the
    warping continuous (τ_zθ jumps by the ratio of the shear moduli there, since τ_zθ = −G(f/r + νr²/2)·...)."""
    E, nu = [70e9, 3e9, 206e9], [0.33, 0.38, 0.3]
    G = [e / (2 * (1 + v)) for e, v in zip(E, nu)]
    radii = [0.002, R1, R2, R3]
    th = 0.4
    for k, R in ((0, R1), (1, R2)):
        a = concentric_flexure_shear(1.0, E, G, nu, radii, k, R, th)
        b = concentric_flexure_shear(1.0, E, G, nu, radii, k + 1, R, th)
        assert a[0] == pytest.approx(b[0], rel=1e-9)
        # the warping f: τ_zθ/(G sin θ) + ν r²/2 ∝ f/r must be the same on both sides
        fa = -a[1] / (G[k] * math.sin(th)) - nu[k] * R**2 / 2 * (1.0 / concentric_bending_rigidity(E, radii))
        fb = -b[1] / (G[k + 1] * math.sin(th)) - nu[k + 1] * R**2 / 2 * (1.0 / concentric_bending_rigidity(E, radii))
        assert fa == pytest.approx(fb, rel=1e-9)
    assert abs(concentric_flexure_shear(1.0, E, G, nu, radii, 0, radii[0], th)[0]) < 1e-9 * abs(a[0])
    assert abs(concentric_flexure_shear(1.0, E, G, nu, radii, 2, R3, th)[0]) < 1e-9 * abs(a[0])


def test_the_shear_resultant_is_the_force():
    """∫ τ_x dA over the layers equals V (equilibrium of the closed form; midpoint rule in r and θ)."""
    E, nu = [206e9, 3e9], [0.3, 0.38]
    G = [e / (2 * (1 + v)) for e, v in zip(E, nu)]
    radii = [0.0, R1, R2]
    total, n = 0.0, 200
    for k in (0, 1):
        a, b = radii[k], radii[k + 1]
        for i in range(n):
            r = a + (i + 0.5) * (b - a) / n
            for j in range(64):
                th = (j + 0.5) * 2 * math.pi / 64
                tr, tt = concentric_flexure_shear(1.0, E, G, nu, radii, k, r, th)
                total += (tr * math.cos(th) - tt * math.sin(th)) * r * (b - a) / n * 2 * math.pi / 64
    assert total == pytest.approx(1.0, rel=1e-4)


def test_the_elementary_formula_and_its_refusals():
    # one material: the solid round at its neutral axis gives 4V/(3A) (E cancels); Q = 2R³/3, b = 2R
    R, E = 0.01, 200e9
    tau = transformed_section_shear(1.0, E * 2 * R**3 / 3, E * math.pi * R**4 / 4, 2 * R)
    assert tau == pytest.approx(4 / (3 * math.pi * R**2), rel=1e-12)
    with pytest.raises(OutOfRangeError):
        transformed_section_shear(1.0, 1.0, 0.0, 1.0)
    with pytest.raises(OutOfRangeError):
        concentric_flexure_shear(1.0, [1.0], [1.0], [0.6], [0.0, 1.0], 0, 0.5, 0.0)
    with pytest.raises(OutOfRangeError):
        concentric_flexure_shear(1.0, [1.0, 1.0], [1.0, 1.0], [0.3, 0.3], [0.0, 1.0, 2.0], 0, 1.5, 0.0)

"""Section properties by FE integration against exact closed forms and the exact boundary integral."""
import math

import pytest

from classic import properties as cp
from fem.geometry import Ellipse, Keyway, custom_section, keyed_section, rectangle, round_section
from fem.mesh import mesh_section
from fem.properties import area_moments


def test_round_and_tube_exact():
    # A = πd²/4, I = πd⁴/64 (tube: differences), exact geometry (any strength-of-materials text)
    for sec, A, I in [(round_section(0.03), math.pi * 0.03**2 / 4, math.pi * 0.03**4 / 64),
                      (round_section(0.03, 0.01), math.pi * (0.03**2 - 0.01**2) / 4, math.pi * (0.03**4 - 0.01**4) / 64)]:
        pr = area_moments(mesh_section(sec))
        area = {"fem": pr.area, "exact": A}
        Ixx = {"fem": pr.Ixx, "exact": I}
        assert area["fem"] == pytest.approx(area["exact"], rel=1e-5)
        assert Ixx["fem"] == pytest.approx(Ixx["exact"], rel=1e-5)
        assert pr.Iyy == pytest.approx(I, rel=1e-5)
        assert abs(pr.Ixy) < 1e-9 * I
        assert pr.c_max == pytest.approx(0.015, rel=1e-9)


def test_rotated_rectangle_principal_axes():
    # Rectangle w×h: Ixx = wh³/12, Iyy = hw³/12 (exact); turned by 30°, the principal axes turn with it.
    w, h = 0.04, 0.01
    pr = area_moments(mesh_section(custom_section([rectangle((0.003, -0.002), (w, h), rotation=30.0)])))
    assert pr.I1 == pytest.approx(h * w**3 / 12, rel=1e-9)
    assert pr.I2 == pytest.approx(w * h**3 / 12, rel=1e-9)
    assert pr.principal_angle_deg == pytest.approx(-60.0, abs=1e-6) or pr.principal_angle_deg == pytest.approx(120.0, abs=1e-6)
    assert pr.centroid == pytest.approx((0.003, -0.002), abs=1e-12)


def test_ellipse_against_closed_form():
    a, b = 0.02, 0.012
    pr = area_moments(mesh_section(custom_section([Ellipse((0.0, 0.0), (a, b))])))
    Ixx, Iyy = cp.ellipse_second_moments(a, b)
    assert pr.Ixx == pytest.approx(Ixx, rel=1e-5)  # πab³/4, exact geometry
    assert pr.Iyy == pytest.approx(Iyy, rel=1e-5)


def test_fe_integrals_agree_with_the_exact_boundary_integral():
    # Internal cross-check on a keyed shaft with a bore: FE quadrature over curved elements against
    # Green's-theorem integrals over the exact boundary curves.
    sec = keyed_section(0.03, [Keyway(0.008, 0.004, 0.0004)], bore=0.01)
    pr = area_moments(mesh_section(sec))
    assert max(pr.rel_diff.values()) < 1e-5
    # the keyway on top moves the centroid down and the section keeps its mirror symmetry
    assert pr.centroid[1] < 0
    assert abs(pr.centroid[0]) < 1e-9
    assert abs(pr.Ixy) < 1e-6 * pr.Ixx

"""Cuts of the exact geometry: area, first moment and chord against closed forms."""
import math

import pytest

from fem.cut import cut_section, elementary_shear
from fem.geometry import custom_section, rectangle, round_section


def test_round_bar_half():
    # half disk: A = πR²/2, Q = 2R³/3 about the diameter, chord 2R (exact geometry)
    R = 0.015
    c = cut_section(round_section(2 * R), (0.0, 0.0), (0.0, 1.0))
    assert c.area == pytest.approx(math.pi * R**2 / 2, rel=1e-12)
    assert c.first_moment == pytest.approx(2 * R**3 / 3, rel=1e-12)
    assert c.chord == pytest.approx(2 * R, rel=1e-12)


def test_elementary_shear_of_rectangle_and_round_bar():
    # VQ/(Ib) on the neutral axis: 3V/(2A) for a rectangle, 4V/(3A) for a round bar (any
    # strength-of-materials text)
    b, h, V = 0.02, 0.05, 1000.0
    tau, _ = elementary_shear(custom_section([rectangle((0.0, 0.0), (b, h))]), (0.0, 0.0), b * h**3 / 12, V, "y")
    assert tau == pytest.approx(3 * V / (2 * b * h), rel=1e-12)
    d = 0.03
    tau, _ = elementary_shear(round_section(d), (0.0, 0.0), math.pi * d**4 / 64, V, "y")
    assert tau == pytest.approx(4 * V / (3 * math.pi * d**2 / 4), rel=1e-12)


def test_cut_through_a_bore_counts_both_walls():
    D, d = 0.04, 0.02
    c = cut_section(round_section(D, d), (0.0, 0.0), (0.0, 1.0))
    assert c.chord == pytest.approx(D - d, rel=1e-12)
    assert c.first_moment == pytest.approx(2 * ((D / 2) ** 3 - (d / 2) ** 3) / 3, rel=1e-12)

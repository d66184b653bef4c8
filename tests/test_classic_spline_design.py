"""classic/spline_design.py: the simplified spline formulas (from memory) against their pitch-circle form."""
import math

import pytest

from classic import spline_design as csp


def test_spline_formulas_from_memory_reduce_to_the_pitch_circle_form():
    # from memory (Dudley, Gear Handbook, 1962): with t = πd/(2z), τ = 2T/(d z t L) = 4T/(π d² L)
    T, d, z, L = 300.0, 0.030, 24, 0.025
    t = math.pi * d / (2 * z)
    assert csp.spline_tooth_shear(T, d, z, t, L) == pytest.approx(4 * T / (math.pi * d**2 * L), rel=1e-13)
    assert csp.spline_bearing_pressure(T, d, z, 0.00125, L) == pytest.approx(2 * T / (d * z * 0.00125 * L), rel=1e-14)

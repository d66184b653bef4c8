"""classic/torsional.py: twist and the textbook torsional frequencies against hand values."""
import math

import pytest

from classic import torsional as ct


def test_twist_and_textbook_frequencies_hand_values():
    # Shigley 9th ed., eq. (3-35); Den Hartog, Mechanical Vibrations, 4th ed., two discs (from memory)
    J = math.pi * 0.05**4 / 32
    assert ct.twist_angle(1000.0, 2.0, 80e9, J) == pytest.approx(1000 * 2 / (80e9 * J), rel=1e-14)
    assert ct.two_disc_frequency(4000.0, 0.02, 0.02) == pytest.approx(math.sqrt(4000 * 2 / 0.02), rel=1e-14)
    assert ct.free_free_shaft_frequency(2, 0.5, 80e9, 8000.0) == pytest.approx(2 * math.pi / 0.5 * math.sqrt(1e7), rel=1e-14)

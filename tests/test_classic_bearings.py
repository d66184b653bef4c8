"""classic/bearings.py: ISO 281 basic rating life against hand values and Shigley's example (from memory)."""
import math

import pytest

from classic import bearings as cb



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

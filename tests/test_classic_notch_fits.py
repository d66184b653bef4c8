"""The shoulder-fillet and U-groove fits (classic/notch_fits.py): ranges as data, refusals,
and the consistency a correct transcription must show."""
import math
import warnings

import pytest

from classic import notch_fits as nf
from classic._validity import OutOfRangeError


@pytest.mark.parametrize("key", [k for k, rows in nf.COEFFICIENTS.items() if len(rows) == 2])
def test_two_ranges_meet_at_their_common_bound(key):
    # Roark's Formulas for Stress and Strain, 7th ed., Table 17.1: each fit is given in two h/r
    # ranges meeting at h/r = 2; both sets describe the same chart there. Measured on these
    # coefficients (from memory): within 1.2 %, except the U-groove in bending (2.0 %).
    lo, hi = nf.COEFFICIENTS[key]
    assert lo[1] == hi[0] == 2.0
    for x in (0.1, 0.3, 0.5):
        vals = []
        for _, _, row in (lo, hi):
            C = [a + b * math.sqrt(2.0) + c * 2.0 for a, b, c in row]
            vals.append(C[0] + C[1] * x + C[2] * x**2 + C[3] * x**3)
        tol = 0.025 if key == ("groove", "bending") else 0.012
        assert vals[0] == pytest.approx(vals[1], rel=tol)


@pytest.mark.parametrize("kind", ["shoulder", "groove"])
def test_tension_and_bending_meet_for_a_shallow_feature(kind):
    # A feature shallow against the shaft (2h/D → 0) sees the same surface stress field in tension
    # and in bending: the two fits must give the same Kt there (a property of elasticity, not of the
    # charts). Checked at h/r = 1 and 4, D/h = 10⁴.
    for hr in (1.0, 4.0):
        h, D = 1.0, 1e4
        second = D - 2 * h if kind == "shoulder" else h
        kt_t = nf.kt_fit(kind, "tension", D, second, h / hr)
        kt_b = nf.kt_fit(kind, "bending", D, second, h / hr)
        assert kt_t == pytest.approx(kt_b, rel=0.02)


def test_shallow_semicircular_groove_in_torsion_doubles_the_stress():
    # Timoshenko & Goodier, Theory of Elasticity, 3rd ed.: a small semicircular groove in a shaft in
    # torsion has twice the shaft's surface stress at its bottom.
    assert nf.groove_kts_torsion(1e5, 1.0, 1.0) == pytest.approx(2.0, abs=0.005)


@pytest.mark.parametrize("fn,args,field", [
    (nf.shoulder_kts_torsion, (1.5, 1.0, 0.05), "h/r"),  # h/r = 5 > 4
    (nf.shoulder_kt_bending, (1.01, 1.0, 0.5), "h/r"),  # h/r = 0.01 < 0.1
    (nf.groove_kt_tension, (1.0, 0.2, 0.001), "h/r"),  # h/r = 200 > 50
    (nf.shoulder_kt_tension, (1.0, 1.2, 0.1), "d"),  # d > D
    (nf.groove_kt_bending, (1.0, 0.6, 0.1), "h"),  # deeper than the radius
    (nf.groove_kts_torsion, (1.0, 0.1, -0.1), "r"),
    (nf.groove_kts_torsion, (1.0, 0.1, float("nan")), "r"),
])
def test_outside_the_range_is_refused_never_clamped(fn, args, field):
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        with pytest.raises(OutOfRangeError) as e:
            fn(*args)
    assert e.value.field == field


def test_ranges_are_data():
    assert nf.RANGES[("shoulder", "torsion")].low == 0.25 and nf.RANGES[("shoulder", "torsion")].high == 4.0
    assert nf.in_range("groove", "tension", 0.1) and not nf.in_range("groove", "bending", 0.1)

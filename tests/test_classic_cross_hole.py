"""The transverse-hole fits (classic/cross_hole.py): the exact small-hole limits, the range as data
(refused outside, never clamped), and the gross-section nominal."""
import pytest

from classic import cross_hole as ch
from classic._validity import OutOfRangeError


def test_small_hole_limits_are_the_plate_values():
    # Kirsch's circular hole in a wide plate (Timoshenko & Goodier, Theory of Elasticity, 3rd ed.):
    # σmax = 3σ in uniaxial tension (the bending fit's limit: the mouth sees the surface's uniaxial
    # bending stress) and σmax = 4τ in pure shear (the torsion fit's), so τmax = 2τ.
    for fit, exact in ((ch.cross_hole_kt_bending, 3.0), (ch.cross_hole_kt_torsion, 4.0),
                       (ch.cross_hole_kts_torsion, 2.0)):
        got = {"fit": fit(1e-6, 1.0), "exact": exact}
        assert got["fit"] == pytest.approx(got["exact"], abs=1e-4)


def test_values_inside_the_range_are_the_cubic_in_d_over_D():
    # Peterson's Stress Concentration Factors, 3rd ed., sec. 4.5.9 (coefficients from memory): the
    # fits are cubics in d/D; at d/D = 0.2 the bending fit is 3.030 and the torsion fit 3.793
    # (σmax/τ), evaluated by hand from the coefficients.
    assert ch.cross_hole_kt_bending(0.006, 0.030) == pytest.approx(3 - 6.25 * 0.2 + 41 * 0.04 - 45 * 0.008)
    assert ch.cross_hole_kt_bending(0.006, 0.030) == pytest.approx(3.030, abs=5e-4)
    assert ch.cross_hole_kt_torsion(0.006, 0.030) == pytest.approx(3.793, abs=5e-4)
    assert ch.cross_hole_kts_torsion(0.006, 0.030) == pytest.approx(3.793 / 2, abs=5e-4)


def test_scale_free():
    # a factor depends on d/D only
    for fit in (ch.cross_hole_kt_bending, ch.cross_hole_kt_torsion):
        assert fit(6.0, 30.0) == pytest.approx(fit(0.006, 0.030), rel=1e-12)


@pytest.mark.parametrize("d, D", [(0.0125, 0.030), (0.5, 1.0), (0.0, 1.0), (-0.1, 1.0)])
def test_outside_the_range_is_refused(d, D):
    for fit in (ch.cross_hole_kt_bending, ch.cross_hole_kt_torsion, ch.cross_hole_kts_torsion):
        with pytest.raises(OutOfRangeError) as exc:
            fit(d, D)
        assert exc.value.field in ("d", "d/D")


def test_bad_lengths_name_the_field():
    with pytest.raises(OutOfRangeError) as exc:
        ch.cross_hole_kt_bending(0.006, "thirty")
    assert exc.value.field == "D"
    with pytest.raises(OutOfRangeError) as exc:
        ch.cross_hole_kt_torsion(float("nan"), 0.03)
    assert exc.value.field == "d"


def test_range_bounds_are_data():
    assert ch.X_RANGE.high == 0.4 and ch.X_RANGE.strict_low
    assert ch.cross_hole_kt_bending(0.4, 1.0) == pytest.approx(3 - 2.5 + 41 * 0.16 - 45 * 0.064)

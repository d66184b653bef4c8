"""Checks of classic.properties against published section properties and independent quadrature."""
import math

import pytest
from scipy.integrate import dblquad

from classic import properties as P
from classic._validity import OutOfRangeError

# Quadrature of a smooth integrand over a region bounded by smooth curves: scipy's default
# tolerances reach about 1e-10 relative, so rel=1e-8 leaves margin and still catches any
# formula slip (which would be a wrong coefficient, i.e. a percent-level error).
QUAD_REL = 1e-8


def _moments(y_lo, y_hi, x_lo, x_hi, first_moment=False):
    """Area, first moment about x (None unless asked), Ixx, Iyy of
    {y_lo <= y <= y_hi, x_lo(y) <= x <= x_hi(y)}, about the x axis and the y axis."""
    def q(f):
        return dblquad(lambda x, y: f(x, y), y_lo, y_hi, x_lo, x_hi, epsabs=0, epsrel=1e-10)[0]
    # The first moment of a symmetric region is zero, which a purely relative tolerance
    # cannot reach; only the (unsymmetric) flat section asks for it.
    sx = q(lambda x, y: y) if first_moment else None
    return q(lambda x, y: 1.0), sx, q(lambda x, y: y * y), q(lambda x, y: x * x)


# ---------------------------------------------------------------- round and tube

def test_round_matches_quadrature():
    # Derived [D]: direct integration over the disc; formulas as printed in Roark, 7th ed., Table A.1.
    d = 0.037
    R = d / 2
    A, _, Ixx, Iyy = _moments(-R, R, lambda y: -math.sqrt(R * R - y * y),
                              lambda y: math.sqrt(R * R - y * y))
    assert P.round_area(d) == pytest.approx(A, rel=QUAD_REL)
    assert P.round_second_moment(d) == pytest.approx(Ixx, rel=QUAD_REL)
    assert P.round_second_moment(d) == pytest.approx(Iyy, rel=QUAD_REL)
    assert P.round_polar_moment(d) == pytest.approx(Ixx + Iyy, rel=QUAD_REL)
    assert P.round_extreme_fibre(d) == pytest.approx(R, rel=1e-15)


def test_tube_is_round_minus_bore():
    # Roark, 7th ed., Table A.1, hollow circle [C]: properties are outer minus inner disc.
    D, d = 0.06, 0.025
    assert P.tube_area(D, d) == pytest.approx(P.round_area(D) - P.round_area(d), rel=1e-14)
    assert P.tube_second_moment(D, d) == pytest.approx(
        P.round_second_moment(D) - P.round_second_moment(d), rel=1e-14)
    assert P.tube_polar_moment(D, d) == pytest.approx(
        P.round_polar_moment(D) - P.round_polar_moment(d), rel=1e-14)
    assert P.tube_extreme_fibre(D, d) == pytest.approx(D / 2, rel=1e-15)


def test_tube_without_bore_is_round():
    # Limit d -> 0 of the hollow circle (Roark, 7th ed., Table A.1) [C]; exact identity.
    assert P.tube_second_moment(0.05, 0.0) == pytest.approx(P.round_second_moment(0.05), rel=1e-15)


# ---------------------------------------------------------------- rectangle

def test_rectangle_matches_quadrature():
    # Derived [D]: direct integration; Roark, 7th ed., Table A.1, rectangle: Ixx = w h^3/12 [C].
    w, h = 0.03, 0.08
    A, _, Ixx, Iyy = _moments(-h / 2, h / 2, lambda y: -w / 2, lambda y: w / 2)
    assert P.rectangle_area(w, h) == pytest.approx(A, rel=QUAD_REL)
    ixx, iyy = P.rectangle_second_moments(w, h)
    assert ixx == pytest.approx(Ixx, rel=QUAD_REL)
    assert iyy == pytest.approx(Iyy, rel=QUAD_REL)
    assert P.rectangle_polar_moment(w, h) == pytest.approx(Ixx + Iyy, rel=QUAD_REL)
    assert P.rectangle_extreme_fibres(w, h) == pytest.approx((h / 2, w / 2), rel=1e-15)


# ---------------------------------------------------------------- ellipse

def test_ellipse_matches_quadrature():
    # Derived [D]: direct integration; Roark, 7th ed., Table A.1, ellipse: Ixx = pi a b^3/4 [C].
    a, b = 0.05, 0.02
    half = lambda y: a * math.sqrt(max(0.0, 1 - (y / b) ** 2))  # noqa: E731
    A, _, Ixx, Iyy = _moments(-b, b, lambda y: -half(y), half)
    assert P.ellipse_area(a, b) == pytest.approx(A, rel=QUAD_REL)
    ixx, iyy = P.ellipse_second_moments(a, b)
    assert ixx == pytest.approx(Ixx, rel=QUAD_REL)
    assert iyy == pytest.approx(Iyy, rel=QUAD_REL)
    assert P.ellipse_polar_moment(a, b) == pytest.approx(Ixx + Iyy, rel=QUAD_REL)
    assert P.ellipse_extreme_fibres(a, b) == (b, a)


def test_ellipse_with_equal_axes_is_round():
    # Limit a = b of the ellipse is the circle (Roark, 7th ed., Table A.1) [C]; exact identity.
    ixx, iyy = P.ellipse_second_moments(0.02, 0.02)
    assert ixx == pytest.approx(P.round_second_moment(0.04), rel=1e-14)
    assert iyy == pytest.approx(P.round_second_moment(0.04), rel=1e-14)


# ---------------------------------------------------------------- round with a flat

@pytest.mark.parametrize("s_over_d", [0.05, 0.2, 0.5, 0.8])
def test_round_flat_matches_quadrature(s_over_d):
    # Derived [D]: integrate the disc below the flat y <= R - s directly, then move Ixx to the
    # centroid; checks the segment formulas (Roark, 7th ed., Table A.1, from memory).
    d = 0.04
    R = d / 2
    s = s_over_d * d
    A, Sx, Ixx_c, Iyy = _moments(-R, R - s, lambda y: -math.sqrt(max(0.0, R * R - y * y)),
                                 lambda y: math.sqrt(max(0.0, R * R - y * y)),
                                 first_moment=True)
    ybar = Sx / A                      # negative: the centroid moves away from the flat
    assert P.round_flat_area(d, s) == pytest.approx(A, rel=QUAD_REL)
    assert P.round_flat_centroid_offset(d, s) == pytest.approx(-ybar, rel=QUAD_REL)
    ixx, iyy = P.round_flat_second_moments(d, s)
    assert ixx == pytest.approx(Ixx_c - A * ybar**2, rel=QUAD_REL)
    assert iyy == pytest.approx(Iyy, rel=QUAD_REL)
    c_flat, c_round = P.round_flat_extreme_fibres(d, s)
    assert c_flat == pytest.approx((R - s) - ybar, rel=QUAD_REL)
    assert c_round == pytest.approx(R + ybar, rel=QUAD_REL)


def test_half_round_published_values():
    # Semicircle, Roark, 7th ed., Table A.1 [C]: centroid 4R/(3 pi) from the diameter,
    # Ixx = (pi/8 - 8/(9 pi)) R^4 about the centroidal axis, Iyy = pi R^4/8. Exact forms.
    R = 0.015
    assert P.round_flat_area(2 * R, R) == pytest.approx(math.pi * R**2 / 2, rel=1e-13)
    assert P.round_flat_centroid_offset(2 * R, R) == pytest.approx(4 * R / (3 * math.pi), rel=1e-13)
    ixx, iyy = P.round_flat_second_moments(2 * R, R)
    assert ixx == pytest.approx((math.pi / 8 - 8 / (9 * math.pi)) * R**4, rel=1e-12)
    assert iyy == pytest.approx(math.pi * R**4 / 8, rel=1e-13)


def test_round_flat_of_zero_depth_is_round():
    # Limit s -> 0: the full circle (Roark, 7th ed., Table A.1) [C]; exact identity.
    ixx, iyy = P.round_flat_second_moments(0.03, 0.0)
    assert ixx == pytest.approx(P.round_second_moment(0.03), rel=1e-14)
    assert iyy == pytest.approx(P.round_second_moment(0.03), rel=1e-14)
    assert P.round_flat_centroid_offset(0.03, 0.0) == pytest.approx(0.0, abs=1e-18)


# ---------------------------------------------------------------- refusals

@pytest.mark.parametrize("call, field", [
    (lambda: P.round_area(0.0), "d"),
    (lambda: P.round_area(-0.01), "d"),
    (lambda: P.round_area(float("nan")), "d"),
    (lambda: P.round_area(math.inf), "d"),
    (lambda: P.round_area("ten"), "d"),
    (lambda: P.tube_area(0.02, 0.03), "d/D"),
    (lambda: P.tube_area(0.02, 0.02), "d/D"),
    (lambda: P.tube_second_moment(0.02, -0.001), "d"),
    (lambda: P.rectangle_second_moments(0.0, 1.0), "w"),
    (lambda: P.rectangle_second_moments(1.0, -1.0), "h"),
    (lambda: P.ellipse_second_moments(1.0, 0.0), "b"),
    (lambda: P.round_flat_area(0.02, 0.02), "s/d"),
    (lambda: P.round_flat_area(0.02, -0.001), "s/d"),
])
def test_bad_input_refused_with_field_name(call, field):
    # Project rule: bad input gets a one-line error naming the field and the value.
    with pytest.raises(OutOfRangeError) as err:
        call()
    assert err.value.field == field
    assert "\n" not in str(err.value)
    assert str(err.value).startswith(field + " = ")

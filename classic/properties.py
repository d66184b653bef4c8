"""Plain-section properties: area, second moments, polar moment, extreme-fibre distance.

SI throughout: lengths [m], areas [m^2], second moments [m^4]. Axes are centroidal: ``x`` across
the section horizontally, ``y`` vertically; ``Ixx = integral of y^2 dA`` (bending about x),
``Iyy = integral of x^2 dA`` (bending about y), polar moment ``Ixx + Iyy``.

The polar moment equals the Saint-Venant torsion constant only for the solid round and the
concentric tube; for the other shapes use :mod:`classic.torsion`.
"""
from __future__ import annotations

import math

from classic._validity import OutOfRangeError, Validity, checked

__all__ = [
    "round_area", "round_second_moment", "round_polar_moment", "round_extreme_fibre",
    "tube_area", "tube_second_moment", "tube_polar_moment", "tube_extreme_fibre",
    "rectangle_area", "rectangle_second_moments", "rectangle_polar_moment",
    "rectangle_extreme_fibres",
    "ellipse_area", "ellipse_second_moments", "ellipse_polar_moment", "ellipse_extreme_fibres",
    "round_flat_area", "round_flat_centroid_offset", "round_flat_second_moments",
    "round_flat_extreme_fibres",
]

_GEOMETRY = "a length of the section must be positive and finite"

# Validity ranges (data). One object per parameter name; the message names the field.
D_OUTER = Validity("D", 0.0, math.inf, "m", "refuse", _GEOMETRY, strict_low=True, strict_high=True)
D_ROUND = Validity("d", 0.0, math.inf, "m", "refuse", _GEOMETRY, strict_low=True, strict_high=True)
D_BORE = Validity("d", 0.0, math.inf, "m", "refuse", "a bore diameter is zero or positive",
                  strict_high=True)
BORE_RATIO = Validity("d/D", 0.0, 1.0, "", "refuse", "the bore must be smaller than the outside",
                      strict_high=True)
W_RECT = Validity("w", 0.0, math.inf, "m", "refuse", _GEOMETRY, strict_low=True, strict_high=True)
H_RECT = Validity("h", 0.0, math.inf, "m", "refuse", _GEOMETRY, strict_low=True, strict_high=True)
A_SEMI = Validity("a", 0.0, math.inf, "m", "refuse", _GEOMETRY, strict_low=True, strict_high=True)
B_SEMI = Validity("b", 0.0, math.inf, "m", "refuse", _GEOMETRY, strict_low=True, strict_high=True)
FLAT_RATIO = Validity("s/d", 0.0, 1.0, "", "refuse",
                      "a flat removes a depth from 0 up to (not including) the whole diameter",
                      strict_high=True)


_checked = checked  # one definition, in classic._validity


def _tube_dims(D, d) -> tuple[float, float]:
    D = _checked(D_OUTER, D)
    d = _checked(D_BORE, d)
    BORE_RATIO.check(d / D)
    return D, d


# --------------------------------------------------------------------------- solid round

def round_area(d: float) -> float:
    r"""Area of a solid round section.

    .. math:: A = \frac{\pi d^2}{4}

    Parameters
    ----------
    d : float
        Diameter [m]

    Returns
    -------
    float
        Area [m^2]

    Notes
    -----
    Valid for ``d > 0`` (refused otherwise).

    Examples
    --------
    The unit circle has area pi:

    >>> round(round_area(2.0), 4)
    3.1416

    References
    ----------
    .. [1] Young, W. C. and Budynas, R. G., Roark's Formulas for Stress and Strain, 7th ed.,
       McGraw-Hill, 2002, Table A.1 (properties of plane areas), solid circle.
    """
    d = _checked(D_ROUND, d)
    return math.pi * d**2 / 4.0


def round_second_moment(d: float) -> float:
    r"""Second moment of area of a solid round section about any centroidal axis.

    .. math:: I_{xx} = I_{yy} = \frac{\pi d^4}{64}

    Parameters
    ----------
    d : float
        Diameter [m]

    Returns
    -------
    float
        Second moment of area [m^4]

    Notes
    -----
    Valid for ``d > 0`` (refused otherwise).

    Examples
    --------
    >>> round(round_second_moment(1.0), 5)
    0.04909

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, solid circle.
    """
    d = _checked(D_ROUND, d)
    return math.pi * d**4 / 64.0


def round_polar_moment(d: float) -> float:
    r"""Polar moment of area of a solid round section.

    .. math:: I_p = I_{xx} + I_{yy} = \frac{\pi d^4}{32}

    Parameters
    ----------
    d : float
        Diameter [m]

    Returns
    -------
    float
        Polar moment of area [m^4]

    Notes
    -----
    Valid for ``d > 0`` (refused otherwise). For the round bar this is also the torsion constant.

    Examples
    --------
    >>> round(round_polar_moment(1.0), 5)
    0.09817

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, solid circle.
    """
    d = _checked(D_ROUND, d)
    return math.pi * d**4 / 32.0


def round_extreme_fibre(d: float) -> float:
    r"""Distance from the centroid to the extreme fibre of a solid round section.

    .. math:: c = \frac{d}{2}

    Parameters
    ----------
    d : float
        Diameter [m]

    Returns
    -------
    float
        Extreme-fibre distance [m]

    Notes
    -----
    Valid for ``d > 0`` (refused otherwise).

    Examples
    --------
    >>> round_extreme_fibre(0.05)
    0.025

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, solid circle.
    """
    d = _checked(D_ROUND, d)
    return d / 2.0


# --------------------------------------------------------------------------- tube

def tube_area(D: float, d: float) -> float:
    r"""Area of a concentric tube (round shaft with a central bore).

    .. math:: A = \frac{\pi (D^2 - d^2)}{4}

    Parameters
    ----------
    D : float
        Outside diameter [m]
    d : float
        Bore diameter [m]

    Returns
    -------
    float
        Area [m^2]

    Notes
    -----
    Valid for ``D > 0`` and ``0 <= d < D`` (refused otherwise); ``d = 0`` is the solid round.

    Examples
    --------
    >>> round(tube_area(2.0, 1.0), 4)
    2.3562

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, hollow circle.
    """
    D, d = _tube_dims(D, d)
    return math.pi * (D**2 - d**2) / 4.0


def tube_second_moment(D: float, d: float) -> float:
    r"""Second moment of area of a concentric tube about any centroidal axis.

    .. math:: I_{xx} = I_{yy} = \frac{\pi (D^4 - d^4)}{64}

    Parameters
    ----------
    D : float
        Outside diameter [m]
    d : float
        Bore diameter [m]

    Returns
    -------
    float
        Second moment of area [m^4]

    Notes
    -----
    Valid for ``D > 0`` and ``0 <= d < D`` (refused otherwise).

    Examples
    --------
    >>> round(tube_second_moment(1.0, 0.5), 5)
    0.04602

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, hollow circle.
    """
    D, d = _tube_dims(D, d)
    return math.pi * (D**4 - d**4) / 64.0


def tube_polar_moment(D: float, d: float) -> float:
    r"""Polar moment of area of a concentric tube.

    .. math:: I_p = \frac{\pi (D^4 - d^4)}{32}

    Parameters
    ----------
    D : float
        Outside diameter [m]
    d : float
        Bore diameter [m]

    Returns
    -------
    float
        Polar moment of area [m^4]

    Notes
    -----
    Valid for ``D > 0`` and ``0 <= d < D`` (refused otherwise). Equal to the tube's torsion
    constant.

    Examples
    --------
    >>> round(tube_polar_moment(1.0, 0.5), 5)
    0.09204

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, hollow circle.
    """
    D, d = _tube_dims(D, d)
    return math.pi * (D**4 - d**4) / 32.0


def tube_extreme_fibre(D: float, d: float) -> float:
    r"""Distance from the centroid to the extreme fibre of a concentric tube.

    .. math:: c = \frac{D}{2}

    Parameters
    ----------
    D : float
        Outside diameter [m]
    d : float
        Bore diameter [m]

    Returns
    -------
    float
        Extreme-fibre distance [m]

    Notes
    -----
    Valid for ``D > 0`` and ``0 <= d < D`` (refused otherwise).

    Examples
    --------
    >>> tube_extreme_fibre(0.05, 0.02)
    0.025

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, hollow circle.
    """
    D, d = _tube_dims(D, d)
    return D / 2.0


# --------------------------------------------------------------------------- rectangle

def rectangle_area(w: float, h: float) -> float:
    r"""Area of a rectangle.

    .. math:: A = w h

    Parameters
    ----------
    w : float
        Width, along x [m]
    h : float
        Height, along y [m]

    Returns
    -------
    float
        Area [m^2]

    Notes
    -----
    Valid for ``w > 0``, ``h > 0`` (refused otherwise).

    Examples
    --------
    >>> rectangle_area(2.0, 3.0)
    6.0

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, rectangle.
    """
    w = _checked(W_RECT, w)
    h = _checked(H_RECT, h)
    return w * h


def rectangle_second_moments(w: float, h: float) -> tuple[float, float]:
    r"""Centroidal second moments of area of a rectangle.

    .. math:: I_{xx} = \frac{w h^3}{12}, \qquad I_{yy} = \frac{h w^3}{12}

    Parameters
    ----------
    w : float
        Width, along x [m]
    h : float
        Height, along y [m]

    Returns
    -------
    tuple of float
        ``(Ixx, Iyy)`` [m^4]: about the centroidal x axis (parallel to the width) and about the
        centroidal y axis.

    Notes
    -----
    Valid for ``w > 0``, ``h > 0`` (refused otherwise).

    Examples
    --------
    >>> tuple(round(i, 4) for i in rectangle_second_moments(1.0, 2.0))
    (0.6667, 0.1667)

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, rectangle.
    """
    w = _checked(W_RECT, w)
    h = _checked(H_RECT, h)
    return w * h**3 / 12.0, h * w**3 / 12.0


def rectangle_polar_moment(w: float, h: float) -> float:
    r"""Polar moment of area of a rectangle about its centroid.

    .. math:: I_p = \frac{w h (w^2 + h^2)}{12}

    Parameters
    ----------
    w : float
        Width, along x [m]
    h : float
        Height, along y [m]

    Returns
    -------
    float
        Polar moment of area [m^4]

    Notes
    -----
    Valid for ``w > 0``, ``h > 0`` (refused otherwise). This is *not* the torsion constant of
    the rectangle (see :func:`classic.torsion.rectangle_torsion_constant`); for a square it is
    about 18 % larger.

    Examples
    --------
    >>> round(rectangle_polar_moment(1.0, 1.0), 4)
    0.1667

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, rectangle.
    """
    w = _checked(W_RECT, w)
    h = _checked(H_RECT, h)
    return w * h * (w**2 + h**2) / 12.0


def rectangle_extreme_fibres(w: float, h: float) -> tuple[float, float]:
    r"""Extreme-fibre distances of a rectangle.

    .. math:: c_y = \frac{h}{2}, \qquad c_x = \frac{w}{2}

    Parameters
    ----------
    w : float
        Width, along x [m]
    h : float
        Height, along y [m]

    Returns
    -------
    tuple of float
        ``(c_y, c_x)`` [m]: for bending about x (use with Ixx) and about y (use with Iyy).

    Notes
    -----
    Valid for ``w > 0``, ``h > 0`` (refused otherwise).

    Examples
    --------
    >>> rectangle_extreme_fibres(0.02, 0.06)
    (0.03, 0.01)

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, rectangle.
    """
    w = _checked(W_RECT, w)
    h = _checked(H_RECT, h)
    return h / 2.0, w / 2.0


# --------------------------------------------------------------------------- ellipse

def ellipse_area(a: float, b: float) -> float:
    r"""Area of a solid ellipse.

    .. math:: A = \pi a b

    Parameters
    ----------
    a : float
        Semi-axis along x [m]
    b : float
        Semi-axis along y [m]

    Returns
    -------
    float
        Area [m^2]

    Notes
    -----
    Valid for ``a > 0``, ``b > 0`` (refused otherwise).

    Examples
    --------
    >>> round(ellipse_area(2.0, 1.0), 4)
    6.2832

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, solid ellipse.
    """
    a = _checked(A_SEMI, a)
    b = _checked(B_SEMI, b)
    return math.pi * a * b


def ellipse_second_moments(a: float, b: float) -> tuple[float, float]:
    r"""Centroidal second moments of area of a solid ellipse.

    .. math:: I_{xx} = \frac{\pi a b^3}{4}, \qquad I_{yy} = \frac{\pi a^3 b}{4}

    Parameters
    ----------
    a : float
        Semi-axis along x [m]
    b : float
        Semi-axis along y [m]

    Returns
    -------
    tuple of float
        ``(Ixx, Iyy)`` [m^4]

    Notes
    -----
    Valid for ``a > 0``, ``b > 0`` (refused otherwise).

    Examples
    --------
    >>> tuple(round(i, 4) for i in ellipse_second_moments(2.0, 1.0))
    (1.5708, 6.2832)

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, solid ellipse.
    """
    a = _checked(A_SEMI, a)
    b = _checked(B_SEMI, b)
    return math.pi * a * b**3 / 4.0, math.pi * a**3 * b / 4.0


def ellipse_polar_moment(a: float, b: float) -> float:
    r"""Polar moment of area of a solid ellipse about its centroid.

    .. math:: I_p = \frac{\pi a b (a^2 + b^2)}{4}

    Parameters
    ----------
    a : float
        Semi-axis along x [m]
    b : float
        Semi-axis along y [m]

    Returns
    -------
    float
        Polar moment of area [m^4]

    Notes
    -----
    Valid for ``a > 0``, ``b > 0`` (refused otherwise). Not the torsion constant unless
    ``a = b`` (see :func:`classic.torsion.ellipse_torsion_constant`).

    Examples
    --------
    >>> round(ellipse_polar_moment(2.0, 1.0), 4)
    7.854

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, solid ellipse.
    """
    a = _checked(A_SEMI, a)
    b = _checked(B_SEMI, b)
    return math.pi * a * b * (a**2 + b**2) / 4.0


def ellipse_extreme_fibres(a: float, b: float) -> tuple[float, float]:
    r"""Extreme-fibre distances of a solid ellipse.

    .. math:: c_y = b, \qquad c_x = a

    Parameters
    ----------
    a : float
        Semi-axis along x [m]
    b : float
        Semi-axis along y [m]

    Returns
    -------
    tuple of float
        ``(c_y, c_x)`` [m]: for bending about x (use with Ixx) and about y (use with Iyy).

    Notes
    -----
    Valid for ``a > 0``, ``b > 0`` (refused otherwise).

    Examples
    --------
    >>> ellipse_extreme_fibres(0.03, 0.02)
    (0.02, 0.03)

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, solid ellipse.
    """
    a = _checked(A_SEMI, a)
    b = _checked(B_SEMI, b)
    return b, a


# --------------------------------------------------------------------------- round with a flat
#
# Round of radius R = d/2 with a flat cut parallel to the x axis at y = c = R - s (s the depth
# removed). The removed circular segment spans the half-angle alpha, cos(alpha) = c/R:
#   segment area        A_s  = R^2 (alpha - sin(alpha) cos(alpha))
#   segment centroid    y_s  = 2 R^3 sin(alpha)^3 / (3 A_s)     (from the circle's centre)
#   about the x axis through the circle's centre
#                       Ix_s = R^4/4 (alpha - sin cos + 2 sin^3 cos)
#   about the symmetry (y) axis
#                       Iy_s = R^4/12 (3 alpha - 3 sin cos - 2 sin^3 cos)
# The remaining section is the circle minus the segment.

def _segment(d: float, s: float) -> tuple[float, float, float, float, float]:
    d = _checked(D_ROUND, d)
    try:
        s = float(s)
    except (TypeError, ValueError):
        raise OutOfRangeError("s", s, "is not a real number") from None
    FLAT_RATIO.check(s / d)
    R = d / 2.0
    alpha = math.acos((R - s) / R)
    sn, cs = math.sin(alpha), math.cos(alpha)
    a_s = R**2 * (alpha - sn * cs)
    ay_s = 2.0 * R**3 * sn**3 / 3.0          # first moment of the segment about the centre
    ix_s = R**4 / 4.0 * (alpha - sn * cs + 2.0 * sn**3 * cs)
    iy_s = R**4 / 12.0 * (3.0 * alpha - 3.0 * sn * cs - 2.0 * sn**3 * cs)
    return R, a_s, ay_s, ix_s, iy_s


def round_flat_area(d: float, s: float) -> float:
    r"""Area of a round section with one flat (a circular segment removed).

    .. math:: A = \frac{\pi d^2}{4} - R^2(\alpha - \sin\alpha\cos\alpha),
              \qquad \cos\alpha = \frac{R - s}{R},\; R = \frac{d}{2}

    Parameters
    ----------
    d : float
        Diameter of the round [m]
    s : float
        Depth of the flat, measured from the original surface [m]

    Returns
    -------
    float
        Area [m^2]

    Notes
    -----
    Valid for ``d > 0`` and ``0 <= s < d`` (refused otherwise). ``s = d/2`` is the half-round.

    Examples
    --------
    The half-round of radius 1 has area pi/2:

    >>> round(round_flat_area(2.0, 1.0), 4)
    1.5708

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, circular segment
       (the subtracted part; segment formulas from memory, re-derived and checked by
       quadrature in the tests).
    """
    R, a_s, _, _, _ = _segment(d, s)
    return math.pi * R**2 - a_s


def round_flat_centroid_offset(d: float, s: float) -> float:
    r"""Shift of the centroid of a round with one flat, away from the flat.

    .. math:: e = \frac{\tfrac{2}{3} R^3 \sin^3\alpha}{A}, \qquad \cos\alpha = \frac{R-s}{R}

    Parameters
    ----------
    d : float
        Diameter of the round [m]
    s : float
        Depth of the flat [m]

    Returns
    -------
    float
        Distance from the circle's centre to the centroid of the remaining section, measured
        away from the flat [m]

    Notes
    -----
    Valid for ``d > 0`` and ``0 <= s < d`` (refused otherwise).

    Examples
    --------
    Half-round, radius 1: the centroid lies 4R/(3 pi) from the flat side:

    >>> round(round_flat_centroid_offset(2.0, 1.0), 4)
    0.4244

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, circular segment and
       semicircle (from memory; checked by quadrature in the tests).
    """
    R, a_s, ay_s, _, _ = _segment(d, s)
    return ay_s / (math.pi * R**2 - a_s)


def round_flat_second_moments(d: float, s: float) -> tuple[float, float]:
    r"""Centroidal second moments of area of a round with one flat.

    .. math::
        I_{xx} = \frac{\pi R^4}{4} - \frac{R^4}{4}\left(\alpha - \sin\alpha\cos\alpha
                 + 2\sin^3\alpha\cos\alpha\right) - A e^2, \qquad
        I_{yy} = \frac{\pi R^4}{4} - \frac{R^4}{12}\left(3\alpha - 3\sin\alpha\cos\alpha
                 - 2\sin^3\alpha\cos\alpha\right)

    Parameters
    ----------
    d : float
        Diameter of the round [m]
    s : float
        Depth of the flat [m]

    Returns
    -------
    tuple of float
        ``(Ixx, Iyy)`` [m^4]: ``Ixx`` about the centroidal axis parallel to the flat, ``Iyy``
        about the axis of symmetry (perpendicular to the flat).

    Notes
    -----
    Valid for ``d > 0`` and ``0 <= s < d`` (refused otherwise). ``e`` is
    :func:`round_flat_centroid_offset`, ``A`` is :func:`round_flat_area`.

    Examples
    --------
    Half-round, radius 1: Ixx = (pi/8 - 8/(9 pi)) R^4, Iyy = pi R^4/8:

    >>> tuple(round(i, 4) for i in round_flat_second_moments(2.0, 1.0))
    (0.1098, 0.3927)

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, circular segment and
       semicircle (from memory; checked by quadrature in the tests).
    """
    R, a_s, ay_s, ix_s, iy_s = _segment(d, s)
    area = math.pi * R**2 - a_s
    e = ay_s / area
    ixx = math.pi * R**4 / 4.0 - ix_s - area * e**2
    iyy = math.pi * R**4 / 4.0 - iy_s
    return ixx, iyy


def round_flat_extreme_fibres(d: float, s: float) -> tuple[float, float]:
    r"""Extreme-fibre distances of a round with one flat, for bending about the axis parallel to the flat.

    .. math:: c_{flat} = (R - s) + e, \qquad c_{round} = R - e

    Parameters
    ----------
    d : float
        Diameter of the round [m]
    s : float
        Depth of the flat [m]

    Returns
    -------
    tuple of float
        ``(c_flat, c_round)`` [m]: from the centroidal axis to the flat and to the far round
        surface. The larger one gives the peak bending stress with ``Ixx``.

    Notes
    -----
    Valid for ``d > 0`` and ``0 <= s < d`` (refused otherwise). For bending about the axis
    of symmetry the extreme fibre is at ``R`` if ``s <= R``, else at the ends of the flat.

    Examples
    --------
    Half-round, radius 1:

    >>> tuple(round(c, 4) for c in round_flat_extreme_fibres(2.0, 1.0))
    (0.4244, 0.5756)

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table A.1, semicircle
       (from memory; checked by quadrature in the tests).
    """
    R, a_s, ay_s, _, _ = _segment(d, s)
    e = ay_s / (math.pi * R**2 - a_s)
    return (R - float(s)) + e, R - e

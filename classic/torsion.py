"""Saint-Venant torsion: closed-form torsion constants and peak shear stresses.

Each function returns either the torsion constant ``J`` [m^4] (torque per unit twist per unit
length per unit shear modulus: ``T = G J theta``) or a peak shear stress [Pa] for a torque
``T`` [N*m]. SI throughout.

Not included: a closed-form or empirical torsion constant for a round shaft with a keyway.
Published approximations exist, but none is given here: none could be confirmed against its
source when this module was written. Use the finite-element solve for keyed sections.
"""
from __future__ import annotations

import math
from numbers import Real

import numpy as np

from classic._validity import OutOfRangeError, Validity, checked
from classic.properties import _tube_dims  # the same tube checks for torsion and properties

__all__ = [
    "round_torsion_constant", "round_peak_shear", "keyed_nominal_shear",
    "tube_torsion_constant", "tube_peak_shear",
    "ellipse_torsion_constant", "ellipse_peak_shear",
    "hollow_ellipse_torsion_constant", "hollow_ellipse_peak_shear",
    "equilateral_triangle_torsion_constant", "equilateral_triangle_peak_shear",
    "rectangle_torsion_series", "rectangle_torsion_constant", "rectangle_peak_shear",
    "RECTANGLE_TABLE", "rectangle_coefficients_table",
    "thin_closed_torsion_constant", "thin_closed_shear",
    "thin_open_torsion_constant", "thin_open_peak_shear",
    "shear_from_torsion_constant",
]

_GEOMETRY = "a length of the section must be positive and finite"
_THIN = "thin-wall theory; t/size <= 0.1 is common practice"


def _positive(name: str, unit: str = "m") -> Validity:
    return Validity(name, 0.0, math.inf, unit, "refuse", _GEOMETRY,
                    strict_low=True, strict_high=True)


def _finite(name: str, unit: str) -> Validity:
    return Validity(name, -math.inf, math.inf, unit, "refuse", "must be a finite number",
                    strict_low=True, strict_high=True)


# Validity ranges (data), one object per parameter name used below.
TORQUE = _finite("T", "N*m")
D_ROUND = _positive("d")
D_OUTER = _positive("D")
D_BORE = Validity("d", 0.0, math.inf, "m", "refuse", "a bore diameter is zero or positive",
                  strict_high=True)
BORE_RATIO = Validity("d/D", 0.0, 1.0, "", "refuse", "the bore must be smaller than the outside",
                      strict_high=True)
A_SEMI = _positive("a")
B_SEMI = _positive("b")
ELLIPSE_ORDER = Validity("b/a", 0.0, 1.0, "", "refuse",
                         "a must be the major semi-axis (a >= b) for the peak at the minor-axis ends",
                         strict_low=True)
Q_HOLLOW = Validity("q", 0.0, 1.0, "", "refuse",
                    "inner ellipse = q times the outer; 0 <= q < 1", strict_high=True)
A_SIDE = _positive("a")
W_RECT = _positive("w")
T_RECT = _positive("t")
NTERMS = Validity("nterms", 1, 100000, "", "refuse", "number of odd series terms")
TABLE_RATIO = Validity("ratio", 1.0, 10.0, "", "refuse",
                       "printed table spans w/t = 1 ... 10 (and infinity); no extrapolation")
AM = _positive("Am", "m^2")
WALL_INTEGRAL = _positive("perimeter_over_t", "")
SEG_LENGTH = _positive("length")
SEG_THICK = _positive("thickness")
SEG_B = _positive("b")
T_WALL = _positive("t")
T_MAX = _positive("t_max")
J_CONST = _positive("J", "m^4")
C_DIST = Validity("c", 0.0, math.inf, "m", "refuse", "a fibre distance is zero or positive",
                  strict_high=True)
THIN_CLOSED = Validity("t/r_m", 0.0, 0.1, "", "warn", _THIN)
THIN_OPEN = Validity("t/b", 0.0, 0.1, "", "warn", _THIN)


_checked = checked  # one definition, in classic._validity


# --------------------------------------------------------------------------- solid round

def round_torsion_constant(d: float) -> float:
    r"""Torsion constant of a solid round shaft.

    .. math:: J = \frac{\pi d^4}{32}

    Parameters
    ----------
    d : float
        Diameter [m]

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    Exact (Coulomb; Saint-Venant). Valid for ``d > 0`` (refused otherwise).

    Examples
    --------
    >>> round(round_torsion_constant(1.0), 5)
    0.09817

    References
    ----------
    .. [1] Young, W. C. and Budynas, R. G., Roark's Formulas for Stress and Strain, 7th ed.,
       McGraw-Hill, 2002, Table 10.1, solid circular section.
    """
    d = _checked(D_ROUND, d)
    return math.pi * d**4 / 32.0


def round_peak_shear(T: float, d: float) -> float:
    r"""Peak torsional shear stress of a solid round shaft (on the surface).

    .. math:: \tau_{max} = \frac{16 T}{\pi d^3}

    Parameters
    ----------
    T : float
        Torque [N*m]
    d : float
        Diameter [m]

    Returns
    -------
    float
        Peak shear stress [Pa]

    Notes
    -----
    Exact. Valid for ``d > 0`` (refused otherwise).

    Examples
    --------
    The coefficient 16/pi:

    >>> round(round_peak_shear(1.0, 1.0), 4)
    5.093

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, solid circular section.
    """
    T = _checked(TORQUE, T)
    d = _checked(D_ROUND, d)
    return 16.0 * T / (math.pi * d**3)


def keyed_nominal_shear(T: float, d: float) -> float:
    r"""Nominal torsional shear stress of a keyed shaft, on the full (un-keyed) diameter.

    .. math:: \tau_{nom} = \frac{16 T}{\pi d^3}

    Parameters
    ----------
    T : float
        Torque [N*m]
    d : float
        Shaft diameter, not reduced for the keyseat [m]

    Returns
    -------
    float
        Nominal shear stress [Pa]

    Notes
    -----
    This is *not* the peak stress of a keyed section. It is the nominal stress that the
    published keyseat torsional stress-concentration factors ``Kts`` multiply: the peak at the
    keyseat is ``Kts * 16 T / (pi d^3)`` with ``d`` the full shaft diameter. Peterson's charts
    and Shigley's shaft equations use this convention; a factor measured against another
    nominal (for example the net section) cannot be compared with them. Valid for ``d > 0``.

    Examples
    --------
    Shigley's first-iteration end-milled keyseat estimate Kts = 3.0 (9th ed., Table 7-1) applied
    to the nominal of a unit shaft under unit torque:

    >>> round(3.0 * keyed_nominal_shear(1.0, 1.0), 3)
    15.279

    References
    ----------
    .. [1] Pilkey, W. D. and Pilkey, D. F., Peterson's Stress Concentration Factors, 3rd ed.,
       Wiley, 2008, keyseat charts (nominal on the full diameter; chapter from memory).
    .. [2] Budynas, R. G. and Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, eqs. 7-7 to 7-14 and Table 7-1.
    """
    return round_peak_shear(T, d)


# --------------------------------------------------------------------------- tube



def tube_torsion_constant(D: float, d: float) -> float:
    r"""Torsion constant of a concentric round tube.

    .. math:: J = \frac{\pi (D^4 - d^4)}{32}

    Parameters
    ----------
    D : float
        Outside diameter [m]
    d : float
        Bore diameter [m]

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    Exact for any wall thickness. Valid for ``D > 0`` and ``0 <= d < D`` (refused otherwise).

    Examples
    --------
    >>> round(tube_torsion_constant(1.0, 0.5), 5)
    0.09204

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, hollow concentric
       circular section.
    """
    D, d = _tube_dims(D, d)
    return math.pi * (D**4 - d**4) / 32.0


def tube_peak_shear(T: float, D: float, d: float) -> float:
    r"""Peak torsional shear stress of a concentric round tube (on the outside surface).

    .. math:: \tau_{max} = \frac{16 T D}{\pi (D^4 - d^4)}

    Parameters
    ----------
    T : float
        Torque [N*m]
    D : float
        Outside diameter [m]
    d : float
        Bore diameter [m]

    Returns
    -------
    float
        Peak shear stress [Pa]

    Notes
    -----
    Exact. Valid for ``D > 0`` and ``0 <= d < D`` (refused otherwise).

    Examples
    --------
    >>> round(tube_peak_shear(1.0, 1.0, 0.5), 4)
    5.4325

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, hollow concentric
       circular section.
    """
    T = _checked(TORQUE, T)
    D, d = _tube_dims(D, d)
    return 16.0 * T * D / (math.pi * (D**4 - d**4))


# --------------------------------------------------------------------------- ellipse

def ellipse_torsion_constant(a: float, b: float) -> float:
    r"""Torsion constant of a solid ellipse.

    .. math:: J = \frac{\pi a^3 b^3}{a^2 + b^2}

    Parameters
    ----------
    a : float
        Semi-axis [m]
    b : float
        Other semi-axis [m]

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    Exact: the Prandtl function
    :math:`\phi = \frac{a^2 b^2}{a^2+b^2}\left(1 - \frac{x^2}{a^2} - \frac{y^2}{b^2}\right)`
    satisfies :math:`\nabla^2\phi = -2` and vanishes on the boundary. Symmetric in ``a`` and
    ``b``. Valid for ``a, b > 0`` (refused otherwise).

    Examples
    --------
    Ellipse with a = 2b, b = 1:

    >>> round(ellipse_torsion_constant(2.0, 1.0), 4)
    5.0265

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, solid elliptical section.
    """
    a = _checked(A_SEMI, a)
    b = _checked(B_SEMI, b)
    return math.pi * a**3 * b**3 / (a**2 + b**2)


def ellipse_peak_shear(T: float, a: float, b: float) -> float:
    r"""Peak torsional shear stress of a solid ellipse, at the ends of the minor axis.

    .. math:: \tau_{max} = \frac{2 T}{\pi a b^2}

    Parameters
    ----------
    T : float
        Torque [N*m]
    a : float
        Major semi-axis [m]
    b : float
        Minor semi-axis [m]

    Returns
    -------
    float
        Peak shear stress [Pa]

    Notes
    -----
    Exact. Valid for ``a >= b > 0``; ``a < b`` is refused (pass the major semi-axis as ``a``).

    Examples
    --------
    >>> round(ellipse_peak_shear(1.0, 2.0, 1.0), 4)
    0.3183

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, solid elliptical section.
    """
    T = _checked(TORQUE, T)
    a = _checked(A_SEMI, a)
    b = _checked(B_SEMI, b)
    ELLIPSE_ORDER.check(b / a)
    return 2.0 * T / (math.pi * a * b**2)


def hollow_ellipse_torsion_constant(a: float, b: float, q: float) -> float:
    r"""Torsion constant of a hollow ellipse bounded by two similar, concentric ellipses.

    .. math:: J = \frac{\pi a^3 b^3}{a^2 + b^2}\,(1 - q^4)

    Parameters
    ----------
    a : float
        Outer semi-axis [m]
    b : float
        Other outer semi-axis [m]
    q : float
        Ratio of inner to outer size: inner semi-axes ``q a`` and ``q b`` [-]

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    Exact. The solid-ellipse Prandtl function
    :math:`\phi = k(1 - x^2/a^2 - y^2/b^2)`, :math:`k = a^2 b^2/(a^2+b^2)`, takes the constant
    value :math:`c = k(1-q^2)` on the inner ellipse, so the inner boundary is traction-free;
    the warping of the solid is single-valued in the annulus, so the hole (circulation)
    condition holds too. Inside the core, :math:`\phi - c` is the Prandtl function of the solid
    inner ellipse; hence :math:`J = 2\int_{annulus}\phi\,dA + 2cA_{hole}` equals
    :math:`J_{outer} - J_{inner} = J_{outer}(1 - q^4)`.
    Valid for ``a, b > 0``, ``0 <= q < 1`` (refused otherwise); ``q = 0`` is the solid ellipse
    and ``a = b`` the concentric tube.

    Examples
    --------
    Circle of radius 1 with a bore of radius 1/2 (the tube J = pi (D^4 - d^4)/32):

    >>> round(hollow_ellipse_torsion_constant(1.0, 1.0, 0.5), 4)
    1.4726

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, hollow elliptical
       section bounded by similar ellipses.
    """
    a = _checked(A_SEMI, a)
    b = _checked(B_SEMI, b)
    q = _checked(Q_HOLLOW, q)
    return math.pi * a**3 * b**3 / (a**2 + b**2) * (1.0 - q**4)


def hollow_ellipse_peak_shear(T: float, a: float, b: float, q: float) -> float:
    r"""Peak torsional shear stress of a hollow ellipse (similar ellipses), at the outer minor-axis ends.

    .. math:: \tau_{max} = \frac{2 T}{\pi a b^2 (1 - q^4)}

    Parameters
    ----------
    T : float
        Torque [N*m]
    a : float
        Outer major semi-axis [m]
    b : float
        Outer minor semi-axis [m]
    q : float
        Ratio of inner to outer size [-]

    Returns
    -------
    float
        Peak shear stress [Pa]

    Notes
    -----
    Exact (same stress function as :func:`hollow_ellipse_torsion_constant`; the stress grows
    linearly outward along each ray, so the peak is on the outer boundary). Valid for
    ``a >= b > 0``, ``0 <= q < 1`` (refused otherwise).

    Examples
    --------
    >>> round(hollow_ellipse_peak_shear(1.0, 2.0, 1.0, 0.5), 4)
    0.3395

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, hollow elliptical
       section bounded by similar ellipses.
    """
    T = _checked(TORQUE, T)
    a = _checked(A_SEMI, a)
    b = _checked(B_SEMI, b)
    ELLIPSE_ORDER.check(b / a)
    q = _checked(Q_HOLLOW, q)
    return 2.0 * T / (math.pi * a * b**2 * (1.0 - q**4))


# --------------------------------------------------------------------------- triangle

def equilateral_triangle_torsion_constant(a: float) -> float:
    r"""Torsion constant of an equilateral triangle.

    .. math:: J = \frac{\sqrt{3}\, a^4}{80}

    Parameters
    ----------
    a : float
        Side length [m]

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    Exact (Saint-Venant). Valid for ``a > 0`` (refused otherwise).

    Examples
    --------
    >>> round(equilateral_triangle_torsion_constant(1.0), 5)
    0.02165

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, equilateral triangle.
    """
    a = _checked(A_SIDE, a)
    return math.sqrt(3.0) * a**4 / 80.0


def equilateral_triangle_peak_shear(T: float, a: float) -> float:
    r"""Peak torsional shear stress of an equilateral triangle, at the middle of each side.

    .. math:: \tau_{max} = \frac{20 T}{a^3}

    Parameters
    ----------
    T : float
        Torque [N*m]
    a : float
        Side length [m]

    Returns
    -------
    float
        Peak shear stress [Pa]

    Notes
    -----
    Exact. Valid for ``a > 0`` (refused otherwise).

    Examples
    --------
    >>> equilateral_triangle_peak_shear(1.0, 1.0)
    20.0

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, equilateral triangle.
    """
    T = _checked(TORQUE, T)
    a = _checked(A_SIDE, a)
    return 20.0 * T / a**3


# --------------------------------------------------------------------------- rectangle

def _long_short(w, t) -> tuple[float, float]:
    w = _checked(W_RECT, w)
    t = _checked(T_RECT, t)
    return (w, t) if w >= t else (t, w)


def rectangle_torsion_series(w: float, t: float, nterms: int = 100) -> tuple[float, float]:
    r"""Saint-Venant series coefficients of a solid rectangle: ``J = beta w t^3``, ``tau_max = T/(alpha w t^2)``.

    .. math::
        \beta = \frac{1}{3}\left[1 - \frac{192}{\pi^5}\frac{t}{w}
                \sum_{n=1,3,5,\dots} \frac{\tanh(n\pi w/2t)}{n^5}\right], \quad
        k = 1 - \frac{8}{\pi^2}\sum_{n=1,3,5,\dots}\frac{1}{n^2\cosh(n\pi w/2t)}, \quad
        \alpha = \frac{\beta}{k}

    Parameters
    ----------
    w : float
        Long side [m]
    t : float
        Short side [m]
    nterms : int, optional
        Number of odd terms ``n = 1, 3, ...`` kept in each sum [-]. The 1/n^5 sum is converged
        to about 1e-9 at the default.

    Returns
    -------
    tuple of float
        ``(beta, alpha)`` [-]

    Notes
    -----
    Exact series (converged, not rounded). The peak stress is at the middle of the long sides.
    If ``w < t`` the two are swapped: the coefficients depend only on long/short. Valid for
    ``w, t > 0``.

    Examples
    --------
    w/t = 2 (printed: beta 0.229, alpha 0.246):

    >>> tuple(round(c, 3) for c in rectangle_torsion_series(2.0, 1.0))
    (0.229, 0.246)

    References
    ----------
    .. [1] Timoshenko, S. P. and Goodier, J. N., Theory of Elasticity, 3rd ed., McGraw-Hill,
       1970, torsion of rectangular bars (series form from memory; values re-derived).
    """
    w, t = _long_short(w, t)
    nterms = int(_checked(NTERMS, nterms))
    n = np.arange(1, 2 * nterms, 2, dtype=float)
    x = n * math.pi * w / (2.0 * t)
    sech = 2.0 * np.exp(-x) / (1.0 + np.exp(-2.0 * x))     # 1/cosh without overflow
    beta = (1.0 - (192.0 / math.pi**5) * (t / w) * float(np.sum(np.tanh(x) / n**5))) / 3.0
    k = 1.0 - (8.0 / math.pi**2) * float(np.sum(sech / n**2))
    return beta, beta / k


def rectangle_torsion_constant(w: float, t: float) -> float:
    r"""Torsion constant of a solid rectangle from the Saint-Venant series.

    .. math:: J = \beta\, w\, t^3

    Parameters
    ----------
    w : float
        Long side [m]
    t : float
        Short side [m]

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    ``beta`` from :func:`rectangle_torsion_series`. ``w`` and ``t`` are swapped if ``w < t``.
    Valid for ``w, t > 0``.

    Examples
    --------
    Square of side 1 (beta = 0.1406):

    >>> round(rectangle_torsion_constant(1.0, 1.0), 4)
    0.1406

    References
    ----------
    .. [1] Timoshenko & Goodier, Theory of Elasticity, 3rd ed., torsion of rectangular bars
       (from memory for the section).
    """
    w, t = _long_short(w, t)
    beta, _ = rectangle_torsion_series(w, t)
    return beta * w * t**3


def rectangle_peak_shear(T: float, w: float, t: float) -> float:
    r"""Peak torsional shear stress of a solid rectangle, at the middle of the long sides.

    .. math:: \tau_{max} = \frac{T}{\alpha\, w\, t^2}

    Parameters
    ----------
    T : float
        Torque [N*m]
    w : float
        Long side [m]
    t : float
        Short side [m]

    Returns
    -------
    float
        Peak shear stress [Pa]

    Notes
    -----
    ``alpha`` from :func:`rectangle_torsion_series`. ``w`` and ``t`` are swapped if ``w < t``.
    Valid for ``w, t > 0``.

    Examples
    --------
    Square of side 1 under unit torque (alpha = 0.2082):

    >>> round(rectangle_peak_shear(1.0, 1.0, 1.0), 3)
    4.804

    References
    ----------
    .. [1] Timoshenko & Goodier, Theory of Elasticity, 3rd ed., torsion of rectangular bars
       (from memory for the section).
    """
    T = _checked(TORQUE, T)
    w, t = _long_short(w, t)
    _, alpha = rectangle_torsion_series(w, t)
    return T / (alpha * w * t**2)


#: Printed coefficient table for the solid rectangle, ``w/t -> (alpha, beta)``, as printed
#: (rounded to three figures) in Shigley's Mechanical Engineering Design and in Roark.
RECTANGLE_TABLE: dict[float, tuple[float, float]] = {
    1.0: (0.208, 0.141),
    1.5: (0.231, 0.196),
    2.0: (0.246, 0.229),
    3.0: (0.267, 0.263),
    4.0: (0.282, 0.281),
    6.0: (0.299, 0.299),
    10.0: (0.313, 0.313),
    math.inf: (0.333, 0.333),
}


def rectangle_coefficients_table(ratio: float) -> tuple[float, float]:
    r"""Rectangle torsion coefficients ``(alpha, beta)`` from the printed table, interpolated linearly.

    .. math:: J = \beta w t^3, \qquad \tau_{max} = \frac{T}{\alpha w t^2}

    Parameters
    ----------
    ratio : float
        Long side over short side, ``w/t`` [-]

    Returns
    -------
    tuple of float
        ``(alpha, beta)`` [-]

    Notes
    -----
    This is the printed table, rounded to three figures; it differs from the converged series
    (:func:`rectangle_torsion_series`) by up to 0.001. Linear interpolation between tabulated
    ratios only, for ``1 <= ratio <= 10``; ``ratio = inf`` returns the printed 0.333. Between
    10 and infinity the table gives no interval to interpolate in, so those ratios are refused,
    as is anything below 1 (use the series instead).

    Examples
    --------
    >>> rectangle_coefficients_table(3.0)
    (0.267, 0.263)

    References
    ----------
    .. [1] Budynas, R. G. and Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, section 3-12 (section number from memory), table of alpha and beta
       for rectangular sections.
    .. [2] Roark's Formulas for Stress and Strain, 7th ed., rectangular section.
    """
    try:
        r = float(ratio)
    except (TypeError, ValueError):
        raise OutOfRangeError("ratio", ratio, "is not a real number") from None
    if r == math.inf:
        return RECTANGLE_TABLE[math.inf]
    TABLE_RATIO.check(r)
    keys = sorted(k for k in RECTANGLE_TABLE if k != math.inf)
    alphas = [RECTANGLE_TABLE[k][0] for k in keys]
    betas = [RECTANGLE_TABLE[k][1] for k in keys]
    return float(np.interp(r, keys, alphas)), float(np.interp(r, keys, betas))


# --------------------------------------------------------------------------- thin closed

def _segment_list(name: str, value) -> list | None:
    """``value`` as a non-empty list of segments, or None if it is not one."""
    if isinstance(value, (str, bytes)):
        return None
    try:
        segs = list(value)
    except TypeError:
        return None
    return segs or None


def _wall_integral(walls) -> tuple[float, float | None, float | None]:
    """``(integral ds/t, total length, thickest wall)`` from a number or (length, thickness) pairs."""
    if isinstance(walls, Real) and not isinstance(walls, bool):
        return _checked(WALL_INTEGRAL, walls), None, None
    segs = _segment_list("walls", walls)
    if segs is None:
        raise OutOfRangeError("walls", walls,
                              "give a number (perimeter/t) or a non-empty list of (length, thickness)")
    total, length, t_max = 0.0, 0.0, 0.0
    for seg in segs:
        try:
            ell, th = seg
        except (TypeError, ValueError):
            raise OutOfRangeError("walls", seg, "each segment must be (length, thickness)") from None
        ell = _checked(SEG_LENGTH, ell)
        th = _checked(SEG_THICK, th)
        total += ell / th
        length += ell
        t_max = max(t_max, th)
    return total, length, t_max


def thin_closed_torsion_constant(Am: float, walls) -> float:
    r"""Torsion constant of a thin-walled single-cell closed section (Bredt–Batho).

    .. math:: J = \frac{4 A_m^2}{\oint ds / t}

    Parameters
    ----------
    Am : float
        Area enclosed by the wall's mid-line [m^2]
    walls : float or list of (float, float)
        Either the wall integral ``perimeter/t`` (the mid-line length over a uniform thickness)
        [-], or segments ``[(length [m], thickness [m]), ...]`` round the mid-line.

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    Thin-wall theory: shear flow uniform through the thickness. With segments, warns
    (OutOfRangeWarning) when the thickest wall exceeds 0.1 times the equivalent mid-line radius
    ``2 Am / perimeter`` (common practice for 'thin'); with a number alone the thickness is
    unknown and no warning is possible. Valid for ``Am > 0`` and positive lengths and
    thicknesses (refused otherwise).

    Examples
    --------
    Circular tube, mid-line radius 1, wall 0.01: J = 2 pi r^3 t:

    >>> round(thin_closed_torsion_constant(math.pi, 2 * math.pi / 0.01), 5)
    0.06283

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, thin-walled closed
       sections (Bredt–Batho).
    """
    Am = _checked(AM, Am)
    integral, length, t_max = _wall_integral(walls)
    if length is not None:
        THIN_CLOSED.check(t_max / (2.0 * Am / length))
    return 4.0 * Am**2 / integral


def thin_closed_shear(T: float, Am: float, t: float) -> float:
    r"""Shear stress in the wall of a thin-walled closed section (Bredt–Batho).

    .. math:: \tau = \frac{T}{2 A_m t}

    Parameters
    ----------
    T : float
        Torque [N*m]
    Am : float
        Area enclosed by the wall's mid-line [m^2]
    t : float
        Local wall thickness; the thinnest wall gives the peak [m]

    Returns
    -------
    float
        Mean shear stress through the thickness at that wall [Pa]

    Notes
    -----
    Thin-wall theory. Warns (OutOfRangeWarning) when ``t`` exceeds 0.1 times the equivalent
    mid-line radius ``sqrt(Am/pi)`` (common practice for 'thin'); the stress at the outer fibre
    of a thick wall is higher than this mean. Valid for ``Am, t > 0``.

    Examples
    --------
    Circular tube, mid-line radius 1, wall 0.01, unit torque: T/(2 pi r^2 t):

    >>> round(thin_closed_shear(1.0, math.pi, 0.01), 3)
    15.915

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, thin-walled closed
       sections (Bredt–Batho).
    """
    T = _checked(TORQUE, T)
    Am = _checked(AM, Am)
    t = _checked(T_WALL, t)
    THIN_CLOSED.check(t / math.sqrt(Am / math.pi))
    return T / (2.0 * Am * t)


# --------------------------------------------------------------------------- thin open

def thin_open_torsion_constant(segments) -> float:
    r"""Torsion constant of a thin-walled open section made of thin rectangles.

    .. math:: J = \sum_i \frac{b_i t_i^3}{3}

    Parameters
    ----------
    segments : list of (float, float)
        ``[(b [m], t [m]), ...]``: mid-line length and thickness of each wall.

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    The 1/3 is the limit of the rectangle's ``beta`` as ``b/t -> inf``; the sum over-estimates
    J by about ``0.63 t/b`` per wall and ignores the corners. Warns (OutOfRangeWarning) when a
    wall has ``t/b > 0.1`` (common practice for 'thin'). Positive lengths and thicknesses only.

    Examples
    --------
    A single strip 1 x 0.01:

    >>> round(thin_open_torsion_constant([(1.0, 0.01)]) * 1e7, 4)
    3.3333

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, thin-walled open
       sections.
    """
    segs = _segment_list("segments", segments)
    if segs is None:
        raise OutOfRangeError("segments", segments, "give a non-empty list of (b, t)")
    total = 0.0
    for seg in segs:
        try:
            b, t = seg
        except (TypeError, ValueError):
            raise OutOfRangeError("segments", seg, "each segment must be (b, t)") from None
        b = _checked(SEG_B, b)
        t = _checked(T_WALL, t)
        THIN_OPEN.check(t / b)
        total += b * t**3 / 3.0
    return total


def thin_open_peak_shear(T: float, t_max: float, J: float) -> float:
    r"""Peak torsional shear stress of a thin-walled open section, in the thickest wall.

    .. math:: \tau_{max} = \frac{T\, t_{max}}{J}

    Parameters
    ----------
    T : float
        Torque [N*m]
    t_max : float
        Thickness of the thickest wall [m]
    J : float
        Torsion constant of the section [m^4]

    Returns
    -------
    float
        Peak shear stress [Pa], away from re-entrant corners (which concentrate it further)

    Notes
    -----
    Thin-wall theory. Valid for ``t_max, J > 0`` (refused otherwise).

    Examples
    --------
    Single strip 1 x 0.01 under unit torque: 3T/(b t^2):

    >>> round(thin_open_peak_shear(1.0, 0.01, 1.0 * 0.01**3 / 3))
    30000

    References
    ----------
    .. [1] Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, thin-walled open
       sections.
    """
    T = _checked(TORQUE, T)
    t_max = _checked(T_MAX, t_max)
    J = _checked(J_CONST, J)
    return T * t_max / J


# --------------------------------------------------------------------------- generic

def shear_from_torsion_constant(T: float, c: float, J: float) -> float:
    r"""Hand-calculation torsional shear stress ``T c / J``.

    .. math:: \tau = \frac{T c}{J}

    Parameters
    ----------
    T : float
        Torque [N*m]
    c : float
        Distance from the axis to the point considered [m]
    J : float
        Torsion constant (polar moment for round sections) [m^4]

    Returns
    -------
    float
        Shear stress [Pa]

    Notes
    -----
    Exact only for the round shaft and the concentric tube (``J`` the polar moment). For other
    sections it is a hand estimate, not the peak. Valid for ``c >= 0``, ``J > 0``.

    Examples
    --------
    Unit round shaft: T (d/2) / (pi d^4/32) = 16/pi:

    >>> round(shear_from_torsion_constant(1.0, 0.5, math.pi / 32), 4)
    5.093

    References
    ----------
    .. [1] Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., section 3-12
       (torsion of round bars; section number from memory).
    """
    T = _checked(TORQUE, T)
    c = _checked(C_DIST, c)
    J = _checked(J_CONST, J)
    return T * c / J

"""Transverse shear: elementary and exact (Saint-Venant flexure) shear stresses, shear
coefficients, and shear centres of thin-walled open sections.

SI throughout: shear force ``V`` [N], lengths [m], areas [m^2], second moments [m^4],
stresses [Pa]. Poisson's ratio ``nu`` [-].

Shear coefficients come in several *definitions* that give different numbers for the same
section. Each function's name says which one; :data:`SHEAR_COEFFICIENT_DEFINITIONS` maps every
coefficient function to its definition label, so numbers of different definitions are never
compared by accident (use :func:`shear_coefficient_definition`).
"""
from __future__ import annotations

import math

from classic._validity import OutOfRangeError, Validity, checked
from classic.properties import round_area

__all__ = [
    "round_shear_elementary", "thin_tube_shear_elementary", "rectangle_shear_elementary", "vq_ib",
    "round_flexure_centre", "round_flexure_surface",
    "RECTANGLE_FLEXURE_TABLE", "RECTANGLE_FLEXURE_NU", "rectangle_flexure_ratios",
    "rectangle_flexure_shear",
    "cowper_round", "cowper_rectangle", "cowper_hollow_round", "cowper_thin_tube",
    "hutchinson_round",
    "energy_round", "energy_hollow_round", "energy_thin_tube", "energy_rectangle",
    "COWPER_1966", "HUTCHINSON_2001", "ENERGY",
    "SHEAR_COEFFICIENT_DEFINITIONS", "shear_coefficient_definition",
    "channel_shear_centre", "slit_thin_tube_shear_centre",
]

_GEOMETRY = "a length of the section must be positive and finite"


def _positive(name: str, unit: str) -> Validity:
    return Validity(name, 0.0, math.inf, unit, "refuse", _GEOMETRY,
                    strict_low=True, strict_high=True)


# Validity ranges (data), one object per parameter name used below.
SHEAR_FORCE = Validity("V", -math.inf, math.inf, "N", "refuse", "must be a finite number",
                       strict_low=True, strict_high=True)
FIRST_MOMENT = Validity("Q", -math.inf, math.inf, "m^3", "refuse", "must be a finite number",
                        strict_low=True, strict_high=True)
D_ROUND = _positive("d", "m")
AREA = _positive("A", "m^2")
SECOND_MOMENT = _positive("I", "m^4")
B_WIDTH = _positive("b", "m")
H_DEPTH = _positive("h", "m")
R_TUBE = _positive("R", "m")
NU = Validity("nu", -1.0, 0.5, "", "refuse",
              "Poisson's ratio of an isotropic solid lies in (-1, 0.5]", strict_low=True)
M_HOLLOW = Validity("m", 0.0, 1.0, "", "refuse", "m = r_inside/r_outside, 0 <= m < 1",
                    strict_high=True)
NU_ENERGY_RECT = Validity("nu", 0.0, 0.0, "", "refuse",
                          "the closed form 5/6 holds at nu = 0 only; at nu > 0 the energy "
                          "coefficient of a rectangle depends on b/h")


_checked = checked  # one definition, in classic._validity


# --------------------------------------------------------------------------- elementary

def round_shear_elementary(V: float, d: float) -> float:
    r"""Elementary (VQ/Ib) peak transverse shear stress of a solid round, at the neutral axis.

    .. math:: \tau_{max} = \frac{4 V}{3 A}, \qquad A = \frac{\pi d^2}{4}

    Parameters
    ----------
    V : float
        Shear force [N]
    d : float
        Diameter [m]

    Returns
    -------
    float
        Shear stress [Pa], the mean across the neutral axis

    Notes
    -----
    Elementary beam theory (stress uniform across the width). The exact flexure solution
    (:func:`round_flexure_centre`) is higher at the centre and lower at the surface. Valid for
    ``d > 0``.

    Examples
    --------
    >>> round(round_shear_elementary(1.0, 1.0) * round_area(1.0), 4)
    1.3333

    References
    ----------
    .. [1] Budynas, R. G. and Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, section 3-11, Table 3-2 (circular section, from memory).
    """
    V = _checked(SHEAR_FORCE, V)
    d = _checked(D_ROUND, d)
    return 4.0 * V / (3.0 * round_area(d))


def thin_tube_shear_elementary(V: float, A: float) -> float:
    r"""Elementary peak transverse shear stress of a thin-walled round tube, at the neutral axis.

    .. math:: \tau_{max} = \frac{2 V}{A}

    Parameters
    ----------
    V : float
        Shear force [N]
    A : float
        Wall area [m^2]

    Returns
    -------
    float
        Shear stress [Pa]

    Notes
    -----
    Thin-wall limit of VQ/(Ib); the wall thickness is not an input, so thinness cannot be
    checked here. Valid for ``A > 0``.

    Examples
    --------
    >>> thin_tube_shear_elementary(1.0, 1.0)
    2.0

    References
    ----------
    .. [1] Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., section 3-11,
       Table 3-2 (hollow thin-walled round, from memory).
    """
    V = _checked(SHEAR_FORCE, V)
    A = _checked(AREA, A)
    return 2.0 * V / A


def rectangle_shear_elementary(V: float, A: float) -> float:
    r"""Elementary peak transverse shear stress of a rectangle, at the neutral axis.

    .. math:: \tau_{max} = \frac{3 V}{2 A}

    Parameters
    ----------
    V : float
        Shear force [N]
    A : float
        Area [m^2]

    Returns
    -------
    float
        Shear stress [Pa]

    Notes
    -----
    Elementary beam theory (stress uniform across the width); exact only at ``nu = 0``
    (see :func:`rectangle_flexure_ratios`). Valid for ``A > 0``.

    Examples
    --------
    >>> rectangle_shear_elementary(1.0, 1.0)
    1.5

    References
    ----------
    .. [1] Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., section 3-11,
       Table 3-2 (rectangular section, from memory).
    """
    V = _checked(SHEAR_FORCE, V)
    A = _checked(AREA, A)
    return 3.0 * V / (2.0 * A)


def vq_ib(V: float, Q: float, I: float, b: float) -> float:
    r"""Elementary transverse shear stress ``V Q / (I b)``.

    .. math:: \tau = \frac{V Q}{I b}

    Parameters
    ----------
    V : float
        Shear force [N]
    Q : float
        First moment, about the neutral axis, of the area beyond the cut [m^3]
    I : float
        Second moment of the whole section about the neutral axis [m^4]
    b : float
        Width of the section at the cut [m]

    Returns
    -------
    float
        Mean shear stress across the cut [Pa]

    Notes
    -----
    Elementary beam theory: the stress is taken uniform across the cut. Valid for ``I, b > 0``.

    Examples
    --------
    Rectangle 1 x 1 at the neutral axis (Q = 1/8, I = 1/12) gives 3V/(2A):

    >>> vq_ib(1.0, 0.125, 1.0 / 12.0, 1.0)
    1.5

    References
    ----------
    .. [1] Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., section 3-11,
       eq. 3-30 (equation number from memory).
    """
    V = _checked(SHEAR_FORCE, V)
    Q = _checked(FIRST_MOMENT, Q)
    I = _checked(SECOND_MOMENT, I)
    b = _checked(B_WIDTH, b)
    return V * Q / (I * b)


# --------------------------------------------------------------------------- exact flexure, round

def round_flexure_centre(V: float, d: float, nu: float) -> float:
    r"""Exact (Saint-Venant flexure) transverse shear stress at the centre of a solid round.

    .. math:: \tau_{centre} = \frac{3 + 2\nu}{2(1+\nu)}\,\frac{V}{A}

    Parameters
    ----------
    V : float
        Shear force, through the centre [N]
    d : float
        Diameter [m]
    nu : float
        Poisson's ratio [-]

    Returns
    -------
    float
        Shear stress at the centre, parallel to V [Pa]; the peak of the section

    Notes
    -----
    Exact for the prismatic cantilever loaded at its end (Saint-Venant flexure). Exceeds the
    elementary 4V/(3A) for ``nu > 0``. Valid for ``d > 0`` and ``-1 < nu <= 0.5``.

    Examples
    --------
    At nu = 0.3:

    >>> round(round_flexure_centre(1.0, 1.0, 0.3) * round_area(1.0), 3)
    1.385

    References
    ----------
    .. [1] Timoshenko, S. P. and Goodier, J. N., Theory of Elasticity, 3rd ed., McGraw-Hill,
       1970, section 120, bending of a cantilever of circular cross section (form from memory;
       value re-derived).
    """
    V = _checked(SHEAR_FORCE, V)
    d = _checked(D_ROUND, d)
    nu = _checked(NU, nu)
    return (3.0 + 2.0 * nu) / (2.0 * (1.0 + nu)) * V / round_area(d)


def round_flexure_surface(V: float, d: float, nu: float) -> float:
    r"""Exact (Saint-Venant flexure) transverse shear stress on the surface of a solid round, at the neutral axis.

    .. math:: \tau_{surface} = \frac{1 + 2\nu}{1+\nu}\,\frac{V}{A}

    Parameters
    ----------
    V : float
        Shear force, through the centre [N]
    d : float
        Diameter [m]
    nu : float
        Poisson's ratio [-]

    Returns
    -------
    float
        Shear stress on the surface where the neutral axis meets it, parallel to V [Pa]

    Notes
    -----
    Exact for the end-loaded prismatic cantilever. Below the elementary 4V/(3A) for
    ``nu < 0.5``, equal to it at ``nu = 0.5``. Valid for ``d > 0`` and ``-1 < nu <= 0.5``.

    Examples
    --------
    At nu = 0.3:

    >>> round(round_flexure_surface(1.0, 1.0, 0.3) * round_area(1.0), 3)
    1.231

    References
    ----------
    .. [1] Timoshenko & Goodier, Theory of Elasticity, 3rd ed., section 120 (form from memory;
       value re-derived).
    """
    V = _checked(SHEAR_FORCE, V)
    d = _checked(D_ROUND, d)
    nu = _checked(NU, nu)
    return (1.0 + 2.0 * nu) / (1.0 + nu) * V / round_area(d)


# --------------------------------------------------------------------------- exact flexure, rectangle

#: Poisson's ratio of the rectangle flexure table.
RECTANGLE_FLEXURE_NU = 0.25

#: Exact/elementary shear stress ratios of a rectangle at ``nu = 0.25``:
#: ``b/h -> (at the centre, at the edges of the neutral axis)``, the ratio to 3V/(2A);
#: ``b`` is the width across the load, ``h`` the depth along it.
RECTANGLE_FLEXURE_TABLE: dict[float, tuple[float, float]] = {
    0.5: (0.983, 1.033),
    1.0: (0.940, 1.126),
    2.0: (0.856, 1.396),
    4.0: (0.805, 1.988),
}

_NU_TABLE = Validity("nu", RECTANGLE_FLEXURE_NU, RECTANGLE_FLEXURE_NU, "", "refuse",
                     "the table is printed for nu = 0.25 only")


def rectangle_flexure_ratios(b_over_h: float, nu: float = RECTANGLE_FLEXURE_NU) -> tuple[float, float]:
    r"""Ratio of the exact flexure shear stress of a rectangle to the elementary 3V/(2A) (table lookup).

    .. math:: \frac{\tau}{3V/(2A)} \;\text{at the centre and at the edges of the neutral axis}

    Parameters
    ----------
    b_over_h : float
        Width across the load over depth along it [-]; one of 1/2, 1, 2, 4
    nu : float, optional
        Poisson's ratio [-]; only 0.25

    Returns
    -------
    tuple of float
        ``(centre, edge)`` ratios [-]

    Notes
    -----
    The printed table, rounded to three figures. Other Poisson's ratios and untabulated
    ``b/h`` are refused: no interpolation, no extrapolation. At ``nu = 0`` both ratios are 1.

    Examples
    --------
    Square section:

    >>> rectangle_flexure_ratios(1.0)
    (0.94, 1.126)

    References
    ----------
    .. [1] Timoshenko & Goodier, Theory of Elasticity, 3rd ed., section 124, table of the
       exact/elementary ratio at nu = 0.25 (from memory; values re-derived from the series).
    """
    nu = _checked(_NU_TABLE, nu)
    try:
        r = float(b_over_h)
    except (TypeError, ValueError):
        raise OutOfRangeError("b_over_h", b_over_h, "is not a real number") from None
    for key, ratios in RECTANGLE_FLEXURE_TABLE.items():
        if math.isclose(r, key, rel_tol=1e-9):
            return ratios
    raise OutOfRangeError("b_over_h", b_over_h,
                          "not tabulated; the table gives b/h = 0.5, 1, 2, 4 only (no interpolation)")


def rectangle_flexure_shear(V: float, b: float, h: float,
                            nu: float = RECTANGLE_FLEXURE_NU) -> tuple[float, float]:
    r"""Exact flexure shear stresses of a rectangle at the centre and the neutral-axis edges (table).

    .. math:: \tau = r \cdot \frac{3 V}{2 b h}

    Parameters
    ----------
    V : float
        Shear force, along the depth ``h`` [N]
    b : float
        Width across the load [m]
    h : float
        Depth along the load [m]
    nu : float, optional
        Poisson's ratio [-]; only 0.25

    Returns
    -------
    tuple of float
        ``(tau_centre, tau_edge)`` [Pa]; the edge value is the peak

    Notes
    -----
    ``r`` from :func:`rectangle_flexure_ratios`; same refusals.

    Examples
    --------
    b/h = 2, unit force on unit area:

    >>> tuple(round(t, 3) for t in rectangle_flexure_shear(1.0, 2.0 ** 0.5, 2.0 ** -0.5))
    (1.284, 2.094)

    References
    ----------
    .. [1] Timoshenko & Goodier, Theory of Elasticity, 3rd ed., section 124 (from memory;
       values re-derived).
    """
    V = _checked(SHEAR_FORCE, V)
    b = _checked(B_WIDTH, b)
    h = _checked(H_DEPTH, h)
    centre, edge = rectangle_flexure_ratios(b / h, nu)
    tau0 = 3.0 * V / (2.0 * b * h)
    return centre * tau0, edge * tau0


# --------------------------------------------------------------------------- shear coefficients

#: Definition labels. Only compare coefficients that carry the same label.
COWPER_1966 = "cowper-1966"
HUTCHINSON_2001 = "hutchinson-2001"
ENERGY = "energy"


def cowper_round(nu: float) -> float:
    r"""Shear coefficient of a solid round, Cowper's 1966 definition.

    .. math:: \kappa = \frac{6(1+\nu)}{7+6\nu}

    Parameters
    ----------
    nu : float
        Poisson's ratio [-]

    Returns
    -------
    float
        Shear coefficient [-], definition ``'cowper-1966'``

    Notes
    -----
    Cowper's definition: the coefficient that makes Timoshenko's beam equations reproduce the
    section-averaged displacement and rotation of the exact flexure solution. Not the same
    number as the energy or Hutchinson definitions. Valid for ``-1 < nu <= 0.5``.

    Examples
    --------
    >>> round(cowper_round(0.3), 3)
    0.886

    References
    ----------
    .. [1] Cowper, G. R., The shear coefficient in Timoshenko's beam theory, J. Appl. Mech. 33
       (1966) 335-340, Table 1.
    """
    nu = _checked(NU, nu)
    return 6.0 * (1.0 + nu) / (7.0 + 6.0 * nu)


def cowper_rectangle(nu: float) -> float:
    r"""Shear coefficient of a solid rectangle, Cowper's 1966 definition.

    .. math:: \kappa = \frac{10(1+\nu)}{12+11\nu}

    Parameters
    ----------
    nu : float
        Poisson's ratio [-]

    Returns
    -------
    float
        Shear coefficient [-], definition ``'cowper-1966'``

    Notes
    -----
    Independent of the aspect ratio in Cowper's definition. Valid for ``-1 < nu <= 0.5``.

    Examples
    --------
    >>> round(cowper_rectangle(0.0), 3)
    0.833

    References
    ----------
    .. [1] Cowper, J. Appl. Mech. 33 (1966) 335-340, Table 1.
    """
    nu = _checked(NU, nu)
    return 10.0 * (1.0 + nu) / (12.0 + 11.0 * nu)


def cowper_hollow_round(nu: float, m: float) -> float:
    r"""Shear coefficient of a hollow round, Cowper's 1966 definition.

    .. math:: \kappa = \frac{6(1+\nu)(1+m^2)^2}{(7+6\nu)(1+m^2)^2 + (20+12\nu)m^2}

    Parameters
    ----------
    nu : float
        Poisson's ratio [-]
    m : float
        Inside over outside radius [-]

    Returns
    -------
    float
        Shear coefficient [-], definition ``'cowper-1966'``

    Notes
    -----
    ``m = 0`` gives :func:`cowper_round`; ``m -> 1`` gives :func:`cowper_thin_tube`.
    Valid for ``-1 < nu <= 0.5`` and ``0 <= m < 1``.

    Examples
    --------
    >>> round(cowper_hollow_round(0.3, 0.0), 3)
    0.886

    References
    ----------
    .. [1] Cowper, J. Appl. Mech. 33 (1966) 335-340, Table 1.
    """
    nu = _checked(NU, nu)
    m = _checked(M_HOLLOW, m)
    s = (1.0 + m**2) ** 2
    return 6.0 * (1.0 + nu) * s / ((7.0 + 6.0 * nu) * s + (20.0 + 12.0 * nu) * m**2)


def cowper_thin_tube(nu: float) -> float:
    r"""Shear coefficient of a thin-walled round tube, Cowper's 1966 definition.

    .. math:: \kappa = \frac{2(1+\nu)}{4+3\nu}

    Parameters
    ----------
    nu : float
        Poisson's ratio [-]

    Returns
    -------
    float
        Shear coefficient [-], definition ``'cowper-1966'``

    Notes
    -----
    The limit ``m -> 1`` of :func:`cowper_hollow_round`. Valid for ``-1 < nu <= 0.5``.

    Examples
    --------
    >>> round(cowper_thin_tube(0.3), 3)
    0.531

    References
    ----------
    .. [1] Cowper, J. Appl. Mech. 33 (1966) 335-340, Table 1 (thin-walled round tube; entry
       from memory, re-derived as the limit of the hollow round).
    """
    nu = _checked(NU, nu)
    return 2.0 * (1.0 + nu) / (4.0 + 3.0 * nu)


def hutchinson_round(nu: float) -> float:
    r"""Shear coefficient of a solid round, Hutchinson's 2001 definition (equal to Timoshenko's 1922 value).

    .. math:: \kappa = \frac{6(1+\nu)^2}{7+12\nu+4\nu^2}

    Parameters
    ----------
    nu : float
        Poisson's ratio [-]

    Returns
    -------
    float
        Shear coefficient [-], definition ``'hutchinson-2001'``

    Notes
    -----
    Hutchinson's definition, built from the exact flexure solution with an averaging different
    from Cowper's (description from memory); for the circle it coincides with Timoshenko's 1922
    coefficient. Higher than Cowper's and the energy value. Valid for ``-1 < nu <= 0.5``.

    Examples
    --------
    >>> round(hutchinson_round(0.3), 3)
    0.925

    References
    ----------
    .. [1] Hutchinson, J. R., Shear coefficients for Timoshenko beam theory, J. Appl. Mech. 68
       (2001) 87-92.
    """
    nu = _checked(NU, nu)
    return 6.0 * (1.0 + nu) ** 2 / (7.0 + 12.0 * nu + 4.0 * nu**2)


def energy_round(nu: float) -> float:
    r"""Shear coefficient of a solid round, energy definition with the exact flexure stresses.

    .. math:: \kappa = \frac{V^2/A}{\int \tau^2\, dA} = \frac{6(1+\nu)^2}{7+14\nu+8\nu^2}

    Parameters
    ----------
    nu : float
        Poisson's ratio [-]

    Returns
    -------
    float
        Shear coefficient [-], definition ``'energy'``

    Notes
    -----
    Shear strain energy of the exact Saint-Venant flexure stresses equated to that of a uniform
    shear strain; this is the coefficient a finite-element shear-function solve returns.
    Valid for ``-1 < nu <= 0.5``.

    Examples
    --------
    >>> round(energy_round(0.3), 3)
    0.851

    References
    ----------
    .. [1] Derived from the flexure stresses of Timoshenko & Goodier, Theory of Elasticity,
       3rd ed., section 120 (re-checked by quadrature in the tests).
    """
    nu = _checked(NU, nu)
    return 6.0 * (1.0 + nu) ** 2 / (7.0 + 14.0 * nu + 8.0 * nu**2)


def energy_hollow_round(nu: float, m: float) -> float:
    r"""Shear coefficient of a hollow round, energy definition with the exact flexure stresses.

    .. math:: \kappa = \frac{6(1+\nu)^2(1+m^2)^2}
              {(7+14\nu+8\nu^2)(1+m^2)^2 + 4m^2(5+10\nu+4\nu^2)}

    Parameters
    ----------
    nu : float
        Poisson's ratio [-]
    m : float
        Inside over outside radius [-]

    Returns
    -------
    float
        Shear coefficient [-], definition ``'energy'``

    Notes
    -----
    ``m = 0`` gives :func:`energy_round`; ``m -> 1`` gives 1/2 (:func:`energy_thin_tube`).
    Valid for ``-1 < nu <= 0.5`` and ``0 <= m < 1``.

    Examples
    --------
    >>> round(energy_hollow_round(0.3, 0.0), 3)
    0.851

    References
    ----------
    .. [1] Derived from the exact flexure solution of the hollow circle (Saint-Venant flexure;
       see Timoshenko & Goodier, Theory of Elasticity, 3rd ed., chapter 12); re-checked by
       quadrature in the tests.
    """
    nu = _checked(NU, nu)
    m = _checked(M_HOLLOW, m)
    s = (1.0 + m**2) ** 2
    return 6.0 * (1.0 + nu) ** 2 * s / (
        (7.0 + 14.0 * nu + 8.0 * nu**2) * s + 4.0 * m**2 * (5.0 + 10.0 * nu + 4.0 * nu**2))


def energy_thin_tube() -> float:
    r"""Shear coefficient of a thin-walled round tube, energy definition.

    .. math:: \kappa = \frac{1}{2}

    Returns
    -------
    float
        Shear coefficient [-], definition ``'energy'``

    Notes
    -----
    The limit ``m -> 1`` of :func:`energy_hollow_round`, the same for every Poisson's ratio.

    Examples
    --------
    >>> energy_thin_tube()
    0.5

    References
    ----------
    .. [1] Derived as the thin-wall limit of the exact hollow-circle flexure solution
       (Timoshenko & Goodier, Theory of Elasticity, 3rd ed.).
    """
    return 0.5


def energy_rectangle(nu: float = 0.0) -> float:
    r"""Shear coefficient of a solid rectangle, energy definition, at ``nu = 0``.

    .. math:: \kappa = \frac{5}{6}

    Parameters
    ----------
    nu : float, optional
        Poisson's ratio [-]; only 0

    Returns
    -------
    float
        Shear coefficient [-], definition ``'energy'``

    Notes
    -----
    At ``nu = 0`` the exact flexure stress is the elementary parabola
    :math:`\tau = \frac{3V}{2A}(1 - 4y^2/h^2)`, whose energy gives 5/6 for any aspect ratio.
    Other ``nu`` are refused: the energy coefficient then depends on ``b/h``.

    Examples
    --------
    >>> round(energy_rectangle(0.0), 4)
    0.8333

    References
    ----------
    .. [1] Derived from the parabolic shear distribution; e.g. Timoshenko & Goodier, Theory of
       Elasticity, 3rd ed., section 124 (exact at nu = 0).
    """
    _checked(NU_ENERGY_RECT, nu)
    return 5.0 / 6.0


#: Function -> definition label. Only compare numbers that carry the same label.
SHEAR_COEFFICIENT_DEFINITIONS = {
    cowper_round: COWPER_1966,
    cowper_rectangle: COWPER_1966,
    cowper_hollow_round: COWPER_1966,
    cowper_thin_tube: COWPER_1966,
    hutchinson_round: HUTCHINSON_2001,
    energy_round: ENERGY,
    energy_hollow_round: ENERGY,
    energy_thin_tube: ENERGY,
    energy_rectangle: ENERGY,
}


def shear_coefficient_definition(func) -> str:
    """Definition label (``'cowper-1966'``, ``'hutchinson-2001'`` or ``'energy'``) of a coefficient function.

    Parameters
    ----------
    func : callable
        One of the shear-coefficient functions of this module.

    Returns
    -------
    str
        The definition label.

    Examples
    --------
    >>> shear_coefficient_definition(energy_round)
    'energy'
    """
    try:
        return SHEAR_COEFFICIENT_DEFINITIONS[func]
    except (KeyError, TypeError):
        raise OutOfRangeError("func", func, "is not a shear-coefficient function of classic.shear") from None


# --------------------------------------------------------------------------- shear centre

def channel_shear_centre(b: float, h: float) -> float:
    r"""Shear-centre offset of a thin-walled channel with equal flange and web thickness.

    .. math:: e = \frac{3 b^2}{h + 6 b}

    Parameters
    ----------
    b : float
        Flange width, centreline (web mid-line to flange tip) [m]
    h : float
        Depth, centreline (between flange mid-lines) [m]

    Returns
    -------
    float
        Distance from the web centreline to the shear centre, on the side away from the
        flanges [m]

    Notes
    -----
    Thin-wall theory: from the flange shear flow, :math:`e = b^2 h^2 t / (4 I)` with
    :math:`I = t h^3/12 + b t h^2/2`. Thickness is not an input; the result is the limit as the
    walls get thin. Valid for ``b, h > 0``.

    Examples
    --------
    >>> channel_shear_centre(1.0, 2.0)
    0.375

    References
    ----------
    .. [1] Timoshenko, S. P. and Gere, J. M., Mechanics of Materials (shear centres of
       thin-walled open sections; edition and section from memory). Re-derived here.
    """
    b = _checked(B_WIDTH, b)
    h = _checked(H_DEPTH, h)
    return 3.0 * b**2 / (h + 6.0 * b)


def slit_thin_tube_shear_centre(R: float) -> float:
    r"""Shear-centre offset of a thin-walled round tube slit along its length.

    .. math:: e = 2R

    Parameters
    ----------
    R : float
        Mid-line radius of the tube [m]

    Returns
    -------
    float
        Distance from the tube's centre to the shear centre, on the side away from the slit [m]

    Notes
    -----
    Thin-wall derivation: with the slit at :math:`\theta = 0` and a shear force V at right
    angles to the symmetry axis, :math:`I = \pi R^3 t` and the open-section shear flow is
    :math:`q(\theta) = \frac{V}{I}\int_0^\theta t R^2 \sin\theta'\,d\theta'
    = \frac{V(1-\cos\theta)}{\pi R}`. Its moment about the centre,
    :math:`\int_0^{2\pi} q R^2\,d\theta = 2VR`, places the resultant at :math:`e = 2R` from the
    centre, opposite the slit. Valid for ``R > 0``; the result is the thin-wall limit.

    Examples
    --------
    >>> slit_thin_tube_shear_centre(0.5)
    1.0

    References
    ----------
    .. [1] Boresi, A. P. and Schmidt, R. J., Advanced Mechanics of Materials, 6th ed., Wiley,
       2003, chapter 8 (shear centre of thin-wall open sections; edition and chapter from
       memory). Re-derived here.
    """
    R = _checked(R_TUBE, R)
    return 2.0 * R

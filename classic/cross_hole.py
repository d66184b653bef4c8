"""Published curve fits of the elastic stress concentration factor at a transverse (cross) through
hole in a solid round shaft.

The fits are those of Peterson's Stress Concentration Factors (W. D. Pilkey and D. F. Pilkey, 3rd
ed., 2008), section 4.5.9 (a round bar or tube with a transverse hole), cubic in x = d/D (d the
hole's diameter, D the shaft's) with coefficients that depend on the tube's bore d_i/D; here the
solid shaft, d_i = 0:

.. math::

    K_{tg} = C_1 + C_2 x + C_3 x^2 + C_4 x^3, \\qquad x = d/D

Both are referred to the gross (unholed) section's nominal stress, the nominal the 3-D engine uses:
32M/(πD³) in bending, 16T/(πD³) in torsion. Bending is in the plane that contains the hole's axis
(the mouths of the hole at the largest bending stress); in torsion the fit gives the largest normal
stress at the hole's mouth over the nominal shear stress.

Both fits start from the exact small-hole limits of an infinite plate: 3 for a hole in uniaxial
tension, 4 (normal stress over shear) for a hole in pure shear (Kirsch's solution; Timoshenko and
Goodier, Theory of Elasticity, 3rd ed., the plate with a circular hole), which the doctests check.

The coefficients were not checked against the printed book here: treat them as from memory. The
charts behind them rest on photoelastic and strain-gauge data; expect several per cent from an
accurate elastic solution (:data:`ACCURACY`). No tension fit is given here: no value is shown for
tension. Validity ranges are data (:data:`X_RANGE`); outside them the functions refuse rather than
extrapolate.
"""
from __future__ import annotations

import math

from classic._validity import OutOfRangeError, Validity

__all__ = ["SOURCE", "COEFFICIENTS", "X_RANGE", "ACCURACY", "cross_hole_kt_bending", "cross_hole_kt_torsion",
           "cross_hole_kts_torsion"]

SOURCE = ("Peterson's Stress Concentration Factors, 3rd ed. (Pilkey & Pilkey, 2008), sec. 4.5.9, the curve fits "
          "for a round bar with a transverse hole (solid bar, gross-section nominal; coefficients from memory)")

#: load -> (C1, C2, C3, C4) of the solid bar (d_i/D = 0), gross-section nominal.
COEFFICIENTS: dict[str, tuple[float, float, float, float]] = {
    "bending": (3.000, -6.250, 41.000, -45.000),
    "torsion": (4.000, -6.055, 32.764, -38.330),
}

#: The span of d/D the charts cover (from memory): refused outside, never clamped.
X_RANGE = Validity("d/D", 0.0, 0.4, "", "refuse", "Peterson, 3rd ed., sec. 4.5.9 charts (from memory)",
                   strict_low=True)

#: The accuracy expected of these fits against an accurate elastic solution: 10 % (common practice for
#: chart fits to photoelastic data; the coefficients are from memory).
ACCURACY = 0.10

_LENGTH = Validity("length", 0.0, math.inf, "m", "refuse", "a length must be positive and finite",
                   strict_low=True, strict_high=True)


def _x(d: float, D: float) -> float:
    for name, v in (("d", d), ("D", D)):
        try:
            val = float(v)
        except (TypeError, ValueError):
            raise OutOfRangeError(name, v, "is not a number") from None
        if not _LENGTH.contains(val):
            raise OutOfRangeError(name, v, "must be a positive, finite length")
    return X_RANGE.check(float(d) / float(D))


def _cubic(load: str, x: float) -> float:
    c1, c2, c3, c4 = COEFFICIENTS[load]
    return c1 + c2 * x + c3 * x**2 + c4 * x**3


def cross_hole_kt_bending(d: float, D: float) -> float:
    r"""Transverse through hole in a solid round shaft in bending, Kt on the gross section.

    .. math::

        K_{tg} = \frac{\sigma_{max}}{32M/(\pi D^3)} = 3.000 - 6.250x + 41.000x^2 - 45.000x^3,
        \qquad x = d/D

    Parameters
    ----------
    d : float
        Hole diameter [m].
    D : float
        Shaft diameter [m].

    Returns
    -------
    float
        Kt [-]: the largest normal stress at the hole over 32M/(πD³), bending in the plane of the
        hole's axis.

    Notes
    -----
    Valid for 0 < d/D ≤ 0.4 (:data:`X_RANGE`, the charts' span, from memory); refused outside. A
    chamfered or blind hole is another geometry.

    References
    ----------
    W. D. Pilkey and D. F. Pilkey, Peterson's Stress Concentration Factors, 3rd ed., Wiley, 2008,
    sec. 4.5.9 (round bar with a transverse hole, bending); coefficients from memory.

    Examples
    --------
    A vanishing hole gives the plate's 3 (Kirsch; Timoshenko & Goodier, Theory of Elasticity, 3rd
    ed.):

    >>> round(cross_hole_kt_bending(1e-9, 1.0), 6)
    3.0
    """
    return _cubic("bending", _x(d, D))


def cross_hole_kt_torsion(d: float, D: float) -> float:
    r"""Transverse through hole in a solid round shaft in torsion: the largest normal stress over the
    gross-section nominal shear stress.

    .. math::

        K_{tg} = \frac{\sigma_{max}}{16T/(\pi D^3)} = 4.000 - 6.055x + 32.764x^2 - 38.330x^3,
        \qquad x = d/D

    Parameters
    ----------
    d : float
        Hole diameter [m].
    D : float
        Shaft diameter [m].

    Returns
    -------
    float
        σmax/τ [-].

    Notes
    -----
    Valid for 0 < d/D ≤ 0.4 (:data:`X_RANGE`, from memory); refused outside.

    References
    ----------
    W. D. Pilkey and D. F. Pilkey, Peterson's Stress Concentration Factors, 3rd ed., Wiley, 2008,
    sec. 4.5.9 (round bar with a transverse hole, torsion); coefficients from memory.

    Examples
    --------
    A vanishing hole gives the plate's 4 under pure shear (Kirsch; Timoshenko & Goodier, Theory of
    Elasticity, 3rd ed.):

    >>> round(cross_hole_kt_torsion(1e-9, 1.0), 6)
    4.0
    """
    return _cubic("torsion", _x(d, D))


def cross_hole_kts_torsion(d: float, D: float) -> float:
    r"""The torsion fit as a shear factor: the largest shear stress at the hole over the nominal.

    .. math::

        K_{ts} = \frac{\tau_{max}}{16T/(\pi D^3)} = \frac{K_{tg}}{2}

    At the peak the bore's surface is free and carries one normal stress along its edge, so the
    largest shear stress is half of it (Mohr's circle of a uniaxial stress).

    Parameters
    ----------
    d : float
        Hole diameter [m].
    D : float
        Shaft diameter [m].

    Returns
    -------
    float
        Kts [-].

    Notes
    -----
    Valid where :func:`cross_hole_kt_torsion` is (0 < d/D ≤ 0.4). The halving holds where the other
    stress in the bore's surface is small at the peak; the 3-D field adds some, so compare loosely.

    References
    ----------
    As :func:`cross_hole_kt_torsion`.

    Examples
    --------
    The small-hole limit: τmax = 2τ (Timoshenko & Goodier, 3rd ed., the hole under pure shear):

    >>> round(cross_hole_kts_torsion(1e-9, 1.0), 6)
    2.0
    """
    return cross_hole_kt_torsion(d, D) / 2.0

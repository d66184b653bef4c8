"""Hand approximations a designer uses for sections without a closed form (flats, drives): round
bars standing in for the real section.

The round bar *inside* the section (the flat-to-opposite-side size of a D-cut, the across-flats
size of a drive) is plain elementary torsion, :func:`classic.torsion.round_torsion_constant`,
used as common practice; it is a lower bound on J for a solid section because the torsional
rigidity of a simply connected section grows with the section (the Prandtl membrane analogy).
The round bar of the *same area* is an upper bound, below.
"""
from __future__ import annotations

import math

from classic._validity import Validity, checked

__all__ = ["equal_area_round_torsion_constant"]

A_POSITIVE = Validity("A", 0.0, math.inf, "m^2", "refuse", "an area must be positive and finite",
                      strict_low=True, strict_high=True)


def equal_area_round_torsion_constant(A: float) -> float:
    r"""Torsion constant of the solid round bar with the same area as the section: an upper bound
    on the torsion constant of every simply connected section of that area.

    .. math:: J \le J_{\circ} = \frac{\pi d_A^4}{32} = \frac{A^2}{2\pi}, \qquad d_A = \sqrt{4A/\pi}

    Parameters
    ----------
    A : float
        Area of the section [m^2]

    Returns
    -------
    float
        Torsion constant of the equal-area round bar [m^4]

    Notes
    -----
    Saint-Venant's conjecture, proved by Pólya (1948): among all simply connected sections of a given
    area the circle has the greatest torsional rigidity. Valid for ``A > 0`` (refused otherwise).
    It bounds solid sections only: a section with a hole is not simply connected, and a thin tube
    can be far stiffer than the solid round of its area.

    Examples
    --------
    A square of side 1 (area 1): the bound 1/(2π) = 0.1592 lies above the square's exact
    J = 0.1406 (Roark's Formulas for Stress and Strain, 7th ed., Table 10.1):

    >>> round(equal_area_round_torsion_constant(1.0), 4)
    0.1592

    References
    ----------
    .. [1] Pólya, G., "Torsional rigidity, principal frequency, electrostatic capacity and symmetrization",
       Quarterly of Applied Mathematics 6 (1948) 267-277 (volume and pages from memory).
    .. [2] Pólya, G. and Szegő, G., Isoperimetric Inequalities in Mathematical Physics, Annals of
       Mathematics Studies 27, Princeton University Press, 1951, Ch. I.
    """
    A = checked(A_POSITIVE, A)
    return A * A / (2.0 * math.pi)

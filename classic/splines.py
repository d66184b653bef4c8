"""Hand approximations a designer uses for the torsion of a splined shaft end.

A splined shaft has no closed-form torsion solution. At the drawing board it is treated as a round
bar of some *equivalent* diameter: most often the minor (root) diameter, which ignores the teeth
and so under-rates the stiffness and over-rates the stress on the shaft body; sometimes the mean of
the major and minor diameters, for the stiffness. shaftcheck sets each beside the FE result so the
designer sees how far off it is; none of them is exact (the pairs are factors, not checks).

SI throughout: lengths [m], torque [N*m], stresses [Pa], torsion constants [m^4].
"""
from __future__ import annotations

import math

from classic._validity import Validity, checked

__all__ = ["minor_diameter_shear", "minor_diameter_torsion_constant", "mean_diameter_torsion_constant"]

D_MINOR = Validity("d_minor", 0.0, math.inf, "m", "refuse", "a diameter is positive", strict_low=True, strict_high=True)
D_MAJOR = Validity("d_major", 0.0, math.inf, "m", "refuse", "a diameter is positive", strict_low=True, strict_high=True)
TORQUE = Validity("T", -math.inf, math.inf, "N*m", "refuse", "must be a finite number", strict_low=True, strict_high=True)
#: The minor diameter must lie below the major one: teeth of zero or negative height are no spline.
DIAMETER_RATIO = Validity("d_minor/d_major", 0.0, 1.0, "", "refuse", "the minor diameter lies below the major one",
                          strict_low=True, strict_high=True)


def minor_diameter_shear(T: float, d_minor: float) -> float:
    r"""Torsional shear stress of a splined shaft taken as a round bar of its minor diameter.

    .. math:: \tau = \frac{16\,T}{\pi d_{minor}^3}

    Parameters
    ----------
    T : float
        Torque [N*m]
    d_minor : float
        Minor (root) diameter of the external spline [m]

    Returns
    -------
    float
        Shear stress at the minor diameter [Pa]

    Notes
    -----
    Common practice: the shaft-shear check of a spline design takes the body of the shaft as a
    round bar of the minor diameter (from memory; the involute-spline strength formulas of
    Machinery's Handbook use this stress with a stress-concentration factor). It ignores the teeth
    (which carry little of the torsion) and the root fillets (where the real peak is). Valid for
    ``d_minor > 0``.

    Examples
    --------
    Elementary torsion of a 20 mm bar under 100 N·m: 16·100/(π·0.02³) = 63.66 MPa.

    >>> round(minor_diameter_shear(100.0, 0.020) / 1e6, 2)
    63.66

    References
    ----------
    .. [1] Oberg, E. et al., Machinery's Handbook, 26th ed., Industrial Press, 2000, 'Involute
       Splines', shear stress of the external spline (from memory).
    .. [2] Young, W. C. and Budynas, R. G., Roark's Formulas for Stress and Strain, 7th ed.,
       McGraw-Hill, 2002, Table 10.1, solid circular section (the round-bar formula itself).
    """
    T = checked(TORQUE, T)
    d = checked(D_MINOR, d_minor)
    return 16.0 * T / (math.pi * d**3)


def minor_diameter_torsion_constant(d_minor: float) -> float:
    r"""Torsion constant of a splined shaft taken as a round bar of its minor diameter.

    .. math:: J = \frac{\pi d_{minor}^4}{32}

    Parameters
    ----------
    d_minor : float
        Minor (root) diameter [m]

    Returns
    -------
    float
        Torsion constant [m^4]; a lower bound of the splined shaft's (its section contains that bar)

    Notes
    -----
    Common practice (the teeth ignored). The true J lies between this and the J of the round bar
    of the major diameter, since the section lies between the two discs (torsional rigidity grows
    with the domain: Saint-Venant's monotonicity, Pólya & Szegő, Isoperimetric Inequalities in
    Mathematical Physics, 1951). Valid for ``d_minor > 0``.

    Examples
    --------
    >>> round(minor_diameter_torsion_constant(0.020) * 1e9, 3)
    15.708

    References
    ----------
    .. [1] Young, W. C. and Budynas, R. G., Roark's Formulas for Stress and Strain, 7th ed.,
       McGraw-Hill, 2002, Table 10.1, solid circular section.
    """
    d = checked(D_MINOR, d_minor)
    return math.pi * d**4 / 32.0


def mean_diameter_torsion_constant(d_major: float, d_minor: float) -> float:
    r"""Torsion constant of a splined shaft taken as a round bar of the mean of its major and minor
    diameters.

    .. math:: J = \frac{\pi}{32}\left(\frac{d_{major} + d_{minor}}{2}\right)^4

    Parameters
    ----------
    d_major : float
        Major (outside) diameter [m]
    d_minor : float
        Minor (root) diameter [m]

    Returns
    -------
    float
        Torsion constant [m^4]

    Notes
    -----
    Common practice, from memory: a rough stiffness estimate for the splined length in a shaft's
    torsional-stiffness (twist) sum. No published accuracy is known to shaftcheck; the FE pair shows
    how far off it is for the section at hand. Valid for ``0 < d_minor < d_major``.

    Examples
    --------
    >>> round(mean_diameter_torsion_constant(0.024, 0.020) * 1e9, 3)
    22.998

    References
    ----------
    .. [1] Young, W. C. and Budynas, R. G., Roark's Formulas for Stress and Strain, 7th ed.,
       McGraw-Hill, 2002, Table 10.1, solid circular section (the round-bar formula applied to the
       mean diameter; the use of the mean diameter is common practice, from memory).
    """
    D = checked(D_MAJOR, d_major)
    d = checked(D_MINOR, d_minor)
    checked(DIAMETER_RATIO, d / D)
    return math.pi * ((D + d) / 2) ** 4 / 32.0

"""Stress concentration at a cavity in an infinite elastic body (exact solutions, for the 3-D checks
of fem/solid.py)."""
from __future__ import annotations

from classic._validity import Validity

__all__ = ["spherical_cavity_kt"]

_NU = Validity("nu", low=-1.0, high=0.5, strict_low=True, strict_high=True, action="refuse",
               source="Poisson's ratio of an isotropic solid lies in (-1, 0.5)")


def spherical_cavity_kt(nu):
    r"""Stress concentration factor at the equator of a spherical cavity in an infinite isotropic
    body under uniaxial tension (Goodier's exact solution).

    .. math::

        K_t = \frac{\sigma_{max}}{\sigma} = \frac{27 - 15\nu}{2(7 - 5\nu)}

    Parameters
    ----------
    nu : float
        Poisson's ratio [-].

    Returns
    -------
    float
        Kt [-], the largest (hoop) stress on the cavity's equator over the remote tension.

    Notes
    -----
    Exact for an infinite body; a cavity in a finite bar approaches it as the cavity's radius over
    the bar's size goes to zero. Validity: -1 < nu < 0.5 (refused outside).

    Examples
    --------
    For nu = 0.3 the factor is 45/22 (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., the
    section on a spherical cavity; the value 45/22 ≈ 2.05 from memory):

    >>> round(spherical_cavity_kt(0.3), 4)
    2.0455

    References
    ----------
    J. N. Goodier, "Concentration of stress around spherical and cylindrical inclusions and flaws",
    J. Appl. Mech. 1 (1933) 39-44.
    """
    nu = _NU.check(nu)
    return (27.0 - 15.0 * nu) / (2.0 * (7.0 - 5.0 * nu))

"""Splined connections: the usual simplified stresses of a spline under torque, tooth shear at the
pitch diameter and flank bearing pressure over the engagement length. One function per formula; SI
(m, N·m, Pa).

**These formulas are from memory** of the simplified spline design formulas of the gear
literature (the SAE / Dudley form), not re-read from a source. They assume every tooth carries its
share evenly along the engagement length; the spline standard's own rating (ISO 4156, ANSI B92.1
and the maker's data) governs, with its load-distribution, wear and fretting factors.
"""
from __future__ import annotations

from classic._validity import Validity

__all__ = ["spline_tooth_shear", "spline_bearing_pressure"]

_POS = "must be positive"


_DP = Validity("d_p", low=0.0, strict_low=True, unit="m", source=_POS)
_Z = Validity("z", low=1.0, unit="", source="at least one tooth")
_T = Validity("t", low=0.0, strict_low=True, unit="m", source=_POS)
_H = Validity("h", low=0.0, strict_low=True, unit="m", source=_POS)
_L = Validity("L", low=0.0, strict_low=True, unit="m", source=_POS)


def spline_tooth_shear(T: float, d_p: float, z: int, t: float, L: float) -> float:
    r"""Average shear stress at the roots of the teeth, taken on the pitch cylinder: the tangential
    force per tooth over the tooth's thickness times the engagement length.

    .. math::

        \tau = \frac{2T}{d_p\,z\,t\,L}
        \;\left(= \frac{4T}{\pi d_p^2 L} \text{ when } t = \frac{\pi d_p}{2z}\right)

    Parameters
    ----------
    T : float
        Torque through the spline [N·m] (sign ignored).
    d_p : float
        Pitch diameter [m].
    z : int
        Number of teeth.
    t : float
        Tooth thickness on the pitch circle [m].
    L : float
        Engagement length [m].

    Returns
    -------
    float
        τ [Pa].

    Notes
    -----
    Validity: every argument positive (refused otherwise). All teeth share the torque evenly (no
    load-distribution factor). From memory: check against the spline standard.

    References
    ----------
    From memory: the simplified spline shear stress of D. W. Dudley, Gear Handbook (McGraw-Hill, 1962),
    and SAE's spline design practice (τ = 4T/(D²Lπ) at the pitch diameter, half the teeth's
    circumference in shear).

    Examples
    --------
    Hand-worked: 200 N·m, d_p = 22.5 mm, 18 teeth, t = π·22.5/36 = 1.9635 mm, L = 20 mm:
    2·200/(0.0225·18·0.0019635·0.020) = 25.15 MPa = 4T/(πd_p²L).

    >>> import math
    >>> round(spline_tooth_shear(200.0, 0.0225, 18, math.pi * 0.0225 / 36, 0.020) / 1e6, 2)
    25.15
    """
    _DP.check(d_p)
    _Z.check(z)
    _T.check(t)
    _L.check(L)
    return 2.0 * abs(T) / (d_p * z * t * L)


def spline_bearing_pressure(T: float, d_p: float, z: int, h: float, L: float) -> float:
    r"""Average bearing (contact) pressure on the flanks: the tangential force per tooth at the
    pitch radius over the radial depth of engagement times the engagement length.

    .. math::

        p = \frac{2T}{d_p\,z\,h\,L}

    Parameters
    ----------
    T : float
        Torque through the spline [N·m] (sign ignored).
    d_p : float
        Pitch diameter [m].
    z : int
        Number of teeth.
    h : float
        Radial depth of engagement of the flanks (between the hub's minor and the shaft's major
        diameter, less chamfers) [m].
    L : float
        Engagement length [m].

    Returns
    -------
    float
        p [Pa].

    Notes
    -----
    Validity: every argument positive (refused otherwise). All teeth in contact over their whole
    depth and length; real splines carry on a fraction of them. From memory: check against the
    spline standard.

    References
    ----------
    From memory: the simplified spline compressive stress of D. W. Dudley, Gear Handbook
    (McGraw-Hill, 1962) (σc = 2T/(D·N·h·L), without its load-distribution factor).

    Examples
    --------
    Hand-worked: 200 N·m, d_p = 22.5 mm, 18 teeth, h = 1.0 mm, L = 20 mm:
    2·200/(0.0225·18·0.001·0.020) = 49.38 MPa.

    >>> round(spline_bearing_pressure(200.0, 0.0225, 18, 0.001, 0.020) / 1e6, 2)
    49.38
    """
    _DP.check(d_p)
    _Z.check(z)
    _H.check(h)
    _L.check(L)
    return 2.0 * abs(T) / (d_p * z * h * L)

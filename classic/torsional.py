"""Torsion along a shaft: the angle of twist of a uniform length and the torsional natural
frequencies of the textbook cases the finite-element model along the shaft is checked against.
One function per formula; SI throughout (m, Pa, N·m, kg·m², rad/s).

Results are a cross-check aid; the governing codes and standards and a licensed engineer decide.
"""
from __future__ import annotations

import math

from classic._validity import Validity

__all__ = ["twist_angle", "two_disc_frequency", "free_free_shaft_frequency", "SEPARATION_MARGIN"]

_POS = "must be positive"
#: A torsional natural frequency within this share of the operating speed (above or below) is
#: reported as too close: a separation margin of 20 % (common practice; API 684 asks for 10 %, from
#: memory). The check is a warning, not an acceptance criterion.
SEPARATION_MARGIN = 0.20

_L0 = Validity("L", low=0.0, unit="m", source="a length is not negative")
_L = Validity("L", low=0.0, strict_low=True, unit="m", source=_POS)
_G = Validity("G", low=0.0, strict_low=True, unit="Pa", source=_POS)
_J = Validity("J", low=0.0, strict_low=True, unit="m^4", source=_POS)
_K = Validity("k", low=0.0, strict_low=True, unit="N*m/rad", source=_POS)
_J1 = Validity("J1", low=0.0, strict_low=True, unit="kg*m^2", source=_POS)
_J2 = Validity("J2", low=0.0, strict_low=True, unit="kg*m^2", source=_POS)
_MODE = Validity("n", low=1.0, source="mode numbers start at 1")
_RHO = Validity("rho", low=0.0, strict_low=True, unit="kg/m^3", source=_POS)


def twist_angle(T: float, L: float, G: float, J: float) -> float:
    r"""Angle of twist of a length of shaft of constant section under a constant torque.

    .. math::

        \varphi = \frac{T\,L}{G\,J}

    Parameters
    ----------
    T : float
        Torque [N·m] (signed: the angle takes its sign).
    L : float
        Length [m].
    G : float
        Shear modulus [Pa].
    J : float
        Torsion constant of the section [m⁴] (πd⁴/32 for a round bar).

    Returns
    -------
    float
        φ [rad].

    Notes
    -----
    Validity: L >= 0, G > 0, J > 0 (refused otherwise). Saint-Venant torsion; the section's warping is
    free.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., eq. (3-35) (θ = Tl/(GJ)).

    Examples
    --------
    Hand-worked: 120 N·m over 100 mm of a 30 mm steel bar (G = 79.3 GPa): J = π·0.03⁴/32 =
    7.952e-8 m⁴, φ = 120·0.1/(79.3e9·7.952e-8) = 1.903e-3 rad.

    >>> round(twist_angle(120.0, 0.1, 79.3e9, math.pi * 0.03**4 / 32) * 1e3, 3)
    1.903
    """
    _L0.check(L)
    _G.check(G)
    _J.check(J)
    return T * L / (G * J)


def two_disc_frequency(k: float, J1: float, J2: float) -> float:
    r"""Natural frequency of two discs on a massless shaft, free in rotation (the rigid-body mode
    aside).

    .. math::

        \omega^2 = k\,\frac{J_1 + J_2}{J_1\,J_2}, \qquad k = \frac{GJ}{L}

    Parameters
    ----------
    k : float
        Torsional stiffness of the shaft between the discs [N·m/rad].
    J1, J2 : float
        Polar mass moments of inertia of the discs [kg·m²].

    Returns
    -------
    float
        ω [rad/s].

    Notes
    -----
    Validity: k, J1, J2 > 0 (refused otherwise). The node of the mode lies at the distance
    L·J2/(J1 + J2) from disc 1.

    References
    ----------
    J. P. Den Hartog, Mechanical Vibrations, 4th ed. (McGraw-Hill, 1956), two-disc torsional system
    (from memory of the section).

    Examples
    --------
    Hand-worked: k = 1000 N·m/rad, J1 = 0.01, J2 = 0.04 kg·m²: ω = √(1000·0.05/0.0004) = 353.55 rad/s.

    >>> round(two_disc_frequency(1000.0, 0.01, 0.04), 2)
    353.55
    """
    _K.check(k)
    _J1.check(J1)
    _J2.check(J2)
    return math.sqrt(k * (J1 + J2) / (J1 * J2))


def free_free_shaft_frequency(n: int, L: float, G: float, rho: float) -> float:
    r"""n-th torsional natural frequency of a uniform round shaft free at both ends.

    .. math::

        \omega_n = \frac{n\pi}{L}\sqrt{\frac{G}{\rho}}, \qquad n = 1, 2, \ldots

    Parameters
    ----------
    n : int
        Mode number (1 = the first mode with one node, at mid-length).
    L : float
        Length [m].
    G : float
        Shear modulus [Pa].
    rho : float
        Density [kg/m³].

    Returns
    -------
    float
        ω_n [rad/s].

    Notes
    -----
    Validity: n >= 1, L, G, rho > 0 (refused otherwise). The section's torsion constant and polar
    moment must be equal (a round bar or tube): for other sections ω_n = (nπ/L)√(GJ/(ρJp)).

    References
    ----------
    W. T. Thomson, Theory of Vibration with Applications (torsional vibration of rods, the wave
    equation ∂²φ/∂t² = (G/ρ)∂²φ/∂z²; edition and section from memory); Den Hartog, Mechanical
    Vibrations, 4th ed. (1956).

    Examples
    --------
    Hand-worked: a 1 m steel shaft, G = 79.3 GPa, ρ = 7850 kg/m³: ω1 = π·√(79.3e9/7850) = 9985 rad/s.

    >>> round(free_free_shaft_frequency(1, 1.0, 79.3e9, 7850.0))
    9985
    """
    _MODE.check(n)
    _L.check(L)
    _G.check(G)
    _RHO.check(rho)
    return n * math.pi / L * math.sqrt(G / rho)

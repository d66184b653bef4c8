"""Rolling bearings: the basic rating life of ISO 281 from the basic dynamic load rating and the
dynamic equivalent load. One function per formula; SI (N, rad/s), lives in revolutions and hours.

Only the basic rating life L10 (90 % reliability, conventional operating conditions). The
adjusted rating life (ISO 281's a1 for reliability and a_ISO for lubrication, contamination and
fatigue load limit) is NOT included.

Results are a cross-check aid; the bearing maker's catalogue and a licensed engineer decide.
"""
from __future__ import annotations

import math

from classic._validity import Validity

__all__ = ["LIFE_EXPONENT", "life_exponent", "equivalent_dynamic_load", "basic_rating_life", "life_hours"]

#: Life exponent p of ISO 281 by rolling element: 3 for ball bearings, 10/3 for roller bearings.
LIFE_EXPONENT = {"ball": 3.0, "roller": 10.0 / 3.0}
#: The project's bearing types (compare/case/shaft.py BEARING_TYPES) by rolling element.
ELEMENT_OF = {"deep_groove_ball": "ball", "spherical_ball": "ball", "self_aligning_ball": "ball",
              "tapered_roller": "roller", "cylindrical_roller": "roller"}

_POS = "must be positive"
_F = Validity("force", low=0.0, unit="N", source="a load is not negative")
_C = Validity("C", low=0.0, strict_low=True, unit="N", source=_POS)
_P = Validity("P", low=0.0, strict_low=True, unit="N", source="the life under no load is not defined")
_SPEED = Validity("speed", low=0.0, strict_low=True, unit="rad/s", source=_POS)
_XY = Validity("factor", low=0.0, unit="", source="X and Y are not negative")


def life_exponent(element: str) -> float:
    r"""Life exponent of the basic rating life.

    .. math::

        p = 3 \;\text{(ball bearings)}, \qquad p = \tfrac{10}{3} \;\text{(roller bearings)}

    Parameters
    ----------
    element : {'ball', 'roller'}
        Rolling element.

    Returns
    -------
    float
        p.

    Notes
    -----
    Validity: element is 'ball' or 'roller' (refused otherwise).

    References
    ----------
    ISO 281:2007, Rolling bearings — Dynamic load ratings and rating life, Sec. 6.2 (radial ball) and
    7.2 (radial roller bearings) (section numbers from memory); Shigley's Mechanical Engineering
    Design, 9th ed., Sec. 11-3, eq. (11-1) (a = 3 and 10/3).

    Examples
    --------
    >>> life_exponent("ball"), round(life_exponent("roller"), 4)
    (3.0, 3.3333)
    """
    if element not in LIFE_EXPONENT:
        raise ValueError(f"element = {element!r}: must be 'ball' or 'roller'")
    return LIFE_EXPONENT[element]


def equivalent_dynamic_load(Fr: float, Fa: float, X: float = 1.0, Y: float = 0.0) -> float:
    r"""Dynamic equivalent load of a radial bearing.

    .. math::

        P = X\,F_r + Y\,F_a

    Parameters
    ----------
    Fr : float
        Radial load [N].
    Fa : float
        Axial (thrust) load [N].
    X, Y : float
        Radial and axial load factors of the bearing for this Fa/Fr (from its catalogue or ISO 281's
        tables); X = 1, Y = 0 for a purely radial load.

    Returns
    -------
    float
        P [N].

    Notes
    -----
    Validity: Fr, Fa, X, Y >= 0 (refused otherwise). X and Y depend on Fa/C0 and on e: they are
    the user's, not looked up here.

    References
    ----------
    ISO 281:2007, Sec. 6.3 (P = X·Fr + Y·Fa; section number from memory); Shigley's Mechanical
    Engineering Design, 9th ed., eq. (11-9).

    Examples
    --------
    Hand-worked: Fr = 4 kN, Fa = 1.5 kN, X = 0.56, Y = 1.6: P = 2.24 + 2.4 = 4.64 kN.

    >>> round(equivalent_dynamic_load(4000.0, 1500.0, 0.56, 1.6), 6)
    4640.0
    """
    for v in (Fr, Fa):
        _F.check(v)
    _XY.check(X)
    _XY.check(Y)
    return X * Fr + Y * Fa


def basic_rating_life(C: float, P: float, p: float) -> float:
    r"""Basic rating life L10 in revolutions: the life 90 % of a group of identical bearings reach.

    .. math::

        L_{10} = \left(\frac{C}{P}\right)^{p} \times 10^6 \;\text{revolutions}

    Parameters
    ----------
    C : float
        Basic dynamic load rating [N].
    P : float
        Dynamic equivalent load [N].
    p : float
        Life exponent (3 ball, 10/3 roller; :func:`life_exponent`).

    Returns
    -------
    float
        L10 [revolutions].

    Notes
    -----
    Validity: C > 0, P > 0 (refused otherwise). ISO 281 also bounds the formula by the static rating
    (P not above C0, nor above 0.5 C); heavier loads are outside it: the caller warns. No adjustment
    for reliability, lubrication or contamination.

    References
    ----------
    ISO 281:2007, eq. for L10 (section numbers from memory); Shigley's Mechanical Engineering
    Design, 9th ed., eq. (11-1) and Example 11-1.

    Examples
    --------
    Shigley 9th ed., Example 11-1 (from memory): a ball bearing for 30 000 h at 1800 rev/min under
    2.67 kN needs C10 = 39.5 kN. Backwards: 39.5 kN under 2.67 kN gives about 3240 million revolutions
    (30 000 h · 1800 rev/min · 60 = 3240 million):

    >>> round(basic_rating_life(39.5e3, 2.67e3, 3.0) / 1e6, -1)
    3240.0
    """
    _C.check(C)
    _P.check(P)
    return (C / P) ** p * 1e6


def life_hours(L10_revolutions: float, speed: float) -> float:
    r"""A life in revolutions as operating hours at a constant speed.

    .. math::

        L_{10h} = \frac{L_{10}}{60\,n}, \qquad n = \frac{\omega}{2\pi}\cdot 60 \;\text{rev/min}

    Parameters
    ----------
    L10_revolutions : float
        Life [revolutions].
    speed : float
        Speed ω [rad/s].

    Returns
    -------
    float
        Hours.

    Notes
    -----
    Validity: speed > 0 (refused otherwise).

    References
    ----------
    ISO 281:2007 (L10h = 10⁶/(60 n)·(C/P)^p; from memory); Shigley's Mechanical Engineering Design,
    9th ed., eq. (11-2) (L = 60·L_h·n).

    Examples
    --------
    Hand-worked: 3240 million revolutions at 1800 rev/min are 30 000 h.

    >>> round(life_hours(3240e6, 1800 * 2 * math.pi / 60), 3)
    30000.0
    """
    _SPEED.check(speed)
    return L10_revolutions / (speed * 60.0 / (2.0 * math.pi)) / 60.0

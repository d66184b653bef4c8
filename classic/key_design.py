"""Parallel and square keys in a keyway: the key's shear stress, the bearing (crushing) stress on the
shaft and hub sides, the engagement depths, and the key length a design factor needs. One function
per formula; SI throughout (m, N, N·m, Pa).

The key is taken to carry the torque as a tangential force F = T/r at the shaft surface, r = d/2,
spread evenly over its length (Shigley's treatment). The real pressure peaks at the end of the hub
where the torque enters; these are nominal design stresses, not the peaks.

Results are a cross-check aid; the governing codes and standards and a licensed engineer decide.
"""
from __future__ import annotations

import math

from classic._validity import Validity

__all__ = [
    "key_force",
    "key_shear_stress",
    "key_bearing_stress",
    "engagement_depths",
    "shear_yield_distortion_energy",
    "key_length_for_shear",
    "key_length_for_bearing",
    "effective_key_count",
    "TWO_KEY_SHARE",
]

_SHIGLEY9 = "Shigley's Mechanical Engineering Design, 9th ed. (Budynas & Nisbett, 2011)"
_POS = "must be positive"
_D = Validity("d", low=0.0, strict_low=True, unit="m", source=_POS)
_W = Validity("w", low=0.0, strict_low=True, unit="m", source=_POS)
_L = Validity("L", low=0.0, strict_low=True, unit="m", source=_POS)
_T = Validity("t", low=0.0, strict_low=True, unit="m", source="an engagement depth must be positive")
_S = Validity("strength", low=0.0, strict_low=True, unit="Pa", source=_POS)
_NKEYS = Validity("n_keys", low=1.0, source="at least one key")
_N = Validity("n_d", low=0.0, strict_low=True, source="a design factor must be positive")

#: Share of the torque counted per key when two keys (at 180°) carry it: the pair is counted as 1.5
#: keys, because fits and keyway positions never share the torque exactly. Common practice (from
#: memory; the same load-share factor 0.75 per key appears in DIN 6892's method C).
TWO_KEY_SHARE = 0.75


def key_force(T: float, d: float) -> float:
    r"""Tangential force on the key(s) at the shaft surface.

    .. math::

        F = \frac{T}{d/2} = \frac{2T}{d}

    Parameters
    ----------
    T : float
        Torque through the keys [N·m] (sign ignored).
    d : float
        Shaft diameter [m].

    Returns
    -------
    float
        F [N].

    Notes
    -----
    Validity: d > 0 (refused otherwise).

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 7-7, Keys (F = T/r).

    Examples
    --------
    Shigley 9th ed., Example 7-6 (from memory: 40 hp at 600 rev/min through a 1 7/16 in shaft,
    T = 4200 lbf·in, F = 5850 lbf); the relation is unit-free:

    >>> round(key_force(4200.0, 1.4375), -1)
    5840.0
    """
    _D.check(d)
    return 2.0 * abs(T) / d


def key_shear_stress(T: float, d: float, w: float, L: float) -> float:
    r"""Average shear stress in the key across its width, on the plane of the shaft surface.

    .. math::

        \tau = \frac{F}{w\,L} = \frac{2T}{d\,w\,L}

    Parameters
    ----------
    T : float
        Torque the key carries [N·m] (sign ignored).
    d : float
        Shaft diameter [m].
    w : float
        Key width [m].
    L : float
        Effective key length [m].

    Returns
    -------
    float
        τ [Pa].

    Notes
    -----
    Validity: d, w, L > 0 (refused otherwise). Uniform stress over the key length assumed.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 7-7 and Example 7-6 (τ = F/(t·l)).

    Examples
    --------
    Hand-worked: 120 N·m through a 30 mm shaft, an 8 mm key 36 mm long:
    2·120/(0.030·0.008·0.036) = 27.78 MPa.

    >>> round(key_shear_stress(120.0, 0.030, 0.008, 0.036) / 1e6, 2)
    27.78
    """
    _D.check(d)
    _W.check(w)
    _L.check(L)
    return 2.0 * abs(T) / (d * w * L)


def key_bearing_stress(T: float, d: float, t: float, L: float) -> float:
    r"""Bearing (crushing) stress on one side of the key, over its engagement depth.

    .. math::

        \sigma = \frac{F}{t\,L} = \frac{2T}{d\,t\,L}

    Parameters
    ----------
    T : float
        Torque the key carries [N·m] (sign ignored).
    d : float
        Shaft diameter [m].
    t : float
        Engagement depth on the side considered (shaft keyway wall, or hub keyway wall) [m].
    L : float
        Effective key length [m].

    Returns
    -------
    float
        σ [Pa] (compressive, given as a magnitude).

    Notes
    -----
    Validity: d, t, L > 0 (refused otherwise). For a square key seated half in each part, t = h/2,
    Shigley's σ = F/(t·l/2) with t the key's side.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 7-7 and Example 7-6.

    Examples
    --------
    Hand-worked: 120 N·m, 30 mm shaft, shaft-side engagement 3.47 mm, 36 mm long:
    2·120/(0.030·0.00347·0.036) = 64.04 MPa.

    >>> round(key_bearing_stress(120.0, 0.030, 0.00347, 0.036) / 1e6, 2)
    64.04
    """
    _D.check(d)
    _T.check(t)
    _L.check(L)
    return 2.0 * abs(T) / (d * t * L)


def engagement_depths(d: float, w: float, depth: float, h: float) -> tuple[float, float]:
    r"""Radial engagement of a key of height ``h`` in a keyway of width ``w`` cut ``depth`` deep
    (on its centre line, from the full circle) into a shaft of diameter ``d``: the height of the
    shaft's keyway wall and of the part of the key standing in the hub.

    .. math::

        y = \frac{d}{2} - \sqrt{\frac{d^2}{4} - \frac{w^2}{4}}, \qquad
        t_s = \text{depth} - y, \qquad t_h = h - t_s

    Parameters
    ----------
    d : float
        Shaft diameter [m].
    w : float
        Keyway (and key) width [m].
    depth : float
        Keyway depth on its centre line, from the shaft's full circle [m].
    h : float
        Key height [m].

    Returns
    -------
    (t_s, t_h) : tuple of float
        Shaft-side and hub-side engagement depths [m] (chamfers of key and keyway not deducted).

    Notes
    -----
    Validity: 0 < w < d, 0 < y < depth < h (refused otherwise: a key that does not stand out of the
    shaft's keyway carries nothing into the hub). The chordal height y is the drop of the keyway's side
    edges below the top of the full circle (ASME B17.1's Y).

    References
    ----------
    ASME B17.1-1967 (R2003), Keys and Keyseats (chordal height); geometry of the key in its seat.

    Examples
    --------
    Hand-worked: d = 30 mm, w = 8 mm, depth 4 mm, key 8 x 7: y = 15 − √(225 − 16) = 0.5432 mm,
    t_s = 3.4568 mm, t_h = 3.5432 mm.

    >>> ts, th = engagement_depths(0.030, 0.008, 0.004, 0.007)
    >>> round(ts * 1e3, 4), round(th * 1e3, 4)
    (3.4568, 3.5432)
    """
    _D.check(d)
    Validity("w", low=0.0, high=d, strict_low=True, strict_high=True, unit="m",
             source="the key must be narrower than the shaft").check(w)
    y = d / 2 - math.sqrt(d * d / 4 - w * w / 4)
    Validity("depth", low=y, high=h, strict_low=True, strict_high=True, unit="m",
             source="the keyway wall must stand above its side edges and below the key's top").check(depth)
    ts = depth - y
    return ts, h - ts


def shear_yield_distortion_energy(Sy: float) -> float:
    r"""Shear yield strength by the distortion-energy theory.

    .. math::

        S_{sy} = 0.577\,S_y

    Parameters
    ----------
    Sy : float
        Tensile yield strength [Pa].

    Returns
    -------
    float
        S_sy [Pa].

    Notes
    -----
    Validity: Sy > 0 (refused otherwise). 0.577 is 1/√3 rounded as the source prints it.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., eq. (5-21).

    Examples
    --------
    Shigley 9th ed., Example 7-6 (from memory): Sy = 65 kpsi gives Ssy = 37.5 kpsi.

    >>> round(shear_yield_distortion_energy(65.0), 1)
    37.5
    """
    _S.check(Sy)
    return 0.577 * Sy


def key_length_for_shear(T: float, d: float, w: float, Ssy: float, n_d: float) -> float:
    r"""Key length that gives the design factor against shear of the key.

    .. math::

        L = \frac{2\,T\,n_d}{d\,w\,S_{sy}}

    Parameters
    ----------
    T : float
        Torque the key carries [N·m].
    d : float
        Shaft diameter [m].
    w : float
        Key width [m].
    Ssy : float
        Shear yield strength of the key material [Pa].
    n_d : float
        Design factor.

    Returns
    -------
    float
        L [m].

    Notes
    -----
    Validity: d, w, Ssy, n_d > 0 (refused otherwise).

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Example 7-6 (n = Ssy/(F/(t·l))).

    Examples
    --------
    Shigley 9th ed., Example 7-6 (from memory): T = 4200 lbf·in, d = 1.4375 in, 3/8 in key,
    Ssy = 37.5 kpsi, n = 2.80: l = 1.16 in (unit-free relation).

    >>> round(key_length_for_shear(4200.0, 1.4375, 0.375, 37.5e3, 2.80), 2)
    1.16
    """
    _D.check(d)
    _W.check(w)
    _S.check(Ssy)
    _N.check(n_d)
    return 2.0 * abs(T) * n_d / (d * w * Ssy)


def key_length_for_bearing(T: float, d: float, t: float, Sy: float, n_d: float) -> float:
    r"""Key length that gives the design factor against crushing on one side of the key.

    .. math::

        L = \frac{2\,T\,n_d}{d\,t\,S_y}

    Parameters
    ----------
    T : float
        Torque the key carries [N·m].
    d : float
        Shaft diameter [m].
    t : float
        Engagement depth on that side [m].
    Sy : float
        Yield strength of the weaker of the key and the part on that side [Pa].
    n_d : float
        Design factor.

    Returns
    -------
    float
        L [m].

    Notes
    -----
    Validity: d, t, Sy, n_d > 0 (refused otherwise).

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Example 7-6 (n = Sy/(F/(t·l/2))).

    Examples
    --------
    Shigley 9th ed., Example 7-6 (from memory): 3/8 in square key, t = 3/16 in, Sy = 65 kpsi,
    n = 2.80: l = 1.34 in.

    >>> round(key_length_for_bearing(4200.0, 1.4375, 0.1875, 65e3, 2.80), 2)
    1.34
    """
    _D.check(d)
    _T.check(t)
    _S.check(Sy)
    _N.check(n_d)
    return 2.0 * abs(T) * n_d / (d * t * Sy)


def effective_key_count(n_keys: int) -> float:
    r"""How many keys' worth of torque a set of keys is counted for.

    .. math::

        n_\text{eff} = 1 \;(\text{one key}), \qquad n_\text{eff} = 2 \times 0.75 = 1.5
        \;(\text{two or more keys})

    Parameters
    ----------
    n_keys : int
        Number of keys carrying the torque.

    Returns
    -------
    float
        n_eff; each key is designed for T/n_eff.

    Notes
    -----
    Validity: n_keys >= 1 (refused otherwise). Common practice (from memory): two keys are counted as
    one and a half; more than two are counted as no more than two, since the share of each cannot be
    relied on. See :data:`TWO_KEY_SHARE`.

    References
    ----------
    Common practice (from memory); the load-share factor 0.75 for two keys is that of DIN 6892
    (2012), method C (from memory).

    Examples
    --------
    >>> effective_key_count(1), effective_key_count(2)
    (1.0, 1.5)
    """
    _NKEYS.check(n_keys)
    return 1.0 if n_keys == 1 else 2.0 * TWO_KEY_SHARE

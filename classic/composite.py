"""Composite (bonded multi-material) bars: the hand formulas of concentric layers and of the
transformed section. Every layer is bonded to its neighbours (no slip), every material linear
elastic; the layers share one axis.
"""
from __future__ import annotations

import math
from typing import Sequence

from classic._validity import OutOfRangeError, Validity

__all__ = ["concentric_torsional_rigidity", "concentric_layer_shear_stress", "concentric_bending_rigidity",
           "transformed_section_stress"]

_MODULUS = Validity("modulus", low=0.0, strict_low=True, action="refuse", source="a modulus must be positive")
_RADIUS = Validity("radius", low=0.0, action="refuse", source="a radius must not be negative")


def _layers(moduli: Sequence[float], radii: Sequence[float]) -> list[tuple[float, float, float]]:
    """(modulus, inner radius, outer radius) of each layer, checked: ``radii`` holds the inner
    radius of the first layer followed by the outer radius of each layer, increasing."""
    if len(radii) != len(moduli) + 1:
        raise OutOfRangeError("radii", list(radii), "needs one more radius than there are layers")
    for m in moduli:
        _MODULUS.check(float(m))
    for r in radii:
        _RADIUS.check(float(r))
    for a, b in zip(radii[:-1], radii[1:]):
        if not b > a:
            raise OutOfRangeError("radii", list(radii), "must increase from the axis outwards")
    return [(float(m), float(a), float(b)) for m, a, b in zip(moduli, radii[:-1], radii[1:])]


def concentric_torsional_rigidity(G: Sequence[float], radii: Sequence[float]) -> float:
    r"""Torsional rigidity of bonded concentric circular layers (a core and its sleeves).

    .. math:: GJ = \sum_i G_i \frac{\pi}{2}\left(r_{o,i}^4 - r_{i,i}^4\right)

    Parameters
    ----------
    G : sequence of float
        Shear modulus of each layer, from the axis outwards [Pa].
    radii : sequence of float
        The inner radius of the first layer (0 for a solid core), then the outer radius of each
        layer [m]; increasing.

    Returns
    -------
    float
        Torsional rigidity GJ [N*m^2].

    Notes
    -----
    Exact for Saint-Venant torsion of bonded concentric circular layers: plane sections stay plane,
    the shear strain is θr in every layer and the torques add. Moduli must be positive and radii
    increasing (refused otherwise).

    Examples
    --------
    A steel core of 10 mm radius (G = 80 GPa) in an aluminium sleeve to 20 mm (G = 26 GPa):
    80e9·π/2·0.01⁴ + 26e9·π/2·(0.02⁴ − 0.01⁴) = 1256.6 + 6126.1 = 7382.7 N·m².

    >>> round(concentric_torsional_rigidity([80e9, 26e9], [0.0, 0.01, 0.02]), 1)
    7382.7

    References
    ----------
    .. [1] Gere, J. M., Mechanics of Materials, 6th ed., Thomson, 2004, Sec. 3.8 and problems on
       composite bars in torsion (from memory for the section number).
    """
    return sum(g * math.pi / 2.0 * (b**4 - a**4) for g, a, b in _layers(G, radii))


def concentric_layer_shear_stress(T: float, G: Sequence[float], radii: Sequence[float], layer: int, r: float) -> float:
    r"""Torsional shear stress at radius ``r`` in one layer of bonded concentric circular layers.

    .. math:: \tau = G_k \, \theta \, r, \qquad \theta = \frac{T}{GJ}

    Parameters
    ----------
    T : float
        Torque [N*m].
    G, radii : sequences of float
        As in :func:`concentric_torsional_rigidity` [Pa], [m].
    layer : int
        Index of the layer (0 = innermost).
    r : float
        Radius within that layer [m].

    Returns
    -------
    float
        Shear stress [Pa]; the largest in layer k is at its outer radius.

    Notes
    -----
    Exact under the assumptions of :func:`concentric_torsional_rigidity`. ``r`` must lie within the
    layer (refused otherwise).

    Examples
    --------
    The core and sleeve above under 100 N·m: θ = 100/7382.7 rad/m; at the sleeve's surface
    τ = 26e9·θ·0.02 = 7.04 MPa, at the core's surface 80e9·θ·0.01 = 10.84 MPa.

    >>> round(concentric_layer_shear_stress(100.0, [80e9, 26e9], [0.0, 0.01, 0.02], 1, 0.02) / 1e6, 2)
    7.04
    >>> round(concentric_layer_shear_stress(100.0, [80e9, 26e9], [0.0, 0.01, 0.02], 0, 0.01) / 1e6, 2)
    10.84

    References
    ----------
    .. [1] Gere, J. M., Mechanics of Materials, 6th ed., Thomson, 2004, composite bars in torsion
       (from memory for the section number).
    """
    lay = _layers(G, radii)
    if not 0 <= layer < len(lay):
        raise OutOfRangeError("layer", layer, f"must be 0 to {len(lay) - 1}")
    g, a, b = lay[layer]
    if not a * (1 - 1e-12) <= r <= b * (1 + 1e-12):
        raise OutOfRangeError("r", r, f"must lie within the layer ({a:g} to {b:g} m)")
    return g * T / concentric_torsional_rigidity(G, radii) * r


def concentric_bending_rigidity(E: Sequence[float], radii: Sequence[float]) -> float:
    r"""Bending rigidity of bonded concentric circular layers by the transformed section.

    .. math:: EI = \sum_i E_i \frac{\pi}{4}\left(r_{o,i}^4 - r_{i,i}^4\right)

    Parameters
    ----------
    E : sequence of float
        Elastic modulus of each layer, from the axis outwards [Pa].
    radii : sequence of float
        As in :func:`concentric_torsional_rigidity` [m].

    Returns
    -------
    float
        Bending rigidity EI about any diameter [N*m^2].

    Notes
    -----
    The transformed-section method (each layer's area scaled by its modular ratio; plane sections stay
    plane). The layers share the axis, so the modulus-weighted centroid is on it. Exact for the
    engineering theory; with unequal Poisson's ratios the bonded layers also carry small interface
    stresses the method leaves out.

    Examples
    --------
    A steel core of 10 mm radius (E = 200 GPa) in an aluminium sleeve to 20 mm (E = 70 GPa):
    200e9·π/4·0.01⁴ + 70e9·π/4·(0.02⁴ − 0.01⁴) = 1570.8 + 8246.7 = 9817.5 N·m².

    >>> round(concentric_bending_rigidity([200e9, 70e9], [0.0, 0.01, 0.02]), 1)
    9817.5

    References
    ----------
    .. [1] Gere, J. M., Mechanics of Materials, 6th ed., Thomson, 2004, Sec. 6.2–6.3, composite beams
       and the transformed-section method (from memory for the section numbers).
    """
    return sum(e * math.pi / 4.0 * (b**4 - a**4) for e, a, b in _layers(E, radii))


def transformed_section_stress(E: float, N: float, EA: float, M: float, EI: float, y: float) -> float:
    r"""Normal stress in one material of a composite bar under axial force and bending.

    .. math:: \sigma = E\left(\frac{N}{EA} + \frac{M\,y}{EI}\right)

    Parameters
    ----------
    E : float
        Elastic modulus of the material at the point [Pa].
    N : float
        Axial force [N].
    EA : float
        Axial rigidity Σ Eᵢ Aᵢ [N].
    M : float
        Bending moment about the neutral axis through the modulus-weighted centroid [N*m].
    EI : float
        Bending rigidity about that axis [N*m^2].
    y : float
        Distance of the point from that axis [m], positive on the side the moment puts in tension.

    Returns
    -------
    float
        Normal stress [Pa].

    Notes
    -----
    The transformed-section method: the strain is linear over the section and each material carries
    its own modulus times it. EA and EI must be positive (refused otherwise).

    Examples
    --------
    Core and sleeve of :func:`concentric_bending_rigidity` under 100 N·m: in the sleeve at 20 mm,
    σ = 70e9·100·0.02/9817.5 = 14.3 MPa.

    >>> round(transformed_section_stress(70e9, 0.0, 1.0, 100.0, 9817.5, 0.02) / 1e6, 1)
    14.3

    References
    ----------
    .. [1] Gere, J. M., Mechanics of Materials, 6th ed., Thomson, 2004, Sec. 6.3, the transformed-section
       method (from memory for the section number).
    """
    for name, v in (("EA", EA), ("EI", EI)):
        if not v > 0:
            raise OutOfRangeError(name, v, "must be positive")
    return E * (N / EA + M * y / EI)

"""Composite (bonded multi-material) bars: the hand formulas of concentric layers and of the
transformed section. Every layer is bonded to its neighbours (no slip), every material linear
elastic; the layers share one axis.
"""
from __future__ import annotations

import math
from typing import Sequence

from classic._validity import OutOfRangeError, Validity

__all__ = ["concentric_torsional_rigidity", "concentric_layer_shear_stress", "concentric_bending_rigidity",
           "transformed_section_stress", "transformed_section_shear", "concentric_flexure_shear",
           "concentric_flexure_peak"]

_MODULUS = Validity("modulus", low=0.0, strict_low=True, action="refuse", source="a modulus must be positive")
_RADIUS = Validity("radius", low=0.0, action="refuse", source="a radius must not be negative")
_NU = Validity("nu", low=-1.0, high=0.5, strict_low=True, action="refuse",
               source="Poisson's ratio of an isotropic solid lies in (-1, 0.5]")


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


def transformed_section_shear(V: float, EQ: float, EI: float, b: float) -> float:
    r"""Mean transverse shear stress across a cut of a composite bar (transformed-section VQ/(Ib)).

    .. math:: \bar\tau = \frac{V \, \sum_i E_i Q_i}{EI \; b}

    Parameters
    ----------
    V : float
        Shear force, along the normal of the cut [N].
    EQ : float
        Modulus-weighted first moment Σ Eᵢ Qᵢ, about the neutral axis, of the part beyond the cut
        [N*m] (Pa·m³).
    EI : float
        Bending rigidity of the whole section about the neutral axis [N*m^2].
    b : float
        Length of the cut (the actual width, all materials together) [m].

    Returns
    -------
    float
        Mean shear stress across the cut [Pa].

    Notes
    -----
    The equilibrium along the bar of the part beyond the cut: its normal force is
    M·Σ Eᵢ Qᵢ/EI (transformed section), so the shear flow on the cut is V·Σ Eᵢ Qᵢ/EI and its mean over
    the actual width b is the formula. Written with a reference modulus, Σ Eᵢ Qᵢ/EI = Q*/I* of the
    transformed section (widths scaled by Eᵢ/E_ref), and the actual width stays b. Elementary beam
    theory: the stress is taken uniform across the cut (the exact flexure stress is not). The cut
    passes through the modulus-weighted centroid, perpendicular to V, and V lies along a principal
    axis of the transformed section. EI and b must be positive (refused otherwise).

    Examples
    --------
    One material: a rectangle 1 × 1 at its neutral axis gives 3V/(2A) (E cancels):

    >>> transformed_section_shear(1.0, 2.0 * 0.125, 2.0 / 12.0, 1.0)
    1.5

    References
    ----------
    .. [1] Gere, J. M., Mechanics of Materials, 6th ed., Thomson, 2004, Sec. 5.8 (shear stresses in
       beams, τ = VQ/(Ib), from the equilibrium of the part beyond the cut) and Sec. 6.3 (the
       transformed section); the modulus-weighted first moment follows from the same equilibrium
       (section numbers from memory).
    """
    for name, v in (("EI", EI), ("b", b)):
        if not v > 0:
            raise OutOfRangeError(name, v, "must be positive")
    return V * EQ / (EI * b)


def _flexure_coefficients(E, G, nu, radii):
    """(A_k, B_k, β_k) of f_k(r) = A r + B/r − β r³/4 in every layer (see concentric_flexure_shear)."""
    import numpy as np  # noqa: PLC0415  only this formula needs a linear solve

    lay = _layers(E, radii)
    n = len(lay)
    if not (len(G) == n and len(nu) == n):
        raise OutOfRangeError("G, nu", (list(G), list(nu)), "need one value per layer")
    for g in G:
        _MODULUS.check(float(g))
    for v in nu:
        _NU.check(float(v))
    beta = [float(e) / (2.0 * float(g)) - float(v) for e, g, v in zip(E, G, nu)]

    def f_row(k, r):  # f_k(r) = A r + B/r − β r³/4: coefficients of (A_k, B_k), constant
        return {2 * k: r, 2 * k + 1: 1.0 / r}, -beta[k] * r**3 / 4.0

    def t_row(k, r):  # G_k (f_k' − ν_k r²/2) = G(A − B/r² − (3β/4 + ν/2) r²)
        g = float(G[k])
        return {2 * k: g, 2 * k + 1: -g / r**2}, -g * (3.0 * beta[k] / 4.0 + float(nu[k]) / 2.0) * r**2

    rows, rhs = [], []

    def add(parts, sign=1.0):
        row = np.zeros(2 * n)
        c = 0.0
        for (coef, const), s in parts:
            for j, v in coef.items():
                row[j] += s * v
            c += s * const
        rows.append(row)
        rhs.append(-c)

    r0 = lay[0][1]
    if r0 == 0.0:
        row = np.zeros(2 * n)
        row[1] = 1.0  # B_0 = 0: the field stays finite on the axis
        rows.append(row)
        rhs.append(0.0)
    else:
        add([(t_row(0, r0), 1.0)])  # traction-free bore
    for k in range(n - 1):
        R = lay[k][2]
        add([(f_row(k, R), 1.0), (f_row(k + 1, R), -1.0)])  # warping continuous (bonded)
        add([(t_row(k, R), 1.0), (t_row(k + 1, R), -1.0)])  # τ_zr continuous
    add([(t_row(n - 1, lay[-1][2]), 1.0)])  # traction-free surface
    sol = np.linalg.solve(np.array(rows), np.array(rhs))
    return [(float(sol[2 * k]), float(sol[2 * k + 1]), beta[k]) for k in range(n)], lay


def concentric_flexure_shear(V: float, E, G, nu, radii, layer: int, r: float, theta: float) -> tuple[float, float]:
    r"""Transverse shear stress of bonded concentric circular layers: the Saint-Venant flexure solution.

    .. math::
        \tau_{zr} = \frac{V}{EI} G_k \left(f_k' - \frac{\nu_k r^2}{2}\right)\cos\theta, \quad
        \tau_{z\theta} = -\frac{V}{EI} G_k \left(\frac{f_k}{r} + \frac{\nu_k r^2}{2}\right)\sin\theta,
        \quad f_k = A_k r + \frac{B_k}{r} - \frac{\beta_k r^3}{4},\ \beta_k = \frac{E_k}{2G_k} - \nu_k

    Parameters
    ----------
    V : float
        Shear force along θ = 0, through the axis [N].
    E, G, nu : sequences of float
        Elastic modulus [Pa], shear modulus [Pa] and Poisson's ratio [-] of each layer, from the axis out.
    radii : sequence of float
        As in :func:`concentric_torsional_rigidity` [m].
    layer : int
        Index of the layer (0 = innermost).
    r, theta : float
        Polar position of the point [m], [rad] (θ from the direction of V).

    Returns
    -------
    tuple of float
        (τ_zr, τ_zθ) [Pa].

    Notes
    -----
    EI = Σ Eᵢ Iᵢ. With equal Poisson's ratios the in-plane stresses of Saint-Venant flexure vanish in
    every layer (the lateral strains −ν ε_z agree across the interfaces), and τ = G_k (∇w − ν_k κ′ d)
    with the warping w continuous; here w = (V/EI)·f_k(r)·cos θ, and A_k, B_k follow from w and
    τ_zr continuous at each interface and τ_zr = 0 on the free surfaces (B = 0 in a solid core). With
    unequal ratios this is the solution that leaves out the in-plane interface stresses they cause.
    One layer gives Timoshenko & Goodier's circular section: at the centre
    τ = (3 + 2ν)/(2(1 + ν))·V/A. Inputs must be positive moduli, −1 < ν ≤ 0.5, increasing radii and
    ``r`` inside the layer (refused otherwise).

    Examples
    --------
    One solid layer at ν = 0.3, unit force and area (the published centre value 1.385 V/A):

    >>> R = (1.0 / math.pi) ** 0.5
    >>> round(concentric_flexure_shear(1.0, [2.6], [1.0], [0.3], [0.0, R], 0, 1e-9, 0.0)[0], 3)
    1.385

    References
    ----------
    .. [1] Timoshenko, S. P. and Goodier, J. N., Theory of Elasticity, 3rd ed., McGraw-Hill, 1970,
       chapter 12, bending of a cantilever of circular cross section (the one-layer case; section
       number from memory). The bonded layers: derived here from the same displacement assumptions
       by separation of variables (w ∝ cos θ), checked against the FE in tests/test_fem_composite_shear.py.
    """
    coef, lay = _flexure_coefficients(E, G, nu, radii)
    if not 0 <= layer < len(lay):
        raise OutOfRangeError("layer", layer, f"must be 0 to {len(lay) - 1}")
    _e, a, b = lay[layer]
    if not a * (1 - 1e-12) <= r <= b * (1 + 1e-12) or not r > 0:
        raise OutOfRangeError("r", r, f"must lie within the layer ({a:g} to {b:g} m) and off the axis")
    A, B, beta = coef[layer]
    g, v = float(G[layer]), float(nu[layer])
    k = V / concentric_bending_rigidity(E, radii)
    f = A * r + B / r - beta * r**3 / 4.0
    fp = A - B / r**2 - 3.0 * beta * r**2 / 4.0
    return k * g * (fp - v * r**2 / 2.0) * math.cos(theta), -k * g * (f / r + v * r**2 / 2.0) * math.sin(theta)


def concentric_flexure_peak(V: float, E, G, nu, radii, layer: int) -> tuple[float, float, float]:
    r"""The largest transverse shear stress in one layer of :func:`concentric_flexure_shear`.

    .. math:: \max |\tau| = \frac{|V|}{EI} G_k \max_{r}\max\left(|a_k(r)|, |b_k(r)|\right),\;
              a_k = f_k' - \frac{\nu_k r^2}{2},\ b_k = \frac{f_k}{r} + \frac{\nu_k r^2}{2}

    Parameters
    ----------
    V, E, G, nu, radii, layer
        As in :func:`concentric_flexure_shear`.

    Returns
    -------
    tuple of float
        (peak [Pa], its radius [m], its angle from V [rad]).

    Notes
    -----
    |τ|² = a² cos²θ + b² sin²θ, so the peak lies at θ = 0 (|a|) or θ = π/2 (|b|); a and b are
    A ∓ B/r² + c·r², whose extremes inside the layer are at r⁴ = ±B/c or at the layer's radii: every
    candidate is taken, nothing is searched. Same validity as :func:`concentric_flexure_shear`.

    Examples
    --------
    One solid layer at ν = 0.3: the peak is at the centre, 1.385 V/A:

    >>> R = (1.0 / math.pi) ** 0.5
    >>> [round(x, 3) for x in concentric_flexure_peak(1.0, [2.6], [1.0], [0.3], [0.0, R], 0)]
    [1.385, 0.0, 0.0]

    References
    ----------
    .. [1] As :func:`concentric_flexure_shear`.
    """
    coef, lay = _flexure_coefficients(E, G, nu, radii)
    if not 0 <= layer < len(lay):
        raise OutOfRangeError("layer", layer, f"must be 0 to {len(lay) - 1}")
    _e, r_in, r_out = lay[layer]
    A, B, beta = coef[layer]
    g, v = float(G[layer]), float(nu[layer])
    k = abs(V) / concentric_bending_rigidity(E, radii) * g
    ca, cb = -(3.0 * beta / 4.0 + v / 2.0), v / 2.0 - beta / 4.0  # a = A − B/r² + ca·r², b = A + B/r² + cb·r²
    best = (-1.0, 0.0, 0.0)
    for sign, c, th in ((-1.0, ca, 0.0), (1.0, cb, math.pi / 2.0)):
        cands = [r_out] + ([r_in] if r_in > 0 else [])
        if c != 0.0 and (sign * B / c) > 0:  # d/dr: −2·sign·B/r³ + 2c·r = 0
            rc = (sign * B / c) ** 0.25
            if r_in < rc < r_out:
                cands.append(rc)
        vals = [(abs(A + sign * B / r**2 + c * r**2), r) for r in cands]
        if r_in == 0.0:
            vals.append((abs(A), 0.0))  # B = 0 in a solid core: the value on the axis
        m, r = max(vals)
        if k * m > best[0]:
            best = (k * m, r, th)
    return best

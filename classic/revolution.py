"""Exact solutions for shafts of revolution (varying diameter).

SI throughout: lengths [m], torque [N*m], shear modulus [Pa], stresses [Pa], angles [rad].
"""
from __future__ import annotations

import math

from classic._validity import Validity, checked

__all__ = ["cone_torsion_constant_C", "cone_torsion_rotation", "cone_surface_shear"]

_ALPHA = Validity("alpha", 0.0, math.pi / 2, "rad", "refuse",
                  "a cone's half angle lies strictly between 0 and 90 degrees", strict_low=True, strict_high=True)
_Z = Validity("z", 0.0, math.inf, "m", "refuse", "the cone lies on the side z > 0 of its apex",
              strict_low=True, strict_high=True)
_G = Validity("G", 0.0, math.inf, "Pa", "refuse", "a shear modulus must be positive", strict_low=True,
              strict_high=True)


def cone_torsion_constant_C(T: float, G: float, alpha: float) -> float:
    """Constant C of the exact rotation ω = C/(r² + z²)^{3/2} of a cone in torsion.

    .. math::

        C = -\\frac{T}{2\\pi G\\,(1-\\cos\\alpha)^2(2+\\cos\\alpha)}

    Parameters
    ----------
    T : float
        Torque [N*m] (positive: the z > 0 end turns positively about +z).
    G : float
        Shear modulus [Pa].
    alpha : float
        Half angle of the cone [rad], apex at the origin, axis along +z.

    Returns
    -------
    float
        C [m^3] (rotation ω [rad] = C·ρ⁻³).

    Notes
    -----
    Valid for 0 < alpha < π/2; refused outside. The solution is exact for a cone loaded at its ends
    by the shear stresses of the solution itself (Saint-Venant: any load of the same torque, far
    enough from the ends). The torque is ∫ 2π r² τ_θz dr over a cross-section, which integrates to
    −2πGC[2 − 3cos α + cos³α] and 2 − 3c + c³ = (1 − c)²(2 + c).

    References
    ----------
    Timoshenko, S. P. and Goodier, J. N., Theory of Elasticity, 3rd ed., McGraw-Hill, 1970, torsion
    of circular shafts of variable diameter, the conical shaft (stress function
    φ = c[cos ψ − cos³ψ/3] in the polar angle ψ; section number not given, from memory). The
    rotation form ω ∝ ρ⁻³ was derived here: it solves ∂/∂r(r³ ∂ω/∂r) + ∂/∂z(r³ ∂ω/∂z) = 0 (the
    five-dimensional Laplacian's fundamental solution) and its gradient is tangent to every cone
    through the apex, so the lateral surface is traction-free.

    Examples
    --------
    A slender cone tends to the round bar, τ = 16T/(πd³) (elementary torsion, exact):

    >>> a, z = 1e-3, 1.0
    >>> tau = cone_surface_shear(1.0, a, z)
    >>> d = 2 * z * math.tan(a)
    >>> round(tau / (16 / (math.pi * d**3)), 4)
    1.0
    """
    T = float(T)
    G = checked(_G, G)
    alpha = checked(_ALPHA, alpha)
    c = math.cos(alpha)
    return -T / (2 * math.pi * G * (1 - c) ** 2 * (2 + c))


def cone_torsion_rotation(T: float, G: float, alpha: float, r, z):
    """Rotation ω(r, z) = C/(r² + z²)^{3/2} [rad] of the cone (apex at the origin) carrying ``T``.

    .. math:: \\omega = C\\,(r^2 + z^2)^{-3/2}

    Parameters
    ----------
    T : float
        Torque [N*m].
    G : float
        Shear modulus [Pa].
    alpha : float
        Half angle [rad].
    r, z : float or array
        Point of the meridian section [m].

    Returns
    -------
    float or array
        ω [rad].

    Notes
    -----
    Valid for 0 < alpha < π/2 and z > 0 (refused otherwise); see :func:`cone_torsion_constant_C`.

    References
    ----------
    Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (as in :func:`cone_torsion_constant_C`).

    Examples
    --------
    The rotation decays with the cube of the distance from the apex:

    >>> w1 = cone_torsion_rotation(1.0, 1.0, 0.3, 0.0, 1.0)
    >>> w2 = cone_torsion_rotation(1.0, 1.0, 0.3, 0.0, 2.0)
    >>> round(w1 / w2, 6)
    8.0
    """
    C = cone_torsion_constant_C(T, G, alpha)
    return C * (r**2 + z**2) ** -1.5


def cone_surface_shear(T: float, alpha: float, z: float) -> float:
    """Shear stress on the surface of a cone in torsion at the axial distance ``z`` from the apex.

    .. math::

        \\tau = \\frac{3\\sin\\alpha\\,\\cos^3\\alpha}{2\\pi z^3 (1-\\cos\\alpha)^2 (2+\\cos\\alpha)}\\,T

    Parameters
    ----------
    T : float
        Torque [N*m].
    alpha : float
        Half angle [rad].
    z : float
        Axial distance of the cross-section from the apex [m].

    Returns
    -------
    float
        τ [Pa] (magnitude, along the generator-normal direction in the surface).

    Notes
    -----
    Valid for 0 < alpha < π/2 and z > 0 (refused otherwise). τ = G·r·|∇ω| = 3G|C|·sin α/ρ³ with
    ρ = z/cos α the distance from the apex.

    References
    ----------
    Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (as in :func:`cone_torsion_constant_C`).

    Examples
    --------
    >>> round(cone_surface_shear(1.0, 1e-3, 1.0) * math.pi * (2e-3) ** 3 / 16, 4)
    1.0
    """
    alpha = checked(_ALPHA, alpha)
    z = checked(_Z, z)
    c = math.cos(alpha)
    rho = z / c
    return abs(float(T)) * 3 * math.sin(alpha) / (rho**3 * 2 * math.pi * (1 - c) ** 2 * (2 + c))

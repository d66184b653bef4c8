"""Press and shrink fits of a hub on a shaft by Lamé's thick-walled cylinder solution: the contact
pressure from the interference, the stresses at the fit in hub and shaft, the torque and axial force
the fit holds by friction, and the interference a temperature change takes away. One function per
formula; SI throughout (m, Pa, N, N·m, 1/K, K).

Plane stress, elastic, hub and shaft of the same length (a hub shorter than the shaft's seat raises
the pressure at its ends, which these formulas do not show).

Results are a cross-check aid; the governing codes and standards and a licensed engineer decide.
"""
from __future__ import annotations

import math
from typing import NamedTuple

from classic._validity import Validity

__all__ = ["contact_pressure", "fit_stresses", "fit_torque", "fit_axial_force", "thermal_interference_change",
           "FitStresses"]

_POS = "must be positive"
_R = Validity("R", low=0.0, strict_low=True, unit="m", source=_POS)
_E = Validity("E", low=0.0, strict_low=True, unit="Pa", source=_POS)
_NU = Validity("nu", low=-1.0, high=0.5, strict_low=True, source="Poisson's ratio of a stable isotropic solid")
_LEN = Validity("L", low=0.0, strict_low=True, unit="m", source=_POS)
_DELTA = Validity("delta", low=0.0, unit="m", source="an interference is not negative")
_DIA = Validity("d", low=0.0, strict_low=True, unit="m", source=_POS)
_MU = Validity("f", low=0.0, high=1.0, strict_low=True, action="warn",
               source="friction coefficients of fits lie between about 0.05 and 0.3")


def contact_pressure(delta: float, R: float, r_o: float, r_i: float, E_o: float, nu_o: float, E_i: float,
                     nu_i: float) -> float:
    r"""Contact pressure of a press fit from its radial interference, hub and shaft of different
    materials.

    .. math::

        p = \frac{\delta}{\dfrac{R}{E_o}\left(\dfrac{r_o^2 + R^2}{r_o^2 - R^2} + \nu_o\right)
            + \dfrac{R}{E_i}\left(\dfrac{R^2 + r_i^2}{R^2 - r_i^2} - \nu_i\right)}

    Parameters
    ----------
    delta : float
        Radial interference [m] (half the diametral interference).
    R : float
        Nominal radius of the fit [m].
    r_o : float
        Outside radius of the hub [m].
    r_i : float
        Bore radius of the shaft [m] (0 for a solid shaft).
    E_o, nu_o : float
        Elastic modulus [Pa] and Poisson's ratio of the hub (outer member).
    E_i, nu_i : float
        Elastic modulus [Pa] and Poisson's ratio of the shaft (inner member).

    Returns
    -------
    float
        p [Pa].

    Notes
    -----
    Validity: 0 <= r_i < R < r_o, delta >= 0, E > 0, -1 < ν <= 0.5 (refused otherwise). With one
    material it reduces to p = Eδ(r_o² − R²)(R² − r_i²)/(2R³(r_o² − r_i²)) (Shigley eq. (3-57)).

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 3-16, eq. (3-56) (written there with the
    diametral interference δ_d = 2δ over the nominal diameter); Timoshenko & Goodier, Theory of
    Elasticity, 3rd ed., Sec. 28 (thick-walled cylinder).

    Examples
    --------
    Hand-worked, one steel (E = 207 GPa, ν = 0.3), solid shaft R = 25 mm, hub r_o = 50 mm, radial
    interference 0.01 mm: p = Eδ(r_o² − R²)/(2R·r_o²) = 207e9·1e-5·(0.0025 − 0.000625)/(2·0.025·0.0025)
    = 31.05 MPa.

    >>> round(contact_pressure(1e-5, 0.025, 0.050, 0.0, 207e9, 0.3, 207e9, 0.3) / 1e6, 2)
    31.05
    """
    _R.check(R)
    Validity("r_o", low=R, strict_low=True, unit="m", source="the hub's outside radius exceeds the fit radius").check(r_o)
    Validity("r_i", low=0.0, high=R, strict_high=True, unit="m", source="the shaft's bore is inside the fit").check(r_i)
    _DELTA.check(delta)
    for e in (E_o, E_i):
        _E.check(e)
    for n in (nu_o, nu_i):
        _NU.check(n)
    hub = R / E_o * ((r_o**2 + R**2) / (r_o**2 - R**2) + nu_o)
    shaft = R / E_i * ((R**2 + r_i**2) / (R**2 - r_i**2) - nu_i)
    return delta / (hub + shaft)


class FitStresses(NamedTuple):
    hub_tangential: float  # at the hub's bore [Pa], tensile
    hub_radial: float  # at the hub's bore [Pa] (= −p)
    shaft_tangential: float  # at the shaft's surface [Pa], compressive
    shaft_radial: float  # at the shaft's surface [Pa] (= −p)


def fit_stresses(p: float, R: float, r_o: float, r_i: float) -> FitStresses:
    r"""Tangential and radial stresses at the fit surface of hub and shaft under the contact pressure.

    .. math::

        \sigma_{t,o} = p\,\frac{r_o^2 + R^2}{r_o^2 - R^2}, \quad
        \sigma_{t,i} = -p\,\frac{R^2 + r_i^2}{R^2 - r_i^2}, \quad \sigma_r = -p

    Parameters
    ----------
    p : float
        Contact pressure [Pa].
    R, r_o, r_i : float
        Fit radius, hub outside radius, shaft bore radius [m].

    Returns
    -------
    FitStresses
        (hub_tangential, hub_radial, shaft_tangential, shaft_radial) [Pa].

    Notes
    -----
    Validity: 0 <= r_i < R < r_o (refused otherwise). These are the largest stresses of each member
    (at the fit surface); the axial stress is zero (plane stress).

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 3-16, eqs. (3-58) and (3-59).

    Examples
    --------
    Hand-worked: p = 31.05 MPa, R = 25 mm, r_o = 50 mm, solid shaft: hub σt = 31.05·(2500 + 625)/
    (2500 − 625) = 51.75 MPa; shaft σt = −31.05 MPa.

    >>> s = fit_stresses(31.05e6, 0.025, 0.050, 0.0)
    >>> round(s.hub_tangential / 1e6, 2), round(s.shaft_tangential / 1e6, 2)
    (51.75, -31.05)
    """
    _R.check(R)
    Validity("r_o", low=R, strict_low=True, unit="m", source="the hub's outside radius exceeds the fit radius").check(r_o)
    Validity("r_i", low=0.0, high=R, strict_high=True, unit="m", source="the shaft's bore is inside the fit").check(r_i)
    return FitStresses(p * (r_o**2 + R**2) / (r_o**2 - R**2), -p, -p * (R**2 + r_i**2) / (R**2 - r_i**2), -p)


def fit_torque(p: float, R: float, L: float, f: float) -> float:
    r"""Torque a press fit transmits before it slips, friction over the whole contact surface.

    .. math::

        T = 2\pi\,f\,p\,R^2 L

    Parameters
    ----------
    p : float
        Contact pressure [Pa].
    R : float
        Fit radius [m].
    L : float
        Length of the fit [m].
    f : float
        Coefficient of friction.

    Returns
    -------
    float
        T [N·m].

    Notes
    -----
    Validity: R, L > 0 (refused otherwise); 0 < f <= 1 (warned outside). The pressure is taken uniform
    over the length; it rises at the hub's ends, so slip starts there under a lower torque in fretting.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 7-8 (limits and fits: T = (π/2) f p l d²,
    the same formula with d = 2R).

    Examples
    --------
    Hand-worked: p = 31.05 MPa, R = 25 mm, L = 40 mm, f = 0.12: 2π·0.12·31.05e6·0.025²·0.040 =
    585.3 N·m.

    >>> round(fit_torque(31.05e6, 0.025, 0.040, 0.12), 1)
    585.3
    """
    _R.check(R)
    _LEN.check(L)
    _MU.check(f)
    return 2.0 * math.pi * f * p * R * R * L


def fit_axial_force(p: float, R: float, L: float, f: float) -> float:
    r"""Axial force a press fit holds before it slides (also about the force to press it on).

    .. math::

        F_a = 2\pi\,f\,p\,R\,L

    Parameters
    ----------
    p : float
        Contact pressure [Pa].
    R : float
        Fit radius [m].
    L : float
        Length of the fit [m].
    f : float
        Coefficient of friction.

    Returns
    -------
    float
        F_a [N].

    Notes
    -----
    Validity: R, L > 0 (refused otherwise); 0 < f <= 1 (warned outside).

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 7-8 (friction on the contact surface
    2πRL); Juvinall & Marshek, Fundamentals of Machine Component Design (assembly force; from memory).

    Examples
    --------
    Hand-worked: p = 31.05 MPa, R = 25 mm, L = 40 mm, f = 0.12: 2π·0.12·31.05e6·0.025·0.040 =
    23.41 kN.

    >>> round(fit_axial_force(31.05e6, 0.025, 0.040, 0.12) / 1e3, 2)
    23.41
    """
    _R.check(R)
    _LEN.check(L)
    _MU.check(f)
    return 2.0 * math.pi * f * p * R * L


def thermal_interference_change(d: float, alpha_shaft: float, dT_shaft: float, alpha_hub: float,
                                dT_hub: float) -> float:
    r"""Change of the diametral interference when shaft and hub warm by different amounts or expand
    differently (negative: the fit loosens).

    .. math::

        \Delta\delta_d = d\,(\alpha_s\,\Delta T_s - \alpha_h\,\Delta T_h)

    Parameters
    ----------
    d : float
        Nominal diameter of the fit [m].
    alpha_shaft, alpha_hub : float
        Linear coefficients of thermal expansion [1/K].
    dT_shaft, dT_hub : float
        Temperature rise of shaft and hub from the temperature at which the interference is given [K].

    Returns
    -------
    float
        Δδ_d [m], to be added to the diametral interference.

    Notes
    -----
    Validity: d > 0 (refused otherwise). Free thermal expansion of each member's diameter; the
    interference stays elastic.

    References
    ----------
    Linear thermal expansion ΔL = α·L·ΔT, Shigley's Mechanical Engineering Design, 9th ed.,
    Sec. 3-20 (temperature effects; section number from memory); the difference of the two diameters
    is the geometry of the fit.

    Examples
    --------
    Hand-worked: d = 50 mm, steel shaft 11.7e-6/K at +20 K, aluminium hub 23e-6/K at +40 K:
    0.050·(11.7e-6·20 − 23e-6·40) = −34.3 µm.

    >>> round(thermal_interference_change(0.050, 11.7e-6, 20.0, 23e-6, 40.0) * 1e6, 1)
    -34.3
    """
    _DIA.check(d)
    return d * (alpha_shaft * dT_shaft - alpha_hub * dT_hub)

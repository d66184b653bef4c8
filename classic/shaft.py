"""The shaft as a whole: forces a gear or a belt puts on it, textbook beam cases, stiffness limits
and critical speeds. One function per published formula. SI throughout (m, N, N·m, kg, rad/s).

Results are a cross-check aid; the governing codes and standards and a licensed engineer decide.
"""
from __future__ import annotations

import math
from typing import NamedTuple

from classic._validity import Validity

__all__ = [
    "gear_forces",
    "belt_pull",
    "simply_supported_point_load",
    "overhung_point_load",
    "two_span_uniform_load",
    "critical_speed_uniform_simply_supported",
    "rayleigh_critical_speed",
    "SLOPE_LIMITS",
    "GEAR_DEFLECTION_LIMIT",
    "GEAR_SLOPE_LIMIT",
    "CRITICAL_SPEED_MARGIN",
]

_SHIGLEY9 = "Shigley's Mechanical Engineering Design, 9th ed. (Budynas & Nisbett, 2011)"
_ROARK7 = "Roark's Formulas for Stress and Strain, 7th ed. (Young & Budynas, 2002)"

_POSITIVE = "must be positive"
_D = Validity("d", low=0.0, strict_low=True, unit="m", source=_POSITIVE)
_PHI_N = Validity("phi_n", low=0.0, high=45.0, strict_low=True, strict_high=True, unit="deg",
                  source="normal pressure angles in use lie between 14.5 and 25 degrees")
_PSI = Validity("psi", low=0.0, high=45.0, strict_high=True, unit="deg", action="warn",
                source="helix angles in use lie between 0 (spur) and about 45 degrees")
_RATIO = Validity("ratio", low=1.0, strict_low=True, source="tight over slack tension is more than 1")
_L = Validity("L", low=0.0, strict_low=True, unit="m", source=_POSITIVE)
_EI = Validity("EI", low=0.0, strict_low=True, unit="N*m^2", source=_POSITIVE)


class GearForces(NamedTuple):
    tangential: float  # Wt [N]
    radial: float  # Wr [N], toward the gear's centre
    axial: float  # Wa [N], magnitude


def gear_forces(torque: float, d: float, phi_n: float, psi: float = 0.0) -> GearForces:
    r"""Force components at the mesh of a spur or helical gear from the torque it carries.

    .. math::

        W_t = \frac{2T}{d}, \qquad W_r = W_t\,\frac{\tan\phi_n}{\cos\psi}, \qquad W_a = W_t\tan\psi

    Parameters
    ----------
    torque : float
        Torque the gear carries [N·m] (its sign is ignored: magnitudes are returned).
    d : float
        Pitch diameter [m].
    phi_n : float
        Normal pressure angle [deg] (for a spur gear, the pressure angle).
    psi : float
        Helix angle [deg]; 0 for a spur gear.

    Returns
    -------
    GearForces
        (tangential, radial, axial) [N], magnitudes.

    Notes
    -----
    Validity: 0 < phi_n < 45 deg (refused outside); 0 <= psi < 45 deg (warned outside). Friction at
    the mesh is neglected, as in the source. tan φt = tan φn / cos ψ is the transverse pressure angle.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 13-14 (spur gears, Wr = Wt tan φ) and
    Sec. 13-16, eq. (13-40) (helical gears: Wr = W sin φn, Wt = W cos φn cos ψ, Wa = W cos φn sin ψ).

    Examples
    --------
    Shigley 9th ed., Example 13-8 (helical pinion, φn = 20°, ψ = 30°, Wt = 50.5 lbf; the example
    number is from memory): Wr = 21.2 lbf and Wa = 29.2 lbf. The relations are unit-free, so with
    T = Wt·d/2 in lbf·in and d in inches:

    >>> f = gear_forces(50.5 * 1.386 / 2, 1.386, 20.0, 30.0)
    >>> round(f.tangential, 1), round(f.radial, 1), round(f.axial, 1)
    (50.5, 21.2, 29.2)

    Shigley 9th ed., Example 13-7 (spur pinion, 2.5 kW at 1750 rev/min, d = 50 mm, 20°; from
    memory): Wt = 0.546 kN, Wr = 0.199 kN:

    >>> T = 2500 / (1750 * 2 * math.pi / 60)
    >>> f = gear_forces(T, 0.050, 20.0)
    >>> round(f.tangential / 1000, 3), round(f.radial / 1000, 3)
    (0.546, 0.199)
    """
    _D.check(d)
    _PHI_N.check(phi_n)
    _PSI.check(psi)
    wt = 2.0 * abs(torque) / d
    c = math.cos(math.radians(psi))
    return GearForces(wt, wt * math.tan(math.radians(phi_n)) / c, wt * math.tan(math.radians(psi)))


class BeltPull(NamedTuple):
    tight: float  # F1 [N]
    slack: float  # F2 [N]
    pull: float  # F1 + F2 [N], on the shaft, strands taken parallel


def belt_pull(torque: float, D: float, ratio: float) -> BeltPull:
    r"""Strand tensions of a belt or rope drive from the torque and the tension ratio, and the pull
    on the shaft with both strands parallel.

    .. math::

        T = (F_1 - F_2)\,\frac{D}{2}, \quad \frac{F_1}{F_2} = r
        \;\Rightarrow\; F_2 = \frac{2T}{D\,(r - 1)},\; F_1 = r F_2, \quad P = F_1 + F_2

    Parameters
    ----------
    torque : float
        Torque the pulley carries [N·m] (sign ignored).
    D : float
        Pitch diameter of the pulley [m].
    ratio : float
        F1/F2, tight over slack side (> 1); ``math.inf`` for a chain (slack side 0).

    Returns
    -------
    BeltPull
        (tight, slack, pull) [N].

    Notes
    -----
    Validity: ratio > 1 (refused otherwise). The pull is the sum of the strand tensions when the
    strands are parallel; with an angle 2β between them it is smaller (the resultant). The tension
    ratio itself comes from the belt's friction and wrap (Shigley eq. (17-7) for flat belts; values of
    about 3 for flat belts and 5 for V-belts are common practice).

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Sec. 17-2, the torque T = (F1 − F2)·D/2 of a
    flat-belt drive.

    Examples
    --------
    The defining relation (no published worked example is reproduced here): a 200 mm V-belt pulley
    carrying 120 N·m at a tension ratio of 5 has F1 − F2 = 1200 N, so F2 = 300 N, F1 = 1500 N:

    >>> b = belt_pull(120.0, 0.200, 5.0)
    >>> round(b.tight, 6), round(b.slack, 6), round(b.pull, 6)
    (1500.0, 300.0, 1800.0)
    """
    _D.check(D)
    _RATIO.check(ratio)
    diff = 2.0 * abs(torque) / D
    if math.isinf(ratio):
        return BeltPull(diff, 0.0, diff)
    slack = diff / (ratio - 1.0)
    return BeltPull(ratio * slack, slack, (ratio + 1.0) * slack)


class BeamCase(NamedTuple):
    R1: float  # left reaction [N]
    R2: float  # right reaction [N]
    M_max: float  # largest bending moment [N·m] (magnitude)
    y_load: float  # deflection under the load [m] (magnitude)


def simply_supported_point_load(P: float, a: float, L: float, EI: float) -> BeamCase:
    r"""Simply supported beam, concentrated load P at a from the left support.

    .. math::

        R_1 = \frac{P b}{L},\; R_2 = \frac{P a}{L},\; M_{max} = \frac{P a b}{L},\;
        y_P = \frac{P a^2 b^2}{3 E I L}, \qquad b = L - a

    Parameters
    ----------
    P : float
        Load [N]. a : float, distance from the left support [m]. L : float, span [m].
    EI : float
        Flexural rigidity [N·m²].

    Notes
    -----
    Validity: 0 <= a <= L (refused outside), small deflections, Euler–Bernoulli (shear deformation
    neglected: slender beams).

    References
    ----------
    Roark's Formulas for Stress and Strain, 7th ed., Table 8.1, case 1e (concentrated intermediate
    load, both ends simply supported).

    Examples
    --------
    >>> c = simply_supported_point_load(1000.0, 0.3, 1.0, 2.0e4)
    >>> round(c.R1, 6), round(c.R2, 6), round(c.M_max, 6), round(c.y_load * 1e6, 3)
    (700.0, 300.0, 210.0, 735.0)
    """
    _L.check(L)
    _EI.check(EI)
    Validity("a", low=0.0, high=L, unit="m", source="the load lies on the span").check(a)
    b = L - a
    return BeamCase(P * b / L, P * a / L, abs(P * a * b / L), abs(P * a**2 * b**2 / (3 * EI * L)))


def overhung_point_load(F: float, a: float, L: float, EI: float) -> BeamCase:
    r"""Beam on two simple supports a distance L apart, load F on an overhang a beyond the right one.

    .. math::

        R_1 = -\frac{F a}{L},\; R_2 = \frac{F (L + a)}{L},\; M_{max} = F a,\;
        y_F = \frac{F a^2 (L + a)}{3 E I}

    (R1 acts against F: it holds the far end down.)

    Parameters
    ----------
    F : float
        Load [N]; a : float, overhang [m]; L : float, span between the supports [m]; EI [N·m²].

    Notes
    -----
    Validity: a >= 0, small deflections, Euler–Bernoulli.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., Table A-9, beam 10 (simple supports,
    overhanging load).

    Examples
    --------
    >>> c = overhung_point_load(100.0, 0.1, 0.4, 1.0e4)
    >>> round(c.R1, 6), round(c.R2, 6), round(c.M_max, 6), round(c.y_load * 1e6, 4)
    (-25.0, 125.0, 10.0, 16.6667)
    """
    _L.check(L)
    _EI.check(EI)
    Validity("a", low=0.0, unit="m", source="an overhang length is not negative").check(a)
    return BeamCase(-F * a / L, F * (L + a) / L, abs(F * a), abs(F * a**2 * (L + a) / (3 * EI)))


class TwoSpan(NamedTuple):
    R_end: float  # each end reaction [N]
    R_middle: float  # middle reaction [N]
    M_middle: float  # moment over the middle support [N·m] (magnitude)


def two_span_uniform_load(w: float, l: float) -> TwoSpan:
    r"""Continuous beam of two equal spans l on three simple supports, uniform load w on both.

    .. math::

        R_{end} = \tfrac{3}{8} w l,\quad R_{middle} = \tfrac{10}{8} w l,\quad
        M_{middle} = \tfrac{1}{8} w l^2

    Parameters
    ----------
    w : float
        Load per length [N/m]. l : float, length of each span [m].

    Notes
    -----
    Validity: equal spans, constant EI, rigid supports at one level (the coefficients depend on
    all three).

    References
    ----------
    AISC Steel Construction Manual, 13th ed., 2005, Table 3-23 'Shears, moments and deflections',
    continuous beam, two equal spans, uniform load (case number not quoted: from memory); the same
    coefficients follow from the three-moment equation (Timoshenko, Strength of Materials, Part I,
    3rd ed., 1955, Art. 45).

    Examples
    --------
    >>> t = two_span_uniform_load(1000.0, 2.0)
    >>> t.R_end, t.R_middle, t.M_middle
    (750.0, 2500.0, 500.0)
    """
    _L.check(l)
    return TwoSpan(3 * w * l / 8, 10 * w * l / 8, abs(w * l * l / 8))


def critical_speed_uniform_simply_supported(L: float, EI: float, rhoA: float, n: int = 1) -> float:
    r"""Natural circular frequency of mode n of a uniform simply supported shaft (Euler–Bernoulli),
    its n-th critical speed when gyroscopic effects are neglected.

    .. math::

        \omega_n = \left(\frac{n\pi}{L}\right)^2 \sqrt{\frac{EI}{\rho A}}

    Parameters
    ----------
    L : float
        Span [m]. EI : float [N·m²]. rhoA : float, mass per length [kg/m]. n : int, mode number.

    Returns
    -------
    float
        [rad/s].

    Notes
    -----
    Validity: slender shaft (shear deformation and rotary inertia neglected: the value is high
    when L/d is small, warned below L/d ≈ 10 by the caller's own check), rigid supports.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., eq. (7-22); Timoshenko, Young & Weaver,
    Vibration Problems in Engineering, 4th ed., 1974, Sec. 5.3.

    Examples
    --------
    A steel shaft of 25 mm diameter, 1 m between bearings (E = 207 GPa, ρ = 7850 kg/m³):

    >>> d = 0.025; A = math.pi * d**2 / 4; I = math.pi * d**4 / 64
    >>> round(critical_speed_uniform_simply_supported(1.0, 207e9 * I, 7850 * A), 1)
    316.8
    """
    _L.check(L)
    _EI.check(EI)
    Validity("rhoA", low=0.0, strict_low=True, unit="kg/m", source=_POSITIVE).check(rhoA)
    return (n * math.pi / L) ** 2 * math.sqrt(EI / rhoA)


def rayleigh_critical_speed(weights, deflections, g: float = 9.80665) -> float:
    r"""Rayleigh's estimate of the first critical speed from the static deflections under the
    part weights.

    .. math::

        \omega_1 = \sqrt{\frac{g \sum w_i y_i}{\sum w_i y_i^2}}

    Parameters
    ----------
    weights : sequence of float
        Weights w_i [N] (or, with g = 1, any loads m_i·g_ref whose deflections are given).
    deflections : sequence of float
        Static deflections y_i [m] at the parts under those loads, all applied together.
    g : float
        Acceleration [m/s²] that turns the weights into masses.

    Returns
    -------
    float
        [rad/s]; an upper bound of the first natural frequency of the lumped-mass model (exact for
        a single mass).

    Notes
    -----
    Validity: a shaft whose first mode is close to its static deflected shape (all y_i of one
    sign); refused when Σ w y is not positive.

    References
    ----------
    Shigley's Mechanical Engineering Design, 9th ed., eq. (7-23).

    Examples
    --------
    One mass: exact. A 10 kg disc whose weight deflects the shaft 0.1 mm: ω = √(g/y):

    >>> round(rayleigh_critical_speed([10 * 9.80665], [1e-4]), 2)
    313.16
    """
    num = math.fsum(w * y for w, y in zip(weights, deflections))
    den = math.fsum(w * y * y for w, y in zip(weights, deflections))
    Validity("sum(w*y)", low=0.0, strict_low=True, unit="N*m",
             source="the weights must deflect the shaft along themselves").check(num)
    return math.sqrt(g * num / den)


#: Largest slope at a bearing [rad] by bearing type, the upper ends of the ranges in Shigley's
#: Mechanical Engineering Design, 9th ed., Table 7-2 (values from memory of that table: tapered
#: roller 0.0005–0.0012, cylindrical roller 0.0008–0.0012, deep-groove ball 0.001–0.003, spherical
#: and self-aligning ball 0.026–0.052). The lower end of each range is kept as well.
SLOPE_LIMITS = {
    "tapered_roller": (0.0005, 0.0012),
    "cylindrical_roller": (0.0008, 0.0012),
    "deep_groove_ball": (0.001, 0.003),
    "spherical_ball": (0.026, 0.052),
    "self_aligning_ball": (0.026, 0.052),
}
#: Transverse deflection at a spur-gear mesh [m]: 0.005 in, the middle row of Shigley 9th ed.,
#: Table 7-2 (diametral pitch 11–19 teeth/in; 0.010 in below 10, 0.003 in from 20 to 50). Used for
#: every gear as common practice.
GEAR_DEFLECTION_LIMIT = 0.005 * 0.0254
#: Slope at an uncrowned spur gear [rad], Shigley 9th ed., Table 7-2 (< 0.0005 rad).
GEAR_SLOPE_LIMIT = 0.0005
#: Operating speed at most half the first critical speed: common practice (Shigley 9th ed., Sec. 7-6,
#: advises a first critical speed at least twice the operating speed).
CRITICAL_SPEED_MARGIN = 2.0

"""Published curve fits of the elastic stress concentration factor at shoulder fillets and U-grooves
of round shafts.

The fits are those of Peterson's Stress Concentration Factors (W. D. Pilkey and D. F. Pilkey, 3rd
ed., 2008) as printed in Roark's Formulas for Stress and Strain (W. C. Young and R. G. Budynas,
7th ed., 2002), Table 17.1, cases 17 (U-shaped circumferential groove in a round shaft) and 18
(stepped round shaft with a shoulder fillet), each in (a) axial tension, (b) bending and (c) torsion:

.. math::

    K_t = C_1 + C_2 \\left(\\frac{2h}{D}\\right) + C_3 \\left(\\frac{2h}{D}\\right)^2
          + C_4 \\left(\\frac{2h}{D}\\right)^3, \\qquad
    C_i = a_i + b_i\\sqrt{h/r} + c_i\\,h/r

with h the shoulder height (D − d)/2 or the groove depth, r the fillet or groove-bottom radius, D
the larger (shoulder) or outside (groove) diameter. Kt is referred to the nominal stress on the
smaller diameter d: 4P/(πd²), 32M/(πd³), 16T/(πd³).

The coefficients below were transcribed from memory of the printed table, not copied from a copy of
it at hand: they were checked here only for internal consistency (each fit's two ranges of h/r
meet at h/r = 2 to about 1 % or better, except the U-groove in bending, where they differ by about
2 %; tension and bending agree in the shallow limit 2h/D → 0, as they must; the U-groove in
torsion gives 2.00 for a shallow semicircular groove, the published limit). Check them against the
printed table before relying on them. The fits are themselves fits to charts built from
photoelastic and early numerical data: expect a few per cent from an accurate solution, more at
some corners of the range. The validity ranges in h/r are data (:data:`RANGES`); outside them the
functions refuse rather than extrapolate.
"""
from __future__ import annotations

import math

from classic._validity import OutOfRangeError, Validity

__all__ = [
    "SOURCE", "COEFFICIENTS", "RANGES", "ACCURACY", "kt_fit", "in_range",
    "shoulder_kt_tension", "shoulder_kt_bending", "shoulder_kts_torsion",
    "groove_kt_tension", "groove_kt_bending", "groove_kts_torsion",
]

SOURCE = ("Roark's Formulas for Stress and Strain, 7th ed. (Young & Budynas), Table 17.1, cases 17 and 18 "
          "(fits of Peterson's Stress Concentration Factors, 3rd ed.; coefficients from memory)")

#: (feature, load) -> list of (h/r low, h/r high, ((a1, b1, c1), (a2, b2, c2), (a3, b3, c3), (a4, b4, c4)))
COEFFICIENTS: dict[tuple[str, str], list] = {
    ("shoulder", "tension"): [
        (0.1, 2.0, ((0.926, 1.157, -0.099), (0.012, -3.036, 0.961), (-0.302, 3.977, -1.744), (0.365, -2.098, 0.878))),
        (2.0, 20.0, ((1.200, 0.860, -0.022), (-1.805, -0.346, -0.038), (2.198, -0.486, 0.165), (-0.593, -0.028, -0.106))),
    ],
    ("shoulder", "bending"): [
        (0.1, 2.0, ((0.947, 1.206, -0.131), (0.022, -3.405, 0.915), (0.869, 1.777, -0.555), (-0.810, 0.422, -0.260))),
        (2.0, 20.0, ((1.232, 0.832, -0.008), (-3.813, 0.968, -0.260), (7.423, -4.868, 0.869), (-3.839, 3.070, -0.600))),
    ],
    ("shoulder", "torsion"): [
        (0.25, 4.0, ((0.905, 0.783, -0.075), (-0.437, -1.969, 0.553), (1.557, 1.073, -0.578), (-1.061, 0.171, 0.086))),
    ],
    ("groove", "tension"): [
        (0.1, 2.0, ((0.455, 3.354, -0.769), (3.129, -15.955, 7.404), (-6.909, 29.286, -16.104), (4.325, -16.685, 9.469))),
        (2.0, 50.0, ((0.935, 1.922, 0.004), (0.537, -3.708, 0.040), (-2.538, 3.438, -0.012), (2.066, -1.652, -0.031))),
    ],
    ("groove", "bending"): [
        (0.25, 2.0, ((0.594, 2.958, -0.520), (0.422, -10.545, 2.692), (0.501, 14.375, -4.486), (-0.613, -6.573, 2.177))),
        (2.0, 50.0, ((0.965, 1.926, 0.0), (-2.773, -4.414, -0.017), (4.785, 4.681, 0.096), (-1.975, -2.115, -0.073))),
    ],
    ("groove", "torsion"): [
        (0.25, 2.0, ((0.966, 1.056, -0.022), (-0.192, -4.037, 0.674), (0.808, 5.321, -1.231), (-0.567, -2.364, 0.566))),
        (2.0, 50.0, ((1.089, 0.924, 0.018), (-1.504, -2.141, -0.047), (2.486, 2.289, 0.091), (-1.056, -1.104, -0.062))),
    ],
}

#: Validity of each fit in h/r (data; refuse outside, never clamp).
RANGES: dict[tuple[str, str], Validity] = {
    key: Validity("h/r", rows[0][0], rows[-1][1], "", "refuse", SOURCE) for key, rows in COEFFICIENTS.items()
}

#: The accuracy stated for these fits against an accurate elastic solution: 5 % (common practice for
#: chart fits; the module docstring's "a few per cent"). A converged FE value further from the fit
#: than this says the fit is off there, not the FE: finite-element studies found the shoulder charts
#: low by up to about 24 % in bending and tension (S. M. Tipton, J. R. Sorem, R. D. Rolovic, "Updated
#: stress concentration factors for filleted shafts in bending and tension", J. Mech. Design 118
#: (1996) 321-327).
ACCURACY = 0.05

_POSITIVE = Validity("length", 0.0, math.inf, "m", "refuse", "a length must be positive and finite",
                     strict_low=True, strict_high=True)


def _hD(kind: str, D: float, second: float, r: float) -> tuple[float, float]:
    """(h, D) from the arguments, each checked."""
    for name, v in (("D", D), ("d" if kind == "shoulder" else "h", second), ("r", r)):
        try:
            x = float(v)
        except (TypeError, ValueError):
            raise OutOfRangeError(name, v, "is not a number") from None
        if not (math.isfinite(x) and x > 0):
            raise OutOfRangeError(name, v, "must be a positive, finite length")
    if kind == "shoulder":
        if second >= D:
            raise OutOfRangeError("d", second, "must be smaller than D at a shoulder")
        return (D - second) / 2, D
    if 2 * second >= D:
        raise OutOfRangeError("h", second, "a groove must be shallower than the shaft radius")
    return second, D


def in_range(kind: str, load: str, h_over_r: float) -> bool:
    """Whether ``h_over_r`` lies inside the stated range of the fit."""
    return RANGES[(kind, load)].contains(h_over_r)


def kt_fit(kind: str, load: str, D: float, second: float, r: float) -> float:
    """The Table 17.1 fit for ``kind`` ('shoulder': second = d; 'groove': second = depth h) and
    ``load`` ('tension', 'bending', 'torsion'). Refuses outside the fit's h/r range.

    Examples
    --------
    A shallow semicircular groove (h = r) in a large shaft in torsion: the groove bottom carries
    twice the nominal shear stress (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., torsion of
    shafts of variable diameter, the semicircular groove; the limit value 2 is also in Roark 7th ed.,
    Table 17.1, case 17c at 2h/D → 0):

    >>> round(kt_fit("groove", "torsion", 1e5, 1.0, 1.0), 2)
    2.0
    """
    h, D = _hD(kind, D, second, r)
    hr = h / r
    RANGES[(kind, load)].check(hr)
    rows = COEFFICIENTS[(kind, load)]
    row = next(c for lo, hi, c in rows if lo <= hr <= hi)
    s = math.sqrt(hr)
    C = [a + b * s + c * hr for a, b, c in row]
    x = 2 * h / D
    return C[0] + C[1] * x + C[2] * x**2 + C[3] * x**3


def shoulder_kt_tension(D: float, d: float, r: float) -> float:
    """Shoulder fillet of a stepped round shaft in axial tension, Kt on σ = 4P/(πd²).

    .. math:: K_t = \\sum_{i=1}^{4} C_i (2h/D)^{i-1}, \\quad h = (D - d)/2

    Parameters
    ----------
    D, d : float
        Larger and smaller diameter [m].
    r : float
        Fillet radius [m].

    Returns
    -------
    float
        Kt [-].

    Notes
    -----
    Valid for 0.1 ≤ h/r ≤ 20 (two coefficient sets, split at h/r = 2); refused outside.

    References
    ----------
    Roark's Formulas for Stress and Strain, 7th ed., Table 17.1, case 18a (Peterson's Stress
    Concentration Factors, 3rd ed., the stepped bar in tension); coefficients from memory.

    Examples
    --------
    Tension and bending fits meet in the shallow-shoulder limit (2h/D → 0), as they must:

    >>> abs(shoulder_kt_tension(1e4, 1e4 - 2, 1.0) - shoulder_kt_bending(1e4, 1e4 - 2, 1.0)) < 0.05
    True
    """
    return kt_fit("shoulder", "tension", D, d, r)


def shoulder_kt_bending(D: float, d: float, r: float) -> float:
    """Shoulder fillet of a stepped round shaft in bending, Kt on σ = 32M/(πd³).

    .. math:: K_t = \\sum_{i=1}^{4} C_i (2h/D)^{i-1}, \\quad h = (D - d)/2

    Parameters
    ----------
    D, d : float
        Larger and smaller diameter [m].
    r : float
        Fillet radius [m].

    Returns
    -------
    float
        Kt [-].

    Notes
    -----
    Valid for 0.1 ≤ h/r ≤ 20; refused outside.

    References
    ----------
    Roark's Formulas for Stress and Strain, 7th ed., Table 17.1, case 18b; coefficients from memory.

    Examples
    --------
    The fit evaluated (a regression value, not a published check value):

    >>> round(shoulder_kt_bending(1.5, 1.0, 0.1), 2)
    1.74
    """
    return kt_fit("shoulder", "bending", D, d, r)


def shoulder_kts_torsion(D: float, d: float, r: float) -> float:
    """Shoulder fillet of a stepped round shaft in torsion, Kts on τ = 16T/(πd³).

    .. math:: K_{ts} = \\sum_{i=1}^{4} C_i (2h/D)^{i-1}, \\quad h = (D - d)/2

    Parameters
    ----------
    D, d : float
        Larger and smaller diameter [m].
    r : float
        Fillet radius [m].

    Returns
    -------
    float
        Kts [-].

    Notes
    -----
    Valid for 0.25 ≤ h/r ≤ 4; refused outside.

    References
    ----------
    Roark's Formulas for Stress and Strain, 7th ed., Table 17.1, case 18c; coefficients from memory.

    Examples
    --------
    The fit evaluated (a regression value, not a published check value):

    >>> round(shoulder_kts_torsion(1.2, 1.0, 0.1), 2)
    1.36
    """
    return kt_fit("shoulder", "torsion", D, d, r)


def groove_kt_tension(D: float, h: float, r: float) -> float:
    """U-shaped circumferential groove in a round shaft in axial tension, Kt on σ = 4P/(πd²),
    d = D − 2h.

    .. math:: K_t = \\sum_{i=1}^{4} C_i (2h/D)^{i-1}

    Parameters
    ----------
    D : float
        Shaft diameter [m].
    h : float
        Groove depth [m].
    r : float
        Groove bottom radius [m].

    Returns
    -------
    float
        Kt [-].

    Notes
    -----
    Valid for 0.1 ≤ h/r ≤ 50; refused outside.

    References
    ----------
    Roark's Formulas for Stress and Strain, 7th ed., Table 17.1, case 17a; coefficients from memory.

    Examples
    --------
    The fit evaluated (a regression value, not a published check value):

    >>> round(groove_kt_tension(1.2, 0.1, 0.1), 2)
    2.3
    """
    return kt_fit("groove", "tension", D, h, r)


def groove_kt_bending(D: float, h: float, r: float) -> float:
    """U-shaped circumferential groove in a round shaft in bending, Kt on σ = 32M/(πd³), d = D − 2h.

    .. math:: K_t = \\sum_{i=1}^{4} C_i (2h/D)^{i-1}

    Parameters
    ----------
    D : float
        Shaft diameter [m].
    h : float
        Groove depth [m].
    r : float
        Groove bottom radius [m].

    Returns
    -------
    float
        Kt [-].

    Notes
    -----
    Valid for 0.25 ≤ h/r ≤ 50; refused outside.

    References
    ----------
    Roark's Formulas for Stress and Strain, 7th ed., Table 17.1, case 17b; coefficients from memory.

    Examples
    --------
    The fit evaluated (a regression value, not a published check value):

    >>> round(groove_kt_bending(1.2, 0.1, 0.1), 2)
    2.06
    """
    return kt_fit("groove", "bending", D, h, r)


def groove_kts_torsion(D: float, h: float, r: float) -> float:
    """U-shaped circumferential groove in a round shaft in torsion, Kts on τ = 16T/(πd³), d = D − 2h.

    .. math:: K_{ts} = \\sum_{i=1}^{4} C_i (2h/D)^{i-1}

    Parameters
    ----------
    D : float
        Shaft diameter [m].
    h : float
        Groove depth [m].
    r : float
        Groove bottom radius [m].

    Returns
    -------
    float
        Kts [-].

    Notes
    -----
    Valid for 0.25 ≤ h/r ≤ 50; refused outside.

    References
    ----------
    Roark's Formulas for Stress and Strain, 7th ed., Table 17.1, case 17c; coefficients from memory.
    Timoshenko & Goodier, Theory of Elasticity, 3rd ed.: Kts → 2 for a shallow semicircular groove.

    Examples
    --------
    >>> round(groove_kts_torsion(1e5, 1.0, 1.0), 2)
    2.0
    """
    return kt_fit("groove", "torsion", D, h, r)

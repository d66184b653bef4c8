"""Polymer shafts: properties read from the user's own data at the service conditions, the
stress-amplitude-life fit, the creep (isochronous) modulus at a load duration and the mean-stress
line. One function per published formula; no material data of any kind is built in.

Everything is read from points the user gives (a supplier's data sheet for the grade, the part's
own tests). Outside the points nothing is extrapolated: each function refuses
(:class:`~classic._validity.OutOfRangeError`) rather than clamp or extend a curve.

Units: stresses in any one consistent unit (Pa inside shaftcheck), temperatures in °C, load
durations in any one unit (s inside shaftcheck), cycles as a count.

Results are a cross-check aid; polymer data depend on the grade, processing, weld lines and
orientation in the moulding: the supplier's data for the grade and the part's own tests decide.
"""
from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np

from classic._validity import OutOfRangeError, Validity

__all__ = [
    "BASQUIN_SOURCE", "SN_FIT_SOURCE", "ISOCHRONOUS_SOURCE", "GOODMAN_SOURCE",
    "interpolate_in_table", "BasquinFit", "basquin_fit", "basquin_amplitude", "sn_strength",
    "creep_modulus", "goodman_factor_polymer",
]

#: The power law of the stress-life curve: Basquin, O. H., "The exponential law of endurance tests",
#: Proc. ASTM 10 (Part II), 1910, pp. 625-630.
BASQUIN_SOURCE = "Basquin, 'The exponential law of endurance tests', Proc. ASTM 10 (II), 1910, pp. 625-630"
#: How the power law is fitted to test points: least squares of log N on log S (life the dependent
#: variable), as ASTM E739 sets out for linearised S-N data (from memory).
SN_FIT_SOURCE = ("least squares of log10 N on log10 Sa, life the dependent variable, as in ASTM E739 "
                 "(statistical analysis of linearised S-N data; from memory)")
#: The creep (isochronous) modulus used in the elastic formulas at the design life, read from
#: creep data plotted against log time: Crawford, Plastics Engineering, 3rd ed., Butterworth-
#: Heinemann, 1998, ch. 2 (pseudo-elastic design method; from memory). Interpolation linear in
#: log10 t between the data points: common practice (creep data are drawn on log time).
ISOCHRONOUS_SOURCE = ("Crawford, Plastics Engineering, 3rd ed. (1998), ch. 2, pseudo-elastic design with the "
                      "creep modulus at the design life (from memory); linear in log10 t between points (common practice)")
#: The mean-stress line: Goodman's straight line from the fully reversed fatigue strength to the
#: tensile strength (Goodman, Mechanics Applied to Engineering, 1899; from memory), applied to a
#: polymer with both strengths at the service temperature and moisture state: common practice
#: (from memory); no polymer-specific published form is used.
GOODMAN_SOURCE = ("Goodman line, σa/Sf + σm/Sut = 1/n (Goodman, Mechanics Applied to Engineering, 1899; from memory), "
                  "with Sf and Sut of the polymer at the service temperature and moisture state (common practice, "
                  "from memory; no polymer-specific form)")

_POSITIVE_STRESS = Validity("stress", low=0.0, strict_low=True, action="refuse",
                            source="a strength, amplitude or modulus must be positive")
_POSITIVE_CYCLES = Validity("cycles", low=1.0, action="refuse", source="a life is at least one cycle")
_POSITIVE_TIME = Validity("duration", low=0.0, strict_low=True, action="refuse",
                          source="a load duration must be positive (it is read on a log scale)")
_NON_NEGATIVE = Validity("stress", low=0.0, action="refuse",
                         source="an amplitude and a von Mises mean stress are not negative")


def _points(xs, ys, xname: str, yname: str) -> tuple[np.ndarray, np.ndarray]:
    x = np.asarray(xs, dtype=float)
    y = np.asarray(ys, dtype=float)
    if x.ndim != 1 or y.shape != x.shape:
        raise OutOfRangeError(yname, list(np.atleast_1d(ys)), f"needs one value per {xname} point ({x.size} given)")
    if x.size < 2:
        raise OutOfRangeError(xname, list(np.atleast_1d(xs)), "needs at least two points")
    if not (np.all(np.isfinite(x)) and np.all(np.isfinite(y))):
        raise OutOfRangeError(xname, list(x), "holds a value that is not a finite number")
    if not np.all(np.diff(x) > 0):
        raise OutOfRangeError(xname, list(x), "must increase strictly from point to point")
    return x, y


def interpolate_in_table(x: float, xs, ys, name: str = "x", unit: str = "", log_x: bool = False) -> float:
    """A property at ``x``, linear between the two data points around it (a data utility, not a
    published formula); refused outside the points (never clamped, never extrapolated).

    .. math:: y(x) = y_i + (y_{i+1} - y_i)\\,\\frac{x - x_i}{x_{i+1} - x_i}

    with ``log10`` of every x in place of x when ``log_x``.

    Parameters
    ----------
    x : float
        Where the property is wanted [the unit of ``xs``].
    xs : sequence of float
        The data's abscissae, strictly increasing [°C, s, ...].
    ys : sequence of float
        The property at each abscissa [any unit].
    name, unit : str
        The abscissa's name and unit, for the refusal.
    log_x : bool
        Interpolate linearly in log10 x (x and xs positive).

    Returns
    -------
    float
        The property at ``x`` [the unit of ``ys``].

    Notes
    -----
    Validity: ``min(xs) <= x <= max(xs)`` (the data's own range, built as a
    :class:`~classic._validity.Validity` from the points); outside it refused.

    Examples
    --------
    A strength of 80 at 20 °C and 60 at 60 °C reads 70 at 40 °C:

    >>> interpolate_in_table(40.0, [20.0, 60.0], [80.0, 60.0], "temperature", "degC")
    70.0
    """
    xa, ya = _points(xs, ys, name, "values")
    Validity(name, low=float(xa[0]), high=float(xa[-1]), unit=unit, action="refuse",
             source="the data's own range: nothing is read outside the points given").check(float(x))
    if log_x:
        if not xa[0] > 0:
            raise OutOfRangeError(name, list(xa), "must be positive to be read on a log scale")
        xa, x = np.log10(xa), math.log10(x)
    return float(np.interp(x, xa, ya))


class BasquinFit(NamedTuple):
    """σa = A·N^b fitted to test points, with the range of lives the points cover."""

    A: float          #: coefficient [stress]
    b: float          #: exponent (negative) [-]
    n_min: float      #: shortest life among the points [cycles]
    n_max: float      #: longest life among the points [cycles]
    r2: float         #: coefficient of determination of the fit in log-log [-]


def basquin_fit(cycles, amplitudes) -> BasquinFit:
    """Fit the power law of the stress-life curve to test points in log-log (no endurance limit
    assumed: the curve keeps falling).

    .. math:: \\sigma_a = A\\,N^{b}, \\qquad \\log_{10} N = c_0 + c_1 \\log_{10}\\sigma_a
              \\;\\Rightarrow\\; b = 1/c_1,\\; A = 10^{-c_0/c_1}

    Parameters
    ----------
    cycles : sequence of float
        Lives of the test points, strictly increasing [cycles].
    amplitudes : sequence of float
        Stress amplitude of each point, at the test's own stress ratio [stress].

    Returns
    -------
    BasquinFit
        A [stress], b [-], the lives covered [cycles] and r² of the log-log fit.

    Notes
    -----
    Validity: at least two points, lives >= 1 cycle, amplitudes > 0 and falling with life (b < 0);
    otherwise refused. The fit regresses log N on log σa (life the dependent variable), as ASTM E739
    does for linearised S-N data (from memory); points lying exactly on a power law give it back.

    References
    ----------
    Basquin, O. H., "The exponential law of endurance tests", Proc. ASTM 10 (Part II), 1910,
    pp. 625-630. ASTM E739, Standard practice for statistical analysis of linear or linearized
    stress-life (S-N) and strain-life fatigue data (from memory).

    Examples
    --------
    Points on σa = 100·N^(-0.1) (hand-worked: 100·10^(-0.4) = 39.81, 100·10^(-0.6) = 25.12):

    >>> f = basquin_fit([1e4, 1e6], [100 * 1e4 ** -0.1, 100 * 1e6 ** -0.1])
    >>> round(f.A, 6), round(f.b, 6)
    (100.0, -0.1)
    """
    n, s = _points(cycles, amplitudes, "cycles", "amplitude")
    for v in n:
        _POSITIVE_CYCLES.check(float(v))
    for v in s:
        _POSITIVE_STRESS.check(float(v))
    ln, ls = np.log10(n), np.log10(s)
    if np.ptp(ls) == 0.0:
        raise OutOfRangeError("amplitude", list(s), "is the same at every life: no stress-life slope to fit")
    c1, c0 = np.polyfit(ls, ln, 1)
    if not c1 < 0:
        raise OutOfRangeError("amplitude", list(s), "must fall as the life grows (a stress-life curve)")
    b = 1.0 / c1
    A = 10.0 ** (-c0 / c1)
    pred = c0 + c1 * ls
    ss = float(np.sum((ln - ln.mean()) ** 2))
    r2 = 1.0 - float(np.sum((ln - pred) ** 2)) / ss if ss > 0 else 1.0
    return BasquinFit(float(A), float(b), float(n[0]), float(n[-1]), r2)


def basquin_amplitude(N: float, A: float, b: float) -> float:
    """Stress amplitude the power law gives at a life.

    .. math:: \\sigma_a = A\\,N^{b}

    Parameters
    ----------
    N : float
        Life [cycles], >= 1.
    A : float
        Coefficient [stress], > 0.
    b : float
        Exponent [-], < 0.

    Returns
    -------
    float
        Stress amplitude [the unit of A].

    Notes
    -----
    Validity: N >= 1, A > 0 (refused otherwise). The range of lives the fit may be read over is
    the data's: :func:`sn_strength` keeps it.

    References
    ----------
    Basquin, O. H., "The exponential law of endurance tests", Proc. ASTM 10 (Part II), 1910.

    Examples
    --------
    >>> round(basquin_amplitude(1e5, 100.0, -0.1), 4)   # 100·10^(-0.5) = 31.6228 by hand
    31.6228
    """
    _POSITIVE_CYCLES.check(float(N))
    _POSITIVE_STRESS.check(float(A))
    return float(A * N ** b)


def sn_strength(N: float, cycles, amplitudes) -> tuple[float, BasquinFit]:
    """Fatigue strength (stress amplitude) at ``N`` cycles from the user's stress-life points:
    the power-law fit read at N, only inside the lives the points cover.

    .. math:: S_f(N) = A\\,N^{b}, \\qquad N_{min} \\le N \\le N_{max}

    Parameters
    ----------
    N : float
        Required life [cycles].
    cycles, amplitudes : sequence of float
        The test points [cycles], [stress].

    Returns
    -------
    tuple
        (S_f [stress], the :class:`BasquinFit`).

    Notes
    -----
    Validity: the lives of the data, ``min(cycles) <= N <= max(cycles)``; refused outside
    (no endurance limit is assumed and the curve is not extended past the longest test).

    References
    ----------
    Basquin (1910), see :func:`basquin_fit`.

    Examples
    --------
    >>> S, fit = sn_strength(1e5, [1e4, 1e6], [100 * 1e4 ** -0.1, 100 * 1e6 ** -0.1])
    >>> round(S, 4)
    31.6228
    """
    fit = basquin_fit(cycles, amplitudes)
    Validity("cycles", low=fit.n_min, high=fit.n_max, unit="cycles", action="refuse",
             source="the lives the stress-life points cover: the curve is not extended past the longest test "
                    "and no endurance limit is assumed").check(float(N))
    return basquin_amplitude(N, fit.A, fit.b), fit


def creep_modulus(t: float, durations, moduli) -> float:
    """Creep (isochronous) modulus at a load duration: linear in log10 t between the data points,
    refused outside them.

    .. math:: E_c(t) = E_i + (E_{i+1} - E_i)\\,
              \\frac{\\log_{10} t - \\log_{10} t_i}{\\log_{10} t_{i+1} - \\log_{10} t_i}

    Parameters
    ----------
    t : float
        Load duration [the unit of ``durations``], > 0.
    durations : sequence of float
        Durations of the data, strictly increasing, > 0 [s, h, ...].
    moduli : sequence of float
        Creep modulus (stress over strain at that duration) at each duration [stress].

    Returns
    -------
    float
        E_c(t) [the unit of ``moduli``].

    Notes
    -----
    Validity: ``min(durations) <= t <= max(durations)``; refused outside. Moduli must be positive.
    The creep modulus used in the elastic formulas at the design life is the pseudo-elastic
    method (Crawford, Plastics Engineering, 3rd ed., 1998, ch. 2; from memory); it is valid for
    the stress level and temperature the data were taken at.

    References
    ----------
    Crawford, R. J., Plastics Engineering, 3rd ed., Butterworth-Heinemann, 1998, ch. 2 (from memory).

    Examples
    --------
    2000 at 1 h and 1400 at 1000 h: at 10 h, one third of the way in log time, 2000 − 600/3 = 1800:

    >>> round(creep_modulus(10.0, [1.0, 1000.0], [2000.0, 1400.0]), 9)
    1800.0
    """
    _POSITIVE_TIME.check(float(t))
    _, m = _points(durations, moduli, "duration", "modulus")
    for v in m:
        _POSITIVE_STRESS.check(float(v))
    for v in durations:
        _POSITIVE_TIME.check(float(v))
    return interpolate_in_table(t, durations, moduli, "duration", log_x=True)


def goodman_factor_polymer(sigma_a: float, sigma_m: float, S_f: float, S_ut: float) -> float:
    """Factor of safety on the Goodman line between the fully reversed fatigue strength at the
    required life and the tensile strength, both at the service temperature and moisture state.

    .. math:: \\frac{1}{n} = \\frac{\\sigma_a}{S_f(N)} + \\frac{\\sigma_m}{S_{ut}}

    Parameters
    ----------
    sigma_a : float
        Equivalent (von Mises) stress amplitude [stress], >= 0.
    sigma_m : float
        Equivalent (von Mises) mean stress [stress], >= 0 (a compressive mean counted like a
        tensile one: conservative).
    S_f : float
        Fully reversed fatigue strength at the required life [stress], > 0.
    S_ut : float
        Tensile strength at the service conditions [stress], > 0.

    Returns
    -------
    float
        n [-]; ``inf`` with no stress.

    Notes
    -----
    Validity: stresses >= 0, strengths > 0 (refused otherwise). The straight line is Goodman's
    (from memory), applied to polymers as common practice (from memory); data at the service
    stress ratio, where the supplier gives them, are better than any mean-stress line.

    References
    ----------
    Goodman, J., Mechanics Applied to Engineering, Longmans, 1899 (from memory).

    Examples
    --------
    σa = 10, σm = 20, Sf = 25, Sut = 80: 1/n = 0.4 + 0.25 = 0.65, n = 1.538 by hand:

    >>> round(goodman_factor_polymer(10.0, 20.0, 25.0, 80.0), 4)
    1.5385
    """
    _NON_NEGATIVE.check(float(sigma_a))
    _NON_NEGATIVE.check(float(sigma_m))
    _POSITIVE_STRESS.check(float(S_f))
    _POSITIVE_STRESS.check(float(S_ut))
    inv = sigma_a / S_f + sigma_m / S_ut
    return math.inf if inv == 0 else 1.0 / inv

"""High-cycle fatigue of steel shafts: Marin factors, notch sensitivity and the shaft criteria.

All forms are those of Shigley's Mechanical Engineering Design, 9th ed. (Budynas & Nisbett,
McGraw-Hill, 2011); later editions revised some of them (the 11th edition revised the surface-factor
table), so the edition is recorded in :data:`EDITION` and in every docstring.

Units. The Marin and notch-sensitivity correlations are published in kpsi / MPa / in / mm and keep
that unit, stated in brackets and in a ``unit`` argument or the function name. The stress-based
fatigue criteria and the shaft (d-based) criteria are dimensionally homogeneous: SI (m, N*m, Pa) is
documented, and any consistent set (in, lbf*in, psi) gives the same factor of safety.

Each shaft criterion exists twice: stress-based (von Mises alternating and mean stresses, usable
with FE local stresses) and d-based (nominal stresses of a round shaft, eqs. 7-5 and 7-6); the d-based
function computes the two stresses and calls the stress-based one, so each criterion is coded once.

Worked-example digits reproduced (tests/test_classic_fatigue.py, and through the shaft check in
tests/test_compare_combined.py): Shigley 9th ed., Example 7-1 (p. 371) - DE-Goodman n = 1.63,
DE-Soderberg 1.56 and the first-cycle yield ny = 4.50 to the printed digits; DE-Gerber and DE-ASME
elliptic compute to 1.863 and 1.872 from the printed inputs where the book prints 1.87 and 1.88 (one
unit in the last printed digit, not explained by rounding of the printed inputs), so those two are
held to +-0.01. The Marin chain gives the printed Se = 29.3 kpsi with the text's factors rounded to
three decimals (29.25 kpsi unrounded); Kf = 1.58 and Kfs = 1.37 from Kt = 1.68, Kts = 1.42 and the
Neuber fits at r = 0.11 in; Example 6-3, ka = 0.860.

Results are a cross-check aid; the governing codes and standards and a licensed engineer decide.
"""
from __future__ import annotations

import math

import numpy as np

from classic import stress
from classic._validity import OutOfRangeError, Validity

EDITION = "Shigley's Mechanical Engineering Design, 9th ed."

__all__ = [
    "EDITION",
    "SURFACE_FACTOR_TABLE", "LOAD_FACTORS", "TEMPERATURE_POLY_F", "RELIABILITY_TABLE",
    "NEUBER_BENDING", "NEUBER_TORSION",
    "surface_factor", "size_factor", "load_factor", "temperature_factor",
    "reliability_factor", "reliability_factor_za", "rotating_beam_endurance",
    "marin_endurance_limit",
    "neuber_sqrt_a_bending", "neuber_sqrt_a_torsion", "notch_sensitivity",
    "notch_sensitivity_si", "fatigue_kf",
    "shaft_von_mises_stresses",
    "goodman_factor", "gerber_factor", "asme_elliptic_factor", "soderberg_factor",
    "langer_factor",
    "de_goodman", "de_gerber", "de_asme_elliptic", "de_soderberg", "de_first_cycle_yield",
    "de_langer",
]

_KPSI = 6.894757293168361e6  # Pa per kpsi (1 lbf/in^2 = 6894.757293168361 Pa)
_INCH = 0.0254               # m per inch, exact

# --- published data -----------------------------------------------------------------------------
#: Table 6-2 (9th ed.): surface factor ka = a * Sut**b; a for Sut in kpsi and in MPa, exponent b.
SURFACE_FACTOR_TABLE = {
    "ground":               {"kpsi": 1.34, "MPa": 1.58, "b": -0.085},
    "machined/cold-drawn":  {"kpsi": 2.70, "MPa": 4.51, "b": -0.265},
    "hot-rolled":           {"kpsi": 14.4, "MPa": 57.7, "b": -0.718},
    "as-forged":            {"kpsi": 39.9, "MPa": 272.0, "b": -0.995},
}
_FINISH_ALIASES = {
    "ground": "ground",
    "machined": "machined/cold-drawn", "cold-drawn": "machined/cold-drawn",
    "machined/cold-drawn": "machined/cold-drawn", "machined-or-cold-drawn": "machined/cold-drawn",
    "hot-rolled": "hot-rolled",
    "as-forged": "as-forged", "forged": "as-forged",
}

#: Eq. 6-26 (9th ed.): load factor kc.
LOAD_FACTORS = {"bending": 1.0, "axial": 0.85, "torsion": 0.59}

#: Eq. 6-27 (9th ed.): kd = sum(c_i * T_F**i), T_F in degrees Fahrenheit.
TEMPERATURE_POLY_F = (0.975, 0.432e-3, -0.115e-5, 0.104e-8, -0.595e-12)

#: Table 6-5 (9th ed.): reliability -> ke (the table's 8 rows; values from memory, see
#: :func:`reliability_factor`).
RELIABILITY_TABLE = {
    0.50: 1.000, 0.90: 0.897, 0.95: 0.868, 0.99: 0.814,
    0.999: 0.753, 0.9999: 0.702, 0.99999: 0.659, 0.999999: 0.620,
}

#: Eq. 6-35a (9th ed.): Neuber constant sqrt(a) [sqrt(in)] for bending or axial load, cubic in
#: Sut [kpsi], steels. Coefficients c0..c3.
NEUBER_BENDING = (0.246, -3.08e-3, 1.51e-5, -2.67e-8)
#: Eq. 6-35b (9th ed.): the same for torsion.
NEUBER_TORSION = (0.190, -2.51e-3, 1.35e-5, -2.67e-8)

# --- validity ranges (data) ---------------------------------------------------------------------
_SUT_POSITIVE = Validity("Sut", low=0.0, strict_low=True, action="refuse",
                         source="an ultimate tensile strength must be positive")
_KB_D_IN = Validity("d", low=0.11, high=10.0, unit="in", action="refuse",
                    source=f"{EDITION}, eq. 6-20 states no size factor outside 0.11-10 in")
_KB_D_MM = Validity("d", low=2.79, high=254.0, unit="mm", action="refuse",
                    source=f"{EDITION}, eq. 6-20 states no size factor outside 2.79-254 mm")
_D_POSITIVE = Validity("d", low=0.0, strict_low=True, action="refuse",
                       source="a diameter must be positive")
_KD_FIT = Validity("T_celsius", low=(70.0 - 32.0) / 1.8, high=(1000.0 - 32.0) / 1.8, unit="degC",
                   action="warn", source=f"{EDITION}, eq. 6-27 is fitted over 70-1000 degF")
_KD_HARD = Validity("T_celsius", low=-273.15, high=(1000.0 - 32.0) / 1.8, unit="degC",
                    action="refuse",
                    source=f"{EDITION}, eq. 6-27 ends at 1000 degF; above it creep governs")
_ZA_RANGE = Validity("z_a", low=0.0, high=12.5, strict_high=True, action="refuse",
                     source=f"{EDITION}, eq. 6-29: z_a >= 0 (reliability >= 50 %) and ke > 0")
_SE_PRIME_POSITIVE = Validity("Se_prime", low=0.0, strict_low=True, action="refuse",
                              source="an endurance limit must be positive")
_NEUBER_SUT_KPSI = Validity("Sut_kpsi", low=60.0, high=200.0, unit="kpsi", action="warn",
                            source=f"{EDITION}, Figs. 6-20/6-21 that eq. 6-35 fits span "
                                   "60-200 kpsi (0.4-1.4 GPa) (from memory)")
_R_POSITIVE = Validity("r", low=0.0, strict_low=True, unit="in", action="refuse",
                       source="a notch radius must be positive")
_R_CHART = Validity("r", low=0.0, high=0.16, unit="in", action="warn",
                    source=f"{EDITION}, Figs. 6-20/6-21 end at r = 0.16 in (4 mm)")
_SQRT_A_NONNEG = Validity("sqrt_a", low=0.0, unit="sqrt(in)", action="refuse",
                          source="the Neuber constant is not negative")
_KT_RANGE = Validity("Kt", low=1.0, action="refuse",
                     source="a stress-concentration factor is at least 1")
_Q_RANGE = Validity("q", low=0.0, high=1.0, action="refuse",
                    source=f"{EDITION}, eq. 6-31: 0 <= q <= 1")
_KF_RANGE = Validity("Kf", low=1.0, action="refuse",
                     source="a fatigue stress-concentration factor is at least 1")
_KFS_RANGE = Validity("Kfs", low=1.0, action="refuse",
                      source="a fatigue stress-concentration factor is at least 1")
_SA_NONNEG = Validity("sa", low=0.0, unit="Pa", action="refuse",
                      source="a von Mises alternating stress is not negative")
_SM_NONNEG = Validity("sm", low=0.0, unit="Pa", action="refuse",
                      source="a von Mises mean stress is not negative; for a compressive mean "
                             f"stress these lines do not apply ({EDITION}, Sec. 6-12)")
_SE_POSITIVE = Validity("Se", low=0.0, strict_low=True, unit="Pa", action="refuse",
                        source="an endurance limit must be positive")
_SUT_PA_POSITIVE = Validity("Sut", low=0.0, strict_low=True, unit="Pa", action="refuse",
                            source="an ultimate tensile strength must be positive")
_SY_POSITIVE = Validity("Sy", low=0.0, strict_low=True, unit="Pa", action="refuse",
                        source="a yield strength must be positive")


# --- helpers ------------------------------------------------------------------------------------
_num = stress._num
_check = stress._check
_out = stress._out


def _factor_check(name: str, value) -> np.ndarray:
    a = _num(name, value)
    _check(Validity(name, low=0.0, strict_low=True, action="refuse",
                    source="a Marin factor must be positive"), a)
    return a


def _choice(field: str, value, options) -> str:
    key = str(value).strip().lower().replace(" ", "-").replace("_", "-")
    if key not in options:
        raise OutOfRangeError(field, value, f"unknown; use one of {sorted(set(options))}")
    return key


def _poly(coeffs, x):
    return sum(c * x**i for i, c in enumerate(coeffs))


# --- Marin factors ------------------------------------------------------------------------------
def surface_factor(Sut, finish, unit="MPa"):
    r"""Marin surface factor ka.

    .. math::
        k_a = a\,S_{ut}^{\,b}

    with a, b from Table 6-2 (:data:`SURFACE_FACTOR_TABLE`):

    ===================  ===========  =========  ======
    finish               a [kpsi]     a [MPa]    b
    ===================  ===========  =========  ======
    ground               1.34         1.58       -0.085
    machined/cold-drawn  2.70         4.51       -0.265
    hot-rolled           14.4         57.7       -0.718
    as-forged            39.9         272        -0.995
    ===================  ===========  =========  ======

    Parameters
    ----------
    Sut : float or array
        Minimum ultimate tensile strength, in ``unit`` [MPa] or [kpsi] (or [Pa]).
    finish : str
        'ground', 'machined' (or 'cold-drawn'), 'hot-rolled' or 'as-forged'.
    unit : {'MPa', 'kpsi', 'Pa'}
        Unit of ``Sut``; 'Pa' is converted to MPa and uses the MPa column.

    Returns
    -------
    ka : float or array
        Surface factor [-]. Not capped at 1 (a ground surface of low Sut gives slightly above 1).

    Notes
    -----
    Steels. The table states no range of Sut; only Sut <= 0 is refused. The two columns are the
    same fit in two units and differ by rounding (well under 1 %). Edition: 9th; the 11th edition
    revised this table.

    Examples
    --------
    Shigley 9th ed., Example 6-3: a machined steel of Sut = 520 MPa, ka = 0.860:

    >>> round(surface_factor(520.0, "machined"), 3)
    0.86

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-9, eq. 6-19 and Table 6-2; Example 6-3.
    """
    unit = {"mpa": "MPa", "kpsi": "kpsi", "pa": "Pa"}.get(str(unit).strip().lower(), unit)
    if unit not in ("MPa", "kpsi", "Pa"):
        raise OutOfRangeError("unit", unit, "unknown; use 'MPa', 'kpsi' or 'Pa'")
    row = SURFACE_FACTOR_TABLE[_FINISH_ALIASES[_choice("finish", finish, _FINISH_ALIASES)]]
    S = _num("Sut", Sut)
    _check(_SUT_POSITIVE, S)
    if unit == "Pa":
        S, unit = S / 1e6, "MPa"
    return _out(row[unit] * S ** row["b"])


def size_factor(d, unit, loading="bending"):
    r"""Marin size factor kb for a round bar.

    .. math::
        k_b = \begin{cases}
            0.879\,d^{-0.107} & 0.11 \le d \le 2\ \mathrm{in} \\
            0.91\,d^{-0.157}  & 2 < d \le 10\ \mathrm{in} \\
            1.24\,d^{-0.107}  & 2.79 \le d \le 51\ \mathrm{mm} \\
            1.51\,d^{-0.157}  & 51 < d \le 254\ \mathrm{mm}
        \end{cases}
        \qquad k_b = 1 \text{ in axial loading (eq. 6-21)}

    Parameters
    ----------
    d : float or array
        Diameter, in ``unit`` [in], [mm] or [m].
    unit : {'in', 'mm', 'm'}
        Unit of ``d``; 'm' is converted to mm and uses the mm form.
    loading : {'bending', 'torsion', 'axial'}
        Bending and torsion share eq. 6-20; axial gives 1.

    Returns
    -------
    kb : float or array
        Size factor [-].

    Notes
    -----
    Rotating round bars; for a non-rotating or non-round section use the equivalent diameter of
    Sec. 6-9 (eq. 6-24, Table 6-3; not coded here). Outside 0.11-10 in (2.79-254 mm) the text gives
    no formula - it says kb varies from 0.60 to 0.75 for larger sizes (from memory) - so those
    diameters are **refused**, not extrapolated. The fit is normalised to the 0.30-in (7.62-mm)
    rotating-beam specimen, kb = 1 there. The two branches meet within 0.1 % at 2 in / 51 mm.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory): d = 1.1 in, kb = 0.870:

    >>> round(size_factor(1.1, "in"), 3)
    0.87

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-9, eqs. 6-20 and 6-21.
    """
    unit = _choice("unit", unit, ("in", "mm", "m"))
    loading = _choice("loading", loading, LOAD_FACTORS)
    d = _num("d", d)
    _check(_D_POSITIVE, d)
    if unit == "m":
        d, unit = d * 1e3, "mm"
    if loading == "axial":
        return _out(np.ones_like(d))
    if unit == "in":
        _check(_KB_D_IN, d)
        return _out(np.where(d <= 2.0, 0.879 * d**-0.107, 0.91 * d**-0.157))
    _check(_KB_D_MM, d)
    return _out(np.where(d <= 51.0, 1.24 * d**-0.107, 1.51 * d**-0.157))


def load_factor(loading):
    r"""Marin load factor kc.

    .. math::
        k_c = \begin{cases} 1 & \text{bending} \\ 0.85 & \text{axial} \\
                            0.59 & \text{torsion} \end{cases}

    Parameters
    ----------
    loading : {'bending', 'axial', 'torsion'}
        Kind of fatigue loading.

    Returns
    -------
    kc : float
        Load factor [-] (:data:`LOAD_FACTORS`).

    Notes
    -----
    0.59 is for pure torsional fatigue only. When torsion is combined with bending, as in a shaft,
    use kc = 1 and carry the torsion in the von Mises stresses (Sec. 6-14) - which is what the shaft
    criteria of this module do.

    Examples
    --------
    Shigley 9th ed., eq. 6-26: axial loading

    >>> load_factor("axial")
    0.85

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-9, eq. 6-26 and its footnote on combined loading (from memory).
    """
    return LOAD_FACTORS[_choice("loading", loading, LOAD_FACTORS)]


def temperature_factor(T_celsius):
    r"""Marin temperature factor kd, the polynomial fit of Table 6-4.

    .. math::
        k_d = 0.975 + 0.432\times10^{-3} T_F - 0.115\times10^{-5} T_F^2
              + 0.104\times10^{-8} T_F^3 - 0.595\times10^{-12} T_F^4,
        \qquad T_F = 1.8\,T + 32

    Parameters
    ----------
    T_celsius : float or array
        Operating temperature [degC] (converted to degF for the published fit).

    Returns
    -------
    kd : float or array
        Temperature factor [-].

    Notes
    -----
    Steels; fitted over 70 <= T_F <= 1000 degF (21.1-537.8 degC). Below 21.1 degC the polynomial
    is still evaluated but a warning is issued (the fit gives about 1 there; low-temperature
    brittleness is not covered). Above 537.8 degC it is **refused** (the fit ends; creep governs).

    Examples
    --------
    Shigley 9th ed., Example 6-5 (from memory): 450 degF gives kd = 1.007:

    >>> round(temperature_factor((450.0 - 32.0) / 1.8), 3)
    1.007

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-9, eq. 6-27 and Table 6-4.
    """
    T = _num("T_celsius", T_celsius)
    _check(_KD_HARD, T)
    _check(_KD_FIT, T)
    return _out(_poly(TEMPERATURE_POLY_F, 1.8 * T + 32.0))


def reliability_factor(reliability):
    r"""Marin reliability factor ke from Table 6-5.

    ===========  =====
    reliability  ke
    ===========  =====
    0.50         1.000
    0.90         0.897
    0.95         0.868
    0.99         0.814
    0.999        0.753
    0.9999       0.702
    0.99999      0.659
    0.999999     0.620
    ===========  =====

    Parameters
    ----------
    reliability : float
        Reliability as a fraction, one of the tabulated values [-].

    Returns
    -------
    ke : float
        Reliability factor [-].

    Notes
    -----
    The text does not interpolate the table, so an untabulated reliability is **refused**. For any
    other reliability the text gives eq. 6-29, ke = 1 - 0.08 z_a (:func:`reliability_factor_za`);
    the table is that equation at the tabulated z_a, rounded. Table values are from memory, and
    agree with eq. 6-29 to the printed digits.

    Examples
    --------
    Shigley 9th ed., Table 6-5: 99 % reliability

    >>> reliability_factor(0.99)
    0.814

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-9, Table 6-5.
    """
    R = _num("reliability", reliability)
    if R.ndim != 0:
        raise OutOfRangeError("reliability", reliability, "must be a single number")
    R = float(R)
    for key, ke in RELIABILITY_TABLE.items():
        if abs(R - key) < 1e-12:
            return ke
    raise OutOfRangeError("reliability", reliability,
                          f"not in {EDITION} Table 6-5 ({sorted(RELIABILITY_TABLE)}); "
                          "use reliability_factor_za (eq. 6-29) for other values")


def reliability_factor_za(z_a):
    r"""Marin reliability factor ke from the standard normal variate (8 % scatter of Se).

    .. math::
        k_e = 1 - 0.08\,z_a

    Parameters
    ----------
    z_a : float or array
        Standard normal variate of the wanted reliability [-] (1.288 for 90 %, 2.326 for 99 %).

    Returns
    -------
    ke : float or array
        Reliability factor [-].

    Notes
    -----
    Assumes a standard deviation of the endurance limit of 8 % of its mean. Refuses z_a < 0
    (reliability below 50 %) and z_a >= 12.5 (ke <= 0).

    Examples
    --------
    Shigley 9th ed., Table 6-5 (from memory): 99 % reliability, z_a = 2.326, ke = 0.814:

    >>> round(reliability_factor_za(2.326), 3)
    0.814

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-9, eq. 6-29 (number from memory).
    """
    z = _num("z_a", z_a)
    _check(_ZA_RANGE, z)
    return _out(1.0 - 0.08 * z)


def rotating_beam_endurance(Sut, unit="MPa"):
    r"""Rotating-beam specimen endurance limit Se' of a steel.

    .. math::
        S_e' = \begin{cases} 0.5\,S_{ut} & S_{ut} \le 200\ \mathrm{kpsi}\ (1400\ \mathrm{MPa}) \\
               100\ \mathrm{kpsi}\ (700\ \mathrm{MPa}) & S_{ut} > 200\ \mathrm{kpsi}\
               (1400\ \mathrm{MPa}) \end{cases}

    Parameters
    ----------
    Sut : float or array
        Minimum ultimate tensile strength, in ``unit`` [MPa], [kpsi] or [Pa].
    unit : {'MPa', 'kpsi', 'Pa'}
        Unit of ``Sut`` and of the result. 'kpsi' uses the 200/100 kpsi form, 'MPa' and 'Pa' the
        1400/700 MPa form (the two are published separately and are not exact conversions).

    Returns
    -------
    Se_prime : float or array
        Endurance limit of the polished rotating-beam specimen, in ``unit``.

    Notes
    -----
    Steels only; a mean estimate of test data (scatter is large). Refuses Sut <= 0.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory): Sut = 105 kpsi gives Se' = 52.5 kpsi:

    >>> rotating_beam_endurance(105.0, "kpsi")
    52.5

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-7, eq. 6-8.
    """
    unit = {"mpa": "MPa", "kpsi": "kpsi", "pa": "Pa"}.get(str(unit).strip().lower(), unit)
    if unit not in ("MPa", "kpsi", "Pa"):
        raise OutOfRangeError("unit", unit, "unknown; use 'MPa', 'kpsi' or 'Pa'")
    S = _num("Sut", Sut)
    _check(_SUT_POSITIVE, S)
    cap = {"kpsi": 200.0, "MPa": 1400.0, "Pa": 1400e6}[unit]
    return _out(np.where(S <= cap, 0.5 * S, 0.5 * cap))


def marin_endurance_limit(Se_prime, ka, kb, kc, kd, ke, kf=1.0):
    r"""Endurance limit at the critical location of a part (Marin equation).

    .. math::
        S_e = k_a k_b k_c k_d k_e k_f\,S_e'

    Parameters
    ----------
    Se_prime : float or array
        Rotating-beam specimen endurance limit [Pa] (or any stress unit; the result has the same).
    ka, kb, kc, kd, ke : float or array
        Surface, size, load, temperature and reliability factors [-].
    kf : float or array, optional
        Miscellaneous-effects factor [-], default 1. Not the fatigue stress-concentration factor
        Kf: in this module Kf multiplies the stresses (Sec. 6-10), as the shaft equations do.

    Returns
    -------
    Se : float or array
        Endurance limit, same unit as ``Se_prime``.

    Notes
    -----
    All factors must be positive.

    Examples
    --------
    Shigley 9th ed., Example 7-1: ka = 0.787, kb = 0.870, kc = kd = 1, ke = 0.814 (these from
    memory) on Se' = 52.5 kpsi give the printed Se = 29.3 kpsi:

    >>> round(marin_endurance_limit(52.5, 0.787, 0.870, 1.0, 1.0, 0.814), 1)
    29.3

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-9, eq. 6-18.
    """
    S = _num("Se_prime", Se_prime)
    _check(_SE_PRIME_POSITIVE, S)
    k = [_factor_check(n, v) for n, v in
         (("ka", ka), ("kb", kb), ("kc", kc), ("kd", kd), ("ke", ke), ("kf", kf))]
    return _out(S * k[0] * k[1] * k[2] * k[3] * k[4] * k[5])


# --- notch sensitivity --------------------------------------------------------------------------
def _neuber(coeffs, Sut_kpsi, loading):
    S = _num("Sut_kpsi", Sut_kpsi)
    _check(_SUT_POSITIVE, S)
    _check(_NEUBER_SUT_KPSI, S)
    sa = _poly(coeffs, S)
    if np.any(sa <= 0):
        bad = float(np.asarray(S).ravel()[np.argmax(np.asarray(sa).ravel() <= 0)])
        raise OutOfRangeError("Sut_kpsi", bad,
                              f"the {loading} fit of {EDITION}, eq. 6-35, gives sqrt(a) <= 0 there")
    return _out(sa)


def neuber_sqrt_a_bending(Sut_kpsi):
    r"""Neuber constant sqrt(a) of steel for bending or axial load (cubic fit).

    .. math::
        \sqrt a = 0.246 - 3.08\times10^{-3} S_{ut} + 1.51\times10^{-5} S_{ut}^2
                  - 2.67\times10^{-8} S_{ut}^3

    Parameters
    ----------
    Sut_kpsi : float or array
        Ultimate tensile strength [kpsi].

    Returns
    -------
    sqrt_a : float or array
        Neuber constant [sqrt(in)].

    Notes
    -----
    Steels. The fit reproduces the chart of Fig. 6-20, whose curves span about 60-200 kpsi
    (0.4-1.4 GPa) (from memory): outside that a warning is issued; where the cubic gives
    sqrt(a) <= 0 it is refused.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory): Sut = 105 kpsi and r = 0.11 in give q = 0.85:

    >>> round(notch_sensitivity(0.11, neuber_sqrt_a_bending(105.0)), 2)
    0.85

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-10, eq. 6-35a and Fig. 6-20.
    """
    return _neuber(NEUBER_BENDING, Sut_kpsi, "bending")


def neuber_sqrt_a_torsion(Sut_kpsi):
    r"""Neuber constant sqrt(a) of steel for torsion (cubic fit).

    .. math::
        \sqrt a = 0.190 - 2.51\times10^{-3} S_{ut} + 1.35\times10^{-5} S_{ut}^2
                  - 2.67\times10^{-8} S_{ut}^3

    Parameters
    ----------
    Sut_kpsi : float or array
        Ultimate tensile strength [kpsi].

    Returns
    -------
    sqrt_a : float or array
        Neuber constant [sqrt(in)].

    Notes
    -----
    Steels. The fit reproduces the chart of Fig. 6-21, whose curves span about 60-200 kpsi
    (from memory): outside that a warning is issued; where the cubic gives sqrt(a) <= 0 (just above
    220 kpsi) it is refused.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory): Sut = 105 kpsi and r = 0.11 in give qs = 0.88:

    >>> round(notch_sensitivity(0.11, neuber_sqrt_a_torsion(105.0)), 2)
    0.88

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-10, eq. 6-35b and Fig. 6-21.
    """
    return _neuber(NEUBER_TORSION, Sut_kpsi, "torsion")


def notch_sensitivity(r, sqrt_a):
    r"""Notch sensitivity q from the notch radius and the Neuber constant.

    .. math::
        q = \frac{1}{1 + \sqrt a / \sqrt r}

    Parameters
    ----------
    r : float or array
        Notch root radius [in].
    sqrt_a : float or array
        Neuber constant [sqrt(in)] (:func:`neuber_sqrt_a_bending`, :func:`neuber_sqrt_a_torsion`).

    Returns
    -------
    q : float or array
        Notch sensitivity [-], 0 < q <= 1.

    Notes
    -----
    Units: r in inches with sqrt(a) in sqrt(in) (the fits' units); for SI input use
    :func:`notch_sensitivity_si`. Refuses r <= 0. The charts end at r = 0.16 in (4 mm); the text
    then says to use the q at 0.16 in. This function does not clamp: it warns above 0.16 in and
    evaluates the formula.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory): r = 0.11 in, bending, Sut = 105 kpsi, q = 0.85:

    >>> round(notch_sensitivity(0.11, 0.0582), 2)
    0.85

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-10, eq. 6-34 (number from memory).
    """
    r = _num("r", r)
    sa = _num("sqrt_a", sqrt_a)
    _check(_R_POSITIVE, r)
    _check(_R_CHART, r)
    _check(_SQRT_A_NONNEG, sa)
    return _out(1.0 / (1.0 + sa / np.sqrt(r)))


def notch_sensitivity_si(r, Sut, loading="bending"):
    r"""Notch sensitivity q of a steel from SI inputs (wrapper of the inch/kpsi fits).

    .. math::
        q = \frac{1}{1 + \sqrt a(S_{ut}) / \sqrt r}

    Parameters
    ----------
    r : float or array
        Notch root radius [m].
    Sut : float or array
        Ultimate tensile strength [Pa].
    loading : {'bending', 'axial', 'torsion'}
        'bending' and 'axial' use eq. 6-35a, 'torsion' eq. 6-35b.

    Returns
    -------
    q : float or array
        Notch sensitivity [-].

    Notes
    -----
    Converts r to inches and Sut to kpsi, then applies :func:`neuber_sqrt_a_bending` or
    :func:`neuber_sqrt_a_torsion` and :func:`notch_sensitivity` with their validity ranges
    (messages then quote Sut in kpsi and r in inches).

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory), in SI: r = 2.794 mm, Sut = 724 MPa, q = 0.85:

    >>> round(notch_sensitivity_si(0.11 * 0.0254, 105e3 * 6894.757293168361), 2)
    0.85

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-10, eqs. 6-34 and 6-35.
    """
    loading = _choice("loading", loading, LOAD_FACTORS)
    S = _num("Sut", Sut)
    _check(_SUT_POSITIVE, S)
    r_in = _num("r", r) / _INCH
    fit = neuber_sqrt_a_torsion if loading == "torsion" else neuber_sqrt_a_bending
    return notch_sensitivity(r_in, fit(S / _KPSI))


def fatigue_kf(Kt, q):
    r"""Fatigue stress-concentration factor from the theoretical factor and the notch sensitivity.

    .. math::
        K_f = 1 + q\,(K_t - 1)

    Parameters
    ----------
    Kt : float or array
        Theoretical (geometric) stress-concentration factor [-], >= 1 (Kts for torsion).
    q : float or array
        Notch sensitivity [-], 0..1 (q_shear for torsion).

    Returns
    -------
    Kf : float or array
        Fatigue stress-concentration factor [-] (Kfs for torsion).

    Notes
    -----
    Refuses Kt < 1 and q outside [0, 1].

    Examples
    --------
    Shigley 9th ed., Example 7-1: Kt = 1.68, q = 0.85 (from memory) give the printed Kf = 1.58:

    >>> round(fatigue_kf(1.68, 0.85), 2)
    1.58

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-10, eqs. 6-32 and 6-33 (numbers from memory).
    """
    Kt, q = _num("Kt", Kt), _num("q", q)
    _check(_KT_RANGE, Kt)
    _check(_Q_RANGE, q)
    return _out(1.0 + q * (Kt - 1.0))


# --- fatigue criteria on von Mises stresses -----------------------------------------------------
def _stresses(sa, sm):
    sa, sm = _num("sa", sa), _num("sm", sm)
    _check(_SA_NONNEG, sa)
    _check(_SM_NONNEG, sm)
    return sa, sm


def _strength(v: Validity, name: str, value) -> np.ndarray:
    a = _num(name, value)
    _check(v, a)
    return a


def _inv(x):
    """1/x for x >= 0, with 1/0 = inf (zero stress: no failure)."""
    return _out(_inv_raw(x))


def _inv_raw(x):
    x = np.asarray(x, dtype=float)
    return np.where(x > 0, 1.0 / np.where(x > 0, x, 1.0), np.inf)


def goodman_factor(sa, sm, Se, Sut):
    r"""Fatigue factor of safety, modified-Goodman line, on von Mises stresses.

    .. math::
        \frac{1}{n} = \frac{\sigma_a'}{S_e} + \frac{\sigma_m'}{S_{ut}}

    Parameters
    ----------
    sa, sm : float or array
        Von Mises alternating and mean stresses [Pa], >= 0 (nominal times Kf, or FE local).
    Se : float or array
        Endurance limit at the location [Pa].
    Sut : float or array
        Ultimate tensile strength [Pa].

    Returns
    -------
    n : float or array
        Factor of safety [-] on proportional growth of both stresses; ``inf`` at zero stress.

    Notes
    -----
    Infinite life, ductile steel, non-negative mean stress. Goodman does not guard against yield:
    check first-cycle yield separately (:func:`langer_factor`, :func:`de_first_cycle_yield`).

    Examples
    --------
    Shigley 9th ed., Example 7-1: sigma_a' = 15 235 psi, sigma_m' = 9 988 psi (from memory),
    Se = 29.3, Sut = 105 kpsi give the printed n = 1.63:

    >>> round(goodman_factor(15235.0, 9988.0, 29.3e3, 105e3), 2)
    1.63

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-12, eq. 6-46 (number from memory); Sec. 7-4, eq. 7-7.
    """
    sa, sm = _stresses(sa, sm)
    Se = _strength(_SE_POSITIVE, "Se", Se)
    Sut = _strength(_SUT_PA_POSITIVE, "Sut", Sut)
    return _inv(sa / Se + sm / Sut)


def gerber_factor(sa, sm, Se, Sut):
    r"""Fatigue factor of safety, Gerber parabola, on von Mises stresses.

    Solves :math:`n\sigma_a'/S_e + (n\sigma_m'/S_{ut})^2 = 1` for n:

    .. math::
        n = \frac{1}{2}\left(\frac{S_{ut}}{\sigma_m'}\right)^2\frac{\sigma_a'}{S_e}
            \left[-1 + \sqrt{1 + \left(\frac{2\sigma_m' S_e}{S_{ut}\sigma_a'}\right)^2}\right]
          = \frac{2 S_e}{\sigma_a' + \sqrt{\sigma_a'^2 + (2\sigma_m' S_e/S_{ut})^2}}

    (the second form is the same number, finite at sigma_m' = 0 and at sigma_a' = 0).

    Parameters
    ----------
    sa, sm : float or array
        Von Mises alternating and mean stresses [Pa], >= 0.
    Se : float or array
        Endurance limit at the location [Pa].
    Sut : float or array
        Ultimate tensile strength [Pa].

    Returns
    -------
    n : float or array
        Factor of safety [-]; ``inf`` at zero stress.

    Notes
    -----
    Infinite life, ductile steel, non-negative mean stress; no guard against yield.

    Examples
    --------
    Shigley 9th ed., Example 7-1 inputs (sigma_a' = 15 235 psi, sigma_m' = 9 988 psi from memory,
    Se = 29.3, Sut = 105 kpsi): the computation gives 1.86 (1.863); the book prints 1.87.

    >>> round(gerber_factor(15235.0, 9988.0, 29.3e3, 105e3), 2)
    1.86

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-12, eq. 6-47 and Table 6-7 (numbers from memory); eq. 7-9.
    """
    sa, sm = _stresses(sa, sm)
    Se = _strength(_SE_POSITIVE, "Se", Se)
    Sut = _strength(_SUT_PA_POSITIVE, "Sut", Sut)
    return _inv((sa + np.sqrt(sa**2 + (2.0 * sm * Se / Sut) ** 2)) / (2.0 * Se))


def asme_elliptic_factor(sa, sm, Se, Sy):
    r"""Fatigue factor of safety, ASME-elliptic line, on von Mises stresses.

    .. math::
        \frac{1}{n} = \sqrt{\left(\frac{\sigma_a'}{S_e}\right)^2
                            + \left(\frac{\sigma_m'}{S_y}\right)^2}

    Parameters
    ----------
    sa, sm : float or array
        Von Mises alternating and mean stresses [Pa], >= 0.
    Se : float or array
        Endurance limit at the location [Pa].
    Sy : float or array
        Yield strength [Pa].

    Returns
    -------
    n : float or array
        Factor of safety [-]; ``inf`` at zero stress.

    Notes
    -----
    Infinite life, ductile steel, non-negative mean stress. Uses Sy, so it reaches the yield
    strength on the mean axis; still check first-cycle yield.

    Examples
    --------
    Shigley 9th ed., Example 7-1 inputs (stresses from memory, Se = 29.3, Sy = 82 kpsi): the
    computation gives 1.87 (1.872); the book prints 1.88.

    >>> round(asme_elliptic_factor(15235.0, 9988.0, 29.3e3, 82e3), 2)
    1.87

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-12, eq. 6-48 and Table 6-8 (numbers from memory); eq. 7-11.
    """
    sa, sm = _stresses(sa, sm)
    Se = _strength(_SE_POSITIVE, "Se", Se)
    Sy = _strength(_SY_POSITIVE, "Sy", Sy)
    return _inv(np.hypot(sa / Se, sm / Sy))


def soderberg_factor(sa, sm, Se, Sy):
    r"""Fatigue factor of safety, Soderberg line, on von Mises stresses.

    .. math::
        \frac{1}{n} = \frac{\sigma_a'}{S_e} + \frac{\sigma_m'}{S_y}

    Parameters
    ----------
    sa, sm : float or array
        Von Mises alternating and mean stresses [Pa], >= 0.
    Se : float or array
        Endurance limit at the location [Pa].
    Sy : float or array
        Yield strength [Pa].

    Returns
    -------
    n : float or array
        Factor of safety [-]; ``inf`` at zero stress.

    Notes
    -----
    Infinite life, non-negative mean stress; the most conservative of the four lines, and it
    guards against yield.

    Examples
    --------
    Shigley 9th ed., Example 7-1 inputs (stresses from memory, Se = 29.3, Sy = 82 kpsi) give the
    printed n = 1.56:

    >>> round(soderberg_factor(15235.0, 9988.0, 29.3e3, 82e3), 2)
    1.56

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-12, eq. 6-45 (number from memory); Sec. 7-4, eq. 7-13.
    """
    sa, sm = _stresses(sa, sm)
    Se = _strength(_SE_POSITIVE, "Se", Se)
    Sy = _strength(_SY_POSITIVE, "Sy", Sy)
    return _inv(sa / Se + sm / Sy)


def langer_factor(sa, sm, Sy):
    r"""First-cycle yield factor of safety, Langer line, on von Mises stresses.

    .. math::
        n_y = \frac{S_y}{\sigma_a' + \sigma_m'}

    Parameters
    ----------
    sa, sm : float or array
        Von Mises alternating and mean stresses [Pa], >= 0.
    Sy : float or array
        Yield strength [Pa].

    Returns
    -------
    ny : float or array
        Yield factor of safety [-]; ``inf`` at zero stress.

    Notes
    -----
    Since :math:`\sigma_a' + \sigma_m' \ge \sigma'_{max}` (triangle inequality on the von Mises
    norm), this is never larger than the von Mises first-cycle yield factor of eq. 7-16: a quick,
    conservative check.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory, stresses and result): Sy = 82 kpsi, ny = 3.25:

    >>> round(langer_factor(15235.0, 9988.0, 82e3), 2)
    3.25

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 6-12, eq. 6-49 (number from memory); Sec. 7-4 after eq. 7-16.
    """
    sa, sm = _stresses(sa, sm)
    Sy = _strength(_SY_POSITIVE, "Sy", Sy)
    return _out(Sy * _inv_raw(sa + sm))


# --- shaft (d-based) criteria -------------------------------------------------------------------
def shaft_von_mises_stresses(d, Kf, Kfs, Ma, Mm, Ta, Tm):
    r"""Von Mises alternating and mean stresses of a solid round shaft in bending and torsion.

    .. math::
        \sigma_a' = \left[\left(\frac{32K_fM_a}{\pi d^3}\right)^2
                    + 3\left(\frac{16K_{fs}T_a}{\pi d^3}\right)^2\right]^{1/2},\qquad
        \sigma_m' = \left[\left(\frac{32K_fM_m}{\pi d^3}\right)^2
                    + 3\left(\frac{16K_{fs}T_m}{\pi d^3}\right)^2\right]^{1/2}

    Parameters
    ----------
    d : float or array
        Shaft diameter at the notch [m].
    Kf, Kfs : float or array
        Fatigue stress-concentration factors in bending and torsion [-], >= 1.
    Ma, Mm : float or array
        Alternating and mean bending moments [N*m].
    Ta, Tm : float or array
        Alternating and mean torques [N*m].

    Returns
    -------
    (sa, sm) : tuple of float or array
        Von Mises alternating and mean stresses [Pa].

    Notes
    -----
    Solid round shaft, no axial load; the same Kf on alternating and mean stress (no local
    yielding at the notch - see Sec. 7-4 of the text for when Kfm differs).

    Examples
    --------
    Shigley 9th ed., Example 7-1 data (Kf = 1.58, Kfs = 1.37, Ma = 1260 lbf*in, Tm = 1100 lbf*in,
    d = 1.1 in): 15 235 and 9 988 psi (these two from memory):

    >>> sa, sm = shaft_von_mises_stresses(1.1, 1.58, 1.37, 1260.0, 0.0, 0.0, 1100.0)
    >>> round(sa), round(sm)
    (15235, 9988)

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 7-4, eqs. 7-5 and 7-6.
    """
    d = _num("d", d)
    _check(_D_POSITIVE, d)
    Kf, Kfs = _num("Kf", Kf), _num("Kfs", Kfs)
    _check(_KF_RANGE, Kf)
    _check(_KFS_RANGE, Kfs)
    Ma, Mm, Ta, Tm = (_num(n, v) for n, v in (("Ma", Ma), ("Mm", Mm), ("Ta", Ta), ("Tm", Tm)))
    shear = 16.0 * Kfs / (math.pi * d**3)   # torsional shear per unit torque, Kfs included
    sa = stress.von_mises_sigma_tau(stress.bending_stress_round(Kf * Ma, d), shear * Ta)
    sm = stress.von_mises_sigma_tau(stress.bending_stress_round(Kf * Mm, d), shear * Tm)
    return sa, sm


def de_goodman(d, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sut):
    r"""Shaft fatigue factor of safety, DE-Goodman.

    .. math::
        \frac{1}{n} = \frac{16}{\pi d^3}\left\{\frac{[4(K_fM_a)^2 + 3(K_{fs}T_a)^2]^{1/2}}{S_e}
            + \frac{[4(K_fM_m)^2 + 3(K_{fs}T_m)^2]^{1/2}}{S_{ut}}\right\}

    Parameters
    ----------
    d : float or array
        Shaft diameter at the notch [m].
    Kf, Kfs : float or array
        Fatigue stress-concentration factors, bending and torsion [-].
    Ma, Mm, Ta, Tm : float or array
        Alternating and mean bending moments and torques [N*m].
    Se, Sut : float or array
        Endurance limit at the location and ultimate tensile strength [Pa].

    Returns
    -------
    n : float or array
        Factor of safety [-].

    Notes
    -----
    :func:`shaft_von_mises_stresses` then :func:`goodman_factor`. Any consistent unit set works
    (in, lbf*in, psi).

    Examples
    --------
    Shigley 9th ed., Example 7-1 (p. 371): n = 1.63

    >>> round(de_goodman(1.1, 1.58, 1.37, 1260.0, 0.0, 0.0, 1100.0, 29.3e3, 105e3), 2)
    1.63

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 7-4, eq. 7-7; Example 7-1.
    """
    return goodman_factor(*shaft_von_mises_stresses(d, Kf, Kfs, Ma, Mm, Ta, Tm), Se, Sut)


def de_gerber(d, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sut):
    r"""Shaft fatigue factor of safety, DE-Gerber.

    .. math::
        \frac{1}{n} = \frac{8A}{\pi d^3 S_e}\left\{1 + \left[1 + \left(\frac{2BS_e}{AS_{ut}}
                      \right)^2\right]^{1/2}\right\},\quad
        A = \sqrt{4(K_fM_a)^2 + 3(K_{fs}T_a)^2},\; B = \sqrt{4(K_fM_m)^2 + 3(K_{fs}T_m)^2}

    Parameters
    ----------
    d : float or array
        Shaft diameter at the notch [m].
    Kf, Kfs : float or array
        Fatigue stress-concentration factors, bending and torsion [-].
    Ma, Mm, Ta, Tm : float or array
        Alternating and mean bending moments and torques [N*m].
    Se, Sut : float or array
        Endurance limit at the location and ultimate tensile strength [Pa].

    Returns
    -------
    n : float or array
        Factor of safety [-].

    Notes
    -----
    :func:`shaft_von_mises_stresses` then :func:`gerber_factor` (the same equation).

    Examples
    --------
    Shigley 9th ed., Example 7-1 inputs: the computation gives 1.86 (1.863), the book prints
    1.87 (a difference in the last printed digit that the printed, rounded inputs do not explain).

    >>> round(de_gerber(1.1, 1.58, 1.37, 1260.0, 0.0, 0.0, 1100.0, 29.3e3, 105e3), 2)
    1.86

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 7-4, eq. 7-9; Example 7-1.
    """
    return gerber_factor(*shaft_von_mises_stresses(d, Kf, Kfs, Ma, Mm, Ta, Tm), Se, Sut)


def de_asme_elliptic(d, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sy):
    r"""Shaft fatigue factor of safety, DE-ASME elliptic.

    .. math::
        \frac{1}{n} = \frac{16}{\pi d^3}\left[4\left(\frac{K_fM_a}{S_e}\right)^2
            + 3\left(\frac{K_{fs}T_a}{S_e}\right)^2 + 4\left(\frac{K_fM_m}{S_y}\right)^2
            + 3\left(\frac{K_{fs}T_m}{S_y}\right)^2\right]^{1/2}

    Parameters
    ----------
    d : float or array
        Shaft diameter at the notch [m].
    Kf, Kfs : float or array
        Fatigue stress-concentration factors, bending and torsion [-].
    Ma, Mm, Ta, Tm : float or array
        Alternating and mean bending moments and torques [N*m].
    Se, Sy : float or array
        Endurance limit at the location and yield strength [Pa].

    Returns
    -------
    n : float or array
        Factor of safety [-].

    Notes
    -----
    :func:`shaft_von_mises_stresses` then :func:`asme_elliptic_factor`.

    Examples
    --------
    Shigley 9th ed., Example 7-1 inputs: the computation gives 1.87 (1.872), the book prints
    1.88 (last-digit difference, as for DE-Gerber).

    >>> round(de_asme_elliptic(1.1, 1.58, 1.37, 1260.0, 0.0, 0.0, 1100.0, 29.3e3, 82e3), 2)
    1.87

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 7-4, eq. 7-11; Example 7-1.
    """
    return asme_elliptic_factor(*shaft_von_mises_stresses(d, Kf, Kfs, Ma, Mm, Ta, Tm), Se, Sy)


def de_soderberg(d, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sy):
    r"""Shaft fatigue factor of safety, DE-Soderberg.

    .. math::
        \frac{1}{n} = \frac{16}{\pi d^3}\left\{\frac{[4(K_fM_a)^2 + 3(K_{fs}T_a)^2]^{1/2}}{S_e}
            + \frac{[4(K_fM_m)^2 + 3(K_{fs}T_m)^2]^{1/2}}{S_y}\right\}

    Parameters
    ----------
    d : float or array
        Shaft diameter at the notch [m].
    Kf, Kfs : float or array
        Fatigue stress-concentration factors, bending and torsion [-].
    Ma, Mm, Ta, Tm : float or array
        Alternating and mean bending moments and torques [N*m].
    Se, Sy : float or array
        Endurance limit at the location and yield strength [Pa].

    Returns
    -------
    n : float or array
        Factor of safety [-].

    Notes
    -----
    :func:`shaft_von_mises_stresses` then :func:`soderberg_factor`.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (p. 371): n = 1.56

    >>> round(de_soderberg(1.1, 1.58, 1.37, 1260.0, 0.0, 0.0, 1100.0, 29.3e3, 82e3), 2)
    1.56

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 7-4, eq. 7-13; Example 7-1.
    """
    return soderberg_factor(*shaft_von_mises_stresses(d, Kf, Kfs, Ma, Mm, Ta, Tm), Se, Sy)


def de_first_cycle_yield(d, Kf, Kfs, Ma, Mm, Ta, Tm, Sy):
    r"""Shaft first-cycle yield factor of safety on the von Mises maximum stress.

    .. math::
        \sigma'_{max} = \left[\left(\frac{32K_f(M_m+M_a)}{\pi d^3}\right)^2
            + 3\left(\frac{16K_{fs}(T_m+T_a)}{\pi d^3}\right)^2\right]^{1/2},\qquad
        n_y = \frac{S_y}{\sigma'_{max}}

    Parameters
    ----------
    d : float or array
        Shaft diameter at the notch [m].
    Kf, Kfs : float or array
        Fatigue stress-concentration factors, bending and torsion [-].
    Ma, Mm, Ta, Tm : float or array
        Alternating and mean bending moments and torques [N*m].
    Sy : float or array
        Yield strength [Pa].

    Returns
    -------
    ny : float or array
        Yield factor of safety [-].

    Notes
    -----
    Peak of the stress cycle, with Kf and Kfs as the text does (conservative). Calls
    :func:`classic.stress.von_mises_sigma_tau` and :func:`classic.stress.yield_factor_von_mises`.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (p. 371): ny = 4.50

    >>> round(de_first_cycle_yield(1.1, 1.58, 1.37, 1260.0, 0.0, 0.0, 1100.0, 82e3), 2)
    4.5

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 7-4, eqs. 7-15 and 7-16; Example 7-1.
    """
    d = _num("d", d)
    _check(_D_POSITIVE, d)
    Kf, Kfs = _num("Kf", Kf), _num("Kfs", Kfs)
    _check(_KF_RANGE, Kf)
    _check(_KFS_RANGE, Kfs)
    Ma, Mm, Ta, Tm = (_num(n, v) for n, v in (("Ma", Ma), ("Mm", Mm), ("Ta", Ta), ("Tm", Tm)))
    sigma = stress.bending_stress_round(Kf * (Mm + Ma), d)
    tau = 16.0 * Kfs * (Tm + Ta) / (math.pi * d**3)
    return stress.yield_factor_von_mises(Sy, stress.von_mises_sigma_tau(sigma, tau))


def de_langer(d, Kf, Kfs, Ma, Mm, Ta, Tm, Sy):
    r"""Shaft first-cycle yield factor of safety, Langer line (quick conservative check).

    .. math::
        n_y = \frac{S_y}{\sigma_a' + \sigma_m'}

    with :math:`\sigma_a', \sigma_m'` of eqs. 7-5 and 7-6.

    Parameters
    ----------
    d : float or array
        Shaft diameter at the notch [m].
    Kf, Kfs : float or array
        Fatigue stress-concentration factors, bending and torsion [-].
    Ma, Mm, Ta, Tm : float or array
        Alternating and mean bending moments and torques [N*m].
    Sy : float or array
        Yield strength [Pa].

    Returns
    -------
    ny : float or array
        Yield factor of safety [-], never above :func:`de_first_cycle_yield`.

    Notes
    -----
    :func:`shaft_von_mises_stresses` then :func:`langer_factor`.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory): ny = 3.25

    >>> round(de_langer(1.1, 1.58, 1.37, 1260.0, 0.0, 0.0, 1100.0, 82e3), 2)
    3.25

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 7-4 (after eq. 7-16); Sec. 6-12, eq. 6-49 (number from memory).
    """
    return langer_factor(*shaft_von_mises_stresses(d, Kf, Kfs, Ma, Mm, Ta, Tm), Sy)

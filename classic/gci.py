"""Discretisation-error estimates from a grid-refinement study: observed order, Richardson
extrapolation and Roache's Grid Convergence Index (GCI).

Notation: f1 on the finest grid, f2 on the middle one, f3 on the coarsest; r21 = h2/h1 and
r32 = h3/h2 the refinement ratios of representative cell sizes (> 1). GCIs are relative, as
fractions (0.001 = 0.1 %). The GCI is an estimate of numerical uncertainty, not a bound; results are a
cross-check aid, and the governing codes and a licensed engineer decide.
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Optional, Sequence

from classic._validity import OutOfRangeError, Validity

__all__ = [
    "observed_order",
    "observed_order_unequal",
    "richardson_extrapolate",
    "gci",
    "asymptotic_ratio",
    "representative_ratio",
    "ConvergenceStudy",
    "convergence_study",
]

_ROACHE = "Roache, J. Fluids Eng. 116:405-413 (1994)"
_CELIK = "Celik et al., J. Fluids Eng. 130 (2008) 078001"

# --- validity ranges (data) ---------------------------------------------------------------------
_R_ABOVE_1 = Validity("r", low=1.0, strict_low=True, action="refuse",
                      source="a refinement ratio h_coarse/h_fine must exceed 1")
_R_CELIK = Validity("r", low=1.3, action="warn",
                    source=f"{_CELIK} recommends r > 1.3 (from memory)")
_R21_ABOVE_1 = Validity("r21", low=1.0, strict_low=True, action="refuse",
                        source="a refinement ratio h_coarse/h_fine must exceed 1")
_R32_ABOVE_1 = Validity("r32", low=1.0, strict_low=True, action="refuse",
                        source="a refinement ratio h_coarse/h_fine must exceed 1")
_R21_CELIK = Validity("r21", low=1.3, action="warn",
                      source=f"{_CELIK} recommends r > 1.3 (from memory)")
_R32_CELIK = Validity("r32", low=1.3, action="warn",
                      source=f"{_CELIK} recommends r > 1.3 (from memory)")
_MONOTONE = Validity("(f3-f2)/(f2-f1)", low=0.0, strict_low=True, action="refuse",
                     source="oscillatory or non-monotone sequence: no observed order")
_FS_POSITIVE = Validity("Fs", low=0.0, strict_low=True, action="refuse",
                        source="a factor of safety must be positive")
_FS_ROACHE = Validity("Fs", low=1.25, action="warn",
                      source=f"{_ROACHE}: Fs = 1.25 with three or more grids, 3 with two")
_P_POSITIVE = Validity("p", low=0.0, strict_low=True, action="refuse",
                       source="the order must be positive (a converging sequence)")
_DIM = Validity("dim", low=1.0, high=3.0, action="refuse", source="1, 2 or 3 dimensions")
_N_POSITIVE = Validity("n_coarse", low=0.0, strict_low=True, action="refuse",
                       source="a DOF or cell count must be positive")
_NF_POSITIVE = Validity("n_fine", low=0.0, strict_low=True, action="refuse",
                        source="a DOF or cell count must be positive")


def _f(name: str, x) -> float:
    try:
        v = float(x)
    except (TypeError, ValueError):
        raise OutOfRangeError(name, x, "is not a number") from None
    if math.isnan(v) or math.isinf(v):
        raise OutOfRangeError(name, x, "is not a finite number")
    return v


def _eps_ratio(f1: float, f2: float, f3: float) -> float:
    """(f3 - f2)/(f2 - f1), refusing f2 == f1 and non-positive ratios."""
    e21, e32 = f2 - f1, f3 - f2
    if e21 == 0.0:
        raise OutOfRangeError("f2 - f1", e21, "no change between the two finest grids: "
                              "no observed order")
    return _MONOTONE.check(e32 / e21)


def observed_order(f1, f2, f3, r):
    r"""Observed order of accuracy from three grids with a constant refinement ratio.

    .. math::
        p = \frac{\ln\left[(f_3 - f_2)/(f_2 - f_1)\right]}{\ln r}

    Parameters
    ----------
    f1, f2, f3 : float
        Solution functional on the fine, medium and coarse grids [any unit].
    r : float
        Refinement ratio h2/h1 = h3/h2 [-], > 1.

    Returns
    -------
    p : float
        Observed order [-]; negative if the differences grow with refinement (divergence).

    Notes
    -----
    Refuses r <= 1, f2 == f1, and (f3 - f2)/(f2 - f1) <= 0 (oscillatory or stalled sequences have
    no order; :func:`convergence_study` flags them instead). Warns for r < 1.3. The order is
    meaningful only in the asymptotic range (see :func:`asymptotic_ratio`).

    Examples
    --------
    NPARC Alliance spatial-convergence example: p = 1.786

    >>> round(observed_order(0.97050, 0.96854, 0.96178, 2.0), 3)
    1.786

    References
    ----------
    .. [1] Roache, P. J., "Perspective: A Method for Uniform Reporting of Grid Refinement
       Studies", J. Fluids Eng. 116:405-413, 1994.
    .. [2] NPARC Alliance, CFD verification and validation, "Examining spatial (grid)
       convergence" (NASA Glenn Research Center), worked example.
    """
    f1, f2, f3, r = (_f(n, v) for n, v in (("f1", f1), ("f2", f2), ("f3", f3), ("r", r)))
    _R_ABOVE_1.check(r)
    _R_CELIK.check(r)
    return math.log(_eps_ratio(f1, f2, f3)) / math.log(r)


def _q(p: float, r21: float, r32: float) -> float:
    """Celik's q(p) = ln[(r21^p - 1)/(r32^p - 1)] for s = +1; its limit at p = 0."""
    if abs(p) < 1e-12:
        return math.log(math.log(r21) / math.log(r32))
    return math.log((r21**p - 1.0) / (r32**p - 1.0))


def observed_order_unequal(f1, f2, f3, r21, r32, tol=1e-12, maxiter=500):
    r"""Observed order from three grids with unequal refinement ratios (fixed-point iteration).

    .. math::
        p = \frac{1}{\ln r_{21}}\left[\ln\left|\frac{\varepsilon_{32}}{\varepsilon_{21}}\right|
            + q(p)\right],\quad
        q(p) = \ln\frac{r_{21}^p - s}{r_{32}^p - s},\quad
        s = \operatorname{sign}\frac{\varepsilon_{32}}{\varepsilon_{21}},\quad
        \varepsilon_{21} = f_2 - f_1,\; \varepsilon_{32} = f_3 - f_2

    iterated from the q = 0 value until the change in p is below ``tol``.

    Parameters
    ----------
    f1, f2, f3 : float
        Solution functional on the fine, medium and coarse grids [any unit].
    r21, r32 : float
        Refinement ratios h2/h1 and h3/h2 [-], > 1.
    tol : float, optional
        Convergence tolerance on p (relative to max(1, |p|)).
    maxiter : int, optional
        Iteration limit; the iteration is refused if it has not converged by then.

    Returns
    -------
    p : float
        Observed order [-].

    Notes
    -----
    Only monotone sequences (s = +1) are accepted; (f3 - f2)/(f2 - f1) <= 0 is refused (Celik et
    al. carry s = -1 through the formula; here an oscillatory sequence gets no order). One
    deliberate difference from the published eq.: its outer absolute value is not taken, so a
    monotone but diverging sequence gives p < 0 instead of a spurious positive order; for
    converging sequences the two agree. With r21 = r32 it reduces to :func:`observed_order`.
    Warns for r < 1.3.

    Examples
    --------
    Equal ratios reproduce the NPARC example value p = 1.786:

    >>> round(observed_order_unequal(0.97050, 0.96854, 0.96178, 2.0, 2.0), 3)
    1.786

    References
    ----------
    .. [1] Celik, I. B., Ghia, U., Roache, P. J., Freitas, C. J., Coleman, H., Raad, P. E.,
       "Procedure for Estimation and Reporting of Uncertainty Due to Discretization in CFD
       Applications", J. Fluids Eng. 130(7):078001, 2008, eqs. 3-5 (from memory).
    """
    f1, f2, f3 = _f("f1", f1), _f("f2", f2), _f("f3", f3)
    r21, r32 = _f("r21", r21), _f("r32", r32)
    _R21_ABOVE_1.check(r21)
    _R32_ABOVE_1.check(r32)
    _R21_CELIK.check(r21)
    _R32_CELIK.check(r32)
    L = math.log(_eps_ratio(f1, f2, f3))
    lr = math.log(r21)
    p = L / lr
    for _ in range(int(maxiter)):
        try:
            p_new = (L + _q(p, r21, r32)) / lr
        except (ValueError, OverflowError, ZeroDivisionError):
            break
        if abs(p_new - p) <= tol * max(1.0, abs(p)):
            return p_new
        p = p_new
    raise OutOfRangeError("p", p, f"fixed-point iteration of {_CELIK} did not converge")


def richardson_extrapolate(f1, f2, r, p):
    r"""Richardson extrapolation of the two finest-grid values to zero cell size.

    .. math::
        f_{ext} = f_1 + \frac{f_1 - f_2}{r^p - 1} = \frac{r^p f_1 - f_2}{r^p - 1}

    Parameters
    ----------
    f1, f2 : float
        Fine- and medium-grid values [any unit].
    r : float
        Refinement ratio h2/h1 [-], > 1.
    p : float
        Order of accuracy [-], > 0 (observed, or formal).

    Returns
    -------
    f_ext : float
        Extrapolated value [unit of f].

    Notes
    -----
    Valid in the asymptotic range, where the error is :math:`C h^p`.

    Examples
    --------
    NPARC Alliance spatial-convergence example: f_ext = 0.971300

    >>> round(richardson_extrapolate(0.97050, 0.96854, 2.0, 1.786), 6)
    0.9713

    References
    ----------
    .. [1] Roache, P. J., J. Fluids Eng. 116:405-413, 1994.
    .. [2] Celik, I. B., et al., J. Fluids Eng. 130(7):078001, 2008, eq. 6.
    """
    f1, f2, r, p = (_f(n, v) for n, v in (("f1", f1), ("f2", f2), ("r", r), ("p", p)))
    _R_ABOVE_1.check(r)
    _P_POSITIVE.check(p)
    return f1 + (f1 - f2) / (r**p - 1.0)


def gci(f1, f2, r, p, Fs=1.25):
    r"""Grid Convergence Index of the finer of two grids, relative (a fraction).

    .. math::
        \mathrm{GCI} = \frac{F_s\,|\varepsilon|}{r^p - 1},\qquad
        \varepsilon = \frac{f_2 - f_1}{f_1}

    Parameters
    ----------
    f1, f2 : float
        Finer- and coarser-grid values [any unit]; f1 != 0.
    r : float
        Refinement ratio h2/h1 [-], > 1.
    p : float
        Order of accuracy [-], > 0.
    Fs : float, optional
        Factor of safety [-]: 1.25 when p comes from three or more grids, 3 with two grids.

    Returns
    -------
    gci : float
        Relative uncertainty estimate of f1 [-], as a fraction (0.001 = 0.1 %).

    Notes
    -----
    For the coarser pair pass (f2, f3, r32, p): the result is relative to f2. Refuses f1 = 0
    (use an absolute error then), r <= 1, p <= 0, Fs <= 0; warns for Fs < 1.25.

    Examples
    --------
    NPARC Alliance spatial-convergence example: GCI12 = 0.103 %, GCI23 = 0.356 %

    >>> round(100 * gci(0.97050, 0.96854, 2.0, 1.786), 3)
    0.103
    >>> round(100 * gci(0.96854, 0.96178, 2.0, 1.786), 3)
    0.356

    References
    ----------
    .. [1] Roache, P. J., J. Fluids Eng. 116:405-413, 1994.
    .. [2] Celik, I. B., et al., J. Fluids Eng. 130(7):078001, 2008, eq. 7.
    """
    f1, f2, r, p, Fs = (_f(n, v) for n, v in
                        (("f1", f1), ("f2", f2), ("r", r), ("p", p), ("Fs", Fs)))
    if f1 == 0.0:
        raise OutOfRangeError("f1", f1, "a relative GCI needs f1 != 0")
    _R_ABOVE_1.check(r)
    _P_POSITIVE.check(p)
    _FS_POSITIVE.check(Fs)
    _FS_ROACHE.check(Fs)
    return Fs * abs((f2 - f1) / f1) / (r**p - 1.0)


def asymptotic_ratio(gci12, gci23, r, p):
    r"""Check that a three-grid study is in the asymptotic range; about 1 if it is.

    .. math::
        \frac{\mathrm{GCI}_{23}}{r^p\,\mathrm{GCI}_{12}}

    Parameters
    ----------
    gci12, gci23 : float
        GCI of the fine pair and of the coarse pair [-] (same convention, relative).
    r : float
        Refinement ratio of the fine pair, h2/h1 [-].
    p : float
        Order of accuracy [-].

    Returns
    -------
    ratio : float
        [-]; near 1 in the asymptotic range.

    Notes
    -----
    With relative GCIs and the observed p of the same three values the ratio is exactly f1/f2
    (the relative errors are normalised by different values). For unequal ratios pass r = r21:
    with f = f0 + C h^p, GCI23/GCI12 = r21^p f1/f2.

    Examples
    --------
    NPARC Alliance spatial-convergence example (GCI12 = 0.103 %, GCI23 = 0.356 %, p = 1.786):
    this form gives 1.002. The example prints 0.998, which is the reciprocal
    r^p GCI12 / GCI23 to the printed digits; both say "asymptotic".

    >>> round(asymptotic_ratio(0.0010308, 0.0035625, 2.0, 1.786), 3)
    1.002

    References
    ----------
    .. [1] Roache, P. J., J. Fluids Eng. 116:405-413, 1994.
    .. [2] NPARC Alliance, "Examining spatial (grid) convergence", worked example.
    """
    g12, g23, r, p = (_f(n, v) for n, v in (("gci12", gci12), ("gci23", gci23), ("r", r),
                                            ("p", p)))
    if g12 <= 0.0:
        raise OutOfRangeError("gci12", gci12, "must be positive")
    _R_ABOVE_1.check(r)
    return g23 / (r**p * g12)


def representative_ratio(n_fine, n_coarse, dim=2):
    r"""Refinement ratio of representative cell sizes from DOF (or cell) counts.

    .. math::
        r = \frac{h_{coarse}}{h_{fine}} = \left(\frac{N_{fine}}{N_{coarse}}\right)^{1/D}

    with D = 2 for a cross-section mesh.

    Parameters
    ----------
    n_fine, n_coarse : float
        Degrees of freedom (or cells) of the finer and coarser mesh [-].
    dim : int, optional
        Spatial dimension D [-], default 2.

    Returns
    -------
    r : float
        Refinement ratio [-].

    Notes
    -----
    Assumes the same element type and a roughly uniform refinement, h ~ (area/N)^(1/2) in 2-D
    (Celik et al. 2008, eq. 1 for the representative size; from memory).

    Examples
    --------
    Halving the mesh size in 2-D multiplies the DOF count by about 4, r = 2:

    >>> representative_ratio(40000, 10000)
    2.0

    References
    ----------
    .. [1] Celik, I. B., et al., J. Fluids Eng. 130(7):078001, 2008, eqs. 1-2.
    """
    nf, nc, D = _f("n_fine", n_fine), _f("n_coarse", n_coarse), _f("dim", dim)
    _NF_POSITIVE.check(nf)
    _N_POSITIVE.check(nc)
    _DIM.check(D)
    if D != int(D):
        raise OutOfRangeError("dim", dim, "must be 1, 2 or 3")
    return (nf / nc) ** (1.0 / D)


@dataclass(frozen=True)
class ConvergenceStudy:
    """Result of :func:`convergence_study`. Fields that cannot be computed are ``None``.

    Attributes
    ----------
    values : tuple of float
        f1, f2, f3 (fine to coarse).
    r21, r32 : float
        Refinement ratios.
    order : float or None
        Observed order p.
    extrapolated : float or None
        Richardson-extrapolated value.
    gci_fine : float or None
        GCI of f1 (fine pair), fraction.
    gci_coarse : float or None
        GCI of f2 (coarse pair), fraction.
    asymptotic_ratio : float or None
        GCI23 / (r21^p GCI12); about 1 in the asymptotic range.
    monotone : bool
        True when (f3 - f2)/(f2 - f1) > 0.
    status : str
        'monotone convergence', 'monotone divergence', 'oscillatory', 'non-monotone',
        'no change between the finest grids' or 'order iteration did not converge'.
    """

    values: tuple
    r21: float
    r32: float
    order: Optional[float]
    extrapolated: Optional[float]
    gci_fine: Optional[float]
    gci_coarse: Optional[float]
    asymptotic_ratio: Optional[float]
    monotone: bool
    status: str


def convergence_study(values_fine_to_coarse: Sequence[float], ratios, Fs=1.25):
    r"""Three-grid study: observed order, extrapolation, GCIs and the asymptotic check.

    .. math::
        p:\ \text{observed order};\quad
        f_{ext} = f_1 + \frac{f_1 - f_2}{r_{21}^p - 1};\quad
        \mathrm{GCI}_{12} = \frac{F_s|(f_2-f_1)/f_1|}{r_{21}^p - 1},\;
        \mathrm{GCI}_{23} = \frac{F_s|(f_3-f_2)/f_2|}{r_{32}^p - 1}

    Parameters
    ----------
    values_fine_to_coarse : sequence of 3 floats
        f1, f2, f3 [any unit].
    ratios : float or (float, float)
        One refinement ratio r, or (r21, r32) [-].
    Fs : float, optional
        GCI factor of safety [-], default 1.25 (three grids).

    Returns
    -------
    ConvergenceStudy
        See its attributes. Non-monotone sequences are flagged, not forced: when
        (f3 - f2)/(f2 - f1) <= 0 the status is 'oscillatory' (< 0) or 'non-monotone' (= 0),
        ``monotone`` is False and order, extrapolation and GCIs are None. A monotone diverging
        sequence (p <= 0) keeps its order but gets no extrapolation or GCI.

    Notes
    -----
    Equal ratios use :func:`observed_order`, unequal ones :func:`observed_order_unequal`.

    Examples
    --------
    NPARC Alliance spatial-convergence example:

    >>> s = convergence_study([0.97050, 0.96854, 0.96178], 2.0)
    >>> round(s.order, 3), round(s.extrapolated, 6), round(100 * s.gci_fine, 3), s.monotone
    (1.786, 0.9713, 0.103, True)

    References
    ----------
    .. [1] Roache, P. J., J. Fluids Eng. 116:405-413, 1994.
    .. [2] Celik, I. B., et al., J. Fluids Eng. 130(7):078001, 2008.
    """
    try:
        vals = tuple(_f(f"values_fine_to_coarse[{i}]", v)
                     for i, v in enumerate(values_fine_to_coarse))
    except TypeError:
        raise OutOfRangeError("values_fine_to_coarse", values_fine_to_coarse,
                              "must be a sequence of three numbers") from None
    if len(vals) != 3:
        raise OutOfRangeError("values_fine_to_coarse", values_fine_to_coarse,
                              f"needs exactly three values (fine to coarse), got {len(vals)}")
    if isinstance(ratios, (list, tuple)) or getattr(ratios, "ndim", 0) == 1:
        if len(ratios) != 2:
            raise OutOfRangeError("ratios", ratios, "give one ratio or (r21, r32)")
        r21, r32 = _f("r21", ratios[0]), _f("r32", ratios[1])
    else:
        r21 = r32 = _f("ratios", ratios)
    _R21_ABOVE_1.check(r21)
    _R32_ABOVE_1.check(r32)
    f1, f2, f3 = vals

    def result(status, monotone, p=None, fext=None, g12=None, g23=None, ar=None):
        return ConvergenceStudy(vals, r21, r32, p, fext, g12, g23, ar, monotone, status)

    e21, e32 = f2 - f1, f3 - f2
    if e21 == 0.0:
        return result("no change between the finest grids", False)
    ratio = e32 / e21
    if ratio < 0.0:
        return result("oscillatory", False)
    if ratio == 0.0:
        return result("non-monotone", False)
    if r21 == r32:
        p = observed_order(f1, f2, f3, r21)
    else:
        try:
            p = observed_order_unequal(f1, f2, f3, r21, r32)
        except OutOfRangeError:
            return result("order iteration did not converge", True)
    if p <= 0.0:
        return result("monotone divergence", True, p=p)
    fext = richardson_extrapolate(f1, f2, r21, p)
    g12 = gci(f1, f2, r21, p, Fs) if f1 != 0.0 else None
    g23 = gci(f2, f3, r32, p, Fs) if f2 != 0.0 else None
    ar = asymptotic_ratio(g12, g23, r21, p) if (g12 and g23 is not None) else None
    return result("monotone convergence", True, p, fext, g12, g23, ar)

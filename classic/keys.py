"""Standard key and keyway sizes by shaft diameter (shaft side), read from the data files in
``classic/data/`` that name their standard and edition.

SI in and out: the shaft diameter in metres, every returned length in metres. The tables are
held in the standards' own units (mm, inch fractions) and compared there, so a range edge such
as 22 mm or 1 1/4 in falls on the side the standard says ("over 17 up to and including 22").
Outside the tables the functions refuse (:class:`~classic._validity.OutOfRangeError`); they never
extrapolate.
"""
from __future__ import annotations

import math
import sys
from fractions import Fraction
from functools import lru_cache
from pathlib import Path

from classic._validity import OutOfRangeError, Validity, checked

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib

__all__ = ["metric_parallel_key", "inch_square_key", "chordal_height", "METRIC_FILE", "INCH_FILE"]

DATA = Path(__file__).with_name("data")
METRIC_FILE = DATA / "keys_metric.toml"
INCH_FILE = DATA / "keys_inch.toml"
MM = 1e-3
INCH = 0.0254  # exact, by definition of the international inch (1959)

D_KEY = Validity("d", 0.0, math.inf, "m", "refuse", "a shaft diameter must be positive and finite",
                 strict_low=True, strict_high=True)


@lru_cache(maxsize=None)
def _table(path: Path) -> dict:
    with open(path, "rb") as fh:
        return tomllib.load(fh)


def _pick(rows, value, unit, standard):
    """The row with ``over < value <= up_to``; refused outside the table (no extrapolation)."""
    for row in rows:
        if Fraction(str(row["over"])) < value <= Fraction(str(row["up_to"])):
            return row
    lo, hi = Fraction(str(rows[0]["over"])), Fraction(str(rows[-1]["up_to"]))
    raise OutOfRangeError("d", f"{float(value):g} {unit}",
                          f"outside the key table of {standard}, which covers shafts over {float(lo):g} up to "
                          f"{float(hi):g} {unit}; give width, depth and fillet explicitly")


def _in_units(d_m: float, unit_m: float) -> Fraction:
    """The diameter in the table's unit, rounded to 12 significant digits first so that a value typed
    as 22 mm or 1.25 in is not moved across a range edge by the conversion to metres and back."""
    x = d_m / unit_m
    return Fraction(f"{x:.12g}")


def metric_parallel_key(d: float) -> dict:
    r"""Shaft keyway of the metric parallel key for a shaft diameter.

    .. math:: (b,\ h,\ t_1,\ r_{min},\ r_{max}) = \mathrm{table}(d), \quad d_{over} < d \le d_{up\,to}

    Parameters
    ----------
    d : float
        Shaft diameter [m]

    Returns
    -------
    dict
        ``width`` (key width b) [m], ``height`` (key height h) [m], ``depth`` (shaft keyway depth t1,
        from the shaft surface on the keyway centre line) [m], ``r_min``, ``r_max`` (keyway bottom
        radius range) [m], ``over``, ``up_to`` (the table row's diameter range) [m],
        ``from_memory`` (bool: the row was not confirmed against the printed table), ``source``.

    Notes
    -----
    Valid for shafts over 6 mm up to and including 130 mm (the rows in ``data/keys_metric.toml``);
    refused outside (no extrapolation). Rows for shafts over 17 up to 58 mm are confirmed against
    the published table; the others are from memory of it and say so (``from_memory``).

    Examples
    --------
    A 30 mm shaft takes the 8 x 7 key, t1 = 4.0 mm (ISO/R773, DIN 6885-1):

    >>> k = metric_parallel_key(0.030)
    >>> round(k["width"] * 1e3, 3), round(k["depth"] * 1e3, 3), round(k["r_max"] * 1e3, 3)
    (8.0, 4.0, 0.25)
    >>> round(metric_parallel_key(0.0301)["width"] * 1e3, 3)
    10.0

    References
    ----------
    .. [1] ISO/R773:1969, Rectangular or square parallel keys and their corresponding keyways.
    .. [2] DIN 6885-1:1968-08, Passfedern, hohe Form (parallel keys, normal form), Table 1.
    """
    d = checked(D_KEY, d)
    t = _table(METRIC_FILE)
    row = _pick(t["rows"], _in_units(d, MM), "mm", t["standard"])
    return {"width": row["b"] * MM, "height": row["h"] * MM, "depth": row["t1"] * MM,
            "r_min": row["r_min"] * MM, "r_max": row["r_max"] * MM,
            "over": row["over"] * MM, "up_to": row["up_to"] * MM,
            "from_memory": bool(row["from_memory"]), "source": t["standard"]}


def chordal_height(d: float, w: float) -> float:
    r"""Height of the circular segment a keyseat of width ``w`` cuts from a shaft of diameter ``d``.

    .. math:: Y = \frac{d - \sqrt{d^2 - w^2}}{2}

    Parameters
    ----------
    d : float
        Shaft diameter [m]
    w : float
        Keyseat width [m]

    Returns
    -------
    float
        Chordal height Y [m]: how far the keyseat's side edges lie below the top of the full circle.

    Notes
    -----
    Plane geometry, exact for ``0 < w < d`` (refused otherwise).

    Examples
    --------
    A 1/4 in keyseat on a 1 in shaft (exact: (1 - sqrt(15/16))/2 = 0.015877 in):

    >>> round(chordal_height(1.0, 0.25), 4)
    0.0159

    References
    ----------
    .. [1] ASME B17.1-1967 (R2003), Keys and Keyseats, chordal height Y (the standard's figure; from
       memory).
    """
    d = checked(D_KEY, d)
    w = checked(Validity("w", 0.0, d, "m", "refuse", "the keyseat must be narrower than the shaft",
                         strict_low=True, strict_high=True), w)
    return (d - math.sqrt(d * d - w * w)) / 2.0


def inch_square_key(d: float) -> dict:
    r"""Shaft keyseat of the inch square key for a shaft diameter.

    .. math:: W = H = \mathrm{table}(d), \quad t_{side} = H/2, \quad t_{centre} = H/2 + Y

    Parameters
    ----------
    d : float
        Shaft diameter [m]

    Returns
    -------
    dict
        ``width`` (key width W = height H) [m], ``height`` [m], ``depth_at_side`` (H/2) [m], ``depth``
        (on the keyseat centre line, H/2 + chordal height Y) [m], ``chordal_height`` [m], ``over``,
        ``up_to`` [m], ``from_memory`` (bool), ``source``.

    Notes
    -----
    Valid for shafts over 5/16 in up to and including 6 1/2 in (the rows in ``data/keys_inch.toml``);
    refused outside (no extrapolation). Rows up to 2 1/4 in are confirmed against the published
    table; larger ones are from memory of it and say so. The standard's key table gives no keyseat
    bottom radius. The depth convention (H/2 at the side, S = D - Y - H/2) is from memory of the
    standard's figure.

    Examples
    --------
    A 1 1/4 in shaft takes the 1/4 in key; just above it, the 5/16 in key (ASME B17.1, Table 1):

    >>> round(inch_square_key(1.25 * 0.0254)["width"] / 0.0254, 4)
    0.25
    >>> round(inch_square_key(1.2501 * 0.0254)["width"] / 0.0254, 4)
    0.3125

    References
    ----------
    .. [1] ASME B17.1-1967 (R2003), Keys and Keyseats, Table 1 (square keys).
    """
    d = checked(D_KEY, d)
    t = _table(INCH_FILE)
    row = _pick(t["rows"], _in_units(d, INCH), "in", t["standard"])
    w = float(Fraction(str(row["key"]))) * INCH
    y = chordal_height(d, w)
    return {"width": w, "height": w, "depth_at_side": w / 2, "depth": w / 2 + y, "chordal_height": y,
            "over": float(Fraction(str(row["over"]))) * INCH, "up_to": float(Fraction(str(row["up_to"]))) * INCH,
            "from_memory": bool(row["from_memory"]), "source": t["standard"]}

"""The rest of the designer's checklist in ``[shaft]``: a bearing's basic dynamic load rating on a
support, and the key, press fit or spline at a station. Checked and converted to SI; every refusal
an :class:`~fem.errors.InputError` naming the field and the value as written.

Case-file keys (docs/layout.md, 'Keys, fits, splines, bearing life and torsion along the shaft')::

    supports = [{ at = 70, bearing = "deep_groove_ball", dynamic_rating = "14 kN",
                  x_factor = 0.56, y_factor = 1.6,        # optional, both or neither: P = X·Fr + Y·Fa
                  required_life = 20000 }]                # optional, hours
    [[shaft.sections]]
    key = { height = 7, length = 36, yield = 390, hub_yield = 250, design_factor = 2 }
    fit = { interference = 0.035, hub_diameter = 70, length = 50, friction = 0.12,
            hub_elastic_modulus = "205 GPa", hub_poisson = 0.29, hub_yield = 300,
            shaft_expansion = 11.5e-6, hub_expansion = 11.5e-6,          # [1/K], plain numbers
            shaft_temperature_rise = 20, hub_temperature_rise = 40,      # [K], plain numbers
            kt_bending = 1.9, kt_bending_source = "..." }
    spline = { length = 24, depth = 1.0 }

Dataclasses (fields added, never renamed): :class:`BearingRating`, :class:`KeyData`,
:class:`KeywayKey`, :class:`FitData`, :class:`SplineData`.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

from classic.bearings import ELEMENT_OF
from classic.key_design import engagement_depths
from classic._validity import OutOfRangeError
from fem.errors import InputError

from .fields import chart_factor, known as _known
from .shapes import resolve_keyway
from .units import to_si

SUPPORT_KEYS = {"dynamic_rating", "x_factor", "y_factor", "required_life"}
STATION_KEYS = {"key", "fit", "spline"}
_KEY = {"height", "length", "yield", "hub_yield", "design_factor"}
_FIT = {"interference", "hub_diameter", "length", "friction", "hub_elastic_modulus", "hub_poisson", "hub_yield",
        "shaft_expansion", "hub_expansion", "shaft_temperature_rise", "hub_temperature_rise", "kt_bending",
        "kt_bending_source"}
_SPLINE = {"length", "depth"}


@dataclass(frozen=True)
class BearingRating:
    C: float  # basic dynamic load rating [N]
    element: str  # "ball" | "roller"
    X: float | None = None
    Y: float | None = None
    required_life: float | None = None  # [h]


@dataclass(frozen=True)
class KeywayKey:
    """One keyway with its key: width, depth (centre line) [m], key height [m] and where it came from,
    the engagement depths on the shaft and hub sides [m]."""

    width: float
    depth: float
    height: float
    height_from: str
    shaft_engagement: float
    hub_engagement: float


@dataclass(frozen=True)
class KeyData:
    length: float  # [m]
    length_from: str
    key_yield: float  # [Pa]
    hub_yield: float  # [Pa]
    design_factor: float | None
    diameter: float  # shaft diameter at the keyways [m]
    keyways: tuple = ()  # KeywayKey per keyway


@dataclass(frozen=True)
class FitData:
    interference: float  # diametral, as given (at assembly temperature) [m]
    hub_diameter: float  # [m]
    length: float  # [m]
    friction: float
    hub_elastic_modulus: float | None  # None: the shaft's
    hub_poisson: float | None
    hub_yield: float | None
    shaft_expansion: float = 0.0  # [1/K]
    hub_expansion: float = 0.0
    shaft_temperature_rise: float = 0.0  # [K]
    hub_temperature_rise: float = 0.0
    kt_bending: float | None = None
    kt_bending_source: str | None = None


@dataclass(frozen=True)
class SplineData:
    length: float  # engagement length [m]
    depth: float  # radial depth of flank engagement [m]


@dataclass
class StationChecklist:
    key: KeyData | None = None
    fit: FitData | None = None
    spline: SplineData | None = None
    notes: list = field(default_factory=list)


def _unit(raw, units, dim):
    return units.label(dim) if units is not None and isinstance(raw, (int, float)) and not isinstance(raw, bool) else None


def _pos(d, key, dim, where, units, required=True):
    if key not in d:
        if required:
            raise InputError(f"{where}.{key}", None, "is required")
        return None
    v = to_si(d[key], dim, f"{where}.{key}", units)
    if not v > 0:
        raise InputError(f"{where}.{key}", d[key], "must be positive", _unit(d[key], units, dim))
    return v


def _plain(d, key, where, what, low=None, positive=False):
    """A plain number (no unit system applies: 1/K, K, hours, factors)."""
    if key not in d:
        return None
    v = d[key]
    if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v):
        raise InputError(f"{where}.{key}", v, f"must be a plain number ({what})")
    if positive and not v > 0:
        raise InputError(f"{where}.{key}", v, f"must be positive ({what})")
    if low is not None and v < low:
        raise InputError(f"{where}.{key}", v, f"must be at least {low:g} ({what})")
    return float(v)


def parse_rating(s: dict, where: str, units, bearing: str | None) -> BearingRating | None:
    """A support's ``dynamic_rating`` and its factors; None when it has none."""
    if "dynamic_rating" not in s:
        for k in ("x_factor", "y_factor", "required_life"):
            if k in s:
                raise InputError(f"{where}.{k}", s[k], "needs dynamic_rating (the bearing's basic dynamic load rating C)")
        return None
    C = _pos(s, "dynamic_rating", "force", where, units)
    if bearing is None:
        raise InputError(f"{where}.bearing", None, "is required with dynamic_rating: the life exponent is 3 for ball "
                         "and 10/3 for roller bearings (ISO 281)")
    X = _plain(s, "x_factor", where, "the radial load factor X", low=0.0)
    Y = _plain(s, "y_factor", where, "the axial load factor Y", low=0.0)
    if (X is None) != (Y is None):
        missing = "y_factor" if Y is None else "x_factor"
        raise InputError(f"{where}.{missing}", None, "is required with the other factor: P = X·Fr + Y·Fa needs both")
    life = _plain(s, "required_life", where, "hours", positive=True)
    return BearingRating(C, ELEMENT_OF[bearing], X, Y, life)


def parse_station_checklist(s: dict, where: str, units, section, diameter: float | None,
                            design_factor: float | None) -> StationChecklist:
    """``key``, ``fit``, ``spline`` of one ``[[shaft.sections]]`` table. ``section`` is the station's
    parsed section (or None: the plain round), ``diameter`` the shaft's diameter there (None without
    segments), ``design_factor`` the case's ``analysis.design_factor``."""
    out = StationChecklist()
    raw_sec = s.get("section") if isinstance(s.get("section"), dict) else {}
    if "key" in s:
        out.key = _key(s["key"], f"{where}.key", units, raw_sec, section, design_factor)
    if "fit" in s:
        d = diameter if diameter is not None else getattr(section, "diameter", None)
        out.fit = _fit(s["fit"], f"{where}.fit", units, d)
    if "spline" in s:
        w = f"{where}.spline"
        sp = s["spline"]
        _known(sp, _SPLINE, w)
        if section is None or section.kind != "spline":
            raise InputError(w, None, "needs the station's section to be a spline (section = { shape = \"spline\", ... })")
        out.spline = SplineData(_pos(sp, "length", "length", w, units), _pos(sp, "depth", "length", w, units))
    return out


def _key(k, w, units, raw_sec, section, design_factor) -> KeyData:
    _known(k, _KEY, w)
    if section is None or section.kind != "keyed" or raw_sec.get("shape") != "keyed":
        raise InputError(w, None, "needs the station's section to be keyed (section = { shape = \"keyed\", keyways = "
                         "[...] }): the key sits in its keyways")
    d = to_si(raw_sec["diameter"], "length", "section.diameter", units)
    h_given = _pos(k, "height", "length", w, units, required=False)
    L_given = _pos(k, "length", "length", w, units, required=False)
    key_yield = _pos(k, "yield", "stress", w, units)
    hub_yield = _pos(k, "hub_yield", "stress", w, units)
    nd = _plain(k, "design_factor", w, "the design factor", positive=True)
    if nd is None:
        nd = design_factor
    keyways, lengths = [], []
    for i, kw in enumerate(raw_sec["keyways"]):
        _, rec = resolve_keyway(kw, d, f"{w.rsplit('.', 1)[0]}.section.keyways[{i}]", units)
        if h_given is not None:
            h, h_from = h_given, "given"
        elif "key_height" in rec:
            h, h_from = rec["key_height"]["value"], rec["key_height"]["from"]
        else:
            raise InputError(f"{w}.height", None, f"is required: keyways[{i}] is not from a key table (give the key's "
                             "height, or standard = \"metric\" or \"inch\" in the keyway)")
        width, depth = rec["width"]["value"], rec["depth"]["value"]
        try:
            ts, th = engagement_depths(d, width, depth, h)
        except OutOfRangeError:
            raise InputError(f"{w}.height" if h_from == "given" else w, k.get("height"),
                             f"the key does not stand out of keyways[{i}] into the hub (its height must exceed the "
                             "keyway's wall)", _unit(k.get("height"), units, "length")) from None
        keyways.append(KeywayKey(width, depth, h, h_from, ts, th))
        if isinstance(kw, dict) and "length" in kw:
            lengths.append(to_si(kw["length"], "length", f"keyways[{i}].length", units))
    if L_given is not None:
        L, L_from = L_given, "given"
    elif len(lengths) == len(keyways):
        L, L_from = min(lengths), "the keyway's length"
    else:
        raise InputError(f"{w}.length", None, "is required (the key's effective length), or give each keyway its length")
    return KeyData(L, L_from, key_yield, hub_yield, nd, d, tuple(keyways))


def _fit(f, w, units, d) -> FitData:
    _known(f, _FIT, w)
    delta = _pos(f, "interference", "length", w, units)
    D = _pos(f, "hub_diameter", "length", w, units)
    if d is not None and not D > d:
        raise InputError(f"{w}.hub_diameter", f["hub_diameter"], "must be larger than the shaft's diameter at the fit",
                         _unit(f["hub_diameter"], units, "length"))
    L = _pos(f, "length", "length", w, units)
    mu = _plain(f, "friction", w, "the coefficient of friction", positive=True)
    if mu is None:
        raise InputError(f"{w}.friction", None, "is required (the coefficient of friction of the fit; about 0.1 to 0.2 "
                         "for dry steel on steel is common practice)")
    if mu > 1:
        raise InputError(f"{w}.friction", f["friction"], "must be at most 1")
    E = _pos(f, "hub_elastic_modulus", "stress", w, units, required=False)
    nu = _plain(f, "hub_poisson", w, "Poisson's ratio")
    if nu is not None and not -1 < nu <= 0.5:
        raise InputError(f"{w}.hub_poisson", f["hub_poisson"], "must lie between -1 and 0.5")
    sy = _pos(f, "hub_yield", "stress", w, units, required=False)
    a_s = _plain(f, "shaft_expansion", w, "coefficient of thermal expansion, 1/K", low=0.0) or 0.0
    a_h = _plain(f, "hub_expansion", w, "coefficient of thermal expansion, 1/K", low=0.0) or 0.0
    dT_s = _plain(f, "shaft_temperature_rise", w, "kelvin") or 0.0
    dT_h = _plain(f, "hub_temperature_rise", w, "kelvin") or 0.0
    for key, dT, a, ak in (("shaft_temperature_rise", dT_s, a_s, "shaft_expansion"),
                           ("hub_temperature_rise", dT_h, a_h, "hub_expansion")):
        if dT and ak not in f:
            raise InputError(f"{w}.{ak}", None, f"is required with {key} (the coefficient of thermal expansion, 1/K)")
    kt = chart_factor(f, "kt_bending", w)
    if kt is None and "kt_bending_source" in f:
        raise InputError(f"{w}.kt_bending_source", f["kt_bending_source"], "is given without kt_bending")
    return FitData(delta, D, L, mu, E, nu, sy, a_s, a_h, dT_s, dT_h, *(kt or (None, None)))


def check_fits_with_section(shaft, section, units=None) -> None:
    """A shaft without segments takes its diameter from [section]: a press fit's hub must be larger
    than that diameter too (checked here, where the section is known)."""
    if shaft is None or shaft.segments:
        return
    for i, st in enumerate(shaft.stations):
        fit = st.checklist.fit if st.checklist is not None else None
        sec = st.section if st.section is not None else section
        d = getattr(sec, "diameter", None)
        if fit is not None and d is not None and not fit.hub_diameter > d:
            raw = st.raw["fit"]["hub_diameter"]
            raise InputError(f"shaft.sections[{i}].fit.hub_diameter", raw, "must be larger than the shaft's diameter at "
                             "the fit", _unit(raw, units, "length"))

"""``shape = "composite"``: a section of bonded regions, each with its own material.

::

    [section]
    shape = "composite"
    [[section.regions]]
    name = "steel core"
    add = [ { disk = { radius = 4 } } ]
    elastic_modulus = "206 GPa"
    poisson = 0.3
    yield = "350 MPa"
    [[section.regions]]
    name = "glass-filled sleeve"
    add = [ { disk = { radius = 9 } } ]
    cut = [ { disk = { radius = 4 } } ]
    elastic_modulus = "7 GPa"
    poisson = 0.38
    yield = "60 MPa"

Each region is added and cut like a custom section; regions are bonded where they touch and may not
overlap. ``shear_modulus`` defaults to E/(2(1 + ν)) (isotropic material); ``yield`` is the strength the
region's static check uses (for a polymer: its strength at the service conditions). ``density`` is
optional on its own and needed when the section is a segment of a shaft layout with self-weight or a
speed (the beam's mass per length; compare/case/shaft_composite.py).

Fatigue, region by region (docs/case-files.md, 'Composite sections'): a steel region gives ``ultimate``
and ``surface`` (or ``endurance_limit``), optionally ``reliability`` and ``temperature``, and is checked
with the Marin factors and the project's criteria; a polymer region gives ``polymer = { ... }`` (the
schema of [material.polymer]) read at the case's [service] conditions, and is checked with its
stress-life strength and the polymer Goodman line. ``fatigue = { kt_bending = ..., kt_bending_source =
"...", kts_torsion = ..., kts_torsion_source = "...", notch_radius = ... }`` gives a region chart
factors for a 3-D feature its section does not show.
"""
from __future__ import annotations

from dataclasses import dataclass

import math

from classic._validity import OutOfRangeError
from classic.fatigue import surface_factor
from fem.composite import Region
from fem.errors import InputError
from fem.geometry import Section, custom_section

from .fields import chart_factor, known
from .polymer import at_service, parse_polymer, parse_service
from .units import to_si

_REGION = {"name", "add", "cut", "elastic_modulus", "shear_modulus", "poisson", "yield", "length",
           "ultimate", "surface", "endurance_limit", "reliability", "temperature", "polymer", "fatigue", "density"}
_REGION_FATIGUE = {"kt_bending", "kt_bending_source", "kts_torsion", "kts_torsion_source", "notch_radius"}
#: Keys a polymer region takes from its data at the service conditions (a second value would contradict them).
_POLYMER_REPLACES = ("elastic_modulus", "shear_modulus", "yield", "ultimate", "surface", "endurance_limit",
                     "reliability", "temperature")


@dataclass
class RegionMaterial:
    """The material of one region, SI."""

    name: str
    elastic_modulus: float
    shear_modulus: float
    poisson: float
    yield_strength: float | None
    field: str
    shear_modulus_from: str = "given"
    #: steel fatigue data (Marin route): SI, None where not given
    ultimate: float | None = None
    surface: str | None = None
    endurance_limit: float | None = None
    reliability: float | None = None
    temperature: float | None = None
    #: chart factors of the region: {"kt_bending": (value, source), "kts_torsion": ..., "notch_radius": m}
    fatigue: dict | None = None
    #: a polymer region's data read at the [service] conditions (compare/case/polymer.PolymerAtService)
    polymer: object | None = None
    density: float | None = None  # [kg/m³]: a layout's self-weight and critical speeds (compare/case/shaft_composite.py)

    @property
    def kind(self) -> str | None:
        """"polymer" (its own data), "steel" (ultimate or endurance limit given: the Marin route), or None."""
        if self.polymer is not None:
            return "polymer"
        if self.ultimate is not None or self.endurance_limit is not None:
            return "steel"
        return None


def parse_composite(s: dict, units, primitive, text) -> tuple[Section, list[RegionMaterial]]:
    """The composite section (``Section.regions`` holds the regions; ``steps`` their added primitives)
    and the regions' materials. ``primitive`` parses one primitive table (compare/case/case.py),
    ``text`` checks a user string."""
    known(s, {"shape", "regions"}, "section")
    raw = s.get("regions")
    if not isinstance(raw, list) or not raw:
        raise InputError("section.regions", raw, "needs at least one [[section.regions]] table")
    regions, mats = [], []
    for k, r in enumerate(raw):
        f = f"section.regions[{k}]"
        if not isinstance(r, dict):
            raise InputError(f, r, "must be a table")
        known(r, _REGION, f)
        if "length" in r:
            raise InputError(f"{f}.length", r["length"], "a composite region runs the whole section length")
        name = text(r.get("name", f"region {k + 1}"), f"{f}.name")
        adds = r.get("add")
        if not isinstance(adds, list) or not adds:
            raise InputError(f"{f}.add", adds, "needs at least one primitive, e.g. [ { disk = { radius = 4 } } ]")
        cuts = r.get("cut", [])
        if not isinstance(cuts, list):
            raise InputError(f"{f}.cut", cuts, "must be a list of primitives")
        add = [primitive(p, f"regions[{k}].add[{i}]", units) for i, p in enumerate(adds)]
        cut = [primitive(p, f"regions[{k}].cut[{i}]", units) for i, p in enumerate(cuts)]
        regions.append(Region(custom_section(add, cut), k, name))
        mats.append(_material(r, f, name, units))
    steps = tuple(st for reg in regions for st in reg.section.steps if st[0] == "add")
    return Section(steps, kind="composite", regions=tuple(regions)), mats


def _material(r: dict, f: str, name: str, units) -> RegionMaterial:
    if "polymer" in r:
        for k in _POLYMER_REPLACES:
            if k in r:
                raise InputError(f"{f}.{k}", r[k], f"cannot be given with {f}.polymer: the modulus and strengths are "
                                 "read from the polymer data at the [service] conditions")
        return _polymer_region(r, f, name, units)
    if "elastic_modulus" not in r:
        raise InputError(f"{f}.elastic_modulus", None, "is needed: every region names its material's modulus")
    E = to_si(r["elastic_modulus"], "stress", f"{f}.elastic_modulus", units)
    if not E > 0:
        raise InputError(f"{f}.elastic_modulus", r["elastic_modulus"], "must be positive")
    if "poisson" not in r:
        raise InputError(f"{f}.poisson", None, "is needed (the shear modulus follows from it, and the transformed "
                         "section assumes the regions' ratios are close)")
    nu = to_si(r["poisson"], "dimensionless", f"{f}.poisson", None)
    if not -1.0 < nu < 0.5:
        raise InputError(f"{f}.poisson", r["poisson"], "must lie between -1 and 0.5")
    if "shear_modulus" in r:
        G = to_si(r["shear_modulus"], "stress", f"{f}.shear_modulus", units)
        if not G > 0:
            raise InputError(f"{f}.shear_modulus", r["shear_modulus"], "must be positive")
        src = "given"
    else:
        G, src = E / (2.0 * (1.0 + nu)), "E/(2(1 + ν)), isotropic"
    Sy = None
    if "yield" in r:
        Sy = to_si(r["yield"], "stress", f"{f}.yield", units)
        if not Sy > 0:
            raise InputError(f"{f}.yield", r["yield"], "must be positive")
    m = RegionMaterial(name, E, G, nu, Sy, f, src, density=_density(r, f, units))
    _steel_fatigue(m, r, f, units)
    m.fatigue = _region_fatigue(r, f, units, polymer=False)
    return m


def _density(r: dict, f: str, units) -> float | None:
    """The region's ``density`` [kg/m³] (a layout's mass per length), or None."""
    if "density" not in r:
        return None
    rho = to_si(r["density"], "density", f"{f}.density", units)
    if not rho > 0:
        raise InputError(f"{f}.density", r["density"], "must be positive",
                         units.label("density") if units is not None else None)
    return rho


def _positive(r, key, f, units, dim="stress"):
    v = to_si(r[key], dim, f"{f}.{key}", units)
    if not v > 0:
        raise InputError(f"{f}.{key}", r[key], "must be positive")
    return v


def _steel_fatigue(m: RegionMaterial, r: dict, f: str, units) -> None:
    """The steel region's fatigue data: ultimate, surface, endurance limit, reliability, temperature."""
    if "ultimate" in r:
        m.ultimate = _positive(r, "ultimate", f, units)
        for key, v in (("yield", m.yield_strength),):
            if v is not None and v > m.ultimate:
                raise InputError(f"{f}.{key}", r[key], "is above the region's ultimate strength; a yield stress cannot "
                                 "exceed it")
    if "endurance_limit" in r:
        m.endurance_limit = _positive(r, "endurance_limit", f, units)
        if m.ultimate is not None and m.endurance_limit > m.ultimate:
            raise InputError(f"{f}.endurance_limit", r["endurance_limit"], "is above the region's ultimate strength")
    if "surface" in r:
        v = r["surface"]
        try:
            if not isinstance(v, str):
                raise OutOfRangeError("surface", v, "not a string")
            surface_factor(500.0, v)
        except OutOfRangeError:
            raise InputError(f"{f}.surface", v, "unknown surface; use ground, machined, cold-drawn, hot-rolled or "
                             "as-forged") from None
        m.surface = v
    if "reliability" in r:
        R = to_si(r["reliability"], "dimensionless", f"{f}.reliability", None)
        if not 0 < R < 1:
            raise InputError(f"{f}.reliability", r["reliability"], "must be a fraction between 0 and 1 (e.g. 0.99)")
        m.reliability = R
    if "temperature" in r:
        t = r["temperature"]
        T = float(t) if isinstance(t, (int, float)) and not isinstance(t, bool) else to_si(t, "temperature", f"{f}.temperature", None)
        if not math.isfinite(T) or T < -273.15:
            raise InputError(f"{f}.temperature", t, "must be a temperature above absolute zero (°C)")
        m.temperature = T


def _region_fatigue(r: dict, f: str, units, polymer: bool) -> dict | None:
    """``fatigue = { kt_bending, kt_bending_source, kts_torsion, kts_torsion_source, notch_radius }``."""
    if "fatigue" not in r:
        return None
    d = r["fatigue"]
    w = f"{f}.fatigue"
    if not isinstance(d, dict):
        raise InputError(w, d, "must be a table, e.g. { kt_bending = 1.8, kt_bending_source = \"...\" }")
    known(d, _REGION_FATIGUE, w)
    out: dict = {}
    for key in ("kt_bending", "kts_torsion"):
        if key not in d and f"{key}_source" in d:
            raise InputError(f"{w}.{key}_source", d[f"{key}_source"], f"is given without {w}.{key}")
        got = chart_factor(d, key, w)
        if got is not None:
            out[key] = got
    if "notch_radius" in d:
        if polymer:
            raise InputError(f"{w}.notch_radius", d["notch_radius"], "is not used for a polymer region: its fatigue "
                             "factor takes Kf = Kt (no notch sensitivity data for polymers); leave it out")
        out["notch_radius"] = _positive(d, "notch_radius", w, units, "length")
    return out or None


def _polymer_region(r: dict, f: str, name: str, units) -> RegionMaterial:
    """A polymer region before the [service] conditions are known: E and G come later
    (:func:`apply_region_polymers`)."""
    if "poisson" not in r:
        raise InputError(f"{f}.poisson", None, "is needed: G = E/(2(1 + ν)) at the service temperature needs it")
    nu = to_si(r["poisson"], "dimensionless", f"{f}.poisson", None)
    if not -1.0 < nu < 0.5:
        raise InputError(f"{f}.poisson", r["poisson"], "must lie between -1 and 0.5")
    m = RegionMaterial(name, math.nan, math.nan, nu, None, f, "E/(2(1 + ν)) at the service conditions, isotropic",
                       density=_density(r, f, units))
    return m


def apply_region_polymers(mats: list, data: dict, units, alternating: bool) -> None:
    """Read every polymer region's data at the case's ``[service]`` conditions (E, G and the static
    strength of the region from them); ``[service]`` without a polymer region, or a polymer region
    without ``[service]``, is refused."""
    raw = (data.get("section") or {}).get("regions") or []
    polymers = [(k, r) for k, r in enumerate(raw) if isinstance(r, dict) and "polymer" in r]
    if not polymers:
        if "service" in data:
            raise InputError("service", None, "is given but no section.regions[k] has polymer data: the service "
                             "conditions are read against a polymer's own data; give them or leave [service] out")
        return
    if "service" not in data:
        k = polymers[0][0]
        raise InputError("service", None, f"is required with section.regions[{k}].polymer: the service temperature, "
                         "moisture state, life and speed (or cycles) the region is checked at")
    rotating = bool((data.get("loads") or {}).get("rotating") is True)
    sv = parse_service(data["service"], units, None, {}, None, rotating)
    for k, r in polymers:
        m = mats[k]
        pd = parse_polymer(r["polymer"], units, f"{m.field}.polymer")
        p = at_service(pd, sv, m.poisson, alternating)
        m.polymer = p
        m.elastic_modulus = p.elastic_modulus
        m.shear_modulus = p.shear_modulus
        m.yield_strength = p.tensile_strength
        m.temperature = sv.temperature
        m.fatigue = _region_fatigue(r, m.field, units, polymer=True)

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
"""
from __future__ import annotations

from dataclasses import dataclass

from fem.composite import Region
from fem.errors import InputError
from fem.geometry import Section, custom_section

from .fields import known
from .units import to_si

_REGION = {"name", "add", "cut", "elastic_modulus", "shear_modulus", "poisson", "yield", "length", "density"}


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
    density: float | None = None  # [kg/m³]: a layout's self-weight and critical speeds (compare/case/shaft_composite.py)


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
    rho = None
    if "density" in r:
        rho = to_si(r["density"], "density", f"{f}.density", units)
        if not rho > 0:
            raise InputError(f"{f}.density", r["density"], "must be positive",
                             units.label("density") if units is not None else None)
    return RegionMaterial(name, E, G, nu, Sy, f, src, rho)

"""Composite segments of a shaft layout: a ``[[shaft.segments]]`` entry with a ``section`` table of
``shape = "composite"`` (bonded regions, each with its material; compare/case/composite.py), or a
``[shaft]`` without segments whose case ``[section]`` is composite (a uniform composite shaft)::

    [[shaft.segments]]
    from = 20
    to = 80
    diameter = 12                      # the outer diameter: the regions must fill a round of it
    [shaft.segments.section]
    shape = "composite"
    [[shaft.segments.section.regions]]
    name = "steel core"
    add = [ { disk = { radius = 3 } } ]
    elastic_modulus = "206 GPa"
    poisson = 0.3
    yield = "420 MPa"
    density = 7850                     # needed when the shaft has self-weight (density) or a speed
    [[shaft.segments.section.regions]]
    ...

What a composite segment does not take (each refused in one line naming the field): a ``bore`` (its
regions give any hole), a shoulder ``fillet`` at either end and a groove on it (the shoulder and groove
factors are those of one material), a station of its own ``section``, ``fatigue``, ``key``, ``fit`` or
``spline`` on it, a station at its joint with another segment, and a region without ``density`` when
the shaft has a density or a speed; ``shaft.density`` when every segment is composite (each region
gives its own), or its absence when a shaft with a speed also has one-material segments. Self-weight
(``self_weight``, default true) uses the regions' densities where they are given. Every check here is on the parsed data; nothing is solved.
"""
from __future__ import annotations

import math

from fem.errors import InputError
from fem.geometry import Disk, Ellipse, Polygon

#: Relative tolerance of the outer round against the segment's diameter (round-off of converted lengths).
ROUND_TOL = 1e-6


def _reach(p) -> float:
    """The largest distance from the shaft's axis of a primitive (an upper bound for a filleted polygon)."""
    if isinstance(p, Disk):
        return math.hypot(*p.center) + p.radius
    if isinstance(p, Ellipse):
        return math.hypot(*p.center) + max(p.semi_axes)
    if isinstance(p, Polygon):
        return max(math.hypot(x, y) for x, y in p.points)
    return math.inf


def check_round(section, diameter: float, fld: str, shown, unit: str | None = None) -> None:
    """The composite section is a round of ``diameter`` on the shaft's axis: one region adds a disk of
    that diameter centred on the axis, and nothing reaches beyond it."""
    R = diameter / 2
    adds = [p for reg in section.regions for op, p in reg.section.steps if op == "add"]
    outer = any(isinstance(p, Disk) and math.hypot(*p.center) <= ROUND_TOL * R and abs(p.radius - R) <= ROUND_TOL * R
                for p in adds)
    if not outer or any(_reach(p) > R * (1 + ROUND_TOL) for p in adds):
        raise InputError(fld, shown, "must be the outer diameter of the composite section: one region's disk of that "
                         "diameter centred on the shaft's axis, nothing beyond it", unit)


def outer_diameter(section) -> float:
    """The outer diameter of a composite section that is a round on the shaft's axis (checked: the
    case's composite [section] as a uniform shaft)."""
    adds = [p for reg in section.regions for op, p in reg.section.steps if op == "add"]
    D = 2.0 * max(_reach(p) for p in adds)
    try:
        if not math.isfinite(D):
            raise InputError("section.regions", None, "")
        check_round(section, D, "section.regions", None)
    except InputError:
        raise InputError("section.regions", None, "must form a round on the shaft's axis for a [shaft] of this section: "
                         "one region's disk centred on the axis, nothing beyond it") from None
    return D


def segment_section(s: dict, w: str, units, parse_section):
    """The composite section of a segment's ``section`` table and its regions' materials."""
    raw = s["section"]
    if not isinstance(raw, dict):
        raise InputError(f"{w}.section", raw, "must be a table: [shaft.segments.section] with shape = \"composite\" "
                         "and its [[shaft.segments.section.regions]]")
    if raw.get("shape") != "composite":
        raise InputError(f"{w}.section.shape", raw.get("shape"), "a segment's section must be shape = \"composite\" (a "
                         "segment of one material is given by its diameter and bore)")
    if "bore" in s:
        raise InputError(f"{w}.bore", s["bore"], "cannot be given with a composite section: its regions give any hole")
    for k, r in enumerate(raw.get("regions") or []):
        if isinstance(r, dict) and "polymer" in r:  # read at [service] for the case's own [section] only
            raise InputError(f"{w}.section.regions[{k}].polymer", None, "a segment's region takes its polymer data "
                             "at the service conditions only through the case's own composite [section] (a uniform "
                             "composite shaft); here give the region's elastic_modulus, poisson and yield at service")
    mats: list = []
    try:
        sec = parse_section(raw, units, None, None, mats)
    except InputError as exc:
        raise InputError(f"{w}.{exc.field}", exc.value, exc.reason, exc.unit) from None
    for m in mats:  # the regions' fields as the layout names them
        m.field = f"{w}.{m.field}"
    return sec, tuple(mats)


def check_composite_segments(sh, raw: dict) -> None:
    """What the layout asks of its composite segments (see the module docstring); ``raw`` is the
    [shaft] table as written."""
    raw_segments = raw.get("segments") or []
    segs = sh.segments
    comp = [i for i, s in enumerate(segs) if s.section is not None]
    if not comp:
        return
    tol = 1e-9 * sh.length
    if len(comp) == len(segs) and sh.density is not None:
        raise InputError("shaft.density", raw.get("density"), "is not used when every segment is composite: give each "
                         "region's density in its [[...regions]] table")
    if len(comp) < len(segs) and sh.speed is not None and sh.density is None:
        raise InputError("shaft.density", None, "is needed: the shaft has a speed and one-material segments beside "
                         "its composite ones (the critical speeds need the whole shaft's mass)")
    for i in comp:
        s = segs[i]
        if sh.density is not None or sh.speed is not None:
            why = "the shaft has a density (self-weight and mass)" if sh.density is not None else \
                "the shaft has a speed (critical speeds need its mass)"
            for m in s.materials:
                if m.density is None:
                    raise InputError(f"{m.field}.density", None, f"is needed: {why}; give each region's density")
        for j in (i, i + 1):
            if 0 < j < len(segs) and segs[j].fillet is not None and segs[j].diameter != segs[j - 1].diameter:
                raise InputError(f"shaft.segments[{j}].fillet", raw_segments[j].get("fillet"), "is at a step of a "
                                 "composite segment: the shoulder factor of bonded regions is not computed (leave it out)")
        for k, g in enumerate(sh.grooves):
            if s.start - tol < g.at + g.width / 2 and g.at - g.width / 2 < s.end + tol:
                raise InputError(f"shaft.grooves[{k}].at", (raw.get("grooves") or [{}])[k].get("at"), "is on a composite segment: the groove factor of "
                                 "bonded regions is not computed")


def check_composite_station(s: dict, w: str, sh, at: float, station_keys) -> None:
    """A station on a composite segment is checked on that segment's section, region by region."""
    tol = 1e-9 * sh.length
    segs = sh.segments
    here = [x for x in segs if x.start - tol <= at <= x.end + tol]
    if not any(x.section is not None for x in here):
        return
    if len(here) > 1 and len({id(x.section) for x in here}) > 1:
        raise InputError(f"{w}.at", s["at"], "is at the joint of a composite segment with another segment: place the "
                         "station inside one of them")
    for key in ("section", "fatigue", "feature_from", *sorted(station_keys)):
        if key in s:
            raise InputError(f"{w}.{key}", s[key] if not isinstance(s[key], dict) else None,
                             "cannot be given for a station on a composite segment: it is checked on the segment's "
                             "composite section, region by region with its regions' own data")

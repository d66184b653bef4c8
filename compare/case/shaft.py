"""The shaft layout: the ``[shaft]`` table of a case file, checked and converted to SI.

Axes: z along the shaft axis from the left end (``at`` is a z position), x and y across it, right-
handed, the same x and y as the cross-section. Loads on the shaft follow the case's other tables:
forces [N], moments [N·m] as vector components, torque about +z as the part applies it to the shaft
(torque put in positive, torque taken out negative).

Case-file schema (docs/layout.md is the reference)::

    [shaft]
    length = 400                         # [length]
    density = 7850                       # optional; self-weight along -y, and the shaft's mass
    speed = "1450 rpm"                   # optional operating speed
    rotating = true                      # optional; as loads.rotating (the loads are fixed in space)
    self_weight = true                   # optional, default true when density is given
    supports = [{ at = 20, bearing = "deep_groove_ball" }, { at = 380, stiffness = 2e5 }]
                                         # radial stiffness optional (rigid); bearing type optional
    [[shaft.segments]]                   # optional; none: uniform with the case's [section]
    from = 0                             # the segments cover 0..length, in order, without gaps
    to = 120
    diameter = 35
    bore = 0                             # optional
    fillet = 1.5                         # optional: shoulder fillet radius at the step where it begins
    section = { shape = "composite", ... }  # optional: bonded regions of several materials (a round of
                                         # the segment's diameter; compare/case/shaft_composite.py)
    [[shaft.grooves]]                    # carried for the shoulder/groove Kt step
    at = 200
    width = 2
    depth = 1
    radius = 0.3
    [[shaft.loads]]
    at = 100
    kind = "point"                       # "point" | "gear" | "pulley" | "sprocket"
    name = "coupling"                    # optional
    force = [0, -500]                    # point: force [Fx, Fy], axial, moment [Mx, My], torque
    axial = 0
    moment = [0, 0]
    torque = 200                         # every kind: the torque the part puts into the shaft
    mass = 2.5                           # optional, every kind: for the critical speed
    inertia = 0.004                      # optional: polar mass moment of inertia of the part
    # gear:   pitch_diameter, pressure_angle (normal, deg), helix_angle (deg, default 0),
    #         hand = "right" | "left" (needed with a helix), mesh_angle (deg from +x toward +y:
    #         where the mating gear touches)
    # pulley: diameter, tension_ratio (tight/slack, > 1), pull_angle (deg from +x toward +y: the
    #         direction the belt pulls the shaft); sprocket: diameter, pull_angle (slack side 0)
    [[shaft.sections]]
    at = 150
    name = "gear keyseat"                # optional
    section = { shape = "keyed", ... }   # optional, same keys as [section]; else the plain round
    fatigue = { kt_bending = 2.1, kt_bending_source = "..." }   # optional, same keys as [fatigue]
    feature_from = 130                   # optional: where the section's feature (keyway, flat, spline,
                                         # cut with a length) begins; without it the feature is centred on at
    segment = { kind = "keyseat_end" }   # optional: the keyway's end (or "sled_runner", "cross_hole") studied
                                         # in 3-D; its Kt, Kts and local stresses are the station's
                                         # (shaft_segment.py: keys, defaults, refusals)

Dataclasses (stable: later steps build on them; fields are added, never renamed):

- :class:`Segment` (start, end, diameter, bore, fillet) [m]; section (a composite fem Section or None),
  materials (its regions' compare.case.composite.RegionMaterial, in region order)
- :class:`Groove` (at, width, depth, radius) [m]
- :class:`Support` (at [m], stiffness [N/m] or None = rigid, name, bearing (type for the slope
  limit, one of :data:`BEARING_TYPES`, or None), rating (shaft_checklist.BearingRating or None))
- :class:`ShaftLoad` (at, kind, name, force (Fx, Fy) [N], axial [N], moment (Mx, My) [N·m],
  torque [N·m], mass [kg], inertia [kg·m²], gear: :class:`Gear` | None, pulley: :class:`Pulley` | None)
- :class:`Gear` (pitch_diameter [m], pressure_angle, helix_angle [deg], hand, mesh_angle [deg])
- :class:`Pulley` (diameter [m], tension_ratio (inf for a sprocket), pull_angle [deg])
- :class:`Station` (at [m], name, section (fem Section | None = the segment's plain round),
  fatigue (dict of the [fatigue] keys given, SI), kt (dict filled by a later feature step:
  {"kt_bending": (value, source), "kts_torsion": (value, source)}; the station check uses a value
  the user gave in ``fatigue`` first, then these), raw (the station's case-file table), extent
  ((z0, z1) [m] of the section's longest feature with a length: centred on ``at``, or from
  ``feature_from``; None without one), extent_field (the case-file field of that length), geometry
  (the section's resolved dimensions, as Case.geometry), checklist
  (shaft_checklist.StationChecklist: key, fit, spline; or None), segment (shaft_segment.StationSegment:
  the station's 3-D feature and, once built, its fem.solid.Segment model; or None))
- :class:`Shaft` (length, segments, grooves, supports, loads, stations, density, speed [rad/s],
  rotating, self_weight)

Every refusal is an :class:`~fem.errors.InputError` naming the field (``shaft.loads[2].torque``) and the
value as written. This module does not import ``case.py`` (``case.py`` imports it); the section
parser is handed in.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

from fem.errors import InputError, escape_text

from .units import from_si, to_si
from .fields import angle as _angle, chart_factor, known as _known
from .shaft_checklist import STATION_KEYS, SUPPORT_KEYS, parse_rating, parse_station_checklist
from .shaft_composite import check_composite_segments, check_composite_station, check_round, outer_diameter, segment_section
from .shaft_segment import parse_station_segment

#: Relative tolerance of the torque balance: the torques of the loads must sum to zero within this
#: share of the largest one. Values typed with 4-6 figures balance far better than this; a torque
#: left out or given the wrong sign misses it by 100 % or more.
TORQUE_BALANCE_TOL = 1e-6
#: Relative gap allowed between consecutive segments (round-off of converted lengths only).
GAP_TOL = 1e-9

_SHAFT = {"length", "density", "speed", "rotating", "self_weight", "supports", "segments", "grooves", "loads",
          "sections"}
_SEGMENT = {"from", "to", "diameter", "bore", "fillet", "section"}
_GROOVE = {"at", "width", "depth", "radius"}
_SUPPORT = {"at", "stiffness", "name", "bearing"} | SUPPORT_KEYS  # rating: shaft_checklist.py
#: Bearing types the slope check knows (classic.shaft.SLOPE_LIMITS, Shigley 9th ed., Table 7-2).
BEARING_TYPES = ("tapered_roller", "cylindrical_roller", "deep_groove_ball", "spherical_ball", "self_aligning_ball")
_COMMON = {"at", "kind", "name", "torque", "mass", "inertia"}
_LOAD_KEYS = {
    "point": _COMMON | {"force", "axial", "moment"},
    "gear": _COMMON | {"pitch_diameter", "pressure_angle", "helix_angle", "hand", "mesh_angle"},
    "pulley": _COMMON | {"diameter", "tension_ratio", "pull_angle"},
    "sprocket": _COMMON | {"diameter", "pull_angle"},
}
_STATION = {"at", "name", "section", "fatigue", "feature_from", "segment"} | STATION_KEYS  # key, fit, spline: shaft_checklist.py;
# segment: a 3-D feature (keyseat end, cross hole) studied in 3-D (shaft_segment.py)
_STATION_FATIGUE = {"kt_bending", "kt_bending_source", "kts_torsion", "kts_torsion_source", "notch_radius"}


@dataclass(frozen=True)
class Segment:
    start: float
    end: float
    diameter: float
    bore: float | None = None
    fillet: float | None = None  # shoulder fillet radius at the step where this segment begins
    section: object | None = field(default=None, compare=False)  # a composite fem Section, or None: one material
    materials: tuple = field(default=(), compare=False)  # the composite's RegionMaterial, in region order


@dataclass(frozen=True)
class Groove:
    at: float
    width: float
    depth: float
    radius: float


@dataclass(frozen=True)
class Support:
    at: float
    stiffness: float | None = None  # radial [N/m]; None: rigid
    name: str = ""
    bearing: str | None = None  # one of BEARING_TYPES; None: judged against the tightest limit
    rating: object | None = None  # shaft_checklist.BearingRating: C, X, Y for the basic rating life


@dataclass(frozen=True)
class Gear:
    pitch_diameter: float
    pressure_angle: float  # normal pressure angle [deg]
    helix_angle: float = 0.0  # [deg]
    hand: str | None = None  # "right" | "left"
    mesh_angle: float = 0.0  # [deg] from +x toward +y


@dataclass(frozen=True)
class Pulley:
    diameter: float
    tension_ratio: float  # tight/slack; inf for a sprocket (slack side taken as 0)
    pull_angle: float  # [deg] from +x toward +y: the direction of the pull on the shaft


@dataclass(frozen=True)
class ShaftLoad:
    at: float
    kind: str = "point"
    name: str = ""
    force: tuple[float, float] = (0.0, 0.0)
    axial: float = 0.0
    moment: tuple[float, float] = (0.0, 0.0)
    torque: float = 0.0
    mass: float | None = None
    inertia: float | None = None
    gear: Gear | None = None
    pulley: Pulley | None = None


@dataclass
class Station:
    at: float
    name: str = ""
    section: object | None = None  # fem.geometry.Section, or None: the segment's plain round
    fatigue: dict = field(default_factory=dict)  # [fatigue] keys given for this station, SI
    kt: dict = field(default_factory=dict)  # filled by a feature step: {"kt_bending": (value, source), ...}
    raw: dict = field(default_factory=dict)  # the station's case-file table (to build its own case)
    extent: tuple[float, float] | None = None  # (z0, z1) of the section's feature with a length, or None
    extent_field: str = ""  # the case-file field of that feature's length
    geometry: dict = field(default_factory=dict)  # the section's resolved dimensions (Case.geometry of its run)
    checklist: object | None = None  # shaft_checklist.StationChecklist: key, press fit, spline
    segment: object | None = None  # shaft_segment.StationSegment: the station's 3-D feature, or None


@dataclass
class Shaft:
    length: float
    segments: list[Segment] = field(default_factory=list)
    grooves: list[Groove] = field(default_factory=list)
    supports: list[Support] = field(default_factory=list)
    loads: list[ShaftLoad] = field(default_factory=list)
    stations: list[Station] = field(default_factory=list)
    density: float | None = None
    speed: float | None = None  # [rad/s]
    rotating: bool = False
    self_weight: bool = True

    def has_features(self) -> bool:
        """A shoulder (a step in diameter between segments) or a groove along the shaft."""
        steps = any(a.diameter != b.diameter for a, b in zip(self.segments, self.segments[1:]))
        return steps or bool(self.grooves)

    @property
    def factors_only(self) -> bool:
        """No loads and no stations: the case asks for the shoulder and groove factors only."""
        return not self.loads and not self.stations and self.has_features()

    def segment_at(self, z: float, side: str = "right") -> Segment | None:
        """The segment holding ``z`` (at a step, the one to its right, or left with ``side="left"``);
        None for a shaft without segments."""
        if not self.segments:
            return None
        for s in self.segments:
            if (s.start <= z < s.end) if side == "right" else (s.start < z <= s.end):
                return s
        return self.segments[-1] if side == "right" or z > self.segments[0].start else self.segments[0]


# ----------------------------------------------------------------------------- parser


def parse_shaft(d, units, parse_section, loads_rotating: bool = False, feature_lengths=None,
                composite=None) -> Shaft:
    """``[shaft]`` as a :class:`Shaft` (SI). ``parse_section(table, units)`` parses a station's
    section table and ``feature_lengths(table, units)`` lists its features' lengths as [(field, m)]
    (both handed in by ``case.py``); ``loads_rotating`` is ``loads.rotating``. ``composite`` is
    (section, region materials) of the case's composite [section]: without segments, the shaft is that
    section all along (one composite segment)."""
    _known(d, _SHAFT, "shaft")
    length = _pos(d, "length", "length", "shaft", units, required=True)
    sh = Shaft(length=length)
    if "density" in d:
        sh.density = _pos(d, "density", "density", "shaft", units)
    if "speed" in d:
        sh.speed = _pos(d, "speed", "angular_speed", "shaft", units)
    for key in ("rotating", "self_weight"):
        if key in d and not isinstance(d[key], bool):
            raise InputError(f"shaft.{key}", d[key], "must be true or false")
    sh.rotating = bool(d.get("rotating", False)) or loads_rotating
    sh.self_weight = bool(d.get("self_weight", True))
    sh.segments = _segments(d.get("segments", []), length, units, parse_section)
    if composite is not None:
        if sh.segments:
            raise InputError("section.shape", "composite", "with [[shaft.segments]]: give the composite in the "
                             "segment's own section table ([shaft.segments.section])")
        sh.segments = [uniform_composite(length, *composite)]
    sh.grooves = [_groove(g, i, sh, units) for i, g in enumerate(_table_list(d.get("grooves", []), "shaft.grooves"))]
    check_composite_segments(sh, d)
    # a layout without loads and stations asks for the shoulder and groove factors only: no beam, no bearings
    factors_only = not d.get("loads") and not d.get("sections") and d.get("supports") is None
    sh.supports = [] if factors_only else _supports(d, length, units)
    sh.loads = [_load(x, i, length, units) for i, x in enumerate(_table_list(d.get("loads", []), "shaft.loads"))]
    _torque_balance(sh.loads, _table_list(d.get("loads", []), "shaft.loads"))
    sh.stations = [_station(s, i, sh, units, parse_section, feature_lengths)
                   for i, s in enumerate(_table_list(d.get("sections", []), "shaft.sections"))]
    return sh


def _segments(raw, length, units, parse_section=None) -> list[Segment]:
    out = []
    for i, s in enumerate(_table_list(raw, "shaft.segments")):
        w = f"shaft.segments[{i}]"
        _known(s, _SEGMENT, w)
        a = _len(s, "from", w, units, required=True)
        b = _len(s, "to", w, units, required=True)
        dia = _pos(s, "diameter", "length", w, units, required=True)
        bore = _len(s, "bore", w, units) if s.get("bore") not in (None, 0) else None
        fil = _len(s, "fillet", w, units) if "fillet" in s else None
        if not b > a:
            raise InputError(f"{w}.to", s["to"], "must be beyond the segment's from", _unit(s["to"], units, "length"))
        expected = 0.0 if not out else out[-1].end
        if abs(a - expected) > GAP_TOL * length:
            where = "the left end (0)" if not out else f"where shaft.segments[{i - 1}] ends"
            raise InputError(f"{w}.from", s["from"], f"must start {where}: the segments cover the shaft "
                             "in order, without gaps or overlaps", _unit(s["from"], units, "length"))
        if b > length * (1 + GAP_TOL):
            raise InputError(f"{w}.to", s["to"], "is beyond the shaft's length", _unit(s["to"], units, "length"))
        if bore is not None and not 0 < bore < dia:
            raise InputError(f"{w}.bore", s["bore"], "must be positive and smaller than the diameter",
                             _unit(s["bore"], units, "length"))
        if fil is not None:
            if not fil > 0:
                raise InputError(f"{w}.fillet", s["fillet"], "must be positive", _unit(s["fillet"], units, "length"))
            if not out or out[-1].diameter == dia:
                raise InputError(f"{w}.fillet", s["fillet"], "is a shoulder fillet and needs a step in diameter "
                                 "where this segment begins", _unit(s["fillet"], units, "length"))
            if fil > b - a:
                raise InputError(f"{w}.fillet", s["fillet"], "is longer than the segment",
                                 _unit(s["fillet"], units, "length"))
        sec, mats = segment_section(s, w, units, parse_section) if "section" in s else (None, ())
        if sec is not None:
            check_round(sec, dia, f"{w}.diameter", s["diameter"], _unit(s["diameter"], units, "length"))
        out.append(Segment(a, min(b, length), dia, bore, fil, sec, mats))
    if out and abs(out[-1].end - length) > GAP_TOL * length:
        raise InputError(f"shaft.segments[{len(out) - 1}].to", raw[-1]["to"], "must end at the shaft's length: the "
                         "segments cover the whole shaft", _unit(raw[-1]["to"], units, "length"))
    return out


def uniform_composite(length: float, section, materials) -> Segment:
    """The one segment of a shaft that is the case's composite [section] all along."""
    return Segment(0.0, length, outer_diameter(section), None, None, section, tuple(materials))


def _groove(g, i, sh: Shaft, units) -> Groove:
    w = f"shaft.grooves[{i}]"
    _known(g, _GROOVE, w)
    at = _at(g, w, sh.length, units)
    width = _pos(g, "width", "length", w, units, required=True)
    depth = _pos(g, "depth", "length", w, units, required=True)
    radius = _pos(g, "radius", "length", w, units, required=True)
    if radius > width / 2 * (1 + GAP_TOL):
        raise InputError(f"{w}.radius", g["radius"], "is more than half the groove's width",
                         _unit(g["radius"], units, "length"))
    seg = sh.segment_at(at)
    if seg is not None:
        wall = (seg.diameter - (seg.bore or 0.0)) / 2
        if not depth < wall:
            raise InputError(f"{w}.depth", g["depth"], "cuts through the shaft's wall there",
                             _unit(g["depth"], units, "length"))
    return Groove(at, width, depth, radius)


def _supports(d, length, units) -> list[Support]:
    raw = d.get("supports")
    if raw is None:
        raise InputError("shaft.supports", None, "is required: give the bearings, e.g. [{ at = 20 }, { at = 380 }]")
    items = _table_list(raw, "shaft.supports")
    if len(items) < 2:
        raise InputError("shaft.supports", raw, "needs at least two supports (bearings as simple supports)")
    out = []
    for i, s in enumerate(items):
        w = f"shaft.supports[{i}]"
        _known(s, _SUPPORT, w)
        at = _at(s, w, length, units)
        k = _pos(s, "stiffness", "stiffness", w, units) if "stiffness" in s else None
        name = _name(s, w)
        bearing = s.get("bearing")
        if bearing is not None and bearing not in BEARING_TYPES:
            raise InputError(f"{w}.bearing", bearing, f"unknown bearing type; use one of {', '.join(BEARING_TYPES)}")
        if any(abs(at - o.at) <= GAP_TOL * length for o in out):
            raise InputError(f"{w}.at", s["at"], "is where another support already is", _unit(s["at"], units, "length"))
        out.append(Support(at, k, name, bearing, parse_rating(s, w, units, bearing)))
    return out


def _load(x, i, length, units) -> ShaftLoad:
    w = f"shaft.loads[{i}]"
    if not isinstance(x, dict):
        raise InputError(w, x, "must be a table")
    kind = x.get("kind", "point")
    if kind not in _LOAD_KEYS:
        raise InputError(f"{w}.kind", kind, "must be \"point\", \"gear\", \"pulley\" or \"sprocket\"")
    _known(x, _LOAD_KEYS[kind], w)
    at = _at(x, w, length, units)
    name = _name(x, w)
    torque = _num(x, "torque", "moment", w, units, required=kind != "point") if "torque" in x or kind != "point" else 0.0
    mass = _nonneg(x, "mass", "mass", w, units) if "mass" in x else None
    inertia = _nonneg(x, "inertia", "mass_inertia", w, units) if "inertia" in x else None
    common = dict(at=at, kind=kind, name=name, torque=torque, mass=mass, inertia=inertia)
    if kind == "point":
        force = _pair(x, "force", "force", w, units) if "force" in x else (0.0, 0.0)
        moment = _pair(x, "moment", "moment", w, units) if "moment" in x else (0.0, 0.0)
        axial = _num(x, "axial", "force", w, units) if "axial" in x else 0.0
        return ShaftLoad(force=force, axial=axial, moment=moment, **common)
    if kind == "gear":
        d = _pos(x, "pitch_diameter", "length", w, units, required=True)
        phi = _angle(_req(x, "pressure_angle", w), f"{w}.pressure_angle")
        if not 0 < phi < 45:
            raise InputError(f"{w}.pressure_angle", x["pressure_angle"], "must lie between 0 and 45 degrees (20 is usual)")
        psi = _angle(x.get("helix_angle", 0.0), f"{w}.helix_angle")
        if not 0 <= psi < 60:
            raise InputError(f"{w}.helix_angle", x["helix_angle"], "must lie between 0 (spur) and 60 degrees")
        hand = x.get("hand")
        if psi > 0 and hand not in ("right", "left"):
            raise InputError(f"{w}.hand", hand, "must be \"right\" or \"left\" for a helical gear (it sets the "
                             "direction of the thrust)")
        if psi == 0 and hand is not None and hand not in ("right", "left"):
            raise InputError(f"{w}.hand", hand, "must be \"right\" or \"left\"")
        mesh = _angle(_req(x, "mesh_angle", w), f"{w}.mesh_angle")
        return ShaftLoad(gear=Gear(d, phi, psi, hand if psi > 0 else None, mesh), **common)
    d = _pos(x, "diameter", "length", w, units, required=True)
    pull = _angle(_req(x, "pull_angle", w), f"{w}.pull_angle")
    if kind == "pulley":
        r = to_si(_req(x, "tension_ratio", w), "dimensionless", f"{w}.tension_ratio", None)
        if not r > 1:
            raise InputError(f"{w}.tension_ratio", x["tension_ratio"], "must be more than 1 (tight side over slack side)")
    else:
        r = math.inf
    return ShaftLoad(pulley=Pulley(d, r, pull), **common)


def _torque_balance(loads: list[ShaftLoad], raw: list) -> None:
    torques = [ld.torque for ld in loads]
    if not torques:
        return
    big = max(abs(t) for t in torques)
    total = math.fsum(torques)
    if big > 0 and abs(total) > TORQUE_BALANCE_TOL * big:
        shown = [x.get("torque", 0) for x in raw]
        raise InputError("shaft.loads[*].torque", shown, "do not balance: the torques put into the shaft must sum to "
                         f"zero (they sum to {total:.6g} N·m); give the torque taken out as negative")


def _station(s, i, sh: Shaft, units, parse_section, feature_lengths=None) -> Station:
    w = f"shaft.sections[{i}]"
    _known(s, _STATION, w)
    at = _at(s, w, sh.length, units)
    check_composite_station(s, w, sh, at, STATION_KEYS)
    st = Station(at=at, name=_name(s, w), raw=dict(s))
    if "section" in s:
        if not isinstance(s["section"], dict):
            raise InputError(f"{w}.section", s["section"], "must be a table with the keys of [section]")
        try:
            st.section = parse_section(s["section"], units, st.geometry)
        except InputError as exc:
            if exc.field.startswith("section"):
                raise InputError(f"{w}.{exc.field}", exc.value, exc.reason, exc.unit) from None
            raise
        seg = sh.segment_at(at)
        d_given = s["section"].get("diameter")
        if seg is not None and d_given is not None:
            dia = to_si(d_given, "length", f"{w}.section.diameter", units)
            if abs(dia - seg.diameter) > 1e-6 * seg.diameter:
                raise InputError(f"{w}.section.diameter", d_given, "is not the diameter of the shaft's segment at this "
                                 "station", _unit(d_given, units, "length"))
    if "fatigue" in s:
        f = s["fatigue"]
        _known(f, _STATION_FATIGUE, f"{w}.fatigue")
        for key in ("kt_bending", "kts_torsion"):
            got = chart_factor(f, key, f"{w}.fatigue")
            if got is not None:
                st.fatigue[key], st.fatigue[f"{key}_source"] = got
            elif f"{key}_source" in f:
                raise InputError(f"{w}.fatigue.{key}_source", f[f"{key}_source"], f"is given without {key}")
        if "notch_radius" in f:
            st.fatigue["notch_radius"] = _pos(f, "notch_radius", "length", f"{w}.fatigue", units)
    _place_feature(s, w, st, sh, units, feature_lengths)
    if "segment" in s:  # a keyseat end or a cross hole, studied in 3-D (shaft_segment.py)
        st.segment = parse_station_segment(s, w, st, units, feature_lengths)
    if STATION_KEYS & set(s):
        seg = sh.segment_at(at)
        st.checklist = parse_station_checklist(s, w, units, st.section, seg.diameter if seg else None, None)
        fit = st.checklist.fit
        if fit is not None and fit.kt_bending is not None:  # the press fit's chart factor is the station's Kt
            if "kt_bending" in st.fatigue:
                raise InputError(f"{w}.fit.kt_bending", s["fit"]["kt_bending"], f"is also given as {w}.fatigue.kt_bending: "
                                 "give it once")
            st.fatigue["kt_bending"], st.fatigue["kt_bending_source"] = fit.kt_bending, fit.kt_bending_source
    return st


def _place_feature(s: dict, w: str, st: Station, sh: Shaft, units, feature_lengths) -> None:
    """Where along the shaft the station's feature with a length lies: ``Station.extent``. The
    longest feature of the section counts (the section, all its features, is checked over it); it is
    centred on ``at`` unless ``feature_from`` gives its start. Refused: ``feature_from`` without such a
    feature, a station off its own feature, a feature running off the shaft, across a step in diameter
    or over a groove (the station's section does not hold there)."""
    got = []
    if "section" in s and feature_lengths is not None:
        try:
            got = feature_lengths(s["section"], units)
        except InputError as exc:
            raise InputError(f"{w}.{exc.field}", exc.value, exc.reason, exc.unit) from None
    if not got:
        if "feature_from" in s:
            raise InputError(f"{w}.feature_from", s["feature_from"], "is given, but the station's section has no "
                             "feature with a length (a keyway, flat or cut with length =, or a spline's length =)",
                             _unit(s["feature_from"], units, "length"))
        return
    fld, ell = max(got, key=lambda x: x[1])
    len_field = f"{w}.{fld}.length"
    raw_len = s["section"] if fld == "section" else _raw_feature(s["section"], fld)
    shown = raw_len.get("length") if isinstance(raw_len, dict) else None
    tol = GAP_TOL * sh.length
    if "feature_from" in s:
        z0 = _len(s, "feature_from", w, units)
        if not z0 - tol <= st.at <= z0 + ell + tol:
            raise InputError(f"{w}.feature_from", s["feature_from"], "puts the feature where the station is not: the "
                             "station's at must lie on its own feature (from feature_from to feature_from + length)",
                             _unit(s["feature_from"], units, "length"))
    else:
        z0 = st.at - ell / 2
    z1 = z0 + ell
    where = "centred on the station" if "feature_from" not in s else "from feature_from"
    if z0 < -tol or z1 > sh.length + tol:
        raise InputError(len_field, shown, f"runs off the shaft ({where}, the feature would span "
                         f"{_where(z0, units)} to {_where(z1, units)} of a {_where(sh.length, units)} shaft): "
                         "shorten it or give feature_from", _unit(shown, units, "length"))
    z0, z1 = max(z0, 0.0), min(z1, sh.length)
    for j in range(1, len(sh.segments)):
        a, b = sh.segments[j - 1], sh.segments[j]
        if a.diameter != b.diameter and z0 + tol < b.start < z1 - tol:
            raise InputError(len_field, shown, f"runs across the step in diameter at {_where(b.start, units)} "
                             f"({where}): the station's section does not hold beyond it; shorten it or give feature_from",
                             _unit(shown, units, "length"))
    for j, g in enumerate(sh.grooves):
        if g.at + g.width / 2 > z0 + tol and g.at - g.width / 2 < z1 - tol:
            raise InputError(len_field, shown, f"runs over the groove shaft.grooves[{j}] ({where}): the station's "
                             "section does not hold there; shorten it or give feature_from", _unit(shown, units, "length"))
    st.extent, st.extent_field = (z0, z1), len_field


def _raw_feature(sec: dict, fld: str):
    """The case-file table of ``section.keyways[2]`` (a feature field of parse_feature_lengths)."""
    key, _, idx = fld.removeprefix("section.").partition("[")
    items = sec.get(key)
    return items[int(idx.rstrip("]"))] if isinstance(items, list) else None


def _where(v: float, units) -> str:
    """A position for a refusal's text, in the case's units."""
    return f"{from_si(v, 'length', units):.6g} {units.label('length')}" if units is not None else f"{v:.6g} m"


def check_with_case(sh: Shaft, raw_loads: dict, material) -> None:
    """What the layout asks of the rest of the case: section loads come from the layout, not from
    [loads] (only ``rotating`` may be given there); at least one station is checked; a rotating shaft's
    bending alternates, so the fatigue check needs the ultimate strength where strengths are given."""
    for k, v in (raw_loads or {}).items():
        if k != "rotating":
            raise InputError(f"loads.{k}", v if not isinstance(v, dict) else None, "cannot be given with [shaft]: "
                             "the layout gives each station its loads (put the load in [[shaft.loads]])")
    if sh.factors_only:
        return  # the shoulder and groove factors only (Kt, Kts of each feature): no beam, no station checks
    if not sh.stations:
        raise InputError("shaft.sections", None, "is required with [shaft]: name at least one station to check, "
                         "e.g. [[shaft.sections]] at = ... (without loads and stations, a layout with shoulders or "
                         "grooves gives their factors only)")
    if sh.segments and all(s.section is not None for s in sh.segments):
        return  # every segment composite: each region names its own material
    if material.elastic_modulus is None:
        raise InputError("material.elastic_modulus", None, "is needed with [shaft]: the beam's deflections, slopes "
                         "and critical speeds depend on it")
    if material.shear_modulus is None:
        raise InputError("material.poisson", None, "is needed with [shaft] (or give shear_modulus): the beam's shear "
                         "deformation depends on it")
    gives_strength = material.yield_strength is not None or material.endurance_limit is not None
    if sh.rotating and gives_strength and material.kind == "ductile" and material.ultimate is None:
        raise InputError("material.ultimate", None, "is needed: the shaft rotates, so its bending alternates, and the "
                         "fatigue check (Se' = 0.5·Sut, Goodman, Gerber) cannot be made without it")


# ----------------------------------------------------------------------------- helpers


def _req(d: dict, key: str, where: str):
    if key not in d:
        raise InputError(f"{where}.{key}", None, "is required")
    return d[key]


def _table_list(v, name) -> list:
    if not isinstance(v, list) or not all(isinstance(x, dict) for x in v):
        raise InputError(name, v, "must be a list of tables")
    return v


def _unit(raw, units, dim):
    return units.label(dim) if units is not None and isinstance(raw, (int, float)) and not isinstance(raw, bool) else None


def _num(d, key, dim, where, units, required=False) -> float:
    v = _req(d, key, where) if required else d[key]
    return to_si(v, dim, f"{where}.{key}", units)


def _len(d, key, where, units, required=False) -> float:
    return _num(d, key, "length", where, units, required)


def _pos(d, key, dim, where, units, required=False) -> float:
    v = _num(d, key, dim, where, units, required)
    if not v > 0:
        raise InputError(f"{where}.{key}", d[key], "must be positive", _unit(d[key], units, dim))
    return v


def _nonneg(d, key, dim, where, units) -> float:
    v = _num(d, key, dim, where, units)
    if v < 0:
        raise InputError(f"{where}.{key}", d[key], "must not be negative", _unit(d[key], units, dim))
    return v


def _at(d, where, length, units) -> float:
    v = _len(d, "at", where, units, required=True)
    if not -GAP_TOL * length <= v <= length * (1 + GAP_TOL):
        raise InputError(f"{where}.at", d["at"], "is not on the shaft (positions run from 0 to the shaft's length)",
                         _unit(d["at"], units, "length"))
    return min(max(v, 0.0), length)


def _pair(d, key, dim, where, units) -> tuple[float, float]:
    v = d[key]
    if not isinstance(v, list) or len(v) != 2:
        raise InputError(f"{where}.{key}", v, "must be a pair [x, y]")
    return (to_si(v[0], dim, f"{where}.{key}[0]", units), to_si(v[1], dim, f"{where}.{key}[1]", units))


def _name(d, where) -> str:
    v = d.get("name", "")
    if not isinstance(v, str):
        raise InputError(f"{where}.name", v, "must be a string")
    return escape_text(v)

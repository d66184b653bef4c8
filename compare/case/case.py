"""Case files (TOML): read, check every field, convert to SI.

Schema (docs/case-files.md is the reference)::

    [case]      title, units ("mm-N-MPa" | "in-lbf-psi" | "in-lbf-ksi" | "m-N-Pa")
    [section]   shape = "round" | "keyed" | "custom" | "spline" | "dxf" | "step" | "brep" | "mesh", and its dimensions
    [loads]     torque, bending = [Mx, My], shear = [Vx, Vy], axial, the *_mean / *_alternating
                parts of each, rotating
    [material]  shear_modulus | elastic_modulus, poisson, yield, ultimate, ...
    [analysis]  fineness, accuracy, max_dofs, max_seconds, design_factor, materials
    [fatigue]   kt_bending (+ kt_bending_source), kts_torsion (+ kts_torsion_source), notch_radius
    [material.polymer], [service]   a polymer's own data and the service conditions (case/polymer.py)

Unknown keys are refused (a misspelt key silently ignored is a wrong answer). Every error is an
:class:`~fem.errors.InputError` naming the field and the value.
"""
from __future__ import annotations

import math
import os
import re
import stat
import sys
from dataclasses import dataclass, field, replace
from pathlib import Path

from classic._validity import OutOfRangeError
from classic.fatigue import surface_factor
from fem.errors import InputError, escape_text
from fem.geometry import Disk, Ellipse, Section, custom_section, polygon, rectangle, round_section

from .outlines import parse_file_shape, parse_spline
from .polymer import apply_polymer
from .shaft import Shaft, check_with_case, parse_shaft
from .shaft_checklist import check_fits_with_section
from .shapes import SHAPE_KEYS, parse_keyed, parse_shape
from .units import UnitSystem, from_si, to_si, unit_system
from .composite import apply_region_polymers, parse_composite
from .segment import parse_model, parse_segment
from .shaft_segment import build_station_segments
from .fields import angle as _angle, chart_factor, known as _known

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib


@dataclass
class Loads:
    """Section loads [N, N·m], SI. Steady values; ``mean``/``alternating`` hold the fatigue split
    where the case gives one (a missing mean is the steady value, a missing alternating part is 0;
    with ``rotating`` a bending load and a shear force fixed in space are fully reversed and may
    not be split). Alternating parts are amplitudes: a scalar is >= 0; a vector amplitude's
    components may have either sign (its direction matters, its overall sign does not)."""

    torque: float = 0.0
    bending: tuple[float, float] = (0.0, 0.0)  # (Mx, My)
    shear: tuple[float, float] | None = None  # (Vx, Vy) or None when not given
    axial: float = 0.0
    mean: dict = field(default_factory=dict)  # e.g. {"torque": 10.0, "bending": (0, 0)}
    alternating: dict = field(default_factory=dict)
    rotating: bool = False


@dataclass
class Material:
    name: str = ""
    shear_modulus: float | None = None
    elastic_modulus: float | None = None
    poisson: float | None = None
    yield_strength: float | None = None
    ultimate: float | None = None
    compressive_ultimate: float | None = None
    endurance_limit: float | None = None
    surface: str | None = None
    reliability: float | None = None
    temperature: float | None = None
    kind: str = "ductile"
    #: [material.polymer] read at the [service] conditions (compare/case/polymer.py PolymerAtService), or None
    polymer: object | None = None


@dataclass
class Analysis:
    fineness: float = 1.0
    accuracy: float = 1e-3
    max_dofs: int = 400_000
    max_seconds: float = 300.0  # refinement stops when the next step would start after this
    design_factor: float | None = None
    materials: str | None = None  # path of a material table


@dataclass
class Fatigue:
    """Optional inputs of the fatigue check. Chart factors are for 3-D effects a 2-D section model
    cannot show (keyseat ends, shoulders); each needs the source it was read from."""

    kt_bending: float | None = None
    kt_bending_source: str | None = None
    kts_torsion: float | None = None
    kts_torsion_source: str | None = None
    notch_radius: float | None = None  # [m], for the notch sensitivity; default: the keyway fillet
    notch_radius_source: str | None = None  # where notch_radius came from, when not the user's fatigue table


@dataclass
class Case:
    title: str
    units: UnitSystem | None
    section: Section
    loads: Loads
    material: Material
    analysis: Analysis
    path: Path | None = None
    fatigue: Fatigue = field(default_factory=Fatigue)
    #: (case-file field, length along the shaft [m]) of the features given a ``length``
    feature_lengths: list = field(default_factory=list)
    expected: dict = field(default_factory=dict)  # [expected] of a verification case: {quantity: SI value}
    shaft: Shaft | None = None  # the [shaft] layout (compare/case/shaft.py), if the case gives one
    #: every resolved section dimension (SI) with where it came from: results.json section.geometry
    geometry: dict = field(default_factory=dict)
    #: the regions' materials of a composite section (compare/case/composite.py), in region order
    region_materials: list = field(default_factory=list)
    #: the [segment] of a 3-D segment study (compare/case/segment.py, fem/solid.Segment), if the case gives one
    segment: object = None
    #: the mirror symmetry the segment study must use (segment.model: 0 whole, 1 half, 2 quarter); None: the
    #: smallest model the features allow
    segment_symmetry: int | None = None


_TOP = {"case", "section", "loads", "material", "analysis", "expected", "fatigue", "shaft", "service",
        "sweep", "segment"}  # [sweep]: read by `shaftcheck sweep` (compare/sweep.py), not by a single run
_CASE = {"title", "units", "description", "source"}
_LOAD_SCALARS = {"torque": "moment", "axial": "force"}
_LOAD_VECTORS = {"bending": "moment", "shear": "force"}
_MATERIAL = {
    "name": None, "shear_modulus": "stress", "elastic_modulus": "stress", "poisson": "dimensionless",
    "yield": "stress", "ultimate": "stress", "compressive_ultimate": "stress",
    "endurance_limit": "stress", "surface": None, "reliability": "dimensionless",
    "temperature": "temperature", "kind": None,
}
_ANALYSIS = {"fineness", "accuracy", "max_dofs", "max_seconds", "design_factor", "materials"}
_FATIGUE = {"kt_bending", "kt_bending_source", "kts_torsion", "kts_torsion_source", "notch_radius"}
#: Quantities an [expected] table may hold (verification cases), with their dimension.
EXPECTED_QUANTITIES = {"torsion.J": "second_moment", "torsion.tau_max": "stress", "shear.tau_max": "stress",
                       "shear.kappa_x": "dimensionless", "shear.kappa_y": "dimensionless"}
#: Case and material files are read only up to this size: a real one is a few kB.
MAX_FILE_BYTES = 1_000_000
#: G = E/(2(1 + ν)) holds for an isotropic linear-elastic solid (Timoshenko & Goodier, Theory of
#: Elasticity, 3rd ed., 1970, Sec. 6). Data sheets round each of E, G and ν to two or three figures,
#: which moves G by a few per cent at most; 5 % allows that and still catches E typed in place of G.
MODULI_TOLERANCE = 0.05
#: Absolute zero [°C] (the kelvin's definition: 0 K = −273.15 °C).
ABSOLUTE_ZERO_C = -273.15


def read_input_file(path: str | Path, field: str) -> str:
    """The text of a case or material file: a regular file of at most :data:`MAX_FILE_BYTES`,
    UTF-8. Anything else (a folder, a FIFO, a device such as /dev/zero, binary data) is refused
    with an :class:`InputError` naming ``field`` before more than that is read."""
    shown = str(path)
    try:
        st = os.stat(path)
    except OSError as exc:
        raise InputError(field, shown, f"cannot be read ({exc.strerror})") from None
    if not stat.S_ISREG(st.st_mode):
        what = "a folder" if stat.S_ISDIR(st.st_mode) else "not a regular file (a pipe, device or socket)"
        raise InputError(field, shown, f"is {what}; give a TOML file")
    if st.st_size > MAX_FILE_BYTES:
        raise InputError(field, shown, f"is {st.st_size} bytes, more than the {MAX_FILE_BYTES} a case or material file may have")
    try:
        fd = os.open(path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0))
        with os.fdopen(fd, "rb") as fh:
            if not stat.S_ISREG(os.fstat(fh.fileno()).st_mode):  # swapped since the stat above
                raise InputError(field, shown, "is not a regular file; give a TOML file")
            raw = fh.read(MAX_FILE_BYTES + 1)
    except OSError as exc:
        raise InputError(field, shown, f"cannot be read ({exc.strerror})") from None
    if len(raw) > MAX_FILE_BYTES:
        raise InputError(field, shown, f"is more than the {MAX_FILE_BYTES} bytes a case or material file may have")
    try:
        return raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        raise InputError(field, shown, f"is not UTF-8 text (byte {exc.start} cannot be read); is it a binary file?") from None


def parse_toml(text: str, field: str, shown: str) -> dict:
    """TOML text as a dict; malformed or pathologically nested input is an :class:`InputError`."""
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError(field, shown, f"is not valid TOML ({escape_text(str(exc))})") from None
    except RecursionError:
        raise InputError(field, shown, "is not usable TOML (arrays or tables nested too deeply)") from None


def load_case(path: str | Path) -> Case:
    path = Path(path)
    data = parse_toml(read_input_file(path, "case file"), "case file", str(path))
    case = parse_case(data, base_dir=path.parent)
    case.path = path
    return case


def parse_case(data: dict, base_dir: Path | None = None) -> Case:
    """A case from its TOML data; files the section names (``section.file``) are taken relative to
    ``base_dir`` (the case file's folder; the working directory when None)."""
    _known(data, _TOP, "")
    c = data.get("case", {})
    _known(c, _CASE, "case")
    units = unit_system(c.get("units"))
    title = _text(c.get("title", "untitled case"), "case.title")
    for key in ("description", "source"):
        if key in c:
            _text(c[key], f"case.{key}")
    geometry: dict = {}
    region_materials: list = []
    segment = segment_symmetry = None
    if "segment" in data:  # a 3-D segment study instead of a section
        for other in ("section", "shaft", "fatigue", "expected"):
            if other in data:
                raise InputError(other, None, "a [segment] case is studied on its own: leave [" + other + "] out")
        segment = parse_segment(data["segment"], units)
        segment_symmetry = parse_model(data["segment"].get("model"), segment, "segment.model")
        data = dict(data, section={"shape": "round", "diameter": f"{segment.d!r} m"})
    section = parse_section(data["section"], units, geometry, base_dir, region_materials) if "section" in data else None
    loads = parse_loads(data.get("loads", {}), units)
    composite = (section, region_materials) if section is not None and section.kind == "composite" else None
    shaft = (parse_shaft(data["shaft"], units, parse_section, loads.rotating, parse_feature_lengths, composite)
             if "shaft" in data else None)
    if "section" not in data and not (shaft is not None and shaft.segments):
        raise InputError("section", None, "is missing: every case describes a section (a [shaft] without "
                         "segments takes its diameter from [section])")
    section = section if section is not None else _shaft_section(shaft)
    material = parse_material(data.get("material", {}), units)
    if section.kind == "composite":  # each polymer region is read at [service] (compare/case/composite.py)
        apply_region_polymers(region_materials, data, units, _alternates(loads))
    else:
        apply_polymer(material, data, units, _alternates(loads) or (shaft is not None and shaft.rotating), shaft)
    analysis = parse_analysis(data.get("analysis", {}))
    fatigue = parse_fatigue(data.get("fatigue", {}), units)
    expected = parse_expected(data["expected"], units) if "expected" in data else {}
    _fatigue_needs_ultimate(loads, material, data.get("material", {}))
    if shaft is not None:
        check_with_case(shaft, data.get("loads", {}), material)
        check_fits_with_section(shaft, section, units)  # a press fit's hub on a shaft without segments
        build_station_segments(shaft, section, material)  # a station's 3-D feature, now that its diameter is known
    if section.kind == "composite":
        _composite_limits(data, loads, shaft)
    if segment is not None:
        _segment_limits(data, material)
    return Case(title, units, section, loads, material, analysis, fatigue=fatigue, expected=expected,
                feature_lengths=parse_feature_lengths(data.get("section", {}), units), shaft=shaft,
                geometry=geometry, region_materials=region_materials, segment=segment,
                segment_symmetry=segment_symmetry)


def _composite_limits(data: dict, loads: Loads, shaft) -> None:
    """What a composite section does not take (yet): said at once, naming the field."""
    if "material" in data:
        raise InputError("material", None, "a composite section names a material in each [[section.regions]] table; "
                         "leave [material] out")
    if "fatigue" in data:
        raise InputError("fatigue", None, "a composite section takes its fatigue data region by region "
                         "(section.regions[k].fatigue, ultimate, surface, polymer); leave [fatigue] out")


def _segment_limits(data: dict, material: Material) -> None:
    """What a [segment] case needs and does not take (yet): said at once, naming the field."""
    if material.poisson is None:
        raise InputError("material.poisson", None, "is needed: the 3-D stress concentration factors of a [segment] "
                         "depend on Poisson's ratio")
    if data.get("loads"):
        raise InputError("loads", None, "a [segment] case gives the stress concentration factors only (per unit "
                         "load); leave [loads] out")


def _shaft_section(shaft: Shaft) -> Section:
    """The case's section when [shaft] has segments and no [section]: the plain round of the first
    segment (each station is checked on its own section; see compare/case/shaft.py)."""
    seg = shaft.segments[0]
    return round_section(seg.diameter, seg.bore)


def parse_expected(d, units) -> dict:
    """The [expected] table of a verification case: published exact values, each with its unit."""
    _known(d, set(EXPECTED_QUANTITIES), "expected")
    if not d:
        raise InputError("expected", None, "is empty: give at least one exact value or leave the table out")
    return {k: to_si(v, EXPECTED_QUANTITIES[k], f"expected.{k}", None) for k, v in d.items()}


def _fatigue_needs_ultimate(loads: Loads, m: Material, raw: dict) -> None:
    """An alternating load on a ductile part whose case gives strengths but not the ultimate: the
    fatigue check (Se' = 0.5·Sut, Goodman, Gerber) cannot be made. Refused rather than left out."""
    alternating = _alternates(loads)
    gives_strength = m.yield_strength is not None or m.endurance_limit is not None
    if alternating and gives_strength and m.kind == "ductile" and m.ultimate is None:
        raise InputError("material.ultimate", None, "is needed: the loads alternate, and the fatigue check "
                         "(Se' = 0.5·Sut, Goodman, Gerber) cannot be made without it; give the minimum ultimate "
                         "tensile strength")


def _alternates(loads: Loads) -> bool:
    """The section's loads alternate (a given amplitude, or a bending load on a rotating shaft)."""
    return any(_nonzero(v) for v in loads.alternating.values()) or (
        loads.rotating and (_nonzero(loads.bending) or _nonzero(loads.shear)))


def _nonzero(v) -> bool:
    if v is None:
        return False
    if isinstance(v, tuple):
        return any(x != 0 for x in v)
    return v != 0


# ----------------------------------------------------------------------------- section


def parse_section(s: dict, units: UnitSystem | None, geometry: dict | None = None,
                  base_dir: Path | None = None, region_materials: list | None = None) -> Section:
    """The section, checked. A value refused by the geometry (which works in metres) is echoed as the
    user wrote it, with its unit, and lengths in the reason are given in the case's units.
    ``geometry``, if given, is filled with every resolved dimension (SI) and where it came from."""
    if not isinstance(s, dict):
        raise InputError("section", s, "must be a table: [section] with shape = \"round\", \"keyed\" or \"custom\"")
    try:
        if s.get("shape") == "composite":
            section, mats = parse_composite(s, units, _primitive, _text)
            if region_materials is not None:
                region_materials.extend(mats)
            if geometry is not None:
                geometry["shape"] = "composite"
            return section
        section, geo = _parse_section({k: v for k, v in s.items() if k != "nominal_diameter"}, units, base_dir)
        if "nominal_diameter" in s:
            nd = to_si(s["nominal_diameter"], "length", "section.nominal_diameter", units)
            if not nd > 0:
                raise InputError("section.nominal_diameter", nd, "must be a positive length")
            section = replace(section, nominal_diameter=nd)
        if section.nominal:
            geo["nominal_diameter"] = {"value": section.nominal, "from": "given" if "nominal_diameter" in s else
                                       _NOMINAL_DEFAULT.get(section.kind, "the shaft diameter")}
        if geometry is not None:
            geometry.update({"shape": section.kind, **geo})
        return section
    except InputError as exc:
        if not exc.field.startswith("section."):
            raise
        found, raw = _lookup(s, exc.field[len("section."):])
        if not found:
            raise
        unit = units.label("length") if units is not None and isinstance(raw, (int, float)) and not exc.field.endswith("angle") else None
        unit = exc.unit or unit  # a field of another dimension (a composite region's density) says its own
        raise InputError(exc.field, raw, _lengths_in(exc.reason, units), unit) from None


def _lookup(data, path: str):
    """(True, value) at a field path like ``keyways[0].depth`` or ``cut[2].disk.center[1]`` in the
    raw case data, else (False, None)."""
    node = data
    for part in re.findall(r"[^.\[\]]+|\[\d+\]", path):
        try:
            node = node[int(part[1:-1])] if part.startswith("[") else node[part]
        except (KeyError, IndexError, TypeError, ValueError):
            return False, None
    return True, node


def _lengths_in(reason: str, units: UnitSystem | None) -> str:
    """Lengths the geometry wrote in metres ("(radius 0.0142875 m)") in the case's length unit."""
    if units is None or units.length == "m":
        return reason

    def conv(m):
        return f"{from_si(float(m.group(1)), 'length', units):.6g} {units.label('length')}"

    return re.sub(r"(-?\d+(?:\.\d*)?(?:e[-+]?\d+)?) m\b", conv, reason)


_NOMINAL_DEFAULT = {"round": "the shaft diameter", "keyed": "the shaft diameter", "flatted": "the round diameter",
                    "cross_slot": "the shaft diameter", "square": "the size across flats (largest round bar inside)",
                    "hexagon": "the size across flats (largest round bar inside)"}


def _parse_section(s: dict, units: UnitSystem | None, base_dir: Path | None = None) -> tuple[Section, dict]:
    """The section and the record of its resolved dimensions (SI, with where each came from)."""
    shape = s.get("shape")
    if shape == "keyed":
        return parse_keyed(s, units)
    if isinstance(shape, str) and shape in SHAPE_KEYS:
        return parse_shape(s, units)
    if shape == "spline":  # the resolved dimensions travel on the section (fem.splines): results.py
        return parse_spline(s, units), {}
    if shape in ("dxf", "step", "brep", "mesh"):
        return parse_file_shape(s, units, base_dir, read_input_file), {}
    sec = _parse_plain(s, units)
    geo = {"diameter": {"value": sec.diameter, "from": "given"}} if sec.diameter else {}
    if sec.bore:
        geo["bore"] = {"value": sec.bore, "from": "given"}
    return sec, geo


def _parse_plain(s: dict, units: UnitSystem | None) -> Section:
    shape = s.get("shape")
    L = lambda key, v: to_si(v, "length", f"section.{key}", units)  # noqa: E731
    if shape == "round":
        _known(s, {"shape", "diameter", "bore"}, "section")
        return round_section(L("diameter", _req(s, "diameter", "section")), _opt_len(s, "bore", units))
    if shape == "custom":
        _known(s, {"shape", "add", "cut"}, "section")
        add = [_primitive(p, f"add[{i}]", units) for i, p in enumerate(_list(s.get("add"), "section.add"))]
        cut = [_primitive(p, f"cut[{i}]", units) for i, p in enumerate(_list(s.get("cut", []), "section.cut"))]
        return custom_section(add, cut)
    raise InputError("section.shape", shape, "must be \"round\", \"keyed\", \"flatted\", \"square\", \"hexagon\", "
                     "\"cross_slot\", \"custom\", \"composite\", \"spline\", \"dxf\", \"step\", \"brep\" or \"mesh\"")


def parse_feature_lengths(s: dict, units) -> list:
    """The optional ``length`` (along the shaft) of each keyway, flat and cut, and a spline's engaged
    length: [(feature field, metres)]; the length itself is ``<feature field>.length``."""
    out = []
    if s.get("shape") == "spline":
        if "length" in s:
            ln = to_si(s["length"], "length", "section.length", units)
            if not ln > 0:
                raise InputError("section.length", s["length"], "must be positive (the splined length along the shaft)")
            out.append(("section", ln))
        return out
    groups = {"keyed": [("keyways", s.get("keyways"))], "flatted": [("flats", s.get("flats"))]}.get(
        s.get("shape"), [("cut", s.get("cut"))])
    for key, items in groups:
        for i, item in enumerate(items if isinstance(items, list) else []):
            if isinstance(item, dict) and "length" in item:
                f = f"section.{key}[{i}].length"
                out.append((f"section.{key}[{i}]", to_si(item["length"], "length", f, units)))
                if not out[-1][1] > 0:
                    raise InputError(f, item["length"], "must be positive (the feature's length along the shaft)")
    return out


def _primitive(p, where: str, units):
    name = f"section.{where}"
    if isinstance(p, dict) and "length" in p:  # the feature's length along the shaft: parse_feature_lengths
        p = {k: v for k, v in p.items() if k != "length"}
    if not isinstance(p, dict) or len(p) != 1:
        raise InputError(name, p, "must be one of { disk = {...} }, { ellipse = {...} }, { rectangle = {...} }, { polygon = {...} }")
    kind, q = next(iter(p.items()))
    name = f"{name}.{kind}"
    if not isinstance(q, dict):
        raise InputError(name, q, "must be a table of parameters")
    L = lambda key, v: to_si(v, "length", f"{name}.{key}", units)  # noqa: E731

    def point(v, key):
        if not isinstance(v, (list, tuple)) or len(v) != 2:
            raise InputError(f"{name}.{key}", v, "must be [x, y]")
        return (L(f"{key}[0]", v[0]), L(f"{key}[1]", v[1]))

    rot = _angle(q.get("rotation", 0.0), f"{name}.rotation")
    if kind == "disk":
        _known(q, {"center", "radius"}, name)
        return Disk(point(q.get("center", [0, 0]), "center"), L("radius", _req(q, "radius", name)), label=name)
    if kind == "ellipse":
        _known(q, {"center", "semi_axes", "rotation"}, name)
        a = point(_req(q, "semi_axes", name), "semi_axes")
        return Ellipse(point(q.get("center", [0, 0]), "center"), a, rot, label=name)
    if kind == "rectangle":
        _known(q, {"center", "size", "rotation", "fillet"}, name)
        size = point(_req(q, "size", name), "size")
        fil = L("fillet", q["fillet"]) if "fillet" in q else 0.0
        return rectangle(point(q.get("center", [0, 0]), "center"), size, rot, fil, name=name)
    if kind == "polygon":
        _known(q, {"points", "rotation", "fillet", "fillets"}, name)
        pts = _req(q, "points", name)
        if not isinstance(pts, list) or len(pts) < 3:
            raise InputError(f"{name}.points", pts, "needs at least three [x, y] points")
        pts = [point(v, f"points[{i}]") for i, v in enumerate(pts)]
        if "fillet" in q and "fillets" in q:
            raise InputError(f"{name}.fillets", q["fillets"], "give either fillet (all corners) or fillets (one per point), not both")
        if "fillets" in q:
            fl = q["fillets"]
            if not isinstance(fl, list):
                raise InputError(f"{name}.fillets", fl, "must be a list with one radius per point")
            fillets = tuple(L(f"fillets[{i}]", v) for i, v in enumerate(fl))
        elif "fillet" in q:
            fillets = (L("fillet", q["fillet"]),) * len(pts)
        else:
            fillets = ()
        return polygon(pts, rot, fillets, name=name)
    raise InputError(name.rsplit(".", 1)[0], kind, "unknown primitive; use disk, ellipse, rectangle or polygon")


# ----------------------------------------------------------------------------- loads, material, analysis


def parse_loads(d: dict, units) -> Loads:
    keys = set()
    for k in list(_LOAD_SCALARS) + list(_LOAD_VECTORS):
        keys |= {k, f"{k}_mean", f"{k}_alternating"}
    _known(d, keys | {"rotating"}, "loads")
    out = Loads()

    def value(key, dim, vector):
        v = d[key]
        if vector:
            if not isinstance(v, list) or len(v) != 2:
                raise InputError(f"loads.{key}", v, "must be a pair [x, y]")
            return (to_si(v[0], dim, f"loads.{key}[0]", units), to_si(v[1], dim, f"loads.{key}[1]", units))
        return to_si(v, dim, f"loads.{key}", units)

    for key, dim in list(_LOAD_SCALARS.items()) + list(_LOAD_VECTORS.items()):
        vector = key in _LOAD_VECTORS
        if key in d:
            setattr(out, key, value(key, dim, vector))
        for part, store in (("mean", out.mean), ("alternating", out.alternating)):
            k = f"{key}_{part}"
            if k in d:
                store[key] = value(k, dim, vector)
        alt = out.alternating.get(key)
        if alt is not None and not vector and alt < 0:  # a vector amplitude's direction may point anywhere
            raise InputError(f"loads.{key}_alternating", d[f"{key}_alternating"], "is an amplitude and must not be negative")
    rot = d.get("rotating", False)
    if not isinstance(rot, bool):
        raise InputError("loads.rotating", rot, "must be true or false")
    out.rotating = rot
    if rot:
        for key in ("bending_mean", "bending_alternating", "shear_mean", "shear_alternating"):
            if key in d:
                raise InputError(f"loads.{key}", d[key], "cannot be given with rotating = true: a load fixed in space "
                                 f"on a rotating shaft is fully reversed; give its size as loads.{key.split('_')[0]}")
    return out


def parse_material(d: dict, units) -> Material:
    _known(d, set(_MATERIAL) | {"polymer"}, "material")  # [material.polymer]: compare/case/polymer.py
    m = Material()
    for key, dim in _MATERIAL.items():
        if key not in d:
            continue
        attr = "yield_strength" if key == "yield" else key
        v = d[key]
        if dim is None:
            setattr(m, attr, _text(v, f"material.{key}"))
            continue
        setattr(m, attr, to_si(v, dim, f"material.{key}", units))
    for key in ("shear_modulus", "elastic_modulus", "yield", "ultimate", "compressive_ultimate", "endurance_limit"):
        attr = "yield_strength" if key == "yield" else key
        v = getattr(m, attr)
        if v is not None and not v > 0:
            raise InputError(f"material.{key}", d[key], "must be positive")
    if m.poisson is not None and not (-1.0 < m.poisson < 0.5):
        raise InputError("material.poisson", d["poisson"], "must lie between -1 and 0.5")
    check_strengths(m, d, "material", units)
    if m.temperature is not None and m.temperature < ABSOLUTE_ZERO_C:
        raise InputError("material.temperature", d["temperature"], "is below absolute zero (−273.15 °C)",
                         "°C" if isinstance(d["temperature"], (int, float)) else None)
    if m.surface is not None:
        check_surface(m.surface, "material.surface")
    if m.shear_modulus is not None and m.elastic_modulus is not None and m.poisson is not None:
        G = m.elastic_modulus / (2 * (1 + m.poisson))
        if abs(m.shear_modulus - G) > MODULI_TOLERANCE * G:
            raise InputError("material.shear_modulus", d["shear_modulus"],
                             f"does not agree with elastic_modulus and poisson: E/(2(1 + ν)) = "
                             f"{_stress_text(G, units)}, {abs(m.shear_modulus / G - 1):.0%} away (at most "
                             f"{MODULI_TOLERANCE:.0%} allowed for rounding); give two of the three",
                             _stress_unit(d["shear_modulus"], units))
    if m.shear_modulus is None and m.elastic_modulus is not None and m.poisson is not None:
        m.shear_modulus = m.elastic_modulus / (2 * (1 + m.poisson))
    if m.elastic_modulus is None and m.shear_modulus is not None and m.poisson is not None:
        m.elastic_modulus = 2 * m.shear_modulus * (1 + m.poisson)
    if m.kind not in ("ductile", "brittle"):
        raise InputError("material.kind", m.kind, "must be \"ductile\" or \"brittle\"")
    if m.reliability is not None and not (0 < m.reliability < 1):
        raise InputError("material.reliability", d["reliability"], "must be a fraction between 0 and 1 (e.g. 0.99)")
    return m


def check_strengths(m: Material, raw: dict, where: str, units) -> None:
    """Strengths that contradict each other: yield or endurance limit above the ultimate."""
    u = m.ultimate
    if u is None:
        return
    for key, attr in (("yield", "yield_strength"), ("endurance_limit", "endurance_limit")):
        v = getattr(m, attr)
        if v is not None and v > u:
            raise InputError(f"{where}.{key}", raw[key], f"is above the ultimate strength ({_stress_text(u, units)}); "
                             "a tensile strength cannot exceed the ultimate", _stress_unit(raw[key], units))


def check_surface(v: str, field: str) -> None:
    """The surface finish must be one the Marin surface factor knows (Shigley 9th ed., Table 6-2)."""
    try:
        surface_factor(500.0, v)
    except OutOfRangeError:
        raise InputError(field, v, "unknown surface; use ground, machined, cold-drawn, hot-rolled or as-forged") from None


def _stress_text(v: float, units) -> str:
    if units is None:
        return f"{v / 1e6:.6g} MPa"
    return f"{from_si(v, 'stress', units):.6g} {units.label('stress')}"


def _stress_unit(raw, units):
    return units.label("stress") if units is not None and isinstance(raw, (int, float)) else None


#: Bounds of ``analysis.fineness`` / ``--fineness``. Below 0.25 the global size is more than a
#: fifth of the section and the study's coarsest mesh (r² coarser) has under three elements across
#: it: the boundary and curvature sizes then decide the mesh, and the study's meshes stop being
#: refined by the ratio. Above 16 (over 300 elements across at the start, before any adaptive
#: refinement) the first mesh alone passes the default max_dofs on a keyed section; the adaptive
#: refinement, not the starting density, is the way to a finer answer.
FINENESS_RANGE = (0.25, 16.0)


def check_fineness(name: str, value, as_written=None) -> float:
    """``value`` if it is within :data:`FINENESS_RANGE`, else an InputError naming ``name``."""
    lo, hi = FINENESS_RANGE
    try:
        v = float(value)
    except (TypeError, ValueError):
        v = math.nan
    if not (math.isfinite(v) and lo <= v <= hi):
        raise InputError(name, value if as_written is None else as_written,
                         f"must be between {lo:g} and {hi:g} (elements across the section relative to the default)")
    return v


def parse_analysis(d: dict) -> Analysis:
    _known(d, _ANALYSIS, "analysis")
    a = Analysis()
    if "fineness" in d:
        a.fineness = to_si(d["fineness"], "dimensionless", "analysis.fineness", None)
        check_fineness("analysis.fineness", a.fineness, d["fineness"])
    if "accuracy" in d:
        a.accuracy = to_si(d["accuracy"], "dimensionless", "analysis.accuracy", None)
        if not 0 < a.accuracy < 0.5:
            raise InputError("analysis.accuracy", d["accuracy"], "must be a small positive fraction, e.g. \"0.1 %\"")
    if "max_dofs" in d:
        v = d["max_dofs"]
        if not isinstance(v, int) or isinstance(v, bool) or v < 1000:
            raise InputError("analysis.max_dofs", v, "must be a whole number of at least 1000")
        a.max_dofs = v
    if "max_seconds" in d:
        v = d["max_seconds"]
        if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v) or not v > 0:
            raise InputError("analysis.max_seconds", v, "must be a positive number of seconds")
        a.max_seconds = float(v)
    if "design_factor" in d:
        v = to_si(d["design_factor"], "dimensionless", "analysis.design_factor", None)
        if not v >= 1:
            raise InputError("analysis.design_factor", d["design_factor"], "must be at least 1")
        a.design_factor = v
    if "materials" in d:
        if not isinstance(d["materials"], str) or not d["materials"].strip() or "\0" in d["materials"]:
            raise InputError("analysis.materials", d["materials"], "must be the path of a material table")
        a.materials = d["materials"]
    return a


def parse_fatigue(d: dict, units) -> Fatigue:
    _known(d, _FATIGUE, "fatigue")
    f = Fatigue()
    for key in ("kt_bending", "kts_torsion"):
        if key not in d:
            if f"{key}_source" in d:
                raise InputError(f"fatigue.{key}_source", d[f"{key}_source"], f"is given without fatigue.{key}")
            continue
        v, src = chart_factor(d, key, "fatigue")
        setattr(f, key, v)
        setattr(f, f"{key}_source", src)
    if "notch_radius" in d:
        f.notch_radius = to_si(d["notch_radius"], "length", "fatigue.notch_radius", units)
        if not f.notch_radius > 0:
            raise InputError("fatigue.notch_radius", d["notch_radius"], "must be positive")
    return f


# ----------------------------------------------------------------------------- helpers


def _req(d: dict, key: str, where: str):
    if key not in d:
        raise InputError(f"{where}.{key}", None, "is required")
    return d[key]


def _opt_len(s, key, units):
    if key not in s or s[key] in (0, None):
        return None
    return to_si(s[key], "length", f"section.{key}", units)


def _list(v, name):
    if not isinstance(v, list) or (name.endswith("add") and not v):
        raise InputError(name, v, "must be a non-empty list of primitives" if name.endswith("add") else "must be a list of primitives")
    return v


def _text(v, name) -> str:
    """A piece of user text (title, name, source): a string, with control characters escaped so it
    is safe to copy into results and print on a terminal."""
    if not isinstance(v, str):
        raise InputError(name, v, "must be a string")
    return escape_text(v)

"""Case files (TOML): read, check every field, convert to SI.

Schema (README, 'Case files', is the reference)::

    [case]      title, units ("mm-N-MPa" | "in-lbf-psi" | "in-lbf-ksi" | "m-N-Pa")
    [section]   shape = "round" | "keyed" | "custom", and its dimensions
    [loads]     torque, bending = [Mx, My], shear = [Vx, Vy], axial, the *_mean / *_alternating
                parts of each, rotating
    [material]  shear_modulus | elastic_modulus, poisson, yield, ultimate, ...
    [analysis]  fineness, accuracy, max_dofs, max_seconds, design_factor, materials
    [fatigue]   kt_bending (+ kt_bending_source), kts_torsion (+ kts_torsion_source), notch_radius

Unknown keys are refused (a misspelt key silently ignored is a wrong answer). Every error is an
:class:`~fem.errors.InputError` naming the field and the value.
"""
from __future__ import annotations

import math
import sys
from dataclasses import dataclass, field
from pathlib import Path

from fem.errors import InputError
from fem.geometry import Disk, Ellipse, Keyway, Section, custom_section, keyed_section, polygon, rectangle, round_section

from .units import UnitSystem, to_si, unit_system

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


_TOP = {"case", "section", "loads", "material", "analysis", "expected", "fatigue"}
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


def load_case(path: str | Path) -> Case:
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8")
    except OSError as exc:
        raise InputError("case file", str(path), f"cannot be read ({exc.strerror})") from None
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError("case file", str(path), f"is not valid TOML ({exc})") from None
    case = parse_case(data)
    case.path = path
    return case


def parse_case(data: dict) -> Case:
    _known(data, _TOP, "")
    c = data.get("case", {})
    _known(c, _CASE, "case")
    units = unit_system(c.get("units"))
    if "section" not in data:
        raise InputError("section", None, "is missing: every case describes a section")
    section = parse_section(data["section"], units)
    loads = parse_loads(data.get("loads", {}), units)
    material = parse_material(data.get("material", {}), units)
    analysis = parse_analysis(data.get("analysis", {}))
    fatigue = parse_fatigue(data.get("fatigue", {}), units)
    return Case(str(c.get("title", "untitled case")), units, section, loads, material, analysis, fatigue=fatigue)


# ----------------------------------------------------------------------------- section


def parse_section(s: dict, units: UnitSystem | None) -> Section:
    shape = s.get("shape")
    L = lambda key, v: to_si(v, "length", f"section.{key}", units)  # noqa: E731
    if shape == "round":
        _known(s, {"shape", "diameter", "bore"}, "section")
        return round_section(L("diameter", _req(s, "diameter", "section")), _opt_len(s, "bore", units))
    if shape == "keyed":
        _known(s, {"shape", "diameter", "bore", "keyways"}, "section")
        d = L("diameter", _req(s, "diameter", "section"))
        kws = s.get("keyways")
        if not isinstance(kws, list) or not kws:
            raise InputError("section.keyways", kws, "a keyed section needs at least one [[section.keyways]] table")
        keyways = []
        for i, k in enumerate(kws):
            f = f"keyways[{i}]"
            if not isinstance(k, dict):
                raise InputError(f"section.{f}", k, "must be a table with width, depth, fillet, angle")
            _known(k, {"width", "depth", "fillet", "angle"}, f"section.{f}")
            keyways.append(Keyway(
                width=L(f"{f}.width", _req(k, "width", f"section.{f}")),
                depth=L(f"{f}.depth", _req(k, "depth", f"section.{f}")),
                fillet=L(f"{f}.fillet", k.get("fillet", 0.0)) if "fillet" in k else 0.0,
                angle=_angle(k.get("angle", 90.0), f"section.{f}.angle"),
            ))
        return keyed_section(d, keyways, _opt_len(s, "bore", units))
    if shape == "custom":
        _known(s, {"shape", "add", "cut"}, "section")
        add = [_primitive(p, f"add[{i}]", units) for i, p in enumerate(_list(s.get("add"), "section.add"))]
        cut = [_primitive(p, f"cut[{i}]", units) for i, p in enumerate(_list(s.get("cut", []), "section.cut"))]
        return custom_section(add, cut)
    raise InputError("section.shape", shape, "must be \"round\", \"keyed\" or \"custom\"")


def _primitive(p, where: str, units):
    name = f"section.{where}"
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
    _known(d, set(_MATERIAL), "material")
    m = Material()
    for key, dim in _MATERIAL.items():
        if key not in d:
            continue
        attr = "yield_strength" if key == "yield" else key
        v = d[key]
        if dim is None:
            if not isinstance(v, str):
                raise InputError(f"material.{key}", v, "must be a string")
            setattr(m, attr, v)
            continue
        setattr(m, attr, to_si(v, dim, f"material.{key}", units))
    for key in ("shear_modulus", "elastic_modulus", "yield", "ultimate", "compressive_ultimate", "endurance_limit"):
        attr = "yield_strength" if key == "yield" else key
        v = getattr(m, attr)
        if v is not None and not v > 0:
            raise InputError(f"material.{key}", d[key], "must be positive")
    if m.poisson is not None and not (-1.0 < m.poisson < 0.5):
        raise InputError("material.poisson", d["poisson"], "must lie between -1 and 0.5")
    if m.shear_modulus is None and m.elastic_modulus is not None and m.poisson is not None:
        m.shear_modulus = m.elastic_modulus / (2 * (1 + m.poisson))
    if m.elastic_modulus is None and m.shear_modulus is not None and m.poisson is not None:
        m.elastic_modulus = 2 * m.shear_modulus * (1 + m.poisson)
    if m.kind not in ("ductile", "brittle"):
        raise InputError("material.kind", m.kind, "must be \"ductile\" or \"brittle\"")
    if m.reliability is not None and not (0 < m.reliability < 1):
        raise InputError("material.reliability", d["reliability"], "must be a fraction between 0 and 1 (e.g. 0.99)")
    return m


def parse_analysis(d: dict) -> Analysis:
    _known(d, _ANALYSIS, "analysis")
    a = Analysis()
    if "fineness" in d:
        a.fineness = to_si(d["fineness"], "dimensionless", "analysis.fineness", None)
        from .accuracy import check_fineness  # noqa: PLC0415

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
        if isinstance(v, bool) or not isinstance(v, (int, float)) or not v > 0:
            raise InputError("analysis.max_seconds", v, "must be a positive number of seconds")
        a.max_seconds = float(v)
    if "design_factor" in d:
        v = to_si(d["design_factor"], "dimensionless", "analysis.design_factor", None)
        if not v >= 1:
            raise InputError("analysis.design_factor", d["design_factor"], "must be at least 1")
        a.design_factor = v
    if "materials" in d:
        if not isinstance(d["materials"], str):
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
        v = to_si(d[key], "dimensionless", f"fatigue.{key}", None)
        if not v >= 1:
            raise InputError(f"fatigue.{key}", d[key], "a stress-concentration factor is at least 1")
        src = d.get(f"{key}_source")
        if not isinstance(src, str) or not src.strip():
            raise InputError(f"fatigue.{key}_source", src, f"is required with fatigue.{key}: name the chart it was "
                             "read from (book, edition, figure)")
        setattr(f, key, v)
        setattr(f, f"{key}_source", src.strip())
    if "notch_radius" in d:
        f.notch_radius = to_si(d["notch_radius"], "length", "fatigue.notch_radius", units)
        if not f.notch_radius > 0:
            raise InputError("fatigue.notch_radius", d["notch_radius"], "must be positive")
    return f


# ----------------------------------------------------------------------------- helpers


def _known(d, allowed: set, where: str) -> None:
    if not isinstance(d, dict):
        raise InputError(where or "case file", d, "must be a table")
    for k in d:
        if k not in allowed:
            name = f"{where}.{k}" if where else k
            raise InputError(name, d[k] if not isinstance(d[k], dict) else None,
                             f"unknown key (expected one of: {', '.join(sorted(allowed))})")


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


def _angle(v, name) -> float:
    """Degrees: a plain number is degrees; a string may carry deg or rad."""
    if isinstance(v, (int, float)) and not isinstance(v, bool):
        return float(v)
    return math.degrees(to_si(v, "angle", name, None))

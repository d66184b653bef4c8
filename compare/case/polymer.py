"""A polymer's own data (``[material.polymer]``) and the service conditions (``[service]``): read, every
field checked, and the properties resolved at the service temperature, moisture state, load duration
and cycles (docs/polymer.md). No material data are built in: everything comes from the
user's points, and nothing is read outside them.

Schema::

    [material.polymer]
    source = "..."                   # where the data come from (text, required)
    illustrative = true              # say so when the values are invented
    [material.polymer.dry]           # and/or [material.polymer.conditioned]: one table per moisture state
    temperature = [-20, 23, 60, 80]  # °C, strictly increasing
    tensile_strength = [...]         # stress at each temperature (required)
    yield = [...]                    # optional: yield stress at each temperature
    elastic_modulus = [...]          # short-term modulus at each temperature (required)
    [[material.polymer.creep]]       # isochronous data: creep modulus against load duration
    temperature = 60                 # °C the curve was taken at
    moisture = "conditioned"         # dry | conditioned
    duration = [1, 10, 100, 1000]    # plain numbers in hours, or strings with a unit ("1 h", "1000 h")
    modulus = [...]                  # creep modulus (stress / strain at that duration)
    [[material.polymer.sn]]          # stress amplitude against cycles (fully reversed, R = -1)
    temperature = 60
    moisture = "conditioned"
    stress_ratio = -1
    cycles = [1e4, 1e5, 1e6, 1e7]
    amplitude = [...]

    [service]
    temperature = 60                 # °C (or material.temperature; both given must agree)
    moisture = "conditioned"         # dry | conditioned
    life = "8000 h"                  # how long the steady loads act and the part must last
    speed = "300 rpm"                # or [shaft] speed; or cycles = 1e7 directly
    cycles_per_revolution = 1        # optional (default 1: a rotating shaft's bending)

A region of a composite section can carry a :class:`PolymerData` too: :func:`parse_polymer` reads one
from any table and :func:`at_service` resolves it, neither depends on ``[material]``.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

from classic import polymer as cp
from classic._validity import OutOfRangeError
from fem.errors import InputError, escape_text

from .fields import known
from .units import to_si

MOISTURE_STATES = ("dry", "conditioned")
_POLYMER = {"source", "illustrative", "note", "dry", "conditioned", "creep", "sn"}
_STATE = {"temperature", "tensile_strength", "yield", "elastic_modulus"}
_CREEP = {"temperature", "moisture", "duration", "modulus", "note"}
_SN = {"temperature", "moisture", "stress_ratio", "cycles", "amplitude", "note"}
_SERVICE = {"temperature", "moisture", "life", "speed", "cycles", "cycles_per_revolution"}
#: [material] keys the polymer data replace: the strengths and moduli are read from the data at the
#: service conditions, so a second value would contradict them.
REPLACED = ("yield", "ultimate", "elastic_modulus", "shear_modulus", "endurance_limit", "compressive_ultimate")
#: How far a temperature may be from a curve's own and still be that curve's (°C): data sheets give
#: temperatures to the degree; this only absorbs the round-off of a unit conversion.
SAME_TEMPERATURE = 1e-6


@dataclass
class StateTable:
    """Strength and modulus against temperature in one moisture state (SI; °C)."""

    temperature: list[float]
    tensile_strength: list[float]
    elastic_modulus: list[float]
    yield_strength: list[float] | None = None


@dataclass
class Curve:
    """One creep curve (x: duration [s], y: modulus [Pa]) or one stress-life curve (x: cycles,
    y: amplitude [Pa]), taken at ``temperature`` [°C] in ``moisture``."""

    temperature: float
    moisture: str
    x: list[float]
    y: list[float]
    where: str  # the case-file field it was read from
    stress_ratio: float | None = None
    raw_temperature: object = None  # the temperature as written


@dataclass
class PolymerData:
    source: str
    illustrative: bool
    states: dict  # moisture state -> StateTable
    creep: list = field(default_factory=list)
    sn: list = field(default_factory=list)
    note: str | None = None
    where: str = "material.polymer"


@dataclass
class Service:
    """The conditions the check is made at (SI: °C, s, rad/s)."""

    temperature: float
    moisture: str
    life: float  # [s]
    cycles: float
    cycles_source: str
    speed: float | None = None
    cycles_per_revolution: float | None = None
    raw: dict = field(default_factory=dict)  # the fields as written, for refusals


@dataclass
class PolymerAtService:
    """The data read at the service conditions; every value says where it came from."""

    data: PolymerData
    service: Service
    poisson: float
    tensile_strength: float
    yield_strength: float | None
    elastic_modulus: float
    creep_modulus: float | None = None
    creep_source: str | None = None
    fatigue_strength: float | None = None
    fatigue_source: str | None = None
    sn_fits: list = field(default_factory=list)  # [{temperature, A, b, r2, n_min, n_max, S_f}]
    creep_curves: list = field(default_factory=list)  # [{temperature, modulus}]
    notes: list = field(default_factory=list)

    @property
    def shear_modulus(self) -> float:
        return self.elastic_modulus / (2 * (1 + self.poisson))

    @property
    def creep_shear_modulus(self) -> float | None:
        if self.creep_modulus is None:
            return None
        return self.creep_modulus / (2 * (1 + self.poisson))


# ----------------------------------------------------------------------------- reading


def _temperature(v, name) -> float:
    """°C: a plain number is °C; a string may carry its unit."""
    if isinstance(v, bool) or not isinstance(v, (int, float, str)):
        raise InputError(name, v, "must be a temperature (a plain number in °C, or e.g. \"60 degC\")")
    if isinstance(v, (int, float)):
        if not math.isfinite(v):
            raise InputError(name, v, "is not a finite number", "°C")
        t = float(v)
    else:
        t = to_si(v, "temperature", name, None)
    if t < -273.15:
        raise InputError(name, v, "is below absolute zero (−273.15 °C)", "°C" if not isinstance(v, str) else None)
    return t


def duration(v, name) -> float:
    """A load duration or a life [s]: a plain number is hours; a string may carry its unit."""
    if isinstance(v, (int, float)) and not isinstance(v, bool):
        if not (math.isfinite(v) and v > 0):
            raise InputError(name, v, "must be a positive duration (a plain number is hours)", "h")
        return float(v) * 3600.0
    t = to_si(v, "time", name, None)
    if not t > 0:
        raise InputError(name, v, "must be a positive duration")
    return t


def _list(d: dict, key: str, where: str, n: int | None = None) -> list:
    v = d.get(key)
    if not isinstance(v, list) or not v:
        raise InputError(f"{where}.{key}", v, "must be a non-empty list")
    if n is not None and len(v) != n:
        raise InputError(f"{where}.{key}", v, f"must have one value per temperature or point ({n}), not {len(v)}")
    return v


def _increasing(xs: list, raw: list, name: str) -> None:
    if len(xs) < 2:
        raise InputError(name, raw, "needs at least two points (a property is interpolated between them)")
    for a, b in zip(xs, xs[1:]):
        if not b > a:
            raise InputError(name, raw, "must increase strictly from point to point")


def _stresses(d, key, where, units, n) -> list[float]:
    raw = _list(d, key, where, n)
    out = [to_si(v, "stress", f"{where}.{key}[{i}]", units) for i, v in enumerate(raw)]
    for i, v in enumerate(out):
        if not v > 0:
            raise InputError(f"{where}.{key}[{i}]", raw[i], "must be positive")
    return out


def _moisture(v, name) -> str:
    if v not in MOISTURE_STATES:
        raise InputError(name, v, f"must be one of {', '.join(MOISTURE_STATES)}")
    return v


def parse_polymer(d, units, where: str = "material.polymer") -> PolymerData:
    """A polymer's data table as :class:`PolymerData` (SI); every field checked."""
    known(d, _POLYMER, where)
    src = d.get("source")
    if not isinstance(src, str) or not src.strip():
        raise InputError(f"{where}.source", src, "is required: say where the data come from (the supplier's data "
                         "sheet for the grade, the part's own tests, or that they are invented)")
    ill = d.get("illustrative", False)
    if not isinstance(ill, bool):
        raise InputError(f"{where}.illustrative", ill, "must be true or false")
    note = d.get("note")
    if note is not None and not isinstance(note, str):
        raise InputError(f"{where}.note", note, "must be a string")
    states = {}
    for state in MOISTURE_STATES:
        if state in d:
            states[state] = _state(d[state], units, f"{where}.{state}")
    if not states:
        raise InputError(f"{where}.dry", None, "is missing: give the strength and modulus against temperature "
                         "for at least one moisture state (dry or conditioned)")
    creep = [_curve(c, units, f"{where}.creep[{i}]", "creep") for i, c in enumerate(_tables(d.get("creep", []), f"{where}.creep"))]
    sn = [_curve(c, units, f"{where}.sn[{i}]", "sn") for i, c in enumerate(_tables(d.get("sn", []), f"{where}.sn"))]
    for name, curves in (("creep", creep), ("sn", sn)):
        seen = set()
        for c in curves:
            key = (c.moisture, c.temperature)
            if key in seen:
                raise InputError(f"{c.where}.temperature", c.raw_temperature,
                                 f"a second {name} curve at the same temperature and moisture state",
                                 "°C" if not isinstance(c.raw_temperature, str) else None)
            seen.add(key)
    return PolymerData(escape_text(src.strip()), ill, states, creep, sn,
                       escape_text(note) if note else None, where)


def _tables(v, name) -> list:
    if isinstance(v, dict):
        v = [v]
    if not isinstance(v, list) or not all(isinstance(x, dict) for x in v):
        raise InputError(name, v if not isinstance(v, dict) else None, "must be a list of tables ([[...]])")
    return v


def _state(d, units, where) -> StateTable:
    known(d, _STATE, where)
    raw_t = _list(d, "temperature", where)
    temps = [_temperature(v, f"{where}.temperature[{i}]") for i, v in enumerate(raw_t)]
    _increasing(temps, raw_t, f"{where}.temperature")
    n = len(temps)
    uts = _stresses(d, "tensile_strength", where, units, n)
    E = _stresses(d, "elastic_modulus", where, units, n)
    sy = _stresses(d, "yield", where, units, n) if "yield" in d else None
    if sy is not None:
        for i, (y, u) in enumerate(zip(sy, uts)):
            if y > u:
                raise InputError(f"{where}.yield[{i}]", d["yield"][i], "is above the tensile strength at the same "
                                 "temperature; a yield stress cannot exceed it")
    return StateTable(temps, uts, E, sy)


def _curve(d, units, where, kind) -> Curve:
    known(d, _CREEP if kind == "creep" else _SN, where)
    if "temperature" not in d:
        raise InputError(f"{where}.temperature", None, "is required: the temperature the curve was taken at (°C)")
    T = _temperature(d["temperature"], f"{where}.temperature")
    moist = _moisture(d.get("moisture"), f"{where}.moisture")
    if kind == "creep":
        raw = _list(d, "duration", where)
        x = [duration(v, f"{where}.duration[{i}]") for i, v in enumerate(raw)]
        _increasing(x, raw, f"{where}.duration")
        y = _stresses(d, "modulus", where, units, len(x))
        return Curve(T, moist, x, y, where, raw_temperature=d["temperature"])
    if "stress_ratio" not in d:
        raise InputError(f"{where}.stress_ratio", None, "is required: state the stress ratio of the tests (only "
                         "fully reversed data, stress_ratio = -1, can be used with the mean-stress line here)")
    R = d["stress_ratio"]
    if isinstance(R, bool) or not isinstance(R, (int, float)) or R != -1:
        raise InputError(f"{where}.stress_ratio", R, "must be -1: the mean-stress line starts from fully reversed "
                         "fatigue strengths; data at another ratio cannot be used as they are")
    raw = _list(d, "cycles", where)
    x = []
    for i, v in enumerate(raw):
        if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v) or not v >= 1:
            raise InputError(f"{where}.cycles[{i}]", v, "must be a number of cycles, at least 1")
        x.append(float(v))
    _increasing(x, raw, f"{where}.cycles")
    y = _stresses(d, "amplitude", where, units, len(x))
    try:
        cp.basquin_fit(x, y)
    except OutOfRangeError as exc:
        raise InputError(f"{where}.amplitude", d["amplitude"], f"cannot be fitted: {exc.reason}") from None
    return Curve(T, moist, x, y, where, float(R), d["temperature"])


def parse_service(d, units, material_temperature: float | None, material_raw: dict, shaft_speed: float | None,
                  rotating: bool) -> Service:
    """``[service]``: the conditions the polymer check is made at; the cycles from the speed and life."""
    known(d, _SERVICE, "service")
    if "temperature" in d:
        T = _temperature(d["temperature"], "service.temperature")
        if material_temperature is not None and abs(material_temperature - T) > SAME_TEMPERATURE:
            raise InputError("service.temperature", d["temperature"], "differs from material.temperature "
                             f"({material_raw.get('temperature')!s}); give the service temperature once",
                             "°C" if not isinstance(d["temperature"], str) else None)
    elif material_temperature is not None:
        T = material_temperature
    else:
        raise InputError("service.temperature", None, "is required: polymer data are read at the service "
                         "temperature (°C)")
    if "moisture" not in d:
        raise InputError("service.moisture", None, f"is required: one of {', '.join(MOISTURE_STATES)}")
    moist = _moisture(d["moisture"], "service.moisture")
    if "life" not in d:
        raise InputError("service.life", None, "is required: how long the steady loads act and the part must last "
                         "(e.g. \"8000 h\")")
    life = duration(d["life"], "service.life")
    per_rev = None
    if "cycles_per_revolution" in d:
        v = d["cycles_per_revolution"]
        if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v) or not v > 0:
            raise InputError("service.cycles_per_revolution", v, "must be a positive number")
        per_rev = float(v)
    speed = to_si(d["speed"], "angular_speed", "service.speed", units) if "speed" in d else None
    if speed is not None and not speed > 0:
        raise InputError("service.speed", d["speed"], "must be positive")
    if speed is not None and shaft_speed is not None and abs(speed - shaft_speed) > 1e-9 * shaft_speed:
        raise InputError("service.speed", d["speed"], "differs from shaft.speed; give the speed once (shaft.speed "
                         "serves both the critical-speed margin and the cycles)")
    if "cycles" in d:
        if speed is not None or per_rev is not None:
            raise InputError("service.cycles", d["cycles"], "is given with service.speed or "
                             "service.cycles_per_revolution; give the cycles or the speed, not both")
        v = d["cycles"]
        if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v) or not v >= 1:
            raise InputError("service.cycles", v, "must be a number of cycles, at least 1")
        return Service(T, moist, life, float(v), "service.cycles as given", raw=dict(d))
    src_speed = "service.speed"
    if speed is None and shaft_speed is not None:
        speed, src_speed = shaft_speed, "shaft.speed"
    if speed is None:
        raise InputError("service.speed", None, "is required (or service.cycles, or shaft.speed): the fatigue "
                         "check needs the cycles the service life brings")
    k = per_rev if per_rev is not None else 1.0
    N = speed / (2 * math.pi) * life * k
    how = (f"{src_speed} × service.life × {k:g} per revolution" +
           ("" if per_rev is not None else
            "; service.cycles_per_revolution not given: one, as a rotating shaft's bending" +
            ("" if rotating else " (this shaft is not declared rotating: give the load cycles per revolution)")))
    return Service(T, moist, life, N, how, speed, k, raw=dict(d))


# ----------------------------------------------------------------------------- at the service conditions


def _refuse(field_name, value, exc: OutOfRangeError, what: str, unit=None):
    raise InputError(field_name, value, f"{what}: {exc.reason}", unit) from None


def _at_temperature(curves: list, T: float, value_of, field_name, raw_T, what: str) -> tuple[float, list]:
    """A curve property at T: the curve at T, or linear in T between the two curves around it."""
    temps = sorted(c.temperature for c in curves)
    exact = [c for c in curves if abs(c.temperature - T) <= SAME_TEMPERATURE]
    if exact:
        v = value_of(exact[0])
        return v, [(exact[0].temperature, v)]
    below = [c for c in curves if c.temperature < T]
    above = [c for c in curves if c.temperature > T]
    if not below or not above:
        span = f"{temps[0]:g} °C" if len(temps) == 1 else f"{temps[0]:g} to {temps[-1]:g} °C"
        raise InputError(field_name, raw_T, f"is outside the temperatures of the {what} curves ({span}): nothing "
                         "is read outside the data; give a curve at or around the service temperature",
                         "°C" if not isinstance(raw_T, str) else None)
    lo = max(below, key=lambda c: c.temperature)
    hi = min(above, key=lambda c: c.temperature)
    v_lo, v_hi = value_of(lo), value_of(hi)
    v = cp.interpolate_in_table(T, [lo.temperature, hi.temperature], [v_lo, v_hi], "temperature", "degC")
    return v, [(lo.temperature, v_lo), (hi.temperature, v_hi)]


def at_service(data: PolymerData, sv: Service, poisson: float, needs_fatigue: bool) -> PolymerAtService:
    """The polymer's properties at the service conditions; refused (InputError naming the service field)
    where the data do not reach them."""
    w = data.where
    raw_T = sv.raw.get("temperature", sv.temperature)
    if sv.moisture not in data.states:
        raise InputError("service.moisture", sv.moisture, f"has no table in {w} (give {w}.{sv.moisture})")
    st = data.states[sv.moisture]
    field_T = "service.temperature" if "temperature" in sv.raw else "material.temperature"

    def read(ys, what):
        try:
            return cp.interpolate_in_table(sv.temperature, st.temperature, ys, "temperature", "degC")
        except OutOfRangeError as exc:
            _refuse(field_T, raw_T, exc, f"is outside the temperatures of {w}.{sv.moisture} ({what})",
                    "°C" if not isinstance(raw_T, str) else None)

    out = PolymerAtService(data, sv, poisson, read(st.tensile_strength, "tensile_strength"),
                           read(st.yield_strength, "yield") if st.yield_strength else None,
                           read(st.elastic_modulus, "elastic_modulus"))
    creep = [c for c in data.creep if c.moisture == sv.moisture]
    if creep:
        def at_life(c):
            try:
                return cp.creep_modulus(sv.life, c.x, c.y)
            except OutOfRangeError:
                raise InputError("service.life", sv.raw.get("life"),
                                 f"is outside the load durations of {c.where} ({c.x[0] / 3600:g} to {c.x[-1] / 3600:g} h): "
                                 "the creep modulus is not read outside the data",
                                 "h" if not isinstance(sv.raw.get("life"), str) else None) from None
        out.creep_modulus, used = _at_temperature(creep, sv.temperature, at_life, field_T, raw_T, "creep")
        by_t = {c.temperature: c for c in creep}
        out.creep_curves = [{"temperature": t, "modulus": v, "duration": list(by_t[t].x), "moduli": list(by_t[t].y)}
                            for t, v in used]
        out.creep_source = cp.ISOCHRONOUS_SOURCE + (
            "; linear in temperature between the two curves around the service temperature" if len(used) == 2 else "")
        if out.creep_modulus > out.elastic_modulus:
            out.notes.append("the creep modulus at the service life is above the short-term modulus at the service "
                             "temperature: the data disagree; check them")
    elif data.creep:
        out.notes.append(f"no creep curve in the {sv.moisture} state: the long-term twist and deflection are not "
                         "computed")
    else:
        out.notes.append("no creep data: the long-term twist and deflection are not computed")
    sn = [c for c in data.sn if c.moisture == sv.moisture]
    if sn:
        fits = []

        def strength(c):
            try:
                S, fit = cp.sn_strength(sv.cycles, c.x, c.y)
            except OutOfRangeError:
                fld = "service.cycles" if "cycles" in sv.raw else "service.life"
                val = sv.raw.get("cycles", sv.raw.get("life"))
                raise InputError(fld, val, f"gives {sv.cycles:.4g} cycles, outside the lives of {c.where} ({c.x[0]:.4g} "
                                 f"to {c.x[-1]:.4g} cycles): the stress-life curve is not extended past the tests and "
                                 "no endurance limit is assumed",
                                 "h" if fld == "service.life" and not isinstance(val, str) else None) from None
            fits.append({"temperature": c.temperature, "A": fit.A, "b": fit.b, "r2": fit.r2,
                         "n_min": fit.n_min, "n_max": fit.n_max, "S_f": S, "points": len(c.x),
                         "cycles": list(c.x), "amplitude": list(c.y)})
            return S

        out.fatigue_strength, _ = _at_temperature(sn, sv.temperature, strength, field_T, raw_T, "stress-life")
        out.sn_fits = fits
        out.fatigue_source = (f"{cp.BASQUIN_SOURCE}; fitted by {cp.SN_FIT_SOURCE}; read at the required cycles, "
                              "inside the tested lives; no endurance limit assumed" +
                              ("; linear in temperature between the two curves around the service temperature"
                               if len(fits) == 2 else ""))
    elif needs_fatigue:
        raise InputError(f"{w}.sn", None, f"is needed: the loads alternate, and a polymer's fatigue strength comes "
                         f"only from its stress-life data (no endurance limit is assumed); give a curve in the "
                         f"{sv.moisture} state")
    return out


def apply_polymer(m, data: dict, units, alternating: bool, shaft) -> None:
    """Read ``[material.polymer]`` and ``[service]`` of a case and put the properties at the service
    conditions into the case's material ``m`` (strengths, E, G, temperature; ``m.polymer`` keeps the
    record). A case without polymer data is left as it is; ``[service]`` without them is refused."""
    mat = data.get("material", {}) if isinstance(data.get("material", {}), dict) else {}
    if "polymer" not in mat:
        if "service" in data:
            raise InputError("service", None, "is given without material.polymer: the service conditions are read "
                             "against a polymer's own data; give them or leave [service] out")
        return
    for k in REPLACED:
        if k in mat:
            raise InputError(f"material.{k}", mat[k], "cannot be given with material.polymer: the strengths and moduli "
                             "are read from the polymer data at the service conditions")
    if m.kind != "ductile":
        raise InputError("material.kind", m.kind, "must be \"ductile\" with material.polymer (brittle polymers are not "
                         "covered by this check)")
    if m.poisson is None:
        raise InputError("material.poisson", None, "is required with material.polymer: G = E/(2(1 + ν)) at the "
                         "service temperature and the creep twist need it")
    # chart factors feed the steel hand path only; the polymer check reads the FE stresses, so a 3-D
    # feature's chart Kt would be silently left out: refused rather than ignored
    charts = [(f"fatigue.{k}", v) for k, v in (data.get("fatigue") or {}).items() if k in ("kt_bending", "kts_torsion")]
    for i, st in enumerate(shaft.stations if shaft is not None else []):
        charts += [(f"shaft.sections[{i}].fatigue.{k}", (st.raw.get("fatigue") or {}).get(k, v))
                   for k, v in st.fatigue.items() if k in ("kt_bending", "kts_torsion")]
    if charts:
        raise InputError(charts[0][0], charts[0][1], "cannot be used with material.polymer: the polymer check reads "
                         "the FE stresses and has no hand path to apply a chart factor to; a 3-D feature's "
                         "concentration would be left out. Model a shoulder or groove in [shaft], or check the "
                         "feature with the part's own tests")
    pd = parse_polymer(mat["polymer"], units)
    if "service" not in data:
        raise InputError("service", None, "is required with material.polymer: the service temperature, moisture "
                         "state, life and speed (or cycles) the check is made at")
    sv = parse_service(data["service"], units, m.temperature, mat, shaft.speed if shaft is not None else None,
                       bool(shaft is not None and shaft.rotating) or bool(data.get("loads", {}).get("rotating") is True))
    res = at_service(pd, sv, m.poisson, alternating)
    m.polymer = res
    m.ultimate = res.tensile_strength
    m.yield_strength = res.yield_strength
    m.elastic_modulus = res.elastic_modulus
    m.shear_modulus = res.shear_modulus
    m.temperature = sv.temperature

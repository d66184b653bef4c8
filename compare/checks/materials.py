"""The choice of material: a table the user keeps (TOML), every row checked against the case's
stress field with the same static and fatigue criteria, ranked by margin over the design factor.

Table format (docs/case-files.md, 'Material table')::

    [table]
    title = "..."
    units = "mm-N-MPa"          # for plain numbers; strings may carry their own unit
    illustrative = true         # say so when the values are not real data

    [[material]]
    name = "steel A (illustrative)"
    class = "steel"             # steel | cast iron | aluminium | polymer | other
    kind = "ductile"            # ductile | brittle
    yield = 350
    ultimate = 600
    compressive_ultimate = 900  # optional; brittle materials need it
    endurance_limit = 200       # optional: the part's fully corrected Se, used as is
    surface = "machined"        # optional; default: the case's material.surface
    max_service_temperature = 80   # optional, °C (a plain number)
    note = "..."
    polymer = { ... }           # optional, class "polymer" only: the data of [material.polymer]
                                # (compare/case/polymer.py), read at the case's [service] conditions

Stresses of a linear-elastic section do not depend on the modulus; the transverse-shear part depends
weakly on Poisson's ratio, and the case's value is used for every row.
"""
from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

import numpy as np

from fem.errors import InputError, escape_text

from ..case.case import ABSOLUTE_ZERO_C, Material, _known, _text, check_strengths, check_surface, parse_toml, read_input_file
from ..case.polymer import REPLACED, at_service, parse_polymer
from ..case.units import to_si, unit_system
from .checks import FATIGUE_CRITERIA, endurance, fe_fatigue, hand_path, static_check
from .polymer import NOT_CHECKED as POLYMER_NOT_CHECKED, row_factors

CLASSES = ("steel", "cast iron", "aluminium", "polymer", "other")
_ROW = {"name", "class", "kind", "yield", "ultimate", "compressive_ultimate", "endurance_limit", "surface",
        "max_service_temperature", "note", "polymer"}
_TABLE = {"title", "units", "illustrative", "note"}

#: What no row of the table lets the tool check, whatever the material.
NOT_CHECKED_ALWAYS = ["wear and fretting at the key, hub and bearing seats", "corrosion", "creep",
                      "stiffness, deflection and critical speed", "the keyseat-end 3-D stress concentration (2-D model)"]
NOT_CHECKED_BY_CLASS = {
    "polymer": ["moisture uptake (strength and size change)", "temperature dependence of strength and modulus",
                "creep and stress relaxation under the steady torque", "fatigue, unless the table gives the part's endurance limit",
                "(give the row `polymer` data and the case [service] conditions to check these at temperature, over "
                "time and cycles)"],
    "cast iron": ["fatigue with the steel correlations (Se' = 0.5·Sut, Marin ka, Neuber q do not apply)"],
    "aluminium": ["fatigue: aluminium alloys have no endurance limit; the table must give a fatigue strength at a stated life"],
    "other": ["fatigue, unless the table gives the part's endurance limit"],
    "steel": [],
}


def read_table(path: Path) -> tuple[dict, list[tuple[Material, dict]]]:
    data = parse_toml(read_input_file(path, "analysis.materials"), "analysis.materials", str(path))
    where = escape_text(path.name)
    _known(data, {"table", "material"}, where)
    head = data.get("table", {})
    _known(head, _TABLE, f"{where}: table")
    units = unit_system(head.get("units"), f"{where}: table.units")
    for key in ("title", "note"):
        if key in head:
            head[key] = _text(head[key], f"{where}: table.{key}")
    if "illustrative" in head and not isinstance(head["illustrative"], bool):
        raise InputError(f"{where}: table.illustrative", head["illustrative"], "must be true or false")
    rows = data.get("material")
    if not isinstance(rows, list) or not rows:
        raise InputError(f"{where}: material", rows, "the table needs at least one [[material]] row")
    out = []
    for i, r in enumerate(rows):
        f = f"{where}: material[{i}]"
        _known(r, _ROW, f)
        if not isinstance(r.get("name"), str) or not r["name"].strip():
            raise InputError(f"{f}.name", r.get("name"), "is required (a text)")
        if "note" in r:
            r["note"] = _text(r["note"], f"{f}.note")
        cls = r.get("class", "other")
        if cls not in CLASSES:
            raise InputError(f"{f}.class", cls, f"must be one of {', '.join(CLASSES)}")
        kind = r.get("kind", "ductile")
        if kind not in ("ductile", "brittle"):
            raise InputError(f"{f}.kind", kind, "must be \"ductile\" or \"brittle\"")
        m = Material(name=escape_text(r["name"].strip()), kind=kind)
        for key, attr in (("yield", "yield_strength"), ("ultimate", "ultimate"),
                          ("compressive_ultimate", "compressive_ultimate"), ("endurance_limit", "endurance_limit")):
            if key in r:
                v = to_si(r[key], "stress", f"{f}.{key}", units)
                if not v > 0:
                    raise InputError(f"{f}.{key}", r[key], "must be positive")
                setattr(m, attr, v)
        check_strengths(m, r, f, units)
        if "surface" in r:
            if not isinstance(r["surface"], str):
                raise InputError(f"{f}.surface", r["surface"], "must be a string")
            check_surface(r["surface"], f"{f}.surface")
            m.surface = r["surface"]
        info = {"class": cls, "note": r.get("note")}
        if "polymer" in r:  # the polymer's own data: its strengths are read at the case's service conditions
            if cls != "polymer":
                raise InputError(f"{f}.polymer", None, f"is only for class = \"polymer\" (this row is \"{cls}\")")
            for k in REPLACED:
                if k in r:
                    raise InputError(f"{f}.{k}", r[k], "cannot be given with polymer data: it is read from them at the "
                                     "case's service conditions")
            info["polymer"] = parse_polymer(r["polymer"], units, f"{f}.polymer")
        if "max_service_temperature" in r:
            v = r["max_service_temperature"]
            if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v):
                raise InputError(f"{f}.max_service_temperature", v, "must be a plain number in °C")
            if v < ABSOLUTE_ZERO_C:
                raise InputError(f"{f}.max_service_temperature", v, "is below absolute zero (−273.15 °C)", "°C")
            info["max_service_temperature"] = float(v)
        if m.yield_strength is None and m.ultimate is None and "polymer" not in info:
            raise InputError(f"{f}", m.name, "gives neither yield nor ultimate: nothing can be checked")
        out.append((m, info))
    return {"title": head.get("title"), "illustrative": bool(head.get("illustrative", False)),
            "note": head.get("note"), "file": escape_text(str(path))}, out


def table_path(case) -> Path:
    p = Path(case.analysis.materials)
    if not p.is_absolute() and case.path is not None:
        p = Path(case.path).parent / p
    return p


def rank_materials(a, fld, cyc, worst, fs, kt2d, skipped: dict) -> list | None:
    """Every row of the table with its factors of safety, ranked by margin n/nd (largest first)."""
    nd = a.case.analysis.design_factor
    head, rows = read_table(table_path(a.case))
    if nd is None:
        skipped["materials"] = "analysis.design_factor is not given: no material can be said to meet it"
        return None
    case_m = a.case.material
    T = case_m.temperature
    ranked = []
    for m, info in rows:
        cls = info["class"]
        if "polymer" in info:
            ranked.append(_polymer_row(a, fld, cyc, worst, fs, m, info, head, nd))
            continue
        # operating conditions (temperature, reliability) come from the case; the surface from the row or the case
        m = replace(m, poisson=case_m.poisson, temperature=T, reliability=case_m.reliability,
                    surface=m.surface or case_m.surface)
        factors: dict = {}
        crit_of: dict = {}
        st = static_check(a, fld, cyc, worst, {}, material=m)
        for c in st["criteria"]:
            factors[c] = st[c]
            crit_of[c] = "FE"
        not_checked = list(NOT_CHECKED_ALWAYS) + NOT_CHECKED_BY_CLASS[cls]
        notes = []
        if m.kind == "ductile":
            steel = cls == "steel"
            en = endurance(a, fld, cyc, material=m, steel=steel)
            if "skipped" in en:
                notes.append(f"fatigue not checked: {en['skipped']}")
            else:
                fe = fe_fatigue(a, fld, cyc, fs, en["Se"], m.ultimate, m.yield_strength)
                for c, e in fe.items():
                    factors[c] = e["factor"]
                    crit_of[c] = "FE"
                # the notch-sensitivity fits of the hand path are for steels
                hand = (hand_path(a, fld, cyc, en["Se"], m.ultimate, m.yield_strength, kt2d) if steel else
                        {"skipped": "not a steel: the Neuber notch-sensitivity fits do not apply"})
                if "skipped" not in hand:
                    for c in FATIGUE_CRITERIA + ("first_cycle_yield",):
                        if c in hand and (c not in factors or hand[c] < factors[c]):
                            factors[c] = hand[c]
                            crit_of[c] = "hand"
                factors["Se"] = en["Se"]
        else:
            notes.append("fatigue not checked: brittle material")
        if "max_service_temperature" in info and T is not None and T > info["max_service_temperature"]:
            notes.append(f"the case temperature {T:g} °C is above the table's max service temperature "
                         f"{info['max_service_temperature']:g} °C")
        crit = [(v, c) for c, v in factors.items() if c != "Se" and v is not None and math.isfinite(v)]
        fatigue_needed = bool(np.any(fs.sa[~fld.excluded] > 0))
        complete = "Se" in factors or not fatigue_needed
        entry = {"name": m.name, "class": cls, "kind": m.kind}
        if crit:
            n, c = min(crit)
            entry.update(factor=n, criterion=c, path=crit_of[c], margin=n / nd,
                         meets=bool(n >= nd) if complete else None, meets_what_was_checked=bool(n >= nd))
        else:
            entry.update(factor=None, criterion=None, path=None, margin=None, meets=None, meets_what_was_checked=None)
        entry["complete"] = complete
        if not complete:
            notes.append("the load cycle alternates but fatigue was not checked: this material cannot be said to meet "
                         "the design factor on this check; it is ranked after the fully checked ones")
        entry.update(factors=dict(factors), not_checked=not_checked, notes=notes,
                     illustrative=head["illustrative"], table=head["file"], design_factor=nd)
        if info.get("note"):
            entry["table_note"] = info["note"]
        ranked.append(entry)
    ranked.sort(key=lambda e: (not e["complete"], e["margin"] is None, -(e["margin"] or 0.0)))
    for k, e in enumerate(ranked, 1):
        e["rank"] = k
    return ranked


def _polymer_row(a, fld, cyc, worst, fs, m, info, head, nd) -> dict:
    """A table row with polymer data, read at the case's service conditions (the case must be a polymer
    case: its [service] gives them) and checked as the case's own polymer is."""
    entry = {"name": m.name, "class": "polymer", "kind": m.kind, "illustrative": head["illustrative"],
             "table": head["file"], "design_factor": nd, "not_checked": list(POLYMER_NOT_CHECKED), "notes": []}
    if info.get("note"):
        entry["table_note"] = info["note"]
    case_p = a.case.material.polymer
    fatigue_needed = bool(np.any(fs.sa[~fld.excluded] > 0))
    factors: dict = {}
    if case_p is None:
        entry["notes"].append("polymer data not read: the case gives no [service] conditions (a case with "
                              "[material.polymer] and [service] does)")
    else:
        try:
            p = at_service(info["polymer"], case_p.service, a.case.material.poisson, fatigue_needed)
        except InputError as exc:
            p = None
            entry["notes"].append(f"the row's data do not reach the service conditions: {exc}")
        if p is not None:
            factors = row_factors(a, fld, fs, worst, p)
            mm = replace(m, poisson=a.case.material.poisson, yield_strength=p.yield_strength, ultimate=p.tensile_strength,
                         temperature=p.service.temperature)
            if p.yield_strength is not None:
                st = static_check(a, fld, cyc, worst, {}, material=mm)
                for c in st["criteria"]:
                    factors[c] = st[c]
            entry["conditions"] = {"temperature": p.service.temperature, "moisture": p.service.moisture,
                                   "life": p.service.life, "cycles": p.service.cycles}
            entry["creep_modulus"] = p.creep_modulus
    complete = bool(factors) and ("polymer_fatigue_goodman" in factors or not fatigue_needed)
    crit = [(v, c) for c, v in factors.items() if v is not None and math.isfinite(v)]
    if crit:
        n, c = min(crit)
        entry.update(factor=n, criterion=c, path="FE", margin=n / nd,
                     meets=bool(n >= nd) if complete else None, meets_what_was_checked=bool(n >= nd))
    else:
        entry.update(factor=None, criterion=None, path=None, margin=None, meets=None, meets_what_was_checked=None)
    entry["complete"] = complete
    entry["factors"] = factors
    return entry

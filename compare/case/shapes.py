"""Case-file sections beyond round and custom: keyways (given or from the key standards), flats,
square and hexagon drives, the cross-slot; and the record of every resolved dimension.

Each parser returns ``(Section, geometry)``: ``geometry`` is what ``results.json`` echoes under
``section.geometry`` — every dimension in SI with where it came from ("given", or the standard's
table row, or a default and its reason). Errors are :class:`~fem.errors.InputError` naming the
case-file field; :func:`compare.case.case.parse_section` echoes the value as the user wrote it.
"""
from __future__ import annotations

import math

from classic._validity import OutOfRangeError
from classic.keys import inch_square_key, metric_parallel_key
from fem.errors import InputError
from fem.geometry import Keyway, keyed_section
from fem.shapes import Flat, cross_slot_section, flatted_section, hexagon_drive, square_drive

from .units import to_si
from .fields import known as _known, angle as _angle

GIVEN = "given"
#: The shapes parsed here besides "keyed", with the keys each accepts.
SHAPE_KEYS = {
    "flatted": {"shape", "diameter", "bore", "flats"},
    "square": {"shape", "size", "corner_radius", "bore"},
    "hexagon": {"shape", "across_flats", "corner_radius", "bore"},
    "cross_slot": {"shape", "diameter", "slot_width", "slot_length", "slot_fillet", "slot_angle"},
}
KEYWAY_KEYS = {"width", "depth", "fillet", "angle", "length", "standard"}
STANDARDS = ("metric", "inch")


def _length(d: dict, key: str, where: str, units, required=True, default=None):
    if key not in d:
        if required:
            raise InputError(f"{where}.{key}", None, "is required")
        return default
    return to_si(d[key], "length", f"{where}.{key}", units)


def _entry(value, source: str) -> dict:
    return {"value": value, "from": source}


def _bore(s, units):
    if "bore" not in s or s["bore"] in (0, None):
        return None
    return to_si(s["bore"], "length", "section.bore", units)


# ----------------------------------------------------------------------------- keyways


def resolve_keyway(k: dict, d: float, where: str, units) -> tuple[Keyway, dict]:
    """One ``[[section.keyways]]`` table as a :class:`Keyway`: with ``standard`` the width, depth and
    bottom radius come from the key table for the shaft diameter ``d`` [m]; any of them given
    explicitly overrides the table."""
    if not isinstance(k, dict):
        raise InputError(where, k, "must be a table with width, depth, fillet, angle (or standard)")
    _known(k, KEYWAY_KEYS, where)
    std = k.get("standard")
    rec: dict = {}
    table = None
    if std is not None:
        if std not in STANDARDS:
            raise InputError(f"{where}.standard", std, "must be \"metric\" (ISO/R773, DIN 6885-1) or \"inch\" (ASME B17.1)")
        try:
            table = metric_parallel_key(d) if std == "metric" else inch_square_key(d)
        except OutOfRangeError as exc:
            raise InputError("section.diameter", d, f"{exc.reason} ({where}.standard = \"{std}\")") from None
        rec["standard"] = table["source"]
        rec["table_row"] = {"over": table["over"], "up_to": table["up_to"], "from_memory": table["from_memory"]}
        if table["from_memory"]:
            rec["table_row"]["caution"] = "this row of the key table is from memory of the standard, not re-read: check it"
        if std == "metric":
            span = f"shafts over {table['over'] * 1e3:g} up to {table['up_to'] * 1e3:g} mm"
        else:
            span = f"shafts over {table['over'] / 0.0254:.4g} up to {table['up_to'] / 0.0254:.4g} in"
        row = f"{table['source']}, {span}"
    else:
        for key in ("width", "depth"):
            if key not in k:
                raise InputError(f"{where}.{key}", None, "is required (or give standard = \"metric\" or \"inch\")")
    out = {}
    for key in ("width", "depth"):
        if key in k:
            out[key] = (_length(k, key, where, units), GIVEN)
        elif std == "inch" and key == "depth":
            out[key] = (table["depth"], f"{row}: key/2 at the keyseat side plus the chordal height "
                                        f"{table['chordal_height']:.6g} m (depth on the centre line)")
        else:
            out[key] = (table[key], row)
    # a given width changes the inch depth's chordal height: recompute from the width used
    if std == "inch" and "depth" not in k and "width" in k:
        w = out["width"][0]
        y = (d - math.sqrt(max(d * d - w * w, 0.0))) / 2
        out["depth"] = (table["depth_at_side"] + y, f"{row}: key/2 at the keyseat side plus the chordal height "
                                                      f"{y:.6g} m of the given width (depth on the centre line)")
    if "fillet" in k:
        out["fillet"] = (_length(k, "fillet", where, units), GIVEN)
    elif std == "metric":
        out["fillet"] = ((table["r_min"] + table["r_max"]) / 2,
                         f"{row}: middle of the standard's bottom radius range {table['r_min'] * 1e3:g}–"
                         f"{table['r_max'] * 1e3:g} mm")
    elif std == "inch":
        raise InputError(f"{where}.fillet", None, "is required with standard = \"inch\": ASME B17.1's key table "
                         "gives no keyseat bottom radius (give the radius of your cutter or drawing)")
    else:
        out["fillet"] = (0.0, "not given: a sharp corner (the peak there is unbounded; give the real radius)")
    angle = _angle(k.get("angle", 90.0), f"{where}.angle")
    kw = Keyway(width=out["width"][0], depth=out["depth"][0], fillet=out["fillet"][0], angle=angle)
    for key, (v, src) in out.items():
        rec[key] = _entry(v, src)
    rec["angle_deg"] = _entry(angle, GIVEN if "angle" in k else "default: 90° (top)")
    if std is not None:
        rec["key_height"] = _entry(table["height"], row)
    return kw, rec


def parse_keyed(s: dict, units) -> tuple:
    _known(s, {"shape", "diameter", "bore", "keyways"}, "section")
    d = _length(s, "diameter", "section", units)
    kws = s.get("keyways")
    if not isinstance(kws, list) or not kws:
        raise InputError("section.keyways", kws, "a keyed section needs at least one [[section.keyways]] table")
    keyways, recs = [], []
    for i, k in enumerate(kws):
        kw, rec = resolve_keyway(k, d, f"section.keyways[{i}]", units)
        keyways.append(kw)
        recs.append(rec)
    bore = _bore(s, units)
    sec = keyed_section(d, keyways, bore)
    geo = {"diameter": _entry(d, GIVEN), "keyways": recs}
    if bore:
        geo["bore"] = _entry(bore, GIVEN)
    return sec, geo


# ----------------------------------------------------------------------------- flats, drives, cross-slot


def parse_shape(s: dict, units) -> tuple:
    """A flatted, square, hexagon or cross-slot section and its geometry record."""
    shape = s["shape"]
    _known(s, SHAPE_KEYS[shape], "section")
    geo: dict = {}
    bore = _bore(s, units) if "bore" in SHAPE_KEYS[shape] else None
    if shape == "flatted":
        d = _length(s, "diameter", "section", units)
        fl = s.get("flats")
        if not isinstance(fl, list) or not fl:
            raise InputError("section.flats", fl, "a flatted section needs at least one flat: flats = [{ depth = ..., angle = ... }]")
        flats, recs = [], []
        for i, f in enumerate(fl):
            where = f"section.flats[{i}]"
            _known(f, {"depth", "angle", "length"}, where)  # length: case.parse_feature_lengths
            flats.append(Flat(_length(f, "depth", where, units), _angle(f.get("angle", 90.0), f"{where}.angle")))
            recs.append({"depth": _entry(flats[-1].depth, GIVEN),
                         "angle_deg": _entry(flats[-1].angle, GIVEN if "angle" in f else "default: 90° (top)"),
                         "across_to_opposite_side": None})
        sec = flatted_section(d, flats, bore)
        for rec, f in zip(recs, flats):  # distance from the flat to the far side of the section
            rec["across_to_opposite_side"] = _entry(_across(d, flats, f), "computed from the diameter and the flats")
        geo = {"diameter": _entry(d, GIVEN), "flats": recs}
    elif shape in ("square", "hexagon"):
        key = "size" if shape == "square" else "across_flats"
        a = _length(s, key, "section", units)
        r = _length(s, "corner_radius", "section", units, required=False, default=0.0)
        sec = (square_drive if shape == "square" else hexagon_drive)(a, r, bore)
        n = 4 if shape == "square" else 6
        geo = {key: _entry(a, GIVEN),
               "corner_radius": _entry(r, GIVEN if "corner_radius" in s else "default: 0 (sharp, convex corners carry no stress)"),
               "across_corners": _entry(a / math.cos(math.pi / n) - 2 * r * (1 / math.cos(math.pi / n) - 1),
                                        "computed: across the rounded corners")}
    else:
        d = _length(s, "diameter", "section", units)
        w = _length(s, "slot_width", "section", units)
        L = _length(s, "slot_length", "section", units)
        r = _length(s, "slot_fillet", "section", units, required=False, default=0.0)
        ang = _angle(s.get("slot_angle", 0.0), "section.slot_angle")
        sec = cross_slot_section(d, w, L, r, ang)
        geo = {"diameter": _entry(d, GIVEN), "slot_width": _entry(w, GIVEN), "slot_length": _entry(L, GIVEN),
               "slot_fillet": _entry(r, GIVEN if "slot_fillet" in s else "default: 0 (sharp: the peak there is unbounded)"),
               "slot_angle_deg": _entry(ang, GIVEN if "slot_angle" in s else "default: 0")}
    if bore:
        geo["bore"] = _entry(bore, GIVEN)
    return sec, geo


def _across(d: float, flats, f) -> float:
    """From the flat ``f`` straight across to the far boundary of the flatted section: the flat
    opposite (within 1°) if there is one, else the round surface."""
    far = d / 2
    for g in flats:
        if g is not f and abs((g.angle - f.angle) % 360.0 - 180.0) < 1.0:
            far = min(far, d / 2 - g.depth)
    return d / 2 - f.depth + far

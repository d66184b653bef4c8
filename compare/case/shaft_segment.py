"""A layout station whose feature is 3-D: the ``segment`` table of a ``[[shaft.sections]]`` station.

A cross-section sees a keyseat as a prism; the end of a keyseat and a transverse hole are 3-D. A
station may ask for the 3-D segment study (compare/solve/segments.py) of its feature::

    [[shaft.sections]]
    at = 25
    section = { shape = "keyed", diameter = 30, keyways = [{ width = 8, depth = 4, fillet = 0.6, length = 40 }] }
    segment = { kind = "keyseat_end" }           # the keyway's end, in 3-D

    [[shaft.sections]]
    at = 120
    segment = { kind = "cross_hole", hole_diameter = 6, chamfer = 0.5, angle = 0 }

Keys: ``kind`` ("keyseat_end": an end-milled keyseat's rounded end; "sled_runner": a disk cutter's
run-out, with ``cutter_diameter``; "cross_hole"); keyseats take width, depth and bottom fillet from
the station's keyed section (``keyway``: which one, default 0) and the key length from that keyway's
``length`` (where it lies: the station's feature extent); a cross hole ``hole_diameter``, ``chamfer``
(45°, default 0), ``hole_depth`` (blind; default through) and ``angle`` (the hole's axis, degrees from
+x toward +y; default 0), on a station without its own section (the plain round). Both: ``length``
(the modelled length; default the feature's span plus three diameters, at least three diameters) and
``fineness`` (of the 3-D meshes; default analysis.fineness) and ``model`` ("whole", "half" or
"quarter"; default the smallest the features allow: compare/case/segment.py). The model is a solid round bar: a hollow
segment is refused, as is a feature too close to the model's end faces. A shoulder of the shaft's
outline whose fillet begins within :data:`SHOULDER_REACH` diameters of the feature's cut is built into the
model (the feature on the smaller diameter; a step down along the shaft modelled as a step up and
mirrored back, ``StationSegment.mirrored``); where it cannot be, ``shoulder_not_in_model`` says why.
Grooves are not built into the 3-D model.

:func:`parse_station_segment` reads the table (in ``shaft.py``'s station parser);
:func:`build_station_segments` makes the :class:`fem.solid.Segment` once the station's diameter is
known (``case.py``, after [section]) and refuses what the model cannot hold.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from fem import solid
from fem.errors import InputError

from .fields import known
from .segment import MARGIN, parse_model
from .units import to_si

KINDS = ("keyseat_end", "sled_runner", "cross_hole")
_KEYS = {"kind", "keyway", "cutter_diameter", "hole_diameter", "chamfer", "hole_depth", "angle", "length", "fineness",
         "model"}
_ALLOWED = {"keyseat_end": {"keyway"}, "sled_runner": {"keyway", "cutter_diameter"},
            "cross_hole": {"hole_diameter", "chamfer", "hole_depth", "angle"}}
#: The default modelled length: the feature's span plus MARGIN diameters (compare/case/segment.py, the
#: one constant of both: 1.5 diameters of plain bar at each end), at least MIN_LENGTH. Measured (tests/benchmarks/bench_segment_length.py, fineness 0.4):
#: with a keyseat 1 diameter from the ends the far-field departure in tension was 9.7 % of nominal, at
#: the warning's 10 % (compare/checks/segment_far_field.py); 1.5 diameters away 6.3 %, the factors within
#: 2.5 % of a 3-diameter model's, at the same unknowns (the plain bar's mesh is coarse).
MIN_LENGTH = 3.0
#: A shoulder of the shaft's outline whose fillet begins within this many of the station's (smaller)
#: diameters of the feature's cut goes into the station's 3-D model (one model holds both raisers).
#: Reason: each raiser disturbs the plain bar's stress over about one diameter from it (Saint-Venant's
#: principle; the 3-D model keeps fem.solid.END_ZONE = 0.75 diameters of plain bar at its ends for that
#: reason, common practice), so closer than that the two peaks' surroundings overlap and neither model
#: alone holds the stress between them; further apart each model alone does.
SHOULDER_REACH = 1.0
#: The combined model's plain bar before the feature's cut (in d) and beyond the shoulder face (in D):
#: 1.5, as the feature's own default length (MARGIN/2 each side): at 1 diameter the far-field
#: departure of a keyseat end in tension reached 9.7 % of nominal, next to the 10 % of the
#: segment_far_field warning (DEVELOPERS.md, 3-D segments' length).
COMBINED_MARGIN = MARGIN / 2


@dataclass
class StationSegment:
    """The 3-D feature of a station (SI): ``kind``, ``field`` (``shaft.sections[i].segment``), ``angle``
    [deg] where the feature sits round the shaft in the station's frame (a keyseat's centre line, a
    hole's axis), ``centre`` [m] along the shaft, the sizes, ``length`` (modelled, None: the default),
    ``fineness`` (None: analysis.fineness), ``notch`` (radius [m], its field) and, once built, ``model``
    (fem.solid.Segment, the feature centred at length/2) and ``d``."""

    kind: str
    field: str
    angle: float
    centre: float
    sizes: dict
    length: float | None = None
    fineness: float | None = None
    notch: tuple | None = None
    model: object | None = None
    d: float | None = None
    raw: dict | None = None
    #: the mirror symmetry of the model asked for (``model``: 0 whole, 1 half, 2 quarter), None: the
    #: smallest the features allow; checked once the model is built
    symmetry: int | None = None
    #: the shaft's z [m] of the model's mid-length (the feature's centre unless a shoulder is in the model)
    mid: float | None = None
    #: the model's z runs against the shaft's (a shoulder stepping down along the shaft, mirrored so the
    #: model steps up): shaft z = mid − (z − length/2)
    mirrored: bool = False
    #: the shoulder of the outline built into the model: {D, fillet, at (shaft z), field}, else None
    shoulder_in_model: dict | None = None
    #: why a shoulder within reach was not built into the model (then the larger-of-the-two rule holds)
    shoulder_not_in_model: str | None = None
    #: the model of the feature alone (without the shoulder), kept for the fallback when the combined
    #: study cannot run (a limit of the case)
    model_alone: object | None = None


def parse_station_segment(s: dict, w: str, st, units, feature_lengths=None) -> StationSegment:
    """The station's ``segment`` table, checked against its section (``st.section``, ``st.extent``)."""
    t = s["segment"]
    fw = f"{w}.segment"
    if not isinstance(t, dict):
        raise InputError(fw, t, "must be a table, e.g. { kind = \"keyseat_end\" }")
    known(t, _KEYS, fw)
    kind = t.get("kind")
    if kind not in KINDS:
        raise InputError(f"{fw}.kind", kind, "must be \"keyseat_end\", \"sled_runner\" or \"cross_hole\"")
    for k in t:
        if k not in _ALLOWED[kind] | {"kind", "length", "fineness", "model"}:
            raise InputError(f"{fw}.{k}", t[k], f"is not a field of a {kind} station segment")

    def length(key, required=True, default=None):
        if key not in t:
            if required:
                raise InputError(f"{fw}.{key}", None, "is missing")
            return default
        v = to_si(t[key], "length", f"{fw}.{key}", units)
        if not (v > 0 and math.isfinite(v)):
            raise InputError(f"{fw}.{key}", t[key], "must be a positive length")
        return v

    fineness = None
    if "fineness" in t:
        v = t["fineness"]
        if isinstance(v, bool) or not isinstance(v, (int, float)) or not (math.isfinite(v) and 0.05 <= v <= 4):
            raise InputError(f"{fw}.fineness", v, "must be a number from 0.05 to 4")
        fineness = float(v)
    model_len = length("length", required=False)
    if kind == "cross_hole":
        if st.section is not None and st.section.kind != "round":
            raise InputError(f"{fw}.kind", kind, f"models a hole in a plain round shaft, but the station's section is "
                             f"{st.section.kind}: leave {w}.section out (or give a round one)")
        chamfer = 0.0
        if "chamfer" in t:
            chamfer = to_si(t["chamfer"], "length", f"{fw}.chamfer", units)
            if not (chamfer >= 0 and math.isfinite(chamfer)):
                raise InputError(f"{fw}.chamfer", t["chamfer"], "must not be negative")
        angle = _angle(t.get("angle", 0.0), f"{fw}.angle")
        sizes = {"hole_diameter": length("hole_diameter"), "chamfer": chamfer,
                 "hole_depth": length("hole_depth", required=False)}
        return StationSegment(kind, fw, angle, st.at, sizes, model_len, fineness, None, raw=dict(t))
    sec = st.section
    if sec is None or sec.kind != "keyed":
        raise InputError(f"{fw}.kind", kind, f"needs a keyed section at the station ({w}.section with shape = "
                         "\"keyed\" and its keyway): the keyseat's width, depth and fillet come from it")
    i = t.get("keyway", 0)
    if isinstance(i, bool) or not isinstance(i, int) or not 0 <= i < len(sec.keyways):
        raise InputError(f"{fw}.keyway", i, f"must be the index of one of the section's {len(sec.keyways)} keyways "
                         "(0 is the first)")
    kw = sec.keyways[i]
    kfield = f"{w}.section.keyways[{i}]"
    if not kw.fillet > 0:
        raise InputError(f"{kfield}.fillet", (s["section"].get("keyways") or [{}])[i].get("fillet"),
                         "is needed for the 3-D keyseat end: a sharp keyseat corner has no bounded peak stress")
    if st.extent is None or st.extent_field != f"{kfield}.length":
        raise InputError(f"{kfield}.length", (s["section"].get("keyways") or [{}])[i].get("length"),
                         "is needed for the 3-D keyseat end (the key length, end to end), and must be the "
                         "station's longest feature (its place along the shaft)")
    z0, z1 = st.extent
    sizes = {"width": kw.width, "depth": kw.depth, "fillet": kw.fillet, "key_length": z1 - z0}
    if kind == "sled_runner":
        sizes["cutter_diameter"] = length("cutter_diameter")
    return StationSegment(kind, fw, float(kw.angle), (z0 + z1) / 2, sizes, model_len, fineness,
                          (kw.fillet, f"{kfield}.fillet"), raw=dict(t))


def _angle(v, name) -> float:
    if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v):
        raise InputError(name, v, "must be an angle in degrees")
    return float(v)


def build_station_segments(shaft, section, material) -> None:
    """Make each station segment's 3-D model once its diameter is known: the shaft's segment at the
    station (or [section]'s for a shaft without segments). Refused: a hollow shaft there, a missing
    Poisson's ratio, a feature the model cannot hold (too close to an end face, too large)."""
    if shaft is None:
        return
    for st in shaft.stations:
        ss = getattr(st, "segment", None)
        if ss is None:
            continue
        seg = shaft.segment_at(ss.centre)
        d = seg.diameter if seg is not None else section.diameter
        bore = seg.bore if seg is not None else section.bore
        if bore:
            raise InputError(f"{ss.field}.kind", ss.kind, "models a solid round shaft, but the shaft is hollow here "
                             "(a bore): the 3-D segment has no bore")
        if material.poisson is None:
            raise InputError("material.poisson", None, "is needed: a station's 3-D segment study depends on "
                             "Poisson's ratio")
        sz = ss.sizes
        if ss.kind == "cross_hole":
            span = sz["hole_diameter"] + 2 * sz["chamfer"]
        else:
            span = sz["key_length"]
        L = ss.length if ss.length is not None else max(MIN_LENGTH * d, span + MARGIN * d)
        mid = L / 2
        if ss.kind == "cross_hole":
            feat = solid.CrossHole(sz["hole_diameter"], mid, sz["chamfer"], sz["hole_depth"])
        elif ss.kind == "keyseat_end":
            feat = solid.ProfileKeyseat(sz["width"], sz["depth"], mid - span / 2, mid + span / 2, sz["fillet"])
        else:
            feat = solid.SledKeyseat(sz["width"], sz["depth"], mid - span / 2, mid + span / 2, sz["cutter_diameter"],
                                     sz["fillet"])
        model = solid.Segment(d, L, (feat,))
        ss.mid = ss.centre
        try:
            model.check(ss.field)
        except InputError as exc:
            f = exc.field.replace(f"{ss.field}.features[0].", f"{ss.field}.")
            key = f.rsplit(".", 1)[1]
            fields = {"z": "length", "z0": "length", "z1": "length", "d": "length", "diameter": "hole_diameter",
                      "depth": "hole_depth" if ss.kind == "cross_hole" else "depth"}
            key = fields.get(key, key)
            if ss.kind != "cross_hole" and key in ("width", "depth", "fillet"):  # sizes of the station's keyway
                raise InputError(f"{ss.notch[1].rsplit('.', 1)[0]}.{key}", exc.value, exc.reason) from None
            raw = (ss.raw or {}).get(key)
            raise InputError(f"{ss.field}.{key}", raw if raw is not None else exc.value, exc.reason) from None
        ss.model, ss.d = model, d
        ss.symmetry = parse_model((ss.raw or {}).get("model"), model, f"{ss.field}.model")
        _with_shoulder(shaft, ss, feat, span, d)


def shoulder_near(shaft, ss, span: float, d: float):
    """The shoulder of the shaft's outline (a step between consecutive segments) whose fillet begins
    within :data:`SHOULDER_REACH` station diameters of the station feature's cut, the nearest: (index
    of the segment the step begins, gap [m]) or None."""
    a, b = ss.centre - span / 2, ss.centre + span / 2
    best = None
    segs = shaft.segments
    for i in range(1, len(segs)):
        if segs[i - 1].diameter == segs[i].diameter:
            continue
        at, r = segs[i].start, segs[i].fillet or 0.0
        gap = max(a - at, at - b, 0.0) - r  # from the cut to the nearer edge of the fillet
        if gap <= SHOULDER_REACH * d and (best is None or gap < best[1]):
            best = (i, gap)
    return best


def _with_shoulder(shaft, ss, feat, span: float, d: float) -> None:
    """Build the shoulder within reach of the station's feature into its 3-D model (the feature on the
    smaller diameter, the shoulder's fillet given, one material, the model asked not a half or quarter),
    or record why not (``shoulder_not_in_model``; the station then keeps the larger-of-the-two rule)."""
    near = shoulder_near(shaft, ss, span, d)
    if near is None:
        return
    i, gap = near
    s0, s1 = shaft.segments[i - 1], shaft.segments[i]
    up = s1.diameter > s0.diameter
    small, big = (s0, s1) if up else (s1, s0)
    fld = f"shaft.segments[{i}].fillet"
    at, r = s1.start, s1.fillet
    why = None
    if abs(small.diameter - d) > 1e-9 * d:
        why = (f"the feature sits on the larger diameter of the step at {fld}: the 3-D model's nominal stresses "
               "are the smaller diameter's (not built in)")
    elif r is None:
        why = f"the shoulder at {fld} has no fillet (a sharp corner has no bounded peak)"
    elif r > (big.diameter - small.diameter) / 2 * (1 + 1e-9):
        why = f"the fillet at {fld} exceeds the step (not a tangent quarter round)"
    elif s0.section is not None or s1.section is not None or (big.bore or 0.0):
        why = f"the shoulder at {fld} has a bore or bonded regions: the 3-D model is one solid material"
    elif ss.symmetry:
        why = (f"the case asks for the {('whole', 'half', 'quarter')[ss.symmetry]} model ({ss.field}.model); a "
               "shoulder needs the whole model")
    if why is not None:
        ss.shoulder_not_in_model = why
        return
    D = big.diameter
    # the model's frame: z from its end on the small diameter, the shoulder stepping up along +z; a
    # shoulder stepping down along the shaft is mirrored (z runs against the shaft's)
    dist = (at - ss.centre) if up else (ss.centre - at)  # from the feature's centre to the face, > 0
    z_feat = COMBINED_MARGIN * d + span / 2
    L = z_feat + dist + COMBINED_MARGIN * D
    fz = z_feat
    if ss.kind == "cross_hole":
        f2 = solid.CrossHole(feat.diameter, fz, feat.chamfer, feat.depth)
    elif ss.kind == "keyseat_end":
        f2 = solid.ProfileKeyseat(feat.width, feat.depth, fz - span / 2, fz + span / 2, feat.fillet)
    else:
        f2 = solid.SledKeyseat(feat.width, feat.depth, fz - span / 2, fz + span / 2, feat.cutter_diameter, feat.fillet)
    model = solid.Segment(d, L, (f2, solid.Shoulder(D, z_feat + dist, r)))
    try:
        model.check(ss.field)
    except InputError as exc:
        ss.shoulder_not_in_model = f"the combined model is refused ({exc.reason}); the feature modelled alone"
        return
    ss.model_alone = ss.model
    ss.model = model
    ss.mirrored = not up
    ss.mid = ss.centre + (L / 2 - z_feat) * (1 if up else -1)
    ss.shoulder_in_model = {"D": D, "fillet": r, "at": at, "field": fld, "gap": gap,
                            "steps": "up" if up else "down"}


def use_alone(ss, why: str) -> None:
    """Fall back from the combined model (feature and shoulder) to the feature's own model, recording
    why (the larger-of-the-two rule then holds)."""
    if ss.model_alone is None:
        return
    ss.model, ss.model_alone = ss.model_alone, None
    ss.mirrored, ss.mid, ss.shoulder_in_model = False, ss.centre, None
    ss.shoulder_not_in_model = why

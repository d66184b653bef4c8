"""The ``[segment]`` table of a case: a short round shaft length with one 3-D feature (a keyseat's
end, a sled-runner keyseat, a cross hole), studied in 3-D (compare/solve/segments.py) instead of a
section. Every field is checked here with one-line :class:`~fem.errors.InputError`; lengths in SI.

Keys: ``kind`` ("keyseat_end", "sled_runner", "cross_hole", or "shoulder": the shoulder alone), ``diameter``,
``length`` (the modelled length, default the feature's span plus :data:`MARGIN` diameters, at least 3;
beside a shoulder 3 diameters; a shoulder alone: up to the face and :data:`SHOULDER_BEYOND` larger
diameters beyond), ``at`` (the feature's centre along the segment, default mid-length);
keyseats: ``width``, ``depth``, ``fillet`` (or ``standard = "metric"`` for the metric parallel key's
keyway of the diameter, classic/keys.py), ``key_length`` (end to end), sled runner ``cutter_diameter``;
cross hole: ``hole_diameter``, ``chamfer`` (default 0), ``hole_depth`` (blind; default through).
Optional ``shoulder = { D = ..., fillet = ..., at = ... }``: the segment steps up from ``diameter`` to
``D`` at ``at`` (the shoulder face; the larger diameter beyond it) through a quarter-round ``fillet``;
the feature must lie clear of the fillet, on either diameter. ``kind = "shoulder"`` takes only
``diameter``, ``length`` and that ``shoulder`` table (required): a stepped round bar with no other
feature (its factors beside the shoulder fits of classic/notch_fits.py).
Optional ``model`` ("whole", "half" or "quarter"; default the smallest the features allow,
:func:`fem.solid.symmetry_of`): the part of the segment meshed; "whole" forces the whole segment, a
model the features do not allow is refused (:func:`parse_model`, Case.segment_symmetry).
"""
from __future__ import annotations

from dataclasses import replace

from classic.keys import metric_parallel_key
from fem import solid
from fem.errors import InputError

from .fields import known
from .units import to_si

KINDS = ("keyseat_end", "sled_runner", "cross_hole", "shoulder")
#: The default modelled length without a shoulder: the feature's span plus this many diameters (1.5 of
#: plain bar at each end), at least three diameters; the same rule as a layout station's
#: (compare/case/shaft_segment.py imports it; the measurement behind it is written there).
MARGIN = 3.0
_KEYS = {"kind", "diameter", "length", "at", "width", "depth", "fillet", "key_length", "cutter_diameter",
         "hole_diameter", "chamfer", "hole_depth", "standard", "shoulder", "model"}
_SHOULDER_KEYS = {"D", "fillet", "at"}
_ALLOWED = {"keyseat_end": {"width", "depth", "fillet", "key_length", "standard"},
            "sled_runner": {"width", "depth", "fillet", "key_length", "cutter_diameter", "standard"},
            "cross_hole": {"hole_diameter", "chamfer", "hole_depth"}, "shoulder": set()}
_KIND_WORDS = "must be \"keyseat_end\", \"sled_runner\", \"cross_hole\" or \"shoulder\""


#: a shoulder segment's default length beyond the shoulder face, in larger diameters (fem.solid's
#: END_ZONE of 0.75 of plain bar there, and half a diameter more for the fillet's disturbance to fade)
SHOULDER_BEYOND = 1.25

#: the models of a segment, by the mirror symmetry they use (fem.solid's ``symmetry`` 0, 1, 2)
MODELS = ("whole", "half", "quarter")
#: what each model needs of the features
_NEEDS = {"half": "features symmetric about the plane through the axis and the feature's centre line",
          "quarter": "features symmetric about that plane and centred along the segment (the mid-length plane)"}


def parse_model(value, seg: solid.Segment, field: str) -> int | None:
    """The symmetry of the ``model`` the case asks for (None: not given, the study takes the smallest
    model the features allow); an unknown name, or a model the features do not allow, is refused."""
    if value is None:
        return None
    if value not in MODELS:
        raise InputError(field, value, 'must be "whole", "half" or "quarter"')
    sym = MODELS.index(value)
    allowed = solid.symmetry_of(seg)
    if sym > allowed:
        raise InputError(field, value,
                         f"needs {_NEEDS[value]}; these features allow the {MODELS[allowed]} model at most")
    return sym


def parse_segment(s, units) -> solid.Segment:
    if not isinstance(s, dict):
        raise InputError("segment", s, "must be a table: [segment] with kind = \"keyseat_end\", \"sled_runner\", "
                         "\"cross_hole\" or \"shoulder\"")
    known(s, _KEYS, "segment")
    kind = s.get("kind")
    if kind not in KINDS:
        raise InputError("segment.kind", kind, _KIND_WORDS)
    for k in s:
        if k not in _ALLOWED[kind] | {"kind", "diameter", "length", "shoulder", "model"} | ({"at"} if kind != "shoulder" else set()):
            raise InputError(f"segment.{k}", s[k], f"is not a field of a {kind} segment")

    def length(key, default=None, required=True):
        if key not in s:
            if default is None and required:
                raise InputError(f"segment.{key}", None, "is missing")
            return default
        v = to_si(s[key], "length", f"segment.{key}", units)
        if not v > 0:
            raise InputError(f"segment.{key}", s[key], "must be a positive length")
        return v

    d = length("diameter")
    L = length("length", 3 * d)
    at = length("at", L / 2)
    if kind == "shoulder":
        if "shoulder" not in s:
            raise InputError("segment.shoulder", None, "is missing (a shoulder segment needs shoulder = { D = ..., "
                             "fillet = ..., at = ... })")
        feat = None
    elif kind == "cross_hole":
        dh = length("hole_diameter")
        chamfer = 0.0
        if "chamfer" in s:
            chamfer = to_si(s["chamfer"], "length", "segment.chamfer", units)
            if chamfer < 0:
                raise InputError("segment.chamfer", s["chamfer"], "must not be negative")
        feat = solid.CrossHole(dh, at, chamfer, length("hole_depth", required=False))
    else:
        std = s.get("standard")
        if std is not None and std != "metric":
            raise InputError("segment.standard", std, "must be \"metric\" (the metric parallel key's keyway of the diameter)")
        if std == "metric":
            try:
                k = metric_parallel_key(d)
            except (ValueError, KeyError):
                raise InputError("segment.diameter", s["diameter"], "is outside the metric parallel key table") from None
            width = length("width", k["width"])
            depth = length("depth", k["depth"])
            fillet = length("fillet", k["r_max"])
        else:
            width, depth, fillet = length("width"), length("depth"), length("fillet")
        kl = length("key_length", 4 * width)
        z0, z1 = at - kl / 2, at + kl / 2
        if kind == "keyseat_end":
            feat = solid.ProfileKeyseat(width, depth, z0, z1, fillet)
        else:
            feat = solid.SledKeyseat(width, depth, z0, z1, length("cutter_diameter"), fillet)
    sh = s.get("shoulder")
    if "length" not in s and sh is None:  # the default length from the feature's span (its place, if not given, centred)
        a, b = feat.span()
        L = max(3 * d, b - a + MARGIN * d)
        if "at" not in s:
            feat = (replace(feat, z=L / 2) if kind == "cross_hole" else
                    replace(feat, z0=feat.z0 + L / 2 - at, z1=feat.z1 + L / 2 - at))
    feats = (feat,) if feat is not None else ()
    if sh is not None:
        if not isinstance(sh, dict):
            raise InputError("segment.shoulder", sh, "must be a table: shoulder = { D = ..., fillet = ..., at = ... }")
        known(sh, _SHOULDER_KEYS, "segment.shoulder")
        vals = {}
        for key in ("D", "fillet", "at"):
            if key not in sh:
                raise InputError(f"segment.shoulder.{key}", None, "is missing")
            vals[key] = to_si(sh[key], "length", f"segment.shoulder.{key}", units)
            if not vals[key] > 0:
                raise InputError(f"segment.shoulder.{key}", sh[key], "must be a positive length")
        feats = (*feats, solid.Shoulder(vals["D"], vals["at"], vals["fillet"]))
        if kind == "shoulder" and "length" not in s:
            L = vals["at"] + SHOULDER_BEYOND * vals["D"]  # the default: the larger bar beyond the face
    seg = solid.Segment(d, L, feats)
    try:
        seg.check("segment")
    except InputError as exc:  # name the case-file field; echo the value as written where there is one
        if exc.field.startswith(f"segment.features[{len(feats) - 1}].") and sh is not None:
            key = {"z": "at"}.get(exc.field.rsplit(".", 1)[1], exc.field.rsplit(".", 1)[1])
            raise InputError(f"segment.shoulder.{key}", sh.get(key), exc.reason) from None
        f = exc.field.replace("segment.features[0].", "segment.")
        f = {"segment.d": "segment.diameter", "segment.z": "segment.at", "segment.z1": "segment.key_length",
             "segment.diameter": "segment.hole_diameter" if kind == "cross_hole" else "segment.diameter",
             "segment.depth": "segment.hole_depth" if kind == "cross_hole" else "segment.depth"}.get(f, f)
        key = f.split(".", 1)[1]
        raise InputError(f, s.get(key), exc.reason if hasattr(exc, "reason") else str(exc)) from None
    return seg

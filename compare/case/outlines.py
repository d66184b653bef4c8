"""The [section] shapes built outside the primitives: splines (``shape = "spline"``) and outlines
read from a file (``shape = "dxf"``, ``"step"``, ``"brep"``, ``"mesh"``). Called from
:func:`compare.case.case.parse_section`; every value is checked and converted to SI here, and every
refusal names the field and the value as written.
"""
from __future__ import annotations

import math
from pathlib import Path

from fem.errors import InputError
from fem.outline_import import cad_section, dxf_section, mesh_file_section
from fem.splines import ISO14, ISO14_SOURCE, involute_spline_section, straight_spline_section

from .units import UnitSystem, to_si
from .fields import known as _known

SPLINE_KEYS = {"involute": {"shape", "form", "teeth", "module", "diametral_pitch", "pressure_angle", "major_diameter",
                            "minor_diameter", "root", "fillet", "bore", "tooth_thickness", "length"},
               "straight": {"shape", "form", "splines", "minor_diameter", "major_diameter", "width", "fillet", "bore",
                            "series", "length"}}
#: ``length`` (both forms): the splined (engaged) length along the shaft, read by case.parse_feature_lengths
FILE_KEYS = {"dxf": {"shape", "file", "units", "layer"}, "step": {"shape", "file"}, "brep": {"shape", "file", "units"},
             "mesh": {"shape", "file", "units"}}
#: Mesh formats meshio reads as text (by file suffix); binary files are refused by the bounded reader.
MESH_SUFFIXES = (".msh", ".vtk", ".vtu", ".obj", ".off", ".stl", ".ply", ".mesh", ".xdmf", ".inp", ".su2")
INCH = 0.0254  # m, exact (international inch, 1959)


def _whole(s, key):
    v = s.get(key)
    if isinstance(v, bool) or not isinstance(v, int):
        raise InputError(f"section.{key}", v, "must be a whole number" if key in s else "is required")
    return v


def parse_spline(s: dict, units: UnitSystem | None):
    form = s.get("form")
    if form not in SPLINE_KEYS:
        raise InputError("section.form", form, "must be \"involute\" or \"straight\"")
    _known(s, SPLINE_KEYS[form], "section")
    L = lambda key: to_si(s[key], "length", f"section.{key}", units) if key in s else None  # noqa: E731
    if form == "involute":
        teeth = _whole(s, "teeth")
        if ("module" in s) == ("diametral_pitch" in s):
            raise InputError("section.module", s.get("module"), "give either module or diametral_pitch (one of them)")
        if "module" in s:
            module, standard = L("module"), "ISO 4156"
        else:
            P = s["diametral_pitch"]
            if isinstance(P, bool) or not isinstance(P, (int, float)) or not (math.isfinite(P) and P > 0):
                raise InputError("section.diametral_pitch", P, "must be a positive number (teeth per inch of pitch diameter)")
            module, standard = INCH / P, "ANSI B92.1"
        pa = s.get("pressure_angle", 30)
        if isinstance(pa, bool) or not isinstance(pa, (int, float)):
            raise InputError("section.pressure_angle", pa, "must be 30, 37.5 or 45 (degrees)")
        root = s.get("root", "flat" if float(pa) == 30.0 else "fillet")
        return involute_spline_section(teeth, module, float(pa), L("major_diameter"), L("minor_diameter"), root,
                                       L("fillet"), L("bore"), L("tooth_thickness"), standard)
    n = _whole(s, "splines")
    for key in ("minor_diameter", "major_diameter"):
        if key not in s:
            raise InputError(f"section.{key}", None, "is required")
    d, D = L("minor_diameter"), L("major_diameter")
    width, src = L("width"), {}
    if width is None:
        series = s.get("series")
        if series not in ("light", "medium"):
            raise InputError("section.width", None, "is required (or give series = \"light\" or \"medium\" to take it "
                             "from the ISO 14 table)")
        key = (series, n, _mm(d), _mm(D))
        if key not in ISO14:
            raise InputError("section.series", series, f"ISO 14 has no {series} spline {n} x {_mm(d):g} x {_mm(D):g} mm "
                             "in the table shaftcheck holds (from memory); give width")
        width, src["width"] = ISO14[key] * 1e-3, ISO14_SOURCE
    return straight_spline_section(n, d, D, width, L("fillet") or 0.0, L("bore"), src)


def _mm(v: float) -> float:
    return round(v * 1e3, 6)


def parse_file_shape(s: dict, units: UnitSystem | None, base_dir: Path | None, read_text):
    """``shape = "dxf" | "step" | "brep" | "mesh"``: the file read through ``read_text`` (the bounded
    reader), relative paths taken from ``base_dir`` (the case file's folder)."""
    shape = s["shape"]
    _known(s, FILE_KEYS[shape], "section")
    raw = s.get("file")
    if not isinstance(raw, str) or not raw.strip():
        raise InputError("section.file", raw, "is required: the path of the file, as a string")
    path = Path(raw)
    if not path.is_absolute() and base_dir is not None:
        path = base_dir / path
    scale = None
    if "units" in s:
        u = s["units"]
        if not isinstance(u, str) or not u.strip():
            raise InputError("section.units", u, "must be a length unit, e.g. \"mm\" or \"in\"")
        try:
            scale = to_si(f"1 {u}", "length", "section.units", None)
        except InputError:
            raise InputError("section.units", u, "is not a length unit (e.g. \"mm\", \"in\", \"m\")") from None
        if not scale > 0:
            raise InputError("section.units", u, "is not a length unit (e.g. \"mm\", \"in\", \"m\")")
    layer = s.get("layer")
    if layer is not None and not isinstance(layer, str):
        raise InputError("section.layer", layer, "must be a layer name (a string)")
    if shape in ("brep", "mesh") and scale is None:
        raise InputError("section.units", None, f"is required: a {shape.upper()} file does not say its length unit")
    suffix = {"step": ".step", "brep": ".brep", "dxf": ".dxf"}.get(shape) or path.suffix.lower()
    if shape == "mesh" and suffix not in MESH_SUFFIXES:
        raise InputError("section.file", raw, f"has no mesh file suffix meshio reads as text ({', '.join(MESH_SUFFIXES)})")
    try:
        text = read_text(path, "section.file")
    except InputError as exc:
        raise InputError("section.file", raw, exc.reason.replace("give a TOML file", "give the file")) from None
    try:
        if shape == "dxf":
            return dxf_section(text, layer, scale)
        if shape == "mesh":
            return mesh_file_section(text, suffix, scale)
        return cad_section(text, suffix, 1.0 if shape == "step" else scale)
    except InputError as exc:
        if exc.field == "section.file" and exc.value is None:
            raise InputError("section.file", raw, exc.reason) from None
        raise

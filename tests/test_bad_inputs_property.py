"""Property test of the input promise (issue 8, 'Also build'): whatever a case file holds (random
TOML values in every field, random TOML-like junk, random bytes), ``shaftcheck run`` either refuses it
with exit code 2 and exactly one line on stderr naming a field, or accepts it; never a traceback.

No FE run is started: the solve is replaced by a stand-in that records that the input was accepted,
so every example takes milliseconds. (What the geometry kernel refuses while building is covered by
the corpus in tests/bad_inputs/.)
"""
import contextlib
import io
import json
import math
import tempfile
from pathlib import Path

import pytest

hypothesis = pytest.importorskip("hypothesis")
from hypothesis import HealthCheck, given, settings  # noqa: E402
from hypothesis import strategies as st  # noqa: E402

SETTINGS = settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])


class Accepted(Exception):
    """Raised by the stand-in for the solve: the input passed every check."""


def run_case_bytes(data: bytes, table: bytes | None = None):
    """Run the CLI on a case file holding ``data``; (exit code or 'accepted', stderr)."""
    from compare.cli import cmd_run, main

    def stand_in(*args, **kwargs):
        raise Accepted

    with tempfile.TemporaryDirectory() as d, pytest.MonkeyPatch.context() as mp:
        mp.setattr(cmd_run, "analyse", stand_in)
        case = Path(d) / "case.toml"
        case.write_bytes(data)
        if table is not None:
            (Path(d) / "table.toml").write_bytes(table)
        out = Path(d) / "out"
        err = io.StringIO()
        with contextlib.redirect_stderr(err), contextlib.redirect_stdout(io.StringIO()):
            try:
                code = main(["run", "--no-report", str(case), "--out", str(out)])
            except Accepted:
                code = "accepted"
        assert not out.exists()  # refused or stopped before the solve: nothing written
        return code, err.getvalue()


def check_promise(code, err):
    if code == "accepted":
        assert err == ""
        return
    assert code == 2, (code, err)
    assert err.startswith("shaftcheck: error: ") and err.count("\n") == 1 and err.endswith("\n"), err
    assert "Traceback" not in err
    assert not any(ord(c) < 32 or 0x7F <= ord(c) < 0xA0 for c in err[:-1]), err


# ------------------------------------------------------------------------- a small TOML writer

def qstr(v: str) -> str:
    """A TOML basic string (JSON's escapes are TOML's; DEL must be escaped in TOML)."""
    return json.dumps(v, ensure_ascii=False).replace("\x7f", "\\u007f")


def toml_value(v) -> str:
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, float):
        return "nan" if math.isnan(v) else ("inf" if v == math.inf else "-inf" if v == -math.inf else repr(v))
    if isinstance(v, int):
        return str(v)
    if isinstance(v, str):
        return qstr(v)
    if isinstance(v, list):
        return "[" + ", ".join(toml_value(x) for x in v) + "]"
    if isinstance(v, dict):
        return "{" + ", ".join(f"{qstr(k)} = {toml_value(x)}" for k, x in v.items()) + "}"
    raise TypeError(type(v))


def toml_document(doc: dict) -> str:
    lines = []
    for table, body in doc.items():
        if isinstance(body, dict):
            lines.append(f"[{qstr(table)}]")
            lines += [f"{qstr(k)} = {toml_value(v)}" for k, v in body.items()]
        else:
            lines.insert(0, f"{qstr(table)} = {toml_value(body)}")
    return "\n".join(lines) + "\n"


scalars = st.one_of(
    st.integers(min_value=-10**20, max_value=10**20), st.floats(allow_nan=True, allow_infinity=True),
    st.booleans(), st.text(max_size=12),
    st.sampled_from(["25 mm", "inf", "nan mm", "-3 in", "1e400 N*m", "0.5 rad", "12 %", "80 degC", "-300 degC",
                     "205 GPa", "machined", "ductile", "mm-N-MPa", "in-lbf-psi", "\x1b[31m", "1 mm**9**9"]),
)
values = st.recursive(scalars, lambda inner: st.one_of(st.lists(inner, max_size=4),
                                                       st.dictionaries(st.text(max_size=6), inner, max_size=3)),
                      max_leaves=8)

BASE = {
    "case": {"title": "p", "units": "mm-N-MPa"},
    "section": {"shape": "keyed", "diameter": 25, "keyways": [{"width": 8, "depth": 4, "fillet": 0.4}]},
    "loads": {"torque": "120 N*m"},
    "material": {"shear_modulus": "79 GPa", "poisson": 0.3, "yield": 390, "ultimate": 630},
    "analysis": {"design_factor": 1.5},
}
FIELDS = {
    "case": ["title", "units", "source"],
    "section": ["shape", "diameter", "bore", "keyways", "add", "cut"],
    "loads": ["torque", "bending", "shear", "axial", "torque_alternating", "bending_alternating", "rotating"],
    "material": ["shear_modulus", "elastic_modulus", "poisson", "yield", "ultimate", "endurance_limit", "surface",
                 "temperature", "kind", "name", "reliability"],
    "analysis": ["fineness", "accuracy", "max_dofs", "max_seconds", "design_factor", "materials"],
    "fatigue": ["kt_bending", "kt_bending_source", "kts_torsion", "notch_radius"],
    "expected": ["torsion.J", "torsion.tau_max", "x"],
}
keyway_fields = st.sampled_from(["width", "depth", "fillet", "angle"])
primitive = st.sampled_from([
    {"disk": {"center": [0, 0], "radius": 20}}, {"ellipse": {"semi_axes": [20, 10], "rotation": 30}},
    {"rectangle": {"size": [10, 6], "center": [0, 19]}}, {"polygon": {"points": [[0, 0], [5, 0], [0, 5]]}},
])


@st.composite
def mutated_cases(draw):
    import copy

    doc = copy.deepcopy(BASE)
    for _ in range(draw(st.integers(1, 3))):
        how = draw(st.sampled_from(["field", "keyway", "primitive", "table"]))
        if how == "field":
            table = draw(st.sampled_from(sorted(FIELDS)))
            if not isinstance(doc.get(table), dict):
                doc[table] = {}
            doc[table][draw(st.sampled_from(FIELDS[table]))] = draw(values)
        elif how == "keyway":
            doc["section"] = {"shape": "keyed", "diameter": 25,
                              "keyways": [{"width": 8, "depth": 4, "fillet": 0.4, draw(keyway_fields): draw(values)}]}
        elif how == "primitive":
            p = copy.deepcopy(draw(primitive))
            kind = next(iter(p))
            p[kind][draw(st.sampled_from(["center", "radius", "semi_axes", "rotation", "size", "points", "fillet"]))] = \
                draw(values)
            doc["section"] = {"shape": "custom", "add": [{"disk": {"radius": 20}}], "cut": [p]}
        else:
            doc[draw(st.sampled_from(sorted(FIELDS) + ["junk"]))] = draw(values)
    return doc


@SETTINGS
@given(mutated_cases())
def test_random_case_files_keep_the_promise(doc):
    try:
        text = toml_document(doc)
    except TypeError:
        return
    check_promise(*run_case_bytes(text.encode("utf-8", "surrogatepass")))


toml_junk = st.lists(st.sampled_from(["[", "]", "[[", "]]", "{", "}", "=", "\"", "'", ",", "\n", "section", "case",
                                      "shape", "keyways", " ", "1", "inf", "nan", "x", ".", "#", "\\u001b", "\\"]),
                     max_size=40).map("".join)


@SETTINGS
@given(st.one_of(toml_junk, st.text(max_size=200)))
def test_random_toml_junk_keeps_the_promise(text):
    check_promise(*run_case_bytes(text.encode("utf-8", "surrogatepass")))


@SETTINGS
@given(st.binary(max_size=300))
def test_random_bytes_keep_the_promise(data):
    check_promise(*run_case_bytes(data))


TABLE_FIELDS = ["name", "class", "kind", "yield", "ultimate", "endurance_limit", "surface", "max_service_temperature",
                "note", "compressive_ultimate"]


@SETTINGS
@given(st.sampled_from(TABLE_FIELDS), values, st.sampled_from(["units", "title", "illustrative"]), values)
def test_random_material_tables_keep_the_promise(row_key, row_value, head_key, head_value):
    case = toml_document({**BASE, "analysis": {"design_factor": 1.5, "materials": "table.toml"}})
    table = {"table": {"units": "mm-N-MPa", head_key: head_value},
             "material": {"name": "a", "yield": 300, "ultimate": 500, row_key: row_value}}
    text = (f"[table]\n" + "\n".join(f"{qstr(k)} = {toml_value(v)}" for k, v in table["table"].items()) +
            "\n[[material]]\n" + "\n".join(f"{qstr(k)} = {toml_value(v)}" for k, v in table["material"].items()))
    check_promise(*run_case_bytes(case.encode(), text.encode("utf-8", "surrogatepass")))

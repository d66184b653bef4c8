"""compare/case/outlines.py: spline and file sections from case files, in SI, files taken relative
to the case file, and what results.json says about them."""
import json
import math
from pathlib import Path

import pytest

from compare.case.case import load_case, parse_case
from fem.errors import InputError

DRAWINGS = Path(__file__).parent / "bad_inputs" / "drawings"
TAIL = '\n[loads]\ntorque = "20 N*m"\n[material]\nshear_modulus = "79 GPa"\n[analysis]\naccuracy = "5 %"\n'


def case(section: dict, units="mm-N-MPa"):
    return parse_case({"case": {"units": units}, "section": section, "loads": {"torque": 10.0},
                       "material": {"shear_modulus": "79 GPa"}})


def test_an_inch_involute_spline_from_its_diametral_pitch():
    """ANSI B92.1: pitch diameter N/P; 30° flat root major (N + 1)/P, minor (N − 1.35)/P (from memory)."""
    c = case({"shape": "spline", "form": "involute", "teeth": 16, "diametral_pitch": 16, "pressure_angle": 30},
             units="in-lbf-psi")
    g = {n: v for n, v, _ in c.section.geometry}
    assert g["pitch_diameter"] == pytest.approx(1.0 * 0.0254, rel=1e-12)  # 16 teeth / 16 per inch = 1 in
    assert g["major_diameter"] == pytest.approx(17 / 16 * 0.0254, rel=1e-12)
    assert g["minor_diameter"] == pytest.approx(14.65 / 16 * 0.0254, rel=1e-12)
    assert g["standard"] == "ANSI B92.1" and c.section.kind == "spline"


def test_given_dimensions_override_the_defaults_and_say_so():
    c = case({"shape": "spline", "form": "involute", "teeth": 20, "module": 1, "major_diameter": 20.8,
              "minor_diameter": 18.4, "fillet": 0.3, "bore": 8})
    src = {n: s for n, _v, s in c.section.geometry}
    g = {n: v for n, v, _ in c.section.geometry}
    assert g["major_diameter"] == pytest.approx(20.8e-3) and src["major_diameter"] == "given"
    assert g["bore"] == pytest.approx(8e-3) and c.section.bore == pytest.approx(8e-3)


def test_a_straight_spline_takes_its_width_from_the_iso14_table():
    """ISO 14 light series 8 x 32 x 36: width 6 mm (from memory)."""
    c = case({"shape": "spline", "form": "straight", "splines": 8, "minor_diameter": 32, "major_diameter": 36,
              "series": "light"})
    g = {n: (v, s) for n, v, s in c.section.geometry}
    assert g["width"][0] == pytest.approx(6e-3) and "ISO 14" in g["width"][1]


def test_a_drawing_is_found_beside_its_case_file(tmp_path):
    (tmp_path / "d").mkdir()
    (tmp_path / "d" / "sq.dxf").write_bytes((DRAWINGS / "square_20mm.dxf").read_bytes())
    p = tmp_path / "c.toml"
    p.write_text('[case]\nunits = "mm-N-MPa"\n[section]\nshape = "dxf"\nfile = "d/sq.dxf"\n' + TAIL)
    c = load_case(p)
    assert c.section.kind == "imported"
    g = {n: v for n, v, _ in c.section.geometry}
    assert g["length_unit"] == 1e-3 and g["loops"] == 1


def test_units_in_the_case_override_the_drawing(tmp_path):
    p = tmp_path / "c.toml"
    p.write_text(f'[section]\nshape = "dxf"\nfile = "{(DRAWINGS / "no_units.dxf").as_posix()}"\nunits = "in"\n' + TAIL)
    c = load_case(p)
    assert {n: v for n, v, _ in c.section.geometry}["length_unit"] == pytest.approx(0.0254, rel=1e-14)


def test_a_refused_file_is_named_as_written(tmp_path):
    p = tmp_path / "c.toml"
    p.write_text('[section]\nshape = "dxf"\nfile = "missing/\\u001b[31mred.dxf"\n' + TAIL)
    with pytest.raises(InputError) as e:
        load_case(p)
    assert e.value.field == "section.file" and "\\x1b" in str(e.value) and "\x1b" not in str(e.value)


def test_results_of_a_mesh_section_say_no_curved_boundary_is_claimed(tmp_path, run_cli):
    mesh = ("$MeshFormat\n2.2 0 8\n$EndMeshFormat\n$Nodes\n5\n1 0 0 0\n2 20 0 0\n3 20 20 0\n4 0 20 0\n5 10 10 0\n"
            "$EndNodes\n$Elements\n4\n1 2 0 1 2 5\n2 2 0 2 3 5\n3 2 0 3 4 5\n4 2 0 4 1 5\n$EndElements\n")
    (tmp_path / "sq.msh").write_text(mesh)
    p = tmp_path / "c.toml"
    p.write_text('[case]\nunits = "mm-N-MPa"\n[section]\nshape = "mesh"\nfile = "sq.msh"\nunits = "mm"\n' + TAIL)
    code, out, err = run_cli("run", str(p), "--out", str(tmp_path / "o"), "--no-vtu")
    assert code == 0, err
    r = json.loads((tmp_path / "o" / "results.json").read_text())
    assert r["section"]["geometry"]["curved_boundary"]["value"] is False
    assert "straight_facet_outline" in [w["code"] for w in r["warnings"]]
    assert "STRAIGHT FACETS ONLY" in out
    # a 20 mm square: J = 0.1406·a⁴ (Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, case 4)
    J = {"fem": r["torsion"]["J"], "exact": 0.1406 * 0.02**4}
    assert J["fem"] == pytest.approx(J["exact"], rel=2e-3)


def test_results_of_a_spline_pair_it_with_the_round_bars(tmp_path, run_cli):
    p = tmp_path / "c.toml"
    p.write_text('[case]\nunits = "mm-N-MPa"\n[section]\nshape = "spline"\nform = "straight"\nsplines = 6\n'
                 'minor_diameter = 23\nmajor_diameter = 26\nseries = "light"\nfillet = 0.4\n' + TAIL)
    code, out, err = run_cli("run", str(p), "--out", str(tmp_path / "o"), "--no-vtu")
    assert code == 0, err
    r = json.loads((tmp_path / "o" / "results.json").read_text())
    pairs = {q["quantity"]: q for q in r["compare"]}
    lo = pairs["J relative to the round bar of the minor diameter"]
    hi = pairs["J relative to the round bar of the major diameter"]
    # the section lies between the two discs, so its J lies between theirs (Pólya & Szegő, 1951)
    assert lo["ratio"] > 1 > hi["ratio"]
    assert lo["classic"] == pytest.approx(math.pi * 0.023**4 / 32, rel=1e-12)
    assert lo["kind"] == "factor" and lo["within_tolerance"] is None
    assert r["section"]["geometry"]["width"]["value"] == pytest.approx(6e-3)
    assert "spline_2d_model" in [w["code"] for w in r["warnings"]]
    # Kts on the minor (root) diameter, as spline practice takes the shaft stress (Machinery's
    # Handbook, 26th ed., 'Involute Splines', from memory); the major-diameter ratio is context only
    T = abs(r["torsion"]["torque"])
    nominal = 16 * T / (math.pi * 0.023**3)  # elementary torsion of the minor-diameter round bar
    assert r["torsion"]["kts_nominal"]["tau_nominal"] == pytest.approx(nominal, rel=1e-12)
    assert "minor (root) diameter" in r["torsion"]["kts_nominal"]["formula"]
    assert r["torsion"]["kts"] == pytest.approx(r["torsion"]["tau_max"] / nominal, rel=1e-12)
    major = pairs["τmax relative to 16T/(πD³) on the major diameter"]
    assert major["classic"] == pytest.approx(16 * T / (math.pi * 0.026**3), rel=1e-12)
    assert major["ratio"] > r["torsion"]["kts"]  # the major diameter understates the nominal stress
    assert "Kts (τmax / nominal on the minor diameter)" in out  # the convention named beside the number

"""The Python API (compare.api), notebook style: a case built in Python is the case a file gives,
the result is the dictionary the command line writes, and bad input raises InputError."""
import json
import math

import pytest

from compare import Case, InputError, Result, analyse

# accuracy 1 %: these tests compare the API with the command line, not the mesh; it keeps them fast
KEYED = dict(diameter="30 mm", keyways=[dict(width="8 mm", depth="4 mm", fillet="0.4 mm")], torque="180 N*m",
             material=dict(elastic_modulus="205 GPa", poisson=0.29), analysis=dict(accuracy="1 %"),
             title="keyed shaft built in Python")
KEYED_TOML = """
[case]
title = "keyed shaft built in Python"
[section]
shape = "keyed"
diameter = "30 mm"
[[section.keyways]]
width = "8 mm"
depth = "4 mm"
fillet = "0.4 mm"
[loads]
torque = "180 N*m"
[material]
elastic_modulus = "205 GPa"
poisson = 0.29
[analysis]
accuracy = "1 %"
"""


def _without_timings_and_file(d):
    """results.json apart from what legitimately differs between two runs: timings, the file name and the
    input file hashes (a case built in Python has no file)."""
    if isinstance(d, dict):
        return {k: _without_timings_and_file(v) for k, v in d.items() if k not in ("seconds", "file", "inputs")}
    if isinstance(d, list):
        return [_without_timings_and_file(v) for v in d]
    return d


@pytest.fixture(scope="module")
def keyed_result():
    return analyse(Case.keyed(**KEYED))


def test_case_built_in_python_is_the_case_of_the_file(tmp_path):
    path = tmp_path / "keyed.toml"
    path.write_text(KEYED_TOML, encoding="utf-8")
    built, loaded = Case.keyed(**KEYED), Case.load(path)
    assert loaded.path == path and built.path is None
    for part in ("title", "units", "loads", "material", "analysis", "fatigue"):
        assert getattr(built, part) == getattr(loaded, part), part
    assert built.section.kind == loaded.section.kind == "keyed"
    assert built.section.diameter == loaded.section.diameter == pytest.approx(0.030, rel=1e-15)
    assert built.section.keyways == loaded.section.keyways


def test_notebook_keyed_section_matches_the_command_line(keyed_result, tmp_path, run_cli):
    """The same keyed case from TOML through ``shaftcheck run``: the same results.json."""
    path = tmp_path / "keyed.toml"
    path.write_text(KEYED_TOML, encoding="utf-8")
    code, _, err = run_cli("run", "--no-report", str(path), "--out", str(tmp_path / "cli"), "--quiet")
    assert code == keyed_result.exit_code == 0, err
    cli = json.loads((tmp_path / "cli" / "results.json").read_text(encoding="utf-8"))
    api = keyed_result.to_dict()
    assert api["case"]["file"] is None and cli["case"]["file"] == str(path)
    assert _without_timings_and_file(api) == _without_timings_and_file(cli)


def test_result_attributes_are_the_results_dictionary(keyed_result):
    r, d = keyed_result, keyed_result.to_dict()
    assert isinstance(r, Result)
    assert r.torsion.J == d["torsion"]["J"] and r.torsion.kts == d["torsion"]["kts"]
    assert r.accuracy.met is d["accuracy"]["met"] is True
    assert r["torsion"]["tau_max"] == d["torsion"]["tau_max"]
    assert r.compare[0].ratio == d["compare"][0]["ratio"]
    assert "kts" in dir(r.torsion)
    with pytest.raises(AttributeError, match="no 'nonsense'"):
        r.torsion.nonsense
    # a copy: changing it leaves the result alone
    d["torsion"]["J"] = -1.0
    assert r.torsion.J > 0
    # the keyed section keeps part of the plain shaft's stiffness and raises the peak shear; the
    # nominal is 16T/(πd³) on the full diameter (Pilkey & Pilkey, Peterson's Stress Concentration
    # Factors, 3rd ed., the convention of its keyseat charts)
    assert r.torsion.kts_nominal.tau_nominal == pytest.approx(16 * 180.0 / (math.pi * 0.030**3), rel=1e-12)
    assert r.torsion.J < math.pi * 0.030**4 / 32 and r.torsion.kts > 1.0


def test_quantities_carry_their_units(keyed_result):
    r = keyed_result
    assert r.q.torsion.J.to("mm**4").magnitude == pytest.approx(r.torsion.J * 1e12, rel=1e-12)
    assert r.q.torsion.tau_max.to("MPa").magnitude == pytest.approx(r.torsion.tau_max / 1e6, rel=1e-12)
    assert r.q.torsion.kts.to("").magnitude == pytest.approx(r.torsion.kts)
    assert r.q.torsion.tau_max_at.to("mm").magnitude.tolist() == pytest.approx([1e3 * v for v in r.torsion.tau_max_at])
    pair = r.q.compare[0]  # pairs carry their own dimension
    assert pair.fe.to("m**4").magnitude == pytest.approx(r.compare[0].fe)
    with pytest.raises(AttributeError, match="no unit is recorded"):
        r.q.mesh.elements


def test_save_writes_what_the_command_line_writes(keyed_result, tmp_path):
    out = keyed_result.save(tmp_path / "api")
    assert sorted(p.name for p in out.iterdir()) == ["figures", "report.html", "results.csv", "results.json", "section.vtu"]
    assert json.loads((out / "results.json").read_text(encoding="utf-8")) == keyed_result.to_dict()
    assert {p.suffix for p in (out / "figures").iterdir()} == {".png", ".svg"}
    out2 = keyed_result.save(tmp_path / "novtu", vtu=False, report=False)
    assert sorted(p.name for p in out2.iterdir()) == ["results.json"]


def test_summary_is_the_terminal_summary(keyed_result):
    text = keyed_result.summary()
    assert text.startswith("shaftcheck ") and "Caution: " in text and "Kts" in text


def test_round_shaft_gives_the_exact_torsion_constant():
    """J = πd⁴/32 and Kts = 1 for a plain round bar (exact; Young & Budynas, Roark's Formulas for
    Stress and Strain, 7th ed., Table 10.1, solid circular section). Tolerance: the case's 1 %
    accuracy target."""
    r = analyse(Case.round(diameter=20, torque=10, units="mm-N-MPa", material=dict(shear_modulus=80e3),
                           analysis=dict(accuracy="1 %")))
    J = {"fem": r.torsion.J, "exact": math.pi * 0.020**4 / 32}
    kts = {"fem": r.torsion.kts, "exact": 1.0}
    assert J["fem"] == pytest.approx(J["exact"], rel=1e-2)
    assert kts["fem"] == pytest.approx(kts["exact"], rel=1e-2)
    assert r.accuracy.met is True


@pytest.mark.parametrize("build, field", [
    (lambda: Case.keyed(diameter="30 mm", keyways=[dict(width="8 mm", depht="4 mm")], torque="1 N*m",
                        material=dict(shear_modulus="80 GPa")), "section.keyways[0]"),
    (lambda: Case.keyed(diameter="30 mm", keyways=[], torque="1 N*m"), "section.keyways"),
    (lambda: Case.keyed(diameter="30 mm", keyways=[dict(width="8 mm", depth="4 mm")], torque="1 N*m",
                        loads=dict(torque="2 N*m")), "loads.torque"),
    (lambda: Case.round(diameter=30, torque=1), "section.diameter"),  # a plain number needs case units
    (lambda: Case.from_dict("section = {}"), "case"),
    (lambda: analyse(Case.round(diameter="20 mm", material=dict(shear_modulus="80 GPa")), fineness=-1), "fineness"),
])
def test_bad_input_raises_input_error_with_field(build, field):
    with pytest.raises(InputError) as err:
        build()
    assert err.value.field.startswith(field)

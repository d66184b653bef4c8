"""The bad-input corpus (tests/bad_inputs/): every file is one kind of bad input, named by what is
wrong, whose first line says which field the error must name (``# expect: FIELD``). The promise for
each: exit code 2, exactly one line on stderr that names the field, no traceback, no control
characters, and an existing ``--out`` folder left exactly as it was. Plus regression tests of the
input-side defects that a corpus file cannot hold (pipes, devices, size limits, command-line options,
values echoed as written).
"""
import os
import re
from pathlib import Path

import pytest

CORPUS = Path(__file__).parent / "bad_inputs"
FILES = sorted(CORPUS.glob("*.toml"))
CONTROL = re.compile(r"[\x00-\x08\x0b-\x1f\x7f-\x9f]")


def expected_field(path: Path) -> str:
    first = path.read_bytes().split(b"\n", 1)[0].decode("ascii")
    assert first.startswith("# expect: "), f"{path.name}: first line must be '# expect: FIELD'"
    return first[len("# expect: "):].strip()


def snapshot(folder: Path) -> dict:
    return {p.relative_to(folder).as_posix(): p.read_bytes() for p in folder.rglob("*") if p.is_file()}


def assert_refused(code, stdout, err, field):
    assert code == 2, (code, err)
    assert err.endswith("\n") and err.count("\n") == 1, err
    assert err.startswith("shaftcheck: error: "), err
    assert field in err, (field, err)
    assert "Traceback" not in err and not CONTROL.search(err[:-1]), err


def test_the_corpus_is_large_enough():
    assert len(FILES) >= 60
    assert len({expected_field(f) for f in FILES}) >= 50  # many different fields, not one error repeated


@pytest.mark.parametrize("path", FILES, ids=[f.stem for f in FILES])
def test_bad_input_is_refused_in_one_line_and_out_is_untouched(path, tmp_path, run_cli):
    out = tmp_path / "out"
    out.mkdir()
    (out / "results.json").write_text('{"from": "an earlier run"}\n')
    before = snapshot(out)
    code, stdout, err = run_cli("run", "--no-report", str(path), "--out", str(out), "--no-vtu")
    assert_refused(code, stdout, err, expected_field(path))
    assert snapshot(out) == before
    assert sorted(p.name for p in tmp_path.iterdir()) == ["out"]  # no temporary folder left behind


# ------------------------------------------------------------------------- what a file cannot hold

GOOD = """[case]
units = "mm-N-MPa"
[section]
shape = "round"
diameter = 25
[loads]
torque = "120 N*m"
[material]
shear_modulus = "79 GPa"
"""


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="named pipes are POSIX")
def test_a_fifo_is_refused_without_blocking(tmp_path, run_cli):
    fifo = tmp_path / "case.toml"
    os.mkfifo(fifo)
    code, out, err = run_cli("run", "--no-report", str(fifo), "--out", str(tmp_path / "o"))
    assert_refused(code, out, err, "case file")
    assert "not a regular file" in err
    table = tmp_path / "table.toml"
    os.mkfifo(table)
    case = tmp_path / "c.toml"
    case.write_text(GOOD + "yield = 390\nultimate = 630\n[analysis]\ndesign_factor = 1.5\nmaterials = \"table.toml\"\n")
    code, out, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / "o"))
    assert_refused(code, out, err, "analysis.materials")
    assert not (tmp_path / "o").exists()


@pytest.mark.skipif(not os.path.exists("/dev/zero"), reason="needs /dev/zero")
def test_dev_zero_and_a_folder_are_refused_as_case_files(tmp_path, run_cli):
    code, out, err = run_cli("run", "--no-report", "/dev/zero", "--out", str(tmp_path / "o"))
    assert_refused(code, out, err, "case file")
    code, out, err = run_cli("run", "--no-report", str(tmp_path), "--out", str(tmp_path / "o"))
    assert_refused(code, out, err, "case file")
    assert "folder" in err


def test_a_file_over_the_size_limit_is_refused_before_parsing(tmp_path, run_cli):
    from compare.case.case import MAX_FILE_BYTES

    big = tmp_path / "big.toml"
    big.write_text(GOOD + "#" * MAX_FILE_BYTES + "\n")
    code, out, err = run_cli("run", "--no-report", str(big), "--out", str(tmp_path / "o"))
    assert_refused(code, out, err, "case file")
    assert str(MAX_FILE_BYTES) in err


@pytest.mark.parametrize("value,says", [("fine", "must be a number"), ("nan", "finite"), ("inf", "finite"),
                                        ("-inf", "finite"), ("0", "between 0.25 and 16"), ("1e9", "between 0.25 and 16"), ("1e999", "finite")])
def test_fineness_option_is_named(tmp_path, run_cli, value, says):
    case = tmp_path / "c.toml"
    case.write_text(GOOD)
    code, out, err = run_cli("run", "--no-report", str(case), f"--fineness={value}", "--out", str(tmp_path / "o"))
    assert_refused(code, out, err, "--fineness")
    assert f'"{value}"' in err and says in err
    assert not (tmp_path / "o").exists()


def test_values_are_echoed_as_written_with_their_unit(tmp_path, run_cli):
    """Issue 8 item 7: an inch case printed `depth = 0.015239999999999998 m`."""
    inch = """[case]
units = "in-lbf-psi"
[section]
shape = "keyed"
diameter = 1.125
[[section.keyways]]
width = 0.25
depth = DEPTH
[loads]
torque = 1450
[material]
shear_modulus = "11.5e6 psi"
"""
    case = tmp_path / "c.toml"
    case.write_text(inch.replace("DEPTH", "0.6"))
    code, out, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / "o"))
    assert_refused(code, out, err, "section.keyways[0].depth")
    assert "depth = 0.6 inch:" in err and "0.5625 inch" in err and "0.0152" not in err
    case.write_text(inch.replace("DEPTH", '"0.6 in"'))
    code, out, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / "o"))
    assert 'depth = "0.6 in":' in err and " m)" not in err


def test_control_characters_of_user_text_are_escaped(tmp_path, run_cli):
    """Issue 8, 'Also build': a title with ANSI escapes printed raw. Escaped where it is parsed, so
    the summary, results.json and every error message are safe."""
    from compare.case import parse_case

    data = {"case": {"title": "\x1b[2J\x1b[31mred\u202e title\nsecond line", "units": "mm-N-MPa"},
            "section": {"shape": "round", "diameter": 25}, "material": {"name": "steel\x07", "shear_modulus": 79000}}
    c = parse_case(data)
    assert not CONTROL.search(c.title) and "\u202e" not in c.title and "\n" not in c.title
    assert c.title.startswith("\\x1b[2J") and "\\u202e" in c.title and "\\n" in c.title
    assert c.material.name == "steel\\x07"
    case = tmp_path / "c.toml"
    case.write_text(GOOD.replace('units = "mm-N-MPa"', 'units = "mm-N-MPa"\ntitle = "\\u001b[31mred"')
                    .replace("diameter = 25", 'diameter = "25 \\u001b[2J"'))
    code, out, err = run_cli("run", "--no-report", str(case), "--out", str(tmp_path / "o"))
    assert_refused(code, out, err, "section.diameter")
    assert "\\x1b[2J" in err


def test_fatigue_that_needs_the_ultimate_says_so():
    """Issue 8 item 6: a fatigue check that needs `ultimate` must not skip silently."""
    from compare.case import parse_case
    from fem.errors import InputError

    base = {"case": {"units": "mm-N-MPa"}, "section": {"shape": "round", "diameter": 25},
            "loads": {"torque": 100000, "torque_alternating": 20000}, "material": {"shear_modulus": 79000, "yield": 390}}
    with pytest.raises(InputError) as e:
        parse_case(base)
    assert e.value.field == "material.ultimate"
    # steady loads need no fatigue check: accepted
    steady = dict(base, loads={"torque": 100000})
    assert parse_case(steady).material.ultimate is None
    # rotating bending is fully reversed: the same refusal
    rot = dict(base, loads={"bending": [50000, 0], "rotating": True})
    with pytest.raises(InputError, match="material.ultimate"):
        parse_case(rot)


def test_moduli_consistency_tolerance():
    """G = E/(2(1 + ν)) for an isotropic solid (Timoshenko & Goodier, Theory of Elasticity, 3rd ed.,
    Sec. 6). Data-sheet values E = 207 GPa, G = 79.3 GPa, ν = 0.292 (steel, from memory) agree to
    0.1 %; E typed in place of G does not."""
    from compare.case import parse_case
    from fem.errors import InputError

    def mat(**m):
        return {"case": {"units": "mm-N-MPa"}, "section": {"shape": "round", "diameter": 25}, "material": m}

    c = parse_case(mat(elastic_modulus="207 GPa", shear_modulus="79.3 GPa", poisson=0.292))
    assert c.material.shear_modulus == pytest.approx(79.3e9)
    with pytest.raises(InputError) as e:
        parse_case(mat(elastic_modulus="207 GPa", shear_modulus="207 GPa", poisson=0.3))
    assert e.value.field == "material.shear_modulus" and "GPa" in str(e.value)

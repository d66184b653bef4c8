"""shaftcheck sweep: variants are single runs, resume, a bad variant, workers, the scheduler address.

The sweeps here are tiny (2-3 variants of a keyed 30 mm shaft at accuracy "1 %"). Numbers are
compared with single runs of the same variants (the sweep's promise), not with outside values:
the results themselves are checked against published solutions in the solver and pairs tests.
"""
from __future__ import annotations

import csv
import json

import pyarrow.parquet as pq
import pytest

import compare.sweep as sweep_mod
from compare.sweep import parse_values, plan, run_sweep, set_field
from fem.errors import InputError

CASE = """
[case]
title = "sweep test shaft (invented)"
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 30
[[section.keyways]]
width = 8
depth = 4
fillet = 0.4
[loads]
torque = "180 N*m"
[material]
elastic_modulus = "205 GPa"
poisson = 0.29
[analysis]
accuracy = "1 %"
"""


def write_case(tmp_path, extra=""):
    p = tmp_path / "shaft.toml"
    p.write_text(CASE + extra, encoding="utf-8")
    return p


def read_csv(path):
    with open(path, newline="", encoding="utf-8") as fh:
        return list(csv.DictReader(fh))


# ------------------------------------------------------------------ parsing (no solves)
def test_a_range_gives_n_values_with_both_ends_and_its_unit():
    assert parse_values("0.1mm:1.5mm:15", "--vary")[0] == "0.1 mm"
    vals = parse_values("0.1mm:1.5mm:15", "--vary")
    assert len(vals) == 15 and vals[-1] == "1.5 mm" and vals[7] == "0.8 mm"
    assert parse_values("1:2:3", "--vary") == [1.0, 1.5, 2.0]
    assert parse_values("0.3, 0.5 mm, 7", "--vary") == [0.3, "0.5 mm", 7]


@pytest.mark.parametrize("spec, says", [("0.1mm:1.5in:3", "different units"), ("1:2:x", "number of values"),
                                        ("1:2:1", "2 to"), ("a:b:3", "not a number"), ("1,,2", "empty"),
                                        ("1:2", "three parts")])
def test_bad_values_name_the_option(spec, says):
    with pytest.raises(InputError) as e:
        parse_values(spec, "--vary")
    assert e.value.field == "--vary" and says in str(e.value)


def test_a_path_must_name_a_field_of_the_case():
    data = {"section": {"keyways": [{"fillet": 0.4}]}}
    set_field(data, "section.keyways[0].fillet", "0.5 mm")
    assert data["section"]["keyways"][0]["fillet"] == "0.5 mm"
    for bad in ("section.keyways[3].fillet", "loads.torque", "section..x", "[0]", "section.keyways.fillet"):
        with pytest.raises(InputError) as e:
            set_field(data, bad, 1.0)
        assert e.value.field == "--vary"


def test_plan_combines_the_table_and_the_options(tmp_path):
    p = write_case(tmp_path, '[sweep]\nvary = { "section.keyways[0].fillet" = "0.3mm:0.5mm:3" }\nplot = ["torsion.kts"]\n')
    sw = plan(p, ["loads.torque=100,200"])
    assert len(sw.variants) == 6 and sw.plots == ["torsion.kts"]
    assert len({v.key for v in sw.variants}) == 6  # every variant has its own input hash
    assert sw.variants[1].data["loads"]["torque"] == 200 and "sweep" not in sw.variants[1].data


# ------------------------------------------------------------------ runs
def test_rows_are_the_single_runs_of_the_variants(tmp_path, run_cli):
    case = write_case(tmp_path)
    out = tmp_path / "sw"
    code, stdout, err = run_cli("sweep", str(case), "--vary", "section.keyways[0].fillet=0.3mm:0.5mm:2",
                                "--out", str(out), "--workers", "0")
    assert code == 0, err
    assert sorted(p.name for p in out.iterdir()) == ["sweep.csv", "sweep.html", "sweep.parquet", "sweep.png", "sweep.svg"]
    rows = read_csv(out / "sweep.csv")
    assert len(rows) == 2 and [r["section.keyways[0].fillet"] for r in rows] == ["0.3 mm", "0.5 mm"]
    table = pq.read_table(out / "sweep.parquet").to_pylist()
    assert [t["kts"] for t in table] == [float(r["kts"]) for r in rows]
    # the second variant as a case file of its own, through `shaftcheck run`
    single = tmp_path / "single.toml"
    single.write_text(CASE.replace("fillet = 0.4", 'fillet = "0.5 mm"'), encoding="utf-8")
    code, _, err = run_cli("run", str(single), "--out", str(tmp_path / "one"), "--no-vtu", "--quiet")
    assert code == 0, err
    res = json.loads((tmp_path / "one" / "results.json").read_text())
    for col, key in (("J", "J"), ("kts", "kts"), ("tau_max", "tau_max")):
        assert float(rows[1][col]) == res["torsion"][key]
    assert float(rows[1]["gci_tau_max"]) == res["convergence"]["tau_max"]["gci"]
    assert int(rows[1]["exit_code"]) == res.get("exit_code", 0)


def test_resume_computes_only_what_is_missing(tmp_path, monkeypatch):
    case = write_case(tmp_path)
    cache = tmp_path / "cache"
    ran = []
    real = sweep_mod.run_variant

    def counting(data, path, fineness=None):
        ran.append(data["section"]["keyways"][0]["fillet"])
        return real(data, path, fineness)

    monkeypatch.setattr(sweep_mod, "run_variant", counting)
    first = run_sweep(plan(case, ["section.keyways[0].fillet=0.3mm:0.5mm:2"]), case, cache, workers=0)
    assert ran == ["0.3 mm", "0.5 mm"]
    # an interrupted sweep of three values left these two in the cache: only the third is computed
    ran.clear()
    again = run_sweep(plan(case, ["section.keyways[0].fillet=0.3mm:0.5mm:3"]), case, cache, workers=0)
    assert ran == ["0.4 mm"]
    assert [r.cached for r in again.records] == [True, False, True]
    assert again.records[0].results == first.records[0].results


def test_a_bad_variant_is_reported_and_the_rest_complete(tmp_path, run_cli):
    case = write_case(tmp_path)
    out = tmp_path / "sw"
    # a 20 mm deep keyseat in a 30 mm shaft is refused by the input checks; 3 mm is fine
    code, stdout, err = run_cli("sweep", str(case), "--vary", "section.keyways[0].depth=3,20",
                                "--out", str(out), "--workers", "0", "--quiet")
    assert code == 2
    rows = read_csv(out / "sweep.csv")
    assert rows[0]["exit_code"] == "0" and rows[0]["error"] == "" and float(rows[0]["kts"]) > 1.0
    assert rows[1]["exit_code"] == "2" and "section.keyways[0].depth" in rows[1]["error"]
    assert "\n" not in rows[1]["error"]
    assert "variant 1" in (out / "sweep.html").read_text()


@pytest.mark.slow
def test_one_and_two_workers_give_identical_rows(tmp_path, run_cli):
    case = write_case(tmp_path)
    got = []
    for n in ("1", "2"):
        out = tmp_path / f"w{n}"
        code, _, err = run_cli("sweep", str(case), "--vary", "section.keyways[0].fillet=0.3mm:0.5mm:2",
                               "--out", str(out), "--workers", n, "--quiet")
        assert code == 0, err
        got.append(read_csv(out / "sweep.csv"))
    assert got[0] == got[1] and len(got[0]) == 2


def test_an_unreachable_scheduler_is_one_line_and_exit_2(tmp_path, run_cli, monkeypatch):
    monkeypatch.setattr(sweep_mod, "CONNECT_TIMEOUT", 1.0)
    case = write_case(tmp_path)
    code, stdout, err = run_cli("sweep", str(case), "--vary", "loads.torque=100,200", "--out",
                                str(tmp_path / "o"), "--scheduler", "tcp://127.0.0.1:1")
    assert code == 2
    assert err.count("\n") == 1 and "--scheduler" in err and "tcp://127.0.0.1:1" in err
    assert not (tmp_path / "o").exists()
    code, _, err = run_cli("sweep", str(case), "--vary", "loads.torque=100", "--out", str(tmp_path / "o"),
                           "--scheduler", "not an address")
    assert code == 2 and "--scheduler" in err and err.count("\n") == 1

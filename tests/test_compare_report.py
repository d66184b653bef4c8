"""The design report of ``shaftcheck run``: report.html (every section, in order, user text escaped),
figures/ in PNG and SVG, results.csv against results.json, the input hashes, the VTU fields it maps
and the one-screen summary. One demo run per module (module-scoped fixture) keeps it fast."""
from __future__ import annotations

import contextlib
import csv
import io
import json
import shutil
from pathlib import Path

import matplotlib.image as mpimg
import meshio
import numpy as np
import pytest

from fem.errors import InputError
from compare.case.case import load_case
from compare.case.units import SYSTEMS, from_si
from compare.cli import main
from compare.cli.cmd_run import check_out
from compare.output.headline import _get, headline_rows
from compare.output.screen import plain_summary
from compare.output.report_html import SECTIONS
from compare.output.trace import input_hashes

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "cases" / "conveyor_fatigue.toml"  # the demo with every section: rotating bending, fatigue, materials


def _run(*argv):
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        code = main(list(argv))
    return code, out.getvalue(), err.getvalue()


@pytest.fixture(scope="module")
def demo(tmp_path_factory):
    d = tmp_path_factory.mktemp("report")
    case = d / "case"
    case.mkdir()
    # the demo at a coarser mesh and a looser target: every section of the report, a few seconds
    text = DEMO.read_text(encoding="utf-8").replace("[analysis]\n", "[analysis]\nfineness = 0.6\naccuracy = 0.01\n")
    (case / DEMO.name).write_text(text, encoding="utf-8")
    shutil.copy(DEMO.parent / "materials_demo.toml", case / "materials_demo.toml")
    out = d / "out"
    code, stdout, stderr = _run("run", str(case / DEMO.name), "--out", str(out))
    return {"code": code, "stdout": stdout, "stderr": stderr, "out": out,
            "html": (out / "report.html").read_text(encoding="utf-8"),
            "res": json.loads((out / "results.json").read_text(encoding="utf-8"))}


def test_demo_report_has_every_section_in_order(demo):
    html = demo["html"]
    pos = [html.find(f'<section id="{sid}"') for sid, _ in SECTIONS]
    assert all(p > 0 for p in pos), [sid for (sid, _), p in zip(SECTIONS, pos) if p < 0]
    assert pos == sorted(pos)
    for _, head in SECTIONS:
        assert head.replace("'", "&#x27;") in html
    # the governing sentence comes before anything else after the title
    assert html.find("Lowest factor of safety") < html.find('<section id="trace"')
    assert "http://" not in html.replace("http://www.w3.org", "") and "https://" not in html  # no network
    assert "<script" not in html  # readable without a script
    assert "break-inside: avoid" in html and "@media print" in html


def test_report_traceability(demo):
    html, res = demo["html"], demo["res"]
    assert res["inputs"]["case_sha256"] in html and res["inputs"]["materials_sha256"] in html
    assert f"shaftcheck {res['tool']['version']}" in html


def test_figures_in_both_formats(demo):
    figs = demo["out"] / "figures"
    stems = {p.stem for p in figs.iterdir()}
    for name in ("section", "mesh", "torsion_stress", "stress_function", "shear_stress", "von_mises", "mohr",
                 "fatigue_factor", "convergence"):
        assert name in stems
    for stem in stems:
        png, svg = figs / f"{stem}.png", figs / f"{stem}.svg"
        img = mpimg.imread(png)
        assert img.shape[0] > 100 and img.shape[1] > 100
        assert svg.read_text(encoding="utf-8").lstrip().startswith("<?xml") and "<svg" in svg.read_text(encoding="utf-8")


def test_convergence_figure_marks_each_mesh_and_each_decade(demo):
    svg = (demo["out"] / "figures" / "convergence.svg").read_text(encoding="utf-8")
    for n in demo["res"]["accuracy"]["meshes"]:  # the x ticks are the meshes' unknowns
        assert f"{n:,}".replace(",", "\u2009") in svg, n
    assert "10\u207b" in svg  # decades such as 10⁻⁶ on the error axis


def test_csv_parses_and_matches_json(demo):
    res = demo["res"]
    system = SYSTEMS[res["case"]["units"]]
    rows = list(csv.DictReader((demo["out"] / "results.csv").read_text(encoding="utf-8").splitlines()))
    assert len(rows) > 10
    dims = {"mm²": "area", "mm⁴": "second_moment", "MPa": "stress", "mm": "length", "": "dimensionless", "1": "dimensionless"}
    size = res["section"]["area"] ** 0.5
    for r in rows:
        si = _get(res, r["results_json_key"])
        v = from_si(si, dims[r["unit"]], system)
        if float(r["value"]) == 0.0 and v != 0.0:  # round-off shown as 0 (Fmt.q0 rule): tiny against the section
            assert abs(si) < 1e-7 * max(size, res["section"]["Ixx"]), r
            continue
        assert float(r["value"]) == pytest.approx(v, rel=1e-12), r
        if r["hand_value"] and r["ratio"]:
            assert float(r["ratio"]) == pytest.approx(float(r["value"]) / float(r["hand_value"]), rel=1e-9)


def test_summary_fits_one_screen_and_leads_with_the_verdict(demo):
    lines = demo["stdout"].rstrip("\n").splitlines()
    assert demo["code"] == 0
    assert len(lines) <= 40, len(lines)
    assert lines[1].startswith(("WARNING", "VERDICT"))
    assert "report.html" in demo["stdout"] and "results.csv" in demo["stdout"]
    assert demo["stderr"] == ""  # no progress bar when stderr is not a terminal


def test_vtu_carries_the_mapped_fields(demo):
    m = meshio.read(demo["out"] / "section.vtu")
    for name in ("worst_sigma", "worst_tau_zx", "worst_tau_zy", "worst_von_mises", "shear_tau_zx", "shear_tau_zy",
                 "fatigue_factor"):
        assert name in m.point_data
    vm = float(np.max(m.point_data["worst_von_mises"]))
    # nodal L2 projection against the boundary read of the results: close, not equal
    assert vm == pytest.approx(demo["res"]["combined"]["von_mises_max"], rel=0.02)
    n = m.point_data["fatigue_factor"]
    fe_min = min(demo["res"]["fatigue"][k] for k in ("goodman", "gerber", "asme_elliptic", "soderberg"))
    assert float(np.min(n[n > 0])) == pytest.approx(fe_min, rel=0.02)


def test_input_hash_changes_with_the_case_or_its_table_and_only_then(tmp_path):
    shutil.copy(DEMO, tmp_path / "c.toml")
    shutil.copy(DEMO.parent / "materials_demo.toml", tmp_path / "materials_demo.toml")
    h0 = input_hashes(load_case(tmp_path / "c.toml"))
    assert h0 == input_hashes(load_case(tmp_path / "c.toml"))  # nothing changed: same hashes
    (tmp_path / "c.toml").write_text((tmp_path / "c.toml").read_text() + "\n# a comment\n")
    h1 = input_hashes(load_case(tmp_path / "c.toml"))
    assert h1["case_sha256"] != h0["case_sha256"] and h1["materials_sha256"] == h0["materials_sha256"]
    t = tmp_path / "materials_demo.toml"
    t.write_text(t.read_text().replace("yield = 300", "yield = 310"))
    h2 = input_hashes(load_case(tmp_path / "c.toml"))
    assert h2["case_sha256"] == h1["case_sha256"] and h2["materials_sha256"] != h1["materials_sha256"]


SMALL = """
[case]
title = "<script>alert('x')</script> & shaft"
units = "mm-N-MPa"
[section]
shape = "round"
diameter = 20
[loads]
torque = "50 N*m"
[material]
name = "<b>steel</b> (illustrative)"
elastic_modulus = "200 GPa"
poisson = 0.3
yield = 350
[analysis]
fineness = 0.5
accuracy = 0.05
"""


def test_user_text_is_escaped_and_no_report_skips_it(tmp_path, run_cli):
    (tmp_path / "c.toml").write_text(SMALL)
    code, out, err = run_cli("run", str(tmp_path / "c.toml"), "--out", str(tmp_path / "o"), "--no-vtu")
    assert code == 0, err
    html = (tmp_path / "o" / "report.html").read_text(encoding="utf-8")
    assert "<script" not in html and "<b>steel" not in html
    assert "&lt;script&gt;alert(&#x27;x&#x27;)&lt;/script&gt; &amp; shaft" in html
    assert "&lt;b&gt;steel&lt;/b&gt;" in html
    assert (tmp_path / "o" / "figures" / "section.svg").is_file()
    # a second run into the same folder replaces the report output as a whole (figures/ included)
    code, out, err = run_cli("run", str(tmp_path / "c.toml"), "--out", str(tmp_path / "o"), "--no-report", "--verbose")
    assert code == 0, err
    assert sorted(p.name for p in (tmp_path / "o").iterdir()) == ["results.json", "section.vtu"]
    assert "Torsion (Saint-Venant)" in out  # --verbose: the full detail


def test_no_verdict_marks_every_peak_and_factor_row(demo):
    """With a sharp re-entrant corner no factor is presented as governing, and every peak and factor
    row says it is for the rest of the section only (the governing row is left out)."""
    res = json.loads(json.dumps(demo["res"]))
    res["governing"] = {"no_verdict": True, "text": "no verdict"}
    rows = headline_rows(res, SYSTEMS[res["case"]["units"]])
    assert not any(r["group"] == "governing" for r in rows)
    for r in rows:
        if r["group"] in ("combined", "static", "fatigue") or r["results_json_key"].endswith("tau_max"):
            assert "NO VERDICT" in r["quantity"], r
    text = plain_summary(res, SYSTEMS[res["case"]["units"]])
    assert text.splitlines()[1].startswith("VERDICT: none")


def test_out_folder_with_a_foreign_file_among_the_figures_is_refused(tmp_path):
    out = tmp_path / "o"
    (out / "figures").mkdir(parents=True)
    (out / "report.html").write_text("old")
    (out / "figures" / "a.png").write_bytes(b"x")
    check_out(out)  # an earlier output: accepted (it will be replaced whole)
    (out / "figures" / "notes.txt").write_text("mine")
    with pytest.raises(InputError) as exc:
        check_out(out)
    assert "notes.txt" in str(exc.value) and "--out" in str(exc.value)


def test_critical_points_at_one_place_are_one_point_with_their_criteria_together(demo):
    """The combined-stress table listed several numbered points at one place, each 'critical for' other
    criteria: points closer than SAME_PLACE of the section's size are merged, their criteria listed
    together (each criterion's own state stays under ``states``)."""
    import math as _m

    from compare.output.figures import SAME_PLACE, critical_points

    res = demo["res"]
    pts = critical_points(res)
    size = _m.sqrt(res["section"]["area"])
    for i, p in enumerate(pts):
        for q in pts[i + 1:]:
            assert _m.dist(p["at"], q["at"]) > SAME_PLACE * size, (p["criteria"], q["criteria"])
    raw = res["combined"]["points"]
    assert sum(len(p["states"]) for p in pts) == len(raw)  # nothing lost
    assert sorted(c for p in pts for c in p["criteria"]) == sorted({r["criterion"] for r in raw})
    for p in pts:  # the state shown is the most severe of the merged ones
        assert p["von_mises"] == max(s["von_mises"] for s in p["states"])
    merged = [p for p in pts if len(p["criteria"]) > 1]
    assert merged and all(", ".join(p["criteria"]) in demo["html"] for p in merged)

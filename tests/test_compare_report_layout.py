"""The design report of a whole shaft (compare/output/report_layout.py, figures_layout.py): every part
of the layout report in order with the verdict first, the figures in both formats, results.csv rows
per station and feature against results.json, the notebook view (Result._repr_html_), and no text
overlapping another in the layout's figures (boxes from matplotlib's renderer). One analysis of the
demo countershaft (coarser mesh and a looser target) per module."""
from __future__ import annotations

import csv
import io
import json
import re
from pathlib import Path

import pytest

from compare.api import analyse
from compare.output import figures_layout
from compare.output.figures import STYLE
from compare.output.headline import _get
from compare.output.report_layout import SECTIONS, STATION_FIGURES
from compare.output.report import CAUTION

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "cases" / "countershaft_layout.toml"


@pytest.fixture(scope="module")
def layout(tmp_path_factory):
    d = tmp_path_factory.mktemp("layout")
    text = DEMO.read_text(encoding="utf-8").replace('accuracy = "1 %"', 'accuracy = "5 %"\nfineness = 0.5')
    case = d / DEMO.name
    case.write_text(text, encoding="utf-8")
    r = analyse(case)
    out = r.save(d / "out", vtu=False)
    return {"r": r, "out": out, "html": (out / "report.html").read_text(encoding="utf-8"),
            "res": json.loads((out / "results.json").read_text(encoding="utf-8"))}


def test_every_part_in_order_verdict_first(layout):
    html, res = layout["html"], layout["res"]
    pos = [html.find(f'<section id="{sid}"') for sid, _ in SECTIONS]
    assert all(p > 0 for p in pos), [sid for (sid, _), p in zip(SECTIONS, pos) if p < 0]
    assert pos == sorted(pos)
    # the whole shaft's verdict is the first thing after the title, and names the governing station
    g = res["shaft"]["governing_station"]
    gst = res["section_loads"][g]
    verdict = html[pos[0]:pos[1]]
    assert "Lowest factor of safety of the shaft" in verdict and gst["name"] in verdict
    assert f"{gst['results']['governing']['factor']:.3g}" in verdict
    # each station has its own part, after the station table and before the accuracy evidence
    stations = res["section_loads"]
    spos = [html.find(f'<section id="station-{i + 1}"') for i in range(len(stations))]
    assert all(pos[SECTIONS.index(("stations", "Checked stations"))] < p < pos[SECTIONS.index(
        ("accuracy", "Accuracy evidence"))] for p in spos)
    # the layout's own title, not the governing station's
    assert "<h1>Countershaft layout: V-belt pulley and spur gear, two bearings</h1>" in html
    assert "http://" not in html.replace("http://www.w3.org", "") and "https://" not in html
    assert "<script" not in html


def test_parts_hold_their_content(layout):
    html, res = layout["html"], layout["res"]
    sh = res["shaft"]

    def part(sid):
        a = html.find(f'<section id="{sid}"')
        return html[a:html.find("</section>", a)]

    for name in ("shaft_layout", "shaft_diagrams", "shaft_modes", "feature_stress"):
        assert f"figures/{name}.png" in html
    for r in sh["reactions"]:
        assert f"<td>{r['name']}</td>" in part("reactions")
    stiff = part("stiffness")
    assert stiff.count("Table 7-2") >= len(sh["slopes"])  # each limit with its source (Shigley 9th ed.)
    assert "common practice" in stiff
    cs = part("critical-speeds")
    assert "Rayleigh" in cs and "need ≥ 2" in cs and "shaft_modes" in cs
    feats = part("features")
    assert "Table 17.1" in feats and "chart status" in feats
    assert feats.count("<tr>") - 1 == sum(1 for r in sh["features"] for k in ("kt_bending", "kts", "kt_axial")
                                          if r.get(k) is not None)
    table = part("stations")
    for st in res["section_loads"]:
        assert st["name"] in table
    for i in range(len(res["section_loads"])):
        sp = part(f"station-{i + 1}")
        for name in ("section", "torsion_stress", "von_mises"):
            assert f"figures/station{i + 1}_{name}.png" in sp
        assert "Factors of safety" in sp and "Hand calculation against FE" in sp and "Convergence" in sp
    acc = part("accuracy")
    assert "equilibrium" in acc and "three-mesh study" in acc and "far-field check" in acc
    assert CAUTION.replace("'", "&#x27;") in part("cautions")
    assert "gyroscopic" in part("assumptions")
    # no bare large moments in the tables: engineering notation (forces and moments ≥ 10⁴ carry 10³)
    assert not re.search(r"\d{5,} N·mm", html)


def test_figures_in_both_formats(layout):
    figs = layout["out"] / "figures"
    stems = {p.stem for p in figs.iterdir()}
    for stem in stems:
        assert (figs / f"{stem}.png").is_file() and (figs / f"{stem}.svg").is_file()
    assert {"shaft_layout", "shaft_diagrams", "shaft_modes", "feature_stress"} <= stems
    n = len(layout["res"]["section_loads"])
    assert {f"station{i}_{nm}" for i in range(1, n + 1) for nm in ("section", "torsion_stress")} <= stems
    assert all(nm in STATION_FIGURES for nm in ("section", "torsion_stress", "von_mises", "mohr"))
    # every image the page names is one of the files
    assert set(re.findall(r"figures/([a-z0-9_]+)\.png", layout["html"])) <= stems
    assert (layout["out"] / "shaft.svg").is_file()


def test_results_csv_rows_per_station_and_feature(layout):
    res = layout["res"]
    rows = list(csv.DictReader(io.StringIO((layout["out"] / "results.csv").read_text(encoding="utf-8"))))
    st = [r for r in rows if r["group"] == "station"]
    assert len(st) == len(res["section_loads"])
    for r in st:
        assert float(r["value"]) == pytest.approx(_get(res, r["results_json_key"]), rel=1e-12)
    ft = [r for r in rows if r["group"] == "shoulders and grooves"]
    n = sum(1 for f in res["shaft"]["features"] for k in ("kt_bending", "kts", "kt_axial") if f.get(k) is not None)
    assert len(ft) == n
    for r in ft:
        fe = _get(res, r["results_json_key"])
        assert float(r["value"]) == pytest.approx(fe, rel=1e-12)
        if r["hand_value"]:
            assert float(r["ratio"]) == pytest.approx(fe / float(r["hand_value"]), rel=1e-12)  # computed, not typed
    assert {"reaction", "stiffness", "critical speed"} <= {r["group"] for r in rows}


def test_mode_shapes_are_the_results_frequencies(layout):
    cs = layout["res"]["shaft"]["critical_speeds"]
    ms = cs["mode_shapes"]
    assert ms["omega"] == pytest.approx(cs["values"], rel=1e-9)
    for w in ms["shapes"]:
        assert max(abs(x) for x in w) == pytest.approx(1.0)
        assert len(w) == len(ms["z"])


def test_notebook_view(layout):
    r = layout["r"]
    html = r._repr_html_()
    assert "Lowest factor of safety of the shaft" in html
    assert "<table" in html and "data:image/svg+xml;base64," in html  # the verdict, the table, the diagrams
    for st in layout["res"]["section_loads"]:
        assert st["name"] in html
    assert "<script" not in html


def _kept(monkeypatch):
    """Make figures_layout keep its matplotlib figures (the Figure of figures.py closes them)."""
    kept = []

    class Keep:
        def __init__(self, name, title, fig):
            self.name, self.title, self.fig = name, title, fig
            kept.append(self)

    monkeypatch.setattr(figures_layout, "Figure", Keep)
    return kept


def test_no_text_overlaps_in_layout_figures(layout, monkeypatch):
    """Every text box of the drawing, the diagrams, the mode shapes and the fillet pictures is clear of
    every other (boxes from matplotlib's own renderer at the saved resolution)."""
    import matplotlib  # noqa: PLC0415  the report's dependency, only for this check
    kept = _kept(monkeypatch)
    r = layout["r"]
    figures_layout.layout_figures(r.analysis, layout["res"], r.analysis.case.units)
    assert {k.name for k in kept} == {"shaft_layout", "shaft_diagrams", "shaft_modes", "feature_stress"}
    for k in kept:
        k.fig.dpi = STYLE["savefig.dpi"]  # the resolution the files are saved at
        overlaps = figures_layout.text_overlaps(k.fig)
        matplotlib.pyplot.close(k.fig)
        assert overlaps == [], (k.name, overlaps)


def test_text_overlaps_finds_an_overlap():
    """The overlap check itself: two texts on one spot are found, two far apart are not."""
    import matplotlib.pyplot as plt  # noqa: PLC0415  the report's dependency, only for this check
    fig, ax = plt.subplots()
    ax.text(0.5, 0.5, "first label")
    ax.text(0.5, 0.5, "second label")
    ax.text(0.05, 0.05, "far away")
    pairs = figures_layout.text_overlaps(fig)
    plt.close(fig)
    assert ("first label", "second label") in pairs
    assert not any("far away" in p for p in pairs)


def test_loads_where_read_from_the_station_record():
    """The station table says where along a feature the loads were taken when the record holds it, and
    the station's own z otherwise."""
    from compare.case.units import SYSTEMS  # noqa: PLC0415  only these small checks
    from compare.output.report_layout import EngFmt, _loads_where  # noqa: PLC0415
    f = EngFmt(SYSTEMS["mm-N-MPa"])
    assert _loads_where({"at": 0.2}, f) == "at the station, z = 200 mm"
    assert _loads_where({"at": 0.2, "loads_where": {"at": 0.215, "note": "keyway end"}}, f) == "z = 215 mm (keyway end)"
    assert _loads_where({"at": 0.2, "governing_at": 0.19}, f) == "z = 190 mm"


def test_engineering_notation_of_large_forces_and_moments():
    from compare.case.units import SYSTEMS  # noqa: PLC0415  only these small checks
    from compare.output.report_layout import EngFmt  # noqa: PLC0415
    f = EngFmt(SYSTEMS["mm-N-MPa"])
    assert f.q(-120.0, "moment", 4) == "-120·10³ N·mm"  # 120 N·m, never a bare 120000
    assert f.q(143.2, "moment", 4) == "143.2·10³ N·mm"
    assert f.q(1800.0, "force", 4) == "1800 N"
    assert f.q(0.025, "length", 4) == "25 mm"
    assert figures_layout.eng_exponent([150000.0]) == 3 and figures_layout.eng_unit(3, "N·mm") == "10³ N·mm"
    assert figures_layout.eng_exponent([6.7e-5]) == -6 and figures_layout.eng_exponent([0.0]) == 0


def test_no_verdict_is_said_first_for_the_whole_shaft():
    """A station without a verdict (an unbounded stress) governs the shaft: the sentence says so and gives
    no factor, whatever the other stations' factors are."""
    from compare.case.units import SYSTEMS  # noqa: PLC0415  only these small checks
    from compare.output.report_layout import EngFmt, whole_shaft_verdict  # noqa: PLC0415
    st = [{"at": 0.05, "name": "keyseat", "results": {"governing": {"factor": 4.0, "criterion": "goodman",
                                                                     "path": "FE", "text": "n = 4"}}},
          {"at": 0.12, "name": "sharp step", "results": {"governing": {"no_verdict": True, "factor": 2.5}}}]
    res = {"section_loads": st, "shaft": {"governing_station": 1, "slopes": [], "gear_deflections": [],
                                          "critical_speeds": {"skipped": "no mass"}}}
    sentence, other = whole_shaft_verdict(res, EngFmt(SYSTEMS["mm-N-MPa"]))
    assert sentence.startswith("NO VERDICT for the shaft") and "sharp step" in sentence
    assert "2.5" not in sentence and "n = 4" not in sentence
    assert any("not computed" in x for x in other)


def test_the_layout_report_says_where_along_each_feature_the_loads_were_and_carries_the_checklist(layout):
    """The demo's pulley keyseat is checked at the worst loads along its 40 mm keyway (at its end toward
    bearing A, where the belt pull's moment is largest: statics, 1800 N × 20 mm); the station table and the
    station's own part say so. The keys, fits and bearing lives are in the report too."""
    html, res = layout["html"], layout["res"]

    def part(sid):
        a = html.find(f'<section id="{sid}"')
        return html[a:html.find("</section>", a)]

    pulley = next(i for i, s in enumerate(res["section_loads"]) if s["name"] == "pulley keyseat")
    st = res["section_loads"][pulley]
    assert st["extent"] is not None and abs(st["used_at"] - 0.045) < 1e-9
    table = part("stations")
    assert "governing loads at z = 45 mm" in table
    assert "governing loads at z = 45 mm" in part(f"station-{pulley + 1}")
    chk = part("checklist")
    assert "key pulley keyseat" in chk and "L10" in chk


def test_a_remembered_fit_that_disagrees_with_the_fe_gets_no_ratio_in_the_layout_report(layout):
    """Roark's Table 17.1 coefficients are from memory; where the fit is off the FE by more than its stated
    accuracy (common practice) plus the FE's estimate, the report says to trust the FE and prints no FE/chart
    ratio that would make the FE look wrong."""
    html, res = layout["html"], layout["res"]
    a = html.find('<section id="features"')
    feats = html[a:html.find("</section>", a)]
    off = [(f, k) for f in res["shaft"]["features"] for k in ("kt_bending", "kts", "kt_axial")
           if (f.get(f"{k}_chart") or {}).get("disagrees_with_fe")]
    for f, k in off:
        assert "trust the FE value" in feats
        assert f"{f[k] / f[f'{k}_chart']['value']:.3g}</td>" not in feats

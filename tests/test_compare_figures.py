"""The section drawing of compare/output/figures.py: a keyway is dimensioned as the key standards
tabulate it (width b, and d − t from the keyway bottom to the opposite side of the shaft), checked
against the key tables of classic/keys.py; no label of the drawing overlaps another. The section is
meshed and solved once without the study (the drawing needs the mesh, not the accuracy)."""
from __future__ import annotations

import re

import matplotlib.pyplot as plt
import pytest

from classic.keys import inch_square_key, metric_parallel_key
from compare.api import Case
from compare.output import figures
from compare.output.figures_layout import text_overlaps
from compare.output.results import build_results
from compare.pipeline import analyse

INCH = 0.0254


def _drawing(monkeypatch, case):
    """The section figure's SVG text and its matplotlib figure (kept open for the overlap check)."""
    a = analyse(case.spec, study=False)
    res = build_results(a)
    kept = []
    real = figures.Figure

    def keep(name, title, fig):
        kept.append(fig)
        fig.draw_without_rendering()
        out = real.__new__(real)
        out.name, out.title, out.svg = name, title, _svg(fig)
        return out

    monkeypatch.setattr(figures, "Figure", keep)
    fg = figures.all_figures(a, res, {}, only={"section"})[0]
    return fg.svg, kept[0]


def _svg(fig) -> str:
    import io  # noqa: PLC0415  only for this helper
    buf = io.StringIO()
    fig.savefig(buf, format="svg")
    return buf.getvalue()


def _dt(svg: str, unit: str) -> float:
    found = re.findall(rf"d − t = ([0-9.]+) {unit}", svg)
    assert len(found) == 1, found
    return float(found[0])


def test_metric_keyway_d_minus_t(monkeypatch):
    """ISO/R773 (1969) and DIN 6885-1 (1968-08), Table 1: a 30 mm shaft takes the 8 × 7 key with t1 = 4.0
    mm; the standards dimension the keyway bottom as d − t1 = 26 mm."""
    case = Case.keyed(diameter="30 mm", keyways=[dict(standard="metric")], torque="100 N*m",
                      material=dict(elastic_modulus="205 GPa", poisson=0.29), analysis=dict(fineness=0.4))
    svg, fig = _drawing(monkeypatch, case)
    row = metric_parallel_key(0.030)
    assert _dt(svg, "mm") == pytest.approx((0.030 - row["depth"]) * 1e3, abs=5e-4)
    assert _dt(svg, "mm") == pytest.approx(26.0, abs=5e-4)  # ISO/R773, DIN 6885-1 Table 1 (published row)
    assert re.search(r"b = 8 mm", svg)
    assert "chord" not in svg
    fig.dpi = figures.STYLE["savefig.dpi"]
    assert text_overlaps(fig) == []
    plt.close(fig)


def test_inch_keyway_d_minus_t(monkeypatch):
    """ASME B17.1-1967 (R2003), Table 1: a 1 1/4 in shaft takes the 1/4 in square key; the keyseat is
    H/2 deep at its side, and the bottom to the opposite side is S = D − Y − H/2 with the chordal height
    Y = (D − √(D² − W²))/2 (the standard's figure; from memory)."""
    case = Case.keyed(diameter=1.25, keyways=[dict(standard="inch", fillet=0.01)], torque=1000, units="in-lbf-psi",
                      material=dict(elastic_modulus=30e6, poisson=0.29), analysis=dict(fineness=0.4))
    svg, fig = _drawing(monkeypatch, case)
    D = 1.25
    W = 0.25
    Y = (D - (D * D - W * W) ** 0.5) / 2
    S = D - Y - W / 2
    assert _dt(svg, "inch") == pytest.approx(S, abs=5e-4)
    assert _dt(svg, "inch") == pytest.approx(D - inch_square_key(D * INCH)["depth"] / INCH, abs=5e-4)
    plt.close(fig)

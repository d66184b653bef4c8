"""Result._repr_html_ (compare/output/notebook.py) of a section case: the verdict, the headline table
with every row of results.csv, user text escaped, no script. (A layout's view is checked in
test_compare_report_layout.py on the demo countershaft.)"""
from __future__ import annotations

from compare.api import Case, analyse
from compare.output.headline import headline_rows


def test_section_result_shows_itself():
    case = Case.keyed(diameter="30 mm", keyways=[dict(width="8 mm", depth="4 mm", fillet="0.4 mm")],
                      torque="150 N*m", material={"elastic_modulus": "205 GPa", "poisson": 0.29, "yield": 400, "ultimate": 650},
                      analysis=dict(fineness=0.4, accuracy=0.2), title="<b>keyed & co</b>", units="mm-N-MPa")
    r = analyse(case)
    html = r._repr_html_()
    assert "&lt;b&gt;keyed &amp; co&lt;/b&gt;" in html and "<b>keyed" not in html  # user text escaped
    assert "Lowest factor of safety" in html
    assert html.count("<tr>") - 1 == len(headline_rows(r.to_dict(), r.analysis.case.units))
    assert "<script" not in html and "<img" not in html  # a section case: no layout diagrams

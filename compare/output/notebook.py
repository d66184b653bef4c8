"""The notebook view of a result (``Result._repr_html_``): the one-screen verdict and headline table,
and for a shaft layout the station table and the diagrams along the shaft. User text escaped; numbers
in the case's units; no script, no network."""
from __future__ import annotations

import base64
import html

from .design_report import is_layout
from .headline import headline_rows, layout_rows
from .report_composite_layout import composite_headline_rows, composite_segment_rows, is_composite
from .report import Fmt


def _e(text) -> str:
    return html.escape("" if text is None else str(text), quote=True)


def _g(v) -> str:
    return "" if v is None else f"{v:.5g}"


def result_html(res: dict, system) -> str:
    """One HTML fragment: warnings, the verdict, the headline rows; for a layout also its stations and
    the diagrams (drawn here, as inline SVG)."""
    parts = [f"<div><strong>{_e(res['case']['title'])}</strong>"]
    for w in res.get("warnings", []):
        parts.append(f"<p style=\"font-weight:bold\">WARNING: {_e(w['text'])}</p>")
    layout = is_layout(res)
    if layout:
        from .report_layout import EngFmt, whole_shaft_verdict  # noqa: PLC0415  lazy import of a slow dependency (matplotlib through .figures)
        sentence, other = whole_shaft_verdict(res, EngFmt(system))
        parts.append(f"<p>{_e(sentence)}</p><ul>" + "".join(f"<li>{_e(x)}</li>" for x in other) + "</ul>")
    else:
        gov = res.get("governing")
        text = (gov.get("text") or f"n = {gov['factor']:.3g} in {gov.get('region')}") if gov else None  # composite: no text
        parts.append(f"<p>{_e('Lowest factor of safety: ' + text if gov else 'No factor of safety computed.')}</p>")
    rows = (composite_headline_rows(res, system) if is_composite(res) else headline_rows(res, system)) + (
        layout_rows(res, system) + composite_segment_rows(res, system) if layout else [])
    parts.append("<table><thead><tr><th>group</th><th>quantity</th><th>value</th><th>unit</th><th>hand</th>"
                 "<th>FE/hand</th><th>source</th></tr></thead><tbody>")
    for r in rows:
        parts.append("<tr>" + "".join(f"<td>{_e(x)}</td>" for x in (
            r["group"], r["quantity"], _g(r["value"]), r["unit"], _g(r["hand_value"]), _g(r["ratio"]), r["source"]))
            + "</tr>")
    parts.append("</tbody></table>")
    if layout:
        from .figures import STYLE  # noqa: PLC0415  lazy import of a slow dependency: matplotlib
        from .figures_layout import diagrams_figure, plt  # noqa: PLC0415  lazy import of a slow dependency: matplotlib
        with plt.rc_context(STYLE):
            fig = diagrams_figure(res, Fmt(system))
        data = base64.b64encode(fig.svg.encode("utf-8")).decode("ascii")
        parts.append(f'<img src="data:image/svg+xml;base64,{data}" alt="{_e(fig.title)}" style="max-width:100%">')
    parts.append(f"<p><small>{_e(res.get('caution', ''))}</small></p></div>")
    return "".join(parts)

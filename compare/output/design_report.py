"""The files of the design report: ``report.html``, ``results.csv`` and every figure as
``figures/<name>.png`` and ``.svg``; written through :func:`compare.cli.cmd_run.write_outputs`.
A shaft layout gets the layout report (compare/output/report_layout.py): the whole shaft's figures
and, for each station, its own section figures (``figures/station<n>_<name>``)."""
from __future__ import annotations

from dataclasses import replace

from ..case.case import read_input_file
from .headline import csv_text, headline_rows, layout_rows
from .report_composite_layout import (composite_headline_rows, composite_segment_rows, composite_station_figures,
                                      is_composite)
from .report import Fmt
from .results import build_results
from .vtu import fields_of


def is_layout(res: dict) -> bool:
    """A results dictionary of a shaft layout with its beam (reactions) and stations."""
    return bool((res.get("shaft") or {}).get("reactions")) and bool(res.get("section_loads"))


def station_results(a) -> list:
    """(analysis, full results) of every station of a layout, in order."""
    out = []
    for sa in a.extra.get("shaft_stations") or []:
        plain = replace(sa, extra={k: v for k, v in sa.extra.items() if k not in ("shaft", "shaft_stations")})
        out.append((sa, build_results(plain)))
    return out


def report_files(a, res: dict, date: str | None = None) -> dict[str, str | bytes]:
    """``{relative name: text or bytes}`` of the report for the analysis ``a`` and its results ``res``."""
    from .figures import all_figures  # noqa: PLC0415  lazy import of a slow dependency: matplotlib (~0.8 s), only when a report is drawn
    from .report_html import render  # noqa: PLC0415  lazy import of a slow dependency (it reaches matplotlib through .figures)
    case_text = read_input_file(a.case.path, "case") if a.case.path is not None else None
    rows = composite_headline_rows(res, a.case.units) if is_composite(res) else headline_rows(res, a.case.units)
    if is_layout(res):
        from .figures_layout import layout_figures  # noqa: PLC0415  lazy import of a slow dependency (matplotlib)
        from .report_layout import STATION_FIGURES, render_layout  # noqa: PLC0415  lazy import of a slow dependency (matplotlib through .figures)
        from .figures_segment import station_segment_figure  # noqa: PLC0415  lazy import of a slow dependency (matplotlib)
        figs = layout_figures(a, res, a.case.units)
        stations = []
        shaft_stations = getattr(a.extra["shaft"].get("shaft"), "stations", None) or []
        for i, (sa, sres) in enumerate(station_results(a), 1):
            if is_composite(sres):  # a station on a composite segment: its regions and torsional stress
                stations.append((sres, composite_station_figures(sa, sres, i)))
                continue
            sfigs = all_figures(sa, sres, fields_of(sa) if sa.extra.get("combined") else {}, only=set(STATION_FIGURES))
            kt = shaft_stations[i - 1].kt if i - 1 < len(shaft_stations) else {}
            if "segment_stresses" in kt:  # a 3-D feature: the surface stress near it under the station's loads
                sfigs.append(station_segment_figure(kt["segment_stresses"][0], sa.case.loads, Fmt(a.case.units)))
            for fg in sfigs:
                fg.name = f"station{i}_{fg.name}"
            stations.append((sres, sfigs))
        html = render_layout(res, a.case.units, figs, stations, case_text, res.get("inputs") or {}, date,
                             title=a.extra["shaft"].get("title"))
        figs = figs + [fg for _, sf in stations for fg in sf]
        rows = rows + layout_rows(res, a.case.units) + composite_segment_rows(res, a.case.units)
    else:
        from .figures_polymer import polymer_figures  # noqa: PLC0415  lazy import of a slow dependency: matplotlib, as above
        figs = all_figures(a, res, fields_of(a) if a.extra.get("combined") else {}) + polymer_figures(res, a.case.units)
        html = render(res, a.case.units, figs, case_text, res.get("inputs") or {}, date)
    out: dict[str, str | bytes] = {"report.html": html, "results.csv": csv_text(rows)}
    for fg in figs:
        out[f"figures/{fg.name}.svg"] = fg.svg
        out[f"figures/{fg.name}.png"] = fg.png
    return out

"""The files of the design report: ``report.html``, ``results.csv`` and every figure as
``figures/<name>.png`` and ``.svg``; written through :func:`compare.cli.cmd_run.write_outputs`."""
from __future__ import annotations

from ..case.case import read_input_file
from .headline import csv_text, headline_rows
from .vtu import fields_of


def report_files(a, res: dict, date: str | None = None) -> dict[str, str | bytes]:
    """``{relative name: text or bytes}`` of the report for the analysis ``a`` and its results ``res``."""
    from .figures import all_figures  # noqa: PLC0415  lazy import of a slow dependency: matplotlib (~0.8 s), only when a report is drawn
    from .report_html import render  # noqa: PLC0415  lazy import of a slow dependency (it reaches matplotlib through .figures)
    from .figures_polymer import polymer_figures  # noqa: PLC0415  lazy import of a slow dependency: matplotlib, as above
    figs = all_figures(a, res, fields_of(a) if a.extra.get("combined") else {}) + polymer_figures(res, a.case.units)
    case_text = read_input_file(a.case.path, "case") if a.case.path is not None else None
    out: dict[str, str | bytes] = {
        "report.html": render(res, a.case.units, figs, case_text, res.get("inputs") or {}, date),
        "results.csv": csv_text(headline_rows(res, a.case.units)),
    }
    for fg in figs:
        out[f"figures/{fg.name}.svg"] = fg.svg
        out[f"figures/{fg.name}.png"] = fg.png
    return out

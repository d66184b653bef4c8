"""``shaft.svg``: the layout's diagrams along the shaft (axial force, shear forces, bending moments and
their resultant, torque, slopes, deflections) with the supports and the checked stations marked, in
the case's units scaled by powers of 10³ — the report's ``figures/shaft_diagrams`` figure
(compare/output/figures_layout.py). Written beside results.json for a shaft-layout case, also with
``--no-report``."""
from __future__ import annotations

from .report import Fmt


def shaft_figure_svg(res: dict, system) -> str | None:
    """The figure as SVG text, or None for a case without a layout."""
    sh = res.get("shaft")
    if not sh or not sh.get("diagrams"):
        return None
    from .figures import STYLE  # noqa: PLC0415  lazy import of a slow dependency: matplotlib, only layout cases draw
    from .figures_layout import diagrams_figure, plt  # noqa: PLC0415  lazy import of a slow dependency (matplotlib)
    with plt.rc_context(STYLE):
        return diagrams_figure(res, Fmt(system)).svg

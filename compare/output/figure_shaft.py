"""``shaft.svg``: the layout's diagrams (bending moment in both planes and resultant, torque, shear
force, deflected shape) along the shaft, with the supports, the loads and the checked stations
marked, in the case's units. Written beside results.json for a shaft-layout case."""
from __future__ import annotations

import io

import numpy as np

from ..case.units import SYSTEMS, from_si


def shaft_figure_svg(res: dict, system) -> str | None:
    """The figure as SVG text, or None for a case without a layout."""
    sh = res.get("shaft")
    if not sh:
        return None
    import matplotlib  # noqa: PLC0415  lazy import of a slow dependency: only layout cases draw

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt  # noqa: PLC0415  lazy import of a slow dependency (with matplotlib)

    s = system or SYSTEMS["mm-N-MPa"]
    c = sh["diagrams"]

    def conv(values, dim):
        return np.array([from_si(v, dim, s) for v in values])

    x = conv(c["x"], "length")
    rows = [("bending moment", "moment", [("Mx", "Mx"), ("My", "My"), ("M", "|M|")]),
            ("torque", None, [("T", "T")]),
            ("shear force", "force", [("Vx", "Vx"), ("Vy", "Vy")]),
            ("deflection", "length", [("deflection_x", "x"), ("deflection_y", "y"), ("deflection", "|δ|")])]
    fig, axes = plt.subplots(len(rows), 1, figsize=(8, 9), sharex=True)
    for ax, (title, dim, series) in zip(axes, rows):
        for key, label in series:
            d = dim or "moment"
            ax.plot(x, conv(c[key], d), label=f"{label} [{s.label(d)}]")
        for st in res.get("section_loads", []):
            ax.axvline(from_si(st["at"], "length", s), color="0.4", lw=0.8, ls="--")
        for r in sh["reactions"]:
            ax.axvline(from_si(r["at"], "length", s), color="k", lw=1.2)
        ax.axhline(0.0, color="0.7", lw=0.6)
        ax.set_title(title, fontsize=9, loc="left")
        ax.legend(fontsize=7, loc="best")
    for st in res.get("section_loads", []):
        axes[0].annotate(st["name"] or "station", (from_si(st["at"], "length", s), 1.0), xycoords=("data", "axes fraction"),
                         fontsize=7, rotation=90, va="top", ha="right", color="0.3")
    axes[-1].set_xlabel(f"position along the shaft [{s.label('length')}]  (solid: supports; dashed: checked stations)")
    fig.tight_layout()
    buf = io.StringIO()
    fig.savefig(buf, format="svg")
    plt.close(fig)
    return buf.getvalue()

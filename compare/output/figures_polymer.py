"""The polymer data figure of the report: the user's stress-life points with their power-law fits and
the required cycles, and the creep-modulus points against load duration with the service life (from
results ``polymer``). The project's figure style (compare/output/figures.py): labelled axes with units,
ink and greys with distinct markers and line styles, readable in grey."""
from __future__ import annotations

import matplotlib.pyplot as plt
import numpy as np
from matplotlib.ticker import FuncFormatter

from ..case.units import from_si
from .figures import INK, STYLE, Figure

_MARKERS = ("o", "s", "^", "D")
_GREYS = (INK, "#6e6e6e", "#a0a0a0", "#404040")
_LINES = ("-", "--", ":", "-.")


def polymer_figures(res: dict, system) -> list[Figure]:
    """[the polymer data figure] when the case is a polymer case with stress-life or creep data; else []."""
    p = res.get("polymer")
    if not p:
        return []
    fits = (p.get("fatigue") or {}).get("fits") or []
    tw = p.get("twist") or {}
    curves = tw.get("curves") or []
    if not fits and not curves:
        return []
    label = system.label("stress") if system is not None else "Pa"

    def s(v):
        return np.asarray(v, float) if system is None else np.array([from_si(x, "stress", system) for x in v])

    with plt.rc_context(STYLE):
        n = int(bool(fits)) + int(bool(curves))
        fig, axes = plt.subplots(1, n, figsize=(4.3 * n, 3.2), squeeze=False)
        k = 0
        if fits:
            ax = axes[0, k]
            k += 1
            for i, f in enumerate(fits):
                N = np.asarray(f["cycles"], float)
                ax.plot(N, s(f["amplitude"]), _MARKERS[i % 4], color=_GREYS[i % 4], ms=4, mfc="none",
                        label=f"points at {f['temperature']:g} °C")
                Nl = np.geomspace(f["n_min"], f["n_max"], 50)
                ax.plot(Nl, s(f["A"] * Nl ** f["b"]), _LINES[i % 4], color=_GREYS[i % 4],
                        label=f"σa = A·N^{f['b']:.3g}")
            Nr = p["fatigue"]["cycles"]
            ax.axvline(Nr, color=INK, lw=0.6, ls=":")
            ax.plot([Nr], s([p["fatigue"]["S_f"]]), "x", color=INK, ms=7,
                    label=f"S_f at {p['conditions']['temperature']:g} °C, {Nr:.3g} cycles")
            ax.set_xscale("log")
            ax.set_yscale("log")
            plain = FuncFormatter(lambda v, _pos: f"{v:g}")  # stresses as plain numbers on the log axis
            ax.yaxis.set_major_formatter(plain)
            ax.yaxis.set_minor_formatter(plain)
            ax.set_xlabel("cycles N [1]")
            ax.set_ylabel(f"stress amplitude σa (fully reversed) [{label}]")
            ax.set_title(f"stress-life data, {p['conditions']['moisture']}")
            ax.grid(True, which="major")
            ax.legend(loc="lower left")
        if curves:
            ax = axes[0, k]
            for i, c in enumerate(curves):
                t = np.asarray(c["duration"], float) / 3600.0
                ax.plot(t, s(c["moduli"]), _MARKERS[i % 4] + _LINES[i % 4], color=_GREYS[i % 4], ms=4, mfc="none",
                        label=f"creep modulus at {c['temperature']:g} °C")
            life = tw["duration"] / 3600.0
            ax.axvline(life, color=INK, lw=0.6, ls=":")
            ax.plot([life], s([tw["creep_modulus"]]), "x", color=INK, ms=7,
                    label=f"E_c at {p['conditions']['temperature']:g} °C, {life:.4g} h")
            ax.set_xscale("log")
            ax.set_xlabel("load duration [h]")
            ax.set_ylabel(f"creep modulus E_c [{label}]")
            ax.set_title(f"creep (isochronous) data, {p['conditions']['moisture']}")
            ax.grid(True, which="major")
            ax.legend(loc="lower left")
        return [Figure("polymer_data", "The polymer's own data read at the service conditions: stress-life points "
                       "with their power-law fits and the required cycles; creep modulus against load duration "
                       "with the service life", fig)]

"""The figures of a 3-D segment (a [segment] case, or a layout station with a 3-D feature): the stress
on the lateral surface near the feature, the surface sample points of the finest mesh unrolled onto
the shaft's surface — z along the shaft, arc length (d/2)·θ round it, θ from the feature's side —
coloured by the stress (each point of the feature's own faces drawn where it projects radially onto the
cylinder), the peak marked. The project's figure style (compare/output/figures.py): one perceptually
uniform colour map, labelled axes and colour bar with units, equal aspect, readable in grey."""
from __future__ import annotations

import math

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402

from ..case.units import from_si  # noqa: E402
from ..solve.segment_superpose import MODEL_ANGLE, superpose, surface_points, surface_stress, von_mises  # noqa: E402
from .figures import CMAP, INK, STYLE, Figure  # noqa: E402
from .report import Fmt  # noqa: E402

#: the unrolled view reaches this many diameters beyond the feature's ends along the shaft
REACH = 0.6
#: and this share of a half turn each way round the shaft from the feature's side (half the circumference)
TURN = 0.5


def _unrolled(ax, fig, pts, values, peak: int, d: float, k: float, z0: float, z1: float, feature_angle: float,
              z_shift: float, label: str, unit: str, title: str):
    """One unrolled panel: ``pts`` (3, n) [m] in the frame where the feature sits at ``feature_angle``
    [deg]; z shown as z + ``z_shift``; only z within the feature's span ± REACH·d."""
    x, y, z = pts
    th = np.angle(np.exp(1j * (np.arctan2(y, x) - math.radians(feature_angle))))
    s = d / 2 * th
    zz = z + z_shift
    on = (zz >= z0 - REACH * d) & (zz <= z1 + REACH * d) & (np.abs(th) <= TURN * math.pi)
    order = np.argsort(values[on])  # the highest drawn last: the peak region stays visible
    sc = ax.scatter(zz[on][order] * k, s[on][order] * k, c=values[on][order], s=2.0, cmap=CMAP, edgecolors="none",
                    rasterized=True)
    if on[peak]:
        ax.plot(zz[peak] * k, s[peak] * k, marker="o", ms=6, mfc="none", mec=INK, mew=1.2)
        ax.annotate("peak", (zz[peak] * k, s[peak] * k), xytext=(6, 6), textcoords="offset points", fontsize=7,
                    color=INK)
    else:  # the peak outside the view: said in the title, not drawn
        title += " (outside this view)"
    ax.set_aspect("equal", adjustable="box")
    ax.set_xlabel(f"z along the shaft [{unit}]")
    ax.set_ylabel(f"arc round the shaft [{unit}]")
    ax.set_title(title, fontsize=8)
    cb = fig.colorbar(sc, ax=ax, shrink=0.85, pad=0.02)
    cb.set_label(label)
    cb.outline.set_linewidth(0.4)


def _vm_over_nominal(r) -> np.ndarray:
    return von_mises(np.asarray(surface_stress(r))) / abs(r.nominal)


def segment_case_figure(a, f: Fmt) -> Figure | None:
    """A [segment] case: von Mises over the nominal stress on the surface near the feature, for bending
    about x (the keyseat's plane) and torsion, from the finest mesh."""
    rec = a.extra["segment"]
    st = rec["study"]
    seg = st.segment
    feat = seg.features[0]
    a0, b0 = feat.span()
    k = from_si(1.0, "length", f.s)
    unit = f.s.label("length")
    loads = [x for x in ("bending_x", "torsion") if x in st.finest]
    if not loads:
        return None
    names = {"bending_x": "bending about x", "torsion": "torsion"}
    with plt.rc_context(STYLE):
        fig, axes = plt.subplots(len(loads), 1, figsize=(6.4, 2.6 * len(loads)), squeeze=False)
        fig.subplots_adjust(hspace=0.55)
        for ax, load in zip(axes[:, 0], loads):
            r = st.finest[load]
            v = _vm_over_nominal(r)
            zs = np.asarray(surface_points(r))[2]
            inside = (zs > 0.375 * seg.d) & (zs < seg.length - 0.375 * seg.d)
            peak = int(np.argmax(np.where(inside, v, -np.inf)))
            _unrolled(ax, fig, np.asarray(surface_points(r)), v, peak, seg.d, k, a0, b0, MODEL_ANGLE.get(feat.kind, 0.0), 0.0,
                      "von Mises / nominal [1]", unit,
                      f"{names[load]}: largest von Mises / nominal {v[peak]:.3g} (finest mesh)")
        return Figure("segment_surface", "Stress on the segment's surface near the feature (finest 3-D mesh), unrolled "
                      "onto the shaft's surface: von Mises stress over the load's nominal stress; the circle marks "
                      "the peak", fig)


def station_segment_figure(local: dict, loads, f: Fmt) -> Figure:
    """A layout station with a 3-D feature: the largest von Mises stress over the load cycle of the
    station's governing loads ``loads`` (the station case's :class:`Loads`) on the surface near the
    feature, in the station's frame and along the shaft."""
    fl = local["fields"]
    Mx, My = loads.bending
    sp = superpose(fl, float(loads.axial or 0.0), float(Mx), float(My), float(loads.torque or 0.0),
                   bool(loads.rotating))
    rec = local["record"]
    d, L = fl.d, local["length"]
    k = from_si(1.0, "length", f.s)
    vm = from_si(1.0, "stress", f.s) * sp.vm_peak
    peak = int(np.argmax(vm))
    unit = f.s.label("length")
    with plt.rc_context(STYLE):
        fig, ax = plt.subplots(figsize=(6.4, 3.0))
        _unrolled(ax, fig, sp.points, vm, peak, d, k, rec["span"][0], rec["span"][1], rec["angle_deg"],
                  local["centre"] - L / 2, f"von Mises, worst instant [{f.s.label('stress')}]", unit,
                  f"{rec['kind'].replace('_', ' ')}: peak von Mises {vm[peak]:.4g} {f.s.label('stress')}"
                  + (" over the turn" if sp.rotating else ""))
        return Figure("segment_surface", "Stress on the shaft's surface near the station's 3-D feature (the 3-D segment's "
                      "unit-load results superposed with the station's governing loads), unrolled onto the shaft's "
                      "surface; the circle marks the peak", fig)

"""The layout report's own figures, in the style of :mod:`.figures` (one palette readable in grey,
labelled axes with units, engineering notation, equal aspect for drawings): the shaft drawn to
scale in both planes with its parts, forces and dimensions; the diagrams along the shaft; the mode
shapes of the critical speeds; the stress along each shoulder fillet and groove bottom.

Labels that could collide are placed by :func:`place_text` (moved along a direction until their box
is free); :func:`text_overlaps` lists the pairs of texts whose boxes still overlap (the tests use it).
"""
from __future__ import annotations

import math

import matplotlib.pyplot as plt
import numpy as np
from matplotlib import colormaps
from matplotlib.patches import Polygon as PolygonPatch
from matplotlib.patches import Rectangle
from matplotlib.text import Text
from matplotlib.ticker import MaxNLocator
from matplotlib.transforms import ScaledTranslation

from ..case.units import from_si
from .figures import CMAP, GRID, INK, STYLE, Figure
from .report import Fmt

#: the line styles of the curves of one panel: colour from the one colour map, and a dash pattern
#: so that they stay apart in grey
SERIES = [(colormaps[CMAP](0.05), "-"), (colormaps[CMAP](0.6), "--"), (INK, ":")]
_SUPER = str.maketrans("-0123456789", "\u207b\u2070\u00b9\u00b2\u00b3\u2074\u2075\u2076\u2077\u2078\u2079")


def eng_exponent(values) -> int:
    """The power of ten (a multiple of 3) that brings the largest |value| into [1, 1000)."""
    v = np.asarray(values, float)
    top = float(np.max(np.abs(v[np.isfinite(v)]))) if v.size and np.isfinite(v).any() else 0.0
    if top == 0.0:
        return 0
    return 3 * math.floor(math.log10(top) / 3 + 1e-12)


def eng_unit(exp: int, unit: str) -> str:
    """The unit of an axis scaled by 10^exp: '10³ N·mm', or the unit itself."""
    if exp == 0:
        return unit or "1"
    return f"10{str(exp).translate(_SUPER)} {unit}".rstrip()


def text_overlaps(fig, pad: float = 0.0) -> list[tuple[str, str]]:
    """Pairs of visible, non-empty texts of ``fig`` (titles, labels, tick labels, annotations) whose
    boxes on the drawn figure overlap by more than ``pad`` pixels."""
    fig.canvas.draw()
    r = fig.canvas.get_renderer()
    texts, ticks = [], set()
    for ax in fig.axes:  # tick labels: only those drawn (matplotlib keeps spare ticks outside the view)
        for axis in (ax.xaxis, ax.yaxis):
            for tick in axis.get_major_ticks() + axis.get_minor_ticks():
                ticks.update((id(tick.label1), id(tick.label2)))
            for tick in axis._update_ticks():
                texts += [tick.label1, tick.label2]
    texts += [t for t in fig.findobj(Text) if id(t) not in ticks]
    boxes, seen = [], set()
    for t in texts:
        if id(t) in seen:  # a legend's texts are reached twice
            continue
        seen.add(id(t))
        if not t.get_visible() or not t.get_text().strip():
            continue
        try:
            bb = t.get_window_extent(r)
        except (RuntimeError, ValueError):
            continue
        if bb.width > 0 and bb.height > 0:
            boxes.append((t.get_text(), bb))
    out = []
    for i in range(len(boxes)):
        for j in range(i + 1, len(boxes)):
            a, b = boxes[i][1], boxes[j][1]
            if min(a.x1, b.x1) - max(a.x0, b.x0) > pad and min(a.y1, b.y1) - max(a.y0, b.y0) > pad:
                out.append((boxes[i][0], boxes[j][0]))
    return out


class Placer:
    """Places texts on one axes so that none overlaps an earlier one: a text that collides is moved
    by its own height (or width) in the given direction until it is free (at most ``tries`` times)."""

    def __init__(self, ax):
        self.ax = ax
        self.fig = ax.figure
        self.r = self.fig.canvas.get_renderer()
        self.boxes = []

    def text(self, x, y, s, step=(0.0, 1.0), tries=12, **kw):
        t = self.ax.text(x, y, s, **kw)
        bb = t.get_window_extent(self.r).padded(2)
        for _ in range(tries):
            if not any(_hit(bb, b) for b in self.boxes):
                break
            dx, dy = step[0] * (bb.width + 2), step[1] * (bb.height + 2)
            t.set_transform(t.get_transform() + _offset(self.fig, dx, dy))
            bb = t.get_window_extent(self.r).padded(2)
        self.boxes.append(bb)
        return t


def _hit(a, b) -> bool:
    return min(a.x1, b.x1) > max(a.x0, b.x0) and min(a.y1, b.y1) > max(a.y0, b.y0)


def _offset(fig, dx, dy):
    return ScaledTranslation(dx / fig.dpi, dy / fig.dpi, fig.dpi_scale_trans)


# ----------------------------------------------------------------------------- the shaft's outline
def profile(segs, grooves, n_arc: int = 12) -> np.ndarray:
    """Upper outline (z, r) of the shaft [m]: segments, shoulder fillets (quarter arcs in the
    re-entrant corner), U-grooves (bottom radius in its corners)."""
    pts: list[tuple[float, float]] = []
    for i, s in enumerate(segs):
        R = s.diameter / 2
        if i == 0:
            pts.append((s.start, 0.0))
            pts.append((s.start, R))
        else:
            a = segs[i - 1]
            ra, z0, rho = a.diameter / 2, s.start, (s.fillet or 0.0)
            if R > ra:
                rho = min(rho, R - ra)
                if rho:
                    t = np.linspace(-math.pi / 2, 0.0, n_arc)
                    pts += [(z0 - rho + rho * math.cos(v), ra + rho + rho * math.sin(v)) for v in t]
                pts.append((z0, R))
            elif R < ra:
                rho = min(rho, ra - R)
                pts.append((z0, ra))
                if rho:
                    t = np.linspace(math.pi, 1.5 * math.pi, n_arc)
                    pts += [(z0 + rho + rho * math.cos(v), R + rho + rho * math.sin(v)) for v in t]
                else:
                    pts.append((z0, R))
        pts.append((s.end, R))
    pts.append((segs[-1].end, 0.0))
    out = np.array(pts)
    for g in grooves:
        out = _with_groove(out, g, n_arc)
    return out


def _with_groove(p: np.ndarray, g, n_arc: int) -> np.ndarray:
    z1, z2 = g.at - g.width / 2, g.at + g.width / 2
    R = float(np.interp(g.at, p[1:-1, 0], p[1:-1, 1]))
    rb = R - g.depth
    rho = min(g.radius or 0.0, g.width / 2, g.depth)
    cut = [(z1, R)]
    if rho:
        t = np.linspace(math.pi, 1.5 * math.pi, n_arc)
        cut += [(z1 + rho + rho * math.cos(v), rb + rho + rho * math.sin(v)) for v in t]
        t = np.linspace(1.5 * math.pi, 2 * math.pi, n_arc)
        cut += [(z2 - rho + rho * math.cos(v), rb + rho + rho * math.sin(v)) for v in t]
    else:
        cut += [(z1, rb), (z2, rb)]
    cut.append((z2, R))
    keep_l = p[(p[:, 0] < z1) | ((p[:, 0] == z1) & (np.arange(len(p)) == 0))]
    keep_r = p[p[:, 0] > z2]
    return np.vstack([keep_l, np.array(cut), keep_r])


def _draw_shaft(ax, prof, segs, k, z_of=None, fill="#e4e4e4"):
    up = prof * k
    low = up[::-1] * np.array([1.0, -1.0])
    poly = np.vstack([up, low])
    ax.add_patch(PolygonPatch(poly, closed=True, fc=fill, ec=INK, lw=0.9, zorder=2))
    for s in segs:
        if s.bore:
            for sgn in (1, -1):
                ax.plot([s.start * k, s.end * k], [sgn * s.bore / 2 * k] * 2, color=INK, lw=0.6, ls="--", zorder=3)
    L = segs[-1].end * k
    ax.plot([-0.02 * L, 1.02 * L], [0, 0], color="#777777", lw=0.5, ls=(0, (8, 2, 1, 2)), zorder=3)


# ----------------------------------------------------------------------------- figures
def layout_drawing(a, res, f: Fmt) -> Figure:
    """The shaft to scale in its two planes: the y–z plane with the y forces and the x–z plane with the x
    forces; parts, supports, checked stations (numbered) and the dimensions of the sketch."""
    shaft, segs = layout_of(a)
    k = from_si(1.0, "length", f.s)
    u = f.s.label("length")
    prof = profile(segs, shaft.grooves)
    L = shaft.length * k
    Dmax = max(s.diameter for s in segs) * k
    parts = {(p["at"], p["name"]): p for p in res["shaft"]["parts"]}
    reach = max([Dmax] + [(ld.gear.pitch_diameter if ld.gear else ld.pulley.diameter if ld.pulley else 0) * k
                          for ld in shaft.loads])
    # parts larger than 2.5 shaft diameters are cut at the frame (the shaft stays to scale)
    reach = min(reach, 2.5 * Dmax)
    hy, hx = 2 * 1.09 * reach, 2 * 1.09 * reach + 0.26 * L  # the data heights of the two views
    fig, axes = plt.subplots(2, 1, figsize=(8.6, 1.6 + 7.0 * (hy + hx) / (1.12 * L)),
                             gridspec_kw={"height_ratios": [hy, hx]})
    fsc = max([abs(p["Fx"]) for p in res["shaft"]["parts"]] + [abs(p["Fy"]) for p in res["shaft"]["parts"]]
              + [abs(r["Fx"]) for r in res["shaft"]["reactions"]] + [abs(r["Fy"]) for r in res["shaft"]["reactions"]]
              + [1e-300])
    arrow_len = 0.45 * reach
    top = reach / 2 + arrow_len + 0.14 * reach
    placers = []
    for ax, plane in zip(axes, ("y", "x")):
        _draw_shaft(ax, prof, segs, k)
        ax.set_aspect("equal", adjustable="box")
        ax.set_xlim(-0.06 * L, 1.06 * L)
        # limits first (the labels are placed in pixels); the lower view holds the dimensions below
        ax.set_ylim(-top - (0.26 * L if plane == "x" else 0.0), top)
        ax.apply_aspect()  # the axes' final box, so that the labels are placed where they will be drawn
        pl = Placer(ax)
        placers.append(pl)
        # the parts: their pitch or belt diameter as a dashed outline over their hub width
        for i, ld in enumerate(shaft.loads):
            z = ld.at * k
            d = (ld.gear.pitch_diameter if ld.gear else ld.pulley.diameter if ld.pulley else None)
            w = 0.06 * L
            if d:
                ax.add_patch(Rectangle((z - w / 2, -d * k / 2), w, d * k, fill=False, ec="#555555", lw=0.8,
                                       ls=(0, (4, 2)), zorder=4, clip_on=True))
            p = parts.get((ld.at, ld.name or f"loads[{i}]"))
            F = (p["Fy"] if plane == "y" else p["Fx"]) if p else 0.0
            if F and abs(F) > 1e-9 * fsc:
                h = arrow_len * abs(F) / fsc
                # at the pitch or belt circle where it fits in the frame, else as far out as fits
                tip = min(d * k / 2 if d else Dmax / 2, top - h - 0.04 * reach) * (1 if F < 0 else -1)
                ax.annotate("", (z, tip), (z, tip - math.copysign(h, F)),
                            arrowprops={"arrowstyle": "-|>", "lw": 1.4, "color": INK, "mutation_scale": 10}, zorder=6)
                pl.text(z, tip - math.copysign(h, F), f" F{plane} {f.q(F, 'force', 3)}", fontsize=7.5,
                        va="bottom" if F < 0 else "top", ha="left", step=(0.0, 1.0 if F < 0 else -1.0))
            Fz = p["Fz"] if p else 0.0
            if plane == "y" and Fz and abs(Fz) > 1e-9 * fsc:  # a thrust (helical gear): along the axis
                h = max(arrow_len * abs(Fz) / fsc, 0.04 * L)
                ax.annotate("", (z, 0.0), (z - math.copysign(h, Fz), 0.0),
                            arrowprops={"arrowstyle": "-|>", "lw": 1.4, "color": INK, "mutation_scale": 10}, zorder=6)
                pl.text(z - math.copysign(h, Fz), 0.02 * reach, f"Fz {f.q(Fz, 'force', 3)}", fontsize=7.5,
                        ha="right" if Fz > 0 else "left", va="bottom", zorder=9, step=(0.0, 1.0),
                        bbox={"boxstyle": "square,pad=0.1", "fc": "#e4e4e4", "ec": "none"})
            kind = ld.kind if ld.kind != "pulley" or not ld.pulley or math.isfinite(ld.pulley.tension_ratio) else "sprocket"
            pl.text(z - w / 2, min((d * k / 2 if d else Dmax / 2) + 0.04 * reach, top - 0.12 * reach), f"{ld.name or kind} ({kind}, z {_n(z)})",
                    fontsize=7.5, ha="left", va="bottom", step=(0.0, 1.0))
        # the supports: a bearing block across the outline, a triangle below, the reaction arrow
        for rct in res["shaft"]["reactions"]:
            z = rct["at"] * k
            r_here = float(np.interp(rct["at"], prof[1:-1, 0], prof[1:-1, 1])) * k
            bw = 0.035 * L
            for sgn in (1, -1):
                ax.add_patch(Rectangle((z - bw / 2, sgn * r_here - (0 if sgn > 0 else 0.22 * r_here)), bw,
                                       0.22 * r_here, fc="#9a9a9a", ec=INK, lw=0.6, zorder=5))
            ax.add_patch(PolygonPatch([(z, -1.22 * r_here), (z - bw / 2, -1.22 * r_here - 0.5 * bw),
                                       (z + bw / 2, -1.22 * r_here - 0.5 * bw)], closed=True, fc="white", ec=INK,
                                      lw=0.7, zorder=5))
            F = rct["Fy"] if plane == "y" else rct["Fx"]
            if abs(F) > 1e-9 * fsc:
                h = arrow_len * abs(F) / fsc
                base = -1.22 * r_here - 0.5 * bw
                ax.annotate("", (z, base + (0 if F > 0 else -h)), (z, base - (h if F > 0 else 0)),
                            arrowprops={"arrowstyle": "-|>", "lw": 1.1, "color": "#555555", "mutation_scale": 9},
                            zorder=6)
                pl.text(z, base - h, f" R{plane} {f.q(F, 'force', 3)}", fontsize=7.5, va="top", ha="left",
                        step=(0.0, -1.0))
            pl.text(z - 0.7 * bw, -1.22 * r_here - 0.5 * bw, f"{rct['name'] or 'support'} (z {_n(z)})", fontsize=7.5,
                    ha="right", va="top", step=(-1.0, 0.0))
        # the checked stations: a dash-dot cut line and its number in a circle
        for j, st in enumerate(res.get("section_loads", []), 1):
            z = st["at"] * k
            ax.plot([z, z], [-0.62 * Dmax, 0.62 * Dmax], color="#3b3b3b", lw=0.8, ls=(0, (6, 2, 1, 2)), zorder=7)
            pl.text(z, 0.62 * Dmax, str(j), fontsize=7, ha="center", va="bottom", zorder=8, step=(1.0, 0.0),
                    bbox={"boxstyle": "circle,pad=0.15", "fc": "white", "ec": INK, "lw": 0.6})
        ax.set_title("y–z plane: forces along y" if plane == "y" else "x–z plane: forces along x (seen from +y)",
                     loc="left")
        ax.set_ylabel(f"{plane} [{u}]")
        ax.spines["left"].set_visible(True)
    _dimensions(axes[1], placers[1], segs, shaft, prof, k, u, L, -top)
    axes[1].set_xlabel(f"z, along the shaft [{u}]")
    return Figure("shaft_layout", "The shaft to scale in both planes: segments, fillets, grooves, bores, parts (dashed: "
                  "pitch or belt diameter), bearings, forces and reactions, the checked stations (numbered) and the "
                  "main dimensions", fig)


def layout_of(a):
    """(the Shaft, its segments) of a layout's analysis; a shaft given without segments is the beam's
    one uniform segment."""
    rec = a.extra["shaft"]
    shaft = rec["shaft"]
    return shaft, list(shaft.segments) or list(dict.fromkeys(rec["layout"]["model"].segs))


def _dimensions(ax, pl, segs, shaft, prof, k, u, L, below):
    """Chain dimensions of the segments and the overall length below ``below`` in the lower view;
    diameters, fillet radii and grooves written on the shaft in that view."""
    ys = below - 0.08 * L
    def dim(z1, z2, y, text):
        ax.annotate("", (z1, y), (z2, y), arrowprops={"arrowstyle": "<|-|>", "lw": 0.5, "color": INK,
                                                        "mutation_scale": 6, "shrinkA": 0, "shrinkB": 0})
        for zz in (z1, z2):
            ax.plot([zz, zz], [y - 0.01 * L, y + 0.03 * L], color=GRID, lw=0.5)
        pl.text((z1 + z2) / 2, y + 0.005 * L, text, fontsize=7, ha="center", va="bottom", step=(0.0, 1.0))
    for s in segs:
        dim(s.start * k, s.end * k, ys, f"{_n((s.end - s.start) * k)}")
    dim(0.0, L, ys - 0.09 * L, f"{_n(L)} {u} overall")
    for i, s in enumerate(segs):
        zc = (s.start + s.end) / 2 * k
        txt = f"⌀{_n(s.diameter * k)}" + (f" (bore ⌀{_n(s.bore * k)})" if s.bore else "")
        pl.text(zc, 0.08 * s.diameter * k, txt, fontsize=7, ha="center", va="bottom", zorder=9, step=(0.0, 1.0),
                bbox={"boxstyle": "square,pad=0.1", "fc": "#e4e4e4", "ec": "none"})
        if i and s.fillet and segs[i - 1].diameter != s.diameter:
            r = min(s.diameter, segs[i - 1].diameter) / 2 * k
            pl.text(s.start * k, r + 0.3 * abs(s.diameter - segs[i - 1].diameter) * k + 0.02 * L,
                    f"R{_n(s.fillet * k)}", fontsize=7, ha="center", va="bottom", zorder=9, step=(0.0, 1.0))
    for g in shaft.grooves:
        R = float(np.interp(g.at, prof[1:-1, 0], prof[1:-1, 1])) * k
        pl.text(g.at * k, R + 0.03 * L, f"groove {_n(g.width * k)}×{_n(g.depth * k)} R{_n(g.radius * k)}",
                fontsize=7, ha="center", va="bottom", zorder=9, step=(0.0, 1.0))


def _n(v: float) -> str:
    return f"{v:.4g}"


DIAGRAM_ROWS = (
    ("axial force", "force", (("N", "N"),)),
    ("shear force", "force", (("Vx", "Vx"), ("Vy", "Vy"))),
    ("bending moment", "moment", (("Mx", "Mx"), ("My", "My"), ("M", "|M|"))),
    ("torque", "moment", (("T", "T"),)),
    ("slope", "rad", (("slope_x", "θx = du/dz"), ("slope_y", "θy = dv/dz"))),
    ("deflection", "length", (("deflection_x", "u (x)"), ("deflection_y", "v (y)"), ("deflection", "|δ|"))),
)


def diagrams_figure(res, f: Fmt) -> Figure:
    """N, Vx, Vy, Mx, My, |M|, T, slopes and deflections along the shaft, in the case's units scaled to
    engineering notation; supports (solid, triangles) and checked stations (dash-dot, numbered)."""
    sh = res["shaft"]
    c = sh["diagrams"]
    kz = from_si(1.0, "length", f.s)
    x = np.asarray(c["x"]) * kz
    fig, axes = plt.subplots(len(DIAGRAM_ROWS), 1, figsize=(8.6, 1.75 * len(DIAGRAM_ROWS) + 0.8), sharex=True)
    fig.subplots_adjust(hspace=0.5)
    stations = res.get("section_loads", [])
    for ax, (title, dim, series) in zip(axes, DIAGRAM_ROWS):
        conv = 1.0 if dim == "rad" else from_si(1.0, dim, f.s)
        ys = [np.asarray(c[key]) * conv for key, _ in series]
        exp = eng_exponent(np.concatenate(ys))
        unit = "rad" if dim == "rad" else f.s.label(dim)
        for (key, label), y, (col, ls) in zip(series, ys, SERIES):
            ax.plot(x, y / 10.0**exp, color=col, ls=ls, lw=1.2, label=label)
        ax.axhline(0.0, color=GRID, lw=0.6)
        for r in sh["reactions"]:
            ax.axvline(r["at"] * kz, color="#555555", lw=0.7)
            ax.plot([r["at"] * kz], [0.0], marker="^", ms=6, mfc="white", mec=INK, clip_on=False, zorder=5)
        for st in stations:
            ax.axvline(st["at"] * kz, color="#555555", lw=0.6, ls=(0, (6, 2, 1, 2)))
        ax.set_ylabel(f"{title}\n[{eng_unit(exp, unit)}]")
        ax.legend(loc="upper left", bbox_to_anchor=(1.0, 1.0), fontsize=7)
        ax.grid(True, axis="y")
    top = axes[0]
    for j, st in enumerate(stations, 1):
        top.annotate(str(j), (st["at"] * kz, 1.0), xycoords=("data", "axes fraction"), xytext=(0, 3),
                     textcoords="offset points", ha="center", va="bottom", fontsize=7,
                     bbox={"boxstyle": "circle,pad=0.15", "fc": "white", "ec": INK, "lw": 0.6})
    axes[-1].set_xlabel(f"z, along the shaft [{f.s.label('length')}]   (triangles: supports; dash-dot: checked "
                        "stations, numbered)")
    return Figure("shaft_diagrams", "Diagrams along the shaft: axial force, shear forces, bending moments and their "
                  "resultant, torque, slopes and deflections in both planes", fig)


def modes_figure(res, a, f: Fmt) -> Figure | None:
    """The mode shapes of the first critical speeds (normalised), over the shaft's outline."""
    cs = res["shaft"]["critical_speeds"]
    ms = cs.get("mode_shapes")
    if not ms:
        return None
    k = from_si(1.0, "length", f.s)
    z = np.asarray(ms["z"]) * k
    fig, ax = plt.subplots(figsize=(8.6, 3.2))
    for (col, ls), w, om in zip(SERIES, ms["shapes"], ms["omega"]):
        ax.plot(z, w, color=col, ls=ls, lw=1.4, label=f"{om / (2 * math.pi):.4g} Hz = {om * 60 / (2 * math.pi):.0f} rpm")
    for r in res["shaft"]["reactions"]:
        ax.plot([r["at"] * k], [0.0], marker="^", ms=7, mfc="white", mec=INK, zorder=5)
    for ld in layout_of(a)[0].loads:
        if ld.mass:
            ax.axvline(ld.at * k, color=GRID, lw=0.8)
    ax.axhline(0.0, color=GRID, lw=0.6)
    ax.set_xlabel(f"z, along the shaft [{f.s.label('length')}]   (triangles: supports; grey lines: part masses)")
    ax.set_ylabel("deflection, largest = 1 [1]")
    sp = cs.get("speed")
    ax.set_title("mode shapes of the first critical speeds" + (f" (operating {sp * 60 / (2 * math.pi):.0f} rpm)"
                                                                 if sp else ""), loc="left")
    ax.legend(loc="upper left", bbox_to_anchor=(1.0, 1.0), fontsize=7)
    return Figure("shaft_modes", "Mode shapes of the first critical speeds (Timoshenko beam with the part masses and "
                  "inertias, shaft at rest)", fig)


_FACTORS = (("kt_bending", "bending: σ1 / σnominal"), ("kts", "torsion: σ1 / τnominal"),
            ("kt_axial", "tension: σ1 / σnominal"))


def feature_stress_figure(res, f: Fmt) -> Figure | None:
    """Per solved shoulder or groove, the largest principal stress over its nominal along the fillet or
    groove-bottom arc (from the meridian-section FE), on the feature's outline; the peak marked."""
    feats = [r for r in (res.get("shaft") or {}).get("features") or []
             if not r.get("skipped") and any(f"{key}_map" in r for key, _ in _FACTORS)]
    if not feats:
        return None
    k = from_si(1.0, "length", f.s)
    # tension only where a station carries an axial force (its factor is in the table either way)
    axial = any(abs(st.get("N") or 0.0) > 0.0 for st in res.get("section_loads", []))
    keys = [(key, lab) for key, lab in _FACTORS if any(f"{key}_map" in r for r in feats)
            and (axial or key != "kt_axial")]
    fig, axes = plt.subplots(len(feats), len(keys), figsize=(2.9 * len(keys) + 0.6, 2.7 * len(feats)), squeeze=False)
    fig.subplots_adjust(hspace=0.65, wspace=0.6)
    cmap = colormaps[CMAP]
    for row, r in zip(axes, feats):
        for ax, (key, lab) in zip(row, keys):
            m = r.get(f"{key}_map")
            if not m:
                ax.axis("off")
                continue
            zz, rr = np.asarray(m["at"]) * k, np.asarray(m["r"]) * k
            v = np.asarray(m["s1_per_nominal"], float)
            lc = ax.scatter(zz, rr, c=v, s=9, cmap=cmap, edgecolors="none", zorder=3)
            pk = r.get(f"{key}_peak") or {}
            if pk.get("at") is not None:
                ax.plot(pk["at"] * k, pk["r"] * k, marker="o", ms=5, mfc="white", mec=INK, zorder=5)
            cb = fig.colorbar(lc, ax=ax, shrink=0.85, pad=0.03)
            cb.set_label(f"{lab} [1]", fontsize=7)
            cb.outline.set_linewidth(0.4)
            ax.set_aspect("equal", adjustable="datalim")
            ax.margins(0.25)
            ax.set_xlabel(f"z [{f.s.label('length')}]")
            ax.set_ylabel(f"r [{f.s.label('length')}]")
            ax.tick_params(labelsize=6.5)
            ax.xaxis.set_major_locator(MaxNLocator(3))
            ax.yaxis.set_major_locator(MaxNLocator(3, prune="lower"))  # clear of the first z label
            name = {"kt_bending": "Kt", "kts": "Kts", "kt_axial": "Kt axial"}[key]
            ax.set_title(f"{r['kind']} at {f.q(r['at'], 'length', 4)}\n{name} = {r[key]:.3f} (circle: peak)",
                         fontsize=7.5)
    return Figure("feature_stress", "Stress along each shoulder fillet and groove bottom (meridian-section FE), over "
                  "the nominal stress of each load; the circle marks the peak", fig)


def layout_figures(a, res, system) -> list[Figure]:
    """Every figure of the layout report, in its order (each drawn once)."""
    f = Fmt(system)
    with plt.rc_context(STYLE):
        figs = [layout_drawing(a, res, f), diagrams_figure(res, f), modes_figure(res, a, f),
                feature_stress_figure(res, f)]
    return [x for x in figs if x is not None]

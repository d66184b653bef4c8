"""The report's figures, drawn with matplotlib (Agg) in the case's units: each one as SVG text and
PNG bytes. One perceptually uniform colour map (:data:`CMAP`) for every field, labelled colour bars,
axis labels with units, equal aspect on every section plot, a sober style readable in grey."""
from __future__ import annotations

import io
import math

import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402
from matplotlib.colors import to_rgba  # noqa: E402
from matplotlib.ticker import FixedLocator, FuncFormatter, LogLocator, NullLocator  # noqa: E402
from matplotlib.transforms import Bbox  # noqa: E402
from matplotlib.tri import LinearTriInterpolator, Triangulation  # noqa: E402
from skfem import Basis, ElementTriP2  # noqa: E402

from fem.export import nodal_gradient  # noqa: E402

from ..case.units import from_si  # noqa: E402
from .report import ROUND_OFF, Fmt  # noqa: E402

#: the one colour map of every field plot: perceptually uniform, readable in grey
CMAP = "cividis"
INK, GRID, MARK = "#1a1a1a", "#c8c8c8", "#d62728"

STYLE = {
    "font.family": "DejaVu Sans", "font.size": 8.5, "axes.titlesize": 9.5, "axes.labelsize": 8.5,
    "axes.edgecolor": INK, "axes.linewidth": 0.6, "axes.spines.top": False, "axes.spines.right": False,
    "xtick.color": INK, "ytick.color": INK, "xtick.major.width": 0.6, "ytick.major.width": 0.6,
    "axes.grid": False, "grid.color": GRID, "grid.linewidth": 0.4, "lines.linewidth": 1.0,
    "figure.dpi": 110, "savefig.dpi": 160, "svg.fonttype": "none", "svg.hashsalt": "shaftcheck",
    "legend.frameon": False, "legend.fontsize": 7.5,
    # titles at the top of their axes, set once: matplotlib's automatic placement measures every y axis's
    # tick labels on each drawing to move a title clear of top ticks, and no figure here has any on top
    "axes.titley": 1.0,
}

#: room [in] added around a figure before it is drawn (every axes kept where it was, in inches), so that
#: a label or legend reaching past the figure's edge is still on the one raster drawing
MARGIN = 0.5


class Figure:
    """One drawn figure: ``name`` (file stem), ``title`` (caption), ``svg`` (text), ``png`` (bytes)."""

    def __init__(self, name: str, title: str, fig):
        self.name, self.title = name, title
        # one raster draw for the PNG and the layout: the figure, with a margin, is drawn once at the
        # PNG's resolution; the box of what it drew (its ink, padded) is handed to the SVG's save, and
        # the PNG is the drawn pixels inside the box (when the drawing reaches the canvas's edge, the
        # artists' tight box decides, and a box past the canvas has the PNG drawn afresh)
        dpi = matplotlib.rcParams["savefig.dpi"]
        fig.dpi = dpi
        _add_margin(fig, MARGIN)
        outside = _draw_watching_texts(fig)
        pad = matplotlib.rcParams["savefig.pad_inches"]
        box = (None if outside else _drawn_box(fig, dpi, pad)) or fig.get_tightbbox(fig.canvas.get_renderer()).padded(pad)
        self.box = box  # [in], on the figure with its margin
        self.png = _png_inside(fig, box, dpi)
        buf = io.BytesIO()
        fig.savefig(buf, format="svg", bbox_inches=box, metadata={"Date": None})
        self.svg = buf.getvalue().decode("utf-8")
        plt.close(fig)


def _add_margin(fig, m: float) -> None:
    """Enlarge ``fig`` by ``m`` inches on every side, every axes keeping its place and size in inches
    (the tight box then cuts the same picture, moved by ``m``)."""
    w, h = fig.get_size_inches()
    W, H = w + 2 * m, h + 2 * m
    for ax in fig.axes:
        p = ax.get_position(original=True)
        ax.set_position([(m + p.x0 * w) / W, (m + p.y0 * h) / H, p.width * w / W, p.height * h / H])
    fig.set_size_inches(W, H)


def _draw_watching_texts(fig) -> int:
    """Draw ``fig`` on its raster canvas; the number of texts placed off the canvas (their anchor
    outside it: a text wholly outside leaves no pixel to find)."""
    renderer = fig.canvas.get_renderer()  # the one the drawing uses (same size and resolution)
    draw_text, off = renderer.draw_text, []

    def watched(gc, x, y, s, *args, **kwargs):
        if not (0 <= x <= renderer.width and 0 <= y <= renderer.height):
            off.append(s)
        return draw_text(gc, x, y, s, *args, **kwargs)

    renderer.draw_text = watched
    try:
        fig.canvas.draw()
    finally:
        del renderer.draw_text
    return len(off)


def _drawn_box(fig, dpi: float, pad: float):
    """The box [in] of what the last raster drawing of ``fig`` put on its face (every pixel not of the
    face's colour), padded by ``pad``; None when nothing is drawn or the drawing reaches the edge (a part
    may lie outside: then the tight box of the artists decides)."""
    rgba = np.asarray(fig.canvas.buffer_rgba())
    face = np.round(np.asarray(to_rgba(fig.get_facecolor())) * 255).astype(np.uint8)
    ink = rgba.view(np.uint32)[..., 0] != face.view(np.uint32)[0]
    rows, cols = np.flatnonzero(ink.any(axis=1)), np.flatnonzero(ink.any(axis=0))
    if not rows.size or rows[0] == 0 or cols[0] == 0 or rows[-1] == ink.shape[0] - 1 or cols[-1] == ink.shape[1] - 1:
        return None
    n = ink.shape[0]
    return Bbox([[cols[0] / dpi, (n - rows[-1] - 1) / dpi], [(cols[-1] + 1) / dpi, (n - rows[0]) / dpi]]).padded(pad)


def _png_inside(fig, box, dpi: float) -> bytes:
    """PNG bytes of the part of ``fig``'s last raster drawing inside ``box`` (inches), as
    ``savefig(bbox_inches=box)`` would give it up to sub-pixel placement; when the box reaches past
    the figure (an artist drawn outside it), the figure is saved with the box instead."""
    from PIL import Image  # noqa: PLC0415  lazy import of a slow dependency (Pillow, with matplotlib)

    rgba = np.asarray(fig.canvas.buffer_rgba())
    rows, cols = rgba.shape[:2]
    # savefig's size: the box's width and height in pixels, truncated; placed on the nearest pixel
    x0, y0 = int(round(box.x0 * dpi)), int(round(box.y0 * dpi))
    x1, y1 = x0 + int(box.width * dpi), y0 + int(box.height * dpi)
    buf = io.BytesIO()
    if x0 < 0 or y0 < 0 or x1 > cols or y1 > rows:
        fig.savefig(buf, format="png", bbox_inches=box, metadata={"Software": None})
        return buf.getvalue()
    cut = rgba[rows - y1:rows - y0, x0:x1]
    if cut[..., 3].min() == 255:  # opaque (the figure's face is): RGB, a quarter less to compress
        cut = cut[..., :3]
    # zlib's fastest level: measured on the gear-seat demo's eight figures, 0.21 → 0.11 CPU s and
    # 1071 → 950 kB together with RGB (the drawn pictures compress about as well at either level)
    Image.fromarray(np.ascontiguousarray(cut)).save(buf, format="png", dpi=(dpi, dpi), compress_level=1)
    return buf.getvalue()


class Geometry:
    """The final mesh in the case's length unit: P2 nodes, sub-triangles for plots, boundary lines."""

    def __init__(self, a, f: Fmt):
        sm = a.mesh
        self.k = from_si(1.0, "length", f.s)
        m = sm.mesh
        t = Basis(m, ElementTriP2()).element_dofs  # vertices, then the edges (0,1), (1,2), (0,2)
        self.xy = np.asarray(m.doflocs) * self.k
        v0, v1, v2, e01, e12, e02 = t
        sub = np.hstack([np.vstack(s) for s in ((v0, e01, e02), (e01, v1, e12), (e02, e12, v2), (e01, e12, e02))])
        self.tri = Triangulation(self.xy[0], self.xy[1], sub.T)
        self.edges = Triangulation(self.xy[0], self.xy[1], np.asarray(t[:3]).T)
        fac = np.asarray(sm.boundary_facets)
        f2t = m.f2t[0, fac]
        lines = []
        for fct, el in zip(fac, f2t):
            a_, b_ = m.facets[:, fct]
            dofs = t[:, el]
            local = {int(v): i for i, v in enumerate(dofs[:3])}
            ia, ib = local[int(a_)], local[int(b_)]
            mid = {frozenset((0, 1)): 3, frozenset((1, 2)): 4, frozenset((0, 2)): 5}[frozenset((ia, ib))]
            pts = self.xy[:, [dofs[ia], dofs[mid], dofs[ib]]]
            s = np.linspace(0, 1, 7)  # the quadratic through the three nodes: the curved edge
            w = np.vstack([(1 - s) * (1 - 2 * s), 4 * s * (1 - s), s * (2 * s - 1)])
            lines.append(pts @ w)
        self.boundary = lines
        self.unit = f.s.label("length")

    def outline(self, ax, lw=0.9, color=INK):
        nan = np.full((2, 1), np.nan)  # one line, broken between facets: one path in the SVG
        xy = np.hstack([np.hstack([ln, nan]) for ln in self.boundary])
        ax.plot(xy[0], xy[1], color=color, lw=lw, solid_capstyle="round")

    def frame(self, ax):
        ax.set_aspect("equal")
        ax.set_xlabel(f"x [{self.unit}]")
        ax.set_ylabel(f"y [{self.unit}]")


def _field(ax, g: Geometry, values, label: str, fig, levels=14):
    v = np.asarray(values, float)
    cs_ = ax.tricontourf(g.tri, v, levels=levels, cmap=CMAP)
    cs_.set_rasterized(True)  # thousands of small patches: a raster inside the SVG keeps the file small
    g.outline(ax)
    cb = fig.colorbar(cs_, ax=ax, shrink=0.85, pad=0.02)
    cb.set_label(label)
    cb.outline.set_linewidth(0.4)
    g.frame(ax)
    return cs_


def _peak(ax, xy, text, g: Geometry):
    ax.plot(xy[0] * g.k, xy[1] * g.k, marker="o", ms=6, mfc="white", mec=INK, mew=1.2, zorder=5)
    ax.annotate(text, (xy[0] * g.k, xy[1] * g.k), xytext=(10, 10), textcoords="offset points", fontsize=8,
                color=INK, arrowprops={"arrowstyle": "-", "color": INK, "lw": 0.6},
                bbox={"boxstyle": "round,pad=0.2", "fc": "white", "ec": INK, "lw": 0.5})


def section_figure(a, res, g: Geometry, f: Fmt) -> Figure:
    fig, ax = plt.subplots(figsize=(5.2, 4.6))
    ax.tripcolor(g.edges, facecolors=np.ones(g.edges.triangles.shape[0]), cmap="Greys", vmin=0, vmax=6,
                 rasterized=True)
    g.outline(ax, lw=1.1)
    x0, x1 = g.xy[0].min(), g.xy[0].max()
    y0, y1 = g.xy[1].min(), g.xy[1].max()
    span = max(x1 - x0, y1 - y0)
    u = g.unit

    def dim(p, q, off, text, vertical=False):
        if vertical:
            xs = p[0] + off
            ax.annotate("", (xs, p[1]), (xs, q[1]), arrowprops={"arrowstyle": "<|-|>", "lw": 0.6, "color": INK})
            ax.plot([p[0], xs], [p[1], p[1]], color=GRID, lw=0.5)
            ax.plot([q[0], xs], [q[1], q[1]], color=GRID, lw=0.5)
            ax.text(xs + 0.015 * span, (p[1] + q[1]) / 2, text, rotation=90, va="center", ha="left", fontsize=8)
        else:
            ys = p[1] + off
            ax.annotate("", (p[0], ys), (q[0], ys), arrowprops={"arrowstyle": "<|-|>", "lw": 0.6, "color": INK})
            ax.plot([p[0], p[0]], [p[1], ys], color=GRID, lw=0.5)
            ax.plot([q[0], q[0]], [q[1], ys], color=GRID, lw=0.5)
            ax.text((p[0] + q[0]) / 2, ys - 0.03 * span, text, ha="center", va="top", fontsize=8)

    dim((x0, y0), (x1, y0), -0.12 * span, f"{_n(x1 - x0)} {u}" + (" (diameter)" if a.case.section.diameter else ""))
    dim((x1, y0), (x1, y1), 0.1 * span, f"{_n(y1 - y0)} {u}", vertical=True)
    sec = a.case.section
    nk = len(getattr(sec, "keyways", ()) or ())
    lims = [(x0 - 0.12 * span, y0 - (0.3 + 0.06 * nk) * span), (x1 + 0.3 * span, y1 + 0.12 * span)]
    for i, kw in enumerate(getattr(sec, "keyways", ()) or ()):
        dt = sec.diameter - kw.depth  # the key standards' d − t1: keyway bottom to the opposite side
        ax.text(0.02, 0.02 + 0.055 * (i + bool(sec.bore)), f"keyway {i + 1}: width b {_n(kw.width * g.k)} {u}, depth t {_n(kw.depth * g.k)} {u}, "
                f"d − t {_n(dt * g.k)} {u}, bottom radius {_n(kw.fillet * g.k)} {u}", transform=ax.transAxes,
                fontsize=7.5, va="bottom")
        if i == 0 and sec.diameter:
            lims += keyway_dimensions(ax, sec, kw, g.k, span, u)
    if sec.bore:
        ax.text(0.02, 0.02, f"bore {_n(sec.bore * g.k)} {u}", transform=ax.transAxes, fontsize=7.5)
    c = res["section"]["centroid"]
    size = res["section"]["area"] ** 0.5
    c = [0.0 if abs(v) < ROUND_OFF * size else v for v in c]
    ax.plot(c[0] * g.k, c[1] * g.k, marker="+", ms=10, color=INK, mew=1.0)
    ax.annotate("centroid", (c[0] * g.k, c[1] * g.k), xytext=(6, -12), textcoords="offset points", fontsize=7.5)
    ax.set_xlim(min(p[0] for p in lims), max(p[0] for p in lims))
    ax.set_ylim(min(p[1] for p in lims), max(p[1] for p in lims))
    g.frame(ax)
    return Figure("section", "Section and its dimensions", fig)


def keyway_dimensions(ax, sec, kw, k: float, span: float, u: str) -> list:
    """A keyway dimensioned as the key standards tabulate it: the width b across the keyway at the
    surface, and d − t from the keyway bottom (on its centre line) to the opposite side of the shaft,
    measured along the centre line. Returns the points the dimensions reach (for the axis limits)."""
    ox, oy = sec.origin[0] * k, sec.origin[1] * k
    R, t, b = sec.diameter / 2 * k, kw.depth * k, kw.width * k
    th = math.radians(kw.angle)
    ux, uy, nx, ny = math.cos(th), math.sin(th), -math.sin(th), math.cos(th)
    arrow = {"arrowstyle": "<|-|>", "lw": 0.6, "color": INK, "shrinkA": 0, "shrinkB": 0}
    # d − t: extension lines along the keyway bottom and the tangent at the opposite side, out to `off`
    off = R + 0.12 * span
    P = (ox + (R - t) * ux, oy + (R - t) * uy)
    Q = (ox - R * ux, oy - R * uy)
    P2, Q2 = (P[0] + off * nx, P[1] + off * ny), (Q[0] + off * nx, Q[1] + off * ny)
    for a_, b_ in ((P, P2), (Q, Q2)):
        ax.plot([a_[0], b_[0] + 0.02 * span * nx], [a_[1], b_[1] + 0.02 * span * ny], color=GRID, lw=0.5)
    ax.annotate("", P2, Q2, arrowprops=arrow)
    rot = math.degrees(th)
    rot = rot - 180 if rot > 90 else rot + 180 if rot <= -90 else rot
    mid = ((P2[0] + Q2[0]) / 2 + 0.05 * span * nx, (P2[1] + Q2[1]) / 2 + 0.05 * span * ny)
    ax.text(*mid, f"d − t = {_n(2 * R - t)} {u}", rotation=rot, rotation_mode="anchor", ha="center", va="center",
            fontsize=8, bbox={"boxstyle": "square,pad=0.1", "fc": "white", "ec": "none"})
    # b: across the keyway, outside the surface
    h = R + 0.1 * span
    w = math.sqrt(max(R * R - (b / 2) ** 2, 0.0))
    A = (ox + w * ux + b / 2 * nx, oy + w * uy + b / 2 * ny)
    B = (ox + w * ux - b / 2 * nx, oy + w * uy - b / 2 * ny)
    A2, B2 = (ox + h * ux + b / 2 * nx, oy + h * uy + b / 2 * ny), (ox + h * ux - b / 2 * nx, oy + h * uy - b / 2 * ny)
    for a_, b_ in ((A, A2), (B, B2)):
        ax.plot([a_[0], b_[0] + 0.02 * span * ux], [a_[1], b_[1] + 0.02 * span * uy], color=GRID, lw=0.5)
    ax.annotate("", A2, B2, arrowprops=arrow)
    lab = (ox + (h + 0.045 * span) * ux, oy + (h + 0.045 * span) * uy)
    ax.text(*lab, f"b = {_n(b)} {u}", rotation=rot - 90 if rot > 0 else rot + 90, rotation_mode="anchor",
            ha="center", va="center", fontsize=8)
    pad = 0.08 * span
    return [(p[0] - pad, p[1] - pad) for p in (P2, Q2, A2, B2, lab, mid)] + \
        [(p[0] + pad, p[1] + pad) for p in (P2, Q2, A2, B2, lab, mid)]


def mesh_figure(a, res, g: Geometry) -> Figure:
    fig, (ax1, ax2) = plt.subplots(1, 2, figsize=(8.6, 4.0))
    for ax in (ax1, ax2):
        for ln in ax.triplot(g.edges, color="#555555", lw=0.25):
            ln.set_rasterized(True)
        g.outline(ax, lw=0.8)
        g.frame(ax)
    peak = np.asarray(res["torsion"]["tau_max_at"]) * g.k
    span = max(np.ptp(g.xy[0]), np.ptp(g.xy[1]))
    h = 0.08 * span
    ax2.set_xlim(peak[0] - h, peak[0] + h)
    ax2.set_ylim(peak[1] - h, peak[1] + h)
    ax2.plot(*peak, marker="o", ms=6, mfc="none", mec=MARK, mew=1.2)
    ax1.add_patch(plt.Rectangle((peak[0] - h, peak[1] - h), 2 * h, 2 * h, fill=False, ec=MARK, lw=0.8))
    ax1.set_title(f"whole section: {res['mesh']['elements']} curved 6-node triangles, {res['mesh']['dofs']} unknowns")
    ax2.set_title("zoomed on the torsion peak (circle)")
    return Figure("mesh", "Mesh, whole and zoomed on the peak", fig)


def torsion_figure(a, res, g: Geometry, f: Fmt, fields: dict) -> Figure:
    from_s = from_si(1.0, "stress", f.s)
    tr = a.torsion
    T = abs(a.torque) or 1.0
    grad = fields["phi_gradient"] if "phi_gradient" in fields else nodal_gradient(tr.basis, tr.phi)
    tx, ty = T * grad[1] / tr.J, -T * grad[0] / tr.J
    mag = np.hypot(tx, ty) * from_s
    fig, ax = plt.subplots(figsize=(6.0, 4.8))
    unit = f.s.label("stress") + ("" if a.torque else f" per {f.s.label('moment')}")
    _field(ax, g, mag, f"torsion shear stress |τ| [{unit}]", fig)
    # direction arrows of equal length on a regular grid (the colour gives the size)
    span = max(np.ptp(g.xy[0]), np.ptp(g.xy[1]))
    gx, gy = np.meshgrid(np.linspace(g.xy[0].min(), g.xy[0].max(), 15), np.linspace(g.xy[1].min(), g.xy[1].max(), 15))
    ux = LinearTriInterpolator(g.tri, tx)(gx, gy)
    uy = LinearTriInterpolator(g.tri, ty)(gx, gy)
    ok = ~np.ma.getmaskarray(ux) & (np.hypot(ux.filled(0), uy.filled(0)) > 0.05 * np.max(np.hypot(tx, ty)))
    ux, uy = ux.filled(0)[ok], uy.filled(0)[ok]
    ln = 0.045 * span / np.hypot(ux, uy)
    ax.quiver(gx[ok], gy[ok], ux * ln, uy * ln, angles="xy", scale_units="xy", scale=1, color="white", pivot="mid",
              width=0.005, headwidth=3.5, headlength=3.5, edgecolor=INK, linewidth=0.4)
    away = " (away from sharp corners)" if res["torsion"].get("singular_corners") else ""
    _peak(ax, res["torsion"]["tau_max_at"], f"τmax{away} {f.q(res['torsion']['tau_max'], 'stress', 4)}", g)
    ax.set_title("torsion: shear-stress magnitude, directions and peak")
    return Figure("torsion_stress", "Torsion shear-stress magnitude with directions and the peak", fig)


def stress_function_figure(a, g: Geometry, f: Fmt) -> Figure:
    phi = np.asarray(a.torsion.phi) * from_si(1.0, "area", f.s)
    fig, ax = plt.subplots(figsize=(6.0, 4.8))
    _field(ax, g, phi, f"Prandtl stress function φ (for Gθ = 1) [{f.s.label('area')}]", fig)
    ax.tricontour(g.tri, phi, levels=14, colors=INK, linewidths=0.45)
    ax.set_title("stress-function contours (the shear flows along them)")
    return Figure("stress_function", "Prandtl stress-function contours", fig)


def shear_figure(a, res, g: Geometry, f: Fmt, fields: dict) -> Figure | None:
    if "shear_tau" not in fields or "centre" not in res.get("shear", {}):
        return None
    per_n = fields["shear_per_newton"]
    v = np.asarray(fields["shear_tau"]) * from_si(1.0, "stress", f.s)
    if per_n:
        v = v / from_si(1.0, "force", f.s)
    fig, ax = plt.subplots(figsize=(6.0, 4.8))
    unit = f.s.label("stress") + (f" per {f.s.label('force')} of Vy" if per_n else "")
    _field(ax, g, v, f"transverse-shear stress |τ| [{unit}]", fig)
    sc, cg = res["shear"]["centre"], res["section"]["centroid"]
    size = res["section"]["area"] ** 0.5
    sc = [0.0 if abs(x) < ROUND_OFF * size else x for x in sc]
    cg = [0.0 if abs(x) < ROUND_OFF * size else x for x in cg]
    ax.plot(sc[0] * g.k, sc[1] * g.k, marker="s", ms=6, mfc="white", mec=INK, mew=1.1, ls="none", label="shear centre")
    ax.plot(cg[0] * g.k, cg[1] * g.k, marker="+", ms=10, color="white", mew=1.6, ls="none")
    ax.plot(cg[0] * g.k, cg[1] * g.k, marker="+", ms=9, color=INK, mew=0.8, ls="none", label="centroid")
    ax.legend(loc="upper left", bbox_to_anchor=(0.0, -0.12), ncol=2)
    what = "a unit force Vy through the shear centre" if per_n else "the case's shear force through the shear centre"
    ax.set_title(f"transverse shear: {what}")
    return Figure("shear_stress", "Transverse-shear stress with the shear centre and centroid", fig)


#: Critical points closer than this fraction of the section's size √A are one place for the reader
#: (0.03 mm on a 30 mm shaft: the read points of one fillet's peak, a few micrometres apart).
SAME_PLACE = 1e-3


def critical_points(res) -> list[dict]:
    """The critical points of ``combined.points`` merged by place and numbered: points that coincide
    (within :data:`SAME_PLACE` of the section's size) are one point, critical for all their criteria
    together. Each criterion's worst instant can differ; the merged point shows the state with the
    largest von Mises stress among them (``states`` keeps every criterion's own)."""
    size = math.sqrt(max((res.get("section") or {}).get("area") or 0.0, 0.0))
    out: list[dict] = []
    for p in (res.get("combined") or {}).get("points", []):
        here = next((q for q in out if math.hypot(q["at"][0] - p["at"][0], q["at"][1] - p["at"][1])
                     <= SAME_PLACE * size), None)
        if here is None:
            out.append({**p, "criteria": [p["criterion"]], "states": [p]})
            continue
        if p["criterion"] not in here["criteria"]:
            here["criteria"].append(p["criterion"])
        here["states"].append(p)
        if p["von_mises"] > here["von_mises"]:  # show the most severe state (and its exact place)
            here.update({k: v for k, v in p.items() if k != "criterion"})
    for i, p in enumerate(out, 1):
        p["number"] = i
    return out


def von_mises_figure(res, g: Geometry, f: Fmt, fields: dict, points: list) -> Figure | None:
    if "von_mises" not in fields:
        return None
    v = np.asarray(fields["von_mises"]) * from_si(1.0, "stress", f.s)
    fig, ax = plt.subplots(figsize=(6.0, 4.8))
    _field(ax, g, v, f"von Mises stress [{f.s.label('stress')}]", fig)
    span = max(np.ptp(g.xy[0]), np.ptp(g.xy[1]))
    placed: list = []
    for p in points:
        x, y = p["at"][0] * g.k, p["at"][1] * g.k
        # points at (nearly) one place get their numbers fanned out around it, joined by a leader
        near = sum(1 for q in placed if math.hypot(q[0] - x, q[1] - y) < 0.04 * span)
        placed.append((x, y))
        ang = math.radians(120 - 40 * near)
        ax.plot(x, y, marker="o", ms=3, color=MARK, zorder=5)
        ax.annotate(str(p["number"]), (x, y), xytext=(22 * math.cos(ang), 22 * math.sin(ang)),
                    textcoords="offset points", ha="center", va="center", fontsize=7, zorder=6,
                    bbox={"boxstyle": "circle,pad=0.2", "fc": "white", "ec": INK, "lw": 0.6},
                    arrowprops={"arrowstyle": "-", "color": INK, "lw": 0.5})
    ax.set_title("combined stress at the worst instant, critical points numbered")
    return Figure("von_mises", "Von Mises stress at the worst instant with the critical points", fig)


def fatigue_figure(res, g: Geometry, fields: dict) -> Figure | None:
    if "fatigue_factor" not in fields:
        return None
    n = np.asarray(fields["fatigue_factor"], float)
    lo = float(np.min(n[np.isfinite(n)]))
    top = 5.0 * lo  # the map shows the range that matters; larger factors share the top colour
    fig, ax = plt.subplots(figsize=(6.0, 4.8))
    _field(ax, g, np.minimum(n, top), f"fatigue factor of safety, FE path [1] (≥ {top:.3g} shown as {top:.3g})", fig,
           levels=np.linspace(lo, top, 15))
    ax.set_title("fatigue factor of safety at every point (lowest of the DE criteria)")
    return Figure("fatigue_factor", "Fatigue factor of safety (FE path) at every point", fig)


def mohr_figures(points: list, f: Fmt) -> list[Figure]:
    """One figure, one panel per critical point (numbered as on the von Mises map)."""
    if not points:
        return []
    k = from_si(1.0, "stress", f.s)
    u = f.s.label("stress")
    ncol = 2
    nrow = math.ceil(len(points) / ncol)
    fig, axes = plt.subplots(nrow, ncol, figsize=(8.6, 3.7 * nrow), squeeze=False)
    fig.subplots_adjust(hspace=0.45, wspace=0.35)
    for ax in list(axes.flat)[len(points):]:
        ax.axis("off")
    for ax, p in zip(axes.flat, points):
        m = p["mohr"]
        th = np.linspace(0, 2 * math.pi, 361)
        styles = {"sigma1-sigma3": (INK, 1.1, "-"), "sigma1-sigma2": ("#666666", 0.7, "--"),
                  "sigma2-sigma3": ("#666666", 0.7, ":")}
        for c in m["circles"]:
            col, lw, ls = styles[c["between"]]
            ax.plot(k * (c["centre"] + c["radius"] * np.cos(th)), k * c["radius"] * np.sin(th), color=col, lw=lw, ls=ls)
        s, t = m["points"]["z_face"]
        s2, t2 = m["points"]["shear_direction_face"]
        ax.plot([k * s, k * s2], [k * t, k * t2], color="#888888", lw=0.6)
        ax.plot(k * s, k * t, "o", color=INK, ms=4)
        ax.annotate("z face (σ, τ)", (k * s, k * t), xytext=(6, 4), textcoords="offset points", fontsize=7.5)
        ax.plot(k * s2, k * t2, "o", mfc="white", mec=INK, ms=4)
        for name, val in (("σ1", p["sigma1"]), ("σ2", p["sigma2"]), ("σ3", p["sigma3"])):
            ax.plot(k * val, 0, "|", color=INK, ms=9)
            ax.annotate(f"{name} {f.q(val, 'stress', 4)}", (k * val, 0), xytext=(2, -14 if name != "σ2" else 8),
                        textcoords="offset points", fontsize=7, ha="center")
        c, r = k * m["centre"], k * m["radius"]
        ax.plot([c, c], [0, r], color="#888888", lw=0.6, ls="--")
        ax.plot([c, c], [0, -r], color="#888888", lw=0.6, ls="--")
        ax.annotate(f"τmax {f.q(m['radius'], 'stress', 4)}", (c, -0.6 * r), xytext=(4, 0), textcoords="offset points",
                    fontsize=7.5, va="center")
        ax.text(0.02, 0.02, f"2θ = {m['double_angle_deg']:.1f}°", transform=ax.transAxes, fontsize=8)
        ax.axhline(0, color=GRID, lw=0.5)
        ax.axvline(0, color=GRID, lw=0.5)
        ax.set_aspect("equal", adjustable="datalim")
        ax.set_xlabel(f"normal stress σ [{u}]")
        ax.set_ylabel(f"shear stress τ [{u}]")
        ax.set_title(f"point {p['number']}: {', '.join(p['criteria'])}", fontsize=8.5)
    return [Figure("mohr", "Mohr's circles of the critical points (z face, principal stresses, maximum shear, 2θ)",
                   fig)]


CONV_LABELS = {"J": "J", "tau_max": "torsion τmax", "shear_tau_max": "shear τmax", "shear_centre_x": "shear centre x",
               "shear_centre_y": "shear centre y", "kappa_x": "κx", "kappa_y": "κy"}


def convergence_figure(res) -> Figure | None:
    conv = {k: v for k, v in (res.get("convergence") or {}).items() if v.get("values")}
    if not conv:
        return None
    keys = list(conv)
    ncol = 3
    nrow = math.ceil(len(keys) / ncol)
    fig, axes = plt.subplots(nrow, ncol, figsize=(8.6, 2.6 * nrow), squeeze=False)
    fig.subplots_adjust(hspace=0.75, wspace=0.55)
    for ax, key in zip(axes.flat, keys):
        v = conv[key]
        d = np.asarray(v["dofs"], float)
        y = np.asarray(v["values"], float)
        ref = v.get("extrapolated")
        base = y[-1] if ref is None else ref
        scale = abs(base) if v.get("relative_to") == "value" and base else 1.0
        err = np.abs(y - base) / (scale or 1.0)
        ax.set_xscale("log")
        ax.set_yscale("log")
        floor = 1e-3 * max(min(float(np.min(err[err > 0])) if np.any(err > 0) else 1e-9, v.get("gci") or 1.0), 1e-15)
        ax.plot(d, np.maximum(err, floor), "o-", color=INK, ms=3.5, label="|value − extrapolated|" if ref is not None
                else "|value − finest|")
        if v.get("gci") is not None:
            ax.axhspan(floor, max(v["gci"], floor), color="#bdbdbd", alpha=0.5, lw=0, label="GCI band (finest)")
        ax.set_title(CONV_LABELS.get(key, key) + ("" if ref is None else f" → {ref:.7g} SI"), fontsize=8)
        ax.set_xlabel("unknowns (DOFs)")
        ax.set_ylabel("relative difference [1]" if v.get("relative_to") == "value" else "difference / √A [1]")
        ax.grid(True, which="major")
        # the x ticks are the meshes themselves (their unknowns); the decades of the y axis are written
        # with Unicode superscripts, which draws in a third of the time of mathtext's 10^x
        ax.xaxis.set_major_locator(FixedLocator(d))
        ax.xaxis.set_major_formatter(FuncFormatter(_count))
        ax.tick_params(axis="x", labelsize=7)
        ax.yaxis.set_major_locator(LogLocator(numticks=4))
        ax.yaxis.set_major_formatter(FuncFormatter(_decade))
        for axis in (ax.xaxis, ax.yaxis):
            axis.set_minor_locator(NullLocator())
    for ax in list(axes.flat)[len(keys):]:
        ax.axis("off")
    axes.flat[0].legend(loc="lower left", fontsize=6.5)
    return Figure("convergence", "Convergence of each quantity against the number of unknowns", fig)


_SUPERSCRIPT = str.maketrans("-0123456789", "\u207b\u2070\u00b9\u00b2\u00b3\u2074\u2075\u2076\u2077\u2078\u2079")


def _decade(v: float, _pos=None) -> str:
    """A tick label of a log axis: '10⁻⁶' at a power of ten, nothing elsewhere."""
    if not v > 0:
        return ""
    e = math.log10(v)
    return f"10{str(round(e)).translate(_SUPERSCRIPT)}" if abs(e - round(e)) < 1e-9 else ""


def _count(v: float, _pos=None) -> str:
    """A count of unknowns, thousands apart by a thin space: '12 400'."""
    return f"{v:,.0f}".replace(",", "\u2009")


def _n(v: float) -> str:
    return f"{v:.4g}"


def all_figures(a, res, fields: dict, only=None) -> list[Figure]:
    """Every figure of the report, in its order; with ``only`` (a set of figure names) just those (a
    layout report draws a few of each station's)."""
    f = Fmt(a.case.units)

    def want(name):
        return only is None or name in only

    with plt.rc_context(STYLE):
        g = Geometry(a, f)
        pts = critical_points(res)
        figs = [section_figure(a, res, g, f) if want("section") else None,
                mesh_figure(a, res, g) if want("mesh") else None,
                torsion_figure(a, res, g, f, fields) if want("torsion_stress") else None,
                stress_function_figure(a, g, f) if want("stress_function") else None,
                shear_figure(a, res, g, f, fields) if want("shear_stress") else None,
                von_mises_figure(res, g, f, fields, pts) if want("von_mises") else None,
                *(mohr_figures(pts, f) if want("mohr") else []),
                fatigue_figure(res, g, fields) if want("fatigue_factor") else None,
                convergence_figure(res) if want("convergence") else None]
    return [x for x in figs if x is not None]

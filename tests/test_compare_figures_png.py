"""compare/output/figures.py: the PNG cut from the figure's one raster drawing against the PNG that
``savefig(bbox_inches=box)`` draws afresh (the way it was made before: same size, same picture up to
the sub-pixel placement of the box)."""
from __future__ import annotations

import io
import re

import matplotlib
import numpy as np
import pytest

matplotlib.use("Agg")
import matplotlib.pyplot as plt  # noqa: E402
from PIL import Image  # noqa: E402

from matplotlib.transforms import Bbox  # noqa: E402

from compare.output.figures import MARGIN, STYLE, Figure, _draw_watching_texts, _drawn_box, _png_inside  # noqa: E402


def _pixels(png: bytes) -> np.ndarray:
    return np.asarray(Image.open(io.BytesIO(png)).convert("RGBA"), float)


def _figure(outside: bool):
    fig, ax = plt.subplots(figsize=(5.0, 4.0))
    x, y = np.meshgrid(np.linspace(0, 1, 40), np.linspace(0, 1, 30))
    im = ax.pcolormesh(x, y, np.sin(6 * x) * np.cos(4 * y), cmap="cividis", rasterized=True)
    fig.colorbar(im, ax=ax, label="value [1]")
    ax.set_xlabel("x [mm]")
    ax.set_ylabel("y [mm]")
    ax.set_title("a field")
    if outside:  # a legend below the axes, past the figure's edge
        ax.plot([0, 1], [0, 1], label="a line")
        ax.legend(loc="upper left", bbox_to_anchor=(0.0, -0.5))
    return fig


@pytest.mark.parametrize("outside", [False, True])
def test_png_cut_from_the_drawing_matches_a_fresh_save(outside):
    with plt.rc_context(STYLE):
        dpi = matplotlib.rcParams["savefig.dpi"]
        fig = _figure(outside)
        fig.dpi = dpi
        fig.canvas.draw()
        box = fig.get_tightbbox(fig.canvas.get_renderer()).padded(matplotlib.rcParams["savefig.pad_inches"])
        w, h = fig.get_size_inches()
        inside = box.x0 >= 0 and box.y0 >= 0 and box.x1 <= w and box.y1 <= h
        assert inside is not outside  # the case under test: cut from the drawing, or saved afresh
        cut = _pixels(_png_inside(fig, box, dpi))
        buf = io.BytesIO()
        fig.savefig(buf, format="png", bbox_inches=box)
        fresh = _pixels(buf.getvalue())
        plt.close(fig)
    assert cut.shape == fresh.shape  # savefig's size: the box in pixels, truncated
    diff = np.abs(cut - fresh).max(axis=2)
    # the same picture moved by less than a pixel: only anti-aliased edges differ (measured: 1-3 % of
    # the pixels of the report's figures by more than 32 of 255, mean difference below 2 of 255)
    assert float(np.mean(diff > 32)) < 0.05
    assert float(np.mean(diff)) < 4.0
    if outside:  # the box reaches past the figure: saved afresh, identical
        assert float(np.max(diff)) == 0.0


def _same_svg(svg: str) -> str:
    """SVG text without what depends on the place on the canvas only: the clip paths' hashed ids, and
    '-0' written for a coordinate rounded to zero."""
    return re.sub(r"(url\(#|id=\")p[0-9a-f]{10}", r"\1p", svg).replace("-0 ", "0 ")


@pytest.mark.parametrize("outside", [False, True])
def test_margin_moves_the_picture_and_changes_nothing_else(outside):
    """A figure drawn with :data:`MARGIN` around it (so that a legend past its edge is on the one
    drawing) gives the SVG of the figure without the margin saved with the same box moved by the
    margin, and its PNG within a sub-pixel shift of that figure's fresh save."""
    with plt.rc_context(STYLE):
        drawn = Figure("f", "a field", _figure(outside))
        fig = _figure(outside)
        box = Bbox(drawn.box.get_points() - MARGIN)
        w, h = fig.get_size_inches()
        assert (box.x0 >= 0 and box.y0 >= 0 and box.x1 <= w and box.y1 <= h) is not outside
        svg, png = io.StringIO(), io.BytesIO()
        fig.savefig(svg, format="svg", bbox_inches=box, metadata={"Date": None})
        fig.savefig(png, format="png", bbox_inches=box)
        plt.close(fig)
    assert _same_svg(drawn.svg) == _same_svg(svg.getvalue())
    cut, fresh = _pixels(drawn.png), _pixels(png.getvalue())
    assert cut.shape == fresh.shape
    diff = np.abs(cut - fresh).max(axis=2)
    assert float(np.mean(diff > 32)) < 0.05  # as above: anti-aliased edges moved by less than a pixel
    assert float(np.mean(diff)) < 4.0


def test_drawn_box_holds_all_that_is_drawn():
    """The box of the drawn pixels: everything outside it is the figure's face, and it lies within the
    artists' tight box (to a pixel); a drawing that reaches the canvas's edge has none, and a text
    wholly off the canvas is seen while drawing (it leaves no pixel)."""
    with plt.rc_context(STYLE):
        dpi = matplotlib.rcParams["savefig.dpi"]
        figs = [_figure(False), _figure(False), _figure(True)]
        figs[1].text(0.98, 0.5, "WWWWWWWW")  # placed inside, drawn past the edge
        figs[2].axes[0].get_legend().set_bbox_to_anchor((0.0, -2.0))  # wholly below the figure
        off = []
        for fig in figs:
            fig.dpi = dpi
            off.append(_draw_watching_texts(fig))
        box = _drawn_box(figs[0], dpi, 0.0)
        tight = figs[0].get_tightbbox(figs[0].canvas.get_renderer())
        rgba = np.asarray(figs[0].canvas.buffer_rgba())
        beyond = [_drawn_box(fig, dpi, 0.0) for fig in figs[1:]]
        for fig in figs:
            plt.close(fig)
    n = rgba.shape[0]
    r0, r1 = n - round(box.y1 * dpi), n - round(box.y0 * dpi)
    c0, c1 = round(box.x0 * dpi), round(box.x1 * dpi)
    outside = np.ones(rgba.shape[:2], bool)
    outside[r0:r1, c0:c1] = False
    assert np.all(rgba[outside] == 255)  # the white face
    assert np.any(rgba[r0, c0:c1] != 255) and np.any(rgba[r1 - 1, c0:c1] != 255)  # tight on the ink
    px = 1.0 / dpi
    assert tight.x0 - px <= box.x0 and tight.y0 - px <= box.y0
    assert box.x1 <= tight.x1 + px and box.y1 <= tight.y1 + px
    assert off[:2] == [0, 0] and beyond[0] is None  # cut by the edge: seen on the pixels
    assert off[2] == 1 and beyond[1] is not None  # the legend's text wholly outside: not on the pixels


def test_titles_where_automatic_placement_puts_them():
    """STYLE sets each title's height once (``axes.titley``); with no tick labels on top, matplotlib's
    automatic placement (measured on every drawing) puts it at the same place."""
    boxes = []
    for titley in (STYLE["axes.titley"], None):
        with plt.rc_context({**STYLE, "axes.titley": titley}):
            fig = _figure(outside=True)
            fig.canvas.draw()
            boxes.append(fig.axes[0].title.get_window_extent(fig.canvas.get_renderer()).bounds)
            plt.close(fig)
    assert boxes[0] == boxes[1]

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

from compare.output.figures import STYLE, Figure, _png_inside  # noqa: E402


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
    drawing) gives the SVG of the figure without the margin saved with its own tight box, and its
    PNG within a sub-pixel shift of that figure's fresh save."""
    with plt.rc_context(STYLE):
        dpi = matplotlib.rcParams["savefig.dpi"]
        drawn = Figure("f", "a field", _figure(outside))
        fig = _figure(outside)
        fig.dpi = dpi
        fig.canvas.draw()
        box = fig.get_tightbbox(fig.canvas.get_renderer()).padded(matplotlib.rcParams["savefig.pad_inches"])
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

"""Key tables: the right row on both sides of every range edge, metric and inch; refusals outside.

Sources: metric parallel keys per ISO/R773 (1969) and DIN 6885-1 (1968-08), Table 1 — shafts over 17
up to 22 mm: 6 x 6, t1 3.5; 22-30: 8 x 7, t1 4.0; 30-38: 10 x 8, t1 5.0; 38-44: 12 x 8, t1 5.0;
44-50: 14 x 9, t1 5.5; 50-58: 16 x 10, t1 6.0; bottom radius 0.16-0.25 mm up to 30 mm, 0.25-0.40 mm
for 30-58 mm. Inch square keys per ASME B17.1-1967 (R2003), Table 1 — 5/16-7/16 in: 3/32;
7/16-9/16: 1/8; 9/16-7/8: 3/16; 7/8-1 1/4: 1/4; 1 1/4-1 3/8: 5/16; 1 3/8-1 3/4: 3/8; 1 3/4-2 1/4: 1/2.
Rows outside these ranges are in the data files marked from memory and are not held to a source here.
"""
import math

import pytest

from classic._validity import OutOfRangeError
from classic.keys import chordal_height, inch_square_key, metric_parallel_key

MM, IN = 1e-3, 0.0254

# (edge [mm], (b, t1, r_min, r_max) at and below the edge, (b, t1, r_min, r_max) just above it)
METRIC_EDGES = [
    (22, (6, 3.5, 0.16, 0.25), (8, 4.0, 0.16, 0.25)),
    (30, (8, 4.0, 0.16, 0.25), (10, 5.0, 0.25, 0.40)),
    (38, (10, 5.0, 0.25, 0.40), (12, 5.0, 0.25, 0.40)),
    (44, (12, 5.0, 0.25, 0.40), (14, 5.5, 0.25, 0.40)),
    (50, (14, 5.5, 0.25, 0.40), (16, 6.0, 0.25, 0.40)),
]


@pytest.mark.parametrize("edge, below, above", METRIC_EDGES)
def test_metric_key_on_both_sides_of_each_range_edge(edge, below, above):
    # ISO/R773 and DIN 6885-1, Table 1: "over a up to and including b"
    for d, want in ((edge, below), (edge - 0.001, below), (edge + 0.001, above)):
        k = metric_parallel_key(d * MM)
        got = (k["width"] / MM, k["depth"] / MM, k["r_min"] / MM, k["r_max"] / MM)
        assert got == pytest.approx(want, rel=1e-12), d
        assert k["from_memory"] is False


def test_metric_first_and_last_confirmed_rows():
    # ISO/R773, DIN 6885-1: 17.001 mm takes 6 x 6 (over 17), 58 mm takes 16 x 10, t1 6.0
    assert metric_parallel_key(17.001 * MM)["width"] == pytest.approx(6 * MM)
    k = metric_parallel_key(58 * MM)
    assert (k["width"], k["height"], k["depth"]) == pytest.approx((16 * MM, 10 * MM, 6 * MM))
    assert metric_parallel_key(58.001 * MM)["from_memory"] is True  # 18 x 11: from memory of the table


INCH_EDGES = [  # (edge [in], key at and below, key just above) — ASME B17.1, Table 1
    (7 / 16, 3 / 32, 1 / 8), (9 / 16, 1 / 8, 3 / 16), (7 / 8, 3 / 16, 1 / 4), (1.25, 1 / 4, 5 / 16),
    (1.375, 5 / 16, 3 / 8), (1.75, 3 / 8, 1 / 2),
]


@pytest.mark.parametrize("edge, below, above", INCH_EDGES)
def test_inch_key_on_both_sides_of_each_range_edge(edge, below, above):
    for d, want in ((edge, below), (edge - 1e-4, below), (edge + 1e-4, above)):
        k = inch_square_key(d * IN)
        assert k["width"] == pytest.approx(want * IN, rel=1e-12), d
        assert k["depth_at_side"] == pytest.approx(want * IN / 2, rel=1e-12)  # square key: half the key
        assert k["from_memory"] is False


def test_inch_centre_line_depth_adds_the_chordal_height():
    # ASME B17.1: depth at the keyseat side H/2; on the centre line H/2 + Y, Y = (D - sqrt(D² - W²))/2
    # (plane geometry of the circular segment; the standard's convention from memory)
    k = inch_square_key(1.0 * IN)
    y = {"fem": k["chordal_height"] / IN, "exact": (1 - math.sqrt(1 - 0.25**2)) / 2}
    assert y["fem"] == pytest.approx(y["exact"], rel=1e-12)
    assert k["depth"] / IN == pytest.approx(0.125 + y["exact"], rel=1e-12)
    assert inch_square_key(2.25 * IN)["width"] == pytest.approx(0.5 * IN)  # last confirmed row
    assert inch_square_key(2.2501 * IN)["from_memory"] is True


@pytest.mark.parametrize("d", [6 * MM, 5 * MM, 130.001 * MM, 0.5])
def test_metric_refused_outside_the_table(d):
    with pytest.raises(OutOfRangeError, match="outside the key table"):
        metric_parallel_key(d)


@pytest.mark.parametrize("d", [5 / 16 * IN, 0.1 * IN, 6.5001 * IN])
def test_inch_refused_outside_the_table(d):
    with pytest.raises(OutOfRangeError, match="outside the key table"):
        inch_square_key(d)


def test_bad_diameters_refused():
    for d in (0.0, -1.0, float("nan"), float("inf")):
        with pytest.raises(OutOfRangeError):
            metric_parallel_key(d)
    with pytest.raises(OutOfRangeError):
        chordal_height(0.01, 0.01)

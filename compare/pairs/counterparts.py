"""Which textbook formula describes a section, if any, and its values.

Round and keyed sections say what they are. A custom section is recognised when it is a single
primitive a formula exists for (a disk, an ellipse, a rectangle, an equilateral triangle) or such a
primitive with one concentric similar hole (tube, hollow ellipse).
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from classic import properties as cp
from classic import torsion as ct
from fem.geometry import Disk, Ellipse, Polygon, Section

ROUND_SOURCE = "elementary torsion of a round bar, any strength-of-materials text (exact)"
ROARD = "Roark's Formulas for Stress and Strain, 7th ed., Table 10.1"
SERIES = "Saint-Venant series for the rectangle, Timoshenko & Goodier, Theory of Elasticity, 3rd ed."


@dataclass
class Counterpart:
    """Hand-formula values for a recognised section (SI); ``peak_per_torque`` is τmax/T."""

    name: str
    J: float
    peak_per_torque: float
    source: str
    area: float | None = None
    Ixx: float | None = None
    Iyy: float | None = None
    exact: bool = True  # the formula is the exact elasticity solution


def recognise(section: Section) -> Counterpart | None:
    if section.kind == "round":
        d, b = section.diameter, section.bore
        if b:
            I = cp.tube_second_moment(d, b)
            return Counterpart("tube", ct.tube_torsion_constant(d, b), ct.tube_peak_shear(1.0, d, b),
                               ROUND_SOURCE, cp.tube_area(d, b), I, I)
        I = cp.round_second_moment(d)
        return Counterpart("solid round", ct.round_torsion_constant(d), ct.round_peak_shear(1.0, d),
                           ROUND_SOURCE, cp.round_area(d), I, I)
    if section.kind == "square" and not section.bore and not any(section.steps[0][1].fillets):
        w = float(np.ptp(np.asarray(section.steps[0][1].points)[:, 0]))  # sharp square: side = width
        return Counterpart("square drive (sharp)", ct.rectangle_torsion_constant(w, w), ct.rectangle_peak_shear(1.0, w, w),
                           SERIES, w * w)
    if section.kind != "custom":
        return None
    adds = [p for op, p in section.steps if op == "add"]
    cuts = [p for op, p in section.steps if op == "cut"]
    if len(adds) != 1 or len(cuts) > 1:
        return None
    p, hole = adds[0], (cuts[0] if cuts else None)
    if isinstance(p, Disk):
        if hole is None:
            return recognise(Section((), kind="round", diameter=2 * p.radius))
        if isinstance(hole, Disk) and np.allclose(hole.center, p.center, atol=1e-12 * p.radius) and hole.radius < p.radius:
            return recognise(Section((), kind="round", diameter=2 * p.radius, bore=2 * hole.radius))
        return None
    if isinstance(p, Ellipse):
        a, b = max(p.semi_axes), min(p.semi_axes)
        if hole is None:
            A = cp.ellipse_area(a, b)
            Ix, Iy = _rotated_moments(*_ellipse_moments(p), p.rotation)
            return Counterpart("ellipse", ct.ellipse_torsion_constant(a, b), ct.ellipse_peak_shear(1.0, a, b), ROARD, A, Ix, Iy)
        if isinstance(hole, Ellipse) and np.allclose(hole.center, p.center, atol=1e-12 * a):
            q = hole.semi_axes[0] / p.semi_axes[0]
            same = math.isclose(hole.semi_axes[1] / p.semi_axes[1], q, rel_tol=1e-9) and math.isclose(
                (hole.rotation - p.rotation) % 180.0, 0.0, abs_tol=1e-9)
            if same and 0 < q < 1:
                return Counterpart("hollow ellipse (similar, concentric)", ct.hollow_ellipse_torsion_constant(a, b, q),
                                   ct.hollow_ellipse_peak_shear(1.0, a, b, q), ROARD)
        return None
    if isinstance(p, Polygon) and hole is None and not any(p.fillets):
        pts = np.asarray(p.points)
        sides = np.linalg.norm(np.roll(pts, -1, axis=0) - pts, axis=1)
        if len(pts) == 3 and np.allclose(sides, sides[0], rtol=1e-9):
            a = float(sides[0])
            return Counterpart("equilateral triangle", ct.equilateral_triangle_torsion_constant(a),
                               ct.equilateral_triangle_peak_shear(1.0, a), ROARD)
        if len(pts) == 4 and _is_rectangle(pts):
            w, t = sorted(sides[:2], reverse=True)
            return Counterpart(f"rectangle {w / t:.3g}:1", ct.rectangle_torsion_constant(w, t),
                               ct.rectangle_peak_shear(1.0, w, t), SERIES, w * t)
    return None


def _ellipse_moments(p: Ellipse):
    a, b = p.semi_axes
    return cp.ellipse_second_moments(a, b)


def _rotated_moments(Ixx, Iyy, deg):
    c, s = math.cos(math.radians(deg)), math.sin(math.radians(deg))
    return Ixx * c * c + Iyy * s * s, Ixx * s * s + Iyy * c * c


def _is_rectangle(pts: np.ndarray) -> bool:
    e = np.roll(pts, -1, axis=0) - pts
    dots = [abs(float(e[i] @ e[(i + 1) % 4])) for i in range(4)]
    return max(dots) <= 1e-9 * float(np.max(np.sum(e * e, axis=1)))

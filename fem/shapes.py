"""Named shaft sections beyond round and keyed: flats (D-cut, double-D), square and hexagon drives,
and a cruciform drive socket (cross-slot). Each returns a :class:`~fem.geometry.Section` of boolean
steps on the primitives of :mod:`fem.geometry` (corner radii as exact arcs through the polygon
fillets), with its geometric checks: a refused value raises
:class:`~fem.errors.InputError` naming the case-file field.

Axis at the origin; SI lengths (metres); angles in degrees, 90 = top (+y), as for keyways.
``nominal_diameter`` is the d of the handbook nominals (16T/(πd³)): the round diameter for flats
and the cross-slot, the across-flats size for the drives (the largest round bar inside them).
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Sequence

import numpy as np

from .errors import InputError
from .geometry import SLIVER, Disk, Polygon, Section, _finite_angle, _positive, _rot, round_section


@dataclass(frozen=True)
class Flat:
    """A flat ground or milled on a round shaft: ``depth`` from the shaft surface on the flat's
    centre line; ``angle`` the direction of its outward normal (90 = top)."""

    depth: float
    angle: float = 90.0


def flatted_section(diameter: float, flats: Sequence[Flat], bore: float | None = None) -> Section:
    """Round shaft with one or more flats (a D-cut, a double-D at 180°), optionally bored."""
    base = round_section(diameter, bore)
    if not flats:
        raise InputError("section.flats", [], "a flatted section needs at least one flat")
    R = diameter / 2
    steps = list(base.steps)
    for i, f in enumerate(flats):
        name = f"section.flats[{i}]"
        _positive(f"{name}.depth", f.depth)
        _finite_angle(f"{name}.angle", f.angle)
        if f.depth < SLIVER * diameter:
            raise InputError(f"{name}.depth", f.depth, f"is a sliver, below {SLIVER:g} of the diameter "
                             f"({SLIVER * diameter:.3g} m): it cannot be meshed or trusted")
        if f.depth >= R:
            raise InputError(f"{name}.depth", f.depth, f"reaches the shaft axis or beyond (radius {R:g} m)")
        if bore and R - f.depth - bore / 2 < SLIVER * diameter:
            raise InputError(f"{name}.depth", f.depth, f"leaves no wall between the flat and the bore (flat at "
                             f"{R - f.depth:g} m from the axis, bore radius {bore / 2:g} m)")
        for j, g in enumerate(flats[:i]):
            if abs((f.angle - g.angle + 180.0) % 360.0 - 180.0) < 1e-9:
                raise InputError(f"{name}.angle", f.angle, f"is the angle of flat {j} too: two flats cannot share a place")
        # the cutter: everything beyond the flat's line, reaching well outside the shaft
        lo, hi = R - f.depth, 2.0 * R
        pts = np.array([[-1.5 * R, lo], [1.5 * R, lo], [1.5 * R, hi], [-1.5 * R, hi]])
        pts = (_rot(f.angle - 90.0) @ pts.T).T
        steps.append(("cut", Polygon(tuple(map(tuple, pts.tolist())))))
    return Section(tuple(steps), kind="flatted", diameter=diameter, bore=bore or None)


def _drive(kind: str, n: int, across_flats: float, corner_radius: float, bore: float | None,
           size_field: str) -> Section:
    _positive(f"section.{size_field}", across_flats)
    if corner_radius is None or not np.isfinite(corner_radius) or corner_radius < 0:
        raise InputError("section.corner_radius", corner_radius, "must be zero or a positive length")
    if corner_radius >= across_flats / 2:
        raise InputError("section.corner_radius", corner_radius,
                         f"is not smaller than half the size across flats ({across_flats / 2:g} m): nothing of the "
                         f"{kind} would be left")
    apothem = across_flats / 2
    circ = apothem / math.cos(math.pi / n)
    pts = [(circ * math.cos(2 * math.pi * (k + 0.5) / n), circ * math.sin(2 * math.pi * (k + 0.5) / n)) for k in range(n)]
    steps = [("add", Polygon(tuple(pts), (corner_radius,) * n if corner_radius else ()))]
    if bore:
        _positive("section.bore", bore)
        if across_flats - bore < 2 * SLIVER * across_flats:
            raise InputError("section.bore", bore, f"leaves no wall inside the {kind} (size across flats "
                             f"{across_flats:g} m)")
        steps.append(("cut", Disk((0.0, 0.0), bore / 2)))
    return Section(tuple(steps), kind=kind, bore=bore or None, nominal_diameter=across_flats)


def square_drive(size: float, corner_radius: float = 0.0, bore: float | None = None) -> Section:
    """Square drive of side ``size`` (across flats), corners rounded with ``corner_radius``."""
    return _drive("square", 4, size, corner_radius, bore, "size")


def hexagon_drive(across_flats: float, corner_radius: float = 0.0, bore: float | None = None) -> Section:
    """Regular hexagon drive, ``across_flats`` wide, corners rounded with ``corner_radius``."""
    return _drive("hexagon", 6, across_flats, corner_radius, bore, "across_flats")


def cross_slot_section(diameter: float, width: float, length: float, fillet: float = 0.0,
                       angle: float = 0.0) -> Section:
    """Round shaft with a cruciform socket at its centre (a cross-slot drive): two slots of ``width``
    crossing at right angles, ``length`` from tip to tip, the slot-end corners rounded with ``fillet``;
    ``angle`` turns the cross."""
    _positive("section.diameter", diameter)
    _positive("section.slot_width", width)
    _positive("section.slot_length", length)
    _finite_angle("section.slot_angle", angle)
    if fillet is None or not np.isfinite(fillet) or fillet < 0:
        raise InputError("section.slot_fillet", fillet, "must be zero or a positive length")
    if width >= length:
        raise InputError("section.slot_width", width, f"is not smaller than the slot length ({length:g} m): "
                         "that is no cross")
    if width < SLIVER * diameter:
        raise InputError("section.slot_width", width, f"is a sliver, below {SLIVER:g} of the diameter")
    # the farthest point of the cross from the axis: a slot-end corner
    reach = math.hypot(length / 2, width / 2)
    if diameter / 2 - reach < SLIVER * diameter:
        raise InputError("section.slot_length", length, f"leaves no wall outside the cross (its corners reach "
                         f"{reach:g} m from the axis, shaft radius {diameter / 2:g} m)")
    if fillet > width / 2 * (1 + 1e-12):
        raise InputError("section.slot_fillet", fillet, f"is larger than half the slot width ({width / 2:g} m)")
    a, h = length / 2, width / 2
    pts, fil = [], []
    for k in range(4):  # one arm per quarter turn: tip corners rounded, inner corner sharp
        for p, r in (((a, -h), fillet), ((a, h), fillet), ((h, h), 0.0)):
            q = _rot(90.0 * k + angle) @ np.asarray(p)
            pts.append((float(q[0]), float(q[1])))
            fil.append(r)
    steps = [("add", Disk((0.0, 0.0), diameter / 2)),
             ("cut", Polygon(tuple(pts), tuple(fil) if fillet else ()))]
    return Section(tuple(steps), kind="cross_slot", diameter=diameter)

"""The exact geometry cut by a straight line: the area on one side, its first moment about the
line, and the length of the chord. This is what the elementary VQ/(Ib) needs, taken from the real
section (OpenCASCADE booleans on the exact curves), not from a round-bar formula."""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from .geometry import Section
from .gmshload import initialize as initialize_gmsh, load_gmsh
from .mesh import normalised_section


@dataclass
class Cut:
    area: float  # area on the positive side of the line
    first_moment: float  # Q = ∫ (p − through)·normal dA over that area
    chord: float  # total length of the line inside the section (b)


def cut_section(section: Section, through, normal) -> Cut:
    """Cut along the line through ``through`` perpendicular to ``normal``. Built in the section's
    scale-free frame (as it is meshed; OpenCASCADE's absolute tolerances fail at tiny scales) and
    mapped back: areas by scale², first moments by scale³, chords by scale."""
    gmsh = load_gmsh()
    if not gmsh.isInitialized():
        initialize_gmsh(gmsh)
    gmsh.option.setNumber("General.Terminal", 0)
    gmsh.clear()
    try:
        gmsh.model.add("cut")
        occ = gmsh.model.occ
        unit, frame = normalised_section(section)
        k = frame.scale
        surfaces = unit.build(gmsh)
        n = np.asarray(normal, float) / np.linalg.norm(normal)
        t = np.array([-n[1], n[0]])
        p0 = (np.asarray(through, float) - np.asarray(frame.origin, float)) / k
        big = 10.0 * unit.length_scale + float(np.linalg.norm(p0))
        # half plane on the +normal side, as a big rectangle
        corners = [p0 - big * t, p0 + big * t, p0 + big * t + big * n, p0 - big * t + big * n]
        pts = [occ.addPoint(float(c[0]), float(c[1]), 0.0) for c in corners]
        lines = [occ.addLine(pts[i], pts[(i + 1) % 4]) for i in range(4)]
        half = occ.addPlaneSurface([occ.addCurveLoop(lines)])
        a = occ.addPoint(*(p0 - big * t), 0.0)
        b = occ.addPoint(*(p0 + big * t), 0.0)
        line = occ.addLine(a, b)
        occ.synchronize()
        chord_parts, _ = occ.intersect([(1, line)], [(2, s) for s in surfaces], removeObject=True, removeTool=False)
        part, _ = occ.intersect([(2, s) for s in surfaces], [(2, half)], removeObject=True, removeTool=True)
        occ.synchronize()
        chord = sum(occ.getMass(1, tag) for dim, tag in chord_parts if dim == 1)
        area = q = 0.0
        for dim, tag in part:
            if dim != 2:
                continue
            m = occ.getMass(2, tag)
            c = np.asarray(occ.getCenterOfMass(2, tag))[:2]
            area += m
            q += m * float((c - p0) @ n)
        return Cut(float(area) * k**2, float(q) * k**3, float(chord) * k)
    finally:
        gmsh.clear()


def elementary_shear(section: Section, centroid, I: float, V: float, direction: str) -> tuple[float, Cut]:
    """VQ/(Ib) on the neutral axis through the centroid: for Vy the cut is the line y = yc
    (I = Ixx), for Vx the line x = xc (I = Iyy)."""
    normal = (0.0, 1.0) if direction == "y" else (1.0, 0.0)
    c = cut_section(section, centroid, normal)
    return (abs(V) * abs(c.first_moment) / (I * c.chord) if c.chord > 0 else math.nan), c

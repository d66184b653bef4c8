"""Section properties by FE integration, cross-checked against the exact boundary integrals."""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
from skfem import Basis, ElementTriP2

from . import forms
from .mesh import SectionMesh, p2_dofs


@dataclass
class AreaMoments:
    """Area, centroid and centroidal second moments [m, m², m⁴]; angles in degrees."""

    area: float
    centroid: tuple[float, float]
    Ixx: float  # ∫ y² dA about the centroidal x axis
    Iyy: float  # ∫ x² dA about the centroidal y axis
    Ixy: float  # ∫ x y dA, centroidal
    I1: float  # major principal moment
    I2: float  # minor principal moment
    principal_angle_deg: float  # angle from x to the major principal axis, counter-clockwise
    polar: float  # Ixx + Iyy
    c_max: float  # distance from the centroid to the farthest boundary point
    exact: dict = field(default_factory=dict)  # same quantities from the exact boundary integral
    rel_diff: dict = field(default_factory=dict)  # |FE − exact| / scale for each


def centroidal(area, sx, sy, ixx0, iyy0, ixy0):
    xc, yc = sx / area, sy / area
    return xc, yc, ixx0 - area * yc**2, iyy0 - area * xc**2, ixy0 - area * xc * yc


def principal(Ixx, Iyy, Ixy):
    avg, rad = (Ixx + Iyy) / 2, math.hypot((Ixx - Iyy) / 2, Ixy)
    angle = 0.5 * math.degrees(math.atan2(-2 * Ixy, Ixx - Iyy))
    if angle <= -90.0 + 1e-4:  # report the axis in (-90°, 90°]
        angle += 180.0
    return avg + rad, avg - rad, angle


def area_moments(sm: SectionMesh, basis: Basis | None = None) -> AreaMoments:
    basis = basis or Basis(sm.mesh, ElementTriP2(), intorder=6, dofs=p2_dofs(sm.mesh))
    A = forms.area.assemble(basis)
    sx = forms.first_moment_x.assemble(basis)
    sy = forms.first_moment_y.assemble(basis)
    xc, yc, Ixx, Iyy, Ixy = centroidal(A, sx, sy, forms.second_moment_xx.assemble(basis),
                                       forms.second_moment_yy.assemble(basis), forms.product_moment.assemble(basis))
    I1, I2, ang = principal(Ixx, Iyy, Ixy)
    bnodes = sm.mesh.doflocs[:, np.unique(sm.mesh.facets[:, sm.mesh.boundary_facets()])]
    c_max = float(np.max(np.hypot(bnodes[0] - xc, bnodes[1] - yc)))
    e = sm.boundary.integrals
    exc, eyc, eIxx, eIyy, eIxy = centroidal(e["A"], e["Sx"], e["Sy"], e["Ixx0"], e["Iyy0"], e["Ixy0"])
    exact = dict(area=e["A"], centroid_x=exc, centroid_y=eyc, Ixx=eIxx, Iyy=eIyy, Ixy=eIxy)
    fe = dict(area=A, centroid_x=xc, centroid_y=yc, Ixx=Ixx, Iyy=Iyy, Ixy=Ixy)
    L = math.sqrt(e["A"])
    Iscale = max(eIxx, eIyy)
    scale = dict(area=e["A"], centroid_x=L, centroid_y=L, Ixx=Iscale, Iyy=Iscale, Ixy=Iscale)
    rel = {k: abs(fe[k] - exact[k]) / scale[k] for k in fe}
    return AreaMoments(A, (xc, yc), Ixx, Iyy, Ixy, I1, I2, ang, Ixx + Iyy, c_max, exact, rel)

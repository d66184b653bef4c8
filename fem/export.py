"""VTU export through meshio, for a look in any general-purpose viewer."""
from __future__ import annotations

from pathlib import Path

import meshio
import numpy as np
from skfem import Basis, ElementTriP2

from scipy.sparse.linalg import splu

from . import forms
from .bases import interpolate
from .mesh import SectionMesh


def nodal_gradient(basis: Basis, u: np.ndarray) -> np.ndarray:
    """∇u projected (L2) onto the P2 space: (2, N) nodal values."""
    g = interpolate(basis, u).grad
    return np.vstack([basis.project(g[0]), basis.project(g[1])])


def projector(basis: Basis):
    """L2 projection onto the space of ``basis`` with one factorisation of the mass matrix: a callable
    taking values at the quadrature points, shaped (elements, points), and returning nodal values.
    For several fields on one mesh this is one factorisation instead of one solve setup per field."""
    lu = splu(forms.mass.assemble(basis).tocsc())
    return lambda q: lu.solve(forms.projection_load.assemble(basis, f=np.asarray(q)))


def centroid_values(mesh, u: np.ndarray):
    """A P2 field's value, gradient (2, elements) and position (2, elements) at every element's
    centroid (the reference point (1/3, 1/3), mapped; skfem's intorder=1 rule has three points, none of
    them the centroid): for fields that jump between elements, such as the stresses of a
    composite section, whose gradients jump at every interface."""
    b = Basis(mesh, ElementTriP2(), quadrature=(np.array([[1.0 / 3.0], [1.0 / 3.0]]), np.array([0.5])))
    f = interpolate(b, u)
    x = np.asarray(b.global_coordinates())[:, :, 0]
    return np.asarray(f)[:, 0], np.vstack([f.grad[0][:, 0], f.grad[1][:, 0]]), x


def write_vtu(path: str | Path, sm: SectionMesh, point_data: dict[str, np.ndarray],
              cell_data: dict[str, np.ndarray] | None = None) -> Path:
    """Write the curved mesh as 6-node triangles with the given P2 nodal fields (and per-element
    ``cell_data``, one value per triangle). ``sm`` is anything with the skfem mesh as ``.mesh``."""
    m = sm.mesh
    basis = Basis(m, ElementTriP2())
    t = basis.element_dofs  # (6, nelems): vertices then edge midpoints, in skfem's edge order
    # skfem edges of a triangle are (0,1), (1,2), (0,2); VTK's 6-node triangle wants the same order
    cells = [("triangle6", t.T.astype(np.int64))]
    pts = np.vstack([m.doflocs, np.zeros(m.doflocs.shape[1])]).T
    mio = meshio.Mesh(pts, cells, point_data={k: np.asarray(v).T for k, v in point_data.items()},
                      cell_data={k: [np.asarray(v)] for k, v in (cell_data or {}).items()})
    path = Path(path)
    mio.write(path)
    return path

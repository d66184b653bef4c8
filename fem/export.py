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


def write_vtu(path: str | Path, sm: SectionMesh, point_data: dict[str, np.ndarray]) -> Path:
    """Write the curved mesh as 6-node triangles with the given P2 nodal fields."""
    m = sm.mesh
    basis = Basis(m, ElementTriP2())
    t = basis.element_dofs  # (6, nelems): vertices then edge midpoints, in skfem's edge order
    # skfem edges of a triangle are (0,1), (1,2), (0,2); VTK's 6-node triangle wants the same order
    cells = [("triangle6", t.T.astype(np.int64))]
    pts = np.vstack([m.doflocs, np.zeros(m.doflocs.shape[1])]).T
    mio = meshio.Mesh(pts, cells, point_data={k: np.asarray(v).T for k, v in point_data.items()})
    path = Path(path)
    mio.write(path)
    return path

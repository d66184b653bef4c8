"""A-posteriori error indicators (recovery-based, Zienkiewicz–Zhu) and the size field they ask for.

The FE gradient of a P2 field jumps between elements; averaging the element gradients at each node
gives a continuous, recovered gradient, and the difference between the two, element by element,
estimates the local error (Zienkiewicz & Zhu, Int. J. Numer. Meth. Eng. 24:337–357, 1987). Relative
to the field's peak it says where the mesh must be finer for the peak stresses to reach a requested
accuracy.
"""
from __future__ import annotations

import numpy as np
from skfem import Basis

from .bases import interpolate
from .mesh import SectionMesh


def element_sizes(mesh) -> np.ndarray:
    """Size of each triangle: side of the equilateral triangle of the same (straight) area."""
    p, t = mesh.p, mesh.t
    a, b, c = p[:, t[0]], p[:, t[1]], p[:, t[2]]
    area = 0.5 * np.abs((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]))
    return np.sqrt(4.0 * area / np.sqrt(3.0))


def recovered_gradient(basis: Basis, u: np.ndarray) -> np.ndarray:
    """Continuous P2 gradient by averaging, at every node, the gradients of the elements that share
    it (nodal-averaging recovery). Returns (2, N) DOF vectors.

    Kept on ``basis`` (the nodal basis, and the result for the last few fields by identity): the
    adaptive indicator and the shear peak recover the same fields on the same basis."""
    from skfem import CellBasis, ElementTriP2

    memo = basis.__dict__.setdefault("_recovered_gradients", [])
    for field, done in memo:
        if field is u:
            return done.copy()
    nb = basis.__dict__.get("_nodal_p2_basis")
    if nb is None:
        e = ElementTriP2()
        ref = np.asarray(e.doflocs, float).T  # (2, 6) reference nodes in DOF order
        nb = CellBasis(basis.mesh, e, mapping=basis.mapping, dofs=basis.dofs,
                       quadrature=(ref, np.full(ref.shape[1], 1.0 / ref.shape[1])))
        basis.__dict__["_nodal_p2_basis"] = nb
    g = np.asarray(interpolate(nb, u).grad)  # (2, nel, 6)
    dofs = nb.element_dofs  # (6, nel)
    out = np.zeros((2, basis.N))
    count = np.zeros(basis.N)
    for i in range(2):
        np.add.at(out[i], dofs.T, g[i])
    np.add.at(count, dofs.T, 1.0)
    out /= np.maximum(count, 1.0)
    memo.append((u, out))
    del memo[:-4]
    return out.copy()


def recovery_indicator(basis: Basis, u: np.ndarray) -> np.ndarray:
    """Per-element RMS of ∇u − G(∇u), G the recovered (continuous) gradient [unit of ∇u]."""
    g = interpolate(basis, u).grad
    G = recovered_gradient(basis, u)
    diff2 = (g[0] - np.asarray(interpolate(basis, G[0]))) ** 2 + (g[1] - np.asarray(interpolate(basis, G[1]))) ** 2
    dx = basis.dx
    return np.sqrt(np.sum(diff2 * dx, axis=1) / np.sum(dx, axis=1))


def adapted_sizes(sm: SectionMesh, relative_error: np.ndarray, target: float, h_max: float,
                  keep: np.ndarray | None = None, order: float = 2.0) -> np.ndarray:
    """New element sizes so that each element's relative error falls to ``target``.

    The gradient error of P2 elements shrinks like h^order (order 2); each element's size is scaled by
    (target/error)^(1/order), limited to [1/4, 3/2] per step and to ``h_max``. Elements flagged in
    ``keep`` (next to a singular corner, where refining never converges) keep their size."""
    h = element_sizes(sm.mesh)
    factor = np.clip((target / np.maximum(relative_error, 1e-300)) ** (1.0 / order), 0.25, 1.5)
    new = np.minimum(h * factor, h_max)
    if keep is not None:
        new[keep] = h[keep]
    return new


def near_points(mesh, points, radius: float) -> np.ndarray:
    """Elements with a vertex within ``radius`` of any of ``points``."""
    flag = np.zeros(mesh.t.shape[1], dtype=bool)
    for x, y in points:
        d = np.hypot(mesh.p[0] - x, mesh.p[1] - y) < radius
        flag |= d[mesh.t].any(axis=0)
    return flag


def triangles_xy(mesh) -> np.ndarray:
    """Vertex coordinates of every triangle, shape (n, 3, 2) (for a gmsh background size view)."""
    return mesh.p[:, mesh.t].transpose(2, 1, 0)

"""Values and gradients of a P2 field at given points of a curved mesh.

scikit-fem's point finder does not cover quadratic meshes; here the element is found on the
straight-sided vertex mesh (then among the nearest elements, for points in the thin slivers between
a chord and its arc), and the reference coordinates by inverting the isoparametric map."""
from __future__ import annotations

import numpy as np
from scipy.spatial import cKDTree
from skfem import CellBasis, ElementTriP2, MeshTri1

from .bases import interpolate


def _locate(mesh, p: np.ndarray):
    """(element, reference coordinates) of point p, or None if it is outside the mesh."""
    mapping = mesh._mapping()
    lin = MeshTri1(mesh.p, mesh.t)
    cands = []
    try:
        cands.append(int(lin.element_finder()(np.array([p[0]]), np.array([p[1]]))[0]))
    except (ValueError, IndexError):
        pass
    if not hasattr(mesh, "_centroid_tree"):
        object.__setattr__(mesh, "_centroid_tree", cKDTree(mesh.p[:, mesh.t].mean(axis=1).T))
    _, near = mesh._centroid_tree.query(p, k=min(12, mesh.t.shape[1]))
    cands += [int(e) for e in np.atleast_1d(near)]
    for e in cands:
        if e < 0:
            continue
        X = np.full((2, 1, 1), 1 / 3)
        x = p.reshape(2, 1, 1)
        for _ in range(30):
            F = mapping.F(X, tind=np.array([e]))
            dX = np.einsum("ijkl,jkl->ikl", mapping.invDF(X, tind=np.array([e])), x - F)
            X = X + dX
            if np.abs(dX).max() < 1e-13:
                break
        r = X[:, 0, 0]
        if r.min() >= -1e-9 and r.sum() <= 1 + 1e-9:
            return e, np.clip(r, 0.0, 1.0)
    return None


def probe(mesh, u: np.ndarray, points) -> tuple[np.ndarray, np.ndarray]:
    """Value (n,) and gradient (2, n) of the P2 field ``u`` at ``points`` (2, n); NaN outside."""
    pts = np.atleast_2d(np.asarray(points, float))
    if pts.shape[0] != 2:
        pts = pts.T
    val = np.full(pts.shape[1], np.nan)
    grad = np.full((2, pts.shape[1]), np.nan)
    for i in range(pts.shape[1]):
        hit = _locate(mesh, pts[:, i])
        if hit is None:
            continue
        e, r = hit
        b = CellBasis(mesh, ElementTriP2(), elements=np.array([e]), quadrature=(r[:, None], np.array([1.0])))
        f = interpolate(b, u)
        val[i] = float(np.asarray(f)[0, 0])
        grad[:, i] = np.asarray(f.grad)[:, 0, 0]
    return val, grad

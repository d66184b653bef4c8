"""Field values of a solution at a basis's points, without a needless cost of scikit-fem.

``Basis.interpolate`` first splits the solution into its components (``split_indices``); for a scalar
element that runs ``np.unique`` over every element's DOFs on every call and then uses none of it
(scikit-fem 12; the field is built from the basis alone). With numpy 2.4 this took 0.65 s per call
at a million unknowns and about a tenth of a demo case's solve time (profiled, tests/benchmarks).
:func:`interpolate` gives the same :class:`~skfem.element.DiscreteField`, bit for bit, without it.
"""
from __future__ import annotations

from skfem import Basis, ElementTriP2
from skfem.element import ElementComposite, ElementVector

from . import forms
from .mesh import p2_dofs, same_topology


def _whole() -> list:
    return [slice(None)]  # the whole vector: one component, the basis itself


def interpolate(basis, w):
    """``basis.interpolate(w)``; for a scalar element the component split is skipped."""
    if not isinstance(basis.elem, (ElementComposite, ElementVector)) and "split_indices" not in vars(basis):
        basis.split_indices = _whole
    return basis.interpolate(w)


def centroidal_laplacian(sm, centroid) -> tuple:
    """The P2 basis (intorder 4) on ``sm``'s mesh moved to centroidal axes, and its Laplace stiffness
    matrix, made once per mesh and centroid and kept on ``sm``: the two shear functions and the warping
    function are solved on this one matrix (one assembly, and with
    :func:`fem.linalg.reuse_factorisations` one factorisation). Read, never changed."""
    key = (float(centroid[0]), float(centroid[1]))
    memo = sm.__dict__.setdefault("_centroidal_laplacian", {})
    if key not in memo:
        memo.clear()  # one centroid per mesh in practice; never keep stale matrices
        moved = same_topology(sm.mesh.translated((-key[0], -key[1])), sm.mesh)
        basis = Basis(moved, ElementTriP2(), intorder=4, dofs=p2_dofs(moved))
        memo[key] = (basis, forms.laplace.assemble(basis))
    return memo[key]

"""fem.bases.interpolate is scikit-fem's own Basis.interpolate, bit for bit, without the component split.

The reference is scikit-fem itself: a fresh basis (no shortcut installed) interpolates the same vector.
"""
from __future__ import annotations

import numpy as np
from skfem import Basis, ElementTriP2, ElementVector, FacetBasis, MeshTri

from fem.bases import interpolate


def _mesh():
    return MeshTri.init_circle(3)


def test_cell_and_facet_fields_equal_scikit_fems():
    m = _mesh()
    rng = np.random.default_rng(3)
    for make in (lambda: Basis(m, ElementTriP2(), intorder=4), lambda: FacetBasis(m, ElementTriP2())):
        ours, ref = make(), make()
        w = rng.standard_normal(ours.N)
        a, b = interpolate(ours, w), ref.interpolate(w)
        assert np.array_equal(np.asarray(a), np.asarray(b))
        assert np.array_equal(np.asarray(a.grad), np.asarray(b.grad))
        assert "split_indices" in vars(ours) and "split_indices" not in vars(ref)


def test_vector_elements_keep_the_split():
    m = _mesh()
    b = Basis(m, ElementVector(ElementTriP2()))
    w = np.arange(b.N, dtype=float)
    out = interpolate(b, w)
    assert "split_indices" not in vars(b)
    assert np.array_equal(np.asarray(out), np.asarray(Basis(m, ElementVector(ElementTriP2())).interpolate(w)))

"""Checked linear solves: the iterative path reproduces the direct one, is deterministic, and an
unconverged solve is never returned."""
import numpy as np
import pytest
from skfem import Basis, ElementTriP2

import fem.linalg as la
from fem import forms
from fem.errors import SolveError
from fem.geometry import Keyway, keyed_section
from fem.mesh import MeshOptions, mesh_section


@pytest.fixture(scope="module")
def system():
    sm = mesh_section(keyed_section(0.03, [Keyway(0.008, 0.004, 0.0006)]), MeshOptions(fineness=1.0))
    basis = Basis(sm.mesh, ElementTriP2(), intorder=4)
    K = forms.laplace.assemble(basis)
    f = forms.prandtl_load.assemble(basis)
    I = np.setdiff1d(np.arange(basis.N), basis.get_dofs().all())
    return K[I][:, I].tocsr(), f[I]


def test_iterative_path_reproduces_the_direct_solve_and_is_deterministic(system, monkeypatch):
    K, f = system
    direct = la.solve_spd(K, f)
    monkeypatch.setattr(la, "DIRECT_LIMIT", 10)  # force AMG + CG on this small system
    with la.record_solves() as log:
        x1 = la.solve_spd(K, f)
        np.random.seed(1)  # a different global random state must not change the answer
        x2 = la.solve_spd(K, f)
    assert [e["method"] for e in log] == ["AMG+CG", "AMG+CG"]
    assert all(e["residual"] <= la.RESIDUAL_TOL for e in log)
    assert np.array_equal(x1, x2)  # bit for bit
    # a relative residual of 1e-9 (the accepted tolerance) keeps the solution within 1e-6 of the direct one
    assert np.linalg.norm(x1 - direct) / np.linalg.norm(direct) < 1e-6


def test_an_unconverged_solve_is_retried_directly_or_refused(system, monkeypatch):
    K, f = system
    direct = la.solve_spd(K, f)
    monkeypatch.setattr(la, "DIRECT_LIMIT", 10)
    monkeypatch.setattr(la, "MAXITER", 1)
    with la.record_solves() as log:
        x = la.solve_spd(K, f)  # CG stops after 1 iteration: refused, retried on the direct path
    assert log[0]["retried"] and log[0]["iterative_residual"] > la.RESIDUAL_TOL
    assert np.array_equal(x, direct)
    monkeypatch.setattr(la, "RETRY_DIRECT_LIMIT", 10)  # no retry allowed: the solve is refused
    with pytest.raises(SolveError, match="relative residual"):
        la.solve_spd(K, f)

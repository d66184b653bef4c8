"""Solver benchmark: the P2 torsion system of a keyed shaft at growing sizes, solved by SuperLU
(COLAMD ordering, scipy's default), SuperLU in symmetric mode (MMD on AᵀA+A, no pivoting) and
smoothed-aggregation AMG + CG (pyamg), with the relative residual each reaches and the J each gives.
Prints figures; asserts nothing (not part of pytest).

    python tests/benchmarks/bench_solver.py [fineness ...]
"""
from __future__ import annotations

import sys
import time

import numpy as np
import scipy.sparse.linalg as spla
from skfem import Basis, ElementTriP2

from fem import forms
from fem.geometry import Keyway, keyed_section
from fem.mesh import MeshOptions, mesh_section


def system(fineness, kind):
    """The stress-function system (Dirichlet) or the warping system (Neumann, one DOF fixed)."""
    d = 0.03
    sm = mesh_section(keyed_section(d, [Keyway(0.008, 0.004, 0.0006)]), MeshOptions(fineness=fineness))
    basis = Basis(sm.mesh, ElementTriP2(), intorder=4)
    K = forms.laplace.assemble(basis)
    if kind == "stress function":
        f = forms.prandtl_load.assemble(basis)
        I = np.setdiff1d(np.arange(basis.N), basis.get_dofs().all())
    else:
        f = forms.warping_load.assemble(basis)
        I = np.arange(1, basis.N)
    return K[I][:, I].tocsr(), f[I], basis.N


def rel_res(K, x, f):
    return float(np.linalg.norm(f - K @ x) / np.linalg.norm(f))


def main(finenesses):
    import pyamg

    print(f"{'DOFs':>8} {'method':<28} {'seconds':>8} {'rel. residual':>13} {'iterations':>10}")
    for fin, kind in [(f, k) for f in finenesses for k in ("stress function", "warping")]:
        K, f, n = system(fin, kind)
        print(kind)
        t = time.perf_counter()
        x0 = spla.splu(K.tocsc(), permc_spec="COLAMD").solve(f)
        print(f"{n:8d} {'SuperLU COLAMD':<28} {time.perf_counter() - t:8.2f} {rel_res(K, x0, f):13.2e} {'-':>10}")
        t = time.perf_counter()
        x1 = spla.splu(K.tocsc(), permc_spec="MMD_AT_PLUS_A", diag_pivot_thresh=0.0,
                       options=dict(SymmetricMode=True)).solve(f)
        print(f"{n:8d} {'SuperLU symmetric MMD':<28} {time.perf_counter() - t:8.2f} {rel_res(K, x1, f):13.2e} {'-':>10}")
        for tol in (1e-10, 1e-12):
            t = time.perf_counter()
            B = np.ones((K.shape[0], 1))
            ml = pyamg.smoothed_aggregation_solver(K, B=B, symmetry="hermitian")
            res = []
            x2 = ml.solve(f, x0=np.zeros_like(f), tol=tol, accel="cg", maxiter=500, residuals=res)
            dx = float(np.linalg.norm(x2 - x0) / np.linalg.norm(x0))
            print(f"{n:8d} {f'AMG+CG tol {tol:g}':<28} {time.perf_counter() - t:8.2f} {rel_res(K, x2, f):13.2e} "
                  f"{len(res) - 1:10d}   |x - x_direct|/|x| {dx:.1e}")


if __name__ == "__main__":
    main([float(a) for a in sys.argv[1:]] or [2.0, 4.0, 6.0])

"""Sparse symmetric positive-definite solves, each one checked.

Two paths (figures measured with ``tests/benchmarks/bench_solver.py``; see docs/method.md, 'Solver'):

* **direct** up to :data:`DIRECT_LIMIT` unknowns: SuperLU in symmetric mode (minimum-degree ordering
  of AᵀA+A, no pivoting: the matrices here are SPD, so the diagonal pivots are safe);
* **iterative** above it: smoothed-aggregation AMG (constant near-null space, which is right for the
  Laplace-type systems of P2 elements) as a preconditioner of conjugate gradients.

Every solve computes its relative residual ‖f − Kx‖/‖f‖ and compares it with :data:`RESIDUAL_TOL`.
An iterative solve that misses it is retried on the direct path (up to :data:`RETRY_DIRECT_LIMIT`
unknowns); a solve that still misses it raises :class:`~fem.errors.SolveError`: an unconverged
solution is never returned. AMG's setup estimates spectral radii from a random start vector; the
generator is seeded (and the caller's random state restored), so the same system gives the same
answer bit for bit.
"""
from __future__ import annotations

import contextlib
import hashlib

import numpy as np
import scipy.sparse as sp
import scipy.sparse.linalg as spla

from .errors import SolveError

#: Largest system solved by the direct factorisation (module variable: tests lower it to force the
#: iterative path).
DIRECT_LIMIT = 150_000

#: Largest system the direct path takes as a retry after a failed iterative solve (memory bound).
RETRY_DIRECT_LIMIT = 600_000

#: Accepted relative residual ‖f − Kx‖/‖f‖. The results need the solution to far better than the
#: finest accuracy target the tool accepts (1e-5 relative): at 1e-9 the measured change of the
#: solution against a direct solve is below 1e-8 relative (bench_solver.py), three decades under it.
RESIDUAL_TOL = 1e-9

#: CG stopping tolerance: a tenth of :data:`RESIDUAL_TOL`, so CG stops on its own criterion and the
#: check above is met with room (pyamg measures the preconditioned residual, not the true one).
CG_TOL = 1e-10

#: CG iteration cap. Measured: 20–60 iterations reach 1e-10 on these systems; the cap only stops a
#: solve that does not converge (tests lower it to 1 to make a solve fail).
MAXITER = 400

#: Seed of the random start vector of AMG's spectral-radius estimates (determinism).
SEED = 20240611

_LOGS: list[list] = []


@contextlib.contextmanager
def record_solves():
    """Collect a dict per solve (``n``, ``method``, ``residual``, ``iterations``, ``retried``)
    made inside the ``with`` block."""
    log: list[dict] = []
    _LOGS.append(log)
    try:
        yield log
    finally:
        _LOGS.remove(log)


def _record(entry: dict) -> None:
    for log in _LOGS:
        log.append(entry)


def relative_residual(K, x, f) -> float:
    nf = float(np.linalg.norm(f))
    r = float(np.linalg.norm(f - K @ x))
    return r / nf if nf > 0 else r


#: Open factorisation caches (see :func:`reuse_factorisations`); the innermost one is used.
_CACHES: list[_FactorCache] = []


class _FactorCache:
    def __init__(self, max_unknowns: int):
        self.max_unknowns = max_unknowns
        self.lus: dict = {}  # key -> factorisation, most recent last

    def get(self, key):
        lu = self.lus.pop(key, None)
        if lu is not None:
            self.lus[key] = lu
        return lu

    def put(self, key, lu) -> None:
        self.lus[key] = lu
        while len(self.lus) > 1 and sum(k[0][0] for k in self.lus) > self.max_unknowns:
            self.lus.pop(next(iter(self.lus)))


@contextlib.contextmanager
def reuse_factorisations(max_unknowns: int = 2 * DIRECT_LIMIT):
    """Inside the ``with`` block, a direct solve of a matrix equal entry for entry to one factorised
    before reuses that factorisation (the warping function and both shear functions share one
    stiffness matrix). Matrices are matched by a hash of their sorted CSR arrays, so only an
    identical matrix is reused; the cache keeps the most recent factorisations up to
    ``max_unknowns`` unknowns in total and is dropped when the block ends."""
    cache = _FactorCache(max_unknowns)
    _CACHES.append(cache)
    try:
        yield cache
    finally:
        _CACHES.remove(cache)
        cache.lus.clear()


def _matrix_key(K: sp.csr_matrix) -> tuple:
    A = K.copy()
    A.sum_duplicates()
    A.sort_indices()
    h = hashlib.blake2b(digest_size=20)
    for arr in (A.indptr, A.indices, A.data):
        h.update(np.ascontiguousarray(arr).tobytes())
    return (A.shape, A.nnz, h.hexdigest())


def _factorise(K: sp.csr_matrix):
    return spla.splu(K.tocsc(), permc_spec="MMD_AT_PLUS_A", diag_pivot_thresh=0.0,
                     options=dict(SymmetricMode=True))


def _direct(K: sp.csr_matrix, f: np.ndarray, entry: dict | None = None) -> np.ndarray:
    if not _CACHES:
        return _factorise(K).solve(f)
    cache = _CACHES[-1]
    key = _matrix_key(K)
    lu = cache.get(key)
    if lu is None:
        lu = _factorise(K)
        cache.put(key, lu)
    elif entry is not None:
        entry["reused_factorisation"] = True
    return lu.solve(f)


def _iterative(K: sp.csr_matrix, f: np.ndarray, tol: float, maxiter: int, near_null=None,
               blocksize: int = 1) -> tuple[np.ndarray, int]:
    import pyamg  # noqa: PLC0415

    state = np.random.get_state()
    try:
        np.random.seed(SEED)
        B = np.ones((K.shape[0], 1)) if near_null is None else np.asarray(near_null, float)
        A = K if blocksize == 1 else sp.bsr_matrix(K, blocksize=(blocksize, blocksize))
        ml = pyamg.smoothed_aggregation_solver(A, B=B, symmetry="hermitian")
    finally:
        np.random.set_state(state)
    cols = [f] if f.ndim == 1 else [f[:, j] for j in range(f.shape[1])]
    out, its = [], 0
    for b in cols:
        res: list = []
        x = ml.solve(b, x0=np.zeros_like(b), tol=tol, accel="cg", maxiter=maxiter, residuals=res)
        out.append(x)
        its = max(its, len(res) - 1)
    return (out[0] if f.ndim == 1 else np.column_stack(out)), its


def solve_spd(K: sp.spmatrix, f: np.ndarray, tol: float | None = None, direct_limit: int | None = None,
              near_null=None, blocksize: int = 1, maxiter: int | None = None) -> np.ndarray:
    """Solve K x = f (K SPD; ``f`` one or more columns), checked against the residual tolerance
    ``tol`` (default :data:`RESIDUAL_TOL`). Raises :class:`~fem.errors.SolveError` when no path
    reaches it.

    Elasticity (fem/solid.py) passes its own ``direct_limit`` (3-D fill-in makes the direct path
    costly far sooner than in 2-D), the rigid-body modes as ``near_null`` (the AMG's near-null
    space, one column per mode, instead of the constant), ``blocksize`` = 3 (the unknowns of one node
    aggregated together) and a larger ``maxiter``."""
    tol = RESIDUAL_TOL if tol is None else tol
    limit = DIRECT_LIMIT if direct_limit is None else direct_limit
    # the direct retry is bounded in proportion when the caller lowered the direct limit (3-D fill-in)
    retry_limit = RETRY_DIRECT_LIMIT if direct_limit is None else min(RETRY_DIRECT_LIMIT, 2 * direct_limit)
    K = sp.csr_matrix(K)
    n = K.shape[0]
    f = np.asarray(f, float)
    entry = dict(n=int(n), method="direct", residual=None, iterations=None, retried=False)
    if n > limit:
        entry["method"] = "AMG+CG"
        x, its = _iterative(K, f, min(CG_TOL, tol / 10.0), MAXITER if maxiter is None else maxiter,
                            near_null, blocksize)
        r = relative_residual(K, x, f)
        entry.update(residual=r, iterations=its)
        if np.all(np.isfinite(x)) and r <= tol:
            _record(entry)
            return x
        if n > retry_limit:
            _record(entry)
            raise SolveError(f"the iterative solve of {n} unknowns stopped at a relative residual of {r:.1e} "
                             f"after {its} iterations (tolerance {tol:.0e}) and the system is too large "
                             f"for the direct retry ({retry_limit} unknowns)")
        entry.update(retried=True, iterative_residual=r, method="direct (after AMG+CG failed)")
    x = _direct(K, f, entry)
    r = relative_residual(K, x, f)
    entry["residual"] = r
    _record(entry)
    if not (np.all(np.isfinite(x)) and r <= tol):
        raise SolveError(f"the direct solve of {n} unknowns reached a relative residual of {r:.1e} only "
                         f"(tolerance {tol:.0e}); the system is singular or badly conditioned")
    return x

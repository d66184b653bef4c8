"""Torsion along a shaft by 1-D finite elements: the angle of twist under a torque diagram and the
torsional natural frequencies of the shaft with the parts' polar inertias. SI throughout; this
module knows nothing of cases.

Unknown at each node: the rotation φ [rad] about the shaft's axis. Strain energy ½∫GJ·φ'² dz,
kinetic energy ½∫ρJp·φ̇² dz + ½ΣIk·φ̇k² (Jp the polar second moment of the element's section,
Ik the polar mass moments of inertia of the parts at their nodes). Linear elements with the
consistent mass matrix: the stiffness and mass of one element of length h are

    K = GJ/h [[1, −1], [−1, 1]],     M = ρJp·h/6 [[2, 1], [1, 2]].

The shaft is free in rotation at its bearings (a rigid-body mode at ω = 0, left out of the
frequencies returned). Frequencies converge at order 2 in the element size (consistent mass of
linear elements, from above); tests/test_fem_torsion_line.py prints the observed order.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import scipy.linalg


@dataclass
class TorsionLine:
    """Nodes at ``z`` [m] (strictly increasing); per element ``GJ`` [N·m²] and ``rhoJp`` [kg·m]
    (mass polar moment per length, 0 for a massless shaft)."""

    z: np.ndarray
    GJ: np.ndarray
    rhoJp: np.ndarray | None = None

    def __post_init__(self):
        self.z = np.asarray(self.z, float)
        n = len(self.z) - 1
        if n < 1 or not np.all(np.diff(self.z) > 0):
            raise ValueError("nodes must be at least two, strictly increasing")
        self.GJ = np.broadcast_to(np.asarray(self.GJ, float), (n,)).copy()
        if not np.all(self.GJ > 0):
            raise ValueError("GJ must be positive in every element")
        self.rhoJp = np.zeros(n) if self.rhoJp is None else np.broadcast_to(np.asarray(self.rhoJp, float), (n,)).copy()


def assemble(line: TorsionLine, inertias=()) -> tuple[np.ndarray, np.ndarray]:
    """Dense stiffness and mass matrices (n_nodes × n_nodes); ``inertias`` = [(node, I [kg·m²])]."""
    n = len(line.z)
    K = np.zeros((n, n))
    M = np.zeros((n, n))
    h = np.diff(line.z)
    for e in range(n - 1):
        k = line.GJ[e] / h[e]
        m = line.rhoJp[e] * h[e] / 6.0
        idx = np.ix_([e, e + 1], [e, e + 1])
        K[idx] += k * np.array([[1.0, -1.0], [-1.0, 1.0]])
        M[idx] += m * np.array([[2.0, 1.0], [1.0, 2.0]])
    for node, inertia in inertias:
        M[node, node] += inertia
    return K, M


def twist(line: TorsionLine, torque: np.ndarray) -> np.ndarray:
    """Rotation of every node relative to the first [rad] under the internal torque ``torque`` of
    each element [N·m] (constant along the element): φ(z_j) = Σ_{e<j} T_e·h_e/GJ_e, the exact
    integral of T/(GJ) for piecewise-constant torque and stiffness."""
    t = np.asarray(torque, float)
    return np.concatenate([[0.0], np.cumsum(t * np.diff(line.z) / line.GJ)])


def natural_frequencies(line: TorsionLine, inertias=(), count: int = 3) -> tuple[np.ndarray, np.ndarray]:
    """The lowest ``count`` non-zero torsional natural frequencies [rad/s] and their mode shapes
    (columns, normalised to a largest rotation of 1), free at both ends. Nodes without inertia
    (a massless stretch of shaft) are condensed out statically first."""
    K, M = assemble(line, inertias)
    d = np.diag(M)
    scale = max(d.max(), 1e-300)
    massive = d > 1e-14 * scale
    if massive.sum() < 2:
        return np.array([]), np.zeros((len(line.z), 0))
    a, b = np.where(massive)[0], np.where(~massive)[0]
    if len(b):  # Guyan condensation of the massless nodes (exact: they carry no inertia)
        Kab, Kbb = K[np.ix_(a, b)], K[np.ix_(b, b)]
        X = np.linalg.solve(Kbb, Kab.T)
        Kc = K[np.ix_(a, a)] - Kab @ X
        Mc = M[np.ix_(a, a)]
    else:
        Kc, Mc, X = K, M, np.zeros((0, len(a)))
    # the lowest count + 1 pairs only (the rigid-body mode among them): a shaft's line has a few hundred nodes
    w2, vec = scipy.linalg.eigh(Kc, Mc, subset_by_index=[0, min(count, len(Kc) - 1)])
    # the shaft is connected (GJ > 0 everywhere) and free at both ends: exactly one rigid-body rotation, the
    # lowest pair (ω² = 0 up to round-off); it is left out by position, never by a tolerance on ω²
    keep = np.arange(1, len(w2))
    full = np.zeros((len(line.z), len(keep)))
    full[a] = vec[:, keep]
    if len(b):
        full[b] = -X @ vec[:, keep]
    full /= np.abs(full).max(axis=0, keepdims=True)
    return np.sqrt(w2[keep]), full

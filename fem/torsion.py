"""Saint-Venant torsion of a meshed section, two independent ways.

Stress function (Prandtl), per unit Gθ: ∇²φ = −2 in the section, φ = 0 on the outer boundary and
φ = cₖ on hole k, each cₖ an unknown fixed by that hole's circulation (Bredt) condition. In the
complementary-energy form ∫(½|∇φ|² − 2φ) dA − 2Σcₖ Aₖ the constant of a hole is one unknown shared
by all the hole's nodes (a 0/1 prolongation P, reduced system PᵀKP) loaded by 2Aₖ.
J = 2∫φ dA + 2Σ cₖAₖ; τzx = Gθ ∂φ/∂y, τzy = −Gθ ∂φ/∂x, Gθ = T/J. A conforming solution gives J
from below. (Saint-Venant/Prandtl; e.g. Timoshenko & Goodier, Theory of Elasticity, 3rd ed., ch. 10.)

Warping function, per unit θ: ∇²ω = 0, ∂ω/∂n = y·nx − x·ny (pure Neumann, one DOF fixed).
J = ∫(x² + y² + x ∂ω/∂y − y ∂ω/∂x) dA, τzx = Gθ(∂ω/∂x − y), τzy = Gθ(∂ω/∂y + x). A conforming
solution gives J from above, so the two bracket the exact value.

Peak stresses are read on the boundary (facet points of the owning elements, through the
isoparametric map), where they live, not at interior quadrature points.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
import scipy.sparse as sp
from skfem import Basis, ElementTriP2, FacetBasis, condense

from . import forms
from .bases import centroidal_laplacian, interpolate
from .linalg import solve_spd
from .mesh import SectionMesh, boundary_mapping, p2_dofs


@dataclass
class BoundaryPeak:
    value: float  # |τ| per unit of the load (see the solver)
    at: tuple[float, float]
    facet: int
    curve: int | None
    loop: int | None


@dataclass
class TorsionResult:
    J: float  # stress-function torsion constant [m⁴], lower bound (boundary-corrected)
    J_warping: float  # warping-function torsion constant [m⁴], upper bound (boundary-corrected)
    J_mesh: float  # stress-function J on the meshed domain, before the boundary correction
    J_warping_mesh: float
    hole_constants: list[float]  # cₖ per unit Gθ [m²]
    hole_areas: list[float]  # Aₖ [m²] (of the meshed hole)
    peak_per_torque: float  # τmax / T [1/m³], stress function
    peak_at: tuple[float, float]
    peak: BoundaryPeak
    peak_warping_per_torque: float  # τmax / T from the warping solution
    peak_warping_at: tuple[float, float]
    dofs: int
    phi: np.ndarray = field(repr=False)
    omega: np.ndarray = field(repr=False)
    basis: Basis = field(repr=False)
    seconds: dict = field(default_factory=dict)
    singular_corners: list = field(default_factory=list)  # sharp re-entrant corners: unbounded stress there
    peak_at_corner_per_torque: float | None = None  # the mesh-dependent value at those corners (not a result)

    def stress(self, T: float, x: np.ndarray | None = None):
        """(τzx, τzy) at the basis quadrature points for torque T [Pa] (``x`` unused: reserved)."""
        g = interpolate(self.basis, self.phi).grad
        k = T / self.J
        return k * g[1], -k * g[0]


def _hole_prolongation(basis: Basis, hole_names: list[str]):
    """P: reduced unknowns (interior DOFs, then one per hole) -> all DOFs; outer DOFs are zero."""
    n = basis.N
    outer = basis.get_dofs("outer").all()
    holes = [basis.get_dofs(h).all() for h in hole_names]
    fixed = np.zeros(n, dtype=bool)
    fixed[outer] = True
    for h in holes:
        fixed[h] = True
    free = np.flatnonzero(~fixed)
    rows = [free]
    cols = [np.arange(len(free))]
    for k, h in enumerate(holes):
        rows.append(h)
        cols.append(np.full(len(h), len(free) + k))
    rows, cols = np.concatenate(rows), np.concatenate(cols)
    P = sp.csr_matrix((np.ones(len(rows)), (rows, cols)), shape=(n, len(free) + len(holes)))
    return P, len(free)


def enclosed_areas(mesh, hole_names) -> list[float]:
    """Area each named hole boundary of ``mesh`` encloses: −∮ x nₓ ds over it (n points out of the
    section). Used by single-material and composite sections."""
    out = []
    for name in hole_names:
        fb = FacetBasis(mesh, ElementTriP2(), facets=mesh.boundaries[name], intorder=6,
                        mapping=boundary_mapping(mesh))
        out.append(-float(forms.x_normal.assemble(fb)))
    return out


def hole_areas(sm: SectionMesh) -> list[float]:
    """Area each meshed hole encloses (:func:`enclosed_areas`)."""
    return enclosed_areas(sm.mesh, sm.hole_names)


def boundary_gradients(sm: SectionMesh, u: np.ndarray, points: str = "sample"):
    """∇u, positions and integration weights on every boundary facet, from the owning element,
    at the peak-sampling or the Gauss points (see :meth:`SectionMesh.boundary_basis`).
    Arrays of shape (2, nf, np), (2, nf, np) and (nf, np)."""
    fb = sm.boundary_basis(points)
    return np.asarray(fb.global_coordinates()), interpolate(fb, u).grad, fb.dx


def boundary_correction(sm: SectionMesh, tau_sq: np.ndarray, ds: np.ndarray) -> float:
    """First-order change of J from the mesh boundary to the exact one (Hadamard's shape derivative
    of the torsional rigidity, δJ = ∮ |τ/Gθ|² δn ds): the curved P2 boundary lies a distance δn
    off the exact curve, and this is what that costs J. Returned as J_exact − J_mesh."""
    return -float(np.sum(tau_sq * sm.boundary_offset * ds))


#: Radius, as a fraction of the section's size, around a sharp re-entrant corner inside which boundary
#: stresses are not used for the peak: there the exact stress is unbounded and the FE value depends
#: only on the mesh.
SINGULAR_RADIUS = 0.02


def singular_mask(sm: SectionMesh, x: np.ndarray) -> np.ndarray:
    """True at boundary points within :data:`SINGULAR_RADIUS` of a sharp re-entrant corner."""
    mask = np.zeros(x.shape[1:], dtype=bool)
    rho = SINGULAR_RADIUS * sm.section.length_scale
    for c in sm.boundary.reentrant_sharp_corners:
        mask |= np.hypot(x[0] - c.point[0], x[1] - c.point[1]) < rho
    return mask


def boundary_peak(sm: SectionMesh, x: np.ndarray, mag: np.ndarray, facets: np.ndarray,
                  exclude: np.ndarray | None = None) -> BoundaryPeak:
    if exclude is not None and exclude.any() and not exclude.all():
        mag = np.where(exclude, -np.inf, mag)
    i, j = np.unravel_index(int(np.argmax(mag)), mag.shape)
    f = int(facets[i])
    curve = sm.facet_curve.get(f)
    loop = sm.boundary.curves[curve].loop if curve in sm.boundary.curves else None
    return BoundaryPeak(float(mag[i, j]), (float(x[0, i, j]), float(x[1, i, j])), f, curve, loop)


def solve_torsion(sm: SectionMesh, centroid: tuple[float, float], warping: bool = True) -> TorsionResult:
    """Torsion on ``sm``: the stress function and (with ``warping``) the warping function, whose
    origin is ``centroid``. Without it, :func:`add_warping` can complete the result later."""
    import time

    t0 = time.perf_counter()
    basis = Basis(sm.mesh, ElementTriP2(), intorder=4, dofs=p2_dofs(sm.mesh))
    K = forms.laplace.assemble(basis)
    f = forms.prandtl_load.assemble(basis)
    t1 = time.perf_counter()

    # --- stress function with one unknown constant per hole
    P, nfree = _hole_prolongation(basis, sm.hole_names)
    areas = hole_areas(sm)
    Kr = (P.T @ K @ P).tocsr()
    fr = P.T @ f
    fr[nfree:] += 2.0 * np.asarray(areas)
    ur = solve_spd(Kr, fr)
    phi = P @ ur
    consts = [float(c) for c in ur[nfree:]]
    J_mesh = 2.0 * float(forms.integral_of.assemble(basis, u=interpolate(basis, phi))) + 2.0 * float(np.dot(consts, areas))
    t2 = time.perf_counter()

    # --- boundary correction and boundary peak, per unit torque
    _, gphi, ds = boundary_gradients(sm, phi, "gauss")
    J = J_mesh + boundary_correction(sm, gphi[0] ** 2 + gphi[1] ** 2, ds)
    x, gphi, _ = boundary_gradients(sm, phi)
    near = singular_mask(sm, x)
    mag = np.hypot(gphi[0], gphi[1]) / J
    peak = boundary_peak(sm, x, mag, sm.boundary_facets, exclude=near)
    corner_value = float(np.max(mag[near])) if near.any() else None
    t3 = time.perf_counter()
    tr = TorsionResult(
        J=J, J_warping=math.nan, J_mesh=J_mesh, J_warping_mesh=math.nan, hole_constants=consts, hole_areas=areas,
        peak_per_torque=peak.value, peak_at=peak.at, peak=peak,
        peak_warping_per_torque=math.nan, peak_warping_at=(math.nan, math.nan),
        dofs=int(basis.N), phi=phi, omega=np.zeros(0), basis=basis,
        seconds=dict(assemble=t1 - t0, solve_stress_function=t2 - t1, boundary=t3 - t2),
        singular_corners=[c.point for c in sm.boundary.reentrant_sharp_corners],
        peak_at_corner_per_torque=corner_value,
    )
    tr._K = K
    if warping:
        add_warping(sm, tr, centroid)
    return tr


def add_warping(sm: SectionMesh, tr: TorsionResult, centroid: tuple[float, float]) -> TorsionResult:
    """Solve the warping function (about ``centroid``) and fill the warping values of ``tr``."""
    import time

    t0 = time.perf_counter()
    # the stiffness matrix on the centroidal mesh that fem.shear.solve_shear uses (made once per mesh):
    # the same matrix with the same DOF fixed, so a factorisation kept by fem.linalg.reuse_factorisations serves both
    cbasis, K = centroidal_laplacian(sm, centroid)
    g = forms.warping_load.assemble(cbasis)
    omega = np.zeros(tr.basis.N)
    Kc, gc, _, I = condense(K, g, D=np.array([0]))
    omega[I] = solve_spd(Kc, gc)
    J_w_mesh = float(forms.warping_torsion_constant.assemble(cbasis, omega=interpolate(cbasis, omega)))

    def warping_stress(x, gw):  # τ/Gθ from the warping function
        return gw[0] - (x[1] - centroid[1]), gw[1] + (x[0] - centroid[0])

    xg, gw, ds = boundary_gradients(sm, omega, "gauss")
    tw = warping_stress(xg, gw)
    J_w = J_w_mesh + boundary_correction(sm, tw[0] ** 2 + tw[1] ** 2, ds)
    x, gw, _ = boundary_gradients(sm, omega)
    tw = warping_stress(x, gw)
    peak_w = boundary_peak(sm, x, np.hypot(*tw) / J_w, sm.boundary_facets, exclude=singular_mask(sm, x))
    tr.J_warping, tr.J_warping_mesh, tr.omega = J_w, J_w_mesh, omega
    tr.peak_warping_per_torque, tr.peak_warping_at = peak_w.value, peak_w.at
    tr.seconds["solve_warping"] = time.perf_counter() - t0
    return tr

"""Transverse shear of a meshed section: Saint-Venant flexure with Poisson's ratio.

Shear-function formulation (Pilkey, Analysis and Design of Elastic Beams: Computational Methods,
Wiley 2002, ch. 6; equations restated in our notation in the project's design notes), on centroidal
axes, with Ixx = ∫y² dA, Iyy = ∫x² dA, Ixy = ∫xy dA and Δ = 2(1+ν)(Ixx·Iyy − Ixy²):

- Ψ (force Vx): ∇²Ψ = 2(Ixy·y − Ixx·x), ∂Ψ/∂n = n·d,
  d = ν(Ixx(x²−y²)/2 − Ixy·xy, Ixx·xy + Ixy(x²−y²)/2);
- Φ (force Vy): ∇²Φ = 2(Ixy·x − Iyy·y), ∂Φ/∂n = n·h,
  h = ν(Iyy·xy − Ixy(x²−y²)/2, −Ixy·xy − Iyy(x²−y²)/2);
- τ = (τzx, τzy) = (Vx/Δ)(∇Ψ − d) + (Vy/Δ)(∇Φ − h), the stresses of forces through the shear centre.

Both are pure Neumann problems on every boundary, holes included (traction-free), one DOF fixed.
Shear centre from the moment of these stresses about the centroid; energy shear coefficients from
∫|τ|² dA. Peaks are searched at every element's nodes and densely along the boundary.
"""
from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np
from skfem import Basis, CellBasis, ElementTriP2, Functional

from . import forms
from .bases import centroidal_laplacian, interpolate
from .linalg import solve_spd
from .mesh import SectionMesh
from .properties import AreaMoments

# Reference P2 nodes and the centroid of the triangle: where a field is read inside the section.
_NODES = np.array([[0.0, 1.0, 0.0, 0.5, 0.5, 0.0, 1 / 3], [0.0, 0.0, 1.0, 0.0, 0.5, 0.5, 1 / 3]])


@Functional
def _dot(w):
    return w["ax"] * w["bx"] + w["ay"] * w["by"]


@dataclass
class ShearResult:
    """Shear functions and what follows from them. Coordinates are centroidal unless named ``_at``
    (those are in the case's geometry). Stresses are per unit force where ``per_unit`` says so."""

    nu: float
    centroid: tuple[float, float]
    centre: tuple[float, float]  # shear centre, geometry coordinates
    alpha: np.ndarray  # 2x2 energy shear-deformation matrix, αij = A ∫ τ(i)·τ(j) dA (unit forces)
    kappa_x: float  # 1/αxx
    kappa_y: float  # 1/αyy
    kappa_xy: float  # off-diagonal of α⁻¹ (zero for a symmetric section)
    area: float
    dofs: int
    psi: np.ndarray = field(repr=False)
    phi: np.ndarray = field(repr=False)
    basis: Basis = field(repr=False)  # on the centroidal mesh
    delta: float = 0.0
    I: tuple = (0.0, 0.0, 0.0)  # centroidal (Ixx, Iyy, Ixy)
    resultant_residual: dict = field(default_factory=dict)  # per unit force: (∫τ − V)/|V|

    # ----------------------------------------------------------- stress fields
    def _unit_fields(self, grad_psi, grad_phi, x):
        """τ for Vx = 1 and Vy = 1 at points x (centroidal), from the shear-function gradients."""
        nu, (Ixx, Iyy, Ixy) = self.nu, self.I
        X, Y = x
        d0 = nu * (Ixx * (X**2 - Y**2) / 2 - Ixy * X * Y)
        d1 = nu * (Ixx * X * Y + Ixy * (X**2 - Y**2) / 2)
        h0 = nu * (Iyy * X * Y - Ixy * (X**2 - Y**2) / 2)
        h1 = nu * (-Ixy * X * Y - Iyy * (X**2 - Y**2) / 2)
        D = self.delta
        return ((grad_psi[0] - d0) / D, (grad_psi[1] - d1) / D), ((grad_phi[0] - h0) / D, (grad_phi[1] - h1) / D)

    def stress(self, Vx: float, Vy: float, basis=None):
        """(τzx, τzy) for (Vx, Vy) through the shear centre, at the quadrature points of ``basis``
        (a basis on the centroidal mesh; default: the solver's)."""
        b = basis or self.basis
        gp, gf = interpolate(b, self.psi).grad, interpolate(b, self.phi).grad
        x = b.global_coordinates()
        ux, uy = self._unit_fields(gp, gf, x)
        return Vx * ux[0] + Vy * uy[0], Vx * ux[1] + Vy * uy[1]

    def stress_at(self, points, Vx: float, Vy: float) -> np.ndarray:
        """(τzx, τzy) for (Vx, Vy) at points (2, n) given in the geometry's coordinates."""
        from .probe import probe  # noqa: PLC0415

        pts = np.asarray(points, float).reshape(2, -1)
        c = pts - np.asarray(self.centroid)[:, None]
        _, gp = probe(self.basis.mesh, self.psi, c)
        _, gf = probe(self.basis.mesh, self.phi, c)
        (ax, ay), (bx, by) = self._unit_fields(gp, gf, c)
        return np.vstack([Vx * ax + Vy * bx, Vx * ay + Vy * by])

    def unit_stresses_at(self, basis):
        """Unit-force stress fields at the points of ``basis``: ((τx, τy) for Vx=1, (τx, τy) for Vy=1)."""
        gp, gf = interpolate(basis, self.psi).grad, interpolate(basis, self.phi).grad
        return self._unit_fields(gp, gf, np.asarray(basis.global_coordinates()))


def solve_shear(sm: SectionMesh, props: AreaMoments, nu: float) -> ShearResult:
    """Both shear functions on ``sm`` for Poisson's ratio ``nu``."""
    xc, yc = props.centroid
    basis, K = centroidal_laplacian(sm, (xc, yc))  # shared with the warping function (fem.torsion.add_warping)
    Ixx, Iyy, Ixy = props.Ixx, props.Iyy, props.Ixy
    fx = forms.shear_load_x.assemble(basis, nu=nu, Ixx=Ixx, Ixy=Ixy)
    fy = forms.shear_load_y.assemble(basis, nu=nu, Iyy=Iyy, Ixy=Ixy)
    I = np.arange(1, basis.N)  # one DOF fixed: the functions are defined up to a constant
    Kc = K[I][:, I]
    U = solve_spd(Kc, np.column_stack([fx[I], fy[I]]))
    psi, phi = np.zeros(basis.N), np.zeros(basis.N)
    psi[I], phi[I] = U[:, 0], U[:, 1]

    res = ShearResult(nu, (xc, yc), (0.0, 0.0), np.zeros((2, 2)), 0.0, 0.0, 0.0, props.area, int(basis.N),
                      psi, phi, basis, delta=2 * (1 + nu) * (Ixx * Iyy - Ixy**2), I=(Ixx, Iyy, Ixy))
    (ax, ay), (bx, by) = res.unit_stresses_at(basis)
    # shear centre: moment of each unit field about the centroid
    Mx = float(forms.shear_moment.assemble(basis, tx=ax, ty=ay))  # Vx = 1 acting at y = ys gives −ys
    My = float(forms.shear_moment.assemble(basis, tx=bx, ty=by))  # Vy = 1 acting at x = xs gives xs
    res.centre = (My + xc, -Mx + yc)
    # equilibrium: the unit fields integrate to the unit forces
    res.resultant_residual = {
        "Vx": [float(forms.field_integral.assemble(basis, t=ax)) - 1.0, float(forms.field_integral.assemble(basis, t=ay))],
        "Vy": [float(forms.field_integral.assemble(basis, t=bx)), float(forms.field_integral.assemble(basis, t=by)) - 1.0],
    }
    A = props.area
    axx = A * float(_dot.assemble(basis, ax=ax, ay=ay, bx=ax, by=ay))
    ayy = A * float(_dot.assemble(basis, ax=bx, ay=by, bx=bx, by=by))
    axy = A * float(_dot.assemble(basis, ax=ax, ay=ay, bx=bx, by=by))
    res.alpha = np.array([[axx, axy], [axy, ayy]])
    res.kappa_x, res.kappa_y = 1.0 / axx, 1.0 / ayy
    res.kappa_xy = float(-axy / (axx * ayy - axy**2))
    return res


@dataclass
class ShearPeak:
    value: float
    at: tuple[float, float]  # geometry coordinates
    on_boundary: bool
    normal_traction: float  # largest |τ·n| on the boundary relative to the peak (should be ~0)
    moment_residual: float  # moment about the shear centre / (|V| · size)


def _lattice(n: int = 8) -> np.ndarray:
    """Reference-triangle points of an n-division lattice, vertices and edges included."""
    pts = [(i / n, j / n) for i in range(n + 1) for j in range(n + 1 - i)]
    return np.array(pts).T


def shear_peak(sm: SectionMesh, sr: ShearResult, Vx: float, Vy: float, moment: bool = True) -> ShearPeak:
    """Largest |τ| for (Vx, Vy), inside or on the boundary (``moment=False``: the moment residual, a
    check of the result and not needed for the peak, is left out and given as NaN).

    Inside, the stress is the recovered (nodally averaged, continuous) field: its largest nodal value
    is found first, then the maximum is sought on a fine lattice over the elements around that node
    (the maximum of a smooth field lies between nodes). On the boundary, the owning element's stress
    is read densely along every facet."""
    from .estimate import recovered_gradient  # noqa: PLC0415
    from .mesh import _boundary_basis  # noqa: PLC0415

    xc, yc = sr.centroid
    cm = sr.basis.mesh
    rec = sr.__dict__.get("_recovered")
    if rec is None:  # the recovered gradients depend on the solution only: computed once per result
        rec = sr.__dict__["_recovered"] = (recovered_gradient(sr.basis, sr.psi), recovered_gradient(sr.basis, sr.phi))
    Gp, Gf = rec
    xn = sr.basis.doflocs
    (ax, ay), (bx, by) = sr._unit_fields(Gp, Gf, xn)
    tn = np.hypot(Vx * ax + Vy * bx, Vx * ay + Vy * by)
    k = int(np.argmax(tn))
    elems = np.flatnonzero((sr.basis.element_dofs == k).any(axis=0))
    lat = _lattice()
    local = CellBasis(cm, ElementTriP2(), elements=elems, quadrature=(lat, np.full(lat.shape[1], 1.0 / lat.shape[1])),
                      dofs=sr.basis.dofs)
    gp = np.array([np.asarray(interpolate(local, Gp[i])) for i in range(2)])
    gf = np.array([np.asarray(interpolate(local, Gf[i])) for i in range(2)])
    xl = np.asarray(local.global_coordinates())
    (ax, ay), (bx, by) = sr._unit_fields(gp, gf, xl)
    ti = np.hypot(Vx * ax + Vy * bx, Vx * ay + Vy * by)
    xi = xl

    fb = _boundary_basis(cm, sm.boundary_facets, "sample")
    (cx, cy), (dx, dy) = sr.unit_stresses_at(fb)
    tbx, tby = Vx * cx + Vy * dx, Vx * cy + Vy * dy
    tb = np.hypot(tbx, tby)
    xb = np.asarray(fb.global_coordinates())
    n = np.asarray(fb.normals)
    i_in = np.unravel_index(int(np.argmax(ti)), ti.shape)
    i_b = np.unravel_index(int(np.argmax(tb)), tb.shape)
    if tb[i_b] >= ti[i_in]:
        val, at, on_b = float(tb[i_b]), (float(xb[0][i_b]) + xc, float(xb[1][i_b]) + yc), True
    else:
        val, at, on_b = float(ti[i_in]), (float(xi[0][i_in]) + xc, float(xi[1][i_in]) + yc), False
    normal = float(np.max(np.abs(tbx * n[0] + tby * n[1]))) / val if val else 0.0
    if not moment:
        return ShearPeak(val, at, on_b, normal, float("nan"))
    # moment of the combined field about the shear centre (vanishes by construction of the centre)
    tx, ty = sr.stress(Vx, Vy)
    M = float(forms.shear_moment.assemble(sr.basis, tx=tx, ty=ty))
    sx, sy = sr.centre[0] - xc, sr.centre[1] - yc
    M_sc = M - (sx * Vy - sy * Vx)
    V = float(np.hypot(Vx, Vy)) or 1.0
    return ShearPeak(val, at, on_b, normal, M_sc / (V * np.sqrt(sr.area)))

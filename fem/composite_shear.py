"""Transverse shear of a bonded composite section: Saint-Venant flexure with the moduli per region.

Formulation (axes through the modulus-weighted centroid; E, G, ν piecewise constant; EIxx = ∫E y² dA,
EIyy = ∫E x² dA, EIxy = ∫E xy dA and D* = EIxx·EIyy − EIxy²):

- Ψ (force Vx): ∇·(G(∇Ψ − ν d*)) = −E (EIxx·x − EIxy·y), d* = (EIxx(x²−y²)/2 − EIxy·xy, EIxx·xy + EIxy(x²−y²)/2);
- Φ (force Vy): ∇·(G(∇Φ − ν h*)) = −E (EIyy·y − EIxy·x), h* = (EIyy·xy − EIxy(x²−y²)/2, −EIxy·xy − EIyy(x²−y²)/2);
- τ = (τzx, τzy) = (Vx/D*)·G(∇Ψ − ν d*) + (Vy/D*)·G(∇Φ − ν h*): the stresses of forces through the
  shear centre. Traction-free outer boundary and holes, τ·n continuous across every interface
  (natural conditions of the weak forms :func:`fem.forms.composite_shear_load_x` / ``_y``), Ψ and Φ
  continuous (the warping of bonded regions).

Where it comes from: the Saint-Venant flexure problem of a cantilever loaded at its end (Timoshenko &
Goodier, Theory of Elasticity, 3rd ed., ch. 12), whose displacement assumptions are kept: the normal
stress is the transformed-section σ = E·ε (plane sections, ε linear), σx = σy = τxy = 0, the lateral
strains are −ν ε, and τ = G(∇w + ∂u⊥/∂z) with the warping w. The equilibrium along the bar gives the
divergence of τ above; ∂u⊥/∂z gives the ν-terms. With one material it is exactly fem/shear.py's
formulation (Pilkey, Analysis and Design of Elastic Beams, Wiley 2002, ch. 6): Ψ* = E·Ψ and
τ = (Vx/Δ)(∇Ψ − d) with Δ = 2(1 + ν)(IxxIyy − Ixy²), since E/G = 2(1 + ν). With equal Poisson's
ratios in all regions the lateral strains agree across the interfaces and the assumptions hold exactly
(no in-plane stresses); with unequal ratios each region takes its own ν and the in-plane interface
stresses that the mismatch causes are left out (the transformed section makes the same assumption).
Not modelled: slip or a compliant bond layer, and any load applied other than at the bar's end
(distributed loads change the interior solution by a small self-equilibrated term, as for one material).

Peaks per region: on the outer boundary and holes, and on both sides of every interface (each read
from the region's own elements), and inside (the flexure stress is not harmonic: its peak may be
inside, at the centre of a round bar), on a lattice of every element of the region.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
from skfem import Basis, CellBasis, ElementTriP2, condense

from . import forms
from .bases import interpolate
from .composite import CompositeMesh, RegionPeak, WeightedProperties, _at_points, _facet_stresses, _per_element
from .linalg import solve_spd


def _lattice(n: int) -> np.ndarray:
    """Reference-triangle points of an n-division lattice, vertices and edges included."""
    return np.array([(i / n, j / n) for i in range(n + 1) for j in range(n + 1 - i)]).T


#: Divisions of the lattice each element is read on for the interior peak (the P2 field's gradient
#: is linear on a straight element, so its largest value lies on the lattice's vertices there).
LATTICE = 6


@dataclass
class CompositeShear:
    """The two shear functions and what follows from them (unit forces through the shear centre)."""

    centroid: tuple  # modulus-weighted centroid (geometry coordinates) [m]
    centre: tuple  # shear centre [m]
    psi: np.ndarray = field(repr=False)
    phi: np.ndarray = field(repr=False)
    E: np.ndarray = field(repr=False)  # per region, scaled by the reference modulus
    G: np.ndarray = field(repr=False)
    nu: np.ndarray = field(repr=False)
    EI: tuple = (0.0, 0.0, 0.0)  # scaled (EIxx, EIyy, EIxy)
    dofs: int = 0
    resultant_residual: dict = field(default_factory=dict)  # per unit force: ∫τ − V

    def unit_stresses(self, x, grad_psi, grad_phi, region):
        """((τx, τy) for Vx = 1, (τx, τy) for Vy = 1) at points ``x`` (geometry coordinates), from the
        gradients of Ψ and Φ there and the region of each point."""
        X, Y = np.asarray(x[0]) - self.centroid[0], np.asarray(x[1]) - self.centroid[1]
        a, b, c = self.EI
        D = a * b - c * c
        g, v = self.G[region], self.nu[region]
        d0 = a * (X**2 - Y**2) / 2 - c * X * Y
        d1 = a * X * Y + c * (X**2 - Y**2) / 2
        h0 = b * X * Y - c * (X**2 - Y**2) / 2
        h1 = -c * X * Y - b * (X**2 - Y**2) / 2
        return ((g * (grad_psi[0] - v * d0) / D, g * (grad_psi[1] - v * d1) / D),
                (g * (grad_phi[0] - v * h0) / D, g * (grad_phi[1] - v * h1) / D))

    def stress(self, x, grad_psi, grad_phi, region, Vx: float, Vy: float):
        (ax, ay), (bx, by) = self.unit_stresses(x, grad_psi, grad_phi, region)
        return np.array([Vx * ax + Vy * bx, Vx * ay + Vy * by])


def composite_shear(cm: CompositeMesh, E, G, nu, props: WeightedProperties) -> CompositeShear:
    """Both shear functions on ``cm`` with E [Pa], G [Pa] and ν of each region, about the weighted
    centroid of ``props`` (from :func:`fem.composite.weighted_properties` with the same E)."""
    E, G, nu = (np.asarray(v, float) for v in (E, G, nu))
    ref = float(np.max(E))  # τ is homogeneous of degree 0 in the moduli: solve with E/E_ref
    e, g = E / ref, G / ref
    EI = (props.EIxx / ref, props.EIyy / ref, props.EIxy / ref)
    cx, cy = props.centroid
    basis = Basis(cm.mesh.translated((-cx, -cy)), ElementTriP2(), intorder=4)
    ce, cg, cn = (_at_points(basis, _per_element(cm, v)) for v in (e, g, nu))
    K = forms.weighted_laplace.assemble(basis, c=cg)
    kw = dict(e=ce, g=cg, nu=cn, EIxx=EI[0], EIyy=EI[1], EIxy=EI[2])
    fx = forms.composite_shear_load_x.assemble(basis, **kw)
    fy = forms.composite_shear_load_y.assemble(basis, **kw)
    psi, phi = np.zeros(basis.N), np.zeros(basis.N)
    Kc, _, _, I = condense(K, fx, D=np.array([0]))  # one DOF fixed: the functions are defined up to a constant
    U = solve_spd(Kc, np.column_stack([fx[I], fy[I]]))
    psi[I], phi[I] = U[:, 0], U[:, 1]
    out = CompositeShear((cx, cy), (0.0, 0.0), psi, phi, e, g, nu, EI, int(basis.N))
    # unit fields at the quadrature points (the translated mesh: x there is centroidal)
    xq = np.asarray(basis.global_coordinates())
    reg = np.repeat(cm.region_of[:, None], xq.shape[-1], axis=1)
    (ax, ay), (bx, by) = out.unit_stresses(xq + np.array([cx, cy])[:, None, None], interpolate(basis, psi).grad,
                                           interpolate(basis, phi).grad, reg)
    Mx = float(forms.shear_moment.assemble(basis, tx=ax, ty=ay))  # Vx = 1 acting at y = ys gives −ys
    My = float(forms.shear_moment.assemble(basis, tx=bx, ty=by))  # Vy = 1 acting at x = xs gives xs
    out.centre = (My + cx, -Mx + cy)
    out.resultant_residual = {
        "Vx": [float(forms.field_integral.assemble(basis, t=ax)) - 1.0, float(forms.field_integral.assemble(basis, t=ay))],
        "Vy": [float(forms.field_integral.assemble(basis, t=bx)), float(forms.field_integral.assemble(basis, t=by)) - 1.0],
    }
    return out


@dataclass
class ShearRegionPeak(RegionPeak):
    place: str = ""  # "boundary", "interface" or "inside"
    interface: float | None = None  # the largest |τ| on the region's interfaces (its own side), or None


def shear_stress_peaks(cm: CompositeMesh, sh: CompositeShear, Vx: float, Vy: float) -> list:
    """Per region: the largest |τ| of the forces (Vx, Vy) through the shear centre [Pa], where, and
    whether on the outer boundary or a hole, on an interface (from the region's own side), or inside;
    and the largest on the region's interfaces alone."""
    n_regions = len(sh.E)
    best = [ShearRegionPeak(-math.inf, (math.nan, math.nan), "") for _ in range(n_regions)]

    def take(mag, x, reg, place):
        for k in range(n_regions):
            m = np.where(reg == k, mag, -np.inf)
            i = np.unravel_index(int(np.argmax(m)), m.shape)
            if m[i] > best[k].value:
                best[k] = ShearRegionPeak(float(m[i]), (float(x[0][i]), float(x[1][i])), place)

    def read(u_psi, u_phi, facets, side):
        x, gp, reg = _facet_stresses(cm, u_psi, facets, side, lambda x_, g_, t_: g_)
        _, gf, _ = _facet_stresses(cm, u_phi, facets, side, lambda x_, g_, t_: g_)
        reg = np.broadcast_to(np.asarray(reg)[:, None], x.shape[1:])
        return x, np.hypot(*sh.stress(x, gp, gf, reg, Vx, Vy)), reg

    x, mag, reg = read(sh.psi, sh.phi, cm.mesh.boundary_facets(), None)
    take(mag, x, reg, "boundary")
    inter = [None] * n_regions
    for side in (0, 1) if len(cm.interfaces) else ():
        x, mag, reg = read(sh.psi, sh.phi, cm.interfaces, side)
        take(mag, x, reg, "interface")
        for k in range(n_regions):
            if np.any(reg == k):
                m = float(np.max(mag[reg == k]))
                inter[k] = m if inter[k] is None else max(inter[k], m)
    lat = _lattice(LATTICE)
    cb = CellBasis(cm.mesh, ElementTriP2(), quadrature=(lat, np.full(lat.shape[1], 1.0 / lat.shape[1])))
    x = np.asarray(cb.global_coordinates())
    reg = np.repeat(cm.region_of[:, None], x.shape[-1], axis=1)
    mag = np.hypot(*sh.stress(x, interpolate(cb, sh.psi).grad, interpolate(cb, sh.phi).grad, reg, Vx, Vy))
    take(mag, x, reg, "inside")  # an element's lattice: taken only where it beats the boundary reads
    for k, b in enumerate(best):
        b.interface = inter[k]
    return best


def shear_stress_at(cm: CompositeMesh, sh: CompositeShear, points, Vx: float, Vy: float) -> np.ndarray:
    """(τzx, τzy) at points (2, n) inside the section (each read from the element that holds it; NaN
    outside the mesh)."""
    from .probe import probe  # noqa: PLC0415

    pts = np.asarray(points, float).reshape(2, -1)
    _, gp = probe(cm.mesh, sh.psi, pts)
    _, gf = probe(cm.mesh, sh.phi, pts)
    from .probe import _locate  # noqa: PLC0415

    hits = [_locate(cm.mesh, pts[:, i]) for i in range(pts.shape[1])]
    reg = np.array([0 if h is None else cm.region_of[h[0]] for h in hits])
    return sh.stress(pts, gp, gf, reg, Vx, Vy)  # NaN where a point lies outside every element

"""Composite sections: bonded regions of different materials in one cross-section.

Each region is a :class:`~fem.geometry.Section` of its own (primitives added and cut) carrying the
index of its material; the regions are fragmented together by OpenCASCADE so that the mesh is
conforming across every interface (bonded: displacements continuous), meshed with curved 6-node
triangles, and every element knows its region.

Torsion (Saint-Venant, per unit twist rate θ; G piecewise constant):

- warping function ω: ∫ G ∇ω·∇v dA = ∫ G (y, −x)·∇v dA (one DOF fixed), the torsional rigidity
  GJ = ∫ G (x² + y² + x ∂ω/∂y − y ∂ω/∂x) dA, an upper bound (minimum potential energy), and the stresses
  τ = Gθ (∂ω/∂x − y, ∂ω/∂y + x);
- stress function φ: ∫ (1/G) ∇φ·∇v dA = ∫ 2 v dA, φ = 0 on the outer boundary and an unknown constant
  on each hole (the circulation condition, as for one material), GJ = 2∫φ dA + 2 Σ cₖAₖ, a lower bound
  (minimum complementary energy), and τ = θ (∂φ/∂y, −∂φ/∂x).

The two bracket the exact GJ of the meshed domain (Timoshenko & Goodier, Theory of Elasticity, 3rd ed.,
chapter 10, for the two energy principles; the weighted forms follow from the same derivation with G
inside the integrals). Within one homogeneous region |τ| takes its largest value on that region's
boundary (outer surface, hole or interface), so peaks are read there from the region's own elements,
on both sides of every interface.

Axial force and bending: the modulus-weighted (transformed) section, EA, the modulus-weighted centroid,
EIxx, EIyy, EIxy about it; σ = E·ε with ε = N/EA + the unsymmetric-bending curvature terms (plane
sections). This is the engineering theory of composite bars (equal Poisson's ratios; a mismatch of ν
adds interface stresses this does not model).
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
from skfem import Basis, ElementTriP2, FacetBasis, condense

from . import forms
from .bases import interpolate
from .errors import InputError
from .geometry import Section
from .gmshload import initialize as initialize_gmsh, load_gmsh
from .linalg import solve_spd
from .mesh import BOUNDARY_POINTS, boundary_mapping, gmsh_p2_mesh, normalised_section, section_frame
from .torsion import _hole_prolongation, enclosed_areas


@dataclass(frozen=True)
class Region:
    """One bonded region: its geometry and the index of its material (into the caller's list)."""

    section: Section
    material: int
    label: str = ""


@dataclass
class CompositeMesh:
    mesh: object  # skfem MeshTri2 in metres, boundaries named outer, hole1, ...
    region_of: np.ndarray  # (elements,) region index of every element
    interfaces: np.ndarray  # interior facets between two regions
    hole_names: list
    fineness: float
    size: float  # the characteristic length used for the element size [m]
    info: dict = field(default_factory=dict)

    @property
    def dofs(self) -> int:
        return int(self.mesh.p.shape[1])


def mesh_composite(regions: list[Region], fineness: float = 1.0, across: float = 20.0,
                   per_circle: float = 48.0, field_name: str = "section.regions") -> CompositeMesh:
    """Fragment the regions into one conforming section and mesh it (order 2). Regions must not
    overlap (refused, naming both); they may touch or leave holes."""
    if not regions:
        raise InputError(field_name, [], "a composite section needs at least one region")
    whole = Section(tuple(s for r in regions for s in r.section.steps if s[0] == "add"), kind="custom")
    frame = section_frame(whole)
    gmsh = load_gmsh()
    initialize_gmsh(gmsh)
    gmsh.option.setNumber("General.Terminal", 0)
    gmsh.option.setNumber("General.NumThreads", 1)
    gmsh.clear()
    try:
        gmsh.model.add("composite")
        occ = gmsh.model.occ
        tags = []
        for r in regions:
            unit, _ = normalised_section(r.section, frame)
            tags.append(unit.build(gmsh))
        objects = [(2, t) for ts in tags for t in ts]
        owner = [k for k, ts in enumerate(tags) for _ in ts]
        _, pieces = occ.fragment(objects, [])
        occ.synchronize()
        region_pieces: dict[int, set] = {k: set() for k in range(len(regions))}
        claimed: dict[int, int] = {}
        for k, out in zip(owner, pieces):
            for dim, t in out:
                if dim != 2:
                    continue
                if t in claimed and claimed[t] != k:
                    a, b = sorted((claimed[t], k))
                    raise InputError(f"{field_name}[{b}]", regions[b].label or b,
                                     f"overlaps {field_name}[{a}]: bonded regions may touch, not overlap")
                claimed[t] = k
                region_pieces[k].add(t)
        for k, ps in region_pieces.items():
            gmsh.model.addPhysicalGroup(2, sorted(ps), name=f"region{k}")
        area = sum(occ.getMass(2, t) for t in claimed)
        perim = sum(occ.getMass(1, abs(c[1])) for c in gmsh.model.getBoundary([(2, t) for t in claimed],
                                                                               combined=True, oriented=False))
        L = 4.0 * area / perim  # hydraulic diameter of the whole section, in the frame
        h = L / (across * fineness)
        gmsh.option.setNumber("Mesh.MeshSizeMax", h)
        gmsh.option.setNumber("Mesh.MeshSizeMin", h / 64.0)
        gmsh.option.setNumber("Mesh.MeshSizeFromCurvature", per_circle * fineness)
        gmsh.option.setNumber("Mesh.MeshSizeExtendFromBoundary", 1)
        gmsh.option.setNumber("Mesh.ElementOrder", 2)
        gmsh.option.setNumber("Mesh.SecondOrderLinear", 0)
        gmsh.option.setNumber("Mesh.HighOrderOptimize", 0)
        gmsh.option.setNumber("Mesh.Algorithm", 6)
        gmsh.model.mesh.generate(2)
        mesh, _facets_on = gmsh_p2_mesh(gmsh, frame.from_frame, field_name)
        all_tags, _ = gmsh.model.mesh.getElementsByType(9)
        position = {int(t): i for i, t in enumerate(all_tags)}
        region_of = np.full(len(all_tags), -1, dtype=np.int64)
        for k, ps in region_pieces.items():
            for t in ps:
                etags, _ = gmsh.model.mesh.getElementsByType(9, t)
                region_of[[position[int(e)] for e in etags]] = k
    except InputError:
        raise
    except Exception as exc:  # gmsh raises plain Exceptions with its own message
        raise InputError(field_name, None, f"the regions could not be built or meshed ({str(exc).splitlines()[0]})") from None
    finally:
        gmsh.clear()
    if np.any(region_of < 0):
        raise InputError(field_name, None, "some elements belong to no region")
    mesh, hole_names = _name_loops(mesh)
    f2t = mesh.f2t
    inner = np.flatnonzero(f2t[1] >= 0)
    interfaces = inner[region_of[f2t[0, inner]] != region_of[f2t[1, inner]]]
    return CompositeMesh(mesh, region_of, interfaces, hole_names, fineness, L * frame.scale,
                         {"elements": int(mesh.t.shape[1])})


def _name_loops(mesh):
    """Name the boundary loops: the one reaching farthest from the centre of the nodes is ``outer``,
    the others ``hole1``, ``hole2``, ... (connected chains of boundary facets)."""
    bf = mesh.boundary_facets()
    parent = {}

    def find(a):
        while parent.setdefault(a, a) != a:
            parent[a] = parent[parent[a]]
            a = parent[a]
        return a

    for f in bf:
        a, b = (int(v) for v in mesh.facets[:, f])
        parent[find(a)] = find(b)
    groups: dict[int, list] = {}
    for f in bf:
        groups.setdefault(find(int(mesh.facets[0, f])), []).append(int(f))
    c = mesh.p.mean(axis=1)
    reach = {g: float(np.max(np.hypot(*(mesh.p[:, mesh.facets[:, fs].ravel()] - c[:, None])))) for g, fs in groups.items()}
    order = sorted(groups, key=lambda g: -reach[g])
    names = {"outer": np.sort(np.array(groups[order[0]], dtype=np.int64))}
    for k, g in enumerate(order[1:], 1):
        names[f"hole{k}"] = np.sort(np.array(groups[g], dtype=np.int64))
    return mesh.with_boundaries(names), [f"hole{k}" for k in range(1, len(order))]


# ----------------------------------------------------------------------------- per-element moduli


def _per_element(cm: CompositeMesh, values) -> np.ndarray:
    v = np.asarray(values, float)
    return v[cm.region_of]


def _at_points(basis, per_element: np.ndarray) -> np.ndarray:
    """A piecewise-constant field at every quadrature point of a cell basis on all elements:
    (elements, points)."""
    return np.repeat(np.asarray(per_element, float)[:, None], basis.X.shape[-1], axis=1)


# ----------------------------------------------------------------------------- section properties


@dataclass
class WeightedProperties:
    """Modulus-weighted (transformed) section properties, SI: EA [N], centroid [m], EI about it [N·m²]."""

    EA: float
    centroid: tuple
    EIxx: float
    EIyy: float
    EIxy: float
    area: float
    region_areas: list

    @property
    def principal(self) -> tuple[float, float, float]:
        """(EI1, EI2, angle of the first principal axis from x [deg])."""
        a, b, c = self.EIxx, self.EIyy, self.EIxy
        m, d = (a + b) / 2, math.hypot((a - b) / 2, c)
        return m + d, m - d, math.degrees(0.5 * math.atan2(-2 * c, b - a)) if (a != b or c) else 0.0

    def strain(self, N: float, Mx: float, My: float, x, y):
        """ε at (x, y) (about the weighted centroid) under N and the moment vector (Mx, My): plane sections,
        with the sign convention of classic.stress.unsymmetric_bending_stress."""
        dx, dy = np.asarray(x) - self.centroid[0], np.asarray(y) - self.centroid[1]
        D = self.EIxx * self.EIyy - self.EIxy**2
        return N / self.EA + (-(My * self.EIxx + Mx * self.EIxy) * dx + (Mx * self.EIyy + My * self.EIxy) * dy) / D


def weighted_properties(cm: CompositeMesh, E) -> WeightedProperties:
    basis = Basis(cm.mesh, ElementTriP2(), intorder=4)
    c = _at_points(basis, _per_element(cm, E))
    one = np.ones_like(c)
    EA = float(forms.weighted_area.assemble(basis, c=c))
    cx = float(forms.weighted_first_moment_x.assemble(basis, c=c)) / EA
    cy = float(forms.weighted_first_moment_y.assemble(basis, c=c)) / EA
    cbasis = Basis(cm.mesh.translated((-cx, -cy)), ElementTriP2(), intorder=4)
    EIxx = float(forms.weighted_second_moment_xx.assemble(cbasis, c=c))
    EIyy = float(forms.weighted_second_moment_yy.assemble(cbasis, c=c))
    EIxy = float(forms.weighted_product_moment.assemble(cbasis, c=c))
    areas = [float(forms.weighted_area.assemble(basis, c=np.where((cm.region_of == k)[:, None], one, 0.0)))
             for k in range(int(cm.region_of.max()) + 1)]
    return WeightedProperties(EA, (cx, cy), EIxx, EIyy, EIxy, float(sum(areas)), areas)


# ----------------------------------------------------------------------------- torsion


@dataclass
class RegionPeak:
    value: float  # |τ| per unit torque [1/m³]
    at: tuple


@dataclass
class CompositeTorsion:
    GJ: float  # stress-function rigidity, a lower bound [N·m²]
    GJ_warping: float  # warping-function rigidity, an upper bound [N·m²]
    peaks: list  # per region: RegionPeak of the stress-function stresses (per unit torque)
    peaks_warping: list  # per region, from the warping function
    interface_peak: list  # per region: the largest |τ| on its interfaces (per unit torque), or None
    dofs: int
    phi: np.ndarray
    omega: np.ndarray


def _facet_stresses(cm: CompositeMesh, u: np.ndarray, facets: np.ndarray, side: int | None, stress):
    """Points, stress vectors and the owning elements' regions on ``facets`` (from ``side``)."""
    kw = {} if side is None else {"side": side}
    q = (BOUNDARY_POINTS[None, :], np.full(len(BOUNDARY_POINTS), 1.0 / len(BOUNDARY_POINTS)))
    fb = FacetBasis(cm.mesh, ElementTriP2(), facets=facets, quadrature=q, mapping=boundary_mapping(cm.mesh), **kw)
    x = np.asarray(fb.global_coordinates())
    g = interpolate(fb, u).grad
    return x, stress(x, g, fb.tind), cm.region_of[fb.tind]


def _peaks(cm: CompositeMesh, u: np.ndarray, stress, n_regions: int):
    """Per region: the largest |τ| on its boundary and interfaces, and on its interfaces alone."""
    best = [RegionPeak(-math.inf, (math.nan, math.nan)) for _ in range(n_regions)]
    inter = [None] * n_regions
    sets = [(cm.mesh.boundary_facets(), None, False)]
    if len(cm.interfaces):
        sets += [(cm.interfaces, 0, True), (cm.interfaces, 1, True)]
    for facets, side, is_interface in sets:
        x, t, reg = _facet_stresses(cm, u, facets, side, stress)
        mag = np.hypot(t[0], t[1])
        for k in range(n_regions):
            m = np.where((reg == k)[:, None], mag, -np.inf)
            i, j = np.unravel_index(int(np.argmax(m)), m.shape)
            if m[i, j] > best[k].value:
                best[k] = RegionPeak(float(m[i, j]), (float(x[0, i, j]), float(x[1, i, j])))
            if is_interface and np.isfinite(m[i, j]) and (inter[k] is None or m[i, j] > inter[k]):
                inter[k] = float(m[i, j])
    return best, inter


def composite_torsion(cm: CompositeMesh, G) -> CompositeTorsion:
    """Both torsion solutions on ``cm`` with the shear modulus ``G[k]`` of region k [Pa]."""
    G = np.asarray(G, float)
    n_regions = len(G)
    basis = Basis(cm.mesh, ElementTriP2(), intorder=4)
    Ge = _per_element(cm, G)
    cG = _at_points(basis, Ge)
    # --- warping function (origin at the mesh's origin; τ does not depend on it)
    K = forms.weighted_laplace.assemble(basis, c=cG)
    g = forms.weighted_warping_load.assemble(basis, c=cG)
    omega = np.zeros(basis.N)
    Kc, gc, _, I = condense(K, g, D=np.array([0]))
    omega[I] = solve_spd(Kc, gc)
    GJ_w = float(forms.weighted_warping_torsion_constant.assemble(basis, c=cG, omega=interpolate(basis, omega)))
    # --- stress function, one constant per hole
    K1 = forms.weighted_laplace.assemble(basis, c=1.0 / cG)
    f = forms.prandtl_load.assemble(basis)
    P, nfree = _hole_prolongation(basis, cm.hole_names)
    areas = enclosed_areas(cm.mesh, cm.hole_names)
    Kr = (P.T @ K1 @ P).tocsr()
    fr = P.T @ f
    fr[nfree:] += 2.0 * np.asarray(areas)
    ur = solve_spd(Kr, fr)
    phi = P @ ur
    consts = ur[nfree:]
    GJ = 2.0 * float(forms.integral_of.assemble(basis, u=interpolate(basis, phi))) + 2.0 * float(np.dot(consts, areas))

    def sf_stress(x, gphi, tind):  # τ per unit torque: θ = T/GJ
        return np.array([gphi[1], -gphi[0]]) / GJ

    def w_stress(x, gw, tind):
        Gp = G[cm.region_of[tind]][:, None]
        return np.array([Gp * (gw[0] - x[1]), Gp * (gw[1] + x[0])]) / GJ_w

    peaks, inter = _peaks(cm, phi, sf_stress, n_regions)
    peaks_w, _ = _peaks(cm, omega, w_stress, n_regions)
    return CompositeTorsion(GJ, GJ_w, peaks, peaks_w, inter, int(basis.N), phi, omega)


def normal_stress_peaks(cm: CompositeMesh, E, props: WeightedProperties, N: float, Mx: float, My: float):
    """Per region: (largest |σ|, where) on its boundary and interfaces, σ = E_k·ε (plane sections)."""
    E = np.asarray(E, float)
    zero = np.zeros(cm.mesh.p.shape[1])

    def sigma(x, _g, tind):
        s = E[cm.region_of[tind]][:, None] * props.strain(N, Mx, My, x[0], x[1])
        return np.array([s, np.zeros_like(s)])

    best, _ = _peaks(cm, zero, sigma, len(E))
    return best

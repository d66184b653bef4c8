"""Shafts of revolution on their meridian section (r, z): shoulders, grooves, cones.

A stress raiser along a shaft (a shoulder fillet, a ring groove) does not show in a cross-section;
it lives in the longitudinal section. For a body of revolution that is again a 2-D domain: the
meridian half-plane r ≥ 0, meshed here with gmsh's curved second-order triangles (the fillet and
groove arcs stay arcs) and solved with isoparametric P2 elements in three problems, each a weak
form in :mod:`fem.forms`:

* torsion, u_θ = r·ω(r, z) (:func:`fem.forms.axisym_torsion`), a twist between the end faces;
* axial load, axisymmetric elasticity (:func:`fem.forms.axisym_elasticity_n0`), an axial
  displacement between the end faces;
* bending, the first circumferential harmonic (:func:`fem.forms.axisym_elasticity_n1`), a relative
  rotation of the end faces (plane end faces, a pure moment).

The ends are loaded by the straight bar's own exact displacement (plane end faces, free
contraction), so they add no disturbance of their own; the model is long enough on both sides of
the feature for the feature's disturbance to die out, and :func:`solve_profile` checks it: the
surface stress on the smaller diameter, away from the feature, must be the elementary one
(:attr:`ProfileResult.far_field`). Peaks are read on the boundary (points along every facet of the
feature arcs), never at interior quadrature points. Force, moment and torque are taken from the
energy (½·load·end displacement = strain energy), so they converge at twice the rate of the stresses.

Coordinates: mesh x[0] = r, x[1] = z. SI throughout. Meshing is done in a scale-free frame (every
length divided by the smaller diameter), so a scaled shaft gets the same mesh.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
import scipy.sparse as sp
from skfem import CellBasis, ElementTriP2, ElementVector, FacetBasis, MeshTri2

from . import forms
from .bases import interpolate
from .errors import InputError
from .gmshload import initialize as initialize_gmsh, load_gmsh
from .linalg import solve_spd
from .mesh import BOUNDARY_POINTS, boundary_mapping, gmsh_p2_mesh, threshold_field

#: Elements along the smaller diameter at fineness 1 (global size d/ACROSS).
ACROSS = 6.0
#: Elements along a quarter turn of a feature arc at fineness 1.
PER_QUARTER_ARC = 8.0
#: Growth of the element size with the distance from a feature arc at fineness 1 (size per length).
GRADING = 0.3
#: Length of plain shaft kept on each side of a feature, in multiples of the larger diameter.
SIDE_LENGTH = 5.0

LOADS = ("torsion", "tension", "bending")


# ----------------------------------------------------------------------------- geometry


@dataclass(frozen=True)
class Piece:
    """One boundary curve of the meridian section: a line ``a -> b`` or an arc ``a -> b`` about
    ``centre`` (less than a half turn), with its name (``axis``, ``bore``, ``end0``, ``end1``,
    ``surface``, ``fillet``)."""

    a: tuple[float, float]
    b: tuple[float, float]
    name: str
    centre: tuple[float, float] | None = None


@dataclass(frozen=True)
class Profile:
    """The meridian section of a shaft of revolution, a closed counter-clockwise loop of pieces in
    the (r, z) plane, from the end face z = 0 up to z = ``length``.

    ``d`` is the smaller diameter at the feature (the nominal), ``bore`` the bore diameter (0 for a
    solid shaft), ``far`` the point on the surface where the elementary stress must hold, ``feature``
    the arcs' centres and radius (for the angle of the peak) and ``kind`` what it is."""

    pieces: tuple[Piece, ...]
    length: float
    d: float
    bore: float
    kind: str
    far: tuple[float, float]
    radius: float = 0.0
    centres: tuple[tuple[float, float], ...] = ()
    params: dict = field(default_factory=dict)


def _pos(field_name: str, value: float) -> float:
    if not (isinstance(value, (int, float)) and math.isfinite(value) and value > 0):
        raise InputError(field_name, value, "must be a positive length")
    return float(value)


def _bore(bore: float, d: float, field_name: str) -> float:
    if not (isinstance(bore, (int, float)) and math.isfinite(bore) and 0 <= bore < d):
        raise InputError(field_name, bore, "must be at least 0 and smaller than the smallest diameter")
    return float(bore)


def _close(outer: list[Piece], length: float, bore: float) -> tuple[Piece, ...]:
    """Add the end faces and the axis (or bore) to the outer pieces (which run from (R0, 0) up to
    (R1, length))."""
    ri = bore / 2
    r0 = outer[0].a[0]
    r1 = outer[-1].b[0]
    inner = "bore" if ri > 0 else "axis"
    return tuple([Piece((ri, 0.0), (r0, 0.0), "end0"), *outer,
                  Piece((r1, length), (ri, length), "end1"), Piece((ri, length), (ri, 0.0), inner)])


def straight_profile(d: float, length: float | None = None, bore: float = 0.0) -> Profile:
    """A plain round bar (or tube) of diameter ``d``: the exact-solution check of every solver."""
    d = _pos("d", d)
    bore = _bore(bore, d, "bore")
    length = _pos("length", length if length is not None else 2 * d)
    a = d / 2
    outer = [Piece((a, 0.0), (a, length), "surface")]
    return Profile(_close(outer, length, bore), length, d, bore, "straight", (a, length / 2))


def cone_profile(alpha: float, z1: float, z2: float) -> Profile:
    """A solid conical frustum r ≤ z·tan α, z1 ≤ z ≤ z2 (apex at the origin; the z = z1 face is the
    small end). Used for the exact cone solution of torsion. ``d`` is the small-end diameter."""
    if not (0 < alpha < math.pi / 2):
        raise InputError("alpha", alpha, "must be between 0 and 90 degrees (in radians)")
    z1, z2 = _pos("z1", z1), _pos("z2", z2)
    if z2 <= z1:
        raise InputError("z2", z2, "must be larger than z1")
    t = math.tan(alpha)
    # the loop is built in z' = z - z1 so that the end faces sit at 0 and length
    length = z2 - z1
    outer = [Piece((z1 * t, 0.0), (z2 * t, length), "surface")]
    p = Profile(_close(outer, length, 0.0), length, 2 * z1 * t, 0.0, "cone", ((z1 + z2) / 2 * t, length / 2),
                params={"alpha": alpha, "z1": z1, "z2": z2})
    return p


def shoulder_profile(d: float, D: float, radius: float, bore: float = 0.0,
                     side: float = SIDE_LENGTH) -> Profile:
    """A shoulder from diameter ``d`` (z < z0) up to ``D`` (z > z0) with a fillet of ``radius``
    tangent to the small cylinder and to the shoulder face. Field names follow the case file."""
    d, D, radius = _pos("d", d), _pos("D", D), _pos("fillet", radius)
    if D <= d:
        raise InputError("D", D, "must be larger than d at a shoulder")
    h = (D - d) / 2
    if radius > h * (1 + 1e-12):
        raise InputError("fillet", radius, f"must not exceed the shoulder height (D - d)/2 = {h:g}")
    bore = _bore(bore, d, "bore")
    a, b = d / 2, D / 2
    z0 = side * D
    length = 2 * side * D
    c = (a + radius, z0 - radius)
    outer = [Piece((a, 0.0), (a, z0 - radius), "surface"),
             Piece((a, z0 - radius), (a + radius, z0), "fillet", c),
             Piece((a + radius, z0), (b, z0), "surface"),
             Piece((b, z0), (b, length), "surface")]
    if radius >= h * (1 - 1e-12):  # the fillet reaches the larger diameter: no flat face left
        outer[1] = Piece((a, z0 - radius), (b, z0), "fillet", (b, z0 - radius))
        c = (b, z0 - radius)
        del outer[2]
    return Profile(_close(outer, length, bore), length, d, bore, "shoulder", (a, z0 / 2), radius, (c,),
                   params={"d": d, "D": D, "radius": radius, "at": z0, "h": h})


def groove_profile(D: float, depth: float, radius: float, width: float | None = None,
                   bore: float = 0.0, side: float = SIDE_LENGTH) -> Profile:
    """A U-groove in a shaft of diameter ``D``: ``depth`` below the surface, bottom corners of
    ``radius`` (a semicircular bottom when ``width`` = 2·radius, the default), parallel flanks."""
    D, depth, radius = _pos("D", D), _pos("depth", depth), _pos("radius", radius)
    width = 2 * radius if width is None else _pos("width", width)
    if depth >= D / 2:
        raise InputError("depth", depth, "must be smaller than the shaft radius")
    if radius > depth * (1 + 1e-12):
        raise InputError("radius", radius, "must not exceed the groove depth")
    if width < 2 * radius * (1 - 1e-12):
        raise InputError("width", width, "must be at least twice the bottom radius")
    d = D - 2 * depth
    bore = _bore(bore, d, "bore")
    R, rb = D / 2, D / 2 - depth
    z0 = side * D + width / 2
    length = 2 * z0
    zl, zr = z0 - width / 2, z0 + width / 2
    c1 = (rb + radius, zl + radius)
    c2 = (rb + radius, zr - radius)
    outer = [Piece((R, 0.0), (R, zl), "surface")]
    flank = depth > radius * (1 + 1e-12)
    if flank:
        outer.append(Piece((R, zl), (rb + radius, zl), "surface"))
    outer.append(Piece((rb + radius, zl), (rb, zl + radius), "fillet", c1))
    if zr - radius > zl + radius:
        outer.append(Piece((rb, zl + radius), (rb, zr - radius), "fillet"))
    outer.append(Piece((rb, zr - radius), (rb + radius, zr), "fillet", c2))
    if flank:
        outer.append(Piece((rb + radius, zr), (R, zr), "surface"))
    outer.append(Piece((R, zr), (R, length), "surface"))
    # the loop runs up the outer surface from z = 0; the pieces above are in that order
    return Profile(_close(outer, length, bore), length, d, bore, "groove", (R, zl / 2), radius, (c1, c2),
                   params={"D": D, "depth": depth, "radius": radius, "width": width, "at": z0, "d": d})


# ----------------------------------------------------------------------------- mesh


@dataclass
class MeridianMesh:
    """A curved P2 mesh of a :class:`Profile` with named boundaries (the piece names)."""

    mesh: MeshTri2
    profile: Profile
    fineness: float
    h: float

    def facets(self, name: str) -> np.ndarray:
        return self.mesh.boundaries.get(name, np.zeros(0, dtype=np.int64))


def mesh_profile(profile: Profile, fineness: float = 1.0, arc_fineness: float | None = None) -> MeridianMesh:
    """Mesh ``profile`` with gmsh order-2 triangles, finer along the feature arcs.

    Near the arcs the size is the fineness-1 field (:data:`PER_QUARTER_ARC` elements per quarter turn,
    growing by :data:`GRADING` per length away from them, up to the global ``d/ACROSS``) divided by
    ``fineness``, so two meshes of a study differ by the fineness ratio everywhere. ``arc_fineness``
    (at least ``fineness``) divides the arcs' field by a larger number than the global size (the finer
    meshes of a reference). (Keeping the fineness-1 size beyond 1.5-3 larger diameters from the feature
    was tried: it changed the factors by up to 5e-4 without converging, so the whole model is refined.)"""
    if not (math.isfinite(fineness) and fineness > 0):
        raise InputError("analysis.fineness", fineness, "must be a positive number")
    gmsh = load_gmsh()
    if not gmsh.isInitialized():
        initialize_gmsh(gmsh)
    gmsh.option.setNumber("General.Terminal", 0)
    gmsh.option.setNumber("General.NumThreads", 1)
    gmsh.clear()
    s = profile.d  # scale-free frame: lengths in units of the smaller diameter
    h = 1.0 / (ACROSS * fineness)
    try:
        gmsh.model.add("meridian")
        g = gmsh.model.geo
        pts: dict[tuple[float, float], int] = {}

        def point(xy):
            key = (round(xy[0] / s, 12), round(xy[1] / s, 12))
            if key not in pts:
                pts[key] = g.addPoint(key[0], key[1], 0.0)
            return pts[key]

        curves, names = [], {}
        for pc in profile.pieces:
            pa, pb = point(pc.a), point(pc.b)
            if pc.centre is None:
                tag = g.addLine(pa, pb)
            else:
                tag = g.addCircleArc(pa, point(pc.centre), pb)
            curves.append(tag)
            names.setdefault(pc.name, []).append(tag)
        loop = g.addCurveLoop(curves)
        surf = g.addPlaneSurface([loop])
        g.synchronize()
        for name, tags in names.items():
            gmsh.model.addPhysicalGroup(1, tags, name=name)
        gmsh.model.addPhysicalGroup(2, [surf], name="meridian")
        f = gmsh.model.mesh.field
        gmsh.option.setNumber("Mesh.MeshSizeMax", h)
        gmsh.option.setNumber("Mesh.MeshSizeMin", 0.0)
        gmsh.option.setNumber("Mesh.MeshSizeFromPoints", 0)
        gmsh.option.setNumber("Mesh.MeshSizeExtendFromBoundary", 0)
        gmsh.option.setNumber("Mesh.MeshSizeFromCurvature", 0)
        if "fillet" in names and profile.radius > 0:
            rho = profile.radius / s
            h1 = 1.0 / ACROSS
            hmin1 = min(h1, 0.5 * math.pi * rho / PER_QUARTER_ARC)
            # the fineness-1 size field divided by the fineness everywhere (the distances are those of
            # fineness 1), so that the meshes of a study are refined by the same ratio everywhere
            fa = fineness if arc_fineness is None else max(arc_fineness, fineness)
            th = threshold_field(f, hmin1 / fa, h, 0.25 * rho, 0.25 * rho + (h - hmin1 / fa) * fa / GRADING,
                                 curves=names["fillet"], sampling=100)
            f.setAsBackgroundMesh(th)
        gmsh.option.setNumber("Mesh.ElementOrder", 2)
        gmsh.option.setNumber("Mesh.SecondOrderLinear", 0)
        gmsh.option.setNumber("Mesh.HighOrderOptimize", 0)
        gmsh.option.setNumber("Mesh.Algorithm", 6)
        gmsh.model.mesh.generate(2)
        mesh = _to_skfem(gmsh, names, s)
    except InputError:
        raise
    except Exception as exc:  # gmsh raises plain Exceptions with its own message
        raise InputError("shaft", profile.kind, f"the meridian section could not be meshed ({str(exc).splitlines()[0]})") from None
    finally:
        gmsh.clear()
    return MeridianMesh(mesh, profile, fineness, h * s)


def _to_skfem(gmsh, names: dict[str, list[int]], scale: float) -> MeshTri2:
    mesh, facets_on = gmsh_p2_mesh(gmsh, lambda xy: xy * scale, "shaft")
    named = {name: np.unique(np.array([f for ctag in ctags for f in facets_on(ctag)], dtype=np.int64))
             for name, ctags in names.items()}
    if sum(len(v) for v in named.values()) != len(mesh.boundary_facets()):
        raise InputError("shaft", None, "could not match every boundary facet to a boundary curve")
    return mesh.with_boundaries(named)


# ----------------------------------------------------------------------------- solve


@dataclass(frozen=True)
class Peak:
    """A boundary peak: value [Pa], where (r, z) [m], and the angle [deg] around the feature arc
    (shoulder: 0 where the fillet leaves the smaller diameter, 90 at the shoulder face; groove: 0 at
    the groove bottom, negative towards z = 0)."""

    value: float
    r: float
    z: float
    angle: float | None


@dataclass
class ProfileResult:
    """One load case on one mesh. ``load`` is the end force [N], moment [N·m] or torque [N·m]
    carried; ``nominal`` the elementary stress on the smaller diameter d for that load [Pa];
    ``kt`` = peak max-principal stress (torsion: peak shear stress) / nominal. ``peak_vm`` the von
    Mises peak; ``far_field`` = {"fem", "exact"} surface stress on the small diameter away from the
    feature (the model-length check), ``points`` the boundary sample points (r, z) with their
    stresses for maps."""

    load_case: str
    load: float
    nominal: float
    peak: Peak
    peak_vm: Peak
    kt: float
    far_field: dict
    dofs: int
    h: float
    points: dict = field(default_factory=dict)
    basis: object = field(default=None, repr=False)  # the P2 basis of the solution
    x: np.ndarray | None = field(default=None, repr=False)  # its nodal values


def nominal_stress(load_case: str, d: float, bore: float, load: float) -> float:
    """Elementary stress on the outer surface of diameter ``d`` (bore ``bore``):
    4P/(π(d²−di²)), 32Md/(π(d⁴−di⁴)), 16Td/(π(d⁴−di⁴))."""
    if load_case == "tension":
        return 4 * load / (math.pi * (d**2 - bore**2))
    if load_case == "bending":
        return 32 * load * d / (math.pi * (d**4 - bore**4))
    return 16 * load * d / (math.pi * (d**4 - bore**4))


def _solve_constrained(K, f, fixed: np.ndarray, values: np.ndarray, T=None) -> np.ndarray:
    """Solve K x = f with x[fixed] = values; with a constraint map T (x = T y) the unknowns are y."""
    if T is not None:
        K = (T.T @ K @ T).tocsr()
        f = T.T @ f
    n = K.shape[0]
    x = np.zeros(n)
    x[fixed] = values
    free = np.setdiff1d(np.arange(n), fixed)
    rhs = f[free] - K[free][:, fixed] @ x[fixed]
    x[free] = solve_spd(K[free][:, free].tocsr(), rhs)
    return x if T is None else T @ x


def _rz_of(basis, dofs):
    return basis.doflocs[:, dofs]


def solve_profile(mm: MeridianMesh, load_case: str, E: float = 2.0e11, nu: float = 0.3) -> ProfileResult:
    """Solve one load case on the meridian mesh; the result is per unit nominal stress scale-free
    (Kt does not depend on the size of the end displacement)."""
    if load_case not in LOADS:
        raise InputError("load", load_case, f"must be one of {', '.join(LOADS)}")
    mesh, prof = mm.mesh, mm.profile
    L = prof.length
    G = E / (2 * (1 + nu))
    inner = "bore" if prof.bore > 0 else "axis"
    e0, e1 = mm.facets("end0"), mm.facets("end1")
    if load_case == "torsion":
        delta = 1.0 / (G * prof.d)  # any twist: Kt is a ratio
        basis, K, x = torsion_field(mm, G, lambda r, z: np.where(z > L / 2, delta, 0.0))
        load = float(x @ (K @ x)) / delta
    elif load_case == "tension":
        basis = CellBasis(mesh, ElementVector(ElementTriP2(), 2))
        K = forms.axisym_elasticity_n0.assemble(basis, E=E, nu=nu)
        uz0 = basis.get_dofs(e0).all("u^2")
        uz1 = basis.get_dofs(e1).all("u^2")
        delta = L / E * 1e6  # any stretch
        fixed = [uz0, uz1]
        vals = [np.zeros(len(uz0)), np.full(len(uz1), delta)]
        if inner == "axis":
            ur_axis = basis.get_dofs(mm.facets("axis")).all("u^1")
            fixed.append(ur_axis)
            vals.append(np.zeros(len(ur_axis)))
        x = _solve_constrained(K, np.zeros(K.shape[0]), np.concatenate(fixed), np.concatenate(vals))
        load = float(x @ (K @ x)) / delta
    else:
        basis = CellBasis(mesh, ElementVector(ElementTriP2(), 3))
        K = forms.axisym_elasticity_n1.assemble(basis, E=E, nu=nu)
        n = K.shape[0]
        kappa = 1e6 / (E * prof.d)  # any curvature
        zm = L / 2
        uz0 = basis.get_dofs(e0).all("u^3")
        uz1 = basis.get_dofs(e1).all("u^3")
        T = None
        if inner == "axis":
            ax = basis.get_dofs(mm.facets("axis"))
            ur, ut, uz = ax.all("u^1"), ax.all("u^2"), ax.all("u^3")
            ur, ut = _match(basis, ur, ut)
            # regularity on the axis: U_θ = −U_r (x = T y, y without the U_θ axis unknowns)
            keep = np.setdiff1d(np.arange(n), ut)
            col = np.full(n, -1, dtype=np.int64)
            col[keep] = np.arange(len(keep))
            rows = np.concatenate([keep, ut])
            cols = np.concatenate([col[keep], col[ur]])
            data = np.concatenate([np.ones(len(keep)), -np.ones(len(ut))])
            T = sp.csr_matrix((data, (rows, cols)), shape=(n, len(keep)))
            # one point fixed sideways (the rigid translation): U_r = 0 on the axis at z = 0
            z_ur = basis.doflocs[1, ur]
            pin = ur[np.argmin(z_ur)]
            fixed_full = [uz0, uz1, uz, np.array([pin])]
        else:
            # a tube: pin the translation at the bore's first node instead
            bo = basis.get_dofs(mm.facets("bore")).all("u^1")
            pin = bo[np.argmin(basis.doflocs[1, bo])]
            fixed_full = [uz0, uz1, np.array([pin])]
        r_of = basis.doflocs[0]
        z_of = basis.doflocs[1]
        fixed_full = np.unique(np.concatenate(fixed_full))
        vals_full = np.zeros(n)
        ends = np.concatenate([uz0, uz1])
        vals_full[ends] = kappa * r_of[ends] * (z_of[ends] - zm)
        if T is not None:
            keep_col = np.full(n, -1, dtype=np.int64)
            keep_col[keep] = np.arange(len(keep))
            fixed_y = keep_col[fixed_full]
            x = _solve_constrained(K, np.zeros(n), fixed_y, vals_full[fixed_full], T)
        else:
            x = _solve_constrained(K, np.zeros(n), fixed_full, vals_full[fixed_full])
        load = float(x @ (K @ x)) / (kappa * L)
    nominal = nominal_stress(load_case, prof.d, prof.bore, load)
    peak, peak_vm, pts = _boundary_stresses(mm, basis, x, load_case, E, nu, G)
    far = _far_field(mm, basis, x, load_case, E, nu, G, load)
    return ProfileResult(load_case, load, nominal, peak, peak_vm, peak.value / nominal, far,
                         int(K.shape[0]), mm.h, pts, basis, x)


def torsion_field(mm: MeridianMesh, G: float, end_rotation):
    """Torsion with the rotation ω = ``end_rotation(r, z)`` [rad] imposed on both end faces, the
    lateral surface (and bore) traction-free. Returns (basis, K, x): the P2 basis, the stiffness of
    :func:`fem.forms.axisym_torsion` and the nodal values of ω."""
    basis = CellBasis(mm.mesh, ElementTriP2())
    K = forms.axisym_torsion.assemble(basis, G=G)
    fixed = basis.get_dofs(np.concatenate([mm.facets("end0"), mm.facets("end1")])).all()
    r, z = basis.doflocs[:, fixed]
    x = _solve_constrained(K, np.zeros(K.shape[0]), fixed, np.asarray(end_rotation(r, z), float))
    return basis, K, x


def surface_stress(mm: MeridianMesh, basis, x, load_case: str, name: str = "surface",
                   E: float = 2.0e11, nu: float = 0.3):
    """(max principal or shear stress, von Mises, r, z) at the sample points of the boundary
    ``name`` for the solution ``x`` of ``load_case`` on ``basis``."""
    G = E / (2 * (1 + nu))
    fb = _facet_basis(mm, basis, mm.facets(name))
    return _stress_at(fb, x, load_case, E, nu, G)


def _match(basis, a: np.ndarray, b: np.ndarray):
    """Order the dofs ``b`` like ``a`` by their location (same nodes, other component)."""
    la, lb = basis.doflocs[:, a], basis.doflocs[:, b]
    ia = np.lexsort((la[0], la[1]))
    ib = np.lexsort((lb[0], lb[1]))
    if not np.allclose(la[:, ia], lb[:, ib], rtol=0, atol=1e-12 * max(1.0, float(np.abs(la).max()))):
        raise RuntimeError("axis dofs of two components do not pair up")
    return a[ia], b[ib]


def _stress_at(fb, x, load_case, E, nu, G):
    """(max principal, von Mises, r, z) at the facet basis points; torsion: (τ, √3·τ, r, z)."""
    u = interpolate(fb, x)
    r, z = np.asarray(fb.global_coordinates())
    if load_case == "torsion":
        g = u.grad
        tau = G * r * np.sqrt(g[0] ** 2 + g[1] ** 2)
        return tau, math.sqrt(3.0) * tau, r, z
    lam = E * nu / ((1 + nu) * (1 - 2 * nu))
    mu = G
    if load_case == "tension":
        er, et, ez, grz = forms.axisym_n0_strains(u, r)
    else:  # bending, at θ = 0 where the cos-group peaks and the sin-group vanishes
        (er, et, ez, grz), _ = forms.axisym_n1_strains(u, r)
    tr = er + et + ez
    sr, st, sz, trz = lam * tr + 2 * mu * er, lam * tr + 2 * mu * et, lam * tr + 2 * mu * ez, mu * grz
    c, rad = (sr + sz) / 2, np.sqrt(((sr - sz) / 2) ** 2 + trz**2)
    s1 = np.maximum(np.maximum(c + rad, c - rad), st)
    vm = np.sqrt(((sr - st) ** 2 + (st - sz) ** 2 + (sz - sr) ** 2) / 2 + 3 * trz**2)
    return s1, vm, r, z


def _facet_basis(mm: MeridianMesh, basis, facets):
    q = (BOUNDARY_POINTS[None, :], np.full(len(BOUNDARY_POINTS), 1.0 / len(BOUNDARY_POINTS)))
    return FacetBasis(mm.mesh, basis.elem, facets=facets, quadrature=q, mapping=boundary_mapping(mm.mesh))


def _angle(prof: Profile, r: float, z: float) -> float | None:
    if not prof.centres:
        return None
    if prof.kind == "shoulder":
        cr, cz = prof.centres[0]
        # 0° on the small cylinder (point (cr - ρ, cz)), 90° on the shoulder face (point (cr, cz + ρ))
        return math.degrees(math.atan2(z - cz, cr - r))
    # groove: angle about the nearer bottom-corner centre, measured from the groove bottom
    (c1r, c1z), (c2r, c2z) = prof.centres
    zc = (c1z + c2z) / 2
    if c1z <= z <= c2z:
        return 0.0
    cr, cz = (c1r, c1z) if z < zc else (c2r, c2z)
    return math.degrees(math.atan2(z - cz, cr - r))


def _boundary_stresses(mm, basis, x, load_case, E, nu, G):
    feature = mm.facets("fillet")
    fb = _facet_basis(mm, basis, feature if len(feature) else mm.facets("surface"))
    s1, vm, r, z = _stress_at(fb, x, load_case, E, nu, G)
    i = np.unravel_index(np.argmax(s1), s1.shape)
    j = np.unravel_index(np.argmax(vm), vm.shape)
    prof = mm.profile
    pk = Peak(float(s1[i]), float(r[i]), float(z[i]), _angle(prof, float(r[i]), float(z[i])))
    pv = Peak(float(vm[j]), float(r[j]), float(z[j]), _angle(prof, float(r[j]), float(z[j])))
    return pk, pv, {"r": r.ravel(), "z": z.ravel(), "s1": s1.ravel(), "vm": vm.ravel()}


def _far_field(mm, basis, x, load_case, E, nu, G, load):
    """Surface stress on the smaller diameter at ``profile.far`` (the nearest boundary sample
    point) against the elementary value for the carried load."""
    prof = mm.profile
    fb = _facet_basis(mm, basis, mm.facets("surface"))
    s1, _, r, z = _stress_at(fb, x, load_case, E, nu, G)
    k = np.unravel_index(np.argmin((r - prof.far[0]) ** 2 + (z - prof.far[1]) ** 2), r.shape)
    rr = float(r[k])
    d = 2 * rr
    if load_case == "tension":
        exact = 4 * load / (math.pi * (d**2 - prof.bore**2))
    elif load_case == "bending":
        exact = 32 * load * d / (math.pi * (d**4 - prof.bore**4))
    else:
        exact = 16 * load * d / (math.pi * (d**4 - prof.bore**4))
    return {"fem": float(s1[k]), "exact": exact, "r": rr, "z": float(z[k])}


#: Order of the stress components of :func:`feature_stress_components` (cylindrical, at θ = 0).
COMPONENTS = ("rr", "tt", "zz", "rz", "rt", "tz")


def feature_stress_components(mm: MeridianMesh, basis, x, load_case: str, E: float = 2.0e11,
                              nu: float = 0.3) -> dict:
    """The stress components [Pa] at the sample points of the feature arcs (the points of
    :attr:`ProfileResult.points`, same order), for superposing loads at each point.

    Returns {"r", "z": arrays (n,), "cos", "sin": arrays (n, 6)} in the order :data:`COMPONENTS`
    (σ_rr, σ_θθ, σ_zz, τ_rz, τ_rθ, τ_θz): the stress at circumferential angle θ is
    ``cos·cos θ + sin·sin θ`` for bending (the first harmonic: the cos-group σ_rr, σ_θθ, σ_zz, τ_rz,
    the sin-group τ_rθ, τ_θz, θ measured from the tension side), and ``cos`` alone (independent of θ)
    for tension (σ_rr, σ_θθ, σ_zz, τ_rz) and torsion (τ_rθ = G·r·∂ω/∂r, τ_θz = G·r·∂ω/∂z)."""
    feature = mm.facets("fillet")
    fb = _facet_basis(mm, basis, feature if len(feature) else mm.facets("surface"))
    u = interpolate(fb, x)
    r, z = (np.asarray(c) for c in fb.global_coordinates())
    G = E / (2 * (1 + nu))
    lam = E * nu / ((1 + nu) * (1 - 2 * nu))
    zero = np.zeros_like(r)
    cos = [zero] * 6
    sin = [zero] * 6
    if load_case == "torsion":
        g = u.grad
        cos = [zero, zero, zero, zero, G * r * g[0], G * r * g[1]]
    else:
        if load_case == "tension":
            er, et, ez, grz = forms.axisym_n0_strains(u, r)
        else:
            (er, et, ez, grz), (grt, gtz) = forms.axisym_n1_strains(u, r)
            sin = [zero, zero, zero, zero, G * grt, G * gtz]
        tr = er + et + ez
        cos = [lam * tr + 2 * G * er, lam * tr + 2 * G * et, lam * tr + 2 * G * ez, G * grz, zero, zero]
    flat = lambda comps: np.stack([np.asarray(c, float).ravel() for c in comps], axis=1)  # noqa: E731
    return {"r": r.ravel(), "z": z.ravel(), "cos": flat(cos), "sin": flat(sin)}

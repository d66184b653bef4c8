"""Second-order (curved, isoparametric) triangle meshes of a section, from gmsh to scikit-fem.

:func:`mesh_section` builds the section in a fresh gmsh model, sizes the mesh (a global size from
the fineness, finer along small fillets and at re-entrant corners, or a size field given by the
caller for adaptive refinement) and returns a :class:`SectionMesh`: the scikit-fem ``MeshTri2``
with named boundaries ``outer``, ``hole1``, ``hole2``…, which exact curve every boundary facet
lies on, and the :class:`~fem.geometry.BoundaryInfo` of the exact geometry.

Same shaft, same mesh: the section is meshed in a scale-free :class:`Frame` (moved to a reference
point of its own and divided by its own length scale, every length then rounded to a fixed binary
grid, :data:`FRAME_QUANTUM`), and the mesh and the boundary data are mapped back to metres. A
section that is only translated or uniformly scaled therefore reaches gmsh as the same numbers and
gets the same mesh (same nodes and elements; coordinates equal after mapping back, up to
round-off); gmsh's absolute geometric tolerances act on the same relative size for every shaft.
Rotated or mirrored sections get a different (equally fine) mesh. The rounding changes the
geometry by at most half a quantum of the length scale, far below any manufacturing tolerance.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field, replace
from typing import Callable

import numpy as np
from skfem import ElementTriP2, FacetBasis, MeshTri2
from skfem.assembly import Dofs
from skfem.assembly.basis.abstract_basis import AbstractBasis
from skfem.element import DiscreteField

from .errors import InputError
from .geometry import BoundaryInfo, Disk, Ellipse, Polygon, Section, analyse_boundary
from .gmshload import initialize as initialize_gmsh, load_gmsh

#: Default global fineness: elements across the section's characteristic size.
DEFAULT_FINENESS = 1.0

#: Points per boundary facet (reference coordinate along the facet) where boundary peaks are read.
BOUNDARY_POINTS = np.linspace(0.0, 1.0, 9)
#: Gauss-Legendre points and weights on [0, 1] for integrals along the boundary.
_gx, _gw = np.polynomial.legendre.leggauss(10)
BOUNDARY_GAUSS = ((_gx + 1) / 2, _gw / 2)


@dataclass(frozen=True)
class MeshOptions:
    """Mesh sizing. ``fineness`` scales every size at once (2 = twice as fine everywhere)."""

    fineness: float = DEFAULT_FINENESS
    across: float = 20.0  # elements across the characteristic size at fineness 1
    per_circle: float = 64.0  # elements per full turn of a curved boundary (fillets, arcs)
    corner_ratio: float = 1.0 / 25.0  # size at a sharp re-entrant corner relative to the global size
    grading: float = 0.25  # growth of the element size per unit distance away from a feature
    small_arc: float = 0.125  # arcs with radius below small_arc * L get their own refinement
    #: growth away from a spline's root fillets (``Section.kind == "spline"``): steeper than
    #: ``grading``, as the zones of its many close fillets otherwise merge into one fine band round
    #: the section where the error is a small part of the peak's (measured, docs/speed.md)
    spline_grading: float = 0.5

    def __post_init__(self):
        if not (self.fineness > 0 and math.isfinite(self.fineness)):
            raise InputError("analysis.fineness", self.fineness, "must be a positive number")


#: Relative precision of gmsh's integration of the size along each boundary curve (its
#: ``Mesh.LcIntegrationPrecision``, default 1e-9), which places the boundary nodes. At the default,
#: the 1-D meshing of B-spline flanks (splines, imported outlines) under curvature sizing took
#: three quarters of all meshing (1.4 of 1.9 CPU s for a 31k-node spline mesh); at 1e-6 it takes a
#: tenth of that and the node count changes by less than 1e-3 (measured, docs/speed.md). Used only
#: for sections with such curves (kind 'curve'): on lines, arcs and ellipses (gmsh reports some
#: trimmed circles as ellipses) the 1-D meshing costs next to nothing, and their meshes stay exactly
#: as they were. Set for the section mesh only and put back afterwards (gmsh keeps options between
#: models).
LC_INTEGRATION_PRECISION = 1e-6

#: Grid on which every length of the section is rounded in the scale-free frame (relative to the
#: section's length scale): 2⁻⁴⁰ ≈ 9.1e-13, a binary fraction, so the rounded values are exact and
#: identical for a translated or scaled copy unless the round-off of the move itself (about 1e-16
#: of the distance moved) happens to straddle a rounding boundary; then they differ by one step.
#: Coarse enough to absorb that round-off, fine enough to stay far below the geometric tolerances
#: of :mod:`fem.geometry` (1e-10 of a primitive's size and up).
FRAME_QUANTUM = 2.0**-40


@dataclass(frozen=True)
class Frame:
    """The scale-free frame a section is meshed in: ``x_frame = (x - origin) / scale``."""

    origin: tuple[float, float]
    scale: float

    def to_frame(self, xy: np.ndarray) -> np.ndarray:
        """Points of shape (2, ...) in metres to the frame."""
        xy = np.asarray(xy, float)
        o = np.reshape(self.origin, (2,) + (1,) * (xy.ndim - 1))
        return (xy - o) / self.scale

    def from_frame(self, xy: np.ndarray) -> np.ndarray:
        """Points of shape (2, ...) in the frame back to metres."""
        xy = np.asarray(xy, float)
        o = np.reshape(self.origin, (2,) + (1,) * (xy.ndim - 1))
        return xy * self.scale + o


def section_frame(section: Section) -> Frame:
    """The section's own frame: origin at the centre of the box around its added primitives
    (disk and ellipse centres, polygon points; the shaft axis for round and keyed sections), scale
    its length scale (the diameter, or the largest extent of the added primitives). Both move and
    scale with the section."""
    lo, hi = [], []
    for op, p in section.steps:
        if op != "add":
            continue
        if isinstance(p, Disk):
            lo.append(p.center)
            hi.append(p.center)
        elif isinstance(p, Ellipse):
            lo.append(p.center)
            hi.append(p.center)
        else:
            pts = np.asarray(p.points, float)
            lo.append(tuple(pts.min(axis=0)))
            hi.append(tuple(pts.max(axis=0)))
    lo, hi = np.min(np.asarray(lo), axis=0), np.max(np.asarray(hi), axis=0)
    origin = (float((lo[0] + hi[0]) / 2), float((lo[1] + hi[1]) / 2))
    return Frame(origin, float(section.length_scale))


def _snap(v: float) -> float:
    return round(v / FRAME_QUANTUM) * FRAME_QUANTUM


def normalised_section(section: Section, frame: Frame | None = None) -> tuple[Section, Frame]:
    """The section in its scale-free frame, every length rounded to :data:`FRAME_QUANTUM`."""
    frame = frame or section_frame(section)
    ox, oy = frame.origin
    k = 1.0 / frame.scale

    def pt(xy):
        return (_snap((xy[0] - ox) * k), _snap((xy[1] - oy) * k))

    def prim(p):
        if isinstance(p, Disk):
            return replace(p, center=pt(p.center), radius=_snap(p.radius * k))
        if isinstance(p, Ellipse):
            return replace(p, center=pt(p.center), semi_axes=(_snap(p.semi_axes[0] * k), _snap(p.semi_axes[1] * k)))
        if isinstance(p, Polygon):
            return replace(p, points=tuple(pt(q) for q in p.points), fillets=tuple(_snap(r * k) for r in p.fillets))
        if hasattr(p, "framed"):  # fem.outline.Outline: points mapped and rounded, directions kept
            return p.framed(pt, k)
        raise TypeError(f"unknown primitive {type(p).__name__}")

    steps = tuple((op, prim(p)) for op, p in section.steps)
    return replace(section, steps=steps, diameter=section.diameter and _snap(section.diameter * k),
                   bore=section.bore and _snap(section.bore * k), keyways=(), origin=pt(section.origin)), frame


def _info_from_frame(info: BoundaryInfo, frame: Frame) -> BoundaryInfo:
    """Boundary data measured in the frame, in metres."""
    s = frame.scale
    ox, oy = frame.origin
    curves = {t: replace(c, radius=None if c.radius is None else c.radius * s, length=c.length * s)
              for t, c in info.curves.items()}
    corners = [replace(c, point=tuple(float(v) for v in frame.from_frame(np.asarray(c.point)))) for c in info.corners]
    e = info.integrals
    A, Sx, Sy = e["A"], e["Sx"], e["Sy"]
    s2 = s * s
    integrals = dict(
        A=s2 * A,
        Sx=s2 * (ox * A + s * Sx),
        Sy=s2 * (oy * A + s * Sy),
        Ixx0=s2 * (oy * oy * A + 2 * oy * s * Sy + s2 * e["Ixx0"]),
        Iyy0=s2 * (ox * ox * A + 2 * ox * s * Sx + s2 * e["Iyy0"]),
        Ixy0=s2 * (ox * oy * A + s * (ox * Sy + oy * Sx) + s2 * e["Ixy0"]),
    )
    return BoundaryInfo(info.loops, curves, corners, [a * s2 for a in info.hole_areas], integrals)


@dataclass
class SectionMesh:
    mesh: MeshTri2
    section: Section
    boundary: BoundaryInfo
    facet_curve: dict[int, int]  # boundary facet index -> exact curve tag
    boundary_facets: np.ndarray  # the boundary facets, in the order of the arrays below
    boundary_offset: np.ndarray  # (nf, ng): outward distance of the mesh boundary from the exact curve [m], at BOUNDARY_GAUSS
    options: MeshOptions
    h_global: float
    seconds: float = 0.0
    info: dict = field(default_factory=dict)
    frame: Frame | None = None  # the scale-free frame the section was meshed in

    @property
    def hole_names(self) -> list[str]:
        return [f"hole{k}" for k in range(1, len(self.boundary.hole_areas) + 1)]

    def boundary_basis(self, points: str = "sample"):
        """FacetBasis (P2) on the boundary facets: at :data:`BOUNDARY_POINTS` (``'sample'``, for
        peaks) or at :data:`BOUNDARY_GAUSS` (``'gauss'``, whose ``dx`` integrates along the boundary)."""
        return _boundary_basis(self.mesh, self.boundary_facets, points)

    def curve_of(self, facet: int):
        return self.boundary.curves.get(self.facet_curve.get(int(facet), -1))


SizeField = Callable[[np.ndarray, np.ndarray], np.ndarray]  # (x, y) -> element size [m]


def mesh_section(section: Section, options: MeshOptions | None = None,
                 size_field: tuple[np.ndarray, np.ndarray] | None = None) -> SectionMesh:
    """Mesh ``section`` with curved second-order triangles.

    ``size_field``, if given, is ``(triangles_xy, sizes)``: a background size on the triangles of an
    earlier mesh (``triangles_xy`` of shape (n, 3, 2), ``sizes`` of shape (n,) or (n, 3)), as used
    by adaptive refinement; it is combined (minimum) with the feature sizes.
    """
    import time

    options = options or MeshOptions()
    gmsh = load_gmsh()
    t0 = time.perf_counter()
    if not gmsh.isInitialized():
        initialize_gmsh(gmsh)
    gmsh.option.setNumber("General.Terminal", 0)
    gmsh.option.setNumber("General.NumThreads", 1)
    gmsh.clear()
    try:
        gmsh.model.add("section")
        # everything gmsh sees is in the section's scale-free frame (module docstring)
        unit, frame = normalised_section(section)
        surfaces = unit.build(gmsh)
        info = analyse_boundary(gmsh, surfaces, unit.length_scale, frame.from_frame)
        # size from the hydraulic diameter 4A/P: the diameter for a round bar, about twice the
        # wall for thin-walled sections, so thin walls get enough elements across
        perimeter = sum(c.length for c in info.curves.values())
        L = 4.0 * info.integrals["A"] / perimeter
        h = L / (options.across * options.fineness)
        if size_field is not None:
            tri, sizes = size_field
            tri = np.moveaxis(frame.to_frame(np.moveaxis(np.asarray(tri, float), -1, 0)), 0, -1)
            size_field = (tri, np.asarray(sizes, float) / frame.scale)
        grading = options.spline_grading if section.kind == "spline" else options.grading
        _set_sizes(gmsh, info, options, h, size_field, grading)
        gmsh.model.addPhysicalGroup(2, surfaces, name="section")
        gmsh.option.setNumber("Mesh.ElementOrder", 2)
        gmsh.option.setNumber("Mesh.SecondOrderLinear", 0)
        gmsh.option.setNumber("Mesh.HighOrderOptimize", 0)
        gmsh.option.setNumber("Mesh.Algorithm", 6)
        default_precision = gmsh.option.getNumber("Mesh.LcIntegrationPrecision")
        if any(c.kind == "curve" for c in info.curves.values()):
            gmsh.option.setNumber("Mesh.LcIntegrationPrecision", LC_INTEGRATION_PRECISION)
        try:
            gmsh.model.mesh.generate(2)
        finally:
            gmsh.option.setNumber("Mesh.LcIntegrationPrecision", default_precision)
        mesh, facet_curve = _to_skfem(gmsh, info, frame)
        bfacets, offset = _boundary_offsets(gmsh, mesh, facet_curve, frame)
    except InputError:
        raise
    except Exception as exc:  # gmsh raises plain Exceptions with its own message
        raise InputError("section", section.kind, f"the geometry could not be built or meshed ({str(exc).splitlines()[0]})") from None
    finally:
        gmsh.clear()
    sm = SectionMesh(mesh, section, _info_from_frame(info, frame), facet_curve, bfacets, offset, options,
                     h * frame.scale, time.perf_counter() - t0, frame=frame)
    sm.info["elements"] = int(mesh.t.shape[1])
    return sm


def threshold_field(f, size_min: float, size_max: float, dist_min: float, dist_max: float, curves=None,
                    points=None, sampling: int | None = None) -> int:
    """A gmsh size field (``f`` is ``gmsh.model.mesh.field``): ``size_min`` within ``dist_min`` of the
    given curves or points, growing linearly to ``size_max`` at ``dist_max``. Returns its tag."""
    d = f.add("Distance")
    if curves is not None:
        f.setNumbers(d, "CurvesList", curves)
    if points is not None:
        f.setNumbers(d, "PointsList", points)
    if sampling is not None:
        f.setNumber(d, "Sampling", sampling)
    t = f.add("Threshold")
    f.setNumber(t, "InField", d)
    f.setNumber(t, "SizeMin", size_min)
    f.setNumber(t, "SizeMax", size_max)
    f.setNumber(t, "DistMin", dist_min)
    f.setNumber(t, "DistMax", dist_max)
    return t


def _set_sizes(gmsh, info: BoundaryInfo, o: MeshOptions, h: float, size_field, grading: float | None = None) -> None:
    """gmsh's size fields; ``grading`` is the growth away from the small fillets (``o.grading`` if None)."""
    grading = o.grading if grading is None else grading
    f = gmsh.model.mesh.field
    gmsh.option.setNumber("Mesh.MeshSizeMax", h)
    gmsh.option.setNumber("Mesh.MeshSizeMin", 0.0)
    gmsh.option.setNumber("Mesh.MeshSizeFromCurvature", o.per_circle * o.fineness)
    gmsh.option.setNumber("Mesh.MeshSizeFromPoints", 0)
    gmsh.option.setNumber("Mesh.MeshSizeExtendFromBoundary", 0)
    L = h * o.across * o.fineness
    fields = []
    small = [c.tag for c in info.curves.values() if c.kind == "arc" and c.radius and c.radius < o.small_arc * L]
    radii = {}
    for tag in small:
        r = info.curves[tag].radius
        radii.setdefault(round(r / L, 9), []).append(tag)
    for _, tags in radii.items():
        r = info.curves[tags[0]].radius
        smin = min(h, 2 * math.pi * r / (o.per_circle * o.fineness))
        fields.append(threshold_field(f, smin, h, 0.5 * r, 0.5 * r + (h - smin) / grading, curves=tags, sampling=40))
    corner_pts = []
    for c in info.reentrant_sharp_corners:
        corner_pts.append(c.point)
    if corner_pts:
        smin = h * o.corner_ratio
        pts = [gmsh.model.occ.addPoint(x, y, 0.0) for x, y in corner_pts]
        gmsh.model.occ.synchronize()
        fields.append(threshold_field(f, smin, h, 0.0, (h - smin) / o.grading, points=pts))
    if size_field is not None:
        tri, sizes = size_field
        tri = np.asarray(tri, float)
        sizes = np.asarray(sizes, float)
        if sizes.ndim == 1:
            sizes = np.repeat(sizes[:, None], 3, axis=1)
        view = gmsh.view.add("size")
        data = np.concatenate([tri[:, :, 0], tri[:, :, 1], np.zeros((len(tri), 3)), sizes], axis=1)
        gmsh.view.addListData(view, "ST", len(tri), np.ascontiguousarray(data.ravel(), dtype=np.float64))
        pv = f.add("PostView")
        f.setNumber(pv, "ViewTag", view)
        fields.append(pv)
    if fields:
        m = f.add("Min")
        f.setNumbers(m, "FieldsList", fields)
        f.setAsBackgroundMesh(m)


def gmsh_p2_mesh(gmsh, to_metres, field: str):
    """gmsh's 6-node triangles as a :class:`MeshTri2` with counter-clockwise vertices (node coordinates
    mapped by ``to_metres``, a function of a (2, n) array), and ``facets_on(curve_tag)``: the boundary
    facets that lie on one gmsh curve. ``field`` names the case-file field of the error raised when
    gmsh made no second-order triangles."""
    tags, coords, _ = gmsh.model.mesh.getNodes()
    xy = np.reshape(coords, (-1, 3))[:, :2]
    index = np.full(int(tags.max()) + 1, -1, dtype=np.int64)
    index[tags.astype(np.int64)] = np.arange(len(tags))
    etags, enodes = gmsh.model.mesh.getElementsByType(9)  # 6-node triangles
    if len(etags) == 0:
        raise InputError(field, None, "gmsh produced no second-order triangles")
    t = index[np.asarray(enodes, dtype=np.int64)].reshape(-1, 6).T
    used = np.unique(t)
    remap = np.full(len(xy), -1, dtype=np.int64)
    remap[used] = np.arange(len(used))
    t = remap[t]
    p = to_metres(xy[used].T)
    # counter-clockwise vertices (the geometry is in the z = 0 plane, normal +z)
    a, b, c = p[:, t[0]], p[:, t[1]], p[:, t[2]]
    cw = ((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])) < 0
    if np.any(cw):
        t[:, cw] = t[[0, 2, 1, 5, 4, 3]][:, cw]
    corner_nodes = np.unique(t[:3])
    vertex_of = np.full(p.shape[1], -1, dtype=np.int64)
    vertex_of[corner_nodes] = np.arange(len(corner_nodes))  # MeshTri2 numbers vertices this way
    mesh = MeshTri2(p, t)
    fkey = {tuple(sorted(mesh.facets[:, f])): f for f in mesh.boundary_facets()}

    def facets_on(ctag: int) -> list[int]:
        _, lnodes = gmsh.model.mesh.getElementsByType(8, ctag)  # 3-node lines on that curve
        ln = remap[index[np.asarray(lnodes, dtype=np.int64)]].reshape(-1, 3)
        out = []
        for a_, b_, _m in ln:
            f_ = fkey.get(tuple(sorted((int(vertex_of[a_]), int(vertex_of[b_])))))
            if f_ is not None:
                out.append(int(f_))
        return out

    return mesh, facets_on


def _to_skfem(gmsh, info: BoundaryInfo, frame: Frame):
    mesh, facets_on = gmsh_p2_mesh(gmsh, frame.from_frame, "section")  # back to metres
    # named boundaries: which loop and which exact curve each boundary facet lies on
    facet_curve: dict[int, int] = {f: ctag for ctag in info.curves for f in facets_on(ctag)}
    names = {}
    loop_of = {ct: cv.loop for ct, cv in info.curves.items()}
    for li in range(len(info.loops)):
        sel = np.array([f for f, ct in facet_curve.items() if loop_of[ct] == li], dtype=np.int64)
        names["outer" if li == 0 else f"hole{li}"] = np.sort(sel)
    if sum(len(v) for v in names.values()) != len(mesh.boundary_facets()):
        raise InputError("section", None, "could not match every boundary facet to a boundary curve")
    mesh = same_topology(mesh.with_boundaries(names), mesh)
    return mesh, facet_curve



#: Margin on the round-off floor of the inverse mapping's convergence test (boundary_mapping).
ROUNDOFF_MARGIN = 64.0


def boundary_mapping(mesh):
    """The mesh's isoparametric mapping, with an inverse that tolerates round-off.

    scikit-fem places facet points in their element by a Newton iteration on the reference
    coordinates with an absolute tolerance of 1e-12 summed over the points; on the small elements
    of a fine fillet far from the origin, round-off alone exceeds that. 1e-10 in reference
    coordinates is still far below anything that shows in a result."""
    from skfem.mapping import MappingIsoparametric

    class _Tolerant(MappingIsoparametric):
        def invF(self, x, tind=None, newton_max_iters=50, newton_tol=1e-10):
            # scikit-fem's Newton iteration (MappingIsoparametric.invF), with a convergence test that
            # knows round-off: coordinates carry about eps·|x|, which the inverse Jacobian (about 1/h)
            # turns into eps·|x|/h of reference coordinates per point. On a fillet of 1e-4 of the
            # section's size far from the origin that floor alone passes any fixed tolerance.
            X = np.zeros(x.shape) + 0.5
            xmax = float(np.max(np.abs(x))) if x.size else 0.0
            for _ in range(newton_max_iters):
                F = self.F(X, tind)
                invDF = self.invDF(X, tind)
                dX = np.einsum("ijkl,jkl->ikl", invDF, x - F)
                X = np.clip(X + dX, 0.0, 1.0)
                floor = ROUNDOFF_MARGIN * np.finfo(float).eps * xmax * np.sum(np.abs(invDF), axis=(0, 1, 3))
                if (np.linalg.norm(dX, 1, (0, 2)) < newton_tol + floor).all():
                    return X
            raise Exception(f"Newton iteration didn't converge up to TOL={newton_tol}")

    if not hasattr(mesh, "_tolerant_mapping"):
        object.__setattr__(mesh, "_tolerant_mapping", _Tolerant(mesh, mesh.elem(), mesh.bndelem))
    return mesh._tolerant_mapping


def p2_dofs(mesh) -> Dofs:
    """The P2 DOF numbering of ``mesh`` (scikit-fem ``Dofs``), made once per mesh object and kept on
    it: every P2 basis on one mesh numbers its DOFs alike (from the topology only), so the bases of a
    mesh share one instead of each building its own. Read, never changed."""
    d = mesh.__dict__.get("_p2_dofs")
    if d is None:
        d = Dofs(mesh, ElementTriP2())
        object.__setattr__(mesh, "_p2_dofs", d)
    return d


def same_topology(new, old):
    """Hand ``new``, a copy of ``old`` with the same elements (moved, or with named boundaries), the
    facets and facet-element maps ``old`` has built already: they depend on the elements only, and
    scikit-fem would build them again for every copy. Returns ``new``."""
    if new is not old and np.array_equal(new.t, old.t):
        for name in ("_facets", "_t2f", "_f2t"):
            if name in old.__dict__ and name not in new.__dict__:
                object.__setattr__(new, name, old.__dict__[name])
    return new


def _boundary_basis(mesh, facets, points):
    """The boundary FacetBasis of ``mesh`` on ``facets`` at ``points``, built once per mesh and kept on
    it (the bases are read, never changed; building one is a tenth of a solve)."""
    facets = np.asarray(facets)
    key = (points, facets.shape, facets.tobytes())
    memo = getattr(mesh, "_boundary_bases", None)
    if memo is None:
        memo = {}
        object.__setattr__(mesh, "_boundary_bases", memo)
    if key not in memo:
        memo[key] = _new_boundary_basis(mesh, facets, points)
    return memo[key]


def _new_boundary_basis(mesh, facets, points):
    if points == "gauss":
        q = (BOUNDARY_GAUSS[0][None, :], BOUNDARY_GAUSS[1])
    else:
        q = (BOUNDARY_POINTS[None, :], np.full(len(BOUNDARY_POINTS), 1.0 / len(BOUNDARY_POINTS)))
    return BoundaryFacetBasis(mesh, ElementTriP2(), facets, q)


class BoundaryFacetBasis(FacetBasis):
    """scikit-fem's ``FacetBasis`` on boundary ``facets`` (isoparametric, :func:`boundary_mapping`),
    with the points' reference coordinates in the owning element written down instead of searched.

    ``FacetBasis`` maps each facet point to the plane and finds it again in its element by a Newton
    iteration (twice: for the basis and for the normals). On a boundary facet the answer is known:
    the facet is the element's edge between two of its vertices, and the element's P2 map restricted
    to that edge is the facet's own P2 map, so the point at 1-D reference coordinate s lies at
    v_a + s (v_b − v_a) of the reference triangle (v_a, v_b the reference vertices of the facet's
    first and second node). The Newton iteration's points agree with these within its stopping
    tolerance (3e-13 of the reference element measured on a keyed section's mesh). The global DOF
    locations, which no boundary read uses, are not computed. A facet with an element on both sides
    (an interface) is refused: ``FacetBasis`` serves there. The body follows ``FacetBasis.__init__``
    of scikit-fem 12."""

    def __init__(self, mesh, elem, facets, quadrature):
        dofs = p2_dofs(mesh) if isinstance(elem, ElementTriP2) else None
        AbstractBasis.__init__(self, mesh, elem, boundary_mapping(mesh), None, quadrature, mesh.brefdom, dofs, True)
        self.find = np.asarray(facets)
        if np.any(mesh.f2t[1, self.find] != -1):
            raise ValueError("BoundaryFacetBasis: a facet is not on the boundary")
        self.tind = self.tind_normals = mesh.f2t[0, self.find]
        verts = mesh.t[:3, self.tind]
        a = np.argmax(verts == mesh.facets[0, self.find], axis=0)
        b = np.argmax(verts == mesh.facets[1, self.find], axis=0)
        ref = np.array([[0.0, 0.0], [1.0, 0.0], [0.0, 1.0]])  # the reference triangle's vertices
        ya, yb = ref[a].T[:, :, None], ref[b].T[:, :, None]
        Y = ya + (yb - ya) * self.X[0][None, None, :]
        self.normals = DiscreteField(value=self.mapping.normals(Y, self.tind, self.find, mesh.t2f))
        self.nelems = len(self.find)
        self.basis = [self.elem.gbasis(self.mapping, Y, j, tind=self.tind) for j in range(self.Nbfun)]
        self.dx = (np.abs(self.mapping.detDG(self.X, find=self.find))
                   * np.broadcast_to(self.W, (self.nelems, self.W.shape[-1])))


def _boundary_offsets(gmsh, mesh, facet_curve, frame: Frame):
    """Signed distance [m] (outward positive) of the curved mesh boundary from the exact curves
    (which gmsh holds in the scale-free frame)."""

    facets = mesh.boundary_facets()
    fb = _boundary_basis(mesh, facets, "gauss")
    X = frame.to_frame(np.asarray(fb.global_coordinates()))  # (2, nf, np), in the frame
    n = np.asarray(fb.normals)
    offset = np.zeros(X.shape[1:])
    curve_of = np.array([facet_curve[int(f)] for f in facets])
    for ctag in np.unique(curve_of):
        sel = np.flatnonzero(curve_of == ctag)
        pts = X[:, sel, :].reshape(2, -1)
        c = _closest_on_curve(gmsh, int(ctag), pts)
        d = pts - c
        nn = n[:, sel, :].reshape(2, -1)
        offset[sel, :] = (d[0] * nn[0] + d[1] * nn[1]).reshape(len(sel), -1)
    return facets, offset * frame.scale


def _closest_on_curve(gmsh, tag: int, pts: np.ndarray, samples: int = 2048) -> np.ndarray:
    """Closest points on an exact curve: nearest of dense samples, then Newton on the parameter
    (gmsh's own projection can land on a far branch of a trimmed ellipse or circle)."""
    from scipy.spatial import cKDTree

    lo, hi = (float(v[0]) for v in gmsh.model.getParametrizationBounds(1, tag))
    ts = np.linspace(lo, hi, samples)
    cs = np.reshape(gmsh.model.getValue(1, tag, ts), (-1, 3))[:, :2]
    _, idx = cKDTree(cs).query(pts.T)
    t = ts[idx]
    for _ in range(4):
        c = np.reshape(gmsh.model.getValue(1, tag, t), (-1, 3))[:, :2].T
        d1 = np.reshape(gmsh.model.getDerivative(1, tag, t), (-1, 3))[:, :2].T
        d2 = np.reshape(gmsh.model.getSecondDerivative(1, tag, t), (-1, 3))[:, :2].T
        r = c - pts
        f = np.sum(r * d1, axis=0)
        fp = np.sum(d1 * d1, axis=0) + np.sum(r * d2, axis=0)
        t = np.clip(t - f / np.where(fp > 0, fp, 1.0), lo, hi)
    return np.reshape(gmsh.model.getValue(1, tag, t), (-1, 3))[:, :2].T

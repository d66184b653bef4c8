"""A submodel of a 3-D segment: the region round one feature, meshed finer and driven by a coarser
solution of the whole (or half, or quarter) segment.

The classic route to a local peak: solve the segment on a moderate mesh (:func:`fem.solid.solve_segment`),
then cut a box round the peak's place from the very same OpenCASCADE solid (the bar with its feature cut,
intersected with the box), mesh it with a small uniform size on the feature's surfaces inside it, and
prescribe on the box's cut faces the displacement of the segment's solution there (its P2 field
evaluated at the cut faces' nodes, :func:`field_at`). Box faces on the segment model's mirror planes keep
the mirror conditions of :data:`fem.solid.PARITY`. The box must reach far enough from the peak that the
segment's displacement on its faces is already accurate (the displacement converges a full order faster
than the stress: P2, error O(h³) against O(h²)). The peak is read as in :mod:`fem.solid` (the stress of
the owning element at the facet nodes, averaged at each boundary node, completed by reflection on the
mirror planes) on the submodel's own free surface, away from its cut faces (:data:`GUARD`), and divided by
the segment solution's nominal stress (the load the segment model carries).

SI throughout (the meshing frame divides every length by d, as :func:`fem.solid.mesh_segment`).
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from scipy.spatial import cKDTree
from skfem import Basis, ElementTetP2, ElementVector

from . import solid
from .errors import InputError, SolveError
from .gmshload import initialize as initialize_gmsh, load_gmsh
from .mesh import boundary_mapping

#: Growth of the element size away from the feature surfaces inside the box (size per unit distance).
GRADE = 0.4
#: The largest element in the box, in feature sizes.
COARSEST = 6.0
#: Nodes closer than this many feature sizes (the ``size`` of :func:`mesh_submodel`) to a cut face are
#: not read for the peak (the prescribed displacement's own disturbance sits there).
GUARD = 4.0
#: Candidate elements tried per point when locating it in the segment mesh (nearest centroids).
CANDIDATES = 24
#: Of those, the ones (best held by their straight tetrahedron first) whose curved map is inverted.
TRIES = 4
#: A point may lie this far outside its element in reference coordinates (a cut face's node on the
#: exact curved surface, a hair outside the segment mesh's quadratic surface): its value is extrapolated.
OUTSIDE = 0.25


@dataclass
class Submodel:
    """A meshed submodel: ``sm`` a :class:`fem.solid.SolidMesh` whose ``ends`` are the box's cut
    faces (prescribed displacement), ``lateral`` the free surface, ``planes`` the mirror faces;
    ``box`` (x0, x1, y0, y1, z0, z1) [m]; ``size`` the element size on the feature surfaces [m]."""

    sm: solid.SolidMesh
    box: tuple
    size: float


def keyseat_end_box(seg: solid.Segment, f: solid.ProfileKeyseat, margin: float, symmetry: int = 0,
                    back: float | None = None) -> tuple:
    """The box [m] round the end z = z1 of profile keyseat ``f`` (the end a quarter model keeps): the
    end's half round, its bottom fillet and ``margin`` [m] of material beyond them on every side, and
    ``back`` [m] (2·margin unless given) of the straight keyseat before the end's half round (in torsion
    the peak sits on the bottom fillet of the straight part); x from 0 when the segment model is
    mirrored about x = 0, else symmetric."""
    back = 2 * margin if back is None else back
    R = seg.diameter_at(f.z1) / 2
    hw = f.width / 2
    x1 = hw + margin
    x0 = 0.0 if symmetry else -x1
    return (x0, x1, R - f.depth - margin, 1.1 * R, max(f.z1 - f.width / 2 - back, (f.z0 + f.z1) / 2), f.z1 + margin)


def mesh_submodel(seg: solid.Segment, box: tuple, size: float, symmetry: int = 0) -> Submodel:
    """Mesh the part of segment ``seg`` inside ``box`` (x0, x1, y0, y1, z0, z1) [m] with curved 10-node
    tetrahedra: ``size`` [m] on the feature's surfaces inside the box (every surface that is neither
    the plain cylinder nor a box face), growing at :data:`GRADE` up to :data:`COARSEST` times that.
    ``symmetry`` is the segment model's (:func:`fem.solid.mesh_segment`): box faces on its mirror
    planes get mirror conditions, every other box face inside the material is a cut face."""
    seg.check()
    if symmetry not in (0, 1, 2) or symmetry > solid.symmetry_of(seg):
        raise InputError("segment.symmetry", symmetry, f"must be between 0 and {solid.symmetry_of(seg)} for these features")
    x0, x1, y0, y1, z0, z1 = box
    if not (x1 > x0 and y1 > y0 and z1 > z0) or z0 < solid.END_ZONE * seg.d * 0.5 or z1 > seg.length:
        raise InputError("submodel.box", box, "must be a box inside the segment, clear of its end zones")
    if symmetry and x0 < -1e-12 * seg.d or symmetry == 2 and z0 < seg.length / 2 - 1e-12 * seg.d:
        raise InputError("submodel.box", box, "must lie inside the mirrored model (x >= 0, and z >= length/2 for a quarter)")
    if not (size > 0 and math.isfinite(size)):
        raise InputError("submodel.size", size, "must be a positive length")
    gmsh = load_gmsh()
    initialize_gmsh(gmsh)
    d = seg.d
    R = 0.5
    L = seg.length / d
    feats = [solid._scaled(f, 1 / d) for f in seg.features]
    b = [v / d for v in box]
    hf = size / d
    gmsh.model.add("submodel")
    try:
        occ = gmsh.model.occ
        gmsh.option.setNumber("General.Terminal", 0)
        gmsh.option.setNumber("General.NumThreads", 1)
        shoulder = next((f for f in feats if isinstance(f, solid.Shoulder)), None)
        bar = solid._bar(gmsh, R, L, shoulder)
        tools = []
        for f in feats:
            if not isinstance(f, solid.Shoulder):
                tools += solid._tool(gmsh, f, R if shoulder is None or f.span()[0] < shoulder.z else shoulder.D / 2)
        if tools:
            bar, _ = occ.cut(bar, tools)
        bar, _ = occ.intersect(bar, [(3, occ.addBox(b[0], b[2], b[4], b[1] - b[0], b[3] - b[2], b[5] - b[4]))])
        if not bar:
            raise InputError("submodel.box", box, "holds no material of the segment")
        occ.synchronize()
        radii = (R,) if shoulder is None else (R, shoulder.D / 2)
        feature = [s for _, s in gmsh.model.getEntities(2) if _kind(gmsh, s, b, radii, L, symmetry) == "feature"]
        hmax = COARSEST * hf
        fm = gmsh.model.mesh.field
        if feature:
            small = min((f.small for f in feats if not isinstance(f, solid.Shoulder)), default=hf)
            dist = fm.add("Distance")
            fm.setNumbers(dist, "SurfacesList", feature)
            fm.setNumber(dist, "Sampling", solid.SAMPLING * 2)
            th = fm.add("Threshold")
            fm.setNumber(th, "InField", dist)
            fm.setNumber(th, "SizeMin", hf)
            fm.setNumber(th, "SizeMax", hmax)
            fm.setNumber(th, "DistMin", min(small, 2 * hf))
            fm.setNumber(th, "DistMax", min(small, 2 * hf) + (hmax - hf) / GRADE)
            fm.setAsBackgroundMesh(th)
        gmsh.option.setNumber("Mesh.MeshSizeMax", hmax)
        gmsh.option.setNumber("Mesh.MeshSizeMin", 0.0)
        gmsh.option.setNumber("Mesh.MeshSizeFromCurvature", 0)
        gmsh.option.setNumber("Mesh.MeshSizeFromPoints", 0)
        gmsh.option.setNumber("Mesh.MeshSizeExtendFromBoundary", 1)
        gmsh.option.setNumber("Mesh.ElementOrder", 2)
        gmsh.option.setNumber("Mesh.HighOrderOptimize", 2)
        gmsh.option.setNumber("Mesh.SecondOrderLinear", 0)
        gmsh.option.setNumber("Mesh.Algorithm3D", 1)
        gmsh.model.mesh.generate(3)
        mesh = solid._to_skfem(gmsh, d)
    finally:
        gmsh.model.remove()
    bf = mesh.boundary_facets()
    p = mesh.p[:, mesh.facets[:, bf]]  # (3, 3, nf)
    tol = 1e-9 * d
    on = {}
    for axis, (lo, hi) in enumerate(((box[0], box[1]), (box[2], box[3]), (box[4], box[5]))):
        for val in (lo, hi):
            on[axis, val] = np.all(np.abs(p[axis] - val) < tol, axis=0)
    mirror_x = on[0, box[0]] if symmetry and abs(box[0]) < tol else np.zeros(len(bf), bool)
    mirror_z = (on[2, box[4]] if symmetry == 2 and abs(box[4] - seg.length / 2) < tol else np.zeros(len(bf), bool))
    cut = np.zeros(len(bf), bool)
    for v in on.values():
        cut |= v
    cut &= ~(mirror_x | mirror_z)
    lateral = bf[~(cut | mirror_x | mirror_z)]
    planes = {}
    if symmetry:
        planes["x"] = bf[mirror_x]
    if symmetry == 2:
        planes["z"] = bf[mirror_z]
    sm = solid.SolidMesh(mesh, seg, hmax * d, size, bf[cut], lateral, np.array([], dtype=np.int64), symmetry, planes)
    return Submodel(sm, tuple(box), size)


def _kind(gmsh, s: int, b, radii, L: float, symmetry: int) -> str:
    """'box' (a face of the box, cut or mirror), 'plain' (a plain cylinder) or 'feature' for surface ``s``
    (frame)."""
    lo, hi = gmsh.model.getParametrizationBounds(2, s)
    uv = []
    for a in (0.2, 0.5, 0.8):
        for c in (0.3, 0.7):
            uv += [lo[0] + a * (hi[0] - lo[0]), lo[1] + c * (hi[1] - lo[1])]
    xyz = np.reshape(gmsh.model.getValue(2, s, uv), (-1, 3))
    for axis in range(3):
        for val in (b[2 * axis], b[2 * axis + 1]):
            if np.all(np.abs(xyz[:, axis] - val) < 1e-9):
                return "box"
    r = np.hypot(xyz[:, 0], xyz[:, 1])
    if any(np.all(np.abs(r - R) < 1e-9) for R in radii):
        return "plain"
    return "feature"


def field_at(basis, x: np.ndarray, points: np.ndarray) -> np.ndarray:
    """The displacement (3, n) of the vector P2 solution ``x`` on ``basis`` (a curved
    :class:`skfem.MeshTet2`, components interleaved) at ``points`` (3, n) [m]: each point located in the
    element whose straight (vertex) tetrahedron holds it best among the :data:`CANDIDATES` nearest by
    centroid, its reference coordinates found by Newton's method on the isoparametric map (a point a
    hair outside the curved boundary is extrapolated from its element), the P2 shape functions summed.
    :class:`~fem.errors.SolveError` if a point is not near any element."""
    mesh = basis.mesh
    verts = mesh.p[:, mesh.t[:4]]  # (3, 4, nel)
    centres = verts.mean(axis=1).T
    k = min(CANDIDATES, mesh.t.shape[1])
    _, cand = cKDTree(centres).query(points.T, k=k)
    cand = np.atleast_2d(cand)
    # barycentric coordinates in each candidate's straight tetrahedron
    A = verts[:, 1:, :] - verts[:, :1, :]  # (3, 3, nel)
    Ainv = np.linalg.inv(np.moveaxis(A, -1, 0))  # (nel, 3(ref), 3(xyz))  columns: edges
    rel = points.T[:, None, :] - verts[:, 0, :].T[cand]  # (n, k, 3)
    lam = np.einsum("nkij,nkj->nki", Ainv[cand], rel)  # (n, k, 3)
    worst = np.minimum(lam.min(axis=2), 1 - lam.sum(axis=2))
    order = np.argsort(-worst, axis=1)[:, :TRIES]  # the straight tetrahedra that hold the point best
    rows = np.arange(points.shape[1])
    mapping = basis.mapping
    target = points[:, :, None]
    best_off, tind, X = None, None, None
    for k in range(order.shape[1]):
        tk = cand[rows, order[:, k]]
        Xk = lam[rows, order[:, k]].T[:, :, None]  # (3, n, 1)
        for _ in range(20):
            dX = np.einsum("ijkl,jkl->ikl", mapping.invDF(Xk, tk), target - mapping.F(Xk, tk))
            Xk = Xk + dX
            if np.max(np.abs(dX)) < 1e-12:
                break
        Xk = Xk[:, :, 0]
        off = np.minimum(Xk.min(axis=0), 1 - Xk.sum(axis=0))
        if best_off is None:
            best_off, tind, X = off, tk, Xk
        else:
            better = off > best_off
            best_off = np.where(better, off, best_off)
            tind = np.where(better, tk, tind)
            X = np.where(better[None], Xk, X)
    if np.min(best_off) < -OUTSIDE:
        raise SolveError(f"a submodel point lies outside the segment mesh (reference coordinate {np.min(best_off):.2g})")
    el = ElementTetP2()
    ed = basis.element_dofs[:, tind]  # (30, n): local dof 3·s + c is component c of scalar function s
    out = np.zeros((3, points.shape[1]))
    for s in range(el.doflocs.shape[0]):
        phi = _lbasis_at(el, X, s)
        for c in range(3):
            out[c] += x[ed[3 * s + c]] * phi
    return out


def _lbasis_at(el, X: np.ndarray, s: int) -> np.ndarray:
    """Shape function ``s`` of ``el`` at the reference points X (3, n), one point per element."""
    return np.asarray(el.lbasis(X, s)[0])


@dataclass
class SubResult:
    """One load on a submodel: the factor (its peak over the segment model's nominal), where it sits
    (x, y, z) [m], the nominal [Pa] (the segment model's), the unknowns, the node points and stress."""

    load_case: str
    factor: float
    peak_at: np.ndarray
    nominal: float
    dofs: int
    node_points: np.ndarray
    node_stress: np.ndarray


def solve_submodel(sub: Submodel, driver: dict, E: float = 2.0e11, nu: float = 0.3) -> dict:
    """Solve the submodel ``sub`` for each load of ``driver`` ({load: :class:`fem.solid.SolidResult`} of
    the segment model, with its basis and solution): the driver's displacement on the cut faces, mirror
    conditions on the mirror faces, the peak read on the free surface at least :data:`GUARD` sizes from
    the cut faces. Returns {load: :class:`SubResult`}."""
    sm = sub.sm
    loads = tuple(driver)
    basis = Basis(sm.mesh, ElementVector(ElementTetP2()), mapping=boundary_mapping(sm.mesh))
    K = solid.stiffness(basis, E, nu)
    n = K.shape[0]
    fixed = basis.get_dofs(sm.ends).all()
    nodes = fixed[fixed % 3 == 0] // 3
    if not np.array_equal(np.sort(fixed), np.sort(np.concatenate([3 * nodes + c for c in range(3)]))):
        raise SolveError("the cut faces' unknowns are not whole nodes")
    loc = basis.doflocs[:, 3 * nodes]
    free = np.setdiff1d(np.arange(n), fixed)
    Kff = K[free][:, free].tocsr()
    Kfc = K[free][:, fixed]
    X = np.zeros((n, len(loads)))
    for j, load in enumerate(loads):
        g = driver[load]
        u = field_at(g.basis, g.x, loc)
        for c in range(3):
            X[3 * nodes + c, j] = u[c]
    solid.solve_free(sm, basis, loads, Kff, Kfc, X, None, fixed, free)
    box = sub.box
    guard = GUARD * sub.size
    L = sm.segment.length
    tol = 1e-9 * sm.segment.d
    mirror = {(0, 0): sm.symmetry >= 1 and abs(box[0]) < tol, (2, 0): sm.symmetry == 2 and abs(box[4] - L / 2) < tol}
    cut_planes = [(axis, box[2 * axis + k]) for axis in range(3) for k in (0, 1) if not mirror.get((axis, k), False)]
    out = {}
    for j, load in enumerate(loads):
        pts, sig = solid.surface_stresses(sm, basis, X[:, j], E, nu)
        npts, nsig = solid.recovered_surface_stresses(sm, pts, sig)
        if sm.symmetry:
            npts, nsig = solid.mirrored_surface_stresses(sm, npts, nsig, load)
        mag = solid.stress_measure(nsig, load)
        # the free surface folded into the model (the mirror images read as their originals), away from
        # every cut face
        q = npts.copy()
        if sm.symmetry:
            q[0] = np.abs(q[0])
        if sm.symmetry == 2:
            q[2] = L / 2 + np.abs(q[2] - L / 2)
        ok = np.ones(npts.shape[1], bool)
        for axis, val in cut_planes:
            ok &= np.abs(q[axis] - val) > guard
        if not np.any(ok):
            raise SolveError("the submodel box leaves no free surface beyond its guard from the cut faces")
        i = int(np.argmax(np.where(ok, mag, -np.inf)))
        nominal = driver[load].nominal
        out[load] = SubResult(load, float(mag[i] / nominal), npts[:, i], nominal, int(n), npts, nsig)
    return out

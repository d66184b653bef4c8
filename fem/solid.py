"""3-D linear elasticity of a short length of shaft with a local feature (a keyseat's end, a cross hole,
a shoulder, or a shoulder with a keyseat or hole beside it).

A cross-section sees a keyseat as a prism; the keyseat's end and a transverse hole are 3-D features.
Here a short segment of round shaft (a few diameters long) is built as an OpenCASCADE solid in gmsh
(with a :class:`Shoulder`, its meridian outline turned about the axis, the fillet an exact torus),
the feature cut from it by a boolean, meshed with second-order (10-node, curved) tetrahedra refined
at the feature and solved with isoparametric P2 elements (:class:`skfem.MeshTet2`,
``ElementVector(ElementTetP2())``; the weak form is :func:`fem.forms.elasticity`).

Loads. Both end faces carry the exact displacement of the plain round bar for the load (Timoshenko &
Goodier, Theory of Elasticity, 3rd ed., the elementary solutions of a prismatic bar: simple tension,
pure bending, torsion of a circular shaft), with z measured from the segment's middle:

* tension: u = ε(−νx, −νy, z);
* bending about the x axis (``bending_x``, σ_zz = Eκy):  u = κ(−νxy, −(z² + ν(y² − x²))/2, yz);
* bending about the y axis (``bending_y``, σ_zz = Eκx):  u = κ(−(z² + ν(x² − y²))/2, −νxy, xz);
* torsion: u = θz(−y, x, 0).

The segment must be long enough that its ends are plain bar (a feature must stay :data:`END_ZONE`
diameters from each end face), so the prescribed ends add no disturbance of their own at the feature;
``far_field`` says how far the surface stress near the end faces departs from the plain bar's (read on
the nodal-averaged stress). Measured (tests/benchmarks/bench_segment_length.py): at END_ZONE the
feature's own field still reaches the end zones (12-27 % of nominal) and a keyseat's Kt in tension read
4.6 % low; from 1 diameter on the factors stayed within the meshes' scatter (compare/checks/segment_far_field.py
warns above 10 %).
The force, moments and torque are the sums of the consistent nodal reactions (K·u) on one end face,
so the nominal stresses use the load the model actually carries.

With a shoulder the two ends are bars of different diameters (d at z = 0, D at z = length), and the
plain-bar displacement of one diameter is no solution at the other. The d end takes the exact
plain-bar displacement above (which also holds the rigid-body motion); the D end takes the exact
plain-bar stress of diameter D as a traction, (τ_xz, τ_yz, σ_zz), scaled to carry the very force,
moment or torque that the d end's displacement implies (N = EεA_d, M = EκI_d, T = GθJ_d;
:func:`end_traction_load`). Each end thus holds its own bar's exact solution; the moment is constant
along the segment (no shear force), and no rigid-body motion is left free. (Prescribing both ends'
displacements would need the unknown relative rotation and shift of the D end as extra unknowns;
the traction end has none.) The load is the sum of the reactions at the d end, and the nominal
stresses are those of d. The far-field check compares each end zone with its own diameter's
elementary stress.

Nominal stresses are those of the plain (gross) round section of diameter d: N/A, 32M/(πd³),
16T/(πd³), with A = πd²/4 — the keyseat or hole is not deducted (handbook charts that use a net
section are converted where they are compared). Factors: Kt = (largest principal stress)/nominal in
tension and bending, Kts = (largest shear stress, half the largest difference of the three principal
stresses)/nominal in torsion.

Peaks are read on the boundary: the stress is evaluated from the owning element at fixed points of
every boundary facet (its three corners, three edge midpoints and centroid), on the lateral surface
only (the end faces carry the prescribed displacement), never as the largest interior quadrature
value; the factor is the largest value of that stress averaged at each boundary node (corner or
edge midpoint) over the lateral facets that share it (:func:`recovered_surface_stresses`), which
removes most of the jumps between elements (the raw largest value is kept as ``factor_raw``).

Sizes: the refinement sits where the peak can sit (:func:`peak_zones`: a keyseat's rounded ends and
its bottom fillet, a hole, a cavity, a shoulder's fillet) at each feature's own smallest
radius/(PER_RADIUS·fineness); a keyseat's flat walls and bottom get :data:`WALL` times that; gmsh's
curvature sizing is off when there is a feature.

Solver: the displacements of the end faces are eliminated; the remaining SPD system is solved
by :func:`fem.linalg.solve_spd` — a direct factorisation up to :data:`DIRECT_LIMIT` unknowns,
above it smoothed-aggregation AMG with the six rigid-body modes as near-null space (3×3 nodal blocks)
preconditioning CG — every solve checked against its residual.

Mirror symmetry (:func:`symmetry_of`, ``symmetry`` of :func:`mesh_segment`): a keyseat centred on
x = 0, a cavity on the axis and a through cross hole are symmetric about the plane x = 0, and a
feature centred along the segment about the mid-length plane; then the half (x ≥ 0) or the quarter
(also z ≥ length/2) is meshed and each load solved with its mirror conditions (:data:`PARITY`: on a
mirror plane the normal displacement is zero for a symmetric load, the two tangential ones for an
antisymmetric one; one matrix per parity group). The nodal surface stress is completed to the
whole lateral surface by reflection (:func:`mirrored_surface_stresses`), so factors, peak places and
superposed stresses read the whole segment; the end-face load is twice the half face's. The tests
check the half and quarter models against the whole model on the mirrored mesh (equal to 1e-6).
Measured on the demo keyseat end (tests/benchmarks/bench_segment_accuracy.py, d 30 mm, 8 × 4 mm,
fillet 0.6 mm, fineness 0.3; estimates tension / bending x / bending y / torsion): whole segment
40k/68k/123k unknowns, 149 CPU s, 2.3 GB, 35 / 19 / 1.7 / 2.1 %; quarter model 12k/18k/30k, 41 CPU s,
1.1 GB, 10 / 9 / 0.8 / 2.1 %; quarter with ``local`` 1.7: 22k/43k/85k, 108 CPU s, 1.65 GB,
2.1 / 2.7 / 0.9 / 7.3 % (re-measured on the present sizes; on an earlier tree 24k/44k/86k,
1.3 / 1.8 / 0.6 / 1.6 %; the other figures here are from earlier trees, not re-measured);
``local`` 2.0: 31k/60k/121k, 158 CPU s, 2.3 GB, 3.7 / 0.7 / 0.7 / 3.5 %;
``local`` 2.5: 48k/95k/201k, 222 CPU s, 3.0 GB, 2.5 / 1.5 / 0.2 / 3.8 %
(oscillating by 0.5–1 % between meshes: the scatter on the 0.6 mm fillet; DEVELOPERS.md lists the
mesh-quality, sizing and surface-projection variants tried against it). Two readings did
not pay: the stress from the surface's tangential strains with the plane-stress law read 4–6 % low
on the coarse meshes and converged slower; a least-squares fit over a patch of facet values around
the peak node read 2.61–2.37 against the nodes' 2.93 on the 0.6 mm fillet (the patch spans the
fillet's turn), while on the cavity it gave 2.068–2.074 against Goodier's 2.045.

SI throughout. Meshing is done in a scale-free frame (every length divided by d), so a scaled
segment gets the same mesh.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
import scipy.sparse as sp
from skfem import Basis, ElementTetP2, ElementVector, FacetBasis, MeshTet2
from skfem.mapping import MappingIsoparametric

from . import forms
from .errors import InputError, SolveError
from .gmshload import initialize as initialize_gmsh, load_gmsh
from .linalg import solve_spd
from .mesh import boundary_mapping

LOADS = ("tension", "bending_x", "bending_y", "torsion")

#: Elements across the diameter far from the feature at fineness 1 (global size d/ACROSS).
ACROSS = 5.0
#: Elements per full turn of a curved feature surface at fineness 1 (gmsh's curvature sizing).
PER_TURN = 20.0
#: Size where the peak can sit (:func:`peak_zones`): the feature's smallest radius divided by this,
#: at fineness 1 (so two elements per fillet radius on the coarsest mesh of a study, ×1.96).
PER_RADIUS = 4.0
#: Size on the feature's other surfaces (a keyseat's prismatic walls and fillets) over the peak size.
WALL = 2.5
#: Growth of the size away from the feature surfaces (size per unit distance).
GRADE = 0.5
#: Points per direction at which gmsh samples a surface for its distance field.
SAMPLING = 40
#: Finer balls at a profile keyseat's predicted peak places (:func:`peak_points`): None, or (divisor
#: of the peak size inside the ball, ball radius in fillet radii). Inside the ball the size is the
#: peak size / divisor (times ``scale``: similar meshes), growing outside it to the global size over
#: a transition whose length is fixed (the same on every mesh of a study, so the ball's whole size
#: field is scaled with the mesh). Measured: DEVELOPERS.md, "3-D keyseat end at 1 %".
PEAK_BALL = None
#: Make a study's meshes similar in their graded zones as well (False: today's sizing): the growth
#: away from the feature GRADE × scale and the distance fields sampled at SIMILAR_SAMPLING / scale
#: points per direction, so every size of the field is ×scale at the same place. Measured:
#: DEVELOPERS.md, "3-D keyseat end at 1 %".
SIMILAR = False
SIMILAR_SAMPLING = 150
#: Read the factor from the nodal-averaged surface stress (True) or the raw element values (False).
#: Measured on the demo keyseat (fineness 0.3, 25k-67k unknowns): averaged 2.75, 2.70, 2.82 in
#: tension and 2.07, 2.14, 2.18 in torsion against raw 2.91, 3.03, 2.84 and 2.84, 3.10, 2.32.
#: Read at the largest node, not between nodes: the largest value of the quadratic interpolant of the
#: nodal tensors lies 0.3-1.3 % higher, but the interpolant at one fixed point of the peak scatters
#: 1.4 % between the finest meshes of three studies (tests/benchmarks/bench_segment_reading.py,
#: DEVELOPERS.md), and it overshoots on the coarse plain bar (bending about y 1.08-1.13 against 1.02).
RECOVERED = True
#: The refined size holds this many smallest radii away from the feature surfaces, then grows at
#: :data:`GRADE`.
GROW = 1.0
#: A feature must stay this many diameters away from each end face (plain bar at the ends).
END_ZONE = 0.75
#: No peak is read within this many diameters of an end face (the end faces carry the prescribed
#: displacement or traction), each end in its own diameter (:func:`away_from_ends`).
PEAK_END_ZONE = 0.5 * END_ZONE
#: Direct factorisation up to this many unknowns (3-D fill-in is far larger than 2-D: measured
#: with tests/benchmarks/bench_solid.py), AMG + CG above it.
DIRECT_LIMIT = 40_000
#: CG iteration cap (measured: 35 iterations to 1e-10 at 70k unknowns with the rigid-body modes).
MAXITER = 600
#: Reference points on each boundary triangle where the surface stress is read: the corners, the
#: edge midpoints and the centroid.
FACET_POINTS = np.array([[0.0, 1.0, 0.0, 0.5, 0.5, 0.0, 1 / 3],
                         [0.0, 0.0, 1.0, 0.0, 0.5, 0.5, 1 / 3]])


# ----------------------------------------------------------------------------- geometry


@dataclass(frozen=True)
class CrossHole:
    """A transverse hole along the x axis crossing the shaft axis at ``z`` [m]: ``diameter`` [m];
    ``depth`` [m] from the surface at x = +R for a blind hole (ball-ended bottom, so no sharp edge)
    or None for a through hole; a 45° ``chamfer`` [m] (leg length along the hole axis) at each mouth."""

    diameter: float
    z: float
    chamfer: float = 0.0
    depth: float | None = None
    kind = "cross_hole"

    @property
    def small(self) -> float:
        return self.diameter / 2 if self.chamfer == 0 else min(self.diameter / 2, 2 * self.chamfer)

    def span(self) -> tuple[float, float]:
        c = self.diameter / 2 + self.chamfer
        return self.z - c, self.z + c


@dataclass(frozen=True)
class ProfileKeyseat:
    """An end-milled (profile) keyseat on the +y side from ``z0`` to ``z1`` [m] (its rounded ends
    included: end radius = width/2, the cutter's), ``width`` and ``depth`` [m] (depth from the top
    of the shaft, as a keyseat's t1), bottom ``fillet`` [m] (the cutter's corner radius, along the
    walls and round the ends)."""

    width: float
    depth: float
    z0: float
    z1: float
    fillet: float
    kind = "keyseat_end"

    @property
    def small(self) -> float:
        return self.fillet

    def span(self) -> tuple[float, float]:
        return self.z0, self.z1


@dataclass(frozen=True)
class SledKeyseat:
    """A sled-runner keyseat on the +y side cut by a disk cutter of ``cutter_diameter`` [m]: full
    depth from ``z0`` to ``z1`` [m] (the cutter's centre travel), running out along the cutter's
    radius beyond; ``width``, ``depth`` [m] and the cutter's corner ``fillet`` [m]."""

    width: float
    depth: float
    z0: float
    z1: float
    cutter_diameter: float
    fillet: float
    kind = "sled_runner"

    @property
    def small(self) -> float:
        return self.fillet

    def span(self) -> tuple[float, float]:
        rc = self.cutter_diameter / 2
        run = math.sqrt(max(rc**2 - (rc - self.depth) ** 2, 0.0))
        return self.z0 - run, self.z1 + run


@dataclass(frozen=True)
class Cavity:
    """A spherical cavity of ``radius`` [m] centred on the axis at ``z`` [m] (verification)."""

    radius: float
    z: float
    kind = "cavity"

    @property
    def small(self) -> float:
        return self.radius

    def span(self) -> tuple[float, float]:
        return self.z - self.radius, self.z + self.radius


@dataclass(frozen=True)
class Shoulder:
    """A shoulder at ``z`` [m]: the shaft steps from the segment's diameter d (z < ``z``) up to ``D``
    [m] (z > ``z``) through a ``fillet`` [m] of full quarter round, tangent to the small cylinder
    (at z − fillet) and to the shoulder face (the plane z = ``z``)."""

    D: float
    z: float
    fillet: float
    kind = "shoulder"

    @property
    def small(self) -> float:
        return self.fillet

    def span(self) -> tuple[float, float]:
        return self.z - self.fillet, self.z


@dataclass(frozen=True)
class Segment:
    """A round shaft of diameter ``d`` [m] from z = 0 to ``length`` [m] with its ``features``; with a
    :class:`Shoulder` the diameter is ``D`` beyond it (z > shoulder.z)."""

    d: float
    length: float
    features: tuple = ()

    @property
    def shoulder(self) -> Shoulder | None:
        return next((f for f in self.features if isinstance(f, Shoulder)), None)

    @property
    def far_diameter(self) -> float:
        """The diameter at the end face z = length (D with a shoulder, else d)."""
        sh = self.shoulder
        return self.d if sh is None else sh.D

    def diameter_at(self, z: float) -> float:
        """The plain diameter [m] at ``z`` (d before a shoulder's face, D beyond it)."""
        sh = self.shoulder
        return self.d if sh is None or z < sh.z else sh.D

    def check(self, field_name: str = "segment") -> None:
        if not (self.d > 0 and math.isfinite(self.d)):
            raise InputError(f"{field_name}.d", self.d, "must be a positive length")
        if not (self.length > 2 * END_ZONE * self.d):
            raise InputError(f"{field_name}.length", self.length,
                             f"must exceed {2 * END_ZONE:g} diameters (plain bar at both ends)")
        shoulders = [i for i, f in enumerate(self.features) if isinstance(f, Shoulder)]
        if len(shoulders) > 1:
            raise InputError(f"{field_name}.features[{shoulders[1]}]", "shoulder", "is a second shoulder (at most one)")
        sh = self.shoulder
        if sh is not None:
            name = f"{field_name}.features[{shoulders[0]}]"
            if not (math.isfinite(sh.D) and sh.D > self.d):
                raise InputError(f"{name}.D", sh.D, "must be larger than the segment's diameter d")
            if not (math.isfinite(sh.fillet) and sh.fillet > 0):
                raise InputError(f"{name}.fillet", sh.fillet,
                                 "must be positive (a sharp shoulder has no bounded peak)")
            if sh.fillet > (sh.D - self.d) / 2 * (1 + 1e-12):
                raise InputError(f"{name}.fillet", sh.fillet,
                                 "must not exceed the step (D - d)/2 (a tangent quarter round)")
            if sh.z - sh.fillet < END_ZONE * sh.D or sh.z > self.length - END_ZONE * sh.D:
                raise InputError(f"{name}.z", sh.z, f"puts the shoulder closer than {END_ZONE:g} larger "
                                 "diameters to an end face")
            if len(self.features) > 2:
                raise InputError(f"{field_name}.features", len(self.features),
                                 "features next to a shoulder: at most one besides it")
        for i, f in enumerate(self.features):
            if isinstance(f, Shoulder):
                continue
            name = f"{field_name}.features[{i}]"
            a, b = f.span()
            dl = self.diameter_at(a)
            if sh is not None:
                ra, rb = _tool_reach(f, dl / 2)
                if rb > sh.z - sh.fillet and ra < sh.z:
                    raise InputError(f"{name}.z", getattr(f, "z", getattr(f, "z0", None)),
                                     "puts the feature's cut on the shoulder's fillet or face (they must not overlap)")
            R = dl / 2
            if a < END_ZONE * self.d or b > self.length - END_ZONE * self.far_diameter:
                raise InputError(f"{name}.z", getattr(f, "z", getattr(f, "z0", None)),
                                 f"puts the feature closer than {END_ZONE:g} diameters to an end face")
            if isinstance(f, CrossHole):
                if not 0 < f.diameter < dl * 0.6:
                    raise InputError(f"{name}.diameter", f.diameter, "must be between 0 and 0.6 of the shaft diameter")
                if f.chamfer < 0 or f.chamfer > f.diameter / 2:
                    raise InputError(f"{name}.chamfer", f.chamfer, "must be between 0 and the hole radius")
                if f.depth is not None and not (f.diameter / 2 < f.depth < dl - f.diameter / 2):
                    raise InputError(f"{name}.depth", f.depth, "must leave the ball-ended bottom inside the shaft")
            elif isinstance(f, (ProfileKeyseat, SledKeyseat)):
                if not 0 < f.width < dl:
                    raise InputError(f"{name}.width", f.width, "must be between 0 and the shaft diameter")
                if not 0 < f.depth < R:
                    raise InputError(f"{name}.depth", f.depth, "must be between 0 and the shaft radius")
                if not 0 < f.fillet < min(f.width / 2, f.depth):
                    raise InputError(f"{name}.fillet", f.fillet,
                                     "must be positive and below half the width and the depth (a sharp corner has no bounded peak)")
                if isinstance(f, ProfileKeyseat) and not f.z1 - f.z0 > f.width:
                    raise InputError(f"{name}.z1", f.z1, "must make the keyseat longer than its width")
                if isinstance(f, SledKeyseat) and not f.cutter_diameter / 2 > f.depth:
                    raise InputError(f"{name}.cutter_diameter", f.cutter_diameter, "must exceed twice the depth")
            elif isinstance(f, Cavity):
                if not 0 < f.radius < 0.4 * dl:
                    raise InputError(f"{name}.radius", f.radius, "must be between 0 and 0.4 of the diameter")


def _tool_reach(f, R: float) -> tuple[float, float]:
    """The z range of the whole volume :func:`_tool` removes for feature ``f`` on a bar of radius
    ``R`` (wider than :meth:`span`, the cut on that bar's surface: a sled runner's cutter disc and a
    chamfer's cone reach further above the surface, where a shoulder's material may be)."""
    if isinstance(f, SledKeyseat):
        return f.z0 - f.cutter_diameter / 2, f.z1 + f.cutter_diameter / 2
    if isinstance(f, CrossHole) and f.chamfer > 0:
        a = f.diameter / 2
        x1 = math.sqrt(max(R**2 - a**2, 0.0)) - f.chamfer
        half = a + (R + a - x1)
        return f.z - half, f.z + half
    return f.span()


def _stadium(occ, y0, hw, c0, c1):
    """A plane stadium face at y = y0 in the x–z plane: half-width ``hw``, end-arc centres at z = c0, c1."""
    p = [occ.addPoint(-hw, y0, c0), occ.addPoint(-hw, y0, c1), occ.addPoint(hw, y0, c1), occ.addPoint(hw, y0, c0)]
    cc = [occ.addPoint(0, y0, c0), occ.addPoint(0, y0, c1)]
    m = [occ.addPoint(0, y0, c0 - hw), occ.addPoint(0, y0, c1 + hw)]
    curves = [occ.addLine(p[0], p[1]), occ.addCircleArc(p[1], cc[1], m[1]), occ.addCircleArc(m[1], cc[1], p[2]),
              occ.addLine(p[2], p[3]), occ.addCircleArc(p[3], cc[0], m[0]), occ.addCircleArc(m[0], cc[0], p[0])]
    return occ.addPlaneSurface([occ.addCurveLoop(curves)])


def _side_stadium(occ, x0, y0, rc, c0, c1):
    """A plane face at x = x0 in the y–z plane: the disk cutter's swept outline, bottom at y = y0,
    cutter radius ``rc``, centre travel c0..c1 along z."""
    yc = y0 + rc
    p = [occ.addPoint(x0, y0, c0), occ.addPoint(x0, y0, c1), occ.addPoint(x0, yc + rc, c1), occ.addPoint(x0, yc + rc, c0)]
    cc = [occ.addPoint(x0, yc, c0), occ.addPoint(x0, yc, c1)]
    m = [occ.addPoint(x0, yc, c0 - rc), occ.addPoint(x0, yc, c1 + rc)]
    curves = [occ.addLine(p[0], p[1]), occ.addCircleArc(p[1], cc[1], m[1]), occ.addCircleArc(m[1], cc[1], p[2]),
              occ.addLine(p[2], p[3]), occ.addCircleArc(p[3], cc[0], m[0]), occ.addCircleArc(m[0], cc[0], p[0])]
    return occ.addPlaneSurface([occ.addCurveLoop(curves)])


def _bar(gmsh, R: float, L: float, shoulder: Shoulder | None) -> list[tuple[int, int]]:
    """The plain bar (frame): a cylinder of radius ``R`` from z = 0 to ``L``, or with a ``shoulder``
    the meridian outline (the small cylinder, the fillet's quarter arc, the shoulder face, the large
    cylinder) turned a full revolution about the z axis, so the fillet is an exact torus."""
    occ = gmsh.model.occ
    if shoulder is None:
        return [(3, occ.addCylinder(0, 0, 0, 0, 0, L, R))]
    Rb, z0, rho = shoulder.D / 2, shoulder.z, shoulder.fillet
    full = rho >= (Rb - R) * (1 - 1e-12)  # the fillet reaches the large diameter: no flat face
    pts = [(0, 0), (R, 0), (R, z0 - rho), (R + rho, z0)]
    if not full:
        pts.append((Rb, z0))
    pts += [(Rb, L), (0, L)]
    tags = [occ.addPoint(x, 0, z) for x, z in pts]
    centre = occ.addPoint(R + rho, 0, z0 - rho)
    curves = [occ.addLine(tags[0], tags[1]), occ.addLine(tags[1], tags[2]),
              occ.addCircleArc(tags[2], centre, tags[3])]
    curves += [occ.addLine(tags[k], tags[k + 1]) for k in range(3, len(tags) - 1)]
    curves.append(occ.addLine(tags[-1], tags[0]))
    face = occ.addPlaneSurface([occ.addCurveLoop(curves)])
    out = occ.revolve([(2, face)], 0, 0, 0, 0, 0, 1, 2 * math.pi)
    occ.remove([(0, centre)])
    return [e for e in out if e[0] == 3]


def _tool(gmsh, f, R: float) -> list[tuple[int, int]]:
    """The volume removed by feature ``f`` (lengths in the frame), as OpenCASCADE dim-tags."""
    occ = gmsh.model.occ
    if isinstance(f, Cavity):
        return [(3, occ.addSphere(0, 0, f.z, f.radius))]
    if isinstance(f, CrossHole):
        a = f.diameter / 2
        out = 2 * R + a
        if f.depth is None:
            tags = [(3, occ.addCylinder(-out, 0, f.z, 2 * out, 0, 0, a))]
            mouths = (1, -1)
        else:
            xb = R - f.depth + a  # the ball's centre
            tags = [(3, occ.addCylinder(xb, 0, f.z, out - xb, 0, 0, a)), (3, occ.addSphere(xb, 0, f.z, a))]
            mouths = (1,)
        if f.chamfer > 0:
            c = f.chamfer
            xs = math.sqrt(R**2 - a**2)  # where the bore meets the shaft surface at its sides
            for s in mouths:
                x1 = xs - c
                tags.append((3, occ.addCone(s * x1, 0, f.z, s * (R + a - x1), 0, 0, a, a + (R + a - x1))))
        return tags
    if isinstance(f, ProfileKeyseat):
        hw = f.width / 2
        y0 = R - f.depth
        s = _stadium(occ, y0, hw, f.z0 + hw, f.z1 - hw)
        ext = occ.extrude([(2, s)], 0, f.depth + R, 0)
        vol = [e for e in ext if e[0] == 3][0][1]
        occ.synchronize()
        bottom = [c[1] for c in gmsh.model.getBoundary([(2, s)], oriented=False)]
        return occ.fillet([vol], bottom, [f.fillet], removeVolume=True)
    if isinstance(f, SledKeyseat):
        hw = f.width / 2
        rc = f.cutter_diameter / 2
        s = _side_stadium(occ, -hw, R - f.depth, rc, f.z0, f.z1)
        ext = occ.extrude([(2, s)], f.width, 0, 0)
        vol = [e for e in ext if e[0] == 3][0][1]
        top = [e for e in ext if e[0] == 2][0]
        occ.synchronize()
        edges = [c[1] for c in gmsh.model.getBoundary([(2, s), top], oriented=False)]
        return occ.fillet([vol], edges, [f.fillet], removeVolume=True)
    raise InputError("segment.features", type(f).__name__, "is not a known feature")


@dataclass
class SolidMesh:
    """A meshed segment: the :class:`skfem.MeshTet2` (metres), the segment, the global and feature
    element sizes [m], and the boundary facets: ``ends`` (both end faces), ``lateral`` (the rest)."""

    mesh: MeshTet2
    segment: Segment
    h: float
    h_feature: float
    ends: np.ndarray
    lateral: np.ndarray
    end1: np.ndarray  # the end face at z = length
    #: 0: the whole segment; 1: the half x ≥ 0 (mirror plane x = 0); 2: the quarter x ≥ 0, z ≥ length/2
    #: (mirror planes x = 0 and z = length/2); see :func:`symmetry_of`
    symmetry: int = 0
    #: the facets of the mirror planes: {"x": ..., "z": ...} (empty for the whole segment)
    planes: dict = field(default_factory=dict)


def _scaled(f, k: float):
    vals = {n: (None if getattr(f, n) is None else getattr(f, n) * k) for n in f.__dataclass_fields__}
    return type(f)(**vals)


def mesh_segment(seg: Segment, fineness: float = 1.0, scale: float = 1.0, local: float = 1.0,
                 symmetry: int = 0) -> SolidMesh:
    """Mesh ``seg`` with curved 10-node tetrahedra: global size d/(ACROSS·fineness), no larger than
    πd/(PER_TURN·fineness) when there is a feature (the cylinder's turn), the feature's sizes from
    :func:`_size_fields` (its smallest radius/(PER_RADIUS·fineness) where the peak can sit); without
    a feature, curvature sizing PER_TURN·fineness elements per turn. ``local`` refines the feature
    alone further (its sizes divided by it; the plain bar keeps its size). ``scale`` multiplies every size (the three meshes of a study:
    scale = 1, r, r², geometrically similar). ``symmetry`` 1 or 2 meshes the half x ≥ 0 or the
    quarter x ≥ 0, z ≥ length/2 (the segment must have that symmetry: :func:`symmetry_of`)."""
    seg.check()
    if symmetry not in (0, 1, 2) or symmetry > symmetry_of(seg):
        raise InputError("segment.symmetry", symmetry, f"must be between 0 and {symmetry_of(seg)} for these features")
    gmsh = load_gmsh()
    initialize_gmsh(gmsh)
    d = seg.d
    R = 0.5  # frame: lengths / d
    L = seg.length / d
    feats = [_scaled(f, 1 / d) for f in seg.features]
    gmsh.model.add("segment")
    try:
        occ = gmsh.model.occ
        gmsh.option.setNumber("General.Terminal", 0)
        gmsh.option.setNumber("General.NumThreads", 1)
        shoulder = next((f for f in feats if isinstance(f, Shoulder)), None)
        bar = _bar(gmsh, R, L, shoulder)
        tools = []
        for f in feats:
            if not isinstance(f, Shoulder):
                tools += _tool(gmsh, f, R if shoulder is None or f.span()[0] < shoulder.z else shoulder.D / 2)
        if tools:
            bar, _ = occ.cut(bar, tools)
        if symmetry:
            z0 = L / 2 if symmetry == 2 else -1.0
            bar, _ = occ.intersect(bar, [(3, occ.addBox(0, -2 * R, z0, 2 * R, 4 * R, L + 2.0 - z0))])
        occ.synchronize()
        h = scale / (ACROSS * fineness)
        hf = h
        if feats:
            h = min(h, scale * math.pi / (PER_TURN * fineness))  # the plain cylinder's turn
            radii = (R,) if shoulder is None else (R, shoulder.D / 2)
            hf = _size_fields(gmsh, feats, radii, L, h, scale, fineness, local, skip=_mirror_surfaces(gmsh, symmetry, L))
        gmsh.option.setNumber("Mesh.MeshSizeMax", h)
        gmsh.option.setNumber("Mesh.MeshSizeMin", 0.0)
        # gmsh's curvature sizing would refine every small fillet along its whole length (and cost
        # minutes of meshing for a 0.02·d fillet); the fields of _size_fields set the feature's sizes
        # and the plain cylinder gets PER_TURN elements per turn from the global size
        gmsh.option.setNumber("Mesh.MeshSizeFromCurvature", 0 if feats else PER_TURN * fineness * local / scale)
        gmsh.option.setNumber("Mesh.MeshSizeExtendFromBoundary", 1)
        # sizes from the fields only, set here: the 2-D section and meridian meshers of the same process
        # set this option to 0, and gmsh keeps options between models, so a 3-D mesh left at gmsh's
        # default (1) depended on what had been meshed before it in the process (measured: a cross
        # hole's study meshed 5979/10425/17544 unknowns alone and 4896/7725/13191 after other tests)
        gmsh.option.setNumber("Mesh.MeshSizeFromPoints", 0)
        gmsh.option.setNumber("Mesh.ElementOrder", 2)
        gmsh.option.setNumber("Mesh.HighOrderOptimize", 2)  # untangle curved elements
        gmsh.option.setNumber("Mesh.SecondOrderLinear", 0)
        gmsh.option.setNumber("Mesh.Algorithm3D", 1)
        gmsh.model.mesh.generate(3)
        mesh = _to_skfem(gmsh, d)
    finally:
        gmsh.model.remove()
    ends, end1, lateral = _boundary_parts(mesh, seg.length)
    planes = {}
    if symmetry:
        lateral, planes = _mirror_facets(mesh, lateral, symmetry, seg)
    return SolidMesh(mesh, seg, h * d, hf * d, ends, lateral, end1, symmetry, planes)


def symmetry_of(seg: Segment) -> int:
    """The mirror symmetry of the segment a model may use: 2 when every feature is symmetric about
    the plane x = 0 and the segment's mid-length plane, 1 about x = 0 only, else 0. Keyseats (profile
    and sled-runner) are cut on the +y side and centred on x = 0; a cavity on the axis; a through
    cross hole along x with equal mouths; a blind hole is not symmetric about x = 0."""
    feats = seg.features
    if not feats or any(isinstance(f, CrossHole) and f.depth is not None for f in feats):
        return 0
    if not all(isinstance(f, (ProfileKeyseat, SledKeyseat, Cavity, CrossHole)) for f in feats):
        return 0
    tol = 1e-9 * seg.d
    mid = all(abs(sum(f.span()) - seg.length) < tol for f in feats)
    return 2 if mid else 1


#: Parity of each load's displacement under the mirror x -> −x and under z -> length − z: +1 when
#: the field is mirror-symmetric (u(Mp) = M u(p), the normal component vanishes on the plane), −1
#: when antisymmetric (u(Mp) = −M u(p), the tangential components vanish), from the plain-bar fields
#: of :func:`plain_bar_displacement` (the features keep the symmetry).
PARITY = {"tension": (1, 1), "bending_x": (1, 1), "bending_y": (-1, 1), "torsion": (-1, -1)}


def _mirror_surfaces(gmsh, symmetry: int, L: float) -> set:
    """The surfaces (frame) of the mirror planes x = 0 and (quarter) z = L/2."""
    out = set()
    if not symmetry:
        return out
    for _, s in gmsh.model.getEntities(2):
        lo, hi = gmsh.model.getParametrizationBounds(2, s)
        uv = [lo[0] + a * (hi[0] - lo[0]) if k == 0 else lo[1] + a2 * (hi[1] - lo[1])
              for a in (0.2, 0.5, 0.8) for a2 in (0.3, 0.7) for k in (0, 1)]
        xyz = np.reshape(gmsh.model.getValue(2, s, uv), (-1, 3))  # sampled points (a bounding box is padded)
        if np.all(np.abs(xyz[:, 0]) < 1e-9) or (symmetry == 2 and np.all(np.abs(xyz[:, 2] - L / 2) < 1e-9)):
            out.add(s)
    return out


def _mirror_facets(mesh, lateral: np.ndarray, symmetry: int, seg: Segment):
    """Split the mirror planes' facets off the lateral boundary: (lateral, {"x": ..., "z": ...})."""
    p = mesh.p[:, mesh.facets[:, lateral]]
    tol = 1e-9 * seg.d
    on_x = np.all(np.abs(p[0]) < tol, axis=0)
    on_z = np.all(np.abs(p[2] - seg.length / 2) < tol, axis=0) if symmetry == 2 else np.zeros_like(on_x)
    planes = {"x": lateral[on_x]}
    if symmetry == 2:
        planes["z"] = lateral[on_z]
    return lateral[~(on_x | on_z)], planes


def feature_edge_length(sm: SolidMesh) -> float | None:
    """Median edge length [m] of the boundary facets on the features' own surfaces (off the plain
    cylinders) inside their :func:`peak_zones`: the element size where the peak sits, as meshed. A
    study's meshes are meant to scale it by their ratio; :func:`compare.solve.segments.study_segment`
    measures it instead of assuming it. None when no such facet exists."""
    seg, m = sm.segment, sm.mesh
    corners = m.p[:, m.facets[:, sm.lateral]]  # (3, 3 corners, facets)
    c = corners.mean(axis=1)
    plain = np.array([seg.diameter_at(z) / 2 for z in c[2]])
    off = np.abs(np.hypot(c[0], c[1]) - plain) > 1e-3 * seg.d
    inside = np.zeros(c.shape[1], dtype=bool)
    for f in seg.features:
        for a, b in peak_zones(f):
            inside |= (c[2] >= a) & (c[2] <= b)
    sel = off & inside
    if not sel.any():
        return None
    e = corners[:, [0, 1, 2], :][:, :, sel] - corners[:, [1, 2, 0], :][:, :, sel]
    return float(np.median(np.linalg.norm(e, axis=0)))


def peak_zones(f, R: float = 0.5):
    """The z ranges (frame or metres, as ``f``) where the peak of feature ``f`` can sit: a profile
    keyseat's two rounded ends (its prismatic middle is the 2-D section's, with a lower peak), every
    other feature whole (a shoulder: its fillet, with the shoulder face at its end)."""
    if isinstance(f, ProfileKeyseat):
        reach = f.width / 2 + 2 * f.fillet
        return [(f.z0, f.z0 + reach), (f.z1 - reach, f.z1)]
    return [f.span()]


def peak_points(f, R: float = 0.5) -> list:
    """Where a profile keyseat's peaks are expected (frame or metres, as ``f`` and ``R``, the shaft's
    radius there): on its bottom fillet 22.5° from the bottom face, round each rounded end at the
    mirror plane x = 0 (tension and bending about x) and across the straight part at its mid-length
    on both sides (torsion: in the prismatic part the peak is the same along the length, and the
    mid-length is the quarter model's mirror plane). Measured on the demo's coarsest mesh at fineness
    0.3: tension and bending x at (0, 11.05, 80.63) mm, torsion at (3.63, 11.05, 63.30) mm, where
    these points fall. Other features: none."""
    if not isinstance(f, ProfileKeyseat):
        return []
    r, a = f.fillet, math.radians(22.5)
    yc = R - f.depth + r  # the fillet's centre line above the bottom face
    y = yc - r * math.cos(a)
    xs = f.width / 2 - r + r * math.sin(a)
    zm = (f.z0 + f.z1) / 2
    return [(0.0, y, f.z0 + r - r * math.sin(a)), (0.0, y, f.z1 - r + r * math.sin(a)),
            (xs, y, zm), (-xs, y, zm)]


def _size_fields(gmsh, feats, radii, L, h, scale, fineness, local, skip=()) -> float:
    """Background sizes (frame), per feature (each with its own smallest radius ``small``): on its
    surfaces inside a :func:`peak_zones` range and on those curved to a radius within twice its
    smallest (a keyseat's bottom fillet along its whole length: in torsion the prismatic part may
    carry the peak) small/(PER_RADIUS·fineness·local), on its other surfaces :data:`WALL` times that,
    growing away from them at :data:`GRADE`; every size times ``scale`` (similar meshes). A surface
    belongs to the feature whose z range holds it; the plain cylinders (``radii``) and end faces get
    the global size, the surfaces in ``skip`` (mirror planes) none. With :data:`PEAK_BALL` a finer
    ball at each of :func:`peak_points`, with :data:`SIMILAR` the growth and the sampling scaled too
    (both off by default: measured, not kept). Returns the smallest size at the peak zones (the
    surfaces' size, not the balls')."""
    tol = 1e-6
    groups = {}  # (size at the surface, distance kept at it) -> surfaces
    for _, s in gmsh.model.getEntities(2):
        if s in skip or _plain_surface(gmsh, s, radii, L):
            continue
        box = gmsh.model.getBoundingBox(2, s)
        owners = [f for f in feats if box[2] >= f.span()[0] - tol and box[5] <= f.span()[1] + tol]
        f = min(owners or feats, key=lambda g: g.small)
        hp = min(h, scale * f.small / (PER_RADIUS * fineness * local))
        inside = any(box[2] >= a - tol and box[5] <= b + tol for a, b in peak_zones(f))
        size = hp if inside or _curved(gmsh, s) > 0.5 / f.small else min(h, WALL * hp)
        groups.setdefault((size, GROW * f.small), []).append(s)
    fm = gmsh.model.mesh.field
    made = []
    for (size, d0), surfs in sorted(groups.items()):
        dist = fm.add("Distance")
        fm.setNumbers(dist, "SurfacesList", surfs)
        fm.setNumber(dist, "Sampling", round(SIMILAR_SAMPLING / scale) if SIMILAR else SAMPLING)
        th = fm.add("Threshold")
        fm.setNumber(th, "InField", dist)
        fm.setNumber(th, "SizeMin", size)
        fm.setNumber(th, "SizeMax", h)
        fm.setNumber(th, "DistMin", d0)
        fm.setNumber(th, "DistMax", d0 + (h - size) / (GRADE * (scale if SIMILAR else 1.0)) + 1e-9)
        made.append(th)
    if PEAK_BALL is not None:
        div, radius = PEAK_BALL
        for f in feats:
            hp = min(h, scale * f.small / (PER_RADIUS * fineness * local))
            vin = hp / div
            # the transition's length fixed (the size at scale 1 growing at GRADE), so the field scales
            thick = (h - vin) / scale / GRADE
            for c in peak_points(f, radii[0]):
                b = fm.add("Ball")
                fm.setNumber(b, "Radius", radius * f.small)
                fm.setNumber(b, "Thickness", thick)
                fm.setNumber(b, "VIn", vin)
                fm.setNumber(b, "VOut", h)
                fm.setNumber(b, "XCenter", c[0])
                fm.setNumber(b, "YCenter", c[1])
                fm.setNumber(b, "ZCenter", c[2])
                made.append(b)
    if len(made) > 1:
        mn = fm.add("Min")
        fm.setNumbers(mn, "FieldsList", made)
        made = [mn]
    if made:
        fm.setAsBackgroundMesh(made[0])
    return min(min(h, scale * f.small / (PER_RADIUS * fineness * local)) for f in feats)


def _curved(gmsh, s: int) -> float:
    """The largest principal curvature [1/frame length] of surface ``s`` at sampled points."""
    lo, hi = gmsh.model.getParametrizationBounds(2, s)
    uv = []
    for a in (0.25, 0.5, 0.75):
        for b in (0.25, 0.5, 0.75):
            uv += [lo[0] + a * (hi[0] - lo[0]), lo[1] + b * (hi[1] - lo[1])]
    kmax, kmin, _, _ = gmsh.model.getPrincipalCurvatures(s, uv)
    return float(np.max(np.abs(np.concatenate([kmax, kmin]))))


def _plain_surface(gmsh, s: int, radii, L: float) -> bool:
    """Whether surface ``s`` (frame) is a plain cylinder of one of ``radii`` or an end face (sampled
    points)."""
    lo, hi = gmsh.model.getParametrizationBounds(2, s)
    uv = []
    for a in (0.2, 0.5, 0.8):
        for b in (0.3, 0.7):
            uv += [lo[0] + a * (hi[0] - lo[0]), lo[1] + b * (hi[1] - lo[1])]
    xyz = np.reshape(gmsh.model.getValue(2, s, uv), (-1, 3))
    r = np.hypot(xyz[:, 0], xyz[:, 1])
    return bool(any(np.all(np.abs(r - R) < 1e-9) for R in radii) or np.all(np.abs(xyz[:, 2]) < 1e-9)
                or np.all(np.abs(xyz[:, 2] - L) < 1e-9))


def _to_skfem(gmsh, d: float) -> MeshTet2:
    tags, coords, _ = gmsh.model.mesh.getNodes()
    xyz = np.reshape(coords, (-1, 3))
    index = np.full(int(tags.max()) + 1, -1, dtype=np.int64)
    index[tags.astype(np.int64)] = np.arange(len(tags))
    _, enodes = gmsh.model.mesh.getElementsByType(11)  # 10-node tetrahedra
    if len(enodes) == 0:
        raise InputError("segment", None, "gmsh produced no second-order tetrahedra")
    # gmsh numbers the edge nodes (01, 12, 20, 30, 32, 31); scikit-fem (01, 12, 02, 03, 13, 23)
    t = index[np.asarray(enodes, dtype=np.int64)].reshape(-1, 10)[:, [0, 1, 2, 3, 4, 5, 6, 7, 9, 8]].T
    used = np.unique(t)
    remap = np.full(len(xyz), -1, dtype=np.int64)
    remap[used] = np.arange(len(used))
    t = remap[t]
    p = xyz[used].T * d
    # positive orientation: swap two vertices (and the edge nodes with them) where the volume is negative
    a, b, c, e = (p[:, t[i]] for i in range(4))
    vol = np.einsum("ij,ij->j", np.cross((b - a).T, (c - a).T).T, e - a)
    neg = vol < 0
    if np.any(neg):
        # swap vertices 1 and 2: edges 01<->02, 13<->23, 12 stays
        t[:, neg] = t[[0, 2, 1, 3, 6, 5, 4, 7, 9, 8]][:, neg]
    return MeshTet2(p, t)


def _boundary_parts(mesh, length: float):
    bf = mesh.boundary_facets()
    z = mesh.p[2, mesh.facets[:, bf]]
    tol = 1e-9 * length
    at0 = np.all(np.abs(z) < tol, axis=0)
    at1 = np.all(np.abs(z - length) < tol, axis=0)
    return bf[at0 | at1], bf[at1], bf[~(at0 | at1)]


# ----------------------------------------------------------------------------- loads and solve


def plain_bar_displacement(load: str, x, y, z, nu: float, amount: float):
    """The exact displacement (3, ...) of the plain round bar for ``load`` (z from the middle):
    ``amount`` is the strain ε (tension), the curvature κ [1/m] (bending) or the twist θ [rad/m]."""
    zero = 0.0 * x
    if load == "tension":
        return np.array([-nu * amount * x, -nu * amount * y, amount * z])
    if load == "bending_x":
        k = amount
        return np.array([-nu * k * x * y, -k * (z**2 + nu * (y**2 - x**2)) / 2, k * y * z])
    if load == "bending_y":
        k = amount
        return np.array([-k * (z**2 + nu * (x**2 - y**2)) / 2, -nu * k * x * y, k * x * z])
    if load == "torsion":
        return np.array([-amount * z * y, amount * z * x, zero])
    raise InputError("load", load, f"must be one of {', '.join(LOADS)}")


def rigid_body_modes(xyz: np.ndarray) -> np.ndarray:
    """The six rigid-body modes (n·3, 6) of nodes at ``xyz`` (3, n), components interleaved."""
    x, y, z = xyz
    n = xyz.shape[1]
    B = np.zeros((n, 3, 6))
    B[:, 0, 0] = B[:, 1, 1] = B[:, 2, 2] = 1.0
    B[:, 0, 3], B[:, 1, 3] = -y, x
    B[:, 1, 4], B[:, 2, 4] = -z, y
    B[:, 0, 5], B[:, 2, 5] = z, -x
    return B.reshape(n * 3, 6)


@dataclass
class SolidResult:
    """One load on one mesh: the load carried (N [N], M [N·m] or T [N·m]), the nominal stress [Pa],
    the factor and where it sits, the surface sample points (3, n) [m] and their stress tensors
    (3, 3, n) [Pa], the basis and solution, the number of unknowns. A half or quarter model's
    points, stress, basis and solution are the model's own; its node_points and node_stress cover
    the whole segment's lateral surface (:func:`mirrored_surface_stresses`)."""

    load_case: str
    load: float
    nominal: float
    factor: float
    peak_at: np.ndarray
    peak_on_feature: bool
    points: np.ndarray
    stress: np.ndarray
    basis: object
    x: np.ndarray
    dofs: int
    far_field: float
    solves: list = field(default_factory=list)
    #: the largest raw element value at the facet sample points over the nominal (the factor is
    #: read from the nodal-averaged surface stress, :func:`recovered_surface_stresses`)
    factor_raw: float | None = None
    #: the lateral boundary's nodes (3, m) [m] and the stress averaged there (3, 3, m) [Pa], from
    #: which the factor is read (:func:`recovered_surface_stresses`)
    node_points: np.ndarray | None = None
    node_stress: np.ndarray | None = None
    #: the kind of the feature the peak sits on (:func:`feature_at`), None on the plain bar
    peak_feature: str | None = None


def _lame(E, nu):
    return E * nu / ((1 + nu) * (1 - 2 * nu)), E / (2 * (1 + nu))


def stiffness(basis, E: float, nu: float):
    """The elasticity matrix of the vector P2 ``basis`` (components interleaved: unknown 3·i + a is
    component a of scalar node i), assembled from the nine :func:`fem.forms.derivative_product`
    blocks of the scalar basis (equal to :func:`fem.forms.elasticity`, about ten times faster)."""
    lam, mu = _lame(E, nu)
    sb = Basis(basis.mesh, ElementTetP2(), mapping=basis.mapping, quadrature=basis.quadrature)
    D = {(a, b): forms.derivative_product(a, b).assemble(sb).tocoo() for a in range(3) for b in range(3)}
    lap = D[0, 0] + D[1, 1] + D[2, 2]
    rows, cols, vals = [], [], []
    for a in range(3):
        for b in range(3):
            blk = (lam * D[b, a] + mu * D[a, b] + (mu * lap if a == b else 0.0)).tocoo()
            rows.append(3 * blk.row + a)
            cols.append(3 * blk.col + b)
            vals.append(blk.data)
    n = 3 * sb.N
    return sp.csr_matrix((np.concatenate(vals), (np.concatenate(rows), np.concatenate(cols))), shape=(n, n))


def away_from_ends(seg: Segment, z) -> np.ndarray:
    """Which axial positions ``z`` [m] lie outside the end zones, where peaks are read: more than
    :data:`PEAK_END_ZONE` diameters from each end face, each end in its own diameter (d at z = 0, the
    segment's :attr:`Segment.far_diameter` at z = length: D beyond a shoulder)."""
    z = np.asarray(z, float)
    return (z > PEAK_END_ZONE * seg.d) & (z < seg.length - PEAK_END_ZONE * seg.far_diameter)


def solve_segment(sm: SolidMesh, loads=LOADS, E: float = 2.0e11, nu: float = 0.3) -> dict:
    """Solve the load cases ``loads`` on the meshed segment (one matrix, one AMG set-up, one CG per
    load); returns {load: :class:`SolidResult`}."""
    for load_case in loads:
        if load_case not in LOADS:
            raise InputError("load", load_case, f"must be one of {', '.join(LOADS)}")
    seg = sm.segment
    d, L = seg.d, seg.length
    basis = Basis(sm.mesh, ElementVector(ElementTetP2()), mapping=boundary_mapping(sm.mesh))
    K = stiffness(basis, E, nu)
    n = K.shape[0]
    sh = seg.shoulder
    # without a shoulder both end faces take the plain bar's displacement; with one, the d end alone
    # (the D end carries the traction of the plain bar of diameter D, module docstring)
    held = sm.ends if sh is None else np.setdiff1d(sm.ends, sm.end1)
    fixed = basis.get_dofs(held).all()
    # every component of an end-face node is fixed, so the free unknowns stay in whole 3-blocks
    loc = basis.doflocs[:, fixed]
    comp = fixed % 3
    free = np.setdiff1d(np.arange(n), fixed)
    Kff = K[free][:, free].tocsr()
    Kfc = K[free][:, fixed]
    X = np.zeros((n, len(loads)))
    F = np.zeros((n, len(loads)))
    for j, load_case in enumerate(loads):
        amount = 1e-3 / d if load_case != "tension" else 1e-3  # any amount: the factors are ratios
        u_ex = plain_bar_displacement(load_case, loc[0], loc[1], loc[2] - L / 2, nu, amount)
        X[fixed, j] = u_ex[comp, np.arange(len(fixed))]
        if sh is not None:
            F[:, j] = end_traction_load(sm, basis, load_case, amount, E, nu)
    solve_free(sm, basis, loads, Kff, Kfc, X, F, fixed, free)
    out = {}
    for j, load_case in enumerate(loads):
        x = X[:, j]
        if sh is None:
            load = _end_load(basis, K @ x, sm.end1, load_case) * (2 if sm.symmetry else 1)  # the end face's half
        else:  # the load the d end carries: its reactions, with the sign of the end z = L's
            load = -_end_load(basis, K @ x, np.setdiff1d(sm.ends, sm.end1), load_case)
        nominal = nominal_stress(load_case, d, load)
        pts, sig = surface_stresses(sm, basis, x, E, nu)
        mag = stress_measure(sig, load_case)
        keep = away_from_ends(seg, pts[2])
        i_raw = int(np.argmax(np.where(keep, mag, -np.inf)))
        npts, nsig = recovered_surface_stresses(sm, pts, sig)
        if sm.symmetry:
            npts, nsig = mirrored_surface_stresses(sm, npts, nsig, load_case)
        nmag = stress_measure(nsig, load_case)
        nkeep = away_from_ends(seg, npts[2])
        if RECOVERED:
            i = int(np.argmax(np.where(nkeep, nmag, -np.inf)))
            at, peak = npts[:, i], nmag[i]
        else:
            at, peak = pts[:, i_raw], mag[i_raw]
        owner = feature_at(seg, at)
        # the far field from the stress the factor is read from (nodal-averaged, whole surface)
        far = _far_field(npts, nmag, np.hypot(npts[0], npts[1]), seg, nominal, load_case)
        out[load_case] = SolidResult(load_case, load, nominal, float(peak / nominal), at, owner is not None,
                                     pts, sig, basis, x, int(n), far, factor_raw=float(mag[i_raw] / nominal),
                                     node_points=npts, node_stress=nsig,
                                     peak_feature=None if owner is None else owner.kind)
    return out


def solve_free(sm: SolidMesh, basis, loads, Kff, Kfc, X: np.ndarray, F: np.ndarray | None, fixed: np.ndarray,
               free: np.ndarray) -> None:
    """Fill the free rows of ``X`` (n × loads; the fixed rows hold the prescribed values) by solving
    Kff·x = F − Kfc·x_fixed per :func:`_mirror_groups` group, the mirror conditions of a half or
    quarter model as identity rows (so the free unknowns stay in whole 3-blocks for the AMG), AMG-CG
    with the rigid-body modes as near-null space above :data:`DIRECT_LIMIT`."""
    B = rigid_body_modes(basis.doflocs[:, free[::3]])
    for cols, zero in _mirror_groups(sm, basis, loads, free):
        K_, B_ = Kff, B
        rhs = -(Kfc @ X[fixed][:, cols])
        if F is not None:
            rhs = rhs + F[free][:, cols]
        if len(zero):
            keep = np.ones(len(free))
            keep[zero] = 0.0
            Dk = sp.diags(keep)
            K_ = (Dk @ Kff @ Dk + sp.diags((1.0 - keep) * Kff.diagonal().mean())).tocsr()
            rhs[zero] = 0.0
            B_ = B * keep[:, None]
        X[np.ix_(free, cols)] = np.reshape(solve_spd(K_, rhs, direct_limit=DIRECT_LIMIT, near_null=B_, blocksize=3,
                                                     maxiter=MAXITER), (len(free), len(cols)))


def _mirror_groups(sm: SolidMesh, basis, loads, free: np.ndarray):
    """The loads grouped by their :data:`PARITY` on the model's mirror planes, each group with the
    positions in ``free`` of the unknowns its mirror conditions set to zero: a symmetric load's normal
    component on a plane, an antisymmetric load's two tangential ones. The whole segment: one group."""
    if not sm.symmetry:
        return [(list(range(len(loads))), np.array([], dtype=np.int64))]
    pos = np.full(3 * basis.N, -1, dtype=np.int64)
    pos[free] = np.arange(len(free))
    groups = {}
    for j, load_case in enumerate(loads):
        groups.setdefault(PARITY[load_case][: sm.symmetry], []).append(j)
    out = []
    for parity, cols in groups.items():
        zero = []
        for name, sign in zip(("x", "z"), parity):
            normal = 0 if name == "x" else 2
            comps = [normal] if sign > 0 else [c for c in range(3) if c != normal]
            dofs = basis.get_dofs(sm.planes[name]).all()
            zero.append(dofs[np.isin(dofs % 3, comps)])
        z = pos[np.unique(np.concatenate(zero))]
        out.append((cols, z[z >= 0]))  # an end face's prescribed (plain-bar) values already obey the mirror
    return out


def mirrored_surface_stresses(sm: SolidMesh, npts: np.ndarray, nsig: np.ndarray, load_case: str):
    """The nodal surface stress of a half or quarter model (:func:`recovered_surface_stresses`)
    completed to the whole segment's lateral surface: the mirror image of each node added with its
    tensor s·MσM (M the reflection, s the load's :data:`PARITY`), and at the nodes on a mirror plane
    the average of the two sides (exactly what the whole segment's averaging gives on the mirrored
    mesh)."""
    tol = 1e-9 * sm.segment.d
    for axis, sign, c in ((0, PARITY[load_case][0], 0.0), (2, PARITY[load_case][1], sm.segment.length / 2))[: sm.symmetry]:
        M = np.ones(3)
        M[axis] = -1.0
        img = sign * nsig * M[:, None, None] * M[None, :, None]
        on = np.abs(npts[axis] - c) < tol
        nsig = nsig.copy()
        nsig[:, :, on] = 0.5 * (nsig[:, :, on] + img[:, :, on])
        q = npts[:, ~on].copy()
        q[axis] = 2 * c - q[axis]
        npts = np.concatenate([npts, q], axis=1)
        nsig = np.concatenate([nsig, img[:, :, ~on]], axis=2)
    return npts, nsig


def end_traction_load(sm: SolidMesh, basis, load_case: str, amount: float, E: float, nu: float) -> np.ndarray:
    """The consistent nodal forces (n,) of the plain-bar stress of diameter D on the end face z = L
    (:func:`fem.forms.plain_bar_end_traction`), carrying the load the plain bar of diameter d takes
    at ``amount`` (strain, curvature [1/m] or twist [rad/m]): N = EεA_d, M = EκI_d, T = GθJ_d, so the
    stress there is that times A_d/A_D, I_d/I_D or J_d/J_D."""
    d, D = sm.segment.d, sm.segment.far_diameter
    G = E / (2 * (1 + nu))
    s0 = sx = sy = tau = 0.0
    if load_case == "tension":
        s0 = E * amount * (d / D) ** 2
    elif load_case == "bending_x":
        sy = E * amount * (d / D) ** 4
    elif load_case == "bending_y":
        sx = E * amount * (d / D) ** 4
    else:
        tau = G * amount * (d / D) ** 4
    fb = FacetBasis(sm.mesh, basis.elem, facets=sm.end1, mapping=basis.mapping, intorder=4)
    return forms.plain_bar_end_traction.assemble(fb, s0=s0, sx=sx, sy=sy, tau=tau)


def feature_at(seg: Segment, at) -> object | None:
    """The feature of ``seg`` a surface point ``at`` (x, y, z) [m] lies on, None on the plain bar
    (the cylinder of its own diameter, :meth:`Segment.diameter_at`). A point off the plain cylinders
    belongs to the feature whose z range holds it (the nearest range when none does: a point on a
    chamfer's rim, say)."""
    x, y, z = (float(v) for v in at)
    dl = seg.diameter_at(z)
    if abs(math.hypot(x, y) - dl / 2) <= 1e-6 * seg.d or not seg.features:
        return None

    def gap(f):
        a, b = f.span()
        return max(a - z, z - b, 0.0)

    return min(seg.features, key=gap)


def nominal_stress(load_case: str, d: float, load: float) -> float:
    """Elementary stress on the surface of the plain round bar of diameter ``d``: 4N/(πd²),
    32M/(πd³), 16T/(πd³)."""
    if load_case == "tension":
        return 4 * load / (math.pi * d**2)
    if load_case.startswith("bending"):
        return 32 * load / (math.pi * d**3)
    return 16 * load / (math.pi * d**3)


def _end_load(basis, reaction: np.ndarray, end1: np.ndarray, load_case: str) -> float:
    """N, M_x, M_y or T carried through the end face z = L: sums of the nodal reactions on it."""
    dofs = basis.get_dofs(end1)
    rx, ry, rz = (reaction[dofs.all(f"u^{i}")] for i in (1, 2, 3))
    xx, yy = basis.doflocs[0, dofs.all("u^1")], basis.doflocs[1, dofs.all("u^1")]
    if load_case == "tension":
        return float(rz.sum())
    if load_case == "bending_x":
        return float((yy * rz).sum())
    if load_case == "bending_y":
        return float((xx * rz).sum())
    return float((xx * ry - yy * rx).sum())


def stress_measure(sig: np.ndarray, load_case: str) -> np.ndarray:
    """Largest principal stress (tension, bending) or largest shear stress (torsion) of the stress
    tensors (3, 3, n)."""
    ev = np.linalg.eigvalsh(np.moveaxis(sig, -1, 0))
    if load_case == "torsion":
        return (ev[:, 2] - ev[:, 0]) / 2
    return ev[:, 2]


def surface_stresses(sm: SolidMesh, basis, x: np.ndarray, E: float, nu: float):
    """Points (3, n) [m] and stress tensors (3, 3, n) [Pa] at :data:`FACET_POINTS` of every lateral
    boundary facet, each from the element that owns the facet."""
    lam, mu = _lame(E, nu)
    fb = _lateral_basis(sm, basis)
    g = fb.interpolate(x).grad  # (3, 3, facets, points)
    eps = 0.5 * (g + np.swapaxes(g, 0, 1))
    tr = np.einsum("ii...->...", eps)
    sig = 2 * mu * eps + lam * tr[None, None] * np.eye(3)[:, :, None, None]
    pts = fb.global_coordinates().value
    return pts.reshape(3, -1), sig.reshape(3, 3, -1)


def recovered_surface_stresses(sm: SolidMesh, pts: np.ndarray, sig: np.ndarray):
    """The surface stress averaged at the boundary nodes: the element values ``sig`` (3, 3, facets·7)
    at ``pts`` of :func:`surface_stresses` at each lateral facet's three corners and three edge midpoints (the
    quadratic boundary's nodes) averaged over every lateral facet that shares the node. Returns the
    node points (3, m) [m] and tensors (3, 3, m) [Pa]: read on the boundary, at its nodes, with the
    jumps between neighbouring elements averaged out."""
    mesh = sm.mesh
    fv = mesh.facets[:, sm.lateral]  # (3, nf)
    nv = mesh.nvertices
    lo = np.minimum(fv[[0, 1, 0]], fv[[1, 2, 2]])
    hi = np.maximum(fv[[0, 1, 0]], fv[[1, 2, 2]])
    keys = np.concatenate([fv, nv + lo * nv + hi]).T.ravel()  # (nf·6,): corners then edges 01, 12, 02
    nf = fv.shape[1]
    take = (np.arange(nf)[:, None] * FACET_POINTS.shape[1] + np.arange(6)[None, :]).ravel()
    uniq, inv = np.unique(keys, return_inverse=True)
    cnt = np.bincount(inv, minlength=len(uniq)).astype(float)
    out = np.zeros((9, len(uniq)))
    for c in range(9):
        out[c] = np.bincount(inv, weights=sig.reshape(9, -1)[c, take], minlength=len(uniq)) / cnt
    where = np.zeros((3, len(uniq)))
    where[:, inv] = pts[:, take]
    return where, out.reshape(3, 3, -1)


def _lateral_basis(sm: SolidMesh, basis):
    memo = getattr(sm, "_lateral", None)
    if memo is None or memo[0] is not basis:
        q = (FACET_POINTS, np.full(FACET_POINTS.shape[1], 1.0 / FACET_POINTS.shape[1]))
        fb = FacetBasis(sm.mesh, basis.elem, facets=sm.lateral, quadrature=q, mapping=_facet_mapping(sm))
        memo = (basis, fb)
        sm._lateral = memo
    return memo[1]


def _facet_mapping(sm: SolidMesh):
    """The mesh's isoparametric mapping, told where the sample points of the lateral facets sit in
    their elements' reference coordinates.

    scikit-fem finds them by a Newton iteration clipped to the unit cube, which can stall on a
    strongly curved tetrahedron; the answer is known exactly (a facet is a face of the reference
    tetrahedron), so it is computed, and checked: the mapped points must be the facet's points to
    1e-9 of the diameter, else :class:`~fem.errors.SolveError`."""
    mesh = sm.mesh
    facets = sm.lateral
    tind = mesh.f2t[0, facets]
    ref = np.array([[0.0, 1.0, 0.0, 0.0], [0.0, 0.0, 1.0, 0.0], [0.0, 0.0, 0.0, 1.0]])
    fv = mesh.facets[:, facets]  # (3, nf) vertices of each facet, in the facet's own order
    tv = mesh.t[:4, tind]  # (4, nf)
    local = np.argmax(tv[None, :, :] == fv[:, None, :], axis=1)  # (3, nf): local vertex of each facet vertex
    V = ref[:, local]  # (3 coords, 3 facet vertices, nf)
    s_, t_ = FACET_POINTS
    Y = (V[:, 0, :, None] + (V[:, 1] - V[:, 0])[:, :, None] * s_[None, None]
         + (V[:, 2] - V[:, 0])[:, :, None] * t_[None, None])

    class _Known(MappingIsoparametric):
        def invF(self, x, tind=None, newton_max_iters=50, newton_tol=1e-10):
            if tind is not None and x.shape == Y.shape and np.array_equal(tind, known_tind):
                return Y
            return super().invF(x, tind=tind, newton_max_iters=newton_max_iters, newton_tol=newton_tol)

    known_tind = tind
    mapping = _Known(mesh, mesh.elem(), mesh.bndelem)
    x = mapping.G(FACET_POINTS, find=facets)
    err = float(np.max(np.abs(mapping.F(Y, tind) - x))) if len(facets) else 0.0
    if not err <= 1e-9 * sm.segment.d:
        raise SolveError(f"the surface sample points do not map onto their facets (off by {err:.1e} m)")
    return mapping


def _far_field(pts, mag, r, seg: Segment, nominal, load_case) -> float:
    """Largest relative departure of the surface stress from the elementary one on the plain
    cylinder within half a diameter of the ends (zero when the model is long enough), each end
    in its own diameter (half of D at a shoulder's D end, as :func:`away_from_ends`) and against
    its own diameter's elementary stress for the same load (the D end of a shoulder: the
    nominal times (d/D)² in tension, (d/D)³ in bending and torsion); relative to the d nominal.
    ``pts``, ``mag``: the nodal-averaged surface stress (the one the factor is read from). The raw
    element values scatter too much on the coarse plain-bar mesh to show the length: measured
    (tests/benchmarks/bench_segment_length.py, fineness 0.4) up to 16 % of nominal raw against up to
    6.3 % nodal-averaged with the feature 1.5–3 diameters from the ends."""
    L = seg.length
    worst = float("nan")
    for end, dia in ((0.0, seg.d), (L, seg.far_diameter)):
        near = (np.abs(pts[2] - end) < 0.5 * dia) & (np.abs(r - dia / 2) < 1e-6 * seg.d)
        if not np.any(near):
            continue
        nom = nominal * (seg.d / dia) ** (2 if load_case == "tension" else 3)
        if load_case == "bending_x":
            ref = nom * np.maximum(pts[1][near], 0) / (dia / 2)
        elif load_case == "bending_y":
            ref = nom * np.maximum(pts[0][near], 0) / (dia / 2)
        else:
            ref = nom
        dev = float(np.max(np.abs(mag[near] - ref))) / nominal
        worst = dev if not worst >= dev else worst
    return worst

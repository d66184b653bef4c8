"""Sections from outside files: a DXF drawing (ezdxf), a planar face in a STEP or BREP file (gmsh's
OpenCASCADE importer), or a ready triangle mesh (meshio).

Every reader turns the file into *pieces* (a line, an arc, a smooth curve; or a whole closed loop),
chains the open pieces end to end into closed loops, and checks the loops: an end that meets no
other piece (an open loop), an end where three or more pieces meet, loops that cross or touch,
loops enclosing no area, islands inside a hole and pieces lying apart are refused with an
:class:`~fem.errors.InputError` naming the entity (type, layer and handle for a DXF). The loop
enclosing the largest area is the outline, the others are holes. Every loop becomes a
:class:`fem.outline.Outline` (a circle a :class:`fem.geometry.Disk`), so curved edges stay curved.

The callers read the files (bounded, regular files; see ``compare.case.case.read_input_file``) and
hand over their text. Coordinates are multiplied by the drawing's length unit in metres and rounded
to 14 significant digits, like every length the case file converts.

A mesh gives only its straight boundary facets: the outline is the polygon of the mesh's boundary
edges, and nothing curved can be claimed for it (``Section.geometry`` says so).
"""
from __future__ import annotations

import io
import math
import os
import tempfile
from dataclasses import dataclass

import numpy as np
from scipy.spatial import cKDTree

from .errors import InputError
from .geometry import Disk, Section
from .gmshload import initialize, load_gmsh
from .outline import Outline, _arc_sweep, _shoelace, crossing

#: $INSUNITS codes of the DXF header -> metres per drawing unit (AutoCAD DXF Reference, HEADER
#: section, $INSUNITS; the unit definitions of NIST SP 811, 2008 ed., Appendix B).
INSUNITS = {1: 0.0254, 2: 0.3048, 4: 1e-3, 5: 1e-2, 6: 1.0, 8: 2.54e-8, 9: 2.54e-5, 10: 0.9144, 13: 1e-6, 14: 0.1}
#: Ends of pieces closer than this fraction of the drawing's extent are one point (drawings are
#: written with 6 to 16 significant digits; 1e-6 joins what the drafter joined and nothing else).
JOIN = 1e-6
#: Points a smooth curve (DXF SPLINE, a STEP B-spline) is resampled at, with its tangents.
CURVE_POINTS = 33
#: Curve kinds that are lines or circles in gmsh's model.
_MAX_ARC = math.pi / 2


@dataclass
class Piece:
    kind: str  # "line" | "arc" | "curve" | "loop" | "circle"
    pts: np.ndarray  # line: (2, 2); arc: (start, end); curve: (n, 2) with tangents
    entity: str  # how the user finds it: 'LINE (layer "0", handle 1F)'
    centre: np.ndarray | None = None  # arc, circle
    sweep: float = 0.0  # arc: signed angle from start to end
    tangents: np.ndarray | None = None  # curve: (n, 2)
    segments: tuple = ()  # loop: Outline segments already closed
    radius: float = 0.0  # circle

    @property
    def start(self):
        return self.pts[0]

    @property
    def end(self):
        return self.pts[-1]


def _round14(v):
    return np.vectorize(lambda x: float(f"{x:.14g}"))(np.asarray(v, float))


# ----------------------------------------------------------------------------- DXF


def _xy(v) -> tuple[float, float]:
    return float(v[0]), float(v[1])


def _entity_name(e) -> str:
    return f'{e.dxftype()} (layer "{e.dxf.layer}", handle {e.dxf.handle})'


def _arc_piece(p0, c, sweep, entity) -> Piece:
    r = float(np.linalg.norm(p0 - c))
    a0 = math.atan2(p0[1] - c[1], p0[0] - c[0])
    p1 = c + r * np.array([math.cos(a0 + sweep), math.sin(a0 + sweep)])
    return Piece("arc", np.array([p0, p1]), entity, centre=np.asarray(c, float), sweep=sweep)


def _bulge_piece(p0, p1, bulge, entity) -> Piece:
    p0, p1 = np.asarray(p0, float), np.asarray(p1, float)
    if abs(bulge) < 1e-12:
        return Piece("line", np.array([p0, p1]), entity)
    theta = 4.0 * math.atan(bulge)
    chord = p1 - p0
    L = float(np.linalg.norm(chord))
    if L == 0:
        raise InputError("section.file", None, f"{entity}: an arc segment has zero length")
    left = np.array([-chord[1], chord[0]]) / L
    c = (p0 + p1) / 2 + left * (L / 2) / math.tan(theta / 2)
    pc = _arc_piece(p0, c, theta, entity)
    pc.pts[-1] = p1  # exactly the next vertex
    return pc


def _polyline_pieces(verts, closed, entity) -> list[Piece]:
    """Pieces of a (LW)POLYLINE given as [(x, y, bulge)]; a closed one comes back as one loop."""
    v = [(float(x), float(y), float(b)) for x, y, b in verts]
    if closed and len(v) > 1 and math.hypot(v[0][0] - v[-1][0], v[0][1] - v[-1][1]) == 0:
        v = v[:-1]
    n = len(v)
    if n < 2 or (closed and n < 2):
        raise InputError("section.file", None, f"{entity}: a polyline with fewer than two points")
    pieces = [_bulge_piece(v[i][:2], v[(i + 1) % n][:2], v[i][2], entity) for i in range(n if closed else n - 1)]
    if closed:
        return [Piece("loop", np.array([p.start for p in pieces]), entity, segments=tuple(pieces))]
    return pieces


def dxf_pieces(text: str, layer: str | None, scale: float | None):
    """The pieces of a DXF drawing's model space (optionally one layer) in metres, and the scale used."""
    import ezdxf  # lazy import: ezdxf is only needed for DXF sections
    from ezdxf.lldxf.const import DXFError

    try:
        doc = ezdxf.read(io.StringIO(text))
    except (DXFError, ValueError, TypeError, IndexError, KeyError, UnicodeError) as exc:
        raise InputError("section.file", None, f"is not a readable DXF drawing ({str(exc).splitlines()[0] if str(exc) else type(exc).__name__})") from None
    if scale is None:
        code = doc.header.get("$INSUNITS", 0)
        if code not in INSUNITS:
            raise InputError("section.units", None, f"is needed: the drawing does not say its length unit ($INSUNITS = {code}); "
                             "give units = \"mm\" (or the unit it was drawn in)")
        scale = INSUNITS[code]
    msp = doc.modelspace()
    layers = sorted({e.dxf.layer for e in msp})
    ents = [e for e in msp if layer is None or e.dxf.layer == layer]
    pieces: list[Piece] = []
    for e in ents:
        t = e.dxftype()
        name = _entity_name(e)
        if t == "LINE":
            pieces.append(Piece("line", np.array([_xy(e.dxf.start), _xy(e.dxf.end)], float), name))
        elif t == "ARC":
            c = np.array(_xy(e.dxf.center), float)
            r = float(e.dxf.radius)
            a0, a1 = math.radians(e.dxf.start_angle), math.radians(e.dxf.end_angle)
            sweep = (a1 - a0) % (2 * math.pi) or 2 * math.pi
            pc = _arc_piece(c + r * np.array([math.cos(a0), math.sin(a0)]), c, sweep, name)
            pieces.append(pc)
        elif t == "CIRCLE":
            pieces.append(Piece("circle", np.array([_xy(e.dxf.center)], float), name,
                                centre=np.array(_xy(e.dxf.center), float), radius=float(e.dxf.radius)))
        elif t == "LWPOLYLINE":
            pieces.extend(_polyline_pieces(list(e.get_points("xyb")), e.closed, name))
        elif t == "POLYLINE":
            if not e.is_2d_polyline:
                raise InputError("section.file", None, f"{name}: a 3-D polyline or mesh; draw the section as a 2-D polyline")
            verts = [(v.dxf.location[0], v.dxf.location[1], v.dxf.get("bulge", 0.0)) for v in e.vertices]
            pieces.extend(_polyline_pieces(verts, e.is_closed, name))
        elif t == "SPLINE":
            bs = e.construction_tool()
            ts = np.linspace(0.0, bs.max_t, CURVE_POINTS)
            pts = np.array([_xy(bs.point(float(u))) for u in ts], float)
            der = np.array([_xy(bs.derivative(float(u), 1)[1]) for u in ts], float)
            pieces.append(Piece("curve", pts, name, tangents=der))
        elif t in ("ELLIPSE", "HATCH", "REGION", "3DFACE", "SOLID", "BODY"):
            raise InputError("section.file", None, f"{name}: {t} entities are not read; draw the outline with lines, "
                             "arcs, circles, polylines or splines")
        # anything else (text, dimensions, points, blocks' inserts) is annotation, not outline
    if not pieces:
        where = f'layer "{layer}"' if layer is not None else "the model space"
        raise InputError("section.layer" if layer is not None else "section.file", layer,
                         f"{where} holds no lines, arcs, circles, polylines or splines"
                         + (f" (layers in the drawing: {', '.join(layers)})" if layers else ""))
    for p in pieces:
        for k in ("pts", "centre"):
            v = getattr(p, k)
            if v is not None:
                setattr(p, k, _round14(v * scale))
        if p.kind == "circle":
            p.radius = float(f"{p.radius * scale:.14g}")
        if p.segments:
            for q in p.segments:
                q.pts = _round14(q.pts * scale)
                if q.centre is not None:
                    q.centre = _round14(q.centre * scale)
        if not np.all(np.isfinite(p.pts)) or (p.centre is not None and not np.all(np.isfinite(p.centre))):
            raise InputError("section.file", None, f"{p.entity}: a coordinate is not a finite number")
    return pieces, scale


def dxf_section(text: str, layer: str | None = None, scale: float | None = None) -> Section:
    """The section a DXF drawing shows (model space, or one layer)."""
    given = scale is not None
    pieces, scale = dxf_pieces(text, layer, scale)
    return section_from_pieces(pieces, source="DXF drawing", scale=scale,
                               extra=(("length_unit", scale, "section.units" if given else "the drawing's $INSUNITS"),))


# ----------------------------------------------------------------------------- STEP / BREP


def cad_section(text: str, suffix: str, scale: float) -> Section:
    """The one planar face in a STEP or BREP file (text), through gmsh's OpenCASCADE importer.
    ``scale`` is metres per file unit (gmsh reads STEP in millimetres unless told otherwise; the
    caller sets it)."""
    gmsh = load_gmsh()
    if not gmsh.isInitialized():
        initialize(gmsh)
    gmsh.option.setNumber("General.Terminal", 0)
    fd, tmp = tempfile.mkstemp(suffix=suffix)
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as fh:
            fh.write(text)
        gmsh.clear()
        gmsh.model.add("import")
        try:
            gmsh.option.setString("Geometry.OCCTargetUnit", "M" if suffix in (".step", ".stp") else "")
            ents = gmsh.model.occ.importShapes(tmp, highestDimOnly=True)
            gmsh.model.occ.synchronize()
        except Exception as exc:  # gmsh raises plain Exceptions with its own message
            raise InputError("section.file", None, f"could not be read as {suffix[1:].upper()} ({str(exc).splitlines()[0]})") from None
        finally:
            gmsh.option.setString("Geometry.OCCTargetUnit", "")
        dims = sorted({d for d, _ in ents})
        faces = [t for d, t in ents if d == 2]
        if dims and max(dims) == 3:
            raise InputError("section.file", None, "holds a solid, not a section: export the planar cross-section face")
        if len(faces) != 1:
            raise InputError("section.file", None, f"holds {len(faces)} faces; give a file with exactly one planar face")
        xmin, ymin, zmin, xmax, ymax, zmax = gmsh.model.getBoundingBox(2, faces[0])
        ext = max(xmax - xmin, ymax - ymin)
        if not ext > 0 or (zmax - zmin) > 1e-5 * ext or abs(zmax + zmin) / 2 > 1e-5 * ext:  # OCC pads boxes by its tolerance
            raise InputError("section.file", None, "the face is not in the plane z = 0 (draw the section in the x-y plane)")
        pieces = []
        bnd = gmsh.model.getBoundary([(2, faces[0])], combined=False, oriented=False)
        for _, c in bnd:
            c = abs(c)
            name = f"{gmsh.model.getType(1, c)} curve {c}"
            lo, hi = (float(v[0]) for v in gmsh.model.getParametrizationBounds(1, c))
            typ = gmsh.model.getType(1, c)
            ends = np.reshape(gmsh.model.getValue(1, c, [lo, hi]), (-1, 3))[:, :2]
            closed = np.linalg.norm(ends[0] - ends[1]) <= 1e-12 * ext
            if typ == "Line":
                pieces.append(Piece("line", ends * scale, name))
            else:
                ts = np.linspace(lo, hi, CURVE_POINTS)
                pts = np.reshape(gmsh.model.getValue(1, c, ts.tolist()), (-1, 3))[:, :2]
                der = np.reshape(gmsh.model.getDerivative(1, c, ts.tolist()), (-1, 3))[:, :2]
                cen = _circumcentre(pts[0], pts[CURVE_POINTS // 3], pts[2 * CURVE_POINTS // 3])
                rad = np.linalg.norm(pts - cen, axis=1) if np.all(np.isfinite(cen)) else np.array([0.0, 1.0])
                if np.ptp(rad) <= 1e-9 * np.max(rad):  # a circle or an arc of one (OCC may call it an ellipse)
                    if closed:
                        pieces.append(Piece("circle", np.array([cen]) * scale, name, centre=cen * scale,
                                            radius=float(np.mean(rad)) * scale))
                    else:
                        sweep = _arc_sweep(pts[0], cen, pts[CURVE_POINTS // 2]) + _arc_sweep(pts[CURVE_POINTS // 2], cen, pts[-1])
                        pc = _arc_piece(ends[0] * scale, cen * scale, sweep, name)
                        pc.pts[-1] = ends[1] * scale
                        pieces.append(pc)
                elif closed:  # one smooth closed curve: two halves
                    h = CURVE_POINTS // 2
                    pieces.append(Piece("curve", pts[:h + 1] * scale, name, tangents=der[:h + 1]))
                    pieces.append(Piece("curve", pts[h:] * scale, name, tangents=der[h:]))
                else:
                    pieces.append(Piece("curve", pts * scale, name, tangents=der))
        for p in pieces:
            p.pts = _round14(p.pts)
            if p.centre is not None:
                p.centre = _round14(p.centre)
        return section_from_pieces(pieces, source=f"{suffix[1:].upper()} face", scale=scale)
    finally:
        gmsh.clear()
        os.unlink(tmp)


def _circumcentre(a, b, c) -> np.ndarray:
    a, b, c = (np.asarray(v, float) for v in (a, b, c))
    d = 2 * (a[0] * (b[1] - c[1]) + b[0] * (c[1] - a[1]) + c[0] * (a[1] - b[1]))
    ux = ((a @ a) * (b[1] - c[1]) + (b @ b) * (c[1] - a[1]) + (c @ c) * (a[1] - b[1])) / d
    uy = ((a @ a) * (c[0] - b[0]) + (b @ b) * (a[0] - c[0]) + (c @ c) * (b[0] - a[0])) / d
    return np.array([ux, uy])


# ----------------------------------------------------------------------------- mesh


def mesh_file_section(text: str, suffix: str, scale: float) -> Section:
    """The outline of a ready triangle mesh (any text format meshio reads): the polygon of its
    boundary edges, in metres (``scale`` metres per file unit). Straight facets only."""
    import meshio  # lazy import: meshio's readers are only needed for mesh sections

    fd, tmp = tempfile.mkstemp(suffix=suffix)
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as fh:
            fh.write(text)
        try:
            m = meshio.read(tmp)
        except Exception as exc:  # noqa: BLE001 - meshio's readers raise many kinds; all mean 'not readable'
            raise InputError("section.file", None, f"could not be read as a mesh ({type(exc).__name__}: "
                             f"{str(exc).splitlines()[0] if str(exc) else 'unreadable'})") from None
    finally:
        os.unlink(tmp)
    tris = [c.data[:, :3] for c in m.cells if c.type in ("triangle", "triangle6")]
    if not tris:
        raise InputError("section.file", None, "holds no triangles")
    t = np.vstack(tris).astype(np.int64)
    p = np.asarray(m.points, float)
    if p.shape[1] > 2 and np.any(np.abs(p[:, 2]) > 1e-9 * np.max(np.ptp(p[:, :2], axis=0))):
        raise InputError("section.file", None, "the mesh is not flat in the plane z = 0")
    p = p[:, :2] * scale
    edges = np.sort(np.vstack([t[:, [0, 1]], t[:, [1, 2]], t[:, [2, 0]]]), axis=1)
    uniq, count = np.unique(edges, axis=0, return_counts=True)
    if np.any(count > 2):
        raise InputError("section.file", None, "an edge is shared by more than two triangles (overlapping triangles)")
    bnd = uniq[count == 1]
    pieces = [Piece("line", _round14(p[[a, b]]), f"boundary edge {a}-{b}") for a, b in bnd]
    return section_from_pieces(pieces, source="triangle mesh", curved=False, scale=scale)


# ----------------------------------------------------------------------------- loops


def chain(pieces: list[Piece], scale: float = 1.0) -> list[list[Piece]]:
    """Open pieces chained end to end into closed loops (each piece oriented along its loop)."""
    loops = [[p] for p in pieces if p.kind in ("loop", "circle")]
    open_ = [p for p in pieces if p.kind not in ("loop", "circle")]
    if not open_:
        return loops
    allpts = np.vstack([p.pts for p in pieces if len(p.pts)] + [np.c_[p.centre + p.radius, p.centre - p.radius].T
                                                                 for p in pieces if p.kind == "circle"])
    tol = JOIN * float(np.max(np.ptp(allpts, axis=0)) or 1.0)
    ends = np.array([[p.start, p.end] for p in open_]).reshape(-1, 2)  # 2i start, 2i+1 end
    tree = cKDTree(ends)
    partner = np.full(len(ends), -1)
    for k in range(len(ends)):
        near = [j for j in tree.query_ball_point(ends[k], tol) if j != k]
        if not near:
            p = open_[k // 2]
            x, y = ends[k]
            raise InputError("section.file", None, f"{p.entity}: the outline is open at {_at(x, y, scale)}; "
                             "no other line, arc or curve ends there")
        if len(near) > 1:
            p = open_[k // 2]
            x, y = ends[k]
            others = ", ".join(open_[j // 2].entity for j in near)
            raise InputError("section.file", None, f"{p.entity}: three or more pieces meet at {_at(x, y, scale)} "
                             f"(also {others}); loops must not overlap, branch or touch")
        partner[k] = near[0]
    used = np.zeros(len(open_), bool)
    for i0 in range(len(open_)):
        if used[i0]:
            continue
        loop, k = [], 2 * i0  # enter piece i0 at its start
        while True:
            i = k // 2
            if used[i]:
                break
            used[i] = True
            p = open_[i] if k % 2 == 0 else _reversed(open_[i])
            loop.append(p)
            k = partner[2 * i + 1 if k % 2 == 0 else 2 * i]  # the end we leave by, and who meets it
        for a, b in zip(loop, loop[1:] + loop[:1]):  # one point where two pieces meet
            m = (a.end + b.start) / 2
            a.pts[-1] = m
            b.pts[0] = m
        loops.append(loop)
    return loops


def _reversed(p: Piece) -> Piece:
    if p.kind == "line":
        return Piece("line", p.pts[::-1].copy(), p.entity)
    if p.kind == "arc":
        return Piece("arc", p.pts[::-1].copy(), p.entity, centre=p.centre, sweep=-p.sweep)
    return Piece("curve", p.pts[::-1].copy(), p.entity, tangents=-p.tangents[::-1])


def _loop_outline(loop: list[Piece]) -> tuple[Outline | Disk, np.ndarray, list[str]]:
    """The loop as a primitive, its sampled polyline, and the entity of each polyline edge."""
    if loop[0].kind == "circle":
        c, r = loop[0].centre, loop[0].radius
        ts = np.linspace(0, 2 * math.pi, 64, endpoint=False)
        poly = np.c_[c[0] + r * np.cos(ts), c[1] + r * np.sin(ts)]
        if not r > 0:
            raise InputError("section.file", None, f"{loop[0].entity}: a circle of zero radius encloses no area")
        return Disk((float(c[0]), float(c[1])), float(r), label=loop[0].entity), poly, [loop[0].entity] * len(poly)
    if loop[0].kind == "loop":
        loop = list(loop[0].segments)
    segs, poly, who = [], [], []
    for p in loop:
        if p.kind == "line":
            segs.append(("line", (tuple(map(float, p.start)),), ()))
            poly.append(p.start)
            who.append(p.entity)
        elif p.kind == "arc":
            n = max(1, math.ceil(abs(p.sweep) / _MAX_ARC - 1e-9))
            r = float(np.linalg.norm(p.start - p.centre))
            a0 = math.atan2(p.start[1] - p.centre[1], p.start[0] - p.centre[0])
            for k in range(n):
                a = a0 + p.sweep * k / n
                q = p.start if k == 0 else p.centre + r * np.array([math.cos(a), math.sin(a)])
                segs.append(("arc", (tuple(map(float, q)), tuple(map(float, p.centre))), ()))
            for k in range(8 * n):
                a = a0 + p.sweep * k / (8 * n)
                poly.append(p.centre + r * np.array([math.cos(a), math.sin(a)]))
                who.append(p.entity)
        else:
            tan = p.tangents / np.linalg.norm(p.tangents, axis=1, keepdims=True)
            segs.append(("spline", tuple(map(tuple, p.pts[:-1].tolist())), tuple(map(tuple, tan.tolist()))))
            poly.extend(p.pts[:-1])
            who.extend([p.entity] * (len(p.pts) - 1))
    return Outline(tuple(segs), label=loop[0].entity, entity=loop[0].entity), np.asarray(poly, float), who


def _inside(pt, poly) -> bool:
    x, y = pt
    xs, ys = poly[:, 0], poly[:, 1]
    x2, y2 = np.roll(xs, -1), np.roll(ys, -1)
    cond = (ys > y) != (y2 > y)
    with np.errstate(divide="ignore", invalid="ignore"):
        xc = xs + (y - ys) * (x2 - xs) / (y2 - ys)
    return bool(np.count_nonzero(cond & (x < xc)) % 2)


def _at(x, y, scale) -> str:
    """A point of the file, in the file's own units."""
    return f"({x / scale:.6g}, {y / scale:.6g})" + (" m" if scale == 1.0 else " in the file's units")


def section_from_pieces(pieces: list[Piece], source: str, curved: bool = True, extra: tuple = (),
                        scale: float = 1.0) -> Section:
    """Chain, check and order the loops; the largest is the outline, the rest holes. ``scale``
    (metres per file unit) only words the points named in errors."""
    loops = chain(pieces, scale)
    prims, polys, whos, areas = [], [], [], []
    for lp in loops:
        prim, poly, who = _loop_outline(lp)
        ext = float(np.max(np.ptp(poly, axis=0))) if len(poly) > 1 else 0.0
        area = abs(_shoelace(poly)) if len(poly) > 2 else 0.0
        if not ext > 0:
            raise InputError("section.file", None, f"{lp[0].entity}: the loop encloses no area")
        hit = crossing(poly)
        if hit is not None and area > 1e-9 * ext * ext:
            raise InputError("section.file", None, f"{lp[0].entity}: the loop crosses or touches itself near "
                             f"{_at(hit[0], hit[1], scale)}")
        if area <= 1e-9 * ext * ext:
            raise InputError("section.file", None, f"{lp[0].entity}: the loop encloses no area"
                             + (" (it folds back on itself or crosses itself)" if hit is not None else ""))
        prims.append(prim)
        polys.append(poly)
        whos.append(who)
        areas.append(area)
    order = list(np.argsort(areas)[::-1])
    prims, polys, loops = [prims[i] for i in order], [polys[i] for i in order], [loops[i] for i in order]
    for i in range(len(polys)):
        for j in range(i + 1, len(polys)):
            hit = crossing(polys[i], polys[j])
            if hit is not None:
                raise InputError("section.file", None, f"{loops[i][0].entity} and {loops[j][0].entity}: the loops cross, "
                                 f"overlap or touch near {_at(hit[0], hit[1], scale)}")
    for j in range(1, len(polys)):
        if not _inside(polys[j][0], polys[0]):
            raise InputError("section.file", None, f"{loops[j][0].entity}: this loop lies outside the outline "
                             f"({loops[0][0].entity}); a shaft section must be one piece")
        for k in range(1, len(polys)):
            if k != j and _inside(polys[j][0], polys[k]):
                raise InputError("section.file", None, f"{loops[j][0].entity}: this loop lies inside the hole "
                                 f"{loops[k][0].entity} (an island); a shaft section must be one piece")
    for p, lp in zip(prims, loops):
        p.validate("section.file")
    steps = [("add", prims[0])] + [("cut", p) for p in prims[1:]]
    geometry = (("source", source, "file"), ("loops", len(prims), "file"),
                ("curved_boundary", curved, "file" if curved else "a mesh gives straight facets only")) + tuple(extra)
    return Section(tuple(steps), kind="imported", geometry=geometry)

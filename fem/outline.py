"""A closed outline of lines, circular arcs and smooth B-splines: the primitive behind splined
shafts (:mod:`fem.splines`) and outlines imported from drawings (:mod:`fem.outline_import`).

An :class:`Outline` is a chain of segments walked in order, each starting where the previous one
ends (the last ends where the first starts):

- ``("line", (start,), ())``
- ``("arc", (start, centre), ())``: the shorter circular arc from ``start`` to the next segment's
  start about ``centre`` (callers split arcs so that each turns less than 180°);
- ``("spline", (start, p1, ..., pn), tangents)``: a C2 B-spline interpolating the points and the
  next segment's start, with the given unit tangent at every one of them (``n + 2`` tangents), so
  a curve such as an involute is built as a smooth curve that follows it closely, never as facets.

Like the other primitives it is a frozen dataclass with ``validate``, ``moved``, ``scaled``,
``mirrored`` and ``build``; ``points`` (the points on the outline) serves the section's frame and
length scale, and ``framed`` maps it into :mod:`fem.mesh`'s scale-free frame.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

import numpy as np
from scipy.spatial import cKDTree

from .errors import InputError

Point = tuple[float, float]


def _rot(deg: float) -> np.ndarray:
    a = math.radians(deg)
    return np.array([[math.cos(a), -math.sin(a)], [math.sin(a), math.cos(a)]])


@dataclass(frozen=True)
class Outline:
    segments: tuple[tuple[str, tuple[Point, ...], tuple[Point, ...]], ...]
    label: str = field(default="", compare=False)  # where it came from, for error messages
    entity: str = field(default="", compare=False)  # the drawing entity it came from, for error messages

    # ------------------------------------------------------------------ geometry
    @property
    def points(self) -> tuple[Point, ...]:
        """The points on the outline (segment starts and spline points), in walking order."""
        out = []
        for kind, pts, _t in self.segments:
            out.append(pts[0])
            if kind == "spline":
                out.extend(pts[1:])
        return tuple(out)

    def ends(self, i: int) -> tuple[np.ndarray, np.ndarray]:
        n = len(self.segments)
        return np.asarray(self.segments[i][1][0], float), np.asarray(self.segments[(i + 1) % n][1][0], float)

    def polyline(self, per_arc: int = 16) -> np.ndarray:
        """The outline sampled as a closed polyline (arcs at ``per_arc`` points, splines at their
        points): for area and crossing checks, never for the analysis itself."""
        out = []
        for i, (kind, pts, _t) in enumerate(self.segments):
            a, b = self.ends(i)
            if kind == "arc":
                c = np.asarray(pts[1], float)
                t0 = math.atan2(a[1] - c[1], a[0] - c[0])
                sweep = _arc_sweep(a, c, b)
                r = float(np.linalg.norm(a - c))
                ts = t0 + sweep * np.arange(per_arc) / per_arc
                out.extend(np.c_[c[0] + r * np.cos(ts), c[1] + r * np.sin(ts)])
            else:
                out.extend(np.asarray(pts, float))
        return np.asarray(out)

    # ------------------------------------------------------------------ primitive protocol
    def validate(self, name: str) -> None:
        prefix = f"{self.entity}: " if self.entity else ""  # the drawing entity, named in every reason

        def err(value, reason):
            return InputError(name, value, prefix + reason)
        if len(self.segments) < 1:
            raise err(None, "the outline has no segments")
        for i, (kind, pts, tans) in enumerate(self.segments):
            arr = np.asarray(pts, float)
            if not np.all(np.isfinite(arr)) or (tans and not np.all(np.isfinite(np.asarray(tans, float)))):
                raise err(None, f"segment {i} holds a value that is not a finite number")
            if kind not in ("line", "arc", "spline"):
                raise err(kind, "unknown segment kind")
        scale = float(np.max(np.ptp(np.asarray(self.points, float), axis=0))) if len(self.points) > 1 else 0.0
        if not scale > 0:
            raise err(None, "the outline encloses no area (all its points coincide)")
        n = len(self.segments)
        for i, (kind, pts, tans) in enumerate(self.segments):
            a, b = self.ends(i)
            if kind != "arc" and n == 1:
                raise err(None, "the outline encloses no area (a single straight or spline segment)")
            if np.linalg.norm(b - a) <= 1e-12 * scale and not (n == 1):
                raise err(None, f"segment {i} has zero length (its ends coincide)")
            if kind == "arc":
                c = np.asarray(pts[1], float)
                ra, rb = np.linalg.norm(a - c), np.linalg.norm(b - c)
                if abs(ra - rb) > 1e-9 * max(ra, rb) or ra <= 1e-12 * scale:
                    raise err(None, f"arc segment {i}: its ends are not on one circle about its centre")
                if _arc_sweep(a, c, b) >= math.pi * (1 - 1e-9):
                    raise err(None, f"arc segment {i} turns 180° or more; split it")
            if kind == "spline" and len(tans) != len(pts) + 1:
                raise err(None, f"spline segment {i} needs one tangent per point")
        poly = self.polyline()
        if abs(_shoelace(poly)) <= 1e-9 * scale**2:
            raise err(None, "the outline encloses no area")
        hit = crossing(poly)
        if hit is not None:
            raise err(None, f"the outline crosses or touches itself near ({hit[0]:.6g}, {hit[1]:.6g})")

    def _map(self, f_point, f_dir):
        segs = tuple((k, tuple(f_point(p) for p in pts), tuple(f_dir(t) for t in tans))
                     for k, pts, tans in self.segments)
        return replace(self, segments=segs)

    def moved(self, dx, dy, deg):
        R = _rot(deg)

        def fp(p):
            q = R @ np.asarray(p, float) + (dx, dy)
            return (float(q[0]), float(q[1]))

        def fd(t):
            q = R @ np.asarray(t, float)
            return (float(q[0]), float(q[1]))

        return self._map(fp, fd)

    def scaled(self, k: float):
        return self._map(lambda p: (k * p[0], k * p[1]), lambda t: t)

    def mirrored(self):
        return self._map(lambda p: (-p[0], p[1]), lambda t: (-t[0], t[1]))

    def framed(self, point, k: float):
        """The outline in a scale-free frame: ``point`` maps (and rounds) a point; directions stay."""
        return self._map(point, lambda t: t)

    def build(self, occ) -> int:
        n = len(self.segments)
        starts = [occ.addPoint(float(p[0]), float(p[1]), 0.0) for p in (s[1][0] for s in self.segments)]
        curves = []
        for i, (kind, pts, tans) in enumerate(self.segments):
            a, b = starts[i], starts[(i + 1) % n]
            if kind == "line":
                curves.append(occ.addLine(a, b))
            elif kind == "arc":
                c = occ.addPoint(float(pts[1][0]), float(pts[1][1]), 0.0)
                curves.append(occ.addCircleArc(a, c, b))
            else:
                mid = [occ.addPoint(float(p[0]), float(p[1]), 0.0) for p in pts[1:]]
                flat = [v for t in tans for v in (float(t[0]), float(t[1]), 0.0)]
                curves.append(occ.addSpline([a, *mid, b], tangents=flat))
        loop = occ.addCurveLoop(curves)
        return occ.addPlaneSurface([loop])


# ----------------------------------------------------------------------------- helpers


def _arc_sweep(a, c, b) -> float:
    """Signed angle of the shorter arc from a to b about c (radians, in (-π, π])."""
    u, v = np.asarray(a, float) - c, np.asarray(b, float) - c
    return math.atan2(u[0] * v[1] - u[1] * v[0], float(u @ v))


def _shoelace(pts: np.ndarray) -> float:
    x, y = pts[:, 0], pts[:, 1]
    return 0.5 * float(np.sum(x * np.roll(y, -1) - np.roll(x, -1) * y))


def _split_long(v: np.ndarray, target: float) -> np.ndarray:
    """The closed polyline ``v`` with every edge longer than ``target`` split evenly."""
    w = np.roll(v, -1, axis=0)
    n = np.maximum(1, np.ceil(np.linalg.norm(w - v, axis=1) / target).astype(np.int64))
    if np.all(n == 1):
        return v
    out = [v[i] + (w[i] - v[i]) * (np.arange(k) / k)[:, None] for i, k in enumerate(n)]
    return np.vstack(out)


def crossing(poly: np.ndarray, other: np.ndarray | None = None):
    """A point where the closed polyline ``poly`` crosses or touches itself (non-adjacent edges), or
    where it meets the closed polyline ``other``; None if nowhere. Candidate edge pairs come from a
    k-d tree on the edge midpoints (edges closer than the longest edge), then an exact test."""
    a = np.asarray(poly, float)
    b = a if other is None else np.asarray(other, float)
    scale = float(max(np.max(np.ptp(a, axis=0)), np.max(np.ptp(b, axis=0))))
    eps = 1e-10 * scale
    # long edges split so that the search radius (the longest edge) stays local
    lengths = np.concatenate([np.linalg.norm(np.roll(v, -1, axis=0) - v, axis=1) for v in (a, b)])
    target = max(4 * float(np.median(lengths)), float(np.sum(lengths)) / 50_000)
    a = _split_long(a, target)
    b = a if other is None else _split_long(b, target)
    na = len(a)
    P, P2 = a, np.roll(a, -1, axis=0)
    Q, Q2 = b, np.roll(b, -1, axis=0)
    ma, mb = (P + P2) / 2, (Q + Q2) / 2
    reach = float(max(np.max(np.linalg.norm(P2 - P, axis=1)), np.max(np.linalg.norm(Q2 - Q, axis=1)))) + 2 * eps
    if other is None:
        pairs = cKDTree(ma).query_pairs(reach, output_type="ndarray")
        i, j = pairs[:, 0], pairs[:, 1]
        keep = ~((i == j) | ((i + 1) % na == j) | ((j + 1) % na == i))
        i, j = i[keep], j[keep]
    else:
        lists = cKDTree(ma).query_ball_tree(cKDTree(mb), reach)
        i = np.array([k for k, lst in enumerate(lists) for _ in lst], dtype=np.int64)
        j = np.array([v for lst in lists for v in lst], dtype=np.int64)
    if len(i):
        p, r = P[i], P2[i] - P[i]
        q, d = Q[j], Q2[j] - Q[j]
        den = r[:, 0] * d[:, 1] - r[:, 1] * d[:, 0]
        w = q - p
        lr, ld = np.linalg.norm(r, axis=1), np.linalg.norm(d, axis=1)
        lr1, ld1 = np.where(lr > 0, lr, 1.0), np.where(ld > 0, ld, 1.0)
        par = np.abs(den) <= 1e-14 * lr * ld
        with np.errstate(divide="ignore", invalid="ignore"):
            t = np.where(par, 0.0, (w[:, 0] * d[:, 1] - w[:, 1] * d[:, 0]) / np.where(par, 1.0, den))
            u = np.where(par, 0.0, (w[:, 0] * r[:, 1] - w[:, 1] * r[:, 0]) / np.where(par, 1.0, den))
        tol_t, tol_u = eps / lr1, eps / ld1
        hit = ~par & (t >= -tol_t) & (t <= 1 + tol_t) & (u >= -tol_u) & (u <= 1 + tol_u)
        # parallel edges that overlap (collinear)
        off = np.abs(w[:, 0] * r[:, 1] - w[:, 1] * r[:, 0]) / lr1
        t0 = (w[:, 0] * r[:, 0] + w[:, 1] * r[:, 1]) / lr1**2
        w2 = Q2[j] - p
        t1 = (w2[:, 0] * r[:, 0] + w2[:, 1] * r[:, 1]) / lr1**2
        hit |= par & (off <= eps) & (np.maximum(t0, t1) >= -tol_t) & (np.minimum(t0, t1) <= 1 + tol_t)
        if np.any(hit):
            k = int(np.argmax(hit))
            pt = p[k] + float(np.clip(t[k], 0, 1)) * r[k]
            return (float(pt[0]), float(pt[1]))
    if other is None:
        # adjacent edges folding back on themselves
        u_ = P2 - P
        v_ = np.roll(u_, -1, axis=0)
        fold = (np.abs(u_[:, 0] * v_[:, 1] - u_[:, 1] * v_[:, 0]) <= 1e-12 * np.linalg.norm(u_, axis=1) *
                np.linalg.norm(v_, axis=1)) & (np.sum(u_ * v_, axis=1) < 0)
        if np.any(fold):
            k = int(np.argmax(fold))
            return (float(P2[k, 0]), float(P2[k, 1]))
    return None

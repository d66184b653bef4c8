"""Splined shaft ends (external splines, the shaft side) as exact sections.

Involute splines: the flanks are the exact involute of the base circle, built as smooth B-splines
through points on it with the involute's own tangent at each point (:class:`fem.outline.Outline`),
joined to the root circle by a root fillet arc tangent to both, and topped by an arc on the major
circle. Straight-sided splines: flanks parallel to each spline's centre line, root fillet arcs,
tip and root arcs.

Involute geometry (any gear text, e.g. Shigley's Mechanical Engineering Design, 10th ed., Sec. 13-5;
the involute function from the same): pitch diameter ``D = m·z``, base diameter ``Db = D·cos α``;
at radius ``r >= Db/2`` the flank of a tooth whose thickness on the pitch circle is ``s`` lies at
the polar angle ``θ(r) = s/D + inv α − inv α_r`` from the tooth's centre line, with
``cos α_r = Db/(2r)`` and ``inv x = tan x − x``. Below the base circle the flank continues as the
radial line the involute starts on.

Default major and minor diameters and root fillet radii are those of ISO 4156-1 (module) and
ANSI B92.1 (diametral pitch) for the flat-root and fillet-root forms, *from memory*: check them
against the standard before relying on them; a case may always give every dimension itself. The
ISO 14 straight-sided series (light and medium) below are also *from memory*.
"""
from __future__ import annotations

import math

import numpy as np

from .errors import InputError
from .geometry import SLIVER, Disk, Section
from .outline import Outline

#: Default diameters and root fillet as multiples of the module m (ISO 4156-1) or of 1/P
#: (ANSI B92.1): (pressure angle, root form) -> (major: z + a, minor: z + b, fillet radius: c),
#: i.e. major = (z + a)·m, minor = (z + b)·m, fillet = c·m. From memory (ISO 4156-1:2005 Table 3
#: and ANSI B92.1-1996 Tables 2 to 4 as remembered); verify against the standard.
DEFAULTS = {
    "ISO 4156": {(30.0, "flat"): (1.0, -1.5, 0.2), (30.0, "fillet"): (1.0, -1.8, 0.4),
                 (37.5, "fillet"): (0.9, -1.4, 0.3), (45.0, "fillet"): (0.8, -1.2, 0.25)},
    "ANSI B92.1": {(30.0, "flat"): (1.0, -1.35, 0.2), (30.0, "fillet"): (1.0, -1.8, 0.4),
                   (37.5, "fillet"): (0.9, -1.4, 0.3), (45.0, "fillet"): (0.8, -1.2, 0.25)},
}
DEFAULTS_SOURCE = {"ISO 4156": "ISO 4156-1 default for this form (from memory)",
                   "ANSI B92.1": "ANSI B92.1 default for this form (from memory)"}
PRESSURE_ANGLES = (30.0, 37.5, 45.0)

#: ISO 14 straight-sided splines, (series, N, minor d [mm], major D [mm]) -> width B [mm]. From memory.
ISO14 = {
    ("light", 6, 23, 26): 6, ("light", 6, 26, 30): 6, ("light", 6, 28, 32): 7, ("light", 8, 32, 36): 6,
    ("light", 8, 36, 40): 7, ("light", 8, 42, 46): 8, ("light", 8, 46, 50): 9, ("light", 8, 52, 58): 10,
    ("light", 8, 56, 62): 10, ("light", 8, 62, 68): 12, ("light", 10, 72, 78): 12, ("light", 10, 82, 88): 12,
    ("light", 10, 92, 98): 14, ("light", 10, 102, 108): 16, ("light", 10, 112, 120): 18,
    ("medium", 6, 11, 14): 3, ("medium", 6, 13, 16): 3.5, ("medium", 6, 16, 20): 4, ("medium", 6, 18, 22): 5,
    ("medium", 6, 21, 25): 5, ("medium", 6, 23, 28): 6, ("medium", 6, 26, 32): 6, ("medium", 6, 28, 34): 7,
    ("medium", 8, 32, 38): 6, ("medium", 8, 36, 42): 7, ("medium", 8, 42, 48): 8, ("medium", 8, 46, 54): 9,
    ("medium", 8, 52, 60): 10, ("medium", 8, 56, 65): 10, ("medium", 8, 62, 72): 12, ("medium", 10, 72, 82): 12,
    ("medium", 10, 82, 92): 12, ("medium", 10, 92, 102): 14, ("medium", 10, 102, 112): 16,
    ("medium", 10, 112, 125): 18,
}
ISO14_SOURCE = "ISO 14 straight-sided spline series (from memory)"

#: Points on each involute flank the B-spline interpolates (with the exact tangent at each): the
#: built curve then follows the involute to better than 1e-6 of the module, also where the flank
#: starts on the base circle (tests/test_fem_splines.py prints the deviation).
FLANK_POINTS = 29


def inv(alpha: float) -> float:
    """The involute function inv α = tan α − α [rad]."""
    return math.tan(alpha) - alpha


class InvoluteFlank:
    """The upper flank (the side at positive angles) of the tooth centred on the +x axis."""

    def __init__(self, rb: float, beta0: float):
        self.rb, self.beta0 = rb, beta0  # base radius; flank angle on the base circle

    def t_at(self, r: float) -> float:
        return math.sqrt(max((r / self.rb) ** 2 - 1.0, 0.0))

    def point(self, t):
        t = np.asarray(t, float)
        r = self.rb * np.sqrt(1 + t * t)
        th = self.beta0 - (t - np.arctan(t))
        return np.stack([r * np.cos(th), r * np.sin(th)], axis=-1)

    def tangent(self, t):
        """Unit tangent in the direction of increasing t (outwards); radial at the base circle."""
        t = np.asarray(t, float)
        r = self.rb * np.sqrt(1 + t * t)
        th = self.beta0 - (t - np.arctan(t))
        er = np.stack([np.cos(th), np.sin(th)], axis=-1)
        et = np.stack([-np.sin(th), np.cos(th)], axis=-1)
        # d/dt divided by t (finite at t = 0)
        d = (self.rb / np.sqrt(1 + t * t))[..., None] * er - (r * t / (1 + t * t))[..., None] * et
        return d / np.linalg.norm(d, axis=-1, keepdims=True)

    def angle_at(self, r: float) -> float:
        """Polar angle of the flank at radius r >= rb."""
        a = math.acos(min(self.rb / r, 1.0))
        return self.beta0 - inv(a)


def _spacing(t0: float, t1: float, n: int) -> np.ndarray:
    """Roll parameters of the flank points, clustered towards both ends (Chebyshev–Lobatto): the
    involute's curvature is unbounded at the base circle, where a flank may start."""
    return t0 + (t1 - t0) * (1 - np.cos(np.linspace(0.0, math.pi, n))) / 2


def _mirror(p):
    p = np.asarray(p, float)
    return np.stack([p[..., 0], -p[..., 1]], axis=-1)


def _rotate_segments(segs, angle: float):
    c, s = math.cos(angle), math.sin(angle)
    R = np.array([[c, -s], [s, c]])
    out = []
    for kind, pts, tans in segs:
        P = [tuple(map(float, R @ np.asarray(p, float))) for p in pts]
        T = [tuple(map(float, R @ np.asarray(t, float))) for t in tans]
        out.append((kind, tuple(P), tuple(T)))
    return out


def _assemble(upper: list, z: int) -> Outline:
    """The closed outline from the upper half of one tooth, given walking *down* from the tip:
    ``upper`` = [(kind, pts, tans)] starting at the tip's upper end and ending at the root arc's
    start (the last segment is the root arc, ending where the next tooth begins). The lower half is
    the mirror image walked up."""
    # lower half: mirror every segment of the upper half except the root arc, walk it reversed
    body = upper[:-1]
    ends = [seg[1][0] for seg in body[1:]] + [upper[-1][1][0]]  # end point of each body segment
    lower = []
    for (kind, pts, tans), end in reversed(list(zip(body, ends))):
        if kind == "line":
            lower.append(("line", (tuple(_mirror(end)),), ()))
        elif kind == "arc":
            lower.append(("arc", (tuple(_mirror(end)), tuple(_mirror(pts[1]))), ()))
        else:  # spline: points reversed and mirrored, tangents reversed, mirrored and negated
            allp = list(pts) + [end]
            rp = [tuple(map(float, _mirror(p))) for p in reversed(allp)]
            rt = [tuple(map(float, -_mirror(t))) for t in reversed(tans)]
            lower.append(("spline", tuple(rp[:-1]), tuple(rt)))
    tip_lower = tuple(map(float, _mirror(upper[0][1][0])))
    tooth = lower + [("arc", (tip_lower, (0.0, 0.0)), ())] + list(upper)
    segs = []
    for k in range(z):
        segs.extend(_rotate_segments(tooth, 2 * math.pi * k / z))
    return Outline(tuple(segs), label="section")


def _fillet_on_line(r_min: float, rho: float, y_line: float):
    """Fillet of radius rho tangent to the root circle (radius r_min, from outside the material's
    hole, i.e. the fillet centre at r_min + rho) and to the line y = y_line (fillet above it)."""
    rc = r_min + rho
    cy = y_line + rho
    if rc <= cy:
        return None
    cx = math.sqrt(rc * rc - cy * cy)
    return np.array([cx, cy]), np.array([cx, y_line]), np.array([cx, cy]) * r_min / rc


def involute_spline_section(teeth, module, pressure_angle, major_diameter=None, minor_diameter=None,
                            root="flat", fillet=None, bore=None, tooth_thickness=None,
                            standard="ISO 4156", as_written=None) -> Section:
    """External involute spline (the shaft side), teeth centred at angles 2πk/z from +x.

    ``module`` in metres (for ANSI B92.1 give 1/P in metres); ``pressure_angle`` in degrees (30, 37.5
    or 45); ``root`` 'flat' or 'fillet' picks the standard's default diameters and root fillet where
    they are not given; ``tooth_thickness`` on the pitch circle defaults to half the circular pitch.
    """
    z = teeth
    if isinstance(z, bool) or not isinstance(z, int) or z < 6 or z > 100:
        raise InputError("section.teeth", z, "must be a whole number from 6 to 100")
    if module is None or not np.isfinite(module) or module <= 0:
        raise InputError("section.module", module, "must be a positive length")
    if pressure_angle not in PRESSURE_ANGLES:
        raise InputError("section.pressure_angle", pressure_angle, "must be 30, 37.5 or 45 (degrees)")
    if root not in ("flat", "fillet"):
        raise InputError("section.root", root, "must be \"flat\" or \"fillet\"")
    m, alpha = float(module), math.radians(pressure_angle)
    table = DEFAULTS[standard]
    key = (float(pressure_angle), root)
    src = {}
    if (major_diameter is None or minor_diameter is None or fillet is None) and key not in table:
        raise InputError("section.root", root, f"{standard} has no {root}-root form at {pressure_angle:g}° "
                         "(from memory: flat root only at 30°); give major_diameter, minor_diameter and fillet, "
                         "or use root = \"fillet\"")
    a, b, c = table.get(key, (None, None, None))
    if major_diameter is None:
        major_diameter, src["major_diameter"] = (z + a) * m, DEFAULTS_SOURCE[standard]
    if minor_diameter is None:
        minor_diameter, src["minor_diameter"] = (z + b) * m, DEFAULTS_SOURCE[standard]
    if fillet is None:
        fillet, src["fillet"] = c * m, DEFAULTS_SOURCE[standard]
    D = z * m
    Db = D * math.cos(alpha)
    s = math.pi * m / 2 if tooth_thickness is None else tooth_thickness
    src.setdefault("tooth_thickness", "half the circular pitch (basic)" if tooth_thickness is None else "given")
    _check_diameters(major_diameter, minor_diameter, bore, fillet)
    if not (s > 0 and np.isfinite(s)) or s >= math.pi * m * (1 - SLIVER):
        raise InputError("section.tooth_thickness", s, f"must be positive and less than the circular pitch ({math.pi * m:g} m)")
    if not (minor_diameter < D < major_diameter):
        raise InputError("section.minor_diameter" if minor_diameter >= D else "section.major_diameter",
                         minor_diameter if minor_diameter >= D else major_diameter,
                         f"the pitch diameter ({D:g} m) must lie between the minor and major diameters")
    R, r, rb, rho = major_diameter / 2, minor_diameter / 2, Db / 2, float(fillet)
    beta0 = s / D + inv(alpha)
    flank = InvoluteFlank(rb, beta0)
    half_pitch = math.pi / z
    tip_angle = flank.angle_at(R)
    if R * tip_angle < SLIVER * major_diameter:
        raise InputError("section.major_diameter", major_diameter, "the teeth come to a point below it (pointed teeth): "
                         "give a smaller major diameter or a thicker tooth")
    if beta0 >= half_pitch * (1 - 1e-9) and r < rb:
        raise InputError("section.tooth_thickness", s, "the teeth meet below the base circle: no space is left between them")
    # the flank's lower end: where it meets the root fillet (or the root circle without one)
    radial = None  # (from radius, to radius) of a radial line below the base circle
    if rho > 0:
        rc = r + rho
        fl = None
        if r < rb:
            # fillet tangent to the radial line at angle beta0 and to the root circle
            ang = beta0 + math.asin(min(rho / rc, 1.0))
            r_t = math.sqrt(rc * rc - rho * rho)
            if r_t <= rb:
                C = rc * np.array([math.cos(ang), math.sin(ang)])
                F = r_t * np.array([math.cos(beta0), math.sin(beta0)])
                fl = (C, F, None)
                radial = (r_t, rb)
        if fl is None:
            def g(t):
                n = flank.tangent(t) @ np.array([[0.0, 1.0], [-1.0, 0.0]])  # tangent turned +90°: into the space
                return float(np.linalg.norm(flank.point(t) + rho * n) - rc)

            t_lo, t_hi = flank.t_at(max(r, rb)), flank.t_at(R)
            if not (g(t_lo) <= 0 < g(t_hi)):
                raise InputError("section.fillet", fillet, "the root fillet does not fit between the root circle and the "
                                 "flank below the major diameter")
            from scipy.optimize import brentq  # noqa: PLC0415  lazy import: ~0.07 s, needed only for a fillet on a flank

            t_f = brentq(g, t_lo, t_hi, xtol=1e-15, rtol=1e-15, maxiter=200) if g(t_lo) < 0 else t_lo
            n = flank.tangent(t_f) @ np.array([[0.0, 1.0], [-1.0, 0.0]])
            C = flank.point(t_f) + rho * n
            fl = (C, flank.point(t_f), t_f)
        C, F, t_f = fl
        P_root = C * r / rc
        phi = math.atan2(C[1], C[0])
        if phi >= half_pitch * (1 - 1e-6):
            raise InputError("section.fillet", fillet, "the root fillet is larger than the space between two teeth allows")
        t_start = 0.0 if t_f is None else t_f
    else:
        if r < rb:
            radial = (r, rb)
            t_start = 0.0
            F = r * np.array([math.cos(beta0), math.sin(beta0)])
        else:
            t_start = flank.t_at(r)
            F = flank.point(t_start)
        P_root = F
        phi = math.atan2(F[1], F[0])
        if phi >= half_pitch * (1 - 1e-6):
            raise InputError("section.tooth_thickness", s, "the teeth meet at the root circle: no space is left between them")
    t_end = flank.t_at(R)
    # upper half of the tooth, walked down from the tip
    ts = _spacing(t_start, t_end, FLANK_POINTS)
    ts = ts[::-1]
    P = flank.point(ts)
    T = -flank.tangent(ts)
    upper = [("spline", tuple(map(tuple, P[:-1].tolist())), tuple(map(tuple, T.tolist())))]
    if radial is not None:
        upper.append(("line", (tuple(map(float, rb * np.array([math.cos(beta0), math.sin(beta0)]))),), ()))
    if rho > 0:
        upper.append(("arc", (tuple(map(float, F)), tuple(map(float, C))), ()))
    upper.append(("arc", (tuple(map(float, P_root)), (0.0, 0.0)), ()))
    outline = _assemble(upper, z)
    outline.validate("section")
    steps = [("add", outline)]
    if bore:
        steps.append(("cut", Disk((0.0, 0.0), bore / 2)))
    geometry = (("form", "involute", "given"), ("teeth", z, "given"), ("module", m, "given"),
                ("pressure_angle", float(pressure_angle), "given"), ("root", root, "given"),
                ("pitch_diameter", D, "module × teeth"), ("base_diameter", Db, "pitch diameter × cos(pressure angle)"),
                ("major_diameter", major_diameter, src.get("major_diameter", "given")),
                ("minor_diameter", minor_diameter, src.get("minor_diameter", "given")),
                ("fillet", rho, src.get("fillet", "given")),
                ("tooth_thickness", s, src["tooth_thickness"]), ("standard", standard, "given"))
    if bore:
        geometry += (("bore", bore, "given"),)
    return Section(tuple(steps), kind="spline", diameter=major_diameter, bore=bore or None, geometry=geometry,
                   nominal_diameter=minor_diameter)  # the shaft stress of a spline is taken on its minor (root) diameter


def straight_spline_section(splines, minor_diameter, major_diameter, width, fillet=0.0, bore=None,
                            sources=None) -> Section:
    """External straight-sided spline: ``splines`` teeth of ``width`` with parallel flanks, centred at
    angles 2πk/N from +x, root fillets of radius ``fillet`` into the root circle."""
    N = splines
    if isinstance(N, bool) or not isinstance(N, int) or N < 3 or N > 60:
        raise InputError("section.splines", N, "must be a whole number from 3 to 60")
    _check_diameters(major_diameter, minor_diameter, bore, fillet)
    if width is None or not np.isfinite(width) or width <= 0:
        raise InputError("section.width", width, "must be a positive length")
    R, r, h, rho = major_diameter / 2, minor_diameter / 2, width / 2, float(fillet)
    if h >= r * math.sin(math.pi / N):
        raise InputError("section.width", width, f"the {N} splines would touch at the minor diameter: the width must be "
                         f"less than {2 * r * math.sin(math.pi / N):.6g} m")
    if width < SLIVER * major_diameter:
        raise InputError("section.width", width, "is a sliver that cannot be meshed or trusted")
    x_tip = math.sqrt(R * R - h * h)
    if rho > 0:
        fl = _fillet_on_line(r, rho, h)
        C, F, P_root = fl
        if F[0] >= x_tip * (1 - 1e-9):
            raise InputError("section.fillet", fillet, "the root fillet reaches the major diameter: no flank is left")
        if math.atan2(C[1], C[0]) >= math.pi / N * (1 - 1e-6):
            raise InputError("section.fillet", fillet, "the root fillet is larger than the space between two splines allows")
    else:
        F = P_root = np.array([math.sqrt(r * r - h * h), h])
    upper = [("line", ((x_tip, h),), ())]
    if rho > 0:
        upper.append(("arc", (tuple(map(float, F)), tuple(map(float, C))), ()))
    upper.append(("arc", (tuple(map(float, P_root)), (0.0, 0.0)), ()))
    outline = _assemble(upper, N)
    outline.validate("section")
    steps = [("add", outline)]
    if bore:
        steps.append(("cut", Disk((0.0, 0.0), bore / 2)))
    src = sources or {}
    geometry = (("form", "straight", "given"), ("teeth", N, src.get("splines", "given")),
                ("major_diameter", major_diameter, src.get("major_diameter", "given")),
                ("minor_diameter", minor_diameter, src.get("minor_diameter", "given")),
                ("width", width, src.get("width", "given")), ("fillet", rho, "given"))
    if bore:
        geometry += (("bore", bore, "given"),)
    return Section(tuple(steps), kind="spline", diameter=major_diameter, bore=bore or None, geometry=geometry,
                   nominal_diameter=minor_diameter)  # the shaft stress of a spline is taken on its minor (root) diameter


def iso14_size(series: str, splines: int, minor_mm: float, major_mm: float) -> float | None:
    """Width [mm] of an ISO 14 spline of that series and size (from memory), or None."""
    return ISO14.get((series, splines, minor_mm, major_mm))


def _check_diameters(major, minor, bore, fillet):
    for key, v in (("major_diameter", major), ("minor_diameter", minor)):
        if v is None or not np.isfinite(v) or v <= 0:
            raise InputError(f"section.{key}", v, "must be a positive length")
    if minor >= major:
        raise InputError("section.minor_diameter", minor, f"is not smaller than the major diameter ({major:g} m)")
    if (major - minor) / 2 < SLIVER * major:
        raise InputError("section.minor_diameter", minor, "leaves teeth too short to mesh or trust")
    if fillet is None or not np.isfinite(fillet) or fillet < 0:
        raise InputError("section.fillet", fillet, "must not be negative")
    if bore:
        if not np.isfinite(bore) or bore <= 0:
            raise InputError("section.bore", bore, "must be a positive length")
        if (minor - bore) / 2 < SLIVER * major or bore >= minor:
            raise InputError("section.bore", bore, f"leaves no wall under the teeth (minor diameter {minor:g} m)")

"""A station whose section has a feature with a length (a keyway's, a flat's or a cut's ``length``,
a spline's splined ``length``) is checked at the worst internal loads anywhere along that feature,
not only at its ``at``. Numbers and records only.

Where the feature lies is :attr:`compare.case.shaft.Station.extent` (z0, z1): centred on the station
unless the case gives ``feature_from``. The internal loads along a beam are piecewise: between point
loads and supports they are linear in z (the moments) or constant (shear forces, torque, axial force),
apart from the self-weight's parabola in Mx; they jump at every load and support. So the candidates
are: both ends of the feature, the station itself, and both sides of every load and support on the
feature, ends included (a load exactly at an end is read on both sides: a point load at the edge of a
hub, taken the conservative way).

Every candidate set of loads is checked on the station's one solved section: the FE section solution is
linear in the loads, so only the combined-stress step (and the findings that follow it) runs again on a
copy of the solved :class:`~compare.pairs.analysis.Analysis` with the candidate's loads — no new mesh,
no new solve. The lowest factor over the candidates governs; the lowest static and the lowest fatigue
factor are recorded with where each was found (they may be at different z).

Why these candidates are enough: each criterion's 1/n (von Mises, Tresca, Coulomb–Mohr, modified Mohr
(the larger of its two branches); Goodman, Gerber, ASME elliptic, Soderberg, Langer on the von Mises
amplitude and mean) is a convex function of the six section loads (norms of stresses linear in the
loads, and σ1, −σ3, composed with non-decreasing convex functions), and the largest over points and
over the shaft's angle of convex functions is convex; along
a stretch where the loads are linear in z, 1/n is therefore convex in z and largest at an end of the
stretch. The self-weight bends the Mx diagram between candidates by at most q·h²/8 (q the weight per
length, h the gap between candidates); that bound is recorded as ``self_weight_departure`` [N·m].
"""
from __future__ import annotations

import math
from dataclasses import replace

from ..case.case import Loads
from .checks import FATIGUE_CRITERIA
from .findings import findings_step
from .shaft_beam import SIDE, loads_at
from .step import combined_step

LOAD_KEYS = ("N", "Vx", "Vy", "Mx", "My", "T")
#: Keys of ``Analysis.extra`` that depend on the loads and are made afresh for each candidate.
RECHECKED = ("combined", "static", "fatigue", "materials", "governing", "warnings")
#: Positions closer than this share of the shaft's length are one point (the layout's own tolerance,
#: case/shaft.py GAP_TOL).
SAME_POINT = 1e-9


def section_loads(ld: dict, rotating: bool) -> Loads:
    """A station's internal loads {N, Vx, Vy, Mx, My, T} as the section case's :class:`Loads`."""
    return Loads(torque=ld["T"], bending=(ld["Mx"], ld["My"]), shear=(ld["Vx"], ld["Vy"]), axial=ld["N"],
                 rotating=rotating)


def at_load_point(layout: dict, at: float) -> dict | None:
    """The parts and supports at ``at`` ({"parts": [names], "supports": [names]}), or None."""
    tol = SAME_POINT * layout["z"][-1]
    parts = [p["name"] for p in layout["parts"] if abs(p["at"] - at) <= tol]
    sups = [r["name"] or "support" for r in layout["reactions"] if abs(r["at"] - at) <= tol]
    return {"parts": parts, "supports": sups} if parts or sups else None


def candidates(layout: dict, st) -> list[dict]:
    """The candidate points along the station's feature, in order of z: {z, side ("left"/"right" of a
    jump, or None), end ("start"/"end"/None), toward (the nearest support beyond that end, or None),
    station (bool), parts, supports, loads}."""
    z_beam, items, qy = layout["z"], layout["items"], layout["qy"]
    L = float(z_beam[-1])
    tol = SAME_POINT * L
    z0, z1 = st.extent
    events = sorted({p.z for p in items if z0 - tol <= p.z <= z1 + tol})
    points: list[float] = []
    for z in sorted([z0, z1, st.at] + events):
        if not points or z - points[-1] > tol:
            points.append(z)
    out = []
    for z in points:
        here = at_load_point(layout, z) or {"parts": [], "supports": []}
        jump = any(abs(e - z) <= tol for e in events)
        end = "start" if abs(z - z0) <= tol else ("end" if abs(z - z1) <= tol else None)
        toward = None
        if end is not None:
            beyond = [r for r in layout["reactions"] if (r["at"] <= z + tol if end == "start" else r["at"] >= z - tol)]
            if beyond:
                toward = min(beyond, key=lambda r: abs(r["at"] - z))["name"] or "support"
        base = {"z": z, "end": end, "toward": toward, "station": abs(z - st.at) <= tol, **here}
        if jump:
            if z > tol:
                out.append({**base, "side": "left", "loads": loads_at(items, z_beam, qy, z - SIDE * L)})
            if z < L - tol:
                out.append({**base, "side": "right", "loads": loads_at(items, z_beam, qy, z)})
        else:
            out.append({**base, "side": None, "loads": loads_at(items, z_beam, qy, min(z, L * (1 - SIDE)))})
    return out


def self_weight_departure(layout: dict, cands: list[dict]) -> float:
    """The largest departure of the Mx diagram from a straight line between neighbouring candidates:
    q·h²/8 with q the largest self-weight per length on the feature [N·m] (0 without self-weight)."""
    z, qy = layout["z"], layout["qy"]
    zs = sorted({c["z"] for c in cands})
    if len(zs) < 2 or not qy.any():
        return 0.0
    mid = 0.5 * (z[:-1] + z[1:])
    on = (mid >= zs[0]) & (mid <= zs[-1])
    q = float(abs(qy[on]).max()) if on.any() else 0.0
    h = max(b - a for a, b in zip(zs[:-1], zs[1:]))
    return q * h * h / 8


def with_loads(base, ld: dict, rotating: bool):
    """A copy of the solved station analysis ``base`` checked under the loads ``ld``: the same mesh and
    FE solution, the combined-stress step and the findings run again. ``base`` itself when its loads are
    these."""
    lo = section_loads(ld, rotating)
    b0 = base.case.loads
    if (lo.torque, tuple(lo.bending), tuple(lo.shear), lo.axial) == (b0.torque, tuple(b0.bending),
                                                                     tuple(b0.shear or (0.0, 0.0)), b0.axial):
        return base
    extra = {k: v for k, v in base.extra.items() if k not in RECHECKED}
    b = replace(base, case=replace(base.case, loads=lo), extra=extra, seconds=dict(base.seconds))
    combined_step(b)
    findings_step(b)
    return b


def factors(a) -> dict:
    """The governing, lowest static and lowest fatigue factors of a checked analysis (None where none
    could be computed); with no verdict (a sharp corner) the governing value away from the corners."""
    gov = a.extra.get("governing") or {}
    n = gov.get("factor")
    away = (gov.get("away_from_corners") or {}) if gov.get("no_verdict") else {}
    st = a.extra.get("static") or {}
    static = [(st[c], c) for c in st.get("criteria", [])]
    ft = a.extra.get("fatigue") or {}
    fat = [(ft["fe"][c]["factor"], c) for c in ft.get("criteria", []) if c in ft.get("fe", {})]
    hand = ft.get("hand") or {}
    if "skipped" not in hand:
        fat += [(hand[c], f"{c} (hand)") for c in FATIGUE_CRITERIA + ("first_cycle_yield",) if c in hand]
    s = _lowest(static)
    f = _lowest(fat)
    return {"factor": n, "criterion": gov.get("criterion"), "no_verdict": bool(gov.get("no_verdict")),
            "away_from_corners": away.get("factor"),
            "static": s[0], "static_criterion": s[1], "fatigue": f[0], "fatigue_criterion": f[1]}


def _lowest(pairs):
    ok = [(v, c) for v, c in pairs if v is not None and math.isfinite(v)]
    return min(ok) if ok else (None, None)


def _key(value) -> float:
    return value if value is not None and math.isfinite(value) else math.inf


def check_over_extent(base, st, layout: dict, rotating: bool, at_station=None, everywhere: bool = False):
    """Check the station's solved section at every candidate along its feature. ``at_station(b)`` is
    applied to the candidates at the station's own ``at`` (a shoulder's fillet path there), or with
    ``everywhere`` to every candidate (a 3-D feature model that spans the whole feature). Returns
    (the governing candidate's analysis, its loads, the record ``extent``)."""
    cands = candidates(layout, st)
    checked, seen = [], {}
    for c in cands:  # equal loads (no jump, or a jump in nothing that matters here) are checked once
        key = (tuple(c["loads"][k] for k in LOAD_KEYS), c["station"])
        if key not in seen:
            b = with_loads(base, c["loads"], rotating)
            if (c["station"] or everywhere) and at_station is not None:
                if b is base:  # the hook changes the analysis it is given: keep the base clean for the rest
                    b = replace(base, extra=dict(base.extra))
                at_station(b)
            seen[key] = b
        checked.append(seen[key])
    rows = []
    for c, b in zip(cands, checked):
        f = factors(b)
        rows.append({k: v for k, v in c.items() if k != "loads"} | dict(c["loads"])
                    | {"M": math.hypot(c["loads"]["Mx"], c["loads"]["My"])} | f)
    g = min(range(len(rows)), key=lambda i: (_key(rows[i]["factor"]), _key(rows[i]["away_from_corners"])))
    s = min(range(len(rows)), key=lambda i: _key(rows[i]["static"]))
    f = min(range(len(rows)), key=lambda i: _key(rows[i]["fatigue"]))
    z0, z1 = st.extent
    rec = {"from": z0, "to": z1, "length": z1 - z0, "field": st.extent_field,
           "placed": "feature_from" if "feature_from" in st.raw else "centred on the station",
           "candidates": rows, "governing": _pick(rows, g, "factor"),
           "static_governing": _pick(rows, s, "static") if rows[s]["static"] is not None else None,
           "fatigue_governing": _pick(rows, f, "fatigue") if rows[f]["fatigue"] is not None else None,
           "self_weight_departure": self_weight_departure(layout, cands),
           "method": "the station's one FE section checked under the loads at both ends of the feature, at the "
                     "station and on both sides of every load and support on it; 1/n is convex in the loads, "
                     "which are linear in z between these points apart from the self-weight's parabola"}
    return checked[g], dict(cands[g]["loads"]), rec


def _pick(rows, i: int, key: str) -> dict:
    r = rows[i]
    return {"index": i, "z": r["z"], "side": r["side"], "end": r["end"], "toward": r["toward"],
            "station": r["station"], "parts": r["parts"], "supports": r["supports"], "factor": r[key],
            "criterion": r["criterion"] if key == "factor" else r[f"{key}_criterion"]}

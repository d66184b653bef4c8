"""The shaft layout as a beam: the forces of every part, the beam solved in both planes, the diagrams
(shear force, bending moment, torque, axial force, slope, deflection), the loads at each station,
the stiffness checks and the critical speeds. Numbers and records only.

Axes and signs (compare/case/shaft.py): z along the axis from the left end; internal loads are
those on the cut face whose outward normal is +z (the part to the right acting on the part to the
left), the same convention as the section's [loads]: σ = N/A + Mx·y/Ix − My·x/Iy for a round.
Internal loads come from statics with the beam model's reactions, so they are exact for the point
loads and the piecewise-uniform self-weight; slopes and deflections come from the Timoshenko beam
(fem/beam.py) with E·I and κ·G·A of each segment. A composite segment (bonded regions of several
materials) takes its EI, κ·GA, mass and rotary inertia per length from its own FE section
(:mod:`.shaft_composite`); the one-material segments keep the expressions they always had, so a
layout without composite segments gives the same numbers bit for bit.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from classic import shaft as cs
from classic.shear import energy_hollow_round, energy_round
from fem.beam import Beam, natural_frequencies, solve_static
from fem.errors import InputError

from ..case.shaft import Segment, Shaft

G_STANDARD = 9.80665  # standard gravity [m/s²] (CGPM 1901)
#: Largest beam element as a share of the shaft's length. The consistent-mass eigenvalues of the
#: interdependent element converge as h⁴ for a slender shaft and as h² where shear and rotary inertia
#: matter (tests/test_fem_beam.py): 1/120 puts the first frequency of a stubby shaft (L/d = 4) within
#: about 1e-5 of the limit, far inside the uncertainty of bearing stiffness and part masses.
MAX_ELEMENT_SHARE = 1.0 / 120.0
#: Diagram samples between events (besides both sides of every jump).
SAMPLES = 400
#: Relative offset used to read "just left" and "just right" of a jump.
SIDE = 1e-9


@dataclass
class PointItem:
    """A concentrated action on the shaft at ``z``: forces [N], moments [N·m], torque [N·m]."""

    z: float
    Fx: float = 0.0
    Fy: float = 0.0
    Fz: float = 0.0
    Mx: float = 0.0
    My: float = 0.0
    T: float = 0.0
    label: str = ""
    detail: dict = field(default_factory=dict)


def part_actions(shaft: Shaft) -> list[PointItem]:
    """Every load of the layout as the forces and moments it puts on the shaft (gears and pulleys
    resolved; see classic.shaft.gear_forces and belt_pull)."""
    out = []
    for i, ld in enumerate(shaft.loads):
        label = ld.name or f"loads[{i}]"
        p = PointItem(ld.at, T=ld.torque, label=label)
        if ld.kind == "point":
            p.Fx, p.Fy = ld.force
            p.Fz = ld.axial
            p.Mx, p.My = ld.moment
        elif ld.kind == "gear":
            g = ld.gear
            R = g.pitch_diameter / 2
            th = math.radians(g.mesh_angle)
            f = cs.gear_forces(ld.torque, g.pitch_diameter, g.pressure_angle, g.helix_angle)
            wt = ld.torque / R  # signed along the tangent (−sin θ, cos θ): r × F = torque into the shaft
            # the helix turns a tangential push into a thrust: right hand −Wt·tan ψ, left hand +Wt·tan ψ
            wa = 0.0 if not g.helix_angle else (-1.0 if g.hand == "right" else 1.0) * wt * math.tan(math.radians(g.helix_angle))
            p.Fx = -wt * math.sin(th) - f.radial * math.cos(th)
            p.Fy = wt * math.cos(th) - f.radial * math.sin(th)
            p.Fz = wa
            p.Mx, p.My = R * wa * math.sin(th), -R * wa * math.cos(th)  # thrust acting at the pitch radius
            p.detail = {"tangential": f.tangential, "radial": f.radial, "axial": f.axial,
                        "source": "Shigley's Mechanical Engineering Design, 9th ed., Sec. 13-14 and eq. (13-40)"}
        else:
            pu = ld.pulley
            b = cs.belt_pull(ld.torque, pu.diameter, pu.tension_ratio)
            a = math.radians(pu.pull_angle)
            p.Fx, p.Fy = b.pull * math.cos(a), b.pull * math.sin(a)
            p.detail = {"tight": b.tight, "slack": b.slack, "pull": b.pull,
                        "source": "Shigley's Mechanical Engineering Design, 9th ed., Sec. 17-2 (T = (F1 − F2)·D/2)"}
        out.append(p)
    return out


def segments_of(shaft: Shaft, section) -> list[Segment]:
    if shaft.segments:
        return shaft.segments
    if not getattr(section, "diameter", None):
        raise InputError("shaft.segments", None, "are needed: the case's [section] has no diameter to make a "
                         "uniform shaft of")
    return [Segment(0.0, shaft.length, section.diameter, section.bore)]


@dataclass
class BeamModel:
    beam: Beam
    segs: list  # segment of each element
    area: np.ndarray
    I: np.ndarray
    #: per element [kg/m] and [kg·m] when the layout has composite segments (their regions' densities;
    #: ``shaft.density`` times A and I elsewhere); None: one material, ``rho * area`` and ``rho * I``
    rhoA: np.ndarray | None = None
    rhoI: np.ndarray | None = None


#: Points of the layout closer than this fraction of the shaft's length share one beam node (0.36 µm on
#: a 360 mm shaft). A shorter element makes the stiffness ill-conditioned (its EI/l³ dwarfs the rest):
#: a station placed 1e-10 of the length from a part was refused as if the supports let the shaft move.
NODE_MERGE = 1e-6


def build_beam(shaft: Shaft, segs, E: float, G: float, nu: float, extra_z=(), overrides=(), composite=None) -> BeamModel:
    """The beam: nodes at every segment end, load, support, station and extra point, elements at most
    :data:`MAX_ELEMENT_SHARE` of the length. ``overrides`` = [(z0, z1, Ixx, Iyy, A, kappa)] replace
    the round-bar values over a stretch (a station's FE section over its feature length); the beam
    takes the smaller of Ixx, Iyy there (both planes share one model). ``composite`` = {segment index:
    :class:`~compare.checks.shaft_composite.SegmentProps`} gives a composite segment's EI, κ·GA and mass
    per length (E, G and ν are then those of the one-material segments, None when there are none)."""
    L = shaft.length
    pts = {0.0, L}
    pts |= {s.start for s in segs} | {s.end for s in segs}
    pts |= {ld.at for ld in shaft.loads} | {s.at for s in shaft.supports} | {s.at for s in shaft.stations}
    pts |= {float(z) for z in extra_z}
    for z0, z1, *_ in overrides:
        pts |= {z0, z1}
    pts = np.array(sorted(pts))
    z = [pts[0]]
    for a, b in zip(pts[:-1], pts[1:]):
        if b - a <= NODE_MERGE * L:
            continue
        n = max(1, int(math.ceil((b - a) / (MAX_ELEMENT_SHARE * L))))
        z.extend(np.linspace(a, b, n + 1)[1:])
    z = np.array(z)
    mid = 0.5 * (z[:-1] + z[1:])
    EI, kGA, A_, I_, seg_of = [], [], [], [], []
    rhoA, rhoI = [], []
    rho = shaft.density or 0.0
    for m in mid:
        i, s = next((i, s) for i, s in enumerate(segs) if s.start <= m <= s.end)
        D, d = s.diameter, (s.bore or 0.0)
        A = math.pi * (D**2 - d**2) / 4
        I = math.pi * (D**4 - d**4) / 64
        if composite and i in composite:  # bonded regions: the segment's own FE section
            p = composite[i]
            EI.append(p.EI)
            kGA.append(p.kGA)
            A_.append(A)
            I_.append(I)
            rhoA.append(p.rhoA or 0.0)
            rhoI.append(p.rhoI or 0.0)
            seg_of.append(s)
            continue
        kappa = energy_hollow_round(nu, d / D) if d else energy_round(nu)
        for z0, z1, Ixx, Iyy, Ao, ko in overrides:
            if z0 <= m <= z1:
                I, A, kappa = min(Ixx, Iyy), Ao, ko
        EI.append(E * I)
        kGA.append(kappa * G * A)
        A_.append(A)
        I_.append(I)
        rhoA.append(rho * A)
        rhoI.append(rho * I)
        seg_of.append(s)
    model = BeamModel(Beam(z, np.array(EI), np.array(kGA)), seg_of, np.array(A_), np.array(I_))
    if composite:
        model.rhoA, model.rhoI = np.array(rhoA), np.array(rhoI)
    return model


def mass_per_length(model: BeamModel, rho) -> tuple[np.ndarray, np.ndarray]:
    """(ρA [kg/m], ρI [kg·m]) per element: ``rho`` times the round-bar A and I for one material, the
    regions' own values on composite segments."""
    if model.rhoA is None:
        r = rho or 0.0
        return r * model.area, r * model.I
    return model.rhoA, model.rhoI


def node_of(z: np.ndarray, at: float) -> int:
    return int(np.argmin(np.abs(z - at)))


def solve_layout(shaft: Shaft, section, material, overrides=(), composite=None) -> dict:
    """The whole-shaft step: returns a record with the parts' forces, reactions, diagrams, stiffness
    checks and critical speeds (SI). ``material`` needs E; G and ν follow from it or are given (not
    when every segment is composite: ``composite`` = {segment index: SegmentProps} gives those)."""
    E, G, nu = material.elastic_modulus, material.shear_modulus, material.poisson
    segs = segments_of(shaft, section)
    if composite and all(i in composite for i in range(len(segs))):
        pass  # every segment composite: no one-material modulus is used
    elif E is None:
        raise InputError("material.elastic_modulus", None, "is needed for the shaft's deflections and critical speeds")
    elif G is None or nu is None:
        raise InputError("material.poisson", None, "is needed (with elastic_modulus) for the shaft's shear deformation")
    model = build_beam(shaft, segs, E, G, nu, overrides=overrides, composite=composite)
    z = model.beam.z
    parts = part_actions(shaft)
    rho = shaft.density
    qy = np.zeros(len(z) - 1)
    if model.rhoA is not None:  # composite segments: each region's density (compare/case/shaft_composite.py)
        if shaft.self_weight and model.rhoA.any():
            qy = -G_STANDARD * model.rhoA
    elif rho and shaft.self_weight:
        qy = -rho * G_STANDARD * model.area  # self-weight along −y [N/m]
    sup = [(node_of(z, s.at), s.stiffness) for s in shaft.supports]
    beam = model.beam
    # plane x: w = u, θ = du/dz, moment load My; plane y: w = v, θ = dv/dz = −(rotation about x), load −Mx
    try:
        rx = solve_static(beam, sup, [(node_of(z, p.z), p.Fx) for p in parts],
                          [(node_of(z, p.z), p.My) for p in parts])
        ry = solve_static(beam, sup, [(node_of(z, p.z), p.Fy) for p in parts],
                          [(node_of(z, p.z), -p.Mx) for p in parts], q=qy)
    except ValueError:
        raise InputError("shaft.supports", [s.at for s in shaft.supports], "leave the shaft free to move") from None
    reactions = []
    items = list(parts)
    for s, fx, fy in zip(shaft.supports, rx.reactions, ry.reactions):
        reactions.append({"at": s.at, "name": s.name, "Fx": float(fx), "Fy": float(fy),
                          "F": float(math.hypot(fx, fy)), "stiffness": s.stiffness})
        items.append(PointItem(s.at, Fx=float(fx), Fy=float(fy), label=s.name or "support"))
    # axial force: the parts' thrust must be taken by a bearing; the first rigid-in-z support is taken
    # as the locating bearing (the left-most support), which puts all of it there
    Fz_total = math.fsum(p.Fz for p in parts)
    if Fz_total:
        locating = min(shaft.supports, key=lambda s: s.at)
        items.append(PointItem(locating.at, Fz=-Fz_total, label="axial reaction"))
        reactions[shaft.supports.index(locating)]["Fz"] = -Fz_total
    resid = equilibrium(items, z, qy)
    diag = diagrams(items, z, qy, rx, ry, beam)
    checks = stiffness_checks(shaft, rx, ry, z)
    crit = critical_speeds(shaft, model, sup, rho)
    return {"parts": [{"at": p.z, "name": p.label, "Fx": p.Fx, "Fy": p.Fy, "Fz": p.Fz, "Mx": p.Mx, "My": p.My,
                       "T": p.T, **p.detail} for p in parts],
            "reactions": reactions, "diagrams": diag, "equilibrium_residual": resid,
            "fe_residual": max(rx.residual, ry.residual), "items": items, "qy": qy, "z": z,
            "plane_x": rx, "plane_y": ry, **checks, "critical_speeds": crit,
            "axial_reaction_note": "axial force taken by the left-most support (the locating bearing)" if Fz_total else None,
            "model": model, "composite_segments": composite or {}}


def loads_at(items: list[PointItem], z: np.ndarray, qy: np.ndarray, x: float) -> dict:
    """Internal loads {N, Vx, Vy, Mx, My, T} at ``x`` (on the +z face; items at exactly ``x`` are
    taken as left of the cut)."""
    Vx = Vy = Mx = My = T = N = 0.0
    for p in items:
        if p.z <= x:
            Vx -= p.Fx
            Vy -= p.Fy
            N -= p.Fz
            T -= p.T
            Mx += (p.z - x) * p.Fy - p.Mx
            My += (x - p.z) * p.Fx - p.My
    # distributed self-weight along y, element by element up to x
    if qy.any():
        a = z[:-1]
        b = np.minimum(z[1:], x)
        F = np.where(b > a, qy * (b - a), 0.0)
        Vy -= float(F.sum())
        Mx += float((F * (0.5 * (a + b) - x)).sum())
    return {"N": N, "Vx": Vx, "Vy": Vy, "Mx": Mx, "My": My, "T": T}


def equilibrium(items, z, qy) -> dict:
    """Sums of all forces and moments about the left end, each over the sum of magnitudes (0 means
    the reactions balance the loads)."""
    w = [(0.5 * (z[e] + z[e + 1]), qy[e] * (z[e + 1] - z[e])) for e in range(len(z) - 1)]
    fx = math.fsum(p.Fx for p in items)
    fy = math.fsum(p.Fy for p in items) + math.fsum(F for _, F in w)
    mx = math.fsum(p.z * p.Fy - p.Mx for p in items) + math.fsum(zc * F for zc, F in w)
    my = math.fsum(p.z * p.Fx + p.My for p in items)
    scale_f = sum(abs(p.Fx) + abs(p.Fy) for p in items) + sum(abs(F) for _, F in w) or 1.0
    scale_m = scale_f * max(z[-1], 1e-300)
    return {"force": math.hypot(fx, fy) / scale_f, "moment": math.hypot(mx, my) / scale_m,
            "torque": abs(math.fsum(p.T for p in items)) / (sum(abs(p.T) for p in items) or 1.0)}


def _deflection_at(res, beam: Beam, x: float):
    """w and θ at ``x`` from the nodal values (cubic Hermite-like reading between nodes: nodes sit at
    every point of interest, so this is only used for the diagram samples)."""
    return float(np.interp(x, beam.z, res.w)), float(np.interp(x, beam.z, res.theta))


def diagrams(items, z, qy, rx, ry, beam) -> dict:
    """Sampled diagrams: both sides of every jump and :data:`SAMPLES` points between."""
    L = z[-1]
    xs = set(np.linspace(0.0, L, SAMPLES + 1).tolist())
    for p in items:
        xs |= {max(p.z - SIDE * L, 0.0), min(p.z + SIDE * L, L)}
    xs = sorted(xs)
    cols = {k: [] for k in ("x", "N", "Vx", "Vy", "Mx", "My", "M", "T", "slope_x", "slope_y", "deflection_x",
                            "deflection_y", "deflection")}
    for x in xs:
        ld = loads_at(items, z, qy, x - (SIDE * L if x >= L else 0.0))
        u, tu = _deflection_at(rx, beam, x)
        v, tv = _deflection_at(ry, beam, x)
        cols["x"].append(x)
        for k in ("N", "Vx", "Vy", "Mx", "My", "T"):
            cols[k].append(ld[k])
        cols["M"].append(math.hypot(ld["Mx"], ld["My"]))
        cols["slope_x"].append(tu)
        cols["slope_y"].append(tv)
        cols["deflection_x"].append(u)
        cols["deflection_y"].append(v)
        cols["deflection"].append(math.hypot(u, v))
    i = int(np.argmax(cols["deflection"]))
    return {"columns": cols, "max_deflection": {"value": cols["deflection"][i], "at": cols["x"][i]},
            "max_moment": {"value": max(cols["M"]), "at": cols["x"][int(np.argmax(cols["M"]))]}}


def stiffness_checks(shaft: Shaft, rx, ry, z) -> dict:
    """Slope at every support and slope and deflection at every gear against the limits of
    classic.shaft (Shigley 9th ed., Table 7-2; gear deflection as common practice)."""
    slopes, gears = [], []
    tightest = min(lo for lo, _ in cs.SLOPE_LIMITS.values())
    for s in shaft.supports:
        n = node_of(z, s.at)
        th = math.hypot(rx.theta[n], ry.theta[n])
        if s.bearing:
            lo, hi = cs.SLOPE_LIMITS[s.bearing]
            limit, basis = hi, f"{s.bearing.replace('_', ' ')}: upper end of the range {lo:g}–{hi:g} rad"
        else:
            limit, basis = tightest, "no bearing type given: the tightest limit of the table (tapered roller, lower end)"
        slopes.append({"at": s.at, "name": s.name, "kind": "support", "slope": th, "slope_x": float(rx.theta[n]),
                       "slope_y": float(ry.theta[n]), "limit": limit, "ok": bool(th <= limit), "basis": basis,
                       "source": "Shigley's Mechanical Engineering Design, 9th ed., Table 7-2"})
    for i, ld in enumerate(shaft.loads):
        if ld.kind != "gear":
            continue
        n = node_of(z, ld.at)
        th = math.hypot(rx.theta[n], ry.theta[n])
        d = math.hypot(rx.w[n], ry.w[n])
        slopes.append({"at": ld.at, "name": ld.name or f"loads[{i}]", "kind": "gear", "slope": th,
                       "slope_x": float(rx.theta[n]), "slope_y": float(ry.theta[n]), "limit": cs.GEAR_SLOPE_LIMIT,
                       "ok": bool(th <= cs.GEAR_SLOPE_LIMIT), "basis": "uncrowned spur gear",
                       "source": "Shigley's Mechanical Engineering Design, 9th ed., Table 7-2"})
        gears.append({"at": ld.at, "name": ld.name or f"loads[{i}]", "deflection": d, "limit": cs.GEAR_DEFLECTION_LIMIT,
                      "ok": bool(d <= cs.GEAR_DEFLECTION_LIMIT),
                      "basis": "0.005 in at a gear mesh for every gear (common practice; Shigley 9th ed., Table 7-2 "
                               "gives 0.003-0.010 in by diametral pitch)"})
    return {"slopes": slopes, "gear_deflections": gears}


def critical_speeds(shaft: Shaft, model: BeamModel, sup, rho) -> dict:
    """First critical speeds: eigenvalues of the Timoshenko beam with rotary inertia and the part
    masses (gyroscopic coupling left out: the frequencies of the shaft at rest), and Rayleigh's
    estimate from the static deflection under the weights (Shigley 9th ed., eq. 7-23)."""
    beam, z = model.beam, model.beam.z
    masses = [(node_of(z, ld.at), ld.mass) for ld in shaft.loads if ld.mass]
    # diametral inertia of a part: half its polar inertia (thin disc; common practice)
    inertias = [(node_of(z, ld.at), ld.inertia / 2) for ld in shaft.loads if ld.inertia]
    rhoA, rhoI = mass_per_length(model, rho)
    if not rhoA.any() and not masses:
        return {"skipped": "no shaft density and no part masses: nothing to vibrate"}
    vib = Beam(beam.z, beam.EI, beam.kGA, rhoA=rhoA, rhoI=rhoI)
    omega, modes = natural_frequencies(vib, sup, masses, inertias, count=3)
    # Rayleigh: lumped weights (parts, and the shaft's own mass at the nodes) all along one direction
    lump = np.zeros(len(z))
    for n, m in masses:
        lump[n] += m
    if rhoA.any():
        mseg = rhoA * np.diff(z)
        lump[:-1] += mseg / 2
        lump[1:] += mseg / 2
    W = lump * G_STANDARD
    static = Beam(beam.z, beam.EI, beam.kGA)
    loaded = [n for n in range(len(z)) if W[n]]
    # Rayleigh wants the weights acting along the first mode: all down first, then each weight turned
    # to the side its point went (weights on an overhang push up; Shigley 9th ed., Sec. 7-6)
    first = solve_static(static, sup, [(n, -W[n]) for n in loaded])
    side = np.where(first.w <= 0.0, 1.0, -1.0)
    st = solve_static(static, sup, [(n, -W[n] * side[n]) for n in loaded])
    ray = cs.rayleigh_critical_speed(W[loaded], (-st.w * side)[loaded])
    out = {"values": [float(w) for w in omega], "method": "eigenvalues of the Timoshenko beam model (shear "
           "deformation, rotary inertia of shaft and parts, part masses); gyroscopic effects not included",
           "rayleigh": ray, "rayleigh_source": "Shigley's Mechanical Engineering Design, 9th ed., eq. (7-23)",
           "rayleigh_note": "lumped weights on the Timoshenko beam's static deflection, without rotary inertia: usually above "
                            "the beam model's value, most where parts with large inertia sit on an overhang",
           "margin": cs.CRITICAL_SPEED_MARGIN,
           "margin_basis": "operating speed at most half the first critical speed (common practice)"}
    if shaft.speed:
        out["speed"] = shaft.speed
        out["ratio"] = omega[0] / shaft.speed if len(omega) else None
        out["ok"] = bool(len(omega) and omega[0] >= cs.CRITICAL_SPEED_MARGIN * shaft.speed)
    return out

"""Transverse shear step: shear centre, shear coefficients and, for the case's shear forces, the
stress field's peak; pairs against the elementary and exact hand values of the same definition."""
from __future__ import annotations

import math

import numpy as np

from classic import shear as cs
from fem.cut import elementary_shear
from fem.errors import InputError
from fem.shear import ShearResult, shear_peak, solve_shear

from .counterparts import recognise
from .hand_shapes import symmetry, symmetry_centre_pairs
from .pairs import Pair, not_applicable

TOL_SHEAR_PEAK = (1e-2, "default mesh targets 1 % on peak stresses")
TOL_KAPPA = (1e-4, "the energy integral converges like the square of the stress error; 1e-4 is far above what is seen")
TOL_CENTRE = (1e-6, "relative to the section size: a symmetric section puts the centre on its axis; the mesh is symmetric only to round-off of the mesher")
TG_SOURCE = "Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §120 (round bar, exact flexure with ν)"
TG_RECT = "Timoshenko & Goodier, Theory of Elasticity, 3rd ed., table in §124 (rectangle, ν = 0.25)"
COWPER = "Cowper 1966, J. Appl. Mech. 33:335–340"
HUTCH = "Hutchinson 2001, J. Appl. Mech. 68:87–92"
ENERGY_DEF = "energy definition κ = (V²/A)/∫|τ|² dA with the exact flexure stresses"


def shear_step(a) -> None:
    """Add ``a.extra['shear']`` (and its pairs) to an :class:`~compare.pairs.analysis.Analysis`."""
    case = a.case
    nu = case.material.poisson
    V = case.loads.shear
    if nu is None:
        if V is not None:
            raise InputError("material.poisson", None, "is required for transverse shear (loads.shear is given)")
        a.extra["shear"] = {"skipped": "material.poisson is not given: transverse shear needs Poisson's ratio"}
        return
    sr = a.shear if a.shear is not None else solve_shear(a.mesh, a.props, nu)
    a.shear = sr
    L = math.sqrt(a.props.area)
    out = {
        "poisson": nu,
        "centre": list(sr.centre),
        "centre_offset_from_centroid": [sr.centre[0] - a.props.centroid[0], sr.centre[1] - a.props.centroid[1]],
        "kappa_x": sr.kappa_x, "kappa_y": sr.kappa_y, "kappa_xy": sr.kappa_xy,
        "kappa_definition": "energy: κ = (V²/A)/∫|τ|² dA for each force alone; κxy is the off-diagonal of α⁻¹, "
                            "α_ij = A∫τ(i)·τ(j) dA for unit forces",
        "shear_area_x": sr.kappa_x * sr.area, "shear_area_y": sr.kappa_y * sr.area,
        "alpha": sr.alpha.tolist(),
        "residuals": {"resultant_Vx": sr.resultant_residual["Vx"], "resultant_Vy": sr.resultant_residual["Vy"]},
        "dofs": sr.dofs,
    }
    # a shear force through the shaft axis (not the shear centre) also twists the section
    ox, oy = case.section.origin
    out["axis"] = [ox, oy]
    if V is not None:
        Vx, Vy = V
        pk = a.shear_peak if a.shear_peak is not None else shear_peak(a.mesh, sr, Vx, Vy)
        out.update({
            "force": [Vx, Vy],
            "tau_max": pk.value,
            "tau_max_at": list(pk.at),
            "tau_max_on_boundary": pk.on_boundary,
            "tau_max_where": a.where(pk.at) if pk.on_boundary else {"at": list(pk.at), "boundary": None},
            "torque_from_axis_offset": (ox - sr.centre[0]) * Vy - (oy - sr.centre[1]) * Vx,
        })
        out["residuals"].update({"moment_about_centre": pk.moment_residual, "normal_traction": pk.normal_traction})
        a.shear_peak = pk
    a.extra["shear"] = out
    a.pairs.extend(shear_pairs(a, sr, out, L))


def shear_pairs(a, sr: ShearResult, out: dict, L: float) -> list[Pair]:
    s, nu, A_sec = a.case.section, sr.nu, sr.area
    pairs: list[Pair] = []
    cp_ = recognise(s)
    name = cp_.name if cp_ else None
    V = a.case.loads.shear
    Vmag = math.hypot(*V) if V else None
    # --- peaks
    if V is not None and Vmag > 0:
        tau = out["tau_max"]
        one_dir = abs(V[0]) < 1e-12 * Vmag or abs(V[1]) < 1e-12 * Vmag
        if name == "tube" and one_dir:
            m = s.bore / s.diameter
            pairs.append(Pair("peak transverse shear over 2V/A (thin tube)", tau, cs.thin_tube_shear_elementary(Vmag, A_sec),
                              "elementary thin-walled tube 2V/A, any strength-of-materials text", "factor", "stress",
                              note=f"the thin-wall value describes a tube only as its wall thins (here d/D = {m:.3g})"))
        if name == "solid round":
            d = s.diameter
            exact = max(cs.round_flexure_centre(Vmag, d, nu), cs.round_flexure_surface(Vmag, d, nu))
            pairs.append(Pair("peak transverse shear, exact flexure with ν", tau, exact, TG_SOURCE, "check", "stress", *TOL_SHEAR_PEAK))
            pairs.append(Pair("peak transverse shear over 4V/3A", tau, cs.round_shear_elementary(Vmag, d),
                              "elementary shear formula 4V/(3A), any strength-of-materials text", "factor", "stress",
                              note="the elementary value ignores Poisson's ratio and the real stress distribution"))
        elif one_dir:
            direction = "y" if abs(V[0]) < 1e-12 * Vmag else "x"
            I = a.props.Ixx if direction == "y" else a.props.Iyy
            el, cut = elementary_shear(s, a.props.centroid, I, Vmag, direction)
            pairs.append(Pair("peak transverse shear over VQ/(Ib) on the neutral axis", tau, el,
                              "elementary shear formula VQ/(Ib), Q and b cut from the real section along the neutral axis "
                              "through the centroid (any strength-of-materials text)", "factor", "stress",
                              note=f"Q = {cut.first_moment:.4g} m³, b = {cut.chord:.4g} m" +
                              ("; Ixy ≠ 0: the elementary formula assumes principal axes" if abs(a.props.Ixy) > 1e-6 * max(a.props.Ixx, a.props.Iyy) else "")))
            if name and name.startswith("rectangle") and math.isclose(nu, cs.RECTANGLE_FLEXURE_NU):
                pairs.extend(_rectangle_table_pairs(a, sr, direction, Vmag))
        else:
            pairs.append(not_applicable("peak transverse shear over an elementary value", tau,
                                        "shear force in both directions: the elementary formula is for one direction", "stress"))
    # --- coefficients (only the energy definition is compared; the others are shown with their label)
    exact_k = None
    if name == "solid round":
        exact_k = (cs.energy_round(nu), "energy shear coefficient of the solid round bar (energy definition integrated from the exact flexure stresses of Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §120)")
        others = [(cs.cowper_round(nu), COWPER), (cs.hutchinson_round(nu), HUTCH)]
    elif name == "tube":
        m = s.bore / s.diameter
        exact_k = (cs.energy_hollow_round(nu, m), "energy shear coefficient of the hollow round (closed form of the exact flexure stresses)")
        others = [(cs.cowper_hollow_round(nu, m), COWPER)]
    else:
        others = []
    if exact_k is not None:
        for axis in ("x", "y"):
            pairs.append(Pair(f"shear coefficient κ{axis} ({ENERGY_DEF})", out[f"kappa_{axis}"], exact_k[0], exact_k[1],
                              "check", "dimensionless", *TOL_KAPPA))
    for val, src in others:
        pairs.append(Pair(f"shear coefficient, {src.split(',')[0]} definition", None, val, src, "not applicable",
                          note="a different definition from the FE's energy coefficient: shown for reference, never compared"))
    # --- shear centre
    off = np.asarray(out["centre_offset_from_centroid"])
    if name in ("solid round", "tube") or (s.kind == "round"):
        pairs.append(Pair("shear-centre offset from the centroid / size", float(np.hypot(*off)) / L, 0.0,
                          "a doubly symmetric section has its shear centre at the centroid (common practice)", "check",
                          "dimensionless", *TOL_CENTRE))
    elif s.kind == "keyed" and len(s.keyways) == 1:
        ang = math.radians(s.keyways[0].angle + s.rotation)
        axis = np.array([math.cos(ang), math.sin(ang)])
        perp = float(abs(off @ np.array([-axis[1], axis[0]])))
        pairs.append(Pair("shear centre off the keyway's symmetry line / size", perp / L, 0.0,
                          "a section with an axis of symmetry has its shear centre on that axis (common practice)", "check",
                          "dimensionless", *TOL_CENTRE))
        pairs.append(not_applicable("shear-centre offset from the centroid along the symmetry line", float(off @ axis), "no hand formula for a keyed section: a shear force through the centroid also twists the section", "length"))
    elif symmetry(a) is not None:
        pairs.extend(symmetry_centre_pairs(a, off, L, TOL_CENTRE))
    else:
        pairs.append(not_applicable("shear-centre offset from the centroid", float(np.hypot(*off)),
                                    "no hand formula for this section", "length"))
    return pairs


def _rectangle_table_pairs(a, sr, direction, V):
    """Centre and edge stresses of a rectangle against the Timoshenko & Goodier table (ν = 0.25)."""
    (p,) = [q for op, q in a.case.section.steps if op == "add"]
    pts = np.asarray(p.points)
    c = pts.mean(axis=0)
    e1, e2 = pts[1] - pts[0], pts[3] - pts[0]
    # h along the load, b across it
    load = np.array([0.0, 1.0]) if direction == "y" else np.array([1.0, 0.0])
    if abs(e1 @ load) > abs(e2 @ load):
        e1, e2 = e2, e1
    b, h = float(np.linalg.norm(e1)), float(np.linalg.norm(e2))
    if not np.isclose(abs(e2 @ load), h, rtol=1e-9):
        return []
    try:
        centre_r, edge_r = cs.rectangle_flexure_ratios(b / h)
    except Exception:  # b/h not tabulated: no pair (the table is never extrapolated)
        return []
    nominal = 3 * V / (2 * b * h)
    Vx, Vy = (0.0, V) if direction == "y" else (V, 0.0)
    edge_pt = c + e1 / 2 * (1 - 1e-9)
    t = sr.stress_at(np.column_stack([c, edge_pt]), Vx, Vy)
    mag = np.hypot(t[0], t[1])
    return [
        Pair("rectangle: τ at the centre / (3V/2A)", float(mag[0] / nominal), centre_r, TG_RECT, "check", "dimensionless",
             5e-3, "the published table is printed to three digits (half a unit in the last place)"),
        Pair("rectangle: τ at the ends of the neutral axis / (3V/2A)", float(mag[1] / nominal), edge_r, TG_RECT, "check",
             "dimensionless", 5e-3, "the published table is printed to three digits (half a unit in the last place)"),
    ]

"""The rest of the designer's checklist on a solved layout: keys, splines and press fits at the
stations, the basic rating life of the bearings from the beam's reactions, and torsion along the
shaft (angle of twist, torsional natural frequencies). Numbers and records only (the sentences are
written in compare/output/results_checklist.py and report_checklist.py).

Inputs come from compare/case/shaft_checklist.py (Station.checklist, Support.rating), the layout
record of :func:`compare.checks.shaft_stations.layout_step` and the stations' section analyses
(their FE torsion constant J feeds the torsion model over each station's feature length).
"""
from __future__ import annotations

import math

import numpy as np

from classic import bearings as cb
from classic import key_design as ck
from classic import press_fit as cp
from classic import spline_design as csp
from classic.torsional import SEPARATION_MARGIN
from fem.torsion_line import TorsionLine, natural_frequencies, twist

from ..case.case import Case
from .shaft_beam import loads_at

SHIGLEY9 = "Shigley's Mechanical Engineering Design, 9th ed."
KEY_SOURCE = f"{SHIGLEY9}, Sec. 7-7 and Example 7-6 (τ = 2T/(d·w·L), σ = 2T/(d·t·L), Ssy = 0.577·Sy, eq. 5-21)"
FIT_SOURCE = f"{SHIGLEY9}, Sec. 3-16, eqs. (3-56), (3-58), (3-59) (Lamé) and Sec. 7-8 (torque a fit holds)"
LIFE_SOURCE = "ISO 281:2007, basic rating life L10 = (C/P)^p (p = 3 ball, 10/3 roller); " \
              f"{SHIGLEY9}, eqs. (11-1), (11-9)"
SPLINE_SOURCE = ("from memory: the simplified spline formulas of Dudley, Gear Handbook (1962) — τ = 2T/(d_p·z·t·L) "
                 "at the pitch diameter, p = 2T/(d_p·z·h·L) on the flanks")
#: ISO 281's formula holds for P up to about half the dynamic rating (heavier loads: plastic
#: deformation, outside the life model; from memory of the standard's scope).
LIFE_LOAD_LIMIT = 0.5


def checklist_step(a, case: Case) -> dict:
    """All five checks of a layout; stored in ``a.extra['checklist']`` and returned."""
    rec = a.extra.get("shaft") or {}
    lay, stations = rec.get("layout"), rec.get("stations") or []
    if lay is None:
        return {}
    shaft = case.shaft
    analyses = a.extra.get("shaft_stations") or []
    out = {"keys": [], "splines": [], "press_fits": [], "bearing_life": bearing_life(shaft, lay),
           "torsional": torsional(shaft, case, lay, stations, analyses)}
    sy = case.material.yield_strength
    for i, (st, srec) in enumerate(zip(shaft.stations, stations)):
        cl = st.checklist
        if cl is None:
            continue
        if cl.key is not None:
            out["keys"] += key_checks(i, st, srec, cl.key, shaft, sy, case.analysis.design_factor)
        if cl.spline is not None:
            out["splines"].append(spline_check(i, st, srec, cl.spline, shaft, sy))
        if cl.fit is not None:
            out["press_fits"].append(fit_check(i, st, srec, cl.fit, case))
    a.extra["checklist"] = out
    return out


# ----------------------------------------------------------------------------- torque through a hub


def hub_torque(st, srec, shaft, length: float) -> tuple[float, str]:
    """Torque through the hub's connection at a station: the largest torque of a part sitting on it
    (within half the connection's length), else the larger of the shaft's torques either side."""
    parts = [(abs(ld.torque), ld.name or f"loads[{j}]") for j, ld in enumerate(shaft.loads)
             if abs(ld.at - st.at) <= length / 2 * (1 + 1e-9) and ld.torque]
    if parts:
        T, name = max(parts)
        return T, f"the torque of the part on it ({name})"
    sl = srec["loads"]
    T = max(abs(sl["left"]["T"]), abs(sl["right"]["T"]))
    return T, "the shaft's torque at the station (the larger side): no part with a torque sits on it"


# ----------------------------------------------------------------------------- keys


def key_checks(i, st, srec, key, shaft, shaft_yield, case_nd) -> list[dict]:
    T, basis = hub_torque(st, srec, shaft, key.length)
    n_keys = len(key.keyways)
    n_eff = ck.effective_key_count(n_keys)
    Tk = T / n_eff
    nd = key.design_factor if key.design_factor is not None else case_nd
    ssy = ck.shear_yield_distortion_energy(key.key_yield)
    s_shaft = min(key.key_yield, shaft_yield) if shaft_yield else key.key_yield
    s_hub = min(key.key_yield, key.hub_yield)
    out = []
    for j, kw in enumerate(key.keyways):
        d, L = key.diameter, key.length
        tau = ck.key_shear_stress(Tk, d, kw.width, L)
        sig_s = ck.key_bearing_stress(Tk, d, kw.shaft_engagement, L)
        sig_h = ck.key_bearing_stress(Tk, d, kw.hub_engagement, L)
        factors = {"shear": _ratio(ssy, tau), "bearing_shaft": _ratio(s_shaft, sig_s), "bearing_hub": _ratio(s_hub, sig_h)}
        req = None
        if nd is not None and T > 0:
            req = {"shear": ck.key_length_for_shear(Tk, d, kw.width, ssy, nd),
                   "bearing_shaft": ck.key_length_for_bearing(Tk, d, kw.shaft_engagement, s_shaft, nd),
                   "bearing_hub": ck.key_length_for_bearing(Tk, d, kw.hub_engagement, s_hub, nd)}
            req["governing"] = max(req.values())
        finite = [v for v in factors.values() if v is not None]
        out.append({
            "station": i, "at": st.at, "name": st.name, "keyway": j, "diameter": d, "torque": T, "torque_basis": basis,
            "keys": n_keys, "torque_per_key": Tk,
            "share": (f"{n_keys} keys counted as {n_eff:g} (each designed for T/{n_eff:g}; common practice, from memory)"
                      if n_keys > 1 else "one key carries the whole torque"),
            "width": kw.width, "height": kw.height, "height_from": kw.height_from, "length": L,
            "length_from": key.length_from, "shaft_engagement": kw.shaft_engagement,
            "hub_engagement": kw.hub_engagement, "shear_stress": tau, "bearing_stress_shaft": sig_s,
            "bearing_stress_hub": sig_h,
            "strengths": {"key_yield": key.key_yield, "key_shear_yield": ssy, "shaft_yield": shaft_yield,
                          "hub_yield": key.hub_yield, "bearing_shaft_strength": s_shaft, "bearing_hub_strength": s_hub},
            "strength_note": None if shaft_yield else "the shaft's yield strength is not given: the shaft side is "
                                                      "judged on the key's yield strength only",
            "factors": factors, "factor": min(finite) if finite else None,
            "design_factor": nd, "required_length": req,
            "required_length_note": None if req else ("no design factor (give key.design_factor or "
                                                       "analysis.design_factor)" if nd is None else "no torque"),
            "ok": (None if nd is None or not finite else bool(min(finite) >= nd)),
            "source": KEY_SOURCE,
        })
    return out


def _ratio(strength, stress):
    return None if not stress else strength / stress


# ----------------------------------------------------------------------------- splines


def spline_check(i, st, srec, sp, shaft, shaft_yield) -> dict:
    geo = {name: value for name, value, _ in (st.section.geometry or ())}
    z = int(geo["teeth"])
    if geo.get("form") == "involute":
        dp, t, basis = geo["pitch_diameter"], geo["tooth_thickness"], "pitch diameter m·z, tooth thickness on it"
    else:  # straight-sided: the mean diameter and the spline's width (common practice)
        dp = (geo["major_diameter"] + geo["minor_diameter"]) / 2
        t, basis = geo["width"], "straight-sided: mean of major and minor diameters, the spline's width (common practice)"
    T, tbasis = hub_torque(st, srec, shaft, sp.length)
    tau = csp.spline_tooth_shear(T, dp, z, t, sp.length)
    p = csp.spline_bearing_pressure(T, dp, z, sp.depth, sp.length)
    ssy = ck.shear_yield_distortion_energy(shaft_yield) if shaft_yield else None
    return {"station": i, "at": st.at, "name": st.name, "torque": T, "torque_basis": tbasis, "teeth": z,
            "pitch_diameter": dp, "tooth_thickness": t, "diameters_basis": basis, "length": sp.length,
            "depth": sp.depth, "shear_stress": tau, "bearing_pressure": p, "shear_yield": ssy,
            "shear_factor": _ratio(ssy, tau) if ssy else None,
            "bearing_factor": None,
            "bearing_note": "no allowable bearing pressure is assumed: it depends on the spline's fit, hardness and "
                            "lubrication (the spline standard's rating governs)",
            "source": SPLINE_SOURCE, "from_memory": True}


# ----------------------------------------------------------------------------- press fits


def fit_check(i, st, srec, fit, case: Case) -> dict:
    shaft, mat = case.shaft, case.material
    d, bore = srec["diameter"], srec.get("bore") or 0.0
    nu_s = mat.poisson if mat.poisson is not None else mat.elastic_modulus / (2 * mat.shear_modulus) - 1
    E_h = fit.hub_elastic_modulus or mat.elastic_modulus
    nu_h = fit.hub_poisson if fit.hub_poisson is not None else nu_s
    dd = cp.thermal_interference_change(d, fit.shaft_expansion, fit.shaft_temperature_rise, fit.hub_expansion,
                                        fit.hub_temperature_rise)
    delta = fit.interference + dd
    R, ro, ri = d / 2, fit.hub_diameter / 2, bore / 2
    lost = delta <= 0
    p = 0.0 if lost else cp.contact_pressure(delta / 2, R, ro, ri, E_h, nu_h, mat.elastic_modulus, nu_s)
    s = cp.fit_stresses(p, R, ro, ri)
    vm_hub = math.sqrt(s.hub_tangential**2 - s.hub_tangential * s.hub_radial + s.hub_radial**2)
    vm_shaft = math.sqrt(s.shaft_tangential**2 - s.shaft_tangential * s.shaft_radial + s.shaft_radial**2)
    T_cap = cp.fit_torque(p, R, fit.length, fit.friction)
    F_cap = cp.fit_axial_force(p, R, fit.length, fit.friction)
    T, tbasis = hub_torque(st, srec, shaft, fit.length)
    sl = srec["loads"]
    N = max(abs(sl["left"]["N"]), abs(sl["right"]["N"]))
    return {"station": i, "at": st.at, "name": st.name, "diameter": d, "bore": bore, "hub_diameter": fit.hub_diameter,
            "length": fit.length, "friction": fit.friction, "interference": fit.interference,
            "interference_thermal_change": dd, "interference_operating": delta, "fit_lost": lost,
            "hub_elastic_modulus": E_h, "hub_poisson": nu_h,
            "hub_material": "given" if fit.hub_elastic_modulus else "the shaft's (hub_elastic_modulus not given)",
            "contact_pressure": p, "hub_tangential": s.hub_tangential, "hub_radial": s.hub_radial,
            "shaft_tangential": s.shaft_tangential, "shaft_radial": s.shaft_radial,
            "hub_von_mises": vm_hub, "shaft_von_mises": vm_shaft,
            "hub_yield": fit.hub_yield, "hub_factor": _ratio(fit.hub_yield, vm_hub) if fit.hub_yield else None,
            "shaft_factor": _ratio(mat.yield_strength, vm_shaft) if mat.yield_strength else None,
            "torque_capacity": T_cap, "axial_capacity": F_cap, "torque": T, "torque_basis": tbasis,
            "axial_force": N, "slip_factor_torque": _ratio(T_cap, T), "slip_factor_axial": _ratio(F_cap, N),
            "kt_bending": fit.kt_bending, "kt_bending_source": fit.kt_bending_source,
            "stresses_note": "the fit's own stresses (plane stress, hub as long as the seat); the station's section "
                             "check does not add them to the bending and torsion stresses",
            "source": FIT_SOURCE}


# ----------------------------------------------------------------------------- bearings


def bearing_life(shaft, lay) -> list[dict]:
    out = []
    for s, r in zip(shaft.supports, lay["reactions"]):
        rt = s.rating
        if rt is None:
            continue
        Fr, Fa = r["F"], abs(r.get("Fz") or 0.0)
        e = {"at": s.at, "name": s.name, "bearing": s.bearing, "element": rt.element, "C": rt.C, "Fr": Fr, "Fa": Fa,
             "X": rt.X, "Y": rt.Y, "exponent": cb.life_exponent(rt.element), "required_life_hours": rt.required_life,
             "source": LIFE_SOURCE,
             "caution": "basic rating life only (90 % reliability): the adjusted-life factors (a1, a_ISO for "
                        "lubrication, contamination and the fatigue load limit) are not included"}
        if Fa > 0 and rt.X is None:
            e["skipped"] = ("this bearing takes an axial force: give x_factor and y_factor (P = X·Fr + Y·Fa, from the "
                            "bearing's catalogue for its Fa/C0 and e)")
            out.append(e)
            continue
        P = cb.equivalent_dynamic_load(Fr, Fa, rt.X if rt.X is not None else 1.0, rt.Y if rt.Y is not None else 0.0)
        e["P"] = P
        if not P > 0:
            e["skipped"] = "no load on this bearing: its rating life is not defined"
            out.append(e)
            continue
        L10 = cb.basic_rating_life(rt.C, P, e["exponent"])
        e["L10_revolutions"] = L10
        e["heavy_load"] = bool(P > LIFE_LOAD_LIMIT * rt.C)
        if shaft.speed:
            e["speed"] = shaft.speed
            e["L10_hours"] = cb.life_hours(L10, shaft.speed)
            if rt.required_life is not None:
                e["ok"] = bool(e["L10_hours"] >= rt.required_life)
        else:
            e["hours_note"] = "no shaft.speed: the life is given in revolutions only"
        out.append(e)
    return out


# ----------------------------------------------------------------------------- torsion along the shaft

#: Beam nodes closer than this share of the shaft's length are one node of the torsion model: a very short
#: element beside long ones makes the eigenproblem ill-conditioned (measured: an element of 1e-9 of the
#: length moved the first frequency by 5e-4, one of 1e-12 by 2 %); merging moves a part or a section
#: boundary by at most this share, which changes twists and frequencies by about as much.
MERGE_SHARE = 1e-6


def merged_nodes(z: np.ndarray) -> np.ndarray:
    """The beam's nodes with those closer than :data:`MERGE_SHARE` of the length to the last kept one
    dropped (both ends kept)."""
    tol = MERGE_SHARE * (z[-1] - z[0])
    keep = [z[0]]
    for x in z[1:-1]:
        if x - keep[-1] > tol and z[-1] - x > tol:
            keep.append(x)
    keep.append(z[-1])
    return np.array(keep)



def composite_hand_GJ(p) -> float:
    """The hand GJ of a composite segment: ΣGᵢJᵢ of bonded concentric layers where it has that pair
    (Gere, Mechanics of Materials, 6th ed.), else its FE value (no closed form)."""
    pair = next((q for q in p.pairs if q.quantity.endswith("torsional rigidity GJ") and q.classic is not None), None)
    return pair.classic if pair is not None else p.GJ


def torsional(shaft, case: Case, lay, stations, analyses) -> dict:
    G = case.material.shear_modulus
    z = merged_nodes(np.asarray(lay["z"], float))
    mid = 0.5 * (z[:-1] + z[1:])
    segs = [next(s for s in lay["model"].segs if s.start <= m <= s.end) for m in mid]
    GJ, Jp, basis = [], [], []
    fe = []
    for st, srec, a in zip(shaft.stations, stations, analyses):
        lengths = [ln for _, ln in a.case.feature_lengths] if st.section is not None else []
        if st.section is not None and not lengths and st.checklist is not None and st.checklist.spline is not None:
            lengths = [st.checklist.spline.length]  # a splined length: its engagement length
        if lengths:
            ell = max(lengths)
            fe.append((max(st.at - ell / 2, 0.0), min(st.at + ell / 2, shaft.length), a.torsion.J, a.props.polar,
                       st.name or f"sections[{len(fe)}]"))
    comp = {id(shaft.segments[i]): p for i, p in (lay.get("composite_segments") or {}).items()}
    rhoJ = []  # polar mass per length of composite elements (None elsewhere)
    for m, seg in zip(mid, segs):
        if id(seg) in comp:  # bonded regions: the segment's FE GJ (the bracket's lower end) and ΣρᵢJᵢ
            p = comp[id(seg)]
            GJ.append(p.GJ)
            Jp.append(0.0)
            rhoJ.append(p.rhoJ or 0.0)
            basis.append("composite")
            continue
        rhoJ.append(None)
        D, d = seg.diameter, seg.bore or 0.0
        J = math.pi * (D**4 - d**4) / 32
        jp, b = J, "round"
        for z0, z1, Jfe, pol, _ in fe:
            if z0 <= m <= z1:
                J, jp, b = Jfe, pol, "fe"
        GJ.append(G * J)
        Jp.append(jp)
        basis.append(b)
    GJ, Jp = np.array(GJ), np.array(Jp)  # hand: round bars, and ΣGᵢJᵢ of concentric layers on composite segments
    GJ_round = np.array([composite_hand_GJ(comp[id(s)]) if id(s) in comp else
                         G * math.pi * (s.diameter**4 - (s.bore or 0.0) ** 4) / 32 for s in segs])
    Tel = np.array([loads_at(lay["items"], z, lay["qy"], x)["T"] for x in mid])
    line = TorsionLine(z, GJ)
    phi = twist(line, Tel)
    phi_round = twist(TorsionLine(z, GJ_round), Tel)
    parts = sorted([(ld.at, ld.name or f"loads[{j}]") for j, ld in enumerate(shaft.loads)])
    node = lambda at: int(np.argmin(np.abs(z - at)))  # noqa: E731
    first = node(parts[0][0]) if parts else 0
    rot = [{"at": at, "name": nm, "rotation": float(phi[node(at)] - phi[first])} for at, nm in parts]
    between = []
    for p in range(len(parts)):
        for q in range(p + 1, len(parts)):
            n1, n2 = node(parts[p][0]), node(parts[q][0])
            between.append({"from": parts[p][1], "to": parts[q][1], "from_at": parts[p][0], "to_at": parts[q][0],
                            "angle": {"fe": float(phi[n2] - phi[n1]), "classic": float(phi_round[n2] - phi_round[n1]),
                                      "source": "round-bar GJ everywhere: Σ T·L/(G·J), J = π(D⁴ − d⁴)/32 "
                                                f"({SHIGLEY9}, eq. (3-35))" + (
                                                    "; on composite segments GJ = ΣGᵢJᵢ of bonded concentric layers (Gere, "
                                                    "Mechanics of Materials, 6th ed.), else their FE GJ" if comp else ""),
                                      "kind": "factor"}})
    rec = {"G": G, "parts": rot, "between": between,
           "stiffness": "round-bar G·J per segment; a station's FE torsion constant J (and FE polar moment) over its "
                        "feature length" + (f" ({', '.join(f[4] for f in fe)})" if fe else ""),
           "fe_stretches": [{"from": f[0], "to": f[1], "J": f[2], "polar": f[3], "name": f[4]} for f in fe]}
    rho = shaft.density
    inertias = [(node(ld.at), ld.inertia) for ld in shaft.loads if ld.inertia]
    polar = (rho or 0.0) * Jp
    if comp:  # composite elements: their regions' ΣρᵢJᵢ (compare/checks/shaft_composite.py)
        polar = np.array([pj if pj is not None else v for pj, v in zip(rhoJ, polar)])
        rec["composite"] = "composite segments: FE GJ (stress function, the lower end of its bracket) and the " \
                           "regions' polar mass ΣρᵢJᵢ; the hand angles use ΣGᵢJᵢ of concentric layers"
    if not polar.any() and len(inertias) < 2:
        rec["frequencies"] = {"skipped": "needs shaft.density or the inertia of at least two parts"}
        return rec
    line_m = TorsionLine(z, GJ, polar)
    omega, modes = natural_frequencies(line_m, inertias, count=3)
    fr = {"values": [float(w) for w in omega],
          "method": "linear finite elements along the shaft: G·J per element, consistent polar mass ρ·Jp of the shaft"
                    + (" (no density given: massless shaft)" if not polar.any() else "") + ", the parts' polar inertias at "
                    "their positions; free in rotation at the bearings (rigid-body mode left out)",
          "margin": SEPARATION_MARGIN,
          "margin_basis": f"a torsional natural frequency within ±{SEPARATION_MARGIN:.0%} of the operating speed is "
                          "too close (common practice)",
          "mode_shapes": {"z": z.tolist(), "modes": modes.T.tolist()}}
    if len(omega) == 0:
        fr = {"skipped": "no torsional mode: the inertia sits at one point only"}
    elif shaft.speed:
        fr["speed"] = shaft.speed
        fr["ratios"] = [float(w / shaft.speed) for w in omega]
        fr["ok"] = bool(all(abs(r - 1.0) > SEPARATION_MARGIN for r in fr["ratios"]))
    rec["frequencies"] = fr
    return rec

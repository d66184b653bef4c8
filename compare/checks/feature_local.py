"""The FE path of a station on a shoulder or groove: local stresses at the fillet from the meridian-
section FE, in place of the plain round section's.

A 2-D cross-section cannot see a shoulder or a groove; the three axisymmetric solutions of the
feature (torsion, tension n = 0, bending n = 1; compare/solve/features.py) can. Per unit nominal
stress they give the stress components at the sample points along the feature arcs
(:func:`fem.axisym.feature_stress_components`). Here they are superposed point by point with the
station's loads {N, M = |(Mx, My)|, T}, scaled by the elementary nominals on the feature's smaller
diameter (4N/(π(d²−di²)), 32M·d/(π(d⁴−di⁴)), 16T·d/(π(d⁴−di⁴))):

    σ(point, θ) = σ_N·S_tension + σ_M·(C_bending·cos θ + S_bending·sin θ) + τ_T·S_torsion,

θ the angle round the shaft from the tension side of the resultant moment. A shaft standing still:
every stress is a mean stress, the worst θ taken. A rotating shaft: the bending (fixed in space) is
fully reversed at every point — alternating σ_M·(C cos ψ + S sin ψ), mean σ_N·S_tension + τ_T·S_torsion;
the alternating von Mises stress is the largest over ψ. θ and ψ are scanned on :data:`N_ANGLES`
points per turn (the von Mises stress is a smooth function of the angle; a step of 0.5° changes it
by at most a relative 1 − cos 0.25° ≈ 1e-5 near its maximum). Then the static criteria (von Mises,
Tresca, Coulomb–Mohr, modified Mohr) and the fatigue criteria are those of :mod:`.checks` (the
classic/ formulas), at every point, and the smallest factor of each is the station's FE-path value.

Not in the meridian model: transverse shear forces (their surface stress is largest where the
bending stress vanishes; the plain section's FE path carries them) — recorded as a note. Numbers and
records only.
"""
from __future__ import annotations

import math
from types import SimpleNamespace

import numpy as np

from classic import stress as cs
from fem.axisym import nominal_stress

from .checks import SHIGLEY, _fe_factors, governing, required_endurance, set_required_strength
from .polymer import polymer_at_feature

#: Angles per turn of the θ (standing shaft) and ψ (rotating shaft) scans.
N_ANGLES = 720
SOURCE = "meridian-section FE (axisymmetric torsion, tension n = 0, bending n = 1) at the feature's arcs"
STATIC_CRITERIA = ("von_mises", "tresca", "coulomb_mohr", "modified_mohr")


def _von_mises(s: np.ndarray) -> np.ndarray:
    rr, tt, zz, rz, rt, tz = np.moveaxis(s, -1, 0)
    return np.sqrt(((rr - tt) ** 2 + (tt - zz) ** 2 + (zz - rr) ** 2) / 2 + 3 * (rz**2 + rt**2 + tz**2))


def _principal(s: np.ndarray) -> np.ndarray:
    rr, tt, zz, rz, rt, tz = np.moveaxis(s, -1, 0)
    m = np.stack([np.stack([rr, rt, rz], -1), np.stack([rt, tt, tz], -1), np.stack([rz, tz, zz], -1)], -2)
    return np.linalg.eigvalsh(m)  # ascending: σ3, σ2, σ1


def fillet_stresses(local: dict, N: float, M: float, T: float, rotating: bool) -> dict:
    """Point-by-point superposition (module docstring). Returns arrays over the points (and angles):
    ``total`` (n, K, 6) the stress over the cycle's worst instants (standing: every θ; rotating: every
    ψ), ``sa``, ``sm`` (n,) the von Mises alternating and mean stresses, ``theta`` (K,) [rad]."""
    d, bore = local["d"], local["bore"]
    sN = nominal_stress("tension", d, bore, N)
    sM = nominal_stress("bending", d, bore, M)
    sT = nominal_stress("torsion", d, bore, T)
    th = np.arange(N_ANGLES) * (2 * math.pi / N_ANGLES)
    mean = sN * local["tension"]["cos"] + sT * local["torsion"]["cos"]  # (n, 6)
    bend = (sM * local["bending"]["cos"][:, None, :] * np.cos(th)[None, :, None]
            + sM * local["bending"]["sin"][:, None, :] * np.sin(th)[None, :, None])  # (n, K, 6)
    total = mean[:, None, :] + bend
    if rotating:
        sa = _von_mises(bend).max(axis=1)
        sm = _von_mises(mean)
    else:
        sm = _von_mises(total).max(axis=1)
        sa = np.zeros_like(sm)
    return {"total": total, "sa": sa, "sm": sm, "theta": th, "nominal": {"axial": sN, "bending": sM, "torsion": sT}}


def _where(local: dict, i: int, theta: float | None) -> dict:
    return {"boundary": f"meridian-section FE at {local['field']}", "feature": "fillet",
            "radius": local["radius"], "angle_deg": math.degrees(theta) if theta is not None else 0.0,
            "angle_from": "the tension side of the resultant bending moment, round the shaft",
            "distance_from_axis": float(local["bending"]["r"][i]), "z": float(local["bending"]["at"][i]),
            "source": SOURCE}


def _at(local: dict, i: int, theta: float, Mx: float, My: float) -> list[float]:
    """The point in the cross-section's (x, y): radius r at the angle θ from the tension side of the
    moment vector (σ = (Mx·y − My·x)/I: the tension side lies along (−My, Mx))."""
    base = math.atan2(Mx, -My) if (Mx or My) else 0.0
    r = float(local["bending"]["r"][i])
    return [r * math.cos(base + theta), r * math.sin(base + theta)]


def fillet_fe_path(a, local: dict, keep_section_min: bool = False) -> dict:
    """Replace the FE-path entries of the station analysis ``a`` (``static``, ``fatigue``, and the
    ``governing`` result) by those of the feature's local stresses; the plain section's values are kept
    beside them (``plain_round``/``plain_section``). With ``keep_section_min`` (a station with its own
    non-round section at the feature) each criterion keeps the smaller of the two. Returns the record
    also stored as ``a.extra['fatigue']['fe_local']`` / ``a.extra['static']['fe_local']``."""
    case = a.case
    ld = case.loads
    Mx, My = ld.bending
    N, M, T = float(ld.axial or 0.0), math.hypot(Mx, My), float(ld.torque or 0.0)
    rot = bool(ld.rotating)
    fs = fillet_stresses(local, N, M, T, rot)
    vm = _von_mises(fs["total"])  # (n, K)
    p = _principal(fs["total"])
    s1, s3 = p[..., 2], p[..., 0]
    plain_key = "plain_section" if keep_section_min else "plain_round"
    notes = ["σ_N, σ_M, τ_T superposed point by point along the feature arcs (per-unit-load solutions on the "
             "finest mesh of the study)",
             "rotating shaft: bending fully reversed, alternating von Mises the largest over the shaft angle"
             if rot else "shaft standing still: every stress is a mean stress, the worst angle round the shaft taken",
             "transverse shear forces are not in the meridian model (their surface stress is largest where the "
             "bending stress vanishes)"]
    if keep_section_min:
        notes.append("the station has its own section at the feature: each criterion keeps the smaller of the "
                     "section's FE path and the fillet's (neither model has both raisers)")
    rec = {"source": SOURCE, "field": local["field"], "kind": local["kind"], "points": int(vm.shape[0]),
           "angles_per_turn": N_ANGLES, "d": local["d"], "bore": local["bore"], "nominal": fs["nominal"],
           "loads": {"N": N, "M": M, "T": T, "rotating": rot}, "notes": notes}
    m = case.material
    st = a.extra.get("static") or {}
    new_static = {}
    if "von_mises" in st.get("criteria", []):
        new_static["von_mises"] = (cs.yield_factor_von_mises(m.yield_strength, vm), vm, True)
        new_static["tresca"] = (cs.yield_factor_tresca(m.yield_strength, s1, s3), s1 - s3, True)
    for name, f in (("coulomb_mohr", cs.coulomb_mohr_factor), ("modified_mohr", cs.modified_mohr_factor)):
        if name in st.get("criteria", []):
            n = np.asarray(f(s1, s3, m.ultimate, m.compressive_ultimate), float)
            new_static[name] = (n, -n, False)
    for name, (n, measure, _) in new_static.items():
        n = np.asarray(n, float)
        k = np.unravel_index(int(np.argmin(np.where(np.isfinite(n), n, np.inf))), n.shape)
        value = float(n[k])
        st.setdefault(plain_key, {})[name] = {"factor": st[name], "at": st["at"][name], "where": st["where"][name]}
        if keep_section_min and st[name] <= value:
            continue
        st[name] = value
        st["at"][name] = _at(local, k[0], float(fs["theta"][k[1]]), Mx, My)
        st["where"][name] = _where(local, k[0], float(fs["theta"][k[1]]))
    if new_static:
        st["path"] = f"{SOURCE}: local stresses at the fillet, worst point and instant of the load cycle"
        st["fe_local"] = rec
        nd = case.analysis.design_factor
        if nd is not None:
            set_required_strength(st, nd, m, st.get("required_strength") or {})
    ft = a.extra.get("fatigue") or {}
    if ft and "skipped" not in ft:
        facs = _fe_factors(SimpleNamespace(sa=fs["sa"], sm=fs["sm"]), np.arange(len(fs["sa"])), ft["Se"], m.ultimate,
                           m.yield_strength)
        for name, n in facs.items():
            i = int(np.argmin(n))
            old = ft["fe"].get(name)
            if old is not None:
                ft.setdefault(f"{plain_key}_fe", {})[name] = old
            if keep_section_min and old is not None and old["factor"] <= float(n[i]):
                continue
            theta = 0.0 if rot else float(fs["theta"][int(np.argmax(vm[i]))])
            ft["fe"][name] = {"factor": float(n[i]), "at": _at(local, i, theta, Mx, My), "sigma_a_vm": float(fs["sa"][i]),
                              "sigma_m_vm": float(fs["sm"][i]), "where": _where(local, i, theta)}
            ft[name] = float(n[i])
        ft["path"] = (f"{SOURCE}: local stresses at the fillet at every sample point (Kf = Kt, q = 1: no notch "
                      "sensitivity applied, conservative against the hand path)")
        ft["fe_local"] = rec
        if "von_mises" in st:
            ft["first_cycle_yield_von_mises"] = st["von_mises"]
        nd = case.analysis.design_factor
        if nd is not None:
            ft["required_endurance_limit"] = required_endurance(
                {k: v for k, v in ft["fe"].items() if k in facs}, None, nd, m.ultimate, m.yield_strength)
        ft["fe_notes"] = list(ft.get("fe_notes") or []) + [f"FE path at the feature ({SHIGLEY} criteria): " + n
                                                           for n in notes]
    gov = a.extra.get("governing")
    if not (gov or {}).get("no_verdict"):
        g = governing(a, st, ft) if (st or ft) else None
        if m.polymer is not None:  # a polymer: its own checks on the fillet's local stresses (checks/polymer.py)
            g = polymer_at_feature(a, fs, vm, lambda i, th: (_at(local, i, th, Mx, My), _where(local, i, th)),
                                   keep_section_min, plain_key, rec, g)
        if g is not None:
            a.extra["governing"] = g
        _factor_below_one(a)
    for e in a.extra.get("materials") or []:  # ranked on the plain section's stresses: no verdict here
        e["meets"] = None
        e["meets_what_was_checked"] = None
        e["no_verdict"] = ("ranked on the plain section's stresses; at this station the feature's local stresses "
                           "govern (see the station's static and fatigue factors)")
    a.extra.setdefault("combined", {}).setdefault("notes", []).append(
        "this station sits on a shoulder or groove: the combined stress points above are the plain section's; its "
        "static and fatigue FE-path factors come from the " + SOURCE)
    return rec


def _factor_below_one(a) -> None:
    """The ``factor_below_one`` warning of the station, again for the replaced governing factor."""
    ws = [w for w in a.extra.get("warnings") or [] if w.get("code") != "factor_below_one"]
    gov = a.extra.get("governing") or {}
    n = gov.get("factor")
    if n is not None and math.isfinite(n) and n < 1.0:
        k = sum(1 for w in ws if w.get("code") in ("sharp_corner_no_verdict", "feature_station_sharp_no_verdict"))
        ws.insert(k, {"code": "factor_below_one", "factor": n, "criterion": gov.get("criterion"),
                      "path": gov.get("path"), "away_from_corners": False})
    a.extra["warnings"] = ws

"""The static check of a composite section, region by region, in each region's own material.

In each region the torsional shear peak (from the case's torque) and the normal-stress peak (axial
force and bending, transformed section) are read on the region's boundary and interfaces. They are
combined as √(σ² + 3τ²) as if they sat at one point: an upper bound of the region's von Mises stress
(the two peaks may lie apart), so the factor of safety Sy/that bound is a lower bound of the region's
own. With a shear force, τ is bounded by the torsional peak (the torque plus the shear force's torque
about the shear centre) plus the region's transverse-shear peak. The fatigue check, region by region,
is compare/checks/composite_fatigue.py. Numbers and records only.
"""
from __future__ import annotations

import math

from fem.composite import normal_stress_peaks

from .composite_fatigue import composite_fatigue, torque_of_unit_shear

NOT_CHECKED = ["the bond's own strength at the interfaces (static and fatigue)",
               "stresses from unequal Poisson's ratios or thermal expansion between regions",
               "creep, moisture and temperature of polymer regions beyond the data given (a polymer region's creep "
               "twist is not computed)",
               "3-D features (a groove, a hub edge, the end of an insert): the section is 2-D; a region's chart "
               "factors stand in for them only where given"]


def composite_checks(a) -> None:
    """``a.extra['regions']`` (one record per region) and ``a.extra['governing']``."""
    case = a.case
    sol = a.extra["composite"]["solution"]
    tr, pr = sol.torsion, sol.props
    mats = case.region_materials
    T, N = case.loads.torque, case.loads.axial
    Mx, My = case.loads.bending
    sig = normal_stress_peaks(sol.mesh, [m.elastic_modulus for m in mats], pr, N, Mx, My)
    T_shear = 0.0
    if sol.shear is not None:  # a shear force through the shaft axis twists about the shear centre
        dTx, dTy = torque_of_unit_shear(case, sol.shear)
        T_shear = dTx * case.loads.shear[0] + dTy * case.loads.shear[1]
    regions = []
    for k, m in enumerate(mats):
        tau_T = abs(T + T_shear) * tr.peaks[k].value
        tau_V = sol.shear_peaks[k].value if sol.shear_peaks else 0.0
        tau = tau_T + tau_V
        s = sig[k].value
        vm = math.hypot(s, math.sqrt(3.0) * tau)
        n = m.yield_strength / vm if (m.yield_strength is not None and vm > 0) else None
        regions.append({
            "name": m.name, "field": m.field,
            "material": {"elastic_modulus": m.elastic_modulus, "shear_modulus": m.shear_modulus,
                         "shear_modulus_from": m.shear_modulus_from, "poisson": m.poisson, "yield": m.yield_strength},
            "area": pr.region_areas[k],
            "tau_max": tau_T, "tau_max_at": list(tr.peaks[k].at),
            "tau_max_warping": abs(T + T_shear) * tr.peaks_warping[k].value,
            "tau_interface_max": None if tr.interface_peak[k] is None else abs(T + T_shear) * tr.interface_peak[k],
            "sigma_max": s, "sigma_max_at": list(sig[k].at),
            "von_mises_bound": vm, "factor": n,
            "criterion": (None if n is None else
                          "von Mises bound √(σmax² + 3(τT + τV)²) against the polymer's tensile strength at the "
                          "service conditions" if m.kind == "polymer" else
                          "von Mises bound √(σmax² + 3(τT + τV)²) against the region's yield"),
        })
        if sol.shear_peaks:
            p = sol.shear_peaks[k]
            regions[-1].update(tau_shear_max=p.value, tau_shear_max_at=list(p.at), tau_shear_max_place=p.place,
                               tau_shear_interface_max=p.interface)
        if T_shear:
            regions[-1]["torque_with_shear"] = T + T_shear
    fat = composite_fatigue(a)
    for r, f in zip(regions, fat["regions"]):
        r["fatigue"] = f
    a.extra["composite_fatigue"] = {k: v for k, v in fat.items() if k != "regions"}
    a.extra["regions"] = regions
    cands = []
    for r in regions:
        if r["factor"] is not None:
            at = r["tau_max_at"] if r["tau_max"] + r.get("tau_shear_max", 0.0) >= abs(r["sigma_max"]) else r["sigma_max_at"]
            cands.append((r["factor"], r["name"], "von_mises_bound", at))
        f = r["fatigue"]
        if f.get("factor") is not None and math.isfinite(f["factor"]):
            cands.append((f["factor"], r["name"], f"fatigue_{f['criterion']}", f["at"]))
    if cands:
        n, name, crit, at = min(cands, key=lambda c: c[0])
        a.extra["governing"] = {"factor": n, "region": name, "criterion": crit, "at": at}
    a.extra["not_checked"] = list(NOT_CHECKED)
    ld = case.loads
    alternating = any(any(x != 0 for x in (v if isinstance(v, (list, tuple)) else [v])) for v in ld.alternating.values()) or (
        ld.rotating and (any(ld.bending) or any(ld.shear or ())))
    warn = []
    skipped = [r["name"] for r in regions if "skipped" in r["fatigue"]]
    if alternating and skipped:
        warn.append({"code": "composite_fatigue_not_checked", "regions": skipped,
                     "reasons": [r["fatigue"]["skipped"] for r in regions if "skipped" in r["fatigue"]]})
    for m in mats:
        if m.polymer is not None and m.polymer.data.illustrative:
            warn.append({"code": "polymer_illustrative_data", "source": m.polymer.data.source,
                         "field": f"{m.polymer.data.where}.illustrative"})
    a.extra["composite_warnings"] = warn

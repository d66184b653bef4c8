"""The static check of a composite section, region by region, in each region's own material.

In each region the torsional shear peak (from the case's torque) and the normal-stress peak (axial
force and bending, transformed section) are read on the region's boundary and interfaces. They are
combined as √(σ² + 3τ²) as if they sat at one point: an upper bound of the region's von Mises stress
(the two peaks may lie apart), so the factor of safety Sy/that bound is a lower bound of the region's
own. The fatigue check of a composite is not made (said in ``not_checked``). Numbers and records only.
"""
from __future__ import annotations

import math

from fem.composite import normal_stress_peaks

NOT_CHECKED = ["fatigue (not made for composite sections)", "transverse shear", "the bond's own strength at the interfaces",
               "stresses from unequal Poisson's ratios or thermal expansion between regions",
               "creep, moisture and temperature of polymer regions beyond the strengths given"]


def composite_checks(a) -> None:
    """``a.extra['regions']`` (one record per region) and ``a.extra['governing']``."""
    case = a.case
    sol = a.extra["composite"]["solution"]
    tr, pr = sol.torsion, sol.props
    mats = case.region_materials
    T, N = case.loads.torque, case.loads.axial
    Mx, My = case.loads.bending
    sig = normal_stress_peaks(sol.mesh, [m.elastic_modulus for m in mats], pr, N, Mx, My)
    regions = []
    for k, m in enumerate(mats):
        tau = abs(T) * tr.peaks[k].value
        s = sig[k].value
        vm = math.hypot(s, math.sqrt(3.0) * tau)
        n = m.yield_strength / vm if (m.yield_strength is not None and vm > 0) else None
        regions.append({
            "name": m.name, "field": m.field,
            "material": {"elastic_modulus": m.elastic_modulus, "shear_modulus": m.shear_modulus,
                         "shear_modulus_from": m.shear_modulus_from, "poisson": m.poisson, "yield": m.yield_strength},
            "area": pr.region_areas[k],
            "tau_max": tau, "tau_max_at": list(tr.peaks[k].at),
            "tau_max_warping": abs(T) * tr.peaks_warping[k].value,
            "tau_interface_max": None if tr.interface_peak[k] is None else abs(T) * tr.interface_peak[k],
            "sigma_max": s, "sigma_max_at": list(sig[k].at),
            "von_mises_bound": vm, "factor": n,
            "criterion": "von Mises bound √(σmax² + 3τmax²) against the region's yield" if n is not None else None,
        })
    a.extra["regions"] = regions
    rated = [r for r in regions if r["factor"] is not None]
    if rated:
        g = min(rated, key=lambda r: r["factor"])
        a.extra["governing"] = {"factor": g["factor"], "region": g["name"], "criterion": "von_mises_bound",
                                "at": g["tau_max_at"] if g["tau_max"] >= abs(g["sigma_max"]) else g["sigma_max_at"]}
    a.extra["not_checked"] = list(NOT_CHECKED)

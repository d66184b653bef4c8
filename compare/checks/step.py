"""The checks of one case in order: the combined stress field and its critical points, the static
and fatigue checks, the material ranking (when a table is given) and the governing factor.
Everything is recorded in ``a.extra`` as numbers and records; :mod:`compare.output` writes the text."""
from __future__ import annotations

import numpy as np

from fem.errors import InputError

from .checks import fatigue_check, governing, static_check
from .combined import (GRID, STRESS_MEASURES, _kc_axial, _point_entry, build_field, fatigue_stresses, kt_bending_2d,
                       load_cycle, worst_over_cycle)
from .materials import rank_materials
from .polymer import governs, polymer_check


def combined_step(a) -> None:
    """Fill ``a.extra`` with ``combined``, ``static``, ``fatigue``, ``materials`` (when a table is
    given) and ``governing`` (when any factor of safety could be computed). Nothing is printed;
    whatever needs data the case does not give is skipped and the reason written down."""
    case = a.case
    fld = build_field(a)
    cyc = load_cycle(case)
    skipped: dict = {}
    if not fld.has_shear and (np.any(cyc.mean[4:]) or np.any(cyc.Lc[4:]) or "shear" in cyc.alt):
        raise InputError("material.poisson", None, "is required for transverse shear (loads.shear is given)")
    usable = ~fld.excluded
    worst = {name: worst_over_cycle(fld, cyc, name) for name in STRESS_MEASURES}
    points = [_point_entry(a, fld, cyc, worst[name].best(usable), worst[name], name) for name in STRESS_MEASURES]
    by = dict(zip(STRESS_MEASURES, points))
    vm, tr, s1, s3 = by["von_mises"], by["tresca"], by["sigma1"], by["sigma3"]
    kt2d = kt_bending_2d(a, fld)
    if cyc.rotating:
        method_psi = ("; shaft angle in closed form (σ = σ0 + A·cos ψ + B·sin ψ peaks at ψ = atan2(B, A) and opposite)"
                      if not cyc.rotating_shear else
                      f"; shaft angle scanned ({GRID} per turn, then golden section) wherever an upper bound allows the maximum")
    else:
        method_psi = ""
    combined = {
        "points": points,
        "von_mises_max": vm["von_mises"],
        "sigma1_max": s1["sigma1"],
        "sigma3_min": s3["sigma3"],
        "tau_abs_max": tr["tau_max"],
        "loads": cyc.describe(),
        "kt_bending_2d": kt2d,
        "read_points": {"boundary": int(fld.on_boundary.sum()), "interior": int((~fld.on_boundary).sum()),
                        "excluded_near_sharp_corners": int(fld.excluded.sum())},
        "method": ("σ = N/A plus unsymmetric bending about the centroidal axes (Ixy included); τ = the Prandtl torsion "
                   "field (torque plus the torque of the shear forces about the shear centre) plus the Saint-Venant "
                   "flexure field; superposed at every boundary read point and at the nodes and centroid of every "
                   "element; worst instant per point over every sign corner of the alternating sources" + method_psi),
        "notes": fld.notes + (["rotating shaft: the bending (and shear) stresses are fully reversed at every point"]
                              if cyc.rotating else []),
        "skipped": skipped,
    }
    a.extra["combined"] = combined
    extra_points: list = []
    st = static_check(a, fld, cyc, worst, skipped, points_out=extra_points)
    a.extra["static"] = st
    fs = fatigue_stresses(fld, cyc, _kc_axial())
    ft = fatigue_check(a, fld, cyc, fs, skipped, st, kt2d)
    fe_pts = ft.pop("_points", {})
    a.extra["fatigue"] = ft
    for name, e in fe_pts.items():
        i = e["index"]
        w = worst["von_mises"]
        entry = _point_entry(a, fld, cyc, i, w, f"fatigue_{name}")
        entry.update(sigma_a_vm=e["sigma_a_vm"], sigma_m_vm=e["sigma_m_vm"], fatigue_factor=e["factor"],
                     state_is="the instant of the largest von Mises stress at this point in the cycle")
        extra_points.append(entry)
    points.extend(extra_points)
    if case.analysis.materials:
        ranked = rank_materials(a, fld, cyc, worst, fs, kt2d, skipped)
        if ranked is not None:
            a.extra["materials"] = ranked
    gov = governing(a, st, ft)
    pol = polymer_check(a, fld, fs, worst)
    if pol is not None:  # a polymer: checked at the service conditions with its own data
        a.extra["polymer"] = pol
        gov = governs(pol, gov, case.analysis.design_factor)
    if gov is not None:
        a.extra["governing"] = gov
    else:
        skipped["governing"] = "no factor of safety could be computed (no strengths given, or no stress)"

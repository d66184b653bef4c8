"""A composite section solved (compare/solve/composite_study.py) and set beside its hand formulas:
for bonded concentric circular layers the exact GJ = Σ Gᵢ Jᵢ, the layer stresses Gₖθr and the
transformed-section EI = Σ Eᵢ Iᵢ (classic/composite.py); for any other arrangement no closed form
(the pairs say so). Returns the :class:`~compare.pairs.analysis.Analysis` the later steps read, with
``extra['composite']`` holding the solution and the study."""
from __future__ import annotations

import math
import time

from classic import composite as cc
from fem.geometry import Disk

from ..solve.composite_study import study_composite
from .analysis import Analysis
from .pairs import Pair, not_applicable

SOURCE_GJ = ("bonded concentric circular layers, GJ = Σ Gᵢ·π(rₒ⁴ − rᵢ⁴)/2: exact Saint-Venant torsion "
             "(Gere, Mechanics of Materials, 6th ed., composite bars in torsion)")
SOURCE_TAU = "bonded concentric circular layers, τ = Gₖ·θ·r at the layer's outer radius: exact (same source)"
SOURCE_EI = ("transformed section, EI = Σ Eᵢ·π(rₒ⁴ − rᵢ⁴)/4 (Gere, Mechanics of Materials, 6th ed., composite "
             "beams and the transformed-section method)")
#: FE against an exact formula: the study's own estimate is the accepted error (plus the case's target).
TOL_REASON = "exact formula: the FE value must agree within the accuracy target"


def concentric_layers(section) -> tuple[tuple[float, float], list[float], list[int]] | None:
    """(centre, radii from the axis out, region index of each layer) when every region is a disk or a
    disk minus a concentric disk and together they form bonded concentric layers; else None."""
    rings = []
    for k, reg in enumerate(section.regions):
        adds = [p for op, p in reg.section.steps if op == "add"]
        cuts = [p for op, p in reg.section.steps if op == "cut"]
        if len(adds) != 1 or len(cuts) > 1 or not isinstance(adds[0], Disk) or (cuts and not isinstance(cuts[0], Disk)):
            return None
        c, ro = adds[0].center, adds[0].radius
        ri = cuts[0].radius if cuts else 0.0
        if cuts and math.dist(cuts[0].center, c) > 1e-12 * ro:
            return None
        rings.append((c, ri, ro, k))
    c0 = rings[0][0]
    if any(math.dist(r[0], c0) > 1e-12 * r[2] for r in rings):
        return None
    rings.sort(key=lambda r: r[2])
    radii = [rings[0][1]] + [r[2] for r in rings]
    for prev, nxt in zip(rings[:-1], rings[1:]):
        if abs(nxt[1] - prev[2]) > 1e-12 * nxt[2]:
            return None  # a gap or an overlap between layers
    return c0, radii, [r[3] for r in rings]


def composite_step(case, fineness: float | None = None) -> Analysis:
    t0 = time.perf_counter()
    st = study_composite(case, fineness)
    sol = st.solutions[-1]
    a = Analysis(case, None, None, None, [], {"solve": time.perf_counter() - t0, "final_mesh": sol.seconds})
    a.extra["composite"] = {"study": st, "solution": sol}
    a.pairs = composite_pairs(case, sol, st.target)
    return a


def composite_pairs(case, sol, target: float) -> list[Pair]:
    mats = case.region_materials
    tr, pr = sol.torsion, sol.props
    lay = concentric_layers(case.section)
    if lay is None:
        why = "no closed form for bonded regions that are not concentric circular layers"
        return [not_applicable("torsional rigidity GJ", tr.GJ, why, "rigidity"),
                not_applicable("bending rigidity EIxx (transformed section)", pr.EIxx, why, "rigidity")]
    _c, radii, order = lay
    G = [mats[k].shear_modulus for k in order]
    E = [mats[k].elastic_modulus for k in order]
    GJ = cc.concentric_torsional_rigidity(G, radii)
    out = [Pair("torsional rigidity GJ", tr.GJ, GJ, SOURCE_GJ, "check", "rigidity", target, TOL_REASON),
           Pair("bending rigidity EIxx (transformed section)", pr.EIxx, cc.concentric_bending_rigidity(E, radii),
                SOURCE_EI, "check", "rigidity", target, TOL_REASON),
           Pair("bending rigidity EIyy (transformed section)", pr.EIyy, cc.concentric_bending_rigidity(E, radii),
                SOURCE_EI, "check", "rigidity", target, TOL_REASON)]
    for i, k in enumerate(order):
        tau = cc.concentric_layer_shear_stress(1.0, G, radii, i, radii[i + 1])
        out.append(Pair(f"τmax per unit torque in {mats[k].name}", tr.peaks[k].value, tau, SOURCE_TAU, "check",
                        "per_cubic", target, TOL_REASON))
    return out

"""A composite section solved (compare/solve/composite_study.py) and set beside its hand formulas:
for bonded concentric circular layers the exact GJ = Σ Gᵢ Jᵢ, the layer stresses Gₖθr and the
transformed-section EI = Σ Eᵢ Iᵢ (classic/composite.py); for any other arrangement no closed form
(the pairs say so). Returns the :class:`~compare.pairs.analysis.Analysis` the later steps read, with
``extra['composite']`` holding the solution and the study."""
from __future__ import annotations

import math
import time

from classic import composite as cc
from fem.cut import cut_section
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
SOURCE_FLEXURE = ("bonded concentric circular layers, Saint-Venant flexure with G, E, ν per layer: closed form "
                  "derived by separation of variables (classic.composite.concentric_flexure_peak; one layer gives "
                  "Timoshenko & Goodier, Theory of Elasticity, 3rd ed., ch. 12, circular section); exact for equal "
                  "Poisson's ratios, and with unequal ones the same model as the FE (in-plane interface stresses left out)")
SOURCE_ELEMENTARY = ("transformed-section shear formula τ = V·ΣEᵢQᵢ/(EI·b) on the neutral axis through the "
                     "modulus-weighted centroid, Q and b cut from each region's exact outline (Gere, Mechanics of "
                     "Materials, 6th ed., Secs. 5.8 and 6.3)")


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
    return _torsion_bending_pairs(case, sol, target) + shear_pairs(case, sol, target)


def shear_pairs(case, sol, target: float) -> list[Pair]:
    """Transverse shear beside its hand values: the closed form of concentric layers (a check), and the
    transformed-section VΣEQ/(EI·b) on the neutral axis (a factor: the elementary mean against the FE peak)."""
    if sol.shear is None or case.loads.shear is None:
        return []
    mats = case.region_materials
    Vx, Vy = case.loads.shear
    V = math.hypot(Vx, Vy)
    if V == 0:
        return []
    peaks = sol.shear_peaks
    out = []
    lay = concentric_layers(case.section)
    if lay is not None:
        _c, radii, order = lay
        E = [mats[k].elastic_modulus for k in order]
        G = [mats[k].shear_modulus for k in order]
        nu = [mats[k].poisson for k in order]
        for i, k in enumerate(order):
            ex, _r, _th = cc.concentric_flexure_peak(V, E, G, nu, radii, i)
            out.append(Pair(f"transverse shear τmax in {mats[k].name}", peaks[k].value, ex,
                            SOURCE_FLEXURE, "check", "stress", target, TOL_REASON))
    pr = sol.props
    n = (Vx / V, Vy / V)
    EI_n = n[0] ** 2 * pr.EIyy + n[1] ** 2 * pr.EIxx + 2 * n[0] * n[1] * pr.EIxy
    prod = n[0] * n[1] * (pr.EIxx - pr.EIyy) + (n[0] ** 2 - n[1] ** 2) * pr.EIxy
    fe = max(p.value for p in peaks)
    if abs(prod) > 1e-6 * EI_n:
        out.append(not_applicable("transverse shear τmax over the transformed-section VΣEQ/(EI·b)", fe,
                                  "the shear force is not along a principal axis of the transformed section", "stress"))
        return out
    EQ, b = 0.0, 0.0
    for reg, m in zip(case.section.regions, mats):
        c = cut_section(reg.section, pr.centroid, n)
        EQ += m.elastic_modulus * c.first_moment
        b += c.chord
    el = cc.transformed_section_shear(V, abs(EQ), EI_n, b) if b > 0 else None
    if el is None:
        out.append(not_applicable("transverse shear τmax over the transformed-section VΣEQ/(EI·b)", fe,
                                  "the neutral axis does not cross the section", "stress"))
        return out
    out.append(Pair("transverse shear τmax over the transformed-section VΣEQ/(EI·b)", fe, el, SOURCE_ELEMENTARY,
                    "factor", "stress", note=f"ΣEQ = {abs(EQ):.4g} N·m, b = {b:.4g} m; the elementary value is the mean "
                    "across the cut, the FE value the largest anywhere: the ratio is the real stress distribution's effect"))
    return out


def _torsion_bending_pairs(case, sol, target: float) -> list[Pair]:
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

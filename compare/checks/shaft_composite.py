"""The beam properties of a layout's composite segments (compare/case/shaft_composite.py): each
composite section solved once (compare/solve/composite_study.py, to the case's accuracy target) and
turned into what the Timoshenko beam (fem/beam.py) and the torsion line (fem/torsion_line.py) take
per element. Numbers and records only.

- EI: the transformed (modulus-weighted) section about its modulus-weighted centroid, the smaller
  principal value EI₂ (both bending planes share one beam model; for a section of revolution
  EI₁ = EI₂). Gere, Mechanics of Materials, 6th ed., composite beams and the transformed-section
  method.
- GJ: the stress-function value, the lower end of the FE bracket (the warping function gives the
  upper end). The lower end is the conservative side for the twist and the angles between parts; the
  bracket's width is inside the study's estimate (compare/solve/composite_study.py widens the GJ
  estimate to at least the bracket), so either end is as accurate as the study says.
- κ·GA: the shear stiffness as κ·ΣGᵢAᵢ (the regions' shear moduli times their areas) with κ the
  energy shear coefficient of a solid round (classic.shear.energy_round, from the flexure stresses of
  Timoshenko & Goodier, Theory of Elasticity, 3rd ed., Sec. 120) at the shear-stiffness-weighted
  Poisson's ratio ν̄ = ΣGᵢAᵢνᵢ / ΣGᵢAᵢ. This is an approximation (common practice): the exact
  coefficient of bonded layers depends on the moduli's ratios; in a shaft with L/d above about 5 the
  shear deformation is a few per cent of the deflection, so an error of 10 % in κ moves the deflection
  by well under 1 %. Stated in the results (``shaft.composite_segments[i].shear_stiffness_basis``).
- mass per length ΣρᵢAᵢ, rotary inertia per length about a diameter (the smaller of Σρᵢ Ixx, Σρᵢ Iyy
  about the mass centre) and polar ΣρᵢJᵢ, all from the same mesh with the density per region.

For bonded concentric circular layers the FE EI and GJ stand beside the exact EI = ΣEᵢIᵢ and
GJ = ΣGᵢJᵢ as pairs (compare/pairs/composite_step.py).
"""
from __future__ import annotations

from dataclasses import dataclass, field, replace
from types import SimpleNamespace

from classic.shear import energy_round
from fem.composite import weighted_properties

from ..pairs.composite_step import composite_pairs
from ..solve.composite_study import study_composite

SHEAR_BASIS = ("κ·ΣGᵢAᵢ, κ the energy shear coefficient of a solid round (Timoshenko & Goodier, Theory of "
               "Elasticity, 3rd ed., Sec. 120) at the shear-stiffness-weighted Poisson's ratio: an approximation "
               "for bonded regions (common practice)")
GJ_BASIS = ("stress-function GJ, the lower end of the FE bracket (conservative for the twist); the study's GJ "
            "estimate covers the bracket's width")
EI_BASIS = "transformed section about the modulus-weighted centroid, the smaller principal EI (Gere, 6th ed.)"


@dataclass
class SegmentProps:
    """What the beam takes from one composite segment, SI."""

    index: int  # the segment's index in Shaft.segments
    EI: float
    kGA: float
    GJ: float
    kappa: float
    rhoA: float | None  # [kg/m]; None when a region has no density
    rhoI: float | None  # [kg·m] about a diameter
    rhoJ: float | None  # [kg·m] polar
    GA: float
    study: object
    pairs: list = field(default_factory=list)
    record: dict = field(default_factory=dict)


def composite_segments(case, fineness: float | None = None) -> dict[int, SegmentProps]:
    """{segment index: SegmentProps} of every composite segment of ``case.shaft`` (solved once per
    section; segments sharing one section share one solve)."""
    shaft = case.shaft
    out, solved = {}, {}
    for i, seg in enumerate(shaft.segments if shaft is not None else []):
        if seg.section is None:
            continue
        key = id(seg.section)
        if key not in solved:
            sub = SimpleNamespace(section=seg.section, region_materials=list(seg.materials), analysis=case.analysis,
                                  loads=SimpleNamespace(shear=None))  # the beam takes EI, GJ: no shear solve
            solved[key] = (sub, study_composite(sub, fineness))
        sub, st = solved[key]
        out[i] = segment_props(i, seg, sub, st)
    return out


def segment_props(i: int, seg, sub, st) -> SegmentProps:
    sol = st.solutions[-1]
    mats = sub.region_materials
    pr, tr = sol.props, sol.torsion
    EI1, EI2, _ang = pr.principal
    GA_k = [m.shear_modulus * a for m, a in zip(mats, pr.region_areas)]
    GA = sum(GA_k)
    nu_bar = sum(g * m.poisson for g, m in zip(GA_k, mats)) / GA
    kappa = energy_round(nu_bar)
    rhoA = rhoI = rhoJ = None
    if all(m.density is not None for m in mats):
        mp = weighted_properties(sol.mesh, [m.density for m in mats])  # mass per length and its moments
        rhoA, rhoI, rhoJ = mp.EA, min(mp.EIxx, mp.EIyy), mp.EIxx + mp.EIyy
    pairs = [replace(p, quantity=f"segment {i}: {p.quantity}") for p in composite_pairs(sub, sol, st.target)
             if "τmax" not in p.quantity]
    achieved = max((v["gci"] for v in st.estimates.values() if v["gci"] is not None), default=None)
    rec = {"segment": i, "from": seg.start, "to": seg.end, "diameter": seg.diameter,
           "regions": [m.name for m in mats], "EI": EI2, "EIxx": pr.EIxx, "EIyy": pr.EIyy, "EI_basis": EI_BASIS,
           "GJ": tr.GJ, "GJ_warping": tr.GJ_warping, "GJ_basis": GJ_BASIS, "GA": GA, "kappa": kappa,
           "poisson_weighted": nu_bar, "kGA": kappa * GA, "shear_stiffness_basis": SHEAR_BASIS,
           "mass_per_length": rhoA, "rotary_inertia_per_length": rhoI, "polar_inertia_per_length": rhoJ,
           "accuracy": {"target": st.target, "achieved": achieved, "limited_by": st.limited,
                        "met": achieved is not None and achieved <= st.target and st.limited is None,
                        "meshes": [s.dofs for s in st.solutions]},
           "compare": [p.to_dict() for p in pairs]}
    return SegmentProps(i, EI2, kappa * GA, tr.GJ, kappa, rhoA, rhoI, rhoJ, GA, st, pairs, rec)

"""A polymer shaft checked at its service conditions (numbers and records only): the static check on
the tensile strength at the service temperature and moisture state, the fatigue check with the
stress-life strength at the cycles the service requires and the Goodman line, the long-term twist
with the creep modulus at the service life; for a layout, the long-term deflections.

The data were read at the service conditions when the case was parsed (compare/case/polymer.py):
``case.material.polymer``. Results key ``polymer`` (docs/polymer.md).
"""
from __future__ import annotations

import math

import numpy as np

from classic import polymer as cp
from classic.fatigue import EDITION as SHIGLEY, shaft_von_mises_stresses

from ..pairs.analysis import TOL_PEAK
from ..pairs.pairs import Pair
from .combined import where_of

#: What the polymer check does not cover, whatever the data (said in every polymer record).
NOT_CHECKED = [
    "weld (knit) lines, fibre orientation and residual stresses of the moulding: the data are for test bars",
    "moisture uptake beyond the states the data give (swelling, the change of size at fits)",
    "hysteretic heating under cyclic load (the tests' frequency against the service speed)",
    "creep rupture and stress relaxation at press fits (the creep modulus gives deformation only)",
    "creep at a stress level other than the data's (the isochronous modulus falls as the stress rises)",
    "temperature peaks and cycles above the service temperature; chemical attack; ultraviolet ageing",
    "wear at the bearing seats and the gear bore",
    "3-D features (keyseat ends, hub and press-fit edges, cross holes): the FE section is 2-D and chart factors "
    "are not applied to a polymer (a shoulder or groove in [shaft] is checked on its fillet)",
]
CAUTION = ("Polymer data depend on the grade, processing, weld lines and orientation in the moulding: the "
           "supplier's data for the grade and the part's own tests decide.")
STATIC_SOURCE = ("the largest von Mises stress over the cycle against the tensile strength at the service "
                 "temperature and moisture state (common practice for a polymer without a yield point; from memory)")


def _steady_torque(case) -> float:
    ld = case.loads
    return float(ld.mean.get("torque", ld.torque))


def polymer_check(a, fld, fs, worst) -> dict | None:
    """The ``polymer`` record of a section case whose material has polymer data, else None.
    ``fs``: the fatigue stresses (von Mises amplitude and mean at every point); ``worst``: the worst
    von Mises over the cycle at every point."""
    p = a.case.material.polymer
    if p is None:
        return None
    sv = p.service
    usable = ~fld.excluded
    nd = a.case.analysis.design_factor
    out: dict = {
        "conditions": {"temperature": sv.temperature, "moisture": sv.moisture, "life": sv.life,
                       "cycles": sv.cycles, "cycles_source": sv.cycles_source, "speed": sv.speed,
                       "cycles_per_revolution": sv.cycles_per_revolution},
        "data": {"source": p.data.source, "illustrative": p.data.illustrative, "note": p.data.note},
        "strengths": {"tensile_strength": p.tensile_strength, "yield": p.yield_strength,
                      "elastic_modulus": p.elastic_modulus, "shear_modulus": p.shear_modulus,
                      "poisson": p.poisson, "fatigue_strength": p.fatigue_strength,
                      "source": (f"{p.data.where}.{sv.moisture}, linear in temperature between the data points "
                                 "(nothing read outside them)")},
        "factors": {},
        "at": {}, "where": {},
        "design_factor": nd,
        "not_checked": list(NOT_CHECKED),
        "notes": list(p.notes),
        "caution": CAUTION,
    }
    # static: largest von Mises over the cycle against the tensile strength at the service conditions
    w = worst["von_mises"]
    i = w.best(usable)
    vm = float(w.value[i])
    out["von_mises_max"] = vm
    n_st = p.tensile_strength / vm if vm > 0 else math.inf
    out["factors"]["static_tensile"] = n_st
    out["at"]["static_tensile"] = [float(fld.xy[0, i]), float(fld.xy[1, i])]
    out["where"]["static_tensile"] = where_of(a, fld, i)
    out["sources"] = {"static_tensile": STATIC_SOURCE}
    # fatigue: Goodman line from the S-N strength at the required cycles to the tensile strength
    if p.fatigue_strength is not None:
        front = fs.pareto(usable)
        sa, sm = fs.sa[front], fs.sm[front]
        inv = sa / p.fatigue_strength + sm / p.tensile_strength
        with np.errstate(divide="ignore"):
            n = np.where(inv > 0, 1.0 / np.where(inv > 0, inv, 1.0), np.inf)
        k = int(np.argmin(n))
        j = int(front[k])
        nf = float(n[k])
        # the same factor through the published form, at the governing point (one formula, coded once in classic/)
        nf_check = cp.goodman_factor_polymer(float(fs.sa[j]), float(fs.sm[j]), p.fatigue_strength, p.tensile_strength)
        out["factors"]["fatigue_goodman"] = nf_check
        out["at"]["fatigue_goodman"] = [float(fld.xy[0, j]), float(fld.xy[1, j])]
        out["where"]["fatigue_goodman"] = where_of(a, fld, j)
        out["fatigue"] = {"S_f": p.fatigue_strength, "cycles": sv.cycles, "sigma_a_vm": float(fs.sa[j]),
                          "sigma_m_vm": float(fs.sm[j]), "fits": p.sn_fits, "source": p.fatigue_source,
                          "mean_stress_correction": cp.GOODMAN_SOURCE,
                          "notes": ["σa', σm': von Mises of the alternating and mean stress states at every read point, "
                                    "alternating sources of unknown phase added (conservative), as in the steel path; an "
                                    "axial alternating stress is divided by the steel load factor 0.85 there too "
                                    "(conservative for the polymer: it raises σa')",
                                    "the stress-life data are taken as fully reversed (stress_ratio = -1) at a test "
                                    "frequency that did not heat the specimen; check the data's frequency against the "
                                    "service speed"],
                          "vectorised_and_formula_agree": bool(math.isclose(nf, nf_check, rel_tol=1e-12)
                                                               or nf == nf_check)}
        out["sources"]["fatigue_goodman"] = cp.GOODMAN_SOURCE
        hand = _hand_fatigue_pair(a, cyc_loads(a), p, nf_check)
        if hand is not None:
            a.pairs.append(hand)
    elif bool(np.any(fs.sa[usable] > 0)):
        out["notes"].append("the loads alternate but no stress-life data are given for this state: fatigue not checked")
    # long-term twist: the steady torque for the whole service life, creep modulus at that duration
    T = _steady_torque(a.case)
    J = a.torsion.J
    tw = {"torque": T, "J": J, "short_term": T / (p.shear_modulus * J),
          "shear_modulus": p.shear_modulus,
          "assumption": "G = E/(2(1 + ν)) with ν held at the given value under creep (ν of a polymer rises "
                        "somewhat with time: the creep twist is then slightly underestimated)"}
    if p.creep_modulus is not None:
        Gc = p.creep_shear_modulus
        tw.update(long_term=T / (Gc * J), creep_modulus=p.creep_modulus, creep_shear_modulus=Gc,
                  duration=sv.life, curves=p.creep_curves, source=p.creep_source,
                  formula="θ = T/(G_c·J), G_c = E_c/(2(1 + ν)), J from the FE (stress function)")
    out["twist"] = tw
    if p.creep_modulus is not None and T != 0:
        a.pairs.extend(twist_pairs(a.pairs, T, p.creep_shear_modulus, J))
    if nd is not None:
        out["meets_design_factor"] = {k: bool(v >= nd) for k, v in out["factors"].items()}
    return out


def cyc_loads(a) -> dict:
    """Ma, Mm, Ta, Tm (magnitudes of the moment vectors) and whether axial or shear loads are present."""
    ld = a.case.loads
    M = ld.mean.get("bending", ld.bending)
    if ld.rotating:
        Ma, Mm = math.hypot(*ld.bending), 0.0
    else:
        Ma, Mm = math.hypot(*ld.alternating.get("bending", (0.0, 0.0))), math.hypot(*M)
    Ta, Tm = abs(ld.alternating.get("torque", 0.0)), abs(ld.mean.get("torque", ld.torque))
    other = bool(ld.axial or ld.mean.get("axial") or ld.alternating.get("axial") or
                 any(v for v in (ld.shear or ())) or any(v for v in ld.mean.get("shear", ()) or ()) or
                 any(v for v in ld.alternating.get("shear", ()) or ()))
    return {"Ma": Ma, "Mm": Mm, "Ta": Ta, "Tm": Tm, "other": other}


def _hand_fatigue_pair(a, L: dict, p, n_fe: float):
    """The Goodman factor on the nominal stresses of a solid round shaft (Kf = Kfs = 1) beside the FE one:
    a check on a plain round bar under bending and torsion alone (the nominal stresses are the exact
    surface stresses there), a factor (the section's concentration) on any other section with a diameter."""
    s = a.case.section
    if not s.nominal or getattr(s, "bore", None):
        return None
    sa, sm = shaft_von_mises_stresses(s.nominal, 1.0, 1.0, L["Ma"], L["Mm"], L["Ta"], L["Tm"])
    n_hand = cp.goodman_factor_polymer(float(sa), float(sm), p.fatigue_strength, p.tensile_strength)
    if not math.isfinite(n_hand):
        return None
    src = (f"{SHIGLEY}, eqs. 7-5, 7-6 (nominal σa', σm' of a solid round shaft, Kf = Kfs = 1) on the Goodman line: "
           f"{cp.GOODMAN_SOURCE}")
    if s.kind == "round" and not L["other"]:
        return Pair("polymer fatigue factor (Goodman on the S–N strength)", n_fe, n_hand, src, "check", "dimensionless",
                    TOL_PEAK[0], "the factor follows the boundary peak stress: " + TOL_PEAK[1])
    return Pair("polymer fatigue factor (Goodman on the S–N strength)", n_fe, n_hand, src, "factor", "dimensionless",
                note="against the nominal stresses of the section's diameter without a concentration factor: the ratio "
                     "is the section's effect on the factor (and the axial or shear loads the hand form leaves out)")


def twist_pairs(pairs: list, T: float, Gc: float, J_fe: float) -> list:
    """The long-term twist beside its hand value for every J the section has a hand formula for:
    θ = T/(G_c·J) with the FE J and with that J (the pair's kind, tolerance and reason are the J pair's:
    the twist differs only through J)."""
    out = []
    for q in list(pairs):
        # the torsion-constant pairs: "torsion constant J" (a closed form) and "J against ..." (stand-ins)
        is_j = q.quantity.startswith(("J ", "torsion constant J"))
        if q.dimension != "second_moment" or not is_j or not q.classic or q.fe is None:
            continue
        out.append(Pair(f"long-term twist θ = T/(G_c·J) (creep modulus), {q.quantity}", T / (Gc * q.fe),
                        T / (Gc * q.classic), f"{q.source}; {cp.ISOCHRONOUS_SOURCE}", kind=q.kind, dimension="twist",
                        tolerance=q.tolerance, reason=q.reason,
                        note="the creep shear modulus G_c = E_c/(2(1 + ν)) at the service life and temperature"))
    return out


def polymer_at_feature(a, fs: dict, vm, place, keep_min: bool, plain_key: str, rec: dict, gov):
    """A polymer station on a shoulder or groove: the polymer checks on the fillet's local stresses
    (``fs``: ``sa``, ``sm`` (n,), ``theta`` (K,); ``vm`` (n, K) the von Mises stress round the shaft;
    ``place(i, theta) -> (at, where)``) replace the plain section's in ``a.extra['polymer']`` (kept
    beside them under ``plain_key``; with ``keep_min`` each keeps the smaller). Returns the governing
    record with the polymer factors among the candidates."""
    pol = a.extra.get("polymer")
    p = a.case.material.polymer
    if pol is None or p is None:
        return gov
    vm = np.asarray(vm, float)
    k = np.unravel_index(int(np.argmax(vm)), vm.shape)
    new = {"static_tensile": (p.tensile_strength / float(vm[k]) if vm[k] > 0 else math.inf,
                              place(int(k[0]), float(fs["theta"][k[1]])))}
    if p.fatigue_strength is not None:
        n = [cp.goodman_factor_polymer(float(sa), float(sm), p.fatigue_strength, p.tensile_strength)
             for sa, sm in zip(fs["sa"], fs["sm"])]
        i = int(np.argmin(n))
        new["fatigue_goodman"] = (float(n[i]), place(i, float(fs["theta"][int(np.argmax(vm[i]))])))
    for crit, (n, (at, where)) in new.items():
        if crit not in pol["factors"]:
            continue
        pol.setdefault(plain_key, {})[crit] = {"factor": pol["factors"][crit], "at": pol["at"][crit],
                                               "where": pol["where"][crit]}
        if keep_min and pol["factors"][crit] <= n:
            continue
        pol["factors"][crit], pol["at"][crit], pol["where"][crit] = n, at, where
    pol["fe_local"] = rec
    pol["notes"].append("this station sits on a shoulder or groove: the polymer factors are those of the fillet's local "
                        "stresses (fe_local; the plain section's kept beside them); fatigue.sigma_a_vm and sigma_m_vm "
                        "are the plain section's")
    nd = a.case.analysis.design_factor
    if nd is not None:
        pol["meets_design_factor"] = {c: bool(v >= nd) for c, v in pol["factors"].items()}
    return governs(pol, gov, nd)


def governs(polymer: dict, gov: dict | None, nd) -> dict | None:
    """The governing record with the polymer factors among the candidates (the smallest wins)."""
    best = gov
    for crit, n in polymer["factors"].items():
        if n is None or not math.isfinite(n):
            continue
        if best is None or best.get("factor") is None or n < best["factor"]:
            best = {"factor": n, "criterion": f"polymer_{crit}", "path": "FE", "at": polymer["at"][crit],
                    "where": polymer["where"][crit], "design_factor": nd,
                    "meets_design_factor": None if nd is None else bool(n >= nd)}
    return best


def long_term_layout(a) -> dict | None:
    """A layout's deflections and slopes after the service life (results ``polymer_layout``): the beam
    was solved with the short-term modulus at the service temperature; under loads held for the whole
    life the bending and shear deflections grow as E/E_c (G/G_c is the same ratio at a fixed ν), each
    against the same limit as the short-term value. None without polymer data or creep data."""
    p = a.case.material.polymer
    shaft = (a.extra.get("shaft") or {}).get("layout")
    if p is None or shaft is None:
        return None
    out: dict = {"duration": p.service.life, "temperature": p.service.temperature, "moisture": p.service.moisture}
    if p.creep_modulus is None:
        out["skipped"] = "no creep data in the service moisture state: the long-term deflections are not computed"
        return out
    r = p.elastic_modulus / p.creep_modulus
    rotating = bool(a.case.shaft is not None and a.case.shaft.rotating)
    out.update(ratio_E_over_E_creep=r, elastic_modulus=p.elastic_modulus, creep_modulus=p.creep_modulus,
               source=p.creep_source,
               assumption=("the loads act for the whole service life with the whole shaft at the service temperature; "
                           "a linear beam, so every deflection and slope scales by E/E_c (pseudo-elastic creep modulus)" +
                           ("; on a rotating shaft each fibre's bending stress reverses every turn, which creeps less "
                            "than a steady stress: the scaled values are taken as an upper bound (from memory)"
                            if rotating else "")))
    if shaft.get("composite_segments"):  # their regions name their own moduli; creep of those is not known here
        out["composite_segments_note"] = ("the composite segments are scaled by the material's E/E_c too, which is not "
                                          "theirs (their regions name their own moduli and no creep data are read for "
                                          "them): where they bend, the long-term values are not a checked result")
    md = shaft["diagrams"]["max_deflection"]
    out["max_deflection"] = {"value": md["value"] * r, "at": md["at"], "short_term": md["value"]}
    out["slopes"] = [{"at": s["at"], "name": s["name"], "kind": s["kind"], "slope": s["slope"] * r,
                      "short_term": s["slope"], "limit": s["limit"], "ok": bool(s["slope"] * r <= s["limit"])}
                     for s in shaft.get("slopes", [])]
    out["gear_deflections"] = [{"at": g["at"], "name": g["name"], "deflection": g["deflection"] * r,
                                "short_term": g["deflection"], "limit": g["limit"],
                                "ok": bool(g["deflection"] * r <= g["limit"])}
                               for g in shaft.get("gear_deflections", [])]
    return out


def polymer_findings(a) -> list[dict]:
    """Warnings of a polymer case: invented (illustrative) data cannot carry a verdict on a real part."""
    p = a.case.material.polymer
    if p is None or not p.data.illustrative:
        return []
    return [{"code": "polymer_illustrative_data", "source": p.data.source, "field": f"{p.data.where}.illustrative"}]


def row_factors(a, fld, fs, worst, p) -> dict:
    """The polymer factors of a material-table row ``p`` (PolymerAtService) on the case's stress field:
    ``polymer_static_tensile`` and, with stress-life data, ``polymer_fatigue_goodman``."""
    usable = ~fld.excluded
    w = worst["von_mises"]
    vm = float(w.value[w.best(usable)])
    out = {"polymer_static_tensile": p.tensile_strength / vm if vm > 0 else math.inf}
    if p.fatigue_strength is not None:
        front = fs.pareto(usable)
        n = [cp.goodman_factor_polymer(float(fs.sa[j]), float(fs.sm[j]), p.fatigue_strength, p.tensile_strength)
             for j in front]
        out["polymer_fatigue_goodman"] = float(min(n))
    return out

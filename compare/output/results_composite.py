"""results.json and the terminal summary of a composite section (compare/pairs/composite_step.py,
compare/checks/composite_checks.py)."""
from __future__ import annotations

from .._version import __version__
from ..solve.composite_study import ORDER
from .report import CAUTION, Fmt


def composite_results(a, warnings_out, schema_version: int) -> dict:
    case = a.case
    comp = a.extra["composite"]
    st, sol = comp["study"], comp["solution"]
    tr, pr = sol.torsion, sol.props
    T = case.loads.torque
    est = st.estimates
    achieved = max((v["gci"] for v in est.values() if v["gci"] is not None), default=None)
    met = achieved is not None and achieved <= st.target and st.limited is None
    EI1, EI2, ang = pr.principal
    out = {
        "schema_version": schema_version, "tool": {"name": "shaftcheck", "version": __version__},
        "case": {"title": case.title, "units": case.units.name if case.units else None,
                 "file": str(case.path) if case.path else None},
        "caution": CAUTION,
        "section": {"kind": "composite", "area": pr.area, "regions": len(case.region_materials),
                    "EA": pr.EA, "centroid_weighted": list(pr.centroid), "EIxx": pr.EIxx, "EIyy": pr.EIyy,
                    "EIxy": pr.EIxy, "EI1": EI1, "EI2": EI2, "principal_angle_deg": ang},
        "torsion": {"GJ": tr.GJ, "GJ_warping": tr.GJ_warping,
                    "GJ_bracket": [min(tr.GJ, tr.GJ_warping), max(tr.GJ, tr.GJ_warping)],
                    "torque": T, "twist_per_length": T / tr.GJ, "dofs": tr.dofs},
        "regions": a.extra["regions"],
        "compare": [p.to_dict() for p in a.pairs],
        "convergence": est,
        "accuracy": {"target": st.target, "achieved": achieved, "met": bool(met), "limited_by": st.limited,
                     "meshes": [s.dofs for s in st.solutions], "finenesses": [s.fineness for s in st.solutions],
                     "formal_orders": ORDER, "seconds": st.seconds,
                     "estimator": "three meshes refined by a constant ratio (GCI); GJ at least its bracket, each "
                                  "region's τmax widened by the parting of its two independent evaluations"},
        "mesh": {"dofs": tr.dofs, "elements": sol.mesh.info.get("elements"), "interfaces": int(len(sol.mesh.interfaces)),
                 "element": "6-node curved (isoparametric) triangle, quadratic; conforming across the interfaces"},
        "not_checked": a.extra.get("not_checked", []),
        "seconds": a.seconds,
    }
    if sol.shear is not None:
        sh = sol.shear
        out["shear"] = {"force": list(case.loads.shear), "centre": list(sh.centre), "centroid_weighted": list(sh.centroid),
                        "resultant_residual": sh.resultant_residual, "dofs": sh.dofs,
                        "method": SHEAR_METHOD}
    if "composite_fatigue" in a.extra:
        out["fatigue"] = a.extra["composite_fatigue"]
    if "governing" in a.extra:
        out["governing"] = dict(a.extra["governing"])
    out["warnings"] = warnings_out(a)
    if not met:
        out["warnings"].insert(0, {"code": "accuracy_not_met", "text": "ACCURACY TARGET NOT SHOWN: target "
                                   f"{100 * st.target:.3g} %, estimated error "
                                   f"{'unknown' if achieved is None else f'{100 * achieved:.3g} %'}"
                                   f"{f' ({st.limited})' if st.limited else ''}: the numbers carry that error at best.",
                                   "data": {"target": st.target, "achieved": achieved, "limited_by": st.limited}})
    if "governing" in out:
        why = [w["code"] for w in out["warnings"] if w["code"] in UNSUPPORTED]
        if out["governing"].get("verdict_supported") is False:  # said by a layout's station check
            why.append(out["governing"].get("not_a_verdict") or "not a verdict")
        out["governing"]["verdict_supported"] = not why
        if why:
            out["governing"]["not_supported_because"] = why
    out["exit_code"] = max(0 if met else 3, a.extra.get("exit_code") or 0)  # 4: a layout station without a verdict
    return out


#: Warnings after which the lowest factor is not a verdict the numbers support.
UNSUPPORTED = ("accuracy_not_met", "polymer_illustrative_data", "composite_fatigue_not_checked")
SHEAR_METHOD = ("Saint-Venant flexure with E, G, ν per region (fem/composite_shear.py): τ = G(∇Ψ − ν d*)·V/D* for forces "
                "through the shear centre; a force through the shaft axis adds its torque about the shear centre to the "
                "torsion field; exact for equal Poisson's ratios, the in-plane interface stresses of unequal ones left out")
CRITERION_WORDS = {"von_mises_bound": "von Mises bound, static", "fatigue_goodman": "fatigue, Goodman",
                   "fatigue_gerber": "fatigue, Gerber", "fatigue_asme_elliptic": "fatigue, ASME elliptic",
                   "fatigue_soderberg": "fatigue, Soderberg", "fatigue_yield_langer": "first-cycle yield, Langer",
                   "fatigue_polymer_goodman": "polymer fatigue, Goodman on the S–N strength"}


def criterion_words(c: str) -> str:
    return CRITERION_WORDS.get(c, c)


def composite_summary(res: dict, system) -> str:
    """The terminal block of a composite section."""
    f = Fmt(system)
    lines = [f"shaftcheck {res['tool']['version']} — {res['case']['title']}"]
    for w in res.get("warnings", []):
        lines.append(f"WARNING: {w['text']}")
    g = res.get("governing")
    if g is not None and g.get("verdict_supported", res["accuracy"]["met"]):
        lines.append(f"VERDICT: lowest n = {g['factor']:.3g} in {g['region']} ({criterion_words(g['criterion'])}, FE)")
    elif g is not None:
        why = ", ".join(w.replace("_", " ") for w in g.get("not_supported_because", ["accuracy not met"]))
        lines.append(f"VERDICT: NOT SHOWN ({why}); lowest n = {g['factor']:.3g} in {g['region']} "
                     f"({criterion_words(g['criterion'])})")
    else:
        lines.append("VERDICT: no factor of safety (no region gives a yield strength)")
    t = res["torsion"]
    lines.append(f"  torsional rigidity GJ {f.q(t['GJ'], 'rigidity')} (bracket up to {f.q(t['GJ_warping'], 'rigidity')}); "
                 f"EIxx {f.q(res['section']['EIxx'], 'rigidity')}, EIyy {f.q(res['section']['EIyy'], 'rigidity')}")
    if "shear" in res:
        sh = res["shear"]
        tiny = 1e-9 * res["section"]["area"] ** 0.5  # round-off shown as 0
        centre = [0.0 if abs(c) < tiny else c for c in sh["centre"]]
        lines.append(f"  transverse shear: V = ({f.q(sh['force'][0], 'force')}, {f.q(sh['force'][1], 'force')}) through the "
                     f"shaft axis; shear centre at {f.point(centre)} (Saint-Venant flexure, E, G, ν per region)")
    acc = res["accuracy"]
    if acc["achieved"] is not None:
        lines.append(f"  accuracy: within {100 * acc['achieved']:.2g} % (target {100 * acc['target']:.3g} %, three-mesh study)")
    lines.append("")
    shear = "shear" in res
    lines.append(f"  {'region':<28} {'τmax':>14} " + (f"{'τ shear':>14} " if shear else "") +
                 f"{'σmax':>14} {'vM bound':>14} {'yield':>12} {'n':>7} {'n fatigue':>10}")
    for r in res["regions"]:
        y = r["material"]["yield"]
        fat = r.get("fatigue") or {}
        nf = "—" if fat.get("factor") is None else format(fat["factor"], ".3g")
        lines.append(f"  {r['name'][:28]:<28} {f.q(r['tau_max'], 'stress', 4):>14} " +
                     (f"{f.q(r['tau_shear_max'], 'stress', 4):>14} " if shear else "") +
                     f"{f.q(r['sigma_max'], 'stress', 4):>14} "
                     f"{f.q(r['von_mises_bound'], 'stress', 4):>14} {f.q(y, 'stress', 4) if y else '—':>12} "
                     f"{'—' if r['factor'] is None else format(r['factor'], '.3g'):>7} {nf:>10}")
    for r in res["regions"]:
        fat = r.get("fatigue") or {}
        if "skipped" in fat:
            lines.append(f"  fatigue of {r['name']}: not checked ({fat['skipped']})")
        elif fat.get("criterion"):
            c = fat["criteria"][fat["criterion"]]
            strength = (f"Se {f.q(fat['Se'], 'stress', 4)}" if fat["kind"] == "steel" else
                        f"S_f {f.q(fat['S_f'], 'stress', 4)} at {fat['cycles']:.3g} cycles")
            lines.append(f"  fatigue of {r['name']}: n = {fat['factor']:.3g} ({fat['criterion'].replace('_', ' ')}; {strength}; "
                         f"σa' {f.q(c['sigma_a_vm'], 'stress', 4)}, σm' {f.q(c['sigma_m_vm'], 'stress', 4)} on the {c['place']})")
    pairs = [p for p in res["compare"] if p["kind"] != "not applicable"]
    if pairs:
        lines.append("")
        lines.append("  FE beside the hand formulas (check: an exact formula; factor: an elementary value):")
        for p in pairs:
            lines.append(f"    {p['quantity']}: FE/{'exact' if p['kind'] == 'check' else 'hand'} {p['ratio']:.6f} ({p['kind']})")
    lines.append("")
    lines.append("Not checked: " + "; ".join(res["not_checked"]) + ".")
    return "\n".join(lines)

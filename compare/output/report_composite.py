"""The design report of a composite section: ``report.html`` (self-contained, printable),
``results.csv`` and ``figures/`` (the regions with their material boundaries, and the torsional shear
stress over them), in the project's figure style (compare/output/figures.py)."""
from __future__ import annotations

import csv
import io

import numpy as np

from ..case.case import read_input_file
from ..case.units import from_si
from .report import CAUTION, Fmt
from .results_composite import criterion_words


def composite_report_files(a, res: dict, date: str | None = None) -> dict[str, str | bytes]:
    """``{relative name: text or bytes}`` of a composite section's report."""
    figs = composite_figures(a, res)  # matplotlib is loaded here, only when a report is drawn
    case_text = read_input_file(a.case.path, "case") if a.case.path is not None else None
    out: dict[str, str | bytes] = {"report.html": _html(res, a.case.units, figs, case_text, date),
                                   "results.csv": _csv(res, a.case.units)}
    for fg in figs:
        out[f"figures/{fg.name}.svg"] = fg.svg
        out[f"figures/{fg.name}.png"] = fg.png
    return out


def _region_lines(sol):
    """The material boundaries as curved polylines: every boundary and interface facet, drawn as the
    quadratic through its two vertices and its mid-node (the curved elements' own edge)."""
    from skfem import Basis, ElementTriP2  # noqa: PLC0415  lazy import of a slow dependency (only when drawn)

    m = sol.mesh.mesh
    b = Basis(m, ElementTriP2())
    facets = np.concatenate([m.boundary_facets(), sol.mesh.interfaces])
    s = np.linspace(0.0, 1.0, 7)
    w = np.vstack([(1 - s) * (1 - 2 * s), 4 * s * (1 - s), s * (2 * s - 1)])
    lines = []
    for f in facets:
        v0, v1 = m.facets[:, f]
        mid = b.facet_dofs[0, f]
        pts = np.column_stack([m.p[:, v0], b.doflocs[:, mid], m.p[:, v1]])
        lines.append(pts @ w)
    return lines


def composite_figures(a, res: dict) -> list:
    import matplotlib  # noqa: PLC0415  lazy import of a slow dependency: matplotlib, only when a report is drawn
    import matplotlib.pyplot as plt  # noqa: PLC0415  lazy import of a slow dependency (matplotlib, scikit-fem), only when drawn
    from matplotlib.tri import Triangulation  # noqa: PLC0415  lazy import of a slow dependency (matplotlib, scikit-fem), only when drawn
    from fem.export import centroid_values  # noqa: PLC0415  lazy import: loads scikit-fem, only when a report is drawn

    from .figures import CMAP, INK, STYLE, Figure  # noqa: PLC0415  lazy import of a slow dependency (matplotlib)

    f = Fmt(a.case.units)
    sol = a.extra["composite"]["solution"]
    m = sol.mesh.mesh
    k = from_si(1.0, "length", f.s)
    tri = Triangulation(m.p[0] * k, m.p[1] * k, m.t[:3].T)
    lines = _region_lines(sol)
    names = [r["name"] for r in res["regions"]]
    out = []
    with matplotlib.rc_context(STYLE):
        # --- the regions, shaded by material (greys), with their boundaries
        fig, ax = plt.subplots(figsize=(6.0, 4.8))
        n = len(names)
        shades = np.linspace(0.85, 0.35, max(n, 2))[:n]
        ax.tripcolor(tri, facecolors=shades[sol.mesh.region_of], cmap="gray", vmin=0.0, vmax=1.0,
                     edgecolors="none")
        for ln in lines:
            ax.plot(ln[0] * k, ln[1] * k, color=INK, lw=0.7)
        from scipy.spatial import cKDTree  # noqa: PLC0415  lazy import of scipy.spatial, only when a report is drawn

        edge_pts = cKDTree(np.hstack(lines).T)
        centres = m.p[:, m.t[:3]].mean(axis=1)  # (2, elements)
        room = edge_pts.query(centres.T)[0]  # how far each element is from every material boundary
        for r_ in range(n):
            sel = np.flatnonzero(sol.mesh.region_of == r_)
            cx, cy = centres[:, sel[int(np.argmax(room[sel]))]] * k  # the region's most open spot
            ax.annotate(f"{r_ + 1}", (cx, cy), ha="center", va="center", fontsize=8,
                        bbox={"boxstyle": "circle,pad=0.25", "fc": "white", "ec": INK, "lw": 0.6})
        ax.set_aspect("equal")
        ax.set_xlabel(f"x [{f.s.label('length')}]")
        ax.set_ylabel(f"y [{f.s.label('length')}]")
        ax.set_title("regions (numbered as in the table) and their material boundaries")
        out.append(Figure("composite_regions", "The section's bonded regions and their material boundaries", fig))
        # --- torsional shear stress under the case's torque (stress function, per element)
        T = abs(res["torsion"]["torque"]) or 1.0
        _, g, _ = centroid_values(m, sol.torsion.phi)  # one value per element: at its centroid
        tau = np.hypot(g[0], g[1]) / sol.torsion.GJ * T * from_si(1.0, "stress", f.s)
        fig, ax = plt.subplots(figsize=(6.0, 4.8))
        pc = ax.tripcolor(tri, facecolors=tau, cmap=CMAP, edgecolors="none")
        for ln in lines:
            ax.plot(ln[0] * k, ln[1] * k, color="white", lw=0.9)
            ax.plot(ln[0] * k, ln[1] * k, color=INK, lw=0.4)
        per = "" if res["torsion"]["torque"] else " per unit torque"
        fig.colorbar(pc, ax=ax, label=f"torsional shear stress |τ| [{f.s.label('stress')}]{per}")
        ax.set_aspect("equal")
        ax.set_xlabel(f"x [{f.s.label('length')}]")
        ax.set_ylabel(f"y [{f.s.label('length')}]")
        ax.set_title("torsional shear stress: it jumps at each interface with the shear modulus")
        out.append(Figure("composite_torsion", "Torsional shear stress over the regions (element values)", fig))
    return out


def _csv(res: dict, system) -> str:
    f = Fmt(system)
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(["group", "quantity", "value", "unit", "hand_value", "ratio", "source", "estimated_error", "results_json_key"])
    conv = res.get("convergence", {})
    rig = f.s.label("rigidity")
    w.writerow(["section", "torsional rigidity GJ", from_si(res["torsion"]["GJ"], "rigidity", f.s), rig,
                *_pair(res, "torsional rigidity GJ", f), (conv.get("GJ") or {}).get("gci"), "torsion.GJ"])
    for key, label in (("EIxx", "bending rigidity EIxx"), ("EIyy", "bending rigidity EIyy")):
        w.writerow(["section", label, from_si(res["section"][key], "rigidity", f.s), rig,
                    *_pair(res, f"{label} (transformed section)", f), (conv.get(key) or {}).get("gci"), f"section.{key}"])
    stress = f.s.label("stress")
    for i, r in enumerate(res["regions"]):
        g = f"region {i + 1}: {r['name']}"
        w.writerow([g, "τmax", from_si(r["tau_max"], "stress", f.s), stress, "", "", "", (conv.get(f"tau_max[{i}]") or {}).get("gci"),
                    f"regions[{i}].tau_max"])
        w.writerow([g, "σmax", from_si(r["sigma_max"], "stress", f.s), stress, "", "", "", "", f"regions[{i}].sigma_max"])
        w.writerow([g, "von Mises bound", from_si(r["von_mises_bound"], "stress", f.s), stress, "", "", "", "",
                    f"regions[{i}].von_mises_bound"])
        if r["factor"] is not None:
            w.writerow([g, "n (von Mises bound against the region's yield)", r["factor"], "", "", "", "", "",
                        f"regions[{i}].factor"])
        if "tau_shear_max" in r:
            w.writerow([g, "transverse shear τmax", from_si(r["tau_shear_max"], "stress", f.s), stress, "", "", "",
                        (conv.get(f"tau_shear_max[{i}]") or {}).get("gci"), f"regions[{i}].tau_shear_max"])
        fat = r.get("fatigue") or {}
        if fat.get("factor") is not None:
            c = fat["criteria"][fat["criterion"]]
            w.writerow([g, f"n fatigue ({fat['criterion']})", fat["factor"], "", "", "", c["source"], "",
                        f"regions[{i}].fatigue.factor"])
    for p in res.get("compare", []):
        if p["quantity"].startswith("transverse shear") and p["classic"] is not None:
            w.writerow(["section", p["quantity"], from_si(p["fe"], "stress", f.s), stress, from_si(p["classic"], "stress", f.s),
                        p["ratio"], p["source"], "", "compare"])
    return buf.getvalue()


def _pair(res: dict, quantity: str, f: Fmt):
    p = next((p for p in res.get("compare", []) if p["quantity"] == quantity), None)
    if p is None or p["classic"] is None:
        return ["", "", ""]
    return [from_si(p["classic"], "rigidity", f.s), p["ratio"], p["source"]]


def _html(res: dict, system, figs: list, case_text: str | None, date: str | None) -> str:
    from .report_html import CSS, _img, _table, e  # noqa: PLC0415  lazy import of a slow dependency: report_html reaches matplotlib through .figures

    f = Fmt(system)
    g = res.get("governing")
    acc = res["accuracy"]
    verdict = ("no factor of safety (no region gives a yield strength or fatigue data)" if g is None else
               f"lowest factor of safety n = {g['factor']:.3g} in {g['region']} ({criterion_words(g['criterion'])})")
    if g is not None and not g.get("verdict_supported", acc["met"]):
        verdict = ("NOT SHOWN (" + ", ".join(w.replace("_", " ") for w in g.get("not_supported_because", [])) +
                   "): read the warnings. " + verdict)
    elif not acc["met"]:
        verdict = "NOT SHOWN: the accuracy target was not reached. " + verdict
    rows = [(i + 1, r["name"], f.q(r["material"]["elastic_modulus"], "stress", 4), f.q(r["material"]["shear_modulus"], "stress", 4),
             f"{r['material']['poisson']:.3g}", f.q(r["tau_max"], "stress", 4), f.q(r["sigma_max"], "stress", 4),
             f.q(r["von_mises_bound"], "stress", 4), f.q(r["material"]["yield"], "stress", 4) if r["material"]["yield"] else "—",
             "—" if r["factor"] is None else f"{r['factor']:.3g}",
             "—" if (r.get("fatigue") or {}).get("factor") is None else f"{r['fatigue']['factor']:.3g}")
            for i, r in enumerate(res["regions"])]
    fat_rows = []
    for i, r in enumerate(res["regions"]):
        fat = r.get("fatigue") or {}
        if "skipped" in fat:
            fat_rows.append((i + 1, r["name"], "—", "—", "—", "—", "not checked: " + fat["skipped"]))
        elif fat.get("criterion"):
            c = fat["criteria"][fat["criterion"]]
            strength = (f"Se = {f.q(fat['Se'], 'stress', 4)} ({fat['Se_source']})" if fat["kind"] == "steel" else
                        f"S_f = {f.q(fat['S_f'], 'stress', 4)} at {fat['cycles']:.3g} cycles ({fat['S_f_source']}); "
                        f"Sut = {f.q(fat['tensile_strength'], 'stress', 4)}")
            fat_rows.append((i + 1, r["name"], fat["criterion"].replace("_", " "), f"{fat['factor']:.3g}",
                             f.q(c["sigma_a_vm"], "stress", 4), f.q(c["sigma_m_vm"], "stress", 4),
                             f"on the {c['place']}; {strength}; {c['source']}"))
    pairs = [(p["quantity"], f.q(p["fe"], p["dimension"]) if p["dimension"] != "per_cubic" else f"{p['fe']:.6g}",
              "—" if p["classic"] is None else (f.q(p["classic"], p["dimension"]) if p["dimension"] != "per_cubic" else f"{p['classic']:.6g}"),
              "—" if p["ratio"] is None else f"{p['ratio']:.6f}", p["source"] or p.get("note", ""))
             for p in res.get("compare", [])]
    conv = [(k, "—" if v.get("gci") is None else f"{100 * v['gci']:.2g} %", v.get("estimate_kind", ""), v.get("status", ""))
            for k, v in res.get("convergence", {}).items()]
    warn = "".join(f'<div class="warn">{e(w["text"])}</div>' for w in res.get("warnings", []))
    t = res["torsion"]
    achieved = "unknown" if acc["achieved"] is None else f"{100 * acc['achieved']:.2g} %"
    body = [
        f"<h1>{e(res['case']['title'])}</h1>",
        f'<section class="first" id="verdict"><h2>Governing result</h2>{warn}<p class="verdict">{e(verdict)}</p>'
        f"<p>Torsional rigidity GJ {e(f.q(t['GJ'], 'rigidity'))} (stress function, a lower bound; the warping "
        f"function gives {e(f.q(t['GJ_warping'], 'rigidity'))}, an upper bound); twist {e(f.q(t['twist_per_length'], 'twist'))} "
        f"under {e(f.q(t['torque'], 'moment'))}. Accuracy: estimated error "
        f"{achieved} against the target "
        f"{100 * acc['target']:.3g} %.</p></section>",
        '<section id="regions"><h2>Regions and their stresses</h2>' + (_img(figs[0]) if figs else "") +
        _table(("#", "region", "E", "G", "ν", "τmax", "σmax", "von Mises bound", "yield", "n", "n fatigue"), rows,
               numeric=(2, 3, 4, 5, 6, 7, 8, 9, 10)) +
        "<p class=\"small\">τmax and σmax are each region's peaks on its boundary and on both sides of its interfaces; "
        "they are combined as if at one point (an upper bound of the region's von Mises stress); with a shear force τmax "
        "adds the region's transverse-shear peak.</p></section>",
        ('<section id="fatigue"><h2>Fatigue, region by region</h2>' +
         _table(("#", "region", "governing criterion", "n", "σa'", "σm'", "where, strength and source"), fat_rows,
                numeric=(3, 4, 5)) +
         f"<p class=\"small\">{e((res.get('fatigue') or {}).get('method', ''))}.</p></section>") if fat_rows else "",
        '<section id="torsion"><h2>Torsional shear stress</h2>' + (_img(figs[1]) if len(figs) > 1 else "") + "</section>",
        '<section id="hand-vs-fe"><h2>Hand calculation against FE</h2>' +
        _table(("quantity", "FE", "hand", "FE/hand", "source"), pairs, numeric=(1, 2, 3)) + "</section>",
        '<section id="convergence"><h2>Convergence</h2>' + _table(("quantity", "estimated error", "estimate", "status"), conv) +
        f"<p class=\"small\">Meshes (unknowns): {e(', '.join(str(x) for x in acc['meshes']))}. {e(acc['estimator'])}.</p></section>",
        '<section id="inputs"><h2>Inputs</h2>' + (f"<pre>{e(case_text)}</pre>" if case_text else
                                                   "<p>The case was built in Python; see results.json.</p>") + "</section>",
        '<section id="cautions"><h2>Assumptions, what is not checked, cautions</h2><ul>' +
        "".join(f"<li>{e(x)}</li>" for x in res.get("not_checked", [])) +
        "<li>Bonded regions: displacements continuous across every interface; plane sections in bending; the "
        "regions' Poisson's ratios taken as close.</li>"
        "<li>A polymer's strength depends on grade, processing, weld lines, orientation in the moulding, temperature, "
        "moisture and time under load: the supplier's data for the grade and the part's own tests decide.</li>"
        f"<li>{e(CAUTION)}</li></ul></section>",
    ]
    stamp = f"<p class=\"small\">Written {e(date)}.</p>" if date else ""
    return ("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>" + e(res["case"]["title"]) +
            f"</title><style>{CSS}</style></head><body>" + "".join(body) + stamp + "</body></html>\n")

"""A shaft layout's stations on composite segments in the design report: each station's part of the
layout report (its regions with their material boundaries, the torsional shear stress over them, the
per-region peaks and factors, its pairs), the composite segments' beam properties beside their hand
values, and the rows of results.csv when the governing station is composite. Only text and figures;
the numbers come from results.json (compare/output/results_composite.py, results_shaft.py)."""
from __future__ import annotations

from ..case.units import from_si
from .report import Fmt

#: the polymer caution of the issue: said wherever a polymer region is reported
POLYMER_CAUTION = ("A polymer's stiffness and strength depend on the grade, processing, weld lines, orientation in the "
                   "moulding, temperature, moisture and time under load: the supplier's data for the grade and the "
                   "part's own tests decide.")


def is_composite(res: dict) -> bool:
    """Results of a composite section (a station on a composite segment, or the section on its own)."""
    return (res.get("section") or {}).get("kind") == "composite"


def composite_station_figures(sa, sres: dict, i: int) -> list:
    """The station's two composite figures, named ``station<i>_composite_regions`` and ``..._torsion``."""
    from .report_composite import composite_figures  # noqa: PLC0415  lazy import of a slow dependency: matplotlib, only when a report is drawn

    figs = composite_figures(sa, sres)
    for fg in figs:
        fg.name = f"station{i}_{fg.name}"
    return figs


def composite_station_html(st: dict, sres: dict, sfigs: list, f: Fmt) -> str:
    """A composite station's part of the layout report."""
    from .report_html import _img, _table, e  # noqa: PLC0415  lazy import of a slow dependency: report_html reaches matplotlib

    warn = "".join(f'<p class="warn">{e(w["text"])}</p>' for w in sres.get("warnings", []))
    gov = sres.get("governing") or {}
    if not gov:
        sentence = "No factor of safety: no region gives a yield strength."
    elif gov.get("verdict_supported") is False:
        sentence = (f"NOT A VERDICT ({gov.get('not_a_verdict')}): lowest static factor of safety n = {gov['factor']:.3g} "
                    f"in {gov['region']} (von Mises bound against the region's yield).")
    else:
        sentence = (f"Lowest factor of safety of this station: n = {gov['factor']:.3g} in {gov['region']} (von Mises "
                    "bound against the region's yield; static).")
    L = ("N", "Vx", "Vy", "Mx", "My", "T")
    dims = {"N": "force", "Vx": "force", "Vy": "force", "Mx": "moment", "My": "moment", "T": "moment"}
    loads = [(side, *(f.q(src[k], dims[k], 4) for k in L)) for side, src in
             (("used", st), ("just left", st["left"]), ("just right", st["right"]))]
    rows = [(i + 1, r["name"], f.q(r["material"]["elastic_modulus"], "stress", 4), f.q(r["tau_max"], "stress", 4),
             f.q(r["sigma_max"], "stress", 4), f.q(r["von_mises_bound"], "stress", 4),
             f.q(r["material"]["yield"], "stress", 4) if r["material"]["yield"] else "—",
             "—" if r["factor"] is None else f"{r['factor']:.3g}") for i, r in enumerate(sres.get("regions", []))]
    pairs = [(p["quantity"], f"{p['fe']:.6g}", "—" if p["classic"] is None else f"{p['classic']:.6g}",
              "—" if p["ratio"] is None else f"{p['ratio']:.6f}", p["source"] or p.get("note", ""))
             for p in sres.get("compare", [])]
    acc = sres.get("accuracy") or {}
    ach = "unknown" if acc.get("achieved") is None else f"{100 * acc['achieved']:.2g} %"
    out = [warn, f'<p class="verdict">{e(sentence)}</p>', "<h3>Loads</h3>",
           _table(("", *L), loads, numeric=(1, 2, 3, 4, 5, 6)),
           "<p class=\"small\">Composite section: bonded regions, each checked in its own material. Transverse shear "
           "(Vx, Vy) is not part of this check.</p>"]
    out += [_img(fg) for fg in sfigs]
    out += ["<h3>Regions and their stresses</h3>",
            _table(("#", "region", "E", "τmax", "σmax", "von Mises bound", "yield", "n"), rows, numeric=(2, 3, 4, 5, 6, 7)),
            "<p class=\"small\">τmax and σmax are each region's peaks on its boundary and on both sides of its interfaces "
            "(SI pairs below: rigidities in N·m², τ per unit torque in 1/m³), combined as if at one point: an upper bound "
            "of the region's von Mises stress.</p>",
            "<h3>Hand calculation against FE (SI)</h3>",
            _table(("quantity", "FE", "hand", "FE/hand", "source"), pairs, numeric=(1, 2, 3)),
            f"<p class=\"small\">Accuracy: estimated error {ach} "
            f"against the target {100 * acc.get('target', 0):.3g} % ({'reached' if acc.get('met') else 'NOT SHOWN'}).</p>",
            "<p class=\"small\">Not checked: " + e("; ".join(sres.get("not_checked") or [])) + ".</p>",
            f"<p class=\"small\">{e(POLYMER_CAUTION)}</p>"]
    return "".join(out)


def composite_segments_html(res: dict, f: Fmt) -> str:
    """The composite segments' beam properties, each FE value beside its hand value where there is one."""
    from .report_html import _table, e  # noqa: PLC0415  lazy import of a slow dependency: report_html reaches matplotlib

    segs = (res.get("shaft") or {}).get("composite_segments") or []
    if not segs:
        return ""
    rows = []
    for s in segs:
        where = f"segment {s['segment']} ({f.q(s['from'], 'length', 4)} to {f.q(s['to'], 'length', 4)})"
        rows.append((where, f.q(s["EI"], "rigidity", 5), f.q(s["GJ"], "rigidity", 5), f"{s['kGA']:.5g} N",
                     "—" if s["mass_per_length"] is None else f"{s['mass_per_length']:.4g} kg/m",
                     ", ".join(s["regions"])))
    pairs = [(p["quantity"], f.q(p["fe"], "rigidity", 6), f.q(p["classic"], "rigidity", 6),
              "—" if p["ratio"] is None else f"{p['ratio']:.6f}", p["source"] or p.get("note", ""))
             for s in segs for p in s["compare"]]
    return ("<h3>Composite segments (bonded regions)</h3>" +
            _table(("segment", "EI", "GJ", "κ·GA", "mass per length", "regions"), rows, numeric=(1, 2, 3, 4)) +
            (_table(("quantity", "FE", "hand", "FE/hand", "source"), pairs, numeric=(1, 2, 3)) if pairs else "") +
            f"<p class=\"small\">EI: {e(segs[0]['EI_basis'])}. GJ: {e(segs[0]['GJ_basis'])}. κ·GA: "
            f"{e(segs[0]['shear_stiffness_basis'])}. {e(POLYMER_CAUTION)}</p>")


def composite_headline_rows(res: dict, system) -> list[dict]:
    """results.csv rows of a composite governing station (its rigidities and each region's peaks and factor)."""
    f = Fmt(system)
    conv = res.get("convergence", {})
    rows = []

    def row(group, quantity, value, dim, key, err=None):
        unit = "" if dim == "dimensionless" else f.s.label(dim)
        v = value if dim == "dimensionless" or value is None else from_si(value, dim, f.s)
        rows.append({"group": group, "quantity": quantity, "value": v, "unit": unit, "hand_value": None, "ratio": None,
                     "source": "", "estimated_error": err, "results_json_key": key})

    row("section", "torsional rigidity GJ", res["torsion"]["GJ"], "rigidity", "torsion.GJ", (conv.get("GJ") or {}).get("gci"))
    for key in ("EIxx", "EIyy"):
        row("section", f"bending rigidity {key}", res["section"][key], "rigidity", f"section.{key}",
            (conv.get(key) or {}).get("gci"))
    for i, r in enumerate(res.get("regions", [])):
        g = f"region {i + 1}: {r['name']}"
        row(g, "τmax", r["tau_max"], "stress", f"regions[{i}].tau_max", (conv.get(f"tau_max[{i}]") or {}).get("gci"))
        row(g, "σmax", r["sigma_max"], "stress", f"regions[{i}].sigma_max")
        row(g, "von Mises bound", r["von_mises_bound"], "stress", f"regions[{i}].von_mises_bound")
        if r["factor"] is not None:
            row(g, "n (von Mises bound against the region's yield; static only)", r["factor"], "dimensionless",
                f"regions[{i}].factor")
    return rows


def composite_segment_rows(res: dict, system) -> list[dict]:
    """results.csv rows of the layout's composite segments: the beam's EI and GJ of each, beside ΣEᵢIᵢ and
    ΣGᵢJᵢ where the regions are concentric layers (the ratio computed from the two)."""
    f = Fmt(system)
    rows = []
    for i, s in enumerate((res.get("shaft") or {}).get("composite_segments") or []):
        for j, p in enumerate(s["compare"]):
            fe, hand = p["fe"], p["classic"]
            rows.append({"group": f"composite segment {s['segment']}", "quantity": p["quantity"].split(": ", 1)[-1],
                         "value": from_si(fe, "rigidity", f.s), "unit": f.s.label("rigidity"),
                         "hand_value": None if hand is None else from_si(hand, "rigidity", f.s),
                         "ratio": p["ratio"], "source": p["source"] or p.get("note", ""),
                         "estimated_error": s["accuracy"]["achieved"],
                         "results_json_key": f"shaft.composite_segments[{i}].compare[{j}]"})
    return rows

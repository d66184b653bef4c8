"""``report.html``: one self-contained page for the design file (figures inline as SVG data, no
network, no script), printable on A4 and Letter. User text is escaped; numbers are in the case's
units, round-off shown as 0."""
from __future__ import annotations

import base64
import datetime as _dt
import html

from .figures import critical_points
from .report import CAUTION, Fmt
from .report_checklist import checklist_html
from .report_combined import LABELS
from .report_polymer import polymer_html

#: the sections of the report, in order (id, heading); the tests check every one is present
SECTIONS = (
    ("verdict", "Governing result"), ("trace", "Traceability"), ("inputs", "Inputs"), ("section", "Section"),
    ("mesh", "Mesh"), ("torsion", "Torsion shear stress"), ("stress-function", "Stress-function contours"),
    ("shear", "Transverse shear"), ("combined", "Combined stress at the worst instant"),
    ("mohr", "Mohr's circles of the critical points"), ("hand-vs-fe", "Hand calculation against FE"),
    ("factors", "Static and fatigue factors of safety"), ("materials", "Material ranking"),
    ("checklist", "Keys, fits, splines, bearings and torsion along the shaft"),
    ("convergence", "Convergence"), ("assumptions", "Assumptions and limits of validity"), ("cautions", "Cautions"),
)

CSS = """
@page { size: auto; margin: 16mm 14mm; }
body { font-family: "DejaVu Sans", "Helvetica Neue", Arial, sans-serif; color: #1a1a1a; max-width: 190mm;
       margin: 0 auto; padding: 8mm 4mm; font-size: 10pt; line-height: 1.4; }
h1 { font-size: 16pt; margin: 0 0 2mm; } h2 { font-size: 12pt; border-bottom: 0.6pt solid #1a1a1a;
     padding-bottom: 1mm; margin-top: 8mm; }
.verdict { border: 1.2pt solid #1a1a1a; padding: 3mm 4mm; font-size: 11pt; }
.warn { border: 1.5pt solid #1a1a1a; border-left: 5pt solid #1a1a1a; padding: 2mm 4mm; margin: 2mm 0;
        font-weight: bold; background: #f2f2f2; }
table { border-collapse: collapse; width: 100%; font-size: 8.5pt; margin: 2mm 0; }
th, td { border-bottom: 0.4pt solid #b0b0b0; padding: 1mm 1.5mm; text-align: left; vertical-align: top; }
th { border-bottom: 0.8pt solid #1a1a1a; } td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
figure { margin: 3mm 0; break-inside: avoid; page-break-inside: avoid; }
figure img { max-width: 100%; height: auto; display: block; }
figcaption { font-size: 8.5pt; color: #404040; }
pre { font-size: 8pt; background: #f5f5f5; padding: 2mm; white-space: pre-wrap; break-inside: avoid; }
.small { font-size: 8.5pt; color: #404040; }
@media print { section { break-before: page; page-break-before: always; }
               section.first, section#trace { break-before: auto; page-break-before: auto; }
               body { max-width: none; padding: 0; } }
"""


def e(text) -> str:
    return html.escape("" if text is None else str(text), quote=True)


def _num(v, digits=4) -> str:
    if v is None:
        return "—"
    return f"{v:.{digits}g}"


def _img(fig) -> str:
    data = base64.b64encode(fig.svg.encode("utf-8")).decode("ascii")
    return (f'<figure><img src="data:image/svg+xml;base64,{data}" alt="{e(fig.title)}">'
            f"<figcaption>{e(fig.title)}. Also as figures/{e(fig.name)}.png and .svg.</figcaption></figure>")


def _table(head, rows, numeric=()) -> str:
    out = ["<table><thead><tr>", *(f"<th>{e(h)}</th>" for h in head), "</tr></thead><tbody>"]
    for r in rows:
        out.append("<tr>" + "".join(f'<td class="n">{e(c)}</td>' if i in numeric else f"<td>{e(c)}</td>"
                                    for i, c in enumerate(r)) + "</tr>")
    out.append("</tbody></table>")
    return "".join(out)


def render(res: dict, system, figures: list, case_text: str | None, trace: dict, date: str | None = None) -> str:
    f = Fmt(system)
    figs = {x.name: x for x in figures}
    date = date or _dt.datetime.now().astimezone().strftime("%Y-%m-%d %H:%M %Z")
    parts: dict[str, str] = {}
    gov = res.get("governing")
    warn = "".join(f'<p class="warn">{e(w["text"])}</p>' for w in res.get("warnings", []))
    if gov and gov.get("no_verdict"):
        sentence = ("No factor of safety governs: a sharp re-entrant corner leaves the peak stress unbounded, so this "
                    "section has no verdict (see the warning above). Factors shown below are for the rest of the "
                    "section only.")
    elif gov:
        sentence = f"Lowest factor of safety: {gov['text']}."
    else:
        sentence = "No factor of safety could be computed (no strengths given): stresses and section results only."
    parts["verdict"] = warn + f'<p class="verdict">{e(sentence)}</p>'
    parts["trace"] = _table(("item", "value"), [
        ("case", res["case"]["title"]), ("case file", res["case"].get("file") or "built in Python (no file)"),
        ("date", date), ("tool", f"shaftcheck {res['tool']['version']}"),
        ("SHA-256 of the case file", trace.get("case_sha256") or "—"),
        ("SHA-256 of the material table", trace.get("materials_sha256") or "no material table"),
        ("units", f.s.name)])
    parts["inputs"] = ("<p>The case file as given (its own units):</p><pre>" + e(case_text) + "</pre>"
                       if case_text else "<p>The case was built in Python; see results.json for its values.</p>")
    parts["section"] = _img(figs["section"]) if "section" in figs else ""
    parts["mesh"] = _img(figs["mesh"]) if "mesh" in figs else ""
    t = res["torsion"]
    away = (" away from the sharp re-entrant corners (there the stress is unbounded: this is not the section's "
            "peak and not a verdict)") if t.get("singular_corners") else ""
    parts["torsion"] = (_img(figs["torsion_stress"]) +
                        f"<p>τmax {e(f.q(t['tau_max'], 'stress'))}{e(away)} at {e(f.point(t['tau_max_at']))}: "
                        f"{e(f.where(t['tau_max_where']))}.</p>")
    parts["stress-function"] = _img(figs["stress_function"])
    parts["shear"] = _img(figs["shear_stress"]) if "shear_stress" in figs else \
        f"<p>Not computed: {e((res.get('shear') or {}).get('skipped', 'no transverse-shear field'))}.</p>"
    pts = critical_points(res)
    # σ or τ below 1e-7 of the point's von Mises stress is round-off (shown as 0, never as -0)
    rows = [(p["number"], ", ".join(p["criteria"]), f.point(p["at"]),
             f.q0(p["sigma"] + 0.0, "stress", p["von_mises"], 4), f.q0(p["tau"] + 0.0, "stress", p["von_mises"], 4),
             f.q(p["von_mises"], "stress", 4)) for p in pts]
    parts["combined"] = ((_img(figs["von_mises"]) if "von_mises" in figs else "") +
                         _table(("point", "critical for", "at", "σ", "τ", "von Mises"), rows, numeric=(3, 4, 5)) +
                         (_img(figs["fatigue_factor"]) if "fatigue_factor" in figs else ""))
    parts["mohr"] = _img(figs["mohr"]) if "mohr" in figs else "<p>No combined-stress points.</p>"
    parts["hand-vs-fe"] = hand_vs_fe(res, f)
    parts["factors"] = (_factors(res) + polymer_html(res, f) +  # a polymer's check at its service conditions
                        (_img(figs["polymer_data"]) if "polymer_data" in figs else ""))
    parts["materials"] = _materials(res)
    parts["checklist"] = checklist_html(res, system)
    parts["convergence"] = (_img(figs["convergence"]) if "convergence" in figs else "") + _convergence(res)
    parts["assumptions"] = ASSUMPTIONS
    parts["cautions"] = f"<p>{e(CAUTION)}</p><p>{e(CAUTION_MORE)}</p>"
    body = []
    for i, (sid, head) in enumerate(SECTIONS):
        cls = ' class="first"' if i == 0 else ""
        body.append(f'<section id="{sid}"{cls}><h2>{e(head)}</h2>{parts.get(sid, "")}</section>')
    return ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            f"<title>{e(res['case']['title'])} — shaftcheck report</title><style>{CSS}</style></head><body>"
            f"<h1>{e(res['case']['title'])}</h1><p class=\"small\">shaftcheck {e(res['tool']['version'])} design "
            f"report, {e(date)}</p>" + "".join(body) + "</body></html>\n")


def hand_vs_fe(res: dict, f: Fmt) -> str:
    """The table of every FE result beside its hand value (the pairs), with Kts."""
    t = res["torsion"]
    hv = []
    for p in res.get("compare", []):
        if p["kind"] == "not applicable":
            hv.append((p["quantity"], "—", "—", "—", p.get("note") or ""))
            continue
        dim = p["dimension"]
        # round-off as 0: against the hand value, or against 1 for a dimensionless ratio (a size-relative offset)
        scale = max(abs(p["classic"] or 0.0), 1.0 if dim == "dimensionless" else 0.0)
        fe = f.q0(p["fe"], dim, scale)
        hv.append((p["quantity"], fe, f.q(p["classic"], dim), _num(p["ratio"], 5),
                   p["source"] + (f"; {p['note']}" if p.get("note") else "")))
    if t.get("kts") is not None:
        hv.append(("Kts = τmax / τnominal", _num(t["kts"], 5), "—", "—", t["kts_nominal"]["source"]))
    return _table(("quantity", "FE", "hand", "ratio FE/hand", "source of the hand value"), hv, numeric=(1, 2, 3))


def _factors(res: dict) -> str:
    st, ft = res.get("static", {}), res.get("fatigue", {})
    out = []
    nv = (res.get("governing") or {}).get("no_verdict")
    if nv:
        out.append('<p class="warn">Away from the sharp corners only: NOT a verdict.</p>')
    if st.get("criteria"):
        out.append(_table(("static criterion (FE local stresses, worst instant)", "n", "source"),
                          [(LABELS.get(k, k), _num(st[k], 3), st["sources"].get(k, "")) for k in st["criteria"]],
                          numeric=(1,)))
    if ft.get("criteria"):
        hand = ft.get("hand", {})
        h1 = hand.get("with_kf_equal_kt", {}) if "skipped" not in hand else {}
        rows = [(LABELS.get(k, k), _num(ft.get(k), 3), _num(hand.get(k), 3), _num(h1.get(k), 3),
                 ft.get("sources", {}).get(k, "")) for k in ft["criteria"]]
        out.append(_table(("fatigue criterion", "FE path (q = 1)", "hand path (Kf, Kfs)", "hand (Kf = Kt)", "source"),
                          rows, numeric=(1, 2, 3)))
        if "Kt" in hand:
            out.append(f"<p class=\"small\">Hand path: Kt {_num(hand['Kt'])} ({e(hand['Kt_source'])}); Kts "
                       f"{_num(hand['Kts'])} ({e(hand['Kts_source'])}); Kf {_num(hand['Kf'])}, Kfs {_num(hand['Kfs'])}. "
                       f"Endurance limit: {e(ft.get('Se_source', ''))}.</p>")
    for k, v in ((res.get("combined") or {}).get("skipped") or {}).items():
        out.append(f"<p class=\"small\">Not checked — {e(k)}: {e(v)}</p>")
    return "".join(out) or "<p>No factor of safety could be computed.</p>"


def _materials(res: dict) -> str:
    mats = res.get("materials")
    if not mats:
        return "<p>No material table was given (analysis.materials).</p>"
    ill = mats[0].get("illustrative")
    rows = []
    for m in mats:
        if m.get("no_verdict"):
            verdict = (f"no verdict ({m['no_verdict']})" if isinstance(m["no_verdict"], str)
                       else "no verdict (unbounded stress at a sharp corner)")
        else:
            verdict = {True: "meets", False: "does not meet", None: "incomplete check"}[m["meets"]]
        rows.append((m["rank"], m["name"], _num(m["factor"], 3),
                     f"{LABELS.get(m['criterion'], m['criterion'])}, {m['path']}" if m["criterion"] else "—",
                     _num(m["margin"], 3), verdict))
    head = (f"<p>Table: {e(mats[0]['table'])}; design factor {mats[0]['design_factor']:g}."
            + (" <strong>ILLUSTRATIVE values, not real material data.</strong>" if ill else "") + "</p>")
    return head + _table(("rank", "material", "n", "governing criterion", "margin n/nd", "verdict"), rows,
                         numeric=(2, 4))


def _convergence(res: dict) -> str:
    conv, acc = res.get("convergence") or {}, res.get("accuracy") or {}
    rows = []
    for k, v in conv.items():
        if not v.get("values"):
            rows.append((k, "—", "—", "—", v.get("status", "")))
            continue
        rows.append((k, ", ".join(str(d) for d in v["dofs"]), _num(v.get("extrapolated"), 7),
                     "—" if v.get("gci") is None else f"{100 * v['gci']:.2g} %", v.get("status", "")))
    head = ""
    if acc:
        met = "reached" if acc.get("met") else "NOT SHOWN"
        ach = "unknown" if acc.get("achieved") is None else f"{100 * acc['achieved']:.2g} %"
        head = f"<p>Accuracy target {100 * acc['target']:.3g} %: {met}; largest estimated error {e(ach)}.</p>"
    return head + _table(("quantity", "unknowns of the three meshes", "extrapolated (SI)", "estimated error (GCI)",
                          "behaviour"), rows, numeric=(2, 3))


ASSUMPTIONS = """<ul>
<li>Saint-Venant prismatic bar: the section is the same along the shaft, and the results hold away from its ends,
shoulders, grooves and keyway ends (at least about one diameter away).</li>
<li>Linear elastic, isotropic, homogeneous material; small strains and rotations.</li>
<li>The keyway is empty (no key, no hub contact or fit pressure) unless stated in the case.</li>
<li>A keyseat end is a 3-D feature: its stress concentration adds to what this 2-D section shows (for bending the
2-D ratio is only the second moment lost to the cut). Take the keyseat-end factor from a published chart.</li>
<li>Round-off: values below 1e-7 of the section's size (or of the largest value of the same kind) are shown as 0.</li>
<li>Maps are nodal projections for looking at; peaks and factors of safety are read on the boundary.</li>
</ul>"""

CAUTION_MORE = ("The results apply to the 2-D model described above. Check the loads, the material data and the "
                "assumptions against the real part; the governing codes and standards and a licensed engineer decide "
                "whether the part is fit for service.")

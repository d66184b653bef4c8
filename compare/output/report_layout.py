"""``report.html`` of a shaft layout: one self-contained page for the whole shaft (figures inline as
SVG data, no network, no script, printable). The verdict of the whole shaft first, then the drawing,
the diagrams, the reactions, the stiffness checks, the critical speeds, the shoulder and groove
factors, the station table and each station's own part, the accuracy evidence, the assumptions and
the cautions. User text is escaped; numbers in the case's units."""
from __future__ import annotations

import datetime as _dt
import math

from ..case.units import from_si
from .figures_layout import eng_exponent, eng_unit
from .report import CAUTION, Fmt, no_verdict_label, num
from .report_combined import LABELS
from .report_checklist import checklist_html
from .report_polymer import layout_lines, polymer_html
from .results_shaft import segment_line, station_place_lines
from .report_composite_layout import composite_segments_html, composite_station_html, is_composite
from .report_html import CAUTION_MORE, CSS, _convergence, _factors, _img, _materials, _num, _table, e, hand_vs_fe

#: the fixed sections of the layout report, in order (id, heading); each station's part follows
#: "stations" as ``station-<n>``; the tests check every one is present
SECTIONS = (
    ("verdict", "Verdict for the whole shaft"), ("trace", "Traceability"), ("inputs", "Inputs"),
    ("drawing", "The shaft"), ("diagrams", "Diagrams along the shaft"), ("reactions", "Part forces and reactions"),
    ("stiffness", "Slopes and deflections against their limits"), ("critical-speeds", "Critical speeds"),
    ("features", "Shoulder and groove factors"), ("stations", "Checked stations"),
    ("checklist", "Keys, fits, splines, bearings and torsion along the shaft"),
    ("accuracy", "Accuracy evidence"), ("materials", "Material ranking (governing station)"),
    ("assumptions", "Assumptions and limits of validity"), ("cautions", "Cautions"),
)
#: the figures each station's part draws (names of compare/output/figures.py); its factors are tables
STATION_FIGURES = ("section", "torsion_stress", "von_mises", "segment_surface", "mohr")

CSS_LAYOUT = CSS + """
.ok { } .bad { font-weight: bold; }
h3 { font-size: 10.5pt; margin: 5mm 0 1mm; }
"""


class EngFmt(Fmt):
    """:class:`Fmt` with large forces and moments in engineering notation: '−120·10³ N·mm', never a bare
    120000."""

    def q(self, value, dimension: str, digits: int = 5) -> str:
        if value is not None and dimension in ("moment", "force"):
            x = from_si(value, dimension, self.s)
            if abs(x) >= 1e4:
                exp = eng_exponent([x])
                return f"{num(x / 10.0**exp, digits)}·{eng_unit(exp, self.s.label(dimension))}"
        return super().q(value, dimension, digits)


def station_label(st: dict, i: int, f: Fmt) -> str:
    """'station 2 (gear keyseat, z = 215 mm)'."""
    where = f"z = {f.q(st['at'], 'length', 5)}"
    return f"station {i + 1} ({st['name']}, {where})" if st.get("name") else f"station {i + 1} ({where})"


def lowest(block: dict | None, criteria=None) -> tuple[float | None, str | None]:
    """The lowest factor of a static or fatigue block (over its criteria) and its criterion."""
    block = block or {}
    best = (None, None)
    for k in criteria if criteria is not None else block.get("criteria", []):
        v = block.get(k)
        if isinstance(v, (int, float)) and math.isfinite(v) and (best[0] is None or v < best[0]):
            best = (v, k)
    return best


def whole_shaft_verdict(res: dict, f: Fmt) -> tuple[str, list[str]]:
    """(the sentence, the other checks' lines) of the whole shaft: the lowest factor of all stations,
    where and by what criterion; no verdict first where a station has none; then the stiffness and
    speed checks."""
    sh, loads = res["shaft"], res.get("section_loads", [])
    g = sh["governing_station"]
    st = loads[g] if loads else None
    gov = (st or {}).get("results", {}).get("governing") or res.get("governing") or {}
    if gov.get("no_verdict") and gov.get("reason_text"):  # a station's 3-D study short of its target
        sentence = (f"NO VERDICT for the shaft: at {station_label(st, g, f)} "
                    f"{gov['reason_text'].removeprefix('no verdict: ')}, so no factor of safety can be given there, and "
                    "none for the whole shaft. The factors of the other stations below are theirs only.")
    elif gov.get("no_verdict"):
        sentence = (f"NO VERDICT for the shaft: at {station_label(st, g, f)} the stress is unbounded (a sharp corner), so no "
                    "factor of safety can be given there, and none for the whole shaft. The factors of the other "
                    "stations below are theirs only.")
    elif gov.get("region") is not None and gov.get("factor") is not None and st is not None:  # a composite station
        sentence = (f"lowest factor of safety n = {gov['factor']:.3g} at {station_label(st, g, f)}, in its region "
                    f"{gov['region']} ({LABELS.get(gov.get('criterion'), gov.get('criterion'))}, each region in its own "
                    "material)")
        why = gov.get("not_a_verdict") or ", ".join(str(w).replace("_", " ") for w in gov.get("not_supported_because", []))
        sentence = (f"NO VERDICT for the shaft ({why or 'see the warnings'}): {sentence}."
                    if gov.get("verdict_supported") is False else f"The shaft's {sentence}.")
    elif gov.get("factor") is not None and st is not None:
        sentence = f"Lowest factor of safety of the shaft, at {station_label(st, g, f)}: {gov.get('text') or gov['factor']}."
    else:
        sentence = "No factor of safety could be computed (no strengths given): loads, stresses and stiffness only."
    other = []
    bad = [s for s in sh["slopes"] if not s["ok"]] + [d for d in sh["gear_deflections"] if not d["ok"]]
    n_checks = len(sh["slopes"]) + len(sh["gear_deflections"])
    other.append(f"Slopes and deflections: {n_checks - len(bad)} of {n_checks} within their limits"
                 + (f"; ABOVE the limit: {', '.join(str(b['name'] or b['at']) for b in bad)}" if bad else "") + ".")
    cs = sh["critical_speeds"]
    if "skipped" in cs:
        other.append(f"Critical speed: not computed ({cs['skipped']}).")
    elif cs.get("speed") and cs.get("ratio") is not None:
        other.append(f"First critical speed {cs['values'][0] * 60 / (2 * math.pi):.0f} rpm, {cs['ratio']:.3g} × the "
                     f"operating speed (need ≥ {cs['margin']:g}, common practice): "
                     f"{'ok' if cs['ok'] else 'TOO CLOSE'}.")
    nv = [station_label(s, i, f) for i, s in enumerate(loads) if (s["results"].get("governing") or {}).get("no_verdict")]
    if nv and not gov.get("no_verdict"):
        other.append(f"No verdict at {', '.join(nv)}.")
    return sentence, other


def render_layout(res: dict, system, figures: list, stations: list, case_text: str | None, trace: dict,
                  date: str | None = None, title: str | None = None) -> str:
    """The page. ``figures``: the layout's figures; ``stations``: per station ``(results, figures)``
    (the station's full results and its section figures); ``title``: the layout's own title (the
    results' case title is the governing station's)."""
    f = EngFmt(system)
    title = title or res["case"]["title"]
    figs = {x.name: x for x in figures}
    date = date or _dt.datetime.now().astimezone().strftime("%Y-%m-%d %H:%M %Z")
    sh = res["shaft"]
    parts: dict[str, str] = {}
    warn = "".join(f'<p class="warn">{e(w["text"])}</p>' for w in res.get("warnings", []))
    sentence, other = whole_shaft_verdict(res, f)
    parts["verdict"] = (warn + f'<p class="verdict">{e(sentence)}</p>' + "<ul>" +
                        "".join(f"<li>{e(x)}</li>" for x in other) + "</ul>" + _station_table(res, f, short=True))
    parts["trace"] = _table(("item", "value"), [
        ("case", title), ("case file", res["case"].get("file") or "built in Python (no file)"),
        ("date", date), ("tool", f"shaftcheck {res['tool']['version']}"),
        ("SHA-256 of the case file", trace.get("case_sha256") or "—"),
        ("SHA-256 of the material table", trace.get("materials_sha256") or "no material table"),
        ("units", f.s.name)])
    parts["inputs"] = ("<p>The case file as given (its own units):</p><pre>" + e(case_text) + "</pre>"
                       if case_text else "<p>The case was built in Python; see results.json for its values.</p>")
    parts["drawing"] = _fig(figs, "shaft_layout") + (
        "<p class=\"small\">Drawn to scale from the case. Part outlines are the pitch or belt diameters over a nominal hub "
        "width (the case gives no hub width). Arrows: the forces the parts put on the shaft and the bearing reactions, "
        "each in its own plane, lengths to one scale.</p>")
    md, mm = sh["max_deflection"], sh["max_moment"]
    parts["diagrams"] = _fig(figs, "shaft_diagrams") + (
        f"<p>Largest bending moment {e(f.q(mm['value'], 'moment', 4))} at {e(f.q(mm['at'], 'length', 4))}; largest "
        f"deflection {e(f.q(md['value'], 'length', 3))} at {e(f.q(md['at'], 'length', 4))}. Signs: loads on the cut face "
        "whose outward normal is +z; slopes θx = du/dz, θy = dv/dz.</p>")
    parts["reactions"] = _reactions(sh, f)
    parts["stiffness"] = _stiffness(sh, f) + (  # a polymer shaft: after the service life too
        "<pre>" + e("\n".join(x.strip() for x in layout_lines(res["polymer_layout"], f))) + "</pre>"
        if res.get("polymer_layout") else "")
    parts["critical-speeds"] = _critical(sh) + _fig(figs, "shaft_modes")
    parts["features"] = _features(sh, f) + _fig(figs, "feature_stress")
    parts["stations"] = _station_table(res, f) + composite_segments_html(res, f)
    parts["checklist"] = checklist_html(res, system, f)
    parts["accuracy"] = _accuracy(res, stations, f)
    parts["materials"] = _materials(res)
    parts["assumptions"] = ASSUMPTIONS_LAYOUT
    parts["cautions"] = f"<p>{e(CAUTION)}</p><p>{e(CAUTION_MORE)}</p>"
    body = []
    for i, (sid, head) in enumerate(SECTIONS):
        cls = ' class="first"' if i == 0 else ""
        body.append(f'<section id="{sid}"{cls}><h2>{e(head)}</h2>{parts.get(sid, "")}</section>')
        if sid == "stations":
            for j, (st, (sres, sfigs)) in enumerate(zip(res.get("section_loads", []), stations)):
                part = composite_station_html(st, sres, sfigs, f) if is_composite(sres) else _station_part(st, sres, sfigs, f)
                body.append(f'<section id="station-{j + 1}"><h2>{e(station_label(st, j, f).capitalize())}</h2>'
                            f"{part}</section>")
    return ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            f"<title>{e(title)} — shaftcheck layout report</title><style>{CSS_LAYOUT}</style></head><body>"
            f"<h1>{e(title)}</h1><p class=\"small\">shaftcheck {e(res['tool']['version'])} design report of a shaft "
            f"layout, {e(date)}</p>" + "".join(body) + "</body></html>\n")


def _fig(figs: dict, name: str) -> str:
    return _img(figs[name]) if name in figs else ""


def _reactions(sh: dict, f: Fmt) -> str:
    rows = []
    for p in sh["parts"]:
        rows.append((p["name"], f.q(p["at"], "length", 5), f.q(p["Fx"], "force", 4), f.q(p["Fy"], "force", 4),
                     f.q(p["Fz"], "force", 4), f.q(p["T"], "moment", 4), p.get("source", "given as forces")))
    out = "<h3>Forces of the parts on the shaft</h3>" + _table(
        ("part", "z", "Fx", "Fy", "Fz (axial)", "torque T", "source of the resolution"), rows, numeric=(1, 2, 3, 4, 5))
    rows = [(r["name"] or "support", f.q(r["at"], "length", 5), f.q(r["Fx"], "force", 4), f.q(r["Fy"], "force", 4),
             f.q(r["F"], "force", 4), f.q(r.get("Fz"), "force", 4) if r.get("Fz") else "—",
             "rigid" if r.get("stiffness") is None else f"{r['stiffness']:.4g} N/m")
            for r in sh["reactions"]]
    out += "<h3>Bearing reactions (forces of the supports on the shaft)</h3>" + _table(
        ("support", "z", "Fx", "Fy", "|F| radial", "axial", "support model"), rows, numeric=(1, 2, 3, 4, 5))
    if sh.get("axial_reaction_note"):
        out += f"<p class=\"small\">{e(sh['axial_reaction_note'])}.</p>"
    return out


def _stiffness(sh: dict, f: Fmt) -> str:
    rows = [(f"{s['kind']} {s['name'] or ''}", f.q(s["at"], "length", 5), f"{s['slope']:.3g} rad", f"{s['limit']:.3g} rad",
             f"{s['slope'] / s['limit']:.3g}", "ok" if s["ok"] else "ABOVE", f"{s['basis']}; {s['source']}")
            for s in sh["slopes"]]
    out = "<h3>Slopes</h3>" + _table(("where", "z", "slope", "limit", "slope / limit", "check", "limit's basis and source"),
                                     rows, numeric=(1, 2, 3, 4))
    rows = [(g["name"], f.q(g["at"], "length", 5), f.q(g["deflection"], "length", 3), f.q(g["limit"], "length", 3),
             f"{g['deflection'] / g['limit']:.3g}", "ok" if g["ok"] else "ABOVE", g["basis"]) for g in sh["gear_deflections"]]
    if rows:
        out += "<h3>Deflection at the gears</h3>" + _table(
            ("gear", "z", "deflection", "limit", "deflection / limit", "check", "limit's basis and source"), rows,
            numeric=(1, 2, 3, 4))
    return out


def _critical(sh: dict) -> str:
    cs = sh["critical_speeds"]
    if "skipped" in cs:
        return f"<p>Not computed: {e(cs['skipped'])}.</p>"
    rows = [(f"mode {i + 1}", f"{w:.4g}", f"{w / (2 * math.pi):.4g}", f"{w * 60 / (2 * math.pi):.0f}")
            for i, w in enumerate(cs["values"])]
    ray = cs["rayleigh"]
    rows.append(("Rayleigh estimate (first)", f"{ray:.4g}", f"{ray / (2 * math.pi):.4g}", f"{ray * 60 / (2 * math.pi):.0f}"))
    out = _table(("", "ω [rad/s]", "f [Hz]", "n [rpm]"), rows, numeric=(1, 2, 3))
    out += f"<p class=\"small\">Beam model: {e(cs['method'])}. Rayleigh: {e(cs['rayleigh_source'])}; {e(cs['rayleigh_note'])}.</p>"
    if cs.get("speed"):
        out += (f"<p>Operating speed {cs['speed'] * 60 / (2 * math.pi):.0f} rpm; first critical speed / operating speed "
                f"= {cs['ratio']:.3g}, need ≥ {cs['margin']:g} ({e(cs['margin_basis'])}): "
                f"<strong>{'ok' if cs['ok'] else 'TOO CLOSE'}</strong>.</p>")
    return out


_FEATURE_FACTORS = (("kt_bending", "Kt bending"), ("kts", "Kts torsion"), ("kt_axial", "Kt tension"))


def _status(ch: dict) -> str:
    """The chart value's status as the record holds it (a 'status' text where given, else valid or why)."""
    if ch.get("disagrees_with_fe"):  # the remembered fit is off here (compare/pairs/feature_step.py)
        side = "below" if ch["chart_minus_fe"] < 0 else "above"
        return (f"the fit is {abs(100 * ch['chart_minus_fe']):.0f} % {side} the FE, beyond its stated ±{100 * ch['allowed']:.2g} % "
                "and the FE's estimate: the remembered fit is off here, trust the FE value")
    if ch.get("status"):
        return str(ch["status"])
    if ch.get("value") is None:
        return f"no chart value ({ch.get('why') or 'none'})"
    return "inside the fit's range" if ch.get("valid") else f"outside the fit's range ({ch.get('why') or ''})"


def _features(sh: dict, f: Fmt) -> str:
    feats = sh.get("features") or []
    if not feats:
        return "<p>The layout has no shoulder or groove.</p>"
    rows, sources = [], []
    for r in feats:
        where = f"{r['kind']} at {f.q(r['at'], 'length', 5)} ({r['field']})"
        size = (f"d {f.q(r.get('d'), 'length', 4)}, D {f.q(r.get('D'), 'length', 4)}" if r["kind"] == "shoulder" else
                f"D {f.q(r.get('D'), 'length', 4)}, depth {f.q(r.get('depth'), 'length', 3)}")
        size += f", r {f.q(r['radius'], 'length', 3)}" if r.get("radius") else ", no radius"
        if r.get("skipped"):
            rows.append((where, size, "—", "—", "—", "—", "—", f"no factors: {r['skipped']}"))
            continue
        for key, name in _FEATURE_FACTORS:
            if r.get(key) is None:
                continue
            ch = r.get(f"{key}_chart") or {}
            gci = r.get(f"{key}_gci")
            kind = r.get(f"{key}_gci_kind") or "estimate"
            err = "—" if gci is None else f"{100 * gci:.2g} % ({kind})"
            chart = ch.get("value")
            if ch.get("source") and ch["source"] not in sources:
                sources.append(ch["source"])
            ratio = "—" if chart is None or ch.get("disagrees_with_fe") else f"{r[key] / chart:.3g}"  # no ratio that makes the FE look wrong
            rows.append((where, size, name, f"{r[key]:.4g}", err, _num(chart, 4), ratio, _status(ch)))
    out = _table(("feature", "geometry", "factor", "FE", "estimated error", "chart", "FE / chart", "chart status"), rows,
                 numeric=(3, 4, 5, 6))
    if sources:
        out += "<p class=\"small\">Chart: " + "; ".join(e(s) for s in sources) + ".</p>"
    return out


def _loads_used(st: dict, f: Fmt) -> str:
    M = math.hypot(st["Mx"], st["My"])
    txt = (f"M {f.q(M, 'moment', 4)} (Mx {f.q(st['Mx'], 'moment', 4)}, My {f.q(st['My'], 'moment', 4)}), "
           f"T {f.q(st['T'], 'moment', 4)}, N {f.q(st['N'], 'force', 4)}, V {f.q(math.hypot(st['Vx'], st['Vy']), 'force', 4)}")
    if st.get("jump"):
        txt += f"; {st.get('used_side')} side of a jump (the larger)"
    return txt


def _loads_where(st: dict, f: Fmt) -> str:
    """Where along the station's feature its governing loads were (the station checked at the worst loads
    along its feature: results_shaft.station_place_lines), a load point it sits on; else the station."""
    lines = station_place_lines(st, f)
    if lines:
        return "; ".join(lines)
    for key in ("loads_where", "governing_at"):
        v = st.get(key)
        if isinstance(v, (int, float)):
            return f"z = {f.q(v, 'length', 5)}"
        if isinstance(v, dict) and isinstance(v.get("at"), (int, float)):
            return f"z = {f.q(v['at'], 'length', 5)}" + (f" ({v['note']})" if v.get("note") else "")
        if isinstance(v, str) and v:
            return v
    return f"at the station, z = {f.q(st['at'], 'length', 5)}"


def _station_table(res: dict, f: Fmt, short: bool = False) -> str:
    rows = []
    for i, st in enumerate(res.get("section_loads", [])):
        r = st["results"]
        gov = r.get("governing") or {}
        sec = r.get("section") or {}
        kind = sec.get("kind") or sec.get("shape") or ("round" if not st.get("features") else "round")
        section = f"{kind}, d {f.q(st['diameter'], 'length', 4)}" + (f", at a {' and '.join(st['features'])}"
                                                                        if st.get("features") else "")
        sn, sc = lowest(r.get("static"))
        ft = r.get("fatigue") or {}
        fn, fc = lowest(ft)
        hand = ft.get("hand") or {}
        hn, hc = lowest(hand, ft.get("criteria", [])) if "skipped" not in hand else (None, None)
        local = "fe_local" in (r.get("fatigue") or {}) or "fe_local" in (r.get("static") or {})
        fe_path = "meridian-section FE at the fillet" if local else "2-D section FE"
        if st.get("fe_path") == "segment":
            fe_path = "3-D segment FE at the feature"
        if gov.get("no_verdict") and gov.get("reason_text"):
            verdict = f"NO VERDICT ({no_verdict_label(gov)})"
        elif gov.get("no_verdict"):
            verdict = "NO VERDICT (unbounded stress)"
        elif gov.get("region") is not None:  # a composite station: per region, static only
            verdict = (f"n = {gov['factor']:.3g} ({LABELS.get(gov.get('criterion'), gov.get('criterion'))}, {gov['region']})" +
                       ("; NOT A VERDICT: " + (gov.get("not_a_verdict") or ", ".join(
                           str(w).replace("_", " ") for w in gov.get("not_supported_because", [])) or "see its warnings")
                        if gov.get("verdict_supported") is False else ""))
        elif gov.get("factor") is None:
            verdict = "no factor"
        else:
            meets = gov.get("meets_design_factor")
            verdict = (f"n = {gov['factor']:.3g} ({LABELS.get(gov.get('criterion'), gov.get('criterion'))}, {gov.get('path')})"
                       + ("" if meets is None else ("; meets the design factor" if meets else "; BELOW the design factor"))
                       + ("; n < 1" if gov["factor"] < 1 else ""))
        if st.get("exit_code"):
            verdict += f" (exit code {st['exit_code']})"
        if short:
            rows.append((i + 1, st.get("name") or "", f.q(st["at"], "length", 5), verdict))
        else:
            rows.append((i + 1, st.get("name") or "", f.q(st["at"], "length", 5), section, _loads_used(st, f),
                         _loads_where(st, f), _num(sn, 3) + (f" ({LABELS.get(sc, sc)})" if sc else ""),
                         _num(fn, 3) + (f" ({LABELS.get(fc, fc)})" if fc else ""),
                         _num(hn, 3) + (f" ({LABELS.get(hc, hc)})" if hc else ""), fe_path, verdict))
    if short:
        return _table(("#", "station", "z", "lowest factor of safety"), rows, numeric=(2,))
    return _table(("#", "station", "z", "section", "loads used", "where the loads were taken",
                   "static n (FE)", "fatigue n (FE path)", "fatigue n (hand path)", "FE path", "verdict"), rows,
                  numeric=(2,))


def _station_part(st: dict, sres: dict, sfigs: list, f: Fmt) -> str:
    figs = {x.name.split("_", 1)[1]: x for x in sfigs}
    warn = "".join(f'<p class="warn">{e(w["text"])}</p>' for w in sres.get("warnings", []))
    gov = sres.get("governing") or {}
    sentence = (gov.get("text") and f"Lowest factor of safety of this station: {gov['text']}.") or \
        "No factor of safety could be computed for this station."
    L = ("N", "Vx", "Vy", "Mx", "My", "T")
    dims = {"N": "force", "Vx": "force", "Vy": "force", "Mx": "moment", "My": "moment", "T": "moment"}
    rows = [(side, *(f.q(src[k], dims[k], 4) for k in L)) for side, src in
            (("used", st), ("just left", st["left"]), ("just right", st["right"]))]
    out = [warn, f'<p class="verdict">{e(sentence)}</p>', "<h3>Loads</h3>",
           _table(("", *L), rows, numeric=(1, 2, 3, 4, 5, 6)),
           f"<p class=\"small\">Loads taken {e(_loads_where(st, f))}.</p>"]
    seg = st.get("segment")
    if seg:  # a 3-D feature: its factors with their estimates, before the figures
        rows3 = [(k, f"{seg[k]:.4g}", "—" if seg[f"{k}_gci"] is None else f"{100 * seg[f'{k}_gci']:.3g} %",
                  seg[f"{k}_status"]) for k in ("kt_bending_x", "kt_bending_y", "kts", "kt_axial")]
        out += ["<h3>3-D feature</h3>", f"<p>{e(segment_line(seg, bool(st.get('segment_far_field'))))}.</p>",
                _table(("factor", "3-D FE (finest mesh)", "three-mesh estimate", "study"), rows3, numeric=(1, 2)),
                f"<p class=\"small\">Hand path: Kt = {e(seg['kt_bending_used']['from'])} ({e(seg['kt_bending_used']['why'])}), "
                "Kts = kts. FE path: the 3-D unit-load results superposed with the station's loads at every candidate "
                "point along the feature.</p>"]
    for name in STATION_FIGURES:
        if name in figs:
            out.append(_img(figs[name]))
    out += ["<h3>Factors of safety</h3>", _factors(sres), polymer_html(sres, f),  # a polymer's own check, if any
            "<h3>Hand calculation against FE</h3>", hand_vs_fe(sres, f),
            "<h3>Convergence</h3>", _convergence(sres)]
    return "".join(out)


def _accuracy(res: dict, stations: list, f: Fmt) -> str:
    sh = res["shaft"]
    eq = sh["equilibrium_residual"]
    out = [f"<p>Beam ({e(sh['beam']['theory'])}; {sh['beam']['elements']} elements): equilibrium of the loads and "
           f"reactions, relative residual force {eq['force']:.1e}, moment {eq['moment']:.1e}, torque {eq['torque']:.1e}; "
           f"beam solve residual {sh['beam_solve_residual']:.1e}. Stiffness: {e(sh['beam']['stiffness'])}.</p>"]
    rows = []
    for i, (st, (sres, _)) in enumerate(zip(res.get("section_loads", []), stations)):
        acc = sres.get("accuracy") or {}
        conv = sres.get("convergence") or {}
        gcis = [v.get("gci") for v in conv.values() if v.get("gci") is not None]
        rows.append((station_label(st, i, f), "—" if not acc else f"{100 * acc['target']:.3g} %",
                     "—" if not acc else ("reached" if acc.get("met") else "NOT SHOWN"),
                     "—" if acc.get("achieved") is None else f"{100 * acc['achieved']:.2g} %",
                     "—" if not gcis else f"{100 * max(gcis):.2g} %", (sres.get("mesh") or {}).get("dofs", "—")))
    out.append("<h3>Section FE of each station (three-mesh study)</h3>")
    out.append(_table(("station", "target", "target", "largest estimated error", "largest GCI", "unknowns (finest)"),
                      rows, numeric=(3, 4, 5)))
    frows = []
    for r in sh.get("features") or []:
        if r.get("skipped"):
            continue
        for key, name in _FEATURE_FACTORS:
            if r.get(key) is None:
                continue
            vals = r.get(f"{key}_values_coarse_to_fine") or []
            ff = r.get(f"{key}_far_field") or {}
            frows.append((f"{r['kind']} at {f.q(r['at'], 'length', 5)}", name, ", ".join(f"{v:.5g}" for v in vals),
                          "—" if r.get(f"{key}_order") is None else f"{r[f'{key}_order']:.2g}",
                          "—" if r.get(f"{key}_gci") is None else f"{100 * r[f'{key}_gci']:.2g} % ({r.get(f'{key}_gci_kind')})",
                          "—" if not ff else ("passed" if ff.get("passed") else "FAILED") + f" ({ff.get('fem', 0):.6g} of nominal)"))
    if frows:
        out.append("<h3>Shoulders and grooves (meridian-section FE on three meshes)</h3>")
        out.append(_table(("feature", "factor", "values, coarse to fine", "observed order", "estimated error",
                           "far-field check"), frows))
    return "".join(out)


ASSUMPTIONS_LAYOUT = """<ul>
<li>The shaft is a beam in two planes (Timoshenko: shear deformation; rotary inertia in the critical speeds), with the
round-bar stiffness of each segment and, over a station's feature length, its FE section; supports are rigid unless
a stiffness is given; internal loads come from statics with the beam's reactions.</li>
<li>Gear and belt forces are resolved from the torque with the textbook relations named in the parts table; the belt's
pull and the gear's mesh direction are as given in the case.</li>
<li>Each station is checked as a 2-D section (Saint-Venant prismatic bar) under the loads at that point. A shoulder,
a groove or a keyseat end is a 3-D feature: its stress concentration comes from the meridian-section FE of the
feature or from a chart, never from the 2-D section.</li>
<li>Critical speeds are those of the shaft at rest (no gyroscopic stiffening), with rigid or given bearing stiffness;
the margin asked is common practice.</li>
<li>Slope and deflection limits are the published ranges named beside each check; bearings and gears of the real
machine may need tighter ones (see their makers' data).</li>
<li>Linear elastic, isotropic, homogeneous material; small strains and rotations. A composite segment: each region
homogeneous, the regions bonded without slip; its EI, κ·GA, GJ and mass per length from its own FE section (κ·GA by an
approximate shear coefficient, see the composite segments table); creep of its polymer regions not applied.</li>
</ul>"""

"""The design report of a [segment] case (a 3-D segment study): ``report.html`` with the factors,
their three-mesh estimates, the warnings first, and the figure of the stress on the surface near the
feature (compare/output/figures_segment.py); ``results.csv`` with one row per factor."""
from __future__ import annotations

import csv
import datetime as _dt
import io

from ..case.case import read_input_file
from .report import CAUTION, Fmt
from .report_html import CSS, _img, _table, e
from .results_segment import SEGMENT_CAUTION, model_phrase, verdict_words

_NAMES = {"kt_axial": "Kt, tension", "kt_bending_x": "Kt, bending about x", "kt_bending_y": "Kt, bending about y",
          "kts": "Kts, torsion"}


def segment_report_files(a, res: dict, date: str | None = None) -> dict[str, str | bytes]:
    """``{relative name: text or bytes}`` of a [segment] case's report."""
    from .figures_segment import segment_case_figure  # noqa: PLC0415  lazy import of a slow dependency (matplotlib)
    f = Fmt(a.case.units)
    fig = segment_case_figure(a, f)
    figs = [fig] if fig is not None else []
    case_text = read_input_file(a.case.path, "case") if a.case.path is not None else None
    date = date or _dt.datetime.now().astimezone().strftime("%Y-%m-%d %H:%M %Z")
    s = res["segments"][0]
    acc = res["accuracy"]
    warn = "".join(f'<p class="warn">{e(w["text"])}</p>' for w in res.get("warnings", []))
    rows = []
    for key, name in _NAMES.items():
        g, c = s[f"{key}_gci"], s[f"{key}_chart"]
        at = ", ".join(f.q0(v, "length", s["diameter"]) for v in s["peak_location"][key]["at"])
        on = s["peak_location"][key].get("feature")
        rows.append((name, f"{s[key]:.4g}", "—" if g is None else f"{100 * g:.3g} %", s[f"{key}_status"],
                     "—" if c is None else f"{c:.3g}", f"({at})", "plain bar" if on is None else on.replace("_", " "),
                     "MODEL TOO SHORT: not a verdict" if s.get(f"{key}_model_too_short") else ""))
    verdict = res.get("verdict") or verdict_words(acc["met"], not acc.get("model_long_enough", True))
    body = (f"<h1>{e(res['case']['title'])}</h1><p class=\"small\">shaftcheck {e(res['tool']['version'])} 3-D segment "
            f"study, {e(date)}</p>" + warn + f'<p class="verdict">{e(verdict)}</p>'
            + f"<h2>Factors</h2><p>{e(s['kind'].replace('_', ' '))} on a {e(f.q(s['diameter'], 'length'))} shaft, "
            f"modelled over {e(f.q(s['length'], 'length'))} ({e(model_phrase(s.get('model')))}); "
            f"meshes {e(str(acc['meshes']))} unknowns; target "
            f"{100 * acc['target']:.3g} %.</p>"
            + (f"<p>{'The' if s['kind'] == 'shoulder' else 'Beside a'} shoulder up to {e(f.q(s['shoulder']['D'], 'length'))} at "
               f"{e(f.q(s['shoulder']['at'], 'length'))} (fillet {e(f.q(s['shoulder']['fillet'], 'length'))}); "
               f"nominal stresses on the {e(f.q(s['diameter'], 'length'))} diameter.</p>" if s.get("shoulder") else "")
            + _table(("factor", "FE (finest)", "estimate", "study", "chart", "peak (x, y, z)", "peak on", "flag"), rows,
                     numeric=(1, 2, 4))
            + "".join(f"<p class=\"small\">chart: {e(src)}</p>" for src in dict.fromkeys(
                s[f"{k}_chart_source"] for k in _NAMES if s.get(f"{k}_chart_source")))
            + "".join(f"<p class=\"small\">no chart value for {e(_NAMES[k])}: {e(s[f'{k}_chart_why'])}</p>"
                      for k in _NAMES if s.get(f"{k}_chart_why"))
            + "<h2>Stress on the surface near the feature</h2>" + "".join(_img(x) for x in figs)
            + "<p class=\"small\">The surface sample points of the finest mesh, unrolled onto the shaft's surface "
              "(points on the feature's own faces drawn where they project radially onto it).</p>"
            + ("<h2>Inputs</h2><pre>" + e(case_text) + "</pre>" if case_text else "")
            + f"<h2>Cautions</h2><p>{e(SEGMENT_CAUTION)}.</p><p>{e(CAUTION)}</p>")
    html = ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            f"<title>{e(res['case']['title'])} — shaftcheck 3-D segment report</title><style>{CSS}</style></head>"
            f"<body>{body}</body></html>\n")
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(["factor", "results_json_key", "value", "estimated_error", "status", "chart", "chart_source"])
    for key, name in _NAMES.items():
        c = s[f"{key}_chart"]
        w.writerow([name, f"segments[0].{key}", repr(s[key]), "" if s[f"{key}_gci"] is None else repr(s[f"{key}_gci"]),
                    s[f"{key}_status"], "" if c is None else repr(c), s.get(f"{key}_chart_source") or ""])
    out: dict[str, str | bytes] = {"report.html": html, "results.csv": buf.getvalue()}
    for fg in figs:
        out[f"figures/{fg.name}.svg"] = fg.svg
        out[f"figures/{fg.name}.png"] = fg.png
    return out

"""results.json and the terminal summary of a 3-D segment study (compare/pairs/segment_step.py)."""
from __future__ import annotations

from .._version import __version__
from ..checks.segment_far_field import far_field_text
from .report import CAUTION, Fmt

#: what the factors of a segment are not, said beside them every time
SEGMENT_CAUTION = ("a chart read by eye (or a handbook curve fit) and this 3-D FE both need checking: the factors are per unit load on a short "
                   "segment with plain-bar ends, the peaks on small radii read high on coarse meshes")

_KEYS = ("kt_axial", "kt_bending_x", "kt_bending_y", "kts")


def segment_results(a, warnings_out, schema_version: int) -> dict:
    case = a.case
    seg = a.extra["segment"]
    st = seg["study"]
    target = case.analysis.accuracy
    gcis = [r["gci"] for r in a.extra["segment_rows"]]
    achieved = None if any(g is None for g in gcis) else max(gcis)
    met = achieved is not None and achieved <= target and st.limited is None
    # a model too short for its feature (the check's records, compare/checks/segment_far_field.py): the
    # factors are shown, flagged, but carry no verdict (exit 3, as a target not shown)
    short = a.extra["segment_far_field"]
    entry = {"kind": seg["kind"], "at": seg["at"], "span": seg["span"], "diameter": st.segment.d,
             "length": st.segment.length, "model": seg.get("model", "whole")}
    peaks = {}
    for r in a.extra["segment_rows"]:
        entry[r["key"]] = r["value"]
        entry[f"{r['key']}_gci"] = r["gci"]
        entry[f"{r['key']}_status"] = r["status"]
        entry[f"{r['key']}_chart"] = r["chart"]
        entry[f"{r['key']}_chart_source"] = r["chart_source"]
        entry[f"{r['key']}_chart_why"] = r.get("chart_why")
        entry[f"{r['key']}_far_field"] = st.far_field.get(r["key"])
        entry[f"{r['key']}_model_too_short"] = bool(short) and r["key"] in short[0]["departures"]
        peaks[r["key"]] = {"at": r["peak_at"], "on_feature": r["peak_on_feature"], "feature": r.get("peak_feature")}
    entry["peak_location"] = peaks
    entry["shoulder"] = seg.get("shoulder")
    entry["chart_source"] = next((r["chart_source"] for r in a.extra["segment_rows"] if r["chart_source"]), None)
    out = {
        "schema_version": schema_version, "tool": {"name": "shaftcheck", "version": __version__},
        "case": {"title": case.title, "units": case.units.name if case.units else None,
                 "file": str(case.path) if case.path else None},
        "caution": CAUTION,
        "segments": [entry],
        "compare": [p.to_dict() for p in a.pairs],
        "convergence": st.estimates,
        "accuracy": {"target": target, "achieved": achieved, "met": bool(met), "limited_by": st.limited,
                     "meshes": st.dofs, "seconds": st.seconds,
                     "estimator": "three geometrically similar meshes (ratio 1.4), GCI per factor"},
        "mesh": {"dofs": st.dofs[-1] if st.dofs else None,
                 "element": "10-node curved (isoparametric) tetrahedron, quadratic displacement"},
        "seconds": a.seconds,
    }
    out["warnings"] = warnings_out(a)
    out["warnings"].insert(0, {"code": "segment_caution", "text": SEGMENT_CAUTION, "data": {}})
    if not met:
        out["warnings"].insert(0, {"code": "accuracy_not_met", "text": "ACCURACY TARGET NOT SHOWN: target "
                                   f"{100 * target:.3g} %, estimated error "
                                   f"{'unknown' if achieved is None else f'{100 * achieved:.3g} %'}"
                                   f"{f' ({st.limited})' if st.limited else ''}: the factors are not a verdict.",
                                   "data": {"target": target, "achieved": achieved, "limited_by": st.limited}})
    for w in short:  # the first warning: the verdict it withholds comes before everything else
        out["warnings"].insert(0, {"code": w["code"], "text": far_field_text(w, Fmt(case.units).q),
                                   "data": {k: v for k, v in w.items() if k != "code"}})
    out["accuracy"]["model_long_enough"] = not short
    out["verdict"] = verdict_words(met, bool(short))
    out["exit_code"] = 0 if met and not short else 3
    return out


def verdict_words(met: bool, short: bool) -> str:
    """The sentence a [segment] case's factors stand under: none where the model is too short or the
    target not shown."""
    if short:
        return ("NO VERDICT: the 3-D model is too short for its feature (the far-field check): the factors are shown, "
                "flagged, but may read low; model a longer segment.")
    if not met:
        return "ACCURACY TARGET NOT SHOWN: these factors are estimates, not a verdict."
    return "The three-mesh estimates meet the target: the factors above carry the stated uncertainty."


def model_phrase(model: str | None) -> str:
    """The model solved, in one short phrase ("quarter model by symmetry")."""
    return "whole model" if model in (None, "whole") else f"{model} model by symmetry"


def segment_summary(res: dict, system) -> str:
    """The terminal block of a 3-D segment study."""
    f = Fmt(system)
    lines = [f"shaftcheck {res['tool']['version']} — {res['case']['title']}"]
    for w in res.get("warnings", []):
        lines.append(f"WARNING: {w['text']}")
    s = res["segments"][0]
    acc = res["accuracy"]
    lines.append(f"  3-D segment: {s['kind']} on a {f.q(s['diameter'], 'length')} shaft, feature at "
                 f"{f.q(s['at'], 'length')} along it; {model_phrase(s.get('model'))}, meshes {acc['meshes']} unknowns, "
                 f"{acc['seconds']:.0f} s")
    if s.get("shoulder"):
        sh = s["shoulder"]
        lines.append(f"  {'the' if s['kind'] == 'shoulder' else 'beside a'} shoulder up to {f.q(sh['D'], 'length')} at {f.q(sh['at'], 'length')}, fillet "
                     f"{f.q(sh['fillet'], 'length')}; nominal stresses on the {f.q(s['diameter'], 'length')} diameter")
    lines.append("")
    lines.append(f"  {'factor':<14} {'FE':>7} {'estimate':>9} {'chart':>7}  peak (x, y, z)")
    for k in _KEYS:
        g, c = s[f"{k}_gci"], s[f"{k}_chart"]
        at = ", ".join(f.q0(v, "length", s["diameter"]) for v in s["peak_location"][k]["at"])
        lines.append(f"  {k:<14} {s[k]:>7.3f} {'—' if g is None else f'{100 * g:.2g} %':>9} "
                     f"{'—' if c is None else f'{c:.2f}':>7}  ({at})"
                     f"{'' if s['peak_location'][k]['on_feature'] else ' away from the feature'}"
                     f"{'  MODEL TOO SHORT: not a verdict' if s.get(f'{k}_model_too_short') else ''}"
                     f"{' on the shoulder' if s['peak_location'][k].get('feature') == 'shoulder' else ''}")
    for src in dict.fromkeys(s[f"{k}_chart_source"] for k in _KEYS if s.get(f"{k}_chart_source")):
        lines.append(f"  chart: {src}")
    for k in _KEYS:  # also where no factor has one (a chamfered or blind hole, beside a shoulder): say why
        if s.get(f"{k}_chart_why"):
            lines.append(f"  no chart value for {k}: {s[f'{k}_chart_why']}")
    lines.append("")
    if res.get("verdict"):
        lines.append(res["verdict"])
    lines.append("Not checked: no loads, no stresses, no factor of safety; the factors alone (per unit load).")
    return "\n".join(lines)

"""The words of a polymer check (results ``polymer``, compare/checks/polymer.py): the summary block
and the warning text. ``f`` is the report's formatter (compare/output/report.py ``Fmt``)."""
from __future__ import annotations

import html
import math

from .report_combined import CRITERION_LABEL


def polymer_warning_text(w: dict, f) -> str:
    if w["code"] == "polymer_illustrative_data":
        return (f"ILLUSTRATIVE POLYMER DATA: {w['field']} = true ({w['source']}). The strengths, moduli, creep and "
                "stress-life points are invented, so no factor of safety here is a verdict on a real part; use the "
                "supplier's data for the grade and the part's own tests.")
    return w["code"]


def _n(v) -> str:
    return "—" if v is None else ("∞" if not math.isfinite(v) else f"{v:.3g}")


def layout_lines(lt: dict, f) -> list[str]:
    """The layout's deflections and slopes after the service life (results ``polymer_layout``)."""
    head = f"  shaft after {lt['duration'] / 3600:.6g} h at {lt['temperature']:g} °C, {lt['moisture']}"
    if "skipped" in lt:
        return [f"{head}: {lt['skipped']}"]
    md = lt["max_deflection"]
    out = [f"{head}: deflections and slopes × E/E_c = {lt['ratio_E_over_E_creep']:.4g} "
           f"(E {f.q(lt['elastic_modulus'], 'stress')}, E_c {f.q(lt['creep_modulus'], 'stress')})",
           f"      largest deflection {f.q(md['value'], 'length')} at {f.q(md['at'], 'length')} "
           f"(short-term {f.q(md['short_term'], 'length')})"]
    for s in lt["slopes"]:
        out.append(f"      slope at {s['name']} ({s['kind']}): {s['slope']:.3g} rad against {s['limit']:.3g} rad "
                   f"{'ok' if s['ok'] else 'ABOVE THE LIMIT'} (short-term {s['short_term']:.3g} rad)")
    for g in lt["gear_deflections"]:
        out.append(f"      deflection at {g['name']}: {f.q(g['deflection'], 'length')} against {f.q(g['limit'], 'length')} "
                   f"{'ok' if g['ok'] else 'ABOVE THE LIMIT'}")
    out.append(f"      {lt['assumption']}; source: {lt['source']}")
    return out


def polymer_lines(res: dict, f) -> list[str]:
    """The summary block of the polymer check; [] when the case has none."""
    p = res.get("polymer")
    if not p:
        return []
    c, s = p["conditions"], p["strengths"]
    lines = ["Polymer at the service conditions",
             f"  checked at        {c['temperature']:g} °C, {c['moisture']}, service life {c['life'] / 3600:.6g} h, "
             f"{c['cycles']:.4g} cycles ({c['cycles_source']})",
             f"  data              {p['data']['source']}" + ("  [ILLUSTRATIVE]" if p["data"]["illustrative"] else ""),
             f"  tensile strength  {f.q(s['tensile_strength'], 'stress')}" +
             (f"   yield {f.q(s['yield'], 'stress')}" if s.get("yield") is not None else "") +
             f"   E {f.q(s['elastic_modulus'], 'stress')}   G {f.q(s['shear_modulus'], 'stress')} (ν = {s['poisson']:g})",
             f"      read from {s['source']}"]
    fat = p.get("fatigue")
    if fat:
        lines.append(f"  fatigue strength  S_f = {f.q(fat['S_f'], 'stress')} at {fat['cycles']:.4g} cycles (fully reversed)")
        for fit in fat["fits"]:
            lines.append(f"      curve at {fit['temperature']:g} °C: σa = {f.q(fit['A'], 'stress')}·N^({fit['b']:.4g}), "
                         f"r² = {fit['r2']:.4f}, {fit['points']} points over {fit['n_min']:.3g} to {fit['n_max']:.3g} cycles, "
                         f"S_f = {f.q(fit['S_f'], 'stress')}")
        lines.append(f"      source: {fat['source']}")
        lines.append(f"      mean stress: {fat['mean_stress_correction']}")
    nd = p.get("design_factor")
    for crit, n in p["factors"].items():
        verdict = "" if nd is None else ("  (meets the design factor %g)" % nd if n >= nd else "  (BELOW the design factor %g)" % nd)
        lines.append(f"  n = {_n(n)}  {CRITERION_LABEL.get('polymer_' + crit, crit)} at {f.point(p['at'][crit])}: "
                     f"{f.where(p['where'][crit])}{verdict}")
    tw = p["twist"]
    lines.append(f"  twist under the steady torque {f.q(tw['torque'], 'moment')}: short-term {f.q(tw['short_term'], 'twist')}"
                 + (f", after {tw['duration'] / 3600:.6g} h {f.q(tw['long_term'], 'twist')} "
                    f"(creep modulus E_c = {f.q(tw['creep_modulus'], 'stress')}, G_c = {f.q(tw['creep_shear_modulus'], 'stress')})"
                    if "long_term" in tw else " (no creep data: long-term twist not computed)"))
    if "long_term" in tw:
        lines.append(f"      source: {tw['source']}; {tw['assumption']}")
    if res.get("polymer_layout"):
        lines += layout_lines(res["polymer_layout"], f)
    for note in p.get("notes", []):
        lines.append(f"  note: {note}")
    lines.append("  not checked: " + "; ".join(p["not_checked"]))
    lines.append(f"  {p['caution']}")
    return lines


def polymer_html(res: dict, f) -> str:
    """The polymer block for report.html (in 'Static and fatigue factors of safety'); '' without one."""
    lines = polymer_lines(res, f)
    if not lines:
        return ""
    body = "\n".join(line[2:] if line.startswith("  ") else line for line in lines[1:])
    return f"<h3>{html.escape(lines[0])}</h3><pre>{html.escape(body)}</pre>"

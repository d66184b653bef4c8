"""The designer's checklist in words, in the case's units: the terminal block, the headline rows
(results.csv and the summary table) and the report's section, all from the results.json blocks
``keys``, ``splines``, ``press_fits``, ``shaft.bearing_life`` and ``shaft.torsional``."""
from __future__ import annotations

import html
import math

from ..case.units import from_si
from .report import Fmt


def _rpm(w) -> str:
    return "—" if w is None else f"{w:.4g} rad/s ({w * 30 / math.pi:.4g} rpm)"


def _name(e: dict, f: Fmt) -> str:
    return e.get("name") or f.q(e["at"], "length", 4)


def _n(v) -> str:
    return "—" if v is None else f"{v:.3g}"


def checklist_lines(res: dict, system, fmt: Fmt | None = None) -> list[str]:
    """The lines of the checklist (no heading); empty when the case has none of it. ``fmt``: the
    number formatter (the layout report's writes large moments in engineering notation)."""
    f = fmt or Fmt(system)
    sh = res.get("shaft") or {}
    lines = []
    for k in res.get("keys") or []:
        n = k["factors"]
        lines.append(f"  key {_name(k, f)} (keyway {k['keyway']}, {f.q(k['width'], 'length', 4)} × "
                     f"{f.q(k['height'], 'length', 4)}, {f.q(k['length'], 'length', 4)} long; T "
                     f"{f.q(k['torque'], 'moment', 4)}{'' if k['keys'] == 1 else ', ' + k['share']}): shear "
                     f"{f.q(k['shear_stress'], 'stress', 4)} (n {_n(n['shear'])}), bearing shaft side "
                     f"{f.q(k['bearing_stress_shaft'], 'stress', 4)} (n {_n(n['bearing_shaft'])}), hub side "
                     f"{f.q(k['bearing_stress_hub'], 'stress', 4)} (n {_n(n['bearing_hub'])})")
        if k["required_length"]:
            lines.append(f"    length for n = {k['design_factor']:g}: {f.q(k['required_length']['governing'], 'length', 4)}"
                         f" — {'ok' if k['ok'] else 'TOO SHORT'}")
    for s in res.get("splines") or []:
        lines.append(f"  spline {_name(s, f)} (T {f.q(s['torque'], 'moment', 4)}, {s['teeth']} teeth, engagement "
                     f"{f.q(s['length'], 'length', 4)}): tooth shear {f.q(s['shear_stress'], 'stress', 4)}"
                     f" (n {_n(s['shear_factor'])}), flank pressure {f.q(s['bearing_pressure'], 'stress', 4)} "
                     "(simplified formulas from memory; the spline standard's rating governs)")
    for p in res.get("press_fits") or []:
        if p["fit_lost"]:
            lines.append(f"  press fit {_name(p, f)}: NO INTERFERENCE LEFT at the operating temperatures")
            continue
        lines.append(f"  press fit {_name(p, f)} (interference {f.q(p['interference_operating'], 'length', 4)}): "
                     f"pressure {f.q(p['contact_pressure'], 'stress', 4)}, hub σt {f.q(p['hub_tangential'], 'stress', 4)}"
                     f" (n {_n(p['hub_factor'])}), shaft σt {f.q(p['shaft_tangential'], 'stress', 4)} "
                     f"(n {_n(p['shaft_factor'])}); holds {f.q(p['torque_capacity'], 'moment', 4)} "
                     f"({_n(p['slip_factor_torque'])} × the torque) and {f.q(p['axial_capacity'], 'force', 4)} axially")
    for b in sh.get("bearing_life") or []:
        if "skipped" in b:
            lines.append(f"  bearing {b['name'] or f.q(b['at'], 'length', 4)}: no rating life ({b['skipped']})")
            continue
        hours = (f", {b['L10_hours']:.4g} h" if "L10_hours" in b else " (no speed: hours not given)")
        need = ""
        if b.get("required_life_hours") is not None and "ok" in b:
            need = f", required {b['required_life_hours']:g} h — {'ok' if b['ok'] else 'TOO SHORT'}"
        lines.append(f"  bearing {b['name'] or f.q(b['at'], 'length', 4)}: P {f.q(b['P'], 'force', 4)}, C "
                     f"{f.q(b['C'], 'force', 4)}, L10 {b['L10_revolutions'] / 1e6:.4g} million rev{hours}{need} "
                     "(basic rating life; adjusted-life factors not included)")
    tor = sh.get("torsional")
    if tor:
        for bt in tor["between"]:
            a = bt["angle"]
            lines.append(f"  twist from {bt['from']} to {bt['to']}: {math.degrees(a['fe']):.4g}° "
                         f"({'hand, ΣGᵢJᵢ on composite segments' if tor.get('composite') else 'round bars'}: "
                         f"{math.degrees(a['classic']):.4g}°)")
        fr = tor["frequencies"]
        if "skipped" in fr:
            lines.append(f"  torsional frequencies: not computed ({fr['skipped']})")
        else:
            text = "  torsional natural frequencies: " + ", ".join(_rpm(w) for w in fr["values"])
            if fr.get("speed"):
                text += (f"; operating {_rpm(fr['speed'])}, first at {fr['ratios'][0]:.3g} × — "
                         f"{'ok' if fr['ok'] else 'TOO CLOSE'} (±{fr['margin']:.0%}, common practice)")
            lines.append(text)
    return lines


def checklist_summary(res: dict, system) -> str:
    """The terminal block (empty without a checklist)."""
    lines = checklist_lines(res, system)
    return "\n".join(["Keys, fits, splines, bearings, torsion along the shaft"] + lines) if lines else ""


def checklist_rows(res: dict, system) -> list[dict]:
    """Headline rows (same columns as compare/output/headline.py's)."""
    f = Fmt(system)
    rows = []

    def add(quantity, v, dim, key, source="", hand=None, unit=None):
        if v is None:
            return
        unit = unit if unit is not None else "" if dim == "dimensionless" else f.s.label(dim)
        rows.append({"group": "checklist", "quantity": quantity, "value": from_si(v, dim, f.s), "unit": unit,
                     "hand_value": None if hand is None else from_si(hand, dim, f.s),
                     "ratio": None if not hand else v / hand, "source": source, "estimated_error": None,
                     "results_json_key": key})

    for i, k in enumerate(res.get("keys") or []):
        who = f"key {k.get('name') or i} [{k['keyway']}]"
        add(f"{who}: shear stress", k["shear_stress"], "stress", f"keys[{i}].shear_stress", k["source"])
        add(f"{who}: bearing stress, shaft side", k["bearing_stress_shaft"], "stress", f"keys[{i}].bearing_stress_shaft",
            k["source"])
        add(f"{who}: bearing stress, hub side", k["bearing_stress_hub"], "stress", f"keys[{i}].bearing_stress_hub",
            k["source"])
        add(f"{who}: lowest n", k["factor"], "dimensionless", f"keys[{i}].factor", k["source"])
        if k["required_length"]:
            add(f"{who}: length for n = {k['design_factor']:g}", k["required_length"]["governing"], "length",
                f"keys[{i}].required_length.governing", k["source"])
    for i, s in enumerate(res.get("splines") or []):
        who = f"spline {s.get('name') or i}"
        add(f"{who}: tooth shear", s["shear_stress"], "stress", f"splines[{i}].shear_stress", s["source"])
        add(f"{who}: flank pressure", s["bearing_pressure"], "stress", f"splines[{i}].bearing_pressure", s["source"])
    for i, p in enumerate(res.get("press_fits") or []):
        who = f"press fit {p.get('name') or i}"
        add(f"{who}: contact pressure", p["contact_pressure"], "stress", f"press_fits[{i}].contact_pressure", p["source"])
        add(f"{who}: torque it holds", p["torque_capacity"], "moment", f"press_fits[{i}].torque_capacity", p["source"])
        add(f"{who}: hub n", p["hub_factor"], "dimensionless", f"press_fits[{i}].hub_factor", p["source"])
    for i, b in enumerate((res.get("shaft") or {}).get("bearing_life") or []):
        who = f"bearing {b['name'] or i}"
        if "L10_hours" in b:
            add(f"{who}: basic rating life L10", b["L10_hours"], "dimensionless", f"shaft.bearing_life[{i}].L10_hours",
                b["source"], unit="h")
        elif "L10_revolutions" in b:
            add(f"{who}: basic rating life L10", b["L10_revolutions"], "dimensionless",
                f"shaft.bearing_life[{i}].L10_revolutions", b["source"], unit="rev")
    tor = (res.get("shaft") or {}).get("torsional")
    if tor:
        for i, bt in enumerate(tor["between"]):
            a = bt["angle"]
            rows.append({"group": "checklist", "quantity": f"twist {bt['from']} to {bt['to']}", "value": a["fe"],
                         "unit": "rad", "hand_value": a["classic"], "ratio": a["fe"] / a["classic"] if a["classic"] else None,
                         "source": a["source"], "estimated_error": None,
                         "results_json_key": f"shaft.torsional.between[{i}].angle.fe"})
        fr = tor["frequencies"]
        if fr.get("values"):
            rows.append({"group": "checklist", "quantity": "first torsional natural frequency", "value": fr["values"][0],
                         "unit": "rad/s", "hand_value": None, "ratio": None, "source": fr["method"],
                         "estimated_error": None, "results_json_key": "shaft.torsional.frequencies.values[0]"})
    return rows


def checklist_html(res: dict, system, fmt: Fmt | None = None) -> str:
    """The report's section: the same lines as the terminal, and the cautions."""
    lines = checklist_lines(res, system, fmt)
    if not lines:
        return "<p>Not given for this case (keys, fits and splines at stations, bearing ratings and torsion need a " \
               "shaft layout).</p>"
    e = html.escape
    items = "".join(f"<li>{e(x.strip())}</li>" for x in lines)
    return (f"<ul>{items}</ul><p class=\"small\">Keys: nominal stresses with the torque spread evenly over the key's "
            "length (Shigley, 9th ed., Sec. 7-7); the real pressure peaks where the torque enters the hub. Press fits: "
            "Lamé's thick cylinders, plane stress, hub as long as its seat; fretting at the hub's ends lowers the "
            "shaft's fatigue strength. Splines: simplified formulas from memory; the spline standard's rating governs. "
            "Bearings: basic rating life L10 (ISO 281) only; adjusted-life factors are not included. Torsion: "
            "natural frequencies of the shaft free in rotation at its bearings, no damping, no driver or driven "
            f"machine beyond the inertias given.</p>")



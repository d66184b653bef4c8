"""The headline table: one row per result a designer files (quantity, value, unit, hand value,
ratio, source, estimated error), in the case's units. ``results.csv`` and the terminal summary's
table are both written from these rows, so they cannot disagree."""
from __future__ import annotations

import csv
import io

from ..case.units import from_si
from .report import ROUND_OFF, Fmt, no_verdict_label
from .report_checklist import checklist_rows
from .report_combined import LABELS

#: convergence key of each results entry whose error the study estimates
_ERROR_OF = {"torsion.J": "J", "torsion.tau_max": "tau_max", "shear.kappa_x": "kappa_x", "shear.kappa_y": "kappa_y",
             "shear.centre[0]": "shear_centre_x", "shear.centre[1]": "shear_centre_y"}

COLUMNS = ("group", "quantity", "value", "unit", "hand_value", "ratio", "source", "estimated_error", "results_json_key")


def _get(res: dict, key: str):
    v = res
    for part in key.replace("]", "").replace("[", ".").split("."):
        if v is None:
            return None
        v = v[int(part)] if part.isdigit() else v.get(part)
    return v


def headline_rows(res: dict, system) -> list[dict]:
    """The rows; ``value`` and ``hand_value`` are numbers in the case's units (None where absent),
    ``estimated_error`` the study's relative error estimate (GCI) where it has one."""
    f = Fmt(system)
    rows: list[dict] = []
    # with a sharp re-entrant corner the stress is unbounded: the peaks and factors below are for the
    # rest of the section only, and every such row says so
    nv = bool((res.get("governing") or {}).get("no_verdict") or res["torsion"].get("singular_corners"))
    size = res["section"]["area"] ** 0.5
    conv = res.get("convergence", {})

    def add(group, quantity, key, dim, hand=None, source="", scale=None):
        v = _get(res, key)
        if v is None:
            return
        if scale is not None and abs(v) < ROUND_OFF * abs(scale):
            v = 0.0  # round-off of a symmetric section, not a result
        ck = _ERROR_OF.get(key)
        err = (conv.get(ck) or {}).get("gci") if ck else None
        if nv and group in ("combined", "static", "fatigue", "polymer") or nv and key.endswith("tau_max"):
            quantity += (f" [NO VERDICT: {no_verdict_label(res['governing'])}]" if (res.get("governing") or {}).get("reason_text")
                         else " [not at the sharp corners: NO VERDICT]")
        unit = "" if dim == "dimensionless" else f.s.label(dim)
        hv = None if hand is None else from_si(hand, dim, f.s)
        ratio = None if hand in (None, 0) else v / hand
        rows.append({"group": group, "quantity": quantity, "value": from_si(v, dim, f.s), "unit": unit,
                     "hand_value": hv, "ratio": ratio, "source": source, "estimated_error": err,
                     "results_json_key": key})

    s = res["section"]
    add("section", "area A", "section.area", "area")
    add("section", "Ixx", "section.Ixx", "second_moment")
    add("section", "Iyy", "section.Iyy", "second_moment")
    add("section", "Ixy", "section.Ixy", "second_moment", scale=max(s["Ixx"], s["Iyy"]))
    pairs = {p["quantity"]: p for p in res.get("compare", [])}
    jp = next((p for q, p in pairs.items() if q.startswith("J") and p.get("classic") is not None), None)
    add("torsion", "torsion constant J", "torsion.J", "second_moment", jp and jp["classic"], jp["source"] if jp else "")
    t = res["torsion"]
    nom = t.get("kts_nominal") or {}
    add("torsion", "torsion τmax", "torsion.tau_max", "stress", nom.get("tau_nominal") if t.get("kts") is not None else None,
        f"nominal {nom.get('formula', '')}: {nom.get('source', '')}" if t.get("kts") is not None else "")
    add("torsion", "Kts (τmax / nominal on the minor diameter)" if s["kind"] == "spline" else "Kts (τmax / nominal)",
        "torsion.kts", "dimensionless")
    if "centre" in res.get("shear", {}):
        add("shear", "shear centre x", "shear.centre[0]", "length", scale=size)
        add("shear", "shear centre y", "shear.centre[1]", "length", scale=size)
        add("shear", "κx (energy)", "shear.kappa_x", "dimensionless")
        add("shear", "κy (energy)", "shear.kappa_y", "dimensionless")
        add("shear", "shear τmax", "shear.tau_max", "stress")
    add("combined", "von Mises max (worst instant)", "combined.von_mises_max", "stress")
    add("combined", "σ1 max", "combined.sigma1_max", "stress")
    st = res.get("static", {})
    for k in st.get("criteria", []):
        add("static", f"n, {LABELS.get(k, k)} (FE)", f"static.{k}", "dimensionless", source=st["sources"].get(k, ""))
    ft = res.get("fatigue", {})
    hand = ft.get("hand", {})
    for k in ft.get("criteria", []):
        hv = hand.get(k)
        add("fatigue", f"n, {LABELS.get(k, k)} (FE; hand beside)", f"fatigue.{k}", "dimensionless", hv,
            ft.get("sources", {}).get(k, ""))
    pol = res.get("polymer") or {}  # a polymer at its service conditions (compare/checks/polymer.py)
    if pol:
        c = pol["conditions"]
        add("polymer", f"checked at the service temperature ({c['moisture']}, {c['life'] / 3600:.6g} h, "
            f"{c['cycles']:.3g} cycles)", "polymer.conditions.temperature", "temperature",
            source=pol["data"]["source"] + (" [ILLUSTRATIVE]" if pol["data"]["illustrative"] else ""))
    for k in pol.get("factors", {}):
        add("polymer", f"n, {LABELS.get('polymer_' + k, k)} (FE)", f"polymer.factors.{k}", "dimensionless",
            source=(pol.get("sources") or {}).get(k, ""))
    add("polymer", "fatigue strength S_f at the service cycles", "polymer.strengths.fatigue_strength", "stress",
        source=(pol.get("fatigue") or {}).get("source", ""))
    add("polymer", "long-term twist (creep modulus)", "polymer.twist.long_term", "twist",
        source=(pol.get("twist") or {}).get("source", ""))
    g = res.get("governing")
    if g and not g.get("no_verdict"):
        add("governing", f"lowest n ({LABELS.get(g['criterion'], g['criterion'])}, {g['path']} path)",
            "governing.factor", "dimensionless")
    for i, sl in enumerate(res.get("section_loads") or []):  # stations checked along a feature's length
        ext = sl.get("extent")
        if not ext:
            continue
        name = sl["name"] or f"station {i}"
        add("stations", f"{name}: governing loads taken at z (along its feature)", f"section_loads[{i}].used_at",
            "length")
        gi = ext["governing"]["index"]
        add("stations", f"{name}: bending moment |M| there", f"section_loads[{i}].extent.candidates[{gi}].M", "moment")
        crit = ext["governing"]["criterion"]
        if ext["governing"]["factor"] is not None:
            add("stations", f"{name}: lowest n along its feature ({LABELS.get(crit, crit)})",
                f"section_loads[{i}].extent.governing.factor", "dimensionless")
    rows += feature_rows(res)
    acc = res.get("accuracy")
    if acc and acc.get("achieved") is not None:
        rows.append({"group": "accuracy", "quantity": "largest estimated error (GCI)", "value": acc["achieved"],
                     "unit": "1", "hand_value": None, "ratio": None, "source": "three-mesh study",
                     "estimated_error": None, "results_json_key": "accuracy.achieved"})
    rows += checklist_rows(res, system)  # keys, fits, splines, bearing life, torsion along the shaft (layouts)
    return rows


def layout_rows(res: dict, system) -> list[dict]:
    """The rows of a shaft layout beside the governing station's: one per station (its lowest factor of
    safety), one per shoulder or groove factor (FE beside the chart, with its error estimate), the
    reactions, the largest deflection and the first critical speed."""
    f = Fmt(system)
    sh = res.get("shaft") or {}
    rows: list[dict] = []

    def row(group, quantity, value, dim, key, hand=None, source="", err=None):
        unit = "" if dim == "dimensionless" else ("rad" if dim == "rad" else "rpm" if dim == "rpm" else f.s.label(dim))
        conv = (lambda v: v) if dim in ("dimensionless", "rad", "rpm") else (lambda v: from_si(v, dim, f.s))
        rows.append({"group": group, "quantity": quantity, "value": None if value is None else conv(value), "unit": unit,
                     "hand_value": None if hand is None else conv(hand),
                     "ratio": None if hand in (None, 0) or value is None else value / hand, "source": source,
                     "estimated_error": err, "results_json_key": key})

    for i, st in enumerate(res.get("section_loads", [])):
        gov = st["results"].get("governing") or {}
        who = f"station {i + 1} ({st['name'] or ''} at {f.q(st['at'], 'length', 5)})"
        if gov.get("no_verdict"):
            row("station", f"{who}: NO VERDICT (unbounded stress at a sharp corner)", None, "dimensionless",
                f"section_loads[{i}].results.governing")
        elif gov.get("factor") is not None:
            row("station", f"{who}: lowest n ({LABELS.get(gov['criterion'], gov['criterion'])}, {gov.get('path', 'composite')} path)",
                gov["factor"], "dimensionless", f"section_loads[{i}].results.governing.factor")
    # the shoulder and groove factors have their rows in headline_rows (feature_rows), chart wording included
    for i, rc in enumerate(sh.get("reactions") or []):
        row("reaction", f"|F| at support {rc['name'] or i + 1}", rc["F"], "force", f"shaft.reactions[{i}].F")
    if sh.get("max_deflection"):
        row("stiffness", "largest deflection", sh["max_deflection"]["value"], "length", "shaft.max_deflection.value")
    for i, s in enumerate(sh.get("slopes") or []):
        row("stiffness", f"slope at {s['kind']} {s['name'] or ''} (limit as hand value)", s["slope"], "rad",
            f"shaft.slopes[{i}].slope", s["limit"], s["source"])
    cs = sh.get("critical_speeds") or {}
    if cs.get("values"):
        row("critical speed", "first critical speed (beam model; Rayleigh as hand value)", cs["values"][0] * 60 / (2 * 3.141592653589793),
            "rpm", "shaft.critical_speeds.values[0]", cs["rayleigh"] * 60 / (2 * 3.141592653589793), cs["rayleigh_source"])
    return rows


_FEATURE_FACTORS = {"kt_bending": "Kt bending", "kt_axial": "Kt axial", "kts": "Kts torsion"}


def feature_rows(res: dict) -> list[dict]:
    """A row per FE factor of each shoulder and groove (``shaft.features``), with its error estimate. The
    chart fit stands beside it as the hand value only where it agrees with the FE within the fit's stated
    accuracy; elsewhere the source says that the remembered fit is off there and the FE is to be trusted
    (no ratio is given that would make the FE look wrong)."""
    rows = []
    for i, ft in enumerate((res.get("shaft") or {}).get("features") or []):
        for key, label in _FEATURE_FACTORS.items():
            if ft.get(key) is None:
                continue
            ch = ft.get(f"{key}_chart") or {}
            hand = ch.get("value")
            if hand is not None and ch.get("disagrees_with_fe"):
                side = "below" if ch["chart_minus_fe"] < 0 else "above"
                source = (f"{ch['source']}: the fit gives {hand:.4g}, {abs(100 * ch['chart_minus_fe']):.0f} % {side} the "
                          f"FE, beyond the ±{100 * ch['allowed']:.2g} % its stated accuracy and the FE's error estimate "
                          "allow; the remembered fit is off here, trust the FE value")
                hand = None
            elif hand is not None:
                source = ch["source"]
            else:
                source = f"no chart value ({ch.get('why')})" if ch else ""
            rows.append({"group": "shoulders and grooves", "quantity": f"{label} at {ft['field']}", "value": ft[key],
                         "unit": "", "hand_value": hand, "ratio": None if hand is None else ft[key] / hand,
                         "source": source, "estimated_error": ft.get(f"{key}_gci"),
                         "results_json_key": f"shaft.features[{i}].{key}"})
    return rows


def csv_text(rows: list[dict]) -> str:
    """``results.csv``: the rows with a header line; numbers written in full (repr), empty where absent."""
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(COLUMNS)
    for r in rows:
        w.writerow(["" if r[c] is None else (repr(float(r[c])) if isinstance(r[c], (int, float)) else r[c])
                    for c in COLUMNS])
    return buf.getvalue()

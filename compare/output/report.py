"""The terminal summary, in the case's own units (results.json stays SI)."""
from __future__ import annotations

import numpy as np

from ..case.units import SYSTEMS, UnitSystem, from_si
from ..checks.feature_bound import BOUND_REASON
from ..checks.segment_far_field import TOO_SHORT_REASON, far_field_text
from ..checks.segment_local import NOT_SHOWN_REASON
from .report_combined import CRITERION_LABEL, combined_lines
from .report_features import factors_only_summary, feature_lines, feature_warning_text
from .report_geometry import geometry_lines
from .report_polymer import polymer_lines, polymer_warning_text
from .section_geometry import SECTION_WARNINGS, section_warning_text
from .words_composite import composite_warning_text

CAUTION = ("shaftcheck is a cross-check aid for the designer. It does not replace the governing codes and "
           "standards, the full design calculation, or the judgement of a licensed engineer, who decide.")

_DIMS = {"second_moment": "second_moment", "area": "area", "stress": "stress", "length": "length"}


def num(v: float, digits: int = 5) -> str:
    """Significant digits, positional notation across the usual engineering range."""
    if v == 0 or 1e-3 <= abs(v) < 1e7:
        return np.format_float_positional(v, precision=digits, unique=False, fractional=False, trim="-")
    return f"{v:.{digits - 1}e}"


#: Relative size below which a printed value is round-off and shown as 0: a centroid at 1e-11 of the
#: section size on a symmetric section, or a shear centre 1e-9 off its symmetry line, is not a result (the
#: solves are converged far below 1e-7 of the section's size, and no design reads digits that fine).
ROUND_OFF = 1e-7


class Fmt:
    def __init__(self, system: UnitSystem | None):
        self.s = system or SYSTEMS["mm-N-MPa"]

    def q(self, value, dimension: str, digits: int = 5) -> str:
        if value is None:
            return "—"
        if dimension == "per_cubic":  # stress per unit torque: show as stress for a unit torque
            v = from_si(value, "stress", self.s) * from_si(1.0, "moment", self.s) ** -1 * 1.0
            return f"{num(v, digits)} {self.s.label('stress')} per {self.s.label('moment')}"
        v = from_si(value, dimension, self.s)
        unit = self.s.label(dimension)
        return f"{num(v, digits)} {unit}".rstrip()

    def q0(self, value, dimension: str, scale: float, digits: int = 5) -> str:
        """Like :meth:`q`, with round-off shown as 0: |value| below 1e-9 of ``scale`` (a size of the same
        dimension) is the solver's noise, not a result."""
        if value is not None and scale and abs(value) < ROUND_OFF * abs(scale):
            value = 0.0
        return self.q(value, dimension, digits)

    def point(self, xy, scale: float | None = None) -> str:
        x, y = (from_si(c, "length", self.s) for c in xy)
        if scale:
            tiny = ROUND_OFF * from_si(scale, "length", self.s)
            x, y = (0.0 if abs(c) < tiny else c for c in (x, y))
        return f"({num(x)}, {num(y)}) {self.s.label('length')}"

    def where(self, loc: dict) -> str:
        parts = []
        if loc.get("boundary"):
            feat = loc.get("feature") or ""
            if loc.get("radius") is not None and feat in ("fillet", "arc"):
                feat += f" r = {self.q(loc['radius'], 'length', 4)}"
            parts.append(f"{loc['boundary']} boundary, {feat}")
        else:
            parts.append("inside the section")
        if loc.get("keyway"):
            parts.append(f"keyway {loc['keyway']}")
        parts.append(f"{loc['angle_deg']:.1f}° around, {self.q(loc['distance_from_axis'], 'length', 4)} from the axis")
        return "; ".join(parts)


_CRIT = {"von_mises": "static yield, von Mises", "tresca": "static yield, Tresca",
         "coulomb_mohr": "static fracture, Coulomb–Mohr", "modified_mohr": "static fracture, modified Mohr",
         "goodman": "fatigue, DE-Goodman", "gerber": "fatigue, DE-Gerber", "asme_elliptic": "fatigue, DE-ASME elliptic",
         "soderberg": "fatigue, DE-Soderberg", "yield_langer": "first-cycle yield, Langer",
         "first_cycle_yield": "first-cycle yield, von Mises at the peak"}


def no_verdict_label(gov: dict) -> str:
    """Why a station's 3-D feature, or a shoulder or groove factor's error bound, left it without a
    verdict, in a few words (its governing record's ``reason``, compare/checks/segment_local.py and
    compare/checks/feature_bound.py)."""
    reason = gov.get("reason") or ""
    words = [w for w, hit in (("3-D accuracy not shown", NOT_SHOWN_REASON in reason),
                              ("3-D model too short", TOO_SHORT_REASON in reason),
                              ("margin within a feature factor's error bound", BOUND_REASON in reason)) if hit]
    return " and ".join(words) or "3-D accuracy not shown"


def warning_text(w: dict, f: Fmt) -> str:
    """One warning record of :mod:`compare.findings` in words, in the case's units."""
    code = w["code"]
    if code.startswith("polymer_"):  # a polymer's own data (compare/output/report_polymer.py)
        return polymer_warning_text(w, f)
    if code.startswith("composite_"):  # a composite section's own (compare/output/words_composite.py)
        return composite_warning_text(w)
    if code.startswith("feature_"):  # shoulders and grooves of [shaft]
        return feature_warning_text(w, f) or code
    if code in SECTION_WARNINGS:
        return section_warning_text(w, f)
    if code == "segment_station_accuracy_not_met":  # a station's 3-D feature (compare/checks/segment_local.py)
        ach = "unknown" if w.get("achieved") is None else f"{100 * w['achieved']:.3g} %"
        why = f" ({w['limited_by']})" if w.get("limited_by") else ""
        return (f"NO VERDICT: ACCURACY TARGET NOT SHOWN by the 3-D study of the station's {w['kind'].replace('_', ' ')} "
                f"({w['field']}): target {100 * w['target']:.3g} %, estimated error {ach}{why}. Its Kt, Kts and local "
                "stresses are estimates with that uncertainty, not a verdict; the factors shown are kept beside, marked.")
    if code == "segment_station_too_short":  # a station's 3-D model too short (compare/checks/segment_local.py)
        return far_field_text(w, f.q)
    if code == "sharp_corner_no_verdict":
        where = []
        for c in w["corners"]:
            bits = [f.point(c["at"])]
            if c.get("keyway"):
                bits.append(f"keyway {c['keyway']}")
            if c.get("boundary"):
                bits.append(f"{c['boundary']} boundary")
            where.append(" ".join([bits[0], f"({', '.join(bits[1:])})" if len(bits) > 1 else ""]).strip())
        lo, hi = w["keyway_radii"]
        fix = (f"give the real keyway bottom radius as section.keyways[].fillet (the metric key standards ISO/R773 and "
               f"DIN 6885-1 give {f.q(lo, 'length', 2)} to {f.q(hi, 'length', 2)}, depending on the key size)"
               if w.get("keyed") else "give the corner its real radius (a fillet on the primitive)")
        return (f"NO VERDICT: sharp re-entrant corner{'s' if len(where) > 1 else ''} at {'; '.join(where)}. The stress "
                "there is unbounded, so this section has no peak stress, no Kts and no factor of safety; no material "
                f"can be said to meet the design factor. To get one, {fix}.")
    if code == "factor_below_one":
        c = w.get("criterion")
        crit = _CRIT.get(c, CRITERION_LABEL.get(c, c or ""))
        away = " even away from the sharp corners" if w.get("away_from_corners") else ""
        return (f"FACTOR OF SAFETY BELOW 1: n = {w['factor']:.3g} ({crit}, {w.get('path')} path){away}: the section is "
                "predicted to fail under these loads, whatever the design factor.")
    if code == "self_check_failed":
        return (f"SELF-CHECK FAILED: {w['check']} (value {_g(w.get('value'))}, limit {_g(w.get('limit'))}): the solution "
                "has detected its own failure; its numbers are not checked results.")
    if code == "accuracy_not_met":
        ach = "unknown" if w.get("achieved") is None else f"{100 * w['achieved']:.3g} %"
        reasons = list(w.get("because") or []) or ([w["limited_by"]] if w.get("limited_by") else [])
        why = f" ({'; '.join(reasons)})" if reasons else ""
        return (f"ACCURACY TARGET NOT SHOWN: target {100 * w['target']:.3g} %, estimated error {ach}{why}: the numbers "
                "carry that error at best, not the target.")
    if code == "open_section":
        what = w.get("label") or f"cut step {w['step']}"
        return (f"OPEN SECTION: {what} joins a hole of the section to the outside (holes: "
                f"{w['holes_without']} without it, {w['holes_with']} with it). A section is repeated along the whole "
                "shaft: this describes a slit running the full length (an open section, far weaker in torsion), not a "
                "local radial hole. For a drilled cross hole use a published Kt for a transverse hole instead.")
    if code == "short_feature":
        return (f"2-D MODEL OF A 3-D FEATURE: {w['field']} is {f.q(w['length'], 'length', 4)} long along the shaft, "
                f"less than the section's width {f.q(w['width'], 'length', 4)}. The 2-D model describes a slot running "
                "the whole length, not a local feature: its J, stiffness and stresses are those of the long slot.")
    return code


def _g(v) -> str:
    return "—" if v is None else (f"{v:.3g}" if isinstance(v, (int, float)) else str(v))


def summary(res: dict, system: UnitSystem | None) -> str:
    f = Fmt(system)
    if res.get("factors_only"):  # a layout asking for the shoulder and groove factors only
        return factors_only_summary(res, f)
    s, t = res["section"], res["torsion"]
    lines = [f"shaftcheck {res['tool']['version']} — {res['case']['title']}",
             f"units: {f.s.name}   mesh: {res['mesh']['elements']} curved P2 triangles, {res['mesh']['dofs']} DOFs",
             ""]
    for w in res.get("warnings", []):
        lines.append(f"WARNING: {w['text']}")
    if res.get("warnings"):
        lines.append("")
    gov = res.get("governing")
    if gov and gov.get("no_verdict"):
        lines += ["GOVERNING: none — a section with a sharp re-entrant corner has no factor of safety (see above); "
                  "the factors printed below are for the rest of the section only and are not a verdict", ""]
    elif gov:
        lines += [f"GOVERNING: {gov['text']}", ""]
    size = s["area"] ** 0.5
    lines += [
        "Section",
        f"  area A            {f.q(s['area'], 'area')}",
        f"  centroid          {f.point(s['centroid'], size)}",
        f"  Ixx, Iyy, Ixy     {f.q(s['Ixx'], 'second_moment')}, {f.q(s['Iyy'], 'second_moment')}, "
        f"{f.q0(s['Ixy'], 'second_moment', max(s['Ixx'], s['Iyy']))}",
        f"  I1, I2 at {s['principal_angle_deg']:.2f}°   {f.q(s['I1'], 'second_moment')}, {f.q(s['I2'], 'second_moment')}",
        f"  FE vs exact boundary integral: largest relative difference {max(s['fe_vs_boundary_integral'].values()):.1e}",
        *geometry_lines(s.get("geometry"), f),
        "",
        "Torsion (Saint-Venant)",
        f"  J (stress function, lower bound)   {f.q(t['J'], 'second_moment', 7)}",
        f"  J (warping function, upper bound)  {f.q(t['J_warping'], 'second_moment', 7)}   gap {t['J_relative_gap']:.1e}",
        f"  torque T          {f.q(t['torque'], 'moment')}",
        f"  τmax              {f.q(t['tau_max'], 'stress')}   (warping solution: {f.q(t['tau_max_warping'], 'stress')}, "
        f"difference {t['peak_relative_difference']:.1e})",
        f"  τmax at           {f.point(t['tau_max_at'])}: {f.where(t['tau_max_where'])}",
        f"  twist θ = T/(GJ)  {f.q(t['twist_per_length'], 'twist')}",
    ]
    if t.get("singular_corners"):
        pts = ", ".join(f.point(p) for p in t["singular_corners"])
        lines.append(f"  {len(t['singular_corners'])} sharp re-entrant corner(s) at {pts}: the stress there is unbounded; "
                     "τmax above is the peak away from them, not the section's peak (see the warning at the top)")
    if t.get("kts") is not None:
        lines.append(f"  Kts               {t['kts']:.4f}   (nominal {t['kts_nominal']['formula']})")
    lines += ["", "FE against the hand formulas"]
    for p in res["compare"]:
        if p["kind"] == "not applicable":
            lines.append(f"  {p['quantity']}: no hand formula — {p['note']}")
            continue
        ratio = f"{p['ratio']:.5f}" if p["ratio"] is not None else "—"
        flag = ""
        if p["within_tolerance"] is not None:
            flag = "  ok" if p["within_tolerance"] else "  OUTSIDE TOLERANCE"
        dim = p["dimension"]
        lines.append(f"  {p['quantity']}: FE {f.q(p['fe'], dim)}, hand {f.q(p['classic'], dim)}, ratio {ratio}{flag}")
        lines.append(f"      source: {p['source']}" + (f"; {p['note']}" if p["note"] else ""))
    if "shear" in res:
        lines += ["", *shear_lines(res["shear"], f, size)]
    if "combined" in res:
        lines += ["", *combined_lines(res, f)]
    if "polymer" in res:
        lines += ["", *polymer_lines(res, f)]
    if "accuracy" in res:
        lines += ["", *accuracy_lines(res)]
    lines += ["", *feature_lines(res, f)] if feature_lines(res, f) else []
    lines += ["", "Caution: " + CAUTION]
    return "\n".join(lines)


def shear_lines(sh: dict, f: Fmt, size: float | None = None) -> list[str]:
    if "skipped" in sh:
        return ["Transverse shear", f"  not computed: {sh['skipped']}"]
    out = ["Transverse shear (Saint-Venant flexure, ν = %g)" % sh["poisson"],
           f"  shear centre      {f.point(sh['centre'], size)}  (offset from the centroid "
           f"{f.point(sh['centre_offset_from_centroid'], size)})",
           f"  κx, κy, κxy       {sh['kappa_x']:.5f}, {sh['kappa_y']:.5f}, "
           f"{0.0 if abs(sh['kappa_xy']) < ROUND_OFF else sh['kappa_xy']:.3g}   (energy definition)",
           f"  shear areas       κx·A {f.q(sh['shear_area_x'], 'area')}, κy·A {f.q(sh['shear_area_y'], 'area')}"]
    if "tau_max" in sh:
        where = f.where(sh["tau_max_where"]) if sh["tau_max_on_boundary"] else "inside the section"
        out += [f"  shear force V     ({f.q(sh['force'][0], 'force')}, {f.q(sh['force'][1], 'force')}) through the shear centre",
                f"  τmax              {f.q(sh['tau_max'], 'stress')} at {f.point(sh['tau_max_at'])}: {where}",
                f"  through the shaft axis instead, V also applies a torque of "
                f"{f.q0(sh['torque_from_axis_offset'], 'moment', (size or 0.0) * max(abs(v) for v in sh['force']))}"]
    r = sh["residuals"]
    res_txt = f"resultant {max(abs(v) for v in r['resultant_Vx'] + r['resultant_Vy']):.1e}"
    if "normal_traction" in r:
        res_txt += f", moment about the centre {abs(r['moment_about_centre']):.1e}, |τ·n| on the boundary {r['normal_traction']:.1e} of τmax"
    out.append(f"  residuals         {res_txt}")
    return out


LABELS = {"J": "J", "tau_max": "torsion τmax", "shear_tau_max": "shear τmax", "shear_centre_x": "shear centre x",
          "shear_centre_y": "shear centre y", "kappa_x": "κx", "kappa_y": "κy", "tau_max_corner": "τ at sharp corners"}


def accuracy_lines(res: dict) -> list[str]:
    """What the designer needs: how big the error can be, and whether the numbers can be trusted to
    the target. The technical terms (observed order, asymptotic range) stay in results.json."""
    acc, conv = res["accuracy"], res.get("convergence", {})
    tgt = f"{100 * acc['target']:.3g} %"
    bad_checks = [c for c in res.get("checks", []) if not c["passed"]]
    if acc["met"]:
        head = (f"Accuracy: target {tgt} reached — the numbers above are estimated to be within "
                f"{100 * acc['achieved']:.2g} % of the exact solution of this 2-D model (largest on "
                f"{LABELS.get(acc['governing_quantity'], acc['governing_quantity'])})")
    else:
        head = f"Accuracy: NOT SHOWN to be within the target {tgt}: do not rely on the numbers above to that accuracy"
    out = [head]
    for c in bad_checks:
        out.append(f"  SELF-CHECK FAILED: {c['name']} = {c['value']!s} (limit {c['limit']!s}): the solution is wrong; "
                   "no number above can be trusted")
    if not acc.get("meshes_distinct", True):
        out.append("  the meshes of the study are not refined by the stated ratio: the error is unknown")
    if acc.get("limited_by"):
        out.append(f"  refinement stopped: {acc['limited_by']}; the errors below apply, not the target")
    out.append(f"  meshes compared: {', '.join(str(d) for d in acc['meshes'])} unknowns; "
               f"{acc['adaptive_steps']} adaptive step(s) before them")
    for key, v in conv.items():
        if key == "tau_max_corner":
            out.append(f"  {LABELS[key]:<16} grows without bound as the mesh is refined: no value is given")
            continue
        rel = " of the section size" if v.get("relative_to", "").startswith("section") else ""
        if v["gci"] is None:
            out.append(f"  {LABELS.get(key, key):<16} error unknown (the meshes do not converge on it)")
            continue
        ok = v["gci"] <= acc["target"]
        trust = "within the target" if ok else "ABOVE the target"
        if bad_checks or not acc.get("meshes_distinct", True):
            trust = "not to be trusted (see above)"
        out.append(f"  {LABELS.get(key, key):<16} estimated error up to {100 * v['gci']:.2g} %{rel}: {trust}")
    return out

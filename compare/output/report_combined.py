"""The terminal summary of the combined-stress, static, fatigue and material results, in the case's
units (``f`` is :class:`compare.output.report.Fmt`). results.json stays SI."""
from __future__ import annotations

LABELS = {
    "goodman": "DE-Goodman", "gerber": "DE-Gerber", "asme_elliptic": "DE-ASME elliptic",
    "soderberg": "DE-Soderberg", "yield_langer": "first-cycle yield, Langer",
    "first_cycle_yield": "first-cycle yield, von Mises peak",
    "von_mises": "von Mises", "tresca": "Tresca", "coulomb_mohr": "Coulomb–Mohr", "modified_mohr": "modified Mohr",
    "polymer_static_tensile": "polymer static on the tensile strength",
    "polymer_fatigue_goodman": "polymer fatigue, Goodman on the S–N strength",
}


def governing_line(res: dict) -> str | None:
    g = res.get("governing")
    return g["text"] if g else None


CRITERION_LABEL = {
    "von_mises": "static yield, von Mises", "tresca": "static yield, Tresca",
    "coulomb_mohr": "static fracture, Coulomb–Mohr", "modified_mohr": "static fracture, modified Mohr",
    "goodman": "fatigue, DE-Goodman", "gerber": "fatigue, DE-Gerber", "asme_elliptic": "fatigue, DE-ASME elliptic",
    "soderberg": "fatigue, DE-Soderberg", "yield_langer": "first-cycle yield, Langer",
    "first_cycle_yield": "first-cycle yield, von Mises at the peak",
    "polymer_static_tensile": "polymer static, von Mises against the tensile strength at the service conditions",
    "polymer_fatigue_goodman": "polymer fatigue, Goodman line on the stress-life strength at the service cycles",
}


def governing_text(gov: dict, fatigue: dict, f) -> str:
    """The sentence for the governing factor of safety (:func:`compare.checks.checks.governing`)."""
    n, crit, path, at, where = gov["factor"], gov["criterion"], gov["path"], gov["at"], gov["where"]
    label = CRITERION_LABEL.get(crit, crit)
    nd = gov["design_factor"]
    verdict = "" if nd is None else ("  (meets the design factor %g)" % nd if n >= nd else "  (BELOW the design factor %g)" % nd)
    if path == "FE":
        return f"n = {n:.3g}, {label} (FE local stresses) at {f.point(at)}: {f.where(where)}{verdict}"
    hand = fatigue.get("hand", {})
    return (f"n = {n:.3g}, {label} (hand path: nominal × Kf = {hand['Kf']:.3g}, Kfs = {hand['Kfs']:.3g})"
            + (f"; the FE critical point of that criterion is at {f.point(at)}: {f.where(where)}" if at else "")
            + verdict)


def _n(v) -> str:
    return "—" if v is None else f"{v:.3g}"


def _loads_line(ld: dict, f) -> str:
    m = ld["mean"]
    parts = []
    if ld["rotating"]:
        r = ld["rotating_in_space"]
        parts.append(f"rotating shaft: bending ({f.q(r['bending'][0], 'moment')}, {f.q(r['bending'][1], 'moment')}) and "
                     f"shear ({f.q(r['shear'][0], 'force')}, {f.q(r['shear'][1], 'force')}) fixed in space, fully reversed")
    else:
        parts.append(f"bending mean ({f.q(m['bending'][0], 'moment')}, {f.q(m['bending'][1], 'moment')})")
        parts.append(f"shear mean ({f.q(m['shear'][0], 'force')}, {f.q(m['shear'][1], 'force')})")
    parts.append(f"torque mean {f.q(m['torque'], 'moment')}")
    parts.append(f"axial mean {f.q(m['axial'], 'force')}")
    alt = ld.get("alternating", {})
    dims = {"axial": "force", "torque": "moment", "bending": "moment", "shear": "force"}
    for s, v in alt.items():
        if isinstance(v, list):
            parts.append(f"{s} alternating ({f.q(v[0], dims[s])}, {f.q(v[1], dims[s])})")
        else:
            parts.append(f"{s} alternating {f.q(v, dims[s])}")
    return "; ".join(parts)


def _instant(p: dict) -> str:
    ins = p.get("instant", {})
    return f"  [shaft angle {ins['shaft_angle_deg']:.1f}°]" if "shaft_angle_deg" in ins else ""


def combined_lines(res: dict, f) -> list[str]:
    out: list[str] = []
    c = res.get("combined")
    if not c:
        return out
    pts = {p["criterion"]: p for p in c["points"]}
    vm = pts["von_mises"]
    out += ["Combined stress (FE, every read point, worst instant of the load cycle)",
            f"  loads             {_loads_line(c['loads'], f)}",
            f"  von Mises max     {f.q(c['von_mises_max'], 'stress')} at {f.point(vm['at'])}: {f.where(vm['where'])}{_instant(vm)}",
            f"    there           σ {f.q(vm['sigma'], 'stress')}, τ {f.q(vm['tau'], 'stress')}; σ1, σ2, σ3 "
            f"{f.q(vm['sigma1'], 'stress')}, {f.q(vm['sigma2'], 'stress')}, {f.q(vm['sigma3'], 'stress')} "
            f"(σ1 at {vm['angle_deg']:.1f}° from the axis)",
            f"    Mohr's circle   centre {f.q(vm['mohr']['centre'], 'stress')}, radius {f.q(vm['mohr']['radius'], 'stress')}",
            f"  σ1 max            {f.q(c['sigma1_max'], 'stress')} at {f.point(pts['sigma1']['at'])}{_instant(pts['sigma1'])}",
            f"  σ3 min            {f.q(c['sigma3_min'], 'stress')} at {f.point(pts['sigma3']['at'])}{_instant(pts['sigma3'])}",
            f"  τmax (absolute)   {f.q(c['tau_abs_max'], 'stress')} at {f.point(pts['tresca']['at'])}{_instant(pts['tresca'])}"]
    kt = c.get("kt_bending_2d")
    if kt:
        out.append(f"  bending, 2-D section ratio σmax/(nominal) {kt['value']:.4f} — the second moment lost to the cut, "
                   "not the 3-D keyseat-end factor")
    for note in c.get("notes", []):
        out.append(f"  note: {note}")
    st = res.get("static", {})
    if st.get("criteria"):
        nv = " — away from the sharp corners only, NOT a verdict" if (res.get("governing") or {}).get("no_verdict") else ""
        out += ["", f"Static check (FE local stresses, worst instant){nv}"]
        req = st.get("required_strength", {})
        for k in st["criteria"]:
            line = f"  {LABELS[k]:<17} n = {_n(st[k])} at {f.point(st['at'][k])}: {f.where(st['where'][k])}"
            out.append(line)
        if req:
            nd = st["design_factor"]
            bits = []
            if "yield_von_mises" in req:
                bits.append(f"Sy ≥ {f.q(req['yield_von_mises'], 'stress', 4)} (von Mises), {f.q(req['yield_tresca'], 'stress', 4)} (Tresca)")
            for k in ("coulomb_mohr", "modified_mohr"):
                r = req.get(f"ultimate_{k}")
                if r:
                    bits.append(f"Sut ≥ {f.q(r['ultimate'], 'stress', 4)} with Suc ≥ {f.q(r['compressive_ultimate'], 'stress', 4)} ({LABELS[k]})")
            out.append(f"  required for the design factor {nd:g}: " + "; ".join(bits))
    ft = res.get("fatigue", {})
    if ft.get("criteria"):
        nv = " — away from the sharp corners only, NOT a verdict" if (res.get("governing") or {}).get("no_verdict") else ""
        out += ["", f"Fatigue ({ft['edition']}){nv}"]
        fac = ft.get("factors") or {}
        if fac:
            chain = " × ".join(f"{k} {v['value']:.3f}" for k, v in fac.items())
            out.append(f"  Se = {f.q(ft['Se'], 'stress', 4)} = Se' {f.q(ft['Se_prime'], 'stress', 4)} × {chain}")
            for k, v in fac.items():
                out.append(f"      {k}: {v['source']}")
        else:
            out.append(f"  Se = {f.q(ft['Se'], 'stress', 4)} ({ft['Se_source']})")
        hand = ft.get("hand", {})
        if "skipped" in hand:
            out.append(f"  hand path not computed: {hand['skipped']}")
        else:
            qtxt = "" if hand["q"] is None else (f", r {f.q(hand['notch_radius'], 'length', 4)}, q {hand['q']:.3f}, "
                                                 f"qs {hand['qs']:.3f}")
            out.append(f"  hand path: Kt {hand['Kt']:.3f} ({hand['Kt_source']})")
            out.append(f"             Kts {hand['Kts']:.3f} ({hand['Kts_source']}){qtxt} → Kf {hand['Kf']:.3f}, Kfs {hand['Kfs']:.3f}")
        out.append(f"  {'criterion':<34}{'FE local (q = 1)':>17}{'hand (Kf, Kfs)':>16}{'hand (Kf = Kt)':>16}")
        h1 = hand.get("with_kf_equal_kt", {}) if "skipped" not in hand else {}
        for k in ft["criteria"] + ["first_cycle_yield"]:
            fe_v = ft.get(k) if k != "first_cycle_yield" else ft.get("first_cycle_yield_von_mises")
            out.append(f"  {LABELS[k]:<34}{_n(fe_v):>17}{_n(hand.get(k)):>16}{_n(h1.get(k)):>16}")
        g = ft["fe"].get("goodman") or next(iter(ft["fe"].values()))
        out.append(f"  FE critical point {f.point(g['at'])}: {f.where(g['where'])}; σa' {f.q(g['sigma_a_vm'], 'stress', 4)}, "
                   f"σm' {f.q(g['sigma_m_vm'], 'stress', 4)}")
        for note in hand.get("notes", []) + ft.get("warnings", []):
            out.append(f"  note: {note}")
    mats = res.get("materials")
    if mats:
        ill = " — ILLUSTRATIVE values, not real material data" if mats[0].get("illustrative") else ""
        out += ["", f"Materials ({mats[0]['table']}{ill}), design factor {mats[0]['design_factor']:g}, ranked by margin"]
        for e in mats:
            if e.get("no_verdict"):
                verdict = (f"no verdict ({e['no_verdict']})" if isinstance(e["no_verdict"], str)
                           else "no verdict (unbounded stress at a sharp corner)")
            elif e["meets"] is True:
                verdict = "meets"
            elif e["meets"] is False:
                verdict = "does not meet"
            else:
                verdict = "incomplete check"
            crit = f"{LABELS.get(e['criterion'], e['criterion'])}, {e['path']}" if e["criterion"] else "nothing checkable"
            out.append(f"  {e['rank']}. {e['name']:<28} n = {_n(e['factor'])} ({crit}), margin {_n(e['margin'])}: {verdict}")
            if e.get("class") == "polymer" and "conditions" not in e:  # why a polymer row was not read
                out += [f"       {note}" for note in e.get("notes", [])]
            extra = [x for x in e["not_checked"] if x not in mats[0]["not_checked"] or e is mats[0]]
            if e is not mats[0] and extra:
                out.append(f"       also not checked: {'; '.join(extra)}")
        out.append(f"  not checked for any material: {'; '.join(_common(mats))}")
    sk = (c or {}).get("skipped", {})
    if sk:
        out += ["", "Skipped"]
        for k, v in sk.items():
            out.append(f"  {k}: {v}")
    return out


def _common(mats: list) -> list:
    common = list(mats[0]["not_checked"])
    for e in mats[1:]:
        common = [x for x in common if x in e["not_checked"]]
    return common

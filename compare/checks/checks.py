"""Static and fatigue checks on the combined stress field, and the hand (nominal-stress) path beside
the FE (local-stress) path.

Every formula comes from :mod:`classic.stress` and :mod:`classic.fatigue` (Shigley's Mechanical
Engineering Design, 9th ed.); this module only chooses inputs, records where each came from, and
says what was skipped and why. Every assumed factor is written to the results with its source.
"""
from __future__ import annotations

import math
import warnings

import numpy as np
from scipy.special import ndtri

from classic import fatigue as cf
from classic import properties as cp
from classic import stress as cs
from classic import torsion as ct
from classic._validity import OutOfRangeError

from ..case.units import SYSTEMS, from_si
from .combined import AXIAL_KC_SOURCE, Cycle, Field, FatigueStresses, _point_entry, where_of, worst_over_cycle

SHIGLEY = cf.EDITION
FATIGUE_CRITERIA = ("goodman", "gerber", "asme_elliptic", "soderberg", "yield_langer")
KEYSEAT_CONTEXT = (f"{SHIGLEY}, p. 373 / Table 7-1 first-iteration estimates for an end-milled keyseat "
                   "(r/d = 0.02, 3-D, key in place): Kt = 2.14 in bending, Kts = 3.0 in torsion — context only")


class _Warnings:
    """Collect the OutOfRangeWarnings of classic formulas as text for the results (no printing)."""

    def __enter__(self):
        self._cm = warnings.catch_warnings(record=True)
        self.caught = self._cm.__enter__()
        warnings.simplefilter("always")
        return self

    def __exit__(self, *exc):
        self._cm.__exit__(*exc)
        self.messages = [str(w.message) for w in self.caught]
        return False


# ====================================================================================== static
def static_check(a, fld: Field, cyc: Cycle, worst: dict, skipped: dict, material=None, points_out=None) -> dict:
    """Factors of safety against yield (von Mises, Tresca) and, where tension and compression
    strengths differ or the material is brittle, against fracture (Coulomb–Mohr, modified Mohr),
    at the worst point and instant of the cycle; the strengths a design factor requires."""
    m = material or a.case.material
    nd = a.case.analysis.design_factor
    usable = ~fld.excluded
    out: dict = {"criteria": [], "at": {}, "where": {}, "strengths": {}, "path": "FE local stresses, worst instant of the load cycle"}
    sk: dict = {}

    def point(name, w):
        i = w.best(usable)
        e = _point_entry(a, fld, cyc, i, w, name)
        return e

    if m.kind == "brittle":
        sk["von_mises"] = sk["tresca"] = "brittle material: the yield criteria do not apply (Coulomb–Mohr and modified Mohr on the ultimate strengths instead)"
    elif m.yield_strength is None:
        sk["von_mises"] = sk["tresca"] = "material.yield is not given"
    else:
        Sy = m.yield_strength
        out["strengths"]["yield"] = Sy
        vm = point("von_mises", worst["von_mises"])
        tr = point("tresca", worst["tresca"])
        out["von_mises"] = cs.yield_factor_von_mises(Sy, vm["von_mises"])
        out["tresca"] = cs.yield_factor_tresca(Sy, tr["sigma1"], tr["sigma3"])
        for name, e in (("von_mises", vm), ("tresca", tr)):
            out["criteria"].append(name)
            out["at"][name], out["where"][name] = e["at"], e["where"]
        out["sources"] = {"von_mises": f"{SHIGLEY}, Sec. 5-5, eq. 5-19", "tresca": f"{SHIGLEY}, Sec. 5-4, eq. 5-3"}
    brittle_needed = m.kind == "brittle" or m.compressive_ultimate is not None
    if brittle_needed:
        if m.ultimate is None or m.compressive_ultimate is None:
            miss = "material.ultimate" if m.ultimate is None else "material.compressive_ultimate"
            sk["coulomb_mohr"] = sk["modified_mohr"] = f"{miss} is not given"
        else:
            strengths = {"Sut": m.ultimate, "Suc": m.compressive_ultimate}
            out["strengths"].update(ultimate=m.ultimate, compressive_ultimate=m.compressive_ultimate)
            out.setdefault("sources", {})
            for name, f, eq in (("coulomb_mohr", cs.coulomb_mohr_factor, "eqs. 5-31a..c"),
                                ("modified_mohr", cs.modified_mohr_factor, "eqs. 5-32a..c")):
                w = worst_over_cycle(fld, cyc, name, strengths)
                e = point(name, w)
                out[name] = f(e["sigma1"], e["sigma3"], m.ultimate, m.compressive_ultimate)
                out["criteria"].append(name)
                out["at"][name], out["where"][name] = e["at"], e["where"]
                out["sources"][name] = f"{SHIGLEY}, Sec. 5-9, {eq} (numbering from memory)"
                if points_out is not None:
                    points_out.append(e)
    if nd is not None and out["criteria"]:
        out["design_factor"] = nd
        set_required_strength(out, nd, m)
    elif nd is None and out["criteria"]:
        sk["required_strength"] = "analysis.design_factor is not given"
    out["skipped"] = sk
    if material is None:
        skipped.update({f"static.{k}": v for k, v in sk.items()})
    return out


# ====================================================================================== endurance
def _length_text(d: float, units) -> str:
    """A length for a source line, in the case's own unit (SI inside)."""
    s = units or SYSTEMS["mm-N-MPa"]
    return f"{from_si(d, 'length', s):.4g} {s.label('length')}"


def set_required_strength(out: dict, nd: float, m, req: dict | None = None) -> None:
    """Fill a static-check record's ``required_strength`` (the strengths that would just give the design
    factor ``nd``, added to ``req`` if given) and ``meets_design_factor`` from its factors."""
    req = {} if req is None else req
    if "von_mises" in out:
        req["yield_von_mises"] = nd * out["strengths"]["yield"] / out["von_mises"]
        req["yield_tresca"] = nd * out["strengths"]["yield"] / out["tresca"]
    for name in ("coulomb_mohr", "modified_mohr"):
        if name in out:
            k = nd / out[name]
            req[f"ultimate_{name}"] = {"ultimate": k * m.ultimate, "compressive_ultimate": k * m.compressive_ultimate,
                                       "note": "both strengths scaled together (the material's Suc/Sut kept)"}
    out["required_strength"] = req
    out["meets_design_factor"] = {c: bool(out[c] >= nd) for c in out["criteria"]}


def shaft_diameter(a, fld: Field) -> tuple[float, str]:
    s = a.case.section
    if s.nominal:
        return s.nominal, "the shaft diameter" if s.nominal == s.diameter else "the nominal diameter (section.geometry)"
    ox, oy = s.origin
    r = float(np.max(np.hypot(fld.xy[0][fld.on_boundary] - ox, fld.xy[1][fld.on_boundary] - oy)))
    return 2 * r, "twice the largest distance of the boundary from the shaft axis (custom section; conservative for kb)"


def endurance(a, fld: Field, cyc: Cycle, material=None, steel: bool = True) -> dict:
    """Endurance limit at the critical location: the material's ``endurance_limit`` as is, or Se'
    (eq. 6-8) times the Marin factors (eq. 6-18), each with its source; the operating temperature
    and reliability come from ``material`` too. ``{'skipped': reason}`` when it cannot be had."""
    m = material or a.case.material
    Sut, surface, given = m.ultimate, m.surface, m.endurance_limit
    if given is not None:
        return {"Se": given, "Se_source": "given (the part's fully corrected endurance limit; no Marin factors applied)",
                "factors": {}, "warnings": []}
    if not steel:
        return {"skipped": "no endurance limit given, and Se' = 0.5·Sut and the Marin surface factors are steel correlations"}
    if Sut is None:
        return {"skipped": "material.ultimate is not given (needed for Se' = 0.5·Sut and the surface factor)"}
    if surface is None:
        return {"skipped": "material.surface is not given (ground, machined, cold-drawn, hot-rolled or as-forged), "
                           "nor material.endurance_limit"}
    d, d_src = shaft_diameter(a, fld)
    f: dict = {}
    with _Warnings() as w:
        try:
            Se_p = cf.rotating_beam_endurance(Sut, "Pa")
            f["ka"] = {"value": cf.surface_factor(Sut, surface, "Pa"), "source": f"{SHIGLEY}, eq. 6-19, Table 6-2 ({surface})"}
            f["kb"] = {"value": cf.size_factor(d, "m", "bending"),
                       "source": f"{SHIGLEY}, eq. 6-20 with d = {_length_text(d, a.case.units)} ({d_src})" +
                       ("" if cyc.rotating else "; not rotating: the actual d is used, conservative against the "
                        "equivalent diameter 0.370·d of eq. 6-24 (from memory)")}
            f["kc"] = {"value": cf.load_factor("bending"),
                       "source": f"{SHIGLEY}, eq. 6-26: combined loading is carried by the von Mises stresses with the "
                                 f"bending kc = 1; an axial alternating stress is divided by kc = 0.85 ({AXIAL_KC_SOURCE})"}
            T = m.temperature
            if T is None:
                f["kd"] = {"value": 1.0, "source": "material.temperature not given: room temperature assumed, kd = 1"}
            else:
                f["kd"] = {"value": cf.temperature_factor(T), "source": f"{SHIGLEY}, eq. 6-27 at {T:g} °C"}
            R = m.reliability
            if R is None:
                f["ke"] = {"value": 1.0, "source": "material.reliability not given: 50 % (the mean), ke = 1"}
            elif any(abs(R - k) < 1e-12 for k in cf.RELIABILITY_TABLE):
                f["ke"] = {"value": cf.reliability_factor(R), "source": f"{SHIGLEY}, Table 6-5, reliability {R:g}"}
            else:

                z = float(ndtri(R))
                f["ke"] = {"value": cf.reliability_factor_za(z),
                           "source": f"{SHIGLEY}, eq. 6-29, z_a = {z:.4f} for reliability {R:g}"}
            f["kf"] = {"value": 1.0, "source": "no miscellaneous effects given (fretting under a hub, corrosion, "
                                                "plating can lower Se a lot): kf = 1"}
            Se = cf.marin_endurance_limit(Se_p, *(f[k]["value"] for k in ("ka", "kb", "kc", "kd", "ke")), f["kf"]["value"])
        except OutOfRangeError as exc:
            return {"skipped": f"endurance limit: {exc}"}
    return {"Se": Se, "Se_prime": Se_p,
            "Se_source": f"Se' = 0.5·Sut ({SHIGLEY}, eq. 6-8) times the Marin factors (eq. 6-18); steel correlations",
            "factors": f, "warnings": w.messages}


# ====================================================================================== fatigue, FE path
def _fe_factors(fs: FatigueStresses, idx: np.ndarray, Se, Sut, Sy) -> dict:
    sa, sm = fs.sa[idx], fs.sm[idx]
    out = {}
    if Sut is not None:
        out["goodman"] = np.atleast_1d(cf.goodman_factor(sa, sm, Se, Sut))
        out["gerber"] = np.atleast_1d(cf.gerber_factor(sa, sm, Se, Sut))
    if Sy is not None:
        out["asme_elliptic"] = np.atleast_1d(cf.asme_elliptic_factor(sa, sm, Se, Sy))
        out["soderberg"] = np.atleast_1d(cf.soderberg_factor(sa, sm, Se, Sy))
        out["yield_langer"] = np.atleast_1d(cf.langer_factor(sa, sm, Sy))
    return out


def fe_fatigue(a, fld: Field, cyc: Cycle, fs: FatigueStresses, Se, Sut, Sy, with_points=True) -> dict:
    """The fatigue criteria on the FE von Mises alternating and mean stresses at every point;
    the smallest factor of each and where."""
    usable = ~fld.excluded
    front = fs.pareto(usable)
    facs = _fe_factors(fs, front, Se, Sut, Sy)
    out: dict = {}
    for name, n in facs.items():
        k = int(np.argmin(n))
        i = int(front[k])
        at = [float(fld.xy[0, i]), float(fld.xy[1, i])]
        e = {"factor": float(n[k]), "at": at, "sigma_a_vm": float(fs.sa[i]), "sigma_m_vm": float(fs.sm[i]), "index": i}
        if cyc.rotating:
            e["shaft_angle_deg_of_alternating_peak"] = math.degrees(float(fs.psi[i]))
        out[name] = e
    return out


# ====================================================================================== fatigue, hand path
#: Shapes whose stress raiser is no small notch (flats, drives) or whose radius the section does not
#: carry (the cross-slot): without fatigue.notch_radius the hand path takes q = 1.
FULL_SENSITIVITY_KINDS = ("flatted", "square", "hexagon", "cross_slot")


def hand_path(a, fld: Field, cyc: Cycle, Se, Sut, Sy, kt2d: dict | None) -> dict:
    """Shigley's shaft equations (eqs. 7-7 to 7-16) on the nominal stresses with Kf, Kfs from
    Kt, Kts and the notch sensitivity; also with Kf = Kt, Kfs = Kts (q = 1), the like-for-like
    companion of the FE path."""
    s, fi = a.case.section, a.case.fatigue
    if not s.nominal:
        return {"skipped": "custom section: the shaft equations need a round shaft of known diameter (give "
                           "section.nominal_diameter); the FE path stands alone"}
    notes: list[str] = []
    # --- Kt (bending)
    if fi.kt_bending is not None:
        Kt, Kt_src = fi.kt_bending, f"given: {fi.kt_bending_source}"
    elif s.kind == "round":
        Kt, Kt_src = 1.0, "plain round section: no notch in bending"
    else:
        Kt = max(1.0, kt2d["value"]) if kt2d else 1.0
        Kt_src = ("FE 2-D ratio σmax/(32M/πd³) of the prismatic section — NOT the 3-D factor where the feature ends (a keyseat end, a flat's runout), which is "
                  "larger; give fatigue.kt_bending from a chart")
        notes.append("Kt for bending is the 2-D section ratio; " + (KEYSEAT_CONTEXT if s.kind == "keyed" else
                     "the 3-D concentration where the feature ends along the shaft is not in it"))
    # --- Kts (torsion)
    if fi.kts_torsion is not None:
        Kts, Kts_src = fi.kts_torsion, f"given: {fi.kts_torsion_source}"
    elif s.kind == "round":
        Kts, Kts_src = 1.0, "plain round section: no notch in torsion"
    elif a.kts is None:
        return {"skipped": "no Kts: the section has sharp re-entrant corners (unbounded stress); model the real fillet "
                           "radius or give fatigue.kts_torsion"}
    else:
        Kts, Kts_src = max(1.0, a.kts), f"FE: τmax / ({a.nominal_shear()[1]}) of the section (torsion.kts)"
    # --- notch sensitivity
    q = qs = None
    r = fi.notch_radius
    r_src = fi.notch_radius_source or "given (fatigue.notch_radius)"
    if r is None and s.kind == "keyed":
        k = (a.where(a.torsion.peak_at).get("keyway") or 1) - 1
        r, r_src = s.keyways[k].fillet, f"the fillet radius of keyway {k + 1}"
    w_msgs: list[str] = []
    if (Kt > 1 or Kts > 1) and r is None and s.kind in FULL_SENSITIVITY_KINDS:
        q = qs = 1.0  # flats and drives: no small notch radius to lower q; Kf = Kt is the safe side
        r_src = "none: q = 1 (Kf = Kt, Kfs = Kts), the conservative choice without a notch radius (common practice)"
        Kf, Kfs = Kt, Kts
    elif Kt > 1 or Kts > 1:
        if r is None or r <= 0:
            return {"skipped": "a notch radius is needed for the notch sensitivity (fatigue.notch_radius)", "Kt": Kt, "Kts": Kts}
        if Sut is None:
            return {"skipped": "material.ultimate is needed for the notch sensitivity", "Kt": Kt, "Kts": Kts}
        with _Warnings() as w:
            try:
                q = cf.notch_sensitivity_si(r, Sut, "bending")
                qs = cf.notch_sensitivity_si(r, Sut, "torsion")
            except OutOfRangeError as exc:
                return {"skipped": f"notch sensitivity: {exc}", "Kt": Kt, "Kts": Kts}
        w_msgs = w.messages
        Kf, Kfs = cf.fatigue_kf(Kt, q), cf.fatigue_kf(Kts, qs)
    else:
        Kf, Kfs = 1.0, 1.0
    # --- loads: magnitudes of the moment vectors
    if cyc.rotating:
        Ma, Mm = math.hypot(cyc.Lc[1], cyc.Lc[2]), 0.0
    else:
        Ma = math.hypot(*cyc.alt["bending"][1:3]) if "bending" in cyc.alt else 0.0
        Mm = math.hypot(cyc.mean[1], cyc.mean[2])
    Ta = abs(cyc.alt["torque"][3]) if "torque" in cyc.alt else 0.0
    Tm = abs(cyc.mean[3])
    if cyc.mean[0] or "axial" in cyc.alt:
        notes.append("the axial load is not in the shaft equations 7-7 to 7-16: the hand path leaves it out")
    if np.any(cyc.mean[4:]) or "shear" in cyc.alt or np.any(cyc.Lc[4:]):
        notes.append("the shaft equations neglect transverse shear: the hand path leaves it out (the FE path has it)")
    d = s.nominal
    out = {"path": "nominal stresses × Kf, Kfs (Shigley's shaft equations)",
           "equations": f"{SHIGLEY}, Sec. 7-4, eqs. 7-7 to 7-16" + (" (solid round, d-form)" if not s.bore else
                                                                      " in stress form with the hollow-round nominals Mc/I and 16TD/(π(D⁴−d⁴))"),
           "Kt": Kt, "Kt_source": Kt_src, "Kts": Kts, "Kts_source": Kts_src,
           "notch_radius": r if (Kt > 1 or Kts > 1) else None, "notch_radius_source": r_src if (Kt > 1 or Kts > 1) else None,
           "q": q, "qs": qs, "q_source": (f"{SHIGLEY}, eqs. 6-34, 6-35a/b (steels)" if r is not None else r_src) if q is not None else None,
           "Kf": Kf, "Kfs": Kfs, "Kf_source": f"{SHIGLEY}, eq. 6-32: Kf = 1 + q(Kt − 1)",
           "Ma": Ma, "Mm": Mm, "Ta": Ta, "Tm": Tm, "d": d, "bore": s.bore,
           "notes": notes, "warnings": w_msgs}
    out.update(_hand_factors(s, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sut, Sy))
    out["with_kf_equal_kt"] = _hand_factors(s, Kt, Kts, Ma, Mm, Ta, Tm, Se, Sut, Sy)
    out["with_kf_equal_kt"]["note"] = "Kf = Kt, Kfs = Kts (q = 1): the like-for-like companion of the FE path"
    return out


def _hand_factors(s, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sut, Sy) -> dict:
    d = s.nominal
    out = {}
    if not s.bore:
        sa, sm = cf.shaft_von_mises_stresses(d, Kf, Kfs, Ma, Mm, Ta, Tm)
        if Sut is not None:
            out["goodman"] = cf.de_goodman(d, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sut)
            out["gerber"] = cf.de_gerber(d, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sut)
        if Sy is not None:
            out["asme_elliptic"] = cf.de_asme_elliptic(d, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sy)
            out["soderberg"] = cf.de_soderberg(d, Kf, Kfs, Ma, Mm, Ta, Tm, Se, Sy)
            out["yield_langer"] = cf.de_langer(d, Kf, Kfs, Ma, Mm, Ta, Tm, Sy)
            out["first_cycle_yield"] = cf.de_first_cycle_yield(d, Kf, Kfs, Ma, Mm, Ta, Tm, Sy)
    else:
        kb = cp.tube_extreme_fibre(d, s.bore) / cp.tube_second_moment(d, s.bore)
        kt = ct.tube_peak_shear(1.0, d, s.bore)
        sa = cs.von_mises_sigma_tau(Kf * Ma * kb, Kfs * Ta * kt)
        sm = cs.von_mises_sigma_tau(Kf * Mm * kb, Kfs * Tm * kt)
        if Sut is not None:
            out["goodman"] = cf.goodman_factor(sa, sm, Se, Sut)
            out["gerber"] = cf.gerber_factor(sa, sm, Se, Sut)
        if Sy is not None:
            out["asme_elliptic"] = cf.asme_elliptic_factor(sa, sm, Se, Sy)
            out["soderberg"] = cf.soderberg_factor(sa, sm, Se, Sy)
            out["yield_langer"] = cf.langer_factor(sa, sm, Sy)
            peak = cs.von_mises_sigma_tau(Kf * (Ma + Mm) * kb, Kfs * (Ta + Tm) * kt)
            out["first_cycle_yield"] = cs.yield_factor_von_mises(Sy, peak)
    out["sigma_a_vm"], out["sigma_m_vm"] = float(sa), float(sm)
    return out


# ====================================================================================== fatigue check
def fatigue_check(a, fld: Field, cyc: Cycle, fs: FatigueStresses, skipped: dict, static: dict,
                  kt2d: dict | None) -> dict:
    m = a.case.material
    nd = a.case.analysis.design_factor
    if m.polymer is not None:  # a polymer's fatigue comes from its own stress-life data (checks/polymer.py)
        reason = "polymer: the fatigue check uses the polymer's stress-life data (results 'polymer'), not the steel correlations"
        skipped["fatigue"] = reason
        return {"skipped": reason}
    if m.kind == "brittle":
        reason = ("brittle material: the shaft fatigue criteria here (Shigley 9th ed., chs. 6-7) are for ductile "
                  "steels")
        skipped["fatigue"] = reason
        return {"skipped": reason}
    if m.ultimate is None and m.yield_strength is None:
        reason = "material.ultimate and material.yield are not given"
        skipped["fatigue"] = reason
        return {"skipped": reason}
    en = endurance(a, fld, cyc)
    if "skipped" in en:
        skipped["fatigue"] = en["skipped"]
        return {"skipped": en["skipped"]}
    Se, Sut, Sy = en["Se"], m.ultimate, m.yield_strength
    out: dict = {"criteria": [], "path": "FE local stresses at every point (Kf = Kt, q = 1: no notch sensitivity "
                                         "applied, conservative against the hand path)"}
    fe = fe_fatigue(a, fld, cyc, fs, Se, Sut, Sy)
    for name in FATIGUE_CRITERIA:
        if name in fe:
            out[name] = fe[name]["factor"]
            out["criteria"].append(name)
        else:
            need = "material.ultimate" if name in ("goodman", "gerber") else "material.yield"
            skipped[f"fatigue.{name}"] = f"{need} is not given"
    if "von_mises" in static:
        out["first_cycle_yield_von_mises"] = static["von_mises"]
    out["Se"] = Se
    out["Se_source"] = en["Se_source"]
    out["Se_prime"] = en.get("Se_prime")
    out["factors"] = en["factors"]
    out["edition"] = SHIGLEY
    out["sources"] = {"goodman": f"{SHIGLEY}, eq. 6-46 / 7-7", "gerber": f"{SHIGLEY}, eq. 6-47 / 7-9",
                      "asme_elliptic": f"{SHIGLEY}, eq. 6-48 / 7-11", "soderberg": f"{SHIGLEY}, eq. 6-45 / 7-13",
                      "yield_langer": f"{SHIGLEY}, eq. 6-49, Sec. 7-4"}
    out["fe"] = {name: {k: v for k, v in e.items() if k != "index"} | {"where": _where(a, fld, e["index"])}
                 for name, e in fe.items()}
    out["fe_notes"] = ["σa', σm': von Mises of the alternating and mean stress states; alternating sources of unknown "
                       "relative phase are combined conservatively (|σ| and |τ| of each added)",
                       "axial alternating stress divided by kc = 0.85 (" + AXIAL_KC_SOURCE + ")",
                       "a compressive mean stress is counted like a tensile one (von Mises mean): conservative"]
    if not fs.sa.any():
        out["fe_notes"].append("no alternating stress: the fatigue lines reduce to static lines")
    out["hand"] = hand_path(a, fld, cyc, Se, Sut, Sy, kt2d)
    out["warnings"] = en["warnings"] + out["hand"].get("warnings", [])
    if nd is not None:
        out["design_factor"] = nd
        out["required_endurance_limit"] = required_endurance(fe, fs, nd, Sut, Sy)
    else:
        skipped["fatigue.required_endurance_limit"] = "analysis.design_factor is not given"
    out["_points"] = fe
    return out


def _where(a, fld: Field, i: int) -> dict:
    return where_of(a, fld, i)


def required_endurance(fe: dict, fs: FatigueStresses, nd, Sut, Sy) -> dict:
    """The endurance limit each criterion needs for the design factor at its critical point,
    with the case's Sut and Sy (rearranged criterion equations)."""
    out = {}
    for name, e in fe.items():
        sa, sm = e["sigma_a_vm"], e["sigma_m_vm"]
        if name == "goodman":
            rest = 1 / nd - sm / Sut
            out[name] = sa / rest if rest > 0 else None
        elif name == "soderberg":
            rest = 1 / nd - sm / Sy
            out[name] = sa / rest if rest > 0 else None
        elif name == "gerber":
            rest = 1 - (nd * sm / Sut) ** 2
            out[name] = nd * sa / rest if rest > 0 else None
        elif name == "asme_elliptic":
            rest = 1 - (nd * sm / Sy) ** 2
            out[name] = nd * sa / math.sqrt(rest) if rest > 0 else None
        elif name == "yield_langer":
            out["yield_for_langer"] = nd * (sa + sm)
    out["note"] = "None: the mean stress alone uses up the design factor — no endurance limit suffices"
    return out


# ====================================================================================== governing
def governing(a, static: dict, fatigue: dict) -> dict | None:
    """The smallest factor of safety over every computed criterion and both paths, and where (a
    record; :func:`compare.output.report_combined.governing_text` writes its sentence)."""
    cands = []
    for c in static.get("criteria", []):
        cands.append((static[c], c, "FE", static["at"][c], static["where"][c]))
    for c in fatigue.get("criteria", []):
        e = fatigue["fe"][c]
        cands.append((e["factor"], c, "FE", e["at"], e["where"]))
    hand = fatigue.get("hand", {})
    if "skipped" not in hand:
        for c in FATIGUE_CRITERIA + ("first_cycle_yield",):
            if c in hand:
                fe_pt = fatigue["fe"].get(c) or fatigue["fe"].get("goodman") or next(iter(fatigue["fe"].values()), None)
                cands.append((hand[c], c, "hand", fe_pt["at"] if fe_pt else None, fe_pt["where"] if fe_pt else None))
    cands = [x for x in cands if x[0] is not None and math.isfinite(x[0])]
    if not cands:
        return None
    n, crit, path, at, where = min(cands, key=lambda x: x[0])
    nd = a.case.analysis.design_factor
    return {"factor": n, "criterion": crit, "path": path, "at": at, "where": where,
            "design_factor": nd, "meets_design_factor": None if nd is None else bool(n >= nd)}

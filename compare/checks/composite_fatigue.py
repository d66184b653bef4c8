"""The fatigue check of a composite section, region by region in each region's own material.

The stresses: at every read point of the section (densely along the outer boundary and the holes, on
both sides of every interface from each region's own elements, and at the nodes and centroid of every
element) the FE unit fields σ, τzx, τzy per unit of each section load (N, Mx, My, T, Vx, Vy) are kept in
the :class:`~compare.checks.combined.Field` every section check uses: σ = E_k·ε (transformed section),
τ from the torsion stress function and the composite flexure functions (fem/composite_shear.py; a
shear force acts through the shaft axis, so its torque about the shear centre is added). The case's
load cycle (:func:`~compare.checks.combined.load_cycle`: means, alternating amplitudes, a rotating
shaft's bending fully reversed) then gives the von Mises alternating and mean stresses σa', σm' at
every point (:func:`~compare.checks.combined.fatigue_stresses`, as for one material).

Each region is checked on its own points:

- a steel region (``ultimate`` and ``surface``, or ``endurance_limit``): the endurance limit by the
  Marin factors (:func:`compare.checks.checks.endurance`; the size factor from the whole section's
  outer size), the project's criteria (Goodman, Gerber, ASME elliptic, Soderberg, Langer first-cycle
  yield; Shigley's Mechanical Engineering Design, 9th ed., eqs. 6-45 to 6-49);
- a polymer region (``polymer`` data read at [service]): the stress-life strength at the service
  cycles (Basquin fit, no endurance limit assumed) on the Goodman line to the tensile strength at the
  service conditions (classic.polymer.goodman_factor_polymer and its stated source).

A region's chart factors (``fatigue.kt_bending``, ``kts_torsion``: a 3-D feature the section does not
show) multiply its stresses as Kf = 1 + q(Kt − 1) (Shigley, eq. 6-32): q from the region's notch
radius and ultimate for a steel (eqs. 6-34, 6-35), q = 1 (Kf = Kt) otherwise and always for a polymer
(no notch-sensitivity data: the conservative choice, common practice). Numbers and records only.
"""
from __future__ import annotations

import math

import numpy as np
from scipy.spatial import cKDTree
from skfem import CellBasis, ElementTriP2

from classic import fatigue as cf
from classic import polymer as cp
from classic._validity import OutOfRangeError
from fem.bases import interpolate
from fem.composite import _facet_stresses
from fem.shear import _NODES

from .checks import FATIGUE_CRITERIA, SHIGLEY, _fe_factors, endurance
from .combined import Field, _kc_axial, fatigue_stresses, load_cycle

SOURCES = {"goodman": f"{SHIGLEY}, eq. 6-46 / 7-7", "gerber": f"{SHIGLEY}, eq. 6-47 / 7-9",
           "asme_elliptic": f"{SHIGLEY}, eq. 6-48 / 7-11", "soderberg": f"{SHIGLEY}, eq. 6-45 / 7-13",
           "yield_langer": f"{SHIGLEY}, eq. 6-49, Sec. 7-4"}


def composite_field(a) -> tuple[Field, np.ndarray, np.ndarray]:
    """The unit fields of a composite section at every read point: (Field, region of each point,
    place of each point: 0 boundary (outer or hole), 1 interface, 2 inside)."""
    case = a.case
    sol = a.extra["composite"]["solution"]
    cm, tr, pr, sh = sol.mesh, sol.torsion, sol.props, sol.shear
    mats = case.region_materials
    E = np.array([m.elastic_modulus for m in mats])

    def grads(u, facets, side):
        x, g, reg = _facet_stresses(cm, u, facets, side, lambda x_, g_, t_: g_)
        reg = np.broadcast_to(np.asarray(reg)[:, None], x.shape[1:])
        return x.reshape(2, -1), np.asarray(g).reshape(2, -1), reg.ravel()

    sets = [(cm.mesh.boundary_facets(), None, 0)]
    if len(cm.interfaces):
        sets += [(cm.interfaces, 0, 1), (cm.interfaces, 1, 1)]
    xs, gphi, gpsi, gPhi, regs, places = [], [], [], [], [], []
    for facets, side, place in sets:
        x, g, reg = grads(tr.phi, facets, side)
        xs.append(x), gphi.append(g), regs.append(reg), places.append(np.full(reg.size, place))
        if sh is not None:
            gpsi.append(grads(sh.psi, facets, side)[1])
            gPhi.append(grads(sh.phi, facets, side)[1])
    ib = CellBasis(cm.mesh, ElementTriP2(), quadrature=(_NODES, np.full(_NODES.shape[1], 1.0 / _NODES.shape[1])))
    xi = np.asarray(ib.global_coordinates()).reshape(2, -1)
    # interior reads on a boundary or interface node are dropped: those lines are read from each
    # facet's own element above, as every peak in the project
    lines = np.concatenate([cm.mesh.boundary_facets(), cm.interfaces])
    on_lines = np.hstack([cm.mesh.p[:, cm.mesh.facets[:, lines].ravel()],
                          np.asarray(ib.doflocs)[:, ib.facet_dofs[0, lines]]])
    dist, _ = cKDTree(on_lines.T).query(xi.T)
    keep = dist > 1e-9 * cm.size
    xs.append(xi[:, keep])
    gphi.append(np.asarray(interpolate(ib, tr.phi).grad).reshape(2, -1)[:, keep])
    if sh is not None:
        gpsi.append(np.asarray(interpolate(ib, sh.psi).grad).reshape(2, -1)[:, keep])
        gPhi.append(np.asarray(interpolate(ib, sh.phi).grad).reshape(2, -1)[:, keep])
    ri = np.repeat(cm.region_of[:, None], _NODES.shape[1], axis=1).ravel()[keep]
    regs.append(ri), places.append(np.full(ri.size, 2))
    xy, g, region, place = np.hstack(xs), np.hstack(gphi), np.concatenate(regs), np.concatenate(places)
    n = xy.shape[1]
    S, TX, TY = np.zeros((6, n)), np.zeros((6, n)), np.zeros((6, n))
    Ek = E[region]
    S[0] = Ek * pr.strain(1.0, 0.0, 0.0, xy[0], xy[1])
    S[1] = Ek * pr.strain(0.0, 1.0, 0.0, xy[0], xy[1])
    S[2] = Ek * pr.strain(0.0, 0.0, 1.0, xy[0], xy[1])
    TX[3], TY[3] = g[1] / tr.GJ, -g[0] / tr.GJ
    notes = []
    if sh is not None:
        (ax, ay), (bx, by) = sh.unit_stresses(xy, np.hstack(gpsi), np.hstack(gPhi), region)
        dTx, dTy = torque_of_unit_shear(case, sh)
        TX[4], TY[4] = ax + dTx * TX[3], ay + dTx * TY[3]
        TX[5], TY[5] = bx + dTy * TX[3], by + dTy * TY[3]
    else:
        notes.append("no shear force given: the transverse-shear rows are zero")
    fld = Field(xy, place == 0, np.full(n, -1, dtype=np.int64), np.zeros(n, dtype=bool), S, TX, TY, sh is not None, notes)
    return fld, region, place


def torque_of_unit_shear(case, sh) -> tuple[float, float]:
    """The torque about the shear centre of a unit Vx and a unit Vy through the shaft axis:
    (o − s) × V (as in compare/checks/combined.build_field)."""
    ox, oy = case.section.origin
    sx, sy = sh.centre
    return -(oy - sy), (ox - sx)


def _kf(m, key: str, loading: str, notes: list) -> tuple[float, dict | None]:
    """The region's fatigue factor for one chart factor: (Kf, record) or (1, None) when not given."""
    fi = m.fatigue or {}
    if key not in fi:
        return 1.0, None
    Kt, src = fi[key]
    r = fi.get("notch_radius")
    rec = {"Kt": Kt, "Kt_source": f"given: {src}"}
    if m.kind == "steel" and r is not None and m.ultimate is not None:
        try:
            q = cf.notch_sensitivity_si(r, m.ultimate, loading)
            rec.update(q=q, q_source=f"{SHIGLEY}, eqs. 6-34, 6-35a/b (steels), notch radius {r:.4g} m")
        except OutOfRangeError as exc:
            q = 1.0
            rec.update(q=q, q_source=f"q = 1 (notch sensitivity out of range: {exc.reason})")
    else:
        q = 1.0
        rec.update(q=q, q_source=("q = 1 (Kf = Kt): no notch-sensitivity data for a polymer; the conservative "
                                  "choice (common practice)") if m.kind == "polymer" else
                   "q = 1 (Kf = Kt): no notch radius and ultimate given for this region; the conservative choice")
    Kf = cf.fatigue_kf(Kt, q)
    rec.update(Kf=Kf, Kf_source=f"{SHIGLEY}, eq. 6-32: Kf = 1 + q(Kt − 1)")
    notes.append(f"{key}: the region's FE stresses × Kf = {Kf:.4g} (a 3-D feature the 2-D section does not show; "
                 "where the section itself concentrates the stress there too, this counts it twice: conservative)")
    return Kf, rec


def composite_fatigue(a) -> dict:
    """Per region: ``fatigue`` record (criteria, factors, points) or ``{'skipped': reason}``;
    ``loads`` the cycle; the number of read points. Returns the records by region index."""
    case = a.case
    mats = case.region_materials
    fld, region, place = composite_field(a)
    cyc = load_cycle(case)
    # the regions' chart factors scale their own points before the cycle is combined
    kf_recs = []
    for k, m in enumerate(mats):
        notes: list = []
        Kf, rb = _kf(m, "kt_bending", "bending", notes)
        Kfs, rt = _kf(m, "kts_torsion", "torsion", notes)
        sel = region == k
        fld.S[:, sel] *= Kf
        fld.TX[:, sel] *= Kfs
        fld.TY[:, sel] *= Kfs
        kf_recs.append(({"bending": rb, "torsion": rt} if (rb or rt) else None, notes))
    fs = fatigue_stresses(fld, cyc, _kc_axial())
    names = ("boundary", "interface", "inside")
    out = []
    for k, m in enumerate(mats):
        sel = region == k
        factors, note = kf_recs[k]
        base = {"read_points": int(sel.sum())}
        if factors:
            base["chart_factors"] = factors
        if note:
            base["notes"] = list(note)
        if m.kind is None:
            out.append(base | {"skipped": "no fatigue data for this region: give ultimate and surface (or "
                                          "endurance_limit) for a steel, or polymer data with stress-life curves"})
            continue
        front = fs.pareto(sel)
        if m.kind == "steel":
            en = endurance(a, fld, cyc, material=m)
            if "skipped" in en:
                out.append(base | {"skipped": en["skipped"]})
                continue
            Se, Sut, Sy = en["Se"], m.ultimate, m.yield_strength
            facs = _fe_factors(fs, front, Se, Sut, Sy)
            crit = {}
            for name in FATIGUE_CRITERIA:
                if name not in facs:
                    continue
                i_min = int(np.argmin(facs[name]))
                i = int(front[i_min])
                crit[name] = {"factor": float(facs[name][i_min]), "at": [float(fld.xy[0, i]), float(fld.xy[1, i])],
                              "place": names[int(place[i])], "sigma_a_vm": float(fs.sa[i]), "sigma_m_vm": float(fs.sm[i]),
                              "source": SOURCES[name]}
            rec = base | {"kind": "steel", "criteria": crit, "Se": Se, "Se_source": en["Se_source"],
                          "Se_prime": en.get("Se_prime"), "marin_factors": en["factors"], "warnings": en["warnings"],
                          "ultimate": Sut, "yield": Sy}
        else:
            p = m.polymer
            if p.fatigue_strength is None:
                reason = (f"no stress-life data in the {p.service.moisture} state" +
                          ("" if not np.any(fs.sa[sel] > 0) else ": the loads alternate, fatigue not checked"))
                out.append(base | {"skipped": reason})
                continue
            inv = fs.sa[front] / p.fatigue_strength + fs.sm[front] / p.tensile_strength
            with np.errstate(divide="ignore"):
                n = np.where(inv > 0, 1.0 / np.where(inv > 0, inv, 1.0), np.inf)
            i = int(front[int(np.argmin(n))])
            nf = cp.goodman_factor_polymer(float(fs.sa[i]), float(fs.sm[i]), p.fatigue_strength, p.tensile_strength)
            crit = {"polymer_goodman": {"factor": nf, "at": [float(fld.xy[0, i]), float(fld.xy[1, i])],
                                        "place": names[int(place[i])], "sigma_a_vm": float(fs.sa[i]),
                                        "sigma_m_vm": float(fs.sm[i]), "source": cp.GOODMAN_SOURCE}}
            sv = p.service
            rec = base | {"kind": "polymer", "criteria": crit, "S_f": p.fatigue_strength, "S_f_source": p.fatigue_source,
                          "tensile_strength": p.tensile_strength, "cycles": sv.cycles, "cycles_source": sv.cycles_source,
                          "sn_fits": p.sn_fits, "mean_stress_correction": cp.GOODMAN_SOURCE,
                          "conditions": {"temperature": sv.temperature, "moisture": sv.moisture, "life": sv.life},
                          "data": {"source": p.data.source, "illustrative": p.data.illustrative}}
        finite = {c: v for c, v in rec["criteria"].items() if math.isfinite(v["factor"])}
        if finite:
            g = min(finite, key=lambda c: finite[c]["factor"])
            rec.update(factor=finite[g]["factor"], criterion=g, at=finite[g]["at"])
        else:
            rec.update(factor=math.inf, criterion=None, at=None)
        out.append(rec)
    method = ("σa', σm': von Mises of the alternating and mean stress states at every read point of the region "
              "(its boundary, both sides of its interfaces, the nodes and centroid of its elements); alternating "
              "sources of unknown phase added (conservative); an axial alternating stress divided by kc = 0.85 "
              f"({SHIGLEY}, eq. 6-26); a compressive mean counted like a tensile one (conservative)")
    return {"regions": out, "loads": cyc.describe(), "method": method,
            "read_points": {"boundary": int((place == 0).sum()), "interface": int((place == 1).sum()),
                            "inside": int((place == 2).sum())}}

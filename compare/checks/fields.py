"""The combined-stress fields at the mesh nodes, for maps and the VTU file: σ, τzx, τzy, von Mises
at the worst instant of the load cycle, the transverse-shear stresses of the case's shear force and
the FE-path fatigue factor of safety at every node. Numbers only; :mod:`compare.output` draws and
writes them.

The worst instant is the one of the von Mises critical point (``combined.points``): the load vector
recorded there is applied to the whole section, so the map shows the section at that instant. Nodal
values are the L2 projection of the element fields onto the P2 space (smooth, for looking at);
the peaks and factors of the results are read on the boundary by :mod:`.combined`, not from these
maps.
"""
from __future__ import annotations

import numpy as np
from classic import fatigue as cf
from classic import stress as cs
from fem.bases import interpolate
from fem.export import projector
from fem.torsion import singular_mask

from .combined import Field, _kc_axial, fatigue_stresses, load_cycle

#: the FE-path fatigue criteria mapped (first-cycle yield is a static check and is left out)
FATIGUE_MAPPED = ("goodman", "gerber", "asme_elliptic", "soderberg")


def node_field(a) -> Field:
    """The unit fields of :class:`~compare.checks.combined.Field` at the P2 nodes of the final mesh."""
    sm, pr, tr = a.mesh, a.props, a.torsion
    xy = np.asarray(sm.mesh.doflocs)
    xc, yc = pr.centroid
    n = xy.shape[1]
    proj_t = projector(tr.basis)
    gq = interpolate(tr.basis, tr.phi).grad
    g = np.vstack([proj_t(gq[0]), proj_t(gq[1])])
    S, TX, TY = np.zeros((6, n)), np.zeros((6, n)), np.zeros((6, n))
    S[0] = cs.axial_stress(1.0, pr.area)
    S[1] = cs.unsymmetric_bending_stress(1.0, 0.0, xy[0] - xc, xy[1] - yc, pr.Ixx, pr.Iyy, pr.Ixy)
    S[2] = cs.unsymmetric_bending_stress(0.0, 1.0, xy[0] - xc, xy[1] - yc, pr.Ixx, pr.Iyy, pr.Ixy)
    TX[3], TY[3] = g[1] / tr.J, -g[0] / tr.J
    has_shear = a.shear is not None
    if has_shear:
        sr = a.shear
        (ax, ay), (bx, by) = sr.unit_stresses_at(sr.basis)
        proj_s = projector(sr.basis)
        proj = [proj_s(v) for v in (ax, ay, bx, by)]
        ox, oy = a.case.section.origin
        sx, sy = sr.centre
        dT_dVx, dT_dVy = -(oy - sy), (ox - sx)  # as in combined.build_field
        TX[4], TY[4] = proj[0] + dT_dVx * TX[3], proj[1] + dT_dVx * TY[3]
        TX[5], TY[5] = proj[2] + dT_dVy * TX[3], proj[3] + dT_dVy * TY[3]
    fld = Field(xy, np.zeros(n, dtype=bool), np.full(n, -1), singular_mask(sm, xy), S, TX, TY, has_shear, [])
    fld.phi_gradient = g  # ∇φ at the nodes (torsion per unit Gθ), for the torsion map
    return fld


def worst_instant_load(combined: dict) -> np.ndarray | None:
    """The load vector (N, Mx, My, T, Vx, Vy) of the von Mises critical point's instant."""
    for p in combined.get("points", []):
        if p.get("criterion") == "von_mises" and "instant" in p:
            ld = p["instant"]["loads"]
            return np.array([ld["axial"], *ld["bending"], ld["torque"], *ld["shear"]], float)
    return None


def nodal_fields(a) -> dict[str, np.ndarray]:
    """Nodal fields [Pa, or 1 for factors] of the analysis ``a`` after :func:`combined_step`:

    ``sigma``, ``tau_zx``, ``tau_zy``, ``von_mises`` at the worst instant; ``shear_tau_zx``,
    ``shear_tau_zy``, ``shear_tau`` for the case's shear force through the shear centre (a unit
    force in y when none is given: then per newton, ``shear_per_newton`` True); and, where the
    fatigue check ran, ``fatigue_factor``: the smallest FE-path factor of safety of the DE
    criteria at each node (infinite where the node carries no stress)."""
    fld = node_field(a)
    out: dict = {}
    comb = a.extra.get("combined") or {}
    L = worst_instant_load(comb)
    if L is not None:
        sg, tx, ty = fld.stress(L)
        out.update(sigma=sg, tau_zx=tx, tau_zy=ty, von_mises=np.asarray(cs.von_mises_sigma_tau(sg, np.hypot(tx, ty))))
    if fld.has_shear:
        V = a.case.loads.shear
        per_newton = not V or not any(V)
        Vx, Vy = (0.0, 1.0) if per_newton else V
        sr = a.shear
        # the force through the shear centre: the shear rows of the field less their torsion part
        tx = Vx * fld.TX[4] + Vy * fld.TX[5] - _torque_of(a, sr, Vx, Vy) * fld.TX[3]
        ty = Vx * fld.TY[4] + Vy * fld.TY[5] - _torque_of(a, sr, Vx, Vy) * fld.TY[3]
        out.update(shear_tau_zx=tx, shear_tau_zy=ty, shear_tau=np.hypot(tx, ty), shear_per_newton=per_newton)
    ft = a.extra.get("fatigue") or {}
    if ft.get("criteria") and ft.get("Se"):
        fs = fatigue_stresses(fld, load_cycle(a.case), _kc_axial())
        todo = np.flatnonzero(~fs.exact)
        if todo.size and fs.refine is not None:
            fs.sa[todo], fs.psi[todo] = fs.refine(todo)
        m = a.case.material
        Se, Sut, Sy = ft["Se"], m.ultimate, m.yield_strength
        facs = []
        with np.errstate(divide="ignore", invalid="ignore"):
            for name in ft["criteria"]:
                if name == "goodman" and Sut is not None:
                    facs.append(cf.goodman_factor(fs.sa, fs.sm, Se, Sut))
                elif name == "gerber" and Sut is not None:
                    facs.append(cf.gerber_factor(fs.sa, fs.sm, Se, Sut))
                elif name == "asme_elliptic" and Sy is not None:
                    facs.append(cf.asme_elliptic_factor(fs.sa, fs.sm, Se, Sy))
                elif name == "soderberg" and Sy is not None:
                    facs.append(cf.soderberg_factor(fs.sa, fs.sm, Se, Sy))
        if facs:
            f = np.min(np.vstack([np.atleast_1d(np.asarray(x, float)) for x in facs]), axis=0)
            out["fatigue_factor"] = np.where(np.isfinite(f), f, np.inf)
    out["phi_gradient"] = fld.phi_gradient
    out["excluded"] = fld.excluded
    out["xy"] = fld.xy
    return out


def _torque_of(a, sr, Vx: float, Vy: float) -> float:
    """The torque about the shear centre of a force (Vx, Vy) through the shaft axis."""
    ox, oy = a.case.section.origin
    sx, sy = sr.centre
    return -(oy - sy) * Vx + (ox - sx) * Vy

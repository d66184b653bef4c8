"""The section's fields for a viewer: ``section.vtu`` (VTK unstructured grid), SI units."""
from __future__ import annotations

import tempfile
from pathlib import Path

import meshio
import numpy as np

from fem.export import centroid_values, nodal_gradient, write_vtu

from ..checks.fields import nodal_fields
from ..solve.segment_superpose import LOADS, superpose, surface_stress, von_mises

#: nodal fields of :func:`compare.checks.fields.nodal_fields` written to the VTU, with their VTU names
MAPPED = {"sigma": "worst_sigma", "tau_zx": "worst_tau_zx", "tau_zy": "worst_tau_zy", "von_mises": "worst_von_mises",
          "shear_tau_zx": "shear_tau_zx", "shear_tau_zy": "shear_tau_zy", "shear_tau": "shear_tau",
          "fatigue_factor": "fatigue_factor"}


def fields_of(a) -> dict:
    """The nodal combined-stress fields of the analysis, computed once and kept on it."""
    cached = getattr(a, "_nodal_fields", None)
    if cached is None:
        cached = nodal_fields(a)
        a._nodal_fields = cached
    return cached


def write_fields_vtu(path: Path, a) -> None:
    """The Prandtl stress function, the warping function and the torsion stresses of the analysis
    (for the case's torque, or a unit torque when it is 0); σ, τzx, τzy and von Mises at the worst
    instant of the load cycle, the transverse-shear stresses and the FE-path fatigue factor of safety
    (where computed; infinite factors written as -1: no stress), plus any field a later step adds."""
    tr = a.torsion
    nf = fields_of(a) if a.extra.get("combined") else {}
    g = nf["phi_gradient"] if "phi_gradient" in nf else nodal_gradient(tr.basis, tr.phi)
    k = (abs(a.torque) or 1.0) / tr.J
    data = {"prandtl_phi": tr.phi, "warping_omega": tr.omega,
            "torsion_tau_zx": k * g[1], "torsion_tau_zy": -k * g[0], "torsion_tau": k * np.hypot(g[0], g[1])}
    for key, name in MAPPED.items():
        if key in nf:
            v = np.asarray(nf[key], float)
            data[name] = np.where(np.isfinite(v), v, -1.0)
    for name, field in a.extra.get("_vtu", {}).items():
        data[name] = field
    write_vtu(path, a.mesh, data)


def segment_vtu_bytes(a) -> bytes:
    """The 3-D segment's finest-mesh lateral boundary nodes (as vertices) with the von Mises stress
    over the load's nominal stress for each load, from the stress averaged at the nodes (the one the
    factors are read from): the stress on the surface near the feature, per unit nominal stress. A half
    or quarter model's nodes come completed by reflection (fem.solid.mirrored_surface_stresses): the
    whole segment's surface. Returned as the bytes of a VTU file."""
    finest = a.extra["segment"]["study"].finest
    first = next(iter(finest.values()))
    data = {}
    for load, r in finest.items():
        s = r.node_stress
        vm = np.sqrt(0.5 * ((s[0, 0] - s[1, 1]) ** 2 + (s[1, 1] - s[2, 2]) ** 2 + (s[2, 2] - s[0, 0]) ** 2)
                     + 3.0 * (s[0, 1] ** 2 + s[1, 2] ** 2 + s[2, 0] ** 2))
        data[f"von_mises_over_nominal_{load}"] = vm / abs(r.nominal)
    pts = np.asarray(first.node_points).T
    with tempfile.TemporaryDirectory() as d:
        path = Path(d) / "segment.vtu"
        meshio.Mesh(pts, [("vertex", np.arange(len(pts)).reshape(-1, 1))], point_data=data).write(path)
        return path.read_bytes()


def composite_vtu_bytes(a) -> bytes:
    """``section.vtu`` of a composite section (on its own, or a layout's station): the finest mesh as
    6-node triangles with, per element (cell data, since the stresses jump at every interface):
    ``region`` and ``material`` (the index of the region and of its material, in the order of the
    case's regions, both from 0), ``torsion_tau`` (|τ| under the case's torque, or per unit torque
    [Pa/(N·m)] when it is 0), ``normal_sigma`` (σ = Eₖ·ε under the case's N, Mx, My, transformed
    section) and ``von_mises`` (√(σ² + 3τ²)), each at the element's centroid; per node, the stress
    function ``prandtl_phi`` and the warping function ``warping_omega`` (one unit twist rate).
    Returned as the bytes of a VTU file; the region names are in results.json ``regions``."""
    case = a.case
    sol = a.extra["composite"]["solution"]
    cm, tr, pr = sol.mesh, sol.torsion, sol.props
    E = np.array([m.elastic_modulus for m in case.region_materials])
    T = abs(case.loads.torque) or 1.0
    _, g, x = centroid_values(cm.mesh, tr.phi)
    tau = np.hypot(g[0], g[1]) / tr.GJ * T
    Mx, My = case.loads.bending
    sigma = E[cm.region_of] * pr.strain(case.loads.axial, Mx, My, x[0], x[1])
    cells = {"region": cm.region_of.astype(np.int64), "material": cm.region_of.astype(np.int64),
             "torsion_tau": tau, "normal_sigma": sigma, "von_mises": np.hypot(sigma, np.sqrt(3.0) * tau)}
    with tempfile.TemporaryDirectory() as d:
        path = Path(d) / "section.vtu"
        write_vtu(path, cm, {"prandtl_phi": tr.phi, "warping_omega": tr.omega}, cells)
        return path.read_bytes()


def layout_segment_vtu_bytes(a) -> bytes | None:
    """A layout's 3-D station features as one point cloud along the shaft (``segment.vtu``): every
    station segment's surface nodes (away from its model's end faces; a half or quarter model's completed
    by reflection to the whole surface) in the station's x, y and
    z along the shaft, with ``station`` (its index), ``von_mises`` [Pa] (the largest over the load cycle
    of the station's governing loads, the 3-D superposition) and ``von_mises_over_nominal_<load>`` per
    unit load. None when no station has a 3-D feature."""
    shaft = (a.extra.get("shaft") or {}).get("shaft")
    analyses = a.extra.get("shaft_stations") or []
    pts, data = [], {"station": [], "von_mises": [], **{f"von_mises_over_nominal_{k}": [] for k in LOADS}}
    for i, st in enumerate(getattr(shaft, "stations", None) or []):
        if "segment_stresses" not in st.kt or i >= len(analyses):
            continue
        local = st.kt["segment_stresses"][0]
        fl = local["fields"]
        ld = analyses[i].case.loads
        sp = superpose(fl, float(ld.axial or 0.0), float(ld.bending[0]), float(ld.bending[1]), float(ld.torque or 0.0),
                       bool(ld.rotating))
        p = np.array(sp.points)
        p[2] += local["centre"] - local["length"] / 2
        pts.append(p.T)
        data["station"].append(np.full(p.shape[1], float(i)))
        data["von_mises"].append(sp.vm_peak)
        for k in LOADS:
            r = local["study"].finest[k]
            data[f"von_mises_over_nominal_{k}"].append(von_mises(np.asarray(surface_stress(r)))[fl.keep] / abs(r.nominal))
    if not pts:
        return None
    xyz = np.vstack(pts)
    point_data = {k: np.concatenate(v) for k, v in data.items()}
    with tempfile.TemporaryDirectory() as d:
        path = Path(d) / "segment.vtu"
        meshio.Mesh(xyz, [("vertex", np.arange(len(xyz)).reshape(-1, 1))], point_data=point_data).write(path)
        return path.read_bytes()

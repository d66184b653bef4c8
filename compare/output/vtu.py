"""The section's fields for a viewer: ``section.vtu`` (VTK unstructured grid), SI units."""
from __future__ import annotations

import tempfile
from pathlib import Path

import meshio
import numpy as np

from fem.export import nodal_gradient, write_vtu

from ..checks.fields import nodal_fields

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
    factors are read from): the stress on the surface near the feature, per unit nominal stress.
    Returned as the bytes of a VTU file."""
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

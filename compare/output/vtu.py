"""The section's fields for a viewer: ``section.vtu`` (VTK unstructured grid), SI units."""
from __future__ import annotations

from pathlib import Path

import numpy as np

from fem.export import nodal_gradient, write_vtu


def write_fields_vtu(path: Path, a) -> None:
    """The Prandtl stress function, the warping function and the torsion stresses of the analysis
    (for the case's torque, or a unit torque when it is 0), plus any field a later step adds."""
    tr = a.torsion
    g = nodal_gradient(tr.basis, tr.phi)
    k = (abs(a.torque) or 1.0) / tr.J
    data = {"prandtl_phi": tr.phi, "warping_omega": tr.omega,
            "torsion_tau_zx": k * g[1], "torsion_tau_zy": -k * g[0], "torsion_tau": k * np.hypot(g[0], g[1])}
    for name, field in a.extra.get("_vtu", {}).items():
        data[name] = field
    write_vtu(path, a.mesh, data)

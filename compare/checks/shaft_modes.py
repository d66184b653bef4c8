"""The mode shapes of the layout's first critical speeds, for the report's drawing of them.

:func:`compare.checks.shaft_beam.critical_speeds` keeps the frequencies only; this solves the same
eigenproblem again (the same vibrating beam, supports, part masses and diametral inertias) and keeps
the shapes, normalised to a largest deflection of 1 (sign: that point positive). The frequencies
are returned beside them so the caller can see they are the ones in the results.
"""
from __future__ import annotations

import numpy as np

from fem.beam import Beam, natural_frequencies

from ..case.shaft import Shaft
from .shaft_beam import mass_per_length, node_of


def mode_shapes(shaft: Shaft, layout: dict, count: int = 3) -> dict | None:
    """``{"z": nodes [m], "omega": [rad/s], "shapes": [[w per node], ...]}`` (each shape scaled to a
    largest |w| of 1), or None where the layout computed no critical speed."""
    if "skipped" in layout["critical_speeds"] or "model" not in layout:
        return None
    model = layout["model"]
    beam, z = model.beam, model.beam.z
    sup = [(node_of(z, s.at), s.stiffness) for s in shaft.supports]
    masses = [(node_of(z, ld.at), ld.mass) for ld in shaft.loads if ld.mass]
    inertias = [(node_of(z, ld.at), ld.inertia / 2) for ld in shaft.loads if ld.inertia]  # as critical_speeds
    rhoA, rhoI = mass_per_length(model, shaft.density)
    vib = Beam(beam.z, beam.EI, beam.kGA, rhoA=rhoA, rhoI=rhoI)
    omega, modes = natural_frequencies(vib, sup, masses, inertias, count=count)
    shapes = []
    for k in range(modes.shape[1]):
        w = modes[:, k]
        i = int(np.argmax(np.abs(w)))
        shapes.append((w / w[i]).tolist() if w[i] else w.tolist())
    return {"z": [float(v) for v in z], "omega": [float(w) for w in omega], "shapes": shapes}

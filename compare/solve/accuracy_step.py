"""Turn the convergence study into ``results.json`` keys ``convergence`` and ``accuracy``."""
from __future__ import annotations

from .accuracy import FS, RATIO, TARGETED, estimates

EXIT_ACCURACY = 3


def accuracy_step(a) -> None:
    st = a.study
    est = estimates(st.solutions)
    targeted = {k: v for k, v in est.items() if k in TARGETED}
    gcis = [v["gci"] for v in targeted.values() if v["gci"] is not None]
    achieved = max(gcis) if gcis else None
    met = achieved is not None and achieved <= st.target and all(v["gci"] is not None for v in targeted.values())
    singular = "tau_max_corner" in est
    acc = {
        "target": st.target,
        "achieved": achieved,
        "met": bool(met),
        "governing_quantity": max(targeted, key=lambda k: targeted[k]["gci"] or 0.0) if targeted else None,
        "limited_by": st.limited,
        "meshes": [s.dofs for s in st.solutions],
        "refinement_ratio": RATIO,
        "safety_factor": FS,
        "adaptive_steps": st.adapt_steps,
        "indicator_max": st.indicator_max,
        "estimator": "recovery (Zienkiewicz–Zhu) indicator drives the mesh; the GCI of three similar meshes is the error estimate",
        "seconds": st.seconds,
        "singular_corners": bool(singular),
    }
    if singular:
        acc["singular_note"] = ("the section has sharp re-entrant corners: the stress there does not converge "
                                "and no value is given for it; tau_max is the peak away from them")
    a.extra["convergence"] = est
    a.extra["accuracy"] = acc
    if not met:
        a.extra["exit_code"] = EXIT_ACCURACY

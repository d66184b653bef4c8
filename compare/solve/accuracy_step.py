"""Turn the convergence study into ``results.json`` keys ``convergence`` and ``accuracy``."""
from __future__ import annotations

from .accuracy import FS, RATIO, RATIO_BAND, TARGETED, estimates
from .selfchecks import failed, self_checks

EXIT_ACCURACY = 3


def accuracy_step(a) -> None:
    st = a.study
    est = estimates(st.solutions)
    targeted = {k: v for k, v in est.items() if k in TARGETED}
    gcis = [v["gci"] for v in targeted.values() if v["gci"] is not None]
    achieved = max(gcis) if gcis else None
    within = achieved is not None and achieved <= st.target and all(v["gci"] is not None for v in targeted.values())
    checks = self_checks(a, est, st.target, st.solves)
    bad = failed(checks)
    met = within and st.distinct and not bad
    singular = "tau_max_corner" in est
    reasons = []
    if bad:
        reasons.append("self-check failed: " + "; ".join(c["name"] for c in bad))
    if not st.distinct:
        reasons.append("the meshes of the study are not distinct and refined by the stated ratio: the error is unknown")
    if st.limited:
        reasons.append(st.limited)
    if not within and not st.limited:
        reasons.append("no error estimate within the target")
    acc = {
        "target": st.target,
        "achieved": achieved,
        "met": bool(met),
        "governing_quantity": max(targeted, key=lambda k: targeted[k]["gci"] or 0.0) if targeted else None,
        "limited_by": st.limited,
        "not_met_because": reasons if not met else [],
        "error_bound": achieved if met else None,
        "meshes": [s.dofs for s in st.solutions],
        "refinement_ratio": RATIO,
        "measured_ratios": st.ratios,
        "measured_ratio_band": list(RATIO_BAND),
        "meshes_distinct": bool(st.distinct),
        "linear_solves": {"count": len(st.solves),
                          "methods": sorted({s["method"] for s in st.solves}),
                          "largest_relative_residual": max((s["residual"] for s in st.solves), default=None)},
        "safety_factor": FS,
        "adaptive_steps": st.adapt_steps,
        "refinement_steps": st.refine_steps,
        "indicator_max": st.indicator_max,
        "estimator": ("recovery (Zienkiewicz–Zhu) indicator drives the mesh; the error estimate of each quantity is the "
                      "GCI of three similar meshes, widened for the torsion peak by the parting of its two independent "
                      "evaluations and for J by the J bracket (convergence.<q>.estimate_kind says which)"),
        "seconds": st.seconds,
        "singular_corners": bool(singular),
    }
    if singular:
        acc["singular_note"] = ("the section has sharp re-entrant corners: the stress there does not converge "
                                "and no value is given for it; tau_max is the peak away from them")
    a.extra["convergence"] = est
    a.extra["checks"] = checks
    a.extra["accuracy"] = acc
    if not met:
        a.extra["exit_code"] = EXIT_ACCURACY

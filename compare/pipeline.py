"""One case, end to end, in the order the data flows: solve (mesh, properties, torsion, shear, the
accuracy study), set beside the hand formulas (pairs), check (combined stress, static, fatigue,
materials). :func:`analyse` returns the :class:`~compare.pairs.analysis.Analysis` with every step's
records; :func:`compare.output.results.build_results` turns it into the ``results.json`` dictionary.
"""
from __future__ import annotations

import time

from .case.case import Case
from .checks.composite_checks import composite_checks
from .checks.feature_bound import no_verdict_first
from .checks.feature_findings import factors_only, feature_findings
from .checks.findings import findings_step
from .checks.shaft_checklist import checklist_step
from .checks.polymer import long_term_layout
from .checks.segment_far_field import segment_case_step
from .checks.shaft_stations import layout_step
from .checks.step import combined_step
from .pairs.analysis import Analysis, solve_case
from .pairs.composite_step import composite_step
from .pairs.segment_step import segment_step
from .pairs.feature_step import attach_features, shaft_features_step
from .pairs.shear_step import shear_step
from .pairs.station_segment import station_segments_step
from .pairs.spline_step import spline_step
from .solve.accuracy_step import accuracy_step
from .solve.selfchecks import self_checks


def analyse(case: Case, fineness: float | None = None, study: bool = True) -> Analysis:
    """Solve the case and run every later step. With ``study`` (the default, and what the command
    line does), refine to the case's accuracy target and run the convergence study; the results come
    from the finest mesh."""
    if case.shaft is not None:  # the whole shaft, then each station through this same function
        feats = shaft_features_step(case)  # shoulders and grooves first: their FE Kt go to the stations
        segs = station_segments_step(case)  # a station's 3-D feature: its Kt, Kts and unit stresses
        if case.shaft.factors_only:  # no loads, no stations: the features' factors are the whole result
            return factors_only(case, feats)
        a = layout_step(case, lambda c: analyse(c, fineness, study), fineness)
        checklist_step(a, case)  # keys, splines, press fits, bearing life, torsion along the shaft
        attach_features(a, feats)
        if segs is not None:  # results 'segments': each station's 3-D study
            a.extra["shaft"]["segments"] = segs
        # the layout itself and its title (the report's drawing and mode shapes; the stations' titles add their place)
        a.extra["shaft"].update(shaft=case.shaft, title=case.title)
        lt = long_term_layout(a)  # a polymer shaft: deflections and slopes after the service life
        if lt is not None:
            a.extra["polymer_layout"] = lt
        a.extra["warnings"] = no_verdict_first(feature_findings(a) + list(a.extra.get("warnings") or []))
        return a
    t0 = time.perf_counter()
    if case.segment is not None:  # a short shaft length with a 3-D feature: its factors on three meshes
        a = segment_step(case, fineness)
        segment_case_step(a)  # is the model long enough for its feature (no verdict where not)
        a.seconds["total"] = time.perf_counter() - t0
        return a
    if case.section.kind == "composite":  # bonded regions of several materials: their own solve and checks
        a = composite_step(case, fineness)
        composite_checks(a)
        a.extra["warnings"] = a.extra.pop("composite_warnings", [])
        a.seconds["total"] = time.perf_counter() - t0
        return a
    a = solve_case(case, fineness, study)  # mesh, properties, torsion and its pairs
    spline_step(a)  # a spline's FE results beside the round bars used for it
    shear_step(a)
    if a.study is not None:
        accuracy_step(a)
    else:
        a.extra["checks"] = self_checks(a, target=case.analysis.accuracy)
    t5 = time.perf_counter()
    combined_step(a)
    a.seconds["combined"] = time.perf_counter() - t5
    findings_step(a)  # last: what the numbers of every step cannot support
    a.seconds["total"] = time.perf_counter() - t0
    return a

"""A layout station whose 3-D feature (a keyseat's end) ends next to a shoulder of the shaft's outline:
the station's 3-D segment is built WITH that shoulder (compare/case/shaft_segment.py), so one model holds
both raisers, and the record says so (``shoulder_in_model``); a shoulder out of reach is left out; a
shoulder stepping down along the shaft is modelled stepping up and mirrored back (the superposed unit
fields, compare/solve/segment_superpose.unit_fields ``mirror``).

Outside checks: (1) the elementary stresses of the plain round bar in tension, pure bending and torsion
(Timoshenko & Goodier, Theory of Elasticity, 3rd ed.) are unchanged by a reflection in a cross-section's
plane (the bar is symmetric), so the mirrored unit fields of those exact fields equal the unmirrored ones
(exact, any mesh); (2) the combined model's bending factor is bounded below by the shoulder's own factor
from the meridian-section FE, less both error estimates: the keyseat, cut on one side of the smaller
diameter and clear of the fillet, removes material and leaves the fillet's peak on the other side (and in
the plane where the keyseat lies on the neutral axis) as it was or higher (Saint-Venant's principle: the
cut's disturbance fades within about a diameter; common practice), so the largest surface stress of the
combined part is at least the shoulder's.
"""
import copy
import math
from types import SimpleNamespace

import numpy as np
import pytest

from compare.case.case import parse_case
from compare.case.shaft_segment import COMBINED_MARGIN
from compare.pairs.station_segment import fillet_in_fe_path, station_segments_step, take_combined
from compare.solve.features import Feature, study_feature
from compare.solve.segment_superpose import LOADS, unit_fields
from fem import solid

KEYED = {"shape": "keyed", "diameter": 30, "keyways": [{"width": 8, "depth": 4, "fillet": 1.0, "angle": 90,
                                                         "length": 36}]}
UP = [{"from": 0, "to": 140, "diameter": 30}, {"from": 140, "to": 300, "diameter": 40, "fillet": 2}]
DOWN = [{"from": 0, "to": 90, "diameter": 40}, {"from": 90, "to": 300, "diameter": 30, "fillet": 2}]


def layout(segments, feature_from, fineness=0.2) -> dict:
    return {
        "case": {"units": "mm-N-MPa"},
        "material": {"elastic_modulus": "205 GPa", "poisson": 0.29},
        "analysis": {"accuracy": "25 %"},
        "shaft": {"length": 300, "supports": [{"at": 30}, {"at": 230}], "segments": segments,
                  "loads": [{"at": 110, "force": [0, -1000], "torque": 60}, {"at": 280, "torque": -60}],
                  "sections": [{"at": 110, "section": copy.deepcopy(KEYED), "feature_from": feature_from,
                                "segment": {"kind": "keyseat_end", "fineness": fineness}}]},
    }


def test_shoulder_within_reach_is_built_into_the_model():
    """Keyway 100-136 mm on the 30 mm seat, the step to 40 mm at 140 mm (fillet 2 mm: its start 2 mm
    from the keyseat's end, within one diameter): the model holds both; far away (step at 180 mm) it
    holds the keyseat alone; the step down along the shaft gives the same model, mirrored."""
    ss = parse_case(layout(UP, 100)).shaft.stations[0].segment
    sh = ss.shoulder_in_model
    assert sh["D"] == pytest.approx(0.040) and sh["fillet"] == pytest.approx(0.002) and sh["at"] == pytest.approx(0.14)
    assert sh["field"] == "shaft.segments[1].fillet" and sh["steps"] == "up" and not ss.mirrored
    key, shoulder = ss.model.features
    assert isinstance(shoulder, solid.Shoulder) and shoulder.D == pytest.approx(0.04)
    # the shoulder face and the keyseat's end 4 mm apart in the model as on the shaft
    assert shoulder.z - key.z1 == pytest.approx(0.004)
    assert solid.symmetry_of(ss.model) == 0  # a shoulder keeps the whole model
    # the model's mid-length on the shaft: its small end COMBINED_MARGIN diameters before the keyway's start
    assert ss.mid - ss.model.length / 2 == pytest.approx(0.100 - COMBINED_MARGIN * 0.030)

    down = parse_case(layout(DOWN, 94)).shaft.stations[0].segment  # keyway 94-130, the face at 90
    assert down.mirrored and down.shoulder_in_model["steps"] == "down"
    assert down.model == ss.model
    assert down.mid + (down.model.length / 2 - down.model.features[1].z) == pytest.approx(0.090)  # the face

    far = [{"from": 0, "to": 180, "diameter": 30}, {"from": 180, "to": 300, "diameter": 40, "fillet": 2}]
    alone = parse_case(layout(far, 100)).shaft.stations[0].segment
    assert alone.shoulder_in_model is None and len(alone.model.features) == 1


def test_shoulder_without_fillet_or_quarter_model_keeps_the_fallback():
    sharp = copy.deepcopy(UP)
    del sharp[1]["fillet"]
    ss = parse_case(layout(sharp, 100)).shaft.stations[0].segment
    assert ss.shoulder_in_model is None and "no fillet" in ss.shoulder_not_in_model
    c = layout(UP, 100)
    c["shaft"]["sections"][0]["segment"]["model"] = "quarter"
    ss = parse_case(c).shaft.stations[0].segment
    assert ss.shoulder_in_model is None and "whole model" in ss.shoulder_not_in_model


def _plain_bar(load, pts, d):
    """The plain bar's exact surface stress per unit load (Timoshenko & Goodier, 3rd ed.)."""
    x, y = pts[0], pts[1]
    n = pts.shape[1]
    s = np.zeros((3, 3, n))
    A, I, J = math.pi * d**2 / 4, math.pi * d**4 / 64, math.pi * d**4 / 32
    if load == "tension":
        s[2, 2] = 1 / A
    elif load == "bending_x":
        s[2, 2] = y / I
    elif load == "bending_y":
        s[2, 2] = x / I
    else:
        s[0, 2] = s[2, 0] = -y / J
        s[1, 2] = s[2, 1] = x / J
    return SimpleNamespace(load=1.0, points=pts, stress=s, nominal=1.0)


def test_mirrored_unit_fields_of_the_plain_bar_are_unchanged():
    rng = np.random.default_rng(3)
    d, L = 0.03, 0.1
    th = rng.uniform(0, 2 * math.pi, 50)
    pts = np.vstack([d / 2 * np.cos(th), d / 2 * np.sin(th), rng.uniform(0, L, 50)])
    finest = {k: _plain_bar(k, pts, d) for k in LOADS}
    a = unit_fields(finest, d, L, turn=30.0)
    b = unit_fields(finest, d, L, turn=30.0, mirror=True)
    got = {"fem": b.S, "exact": a.S}  # the exact field is its own mirror image
    assert np.allclose(got["fem"], got["exact"], rtol=0, atol=1e-9 * np.abs(a.S).max())
    assert np.allclose(b.points[2], L - a.points[2])


@pytest.mark.slow
def test_combined_model_runs_and_bounds_the_shoulder_factor():
    """The coarse combined study (fineness 0.2, whole model): the record names the shoulder in the model,
    the station's factors are the combined model's own (no larger-of-the-two), and its bending factor is
    at least the meridian FE's shoulder factor less both estimates (module docstring, check 2)."""
    case = parse_case(layout(UP, 100))
    (rec,) = station_segments_step(case)
    st = case.shaft.stations[0]
    assert rec["shoulder_in_model"]["field"] == "shaft.segments[1].fillet" and rec["model"] == "whole"
    assert "also_on_a_shoulder_or_groove" not in rec and rec["grooves_in_model"] is False
    assert st.kt["kt_bending"][0] == rec["kt_bending_used"]["value"] and "3-D FE" in st.kt["kt_bending"][1]
    assert rec["span"] == pytest.approx([0.100, 0.136])
    fields = st.kt["segment_stresses"][0]["fields"]
    z = fields.points[2] + st.kt["segment_stresses"][0]["centre"] - rec["length"] / 2
    assert z.min() == pytest.approx(0.100 - COMBINED_MARGIN * 0.030, abs=1e-6) and z.max() > 0.140  # the model reaches past the face
    mer = study_feature(Feature("shoulder", 0.14, 0.030, 0.040, 0.002, "shaft.segments[1].fillet"), poisson=0.29)
    m = mer["bending"]
    for key in ("kt_bending_x", "kt_bending_y"):
        g = rec[f"{key}_gci"]
        if g is None:  # no estimate on these coarse meshes: no bound (said in the status)
            assert rec[f"{key}_status"].startswith("no estimate"), rec[f"{key}_status"]
            continue
        bound = m["kt"] * (1 - g - m["gci"])
        print(f"\n{key}: combined {rec[key]:.3f} (estimate {100 * g:.1f} %), meridian shoulder {m['kt']:.3f} "
              f"(estimate {100 * m['gci']:.2f} %), bound {bound:.3f}; unknowns {rec['dofs']}, {rec['seconds']:.0f} s")
        assert rec[key] >= bound, (key, rec[key], bound)
    assert max(rec["kt_bending_x"], rec["kt_bending_y"]) >= m["kt"] * (1 - 0.25 - m["gci"])  # the case's target


def test_combined_model_over_max_dofs_falls_back_to_the_feature_alone():
    """analysis.max_dofs below the combined (whole) model's first mesh: the station studies its keyseat
    alone (its quarter model), records why the shoulder was left out, and keeps the larger-of-the-two
    rule; the limit is kept (no mesh above it solved)."""
    c = layout(UP, 100)
    c["analysis"]["max_dofs"] = 12000
    case = parse_case(c)
    (rec,) = station_segments_step(case)
    assert rec["shoulder_in_model"] is None and "exceeded a limit" in rec["shoulder_not_in_model"]
    assert rec["model"] == "quarter" and max(rec["dofs"]) <= 12000
    ss = case.shaft.stations[0].segment
    assert len(ss.model.features) == 1 and not ss.mirrored and ss.mid == ss.centre


def test_a_larger_meridian_shoulder_factor_is_kept_beside_the_combined_model():
    """The combined model's factor replaces the shoulder's meridian factor only when it is not smaller:
    the 3-D meshes are far coarser at the fillet (the winch demo's fillet read 6 % low inside a 22 %
    estimate), so the larger of the two is used, and the record says which (safe side: a design check
    takes the larger of two models' factors for one raiser; common practice)."""
    kt = {"kt_bending": (2.0, "meridian FE"), "kts_torsion": (1.3, "meridian FE")}
    rec = {}
    assert take_combined(kt, "kt_bending", 1.9, "3-D FE", rec) is False
    assert kt["kt_bending"] == (2.0, "meridian FE")
    assert rec["kept_shoulder_factor"]["kt_bending"]["combined_3d"] == 1.9
    assert take_combined(kt, "kts_torsion", 1.6, "3-D FE", rec) is True
    assert kt["kts_torsion"] == (1.6, "3-D FE")
    assert rec["replaced_shoulder_or_groove_factor"]["kts_torsion"]["value"] == 1.3
    fresh = {}
    assert take_combined(fresh, "kt_bending", 1.9, "3-D FE", {}) is True and fresh["kt_bending"] == (1.9, "3-D FE")


def test_the_fillet_stresses_stay_in_the_fe_path_where_a_meridian_factor_was_kept():
    """Where the meridian factor was kept as the larger (the combined 3-D model reads the fillet low on its
    coarse meshes), the FE path must not read the combined model's local stresses alone: the fillet's
    meridian stresses stay, and the station's FE path takes the worse of the two (safe side; common
    practice, as for a station also on a shoulder). Where the combined model's factors were taken, they go."""
    kt = {"kt_bending": (2.0, "meridian FE"), "fillet_stresses": ({"local": 1}, "shaft.segments[1].fillet")}
    rec = {}
    take_combined(kt, "kt_bending", 1.9, "3-D FE", rec)
    assert fillet_in_fe_path(kt, rec) is True
    assert "fillet_stresses" in kt and "worse" in rec["fe_path_with_fillet"]
    kt2 = {"kt_bending": (1.8, "meridian FE"), "fillet_stresses": ({"local": 1}, "shaft.segments[1].fillet")}
    rec2 = {}
    take_combined(kt2, "kt_bending", 1.9, "3-D FE", rec2)
    assert fillet_in_fe_path(kt2, rec2) is False
    assert "fillet_stresses" not in kt2 and "fe_path_with_fillet" not in rec2
    assert fillet_in_fe_path({}, {"kept_shoulder_factor": {"kt_bending": {}}}) is False  # nothing to keep


def test_unit_fields_end_zones_in_each_ends_own_diameter():
    """The FE path's points are read away from the model's end faces, each end in its own diameter
    (fem.solid.PEAK_END_ZONE of d at z = 0, of D at z = length beyond a shoulder in the model;
    Saint-Venant's principle, Timoshenko & Goodier, Theory of Elasticity, 3rd ed., Sec. 19); a mirrored
    model's D end lies at the station's z = 0 after the reflection."""
    from fem.solid import PEAK_END_ZONE
    d, D, L = 0.03, 0.045, 0.15
    z = np.linspace(0, L, 3001)
    pts = np.vstack([d / 2 * np.ones_like(z), np.zeros_like(z), z])
    finest = {k: _plain_bar(k, pts, d) for k in LOADS}
    up = unit_fields(finest, d, L, far_d=D)
    assert np.array_equal(up.keep, (z > PEAK_END_ZONE * d) & (z < L - PEAK_END_ZONE * D))
    down = unit_fields(finest, d, L, far_d=D, mirror=True)
    zm = L - z
    assert np.array_equal(down.keep, (zm > PEAK_END_ZONE * D) & (zm < L - PEAK_END_ZONE * d))
    assert np.array_equal(unit_fields(finest, d, L).keep, (z > PEAK_END_ZONE * d) & (z < L - PEAK_END_ZONE * d))

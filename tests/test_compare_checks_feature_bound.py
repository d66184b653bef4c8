"""A station's verdict against the error bound of the shoulder or groove factor it rests on
(compare/checks/feature_bound.py).

The rule's premise is checked on the criteria the checks use (the fatigue and first-cycle yield
criteria as Shigley's Mechanical Engineering Design, 9th ed., Secs. 5-5 and 7-4, writes them, coded in
classic/fatigue.py): raising every stress by (1 + b) divides each factor of safety by exactly (1 + b).
Then the rule itself on records, and once through the command line on the countershaft demo's
shoulder station, with its own study's bound and factor read first (so no mesh's luck decides it)."""
from __future__ import annotations

import json
import math
from types import SimpleNamespace

import numpy as np
import pytest

import classic.fatigue as cf
from compare.checks.feature_bound import BOUND_REASON, EXIT_BOUND, NO_VERDICT, bound_verdict, used_feature_bounds

SE, SUT, SY = 180e6, 600e6, 420e6


@pytest.mark.parametrize("b", [0.011, 0.05, 0.3])
def test_every_criterion_divides_by_the_stress_factor(b):
    """n(k·σa, k·σm) = n(σa, σm)/k for the modified Goodman, Gerber, ASME elliptic, Soderberg and Langer
    lines (each an equation in n·σ: Shigley, 9th ed., Sec. 7-4) and for static von Mises (n = Sy/σ')."""
    sa, sm = np.array([40e6, 90e6, 10e6]), np.array([60e6, 20e6, 150e6])
    k = 1 + b
    for name, f in (("goodman", lambda a, m: cf.goodman_factor(a, m, SE, SUT)),
                    ("gerber", lambda a, m: cf.gerber_factor(a, m, SE, SUT)),
                    ("asme_elliptic", lambda a, m: cf.asme_elliptic_factor(a, m, SE, SY)),
                    ("soderberg", lambda a, m: cf.soderberg_factor(a, m, SE, SY)),
                    ("langer", lambda a, m: cf.langer_factor(a, m, SY)),
                    ("von_mises", lambda a, m: SY / (a + m))):
        got = {"fem": np.asarray(f(k * sa, k * sm)), "exact": np.asarray(f(sa, sm)) / k}
        assert got["fem"] == pytest.approx(got["exact"], rel=1e-12), name


def _analysis(n, nd, meets=None):
    gov = {"factor": n, "design_factor": nd, "criterion": "soderberg",
           "meets_design_factor": None if nd is None else bool(n >= nd)}
    if meets is not None:
        gov["meets_design_factor"] = meets
    return SimpleNamespace(extra={"governing": gov, "static": {"meets_design_factor": {"von_mises": True}},
                                  "materials": [{"meets": True}], "warnings": [{"code": "other"}]})


USED = {"kt_bending": {"field": "shaft.segments[1].fillet", "bound": 0.011},
        "kts_torsion": {"field": "shaft.segments[1].fillet", "bound": 0.002}}


def test_bound_within_the_target_changes_nothing():
    a = _analysis(2.01, 2.0)
    rec = {}
    assert bound_verdict(a, rec, USED, 0.02) is None and rec == {}
    assert a.extra["governing"]["meets_design_factor"] is True and a.extra["warnings"] == [{"code": "other"}]


def test_verdict_that_survives_the_bound_is_kept_and_says_so():
    n, nd, b = 2.5, 2.0, 0.011
    a = _analysis(n, nd)
    rec = {}
    out = bound_verdict(a, rec, USED, 0.01)
    assert out["verdict"] == "holds" and rec["feature_bound"] is out
    hb = a.extra["governing"]["holds_within_feature_bound"]
    assert hb["factor_lowered"] == pytest.approx(n / (1 + b)) and hb["bound"] == b
    assert a.extra["governing"]["meets_design_factor"] is True and "exit_code" not in a.extra


@pytest.mark.parametrize("bound", [0.011, None])
def test_margin_within_the_bound_withdraws_the_verdict(bound):
    """n = 2.01 meets nd = 2 by 0.5 %, less than a 1.1 % bound (or an unknown one): no verdict, the
    value kept beside, the warning first, exit 3."""
    used = {**USED, "kt_bending": {**USED["kt_bending"], "bound": bound}}
    a = _analysis(2.01, 2.0)
    gov = a.extra["governing"]
    out = bound_verdict(a, {}, used, 0.01)
    assert out["verdict"] == "withdrawn"
    g = a.extra["governing"]
    assert g["no_verdict"] and g["factor"] is None and g["reason"] == BOUND_REASON and g["away_from_corners"] is gov
    assert a.extra["static"]["meets_design_factor"] == {"von_mises": None} and a.extra["materials"][0]["meets"] is None
    assert [w["code"] for w in a.extra["warnings"]] == [NO_VERDICT, "other"]
    w = a.extra["warnings"][0]
    assert w["bound"] == bound and w["fields"] == ["shaft.segments[1].fillet"]
    assert a.extra["exit_code"] == EXIT_BOUND


def test_failing_verdict_and_no_design_factor_are_kept():
    a = _analysis(1.9, 2.0)
    assert bound_verdict(a, {}, USED, 0.001)["verdict"] == "does not meet (kept)"
    assert a.extra["governing"]["meets_design_factor"] is False
    a = _analysis(1.9, None)
    assert bound_verdict(a, {}, USED, 0.001)["verdict"] == "none to test"
    assert not a.extra["governing"].get("no_verdict")


def test_which_factors_the_station_rests_on():
    """The hand path's factors while they are still the feature study's (same source), not one a 3-D
    model or the station's own fatigue table replaced; all three where the FE path reads the fillet."""
    src_b, src_t, src_a = "meridian, f, GCI 1.10%", "meridian, f, GCI 0.20%", "meridian, f, GCI 1.10%"
    fb = ({"kt_bending": {"bound": 0.011, "source": src_b}, "kts_torsion": {"bound": 0.002, "source": src_t},
           "kt_axial": {"bound": 0.011, "source": src_a}}, "f")
    st = SimpleNamespace(kt={"kt_bending": (2.3, src_b), "kts_torsion": (1.5, src_t), "feature_bounds": fb}, fatigue={})
    assert set(used_feature_bounds(st)) == {"kt_bending", "kts_torsion"}
    st.kt["kt_bending"] = (2.4, "3-D segment study")  # replaced by a combined 3-D model's
    assert set(used_feature_bounds(st)) == {"kts_torsion"}
    st.fatigue = {"kts_torsion": 1.4}  # the station's own value
    assert used_feature_bounds(st) is None
    st.kt["fillet_stresses"] = ({}, "f")  # the FE path reads the fillet: all three
    assert set(used_feature_bounds(st)) == {"kt_bending", "kts_torsion", "kt_axial"}
    assert used_feature_bounds(SimpleNamespace(kt={}, fatigue={})) is None


def test_countershaft_shoulder_station_through_the_command_line(tmp_path, monkeypatch, capsys):
    """The countershaft demo's shoulder station (cases/countershaft_layout.toml, an invented scenario):
    its own n and its shoulder factors' largest bound are read from a first run; the target is taken
    below that bound (the test's monkeypatch: the check sees target 0, whatever this machine's meshes
    gave), then the design factor is put inside and outside the margin the bound allows."""
    from pathlib import Path

    from compare.checks import shaft_stations
    from compare.cli.main import main
    from compare.pipeline import analyse
    from compare.case.case import load_case

    real = shaft_stations.bound_verdict
    monkeypatch.setattr(shaft_stations, "bound_verdict", lambda a, rec, used, target: real(a, rec, used, 0.0))
    root = Path(__file__).resolve().parents[1]
    text = (root / "cases" / "countershaft_layout.toml").read_text()
    a = analyse(load_case(root / "cases" / "countershaft_layout.toml"))
    (i, rec), = [(i, r) for i, r in enumerate(a.extra["shaft"]["stations"]) if r.get("feature_bound")]
    n, b = rec["feature_bound"]["factor"], rec["feature_bound"]["bound"]
    assert rec["feature_bound"]["verdict"] == "none to test" and n > 1 and b > 0  # no design factor in the demo
    for nd, withdrawn in ((n / (1 + b / 2), True), (n / (1 + 2 * b), False)):
        case = tmp_path / "cs.toml"
        case.write_text(text.replace('accuracy = "1 %"', f'accuracy = "1 %"\ndesign_factor = {nd!r}'))
        code = main(["run", str(case), "--out", str(tmp_path / "out"), "--no-report"])
        printed = capsys.readouterr().out
        res = json.loads((tmp_path / "out" / "results.json").read_text())
        sl = res["section_loads"][i]
        gov = sl["results"]["governing"]
        if withdrawn:
            assert gov["no_verdict"] and gov["reason"] == BOUND_REASON and gov["away_from_corners"]["factor"] == n
            assert sl["results"]["warnings"][0]["code"] == NO_VERDICT and code == EXIT_BOUND
            assert "NO VERDICT: the factor of safety" in printed
        else:
            hb = gov["holds_within_feature_bound"]
            assert not gov.get("no_verdict") and gov["meets_design_factor"] is True
            assert math.isclose(hb["factor_lowered"], n / (1 + b), rel_tol=1e-12)
            assert "meets the design factor also with the stresses raised" in printed


def test_no_verdict_reasons_lead_the_station_warnings():
    """The reasons a station has no verdict come first, in their order, before the feature findings the
    governing station also receives."""
    from compare.checks.feature_bound import no_verdict_first

    ws = [{"code": "feature_target_not_shown"}, {"code": "segment_station_too_short"}, {"code": "other"},
          {"code": NO_VERDICT}, {"code": "feature_station_sharp_no_verdict"}]
    assert [w["code"] for w in no_verdict_first(ws)] == ["segment_station_too_short", NO_VERDICT,
                                                         "feature_station_sharp_no_verdict",
                                                         "feature_target_not_shown", "other"]

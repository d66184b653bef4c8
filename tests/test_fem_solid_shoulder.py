"""A shoulder in the 3-D segment (fem/solid.py): loads carried through the traction end, the refusals,
a cross hole beside a shoulder, and the 3-D factors against the meridian-section FE of the same shoulder.

The meridian-section FE (fem/axisym.py through compare/solve/features.study_feature) is the project's
own; the external context is the fit of Roark's Formulas for Stress and Strain, 7th ed. (Young &
Budynas), Table 17.1, case 18 (classic/notch_fits.py, coefficients from memory), printed beside and
not used as the pass mark.
"""
import math
import time

import pytest

from classic.notch_fits import kt_fit
from compare.solve.features import Feature, study_feature
from compare.solve.segments import KEYS, study_segment
from fem import solid
from fem.errors import InputError

d = 0.03
E, NU = 2.0e11, 0.3
G = E / (2 * (1 + NU))


def _segment(D=1.5 * d, at=1.25 * d, fillet=0.1 * d, beyond=1.25, others=()):
    """d from z = 0 to the shoulder face at ``at``, D beyond it for ``beyond`` larger diameters."""
    return solid.Segment(d, at + beyond * D, (solid.Shoulder(D, at, fillet), *others))


@pytest.mark.parametrize("fineness", [0.35, 0.45])
def test_traction_end_carries_the_load_of_the_held_end(fineness):
    """The d end holds the plain bar's exact displacement at strain ε, curvature κ or twist θ; the D
    end carries the plain-bar stress of D scaled to the same load. The reactions at the d end are
    then the d bar's N = EεA, M = EκI, T = GθJ (exact for the prismatic bar; Timoshenko & Goodier,
    Theory of Elasticity, 3rd ed.), to the curved boundary's area error (two meshes)."""
    sm = solid.mesh_segment(_segment(), fineness=fineness)
    res = solid.solve_segment(sm, solid.LOADS, E, NU)
    A, I, J = math.pi * d**2 / 4, math.pi * d**4 / 64, math.pi * d**4 / 32
    exact = {"tension": E * 1e-3 * A, "bending_x": E * (1e-3 / d) * I, "bending_y": E * (1e-3 / d) * I,
             "torsion": G * (1e-3 / d) * J}
    for load, r in res.items():
        got = {"fem": r.load, "exact": exact[load]}
        assert got["fem"] == pytest.approx(got["exact"], rel=2e-4), (load, got)
        assert r.peak_feature == "shoulder", (load, r.peak_at)
        z = r.peak_at[2]
        assert 1.15 * d - 1e-9 <= z <= 1.25 * d + 1e-9, (load, z)  # on the fillet
        # each end against its own bar's elementary stress (the plain bar's single-point discretisation
        # error on coarse meshes, as tests/test_fem_solid.py: bounded by 10 %)
        assert r.far_field < 0.1, (load, r.far_field)


def test_shoulder_refusals_name_the_field():
    bad = [(dict(D=0.9 * d), "features[0].D"), (dict(fillet=0.0), "features[0].fillet"),
           (dict(fillet=0.3 * d), "features[0].fillet"), (dict(at=0.6 * d), "features[0].z"),
           (dict(beyond=0.5), "features[0].z")]
    for kw, field in bad:
        with pytest.raises(InputError) as e:
            _segment(**kw).check()
        assert e.value.field == f"segment.{field}", (kw, e.value.field)
    two = solid.Segment(d, 6 * d, (solid.Shoulder(1.5 * d, 1.5 * d, 0.1 * d), solid.Shoulder(2 * d, 4 * d, 0.1 * d)))
    with pytest.raises(InputError) as e:
        two.check()
    assert e.value.field == "segment.features[1]"
    on_fillet = _segment(others=(solid.CrossHole(0.2 * d, 1.15 * d),))
    with pytest.raises(InputError) as e:
        on_fillet.check()
    assert e.value.field == "segment.features[1].z"
    crowd = _segment(at=2.5 * d, others=(solid.CrossHole(0.2 * d, 0.9 * d), solid.CrossHole(0.2 * d, 1.6 * d)))
    with pytest.raises(InputError) as e:
        crowd.check()
    assert e.value.field == "segment.features"

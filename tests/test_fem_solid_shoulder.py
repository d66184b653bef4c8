"""A shoulder in the 3-D segment (fem/solid.py): loads carried through the traction end, the refusals,
a cross hole beside a shoulder, and the 3-D factors against the meridian-section FE of the same shoulder.

The meridian-section FE (fem/axisym.py through compare/solve/features.study_feature) is the project's
own; the external context is the fit of Roark's Formulas for Stress and Strain, 7th ed. (Young &
Budynas), Table 17.1, case 18 (classic/notch_fits.py, coefficients from memory), printed beside and
not used as the pass mark.
"""
import math
import time

import numpy as np
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
    Theory of Elasticity, 3rd ed.), to the meshed end faces' error (two meshes): the D face's traction
    is integrated over a circle of about ten quadratic arcs at these coarse sizes (measured 2.1e-4 in
    bending at fineness 0.35)."""
    sm = solid.mesh_segment(_segment(), fineness=fineness)
    res = solid.solve_segment(sm, solid.LOADS, E, NU)
    A, I, J = math.pi * d**2 / 4, math.pi * d**4 / 64, math.pi * d**4 / 32
    exact = {"tension": E * 1e-3 * A, "bending_x": E * (1e-3 / d) * I, "bending_y": E * (1e-3 / d) * I,
             "torsion": G * (1e-3 / d) * J}
    for load, r in res.items():
        got = {"fem": r.load, "exact": exact[load]}
        assert got["fem"] == pytest.approx(got["exact"], rel=5e-4), (load, got)
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



@pytest.mark.parametrize("side", ["small", "large"])
def test_cross_hole_beside_a_shoulder_peak_sits_where_expected(side):
    """A through hole of 0.2 d beside the shoulder (D/d = 1.5, r/d = 0.1), bending in the plane of the
    hole's axis (its mouths on the most stressed fibres). On the small diameter the hole's factor
    (about 3 on the gross d nominal: Peterson's chart for a transverse hole in bending, d/D = 0.2,
    Kt ≈ 2.0 on the net section, Pilkey, Peterson's Stress Concentration Factors, 2nd ed.; from
    memory; times the gross-to-net modulus ratio 1.5) is far above the shoulder's (about 1.8, the
    meridian FE of the test below; Roark's Table 17.1 fit 1.74, from memory): the peak sits at the
    hole's mouth. On the large diameter the hole sees the bending stress of D, (d/D)³ = 0.30 of d's,
    so its peak (about 0.9 of the d nominal) stays below the fillet's: the peak sits on the shoulder's
    fillet. Both margins (1.6 and 2 times) are far beyond the coarse meshes' error (a few %), so the
    verdict holds on any mesh; both runs also check the load carried (M = EκI of d, exact). Measured
    at fineness 0.3: 2.86 at the hole's mouth (33k unknowns), 1.67 on the fillet (46k unknowns); at 0.4,
    3.02 and 1.81."""
    at = 1.25 * d
    zh = 0.9 * d if side == "small" else at + 0.5 * d
    seg = _segment(at=at, others=(solid.CrossHole(0.2 * d, zh),))
    r = solid.solve_segment(solid.mesh_segment(seg, fineness=0.3), ("bending_y",), E, NU)["bending_y"]
    print(f"\nhole on the {side} diameter: factor {r.factor:.3f} at {r.peak_at / d} d on the {r.peak_feature}, "
          f"{r.dofs} unknowns, far field {r.far_field:.3f}")
    assert r.load == pytest.approx(E * (1e-3 / d) * math.pi * d**4 / 64, rel=5e-4)
    if side == "small":
        assert r.peak_feature == "cross_hole"
        assert abs(r.peak_at[2] - zh) <= 0.1 * d * 1.01 and r.peak_at[0] > 0.4 * d  # the mouth at x = +R
        assert r.factor > 2.2
    else:
        assert r.peak_feature == "shoulder"
        assert at - 0.1 * d - 1e-9 <= r.peak_at[2] <= at + 1e-9
        assert 1.5 < r.factor < 2.2

@pytest.mark.slow
def test_shoulder_3d_equals_the_meridian_section_fe():
    """D/d = 1.5, r/d = 0.1 (a large fillet, so the 3-D meshes stay cheap), studied in 3-D on three
    similar meshes at the coarse fineness 0.4 (compare/solve/segments.study_segment: Kt in tension and
    bending in one plane, Kts in torsion) against the meridian-section FE of the same shoulder
    (fem/axisym.py through compare/solve/features.study_feature, its own meshes and estimate).

    Pass mark: the two agree within the sum of their error estimates, and the finest 3-D value lies
    within 6 % of the meridian one (measured 0.9-3.7 % above on five 3-D meshes of
    50k-260k unknowns, fineness 0.4 and 0.5, the fillet refined further once: the node-averaged 3-D
    peak reads high at these sizes, as the cavity test of tests/test_fem_solid.py shows against
    Goodier's exact factor).

    Measured here (one run): 3-D 2.066, 2.064, 2.173 (tension), 1.613, 1.695, 1.832 (bending),
    1.400, 1.350, 1.392 (torsion) on 13.9k, 25.1k, 53.6k unknowns, three-mesh estimates 15 %, 36 %,
    9 % (not asymptotic: oscillating or diverging at these sizes); meridian 2.116, 1.802, 1.380 with
    estimates 1.2 %, 1.2 %, 0.04 % (67k-132k unknowns); 33-40 CPU s for the 3-D study and 9-11 for
    the meridian one (two runs). On perturbed meshes (fineness 0.45: 16.6k, 32.7k, 70.7k unknowns, 46
    CPU s) the same check holds: 2.160, 1.815, 1.388 with estimates 7.4 %, 28 %, 1.8 %. Roark's Table 17.1 fit (from memory) gives 1.86, 1.74, 1.41: printed only (the
    fit is known to read low in tension for the stepped bar, see tests/test_compare_features.py)."""
    D, r = 1.5 * d, 0.1 * d
    c0 = time.process_time()
    three = study_segment(_segment(D=D, at=1.5 * d, fillet=r), fineness=0.4,
                          loads=("tension", "bending_x", "torsion"), E=E, nu=NU)
    c1 = time.process_time()
    mer = study_feature(Feature("shoulder", 0.1, d, D, r, "segment.shoulder"), poisson=NU)
    c2 = time.process_time()
    print(f"\nshoulder D/d 1.5, r/d 0.1: 3-D unknowns {three.dofs}, {c1 - c0:.0f} CPU s; meridian {c2 - c1:.0f} CPU s")
    for load3, loadm in (("tension", "tension"), ("bending_x", "bending"), ("torsion", "torsion")):
        k = KEYS[load3]
        est3, m = three.estimates[k], mer[loadm]
        got = {"fem": three.values[k], "exact": m["kt"]}  # the meridian FE stands for the exact value here
        bound = est3["gci"] * got["fem"] + m["gci"] * got["exact"]
        print(f"  {k}: 3-D {got['fem']:.3f} (values {[round(v, 3) for v in est3['values']]}, estimate "
              f"{100 * est3['gci']:.1f} %, {est3['status']}); meridian {m['kt']:.3f} (estimate {100 * m['gci']:.2f} %, "
              f"{m['dofs']} unknowns); Roark Table 17.1 fit (from memory) {kt_fit('shoulder', loadm, D, d, r):.2f}")
        assert three.peaks[k]["on_feature"] and three.finest[load3].peak_feature == "shoulder"
        assert est3["gci"] is not None and m["gci"] is not None
        assert abs(got["fem"] - got["exact"]) <= bound, (k, got, bound)
        assert abs(got["fem"] / got["exact"] - 1) <= 0.06, (k, got)


def test_a_cutter_reaching_the_shoulder_is_refused():
    """The check keeps the whole cut clear of the shoulder, not only its trace on the surface of d: a
    sled runner's cutter disc reaches its radius beyond the centre travel (above the surface, where
    the fillet's material is), a chamfer's cone beyond the hole's mouth; both are refused when that
    reach meets the fillet (conservative: the disc's exact outline may pass just above it)."""
    sled = solid.SledKeyseat(0.008, 0.004, 1.1 * d, 1.3 * d, 0.8 * d, 0.02 * d)
    assert sled.span()[1] < 1.65 * d  # clear of the fillet (from 1.65 d) on the surface of d ...
    with pytest.raises(InputError) as e:
        _segment(at=1.75 * d, others=(sled,)).check()  # ... but the disc reaches z1 + 0.4 d = 1.7 d
    assert e.value.field == "segment.features[1].z" and "fillet" in e.value.reason
    _segment(at=1.75 * d, others=(solid.SledKeyseat(0.008, 0.004, 1.1 * d, 1.3 * d, 0.5 * d, 0.02 * d),)).check()
    with pytest.raises(InputError) as e:
        _segment(at=1.25 * d, others=(solid.CrossHole(0.2 * d, 0.95 * d, chamfer=0.05 * d),)).check()
    assert e.value.field == "segment.features[1].z" and "fillet" in e.value.reason
    _segment(at=1.25 * d, others=(solid.CrossHole(0.2 * d, 0.95 * d),)).check()


def test_peak_search_skips_each_end_zone_in_its_own_diameter():
    """The peak is read more than PEAK_END_ZONE diameters from each end face, each end in its own
    diameter: at the D end of a shoulder segment that is D, not d (the end face's prescribed traction
    disturbs the surface over a length of the order of that end's own diameter: Saint-Venant's
    principle, Timoshenko & Goodier, Theory of Elasticity, 3rd ed., Sec. 19). Checked on the mesh's
    own lateral surface nodes (no solve): the band between the d-based and the D-based zone at z =
    length holds nodes, and every one of them is skipped; at z = 0 the zone stays d's."""
    seg = _segment()  # D = 1.5 d
    D, L, z0 = seg.far_diameter, seg.length, solid.PEAK_END_ZONE
    assert D == pytest.approx(1.5 * d)
    sm = solid.mesh_segment(seg, fineness=0.3)
    z = sm.mesh.p[2, np.unique(sm.mesh.facets[:, sm.lateral])]
    keep = solid.away_from_ends(seg, z)
    band = (z > L - z0 * D) & (z < L - z0 * d)  # within D's zone, outside d's
    assert np.count_nonzero(band) > 0 and not np.any(keep[band])
    assert np.all(keep == ((z > z0 * d) & (z < L - z0 * D)))
    # without a shoulder both ends keep the d zone
    plain = solid.Segment(d, L)
    zz = np.linspace(0, L, 2001)
    assert np.array_equal(solid.away_from_ends(plain, zz), (zz > z0 * d) & (zz < L - z0 * d))


def test_far_field_window_in_each_ends_own_diameter():
    """The far-field departure (:func:`fem.solid._far_field`) is read within half a diameter of each
    end face in that end's own diameter, as the peak search's end zones (Saint-Venant's principle,
    Timoshenko & Goodier, Theory of Elasticity, 3rd ed., Sec. 19): at a shoulder segment's D end the
    window is 0.5 D. Synthetic surface points (no solve), tension: the elementary stress everywhere
    on the D cylinder (nominal × (d/D)², the same load on the larger area) except one point between
    0.5 d and 0.5 D from the end face, which departs by 20 % of nominal; at z = 0 the window stays
    0.5 d (a departure 0.6 d from that end is outside it)."""
    seg = _segment()  # D = 1.5 d
    D, L = seg.far_diameter, seg.length
    nominal = 100e6
    z = np.array([L - 0.1 * d, L - 0.3 * D, L - 0.45 * D, 0.1 * d, 0.6 * d])
    r = np.array([D / 2, D / 2, D / 2, d / 2, d / 2])
    pts = np.vstack([r, np.zeros_like(r), z])
    mag = np.array([nominal * (d / D) ** 2] * 3 + [nominal] * 2)
    assert solid._far_field(pts, mag, r, seg, nominal, "tension") == pytest.approx(0.0, abs=1e-12)
    mag[2] += 0.2 * nominal  # 0.45 D from the D end: beyond 0.5 d (0.3 D), inside 0.5 D
    assert solid._far_field(pts, mag, r, seg, nominal, "tension") == pytest.approx(0.2)
    mag[2] -= 0.2 * nominal
    mag[4] += 0.3 * nominal  # 0.6 d from the d end: outside its window
    assert solid._far_field(pts, mag, r, seg, nominal, "tension") == pytest.approx(0.0, abs=1e-12)

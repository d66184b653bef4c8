"""The transverse-hole fits (classic/cross_hole.py) against facts outside the fits' own coefficients
(which are from memory, Peterson's Stress Concentration Factors, 3rd ed., sec. 4.5.9, and are not
re-evaluated here): the exact small-hole limits, bounds from statics that any elastic field must obey
over the whole range, dimensional analysis, and the range refused outside, never clamped.

Definitions (the module's): gross-section nominal stress, 32M/(πD³) in bending and 16T/(πD³) in
torsion; bending in the plane of the hole's axis (the mouths at the largest bending stress); the torsion
fit is the largest normal stress over the nominal shear stress, Kts half of it. The fits claim 0 < d/D ≤
0.4 (from memory), so the small-hole limit d/D → 0 lies at the edge of their range and is checked there.

Not asserted: monotonicity in d/D. In gross-section terms the fits are not monotonic (they fall from
the plate's 3 and 4 to about 2.74 and 3.68 near d/D = 0.1, then rise: the hole's mouth sits in the
bending gradient and on a curved surface, while the section loses stiffness), and no published source
at hand states a monotonic quantity for this geometry.
"""
import math

import numpy as np
import pytest

from classic import cross_hole as ch
from classic._validity import OutOfRangeError

#: d/D over the fits' whole range (0, 0.4], the upper end included
X = np.concatenate([np.geomspace(1e-6, 0.01, 5), np.linspace(0.02, 0.4, 39)])


def test_small_hole_limits_are_the_plate_values():
    """Kirsch's circular hole in an infinite plate (Kirsch 1898; Timoshenko & Goodier, Theory of
    Elasticity, 3rd ed., Sec. 35): the hoop stress at the edge is σθ = σ(1 − 2 cos 2θ) in uniaxial
    tension σ, so σmax = 3σ; under pure shear τ (tension τ and compression −τ at 45°, superposed)
    σθ = −4τ sin 2θ, so σmax = 4τ, and the edge being free and in uniaxial stress, τmax = 2τ. A hole
    vanishingly small against the shaft sees the shaft surface's stress as such a plate (gross and
    net nominal then coincide), so the bending fit tends to 3, the torsion fit to 4, Kts to 2, the
    difference vanishing with d/D (the limit lies at the edge of the fits' range 0 < d/D ≤ 0.4)."""
    for fit, exact in ((ch.cross_hole_kt_bending, 3.0), (ch.cross_hole_kt_torsion, 4.0),
                       (ch.cross_hole_kts_torsion, 2.0)):
        gaps = [abs(fit(x, 1.0) - exact) for x in (1e-2, 1e-3, 1e-4, 1e-6)]
        got = {"fit": fit(1e-6, 1.0), "exact": exact}
        assert got["fit"] == pytest.approx(got["exact"], abs=1e-4), fit.__name__
        assert all(b < a for a, b in zip(gaps, gaps[1:])), (fit.__name__, gaps)


def test_bounds_from_statics_over_the_whole_range():
    """Any elastic field obeys these, whatever the fits' coefficients (loose bounds: they catch a sign
    or a nominal's error, not a few per cent).

    1. Far from the hole the bar carries its plain elementary stress (Saint-Venant's principle;
       Timoshenko & Goodier, 3rd ed., Sec. 19): the surface's σ = 32M/(πD³) in bending and τ =
       16T/(πD³) in torsion, so the peak is at least the nominal: Kt ≥ 1, Kts ≥ 1.
    2. Equilibrium of the net section through the hole's axis (the circle less the strip |x| ≤ d/2):
       M = ∫ y σ dA ≤ σmax ∫|y| dA, with ∫|y| dA = D³/6 − dD²/4 + d³/12 (integrated exactly); and
       T = ∫ r τ dA ≤ τmax ∫ r dA, with ∫ r dA ≤ πD³/12 − (dD²/4 − d³/12) (r ≥ |y| on the strip).
       Divided by the gross nominal: Kt ≥ (π/32)/(1/6 − x/4 + x³/12) and
       Kts ≥ (π/16)/(π/12 − x/4 + x³/12), x = d/D."""
    for x in X:
        kb, kts = ch.cross_hole_kt_bending(x, 1.0), ch.cross_hole_kts_torsion(x, 1.0)
        bend = max(1.0, (math.pi / 32) / (1 / 6 - x / 4 + x**3 / 12))
        tors = max(1.0, (math.pi / 16) / (math.pi / 12 - x / 4 + x**3 / 12))
        assert kb >= bend, (x, kb, bend)
        assert kts >= tors, (x, kts, tors)
        assert ch.cross_hole_kt_torsion(x, 1.0) >= 2 * tors  # σmax = 2 τmax at the free edge (Mohr's circle)


def test_scale_free():
    """In linear elasticity a factor of a geometry depends on its shape only, not its size
    (dimensional analysis: the stress is proportional to the load over a length cubed), so on d/D."""
    for fit in (ch.cross_hole_kt_bending, ch.cross_hole_kt_torsion, ch.cross_hole_kts_torsion):
        for x in (0.05, 0.2, 0.4):
            assert fit(x * 30.0, 30.0) == pytest.approx(fit(x * 0.03, 0.03), rel=1e-12)


@pytest.mark.parametrize("d, D", [(0.0125, 0.030), (0.5, 1.0), (0.0, 1.0), (-0.1, 1.0)])
def test_outside_the_range_is_refused(d, D):
    """Outside 0 < d/D ≤ 0.4 (the charts' span, from memory) the fits refuse: never a clamped or
    extrapolated value (d/D = 0 is no hole)."""
    for fit in (ch.cross_hole_kt_bending, ch.cross_hole_kt_torsion, ch.cross_hole_kts_torsion):
        with pytest.raises(OutOfRangeError) as exc:
            fit(d, D)
        assert exc.value.field in ("d", "d/D")


def test_the_range_end_is_sharp_not_clamped():
    """The upper end of the stated range (0.4, from memory) is a value, just above it a refusal, not
    the end's value."""
    top = ch.X_RANGE.high
    for fit in (ch.cross_hole_kt_bending, ch.cross_hole_kt_torsion, ch.cross_hole_kts_torsion):
        assert math.isfinite(fit(top, 1.0))
        with pytest.raises(OutOfRangeError):
            fit(top * (1 + 1e-9), 1.0)


def test_bad_lengths_name_the_field():
    with pytest.raises(OutOfRangeError) as exc:
        ch.cross_hole_kt_bending(0.006, "thirty")
    assert exc.value.field == "D"
    with pytest.raises(OutOfRangeError) as exc:
        ch.cross_hole_kt_torsion(float("nan"), 0.03)
    assert exc.value.field == "d"

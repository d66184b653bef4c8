"""Checks of classic.gci: Roache's GCI (J. Fluids Eng. 116:405-413, 1994), the unequal-ratio form of
Celik et al. (J. Fluids Eng. 130 (2008) 078001), the NPARC Alliance worked example, and
self-consistency on exact power-law sequences."""
import math
import warnings

import pytest

from classic import gci
from classic._validity import OutOfRangeError, OutOfRangeWarning

# NPARC Alliance, "Examining spatial (grid) convergence" example: fine -> coarse, r = 2.
NPARC = (0.97050, 0.96854, 0.96178)


def test_nparc_order_extrapolation_gci():
    # NPARC example, printed: p = 1.786, f_ext = 0.971300, GCI12 = 0.103 %, GCI23 = 0.356 %.
    f1, f2, f3 = NPARC
    p = gci.observed_order(f1, f2, f3, 2.0)
    assert round(p, 3) == 1.786
    assert round(gci.richardson_extrapolate(f1, f2, 2.0, p), 6) == 0.971300
    assert round(100 * gci.gci(f1, f2, 2.0, p), 3) == 0.103
    assert round(100 * gci.gci(f2, f3, 2.0, p), 3) == 0.356


def test_nparc_asymptotic_ratio():
    # NPARC example prints 0.998 for the asymptotic-range check. The form of Roache (1994) as
    # used with that example, GCI23/(r^p GCI12), gives 1.002 on the same data: with relative
    # GCIs and the observed p it is identically f1/f2 (derived). 0.998 = f2/f1 is its reciprocal to
    # the printed digits. Both are "about 1", which is what the check asks.
    f1, f2, f3 = NPARC
    p = gci.observed_order(f1, f2, f3, 2.0)
    ratio = gci.asymptotic_ratio(gci.gci(f1, f2, 2.0, p), gci.gci(f2, f3, 2.0, p), 2.0, p)
    assert ratio == pytest.approx(f1 / f2, rel=1e-12)   # derived identity, round-off only
    assert round(1.0 / ratio, 3) == 0.998                # the printed value, as its reciprocal
    assert abs(ratio - 1.0) < 0.003


def test_nparc_convergence_study():
    # NPARC example through the convenience function: same printed values.
    s = gci.convergence_study(NPARC, 2.0)
    assert s.monotone and s.status == "monotone convergence"
    assert round(s.order, 3) == 1.786
    assert round(s.extrapolated, 6) == 0.971300
    assert round(100 * s.gci_fine, 3) == 0.103
    assert round(100 * s.gci_coarse, 3) == 0.356
    assert s.asymptotic_ratio == pytest.approx(1.0, abs=0.003)


def test_unequal_form_reduces_to_equal_ratio():
    # Celik et al. (2008): with r21 = r32, q(p) = 0 and the iteration returns Roache's p.
    p_eq = gci.observed_order(*NPARC, 2.0)
    p_un = gci.observed_order_unequal(*NPARC, 2.0, 2.0)
    assert p_un == pytest.approx(p_eq, rel=1e-12)


# Self-consistency checks (not external): an exact sequence f_h = f0 + C h^p must return p and f0.

@pytest.mark.parametrize("p_true, C", [(2.0, 0.3), (1.0, -0.05), (3.7, 1e-3)])
def test_exact_power_law_equal_ratio(p_true, C):
    f0, r = 1.25, 2.0
    f1, f2, f3 = (f0 + C * h**p_true for h in (1.0, r, r * r))
    p = gci.observed_order(f1, f2, f3, r)
    assert p == pytest.approx(p_true, rel=1e-12)                      # round-off only
    assert gci.richardson_extrapolate(f1, f2, r, p) == pytest.approx(f0, rel=1e-12)
    s = gci.convergence_study([f1, f2, f3], r)
    assert s.extrapolated == pytest.approx(f0, rel=1e-12)
    # The exact error of f1 is |f1 - f0|; with Fs = 1 the GCI equals it (relative to f1).
    with pytest.warns(OutOfRangeWarning, match="Fs"):    # Fs < 1.25 warns, by design
        g = gci.gci(f1, f2, r, p, Fs=1.0)
    assert g * abs(f1) == pytest.approx(abs(f1 - f0), rel=1e-10)
    # asymptotic ratio of an exact sequence is f1/f2 (derived)
    assert s.asymptotic_ratio == pytest.approx(f1 / f2, rel=1e-10)


@pytest.mark.parametrize("h, p_true", [((1.0, 1.5, 2.7), 2.0), ((1.0, 1.4, 3.0), 1.3),
                                       ((0.5, 0.8, 1.3), 2.6)])
def test_exact_power_law_unequal_ratio(h, p_true):
    f0, C = 0.75, -0.2
    f1, f2, f3 = (f0 + C * x**p_true for x in h)
    r21, r32 = h[1] / h[0], h[2] / h[1]
    p = gci.observed_order_unequal(f1, f2, f3, r21, r32)
    assert p == pytest.approx(p_true, rel=1e-9)   # iteration tolerance 1e-12, round-off
    s = gci.convergence_study([f1, f2, f3], (r21, r32))
    assert s.order == pytest.approx(p_true, rel=1e-9)
    assert s.extrapolated == pytest.approx(f0, rel=1e-9)


def test_oscillatory_and_other_flags():
    # Flagged, not forced: (f3-f2)/(f2-f1) <= 0 -> no order.
    s = gci.convergence_study([1.00, 1.10, 0.95], 2.0)
    assert s.status == "oscillatory" and not s.monotone
    assert s.order is None and s.extrapolated is None and s.gci_fine is None
    s = gci.convergence_study([1.00, 1.10, 1.10], 2.0)
    assert s.status == "non-monotone" and not s.monotone and s.order is None
    s = gci.convergence_study([1.00, 1.00, 1.10], 2.0)
    assert s.status == "no change between the finest grids" and s.order is None
    # monotone but the differences grow as the grid is refined: p < 0, no GCI
    s = gci.convergence_study([1.00, 1.10, 1.15], 2.0)
    assert s.monotone and s.status == "monotone divergence"
    assert s.order == pytest.approx(-1.0, rel=1e-12) and s.gci_fine is None
    s = gci.convergence_study([1.00, 1.10, 1.15], (1.5, 2.0))
    assert s.status == "monotone divergence" and s.order < 0


def test_observed_order_refusals_and_warnings():
    with pytest.raises(OutOfRangeError, match=r"^\(f3-f2\)/\(f2-f1\) = -1\.5"):
        gci.observed_order(1.0, 1.1, 0.95, 2.0)
    with pytest.raises(OutOfRangeError, match=r"^r = 1\.0: "):
        gci.observed_order(*NPARC, 1.0)
    with pytest.warns(OutOfRangeWarning, match=r"r = 1\.1"):
        gci.observed_order(*NPARC, 1.1)
    with pytest.raises(OutOfRangeError, match=r"^f1 = 'x': is not a number$"):
        gci.observed_order("x", 1.0, 1.1, 2.0)
    with pytest.raises(OutOfRangeError, match="exactly three values"):
        gci.convergence_study([1.0, 1.1], 2.0)
    with pytest.raises(OutOfRangeError, match=r"^f1 = 0\.0: "):
        gci.gci(0.0, 0.1, 2.0, 2.0)


def test_two_grid_factor_of_safety():
    # Roache (1994): Fs = 3 with two grids, 1.25 with three; GCI is linear in Fs.
    g125 = gci.gci(1.0, 1.02, 2.0, 2.0)
    g3 = gci.gci(1.0, 1.02, 2.0, 2.0, Fs=3.0)
    assert g3 / g125 == pytest.approx(3.0 / 1.25, rel=1e-12)
    assert g125 == pytest.approx(1.25 * 0.02 / 3.0, rel=1e-12)   # Roache's formula, p = 2, r = 2
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        gci.gci(1.0, 1.02, 2.0, 2.0, Fs=3.0)                      # no warning at Fs >= 1.25
    with pytest.warns(OutOfRangeWarning, match="Fs = 1.0"):
        gci.gci(1.0, 1.02, 2.0, 2.0, Fs=1.0)


def test_representative_ratio_2d():
    # Celik et al. (2008), eqs. 1-2: h ~ (A/N)^(1/2) in 2-D, so r = (N_fine/N_coarse)^(1/2).
    assert gci.representative_ratio(40000, 10000) == pytest.approx(2.0, rel=1e-14)
    assert gci.representative_ratio(22500, 10000) == pytest.approx(1.5, rel=1e-14)
    assert gci.representative_ratio(8000, 1000, dim=3) == pytest.approx(2.0, rel=1e-14)
    with pytest.raises(OutOfRangeError, match=r"^n_coarse = 0\.0: "):
        gci.representative_ratio(100, 0)

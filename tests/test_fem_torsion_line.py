"""fem/torsion_line.py: the 1-D torsional finite elements along a shaft against exact solutions —
the two-disc system, the uniform free-free shaft (with the observed order of convergence printed),
and the angle of twist of a stepped shaft."""
import math

import numpy as np
import pytest

from classic.torsional import free_free_shaft_frequency, twist_angle, two_disc_frequency
from fem.torsion_line import TorsionLine, natural_frequencies, twist

G, RHO = 79.3e9, 7850.0


@pytest.mark.parametrize("n_el", [1, 3, 17])
def test_two_discs_on_a_massless_shaft_exact(n_el):
    # Den Hartog, Mechanical Vibrations, 4th ed. (1956), two-disc system: ω² = k(J1 + J2)/(J1·J2),
    # k = GJ/L. A massless shaft of linear elements is exact for any number of elements.
    L, d, J1, J2 = 0.4, 0.03, 0.02, 0.05
    J = math.pi * d**4 / 32
    z = np.linspace(0.0, L, n_el + 1)
    w, modes = natural_frequencies(TorsionLine(z, G * J), [(0, J1), (n_el, J2)], count=3)
    exact = two_disc_frequency(G * J / L, J1, J2)
    assert len(w) == 1
    assert {"fem": w[0], "exact": exact} == pytest.approx({"fem": exact, "exact": exact}, rel=1e-10)
    # the node of the mode: rotations of opposite sign, in the ratio −J1/J2 (momentum balance)
    assert modes[0, 0] * J1 == pytest.approx(-modes[-1, 0] * J2, rel=1e-9)


def test_uniform_free_free_shaft_converges_at_order_two():
    # W. T. Thomson, Theory of Vibration with Applications (wave equation of a rod in torsion), and
    # Den Hartog, 4th ed.: ω_n = nπ/L·√(G/ρ) for a uniform round shaft free at both ends.
    L, d = 0.8, 0.04
    Jp = math.pi * d**4 / 32
    exact = [free_free_shaft_frequency(n, L, G, RHO) for n in (1, 2, 3)]
    errs, sizes = [], []
    for n_el in (8, 16, 32, 64):
        # perturbed (not uniform) nodes, so no mesh gets a lucky answer: ±20 % of an element, fixed seed
        rng = np.random.default_rng(n_el)
        h = L / n_el
        z = np.linspace(0.0, L, n_el + 1)
        z[1:-1] += rng.uniform(-0.2, 0.2, n_el - 1) * h
        w, _ = natural_frequencies(TorsionLine(z, G * Jp, RHO * Jp), count=3)
        errs.append(abs(w[0] - exact[0]) / exact[0])
        sizes.append(h)
        assert all(wi >= ei * (1 - 1e-12) for wi, ei in zip(w, exact))  # consistent mass: bounds from above
    orders = [math.log(errs[i] / errs[i + 1]) / math.log(sizes[i] / sizes[i + 1]) for i in range(len(errs) - 1)]
    print(f"torsion line, first free-free frequency: relative errors {errs}, observed orders {orders}")
    assert all(1.8 < p < 2.2 for p in orders)
    assert {"fem": w[2], "exact": exact[2]} == pytest.approx({"fem": exact[2], "exact": exact[2]}, rel=5e-3)


def test_twist_of_a_stepped_shaft_is_the_sum_of_the_segments():
    # Shigley's Mechanical Engineering Design, 9th ed., eq. (3-35), θ = Σ T·L/(G·J), exact for
    # piecewise-constant torque and section
    d = [0.03, 0.04]
    J = [math.pi * x**4 / 32 for x in d]
    z = np.array([0.0, 0.1, 0.25, 0.3])
    GJ = np.array([G * J[0], G * J[1], G * J[1]])
    T = np.array([200.0, 200.0, -50.0])
    phi = twist(TorsionLine(z, GJ), T)
    exact = twist_angle(200, 0.1, G, J[0]) + twist_angle(200, 0.15, G, J[1]) + twist_angle(-50, 0.05, G, J[1])
    assert {"fem": phi[-1], "exact": exact} == pytest.approx({"fem": exact, "exact": exact}, rel=1e-13)


def test_refusals():
    with pytest.raises(ValueError):
        TorsionLine([0.0, 0.0], 1.0)
    with pytest.raises(ValueError):
        TorsionLine([0.0, 1.0], 0.0)
    w, _ = natural_frequencies(TorsionLine([0.0, 1.0], 1.0), [(0, 1.0)])
    assert len(w) == 0  # one inertia on a massless shaft: no vibration mode


def test_a_tiny_element_loses_no_mode():
    # two points of interest 1e-9 of the length apart make a very stiff element; the rigid-body mode is
    # left out by position, so the two-disc mode (Den Hartog, 4th ed.) is still found exactly
    L, GJ, J1, J2 = 0.4, 5000.0, 0.02, 0.05
    z = np.array([0.0, 0.2, 0.2 + 1e-9 * L, L])
    w, _ = natural_frequencies(TorsionLine(z, GJ), [(0, J1), (3, J2)], count=3)
    exact = two_disc_frequency(GJ / L, J1, J2)
    assert w[0] == pytest.approx(exact, rel=1e-6)

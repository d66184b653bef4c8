"""The Timoshenko beam elements (fem/beam.py) against exact solutions. Exact-solution results are
stored as {"fem": ..., "exact": ...}."""
import math

import numpy as np
import pytest
from scipy.integrate import cumulative_trapezoid

from fem.beam import Beam, element_matrices, natural_frequencies, solve_static

EI, P, L = 2.0e4, 1000.0, 1.0


def test_simply_supported_point_load_roark():
    # Roark's Formulas for Stress and Strain, 7th ed., Table 8.1, case 1e: R1 = Pb/L, R2 = Pa/L,
    # deflection under the load P a² b² / (3 E I L)
    a = 0.3
    b = L - a
    r = solve_static(Beam([0, a, L], EI, np.inf), [(0, None), (2, None)], forces=[(1, -P)])
    res = {"R1": {"fem": r.reactions[0], "exact": P * b / L}, "R2": {"fem": r.reactions[1], "exact": P * a / L},
           "y": {"fem": -r.w[1], "exact": P * a**2 * b**2 / (3 * EI * L)}}
    for v in res.values():
        assert v["fem"] == pytest.approx(v["exact"], rel=1e-12)
    assert r.residual < 1e-12


def test_cantilever_with_shear_deformation():
    # Timoshenko cantilever, tip load: P L³/(3EI) + P L/(κGA) (Timoshenko & Gere, Mechanics of
    # Materials, 4th ed., 1997, Sec. 9.11: shear deflection of a cantilever) — one element is exact
    kGA = 1.0e5
    K, _, _ = element_matrices(L, EI, kGA)
    u = np.linalg.solve(K[2:, 2:], [P, 0.0])
    res = {"fem": u[0], "exact": P * L**3 / (3 * EI) + P * L / kGA}
    assert res["fem"] == pytest.approx(res["exact"], rel=1e-12)


def test_stepped_beam_against_integration_of_M_over_EI():
    # an independent double integration of the curvature M/EI (trapezoid rule on 200 001 points) of
    # a stepped simply supported beam with a load off the step
    z_step, a = 0.4, 0.7
    EI1, EI2 = 2.0e4, 5.0e4
    beam = Beam([0.0, z_step, a, L], [EI1, EI2, EI2], np.inf)
    r = solve_static(beam, [(0, None), (3, None)], forces=[(2, -P)])
    z = np.linspace(0, L, 200_001)
    R1 = P * (L - a) / L
    M = np.where(z < a, R1 * z, R1 * z - P * (z - a))  # sagging positive
    kappa = M / np.where(z < z_step, EI1, EI2)  # v'' = M/EI, y up, sagging moment positive
    slope = cumulative_trapezoid(kappa, z, initial=0.0)
    v = cumulative_trapezoid(slope, z, initial=0.0)
    v -= z * v[-1] / L  # the rigid rotation that puts v(L) = 0
    for node, zz in ((1, z_step), (2, a)):
        res = {"fem": r.w[node], "exact": float(np.interp(zz, z, v))}
        # the trapezoid rule steps over the jump of EI at the step with h = 5e-6·L: error ~1e-5
        assert res["fem"] == pytest.approx(res["exact"], rel=2e-5)


def test_uniform_simply_supported_frequency_euler_bernoulli_and_order():
    # (π/L)²·√(EI/(ρA)) (Euler–Bernoulli, exact; Shigley 9th ed., eq. 7-22)
    rhoA = 7.85
    exact = (math.pi / L) ** 2 * math.sqrt(EI / rhoA)
    errs = []
    for n in (4, 8, 16, 32):
        beam = Beam(np.linspace(0, L, n + 1), EI, np.inf, rhoA)
        w, _ = natural_frequencies(beam, [(0, None), (n, None)], count=1)
        errs.append(abs(w[0] - exact) / exact)
    order = [math.log(errs[i] / errs[i + 1], 2) for i in range(2)]  # before round-off sets in
    print(f"first frequency, consistent mass: relative errors {errs}, observed order {order}")
    assert errs[-1] < 1e-6 and min(order) > 3.5  # the consistent-mass Hermite element converges as h⁴
    res = {"fem": w[0], "exact": exact}
    assert res["fem"] == pytest.approx(res["exact"], rel=1e-6)


def test_short_shaft_timoshenko_frequency():
    # simply supported Timoshenko beam, mode 1: with w = W sin kz, θ = Θ cos kz (k = π/L) the
    # equations ρA ẅ = κGA(w'' − θ'), ρI θ̈ = EI θ'' + κGA(w' − θ) give
    # (κGA k² − ρA ω²)(EI k² + κGA − ρI ω²) = (κGA k)², the lower root exact
    # (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed., 1974, Sec. 5.12)
    d, Ls, E, G, rho = 0.05, 0.2, 205e9, 79.5e9, 7850.0
    A, I = math.pi * d**2 / 4, math.pi * d**4 / 64
    kappa = 0.85
    kGA, EIs, rhoA, rhoI = kappa * G * A, E * I, rho * A, rho * I
    k = math.pi / Ls
    a2 = rhoA * rhoI
    a1 = -(rhoA * (EIs * k**2 + kGA) + rhoI * kGA * k**2)
    a0 = kGA * k**2 * (EIs * k**2 + kGA) - (kGA * k) ** 2
    exact = math.sqrt((-a1 - math.sqrt(a1 * a1 - 4 * a2 * a0)) / (2 * a2))
    errs = []
    for n in (40, 80, 160):
        beam = Beam(np.linspace(0, Ls, n + 1), EIs, kGA, rhoA, rhoI)
        w, _ = natural_frequencies(beam, [(0, None), (n, None)], count=1)
        errs.append(abs(w[0] - exact) / exact)
    order = [math.log(errs[i] / errs[i + 1], 2) for i in range(2)]
    print(f"Timoshenko first frequency: relative errors {errs}, observed order {order}")
    assert min(order) > 1.8  # with shear and rotary inertia the consistent mass converges as h²
    res = {"fem": w[0], "exact": exact}
    eb = k**2 * math.sqrt(EIs / rhoA)
    assert exact < 0.97 * eb  # the correction matters for this short shaft (L/d = 4)
    assert res["fem"] == pytest.approx(res["exact"], rel=1e-5)  # 160 elements: about 2e-6 left


def test_spring_support_and_mechanism():
    k = 1.0e5
    r = solve_static(Beam([0, 0.5, 1.0], EI, np.inf), [(0, None), (2, k)], forces=[(1, -P)])
    # the spring carries half the load: its end sinks by (P/2)/k; the beam adds PL³/48EI at mid-span
    res = {"fem": r.w[1], "exact": -(P * L**3 / (48 * EI) + 0.5 * (P / 2) / k)}
    assert res["fem"] == pytest.approx(res["exact"], rel=1e-12)
    with pytest.raises(ValueError):
        solve_static(Beam([0, 0.5, 1.0], EI, np.inf), [(0, None)], forces=[(1, -P)])


@pytest.mark.parametrize("n", [4, 160])  # both eigen-solver routes: dense (8 free unknowns) and sparse Lanczos
def test_lowest_three_timoshenko_frequencies_in_order(n):
    # simply supported Timoshenko beam, modes j = 1..3: the lower root of
    # (κGA k² − ρA ω²)(EI k² + κGA − ρI ω²) = (κGA k)² with k = jπ/L, exact
    # (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed., 1974, Sec. 5.12)
    d, Ls, E, G, rho = 0.05, 0.4, 205e9, 79.5e9, 7850.0
    A, I = math.pi * d**2 / 4, math.pi * d**4 / 64
    kGA, EIs, rhoA, rhoI = 0.85 * G * A, E * I, rho * A, rho * I
    exact = []
    for j in (1, 2, 3):
        k = j * math.pi / Ls
        a2, a1 = rhoA * rhoI, -(rhoA * (EIs * k**2 + kGA) + rhoI * kGA * k**2)
        a0 = kGA * k**2 * (EIs * k**2 + kGA) - (kGA * k) ** 2
        exact.append(math.sqrt((-a1 - math.sqrt(a1 * a1 - 4 * a2 * a0)) / (2 * a2)))
    beam = Beam(np.linspace(0, Ls, n + 1), EIs, kGA, rhoA, rhoI)
    w, modes = natural_frequencies(beam, [(0, None), (n, None)], count=3)
    assert modes.shape == (n + 1, 3)
    res = {"fem": list(w), "exact": exact}
    # 4 elements: under one and a half per half wave of the third mode (5.3 %, measured); 160 elements:
    # the error falls as h² and grows with the mode number, about 3e-5 left in the third (measured)
    assert res["fem"] == pytest.approx(res["exact"], rel=0.06 if n == 4 else 1e-4)
    assert np.all(np.diff(w) > 0)

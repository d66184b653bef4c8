"""Transverse shear (Saint-Venant flexure with Poisson's ratio) against exact solutions and tables."""
import math

import numpy as np
import pytest

from classic import shear as cs
from fem.geometry import Keyway, custom_section, keyed_section, polygon, rectangle, round_section
from fem.mesh import MeshOptions, mesh_section
from fem.properties import area_moments
from fem.shear import shear_peak, solve_shear
from tests.helpers import observed_order


def shear_of(section, nu, fineness=1.0):
    sm = mesh_section(section, MeshOptions(fineness=fineness))
    pr = area_moments(sm)
    return sm, pr, solve_shear(sm, pr, nu)


@pytest.mark.parametrize("nu", [0.0, 0.3])
def test_round_bar_centre_and_surface(nu):
    # Exact flexure of the solid round bar (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §120;
    # form from memory, values re-derived from it): at the centre
    # (3+2ν)/(2(1+ν))·V/A, on the surface at the neutral axis (1+2ν)/(1+ν)·V/A.
    d, V = 0.02, 1000.0
    A = math.pi * d**2 / 4
    sm, pr, sr = shear_of(round_section(d), nu)
    t = sr.stress_at(np.array([[0.0, d / 2 * (1 - 1e-9)], [0.0, 0.0]]), 0.0, V)
    centre = {"fem": float(t[1, 0]), "exact": (3 + 2 * nu) / (2 * (1 + nu)) * V / A}
    surface = {"fem": float(t[1, 1]), "exact": (1 + 2 * nu) / (1 + nu) * V / A}
    assert centre["fem"] == pytest.approx(centre["exact"], rel=2e-3)  # default mesh, a point value
    assert surface["fem"] == pytest.approx(surface["exact"], rel=5e-3)  # a boundary point, one element's gradient
    pk = shear_peak(sm, sr, 0.0, V)
    assert pk.value == pytest.approx(max(centre["exact"], surface["exact"]), rel=1e-2)  # 1 % peak target
    # Equilibrium of the part above the neutral axis: the mean of τzy across the chord is VQ/(Ib)
    # exactly, for any ν (the elementary 4V/3A of the round bar is that mean).
    xs = np.linspace(-d / 2, d / 2, 81) * (1 - 1e-9)
    ty = sr.stress_at(np.vstack([xs, np.zeros_like(xs)]), 0.0, V)[1]
    from scipy.integrate import simpson

    mean = {"fem": simpson(ty, x=xs) / d, "exact": 4 * V / (3 * A)}
    assert mean["fem"] == pytest.approx(mean["exact"], rel=1e-3)


@pytest.mark.parametrize("b_over_h", [0.5, 1.0, 2.0, 4.0])
def test_rectangle_against_the_timoshenko_goodier_table(b_over_h):
    # Timoshenko & Goodier, 3rd ed., table in §124, ν = 0.25: τ/(3V/2A) at the centre and at the
    # ends of the neutral axis (from memory; values re-derived from the series in classic.shear).
    centre_ratio, edge_ratio = cs.rectangle_flexure_ratios(b_over_h)
    h = 0.01
    b = b_over_h * h
    V = 100.0
    _, _, sr = shear_of(custom_section([rectangle((0.0, 0.0), (b, h))]), 0.25, fineness=2.0)
    t = sr.stress_at(np.array([[0.0, b / 2 * (1 - 1e-9)], [0.0, 0.0]]), 0.0, V)
    nominal = 3 * V / (2 * b * h)
    ratio = {"fem": t[1] / nominal, "exact": (centre_ratio, edge_ratio)}
    assert ratio["fem"][0] == pytest.approx(ratio["exact"][0], abs=4e-3)  # table printed to 3 digits
    assert ratio["fem"][1] == pytest.approx(ratio["exact"][1], abs=4e-3)


@pytest.mark.parametrize("nu", [0.0, 0.3])
def test_energy_shear_coefficient_round_and_hollow(nu):
    # Energy definition with the exact flexure stresses: round 6(1+ν)²/(7+14ν+8ν²); hollow round
    # with m = r_in/r_out, both derived from the exact flexure stresses (T&G 3rd ed., §120).
    _, _, sr = shear_of(round_section(0.02), nu)
    k = {"fem": (sr.kappa_x, sr.kappa_y), "exact": cs.energy_round(nu)}
    assert k["fem"][0] == pytest.approx(k["exact"], rel=1e-4)
    assert k["fem"][1] == pytest.approx(k["exact"], rel=1e-4)
    _, _, sr = shear_of(round_section(0.02, 0.01), nu)
    k = {"fem": sr.kappa_y, "exact": cs.energy_hollow_round(nu, 0.5)}
    assert k["fem"] == pytest.approx(k["exact"], rel=1e-4)
    assert abs(sr.kappa_xy) < 1e-6  # doubly symmetric: no coupling


def channel(b, h, t):
    """Thin channel, centreline flange width b and depth h, wall t, web centreline on x = 0."""
    y0, y1 = h / 2 - t / 2, h / 2 + t / 2
    return polygon([(-t / 2, -y1), (b, -y1), (b, -y0), (t / 2, -y0), (t / 2, y0), (b, y0), (b, y1), (-t / 2, y1)])


def test_thin_channel_shear_centre_tends_to_the_thin_wall_value():
    # Thin-walled theory: e = 3b²/(h+6b) from the web centreline, away from the flanges (standard
    # thin-wall result, common practice). The FE value approaches it as the wall thins.
    b, h = 0.04, 0.1
    e = cs.channel_shear_centre(b, h)
    errs = []
    for t in (0.008, 0.004, 0.002):
        _, _, sr = shear_of(custom_section([channel(b, h, t)]), 0.3, fineness=0.5)
        xs = -sr.centre[0]
        errs.append(abs(xs - e) / e)
        assert abs(sr.centre[1]) < 1e-6 * h  # on the axis of symmetry (mesh not exactly symmetric)
    print(f"\nchannel shear centre: relative differences from 3b²/(h+6b) {[f'{x:.2e}' for x in errs]}")
    assert errs[0] > errs[1] > errs[2]
    assert errs[-1] < 0.01


def test_symmetric_keyed_section_puts_the_centre_on_its_axis_and_moves_it_away_from_the_keyway():
    sm, pr, sr = shear_of(keyed_section(0.03, [Keyway(0.008, 0.004, 0.0004)]), 0.3)
    assert abs(sr.centre[0]) < 1e-6 * 0.03  # on the symmetry line (common practice); mesh not exactly symmetric
    assert sr.centre[1] < pr.centroid[1] < 0  # below the centroid, away from the keyway on top


def test_rotating_the_section_rotates_the_centre():
    sec = keyed_section(0.03, [Keyway(0.008, 0.004, 0.0004)])
    _, _, s0 = shear_of(sec, 0.3)
    _, _, s1 = shear_of(sec.moved(0.005, 0.002, 50.0), 0.3)
    c = math.radians(50.0)
    R = np.array([[math.cos(c), -math.sin(c)], [math.sin(c), math.cos(c)]])
    assert np.allclose(s1.centre, R @ np.array(s0.centre) + (0.005, 0.002), atol=1e-8)
    # the coefficients turn as a tensor: the trace of α is invariant
    assert np.trace(s1.alpha) == pytest.approx(np.trace(s0.alpha), rel=1e-5)


def test_equilibrium_residuals_are_small_on_an_unsymmetric_section():
    # an L-like section with Ixy ≠ 0
    sec = custom_section([polygon([(0, 0), (0.03, 0), (0.03, 0.006), (0.006, 0.006), (0.006, 0.02), (0, 0.02)],
                                  fillets=(0, 0, 0, 0.002, 0, 0))])
    sm, pr, sr = shear_of(sec, 0.3)
    assert abs(pr.Ixy) > 0.1 * pr.Ixx
    for key in ("Vx", "Vy"):
        assert max(abs(v) for v in sr.resultant_residual[key]) < 1e-6
    pk = shear_peak(sm, sr, 300.0, -500.0)
    assert abs(pk.moment_residual) < 1e-9
    assert pk.normal_traction < 0.05  # traction-free boundary satisfied weakly (common practice)


def test_convergence_rate_of_the_round_bar_coefficient():
    # Exact: energy κ of the round bar at ν = 0.3 (derived from T&G 3rd ed., §120). Observed order printed.
    exact = cs.energy_round(0.3)
    errs, hs = [], []
    for f in (0.5, 1.0, 2.0):
        sm, _, sr = shear_of(round_section(0.02), 0.3, f)
        errs.append(sr.kappa_y / exact - 1)
        hs.append(sm.h_global)
    p = observed_order(errs, hs)
    print(f"\nround-bar shear coefficient: observed order {p:.2f}, errors {[f'{e:.1e}' for e in errs]}")
    assert p > 3.0


def test_slit_thin_tube_shear_centre_is_near_twice_the_radius():
    # Thin-walled open tube slit along one generator: shear centre at 2R from the tube's centre, on
    # the far side from the slit (thin-wall theory, common practice). The FE value
    # of a finite wall approaches it.
    from fem.geometry import Disk

    R, t, gap = 0.02, 0.001, 0.0005
    sec = custom_section([Disk((0.0, 0.0), R + t / 2)], [Disk((0.0, 0.0), R - t / 2), rectangle((R, 0.0), (4 * t, gap))])
    _, _, sr = shear_of(sec, 0.3, fineness=0.5)
    e = {"fem": -sr.centre[0], "exact": cs.slit_thin_tube_shear_centre(R)}
    assert abs(sr.centre[1]) < 1e-6 * R  # on the symmetry axis
    assert e["fem"] == pytest.approx(e["exact"], rel=0.01)  # t/R = 0.05: thin-wall theory holds to about 1 %

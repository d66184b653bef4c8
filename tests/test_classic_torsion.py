"""Checks of classic.torsion against published values (each test names its source, and says where a value is
derived from the named exact solution or remembered from it) and against the exact
Prandtl stress functions integrated numerically here."""
import math
import warnings

import numpy as np
import pytest
from scipy.integrate import dblquad

from classic import torsion as Tn
from classic._validity import OutOfRangeError, OutOfRangeWarning

# Numerical quadrature of the exact stress functions reaches ~1e-10 relative; rel=1e-8 leaves
# margin while any formula slip (a wrong coefficient) would be off by percent.
QUAD_REL = 1e-8
# Closed forms compared with closed forms: floating-point rounding only.
EXACT_REL = 1e-12


def _quad(f, y_lo, y_hi, x_lo, x_hi):
    return dblquad(lambda x, y: f(x, y), y_lo, y_hi, x_lo, x_hi, epsabs=0, epsrel=1e-10)[0]


# ---------------------------------------------------------------- solid round and tube

def test_round_against_strength_of_materials():
    # Solid round: J = pi d^4/32, peak 16T/(pi d^3) on the surface — any strength-of-materials
    # text [C]; J checked here by integrating r^2 over the disc [D].
    d, T = 0.042, 310.0
    R = d / 2
    J = _quad(lambda x, y: x * x + y * y, -R, R,
              lambda y: -math.sqrt(R * R - y * y), lambda y: math.sqrt(R * R - y * y))
    assert Tn.round_torsion_constant(d) == pytest.approx(J, rel=QUAD_REL)
    assert Tn.round_torsion_constant(d) == pytest.approx(math.pi * d**4 / 32, rel=EXACT_REL)
    assert Tn.round_peak_shear(T, d) == pytest.approx(16 * T / (math.pi * d**3), rel=EXACT_REL)
    # Tc/J hand formula at c = d/2 is the same stress (any strength-of-materials text) [C].
    assert Tn.shear_from_torsion_constant(T, R, J) == pytest.approx(
        Tn.round_peak_shear(T, d), rel=QUAD_REL)


def test_keyed_nominal_is_full_diameter_round_stress():
    # Peterson's / Shigley's convention (Shigley, 9th ed., eqs. 7-7 ... 7-14, Table 7-1) [C]:
    # Kts multiplies 16T/(pi d^3) on the full shaft diameter.
    assert Tn.keyed_nominal_shear(95.0, 0.028) == pytest.approx(
        16 * 95.0 / (math.pi * 0.028**3), rel=EXACT_REL)


def test_tube_against_strength_of_materials():
    # Tube: J = pi (D^4 - d^4)/32, peak 16 T D / (pi (D^4 - d^4)) — any text [C].
    D, d, T = 0.05, 0.03, 420.0
    assert Tn.tube_torsion_constant(D, d) == pytest.approx(math.pi * (D**4 - d**4) / 32, rel=EXACT_REL)
    assert Tn.tube_peak_shear(T, D, d) == pytest.approx(
        16 * T * D / (math.pi * (D**4 - d**4)), rel=EXACT_REL)
    # d = 0 is the solid round (same source) [C].
    assert Tn.tube_torsion_constant(D, 0.0) == pytest.approx(Tn.round_torsion_constant(D), rel=EXACT_REL)
    assert Tn.tube_peak_shear(T, D, 0.0) == pytest.approx(Tn.round_peak_shear(T, D), rel=EXACT_REL)


# ---------------------------------------------------------------- ellipse

def _ellipse_phi(a, b):
    k = a * a * b * b / (a * a + b * b)
    phi = lambda x, y: k * (1 - x * x / a**2 - y * y / b**2)  # noqa: E731
    grad = lambda x, y: (-2 * k * x / a**2, -2 * k * y / b**2)  # noqa: E731
    return k, phi, grad


def test_ellipse_against_prandtl_function():
    # Roark, 7th ed., Table 10.1 [C]: J = pi a^3 b^3/(a^2+b^2), peak 2T/(pi a b^2) at the ends of
    # the minor axis. Re-checked [D] with the exact Prandtl function of the ellipse
    # (phi = k(1 - x^2/a^2 - y^2/b^2), del^2 phi = -2): J = 2 * integral(phi), tau = (T/J)|grad phi|.
    a, b, T = 0.03, 0.012, 150.0
    _, phi, grad = _ellipse_phi(a, b)
    half = lambda y: a * math.sqrt(max(0.0, 1 - (y / b) ** 2))  # noqa: E731
    J = 2 * _quad(phi, -b, b, lambda y: -half(y), half)
    assert Tn.ellipse_torsion_constant(a, b) == pytest.approx(J, rel=QUAD_REL)
    assert Tn.ellipse_torsion_constant(b, a) == pytest.approx(J, rel=QUAD_REL)
    # Peak: the largest |grad phi| round the boundary is at (0, b), the minor-axis end.
    s = np.linspace(0, 2 * np.pi, 20001)
    gx, gy = grad(a * np.cos(s), b * np.sin(s))
    tau_boundary = T / J * np.hypot(gx, gy)
    assert np.argmax(tau_boundary) in (5000, 15000)          # s = pi/2 or 3 pi/2
    assert Tn.ellipse_peak_shear(T, a, b) == pytest.approx(tau_boundary.max(), rel=QUAD_REL)


def test_ellipse_with_equal_axes_is_round():
    # a = b: the circle (Roark, 7th ed., Table 10.1, solid circular section) [C].
    r, T = 0.02, 80.0
    assert Tn.ellipse_torsion_constant(r, r) == pytest.approx(Tn.round_torsion_constant(2 * r), rel=EXACT_REL)
    assert Tn.ellipse_peak_shear(T, r, r) == pytest.approx(Tn.round_peak_shear(T, 2 * r), rel=EXACT_REL)


def test_hollow_ellipse_against_prandtl_function():
    # Roark, 7th ed., Table 10.1, hollow ellipse bounded by similar ellipses [C]:
    # J = pi a^3 b^3/(a^2+b^2) (1 - q^4), peak 2T/(pi a b^2 (1 - q^4)).
    # Re-checked [D]: the solid-ellipse phi is constant (c = k(1 - q^2)) on the inner ellipse,
    # so J = 2 * integral over the annulus of phi + 2 c A_hole (the hole term of the
    # stress-function form with a circulation condition).
    a, b, q, T = 0.04, 0.025, 0.6, 900.0
    k, phi, _ = _ellipse_phi(a, b)
    c = k * (1 - q * q)
    outer = lambda y: a * math.sqrt(max(0.0, 1 - (y / b) ** 2))  # noqa: E731
    inner = lambda y: q * a * math.sqrt(max(0.0, 1 - (y / (q * b)) ** 2))  # noqa: E731
    # the annulus, split at |y| = q b into the two caps and the two side strips
    ann = (2 * _quad(phi, q * b, b, lambda y: -outer(y), outer)
           + 2 * _quad(phi, -q * b, q * b, inner, outer))
    A_hole = math.pi * q * a * q * b
    J = 2 * ann + 2 * c * A_hole
    assert Tn.hollow_ellipse_torsion_constant(a, b, q) == pytest.approx(J, rel=QUAD_REL)
    assert Tn.hollow_ellipse_peak_shear(T, a, b, q) == pytest.approx(
        2 * T / (math.pi * a * b**2 * (1 - q**4)), rel=EXACT_REL)


def test_hollow_ellipse_limits():
    # q = 0 is the solid ellipse; a = b is the concentric tube with d = q D
    # (Roark, 7th ed., Table 10.1, both cases) [C]. Exact identities.
    a, b, T = 0.03, 0.02, 55.0
    assert Tn.hollow_ellipse_torsion_constant(a, b, 0.0) == pytest.approx(
        Tn.ellipse_torsion_constant(a, b), rel=EXACT_REL)
    assert Tn.hollow_ellipse_peak_shear(T, a, b, 0.0) == pytest.approx(
        Tn.ellipse_peak_shear(T, a, b), rel=EXACT_REL)
    R, q = 0.025, 0.7
    assert Tn.hollow_ellipse_torsion_constant(R, R, q) == pytest.approx(
        Tn.tube_torsion_constant(2 * R, 2 * q * R), rel=EXACT_REL)
    assert Tn.hollow_ellipse_peak_shear(T, R, R, q) == pytest.approx(
        Tn.tube_peak_shear(T, 2 * R, 2 * q * R), rel=EXACT_REL)


# ---------------------------------------------------------------- equilateral triangle

def test_triangle_against_prandtl_function():
    # Roark, 7th ed., Table 10.1 [C]: J = sqrt(3) a^4/80, peak 20T/a^3 at the mid-sides.
    # Re-checked [D] with the exact Prandtl function of the equilateral triangle of height h,
    # sides x = -h/3 and x +- sqrt(3) y = 2h/3: phi = ((x - 2h/3)^2 - 3y^2)(x + h/3)/(2h),
    # del^2 phi = -2, phi = 0 on the sides.
    a, T = 0.05, 40.0
    h = math.sqrt(3) * a / 2
    phi = lambda x, y: ((x - 2 * h / 3) ** 2 - 3 * y * y) * (x + h / 3) / (2 * h)  # noqa: E731
    # integrate over x in [-h/3, 2h/3] (outer), |y| <= (2h/3 - x)/sqrt(3) (inner)
    J = 2 * dblquad(lambda y, x: phi(x, y), -h / 3, 2 * h / 3,
                    lambda x: -(2 * h / 3 - x) / math.sqrt(3),
                    lambda x: (2 * h / 3 - x) / math.sqrt(3), epsabs=0, epsrel=1e-10)[0]
    assert Tn.equilateral_triangle_torsion_constant(a) == pytest.approx(J, rel=QUAD_REL)
    # |grad phi| over a grid of the triangle peaks at the mid-side (-h/3, 0), where it is h/2.
    xs, ys = np.meshgrid(np.linspace(-h / 3, 2 * h / 3, 601), np.linspace(-h / 2, h / 2, 601))
    inside = np.abs(ys) <= (2 * h / 3 - xs) / math.sqrt(3)
    u = xs - 2 * h / 3
    gx = ((u**2 - 3 * ys**2) + 2 * u * (xs + h / 3)) / (2 * h)
    gy = (-6 * ys * (xs + h / 3)) / (2 * h)
    g = np.where(inside, np.hypot(gx, gy), 0.0)
    assert g.max() == pytest.approx(h / 2, rel=1e-12)
    assert Tn.equilateral_triangle_peak_shear(T, a) == pytest.approx(T / J * h / 2, rel=QUAD_REL)


# ---------------------------------------------------------------- rectangle

# Rectangle: Saint-Venant series values (Timoshenko & Goodier, 3rd ed.; derived, 4 decimals) and the printed
# tables of Shigley, Mechanical Engineering Design, and Roark, Table 10.1 (3 decimals).
RATIOS = [1, 1.5, 2, 3, 4, 6, 10]
BETA_SERIES = [0.1406, 0.1958, 0.2287, 0.2633, 0.2808, 0.2983, 0.3123]
ALPHA_SERIES = [0.2082, 0.2310, 0.2459, 0.2672, 0.2817, 0.2984, 0.3123]
BETA_PRINTED = [0.141, 0.196, 0.229, 0.263, 0.281, 0.299, 0.313]
ALPHA_PRINTED = [0.208, 0.231, 0.246, 0.267, 0.282, 0.299, 0.313]


@pytest.mark.parametrize("r, beta, alpha", zip(RATIOS, BETA_SERIES, ALPHA_SERIES))
def test_rectangle_series_against_derived_values(r, beta, alpha):
    # Timoshenko & Goodier, Theory of Elasticity, 3rd ed., rectangle series [M form, D values].
    # The reference values are rounded to 4 decimals: half a unit in the 4th place is 5e-5.
    b_, a_ = Tn.rectangle_torsion_series(r * 0.01, 0.01)
    assert b_ == pytest.approx(beta, abs=5e-5 + 1e-9)
    assert a_ == pytest.approx(alpha, abs=5e-5 + 1e-9)


@pytest.mark.parametrize("r, beta, alpha", zip(RATIOS, BETA_PRINTED, ALPHA_PRINTED))
def test_rectangle_series_against_printed_table(r, beta, alpha):
    # Printed table, Shigley, Mechanical Engineering Design / Roark [C]. The printed tables
    # round differently (0.228/0.229, 0.312/0.313), so ±0.001.
    b_, a_ = Tn.rectangle_torsion_series(r, 1.0)
    assert b_ == pytest.approx(beta, abs=0.001)
    assert a_ == pytest.approx(alpha, abs=0.001)


@pytest.mark.parametrize("r, beta, alpha", zip(RATIOS, BETA_PRINTED, ALPHA_PRINTED))
def test_rectangle_table_data_is_the_printed_table(r, beta, alpha):
    # The stored table must be the printed one (Shigley / Roark [C]), value for value.
    assert Tn.rectangle_coefficients_table(r) == pytest.approx((alpha, beta), abs=1e-12)


def test_rectangle_table_infinite_ratio_and_interpolation():
    # Printed table, w/t = inf: 0.333 (Shigley / Roark [C]).
    assert Tn.rectangle_coefficients_table(math.inf) == (0.333, 0.333)
    # Linear interpolation between the printed 4 and 6 entries (Shigley / Roark [C]);
    # the interpolated value stays within 0.001 of the converged series [D] there.
    alpha, beta = Tn.rectangle_coefficients_table(5.0)
    assert alpha == pytest.approx((0.282 + 0.299) / 2, abs=1e-12)
    assert beta == pytest.approx((0.281 + 0.299) / 2, abs=1e-12)
    b_s, a_s = Tn.rectangle_torsion_series(5.0, 1.0)
    assert beta == pytest.approx(b_s, abs=0.002)    # 2 printed roundings + curvature of beta(r)
    assert alpha == pytest.approx(a_s, abs=0.002)


@pytest.mark.parametrize("ratio", [0.5, 10.5, 20.0, -1.0, float("nan")])
def test_rectangle_table_refuses_outside(ratio):
    # No extrapolation beyond the printed range 1 ... 10 (and inf) — project rule.
    with pytest.raises(OutOfRangeError) as err:
        Tn.rectangle_coefficients_table(ratio)
    assert err.value.field == "ratio"


def test_rectangle_functions_use_series_and_swap_sides():
    # J = beta w t^3 and tau = T/(alpha w t^2) (Timoshenko & Goodier, 3rd ed. [M form]);
    # the section does not care which side is called w (exact symmetry).
    w, t, T = 0.06, 0.02, 250.0
    beta, alpha = Tn.rectangle_torsion_series(w, t)
    assert Tn.rectangle_torsion_constant(w, t) == pytest.approx(beta * w * t**3, rel=EXACT_REL)
    assert Tn.rectangle_torsion_constant(t, w) == pytest.approx(beta * w * t**3, rel=EXACT_REL)
    assert Tn.rectangle_peak_shear(T, w, t) == pytest.approx(T / (alpha * w * t**2), rel=EXACT_REL)
    assert Tn.rectangle_peak_shear(T, t, w) == pytest.approx(T / (alpha * w * t**2), rel=EXACT_REL)
    # square: beta = 0.1406 [D] (Saint-Venant series, w/t = 1; derived), so J = 0.1406 a^4
    assert Tn.rectangle_torsion_constant(0.03, 0.03) == pytest.approx(0.1406 * 0.03**4, rel=4e-4)


def test_rectangle_series_converged():
    # The series is converged at the default: doubling the terms changes nothing visible
    # (the 1/n^5 tail beyond 100 odd terms is ~1e-10).
    for r in (1.0, 2.5, 10.0):
        assert Tn.rectangle_torsion_series(r, 1.0) == pytest.approx(
            Tn.rectangle_torsion_series(r, 1.0, nterms=200), abs=1e-9)


def test_rectangle_tends_to_thin_strip():
    # Timoshenko & Goodier, 3rd ed. [M]: beta = (1/3)(1 - 0.630 t/w) for large w/t, with
    # 0.630 = (192/pi^5) * sum 1/n^5 over odd n [D]; beta -> 1/3 (w/t = inf).
    c = 192 / math.pi**5 * sum(1 / n**5 for n in range(1, 2001, 2))
    assert c == pytest.approx(0.630, abs=5e-4)
    for r in (20.0, 100.0, 1000.0):
        beta, alpha = Tn.rectangle_torsion_series(r, 1.0)
        assert beta == pytest.approx((1 - c / r) / 3, rel=1e-12)
        assert alpha == pytest.approx(beta, rel=1e-12)      # k -> 1 exponentially
    # thin open strip (any text [C]) over-estimates by 1/(1 - 0.630 t/w)
    w, t = 0.1, 0.001
    assert Tn.thin_open_torsion_constant([(w, t)]) / Tn.rectangle_torsion_constant(w, t) == pytest.approx(
        1 / (1 - c * t / w), rel=1e-12)


# ---------------------------------------------------------------- thin closed (Bredt–Batho)

def test_bredt_batho_circular_tube_limit():
    # Bredt–Batho, any text [C]: J = 4 Am^2/(perimeter/t), tau = T/(2 Am t). For a circular tube
    # of mid-line radius rm the exact J is 2 pi rm t (rm^2 + t^2/4) [D from pi(D^4-d^4)/32], so
    # the ratio is 1/(1 + (t/2rm)^2): 2.5e-5 at t/rm = 0.01.
    rm, t, T = 0.05, 0.0005, 60.0
    Am = math.pi * rm**2
    Jb = Tn.thin_closed_torsion_constant(Am, 2 * math.pi * rm / t)
    Jx = Tn.tube_torsion_constant(2 * rm + t, 2 * rm - t)
    assert Jb / Jx == pytest.approx(1 / (1 + (t / (2 * rm)) ** 2), rel=1e-10)
    assert Jb == pytest.approx(Jx, rel=3e-5)
    # mean wall stress vs exact outer-fibre stress: differ by O(t/rm) (0.5 % here)
    tau_b = Tn.thin_closed_shear(T, Am, t)
    tau_x = Tn.tube_peak_shear(T, 2 * rm + t, 2 * rm - t)
    assert tau_b == pytest.approx(T / (2 * Am * t), rel=EXACT_REL)
    assert tau_b == pytest.approx(tau_x, rel=0.006)        # thin-wall error ~ t/(2 rm)


def test_bredt_batho_segments():
    # Box section a x a with walls t1 (top, bottom) and t2 (sides): J = 4 a^4/(2a/t1 + 2a/t2)
    # (Bredt–Batho, any text [C]).
    a, t1, t2 = 0.1, 0.004, 0.002
    segs = [(a, t1), (a, t2), (a, t1), (a, t2)]
    expected = 4 * a**4 / (2 * a / t1 + 2 * a / t2)
    assert Tn.thin_closed_torsion_constant(a * a, segs) == pytest.approx(expected, rel=EXACT_REL)
    # same as giving the wall integral directly
    assert Tn.thin_closed_torsion_constant(a * a, 2 * a / t1 + 2 * a / t2) == pytest.approx(
        expected, rel=EXACT_REL)


def test_thin_closed_warns_when_wall_is_thick():
    # 'Thin' taken as t <= 0.1 x mid-line radius — common practice.
    rm = 0.05
    with pytest.warns(OutOfRangeWarning, match="t/r_m"):
        Tn.thin_closed_torsion_constant(math.pi * rm**2, [(2 * math.pi * rm, 0.01)])
    with pytest.warns(OutOfRangeWarning, match="t/r_m"):
        Tn.thin_closed_shear(1.0, math.pi * rm**2, 0.01)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        Tn.thin_closed_shear(1.0, math.pi * rm**2, 0.002)           # thin: no warning


# ---------------------------------------------------------------- thin open

def test_thin_open_sum_and_peak():
    # Thin open section: J = sum b t^3/3, tau = T t/J (any text [C]). Channel-like section of
    # three walls; the peak is in the thickest wall.
    segs = [(0.04, 0.003), (0.1, 0.004), (0.04, 0.003)]
    J = Tn.thin_open_torsion_constant(segs)
    assert J == pytest.approx(sum(b * t**3 / 3 for b, t in segs), rel=EXACT_REL)
    assert Tn.thin_open_peak_shear(12.0, 0.004, J) == pytest.approx(12.0 * 0.004 / J, rel=EXACT_REL)
    # against the rectangle series for one strip, b/t = 100: tau from T/(alpha b t^2);
    # thin-wall theory is low by about 0.63 t/b (Timoshenko & Goodier, 3rd ed. [M]).
    b, t, T = 0.2, 0.002, 5.0
    tau_thin = Tn.thin_open_peak_shear(T, t, Tn.thin_open_torsion_constant([(b, t)]))
    assert tau_thin == pytest.approx(Tn.rectangle_peak_shear(T, b, t), rel=0.0065)


def test_thin_open_warns_when_wall_is_thick():
    # 'Thin' taken as t/b <= 0.1 — common practice; at b/t = 5 the 1/3 is 17 % high (series [D]).
    with pytest.warns(OutOfRangeWarning, match="t/b"):
        Tn.thin_open_torsion_constant([(0.01, 0.002)])


# ---------------------------------------------------------------- refusals

@pytest.mark.parametrize("call, field", [
    (lambda: Tn.round_torsion_constant(0.0), "d"),
    (lambda: Tn.round_torsion_constant(-0.02), "d"),
    (lambda: Tn.round_peak_shear("x", 0.02), "T"),
    (lambda: Tn.round_peak_shear(math.inf, 0.02), "T"),
    (lambda: Tn.tube_torsion_constant(0.03, 0.04), "d/D"),
    (lambda: Tn.tube_peak_shear(1.0, 0.03, 0.03), "d/D"),
    (lambda: Tn.ellipse_torsion_constant(0.0, 0.01), "a"),
    (lambda: Tn.ellipse_peak_shear(1.0, 0.01, 0.02), "b/a"),
    (lambda: Tn.hollow_ellipse_torsion_constant(0.02, 0.01, 1.0), "q"),
    (lambda: Tn.hollow_ellipse_torsion_constant(0.02, 0.01, -0.1), "q"),
    (lambda: Tn.hollow_ellipse_peak_shear(1.0, 0.02, 0.01, 1.2), "q"),
    (lambda: Tn.equilateral_triangle_torsion_constant(-1.0), "a"),
    (lambda: Tn.rectangle_torsion_series(0.0, 0.01), "w"),
    (lambda: Tn.rectangle_torsion_series(0.02, 0.01, nterms=0), "nterms"),
    (lambda: Tn.rectangle_peak_shear(1.0, 0.02, -0.01), "t"),
    (lambda: Tn.thin_closed_torsion_constant(0.0, 100.0), "Am"),
    (lambda: Tn.thin_closed_torsion_constant(0.01, []), "walls"),
    (lambda: Tn.thin_closed_torsion_constant(0.01, [(0.1, 0.0)]), "thickness"),
    (lambda: Tn.thin_closed_torsion_constant(0.01, [(0.1,)]), "walls"),
    (lambda: Tn.thin_closed_shear(1.0, 0.01, 0.0), "t"),
    (lambda: Tn.thin_open_torsion_constant([]), "segments"),
    (lambda: Tn.thin_open_torsion_constant([(0.0, 0.001)]), "b"),
    (lambda: Tn.thin_open_peak_shear(1.0, 0.001, 0.0), "J"),
    (lambda: Tn.shear_from_torsion_constant(1.0, -0.01, 1e-8), "c"),
])
def test_bad_input_refused_with_field_name(call, field):
    # Project rule: bad input gets a one-line error naming the field and the value.
    with pytest.raises(OutOfRangeError) as err:
        call()
    assert err.value.field == field
    assert "\n" not in str(err.value)

"""Checks of classic.shear against published values (each test names its source, and says where a value is
derived from the named exact solution or remembered from it) and against exact
flexure stress fields evaluated numerically here."""
import math

import numpy as np
import pytest

from classic import shear as S
from classic._validity import OutOfRangeError
from classic.properties import round_area

# Closed forms compared with closed forms: floating-point rounding only.
EXACT_REL = 1e-12
# Values printed to 3 decimals in the cited tables: half a unit in the last place.
PRINTED_3 = 5e-4 + 1e-9


# ---------------------------------------------------------------- elementary

def test_elementary_values_from_vq_ib():
    # Elementary beam theory, any strength-of-materials text [C]: tau = VQ/(Ib) at the neutral
    # axis gives 4V/3A (round), 3V/2A (rectangle), 2V/A (thin tube).
    V = 2500.0
    R = 0.02   # round: Q of the half disc 2R^3/3, width 2R, I = pi R^4/4
    assert S.round_shear_elementary(V, 2 * R) == pytest.approx(
        S.vq_ib(V, 2 * R**3 / 3, math.pi * R**4 / 4, 2 * R), rel=EXACT_REL)
    b, h = 0.03, 0.05   # rectangle: Q = b h^2/8, I = b h^3/12, width b
    assert S.rectangle_shear_elementary(V, b * h) == pytest.approx(
        S.vq_ib(V, b * h**2 / 8, b * h**3 / 12, b), rel=EXACT_REL)
    Rm, t = 0.04, 0.001  # thin tube: Q = 2 Rm^2 t, I = pi Rm^3 t, width 2t, A = 2 pi Rm t
    assert S.thin_tube_shear_elementary(V, 2 * math.pi * Rm * t) == pytest.approx(
        S.vq_ib(V, 2 * Rm**2 * t, math.pi * Rm**3 * t, 2 * t), rel=EXACT_REL)


# ---------------------------------------------------------------- exact flexure of the round

def _hollow_round_flexure(nu, R, Ri, V):
    """Exact Saint-Venant flexure stresses of a (hollow) round bar, derived here [D].

    Shear-function form (Pilkey, Analysis and Design of Elastic Beams, 2002; Vy alone, Ixy = 0): del^2 F = -2 y,
    dF/dn = nu n.(xy, -(x^2-y^2)/2) on both circles, tau = V/(2(1+nu)I) (grad F - h).
    In polar form F = (-r^3/4 + B r + C/r) sin(theta) with
    B = (3+2nu)(R^2+Ri^2)/4, C = (3+2nu) R^2 Ri^2/4 satisfies both boundary conditions.
    """
    k = (3 + 2 * nu) / 4
    B, C = k * (R**2 + Ri**2), k * R**2 * Ri**2
    I = math.pi * (R**4 - Ri**4) / 4
    c = V / (2 * (1 + nu) * I)

    def tau(x, y):
        r2 = x * x + y * y
        inv = np.where(r2 > 0, 1 / np.where(r2 > 0, r2, 1) ** 2, 0.0)
        fx = -x * y / 2 - 2 * C * x * y * inv
        fy = -(x * x + 3 * y * y) / 4 + B + C * (r2 - 2 * y * y) * inv
        return c * (fx - nu * x * y), c * (fy + nu * (x * x - y * y) / 2)
    return tau


def _polar_grid(Ri, R, n=300):
    # Gauss-Legendre in r, uniform in theta: exact-to-rounding for these polynomial/trig fields
    xg, wg = np.polynomial.legendre.leggauss(n)
    r = Ri + (R - Ri) * (xg + 1) / 2
    w = wg * (R - Ri) / 2 * r
    th = np.linspace(0, 2 * np.pi, n, endpoint=False)
    rr, tt = np.meshgrid(r, th, indexing="ij")
    return rr * np.cos(tt), rr * np.sin(tt), (w[:, None] * (2 * np.pi / n)) * np.ones_like(tt)


def test_derived_round_field_is_the_exact_solution():
    # Sanity of the derived field used below: traction-free on both circles, resultant V,
    # zero moment about the centre (symmetric section). Exact solution => rounding only.
    nu, R, Ri, V = 0.3, 0.02, 0.008, 1000.0
    for ri in (0.0, Ri):
        tau = _hollow_round_flexure(nu, R, ri, V)
        th = np.linspace(0, 2 * np.pi, 73)
        for rad in ([R] if ri == 0 else [R, ri]):
            tx, ty = tau(rad * np.cos(th), rad * np.sin(th))
            assert np.max(np.abs(tx * np.cos(th) + ty * np.sin(th))) < 1e-9 * V / R**2
        x, y, w = _polar_grid(ri, R)
        tx, ty = tau(x, y)
        assert np.sum(ty * w) == pytest.approx(V, rel=1e-12)
        assert abs(np.sum(tx * w)) < 1e-12 * V
        assert abs(np.sum((x * ty - y * tx) * w)) < 1e-12 * V * R


@pytest.mark.parametrize("nu", [0.0, 0.25, 0.3, 0.5])
def test_round_flexure_against_derived_field(nu):
    # Timoshenko & Goodier, 3rd ed., section 120 [M form, D re-checked]: centre
    # (3+2nu)/(2(1+nu)) V/A, surface at the neutral axis (1+2nu)/(1+nu) V/A.
    d, V = 0.05, 800.0
    tau = _hollow_round_flexure(nu, d / 2, 0.0, V)
    assert S.round_flexure_centre(V, d, nu) == pytest.approx(tau(0.0, 0.0)[1], rel=1e-12)
    assert S.round_flexure_surface(V, d, nu) == pytest.approx(tau(d / 2, 0.0)[1], rel=1e-12)


def test_round_flexure_reference_values():
    # Solid round at nu = 0.3: 1.385 and 1.231 V/A, elementary 4/3 (Timoshenko & Goodier, Theory of
    # Elasticity, 3rd ed., section 120; the form from memory, the values derived from it and re-checked); printed to 3 decimals.
    d, V = 0.03, 1.0
    A = round_area(d)
    assert S.round_flexure_centre(V, d, 0.3) * A == pytest.approx(1.385, abs=PRINTED_3)
    assert S.round_flexure_surface(V, d, 0.3) * A == pytest.approx(1.231, abs=PRINTED_3)
    assert S.round_shear_elementary(V, d) * A == pytest.approx(4 / 3, rel=EXACT_REL)
    # At nu = 1/2 the exact stress is uniform across the neutral axis and equals the
    # elementary 4V/3A (follows from the same T&G form [D]).
    assert S.round_flexure_centre(V, d, 0.5) == pytest.approx(S.round_shear_elementary(V, d), rel=EXACT_REL)
    assert S.round_flexure_surface(V, d, 0.5) == pytest.approx(S.round_shear_elementary(V, d), rel=EXACT_REL)


# ---------------------------------------------------------------- exact flexure of the rectangle

def _rectangle_flexure_series(b_over_h, nu, nterms=200):
    """Exact/elementary ratios at the centre and the neutral-axis edges, derived here [D].

    Half-depth a along the load, half-width c across it. Stress function (Timoshenko &
    Goodier's flexure formulation): tau_load = d(phi)/dy + P(a^2 - x^2)/(2I), with
    del^2 phi = (nu/(1+nu)) P y / I and phi = 0 on the boundary. With phi = (nu P/((1+nu) I)) psi,
    psi = (y^3 - c^2 y)/6 + sum A_n cosh(n pi x/c) sin(n pi y/c); the particular part vanishes on
    y = +-c and A_n cancels it on x = +-a. With I = 4 c a^3/3 and A = 4 a c the ratio to 3P/(2A)
    is 1 + (nu/(1+nu)) (2/a^2) psi_y(0, y), at y = 0 (centre) and y = c (edge).
    """
    a = 1.0
    c = b_over_h * a
    n = np.arange(1, nterms + 1, dtype=float)
    # (y^3 - c^2 y)/6 = sum g_n sin(n pi y/c), g_n = 2 c^3 (-1)^n/(n pi)^3
    g = 2 * c**3 * (-1.0) ** n / (n * np.pi) ** 3
    x = n * np.pi * a / c
    sech = 2 * np.exp(-x) / (1 + np.exp(-2 * x))
    A = -g * sech                                   # psi = 0 on x = +-a
    out = []
    for y in (0.0, c):
        psi_y = (3 * y * y - c * c) / 6 + np.sum(A * (n * np.pi / c) * np.cos(n * np.pi * y / c))
        out.append(1 + nu / (1 + nu) * 2 / a**2 * psi_y)
    return tuple(out)


# Timoshenko & Goodier, Theory of Elasticity, 3rd ed., table in section 124, nu = 0.25
# (from memory; values re-derived from the series below): b/h -> (centre, edges of the neutral axis).
TG_RECT = {0.5: (0.983, 1.033), 1.0: (0.940, 1.126), 2.0: (0.856, 1.396), 4.0: (0.805, 1.988)}


@pytest.mark.parametrize("boh", sorted(TG_RECT))
def test_rectangle_flexure_table(boh):
    # Table data (Timoshenko & Goodier, 3rd ed., section 124; from memory) and against the series
    # derived above [D]; the table is printed to 3 decimals (half a unit: 5e-4).
    centre, edge = S.rectangle_flexure_ratios(boh, 0.25)
    assert (centre, edge) == pytest.approx(TG_RECT[boh], abs=1e-12)
    s_centre, s_edge = _rectangle_flexure_series(boh, 0.25)
    assert centre == pytest.approx(s_centre, abs=PRINTED_3)
    assert edge == pytest.approx(s_edge, abs=PRINTED_3)


def test_rectangle_flexure_shear_scales_elementary():
    # tau = ratio * 3V/(2A) (T&G, 3rd ed., section 124 [M]).
    V, b, h = 3000.0, 0.04, 0.02
    tc, te = S.rectangle_flexure_shear(V, b, h)
    assert tc == pytest.approx(0.856 * 1.5 * V / (b * h), rel=EXACT_REL)
    assert te == pytest.approx(1.396 * 1.5 * V / (b * h), rel=EXACT_REL)


def test_rectangle_series_is_elementary_at_zero_poisson():
    # At nu = 0 the exact solution is the elementary parabola (T&G, 3rd ed., section 124 [M]).
    assert _rectangle_flexure_series(2.0, 0.0) == pytest.approx((1.0, 1.0), abs=1e-15)


@pytest.mark.parametrize("boh, nu, field", [
    (1.0, 0.3, "nu"), (1.0, 0.0, "nu"), (3.0, 0.25, "b_over_h"), (0.25, 0.25, "b_over_h"),
    (8.0, 0.25, "b_over_h"), ("one", 0.25, "b_over_h"),
])
def test_rectangle_flexure_table_refuses(boh, nu, field):
    # Table only (no interpolation, no extrapolation, no other nu) — project rule.
    with pytest.raises(OutOfRangeError) as err:
        S.rectangle_flexure_ratios(boh, nu)
    assert err.value.field == field


# ---------------------------------------------------------------- shear coefficients

@pytest.mark.parametrize("nu", [0.0, 0.25, 0.3, 0.5])
def test_cowper_formulas(nu):
    # Cowper 1966, J. Appl. Mech. 33:335-340 [C]: round 6(1+nu)/(7+6nu), rectangle
    # 10(1+nu)/(12+11nu), hollow round (m = r_in/r_out) with its m -> 1 limit the thin tube
    # 2(1+nu)/(4+3nu) [D].
    assert S.cowper_round(nu) == pytest.approx(6 * (1 + nu) / (7 + 6 * nu), rel=EXACT_REL)
    assert S.cowper_rectangle(nu) == pytest.approx(10 * (1 + nu) / (12 + 11 * nu), rel=EXACT_REL)
    m = 0.6
    s = (1 + m * m) ** 2
    assert S.cowper_hollow_round(nu, m) == pytest.approx(
        6 * (1 + nu) * s / ((7 + 6 * nu) * s + (20 + 12 * nu) * m * m), rel=EXACT_REL)
    assert S.cowper_hollow_round(nu, 0.0) == pytest.approx(S.cowper_round(nu), rel=EXACT_REL)
    assert S.cowper_hollow_round(nu, 1 - 1e-7) == pytest.approx(S.cowper_thin_tube(nu), rel=1e-6)


def test_cowper_known_values():
    # Cowper 1966 [C]: the rectangle at nu = 0 is 5/6, and at nu = 0.3 the round is 0.886
    # (formula value, 3 decimals).
    assert S.cowper_rectangle(0.0) == pytest.approx(5 / 6, rel=EXACT_REL)
    assert S.cowper_round(0.3) == pytest.approx(0.886, abs=PRINTED_3)


def test_hutchinson_round():
    # Timoshenko 1922 / Hutchinson 2001, J. Appl. Mech. 68:87-92 [C]: 6(1+nu)^2/(7+12nu+4nu^2).
    for nu in (0.0, 0.3, 0.5):
        assert S.hutchinson_round(nu) == pytest.approx(
            6 * (1 + nu) ** 2 / (7 + 12 * nu + 4 * nu**2), rel=EXACT_REL)
    # at nu = 0 all three round definitions agree at 6/7 (the stresses are then the same
    # field for each averaging) [D from the three formulas]
    assert S.hutchinson_round(0.0) == pytest.approx(6 / 7, rel=EXACT_REL)
    assert S.cowper_round(0.0) == pytest.approx(6 / 7, rel=EXACT_REL)
    assert S.energy_round(0.0) == pytest.approx(6 / 7, rel=EXACT_REL)


def _energy_kappa(nu, R, Ri):
    # Energy definition kappa = (V^2/A)/integral |tau|^2 dA with the exact flexure field [D].
    V = 1.0
    tau = _hollow_round_flexure(nu, R, Ri, V)
    x, y, w = _polar_grid(Ri, R)
    tx, ty = tau(x, y)
    A = math.pi * (R**2 - Ri**2)
    return (V**2 / A) / np.sum((tx**2 + ty**2) * w)


@pytest.mark.parametrize("nu", [0.0, 0.3, 0.5])
@pytest.mark.parametrize("m", [0.0, 0.3, 0.7, 0.95])
def test_energy_hollow_round_against_quadrature(nu, m):
    # Energy definition with the exact flexure stresses of Timoshenko & Goodier, 3rd ed., section 120
    # (derived): round 6(1+nu)^2/(7+14nu+8nu^2), hollow round
    # 6(1+nu)^2(1+m^2)^2/[(7+14nu+8nu^2)(1+m^2)^2 + 4m^2(5+10nu+4nu^2)]; re-derived here by
    # Gauss quadrature of the exact field (rounding-level agreement expected).
    assert S.energy_hollow_round(nu, m) == pytest.approx(_energy_kappa(nu, 1.0, m), rel=1e-10)
    if m == 0.0:
        assert S.energy_round(nu) == pytest.approx(_energy_kappa(nu, 1.0, 0.0), rel=1e-10)


def test_energy_reference_values_and_limits():
    # Derived from the same closed forms: round 0.851 at nu = 0.3; thin tube -> 1/2; rectangle at nu = 0 -> 5/6.
    assert S.energy_round(0.3) == pytest.approx(0.851, abs=PRINTED_3)
    for nu in (0.0, 0.3, 0.5):
        assert S.energy_hollow_round(nu, 1 - 1e-7) == pytest.approx(S.energy_thin_tube(), rel=1e-6)
        assert S.energy_hollow_round(nu, 0.0) == pytest.approx(S.energy_round(nu), rel=EXACT_REL)
    assert S.energy_thin_tube() == 0.5
    # rectangle at nu = 0: the parabola tau = (3V/2A)(1 - 4y^2/h^2) gives 5/6 [D]
    y, w = np.polynomial.legendre.leggauss(10)       # exact for this polynomial
    integral = np.sum(w * (1.5 * (1 - y**2)) ** 2) / 2  # mean of (tau A/V)^2 over y in [-1, 1]
    assert S.energy_rectangle(0.0) == pytest.approx(1 / integral, rel=1e-13)
    assert S.energy_rectangle(0.0) == pytest.approx(5 / 6, rel=EXACT_REL)


def test_definitions_registry():
    # Every coefficient function carries its definition label, and the label matches its name.
    coeffs = [S.cowper_round, S.cowper_rectangle, S.cowper_hollow_round, S.cowper_thin_tube,
              S.hutchinson_round, S.energy_round, S.energy_hollow_round, S.energy_thin_tube,
              S.energy_rectangle]
    assert set(S.SHEAR_COEFFICIENT_DEFINITIONS) == set(coeffs)
    prefix = {"cowper": S.COWPER_1966, "hutchinson": S.HUTCHINSON_2001, "energy": S.ENERGY}
    for f in coeffs:
        assert S.shear_coefficient_definition(f) == prefix[f.__name__.split("_")[0]]
    assert {S.COWPER_1966, S.HUTCHINSON_2001, S.ENERGY} == {"cowper-1966", "hutchinson-2001", "energy"}
    with pytest.raises(OutOfRangeError):
        S.shear_coefficient_definition(S.vq_ib)
    # the definitions really differ: at nu = 0.3 the three round values are not equal
    vals = {S.cowper_round(0.3), S.hutchinson_round(0.3), S.energy_round(0.3)}
    assert len({round(v, 3) for v in vals}) == 3


@pytest.mark.parametrize("call, field", [
    (lambda: S.cowper_round(0.6), "nu"),
    (lambda: S.cowper_round(-1.0), "nu"),
    (lambda: S.hutchinson_round(float("nan")), "nu"),
    (lambda: S.cowper_hollow_round(0.3, 1.0), "m"),
    (lambda: S.energy_hollow_round(0.3, -0.1), "m"),
    (lambda: S.energy_rectangle(0.3), "nu"),
    (lambda: S.round_flexure_centre(1.0, 0.0, 0.3), "d"),
    (lambda: S.round_flexure_surface(1.0, 0.02, 0.7), "nu"),
    (lambda: S.round_shear_elementary(math.inf, 0.02), "V"),
    (lambda: S.vq_ib(1.0, 1e-6, 0.0, 0.01), "I"),
    (lambda: S.vq_ib(1.0, 1e-6, 1e-8, 0.0), "b"),
    (lambda: S.thin_tube_shear_elementary(1.0, -1e-4), "A"),
    (lambda: S.channel_shear_centre(0.0, 0.1), "b"),
    (lambda: S.channel_shear_centre(0.05, "deep"), "h"),
    (lambda: S.slit_thin_tube_shear_centre(-0.01), "R"),
])
def test_bad_input_refused_with_field_name(call, field):
    # Project rule: bad input gets a one-line error naming the field and the value.
    with pytest.raises(OutOfRangeError) as err:
        call()
    assert err.value.field == field
    assert "\n" not in str(err.value)


# ---------------------------------------------------------------- shear centres

def test_channel_shear_centre_from_shear_flow():
    # Standard thin-wall result (common practice; derived below): e = 3b^2/(h+6b) from the web centreline.
    # Re-derived: flange shear flow q(s) = V t s (h/2)/I from the tip, flange force F = integral q,
    # e = F h / V, with the thin-wall I = t h^3/12 + 2 b t (h/2)^2.
    b, h, t, V = 0.04, 0.1, 0.001, 1.0
    I = t * h**3 / 12 + 2 * b * t * (h / 2) ** 2
    s, w = np.polynomial.legendre.leggauss(8)
    s = b * (s + 1) / 2
    F = np.sum(w * b / 2 * V * t * s * (h / 2) / I)
    assert S.channel_shear_centre(b, h) == pytest.approx(F * h / V, rel=1e-13)


def test_slit_tube_shear_centre_from_shear_flow():
    # Thin-wall theory (Boresi & Schmidt, Advanced Mechanics of Materials, 6th ed. — from memory):
    # e = 2R from the centre, away from the slit. Re-derived: q(theta) = (V/I) t R^2 (1 - cos theta)
    # from the slit at theta = 0, i.e. at (R, 0), with y = R sin(theta) and I = pi R^3 t.
    R, t, V = 0.03, 0.0005, 1.0
    I = math.pi * R**3 * t
    th, w = np.polynomial.legendre.leggauss(40)
    th = np.pi * (th + 1)
    q = V / I * t * R**2 * (1 - np.cos(th))
    moment = np.sum(w * np.pi * q * R**2)
    # The flow runs along e_theta = (-sin, cos); its y resultant is integral q cos(theta) R:
    # exactly -V (the shear flow balances the applied V), no x resultant.
    Fy = np.sum(w * np.pi * q * np.cos(th) * R)
    Fx = np.sum(w * np.pi * q * -np.sin(th) * R)
    assert Fy == pytest.approx(-V, rel=1e-12)
    assert abs(Fx) < 1e-12 * V
    # A force Fy at x_s has moment x_s Fy about the centre: x_s = moment/Fy = -2R, i.e. on the
    # far side from the slit (which is at x = +R).
    x_s = moment / Fy
    assert x_s == pytest.approx(-S.slit_thin_tube_shear_centre(R), rel=1e-12)

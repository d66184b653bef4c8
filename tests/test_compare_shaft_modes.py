"""The mode shapes of the layout's critical speeds (compare/checks/shaft_modes.py) against exact
solutions: a uniform shaft on two simple supports vibrates in sin(nπz/L) (the exact solution of the
Euler–Bernoulli beam; Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th ed., 1974,
the chapter on the transverse vibration of beams — chapter from memory); the Timoshenko beam differs by shear and rotary inertia, about (πr/L)² ≈ 4e-4 at L/d = 25); a mass on a
massless shaft moves in the static deflection shape of a central point load (Roark, 7th ed., Table 8.1,
case 1e). The frequencies are those of the results. Exact-solution results stored as {"fem", "exact"}."""
from __future__ import annotations

import math

import numpy as np
import pytest

from classic.shear import energy_round
from compare.case.case import parse_case
from compare.checks.shaft_beam import solve_layout
from compare.checks.shaft_modes import mode_shapes

E, NU, D = 205e9, 0.29, 0.04


def layout(**shaft):
    d = {"case": {"units": "m-N-Pa"}, "material": {"elastic_modulus": E, "poisson": NU},
         "shaft": {"length": 1.0, "supports": [{"at": 0}, {"at": 1.0}], "sections": [{"at": 0.5}],
                   "segments": [{"from": 0, "to": 1.0, "diameter": D}]}}
    d["shaft"].update(shaft)
    c = parse_case(d)
    return c, solve_layout(c.shaft, c.section, c.material)


def test_uniform_simply_supported_modes_are_sines():
    c, lay = layout(density=7850.0, self_weight=False)
    ms = mode_shapes(c.shaft, lay)
    z = np.asarray(ms["z"])
    assert ms["omega"] == pytest.approx(lay["critical_speeds"]["values"], rel=1e-12)  # the results' frequencies
    for n, w in enumerate(ms["shapes"], 1):
        exact = np.sin(n * math.pi * z)
        exact /= exact[np.argmax(np.abs(exact))]
        res = {"fem": np.asarray(w), "exact": exact}
        # equal peaks of opposite sign (n ≥ 3): the shape is defined up to its sign
        err = min(float(np.max(np.abs(res["fem"] - s * res["exact"]))) for s in (1.0, -1.0))
        print(f"mode {n}: largest difference from sin({n}πz/L) {err:.2e}")
        # the simply supported Timoshenko beam vibrates in the same sines (shear and rotary inertia change
        # the frequencies only), so the nodal shape is exact up to the eigensolver's round-off
        assert err < 1e-8


def test_central_mass_mode_is_the_static_deflection_shape():
    c, lay = layout(loads=[{"at": 0.5, "mass": 20.0}])
    ms = mode_shapes(c.shaft, lay, count=1)
    z = np.asarray(ms["z"])
    I = math.pi * D**4 / 64
    G = E / (2 * (1 + NU))
    kga = energy_round(NU) * G * math.pi * D**2 / 4
    # central point load P on a simple span (Roark 7th ed., Table 8.1, case 1e) plus the shear deflection
    zl = np.minimum(z, 1.0 - z)
    bend = zl * (3 - 4 * zl**2) / (48 * E * I)
    shear = zl / (2 * kga)
    exact = (bend + shear) / (bend + shear).max()
    res = {"fem": np.asarray(ms["shapes"][0]), "exact": exact}
    assert np.max(np.abs(res["fem"] - res["exact"])) < 1e-9


def test_no_modes_without_mass():
    c, lay = layout()
    assert mode_shapes(c.shaft, lay) is None

"""fem/composite_shear.py: transverse shear of bonded multi-material sections (Saint-Venant flexure with
E, G and ν per region).

Exact references:
- one material: the solid round bar's flexure stresses, τ = (3 + 2ν)/(2(1 + ν))·V/A at the centre and
  (1 + 2ν)/(1 + ν)·V/A on the surface at the neutral axis (Timoshenko & Goodier, Theory of Elasticity,
  3rd ed., ch. 12, circular cross section; classic/shear.py), and the project's single-material solver
  fem/shear.py (Pilkey, Analysis and Design of Elastic Beams, 2002, ch. 6), which is the same
  formulation with one E, G, ν;
- bonded concentric layers: the closed form of the same flexure problem (classic.composite.
  concentric_flexure_shear, derived by separation of variables; one layer is Timoshenko & Goodier's).
"""
import math

import numpy as np
import pytest

from classic.composite import concentric_flexure_peak, concentric_flexure_shear
from classic.shear import round_flexure_centre, round_flexure_surface
from fem.composite import Region, mesh_composite, weighted_properties
from fem.composite_shear import composite_shear, shear_stress_at, shear_stress_peaks
from fem.geometry import Disk, custom_section, rectangle
from fem.mesh import MeshOptions, mesh_section
from fem.properties import area_moments
from fem.shear import shear_peak, solve_shear
from tests.helpers import observed_order

R1, R2 = 0.004, 0.009
STEEL = (206e9, 0.3)
POLYMER = (3.0e9, 0.38)


def tube(a, b, c=(0.0, 0.0)):
    return custom_section([Disk(c, b)], [Disk(c, a)] if a else [])


def layers(fineness, mats, shift=(0.0, 0.0)):
    regs = [Region(tube(0.0, R1), 0, "core"), Region(tube(R1, R2), 1, "sleeve")]
    if shift != (0.0, 0.0):
        regs = [Region(r.section.moved(*shift), r.material, r.label) for r in regs]
    cm = mesh_composite(regs, fineness)
    E = [m[0] for m in mats]
    nu = [m[1] for m in mats]
    G = [e / (2 * (1 + v)) for e, v in zip(E, nu)]
    pr = weighted_properties(cm, E)
    return cm, composite_shear(cm, E, G, nu, pr), (E, G, nu)


def exact_xy(V, moduli, k, x, y):
    """(τzx, τzy) of the closed form at (x, y) for V along x."""
    E, G, nu = moduli
    r, th = math.hypot(x, y), math.atan2(y, x)
    tr, tt = concentric_flexure_shear(V, E, G, nu, [0.0, R1, R2], k, r, th)
    return tr * math.cos(th) - tt * math.sin(th), tr * math.sin(th) + tt * math.cos(th)


POINTS = np.array([[0.002, 0.0, 0.006, -0.0031, 0.0005], [0.001, 0.003, -0.005, 0.0022, -0.0085]])


@pytest.mark.parametrize("fineness", [0.8, 1.0, 1.25])
def test_one_material_in_two_regions_is_the_round_bar_exact_solution(fineness):
    cm, sh, mod = layers(fineness, [STEEL, STEEL])
    V = 1000.0
    A = math.pi * R2**2
    peaks = shear_stress_peaks(cm, sh, V, 0.0)
    centre = {"fem": peaks[0].value, "exact": round_flexure_centre(V, 2 * R2, 0.3)}
    # a derivative read on a lattice of curved P2 elements: O(h²), about 3e-4 at these meshes
    assert centre["fem"] == pytest.approx(centre["exact"], rel=2e-3)
    assert math.hypot(*peaks[0].at) < 0.1 * R1  # at the centre
    # just inside the surface at the neutral axis (1e-4 of the radius in: 1e-4 of the value at most)
    surface = {"fem": float(np.hypot(*shear_stress_at(cm, sh, np.array([[0.0], [R2 * (1 - 1e-4)]]), V, 0.0))[0]),
               "exact": round_flexure_surface(V, 2 * R2, 0.3)}
    assert surface["fem"] == pytest.approx(surface["exact"], rel=2e-3)
    assert centre["exact"] == pytest.approx((3 + 0.6) / (2 * 1.3) * V / A)
    # symmetric section: the shear centre is the centroid; the fields carry exactly the unit forces
    assert math.hypot(*sh.centre) < 1e-9 * R2
    for key in ("Vx", "Vy"):
        assert max(abs(v) for v in sh.resultant_residual[key]) < 1e-9


def two_halves(f, same=True):
    """A filleted rectangle 24 × 16 mm with an off-centre bore (no symmetry: Ixy ≠ 0 and the shear centre
    off the centroid), cut at x = 0 into two bonded regions."""
    outer = rectangle((0.0, 0.0), (0.024, 0.016), 0.0, 0.002)
    bore = Disk((0.0045, 0.002), 0.003)
    right_half = rectangle((0.006, 0.0), (0.012, 0.020), 0.0, 0.0)
    left_half = rectangle((-0.006, 0.0), (0.012, 0.020), 0.0, 0.0)
    regs = [Region(custom_section([outer], [right_half, bore]), 0, "left"),
            Region(custom_section([outer], [left_half, bore]), 1, "right")]
    return mesh_composite(regs, f), custom_section([outer], [bore])


@pytest.mark.parametrize("fineness", [1.0, 1.4])
def test_one_material_reproduces_the_single_material_solver_on_an_unsymmetric_section(fineness):
    """Same formulation, one E, G, ν: the composite solver on two bonded halves of one material and
    fem/shear.py on the whole outline must give the same shear centre and peaks, to the two meshes'
    discretisation error (both O(h²) in the peaks)."""
    E, nu = 200e9, 0.3
    G = E / (2 * (1 + nu))
    cm, whole = two_halves(fineness)
    pr = weighted_properties(cm, [E, E])
    sh = composite_shear(cm, [E, E], [G, G], [nu, nu], pr)
    sm = mesh_section(whole, MeshOptions(fineness=fineness))
    sp = area_moments(sm)
    sr = solve_shear(sm, sp, nu)
    size = 0.024
    assert math.dist(sh.centre, sr.centre) < 2e-3 * size
    assert abs(pr.EIxy / E - sp.Ixy) < 1e-6 * sp.Ixx and abs(sp.Ixy) > 1e-3 * sp.Ixx  # really unsymmetric
    for V in ((1.0, 0.0), (0.0, 1.0), (0.6, -0.8)):
        fe = max(p.value for p in shear_stress_peaks(cm, sh, *V))
        single = shear_peak(sm, sr, *V, moment=False).value
        assert fe == pytest.approx(single, rel=5e-3), V
    for key in ("Vx", "Vy"):
        assert max(abs(v) for v in sh.resultant_residual[key]) < 1e-8


@pytest.mark.parametrize("fineness", [0.8, 1.0, 1.25])
def test_steel_core_in_a_polymer_sleeve_against_the_closed_form(fineness):
    cm, sh, mod = layers(fineness, [STEEL, POLYMER])
    V = 1000.0
    peaks = shear_stress_peaks(cm, sh, V, 0.0)
    for k in (0, 1):
        ex, r, th = concentric_flexure_peak(V, *mod, [0.0, R1, R2], k)
        row = {"fem": peaks[k].value, "exact": ex}
        assert row["fem"] == pytest.approx(row["exact"], rel=3e-3), (k, row)
    # the steel core carries most of the force: its centre stress is about four times the one-material value
    assert peaks[0].value > 3.5 * round_flexure_centre(V, 2 * R2, 0.3)
    fe = shear_stress_at(cm, sh, POINTS, V, 0.0)
    for i in range(POINTS.shape[1]):
        x, y = POINTS[:, i]
        k = 0 if math.hypot(x, y) < R1 else 1
        ex = exact_xy(V, mod, k, x, y)
        scale = peaks[k].value
        assert abs(fe[0, i] - ex[0]) < 3e-3 * scale and abs(fe[1, i] - ex[1]) < 3e-3 * scale, (i, fe[:, i], ex)
    # where: the core's peak at the centre, the sleeve's on the interface where V crosses it (closed form)
    assert math.hypot(*peaks[0].at) < 0.1 * R1
    assert math.hypot(*peaks[1].at) == pytest.approx(R1, rel=1e-3) and abs(peaks[1].at[1]) < 0.1 * R1


def test_moved_and_turned_layers_give_the_same_peaks():
    V = 500.0
    base = shear_stress_peaks(*layers(1.0, [STEEL, POLYMER])[:2], V, 0.0)
    cm, sh, _ = layers(1.0, [STEEL, POLYMER], shift=(0.05, -0.02))
    moved = shear_stress_peaks(cm, sh, 0.0, V)  # any direction: the section is axisymmetric
    assert math.dist(sh.centre, (0.05, -0.02)) < 1e-9
    for a, b in zip(base, moved):
        assert b.value == pytest.approx(a.value, rel=3e-3)


def test_convergence_rate_against_the_closed_form():
    """The field error at fixed points against the closed form: P2 gradients converge as h²."""
    errs, hs = [], []
    for f in (0.7, 1.4, 2.8):
        cm, sh, mod = layers(f, [STEEL, POLYMER])
        fe = shear_stress_at(cm, sh, POINTS, 1.0, 0.0)
        e = 0.0
        for i in range(POINTS.shape[1]):
            x, y = POINTS[:, i]
            ex = exact_xy(1.0, mod, 0 if math.hypot(x, y) < R1 else 1, x, y)
            e = max(e, math.hypot(fe[0, i] - ex[0], fe[1, i] - ex[1]))
        errs.append(e)
        hs.append(cm.dofs ** -0.5)
    p = observed_order(errs, hs)
    print(f"composite transverse shear: errors {errs}, observed order {p:.2f} (formal 2)")
    assert errs[2] < errs[1] < errs[0] and p > 1.5


def test_off_centre_insert_converges_to_a_finer_mesh():
    """No closed form: a square steel key bonded off-centre into a polymer shaft; the peaks against the
    finest mesh must fall as the mesh is refined."""
    shaft = custom_section([Disk((0.0, 0.0), 0.010)], [rectangle((0.003, 0.002), (0.006, 0.004), 0.0, 0.0005)])
    key = custom_section([rectangle((0.003, 0.002), (0.006, 0.004), 0.0, 0.0005)])
    E, nu = [3.0e9, 206e9], [0.38, 0.3]
    G = [e / (2 * (1 + v)) for e, v in zip(E, nu)]
    vals = []
    for f in (1.0, 2.0, 4.0):
        cm = mesh_composite([Region(shaft, 0, "shaft"), Region(key, 1, "insert")], f)
        sh = composite_shear(cm, E, G, nu, weighted_properties(cm, E))
        vals.append([p.value for p in shear_stress_peaks(cm, sh, 300.0, 400.0)])
        assert max(abs(v) for v in sh.resultant_residual["Vy"]) < 1e-8
    err = [[abs(v[k] / vals[-1][k] - 1) for k in (0, 1)] for v in vals[:2]]
    print(f"composite insert: shear peaks against the finest mesh {err}")
    assert all(err[1][k] < err[0][k] for k in (0, 1)) and max(err[1]) < 0.02


def test_interface_values_from_both_sides_against_the_closed_form():
    """On the core–sleeve interface τ_zr is continuous and τ_zθ jumps with G (closed form): each
    side's largest value is the closed form's largest over the circle r = R1 in that layer."""
    cm, sh, mod = layers(1.25, [STEEL, POLYMER])
    V = 1000.0
    peaks = shear_stress_peaks(cm, sh, V, 0.0)
    for k in (0, 1):
        a = concentric_flexure_shear(V, *mod, [0.0, R1, R2], k, R1, 0.0)[0]
        b = concentric_flexure_shear(V, *mod, [0.0, R1, R2], k, R1, math.pi / 2)[1]
        row = {"fem": peaks[k].interface, "exact": max(abs(a), abs(b))}
        assert row["fem"] == pytest.approx(row["exact"], rel=3e-3), (k, row)

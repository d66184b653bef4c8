"""fem/composite.py: bonded multi-material sections (torsion with G per region, the transformed section).

Exact reference: bonded concentric circular layers, whose Saint-Venant torsion is elementary (plane
sections stay plane, τ = G_k·θ·r in layer k, GJ = Σ G_k J_k) and whose transformed-section bending
rigidity is Σ E_k I_k (Gere, Mechanics of Materials, 6th ed., composite bars and beams; the torsion
solution is exact, classic/composite.py).
"""
import math

import pytest

from classic.composite import (concentric_bending_rigidity, concentric_layer_shear_stress,
                               concentric_torsional_rigidity)
from fem.composite import Region, composite_torsion, mesh_composite, normal_stress_peaks, weighted_properties
from fem.errors import InputError
from fem.geometry import Disk, custom_section, rectangle
from tests.helpers import observed_order

R1, R2, R3 = 0.004, 0.009, 0.012
G = [80e9, 1.1e9, 27e9]  # steel core, polymer layer, aluminium sleeve (any positive moduli do)
E = [206e9, 3.0e9, 70e9]


def tube(r_in, r_out):
    return custom_section([Disk((0.0, 0.0), r_out)], [Disk((0.0, 0.0), r_in)] if r_in else [])


def layers(fineness=1.0, shift=(0.0, 0.0)):
    regs = [Region(tube(0.0, R1), 0, "core"), Region(tube(R1, R2), 1, "layer"), Region(tube(R2, R3), 2, "sleeve")]
    if shift != (0.0, 0.0):
        regs = [Region(r.section.moved(*shift), r.material, r.label) for r in regs]
    return mesh_composite(regs, fineness)


@pytest.mark.parametrize("fineness", [0.8, 1.0, 1.25])
def test_concentric_layers_against_the_exact_solution(fineness):
    cm = layers(fineness)
    tr = composite_torsion(cm, G)
    GJ = {"fem": tr.GJ, "exact": concentric_torsional_rigidity(G, [0.0, R1, R2, R3])}
    GJw = {"fem": tr.GJ_warping, "exact": GJ["exact"]}
    # the curved P2 boundary and interfaces lie on the circles to about 1e-6 of the area
    assert GJ["fem"] == pytest.approx(GJ["exact"], rel=1e-5)
    assert GJw["fem"] == pytest.approx(GJw["exact"], rel=1e-5)
    assert tr.GJ <= tr.GJ_warping * (1 + 1e-12)  # lower and upper bound of the meshed domain's GJ
    T = 100.0
    for k, r in enumerate((R1, R2, R3)):
        tau = {"fem": T * tr.peaks[k].value, "exact": concentric_layer_shear_stress(T, G, [0.0, R1, R2, R3], k, r)}
        # the stress-function peak is a derivative read on the boundary: O(h²), 1e-3 at these meshes
        assert tau["fem"] == pytest.approx(tau["exact"], rel=2e-3), k
        assert math.hypot(*tr.peaks[k].at) == pytest.approx(r, rel=1e-3)  # on the layer's outer radius
        tw = {"fem": T * tr.peaks_warping[k].value, "exact": tau["exact"]}
        assert tw["fem"] == pytest.approx(tw["exact"], rel=1e-5)  # ω = 0 exactly: P2 holds it
    # the stress jumps at each interface with G (τ = G θ r): the inner layer's interface value
    assert T * tr.interface_peak[1] == pytest.approx(T * G[1] * R2 / GJ["exact"], rel=2e-3)
    p = weighted_properties(cm, E)
    EI = {"fem": p.EIxx, "exact": concentric_bending_rigidity(E, [0.0, R1, R2, R3])}
    assert EI["fem"] == pytest.approx(EI["exact"], rel=1e-5) and p.EIyy == pytest.approx(EI["exact"], rel=1e-5)
    assert abs(p.EIxy) <= 1e-9 * EI["exact"] and math.hypot(*p.centroid) <= 1e-9 * R3
    M = 50.0
    sig = normal_stress_peaks(cm, E, p, 0.0, M, 0.0)
    for k, r in enumerate((R1, R2, R3)):
        exact = E[k] * M * r / EI["exact"]  # transformed section: σ = E_k·M·y/EI at the layer's outer fibre
        assert sig[k].value == pytest.approx(exact, rel=1e-3), k


def test_moved_layers_give_the_same_rigidity_and_stresses():
    base, moved = (composite_torsion(layers(1.0, s), G) for s in ((0.0, 0.0), (0.07, -0.03)))
    assert moved.GJ == pytest.approx(base.GJ, rel=1e-6)
    assert moved.peaks[2].value == pytest.approx(base.peaks[2].value, rel=2e-3)


def insert(fineness):
    """A square steel key bonded off-centre into a polymer shaft (no closed form)."""
    shaft = custom_section([Disk((0.0, 0.0), 0.010)], [rectangle((0.003, 0.002), (0.006, 0.004), 0.0, 0.0005)])
    key = custom_section([rectangle((0.003, 0.002), (0.006, 0.004), 0.0, 0.0005)])
    return mesh_composite([Region(shaft, 0, "shaft"), Region(key, 1, "insert")], fineness)


def test_off_centre_insert_converges_and_its_bracket_closes():
    """No closed form: the stress-function GJ (a lower bound) and the warping-function GJ (an upper bound)
    bracket the exact GJ on every mesh (minimum complementary and potential energy; Timoshenko & Goodier,
    Theory of Elasticity, 3rd ed., ch. 10), so the brackets of all meshes overlap and their width bounds
    the error of either value; it must shrink at an order of at least 2 (formal 4: these meshes are still
    short of the asymptotic range at the insert's fillets)."""
    Gs = [1.2e9, 80e9]
    fs = (1.0, 2.0, 4.0)
    meshes = [insert(f) for f in fs]
    vals = [composite_torsion(cm, Gs) for cm in meshes]
    widths = [(v.GJ_warping - v.GJ) / v.GJ for v in vals]
    h = [cm.dofs ** -0.5 for cm in meshes]  # element size from the unknowns (curvature sizing is not ×2)
    p = observed_order(widths, h)
    print(f"composite GJ bracket widths {widths}, observed order {p:.2f} (formal 4)")
    assert all(w > 0 for w in widths) and p > 2.0
    lo, hi = max(v.GJ for v in vals), min(v.GJ_warping for v in vals)
    assert lo <= hi  # one exact value inside every bracket
    perr = [abs(v.peaks[0].value - vals[-1].peaks[0].value) / vals[-1].peaks[0].value for v in vals[:2]]
    print(f"composite τmax in the polymer against the finest mesh: {perr}")
    assert perr[1] < perr[0]


def test_overlapping_regions_are_refused_naming_both():
    a = custom_section([Disk((0.0, 0.0), 0.010)])
    b = custom_section([Disk((0.005, 0.0), 0.010)])
    with pytest.raises(InputError) as e:
        mesh_composite([Region(a, 0, "one"), Region(b, 1, "two")])
    assert e.value.field == "section.regions[1]" and "overlaps section.regions[0]" in e.value.reason

"""Recovery indicator and point probes on curved P2 meshes."""
import numpy as np
import pytest
from skfem import Basis, ElementTriP2

from fem.estimate import adapted_sizes, element_sizes, recovery_indicator
from fem.geometry import Keyway, keyed_section, round_section
from fem.mesh import mesh_section
from fem.probe import probe


def test_recovery_indicator_vanishes_for_a_field_with_a_continuous_gradient():
    # a linear field has a constant gradient: the recovered gradient equals it exactly
    sm = mesh_section(round_section(0.02))
    b = Basis(sm.mesh, ElementTriP2())
    u = 3.0 * b.doflocs[0] - 2.0 * b.doflocs[1]
    assert np.max(recovery_indicator(b, u)) < 1e-9


def test_indicator_is_largest_at_the_fillets_of_a_keyed_shaft():
    from fem.properties import area_moments
    from fem.torsion import solve_torsion

    sm = mesh_section(keyed_section(0.03, [Keyway(0.008, 0.004, 0.0004)]))
    tr = solve_torsion(sm, area_moments(sm).centroid, warping=False)
    eta = recovery_indicator(tr.basis, tr.phi)
    worst = np.argmax(eta / element_sizes(sm.mesh))  # error density
    cx, cy = sm.mesh.p[:, sm.mesh.t[:, worst]].mean(axis=1)
    # the worst element touches the keyway (|x| ≤ 4 mm, y above 10 mm), not the plain surface
    assert abs(cx) < 0.0045 and cy > 0.010
    new = adapted_sizes(sm, eta / eta.max(), 0.5, h_max=sm.h_global)
    assert new[worst] < element_sizes(sm.mesh)[worst]


def test_probe_reads_a_quadratic_field_exactly():
    sm = mesh_section(round_section(0.02))
    b = Basis(sm.mesh, ElementTriP2())
    x, y = b.doflocs
    u = x**2 + 2 * x * y - y
    pts = np.array([[0.0, 0.003, -0.007, 0.00999], [0.0, -0.002, 0.007, 0.0]])  # the last one near the arc
    val, grad = probe(sm.mesh, u, pts)
    px, py = pts
    assert val == pytest.approx(px**2 + 2 * px * py - py, abs=1e-12)
    assert grad[0] == pytest.approx(2 * px + 2 * py, abs=1e-9)
    assert grad[1] == pytest.approx(2 * px - 1, abs=1e-9)
    outside, _ = probe(sm.mesh, u, np.array([[0.05], [0.0]]))
    assert np.isnan(outside[0])

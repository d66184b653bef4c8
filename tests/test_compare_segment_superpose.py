"""Superposition of a 3-D segment's unit-load results (compare/solve/segment_superpose.py).

Exact checks: on a plain round bar the stresses are the elementary ones (Timoshenko & Goodier, Theory
of Elasticity, 3rd ed., simple tension, pure bending and torsion of a circular shaft: σ = N/A + Mc/I,
τ = Tc/J); superposed they must give exactly σ = N/A + (Mx·y − My·x)/I, τ = T·r/J, and on a rotating
shaft the alternating von Mises stress 32M/(πd³) with the mean √(σ_N² + 3τ²) (Shigley's Mechanical
Engineering Design, 9th ed., Sec. 6-14, von Mises of the alternating and mean components). With a
feature, a single load must reproduce that load's factor times its nominal stress (the definition of
Kt in fem/solid.py)."""
from __future__ import annotations

import math
from types import SimpleNamespace

import numpy as np
import pytest

from compare.solve import segment_superpose as sup
from compare.solve.segments import study_segment
from fem import solid

D, LENGTH = 0.03, 0.09


def _exact_results(n=400, seed=1, carried=(1.7e4, 35.0, -22.0, 41.0)):
    """Elementary plain-bar stresses on the surface r = d/2 (and a few inside), for each load case
    with the load 'carried' as the model would report it (bending_y carries ∫x·σ dA)."""
    rng = np.random.default_rng(seed)
    th = rng.uniform(0, 2 * math.pi, n)
    r = np.where(np.arange(n) % 5 == 0, rng.uniform(0.3, 1.0, n), 1.0) * D / 2
    z = rng.uniform(0.2, 0.8, n) * LENGTH
    x, y = r * np.cos(th), r * np.sin(th)
    A, I, J = math.pi * D**2 / 4, math.pi * D**4 / 64, math.pi * D**4 / 32
    out = {}
    for load, L in zip(sup.LOADS, carried):
        s = np.zeros((3, 3, n))
        if load == "tension":
            s[2, 2] = L / A
        elif load == "bending_x":
            s[2, 2] = L * y / I
        elif load == "bending_y":
            s[2, 2] = L * x / I
        else:
            s[0, 2] = s[2, 0] = -L * y / J
            s[1, 2] = s[2, 1] = L * x / J
        out[load] = SimpleNamespace(load=L, points=np.array([x, y, z]), stress=s)
    return out, (x, y, z, A, I, J)


def _elementary(xyz, N, Mx, My, T):
    x, y, z, A, I, J = xyz
    s = np.zeros((3, 3, len(x)))
    s[2, 2] = N / A + (Mx * y - My * x) / I
    s[0, 2] = s[2, 0] = -T * y / J
    s[1, 2] = s[2, 1] = T * x / J
    return s


@pytest.mark.parametrize("turn", [0.0, 30.0, -115.0])
def test_standing_shaft_is_the_elementary_combination(turn):
    """Exact (round-off): superposed = N/A + (Mx·y − My·x)/I and τ = T·r/J at every point, in any frame
    (turning the model turns points, moments and tensors together)."""
    res, _ = _exact_results()
    f = sup.unit_fields(res, D, LENGTH, turn=turn)
    N, Mx, My, T = 2.5e3, 140.0, -60.0, 95.0
    sp = sup.superpose(f, N, Mx, My, T, rotating=False)
    x, y, z = sp.points
    A, I, J = math.pi * D**2 / 4, math.pi * D**4 / 64, math.pi * D**4 / 32
    exact = _elementary((x, y, z, A, I, J), N, Mx, My, T)
    check = {"fem": sp.mean, "exact": exact}
    assert np.allclose(check["fem"], check["exact"], rtol=0, atol=1e-9 * np.abs(exact).max())
    vm = np.sqrt(exact[2, 2] ** 2 + 3 * (exact[0, 2] ** 2 + exact[1, 2] ** 2))
    assert np.allclose(sp.vm_peak, vm, rtol=1e-12)
    assert not sp.sa.any()


def test_rotating_shaft_alternating_and_mean_are_exact():
    """Rotating, loads fixed in space: on the surface σa' = 32M/(πd³) (closed form, exact), σm' =
    √(σ_N² + 3τ²), and the peak over the turn √((|σ_N| + σ_b)² + 3τ²) (sampled: within 1e-5)."""
    res, _ = _exact_results()
    f = sup.unit_fields(res, D, LENGTH, turn=12.0)
    N, Mx, My, T = -4.0e3, 90.0, 120.0, 75.0
    sp = sup.superpose(f, N, Mx, My, T, rotating=True)
    x, y, _ = sp.points
    surf = np.isclose(np.hypot(x, y), D / 2, rtol=1e-12)
    sb = 32 * math.hypot(Mx, My) / (math.pi * D**3)
    sN, tau = 4 * N / (math.pi * D**2), 16 * T / (math.pi * D**3)
    check = {"fem": sp.sa[surf], "exact": np.full(surf.sum(), sb)}
    assert np.allclose(check["fem"], check["exact"], rtol=1e-12)
    assert np.allclose(sp.sm[surf], math.sqrt(sN**2 + 3 * tau**2), rtol=1e-12)
    peak = math.sqrt((abs(sN) + sb) ** 2 + 3 * tau**2)
    assert np.all(sp.vm_peak[surf] <= peak * (1 + 1e-12))
    assert np.all(sp.vm_peak[surf] >= peak * (1 - 1e-5))  # 0.5° steps: 1 − cos 0.25° ≈ 1e-5
    s = sup.summary(sp)
    assert s["von_mises_peak"] == pytest.approx(peak, rel=1e-5)
    # Tresca on the surface: σ1 − σ3 = √((σ)² + 4τ²) with σ = σ_N + σ_b cos ψ; its worst found by the pruned scan
    tresca = math.sqrt((abs(sN) + sb) ** 2 + 4 * tau**2)
    tr, i, _ = sp.worst(lambda p: p[..., 2] - p[..., 0], math.sqrt(2))
    assert tr == pytest.approx(tresca, rel=1e-5)
    tv, _, _ = sp.worst(lambda p: p[..., 2] - p[..., 0], 2 / math.sqrt(3), of="von_mises")
    assert tv == pytest.approx(tresca, rel=1e-5)
    assert np.all(sp.vm_bound >= sp.vm_peak * (1 - 1e-12))  # the pruning's bound is a bound


def test_alternating_closed_form_matches_a_fine_scan():
    """The closed-form largest von Mises amplitude against a scan of 7200 angles (any tensors A, B)."""
    rng = np.random.default_rng(3)
    A, B = rng.normal(size=(3, 3, 50)), rng.normal(size=(3, 3, 50))
    A, B = A + A.transpose(1, 0, 2), B + B.transpose(1, 0, 2)
    qa, qb, qh = sup._dev_form(A, A), sup._dev_form(B, B), sup._dev_form(A, B)
    closed = np.sqrt((qa + qb) / 2 + np.hypot((qa - qb) / 2, qh))
    th = np.linspace(0, 2 * math.pi, 7200, endpoint=False)
    scan = np.max(sup.von_mises(A[..., None] * np.cos(th) + B[..., None] * np.sin(th)), axis=1)
    assert np.all(closed >= scan * (1 - 1e-12)) and np.allclose(closed, scan, rtol=1e-6)


@pytest.fixture(scope="module")
def plain_bar():
    seg = solid.Segment(D, LENGTH, ())
    return solid.solve_segment(solid.mesh_segment(seg, fineness=0.7))


def test_plain_bar_fe_superposes_to_the_elementary_stresses(plain_bar):
    """The real 3-D FE of a plain bar: the superposed stress equals the elementary combination up to the
    unit results' own discretisation error — |σ − σ_elem| ≤ Σ|load_k|·|σ_k/load_k − σ_k,elem/load_k|
    pointwise (linearity, round-off allowed), and within 15 % of the peak (a coarse curved P2 mesh: the
    surface reads of the bar's unit cases depart by up to ~9 % at fineness 0.5–0.7, measured); a sign error
    of a moment or the torque would be a 100 % departure."""
    f = sup.unit_fields(plain_bar, D, LENGTH)
    N, Mx, My, T = 3.0e3, 80.0, -50.0, 60.0
    sp = sup.superpose(f, N, Mx, My, T, rotating=False)
    x, y, z = sp.points
    A, I, J = math.pi * D**2 / 4, math.pi * D**4 / 64, math.pi * D**4 / 32
    exact = _elementary((x, y, z, A, I, J), N, Mx, My, T)
    dev = np.abs(sp.mean - exact).max(axis=(0, 1))
    unit_dev = 0.0
    for k, (load, L) in enumerate(zip(sup.LOADS, (N, Mx, My, T))):
        e = _elementary((x, y, z, A, I, J), *[1.0 if j == k else 0.0 for j in range(4)])
        unit_dev = unit_dev + abs(L) * np.abs(f.S[k][..., sp.idx] - e).max(axis=(0, 1))
    assert np.all(dev <= unit_dev * (1 + 1e-9) + 1e-9 * np.abs(exact).max())
    assert dev.max() <= 0.15 * np.abs(exact).max()


@pytest.fixture(scope="module")
def keyseat_study():
    kw = solid.ProfileKeyseat(0.008, 0.004, 0.027, 0.063, 0.0008)
    return study_segment(solid.Segment(D, LENGTH, (kw,)), fineness=0.25)


@pytest.mark.parametrize("load,key", [("bending_x", "kt_bending_x"), ("bending_y", "kt_bending_y"),
                                      ("tension", "kt_axial"), ("torsion", "kts")])
def test_single_load_reproduces_its_factor(keyseat_study, load, key):
    """With the keyseat, one load alone: largest principal stress (tension, bending) or largest shear
    stress (torsion) over the points = the study's factor × the load's nominal stress (fem/solid.py's
    definition of Kt, Kts); the unit fields must not lose or rescale any point that holds the peak."""
    st = keyseat_study
    f = sup.unit_fields(st.finest, D, LENGTH)
    M = 150.0
    loads = {"tension": (5e3, 0, 0, 0), "bending_x": (0, M, 0, 0), "bending_y": (0, 0, -M, 0),
             "torsion": (0, 0, 0, M)}[load]
    sp = sup.superpose(f, *loads, rotating=False)
    if load == "torsion":
        val, _, _ = sp.worst(lambda p: (p[..., 2] - p[..., 0]) / 2, 1.0)
        nominal = 16 * M / (math.pi * D**3)
    else:
        val, _, _ = sp.worst(lambda p: p[..., 2], 1.0, of="sigma1")
        nominal = 4 * 5e3 / (math.pi * D**2) if load == "tension" else 32 * M / (math.pi * D**3)
    check = {"fem": val / nominal, "exact": st.values[key]}
    assert check["fem"] == pytest.approx(check["exact"], rel=1e-9)


@pytest.mark.parametrize("rotating", [True, False])
def test_pruned_scans_equal_the_full_scan(rotating):
    """The pruning is rigorous: on random unit fields the pruned scans give the same worst Tresca stress
    and σ1 as scanning every point at every sampled angle."""
    res, _ = _exact_results(n=300, seed=7)
    rng = np.random.default_rng(11)
    for r in res.values():
        s = rng.normal(size=(3, 3, 300)) * 1e6
        r.stress = s + s.transpose(1, 0, 2)
    f = sup.unit_fields(res, D, LENGTH, turn=40.0)
    sp = sup.superpose(f, 1.3e3, 20.0, -35.0, 15.0, rotating=rotating)
    th = sp.angles()
    full = sup.principal(sp.mean[..., None] + np.cos(th) * sp.A[..., None] + np.sin(th) * sp.B[..., None])
    for g, c, of in ((lambda p: p[..., 2] - p[..., 0], 2 / math.sqrt(3), "von_mises"),
                     (lambda p: p[..., 2] - p[..., 0], math.sqrt(2), "norm"), (lambda p: p[..., 2], 1.0, "norm"),
                     (lambda p: p[..., 2], 1.0, "sigma1")):
        v, _, _ = sp.worst(g, c, of=of)
        assert v == pytest.approx(float(np.max(g(full))), rel=1e-12)


@pytest.mark.slow
def test_quarter_model_superposes_as_the_mirrored_whole():
    """The quarter model's unit fields (its surface stress completed by reflection, fem/solid.py) give
    the station's superposed stresses of the whole segment on the mesh identical by mirror: the same
    peak von Mises stress over the turn, alternating and mean stresses and largest principal stress,
    to the solver's tolerance (exact: the same equations on the same nodes), with the model turned
    about the axis and every load present (symmetric and antisymmetric ones)."""
    from skfem import Basis, ElementTetP2, MeshTet2

    from fem.mesh import boundary_mapping

    def mirrored(sm, axis, c):  # the mesh completed by its mirror image in the plane (axis) = c
        b = Basis(sm.mesh, ElementTetP2(), mapping=boundary_mapping(sm.mesh))
        P, T = np.asarray(b.doflocs), np.asarray(b.element_dofs)
        on = np.abs(P[axis] - c) < 1e-9 * D
        idx = np.arange(P.shape[1])
        idx[~on] = P.shape[1] + np.arange(int((~on).sum()))
        Q = P[:, ~on].copy()
        Q[axis] = 2 * c - Q[axis]
        T2 = idx[T][[0, 2, 1, 3, 6, 5, 4, 7, 9, 8]]  # a reflection turns the orientation
        mesh = MeshTet2(np.hstack([P, Q]), np.hstack([T, T2]))
        ends, end1, lateral = solid._boundary_parts(mesh, sm.segment.length)
        return solid.SolidMesh(mesh, sm.segment, sm.h, sm.h_feature, ends, lateral, end1)

    L = 2.5 * D
    seg = solid.Segment(D, L, (solid.ProfileKeyseat(0.008, 0.004, L / 2 - 0.012, L / 2 + 0.012, 0.05 * D),))
    part = solid.mesh_segment(seg, fineness=0.4, symmetry=2)
    whole = mirrored(mirrored(part, 0, 0.0), 2, L / 2)
    rp, rw = solid.solve_segment(part, solid.LOADS, 2.0e11, 0.3), solid.solve_segment(whole, solid.LOADS, 2.0e11, 0.3)
    for rotating in (True, False):
        fp = sup.superpose(sup.unit_fields(rp, D, L, turn=37.0), 900.0, 14.0, -9.0, 11.0, rotating)
        fw = sup.superpose(sup.unit_fields(rw, D, L, turn=37.0), 900.0, 14.0, -9.0, 11.0, rotating)
        assert len(fp.idx) == len(fw.idx)  # the completed node set is the whole model's
        sp, sw = sup.summary(fp), sup.summary(fw)
        for k in ("von_mises_peak", "sigma_a_vm", "sigma_m_vm", "alternating_peak", "sigma1_peak"):
            check = {"fem": sp[k], "exact": sw[k]}  # exact: the whole model on the mirrored mesh
            assert check["fem"] == pytest.approx(check["exact"], rel=1e-6, abs=1e-9 * sw["von_mises_peak"]), (k, check)

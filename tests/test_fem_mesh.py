"""Meshing in the section's scale-free frame: same shaft, same mesh, same answer.

A section that is only translated or uniformly scaled reaches gmsh as the same numbers, so it gets
the same mesh (same nodes, same elements) and, after mapping back to metres, the same results up to
round-off. Elasticity fixes how the results scale: J ∝ k⁴ and τmax/T ∝ k⁻³ for a section k times
the size (Prandtl stress function: φ ∝ k², J = 2∫φ ∝ k⁴, τ = |∇φ|·T/J ∝ k⁻³; Timoshenko & Goodier,
Theory of Elasticity, 3rd ed., §§104–105), and a rigid translation changes neither."""
import math

import numpy as np
import pytest

from fem.errors import InputError
from fem.geometry import Disk, Ellipse, Keyway, custom_section, keyed_section, polygon, rectangle, round_section
from fem.mesh import FRAME_QUANTUM, MeshOptions, mesh_section, normalised_section, section_frame
from tests.helpers import torsion_of

KEYED = keyed_section(0.0381, [Keyway(0.009525, 0.0047625, 0.000508)], bore=0.012)
CUSTOM = custom_section([rectangle((0.003, -0.002), (0.03, 0.012), rotation=30.0, fillet=0.001)],
                        [Disk((0.004, -0.001), 0.002), Ellipse((-0.006, -0.004), (0.002, 0.001), 20.0)])
ROUND_OFF = 1e-12  # relative: what round-off of the move and of the mapping back can leave


@pytest.mark.parametrize("section", [KEYED, CUSTOM], ids=["keyed", "custom"])
def test_translated_and_scaled_sections_reach_gmsh_as_the_same_numbers(section):
    ref, _ = normalised_section(section)
    for other in (section.moved(0.37, -1.2), section.scaled(25.4), section.scaled(0.3).moved(-0.05, 0.02)):
        got, frame = normalised_section(other)
        assert got.steps == ref.steps  # every rounded length equal, not only close
    # the rounding grid is far below any geometric tolerance: a keyway fillet moves by < 1e-12 D
    assert FRAME_QUANTUM * KEYED.diameter < 1e-13


@pytest.mark.parametrize("section", [KEYED, CUSTOM], ids=["keyed", "custom"])
def test_translation_gives_the_same_mesh_and_the_same_answer(section):
    # a few diameters away: round-off in the node coordinates grows as about 1e-16 of the distance
    # from the origin, relative to the smallest element (here ~2e-13 on the fillet's peak)
    dx, dy = 0.06, -0.09
    sm0, pr0, tr0 = torsion_of(section, fineness=0.7)
    sm1, pr1, tr1 = torsion_of(section.moved(dx, dy), fineness=0.7)
    assert np.array_equal(sm1.mesh.t, sm0.mesh.t)  # same topology, same numbering
    size = section.length_scale
    assert np.max(np.abs(sm1.mesh.p - sm0.mesh.p - np.array([[dx], [dy]]))) < 1e-12 * (size + math.hypot(dx, dy))
    assert tr1.dofs == tr0.dofs
    J = {"fem": tr1.J, "exact": tr0.J}  # exact: a rigid translation leaves J unchanged
    tau = {"fem": tr1.peak_per_torque, "exact": tr0.peak_per_torque}
    assert J["fem"] == pytest.approx(J["exact"], rel=ROUND_OFF)
    assert tau["fem"] == pytest.approx(tau["exact"], rel=ROUND_OFF)
    assert tr1.peak_at == pytest.approx((tr0.peak_at[0] + dx, tr0.peak_at[1] + dy), abs=1e-12 * (size + 0.2))
    assert pr1.centroid == pytest.approx((pr0.centroid[0] + dx, pr0.centroid[1] + dy), abs=1e-12 * (size + 0.2))


@pytest.mark.parametrize("k", [25.4, 0.001])
def test_uniform_scale_gives_the_same_mesh_and_scaled_answers(k):
    sm0, _, tr0 = torsion_of(KEYED, fineness=0.7)
    sm1, _, tr1 = torsion_of(KEYED.scaled(k), fineness=0.7)
    assert np.array_equal(sm1.mesh.t, sm0.mesh.t)
    assert np.allclose(sm1.mesh.p, k * sm0.mesh.p, rtol=0, atol=1e-12 * k * KEYED.diameter)
    assert sm1.h_global == pytest.approx(k * sm0.h_global, rel=ROUND_OFF)
    J = {"fem": tr1.J, "exact": k**4 * tr0.J}  # J ∝ k⁴ (module docstring)
    tau = {"fem": tr1.peak_per_torque, "exact": tr0.peak_per_torque / k**3}  # τ/T ∝ k⁻³
    assert J["fem"] == pytest.approx(J["exact"], rel=ROUND_OFF)
    assert tau["fem"] == pytest.approx(tau["exact"], rel=ROUND_OFF)


def test_boundary_data_come_back_in_metres():
    # A disk of radius r centred at (cx, cy): A = πr², ∫x dA = A·cx, ∫y dA = A·cy, ∫y² dA =
    # πr⁴/4 + A·cy², ∫xy dA = A·cx·cy (the parallel-axis theorem; Beer & Johnston, Vector
    # Mechanics for Engineers: Statics, 9th ed., §9.6). Exact up to the boundary quadrature.
    r, cx, cy = 0.01, 0.25, -0.4
    sm = mesh_section(custom_section([Disk((cx, cy), r)]))
    e = sm.boundary.integrals
    A = math.pi * r**2
    exact = dict(A=A, Sx=A * cx, Sy=A * cy, Ixx0=math.pi * r**4 / 4 + A * cy**2,
                 Iyy0=math.pi * r**4 / 4 + A * cx**2, Ixy0=A * cx * cy)
    for key, want in exact.items():
        assert e[key] == pytest.approx(want, rel=1e-10), key
    # the offsets of the curved mesh boundary from the circle are in metres, far below the size
    assert np.max(np.abs(sm.boundary_offset)) < 1e-6 * r
    # a sharp keyway's corners at (±w/2, y) with y = R − depth (the cutter's bottom edge), moved
    w, depth, R = 0.006, 0.0035, 0.01
    sm = mesh_section(keyed_section(2 * R, [Keyway(w, depth, 0.0)]).moved(0.5, 0.25))
    pts = np.array(sorted(c.point for c in sm.boundary.reentrant_sharp_corners))
    want = np.array([(0.5 - w / 2, 0.25 + R - depth), (0.5 + w / 2, 0.25 + R - depth)])
    assert pts.shape == (2, 2) and np.allclose(pts, want, rtol=0, atol=1e-14)
    lines = [c.length for c in sm.boundary.curves.values() if c.kind == "line"]
    assert min(abs(v - w) for v in lines) < 1e-11 * w  # the keyway bottom, width w, in metres
    # fillet radii in metres (a 0.4 mm fillet on a 30 mm shaft, far from the origin)
    sm = mesh_section(keyed_section(0.03, [Keyway(0.008, 0.004, 0.0004)]).moved(-0.3, 0.7))
    radii = [c.radius for c in sm.boundary.curves.values() if c.kind == "arc"]
    assert radii == pytest.approx([0.0004] * 2, rel=1e-9)


def test_a_message_about_the_outline_gives_the_point_in_metres():
    d = 1.0  # the same outline far from the origin: the point is reported where the user put it
    sec = custom_section([rectangle((0.01 + d, 0.01), (0.02, 0.02))],
                         [polygon([(0.01 + d, 0.02), (0.005 + d, 0.01), (0.015 + d, 0.01)])])
    with pytest.raises(InputError) as e:
        mesh_section(sec)
    assert "point (1.01, 0.02)" in str(e.value)


def test_frame_follows_the_section():
    f = section_frame(KEYED)
    assert f.origin == (0.0, 0.0) and f.scale == KEYED.diameter  # the shaft axis, the diameter
    g = section_frame(KEYED.scaled(2.0).moved(0.1, 0.2))
    assert g.origin == pytest.approx((0.1, 0.2), abs=1e-15) and g.scale == 2.0 * KEYED.diameter
    pts = np.array([[0.1, -0.3], [0.02, 0.05]])
    assert np.allclose(g.from_frame(g.to_frame(pts)), pts, rtol=0, atol=1e-16)
    with pytest.raises(InputError):
        round_section(0.02).scaled(-1.0)


@pytest.mark.parametrize("section", [KEYED, CUSTOM], ids=["keyed", "custom"])
@pytest.mark.parametrize("fineness", [0.7, 1.1])
def test_boundary_facet_basis_is_scikit_fems_facet_basis_without_the_search(section, fineness):
    """BoundaryFacetBasis writes down where each boundary point lies in its element; scikit-fem's
    FacetBasis searches for it (Newton). The two agree, on two meshes; and the boundary integral
    ∮ x nₓ ds of the Gauss basis is the meshed area (divergence theorem, exact for the curved mesh)."""
    from skfem import Basis, ElementTriP2, FacetBasis

    from fem.mesh import BOUNDARY_GAUSS, BOUNDARY_POINTS, BoundaryFacetBasis, boundary_mapping

    sm = mesh_section(section, MeshOptions(fineness=fineness))
    facets = sm.boundary_facets
    for X in (BOUNDARY_GAUSS[0], BOUNDARY_POINTS):
        q = (X[None, :], np.full(len(X), 1.0 / len(X)))
        new = BoundaryFacetBasis(sm.mesh, ElementTriP2(), facets, q)
        old = FacetBasis(sm.mesh, ElementTriP2(), facets=facets, quadrature=q, mapping=boundary_mapping(sm.mesh))
        for a, b in ((new.global_coordinates(), old.global_coordinates()), (new.normals, old.normals),
                     (new.dx, old.dx)):
            assert np.allclose(np.asarray(a), np.asarray(b), rtol=0, atol=1e-12 * np.max(np.abs(np.asarray(b))))
        for j in range(new.Nbfun):
            (fn,), (fo,) = new.basis[j], old.basis[j]
            assert np.allclose(np.asarray(fn), np.asarray(fo), rtol=0, atol=1e-9)
            assert np.allclose(fn.grad, fo.grad, rtol=0, atol=1e-9 * np.max(np.abs(fo.grad)))
    g = BoundaryFacetBasis(sm.mesh, ElementTriP2(), facets, (BOUNDARY_GAUSS[0][None, :], BOUNDARY_GAUSS[1]))
    x, n = np.asarray(g.global_coordinates()), np.asarray(g.normals)
    area = {"fem": float(np.sum(x[0] * n[0] * g.dx)),
            "exact": float(np.sum(Basis(sm.mesh, ElementTriP2(), intorder=4).dx))}  # the meshed area
    assert area["fem"] == pytest.approx(area["exact"], rel=1e-10)
    inner = np.flatnonzero(sm.mesh.f2t[1] != -1)[:3]
    with pytest.raises(ValueError):
        BoundaryFacetBasis(sm.mesh, ElementTriP2(), inner, (BOUNDARY_POINTS[None, :], np.ones(9) / 9))


def test_a_moved_copy_takes_over_the_facets_it_would_build_itself():
    """same_topology hands a copy the facet arrays of its original; they are the ones scikit-fem
    builds for the copy from its elements (checked against a fresh copy), and p2_dofs numbers the
    DOFs as a basis's own numbering does."""
    from skfem import Basis, ElementTriP2

    from fem.mesh import p2_dofs, same_topology

    sm = mesh_section(KEYED, MeshOptions(fineness=0.8))
    sm.mesh.boundary_facets()  # the original builds its facets
    shared = same_topology(sm.mesh.translated((0.01, -0.02)), sm.mesh)
    fresh = sm.mesh.translated((0.01, -0.02))
    assert shared.facets is sm.mesh.facets
    for name in ("facets", "t2f", "f2t"):
        assert np.array_equal(getattr(shared, name), getattr(fresh, name))
    assert np.array_equal(p2_dofs(fresh).element_dofs, Basis(fresh, ElementTriP2()).element_dofs)
    other = mesh_section(KEYED, MeshOptions(fineness=0.5)).mesh
    assert same_topology(other, sm.mesh).facets is not sm.mesh.facets  # other elements: nothing handed over


def test_the_spline_grading_reaches_spline_sections_only():
    """``MeshOptions.spline_grading`` is the growth away from a spline's root fillets: a keyed
    section's mesh is the same whatever it is; a spline's mesh keeps its fillet size (set by
    ``per_circle``) and has fewer elements with the steeper growth."""
    from fem.estimate import element_sizes
    from fem.mesh import MeshOptions
    from fem.splines import involute_spline_section

    keyed = keyed_section(0.03, [Keyway(0.008, 0.004, 0.0006)])
    a = mesh_section(keyed, MeshOptions(fineness=0.5))
    b = mesh_section(keyed, MeshOptions(fineness=0.5, spline_grading=0.9))
    assert a.mesh.p.shape == b.mesh.p.shape and np.array_equal(a.mesh.p, b.mesh.p)
    spline = involute_spline_section(12, 1.0e-3, 30.0, root="fillet")
    gentle = mesh_section(spline, MeshOptions(fineness=0.5, spline_grading=0.25))
    steep = mesh_section(spline, MeshOptions(fineness=0.5, spline_grading=0.5))
    assert steep.mesh.t.shape[1] < 0.85 * gentle.mesh.t.shape[1]
    h_gentle, h_steep = element_sizes(gentle.mesh).min(), element_sizes(steep.mesh).min()
    assert h_steep == pytest.approx(h_gentle, rel=0.2)

"""Geometry that cannot be a shaft section is refused with a one-line error naming the field."""
import pytest

from fem.errors import InputError
from fem.geometry import Disk, Keyway, custom_section, keyed_section, polygon, rectangle, round_section
from fem.mesh import mesh_section


def refused(fn, field):
    with pytest.raises(InputError) as e:
        fn()
    msg = str(e.value)
    assert "\n" not in msg
    assert e.value.field == field
    return msg


def test_keyway_deeper_than_the_radius():
    msg = refused(lambda: keyed_section(0.02, [Keyway(0.006, 0.011, 0.0002)]), "section.keyways[0].depth")
    assert "axis" in msg


def test_keyway_into_the_bore():
    refused(lambda: keyed_section(0.03, [Keyway(0.008, 0.006, 0.0002)], bore=0.02), "section.keyways[0].depth")


def test_fillet_wider_than_half_the_keyway():
    msg = refused(lambda: keyed_section(0.02, [Keyway(0.006, 0.0035, 0.0031)]), "section.keyways[0].fillet")
    assert "half the keyway width" in msg


def test_bore_not_smaller_than_the_shaft():
    refused(lambda: round_section(0.02, 0.02), "section.bore")


def test_negative_dimension():
    refused(lambda: round_section(-0.02), "section.diameter")


def test_self_intersecting_polygon():
    bow_tie = [(0, 0), (0.01, 0.01), (0.01, 0), (0, 0.01)]
    msg = refused(lambda: custom_section([polygon(bow_tie)]), "section.add[0].points")
    assert "intersects itself" in msg


def test_fillet_that_does_not_fit_its_corner():
    refused(lambda: custom_section([polygon([(0, 0), (0.01, 0), (0, 0.01)], fillets=(0.0, 0.004, 0.004))]),
            "section.add[0].fillets[1]")


def test_cut_that_removes_everything():
    sec = custom_section([Disk((0, 0), 0.01)], [rectangle((0, 0), (0.05, 0.05))])
    refused(lambda: mesh_section(sec), "section")


def test_disconnected_result():
    sec = custom_section([Disk((0, 0), 0.01)], [rectangle((0, 0), (0.002, 0.05))])
    msg = refused(lambda: mesh_section(sec), "section")
    assert "separate pieces" in msg


def test_keyed_section_with_two_keyways_and_a_bore_meshes_with_named_boundaries():
    sec = keyed_section(0.04, [Keyway(0.012, 0.005, 0.0004, 90.0), Keyway(0.012, 0.005, 0.0004, 270.0)], bore=0.012)
    sm = mesh_section(sec)
    assert set(sm.mesh.boundaries) == {"outer", "hole1"}
    assert len(sm.boundary.hole_areas) == 1
    # fillet arcs recognised as such, with their radius
    radii = sorted(c.radius for c in sm.boundary.curves.values() if c.kind == "arc" and c.radius < 0.001)
    assert radii == pytest.approx([0.0004] * 4, rel=1e-9)
    # the keyway corners where the sides meet the fillets are tangent, the sides meet the shaft sharply
    assert not sm.boundary.reentrant_sharp_corners


def test_sharp_keyway_is_reported_as_a_reentrant_corner():
    sm = mesh_section(keyed_section(0.02, [Keyway(0.006, 0.0035, 0.0)]))
    assert len(sm.boundary.reentrant_sharp_corners) == 2


# issue 8 items 5-7: non-finite angles (a NaN ellipse rotation crashed gmsh with a segfault), slivers
# beside a bore, a cut that lies wholly outside the section


@pytest.mark.parametrize("bad", [float("nan"), float("inf"), -float("inf")])
def test_non_finite_rotations_and_angles_are_refused_before_gmsh(bad):
    from fem.geometry import Ellipse

    refused(lambda: custom_section([Ellipse((0.0, 0.0), (0.02, 0.01), bad, label="section.add[0].ellipse")]),
            "section.add[0].ellipse.rotation")
    refused(lambda: rectangle((0, 0), (0.01, 0.02), bad, name="section.cut[0].rectangle"), "section.cut[0].rectangle.rotation")
    refused(lambda: polygon([(0, 0), (1, 0), (0, 1)], bad, name="section.add[0].polygon"), "section.add[0].polygon.rotation")
    refused(lambda: keyed_section(0.025, [Keyway(0.008, 0.004, 0.0002, bad)]), "section.keyways[0].angle")


def test_slivers_beside_a_bore_are_refused():
    msg = refused(lambda: round_section(0.025, 0.02499999), "section.bore")
    assert "sliver" in msg
    msg = refused(lambda: keyed_section(0.025, [Keyway(0.008, 0.00749999, 0.0002)], bore=0.010), "section.keyways[0].depth")
    assert "ligament" in msg
    refused(lambda: keyed_section(0.025, [Keyway(1e-7, 0.004, 0.0)]), "section.keyways[0].width")
    # a thin but real wall (2 % of the diameter) is accepted
    assert round_section(0.025, 0.024).bore == 0.024


def test_a_cut_wholly_outside_the_section_is_refused():
    s = custom_section([Disk((0.0, 0.0), 0.02)], [Disk((0.05, 0.0), 0.002, label="section.cut[0].disk")])
    msg = refused(lambda: mesh_section(s), "section.cut[0].disk")
    assert "outside" in msg

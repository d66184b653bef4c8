"""Imported outlines (fem/outline_import.py): a DXF, STEP, BREP or mesh of a section gives the
same area, J and peak as the same section built from shapes, and bad drawings are refused naming
the entity."""
import io
import math

import ezdxf
import numpy as np
import pytest

from fem.errors import InputError
from fem.geometry import Keyway, keyed_section
from fem.outline_import import cad_section, dxf_section, mesh_file_section
from tests.helpers import torsion_of

R, W, DEPTH, F, BORE = 15.0, 8.0, 4.0, 0.4, 10.0  # mm: a 30 mm shaft, 8 x 4 keyway, 0.4 mm bottom radius


def keyed_outline_xyb():
    """The keyed shaft's outline as an LWPOLYLINE (x, y, bulge), counter-clockwise: the shaft arc
    from the keyway's left edge round to its right edge, down the right wall, the two bottom
    fillets (quarter arcs, bulge tan(90°/4), clockwise so negative) and up the left wall."""
    yb = math.sqrt(R * R - (W / 2) ** 2)
    sweep = 2 * math.pi - 2 * math.atan2(W / 2, yb)  # the shaft arc, the long way round
    yk = R - DEPTH
    q = -math.tan(math.pi / 8)
    return [(-W / 2, yb, math.tan(sweep / 4)), (W / 2, yb, 0.0), (W / 2, yk + F, q), (W / 2 - F, yk, 0.0),
            (-W / 2 + F, yk, q), (-W / 2, yk + F, 0.0)]


def dxf_text(build, insunits=4):
    doc = ezdxf.new("R2010")
    doc.header["$INSUNITS"] = insunits
    build(doc.modelspace())
    s = io.StringIO()
    doc.write(s)
    return s.getvalue()


def keyed_drawing(msp):
    msp.add_lwpolyline(keyed_outline_xyb(), format="xyb", close=True, dxfattribs={"layer": "SECTION"})
    msp.add_circle((0, 0), BORE / 2, dxfattribs={"layer": "SECTION"})
    msp.add_text("A-A", dxfattribs={"layer": "NOTES"})  # annotation is ignored


REFERENCE = keyed_section(30e-3, [Keyway(W * 1e-3, DEPTH * 1e-3, F * 1e-3)], bore=BORE * 1e-3)


@pytest.fixture(scope="module")
def reference():
    return torsion_of(REFERENCE, fineness=1.0)


def compare_to_reference(sec, reference):
    sm0, p0, t0 = reference
    sm, p, t = torsion_of(sec, fineness=1.0)
    out = {"area": {"fem": p.area, "exact": p0.area}, "J": {"fem": t.J, "exact": t0.J},
           "peak": {"fem": t.peak_per_torque, "exact": t0.peak_per_torque}}
    print({k: v["fem"] / v["exact"] - 1 for k, v in out.items()})
    # the same exact geometry: the exact boundary integral of the area agrees to round-off
    assert sm.boundary.integrals["A"] == pytest.approx(sm0.boundary.integrals["A"], rel=1e-9)
    # the FE area of two meshes: each differs from the exact one by the P2 interpolation of its arcs
    assert out["area"]["fem"] == pytest.approx(out["area"]["exact"], rel=1e-6)
    # J (the tolerance): two meshes of one exact geometry, J converging at order 4
    assert out["J"]["fem"] == pytest.approx(out["J"]["exact"], rel=1e-4)
    # the boundary peak at the keyway fillet from two different meshes of the same curve: at this
    # fineness each is within about 1e-4 of the converged peak (measured: 1.5e-4 apart at fineness 1,
    # 3e-5 at fineness 2), so 1e-3 separates a geometry error from discretisation
    assert out["peak"]["fem"] == pytest.approx(out["peak"]["exact"], rel=1e-3)
    return sm


def test_dxf_polyline_with_bulges_and_a_circle_matches_the_keyed_section(reference):
    """Reference: the same section built from shapes (fem.geometry.keyed_section)."""
    sec = dxf_section(dxf_text(keyed_drawing), layer="SECTION")
    assert sec.kind == "imported" and len(sec.steps) == 2
    sm = compare_to_reference(sec, reference)
    assert not sm.boundary.reentrant_sharp_corners  # fillets joined tangentially, no kink


def test_dxf_lines_and_arcs_in_any_order_and_direction_match(reference):
    """The same outline as loose LINE and ARC entities, shuffled and some drawn backwards, in inches."""
    pts = keyed_outline_xyb()
    inch = 25.4

    def build(msp):
        ents = []
        for i, (x, y, b) in enumerate(pts):
            x2, y2, _ = pts[(i + 1) % len(pts)]
            if b == 0:
                ents.append(("line", (x2 / inch, y2 / inch), (x / inch, y / inch)) if i % 2 else
                            ("line", (x / inch, y / inch), (x2 / inch, y2 / inch)))
            else:
                theta = 4 * math.atan(b)
                chord = np.array([x2 - x, y2 - y])
                L = np.linalg.norm(chord)
                c = (np.array([x, y]) + np.array([x2, y2])) / 2 + np.array([-chord[1], chord[0]]) / L * (L / 2) / math.tan(theta / 2)
                a0 = math.degrees(math.atan2(y - c[1], x - c[0]))
                a1 = math.degrees(math.atan2(y2 - c[1], x2 - c[0]))
                if theta < 0:
                    a0, a1 = a1, a0  # DXF arcs run counter-clockwise
                ents.append(("arc", tuple(c / inch), math.hypot(x - c[0], y - c[1]) / inch, a0, a1))
        for e in reversed(ents):
            if e[0] == "line":
                msp.add_line(e[1], e[2])
            else:
                msp.add_arc(e[1], e[2], e[3], e[4])
        msp.add_circle((0, 0), BORE / 2 / inch)

    sec = dxf_section(dxf_text(build, insunits=1))
    compare_to_reference(sec, reference)


def test_step_and_brep_faces_match(reference, tmp_path):
    """A planar face written by gmsh's OpenCASCADE kernel as STEP and as BREP, read back."""
    from fem.gmshload import initialize, load_gmsh

    gmsh = load_gmsh()
    if not gmsh.isInitialized():
        initialize(gmsh)
    gmsh.option.setNumber("General.Terminal", 0)
    gmsh.clear()
    gmsh.model.add("write")
    surfaces = REFERENCE.scaled(1e3).build(gmsh)
    assert surfaces
    gmsh.write(str(tmp_path / "s.brep"))
    gmsh.option.setString("Geometry.OCCTargetUnit", "MM")
    gmsh.write(str(tmp_path / "s.step"))
    gmsh.option.setString("Geometry.OCCTargetUnit", "")
    gmsh.clear()
    brep = cad_section((tmp_path / "s.brep").read_text(), ".brep", 1e-3)
    compare_to_reference(brep, reference)
    step = cad_section((tmp_path / "s.step").read_text(), ".step", 1.0)
    compare_to_reference(step, reference)


def test_a_mesh_outline_has_straight_facets_and_says_so():
    """A triangulated square 20 mm: area exact (straight edges), and the geometry record says no
    curved boundary is claimed."""
    text = ("$MeshFormat\n2.2 0 8\n$EndMeshFormat\n$Nodes\n5\n1 0 0 0\n2 20 0 0\n3 20 20 0\n4 0 20 0\n5 10 10 0\n"
            "$EndNodes\n$Elements\n4\n1 2 0 1 2 5\n2 2 0 2 3 5\n3 2 0 3 4 5\n4 2 0 4 1 5\n$EndElements\n")
    sec = mesh_file_section(text, ".msh", 1e-3)
    g = {n: v for n, v, _ in sec.geometry}
    assert g["curved_boundary"] is False
    sm, p, t = torsion_of(sec, fineness=0.5)
    assert p.area == pytest.approx(400e-6, rel=1e-9)  # exact: a 20 mm square
    # square bar, b/a = 1: J = 0.1406·a⁴ (Roark's Formulas for Stress and Strain, 7th ed., Table 10.1, case 4)
    assert t.J == pytest.approx(0.1406 * 0.02**4, rel=2e-3)


def square(msp, x0=0.0, y0=0.0, a=20.0, **kw):
    msp.add_lwpolyline([(x0, y0), (x0 + a, y0), (x0 + a, y0 + a), (x0, y0 + a)], close=True, dxfattribs=kw)


@pytest.mark.parametrize("build, words", [
    (lambda m: [m.add_line((0, 0), (20, 0)), m.add_line((20, 0), (20, 20)), m.add_line((20, 20), (0, 20))],
     "open at"),
    (lambda m: [square(m), square(m, 10, 10)], "cross"),
    (lambda m: [square(m), square(m, 5, 5, 10), square(m, 8, 8, 2)], "island"),
    (lambda m: [square(m), square(m, 30, 0, 5)], "outside the outline"),
    (lambda m: m.add_lwpolyline([(0, 0), (10, 0), (20, 0)], close=True), "no area"),
    (lambda m: m.add_lwpolyline([(0, 0), (10, 10), (10, 0), (0, 10)], close=True), "crosses itself"),
    (lambda m: m.add_lwpolyline([(0, 0), (20, 20), (20, 0), (0, 10)], close=True), "crosses or touches itself"),
    (lambda m: [m.add_line((0, 0), (20, 0)), m.add_line((20, 0), (20, 20)), m.add_line((20, 20), (0, 0)),
                m.add_line((20, 0), (30, 0))], "three or more"),
])
def test_bad_drawings_are_refused_naming_the_entity(build, words):
    with pytest.raises(InputError) as e:
        dxf_section(dxf_text(build))
    msg = str(e.value)
    assert e.value.field == "section.file" and words in msg, msg
    assert "layer" in msg and "handle" in msg, msg  # the entity: type, layer, handle


def test_an_empty_layer_and_a_drawing_without_units_are_refused():
    with pytest.raises(InputError) as e:
        dxf_section(dxf_text(lambda m: square(m, layer="A")), layer="B")
    assert e.value.field == "section.layer" and "layers in the drawing: A" in str(e.value)
    with pytest.raises(InputError) as e:
        dxf_section(dxf_text(square, insunits=0))
    assert e.value.field == "section.units"
    sec = dxf_section(dxf_text(square, insunits=0), scale=1e-3)  # units given in the case instead
    assert {n: v for n, v, _ in sec.geometry}["length_unit"] == 1e-3

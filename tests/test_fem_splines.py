"""Splined sections (fem/splines.py): the flanks are the exact involute, J is unchanged by turning
the section one tooth pitch and lies between the J of the minor- and major-diameter round bars,
and impossible splines are refused."""
import math

import numpy as np
import pytest

from fem.errors import InputError
from fem.gmshload import initialize, load_gmsh
from fem.splines import FLANK_POINTS, InvoluteFlank, inv, involute_spline_section, straight_spline_section
from tests.helpers import torsion_of

M = 1.0e-3  # module [m]


def involute_deviation(section, z, m, alpha_deg, s=None):
    """Largest distance [m], measured along the circle through the point, of the built B-spline
    curves from the exact involute of the tooth they belong to. The involute in polar form: at
    radius r >= rb the flank lies at θ(r) = s/D + inv α − inv α_r, cos α_r = rb/r (the involute of
    a circle; any gear text, e.g. Shigley's Mechanical Engineering Design, 10th ed., Ch. 13)."""
    gmsh = load_gmsh()
    if not gmsh.isInitialized():
        initialize(gmsh)
    gmsh.option.setNumber("General.Terminal", 0)
    gmsh.clear()
    gmsh.model.add("flanks")
    section.build(gmsh)
    D = z * m
    alpha = math.radians(alpha_deg)
    rb = D * math.cos(alpha) / 2
    beta0 = (math.pi * m / 2 if s is None else s) / D + inv(alpha)
    worst, n = 0.0, 0
    for _, c in gmsh.model.getEntities(1):
        if gmsh.model.getType(1, c) != "BSpline":
            continue
        lo, hi = (float(v[0]) for v in gmsh.model.getParametrizationBounds(1, c))
        xy = np.reshape(gmsh.model.getValue(1, c, np.linspace(lo, hi, 301).tolist()), (-1, 3))[:, :2]
        r = np.hypot(xy[:, 0], xy[:, 1])
        phi = np.arctan2(xy[:, 1], xy[:, 0])
        phi -= np.round(phi / (2 * math.pi / z)) * (2 * math.pi / z)  # angle from the tooth's centre line
        a = np.arccos(np.minimum(rb / r, 1.0))
        worst = max(worst, float(np.max(np.abs(r * (np.abs(phi) - (beta0 - (np.tan(a) - a)))))))
        n += 1
    gmsh.clear()
    return worst, n


@pytest.mark.parametrize("z, alpha, root", [(20, 30.0, "flat"), (12, 30.0, "fillet"), (12, 37.5, "fillet"),
                                           (30, 45.0, "fillet")])
def test_flanks_lie_on_the_exact_involute(z, alpha, root):
    sec = involute_spline_section(z, M, alpha, root=root)
    worst, n = involute_deviation(sec, z, M, alpha)
    assert n == 2 * z  # two flanks per tooth, each one smooth curve
    assert worst < 1e-6 * M, worst / M  # the requirement: 1e-6 of the module


def test_below_the_base_circle_the_flank_is_the_radial_line():
    """12 teeth, 30° fillet root: the minor diameter (z − 1.8)·m lies inside the base circle
    z·m·cos 30°; with a root radius of 0.05·m the fillet ends below the base circle, so each flank
    starts with a radial segment, tangent to the involute's start."""
    sec = involute_spline_section(12, M, 30.0, root="fillet", fillet=0.05 * M)
    kinds = [k for k, _p, _t in sec.steps[0][1].segments]
    assert kinds.count("line") == 2 * 12 and kinds.count("spline") == 2 * 12
    rb = 12 * M * math.cos(math.radians(30.0)) / 2
    for k, pts, _t in sec.steps[0][1].segments:
        if k == "spline":
            assert min(math.hypot(*pts[0]), math.hypot(*pts[-1])) >= rb * (1 - 1e-12)
    worst, n = involute_deviation(sec, 12, M, 30.0)
    assert n == 24 and worst < 1e-6 * M


def test_flank_definition_points_are_exact():
    """The points the B-spline interpolates satisfy the polar involute equation to round-off."""
    fl = InvoluteFlank(0.01, 0.1)
    t = np.linspace(0, 0.8, FLANK_POINTS)
    p = fl.point(t)
    r = np.hypot(p[:, 0], p[:, 1])
    a = np.arccos(0.01 / r)
    assert np.allclose(np.arctan2(p[:, 1], p[:, 0]), 0.1 - (np.tan(a) - a), atol=1e-15, rtol=0)


def test_default_dimensions_follow_the_standard_rule():
    """ISO 4156-1, 30° flat root, external: major (z + 1)·m, minor (z − 1.5)·m, fillet 0.2·m (from memory)."""
    sec = involute_spline_section(20, M, 30.0, root="flat")
    g = {n: v for n, v, _ in sec.geometry}
    assert g["major_diameter"] == pytest.approx(21 * M, rel=1e-12)
    assert g["minor_diameter"] == pytest.approx(18.5 * M, rel=1e-12)
    assert g["pitch_diameter"] == pytest.approx(20 * M, rel=1e-12)
    assert g["fillet"] == pytest.approx(0.2 * M, rel=1e-12)
    assert g["teeth"] == 20 and sec.diameter == g["major_diameter"]


def test_involute_J_is_unchanged_by_one_tooth_pitch_and_between_the_round_bars():
    """Rotating a section changes no section property (the torsion constant is a property of the
    shape, Timoshenko & Goodier, Theory of Elasticity, 3rd ed., Sec. 104); a section lying between
    two discs has J between theirs (torsional rigidity increases with the domain: Pólya & Szegő,
    Isoperimetric Inequalities in Mathematical Physics, 1951)."""
    z = 12
    sec = involute_spline_section(z, M, 30.0, root="fillet")
    _, _, t0 = torsion_of(sec, fineness=0.3)
    _, _, t1 = torsion_of(sec.moved(rotation=360.0 / z), fineness=0.3)
    rel = abs(t1.J / t0.J - 1)
    print(f"J turned one pitch / J: {t1.J / t0.J:.10f}")
    assert rel < 1e-4
    g = {n: v for n, v, _ in sec.geometry}
    J_minor = math.pi * g["minor_diameter"] ** 4 / 32
    J_major = math.pi * g["major_diameter"] ** 4 / 32
    assert J_minor < t0.J < J_major, (J_minor, t0.J, J_major)


def test_straight_spline_J_between_the_round_bars_and_turned_one_pitch():
    """Same two facts as above for a straight-sided spline (ISO 14 light 8 x 32 x 36, width 6 mm,
    from memory)."""
    sec = straight_spline_section(8, 32e-3, 36e-3, 6e-3, 0.3e-3)
    _, _, t0 = torsion_of(sec, fineness=0.3)
    _, _, t1 = torsion_of(sec.moved(rotation=45.0), fineness=0.3)
    assert abs(t1.J / t0.J - 1) < 1e-4
    assert math.pi * 32e-3**4 / 32 < t0.J < math.pi * 36e-3**4 / 32


@pytest.mark.parametrize("kwargs, field", [
    (dict(teeth=5), "section.teeth"),
    (dict(teeth=20.0), "section.teeth"),
    (dict(pressure_angle=20.0), "section.pressure_angle"),
    (dict(module=-1e-3), "section.module"),
    (dict(major_diameter=40e-3), "section.major_diameter"),  # pointed teeth
    (dict(minor_diameter=21.5e-3), "section.minor_diameter"),  # above the pitch circle
    (dict(fillet=2e-3), "section.fillet"),  # wider than the space between teeth
    (dict(bore=18.49e-3), "section.bore"),  # a wall of 5 µm under the teeth: a sliver
    (dict(root="round"), "section.root"),
    (dict(pressure_angle=45.0, root="flat"), "section.root"),  # flat root only at 30° (from memory)
])
def test_impossible_involute_splines_are_refused(kwargs, field):
    args = dict(teeth=20, module=M, pressure_angle=30.0)
    args.update(kwargs)
    with pytest.raises(InputError) as e:
        involute_spline_section(**args)
    assert e.value.field == field, str(e.value)


@pytest.mark.parametrize("args, field", [
    ((2, 32e-3, 36e-3, 6e-3), "section.splines"),
    ((8, 36e-3, 32e-3, 6e-3), "section.minor_diameter"),
    ((8, 32e-3, 36e-3, 14e-3), "section.width"),  # splines touch at the minor diameter
    ((8, 32e-3, 36e-3, 6e-3, 3e-3), "section.fillet"),
])
def test_impossible_straight_splines_are_refused(args, field):
    with pytest.raises(InputError) as e:
        straight_spline_section(*args)
    assert e.value.field == field, str(e.value)


def test_a_scaled_spline_gets_the_same_mesh_and_J_times_k4():
    """Dimensional analysis: J scales with the fourth power of the size (J has units m⁴); the section
    is meshed in its own scale-free frame, so the scaled copy gets the same mesh (fem/mesh.py)."""
    sec = involute_spline_section(12, M, 30.0, root="fillet")
    sm0, _, t0 = torsion_of(sec, fineness=0.3)
    sm1, _, t1 = torsion_of(sec.scaled(2.5), fineness=0.3)
    assert sm0.mesh.t.shape == sm1.mesh.t.shape
    J = {"fem": t1.J, "exact": 2.5**4 * t0.J}
    assert J["fem"] == pytest.approx(J["exact"], rel=1e-9)
    g = {n: v for n, v, _ in sec.scaled(2.5).geometry}
    assert g["major_diameter"] == pytest.approx(2.5 * 13 * M) and g["teeth"] == 12

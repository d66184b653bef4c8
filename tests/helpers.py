"""Small shared pieces for the tests: solve a section once, observed order from a sequence."""
import math

from fem.mesh import MeshOptions, mesh_section
from fem.properties import area_moments
from fem.torsion import solve_torsion


def torsion_of(section, fineness=1.0):
    sm = mesh_section(section, MeshOptions(fineness=fineness))
    props = area_moments(sm)
    return sm, props, solve_torsion(sm, props.centroid)


def observed_order(errors, sizes):
    """Least-squares slope of log(error) against log(h)."""
    xs = [math.log(h) for h in sizes]
    ys = [math.log(abs(e)) for e in errors]
    n = len(xs)
    mx, my = sum(xs) / n, sum(ys) / n
    return sum((x - mx) * (y - my) for x, y in zip(xs, ys)) / sum((x - mx) ** 2 for x in xs)

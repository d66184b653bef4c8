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


def exact_plain_bar_stress(load, p, amount, E, nu):
    """The plain round bar's stress tensor (3, 3, points) at points ``p`` for ``load`` at ``amount``
    (strain, curvature [1/m] or twist [rad/m]): Timoshenko & Goodier, Theory of Elasticity, 3rd ed.,
    the elementary solutions of tension, pure bending and torsion of a circular shaft."""
    import numpy as np

    G = E / (2 * (1 + nu))
    x, y = p[0], p[1]
    s = np.zeros((3, 3, p.shape[1]))
    if load == "tension":
        s[2, 2] = E * amount
    elif load == "bending_x":
        s[2, 2] = E * amount * y
    elif load == "bending_y":
        s[2, 2] = E * amount * x
    else:
        s[0, 2] = s[2, 0] = -G * amount * y
        s[1, 2] = s[2, 1] = G * amount * x
    return s

"""Weak forms and functionals, one small named function each (scikit-fem's own style).

Coordinates ``w.x`` are those of the mesh; the solvers pass centroidal meshes where a form needs
centroidal axes (warping and shear functions). Second-moment parameters arrive as ``w.Ixx`` etc.
"""
from skfem import BilinearForm, Functional, LinearForm
from skfem.helpers import dot, grad

# ----------------------------------------------------------------------------- torsion


@BilinearForm
def laplace(u, v, _):
    """∫ ∇u·∇v dA."""
    return dot(grad(u), grad(v))


@LinearForm
def prandtl_load(v, _):
    """Right-hand side of ∇²φ = −2 (φ per unit Gθ): ∫ 2 v dA."""
    return 2.0 * v


@LinearForm
def warping_load(v, w):
    """Neumann data ∂ω/∂n = y·nx − x·ny written over the area: ∫ (y ∂v/∂x − x ∂v/∂y) dA
    (the divergence theorem turns the boundary integral into this, since div(y, −x) = 0)."""
    x, y = w.x
    return y * grad(v)[0] - x * grad(v)[1]


# ----------------------------------------------------------------------------- section integrals


@Functional
def area(w):
    return 1.0 + 0.0 * w.x[0]


@Functional
def first_moment_x(w):
    """∫ x dA."""
    return w.x[0]


@Functional
def first_moment_y(w):
    """∫ y dA."""
    return w.x[1]


@Functional
def second_moment_xx(w):
    """Ixx = ∫ y² dA (about the mesh's x axis)."""
    return w.x[1] ** 2


@Functional
def second_moment_yy(w):
    """Iyy = ∫ x² dA."""
    return w.x[0] ** 2


@Functional
def product_moment(w):
    """Ixy = ∫ x y dA."""
    return w.x[0] * w.x[1]


@Functional
def integral_of(w):
    """∫ u dA for the field passed as ``u``."""
    return w["u"]


@Functional
def warping_torsion_constant(w):
    """J = ∫ (x² + y² + x ∂ω/∂y − y ∂ω/∂x) dA for the warping function passed as ``omega``."""
    x, y = w.x
    g = grad(w["omega"])
    return x**2 + y**2 + x * g[1] - y * g[0]


@Functional
def squared_gradient(w):
    """∫ |∇u|² dA (twice the energy of the field ``u``)."""
    g = grad(w["u"])
    return g[0] ** 2 + g[1] ** 2


# ----------------------------------------------------------------------------- transverse shear


@LinearForm
def shear_load_x(v, w):
    """Weak right-hand side of the shear function Ψ (force Vx), centroidal axes:
    ∇²Ψ = 2(Ixy·y − Ixx·x) in the section, ∂Ψ/∂n = n·d on the boundary, with
    d = ν(Ixx(x²−y²)/2 − Ixy·xy, Ixx·xy + Ixy(x²−y²)/2). The boundary term is written over the
    area (∮ (n·d) v ds = ∫ (d·∇v + v div d) dA), so no facet integral is needed."""
    x, y = w.x
    nu, Ixx, Ixy = w.nu, w.Ixx, w.Ixy
    d0 = nu * (Ixx * (x**2 - y**2) / 2 - Ixy * x * y)
    d1 = nu * (Ixx * x * y + Ixy * (x**2 - y**2) / 2)
    div_d = nu * (2 * Ixx * x - 2 * Ixy * y)
    src = 2.0 * (Ixy * y - Ixx * x)
    gv = grad(v)
    return -src * v + d0 * gv[0] + d1 * gv[1] + div_d * v


@LinearForm
def shear_load_y(v, w):
    """Weak right-hand side of the shear function Φ (force Vy), centroidal axes:
    ∇²Φ = 2(Ixy·x − Iyy·y), ∂Φ/∂n = n·h, h = ν(Iyy·xy − Ixy(x²−y²)/2, −Ixy·xy − Iyy(x²−y²)/2)."""
    x, y = w.x
    nu, Iyy, Ixy = w.nu, w.Iyy, w.Ixy
    h0 = nu * (Iyy * x * y - Ixy * (x**2 - y**2) / 2)
    h1 = nu * (-Ixy * x * y - Iyy * (x**2 - y**2) / 2)
    div_h = nu * (2 * Iyy * y - 2 * Ixy * x)
    src = 2.0 * (Ixy * x - Iyy * y)
    gv = grad(v)
    return -src * v + h0 * gv[0] + h1 * gv[1] + div_h * v


@BilinearForm
def mass(u, v, _):
    """∫ u v dA: the mass matrix of an L2 projection."""
    return u * v


@LinearForm
def projection_load(v, w):
    """∫ f v dA for quadrature-point values ``f``: the load of an L2 projection."""
    return w.f * v

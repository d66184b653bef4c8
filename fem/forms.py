"""Weak forms and functionals, one small named function each (scikit-fem's own style).

Coordinates ``w.x`` are those of the mesh; the solvers pass centroidal meshes where a form needs
centroidal axes (warping and shear functions). Second-moment parameters arrive as ``w.Ixx`` etc.
"""
import math

import numpy as np
from skfem import BilinearForm, Functional, LinearForm
from skfem.helpers import ddot, dot, grad, sym_grad, trace

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


# ----------------------------------------------------------------------------- shafts of revolution
# The meridian section of a shaft of revolution: mesh coordinates w.x = (r, z), r ≥ 0 the distance
# from the axis, z along it. The θ-integral is done by hand, so every form below is the full 3-D
# energy of a shaft of revolution (per radian factors 2π or π included), and ½·xᵀKx is the strain
# energy of the solid.
#   Torsion: Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §119 (section number from memory) "Torsion of circular shafts
#   of variable diameter": u_θ = r·ω(r, z), equilibrium ∂/∂r(r³ ∂ω/∂r) + ∂/∂z(r³ ∂ω/∂z) = 0,
#   τ_rθ = G·r·∂ω/∂r, τ_θz = G·r·∂ω/∂z; lateral surface traction-free (natural condition).
#   Axisymmetric and first-harmonic elasticity: Zienkiewicz & Taylor, The Finite Element Method,
#   vol. 1, 6th ed., the sections on axisymmetric stress analysis and on axisymmetric solids under
#   non-symmetric loads by Fourier series (cited from memory, section numbers not given); the strain
#   definitions below were derived here from
#   the cylindrical-coordinate strains and checked on the exact straight-bar fields (tests).


@BilinearForm
def axisym_torsion(u, v, w):
    """2π·G ∫ r³ ∇ω·∇v dr dz (G passed as ``w.G``): the energy of u_θ = r·ω(r, z)."""
    r = w.x[0]
    return 2.0 * math.pi * w.G * r**3 * dot(grad(u), grad(v))


def _lame(E, nu):
    lam = E * nu / ((1 + nu) * (1 - 2 * nu))
    mu = E / (2 * (1 + nu))
    return lam, mu


def _once_per_field(w, strains, u, r):
    """``strains(u, r)`` for the basis function ``u``, computed once per assembly: scikit-fem calls a
    bilinear form for every pair of local basis functions (18 × 18 for a P2 vector of three
    components) with the same field objects and the same ``w``, so each function's strains are kept
    in ``w`` (a dict made afresh for every assembly) under its field's id. The values are those
    computed each time, bit for bit; the bending assembly at 79k unknowns took 0.48–0.49 CPU s
    instead of 0.68–0.84 (docs/speed.md)."""
    memo = w.setdefault("_strains_once", {})
    key = (strains.__name__, id(u))
    if key not in memo:
        memo[key] = (u, strains(u, r))  # u kept, so its id is not reused while the memo lives
    return memo[key][1]


def axisym_n0_strains(u, r):
    """(ε_r, ε_θ, ε_z, γ_rz) of u = (u_r, u_z) on the meridian section (harmonic n = 0)."""
    g = u.grad
    v = np.asarray(u)  # the value of the field (a DiscreteField is an array of its values)
    return g[0][0], v[0] / r, g[1][1], g[0][1] + g[1][0]


@BilinearForm
def axisym_elasticity_n0(u, v, w):
    """2π ∫ σ(u):ε(v) r dr dz, u = (u_r, u_z): axisymmetric elasticity (axial load).

    ε_r = ∂u_r/∂r, ε_θ = u_r/r, ε_z = ∂u_z/∂z, γ_rz = ∂u_r/∂z + ∂u_z/∂r; isotropic, E = ``w.E``,
    ν = ``w.nu``. u_r = 0 on the axis is imposed by the solver."""
    r = w.x[0]
    lam, mu = _lame(w.E, w.nu)
    er, et, ez, grz = _once_per_field(w, axisym_n0_strains, u, r)
    fr, ft, fz, frz = _once_per_field(w, axisym_n0_strains, v, r)
    tr_u = er + et + ez
    tr_v = fr + ft + fz
    s = lam * tr_u * tr_v + 2 * mu * (er * fr + et * ft + ez * fz) + mu * grz * frz
    return 2.0 * math.pi * s * r


def axisym_n1_strains(u, r):
    """Strain amplitudes of the first circumferential harmonic, u = (U_r, U_θ, U_z) with
    u_r = U_r cos θ, u_θ = U_θ sin θ, u_z = U_z cos θ:
    (ε_r, ε_θ, ε_z, γ_rz) multiply cos θ, (γ_rθ, γ_θz) multiply sin θ.

    ε_r = ∂U_r/∂r, ε_θ = (U_r + U_θ)/r, ε_z = ∂U_z/∂z, γ_rz = ∂U_r/∂z + ∂U_z/∂r,
    γ_rθ = ∂U_θ/∂r − (U_r + U_θ)/r, γ_θz = ∂U_θ/∂z − U_z/r."""
    g = u.grad
    Ur, Ut, Uz = np.asarray(u)  # the value of the field
    et = (Ur + Ut) / r
    return (g[0][0], et, g[2][1], g[0][1] + g[2][0]), (g[1][0] - et, g[1][1] - Uz / r)


@BilinearForm
def axisym_elasticity_n1(u, v, w):
    """π ∫ σ(u):ε(v) r dr dz for the first circumferential harmonic (bending).

    The θ-integrals of cos²θ and sin²θ over a turn are both π; the cos-group and the sin-group of
    strains do not couple in an isotropic material. On the axis the solver imposes U_z = 0 and
    U_r + U_θ = 0 (regularity)."""
    r = w.x[0]
    lam, mu = _lame(w.E, w.nu)
    (er, et, ez, grz), (grt, gtz) = _once_per_field(w, axisym_n1_strains, u, r)
    (fr, ft, fz, frz), (frt, ftz) = _once_per_field(w, axisym_n1_strains, v, r)
    s = (lam * (er + et + ez) * (fr + ft + fz) + 2 * mu * (er * fr + et * ft + ez * fz)
         + mu * (grz * frz + grt * frt + gtz * ftz))
    return math.pi * s * r


@BilinearForm
def mass(u, v, _):
    """∫ u v dA: the mass matrix of an L2 projection."""
    return u * v


@LinearForm
def projection_load(v, w):
    """∫ f v dA for quadrature-point values ``f``: the load of an L2 projection."""
    return w.f * v


# ----------------------------------------------------------------------------- composite sections
# (fem/composite.py): the modulus of each element's region arrives as ``c`` at the quadrature points


@BilinearForm
def weighted_laplace(u, v, w):
    """∫ c ∇u·∇v dA (c = G for the warping function, 1/G for the stress function)."""
    return w.c * dot(grad(u), grad(v))


@LinearForm
def weighted_warping_load(v, w):
    """∫ G (y ∂v/∂x − x ∂v/∂y) dA: the warping function's load with the shear modulus per region."""
    x, y = w.x
    return w.c * (y * grad(v)[0] - x * grad(v)[1])


@Functional
def weighted_warping_torsion_constant(w):
    """GJ = ∫ G (x² + y² + x ∂ω/∂y − y ∂ω/∂x) dA for the warping function ``omega``."""
    x, y = w.x
    g = grad(w["omega"])
    return w.c * (x**2 + y**2 + x * g[1] - y * g[0])


@Functional
def weighted_area(w):
    """∫ c dA (EA with c = E)."""
    return w.c + 0.0 * w.x[0]


@Functional
def weighted_first_moment_x(w):
    """∫ c x dA."""
    return w.c * w.x[0]


@Functional
def weighted_first_moment_y(w):
    """∫ c y dA."""
    return w.c * w.x[1]


@Functional
def weighted_second_moment_xx(w):
    """∫ c y² dA (EIxx with c = E, about the mesh's x axis)."""
    return w.c * w.x[1] ** 2


@Functional
def weighted_second_moment_yy(w):
    """∫ c x² dA."""
    return w.c * w.x[0] ** 2


@Functional
def weighted_product_moment(w):
    """∫ c x y dA."""
    return w.c * w.x[0] * w.x[1]


@LinearForm
def composite_shear_load_x(v, w):
    """Weak right-hand side of the composite shear function Ψ (force Vx), axes through the
    modulus-weighted centroid: ∫ G ν d*·∇v dA + ∫ E (EIxx·x − EIxy·y) v dA, with
    d* = (EIxx(x²−y²)/2 − EIxy·xy, EIxx·xy + EIxy(x²−y²)/2) and, per region, E = ``w.e``,
    G = ``w.g``, ν = ``w.nu`` (the strong form ∇·(G(∇Ψ − ν d*)) = −E (EIxx·x − EIxy·y), traction-free
    boundaries and τ·n continuous across interfaces: natural conditions of this form)."""
    x, y = w.x
    d0 = w.EIxx * (x**2 - y**2) / 2 - w.EIxy * x * y
    d1 = w.EIxx * x * y + w.EIxy * (x**2 - y**2) / 2
    gv = grad(v)
    return w.g * w.nu * (d0 * gv[0] + d1 * gv[1]) + w.e * (w.EIxx * x - w.EIxy * y) * v


@LinearForm
def composite_shear_load_y(v, w):
    """The same for Φ (force Vy): ∫ G ν h*·∇v dA + ∫ E (EIyy·y − EIxy·x) v dA, with
    h* = (EIyy·xy − EIxy(x²−y²)/2, −EIxy·xy − EIyy(x²−y²)/2)."""
    x, y = w.x
    h0 = w.EIyy * x * y - w.EIxy * (x**2 - y**2) / 2
    h1 = -w.EIxy * x * y - w.EIyy * (x**2 - y**2) / 2
    gv = grad(v)
    return w.g * w.nu * (h0 * gv[0] + h1 * gv[1]) + w.e * (w.EIyy * y - w.EIxy * x) * v


@Functional
def x_normal(w):
    """∮ x nₓ ds on a boundary (minus the area a hole encloses, with n pointing out of the section)."""
    return w.x[0] * w.n[0]


# ----------------------------------------------------------------------------- 3-D elasticity
# Isotropic linear elasticity of a solid (fem/solid.py): u = (u_x, u_y, u_z), Lamé constants
# ``w.lam`` and ``w.mu``; ½·xᵀKx is the strain energy.


def small_strain(u):
    """ε = (∇u + ∇uᵀ)/2 of a vector field."""
    return sym_grad(u)


@BilinearForm
def elasticity(u, v, w):
    """∫ σ(u):ε(v) dV with σ = λ tr(ε) I + 2μ ε (the reference form; fem/solid.py assembles the same
    matrix from :func:`derivative_product` blocks, about ten times faster, and a test checks that
    the two agree)."""
    eu, ev = small_strain(u), small_strain(v)
    return w.lam * trace(eu) * trace(ev) + 2.0 * w.mu * ddot(eu, ev)


@LinearForm
def plain_bar_end_traction(v, w):
    """∫ t·v dS on an end face with outward normal +z, t = (τ_xz, τ_yz, σ_zz) the plain round
    bar's stress: σ_zz = ``s0`` + ``sx``·x + ``sy``·y (tension and bending), (τ_xz, τ_yz) =
    ``tau``·(−y, x) (torsion); scalars in Pa and Pa/m (the consistent nodal forces of a traction
    end, fem/solid.py)."""
    x, y = w.x[0], w.x[1]
    return (v[0] * (-w.tau * y) + v[1] * (w.tau * x)
            + v[2] * (w.s0 + w.sx * x + w.sy * y))


def derivative_product(a: int, b: int):
    """The form ∫ ∂_a u ∂_b v dV of a scalar basis (a, b = 0, 1, 2 for x, y, z). The elasticity
    matrix block of components (a, b) is λ·D_ba + μ·D_ab + μ·δ_ab·Σ_c D_cc with D_ab this form
    (rows v, columns u)."""

    @BilinearForm
    def form(u, v, _):
        return grad(u)[a] * grad(v)[b]

    return form


@Functional
def shear_moment(w):
    """∫ (x·τzy − y·τzx) dA for a shear stress (τzx, τzy) passed as ``tx``, ``ty`` (centroidal x, y):
    the moment of a shear-stress field about the origin (the shear centre's condition)."""
    return w.x[0] * w["ty"] - w.x[1] * w["tx"]


@Functional
def field_integral(w):
    """∫ t dA of a field passed as ``t`` (a shear-stress component: its resultant)."""
    return w["t"]

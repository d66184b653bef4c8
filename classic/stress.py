"""Stress state at a point: nominal stresses, principal stresses, equivalent stresses and static
factors of safety.

Coordinates: x, y in the section plane, z along the shaft, right-handed, about the centroid.
Normal stresses are positive in tension. SI throughout (m, N, N*m, m^4, Pa); every formula here is
dimensionally homogeneous, so any consistent set of units (in, lbf, lbf*in, psi) gives the same
factors of safety.

Every function accepts numpy arrays where that is natural (FE results at many points) and returns a
float for scalar input.

Results are a cross-check aid; the governing codes and standards and a licensed engineer decide.
"""
from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np

from classic._validity import OutOfRangeError, Validity

__all__ = [
    "bending_stress_round",
    "axial_stress",
    "unsymmetric_bending_stress",
    "principal_stresses",
    "shaft_mohr",
    "MohrCircle",
    "von_mises",
    "von_mises_tensor",
    "von_mises_sigma_tau",
    "tresca",
    "yield_factor_von_mises",
    "yield_factor_tresca",
    "coulomb_mohr_factor",
    "modified_mohr_factor",
]

_SHIGLEY9 = "Shigley's Mechanical Engineering Design, 9th ed."

# --- validity ranges (data) ---------------------------------------------------------------------
_D_POSITIVE = Validity("d", low=0.0, strict_low=True, unit="m", action="refuse",
                       source="a diameter must be positive")
_A_POSITIVE = Validity("A", low=0.0, strict_low=True, unit="m^2", action="refuse",
                       source="an area must be positive")
_IXX_POSITIVE = Validity("Ixx", low=0.0, strict_low=True, unit="m^4", action="refuse",
                         source="a second moment of area must be positive")
_IYY_POSITIVE = Validity("Iyy", low=0.0, strict_low=True, unit="m^4", action="refuse",
                         source="a second moment of area must be positive")
# Ixx*Iyy - Ixy^2 > 0 for any section of non-zero area (Cauchy-Schwarz); checked on the ratio.
_IXY_ADMISSIBLE = Validity("Ixy^2/(Ixx*Iyy)", low=0.0, high=1.0, strict_high=True, action="refuse",
                           source="Ixx*Iyy - Ixy^2 must be positive for a real section")
_SY_POSITIVE = Validity("Sy", low=0.0, strict_low=True, unit="Pa", action="refuse",
                        source="a yield strength must be positive")
_SUT_POSITIVE = Validity("Sut", low=0.0, strict_low=True, unit="Pa", action="refuse",
                         source="an ultimate tensile strength must be positive")
_SUC_POSITIVE = Validity("Suc", low=0.0, strict_low=True, unit="Pa", action="refuse",
                         source="Suc is the magnitude of the compressive strength, positive")
_SIGMA_VM_NONNEG = Validity("sigma_vm", low=0.0, unit="Pa", action="refuse",
                            source="a von Mises stress is never negative")
_S1_GE_S3 = Validity("s1 - s3", low=0.0, unit="Pa", action="refuse",
                     source="s1 must be the largest and s3 the smallest principal stress")


# --- helpers ------------------------------------------------------------------------------------
def _num(name: str, x) -> np.ndarray:
    """``x`` as a float array; a one-line error naming the field if it is not numeric."""
    try:
        return np.asarray(x, dtype=float)
    except (TypeError, ValueError):
        raise OutOfRangeError(name, x, "is not a number") from None


def _check(v: Validity, a: np.ndarray) -> None:
    """Apply ``v.check`` to a scalar or to every element of an array (first offender reported)."""
    if a.ndim == 0:
        v.check(float(a))
        return
    flat = a.ravel()
    bad = ~v.mask(flat)
    if bad.any():
        v.check(float(flat[np.argmax(bad)]))


def _out(a):
    """Float for a 0-d result, the array otherwise."""
    a = np.asarray(a)
    return float(a) if a.ndim == 0 else a


# --- nominal stresses ---------------------------------------------------------------------------
def bending_stress_round(M, d):
    r"""Peak bending stress on the surface of a solid round shaft.

    .. math::
        \sigma = \frac{M c}{I} = \frac{32 M}{\pi d^3}

    Parameters
    ----------
    M : float or array
        Bending moment [N*m].
    d : float or array
        Shaft diameter [m].

    Returns
    -------
    sigma : float or array
        Bending stress at the outer fibre [Pa], the sign of ``M``.

    Notes
    -----
    Euler-Bernoulli bending of a straight, prismatic, linear-elastic bar (plane sections stay
    plane). No stress concentration: multiply by Kt or Kf for a notch. ``d`` must be positive.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory): Kf*Ma = 1.58 * 1260 lbf*in on d = 1.1 in gives
    15 235 psi; in SI:

    >>> lbf_in, inch, psi = 0.1129848290276167, 0.0254, 6894.757293168361
    >>> round(bending_stress_round(1.58 * 1260 * lbf_in, 1.1 * inch) / psi)
    15235

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 3-10 (sigma = Mc/I) and Sec. 7-4, eqs. 7-1..7-3 (32M/(pi d^3));
       equation numbers from memory.
    """
    M = _num("M", M)
    d = _num("d", d)
    _check(_D_POSITIVE, d)
    return _out(32.0 * M / (math.pi * d**3))


def axial_stress(F, A):
    r"""Uniform normal stress of an axial force on a cross-section.

    .. math::
        \sigma = \frac{F}{A}

    Parameters
    ----------
    F : float or array
        Axial force, positive in tension [N].
    A : float or array
        Cross-section area [m^2].

    Returns
    -------
    sigma : float or array
        Normal stress [Pa], positive in tension.

    Notes
    -----
    Away from the load application (Saint-Venant's principle); no stress concentration.
    ``A`` must be positive.

    Examples
    --------
    10 kN on 100 mm^2 is 100 MPa (the definition of stress, any strength-of-materials text):

    >>> axial_stress(10e3, 100e-6) / 1e6
    100.0

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 3-8 (sigma = F/A; equation number not recorded).
    """
    F = _num("F", F)
    A = _num("A", A)
    _check(_A_POSITIVE, A)
    return _out(F / A)


def unsymmetric_bending_stress(Mx, My, x, y, Ixx, Iyy, Ixy=0.0):
    r"""Bending normal stress at (x, y) for moments about both centroidal axes, with Ixy.

    Sign convention (stated, and derived here): x, y, z right-handed, z along the shaft axis and
    the outward normal of the cut face; ``Mx`` and ``My`` are the components of the bending-moment
    *vector* acting on that face, so :math:`M_x = \int y\,\sigma_z\,dA` and
    :math:`M_y = -\int x\,\sigma_z\,dA`; :math:`\sigma_z` is positive in tension;
    :math:`I_{xx} = \int y^2 dA`, :math:`I_{yy} = \int x^2 dA`, :math:`I_{xy} = \int xy\,dA` about
    the centroid. Plane sections give :math:`\sigma_z = b x + c y`; the two resultants give

    .. math::
        \sigma_z = \frac{-(M_y I_{xx} + M_x I_{xy})\,x + (M_x I_{yy} + M_y I_{xy})\,y}
                        {I_{xx} I_{yy} - I_{xy}^2}

    With :math:`I_{xy} = 0` this is :math:`\sigma_z = M_x y/I_{xx} - M_y x/I_{yy}`.
    Texts that instead define :math:`M_y' = \int x\,\sigma_z\,dA` (moment positive when it puts
    +x in tension, :math:`M_y' = -M_y`) write the same result as
    :math:`[(M_y' I_{xx} - M_x I_{xy})x + (M_x I_{yy} - M_y' I_{xy})y]/(I_{xx}I_{yy}-I_{xy}^2)`.

    Parameters
    ----------
    Mx, My : float or array
        Bending-moment vector components on the +z face [N*m].
    x, y : float or array
        Point coordinates from the centroid [m].
    Ixx, Iyy : float
        Centroidal second moments of area, :math:`\int y^2 dA` and :math:`\int x^2 dA` [m^4].
    Ixy : float, optional
        Centroidal product of area :math:`\int xy\,dA` [m^4]; 0 for a section with a symmetry axis.

    Returns
    -------
    sigma_z : float or array
        Normal stress [Pa], positive in tension.

    Notes
    -----
    Euler-Bernoulli bending of a straight prismatic bar; x, y must be measured from the centroid;
    no axial force. Refuses :math:`I_{xx} I_{yy} - I_{xy}^2 \le 0` (no real section has it).

    Examples
    --------
    A round shaft, d = 0.05 m, Mx = 1 kN*m: at the top fibre this equals 32M/(pi d^3)
    (Shigley 9th ed., Sec. 3-10, sigma = Mc/I with c = d/2):

    >>> I = math.pi * 0.05**4 / 64
    >>> s = unsymmetric_bending_stress(1e3, 0.0, 0.0, 0.025, I, I)
    >>> round(s / 1e6, 3), round(bending_stress_round(1e3, 0.05) / 1e6, 3)
    (81.487, 81.487)

    References
    ----------
    .. [1] Boresi, A. P., Schmidt, R. J., Advanced Mechanics of Materials, 6th ed., Wiley, 2003,
       Ch. 7, nonsymmetrical bending of straight beams (from memory; that text uses its own sign
       convention for the moments - the signs above are derived here from the definitions stated).
    .. [2] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 3-10, eq. 3-27 (two-plane bending with Ixy = 0; from memory).
    """
    Mx, My, x, y = (_num(n, v) for n, v in (("Mx", Mx), ("My", My), ("x", x), ("y", y)))
    Ixx, Iyy, Ixy = (_num(n, v) for n, v in (("Ixx", Ixx), ("Iyy", Iyy), ("Ixy", Ixy)))
    _check(_IXX_POSITIVE, Ixx)
    _check(_IYY_POSITIVE, Iyy)
    _check(_IXY_ADMISSIBLE, Ixy**2 / (Ixx * Iyy))
    det = Ixx * Iyy - Ixy**2
    return _out((-(My * Ixx + Mx * Ixy) * x + (Mx * Iyy + My * Ixy) * y) / det)


# --- principal stresses -------------------------------------------------------------------------
def principal_stresses(sigma_x, sigma_y, sigma_z, tau_xy, tau_yz, tau_zx):
    r"""Principal stresses of a general 3-D stress state, sorted s1 >= s2 >= s3.

    The eigenvalues of the symmetric stress tensor, i.e. the roots of

    .. math::
        s^3 - I_1 s^2 + I_2 s - I_3 = 0,\quad
        I_1 = \sigma_x+\sigma_y+\sigma_z,\;
        I_2 = \sigma_x\sigma_y + \sigma_y\sigma_z + \sigma_z\sigma_x
              - \tau_{xy}^2 - \tau_{yz}^2 - \tau_{zx}^2,\;
        I_3 = \det\boldsymbol{\sigma}

    Parameters
    ----------
    sigma_x, sigma_y, sigma_z : float or array
        Normal stresses [Pa], positive in tension.
    tau_xy, tau_yz, tau_zx : float or array
        Shear stresses [Pa].

    Returns
    -------
    (s1, s2, s3) : tuple of float or array
        Principal stresses [Pa], s1 >= s2 >= s3.

    Notes
    -----
    Valid for any symmetric stress tensor; solved with a symmetric eigenvalue routine rather than
    the cubic's closed form (no loss of accuracy at repeated roots). Arrays broadcast together.

    Examples
    --------
    Shigley 9th ed., Example 5-1(b) (from memory): sigma_x = 30, sigma_y = 70,
    tau_xy = -30 kpsi gives 86.1 and 13.9 kpsi, the third principal stress being 0:

    >>> s = principal_stresses(30.0, 70.0, 0.0, -30.0, 0.0, 0.0)
    >>> tuple(round(v, 1) for v in s)
    (86.1, 13.9, 0.0)

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 3-7, eq. 3-15 (the cubic; from memory of the number).
    """
    comps = [_num(n, v) for n, v in (("sigma_x", sigma_x), ("sigma_y", sigma_y),
                                     ("sigma_z", sigma_z), ("tau_xy", tau_xy),
                                     ("tau_yz", tau_yz), ("tau_zx", tau_zx))]
    for name, c in zip(("sigma_x", "sigma_y", "sigma_z", "tau_xy", "tau_yz", "tau_zx"), comps):
        if np.isnan(c).any():
            raise OutOfRangeError(name, float(c.ravel()[np.argmax(np.isnan(c.ravel()))]),
                                  "is not a number")
    sx, sy, sz, txy, tyz, tzx = np.broadcast_arrays(*comps)
    T = np.empty(sx.shape + (3, 3))
    T[..., 0, 0], T[..., 1, 1], T[..., 2, 2] = sx, sy, sz
    T[..., 0, 1] = T[..., 1, 0] = txy
    T[..., 1, 2] = T[..., 2, 1] = tyz
    T[..., 2, 0] = T[..., 0, 2] = tzx
    w = np.linalg.eigvalsh(T)  # ascending
    # +0.0 turns an eigenvalue of -0.0 into 0.0 (display only; same number)
    return _out(w[..., 2] + 0.0), _out(w[..., 1] + 0.0), _out(w[..., 0] + 0.0)


class MohrCircle(NamedTuple):
    """Mohr's circle of a shaft point (normal stress along z, shear in the section plane).

    centre, radius, s1, s2, s3 in [Pa]; angle in [rad].
    """

    centre: float
    radius: float
    s1: float
    s2: float
    s3: float
    angle: float


def shaft_mohr(sigma, tau_zx, tau_zy):
    r"""Principal stresses of the shaft stress state: one normal stress and a transverse shear.

    At a point of a shaft only :math:`\sigma_z` (bending, axial) and the shear components
    :math:`\tau_{zx}, \tau_{zy}` (torsion, transverse shear) act. In the plane containing z and the
    resultant shear :math:`\tau = |(\tau_{zx}, \tau_{zy})|` Mohr's circle has

    .. math::
        c = \frac{\sigma}{2},\quad R = \sqrt{\left(\frac{\sigma}{2}\right)^2 + \tau^2},\quad
        s_1 = c + R,\; s_2 = 0,\; s_3 = c - R,\quad
        \theta_p = \tfrac12\operatorname{atan2}(2\tau, \sigma)

    Parameters
    ----------
    sigma : float or array
        Normal stress :math:`\sigma_z` [Pa], positive in tension.
    tau_zx, tau_zy : float or array
        Shear stress components on the z face [Pa].

    Returns
    -------
    MohrCircle
        ``centre`` [Pa], ``radius`` [Pa], ``s1 >= s2 = 0 >= s3`` [Pa], ``angle`` [rad]: the angle
        from the z axis to the s1 direction, turned towards the resultant shear direction, in
        [0, pi/2].

    Notes
    -----
    The third principal stress is exactly 0 (the plane normal to both z and the shear direction is
    stress free), so s1 >= 0 >= s3 always. Valid for any sigma, tau.

    Examples
    --------
    Shigley 9th ed., Example 7-1: sigma = 15 235 psi of bending with tau = 5 766 psi of torsion
    (these two from memory); the von Mises stress of s1, s3 over Sy = 82 kpsi gives the printed
    first-cycle yield factor ny = 4.50:

    >>> m = shaft_mohr(15235.0, 5766.0, 0.0)
    >>> round(82000.0 / von_mises(m.s1, m.s2, m.s3), 2)
    4.5

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 3-6, eqs. 3-10 and 3-13 (plane-stress principal stresses and
       angle; from memory of the numbers).
    """
    sigma = _num("sigma", sigma)
    tau = np.hypot(_num("tau_zx", tau_zx), _num("tau_zy", tau_zy))
    c = sigma / 2.0
    R = np.hypot(c, tau)
    s1, s3 = c + R, c - R
    angle = 0.5 * np.arctan2(2.0 * tau, sigma)
    return MohrCircle(_out(c), _out(R), _out(s1), _out(np.zeros_like(s1)), _out(s3), _out(angle))


# --- equivalent stresses ------------------------------------------------------------------------
def von_mises(s1, s2, s3):
    r"""Von Mises (distortion-energy) equivalent stress from the principal stresses.

    .. math::
        \sigma' = \sqrt{\frac{(s_1-s_2)^2 + (s_2-s_3)^2 + (s_3-s_1)^2}{2}}

    Parameters
    ----------
    s1, s2, s3 : float or array
        Principal stresses [Pa], in any order.

    Returns
    -------
    sigma_vm : float or array
        Von Mises stress [Pa], >= 0.

    Notes
    -----
    Ductile, isotropic materials with equal tensile and compressive yield strength.

    Examples
    --------
    Shigley 9th ed., Example 5-1(b) (from memory): principal stresses 86.06, 13.94, 0 kpsi
    give sigma' = 80 kpsi:

    >>> round(von_mises(86.0555, 13.9445, 0.0), 2)
    80.0

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 5-5, eq. 5-12.
    """
    s1, s2, s3 = _num("s1", s1), _num("s2", s2), _num("s3", s3)
    return _out(np.sqrt(((s1 - s2) ** 2 + (s2 - s3) ** 2 + (s3 - s1) ** 2) / 2.0))


def von_mises_tensor(sigma_x, sigma_y, sigma_z, tau_xy, tau_yz, tau_zx):
    r"""Von Mises equivalent stress from the six stress components.

    .. math::
        \sigma' = \frac{1}{\sqrt2}\sqrt{(\sigma_x-\sigma_y)^2 + (\sigma_y-\sigma_z)^2
        + (\sigma_z-\sigma_x)^2 + 6(\tau_{xy}^2 + \tau_{yz}^2 + \tau_{zx}^2)}

    Parameters
    ----------
    sigma_x, sigma_y, sigma_z : float or array
        Normal stresses [Pa].
    tau_xy, tau_yz, tau_zx : float or array
        Shear stresses [Pa].

    Returns
    -------
    sigma_vm : float or array
        Von Mises stress [Pa].

    Notes
    -----
    Same validity as :func:`von_mises`; invariant, so no principal-stress solve is needed.

    Examples
    --------
    Shigley 9th ed., Example 5-1(b) (from memory): sigma_x = 30, sigma_y = 70,
    tau_xy = -30 kpsi gives sigma' = 80 kpsi:

    >>> round(von_mises_tensor(30.0, 70.0, 0.0, -30.0, 0.0, 0.0), 6)
    80.0

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 5-5, eq. 5-14.
    """
    sx, sy, sz = _num("sigma_x", sigma_x), _num("sigma_y", sigma_y), _num("sigma_z", sigma_z)
    txy, tyz, tzx = _num("tau_xy", tau_xy), _num("tau_yz", tau_yz), _num("tau_zx", tau_zx)
    return _out(np.sqrt(((sx - sy) ** 2 + (sy - sz) ** 2 + (sz - sx) ** 2
                         + 6.0 * (txy**2 + tyz**2 + tzx**2)) / 2.0))


def von_mises_sigma_tau(sigma, tau):
    r"""Von Mises equivalent stress of one normal stress with one shear stress (shaft point).

    .. math::
        \sigma' = \sqrt{\sigma^2 + 3\tau^2}

    Parameters
    ----------
    sigma : float or array
        Normal stress [Pa].
    tau : float or array
        Shear stress magnitude [Pa] (for a shaft, :math:`|(\tau_{zx}, \tau_{zy})|`).

    Returns
    -------
    sigma_vm : float or array
        Von Mises stress [Pa].

    Notes
    -----
    The plane-stress form of eq. 5-15 with one normal stress zero; exact for the shaft state.

    Examples
    --------
    Shigley 9th ed., Example 7-1 (from memory): 15 235 psi with 5 766 psi of torsional shear:

    >>> round(von_mises_sigma_tau(15235.0, 5766.0))
    18217

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 5-5, eq. 5-15 (sigma_y = 0), and eq. 7-15.
    """
    sigma, tau = _num("sigma", sigma), _num("tau", tau)
    return _out(np.sqrt(sigma**2 + 3.0 * tau**2))


def tresca(s1, s2, s3):
    r"""Tresca (maximum-shear-stress) equivalent stress: the diameter of the largest Mohr circle.

    .. math::
        \sigma_T = \max(s_i) - \min(s_i) = s_1 - s_3 \quad (s_1 \ge s_2 \ge s_3)

    Parameters
    ----------
    s1, s2, s3 : float or array
        Principal stresses [Pa], in any order.

    Returns
    -------
    sigma_tresca : float or array
        Tresca stress, twice the maximum shear stress [Pa].

    Notes
    -----
    Ductile isotropic materials; yield predicted when it reaches Sy. Conservative against von
    Mises by at most 2/sqrt(3) (pure shear).

    Examples
    --------
    Shigley 9th ed., Example 5-1(b) (from memory): 86.06, 13.94, 0 kpsi:

    >>> round(tresca(86.0555, 13.9445, 0.0), 2)
    86.06

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 5-4, eq. 5-1 (tau_max = (s1 - s3)/2).
    """
    s = np.stack(np.broadcast_arrays(_num("s1", s1), _num("s2", s2), _num("s3", s3)))
    return _out(s.max(axis=0) - s.min(axis=0))


# --- static factors of safety -------------------------------------------------------------------
def _safe_div(num, den):
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(den > 0, num / np.where(den > 0, den, 1.0), np.inf)


def yield_factor_von_mises(Sy, sigma_vm):
    r"""Static yield factor of safety, distortion-energy (von Mises) theory.

    .. math::
        n = \frac{S_y}{\sigma'}

    Parameters
    ----------
    Sy : float or array
        Tensile yield strength [Pa].
    sigma_vm : float or array
        Von Mises stress [Pa].

    Returns
    -------
    n : float or array
        Factor of safety; ``inf`` where the stress is zero.

    Notes
    -----
    Ductile materials, Syt = Syc. ``Sy`` > 0 and ``sigma_vm`` >= 0 are required.

    Examples
    --------
    Shigley 9th ed., Example 5-1(b) (from memory): Sy = 100 kpsi, sigma' = 80 kpsi, n = 1.25:

    >>> yield_factor_von_mises(100.0, 80.0)
    1.25

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 5-5, eq. 5-19.
    """
    Sy, s = _num("Sy", Sy), _num("sigma_vm", sigma_vm)
    _check(_SY_POSITIVE, Sy)
    _check(_SIGMA_VM_NONNEG, s)
    return _out(_safe_div(Sy, s))


def yield_factor_tresca(Sy, s1, s3):
    r"""Static yield factor of safety, maximum-shear-stress (Tresca) theory.

    .. math::
        n = \frac{S_y}{s_1 - s_3}

    Parameters
    ----------
    Sy : float or array
        Tensile yield strength [Pa].
    s1, s3 : float or array
        Largest and smallest principal stresses [Pa] (include the zero one in plane stress).

    Returns
    -------
    n : float or array
        Factor of safety; ``inf`` where s1 = s3.

    Notes
    -----
    Ductile materials. Refuses s1 < s3.

    Examples
    --------
    Shigley 9th ed., Example 5-1(b) (from memory): Sy = 100 kpsi, s1 = 86.06, s3 = 0, n = 1.16:

    >>> round(yield_factor_tresca(100.0, 86.0555, 0.0), 2)
    1.16

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 5-4, eq. 5-3.
    """
    Sy, s1, s3 = _num("Sy", Sy), _num("s1", s1), _num("s3", s3)
    _check(_SY_POSITIVE, Sy)
    _check(_S1_GE_S3, s1 - s3)
    return _out(_safe_div(Sy, s1 - s3))


def coulomb_mohr_factor(s1, s3, Sut, Suc):
    r"""Factor of safety of a brittle material, brittle Coulomb-Mohr theory.

    With :math:`s_1 \ge s_3` the largest and smallest principal stresses and :math:`S_{uc} > 0`
    the magnitude of the compressive strength:

    .. math::
        n = \begin{cases}
            S_{ut}/s_1 & s_3 \ge 0 \\
            \left(\dfrac{s_1}{S_{ut}} - \dfrac{s_3}{S_{uc}}\right)^{-1} & s_1 \ge 0 \ge s_3 \\
            S_{uc}/(-s_3) & s_1 \le 0
        \end{cases}

    Parameters
    ----------
    s1, s3 : float or array
        Largest and smallest principal stresses [Pa] (include the zero one in plane stress).
    Sut : float or array
        Ultimate tensile strength [Pa].
    Suc : float or array
        Ultimate compressive strength, as a positive number [Pa].

    Returns
    -------
    n : float or array
        Factor of safety against fracture; ``inf`` at zero stress.

    Notes
    -----
    Brittle materials (cast irons); Mohr theories ignore the intermediate principal stress.
    In pure shear it predicts the shear strength :math:`S_{ut}S_{uc}/(S_{ut}+S_{uc})`.

    Examples
    --------
    Pure shear tau = Sut*Suc/(Sut+Suc) is exactly the predicted torsional strength (n = 1), for
    ASTM grade 30 cast iron, Sut = 31, Suc = 109 kpsi (Shigley 9th ed., Table A-24, from memory):

    >>> tau = 31.0 * 109.0 / (31.0 + 109.0)
    >>> round(coulomb_mohr_factor(tau, -tau, 31.0, 109.0), 12)
    1.0

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 5-9, eqs. 5-31a..c (numbering from memory).
    """
    s1, s3, Sut, Suc = _num("s1", s1), _num("s3", s3), _num("Sut", Sut), _num("Suc", Suc)
    _check(_SUT_POSITIVE, Sut)
    _check(_SUC_POSITIVE, Suc)
    _check(_S1_GE_S3, s1 - s3)
    with np.errstate(divide="ignore", invalid="ignore"):
        inv = np.where(s3 >= 0, s1 / Sut,
                       np.where(s1 <= 0, -s3 / Suc, s1 / Sut - s3 / Suc))
    return _out(_safe_div(1.0, inv))


def modified_mohr_factor(s1, s3, Sut, Suc):
    r"""Factor of safety of a brittle material, modified Mohr theory.

    With :math:`s_1 \ge s_3` the largest and smallest principal stresses and :math:`S_{uc} > 0`:

    .. math::
        n = \begin{cases}
            S_{ut}/s_1 & s_1 \ge 0,\; s_3 \ge -s_1 \\
            \left(\dfrac{(S_{uc}-S_{ut})\,s_1}{S_{uc}S_{ut}} - \dfrac{s_3}{S_{uc}}\right)^{-1}
                & s_1 \ge 0,\; s_3 < -s_1 \\
            S_{uc}/(-s_3) & s_1 \le 0
        \end{cases}

    Parameters
    ----------
    s1, s3 : float or array
        Largest and smallest principal stresses [Pa] (include the zero one in plane stress).
    Sut : float or array
        Ultimate tensile strength [Pa].
    Suc : float or array
        Ultimate compressive strength, as a positive number [Pa].

    Returns
    -------
    n : float or array
        Factor of safety against fracture; ``inf`` at zero stress.

    Notes
    -----
    Brittle materials. The first two branches meet at :math:`s_3 = -s_1`; in pure shear the
    predicted shear strength equals Sut.

    Examples
    --------
    Pure shear at tau = Sut is exactly at fracture (n = 1); grade 30 cast iron, Sut = 31,
    Suc = 109 kpsi (Shigley 9th ed., Table A-24, from memory):

    >>> modified_mohr_factor(31.0, -31.0, 31.0, 109.0)
    1.0

    References
    ----------
    .. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering Design, 9th ed.,
       McGraw-Hill, 2011, Sec. 5-9, eqs. 5-32a..c (numbering from memory).
    """
    s1, s3, Sut, Suc = _num("s1", s1), _num("s3", s3), _num("Sut", Sut), _num("Suc", Suc)
    _check(_SUT_POSITIVE, Sut)
    _check(_SUC_POSITIVE, Suc)
    _check(_S1_GE_S3, s1 - s3)
    with np.errstate(divide="ignore", invalid="ignore"):
        inv = np.where(s1 <= 0, -s3 / Suc,
                       np.where(s3 >= -s1, s1 / Sut,
                                (Suc - Sut) * s1 / (Suc * Sut) - s3 / Suc))
    return _out(_safe_div(1.0, inv))

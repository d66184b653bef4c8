"""Combined stress at every point of the section, its critical points, and the checks built on it.

At a point of a shaft section only three stresses act: the normal stress σ = σz (axial force and
bending) and the shear stress (τzx, τzy) (torsion and transverse shear). All are linear in the six
section loads L = (N, Mx, My, T, Vx, Vy), so the FE solution is kept as unit fields — σ, τzx, τzy
per unit of each load — at every point where it is read: densely along the boundary (points along
every boundary facet, from the owning element) and inside (the P2 nodes and centroid of every
element). Any load instant is then a matrix product.

Conventions (docs/case-files.md, 'Axes and sign conventions'): x, y in the section plane, z along the shaft
axis and out of the cut face, right-handed; Mx, My are the components of the bending-moment vector
(Mx = ∫y·σ dA, My = −∫x·σ dA, classic.stress.unsymmetric_bending_stress); σ is positive in tension;
T is the moment vector along +z; Vx, Vy act through the shaft axis, so a shear force off the shear
centre also twists the section (that torque is added to T point by point).

The load cycle (:class:`Cycle`): mean loads plus alternating amplitudes per source (axial, bending,
torque, shear). Their phases are not known, so the worst instant is sought over every sign
combination of the alternating sources (each equivalent stress is convex in the loads, so the worst
instant of any phase relation is one of these corners). On a rotating shaft the bending moment and
shear force are fixed in space and the section turns under them: in the section frame they rotate
with the shaft angle ψ, fully reversed at every point. Without a rotating shear force the worst ψ at
each point is known in closed form (σ(ψ) = σ0 + A·cos ψ + B·sin ψ peaks at ψ = atan2(B, A) and its
opposite, and every criterion here is monotone or convex in σ at fixed τ); with one, ψ is scanned
where a rigorous upper bound says the maximum can be, and refined.

Results are a cross-check aid; governing codes and standards and a licensed engineer decide.
"""
from __future__ import annotations

import itertools
import math
from dataclasses import dataclass, field

import numpy as np
from scipy.spatial import cKDTree
from skfem import CellBasis, ElementTriP2

from classic import properties as cp
from classic import stress as cs
from classic.fatigue import load_factor
from fem.bases import interpolate
from fem.mesh import _boundary_basis
from fem.shear import _NODES
from fem.torsion import singular_mask

#: The four load sources; each has one alternating amplitude and one phase.
SOURCES = ("axial", "bending", "torque", "shear")
#: Rows of a load vector.
LOAD_ROWS = ("N", "Mx", "My", "T", "Vx", "Vy")
_SLICES = {"axial": [0], "bending": [1, 2], "torque": [3], "shear": [4, 5]}

#: Criteria scanned over the section whatever the material (value to maximise).
STRESS_MEASURES = ("von_mises", "tresca", "sigma1", "sigma3")


# ====================================================================================== the field
@dataclass
class Field:
    """Unit stress fields at the read points. ``S[k]``, ``TX[k]``, ``TY[k]`` are σ, τzx, τzy per
    unit of load row k (N, Mx, My, T, Vx, Vy); the shear rows include the torque of a force through
    the shaft axis about the shear centre. Coordinates are those of the case's geometry."""

    xy: np.ndarray  # (2, n)
    on_boundary: np.ndarray  # (n,) bool
    facet: np.ndarray  # (n,) boundary facet of the point, -1 inside
    excluded: np.ndarray  # (n,) near a sharp re-entrant corner: unbounded stress, not used for maxima
    S: np.ndarray  # (6, n)
    TX: np.ndarray  # (6, n)
    TY: np.ndarray  # (6, n)
    has_shear: bool = True
    notes: list = field(default_factory=list)

    @property
    def n(self) -> int:
        return self.xy.shape[1]

    def stress(self, L, idx=None):
        """σ, τzx, τzy for load vector(s) ``L`` (6,) or (6, k): arrays (n,) or (k, n). Whole-field
        results of single load vectors are kept (a few) for the next criterion; do not modify them."""
        L = np.asarray(L, float)
        if idx is not None:
            return L.T @ self.S[:, idx], L.T @ self.TX[:, idx], L.T @ self.TY[:, idx]
        cache = self.__dict__.setdefault("_stress", {})
        key = L.tobytes() if L.ndim == 1 else None
        if key is not None and key in cache:
            return cache[key]
        out = (L.T @ self.S, L.T @ self.TX, L.T @ self.TY)
        if key is not None:
            if len(cache) >= 16:
                cache.pop(next(iter(cache)))
            cache[key] = out
        return out


def build_field(a) -> Field:
    """Read the FE unit fields of an :class:`~compare.pairs.analysis.Analysis` at every point."""
    sm, pr, tr = a.mesh, a.props, a.torsion
    xc, yc = pr.centroid
    quad = (_NODES, np.full(_NODES.shape[1], 1.0 / _NODES.shape[1]))
    fb = _boundary_basis(sm.mesh, sm.boundary_facets, "sample")
    ib = CellBasis(sm.mesh, ElementTriP2(), quadrature=quad)
    xb3 = np.asarray(fb.global_coordinates())  # (2, facets, points per facet)
    xb = xb3.reshape(2, -1)
    xi = np.asarray(ib.global_coordinates()).reshape(2, -1)
    gb = np.asarray(interpolate(fb, tr.phi).grad).reshape(2, -1)
    gi = np.asarray(interpolate(ib, tr.phi).grad).reshape(2, -1)
    # interior reads that fall on a boundary node (vertices and edge nodes of boundary facets) are
    # dropped: the boundary is read from each facet's own element, as for every peak in the project
    bdofs = tr.basis.get_dofs().all()
    bloc = np.asarray(tr.basis.doflocs)[:, bdofs]
    dist, _ = cKDTree(bloc.T).query(xi.T)
    keep = dist > 1e-9 * sm.section.length_scale
    nb = xb.shape[1]
    xy = np.hstack([xb, xi[:, keep]])
    g = np.hstack([gb, gi[:, keep]])
    n = xy.shape[1]
    on_b = np.zeros(n, dtype=bool)
    on_b[:nb] = True
    facet = np.full(n, -1, dtype=np.int64)
    facet[:nb] = np.repeat(np.asarray(sm.boundary_facets), xb3.shape[2])
    S, TX, TY = np.zeros((6, n)), np.zeros((6, n)), np.zeros((6, n))
    S[0] = cs.axial_stress(1.0, pr.area)
    S[1] = cs.unsymmetric_bending_stress(1.0, 0.0, xy[0] - xc, xy[1] - yc, pr.Ixx, pr.Iyy, pr.Ixy)
    S[2] = cs.unsymmetric_bending_stress(0.0, 1.0, xy[0] - xc, xy[1] - yc, pr.Ixx, pr.Iyy, pr.Ixy)
    # Prandtl stress function: τzx = (T/J) ∂φ/∂y, τzy = −(T/J) ∂φ/∂x
    TX[3], TY[3] = g[1] / tr.J, -g[0] / tr.J
    notes = []
    has_shear = a.shear is not None
    if has_shear:
        sr = a.shear
        fbc = _boundary_basis(sr.basis.mesh, sm.boundary_facets, "sample")
        ibc = CellBasis(sr.basis.mesh, ElementTriP2(), quadrature=quad)
        (bxx, bxy), (byx, byy) = sr.unit_stresses_at(fbc)
        (ixx, ixy), (iyx, iyy) = (tuple(np.ravel(v)[keep] for v in pair) for pair in sr.unit_stresses_at(ibc))
        ux = (np.hstack([np.ravel(bxx), np.ravel(ixx)]), np.hstack([np.ravel(bxy), np.ravel(ixy)]))
        uy = (np.hstack([np.ravel(byx), np.ravel(iyx)]), np.hstack([np.ravel(byy), np.ravel(iyy)]))
        ox, oy = a.case.section.origin
        sx, sy = sr.centre
        # a force through the shaft axis = the same force through the shear centre + the torque
        # (o − s) × V about the shear centre, carried by the torsion field
        dT_dVx, dT_dVy = -(oy - sy), (ox - sx)
        TX[4], TY[4] = ux[0] + dT_dVx * TX[3], ux[1] + dT_dVx * TY[3]
        TX[5], TY[5] = uy[0] + dT_dVy * TX[3], uy[1] + dT_dVy * TY[3]
    else:
        notes.append("no transverse-shear field (material.poisson not given): shear forces cannot be applied")
    excluded = singular_mask(sm, xy)
    if excluded.any():
        notes.append(f"{int(excluded.sum())} read points within the singular radius of a sharp re-entrant corner "
                     "are not used for maxima (the exact stress there is unbounded)")
    return Field(xy, on_b, facet, excluded, S, TX, TY, has_shear, notes)


# ====================================================================================== the cycle
@dataclass
class Cycle:
    """Loads in the section frame: mean vector, one alternating amplitude vector per source, and
    on a rotating shaft the fixed-in-space bending and shear as a rotating pair (Lc, Ls):
    L(ψ) = mean + cos ψ·Lc + sin ψ·Ls (+ the alternating corners of axial and torque)."""

    mean: np.ndarray
    alt: dict  # source -> (6,) amplitude
    rotating: bool
    Lc: np.ndarray
    Ls: np.ndarray
    notes: list = field(default_factory=list)

    @property
    def alt_sources(self) -> list[str]:
        return [s for s in SOURCES if np.any(self.alt.get(s, np.zeros(6)) != 0)]

    @property
    def rotating_shear(self) -> bool:
        return self.rotating and bool(np.any(self.Lc[4:] != 0) or np.any(self.Ls[4:] != 0))

    def corners(self) -> list[tuple[dict, np.ndarray]]:
        """Every sign combination of the alternating sources: (signs, load vector)."""
        src = self.alt_sources
        out = []
        for signs in itertools.product((1.0, -1.0), repeat=len(src)):
            L = self.mean.copy()
            for s, c in zip(src, signs):
                L = L + c * self.alt[s]
            out.append((dict(zip(src, signs)), L))
        return out

    def at(self, L_fix: np.ndarray, psi: float | None) -> np.ndarray:
        if not self.rotating or psi is None:
            return L_fix
        return L_fix + math.cos(psi) * self.Lc + math.sin(psi) * self.Ls

    def describe(self) -> dict:
        def vec(L):
            return {"axial": L[0], "bending": [L[1], L[2]], "torque": L[3], "shear": [L[4], L[5]]}

        out = {"rotating": self.rotating, "mean": vec(self.mean),
               "alternating": {s: (vec(self.alt[s])[s]) for s in SOURCES if s in self.alt}}
        if self.rotating:
            out["rotating_in_space"] = {"bending": [self.Lc[1], self.Lc[2]], "shear": [self.Lc[4], self.Lc[5]]}
        out["notes"] = list(self.notes)
        return out


def load_cycle(case) -> Cycle:
    """The case's loads as a :class:`Cycle`. Steady values are the mean unless ``*_mean`` is given;
    the alternating part is ``*_alternating`` or 0; on a rotating shaft the steady bending and
    shear are fully reversed (case.py refuses a mean or alternating part for them)."""
    ld = case.loads
    steady = {"axial": [ld.axial], "bending": list(ld.bending), "torque": [ld.torque],
              "shear": list(ld.shear) if ld.shear is not None else [0.0, 0.0]}
    mean, Lc, Ls = np.zeros(6), np.zeros(6), np.zeros(6)
    alt: dict = {}
    notes = []

    def as_list(v):
        return list(v) if isinstance(v, (list, tuple)) else [v]

    for s in SOURCES:
        rows = _SLICES[s]
        if case.loads.rotating and s in ("bending", "shear"):
            v = steady[s]
            if s == "bending":
                Lc[1], Lc[2] = v[0], v[1]
                Ls[1], Ls[2] = v[1], -v[0]
            else:
                Lc[4], Lc[5] = v[0], v[1]
                Ls[4], Ls[5] = v[1], -v[0]
            if any(v):
                notes.append(f"{s}: fixed in space on a rotating shaft — fully reversed at every point, amplitude "
                             f"|{s}| = {math.hypot(*v):.6g}, mean 0")
            continue
        m = as_list(ld.mean[s]) if s in ld.mean else steady[s]
        mean[rows] = m
        if s in ld.alternating:
            a_ = np.zeros(6)
            a_[rows] = as_list(ld.alternating[s])
            alt[s] = a_
        why = "given" if s in ld.mean else "the steady value"
        if s in ld.mean or s in ld.alternating or any(m):
            notes.append(f"{s}: mean = {why}; alternating = " + ("given" if s in ld.alternating else "0 (none given)"))
    return Cycle(mean, alt, bool(case.loads.rotating), Lc, Ls, notes)


# ====================================================================================== measures
def _mohr(sigma, tau):
    return cs.shaft_mohr(sigma, tau, 0.0 * tau)


def measure(name: str, sigma, tau, strengths: dict | None = None):
    """The quantity a criterion maximises, from σ and |τ| (arrays): an equivalent stress, or the
    inverse factor of safety for the brittle criteria (which need ``Sut``, ``Suc``)."""
    m = _mohr(sigma, tau)
    if name == "von_mises":
        return np.asarray(cs.von_mises(m.s1, m.s2, m.s3))
    if name == "tresca":
        return np.asarray(cs.tresca(m.s1, m.s2, m.s3))
    if name == "sigma1":
        return np.asarray(m.s1)
    if name == "sigma3":
        return -np.asarray(m.s3)
    if name in ("coulomb_mohr", "modified_mohr"):
        f = cs.coulomb_mohr_factor if name == "coulomb_mohr" else cs.modified_mohr_factor
        n = np.asarray(f(m.s1, m.s3, strengths["Sut"], strengths["Suc"]), float)
        with np.errstate(divide="ignore"):
            return np.where(np.isfinite(n), 1.0 / n, 0.0)
    raise ValueError(name)


def measure_bound(name: str, smax, smin, tmax, strengths: dict | None = None):
    """An upper bound of :func:`measure` over all states with smin <= σ <= smax and |τ| <= tmax
    (each measure is increasing in |τ| and monotone or convex in σ)."""
    if name in ("von_mises", "tresca"):
        S = np.maximum(np.abs(smax), np.abs(smin))
        return np.sqrt(S**2 + (3.0 if name == "von_mises" else 4.0) * tmax**2)
    s1u = smax / 2 + np.sqrt(smax**2 / 4 + tmax**2)
    s3u = -smin / 2 + np.sqrt(smin**2 / 4 + tmax**2)  # bound of −s3
    if name == "sigma1":
        return s1u
    if name == "sigma3":
        return s3u
    # the brittle criteria in the shaft state (s1 >= 0 >= s3): each branch is a·σ + b·R with b >= 0,
    # R = √(σ²/4 + τ²) the Mohr radius; bound a·σ by the right end of [smin, smax] and R by its maximum
    Sut, Suc = strengths["Sut"], strengths["Suc"]
    Rmax = np.sqrt(np.maximum(smax**2, smin**2) / 4 + tmax**2)

    def lin(a_, b_):
        return np.where(a_ >= 0, a_ * smax, a_ * smin) + b_ * Rmax

    if name == "coulomb_mohr":  # s1/Sut − s3/Suc
        return np.minimum(s1u / Sut + s3u / Suc, lin(0.5 * (1 / Sut - 1 / Suc), 1 / Sut + 1 / Suc))
    if name == "modified_mohr":  # max(s1/Sut, k·s1 − s3/Suc), k = (Suc − Sut)/(Suc·Sut)
        k = (Suc - Sut) / (Suc * Sut)
        first = np.minimum(s1u / Sut, lin(0.5 / Sut, 1 / Sut))
        second = lin(0.5 * (k - 1 / Suc), k + 1 / Suc)  # k + 1/Suc = 1/Sut > 0 for any strengths
        return np.maximum(first, second)
    raise ValueError(name)


# ====================================================================================== scanning
@dataclass
class Worst:
    """Per point, the worst value of a measure over the cycle and the instant where it occurs."""

    value: np.ndarray  # (n,) exact where ``exact``; −inf at points that cannot hold the maximum
    corner: np.ndarray  # (n,) index into Cycle.corners()
    psi: np.ndarray  # (n,) shaft angle [rad] (0 when not rotating)
    exact: np.ndarray  # (n,) bool

    def best(self, usable: np.ndarray) -> int:
        v = np.where(usable, self.value, -np.inf)
        return int(np.argmax(v))


GRID = 72  # shaft-angle samples per turn where a scan is needed (then refined by golden section)
GOLDEN_ITERS = 30  # the bracket (two grid steps) shrinks by 0.618^30 ≈ 5e-7


def _rot_parts(field_: Field, cyc: Cycle, idx=None):
    """σ = A cos ψ + B sin ψ, τ = C cos ψ + D sin ψ of the rotating loads."""
    A, CX, CY = field_.stress(cyc.Lc, idx)
    B, DX, DY = field_.stress(cyc.Ls, idx)
    return A, B, (CX, CY), (DX, DY)


def _state(sf, tfx, tfy, A, B, C, D, psi):
    """σ and |τ| at angles ``psi`` (broadcast with the per-point arrays)."""
    c, s = np.cos(psi), np.sin(psi)
    sig = sf + A * c + B * s
    tx = tfx + C[0] * c + D[0] * s
    ty = tfy + C[1] * c + D[1] * s
    return sig, np.hypot(tx, ty)


#: Points whose exact value is computed first, to give the pruning its lower bound.
TOP_K = 256


def worst_over_cycle(field_: Field, cyc: Cycle, name: str, strengths: dict | None = None) -> Worst:
    """The worst value of measure ``name`` over the load cycle, at every point that can hold the
    maximum (see module notes). A cheap upper bound is taken everywhere; the exact value (through
    :mod:`classic.stress`) at the TOP_K points of largest bound gives a true lower bound; only points
    whose bound reaches it are evaluated exactly (and, with a rotating shear force, scanned over ψ).
    Elsewhere ``value`` is −inf: those points cannot hold the maximum."""
    n = field_.n
    best = Worst(np.full(n, -np.inf), np.zeros(n, dtype=np.int64), np.zeros(n), np.zeros(n, dtype=bool))
    usable = ~field_.excluded
    if cyc.rotating:
        A, B, C, D = _rot_parts(field_, cyc)
        amp = np.hypot(A, B)
        psi0 = np.arctan2(B, A)
        trot = np.sqrt(C[0] ** 2 + C[1] ** 2 + D[0] ** 2 + D[1] ** 2)
    else:
        A = B = amp = psi0 = trot = np.zeros(n)
        C = D = (np.zeros(n), np.zeros(n))
    for k, (_, L) in enumerate(cyc.corners()):
        sf, tfx, tfy = field_.stress(L)
        ub = measure_bound(name, sf + amp, sf - amp, np.hypot(tfx, tfy) + trot, strengths)
        ub = np.where(usable, ub, -np.inf)

        def exact(idx, scan=True):
            """Value and ψ at the closed-form angles (σ extremes), then the scan if shear rotates."""
            if not cyc.rotating:
                return measure(name, sf[idx], np.hypot(tfx[idx], tfy[idx]), strengths), np.zeros(len(idx))
            cand = np.stack([psi0[idx], psi0[idx] + math.pi])
            st = (sf[idx], tfx[idx], tfy[idx], A[idx], B[idx], (C[0][idx], C[1][idx]), (D[0][idx], D[1][idx]))
            vals = np.stack([measure(name, *_state(*st, p), strengths) for p in cand])
            j = np.argmax(vals, axis=0)
            r = np.arange(len(idx))
            v, p = vals[j, r], cand[j, r]
            if cyc.rotating_shear and scan:
                v, p = _scan(name, strengths, *st, p, v)
            return v, p

        top = np.argsort(ub)[::-1][:TOP_K]
        top = top[np.isfinite(ub[top])]
        if top.size == 0:
            continue
        v_top, _ = exact(top, scan=False)  # true values: a lower bound of the maximum
        target = max(float(np.max(v_top)), float(np.max(best.value)))
        idx = np.flatnonzero(ub >= target * (1 - 1e-12) - 1e-300)
        v, p = exact(idx)
        better = v > best.value[idx]
        sel = idx[better]
        best.value[sel], best.corner[sel], best.psi[sel] = v[better], k, p[better]
        best.exact[sel] = True
    return best


def _scan(name, strengths, sf, tfx, tfy, A, B, C, D, psi_start, v_start, period=2 * math.pi):
    """Maximise a measure over ψ for a few points: a grid, then golden section around the best."""
    grid = np.linspace(0.0, period, GRID, endpoint=False)
    P = np.concatenate([grid[None, :].repeat(len(sf), 0), psi_start[:, None]], axis=1)

    def f(p):
        return measure(name, *_state(sf[:, None], tfx[:, None], tfy[:, None], A[:, None], B[:, None],
                                     (C[0][:, None], C[1][:, None]), (D[0][:, None], D[1][:, None]), p), strengths)

    vals = f(P)
    j = np.argmax(vals, axis=1)
    p0 = P[np.arange(len(sf)), j]
    h = period / GRID
    lo, hi = p0 - h, p0 + h
    g = (math.sqrt(5) - 1) / 2
    for _ in range(GOLDEN_ITERS):
        x1, x2 = hi - g * (hi - lo), lo + g * (hi - lo)
        left = f(x1[:, None])[:, 0] > f(x2[:, None])[:, 0]  # the maximum lies in [lo, x2]
        hi, lo = np.where(left, x2, hi), np.where(left, lo, x1)
    pm = (lo + hi) / 2
    r = np.arange(len(sf))
    cand_p = np.stack([p0, pm, psi_start], axis=1)
    cand_v = np.stack([vals[r, j], f(pm[:, None])[:, 0], v_start], axis=1)
    k = np.argmax(cand_v, axis=1)
    return cand_v[r, k], np.mod(cand_p[r, k], period)


# ====================================================================================== fatigue stresses
#: Shigley 9th ed., Sec. 6-14 (combination of loading modes, eq. 6-66; from memory): with bending
#: and axial fatigue loads together, the axial alternating stress is divided by the axial load
#: factor kc = 0.85 and the endurance limit is the bending one.
AXIAL_KC_SOURCE = "Shigley's Mechanical Engineering Design, 9th ed., Sec. 6-14, eq. 6-66 (from memory)"


@dataclass
class FatigueStresses:
    """Von Mises alternating and mean stresses at every point [Pa] (alternating parts combined
    conservatively: magnitudes of the sources added, as their phases are not known)."""

    sa: np.ndarray  # exact where ``exact``; elsewhere the pair (sa_lb, sa_ub) brackets it
    sm: np.ndarray
    sa_ub: np.ndarray
    exact: np.ndarray
    psi: np.ndarray  # worst shaft angle of the alternating part (rotating)
    refine: object = None  # callable(idx) -> exact sa at those points

    def pareto(self, usable: np.ndarray) -> np.ndarray:
        """Indices of the points no other point dominates in (σa', σm'): every fatigue criterion
        here decreases in both, so its smallest factor of safety is among them."""
        key = usable.tobytes()
        memo = self.__dict__.setdefault("_pareto_memo", {})
        if key not in memo:
            memo[key] = self._pareto(usable)
        return memo[key]

    def _pareto(self, usable: np.ndarray) -> np.ndarray:
        idx = np.flatnonzero(usable)
        # points whose upper bound cannot reach the staircase of lower bounds are dominated
        order = idx[np.lexsort((-self.sa[idx], -self.sm[idx]))]
        stair = np.maximum.accumulate(self.sa[order])
        cand = order[self.sa_ub[order] >= stair]
        todo = cand[~self.exact[cand]]
        if todo.size and self.refine is not None:
            self.sa[todo], self.psi[todo] = self.refine(todo)
            self.sa_ub[todo] = self.sa[todo]
            self.exact[todo] = True
        order = cand[np.lexsort((-self.sm[cand], -self.sa[cand]))]
        m = self.sm[order]
        prev = np.concatenate([[-np.inf], np.maximum.accumulate(m)[:-1]])
        return order[m > prev]


def fatigue_stresses(field_: Field, cyc: Cycle, kc_axial: float) -> FatigueStresses:
    sig_m, tmx, tmy = field_.stress(cyc.mean)
    sm = np.asarray(cs.von_mises_sigma_tau(sig_m, np.hypot(tmx, tmy)))
    n = field_.n
    s_na, t_na = np.zeros(n), np.zeros(n)  # non-rotating alternating: |σ| and |τ| added per source
    for s in cyc.alt_sources:
        sg, tx, ty = field_.stress(cyc.alt[s])
        s_na += np.abs(sg) / (kc_axial if s == "axial" else 1.0)
        t_na += np.hypot(tx, ty)
    if not cyc.rotating:
        sa = np.asarray(cs.von_mises_sigma_tau(s_na, t_na))
        return FatigueStresses(sa, sm, sa.copy(), np.ones(n, dtype=bool), np.zeros(n))
    A, B, C, D = _rot_parts(field_, cyc)
    amp = np.hypot(A, B)
    psi0 = np.arctan2(B, A)

    def sa_at(idx, psi):
        c, s = np.cos(psi), np.sin(psi)
        sg = np.abs(A[idx, None] * c + B[idx, None] * s) + s_na[idx, None]
        t = np.hypot(C[0][idx, None] * c + D[0][idx, None] * s, C[1][idx, None] * c + D[1][idx, None] * s) + t_na[idx, None]
        return np.asarray(cs.von_mises_sigma_tau(sg, t))

    all_ = np.arange(n)
    sa = sa_at(all_, psi0[:, None])[:, 0]
    if not cyc.rotating_shear:
        return FatigueStresses(sa, sm, sa.copy(), np.ones(n, dtype=bool), np.mod(psi0, math.pi))
    ub = np.asarray(cs.von_mises_sigma_tau(amp + s_na, np.sqrt(C[0] ** 2 + C[1] ** 2 + D[0] ** 2 + D[1] ** 2) + t_na))

    def refine(idx):
        period = math.pi  # |alternating| repeats every half turn
        grid = np.linspace(0.0, period, GRID // 2, endpoint=False)
        P = np.concatenate([grid[None, :].repeat(len(idx), 0), psi0[idx, None]], axis=1)
        vals = sa_at(idx, P)
        j = np.argmax(vals, axis=1)
        r = np.arange(len(idx))
        p0 = P[r, j]
        h = period / (GRID // 2)
        lo, hi = p0 - h, p0 + h
        g = (math.sqrt(5) - 1) / 2
        for _ in range(GOLDEN_ITERS):
            x1, x2 = hi - g * (hi - lo), lo + g * (hi - lo)
            f1, f2 = sa_at(idx, x1[:, None])[:, 0], sa_at(idx, x2[:, None])[:, 0]
            left = f1 > f2
            hi, lo = np.where(left, x2, hi), np.where(left, lo, x1)
        pm = (lo + hi) / 2
        cand_p = np.stack([p0, pm], axis=1)
        cand_v = np.stack([vals[r, j], sa_at(idx, pm[:, None])[:, 0]], axis=1)
        k = np.argmax(cand_v, axis=1)
        return cand_v[r, k], np.mod(cand_p[r, k], period)

    return FatigueStresses(sa, sm, ub, np.zeros(n, dtype=bool), np.mod(psi0, math.pi), refine)


# ====================================================================================== point reports
def point_state(field_: Field, cyc: Cycle, i: int, corner: int, psi: float | None) -> dict:
    """The full stress state at point ``i`` at one instant of the cycle: components, principal
    stresses and directions, maximum shear, equivalents, Mohr's circles."""
    L = cyc.at(cyc.corners()[corner][1], psi if cyc.rotating else None)
    sg, tx, ty = (float(v[0]) for v in field_.stress(L, np.array([i])))
    return stress_report(sg, tx, ty) | {"instant": instant_report(cyc, corner, psi, L)}


def stress_report(sigma: float, tau_zx: float, tau_zy: float) -> dict:
    tau = math.hypot(tau_zx, tau_zy)
    m = cs.shaft_mohr(sigma, tau_zx, tau_zy)
    s1, s2, s3, th = m.s1, m.s2, m.s3, m.angle
    et = (tau_zx / tau, tau_zy / tau) if tau > 0 else (1.0, 0.0)
    n1 = [math.sin(th) * et[0], math.sin(th) * et[1], math.cos(th)]
    n3 = [math.cos(th) * et[0], math.cos(th) * et[1], -math.sin(th)]
    n2 = [-et[1], et[0], 0.0]
    return {
        "sigma": sigma, "tau_zx": tau_zx, "tau_zy": tau_zy, "tau": tau,
        "shear_direction_deg": math.degrees(math.atan2(tau_zy, tau_zx)) if tau > 0 else None,
        "sigma1": s1, "sigma2": s2, "sigma3": s3,
        "angle_deg": math.degrees(th),
        "directions": {"sigma1": n1, "sigma2": n2, "sigma3": n3},
        "tau_max": (s1 - s3) / 2, "tau_max_in_plane": m.radius,
        "von_mises": float(cs.von_mises(s1, s2, s3)), "tresca": float(cs.tresca(s1, s2, s3)),
        "mohr": {
            "centre": m.centre, "radius": m.radius,
            "points": {"z_face": [sigma, tau], "shear_direction_face": [0.0, -tau]},
            "circles": [{"between": "sigma1-sigma3", "centre": (s1 + s3) / 2, "radius": (s1 - s3) / 2},
                        {"between": "sigma1-sigma2", "centre": (s1 + s2) / 2, "radius": (s1 - s2) / 2},
                        {"between": "sigma2-sigma3", "centre": (s2 + s3) / 2, "radius": (s2 - s3) / 2}],
            "double_angle_deg": math.degrees(2 * th),
        },
    }


def instant_report(cyc: Cycle, corner: int, psi, L) -> dict:
    signs = cyc.corners()[corner][0]
    out = {"loads": {"axial": L[0], "bending": [L[1], L[2]], "torque": L[3], "shear": [L[4], L[5]]},
           "alternating_signs": signs}
    if cyc.rotating:
        out["shaft_angle_deg"] = math.degrees(psi) % 360.0
    return out


def _kc_axial() -> float:
    return load_factor("axial")


def _point_entry(a, fld: Field, cyc: Cycle, i: int, w: Worst, criterion: str) -> dict:
    psi = float(w.psi[i]) if cyc.rotating else None
    st = point_state(fld, cyc, i, int(w.corner[i]), psi)
    at = [float(fld.xy[0, i]), float(fld.xy[1, i])]
    return {"criterion": criterion, "at": at, "where": where_of(a, fld, i), "on_boundary": bool(fld.on_boundary[i]), **st}


def where_of(a, fld: Field, i: int) -> dict:
    """Words for read point ``i`` (:meth:`Analysis.where` on the boundary), cached per point."""
    cache = fld.__dict__.setdefault("_where", {})
    if i not in cache:
        at = [float(fld.xy[0, i]), float(fld.xy[1, i])]
        if fld.on_boundary[i]:
            cache[i] = a.where(at)
        else:
            ox, oy = a.case.section.origin
            cache[i] = {"at": at, "boundary": None, "feature": None, "radius": None, "keyway": None,
                        "angle_deg": math.degrees(math.atan2(at[1] - oy, at[0] - ox)) % 360.0,
                        "distance_from_axis": math.hypot(at[0] - ox, at[1] - oy)}
    return dict(cache[i])


def kt_bending_2d(a, fld: Field) -> dict | None:
    """σmax of the section per unit bending moment, over the worst moment direction, relative to the
    plain-shaft nominal 32M/(πd³) (Mc/I of the hollow round with a bore)."""
    s = a.case.section
    if not s.nominal:
        return None
    usable = ~fld.excluded
    per_moment = float(np.max(np.where(usable, np.hypot(fld.S[1], fld.S[2]), -np.inf)))
    if s.bore:
        nominal = cp.tube_extreme_fibre(s.nominal, s.bore) / cp.tube_second_moment(s.nominal, s.bore)
        formula = "M·(D/2)/I of the hollow round (full diameter and bore)"
    else:
        nominal = cs.bending_stress_round(1.0, s.nominal)
        formula = "32·M/(π·d³) on the full diameter"
    return {"value": per_moment / nominal, "nominal_per_moment": nominal, "fe_per_moment": per_moment,
            "formula": formula,
            "meaning": "2-D ratio of the prismatic section (worst bending direction): the second moment lost to "
                       "the cut and the shifted neutral axis. A 2-D section has no bending notch effect; the 3-D "
                       "concentration at a keyseat end is not in it (give fatigue.kt_bending from a chart for that)."}

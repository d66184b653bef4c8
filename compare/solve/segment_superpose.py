"""The local stresses of a 3-D segment (compare/solve/segments.py) under a station's loads, by
superposition of its unit-load results. Numbers only.

Each load case of the segment study (tension, bending about x, bending about y, torsion) gives the
stress tensor at every surface sample point of the finest mesh (``SolidResult.stress``, (3, 3, n))
and the load the model carried through its end face (``SolidResult.load``: N, ∫y·σ dA, ∫x·σ dA, T).
The elasticity problem is linear, so the stress for any loads is the sum of the unit results scaled
by load / carried load — the same as scaling each by its nominal stress (σ_nom(load) / σ_nom(carried)).
The signs follow the section's convention (docs/case-files.md, 'Axes and sign conventions'):
Mx = ∫y·σ dA, My = −∫x·σ dA, so the model's bending about y (which carried ∫x·σ dA) enters with −My.

A station's feature may sit at another angle round the shaft than the model's (a keyseat on +y, a
cross hole along x): the unit fields are turned about the shaft axis into the station's frame (the
points, the moment vectors and the stress tensors).

The load cycle (rotating shaft, loads fixed in space): the section turns under the bending moment,
so at the shaft angle ψ the bending stress at a point is cos ψ·A + sin ψ·B with A, B the stresses of
the moment's magnitude M about x and about y of the section; it is fully reversed at every point.
The steady axial force and torque give the mean stress m. Following the von Mises combination of
the alternating and of the mean stress components (Shigley's Mechanical Engineering Design, 9th ed.,
Sec. 6-14, 'Combinations of loading modes'), the alternating equivalent stress is the von Mises
stress of the bending's stress amplitude, largest over ψ, and the mean one the von Mises stress of
m. The von Mises stress squared is a quadratic form Q of the tensor (3/2 of the deviator's square),
so of the alternating part it is a·cos²ψ + b·sin²ψ + 2h·sinψ·cosψ (a = Q(A), b = Q(B), h = Q(A, B)),
largest at (a + b)/2 + √(((a − b)/2)² + h²) — exact, no scan. The peak static von Mises stress over
the turn, of m + cos ψ·A + sin ψ·B, is a trigonometric polynomial of degree 2 in ψ; it is sampled on
:data:`N_ANGLES` angles per turn (a step of 0.5°: the relative error at a smooth maximum is below
1 − cos 0.25° ≈ 1e-5). A shaft standing still: the moment has a known direction in the section, every
stress is a mean stress, one instant.

Criteria other than von Mises (Tresca, Coulomb–Mohr) need the principal stresses; they are evaluated at
every sampled angle on the points that can reach the worst value: a criterion g with g(σ) ≤ c·‖σ‖
(Frobenius norm) cannot exceed c·(‖m‖ + √(‖A‖² + ‖B‖²)) at a point, and Tresca's σ1 − σ3 ≤ (2/√3)·σ_vM
(Mohr's circles) cannot exceed (2/√3)·√(Q(m) + 2·√(Q(m, A)² + Q(m, B)²) + σa'²) there (each part of the
von Mises stress squared at its own largest), so only points where the bound reaches the value already
found at the von Mises-worst instants are scanned (a rigorous pruning, not a sample). The largest
principal stress σ1 = tr σ/3 + (the deviator's largest) ≤ tr σ/3 + (2/3)·σ_vM is pruned the same way.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from fem.solid import PEAK_END_ZONE

#: Sampled shaft angles per turn for the static peak on a rotating shaft.
N_ANGLES = 720
#: Points per block when angles are sampled (memory: block × N_ANGLES floats).
BLOCK = 2048
#: Points per block when principal stresses are scanned over the angles (block × N_ANGLES 3×3 tensors).
SCAN_BLOCK = 256
LOADS = ("tension", "bending_x", "bending_y", "torsion")
#: The angle round the shaft [deg, from +x toward +y] where each model kind has its feature: the
#: keyseats on +y, the cross hole's axis along x.
MODEL_ANGLE = {"keyseat_end": 90.0, "sled_runner": 90.0, "cross_hole": 0.0, "cavity": 0.0}


@dataclass
class UnitFields:
    """Stress per unit station load at the surface points, in the station's frame: ``points`` (3, n)
    [m] (z along the model), ``S`` (4, 3, 3, n) [Pa per N or N·m] for N, Mx, My, T (the section's
    convention), ``keep`` (n,) points away from the model's end faces, ``nominal_per_unit`` (4,) the
    plain-bar nominal stress of a unit load, ``d`` [m]."""

    points: np.ndarray
    S: np.ndarray
    keep: np.ndarray
    nominal_per_unit: np.ndarray
    d: float
    turn: float = 0.0  # [deg] the model's frame turned by this about z into the station's


def _rot(deg: float) -> np.ndarray:
    c, s = math.cos(math.radians(deg)), math.sin(math.radians(deg))
    return np.array([[c, -s, 0.0], [s, c, 0.0], [0.0, 0.0, 1.0]])


def surface_points(r):
    """The surface points the factors are read at: the lateral boundary's nodes with the nodal-averaged
    stress where the solver gives them (fem.solid.recovered_surface_stresses), else the sample points."""
    node = getattr(r, "node_points", None)
    return r.points if node is None else node


def surface_stress(r):
    node = getattr(r, "node_stress", None)
    return r.stress if node is None else node


def unit_fields(finest: dict, d: float, length: float, turn: float = 0.0, end_zone: float = PEAK_END_ZONE,
                mirror: bool = False, far_d: float | None = None) -> UnitFields:
    """From the finest mesh's results {load: SolidResult} (or any object with ``load``, ``points``,
    ``stress``), the stress per unit N, Mx, My, T, turned by ``turn`` degrees about the shaft axis
    (model frame to station frame). Points within ``end_zone`` diameters of an end face are marked
    off in ``keep`` (the solver's own margin, fem.solid.PEAK_END_ZONE: the end faces carry the prescribed
    displacement or traction), each end in its own diameter: ``d`` at the model's z = 0, ``far_d`` at
    its z = length (D beyond a shoulder in the model; d when not given).

    ``mirror``: the station's part is the model reflected in its mid-length plane (z → length − z; a
    shoulder stepping down along the shaft, modelled stepping up). The reflected field solves the
    reflected part (linear elasticity is invariant under reflections): its stress is QσQ, Q = diag(1, 1,
    −1) (the shear components τ_xz, τ_yz change sign); the axial force and the moments ∫yσ_zz dA,
    ∫xσ_zz dA keep theirs, the torque ∫(xτ_yz − yτ_xz) dA changes sign, so the reflected unit torque's
    field is −QσQ of the model's."""
    missing = [k for k in LOADS if k not in finest]
    if missing:
        raise ValueError(f"the segment study has no {', '.join(missing)} result")
    pts = np.asarray(surface_points(finest["tension"]), float)
    for k in LOADS:
        if np.asarray(surface_points(finest[k])).shape != pts.shape or not np.allclose(surface_points(finest[k]), pts, rtol=0,
                                                                                  atol=1e-12 * d):
            raise ValueError("the unit-load results are not on the same surface points")
    per = {k: np.asarray(surface_stress(finest[k]), float) / float(finest[k].load) for k in LOADS}
    if mirror:
        q = np.array([1.0, 1.0, -1.0])
        per = {k: v * (q[:, None, None] * q[None, :, None]) * (-1.0 if k == "torsion" else 1.0) for k, v in per.items()}
        pts = pts.copy()
        pts[2] = length - pts[2]
    R = _rot(turn)
    c, s = math.cos(math.radians(turn)), math.sin(math.radians(turn))
    # a unit moment (Mx, My) of the station is R(−turn)·(Mx, My) in the model; the model's bending_y
    # carried ∫x·σ dA = −My_model
    def moment(mx, my):
        mxm, mym = c * mx + s * my, -s * mx + c * my
        return mxm * per["bending_x"] - mym * per["bending_y"]

    model = [per["tension"], moment(1.0, 0.0), moment(0.0, 1.0), per["torsion"]]
    S = np.stack([np.einsum("ia,abn,jb->ijn", R, m, R) for m in model])
    z = pts[2]
    d0, d1 = (d, d if far_d is None else far_d)[:: -1 if mirror else 1]  # the model's ends, reflected with it
    keep = (z > end_zone * d0) & (z < length - end_zone * d1)
    nom = np.array([4 / (math.pi * d**2), 32 / (math.pi * d**3), 32 / (math.pi * d**3), 16 / (math.pi * d**3)])
    return UnitFields(R @ pts, S, keep, nom, d, turn)


def _dev_form(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Q(a, b) = 3/2 dev(a):dev(b) over the points (a, b: (3, 3, n)); Q(a, a) is the von Mises stress squared."""
    ta, tb = np.einsum("ii...->...", a), np.einsum("ii...->...", b)
    return 1.5 * (np.einsum("ij...,ij...->...", a, b) - ta * tb / 3.0)


def von_mises(s: np.ndarray) -> np.ndarray:
    """The von Mises stress of tensors (3, 3, ...)."""
    return np.sqrt(np.maximum(_dev_form(s, s), 0.0))


def principal(s: np.ndarray) -> np.ndarray:
    """Principal stresses, ascending, of tensors (3, 3, ...) -> (..., 3)."""
    return np.linalg.eigvalsh(np.moveaxis(np.moveaxis(s, 0, -1), 0, -1))


@dataclass
class Superposed:
    """The station's local stresses at the kept surface points ``idx`` of the unit fields:
    ``mean`` (3, 3, n) the steady part (a standing shaft: the whole stress), ``A``, ``B`` (3, 3, n) the
    bending of the moment's magnitude about x and about y (a rotating shaft; zeros standing),
    ``vm_peak`` (n,) the largest von Mises stress over the turn and ``psi_peak`` (n,) its angle [rad],
    ``sa``, ``sm`` (n,) the alternating and mean von Mises stresses."""

    fields: UnitFields
    idx: np.ndarray
    loads: dict
    rotating: bool
    mean: np.ndarray
    A: np.ndarray
    B: np.ndarray
    vm_peak: np.ndarray
    psi_peak: np.ndarray
    sa: np.ndarray
    sm: np.ndarray
    vm_bound: np.ndarray  # (n,) an upper bound of the von Mises stress over the turn (module docstring)

    @property
    def points(self) -> np.ndarray:
        return self.fields.points[:, self.idx]

    def at(self, i, psi) -> np.ndarray:
        """The stress tensor(s) at point(s) ``i`` and shaft angle(s) ``psi`` (0 on a standing shaft)."""
        return self.mean[..., i] + np.cos(psi) * self.A[..., i] + np.sin(psi) * self.B[..., i]

    def angles(self) -> np.ndarray:
        return np.arange(N_ANGLES) * (2 * math.pi / N_ANGLES) if self.rotating else np.zeros(1)

    def worst(self, g, c: float, of: str = "norm") -> tuple[float, int, float]:
        """Largest of the criterion ``g`` (principal stresses (..., 3) -> value) over the points and the
        turn, with g(σ) ≤ c·‖σ‖ (``of="norm"``, Frobenius), g(σ) ≤ c·σ_vM (``of="von_mises"``) or
        g(σ) ≤ c·σ1 (``of="sigma1"``):
        (value, point index, angle [rad]); the pruning is in the module docstring."""
        i0 = np.arange(len(self.idx))
        first = g(principal(self.at(i0, self.psi_peak)))
        best = float(np.max(first))
        if of == "von_mises":
            bound = c * self.vm_bound
        elif of == "sigma1":  # σ1 = tr σ/3 + (deviator's largest) ≤ tr σ/3 + (2/3)·σ_vM, each part at its largest
            tr = lambda t: np.einsum("ii...->...", t)  # noqa: E731
            bound = c * ((tr(self.mean) + np.hypot(tr(self.A), tr(self.B))) / 3 + 2 * self.vm_bound / 3)
        else:
            fro = lambda t: np.sqrt(np.einsum("ij...,ij...->...", t, t))  # noqa: E731
            bound = c * (fro(self.mean) + np.sqrt(fro(self.A) ** 2 + fro(self.B) ** 2))
        cand = np.nonzero(bound >= best * (1 - 1e-12))[0]
        th = self.angles()
        val, ib, pb = best, int(np.argmax(first)), float(self.psi_peak[int(np.argmax(first))])
        for lo in range(0, len(cand), SCAN_BLOCK):
            ii = cand[lo:lo + SCAN_BLOCK]
            t = (self.mean[..., ii, None] + np.cos(th) * self.A[..., ii, None] + np.sin(th) * self.B[..., ii, None])
            v = g(principal(t))  # (len(ii), K)
            k = np.unravel_index(int(np.argmax(v)), v.shape)
            if v[k] > val:
                val, ib, pb = float(v[k]), int(ii[k[0]]), float(th[k[1]])
        return val, ib, pb


def superpose(f: UnitFields, N: float, Mx: float, My: float, T: float, rotating: bool) -> Superposed:
    """The local stresses of the loads (N [N], Mx, My, T [N·m], the section's convention) at the kept
    points (module docstring: a rotating shaft's bending turns under the section)."""
    idx = np.nonzero(f.keep)[0]
    S = f.S[..., idx]
    mean = N * S[0] + T * S[3]
    if rotating:
        M = math.hypot(Mx, My)
        A, B = M * S[1], M * S[2]
    else:
        mean = mean + Mx * S[1] + My * S[2]
        A = B = np.zeros_like(mean)
    n = len(idx)
    if rotating:
        qa, qb, qh = _dev_form(A, A), _dev_form(B, B), _dev_form(A, B)
        sa = np.sqrt(np.maximum((qa + qb) / 2 + np.hypot((qa - qb) / 2, qh), 0.0))
        sm = von_mises(mean)
        q0, q1, q2 = _dev_form(mean, mean), _dev_form(mean, A), _dev_form(mean, B)
        th = np.arange(N_ANGLES) * (2 * math.pi / N_ANGLES)
        c, s = np.cos(th), np.sin(th)
        # von Mises squared over the turn: q0 + 2(q1 cos ψ + q2 sin ψ) + (the alternating part's form), each
        # part at most its own largest value: a rigorous bound for the pruning
        vm_bound = np.sqrt(np.maximum(q0 + 2 * np.hypot(q1, q2) + sa**2, 0.0))
        vm_peak, psi_peak = np.empty(n), np.empty(n)
        for lo in range(0, n, BLOCK):
            sl = slice(lo, lo + BLOCK)
            v = (q0[sl, None] + 2 * c * q1[sl, None] + 2 * s * q2[sl, None] + c * c * qa[sl, None]
                 + s * s * qb[sl, None] + 2 * c * s * qh[sl, None])
            k = np.argmax(v, axis=1)
            vm_peak[sl] = np.sqrt(np.maximum(v[np.arange(len(k)), k], 0.0))
            psi_peak[sl] = th[k]
    else:
        vm_peak = von_mises(mean)
        psi_peak = np.zeros(n)
        sa, sm = np.zeros(n), vm_peak
        vm_bound = vm_peak
    return Superposed(f, idx, {"N": N, "Mx": Mx, "My": My, "T": T}, bool(rotating), mean, A, B, vm_peak, psi_peak,
                      sa, sm, vm_bound)


def summary(sp: Superposed) -> dict:
    """The numbers a station reports: the peak von Mises stress (static, over the turn) and where, the
    alternating and mean von Mises stresses at that point and at the point of the largest alternating
    stress, the largest principal stress over the turn and where."""
    i = int(np.argmax(sp.vm_peak))
    j = int(np.argmax(sp.sa)) if sp.rotating else i
    s1, k1, p1 = sp.worst(lambda p: p[..., 2], 1.0, of="sigma1")
    pts = sp.points

    def place(k):
        return [float(v) for v in pts[:, k]]

    return {"von_mises_peak": float(sp.vm_peak[i]), "von_mises_peak_at": place(i),
            "von_mises_peak_angle_deg": math.degrees(float(sp.psi_peak[i])),
            "sigma_a_vm": float(sp.sa[i]), "sigma_m_vm": float(sp.sm[i]),
            "alternating_peak": float(sp.sa[j]), "alternating_peak_mean": float(sp.sm[j]),
            "alternating_peak_at": place(j),
            "sigma1_peak": s1, "sigma1_peak_at": place(k1), "sigma1_peak_angle_deg": math.degrees(p1),
            "points": int(len(sp.idx)), "angles_per_turn": N_ANGLES if sp.rotating else 1,
            "rotating": sp.rotating}

"""How the 3-D segment's peak is read (fem/solid.py), measured on the demo's keyseat end
(cases/keyseat_end_3d.toml: d = 30 mm, 8 x 4 mm end-milled keyseat 36 mm long in a 126 mm length,
bottom fillet 0.6 mm by default, quarter model): each study (three similar meshes at one fineness, as
:func:`compare.solve.segments.study_segment` makes them) is meshed and solved once and its surface
stress read several ways:

- ``node``: the largest nodal-averaged surface stress at a boundary node (the factor as
  :func:`fem.solid.solve_segment` reads it);
- ``p2``: the largest value of the quadratic (P2) interpolant of the nodal-averaged tensors over the
  lateral facets nearest that node (sampled at 325 points per facet; a peak between nodes is found);
- ``at point``: the P2 interpolant at one fixed place, the ``p2`` peak's on the last study's finest
  mesh, on every mesh of every study. The same place on every mesh: a spread here is the solved stress's
  own, not where the nodes fall (where the peak sits at one place: a peak that moves along a ridge
  between meshes, as torsion's along the keyseat's bottom fillet, makes this no measure of scatter);
- ``disk``: the mean of the raw element values at the facet points within :data:`DISK` of that same
  place (each point weighted by a seventh of its facet's flat area, the mirror images counted): a
  smoothed value, far below the peak, whose spread between meshes shows how much of a point value's
  scatter is element-level noise that averaging removes (nan where no facet point lies in the disk).

- ``p2f``: ``p2`` where the peak is on the feature, ``node`` where it is on the plain bar (the
  interpolant overshoots on the coarse plain cylinder);
- ``free``: the largest nodal-averaged stress of the traction-free surface law: the element's strain
  projected on the surface's tangent plane (P ε P, P = I - n n with the curved facet's normal n) and
  the plane-stress law σ = E/(1 - ν²)((1 - ν) ε_t + ν tr(ε_t) P), so σ·n = 0 exactly; the normal
  strain, which the element reads worst at the boundary, is not used.

Prints per study the unknowns, the measured ratios and per load the three meshes' values and the
estimate (GCI, :func:`compare.solve.segments.study_with_notes`) of each reading,
then per load the finest meshes' spread across the studies for each reading and the whole process's
CPU seconds. Asserts nothing (not part of pytest).

With ``meshes`` 1 each study is its finest mesh alone (no estimate): the scatter between single
meshes of nearby finenesses at a third of the cost.

    python tests/benchmarks/bench_segment_reading.py [fineness,fineness,...] [fillet in mm] [local] [meshes 3|1] [ball=D,R] [per_turn=N]

``ball=D,R`` sets ``fem.solid.PEAK_BALL`` (as in bench_segment_accuracy.py), ``per_turn=N``
``fem.solid.PER_TURN`` (the plain cylinder's elements per turn at fineness 1). Each estimate is
printed with the measured ratios and, in brackets, with the nominal ratio (the balls' fields are
similar by construction, while the measured median edge mixes ball and surface sizes).
"""
from __future__ import annotations

import resource
import sys

import numpy as np

#: The readings compared (index into _read's answer, name)
READINGS = ((0, "node"), (1, "p2"), (4, "p2f"), (5, "free"))
#: Facets nearest the node maximum searched for the interpolant's maximum (about two rings).
NEAREST = 30
#: Subdivisions per facet edge of the sampling grid of the interpolant.
GRID = 24
#: Radius [m] of the disk of the ``disk`` reading: two thirds of the demo's 0.6 mm fillet, holding
#: about 15 facet points on the coarsest mesh of fineness 0.27 and 90 on the finest of 0.33.
DISK = 0.4e-3


def _cpu() -> float:
    me, kids = resource.getrusage(resource.RUSAGE_SELF), resource.getrusage(resource.RUSAGE_CHILDREN)
    return me.ru_utime + me.ru_stime + kids.ru_utime + kids.ru_stime


def _facet_nodes(sm) -> np.ndarray:
    """(facets, 6) indices into :func:`fem.solid.recovered_surface_stresses`' nodes of each lateral
    facet's corners and edge midpoints (edges 01, 12, 02), built as that function builds its keys."""
    fv = sm.mesh.facets[:, sm.lateral]
    nv = sm.mesh.nvertices
    lo = np.minimum(fv[[0, 1, 0]], fv[[1, 2, 2]])
    hi = np.maximum(fv[[0, 1, 0]], fv[[1, 2, 2]])
    keys = np.concatenate([fv, nv + lo * nv + hi]).T.ravel()
    _, inv = np.unique(keys, return_inverse=True)
    return inv.reshape(-1, 6)


def _p2_samples(npts, nsig, conn, near):
    """Points (3, q) and tensors (3, 3, q) of the P2 interpolant on the NEAREST facets to ``near``."""
    a, b = np.array([(i / GRID, j / GRID) for i in range(GRID + 1) for j in range(GRID + 1 - i)]).T
    c = 1 - a - b
    N = np.array([c * (2 * c - 1), a * (2 * a - 1), b * (2 * b - 1), 4 * c * a, 4 * a * b, 4 * c * b])
    centre = npts[:, conn].mean(axis=2)
    sel = np.argsort(np.linalg.norm(centre - near[:, None], axis=0))[:NEAREST]
    X = np.einsum("ifk,kq->ifq", npts[:, conn[sel]], N).reshape(3, -1)
    S = np.einsum("ijfk,kq->ijfq", nsig[:, :, conn[sel]], N).reshape(3, 3, -1)
    return X, S


def _fold(p, seg, symmetry):
    """A point folded into the modelled part (x >= 0; z >= length/2 for the quarter)."""
    q = np.array(p, dtype=float)
    if symmetry:
        q[0] = abs(q[0])
    if symmetry == 2:
        q[2] = seg.length / 2 + abs(q[2] - seg.length / 2)
    return q


def free_surface_stresses(sm, basis, x, E, nu):
    """Points (3, n) [m] and tensors (3, 3, n) [Pa] of the traction-free surface law (module
    docstring, ``free``) at the facet points of :func:`fem.solid.surface_stresses`."""
    from fem import solid

    fb = solid._lateral_basis(sm, basis)
    g = fb.interpolate(x).grad
    n = fb.normals.value
    P = np.eye(3)[:, :, None, None] - n[:, None] * n[None, :]
    eps = np.einsum("ik...,kl...,lj...->ij...", P, 0.5 * (g + np.swapaxes(g, 0, 1)), P)
    tr = np.einsum("ii...->...", eps)
    sig = E / (1 - nu**2) * ((1 - nu) * eps + nu * tr[None, None] * P)
    return fb.global_coordinates().value.reshape(3, -1), sig.reshape(3, 3, -1)


def _free(sm, res, load, seg):
    """The ``free`` reading over the nominal."""
    from fem import solid

    r = res[load]
    p, s = free_surface_stresses(sm, r.basis, r.x, 2.05e11, 0.29)
    npts, nsig = solid.mirrored_surface_stresses(sm, *solid.recovered_surface_stresses(sm, p, s), load)
    mag = solid.stress_measure(nsig, load)
    return float(np.max(np.where(solid.away_from_ends(seg, npts[2]), mag, -np.inf)) / r.nominal)


def _read(sm, res, load, seg):
    """node, p2 readings (over the nominal) and the data to evaluate the interpolant elsewhere."""
    from fem import solid

    r = res[load]
    npts, nsig = solid.recovered_surface_stresses(sm, r.points, r.stress)
    m = npts.shape[1]
    # the model's own nodes with the mirror planes' nodes averaged as solve_segment averages them
    _, msig = solid.mirrored_surface_stresses(sm, npts, nsig, load)
    msig = msig[:, :, :m]
    sign = np.prod([solid.PARITY[load][k] for k in range(sm.symmetry)]) if sm.symmetry else 1
    conn = _facet_nodes(sm)
    X, S = _p2_samples(npts, msig, conn, _fold(r.peak_at, seg, sm.symmetry))
    mag = solid.stress_measure(S, load)
    if sign < 0:  # a mirror image's tensor is -M sigma M: its measure is that of -sigma
        mag = np.maximum(mag, solid.stress_measure(-S, load))
    j = int(np.argmax(mag))
    keep = dict(npts=npts, msig=msig, conn=conn, sign=sign, raw=(r.points, r.stress), L=seg.length,
                symmetry=sm.symmetry, parity=solid.PARITY[load])
    p2 = float(mag[j] / r.nominal)
    return r.factor, p2, X[:, j], keep, p2 if r.peak_on_feature else r.factor, _free(sm, res, load, seg)


def _at(keep, point, load, nominal):
    from fem import solid

    X, S = _p2_samples(keep["npts"], keep["msig"], keep["conn"], point)
    j = int(np.argmin(np.linalg.norm(X - point[:, None], axis=0)))
    mag = solid.stress_measure(S[:, :, j:j + 1], load)
    if keep["sign"] < 0:
        mag = np.maximum(mag, solid.stress_measure(-S[:, :, j:j + 1], load))
    return float(mag[0] / nominal), float(np.linalg.norm(X[:, j] - point))


def _disk(keep, point, load, nominal):
    """The ``disk`` reading at ``point`` (over the nominal) and how many facet points it holds."""
    from fem import solid

    pts, sig = keep["raw"]
    nf = pts.shape[1] // 7
    cor = pts.reshape(3, nf, 7)[:, :, :3]
    area = 0.5 * np.linalg.norm(np.cross((cor[:, :, 1] - cor[:, :, 0]).T, (cor[:, :, 2] - cor[:, :, 0]).T), axis=1)
    w = np.repeat(area / 7, 7)
    mag = {1: solid.stress_measure(sig, load), -1: solid.stress_measure(-sig, load)}
    total = weight = 0.0
    count = 0
    images = [(np.ones(3), 0.0, 1)]
    if keep["symmetry"]:
        images.append((np.array([-1.0, 1.0, 1.0]), 0.0, keep["parity"][0]))
    if keep["symmetry"] == 2:
        images += [(m * np.array([1.0, 1.0, -1.0]), keep["L"], s * keep["parity"][1]) for m, _, s in list(images)]
    for m, shift, s in images:
        q = pts * m[:, None]
        q[2] += shift
        inside = np.linalg.norm(q - point[:, None], axis=0) < DISK
        total += float(np.sum(w[inside] * mag[s][inside]))
        weight += float(np.sum(w[inside]))
        count += int(inside.sum())
    return (total / weight / nominal if weight > 0 else float("nan")), count


def main():
    from compare.solve.segments import KEYS, RATIO, measured_ratios, mesh_dofs, study_with_notes
    from fem import solid

    for a in sys.argv[1:]:
        if a.startswith("ball="):
            v = a.split("=", 1)[1]
            solid.PEAK_BALL = None if v == "none" else tuple(float(x) for x in v.split(","))
        if a.startswith("per_turn="):
            solid.PER_TURN = float(a.split("=", 1)[1])
    sys.argv = [a for a in sys.argv if "=" not in a]
    finenesses = [float(v) for v in sys.argv[1].split(",")] if len(sys.argv) > 1 else [0.27, 0.3, 0.33]
    fillet = (float(sys.argv[2]) if len(sys.argv) > 2 else 0.6) * 1e-3
    local = float(sys.argv[3]) if len(sys.argv) > 3 else 1.7
    scales = (RATIO**2, RATIO, 1.0) if len(sys.argv) <= 4 or sys.argv[4] != "1" else (1.0,)
    d, L, kl = 0.030, 0.126, 0.036
    seg = solid.Segment(d, L, (solid.ProfileKeyseat(0.008, 0.004, L / 2 - kl / 2, L / 2 + kl / 2, fillet),))
    symmetry = solid.symmetry_of(seg)
    print(f"keyseat end: d 30 mm, 8 x 4 mm, length 126 mm, fillet {fillet * 1e3:g} mm, local {local:g}, "
          f"symmetry {symmetry}, peak balls {solid.PEAK_BALL}, PER_TURN {solid.PER_TURN:g}")
    studies = []
    for fineness in finenesses:
        runs = []
        for scale in scales:
            sm = solid.mesh_segment(seg, fineness=fineness, scale=scale, local=local, symmetry=symmetry)
            res = solid.solve_segment(sm, solid.LOADS, 2.05e11, 0.29)
            reads = {load: _read(sm, res, load, seg) for load in solid.LOADS}
            runs.append(dict(dofs=mesh_dofs(sm), size=solid.feature_edge_length(sm), reads=reads,
                             nominal={load: res[load].nominal for load in solid.LOADS}))
            del res, sm
        dofs = [r["dofs"] for r in runs]
        studies.append((fineness, runs))
        if len(runs) < 3:
            print(f"fineness {fineness:g}: unknowns {dofs}, one mesh (no estimate)")
            continue
        ratios, why = measured_ratios([r["size"] for r in runs], RATIO)
        print(f"fineness {fineness:g}: unknowns {dofs}, measured ratios {ratios[1]:.3f}, {ratios[0]:.3f}"
              f"{'' if why is None else ' (' + why + ')'}")
        for load in solid.LOADS:
            for k, name in READINGS:
                vals = [r["reads"][load][k] for r in runs]
                e = study_with_notes(KEYS[load], vals[::-1], dofs[::-1], ratios, d)
                e2 = study_with_notes(KEYS[load], vals[::-1], dofs[::-1], (RATIO, RATIO), d)
                g, g2 = ("-" if x["gci"] is None else f"{100 * x['gci']:.2f} %" for x in (e, e2))
                print(f"  {KEYS[load]:13s} {name:4s} {', '.join(f'{v:.4f}' for v in vals)}  GCI {g} ({g2})")
    print("finest meshes across the studies (spread = (max - min) / mean):")
    for load in solid.LOADS:
        for k, name in READINGS:
            v = np.array([runs[-1]["reads"][load][k] for _, runs in studies])
            print(f"  {KEYS[load]:13s} {name:4s} {', '.join(f'{x:.4f}' for x in v)}  "
                  f"spread {100 * (v.max() - v.min()) / v.mean():.2f} %")
    print("the P2 interpolant at one place (the p2 peak on the last study's finest mesh), every mesh:")
    for load in solid.LOADS:
        point = studies[-1][1][-1]["reads"][load][2]
        rows, off = [], 0.0
        for fineness, runs in studies:
            vals = [_at(r["reads"][load][3], point, load, r["nominal"][load]) for r in runs]
            rows.append(f"{fineness:g}: " + ", ".join(f"{v:.4f}" for v, _ in vals))
            off = max([off] + [o for _, o in vals])
        fine = np.array([_at(runs[-1]["reads"][load][3], point, load, runs[-1]["nominal"][load])[0]
                         for _, runs in studies])
        print(f"  {KEYS[load]:13s} at ({', '.join(f'{c * 1e3:.3f}' for c in point)}) mm: {'; '.join(rows)}; "
              f"finest spread {100 * (fine.max() - fine.min()) / fine.mean():.2f} % (sampled within {off * 1e6:.0f} um)")
    print(f"the disk reading ({DISK * 1e3:g} mm round the same place), every mesh (facet points in the disk):")
    for load in solid.LOADS:
        point = studies[-1][1][-1]["reads"][load][2]
        rows = []
        for fineness, runs in studies:
            vals = [_disk(r["reads"][load][3], point, load, r["nominal"][load]) for r in runs]
            rows.append(f"{fineness:g}: " + ", ".join(f"{v:.4f} ({n})" for v, n in vals))
        fine = np.array([_disk(runs[-1]["reads"][load][3], point, load, runs[-1]["nominal"][load])[0]
                         for _, runs in studies])
        print(f"  {KEYS[load]:13s} {'; '.join(rows)}; finest spread {100 * (fine.max() - fine.min()) / fine.mean():.2f} %")
    print(f"whole process CPU {_cpu():.0f} s")


if __name__ == "__main__":
    main()

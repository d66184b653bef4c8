"""How the keyseat end's tension peak is read (fem/solid.py, issue 21): the demo keyseat end (as in
bench_segment_accuracy.py: d 30 mm, 8 x 4 mm, 0.6 mm fillet, 126 mm, quarter model) meshed at the
three scales of a study (1.96, 1.4, 1) with ``fem.solid.PEAK_BALL`` = (D, 2) at the predicted peak
places, tension only. Prints, per mesh, the factor as the study reads it (the largest nodal-averaged
value, ``solve_segment``) and the largest value of the same nodal averages interpolated over each
lateral facet (the quadratic facet's six nodes, 12 divisions per edge) within 0.8 mm of the predicted
peak: a peak narrower than a few node spacings is sampled by the nodes, and the nodal maximum moves
with where the nodes fall. Asserts nothing (not part of pytest). Figures: DEVELOPERS.md, "3-D keyseat
end at 1 %".

    python tests/benchmarks/bench_segment_peak_reading.py [fineness] [ball divisor D] [local]
"""
from __future__ import annotations

import sys

import numpy as np


def main():
    from fem import solid

    fineness = float(sys.argv[1]) if len(sys.argv) > 1 else 0.3
    solid.PEAK_BALL = (float(sys.argv[2]) if len(sys.argv) > 2 else 3.0, 2.0)
    local = float(sys.argv[3]) if len(sys.argv) > 3 else 1.7
    d, kl = 0.030, 0.036
    L = kl + 3 * d
    f = solid.ProfileKeyseat(0.008, 0.004, L / 2 - kl / 2, L / 2 + kl / 2, 0.0006)
    seg = solid.Segment(d, L, (f,))
    centre = np.array(solid.peak_points(f, d / 2)[1])
    n = 12
    l0, l1, l2 = np.array([(i / n, j / n, 1 - i / n - j / n) for i in range(n + 1) for j in range(n + 1 - i)]).T
    shape = np.array([l0 * (2 * l0 - 1), l1 * (2 * l1 - 1), l2 * (2 * l2 - 1), 4 * l0 * l1, 4 * l1 * l2, 4 * l0 * l2])
    print(f"fineness {fineness:g}, local {local:g}, peak balls {solid.PEAK_BALL}, tension")
    for scale in (1.96, 1.4, 1.0):
        sm = solid.mesh_segment(seg, fineness=fineness, scale=scale, symmetry=2, local=local)
        r = solid.solve_segment(sm, ("tension",), 2.05e11, 0.29)["tension"]
        where, nsig = solid.recovered_surface_stresses(sm, r.points, r.stress)
        # each lateral facet's six nodes in the order recovered_surface_stresses numbers them
        fv, nv = sm.mesh.facets[:, sm.lateral], sm.mesh.nvertices
        lo, hi = np.minimum(fv[[0, 1, 0]], fv[[1, 2, 2]]), np.maximum(fv[[0, 1, 0]], fv[[1, 2, 2]])
        _, inv = np.unique(np.concatenate([fv, nv + lo * nv + hi]).T.ravel(), return_inverse=True)
        idx = inv.reshape(-1, 6)
        near = np.linalg.norm(where[:, idx].mean(axis=2) - centre[:, None], axis=0) < 0.8e-3
        sig = np.einsum("cfk,kp->cfp", nsig.reshape(9, -1)[:, idx[near]], shape).reshape(3, 3, -1)
        at = np.einsum("cfk,kp->cfp", where[:, idx[near]], shape).reshape(3, -1)
        mag = solid.stress_measure(sig, "tension") / r.nominal
        i = int(np.argmax(mag))
        print(f"  scale {scale:g}: {r.dofs} unknowns, nodal maximum {r.factor:.4f}, interpolated maximum "
              f"{mag[i]:.4f} at ({', '.join(f'{v * 1e3:.3f}' for v in at[:, i])}) mm", flush=True)


if __name__ == "__main__":
    main()

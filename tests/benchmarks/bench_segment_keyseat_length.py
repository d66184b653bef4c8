"""Torsion of an end-milled keyseat against its length (fem/solid.py): the 3-D Kts at the keyseat's
mid-length for keyseats of several lengths (the demo's section: d = 30 mm, 8 x 4 mm, bottom fillet
0.6 mm; the segment the keyseat plus 3 d, quarter model), one mesh each (fineness 0.3, local 1.7,
``fem.solid.PEAK_BALL`` = (4, 2): about 13 elements per quarter of the fillet's arc in the ball at
mid-length), beside the 2-D section FE's Kts of the same keyed section (fem/torsion.py, the long
keyseat's limit: Saint-Venant torsion of the prism). Prints each length's Kts, where its peak sits,
the unknowns and the CPU seconds so far. Asserts nothing (not part of pytest). Measured figures:
DEVELOPERS.md, "3-D keyseat end at 1 %".

    python tests/benchmarks/bench_segment_keyseat_length.py [keyseat lengths in mm, comma separated]
"""
from __future__ import annotations

import math
import resource
import sys


def main():
    from fem import solid
    from fem.geometry import Keyway, keyed_section
    from fem.mesh import MeshOptions, mesh_section
    from fem.properties import area_moments
    from fem.torsion import solve_torsion

    d, b, t, rf = 0.030, 0.008, 0.004, 0.6e-3
    lengths = [float(v) * 1e-3 for v in sys.argv[1].split(",")] if len(sys.argv) > 1 else [0.036, 0.060, 0.090]
    for f in (2.0, 4.0):
        sm2 = mesh_section(keyed_section(d, [Keyway(b, t, rf)]), MeshOptions(fineness=f))
        tr = solve_torsion(sm2, area_moments(sm2).centroid)
        print(f"2-D section Kts at fineness {f:g}: {tr.peak_per_torque * math.pi * d**3 / 16:.5f}", flush=True)
    solid.PEAK_BALL = (4.0, 2.0)
    for kl in lengths:
        L = kl + 3 * d
        seg = solid.Segment(d, L, (solid.ProfileKeyseat(b, t, L / 2 - kl / 2, L / 2 + kl / 2, rf),))
        sm = solid.mesh_segment(seg, fineness=0.3, scale=1.0, local=1.7, symmetry=solid.symmetry_of(seg))
        r = solid.solve_segment(sm, ("torsion",), 2.05e11, 0.29)["torsion"]
        me = resource.getrusage(resource.RUSAGE_SELF)
        print(f"keyseat {kl * 1e3:.0f} mm ({kl / d:.1f} d): 3-D Kts {r.factor:.4f}, peak {1e3 * (r.peak_at[2] - L / 2):.1f} mm "
              f"from mid-length, {r.dofs} unknowns, CPU so far {me.ru_utime + me.ru_stime:.0f} s", flush=True)


if __name__ == "__main__":
    main()

"""Nested (split) meshes against meshes made afresh at each fineness (prints; asserts nothing; not
part of pytest). Measures whether a three-mesh study on one mesh and its uniform splits (ratio 2,
gmsh's refine: every triangle into four, new boundary nodes on the exact curves, second order rebuilt)
pays against meshing each level, for a keyed 30 mm shaft with a small keyseat fillet (an invented
benchmark section).

    python tests/benchmarks/bench_nested.py [FINENESS ...]

For each coarse fineness f: the levels f, 2f, 4f made by splitting, and the same finenesses meshed
afresh; per mesh the unknowns, the CPU seconds of making it, the stress-function and the warping-
function torsion peaks per unit torque and their parting (an error measure that needs no exact
value). A graded mesh keeps its grading zones when split: their element count does not fall with the
fineness, so a split family reaches the fine level with more unknowns than a fresh mesh there.
"""
from __future__ import annotations

import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))

from fem.geometry import Keyway, analyse_boundary, keyed_section  # noqa: E402
from fem.gmshload import initialize, load_gmsh  # noqa: E402
from fem.mesh import (MeshOptions, SectionMesh, _boundary_offsets, _info_from_frame, _set_sizes,  # noqa: E402
                      _to_skfem, mesh_section, normalised_section)
from fem.properties import area_moments  # noqa: E402
from fem.torsion import solve_torsion  # noqa: E402

SECTION = keyed_section(0.03, [Keyway(width=0.008, depth=0.004, fillet=0.00025)])


def split_family(section, options: MeshOptions, splits: int) -> list[tuple[SectionMesh, float]]:
    """The mesh at ``options`` and its ``splits`` uniform splits, as mesh_section sizes and converts
    them; the CPU seconds of each level (the first includes the geometry and meshing)."""
    gmsh = load_gmsh()
    if not gmsh.isInitialized():
        initialize(gmsh)
    gmsh.option.setNumber("General.Terminal", 0)
    gmsh.option.setNumber("General.NumThreads", 1)
    gmsh.clear()
    out = []
    c0 = time.process_time()
    try:
        gmsh.model.add("nested")
        unit, frame = normalised_section(section)
        surfaces = unit.build(gmsh)
        info = analyse_boundary(gmsh, surfaces, unit.length_scale, frame.from_frame)
        perimeter = sum(c.length for c in info.curves.values())
        h = 4.0 * info.integrals["A"] / perimeter / (options.across * options.fineness)
        _set_sizes(gmsh, info, options, h, None)
        gmsh.model.addPhysicalGroup(2, surfaces, name="section")
        for name, v in (("Mesh.ElementOrder", 2), ("Mesh.SecondOrderLinear", 0), ("Mesh.HighOrderOptimize", 0),
                        ("Mesh.Algorithm", 6)):
            gmsh.option.setNumber(name, v)
        gmsh.model.mesh.generate(2)
        for k in range(splits + 1):
            if k:
                gmsh.model.mesh.refine()
                gmsh.model.mesh.setOrder(2)
            mesh, facet_curve = _to_skfem(gmsh, info, frame)
            bfacets, offset = _boundary_offsets(gmsh, mesh, facet_curve, frame)
            sm = SectionMesh(mesh, section, _info_from_frame(info, frame), facet_curve, bfacets, offset, options,
                             h * frame.scale / 2**k, frame=frame)
            c1 = time.process_time()
            out.append((sm, c1 - c0))
            c0 = c1
    finally:
        gmsh.clear()
    return out


def row(label: str, sm: SectionMesh, seconds: float) -> None:
    tr = solve_torsion(sm, area_moments(sm).centroid, warping=True)
    parting = abs(tr.peak_warping_per_torque - tr.peak_per_torque) / tr.peak_per_torque
    print(f"{label:22s} {tr.dofs:9d} {seconds:9.3f} {tr.peak_per_torque:14.6g} {tr.peak_warping_per_torque:14.6g} "
          f"{100 * parting:9.3f}")


def main(finenesses: list[float]) -> None:
    print(f"{'mesh':22s} {'unknowns':>9s} {'CPU s':>9s} {'τ/T stress fn':>14s} {'τ/T warping':>14s} {'parting %':>9s}")
    for f in finenesses:
        for k, (sm, s) in enumerate(split_family(SECTION, MeshOptions(fineness=f), 2)):
            row(f"split {k}x of f={f:g}", sm, s)
        for k in range(3):
            c0 = time.process_time()
            sm = mesh_section(SECTION, MeshOptions(fineness=f * 2**k))
            row(f"fresh f={f * 2**k:g}", sm, time.process_time() - c0)


if __name__ == "__main__":
    main([float(v) for v in sys.argv[1:]] or [0.25, 0.5])

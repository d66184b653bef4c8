"""How each cut changes the connectivity of a section: does it open a hole to the outside, or join
two holes?

A prismatic (2-D) model repeats the section along the whole shaft. A cut that joins a hole (a bore)
to the outside therefore describes a slit running the whole length, and turns a closed section
into an open one: the torsion constant can fall by orders of magnitude. A radial hole drilled
through one wall is a local 3-D feature and is not that. The callers warn the designer when it
happens (the numbers are right for a slit shaft, and wrong for the part they probably meant).

The test is order-independent: for each cut, the section is built with every step but that cut;
if the full section has fewer holes than that one, the cut has opened a hole (or joined two).
Only OpenCASCADE booleans are run; nothing is meshed.
"""
from __future__ import annotations

from dataclasses import replace

from .geometry import Section
from .gmshload import load_gmsh
from .mesh import normalised_section


def _holes(gmsh, section: Section) -> int:
    """The number of holes of ``section`` (inner boundary loops), built in a fresh gmsh model in the
    section's scale-free frame (as it is meshed: OpenCASCADE's absolute tolerances fail on a section
    built in metres at a micrometre scale or below)."""
    gmsh.clear()
    gmsh.model.add("topology")
    surfaces = normalised_section(section)[0].build(gmsh)
    n = 0
    for s in surfaces:
        _tags, loops = gmsh.model.occ.getCurveLoops(s)
        n += max(len(loops) - 1, 0)
    return n


def cut_connectivity(section: Section) -> list[dict]:
    """For every cut step that lowers the number of holes: ``{"step", "label", "holes_without",
    "holes_with"}`` (``step`` indexes ``section.steps``, ``label`` is the case-file field when known).
    An empty list when no cut changes the connectivity."""
    cuts = [i for i, (op, _p) in enumerate(section.steps) if op == "cut"]
    if not cuts:
        return []
    gmsh = load_gmsh()
    if not gmsh.isInitialized():  # kept initialised afterwards, as fem.mesh does
        gmsh.initialize(readConfigFiles=False, interruptible=False)
    gmsh.option.setNumber("General.Terminal", 0)
    out = []
    try:
        full = _holes(gmsh, section)
        for i in cuts:
            steps = tuple(s for j, s in enumerate(section.steps) if j != i)
            try:
                without = _holes(gmsh, replace(section, steps=steps))
            except Exception:  # noqa: BLE001 - a section that is not valid without this cut says nothing here
                continue
            if full < without:
                out.append({"step": i, "label": getattr(section.steps[i][1], "label", "") or "",
                            "holes_without": without, "holes_with": full})
    finally:
        gmsh.clear()
    return out

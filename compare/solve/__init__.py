"""Solving a case: mesh → section properties → torsion → shear on a given fineness, the adaptive
refinement to the case's accuracy and the convergence study (:mod:`.accuracy`), and its record
for ``results.json`` (:mod:`.accuracy_step`).

May import :mod:`compare.case`, :mod:`fem` and :mod:`classic`.
"""

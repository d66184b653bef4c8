"""Solving a case: mesh → section properties → torsion → shear on the finest mesh of the adaptive
refinement, and the convergence study (:mod:`.analysis`, :mod:`.accuracy`, :mod:`.accuracy_step`).

May import :mod:`compare.case`, :mod:`fem` and :mod:`classic`.
"""

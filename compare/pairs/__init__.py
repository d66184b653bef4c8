"""FE results beside the hand formulas: :class:`.pairs.Pair`, which closed form describes a section
(:mod:`.counterparts`), the solved case with its torsion pairs (:mod:`.analysis`: the
:class:`~.analysis.Analysis` every later room reads) and the transverse-shear step and its pairs
(:mod:`.shear_step`).

May import :mod:`compare.solve`, :mod:`compare.case`, :mod:`fem` and :mod:`classic`.
"""
